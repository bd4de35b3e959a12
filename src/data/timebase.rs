//! Sampling statistics of a log's time axis once it is read: median step, rate and gaps.

use super::stream::first_data_row;
use super::{Log, find_gaps, median_step};
use crate::Dimension;

/// Fills in the step, rate and gaps of `log.time`; `rows` maps samples to file rows when they
/// are not consecutive.
pub(crate) fn analyse(log: &mut Log, rows: Option<&[usize]>, gap_factor: f64) {
    let base = first_data_row(log.format);
    analyse_from(log, rows, gap_factor, base);
}

/// [`analyse`] for samples whose first lies on file row `base` (a block of a longer log).
pub(crate) fn analyse_from(log: &mut Log, rows: Option<&[usize]>, gap_factor: f64, base: usize) {
    let Some(t) = log.time.as_mut() else { return };
    let values = &t.channel.values;
    let Some(step) = median_step(values) else {
        return;
    };
    t.step = step;
    if t.channel.unit.dimension() == Dimension::TIME {
        t.sample_rate_hz = 1.0 / (step * t.channel.unit.factor());
    }
    let mut gaps = find_gaps(values, step, gap_factor, base);
    if let Some(rows) = rows {
        for g in &mut gaps {
            g.row = rows[g.row - base];
        }
    }
    t.gaps = gaps;
}
