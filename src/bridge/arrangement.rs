//! The named bridge arrangements of the trade and their exact output, exact inverse, linear
//! output, bridge factor and nonlinearity.
//!
//! Every arrangement is a four-arm Wheatstone bridge of equal nominal arms (numbered as in
//! [`WheatstoneBridge`](crate::WheatstoneBridge)) in which arm i changes by ΔRᵢ/R = cᵢ·x, with
//! x = F·ε the relative change of the gauge in arm R1 (F the gauge factor, ε the strain along
//! that gauge's axis). Substituting into Vo/V = R1/(R1+R2) − R4/(R3+R4) gives, for all six,
//!
//! Vo/V = (B/4)·x/(1 + β·x), so exactly ε = 4r/(F·(B − 4β·r)),
//!
//! with B the bridge factor (linear output = B·x/4) and β the nonlinearity coefficient. The
//! relations and the bridge factors are in Dally & Riley, *Experimental Stress Analysis*, 4th
//! ed., ch. 6–7 and Window, *Strain Gauge Technology*, 2nd ed., ch. 3 (both from memory); the
//! closed forms here are derived from the bridge equation and checked against the general bridge
//! in the tests.
//!
//! Sign: the output ratio is positive when the resistance of the gauge in R1 rises (tension with
//! a positive gauge factor).

use std::fmt;
use std::str::FromStr;

use uom::si::electrical_resistance::ohm;

use super::{Arm, StrainInverse, WheatstoneBridge};
use crate::units::ElectricalResistance;
use crate::{OutputRatio, PhysicsError, Strain, check_finite, check_poisson, check_positive};

/// A named bridge arrangement.
///
/// | name | arms (ΔRᵢ/R per x) | bridge factor B | β |
/// |---|---|---|---|
/// | `quarter` | R1 = +1 | 1 | 1/2 |
/// | `half-bending` | R1 = +1, R2 = −1 | 2 | 0 |
/// | `half-poisson` | R1 = +1, R2 = −ν | 1 + ν | (1 − ν)/2 |
/// | `full-bending` | R1 = R3 = +1, R2 = R4 = −1 | 4 | 0 |
/// | `full-poisson` | R1 = R3 = +1, R2 = R4 = −ν | 2(1 + ν) | (1 − ν)/2 |
/// | `full-shear` | R1 = R3 = +1, R2 = R4 = −1 (gauges at ±45°) | 4 | 0 |
///
/// Arms without a coefficient are fixed completion resistors equal to the gauge's nominal
/// resistance. For `full-shear` the strain is the normal strain along the +45° gauge, which is
/// half the engineering shear strain γ in pure shear (so the factor is 2 per unit γ). ν is the
/// specimen's Poisson's ratio; arrangements without a Poisson arm ignore it and do not check it.
///
/// ```
/// use gaugebook::{Arrangement, Strain};
/// let q = Arrangement::from_name("quarter")?;
/// let r = q.output(Strain::from_microstrain(1000.0), 2.0, 0.3)?;
/// // Vo/V = x/(4 + 2x), x = GF·ε = 0.002.
/// assert!((r.value() - 0.002 / 4.004).abs() < 1e-15);
/// assert_eq!(q.name(), "quarter");
/// # Ok::<(), gaugebook::PhysicsError>(())
/// ```
#[derive(Clone, Copy, Debug, PartialEq, Eq, Hash)]
pub enum Arrangement {
    /// One active gauge in R1, three fixed arms.
    Quarter,
    /// Two active gauges in adjacent arms R1, R2 with equal and opposite strain (bending).
    HalfBending,
    /// An axial gauge in R1 and a transverse (Poisson) gauge in R2.
    HalfPoisson,
    /// Four active gauges, R1 and R3 in tension, R2 and R4 in compression (bending).
    FullBending,
    /// Axial gauges in R1 and R3, transverse (Poisson) gauges in R2 and R4 (column, axial load).
    FullPoisson,
    /// Four gauges at ±45° (shear web, torque shaft): R1, R3 at +45°, R2, R4 at −45°.
    FullShear,
}

impl Arrangement {
    /// All arrangements, in the order of the table above.
    ///
    /// ```
    /// assert_eq!(gaugebook::Arrangement::ALL.len(), 6);
    /// ```
    pub const ALL: [Arrangement; 6] = [
        Arrangement::Quarter,
        Arrangement::HalfBending,
        Arrangement::HalfPoisson,
        Arrangement::FullBending,
        Arrangement::FullPoisson,
        Arrangement::FullShear,
    ];

    /// The arrangement named `name` (`quarter`, `half-bending`, `half-poisson`,
    /// `full-bending`, `full-poisson`, `full-shear`; case-insensitive, `_` accepted for `-`).
    ///
    /// ```
    /// use gaugebook::Arrangement;
    /// assert_eq!(Arrangement::from_name("Full-Shear")?, Arrangement::FullShear);
    /// assert!(Arrangement::from_name("third").is_err());
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn from_name(name: &str) -> Result<Arrangement, PhysicsError> {
        let key = name.trim().to_ascii_lowercase().replace('_', "-");
        Arrangement::ALL.into_iter().find(|a| a.name() == key).ok_or_else(|| {
            PhysicsError::invalid(
                "bridge arrangement",
                format!("\"{name}\""),
                "one of quarter, half-bending, half-poisson, full-bending, full-poisson, full-shear",
            )
        })
    }

    /// The arrangement's name, as accepted by [`from_name`](Arrangement::from_name).
    ///
    /// ```
    /// assert_eq!(gaugebook::Arrangement::HalfPoisson.name(), "half-poisson");
    /// ```
    pub fn name(self) -> &'static str {
        match self {
            Arrangement::Quarter => "quarter",
            Arrangement::HalfBending => "half-bending",
            Arrangement::HalfPoisson => "half-poisson",
            Arrangement::FullBending => "full-bending",
            Arrangement::FullPoisson => "full-poisson",
            Arrangement::FullShear => "full-shear",
        }
    }

    /// Whether an arm carries a transverse (Poisson) gauge, so that ν matters.
    ///
    /// ```
    /// use gaugebook::Arrangement;
    /// assert!(Arrangement::FullPoisson.uses_poisson());
    /// assert!(!Arrangement::FullBending.uses_poisson());
    /// ```
    pub fn uses_poisson(self) -> bool {
        matches!(self, Arrangement::HalfPoisson | Arrangement::FullPoisson)
    }

    /// Number of active gauges (1, 2 or 4).
    ///
    /// ```
    /// assert_eq!(gaugebook::Arrangement::HalfBending.active_gauges(), 2);
    /// ```
    pub fn active_gauges(self) -> usize {
        match self {
            Arrangement::Quarter => 1,
            Arrangement::HalfBending | Arrangement::HalfPoisson => 2,
            _ => 4,
        }
    }

    /// ΔRᵢ/R of arms R1..R4 per unit x = F·ε (see the table on [`Arrangement`]).
    ///
    /// ```
    /// use gaugebook::Arrangement;
    /// assert_eq!(Arrangement::HalfPoisson.arm_coefficients(0.3)?, [1.0, -0.3, 0.0, 0.0]);
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn arm_coefficients(self, nu: f64) -> Result<[f64; 4], PhysicsError> {
        let nu = self.checked_nu(nu)?;
        Ok(match self {
            Arrangement::Quarter => [1.0, 0.0, 0.0, 0.0],
            Arrangement::HalfBending => [1.0, -1.0, 0.0, 0.0],
            Arrangement::HalfPoisson => [1.0, -nu, 0.0, 0.0],
            Arrangement::FullBending | Arrangement::FullShear => [1.0, -1.0, 1.0, -1.0],
            Arrangement::FullPoisson => [1.0, -nu, 1.0, -nu],
        })
    }

    /// Bridge factor B: the linear output over that of one active gauge, Σ ± cᵢ.
    ///
    /// ```
    /// use gaugebook::Arrangement;
    /// assert_eq!(Arrangement::FullBending.bridge_factor(0.3)?, 4.0);
    /// assert!((Arrangement::FullPoisson.bridge_factor(0.3)? - 2.6).abs() < 1e-15);
    /// assert!(Arrangement::FullPoisson.bridge_factor(0.6).is_err());
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn bridge_factor(self, nu: f64) -> Result<f64, PhysicsError> {
        Ok(self.coefficients(nu)?.0)
    }

    /// (B, β) of Vo/V = (B/4)·x/(1 + β·x).
    fn coefficients(self, nu: f64) -> Result<(f64, f64), PhysicsError> {
        let nu = self.checked_nu(nu)?;
        Ok(match self {
            Arrangement::Quarter => (1.0, 0.5),
            Arrangement::HalfBending => (2.0, 0.0),
            Arrangement::HalfPoisson => (1.0 + nu, 0.5 * (1.0 - nu)),
            Arrangement::FullBending | Arrangement::FullShear => (4.0, 0.0),
            Arrangement::FullPoisson => (2.0 * (1.0 + nu), 0.5 * (1.0 - nu)),
        })
    }

    fn checked_nu(self, nu: f64) -> Result<f64, PhysicsError> {
        if self.uses_poisson() {
            check_poisson(nu)
        } else {
            Ok(nu)
        }
    }

    fn checked_x(self, strain: Strain, gf: f64) -> Result<f64, PhysicsError> {
        check_positive("gauge factor", gf, "")?;
        check_finite("strain", strain.value(), "m/m")?;
        Ok(gf * strain.value())
    }

    /// Exact output ratio Vo/V for strain `strain` at the R1 gauge, gauge factor `gf` and the
    /// specimen's Poisson's ratio `nu`.
    ///
    /// Errors on a gauge factor that is not above zero, a strain that is not finite, ν outside
    /// (−1, 0.5) where it is used, or a strain so large that an arm's resistance would not stay
    /// above zero.
    ///
    /// ```
    /// use gaugebook::{Arrangement, Strain};
    /// let r = Arrangement::HalfBending.output(Strain::from_microstrain(500.0), 2.0, 0.3)?;
    /// assert!((r.mv_per_v() - 0.5).abs() < 1e-12);
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn output(self, strain: Strain, gf: f64, nu: f64) -> Result<OutputRatio, PhysicsError> {
        let x = self.checked_x(strain, gf)?;
        let (lo, hi) = self.x_domain(nu)?;
        if !(x > lo && x < hi) {
            return Err(PhysicsError::out_of_range(
                format!("the {} bridge", self.name()),
                format!(
                    "GF·ε = {x} leaves an arm at or below zero resistance (allowed {lo} < GF·ε < {hi})"
                ),
            ));
        }
        let (b, beta) = self.coefficients(nu)?;
        Ok(OutputRatio::new(0.25 * b * x / (1.0 + beta * x)))
    }

    /// Linear output ratio B·F·ε/4 (the small-strain approximation).
    ///
    /// ```
    /// use gaugebook::{Arrangement, Strain};
    /// let r = Arrangement::Quarter.linear_output(Strain::from_microstrain(1000.0), 2.0, 0.3)?;
    /// assert!((r.mv_per_v() - 0.5).abs() < 1e-12);
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn linear_output(
        self,
        strain: Strain,
        gf: f64,
        nu: f64,
    ) -> Result<OutputRatio, PhysicsError> {
        let x = self.checked_x(strain, gf)?;
        let (b, _) = self.coefficients(nu)?;
        Ok(OutputRatio::new(0.25 * b * x))
    }

    /// Nonlinearity in percent of the linear output: 100·(linear − exact)/linear = 100·βx/(1+βx).
    ///
    /// This is the η of Dally & Riley, 4th ed., ch. 6 (from memory); it is positive when the
    /// exact output falls short of the linear one (quarter bridge in tension) and zero for the
    /// bending and shear arrangements, whose outputs are exactly linear.
    ///
    /// ```
    /// use gaugebook::{Arrangement, Strain};
    /// // Quarter bridge, x = 0.002: η = x/(2 + x) ≈ 0.0999 %.
    /// let n = Arrangement::Quarter.nonlinearity(Strain::from_microstrain(1000.0), 2.0, 0.3)?;
    /// assert!((n - 100.0 * 0.002 / 2.002).abs() < 1e-12);
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn nonlinearity(self, strain: Strain, gf: f64, nu: f64) -> Result<f64, PhysicsError> {
        // Validates the strain range the same way as the exact output.
        self.output(strain, gf, nu)?;
        let x = gf * strain.value();
        let (_, beta) = self.coefficients(nu)?;
        Ok(100.0 * beta * x / (1.0 + beta * x))
    }

    /// Exact inverse: the strain at the R1 gauge that gives output ratio `ratio`,
    /// ε = 4r/(F·(B − 4β·r)); for the quarter bridge ε = 4r/(F·(1 − 2r)).
    ///
    /// Errors on bad parameters, and when `ratio` lies outside the open range the arrangement
    /// can produce with every arm above zero resistance (see
    /// [`output_range`](Arrangement::output_range)).
    ///
    /// ```
    /// use gaugebook::{Arrangement, OutputRatio, Strain};
    /// let q = Arrangement::Quarter;
    /// let e = Strain::from_microstrain(2500.0);
    /// let back = q.strain_from_output(q.output(e, 2.1, 0.3)?, 2.1, 0.3)?;
    /// assert!((back.microstrain() - 2500.0).abs() < 1e-9);
    /// assert!(q.strain_from_output(OutputRatio::new(0.5), 2.1, 0.3).is_err());
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn strain_from_output(
        self,
        ratio: OutputRatio,
        gf: f64,
        nu: f64,
    ) -> Result<Strain, PhysicsError> {
        self.inverse(gf, nu)?.apply_checked(ratio)
    }

    /// The open interval of output ratios the arrangement can produce while every arm keeps a
    /// resistance above zero (independent of the gauge factor).
    ///
    /// ```
    /// use gaugebook::Arrangement;
    /// let (lo, hi) = Arrangement::Quarter.output_range(0.3)?;
    /// assert_eq!((lo.value(), hi.value()), (-0.5, 0.5));
    /// let (lo, hi) = Arrangement::FullBending.output_range(0.3)?;
    /// assert_eq!((lo.value(), hi.value()), (-1.0, 1.0));
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn output_range(self, nu: f64) -> Result<(OutputRatio, OutputRatio), PhysicsError> {
        let (b, beta) = self.coefficients(nu)?;
        let (lo, hi) = self.x_domain(nu)?;
        let r = |x: f64| {
            if x.is_infinite() {
                0.25 * b / beta * x.signum()
            } else {
                0.25 * b * x / (1.0 + beta * x)
            }
        };
        Ok((OutputRatio::new(r(lo)), OutputRatio::new(r(hi))))
    }

    /// Open interval of x = F·ε for which every arm 1 + cᵢx stays above zero.
    fn x_domain(self, nu: f64) -> Result<(f64, f64), PhysicsError> {
        let c = self.arm_coefficients(nu)?;
        let mut lo = f64::NEG_INFINITY;
        let mut hi = f64::INFINITY;
        for ci in c {
            if ci > 0.0 {
                lo = lo.max(-1.0 / ci);
            } else if ci < 0.0 {
                hi = hi.min(-1.0 / ci);
            }
        }
        Ok((lo, hi))
    }

    /// A prepared exact inverse for bulk conversion: validates `gf` and `nu` once, then
    /// converts each sample with one multiply, one multiply-add and one divide.
    ///
    /// ```
    /// use gaugebook::Arrangement;
    /// let inv = Arrangement::Quarter.inverse(2.0, 0.3)?;
    /// let r = [0.0, 1.0e-3, -1.0e-3];
    /// let e: Vec<f64> = r.iter().map(|&r| inv.apply(r)).collect();
    /// assert!((e[1] - 4.0e-3 / (2.0 * (1.0 - 2.0e-3))).abs() < 1e-18);
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn inverse(self, gf: f64, nu: f64) -> Result<StrainInverse, PhysicsError> {
        check_positive("gauge factor", gf, "")?;
        let (b, beta) = self.coefficients(nu)?;
        let (lo, hi) = self.output_range(nu)?;
        Ok(StrainInverse::from_parts(
            4.0 / gf,
            b,
            4.0 * beta,
            lo.value(),
            hi.value(),
        ))
    }

    /// The general four-arm bridge this arrangement is, with gauges of nominal resistance
    /// `gauge_resistance` at strain `strain` (completion arms are fixed resistors of the same
    /// nominal value).
    ///
    /// ```
    /// use gaugebook::{Arrangement, Strain};
    /// use gaugebook::units::ElectricalResistance;
    /// use uom::si::electrical_resistance::ohm;
    /// let e = Strain::from_microstrain(1500.0);
    /// let a = Arrangement::FullPoisson;
    /// let b = a.bridge(ElectricalResistance::new::<ohm>(350.0), e, 2.0, 0.3)?;
    /// assert!((b.output_ratio().value() - a.output(e, 2.0, 0.3)?.value()).abs() < 1e-15);
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn bridge(
        self,
        gauge_resistance: ElectricalResistance,
        strain: Strain,
        gf: f64,
        nu: f64,
    ) -> Result<WheatstoneBridge, PhysicsError> {
        check_positive("gauge resistance", gauge_resistance.get::<ohm>(), "Ω")?;
        let x = self.checked_x(strain, gf)?;
        let c = self.arm_coefficients(nu)?;
        let arm = |ci: f64| {
            if ci == 0.0 {
                Arm::fixed(gauge_resistance)
            } else {
                Arm::gauge(gauge_resistance, ci * x)
            }
        };
        Ok(WheatstoneBridge::new([
            arm(c[0])?,
            arm(c[1])?,
            arm(c[2])?,
            arm(c[3])?,
        ]))
    }
}

impl fmt::Display for Arrangement {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        f.write_str(self.name())
    }
}

impl FromStr for Arrangement {
    type Err = PhysicsError;

    fn from_str(s: &str) -> Result<Arrangement, PhysicsError> {
        Arrangement::from_name(s)
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn names_round_trip() {
        for a in Arrangement::ALL {
            assert_eq!(Arrangement::from_name(a.name()).unwrap(), a);
            assert_eq!(a.to_string().parse::<Arrangement>().unwrap(), a);
        }
    }

    #[test]
    fn bridge_factor_is_signed_sum_of_arm_coefficients() {
        // Closed-form identity: linearising R1/(R1+R2) − R4/(R3+R4) gives (c1 − c2 + c3 − c4)/4.
        for a in Arrangement::ALL {
            let c = a.arm_coefficients(0.28).unwrap();
            let b = a.bridge_factor(0.28).unwrap();
            assert!((b - (c[0] - c[1] + c[2] - c[3])).abs() < 1e-15, "{a}");
        }
    }

    #[test]
    fn strain_beyond_arm_limit_is_an_error() {
        // x = −1 would make the quarter gauge's resistance zero.
        let e = Strain::new(-0.5);
        assert!(matches!(
            Arrangement::Quarter.output(e, 2.0, 0.3),
            Err(PhysicsError::OutOfRange { .. })
        ));
    }
}
