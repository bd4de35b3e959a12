//! Quantities in scripts: `q("350 ohm")`, `q(350.0, "ohm")`, unit constants (`350.0 * ohm`),
//! conversion, arithmetic and comparison with the units layer's dimension and kind checks.
//!
//! This file is the worked example of the binding convention in `src/script/mod.rs`: documented
//! registrations through `bind::func` with asserting ```rhai examples, fallible functions
//! returning `ScriptResult` with `?` on `UnitError`, and plain `register_fn` for operators.

use std::cmp::Ordering;
use std::collections::HashMap;
use std::sync::{Arc, OnceLock};

use rhai::{Dynamic, Engine, INT, Map};

use super::bind::{ScriptResult, fault, func};
use crate::units::{Quantity, Unit};
use crate::{Dimension, Kind};

/// The unit constants, from the units layer's own list (`Unit::constants`): one of each unit.
fn constants() -> &'static HashMap<&'static str, Quantity> {
    static TABLE: OnceLock<HashMap<&'static str, Quantity>> = OnceLock::new();
    TABLE.get_or_init(|| {
        Unit::constants()
            .into_iter()
            .map(|(name, u)| (name, Quantity::in_unit(1.0, Arc::new(u))))
            .collect()
    })
}

/// The quantity a unit-constant name stands for (`kN` → 1 kN).
pub(crate) fn unit_constant(name: &str) -> Option<Quantity> {
    constants().get(name).cloned()
}

/// Names of the unit constants available in this build.
pub(crate) fn unit_constant_names() -> Vec<&'static str> {
    let mut v: Vec<&'static str> = constants().keys().copied().collect();
    v.sort_unstable();
    v
}

fn plain(q: &Quantity) -> bool {
    q.dimension() == Dimension::NONE && q.kind() == Kind::Plain
}

/// A bare number may stand beside a plain dimensionless quantity only.
fn with_number(q: &Quantity, x: f64, op: &str) -> ScriptResult<Quantity> {
    if plain(q) {
        Ok(Quantity::number(x))
    } else {
        Err(fault(
            "UnitError",
            format!("cannot {op} {q} and the bare number {x}; give the number a unit"),
        ))
    }
}

fn cmp(a: &Quantity, b: &Quantity) -> ScriptResult<Ordering> {
    Ok(a.try_cmp(b)?)
}

fn pick(a: Quantity, b: Quantity, want: Ordering) -> ScriptResult<Quantity> {
    Ok(if cmp(&a, &b)? == want { a } else { b })
}

/// Registers `Quantity`, `q()`, conversions, operators and the constants' reference.
pub(crate) fn register(engine: &mut Engine) {
    engine.register_type_with_name::<Quantity>("Quantity");
    engine.register_fn("to_string", |x: &mut Quantity| x.to_string());
    engine.register_fn("to_debug", |x: &mut Quantity| x.to_string());

    func(
        "q",
        &["text: String"],
        "Quantity",
        r#"
        A quantity from text: a number, then a unit (`"350 ohm"`, `"2.5 mV/V"`, `"1000 ue"`).

        Quantities keep SI values and check dimensions and kinds: adding a resistance to a voltage,
        or a strain to a bridge output ratio, is an error naming both sides. Arithmetic `+ - * /`,
        integer powers `**`, unary minus, comparisons, `abs`, `sqrt`, `min`, `max` work on them, and
        a number times a quantity scales it. Comparing a quantity with a bare number is an error.
        ```rhai
        let r = q("350 ohm");
        assert_close(r.value("kohm"), 0.35, 1e-12);
        assert_close(r * 2, q("700 ohm"), 1e-12);
        assert(q("1 kN") > q("999 N"));
        ```
    "#,
    )
    .register_into_engine(engine, |text: &str| -> ScriptResult<Quantity> {
        Ok(Quantity::parse(text)?)
    });

    func(
        "q",
        &["value: f64", "unit: String"],
        "Quantity",
        r#"
        A quantity from a number and a unit.
        ```rhai
        let e = q(2.5, "mV/V");
        assert_close(e.value("V/V"), 0.0025, 1e-12);
        ```
    "#,
    )
    .register_into_engine(engine, |v: f64, unit: &str| -> ScriptResult<Quantity> {
        Ok(Quantity::new(v, unit)?)
    });

    func(
        "q",
        &["value: i64", "unit: String"],
        "Quantity",
        r#"
        A quantity from a whole number and a unit.
        ```rhai
        assert_close(q(350, "ohm"), 350.0 * ohm, 1e-12);
        ```
    "#,
    )
    .register_into_engine(engine, |v: INT, unit: &str| -> ScriptResult<Quantity> {
        Ok(Quantity::new(v as f64, unit)?)
    });

    func(
        "to",
        &["x: Quantity", "unit: String"],
        "Quantity",
        r#"
        The same quantity shown in another unit of its dimension and kind.
        ```rhai
        let r = q("174650 ohm").to("kohm");
        assert_eq(r.unit, "kΩ");
        assert_close(r.value("kohm"), 174.65, 1e-12);
        ```
    "#,
    )
    .register_into_engine(
        engine,
        |x: &mut Quantity, unit: &str| -> ScriptResult<Quantity> { Ok(x.to(unit)?) },
    );

    func(
        "value",
        &["x: Quantity", "unit: String"],
        "f64",
        r#"
        The number this quantity is in `unit`; an error if the unit has another dimension or kind.
        ```rhai
        assert_close(q("2.5 kN").value("N"), 2500.0, 1e-12);
        ```
    "#,
    )
    .register_into_engine(
        engine,
        |x: &mut Quantity, unit: &str| -> ScriptResult<f64> { Ok(x.value_in(unit)?) },
    );

    func(
        "value",
        &["x: Quantity"],
        "f64",
        r#"
        The number this quantity is in its own display unit (SI when it has none).
        ```rhai
        assert_close(q("2.5 kN").value(), 2.5, 1e-12);
        ```
    "#,
    )
    .register_into_engine(engine, |x: &mut Quantity| {
        x.unit().map_or(x.si(), |u| u.from_si(x.si()))
    });

    engine.register_get("unit", |x: &mut Quantity| match x.unit() {
        Some(u) => u.symbol().to_string(),
        None if plain(x) => String::new(),
        None => x.dimension().to_string(),
    });
    engine.register_get("si", |x: &mut Quantity| x.si());
    engine.register_get("kind", |x: &mut Quantity| x.kind().to_string());
    engine.register_get("dimension", |x: &mut Quantity| x.dimension().to_string());

    // Arithmetic between quantities.
    engine.register_fn("+", |a: Quantity, b: Quantity| -> ScriptResult<Quantity> {
        Ok(a.try_add(&b)?)
    });
    engine.register_fn("-", |a: Quantity, b: Quantity| -> ScriptResult<Quantity> {
        Ok(a.try_sub(&b)?)
    });
    engine.register_fn("*", |a: Quantity, b: Quantity| a.mul(&b));
    engine.register_fn("/", |a: Quantity, b: Quantity| a.div(&b));
    engine.register_fn("-", |a: Quantity| a.neg());
    engine.register_fn("+", |a: Quantity| a);
    engine.register_fn("**", |a: Quantity, n: INT| -> ScriptResult<Quantity> {
        let n = i32::try_from(n)
            .map_err(|_| fault("ArgumentError", format!("power {n} is too large")))?;
        Ok(a.powi(n))
    });
    engine.register_fn("**", |a: Quantity, n: f64| -> ScriptResult<Quantity> {
        Err(fault(
            "UnitError",
            format!(
                "cannot raise {a} to the power {n}: only whole powers keep units (use sqrt for ½)"
            ),
        ))
    });

    // Numbers beside quantities: scaling always, adding only to plain dimensionless ones.
    macro_rules! with_numbers {
        ($t:ty) => {
            engine.register_fn("*", |a: Quantity, k: $t| a.scale(k as f64));
            engine.register_fn("*", |k: $t, a: Quantity| a.scale(k as f64));
            engine.register_fn("/", |a: Quantity, k: $t| a.scale(1.0 / k as f64));
            engine.register_fn("/", |k: $t, a: Quantity| Quantity::number(k as f64).div(&a));
            engine.register_fn("+", |a: Quantity, k: $t| -> ScriptResult<Quantity> {
                Ok(a.try_add(&with_number(&a, k as f64, "add")?)?)
            });
            engine.register_fn("+", |k: $t, a: Quantity| -> ScriptResult<Quantity> {
                Ok(with_number(&a, k as f64, "add")?.try_add(&a)?)
            });
            engine.register_fn("-", |a: Quantity, k: $t| -> ScriptResult<Quantity> {
                Ok(a.try_sub(&with_number(&a, k as f64, "subtract")?)?)
            });
            engine.register_fn("-", |k: $t, a: Quantity| -> ScriptResult<Quantity> {
                Ok(with_number(&a, k as f64, "subtract")?.try_sub(&a)?)
            });
        };
    }
    with_numbers!(f64);
    with_numbers!(INT);

    // Comparisons: between quantities of one dimension and kind; with a bare number only for
    // plain dimensionless quantities. Rhai's default `==` across types is `false`, which would
    // hide a unit slip, so every mixed form is registered and checked.
    macro_rules! comparisons {
        ($($op:literal => $test:expr),*) => {$(
            engine.register_fn($op, |a: Quantity, b: Quantity| -> ScriptResult<bool> {
                Ok($test(cmp(&a, &b)?))
            });
            engine.register_fn($op, |a: Quantity, k: f64| -> ScriptResult<bool> {
                Ok($test(cmp(&a, &with_number(&a, k, "compare")?)?))
            });
            engine.register_fn($op, |k: f64, a: Quantity| -> ScriptResult<bool> {
                Ok($test(cmp(&with_number(&a, k, "compare")?, &a)?))
            });
            engine.register_fn($op, |a: Quantity, k: INT| -> ScriptResult<bool> {
                Ok($test(cmp(&a, &with_number(&a, k as f64, "compare")?)?))
            });
            engine.register_fn($op, |k: INT, a: Quantity| -> ScriptResult<bool> {
                Ok($test(cmp(&with_number(&a, k as f64, "compare")?, &a)?))
            });
        )*};
    }
    comparisons!(
        "<" => |o: Ordering| o == Ordering::Less,
        "<=" => |o: Ordering| o != Ordering::Greater,
        ">" => |o: Ordering| o == Ordering::Greater,
        ">=" => |o: Ordering| o != Ordering::Less,
        "==" => |o: Ordering| o == Ordering::Equal,
        "!=" => |o: Ordering| o != Ordering::Equal
    );

    func(
        "abs",
        &["x: Quantity"],
        "Quantity",
        r#"
        The magnitude.
        ```rhai
        assert_close(abs(q("-3 mV")), q("3 mV"), 1e-12);
        ```
    "#,
    )
    .register_into_engine(engine, |x: Quantity| x.abs());

    func(
        "sqrt",
        &["x: Quantity"],
        "Quantity",
        r#"
        The square root; the dimension must have even exponents and the value must not be negative.
        ```rhai
        let a = q("9 mm") * q("4 mm");
        assert_close(sqrt(a), q("6 mm"), 1e-12);
        ```
    "#,
    )
    .register_into_engine(engine, |x: Quantity| -> ScriptResult<Quantity> {
        Ok(x.sqrt()?)
    });

    func(
        "min",
        &["a: Quantity", "b: Quantity"],
        "Quantity",
        r#"
        The smaller of two quantities of one dimension and kind.
        ```rhai
        assert_close(min(q("1 kN"), q("900 N")), q("900 N"), 1e-12);
        ```
    "#,
    )
    .register_into_engine(engine, |a: Quantity, b: Quantity| {
        pick(a, b, Ordering::Less)
    });

    func(
        "max",
        &["a: Quantity", "b: Quantity"],
        "Quantity",
        r#"
        The larger of two quantities of one dimension and kind.
        ```rhai
        assert_close(max(q("1 kN"), q("900 N")), q("1 kN"), 1e-12);
        ```
    "#,
    )
    .register_into_engine(engine, |a: Quantity, b: Quantity| {
        pick(a, b, Ordering::Greater)
    });

    func("unit_constants", &[], "Map", r#"
        The unit constants every script can use by name (`350.0 * ohm`, `2.0 * mV_per_V`, `1000.0 * ue`),
        as a map from name to one of that unit: `V mV uV A mA ohm kohm Mohm W N kN N_m lbf kg m mm
        um inch Pa MPa GPa psi ue mV_per_V …` (print `unit_constants().keys()` for all of them).
        Names are Rhai identifiers: `µε` is `ue`, `mV/V` is `mV_per_V`, `N·m` is `N_m`. A variable of
        the same name hides the constant.
        ```rhai
        assert_close(350.0 * ohm, q("350 ohm"), 1e-12);
        assert_close(2.0 * mV_per_V, q("2 mV/V"), 1e-12);
        assert("kN" in unit_constants());
        ```
    "#)
    .register_into_engine(engine, || -> Map {
        unit_constant_names()
            .into_iter()
            .filter_map(|n| unit_constant(n).map(|q| (n.into(), Dynamic::from(q))))
            .collect()
    });
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn constants_cover_the_issue_list() {
        // Issue 3 names these explicitly.
        for n in [
            "V", "mV", "ohm", "kohm", "N", "kN", "kg", "mm", "MPa", "GPa", "ue",
        ] {
            assert!(unit_constant(n).is_some(), "{n}");
        }
        assert_eq!(unit_constant("kohm").map(|q| q.si()), Some(1000.0));
    }

    #[test]
    fn constant_names_are_rhai_identifiers() {
        for n in unit_constant_names() {
            assert!(
                n.chars().all(|c| c.is_ascii_alphanumeric() || c == '_'),
                "{n}"
            );
            assert!(!n.starts_with(|c: char| c.is_ascii_digit()), "{n}");
        }
    }
}
