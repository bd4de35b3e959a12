//! The general four-arm Wheatstone bridge: exact output for voltage or current excitation,
//! balance condition, input and output resistance, and the current and power in each arm.

use uom::si::electric_current::ampere;
use uom::si::electric_potential::volt;
use uom::si::electrical_resistance::ohm;
use uom::si::power::watt;

use super::{Arm, ArmId, Excitation};
use crate::units::{ElectricCurrent, ElectricPotential, ElectricalResistance, Power};
use crate::{OutputRatio, PhysicsError};

/// A four-arm Wheatstone bridge.
///
/// Arm numbering and sign (the convention of Dally & Riley, *Experimental Stress Analysis*, 4th
/// ed., ch. 6, from memory): the excitation corners are E+ and E−, the output corners S+ and S−.
/// Going round the ring, R1 joins E− to S+, R2 joins S+ to E+, R3 joins E+ to S−, and R4 joins
/// S− to E−. Adjacent arms (1–2, 2–3, 3–4, 4–1) share a corner; opposite arms (1–3, 2–4) do not.
/// The output is Vo = V(S+) − V(S−), so
///
/// Vo/V = R1/(R1 + R2) − R4/(R3 + R4) = (R1·R3 − R2·R4)/((R1 + R2)(R3 + R4)),
///
/// positive when R1 or R3 rises and negative when R2 or R4 rises; V is the voltage across E+ and
/// E−. The bridge is balanced (Vo = 0) when R1·R3 = R2·R4. The output corners are assumed
/// unloaded (an instrument input of infinite impedance).
///
/// ```
/// use gaugebook::{Arm, WheatstoneBridge, Excitation};
/// use gaugebook::units::{ElectricalResistance, ElectricPotential};
/// use uom::si::{electrical_resistance::ohm, electric_potential::{volt, millivolt}};
/// let r = ElectricalResistance::new::<ohm>(350.0);
/// let b = WheatstoneBridge::new([Arm::gauge(r, 2.0e-3)?, Arm::fixed(r)?, Arm::fixed(r)?, Arm::fixed(r)?]);
/// let vo = b.output(Excitation::voltage(ElectricPotential::new::<volt>(10.0))?)?;
/// // Quarter bridge: Vo/V = x/(4 + 2x).
/// assert!((vo.get::<millivolt>() - 10.0e3 * 2.0e-3 / 4.004).abs() < 1e-9);
/// # Ok::<(), gaugebook::PhysicsError>(())
/// ```
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct WheatstoneBridge {
    arms: [Arm; 4],
}

impl WheatstoneBridge {
    /// A bridge of arms R1, R2, R3, R4 (in that order).
    ///
    /// ```
    /// use gaugebook::{Arm, WheatstoneBridge};
    /// use gaugebook::units::ElectricalResistance;
    /// use uom::si::electrical_resistance::ohm;
    /// let r = Arm::fixed(ElectricalResistance::new::<ohm>(120.0))?;
    /// assert!(WheatstoneBridge::new([r; 4]).is_balanced(1e-12));
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn new(arms: [Arm; 4]) -> WheatstoneBridge {
        WheatstoneBridge { arms }
    }

    /// Four equal fixed arms of `resistance`.
    ///
    /// ```
    /// use gaugebook::WheatstoneBridge;
    /// use gaugebook::units::ElectricalResistance;
    /// use uom::si::electrical_resistance::ohm;
    /// let b = WheatstoneBridge::equal_arms(ElectricalResistance::new::<ohm>(350.0))?;
    /// assert_eq!(b.output_ratio().value(), 0.0);
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn equal_arms(resistance: ElectricalResistance) -> Result<WheatstoneBridge, PhysicsError> {
        let a = Arm::fixed(resistance)?;
        Ok(WheatstoneBridge { arms: [a; 4] })
    }

    /// The arm at `id`.
    ///
    /// ```
    /// use gaugebook::{ArmId, WheatstoneBridge};
    /// use gaugebook::units::ElectricalResistance;
    /// use uom::si::electrical_resistance::ohm;
    /// let b = WheatstoneBridge::equal_arms(ElectricalResistance::new::<ohm>(350.0))?;
    /// assert_eq!(b.arm(ArmId::R2).resistance().get::<ohm>(), 350.0);
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn arm(&self, id: ArmId) -> &Arm {
        &self.arms[id.index()]
    }

    /// All four arms, R1 first.
    ///
    /// ```
    /// use gaugebook::WheatstoneBridge;
    /// use gaugebook::units::ElectricalResistance;
    /// use uom::si::electrical_resistance::ohm;
    /// let b = WheatstoneBridge::equal_arms(ElectricalResistance::new::<ohm>(350.0))?;
    /// assert_eq!(b.arms().len(), 4);
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn arms(&self) -> &[Arm; 4] {
        &self.arms
    }

    /// The same bridge with arm `id` replaced by `arm`.
    ///
    /// ```
    /// use gaugebook::{Arm, ArmId, WheatstoneBridge};
    /// use gaugebook::units::ElectricalResistance;
    /// use uom::si::electrical_resistance::ohm;
    /// let r = ElectricalResistance::new::<ohm>(350.0);
    /// let b = WheatstoneBridge::equal_arms(r)?.with_arm(ArmId::R3, Arm::gauge(r, 1e-3)?);
    /// assert!(b.output_ratio().value() > 0.0);
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn with_arm(mut self, id: ArmId, arm: Arm) -> WheatstoneBridge {
        self.arms[id.index()] = arm;
        self
    }

    fn ohms(&self) -> [f64; 4] {
        [
            self.arms[0].ohms(),
            self.arms[1].ohms(),
            self.arms[2].ohms(),
            self.arms[3].ohms(),
        ]
    }

    /// Total resistance of each arm (with its trim), R1 first.
    ///
    /// ```
    /// use gaugebook::WheatstoneBridge;
    /// use gaugebook::units::ElectricalResistance;
    /// use uom::si::electrical_resistance::ohm;
    /// let b = WheatstoneBridge::equal_arms(ElectricalResistance::new::<ohm>(350.0))?;
    /// assert_eq!(b.arm_resistances()[3].get::<ohm>(), 350.0);
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn arm_resistances(&self) -> [ElectricalResistance; 4] {
        self.ohms().map(ElectricalResistance::new::<ohm>)
    }

    /// Exact output ratio Vo/V = R1/(R1 + R2) − R4/(R3 + R4), the same for voltage and current
    /// excitation (V is then the voltage the current develops across the bridge).
    ///
    /// ```
    /// use gaugebook::{Arm, WheatstoneBridge};
    /// use gaugebook::units::ElectricalResistance;
    /// use uom::si::electrical_resistance::ohm;
    /// let r = ElectricalResistance::new::<ohm>(100.0);
    /// let b = WheatstoneBridge::equal_arms(r)?.with_arm(gaugebook::ArmId::R2, Arm::gauge(r, 0.01)?);
    /// // R2 rises, so the output falls: 100/201 − 1/2.
    /// assert!((b.output_ratio().value() - (100.0 / 201.0 - 0.5)).abs() < 1e-15);
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn output_ratio(&self) -> OutputRatio {
        let [r1, r2, r3, r4] = self.ohms();
        // The product form keeps full relative precision near balance, where the difference of
        // two nearly equal divider ratios would cancel.
        OutputRatio::new((r1 * r3 - r2 * r4) / ((r1 + r2) * (r3 + r4)))
    }

    /// Voltage across E+ and E− under `excitation`: the voltage itself, or I·(R1+R2)‖(R3+R4).
    ///
    /// ```
    /// use gaugebook::{Excitation, WheatstoneBridge};
    /// use gaugebook::units::{ElectricalResistance, ElectricCurrent};
    /// use uom::si::{electrical_resistance::ohm, electric_current::milliampere, electric_potential::volt};
    /// let b = WheatstoneBridge::equal_arms(ElectricalResistance::new::<ohm>(350.0))?;
    /// let v = b.excitation_voltage(Excitation::current(ElectricCurrent::new::<milliampere>(10.0))?)?;
    /// assert!((v.get::<volt>() - 3.5).abs() < 1e-12);
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn excitation_voltage(
        &self,
        excitation: Excitation,
    ) -> Result<ElectricPotential, PhysicsError> {
        Ok(match excitation.checked()? {
            Excitation::Voltage(v) => v,
            Excitation::Current(i) => {
                ElectricPotential::new::<volt>(i.get::<ampere>() * self.input_ohms())
            }
        })
    }

    /// Exact output voltage Vo = V(S+) − V(S−) under `excitation`.
    ///
    /// ```
    /// use gaugebook::{Arm, ArmId, Excitation, WheatstoneBridge};
    /// use gaugebook::units::{ElectricalResistance, ElectricCurrent};
    /// use uom::si::{electrical_resistance::ohm, electric_current::ampere, electric_potential::volt};
    /// let r = ElectricalResistance::new::<ohm>(100.0);
    /// let b = WheatstoneBridge::equal_arms(r)?.with_arm(ArmId::R1, Arm::gauge(r, 0.02)?);
    /// // Current drive: Vo = I·(R1·R3 − R2·R4)/ΣR.
    /// let vo = b.output(Excitation::current(ElectricCurrent::new::<ampere>(0.01))?)?;
    /// assert!((vo.get::<volt>() - 0.01 * (102.0 * 100.0 - 100.0 * 100.0) / 402.0).abs() < 1e-15);
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn output(&self, excitation: Excitation) -> Result<ElectricPotential, PhysicsError> {
        let v = self.excitation_voltage(excitation)?;
        Ok(v * self.output_ratio().value())
    }

    fn input_ohms(&self) -> f64 {
        let [r1, r2, r3, r4] = self.ohms();
        (r1 + r2) * (r3 + r4) / (r1 + r2 + r3 + r4)
    }

    /// Resistance seen by the excitation source across E+ and E−: (R1 + R2)‖(R3 + R4).
    ///
    /// ```
    /// use gaugebook::WheatstoneBridge;
    /// use gaugebook::units::ElectricalResistance;
    /// use uom::si::electrical_resistance::ohm;
    /// let b = WheatstoneBridge::equal_arms(ElectricalResistance::new::<ohm>(350.0))?;
    /// assert!((b.input_resistance().get::<ohm>() - 350.0).abs() < 1e-12);
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn input_resistance(&self) -> ElectricalResistance {
        ElectricalResistance::new::<ohm>(self.input_ohms())
    }

    /// Source resistance seen at S+ and S− with the excitation source shorted:
    /// R1‖R2 + R3‖R4.
    ///
    /// ```
    /// use gaugebook::WheatstoneBridge;
    /// use gaugebook::units::ElectricalResistance;
    /// use uom::si::electrical_resistance::ohm;
    /// let b = WheatstoneBridge::equal_arms(ElectricalResistance::new::<ohm>(350.0))?;
    /// assert!((b.output_resistance().get::<ohm>() - 350.0).abs() < 1e-12);
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn output_resistance(&self) -> ElectricalResistance {
        let [r1, r2, r3, r4] = self.ohms();
        ElectricalResistance::new::<ohm>(r1 * r2 / (r1 + r2) + r3 * r4 / (r3 + r4))
    }

    /// Relative departure from balance, R1·R3/(R2·R4) − 1 (zero when balanced).
    ///
    /// ```
    /// use gaugebook::{Arm, ArmId, WheatstoneBridge};
    /// use gaugebook::units::ElectricalResistance;
    /// use uom::si::electrical_resistance::ohm;
    /// let r = ElectricalResistance::new::<ohm>(350.0);
    /// let b = WheatstoneBridge::equal_arms(r)?.with_arm(ArmId::R1, Arm::gauge(r, 0.001)?);
    /// assert!((b.balance_residual() - 0.001).abs() < 1e-15);
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn balance_residual(&self) -> f64 {
        let [r1, r2, r3, r4] = self.ohms();
        r1 * r3 / (r2 * r4) - 1.0
    }

    /// Whether R1·R3 = R2·R4 to within relative tolerance `rel_tol`.
    ///
    /// ```
    /// use gaugebook::{Arm, WheatstoneBridge};
    /// use gaugebook::units::ElectricalResistance;
    /// use uom::si::electrical_resistance::ohm;
    /// let a = |v| Arm::fixed(ElectricalResistance::new::<ohm>(v));
    /// // 100·300 = 200·150: balanced although no two arms are equal.
    /// let b = WheatstoneBridge::new([a(100.0)?, a(200.0)?, a(300.0)?, a(150.0)?]);
    /// assert!(b.is_balanced(1e-12));
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn is_balanced(&self, rel_tol: f64) -> bool {
        self.balance_residual().abs() <= rel_tol
    }

    /// Current through each arm, R1 first: Vex/(R1 + R2) in R1 and R2, Vex/(R3 + R4) in R3
    /// and R4 (the output corners unloaded).
    ///
    /// ```
    /// use gaugebook::{Excitation, WheatstoneBridge};
    /// use gaugebook::units::{ElectricalResistance, ElectricPotential};
    /// use uom::si::{electrical_resistance::ohm, electric_potential::volt, electric_current::milliampere};
    /// let b = WheatstoneBridge::equal_arms(ElectricalResistance::new::<ohm>(350.0))?;
    /// let i = b.arm_currents(Excitation::voltage(ElectricPotential::new::<volt>(7.0))?)?;
    /// assert!((i[0].get::<milliampere>() - 10.0).abs() < 1e-12);
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn arm_currents(
        &self,
        excitation: Excitation,
    ) -> Result<[ElectricCurrent; 4], PhysicsError> {
        let v = self.excitation_voltage(excitation)?.get::<volt>();
        let [r1, r2, r3, r4] = self.ohms();
        let left = v / (r1 + r2);
        let right = v / (r3 + r4);
        Ok([left, left, right, right].map(ElectricCurrent::new::<ampere>))
    }

    /// Power dissipated in each arm's element (the gauge or fixed resistor, not its trim), R1
    /// first: I²·R for a series trim or none, V²/R across an element with a parallel trim.
    ///
    /// ```
    /// use gaugebook::{Excitation, WheatstoneBridge};
    /// use gaugebook::units::{ElectricalResistance, ElectricPotential};
    /// use uom::si::{electrical_resistance::ohm, electric_potential::volt, power::milliwatt};
    /// let b = WheatstoneBridge::equal_arms(ElectricalResistance::new::<ohm>(350.0))?;
    /// let p = b.element_powers(Excitation::voltage(ElectricPotential::new::<volt>(10.0))?)?;
    /// // (V/2)²/R = 25/350 W.
    /// assert!((p[2].get::<milliwatt>() - 25.0e3 / 350.0).abs() < 1e-9);
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn element_powers(&self, excitation: Excitation) -> Result<[Power; 4], PhysicsError> {
        let i = self.arm_currents(excitation)?;
        let mut p = [Power::new::<watt>(0.0); 4];
        for (k, arm) in self.arms.iter().enumerate() {
            let ia = i[k].get::<ampere>();
            let re = arm.element_ohms();
            let w = match arm.trim() {
                Some(t) if t.kind() == super::TrimKind::Parallel => {
                    // The whole arm current splits; the element sees the arm's voltage.
                    let va = ia * arm.ohms();
                    va * va / re
                }
                _ => ia * ia * re,
            };
            p[k] = Power::new::<watt>(w);
        }
        Ok(p)
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    fn ohm_arm(v: f64) -> Arm {
        Arm::fixed(ElectricalResistance::new::<ohm>(v)).unwrap()
    }

    #[test]
    fn product_form_equals_divider_difference() {
        // Closed-form identity: R1/(R1+R2) − R4/(R3+R4) = (R1R3 − R2R4)/((R1+R2)(R3+R4)).
        let b =
            WheatstoneBridge::new([ohm_arm(101.0), ohm_arm(99.5), ohm_arm(100.3), ohm_arm(98.0)]);
        let d = 101.0 / (101.0 + 99.5) - 98.0 / (100.3 + 98.0);
        assert!((b.output_ratio().value() - d).abs() < 1e-15);
    }

    #[test]
    fn element_power_sums_to_input_power() {
        // Energy conservation: Σ arm powers = Vex²/R_in (no trims).
        let b = WheatstoneBridge::new([
            ohm_arm(120.0),
            ohm_arm(350.0),
            ohm_arm(1000.0),
            ohm_arm(50.0),
        ]);
        let v = 5.0;
        let ex = Excitation::voltage(ElectricPotential::new::<volt>(v)).unwrap();
        let p: f64 = b
            .element_powers(ex)
            .unwrap()
            .iter()
            .map(|p| p.get::<watt>())
            .sum();
        assert!((p - v * v / b.input_resistance().get::<ohm>()).abs() < 1e-12);
    }
}
