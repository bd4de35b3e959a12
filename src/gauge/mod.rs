//! Strain gauges: the gauge itself ([`Gauge`]) and its thermal output ([`ThermalOutput`]).
//!
//! The gauge turns strain into a relative resistance change; the bridge module turns that into
//! an output ratio. Transverse-sensitivity corrections of measured strains live with the
//! rosettes, because they need more than one gauge's reading.

mod spec;
mod thermal;

pub use spec::{DEFAULT_CALIBRATION_POISSON, Gauge};
pub use thermal::ThermalOutput;
