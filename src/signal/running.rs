//! Statistics and a least-squares line gathered block by block, so a log read in blocks needs
//! no second pass and no whole column in memory for them.
//!
//! Within a block one pass gathers the sums of `x − k` and `(x − k)²` about the block's first
//! sample `k`, in four lanes the processor can run side by side; the shift keeps the
//! cancellation in `Σ(x−k)² − (Σ(x−k))²/n` to a few units of round-off, since a block's samples
//! lie within a few standard deviations of `k`. Blocks are then merged with the pairwise update
//! of the mean and of the sum of squared deviations (T. F. Chan, G. H. Golub and R. J. LeVeque,
//! "Updating formulae and a pairwise algorithm for computing sample variances", Stanford
//! STAN-CS-79-773, 1979, from memory), which is exact in exact arithmetic for any split.

use super::stats::Summary;
use crate::PhysicsError;

/// Count, extremes, mean and spread of samples added block by block; [`summary`] gives the
/// same figures as [`summarize`](crate::summarize) of all the samples at once (to round-off).
///
/// [`summary`]: RunningSummary::summary
///
/// ```
/// let mut s = gaugebook::RunningSummary::new();
/// s.add(&[1.0, 2.0]);
/// s.add(&[3.0, 4.0]);
/// let all = s.summary()?;
/// assert_eq!((all.count, all.min, all.max, all.mean), (4, 1.0, 4.0, 2.5));
/// assert!((all.std_dev - 1.2909944487358056).abs() < 1e-15); // numpy.std(x, ddof=1)
/// # Ok::<(), gaugebook::PhysicsError>(())
/// ```
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct RunningSummary {
    n: usize,
    mean: f64,
    /// Sum of squared deviations from the mean.
    m2: f64,
    min: f64,
    max: f64,
    /// Whether a NaN or infinite sample was added (the figures are then meaningless).
    non_finite: bool,
}

impl Default for RunningSummary {
    fn default() -> Self {
        RunningSummary::new()
    }
}

/// The shifted sums of one block: (n, Σ(x−k), Σ(x−k)², min, max), `k` its first sample.
fn block_sums(x: &[f64], k: f64) -> (f64, f64, f64, f64, f64) {
    let (mut s1, mut s2) = ([0.0f64; 4], [0.0f64; 4]);
    let (mut lo, mut hi) = ([f64::INFINITY; 4], [f64::NEG_INFINITY; 4]);
    let chunks = x.chunks_exact(4);
    let tail = chunks.remainder();
    for c in chunks {
        for j in 0..4 {
            let d = c[j] - k;
            s1[j] += d;
            s2[j] += d * d;
            lo[j] = lo[j].min(c[j]);
            hi[j] = hi[j].max(c[j]);
        }
    }
    for (j, &v) in tail.iter().enumerate() {
        let d = v - k;
        s1[j] += d;
        s2[j] += d * d;
        lo[j] = lo[j].min(v);
        hi[j] = hi[j].max(v);
    }
    let t1 = (s1[0] + s1[1]) + (s1[2] + s1[3]);
    let t2 = (s2[0] + s2[1]) + (s2[2] + s2[3]);
    let min = lo.iter().copied().fold(f64::INFINITY, f64::min);
    let max = hi.iter().copied().fold(f64::NEG_INFINITY, f64::max);
    (x.len() as f64, t1, t2, min, max)
}

/// Merges a block's mean and sum of squared deviations into running ones (Chan et al.).
fn merge(n_a: f64, mean_a: f64, m2_a: f64, n_b: f64, mean_b: f64, m2_b: f64) -> (f64, f64) {
    let n = n_a + n_b;
    let d = mean_b - mean_a;
    (mean_a + d * n_b / n, m2_a + m2_b + d * d * n_a * n_b / n)
}

impl RunningSummary {
    /// No samples yet.
    ///
    /// ```
    /// assert_eq!(gaugebook::RunningSummary::new().count(), 0);
    /// ```
    pub fn new() -> RunningSummary {
        RunningSummary {
            n: 0,
            mean: 0.0,
            m2: 0.0,
            min: f64::INFINITY,
            max: f64::NEG_INFINITY,
            non_finite: false,
        }
    }

    /// Adds a block of samples.
    ///
    /// ```
    /// let mut s = gaugebook::RunningSummary::new();
    /// s.add(&[5.0, 7.0]);
    /// s.add(&[]);
    /// assert_eq!((s.count(), s.mean()), (2, 6.0));
    /// ```
    pub fn add(&mut self, x: &[f64]) {
        let Some(&k) = x.first() else {
            return;
        };
        let (nb, t1, t2, min, max) = block_sums(x, k);
        if !(t1.is_finite() && t2.is_finite()) {
            self.non_finite = true;
        }
        let mean_b = k + t1 / nb;
        let m2_b = (t2 - t1 * t1 / nb).max(0.0);
        let (mean, m2) = merge(self.n as f64, self.mean, self.m2, nb, mean_b, m2_b);
        self.mean = mean;
        self.m2 = m2;
        self.n += x.len();
        self.min = self.min.min(min);
        self.max = self.max.max(max);
    }

    /// Merges the samples another summary has seen (as if added here after these).
    ///
    /// ```
    /// use gaugebook::RunningSummary;
    /// let (mut a, mut b) = (RunningSummary::new(), RunningSummary::new());
    /// a.add(&[1.0, 2.0]);
    /// b.add(&[3.0, 4.0]);
    /// a.merge(&b);
    /// assert_eq!((a.count(), a.mean(), a.max()), (4, 2.5, 4.0));
    /// ```
    pub fn merge(&mut self, other: &RunningSummary) {
        if other.n == 0 {
            return;
        }
        let (mean, m2) = merge(
            self.n as f64,
            self.mean,
            self.m2,
            other.n as f64,
            other.mean,
            other.m2,
        );
        self.mean = mean;
        self.m2 = m2;
        self.n += other.n;
        self.min = self.min.min(other.min);
        self.max = self.max.max(other.max);
        self.non_finite |= other.non_finite;
    }

    /// Samples added so far.
    ///
    /// ```
    /// let mut s = gaugebook::RunningSummary::new();
    /// s.add(&[1.0; 10]);
    /// assert_eq!(s.count(), 10);
    /// ```
    pub fn count(&self) -> usize {
        self.n
    }

    /// The mean so far (NaN before any sample).
    ///
    /// ```
    /// let mut s = gaugebook::RunningSummary::new();
    /// assert!(s.mean().is_nan());
    /// s.add(&[2.0, 4.0]);
    /// assert_eq!(s.mean(), 3.0);
    /// ```
    pub fn mean(&self) -> f64 {
        if self.n == 0 { f64::NAN } else { self.mean }
    }

    /// The smallest sample so far (+∞ before any).
    ///
    /// ```
    /// let mut s = gaugebook::RunningSummary::new();
    /// s.add(&[2.0, -4.0]);
    /// assert_eq!(s.min(), -4.0);
    /// ```
    pub fn min(&self) -> f64 {
        self.min
    }

    /// The largest sample so far (−∞ before any).
    ///
    /// ```
    /// let mut s = gaugebook::RunningSummary::new();
    /// s.add(&[2.0, -4.0]);
    /// assert_eq!(s.max(), 2.0);
    /// ```
    pub fn max(&self) -> f64 {
        self.max
    }

    /// The figures of every sample added (see [`Summary`]). Errors as
    /// [`summarize`](crate::summarize): fewer than 2 samples, or a NaN or infinite one.
    ///
    /// ```
    /// let mut s = gaugebook::RunningSummary::new();
    /// s.add(&[1.0]);
    /// assert!(s.summary().is_err());
    /// s.add(&[f64::NAN]);
    /// assert!(s.summary().is_err());
    /// ```
    pub fn summary(&self) -> Result<Summary, PhysicsError> {
        if self.n < 2 {
            return Err(PhysicsError::NotEnoughData {
                what: "statistics with a standard deviation".to_string(),
                needed: 2,
                found: self.n,
            });
        }
        if self.non_finite {
            return Err(PhysicsError::invalid(
                "a sample of the signal",
                "NaN or infinity",
                "a finite value",
            ));
        }
        let n = self.n as f64;
        Ok(Summary {
            count: self.n,
            min: self.min,
            max: self.max,
            mean: self.mean,
            std_dev: (self.m2 / (n - 1.0)).max(0.0).sqrt(),
            // Σx²/n = m2/n + mean²
            rms: (self.m2 / n + self.mean * self.mean).sqrt(),
            peak_to_peak: self.max - self.min,
        })
    }
}

/// A least-squares straight line `y = a + b·x` with its r² and RMS residual, from pairs added
/// block by block (co-moments merged as [`RunningSummary`] merges moments).
///
/// ```
/// let mut l = gaugebook::RunningLine::new();
/// l.add(&[0.0, 1.0], &[3.0, 5.0])?;
/// l.add(&[2.0, 3.0], &[7.0, 9.0])?;
/// let f = l.fit()?;
/// assert!((f.intercept - 3.0).abs() < 1e-12 && (f.slope - 2.0).abs() < 1e-12);
/// assert!((f.r2 - 1.0).abs() < 1e-12 && f.rmse < 1e-12);
/// # Ok::<(), gaugebook::PhysicsError>(())
/// ```
#[derive(Clone, Copy, Debug, Default, PartialEq)]
pub struct RunningLine {
    n: f64,
    mx: f64,
    my: f64,
    sxx: f64,
    syy: f64,
    sxy: f64,
}

/// A fitted straight line (see [`RunningLine::fit`]).
///
/// ```
/// let f = gaugebook::LineFit { count: 2, intercept: 1.0, slope: 2.0, r2: 1.0, rmse: 0.0 };
/// assert_eq!(f.intercept + f.slope * 3.0, 7.0);
/// ```
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct LineFit {
    /// Pairs fitted.
    pub count: usize,
    /// `a`, the value of y at x = 0.
    pub intercept: f64,
    /// `b`, the change of y per unit x.
    pub slope: f64,
    /// Coefficient of determination, 1 − SS_res/SS_tot.
    pub r2: f64,
    /// Root mean square of the residuals, √(SS_res/n) (numpy's `sqrt(mean(resid**2))`).
    pub rmse: f64,
}

impl RunningLine {
    /// No pairs yet.
    ///
    /// ```
    /// assert!(gaugebook::RunningLine::new().fit().is_err());
    /// ```
    pub fn new() -> RunningLine {
        RunningLine::default()
    }

    /// Adds a block of pairs; `x` and `y` must have one length.
    ///
    /// ```
    /// let mut l = gaugebook::RunningLine::new();
    /// assert!(l.add(&[1.0, 2.0], &[1.0]).is_err());
    /// ```
    pub fn add(&mut self, x: &[f64], y: &[f64]) -> Result<(), PhysicsError> {
        if x.len() != y.len() {
            return Err(PhysicsError::invalid(
                "the y samples of a line fit",
                format!("{} samples", y.len()),
                format!("{} samples, as many as x", x.len()),
            ));
        }
        let (Some(&kx), Some(&ky)) = (x.first(), y.first()) else {
            return Ok(());
        };
        // Σdx, Σdy, Σdx², Σdy², Σdx·dy about the block's first pair, in four lanes.
        let mut acc = [[0.0f64; 4]; 5];
        let n4 = x.len() / 4 * 4;
        let mut i = 0;
        while i < n4 {
            for j in 0..4 {
                let dx = x[i + j] - kx;
                let dy = y[i + j] - ky;
                acc[0][j] += dx;
                acc[1][j] += dy;
                acc[2][j] += dx * dx;
                acc[3][j] += dy * dy;
                acc[4][j] += dx * dy;
            }
            i += 4;
        }
        for (j, (&xv, &yv)) in x[n4..].iter().zip(&y[n4..]).enumerate() {
            let dx = xv - kx;
            let dy = yv - ky;
            acc[0][j] += dx;
            acc[1][j] += dy;
            acc[2][j] += dx * dx;
            acc[3][j] += dy * dy;
            acc[4][j] += dx * dy;
        }
        let t = acc.map(|a| (a[0] + a[1]) + (a[2] + a[3]));
        let nb = x.len() as f64;
        let (mx_b, my_b) = (kx + t[0] / nb, ky + t[1] / nb);
        let sxx_b = t[2] - t[0] * t[0] / nb;
        let syy_b = t[3] - t[1] * t[1] / nb;
        let sxy_b = t[4] - t[0] * t[1] / nb;
        let n = self.n + nb;
        let (dx, dy) = (mx_b - self.mx, my_b - self.my);
        let w = self.n * nb / n;
        self.sxx += sxx_b + dx * dx * w;
        self.syy += syy_b + dy * dy * w;
        self.sxy += sxy_b + dx * dy * w;
        self.mx += dx * nb / n;
        self.my += dy * nb / n;
        self.n = n;
        Ok(())
    }

    /// The line through the pairs so far. Errors: fewer than 2 pairs, x constant, or a NaN or
    /// infinite value among them.
    ///
    /// ```
    /// let mut l = gaugebook::RunningLine::new();
    /// l.add(&[1.0, 1.0], &[2.0, 3.0])?;
    /// assert!(l.fit().is_err()); // x constant: no slope
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn fit(&self) -> Result<LineFit, PhysicsError> {
        if self.n < 2.0 {
            return Err(PhysicsError::NotEnoughData {
                what: "a straight-line fit".to_string(),
                needed: 2,
                found: self.n as usize,
            });
        }
        if ![self.sxx, self.syy, self.sxy, self.mx, self.my]
            .iter()
            .all(|v| v.is_finite())
        {
            return Err(PhysicsError::invalid(
                "a pair of the line fit",
                "NaN or infinity",
                "finite values",
            ));
        }
        if self.sxx <= 0.0 {
            return Err(PhysicsError::invalid(
                "the x samples of a line fit",
                "all equal",
                "at least two different values",
            ));
        }
        let slope = self.sxy / self.sxx;
        let intercept = self.my - slope * self.mx;
        // SS_res = Syy − Sxy²/Sxx, never below zero after round-off.
        let ss_res = (self.syy - self.sxy * slope).max(0.0);
        let r2 = if self.syy > 0.0 {
            1.0 - ss_res / self.syy
        } else {
            1.0
        };
        Ok(LineFit {
            count: self.n as usize,
            intercept,
            slope,
            r2,
            rmse: (ss_res / self.n).sqrt(),
        })
    }

    /// [`fit`](RunningLine::fit) with r² and the RMS residual from `ss_res`, the sum of squared
    /// residuals Σ(y − a − b·x)² about the fitted line, found by a second pass over the pairs.
    /// The one-pass figure Syy − Sxy²/Sxx loses about −log10(1 − r²) digits to cancellation (5
    /// for r² = 0.99999); a second pass does not.
    ///
    /// ```
    /// let mut l = gaugebook::RunningLine::new();
    /// let (x, y) = ([0.0, 1.0, 2.0], [1.0, 2.5, 5.0]);
    /// l.add(&x, &y)?;
    /// let f = l.fit()?;
    /// let ss: f64 = x.iter().zip(&y).map(|(x, y)| (y - f.intercept - f.slope * x).powi(2)).sum();
    /// let g = l.fit_with_residuals(ss)?;
    /// assert!((g.rmse - (ss / 3.0).sqrt()).abs() < 1e-15);
    /// assert!((g.r2 - f.r2).abs() < 1e-12);
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn fit_with_residuals(&self, ss_res: f64) -> Result<LineFit, PhysicsError> {
        let mut f = self.fit()?;
        if !(ss_res.is_finite() && ss_res >= 0.0) {
            return Err(PhysicsError::invalid(
                "the sum of squared residuals",
                ss_res,
                "a finite value of zero or more",
            ));
        }
        f.r2 = if self.syy > 0.0 {
            1.0 - ss_res / self.syy
        } else {
            1.0
        };
        f.rmse = (ss_res / self.n).sqrt();
        Ok(f)
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    /// Blocks of uneven sizes, so merges of every shape are exercised.
    fn in_blocks(x: &[f64]) -> RunningSummary {
        let mut s = RunningSummary::new();
        let mut i = 0;
        let mut size = 1;
        while i < x.len() {
            let j = (i + size).min(x.len());
            s.add(&x[i..j]);
            i = j;
            size = size * 3 % 1001 + 1;
        }
        s
    }

    #[test]
    fn the_integers_one_to_n_have_their_closed_form_mean_and_variance() {
        // Mean (n+1)/2 and sample variance n(n+1)/12 of 1..n (a sum of squares identity), with a
        // large offset added to test the shifted sums.
        for offset in [0.0, 1e9] {
            let n = 100_001usize;
            let x: Vec<f64> = (1..=n).map(|i| i as f64 + offset).collect();
            let s = in_blocks(&x).summary().unwrap();
            let nf = n as f64;
            assert_eq!(s.count, n);
            assert!((s.mean - ((nf + 1.0) / 2.0 + offset)).abs() < 1e-6);
            let var = nf * (nf + 1.0) / 12.0;
            assert!(
                (s.std_dev * s.std_dev / var - 1.0).abs() < 1e-12,
                "offset {offset}"
            );
            assert_eq!((s.min, s.max), (1.0 + offset, nf + offset));
        }
    }

    #[test]
    fn agrees_with_the_whole_record_summary() {
        let x: Vec<f64> = (0..50_000)
            .map(|i| 300.0 + 40.0 * (i as f64 * 0.0137).sin() + (i % 7) as f64 * 0.01)
            .collect();
        let whole = crate::summarize(&x).unwrap();
        let run = in_blocks(&x).summary().unwrap();
        for (a, b) in [
            (whole.mean, run.mean),
            (whole.std_dev, run.std_dev),
            (whole.rms, run.rms),
        ] {
            assert!((a - b).abs() <= 1e-12 * a.abs(), "{a} against {b}");
        }
        assert_eq!((whole.min, whole.max), (run.min, run.max));
    }

    #[test]
    fn anscombes_first_set_gives_the_published_line() {
        // F. J. Anscombe, "Graphs in statistical analysis", The American Statistician 27 (1973)
        // 17-21, data set I: y = 3.00 + 0.500 x, r = 0.816 (figures from memory; the line of
        // all four sets is 3.0001 + 0.5001 x to four decimals).
        let x = [10.0, 8.0, 13.0, 9.0, 11.0, 14.0, 6.0, 4.0, 12.0, 7.0, 5.0];
        let y = [
            8.04, 6.95, 7.58, 8.81, 8.33, 9.96, 7.24, 4.26, 10.84, 4.82, 5.68,
        ];
        let mut l = RunningLine::new();
        l.add(&x[..3], &y[..3]).unwrap();
        l.add(&x[3..4], &y[3..4]).unwrap();
        l.add(&x[4..], &y[4..]).unwrap();
        let f = l.fit().unwrap();
        assert!((f.intercept - 3.0001).abs() < 5e-5, "{}", f.intercept);
        assert!((f.slope - 0.5001).abs() < 5e-5, "{}", f.slope);
        assert!((f.r2.sqrt() - 0.816).abs() < 5e-4, "{}", f.r2);
        assert_eq!(f.count, 11);
    }
}
