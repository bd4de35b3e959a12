//! Calibration, class evaluation and uncertainty in scripts: runs from columns or from a log's
//! holds, fits, characteristic figures, OIML R 60 and ASTM E74 verdicts, GUM budgets and Monte
//! Carlo over columns.
//!
//! Loads are forces (N) or torques (N·m), told apart by the load column's dimension; the
//! indication keeps the unit of its column (mV/V, µε, V, or plain counts). A computed class
//! verdict is not a type approval or a legal-for-trade certificate; that follows local
//! regulation.

use std::cell::RefCell;
use std::fmt;
use std::sync::Arc;

use rhai::{Array, Dynamic, Engine, FnPtr, INT, Map, NativeCallContext};

use super::bind::{Options, Record, ScriptResult, fault, func, register_display};
use super::column::Column;
use crate::units::{Quantity, Unit};
use crate::{
    Budget, CalibrationRun, Characterisation, CharacteriseOptions, ClassVerdict, Direction,
    Distribution, Fit, FitModel, HoldCriteria, Input, IntervalKind, LoadKind, MimeBundle,
    MonteCarlo, OimlClass, R60Extras, R60LoadCell, ToMime, evaluate_e74, evaluate_r60, find_holds,
};
use crate::{
    CreepHold, GumResult, Iso376Data, McResult, classify_iso376, coverage_factor, tc_span, tc_zero,
};

/// A calibration run as scripts hold it.
#[derive(Clone, Debug)]
pub(crate) struct Run(CalibrationRun);

impl fmt::Display for Run {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        self.0.fmt(f)
    }
}

impl ToMime for Run {
    fn to_mime(&self) -> MimeBundle {
        self.0.to_mime()
    }
}

/// A fitted curve with the run's units.
#[derive(Clone, Debug)]
pub(crate) struct Curve {
    fit: Fit,
    load: LoadKind,
    indication: String,
    /// The run the curve was fitted to, for its figure.
    #[cfg_attr(not(feature = "plot"), allow(dead_code))]
    run: CalibrationRun,
}

impl fmt::Display for Curve {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        self.fit.fmt(f)
    }
}

impl ToMime for Curve {
    fn to_mime(&self) -> MimeBundle {
        self.fit.to_mime()
    }
}

fn load_kind(c: &Column) -> ScriptResult<LoadKind> {
    let force = Unit::parse("N")?;
    let torque = Unit::parse("N*m")?;
    if c.dimension() == force.dimension() {
        Ok(LoadKind::Force)
    } else if c.dimension() == torque.dimension() {
        Ok(LoadKind::Torque)
    } else {
        Err(fault(
            "UnitError",
            format!(
                "loads must be forces (N) or torques (N·m), found {}",
                c.describe()
            ),
        ))
    }
}

fn unit_label(c: &Column) -> String {
    c.unit().map(|u| u.symbol().to_string()).unwrap_or_default()
}

fn indications(c: &Column, label: &str) -> ScriptResult<Vec<f64>> {
    if label.is_empty() {
        return Ok(c.data().to_vec());
    }
    Ok(c.values_in(label)?)
}

fn direction(text: &str) -> ScriptResult<Direction> {
    match text {
        "ascending" | "up" => Ok(Direction::Ascending),
        "descending" | "down" => Ok(Direction::Descending),
        other => Err(fault(
            "ArgumentError",
            format!("direction must be \"ascending\" or \"descending\", found \"{other}\""),
        )),
    }
}

fn quantity(v: f64, label: &str) -> ScriptResult<Quantity> {
    if label.is_empty() {
        Ok(Quantity::number(v))
    } else {
        Ok(Quantity::new(v, label)?)
    }
}

fn load_q(si: f64, kind: LoadKind) -> ScriptResult<Quantity> {
    Ok(Quantity::new(
        si,
        match kind {
            LoadKind::Force => "N",
            LoadKind::Torque => "N*m",
        },
    )?)
}

fn load_si(q: &Quantity, kind: LoadKind, what: &str) -> ScriptResult<f64> {
    let unit = match kind {
        LoadKind::Force => "N",
        LoadKind::Torque => "N*m",
    };
    q.value_in(unit).map_err(|_| {
        fault(
            "UnitError",
            format!("{what} must be convertible to {unit}, found {q}"),
        )
    })
}

fn new_run(load: &Column, ind: &Column, dir: &str, rotation: f64) -> ScriptResult<Run> {
    let kind = load_kind(load)?;
    let label = unit_label(ind);
    let mut run = CalibrationRun::new(kind, &label);
    run.push_series(
        load.data(),
        &indications(ind, &label)?,
        direction(dir)?,
        rotation,
    )?;
    Ok(Run(run))
}

fn add_series(
    run: &mut Run,
    load: &Column,
    ind: &Column,
    dir: &str,
    rotation: f64,
) -> ScriptResult<()> {
    let kind = load_kind(load)?;
    if kind != run.0.load_kind() {
        return Err(fault(
            "UnitError",
            format!(
                "loads of this series are {}, the run's are {}",
                kind.si_unit(),
                run.0.load_kind().si_unit()
            ),
        ));
    }
    let label = run.0.indication_unit().to_string();
    let values = indications(ind, &label).map_err(|_| {
        fault(
            "UnitError",
            format!(
                "indications must be convertible to {label}, found {}",
                ind.describe()
            ),
        )
    })?;
    run.0
        .push_series(load.data(), &values, direction(dir)?, rotation)?;
    Ok(())
}

fn from_log(load: &Column, ind: &Column, opts: &Map) -> ScriptResult<Run> {
    let o = Options::new(
        opts,
        "calibration_from_log()",
        &["tolerance", "min_samples", "settle", "rotation"],
    )?;
    let kind = load_kind(load)?;
    let tol = load_si(
        &o.quantity(
            "tolerance",
            match kind {
                LoadKind::Force => "N",
                LoadKind::Torque => "N*m",
            },
        )?,
        kind,
        "tolerance",
    )?;
    let min_samples = o.opt_f64("min_samples")?.unwrap_or(10.0) as usize;
    let settle = o.opt_f64("settle")?.unwrap_or(0.0) as usize;
    if load.len() != ind.len() {
        return Err(fault(
            "ArgumentError",
            format!(
                "load and indication columns differ in length: {} and {}",
                load.len(),
                ind.len()
            ),
        ));
    }
    let holds = find_holds(
        load.data(),
        &HoldCriteria {
            tolerance: tol,
            min_samples,
            settle_samples: 0,
        },
    )?;
    let label = unit_label(ind);
    let run = CalibrationRun::from_holds(
        kind,
        &label,
        load.data(),
        &indications(ind, &label)?,
        &holds,
        settle,
        tol,
        o.opt_f64("rotation")?.unwrap_or(0.0),
    )?;
    Ok(Run(run))
}

fn fit_model(degree: &Dynamic) -> ScriptResult<FitModel> {
    if let Ok(d) = degree.as_int() {
        return match d {
            1 => Ok(FitModel::Linear),
            2..=5 => Ok(FitModel::Polynomial(d as usize)),
            _ => Err(fault(
                "ArgumentError",
                format!("degree must be 1 to 5 or \"zero\", found {d}"),
            )),
        };
    }
    match degree.clone().into_string().as_deref() {
        Ok("zero") => Ok(FitModel::ThroughZero),
        Ok("linear") => Ok(FitModel::Linear),
        _ => Err(fault(
            "ArgumentError",
            format!(
                "degree must be 1 to 5 or \"zero\", found {}",
                super::bind::type_of(degree)
            ),
        )),
    }
}

fn curve(run: &mut Run, degree: Dynamic) -> ScriptResult<Curve> {
    let (x, y) = run.0.xy(None);
    Ok(Curve {
        fit: Fit::new(&x, &y, fit_model(&degree)?)?,
        load: run.0.load_kind(),
        indication: run.0.indication_unit().to_string(),
        run: run.0.clone(),
    })
}

fn oiml_class(text: &str) -> ScriptResult<OimlClass> {
    match text {
        "A" => Ok(OimlClass::A),
        "B" => Ok(OimlClass::B),
        "C" => Ok(OimlClass::C),
        "D" => Ok(OimlClass::D),
        other => Err(fault(
            "ArgumentError",
            format!("class must be \"A\", \"B\", \"C\" or \"D\", found \"{other}\""),
        )),
    }
}

fn r60(run: &mut Run, opts: &Map) -> ScriptResult<ClassVerdict> {
    let o = Options::new(
        opts,
        "r60()",
        &[
            "class",
            "n_max",
            "e_max",
            "e_min",
            "v_min",
            "p_lc",
            "dead_load_return",
            "z",
            "creep_time",
            "creep_indication",
            "min_load_change",
            "temperature_change",
        ],
    )?;
    let cell = R60LoadCell::new(
        oiml_class(&o.string("class")?)?,
        o.f64("n_max")? as u32,
        o.quantity("e_max", "N")?.si(),
        o.opt_quantity("e_min", "N")?.map_or(0.0, |q| q.si()),
        o.quantity("v_min", "N")?.si(),
    )?;
    let cell = match o.opt_f64("p_lc")? {
        Some(p) => cell.with_p_lc(p)?,
        None => cell,
    };
    let mut cell = cell;
    if let Some(z) = o.opt_f64("z")? {
        crate::check_positive("declared Z", z, "")?;
        cell.z = Some(z);
    }
    let creep = match (o.raw("creep_time"), o.raw("creep_indication")) {
        (None, None) => None,
        (Some(t), Some(y)) => {
            let (t, y) = (
                column_arg(t, "creep_time")?,
                column_arg(y, "creep_indication")?,
            );
            let label = run.0.indication_unit().to_string();
            Some(CreepHold::new(
                &t.values_in("s")?,
                &indications(&y, &label).map_err(|_| {
                    fault(
                        "UnitError",
                        format!(
                            "creep_indication must be convertible to {label}, found {}",
                            y.describe()
                        ),
                    )
                })?,
            )?)
        }
        _ => {
            return Err(fault(
                "ArgumentError",
                "r60() needs both `creep_time` and `creep_indication`, or neither".to_string(),
            ));
        }
    };
    let temperature = match (o.has("min_load_change"), o.has("temperature_change")) {
        (false, false) => None,
        (true, true) => Some((
            o.quantity("min_load_change", "N")?.si(),
            o.quantity("temperature_change", "K")?.si(),
        )),
        _ => {
            return Err(fault(
                "ArgumentError",
                "r60() needs both `min_load_change` and `temperature_change`, or neither"
                    .to_string(),
            ));
        }
    };
    let extras = R60Extras {
        creep,
        dead_load_return: o.opt_quantity("dead_load_return", "N")?.map(|q| q.si()),
        min_load_temperature_effect: temperature,
    };
    Ok(evaluate_r60(&cell, &run.0, &extras)?)
}

fn e74(run: &mut Run, opts: &Map) -> ScriptResult<Record> {
    let o = Options::new(opts, "e74()", &["degree", "resolution", "other"])?;
    let mut other = vec![];
    if let Some(v) = o.raw("other") {
        let list = v.read_lock::<Array>().map(|a| a.clone()).ok_or_else(|| {
            fault(
                "ArgumentError",
                "key `other` in options of e74() must be an array of forces".to_string(),
            )
        })?;
        for (i, item) in list.iter().enumerate() {
            match super::bind::values(item, &format!("other[{i}] in options of e74()"), "N")? {
                super::bind::Values::One(si) => other.push(si),
                super::bind::Values::Many(_) => {
                    return Err(fault(
                        "ArgumentError",
                        format!("other[{i}] in options of e74() must be a single force"),
                    ));
                }
            }
        }
    }
    let r = evaluate_e74(
        &run.0,
        o.opt_f64("degree")?.unwrap_or(2.0) as usize,
        o.quantity("resolution", "N")?.si(),
        &other,
    )?;
    let n = |v: f64| Quantity::new(v, "N").map_err(Box::<rhai::EvalAltResult>::from);
    Ok(Record::new("ASTM E74-18 evaluation")
        .field("s", Dynamic::from(n(r.s)?))
        .field("llf", Dynamic::from(n(r.llf)?))
        .field("class_aa_lower", Dynamic::from(n(r.class_aa_lower)?))
        .field("class_a_lower", Dynamic::from(n(r.class_a_lower)?))
        .field("upper", Dynamic::from(n(r.upper)?))
        .field("class_aa", Dynamic::from(r.verdict(true)))
        .field("class_a", Dynamic::from(r.verdict(false))))
}

/// One script input: the physics input plus the unit its columns carry.
struct ScriptInput {
    input: Input,
    dim: crate::Dimension,
    kind: crate::Kind,
    unit: Option<Arc<Unit>>,
}

fn read_inputs(inputs: &Array) -> ScriptResult<Vec<ScriptInput>> {
    let mut out = vec![];
    for (i, d) in inputs.iter().enumerate() {
        let Some(map) = d.read_lock::<Map>() else {
            return Err(fault(
                "ArgumentError",
                format!(
                    "input {i} must be an object map like #{{ name: \"x\", value: 1.0 * mm, u: 0.01 * mm }}"
                ),
            ));
        };
        let o = Options::new(
            &map,
            "an uncertainty input",
            &["name", "value", "u", "dof", "dist", "half_width", "samples"],
        )?;
        let name = o.opt_string("name")?.unwrap_or_else(|| format!("x{i}"));
        if let Some(s) = o.raw("samples") {
            let Some(c) = s.read_lock::<Column>() else {
                return Err(fault(
                    "ArgumentError",
                    format!("`samples` of input {name} must be a column"),
                ));
            };
            out.push(ScriptInput {
                input: Input::type_a(&name, c.data())?,
                dim: c.dimension(),
                kind: c.kind(),
                unit: c.unit().map(|u| Arc::new(u.clone())),
            });
            continue;
        }
        let value = o.raw("value").ok_or_else(|| {
            fault(
                "ArgumentError",
                format!("missing key `value` in input {name}"),
            )
        })?;
        let q: Quantity = match value.read_lock::<Quantity>() {
            Some(q) => q.clone(),
            None => Quantity::number(super::bind::number(value).ok_or_else(|| {
                fault(
                    "ArgumentError",
                    format!("`value` of input {name} must be a quantity or a number"),
                )
            })?),
        };
        let same = |key: &str| -> ScriptResult<Option<f64>> {
            match o.raw(key) {
                None => Ok(None),
                Some(v) => match v.read_lock::<Quantity>() {
                    Some(u) if u.dimension() == q.dimension() => Ok(Some(u.si())),
                    Some(u) => Err(fault(
                        "UnitError",
                        format!(
                            "`{key}` of input {name} must have the unit of its value {q}, found {}",
                            *u
                        ),
                    )),
                    None => super::bind::number(v)
                        .filter(|_| q.dimension().is_dimensionless())
                        .map(Some)
                        .ok_or_else(|| {
                            fault(
                                "UnitError",
                                format!(
                                    "`{key}` of input {name} must have the unit of its value {q}"
                                ),
                            )
                        }),
                },
            }
        };
        let dist = o.opt_string("dist")?.unwrap_or_else(|| "normal".into());
        let mean = q.si();
        let distribution = match dist.as_str() {
            "normal" => Distribution::Normal {
                mean,
                sd: same("u")?.ok_or_else(|| {
                    fault("ArgumentError", format!("missing key `u` in input {name}"))
                })?,
            },
            "rectangular" | "triangular" | "arcsine" | "u-shaped" => {
                let a = same("half_width")?.ok_or_else(|| {
                    fault(
                        "ArgumentError",
                        format!("missing key `half_width` in input {name}"),
                    )
                })?;
                match dist.as_str() {
                    "rectangular" => Distribution::Rectangular {
                        mean,
                        half_width: a,
                    },
                    "triangular" => Distribution::Triangular {
                        mean,
                        half_width: a,
                    },
                    _ => Distribution::Arcsine {
                        mean,
                        half_width: a,
                    },
                }
            }
            other => {
                return Err(fault(
                    "ArgumentError",
                    format!(
                        "`dist` of input {name} must be normal, rectangular, triangular or arcsine, found \"{other}\""
                    ),
                ));
            }
        };
        let mut input = Input::type_b(&name, distribution)?;
        if let Some(dof) = o.opt_f64("dof")? {
            input = input.with_dof(dof)?;
        }
        out.push(ScriptInput {
            input,
            dim: q.dimension(),
            kind: q.kind(),
            unit: q.unit().map(|u| Arc::new(u.clone())),
        });
    }
    if out.is_empty() {
        return Err(fault(
            "ArgumentError",
            "an uncertainty budget needs at least one input".to_string(),
        ));
    }
    Ok(out)
}

fn budget(inputs: &[ScriptInput], opts: Option<&Options>) -> ScriptResult<Budget> {
    let mut b = Budget::new(inputs.iter().map(|i| i.input.clone()).collect());
    if let Some(c) = opts.and_then(|o| o.raw("correlations")) {
        let Some(list) = c.read_lock::<Array>() else {
            return Err(fault(
                "ArgumentError",
                "`correlations` must be an array of [i, j, r]".to_string(),
            ));
        };
        for item in list.iter() {
            let t = item
                .read_lock::<Array>()
                .map(|a| a.clone())
                .unwrap_or_default();
            let num = |k: usize| t.get(k).and_then(super::bind::number);
            match (num(0), num(1), num(2)) {
                (Some(i), Some(j), Some(r)) => b.correlate(i as usize, j as usize, r)?,
                _ => {
                    return Err(fault(
                        "ArgumentError",
                        "each correlation must be [i, j, r]".to_string(),
                    ));
                }
            }
        }
    }
    Ok(b)
}

/// The output of a column model: SI values and their dimension, kind and unit.
struct ModelOut {
    dim: crate::Dimension,
    kind: crate::Kind,
    unit: Option<String>,
}

fn call_model(
    ctx: &NativeCallContext,
    model: &FnPtr,
    inputs: &[ScriptInput],
    cols: &[Vec<f64>],
    out: &RefCell<Option<ModelOut>>,
) -> ScriptResult<Vec<f64>> {
    let arr: Array = cols
        .iter()
        .zip(inputs)
        .map(|(c, i)| {
            Dynamic::from(Column::from_si(
                Arc::new(c.clone()),
                i.dim,
                i.kind,
                i.unit.clone(),
            ))
        })
        .collect();
    let r: Dynamic = model.call_within_context(ctx, (arr,))?;
    if let Some(c) = r.read_lock::<Column>() {
        *out.borrow_mut() = Some(ModelOut {
            dim: c.dimension(),
            kind: c.kind(),
            unit: c.unit().map(|u| u.symbol().to_string()),
        });
        return Ok(c.data().to_vec());
    }
    Err(fault(
        "ArgumentError",
        format!(
            "the model must return a column (it receives one column per input), found {}",
            super::bind::type_of(&r)
        ),
    ))
}

fn out_q(si: f64, m: &Option<ModelOut>) -> Quantity {
    match m {
        Some(m) => {
            let q = Quantity::from_si(si, m.dim, m.kind);
            m.unit.as_deref().and_then(|u| q.to(u).ok()).unwrap_or(q)
        }
        None => Quantity::number(si),
    }
}

fn gum(ctx: &NativeCallContext, inputs: &Array, model: &FnPtr, opts: &Map) -> ScriptResult<Record> {
    let o = Options::new(opts, "gum()", &["p", "correlations"])?;
    let ins = read_inputs(inputs)?;
    let b = budget(&ins, Some(&o))?;
    let shape = RefCell::new(None);
    let err = RefCell::new(None);
    let r = b.evaluate_columns(|cols| match call_model(ctx, model, &ins, cols, &shape) {
        Ok(v) => v,
        Err(e) => {
            *err.borrow_mut() = Some(e);
            vec![]
        }
    });
    if let Some(e) = err.into_inner() {
        return Err(e);
    }
    let r = r?;
    let shape = shape.into_inner();
    let e = r.expanded(o.opt_f64("p")?.unwrap_or(0.95))?;
    Ok(Record::new("GUM uncertainty (JCGM 100:2008)")
        .field("value", Dynamic::from(out_q(r.value, &shape)))
        .field("u", Dynamic::from(out_q(r.combined, &shape)))
        .field("dof_eff", r.dof_eff)
        .field("k", e.k)
        .field("expanded", Dynamic::from(out_q(e.expanded, &shape)))
        .field("budget", Dynamic::from(r)))
}

fn monte_carlo(
    ctx: &NativeCallContext,
    inputs: &Array,
    model: &FnPtr,
    opts: &Map,
) -> ScriptResult<Record> {
    let o = Options::new(
        opts,
        "monte_carlo()",
        &["trials", "seed", "p", "correlations", "ndig"],
    )?;
    let ins = read_inputs(inputs)?;
    let b = budget(&ins, Some(&o))?;
    let p = o.opt_f64("p")?.unwrap_or(0.95);
    let mc = MonteCarlo::new(
        o.opt_f64("trials")?.unwrap_or(1e6) as usize,
        o.opt_f64("seed")?.unwrap_or(1.0) as u64,
    );
    let shape = RefCell::new(None);
    let err = RefCell::new(None);
    let run_model = |cols: &[Vec<f64>]| match call_model(ctx, model, &ins, cols, &shape) {
        Ok(v) => v,
        Err(e) => {
            *err.borrow_mut() = Some(e);
            vec![]
        }
    };
    let res = mc.run(&b, run_model);
    let gum = b.evaluate_columns(run_model);
    if let Some(e) = err.into_inner() {
        return Err(e);
    }
    let (res, gum) = (res?, gum?);
    let shape = shape.into_inner();
    let (lo, hi) = res.coverage_interval(p, IntervalKind::Symmetric)?;
    let (slo, shi) = res.coverage_interval(p, IntervalKind::Shortest)?;
    let v = res.validate(
        &gum,
        p,
        o.opt_f64("ndig")?.unwrap_or(2.0) as u32,
        IntervalKind::Symmetric,
    )?;
    let g = gum.expanded(p)?;
    let draws = Draws::new(res.clone(), gum.clone(), p, &shape);
    Ok(Record::new("Monte Carlo (JCGM 101:2008)")
        .field("value", Dynamic::from(out_q(res.value, &shape)))
        .field("u", Dynamic::from(out_q(res.standard_uncertainty, &shape)))
        .field("low", Dynamic::from(out_q(lo, &shape)))
        .field("high", Dynamic::from(out_q(hi, &shape)))
        .field("shortest_low", Dynamic::from(out_q(slo, &shape)))
        .field("shortest_high", Dynamic::from(out_q(shi, &shape)))
        .field("gum_low", Dynamic::from(out_q(g.low, &shape)))
        .field("gum_high", Dynamic::from(out_q(g.high, &shape)))
        .field("delta", Dynamic::from(out_q(v.delta, &shape)))
        .field("validated", v.validated)
        .hidden("draws", Dynamic::from(draws)))
}

/// The sorted Monte Carlo outputs and the GUM result behind a `monte_carlo` record, kept (not
/// printed) so `plot_monte_carlo` can draw the histogram; shared, so copies of the record are
/// cheap.
#[derive(Clone)]
#[cfg_attr(not(feature = "plot"), allow(dead_code))]
pub(crate) struct Draws {
    mc: Arc<McResult>,
    gum: Arc<GumResult>,
    p: f64,
    /// Display unit label and the factor from SI to it.
    unit: String,
    scale: f64,
}

impl Draws {
    fn new(mc: McResult, gum: GumResult, p: f64, shape: &Option<ModelOut>) -> Draws {
        let one = out_q(1.0, shape);
        let (unit, scale) = match one.unit() {
            Some(u) => (
                u.symbol().to_string(),
                one.value_in(u.symbol()).unwrap_or(1.0),
            ),
            // No display unit: SI, labelled as the quantity prints ("1 1/N" gives "1/N").
            None => {
                let text = one.to_string();
                let label = text.split_once(' ').map(|(_, u)| u.to_string());
                (label.unwrap_or_default(), 1.0)
            }
        };
        Draws {
            mc: Arc::new(mc),
            gum: Arc::new(gum),
            p,
            unit,
            scale,
        }
    }
}

/// A column argument given as a `Dynamic` (an options value).
fn column_arg(v: &Dynamic, what: &str) -> ScriptResult<Column> {
    v.read_lock::<Column>().map(|c| c.clone()).ok_or_else(|| {
        fault(
            "ArgumentError",
            format!("{what} must be a column, found {}", super::bind::type_of(v)),
        )
    })
}

/// An indication given as a quantity convertible to the run's unit (or a plain number for a
/// run without a unit), as a number in that unit.
fn indication_value(v: &Dynamic, label: &str, what: &str) -> ScriptResult<f64> {
    if let Some(q) = v.read_lock::<Quantity>() {
        if label.is_empty() {
            if q.dimension().is_dimensionless() {
                return Ok(q.si());
            }
        } else if let Ok(x) = q.value_in(label) {
            return Ok(x);
        }
        return Err(fault(
            "UnitError",
            format!(
                "{what} must be convertible to {}, found {}",
                if label.is_empty() {
                    "a plain number"
                } else {
                    label
                },
                *q
            ),
        ));
    }
    if let (true, Some(x)) = (label.is_empty(), super::bind::number(v)) {
        return Ok(x);
    }
    Err(fault(
        "ArgumentError",
        format!(
            "{what} must be a quantity in {label}, found {}",
            super::bind::type_of(v)
        ),
    ))
}

/// A pair `[a, b]` of indications in the run's unit.
fn indication_pair(v: &Dynamic, label: &str, what: &str) -> ScriptResult<(f64, f64)> {
    let a = v
        .read_lock::<Array>()
        .map(|a| a.clone())
        .unwrap_or_default();
    if a.len() != 2 {
        return Err(fault(
            "ArgumentError",
            format!("{what} must be an array of two indications [before, after]"),
        ));
    }
    Ok((
        indication_value(&a[0], label, what)?,
        indication_value(&a[1], label, what)?,
    ))
}

fn iso376(run: &mut Run, opts: &Map) -> ScriptResult<Record> {
    let o = Options::new(opts, "iso376()", &["resolution", "degree", "zero", "creep"])?;
    let label = run.0.indication_unit().to_string();
    let mut d = Iso376Data::from_run(&run.0)?;
    if let Some(r) = o.raw("resolution") {
        let r = indication_value(r, &label, "resolution")?;
        crate::check_positive("resolution", r, &label)?;
        d.resolution = Some(r);
    }
    if let Some(k) = o.opt_f64("degree")? {
        d.degree = k as usize;
    }
    if let Some(z) = o.raw("zero") {
        d.zero_before_after = Some(indication_pair(z, &label, "zero")?);
    }
    if let Some(c) = o.raw("creep") {
        d.creep_30_300 = Some(indication_pair(c, &label, "creep")?);
    }
    let r = classify_iso376(&d)?;
    let opt = |v: Option<f64>| v.map(Dynamic::from).unwrap_or(Dynamic::UNIT);
    let steps: Array = r
        .steps
        .iter()
        .map(|s| -> ScriptResult<Dynamic> {
            let mut m = Map::new();
            m.insert(
                "force".into(),
                Dynamic::from(load_q(s.force, run.0.load_kind())?),
            );
            m.insert("reproducibility".into(), Dynamic::from(s.reproducibility));
            m.insert("repeatability".into(), Dynamic::from(s.repeatability));
            m.insert("interpolation".into(), Dynamic::from(s.interpolation));
            m.insert("reversibility".into(), opt(s.reversibility));
            m.insert(
                "class".into(),
                s.class
                    .map(|c| Dynamic::from(c.name().to_string()))
                    .unwrap_or(Dynamic::UNIT),
            );
            Ok(Dynamic::from(m))
        })
        .collect::<ScriptResult<Array>>()?;
    Ok(Record::new("ISO 376:2011 classification")
        .field(
            "class",
            r.class
                .map(|c| Dynamic::from(c.name().to_string()))
                .unwrap_or(Dynamic::UNIT),
        )
        .field("passed", r.verdict.passed)
        .field("zero", opt(r.zero))
        .field("creep", opt(r.creep))
        .field("steps", steps)
        .field("verdict", Dynamic::from(r.verdict)))
}

/// SI values of two quantities of the same dimension (indications in any unit).
fn same_dimension(a: &Quantity, b: &Quantity, what: &str) -> ScriptResult<(f64, f64)> {
    if a.dimension() != b.dimension() {
        return Err(fault(
            "UnitError",
            format!("{what} must have the same unit dimension, found {a} and {b}"),
        ));
    }
    Ok((a.si(), b.si()))
}

fn temperature(q: &Quantity, what: &str) -> ScriptResult<crate::units::ThermodynamicTemperature> {
    crate::units::ThermodynamicTemperature::try_from(q).map_err(|e| {
        fault(
            "UnitError",
            format!("{what} must be a temperature reading such as q(\"23 degC\"): {e}"),
        )
    })
}

fn creep_of(time: &Column, ind: &Column, opts: &Map) -> ScriptResult<Record> {
    let o = Options::new(opts, "creep()", &["from", "to", "rated_output", "capacity"])?;
    let label = unit_label(ind);
    let hold = CreepHold::new(&time.values_in("s")?, &indications(ind, &label)?)?;
    let from = o.quantity("from", "s")?.si();
    let to = o.quantity("to", "s")?.si();
    let change = hold.change(from, to)?;
    let mut r = Record::new(format!("creep from {from} s to {to} s"))
        .field("change", Dynamic::from(quantity(change, &label)?));
    if let Some(ro) = o.raw("rated_output") {
        let ro = indication_value(ro, &label, "rated_output")?;
        crate::check_positive("rated output", ro.abs(), &label)?;
        r = r.field("percent_ro", change / ro * 100.0);
        if let Some(cap) = o.raw("capacity") {
            let Some(cap) = cap.read_lock::<Quantity>().map(|q| q.clone()) else {
                return Err(fault(
                    "ArgumentError",
                    "key `capacity` in options of creep() must be a force or torque".to_string(),
                ));
            };
            let kind = if cap.value_in("N").is_ok() {
                LoadKind::Force
            } else {
                LoadKind::Torque
            };
            let c = load_si(&cap, kind, "capacity")?;
            r = r.field("load", Dynamic::from(load_q(change / ro * c, kind)?));
        }
    }
    Ok(r)
}

/// Registers the calibration, standards and uncertainty functions.
pub(crate) fn register(engine: &mut Engine) {
    register_display::<Run>(engine, "CalibrationRun");
    register_display::<Curve>(engine, "Fit");
    register_display::<Characterisation>(engine, "Characterisation");
    register_display::<ClassVerdict>(engine, "ClassVerdict");
    register_display::<crate::GumResult>(engine, "GumBudget");

    func("calibration_run", &["load: Column", "indication: Column", "direction: String"], "CalibrationRun", r#"
        A calibration run with one series: applied loads (forces or torques) against indications
        (any unit: mV/V, µε, V, counts). `direction` is "ascending" or "descending".
        ```rhai
        let run = calibration_run(column([0.0, 5.0, 10.0], "kN"), column([0.0, 1.0, 2.0], "mV/V"), "ascending");
        assert_eq(run.points, 3);
        ```
    "#).register_into_engine(engine, |l: Column, i: Column, d: &str| new_run(&l, &i, d, 0.0));

    func("add_series", &["run: CalibrationRun", "load: Column", "indication: Column", "direction: String", "rotation_deg: f64"], "()", r#"
        Adds a series taken at a mounting rotation (degrees). Loads must be strictly monotonic in
        the stated direction; the indication must be convertible to the run's unit.
        ```rhai
        let run = calibration_run(column([0.0, 10.0], "kN"), column([0.0, 2.0], "mV/V"), "ascending");
        run.add_series(column([10.0, 0.0], "kN"), column([2.001, 0.0], "mV/V"), "descending", 0.0);
        assert_eq(run.series, 2);
        ```
    "#).register_into_engine(engine, |r: &mut Run, l: Column, i: Column, d: &str, rot: f64| add_series(r, &l, &i, d, rot));

    func("calibration_from_log", &["load: Column", "indication: Column", "options: Map"], "CalibrationRun", r#"
        A run from a test log: holds of the load column (steady within `tolerance` for at least
        `min_samples`) become points, `settle` samples dropped at each end, split into ascending
        and descending series where the load turns.
        ```rhai
        let l = []; let y = [];
        for v in [0.0, 5.0, 10.0, 5.0, 0.0] { for k in 0..20 { l.push(v); y.push(0.2 * v); } }
        let run = calibration_from_log(column(l, "kN"), column(y, "mV/V"), #{ tolerance: 0.01 * kN, min_samples: 10 });
        assert_eq(run.series, 2);
        ```
    "#).register_into_engine(engine, |l: Column, i: Column, o: Map| from_log(&l, &i, &o));

    engine.register_get("points", |r: &mut Run| r.0.points().len() as INT);
    engine.register_get("series", |r: &mut Run| r.0.series().len() as INT);
    engine.register_get("descending_series", |r: &mut Run| {
        r.0.series_in(Direction::Descending).len() as INT
    });

    func("fit", &["run: CalibrationRun", "degree: Dynamic"], "Fit", r#"
        Least-squares curve of indication against load over every point: degree 1 to 5, or
        "zero" for a line through zero (centred, scaled Householder QR; checked against NIST StRD).
        ```rhai
        let run = calibration_run(column([0.0, 5.0, 10.0, 15.0], "kN"), column([0.0, 1.0, 2.0, 3.0], "mV/V"), "ascending");
        let f = run.fit(1);
        assert_close(f.indication_at(q("7.5 kN")), q("1.5 mV/V"), 1e-9);
        assert_close(f.inverse(q("1.5 mV/V")), q("7.5 kN"), 1e-9);
        ```
    "#).register_into_engine(engine, |r: &mut Run, d: Dynamic| curve(r, d));

    func("indication_at", &["fit: Fit", "load: Quantity"], "Quantity", r#"
        The fitted indication at a load.
        ```rhai
        let f = calibration_run(column([0.0, 1.0, 2.0], "kN"), column([0.0, 1.0, 2.0], "mV/V"), "ascending").fit("zero");
        assert_close(f.indication_at(q("1.5 kN")), q("1.5 mV/V"), 1e-9);
        ```
    "#).register_into_engine(engine, |c: &mut Curve, l: Quantity| -> ScriptResult<Quantity> {
        quantity(c.fit.eval(load_si(&l, c.load, "load")?), &c.indication)
    });

    func("inverse", &["fit: Fit", "indication: Quantity"], "Quantity", r#"
        The load whose fitted indication is the given one (Newton with a bracketing guard).
        ```rhai
        let f = calibration_run(column([0.0, 1.0, 2.0], "kN"), column([0.0, 1.0, 2.0], "mV/V"), "ascending").fit("zero");
        assert_close(f.inverse(q("0.5 mV/V")), q("0.5 kN"), 1e-9);
        ```
    "#).register_into_engine(engine, |c: &mut Curve, y: Quantity| -> ScriptResult<Quantity> {
        let v = if c.indication.is_empty() { y.si() } else { y.value_in(&c.indication)? };
        load_q(c.fit.inverse(v)?, c.load)
    });

    engine.register_get("residual_sd", |c: &mut Curve| c.fit.residual_sd());
    engine.register_get("r_squared", |c: &mut Curve| c.fit.r_squared());
    engine.register_get("std_errors", |c: &mut Curve| -> Array {
        c.fit
            .std_errors()
            .iter()
            .map(|&v| Dynamic::from(v))
            .collect()
    });
    engine.register_get("dof", |c: &mut Curve| c.fit.dof() as INT);
    engine.register_get("coefficients", |c: &mut Curve| -> Array {
        c.fit
            .coefficients()
            .iter()
            .map(|&v| Dynamic::from(v))
            .collect()
    });

    func("characterise", &["run: CalibrationRun", "capacity: Quantity"], "Characterisation", r#"
        The characteristic figures of a run in % of rated output: nonlinearity against the
        terminal, least-squares and minimax lines, hysteresis, non-repeatability, combined error,
        zero balance and zero return. `in_load(name)` gives a figure in load units.
        ```rhai
        let run = calibration_run(column([0.0, 5.0, 10.0], "kN"), column([0.0, 1.001, 2.0], "mV/V"), "ascending");
        let c = run.characterise(q("10 kN"));
        assert_close(c.rated_output, q("2 mV/V"), 1e-12);
        assert_close(c.nonlinearity, 0.05, 1e-9);
        assert_close(c.in_load("nonlinearity"), q("5 N"), 1e-9);
        ```
    "#).register_into_engine(engine, |r: &mut Run, cap: Quantity| -> ScriptResult<Characterisation> {
        let kind = r.0.load_kind();
        Ok(Characterisation::from_run(&r.0, CharacteriseOptions::new(load_si(&cap, kind, "capacity")?))?)
    });

    fn figure<'a>(c: &'a Characterisation, name: &str) -> ScriptResult<&'a crate::Figure> {
        Ok(match name {
            "zero_balance" => &c.zero_balance,
            "nonlinearity" | "nonlinearity_terminal" => &c.nonlinearity_terminal,
            "nonlinearity_least_squares" => &c.nonlinearity_least_squares,
            "nonlinearity_minimax" => &c.nonlinearity_minimax,
            "hysteresis" => &c.hysteresis,
            "non_repeatability" => &c.non_repeatability,
            "combined_error" => &c.combined_error,
            "zero_return" => c.zero_return.as_ref().ok_or_else(|| {
                fault(
                    "ArgumentError",
                    "the run has no zero return (it must start and end at zero load)".to_string(),
                )
            })?,
            other => {
                return Err(fault(
                    "ArgumentError",
                    format!(
                        "no figure `{other}`; figures are zero_balance, nonlinearity, nonlinearity_least_squares, nonlinearity_minimax, hysteresis, non_repeatability, combined_error, zero_return"
                    ),
                ));
            }
        })
    }
    for name in [
        "zero_balance",
        "nonlinearity",
        "nonlinearity_least_squares",
        "nonlinearity_minimax",
        "hysteresis",
        "non_repeatability",
        "combined_error",
        "zero_return",
    ] {
        engine.register_get(name, move |c: &mut Characterisation| -> ScriptResult<f64> {
            Ok(figure(c, name)?.percent_ro)
        });
    }
    engine.register_get("rated_output", |c: &mut Characterisation| {
        quantity(c.rated_output, &c.indication_unit)
    });
    engine.register_get("capacity", |c: &mut Characterisation| {
        Ok::<Quantity, Box<rhai::EvalAltResult>>(Quantity::new(
            c.capacity,
            if c.load_unit == "N" { "N" } else { "N*m" },
        )?)
    });

    func("in_load", &["c: Characterisation", "figure: String"], "Quantity", r#"
        A characteristic figure in load units (N or N·m) instead of % RO.
        ```rhai
        let run = calibration_run(column([0.0, 5.0, 10.0], "kN"), column([0.0, 1.0, 2.002], "mV/V"), "ascending");
        assert_close(run.characterise(q("10 kN")).in_load("zero_balance"), q("0 N"), 1e-12);
        ```
    "#).register_into_engine(engine, |c: &mut Characterisation, name: &str| -> ScriptResult<Quantity> {
        Ok(Quantity::new(figure(c, name)?.load, if c.load_unit == "N" { "N" } else { "N*m" })?)
    });

    func("markdown", &["c: Characterisation"], "String", r#"
        The characterisation table as markdown (`csv` gives CSV).
        ```rhai
        let run = calibration_run(column([0.0, 5.0, 10.0], "kN"), column([0.0, 1.0, 2.0], "mV/V"), "ascending");
        assert(run.characterise(q("10 kN")).markdown().contains("rated output"));
        ```
    "#).register_into_engine(engine, |c: &mut Characterisation| c.table().to_markdown());
    func("csv", &["c: Characterisation"], "String", r#"
        The characterisation table as CSV.
        ```rhai
        let run = calibration_run(column([0.0, 5.0, 10.0], "kN"), column([0.0, 1.0, 2.0], "mV/V"), "ascending");
        assert(run.characterise(q("10 kN")).csv().starts_with("name,value,unit,limit,verdict"));
        ```
    "#).register_into_engine(engine, |c: &mut Characterisation| c.table().to_csv());

    func(
        "r60",
        &["run: CalibrationRun", "options: Map"],
        "ClassVerdict",
        r#"
        Evaluates a load cell run against OIML R 60:2021 for the declared class: options
        `class` ("A"–"D"), `n_max`, `e_max`, `v_min`, optional `e_min`, `p_lc`,
        `dead_load_return` (DR, N) and a declared `z`; the creep hold at the maximum load as
        `creep_time` (s from loading, to 30 min) and `creep_indication` columns; the minimum
        dead load output change `min_load_change` (N) over `temperature_change` (K). The
        verdict names the deciding limit; `checks` and `points` list every check and each
        reading's error against its MPE. A computed class verdict is not a type approval or a
        legal-for-trade certificate; that follows local regulation.
        ```rhai
        let l = column([0.0, 2.5, 5.0, 7.5, 10.0], "kN");
        let run = calibration_run(l, column([0.0, 0.5, 1.0, 1.5, 2.0], "mV/V"), "ascending");
        let v = run.r60(#{ class: "C", n_max: 3000, e_max: 10.0 * kN, v_min: 0.5 * N });
        assert(v.passed);
        assert(v.caution.contains("legal-for-trade"));
        assert_eq(v.points.len, 5);
        // Creep 0.0001 mV/V over 30 min = 0.5 N, within 0.7 × 3.5 N (R 60-1 5.5.1).
        let c = run.r60(#{ class: "C", n_max: 3000, e_max: 10.0 * kN, v_min: 0.5 * N,
            creep_time: column([0.0, 1200.0, 1800.0], "s"), creep_indication: column([2.0, 2.00009, 2.0001], "mV/V") });
        assert(c.passed);
        ```
    "#,
    )
    .register_into_engine(engine, |r: &mut Run, o: Map| r60(r, &o));

    engine.register_get("passed", |v: &mut ClassVerdict| v.passed);
    engine.register_get("class", |v: &mut ClassVerdict| v.class.clone());
    engine.register_get("standard", |v: &mut ClassVerdict| v.standard.clone());
    engine.register_get("caution", |_v: &mut ClassVerdict| {
        crate::VERDICT_CAUTION.to_string()
    });
    engine.register_get("deciding", |v: &mut ClassVerdict| {
        v.deciding()
            .map(|d| format!("{} ({})", d.name, d.source))
            .unwrap_or_default()
    });
    engine.register_get("checks", |v: &mut ClassVerdict| -> Array {
        v.checks
            .iter()
            .map(|c| {
                let mut m = Map::new();
                m.insert("name".into(), Dynamic::from(c.name.clone()));
                m.insert("value".into(), Dynamic::from(c.value));
                m.insert("limit".into(), Dynamic::from(c.limit));
                m.insert("unit".into(), Dynamic::from(c.unit.clone()));
                m.insert("source".into(), Dynamic::from(c.source.clone()));
                m.insert("passed".into(), Dynamic::from(c.passed));
                Dynamic::from(m)
            })
            .collect()
    });
    engine.register_get("points", |v: &mut ClassVerdict| -> ScriptResult<Array> {
        let unit = v.point_unit.clone();
        v.points
            .iter()
            .map(|p| {
                let q =
                    |x: f64| -> ScriptResult<Dynamic> { Ok(Dynamic::from(quantity(x, &unit)?)) };
                let mut m = Map::new();
                m.insert(
                    "load".into(),
                    Dynamic::from(load_q(p.load, LoadKind::Force)?),
                );
                m.insert(
                    "direction".into(),
                    Dynamic::from(match p.direction {
                        Direction::Ascending => "ascending",
                        Direction::Descending => "descending",
                    }),
                );
                m.insert("series".into(), Dynamic::from(p.series as INT));
                m.insert("error".into(), q(p.error)?);
                m.insert("limit".into(), q(p.limit)?);
                Ok(Dynamic::from(m))
            })
            .collect()
    });
    engine.register_fn("markdown", |v: &mut ClassVerdict| v.table().to_markdown());
    engine.register_fn("csv", |v: &mut ClassVerdict| v.table().to_csv());

    func(
        "e74",
        &["run: CalibrationRun", "options: Map"],
        "Record",
        r#"
        ASTM E74-18 evaluation: polynomial of `degree` (default 2), standard deviation s, lower
        limit factor LLF = 2.4 s and the class AA and A loading ranges (lower limits 2000 LLF and
        400 LLF, not below 2000 and 400 `resolution`s). Further standard deviations (forces) in
        `other` combine with s in quadrature before the factor 2.4 (E74-18, from memory).
        ```rhai
        let f = linspace(1.0 * kN, 10.0 * kN, 10);
        let y = column([0.2, 0.4001, 0.6, 0.7999, 1.0, 1.2001, 1.4, 1.5999, 1.8, 2.0], "mV/V");
        let r = calibration_run(f, y, "ascending").e74(#{ degree: 2, resolution: 0.1 * N });
        assert_close(r.llf, 2.4 * r.s, 1e-12);
        ```
    "#,
    )
    .register_into_engine(engine, |r: &mut Run, o: Map| e74(r, &o));

    func("gum", &["inputs: Array", "model: FnPtr", "options: Map"], "Record", r#"
        A GUM uncertainty budget (JCGM 100:2008). Each input is a map: `#{ name, value, u, dof }`
        (normal), `#{ name, value, half_width, dist: "rectangular" | "triangular" | "arcsine" }`
        or `#{ name, samples: column }` (type A). The model takes an array of columns, one per
        input, and returns a column: the same function Monte Carlo runs over a million draws.
        Sensitivities by central differences with a step of one standard uncertainty; options
        `p` (default 0.95) and `correlations: [[i, j, r], …]`.
        ```rhai
        let inputs = [#{ name: "a", value: 10.0 * N, u: 0.3 * N }, #{ name: "b", value: 5.0 * N, u: 0.4 * N }];
        let r = gum(inputs, |x| x[0] + x[1], #{});
        assert_close(r.u, q("0.5 N"), 1e-9);
        assert_close(r.k, 1.959963984540054, 1e-9);
        ```
    "#).register_into_engine(engine, |ctx: NativeCallContext, inputs: Array, model: FnPtr, o: Map| gum(&ctx, &inputs, &model, &o));

    func(
        "monte_carlo",
        &["inputs: Array", "model: FnPtr", "options: Map"],
        "Record",
        r#"
        Monte Carlo propagation (JCGM 101:2008) with the inputs and column model of `gum`:
        options `trials` (default 10⁶), `seed` (xoshiro256++, default 1), `p`, `ndig` and
        `correlations`. Gives the mean, standard uncertainty, the probabilistically symmetric and
        shortest intervals, the GUM interval and the §8 validation (`validated`, `delta`).
        ```rhai
        let inputs = [];
        for i in 0..4 { inputs.push(#{ name: `X${i}`, value: 0.0 * V, u: 1.0 * V }); }
        let r = monte_carlo(inputs, |x| x[0] + x[1] + x[2] + x[3], #{ trials: 200000, seed: 7 });
        assert_close(r.u, q("2 V"), 0.01);
        assert(r.validated);
        ```
    "#,
    )
    .register_into_engine(
        engine,
        |ctx: NativeCallContext, inputs: Array, model: FnPtr, o: Map| {
            monte_carlo(&ctx, &inputs, &model, &o)
        },
    );
    engine.register_type_with_name::<Draws>("MonteCarloDraws");

    func(
        "iso376",
        &["run: CalibrationRun", "options: Map"],
        "Record",
        r#"
        Classifies a force-proving instrument by ISO 376:2011 from its run: X1 and X2 are the
        first two ascending series in the first mounting position, X3 and X5 the first ascending
        series in the next two positions (rotations), X4' and X6' the descending series after
        them. Deflections are taken from each pass's zero-load reading. Options: `resolution`
        (indication units), `degree` of the interpolation curve (1–3, default 3), `zero`
        [before, after] and `creep` [at 30 s, at 300 s] readings. Gives the best `class` met (or
        `()`), `passed`, the relative `zero` and `creep` errors (%), per-step errors and the
        `verdict` with its deciding limit. Table values are recalled from memory. A computed class
        verdict is not a type approval or a legal-for-trade certificate; that follows local
        regulation.
        ```rhai
        let f = column([0.0, 20.0, 40.0, 60.0, 80.0, 100.0], "kN");
        let y = column([0.0, 0.4, 0.8, 1.2, 1.6, 2.0], "mV/V");
        let run = calibration_run(f, y, "ascending");
        run.add_series(f, y, "ascending", 0.0);
        run.add_series(f, y * 1.0008, "ascending", 120.0);
        run.add_series(f, y, "ascending", 240.0);
        let r = run.iso376(#{});
        // b = 0.08 % / (1 + 0.0008 / 3) at every step: class 0.5 (b ≤ 0.10 %).
        assert_close(r.steps[0].reproducibility, 0.08 / (1.0 + 0.0008 / 3.0), 1e-9);
        assert_eq(r.class, "0.5");
        ```
    "#,
    )
    .register_into_engine(engine, |r: &mut Run, o: Map| iso376(r, &o));

    func(
        "creep",
        &["time: Column", "indication: Column", "options: Map"],
        "Record",
        r#"
        Creep (or creep recovery) of a hold: the change of the indication between the times
        `from` and `to` (from the moment the load was applied or removed; linear interpolation
        between readings). With `rated_output` also in % RO, and with `capacity` in load units.
        ```rhai
        let t = column([0.0, 600.0, 1200.0, 1800.0], "s");
        let y = column([2.0, 2.0003, 2.0004, 2.0005], "mV/V");
        let c = creep(t, y, #{ from: 0.0 * s, to: 1800.0 * s, rated_output: 2.0 * mV_per_V, capacity: 10.0 * kN });
        assert_close(c.change, q("0.0005 mV/V"), 1e-9);
        assert_close(c.percent_ro, 0.025, 1e-9);
        assert_close(c.load, q("2.5 N"), 1e-9);
        ```
    "#,
    )
    .register_into_engine(engine, |t: Column, y: Column, o: Map| creep_of(&t, &y, &o));

    func(
        "tc_zero",
        &["zero_1: Quantity", "zero_2: Quantity", "t1: Quantity", "t2: Quantity", "rated_output: Quantity", "capacity: Quantity"],
        "Record",
        r#"
        Temperature coefficient of zero from the zero readings at two temperatures: `per_k` in
        % RO per K and `load_per_k` in load units per K (common practice; data sheets often quote
        it per 10 K).
        ```rhai
        let tc = tc_zero(0.0 * mV_per_V, 0.0008 * mV_per_V, q("20 degC"), q("40 degC"), 2.0 * mV_per_V, 1.0 * kN);
        assert_close(tc.per_k, 0.002, 1e-9); // 0.04 % RO over 20 K
        assert_close(tc.load_per_k, q("0.02 N/K"), 1e-9);
        ```
    "#,
    )
    .register_into_engine(
        engine,
        |z1: Quantity, z2: Quantity, t1: Quantity, t2: Quantity, ro: Quantity, cap: Quantity| -> ScriptResult<Record> {
            let (z1, z2) = same_dimension(&z1, &z2, "zero readings")?;
            let (ro, _) = same_dimension(&ro, &ro, "rated output")?;
            let kind = if cap.value_in("N").is_ok() { LoadKind::Force } else { LoadKind::Torque };
            let c = load_si(&cap, kind, "capacity")?;
            let f = tc_zero(z1, z2, temperature(&t1, "t1")?, temperature(&t2, "t2")?, ro, c)?;
            let unit = match kind { LoadKind::Force => "N/K", LoadKind::Torque => "N*m/K" };
            Ok(Record::new("temperature coefficient of zero")
                .field("per_k", f.percent_ro)
                .field("load_per_k", Dynamic::from(Quantity::new(f.load, unit)?)))
        },
    );

    func(
        "tc_span",
        &[
            "rated_output_1: Quantity",
            "rated_output_2: Quantity",
            "t1: Quantity",
            "t2: Quantity",
        ],
        "f64",
        r#"
        Temperature coefficient of span: the relative change of rated output per kelvin between
        two temperatures, in % per K (common practice).
        ```rhai
        let tc = tc_span(2.0 * mV_per_V, 2.0004 * mV_per_V, q("20 degC"), q("40 degC"));
        assert_close(tc, 0.001, 1e-9);
        ```
    "#,
    )
    .register_into_engine(
        engine,
        |a: Quantity, b: Quantity, t1: Quantity, t2: Quantity| -> ScriptResult<f64> {
            let (a, b) = same_dimension(&a, &b, "rated outputs")?;
            Ok(tc_span(
                a,
                b,
                temperature(&t1, "t1")?,
                temperature(&t2, "t2")?,
            )?)
        },
    );

    func(
        "inverse_with_uncertainty",
        &["fit: Fit", "indication: Quantity", "u: Quantity"],
        "Record",
        r#"
        The load for an indication and its standard uncertainty from the curve's coefficient
        covariance and the indication's own standard uncertainty `u` (first order, JCGM 100:2008
        5.2.2 with correlated coefficients).
        ```rhai
        let run = calibration_run(column([0.0, 1.0, 2.0, 3.0, 4.0], "kN"), column([0.1, 0.9, 2.1, 2.9, 4.1], "mV/V"), "ascending");
        let r = run.fit(1).inverse_with_uncertainty(2.0 * mV_per_V, 0.0 * mV_per_V);
        // Line fit b = 1.0 mV/V per kN, a = 0.02 mV/V: load (2 − 0.02)/1.0 = 1.98 kN.
        assert_close(r.load, q("1.98 kN"), 1e-9);
        assert(r.u > 0.0 * N);
        ```
    "#,
    )
    .register_into_engine(engine, |c: &mut Curve, y: Quantity, u: Quantity| -> ScriptResult<Record> {
        let label = c.indication.clone();
        let yv = indication_value(&Dynamic::from(y), &label, "indication")?;
        let uv = indication_value(&Dynamic::from(u), &label, "u")?;
        let (x, ux) = c.fit.inverse_with_uncertainty(yv, uv)?;
        Ok(Record::new("load from the calibration curve")
            .field("load", Dynamic::from(load_q(x, c.load)?))
            .field("u", Dynamic::from(load_q(ux, c.load)?)))
    });

    func(
        "coverage_factor",
        &["p: f64", "dof: f64"],
        "f64",
        r#"
        The coverage factor k for coverage probability `p` and `dof` degrees of freedom: the
        two-sided Student's t quantile (JCGM 100:2008 G.3; infinite `dof` gives the normal one).
        ```rhai
        // scipy.stats.t.ppf(0.975, 10) = 2.228138851986274 (scipy 1.17.1)
        assert_close(coverage_factor(0.95, 10.0), 2.228138851986274, 1e-9);
        ```
    "#,
    )
    .register_into_engine(engine, |p: f64, dof: f64| -> ScriptResult<f64> {
        coverage_factor(p, dof).ok_or_else(|| {
            fault(
                "ArgumentError",
                format!("coverage_factor() needs p in (0, 1) and dof above 0, found p = {p}, dof = {dof}"),
            )
        })
    });

    #[cfg(feature = "plot")]
    register_plots(engine);
}

/// The report figures: calibration curve, class errors, hysteresis loop, Monte Carlo histogram.
#[cfg(feature = "plot")]
fn register_plots(engine: &mut Engine) {
    use crate::{Axis, Plot};
    let plot_err = |e: crate::PlotError| fault("PlotError", e.to_string());

    func(
        "plot_calibration",
        &["fit: Fit"],
        "Plot",
        r#"
        The calibration curve of the run a fit was made from: the readings (ascending and
        descending apart), the fitted curve, and beneath them the residuals with a zero line.
        ```rhai
        let run = calibration_run(column([0.0, 5.0, 10.0], "kN"), column([0.0, 1.0004, 2.0], "mV/V"), "ascending");
        run.add_series(column([10.0, 5.0, 0.0], "kN"), column([2.0, 1.001, 0.0002], "mV/V"), "descending", 0.0);
        let svg = plot_calibration(run.fit(1)).to_svg();
        assert(svg.contains("residual (mV/V)") && svg.contains("descending"));
        ```
    "#,
    )
    .register_into_engine(engine, move |c: &mut Curve| -> ScriptResult<Plot> {
        Plot::calibration_curve(&c.run, &c.fit).map_err(plot_err)
    });

    func(
        "plot_calibration",
        &["run: CalibrationRun", "degree: Dynamic"],
        "Plot",
        r#"
        Fits the run (degree 1 to 5, or "zero") and draws its calibration curve with residuals.
        ```rhai
        let run = calibration_run(column([0.0, 5.0, 10.0, 15.0], "kN"), column([0.0, 1.0, 2.001, 3.0], "mV/V"), "ascending");
        assert(plot_calibration(run, 2).to_svg().contains("polynomial of degree 2"));
        ```
    "#,
    )
    .register_into_engine(engine, move |r: &mut Run, d: Dynamic| -> ScriptResult<Plot> {
        let c = curve(r, d)?;
        Plot::calibration_curve(&c.run, &c.fit).map_err(plot_err)
    });

    func(
        "plot_class_errors",
        &["verdict: ClassVerdict"],
        "Plot",
        r#"
        Each reading's error against the permissible error of its class (± MPE lines), from an
        OIML R 60 verdict (`r60`). A computed class verdict is not a type approval or a
        legal-for-trade certificate; that follows local regulation.
        ```rhai
        let l = column([0.0, 2.5, 5.0, 7.5, 10.0], "kN");
        let run = calibration_run(l, column([0.0, 0.5, 1.0001, 1.5, 2.0], "mV/V"), "ascending");
        let v = run.r60(#{ class: "C", n_max: 3000, e_max: 10.0 * kN, v_min: 0.5 * N });
        let svg = plot_class_errors(v).to_svg();
        assert(svg.contains("+MPE") && svg.contains("error (N)"));
        ```
    "#,
    )
    .register_into_engine(engine, move |v: &mut ClassVerdict| -> ScriptResult<Plot> {
        Plot::class_errors(v).map_err(plot_err)
    });

    func(
        "plot_hysteresis",
        &["run: CalibrationRun"],
        "Plot",
        r#"
        The hysteresis loop: every series' deviation from the terminal line, ascending and
        descending as lines, so the gap between them is the hysteresis.
        ```rhai
        let run = calibration_run(column([0.0, 5.0, 10.0], "kN"), column([0.0, 1.0, 2.0], "mV/V"), "ascending");
        run.add_series(column([10.0, 5.0, 0.0], "kN"), column([2.0, 1.002, 0.0], "mV/V"), "descending", 0.0);
        let svg = plot_hysteresis(run).to_svg();
        assert(svg.contains("deviation from terminal line (mV/V)"));
        ```
    "#,
    )
    .register_into_engine(engine, move |r: &mut Run| -> ScriptResult<Plot> {
        Plot::hysteresis_loop(&r.0).map_err(plot_err)
    });

    func(
        "plot_monte_carlo",
        &["result: Record"],
        "Plot",
        r#"
        The histogram of a `monte_carlo` result with the probabilistically symmetric and the
        shortest coverage intervals and the GUM interval drawn as brackets above it.
        ```rhai
        let inputs = [#{ name: "a", value: 10.0 * N, half_width: 1.0 * N, dist: "rectangular" }];
        let mc = monte_carlo(inputs, |x| x[0], #{ trials: 20000, seed: 3 });
        let svg = plot_monte_carlo(mc).to_svg();
        assert(svg.contains("shortest 95 %") && svg.contains("y (N)"));
        ```
    "#,
    )
    .register_into_engine(engine, move |r: &mut Record| -> ScriptResult<Plot> {
        let d = r.get("draws").map_err(|_| {
            fault(
                "ArgumentError",
                "plot_monte_carlo() needs the result of monte_carlo()".to_string(),
            )
        })?;
        let Some(d) = d.read_lock::<Draws>().map(|d| d.clone()) else {
            return Err(fault(
                "ArgumentError",
                "plot_monte_carlo() needs the result of monte_carlo()".to_string(),
            ));
        };
        Plot::monte_carlo(&d.mc, &d.gum, d.p, Axis::new("y", d.unit.clone()), d.scale)
            .map_err(plot_err)
    });
}
