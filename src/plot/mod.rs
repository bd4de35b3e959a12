//! Figures of test data with plotters (feature `plot`): time series of several channels, XY plots
//! such as a calibration curve with its residuals, and histograms, as SVG text or PNG bytes,
//! saved atomically or shown inline in a notebook through [`crate::ToMime`].
//!
//! Inputs are plain `&[f64]` with an [`Axis`] (quantity name and unit) per axis; this layer knows
//! nothing of scripts or logs. Long time series are thinned per pixel column keeping each
//! column's extremes, so millions of samples draw in milliseconds and spikes stay visible.
//! PNG text uses an embedded DejaVu Sans font (no system font libraries).

mod base64;
mod error;
mod figure;
mod output;
mod render;
mod report;
mod thin;

pub use base64::base64_encode;
pub use error::PlotError;
pub use figure::{Axis, Panel, Plot, histogram_bins};
