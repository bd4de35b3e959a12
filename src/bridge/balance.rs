//! Balancing a bridge with a trim resistor in one named arm.
//!
//! Balance needs R1·R3 = R2·R4, so the arm being trimmed must reach the resistance the other
//! three dictate: R1 = R2R4/R3, R2 = R1R3/R4, R3 = R2R4/R1, R4 = R1R3/R2. A series trim Rs adds
//! to the element (R + Rs), a parallel trim Rp shunts it (R·Rp/(R + Rp)), so a series trim can
//! only raise an arm and a parallel trim only lower it; the other direction has no solution in
//! that arm, and the error says which arm or kind would work.

use uom::si::electrical_resistance::ohm;

use super::{ArmId, Trim, TrimKind, WheatstoneBridge};
use crate::units::ElectricalResistance;
use crate::{OutputRatio, PhysicsError, check_finite};

impl WheatstoneBridge {
    /// The trim of `kind` in arm `arm` that balances the bridge (R1·R3 = R2·R4), computed for
    /// the arm's element without any trim it already has (the result replaces that trim).
    ///
    /// Errors with [`PhysicsError::NoSolution`] when the arm would have to move the other way
    /// (a series trim cannot lower an arm, a parallel one cannot raise it) or is already
    /// balanced (no finite trim is needed).
    ///
    /// ```
    /// use gaugebook::{Arm, ArmId, TrimKind, WheatstoneBridge};
    /// use gaugebook::units::ElectricalResistance;
    /// use uom::si::electrical_resistance::ohm;
    /// let r = ElectricalResistance::new::<ohm>(350.0);
    /// // R1 is 0.7 Ω high: balance it with 0.7 Ω in series with R2 (adjacent) …
    /// let b = WheatstoneBridge::equal_arms(r)?.with_arm(ArmId::R1, Arm::gauge(r, 0.002)?);
    /// let t = b.balance_trim(ArmId::R2, TrimKind::Series)?;
    /// assert!((t.resistance().get::<ohm>() - 0.7).abs() < 1e-9);
    /// // … or with a shunt across R1 itself: 350.7·Rp/(350.7 + Rp) = 350.
    /// let t = b.balance_trim(ArmId::R1, TrimKind::Parallel)?;
    /// assert!((t.resistance().get::<ohm>() - 350.7 * 350.0 / 0.7).abs() < 1e-4);
    /// assert!(b.balance_trim(ArmId::R1, TrimKind::Series).is_err());
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn balance_trim(&self, arm: ArmId, kind: TrimKind) -> Result<Trim, PhysicsError> {
        self.trim_for_output(arm, kind, OutputRatio::ZERO)
    }

    /// The trim of `kind` in arm `arm` that cancels a measured zero offset `offset` of a real
    /// bridge that this bridge models (for example nominal equal arms): the trim that makes the
    /// model read `self.output_ratio() − offset`. To first order in the offset the real bridge
    /// then reads zero, wherever its imbalance sits (common practice; exact when the imbalance
    /// is in the model).
    ///
    /// ```
    /// use gaugebook::{ArmId, OutputRatio, TrimKind, WheatstoneBridge};
    /// use gaugebook::units::ElectricalResistance;
    /// use uom::si::electrical_resistance::ohm;
    /// let nominal = WheatstoneBridge::equal_arms(ElectricalResistance::new::<ohm>(350.0))?;
    /// // +0.5 mV/V of zero offset: raise R2 or R4 (or lower R1 or R3).
    /// let t = nominal.trim_for_offset(ArmId::R2, TrimKind::Series, OutputRatio::from_mv_per_v(0.5))?;
    /// // About 4·R·r₀ = 0.7 Ω.
    /// assert!((t.resistance().get::<ohm>() - 0.7).abs() < 0.01);
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn trim_for_offset(
        &self,
        arm: ArmId,
        kind: TrimKind,
        offset: OutputRatio,
    ) -> Result<Trim, PhysicsError> {
        crate::check_finite("zero offset", offset.value(), "V/V")?;
        self.trim_for_output(arm, kind, self.output_ratio() - offset)
    }

    /// The trim of `kind` in arm `arm` that makes the bridge read `target` (computed for the
    /// arm's element without any trim it already has; the result replaces that trim).
    ///
    /// ```
    /// use gaugebook::{ArmId, OutputRatio, TrimKind, WheatstoneBridge};
    /// use gaugebook::units::ElectricalResistance;
    /// use uom::si::electrical_resistance::ohm;
    /// let b = WheatstoneBridge::equal_arms(ElectricalResistance::new::<ohm>(350.0))?;
    /// let target = OutputRatio::from_mv_per_v(-1.0);
    /// let t = b.trim_for_output(ArmId::R1, TrimKind::Parallel, target)?;
    /// let arm = b.arm(ArmId::R1).with_trim(t);
    /// assert!((b.with_arm(ArmId::R1, arm).output_ratio().mv_per_v() + 1.0).abs() < 1e-12);
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn trim_for_output(
        &self,
        arm: ArmId,
        kind: TrimKind,
        target: OutputRatio,
    ) -> Result<Trim, PhysicsError> {
        let needed = self.arm_resistance_for(arm, target)?.get::<ohm>();
        let element = self.arm(arm).element_ohms();
        let what = format!("a {} trim in arm {arm}", kind_name(kind));
        // At the target to within rounding: any finite trim would move it away.
        if (needed - element).abs() <= 1e-13 * element {
            return Err(PhysicsError::NoSolution {
                what,
                reason: format!("the untrimmed arm already gives {target}"),
            });
        }
        let value = match kind {
            TrimKind::Series => {
                if needed > element {
                    needed - element
                } else {
                    return Err(PhysicsError::NoSolution {
                        what,
                        reason: format!(
                            "the arm must fall from {element} Ω to {needed} Ω; a series trim only raises it (use a parallel trim here or a series trim in an adjacent arm)"
                        ),
                    });
                }
            }
            TrimKind::Parallel => {
                if needed < element {
                    needed * element / (element - needed)
                } else {
                    return Err(PhysicsError::NoSolution {
                        what,
                        reason: format!(
                            "the arm must rise from {element} Ω to {needed} Ω; a parallel trim only lowers it (use a series trim here or a parallel trim in an adjacent arm)"
                        ),
                    });
                }
            }
        };
        Trim::new(kind, ElectricalResistance::new::<ohm>(value))
    }

    /// The same bridge balanced by [`balance_trim`](WheatstoneBridge::balance_trim) in `arm`.
    ///
    /// ```
    /// use gaugebook::{Arm, ArmId, TrimKind, WheatstoneBridge};
    /// use gaugebook::units::ElectricalResistance;
    /// use uom::si::electrical_resistance::ohm;
    /// let r = ElectricalResistance::new::<ohm>(120.0);
    /// let b = WheatstoneBridge::equal_arms(r)?.with_arm(ArmId::R3, Arm::gauge(r, -0.004)?);
    /// let bal = b.balanced(ArmId::R4, TrimKind::Parallel)?;
    /// assert!(bal.output_ratio().value().abs() < 1e-15);
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn balanced(&self, arm: ArmId, kind: TrimKind) -> Result<WheatstoneBridge, PhysicsError> {
        let trim = self.balance_trim(arm, kind)?;
        let a = self.arm(arm).with_trim(trim);
        Ok(self.with_arm(arm, a))
    }
}

impl WheatstoneBridge {
    /// The total resistance arm `arm` must have, the other three unchanged, for the bridge to
    /// give output ratio `ratio` (balance is `ratio` = 0).
    ///
    /// From Vo/V = R1/(R1 + R2) − R4/(R3 + R4): with q = r + R4/(R3 + R4), R1 = q·R2/(1 − q) and
    /// R2 = R1·(1 − q)/q; with p = R1/(R1 + R2) − r, R4 = p·R3/(1 − p) and R3 = R4·(1 − p)/p.
    /// Errors with [`PhysicsError::NoSolution`] when no positive resistance gives `ratio`.
    ///
    /// ```
    /// use gaugebook::{ArmId, OutputRatio, WheatstoneBridge};
    /// use gaugebook::units::ElectricalResistance;
    /// use uom::si::electrical_resistance::ohm;
    /// let b = WheatstoneBridge::equal_arms(ElectricalResistance::new::<ohm>(350.0))?;
    /// let r1 = b.arm_resistance_for(ArmId::R1, OutputRatio::from_mv_per_v(1.0))?;
    /// let b2 = b.with_arm(ArmId::R1, gaugebook::Arm::fixed(r1)?);
    /// assert!((b2.output_ratio().mv_per_v() - 1.0).abs() < 1e-12);
    /// assert!(b.arm_resistance_for(ArmId::R1, OutputRatio::new(0.5)).is_err());
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn arm_resistance_for(
        &self,
        arm: ArmId,
        ratio: OutputRatio,
    ) -> Result<ElectricalResistance, PhysicsError> {
        let r = check_finite("output ratio", ratio.value(), "V/V")?;
        let [r1, r2, r3, r4] = self.arm_resistances().map(|x| x.get::<ohm>());
        let q = r + r4 / (r3 + r4);
        let p = r1 / (r1 + r2) - r;
        let (frac, value) = match arm {
            ArmId::R1 => (q, q * r2 / (1.0 - q)),
            ArmId::R2 => (q, r1 * (1.0 - q) / q),
            ArmId::R3 => (p, r4 * (1.0 - p) / p),
            ArmId::R4 => (p, p * r3 / (1.0 - p)),
        };
        // The divider fraction must lie strictly inside (0, 1) for a positive, finite arm.
        if !(frac > 0.0 && frac < 1.0 && value.is_finite() && value > 0.0) {
            return Err(PhysicsError::NoSolution {
                what: format!("the resistance of arm {arm}"),
                reason: format!(
                    "no positive resistance gives {r} V/V with the other arms as they are"
                ),
            });
        }
        Ok(ElectricalResistance::new::<ohm>(value))
    }
}

fn kind_name(kind: TrimKind) -> &'static str {
    match kind {
        TrimKind::Series => "series",
        TrimKind::Parallel => "parallel",
    }
}
