//! Design sweeps in scripts: a script function builds a layout from one or two parameter
//! values, `sweep` tabulates the designs over given values, and `solve_for_output` finds the
//! value that gives a target rated output within the stress margin (the physics is
//! [`DesignPoint`] and [`solve_for_rated_output`] in `src/layout/sweep.rs`).
//!
//! The build function may refuse a value (an element outside its range of validity): in a sweep
//! that value is listed as skipped with the reason; any other script error stops the sweep.
//! Every margin carries the caution: design estimates must be proven by test; overload and
//! lifting uses follow local codes and licensed practice.

use std::cell::RefCell;
use std::fmt;

use rhai::{Array, Dynamic, Engine, EvalAltResult, FnPtr, INT, Map, NativeCallContext};
use uom::si::frequency::hertz;
use uom::si::pressure::pascal;

use super::super::bind::{Options, Record, ScriptResult, fault, func, number, type_of};
use super::super::column::Column;
use super::super::error::Fault;
use super::attached_arg;
use crate::units::Quantity;
use crate::{
    DesignCriteria, DesignPoint, Layout, MARGIN_CAUTION, MimeBundle, OutputRatio, OverloadFactors,
    Stiffness, ToMime, html_escape, solve_for_rated_output,
};

/// The keys every sweep and search accepts for its design criteria.
const CRITERIA_KEYS: [&str; 6] = [
    "bridge",
    "attached",
    "safe_overload",
    "ultimate_overload",
    "min_yield_factor",
    "min_fatigue_factor",
];

/// Reads the design criteria from an options map (defaults as [`DesignCriteria::default`]).
fn criteria(o: &Options) -> ScriptResult<DesignCriteria> {
    let mut c = DesignCriteria::default();
    if let Some(b) = o.opt_f64("bridge")? {
        if b.fract() != 0.0 || b < 0.0 {
            return Err(fault(
                "ArgumentError",
                format!("`bridge` must be a bridge index 0, 1, …, found {b}"),
            ));
        }
        c.bridge = b as usize;
    }
    if let Some(a) = o.raw("attached") {
        let q = a.read_lock::<Quantity>().ok_or_else(|| {
            fault(
                "ArgumentError",
                format!(
                    "`attached` must be a mass or a rotary inertia, found {}",
                    type_of(a)
                ),
            )
        })?;
        c.attached = attached_arg(&q)?;
    }
    let defaults = OverloadFactors::default();
    c.overload = OverloadFactors::new(
        o.opt_f64("safe_overload")?.unwrap_or(defaults.safe()),
        o.opt_f64("ultimate_overload")?
            .unwrap_or(defaults.ultimate()),
    )?;
    if let Some(y) = o.opt_f64("min_yield_factor")? {
        c.min_yield_factor = y;
    }
    c.min_fatigue_factor = o.opt_f64("min_fatigue_factor")?;
    Ok(c)
}

/// The kind and message of the script fault an error carries, looking through the function
/// calls it came out of.
fn fault_of(e: &EvalAltResult) -> Option<(String, String)> {
    match e {
        EvalAltResult::ErrorRuntime(v, _) => v
            .read_lock::<Fault>()
            .map(|f| (f.kind.clone(), f.message.clone())),
        EvalAltResult::ErrorInFunctionCall(_, _, inner, _)
        | EvalAltResult::ErrorInModule(_, inner, _) => fault_of(inner),
        _ => None,
    }
}

/// A parameter value: what the build function receives, and how it is shown.
#[derive(Clone)]
struct Value {
    arg: Dynamic,
    label: String,
}

fn value_list(x: &Dynamic, what: &str) -> ScriptResult<Vec<Value>> {
    if let Some(c) = x.read_lock::<Column>() {
        return Ok((0..c.len())
            .filter_map(|i| c.get(i))
            .map(|q| Value {
                label: q.to_string(),
                arg: Dynamic::from(q),
            })
            .collect());
    }
    let Some(arr) = x.read_lock::<Array>() else {
        return Err(fault(
            "ArgumentError",
            format!(
                "{what} must be an array of values or a column, found {}",
                type_of(x)
            ),
        ));
    };
    if arr.is_empty() {
        return Err(fault("ArgumentError", format!("{what} is empty")));
    }
    Ok(arr
        .iter()
        .map(|v| Value {
            label: label(v),
            arg: v.clone(),
        })
        .collect())
}

fn label(v: &Dynamic) -> String {
    if let Some(q) = v.read_lock::<Quantity>() {
        return q.to_string();
    }
    if let Some(n) = number(v) {
        return super::super::core::format_number(n, 6);
    }
    v.to_string()
}

/// Calls the build function and reads the layout it returns.
fn build(ctx: &NativeCallContext, f: &FnPtr, args: &[Dynamic]) -> ScriptResult<Layout> {
    let d: Dynamic = match args {
        [a] => f.call_within_context(ctx, (a.clone(),))?,
        [a, b] => f.call_within_context(ctx, (a.clone(), b.clone()))?,
        _ => {
            return Err(fault(
                "ArgumentError",
                "a sweep takes one or two parameters",
            ));
        }
    };
    let type_name = type_of(&d);
    d.try_cast::<Layout>().ok_or_else(|| {
        fault(
            "ArgumentError",
            format!("the build function must return a layout, found {type_name}"),
        )
    })
}

/// A design sweep's table: one row per evaluated design, and the values the element refused.
#[derive(Clone)]
pub(crate) struct Sweep {
    names: Vec<String>,
    rows: Vec<(Vec<Value>, DesignPoint)>,
    skipped: Vec<(Vec<Value>, String)>,
}

/// `si` in `unit`, shown in `show` (both are fixed symbols of the unit table, so the fallback
/// to a plain number is never taken in practice).
fn quantity(si: f64, unit: &str, show: &str) -> Quantity {
    Quantity::new(si, unit)
        .and_then(|v| v.to(show))
        .unwrap_or_else(|_| Quantity::number(si))
}

fn stiffness_q(k: Stiffness) -> Quantity {
    match k {
        Stiffness::Translational(v) => quantity(v, "N/m", "N/mm"),
        Stiffness::Rotational(v) => quantity(v, "N*m", "N*m"),
    }
}

fn factor(v: Option<f64>) -> String {
    v.map_or("–".into(), |f| format!("{f:.3}"))
}

impl Sweep {
    const HEADINGS: [&'static str; 7] = [
        "rated output",
        "peak stress",
        "yield factor (safe overload)",
        "fatigue factor (rated)",
        "stiffness",
        "frequency",
        "meets margins",
    ];

    fn cells(p: &DesignPoint) -> [String; 7] {
        [
            quantity(p.rated_output.value(), "V/V", "mV/V").to_string(),
            quantity(p.peak_stress.get::<pascal>(), "Pa", "MPa").to_string(),
            format!("{:.3}", p.yield_factor),
            factor(p.fatigue_factor),
            stiffness_q(p.stiffness).to_string(),
            quantity(p.frequency.get::<hertz>(), "Hz", "Hz").to_string(),
            if p.meets_margins { "yes" } else { "no" }.into(),
        ]
    }

    fn values_text(names: &[String], vals: &[Value]) -> String {
        names
            .iter()
            .zip(vals)
            .map(|(n, v)| format!("{n} = {}", v.label))
            .collect::<Vec<_>>()
            .join(", ")
    }

    fn record(&self, i: usize) -> Record {
        let (vals, p) = &self.rows[i];
        let mut r = Record::new(format!(
            "design at {}",
            Self::values_text(&self.names, vals)
        ));
        for (n, v) in self.names.iter().zip(vals) {
            r = r.field(n, v.arg.clone());
        }
        design_fields(r, p)
    }

    fn column(&self, f: impl Fn(&DesignPoint) -> f64, unit: &str, show: &str) -> Column {
        let data: Vec<f64> = self.rows.iter().map(|(_, p)| f(p)).collect();
        let scale = Quantity::new(1.0, unit).map(|q| q.si()).unwrap_or(1.0);
        let shown = Quantity::new(1.0, show).map(|q| q.si()).unwrap_or(1.0);
        Column::new(data.iter().map(|v| v * scale / shown).collect(), show)
            .unwrap_or_else(|_| Column::new(data, "").unwrap_or_else(|_| unreachable_column()))
    }
}

/// An empty plain column (the unit "" always parses, so this is never reached in practice).
fn unreachable_column() -> Column {
    Column::from_si(
        std::sync::Arc::new(Vec::new()),
        crate::Dimension::NONE,
        crate::Kind::Plain,
        None,
    )
}

fn design_fields(r: Record, p: &DesignPoint) -> Record {
    let q = |v: Quantity| Dynamic::from(v);
    r.field(
        "rated_output",
        q(quantity(p.rated_output.value(), "V/V", "mV/V")),
    )
    .field(
        "peak_stress",
        q(quantity(p.peak_stress.get::<pascal>(), "Pa", "MPa")),
    )
    .field("yield_factor", p.yield_factor)
    .field(
        "fatigue_factor",
        p.fatigue_factor.map_or(Dynamic::UNIT, Dynamic::from),
    )
    .field("stiffness", q(stiffness_q(p.stiffness)))
    .field(
        "frequency",
        q(quantity(p.frequency.get::<hertz>(), "Hz", "Hz")),
    )
    .field("meets_margins", p.meets_margins)
    .field("caution", MARGIN_CAUTION)
}

impl fmt::Display for Sweep {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        let mut head: Vec<String> = self.names.clone();
        head.extend(Self::HEADINGS.iter().map(|s| s.to_string()));
        let body: Vec<Vec<String>> = self
            .rows
            .iter()
            .map(|(vals, p)| {
                vals.iter()
                    .map(|v| v.label.clone())
                    .chain(Self::cells(p))
                    .collect()
            })
            .collect();
        let width: Vec<usize> = (0..head.len())
            .map(|j| {
                body.iter()
                    .map(|r| r[j].chars().count())
                    .chain(std::iter::once(head[j].chars().count()))
                    .max()
                    .unwrap_or(0)
            })
            .collect();
        writeln!(f, "design sweep over {}", self.names.join(" and "))?;
        for row in std::iter::once(&head).chain(body.iter()) {
            let line: Vec<String> = row
                .iter()
                .zip(&width)
                .map(|(c, &w)| format!("{c:>w$}"))
                .collect();
            writeln!(f, "  {}", line.join("  "))?;
        }
        for (vals, why) in &self.skipped {
            writeln!(f, "skipped {}: {why}", Self::values_text(&self.names, vals))?;
        }
        write!(f, "caution: {MARGIN_CAUTION}")
    }
}

impl ToMime for Sweep {
    fn to_mime(&self) -> MimeBundle {
        let mut h = format!(
            "<table class=\"gaugebook-sweep\"><caption>design sweep over {}</caption><thead><tr>",
            html_escape(&self.names.join(" and "))
        );
        for n in self.names.iter().map(String::as_str).chain(Self::HEADINGS) {
            h.push_str(&format!("<th>{}</th>", html_escape(n)));
        }
        h.push_str("</tr></thead><tbody>");
        for (vals, p) in &self.rows {
            h.push_str("<tr>");
            for c in vals.iter().map(|v| v.label.clone()).chain(Self::cells(p)) {
                h.push_str(&format!("<td>{}</td>", html_escape(&c)));
            }
            h.push_str("</tr>");
        }
        h.push_str("</tbody></table>");
        if !self.skipped.is_empty() {
            h.push_str("<ul class=\"gaugebook-skipped\">");
            for (vals, why) in &self.skipped {
                h.push_str(&format!(
                    "<li>skipped {}: {}</li>",
                    html_escape(&Self::values_text(&self.names, vals)),
                    html_escape(why)
                ));
            }
            h.push_str("</ul>");
        }
        h.push_str(&format!("<p>caution: {}</p>", html_escape(MARGIN_CAUTION)));
        MimeBundle::text(self.to_string()).with("text/html", h)
    }
}

fn sweep(ctx: &NativeCallContext, f: &FnPtr, opts: &Map) -> ScriptResult<Sweep> {
    let mut keys = vec!["parameter", "parameters", "values"];
    keys.extend(CRITERIA_KEYS);
    let o = Options::new(opts, "sweep()", &keys)?;
    let c = criteria(&o)?;
    let values = o.raw("values").ok_or_else(|| {
        fault(
            "ArgumentError",
            "missing key `values` in options of sweep()",
        )
    })?;
    let (names, grid): (Vec<String>, Vec<Vec<Value>>) = match (
        o.opt_string("parameter")?,
        o.raw("parameters"),
    ) {
        (Some(name), None) => {
            let vs = value_list(values, "key `values` in options of sweep()")?;
            (vec![name], vs.into_iter().map(|v| vec![v]).collect())
        }
        (None, Some(p)) => {
            let names: Vec<String> = p
                .read_lock::<Array>()
                .map(|a| a.iter().map(|s| s.to_string()).collect())
                .unwrap_or_default();
            let lists = values.read_lock::<Array>().map(|a| a.to_vec());
            let (Some(lists), 2) = (lists, names.len()) else {
                return Err(fault(
                    "ArgumentError",
                    "two parameters take `parameters: [name, name]` and `values: [[…], […]]`",
                ));
            };
            if lists.len() != 2 {
                return Err(fault(
                    "ArgumentError",
                    format!(
                        "key `values` in options of sweep() must hold 2 lists for 2 parameters, found {}",
                        lists.len()
                    ),
                ));
            }
            let xs = value_list(&lists[0], &format!("values of `{}`", names[0]))?;
            let ys = value_list(&lists[1], &format!("values of `{}`", names[1]))?;
            let grid = xs
                .iter()
                .flat_map(|x| ys.iter().map(move |y| vec![x.clone(), y.clone()]))
                .collect();
            (names, grid)
        }
        _ => {
            return Err(fault(
                "ArgumentError",
                "sweep() needs `parameter` (one name) or `parameters` (two names), not both",
            ));
        }
    };
    let mut t = Sweep {
        names,
        rows: vec![],
        skipped: vec![],
    };
    for vals in grid {
        let args: Vec<Dynamic> = vals.iter().map(|v| v.arg.clone()).collect();
        let point = match build(ctx, f, &args) {
            Ok(l) => DesignPoint::evaluate(&l, &c, vec![]).map_err(|e| e.to_string()),
            Err(e) => match fault_of(&e) {
                Some((kind, msg)) if kind == "PhysicsError" => Err(msg),
                _ => return Err(e),
            },
        };
        match point {
            Ok(p) => t.rows.push((vals, p)),
            Err(why) => t.skipped.push((vals, why)),
        }
    }
    Ok(t)
}

fn solve(ctx: &NativeCallContext, f: &FnPtr, opts: &Map) -> ScriptResult<Record> {
    let mut keys = vec!["parameter", "lo", "hi", "target"];
    keys.extend(CRITERIA_KEYS);
    let name = "solve_for_output()";
    let o = Options::new(opts, name, &keys)?;
    let c = criteria(&o)?;
    let param = o
        .opt_string("parameter")?
        .unwrap_or_else(|| "parameter".into());
    let target = OutputRatio::new(o.quantity("target", "V/V")?.si());
    let bound = |k: &str| -> ScriptResult<Quantity> {
        let v = o.raw(k).ok_or_else(|| {
            fault(
                "ArgumentError",
                format!("missing key `{k}` in options of {name}"),
            )
        })?;
        if let Some(q) = v.read_lock::<Quantity>() {
            return Ok(q.clone());
        }
        number(v).map(Quantity::number).ok_or_else(|| {
            fault(
                "ArgumentError",
                format!(
                    "key `{k}` in options of {name} must be a quantity or a number, found {}",
                    type_of(v)
                ),
            )
        })
    };
    let (lo, hi) = (bound("lo")?, bound("hi")?);
    // Search in lo's display unit, so the build function receives values in it.
    let unit = lo.unit().map(|u| u.symbol().to_string());
    let shown = |q: &Quantity| -> ScriptResult<f64> {
        Ok(match &unit {
            Some(u) => q.value_in(u)?,
            None => {
                lo.try_sub(q)?;
                q.si()
            }
        })
    };
    let (a, b) = (shown(&lo)?, shown(&hi)?);
    let arg = |p: f64| -> Dynamic {
        match &unit {
            Some(u) => Dynamic::from(Quantity::new(p, u).unwrap_or_else(|_| Quantity::number(p))),
            None => Dynamic::from(Quantity::from_si(p, lo.dimension(), lo.kind())),
        }
    };
    let failed: RefCell<Option<Box<EvalAltResult>>> = RefCell::new(None);
    let result = solve_for_rated_output(
        a,
        b,
        target,
        |p| {
            build(ctx, f, &[arg(p)]).map_err(|e| {
                let label = label(&arg(p));
                let e = match fault_of(&e) {
                    Some((kind, msg)) => fault(&kind, format!("at {param} = {label}: {msg}")),
                    None => e,
                };
                failed.borrow_mut().get_or_insert(e);
                crate::PhysicsError::invalid(
                    param.as_str(),
                    label,
                    "a value the build function accepts",
                )
            })
        },
        &c,
    );
    let point = match result {
        Ok(p) => p,
        Err(e) => {
            return Err(match failed.into_inner() {
                Some(script) => script,
                None => fault(
                    "PhysicsError",
                    format!("{e} (searching `{param}` over {lo} to {hi})"),
                ),
            });
        }
    };
    let p = point.parameters.first().copied().unwrap_or(f64::NAN);
    let layout = build(ctx, f, &[arg(p)])?;
    let r = Record::new(format!("design for a rated output of {target}")).field(&param, arg(p));
    Ok(design_fields(r, &point).field("layout", Dynamic::from(layout)))
}

/// Registers `sweep`, `solve_for_output` and the sweep table's fields.
pub(crate) fn register(engine: &mut Engine) {
    super::super::bind::register_display::<Sweep>(engine, "Sweep");
    engine.register_get("len", |t: &mut Sweep| t.rows.len() as INT);
    engine.register_get("names", |t: &mut Sweep| -> Array {
        t.names.iter().map(|n| Dynamic::from(n.clone())).collect()
    });
    engine.register_get("rows", |t: &mut Sweep| -> Array {
        (0..t.rows.len())
            .map(|i| Dynamic::from(t.record(i)))
            .collect()
    });
    engine.register_get("skipped", |t: &mut Sweep| -> Array {
        t.skipped
            .iter()
            .map(|(v, why)| Dynamic::from(format!("{}: {why}", Sweep::values_text(&t.names, v))))
            .collect()
    });
    engine.register_get("rated_output", |t: &mut Sweep| {
        t.column(|p| p.rated_output.value(), "V/V", "mV/V")
    });
    engine.register_get("peak_stress", |t: &mut Sweep| {
        t.column(|p| p.peak_stress.get::<pascal>(), "Pa", "MPa")
    });
    engine.register_get("yield_factor", |t: &mut Sweep| {
        t.column(|p| p.yield_factor, "", "")
    });
    engine.register_get("frequency", |t: &mut Sweep| {
        t.column(|p| p.frequency.get::<hertz>(), "Hz", "Hz")
    });
    engine.register_get("caution", |_: &mut Sweep| MARGIN_CAUTION.to_string());

    func(
        "sweep",
        &["build: FnPtr", "options: Map"],
        "Sweep",
        r#"
        Evaluates the designs that `build` (a function of one or two parameter values that
        returns a layout) gives over `values`: rated output, peak stress at rated load, yield
        factor at the safe overload, fatigue factor at rated load, stiffness, first natural
        frequency, and whether the margins are met. One parameter: `parameter` (its name) and
        `values` (an array or a column); two: `parameters: [name, name]` and `values: [[…], […]]`
        (every pair). Criteria: `bridge` (default 0), `attached` (mass at the load point, for the
        frequency), `safe_overload` and `ultimate_overload` (default 1.5 and 3.0, common
        practice), `min_yield_factor` (default 1.0), `min_fatigue_factor`. A value the element
        refuses (outside its range of validity) is listed in `skipped`. The table prints and
        shows as HTML; `rows`, `rated_output`, `peak_stress`, `yield_factor` and `frequency`
        read it. Design estimates must be proven by test; overload and lifting uses follow local
        codes and licensed practice.
        ```rhai
        let beam = |h| layout(cantilever(#{ material: "2024-T351", length: 100.0 * mm,
            width: 20.0 * mm, depth: h, station: 30.0 * mm }), #{ r0: 350.0 * ohm, gf: 2.0 },
            "full-bending", 50.0 * N);
        let t = sweep(beam, #{ parameter: "depth", values: [4.0 * mm, 5.0 * mm, 25.0 * mm] });
        assert_eq(t.len, 2);
        // Full bridge on the beam: RO = GF·6F(L − x)/(E·b·h²) = 2·6·50·0.07/(73.1e9·0.02·0.005²).
        assert_close(t.rated_output[1], 1.149111 * mV_per_V, 1e-5);
        assert(t.rated_output[0] > t.rated_output[1]);
        assert(t.skipped[0].contains("L/h"));
        assert(t.to_string().contains("proven by test"));
        let wide = |b, h| layout(cantilever(#{ material: "2024-T351", length: 100.0 * mm,
            width: b, depth: h, station: 30.0 * mm }), #{ r0: 350.0 * ohm, gf: 2.0 },
            "full-bending", 50.0 * N);
        let g = sweep(wide, #{ parameters: ["width", "depth"],
            values: [[10.0 * mm, 20.0 * mm], [4.0 * mm, 5.0 * mm]] });
        assert_eq(g.rows.len(), 4);
        assert_close(g.rows[3].depth, 5.0 * mm, 1e-12);
        // Half the width, twice the output (RO ∝ 1/b).
        assert_close(g.rows[1].rated_output, 2.0 * g.rows[3].rated_output, 1e-9);
        ```
    "#,
    )
    .register_into_engine(
        engine,
        |ctx: NativeCallContext, f: FnPtr, opts: Map| -> ScriptResult<Sweep> {
            sweep(&ctx, &f, &opts)
        },
    );

    func(
        "solve_for_output",
        &["build: FnPtr", "options: Map"],
        "Record",
        r#"
        The parameter value in [`lo`, `hi`] at which `build` (a function of one value that
        returns a layout) gives the rated output `target`, found by bisection, with its margins
        checked against the criteria (the keys of `sweep`). Optional `parameter` names it. An
        error says so when the rated output does not reach the target on the interval (giving
        the range it spans) or when the design that reaches it fails the margins (giving them).
        The record has the value, the design's figures, its `layout` and the caution: design
        estimates must be proven by test; overload and lifting uses follow local codes and
        licensed practice.
        ```rhai
        let beam = |h| layout(cantilever(#{ material: "2024-T351", length: 100.0 * mm,
            width: 20.0 * mm, depth: h, station: 30.0 * mm }), #{ r0: 350.0 * ohm, gf: 2.0 },
            "full-bending", 50.0 * N);
        let d = solve_for_output(beam, #{ parameter: "depth", lo: 3.0 * mm, hi: 10.0 * mm,
            target: 1.0 * mV_per_V });
        // RO ∝ 1/h²: h = 5 mm · √(1.149111/1.0).
        assert_close(d.depth, 5.359828 * mm, 1e-5);
        assert_close(d.rated_output, 1.0 * mV_per_V, 1e-9);
        let msg = "";
        try { solve_for_output(beam, #{ lo: 3.0 * mm, hi: 10.0 * mm, target: 5.0 * mV_per_V }); }
        catch (e) { msg = e.message; }
        assert(msg.contains("spans"));
        ```
    "#,
    )
    .register_into_engine(
        engine,
        |ctx: NativeCallContext, f: FnPtr, opts: Map| -> ScriptResult<Record> {
            solve(&ctx, &f, &opts)
        },
    );
}
