//! Propagation of distributions by Monte Carlo (JCGM 101:2008).
//!
//! The model takes one column per input (M draws each) and returns M output values, so a
//! million trials are one call and per-sample work stays in compiled code. Draws come from
//! xoshiro256++ seeded explicitly, so a recorded result reruns to the same numbers. Correlated
//! inputs must be normal: they are drawn from the multivariate Gaussian through the Cholesky
//! factor of their covariance (JCGM 101:2008, 6.4.8, from memory).
//!
//! Coverage intervals (7.7): probabilistically symmetric — the (1 − p)/2 and (1 + p)/2
//! quantiles of the sorted outputs — and shortest, the narrowest window of q = ⌊pM + ½⌋ sorted
//! values. Validation of the GUM result (8.2): with u(y) rounded to `ndig` significant digits as
//! c × 10^l, δ = ½ × 10^l; the GUM interval y ± U_p is validated if both end-point differences
//! from the Monte Carlo interval are at most δ.

// Index loops mirror the Cholesky algebra.
#![allow(clippy::needless_range_loop)]

use super::distribution::Distribution;
use super::gum::{Budget, GumResult};
use crate::PhysicsError;
use rand::SeedableRng;
use rand_distr::{Distribution as _, StandardNormal};
use rand_xoshiro::Xoshiro256PlusPlus;

/// Which coverage interval.
///
/// ```
/// use gaugebook::IntervalKind;
/// assert_ne!(IntervalKind::Symmetric, IntervalKind::Shortest);
/// ```
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub enum IntervalKind {
    /// Probabilistically symmetric (equal tail probabilities), JCGM 101:2008, 7.7.1.
    Symmetric,
    /// Shortest interval of the stated probability, JCGM 101:2008, 7.7.2.
    Shortest,
}

/// A Monte Carlo run's settings.
///
/// ```
/// use gaugebook::{Budget, Distribution, Input, MonteCarlo};
/// let b = Budget::new(vec![Input::type_b("x", Distribution::Rectangular { mean: 0.0, half_width: 1.0 })?]);
/// let r = MonteCarlo::new(100_000, 7).run(&b, |c: &[Vec<f64>]| c[0].clone())?;
/// assert!((r.standard_uncertainty - 1.0 / 3f64.sqrt()).abs() < 0.005);
/// # Ok::<(), gaugebook::PhysicsError>(())
/// ```
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub struct MonteCarlo {
    /// Number of trials M.
    pub trials: usize,
    /// Seed of the xoshiro256++ stream.
    pub seed: u64,
}

/// The distribution of the output as M sorted values.
///
/// ```
/// use gaugebook::{Budget, Distribution, Input, MonteCarlo};
/// let b = Budget::new(vec![Input::type_b("x", Distribution::Normal { mean: 1.0, sd: 0.1 })?]);
/// let r = MonteCarlo::new(10_000, 2).run(&b, |c: &[Vec<f64>]| c[0].iter().map(|x| x * x).collect())?;
/// assert!((r.value - 1.01).abs() < 0.01); // E[x²] = 1 + 0.01
/// # Ok::<(), gaugebook::PhysicsError>(())
/// ```
#[derive(Clone, Debug, PartialEq)]
pub struct McResult {
    /// Mean of the output values (the estimate, JCGM 101 7.6).
    pub value: f64,
    /// Standard deviation of the output values (standard uncertainty).
    pub standard_uncertainty: f64,
    sorted: Vec<f64>,
}

/// The JCGM 101 §8 comparison of a GUM interval with a Monte Carlo interval.
///
/// ```
/// use gaugebook::{Budget, Distribution, Input, IntervalKind, MonteCarlo};
/// let b = Budget::new(vec![Input::type_b("x", Distribution::Normal { mean: 0.0, sd: 1.0 })?]);
/// let gum = b.evaluate(|x| x[0])?;
/// let mc = MonteCarlo::new(100_000, 4).run(&b, |c: &[Vec<f64>]| c[0].clone())?;
/// let v = mc.validate(&gum, 0.95, 1, IntervalKind::Symmetric)?;
/// assert_eq!(v.delta, 0.5);
/// # Ok::<(), gaugebook::PhysicsError>(())
/// ```
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct Validation {
    /// Numerical tolerance δ.
    pub delta: f64,
    /// |y − U_p − y_low|.
    pub d_low: f64,
    /// |y + U_p − y_high|.
    pub d_high: f64,
    /// Both differences at most δ.
    pub validated: bool,
}

impl MonteCarlo {
    /// M trials from a seed. JCGM 101 7.2.2 suggests M = 10⁶ for a 95 % interval.
    ///
    /// ```
    /// let m = gaugebook::MonteCarlo::new(1_000_000, 1);
    /// assert_eq!((m.trials, m.seed), (1_000_000, 1));
    /// ```
    pub fn new(trials: usize, seed: u64) -> MonteCarlo {
        MonteCarlo { trials, seed }
    }

    /// Draws the input columns (one per input, `trials` values each).
    ///
    /// ```
    /// use gaugebook::{Budget, Distribution, Input, MonteCarlo};
    /// let b = Budget::new(vec![Input::type_b("x", Distribution::Normal { mean: 5.0, sd: 0.0 })?]);
    /// let cols = MonteCarlo::new(10, 1).draw(&b)?;
    /// assert_eq!(cols[0], vec![5.0; 10]);
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn draw(&self, budget: &Budget) -> Result<Vec<Vec<f64>>, PhysicsError> {
        if self.trials < 2 {
            return Err(PhysicsError::NotEnoughData {
                what: "Monte Carlo trials".into(),
                needed: 2,
                found: self.trials,
            });
        }
        let mut rng = Xoshiro256PlusPlus::seed_from_u64(self.seed);
        let inputs = budget.inputs();
        let n = inputs.len();
        let correlated: Vec<usize> = (0..n)
            .filter(|&i| (0..n).any(|j| j != i && budget.correlation(i, j) != 0.0))
            .collect();
        for &i in &correlated {
            if !matches!(inputs[i].distribution, Distribution::Normal { .. }) {
                return Err(PhysicsError::invalid(
                    format!("distribution of correlated input {}", inputs[i].name),
                    "not normal",
                    "normal distributions for correlated inputs (JCGM 101 6.4.8)",
                ));
            }
        }
        let mut cols = vec![vec![0.0; self.trials]; n];
        for i in 0..n {
            if !correlated.contains(&i) {
                inputs[i].distribution.sample_into(&mut rng, &mut cols[i]);
            }
        }
        if !correlated.is_empty() {
            let m = correlated.len();
            let sd: Vec<f64> = correlated
                .iter()
                .map(|&i| inputs[i].standard_uncertainty)
                .collect();
            let mut cov = vec![vec![0.0; m]; m];
            for a in 0..m {
                for b in 0..m {
                    cov[a][b] = sd[a] * sd[b] * budget.correlation(correlated[a], correlated[b]);
                }
            }
            let l = cholesky(&cov)?;
            let mut z = vec![0.0; m];
            for k in 0..self.trials {
                for v in z.iter_mut() {
                    *v = StandardNormal.sample(&mut rng);
                }
                for a in 0..m {
                    let s: f64 = (0..=a).map(|b| l[a][b] * z[b]).sum();
                    cols[correlated[a]][k] = inputs[correlated[a]].estimate + s;
                }
            }
        }
        Ok(cols)
    }

    /// Runs the model over the drawn columns and summarises the output.
    ///
    /// ```
    /// use gaugebook::{Budget, Distribution, Input, MonteCarlo};
    /// let b = Budget::new(vec![Input::type_b("x", Distribution::Normal { mean: 1.0, sd: 0.1 })?]);
    /// let r = MonteCarlo::new(10_000, 2).run(&b, |c: &[Vec<f64>]| c[0].iter().map(|x| x * x).collect())?;
    /// assert_eq!(r.sorted_values().len(), 10_000);
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn run(
        &self,
        budget: &Budget,
        model: impl Fn(&[Vec<f64>]) -> Vec<f64>,
    ) -> Result<McResult, PhysicsError> {
        let cols = self.draw(budget)?;
        let mut y = model(&cols);
        if y.len() != self.trials {
            return Err(PhysicsError::Mismatch {
                what: "Monte Carlo model output length".into(),
                left: format!("{} trials", self.trials),
                right: format!("{} values", y.len()),
            });
        }
        if let Some(k) = crate::error::first_non_finite(&y) {
            return Err(PhysicsError::Numerical {
                what: "Monte Carlo model".into(),
                reason: format!("trial {k} gave a value that is not finite"),
            });
        }
        let m = y.len() as f64;
        let mean = y.iter().sum::<f64>() / m;
        let var = y.iter().map(|v| (v - mean).powi(2)).sum::<f64>() / (m - 1.0);
        y.sort_by(f64::total_cmp);
        Ok(McResult {
            value: mean,
            standard_uncertainty: var.sqrt(),
            sorted: y,
        })
    }
}

impl McResult {
    /// The sorted output values (for histograms).
    ///
    /// ```
    /// use gaugebook::{Budget, Distribution, Input, MonteCarlo};
    /// let b = Budget::new(vec![Input::type_b("x", Distribution::Normal { mean: 1.0, sd: 0.1 })?]);
    /// let r = MonteCarlo::new(10_000, 2).run(&b, |c: &[Vec<f64>]| c[0].iter().map(|x| x * x).collect())?;
    /// let v = r.sorted_values();
    /// assert!(v.windows(2).all(|w| w[0] <= w[1]));
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn sorted_values(&self) -> &[f64] {
        &self.sorted
    }

    /// The coverage interval of probability p.
    ///
    /// ```
    /// use gaugebook::{Budget, Distribution, Input, IntervalKind, MonteCarlo};
    /// let b = Budget::new(vec![Input::type_b("x", Distribution::Rectangular { mean: 0.0, half_width: 1.0 })?]);
    /// let r = MonteCarlo::new(200_000, 3).run(&b, |c: &[Vec<f64>]| c[0].clone())?;
    /// let (lo, hi) = r.coverage_interval(0.9, IntervalKind::Symmetric)?;
    /// assert!((lo + 0.9).abs() < 0.01 && (hi - 0.9).abs() < 0.01);
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn coverage_interval(
        &self,
        p: f64,
        kind: IntervalKind,
    ) -> Result<(f64, f64), PhysicsError> {
        if !(p > 0.0 && p < 1.0) {
            return Err(PhysicsError::invalid(
                "coverage probability",
                p,
                "a value in (0, 1)",
            ));
        }
        let m = self.sorted.len();
        // q = pM if an integer, else ⌊pM + ½⌋ (JCGM 101:2008, 7.7.1).
        let q = ((p * m as f64 + 0.5).floor() as usize).clamp(1, m);
        if q >= m {
            return Err(PhysicsError::NotEnoughData {
                what: format!("a {p} coverage interval"),
                needed: (1.0 / (1.0 - p)).ceil() as usize + 1,
                found: m,
            });
        }
        // 1-based: [y_(r), y_(r+q)]; symmetric r = (M − q)/2 rounded, clamped to ≥ 1.
        match kind {
            IntervalKind::Symmetric => {
                let r = (((m - q) as f64 / 2.0).round() as usize).max(1);
                Ok((self.sorted[r - 1], self.sorted[(r + q - 1).min(m - 1)]))
            }
            IntervalKind::Shortest => {
                let (mut best, mut br) = (f64::INFINITY, 1);
                for r in 1..=(m - q) {
                    let w = self.sorted[r + q - 1] - self.sorted[r - 1];
                    if w < best {
                        best = w;
                        br = r;
                    }
                }
                Ok((self.sorted[br - 1], self.sorted[br + q - 1]))
            }
        }
    }

    /// The JCGM 101:2008 §8 validation of a GUM result at coverage probability p, with u(y)
    /// judged to `ndig` significant decimal digits (usually 1 or 2).
    ///
    /// ```
    /// use gaugebook::{Budget, Distribution, Input, IntervalKind, MonteCarlo};
    /// let b = Budget::new((0..4).map(|i| Input::type_b(&format!("X{i}"),
    ///     Distribution::Normal { mean: 0.0, sd: 1.0 })).collect::<Result<_, _>>()?);
    /// let gum = b.evaluate(|x| x.iter().sum())?;
    /// let mc = MonteCarlo::new(200_000, 1).run(&b, |c: &[Vec<f64>]| {
    ///     (0..c[0].len()).map(|k| c.iter().map(|col| col[k]).sum()).collect() })?;
    /// assert!(mc.validate(&gum, 0.95, 2, IntervalKind::Symmetric)?.validated);
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn validate(
        &self,
        gum: &GumResult,
        p: f64,
        ndig: u32,
        kind: IntervalKind,
    ) -> Result<Validation, PhysicsError> {
        if ndig == 0 {
            return Err(PhysicsError::invalid("significant digits", 0, "1 or more"));
        }
        let e = gum.expanded(p)?;
        let (lo, hi) = self.coverage_interval(p, kind)?;
        let u = gum.combined;
        let delta = if u > 0.0 {
            let l = u.log10().floor() as i32 - (ndig as i32 - 1);
            0.5 * 10f64.powi(l)
        } else {
            0.0
        };
        let d_low = (e.low - lo).abs();
        let d_high = (e.high - hi).abs();
        Ok(Validation {
            delta,
            d_low,
            d_high,
            validated: d_low <= delta && d_high <= delta,
        })
    }
}

fn cholesky(a: &[Vec<f64>]) -> Result<Vec<Vec<f64>>, PhysicsError> {
    let n = a.len();
    let mut l = vec![vec![0.0; n]; n];
    for i in 0..n {
        for j in 0..=i {
            let s: f64 = (0..j).map(|k| l[i][k] * l[j][k]).sum();
            if i == j {
                let d = a[i][i] - s;
                if d < -1e-12 * a[i][i].abs() {
                    return Err(PhysicsError::Numerical {
                        what: "correlated Monte Carlo draws".into(),
                        reason: "the correlation matrix is not positive semidefinite".into(),
                    });
                }
                l[i][j] = d.max(0.0).sqrt();
            } else {
                l[i][j] = if l[j][j] > 0.0 {
                    (a[i][j] - s) / l[j][j]
                } else {
                    0.0
                };
            }
        }
    }
    Ok(l)
}
