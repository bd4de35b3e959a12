//! Decimation by an integer factor with anti-alias filtering.
//!
//! The anti-alias filter is an 8th-order Butterworth low-pass at 0.8 × the new Nyquist
//! frequency, applied zero-phase (forward–backward, [`SosFilter::filter_zero_phase`]), then every
//! `factor`-th sample is kept starting with the first. This is scipy.signal.decimate's recipe
//! (order 8, cutoff 0.8/q, zero phase, `y[::q]`) with a Butterworth in place of its default
//! Chebyshev type I, so the pass band is flat rather than rippled: equal to
//! `scipy.signal.decimate(x, q, ftype=dlti(*butter(8, 0.8/q, output="zpk")))` (tests).

use super::butterworth;
use super::design::{FilterBand, digital_sections};
use super::filter::SosFilter;
use crate::PhysicsError;

/// Order of the anti-alias Butterworth (scipy.signal.decimate's default IIR order is 8).
const ANTI_ALIAS_ORDER: usize = 8;
/// Cutoff as a fraction of the new Nyquist frequency (scipy.signal.decimate uses 0.8).
const ANTI_ALIAS_FRACTION: f64 = 0.8;

/// The anti-alias filter [`decimate`] uses for `factor` (≥ 2).
///
/// ```
/// let f = gaugebook::decimation_filter(4)?;
/// assert_eq!(f.sections().len(), 4);
/// # Ok::<(), gaugebook::PhysicsError>(())
/// ```
pub fn decimation_filter(factor: usize) -> Result<SosFilter, PhysicsError> {
    if factor < 2 {
        return Err(PhysicsError::invalid(
            "decimation factor",
            factor,
            "a factor of 2 or more",
        ));
    }
    let wn = ANTI_ALIAS_FRACTION / factor as f64;
    SosFilter::from_sections(digital_sections(
        butterworth::prototype(ANTI_ALIAS_ORDER),
        FilterBand::LowPass,
        wn,
    ))
}

/// Keeps every `factor`-th sample of `x` after zero-phase anti-alias filtering (see the module
/// notes); `ceil(len / factor)` samples out. The new sample rate is the old one / `factor`.
///
/// Errors: a factor below 2, a non-finite sample, or fewer than 28 samples (the filter's
/// zero-phase padding).
///
/// ```
/// let x = vec![1.0; 100];
/// let y = gaugebook::decimate(&x, 4)?;
/// assert_eq!(y.len(), 25);
/// assert!(y.iter().all(|v| (v - 1.0).abs() < 1e-12));
/// # Ok::<(), gaugebook::PhysicsError>(())
/// ```
pub fn decimate(x: &[f64], factor: usize) -> Result<Vec<f64>, PhysicsError> {
    let f = decimation_filter(factor)?;
    let y = f.filter_zero_phase(x)?;
    Ok(y.into_iter().step_by(factor).collect())
}
