//! Test logs: import of CSV (read field by field) and Parquet (through polars), only the kept
//! columns, block by block; units from column headers, the time axis with its sample rate and gaps, channel metadata,
//! conversion to strain and load, zero, drift and temperature compensation, and atomic export.
//!
//! Values are held as owned `Vec<f64>` in the unit written in the file; conversions are pure
//! functions on slices. No polars type appears in this module's public API.

mod bridge_signal;
mod calibration;
mod csv_blocks;
mod csv_lines;
mod decimal;
mod error;
mod export;
mod fixed;
mod header;
mod log;
mod options;
mod parquet_sink;
mod plan;
mod progress;
mod stream;
mod thermal;
mod time;
mod timebase;
mod zero;

pub use bridge_signal::{
    AdcScale, LeadWires, channel_to_strain, correct_lead_wires, ratio_to_strain,
    ratio_to_strain_in_place,
};
pub use calibration::{Calibration, CalibrationModel};
pub use error::DataError;
pub use export::{ColumnWriter, ExportOptions, write_columns, write_log, write_text_atomic};
pub use header::HeaderUnit;
pub use log::{Channel, ChannelMeta, Log, LogFormat, SkippedRow, TimeAxis};
pub use options::{LogOptions, TimeColumn};
pub use progress::{NoProgress, Progress, TerminalProgress};
pub use stream::{LogChunk, LogStream, open_log, read_log, read_log_with_progress};
pub use thermal::{TemperatureCompensation, compensate_temperature};
pub use time::{Gap, find_gaps, median_step, parse_timestamp};
pub use zero::{DriftLine, remove_drift, subtract_zero, window_by_time, zero_of};
