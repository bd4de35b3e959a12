//! Lead wires: resistance per wire and how it changes with temperature.
//!
//! Copper's figures are those of the International Annealed Copper Standard, IEC 60028 (1925)
//! and NIST Handbook 100, *Copper Wire Tables* (1966) (both from memory): resistivity
//! 1/58 Ω·mm²/m = 0.017 241 Ω·mm²/m and temperature coefficient of resistance 0.003 93 K⁻¹,
//! both at 20 °C.

use uom::si::area::square_meter;
use uom::si::electrical_resistance::ohm;
use uom::si::length::meter;
use uom::si::temperature_coefficient::per_kelvin;
use uom::si::temperature_interval::kelvin;

use crate::units::{
    Area, ElectricalResistance, Length, TemperatureCoefficient, TemperatureInterval,
};
use crate::{PhysicsError, check_finite};

/// Resistivity of annealed copper at 20 °C, Ω·m: 1/58 Ω·mm²/m (IEC 60028, from memory).
///
/// ```
/// assert!((gaugebook::COPPER_RESISTIVITY - 1.7241e-8).abs() < 1e-12);
/// ```
pub const COPPER_RESISTIVITY: f64 = 1.0e-6 / 58.0;

/// Temperature coefficient of resistance of annealed copper at 20 °C, K⁻¹ (IEC 60028 and NIST
/// Handbook 100, from memory).
///
/// ```
/// assert_eq!(gaugebook::COPPER_TEMPERATURE_COEFFICIENT, 0.00393);
/// ```
pub const COPPER_TEMPERATURE_COEFFICIENT: f64 = 0.00393;

/// One lead wire: its resistance at the installation temperature and its temperature
/// coefficient of resistance. All wires of a cable are taken as equal.
///
/// ```
/// use gaugebook::LeadWire;
/// use gaugebook::units::{Area, ElectricalResistance, Length};
/// use uom::si::{area::square_millimeter, length::meter, electrical_resistance::ohm};
/// // 10 m of 0.25 mm² copper: 10/(58·0.25) Ω.
/// let w = LeadWire::copper_wire(Length::new::<meter>(10.0), Area::new::<square_millimeter>(0.25))?;
/// assert!((w.resistance().get::<ohm>() - 10.0 / 14.5).abs() < 1e-12);
/// # Ok::<(), gaugebook::PhysicsError>(())
/// ```
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct LeadWire {
    resistance: ElectricalResistance,
    tc: TemperatureCoefficient,
}

impl LeadWire {
    /// A wire of resistance `resistance` (zero allowed: an ideal lead) and temperature
    /// coefficient `tc`.
    ///
    /// ```
    /// use gaugebook::LeadWire;
    /// use gaugebook::units::{ElectricalResistance, TemperatureCoefficient};
    /// use uom::si::{electrical_resistance::ohm, temperature_coefficient::per_kelvin};
    /// let tc = TemperatureCoefficient::new::<per_kelvin>(0.004);
    /// assert!(LeadWire::new(ElectricalResistance::new::<ohm>(0.2), tc).is_ok());
    /// assert!(LeadWire::new(ElectricalResistance::new::<ohm>(-0.2), tc).is_err());
    /// ```
    pub fn new(
        resistance: ElectricalResistance,
        tc: TemperatureCoefficient,
    ) -> Result<LeadWire, PhysicsError> {
        let r = check_finite("lead resistance", resistance.get::<ohm>(), "Ω")?;
        if r < 0.0 {
            return Err(PhysicsError::invalid(
                "lead resistance",
                format!("{r} Ω"),
                "a value of 0 Ω or more",
            ));
        }
        check_finite(
            "lead temperature coefficient",
            tc.get::<per_kelvin>(),
            "1/K",
        )?;
        Ok(LeadWire { resistance, tc })
    }

    /// A copper wire of resistance `resistance` (temperature coefficient 0.003 93 K⁻¹).
    ///
    /// ```
    /// use gaugebook::LeadWire;
    /// use gaugebook::units::ElectricalResistance;
    /// use uom::si::{electrical_resistance::ohm, temperature_coefficient::per_kelvin};
    /// let w = LeadWire::copper(ElectricalResistance::new::<ohm>(0.5))?;
    /// assert_eq!(w.temperature_coefficient().get::<per_kelvin>(), 0.00393);
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn copper(resistance: ElectricalResistance) -> Result<LeadWire, PhysicsError> {
        LeadWire::new(
            resistance,
            TemperatureCoefficient::new::<per_kelvin>(COPPER_TEMPERATURE_COEFFICIENT),
        )
    }

    /// A copper wire of `length` and conductor cross-section `area`: R = ρ·L/A at 20 °C.
    ///
    /// ```
    /// use gaugebook::LeadWire;
    /// use gaugebook::units::{Area, Length};
    /// use uom::si::{area::square_millimeter, length::meter};
    /// assert!(LeadWire::copper_wire(Length::new::<meter>(5.0), Area::new::<square_millimeter>(0.0)).is_err());
    /// ```
    pub fn copper_wire(length: Length, area: Area) -> Result<LeadWire, PhysicsError> {
        let l = check_finite("lead length", length.get::<meter>(), "m")?;
        if l < 0.0 {
            return Err(PhysicsError::invalid(
                "lead length",
                format!("{l} m"),
                "a value of 0 m or more",
            ));
        }
        let a = crate::check_positive("lead cross-section", area.get::<square_meter>(), "m²")?;
        LeadWire::copper(ElectricalResistance::new::<ohm>(COPPER_RESISTIVITY * l / a))
    }

    /// Resistance of one wire at the installation temperature.
    ///
    /// ```
    /// use gaugebook::LeadWire;
    /// use gaugebook::units::ElectricalResistance;
    /// use uom::si::electrical_resistance::ohm;
    /// assert_eq!(LeadWire::copper(ElectricalResistance::new::<ohm>(0.5))?.resistance().get::<ohm>(), 0.5);
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn resistance(&self) -> ElectricalResistance {
        self.resistance
    }

    /// Temperature coefficient of resistance.
    ///
    /// ```
    /// use gaugebook::LeadWire;
    /// use gaugebook::units::ElectricalResistance;
    /// use uom::si::{electrical_resistance::ohm, temperature_coefficient::per_kelvin};
    /// let w = LeadWire::copper(ElectricalResistance::new::<ohm>(0.5))?;
    /// assert!(w.temperature_coefficient().get::<per_kelvin>() > 0.0);
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn temperature_coefficient(&self) -> TemperatureCoefficient {
        self.tc
    }

    /// Resistance of one wire warmed by `rise` above the installation temperature:
    /// R·(1 + α·ΔT), the linear model the coefficient defines.
    ///
    /// ```
    /// use gaugebook::LeadWire;
    /// use gaugebook::units::{ElectricalResistance, TemperatureInterval};
    /// use uom::si::{electrical_resistance::ohm, temperature_interval::kelvin};
    /// let w = LeadWire::copper(ElectricalResistance::new::<ohm>(1.0))?;
    /// let r = w.resistance_after(TemperatureInterval::new::<kelvin>(10.0))?;
    /// assert!((r.get::<ohm>() - 1.0393).abs() < 1e-12);
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn resistance_after(
        &self,
        rise: TemperatureInterval,
    ) -> Result<ElectricalResistance, PhysicsError> {
        Ok(ElectricalResistance::new::<ohm>(self.ohms_after(rise)?))
    }

    pub(crate) fn ohms(&self) -> f64 {
        self.resistance.get::<ohm>()
    }

    pub(crate) fn ohms_after(&self, rise: TemperatureInterval) -> Result<f64, PhysicsError> {
        let dt = check_finite("lead temperature rise", rise.get::<kelvin>(), "K")?;
        let f = 1.0 + self.tc.get::<per_kelvin>() * dt;
        if f <= 0.0 {
            return Err(PhysicsError::out_of_range(
                "the linear lead-resistance model",
                format!("1 + α·ΔT = {f} is not above 0"),
            ));
        }
        Ok(self.ohms() * f)
    }
}
