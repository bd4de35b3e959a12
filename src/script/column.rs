//! `Column`: a unit-carrying vector of SI values whose arithmetic, reductions and maps run in
//! Rust over the whole column, so per-sample work never runs in the interpreter (DESIGN.md §5).
//!
//! The values sit in an `Arc<Vec<f64>>`: the polars import moves a `Vec<f64>` in without
//! copying, and an operator whose operand is a temporary (`(x * 2.0) + y`) writes into that
//! temporary's buffer instead of allocating a new one.
//!
//! Unit rules are the units layer's own: each operation is first applied to one representative
//! `Quantity` per operand, which yields the result's dimension, kind and display unit (or the
//! error), and only then to the numbers.

use std::fmt;
use std::sync::Arc;

use rhai::{Array, Dynamic, Engine, EvalAltResult, INT};

use super::bind::{ScriptResult, fault, func, number, type_of};
use crate::units::{Quantity, Unit, UnitError};
use crate::{Dimension, Kind, MimeBundle, ToMime, html_escape};

/// A column of values with one dimension, kind and display unit, stored in SI.
///
/// ```
/// use gaugebook::script::Column;
/// let c = Column::new(vec![1.0, 2.0, 3.0], "mV")?;
/// assert_eq!(c.len(), 3);
/// assert!((c.data()[2] - 3e-3).abs() < 1e-18);
/// assert_eq!(c.values_in("V")?.len(), 3);
/// # Ok::<(), gaugebook::UnitError>(())
/// ```
#[derive(Clone, Debug)]
pub struct Column {
    data: Arc<Vec<f64>>,
    dim: Dimension,
    kind: Kind,
    unit: Option<Arc<Unit>>,
}

impl Column {
    /// A column from values written in `unit`; converted to SI in place (no copy).
    ///
    /// ```
    /// use gaugebook::script::Column;
    /// let e = Column::new(vec![0.0, 500.0, 1000.0], "ue")?;
    /// assert_eq!(e.kind(), gaugebook::Kind::Strain);
    /// assert!((e.data()[2] - 1e-3).abs() < 1e-15);
    /// assert!(Column::new(vec![1.0], "furlong").is_err());
    /// # Ok::<(), gaugebook::UnitError>(())
    /// ```
    pub fn new(mut values: Vec<f64>, unit: &str) -> Result<Column, UnitError> {
        let u = Unit::parse(unit)?;
        if u.factor() != 1.0 || u.offset() != 0.0 {
            for v in values.iter_mut() {
                *v = u.to_si(*v);
            }
        }
        Ok(Column {
            data: Arc::new(values),
            dim: u.dimension(),
            kind: u.kind(),
            unit: Some(Arc::new(u)),
        })
    }

    /// A column from SI values; `unit` (if any) must have the same dimension and kind, else it
    /// is dropped and the column shows in SI.
    ///
    /// ```
    /// use gaugebook::script::Column;
    /// use std::sync::Arc;
    /// use gaugebook::{Kind, Unit};
    /// let kn = Arc::new(Unit::parse("kN")?);
    /// let c = Column::from_si(Arc::new(vec![2000.0]), kn.dimension(), Kind::Plain, Some(kn.clone()));
    /// assert_eq!(c.unit().map(|u| u.symbol()), Some("kN"));
    /// let v = Column::from_si(Arc::new(vec![2.0]), Unit::parse("V")?.dimension(), Kind::Plain, Some(kn));
    /// assert!(v.unit().is_none()); // kN does not fit volts: shown in SI
    /// # Ok::<(), gaugebook::UnitError>(())
    /// ```
    pub fn from_si(
        data: Arc<Vec<f64>>,
        dim: Dimension,
        kind: Kind,
        unit: Option<Arc<Unit>>,
    ) -> Column {
        let unit = unit.filter(|u| u.dimension() == dim && u.kind() == kind);
        Column {
            data,
            dim,
            kind,
            unit,
        }
    }

    /// The SI values.
    ///
    /// ```
    /// use gaugebook::script::Column;
    /// let c = Column::new(vec![1.5], "kN")?;
    /// assert_eq!(c.data().as_slice(), &[1500.0]);
    /// # Ok::<(), gaugebook::UnitError>(())
    /// ```
    pub fn data(&self) -> &Arc<Vec<f64>> {
        &self.data
    }

    /// The SI values as an owned vector: the column's own buffer when nothing else holds it
    /// (a temporary in a script expression), else a copy.
    ///
    /// ```
    /// use gaugebook::script::Column;
    /// let c = Column::new(vec![1.5, 2.0], "kN")?;
    /// assert_eq!(c.into_data(), vec![1500.0, 2000.0]);
    /// # Ok::<(), gaugebook::UnitError>(())
    /// ```
    pub fn into_data(self) -> Vec<f64> {
        Arc::try_unwrap(self.data).unwrap_or_else(|shared| shared.as_ref().clone())
    }

    /// The dimension.
    ///
    /// ```
    /// use gaugebook::script::Column;
    /// let c = Column::new(vec![1.0], "kN")?;
    /// assert_eq!(c.dimension(), gaugebook::Unit::parse("N")?.dimension());
    /// # Ok::<(), gaugebook::UnitError>(())
    /// ```
    pub fn dimension(&self) -> Dimension {
        self.dim
    }

    /// The kind.
    ///
    /// ```
    /// use gaugebook::script::Column;
    /// assert_eq!(Column::new(vec![2.0], "mV/V")?.kind(), gaugebook::Kind::OutputRatio);
    /// # Ok::<(), gaugebook::UnitError>(())
    /// ```
    pub fn kind(&self) -> Kind {
        self.kind
    }

    /// The display unit, if any.
    ///
    /// ```
    /// use gaugebook::script::Column;
    /// assert_eq!(Column::new(vec![2.0], "MPa")?.unit().map(|u| u.symbol()), Some("MPa"));
    /// # Ok::<(), gaugebook::UnitError>(())
    /// ```
    pub fn unit(&self) -> Option<&Unit> {
        self.unit.as_deref()
    }

    /// Number of samples.
    ///
    /// ```
    /// use gaugebook::script::Column;
    /// assert_eq!(Column::new(vec![1.0, 2.0], "N")?.len(), 2);
    /// # Ok::<(), gaugebook::UnitError>(())
    /// ```
    pub fn len(&self) -> usize {
        self.data.len()
    }

    /// True when there are no samples.
    ///
    /// ```
    /// use gaugebook::script::Column;
    /// assert!(Column::new(Vec::new(), "N")?.is_empty());
    /// # Ok::<(), gaugebook::UnitError>(())
    /// ```
    pub fn is_empty(&self) -> bool {
        self.data.is_empty()
    }

    /// Sample `i` as a quantity in the display unit.
    ///
    /// ```
    /// let c = gaugebook::script::Column::new(vec![5.0, 6.0], "kN")?;
    /// assert_eq!(c.get(1).map(|q| q.si()), Some(6000.0));
    /// # Ok::<(), gaugebook::UnitError>(())
    /// ```
    pub fn get(&self, i: usize) -> Option<Quantity> {
        self.data.get(i).map(|&si| self.quantity(si))
    }

    /// The values expressed in `unit`.
    ///
    /// ```
    /// use gaugebook::script::Column;
    /// let c = Column::new(vec![1.0, 2.5], "kN")?;
    /// assert_eq!(c.values_in("N")?, vec![1000.0, 2500.0]);
    /// assert!(c.values_in("V").is_err()); // not a force
    /// # Ok::<(), gaugebook::UnitError>(())
    /// ```
    pub fn values_in(&self, unit: &str) -> Result<Vec<f64>, UnitError> {
        let u = Unit::parse(unit)?;
        self.rep().value_in(unit)?;
        Ok(self.data.iter().map(|&si| u.from_si(si)).collect())
    }

    /// "a column of 3 values in mV", for messages.
    pub(crate) fn describe(&self) -> String {
        format!("a column of {} values in {}", self.len(), self.unit_text())
    }

    fn unit_text(&self) -> String {
        match &self.unit {
            Some(u) => u.symbol().to_string(),
            None if self.dim.is_dimensionless() && self.kind == Kind::Plain => {
                "plain numbers".into()
            }
            None => self.dim.to_string(),
        }
    }

    fn quantity(&self, si: f64) -> Quantity {
        let q = Quantity::from_si(si, self.dim, self.kind);
        match &self.unit {
            Some(u) => q.to(u.symbol()).unwrap_or(q),
            None => q,
        }
    }

    /// One quantity standing for the column in unit algebra.
    fn rep(&self) -> Quantity {
        let first = self.data.first().copied().unwrap_or(1.0);
        self.quantity(if first.is_finite() { first } else { 1.0 })
    }

    /// `f` over the samples, keeping the unit; reuses the buffer when this is its only owner.
    fn map_keep(self, f: impl Fn(f64) -> f64) -> Column {
        let Column {
            data,
            dim,
            kind,
            unit,
        } = self;
        Column {
            data: map_owned(data, f),
            dim,
            kind,
            unit,
        }
    }

    /// A column with `meta`'s dimension, kind and display unit. A result with no display unit
    /// (a product or quotient: `strain * E`) takes the SI unit its largest value would print
    /// in (`MPa`), so that it converts, compares and labels like a column read with a unit.
    fn with_meta(data: Arc<Vec<f64>>, meta: &Quantity) -> Column {
        let unit = match meta.unit() {
            Some(u) => Some(u.clone()),
            None => {
                let big = data
                    .iter()
                    .filter(|v| v.is_finite())
                    .fold(0.0f64, |m, v| m.max(v.abs()));
                Quantity::from_si(big, meta.dimension(), meta.kind()).shown_unit()
            }
        };
        Column::from_si(data, meta.dimension(), meta.kind(), unit.map(Arc::new))
    }

    fn display_values(&self, max: usize) -> String {
        let u = self.unit.as_deref();
        let fmt = |si: f64| {
            let v = u.map_or(si, |u| u.from_si(si));
            short(v)
        };
        let n = self.len();
        if n <= max {
            self.data
                .iter()
                .map(|&x| fmt(x))
                .collect::<Vec<_>>()
                .join(", ")
        } else {
            let head = self.data[..max / 2].iter().map(|&x| fmt(x));
            let tail = self.data[n - max / 2..].iter().map(|&x| fmt(x));
            head.chain(std::iter::once("…".to_string()))
                .chain(tail)
                .collect::<Vec<_>>()
                .join(", ")
        }
    }
}

/// Up to 6 significant figures, trailing zeros dropped (the way a person writes a reading).
fn short(v: f64) -> String {
    super::core::format_number(v, 6)
}

/// `[1, 2, 3] mV (3 samples)`; long columns show their first and last values.
impl fmt::Display for Column {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        let unit = match &self.unit {
            Some(u) if !u.symbol().is_empty() => format!(" {}", u.symbol()),
            Some(_) => String::new(),
            None if self.dim.is_dimensionless() && self.kind == Kind::Plain => String::new(),
            None => format!(" {}", self.dim),
        };
        write!(
            f,
            "[{}]{unit} ({} samples)",
            self.display_values(10),
            self.len()
        )
    }
}

impl ToMime for Column {
    fn to_mime(&self) -> MimeBundle {
        let mut html = String::from("<table class=\"gaugebook-column\"><thead><tr><th>#</th><th>");
        html.push_str(&html_escape(&self.unit_text()));
        html.push_str("</th></tr></thead><tbody>");
        let n = self.len();
        let shown: Vec<usize> = if n <= 20 {
            (0..n).collect()
        } else {
            (0..10).chain(n - 10..n).collect()
        };
        let u = self.unit.as_deref();
        for (j, &i) in shown.iter().enumerate() {
            if n > 20 && j == 10 {
                html.push_str("<tr><td>…</td><td>…</td></tr>");
            }
            let v = u.map_or(self.data[i], |u| u.from_si(self.data[i]));
            html.push_str(&format!("<tr><td>{i}</td><td>{}</td></tr>", short(v)));
        }
        html.push_str(&format!("</tbody><caption>{n} samples</caption></table>"));
        MimeBundle::text(self.to_string()).with("text/html", html)
    }
}

/// The columns of an array argument of `func` (sharing their buffers), or an error naming the
/// first item that is not one.
pub(crate) fn array_columns(items: &Array, func: &str) -> ScriptResult<Vec<Column>> {
    items
        .iter()
        .enumerate()
        .map(|(i, v)| {
            v.read_lock::<Column>().map(|c| c.clone()).ok_or_else(|| {
                fault(
                    "ArgumentError",
                    format!("item {i} of {func} must be a Column, found {}", type_of(v)),
                )
            })
        })
        .collect()
}

/// The blocks of one record: an array of at least one column, all of the first one's dimension
/// and kind. `what` names the argument in messages (`"concat()"`, `"the blocks of rainflow()"`).
pub(crate) fn record_blocks(items: &Array, what: &str) -> ScriptResult<Vec<Column>> {
    let parts = array_columns(items, what)?;
    let Some(first) = parts.first() else {
        return Err(fault(
            "ArgumentError",
            format!("{what} needs at least one column"),
        ));
    };
    if let Some((i, c)) = parts
        .iter()
        .enumerate()
        .find(|(_, c)| c.dim != first.dim || c.kind != first.kind)
    {
        return Err(fault(
            "UnitError",
            format!(
                "item {i} of {what} is a column of {}, item 0 one of {}",
                c.dim, first.dim
            ),
        ));
    }
    Ok(parts)
}

/// `f` over the values, writing into the buffer when no one else holds it.
fn map_owned(mut a: Arc<Vec<f64>>, f: impl Fn(f64) -> f64) -> Arc<Vec<f64>> {
    if let Some(v) = Arc::get_mut(&mut a) {
        for x in v.iter_mut() {
            *x = f(*x);
        }
        a
    } else {
        Arc::new(a.iter().map(|&x| f(x)).collect())
    }
}

/// `f` pairwise, writing into whichever buffer no one else holds.
fn zip_owned(
    mut a: Arc<Vec<f64>>,
    mut b: Arc<Vec<f64>>,
    f: impl Fn(f64, f64) -> f64,
) -> Arc<Vec<f64>> {
    if let Some(v) = Arc::get_mut(&mut a) {
        for (x, &y) in v.iter_mut().zip(b.iter()) {
            *x = f(*x, y);
        }
        a
    } else if let Some(w) = Arc::get_mut(&mut b) {
        for (y, &x) in w.iter_mut().zip(a.iter()) {
            *y = f(x, *y);
        }
        b
    } else {
        Arc::new(a.iter().zip(b.iter()).map(|(&x, &y)| f(x, y)).collect())
    }
}

#[derive(Clone, Copy)]
enum Op {
    Add,
    Sub,
    Mul,
    Div,
}

impl Op {
    fn word(self) -> &'static str {
        match self {
            Op::Add => "add",
            Op::Sub => "subtract",
            Op::Mul => "multiply",
            Op::Div => "divide",
        }
    }

    /// The result's unit metadata, by the units layer's rules on representatives.
    fn meta(self, a: &Quantity, b: &Quantity) -> Result<Quantity, UnitError> {
        match self {
            Op::Add => a.try_add(b),
            Op::Sub => a.try_sub(b),
            Op::Mul => Ok(a.mul(b)),
            Op::Div => Ok(a.div(b)),
        }
    }
}

/// One operand of a column operation.
enum Side {
    Col(Column),
    Scalar(Quantity),
}

impl Side {
    fn num(x: f64) -> Side {
        Side::Scalar(Quantity::number(x))
    }

    fn rep(&self) -> Quantity {
        match self {
            Side::Col(c) => c.rep(),
            Side::Scalar(q) => q.clone(),
        }
    }

    fn describe(&self) -> String {
        match self {
            Side::Col(c) => c.describe(),
            Side::Scalar(q) => q.to_string(),
        }
    }
}

fn binary(op: Op, a: Side, b: Side) -> ScriptResult<Column> {
    let meta = op.meta(&a.rep(), &b.rep()).map_err(|e| match e {
        UnitError::Incompatible { .. } => fault(
            "UnitError",
            format!("cannot {} {} and {}", op.word(), a.describe(), b.describe()),
        ),
        other => other.into(),
    })?;
    let data = match (a, b) {
        (Side::Col(x), Side::Col(y)) => {
            if x.len() != y.len() {
                return Err(fault(
                    "ArgumentError",
                    format!(
                        "cannot {} columns of different lengths, {} and {}",
                        op.word(),
                        x.len(),
                        y.len()
                    ),
                ));
            }
            // One loop per operator (not a match per sample), so each loop vectorises.
            match op {
                Op::Add => zip_owned(x.data, y.data, |p, q| p + q),
                Op::Sub => zip_owned(x.data, y.data, |p, q| p - q),
                Op::Mul => zip_owned(x.data, y.data, |p, q| p * q),
                Op::Div => zip_owned(x.data, y.data, |p, q| p / q),
            }
        }
        (Side::Col(x), Side::Scalar(s)) => {
            let s = s.si();
            match op {
                Op::Add => map_owned(x.data, |p| p + s),
                Op::Sub => map_owned(x.data, |p| p - s),
                Op::Mul => map_owned(x.data, |p| p * s),
                Op::Div => map_owned(x.data, |p| p / s),
            }
        }
        (Side::Scalar(s), Side::Col(y)) => {
            let s = s.si();
            match op {
                Op::Add => map_owned(y.data, |q| s + q),
                Op::Sub => map_owned(y.data, |q| s - q),
                Op::Mul => map_owned(y.data, |q| s * q),
                Op::Div => map_owned(y.data, |q| s / q),
            }
        }
        (Side::Scalar(_), Side::Scalar(_)) => {
            return Err(fault(
                "TypeError",
                "column arithmetic needs a column operand",
            ));
        }
    };
    Ok(Column::with_meta(data, &meta))
}

fn reduce_meta(c: &Column, what: &str) -> ScriptResult<()> {
    if c.is_empty() {
        return Err(fault(
            "ArgumentError",
            format!("cannot take the {what} of an empty column"),
        ));
    }
    Ok(())
}

fn sum(c: &Column) -> ScriptResult<Quantity> {
    let rep = c.rep();
    let meta = rep.try_add(&rep)?;
    let s: f64 = c.data.iter().sum();
    Ok(Column::with_meta(Arc::new(vec![s]), &meta).quantity(s))
}

fn mean(c: &Column) -> ScriptResult<Quantity> {
    reduce_meta(c, "mean")?;
    let m = c.data.iter().sum::<f64>() / c.len() as f64;
    Ok(c.quantity(m))
}

/// Sample standard deviation, divisor n − 1 (JCGM 100:2008, GUM, eq. 4, experimental standard
/// deviation (from memory)).
fn std(c: &Column) -> ScriptResult<Quantity> {
    if c.len() < 2 {
        return Err(fault(
            "ArgumentError",
            format!("std needs at least 2 samples, found {}", c.len()),
        ));
    }
    let n = c.len() as f64;
    let m = c.data.iter().sum::<f64>() / n;
    let ss: f64 = c.data.iter().map(|x| (x - m) * (x - m)).sum();
    let rep = c.rep();
    let meta = rep.try_sub(&rep)?;
    Ok(Column::with_meta(Arc::new(vec![0.0]), &meta).quantity((ss / (n - 1.0)).sqrt()))
}

fn rms(c: &Column) -> ScriptResult<Quantity> {
    reduce_meta(c, "rms")?;
    let ms = c.data.iter().map(|x| x * x).sum::<f64>() / c.len() as f64;
    Ok(c.quantity(ms.sqrt()))
}

fn extreme(c: &Column, what: &str, pick: fn(f64, f64) -> f64) -> ScriptResult<Quantity> {
    reduce_meta(c, what)?;
    let v = c.data.iter().copied().fold(f64::NAN, pick);
    Ok(c.quantity(v))
}

fn index(c: &Column, i: INT) -> ScriptResult<Quantity> {
    let n = c.len() as INT;
    let j = if i < 0 { n + i } else { i };
    if j < 0 || j >= n {
        return Err(fault(
            "IndexError",
            format!("index {i} out of bounds for a column of {n} samples"),
        ));
    }
    Ok(c.quantity(c.data[j as usize]))
}

/// A column from an array of quantities (one dimension and kind) or plain numbers.
fn from_array(arr: &Array) -> ScriptResult<Column> {
    let mut data = Vec::with_capacity(arr.len());
    let mut meta: Option<Quantity> = None;
    for (i, x) in arr.iter().enumerate() {
        let q = if let Some(q) = x.read_lock::<Quantity>() {
            q.clone()
        } else if let Some(v) = number(x) {
            Quantity::number(v)
        } else {
            return Err(fault(
                "TypeError",
                format!(
                    "column() needs quantities or numbers, found {} at index {i}",
                    type_of(x)
                ),
            ));
        };
        if let Some(m) = &meta {
            if m.dimension() != q.dimension() || m.kind() != q.kind() {
                return Err(fault(
                    "UnitError",
                    format!(
                        "column() needs one unit for all entries: index 0 is {m}, index {i} is {q}"
                    ),
                ));
            }
        } else {
            meta = Some(q.clone());
        }
        data.push(q.si());
    }
    let meta = meta.unwrap_or_else(|| Quantity::number(0.0));
    Ok(Column::with_meta(Arc::new(data), &meta))
}

fn from_array_in(arr: &Array, unit: &str) -> ScriptResult<Column> {
    let mut v = Vec::with_capacity(arr.len());
    for (i, x) in arr.iter().enumerate() {
        v.push(number(x).ok_or_else(|| {
            fault(
                "TypeError",
                format!(
                    "column(values, unit) needs numbers, found {} at index {i}",
                    type_of(x)
                ),
            )
        })?);
    }
    Ok(Column::new(v, unit)?)
}

fn linspace(a: Dynamic, b: Dynamic, n: INT) -> ScriptResult<Column> {
    let qa = a
        .read_lock::<Quantity>()
        .map(|q| q.clone())
        .or_else(|| number(&a).map(Quantity::number));
    let qb = b
        .read_lock::<Quantity>()
        .map(|q| q.clone())
        .or_else(|| number(&b).map(Quantity::number));
    let (Some(qa), Some(qb)) = (qa, qb) else {
        return Err(fault(
            "TypeError",
            format!(
                "linspace needs quantities or numbers, found {} and {}",
                type_of(&a),
                type_of(&b)
            ),
        ));
    };
    let span = qb.try_sub(&qa)?;
    let _ = span;
    if n < 2 {
        return Err(fault(
            "ArgumentError",
            format!("linspace needs at least 2 points, found {n}"),
        ));
    }
    let (x0, x1) = (qa.si(), qb.si());
    let step = (x1 - x0) / (n - 1) as f64;
    let data: Vec<f64> = (0..n)
        .map(|i| if i == n - 1 { x1 } else { x0 + step * i as f64 })
        .collect();
    Ok(Column::with_meta(Arc::new(data), &qa))
}

/// Registers the `Column` type, its operators, reductions and constructors.
pub(crate) fn register(engine: &mut Engine) {
    super::bind::register_display::<Column>(engine, "Column");

    macro_rules! ops {
        ($name:literal, $op:expr) => {
            engine.register_fn($name, |a: Column, b: Column| {
                binary($op, Side::Col(a), Side::Col(b))
            });
            engine.register_fn($name, |a: Column, b: Quantity| {
                binary($op, Side::Col(a), Side::Scalar(b))
            });
            engine.register_fn($name, |a: Quantity, b: Column| {
                binary($op, Side::Scalar(a), Side::Col(b))
            });
            engine.register_fn($name, |a: Column, b: f64| {
                binary($op, Side::Col(a), Side::num(b))
            });
            engine.register_fn($name, |a: f64, b: Column| {
                binary($op, Side::num(a), Side::Col(b))
            });
            engine.register_fn($name, |a: Column, b: INT| {
                binary($op, Side::Col(a), Side::num(b as f64))
            });
            engine.register_fn($name, |a: INT, b: Column| {
                binary($op, Side::num(a as f64), Side::Col(b))
            });
        };
    }
    ops!("+", Op::Add);
    ops!("-", Op::Sub);
    ops!("*", Op::Mul);
    ops!("/", Op::Div);

    engine.register_fn("-", |a: Column| a.map_keep(|x| -x));
    engine.register_fn("**", |a: Column, n: INT| -> ScriptResult<Column> {
        let meta = a.rep().powi(n as i32);
        let n = n as i32;
        Ok(Column::with_meta(map_owned(a.data, |x| x.powi(n)), &meta))
    });
    engine.register_indexer_get(|c: &mut Column, i: INT| index(c, i));
    engine.register_get("len", |c: &mut Column| c.len() as INT);
    engine.register_get("unit", |c: &mut Column| c.unit_text());

    func(
        "len",
        &["column: Column"],
        "i64",
        r#"
        Number of samples in a column.
        ```rhai
        assert_eq(len(column([1.0, 2.0, 3.0], "mV")), 3);
        ```
    "#,
    )
    .register_into_engine(engine, |c: &mut Column| c.len() as INT);

    func(
        "column",
        &["values: Array"],
        "Column",
        r#"
        A column from an array of quantities of one unit, or of plain numbers.
        ```rhai
        let c = column([q("1 mV"), q("2 mV"), q("3 mV")]);
        assert_eq(c.len, 3);
        assert_close(c.mean(), q("2 mV"), 1e-12);
        ```
    "#,
    )
    .register_into_engine(engine, |a: Array| from_array(&a));

    func(
        "column",
        &["values: Array", "unit: String"],
        "Column",
        r#"
        A column from an array of numbers written in `unit`.
        ```rhai
        let f = column([0.0, 500.0, 1000.0], "N");
        assert_close(f.max(), q("1 kN"), 1e-12);
        ```
    "#,
    )
    .register_into_engine(engine, |a: Array, unit: &str| from_array_in(&a, unit));

    func(
        "linspace",
        &["start: Quantity", "stop: Quantity", "n: i64"],
        "Column",
        r#"
        `n` evenly spaced values from `start` to `stop`, both included.
        ```rhai
        let f = linspace(0.0 * kN, 10.0 * kN, 11);
        assert_eq(f.len, 11);
        assert_close(f[3], q("3 kN"), 1e-12);
        ```
    "#,
    )
    .register_into_engine(engine, linspace);

    func(
        "to_array",
        &["column: Column"],
        "Array",
        r#"
        The column as an array of quantities.
        ```rhai
        let a = column([1.0, 2.0], "V").to_array();
        assert_close(a[1], q("2 V"), 1e-12);
        ```
    "#,
    )
    .register_into_engine(engine, |c: &mut Column| -> Array {
        c.data
            .iter()
            .map(|&si| Dynamic::from(c.quantity(si)))
            .collect()
    });

    func(
        "values",
        &["column: Column", "unit: String"],
        "Array",
        r#"
        The column's numbers in `unit`, as an array of floats.
        ```rhai
        let v = column([1.0, 2.0], "kN").values("N");
        assert_eq(v, [1000.0, 2000.0]);
        ```
    "#,
    )
    .register_into_engine(
        engine,
        |c: &mut Column, unit: &str| -> ScriptResult<Array> {
            Ok(c.values_in(unit)?.into_iter().map(Dynamic::from).collect())
        },
    );

    func(
        "to",
        &["column: Column", "unit: String"],
        "Column",
        r#"
        The same column shown in another unit of the same dimension and kind.
        ```rhai
        let c = column([1500.0], "N").to("kN");
        assert_eq(c.unit, "kN");
        assert_close(c[0], q("1.5 kN"), 1e-12);
        ```
    "#,
    )
    .register_into_engine(
        engine,
        |c: &mut Column, unit: &str| -> ScriptResult<Column> {
            let meta = c.rep().to(unit)?;
            Ok(Column::with_meta(c.data.clone(), &meta))
        },
    );

    func(
        "slice",
        &["column: Column", "start: i64", "end: i64"],
        "Column",
        r#"
        Samples `start` (included) to `end` (excluded).
        ```rhai
        let c = column([1.0, 2.0, 3.0, 4.0], "V").slice(1, 3);
        assert_eq(c.values("V"), [2.0, 3.0]);
        ```
    "#,
    )
    .register_into_engine(
        engine,
        |c: &mut Column, start: INT, end: INT| -> ScriptResult<Column> {
            let n = c.len() as INT;
            if start < 0 || end < start || end > n {
                return Err(fault(
                    "IndexError",
                    format!("slice {start}..{end} out of bounds for a column of {n} samples"),
                ));
            }
            let data = c.data[start as usize..end as usize].to_vec();
            Ok(Column {
                data: Arc::new(data),
                ..c.clone()
            })
        },
    );

    func(
        "concat",
        &["columns: Array"],
        "Column",
        r#"
        The columns one after the other (blocks of a record joined back together); all must have
        one dimension, and the result shows in the first one's unit.
        ```rhai
        let c = concat([column([1.0, 2.0], "kN"), column([3000.0], "N")]);
        assert_eq(c.values("kN"), [1.0, 2.0, 3.0]);
        ```
    "#,
    )
    .register_into_engine(engine, |cols: Array| -> ScriptResult<Column> {
        let parts = record_blocks(&cols, "concat()")?;
        let first = &parts[0];
        let mut data = Vec::with_capacity(parts.iter().map(Column::len).sum());
        for c in &parts {
            data.extend_from_slice(&c.data);
        }
        Ok(Column {
            data: Arc::new(data),
            ..first.clone()
        })
    });

    func(
        "sum",
        &["column: Column"],
        "Quantity",
        r#"
        The sum of the samples.
        ```rhai
        assert_close(column([1.0, 2.0, 3.5], "N").sum(), q("6.5 N"), 1e-12);
        ```
    "#,
    )
    .register_into_engine(engine, |c: &mut Column| sum(c));

    func(
        "mean",
        &["column: Column"],
        "Quantity",
        r#"
        The arithmetic mean.
        ```rhai
        assert_close(column([1.0, 2.0, 6.0], "mV").mean(), q("3 mV"), 1e-12);
        ```
    "#,
    )
    .register_into_engine(engine, |c: &mut Column| mean(c));

    func(
        "std",
        &["column: Column"],
        "Quantity",
        r#"
        The sample standard deviation (divisor n − 1, the GUM's experimental standard deviation).
        ```rhai
        // numpy 2.4.6: numpy.std([1, 2, 3, 4], ddof=1) = 1.2909944487358056
        assert_close(column([1.0, 2.0, 3.0, 4.0], "mV").std(), 1.2909944487358056 * mV, 1e-12);
        ```
    "#,
    )
    .register_into_engine(engine, |c: &mut Column| std(c));

    func(
        "rms",
        &["column: Column"],
        "Quantity",
        r#"
        The root mean square.
        ```rhai
        // sqrt((9 + 16) / 2) = 3.5355339059327378
        assert_close(column([3.0, -4.0], "V").rms(), 3.5355339059327378 * V, 1e-12);
        ```
    "#,
    )
    .register_into_engine(engine, |c: &mut Column| rms(c));

    func(
        "min",
        &["column: Column"],
        "Quantity",
        r#"
        The smallest sample (NaN samples are skipped).
        ```rhai
        assert_close(column([3.0, -4.0, 1.0], "N").min(), q("-4 N"), 1e-12);
        ```
    "#,
    )
    .register_into_engine(engine, |c: &mut Column| extreme(c, "min", f64::min));

    func(
        "max",
        &["column: Column"],
        "Quantity",
        r#"
        The largest sample (NaN samples are skipped).
        ```rhai
        assert_close(column([3.0, -4.0, 1.0], "N").max(), q("3 N"), 1e-12);
        ```
    "#,
    )
    .register_into_engine(engine, |c: &mut Column| extreme(c, "max", f64::max));

    func(
        "abs",
        &["column: Column"],
        "Column",
        r#"
        The magnitude of every sample.
        ```rhai
        assert_eq(abs(column([-1.0, 2.0], "V")).values("V"), [1.0, 2.0]);
        ```
    "#,
    )
    .register_into_engine(engine, |c: Column| c.map_keep(f64::abs));

    func(
        "sqrt",
        &["column: Column"],
        "Column",
        r#"
        The square root of every sample; the dimension must have even exponents.
        ```rhai
        let a = column([4.0, 9.0], "mm") * column([1.0, 1.0], "mm");
        assert_close(sqrt(a)[1], q("3 mm"), 1e-12);
        ```
    "#,
    )
    .register_into_engine(engine, |c: Column| -> ScriptResult<Column> {
        let rep = Quantity::from_si(1.0, c.dim, c.kind);
        let meta = rep.sqrt()?;
        if let Some(i) = c.data.iter().position(|&x| x < 0.0) {
            return Err(fault(
                "UnitError",
                format!(
                    "cannot take the square root of {}: sample {i} is negative",
                    c.describe()
                ),
            ));
        }
        Ok(Column::with_meta(map_owned(c.data, f64::sqrt), &meta))
    });
}

#[allow(dead_code)]
fn _assert_send_sync() {
    fn is<T: Send + Sync>() {}
    is::<Column>();
    let _: Option<Box<EvalAltResult>> = None;
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn temporaries_are_reused_in_place() {
        let a = Arc::new(vec![1.0, 2.0]);
        let p = Arc::as_ptr(&a);
        let b = map_owned(a, |x| x * 2.0);
        assert_eq!(Arc::as_ptr(&b), p);
        assert_eq!(*b, vec![2.0, 4.0]);
        let shared = b.clone();
        let c = map_owned(b, |x| x + 1.0);
        assert_ne!(Arc::as_ptr(&c), Arc::as_ptr(&shared));
        assert_eq!(*shared, vec![2.0, 4.0]);
    }

    #[test]
    fn short_numbers() {
        assert_eq!(short(0.4995), "0.4995");
        assert_eq!(short(174.65), "174.65");
        assert_eq!(short(1.0 / 3.0), "0.333333");
    }
}
