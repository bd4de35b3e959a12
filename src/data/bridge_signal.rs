//! From what the amplifier recorded to strain: ADC counts to output ratio, output ratio to
//! strain through the exact inverse of the channel's bridge arrangement, and the lead-wire
//! correction. Pure functions on slices; the inverse itself is the bridge module's.

use uom::si::electric_potential::volt;

use super::DataError;
use crate::units::ElectricPotential;
use crate::{Arrangement, OutputRatio, PhysicsError, QuarterLeads, SupplyLeads, check_positive};

/// The scale of an analogue-to-digital converter reading a bridge: `full_scale_counts` counts
/// correspond to the output ratio `full_scale`.
///
/// ```
/// use gaugebook::{AdcScale, OutputRatio};
/// let adc = AdcScale::new(8_388_608.0, OutputRatio::from_mv_per_v(4.0))?;
/// assert!((adc.ratio(4_194_304.0) - 2.0e-3).abs() < 1e-18);
/// # Ok::<(), gaugebook::PhysicsError>(())
/// ```
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct AdcScale {
    ratio_per_count: f64,
}

impl AdcScale {
    /// A scale from counts at full scale and the output ratio there.
    ///
    /// ```
    /// use gaugebook::{AdcScale, OutputRatio};
    /// assert!(AdcScale::new(1000.0, OutputRatio::from_mv_per_v(2.0)).is_ok());
    /// assert!(AdcScale::new(0.0, OutputRatio::from_mv_per_v(2.0)).is_err());
    /// ```
    pub fn new(full_scale_counts: f64, full_scale: OutputRatio) -> Result<AdcScale, PhysicsError> {
        check_positive("full-scale counts", full_scale_counts, "")?;
        check_positive("full-scale output ratio", full_scale.value(), " V/V")?;
        Ok(AdcScale {
            ratio_per_count: full_scale.value() / full_scale_counts,
        })
    }

    /// A bipolar converter of `bits` bits (full scale 2^(bits−1) counts) behind an amplifier of
    /// `gain`, with input range ±`input_range` and bridge excitation `excitation`:
    /// r = counts / 2^(bits−1) · input_range / (gain · excitation) (closed form).
    ///
    /// ```
    /// use gaugebook::AdcScale;
    /// use gaugebook::units::ElectricPotential;
    /// use uom::si::electric_potential::volt;
    /// let v = ElectricPotential::new::<volt>;
    /// let adc = AdcScale::from_range(24, v(2.5), 128.0, v(5.0))?;
    /// // 2^23 counts = 2.5 V / 128 at the input = 3.90625 mV/V at 5 V excitation.
    /// assert!((adc.ratio(8_388_608.0) - 3.90625e-3).abs() < 1e-18);
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn from_range(
        bits: u32,
        input_range: ElectricPotential,
        gain: f64,
        excitation: ElectricPotential,
    ) -> Result<AdcScale, PhysicsError> {
        if !(2..=32).contains(&bits) {
            return Err(PhysicsError::invalid(
                "converter resolution",
                format!("{bits} bits"),
                "2 to 32 bits",
            ));
        }
        check_positive("amplifier gain", gain, "")?;
        check_positive("input range", input_range.get::<volt>(), " V")?;
        check_positive("excitation", excitation.get::<volt>(), " V")?;
        let fs = input_range.get::<volt>() / (gain * excitation.get::<volt>());
        AdcScale::new(2f64.powi(bits as i32 - 1), OutputRatio::new(fs))
    }

    /// The output ratio (V/V) of one reading.
    ///
    /// ```
    /// use gaugebook::{AdcScale, OutputRatio};
    /// let adc = AdcScale::new(1000.0, OutputRatio::from_mv_per_v(2.0))?;
    /// assert!((adc.ratio(-250.0) + 0.5e-3).abs() < 1e-18);
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn ratio(&self, counts: f64) -> f64 {
        counts * self.ratio_per_count
    }

    /// Converts a column of counts to output ratios (V/V).
    ///
    /// ```
    /// use gaugebook::{AdcScale, OutputRatio};
    /// let adc = AdcScale::new(1000.0, OutputRatio::new(1e-3))?;
    /// assert_eq!(adc.ratios(&[0.0, 500.0]), vec![0.0, 5e-4]);
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn ratios(&self, counts: &[f64]) -> Vec<f64> {
        counts.iter().map(|&c| c * self.ratio_per_count).collect()
    }
}

/// Output ratios (V/V) to strain (m/m) with the exact inverse of `arrangement`. A sample outside
/// what the bridge can produce becomes NaN rather than a meaningless number.
///
/// ```
/// use gaugebook::{Arrangement, ratio_to_strain};
/// let e = ratio_to_strain(&[0.0, 1.0e-3, 0.9], Arrangement::Quarter, 2.0, 0.3)?;
/// // Quarter bridge: ε = 4r / (F (1 − 2r)).
/// assert!((e[1] - 4.0e-3 / (2.0 * 0.998)).abs() < 1e-18);
/// assert!(e[2].is_nan());
/// # Ok::<(), gaugebook::PhysicsError>(())
/// ```
pub fn ratio_to_strain(
    ratios: &[f64],
    arrangement: Arrangement,
    gauge_factor: f64,
    poisson: f64,
) -> Result<Vec<f64>, PhysicsError> {
    let inv = arrangement.inverse(gauge_factor, poisson)?;
    Ok(ratios.iter().map(|&r| inv.apply_or_nan(r)).collect())
}

/// [`ratio_to_strain`] in the buffer: each output ratio (V/V) replaced by its strain (m/m), NaN
/// where the bridge cannot produce the ratio. For long channels that are not needed as ratios
/// afterwards (no second buffer, no fresh memory).
///
/// ```
/// use gaugebook::{Arrangement, ratio_to_strain, ratio_to_strain_in_place};
/// let mut r = vec![0.0, 1.0e-3, 0.9];
/// ratio_to_strain_in_place(&mut r, Arrangement::Quarter, 2.0, 0.3)?;
/// let e = ratio_to_strain(&[0.0, 1.0e-3, 0.9], Arrangement::Quarter, 2.0, 0.3)?;
/// assert_eq!(r[..2], e[..2]);
/// assert!(r[2].is_nan());
/// # Ok::<(), gaugebook::PhysicsError>(())
/// ```
pub fn ratio_to_strain_in_place(
    ratios: &mut [f64],
    arrangement: Arrangement,
    gauge_factor: f64,
    poisson: f64,
) -> Result<(), PhysicsError> {
    let inv = arrangement.inverse(gauge_factor, poisson)?;
    for r in ratios.iter_mut() {
        *r = inv.apply_or_nan(*r);
    }
    Ok(())
}

/// The lead wires of a channel, as the bridge module models them: a quarter bridge's two- or
/// three-wire connection, or a full bridge's four- or six-wire supply.
///
/// ```
/// use gaugebook::{Gauge, LeadWire, LeadWires, QuarterLeads, QuarterWiring};
/// use gaugebook::units::ElectricalResistance;
/// use uom::si::electrical_resistance::ohm;
/// let g = Gauge::new(ElectricalResistance::new::<ohm>(350.0), 2.0)?;
/// let q = QuarterLeads::new(&g, QuarterWiring::TwoWire, LeadWire::copper(ElectricalResistance::new::<ohm>(3.5))?);
/// // Two leads of 3.5 Ω in series with 350 Ω: indicated strain is 350/357 of the true strain.
/// assert!((LeadWires::Quarter(q).strain_factor() - 357.0 / 350.0).abs() < 1e-15);
/// # Ok::<(), gaugebook::PhysicsError>(())
/// ```
#[derive(Clone, Copy, Debug, PartialEq)]
pub enum LeadWires {
    /// A quarter bridge wired through leads.
    Quarter(QuarterLeads),
    /// A complete bridge fed through supply leads.
    Supply(SupplyLeads),
}

impl LeadWires {
    /// The factor that turns strain indicated without regard to the leads into strain: the
    /// inverse of the bridge module's sensitivity factor (1 / (1 − desensitisation)).
    pub fn strain_factor(&self) -> f64 {
        match self {
            LeadWires::Quarter(q) => 1.0 / q.sensitivity_factor(),
            LeadWires::Supply(s) => 1.0 / (1.0 - s.desensitization()),
        }
    }
}

/// Corrects a strain column for lead-wire desensitisation in place.
///
/// ```
/// use gaugebook::{LeadWire, LeadWires, SupplyLeads, SupplyWiring, correct_lead_wires};
/// use gaugebook::units::ElectricalResistance;
/// use uom::si::electrical_resistance::ohm;
/// let lead = LeadWire::copper(ElectricalResistance::new::<ohm>(1.0))?;
/// let s = SupplyLeads::new(ElectricalResistance::new::<ohm>(350.0), SupplyWiring::FourWire, lead)?;
/// let mut e = vec![1.0e-3];
/// correct_lead_wires(&mut e, &LeadWires::Supply(s));
/// assert!((e[0] - 1.0e-3 * 352.0 / 350.0).abs() < 1e-15);
/// # Ok::<(), gaugebook::PhysicsError>(())
/// ```
pub fn correct_lead_wires(strain: &mut [f64], leads: &LeadWires) {
    let f = leads.strain_factor();
    strain.iter_mut().for_each(|e| *e *= f);
}

/// The whole chain for a channel: its values (counts must already be ratios) in its unit to V/V,
/// the exact inverse of `meta.arrangement` with `meta.gauge_factor` and `meta.poisson`
/// (0.3 when absent: steel, common practice; only Poisson arrangements use it), then the
/// lead-wire correction when `meta.leads` is given. Returns a strain channel in µε.
///
/// ```
/// use gaugebook::{Arrangement, Channel, ChannelMeta, Unit, channel_to_strain};
/// let meta = ChannelMeta { arrangement: Some(Arrangement::Quarter), gauge_factor: Some(2.0), ..Default::default() };
/// let c = Channel::new("sg1", Unit::parse("mV/V")?, vec![0.0, 1.0]).with_meta(meta);
/// let e = channel_to_strain(&c)?;
/// assert_eq!(e.unit.symbol(), "µε");
/// assert!((e.values[1] - 4.0e-3 / (2.0 * 0.998) * 1e6).abs() < 1e-9);
/// # Ok::<(), Box<dyn std::error::Error>>(())
/// ```
pub fn channel_to_strain(channel: &super::Channel) -> Result<super::Channel, DataError> {
    let m = &channel.meta;
    let need = |what: &str| {
        DataError::Physics(PhysicsError::invalid(
            format!("channel `{}`", channel.name),
            format!("no {what}"),
            format!("a {what} in the channel's metadata"),
        ))
    };
    if channel.unit.kind() != crate::Kind::OutputRatio {
        return Err(DataError::Physics(PhysicsError::invalid(
            format!("unit of channel `{}`", channel.name),
            channel.unit.symbol().to_string(),
            "a bridge output ratio (mV/V, V/V)",
        )));
    }
    let arrangement = m.arrangement.ok_or_else(|| need("bridge arrangement"))?;
    let gf = m.gauge_factor.ok_or_else(|| need("gauge factor"))?;
    // ν of steel, 0.3 (common practice), when the specimen's is not given.
    let nu = m.poisson.unwrap_or(0.3);
    let inv = arrangement.inverse(gf, nu)?;
    let f = channel.unit.factor();
    let lead = m.leads.as_ref().map_or(1.0, LeadWires::strain_factor);
    // µε per m/m: 10⁶ (SI prefix micro).
    let scale = lead * 1e6;
    let values = channel
        .values
        .iter()
        .map(|&v| inv.apply_or_nan(v * f) * scale)
        .collect();
    let unit = super::header::parse_unit("µε").map_err(|e| {
        DataError::Physics(PhysicsError::invalid(
            "strain unit",
            e.to_string(),
            "µε in the unit table",
        ))
    })?;
    Ok(super::Channel {
        name: channel.name.clone(),
        header: channel.header.clone(),
        column: channel.column,
        unit,
        values,
        meta: channel.meta.clone(),
    })
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::Strain;

    #[test]
    fn inverse_round_trips_every_arrangement() {
        // Closed-form identity: output() then the bulk inverse returns the strain.
        for a in Arrangement::ALL {
            let strains = [-3000.0, -10.0, 0.0, 250.0, 5000.0];
            let r: Vec<f64> = strains
                .iter()
                .map(|&ue| {
                    a.output(Strain::from_microstrain(ue), 2.1, 0.3)
                        .unwrap()
                        .value()
                })
                .collect();
            let back = ratio_to_strain(&r, a, 2.1, 0.3).unwrap();
            for (ue, e) in strains.iter().zip(back) {
                assert!(
                    (e * 1e6 - ue).abs() < 1e-9 * ue.abs().max(1.0),
                    "{a:?}: {ue} vs {}",
                    e * 1e6
                );
            }
        }
    }

    #[test]
    fn two_wire_correction_undoes_the_arm_resistance_ratio() {
        // A gauge arm of R_g + 2 R_L changes by R_g·F·ε: the indicated relative change is
        // F·ε·R_g/(R_g + 2R_L); the correction undoes exactly that (closed form).
        use crate::units::ElectricalResistance;
        use crate::{Gauge, LeadWire, QuarterWiring};
        use uom::si::electrical_resistance::ohm;
        let r = ElectricalResistance::new::<ohm>;
        let (rg, rl, e) = (120.0, 0.8, 1.0e-3);
        let g = Gauge::new(r(rg), 2.0).unwrap();
        let q = QuarterLeads::new(&g, QuarterWiring::TwoWire, LeadWire::copper(r(rl)).unwrap());
        let mut indicated = vec![e * rg / (rg + 2.0 * rl)];
        correct_lead_wires(&mut indicated, &LeadWires::Quarter(q));
        assert!((indicated[0] - e).abs() < 1e-18);
    }

    #[test]
    fn bad_converter_parameters_are_errors() {
        let v = ElectricPotential::new::<volt>;
        assert!(AdcScale::from_range(1, v(2.5), 1.0, v(5.0)).is_err());
        assert!(AdcScale::from_range(24, v(2.5), 0.0, v(5.0)).is_err());
        assert!(AdcScale::new(f64::NAN, OutputRatio::new(1e-3)).is_err());
    }
}
