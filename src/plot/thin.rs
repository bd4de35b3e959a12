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
    thin_blocks(&[(x, y)], columns)
}

/// The blocks (x, y) joined into one series.
pub(crate) fn join_blocks(blocks: &[(&[f64], &[f64])]) -> (Vec<f64>, Vec<f64>) {
    (
        blocks.iter().flat_map(|b| b.0.iter().copied()).collect(),
        blocks.iter().flat_map(|b| b.1.iter().copied()).collect(),
    )
}

/// One kept point: its index in the whole series, x and y.
type Kept = (usize, f64, f64);

/// [`thin`] of a series held as consecutive blocks (x, y), without joining them first: the
/// column being gathered carries over from one block to the next.
pub(crate) fn thin_blocks(blocks: &[(&[f64], &[f64])], columns: usize) -> (Vec<f64>, Vec<f64>) {
    let n: usize = blocks.iter().map(|b| b.0.len()).sum();
    let joined = || join_blocks(blocks);
    let x0 = blocks.iter().find_map(|b| b.0.first().copied());
    let x1 = blocks.iter().rev().find_map(|b| b.0.last().copied());
    let (Some(x0), Some(x1)) = (x0, x1) else {
        return joined();
    };
    let span = x1 - x0;
    if n <= 4 * columns || columns == 0 || span <= 0.0 {
        return joined();
    }
    let scale = columns as f64 / span;
    let mut ox = Vec::with_capacity(4 * columns);
    let mut oy = Vec::with_capacity(4 * columns);
    // The first, lowest, highest and last point of a column, kept in their original order.
    let mut emit = |mut keep: [Kept; 4]| {
        keep.sort_unstable_by_key(|p| p.0);
        let mut prev = usize::MAX;
        for (k, x, y) in keep {
            if k != prev {
                ox.push(x);
                oy.push(y);
                prev = k;
            }
        }
    };
    let mut open: Option<(usize, [Kept; 4])> = None;
    let mut k = 0;
    for (bx, by) in blocks {
        for (&x, &y) in bx.iter().zip(by.iter()) {
            let col = (((x - x0) * scale) as usize).min(columns - 1);
            match &mut open {
                Some((c, keep)) if *c == col => {
                    if y < keep[1].2 {
                        keep[1] = (k, x, y);
                    }
                    if y > keep[2].2 {
                        keep[2] = (k, x, y);
                    }
                    keep[3] = (k, x, y);
                }
                _ => {
                    if let Some((_, keep)) = open.take() {
                        emit(keep);
                    }
                    open = Some((col, [(k, x, y); 4]));
                }
            }
            k += 1;
        }
    }
    if let Some((_, keep)) = open {
        emit(keep);
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
        // Cut into blocks anywhere, the series thins to the same points.
        for cuts in [
            vec![1, 2, 500_000],
            vec![123_457, 123_458, 999_999],
            vec![333_333, 666_666],
        ] {
            let mut blocks = Vec::new();
            let mut from = 0;
            for c in cuts.into_iter().chain([n]) {
                blocks.push((&x[from..c], &y[from..c]));
                from = c;
            }
            assert_eq!(thin_blocks(&blocks, 800), (tx.clone(), ty.clone()));
        }
    }
}
