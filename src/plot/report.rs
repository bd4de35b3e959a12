//! Report figures of a calibration: the calibration curve with its residuals, each reading's
//! error against the class envelope, the hysteresis loop, and the Monte Carlo histogram with
//! its coverage intervals beside the GUM interval.
//!
//! The builders take the calibration, standards and uncertainty results directly (the plot
//! layer sits above the physics layer) and return an ordinary [`Plot`], so the figures save as
//! SVG or PNG and show inline in notebooks like any other. Loads are shown in N, kN or MN (N·m,
//! kN·m) by their magnitude, and V/V indications in mV/V, so ticks stay short.

use super::error::PlotError;
use super::figure::{Axis, Panel, Plot, histogram_bins};
use crate::{
    CalibrationRun, ClassVerdict, Direction, Fit, FitModel, GumResult, IntervalKind, LoadKind,
    McResult, Series,
};

/// The display unit of a run's loads and the factor from SI to it.
fn load_axis(run: &CalibrationRun) -> (f64, Axis) {
    let top = run
        .points()
        .iter()
        .map(|p| p.load.abs())
        .fold(0.0, f64::max);
    load_axis_for(run.load_kind(), top)
}

fn load_axis_for(kind: LoadKind, top: f64) -> (f64, Axis) {
    // Prefixes by magnitude so tick labels stay under five digits (common practice).
    let (factor, prefix) = if top >= 1e7 {
        (1e-6, "M")
    } else if top >= 1e4 {
        (1e-3, "k")
    } else {
        (1.0, "")
    };
    let unit = match kind {
        LoadKind::Force => format!("{prefix}N"),
        LoadKind::Torque => format!("{prefix}N·m"),
    };
    (factor, Axis::new("load", unit))
}

/// The display unit of a run's indications and the factor from the run's unit to it.
fn indication_unit(run: &CalibrationRun) -> (f64, String) {
    match run.indication_unit() {
        // 1 V/V = 1000 mV/V, 1 m/m = 10⁶ µε (SI prefixes, SI Brochure 9th ed., Table 7).
        "V/V" => (1e3, "mV/V".to_string()),
        "m/m" => (1e6, "µε".to_string()),
        other => (1.0, other.to_string()),
    }
}

fn direction_name(d: Direction) -> &'static str {
    match d {
        Direction::Ascending => "ascending",
        Direction::Descending => "descending",
    }
}

fn model_name(m: FitModel) -> String {
    match m {
        FitModel::ThroughZero => "line through zero".to_string(),
        FitModel::Linear => "straight line".to_string(),
        FitModel::Polynomial(d) => format!("polynomial of degree {d}"),
    }
}

/// Loads and indications of the series in one direction, scaled for display.
fn scaled(series: &[&Series], lf: f64, yf: f64) -> (Vec<f64>, Vec<f64>) {
    series
        .iter()
        .flat_map(|s| s.points.iter().map(|p| (p.load * lf, p.indication * yf)))
        .unzip()
}

impl Plot {
    /// The calibration curve of a run: the readings (ascending and descending apart) and the
    /// fitted curve over the fit's load range, and beneath them the residuals (reading − curve)
    /// with a zero line. The fit must be of this run's loads (in SI) against its indications.
    ///
    /// Errors: a run without points, or values that cannot be drawn.
    ///
    /// ```
    /// use gaugebook::{CalibrationRun, Direction, Fit, FitModel, LoadKind, Plot};
    /// let mut run = CalibrationRun::new(LoadKind::Force, "mV/V");
    /// run.push_series(&[0.0, 5e3, 10e3], &[0.0, 1.0004, 2.0], Direction::Ascending, 0.0)?;
    /// run.push_series(&[10e3, 5e3, 0.0], &[2.0, 1.0010, 0.0002], Direction::Descending, 0.0)?;
    /// let (x, y) = run.xy(None);
    /// let fit = Fit::new(&x, &y, FitModel::Linear)?;
    /// let svg = Plot::calibration_curve(&run, &fit)?.to_svg()?;
    /// assert!(svg.contains("residual (mV/V)") && svg.contains("load (kN)"));
    /// # Ok::<(), Box<dyn std::error::Error>>(())
    /// ```
    pub fn calibration_curve(run: &CalibrationRun, fit: &Fit) -> Result<Plot, PlotError> {
        if run.points().is_empty() {
            return Err(PlotError::Empty {
                what: "calibration curve (the run has no points)".to_string(),
            });
        }
        let (lf, x_axis) = load_axis(run);
        let (yf, yu) = indication_unit(run);
        let (a, b) = fit.x_range();
        // 200 segments draw any polynomial of degree ≤ 5 smoothly at report sizes.
        let xs: Vec<f64> = (0..=200).map(|k| a + (b - a) * k as f64 / 200.0).collect();
        let curve_x: Vec<f64> = xs.iter().map(|x| x * lf).collect();
        let curve_y: Vec<f64> = xs.iter().map(|&x| fit.eval(x) * yf).collect();
        let mut top = Panel::new(x_axis.clone(), Axis::new("indication", yu.clone()));
        let mut bottom = Panel::new(x_axis, Axis::new("residual", yu)).with_zero_line();
        for dir in [Direction::Ascending, Direction::Descending] {
            let series = run.series_in(dir);
            if series.is_empty() {
                continue;
            }
            let (x, y) = scaled(&series, lf, yf);
            let r: Vec<f64> = series
                .iter()
                .flat_map(|s| {
                    s.points
                        .iter()
                        .map(|p| (p.indication - fit.eval(p.load)) * yf)
                })
                .collect();
            top = top.points(direction_name(dir), &x, &y)?;
            bottom = bottom.points(&format!("{} residual", direction_name(dir)), &x, &r)?;
        }
        top = top
            .line(
                &format!("fit ({})", model_name(fit.model())),
                &curve_x,
                &curve_y,
            )?
            .with_height(2.0);
        Ok(Plot::new("calibration curve and residuals")
            .with_panel(top)
            .with_panel(bottom))
    }

    /// Each reading's error against the permissible error of its class: the verdict's per-point
    /// errors (ascending and descending apart) and the envelope as ± lines. Made from an
    /// OIML R 60 verdict ([`crate::evaluate_r60`]), whose points and envelope it carries.
    ///
    /// Errors: a verdict without per-point errors (other standards have no envelope).
    ///
    /// ```
    /// use gaugebook::{CalibrationRun, Direction, LoadKind, OimlClass, Plot, R60Extras, R60LoadCell, evaluate_r60};
    /// let mut run = CalibrationRun::new(LoadKind::Force, "mV/V");
    /// let loads = [0.0, 2500.0, 5000.0, 7500.0, 10_000.0];
    /// let out: Vec<f64> = loads.iter().map(|l| 2e-4 * l).collect();
    /// run.push_series(&loads, &out, Direction::Ascending, 0.0)?;
    /// let cell = R60LoadCell::new(OimlClass::C, 3000, 10_000.0, 0.0, 0.5)?;
    /// let v = evaluate_r60(&cell, &run, &R60Extras::default())?;
    /// let svg = Plot::class_errors(&v)?.to_svg()?;
    /// assert!(svg.contains("+MPE") && svg.contains("error (N)"));
    /// # Ok::<(), Box<dyn std::error::Error>>(())
    /// ```
    pub fn class_errors(verdict: &ClassVerdict) -> Result<Plot, PlotError> {
        if verdict.points.is_empty() || verdict.envelope.is_empty() {
            return Err(PlotError::Invalid {
                name: "verdict for a class error figure".to_string(),
                found: format!("{} verdict without per-point errors", verdict.standard),
                expected: "a verdict with per-point errors and an envelope (OIML R 60)".to_string(),
            });
        }
        let top = verdict
            .points
            .iter()
            .map(|p| p.load.abs())
            .fold(0.0, f64::max);
        // R 60 runs are forces; the axis prefix follows the largest load.
        let (lf, x_axis) = load_axis_for(LoadKind::Force, top);
        let mut panel =
            Panel::new(x_axis, Axis::new("error", verdict.point_unit.clone())).with_zero_line();
        let ex: Vec<f64> = verdict.envelope.iter().map(|(l, _)| l * lf).collect();
        let hi: Vec<f64> = verdict.envelope.iter().map(|(_, m)| *m).collect();
        let lo: Vec<f64> = hi.iter().map(|m| -m).collect();
        panel = panel.line("+MPE", &ex, &hi)?.line("−MPE", &ex, &lo)?;
        for dir in [Direction::Ascending, Direction::Descending] {
            let (x, y): (Vec<f64>, Vec<f64>) = verdict
                .points
                .iter()
                .filter(|p| p.direction == dir)
                .map(|p| (p.load * lf, p.error))
                .unzip();
            if !x.is_empty() {
                panel = panel.points(direction_name(dir), &x, &y)?;
            }
        }
        let outcome = if verdict.passed {
            "meets"
        } else {
            "does not meet"
        };
        Ok(Plot::new(format!(
            "errors against {} class {} ({outcome})",
            verdict.standard, verdict.class
        ))
        .with_panel(panel))
    }

    /// The hysteresis loop: every series' deviation from the terminal line (through the mean
    /// ascending indications at the lowest and the highest ascending load), ascending and
    /// descending series as lines in the order taken, so the gap between them is the
    /// hysteresis.
    ///
    /// Errors: a run without both ascending and descending series, or with fewer than two
    /// ascending load levels.
    ///
    /// ```
    /// use gaugebook::{CalibrationRun, Direction, LoadKind, Plot};
    /// let mut run = CalibrationRun::new(LoadKind::Force, "mV/V");
    /// run.push_series(&[0.0, 500.0, 1000.0], &[0.0, 1.0, 2.0], Direction::Ascending, 0.0)?;
    /// run.push_series(&[1000.0, 500.0, 0.0], &[2.0, 1.002, 0.0], Direction::Descending, 0.0)?;
    /// let svg = Plot::hysteresis_loop(&run)?.to_svg()?;
    /// assert!(svg.contains("descending, series 1"));
    /// let mut up_only = CalibrationRun::new(LoadKind::Force, "mV/V");
    /// up_only.push_series(&[0.0, 1000.0], &[0.0, 2.0], Direction::Ascending, 0.0)?;
    /// assert!(Plot::hysteresis_loop(&up_only).is_err());
    /// # Ok::<(), Box<dyn std::error::Error>>(())
    /// ```
    pub fn hysteresis_loop(run: &CalibrationRun) -> Result<Plot, PlotError> {
        let asc = run.series_in(Direction::Ascending);
        let desc = run.series_in(Direction::Descending);
        if asc.is_empty() || desc.is_empty() {
            return Err(PlotError::Invalid {
                name: "run for a hysteresis loop".to_string(),
                found: format!(
                    "{} ascending and {} descending series",
                    asc.len(),
                    desc.len()
                ),
                expected: "at least one ascending and one descending series".to_string(),
            });
        }
        let top = run
            .points()
            .iter()
            .map(|p| p.load.abs())
            .fold(0.0, f64::max);
        let levels = run.load_levels(top * 1e-6);
        let mean_at = |l: f64| {
            let v: Vec<f64> = asc
                .iter()
                .filter_map(|s| s.indication_at(l, top * 1e-6))
                .collect();
            v.iter().sum::<f64>() / v.len() as f64
        };
        let (l0, l1) = match (levels.first(), levels.last()) {
            (Some(&a), Some(&b)) if b > a => (a, b),
            _ => {
                return Err(PlotError::Invalid {
                    name: "run for a hysteresis loop".to_string(),
                    found: format!("{} ascending load levels", levels.len()),
                    expected: "at least two ascending load levels".to_string(),
                });
            }
        };
        let (y0, y1) = (mean_at(l0), mean_at(l1));
        let slope = (y1 - y0) / (l1 - l0);
        let (lf, x_axis) = load_axis(run);
        let (yf, yu) = indication_unit(run);
        let mut panel =
            Panel::new(x_axis, Axis::new("deviation from terminal line", yu)).with_zero_line();
        for (k, s) in run.series().iter().enumerate() {
            let x: Vec<f64> = s.points.iter().map(|p| p.load * lf).collect();
            let y: Vec<f64> = s
                .points
                .iter()
                .map(|p| (p.indication - (y0 + slope * (p.load - l0))) * yf)
                .collect();
            let name = format!(
                "{}, series {k} ({}°)",
                direction_name(s.direction),
                s.rotation_deg
            );
            panel = panel.line(&name, &x, &y)?;
        }
        Ok(Plot::new("hysteresis loop").with_panel(panel))
    }

    /// The Monte Carlo distribution of the output as a histogram, with three intervals of
    /// coverage probability `p` drawn as brackets above it: the probabilistically symmetric and
    /// the shortest coverage intervals (JCGM 101:2008 7.7) and the GUM interval y ± U_p (JCGM
    /// 100:2008 6.2, k from Student's t at ν_eff). Values are multiplied by `scale` for display
    /// (1 when `axis` is in the SI unit); the bin count is √M, from 10 to 100 (common practice).
    ///
    /// Errors: p outside (0, 1), too few trials for the interval, or a `scale` that is not
    /// finite and non-zero.
    ///
    /// ```
    /// use gaugebook::{Axis, Budget, Distribution, Input, MonteCarlo, Plot};
    /// let b = Budget::new(vec![Input::type_b("x", Distribution::Rectangular { mean: 0.0, half_width: 1.0 })?]);
    /// let gum = b.evaluate(|x| x[0])?;
    /// let mc = MonteCarlo::new(20_000, 3).run(&b, |c: &[Vec<f64>]| c[0].clone())?;
    /// let svg = Plot::monte_carlo(&mc, &gum, 0.95, Axis::new("y", "mm"), 1.0)?.to_svg()?;
    /// assert!(svg.contains("shortest 95 %") && svg.contains("GUM"));
    /// # Ok::<(), Box<dyn std::error::Error>>(())
    /// ```
    pub fn monte_carlo(
        mc: &McResult,
        gum: &GumResult,
        p: f64,
        axis: Axis,
        scale: f64,
    ) -> Result<Plot, PlotError> {
        if !(scale.is_finite() && scale != 0.0) {
            return Err(PlotError::Invalid {
                name: "display scale".to_string(),
                found: scale.to_string(),
                expected: "a finite, non-zero factor".to_string(),
            });
        }
        let physics = |e: crate::PhysicsError| PlotError::Invalid {
            name: "coverage interval".to_string(),
            found: e.to_string(),
            expected: "p in (0, 1) and enough trials".to_string(),
        };
        let (slo, shi) = mc
            .coverage_interval(p, IntervalKind::Symmetric)
            .map_err(physics)?;
        let (qlo, qhi) = mc
            .coverage_interval(p, IntervalKind::Shortest)
            .map_err(physics)?;
        let g = gum.expanded(p).map_err(physics)?;
        let values: Vec<f64> = mc.sorted_values().iter().map(|v| v * scale).collect();
        let bins = ((values.len() as f64).sqrt() as usize).clamp(10, 100);
        let (edges, counts) = histogram_bins(&values, bins)?;
        let peak = counts.iter().copied().fold(0.0, f64::max);
        let pct = p * 100.0;
        let bracket = |lo: f64, hi: f64, level: f64| {
            let (a, b) = if scale > 0.0 {
                (lo * scale, hi * scale)
            } else {
                (hi * scale, lo * scale)
            };
            (vec![a, a, b, b], vec![0.0, peak * level, peak * level, 0.0])
        };
        let (sx, sy) = bracket(slo, shi, 1.06);
        let (qx, qy) = bracket(qlo, qhi, 1.12);
        let (gx, gy) = bracket(g.low, g.high, 1.18);
        let panel = Panel::new(axis, Axis::new("trials per bin", ""))
            .bars("Monte Carlo", &edges, &counts)?
            .line(&format!("probabilistically symmetric {pct} %"), &sx, &sy)?
            .line(&format!("shortest {pct} %"), &qx, &qy)?
            .line(&format!("GUM y ± U, k = {:.3} ({pct} %)", g.k), &gx, &gy)?;
        Ok(Plot::new(format!(
            "Monte Carlo, {} trials (JCGM 101:2008)",
            values.len()
        ))
        .with_panel(panel))
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn load_prefix_follows_magnitude() {
        // SI prefixes k = 10³, M = 10⁶ (SI Brochure 9th ed., Table 7, from memory).
        assert_eq!(load_axis_for(LoadKind::Force, 9_999.0).1.unit, "N");
        assert_eq!(
            load_axis_for(LoadKind::Force, 10_000.0),
            (1e-3, Axis::new("load", "kN"))
        );
        assert_eq!(load_axis_for(LoadKind::Torque, 2e7).1.unit, "MN·m");
    }

    #[test]
    fn ratio_and_strain_indications_are_shown_with_prefixes() {
        let run = CalibrationRun::force_in_output_ratio();
        assert_eq!(indication_unit(&run), (1e3, "mV/V".to_string()));
        let run = CalibrationRun::new(LoadKind::Torque, "m/m");
        assert_eq!(indication_unit(&run), (1e6, "µε".to_string()));
        let run = CalibrationRun::new(LoadKind::Force, "counts");
        assert_eq!(indication_unit(&run), (1.0, "counts".to_string()));
    }
}
