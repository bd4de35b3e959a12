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

// Signal processing, statistics and fatigue counting (issue 6).
mod signal;
pub use signal::{
    Cycle, FilterBand, FrequencyResponse, Hold, HoldCriteria, MAX_FILTER_ORDER, Ramp, RangeBin,
    SnCurve, SosFilter, StreamingFilter, Summary, counts_by_range, decimate, decimation_filter,
    find_holds, find_ramps, miner_damage, moving_average, rainflow_cycles, range_histogram,
    resample_linear, reversals, rising_crossings, summarize, summarize_windows, uniform_times,
};

pub use display::{MimeBundle, ToMime, html_escape};
pub use error::{PhysicsError, check_finite, check_poisson, check_positive};
pub use units::{Dimension, Kind, OutputRatio, Quantity, Strain, Unit, UnitError};

// Circuits and gauges: bridges, gauges, rosettes, plane stress, signal chain.
mod bridge;
mod gauge;
pub use bridge::{
    Arm, ArmId, Arrangement, COPPER_RESISTIVITY, COPPER_TEMPERATURE_COEFFICIENT, Excitation,
    GaugeDissipation, LeadWire, QuarterLeads, QuarterWiring, ShuntCalibration, ShuntDefinition,
    StrainInverse, SupplyLeads, SupplyWiring, Trim, TrimKind, WheatstoneBridge,
};
pub use gauge::{DEFAULT_CALIBRATION_POISSON, Gauge, ThermalOutput};

// Figures (issue 6, feature `plot`).
#[cfg(feature = "plot")]
mod plot;
#[cfg(feature = "plot")]
pub use plot::{Axis, Figure, Panel, PlotError, base64_encode, histogram_bins};

#[cfg(feature = "cli")]
pub mod cli;
