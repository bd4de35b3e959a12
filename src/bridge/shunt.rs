//! Shunt calibration: the strain a shunt resistor across one arm simulates, and the shunt for
//! a target strain, under two definitions that the result names.
//!
//! *Resistance-equivalent*: the shunt R_s across an arm of resistance R lowers it to
//! R·R_s/(R + R_s), a change ΔR/R = −R/(R + R_s); the simulated strain is the strain a gauge
//! in that arm would need for the same change, ε = −R/(F·(R + R_s)), with R_s = R/(F·|ε|) − R
//! for a target (Dally & Riley, *Experimental Stress Analysis*, 4th ed., ch. 6; Window, *Strain
//! Gauge Technology*, 2nd ed., ch. 3; both from memory). Here it is signed by the arm's effect
//! on the output (negative across R1 or R3, positive across R2 or R4), so that its sign matches
//! the reading's.
//!
//! *Indicated reading*: the strain the bridge reading shows, i.e. the exact output of the
//! shunted bridge converted by the arrangement's exact inverse. The two agree exactly for a
//! shunt across the active arm of a quarter bridge; elsewhere they differ by the bridge factor
//! (a shunt changes one arm, the arrangement's inverse assumes all its active arms move) and by
//! nonlinearity. Which one a certificate means must be stated; the result carries it.

use uom::si::electrical_resistance::ohm;

use super::{Arm, ArmId, Arrangement, Trim, TrimKind, WheatstoneBridge};
use crate::units::ElectricalResistance;
use crate::{Gauge, OutputRatio, PhysicsError, Strain, check_finite, check_positive};

/// Which definition of shunt-calibration strain a [`ShuntCalibration`] uses (see the module
/// documentation).
///
/// ```
/// use gaugebook::ShuntDefinition;
/// assert_eq!(ShuntDefinition::ResistanceEquivalent.name(), "resistance-equivalent");
/// assert_eq!(ShuntDefinition::from_name("indicated")?, ShuntDefinition::IndicatedReading);
/// # Ok::<(), gaugebook::PhysicsError>(())
/// ```
#[derive(Clone, Copy, Debug, PartialEq, Eq, Hash)]
pub enum ShuntDefinition {
    /// ε = ∓R/(F(R + R_s)): the strain a gauge in the shunted arm would need.
    ResistanceEquivalent,
    /// The strain the bridge's exact output reads through the arrangement's exact inverse.
    IndicatedReading,
}

impl ShuntDefinition {
    /// The definition's name: `resistance-equivalent` or `indicated`.
    ///
    /// ```
    /// assert_eq!(gaugebook::ShuntDefinition::IndicatedReading.name(), "indicated");
    /// ```
    pub fn name(self) -> &'static str {
        match self {
            ShuntDefinition::ResistanceEquivalent => "resistance-equivalent",
            ShuntDefinition::IndicatedReading => "indicated",
        }
    }

    /// The definition named `name` (as [`name`](ShuntDefinition::name) gives it).
    ///
    /// ```
    /// assert!(gaugebook::ShuntDefinition::from_name("average").is_err());
    /// ```
    pub fn from_name(name: &str) -> Result<ShuntDefinition, PhysicsError> {
        match name.trim().to_ascii_lowercase().as_str() {
            "resistance-equivalent" => Ok(ShuntDefinition::ResistanceEquivalent),
            "indicated" => Ok(ShuntDefinition::IndicatedReading),
            _ => Err(PhysicsError::invalid(
                "shunt-calibration definition",
                format!("\"{name}\""),
                "resistance-equivalent or indicated",
            )),
        }
    }
}

/// A shunt calibration point: which arm is shunted, by what, the bridge output it gives and
/// the strain it stands for under the stated definition. Built by
/// [`simulate`](ShuntCalibration::simulate) or [`resistor_for`](ShuntCalibration::resistor_for).
///
/// ```
/// use gaugebook::{ArmId, Arrangement, Gauge, ShuntCalibration, ShuntDefinition};
/// use gaugebook::units::ElectricalResistance;
/// use uom::si::electrical_resistance::{ohm, kiloohm};
/// let g = Gauge::new(ElectricalResistance::new::<ohm>(350.0), 2.0)?;
/// let c = ShuntCalibration::simulate(Arrangement::Quarter, &g, 0.3, ArmId::R1,
///     ElectricalResistance::new::<kiloohm>(174.65), ShuntDefinition::ResistanceEquivalent)?;
/// // −350/(2·(350 + 174 650)) = −1000 µε.
/// assert!((c.strain().microstrain() + 1000.0).abs() < 1e-9);
/// assert_eq!(c.definition(), ShuntDefinition::ResistanceEquivalent);
/// # Ok::<(), gaugebook::PhysicsError>(())
/// ```
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct ShuntCalibration {
    definition: ShuntDefinition,
    arrangement: Arrangement,
    arm: ArmId,
    shunt: ElectricalResistance,
    strain: Strain,
    output: OutputRatio,
}

/// +1 for arms that raise the output when they rise (R1, R3), −1 for the others.
fn arm_sign(arm: ArmId) -> f64 {
    match arm {
        ArmId::R1 | ArmId::R3 => 1.0,
        ArmId::R2 | ArmId::R4 => -1.0,
    }
}

fn unstrained(
    arrangement: Arrangement,
    gauge: &Gauge,
    nu: f64,
) -> Result<WheatstoneBridge, PhysicsError> {
    arrangement.bridge(gauge.resistance(), Strain::ZERO, gauge.gauge_factor(), nu)
}

fn shunted(
    bridge: &WheatstoneBridge,
    arm: ArmId,
    shunt: ElectricalResistance,
) -> Result<WheatstoneBridge, PhysicsError> {
    let a: Arm = bridge
        .arm(arm)
        .with_trim(Trim::new(TrimKind::Parallel, shunt)?);
    Ok(bridge.with_arm(arm, a))
}

impl ShuntCalibration {
    /// The calibration point of shunt `shunt` across arm `arm` of `arrangement` built from
    /// `gauge` (unstrained, ν = `nu` for Poisson arms), under `definition`.
    ///
    /// ```
    /// use gaugebook::{ArmId, Arrangement, Gauge, ShuntCalibration, ShuntDefinition};
    /// use gaugebook::units::ElectricalResistance;
    /// use uom::si::electrical_resistance::{ohm, kiloohm};
    /// let g = Gauge::new(ElectricalResistance::new::<ohm>(350.0), 2.0)?;
    /// let rs = ElectricalResistance::new::<kiloohm>(100.0);
    /// let re = ShuntCalibration::simulate(Arrangement::Quarter, &g, 0.3, ArmId::R1, rs, ShuntDefinition::ResistanceEquivalent)?;
    /// let ind = ShuntCalibration::simulate(Arrangement::Quarter, &g, 0.3, ArmId::R1, rs, ShuntDefinition::IndicatedReading)?;
    /// // Across the active arm of a quarter bridge the two definitions agree.
    /// assert!((re.strain().value() - ind.strain().value()).abs() < 1e-15);
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn simulate(
        arrangement: Arrangement,
        gauge: &Gauge,
        nu: f64,
        arm: ArmId,
        shunt: ElectricalResistance,
        definition: ShuntDefinition,
    ) -> Result<ShuntCalibration, PhysicsError> {
        check_positive("shunt resistance", shunt.get::<ohm>(), "Ω")?;
        let gf = gauge.gauge_factor();
        let b = shunted(&unstrained(arrangement, gauge, nu)?, arm, shunt)?;
        let output = b.output_ratio();
        let strain = match definition {
            ShuntDefinition::ResistanceEquivalent => {
                let r = gauge.resistance().get::<ohm>();
                let rs = shunt.get::<ohm>();
                Strain::new(-arm_sign(arm) * r / (gf * (r + rs)))
            }
            ShuntDefinition::IndicatedReading => arrangement.strain_from_output(output, gf, nu)?,
        };
        Ok(ShuntCalibration {
            definition,
            arrangement,
            arm,
            shunt,
            strain,
            output,
        })
    }

    /// The shunt across arm `arm` that stands for strain `target` under `definition`.
    ///
    /// A shunt only lowers an arm, so across R1 or R3 it simulates negative strain and across
    /// R2 or R4 positive; a target of the other sign, zero, or too large to reach errors with
    /// [`PhysicsError::NoSolution`].
    ///
    /// ```
    /// use gaugebook::{ArmId, Arrangement, Gauge, ShuntCalibration, ShuntDefinition, Strain};
    /// use gaugebook::units::ElectricalResistance;
    /// use uom::si::electrical_resistance::{ohm, kiloohm};
    /// let g = Gauge::new(ElectricalResistance::new::<ohm>(350.0), 2.0)?;
    /// let c = ShuntCalibration::resistor_for(Arrangement::Quarter, &g, 0.3, ArmId::R1,
    ///     Strain::from_microstrain(-1000.0), ShuntDefinition::ResistanceEquivalent)?;
    /// // R_s = R/(F·|ε|) − R = 175 000 − 350 Ω.
    /// assert!((c.shunt().get::<kiloohm>() - 174.65).abs() < 1e-9);
    /// assert!(ShuntCalibration::resistor_for(Arrangement::Quarter, &g, 0.3, ArmId::R1,
    ///     Strain::from_microstrain(1000.0), ShuntDefinition::ResistanceEquivalent).is_err());
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn resistor_for(
        arrangement: Arrangement,
        gauge: &Gauge,
        nu: f64,
        arm: ArmId,
        target: Strain,
        definition: ShuntDefinition,
    ) -> Result<ShuntCalibration, PhysicsError> {
        let e = check_finite("target strain", target.value(), "m/m")?;
        let gf = gauge.gauge_factor();
        let r = gauge.resistance().get::<ohm>();
        let no = |reason: String| PhysicsError::NoSolution {
            what: format!("a shunt across arm {arm} for {target}"),
            reason,
        };
        let shunt = match definition {
            ShuntDefinition::ResistanceEquivalent => {
                let m = -arm_sign(arm) * e;
                if !(m > 0.0 && gf * m < 1.0) {
                    return Err(no(format!(
                        "a shunt across {arm} simulates strain of the {} sign with F·|ε| < 1",
                        if arm_sign(arm) > 0.0 {
                            "negative"
                        } else {
                            "positive"
                        }
                    )));
                }
                r / (gf * m) - r
            }
            ShuntDefinition::IndicatedReading => {
                let b = unstrained(arrangement, gauge, nu)?;
                let out = arrangement.output(target, gf, nu)?;
                let needed = b.arm_resistance_for(arm, out)?.get::<ohm>();
                let element = b.arm(arm).element_ohms();
                if needed >= element {
                    return Err(no(format!(
                        "the arm must rise from {element} Ω to {needed} Ω and a shunt only lowers it"
                    )));
                }
                element * needed / (element - needed)
            }
        };
        ShuntCalibration::simulate(
            arrangement,
            gauge,
            nu,
            arm,
            ElectricalResistance::new::<ohm>(shunt),
            definition,
        )
    }

    /// The definition the strain follows.
    ///
    /// ```
    /// use gaugebook::{ArmId, Arrangement, Gauge, ShuntCalibration, ShuntDefinition};
    /// use gaugebook::units::ElectricalResistance;
    /// use uom::si::electrical_resistance::{ohm, kiloohm};
    /// let g = Gauge::new(ElectricalResistance::new::<ohm>(350.0), 2.0)?;
    /// let c = ShuntCalibration::simulate(Arrangement::FullBending, &g, 0.3, ArmId::R2,
    ///     ElectricalResistance::new::<kiloohm>(60.0), ShuntDefinition::IndicatedReading)?;
    /// assert_eq!(c.definition().name(), "indicated");
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn definition(&self) -> ShuntDefinition {
        self.definition
    }

    /// The arrangement the shunt was applied to.
    ///
    /// ```
    /// use gaugebook::{ArmId, Arrangement, Gauge, ShuntCalibration, ShuntDefinition};
    /// use gaugebook::units::ElectricalResistance;
    /// use uom::si::electrical_resistance::{ohm, kiloohm};
    /// let g = Gauge::new(ElectricalResistance::new::<ohm>(350.0), 2.0)?;
    /// let c = ShuntCalibration::simulate(Arrangement::HalfBending, &g, 0.3, ArmId::R2,
    ///     ElectricalResistance::new::<kiloohm>(60.0), ShuntDefinition::IndicatedReading)?;
    /// assert_eq!(c.arrangement(), Arrangement::HalfBending);
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn arrangement(&self) -> Arrangement {
        self.arrangement
    }

    /// The shunted arm.
    ///
    /// ```
    /// use gaugebook::{ArmId, Arrangement, Gauge, ShuntCalibration, ShuntDefinition};
    /// use gaugebook::units::ElectricalResistance;
    /// use uom::si::electrical_resistance::{ohm, kiloohm};
    /// let g = Gauge::new(ElectricalResistance::new::<ohm>(350.0), 2.0)?;
    /// let c = ShuntCalibration::simulate(Arrangement::Quarter, &g, 0.3, ArmId::R4,
    ///     ElectricalResistance::new::<kiloohm>(60.0), ShuntDefinition::ResistanceEquivalent)?;
    /// assert_eq!(c.arm(), ArmId::R4);
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn arm(&self) -> ArmId {
        self.arm
    }

    /// The shunt resistor.
    ///
    /// ```
    /// use gaugebook::{ArmId, Arrangement, Gauge, ShuntCalibration, ShuntDefinition};
    /// use gaugebook::units::ElectricalResistance;
    /// use uom::si::electrical_resistance::{ohm, kiloohm};
    /// let g = Gauge::new(ElectricalResistance::new::<ohm>(350.0), 2.0)?;
    /// let rs = ElectricalResistance::new::<kiloohm>(60.0);
    /// let c = ShuntCalibration::simulate(Arrangement::Quarter, &g, 0.3, ArmId::R1, rs, ShuntDefinition::ResistanceEquivalent)?;
    /// assert_eq!(c.shunt(), rs);
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn shunt(&self) -> ElectricalResistance {
        self.shunt
    }

    /// The simulated strain under [`definition`](ShuntCalibration::definition).
    ///
    /// ```
    /// use gaugebook::{ArmId, Arrangement, Gauge, ShuntCalibration, ShuntDefinition};
    /// use gaugebook::units::ElectricalResistance;
    /// use uom::si::electrical_resistance::{ohm, kiloohm};
    /// let g = Gauge::new(ElectricalResistance::new::<ohm>(350.0), 2.0)?;
    /// let c = ShuntCalibration::simulate(Arrangement::Quarter, &g, 0.3, ArmId::R2,
    ///     ElectricalResistance::new::<kiloohm>(174.65), ShuntDefinition::ResistanceEquivalent)?;
    /// assert!((c.strain().microstrain() - 1000.0).abs() < 1e-9);
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn strain(&self) -> Strain {
        self.strain
    }

    /// The exact output ratio of the shunted (otherwise unstrained) bridge.
    ///
    /// ```
    /// use gaugebook::{ArmId, Arrangement, Gauge, ShuntCalibration, ShuntDefinition};
    /// use gaugebook::units::ElectricalResistance;
    /// use uom::si::electrical_resistance::{ohm, kiloohm};
    /// let g = Gauge::new(ElectricalResistance::new::<ohm>(350.0), 2.0)?;
    /// let c = ShuntCalibration::simulate(Arrangement::Quarter, &g, 0.3, ArmId::R1,
    ///     ElectricalResistance::new::<kiloohm>(174.65), ShuntDefinition::ResistanceEquivalent)?;
    /// assert!(c.output().mv_per_v() < 0.0);
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn output(&self) -> OutputRatio {
        self.output
    }
}
