//! Temperature compensation of a signal from its temperature coefficients of zero and span.
//!
//! Model (common practice; the TC of zero and TC of span figures of a transducer datasheet and of
//! OIML R 60 temperature tests, from memory): at temperature T the signal is
//! s(T) = s_ref·(1 + TC_span·ΔT) + TC_zero·ΔT, ΔT = T − T_ref. Compensation inverts it exactly:
//! s_ref = (s − TC_zero·ΔT)/(1 + TC_span·ΔT).

use super::DataError;
use crate::PhysicsError;

/// Temperature coefficients of a channel.
///
/// ```
/// use gaugebook::TemperatureCompensation;
/// let tc = TemperatureCompensation { tc_zero: 2.0e-4, tc_span: 1.0e-5, reference_k: 296.15 };
/// assert!((tc.compensate(tc.apparent(1.5, 306.15), 306.15) - 1.5).abs() < 1e-15);
/// ```
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct TemperatureCompensation {
    /// Change of the zero per kelvin, in the signal's unit.
    pub tc_zero: f64,
    /// Relative change of the span per kelvin (1/K; 0.0015 %/K = 1.5e-5).
    pub tc_span: f64,
    /// The reference temperature, kelvin.
    pub reference_k: f64,
}

impl TemperatureCompensation {
    /// The signal the model predicts at `temperature_k` for `reference_signal` at the reference.
    ///
    /// ```
    /// let tc = gaugebook::TemperatureCompensation { tc_zero: 1e-4, tc_span: 2e-5, reference_k: 293.15 };
    /// // 10 K warmer: span +0.02 %, zero +0.001.
    /// assert!((tc.apparent(2.0, 303.15) - (2.0 * 1.0002 + 0.001)).abs() < 1e-15);
    /// ```
    pub fn apparent(&self, reference_signal: f64, temperature_k: f64) -> f64 {
        let dt = temperature_k - self.reference_k;
        reference_signal * (1.0 + self.tc_span * dt) + self.tc_zero * dt
    }

    /// The signal at the reference temperature for `signal` read at `temperature_k`.
    ///
    /// ```
    /// let tc = gaugebook::TemperatureCompensation { tc_zero: 1e-4, tc_span: 2e-5, reference_k: 293.15 };
    /// assert!((tc.compensate(2.0 * 1.0002 + 0.001, 303.15) - 2.0).abs() < 1e-15);
    /// ```
    pub fn compensate(&self, signal: f64, temperature_k: f64) -> f64 {
        let dt = temperature_k - self.reference_k;
        (signal - self.tc_zero * dt) / (1.0 + self.tc_span * dt)
    }
}

/// Compensates a column in place, sample by sample, with temperatures in kelvin.
///
/// ```
/// use gaugebook::{TemperatureCompensation, compensate_temperature};
/// let tc = TemperatureCompensation { tc_zero: 0.01, tc_span: 0.0, reference_k: 293.15 };
/// let mut s = vec![1.0, 1.1];
/// compensate_temperature(&mut s, &[293.15, 303.15], &tc)?;
/// assert!((s[1] - 1.0).abs() < 1e-12);
/// # Ok::<(), gaugebook::DataError>(())
/// ```
pub fn compensate_temperature(
    signal: &mut [f64],
    temperatures_k: &[f64],
    tc: &TemperatureCompensation,
) -> Result<(), DataError> {
    if signal.len() != temperatures_k.len() {
        return Err(DataError::LengthMismatch {
            what: "signal and temperature columns".into(),
            left: signal.len(),
            right: temperatures_k.len(),
        });
    }
    crate::check_finite("TC of zero", tc.tc_zero, "")?;
    crate::check_finite("TC of span", tc.tc_span, " 1/K")?;
    crate::check_positive("reference temperature", tc.reference_k, " K")?;
    for (s, &t) in signal.iter_mut().zip(temperatures_k) {
        let dt = t - tc.reference_k;
        let span = 1.0 + tc.tc_span * dt;
        if span <= 0.0 {
            return Err(DataError::Physics(PhysicsError::out_of_range(
                "temperature compensation",
                format!("span factor 1 + TC_span·ΔT = {span} at {t} K, expected above 0"),
            )));
        }
        *s = (*s - tc.tc_zero * dt) / span;
    }
    Ok(())
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn compensation_inverts_the_model_exactly() {
        let tc = TemperatureCompensation {
            tc_zero: -3.0e-5,
            tc_span: 8.0e-6,
            reference_k: 296.15,
        };
        let temps: Vec<f64> = (0..50).map(|i| 263.15 + 2.0 * i as f64).collect();
        let truth: Vec<f64> = (0..50).map(|i| 2.0 * (i as f64 / 49.0)).collect();
        let mut s: Vec<f64> = truth
            .iter()
            .zip(&temps)
            .map(|(&x, &t)| tc.apparent(x, t))
            .collect();
        compensate_temperature(&mut s, &temps, &tc).unwrap();
        for (a, b) in s.iter().zip(&truth) {
            assert!((a - b).abs() < 1e-14);
        }
        assert!(compensate_temperature(&mut s, &temps[..3], &tc).is_err());
    }
}
