//! ISO 376:2011, *Metallic materials — Calibration of force-proving instruments used for the
//! verification of uniaxial testing machines*: relative errors and classification.
//!
//! As recalled (every value "from memory"; confirm against the published text). Deflections
//! are readings minus the zero reading of their series. At each force step:
//! - reproducibility b = (X_max − X_min)/X̄_r × 100 over the series X₁, X₃, X₅ in different
//!   mounting positions, X̄_r their mean (7.5.1);
//! - repeatability b′ = |X₂ − X₁|/X̄_wr × 100, X̄_wr = (X₁ + X₂)/2 (7.5.1);
//! - interpolation f_c = (X̄_r − X_a)/X_a × 100, X_a from a polynomial of degree ≤ 3 fitted to
//!   X̄_r (7.5.3);
//! - reversibility v = mean over the descending series of |X′_desc − X_asc|/X_asc × 100 (7.5.5);
//! - zero f₀ = (i_f − i₀)/X_N × 100 (7.5.4) and creep c = (i₃₀₀ − i₃₀)/X_N × 100 (7.5.6),
//!   once for the instrument.
//!
//! Class limits, Table 2 (from memory), in %: class, b, b′, |f_c|, |f₀|, v, c:
//! 00: 0.05, 0.025, 0.025, 0.012, 0.07, 0.025; 0.5: 0.10, 0.05, 0.05, 0.025, 0.15, 0.05;
//! 1: 0.20, 0.10, 0.10, 0.050, 0.30, 0.10; 2: 0.40, 0.20, 0.20, 0.10, 0.50, 0.20.
//! Lower limit of calibration (Table 3, from memory): at least 4000 r (class 00), 2000 r (0.5),
//! 1000 r (1), 500 r (2), r the resolution.

use super::verdict::{Check, ClassVerdict};
use crate::{CalibrationRun, Direction, Fit, FitModel, PhysicsError, Series};

const STD: &str = "ISO 376:2011";

/// ISO 376 class of a force-proving instrument.
///
/// ```
/// use gaugebook::Iso376Class;
/// assert_eq!(Iso376Class::Half.limits().repeatability, 0.05);
/// assert_eq!(Iso376Class::Zero0.name(), "00");
/// ```
#[derive(Clone, Copy, Debug, PartialEq, Eq, PartialOrd, Ord)]
pub enum Iso376Class {
    /// Class 00.
    Zero0,
    /// Class 0.5.
    Half,
    /// Class 1.
    One,
    /// Class 2.
    Two,
}

/// The class limits of ISO 376:2011 Table 2 (from memory), in %.
///
/// ```
/// let l = gaugebook::Iso376Class::Two.limits();
/// assert_eq!((l.reproducibility, l.creep), (0.40, 0.20));
/// ```
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct Iso376Limits {
    /// Relative reproducibility error b.
    pub reproducibility: f64,
    /// Relative repeatability error b′.
    pub repeatability: f64,
    /// Relative interpolation error |f_c|.
    pub interpolation: f64,
    /// Relative zero error |f₀|.
    pub zero: f64,
    /// Relative reversibility error v.
    pub reversibility: f64,
    /// Relative creep error c.
    pub creep: f64,
    /// Lower limit of calibration in resolutions (Table 3, from memory).
    pub min_resolutions: f64,
}

impl Iso376Class {
    /// All classes, best first.
    ///
    /// ```
    /// assert_eq!(gaugebook::Iso376Class::ALL[0], gaugebook::Iso376Class::Zero0);
    /// ```
    pub const ALL: [Iso376Class; 4] = [
        Iso376Class::Zero0,
        Iso376Class::Half,
        Iso376Class::One,
        Iso376Class::Two,
    ];

    /// The class name as the standard writes it.
    ///
    /// ```
    /// assert_eq!(gaugebook::Iso376Class::Half.name(), "0.5");
    /// ```
    pub fn name(self) -> &'static str {
        match self {
            Iso376Class::Zero0 => "00",
            Iso376Class::Half => "0.5",
            Iso376Class::One => "1",
            Iso376Class::Two => "2",
        }
    }

    /// Table 2 limits (from memory).
    ///
    /// ```
    /// assert_eq!(gaugebook::Iso376Class::One.limits().zero, 0.050);
    /// ```
    pub fn limits(self) -> Iso376Limits {
        let (b, bp, fc, f0, v, c, r) = match self {
            Iso376Class::Zero0 => (0.05, 0.025, 0.025, 0.012, 0.07, 0.025, 4000.0),
            Iso376Class::Half => (0.10, 0.05, 0.05, 0.025, 0.15, 0.05, 2000.0),
            Iso376Class::One => (0.20, 0.10, 0.10, 0.050, 0.30, 0.10, 1000.0),
            Iso376Class::Two => (0.40, 0.20, 0.20, 0.10, 0.50, 0.20, 500.0),
        };
        Iso376Limits {
            reproducibility: b,
            repeatability: bp,
            interpolation: fc,
            zero: f0,
            reversibility: v,
            creep: c,
            min_resolutions: r,
        }
    }
}

/// The data of an ISO 376 calibration: deflections per force step for each series.
///
/// ```
/// use gaugebook::Iso376Data;
/// let d = Iso376Data::new(vec![1.0, 2.0], vec![1.0, 2.0], vec![1.0, 2.0], vec![1.0, 2.0], vec![1.0, 2.0]);
/// assert_eq!(d.forces.len(), 2);
/// ```
#[derive(Clone, Debug, PartialEq)]
pub struct Iso376Data {
    /// Force steps (N), increasing.
    pub forces: Vec<f64>,
    /// Series 1, position 0°, increasing.
    pub x1: Vec<f64>,
    /// Series 2, position 0° repeated.
    pub x2: Vec<f64>,
    /// Series 3, second position (e.g. 120°).
    pub x3: Vec<f64>,
    /// Series 5, third position (e.g. 240°).
    pub x5: Vec<f64>,
    /// Decreasing readings matching series 3 (X′₄), if measured.
    pub x4_decreasing: Option<Vec<f64>>,
    /// Decreasing readings matching series 5 (X′₆), if measured.
    pub x6_decreasing: Option<Vec<f64>>,
    /// Zero reading before (i₀) and after (i_f) loading, if measured.
    pub zero_before_after: Option<(f64, f64)>,
    /// Readings 30 s and 300 s after applying the maximum force (i₃₀, i₃₀₀), if measured.
    pub creep_30_300: Option<(f64, f64)>,
    /// Resolution r of the indicator (deflection units), if known.
    pub resolution: Option<f64>,
    /// Degree of the interpolation polynomial (1 to 3).
    pub degree: usize,
}

impl Iso376Data {
    /// Data with the four increasing series, a cubic interpolation and nothing else measured.
    ///
    /// ```
    /// let d = gaugebook::Iso376Data::new(vec![1.0], vec![1.0], vec![1.0], vec![1.0], vec![1.0]);
    /// assert_eq!(d.degree, 3);
    /// ```
    pub fn new(
        forces: Vec<f64>,
        x1: Vec<f64>,
        x2: Vec<f64>,
        x3: Vec<f64>,
        x5: Vec<f64>,
    ) -> Iso376Data {
        Iso376Data {
            forces,
            x1,
            x2,
            x3,
            x5,
            x4_decreasing: None,
            x6_decreasing: None,
            zero_before_after: None,
            creep_30_300: None,
            resolution: None,
            degree: 3,
        }
    }
}

impl Iso376Data {
    /// The series of a calibration run in the order ISO 376:2011 7.4 takes them (as recalled,
    /// from memory): the first two increasing series in the first mounting position give X₁ and
    /// X₂; in the second and third positions (rotations, in the order they first appear) the
    /// first increasing series gives X₃ and X₅ and the first decreasing series after it X′₄ and
    /// X′₆, if there is one. Other series are not used.
    ///
    /// Deflections are readings minus the zero-load reading of the increasing series of their
    /// position and pass (a decreasing series is referred to the zero before the increasing
    /// series it follows); every used increasing series must therefore start at zero load. The
    /// force steps are the non-zero loads of X₁; every used series must have a reading at each
    /// (loads within 10⁻⁶ of the largest load are the same step). Zero before/after, creep,
    /// resolution and the interpolation degree are not in a run: set those fields afterwards.
    ///
    /// ```
    /// use gaugebook::{CalibrationRun, Direction, Iso376Class, Iso376Data, LoadKind, classify_iso376};
    /// let mut run = CalibrationRun::new(LoadKind::Force, "mV/V");
    /// let f = [0.0, 20e3, 40e3, 60e3, 80e3, 100e3];
    /// let y: Vec<f64> = f.iter().map(|f| 2e-5 * f).collect();
    /// for rot in [0.0, 0.0, 120.0, 240.0] {
    ///     run.push_series(&f, &y, Direction::Ascending, rot)?;
    /// }
    /// let d = Iso376Data::from_run(&run)?;
    /// assert_eq!(d.forces, vec![20e3, 40e3, 60e3, 80e3, 100e3]);
    /// assert_eq!(classify_iso376(&d)?.class, Some(Iso376Class::Zero0));
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn from_run(run: &CalibrationRun) -> Result<Iso376Data, PhysicsError> {
        let unit = run.load_kind().si_unit();
        let top = run
            .points()
            .iter()
            .map(|p| p.load.abs())
            .fold(0.0, f64::max);
        let tol = top * 1e-6;
        // Mounting positions in the order they first appear.
        let mut rotations: Vec<f64> = vec![];
        for s in run.series() {
            if !rotations.contains(&s.rotation_deg) {
                rotations.push(s.rotation_deg);
            }
        }
        if rotations.len() < 3 {
            return Err(PhysicsError::NotEnoughData {
                what: "an ISO 376 classification (mounting positions)".into(),
                needed: 3,
                found: rotations.len(),
            });
        }
        let in_position = |rot: f64| -> Vec<(usize, &Series)> {
            run.series()
                .iter()
                .enumerate()
                .filter(|(_, s)| s.rotation_deg == rot)
                .collect()
        };
        let first = in_position(rotations[0]);
        let asc0: Vec<&(usize, &Series)> = first
            .iter()
            .filter(|(_, s)| s.direction == Direction::Ascending)
            .collect();
        if asc0.len() < 2 {
            return Err(PhysicsError::NotEnoughData {
                what: format!(
                    "increasing series in the first mounting position ({}°) for X1 and X2",
                    rotations[0]
                ),
                needed: 2,
                found: asc0.len(),
            });
        }
        let zero_of = |s: &Series, name: &str| -> Result<f64, PhysicsError> {
            s.indication_at(0.0, tol).ok_or_else(|| {
                PhysicsError::invalid(
                    format!("series {name} ({}°)", s.rotation_deg),
                    "no reading at zero load",
                    "an increasing series that starts at zero load",
                )
            })
        };
        let forces: Vec<f64> = asc0[0]
            .1
            .loads()
            .into_iter()
            .filter(|l| l.abs() > tol)
            .collect();
        let at_steps = |s: &Series, zero: f64, name: &str| -> Result<Vec<f64>, PhysicsError> {
            forces
                .iter()
                .map(|&f| {
                    s.indication_at(f, tol).map(|r| r - zero).ok_or_else(|| {
                        PhysicsError::invalid(
                            format!("series {name} ({}°)", s.rotation_deg),
                            format!("no reading at the force step {f} {unit}"),
                            "a reading at every force step of series X1",
                        )
                    })
                })
                .collect()
        };
        let increasing = |s: &Series, name: &str| -> Result<Vec<f64>, PhysicsError> {
            at_steps(s, zero_of(s, name)?, name)
        };
        let x1 = increasing(asc0[0].1, "X1")?;
        let x2 = increasing(asc0[1].1, "X2")?;
        // The increasing series of a later position and the decreasing one that follows it.
        let pass = |rot: f64,
                    up: &str,
                    down: &str|
         -> Result<(Vec<f64>, Option<Vec<f64>>), PhysicsError> {
            let list = in_position(rot);
            let (k, asc) = list
                .iter()
                .find(|(_, s)| s.direction == Direction::Ascending)
                .copied()
                .ok_or_else(|| {
                    PhysicsError::invalid(
                        format!("mounting position {rot}°"),
                        "no increasing series",
                        format!("an increasing series for {up}"),
                    )
                })?;
            let zero = zero_of(asc, up)?;
            let x = at_steps(asc, zero, up)?;
            let desc = list
                .iter()
                .find(|(j, s)| *j > k && s.direction == Direction::Descending)
                .map(|(_, s)| at_steps(s, zero, down))
                .transpose()?;
            Ok((x, desc))
        };
        let (x3, x4) = pass(rotations[1], "X3", "X4'")?;
        let (x5, x6) = pass(rotations[2], "X5", "X6'")?;
        let mut d = Iso376Data::new(forces, x1, x2, x3, x5);
        d.x4_decreasing = x4;
        d.x6_decreasing = x6;
        Ok(d)
    }
}

/// The relative errors at one force step, in %.
///
/// ```
/// use gaugebook::{Iso376Data, classify_iso376};
/// let f: Vec<f64> = (1..=6).map(|i| i as f64 * 1000.0).collect();
/// let x: Vec<f64> = f.iter().map(|f| f * 1e-4).collect();
/// let r = classify_iso376(&Iso376Data::new(f, x.clone(), x.clone(), x.clone(), x))?;
/// assert_eq!(r.steps[0].reproducibility, 0.0);
/// # Ok::<(), gaugebook::PhysicsError>(())
/// ```
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct Iso376Step {
    /// Force (N).
    pub force: f64,
    /// Mean deflection X̄_r.
    pub mean: f64,
    /// b.
    pub reproducibility: f64,
    /// b′.
    pub repeatability: f64,
    /// f_c.
    pub interpolation: f64,
    /// v, if decreasing series were measured.
    pub reversibility: Option<f64>,
    /// Best class this step meets.
    pub class: Option<Iso376Class>,
}

/// The classification result.
///
/// ```
/// use gaugebook::{Iso376Data, classify_iso376};
/// let f: Vec<f64> = (1..=6).map(|i| i as f64 * 1000.0).collect();
/// let x: Vec<f64> = f.iter().map(|f| f * 1e-4).collect();
/// let r = classify_iso376(&Iso376Data::new(f, x.clone(), x.clone(), x.clone(), x))?;
/// assert!(r.verdict.passed && r.zero.is_none());
/// # Ok::<(), gaugebook::PhysicsError>(())
/// ```
#[derive(Clone, Debug, PartialEq)]
pub struct Iso376Result {
    /// Per force step.
    pub steps: Vec<Iso376Step>,
    /// f₀, if measured.
    pub zero: Option<f64>,
    /// c, if measured.
    pub creep: Option<f64>,
    /// The best class met at every step and by zero and creep, if any.
    pub class: Option<Iso376Class>,
    /// The verdict for that class (or for class 2 when none is met), with every check.
    pub verdict: ClassVerdict,
}

fn pct(a: f64, b: f64) -> f64 {
    a / b * 100.0
}

/// Computes the relative errors and the class.
///
/// ```
/// use gaugebook::{Iso376Class, Iso376Data, classify_iso376};
/// let f: Vec<f64> = (1..=8).map(|i| i as f64 * 10_000.0).collect();
/// let x: Vec<f64> = f.iter().map(|f| f * 2e-5).collect();
/// let d = Iso376Data::new(f, x.clone(), x.clone(), x.clone(), x);
/// let r = classify_iso376(&d)?;
/// assert_eq!(r.class, Some(Iso376Class::Zero0));
/// # Ok::<(), gaugebook::PhysicsError>(())
/// ```
pub fn classify_iso376(d: &Iso376Data) -> Result<Iso376Result, PhysicsError> {
    let n = d.forces.len();
    if n < 5 {
        // 8 steps are usual; the cubic needs 5 for a residual degree of freedom.
        return Err(PhysicsError::NotEnoughData {
            what: "an ISO 376 classification (force steps)".into(),
            needed: 5,
            found: n,
        });
    }
    let series: [(&str, &Vec<f64>); 4] =
        [("X1", &d.x1), ("X2", &d.x2), ("X3", &d.x3), ("X5", &d.x5)];
    for (name, s) in series {
        if s.len() != n {
            return Err(PhysicsError::Mismatch {
                what: format!("series {name} and force step counts"),
                left: s.len().to_string(),
                right: n.to_string(),
            });
        }
    }
    for (name, s) in [("X4'", &d.x4_decreasing), ("X6'", &d.x6_decreasing)] {
        if let Some(s) = s
            && s.len() != n
        {
            return Err(PhysicsError::Mismatch {
                what: format!("series {name} and force step counts"),
                left: s.len().to_string(),
                right: n.to_string(),
            });
        }
    }
    if d.forces.windows(2).any(|w| w[1] <= w[0] || w[1].is_nan()) {
        return Err(PhysicsError::invalid(
            "ISO 376 force steps",
            "not strictly increasing",
            "strictly increasing forces",
        ));
    }
    if !(1..=3).contains(&d.degree) {
        return Err(PhysicsError::invalid(
            "interpolation degree",
            d.degree,
            "1, 2 or 3 (ISO 376:2011 7.5.3, from memory)",
        ));
    }
    let means: Vec<f64> = (0..n)
        .map(|i| (d.x1[i] + d.x3[i] + d.x5[i]) / 3.0)
        .collect();
    let fit = Fit::new(&d.forces, &means, FitModel::Polynomial(d.degree))?;
    let x_n = means[n - 1];
    let mut steps = vec![];
    for i in 0..n {
        let trio = [d.x1[i], d.x3[i], d.x5[i]];
        let hi = trio.iter().copied().fold(f64::NEG_INFINITY, f64::max);
        let lo = trio.iter().copied().fold(f64::INFINITY, f64::min);
        let b = pct(hi - lo, means[i]);
        let bp = pct((d.x2[i] - d.x1[i]).abs(), 0.5 * (d.x1[i] + d.x2[i]));
        let xa = fit.eval(d.forces[i]);
        let fc = pct(means[i] - xa, xa);
        let revs: Vec<f64> = [(&d.x4_decreasing, &d.x3), (&d.x6_decreasing, &d.x5)]
            .iter()
            .filter_map(|(desc, asc)| desc.as_ref().map(|ds| pct((ds[i] - asc[i]).abs(), asc[i])))
            .collect();
        let v = if revs.is_empty() {
            None
        } else {
            Some(revs.iter().sum::<f64>() / revs.len() as f64)
        };
        let class = Iso376Class::ALL.into_iter().find(|c| {
            let l = c.limits();
            b <= l.reproducibility
                && bp <= l.repeatability
                && fc.abs() <= l.interpolation
                && v.is_none_or(|v| v <= l.reversibility)
                && d.resolution
                    .is_none_or(|r| means[i] >= l.min_resolutions * r)
        });
        steps.push(Iso376Step {
            force: d.forces[i],
            mean: means[i],
            reproducibility: b,
            repeatability: bp,
            interpolation: fc,
            reversibility: v,
            class,
        });
    }
    let zero = d.zero_before_after.map(|(i0, i_f)| pct(i_f - i0, x_n));
    let creep = d.creep_30_300.map(|(a, b)| pct(b - a, x_n));
    let meets = |c: Iso376Class| {
        let l = c.limits();
        steps.iter().all(|s| s.class.is_some_and(|sc| sc <= c))
            && zero.is_none_or(|z| z.abs() <= l.zero)
            && creep.is_none_or(|k| k.abs() <= l.creep)
    };
    let class = Iso376Class::ALL.into_iter().find(|&c| meets(c));
    let judged = class.unwrap_or(Iso376Class::Two);
    let l = judged.limits();
    let t2 = "ISO 376:2011 Table 2 (from memory)";
    let mut checks = vec![];
    for s in &steps {
        checks.push(Check::at_most(
            &format!("reproducibility b at {} N", s.force),
            s.reproducibility,
            l.reproducibility,
            "%",
            t2,
        ));
        checks.push(Check::at_most(
            &format!("repeatability b' at {} N", s.force),
            s.repeatability,
            l.repeatability,
            "%",
            t2,
        ));
        checks.push(Check::at_most(
            &format!("interpolation f_c at {} N", s.force),
            s.interpolation,
            l.interpolation,
            "%",
            t2,
        ));
        if let Some(v) = s.reversibility {
            checks.push(Check::at_most(
                &format!("reversibility v at {} N", s.force),
                v,
                l.reversibility,
                "%",
                t2,
            ));
        }
        if let Some(r) = d.resolution {
            checks.push(Check::at_least(
                &format!("deflection in resolutions at {} N", s.force),
                s.mean / r,
                l.min_resolutions,
                "r",
                "ISO 376:2011 Table 3 (from memory)",
            ));
        }
    }
    if let Some(z) = zero {
        checks.push(Check::at_most("zero f_0", z, l.zero, "%", t2));
    }
    if let Some(c) = creep {
        checks.push(Check::at_most("creep c", c, l.creep, "%", t2));
    }
    let verdict = ClassVerdict::new(STD, judged.name(), checks);
    Ok(Iso376Result {
        steps,
        zero,
        creep,
        class,
        verdict,
    })
}
