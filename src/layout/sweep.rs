//! Design sweeps: evaluate a layout family over one or two geometry parameters, and solve for
//! the parameter that gives a target rated output within a stress margin.
//!
//! Every margin here is a design estimate; design estimates must be proven by test, and
//! overload and lifting uses follow local codes and licensed practice.

use std::fmt;

use uom::si::frequency::hertz;
use uom::si::pressure::megapascal;

use super::explorer::Layout;
use crate::OutputRatio;
use crate::error::PhysicsError;
use crate::spring::{AttachedMass, MARGIN_CAUTION, OverloadFactors, Stiffness};
use crate::units::{Frequency, Mass, Stress};

/// Bisection steps: enough to shrink any bracket by 2⁻¹⁰⁰.
const MAX_STEPS: usize = 100;

/// What a design must meet, and how it is evaluated.
///
/// Defaults: bridge 0, no attached mass, overloads 150 %/300 % (common practice), no yield at
/// the safe overload (yield factor ≥ 1 there, common practice), no fatigue requirement.
///
/// ```
/// let c = gaugebook::DesignCriteria::default();
/// assert_eq!(c.min_yield_factor, 1.0);
/// ```
#[derive(Debug, Clone, PartialEq)]
pub struct DesignCriteria {
    /// Which bridge of the layout gives the rated output.
    pub bridge: usize,
    /// The mass (and inertia) at the load point for the frequency estimate.
    pub attached: AttachedMass,
    /// The overload levels.
    pub overload: OverloadFactors,
    /// Least yield factor at the safe overload.
    pub min_yield_factor: f64,
    /// Least fatigue factor at the rated load (zero-to-rated cycling), if required.
    pub min_fatigue_factor: Option<f64>,
}

impl Default for DesignCriteria {
    fn default() -> DesignCriteria {
        DesignCriteria {
            bridge: 0,
            attached: AttachedMass::mass(Mass::new::<uom::si::mass::kilogram>(0.0)),
            overload: OverloadFactors::default(),
            min_yield_factor: 1.0,
            min_fatigue_factor: None,
        }
    }
}

/// One evaluated design.
///
/// ```
/// # use gaugebook::{Arrangement, Cantilever, Gauge, Layout, LoadComponent, Wrench, material};
/// # use gaugebook::units::{ElectricalResistance, Length};
/// # use uom::si::{electrical_resistance::ohm, length::millimeter};
/// # let mm = Length::new::<millimeter>;
/// # let beam = Cantilever::new(material("2024-T351")?, mm(100.0), mm(20.0), mm(5.0), mm(30.0))?;
/// # let g = Gauge::new(ElectricalResistance::new::<ohm>(350.0), 2.0)?;
/// # let l = Layout::standard(beam, &g, Arrangement::FullBending, 50.0)?;
/// use gaugebook::{DesignCriteria, DesignPoint};
/// let p = DesignPoint::evaluate(&l, &DesignCriteria::default(), vec![])?;
/// assert!(p.yield_factor > 1.0);
/// # Ok::<(), gaugebook::PhysicsError>(())
/// ```
#[derive(Debug, Clone, PartialEq)]
pub struct DesignPoint {
    /// The parameter values.
    pub parameters: Vec<f64>,
    /// Exact rated output at capacity.
    pub rated_output: OutputRatio,
    /// Peak von Mises stress at the rated load.
    pub peak_stress: Stress,
    /// Yield factor at the safe overload.
    pub yield_factor: f64,
    /// Fatigue factor at the rated load, if the material has a fatigue strength.
    pub fatigue_factor: Option<f64>,
    /// Stiffness along the primary component.
    pub stiffness: Stiffness,
    /// First natural-frequency estimate.
    pub frequency: Frequency,
    /// Whether the margins meet the criteria.
    pub meets_margins: bool,
}

impl DesignPoint {
    /// Evaluates `layout` against `criteria`, labelled with `parameters`.
    ///
    /// ```
    /// use gaugebook::{Arrangement, Cantilever, DesignCriteria, DesignPoint, Gauge, Layout, material};
    /// use gaugebook::units::{ElectricalResistance, Length};
    /// use uom::si::{electrical_resistance::ohm, length::millimeter};
    /// let mm = Length::new::<millimeter>;
    /// let beam = Cantilever::new(material("2024-T351")?, mm(100.0), mm(20.0), mm(5.0), mm(30.0))?;
    /// let g = Gauge::new(ElectricalResistance::new::<ohm>(350.0), 2.0)?;
    /// let l = Layout::standard(beam, &g, Arrangement::FullBending, 50.0)?;
    /// let p = DesignPoint::evaluate(&l, &DesignCriteria::default(), vec![5.0])?;
    /// assert!(p.meets_margins);
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn evaluate(
        layout: &Layout,
        criteria: &DesignCriteria,
        parameters: Vec<f64>,
    ) -> Result<DesignPoint, PhysicsError> {
        let report = layout.report(criteria.bridge)?;
        let el = layout.element();
        let margins = el.margins(&layout.capacity(), &criteria.overload)?;
        let yield_factor = margins.safe.yield_factor;
        let fatigue_factor = margins.rated.fatigue_factor;
        let fatigue_ok = match (criteria.min_fatigue_factor, fatigue_factor) {
            (None, _) => true,
            (Some(min), Some(f)) => f >= min,
            (Some(_), None) => false,
        };
        Ok(DesignPoint {
            parameters,
            rated_output: report.rated_output,
            peak_stress: margins.rated.peak.von_mises,
            yield_factor,
            fatigue_factor,
            stiffness: el.stiffness(),
            frequency: el.natural_frequency(&criteria.attached)?,
            meets_margins: yield_factor >= criteria.min_yield_factor && fatigue_ok,
        })
    }
}

/// A table of designs over a parameter sweep, with the points the models refused.
///
/// ```
/// # use gaugebook::{Arrangement, Cantilever, Gauge, Layout, LoadComponent, Wrench, material};
/// # use gaugebook::units::{ElectricalResistance, Length};
/// # use uom::si::{electrical_resistance::ohm, length::millimeter};
/// # let mm = Length::new::<millimeter>;
/// # let beam = Cantilever::new(material("2024-T351")?, mm(100.0), mm(20.0), mm(5.0), mm(30.0))?;
/// # let g = Gauge::new(ElectricalResistance::new::<ohm>(350.0), 2.0)?;
/// # let l = Layout::standard(beam, &g, Arrangement::FullBending, 50.0)?;
/// use gaugebook::{DesignCriteria, sweep};
/// let t = sweep("x", &[1.0], |_| Ok(l.clone()), &DesignCriteria::default());
/// assert!(t.to_string().contains("proven by test"));
/// # Ok::<(), gaugebook::PhysicsError>(())
/// ```
#[derive(Debug, Clone, PartialEq)]
pub struct SweepTable {
    /// The parameters' names, as given.
    pub names: Vec<String>,
    /// The evaluated designs.
    pub points: Vec<DesignPoint>,
    /// Parameter values the element or layout refused, with the reason.
    pub skipped: Vec<(Vec<f64>, PhysicsError)>,
}

impl fmt::Display for SweepTable {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        for n in &self.names {
            write!(f, "{n:>12}")?;
        }
        writeln!(
            f,
            "   RO (mV/V)  peak (MPa)  yield@SO  fatigue   stiffness   f1 (Hz)  ok"
        )?;
        for p in &self.points {
            for v in &p.parameters {
                write!(f, "{v:>12.5}")?;
            }
            writeln!(
                f,
                " {:>11.4} {:>11.1} {:>9.2} {:>8} {:>11.4e} {:>9.1}  {}",
                p.rated_output.mv_per_v(),
                p.peak_stress.get::<megapascal>(),
                p.yield_factor,
                p.fatigue_factor.map_or("–".into(), |v| format!("{v:.2}")),
                p.stiffness.value(),
                p.frequency.get::<hertz>(),
                if p.meets_margins { "yes" } else { "no" }
            )?;
        }
        for (v, e) in &self.skipped {
            writeln!(f, "skipped {v:?}: {e}")?;
        }
        write!(f, "caution: {MARGIN_CAUTION}")
    }
}

/// Evaluates the layouts `build(v)` for each value in `values`.
///
/// ```
/// use gaugebook::{Arrangement, Cantilever, DesignCriteria, Gauge, Layout, material, sweep};
/// use gaugebook::units::{ElectricalResistance, Length};
/// use uom::si::{electrical_resistance::ohm, length::millimeter};
/// let mm = Length::new::<millimeter>;
/// let g = Gauge::new(ElectricalResistance::new::<ohm>(350.0), 2.0)?;
/// let build = |h: f64| {
///     let beam = Cantilever::new(material("2024-T351")?, mm(100.0), mm(20.0), mm(h), mm(30.0))?;
///     Layout::standard(beam, &g, Arrangement::FullBending, 50.0)
/// };
/// let t = sweep("depth (mm)", &[4.0, 5.0, 6.0, 25.0], build, &DesignCriteria::default());
/// assert_eq!(t.points.len(), 3);
/// assert_eq!(t.skipped.len(), 1); // 25 mm deep: L/h = 4 < 5
/// assert!(t.points[0].rated_output > t.points[2].rated_output);
/// # Ok::<(), gaugebook::PhysicsError>(())
/// ```
pub fn sweep(
    name: &str,
    values: &[f64],
    build: impl Fn(f64) -> Result<Layout, PhysicsError>,
    criteria: &DesignCriteria,
) -> SweepTable {
    let mut t = SweepTable {
        names: vec![name.to_string()],
        points: vec![],
        skipped: vec![],
    };
    for &v in values {
        match build(v).and_then(|l| DesignPoint::evaluate(&l, criteria, vec![v])) {
            Ok(p) => t.points.push(p),
            Err(e) => t.skipped.push((vec![v], e)),
        }
    }
    t
}

/// Evaluates the layouts `build(x, y)` over the grid `xs` × `ys`.
///
/// ```
/// use gaugebook::{Arrangement, Cantilever, DesignCriteria, Gauge, Layout, material, sweep2};
/// use gaugebook::units::{ElectricalResistance, Length};
/// use uom::si::{electrical_resistance::ohm, length::millimeter};
/// let mm = Length::new::<millimeter>;
/// let g = Gauge::new(ElectricalResistance::new::<ohm>(350.0), 2.0)?;
/// let build = |b: f64, h: f64| {
///     let beam = Cantilever::new(material("2024-T351")?, mm(100.0), mm(b), mm(h), mm(30.0))?;
///     Layout::standard(beam, &g, Arrangement::FullBending, 50.0)
/// };
/// let t = sweep2(["width (mm)", "depth (mm)"], &[15.0, 20.0], &[4.0, 5.0, 6.0], build,
///     &DesignCriteria::default());
/// assert_eq!(t.points.len(), 6);
/// # Ok::<(), gaugebook::PhysicsError>(())
/// ```
pub fn sweep2(
    names: [&str; 2],
    xs: &[f64],
    ys: &[f64],
    build: impl Fn(f64, f64) -> Result<Layout, PhysicsError>,
    criteria: &DesignCriteria,
) -> SweepTable {
    let mut t = SweepTable {
        names: names.iter().map(|s| s.to_string()).collect(),
        points: vec![],
        skipped: vec![],
    };
    for &x in xs {
        for &y in ys {
            match build(x, y).and_then(|l| DesignPoint::evaluate(&l, criteria, vec![x, y])) {
                Ok(p) => t.points.push(p),
                Err(e) => t.skipped.push((vec![x, y], e)),
            }
        }
    }
    t
}

/// Finds the parameter in [`lo`, `hi`] at which the layout `build(p)` gives the rated output
/// `target` (compared in magnitude), by bisection, and checks its margins against `criteria`.
///
/// Errors with [`PhysicsError::NoSolution`] when the rated output does not pass through the
/// target on the interval (the message gives the range it spans) or when the design that meets
/// it fails the margins (the message gives them). Design estimates must be proven by test.
///
/// ```
/// use gaugebook::{Arrangement, Cantilever, DesignCriteria, Gauge, Layout, OutputRatio, material,
///     solve_for_rated_output};
/// use gaugebook::units::{ElectricalResistance, Length};
/// use uom::si::{electrical_resistance::ohm, length::millimeter};
/// let mm = Length::new::<millimeter>;
/// let g = Gauge::new(ElectricalResistance::new::<ohm>(350.0), 2.0)?;
/// let build = |h: f64| {
///     let beam = Cantilever::new(material("2024-T351")?, mm(100.0), mm(20.0), mm(h), mm(30.0))?;
///     Layout::standard(beam, &g, Arrangement::FullBending, 50.0)
/// };
/// let p = solve_for_rated_output(3.0, 10.0, OutputRatio::from_mv_per_v(1.0), build,
///     &DesignCriteria::default())?;
/// assert!((p.rated_output.mv_per_v() - 1.0).abs() < 1e-9);
/// // 5 mV/V would need a beam thinner than 3 mm: no solution on [3, 10].
/// assert!(solve_for_rated_output(3.0, 10.0, OutputRatio::from_mv_per_v(5.0), build,
///     &DesignCriteria::default()).is_err());
/// # Ok::<(), gaugebook::PhysicsError>(())
/// ```
pub fn solve_for_rated_output(
    lo: f64,
    hi: f64,
    target: OutputRatio,
    build: impl Fn(f64) -> Result<Layout, PhysicsError>,
    criteria: &DesignCriteria,
) -> Result<DesignPoint, PhysicsError> {
    let what = format!("a rated output of {target}");
    if !(lo.is_finite() && hi.is_finite() && lo < hi) {
        return Err(PhysicsError::invalid(
            "search interval",
            format!("[{lo}, {hi}]"),
            "lo < hi, both finite",
        ));
    }
    let goal = target.value().abs();
    if !(goal.is_finite() && goal > 0.0) {
        return Err(PhysicsError::invalid(
            "target rated output",
            target,
            "a finite, non-zero output",
        ));
    }
    let f = |p: f64| -> Result<f64, PhysicsError> {
        Ok(build(p)?
            .report(criteria.bridge)?
            .rated_output
            .value()
            .abs()
            - goal)
    };
    let (mut a, mut b) = (lo, hi);
    let (mut fa, fb) = (f(a)?, f(b)?);
    if fa * fb > 0.0 {
        return Err(PhysicsError::NoSolution {
            what,
            reason: format!(
                "the rated output spans {:.4}..{:.4} mV/V over [{lo}, {hi}]",
                (fa + goal) * 1e3,
                (fb + goal) * 1e3
            ),
        });
    }
    for _ in 0..MAX_STEPS {
        let m = 0.5 * (a + b);
        if m <= a || m >= b {
            break;
        }
        let fm = f(m)?;
        if fm == 0.0 {
            a = m;
            b = m;
            break;
        }
        if fa * fm < 0.0 {
            b = m;
        } else {
            a = m;
            fa = fm;
        }
    }
    let p = 0.5 * (a + b);
    let point = DesignPoint::evaluate(&build(p)?, criteria, vec![p])?;
    if !point.meets_margins {
        return Err(PhysicsError::NoSolution {
            what,
            reason: format!(
                "at parameter {p:.6} the yield factor at the safe overload is {:.3} (needed {}) \
                 and the fatigue factor is {}",
                point.yield_factor,
                criteria.min_yield_factor,
                point
                    .fatigue_factor
                    .map_or("unknown".into(), |v| format!("{v:.3}"))
            ),
        });
    }
    Ok(point)
}
