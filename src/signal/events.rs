//! Holds (plateaus) and ramps in a channel, so that calibration steps, creep holds and zero
//! windows are found in a log without typing their times.
//!
//! **Hold criterion.** A hold is a run of at least `min_samples` consecutive samples whose
//! peak-to-peak (max − min over the whole run) does not exceed `tolerance`. Runs are taken
//! greedily from the start of the log, each as long as it can grow; the search then continues
//! after it. Choosing the two numbers:
//! - `tolerance` must exceed the noise's peak-to-peak over a hold (about 6–8 σ for Gaussian
//!   noise over thousands of samples; low-pass filtering first lets it be smaller), and stay
//!   below the smallest step between levels that should be told apart;
//! - a ramp whose change over `min_samples` samples is below `tolerance` (slope <
//!   tolerance / min_samples per sample) looks like a hold, so `min_samples` must be longer than
//!   tolerance / slope for the slowest ramp to be rejected;
//! - the first and last samples of a hold may still be settling after a step; `settle_samples`
//!   are left out of the hold's mean at each end (the hold's extent is reported in full).
//!
//! **Ramp criterion.** A ramp is the stretch between two consecutive holds whose levels differ by
//! at least `min_change`; it rises or falls with the sign of that change. Gaps between holds
//! with a smaller change (a disturbance inside one level) are not ramps.
//!
//! The search is O(n): two indices sweep the log once, with monotonic queues giving the running
//! minimum and maximum (the "sliding window minimum" technique; common practice).

use crate::PhysicsError;
use std::collections::VecDeque;

/// The tunable hold criterion (see the module notes).
///
/// ```
/// let c = gaugebook::HoldCriteria { tolerance: 0.5, min_samples: 100, settle_samples: 10 };
/// assert!(c.check().is_ok());
/// ```
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct HoldCriteria {
    /// Largest peak-to-peak allowed within a hold, in the signal's unit.
    pub tolerance: f64,
    /// Fewest samples a hold must last (at least 2).
    pub min_samples: usize,
    /// Samples left out of the hold mean at each end (settling); must leave at least one.
    pub settle_samples: usize,
}

impl HoldCriteria {
    /// Checks the criterion: tolerance finite and ≥ 0, min_samples ≥ 2, and
    /// 2·settle_samples < min_samples.
    ///
    /// ```
    /// let c = gaugebook::HoldCriteria { tolerance: -1.0, min_samples: 100, settle_samples: 0 };
    /// assert!(c.check().is_err());
    /// ```
    pub fn check(&self) -> Result<(), PhysicsError> {
        if !(self.tolerance.is_finite() && self.tolerance >= 0.0) {
            return Err(PhysicsError::invalid(
                "hold tolerance",
                self.tolerance,
                "a finite value of 0 or more",
            ));
        }
        if self.min_samples < 2 {
            return Err(PhysicsError::invalid(
                "hold length",
                format!("{} samples", self.min_samples),
                "2 samples or more",
            ));
        }
        if 2 * self.settle_samples >= self.min_samples {
            return Err(PhysicsError::invalid(
                "settling samples",
                self.settle_samples,
                format!(
                    "fewer than half the hold length, {} samples",
                    self.min_samples
                ),
            ));
        }
        Ok(())
    }
}

/// A hold found in a signal: samples `start..end`.
///
/// ```
/// let h = gaugebook::Hold { start: 10, end: 20, mean: 5.0, peak_to_peak: 0.1 };
/// assert_eq!(h.len(), 10);
/// ```
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct Hold {
    /// First sample of the hold.
    pub start: usize,
    /// One past the last sample.
    pub end: usize,
    /// Mean of the hold without its settling samples.
    pub mean: f64,
    /// max − min over the whole hold.
    pub peak_to_peak: f64,
}

impl Hold {
    /// Number of samples.
    ///
    /// ```
    /// assert_eq!(gaugebook::Hold { start: 3, end: 5, mean: 0.0, peak_to_peak: 0.0 }.len(), 2);
    /// ```
    pub fn len(&self) -> usize {
        self.end - self.start
    }

    /// True for a hold of no samples (never produced by [`find_holds`]).
    ///
    /// ```
    /// assert!(!gaugebook::Hold { start: 3, end: 5, mean: 0.0, peak_to_peak: 0.0 }.is_empty());
    /// ```
    pub fn is_empty(&self) -> bool {
        self.end == self.start
    }
}

/// A ramp between two holds: samples `start..end` (the end of one hold to the start of the next).
///
/// ```
/// let r = gaugebook::Ramp { start: 20, end: 30, from: 0.0, to: 8.0 };
/// assert!(r.is_rising());
/// assert_eq!(r.change(), 8.0);
/// ```
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct Ramp {
    /// First sample after the previous hold.
    pub start: usize,
    /// First sample of the next hold.
    pub end: usize,
    /// The previous hold's mean.
    pub from: f64,
    /// The next hold's mean.
    pub to: f64,
}

impl Ramp {
    /// to − from.
    ///
    /// ```
    /// assert_eq!(gaugebook::Ramp { start: 0, end: 1, from: 3.0, to: 1.0 }.change(), -2.0);
    /// ```
    pub fn change(&self) -> f64 {
        self.to - self.from
    }

    /// True when the level rises.
    ///
    /// ```
    /// assert!(!gaugebook::Ramp { start: 0, end: 1, from: 3.0, to: 1.0 }.is_rising());
    /// ```
    pub fn is_rising(&self) -> bool {
        self.to > self.from
    }
}

/// The holds in `x` by the criterion in the module notes, in order. Errors: a bad criterion or
/// a non-finite sample.
///
/// ```
/// use gaugebook::{HoldCriteria, find_holds};
/// // 0 for 50 samples, a ramp over 20, then 10 for 50.
/// let x: Vec<f64> = (0..120).map(|i| match i { 0..50 => 0.0, 50..70 => (i - 49) as f64 * 0.5, _ => 10.0 }).collect();
/// let holds = find_holds(&x, &HoldCriteria { tolerance: 0.1, min_samples: 30, settle_samples: 0 })?;
/// assert_eq!(holds.len(), 2);
/// assert_eq!((holds[0].start, holds[0].end, holds[0].mean), (0, 50, 0.0));
/// assert_eq!((holds[1].start, holds[1].end, holds[1].mean), (69, 120, 10.0));
/// # Ok::<(), gaugebook::PhysicsError>(())
/// ```
pub fn find_holds(x: &[f64], criteria: &HoldCriteria) -> Result<Vec<Hold>, PhysicsError> {
    criteria.check()?;
    if let Some(i) = crate::error::first_non_finite(x) {
        return Err(PhysicsError::invalid(
            format!("sample {i} of the signal"),
            x[i],
            "a finite value",
        ));
    }
    let n = x.len();
    let tol = criteria.tolerance;
    let mut holds = Vec::new();
    let (mut maxq, mut minq) = (VecDeque::<usize>::new(), VecDeque::<usize>::new());
    let (mut i, mut j) = (0usize, 0usize);
    while i < n {
        // Grow [i, j) while the next sample keeps the spread within tolerance.
        while j < n {
            let v = x[j];
            let hi = maxq.front().map_or(v, |&k| x[k].max(v));
            let lo = minq.front().map_or(v, |&k| x[k].min(v));
            if hi - lo > tol {
                break;
            }
            while maxq.back().is_some_and(|&k| x[k] <= v) {
                maxq.pop_back();
            }
            maxq.push_back(j);
            while minq.back().is_some_and(|&k| x[k] >= v) {
                minq.pop_back();
            }
            minq.push_back(j);
            j += 1;
        }
        if j - i >= criteria.min_samples {
            let run = &x[i + criteria.settle_samples..j - criteria.settle_samples];
            let mean = run.iter().sum::<f64>() / run.len() as f64;
            let spread = maxq.front().map_or(0.0, |&k| x[k]) - minq.front().map_or(0.0, |&k| x[k]);
            holds.push(Hold {
                start: i,
                end: j,
                mean,
                peak_to_peak: spread,
            });
            i = j;
            maxq.clear();
            minq.clear();
        } else {
            i += 1;
            while maxq.front().is_some_and(|&k| k < i) {
                maxq.pop_front();
            }
            while minq.front().is_some_and(|&k| k < i) {
                minq.pop_front();
            }
        }
    }
    Ok(holds)
}

/// The ramps between consecutive holds whose levels differ by at least `min_change` (see the
/// module notes). Errors: as [`find_holds`], and a `min_change` that is not finite and positive.
///
/// ```
/// use gaugebook::{HoldCriteria, find_ramps};
/// let x: Vec<f64> = (0..120).map(|i| match i { 0..50 => 0.0, 50..70 => (i - 49) as f64 * 0.5, _ => 10.0 }).collect();
/// let c = HoldCriteria { tolerance: 0.1, min_samples: 30, settle_samples: 0 };
/// let ramps = find_ramps(&x, &c, 1.0)?;
/// assert_eq!(ramps.len(), 1);
/// assert_eq!((ramps[0].start, ramps[0].end, ramps[0].change()), (50, 69, 10.0));
/// # Ok::<(), gaugebook::PhysicsError>(())
/// ```
pub fn find_ramps(
    x: &[f64],
    criteria: &HoldCriteria,
    min_change: f64,
) -> Result<Vec<Ramp>, PhysicsError> {
    crate::check_positive("smallest ramp change", min_change, "")?;
    let holds = find_holds(x, criteria)?;
    Ok(holds
        .windows(2)
        .filter(|w| (w[1].mean - w[0].mean).abs() >= min_change)
        .map(|w| Ramp {
            start: w[0].end,
            end: w[1].start,
            from: w[0].mean,
            to: w[1].mean,
        })
        .collect())
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn staircase_with_noise_gives_each_step() {
        // Five levels of 400 samples joined by 100-sample ramps, ±0.2 deterministic noise.
        let levels = [0.0, 2.0, 4.0, 6.0, 3.0];
        let mut x = Vec::new();
        for (k, &l) in levels.iter().enumerate() {
            if k > 0 {
                let prev = levels[k - 1];
                x.extend((1..=100).map(|i| prev + (l - prev) * i as f64 / 100.0));
            }
            x.extend((0..400).map(|i| l + 0.2 * ((i * 7919 % 13) as f64 / 6.0 - 1.0)));
        }
        let c = HoldCriteria {
            tolerance: 0.5,
            min_samples: 200,
            settle_samples: 20,
        };
        let holds = find_holds(&x, &c).unwrap();
        assert_eq!(holds.len(), 5);
        for (h, l) in holds.iter().zip(levels) {
            assert!((h.mean - l).abs() < 0.05, "{h:?}");
            assert!(h.len() >= 400 && h.len() < 430, "{h:?}");
        }
        let ramps = find_ramps(&x, &c, 1.0).unwrap();
        assert_eq!(ramps.len(), 4);
        assert_eq!(ramps.iter().filter(|r| r.is_rising()).count(), 3);
    }

    #[test]
    fn a_slow_ramp_is_not_a_hold_when_min_samples_is_long_enough() {
        // Slope 0.01 per sample, tolerance 0.5: no 100-sample run stays within 0.5.
        let x: Vec<f64> = (0..10_000).map(|i| i as f64 * 0.01).collect();
        let c = HoldCriteria {
            tolerance: 0.5,
            min_samples: 100,
            settle_samples: 0,
        };
        assert!(find_holds(&x, &c).unwrap().is_empty());
        let c2 = HoldCriteria {
            tolerance: 0.5,
            min_samples: 40,
            settle_samples: 0,
        };
        assert!(!find_holds(&x, &c2).unwrap().is_empty()); // the documented failure mode
    }
}
