//! Functions every script has besides the physics: checks (`assert`, `assert_eq`,
//! `assert_close`, used by every reference example) and output (`display`, `update_display`,
//! `clear_output`, `eprint`).

use rhai::{Dynamic, Engine, NativeCallContext};

use super::bind::{ScriptResult, fault, func, number, type_of};
use super::column::Column;
use super::output::{SinkSlot, mime_of, text_of};
use crate::units::Quantity;

fn close(actual: f64, expected: f64, rel: f64, abs: f64) -> bool {
    (actual - expected).abs() <= rel * expected.abs() + abs
}

fn close_error(actual: &str, expected: &str, rel: f64) -> Box<rhai::EvalAltResult> {
    fault(
        "AssertionError",
        format!("assert_close failed: expected {expected} (rel. tol. {rel:e}), found {actual}"),
    )
}

fn assert_close_q(a: &Quantity, e: &Quantity, rel: f64, abs_si: f64) -> ScriptResult<bool> {
    // The difference checks dimension and kind with the usual message.
    let d = a
        .try_sub(e)
        .map_err(|err| fault("AssertionError", format!("assert_close failed: {err}")))?;
    if d.si().abs() <= rel * e.si().abs() + abs_si {
        Ok(true)
    } else {
        Err(close_error(&a.to_string(), &e.to_string(), rel))
    }
}

fn assert_close_dyn(
    actual: Dynamic,
    expected: Dynamic,
    rel: f64,
    abs: Option<Dynamic>,
) -> ScriptResult<bool> {
    if let (Some(a), Some(e)) = (
        actual.read_lock::<Quantity>(),
        expected.read_lock::<Quantity>(),
    ) {
        let abs_si = match &abs {
            None => 0.0,
            Some(t) => match t.read_lock::<Quantity>() {
                Some(t) => {
                    a.try_sub(&t).map_err(|err| {
                        fault("AssertionError", format!("assert_close tolerance: {err}"))
                    })?;
                    t.si().abs()
                }
                None => number(t).ok_or_else(|| {
                    fault(
                        "TypeError",
                        "assert_close tolerance must be a number or quantity",
                    )
                })?,
            },
        };
        return assert_close_q(&a, &e, rel, abs_si);
    }
    if let (Some(a), Some(e)) = (actual.read_lock::<Column>(), expected.read_lock::<Column>()) {
        if a.len() != e.len() || a.dimension() != e.dimension() || a.kind() != e.kind() {
            return Err(fault(
                "AssertionError",
                format!(
                    "assert_close failed: {} versus {}",
                    a.describe(),
                    e.describe()
                ),
            ));
        }
        let abs = abs.as_ref().and_then(number).unwrap_or(0.0);
        for (i, (x, y)) in a.data().iter().zip(e.data().iter()).enumerate() {
            if !close(*x, *y, rel, abs) {
                return Err(fault(
                    "AssertionError",
                    format!("assert_close failed at sample {i}: expected {y} (SI), found {x} (SI)"),
                ));
            }
        }
        return Ok(true);
    }
    match (number(&actual), number(&expected)) {
        (Some(a), Some(e)) => {
            let abs = abs.as_ref().and_then(number).unwrap_or(0.0);
            if close(a, e, rel, abs) {
                Ok(true)
            } else {
                Err(close_error(&a.to_string(), &e.to_string(), rel))
            }
        }
        _ => Err(fault(
            "TypeError",
            format!(
                "assert_close compares two numbers, quantities or columns, found {} and {}",
                type_of(&actual),
                type_of(&expected)
            ),
        )),
    }
}

/// `v` to `digits` significant figures, trailing zeros dropped; scientific notation outside
/// 1e-4 ..= 1e9, the way a person writes a reading.
pub(crate) fn format_number(v: f64, digits: usize) -> String {
    let digits = digits.clamp(1, 17);
    if v == 0.0 || !v.is_finite() {
        return format!("{v}");
    }
    let mag = v.abs().log10().floor() as i32;
    if !(-4..=9).contains(&mag) {
        let s = format!("{v:.*e}", digits - 1);
        return match s.split_once('e') {
            Some((m, e)) if m.contains('.') => {
                format!("{}e{e}", m.trim_end_matches('0').trim_end_matches('.'))
            }
            _ => s,
        };
    }
    let decimals = (digits as i32 - 1 - mag).max(0) as usize;
    let s = format!("{v:.decimals$}");
    if s.contains('.') {
        s.trim_end_matches('0').trim_end_matches('.').to_string()
    } else {
        s
    }
}

/// Registers the checks and the output functions; output goes to `sink`.
pub(crate) fn register(engine: &mut Engine, sink: SinkSlot) {
    func(
        "format_number",
        &["x: f64", "digits: i64"],
        "String",
        r#"
        `x` to `digits` significant figures, without trailing zeros; scientific notation below
        1e-4 and above 1e9.
        ```rhai
        assert_eq(format_number(0.49951234, 4), "0.4995");
        assert_eq(format_number(174650.0, 6), "174650");
        assert_eq(format_number(1.0 / 3.0, 3), "0.333");
        assert_eq(format_number(2.5e-7, 3), "2.5e-7");
        ```
    "#,
    )
    .register_into_engine(engine, |x: f64, d: rhai::INT| {
        format_number(x, d.max(1) as usize)
    });
    engine.register_fn("format_number", |x: rhai::INT, d: rhai::INT| {
        format_number(x as f64, d.max(1) as usize)
    });

    func(
        "assert",
        &["condition: bool"],
        "()",
        r#"
        Fails with an `AssertionError` unless `condition` is true.
        ```rhai
        assert(q("1 kN") > q("1 N"));
        ```
    "#,
    )
    .register_into_engine(engine, |c: bool| -> ScriptResult<()> {
        if c {
            Ok(())
        } else {
            Err(fault("AssertionError", "assertion failed"))
        }
    });

    func(
        "assert",
        &["condition: bool", "message: String"],
        "()",
        r#"
        Fails with `message` unless `condition` is true.
        ```rhai
        assert(2 + 2 == 4, "arithmetic");
        ```
    "#,
    )
    .register_into_engine(engine, |c: bool, m: &str| -> ScriptResult<()> {
        if c {
            Ok(())
        } else {
            Err(fault("AssertionError", format!("assertion failed: {m}")))
        }
    });

    func(
        "assert_eq",
        &["left: ?", "right: ?"],
        "()",
        r#"
        Fails unless `left == right` (for quantities: equal SI values, same dimension and kind).
        ```rhai
        assert_eq(q("1 kN"), q("1000 N"));
        assert_eq([1, 2], [1, 2]);
        ```
    "#,
    )
    .register_into_engine(
        engine,
        |ctx: NativeCallContext, a: Dynamic, b: Dynamic| -> ScriptResult<()> {
            let (mut x, mut y) = (a.clone(), b.clone());
            let eq = ctx.call_native_fn_raw("==", false, &mut [&mut x, &mut y])?;
            if eq.as_bool().unwrap_or(false) {
                Ok(())
            } else {
                let (mut a, mut b) = (a, b);
                Err(fault(
                    "AssertionError",
                    format!(
                        "assert_eq failed: left is {}, right is {}",
                        text_of(&ctx, &mut a),
                        text_of(&ctx, &mut b)
                    ),
                ))
            }
        },
    );

    func(
        "assert_close",
        &["actual: ?", "expected: ?", "rel: f64"],
        "()",
        r#"
        Fails unless `|actual − expected| ≤ rel·|expected|`, for numbers, quantities (which must
        also agree in dimension and kind) or columns (sample by sample).
        ```rhai
        assert_close(q("1.0000001 kN"), q("1 kN"), 1e-6);
        assert_close(0.1 + 0.2, 0.3, 1e-15);
        ```
    "#,
    )
    .register_into_engine(
        engine,
        |a: Dynamic, e: Dynamic, rel: f64| -> ScriptResult<()> {
            assert_close_dyn(a, e, rel, None).map(|_| ())
        },
    );

    func(
        "assert_close",
        &["actual: ?", "expected: ?", "rel: f64", "abs: ?"],
        "()",
        r#"
        Fails unless `|actual − expected| ≤ rel·|expected| + abs`; `abs` has the values' unit.
        ```rhai
        assert_close(q("0.0000001 mV/V"), q("0 mV/V"), 0.0, q("0.000001 mV/V"));
        ```
    "#,
    )
    .register_into_engine(
        engine,
        |a: Dynamic, e: Dynamic, rel: f64, abs: Dynamic| -> ScriptResult<()> {
            assert_close_dyn(a, e, rel, Some(abs)).map(|_| ())
        },
    );

    let s = sink.clone();
    func(
        "display",
        &["value: ?"],
        "()",
        r#"
        Shows a value richly: a table or figure in a notebook, its text in the runner.
        ```rhai
        display(q("2 mV/V"));
        ```
    "#,
    )
    .register_into_engine(engine, move |ctx: NativeCallContext, v: Dynamic| {
        let mut v = v;
        s.get().display(mime_of(&ctx, &mut v), None, false);
    });

    let s = sink.clone();
    func(
        "display",
        &["value: ?", "display_id: String"],
        "()",
        r#"
        Shows a value in a view named `display_id`, which `update_display` can later replace.
        ```rhai
        display("loading …", "progress");
        update_display("done", "progress");
        ```
    "#,
    )
    .register_into_engine(
        engine,
        move |ctx: NativeCallContext, v: Dynamic, id: &str| {
            let mut v = v;
            s.get()
                .display(mime_of(&ctx, &mut v), Some(id.to_string()), false);
        },
    );

    let s = sink.clone();
    func(
        "update_display",
        &["value: ?", "display_id: String"],
        "()",
        r#"
        Replaces the view shown earlier with `display(value, display_id)`.
        ```rhai
        display(0, "count");
        for i in 1..4 { update_display(i, "count"); }
        ```
    "#,
    )
    .register_into_engine(
        engine,
        move |ctx: NativeCallContext, v: Dynamic, id: &str| {
            let mut v = v;
            s.get()
                .display(mime_of(&ctx, &mut v), Some(id.to_string()), true);
        },
    );

    let s = sink.clone();
    func(
        "clear_output",
        &[],
        "()",
        r#"
        Clears the cell's output now.
        ```rhai
        print("soon gone");
        clear_output();
        ```
    "#,
    )
    .register_into_engine(engine, move || s.get().clear_output(false));

    let s = sink.clone();
    func(
        "clear_output",
        &["wait: bool"],
        "()",
        r#"
        Clears the cell's output; with `wait`, only when the next output arrives (no flicker).
        ```rhai
        clear_output(true);
        print("replaces what was there");
        ```
    "#,
    )
    .register_into_engine(engine, move |wait: bool| s.get().clear_output(wait));

    for password in [false, true] {
        let s = sink.clone();
        let (name, doc) = if password {
            (
                "input_password",
                r#"
        Like `input(prompt)`, but asks the front-end not to show what is typed (a notebook
        shows a password field).
        ```rhai
        let key = "";
        try { key = input_password("rig access code? "); } catch { }
        ```
    "#,
            )
        } else {
            (
                "input",
                r#"
        Asks the person running the script for one line of text: the notebook shows a field
        under the cell (when the client allows input), the runner and the prompt read standard
        input. Where nobody can answer (a headless notebook run, a client without input, the end
        of standard input) it raises an error, which `try` can catch.
        ```rhai
        let who = "(no input here)";
        try { who = input("operator initials? "); } catch { }
        print(`rig operator: ${who}`);
        ```
    "#,
            )
        };
        func(name, &["prompt: String"], "String", doc).register_into_engine(
            engine,
            move |prompt: &str| -> ScriptResult<String> {
                s.get()
                    .input(prompt, password)
                    .map_err(|why| fault("InputError", format!("no input: {why}")))
            },
        );
    }

    let s = sink;
    func(
        "eprint",
        &["text: ?"],
        "()",
        r#"
        Prints to standard error (a notebook shows it in red).
        ```rhai
        eprint("warning: shunt value outside the usual range");
        ```
    "#,
    )
    .register_into_engine(engine, move |ctx: NativeCallContext, v: Dynamic| {
        let mut v = v;
        s.get().stderr(&format!("{}\n", text_of(&ctx, &mut v)));
    });
}
