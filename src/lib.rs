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

mod display;
mod error;
pub mod units;

pub use display::{MimeBundle, ToMime, html_escape};
pub use error::{PhysicsError, check_finite, check_poisson, check_positive};
pub use units::{Dimension, Kind, OutputRatio, Quantity, Strain, Unit, UnitError};

// Circuits and gauges: bridges, gauges, rosettes, plane stress, signal chain.
mod bridge;
mod gauge;
pub use bridge::{
    Arm, ArmId, Arrangement, Excitation, StrainInverse, Trim, TrimKind, WheatstoneBridge,
};
pub use gauge::{DEFAULT_CALIBRATION_POISSON, Gauge, ThermalOutput};

// Test logs (feature `data`): polars import, conversion to strain and load, atomic export.
#[cfg(feature = "data")]
mod data;
#[cfg(feature = "data")]
pub use data::{
    AdcScale, Calibration, CalibrationModel, Channel, ChannelMeta, ColumnWriter, DataError, DriftLine,
    ExportOptions, Gap, HeaderUnit, Log, LogChunk, LogFormat, LogOptions, LogStream, NoProgress,
    Progress, SkippedRow, TemperatureCompensation, TerminalProgress, TimeAxis, TimeColumn, Wiring,
    channel_to_strain, compensate_temperature, correct_lead_wires, find_gaps, lead_wire_factor,
    median_step, open_log, parse_timestamp, ratio_to_strain, read_log, read_log_with_progress,
    remove_drift, subtract_zero, window_by_time, write_columns, write_log, write_text_atomic, zero_of,
};

#[cfg(feature = "cli")]
pub mod cli;
