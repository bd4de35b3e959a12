//! Frequency response of a section cascade: H(e^{iω}) = ∏ (b0 + b1 e^{−iω} + b2 e^{−2iω}) /
//! (1 + a1 e^{−iω} + a2 e^{−2iω}) with ω = 2π f / f_s, what scipy.signal.sosfreqz evaluates.

use super::complex::C;
use super::filter::SosFilter;
use crate::PhysicsError;
use crate::units::Frequency;
use uom::si::frequency::hertz;

/// Gain and phase of a filter at one frequency.
///
/// ```
/// use gaugebook::{FilterBand, SosFilter};
/// use gaugebook::units::Frequency;
/// use uom::si::frequency::hertz;
/// let hz = Frequency::new::<hertz>;
/// let f = SosFilter::butterworth(2, FilterBand::LowPass, hz(50.0), hz(1000.0))?;
/// let r = f.response(hz(50.0), hz(1000.0))?;
/// assert!((r.magnitude_db() + 3.0103).abs() < 1e-4);
/// assert!((r.phase + std::f64::consts::FRAC_PI_2).abs() < 1e-12); // −90° at cutoff, order 2
/// # Ok::<(), gaugebook::PhysicsError>(())
/// ```
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct FrequencyResponse {
    /// |H|, a plain ratio.
    pub magnitude: f64,
    /// arg H in radians, in (−π, π].
    pub phase: f64,
}

impl FrequencyResponse {
    /// 20 log10 |H| in dB.
    ///
    /// ```
    /// let r = gaugebook::FrequencyResponse { magnitude: 0.1, phase: 0.0 };
    /// assert!((r.magnitude_db() + 20.0).abs() < 1e-12);
    /// ```
    pub fn magnitude_db(&self) -> f64 {
        20.0 * self.magnitude.log10()
    }
}

impl SosFilter {
    /// The response at `frequency` for a filter run at `sample_rate`; frequencies from 0 to
    /// Nyquist (half the sample rate) inclusive are accepted.
    ///
    /// ```
    /// use gaugebook::{FilterBand, SosFilter};
    /// use gaugebook::units::Frequency;
    /// use uom::si::frequency::hertz;
    /// let hz = Frequency::new::<hertz>;
    /// let f = SosFilter::butterworth(4, FilterBand::LowPass, hz(50.0), hz(1000.0))?;
    /// assert!(f.response(hz(500.0), hz(1000.0))?.magnitude < 1e-12); // zeros at Nyquist
    /// assert!(f.response(hz(600.0), hz(1000.0)).is_err());
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn response(
        &self,
        frequency: Frequency,
        sample_rate: Frequency,
    ) -> Result<FrequencyResponse, PhysicsError> {
        let fs = crate::check_positive("sample rate", sample_rate.get::<hertz>(), "Hz")?;
        let f = frequency.get::<hertz>();
        if !(f.is_finite() && (0.0..=fs / 2.0).contains(&f)) {
            return Err(PhysicsError::invalid(
                "response frequency",
                format!("{f} Hz"),
                format!("a frequency from 0 to Nyquist, {} Hz", fs / 2.0),
            ));
        }
        let w = 2.0 * std::f64::consts::PI * f / fs;
        let z1 = C::cis(-w);
        let z2 = C::cis(-2.0 * w);
        let mut h = C::real(1.0);
        for s in self.sections() {
            let num = C::real(s[0]) + z1 * s[1] + z2 * s[2];
            let den = C::real(s[3]) + z1 * s[4] + z2 * s[5];
            h = h * (num / den);
        }
        Ok(FrequencyResponse {
            magnitude: h.abs(),
            phase: h.im.atan2(h.re),
        })
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::FilterBand;

    #[test]
    fn butterworth_magnitude_follows_the_closed_form() {
        // Digital Butterworth via bilinear transform: |H|² = 1 / (1 + (tan(πf/fs)/tan(πfc/fs))^(2N))
        // (the prewarped analog response; Oppenheim & Schafer 3rd ed. §7.1.2, from memory).
        let hz = Frequency::new::<hertz>;
        for order in 1..=12 {
            let f =
                SosFilter::butterworth(order, FilterBand::LowPass, hz(40.0), hz(1000.0)).unwrap();
            for fr in [0.0, 5.0, 40.0, 100.0, 300.0] {
                let r = f.response(hz(fr), hz(1000.0)).unwrap().magnitude;
                let ratio = (std::f64::consts::PI * fr / 1000.0).tan()
                    / (std::f64::consts::PI * 40.0 / 1000.0).tan();
                let want = 1.0 / (1.0 + ratio.powi(2 * order as i32)).sqrt();
                assert!(
                    (r - want).abs() < 1e-12 * want.max(1e-3),
                    "N={order} f={fr}: {r} vs {want}"
                );
            }
        }
    }
}
