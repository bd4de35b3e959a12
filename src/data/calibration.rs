//! From signal (strain or output ratio) to load through a calibration: a linear sensitivity with
//! a zero, or a polynomial. Coefficients are in the calibration's own input and output units.

use super::{Channel, DataError};
use crate::{PhysicsError, Unit};

/// How the load follows from the signal.
///
/// ```
/// use gaugebook::CalibrationModel;
/// let lin = CalibrationModel::Linear { sensitivity: 0.2, zero: 0.01 };
/// assert!((lin.load(2.01) - 10.0).abs() < 1e-12);
/// let poly = CalibrationModel::Polynomial { coefficients: vec![1.0, 2.0, 3.0] };
/// assert_eq!(poly.load(2.0), 1.0 + 4.0 + 12.0);
/// ```
#[derive(Clone, Debug, PartialEq)]
pub enum CalibrationModel {
    /// load = (signal − zero) / sensitivity; sensitivity in signal units per load unit (for a
    /// load cell, rated output over capacity: 2 mV/V per 10 kN = 0.2 (mV/V)/kN).
    Linear {
        /// Signal per unit load.
        sensitivity: f64,
        /// Signal at no load.
        zero: f64,
    },
    /// load = Σ cₖ·signalᵏ, constant term first (numpy.polynomial order).
    Polynomial {
        /// c₀, c₁, c₂ …
        coefficients: Vec<f64>,
    },
}

impl CalibrationModel {
    /// The load for one signal value.
    ///
    /// ```
    /// use gaugebook::CalibrationModel;
    /// // 2 mV/V at 10 kN with a zero of 0.012 mV/V: 1.012 mV/V reads 5 kN.
    /// let m = CalibrationModel::Linear { sensitivity: 0.2, zero: 0.012 };
    /// assert!((m.load(1.012) - 5.0).abs() < 1e-12);
    /// ```
    pub fn load(&self, x: f64) -> f64 {
        match self {
            CalibrationModel::Linear { sensitivity, zero } => (x - zero) / sensitivity,
            // Horner's rule: fewer operations and less rounding than summing powers.
            CalibrationModel::Polynomial { coefficients } => {
                coefficients.iter().rev().fold(0.0, |acc, &c| acc * x + c)
            }
        }
    }
}

/// A calibration: its model, the unit the signal is taken in and the unit the load comes out in.
///
/// ```
/// use gaugebook::{Calibration, CalibrationModel, Channel, Unit};
/// let cal = Calibration::new(
///     CalibrationModel::Linear { sensitivity: 0.2, zero: 0.0 },
///     Unit::parse("mV/V")?,
///     Unit::parse("kN")?,
/// )?;
/// let signal = Channel::new("out", Unit::parse("V/V")?, vec![0.0, 1.0e-3]);
/// let load = cal.apply_channel(&signal)?;
/// assert_eq!(load.unit.symbol(), "kN");
/// assert!((load.values[1] - 5.0).abs() < 1e-12);
/// # Ok::<(), Box<dyn std::error::Error>>(())
/// ```
#[derive(Clone, Debug, PartialEq)]
pub struct Calibration {
    /// The model.
    pub model: CalibrationModel,
    /// The unit of the signal in the model.
    pub input: Unit,
    /// The unit of the load out of the model.
    pub output: Unit,
}

impl Calibration {
    /// Checks the model (finite coefficients, sensitivity not zero) and builds the calibration.
    ///
    /// ```
    /// use gaugebook::{Calibration, CalibrationModel, Unit};
    /// let bad = CalibrationModel::Linear { sensitivity: 0.0, zero: 0.0 };
    /// assert!(Calibration::new(bad, Unit::parse("mV/V")?, Unit::parse("N")?).is_err());
    /// # Ok::<(), Box<dyn std::error::Error>>(())
    /// ```
    pub fn new(
        model: CalibrationModel,
        input: Unit,
        output: Unit,
    ) -> Result<Calibration, PhysicsError> {
        match &model {
            CalibrationModel::Linear { sensitivity, zero } => {
                crate::check_finite("calibration zero", *zero, "")?;
                if !sensitivity.is_finite() || *sensitivity == 0.0 {
                    return Err(PhysicsError::invalid(
                        "calibration sensitivity",
                        sensitivity.to_string(),
                        "a finite sensitivity other than 0",
                    ));
                }
            }
            CalibrationModel::Polynomial { coefficients } => {
                if coefficients.is_empty() || coefficients.iter().any(|c| !c.is_finite()) {
                    return Err(PhysicsError::invalid(
                        "calibration polynomial",
                        format!("{coefficients:?}"),
                        "one or more finite coefficients",
                    ));
                }
            }
        }
        Ok(Calibration {
            model,
            input,
            output,
        })
    }

    /// Loads for signals already in the calibration's input unit.
    ///
    /// ```
    /// use gaugebook::{Calibration, CalibrationModel, Unit};
    /// let cal = Calibration::new(
    ///     CalibrationModel::Polynomial { coefficients: vec![0.0, 10.0] },
    ///     Unit::parse("mV/V")?, Unit::parse("kN")?,
    /// )?;
    /// assert_eq!(cal.apply(&[0.5, 1.0]), vec![5.0, 10.0]);
    /// # Ok::<(), Box<dyn std::error::Error>>(())
    /// ```
    pub fn apply(&self, signal: &[f64]) -> Vec<f64> {
        signal.iter().map(|&x| self.model.load(x)).collect()
    }

    /// A load channel from a signal channel, converting the channel's unit to the calibration's
    /// input unit first (they must share dimension and kind).
    pub fn apply_channel(&self, signal: &Channel) -> Result<Channel, DataError> {
        let u = &signal.unit;
        if u.dimension() != self.input.dimension() || u.kind() != self.input.kind() {
            return Err(DataError::Physics(PhysicsError::invalid(
                format!("unit of channel `{}`", signal.name),
                u.symbol().to_string(),
                format!(
                    "a unit like the calibration's input, {}",
                    self.input.symbol()
                ),
            )));
        }
        // Both units are linear here (no offset: signals are not absolute temperatures).
        let k = u.factor() / self.input.factor();
        let values = signal
            .values
            .iter()
            .map(|&x| self.model.load(x * k))
            .collect();
        Ok(Channel {
            name: signal.name.clone(),
            header: signal.header.clone(),
            column: signal.column,
            unit: self.output.clone(),
            values,
            meta: signal.meta.clone(),
        })
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn linear_inverts_the_forward_line() {
        // Closed form: signal = zero + sensitivity·load, so load(signal) returns the load.
        let m = CalibrationModel::Linear {
            sensitivity: 0.19987,
            zero: -0.0123,
        };
        for load in [-5.0, 0.0, 3.3, 10.0] {
            let s = -0.0123 + 0.19987 * load;
            assert!((m.load(s) - load).abs() < 1e-12);
        }
    }

    #[test]
    fn horner_matches_power_sum() {
        // numpy.polynomial.polynomial.polyval([1.5, -2, 0.25, 1e-3], 3.0) = 1.5 - 6 + 2.25 + 0.027
        // = -2.223 (numpy 2.4.6; the sum is exact arithmetic here).
        let m = CalibrationModel::Polynomial {
            coefficients: vec![1.5, -2.0, 0.25, 1e-3],
        };
        assert!((m.load(3.0) + 2.223).abs() < 1e-12);
    }
}
