//! Characteristic figures of a transducer from its calibration run.
//!
//! Every figure is computed in the run's indication unit and reported as a [`Figure`]: in % of
//! rated output and in load units (divided by the sensitivity). The definitions follow the trade
//! (common practice, as load cell and force transducer data sheets state them) and, where a
//! standard defines the same quantity, that standard:
//! - rated output: mean ascending indication at capacity minus the mean at zero load;
//! - nonlinearity: largest deviation of the ascending means from a reference line — the terminal
//!   line (through the zero and capacity outputs), the least-squares line, or the minimax
//!   (Chebyshev, "best-fit straight line") line, each reported separately;
//! - hysteresis: largest difference between descending and ascending means at the same load
//!   (cf. the reversibility error of ISO 376:2011, 7.5.2, from memory);
//! - non-repeatability: largest spread of repeated ascending readings at one load and one
//!   mounting rotation (cf. the repeatability error b′ of ISO 376:2011, 7.5.1, from memory);
//! - combined error: largest deviation of any reading, ascending or descending, from the
//!   terminal line (common practice: nonlinearity and hysteresis together);
//! - zero return: zero after the run minus zero before it;
//! - creep and creep recovery: change of indication under a constant load (or after its
//!   removal) between two stated times (cf. OIML R 60:2021 creep test, from memory).
//!
//! These are test results of one specimen; design estimates must be proven by test, and
//! legal-for-trade use follows local regulation.

use crate::units::ThermodynamicTemperature;
use crate::{CalibrationRun, Direction, PhysicsError};
use uom::si::thermodynamic_temperature::kelvin;

/// A figure in % of rated output and in load units.
///
/// ```
/// use gaugebook::Figure;
/// // 0.002 mV/V on a 2 mV/V, 10 kN cell: 0.1 % RO = 10 N.
/// let f = Figure::from_indication(0.002, 2.0, 10_000.0);
/// assert!((f.percent_ro - 0.1).abs() < 1e-12 && (f.load - 10.0).abs() < 1e-9);
/// ```
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct Figure {
    /// In the run's indication unit.
    pub indication: f64,
    /// In % of rated output.
    pub percent_ro: f64,
    /// In load units (N or N·m): indication divided by the sensitivity RO/capacity.
    pub load: f64,
}

impl Figure {
    /// From a deviation in indication units, the rated output and the capacity.
    ///
    /// ```
    /// use gaugebook::Figure;
    /// let f = Figure::from_indication(-0.001, 2.0, 500.0);
    /// assert_eq!((f.percent_ro, f.load), (-0.05, -0.25));
    /// ```
    pub fn from_indication(indication: f64, rated_output: f64, capacity: f64) -> Figure {
        Figure {
            indication,
            percent_ro: indication / rated_output * 100.0,
            load: indication / rated_output * capacity,
        }
    }
}

/// The straight line that nonlinearity is measured against.
///
/// ```
/// use gaugebook::ReferenceLine;
/// assert_eq!(ReferenceLine::Minimax.name(), "minimax (best-fit straight line)");
/// ```
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub enum ReferenceLine {
    /// Through the mean outputs at zero load and at capacity (end points).
    Terminal,
    /// The least-squares line through the ascending means.
    LeastSquares,
    /// The line minimising the largest absolute deviation (Chebyshev / minimax), the "best-fit
    /// straight line" of data sheets (common practice).
    Minimax,
}

impl ReferenceLine {
    /// The name used in tables.
    ///
    /// ```
    /// assert_eq!(gaugebook::ReferenceLine::Terminal.name(), "terminal");
    /// ```
    pub fn name(self) -> &'static str {
        match self {
            ReferenceLine::Terminal => "terminal",
            ReferenceLine::LeastSquares => "least-squares",
            ReferenceLine::Minimax => "minimax (best-fit straight line)",
        }
    }
}

/// A straight line y = intercept + slope · x.
///
/// ```
/// use gaugebook::{Line, ReferenceLine};
/// let l = Line::fit(&[0.0, 1.0, 2.0], &[0.0, 1.0, 4.0], ReferenceLine::Terminal)?;
/// assert_eq!((l.intercept, l.slope), (0.0, 2.0));
/// # Ok::<(), gaugebook::PhysicsError>(())
/// ```
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct Line {
    /// Value at x = 0.
    pub intercept: f64,
    /// dy/dx.
    pub slope: f64,
}

impl Line {
    /// The line's value at x.
    ///
    /// ```
    /// let l = gaugebook::Line { intercept: 1.0, slope: 2.0 };
    /// assert_eq!(l.eval(3.0), 7.0);
    /// ```
    pub fn eval(&self, x: f64) -> f64 {
        self.intercept + self.slope * x
    }

    /// The reference line of `kind` through points sorted by x (terminal: first and last).
    ///
    /// The minimax line is exact: the largest deviation max|yᵢ − a − b xᵢ|, minimised over a,
    /// is half the spread of yᵢ − b xᵢ, a convex piecewise-linear function of b whose corners lie
    /// at the slopes between pairs of points, so the best b is one of those slopes (Chebyshev
    /// alternation; Cheney, *Introduction to Approximation Theory*, 1966, ch. 1, from memory).
    ///
    /// ```
    /// use gaugebook::{Line, ReferenceLine};
    /// let x = [0.0, 1.0, 2.0];
    /// let y = [0.0, 1.0, 0.0];
    /// let l = Line::fit(&x, &y, ReferenceLine::Minimax)?;
    /// // Equal and alternating deviations of ±0.5 about y = 0.5.
    /// assert!((l.intercept - 0.5).abs() < 1e-12 && l.slope.abs() < 1e-12);
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn fit(x: &[f64], y: &[f64], kind: ReferenceLine) -> Result<Line, PhysicsError> {
        if x.len() != y.len() {
            return Err(PhysicsError::Mismatch {
                what: "reference line abscissa and ordinate lengths".into(),
                left: x.len().to_string(),
                right: y.len().to_string(),
            });
        }
        if x.len() < 2 {
            return Err(PhysicsError::NotEnoughData {
                what: "a reference line".into(),
                needed: 2,
                found: x.len(),
            });
        }
        let n = x.len();
        match kind {
            ReferenceLine::Terminal => {
                let slope = (y[n - 1] - y[0]) / (x[n - 1] - x[0]);
                if !slope.is_finite() {
                    return Err(PhysicsError::invalid(
                        "terminal points",
                        format!("x = {} and {}", x[0], x[n - 1]),
                        "two different loads",
                    ));
                }
                Ok(Line {
                    intercept: y[0] - slope * x[0],
                    slope,
                })
            }
            ReferenceLine::LeastSquares => {
                let mx = x.iter().sum::<f64>() / n as f64;
                let my = y.iter().sum::<f64>() / n as f64;
                let sxy: f64 = x.iter().zip(y).map(|(a, b)| (a - mx) * (b - my)).sum();
                let sxx: f64 = x.iter().map(|a| (a - mx).powi(2)).sum();
                if sxx == 0.0 {
                    return Err(PhysicsError::invalid(
                        "loads",
                        "all equal",
                        "two different loads",
                    ));
                }
                let slope = sxy / sxx;
                Ok(Line {
                    intercept: my - slope * mx,
                    slope,
                })
            }
            ReferenceLine::Minimax => {
                let spread = |b: f64| {
                    let r = x.iter().zip(y).map(|(xi, yi)| yi - b * xi);
                    let (lo, hi) = r.fold((f64::INFINITY, f64::NEG_INFINITY), |(l, h), v| {
                        (l.min(v), h.max(v))
                    });
                    (hi - lo, lo, hi)
                };
                let mut best: Option<(f64, f64, f64)> = None;
                for i in 0..n {
                    for j in i + 1..n {
                        if x[j] == x[i] {
                            continue;
                        }
                        let b = (y[j] - y[i]) / (x[j] - x[i]);
                        let (s, lo, hi) = spread(b);
                        if best.is_none_or(|(bs, _, _)| s < bs) {
                            best = Some((s, b, 0.5 * (lo + hi)));
                        }
                    }
                }
                let (_, slope, intercept) = best.ok_or_else(|| {
                    PhysicsError::invalid("loads", "all equal", "two different loads")
                })?;
                Ok(Line { intercept, slope })
            }
        }
    }

    /// The largest absolute deviation max|yᵢ − line(xᵢ)|.
    ///
    /// ```
    /// let l = gaugebook::Line { intercept: 0.0, slope: 1.0 };
    /// assert_eq!(l.max_deviation(&[0.0, 1.0, 2.0], &[0.0, 1.5, 2.0]), 0.5);
    /// ```
    pub fn max_deviation(&self, x: &[f64], y: &[f64]) -> f64 {
        x.iter()
            .zip(y)
            .map(|(&xi, &yi)| (yi - self.eval(xi)).abs())
            .fold(0.0, f64::max)
    }
}

/// Mean indication of each load level in one direction (levels without a reading are `None`).
fn level_means(run: &CalibrationRun, levels: &[f64], dir: Direction, tol: f64) -> Vec<Option<f64>> {
    levels
        .iter()
        .map(|&l| {
            let v: Vec<f64> = run
                .series_in(dir)
                .iter()
                .filter_map(|s| s.indication_at(l, tol))
                .collect();
            if v.is_empty() {
                None
            } else {
                Some(v.iter().sum::<f64>() / v.len() as f64)
            }
        })
        .collect()
}

/// Options for [`Characterisation::from_run`].
///
/// ```
/// let o = gaugebook::CharacteriseOptions::new(10_000.0);
/// assert_eq!(o.capacity, 10_000.0);
/// ```
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct CharacteriseOptions {
    /// Rated capacity (N or N·m); the run must hold an ascending reading there.
    pub capacity: f64,
    /// Loads within this of each other are the same level (N or N·m); default capacity × 10⁻⁶.
    pub level_tolerance: f64,
}

impl CharacteriseOptions {
    /// Options with the default level tolerance.
    ///
    /// ```
    /// let o = gaugebook::CharacteriseOptions::new(2000.0);
    /// assert_eq!(o.level_tolerance, 2000.0 * 1e-6);
    /// ```
    pub fn new(capacity: f64) -> CharacteriseOptions {
        CharacteriseOptions {
            capacity,
            level_tolerance: capacity.abs() * 1e-6,
        }
    }
}

/// The figures of one calibration run.
///
/// ```
/// use gaugebook::{CalibrationRun, Characterisation, CharacteriseOptions, Direction, LoadKind};
/// let mut run = CalibrationRun::new(LoadKind::Force, "mV/V");
/// run.push_series(&[0.0, 500.0, 1000.0], &[0.010, 1.012, 2.010], Direction::Ascending, 0.0)?;
/// run.push_series(&[1000.0, 500.0, 0.0], &[2.010, 1.014, 0.011], Direction::Descending, 0.0)?;
/// let c = Characterisation::from_run(&run, CharacteriseOptions::new(1000.0))?;
/// assert!((c.rated_output - 2.0).abs() < 1e-12);
/// assert!((c.hysteresis.percent_ro - 0.1).abs() < 1e-9); // 0.002 mV/V of 2 mV/V
/// # Ok::<(), gaugebook::PhysicsError>(())
/// ```
#[derive(Clone, Debug, PartialEq)]
pub struct Characterisation {
    /// Indication unit label.
    pub indication_unit: String,
    /// Load unit (N or N·m).
    pub load_unit: String,
    /// Rated capacity.
    pub capacity: f64,
    /// Rated output (indication at capacity minus indication at zero, ascending means).
    pub rated_output: f64,
    /// Sensitivity, rated output per unit load.
    pub sensitivity: f64,
    /// Zero balance: mean ascending indication at zero load, as a figure.
    pub zero_balance: Figure,
    /// Nonlinearity against the terminal line.
    pub nonlinearity_terminal: Figure,
    /// Nonlinearity against the least-squares line.
    pub nonlinearity_least_squares: Figure,
    /// Nonlinearity against the minimax (best-fit straight) line.
    pub nonlinearity_minimax: Figure,
    /// Hysteresis (largest descending − ascending difference); zero without descending series.
    pub hysteresis: Figure,
    /// Non-repeatability (largest spread at one load and rotation); zero without repeats.
    pub non_repeatability: Figure,
    /// Combined error against the terminal line, all readings.
    pub combined_error: Figure,
    /// Zero return (last zero reading of the run minus the first), if both exist.
    pub zero_return: Option<Figure>,
    /// Load levels used.
    pub levels: Vec<f64>,
    /// Mean ascending indication per level.
    pub ascending_means: Vec<f64>,
}

impl Characterisation {
    /// Computes the figures. Needs ascending readings at zero load and at capacity.
    ///
    /// ```
    /// use gaugebook::{CalibrationRun, Characterisation, CharacteriseOptions, Direction, LoadKind};
    /// let mut run = CalibrationRun::new(LoadKind::Force, "mV/V");
    /// run.push_series(&[0.0, 250.0, 500.0], &[0.0, 0.5, 1.0], Direction::Ascending, 0.0)?;
    /// let e = Characterisation::from_run(&run, CharacteriseOptions::new(1000.0)).unwrap_err();
    /// assert!(e.to_string().contains("capacity"));
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn from_run(
        run: &CalibrationRun,
        opts: CharacteriseOptions,
    ) -> Result<Characterisation, PhysicsError> {
        let unit = run.load_kind().si_unit();
        crate::check_positive("capacity", opts.capacity, unit)?;
        let tol = opts.level_tolerance;
        let levels = run.load_levels(tol);
        if levels.len() < 3 {
            return Err(PhysicsError::NotEnoughData {
                what: "characteristic figures (ascending load levels)".into(),
                needed: 3,
                found: levels.len(),
            });
        }
        let asc = level_means(run, &levels, Direction::Ascending, tol);
        let asc: Vec<f64> = asc.into_iter().map(|v| v.unwrap_or(f64::NAN)).collect();
        let zero_idx = levels.iter().position(|l| l.abs() <= tol).ok_or_else(|| {
            PhysicsError::invalid(
                "calibration run",
                "no ascending reading at zero load",
                "a zero-load reading",
            )
        })?;
        let cap_idx = levels
            .iter()
            .position(|l| (l - opts.capacity).abs() <= tol)
            .ok_or_else(|| {
                PhysicsError::invalid(
                    "calibration run",
                    format!(
                        "no ascending reading at the capacity {} {unit}",
                        opts.capacity
                    ),
                    "a reading at capacity",
                )
            })?;
        let ro = asc[cap_idx] - asc[zero_idx];
        if ro == 0.0 || !ro.is_finite() {
            return Err(PhysicsError::invalid(
                "rated output",
                ro,
                "a non-zero output at capacity",
            ));
        }
        let fig = |d: f64| Figure::from_indication(d, ro, opts.capacity);
        // Nonlinearity over the levels from zero to capacity.
        let (xs, ys): (Vec<f64>, Vec<f64>) = levels
            .iter()
            .zip(&asc)
            .filter(|(l, _)| **l >= levels[zero_idx] - tol && **l <= opts.capacity + tol)
            .map(|(&l, &v)| (l, v))
            .unzip();
        let nl = |kind| -> Result<Figure, PhysicsError> {
            let line = Line::fit(&xs, &ys, kind)?;
            Ok(fig(line.max_deviation(&xs, &ys)))
        };
        let terminal = Line::fit(&xs, &ys, ReferenceLine::Terminal)?;
        // Hysteresis: descending mean minus ascending mean at each common level.
        let desc = level_means(run, &levels, Direction::Descending, tol);
        let hyst = asc
            .iter()
            .zip(&desc)
            .filter_map(|(a, d)| d.map(|d| (d - a).abs()))
            .fold(0.0, f64::max);
        // Non-repeatability: spread at one level among ascending series of the same rotation.
        let mut nonrep = 0.0_f64;
        let asc_series = run.series_in(Direction::Ascending);
        for &l in &levels {
            let mut rots: Vec<f64> = asc_series.iter().map(|s| s.rotation_deg).collect();
            rots.sort_by(f64::total_cmp);
            rots.dedup();
            for r in rots {
                let v: Vec<f64> = asc_series
                    .iter()
                    .filter(|s| s.rotation_deg == r)
                    .filter_map(|s| s.indication_at(l, tol))
                    .collect();
                if v.len() >= 2 {
                    let hi = v.iter().copied().fold(f64::NEG_INFINITY, f64::max);
                    let lo = v.iter().copied().fold(f64::INFINITY, f64::min);
                    nonrep = nonrep.max(hi - lo);
                }
            }
        }
        let (ax, ay) = run.xy(None);
        let combined = terminal.max_deviation(&ax, &ay);
        // Zero return: the first reading of the run and the last, when both are at zero load.
        let pts = run.points();
        let zero_return = match (pts.first(), pts.last()) {
            (Some(a), Some(b)) if pts.len() > 1 && a.load.abs() <= tol && b.load.abs() <= tol => {
                Some(fig(b.indication - a.indication))
            }
            _ => None,
        };
        Ok(Characterisation {
            indication_unit: run.indication_unit().to_string(),
            load_unit: unit.to_string(),
            capacity: opts.capacity,
            rated_output: ro,
            sensitivity: ro / opts.capacity,
            zero_balance: fig(asc[zero_idx]),
            nonlinearity_terminal: nl(ReferenceLine::Terminal)?,
            nonlinearity_least_squares: nl(ReferenceLine::LeastSquares)?,
            nonlinearity_minimax: nl(ReferenceLine::Minimax)?,
            hysteresis: fig(hyst),
            non_repeatability: fig(nonrep),
            combined_error: fig(combined),
            zero_return,
            levels,
            ascending_means: asc,
        })
    }
}

/// Readings taken under constant load (creep) or after its removal (creep recovery).
///
/// ```
/// use gaugebook::CreepHold;
/// let h = CreepHold::new(&[0.0, 600.0, 1800.0], &[2.0, 2.0006, 2.001])?;
/// assert!((h.change(0.0, 1800.0)? - 0.001).abs() < 1e-12);
/// # Ok::<(), gaugebook::PhysicsError>(())
/// ```
#[derive(Clone, Debug, PartialEq)]
pub struct CreepHold {
    times_s: Vec<f64>,
    indications: Vec<f64>,
}

impl CreepHold {
    /// Times in seconds from the moment the load was applied (or removed), strictly increasing,
    /// and the indications at those times.
    ///
    /// ```
    /// use gaugebook::CreepHold;
    /// assert!(CreepHold::new(&[0.0, 0.0], &[1.0, 1.0]).is_err()); // times must increase
    /// assert!(CreepHold::new(&[0.0], &[1.0]).is_err()); // too few readings
    /// ```
    pub fn new(times_s: &[f64], indications: &[f64]) -> Result<CreepHold, PhysicsError> {
        if times_s.len() != indications.len() {
            return Err(PhysicsError::Mismatch {
                what: "hold times and indications lengths".into(),
                left: times_s.len().to_string(),
                right: indications.len().to_string(),
            });
        }
        if times_s.len() < 2 {
            return Err(PhysicsError::NotEnoughData {
                what: "a creep hold".into(),
                needed: 2,
                found: times_s.len(),
            });
        }
        if times_s.windows(2).any(|w| w[1] <= w[0] || w[1].is_nan())
            || times_s.iter().any(|t| !t.is_finite())
        {
            return Err(PhysicsError::invalid(
                "hold times",
                "not strictly increasing",
                "strictly increasing finite times in s",
            ));
        }
        Ok(CreepHold {
            times_s: times_s.to_vec(),
            indications: indications.to_vec(),
        })
    }

    /// The indication at time t (s), linearly interpolated; t must lie within the hold.
    ///
    /// ```
    /// let h = gaugebook::CreepHold::new(&[0.0, 100.0], &[1.0, 2.0])?;
    /// assert_eq!(h.at(25.0)?, 1.25);
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn at(&self, t: f64) -> Result<f64, PhysicsError> {
        let (t0, t1) = (self.times_s[0], self.times_s[self.times_s.len() - 1]);
        if !(t >= t0 && t <= t1) {
            return Err(PhysicsError::invalid(
                "hold time",
                format!("{t} s"),
                format!("a time within {t0} … {t1} s"),
            ));
        }
        let i = self
            .times_s
            .partition_point(|&ti| ti <= t)
            .clamp(1, self.times_s.len() - 1);
        let (ta, tb) = (self.times_s[i - 1], self.times_s[i]);
        let (ya, yb) = (self.indications[i - 1], self.indications[i]);
        Ok(ya + (yb - ya) * (t - ta) / (tb - ta))
    }

    /// Indication at `to_s` minus indication at `from_s`.
    ///
    /// ```
    /// let h = gaugebook::CreepHold::new(&[0.0, 1200.0, 1800.0], &[2.0, 2.0004, 2.0005])?;
    /// assert!((h.change(1200.0, 1800.0)? - 0.0001).abs() < 1e-12);
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn change(&self, from_s: f64, to_s: f64) -> Result<f64, PhysicsError> {
        Ok(self.at(to_s)? - self.at(from_s)?)
    }

    /// Creep (or recovery) between two stated times as a [`Figure`].
    ///
    /// ```
    /// use gaugebook::CreepHold;
    /// let h = CreepHold::new(&[0.0, 1800.0], &[2.0, 2.0005])?;
    /// let f = h.creep(0.0, 1800.0, 2.0, 1000.0)?;
    /// assert!((f.percent_ro - 0.025).abs() < 1e-9);
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn creep(
        &self,
        from_s: f64,
        to_s: f64,
        rated_output: f64,
        capacity: f64,
    ) -> Result<Figure, PhysicsError> {
        Ok(Figure::from_indication(
            self.change(from_s, to_s)?,
            rated_output,
            capacity,
        ))
    }
}

/// Temperature coefficient of zero: change of the zero indication per kelvin, as a [`Figure`]
/// per K (% RO/K and load units/K). Common practice (data sheets quote it per K or per 10 K).
///
/// ```
/// use gaugebook::tc_zero;
/// use gaugebook::units::ThermodynamicTemperature;
/// use uom::si::thermodynamic_temperature::degree_celsius;
/// let (t1, t2) = (ThermodynamicTemperature::new::<degree_celsius>(20.0),
///                 ThermodynamicTemperature::new::<degree_celsius>(40.0));
/// let f = tc_zero(0.0, 0.0008, t1, t2, 2.0, 1000.0)?;
/// assert!((f.percent_ro - 0.002).abs() < 1e-12); // 0.04 % RO over 20 K
/// # Ok::<(), gaugebook::PhysicsError>(())
/// ```
pub fn tc_zero(
    zero_1: f64,
    zero_2: f64,
    t1: ThermodynamicTemperature,
    t2: ThermodynamicTemperature,
    rated_output: f64,
    capacity: f64,
) -> Result<Figure, PhysicsError> {
    let dt = delta_t(t1, t2)?;
    Ok(Figure::from_indication(
        (zero_2 - zero_1) / dt,
        rated_output,
        capacity,
    ))
}

/// Temperature coefficient of span (rated output): relative change of rated output per kelvin,
/// in % per K. Common practice.
///
/// ```
/// use gaugebook::tc_span;
/// use gaugebook::units::ThermodynamicTemperature;
/// use uom::si::thermodynamic_temperature::degree_celsius;
/// let (t1, t2) = (ThermodynamicTemperature::new::<degree_celsius>(20.0),
///                 ThermodynamicTemperature::new::<degree_celsius>(40.0));
/// let pct_per_k = tc_span(2.0, 2.0004, t1, t2)?;
/// assert!((pct_per_k - 0.001).abs() < 1e-12);
/// # Ok::<(), gaugebook::PhysicsError>(())
/// ```
pub fn tc_span(
    rated_output_1: f64,
    rated_output_2: f64,
    t1: ThermodynamicTemperature,
    t2: ThermodynamicTemperature,
) -> Result<f64, PhysicsError> {
    let dt = delta_t(t1, t2)?;
    if rated_output_1 == 0.0 || !rated_output_1.is_finite() {
        return Err(PhysicsError::invalid(
            "rated output",
            rated_output_1,
            "a finite non-zero value",
        ));
    }
    Ok((rated_output_2 - rated_output_1) / rated_output_1 / dt * 100.0)
}

fn delta_t(
    t1: ThermodynamicTemperature,
    t2: ThermodynamicTemperature,
) -> Result<f64, PhysicsError> {
    let dt = t2.get::<kelvin>() - t1.get::<kelvin>();
    if dt == 0.0 || !dt.is_finite() {
        return Err(PhysicsError::invalid(
            "temperature difference",
            format!("{dt} K"),
            "two different temperatures",
        ));
    }
    Ok(dt)
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn minimax_beats_least_squares() {
        let x = [0.0, 1.0, 2.0, 3.0, 4.0, 5.0];
        let y: Vec<f64> = x.iter().map(|v: &f64| v + 0.05 * v * (5.0 - v)).collect();
        let mm = Line::fit(&x, &y, ReferenceLine::Minimax).unwrap();
        let ls = Line::fit(&x, &y, ReferenceLine::LeastSquares).unwrap();
        let t = Line::fit(&x, &y, ReferenceLine::Terminal).unwrap();
        let (a, b, c) = (
            mm.max_deviation(&x, &y),
            ls.max_deviation(&x, &y),
            t.max_deviation(&x, &y),
        );
        assert!(a <= b + 1e-15 && b <= c, "{a} {b} {c}");
        // Closed form: the bump 0.05·x(5 − x) sampled at integers peaks at h = 0.3 (x = 2, 3)
        // above the terminal line and is symmetric, so the minimax line is the terminal line
        // raised by h/2 with deviations ±0.15.
        assert!(
            (c - 0.3).abs() < 1e-12 && (a - 0.15).abs() < 1e-12,
            "{a} {c}"
        );
    }

    #[test]
    fn hold_rejects_out_of_range() {
        let h = CreepHold::new(&[0.0, 10.0], &[1.0, 1.0]).unwrap();
        assert!(h.at(11.0).is_err());
    }
}
