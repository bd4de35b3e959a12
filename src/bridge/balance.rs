//! Balancing a bridge with a trim resistor in one named arm.
//!
//! Balance needs R1·R3 = R2·R4, so the arm being trimmed must reach the resistance the other
//! three dictate: R1 = R2R4/R3, R2 = R1R3/R4, R3 = R2R4/R1, R4 = R1R3/R2. A series trim Rs adds
//! to the element (R + Rs), a parallel trim Rp shunts it (R·Rp/(R + Rp)), so a series trim can
//! only raise an arm and a parallel trim only lower it; the other direction has no solution in
//! that arm, and the error says which arm or kind would work.

use uom::si::electrical_resistance::ohm;

use super::{ArmId, Trim, TrimKind, WheatstoneBridge};
use crate::PhysicsError;
use crate::units::ElectricalResistance;

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
        let r = self.arm_resistances().map(|x| x.get::<ohm>());
        let needed = match arm {
            ArmId::R1 => r[1] * r[3] / r[2],
            ArmId::R2 => r[0] * r[2] / r[3],
            ArmId::R3 => r[1] * r[3] / r[0],
            ArmId::R4 => r[0] * r[2] / r[1],
        };
        let element = self.arm(arm).element_ohms();
        let what = format!("a {} trim in arm {arm}", kind_name(kind));
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

fn kind_name(kind: TrimKind) -> &'static str {
    match kind {
        TrimKind::Series => "series",
        TrimKind::Parallel => "parallel",
    }
}
