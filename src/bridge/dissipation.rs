//! Current, power and power density in a gauge at a given excitation.
//!
//! A gauge heats its own grid; the trade limits the power per grid area to keep self-heating
//! drift small (common practice). For an unstrained equal-arm bridge each arm carries half the
//! bridge current, so a gauge under voltage excitation V dissipates V²/(4R), and the excitation
//! for a power-density limit q on grid area A is V = 2·√(q·A·R).

use uom::si::area::square_meter;
use uom::si::electric_potential::volt;
use uom::si::electrical_resistance::ohm;
use uom::si::heat_flux_density::watt_per_square_meter;
use uom::si::power::watt;

use super::{Arrangement, Excitation};
use crate::units::{ElectricCurrent, ElectricPotential, Power, PowerDensity};
use crate::{Gauge, PhysicsError, Strain, check_positive};

/// Current through a gauge, the power it dissipates and that power per grid area (when the
/// gauge's grid size is known).
///
/// ```
/// use gaugebook::{Arrangement, Excitation, Gauge, GaugeDissipation};
/// use gaugebook::units::{ElectricalResistance, ElectricPotential, Length};
/// use uom::si::{electrical_resistance::ohm, electric_potential::volt, length::millimeter};
/// use uom::si::{power::milliwatt, heat_flux_density::watt_per_square_meter};
/// let g = Gauge::new(ElectricalResistance::new::<ohm>(350.0), 2.0)?
///     .with_grid(Length::new::<millimeter>(3.0), Length::new::<millimeter>(2.0))?;
/// let d = GaugeDissipation::in_bridge(&g, Arrangement::Quarter, Excitation::voltage(ElectricPotential::new::<volt>(10.0))?)?;
/// // V²/(4R) = 100/1400 W on 6 mm².
/// assert!((d.power().get::<milliwatt>() - 1.0e5 / 1400.0).abs() < 1e-9);
/// let q = d.power_density().unwrap().get::<watt_per_square_meter>();
/// assert!((q - (100.0 / 1400.0) / 6.0e-6).abs() < 1e-6);
/// # Ok::<(), gaugebook::PhysicsError>(())
/// ```
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct GaugeDissipation {
    current: ElectricCurrent,
    power: Power,
    power_density: Option<PowerDensity>,
}

impl GaugeDissipation {
    /// The active gauge in arm R1 of `arrangement` built from `gauge`, unstrained, at
    /// `excitation`. (All gauges of the named arrangements dissipate alike when unstrained.)
    ///
    /// ```
    /// use gaugebook::{Arrangement, Excitation, Gauge, GaugeDissipation};
    /// use gaugebook::units::{ElectricalResistance, ElectricCurrent};
    /// use uom::si::{electrical_resistance::ohm, electric_current::milliampere};
    /// let g = Gauge::new(ElectricalResistance::new::<ohm>(120.0), 2.0)?;
    /// let d = GaugeDissipation::in_bridge(&g, Arrangement::FullBending, Excitation::current(ElectricCurrent::new::<milliampere>(20.0))?)?;
    /// assert!((d.current().get::<milliampere>() - 10.0).abs() < 1e-12);
    /// assert!(d.power_density().is_none());
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn in_bridge(
        gauge: &Gauge,
        arrangement: Arrangement,
        excitation: Excitation,
    ) -> Result<GaugeDissipation, PhysicsError> {
        // ν does not matter at zero strain; 0 is valid for every arrangement.
        let b = arrangement.bridge(gauge.resistance(), Strain::ZERO, gauge.gauge_factor(), 0.0)?;
        let current = b.arm_currents(excitation)?[0];
        let power = b.element_powers(excitation)?[0];
        let power_density = gauge.grid_area().map(|a| {
            PowerDensity::new::<watt_per_square_meter>(
                power.get::<watt>() / a.get::<square_meter>(),
            )
        });
        Ok(GaugeDissipation {
            current,
            power,
            power_density,
        })
    }

    /// Current through the gauge.
    ///
    /// ```
    /// use gaugebook::{Arrangement, Excitation, Gauge, GaugeDissipation};
    /// use gaugebook::units::{ElectricalResistance, ElectricPotential};
    /// use uom::si::{electrical_resistance::ohm, electric_potential::volt, electric_current::milliampere};
    /// let g = Gauge::new(ElectricalResistance::new::<ohm>(350.0), 2.0)?;
    /// let d = GaugeDissipation::in_bridge(&g, Arrangement::Quarter, Excitation::voltage(ElectricPotential::new::<volt>(7.0))?)?;
    /// assert!((d.current().get::<milliampere>() - 10.0).abs() < 1e-12);
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn current(&self) -> ElectricCurrent {
        self.current
    }

    /// Power dissipated in the gauge.
    ///
    /// ```
    /// use gaugebook::{Arrangement, Excitation, Gauge, GaugeDissipation};
    /// use gaugebook::units::{ElectricalResistance, ElectricPotential};
    /// use uom::si::{electrical_resistance::ohm, electric_potential::volt, power::milliwatt};
    /// let g = Gauge::new(ElectricalResistance::new::<ohm>(350.0), 2.0)?;
    /// let d = GaugeDissipation::in_bridge(&g, Arrangement::Quarter, Excitation::voltage(ElectricPotential::new::<volt>(7.0))?)?;
    /// assert!((d.power().get::<milliwatt>() - 35.0).abs() < 1e-9);
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn power(&self) -> Power {
        self.power
    }

    /// Power per grid area, if the gauge has a grid size.
    ///
    /// ```
    /// use gaugebook::{Arrangement, Excitation, Gauge, GaugeDissipation};
    /// use gaugebook::units::{ElectricalResistance, ElectricPotential};
    /// use uom::si::{electrical_resistance::ohm, electric_potential::volt};
    /// let g = Gauge::new(ElectricalResistance::new::<ohm>(350.0), 2.0)?;
    /// let d = GaugeDissipation::in_bridge(&g, Arrangement::Quarter, Excitation::voltage(ElectricPotential::new::<volt>(7.0))?)?;
    /// assert!(d.power_density().is_none());
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn power_density(&self) -> Option<PowerDensity> {
        self.power_density
    }

    /// The largest voltage excitation of an unstrained equal-arm bridge of `gauge` that keeps
    /// the gauge's power density at or below `limit`: V = 2·√(q·A·R).
    ///
    /// Errors when the gauge has no grid size or the limit is not above zero.
    ///
    /// ```
    /// use gaugebook::GaugeDissipation;
    /// use gaugebook::Gauge;
    /// use gaugebook::units::{ElectricalResistance, Length, PowerDensity};
    /// use uom::si::{electrical_resistance::ohm, length::millimeter, electric_potential::volt};
    /// use uom::si::heat_flux_density::watt_per_square_meter;
    /// let g = Gauge::new(ElectricalResistance::new::<ohm>(350.0), 2.0)?
    ///     .with_grid(Length::new::<millimeter>(3.0), Length::new::<millimeter>(2.0))?;
    /// // 7.75 kW/m² is 5 W/in², a figure often quoted for good heat sinks (common practice).
    /// let v = GaugeDissipation::max_excitation(&g, PowerDensity::new::<watt_per_square_meter>(7750.0))?;
    /// assert!((v.get::<volt>() - 2.0 * (7750.0 * 6.0e-6 * 350.0f64).sqrt()).abs() < 1e-12);
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn max_excitation(
        gauge: &Gauge,
        limit: PowerDensity,
    ) -> Result<ElectricPotential, PhysicsError> {
        let q = check_positive(
            "power-density limit",
            limit.get::<watt_per_square_meter>(),
            "W/m²",
        )?;
        let a = gauge.grid_area().ok_or_else(|| {
            PhysicsError::invalid("grid area", "none", "a gauge with grid length and width")
        })?;
        let p = q * a.get::<square_meter>();
        let v = 2.0 * (p * gauge.resistance().get::<ohm>()).sqrt();
        Ok(ElectricPotential::new::<volt>(v))
    }
}
