//! Thermal output (apparent strain) of a bonded gauge as a polynomial in temperature.
//!
//! A gauge bonded to a specimen that is free to expand reads a strain when only the temperature
//! changes: the grid's resistance changes with temperature and the grid is forced to follow the
//! specimen's expansion rather than its own. ASTM E251 calls this the thermal output (from
//! memory). It is measured on a free specimen of the intended material and quoted as a
//! polynomial in temperature, which is what this type holds. The polynomial is written in the
//! difference from a stated reference temperature so that its coefficients stay well scaled.

use uom::si::thermodynamic_temperature::kelvin;

use crate::units::ThermodynamicTemperature;
use crate::{PhysicsError, Strain};

/// Thermal output ε_app(T) = Σₖ cₖ·(T − T_ref)ᵏ, with cₖ in (m/m)/Kᵏ.
///
/// The coefficients are plain numbers because their units differ with the power (m/m, (m/m)/K,
/// (m/m)/K² …); the constructor takes them lowest power first. The value at the reference
/// temperature is c₀, which need not be zero.
///
/// ```
/// use gaugebook::ThermalOutput;
/// use gaugebook::units::ThermodynamicTemperature;
/// use uom::si::thermodynamic_temperature::degree_celsius;
/// let t0 = ThermodynamicTemperature::new::<degree_celsius>(20.0);
/// // −2 µε/K and +0.05 µε/K² about 20 °C.
/// let to = ThermalOutput::new(t0, vec![0.0, -2.0e-6, 0.05e-6])?;
/// let at_60 = to.at(ThermodynamicTemperature::new::<degree_celsius>(60.0));
/// assert!((at_60.microstrain() - (-80.0 + 80.0)).abs() < 1e-9);
/// # Ok::<(), gaugebook::PhysicsError>(())
/// ```
#[derive(Clone, Debug, PartialEq)]
pub struct ThermalOutput {
    reference: ThermodynamicTemperature,
    coefficients: Vec<f64>,
}

impl ThermalOutput {
    /// A thermal-output polynomial about `reference`, coefficients lowest power first.
    ///
    /// Errors when the reference temperature is not above absolute zero or any coefficient is
    /// not finite. An empty list is the zero polynomial.
    ///
    /// ```
    /// use gaugebook::ThermalOutput;
    /// use gaugebook::units::ThermodynamicTemperature;
    /// use uom::si::thermodynamic_temperature::kelvin;
    /// let t0 = ThermodynamicTemperature::new::<kelvin>(293.15);
    /// assert!(ThermalOutput::new(t0, vec![f64::NAN]).is_err());
    /// assert!(ThermalOutput::new(t0, vec![]).is_ok());
    /// ```
    pub fn new(
        reference: ThermodynamicTemperature,
        coefficients: Vec<f64>,
    ) -> Result<ThermalOutput, PhysicsError> {
        crate::check_positive(
            "thermal-output reference temperature",
            reference.get::<kelvin>(),
            "K",
        )?;
        for (k, c) in coefficients.iter().enumerate() {
            crate::check_finite(&format!("thermal-output coefficient c{k}"), *c, "")?;
        }
        Ok(ThermalOutput {
            reference,
            coefficients,
        })
    }

    /// No thermal output at any temperature (the default of a [`Gauge`](crate::Gauge)).
    ///
    /// ```
    /// use gaugebook::ThermalOutput;
    /// use gaugebook::units::ThermodynamicTemperature;
    /// use uom::si::thermodynamic_temperature::kelvin;
    /// let t = ThermodynamicTemperature::new::<kelvin>(350.0);
    /// assert_eq!(ThermalOutput::none().at(t).value(), 0.0);
    /// ```
    pub fn none() -> ThermalOutput {
        ThermalOutput {
            // 20 °C, the standard reference temperature of ISO 1:2016; irrelevant for a zero
            // polynomial but kept meaningful.
            reference: ThermodynamicTemperature::new::<kelvin>(293.15),
            coefficients: Vec::new(),
        }
    }

    /// The reference temperature the polynomial is written about.
    ///
    /// ```
    /// use gaugebook::ThermalOutput;
    /// use uom::si::thermodynamic_temperature::kelvin;
    /// assert_eq!(ThermalOutput::none().reference().get::<kelvin>(), 293.15);
    /// ```
    pub fn reference(&self) -> ThermodynamicTemperature {
        self.reference
    }

    /// The coefficients, lowest power first, in (m/m)/Kᵏ.
    ///
    /// ```
    /// assert!(gaugebook::ThermalOutput::none().coefficients().is_empty());
    /// ```
    pub fn coefficients(&self) -> &[f64] {
        &self.coefficients
    }

    /// The apparent strain at temperature `t`.
    ///
    /// ```
    /// use gaugebook::ThermalOutput;
    /// use gaugebook::units::ThermodynamicTemperature;
    /// use uom::si::thermodynamic_temperature::kelvin;
    /// let to = ThermalOutput::new(ThermodynamicTemperature::new::<kelvin>(300.0), vec![1e-6, 1e-6])?;
    /// let e = to.at(ThermodynamicTemperature::new::<kelvin>(310.0));
    /// assert!((e.microstrain() - 11.0).abs() < 1e-9);
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn at(&self, t: ThermodynamicTemperature) -> Strain {
        let dt = t.get::<kelvin>() - self.reference.get::<kelvin>();
        // Horner's rule: fewer roundings than summing powers.
        let v = self
            .coefficients
            .iter()
            .rev()
            .fold(0.0, |acc, c| acc * dt + c);
        Strain::new(v)
    }
}

impl Default for ThermalOutput {
    fn default() -> ThermalOutput {
        ThermalOutput::none()
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn horner_matches_power_sum() {
        // Closed-form identity: Horner's rule equals the power sum.
        let t0 = ThermodynamicTemperature::new::<kelvin>(297.15);
        let c = vec![-3e-6, 1.5e-6, -2e-8, 4e-10];
        let to = ThermalOutput::new(t0, c.clone()).unwrap();
        let t = ThermodynamicTemperature::new::<kelvin>(370.0);
        let dt: f64 = 370.0 - 297.15;
        let direct: f64 = c
            .iter()
            .enumerate()
            .map(|(k, ck)| ck * dt.powi(k as i32))
            .sum();
        assert!((to.at(t).value() - direct).abs() < 1e-15);
    }

    #[test]
    fn bad_reference_is_an_error() {
        let t0 = ThermodynamicTemperature::new::<kelvin>(0.0);
        assert!(matches!(
            ThermalOutput::new(t0, vec![]),
            Err(PhysicsError::InvalidParameter { .. })
        ));
    }
}
