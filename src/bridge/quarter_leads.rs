//! Lead wires of a quarter bridge, two-wire and three-wire: desensitisation, zero offset,
//! apparent strain when the leads warm, and the correction.
//!
//! Two-wire: both leads run in series with the gauge in arm R1, so they desensitise the bridge
//! by R_g/(R_g + 2R_L) and, when they warm, read as strain. Three-wire: one lead stays in R1,
//! one moves into the adjacent arm R2 with the completion resistor, and the third carries the
//! output corner S+ to the instrument without current; a lead temperature change then raises
//! R1 and R2 alike and cancels (exactly, when R1 = R2 to start with), and the desensitisation
//! falls to R_g/(R_g + R_L). (Dally & Riley, *Experimental Stress Analysis*, 4th ed., ch. 6;
//! Window, *Strain Gauge Technology*, 2nd ed., ch. 3; both from memory.) The results here are
//! the exact outputs of the wired circuit through [`WheatstoneBridge`]; the textbook linear
//! forms are checked against them in the tests.

use uom::si::electrical_resistance::ohm;
use uom::si::temperature_interval::kelvin;

use super::{Arm, Arrangement, LeadWire, WheatstoneBridge};
use crate::units::{ElectricalResistance, TemperatureInterval};
use crate::{Gauge, OutputRatio, PhysicsError, Strain, check_positive};

/// How a quarter-bridge gauge is wired to the instrument.
///
/// ```
/// use gaugebook::QuarterWiring;
/// assert_eq!(QuarterWiring::TwoWire.leads_in_gauge_arm(), 2);
/// assert_eq!(QuarterWiring::ThreeWire.leads_in_gauge_arm(), 1);
/// ```
#[derive(Clone, Copy, Debug, PartialEq, Eq, Hash)]
pub enum QuarterWiring {
    /// Two leads, both in the gauge's arm.
    TwoWire,
    /// Three leads: one in the gauge's arm, one in the adjacent arm, one sense lead.
    ThreeWire,
}

impl QuarterWiring {
    /// How many leads carry current in series with the gauge.
    ///
    /// ```
    /// assert_eq!(gaugebook::QuarterWiring::TwoWire.leads_in_gauge_arm(), 2);
    /// ```
    pub fn leads_in_gauge_arm(self) -> usize {
        match self {
            QuarterWiring::TwoWire => 2,
            QuarterWiring::ThreeWire => 1,
        }
    }
}

/// A quarter bridge whose gauge (arm R1) is connected through lead wires; the completion arms
/// R2, R3, R4 sit in the instrument and equal the gauge's nominal resistance unless changed.
///
/// "Indicated" strain is what an instrument shows that was zeroed at installation (no strain,
/// leads at their installation temperature) and converts output to strain with the plain
/// quarter-bridge exact inverse and the gauge factor, knowing nothing of the leads.
///
/// ```
/// use gaugebook::{Gauge, LeadWire, QuarterLeads, QuarterWiring};
/// use gaugebook::units::{ElectricalResistance, TemperatureInterval};
/// use uom::si::{electrical_resistance::ohm, temperature_interval::kelvin};
/// let g = Gauge::new(ElectricalResistance::new::<ohm>(120.0), 2.0)?;
/// let lead = LeadWire::copper(ElectricalResistance::new::<ohm>(1.0))?;
/// let two = QuarterLeads::new(&g, QuarterWiring::TwoWire, lead);
/// assert!((two.desensitization() - 2.0 / 122.0).abs() < 1e-15);
/// let warm = TemperatureInterval::new::<kelvin>(10.0);
/// // About 2·R_L·α·ΔT/(F·(R_g + 2R_L)) = 322 µε for two wires; nothing for three.
/// assert!((two.apparent_strain(warm)?.microstrain() - 322.1).abs() < 1.0);
/// let three = QuarterLeads::new(&g, QuarterWiring::ThreeWire, lead);
/// assert!(three.apparent_strain(warm)?.microstrain().abs() < 1e-9);
/// # Ok::<(), gaugebook::PhysicsError>(())
/// ```
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct QuarterLeads {
    gauge_resistance: ElectricalResistance,
    gauge_factor: f64,
    wiring: QuarterWiring,
    lead: LeadWire,
    completion: ElectricalResistance,
}

impl QuarterLeads {
    /// `gauge` wired by `wiring` with leads like `lead`; completion arms equal to the gauge's
    /// nominal resistance.
    ///
    /// ```
    /// use gaugebook::{Gauge, LeadWire, QuarterLeads, QuarterWiring};
    /// use gaugebook::units::ElectricalResistance;
    /// use uom::si::electrical_resistance::ohm;
    /// let g = Gauge::new(ElectricalResistance::new::<ohm>(350.0), 2.0)?;
    /// let q = QuarterLeads::new(&g, QuarterWiring::ThreeWire, LeadWire::copper(ElectricalResistance::new::<ohm>(0.4))?);
    /// assert_eq!(q.wiring(), QuarterWiring::ThreeWire);
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn new(gauge: &Gauge, wiring: QuarterWiring, lead: LeadWire) -> QuarterLeads {
        QuarterLeads {
            gauge_resistance: gauge.resistance(),
            gauge_factor: gauge.gauge_factor(),
            wiring,
            lead,
            completion: gauge.resistance(),
        }
    }

    /// The same circuit with completion resistors of `completion` in R2, R3 and R4.
    ///
    /// ```
    /// use gaugebook::{Gauge, LeadWire, QuarterLeads, QuarterWiring};
    /// use gaugebook::units::ElectricalResistance;
    /// use uom::si::electrical_resistance::ohm;
    /// let g = Gauge::new(ElectricalResistance::new::<ohm>(350.0), 2.0)?;
    /// let q = QuarterLeads::new(&g, QuarterWiring::TwoWire, LeadWire::copper(ElectricalResistance::new::<ohm>(0.4))?);
    /// assert!(q.with_completion(ElectricalResistance::new::<ohm>(0.0)).is_err());
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn with_completion(
        mut self,
        completion: ElectricalResistance,
    ) -> Result<QuarterLeads, PhysicsError> {
        check_positive("completion resistance", completion.get::<ohm>(), "Ω")?;
        self.completion = completion;
        Ok(self)
    }

    /// The wiring.
    ///
    /// ```
    /// use gaugebook::{Gauge, LeadWire, QuarterLeads, QuarterWiring};
    /// use gaugebook::units::ElectricalResistance;
    /// use uom::si::electrical_resistance::ohm;
    /// let g = Gauge::new(ElectricalResistance::new::<ohm>(350.0), 2.0)?;
    /// let q = QuarterLeads::new(&g, QuarterWiring::TwoWire, LeadWire::copper(ElectricalResistance::new::<ohm>(0.4))?);
    /// assert_eq!(q.wiring(), QuarterWiring::TwoWire);
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn wiring(&self) -> QuarterWiring {
        self.wiring
    }

    /// Fraction of the gauge arm's resistance that is the gauge: R_g/(R_g + n·R_L), n = 2
    /// (two-wire) or 1 (three-wire). An arm change ΔR_g reads as ΔR_g/(R_g + n·R_L).
    ///
    /// ```
    /// use gaugebook::{Gauge, LeadWire, QuarterLeads, QuarterWiring};
    /// use gaugebook::units::ElectricalResistance;
    /// use uom::si::electrical_resistance::ohm;
    /// let g = Gauge::new(ElectricalResistance::new::<ohm>(350.0), 2.0)?;
    /// let q = QuarterLeads::new(&g, QuarterWiring::ThreeWire, LeadWire::copper(ElectricalResistance::new::<ohm>(3.5))?);
    /// assert!((q.sensitivity_factor() - 350.0 / 353.5).abs() < 1e-15);
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn sensitivity_factor(&self) -> f64 {
        let rg = self.gauge_resistance.get::<ohm>();
        rg / (rg + self.wiring.leads_in_gauge_arm() as f64 * self.lead.ohms())
    }

    /// Loss of sensitivity, 1 − R_g/(R_g + n·R_L) (a fraction; ×100 for percent).
    ///
    /// ```
    /// use gaugebook::{Gauge, LeadWire, QuarterLeads, QuarterWiring};
    /// use gaugebook::units::ElectricalResistance;
    /// use uom::si::electrical_resistance::ohm;
    /// let g = Gauge::new(ElectricalResistance::new::<ohm>(350.0), 2.0)?;
    /// let q = QuarterLeads::new(&g, QuarterWiring::TwoWire, LeadWire::copper(ElectricalResistance::new::<ohm>(0.0))?);
    /// assert_eq!(q.desensitization(), 0.0);
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn desensitization(&self) -> f64 {
        1.0 - self.sensitivity_factor()
    }

    /// The wired circuit as a general bridge, with the gauge at `strain` (axial, no transverse
    /// strain) and the leads warmed by `lead_rise`.
    ///
    /// ```
    /// use gaugebook::{Gauge, LeadWire, QuarterLeads, QuarterWiring, Strain};
    /// use gaugebook::units::{ElectricalResistance, TemperatureInterval};
    /// use uom::si::{electrical_resistance::ohm, temperature_interval::kelvin};
    /// let g = Gauge::new(ElectricalResistance::new::<ohm>(350.0), 2.0)?;
    /// let q = QuarterLeads::new(&g, QuarterWiring::TwoWire, LeadWire::copper(ElectricalResistance::new::<ohm>(0.5))?);
    /// let b = q.bridge(Strain::ZERO, TemperatureInterval::new::<kelvin>(0.0))?;
    /// assert!((b.arm_resistances()[0].get::<ohm>() - 351.0).abs() < 1e-12);
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn bridge(
        &self,
        strain: Strain,
        lead_rise: TemperatureInterval,
    ) -> Result<WheatstoneBridge, PhysicsError> {
        let rl = self.lead.ohms_after(lead_rise)?;
        let rg = self.gauge_resistance.get::<ohm>();
        let rc = self.completion.get::<ohm>();
        let x = crate::check_finite("strain", strain.value(), "m/m")? * self.gauge_factor;
        // The gauge element plus its leads, expressed as one gauge arm of the combined nominal.
        let n = self.wiring.leads_in_gauge_arm() as f64;
        let r1_nominal = rg + n * rl;
        let r1 = Arm::gauge(
            ElectricalResistance::new::<ohm>(r1_nominal),
            rg * x / r1_nominal,
        )?;
        let r2_ohms = match self.wiring {
            QuarterWiring::TwoWire => rc,
            QuarterWiring::ThreeWire => rc + rl,
        };
        let r2 = Arm::fixed(ElectricalResistance::new::<ohm>(r2_ohms))?;
        let rc_arm = Arm::fixed(self.completion)?;
        Ok(WheatstoneBridge::new([r1, r2, rc_arm, rc_arm]))
    }

    /// Exact output ratio of the wired circuit.
    ///
    /// ```
    /// use gaugebook::{Gauge, LeadWire, QuarterLeads, QuarterWiring, Strain};
    /// use gaugebook::units::{ElectricalResistance, TemperatureInterval};
    /// use uom::si::{electrical_resistance::ohm, temperature_interval::kelvin};
    /// let g = Gauge::new(ElectricalResistance::new::<ohm>(350.0), 2.0)?;
    /// let q = QuarterLeads::new(&g, QuarterWiring::ThreeWire, LeadWire::copper(ElectricalResistance::new::<ohm>(0.5))?);
    /// let r = q.output(Strain::ZERO, TemperatureInterval::new::<kelvin>(25.0))?;
    /// assert!(r.value().abs() < 1e-16);
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn output(
        &self,
        strain: Strain,
        lead_rise: TemperatureInterval,
    ) -> Result<OutputRatio, PhysicsError> {
        Ok(self.bridge(strain, lead_rise)?.output_ratio())
    }

    /// Output ratio with no strain and the leads at installation temperature: the imbalance the
    /// leads cause before the instrument is zeroed (two-wire: R_L in R1 against R_c in R2).
    ///
    /// ```
    /// use gaugebook::{Gauge, LeadWire, QuarterLeads, QuarterWiring};
    /// use gaugebook::units::ElectricalResistance;
    /// use uom::si::electrical_resistance::ohm;
    /// let g = Gauge::new(ElectricalResistance::new::<ohm>(350.0), 2.0)?;
    /// let q = QuarterLeads::new(&g, QuarterWiring::TwoWire, LeadWire::copper(ElectricalResistance::new::<ohm>(0.5))?);
    /// // R1 = 351 Ω against 350 Ω: 351/701 − 1/2.
    /// assert!((q.zero_offset()?.value() - (351.0 / 701.0 - 0.5)).abs() < 1e-15);
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn zero_offset(&self) -> Result<OutputRatio, PhysicsError> {
        self.output(Strain::ZERO, TemperatureInterval::new::<kelvin>(0.0))
    }

    /// The strain the instrument indicates (see the type's doc) for a true strain `strain`
    /// with the leads warmed by `lead_rise`.
    ///
    /// ```
    /// use gaugebook::{Gauge, LeadWire, QuarterLeads, QuarterWiring, Strain};
    /// use gaugebook::units::{ElectricalResistance, TemperatureInterval};
    /// use uom::si::{electrical_resistance::ohm, temperature_interval::kelvin};
    /// let g = Gauge::new(ElectricalResistance::new::<ohm>(120.0), 2.0)?;
    /// let q = QuarterLeads::new(&g, QuarterWiring::TwoWire, LeadWire::copper(ElectricalResistance::new::<ohm>(3.0))?);
    /// let e = q.indicated_strain(Strain::from_microstrain(1000.0), TemperatureInterval::new::<kelvin>(0.0))?;
    /// // Reads about 120/126 of the true strain.
    /// assert!((e.microstrain() - 1000.0 * 120.0 / 126.0).abs() < 2.0);
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn indicated_strain(
        &self,
        strain: Strain,
        lead_rise: TemperatureInterval,
    ) -> Result<Strain, PhysicsError> {
        let r = self.output(strain, lead_rise)? - self.zero_offset()?;
        Arrangement::Quarter.strain_from_output(r, self.gauge_factor, 0.0)
    }

    /// The strain indicated with no strain when the leads warm by `lead_rise` (the error the
    /// leads' temperature causes).
    ///
    /// ```
    /// use gaugebook::{Gauge, LeadWire, QuarterLeads, QuarterWiring};
    /// use gaugebook::units::{ElectricalResistance, TemperatureInterval};
    /// use uom::si::{electrical_resistance::ohm, temperature_interval::kelvin};
    /// let g = Gauge::new(ElectricalResistance::new::<ohm>(350.0), 2.0)?;
    /// let q = QuarterLeads::new(&g, QuarterWiring::TwoWire, LeadWire::copper(ElectricalResistance::new::<ohm>(0.5))?);
    /// let e = q.apparent_strain(TemperatureInterval::new::<kelvin>(-10.0))?;
    /// assert!(e.value() < 0.0);
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn apparent_strain(&self, lead_rise: TemperatureInterval) -> Result<Strain, PhysicsError> {
        self.indicated_strain(Strain::ZERO, lead_rise)
    }

    /// The desensitisation correction: indicated strain divided by
    /// [`sensitivity_factor`](QuarterLeads::sensitivity_factor), i.e. ×(1 + n·R_L/R_g)
    /// (Dally & Riley, 4th ed., ch. 6, from memory). It removes the loss of span; a
    /// temperature-driven zero shift of two-wire leads is not removed and needs three wires.
    ///
    /// ```
    /// use gaugebook::{Gauge, LeadWire, QuarterLeads, QuarterWiring, Strain};
    /// use gaugebook::units::{ElectricalResistance, TemperatureInterval};
    /// use uom::si::{electrical_resistance::ohm, temperature_interval::kelvin};
    /// let g = Gauge::new(ElectricalResistance::new::<ohm>(120.0), 2.0)?;
    /// let q = QuarterLeads::new(&g, QuarterWiring::ThreeWire, LeadWire::copper(ElectricalResistance::new::<ohm>(3.0))?);
    /// let cold = TemperatureInterval::new::<kelvin>(0.0);
    /// let ind = q.indicated_strain(Strain::from_microstrain(500.0), cold)?;
    /// assert!((q.corrected_strain(ind).microstrain() - 500.0).abs() < 0.5);
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn corrected_strain(&self, indicated: Strain) -> Strain {
        indicated / self.sensitivity_factor()
    }
}
