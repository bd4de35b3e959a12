//! Bridge circuits: the general four-arm Wheatstone bridge, its arms and excitation, balance
//! trims, the named arrangements with their exact output and exact inverse, lead wires, shunt
//! calibration and gauge dissipation.
//!
//! The general bridge is the ground truth; the named arrangements are closed forms of it for
//! equal arms and are tested against it.

mod arm;
mod arrangement;
mod balance;
mod dissipation;
mod excitation;
mod inverse;
mod leads;
mod quarter_leads;
mod shunt;
mod supply_leads;
mod wheatstone;

pub use arm::{Arm, ArmId, Trim, TrimKind};
pub use arrangement::Arrangement;
pub use dissipation::GaugeDissipation;
pub use excitation::Excitation;
pub use inverse::StrainInverse;
pub use leads::{COPPER_RESISTIVITY, COPPER_TEMPERATURE_COEFFICIENT, LeadWire};
pub use quarter_leads::{QuarterLeads, QuarterWiring};
pub use shunt::{ShuntCalibration, ShuntDefinition};
pub use supply_leads::{SupplyLeads, SupplyWiring};
pub use wheatstone::WheatstoneBridge;
