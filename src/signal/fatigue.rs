//! Fatigue damage by the Palmgren–Miner linear rule, D = Σ nᵢ / Nᵢ, with cycles to failure from
//! a Basquin S–N curve N = C·S^(−m) and an optional endurance limit below which cycles do no
//! damage (A. Palmgren 1924; M. A. Miner, *J. Appl. Mech.* 12 (1945) A159; O. H. Basquin,
//! *Proc. ASTM* 10 (1910); all from memory).
//!
//! S here is the cycle's **range** as counted by [`crate::rainflow_cycles`], in the signal's
//! unit (stress, strain or load), and C must be given for ranges in that unit. For a curve
//! written in amplitude, S_a = S/2, use C_range = C_amplitude · 2^m.
//!
//! Damage sums are design estimates that must be proven by test; fatigue rating and approval
//! follow local codes and licensed practice. The linear rule ignores load sequence, and a sharp
//! endurance limit ignores damage from small cycles once large ones have started a crack.

use super::rainflow::Cycle;
use crate::PhysicsError;

/// A Basquin S–N curve, N = C·S^(−m), optionally with an endurance limit.
///
/// ```
/// let sn = gaugebook::SnCurve::basquin(1e12, 3.0)?.with_endurance_limit(50.0)?;
/// assert_eq!(sn.cycles_to_failure(100.0), 1e6);
/// assert_eq!(sn.cycles_to_failure(40.0), f64::INFINITY);
/// # Ok::<(), gaugebook::PhysicsError>(())
/// ```
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct SnCurve {
    coefficient: f64,
    exponent: f64,
    endurance_limit: Option<f64>,
}

impl SnCurve {
    /// N = `coefficient`·S^(−`exponent`); both must be finite and positive.
    ///
    /// ```
    /// assert!(gaugebook::SnCurve::basquin(0.0, 3.0).is_err());
    /// ```
    pub fn basquin(coefficient: f64, exponent: f64) -> Result<SnCurve, PhysicsError> {
        crate::check_positive("S-N coefficient C", coefficient, "")?;
        crate::check_positive("S-N exponent m", exponent, "")?;
        Ok(SnCurve {
            coefficient,
            exponent,
            endurance_limit: None,
        })
    }

    /// Ranges below `limit` (finite, positive) do no damage.
    ///
    /// ```
    /// assert!(gaugebook::SnCurve::basquin(1e12, 3.0)?.with_endurance_limit(-1.0).is_err());
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn with_endurance_limit(self, limit: f64) -> Result<SnCurve, PhysicsError> {
        crate::check_positive("endurance limit", limit, "")?;
        Ok(SnCurve {
            endurance_limit: Some(limit),
            ..self
        })
    }

    /// Cycles to failure at range `s`; infinite below the endurance limit or for s ≤ 0.
    ///
    /// ```
    /// let sn = gaugebook::SnCurve::basquin(8.0, 3.0)?;
    /// assert_eq!(sn.cycles_to_failure(2.0), 1.0);
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn cycles_to_failure(&self, s: f64) -> f64 {
        if s <= 0.0 || self.endurance_limit.is_some_and(|l| s < l) {
            f64::INFINITY
        } else {
            self.coefficient * s.powf(-self.exponent)
        }
    }
}

/// Palmgren–Miner damage Σ count / N(range) of counted cycles (failure is predicted near
/// D = 1; see the module notes for what this estimate leaves out).
///
/// ```
/// use gaugebook::{SnCurve, miner_damage, rainflow_cycles};
/// let cycles = rainflow_cycles(&[0.0, 100.0, 0.0, 100.0, 0.0])?;
/// let d = miner_damage(&cycles, &SnCurve::basquin(1e12, 3.0)?);
/// assert!((d - 2.0 * 1e-6).abs() < 1e-18); // four half cycles of range 100, N = 1e6 each
/// # Ok::<(), gaugebook::PhysicsError>(())
/// ```
pub fn miner_damage(cycles: &[Cycle], curve: &SnCurve) -> f64 {
    cycles
        .iter()
        .map(|c| c.count / curve.cycles_to_failure(c.range))
        .sum()
}
