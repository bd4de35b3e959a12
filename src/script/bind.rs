//! Helpers every binding file uses: documented registration, options maps, quantity-or-column
//! arguments, and result records. See the convention in `src/script/mod.rs`.

use std::fmt::Display;
use std::path::{Path, PathBuf};
use std::sync::Arc;

use rhai::{
    Dynamic, Engine, EvalAltResult, FuncRegistration, ImmutableString, Map, NativeCallContext,
};

use super::column::Column;
use super::output::text_of;
use crate::units::{Quantity, Unit};
use crate::{MimeBundle, ToMime, html_escape};

pub(crate) use super::error::fault;

/// What a fallible native function returns; `?` converts `UnitError` and `PhysicsError`.
pub(crate) type ScriptResult<T> = Result<T, Box<EvalAltResult>>;

/// A registration with its parameters, return type and reference text filled in.
///
/// `params` are `"name: Type"` strings, `ret` the return type, `doc` markdown whose first line
/// is the summary and which holds at least one ` ```rhai ` example that asserts its result.
/// Finish with `.register_into_engine(engine, closure)`.
///
/// ```ignore
/// bind::func("q", &["text: String"], "Quantity", r#"
/// Builds a quantity from text.
/// ```rhai
/// assert_eq(q("350 ohm").value("kohm"), 0.35);
/// ```
/// "#).register_into_engine(engine, |text: &str| -> ScriptResult<Quantity> { Ok(Quantity::parse(text)?) });
/// ```
pub(crate) fn func(name: &str, params: &[&str], ret: &str, doc: &str) -> FuncRegistration {
    let mut info: Vec<&str> = params.to_vec();
    info.push(ret);
    FuncRegistration::new(name)
        .with_params_info(info)
        .with_comments([doc_comment(doc)])
}

/// Turns markdown into the `///` lines Rhai's metadata expects, dropping the common indent.
fn doc_comment(doc: &str) -> String {
    let lines: Vec<&str> = doc.trim_matches('\n').lines().collect();
    let indent = lines
        .iter()
        .filter(|l| !l.trim().is_empty())
        .map(|l| l.len() - l.trim_start().len())
        .min()
        .unwrap_or(0);
    lines
        .iter()
        .map(|l| {
            let body = l.get(indent..).unwrap_or("").trim_end();
            if body.is_empty() {
                "///".to_string()
            } else {
                format!("/// {body}")
            }
        })
        .collect::<Vec<_>>()
        .join("\n")
}

/// The SI values of a quantity or a column argument.
#[derive(Clone, Debug, PartialEq)]
pub(crate) enum Values {
    /// One value (from a `Quantity` or a plain number).
    One(f64),
    /// A whole column, shared without copying.
    Many(Arc<Vec<f64>>),
}

impl Values {
    /// Number of samples (1 for a scalar).
    pub(crate) fn len(&self) -> usize {
        match self {
            Values::One(_) => 1,
            Values::Many(v) => v.len(),
        }
    }

    /// Sample `i` (the scalar for every `i`).
    #[inline]
    pub(crate) fn get(&self, i: usize) -> f64 {
        match self {
            Values::One(x) => *x,
            Values::Many(v) => v[i],
        }
    }
}

/// Reads a quantity or column argument whose unit must be convertible to `unit` (same dimension
/// and kind), as SI numbers. A bare number is accepted where `unit` is dimensionless and plain
/// (`""` or `"1"`). `what` names the argument in the error message.
pub(crate) fn values(x: &Dynamic, what: &str, unit: &str) -> ScriptResult<Values> {
    let target = Unit::parse(unit)?;
    if let Some(q) = x.read_lock::<Quantity>() {
        return match q.value_in(unit) {
            Ok(_) => Ok(Values::One(q.si())),
            Err(_) => Err(fault(
                "UnitError",
                format!(
                    "{what} must be convertible to {}, found {}",
                    target.symbol(),
                    *q
                ),
            )),
        };
    }
    if let Some(c) = x.read_lock::<Column>() {
        return if c.dimension() == target.dimension() && c.kind() == target.kind() {
            Ok(Values::Many(c.data().clone()))
        } else {
            Err(fault(
                "UnitError",
                format!(
                    "{what} must be convertible to {}, found {}",
                    target.symbol(),
                    c.describe()
                ),
            ))
        };
    }
    let plain = target.dimension().is_dimensionless() && target.kind() == crate::Kind::Plain;
    if plain {
        if let Some(v) = number(x) {
            return Ok(Values::One(v));
        }
    }
    Err(fault(
        "ArgumentError",
        format!(
            "{what} must be a quantity or column in {}, found {}",
            if target.symbol().is_empty() {
                "plain numbers"
            } else {
                target.symbol()
            },
            type_of(x)
        ),
    ))
}

/// Reads a single-quantity argument as a uom type (`Force`, `ElectricalResistance`, `Strain` …)
/// through the units layer's `TryFrom<&Quantity>`, naming the argument when it does not fit.
pub(crate) fn uom_arg<T>(x: &Dynamic, what: &str) -> ScriptResult<T>
where
    for<'q> T: TryFrom<&'q Quantity, Error = crate::UnitError>,
{
    match x.read_lock::<Quantity>() {
        Some(q) => T::try_from(&q).map_err(|e| fault("UnitError", format!("{what}: {e}"))),
        None => Err(fault(
            "ArgumentError",
            format!("{what} must be a quantity, found {}", type_of(x)),
        )),
    }
}

/// A uom value (or `Strain`, `OutputRatio`) as a script quantity displayed in `unit`.
pub(crate) fn from_uom<T: Into<Quantity>>(v: T, unit: &str) -> Dynamic {
    let q: Quantity = v.into();
    Dynamic::from(q.to(unit).unwrap_or(q))
}

/// A float from an `f64` or `i64` script value.
pub(crate) fn number(x: &Dynamic) -> Option<f64> {
    x.as_float()
        .ok()
        .or_else(|| x.as_int().ok().map(|i| i as f64))
}

/// The script type of a value, with an article, for messages ("a string", "a Quantity 5 V").
pub(crate) fn type_of(x: &Dynamic) -> String {
    if let Some(q) = x.read_lock::<Quantity>() {
        return format!("{}", *q);
    }
    if let Some(c) = x.read_lock::<Column>() {
        return c.describe();
    }
    let t = x.type_name();
    let t = match t {
        "f64" => "a number",
        "i64" => "an integer",
        "string" | "&str" | "ImmutableString" => "a string",
        "bool" => "a boolean",
        "()" => "nothing (`()`)",
        "array" => "an array",
        "map" => "an object map",
        other => return format!("a {}", other.rsplit("::").next().unwrap_or(other)),
    };
    t.to_string()
}

fn length_error(what: &str, a: usize, b: usize) -> Box<EvalAltResult> {
    fault(
        "ArgumentError",
        format!("{what}: columns of different lengths, {a} and {b}"),
    )
}

/// The common length of several arguments (scalars broadcast), or an error.
fn common_len(args: &[&Values], what: &str) -> ScriptResult<Option<usize>> {
    let mut n: Option<usize> = None;
    for a in args {
        if let Values::Many(v) = a {
            match n {
                None => n = Some(v.len()),
                Some(m) if m != v.len() => return Err(length_error(what, m, v.len())),
                _ => {}
            }
        }
    }
    Ok(n)
}

/// Applies `f` (SI in, SI out) to a scalar or to every sample of a column.
pub(crate) fn lift1<E>(x: &Values, f: impl Fn(f64) -> Result<f64, E>) -> ScriptResult<Values>
where
    Box<EvalAltResult>: From<E>,
{
    lift(&[x], "", |a| f(a[0]))
}

/// Applies `f` to two scalars, or sample by sample where either is a column (a scalar is
/// broadcast against a column; two columns must have the same length).
pub(crate) fn lift2<E>(
    a: &Values,
    b: &Values,
    f: impl Fn(f64, f64) -> Result<f64, E>,
) -> ScriptResult<Values>
where
    Box<EvalAltResult>: From<E>,
{
    lift(&[a, b], "", |x| f(x[0], x[1]))
}

/// Applies `f` to any number of scalar-or-column arguments, sample by sample. An error at one
/// sample stops the work and names the sample. `what` names the function in length errors.
pub(crate) fn lift<E>(
    args: &[&Values],
    what: &str,
    f: impl Fn(&[f64]) -> Result<f64, E>,
) -> ScriptResult<Values>
where
    Box<EvalAltResult>: From<E>,
{
    let mut buf = vec![0.0; args.len()];
    match common_len(args, what)? {
        None => {
            for (b, a) in buf.iter_mut().zip(args) {
                *b = a.get(0);
            }
            Ok(Values::One(f(&buf).map_err(Box::<EvalAltResult>::from)?))
        }
        Some(n) => {
            let mut out = Vec::with_capacity(n);
            for i in 0..n {
                for (b, a) in buf.iter_mut().zip(args) {
                    *b = a.get(i);
                }
                match f(&buf) {
                    Ok(y) => out.push(y),
                    Err(e) => return Err(at_sample(Box::<EvalAltResult>::from(e), i)),
                }
            }
            Ok(Values::Many(Arc::new(out)))
        }
    }
}

fn at_sample(e: Box<EvalAltResult>, i: usize) -> Box<EvalAltResult> {
    if let EvalAltResult::ErrorRuntime(v, _) = &*e {
        if let Some(f) = v.read_lock::<super::error::Fault>() {
            return fault(&f.kind, format!("at sample {i}: {}", f.message));
        }
    }
    e
}

/// Wraps SI results as a `Quantity` (scalar) or a `Column`, displayed in `unit`.
pub(crate) fn shaped(v: Values, unit: &str) -> ScriptResult<Dynamic> {
    let u = Arc::new(Unit::parse(unit)?);
    Ok(match v {
        Values::One(si) => {
            let q = Quantity::from_si(si, u.dimension(), u.kind());
            Dynamic::from(q.to(unit).unwrap_or(q))
        }
        Values::Many(data) => {
            Dynamic::from(Column::from_si(data, u.dimension(), u.kind(), Some(u)))
        }
    })
}

/// Reads an options map (`#{ r0: 350.0 * ohm, gf: 2.1 }`) for function `func` (written with
/// parentheses, `"bridge()"`). Unknown keys are refused when the reader is made.
pub(crate) struct Options<'a> {
    map: &'a Map,
    func: &'a str,
}

impl<'a> Options<'a> {
    /// Checks that every key is one of `allowed`.
    pub(crate) fn new(map: &'a Map, func: &'a str, allowed: &[&str]) -> ScriptResult<Options<'a>> {
        for k in map.keys() {
            if !allowed.contains(&k.as_str()) {
                return Err(fault(
                    "ArgumentError",
                    format!(
                        "unknown key `{k}` in options of {func}; expected {}",
                        allowed
                            .iter()
                            .map(|a| format!("`{a}`"))
                            .collect::<Vec<_>>()
                            .join(", ")
                    ),
                ));
            }
        }
        Ok(Options { map, func })
    }

    fn missing(&self, key: &str) -> Box<EvalAltResult> {
        fault(
            "ArgumentError",
            format!("missing key `{key}` in options of {}", self.func),
        )
    }

    fn what(&self, key: &str) -> String {
        format!("key `{key}` in options of {}", self.func)
    }

    /// True when the key is present.
    pub(crate) fn has(&self, key: &str) -> bool {
        self.map.contains_key(key)
    }

    /// A required quantity convertible to `unit`.
    pub(crate) fn quantity(&self, key: &str, unit: &str) -> ScriptResult<Quantity> {
        self.opt_quantity(key, unit)?
            .ok_or_else(|| self.missing(key))
    }

    /// An optional quantity convertible to `unit`.
    pub(crate) fn opt_quantity(&self, key: &str, unit: &str) -> ScriptResult<Option<Quantity>> {
        let Some(v) = self.map.get(key) else {
            return Ok(None);
        };
        match values(v, &self.what(key), unit)? {
            Values::One(si) => {
                let u = Unit::parse(unit)?;
                Ok(Some(
                    v.read_lock::<Quantity>()
                        .map(|q| q.clone())
                        .unwrap_or_else(|| Quantity::from_si(si, u.dimension(), u.kind())),
                ))
            }
            Values::Many(_) => Err(fault(
                "ArgumentError",
                format!(
                    "{} must be a single quantity, found a column",
                    self.what(key)
                ),
            )),
        }
    }

    /// A required quantity-or-column convertible to `unit`, as SI values.
    pub(crate) fn values(&self, key: &str, unit: &str) -> ScriptResult<Values> {
        let v = self.map.get(key).ok_or_else(|| self.missing(key))?;
        values(v, &self.what(key), unit)
    }

    /// An optional quantity-or-column convertible to `unit`.
    pub(crate) fn opt_values(&self, key: &str, unit: &str) -> ScriptResult<Option<Values>> {
        self.map
            .get(key)
            .map(|v| values(v, &self.what(key), unit))
            .transpose()
    }

    /// A required plain number (integer, float or dimensionless quantity).
    pub(crate) fn f64(&self, key: &str) -> ScriptResult<f64> {
        self.opt_f64(key)?.ok_or_else(|| self.missing(key))
    }

    /// An optional plain number.
    pub(crate) fn opt_f64(&self, key: &str) -> ScriptResult<Option<f64>> {
        let Some(v) = self.map.get(key) else {
            return Ok(None);
        };
        match values(v, &self.what(key), "")? {
            Values::One(x) => Ok(Some(x)),
            Values::Many(_) => Err(fault(
                "ArgumentError",
                format!("{} must be a single number, found a column", self.what(key)),
            )),
        }
    }

    /// A required string.
    pub(crate) fn string(&self, key: &str) -> ScriptResult<String> {
        self.opt_string(key)?.ok_or_else(|| self.missing(key))
    }

    /// An optional string.
    pub(crate) fn opt_string(&self, key: &str) -> ScriptResult<Option<String>> {
        let Some(v) = self.map.get(key) else {
            return Ok(None);
        };
        match v.read_lock::<ImmutableString>() {
            Some(s) => Ok(Some(s.to_string())),
            None => Err(fault(
                "ArgumentError",
                format!("{} must be a string, found {}", self.what(key), type_of(v)),
            )),
        }
    }

    /// An optional boolean.
    pub(crate) fn opt_bool(&self, key: &str) -> ScriptResult<Option<bool>> {
        let Some(v) = self.map.get(key) else {
            return Ok(None);
        };
        v.as_bool().map(Some).map_err(|_| {
            fault(
                "ArgumentError",
                format!(
                    "{} must be true or false, found {}",
                    self.what(key),
                    type_of(v)
                ),
            )
        })
    }

    /// The raw value, for keys that take a domain object.
    pub(crate) fn raw(&self, key: &str) -> Option<&Dynamic> {
        self.map.get(key)
    }
}

/// A result object: a title and named values in order. Fields read as `r.name` or `r["name"]`;
/// it prints as an aligned list and shows in notebooks as an HTML table.
#[derive(Clone, Debug)]
pub(crate) struct Record {
    title: String,
    fields: Vec<(String, Dynamic)>,
    /// Fields read by name (by functions such as figure builders) but neither printed nor
    /// listed by `keys`: bulky data such as Monte Carlo draws.
    hidden: Vec<(String, Dynamic)>,
}

impl Record {
    /// An empty record with a title ("quarter bridge").
    pub(crate) fn new(title: impl Into<String>) -> Record {
        Record {
            title: title.into(),
            fields: Vec::new(),
            hidden: Vec::new(),
        }
    }

    /// Adds a field that is read by name but not printed or listed (see `hidden`).
    pub(crate) fn hidden(mut self, name: &str, value: impl Into<Dynamic>) -> Record {
        self.hidden.push((name.to_string(), value.into()));
        self
    }

    /// Adds a field (any script value: a Quantity, a Column, a number, a string, a Record …).
    pub(crate) fn field(mut self, name: &str, value: impl Into<Dynamic>) -> Record {
        self.fields.push((name.to_string(), value.into()));
        self
    }

    /// A field by name (printed or hidden), or an error listing the printed fields.
    pub(crate) fn get(&self, name: &str) -> ScriptResult<Dynamic> {
        self.fields
            .iter()
            .chain(&self.hidden)
            .find(|(k, _)| k == name)
            .map(|(_, v)| v.clone())
            .ok_or_else(|| {
                fault(
                    "PropertyNotFound",
                    format!(
                        "no field `{name}` in {}; fields are {}",
                        self.title,
                        self.fields
                            .iter()
                            .map(|(k, _)| format!("`{k}`"))
                            .collect::<Vec<_>>()
                            .join(", ")
                    ),
                )
            })
    }

    fn text(&self, ctx: &NativeCallContext) -> String {
        let w = self
            .fields
            .iter()
            .map(|(k, _)| k.chars().count())
            .max()
            .unwrap_or(0);
        let mut out = self.title.clone();
        for (k, v) in &self.fields {
            let mut v = v.clone();
            let t = text_of(ctx, &mut v).replace('\n', "\n    ");
            out.push_str(&format!("\n  {k:<w$}  {t}"));
        }
        out
    }

    fn html(&self, ctx: &NativeCallContext) -> String {
        let mut out = format!(
            "<table class=\"gaugebook-record\"><caption>{}</caption><tbody>",
            html_escape(&self.title)
        );
        for (k, v) in &self.fields {
            let mut v = v.clone();
            let cell = match super::output::mime_of(ctx, &mut v).get("text/html") {
                Some(h) => h.to_string(),
                None => html_escape(&text_of(ctx, &mut v)),
            };
            out.push_str(&format!(
                "<tr><th>{}</th><td>{cell}</td></tr>",
                html_escape(k)
            ));
        }
        out.push_str("</tbody></table>");
        out
    }
}

/// Registers `Record`: field access, `keys`, `title`, text and MIME.
pub(crate) fn register_record(engine: &mut Engine) {
    engine.register_type_with_name::<Record>("Record");
    engine.register_indexer_get(|r: &mut Record, name: &str| r.get(name));
    engine.register_fn("keys", |r: &mut Record| -> rhai::Array {
        r.fields
            .iter()
            .map(|(k, _)| Dynamic::from(k.clone()))
            .collect()
    });
    engine.register_get("title", |r: &mut Record| r.title.clone());
    engine.register_fn("to_map", |r: &mut Record| -> Map {
        r.fields
            .iter()
            .map(|(k, v)| (k.as_str().into(), v.clone()))
            .collect()
    });
    engine.register_fn("to_string", |ctx: NativeCallContext, r: &mut Record| {
        r.text(&ctx)
    });
    engine.register_fn("to_debug", |ctx: NativeCallContext, r: &mut Record| {
        r.text(&ctx)
    });
    engine.register_fn("to_mime", |ctx: NativeCallContext, r: &mut Record| -> Map {
        let mut m = Map::new();
        m.insert("text/plain".into(), r.text(&ctx).into());
        m.insert("text/html".into(), r.html(&ctx).into());
        m
    });
}

/// Registers a Rust type's script name, its `to_string`/`to_debug` from `Display`, and its
/// `to_mime` from [`ToMime`], so it prints readably and shows richly in notebooks.
pub(crate) fn register_display<T>(engine: &mut Engine, name: &str)
where
    T: Display + ToMime + Clone + Send + Sync + 'static,
{
    engine.register_type_with_name::<T>(name);
    engine.register_fn("to_string", |x: &mut T| x.to_string());
    engine.register_fn("to_debug", |x: &mut T| x.to_string());
    engine.register_fn("to_mime", |x: &mut T| -> Map { bundle_map(&x.to_mime()) });
}

/// A MIME bundle as the `to_mime` map the session reads.
pub(crate) fn bundle_map(b: &MimeBundle) -> Map {
    b.iter()
        .map(|(k, v)| (k.into(), Dynamic::from(v.to_string())))
        .collect()
}

/// The value of the engine's default tag: the session's script folder, if any.
pub(crate) fn script_dir_tag(dir: Option<&Path>) -> Dynamic {
    dir.map_or(Dynamic::UNIT, |d| {
        Dynamic::from(d.to_string_lossy().to_string())
    })
}

/// A script path made absolute against the script's folder (the calling file's folder, else the session's script folder, else the current directory).
pub(crate) fn resolve(ctx: &NativeCallContext, path: &str) -> PathBuf {
    let p = PathBuf::from(path);
    if p.is_absolute() {
        return p;
    }
    let from_source = ctx
        .call_source()
        .map(Path::new)
        .filter(|s| s.is_file())
        .and_then(Path::parent)
        .map(Path::to_path_buf);
    let from_session = ctx.tag().and_then(|t| {
        t.read_lock::<ImmutableString>()
            .map(|s| PathBuf::from(s.as_str()))
    });
    match from_source.or(from_session) {
        Some(dir) => dir.join(p),
        None => p,
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    /// A complete binding in the convention's shape (test-only; the physics is a voltage
    /// divider, `v_out = v · r2 / (r1 + r2)`, a closed-form identity): options map, quantity or
    /// column inputs, a shaped result inside a `Record`.
    fn register_divider(engine: &mut Engine) {
        func(
            "divider",
            &["options: Map"],
            "Record",
            r#"
            Output of a resistive divider.
            ```rhai
            let d = divider(#{ v: 10.0 * V, r1: 1.0 * kohm, r2: 3.0 * kohm });
            assert_close(d.v_out, q("7.5 V"), 1e-12);
            ```
        "#,
        )
        .register_into_engine(engine, |m: Map| -> ScriptResult<Record> {
            let o = Options::new(&m, "divider()", &["v", "r1", "r2"])?;
            let v = o.values("v", "V")?;
            let r1 = o.values("r1", "ohm")?;
            let r2 = o.values("r2", "ohm")?;
            let out = lift(&[&v, &r1, &r2], "divider()", |x| {
                crate::check_positive("r1 + r2", x[1] + x[2], "Ω")?;
                Ok::<f64, crate::PhysicsError>(x[0] * x[2] / (x[1] + x[2]))
            })?;
            Ok(Record::new("divider")
                .field("v_out", shaped(out, "V")?)
                .field("ratio", 0.75))
        });
    }

    fn engine() -> Engine {
        let mut e = super::super::build_engine(&Default::default());
        register_divider(&mut e);
        e
    }

    #[test]
    fn example_binding_scalar_and_column() {
        let e = engine();
        let v: f64 = e
            .eval(r#"divider(#{ v: 10.0 * V, r1: 1.0 * kohm, r2: 3.0 * kohm }).v_out.value("V")"#)
            .unwrap();
        assert!((v - 7.5).abs() < 1e-12);
        let n: rhai::INT = e
            .eval(r#"let c = divider(#{ v: 10.0 * V, r1: column([1.0, 3.0], "kohm"), r2: 3.0 * kohm }); c["v_out"].len"#)
            .unwrap();
        assert_eq!(n, 2);
        let t: String = e
            .eval(r#"to_string(divider(#{ v: 1.0 * V, r1: 1.0 * ohm, r2: 1.0 * ohm }))"#)
            .unwrap();
        assert_eq!(t, "divider\n  v_out  0.5 V\n  ratio  0.75");
    }

    #[test]
    fn example_binding_errors_name_the_key() {
        let e = engine();
        let msg = |code: &str| match *e.eval::<rhai::Dynamic>(code).unwrap_err() {
            EvalAltResult::ErrorRuntime(v, _) => v
                .read_lock::<super::super::error::Fault>()
                .map(|f| f.message.clone())
                .unwrap_or_default(),
            other => other.to_string(),
        };
        assert!(
            msg(r#"divider(#{ v: 1.0 * V, r1: 1.0 * ohm })"#)
                .contains("missing key `r2` in options of divider()")
        );
        assert!(
            msg(r#"divider(#{ v: 1.0 * V, r1: 1.0 * ohm, r2: 5.0 * V })"#)
                .contains("key `r2` in options of divider() must be convertible to Ω, found 5 V")
        );
        assert!(
            msg(r#"divider(#{ v: 1.0 * V, r1: 1.0 * ohm, r2: 1.0 * ohm, r3: 1 })"#)
                .contains("unknown key `r3`")
        );
        assert!(
            msg(r#"divider(#{ v: 1.0 * V, r1: 1.0 * ohm, r2: "x" })"#).contains("found a string")
        );
        assert!(
            msg(r#"divider(#{ v: 1.0 * V, r1: column([-1.0, -2.0], "ohm"), r2: 1.0 * ohm })"#)
                .contains("at sample 0: invalid r1 + r2")
        );
    }

    #[test]
    fn doc_comment_strips_indent_and_prefixes() {
        assert_eq!(
            doc_comment("\n    Sum.\n\n    ```rhai\n    1\n    ```\n"),
            "/// Sum.\n///\n/// ```rhai\n/// 1\n/// ```"
        );
    }

    #[test]
    fn lift_broadcasts_scalars_and_checks_lengths() {
        let a = Values::Many(Arc::new(vec![1.0, 2.0, 3.0]));
        let b = Values::One(10.0);
        let r = lift2(&a, &b, |x, y| Ok::<f64, Box<EvalAltResult>>(x * y)).unwrap();
        assert_eq!(r, Values::Many(Arc::new(vec![10.0, 20.0, 30.0])));
        let c = Values::Many(Arc::new(vec![1.0]));
        assert!(lift2(&a, &c, |x, y| Ok::<f64, Box<EvalAltResult>>(x + y)).is_err());
        let s = lift1(&b, |x| Ok::<f64, Box<EvalAltResult>>(-x)).unwrap();
        assert_eq!(s, Values::One(-10.0));
    }
}
