//! Resampling onto a new time base by linear interpolation between neighbouring samples (the
//! formula of numpy.interp), without extrapolation: every new time must lie within the old ones.

use crate::PhysicsError;

/// Values of the series (`time`, `values`) at `new_time`, by linear interpolation.
///
/// `time` must be finite and strictly increasing with at least 2 samples; `new_time` finite,
/// non-decreasing and within `[time[0], time[last]]` (nothing is extrapolated). Linear
/// interpolation does not filter: to reduce the rate, low-pass first (or use [`crate::decimate`]).
///
/// ```
/// let y = gaugebook::resample_linear(&[0.0, 1.0, 2.0], &[0.0, 10.0, 0.0], &[0.5, 1.0, 1.25])?;
/// assert_eq!(y, vec![5.0, 10.0, 7.5]);
/// assert!(gaugebook::resample_linear(&[0.0, 1.0], &[0.0, 1.0], &[2.0]).is_err());
/// # Ok::<(), gaugebook::PhysicsError>(())
/// ```
pub fn resample_linear(
    time: &[f64],
    values: &[f64],
    new_time: &[f64],
) -> Result<Vec<f64>, PhysicsError> {
    if time.len() != values.len() {
        return Err(PhysicsError::Mismatch {
            what: "time and value series lengths".to_string(),
            left: time.len().to_string(),
            right: values.len().to_string(),
        });
    }
    if time.len() < 2 {
        return Err(PhysicsError::NotEnoughData {
            what: "linear resampling".to_string(),
            needed: 2,
            found: time.len(),
        });
    }
    super::filter::check_signal(values)?;
    for (i, w) in time.windows(2).enumerate() {
        if !(w[0].is_finite() && w[1].is_finite() && w[1] > w[0]) {
            return Err(PhysicsError::invalid(
                format!("time at sample {}", i + 1),
                format!("{} s after {} s", w[1], w[0]),
                "finite, strictly increasing times",
            ));
        }
    }
    let (t0, t1) = (time[0], time[time.len() - 1]);
    let mut out = Vec::with_capacity(new_time.len());
    let mut j = 0;
    let mut prev = f64::NEG_INFINITY;
    for (i, &t) in new_time.iter().enumerate() {
        if !(t.is_finite() && t >= t0 && t <= t1 && t >= prev) {
            return Err(PhysicsError::invalid(
                format!("new time at index {i}"),
                format!("{t} s"),
                format!("non-decreasing times within the series, {t0} s to {t1} s"),
            ));
        }
        prev = t;
        while j + 2 < time.len() && time[j + 1] <= t {
            j += 1;
        }
        if t == t1 {
            out.push(values[values.len() - 1]);
        } else {
            // numpy.interp's form: slope·(t − t_j) + y_j.
            let slope = (values[j + 1] - values[j]) / (time[j + 1] - time[j]);
            out.push(slope * (t - time[j]) + values[j]);
        }
    }
    Ok(out)
}

/// `count` equally spaced times `start, start + step, …` for a new time base.
///
/// ```
/// assert_eq!(gaugebook::uniform_times(1.0, 0.5, 3)?, vec![1.0, 1.5, 2.0]);
/// # Ok::<(), gaugebook::PhysicsError>(())
/// ```
pub fn uniform_times(start: f64, step: f64, count: usize) -> Result<Vec<f64>, PhysicsError> {
    crate::check_finite("start time", start, "s")?;
    crate::check_positive("time step", step, "s")?;
    // start + k·step rather than repeated addition, so the grid does not drift.
    Ok((0..count).map(|k| start + k as f64 * step).collect())
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn linear_data_is_reproduced_exactly_enough() {
        // Closed form: interpolating a straight line returns the line.
        let t: Vec<f64> = (0..100)
            .map(|i| i as f64 * 0.01 + (i % 3) as f64 * 1e-4)
            .collect();
        let y: Vec<f64> = t.iter().map(|v| 3.0 * v - 1.0).collect();
        let nt = uniform_times(0.0, 0.003, 300).unwrap();
        let r = resample_linear(&t, &y, &nt).unwrap();
        for (a, b) in r.iter().zip(&nt) {
            assert!((a - (3.0 * b - 1.0)).abs() < 1e-12);
        }
        assert!(resample_linear(&[0.0, 0.0], &[1.0, 2.0], &[0.0]).is_err());
        assert!(resample_linear(&[0.0, 1.0], &[1.0], &[0.0]).is_err());
        assert!(resample_linear(&[0.0, 1.0], &[1.0, 2.0], &[0.5, 0.2]).is_err());
    }
}
