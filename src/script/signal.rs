//! Script bindings for signal processing, statistics, events and fatigue counting over
//! `Column`s (the physics in `src/signal/`), and, with feature `plot`, `plot(...)` figures.
//!
//! Every function takes whole columns and runs in Rust (DESIGN.md §5); results keep the input
//! column's unit. Cycle counts come back as a `Record` of columns (range, mean, count), not as
//! one object per cycle, so a long fatigue block stays cheap.

use std::sync::Arc;

use rhai::{Array, Dynamic, Engine, INT, Map};

use super::bind::{Options, Record, ScriptResult, Values, fault, func, values};
use super::column::Column;
use crate::Kind;
use crate::units::{Frequency, Quantity};
use crate::{
    Cycle, FilterBand, HoldCriteria, SnCurve, SosFilter, Summary, find_holds, find_ramps,
    miner_damage, rainflow_cycles, range_histogram, summarize, summarize_windows,
};
use uom::si::frequency::hertz;

/// A column with the same dimension, kind and display unit as `like`, from SI values.
pub(super) fn same_unit(like: &Column, data: Vec<f64>) -> Column {
    Column::from_si(
        Arc::new(data),
        like.dimension(),
        like.kind(),
        like.unit().map(|u| Arc::new(u.clone())),
    )
}

/// A quantity in `like`'s unit, from an SI value, as a script value.
pub(super) fn quantity_like(like: &Column, si: f64) -> Dynamic {
    Dynamic::from(match like.unit() {
        Some(u) => Quantity::in_unit(u.from_si(si), Arc::new(u.clone())),
        None => Quantity::from_si(si, like.dimension(), like.kind()),
    })
}

/// The unit a band or a change of `x` is read in: `x`'s display unit (or, without one, the SI
/// unit it shows in), except that for temperature readings (°C) a band is a temperature
/// difference, read in K.
fn difference_unit(x: &Column) -> String {
    if x.kind() == Kind::AbsoluteTemperature {
        return "K".into();
    }
    x.unit()
        .cloned()
        .or_else(|| Quantity::from_si(1.0, x.dimension(), x.kind()).shown_unit())
        .map(|u| u.symbol().to_string())
        .unwrap_or_default()
}

/// A band or change of `x` (key `key` of `func`'s options) in SI. On a temperature-reading
/// column it must be a temperature difference: a reading there (`0.2 °C`, which is 273.35 K
/// from absolute zero) is refused rather than read as a huge band.
fn difference(x: &Column, v: &Dynamic, key: &str, func: &str) -> ScriptResult<f64> {
    let what = format!("key `{key}` in options of {func}");
    if x.kind() == Kind::AbsoluteTemperature
        && v.read_lock::<Quantity>()
            .is_some_and(|q| q.kind() == Kind::AbsoluteTemperature)
    {
        return Err(fault(
            "UnitError",
            format!(
                "{what} must be a temperature difference on a column of temperature readings \
                 (write 0.2 K), found {}",
                super::bind::type_of(v)
            ),
        ));
    }
    match values(v, &what, &difference_unit(x))? {
        Values::One(si) => Ok(si),
        Values::Many(_) => Err(fault(
            "ArgumentError",
            format!("{what} must be a single quantity, found a column"),
        )),
    }
}

/// A difference of `x`'s values (a peak-to-peak, a step) as a script quantity: in `x`'s unit,
/// or in K for a column of temperature readings.
fn difference_like(x: &Column, si: f64) -> Dynamic {
    if x.kind() == Kind::AbsoluteTemperature {
        return Dynamic::from(Quantity::from_si(
            si,
            x.dimension(),
            Kind::TemperatureInterval,
        ));
    }
    quantity_like(x, si)
}

/// A plain-number column.
fn plain(data: Vec<f64>) -> ScriptResult<Column> {
    Ok(Column::new(data, "")?)
}

fn positive_int(x: INT, what: &str) -> ScriptResult<usize> {
    usize::try_from(x).ok().filter(|&n| n > 0).ok_or_else(|| {
        fault(
            "ArgumentError",
            format!("{what} must be a whole number above 0, found {x}"),
        )
    })
}

/// One Hz value from a `Quantity` argument.
fn frequency(x: &Dynamic, what: &str) -> ScriptResult<Frequency> {
    match values(x, what, "Hz")? {
        Values::One(si) => Ok(Frequency::new::<hertz>(si)),
        Values::Many(_) => Err(fault(
            "ArgumentError",
            format!("{what} must be a single frequency, found a column"),
        )),
    }
}

/// The filter an options map describes (`cutoff`, `rate`, `order`, `design`).
pub(super) fn design(band: FilterBand, opts: &Map, name: &str) -> ScriptResult<(SosFilter, bool)> {
    let o = Options::new(
        opts,
        name,
        &["cutoff", "rate", "order", "design", "zero_phase"],
    )?;
    let cutoff = frequency(
        o.raw("cutoff").ok_or_else(|| {
            fault(
                "ArgumentError",
                format!("missing key `cutoff` in options of {name}"),
            )
        })?,
        "key `cutoff`",
    )?;
    let rate = frequency(
        o.raw("rate").ok_or_else(|| {
            fault(
                "ArgumentError",
                format!("missing key `rate` in options of {name}"),
            )
        })?,
        "key `rate`",
    )?;
    let order = o.opt_f64("order")?.unwrap_or(2.0);
    if order.fract() != 0.0 || order < 0.0 {
        return Err(fault(
            "ArgumentError",
            format!("key `order` in options of {name} must be a whole number, found {order}"),
        ));
    }
    let kind = o
        .opt_string("design")?
        .unwrap_or_else(|| "butterworth".to_string());
    let f = match kind.as_str() {
        "butterworth" => SosFilter::butterworth(order as usize, band, cutoff, rate)?,
        "bessel" => SosFilter::bessel(order as usize, band, cutoff, rate)?,
        other => {
            return Err(fault(
                "ArgumentError",
                format!(
                    "key `design` in options of {name} must be \"butterworth\" or \"bessel\", found \"{other}\""
                ),
            ));
        }
    };
    Ok((f, o.opt_bool("zero_phase")?.unwrap_or(false)))
}

fn run_filter(x: &Column, f: &SosFilter, zero_phase: bool) -> ScriptResult<Column> {
    let y = if zero_phase {
        f.filter_zero_phase(x.data())?
    } else {
        let mut y = x.data().as_ref().clone();
        f.filter_in_place(&mut y)?;
        y
    };
    Ok(same_unit(x, y))
}

pub(super) fn summary_record(x: &Column, s: &Summary, title: &str) -> Record {
    Record::new(title)
        .field("count", s.count as INT)
        .field("min", quantity_like(x, s.min))
        .field("max", quantity_like(x, s.max))
        .field("mean", quantity_like(x, s.mean))
        .field("std", quantity_like(x, s.std_dev))
        .field("rms", quantity_like(x, s.rms))
        .field("peak_to_peak", quantity_like(x, s.peak_to_peak))
}

fn hold_criteria(x: &Column, opts: &Map, name: &str, extra: &[&str]) -> ScriptResult<HoldCriteria> {
    let mut allowed = vec!["tolerance", "min_samples", "settle_samples"];
    allowed.extend_from_slice(extra);
    let o = Options::new(opts, name, &allowed)?;
    let tol = match o.raw("tolerance") {
        Some(v) => difference(x, v, "tolerance", name)?,
        None => {
            return Err(fault(
                "ArgumentError",
                format!("missing key `tolerance` in options of {name}"),
            ));
        }
    };
    let min = o.f64("min_samples")?;
    let settle = o.opt_f64("settle_samples")?.unwrap_or(0.0);
    for (k, v) in [("min_samples", min), ("settle_samples", settle)] {
        if v.fract() != 0.0 || v < 0.0 {
            return Err(fault(
                "ArgumentError",
                format!("key `{k}` in options of {name} must be a whole number, found {v}"),
            ));
        }
    }
    Ok(HoldCriteria {
        tolerance: tol,
        min_samples: min as usize,
        settle_samples: settle as usize,
    })
}

/// Counted cycles as script columns (see `rainflow()`); fields `range`, `mean`, `count`,
/// `start` and `cycles` (the total).
#[derive(Clone, Debug)]
struct Cycles {
    range: Column,
    mean: Column,
    count: Column,
    start: Column,
    cycles: Vec<Cycle>,
}

impl std::fmt::Display for Cycles {
    fn fmt(&self, f: &mut std::fmt::Formatter<'_>) -> std::fmt::Result {
        let total: f64 = self.cycles.iter().map(|c| c.count).sum();
        write!(
            f,
            "rainflow cycles (ASTM E1049-85 §5.4.4): {total} cycles in {} ranges",
            self.cycles.len()
        )
    }
}

impl crate::ToMime for Cycles {
    fn to_mime(&self) -> crate::MimeBundle {
        crate::MimeBundle::text(self.to_string())
    }
}

fn cycles_of(x: &Column, cycles: Vec<Cycle>) -> ScriptResult<Cycles> {
    // A range is a difference: an offset unit (degC) would misread it, so such columns show SI.
    let unit = x
        .unit()
        .filter(|u| u.offset() == 0.0)
        .map(|u| Arc::new(u.clone()));
    let range = Column::from_si(
        Arc::new(cycles.iter().map(|c| c.range).collect()),
        x.dimension(),
        x.kind(),
        unit,
    );
    Ok(Cycles {
        range,
        mean: same_unit(x, cycles.iter().map(|c| c.mean).collect()),
        count: plain(cycles.iter().map(|c| c.count).collect())?,
        start: plain(cycles.iter().map(|c| c.start as f64).collect())?,
        cycles,
    })
}

/// Registers the signal functions.
pub(crate) fn register(engine: &mut Engine) {
    super::bind::register_display::<Cycles>(engine, "Cycles");
    engine.register_get("range", |c: &mut Cycles| c.range.clone());
    engine.register_get("mean", |c: &mut Cycles| c.mean.clone());
    engine.register_get("count", |c: &mut Cycles| c.count.clone());
    engine.register_get("start", |c: &mut Cycles| c.start.clone());
    engine.register_get("cycles", |c: &mut Cycles| {
        c.cycles.iter().map(|c| c.count).sum::<f64>()
    });

    func(
        "lowpass",
        &["x: Column", "options: Map"],
        "Column",
        r#"
        Low-pass filters a column: Butterworth (default) or Bessel sections, designed like
        scipy.signal.butter / bessel (bilinear transform, prewarped), run causally from rest or,
        with `zero_phase: true`, forward and backward like scipy.signal.sosfiltfilt.

        Options: `cutoff` and `rate` (frequencies), `order` (default 2), `design`
        (`"butterworth"` or `"bessel"`), `zero_phase` (default false).
        ```rhai
        let x = column([1.0, 1.0, 1.0, 1.0], "mV/V");
        let y = lowpass(x, #{ cutoff: 50.0 * Hz, rate: 1000.0 * Hz, order: 2 });
        assert_close(y[0], q("0.020083365564211 mV/V"), 1e-9); // b0 of butter(2, 0.1)
        let z = lowpass(column([2.0, 2.0, 2.0, 2.0, 2.0, 2.0, 2.0, 2.0, 2.0, 2.0], "N"), #{ cutoff: 50.0 * Hz, rate: 1000.0 * Hz, order: 1, zero_phase: true });
        assert_close(z[5], q("2 N"), 1e-12);
        ```
    "#,
    )
    .register_into_engine(engine, |x: &mut Column, opts: Map| -> ScriptResult<Column> {
        let (f, zp) = design(FilterBand::LowPass, &opts, "lowpass()")?;
        run_filter(x, &f, zp)
    });

    func(
        "highpass",
        &["x: Column", "options: Map"],
        "Column",
        r#"
        High-pass filters a column; the same options as `lowpass`.
        ```rhai
        let x = column([5.0, 5.0, 5.0, 5.0, 5.0, 5.0, 5.0, 5.0, 5.0, 5.0, 5.0, 5.0, 5.0, 5.0, 5.0, 5.0, 5.0, 5.0, 5.0, 5.0, 5.0, 5.0, 5.0, 5.0, 5.0, 5.0, 5.0, 5.0, 5.0, 5.0], "V");
        let y = highpass(x, #{ cutoff: 10.0 * Hz, rate: 100.0 * Hz, design: "bessel", order: 2, zero_phase: true });
        assert_close(y[15], q("0 V"), 0.0, 1e-9); // a constant has no content above DC
        ```
    "#,
    )
    .register_into_engine(engine, |x: &mut Column, opts: Map| -> ScriptResult<Column> {
        let (f, zp) = design(FilterBand::HighPass, &opts, "highpass()")?;
        run_filter(x, &f, zp)
    });

    func(
        "moving_average",
        &["x: Column", "window: i64"],
        "Column",
        r#"
        Means of `window` consecutive samples; `len - window + 1` values (numpy.convolve "valid").
        ```rhai
        let y = moving_average(column([1.0, 2.0, 3.0, 4.0], "kN"), 2);
        assert_eq(y.len, 3);
        assert_close(y[0], q("1.5 kN"), 1e-12);
        ```
    "#,
    )
    .register_into_engine(engine, |x: &mut Column, w: INT| -> ScriptResult<Column> {
        let w = positive_int(w, "moving-average window")?;
        Ok(same_unit(x, crate::moving_average(x.data(), w)?))
    });

    func(
        "decimate",
        &["x: Column", "factor: i64"],
        "Column",
        r#"
        Every `factor`-th sample after an 8th-order Butterworth anti-alias low-pass at 0.8 × the
        new Nyquist frequency, applied zero-phase.
        ```rhai
        let x = linspace(0.0 * V, 0.0 * V, 100) + 1.0 * V;
        let y = decimate(x, 4);
        assert_eq(y.len, 25);
        assert_close(y[10], q("1 V"), 1e-12);
        ```
    "#,
    )
    .register_into_engine(engine, |x: &mut Column, k: INT| -> ScriptResult<Column> {
        let k = positive_int(k, "decimation factor")?;
        Ok(same_unit(x, crate::decimate(x.data(), k)?))
    });

    func(
        "resample",
        &["time: Column", "x: Column", "new_time: Column"],
        "Column",
        r#"
        Values of `x` (sampled at `time`) at `new_time`, by linear interpolation; no extrapolation.
        ```rhai
        let t = column([0.0, 1.0, 2.0], "s");
        let y = resample(t, column([0.0, 10.0, 0.0], "N"), column([0.5, 1.25], "s"));
        assert_close(y[1], q("7.5 N"), 1e-12);
        ```
    "#,
    )
    .register_into_engine(
        engine,
        |t: Column, x: Column, nt: Column| -> ScriptResult<Column> {
            let s = crate::Unit::parse("s")?;
            for (c, what) in [(&t, "time"), (&nt, "new_time")] {
                if c.dimension() != s.dimension() {
                    return Err(fault(
                        "UnitError",
                        format!("{what} must be a column of times, found {}", c.describe()),
                    ));
                }
            }
            Ok(same_unit(
                &x,
                crate::resample_linear(t.data(), x.data(), nt.data())?,
            ))
        },
    );

    func(
        "stats",
        &["x: Column"],
        "Record",
        r#"
        Count, min, max, mean, standard deviation (n − 1), RMS and peak-to-peak of a column.
        ```rhai
        let s = stats(column([1.0, 2.0, 3.0, 4.0], "ue"));
        assert_eq(s.count, 4);
        assert_close(s.std, q("1.2909944487358056 ue"), 1e-12);
        assert_close(s.peak_to_peak, q("3 ue"), 1e-12);
        ```
    "#,
    )
    .register_into_engine(engine, |x: &mut Column| -> ScriptResult<Record> {
        Ok(summary_record(x, &summarize(x.data())?, "statistics"))
    });

    func(
        "window_stats",
        &["x: Column", "window: i64"],
        "Array",
        r#"
        `stats` of consecutive windows of `window` samples (a last window of 2 or more included).
        ```rhai
        let w = window_stats(column([1.0, 3.0, 10.0, 20.0, 5.0], "N"), 2);
        assert_eq(w.len(), 2);
        assert_close(w[1].mean, q("15 N"), 1e-12);
        ```
    "#,
    )
    .register_into_engine(engine, |x: &mut Column, w: INT| -> ScriptResult<Array> {
        let w = positive_int(w, "statistics window")?;
        Ok(summarize_windows(x.data(), w)?
            .iter()
            .enumerate()
            .map(|(k, s)| Dynamic::from(summary_record(x, s, &format!("window {k}"))))
            .collect())
    });

    func(
        "rising_crossings",
        &["x: Column", "level: Quantity"],
        "i64",
        r#"
        Number of samples with x[i−1] < level ≤ x[i].
        ```rhai
        assert_eq(rising_crossings(column([0.0, 1.0, 0.0, 0.5, 2.0], "V"), 0.5 * V), 2);
        ```
    "#,
    )
    .register_into_engine(
        engine,
        |x: &mut Column, level: Quantity| -> ScriptResult<INT> {
            let unit = x.unit().map(|u| u.symbol().to_string()).unwrap_or_default();
            let l = match values(&Dynamic::from(level), "level", &unit)? {
                Values::One(si) => si,
                Values::Many(_) => {
                    return Err(fault("ArgumentError", "level must be a single quantity"));
                }
            };
            Ok(crate::rising_crossings(x.data(), l) as INT)
        },
    );

    func(
        "rising_crossings",
        &["blocks: Array", "level: Quantity"],
        "i64",
        r#"
        Rising crossings of a record held as consecutive blocks (an array of columns of one
        dimension), counted across the joins too, without joining them.
        ```rhai
        let blocks = [column([0.0, 1.0, 0.0], "V"), column([0.5, 2.0], "V")];
        assert_eq(rising_crossings(blocks, 0.5 * V), 2);
        ```
    "#,
    )
    .register_into_engine(engine, |blocks: Array, level: Quantity| -> ScriptResult<INT> {
        let cols = super::column::array_columns(&blocks, "the blocks of rising_crossings()")?;
        for (i, c) in cols.iter().enumerate() {
            if c.dimension() != level.dimension() {
                return Err(fault(
                    "UnitError",
                    format!(
                        "item {i} of the blocks of rising_crossings() is a column of {}, the level {}",
                        c.dimension(),
                        level.dimension()
                    ),
                ));
            }
        }
        let unit = match cols.first() {
            Some(c) => c.unit().map(|u| u.symbol().to_string()).unwrap_or_default(),
            None => return Ok(0),
        };
        let l = match values(&Dynamic::from(level), "level", &unit)? {
            Values::One(si) => si,
            Values::Many(_) => {
                return Err(fault("ArgumentError", "level must be a single quantity"));
            }
        };
        Ok(crate::rising_crossings_in_blocks(cols.iter().map(|c| c.data().as_slice()), l) as INT)
    });

    func(
        "holds",
        &["x: Column", "criteria: Map"],
        "Array",
        r#"
        Holds (plateaus): runs of at least `min_samples` samples whose peak-to-peak stays within
        `tolerance`; `settle_samples` at each end are left out of the mean. Each is a record with
        `start`, `end` (sample indices, end exclusive), `mean` and `peak_to_peak`. On a column
        of temperature readings (°C) the tolerance is a temperature difference (`0.2 * K`).
        ```rhai
        let x = column([0.0, 0.0, 0.0, 0.0, 5.0, 10.0, 10.0, 10.0, 10.0, 10.0], "kN");
        let h = holds(x, #{ tolerance: 0.1 * kN, min_samples: 3 });
        assert_eq(h.len(), 2);
        assert_eq(h[1].start, 5);
        assert_close(h[1].mean, q("10 kN"), 1e-12);
        let t = column([20.0, 20.1, 20.0, 40.0, 40.1, 40.0], "degC");
        let soaks = holds(t, #{ tolerance: 0.2 * K, min_samples: 3 });
        assert_eq(soaks.len(), 2);
        assert_close(soaks[1].mean, q("40.0333333333 degC"), 1e-9);
        assert_close(soaks[1].peak_to_peak, q("0.1 K"), 1e-9);
        ```
    "#,
    )
    .register_into_engine(engine, |x: &mut Column, opts: Map| -> ScriptResult<Array> {
        let c = hold_criteria(x, &opts, "holds()", &[])?;
        Ok(find_holds(x.data(), &c)?
            .iter()
            .map(|h| {
                Dynamic::from(
                    Record::new("hold")
                        .field("start", h.start as INT)
                        .field("end", h.end as INT)
                        .field("mean", quantity_like(x, h.mean))
                        .field("peak_to_peak", difference_like(x, h.peak_to_peak)),
                )
            })
            .collect())
    });

    func(
        "ramps",
        &["x: Column", "criteria: Map"],
        "Array",
        r#"
        Ramps: the stretches between consecutive holds (criteria as for `holds`) whose levels
        differ by at least `min_change`. Records with `start`, `end`, `from`, `to`, `rising`.
        ```rhai
        let x = column([0.0, 0.0, 0.0, 0.0, 5.0, 10.0, 10.0, 10.0, 10.0, 10.0], "kN");
        let r = ramps(x, #{ tolerance: 0.1 * kN, min_samples: 3, min_change: 1.0 * kN });
        assert_eq(r.len(), 1);
        assert(r[0].rising);
        assert_close(r[0].to, q("10 kN"), 1e-12);
        ```
    "#,
    )
    .register_into_engine(engine, |x: &mut Column, opts: Map| -> ScriptResult<Array> {
        let c = hold_criteria(x, &opts, "ramps()", &["min_change"])?;
        let min_change = match opts.get("min_change") {
            Some(v) => difference(x, v, "min_change", "ramps()")?,
            None => {
                return Err(fault(
                    "ArgumentError",
                    "missing key `min_change` in options of ramps()",
                ));
            }
        };
        Ok(find_ramps(x.data(), &c, min_change)?
            .iter()
            .map(|r| {
                Dynamic::from(
                    Record::new("ramp")
                        .field("start", r.start as INT)
                        .field("end", r.end as INT)
                        .field("from", quantity_like(x, r.from))
                        .field("to", quantity_like(x, r.to))
                        .field("rising", r.is_rising()),
                )
            })
            .collect())
    });

    func(
        "rainflow",
        &["x: Column"],
        "Cycles",
        r#"
        Rainflow cycles by ASTM E1049-85 (2017) §5.4.4 (three-point method with half cycles): a
        `Cycles` value with columns `range`, `mean`, `count` (1 or 0.5), `start` (sample index)
        and the total `cycles`.
        ```rhai
        let c = rainflow(column([-2.0, 1.0, -3.0, 5.0, -1.0, 3.0, -4.0, 4.0, -2.0], "MPa"));
        assert_close(c.cycles, 4.0, 1e-12);
        assert_close(c.range.max(), q("9 MPa"), 1e-12);
        ```
    "#,
    )
    .register_into_engine(engine, |x: &mut Column| -> ScriptResult<Cycles> {
        cycles_of(x, rainflow_cycles(x.data())?)
    });

    func(
        "rainflow",
        &["blocks: Array"],
        "Cycles",
        r#"
        Rainflow cycles (as above) of a record held as consecutive blocks (an array of columns of
        one dimension), counted block by block without joining them; `start` counts samples from
        the first block's first. The same cycles as of the joined record.
        ```rhai
        let whole = rainflow(column([-2.0, 1.0, -3.0, 5.0, -1.0, 3.0, -4.0, 4.0, -2.0], "MPa"));
        let parts = rainflow([column([-2.0, 1.0, -3.0, 5.0], "MPa"), column([-1.0, 3.0, -4.0, 4.0, -2.0], "MPa")]);
        assert_eq(parts.cycles, whole.cycles);
        assert_eq(parts.start.values(""), whole.start.values(""));
        ```
    "#,
    )
    .register_into_engine(engine, |blocks: Array| -> ScriptResult<Cycles> {
        let cols = super::column::record_blocks(&blocks, "the blocks of rainflow()")?;
        let mut counter = crate::RainflowCounter::new();
        for c in &cols {
            counter.add(c.data())?;
        }
        let first = &cols[0];
        cycles_of(first, counter.finish())
    });

    func(
        "range_histogram",
        &["cycles: Cycles", "width: Quantity"],
        "Record",
        r#"
        Cycle counts of a `rainflow` record in range bins (upper − width, upper]: columns `upper`
        and `count`, every bin up to the largest range listed.
        ```rhai
        let c = rainflow(column([-2.0, 1.0, -3.0, 5.0, -1.0, 3.0, -4.0, 4.0, -2.0], "MPa"));
        let h = range_histogram(c, 5.0 * MPa);
        assert_eq(h.count.values(""), [2.0, 2.0]);
        assert_close(h.upper[1], q("10 MPa"), 1e-12);
        ```
    "#,
    )
    .register_into_engine(
        engine,
        |c: &mut Cycles, width: Quantity| -> ScriptResult<Record> {
            let (range, cycles) = (&c.range, &c.cycles);
            let unit = range
                .unit()
                .map(|u| u.symbol().to_string())
                .unwrap_or_default();
            let w = match values(&Dynamic::from(width), "width", &unit)? {
                Values::One(si) => si,
                Values::Many(_) => {
                    return Err(fault("ArgumentError", "width must be a single quantity"));
                }
            };
            let bins = range_histogram(cycles, w)?;
            Ok(Record::new("range histogram")
                .field(
                    "upper",
                    Dynamic::from(same_unit(range, bins.iter().map(|b| b.upper).collect())),
                )
                .field(
                    "count",
                    Dynamic::from(plain(bins.iter().map(|b| b.count).collect())?),
                ))
        },
    );

    func(
        "miner_damage",
        &["cycles: Cycles", "curve: Map"],
        "f64",
        r#"
        Palmgren–Miner damage Σ n/N of a `rainflow` record for the Basquin curve through
        (`range`, `cycles`) with slope `m`: N = cycles·(S/range)^−m, S the cycle range; ranges
        below an optional `endurance_limit` do no damage. A design estimate that must be proven
        by test; fatigue rating follows local codes and licensed practice.
        ```rhai
        let c = rainflow(column([0.0, 100.0, 0.0, 100.0, 0.0], "MPa"));
        let d = miner_damage(c, #{ range: 100.0 * MPa, cycles: 1e6, m: 3.0 });
        assert_close(d, 2e-6, 1e-12);
        ```
    "#,
    )
    .register_into_engine(engine, |c: &mut Cycles, opts: Map| -> ScriptResult<f64> {
        let (range, cycles) = (&c.range, &c.cycles);
        let o = Options::new(
            &opts,
            "miner_damage()",
            &["range", "cycles", "m", "endurance_limit"],
        )?;
        let unit = range
            .unit()
            .map(|u| u.symbol().to_string())
            .unwrap_or_default();
        let one = |k: &str| -> ScriptResult<f64> {
            match o.values(k, &unit)? {
                Values::One(si) => Ok(si),
                Values::Many(_) => Err(fault(
                    "ArgumentError",
                    format!("key `{k}` must be a single quantity"),
                )),
            }
        };
        let s_ref = one("range")?;
        let n_ref = o.f64("cycles")?;
        let m = o.f64("m")?;
        crate::check_positive("reference range", s_ref, "")?;
        // N = N_ref (S/S_ref)^−m, i.e. Basquin's C = N_ref · S_ref^m (in SI).
        let mut curve = SnCurve::basquin(n_ref * s_ref.powf(m), m)?;
        if o.has("endurance_limit") {
            curve = curve.with_endurance_limit(one("endurance_limit")?)?;
        }
        Ok(miner_damage(cycles, &curve))
    });

    #[cfg(feature = "plot")]
    plot::register(engine);
}

#[cfg(feature = "plot")]
mod plot {
    //! `plot(...)`, `histogram(...)`, `calibration_plot(...)` and `save(...)` for figures.

    use super::*;
    use crate::{Axis, Panel, Plot};
    use rhai::NativeCallContext;

    fn axis_of(c: &Column, name: &str) -> Axis {
        Axis::new(
            name,
            c.unit().map(|u| u.symbol().to_string()).unwrap_or_default(),
        )
    }

    /// The column's numbers in its display unit.
    fn shown(c: &Column) -> ScriptResult<std::borrow::Cow<'_, [f64]>> {
        shown_like(c, c)
    }

    /// The column's numbers in `like`'s display unit (the blocks of a record are drawn in the
    /// first block's unit, which labels the axis).
    fn shown_like<'a>(c: &'a Column, like: &Column) -> ScriptResult<std::borrow::Cow<'a, [f64]>> {
        match like.unit() {
            // Already in its display unit (s, N, V): no copy of a long channel.
            Some(u) if u.factor() == 1.0 && u.offset() == 0.0 => Ok(c.data().as_slice().into()),
            Some(u) => Ok(c.values_in(u.symbol())?.into()),
            None => Ok(c.data().as_slice().into()),
        }
    }

    fn text_opt(o: &Options, k: &str, default: &str) -> ScriptResult<String> {
        Ok(o.opt_string(k)?.unwrap_or_else(|| default.to_string()))
    }

    /// The figure of one panel with the `title` and `size` options.
    fn figure(o: &Options, panel: Panel) -> ScriptResult<Plot> {
        let mut fig = Plot::new(text_opt(o, "title", "")?).with_panel(panel);
        if let Some(v) = o.raw("size") {
            let a = v
                .read_lock::<Array>()
                .map(|a| a.clone())
                .unwrap_or_default();
            let w = a.first().and_then(|v| v.as_int().ok());
            let h = a.get(1).and_then(|v| v.as_int().ok());
            match (w, h) {
                (Some(w), Some(h)) if a.len() == 2 => {
                    fig = fig
                        .with_size(
                            w.clamp(0, u32::MAX as INT) as u32,
                            h.clamp(0, u32::MAX as INT) as u32,
                        )
                        .map_err(|e| fault("PlotError", e.to_string()))?;
                }
                _ => {
                    return Err(fault(
                        "ArgumentError",
                        "key `size` in options of plot() must be [width, height] in pixels",
                    ));
                }
            }
        }
        Ok(fig)
    }

    pub(super) fn register(engine: &mut Engine) {
        super::super::bind::register_display::<Plot>(engine, "Plot");

        func(
            "plot",
            &["x: Column", "y: Dynamic", "options: Map"],
            "Plot",
            r#"
            A line figure of one column or an array of columns `y` against `x`, axes labelled with
            the columns' units; millions of samples are thinned per pixel column, extremes kept.
            Options: `title`, `x_name`, `y_name`, `names` (array of strings), `size` ([w, h] px).
            ```rhai
            let t = column([0.0, 0.5, 1.0], "s");
            let p = plot(t, [column([0.0, 1.0, 2.0], "V"), column([0.0, 1.5, 3.0], "V")], #{ title: "ramps", y_name: "output", names: ["a", "b"] });
            let svg = p.to_svg();
            assert(svg.contains("output (V)") && svg.contains("x (s)"));
            ```
        "#,
        )
        .register_into_engine(engine, |x: Column, y: Dynamic, opts: Map| -> ScriptResult<Plot> {
            let o = Options::new(&opts, "plot()", &["title", "x_name", "y_name", "names", "size"])?;
            let ys: Vec<Column> = if let Some(c) = y.read_lock::<Column>() {
                vec![c.clone()]
            } else if let Some(a) = y.read_lock::<Array>() {
                a.iter()
                    .map(|v| v.read_lock::<Column>().map(|c| c.clone()).ok_or_else(|| fault("ArgumentError", "plot() y must be a column or an array of columns")))
                    .collect::<ScriptResult<Vec<Column>>>()?
            } else {
                return Err(fault("ArgumentError", "plot() y must be a column or an array of columns"));
            };
            if ys.is_empty() {
                return Err(fault("ArgumentError", "plot() needs at least one column to draw"));
            }
            let names: Vec<String> = match o.raw("names") {
                Some(v) => v
                    .read_lock::<Array>()
                    .map(|a| a.iter().map(|s| s.to_string()).collect())
                    .ok_or_else(|| fault("ArgumentError", "key `names` in options of plot() must be an array of strings"))?,
                None => (1..=ys.len()).map(|k| format!("y{k}")).collect(),
            };
            let xv = shown(&x)?;
            let mut panel = Panel::new(axis_of(&x, &text_opt(&o, "x_name", "x")?), axis_of(&ys[0], &text_opt(&o, "y_name", "y")?));
            for (k, c) in ys.iter().enumerate() {
                let name = names.get(k).cloned().unwrap_or_else(|| format!("y{}", k + 1));
                panel = panel.line(&name, &xv, &shown(c)?).map_err(|e| fault("PlotError", e.to_string()))?;
            }
            figure(&o, panel)
        });

        func(
            "plot",
            &["x: Array", "y: Array", "options: Map"],
            "Plot",
            r#"
            A line figure of one record held as consecutive blocks: `y`'s blocks against `x`'s (two
            arrays of columns, block for block of one length), thinned block by block without
            joining them. Options as above (`names` takes the one name).
            ```rhai
            let t = [column([0.0, 0.5], "s"), column([1.0, 1.5], "s")];
            let f = [column([0.0, 1.0], "kN"), column([2.0, 1.0], "kN")];
            let p = plot(t, f, #{ title: "load", y_name: "load" });
            assert(p.to_svg().contains("load (kN)"));
            ```
        "#,
        )
        .register_into_engine(
            engine,
            |x: Array, y: Array, opts: Map| -> ScriptResult<Plot> {
                let o = Options::new(
                    &opts,
                    "plot()",
                    &["title", "x_name", "y_name", "names", "size"],
                )?;
                let xs = super::super::column::record_blocks(&x, "the x blocks of plot()")?;
                let ys = super::super::column::record_blocks(&y, "the y blocks of plot()")?;
                if xs.len() != ys.len() {
                    return Err(fault(
                        "ArgumentError",
                        format!("plot() has {} x blocks but {} y blocks", xs.len(), ys.len()),
                    ));
                }
                let (x0, y0) = (&xs[0], &ys[0]);
                let xv = xs
                    .iter()
                    .map(|c| shown_like(c, x0))
                    .collect::<ScriptResult<Vec<_>>>()?;
                let yv = ys
                    .iter()
                    .map(|c| shown_like(c, y0))
                    .collect::<ScriptResult<Vec<_>>>()?;
                let blocks: Vec<(&[f64], &[f64])> = xv
                    .iter()
                    .zip(&yv)
                    .map(|(a, b)| (a.as_ref(), b.as_ref()))
                    .collect();
                let name = match o.raw("names") {
                    Some(v) => v
                        .read_lock::<Array>()
                        .and_then(|a| a.first().map(|s| s.to_string()))
                        .ok_or_else(|| {
                            fault(
                                "ArgumentError",
                                "key `names` in options of plot() must be an array of strings",
                            )
                        })?,
                    None => "y1".to_string(),
                };
                let panel = Panel::new(
                    axis_of(x0, &text_opt(&o, "x_name", "x")?),
                    axis_of(y0, &text_opt(&o, "y_name", "y")?),
                )
                .line_blocks(&name, &blocks)
                .map_err(|e| fault("PlotError", e.to_string()))?;
                figure(&o, panel)
            },
        );

        func(
            "histogram",
            &["x: Column", "bins: i64"],
            "Plot",
            r#"
            A histogram figure of a column's values in `bins` equal bins (numpy.histogram's rule).
            ```rhai
            let h = histogram(column([0.1, 0.2, 0.2, 0.9], "uV/V"), 4);
            assert(h.to_svg().contains("<rect"));
            ```
        "#,
        )
        .register_into_engine(engine, |x: &mut Column, bins: INT| -> ScriptResult<Plot> {
            let bins = positive_int(bins, "bin count")?;
            Plot::histogram("", &shown(x)?, bins, axis_of(x, "value"))
                .map_err(|e| fault("PlotError", e.to_string()))
        });

        func(
            "calibration_plot",
            &["x: Column", "measured: Column", "fitted: Column"],
            "Plot",
            r#"
            Measured points and fitted line against `x`, with the residuals (measured − fitted)
            beneath.
            ```rhai
            let f = column([0.0, 5.0, 10.0], "kN");
            let p = calibration_plot(f, column([0.0, 1.0002, 1.9999], "mV/V"), column([0.0, 1.0, 2.0], "mV/V"));
            assert(p.to_svg().contains("residual (mV/V)"));
            ```
        "#,
        )
        .register_into_engine(engine, |x: Column, m: Column, f: Column| -> ScriptResult<Plot> {
            let fv = match (m.unit(), f.dimension() == m.dimension()) {
                (Some(u), true) => f.values_in(u.symbol())?,
                (None, true) => f.data().as_ref().clone(),
                _ => return Err(fault("UnitError", format!("fitted values must be in the unit of the measured ones, found {}", f.describe()))),
            };
            Plot::calibration("", &shown(&x)?, &shown(&m)?, &fv, axis_of(&x, "x"), axis_of(&m, "output")).map_err(|e| fault("PlotError", e.to_string()))
        });

        func(
            "to_svg",
            &["figure: Plot"],
            "String",
            r#"
            The figure as SVG text.
            ```rhai
            assert(histogram(column([1.0, 2.0], "N"), 2).to_svg().starts_with("<svg"));
            ```
        "#,
        )
        .register_into_engine(engine, |p: &mut Plot| -> ScriptResult<String> {
            p.to_svg().map_err(|e| fault("PlotError", e.to_string()))
        });

        func(
            "save",
            &["figure: Plot", "path: String"],
            "()",
            r#"
            Writes the figure to a `.svg` or `.png` file (a temporary file, then renamed); a
            relative path is taken from the script's folder.
            ```rhai
            let p = histogram(column([1.0, 2.0], "N"), 2);
            let refused = false;
            try { p.save("figure.bmp"); } catch (e) { refused = true; }
            assert(refused);
            ```
        "#,
        )
        .register_into_engine(
            engine,
            |ctx: NativeCallContext, p: &mut Plot, path: &str| -> ScriptResult<()> {
                p.save(super::super::bind::resolve(&ctx, path))
                    .map_err(|e| fault("PlotError", e.to_string()))
            },
        );
    }
}
