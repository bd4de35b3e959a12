//! ASTM E74-18, *Standard Practices for Calibration and Verification for Force-Measuring
//! Instruments*: calibration equation, standard deviation, lower limit factor and the class AA
//! and class A loading ranges.
//!
//! As recalled (every value "from memory"; confirm against the published text):
//! - the calibration equation is a polynomial of degree 1 to 5 in the applied force, fitted by
//!   least squares to the deflections (E74-18 §8, from memory);
//! - the standard deviation s of the deflections about the curve, converted to force by the
//!   local slope, uses n − m − 1 degrees of freedom for a degree-m polynomial (from memory);
//! - LLF = 2.4 s (E74-13a defined it from s alone; E74-18 combines s with the resolution and
//!   the reference-standard contributions in quadrature before multiplying by 2.4 — pass those
//!   as `other_components` to follow -18, from memory);
//! - class AA loading range: lower limit 2000 × LLF, and not below 2000 × resolution; class A:
//!   400 × LLF and 400 × resolution; the upper limit is the largest calibration force (from
//!   memory).

use super::verdict::{Check, ClassVerdict};
use crate::{CalibrationRun, Fit, FitModel, PhysicsError};

const STD: &str = "ASTM E74-18";

/// The E74 evaluation of a calibration run.
///
/// ```
/// use gaugebook::{CalibrationRun, Direction, LoadKind, evaluate_e74};
/// let mut run = CalibrationRun::new(LoadKind::Force, "mV/V");
/// let f: Vec<f64> = (1..=10).map(|i| i as f64 * 1000.0).collect();
/// let noise = [1e-5, -1e-5, 2e-5, 0.0, -2e-5, 1e-5, 0.0, -1e-5, 1e-5, 0.0];
/// let y: Vec<f64> = f.iter().zip(&noise).map(|(f, n)| 2e-4 * f + n).collect();
/// run.push_series(&f, &y, Direction::Ascending, 0.0)?;
/// let r = evaluate_e74(&run, 2, 0.1, &[])?;
/// assert!((r.llf - 2.4 * r.s).abs() < 1e-12);
/// assert!((r.class_a_lower - 400.0 * r.llf).abs() < 1e-9 || r.class_a_lower == 40.0);
/// # Ok::<(), gaugebook::PhysicsError>(())
/// ```
#[derive(Clone, Debug, PartialEq)]
pub struct E74Result {
    /// The calibration curve (indication against force).
    pub fit: Fit,
    /// Standard deviation of the deflections about the curve, in force units.
    pub s: f64,
    /// Lower limit factor, force units.
    pub llf: f64,
    /// Lower limit of the class AA loading range.
    pub class_aa_lower: f64,
    /// Lower limit of the class A loading range.
    pub class_a_lower: f64,
    /// Upper limit of both ranges: the largest calibration force.
    pub upper: f64,
}

impl E74Result {
    /// The class verdict: is the class AA (or A) range non-empty?
    ///
    /// ```
    /// use gaugebook::{CalibrationRun, Direction, LoadKind, evaluate_e74};
    /// let mut run = CalibrationRun::new(LoadKind::Force, "mV/V");
    /// let f: Vec<f64> = (1..=10).map(|i| i as f64 * 1000.0).collect();
    /// let y: Vec<f64> = f.iter().enumerate().map(|(i, f)| 2e-4 * f + if i % 2 == 0 { 1e-3 } else { -1e-3 }).collect();
    /// run.push_series(&f, &y, Direction::Ascending, 0.0)?;
    /// let r = evaluate_e74(&run, 1, 0.1, &[])?;
    /// assert!(!r.verdict(true).passed); // noisy: no class AA range
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn verdict(&self, class_aa: bool) -> ClassVerdict {
        let (lower, name, factor) = if class_aa {
            (self.class_aa_lower, "AA", 2000.0)
        } else {
            (self.class_a_lower, "A", 400.0)
        };
        ClassVerdict::new(
            STD,
            name,
            vec![Check::at_most(
                &format!("class {name} lower limit ({factor} × LLF) within the calibrated range"),
                lower,
                self.upper,
                "N",
                "ASTM E74-18, loading range (from memory)",
            )],
        )
    }
}

/// Fits a degree-`degree` curve to every point of the run and derives s, LLF and the ranges.
/// `resolution` in force units; `other_components` are further standard uncertainties in force
/// units combined with s in quadrature before the 2.4 factor (E74-18 practice, from memory).
///
/// ```
/// use gaugebook::{CalibrationRun, Direction, LoadKind, evaluate_e74};
/// let mut run = CalibrationRun::new(LoadKind::Force, "mV/V");
/// run.push_series(&[1.0, 2.0, 3.0], &[1.0, 2.0, 3.0], Direction::Ascending, 0.0)?;
/// assert!(evaluate_e74(&run, 2, 0.0, &[]).is_err()); // resolution must be above 0
/// # Ok::<(), gaugebook::PhysicsError>(())
/// ```
pub fn evaluate_e74(
    run: &CalibrationRun,
    degree: usize,
    resolution: f64,
    other_components: &[f64],
) -> Result<E74Result, PhysicsError> {
    if !(1..=5).contains(&degree) {
        return Err(PhysicsError::invalid(
            "E74 polynomial degree",
            degree,
            "a degree from 1 to 5",
        ));
    }
    crate::check_positive("resolution", resolution, "N")?;
    let (x, y) = run.xy(None);
    let fit = Fit::new(&x, &y, FitModel::Polynomial(degree))?;
    let ss: f64 = fit
        .residuals()
        .iter()
        .zip(&x)
        .map(|(r, &xi)| (r / fit.slope(xi)).powi(2))
        .sum();
    let s = (ss / fit.dof() as f64).sqrt();
    let others: f64 = other_components.iter().map(|u| u * u).sum();
    // 2.4: ASTM E74 lower limit factor multiplier (from memory).
    let llf = 2.4 * (s * s + others).sqrt();
    let upper = x.iter().copied().fold(f64::NEG_INFINITY, f64::max);
    Ok(E74Result {
        s,
        llf,
        // 2000 and 400: ASTM E74 class AA and class A range factors (from memory).
        class_aa_lower: (2000.0 * llf).max(2000.0 * resolution),
        class_a_lower: (400.0 * llf).max(400.0 * resolution),
        upper,
        fit,
    })
}
