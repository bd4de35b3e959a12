//! Least-squares calibration curves: through zero, linear, and polynomials up to degree 5.
//!
//! Why centre, scale and QR: a load axis in newtons (10⁵ … 10⁶) raised to the fifth power spans
//! thirty decades, and the normal equations square the condition number. The abscissa is mapped
//! to t = (x − c)/s on [−1, 1] (only scaled, c = 0, for a line through zero, which centring would
//! break), the design matrix in powers of t is factorised by Householder QR (Golub & Van Loan,
//! *Matrix Computations*, 4th ed., §5.1–5.3, from memory), and the coefficients and their
//! covariance are mapped back to powers of x exactly (binomial expansion). Evaluation uses the
//! t basis. This reproduces the NIST StRD certified values for Norris, Pontius, NoInt1/2 and
//! Wampler1–5 (tests/calib.rs).

// Index loops mirror the matrix algebra (Golub & Van Loan's notation) and read better than
// iterator chains over rows and columns at once.
#![allow(clippy::needless_range_loop)]

use crate::PhysicsError;

/// The form of a calibration curve.
///
/// ```
/// use gaugebook::FitModel;
/// assert_eq!(FitModel::Polynomial(3).parameters(), 4);
/// assert_eq!(FitModel::ThroughZero.parameters(), 1);
/// ```
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub enum FitModel {
    /// y = b₁ x.
    ThroughZero,
    /// y = b₀ + b₁ x.
    Linear,
    /// y = b₀ + b₁ x + … + b_d x^d, 1 ≤ d ≤ 5.
    Polynomial(usize),
}

impl FitModel {
    /// Highest power of x.
    ///
    /// ```
    /// assert_eq!(gaugebook::FitModel::ThroughZero.degree(), 1);
    /// ```
    pub fn degree(self) -> usize {
        match self {
            FitModel::ThroughZero | FitModel::Linear => 1,
            FitModel::Polynomial(d) => d,
        }
    }

    /// Number of fitted parameters p.
    ///
    /// ```
    /// assert_eq!(gaugebook::FitModel::Linear.parameters(), 2);
    /// ```
    pub fn parameters(self) -> usize {
        match self {
            FitModel::ThroughZero => 1,
            m => m.degree() + 1,
        }
    }

    fn has_intercept(self) -> bool {
        !matches!(self, FitModel::ThroughZero)
    }
}

/// A fitted calibration curve y(x) with its statistics.
///
/// `coefficients[k]` multiplies x^k (for [`FitModel::ThroughZero`], `coefficients = [0, b₁]` and
/// `std_errors = [0, u(b₁)]` so the indexing is the same for every model).
///
/// ```
/// use gaugebook::{Fit, FitModel};
/// let x = [0.0, 1.0, 2.0, 3.0];
/// let y = [1.0, 3.0, 5.0, 7.0];
/// let f = Fit::new(&x, &y, FitModel::Linear)?;
/// assert!((f.coefficients()[1] - 2.0).abs() < 1e-12);
/// assert!((f.inverse(5.0)? - 2.0).abs() < 1e-12);
/// # Ok::<(), gaugebook::PhysicsError>(())
/// ```
#[derive(Clone, Debug, PartialEq)]
pub struct Fit {
    model: FitModel,
    centre: f64,
    scale: f64,
    /// Coefficients in powers of t = (x − centre)/scale (t basis, used for evaluation).
    t_coefficients: Vec<f64>,
    coefficients: Vec<f64>,
    std_errors: Vec<f64>,
    covariance: Vec<Vec<f64>>,
    residuals: Vec<f64>,
    residual_sd: f64,
    dof: usize,
    r_squared: f64,
    x_min: f64,
    x_max: f64,
}

impl Fit {
    /// Fits `model` to the points (x, y) by least squares.
    ///
    /// Errors: lengths differ, a value is not finite, fewer points than parameters + 1 (no
    /// degrees of freedom left for the residual standard deviation), degree outside 1–5, or the
    /// abscissae are too few distinct values for the degree (rank-deficient design).
    ///
    /// ```
    /// use gaugebook::{Fit, FitModel};
    /// let e = Fit::new(&[0.0, 1.0], &[0.0, 1.0], FitModel::Linear).unwrap_err();
    /// assert!(e.to_string().contains("needs at least 3"));
    /// ```
    pub fn new(x: &[f64], y: &[f64], model: FitModel) -> Result<Fit, PhysicsError> {
        if x.len() != y.len() {
            return Err(PhysicsError::Mismatch {
                what: "abscissa and ordinate lengths".into(),
                left: format!("{} x values", x.len()),
                right: format!("{} y values", y.len()),
            });
        }
        let d = model.degree();
        if !(1..=5).contains(&d) {
            return Err(PhysicsError::invalid(
                "polynomial degree",
                d,
                "a degree from 1 to 5",
            ));
        }
        let p = model.parameters();
        let n = x.len();
        if n < p + 1 {
            return Err(PhysicsError::NotEnoughData {
                what: format!("a fit with {p} parameters"),
                needed: p + 1,
                found: n,
            });
        }
        for (i, (&xi, &yi)) in x.iter().zip(y).enumerate() {
            crate::check_finite(&format!("x at point {i}"), xi, "")?;
            crate::check_finite(&format!("y at point {i}"), yi, "")?;
        }
        let x_min = x.iter().copied().fold(f64::INFINITY, f64::min);
        let x_max = x.iter().copied().fold(f64::NEG_INFINITY, f64::max);
        let (centre, scale) = if model.has_intercept() {
            let c = 0.5 * (x_min + x_max);
            (c, 0.5 * (x_max - x_min))
        } else {
            (0.0, x_min.abs().max(x_max.abs()))
        };
        if scale <= 0.0 || !scale.is_finite() {
            return Err(PhysicsError::invalid(
                "abscissae",
                format!("all equal to {x_min}"),
                "at least two distinct x values",
            ));
        }
        // Powers of t present in the model: 0..=d, or just 1 for a line through zero.
        let powers: Vec<usize> = if model.has_intercept() {
            (0..=d).collect()
        } else {
            vec![1]
        };
        let mut a: Vec<Vec<f64>> = (0..n)
            .map(|i| {
                let t = (x[i] - centre) / scale;
                powers.iter().map(|&k| t.powi(k as i32)).collect()
            })
            .collect();
        let mut b = y.to_vec();
        let r = householder_qr(&mut a, &mut b, p)?;
        let coef_t = back_substitute(&r, &b[..p]);
        // Residuals from the original data, not from the transformed right-hand side, so they
        // are exactly y − ŷ.
        let t_coefficients = expand(&powers, &coef_t, d);
        let fitted: Vec<f64> = x
            .iter()
            .map(|&xi| horner(&t_coefficients, (xi - centre) / scale))
            .collect();
        let residuals: Vec<f64> = y.iter().zip(&fitted).map(|(yi, fi)| yi - fi).collect();
        let dof = n - p;
        let sse: f64 = residuals.iter().map(|e| e * e).sum();
        let residual_sd = (sse / dof as f64).sqrt();
        // R²: centred total sum of squares with an intercept; uncentred (Σy²) through zero, the
        // convention of the NIST StRD NoInt1/NoInt2 certified values.
        let sst = if model.has_intercept() {
            let mean = y.iter().sum::<f64>() / n as f64;
            y.iter().map(|yi| (yi - mean).powi(2)).sum::<f64>()
        } else {
            y.iter().map(|yi| yi * yi).sum::<f64>()
        };
        let r_squared = if sst > 0.0 { 1.0 - sse / sst } else { 1.0 };
        // Covariance in the t basis: s² R⁻¹ R⁻ᵀ.
        let rinv = invert_upper(&r);
        let mut cov_t = vec![vec![0.0; p]; p];
        for i in 0..p {
            for j in 0..p {
                cov_t[i][j] =
                    (0..p).map(|k| rinv[i][k] * rinv[j][k]).sum::<f64>() * residual_sd.powi(2);
            }
        }
        // Map t-basis parameters to x-basis coefficients: x-coefficient m = Σ_k T[m][k] θ_k.
        let tmat = t_to_x(&powers, d, centre, scale);
        let coefficients: Vec<f64> = (0..=d)
            .map(|m| (0..p).map(|k| tmat[m][k] * coef_t[k]).sum())
            .collect();
        let mut covariance = vec![vec![0.0; d + 1]; d + 1];
        for m in 0..=d {
            for l in 0..=d {
                let mut s = 0.0;
                for i in 0..p {
                    for j in 0..p {
                        s += tmat[m][i] * cov_t[i][j] * tmat[l][j];
                    }
                }
                covariance[m][l] = s;
            }
        }
        let std_errors = (0..=d).map(|m| covariance[m][m].max(0.0).sqrt()).collect();
        Ok(Fit {
            model,
            centre,
            scale,
            t_coefficients,
            coefficients,
            std_errors,
            covariance,
            residuals,
            residual_sd,
            dof,
            r_squared,
            x_min,
            x_max,
        })
    }

    /// The model fitted.
    ///
    /// ```
    /// use gaugebook::{Fit, FitModel};
    /// let f = Fit::new(&[0.0, 1.0, 2.0, 3.0], &[0.1, 1.0, 2.1, 2.9], FitModel::Linear)?;
    /// assert_eq!(f.model(), FitModel::Linear);
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn model(&self) -> FitModel {
        self.model
    }

    /// Coefficients of 1, x, x², … (index = power).
    ///
    /// ```
    /// use gaugebook::{Fit, FitModel};
    /// let f = Fit::new(&[0.0, 1.0, 2.0, 3.0], &[0.1, 1.0, 2.1, 2.9], FitModel::Linear)?;
    /// assert_eq!(f.coefficients().len(), 2);
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn coefficients(&self) -> &[f64] {
        &self.coefficients
    }

    /// Standard errors of the coefficients (index = power), from s²(AᵀA)⁻¹.
    ///
    /// ```
    /// use gaugebook::{Fit, FitModel};
    /// let f = Fit::new(&[0.0, 1.0, 2.0, 3.0], &[0.1, 1.0, 2.1, 2.9], FitModel::Linear)?;
    /// assert!(f.std_errors().iter().all(|&s| s > 0.0));
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn std_errors(&self) -> &[f64] {
        &self.std_errors
    }

    /// Covariance matrix of the coefficients (index = power).
    ///
    /// ```
    /// use gaugebook::{Fit, FitModel};
    /// let f = Fit::new(&[0.0, 1.0, 2.0, 3.0], &[0.1, 1.0, 2.1, 2.9], FitModel::Linear)?;
    /// let c = f.covariance();
    /// assert!((c[1][1].sqrt() - f.std_errors()[1]).abs() < 1e-15);
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn covariance(&self) -> &[Vec<f64>] {
        &self.covariance
    }

    /// Residuals y − ŷ in the order of the input points.
    ///
    /// ```
    /// use gaugebook::{Fit, FitModel};
    /// let f = Fit::new(&[0.0, 1.0, 2.0, 3.0], &[0.1, 1.0, 2.1, 2.9], FitModel::Linear)?;
    /// // Least squares with an intercept: the residuals sum to zero.
    /// assert!(f.residuals().iter().sum::<f64>().abs() < 1e-12);
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn residuals(&self) -> &[f64] {
        &self.residuals
    }

    /// Residual standard deviation s = √(Σe²/(n − p)).
    ///
    /// ```
    /// use gaugebook::{Fit, FitModel};
    /// let f = Fit::new(&[0.0, 1.0, 2.0, 3.0], &[0.1, 1.0, 2.1, 2.9], FitModel::Linear)?;
    /// let sse: f64 = f.residuals().iter().map(|e| e * e).sum();
    /// assert!((f.residual_sd() - (sse / 2.0).sqrt()).abs() < 1e-15);
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn residual_sd(&self) -> f64 {
        self.residual_sd
    }

    /// Degrees of freedom of the residual, n − p.
    ///
    /// ```
    /// use gaugebook::{Fit, FitModel};
    /// let f = Fit::new(&[0.0, 1.0, 2.0, 3.0], &[0.1, 1.0, 2.1, 2.9], FitModel::Linear)?;
    /// assert_eq!(f.dof(), 2); // n − p = 4 − 2
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn dof(&self) -> usize {
        self.dof
    }

    /// Coefficient of determination (uncentred through zero, as NIST StRD certifies it).
    ///
    /// ```
    /// use gaugebook::{Fit, FitModel};
    /// let f = Fit::new(&[0.0, 1.0, 2.0, 3.0], &[0.1, 1.0, 2.1, 2.9], FitModel::Linear)?;
    /// assert!(f.r_squared() > 0.99 && f.r_squared() <= 1.0);
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn r_squared(&self) -> f64 {
        self.r_squared
    }

    /// The range of x the curve was fitted over.
    ///
    /// ```
    /// use gaugebook::{Fit, FitModel};
    /// let f = Fit::new(&[0.0, 1.0, 2.0, 3.0], &[0.1, 1.0, 2.1, 2.9], FitModel::Linear)?;
    /// assert_eq!(f.x_range(), (0.0, 3.0));
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn x_range(&self) -> (f64, f64) {
        (self.x_min, self.x_max)
    }

    /// The curve's value at x.
    ///
    /// ```
    /// use gaugebook::{Fit, FitModel};
    /// let f = Fit::new(&[1.0, 2.0, 3.0, 4.0], &[1.0, 4.0, 9.0, 16.0], FitModel::Polynomial(2))?;
    /// assert!((f.eval(5.0) - 25.0).abs() < 1e-9);
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn eval(&self, x: f64) -> f64 {
        horner(&self.t_coefficients, (x - self.centre) / self.scale)
    }

    /// The slope dy/dx at x.
    ///
    /// ```
    /// use gaugebook::{Fit, FitModel};
    /// let f = Fit::new(&[1.0, 2.0, 3.0, 4.0], &[1.0, 4.0, 9.0, 16.0], FitModel::Polynomial(2))?;
    /// assert!((f.slope(3.0) - 6.0).abs() < 1e-9);
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn slope(&self, x: f64) -> f64 {
        let t = (x - self.centre) / self.scale;
        let d: Vec<f64> = self
            .t_coefficients
            .iter()
            .enumerate()
            .skip(1)
            .map(|(k, c)| k as f64 * c)
            .collect();
        horner(&d, t) / self.scale
    }

    /// The load x whose curve value is `y` (indication → load): Newton's method on the
    /// polynomial, guarded by bisection inside the fitted range widened by 10 % each side. The
    /// curve must be monotonic there (a calibration curve is); otherwise an error names the
    /// range searched.
    ///
    /// ```
    /// use gaugebook::{Fit, FitModel};
    /// let f = Fit::new(&[0.0, 1.0, 2.0, 3.0], &[0.0, 1.0, 2.0, 3.0], FitModel::Linear)?;
    /// assert!(f.inverse(50.0).is_err());
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn inverse(&self, y: f64) -> Result<f64, PhysicsError> {
        crate::check_finite("indication to invert", y, "")?;
        let span = self.x_max - self.x_min;
        let (mut lo, mut hi) = (self.x_min - 0.1 * span, self.x_max + 0.1 * span);
        let (flo, fhi) = (self.eval(lo) - y, self.eval(hi) - y);
        if flo == 0.0 {
            return Ok(lo);
        }
        if fhi == 0.0 {
            return Ok(hi);
        }
        if flo.signum() == fhi.signum() {
            return Err(PhysicsError::NoSolution {
                what: format!("the load giving indication {y}"),
                reason: format!(
                    "the curve runs from {} to {} over loads {lo} … {hi} (fitted range ±10 %)",
                    self.eval(lo),
                    self.eval(hi)
                ),
            });
        }
        let rising = fhi > 0.0;
        let mut x = lo + (hi - lo) * (y - self.eval(lo)) / (self.eval(hi) - self.eval(lo));
        for _ in 0..200 {
            let f = self.eval(x) - y;
            if f == 0.0 {
                return Ok(x);
            }
            if (f > 0.0) == rising {
                hi = x;
            } else {
                lo = x;
            }
            let d = self.slope(x);
            let newton = x - f / d;
            x = if d != 0.0 && newton > lo && newton < hi {
                newton
            } else {
                0.5 * (lo + hi)
            };
            if (hi - lo).abs() <= 4.0 * f64::EPSILON * x.abs().max(span)
                || (f / d).abs() <= 2.0 * f64::EPSILON * x.abs().max(span * 1e-3)
            {
                return Ok(x);
            }
        }
        Ok(x)
    }
}

impl Fit {
    /// The load for an indication and its standard uncertainty, from the curve's coefficient
    /// covariance and the indication's own standard uncertainty `u_y`, to first order (GUM
    /// JCGM 100:2008 5.2.2 with correlated coefficients): with g_k = x^k the sensitivities of
    /// the curve value to its coefficients, u²(x) = (gᵀ V g + u_y²) / (dy/dx)².
    ///
    /// For a straight line and `u_y = s/√m` (the mean of m readings) this is the classical
    /// calibration (inverse prediction) formula u²(x) = s²/b² · (1/m + 1/n + (y − ȳ)²/(b² Sxx))
    /// (Draper & Smith, *Applied Regression Analysis*, 3rd ed., 1998, §3.2, from memory).
    ///
    /// ```
    /// use gaugebook::{Fit, FitModel};
    /// let f = Fit::new(&[0.0, 1.0, 2.0, 3.0, 4.0], &[0.1, 0.9, 2.1, 2.9, 4.1], FitModel::Linear)?;
    /// let (x, u) = f.inverse_with_uncertainty(2.0, 0.0)?;
    /// assert!((f.eval(x) - 2.0).abs() < 1e-12 && u > 0.0);
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn inverse_with_uncertainty(&self, y: f64, u_y: f64) -> Result<(f64, f64), PhysicsError> {
        if !(u_y.is_finite() && u_y >= 0.0) {
            return Err(PhysicsError::invalid(
                "indication uncertainty",
                u_y,
                "a finite value of 0 or more",
            ));
        }
        let x = self.inverse(y)?;
        let d = self.coefficients.len();
        let g: Vec<f64> = (0..d).map(|k| x.powi(k as i32)).collect();
        let mut var = u_y * u_y;
        for i in 0..d {
            for j in 0..d {
                var += g[i] * self.covariance[i][j] * g[j];
            }
        }
        let slope = self.slope(x);
        Ok((x, var.max(0.0).sqrt() / slope.abs()))
    }
}

/// Householder QR of the n×p matrix `a` (rows), applied to `b` as well; returns R (p×p).
fn householder_qr(
    a: &mut [Vec<f64>],
    b: &mut [f64],
    p: usize,
) -> Result<Vec<Vec<f64>>, PhysicsError> {
    let n = a.len();
    let mut first_norm = 0.0_f64;
    for k in 0..p {
        let norm = (k..n).map(|i| a[i][k] * a[i][k]).sum::<f64>().sqrt();
        if k == 0 {
            first_norm = norm.max(1.0);
        }
        // A column that vanishes after the earlier reflections means the x values cannot carry
        // this degree (too few distinct abscissae).
        if norm <= 1e-13 * first_norm * (n as f64) {
            return Err(PhysicsError::Numerical {
                what: "least-squares fit".into(),
                reason: format!(
                    "design matrix is rank deficient at power {k}: too few distinct x values for the degree"
                ),
            });
        }
        let alpha = if a[k][k] > 0.0 { -norm } else { norm };
        let mut v: Vec<f64> = (k..n).map(|i| a[i][k]).collect();
        v[0] -= alpha;
        let vnorm2: f64 = v.iter().map(|e| e * e).sum();
        for j in k..p {
            let dot: f64 = (k..n).map(|i| v[i - k] * a[i][j]).sum();
            let f = 2.0 * dot / vnorm2;
            for i in k..n {
                a[i][j] -= f * v[i - k];
            }
        }
        let dot: f64 = (k..n).map(|i| v[i - k] * b[i]).sum();
        let f = 2.0 * dot / vnorm2;
        for i in k..n {
            b[i] -= f * v[i - k];
        }
    }
    Ok((0..p)
        .map(|i| (0..p).map(|j| if j >= i { a[i][j] } else { 0.0 }).collect())
        .collect())
}

fn back_substitute(r: &[Vec<f64>], b: &[f64]) -> Vec<f64> {
    let p = b.len();
    let mut x = vec![0.0; p];
    for i in (0..p).rev() {
        let s: f64 = (i + 1..p).map(|j| r[i][j] * x[j]).sum();
        x[i] = (b[i] - s) / r[i][i];
    }
    x
}

fn invert_upper(r: &[Vec<f64>]) -> Vec<Vec<f64>> {
    let p = r.len();
    let mut inv = vec![vec![0.0; p]; p];
    for col in 0..p {
        let e: Vec<f64> = (0..p).map(|i| if i == col { 1.0 } else { 0.0 }).collect();
        let x = back_substitute(r, &e);
        for i in 0..p {
            inv[i][col] = x[i];
        }
    }
    inv
}

/// Full t-basis coefficient vector (index = power of t) from the fitted powers.
fn expand(powers: &[usize], coef: &[f64], d: usize) -> Vec<f64> {
    let mut c = vec![0.0; d + 1];
    for (&k, &v) in powers.iter().zip(coef) {
        c[k] = v;
    }
    c
}

/// T[m][k]: contribution of t-parameter k (power powers[k]) to the coefficient of x^m, from
/// t^j = ((x − c)/s)^j = Σ_m C(j, m) x^m (−c)^(j−m) / s^j.
fn t_to_x(powers: &[usize], d: usize, c: f64, s: f64) -> Vec<Vec<f64>> {
    let mut t = vec![vec![0.0; powers.len()]; d + 1];
    for (k, &j) in powers.iter().enumerate() {
        for m in 0..=j {
            t[m][k] = binomial(j, m) * (-c).powi((j - m) as i32) / s.powi(j as i32);
        }
    }
    t
}

fn binomial(n: usize, k: usize) -> f64 {
    (0..k).fold(1.0, |acc, i| acc * (n - i) as f64 / (i + 1) as f64)
}

fn horner(c: &[f64], t: f64) -> f64 {
    c.iter().rev().fold(0.0, |acc, &ci| acc * t + ci)
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn exact_cubic_round_trip() {
        // Closed-form identity: data on an exact cubic are fitted exactly and inverted exactly.
        let x: Vec<f64> = (0..10).map(|i| i as f64 * 1000.0).collect();
        let y: Vec<f64> = x
            .iter()
            .map(|&v| 0.1 + 2e-4 * v - 3e-9 * v * v + 1e-14 * v.powi(3))
            .collect();
        let f = Fit::new(&x, &y, FitModel::Polynomial(3)).unwrap();
        for &xi in &x[1..] {
            let back = f.inverse(f.eval(xi)).unwrap();
            assert!((back - xi).abs() < 1e-8 * 9000.0, "{back} vs {xi}");
        }
        assert!((f.coefficients()[3] - 1e-14).abs() < 1e-20);
    }

    #[test]
    fn rank_deficient() {
        let e = Fit::new(
            &[1.0, 1.0, 2.0, 2.0],
            &[0.0, 0.0, 1.0, 1.0],
            FitModel::Polynomial(2),
        );
        assert!(matches!(e, Err(PhysicsError::Numerical { .. })), "{e:?}");
    }

    #[test]
    fn degree_six_rejected() {
        let x: Vec<f64> = (0..10).map(f64::from).collect();
        assert!(Fit::new(&x, &x, FitModel::Polynomial(6)).is_err());
    }
}
