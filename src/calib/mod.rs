//! Calibration: points and series, fitted curves, characteristic figures and report tables.
//!
//! Class evaluations against published standards live in `src/standards/`; uncertainty budgets
//! and Monte Carlo in `src/uncertainty/`.

mod figures;
mod fit;
mod points;
mod table;

pub use figures::{
    Characterisation, CharacteriseOptions, CreepHold, Figure, Line, ReferenceLine, tc_span, tc_zero,
};
pub use fit::{Fit, FitModel};
pub use points::{CalibrationPoint, CalibrationRun, Direction, LoadKind, Series};
pub use table::{ReportRow, ReportTable};
