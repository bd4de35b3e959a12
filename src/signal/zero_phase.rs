//! Zero-phase (forward–backward) filtering and the steady-state initial conditions it starts
//! from: scipy.signal.sosfiltfilt with its defaults (`padtype="odd"`, `padlen=None`) and
//! scipy.signal.sosfilt_zi, version 1.17.1.
//!
//! The signal is extended at each end by its point reflection (odd extension, 2·x₀ − x[k]) over
//! `3·(2·sections + 1 − min(#b2 = 0, #a2 = 0))` samples, filtered forward from the state a
//! constant input x₀ would have settled to, reversed, filtered again from the settled state of
//! its new first sample, reversed back and trimmed. The result has no phase shift and the
//! squared magnitude response.

use super::filter::{SosFilter, check_signal, run};
use crate::PhysicsError;

impl SosFilter {
    /// Initial states (one [z0, z1] per section) for which a unit step input gives a constant
    /// unit-DC-gain output from the first sample: scipy.signal.sosfilt_zi. Multiply by the first
    /// sample to start a filter settled on it.
    ///
    /// ```
    /// let f = gaugebook::SosFilter::from_sections(vec![[0.5, 0.5, 0.0, 1.0, 0.0, 0.0]])?;
    /// assert_eq!(f.initial_conditions(), vec![[0.5, 0.0]]);
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn initial_conditions(&self) -> Vec<[f64; 2]> {
        let mut scale = 1.0;
        self.sections()
            .iter()
            .map(|s| {
                let [b0, b1, b2, _, a1, a2] = *s;
                // scipy's lfilter_zi for one section: solve (I − Aᵀ) zi = b[1:] − a[1:]·b0 with the
                // companion matrix A of [1, a1, a2]; closed form for the 2×2 system.
                let (r0, r1) = (b1 - a1 * b0, b2 - a2 * b0);
                let z0 = (r0 + r1) / (1.0 + a1 + a2);
                let z1 = r1 - a2 * z0;
                let zi = [scale * z0, scale * z1];
                // The next section sees this one's settled output: its DC gain times the input.
                scale *= (b0 + b1 + b2) / (1.0 + a1 + a2);
                zi
            })
            .collect()
    }

    /// Samples added at each end by [`SosFilter::filter_zero_phase`] (scipy's default padlen);
    /// the signal must be longer than this.
    ///
    /// ```
    /// use gaugebook::{FilterBand, SosFilter};
    /// use gaugebook::units::Frequency;
    /// use uom::si::frequency::hertz;
    /// let hz = Frequency::new::<hertz>;
    /// let f = SosFilter::butterworth(4, FilterBand::LowPass, hz(50.0), hz(1000.0))?;
    /// assert_eq!(f.zero_phase_padding(), 15); // 3·(2·2 + 1)
    /// let f3 = SosFilter::butterworth(3, FilterBand::LowPass, hz(50.0), hz(1000.0))?;
    /// assert_eq!(f3.zero_phase_padding(), 12); // one section is first order: 3·(2·2 + 1 − 1)
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn zero_phase_padding(&self) -> usize {
        let s = self.sections();
        let b2_zero = s.iter().filter(|c| c[2] == 0.0).count();
        let a2_zero = s.iter().filter(|c| c[5] == 0.0).count();
        3 * (2 * s.len() + 1 - b2_zero.min(a2_zero))
    }

    /// Forward–backward filtering without phase shift (scipy.signal.sosfiltfilt, defaults).
    /// Errors: a non-finite sample, or a signal not longer than
    /// [`SosFilter::zero_phase_padding`].
    ///
    /// ```
    /// use gaugebook::{FilterBand, SosFilter};
    /// use gaugebook::units::Frequency;
    /// use uom::si::frequency::hertz;
    /// let hz = Frequency::new::<hertz>;
    /// let f = SosFilter::butterworth(2, FilterBand::LowPass, hz(5.0), hz(1000.0))?;
    /// let ramp: Vec<f64> = (0..4000).map(|i| i as f64).collect();
    /// let y = f.filter_zero_phase(&ramp)?;
    /// assert!((y[2000] - 2000.0).abs() < 1e-6); // no lag on a ramp, unlike causal filtering
    /// assert!(f.filter_zero_phase(&ramp[..9]).is_err());
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn filter_zero_phase(&self, x: &[f64]) -> Result<Vec<f64>, PhysicsError> {
        check_signal(x)?;
        let edge = self.zero_phase_padding();
        let n = x.len();
        if n <= edge {
            return Err(PhysicsError::NotEnoughData {
                what: "zero-phase filtering".to_string(),
                needed: edge + 1,
                found: n,
            });
        }
        let (first, last) = (x[0], x[n - 1]);
        let mut ext = Vec::with_capacity(n + 2 * edge);
        ext.extend((1..=edge).rev().map(|k| 2.0 * first - x[k]));
        ext.extend_from_slice(x);
        ext.extend((1..=edge).map(|k| 2.0 * last - x[n - 1 - k]));
        let zi = self.initial_conditions();
        let mut state: Vec<[f64; 2]> = zi.iter().map(|z| [z[0] * ext[0], z[1] * ext[0]]).collect();
        run(self.sections(), &mut state, &mut ext);
        ext.reverse();
        let y0 = ext[0];
        let mut state: Vec<[f64; 2]> = zi.iter().map(|z| [z[0] * y0, z[1] * y0]).collect();
        run(self.sections(), &mut state, &mut ext);
        ext.reverse();
        ext.truncate(n + edge);
        ext.drain(..edge);
        Ok(ext)
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::FilterBand;
    use crate::units::Frequency;
    use uom::si::frequency::hertz;

    #[test]
    fn settled_start_gives_a_flat_step_response() {
        // Definition of sosfilt_zi: a constant input from a state zi·x0 produces a constant output.
        let hz = Frequency::new::<hertz>;
        let f = SosFilter::bessel(5, FilterBand::LowPass, hz(20.0), hz(1000.0)).unwrap();
        let mut state: Vec<[f64; 2]> = f
            .initial_conditions()
            .iter()
            .map(|z| [z[0] * 3.0, z[1] * 3.0])
            .collect();
        let mut x = vec![3.0; 100];
        run(f.sections(), &mut state, &mut x);
        assert!(x.iter().all(|v| (v - 3.0).abs() < 1e-12));
    }
}
