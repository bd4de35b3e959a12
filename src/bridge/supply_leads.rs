//! Supply leads of a full bridge: four-wire (no sensing) and six-wire (remote sense).
//!
//! With four wires the two excitation leads carry the bridge current, so the bridge corners see
//! V·R_b/(R_b + 2R_L) instead of V (R_b the bridge's input resistance): the span falls, and it
//! moves when the leads warm. The output leads carry no current and change nothing; neither do
//! the excitation leads change the zero, because they scale the whole bridge. With six wires a
//! pair of sense leads brings the voltage at the bridge corners back to the instrument, which
//! regulates (or measures ratiometrically against) it, so neither lead resistance nor its
//! temperature affects the reading (Window, *Strain Gauge Technology*, 2nd ed., ch. 3, from
//! memory; common practice).

use uom::si::electrical_resistance::ohm;
use uom::si::temperature_interval::kelvin;

use super::{LeadWire, WheatstoneBridge};
use crate::units::{ElectricalResistance, TemperatureInterval};
use crate::{OutputRatio, PhysicsError, Strain, check_positive};

/// How a full bridge's excitation is wired.
///
/// ```
/// use gaugebook::SupplyWiring;
/// assert_ne!(SupplyWiring::FourWire, SupplyWiring::SixWire);
/// ```
#[derive(Clone, Copy, Debug, PartialEq, Eq, Hash)]
pub enum SupplyWiring {
    /// Excitation and output pairs only.
    FourWire,
    /// Excitation, output and a pair of sense leads (remote sense).
    SixWire,
}

/// A full bridge of input resistance R_b fed through two excitation leads, with or without
/// remote sense. "Ratio" here is the output over the excitation the instrument sets (at its
/// terminals for four wires, at the bridge for six).
///
/// ```
/// use gaugebook::{LeadWire, SupplyLeads, SupplyWiring};
/// use gaugebook::units::ElectricalResistance;
/// use uom::si::electrical_resistance::ohm;
/// let lead = LeadWire::copper(ElectricalResistance::new::<ohm>(2.0))?;
/// let four = SupplyLeads::new(ElectricalResistance::new::<ohm>(350.0), SupplyWiring::FourWire, lead)?;
/// assert!((four.desensitization() - 4.0 / 354.0).abs() < 1e-15);
/// let six = SupplyLeads::new(ElectricalResistance::new::<ohm>(350.0), SupplyWiring::SixWire, lead)?;
/// assert_eq!(six.desensitization(), 0.0);
/// # Ok::<(), gaugebook::PhysicsError>(())
/// ```
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct SupplyLeads {
    bridge_resistance: ElectricalResistance,
    wiring: SupplyWiring,
    lead: LeadWire,
}

impl SupplyLeads {
    /// The supply leads of `bridge`, taking its input resistance.
    ///
    /// ```
    /// use gaugebook::{LeadWire, SupplyLeads, SupplyWiring, WheatstoneBridge};
    /// use gaugebook::units::ElectricalResistance;
    /// use uom::si::electrical_resistance::ohm;
    /// let b = WheatstoneBridge::equal_arms(ElectricalResistance::new::<ohm>(700.0))?;
    /// let s = SupplyLeads::for_bridge(&b, SupplyWiring::FourWire, LeadWire::copper(ElectricalResistance::new::<ohm>(1.0))?)?;
    /// assert!((s.desensitization() - 2.0 / 702.0).abs() < 1e-15);
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn for_bridge(
        bridge: &WheatstoneBridge,
        wiring: SupplyWiring,
        lead: LeadWire,
    ) -> Result<SupplyLeads, PhysicsError> {
        SupplyLeads::new(bridge.input_resistance(), wiring, lead)
    }

    /// A bridge of input resistance `bridge_resistance` (see
    /// [`WheatstoneBridge::input_resistance`](crate::WheatstoneBridge::input_resistance))
    /// wired by `wiring` with excitation leads like `lead`.
    ///
    /// ```
    /// use gaugebook::{LeadWire, SupplyLeads, SupplyWiring};
    /// use gaugebook::units::ElectricalResistance;
    /// use uom::si::electrical_resistance::ohm;
    /// let lead = LeadWire::copper(ElectricalResistance::new::<ohm>(2.0))?;
    /// assert!(SupplyLeads::new(ElectricalResistance::new::<ohm>(-350.0), SupplyWiring::FourWire, lead).is_err());
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn new(
        bridge_resistance: ElectricalResistance,
        wiring: SupplyWiring,
        lead: LeadWire,
    ) -> Result<SupplyLeads, PhysicsError> {
        check_positive(
            "bridge input resistance",
            bridge_resistance.get::<ohm>(),
            "Ω",
        )?;
        Ok(SupplyLeads {
            bridge_resistance,
            wiring,
            lead,
        })
    }

    /// Fraction of the instrument's excitation that reaches the bridge with the leads warmed by
    /// `lead_rise`: R_b/(R_b + 2R_L(1 + αΔT)) for four wires, 1 for six.
    ///
    /// ```
    /// use gaugebook::{LeadWire, SupplyLeads, SupplyWiring};
    /// use gaugebook::units::{ElectricalResistance, TemperatureInterval};
    /// use uom::si::{electrical_resistance::ohm, temperature_interval::kelvin};
    /// let lead = LeadWire::copper(ElectricalResistance::new::<ohm>(1.0))?;
    /// let s = SupplyLeads::new(ElectricalResistance::new::<ohm>(350.0), SupplyWiring::FourWire, lead)?;
    /// let f = s.sensitivity_factor(TemperatureInterval::new::<kelvin>(0.0))?;
    /// assert!((f - 350.0 / 352.0).abs() < 1e-15);
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn sensitivity_factor(&self, lead_rise: TemperatureInterval) -> Result<f64, PhysicsError> {
        let rl = self.lead.ohms_after(lead_rise)?;
        Ok(match self.wiring {
            SupplyWiring::SixWire => 1.0,
            SupplyWiring::FourWire => {
                let rb = self.bridge_resistance.get::<ohm>();
                rb / (rb + 2.0 * rl)
            }
        })
    }

    /// Loss of sensitivity with the leads at installation temperature, 1 − R_b/(R_b + 2R_L)
    /// (zero with remote sense).
    ///
    /// ```
    /// use gaugebook::{LeadWire, SupplyLeads, SupplyWiring};
    /// use gaugebook::units::ElectricalResistance;
    /// use uom::si::electrical_resistance::ohm;
    /// let lead = LeadWire::copper(ElectricalResistance::new::<ohm>(1.0))?;
    /// let s = SupplyLeads::new(ElectricalResistance::new::<ohm>(350.0), SupplyWiring::FourWire, lead)?;
    /// assert!((s.desensitization() - 2.0 / 352.0).abs() < 1e-15);
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn desensitization(&self) -> f64 {
        let rb = self.bridge_resistance.get::<ohm>();
        match self.wiring {
            SupplyWiring::SixWire => 0.0,
            SupplyWiring::FourWire => 2.0 * self.lead.ohms() / (rb + 2.0 * self.lead.ohms()),
        }
    }

    /// The zero offset the leads cause: none, since supply leads only scale the bridge.
    ///
    /// ```
    /// use gaugebook::{LeadWire, SupplyLeads, SupplyWiring};
    /// use gaugebook::units::ElectricalResistance;
    /// use uom::si::electrical_resistance::ohm;
    /// let lead = LeadWire::copper(ElectricalResistance::new::<ohm>(1.0))?;
    /// let s = SupplyLeads::new(ElectricalResistance::new::<ohm>(350.0), SupplyWiring::FourWire, lead)?;
    /// assert_eq!(s.zero_offset().value(), 0.0);
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn zero_offset(&self) -> OutputRatio {
        OutputRatio::ZERO
    }

    /// The output ratio the instrument sees for a bridge whose own output ratio is
    /// `bridge_ratio`, with the leads warmed by `lead_rise`.
    ///
    /// ```
    /// use gaugebook::{LeadWire, OutputRatio, SupplyLeads, SupplyWiring};
    /// use gaugebook::units::{ElectricalResistance, TemperatureInterval};
    /// use uom::si::{electrical_resistance::ohm, temperature_interval::kelvin};
    /// let lead = LeadWire::copper(ElectricalResistance::new::<ohm>(1.0))?;
    /// let s = SupplyLeads::new(ElectricalResistance::new::<ohm>(350.0), SupplyWiring::SixWire, lead)?;
    /// let seen = s.seen_ratio(OutputRatio::from_mv_per_v(2.0), TemperatureInterval::new::<kelvin>(30.0))?;
    /// assert_eq!(seen.mv_per_v(), 2.0);
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn seen_ratio(
        &self,
        bridge_ratio: OutputRatio,
        lead_rise: TemperatureInterval,
    ) -> Result<OutputRatio, PhysicsError> {
        Ok(bridge_ratio * self.sensitivity_factor(lead_rise)?)
    }

    /// Relative span change when the leads warm by `lead_rise`, for an instrument calibrated
    /// with them at installation temperature: f(ΔT)/f(0) − 1 (zero with remote sense).
    ///
    /// ```
    /// use gaugebook::{LeadWire, SupplyLeads, SupplyWiring};
    /// use gaugebook::units::{ElectricalResistance, TemperatureInterval};
    /// use uom::si::{electrical_resistance::ohm, temperature_interval::kelvin};
    /// let lead = LeadWire::copper(ElectricalResistance::new::<ohm>(1.0))?;
    /// let s = SupplyLeads::new(ElectricalResistance::new::<ohm>(350.0), SupplyWiring::FourWire, lead)?;
    /// let e = s.span_error(TemperatureInterval::new::<kelvin>(20.0))?;
    /// assert!(e < 0.0 && e > -5e-4);
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn span_error(&self, lead_rise: TemperatureInterval) -> Result<f64, PhysicsError> {
        let cold = self.sensitivity_factor(TemperatureInterval::new::<kelvin>(0.0))?;
        Ok(self.sensitivity_factor(lead_rise)? / cold - 1.0)
    }

    /// The apparent strain at a reading of `reading` when the leads warm by `lead_rise`: the
    /// reading times the span error (no apparent strain at zero, since the zero does not move).
    ///
    /// ```
    /// use gaugebook::{LeadWire, SupplyLeads, SupplyWiring, Strain};
    /// use gaugebook::units::{ElectricalResistance, TemperatureInterval};
    /// use uom::si::{electrical_resistance::ohm, temperature_interval::kelvin};
    /// let lead = LeadWire::copper(ElectricalResistance::new::<ohm>(1.0))?;
    /// let s = SupplyLeads::new(ElectricalResistance::new::<ohm>(350.0), SupplyWiring::FourWire, lead)?;
    /// let warm = TemperatureInterval::new::<kelvin>(20.0);
    /// assert_eq!(s.apparent_strain(Strain::ZERO, warm)?.value(), 0.0);
    /// assert!(s.apparent_strain(Strain::from_microstrain(1000.0), warm)?.microstrain() < 0.0);
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn apparent_strain(
        &self,
        reading: Strain,
        lead_rise: TemperatureInterval,
    ) -> Result<Strain, PhysicsError> {
        Ok(reading * self.span_error(lead_rise)?)
    }

    /// The correction: a ratio measured with the leads warmed by `lead_rise` divided by the
    /// sensitivity factor, giving the bridge's own output ratio (identity with remote sense).
    ///
    /// ```
    /// use gaugebook::{LeadWire, OutputRatio, SupplyLeads, SupplyWiring};
    /// use gaugebook::units::{ElectricalResistance, TemperatureInterval};
    /// use uom::si::{electrical_resistance::ohm, temperature_interval::kelvin};
    /// let lead = LeadWire::copper(ElectricalResistance::new::<ohm>(1.0))?;
    /// let s = SupplyLeads::new(ElectricalResistance::new::<ohm>(350.0), SupplyWiring::FourWire, lead)?;
    /// let t = TemperatureInterval::new::<kelvin>(15.0);
    /// let r = OutputRatio::from_mv_per_v(2.0);
    /// let back = s.corrected_ratio(s.seen_ratio(r, t)?, t)?;
    /// assert!((back.mv_per_v() - 2.0).abs() < 1e-12);
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn corrected_ratio(
        &self,
        measured: OutputRatio,
        lead_rise: TemperatureInterval,
    ) -> Result<OutputRatio, PhysicsError> {
        Ok(measured / self.sensitivity_factor(lead_rise)?)
    }
}
