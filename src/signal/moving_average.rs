//! Moving average over a fixed number of samples: output k is the mean of x[k..k+window],
//! the "valid" part of the convolution with a boxcar (numpy.convolve(x, ones(w)/w, "valid")).

use crate::PhysicsError;

/// The moving average of `x` over `window` samples; `x.len() − window + 1` outputs, each the
/// mean of `window` consecutive inputs (so output k belongs to the window starting at sample k).
///
/// A running sum keeps the cost at two additions per sample whatever the window; Neumaier's
/// compensation (A. Neumaier, *ZAMM* 54 (1974) 39–51, from memory) stops round-off from
/// accumulating over millions of samples.
///
/// Errors: a window of 0 or longer than `x`, or a non-finite sample.
///
/// ```
/// let y = gaugebook::moving_average(&[1.0, 2.0, 3.0, 4.0], 2)?;
/// assert_eq!(y, vec![1.5, 2.5, 3.5]);
/// # Ok::<(), gaugebook::PhysicsError>(())
/// ```
pub fn moving_average(x: &[f64], window: usize) -> Result<Vec<f64>, PhysicsError> {
    if window == 0 || window > x.len() {
        return Err(PhysicsError::invalid(
            "moving-average window",
            format!("{window} samples"),
            format!("a window from 1 to the signal length, {} samples", x.len()),
        ));
    }
    super::filter::check_signal(x)?;
    let mut out = Vec::with_capacity(x.len() - window + 1);
    let (mut sum, mut comp) = (0.0f64, 0.0f64);
    let add = |v: f64, sum: &mut f64, comp: &mut f64| {
        let t = *sum + v;
        if sum.abs() >= v.abs() {
            *comp += (*sum - t) + v;
        } else {
            *comp += (v - t) + *sum;
        }
        *sum = t;
    };
    for &v in &x[..window] {
        add(v, &mut sum, &mut comp);
    }
    let w = window as f64;
    out.push((sum + comp) / w);
    for k in window..x.len() {
        add(x[k], &mut sum, &mut comp);
        add(-x[k - window], &mut sum, &mut comp);
        out.push((sum + comp) / w);
    }
    Ok(out)
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn no_drift_over_long_signals() {
        // A constant with large offset: every output must be that constant (exact arithmetic).
        let x: Vec<f64> = (0..200_000)
            .map(|i| 1e6 + if i % 2 == 0 { 0.1 } else { -0.1 })
            .collect();
        let y = moving_average(&x, 10).unwrap();
        assert!(y.iter().all(|v| (v - 1e6).abs() < 1e-9));
        assert!(moving_average(&x[..3], 4).is_err());
        assert!(moving_average(&x, 0).is_err());
    }
}
