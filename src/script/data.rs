//! Script bindings for test logs (the data layer in `src/data/`): `read_log` gives a `Frame` whose
//! channels are script `Column`s in their file units, conversions to strain and load, zero, drift
//! and temperature compensation, and atomic CSV/Parquet export.
//!
//! A channel's `Vec<f64>` moves into its `Column` (converted to SI in place, not copied). Relative
//! paths resolve against the running script's folder: the calling file's folder when the code
//! came from a file, else the session's script folder (`SessionOptions::script_dir`, carried as
//! the engine's default tag), else the current directory. Every `DataError` becomes a catchable
//! `DataError` script error at the call position; its text names the file, row and column.

use std::fmt;
use std::path::PathBuf;
use std::sync::Arc;
use std::sync::atomic::{AtomicU64, Ordering};

use rhai::{Array, Dynamic, Engine, EvalAltResult, INT, ImmutableString, Map, NativeCallContext};

use super::bind::{
    Options, Record, ScriptResult, Values, fault, func, number, resolve, shaped, type_of, values,
};
use super::column::Column;
use crate::units::{
    ElectricPotential, ElectricalResistance, Quantity, TemperatureCoefficient, Unit,
};
use crate::{
    AdcScale, Arrangement, Calibration, CalibrationModel, Channel, DataError, ExportOptions, Gap,
    Gauge, LeadWire, LeadWires, LogFormat, LogOptions, MimeBundle, OutputRatio, QuarterLeads,
    QuarterWiring, SkippedRow, SupplyLeads, SupplyWiring, TemperatureCompensation, TimeColumn,
    ToMime, compensate_temperature, correct_lead_wires, html_escape, ratio_to_strain,
    ratio_to_strain_in_place, read_log, remove_drift, window_by_time, write_columns,
    write_text_atomic, zero_of,
};
use uom::si::electric_potential::volt;
use uom::si::electrical_resistance::ohm;
use uom::si::temperature_coefficient::per_kelvin;

impl From<DataError> for Box<EvalAltResult> {
    fn from(e: DataError) -> Self {
        match e {
            DataError::Physics(p) => p.into(),
            other => fault("DataError", other.to_string()),
        }
    }
}

/// A channel's values as a column, moved (converted to SI in place).
fn channel_column(ch: Channel) -> Column {
    let Channel {
        unit, mut values, ..
    } = ch;
    if unit.factor() != 1.0 || unit.offset() != 0.0 {
        for v in values.iter_mut() {
            *v = unit.to_si(*v);
        }
    }
    Column::from_si(
        Arc::new(values),
        unit.dimension(),
        unit.kind(),
        Some(Arc::new(unit)),
    )
}

fn seconds() -> Option<Unit> {
    Unit::parse("s").ok()
}

/// A test log read into script columns.
#[derive(Clone, Debug)]
pub(crate) struct Frame {
    path: PathBuf,
    format: LogFormat,
    /// (name, column), time first when there is one.
    columns: Vec<(String, Column)>,
    /// Header text of each column (to find a column by header as well as by name).
    headers: Vec<String>,
    has_time: bool,
    sample_rate_hz: f64,
    /// Gaps: (row, start s, length s) — in seconds when the time column is a time, else as read.
    gaps: Vec<(usize, f64, f64)>,
    time_is_seconds: bool,
    skipped: Vec<SkippedRow>,
    rows: usize,
}

impl Frame {
    pub(super) fn from_log(log: crate::Log) -> Frame {
        let rows = log.rows();
        let crate::Log {
            path,
            format,
            time,
            channels,
            skipped,
        } = log;
        let mut columns = Vec::with_capacity(channels.len() + 1);
        let mut headers = Vec::with_capacity(channels.len() + 1);
        let (mut sample_rate_hz, mut gaps, mut time_is_seconds) = (f64::NAN, Vec::new(), false);
        let has_time = time.is_some();
        if let Some(t) = time {
            sample_rate_hz = t.sample_rate_hz;
            let unit = t.channel.unit.clone();
            let s = seconds();
            time_is_seconds = s
                .as_ref()
                .is_some_and(|s| s.dimension() == unit.dimension() && s.kind() == unit.kind());
            // Gap times are in the time column's unit; shown in seconds where that is a time.
            let k = if time_is_seconds { unit.factor() } else { 1.0 };
            gaps = t
                .gaps
                .iter()
                .map(|g: &Gap| (g.row, g.start * k, g.length * k))
                .collect();
            let name = t.channel.name.clone();
            headers.push(t.channel.header.clone());
            let mut c = channel_column(t.channel);
            if let (true, Some(s)) = (time_is_seconds, s) {
                c = Column::from_si(c.data().clone(), c.dimension(), c.kind(), Some(Arc::new(s)));
            }
            columns.push((name, c));
        }
        for ch in channels {
            headers.push(ch.header.clone());
            columns.push((ch.name.clone(), channel_column(ch)));
        }
        Frame {
            path,
            format,
            columns,
            headers,
            has_time,
            sample_rate_hz,
            gaps,
            time_is_seconds,
            skipped,
            rows,
        }
    }

    fn names(&self) -> Array {
        self.columns
            .iter()
            .map(|(n, _)| Dynamic::from(n.clone()))
            .collect()
    }

    fn col(&self, name: &str) -> ScriptResult<Column> {
        self.columns
            .iter()
            .zip(&self.headers)
            .find(|((n, _), h)| n == name || *h == name)
            .map(|((_, c), _)| c.clone())
            .ok_or_else(|| {
                fault(
                    "PropertyNotFound",
                    format!(
                        "no column `{name}` in {}; columns are {}",
                        self.path.display(),
                        self.columns
                            .iter()
                            .map(|(n, _)| format!("`{n}`"))
                            .collect::<Vec<_>>()
                            .join(", ")
                    ),
                )
            })
    }

    /// The column `name` handed over: removed from the frame (so a conversion of it can work in
    /// its buffer), the time column excepted.
    fn remove(&mut self, name: &str) -> ScriptResult<Column> {
        let found = self
            .columns
            .iter()
            .zip(&self.headers)
            .position(|((n, _), h)| n == name || h == name);
        let Some(k) = found else {
            // Not there: the same error as reading it.
            return self.col(name);
        };
        if self.has_time && k == 0 {
            return Err(fault(
                "ArgumentError",
                format!("the time column `{name}` stays in the frame; read it with `.time`"),
            ));
        }
        self.headers.remove(k);
        Ok(self.columns.remove(k).1)
    }

    fn time(&self) -> Dynamic {
        if self.has_time {
            Dynamic::from(self.columns[0].1.clone())
        } else {
            Dynamic::UNIT
        }
    }

    fn sample_rate(&self) -> Dynamic {
        if self.sample_rate_hz.is_finite() {
            Quantity::new(self.sample_rate_hz, "Hz").map_or(Dynamic::UNIT, Dynamic::from)
        } else {
            Dynamic::UNIT
        }
    }

    fn time_quantity(&self, v: f64) -> Dynamic {
        if self.time_is_seconds {
            Quantity::new(v, "s").map_or(Dynamic::from(v), Dynamic::from)
        } else {
            Dynamic::from(v)
        }
    }

    fn gaps(&self) -> Array {
        self.gaps
            .iter()
            .map(|&(row, start, length)| {
                Dynamic::from(
                    Record::new("gap")
                        .field("row", row as INT)
                        .field("start", self.time_quantity(start))
                        .field("length", self.time_quantity(length)),
                )
            })
            .collect()
    }

    fn skipped(&self) -> Array {
        self.skipped
            .iter()
            .map(|s| {
                Dynamic::from(
                    Record::new("skipped row")
                        .field("row", s.row as INT)
                        .field("column", s.column as INT)
                        .field("name", s.name.clone())
                        .field("value", s.value),
                )
            })
            .collect()
    }

    fn format_name(&self) -> &'static str {
        match self.format {
            LogFormat::Csv => "CSV",
            LogFormat::Parquet => "Parquet",
        }
    }

    fn summary(&self) -> String {
        let rate = if self.sample_rate_hz.is_finite() {
            format!(", {} Hz", num(self.sample_rate_hz))
        } else {
            String::new()
        };
        format!(
            "log {} ({}): {} rows × {} columns{rate}, {} gaps, {} skipped rows",
            self.path.display(),
            self.format_name(),
            self.rows,
            self.columns.len(),
            self.gaps.len(),
            self.skipped.len()
        )
    }
}

/// Up to 6 significant figures, trailing zeros dropped.
fn num(v: f64) -> String {
    if v == 0.0 || !v.is_finite() {
        return format!("{v}");
    }
    let mag = v.abs().log10().floor() as i32;
    if !(-5..=9).contains(&mag) {
        return format!("{v:.5e}");
    }
    let digits = (5 - mag).clamp(0, 17) as usize;
    let s = format!("{v:.digits$}");
    if s.contains('.') {
        s.trim_end_matches('0').trim_end_matches('.').to_string()
    } else {
        s
    }
}

/// The unit text, min and max (in the display unit) of a column.
fn stats(c: &Column) -> (String, String, String) {
    let u = c.unit();
    let shown = |si: f64| num(u.map_or(si, |u| u.from_si(si)));
    let (lo, hi) = c
        .data()
        .iter()
        .fold((f64::NAN, f64::NAN), |(a, b), &x| (a.min(x), b.max(x)));
    let unit = u.map(|u| u.symbol().to_string()).unwrap_or_default();
    (unit, shown(lo), shown(hi))
}

fn shown(c: &Column, i: usize) -> String {
    let si = c.data()[i];
    num(c.unit().map_or(si, |u| u.from_si(si)))
}

/// The summary line, then one line per column: name, unit, min and max.
impl fmt::Display for Frame {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        write!(f, "{}", self.summary())?;
        let w = self
            .columns
            .iter()
            .map(|(n, _)| n.chars().count())
            .max()
            .unwrap_or(0);
        for (n, c) in &self.columns {
            let (unit, lo, hi) = stats(c);
            write!(f, "\n  {n:<w$}  {unit:<6} min {lo}, max {hi}")?;
        }
        Ok(())
    }
}

/// A table of the first rows, under a unit, min and max line per column.
impl ToMime for Frame {
    fn to_mime(&self) -> MimeBundle {
        const SHOWN: usize = 10;
        let mut h = format!(
            "<table class=\"gaugebook-frame\"><caption>{}</caption><thead><tr><th></th>",
            html_escape(&self.summary())
        );
        for (n, _) in &self.columns {
            h.push_str(&format!("<th>{}</th>", html_escape(n)));
        }
        h.push_str("</tr>");
        let st: Vec<_> = self.columns.iter().map(|(_, c)| stats(c)).collect();
        for (label, pick) in [("unit", 0), ("min", 1), ("max", 2)] {
            h.push_str(&format!("<tr><th>{label}</th>"));
            for s in &st {
                let v = match pick {
                    0 => &s.0,
                    1 => &s.1,
                    _ => &s.2,
                };
                h.push_str(&format!("<td>{}</td>", html_escape(v)));
            }
            h.push_str("</tr>");
        }
        h.push_str("</thead><tbody>");
        for i in 0..self.rows.min(SHOWN) {
            h.push_str(&format!("<tr><th>{i}</th>"));
            for (_, c) in &self.columns {
                h.push_str(&format!("<td>{}</td>", shown(c, i)));
            }
            h.push_str("</tr>");
        }
        if self.rows > SHOWN {
            h.push_str(&format!(
                "<tr><th>…</th><td colspan=\"{}\">{} more rows</td></tr>",
                self.columns.len(),
                self.rows - SHOWN
            ));
        }
        h.push_str("</tbody></table>");
        MimeBundle::text(self.to_string()).with("text/html", h)
    }
}

fn strings(x: &Dynamic, what: &str) -> ScriptResult<Vec<String>> {
    let bad = || {
        fault(
            "ArgumentError",
            format!("{what} must be an array of strings, found {}", type_of(x)),
        )
    };
    let arr = x.read_lock::<Array>().ok_or_else(bad)?;
    arr.iter()
        .map(|v| {
            v.read_lock::<ImmutableString>()
                .map(|s| s.to_string())
                .ok_or_else(bad)
        })
        .collect()
}

pub(super) fn log_options(map: &Map, name: &str) -> ScriptResult<LogOptions> {
    let o = Options::new(
        map,
        name,
        &[
            "columns",
            "units",
            "time",
            "skip_nan",
            "separator",
            "gap_factor",
            "block_bytes",
        ],
    )?;
    let mut opts = LogOptions::new();
    if let Some(c) = o.raw("columns") {
        opts = opts.keep(strings(c, &format!("key `columns` in options of {name}"))?);
    }
    if let Some(u) = o.raw("units") {
        let m = u.read_lock::<Map>().ok_or_else(|| {
            fault(
                "ArgumentError",
                format!(
                    "key `units` in options of {name} must be a map of column to unit text, found {}",
                    type_of(u)
                ),
            )
        })?;
        for (k, v) in m.iter() {
            let unit = v.read_lock::<ImmutableString>().ok_or_else(|| {
                fault(
                    "ArgumentError",
                    format!(
                        "unit of `{k}` in options of {name} must be a string, found {}",
                        type_of(v)
                    ),
                )
            })?;
            opts = opts.unit(k.as_str(), unit.as_str());
        }
    }
    if let Some(t) = o.raw("time") {
        if let Some(s) = t.read_lock::<ImmutableString>() {
            opts = opts.time(s.as_str());
        } else if t.as_bool() == Ok(false) || t.is_unit() {
            opts.time = TimeColumn::None;
        } else if t.as_bool() != Ok(true) {
            return Err(fault(
                "ArgumentError",
                format!(
                    "key `time` in options of {name} must be a column name, true (find it) or false (none), found {}",
                    type_of(t)
                ),
            ));
        }
    }
    if let Some(b) = o.opt_bool("skip_nan")? {
        opts = opts.skip_nan(b);
    }
    if let Some(s) = o.opt_string("separator")? {
        match s.as_bytes() {
            [b] if b.is_ascii() => opts = opts.separator(*b),
            _ => {
                return Err(fault(
                    "ArgumentError",
                    format!(
                        "key `separator` in options of {name} must be one character, found \"{s}\""
                    ),
                ));
            }
        }
    }
    if let Some(g) = o.opt_f64("gap_factor")? {
        if !(g > 1.0 && g.is_finite()) {
            return Err(fault(
                "ArgumentError",
                format!("key `gap_factor` in options of {name} must be above 1, found {g}"),
            ));
        }
        opts.gap_factor = g;
    }
    if let Some(b) = o.opt_f64("block_bytes")? {
        if b.fract() != 0.0 || !(4096.0..=(1u64 << 32) as f64).contains(&b) {
            return Err(fault(
                "ArgumentError",
                format!(
                    "key `block_bytes` in options of {name} must be a whole number from 4096 to 2^32, found {b}"
                ),
            ));
        }
        opts.block_bytes = b as usize;
    }
    Ok(opts)
}

/// One value of a quantity argument, in SI.
fn one(x: &Dynamic, what: &str, unit: &str) -> ScriptResult<f64> {
    match values(x, what, unit)? {
        Values::One(v) => Ok(v),
        Values::Many(_) => Err(fault(
            "ArgumentError",
            format!("{what} must be a single quantity, found a column"),
        )),
    }
}

/// A column argument's SI samples.
fn samples(x: &Dynamic, what: &str, unit: &str) -> ScriptResult<Arc<Vec<f64>>> {
    match values(x, what, unit)? {
        Values::Many(v) => Ok(v),
        Values::One(_) => Err(fault(
            "ArgumentError",
            format!("{what} must be a column, found {}", type_of(x)),
        )),
    }
}

fn like(c: &Column, data: Vec<f64>) -> Column {
    Column::from_si(
        Arc::new(data),
        c.dimension(),
        c.kind(),
        c.unit().map(|u| Arc::new(u.clone())),
    )
}

fn owned(c: &Column) -> Vec<f64> {
    c.data().as_ref().clone()
}

/// The sample range of a time window `[t0, t1)` given as an array of two times.
fn window(times: &[f64], w: &Dynamic, what: &str) -> ScriptResult<std::ops::Range<usize>> {
    let arr = w
        .read_lock::<Array>()
        .filter(|a| a.len() == 2)
        .ok_or_else(|| {
            fault(
                "ArgumentError",
                format!(
                    "{what} must be an array of two times [start, end], found {}",
                    type_of(w)
                ),
            )
        })?;
    let t0 = one(&arr[0], &format!("start of {what}"), "s")?;
    let t1 = one(&arr[1], &format!("end of {what}"), "s")?;
    Ok(window_by_time(times, t0, t1))
}

/// A converter's scale from an options map: `#{ bits, range, gain, excitation }` (a bipolar
/// converter behind an amplifier) or `#{ full_scale_counts, full_scale }`.
fn adc_arg(v: &Dynamic, func: &str) -> ScriptResult<AdcScale> {
    let what = format!("the `adc` of {func}");
    let map = v.read_lock::<Map>().ok_or_else(|| {
        fault(
            "ArgumentError",
            format!(
                "{what} must be a map #{{ bits, range, gain, excitation }}, found {}",
                type_of(v)
            ),
        )
    })?;
    let o = Options::new(
        &map,
        &what,
        &[
            "bits",
            "range",
            "gain",
            "excitation",
            "full_scale_counts",
            "full_scale",
        ],
    )?;
    if o.has("full_scale_counts") {
        return Ok(AdcScale::new(
            o.f64("full_scale_counts")?,
            OutputRatio::new(o.quantity("full_scale", "V/V")?.si()),
        )?);
    }
    let bits = o.f64("bits")?;
    if bits.fract() != 0.0 || !(2.0..=32.0).contains(&bits) {
        return Err(fault(
            "ArgumentError",
            format!(
                "key `bits` in {what} must be a whole number of bits from 2 to 32, found {bits}"
            ),
        ));
    }
    let volts = |k: &str| -> ScriptResult<ElectricPotential> {
        Ok(ElectricPotential::new::<volt>(o.quantity(k, "V")?.si()))
    };
    Ok(AdcScale::from_range(
        bits as u32,
        volts("range")?,
        o.opt_f64("gain")?.unwrap_or(1.0),
        volts("excitation")?,
    )?)
}

/// Lead wires from an options map: `#{ wiring: "two-wire" | "three-wire", lead, r0 }` for a
/// quarter bridge (r0 the gauge's resistance), `#{ wiring: "four-wire" | "six-wire", lead,
/// bridge_resistance }` for a complete bridge; `lead` is one lead's resistance, `lead_tc` its
/// temperature coefficient (default copper).
fn leads_arg(v: &Dynamic, gf: f64, func: &str) -> ScriptResult<LeadWires> {
    let what = format!("the `leads` of {func}");
    let map = v.read_lock::<Map>().ok_or_else(|| {
        fault(
            "ArgumentError",
            format!(
                "{what} must be a map #{{ wiring, lead, ... }}, found {}",
                type_of(v)
            ),
        )
    })?;
    let o = Options::new(
        &map,
        &what,
        &["wiring", "lead", "lead_tc", "r0", "bridge_resistance"],
    )?;
    let ohms = |k: &str| -> ScriptResult<ElectricalResistance> {
        Ok(ElectricalResistance::new::<ohm>(o.quantity(k, "ohm")?.si()))
    };
    let r = ohms("lead")?;
    let lead = match o.opt_quantity("lead_tc", "1/K")? {
        Some(tc) => LeadWire::new(r, TemperatureCoefficient::new::<per_kelvin>(tc.si()))?,
        None => LeadWire::copper(r)?,
    };
    let wiring = o.string("wiring")?.to_ascii_lowercase();
    Ok(match wiring.as_str() {
        "two-wire" | "2-wire" | "three-wire" | "3-wire" => {
            let w = if wiring.starts_with("two") || wiring.starts_with('2') {
                QuarterWiring::TwoWire
            } else {
                QuarterWiring::ThreeWire
            };
            let g = Gauge::new(ohms("r0")?, gf)?;
            LeadWires::Quarter(QuarterLeads::new(&g, w, lead))
        }
        "four-wire" | "4-wire" | "six-wire" | "6-wire" | "remote-sense" => {
            let w = if wiring.starts_with("four") || wiring.starts_with('4') {
                SupplyWiring::FourWire
            } else {
                SupplyWiring::SixWire
            };
            LeadWires::Supply(SupplyLeads::new(ohms("bridge_resistance")?, w, lead)?)
        }
        other => {
            return Err(fault(
                "ArgumentError",
                format!(
                    "key `wiring` in {what} must be \"two-wire\", \"three-wire\", \"four-wire\" \
                     or \"six-wire\", found \"{other}\""
                ),
            ));
        }
    })
}

/// What `to_strain` does besides the arrangement's inverse: counts to ratio first, the
/// lead-wire correction after.
#[derive(Default)]
struct StrainSteps {
    nu: Option<f64>,
    adc: Option<AdcScale>,
    leads: Option<Dynamic>,
}

fn to_strain(x: Dynamic, name: &str, gf: Dynamic, steps: StrainSteps) -> ScriptResult<Dynamic> {
    let nu = steps.nu;
    let a = Arrangement::from_name(name)?;
    let gf = number(&gf).ok_or_else(|| {
        fault(
            "ArgumentError",
            format!("gauge factor must be a number, found {}", type_of(&gf)),
        )
    })?;
    if a.uses_poisson() && nu.is_none() {
        return Err(fault(
            "ArgumentError",
            format!(
                "the {name} arrangement needs Poisson's ratio: to_strain(x, \"{name}\", gf, #{{ nu: 0.3 }})"
            ),
        ));
    }
    // ν is unused by the arrangements that accept no ν; 0.3 keeps it valid.
    let nu = nu.unwrap_or(0.3);
    let v = match &steps.adc {
        None => values(&x, "bridge output", "V/V")?,
        Some(adc) => match values(&x, "ADC counts", "")? {
            Values::One(c) => Values::One(adc.ratio(c)),
            Values::Many(c) => Values::Many(Arc::new(adc.ratios(&c))),
        },
    };
    // The argument's hold on the samples goes, so a column no one else holds (a temporary, or
    // one taken out of its frame with `remove`) is converted in its own buffer.
    drop(x);
    let (one, mut strain) = match v {
        Values::One(r) => (true, vec![ratio_to_strain(&[r], a, gf, nu)?[0]]),
        Values::Many(r) => match Arc::try_unwrap(r) {
            Ok(mut owned) => {
                ratio_to_strain_in_place(&mut owned, a, gf, nu)?;
                (false, owned)
            }
            Err(shared) => (false, ratio_to_strain(&shared, a, gf, nu)?),
        },
    };
    if let Some(l) = &steps.leads {
        correct_lead_wires(&mut strain, &leads_arg(l, gf, "to_strain()")?);
    }
    shaped(
        if one {
            Values::One(strain[0])
        } else {
            Values::Many(Arc::new(strain))
        },
        "µε",
    )
}

/// The `Column`s of a map of name to column (in name order), or an error naming the first
/// value that is not one.
pub(super) fn map_columns(cols: &Map) -> ScriptResult<Vec<(String, Column)>> {
    cols.iter()
        .map(|(k, v)| {
            let c = v.read_lock::<Column>().ok_or_else(|| {
                fault(
                    "ArgumentError",
                    format!(
                        "column `{k}` to write must be a Column, found {}",
                        type_of(v)
                    ),
                )
            })?;
            Ok((k.to_string(), c.clone()))
        })
        .collect()
}

fn columns_of(cols: &Map) -> ScriptResult<Vec<(String, Vec<f64>)>> {
    Ok(map_columns(cols)?
        .iter()
        .map(|(k, c)| header_values(k, c))
        .collect())
}

/// The header a column is written under and the unit its values are written in: `name [unit]`
/// and the column's unit, or the bare name and plain SI values without one.
pub(super) fn header_and_unit(name: &str, c: &Column) -> (String, Option<Unit>) {
    match c.unit() {
        Some(u) if !u.symbol().is_empty() => (format!("{name} [{}]", u.symbol()), Some(u.clone())),
        _ => (name.to_string(), None),
    }
}

/// `name [unit]` and the values in the column's display unit (read back with their unit).
fn header_values(name: &str, c: &Column) -> (String, Vec<f64>) {
    match header_and_unit(name, c) {
        (h, Some(u)) => (h, c.data().iter().map(|&si| u.from_si(si)).collect()),
        (h, None) => (h, owned(c)),
    }
}

/// The `decimals` key of a writer's options: fixed decimals for CSV, 0 to 17.
pub(super) fn decimals_option(o: &Options, name: &str) -> ScriptResult<Option<usize>> {
    match o.opt_f64("decimals")? {
        None => Ok(None),
        Some(d) if d.fract() == 0.0 && (0.0..=17.0).contains(&d) => Ok(Some(d as usize)),
        Some(d) => Err(fault(
            "ArgumentError",
            format!(
                "key `decimals` in options of {name} must be a whole number 0 to 17, found {d}"
            ),
        )),
    }
}

fn frame_columns(f: &Frame) -> Vec<(String, Vec<f64>)> {
    f.columns.iter().map(|(n, c)| header_values(n, c)).collect()
}

fn write(
    ctx: &NativeCallContext,
    path: &str,
    cols: Vec<(String, Vec<f64>)>,
    format: LogFormat,
    opts: Option<&Map>,
    name: &str,
) -> ScriptResult<INT> {
    let mut eo = ExportOptions {
        format: Some(format),
        ..Default::default()
    };
    if let Some(m) = opts {
        eo.decimals = decimals_option(&Options::new(m, name, &["decimals"])?, name)?;
    }
    let refs: Vec<(&str, &[f64])> = cols
        .iter()
        .map(|(n, v)| (n.as_str(), v.as_slice()))
        .collect();
    Ok(write_columns(resolve(ctx, path), &refs, &eo)? as INT)
}

static TEMP_COUNTER: AtomicU64 = AtomicU64::new(0);

/// Registers `Frame`, `read_log`, the conversions and the writers.
pub(crate) fn register(engine: &mut Engine) {
    super::bind::register_display::<Frame>(engine, "Frame");
    engine.register_indexer_get(|f: &mut Frame, name: &str| f.col(name));
    engine.register_get("names", |f: &mut Frame| f.names());
    engine.register_get("rows", |f: &mut Frame| f.rows as INT);
    engine.register_get("time", |f: &mut Frame| f.time());
    engine.register_get("sample_rate", |f: &mut Frame| f.sample_rate());
    engine.register_get("gaps", |f: &mut Frame| f.gaps());
    engine.register_get("skipped", |f: &mut Frame| f.skipped());
    engine.register_get("path", |f: &mut Frame| f.path.display().to_string());

    func(
        "temp_path",
        &["name: String"],
        "String",
        r#"
        A path named `name` in a fresh folder under the system's temporary folder, for scratch
        files (examples, tests). The folder is new on every call.
        ```rhai
        let p = temp_path("run.csv");
        assert(p.ends_with("run.csv"));
        assert(p != temp_path("run.csv"));
        ```
    "#,
    )
    .register_into_engine(engine, |name: &str| -> ScriptResult<String> {
        let n = TEMP_COUNTER.fetch_add(1, Ordering::Relaxed);
        let dir = std::env::temp_dir().join(format!("gaugebook-{}-{n}", std::process::id()));
        std::fs::create_dir_all(&dir).map_err(|e| {
            fault(
                "DataError",
                format!("{}: cannot create folder: {e}", dir.display()),
            )
        })?;
        Ok(dir.join(name).to_string_lossy().to_string())
    });

    func(
        "write_text",
        &["path: String", "text: String"],
        "()",
        r#"
        Writes `text` to a file atomically (a temporary file renamed over the target). Relative
        paths are taken from the script's folder.
        ```rhai
        let p = temp_path("a.csv");
        write_text(p, "x [mm]\n1\n2\n");
        assert_eq(read_log(p).rows, 2);
        ```
    "#,
    )
    .register_into_engine(
        engine,
        |ctx: NativeCallContext, path: &str, text: &str| -> ScriptResult<()> {
            Ok(write_text_atomic(resolve(&ctx, path), text)?)
        },
    );

    func(
        "read_log",
        &["path: String"],
        "Frame",
        r#"
        Reads a test log (CSV or Parquet, by extension) into a `Frame`: `f["sg1"]` or
        `f.col("sg1")` is a channel as a `Column` in its header's unit, `f.time` the time axis in
        s (or `()`), `f.names` the column names (time first), `f.rows`, `f.sample_rate` (Hz, from
        the median step), `f.gaps` and `f.skipped` (records with `row` counted as a text editor
        counts lines, header = row 1). A relative path is taken from the script's folder.
        ```rhai
        let p = temp_path("run.csv");
        write_text(p, "time_s,sg1_mVV,load [kN]\n0,0.5,1\n0.5,1.0,2\n1.0,1.5,3\n3.0,2.0,4\n");
        let f = read_log(p);
        assert_eq(f.names, ["time", "sg1", "load"]);
        assert_eq(f.rows, 4);
        assert_close(f["sg1"].max(), q("2 mV/V"), 1e-12);
        assert_close(f.col("load")[1], q("2 kN"), 1e-12);
        assert_close(f.time[3], q("3 s"), 1e-12);
        // median step 0.5 s
        assert_close(f.sample_rate, q("2 Hz"), 1e-12);
        assert_eq(f.gaps.len(), 1);
        assert_eq(f.gaps[0].row, 5);
        assert_close(f.gaps[0].length, q("2 s"), 1e-12);
        ```
    "#,
    )
    .register_into_engine(
        engine,
        |ctx: NativeCallContext, path: &str| -> ScriptResult<Frame> {
            Ok(Frame::from_log(read_log(
                resolve(&ctx, path),
                &LogOptions::new(),
            )?))
        },
    );

    func(
        "read_log",
        &["path: String", "options: Map"],
        "Frame",
        r#"
        Reads a test log with options: `columns` (names or headers to keep, in order; the time
        column is kept anyway), `units` (a map of column to unit text, overriding headers),
        `time` (the time column's name, or `false` for none), `skip_nan` (drop rows with NaN and
        list them in `f.skipped` instead of stopping), `separator` (one character) and
        `gap_factor` (a step longer than this many median steps is a gap; default 1.5).
        ```rhai
        let p = temp_path("run.csv");
        write_text(p, "t,ch1,ch2,note\n0,0.1,5,a\n1,NaN,6,b\n2,0.3,7,c\n");
        let f = read_log(p, #{ columns: ["ch1"], units: #{ ch1: "mV/V" }, skip_nan: true });
        assert_eq(f.names, ["t", "ch1"]);
        assert_eq(f.rows, 2);
        assert_close(f["ch1"][1], q("0.3 mV/V"), 1e-12);
        assert_eq(f.skipped[0].row, 3);
        assert_eq(f.skipped[0].name, "ch1");
        let g = read_log(p, #{ time: false, columns: ["ch2"] });
        assert_eq(g.time, ());
        assert_eq(g.names, ["ch2"]);
        ```
    "#,
    )
    .register_into_engine(
        engine,
        |ctx: NativeCallContext, path: &str, options: Map| -> ScriptResult<Frame> {
            let opts = log_options(&options, "read_log()")?;
            Ok(Frame::from_log(read_log(resolve(&ctx, path), &opts)?))
        },
    );

    func(
        "columns",
        &["frame: Frame"],
        "Array",
        r#"
        The frame's column names, time first.
        ```rhai
        let p = temp_path("a.csv");
        write_text(p, "b,time,a\n1,0,2\n");
        assert_eq(read_log(p).columns(), ["time", "b", "a"]);
        ```
    "#,
    )
    .register_into_engine(engine, |f: &mut Frame| f.names());

    func(
        "col",
        &["frame: Frame", "name: String"],
        "Column",
        r#"
        A column by name or by header text (as `frame[name]`).
        ```rhai
        let p = temp_path("a.csv");
        write_text(p, "load [kN]\n1.5\n");
        let f = read_log(p);
        assert_close(f.col("load")[0], q("1500 N"), 1e-12);
        assert_close(f.col("load [kN]")[0], q("1.5 kN"), 1e-12);
        ```
    "#,
    )
    .register_into_engine(engine, |f: &mut Frame, name: &str| f.col(name));

    func(
        "remove",
        &["frame: Frame", "name: String"],
        "Column",
        r#"
        A column taken out of the frame (by name or header text): the frame no longer holds it,
        so `to_strain(b.remove("sg1"), …)` converts in the column's own buffer instead of a copy,
        which saves memory and time on long logs. The time column stays (`.time`).
        ```rhai
        let p = temp_path("a.csv");
        write_text(p, "t,sg1_mVV\n0,0.5\n1,1.0\n");
        let f = read_log(p);
        let e = to_strain(f.remove("sg1"), "quarter", 2.0);
        assert_eq(f.names, ["t"]);
        assert_close(e[0], q("1001.001001001001 ue"), 1e-12); // 4r/(F(1-2r)), r = 0.5e-3
        ```
    "#,
    )
    .register_into_engine(engine, |f: &mut Frame, name: &str| f.remove(name));

    func(
        "to_strain",
        &["output: Column", "arrangement: String", "gauge_factor: f64"],
        "Column",
        r#"
        Strain (µε, along the gauge in arm R1) from a bridge output ratio, by the exact inverse
        of the named arrangement (`"quarter"`, `"half-bending"`, `"full-bending"`,
        `"full-shear"`; the Poisson arrangements take ν in options). Outputs outside the
        arrangement's range give NaN.
        ```rhai
        // Exact inverse: the quarter bridge's output at 1000 µε, GF 2, converted back.
        let r = bridge("quarter", gauge(#{ r0: 350.0 * ohm, gf: 2.0 })).output(q("1000 ue"));
        assert_close(to_strain(r, "quarter", 2.0), q("1000 ue"), 1e-12);
        let c = column([0.0, 0.4995004995004995], "mV/V");
        assert_close(to_strain(c, "quarter", 2.0)[1], q("1000 ue"), 1e-12);
        ```
    "#,
    )
    .register_into_engine(engine, |x: Dynamic, name: &str, gf: Dynamic| {
        to_strain(x, name, gf, StrainSteps::default())
    });

    func(
        "to_strain",
        &[
            "output: Column",
            "arrangement: String",
            "gauge_factor: f64",
            "options: Map",
        ],
        "Column",
        r#"
        Strain from a bridge output ratio, with options `nu` (Poisson's ratio of the specimen,
        needed by `"half-poisson"` and `"full-poisson"`), `adc` (the input is converter counts:
        `#{ bits, range, gain, excitation }` for a bipolar converter of 2^(bits−1) counts at
        +range behind an amplifier, or `#{ full_scale_counts, full_scale }`), and `leads` (the
        lead-wire desensitisation is corrected: `#{ wiring: "two-wire" | "three-wire", lead, r0 }`
        for a quarter bridge, `#{ wiring: "four-wire" | "six-wire", lead, bridge_resistance }`
        for a complete one; `lead` is one lead's resistance). The order is the signal's: counts
        to ratio, the arrangement's exact inverse, then the correction ×(1 + n·R_L/R) of the
        bridge module.
        ```rhai
        // Exact inverse of the full Poisson bridge at 500 µε, GF 2.1, ν 0.3.
        let b = bridge("full-poisson", gauge(#{ r0: 350.0 * ohm, gf: 2.1 }), #{ nu: 0.3 });
        let r = b.output(q("500 ue"));
        assert_close(to_strain(r, "full-poisson", 2.1, #{ nu: 0.3 }), q("500 ue"), 1e-12);
        // Counts of a 24-bit converter, ±2.5 V behind a gain of 128, at 5 V excitation:
        // 2^23 counts = 3.90625 mV/V; the quarter bridge's 1000 µε at GF 2 is
        // r = Fε/(4 + 2Fε) = 0.4995004995 mV/V.
        let counts = 0.4995004995004995 / 3.90625 * 8388608.0;
        let adc = #{ bits: 24, range: 2.5 * V, gain: 128.0, excitation: 5.0 * V };
        assert_close(to_strain(counts, "quarter", 2.0, #{ adc: adc }), q("1000 ue"), 1e-12);
        // Four-wire supply leads of 2 Ω on a 350 Ω full bridge see Rb/(Rb + 2RL) of the ratio.
        let seen = q("1 mV/V") * 350.0 / 354.0;
        let leads = #{ wiring: "four-wire", lead: 2.0 * ohm, bridge_resistance: 350.0 * ohm };
        assert_close(to_strain(seen, "full-bending", 2.0, #{ leads: leads }), q("500 ue"), 1e-12);
        ```
    "#,
    )
    .register_into_engine(
        engine,
        |x: Dynamic, name: &str, gf: Dynamic, options: Map| -> ScriptResult<Dynamic> {
            let o = Options::new(&options, "to_strain()", &["nu", "adc", "leads"])?;
            let steps = StrainSteps {
                nu: o.opt_f64("nu")?,
                adc: o
                    .raw("adc")
                    .map(|a| adc_arg(a, "to_strain()"))
                    .transpose()?,
                leads: o.raw("leads").cloned(),
            };
            to_strain(x, name, gf, steps)
        },
    );

    func(
        "adc_to_ratio",
        &["counts: Column", "adc: Map"],
        "Column",
        r#"
        Bridge output ratio (mV/V) from converter counts: `#{ bits, range, gain, excitation }`
        (r = counts / 2^(bits−1) · range / (gain · excitation), a bipolar converter; `gain`
        defaults to 1) or `#{ full_scale_counts, full_scale }`. Counts are plain numbers.
        ```rhai
        let adc = #{ bits: 24, range: 2.5 * V, gain: 128.0, excitation: 5.0 * V };
        let r = adc_to_ratio(column([0.0, 4194304.0, -8388608.0], ""), adc);
        assert_close(r[1], q("1.953125 mV/V"), 1e-12);
        assert_close(r[2], q("-3.90625 mV/V"), 1e-12);
        let s = adc_to_ratio(500.0, #{ full_scale_counts: 1000.0, full_scale: 2.0 * mV_per_V });
        assert_close(s, q("1 mV/V"), 1e-12);
        ```
    "#,
    )
    .register_into_engine(
        engine,
        |x: Dynamic, adc: Dynamic| -> ScriptResult<Dynamic> {
            let a = adc_arg(&adc, "adc_to_ratio()")?;
            let r = match values(&x, "ADC counts", "")? {
                Values::One(c) => Values::One(a.ratio(c)),
                Values::Many(c) => Values::Many(Arc::new(a.ratios(&c))),
            };
            shaped(r, "mV/V")
        },
    );

    func(
        "zero",
        &["x: Column", "time: Column", "t0: Quantity", "t1: Quantity"],
        "Column",
        r#"
        The column less its mean over the samples with `t0 <= time < t1` (the zero reading).
        ```rhai
        let t = column([0.0, 1.0, 2.0, 3.0, 4.0], "s");
        let x = column([0.10, 0.12, 0.50, 1.00, 1.50], "mV/V");
        let z = zero(x, t, 0.0 * s, 2.0 * s);
        // mean of the first two samples: 0.11 mV/V
        assert_close(z[4], q("1.39 mV/V"), 1e-12);
        assert_eq(z.unit, "mV/V");
        ```
    "#,
    )
    .register_into_engine(
        engine,
        |x: Column, time: Dynamic, t0: Dynamic, t1: Dynamic| -> ScriptResult<Column> {
            let times = samples(&time, "time", "s")?;
            let w = window_by_time(&times, one(&t0, "t0", "s")?, one(&t1, "t1", "s")?);
            if times.len() != x.len() {
                return Err(DataError::LengthMismatch {
                    what: "column and time".into(),
                    left: x.len(),
                    right: times.len(),
                }
                .into());
            }
            let z = zero_of(x.data(), w)?;
            Ok(like(&x, x.data().iter().map(|v| v - z).collect()))
        },
    );

    func(
        "remove_drift",
        &[
            "x: Column",
            "time: Column",
            "hold_a: Array",
            "hold_b: Array",
        ],
        "Column",
        r#"
        The column less the straight line through its means over two zero holds, each given as
        `[start, end]` times (the end excluded): a zero that drifts linearly in time is removed.
        ```rhai
        let t = linspace(0.0 * s, 10.0 * s, 11);
        let x = column([1.0, 1.1, 5.0, 5.0, 5.0, 5.0, 5.0, 5.0, 5.0, 1.9, 2.0], "mV/V");
        let y = remove_drift(x, t, [0.0 * s, 2.0 * s], [9.0 * s, 11.0 * s]);
        // holds: mean 1.05 at 0.5 s, mean 1.95 at 9.5 s; line 1.05 + 0.1·(t − 0.5)
        assert_close(y[0], q("0 mV/V"), 0.0, q("1e-12 mV/V"));
        assert_close(y[2], q("3.8 mV/V"), 1e-12);
        assert_close(y[5], q("3.5 mV/V"), 1e-12);
        assert_close(y[10], q("0 mV/V"), 0.0, q("1e-12 mV/V"));
        ```
    "#,
    )
    .register_into_engine(
        engine,
        |x: Column, time: Dynamic, a: Dynamic, b: Dynamic| -> ScriptResult<Column> {
            let times = samples(&time, "time", "s")?;
            let (ra, rb) = (
                window(&times, &a, "first hold")?,
                window(&times, &b, "second hold")?,
            );
            let mut v = owned(&x);
            remove_drift(&mut v, &times, ra, rb)?;
            Ok(like(&x, v))
        },
    );

    func(
        "compensate_temperature",
        &["x: Column", "temperature: Column", "options: Map"],
        "Column",
        r#"
        The signal corrected for temperature: `(x − tc_zero·ΔT) / (1 + tc_span·ΔT)` with
        ΔT = T − `reference`. Options: `tc_zero` (the column's unit per K), `tc_span` (1/K, e.g.
        ppm/K), `reference` (a temperature).
        ```rhai
        let tc = #{ tc_zero: q("0.002 mV/V") / K, tc_span: q("100 ppm/K"), reference: q("20 degC") };
        let temp = column([20.0, 30.0], "degC");
        // at 30 °C: (2.02 − 0.002·10) / (1 + 1e-4·10) = 2 / 1.001
        let y = compensate_temperature(column([1.0, 2.02], "mV/V"), temp, tc);
        assert_close(y[0], q("1 mV/V"), 1e-12);
        assert_close(y[1], q("1.998001998001998 mV/V"), 1e-12);
        ```
    "#,
    )
    .register_into_engine(
        engine,
        |x: Column, temp: Dynamic, options: Map| -> ScriptResult<Column> {
            let name = "compensate_temperature()";
            let o = Options::new(&options, name, &["tc_zero", "tc_span", "reference"])?;
            let temps = samples(&temp, "temperature", "degC")?;
            let tz = o.raw("tc_zero").ok_or_else(|| {
                fault("ArgumentError", format!("missing key `tc_zero` in options of {name}"))
            })?;
            let per_k = Quantity::from_si(1.0, x.dimension(), x.kind()).div(&Quantity::parse("1 K")?);
            let tc_zero = match tz.read_lock::<Quantity>() {
                Some(q) if q.dimension() == per_k.dimension() => q.si(),
                _ => {
                    return Err(fault(
                        "UnitError",
                        format!(
                            "key `tc_zero` in options of {name} must be in the column's unit per K, found {}",
                            type_of(tz)
                        ),
                    ));
                }
            };
            let tc = TemperatureCompensation {
                tc_zero,
                tc_span: one(
                    o.raw("tc_span").ok_or_else(|| {
                        fault("ArgumentError", format!("missing key `tc_span` in options of {name}"))
                    })?,
                    "key `tc_span`",
                    "1/K",
                )?,
                reference_k: o.quantity("reference", "degC")?.si(),
            };
            let mut v = owned(&x);
            compensate_temperature(&mut v, &temps, &tc)?;
            Ok(like(&x, v))
        },
    );

    func(
        "to_load",
        &["x: Column", "calibration: Map"],
        "Column",
        r#"
        A load from a signal by a calibration. Linear: `#{ sensitivity, zero, unit }` gives
        `(x − zero) / sensitivity` (sensitivity as signal per load, zero in the signal's unit,
        optional; `unit` the display unit). Polynomial: `#{ coefficients: [c0, c1, …], input,
        output }` gives c0 + c1·x + … with x in unit `input` and the result in unit `output`.
        ```rhai
        let x = column([0.0, 1.0, 2.0], "mV/V");
        let f = to_load(x, #{ sensitivity: q("2 mV/V") / q("10 kN"), unit: "kN" });
        assert_close(f[1], q("5 kN"), 1e-12);
        let g = to_load(x, #{ coefficients: [1.0, 4.0, 0.5], input: "mV/V", output: "kN" });
        // 1 + 4·2 + 0.5·4 = 11
        assert_close(g[2], q("11 kN"), 1e-12);
        ```
    "#,
    )
    .register_into_engine(engine, |x: Column, cal: Map| -> ScriptResult<Column> {
        let name = "to_load()";
        if cal.contains_key("coefficients") {
            let o = Options::new(&cal, name, &["coefficients", "input", "output"])?;
            let arr = o
                .raw("coefficients")
                .and_then(|c| c.read_lock::<Array>().map(|a| a.clone()));
            let coefficients = arr
                .and_then(|a| a.iter().map(number).collect::<Option<Vec<f64>>>())
                .ok_or_else(|| {
                    fault(
                        "ArgumentError",
                        format!(
                            "key `coefficients` in options of {name} must be an array of numbers"
                        ),
                    )
                })?;
            let (input, output) = (o.string("input")?, o.string("output")?);
            let c = Calibration::new(
                CalibrationModel::Polynomial { coefficients },
                Unit::parse(&input)?,
                Unit::parse(&output)?,
            )?;
            return Ok(Column::new(c.apply(&x.values_in(&input)?), &output)?);
        }
        let o = Options::new(&cal, name, &["sensitivity", "zero", "unit"])?;
        let sens = match o
            .raw("sensitivity")
            .and_then(|s| s.read_lock::<Quantity>().map(|q| q.clone()))
        {
            Some(q) => q,
            None => {
                return Err(fault(
                    "ArgumentError",
                    format!("missing key `sensitivity` (a quantity) in options of {name}"),
                ));
            }
        };
        let rep = Quantity::from_si(1.0, x.dimension(), x.kind());
        let zero = match o.raw("zero") {
            Some(z) => one(
                z,
                "key `zero` in options of to_load()",
                &x.unit().map(|u| u.symbol().to_string()).unwrap_or_default(),
            )?,
            None => 0.0,
        };
        let model = CalibrationModel::Linear {
            sensitivity: sens.si(),
            zero,
        };
        // Validates sensitivity and zero (finite, sensitivity not 0); units are checked above.
        let si = Unit::parse("")?;
        let c = Calibration::new(model, si.clone(), si)?;
        let load = rep.div(&sens);
        let (dim, kind, unit) = match o.opt_string("unit")? {
            Some(u) => {
                let un = Unit::parse(&u)?;
                if un.dimension() != load.dimension() {
                    return Err(fault(
                        "UnitError",
                        format!(
                            "key `unit` in options of {name} must be a unit of {}, found {u}",
                            load.dimension()
                        ),
                    ));
                }
                (un.dimension(), un.kind(), Some(Arc::new(un)))
            }
            None => (
                load.dimension(),
                load.kind(),
                load.unit().map(|u| Arc::new(u.clone())),
            ),
        };
        Ok(Column::from_si(
            Arc::new(c.apply(x.data())),
            dim,
            kind,
            unit,
        ))
    });

    func(
        "write_csv",
        &["path: String", "columns: Map"],
        "i64",
        r#"
        Writes columns (a map of name to `Column`, written in name order) to a CSV file
        atomically, headers `name [unit]` and values in each column's unit, so `read_log` reads
        them back with their units. Returns the bytes written.
        ```rhai
        let p = temp_path("out.csv");
        let n = write_csv(p, #{ a_load: column([1.0, 2.0], "kN"), b_e: column([10.0, 20.0], "ue") });
        assert(n > 0);
        let f = read_log(p);
        assert_close(f["a_load"][1], q("2 kN"), 1e-12);
        assert_close(f["b_e"][0], q("10 ue"), 1e-12);
        ```
    "#,
    )
    .register_into_engine(
        engine,
        |ctx: NativeCallContext, path: &str, cols: Map| -> ScriptResult<INT> {
            write(&ctx, path, columns_of(&cols)?, LogFormat::Csv, None, "write_csv()")
        },
    );

    func(
        "write_csv",
        &["path: String", "columns: Map", "options: Map"],
        "i64",
        r#"
        Writes columns to CSV with options: `decimals` (fixed decimals, as C's `%.4f` for 4).
        ```rhai
        let p = temp_path("out.csv");
        write_csv(p, #{ x: column([1.0, 2.0 / 3.0], "") }, #{ decimals: 3 });
        let f = read_log(p);
        assert_eq(f["x"].values(""), [1.0, 0.667]);
        ```
    "#,
    )
    .register_into_engine(
        engine,
        |ctx: NativeCallContext, path: &str, cols: Map, opts: Map| -> ScriptResult<INT> {
            write(
                &ctx,
                path,
                columns_of(&cols)?,
                LogFormat::Csv,
                Some(&opts),
                "write_csv()",
            )
        },
    );

    func(
        "write_csv",
        &["path: String", "frame: Frame"],
        "i64",
        r#"
        Writes a frame's columns (time first, in its order) to CSV atomically.
        ```rhai
        let p = temp_path("in.csv");
        write_text(p, "time_s,sg1 [mV/V]\n0,0.5\n1,0.75\n");
        let q2 = temp_path("copy.csv");
        write_csv(q2, read_log(p));
        let f = read_log(q2);
        assert_eq(f.names, ["time", "sg1"]);
        assert_close(f["sg1"][1], q("0.75 mV/V"), 1e-12);
        ```
    "#,
    )
    .register_into_engine(
        engine,
        |ctx: NativeCallContext, path: &str, f: Frame| -> ScriptResult<INT> {
            write(
                &ctx,
                path,
                frame_columns(&f),
                LogFormat::Csv,
                None,
                "write_csv()",
            )
        },
    );

    func(
        "write_parquet",
        &["path: String", "columns: Map"],
        "i64",
        r#"
        Writes columns (a map of name to `Column`, in name order) to a Parquet file atomically,
        named `name [unit]` with values in each column's unit. Returns the bytes written.
        ```rhai
        let p = temp_path("out.parquet");
        write_parquet(p, #{ load: column([1.0, 2.5], "kN") });
        let f = read_log(p);
        assert_close(f["load"][1], q("2.5 kN"), 1e-12);
        ```
    "#,
    )
    .register_into_engine(
        engine,
        |ctx: NativeCallContext, path: &str, cols: Map| -> ScriptResult<INT> {
            write(
                &ctx,
                path,
                columns_of(&cols)?,
                LogFormat::Parquet,
                None,
                "write_parquet()",
            )
        },
    );

    func(
        "write_parquet",
        &["path: String", "frame: Frame"],
        "i64",
        r#"
        Writes a frame's columns (time first) to a Parquet file atomically.
        ```rhai
        let p = temp_path("in.csv");
        write_text(p, "time_s,load [N]\n0,5\n1,6\n");
        let pq = temp_path("in.parquet");
        write_parquet(pq, read_log(p));
        assert_close(read_log(pq)["load"][1], q("6 N"), 1e-12);
        ```
    "#,
    )
    .register_into_engine(
        engine,
        |ctx: NativeCallContext, path: &str, f: Frame| -> ScriptResult<INT> {
            write(
                &ctx,
                path,
                frame_columns(&f),
                LogFormat::Parquet,
                None,
                "write_parquet()",
            )
        },
    );
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn channel_values_move_into_the_column() {
        let values = vec![1.0, 2.0];
        let p = values.as_ptr();
        let c = channel_column(Channel::new("x", Unit::parse("kN").unwrap(), values));
        assert_eq!(c.data().as_ptr(), p);
        assert_eq!(**c.data(), vec![1000.0, 2000.0]);
    }

    #[test]
    fn numbers_are_short() {
        assert_eq!(num(0.5), "0.5");
        assert_eq!(num(2.0 / 3.0), "0.666667");
    }
}
