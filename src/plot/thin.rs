//! Min/max thinning of long line series for drawing ("M4": R. Jugel et al., "M4: a
//! visualization-oriented time series data aggregation", *Proc. VLDB* 7 (2014), from memory).
//!
//! The x range is cut into columns (one per pixel, or a fixed fine grid when the figure is
//! built); in each column only the first, lowest, highest and last points are kept, in their
//! original order. A line through them lights the same pixels as a line through all points, so
//! spikes and extremes survive while millions of points become a few thousand.

/// Thins (x, y) to at most 4 points per column over `columns` columns of the x range. `x` must be
/// non-decreasing; series with fewer than 4·columns points are returned unchanged.
pub(crate) fn thin(x: &[f64], y: &[f64], columns: usize) -> (Vec<f64>, Vec<f64>) {
    let n = x.len();
    if n <= 4 * columns || columns == 0 {
        return (x.to_vec(), y.to_vec());
    }
    let (x0, x1) = (x[0], x[n - 1]);
    let span = x1 - x0;
    if span <= 0.0 {
        return (x.to_vec(), y.to_vec());
    }
    let scale = columns as f64 / span;
    let mut ox = Vec::with_capacity(4 * columns);
    let mut oy = Vec::with_capacity(4 * columns);
    let mut i = 0;
    while i < n {
        let col = (((x[i] - x0) * scale) as usize).min(columns - 1);
        let start = i;
        let (mut lo, mut hi) = (i, i);
        i += 1;
        while i < n && (((x[i] - x0) * scale) as usize).min(columns - 1) == col {
            if y[i] < y[lo] {
                lo = i;
            }
            if y[i] > y[hi] {
                hi = i;
            }
            i += 1;
        }
        let last = i - 1;
        let mut keep = [start, lo, hi, last];
        keep.sort_unstable();
        let mut prev = usize::MAX;
        for k in keep {
            if k != prev {
                ox.push(x[k]);
                oy.push(y[k]);
                prev = k;
            }
        }
    }
    (ox, oy)
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn extremes_survive_and_size_is_bounded() {
        let n = 1_000_000;
        let x: Vec<f64> = (0..n).map(|i| i as f64).collect();
        let mut y: Vec<f64> = x.iter().map(|v| (v * 0.001).sin()).collect();
        y[123_457] = 50.0; // a single-sample spike
        y[876_543] = -50.0;
        let (tx, ty) = thin(&x, &y, 800);
        assert!(tx.len() <= 4 * 800);
        assert!(ty.contains(&50.0) && ty.contains(&-50.0));
        assert_eq!((tx[0], *tx.last().unwrap()), (0.0, (n - 1) as f64));
        assert!(tx.windows(2).all(|w| w[0] <= w[1]));
    }
}
