//! Script objects that carry their state from block to block of a long log: a causal filter,
//! running statistics and a running least-squares line (the physics in
//! `src/signal/stream.rs` and `src/signal/running.rs`).
//!
//! A script that reads a log with `blocks(...)` holds one block at a time; these objects let it
//! filter, summarise and fit the whole record without holding it. Each remembers the unit of
//! the first column it saw and refuses a column of another dimension later, so a channel mixed
//! up between blocks is an error, not a silent average of strain and force.

use std::fmt;
use std::sync::Arc;

use rhai::{Array, Dynamic, Engine, INT, Map};

use super::bind::{Record, ScriptResult, fault, func, type_of};
use super::column::Column;
use super::signal::{design, quantity_like, same_unit, summary_record};
use crate::units::Quantity;
use crate::{
    FilterBand, MimeBundle, RunningLine, RunningSummary, StreamingBank, StreamingFilter, ToMime,
};

/// An empty column with `c`'s dimension, kind and unit: the template results are shown in.
fn template(c: &Column) -> Column {
    Column::from_si(
        Arc::new(Vec::new()),
        c.dimension(),
        c.kind(),
        c.unit().map(|u| Arc::new(u.clone())),
    )
}

/// Remembers the first column's unit; a later column must have its dimension.
fn check_like(like: &mut Option<Column>, x: &Column, what: &str) -> ScriptResult<()> {
    match like {
        None => {
            *like = Some(template(x));
            Ok(())
        }
        Some(l) if l.dimension() == x.dimension() => Ok(()),
        Some(l) => Err(fault(
            "UnitError",
            format!(
                "{what} was started with a column of {} and cannot take one of {}",
                l.dimension(),
                x.dimension()
            ),
        )),
    }
}

/// A causal filter whose state carries over from one `apply` to the next: of one channel, or
/// (applied to arrays) of several channels run side by side in a bank.
#[derive(Clone, Debug)]
pub(crate) struct RunningFilter {
    filter: StreamingFilter,
    /// Made by the first `apply` to an array, for that many channels.
    bank: Option<StreamingBank>,
    band: &'static str,
    like: Option<Column>,
    /// The units of the channels of the bank, from the first array.
    likes: Vec<Column>,
}

impl fmt::Display for RunningFilter {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        write!(
            f,
            "running {} filter, {} second-order sections",
            self.band,
            self.filter.filter().sections().len()
        )
    }
}

impl ToMime for RunningFilter {
    fn to_mime(&self) -> MimeBundle {
        MimeBundle::text(self.to_string())
    }
}

/// Running statistics of the columns added.
#[derive(Clone, Debug, Default)]
pub(crate) struct RunningStats {
    summary: RunningSummary,
    like: Option<Column>,
}

impl fmt::Display for RunningStats {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        write!(f, "running statistics of {} samples", self.summary.count())
    }
}

impl ToMime for RunningStats {
    fn to_mime(&self) -> MimeBundle {
        MimeBundle::text(self.to_string())
    }
}

/// A running least-squares line through the pairs added.
#[derive(Clone, Debug, Default)]
pub(crate) struct RunningFit {
    line: RunningLine,
    x: Option<Column>,
    y: Option<Column>,
    pairs: usize,
}

impl fmt::Display for RunningFit {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        write!(f, "running line fit of {} pairs", self.pairs)
    }
}

impl ToMime for RunningFit {
    fn to_mime(&self) -> MimeBundle {
        MimeBundle::text(self.to_string())
    }
}

fn running_filter(band: FilterBand, opts: &Map, name: &str) -> ScriptResult<RunningFilter> {
    let (f, zero_phase) = design(band, opts, name)?;
    if zero_phase {
        return Err(fault(
            "ArgumentError",
            format!(
                "{name} runs causally, block by block; `zero_phase` needs the whole record \
                 (use lowpass or highpass on it)"
            ),
        ));
    }
    Ok(RunningFilter {
        filter: StreamingFilter::new(f),
        bank: None,
        likes: Vec::new(),
        band: match band {
            FilterBand::LowPass => "low-pass",
            FilterBand::HighPass => "high-pass",
        },
        like: None,
    })
}

/// Registers the running filter, statistics and line.
pub(crate) fn register(engine: &mut Engine) {
    super::bind::register_display::<RunningFilter>(engine, "RunningFilter");
    super::bind::register_display::<RunningStats>(engine, "RunningStats");
    super::bind::register_display::<RunningFit>(engine, "RunningFit");

    func(
        "running_lowpass",
        &["options: Map"],
        "RunningFilter",
        r#"
        A causal low-pass filter for a record read in blocks: `f.apply(x)` filters the next
        block, carrying the filter's state over from the block before, so the blocks filtered
        in turn equal `lowpass` of the whole record (from rest). Options as `lowpass`, without
        `zero_phase`.
        ```rhai
        let design = #{ cutoff: 50.0 * Hz, rate: 1000.0 * Hz, order: 2 };
        let x = column([1.0, 0.0, 2.0, 5.0, 3.0, 1.0], "ue");
        let f = running_lowpass(design);
        let a = f.apply(x.slice(0, 2));
        let b = f.apply(x.slice(2, 6));
        let whole = lowpass(x, design);
        assert_close(b[3], whole[5], 1e-12);
        assert_close(a[1], whole[1], 1e-12);
        ```
    "#,
    )
    .register_into_engine(engine, |opts: Map| -> ScriptResult<RunningFilter> {
        running_filter(FilterBand::LowPass, &opts, "running_lowpass()")
    });

    func(
        "running_highpass",
        &["options: Map"],
        "RunningFilter",
        r#"
        The high-pass counterpart of `running_lowpass`.
        ```rhai
        let f = running_highpass(#{ cutoff: 1.0 * Hz, rate: 100.0 * Hz, order: 1 });
        let y = f.apply(column([2.0, 2.0, 2.0], "V"));
        assert_close(y[0], q("1.939061 V"), 1e-6); // 2 V times b0 = 1/(1 + tan(pi/100)), order 1
        ```
    "#,
    )
    .register_into_engine(engine, |opts: Map| -> ScriptResult<RunningFilter> {
        running_filter(FilterBand::HighPass, &opts, "running_highpass()")
    });

    func(
        "apply",
        &["filter: RunningFilter", "x: Column"],
        "Column",
        r#"
        Filters the next block of a record; the result keeps `x`'s unit. Every block must have
        the dimension of the first.
        ```rhai
        let f = running_lowpass(#{ cutoff: 10.0 * Hz, rate: 1000.0 * Hz });
        let y = f.apply(column([0.0, 0.0], "N"));
        assert_eq(y.len(), 2);
        ```
    "#,
    )
    .register_into_engine(
        engine,
        |f: &mut RunningFilter, x: Column| -> ScriptResult<Column> {
            if f.bank.is_some() {
                return Err(fault(
                    "ArgumentError",
                    "this running filter was started on an array of channels; use one filter per way of calling it",
                ));
            }
            check_like(&mut f.like, &x, "this running filter")?;
            let like = template(&x);
            // In place when the block is a temporary (`f.apply(e - z)`), else on a copy.
            let mut y = x.into_data();
            f.filter.process(&mut y)?;
            Ok(same_unit(&like, y))
        },
    );

    func(
        "apply",
        &["filter: RunningFilter", "channels: Array"],
        "Array",
        r#"
        Filters the next block of several channels at once (an array of columns of one length),
        run side by side, four to a pass; the result is the array of filtered columns, each in
        its channel's unit. The first array fixes the number of channels and their dimensions;
        a filter used on arrays is not used on single columns, nor the other way round.
        ```rhai
        let design = #{ cutoff: 50.0 * Hz, rate: 1000.0 * Hz, order: 2 };
        let a = column([1.0, 0.0, 2.0, 5.0], "ue");
        let b = column([3.0, 3.0, 1.0, 0.0], "N");
        let f = running_lowpass(design);
        let first = f.apply([a.slice(0, 2), b.slice(0, 2)]);
        let next = f.apply([a.slice(2, 4), b.slice(2, 4)]);
        assert_close(next[0][1], lowpass(a, design)[3], 1e-12);
        assert_close(next[1][1], lowpass(b, design)[3], 1e-12);
        assert_eq(first.len(), 2);
        ```
    "#,
    )
    .register_into_engine(
        engine,
        |f: &mut RunningFilter, channels: Array| -> ScriptResult<Array> {
            if f.like.is_some() {
                return Err(fault(
                    "ArgumentError",
                    "this running filter was started on single columns; use one filter per way of calling it",
                ));
            }
            let mut cols = Vec::with_capacity(channels.len());
            for (i, v) in channels.into_iter().enumerate() {
                let what = type_of(&v);
                cols.push(v.try_cast::<Column>().ok_or_else(|| {
                    fault(
                        "ArgumentError",
                        format!("item {i} of the channels to filter must be a Column, found {what}"),
                    )
                })?);
            }
            if f.bank.is_none() {
                f.bank = Some(StreamingBank::new(f.filter.filter().clone(), cols.len()));
                f.likes = cols.iter().map(template).collect();
            }
            if cols.len() != f.likes.len() {
                return Err(fault(
                    "ArgumentError",
                    format!(
                        "this running filter was started on {} channels, found {}",
                        f.likes.len(),
                        cols.len()
                    ),
                ));
            }
            for (i, (c, l)) in cols.iter().zip(&f.likes).enumerate() {
                if c.dimension() != l.dimension() {
                    return Err(fault(
                        "UnitError",
                        format!(
                            "channel {i} of this running filter was a column of {}, now one of {}",
                            l.dimension(),
                            c.dimension()
                        ),
                    ));
                }
            }
            // In place for columns no one else holds (`f.apply([a - z, …])`), else on copies.
            let mut data: Vec<Vec<f64>> = cols.into_iter().map(Column::into_data).collect();
            let mut parts: Vec<&mut [f64]> = data.iter_mut().map(|v| &mut v[..]).collect();
            if let Some(bank) = f.bank.as_mut() {
                bank.process(&mut parts)?;
            }
            Ok(data
                .into_iter()
                .zip(&f.likes)
                .map(|(v, l)| Dynamic::from(same_unit(l, v)))
                .collect())
        },
    );

    func(
        "running_stats",
        &[],
        "RunningStats",
        r#"
        Statistics gathered block by block: `s.add(x)` takes the next block, `s.summary()` gives
        what `stats` gives for all of them together (to round-off), `s.count` the samples so far.
        ```rhai
        let s = running_stats();
        s.add(column([1.0, 2.0], "ue"));
        s.add(column([3.0, 4.0], "ue"));
        let all = s.summary();
        assert_eq(all.count, 4);
        assert_close(all.std, stats(column([1.0, 2.0, 3.0, 4.0], "ue")).std, 1e-12);
        ```
    "#,
    )
    .register_into_engine(engine, RunningStats::default);

    func(
        "add",
        &["stats: RunningStats", "x: Column"],
        "()",
        r#"
        Adds a block to running statistics; every block must have the dimension of the first.
        ```rhai
        let s = running_stats();
        s.add(column([5.0], "N"));
        assert_eq(s.count, 1);
        ```
    "#,
    )
    .register_into_engine(
        engine,
        |s: &mut RunningStats, x: Column| -> ScriptResult<()> {
            check_like(&mut s.like, &x, "these running statistics")?;
            s.summary.add(x.data());
            Ok(())
        },
    );

    func(
        "summary",
        &["stats: RunningStats"],
        "Record",
        r#"
        Count, min, max, mean, standard deviation (n − 1), RMS and peak-to-peak of every sample
        added, in the unit of the first block; an error before two samples.
        ```rhai
        let s = running_stats();
        s.add(column([1.0, 3.0], "mV/V"));
        assert_close(s.summary().mean, q("2 mV/V"), 1e-12);
        ```
    "#,
    )
    .register_into_engine(engine, |s: &mut RunningStats| -> ScriptResult<Record> {
        let summary = s.summary.summary()?;
        let like = s
            .like
            .as_ref()
            .ok_or_else(|| fault("ArgumentError", "running statistics without any sample"))?;
        Ok(summary_record(like, &summary, "running statistics"))
    });

    func(
        "count",
        &["stats: RunningStats"],
        "i64",
        r#"
        Samples added so far (a property: `s.count`).
        ```rhai
        assert_eq(running_stats().count, 0);
        ```
    "#,
    )
    .register_into_engine(engine, |s: &mut RunningStats| s.summary.count() as INT);
    engine.register_get("count", |s: &mut RunningStats| s.summary.count() as INT);

    func(
        "running_fit",
        &[],
        "RunningFit",
        r#"
        A least-squares straight line `y = a + b·x` gathered block by block: `l.add(x, y)` takes
        the next pairs, `l.line()` gives `a` (in y's unit), `b` (y per x), `r2`, `rmse` (y's
        unit) and `count`, as the whole record fitted at once would (to round-off).
        ```rhai
        let l = running_fit();
        l.add(column([0.0, 100.0], "ue"), column([3.0, 1003.0], "N"));
        l.add(column([200.0], "ue"), column([2003.0], "N"));
        let line = l.line();
        assert_close(line.a, q("3 N"), 1e-9);
        assert_close(line.b, q("10 N/ue"), 1e-12);
        assert_close(line.r2, 1.0, 1e-12);
        ```
    "#,
    )
    .register_into_engine(engine, RunningFit::default);

    func(
        "add",
        &["fit: RunningFit", "x: Column", "y: Column"],
        "()",
        r#"
        Adds pairs (two columns of one length) to a running line fit; every block must have the
        dimensions of the first.
        ```rhai
        let l = running_fit();
        l.add(column([1.0, 2.0], "s"), column([2.0, 4.0], "m"));
        assert_eq(l.line().count, 2);
        ```
    "#,
    )
    .register_into_engine(
        engine,
        |l: &mut RunningFit, x: Column, y: Column| -> ScriptResult<()> {
            check_like(&mut l.x, &x, "the x of this running fit")?;
            check_like(&mut l.y, &y, "the y of this running fit")?;
            l.line.add(x.data(), y.data())?;
            l.pairs += x.len();
            Ok(())
        },
    );

    func(
        "line",
        &["fit: RunningFit"],
        "Record",
        r#"
        The fitted line: `a`, `b`, `r2`, `rmse`, `count`. An error before two pairs or when x
        never changes.
        ```rhai
        let l = running_fit();
        l.add(column([1.0, 2.0, 3.0], "s"), column([1.0, 2.0, 2.0], "m"));
        let f = l.line();
        assert_close(f.b, q("0.5 m/s"), 1e-12);
        assert_close(f.a, q("0.666666666666667 m"), 1e-12);
        ```
    "#,
    )
    .register_into_engine(engine, |l: &mut RunningFit| -> ScriptResult<Record> {
        let fit = l.line.fit()?;
        let (Some(x), Some(y)) = (l.x.as_ref(), l.y.as_ref()) else {
            return Err(fault("ArgumentError", "a running fit without any pair"));
        };
        let per_x = Quantity::from_si(1.0, x.dimension(), x.kind());
        let slope = Quantity::from_si(fit.slope, y.dimension(), y.kind()).div(&per_x);
        let slope = match (y.unit(), x.unit()) {
            // Shown per the x unit (N/ue), not per SI strain.
            (Some(yu), Some(xu)) => {
                let symbol = format!("{}/{}", yu.symbol(), xu.symbol());
                slope.to(&symbol).unwrap_or(slope)
            }
            _ => slope,
        };
        Ok(Record::new("running line fit")
            .field("a", quantity_like(y, fit.intercept))
            .field("b", rhai::Dynamic::from(slope))
            .field("r2", fit.r2)
            .field("rmse", quantity_like(y, fit.rmse))
            .field("count", fit.count as INT))
    });
}
