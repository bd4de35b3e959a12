//! Signal processing and fatigue counting for recorded channels: Butterworth and Bessel filters
//! as second-order sections (causal, streaming or zero-phase), moving average, decimation,
//! linear resampling, statistics (whole or gathered block by block), hold and ramp detection,
//! rainflow counting and Miner damage.
//!
//! Everything works on plain `&[f64]` samples (in place where the result has the input's
//! length) so a caller holding a column from a log reader passes its buffer straight in; the
//! designs take uom frequencies. Designs and filtering follow scipy.signal 1.17.1 and are tested
//! against its outputs; rainflow counting follows ASTM E1049-85 (2017) §5.4.4.

mod bessel;
mod butterworth;
mod complex;
mod decimate;
mod design;
mod events;
mod fatigue;
mod filter;
mod moving_average;
mod rainflow;
mod resample;
mod response;
mod running;
mod stats;
mod stream;
mod zero_phase;

pub use decimate::{decimate, decimation_filter};
pub use design::FilterBand;
pub use events::{Hold, HoldCriteria, Ramp, find_holds, find_ramps};
pub use fatigue::{SnCurve, miner_damage};
pub use filter::{MAX_FILTER_ORDER, SosFilter};
pub use moving_average::moving_average;
pub use rainflow::{
    Cycle, RainflowCounter, RangeBin, counts_by_range, rainflow_cycles, range_histogram, reversals,
};
pub use resample::{resample_linear, uniform_times};
pub use response::FrequencyResponse;
pub use running::{LineFit, RunningLine, RunningSummary};
pub use stats::{
    Summary, rising_crossings, rising_crossings_in_blocks, summarize, summarize_windows,
};
pub use stream::{StreamingBank, StreamingFilter};
