//! Gauge layouts on spring elements: gauges placed at sites and angles, wired into bridges,
//! and what each bridge puts out for every load component and for temperature; placement
//! sensitivity; design sweeps.
//!
//! Design estimates must be proven by test; overload and lifting uses follow local codes and
//! licensed practice.

mod explorer;
mod placement;
mod report;
mod sensitivity;
mod standard;
mod sweep;

pub use explorer::{BridgeWiring, Layout};
pub use placement::Placement;
pub use report::{BridgeReport, ResponseMatrix};
pub use sensitivity::{PlacementError, SensitivityRow, SensitivityTable};
pub use sweep::{DesignCriteria, DesignPoint, SweepTable, solve_for_rated_output, sweep, sweep2};
