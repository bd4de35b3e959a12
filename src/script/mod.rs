//! The Rhai scripting surface: one engine with Gaugebook's functions, dimension-checked
//! quantities and fast columns, a stdlib resolver, and the [`Session`] that the runner, the REPL
//! and the Jupyter kernel all drive.
//!
//! # Layout
//!
//! | file          | holds |
//! |---------------|-------|
//! | `session.rs`  | [`Session`]: persistent state across cells, interrupts, panics, completion |
//! | `engine.rs`   | the one engine constructor; **the list of domain `register` calls** |
//! | `resolver.rs` | `import` resolution: the script's folder, then `stdlib/` |
//! | `error.rs`    | [`ScriptError`] (rendered `FILE:LINE:COL: message` + caret) and script-side faults |
//! | `output.rs`   | [`OutputSink`], `print`/`debug`/`display` plumbing, value → [`MimeBundle`](crate::MimeBundle) |
//! | `bind.rs`     | helpers every binding file uses (docs, options maps, quantity-or-column, records) |
//! | `quantity.rs` | the worked example binding file: `q()`, unit constants, arithmetic |
//! | `column.rs`   | `Column`: unit-carrying `Arc<Vec<f64>>` with whole-column arithmetic |
//! | `core.rs`     | `assert`, `assert_eq`, `assert_close`, `display`, `help` |
//! | `doc.rs`      | reference text from the registered metadata (`gaugebook doc`, inspection) |
//! | `complete.rs` | completion and inspection at a cursor |
//! | `lex.rs`      | a small Rhai-aware scanner (strings, comments, imports) |
//!
//! # The binding convention (for every domain: bridges, gauges, springs, signal, calib, data …)
//!
//! 1. **One file per domain**, `src/script/<domain>.rs`, exposing
//!    `pub(crate) fn register(engine: &mut Engine)`, gated like its physics module
//!    (`#[cfg(feature = "data")]` where it needs polars). Add the `mod <domain>;` line below and one
//!    line to the `DOMAINS` list in `engine.rs` — nothing else in the engine changes.
//! 2. **Register through [`bind::func`]**, which is `FuncRegistration` with the parameter names,
//!    return type and doc comment filled in. The doc text is markdown; its first line is the
//!    summary; it must contain at least one fenced ` ```rhai ` example that *asserts* its result
//!    with `assert_close`, `assert_eq` or `assert` (registered by `core.rs`). The metadata feeds
//!    `gaugebook doc`, the kernel's inspection and the test `script_reference_examples`, which runs
//!    every example of every registered function — including yours, with nothing to add.
//!    Plain `engine.register_fn` is for operators and `to_string`/`to_debug` only.
//! 3. **Fallible functions return [`bind::ScriptResult<T>`]**. `?` works directly on
//!    [`UnitError`](crate::UnitError) and [`PhysicsError`](crate::PhysicsError): they become
//!    catchable script errors whose position Rhai fills with the call site, and whose kind
//!    (`"UnitError"`, `"PhysicsError"`) the kernel shows as `ename`. For other failures use
//!    [`bind::fault`]`(kind, message)`. Never panic (a panic is caught at the session boundary and
//!    reported, but it is a bug).
//! 4. **Options come as object maps**: `#{ r0: 350.0 * ohm, gf: 2.1 }`. Read them with
//!    [`bind::Options`], which rejects unknown keys (typos) and gives
//!    "missing key `gf` in options of bridge()" and
//!    "key `r0` in options of bridge() must be convertible to Ω, found 5 V".
//! 5. **Quantities in, quantities out, columns too.** A parameter that is a physical value takes a
//!    `Dynamic` and reads it with [`bind::values`] (or `Options::values`): a `Quantity` or a
//!    `Column` of the expected unit's dimension and kind, as SI numbers. Compute in SI through
//!    [`bind::lift1`], [`bind::lift2`] or [`bind::lift`], then return [`bind::shaped`], which gives
//!    a `Quantity` for scalar inputs and a `Column` for column inputs. One script function thus
//!    evaluates a design point or a million Monte Carlo draws. Inside the closure build uom values
//!    from SI (`Force::new::<newton>(si)`) and call the physics function; for a scalar-only API
//!    convert a `Quantity` with the units layer's `TryFrom<&Quantity>` impls
//!    (`let f: Force = (&q).try_into()?;`).
//! 6. **Results are objects with named fields.** Return a [`bind::Record`] (an ordered set of
//!    named values with a title): `r.output`, `r["output"]` and `r.keys()` work, it prints as an
//!    aligned two-column list and shows in notebooks as an HTML table. A domain type that has
//!    methods of its own (a gauge, a bridge) is a Rust struct registered with
//!    [`bind::register_display`] (text, debug and MIME from its `Display` and
//!    [`ToMime`](crate::ToMime) impls) plus `engine.register_get` for its fields.
//! 7. **Names**: the trade's terms (`bridge`, `gauge_factor`, `shunt_cal`), plain words otherwise,
//!    `snake_case`, SI symbols for units.
//!
//! `quantity.rs` is the complete worked example of all of this.

// Helpers for the domain binding files; some are used only once those land.
#[allow(dead_code)]
mod bind;
#[cfg(feature = "data")]
mod blocks;
mod calib;
mod circuits;
mod column;
mod complete;
mod core;
#[cfg(feature = "data")]
mod data;
mod doc;
mod engine;
mod error;
mod lex;
mod output;
mod quantity;
mod resolver;
mod running;
mod session;
mod signal;
mod spring;

pub use column::Column;
pub use doc::{FnDoc, reference_docs, reference_markdown};
pub use engine::{EngineOptions, STDLIB_ENV, build_engine, default_stdlib_dir};
pub use error::{ScriptError, TraceFrame};
pub use output::{CaptureSink, OutputEvent, OutputSink, StdSink};
pub use session::{
    CellOutput, Completeness, Completions, InterruptHandle, Session, SessionOptions,
};

/// Rhai itself, re-exported so front-ends and tests can name `Dynamic`, `Engine` and friends
/// without a separate dependency line.
pub use rhai;
