//! Rosettes: the in-plane strain state, principal strains, rectangular and delta rosettes, and
//! the transverse-sensitivity corrections of gauge readings.

mod delta;
mod principal;
mod rectangular;
mod state;
mod transverse;

pub use delta::DeltaRosette;
pub use principal::PrincipalStrains;
pub use rectangular::RectangularRosette;
pub use state::StrainState;
pub use transverse::{correct_orthogonal, correct_single, correct_uniaxial};
