//! The GUM uncertainty budget (JCGM 100:2008): law of propagation of uncertainty, effective
//! degrees of freedom and expanded uncertainty.
//!
//! - Type A input (4.2): the mean of n observations, u = s/√n, ν = n − 1.
//! - Type B input (4.3): a [`Distribution`], u from its standard deviation, ν = ∞ unless stated.
//! - Sensitivity coefficients (5.1.3): given, or by central differences with a step of one
//!   standard uncertainty each side, c_i ≈ [f(x_i + u_i) − f(x_i − u_i)]/(2u_i) (5.1.3, Note 2,
//!   from memory).
//! - Combined standard uncertainty (5.2.2, eq. 13): u_c² = Σ_i Σ_j c_i c_j u_i u_j r_ij.
//! - Effective degrees of freedom (G.4.1, eq. G.2b, Welch–Satterthwaite): ν_eff = u_c⁴ /
//!   Σ (c_i u_i)⁴/ν_i; the formula assumes uncorrelated inputs.
//! - Expanded uncertainty (6.2, G.3): U = k u_c with k = t_{(1+p)/2}(ν_eff), ν_eff truncated to
//!   the next lower integer as G.4.1 Note 1 describes (so results match the GUM's examples).

use super::distribution::Distribution;
use super::special::coverage_factor;
use crate::PhysicsError;

/// One input quantity of a measurement model.
///
/// ```
/// use gaugebook::{Distribution, Input};
/// let a = Input::type_a("repeated reading", &[10.1, 10.3, 10.2, 10.2])?;
/// assert!((a.estimate - 10.2).abs() < 1e-12 && a.dof == 3.0);
/// let b = Input::type_b("resolution", Distribution::Rectangular { mean: 0.0, half_width: 0.05 })?;
/// assert!(b.dof.is_infinite());
/// # Ok::<(), gaugebook::PhysicsError>(())
/// ```
#[derive(Clone, Debug, PartialEq)]
pub struct Input {
    /// Name shown in the budget.
    pub name: String,
    /// Best estimate x_i.
    pub estimate: f64,
    /// Standard uncertainty u(x_i).
    pub standard_uncertainty: f64,
    /// Degrees of freedom ν_i (∞ for a distribution known exactly).
    pub dof: f64,
    /// The distribution Monte Carlo draws from.
    pub distribution: Distribution,
}

impl Input {
    /// A type A input from repeated observations (JCGM 100, 4.2.1–4.2.3): mean, experimental
    /// standard deviation of the mean s/√n, ν = n − 1; Monte Carlo draws from the scaled and
    /// shifted t (JCGM 101, 6.4.9.7, from memory).
    ///
    /// ```
    /// let i = gaugebook::Input::type_a("r", &[1.0, 2.0, 3.0])?;
    /// assert!((i.standard_uncertainty - (1.0f64 / 3.0).sqrt()).abs() < 1e-15); // s/√n, s = 1
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn type_a(name: &str, observations: &[f64]) -> Result<Input, PhysicsError> {
        let n = observations.len();
        if n < 2 {
            return Err(PhysicsError::NotEnoughData {
                what: format!("a type A evaluation of {name}"),
                needed: 2,
                found: n,
            });
        }
        for &o in observations {
            crate::check_finite(&format!("observation of {name}"), o, "")?;
        }
        let mean = observations.iter().sum::<f64>() / n as f64;
        let var = observations.iter().map(|o| (o - mean).powi(2)).sum::<f64>() / (n - 1) as f64;
        let u = (var / n as f64).sqrt();
        let dof = (n - 1) as f64;
        Ok(Input {
            name: name.to_string(),
            estimate: mean,
            standard_uncertainty: u,
            dof,
            distribution: Distribution::StudentT {
                mean,
                scale: u,
                dof,
            },
        })
    }

    /// A type B input from a distribution, ν = ∞.
    ///
    /// ```
    /// use gaugebook::{Distribution, Input};
    /// let i = Input::type_b("t", Distribution::Triangular { mean: 0.0, half_width: 6f64.sqrt() })?;
    /// assert!((i.standard_uncertainty - 1.0).abs() < 1e-15);
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn type_b(name: &str, distribution: Distribution) -> Result<Input, PhysicsError> {
        let u = distribution.standard_uncertainty()?;
        Ok(Input {
            name: name.to_string(),
            estimate: distribution.mean(),
            standard_uncertainty: u,
            dof: f64::INFINITY,
            distribution,
        })
    }

    /// A normal input with a stated standard uncertainty and degrees of freedom (for
    /// uncertainties quoted on a certificate with their ν). Monte Carlo draws from the normal.
    ///
    /// ```
    /// let i = gaugebook::Input::normal("standard", 50.000623, 25e-6, 18.0)?;
    /// assert_eq!(i.dof, 18.0);
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn normal(name: &str, estimate: f64, u: f64, dof: f64) -> Result<Input, PhysicsError> {
        let mut i = Input::type_b(
            name,
            Distribution::Normal {
                mean: estimate,
                sd: u,
            },
        )?;
        i.dof = Input::check_dof(dof)?;
        Ok(i)
    }

    /// The same input with stated degrees of freedom (GUM G.4.2 for type B: ν ≈ ½ (Δu/u)⁻²).
    ///
    /// ```
    /// use gaugebook::{Distribution, Input};
    /// let i = Input::type_b("x", Distribution::Normal { mean: 0.0, sd: 1.0 })?.with_dof(8.0)?;
    /// assert_eq!(i.dof, 8.0);
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn with_dof(mut self, dof: f64) -> Result<Input, PhysicsError> {
        self.dof = Input::check_dof(dof)?;
        Ok(self)
    }

    fn check_dof(dof: f64) -> Result<f64, PhysicsError> {
        if dof.is_nan() || dof <= 0.0 {
            return Err(PhysicsError::invalid(
                "degrees of freedom",
                dof,
                "a value above 0 (or ∞)",
            ));
        }
        Ok(dof)
    }
}

/// The sample correlation coefficient of paired observations (JCGM 100:2008, 5.2.3, eq. 17,
/// from memory), for simultaneous type A inputs.
///
/// ```
/// let r = gaugebook::sample_correlation(&[1.0, 2.0, 3.0], &[2.0, 4.0, 6.1])?;
/// assert!(r > 0.99);
/// # Ok::<(), gaugebook::PhysicsError>(())
/// ```
pub fn sample_correlation(a: &[f64], b: &[f64]) -> Result<f64, PhysicsError> {
    if a.len() != b.len() {
        return Err(PhysicsError::Mismatch {
            what: "paired observation counts".into(),
            left: a.len().to_string(),
            right: b.len().to_string(),
        });
    }
    if a.len() < 2 {
        return Err(PhysicsError::NotEnoughData {
            what: "a correlation".into(),
            needed: 2,
            found: a.len(),
        });
    }
    let n = a.len() as f64;
    let (ma, mb) = (a.iter().sum::<f64>() / n, b.iter().sum::<f64>() / n);
    let sab: f64 = a.iter().zip(b).map(|(x, y)| (x - ma) * (y - mb)).sum();
    let saa: f64 = a.iter().map(|x| (x - ma).powi(2)).sum();
    let sbb: f64 = b.iter().map(|y| (y - mb).powi(2)).sum();
    Ok(sab / (saa * sbb).sqrt())
}

/// One line of an evaluated budget.
///
/// ```
/// use gaugebook::{Budget, Input};
/// let b = Budget::new(vec![Input::normal("x", 2.0, 0.1, f64::INFINITY)?]);
/// let r = b.evaluate(|x| 3.0 * x[0])?;
/// assert!((r.contributions[0].sensitivity - 3.0).abs() < 1e-12);
/// # Ok::<(), gaugebook::PhysicsError>(())
/// ```
#[derive(Clone, Debug, PartialEq)]
pub struct Contribution {
    /// Input name.
    pub name: String,
    /// Estimate x_i.
    pub estimate: f64,
    /// Standard uncertainty u(x_i).
    pub standard_uncertainty: f64,
    /// Sensitivity coefficient c_i = ∂f/∂x_i.
    pub sensitivity: f64,
    /// Uncertainty contribution u_i(y) = |c_i| u(x_i).
    pub contribution: f64,
    /// Degrees of freedom ν_i.
    pub dof: f64,
}

/// The result of a GUM evaluation.
///
/// ```
/// use gaugebook::{Budget, Input};
/// let b = Budget::new(vec![Input::normal("a", 1.0, 0.1, 5.0)?, Input::normal("b", 2.0, 0.2, 10.0)?]);
/// let r = b.evaluate(|x| x[0] * x[1])?;
/// assert!((r.value - 2.0).abs() < 1e-15 && r.dof_eff > 5.0);
/// # Ok::<(), gaugebook::PhysicsError>(())
/// ```
#[derive(Clone, Debug, PartialEq)]
pub struct GumResult {
    /// Output estimate y = f(x).
    pub value: f64,
    /// Combined standard uncertainty u_c(y).
    pub combined: f64,
    /// Effective degrees of freedom (Welch–Satterthwaite), possibly non-integer or ∞.
    pub dof_eff: f64,
    /// The budget lines.
    pub contributions: Vec<Contribution>,
}

/// An expanded uncertainty at a coverage probability.
///
/// ```
/// use gaugebook::{Budget, Input};
/// let b = Budget::new(vec![Input::normal("a", 1.0, 0.1, 5.0)?, Input::normal("b", 2.0, 0.2, 10.0)?]);
/// let e = b.evaluate(|x| x[0] + x[1])?.expanded(0.95)?;
/// assert!((e.high - e.low - 2.0 * e.expanded).abs() < 1e-15);
/// # Ok::<(), gaugebook::PhysicsError>(())
/// ```
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct Expanded {
    /// Coverage probability p.
    pub p: f64,
    /// Coverage factor k.
    pub k: f64,
    /// Expanded uncertainty U = k u_c.
    pub expanded: f64,
    /// y − U.
    pub low: f64,
    /// y + U.
    pub high: f64,
}

impl GumResult {
    /// Expanded uncertainty at coverage probability p, k from Student's t at ν_eff truncated to
    /// the next lower integer (JCGM 100:2008, G.4.1 Note 1), or the normal when ν_eff = ∞.
    ///
    /// ```
    /// use gaugebook::{Budget, Input};
    /// let b = Budget::new(vec![Input::normal("x", 1.0, 0.5, f64::INFINITY)?]);
    /// let e = b.evaluate(|x| x[0])?.expanded(0.95)?;
    /// assert!((e.k - 1.959963984540054).abs() < 1e-12); // scipy.stats.norm.ppf(0.975), 1.17.1
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn expanded(&self, p: f64) -> Result<Expanded, PhysicsError> {
        let nu = if self.dof_eff.is_finite() {
            self.dof_eff.floor().max(1.0)
        } else {
            f64::INFINITY
        };
        let k = coverage_factor(p, nu)
            .ok_or_else(|| PhysicsError::invalid("coverage probability", p, "a value in (0, 1)"))?;
        let u = k * self.combined;
        Ok(Expanded {
            p,
            k,
            expanded: u,
            low: self.value - u,
            high: self.value + u,
        })
    }
}

/// A set of inputs with their correlations.
///
/// ```
/// use gaugebook::{Budget, Distribution, Input};
/// // JCGM 101:2008, 9.2.2: Y = X1 + X2 + X3 + X4, each standard normal: u(y) = 2.
/// let inputs = (1..=4)
///     .map(|i| Input::type_b(&format!("X{i}"), Distribution::Normal { mean: 0.0, sd: 1.0 }))
///     .collect::<Result<Vec<_>, _>>()?;
/// let r = Budget::new(inputs).evaluate(|x| x.iter().sum())?;
/// assert!((r.combined - 2.0).abs() < 1e-12);
/// # Ok::<(), gaugebook::PhysicsError>(())
/// ```
#[derive(Clone, Debug, PartialEq)]
pub struct Budget {
    inputs: Vec<Input>,
    correlations: Vec<(usize, usize, f64)>,
}

impl Budget {
    /// A budget of uncorrelated inputs.
    ///
    /// ```
    /// use gaugebook::{Budget, Input};
    /// let b = Budget::new(vec![Input::normal("a", 1.0, 0.1, 5.0)?, Input::normal("b", 2.0, 0.2, 10.0)?]);
    /// assert!(!b.has_correlations());
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn new(inputs: Vec<Input>) -> Budget {
        Budget {
            inputs,
            correlations: vec![],
        }
    }

    /// The inputs.
    ///
    /// ```
    /// use gaugebook::{Budget, Input};
    /// let b = Budget::new(vec![Input::normal("a", 1.0, 0.1, 5.0)?, Input::normal("b", 2.0, 0.2, 10.0)?]);
    /// assert_eq!(b.inputs()[1].name, "b");
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn inputs(&self) -> &[Input] {
        &self.inputs
    }

    /// The correlation coefficient r(x_i, x_j) (1 on the diagonal, 0 if not set).
    ///
    /// ```
    /// use gaugebook::{Budget, Input};
    /// let b = Budget::new(vec![Input::normal("a", 1.0, 0.1, 5.0)?, Input::normal("b", 2.0, 0.2, 10.0)?]);
    /// assert_eq!((b.correlation(0, 0), b.correlation(0, 1)), (1.0, 0.0));
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn correlation(&self, i: usize, j: usize) -> f64 {
        if i == j {
            return 1.0;
        }
        self.correlations
            .iter()
            .find(|&&(a, b, _)| (a, b) == (i, j) || (a, b) == (j, i))
            .map_or(0.0, |&(_, _, r)| r)
    }

    /// Sets r(x_i, x_j), −1 ≤ r ≤ 1, i ≠ j.
    ///
    /// ```
    /// use gaugebook::{Budget, Input};
    /// let mut b = Budget::new(vec![Input::normal("a", 1.0, 0.1, f64::INFINITY)?,
    ///                              Input::normal("b", 1.0, 0.1, f64::INFINITY)?]);
    /// b.correlate(0, 1, 1.0)?;
    /// let r = b.evaluate(|x| x[0] - x[1])?;
    /// assert!(r.combined.abs() < 1e-9); // fully correlated inputs cancel
    /// assert!(b.correlate(0, 5, 0.5).is_err());
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn correlate(&mut self, i: usize, j: usize, r: f64) -> Result<(), PhysicsError> {
        let n = self.inputs.len();
        if i >= n || j >= n || i == j {
            return Err(PhysicsError::invalid(
                "correlated input pair",
                format!("({i}, {j})"),
                format!("two different indices below {n}"),
            ));
        }
        if !(-1.0..=1.0).contains(&r) {
            return Err(PhysicsError::invalid(
                "correlation coefficient",
                r,
                "a value in [-1, 1]",
            ));
        }
        self.correlations
            .retain(|&(a, b, _)| !((a, b) == (i, j) || (a, b) == (j, i)));
        self.correlations.push((i, j, r));
        Ok(())
    }

    /// True if any pair is correlated.
    ///
    /// ```
    /// use gaugebook::{Budget, Input};
    /// let b = Budget::new(vec![Input::normal("a", 1.0, 0.1, 5.0)?, Input::normal("b", 2.0, 0.2, 10.0)?]);
    /// let mut b = b;
    /// b.correlate(0, 1, -0.5)?;
    /// assert!(b.has_correlations());
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn has_correlations(&self) -> bool {
        self.correlations.iter().any(|&(_, _, r)| r != 0.0)
    }

    /// Evaluates a scalar model with sensitivities by central differences (step u_i).
    ///
    /// ```
    /// use gaugebook::{Budget, Input};
    /// let b = Budget::new(vec![Input::normal("a", 1.0, 0.1, 5.0)?, Input::normal("b", 2.0, 0.2, 10.0)?]);
    /// let r = b.evaluate(|x| x[0] * x[1])?;
    /// // c = (x₂, x₁) = (2, 1): u = √((2·0.1)² + (1·0.2)²)
    /// assert!((r.combined - 0.08f64.sqrt()).abs() < 1e-12);
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn evaluate(&self, model: impl Fn(&[f64]) -> f64) -> Result<GumResult, PhysicsError> {
        self.evaluate_columns(|cols: &[Vec<f64>]| {
            let n = cols.first().map_or(0, Vec::len);
            let mut row = vec![0.0; cols.len()];
            (0..n)
                .map(|k| {
                    for (r, c) in row.iter_mut().zip(cols) {
                        *r = c[k];
                    }
                    model(&row)
                })
                .collect()
        })
    }

    /// Evaluates a column model (the same one Monte Carlo uses): all 2N + 1 evaluation points
    /// go to the model in one call, one column per input.
    ///
    /// ```
    /// use gaugebook::{Budget, Input};
    /// let b = Budget::new(vec![Input::normal("x", 2.0, 0.1, f64::INFINITY)?]);
    /// let r = b.evaluate_columns(|c: &[Vec<f64>]| c[0].iter().map(|x| x * x).collect())?;
    /// assert!((r.combined - 0.4).abs() < 1e-12); // |2x| u for x = 2
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn evaluate_columns(
        &self,
        model: impl Fn(&[Vec<f64>]) -> Vec<f64>,
    ) -> Result<GumResult, PhysicsError> {
        let n = self.inputs.len();
        if n == 0 {
            return Err(PhysicsError::NotEnoughData {
                what: "an uncertainty budget".into(),
                needed: 1,
                found: 0,
            });
        }
        let steps: Vec<f64> = self
            .inputs
            .iter()
            .map(|i| {
                if i.standard_uncertainty > 0.0 {
                    i.standard_uncertainty
                } else {
                    1e-6 * i.estimate.abs().max(1.0)
                }
            })
            .collect();
        let mut cols: Vec<Vec<f64>> = self
            .inputs
            .iter()
            .map(|i| vec![i.estimate; 2 * n + 1])
            .collect();
        for (j, &h) in steps.iter().enumerate() {
            cols[j][1 + 2 * j] += h;
            cols[j][2 + 2 * j] -= h;
        }
        let y = model(&cols);
        if y.len() != 2 * n + 1 {
            return Err(PhysicsError::Mismatch {
                what: "model output length".into(),
                left: format!("{} rows in", 2 * n + 1),
                right: format!("{} values out", y.len()),
            });
        }
        let c: Vec<f64> = (0..n)
            .map(|j| (y[1 + 2 * j] - y[2 + 2 * j]) / (2.0 * steps[j]))
            .collect();
        self.combine(y[0], &c)
    }

    /// Combines given sensitivity coefficients (when ∂f/∂x_i are known analytically).
    ///
    /// ```
    /// use gaugebook::{Budget, Input};
    /// let b = Budget::new(vec![Input::normal("a", 1.0, 0.3, 10.0)?, Input::normal("b", 1.0, 0.4, 20.0)?]);
    /// let r = b.evaluate_with_sensitivities(2.0, &[1.0, 1.0])?;
    /// assert!((r.combined - 0.5).abs() < 1e-15);
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn evaluate_with_sensitivities(
        &self,
        value: f64,
        sensitivities: &[f64],
    ) -> Result<GumResult, PhysicsError> {
        if sensitivities.len() != self.inputs.len() {
            return Err(PhysicsError::Mismatch {
                what: "sensitivity and input counts".into(),
                left: sensitivities.len().to_string(),
                right: self.inputs.len().to_string(),
            });
        }
        self.combine(value, sensitivities)
    }

    fn combine(&self, value: f64, c: &[f64]) -> Result<GumResult, PhysicsError> {
        crate::check_finite("model value at the estimates", value, "")?;
        let n = self.inputs.len();
        let cu: Vec<f64> = c
            .iter()
            .zip(&self.inputs)
            .map(|(ci, i)| ci * i.standard_uncertainty)
            .collect();
        let mut var = 0.0;
        for i in 0..n {
            for j in 0..n {
                var += cu[i] * cu[j] * self.correlation(i, j);
            }
        }
        let combined = var.max(0.0).sqrt();
        let denom: f64 = cu
            .iter()
            .zip(&self.inputs)
            .filter(|(_, i)| i.dof.is_finite())
            .map(|(v, i)| v.powi(4) / i.dof)
            .sum();
        let dof_eff = if denom > 0.0 {
            combined.powi(4) / denom
        } else {
            f64::INFINITY
        };
        let contributions = self
            .inputs
            .iter()
            .zip(c)
            .zip(&cu)
            .map(|((i, &ci), &v)| Contribution {
                name: i.name.clone(),
                estimate: i.estimate,
                standard_uncertainty: i.standard_uncertainty,
                sensitivity: ci,
                contribution: v.abs(),
                dof: i.dof,
            })
            .collect();
        if c.iter().any(|v| !v.is_finite()) {
            return Err(PhysicsError::Numerical {
                what: "sensitivity coefficients".into(),
                reason: "the model is not finite within one standard uncertainty of the estimates"
                    .into(),
            });
        }
        Ok(GumResult {
            value,
            combined,
            dof_eff,
            contributions,
        })
    }
}
