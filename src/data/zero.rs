//! Zero offsets and drift: the mean over a window of samples or a hold in time, subtracted; and
//! a straight line between two zero holds, subtracted to remove slow drift.

use std::ops::Range;

use super::DataError;

/// The index range of samples with `start <= t < end` in an increasing time column.
///
/// ```
/// use gaugebook::window_by_time;
/// let t = [0.0, 0.5, 1.0, 1.5, 2.0];
/// assert_eq!(window_by_time(&t, 0.5, 1.5), 1..3);
/// ```
pub fn window_by_time(times: &[f64], start: f64, end: f64) -> Range<usize> {
    let a = times.partition_point(|&t| t < start);
    let b = times.partition_point(|&t| t < end).max(a);
    a..b
}

/// The mean of `values[window]`; an empty or out-of-bounds window is an error.
///
/// ```
/// use gaugebook::zero_of;
/// assert_eq!(zero_of(&[1.0, 3.0, 9.0], 0..2)?, 2.0);
/// assert!(zero_of(&[1.0], 0..5).is_err());
/// # Ok::<(), gaugebook::DataError>(())
/// ```
pub fn zero_of(values: &[f64], window: Range<usize>) -> Result<f64, DataError> {
    check_window(values.len(), &window, "zero window")?;
    Ok(mean(&values[window]))
}

/// Subtracts a zero in place.
///
/// ```
/// use gaugebook::subtract_zero;
/// let mut v = vec![5.0, 6.0];
/// subtract_zero(&mut v, 5.0);
/// assert_eq!(v, vec![0.0, 1.0]);
/// ```
pub fn subtract_zero(values: &mut [f64], zero: f64) {
    values.iter_mut().for_each(|v| *v -= zero);
}

/// The drift line found by [`remove_drift`]: value = `at_a + slope·(t − t_a)`.
///
/// ```
/// let d = gaugebook::DriftLine { t_a: 1.0, at_a: 2.0, slope: 0.5 };
/// assert_eq!(d.at(3.0), 3.0);
/// ```
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct DriftLine {
    /// Mean time of the first hold.
    pub t_a: f64,
    /// Mean value of the first hold.
    pub at_a: f64,
    /// Change of the zero per unit time.
    pub slope: f64,
}

impl DriftLine {
    /// The zero at time `t`.
    ///
    /// ```
    /// let d = gaugebook::DriftLine { t_a: 0.0, at_a: 0.01, slope: -0.001 };
    /// assert!((d.at(10.0) - 0.0).abs() < 1e-15);
    /// ```
    pub fn at(&self, t: f64) -> f64 {
        self.at_a + self.slope * (t - self.t_a)
    }
}

/// Removes drift: the means of two zero holds (index windows) at their mean times define a
/// line, which is subtracted from every sample (extrapolated outside the holds). Both holds
/// then average to zero (closed form).
///
/// ```
/// use gaugebook::remove_drift;
/// let t: Vec<f64> = (0..10).map(f64::from).collect();
/// let mut v: Vec<f64> = t.iter().map(|t| 1.0 + 0.1 * t).collect();
/// v[5] += 7.0; // a load between the holds
/// let line = remove_drift(&mut v, &t, 0..2, 8..10)?;
/// assert!((line.slope - 0.1).abs() < 1e-12);
/// assert!(v[0].abs() < 1e-12 && (v[5] - 7.0).abs() < 1e-12);
/// # Ok::<(), gaugebook::DataError>(())
/// ```
pub fn remove_drift(
    values: &mut [f64],
    times: &[f64],
    hold_a: Range<usize>,
    hold_b: Range<usize>,
) -> Result<DriftLine, DataError> {
    if values.len() != times.len() {
        return Err(DataError::LengthMismatch {
            what: "values and times".into(),
            left: values.len(),
            right: times.len(),
        });
    }
    check_window(values.len(), &hold_a, "first zero hold")?;
    check_window(values.len(), &hold_b, "second zero hold")?;
    let (ta, tb) = (mean(&times[hold_a.clone()]), mean(&times[hold_b.clone()]));
    if !(tb > ta) {
        return Err(DataError::BadRange {
            what: "zero holds".into(),
            expected: "the second hold later than the first".into(),
            found: format!("mean times {ta} and {tb}"),
        });
    }
    let (za, zb) = (mean(&values[hold_a]), mean(&values[hold_b]));
    let line = DriftLine {
        t_a: ta,
        at_a: za,
        slope: (zb - za) / (tb - ta),
    };
    for (v, &t) in values.iter_mut().zip(times) {
        *v -= line.at(t);
    }
    Ok(line)
}

fn check_window(len: usize, w: &Range<usize>, what: &str) -> Result<(), DataError> {
    if w.start >= w.end || w.end > len {
        return Err(DataError::BadRange {
            what: what.into(),
            expected: format!("a non-empty range of samples within 0..{len}"),
            found: format!("{}..{}", w.start, w.end),
        });
    }
    Ok(())
}

/// Mean by pairwise summation (rounding error grows as log n, not n; Higham, *Accuracy and
/// Stability of Numerical Algorithms*, 2nd ed., §4.2, from memory), as numpy's mean does.
pub(crate) fn mean(x: &[f64]) -> f64 {
    pairwise_sum(x) / x.len() as f64
}

pub(crate) fn pairwise_sum(x: &[f64]) -> f64 {
    // Blocks of 128 summed in 8 lanes, then halves recursively: numpy's pairwise_sum layout.
    if x.len() < 8 {
        return x.iter().sum();
    }
    if x.len() <= 128 {
        let mut r = [0.0; 8];
        r.copy_from_slice(&x[..8]);
        let mut i = 8;
        while i + 8 <= x.len() {
            for k in 0..8 {
                r[k] += x[i + k];
            }
            i += 8;
        }
        let mut s = ((r[0] + r[1]) + (r[2] + r[3])) + ((r[4] + r[5]) + (r[6] + r[7]));
        for v in &x[i..] {
            s += v;
        }
        return s;
    }
    let mut half = x.len() / 2;
    half -= half % 8;
    pairwise_sum(&x[..half]) + pairwise_sum(&x[half..])
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn drift_holds_average_to_zero_after_removal() {
        let t: Vec<f64> = (0..1000).map(|i| i as f64 * 0.01).collect();
        let mut v: Vec<f64> = t
            .iter()
            .map(|t| 3.0 - 0.02 * t + (t * 7.0).sin() * 1e-3)
            .collect();
        remove_drift(&mut v, &t, 0..100, 900..1000).unwrap();
        assert!(mean(&v[0..100]).abs() < 1e-12);
        assert!(mean(&v[900..1000]).abs() < 1e-12);
        assert!(remove_drift(&mut v, &t, 900..1000, 0..100).is_err());
    }

    #[test]
    fn pairwise_sum_is_exact_on_integers() {
        let x: Vec<f64> = (1..=100_000).map(f64::from).collect();
        assert_eq!(pairwise_sum(&x), 5_000_050_000.0);
    }
}
