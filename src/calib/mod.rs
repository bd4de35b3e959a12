//! Calibration: points and series, fitted curves, characteristic figures and report tables.
//!
//! The layer below the standards ([`crate::standards`]-style class evaluations live in
//! `src/standards/`) and beside the uncertainty budgets (`src/uncertainty/`).

mod fit;
mod points;

pub use fit::{Fit, FitModel};
pub use points::{CalibrationPoint, CalibrationRun, Direction, LoadKind, Series};
