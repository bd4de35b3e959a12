//! Bridge circuits: the general four-arm Wheatstone bridge, its arms and excitation, balance
//! trims, and the named arrangements with their exact output and exact inverse.
//!
//! The general bridge is the ground truth; the named arrangements are closed forms of it for
//! equal arms and are tested against it.

mod arm;
mod arrangement;
mod balance;
mod excitation;
mod inverse;
mod wheatstone;

pub use arm::{Arm, ArmId, Trim, TrimKind};
pub use arrangement::Arrangement;
pub use excitation::Excitation;
pub use inverse::StrainInverse;
pub use wheatstone::WheatstoneBridge;
