//! Descriptive statistics of a channel or of windows of it: minimum, maximum, mean, sample
//! standard deviation (ddof = 1), RMS and peak-to-peak, and the count of rising level crossings.
//!
//! Sums use numpy's pairwise summation (blocks of 128 with eight running partial sums, halves
//! recursively above that; numpy's `pairwise_sum`), whose error grows as log n rather than n,
//! and which the processor can vectorise. The variance is the corrected two-pass formula
//! (Chan, Golub & LeVeque, "Algorithms for computing the sample variance", *Am. Stat.* 37
//! (1983), eq. 1.7, from memory): Σ(x−x̄)² − (Σ(x−x̄))²/n, over n − 1, stable for signals with
//! a large offset where the one-pass Σx² − n·x̄² cancels catastrophically.

use crate::PhysicsError;

/// Statistics of one run of samples.
///
/// ```
/// let s = gaugebook::summarize(&[1.0, 2.0, 3.0, 4.0])?;
/// assert_eq!((s.count, s.min, s.max, s.mean, s.peak_to_peak), (4, 1.0, 4.0, 2.5, 3.0));
/// assert!((s.std_dev - 1.2909944487358056).abs() < 1e-15); // numpy.std(x, ddof=1)
/// assert!((s.rms - 7.5f64.sqrt()).abs() < 1e-15);
/// # Ok::<(), gaugebook::PhysicsError>(())
/// ```
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct Summary {
    /// Number of samples.
    pub count: usize,
    /// Smallest sample.
    pub min: f64,
    /// Largest sample.
    pub max: f64,
    /// Arithmetic mean.
    pub mean: f64,
    /// Sample standard deviation, divisor n − 1 (numpy's `std(ddof=1)`).
    pub std_dev: f64,
    /// Root mean square, √(Σx²/n).
    pub rms: f64,
    /// max − min.
    pub peak_to_peak: f64,
}

/// Statistics of `x` (see [`Summary`]). Errors: fewer than 2 samples (the standard deviation
/// needs two), or a NaN or infinite sample (its index is named).
///
/// ```
/// assert!(gaugebook::summarize(&[1.0]).is_err());
/// assert!(gaugebook::summarize(&[1.0, f64::NAN]).is_err());
/// ```
pub fn summarize(x: &[f64]) -> Result<Summary, PhysicsError> {
    if x.len() < 2 {
        return Err(PhysicsError::NotEnoughData {
            what: "statistics with a standard deviation".to_string(),
            needed: 2,
            found: x.len(),
        });
    }
    let n = x.len() as f64;
    let first = first_pass(x);
    let (sum, sum_sq, min, max) = (first.sum, first.sum_sq, first.min, first.max);
    if !(sum.is_finite() && sum_sq.is_finite())
        && let Some(i) = crate::error::first_non_finite(x)
    {
        return Err(PhysicsError::invalid(
            format!("sample {i} of the signal"),
            x[i],
            "a finite value",
        ));
    }
    let mean = sum / n;
    let (dev, dev_sq) = pairwise2(x, |v| v - mean, |v| (v - mean) * (v - mean));
    let var = (dev_sq - dev * dev / n) / (n - 1.0);
    Ok(Summary {
        count: x.len(),
        min,
        max,
        mean,
        std_dev: var.max(0.0).sqrt(),
        rms: (sum_sq / n).sqrt(),
        peak_to_peak: max - min,
    })
}

/// Statistics of consecutive, non-overlapping windows of `window` samples; a last, shorter window
/// is included when it has at least 2 samples. Errors as for [`summarize`], and a window below 2.
///
/// ```
/// let w = gaugebook::summarize_windows(&[1.0, 3.0, 10.0, 20.0, 5.0], 2)?;
/// assert_eq!(w.len(), 2); // the lone last sample makes no window
/// assert_eq!((w[0].mean, w[1].mean), (2.0, 15.0));
/// # Ok::<(), gaugebook::PhysicsError>(())
/// ```
pub fn summarize_windows(x: &[f64], window: usize) -> Result<Vec<Summary>, PhysicsError> {
    if window < 2 {
        return Err(PhysicsError::invalid(
            "statistics window",
            format!("{window} samples"),
            "2 samples or more",
        ));
    }
    let mut out = Vec::with_capacity(x.len() / window + 1);
    for (k, chunk) in x.chunks(window).enumerate() {
        if chunk.len() < 2 {
            break;
        }
        out.push(summarize(chunk).map_err(|e| match e {
            PhysicsError::InvalidParameter {
                found, expected, ..
            } => PhysicsError::InvalidParameter {
                name: format!("a sample in window {k} (from sample {})", k * window),
                found,
                expected,
            },
            other => other,
        })?);
    }
    if out.is_empty() {
        return Err(PhysicsError::NotEnoughData {
            what: "windowed statistics".to_string(),
            needed: 2,
            found: x.len(),
        });
    }
    Ok(out)
}

/// Number of rising crossings of `level`: samples i ≥ 1 with x[i−1] < level ≤ x[i] (no
/// hysteresis; the definition of ../shared/bench/peer_reanalysis.py). NaN samples never count.
///
/// ```
/// assert_eq!(gaugebook::rising_crossings(&[0.0, 1.0, 0.0, 0.5, 2.0], 0.5), 2);
/// assert_eq!(gaugebook::rising_crossings(&[0.0, 1.0, 0.0, 0.4, 2.0], 0.5), 2);
/// assert_eq!(gaugebook::rising_crossings(&[1.0, 1.0, 0.0], 0.5), 0);
/// ```
pub fn rising_crossings(x: &[f64], level: f64) -> usize {
    // Branch-free count so the loop vectorises on long channels.
    x.windows(2)
        .map(|w| usize::from(w[0] < level && level <= w[1]))
        .sum()
}

/// [`rising_crossings`] of a record held as consecutive blocks, counted across the joins too
/// (the last sample of one block and the first of the next), without joining them.
///
/// ```
/// let blocks: [&[f64]; 2] = [&[0.0, 1.0, 0.0], &[0.5, 2.0]];
/// assert_eq!(gaugebook::rising_crossings_in_blocks(blocks, 0.5), 2);
/// assert_eq!(gaugebook::rising_crossings(&[0.0, 1.0, 0.0, 0.5, 2.0], 0.5), 2);
/// ```
pub fn rising_crossings_in_blocks<'a>(
    blocks: impl IntoIterator<Item = &'a [f64]>,
    level: f64,
) -> usize {
    let mut count = 0;
    let mut prev: Option<f64> = None;
    for x in blocks {
        if let (Some(p), Some(&first)) = (prev, x.first()) {
            count += usize::from(p < level && level <= first);
        }
        count += rising_crossings(x, level);
        prev = x.last().copied().or(prev);
    }
    count
}

/// Sum, sum of squares, minimum and maximum in one pass.
struct First {
    sum: f64,
    sum_sq: f64,
    min: f64,
    max: f64,
}

/// [`First`] by pairwise summation (numpy's block shape), with eight lanes of running minimum
/// and maximum in each block so the loop vectorises.
fn first_pass(x: &[f64]) -> First {
    const BLOCK: usize = 128;
    let n = x.len();
    if n <= BLOCK {
        let mut r = [0.0f64; 8];
        let mut q = [0.0f64; 8];
        let mut lo = [f64::INFINITY; 8];
        let mut hi = [f64::NEG_INFINITY; 8];
        let full = if n < 8 { 0 } else { n - n % 8 };
        for c in x[..full].chunks_exact(8) {
            for k in 0..8 {
                r[k] += c[k];
                q[k] += c[k] * c[k];
                lo[k] = if c[k] < lo[k] { c[k] } else { lo[k] };
                hi[k] = if c[k] > hi[k] { c[k] } else { hi[k] };
            }
        }
        let mut out = First {
            sum: ((r[0] + r[1]) + (r[2] + r[3])) + ((r[4] + r[5]) + (r[6] + r[7])),
            sum_sq: ((q[0] + q[1]) + (q[2] + q[3])) + ((q[4] + q[5]) + (q[6] + q[7])),
            min: lo.iter().copied().fold(f64::INFINITY, f64::min),
            max: hi.iter().copied().fold(f64::NEG_INFINITY, f64::max),
        };
        for &v in &x[full..] {
            out.sum += v;
            out.sum_sq += v * v;
            out.min = out.min.min(v);
            out.max = out.max.max(v);
        }
        return out;
    }
    let half = n / 2;
    let half = half - half % 8;
    let (a, b) = (first_pass(&x[..half]), first_pass(&x[half..]));
    First {
        sum: a.sum + b.sum,
        sum_sq: a.sum_sq + b.sum_sq,
        min: a.min.min(b.min),
        max: a.max.max(b.max),
    }
}

/// Two pairwise sums of mapped values in one pass (numpy's pairwise_sum shape, two lanes).
fn pairwise2(
    x: &[f64],
    f: impl Fn(f64) -> f64 + Copy,
    g: impl Fn(f64) -> f64 + Copy,
) -> (f64, f64) {
    // numpy's PW_BLOCKSIZE.
    const BLOCK: usize = 128;
    let n = x.len();
    if n < 8 {
        return x.iter().fold((0.0, 0.0), |(a, b), &v| (a + f(v), b + g(v)));
    }
    if n <= BLOCK {
        let mut r = [0.0f64; 8];
        let mut s = [0.0f64; 8];
        let full = n - n % 8;
        for c in x[..full].chunks_exact(8) {
            for k in 0..8 {
                r[k] += f(c[k]);
                s[k] += g(c[k]);
            }
        }
        let mut a = ((r[0] + r[1]) + (r[2] + r[3])) + ((r[4] + r[5]) + (r[6] + r[7]));
        let mut b = ((s[0] + s[1]) + (s[2] + s[3])) + ((s[4] + s[5]) + (s[6] + s[7]));
        for &v in &x[full..] {
            a += f(v);
            b += g(v);
        }
        return (a, b);
    }
    let half = n / 2;
    let half = half - half % 8;
    let (a1, b1) = pairwise2(&x[..half], f, g);
    let (a2, b2) = pairwise2(&x[half..], f, g);
    (a1 + a2, b1 + b2)
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn large_offset_does_not_destroy_the_variance() {
        // x = 1e9 + {0, 1, 2, 3}·1e-3. The offsets x − 1e9 are exact in f64 (Sterbenz), so the
        // variance of the small offsets is the reference; a one-pass Σx² − n·x̄² formula loses
        // every digit at this offset.
        let x: Vec<f64> = (0..1000).map(|i| 1e9 + (i % 4) as f64 * 1e-3).collect();
        let d: Vec<f64> = x.iter().map(|v| v - 1e9).collect();
        let m = d.iter().sum::<f64>() / 1000.0;
        let want = (d.iter().map(|v| (v - m) * (v - m)).sum::<f64>() / 999.0).sqrt();
        let s = summarize(&x).unwrap();
        assert!(
            (s.std_dev - want).abs() < 1e-9 * want,
            "{} vs {want}",
            s.std_dev
        );
    }

    #[test]
    fn pairwise_sum_is_exact_on_integers() {
        let x: Vec<f64> = (1..=100_000).map(|i| i as f64).collect();
        assert_eq!(pairwise2(&x, |v| v, |_| 1.0), (5_000_050_000.0, 100_000.0));
        // Closed forms: Σi = n(n+1)/2, Σi² = n(n+1)(2n+1)/6 (exact in f64 at this size).
        for n in [1usize, 7, 8, 9, 127, 128, 129, 1000, 100_000] {
            let x: Vec<f64> = (1..=n).map(|i| i as f64).collect();
            let f = first_pass(&x);
            let nf = n as f64;
            assert_eq!((f.sum, f.min, f.max), (nf * (nf + 1.0) / 2.0, 1.0, nf));
            assert_eq!(f.sum_sq, nf * (nf + 1.0) * (2.0 * nf + 1.0) / 6.0);
        }
    }
}
