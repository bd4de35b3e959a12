//! Rainflow cycle counting by the three-point method of ASTM E1049-85 (reapproved 2017),
//! §5.4.4, with half cycles, and a histogram of the counted ranges.
//!
//! The history is first reduced to its reversals (peaks and valleys; the first and last samples
//! count as reversals, and a run of equal samples is one point). Then, with X the most recent
//! range and Y the one before it (§5.4.4 steps 1–6): read points until X ≥ Y; if Y contains the
//! starting point, count Y as a half cycle and drop its first point; otherwise count Y as one
//! cycle and drop both its points; at the end count every remaining range as a half cycle.
//! The rainflow package 3.2.0 (`extract_cycles`) implements the same steps; the tests compare
//! against it and against the standard's example history.

use crate::PhysicsError;

/// One counted range.
///
/// ```
/// let c = gaugebook::rainflow_cycles(&[0.0, 4.0, 1.0, 3.0, 0.0])?;
/// assert_eq!(c[0], gaugebook::Cycle { range: 2.0, mean: 2.0, count: 1.0, start: 2, end: 3 });
/// # Ok::<(), gaugebook::PhysicsError>(())
/// ```
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct Cycle {
    /// |difference| of the two reversals, in the signal's unit.
    pub range: f64,
    /// Their mean.
    pub mean: f64,
    /// 1 for a full cycle, 0.5 for a half cycle.
    pub count: f64,
    /// Sample index of the first reversal (the last sample of a flat run).
    pub start: usize,
    /// Sample index of the second reversal.
    pub end: usize,
}

/// The reversals (index, value) of a history, as rainflow 3.2.0's `reversals` finds them: the
/// first sample, every sample where the slope changes sign (for a flat top, its last sample),
/// and the last sample.
///
/// ```
/// let r = gaugebook::reversals(&[0.0, 1.0, 2.0, 2.0, 1.0, 3.0]);
/// assert_eq!(r, vec![(0, 0.0), (3, 2.0), (4, 1.0), (5, 3.0)]);
/// ```
pub fn reversals(x: &[f64]) -> Vec<(usize, f64)> {
    let mut out = Vec::new();
    let mut finder = ReversalFinder::default();
    finder.add(x, |p| out.push(p));
    finder.finish(|p| out.push(p));
    out
}

/// Finds reversals sample by sample, so a history can arrive in blocks: the first sample, then
/// each sample before a change of slope sign (equal samples are one point), and at the end the
/// last sample when there were more than two (rainflow 3.2.0's rule, see [`reversals`]).
#[derive(Clone, Debug, Default)]
struct ReversalFinder {
    /// Samples seen so far.
    seen: usize,
    /// The first sample.
    first: f64,
    /// The latest value that differed from the one before it.
    cur: f64,
    /// The slope into `cur`.
    d_last: f64,
    /// The latest sample.
    last: f64,
}

impl ReversalFinder {
    #[inline]
    fn add(&mut self, x: &[f64], mut emit: impl FnMut((usize, f64))) {
        for &next in x {
            let k = self.seen;
            self.seen += 1;
            self.last = next;
            match k {
                0 => {
                    self.first = next;
                    emit((0, next));
                }
                1 => {
                    self.cur = next;
                    self.d_last = next - self.first;
                }
                _ if next == self.cur => {}
                _ => {
                    let d_next = next - self.cur;
                    if self.d_last * d_next < 0.0 {
                        emit((k - 1, self.cur));
                    }
                    self.cur = next;
                    self.d_last = d_next;
                }
            }
        }
    }

    fn finish(&self, mut emit: impl FnMut((usize, f64))) {
        if self.seen > 2 {
            emit((self.seen - 1, self.last));
        }
    }
}

/// Rainflow cycles of a history per ASTM E1049-85 (2017) §5.4.4, in the order counted.
/// Errors: a NaN or infinite sample. A history of fewer than 2 samples has no cycles; one of
/// exactly 2 has none either (rainflow 3.2.0 behaves the same).
///
/// ```
/// // ASTM E1049-85 (2017) Fig. 6 example history (from memory): ranges 3, 4 (×1.5), 6, 8 (×1), 9.
/// let c = gaugebook::rainflow_cycles(&[-2.0, 1.0, -3.0, 5.0, -1.0, 3.0, -4.0, 4.0, -2.0])?;
/// let total: f64 = c.iter().map(|c| c.count).sum();
/// assert_eq!(total, 4.0);
/// # Ok::<(), gaugebook::PhysicsError>(())
/// ```
pub fn rainflow_cycles(x: &[f64]) -> Result<Vec<Cycle>, PhysicsError> {
    let mut counter = RainflowCounter::new();
    counter.add(x)?;
    Ok(counter.finish())
}

/// Rainflow counting (ASTM E1049-85 (2017) §5.4.4, as [`rainflow_cycles`]) of a history that
/// arrives in blocks: a long log's load counted block by block without joining it. The cycles
/// and their sample indices (counted from the first block's first sample) are those of
/// [`rainflow_cycles`] over the joined history.
///
/// ```
/// use gaugebook::{RainflowCounter, rainflow_cycles};
/// let x = [-2.0, 1.0, -3.0, 5.0, -1.0, 3.0, -4.0, 4.0, -2.0];
/// let mut counter = RainflowCounter::new();
/// for block in x.chunks(2) {
///     counter.add(block)?;
/// }
/// assert_eq!(counter.samples(), 9);
/// assert_eq!(counter.finish(), rainflow_cycles(&x)?);
/// # Ok::<(), gaugebook::PhysicsError>(())
/// ```
#[derive(Clone, Debug, Default)]
pub struct RainflowCounter {
    reversals: ReversalFinder,
    /// The stack of reversals not yet discarded; `points[head]` is the starting point S.
    points: Vec<(usize, f64)>,
    /// Index of S in `points` (dropping the first point is O(1)).
    head: usize,
    cycles: Vec<Cycle>,
}

fn cycle(a: (usize, f64), b: (usize, f64), count: f64) -> Cycle {
    Cycle {
        range: (a.1 - b.1).abs(),
        mean: 0.5 * (a.1 + b.1),
        count,
        start: a.0,
        end: b.0,
    }
}

impl RainflowCounter {
    /// A counter that has seen no samples.
    ///
    /// ```
    /// assert!(gaugebook::RainflowCounter::new().finish().is_empty());
    /// ```
    pub fn new() -> RainflowCounter {
        RainflowCounter::default()
    }

    /// Counts the next block of the history. Errors: a NaN or infinite sample, named by its
    /// index in the whole history; the block is then not counted.
    ///
    /// ```
    /// let mut c = gaugebook::RainflowCounter::new();
    /// c.add(&[0.0, 1.0])?;
    /// let e = c.add(&[2.0, f64::NAN]).unwrap_err();
    /// assert!(e.to_string().contains("sample 3"));
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn add(&mut self, x: &[f64]) -> Result<(), PhysicsError> {
        if let Some(i) = crate::error::first_non_finite(x) {
            return Err(PhysicsError::invalid(
                format!("sample {} of the load history", self.reversals.seen + i),
                x[i],
                "a finite value",
            ));
        }
        let RainflowCounter {
            reversals,
            points,
            head,
            cycles,
        } = self;
        reversals.add(x, |p| count_point(points, head, cycles, p));
        Ok(())
    }

    /// Samples counted so far.
    ///
    /// ```
    /// let mut c = gaugebook::RainflowCounter::new();
    /// c.add(&[0.0, 1.0, 0.5])?;
    /// assert_eq!(c.samples(), 3);
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn samples(&self) -> usize {
        self.reversals.seen
    }

    /// Ends the history: the last sample is a reversal, and every range left is a half cycle.
    /// Returns the cycles in the order counted.
    ///
    /// ```
    /// let mut c = gaugebook::RainflowCounter::new();
    /// c.add(&[0.0, 4.0, 1.0, 3.0, 0.0])?;
    /// assert_eq!(c.finish().len(), 3);
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn finish(self) -> Vec<Cycle> {
        let RainflowCounter {
            reversals,
            mut points,
            mut head,
            mut cycles,
        } = self;
        reversals.finish(|p| count_point(&mut points, &mut head, &mut cycles, p));
        for k in head..points.len().saturating_sub(1) {
            cycles.push(cycle(points[k], points[k + 1], 0.5));
        }
        cycles
    }
}

/// One reversal into the three-point method (§5.4.4 steps 1–6): with X the most recent range
/// and Y the one before it, read points until X ≥ Y; if Y contains the starting point, count Y
/// as a half cycle and drop its first point; otherwise count Y as one cycle and drop both its
/// points.
#[inline]
fn count_point(
    points: &mut Vec<(usize, f64)>,
    head: &mut usize,
    out: &mut Vec<Cycle>,
    p: (usize, f64),
) {
    points.push(p);
    while points.len() - *head >= 3 {
        let n = points.len();
        let (x1, x2, x3) = (points[n - 3].1, points[n - 2].1, points[n - 1].1);
        let range_x = (x3 - x2).abs();
        let range_y = (x2 - x1).abs();
        if range_x < range_y {
            break;
        } else if n - *head == 3 {
            // Y contains the starting point: a half cycle; S moves to Y's second point.
            out.push(cycle(points[*head], points[*head + 1], 0.5));
            *head += 1;
        } else {
            out.push(cycle(points[n - 3], points[n - 2], 1.0));
            let last = points[n - 1];
            points.truncate(n - 3);
            points.push(last);
        }
    }
}

/// Total counts per distinct range, sorted by range (rainflow 3.2.0's `count_cycles` without
/// binning).
///
/// ```
/// let c = gaugebook::rainflow_cycles(&[-2.0, 1.0, -3.0, 5.0, -1.0, 3.0, -4.0, 4.0, -2.0])?;
/// let by_range = gaugebook::counts_by_range(&c);
/// assert_eq!(by_range, vec![(3.0, 0.5), (4.0, 1.5), (6.0, 0.5), (8.0, 1.0), (9.0, 0.5)]);
/// # Ok::<(), gaugebook::PhysicsError>(())
/// ```
pub fn counts_by_range(cycles: &[Cycle]) -> Vec<(f64, f64)> {
    let mut v: Vec<(f64, f64)> = cycles.iter().map(|c| (c.range, c.count)).collect();
    v.sort_by(|a, b| a.0.total_cmp(&b.0));
    let mut out: Vec<(f64, f64)> = Vec::new();
    for (r, c) in v {
        match out.last_mut() {
            Some(last) if last.0 == r => last.1 += c,
            _ => out.push((r, c)),
        }
    }
    out
}

/// One bin of a range histogram: ranges in (upper − width, upper].
///
/// ```
/// let b = gaugebook::RangeBin { upper: 5.0, count: 1.5 };
/// assert_eq!(b.upper, 5.0);
/// ```
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct RangeBin {
    /// Upper edge of the bin (included).
    pub upper: f64,
    /// Cycles counted (half cycles count 0.5).
    pub count: f64,
}

/// Histogram of cycle ranges in bins of `width`: bin k (k = 1, 2, …) holds ranges in
/// ((k−1)·width, k·width], every bin up to the largest range is listed, empty ones with 0
/// (rainflow 3.2.0's `count_cycles(..., binsize=width)`). Errors: a width not finite and positive.
///
/// ```
/// let c = gaugebook::rainflow_cycles(&[-2.0, 1.0, -3.0, 5.0, -1.0, 3.0, -4.0, 4.0, -2.0])?;
/// let h = gaugebook::range_histogram(&c, 5.0)?;
/// assert_eq!(h, vec![gaugebook::RangeBin { upper: 5.0, count: 2.0 }, gaugebook::RangeBin { upper: 10.0, count: 2.0 }]);
/// # Ok::<(), gaugebook::PhysicsError>(())
/// ```
pub fn range_histogram(cycles: &[Cycle], width: f64) -> Result<Vec<RangeBin>, PhysicsError> {
    crate::check_positive("histogram bin width", width, "")?;
    let mut counts: Vec<f64> = Vec::new();
    for c in cycles {
        // ceil(range / width) is the bin number, as in rainflow 3.2.0; a zero range joins bin 1.
        let k = ((c.range / width).ceil() as usize).max(1);
        if counts.len() < k {
            counts.resize(k, 0.0);
        }
        counts[k - 1] += c.count;
    }
    Ok(counts
        .into_iter()
        .enumerate()
        .map(|(i, count)| RangeBin {
            upper: (i + 1) as f64 * width,
            count,
        })
        .collect())
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn flat_and_short_histories() {
        assert!(rainflow_cycles(&[]).unwrap().is_empty());
        assert!(rainflow_cycles(&[1.0]).unwrap().is_empty());
        assert!(
            rainflow_cycles(&[1.0, 1.0, 1.0])
                .unwrap()
                .iter()
                .all(|c| c.range == 0.0)
        );
        assert!(rainflow_cycles(&[0.0, f64::NAN]).is_err());
    }
}
