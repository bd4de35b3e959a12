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
mod text;
pub mod units;

// Signal processing, statistics and fatigue counting (issue 6).
mod signal;
pub use signal::{
    Cycle, FilterBand, FrequencyResponse, Hold, HoldCriteria, LineFit, MAX_FILTER_ORDER,
    RainflowCounter, Ramp, RangeBin, RunningLine, RunningSummary, SnCurve, SosFilter,
    StreamingBank, StreamingFilter, Summary, counts_by_range, decimate, decimation_filter,
    find_holds, find_ramps, miner_damage, moving_average, rainflow_cycles, range_histogram,
    resample_linear, reversals, rising_crossings, rising_crossings_in_blocks, summarize,
    summarize_windows, uniform_times,
};

pub use display::{MimeBundle, ToMime, html_escape};
pub use error::{PhysicsError, check_finite, check_poisson, check_positive};

// Spring elements, materials, layouts and check-weighing (issue 5).
mod layout;
mod material;
mod spring;
mod weighing;
pub use layout::{
    BridgeReport, BridgeWiring, DesignCriteria, DesignPoint, Layout, Placement, PlacementError,
    ResponseMatrix, SensitivityRow, SensitivityTable, SweepTable, solve_for_rated_output, sweep,
    sweep2,
};
pub use material::{Material, material, materials};
pub use spring::{
    AttachedMass, Cantilever, Column, ColumnSection, Face, LoadComponent, MARGIN_CAUTION, MarginAt,
    Margins, Motion, OverloadFactors, Parallelogram, Part, PeakStress, ShearWeb, Site,
    SpringElement, Stiffness, SurfaceStrain, SurfaceStress, TorqueShaft, Wrench,
};
pub use weighing::{CheckWeigher, CheckWeighing, STANDARD_GRAVITY, WEIGHING_CAUTION};

// Calibration, class evaluation against standards, uncertainty (issue 7).
mod calib;
mod standards;
mod uncertainty;
pub use calib::{
    CalibrationPoint, CalibrationRun, Characterisation, CharacteriseOptions, CreepHold, Direction,
    Figure, Fit, FitModel, Line, LoadKind, ReferenceLine, ReportRow, ReportTable, Series, tc_span,
    tc_zero,
};
pub use standards::{
    Check, ClassVerdict, E74Result, ErrorPoint, Iso376Class, Iso376Data, Iso376Limits,
    Iso376Result, Iso376Step, OimlClass, R60Extras, R60LoadCell, VERDICT_CAUTION, classify_iso376,
    evaluate_e74, evaluate_r60,
};
pub use uncertainty::{
    Budget, Contribution, Distribution, Expanded, GumResult, Input, IntervalKind, McResult,
    MonteCarlo, Validation, coverage_factor, ln_gamma, sample_correlation, student_t_quantile,
    student_t_two_sided_tail,
};
pub use units::{Dimension, Kind, OutputRatio, Quantity, Strain, Unit, UnitError};

// Circuits and gauges: bridges, gauges, rosettes, plane stress, signal chain.
mod bridge;
mod chain;
mod gauge;
mod rosette;
mod stress;
pub use bridge::{
    Arm, ArmId, Arrangement, COPPER_RESISTIVITY, COPPER_TEMPERATURE_COEFFICIENT, Excitation,
    GaugeDissipation, LeadWire, QuarterLeads, QuarterWiring, ShuntCalibration, ShuntDefinition,
    StrainInverse, SupplyLeads, SupplyWiring, Trim, TrimKind, WheatstoneBridge,
};
pub use chain::{Adc, AdcReference, Amplifier, InputNoise, PEAK_TO_PEAK_PER_RMS, SignalChain};
pub use gauge::{DEFAULT_CALIBRATION_POISSON, Gauge, ThermalOutput};
pub use rosette::{
    DeltaRosette, PrincipalStrains, RectangularRosette, StrainState, correct_orthogonal,
    correct_single, correct_uniaxial,
};
pub use stress::{Elastic, PlaneStress, PrincipalStresses};

// The embedded worked example behind `gaugebook demo`.
mod demo;
pub use demo::{DesignReport, ReportSection, bridge_design_demo};
// Example-notebook test logs (area: examples).
pub use demo::{
    EXAMPLE_CELL, EXAMPLE_SPECTRUM, ExampleCell, ExampleLog, ExampleSpectrum, calibration_log,
    creep_log, example_logs, fatigue_log, temperature_log, write_example_logs,
};

// Figures (issue 6, feature `plot`).
#[cfg(feature = "plot")]
mod plot;
#[cfg(feature = "plot")]
pub use plot::{Axis, Panel, Plot, PlotError, base64_encode, histogram_bins};

// Scripting: the Rhai surface, sessions, runner support (feature `script`).
#[cfg(feature = "script")]
pub mod script;

// Test logs (feature `data`): polars import, conversion to strain and load, atomic export.
#[cfg(feature = "data")]
mod data;
#[cfg(feature = "data")]
pub use data::{
    AdcScale, Calibration, CalibrationModel, Channel, ChannelMeta, ColumnWriter, DataError,
    DriftLine, ExportOptions, Gap, HeaderUnit, LeadWires, Log, LogChunk, LogFormat, LogOptions,
    LogStream, NoProgress, Progress, SkippedRow, TemperatureCompensation, TerminalProgress,
    TimeAxis, TimeColumn, channel_to_strain, compensate_temperature, correct_lead_wires, find_gaps,
    median_step, open_log, parse_timestamp, ratio_to_strain, ratio_to_strain_in_place, read_log,
    read_log_with_progress, remove_drift, subtract_zero, window_by_time, write_columns, write_log,
    write_text_atomic, zero_of,
};

#[cfg(feature = "cli")]
pub mod cli;

// Jupyter kernel (area: kernel).
#[cfg(feature = "kernel")]
mod kernel;
#[cfg(feature = "kernel")]
pub use kernel::{
    Backend, CellError, CodeStatus, CompletionSet, Interrupter, KERNEL_NAME, KernelError,
    KernelOutput, KernelspecTarget, install_kernelspec, install_kernelspec_with, run_kernel,
    run_kernel_with, uninstall_kernelspec,
};

// Headless notebooks: run, provenance, verify (issue 8, feature `script`).
#[cfg(feature = "script")]
mod notebook;
#[cfg(feature = "script")]
pub use notebook::{
    Cell, CellKind, Drift, DriftKind, Notebook, NotebookError, NumberChange, Output, Provenance,
    RunOptions, VerifyOptions, VerifyReport, file_hash, html_page, rhai_version, run_notebook,
    verify_notebook,
};
