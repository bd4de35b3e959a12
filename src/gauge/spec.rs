//! A bonded resistance strain gauge: resistance, gauge factor, transverse sensitivity, grid
//! size, and how the gauge factor and the zero move with temperature.
//!
//! Terms follow ASTM E251 (from memory): the gauge factor F is the ratio of ΔR/R to the axial
//! strain, measured in a uniaxial stress field on a calibration beam whose Poisson's ratio ν₀
//! is stated; the transverse sensitivity coefficient is K_t = F_t/F_a, the ratio of the
//! transverse to the axial sensitivity. Then ΔR/R = F_a·(ε_a + K_t·ε_t) with
//! F = F_a·(1 − ν₀·K_t) (Dally & Riley, *Experimental Stress Analysis*, 4th ed., §6 on
//! transverse sensitivity, from memory).

use uom::si::area::square_meter;
use uom::si::electrical_resistance::ohm;
use uom::si::length::meter;
use uom::si::temperature_coefficient::per_kelvin;
use uom::si::thermodynamic_temperature::kelvin;

use super::ThermalOutput;
use crate::units::{
    Area, ElectricalResistance, Length, TemperatureCoefficient, ThermodynamicTemperature,
};
use crate::{PhysicsError, Strain, check_finite, check_poisson, check_positive};

/// Poisson's ratio of the gauge-factor calibration beam when none is given: 0.285, the value
/// ASTM E251 (from memory) and the trade (common practice) quote for the steel calibration beam.
///
/// ```
/// assert_eq!(gaugebook::DEFAULT_CALIBRATION_POISSON, 0.285);
/// ```
pub const DEFAULT_CALIBRATION_POISSON: f64 = 0.285;

/// A bonded resistance strain gauge.
///
/// Built with [`Gauge::new`] and refined with the `with_*` builders, each of which checks its
/// input. Defaults: no transverse sensitivity (K_t = 0), ν₀ = 0.285, no grid size, no change of
/// gauge factor with temperature, no thermal output.
///
/// ```
/// use gaugebook::{Gauge, Strain};
/// use gaugebook::units::ElectricalResistance;
/// use uom::si::electrical_resistance::ohm;
/// let g = Gauge::new(ElectricalResistance::new::<ohm>(350.0), 2.0)?;
/// let dr = g.relative_change(Strain::from_microstrain(1000.0), Strain::ZERO);
/// assert!((dr - 2.0e-3).abs() < 1e-15);
/// # Ok::<(), gaugebook::PhysicsError>(())
/// ```
#[derive(Clone, Debug, PartialEq)]
pub struct Gauge {
    resistance: ElectricalResistance,
    gauge_factor: f64,
    transverse_sensitivity: f64,
    calibration_poisson: f64,
    grid_length: Option<Length>,
    grid_width: Option<Length>,
    gauge_factor_tc: TemperatureCoefficient,
    gauge_factor_reference: ThermodynamicTemperature,
    thermal_output: ThermalOutput,
}

impl Gauge {
    /// A gauge of nominal resistance `resistance` and gauge factor `gauge_factor`.
    ///
    /// Errors unless the resistance and the gauge factor are finite and above zero.
    ///
    /// ```
    /// use gaugebook::Gauge;
    /// use gaugebook::units::ElectricalResistance;
    /// use uom::si::electrical_resistance::ohm;
    /// assert!(Gauge::new(ElectricalResistance::new::<ohm>(120.0), 2.1).is_ok());
    /// assert!(Gauge::new(ElectricalResistance::new::<ohm>(0.0), 2.1).is_err());
    /// assert!(Gauge::new(ElectricalResistance::new::<ohm>(120.0), -2.0).is_err());
    /// ```
    pub fn new(resistance: ElectricalResistance, gauge_factor: f64) -> Result<Gauge, PhysicsError> {
        check_positive("gauge resistance", resistance.get::<ohm>(), "Ω")?;
        check_positive("gauge factor", gauge_factor, "")?;
        Ok(Gauge {
            resistance,
            gauge_factor,
            transverse_sensitivity: 0.0,
            calibration_poisson: DEFAULT_CALIBRATION_POISSON,
            grid_length: None,
            grid_width: None,
            gauge_factor_tc: TemperatureCoefficient::new::<per_kelvin>(0.0),
            // 20 °C, the standard reference temperature of ISO 1:2016.
            gauge_factor_reference: ThermodynamicTemperature::new::<kelvin>(293.15),
            thermal_output: ThermalOutput::none(),
        })
    }

    /// The same gauge with transverse sensitivity coefficient `kt` (K_t = F_t/F_a, a plain
    /// ratio; datasheets quote it in percent, so 1.5 % is 0.015).
    ///
    /// Errors unless |K_t| < 1 (a gauge more sensitive across than along is not a gauge) and
    /// finite.
    ///
    /// ```
    /// use gaugebook::Gauge;
    /// use gaugebook::units::ElectricalResistance;
    /// use uom::si::electrical_resistance::ohm;
    /// let g = Gauge::new(ElectricalResistance::new::<ohm>(350.0), 2.0)?.with_transverse_sensitivity(0.015)?;
    /// assert_eq!(g.transverse_sensitivity(), 0.015);
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn with_transverse_sensitivity(mut self, kt: f64) -> Result<Gauge, PhysicsError> {
        if !(kt.is_finite() && kt.abs() < 1.0) {
            return Err(PhysicsError::invalid(
                "transverse sensitivity coefficient",
                kt,
                "a finite value in (-1, 1)",
            ));
        }
        self.transverse_sensitivity = kt;
        Ok(self)
    }

    /// The same gauge with the Poisson's ratio ν₀ of the beam its gauge factor was measured on.
    ///
    /// ```
    /// use gaugebook::Gauge;
    /// use gaugebook::units::ElectricalResistance;
    /// use uom::si::electrical_resistance::ohm;
    /// let g = Gauge::new(ElectricalResistance::new::<ohm>(350.0), 2.0)?;
    /// assert!(g.clone().with_calibration_poisson(0.3).is_ok());
    /// assert!(g.with_calibration_poisson(0.5).is_err());
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn with_calibration_poisson(mut self, nu0: f64) -> Result<Gauge, PhysicsError> {
        self.calibration_poisson = check_poisson(nu0)?;
        Ok(self)
    }

    /// The same gauge with an active grid of `length` (along the gauge axis) by `width`.
    ///
    /// ```
    /// use gaugebook::Gauge;
    /// use gaugebook::units::{ElectricalResistance, Length};
    /// use uom::si::{electrical_resistance::ohm, length::millimeter, area::square_millimeter};
    /// let g = Gauge::new(ElectricalResistance::new::<ohm>(350.0), 2.0)?
    ///     .with_grid(Length::new::<millimeter>(3.0), Length::new::<millimeter>(2.0))?;
    /// let a = g.grid_area().unwrap().get::<square_millimeter>();
    /// assert!((a - 6.0).abs() < 1e-12);
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn with_grid(mut self, length: Length, width: Length) -> Result<Gauge, PhysicsError> {
        check_positive("grid length", length.get::<meter>(), "m")?;
        check_positive("grid width", width.get::<meter>(), "m")?;
        self.grid_length = Some(length);
        self.grid_width = Some(width);
        Ok(self)
    }

    /// The same gauge with a gauge factor that changes linearly with temperature,
    /// F(T) = F·(1 + α·(T − T_ref)), where F is the gauge factor at `reference`.
    ///
    /// ```
    /// use gaugebook::Gauge;
    /// use gaugebook::units::{ElectricalResistance, TemperatureCoefficient, ThermodynamicTemperature};
    /// use uom::si::{electrical_resistance::ohm, temperature_coefficient::ppm_per_kelvin};
    /// use uom::si::thermodynamic_temperature::degree_celsius;
    /// let g = Gauge::new(ElectricalResistance::new::<ohm>(350.0), 2.0)?.with_gauge_factor_tc(
    ///     TemperatureCoefficient::new::<ppm_per_kelvin>(100.0),
    ///     ThermodynamicTemperature::new::<degree_celsius>(24.0),
    /// )?;
    /// let f = g.gauge_factor_at(ThermodynamicTemperature::new::<degree_celsius>(124.0));
    /// assert!((f - 2.02).abs() < 1e-12);
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn with_gauge_factor_tc(
        mut self,
        tc: TemperatureCoefficient,
        reference: ThermodynamicTemperature,
    ) -> Result<Gauge, PhysicsError> {
        check_finite(
            "gauge-factor temperature coefficient",
            tc.get::<per_kelvin>(),
            "1/K",
        )?;
        check_positive(
            "gauge-factor reference temperature",
            reference.get::<kelvin>(),
            "K",
        )?;
        self.gauge_factor_tc = tc;
        self.gauge_factor_reference = reference;
        Ok(self)
    }

    /// The same gauge with a thermal-output polynomial (see [`ThermalOutput`]).
    ///
    /// ```
    /// use gaugebook::{Gauge, ThermalOutput};
    /// use gaugebook::units::{ElectricalResistance, ThermodynamicTemperature};
    /// use uom::si::{electrical_resistance::ohm, thermodynamic_temperature::degree_celsius};
    /// let t0 = ThermodynamicTemperature::new::<degree_celsius>(24.0);
    /// let g = Gauge::new(ElectricalResistance::new::<ohm>(350.0), 2.0)?
    ///     .with_thermal_output(ThermalOutput::new(t0, vec![0.0, 1.0e-6])?);
    /// let e = g.thermal_output(ThermodynamicTemperature::new::<degree_celsius>(34.0));
    /// assert!((e.microstrain() - 10.0).abs() < 1e-9);
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn with_thermal_output(mut self, thermal_output: ThermalOutput) -> Gauge {
        self.thermal_output = thermal_output;
        self
    }

    /// Nominal (unstrained) resistance.
    ///
    /// ```
    /// use gaugebook::Gauge;
    /// use gaugebook::units::ElectricalResistance;
    /// use uom::si::electrical_resistance::ohm;
    /// let g = Gauge::new(ElectricalResistance::new::<ohm>(350.0), 2.0)?;
    /// assert_eq!(g.resistance().get::<ohm>(), 350.0);
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn resistance(&self) -> ElectricalResistance {
        self.resistance
    }

    /// Gauge factor F at its reference temperature (ASTM E251's F, measured with ν₀).
    ///
    /// ```
    /// use gaugebook::Gauge;
    /// use gaugebook::units::ElectricalResistance;
    /// use uom::si::electrical_resistance::ohm;
    /// assert_eq!(Gauge::new(ElectricalResistance::new::<ohm>(350.0), 2.05)?.gauge_factor(), 2.05);
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn gauge_factor(&self) -> f64 {
        self.gauge_factor
    }

    /// Transverse sensitivity coefficient K_t (plain ratio).
    ///
    /// ```
    /// use gaugebook::Gauge;
    /// use gaugebook::units::ElectricalResistance;
    /// use uom::si::electrical_resistance::ohm;
    /// assert_eq!(Gauge::new(ElectricalResistance::new::<ohm>(350.0), 2.0)?.transverse_sensitivity(), 0.0);
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn transverse_sensitivity(&self) -> f64 {
        self.transverse_sensitivity
    }

    /// Poisson's ratio ν₀ of the gauge-factor calibration beam.
    ///
    /// ```
    /// use gaugebook::Gauge;
    /// use gaugebook::units::ElectricalResistance;
    /// use uom::si::electrical_resistance::ohm;
    /// assert_eq!(Gauge::new(ElectricalResistance::new::<ohm>(350.0), 2.0)?.calibration_poisson(), 0.285);
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn calibration_poisson(&self) -> f64 {
        self.calibration_poisson
    }

    /// Axial sensitivity F_a = F/(1 − ν₀·K_t): ΔR/R per unit axial strain with no transverse
    /// strain.
    ///
    /// ```
    /// use gaugebook::Gauge;
    /// use gaugebook::units::ElectricalResistance;
    /// use uom::si::electrical_resistance::ohm;
    /// let g = Gauge::new(ElectricalResistance::new::<ohm>(350.0), 2.0)?.with_transverse_sensitivity(0.02)?;
    /// assert!((g.axial_sensitivity() - 2.0 / (1.0 - 0.285 * 0.02)).abs() < 1e-12);
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn axial_sensitivity(&self) -> f64 {
        // 1 − ν₀·K_t > 0 because |ν₀| < 1 and |K_t| < 1.
        self.gauge_factor / (1.0 - self.calibration_poisson * self.transverse_sensitivity)
    }

    /// Grid length along the gauge axis, if given.
    ///
    /// ```
    /// use gaugebook::Gauge;
    /// use gaugebook::units::ElectricalResistance;
    /// use uom::si::electrical_resistance::ohm;
    /// assert!(Gauge::new(ElectricalResistance::new::<ohm>(350.0), 2.0)?.grid_length().is_none());
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn grid_length(&self) -> Option<Length> {
        self.grid_length
    }

    /// Grid width across the gauge axis, if given.
    ///
    /// ```
    /// use gaugebook::Gauge;
    /// use gaugebook::units::ElectricalResistance;
    /// use uom::si::electrical_resistance::ohm;
    /// assert!(Gauge::new(ElectricalResistance::new::<ohm>(350.0), 2.0)?.grid_width().is_none());
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn grid_width(&self) -> Option<Length> {
        self.grid_width
    }

    /// Active grid area (length × width), the area for the grid's power density, if the grid
    /// size was given.
    ///
    /// ```
    /// use gaugebook::Gauge;
    /// use gaugebook::units::{ElectricalResistance, Length};
    /// use uom::si::{electrical_resistance::ohm, length::millimeter, area::square_millimeter};
    /// let g = Gauge::new(ElectricalResistance::new::<ohm>(350.0), 2.0)?
    ///     .with_grid(Length::new::<millimeter>(6.0), Length::new::<millimeter>(3.0))?;
    /// assert!((g.grid_area().unwrap().get::<square_millimeter>() - 18.0).abs() < 1e-12);
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn grid_area(&self) -> Option<Area> {
        match (self.grid_length, self.grid_width) {
            (Some(l), Some(w)) => Some(Area::new::<square_meter>(
                l.get::<meter>() * w.get::<meter>(),
            )),
            _ => None,
        }
    }

    /// Temperature coefficient α of the gauge factor.
    ///
    /// ```
    /// use gaugebook::Gauge;
    /// use gaugebook::units::ElectricalResistance;
    /// use uom::si::{electrical_resistance::ohm, temperature_coefficient::per_kelvin};
    /// let g = Gauge::new(ElectricalResistance::new::<ohm>(350.0), 2.0)?;
    /// assert_eq!(g.gauge_factor_tc().get::<per_kelvin>(), 0.0);
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn gauge_factor_tc(&self) -> TemperatureCoefficient {
        self.gauge_factor_tc
    }

    /// Temperature at which [`gauge_factor`](Gauge::gauge_factor) holds.
    ///
    /// ```
    /// use gaugebook::Gauge;
    /// use gaugebook::units::ElectricalResistance;
    /// use uom::si::{electrical_resistance::ohm, thermodynamic_temperature::kelvin};
    /// let g = Gauge::new(ElectricalResistance::new::<ohm>(350.0), 2.0)?;
    /// assert_eq!(g.gauge_factor_reference().get::<kelvin>(), 293.15);
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn gauge_factor_reference(&self) -> ThermodynamicTemperature {
        self.gauge_factor_reference
    }

    /// The thermal-output polynomial.
    ///
    /// ```
    /// use gaugebook::Gauge;
    /// use gaugebook::units::ElectricalResistance;
    /// use uom::si::electrical_resistance::ohm;
    /// let g = Gauge::new(ElectricalResistance::new::<ohm>(350.0), 2.0)?;
    /// assert!(g.thermal_output_model().coefficients().is_empty());
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn thermal_output_model(&self) -> &ThermalOutput {
        &self.thermal_output
    }

    /// Gauge factor at temperature `t`: F·(1 + α·(T − T_ref)).
    ///
    /// ```
    /// use gaugebook::Gauge;
    /// use gaugebook::units::{ElectricalResistance, ThermodynamicTemperature};
    /// use uom::si::{electrical_resistance::ohm, thermodynamic_temperature::kelvin};
    /// let g = Gauge::new(ElectricalResistance::new::<ohm>(350.0), 2.0)?;
    /// assert_eq!(g.gauge_factor_at(ThermodynamicTemperature::new::<kelvin>(400.0)), 2.0);
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn gauge_factor_at(&self, t: ThermodynamicTemperature) -> f64 {
        let dt = t.get::<kelvin>() - self.gauge_factor_reference.get::<kelvin>();
        self.gauge_factor * (1.0 + self.gauge_factor_tc.get::<per_kelvin>() * dt)
    }

    /// Apparent strain at temperature `t` from the thermal-output polynomial.
    ///
    /// ```
    /// use gaugebook::Gauge;
    /// use gaugebook::units::{ElectricalResistance, ThermodynamicTemperature};
    /// use uom::si::{electrical_resistance::ohm, thermodynamic_temperature::kelvin};
    /// let g = Gauge::new(ElectricalResistance::new::<ohm>(350.0), 2.0)?;
    /// assert_eq!(g.thermal_output(ThermodynamicTemperature::new::<kelvin>(400.0)).value(), 0.0);
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn thermal_output(&self, t: ThermodynamicTemperature) -> Strain {
        self.thermal_output.at(t)
    }

    /// Relative resistance change ΔR/R = F_a·(ε_a + K_t·ε_t) = F·(ε_a + K_t·ε_t)/(1 − ν₀·K_t)
    /// for axial strain `axial` (along the grid) and transverse strain `transverse` (across it).
    ///
    /// With ε_t = −ν₀·ε_a (the calibration field) this is exactly F·ε_a, which is how ASTM E251
    /// defines F (from memory).
    ///
    /// ```
    /// use gaugebook::{Gauge, Strain};
    /// use gaugebook::units::ElectricalResistance;
    /// use uom::si::electrical_resistance::ohm;
    /// let g = Gauge::new(ElectricalResistance::new::<ohm>(350.0), 2.0)?.with_transverse_sensitivity(0.03)?;
    /// let ea = Strain::from_microstrain(1000.0);
    /// let dr = g.relative_change(ea, -0.285 * ea);
    /// assert!((dr - 2.0e-3).abs() < 1e-15);
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn relative_change(&self, axial: Strain, transverse: Strain) -> f64 {
        self.axial_sensitivity()
            * (axial.value() + self.transverse_sensitivity * transverse.value())
    }

    /// The strain an instrument set to this gauge's factor F reads: (ΔR/R)/F.
    ///
    /// ```
    /// use gaugebook::{Gauge, Strain};
    /// use gaugebook::units::ElectricalResistance;
    /// use uom::si::electrical_resistance::ohm;
    /// let g = Gauge::new(ElectricalResistance::new::<ohm>(350.0), 2.0)?;
    /// let e = g.indicated_strain(Strain::from_microstrain(500.0), Strain::from_microstrain(-150.0));
    /// assert!((e.microstrain() - 500.0).abs() < 1e-9);
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn indicated_strain(&self, axial: Strain, transverse: Strain) -> Strain {
        Strain::new(self.relative_change(axial, transverse) / self.gauge_factor)
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    fn g() -> Gauge {
        Gauge::new(ElectricalResistance::new::<ohm>(350.0), 2.1).unwrap()
    }

    #[test]
    fn calibration_field_gives_the_gauge_factor() {
        // ASTM E251 definition (from memory): in ε_t = −ν₀ε_a, ΔR/R = F·ε_a for any K_t.
        for kt in [-0.05, 0.0, 0.01, 0.04] {
            let gg = g().with_transverse_sensitivity(kt).unwrap();
            let ea = Strain::from_microstrain(1234.0);
            let dr = gg.relative_change(ea, -DEFAULT_CALIBRATION_POISSON * ea);
            assert!((dr - 2.1 * 1234e-6).abs() < 1e-15, "kt {kt}");
        }
    }

    #[test]
    fn bad_parameters_are_typed_errors() {
        let r = ElectricalResistance::new::<ohm>(f64::NAN);
        assert!(matches!(
            Gauge::new(r, 2.0),
            Err(PhysicsError::InvalidParameter { .. })
        ));
        assert!(g().with_transverse_sensitivity(1.0).is_err());
        assert!(g().with_transverse_sensitivity(f64::NAN).is_err());
        assert!(g().with_calibration_poisson(-1.0).is_err());
        let zero = Length::new::<meter>(0.0);
        assert!(g().with_grid(zero, Length::new::<meter>(1e-3)).is_err());
    }
}
