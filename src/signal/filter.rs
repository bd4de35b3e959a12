//! A digital IIR filter as cascaded second-order sections, its Butterworth and Bessel designs,
//! and causal filtering from a zero initial state (what scipy.signal.sosfilt does).
//!
//! Sections are stored as `[b0, b1, b2, a0, a1, a2]` with a0 = 1, scipy's SOS layout. Filtering
//! runs the transposed direct form II of each section (the recurrence scipy's `sosfilt` uses,
//! term for term) over blocks of samples: a block stays in the L1 cache while every section
//! passes over it, so a 10 M-sample channel streams through memory once, with no allocation.

use super::bessel;
use super::butterworth;
use super::design::{FilterBand, digital_sections};
use crate::PhysicsError;
use crate::units::Frequency;
use uom::si::frequency::hertz;

/// The highest order the designs accept. Butterworth is exact at any order; the Bessel
/// pole iteration is checked to order 20 (tests), which is far beyond the 2–8 used in practice.
///
/// ```
/// use gaugebook::{FilterBand, MAX_FILTER_ORDER, SosFilter};
/// use gaugebook::units::Frequency;
/// use uom::si::frequency::hertz;
/// let hz = Frequency::new::<hertz>;
/// assert!(SosFilter::bessel(MAX_FILTER_ORDER, FilterBand::LowPass, hz(10.0), hz(1000.0)).is_ok());
/// assert!(SosFilter::bessel(MAX_FILTER_ORDER + 1, FilterBand::LowPass, hz(10.0), hz(1000.0)).is_err());
/// ```
pub const MAX_FILTER_ORDER: usize = 20;

/// Samples per block: 2048 f64 are 16 KiB, half a typical 32 KiB L1 data cache.
const BLOCK: usize = 2048;

/// A filter made of cascaded second-order sections.
///
/// ```
/// use gaugebook::{FilterBand, SosFilter};
/// use gaugebook::units::Frequency;
/// use uom::si::frequency::hertz;
/// let fs = Frequency::new::<hertz>(1000.0);
/// let lp = SosFilter::butterworth(4, FilterBand::LowPass, Frequency::new::<hertz>(50.0), fs)?;
/// assert_eq!(lp.sections().len(), 2);
/// let mut x = vec![1.0; 2000];
/// lp.filter_in_place(&mut x)?;
/// assert!((x[1999] - 1.0).abs() < 1e-9); // unit gain at DC once the start transient has died
/// # Ok::<(), gaugebook::PhysicsError>(())
/// ```
#[derive(Clone, Debug, PartialEq)]
pub struct SosFilter {
    sections: Vec<[f64; 6]>,
}

impl SosFilter {
    /// Butterworth design of order 1..=[`MAX_FILTER_ORDER`], −3 dB at `cutoff`, by the bilinear
    /// transform with prewarping; the same sections as
    /// `scipy.signal.butter(order, cutoff, btype, fs=sample_rate, output="sos")` (1.17.1).
    ///
    /// Errors: order 0 or above the maximum, a cutoff or sample rate that is not finite and
    /// positive, or a cutoff at or above Nyquist (half the sample rate).
    ///
    /// ```
    /// use gaugebook::{FilterBand, SosFilter};
    /// use gaugebook::units::Frequency;
    /// use uom::si::frequency::hertz;
    /// let hz = Frequency::new::<hertz>;
    /// let hp = SosFilter::butterworth(3, FilterBand::HighPass, hz(20.0), hz(1000.0))?;
    /// let g = hp.response(hz(20.0), hz(1000.0))?.magnitude;
    /// assert!((g - 0.5f64.sqrt()).abs() < 1e-12);
    /// assert!(SosFilter::butterworth(2, FilterBand::LowPass, hz(500.0), hz(1000.0)).is_err());
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn butterworth(
        order: usize,
        band: FilterBand,
        cutoff: Frequency,
        sample_rate: Frequency,
    ) -> Result<SosFilter, PhysicsError> {
        let wn = check_design(order, cutoff, sample_rate)?;
        Ok(SosFilter {
            sections: digital_sections(butterworth::prototype(order), band, wn),
        })
    }

    /// Bessel design (maximally flat group delay), phase-normalised like scipy's default
    /// `norm="phase"`: the phase reaches half its final value at `cutoff`, and the magnitude
    /// asymptotes are those of the Butterworth of the same order. The same sections as
    /// `scipy.signal.bessel(order, cutoff, btype, fs=sample_rate, output="sos")` (1.17.1).
    /// Errors as for [`SosFilter::butterworth`].
    ///
    /// ```
    /// use gaugebook::{FilterBand, SosFilter};
    /// use gaugebook::units::Frequency;
    /// use uom::si::frequency::hertz;
    /// let hz = Frequency::new::<hertz>;
    /// let lp = SosFilter::bessel(4, FilterBand::LowPass, hz(100.0), hz(1000.0))?;
    /// assert!((lp.response(hz(0.0), hz(1000.0))?.magnitude - 1.0).abs() < 1e-12);
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn bessel(
        order: usize,
        band: FilterBand,
        cutoff: Frequency,
        sample_rate: Frequency,
    ) -> Result<SosFilter, PhysicsError> {
        let wn = check_design(order, cutoff, sample_rate)?;
        Ok(SosFilter {
            sections: digital_sections(bessel::prototype(order)?, band, wn),
        })
    }

    /// A filter from given sections `[b0, b1, b2, a0, a1, a2]`; each a0 must be 1 and every
    /// coefficient finite (scipy's `sosfilt` requires a0 = 1 too).
    ///
    /// ```
    /// // A two-point average, y[n] = (x[n] + x[n-1]) / 2, as one first-order section.
    /// let f = gaugebook::SosFilter::from_sections(vec![[0.5, 0.5, 0.0, 1.0, 0.0, 0.0]])?;
    /// assert_eq!(f.filter(&[2.0, 4.0, 6.0])?, vec![1.0, 3.0, 5.0]);
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn from_sections(sections: Vec<[f64; 6]>) -> Result<SosFilter, PhysicsError> {
        if sections.is_empty() {
            return Err(PhysicsError::NotEnoughData {
                what: "a second-order-section filter".to_string(),
                needed: 1,
                found: 0,
            });
        }
        for (i, s) in sections.iter().enumerate() {
            if s.iter().any(|c| !c.is_finite()) || s[3] != 1.0 {
                return Err(PhysicsError::invalid(
                    format!("section {i}"),
                    format!("{s:?}"),
                    "finite coefficients with a0 = 1",
                ));
            }
        }
        Ok(SosFilter { sections })
    }

    /// The sections, `[b0, b1, b2, a0, a1, a2]` each (scipy's SOS row layout).
    ///
    /// ```
    /// use gaugebook::{FilterBand, SosFilter};
    /// use gaugebook::units::Frequency;
    /// use uom::si::frequency::hertz;
    /// let hz = Frequency::new::<hertz>;
    /// let f = SosFilter::butterworth(5, FilterBand::LowPass, hz(10.0), hz(100.0))?;
    /// assert_eq!(f.sections().len(), 3);
    /// assert!(f.sections().iter().all(|s| s[3] == 1.0));
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn sections(&self) -> &[[f64; 6]] {
        &self.sections
    }

    /// Filters `x` in place, causally, from a zero initial state (scipy.signal.sosfilt with no
    /// `zi`). The output lags the input (phase delay); see [`SosFilter::filter_zero_phase`].
    ///
    /// Errors: an empty signal or a non-finite sample (the index of the first one is named);
    /// `x` is unchanged on error.
    ///
    /// ```
    /// let f = gaugebook::SosFilter::from_sections(vec![[0.5, 0.5, 0.0, 1.0, 0.0, 0.0]])?;
    /// let mut x = vec![2.0, 4.0];
    /// f.filter_in_place(&mut x)?;
    /// assert_eq!(x, [1.0, 3.0]);
    /// assert!(f.filter_in_place(&mut [1.0, f64::NAN]).is_err());
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn filter_in_place(&self, x: &mut [f64]) -> Result<(), PhysicsError> {
        check_signal(x)?;
        let mut state = vec![[0.0; 2]; self.sections.len()];
        run(&self.sections, &mut state, x);
        Ok(())
    }

    /// Causal filtering into a new vector; see [`SosFilter::filter_in_place`].
    ///
    /// ```
    /// let f = gaugebook::SosFilter::from_sections(vec![[1.0, 0.0, 0.0, 1.0, -0.5, 0.0]])?;
    /// assert_eq!(f.filter(&[1.0, 0.0, 0.0])?, vec![1.0, 0.5, 0.25]); // y[n] = x[n] + y[n-1]/2
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn filter(&self, x: &[f64]) -> Result<Vec<f64>, PhysicsError> {
        let mut y = x.to_vec();
        self.filter_in_place(&mut y)?;
        Ok(y)
    }

    /// Filters several channels in place, each causally from a zero state. Channels of equal
    /// length are run four at a time in lockstep: their recurrences are independent, so the
    /// processor overlaps them and the cost per channel drops, with results identical to
    /// [`SosFilter::filter_in_place`] on each channel alone.
    ///
    /// ```
    /// let f = gaugebook::SosFilter::from_sections(vec![[0.5, 0.5, 0.0, 1.0, 0.0, 0.0]])?;
    /// let (mut a, mut b) = (vec![2.0, 4.0], vec![0.0, 2.0]);
    /// f.filter_channels_in_place(&mut [&mut a[..], &mut b[..]])?;
    /// assert_eq!((a, b), (vec![1.0, 3.0], vec![0.0, 1.0]));
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn filter_channels_in_place(
        &self,
        channels: &mut [&mut [f64]],
    ) -> Result<(), PhysicsError> {
        for (i, c) in channels.iter().enumerate() {
            check_signal(c).map_err(|e| match e {
                PhysicsError::InvalidParameter {
                    name,
                    found,
                    expected,
                } => PhysicsError::InvalidParameter {
                    name: format!("{name} of channel {i}"),
                    found,
                    expected,
                },
                other => other,
            })?;
        }
        let mut rest: &mut [&mut [f64]] = channels;
        while !rest.is_empty() {
            let take = if rest.len() >= 4 && rest[..4].iter().all(|c| c.len() == rest[0].len()) {
                4
            } else {
                1
            };
            let (group, tail) = rest.split_at_mut(take);
            if take == 4 {
                let mut state = vec![[[0.0f64; 2]; 4]; self.sections.len()];
                run4(&self.sections, &mut state, group);
            } else {
                let mut state = vec![[0.0; 2]; self.sections.len()];
                run(&self.sections, &mut state, group[0]);
            }
            rest = tail;
        }
        Ok(())
    }
}

/// Validates a design request; returns the cutoff as a fraction of Nyquist.
fn check_design(
    order: usize,
    cutoff: Frequency,
    sample_rate: Frequency,
) -> Result<f64, PhysicsError> {
    if order == 0 || order > MAX_FILTER_ORDER {
        return Err(PhysicsError::invalid(
            "filter order",
            order,
            format!("an order from 1 to {MAX_FILTER_ORDER}"),
        ));
    }
    let fs = crate::check_positive("sample rate", sample_rate.get::<hertz>(), "Hz")?;
    let fc = crate::check_positive("cutoff frequency", cutoff.get::<hertz>(), "Hz")?;
    if fc >= fs / 2.0 {
        return Err(PhysicsError::invalid(
            "cutoff frequency",
            format!("{fc} Hz"),
            format!(
                "a cutoff below Nyquist, {} Hz (half the sample rate)",
                fs / 2.0
            ),
        ));
    }
    Ok(fc / (fs / 2.0))
}

/// Rejects an empty signal or one with a NaN or infinite sample.
pub(crate) fn check_signal(x: &[f64]) -> Result<(), PhysicsError> {
    if x.is_empty() {
        return Err(PhysicsError::NotEnoughData {
            what: "filtering".to_string(),
            needed: 1,
            found: 0,
        });
    }
    if let Some(i) = crate::error::first_non_finite(x) {
        return Err(PhysicsError::invalid(
            format!("sample {i} of the signal"),
            x[i],
            "a finite value",
        ));
    }
    Ok(())
}

/// Runs the cascade over `x` in place, block by block, carrying `state` (one [z0, z1] per section).
pub(crate) fn run(sections: &[[f64; 6]], state: &mut [[f64; 2]], x: &mut [f64]) {
    for block in x.chunks_mut(BLOCK) {
        for (s, z) in sections.iter().zip(state.iter_mut()) {
            let [b0, b1, b2, _, a1, a2] = *s;
            let [mut z0, mut z1] = *z;
            for v in block.iter_mut() {
                // Transposed direct form II, in the order of scipy's _sosfilt kernel.
                let xi = *v;
                let y = b0 * xi + z0;
                z0 = b1 * xi - a1 * y + z1;
                z1 = b2 * xi - a2 * y;
                *v = y;
            }
            *z = [z0, z1];
        }
    }
}

/// [`run`] on four channels of equal length at once, carrying `state` (per section, one [z0, z1]
/// per channel). Each channel sees exactly the arithmetic of [`run`]; interleaving four
/// independent recursions only hides the latency of each one's feedback chain.
pub(crate) fn run4(sections: &[[f64; 6]], state: &mut [[[f64; 2]; 4]], ch: &mut [&mut [f64]]) {
    let n = ch[0].len();
    let mut start = 0;
    while start < n {
        let end = (start + BLOCK).min(n);
        for (s, zs) in sections.iter().zip(state.iter_mut()) {
            let [b0, b1, b2, _, a1, a2] = *s;
            let mut z0 = [zs[0][0], zs[1][0], zs[2][0], zs[3][0]];
            let mut z1 = [zs[0][1], zs[1][1], zs[2][1], zs[3][1]];
            let [c0, c1, c2, c3] = ch else {
                // run4 is only called with exactly four channels.
                return;
            };
            let (c0, c1, c2, c3) = (
                &mut c0[start..end],
                &mut c1[start..end],
                &mut c2[start..end],
                &mut c3[start..end],
            );
            for i in 0..end - start {
                let xi = [c0[i], c1[i], c2[i], c3[i]];
                let mut y = [0.0; 4];
                for k in 0..4 {
                    y[k] = b0 * xi[k] + z0[k];
                    z0[k] = b1 * xi[k] - a1 * y[k] + z1[k];
                    z1[k] = b2 * xi[k] - a2 * y[k];
                }
                c0[i] = y[0];
                c1[i] = y[1];
                c2[i] = y[2];
                c3[i] = y[3];
            }
            for k in 0..4 {
                zs[k] = [z0[k], z1[k]];
            }
        }
        start = end;
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    fn hz(v: f64) -> Frequency {
        Frequency::new::<hertz>(v)
    }

    #[test]
    fn bad_designs_are_rejected() {
        let lp = FilterBand::LowPass;
        assert!(SosFilter::butterworth(0, lp, hz(10.0), hz(100.0)).is_err());
        assert!(SosFilter::butterworth(MAX_FILTER_ORDER + 1, lp, hz(10.0), hz(100.0)).is_err());
        assert!(SosFilter::butterworth(2, lp, hz(50.0), hz(100.0)).is_err());
        assert!(SosFilter::bessel(2, lp, hz(f64::NAN), hz(100.0)).is_err());
        assert!(SosFilter::bessel(2, lp, hz(10.0), hz(-100.0)).is_err());
        assert!(SosFilter::butterworth(2, lp, hz(0.0), hz(100.0)).is_err());
        let e = SosFilter::butterworth(2, lp, hz(60.0), hz(100.0))
            .unwrap_err()
            .to_string();
        assert_eq!(
            e,
            "invalid cutoff frequency: expected a cutoff below Nyquist, 50 Hz (half the sample rate), found 60 Hz"
        );
    }

    #[test]
    fn block_boundaries_do_not_change_the_result() {
        // Filtering in one call equals filtering sample by sample with carried state.
        let f = SosFilter::butterworth(6, FilterBand::LowPass, hz(30.0), hz(1000.0)).unwrap();
        let x: Vec<f64> = (0..5000).map(|i| ((i * 37 % 101) as f64).sin()).collect();
        let whole = f.filter(&x).unwrap();
        let mut state = vec![[0.0; 2]; f.sections().len()];
        let mut one = x.clone();
        for v in one.chunks_mut(1) {
            run(f.sections(), &mut state, v);
        }
        assert_eq!(whole, one);
    }

    #[test]
    fn lockstep_channels_equal_single_channels() {
        let f = SosFilter::bessel(5, FilterBand::HighPass, hz(3.0), hz(1000.0)).unwrap();
        let mk = |k: usize| -> Vec<f64> {
            (0..4100)
                .map(|i| ((i * (k + 3)) as f64 * 0.01).cos())
                .collect()
        };
        let mut chans: Vec<Vec<f64>> = (0..5).map(mk).collect();
        let want: Vec<Vec<f64>> = chans.iter().map(|c| f.filter(c).unwrap()).collect();
        let mut refs: Vec<&mut [f64]> = chans.iter_mut().map(|c| c.as_mut_slice()).collect();
        f.filter_channels_in_place(&mut refs).unwrap();
        assert_eq!(chans, want);
    }

    #[test]
    fn empty_and_nan_input_are_errors_and_leave_input_alone() {
        let f = SosFilter::from_sections(vec![[0.5, 0.5, 0.0, 1.0, 0.0, 0.0]]).unwrap();
        assert!(f.filter(&[]).is_err());
        let mut x = [1.0, 2.0, f64::INFINITY];
        let e = f.filter_in_place(&mut x).unwrap_err();
        assert!(e.to_string().contains("sample 2"), "{e}");
        assert_eq!(x[..2], [1.0, 2.0]);
        assert!(SosFilter::from_sections(vec![[1.0, 0.0, 0.0, 2.0, 0.0, 0.0]]).is_err());
        assert!(SosFilter::from_sections(vec![]).is_err());
    }
}
