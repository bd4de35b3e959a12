//! Gaugebook: unit-checked strain-gauge, bridge, spring-element, calibration and uncertainty
//! methods for the engineers who design and test strain-gauge transducers.
//!
//! The physics core (this crate with `--no-default-features`) takes and returns uom quantities
//! and the [`Strain`] and [`OutputRatio`] newtypes. The scripting layer (feature `script`) exposes
//! it to Rhai; the kernel (feature `kernel`) serves those scripts to Jupyter.
//!
//! ```
//! use gaugebook::{OutputRatio, Strain};
//! let e = Strain::from_microstrain(1000.0);
//! assert_eq!(e.to_string(), "1000 µε");
//! assert_eq!(OutputRatio::from_mv_per_v(2.0).value(), 0.002);
//! ```
//!
//! Design results are estimates that must be proven by test. Overload, fatigue and
//! legal-for-trade approval follow local codes and licensed practice.

#![warn(missing_docs)]

mod calib;
mod display;
mod error;
mod standards;
mod uncertainty;
pub mod units;

// calibration, standards and uncertainty (issue 7)
pub use calib::{
    CalibrationPoint, CalibrationRun, Characterisation, CharacteriseOptions, Direction, Figure,
    Fit, FitModel, Hold, Line, LoadKind, ReferenceLine, ReportRow, ReportTable, Series, tc_span,
    tc_zero,
};
pub use display::{MimeBundle, ToMime, html_escape};
pub use error::{PhysicsError, check_finite, check_poisson, check_positive};
pub use standards::{
    Check, ClassVerdict, E74Result, Iso376Class, Iso376Data, Iso376Limits, Iso376Result,
    Iso376Step, OimlClass, R60Extras, R60LoadCell, VERDICT_CAUTION, classify_iso376, evaluate_e74,
    evaluate_r60,
};
pub use uncertainty::{
    Budget, Contribution, Distribution, Expanded, GumResult, Input, IntervalKind, McResult,
    MonteCarlo, Validation, coverage_factor, ln_gamma, sample_correlation, student_t_quantile,
    student_t_two_sided_tail,
};
pub use units::{Dimension, Kind, OutputRatio, Quantity, Strain, Unit, UnitError};

#[cfg(feature = "cli")]
pub mod cli;
