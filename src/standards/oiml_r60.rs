//! OIML R 60:2021, *Metrological regulation for load cells* (Part 1 requirements, Part 2 tests,
//! Part 3 test report format, second edition 2021-10-01): accuracy classes, limits and the
//! evaluation of a load cell test.
//!
//! Read in the public copy of R 60-1/-3:2021 (OIML's metanorma edition; the table cells and some
//! symbols did not survive in that copy, so numbers from tables are still "from memory"):
//! - the MPE on type evaluation is p_LC times the Table 4 values; p_LC is declared in 0.3 … 0.8,
//!   0.7 when not declared; the MPE applies to increasing and decreasing loads (R 60-1 5.3.2);
//! - errors are taken against the line through the mean increasing-load indication at D_min and
//!   the one at D_min + 75 % (D_max − D_min), interpolated between the adjacent test loads when no
//!   load was applied there (R 60-3 2.1.2.2–2.1.2.6, the conversion factor);
//! - creep: the change over 30 min at 90–100 % of D_max ≤ 0.7 |MPE| for that load, and between
//!   20 and 30 min ≤ 0.15 |MPE|, the MPE taken with a fixed apportioning factor whatever p_LC is
//!   declared (R 60-1 5.5.1; the factor's value is not legible in the copy: 0.7, from memory);
//! - minimum dead load output return DR ≤ 0.5 v (R 60-3 2.1.5.5, R 60-1 5.5.2; the unit is
//!   not legible in the copy: v, from memory); Z, the relative minimum dead load output return,
//!   is the maximum measuring range (E_min to E_max) over 2 DR (R 60-1 3.5), so
//!   Z = (E_max − E_min)/(2 DR);
//! - the change of the minimum dead load output, per 5 °C for classes B, C, D or per 2 °C for
//!   class A, in units of v_min, must not exceed p_LC (R 60-3 2.1.4; R 60 (2000) erratum C.2.4.4);
//! - the test interval v = (D_max − D_min)/n_max with v_min ≤ v (R 60 (2000) erratum C.4.4).
//!
//! From memory:
//! - n_LC per class: A ≥ 50 000; B 5 000 … 100 000; C 500 … 10 000; D 100 … 1 000 (R 60-1 5.1.2);
//! - Table 4 bands: p_LC × 0.5 v, 1.0 v, 1.5 v for loads (in v) A: 0–50 000–200 000–; B:
//!   0–5 000–20 000–; C: 0–500–2 000–; D: 0–50–200–;
//! - repeatability: the difference between repeated results at one load ≤ |MPE| (R 60-1 5.4);
//! - Y = (E_max − E_min)/v_min, the maximum measuring range over v_min (R 60-1 3.5; the 2000
//!   edition wrote E_max/v_min, the same for E_min = 0). The temperature effect on span is covered by applying the
//!   MPE to the run at each test temperature (R 60-1 5.3.2 includes it).
//!
//! A computed class verdict is not a type approval or a legal-for-trade certificate; that
//! follows local regulation.

use super::verdict::{Check, ClassVerdict, ErrorPoint};
use crate::{CalibrationRun, CreepHold, Direction, PhysicsError};

const STD: &str = "OIML R 60:2021";

/// OIML R 60 accuracy class.
///
/// ```
/// use gaugebook::OimlClass;
/// assert_eq!(OimlClass::C.interval_range(), (500, Some(10_000)));
/// ```
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub enum OimlClass {
    /// Special accuracy.
    A,
    /// High accuracy.
    B,
    /// Medium accuracy.
    C,
    /// Ordinary accuracy.
    D,
}

impl OimlClass {
    /// Minimum and maximum number of load cell verification intervals n_LC (R 60-1 5.1.2, from
    /// memory); `None`: no upper limit.
    ///
    /// ```
    /// assert_eq!(gaugebook::OimlClass::A.interval_range().1, None);
    /// ```
    pub fn interval_range(self) -> (u32, Option<u32>) {
        match self {
            OimlClass::A => (50_000, None),
            OimlClass::B => (5_000, Some(100_000)),
            OimlClass::C => (500, Some(10_000)),
            OimlClass::D => (100, Some(1_000)),
        }
    }

    /// Upper edges of the first two MPE bands, in verification intervals (R 60-1 Table 4, from memory).
    ///
    /// ```
    /// assert_eq!(gaugebook::OimlClass::D.band_edges(), (50.0, 200.0));
    /// ```
    pub fn band_edges(self) -> (f64, f64) {
        match self {
            OimlClass::A => (50_000.0, 200_000.0),
            OimlClass::B => (5_000.0, 20_000.0),
            OimlClass::C => (500.0, 2_000.0),
            OimlClass::D => (50.0, 200.0),
        }
    }

    /// Temperature change over which the minimum dead load output may change by p_LC × v_min:
    /// 2 °C for class A, 5 °C otherwise (from memory).
    ///
    /// ```
    /// assert_eq!(gaugebook::OimlClass::B.min_load_temperature_step(), 5.0);
    /// ```
    pub fn min_load_temperature_step(self) -> f64 {
        match self {
            OimlClass::A => 2.0,
            _ => 5.0,
        }
    }

    /// The class letter.
    ///
    /// ```
    /// assert_eq!(gaugebook::OimlClass::C.letter(), "C");
    /// ```
    pub fn letter(self) -> &'static str {
        match self {
            OimlClass::A => "A",
            OimlClass::B => "B",
            OimlClass::C => "C",
            OimlClass::D => "D",
        }
    }

    /// Maximum permissible error, in verification intervals v, at a load of `m` intervals above
    /// the minimum test load: p_LC × (0.5, 1.0 or 1.5) (R 60-1 Table 4, from memory).
    ///
    /// ```
    /// use gaugebook::OimlClass;
    /// assert_eq!(OimlClass::C.mpe_intervals(400.0, 0.7), 0.35);
    /// assert_eq!(OimlClass::C.mpe_intervals(1500.0, 0.7), 0.7);
    /// assert!((OimlClass::C.mpe_intervals(3000.0, 0.7) - 1.05).abs() < 1e-12);
    /// ```
    pub fn mpe_intervals(self, m: f64, p_lc: f64) -> f64 {
        let (e1, e2) = self.band_edges();
        let base = if m <= e1 {
            0.5
        } else if m <= e2 {
            1.0
        } else {
            1.5
        };
        p_lc * base
    }
}

/// A load cell as declared for an R 60 evaluation.
///
/// ```
/// use gaugebook::{OimlClass, R60LoadCell};
/// let cell = R60LoadCell::new(OimlClass::C, 3000, 10_000.0, 0.0, 0.5)?;
/// assert!((cell.y() - 20_000.0).abs() < 1e-9);
/// # Ok::<(), gaugebook::PhysicsError>(())
/// ```
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct R60LoadCell {
    /// Accuracy class.
    pub class: OimlClass,
    /// Maximum number of verification intervals n_max.
    pub n_max: u32,
    /// Maximum capacity E_max (N).
    pub e_max: f64,
    /// Minimum dead load E_min (N); the minimum test load.
    pub e_min: f64,
    /// Minimum verification interval v_min (N).
    pub v_min: f64,
    /// Apportionment factor p_LC (0.7 unless declared).
    pub p_lc: f64,
    /// Declared Z = (E_max − E_min)/(2 DR), if any.
    pub z: Option<f64>,
    /// Fraction of the maximum test load the reference line passes through (0.75, from memory).
    pub reference_fraction: f64,
}

impl R60LoadCell {
    /// A load cell with p_LC = 0.7 and the default reference line.
    ///
    /// ```
    /// use gaugebook::{OimlClass, R60LoadCell};
    /// assert!(R60LoadCell::new(OimlClass::C, 3000, 1e4, 2e4, 0.5).is_err()); // E_min ≥ E_max
    /// assert_eq!(R60LoadCell::new(OimlClass::C, 3000, 1e4, 0.0, 0.5)?.p_lc, 0.7);
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn new(
        class: OimlClass,
        n_max: u32,
        e_max: f64,
        e_min: f64,
        v_min: f64,
    ) -> Result<R60LoadCell, PhysicsError> {
        crate::check_positive("maximum capacity", e_max, "N")?;
        crate::check_positive("minimum verification interval", v_min, "N")?;
        crate::check_finite("minimum dead load", e_min, "N")?;
        if e_min < 0.0 || e_min >= e_max {
            return Err(PhysicsError::invalid(
                "minimum dead load",
                format!("{e_min} N"),
                format!("0 ≤ E_min < E_max = {e_max} N"),
            ));
        }
        if n_max == 0 {
            return Err(PhysicsError::invalid("n_max", 0, "a count above 0"));
        }
        Ok(R60LoadCell {
            class,
            n_max,
            e_max,
            e_min,
            v_min,
            p_lc: 0.7,
            z: None,
            reference_fraction: 0.75,
        })
    }

    /// With a declared apportionment factor (0.3 ≤ p_LC ≤ 0.8, from memory).
    ///
    /// ```
    /// use gaugebook::{OimlClass, R60LoadCell};
    /// let c = R60LoadCell::new(OimlClass::C, 3000, 1e4, 0.0, 0.5)?;
    /// assert!(c.with_p_lc(0.9).is_err());
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn with_p_lc(mut self, p_lc: f64) -> Result<R60LoadCell, PhysicsError> {
        if !(0.3..=0.8).contains(&p_lc) {
            return Err(PhysicsError::invalid(
                "apportionment factor p_LC",
                p_lc,
                "a value in 0.3 … 0.8",
            ));
        }
        self.p_lc = p_lc;
        Ok(self)
    }

    /// Y = (E_max − E_min)/v_min (R 60-1:2021 3.5).
    ///
    /// ```
    /// let c = gaugebook::R60LoadCell::new(gaugebook::OimlClass::C, 3000, 1e4, 0.0, 1.0)?;
    /// assert_eq!(c.y(), 1e4);
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn y(&self) -> f64 {
        (self.e_max - self.e_min) / self.v_min
    }

    /// The verification interval used in the test: v = (D_max − D_min)/n_max over the measuring
    /// range from E_min to E_max (from memory).
    ///
    /// ```
    /// let c = gaugebook::R60LoadCell::new(gaugebook::OimlClass::C, 2000, 1e4, 0.0, 1.0)?;
    /// assert_eq!(c.test_interval(), 5.0);
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn test_interval(&self) -> f64 {
        (self.e_max - self.e_min) / self.n_max as f64
    }
}

/// Test results beyond the calibration run: creep hold at maximum load, dead load return and
/// the temperature effect on the minimum dead load output.
///
/// ```
/// let t = gaugebook::R60Extras::default();
/// assert!(t.creep.is_none());
/// ```
#[derive(Clone, Debug, Default, PartialEq)]
pub struct R60Extras {
    /// Indications during 30 min at the maximum test load (times in s from loading).
    pub creep: Option<CreepHold>,
    /// Minimum dead load output return DR, in N.
    pub dead_load_return: Option<f64>,
    /// Change of the minimum dead load output, in N, and the temperature change in K.
    pub min_load_temperature_effect: Option<(f64, f64)>,
}

/// Evaluates a load cell test run (forces in N) against R 60 for the declared class.
///
/// Per-point errors are every reading's deviation from the reference line, converted to
/// load with the line's slope and divided by the test interval v.
///
/// ```
/// use gaugebook::{CalibrationRun, Direction, LoadKind, OimlClass, R60Extras, R60LoadCell, evaluate_r60};
/// let mut run = CalibrationRun::new(LoadKind::Force, "mV/V");
/// let loads = [0.0, 2500.0, 5000.0, 7500.0, 10_000.0];
/// let out: Vec<f64> = loads.iter().map(|l| 2e-4 * l).collect();
/// run.push_series(&loads, &out, Direction::Ascending, 0.0)?;
/// let cell = R60LoadCell::new(OimlClass::C, 3000, 10_000.0, 0.0, 0.5)?;
/// let v = evaluate_r60(&cell, &run, &R60Extras::default())?;
/// assert!(v.passed, "{v}");
/// # Ok::<(), gaugebook::PhysicsError>(())
/// ```
pub fn evaluate_r60(
    cell: &R60LoadCell,
    run: &CalibrationRun,
    extras: &R60Extras,
) -> Result<ClassVerdict, PhysicsError> {
    if run.load_kind() != crate::LoadKind::Force {
        return Err(PhysicsError::Mismatch {
            what: "R 60 evaluation load kind".into(),
            left: "load cell forces (N)".into(),
            right: format!("a run of {}", run.load_kind().si_unit()),
        });
    }
    let class = cell.class;
    let v = cell.test_interval();
    let mut checks = vec![];
    let (nmin, nmax) = class.interval_range();
    checks.push(Check::at_least(
        "n_max against the class minimum",
        cell.n_max as f64,
        nmin as f64,
        "",
        "OIML R 60-1:2021 5.1.2 (values from memory)",
    ));
    if let Some(nm) = nmax {
        checks.push(Check::at_most(
            "n_max against the class maximum",
            cell.n_max as f64,
            nm as f64,
            "",
            "OIML R 60-1:2021 5.1.2 (values from memory)",
        ));
    }
    checks.push(Check::at_least(
        "test interval v against v_min",
        v,
        cell.v_min,
        "N",
        "OIML R 60 (2000) erratum C.4.4, v_min ≤ (D_max − D_min)/n_max",
    ));

    // Reference line through the mean outputs at the minimum test load and at 75 % of the max.
    let tol = cell.e_max * 1e-6;
    let levels = run.load_levels(tol);
    let mean_at = |l: f64| -> Option<f64> {
        let v: Vec<f64> = run
            .series_in(Direction::Ascending)
            .iter()
            .filter_map(|s| s.indication_at(l, tol))
            .collect();
        if v.is_empty() {
            None
        } else {
            Some(v.iter().sum::<f64>() / v.len() as f64)
        }
    };
    let d_min = *levels.first().ok_or_else(|| PhysicsError::NotEnoughData {
        what: "an R 60 test run".into(),
        needed: 2,
        found: 0,
    })?;
    let d_max = *levels.last().unwrap_or(&d_min);
    let ref_load = d_min + cell.reference_fraction * (d_max - d_min);
    // Interpolate between the adjacent increasing-load means when no load was applied at the
    // 75 % point (R 60-3 2.1.2.3).
    let means: Vec<(f64, f64)> = levels
        .iter()
        .filter_map(|&l| mean_at(l).map(|m| (l, m)))
        .collect();
    let upper = means
        .iter()
        .position(|&(l, _)| l >= ref_load - tol)
        .unwrap_or(means.len());
    if upper == 0 || upper == means.len() || levels.len() < 2 {
        return Err(PhysicsError::invalid(
            "R 60 test loads",
            format!("increasing loads that do not bracket {ref_load} N"),
            "increasing-load readings at D_min and on both sides of 75 % of the range",
        ));
    }
    let (la, ya) = means[upper - 1];
    let (lb, yb) = means[upper];
    let y1 = if (lb - ref_load).abs() <= tol {
        yb
    } else {
        ya + (yb - ya) * (ref_load - la) / (lb - la)
    };
    let y0 = means[0].1;
    let ref_level = ref_load;
    let slope = (y1 - y0) / (ref_level - d_min);
    if !(slope.is_finite() && slope != 0.0) {
        return Err(PhysicsError::invalid(
            "reference line slope",
            slope,
            "a finite non-zero output per newton",
        ));
    }
    let err_n = |load: f64, ind: f64| (ind - (y0 + slope * (load - d_min))) / slope;
    let src_mpe = "OIML R 60-1:2021 5.3.2, p_LC × Table 4 (band values from memory)";
    let mut points = vec![];
    for p in run.points() {
        let m = (p.load - d_min) / v;
        let mpe = class.mpe_intervals(m, cell.p_lc) * v;
        let dir = match p.direction {
            Direction::Ascending => "ascending",
            Direction::Descending => "descending",
        };
        let error = err_n(p.load, p.indication);
        checks.push(Check::at_most(
            &format!("error at {} N ({dir}, series {})", p.load, p.series),
            error,
            mpe,
            "N",
            src_mpe,
        ));
        points.push(ErrorPoint {
            load: p.load,
            direction: p.direction,
            series: p.series,
            error,
            limit: mpe,
        });
    }
    let envelope = mpe_envelope(class, cell.p_lc, v, d_min, d_max);
    // Repeatability: spread of ascending readings at one load.
    for &l in &levels {
        let r: Vec<f64> = run
            .series_in(Direction::Ascending)
            .iter()
            .filter_map(|s| s.indication_at(l, tol))
            .collect();
        if r.len() >= 2 {
            let hi = r.iter().copied().fold(f64::NEG_INFINITY, f64::max);
            let lo = r.iter().copied().fold(f64::INFINITY, f64::min);
            let mpe = class.mpe_intervals((l - d_min) / v, cell.p_lc) * v;
            checks.push(Check::at_most(
                &format!("repeatability at {l} N"),
                (hi - lo) / slope.abs(),
                mpe,
                "N",
                "OIML R 60-1:2021 5.4, repeatability ≤ |MPE| (from memory)",
            ));
        }
    }
    if let Some(h) = &extras.creep {
        // R 60-1 5.5.1: the creep MPE uses a fixed apportioning factor whatever p_LC is
        // declared; 0.7 (from memory, the value is not legible in the copy read).
        let mpe = class.mpe_intervals((d_max - d_min) / v, 0.7) * v;
        checks.push(Check::at_most(
            "creep over 30 min at the maximum test load",
            h.change(0.0, 1800.0)? / slope,
            0.7 * mpe,
            "N",
            "OIML R 60-1:2021 5.5.1, ≤ 0.7 |MPE|",
        ));
        checks.push(Check::at_most(
            "creep between 20 and 30 min",
            h.change(1200.0, 1800.0)? / slope,
            0.15 * mpe,
            "N",
            "OIML R 60-1:2021 5.5.1, ≤ 0.15 |MPE|",
        ));
    }
    if let Some(dr) = extras.dead_load_return {
        checks.push(Check::at_most(
            "minimum dead load output return DR",
            dr,
            0.5 * v,
            "N",
            "OIML R 60-3:2021 2.1.5.5, DR ≤ 0.5 v (unit from memory)",
        ));
        if let Some(z) = cell.z {
            checks.push(Check::at_most(
                "DR against the declared Z",
                dr,
                (cell.e_max - cell.e_min) / (2.0 * z),
                "N",
                "OIML R 60-1:2021 3.5, Z = (E_max − E_min)/(2 DR)",
            ));
        }
    }
    if let Some((change, dt)) = extras.min_load_temperature_effect {
        crate::check_positive("temperature change", dt.abs(), "K")?;
        let per_step = change.abs() / dt.abs() * class.min_load_temperature_step();
        checks.push(Check::at_most(
            &format!(
                "minimum dead load output change per {} °C",
                class.min_load_temperature_step()
            ),
            per_step,
            cell.p_lc * cell.v_min,
            "N",
            "OIML R 60-3:2021 2.1.4, ≤ p_LC v_min",
        ));
    }
    let mut verdict = ClassVerdict::new(
        STD,
        &format!("{}, n_max = {}", class.letter(), cell.n_max),
        checks,
    );
    verdict.points = points;
    verdict.envelope = envelope;
    verdict.point_unit = "N".to_string();
    Ok(verdict)
}

/// The MPE (N) against load from `d_min` to `d_max` as a step polyline: constant within each
/// Table 4 band, two pairs at each band edge inside the range (the lower band includes its edge,
/// as [`OimlClass::mpe_intervals`] does).
fn mpe_envelope(class: OimlClass, p_lc: f64, v: f64, d_min: f64, d_max: f64) -> Vec<(f64, f64)> {
    let mpe = |load: f64| class.mpe_intervals((load - d_min) / v, p_lc) * v;
    let (e1, e2) = class.band_edges();
    let mut out = vec![(d_min, mpe(d_min))];
    // Above the first edge the 1.0 band applies, above the second the 1.5 band (Table 4).
    for (edge, above) in [(d_min + e1 * v, 1.0), (d_min + e2 * v, 1.5)] {
        if edge > d_min && edge < d_max {
            out.push((edge, mpe(edge)));
            out.push((edge, p_lc * above * v));
        }
    }
    out.push((d_max, mpe(d_max)));
    out
}

#[cfg(test)]
mod tests {
    use super::*;

    /// Band edges outside the tested range add no steps: class D on 100 v has only its first
    /// edge (50 v) inside (R 60-1 Table 4, band values from memory).
    #[test]
    fn envelope_steps_only_inside_the_range() {
        let e = mpe_envelope(OimlClass::D, 0.7, 1.0, 0.0, 100.0);
        assert_eq!(
            e,
            vec![(0.0, 0.35), (50.0, 0.35), (50.0, 0.7), (100.0, 0.7)]
        );
        let e = mpe_envelope(OimlClass::A, 0.5, 1.0, 10.0, 1000.0);
        assert_eq!(e, vec![(10.0, 0.25), (1000.0, 0.25)]);
    }
}
