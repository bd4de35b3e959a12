//! The one engine constructor: Rhai's standard packages, Gaugebook's functions from every
//! domain file, unit constants by name, output capture, the interrupt hook and the stdlib
//! resolver.

use std::path::PathBuf;
use std::sync::Arc;
use std::sync::atomic::{AtomicBool, Ordering};

use rhai::{Dynamic, Engine};

use super::error::SourceMap;
use super::output::SinkSlot;
use super::resolver::{Resolver, ResolverHandle};
use super::session::SessionOptions;
use super::{bind, column, core, quantity};

/// Every domain's `register` function, in registration order. A binding file adds one line here
/// (gated by its feature where it needs one) and nothing else.
const DOMAINS: &[fn(&mut Engine)] = &[
    quantity::register,
    column::register,
    bind::register_record,
    super::doc::register,
    super::error::register,
    super::circuits::register,
    super::signal::register,
    super::running::register,
    super::spring::register,
    super::calib::register,
    #[cfg(feature = "data")]
    super::data::register,
    #[cfg(feature = "data")]
    super::blocks::register,
    // bridge::register, gauge::register, rosette::register, chain::register,
    // spring::register, layout::register, signal::register, calib::register,
    // uncertainty::register, data::register (feature "data"), plot::register (feature "plot"),
];

/// Environment variable naming the stdlib folder (overrides the built-in search).
///
/// ```
/// assert_eq!(gaugebook::script::STDLIB_ENV, "GAUGEBOOK_STDLIB");
/// ```
pub const STDLIB_ENV: &str = "GAUGEBOOK_STDLIB";

/// Options for [`build_engine`]; the same as a session's.
///
/// ```
/// let opts = gaugebook::script::EngineOptions::default();
/// let engine = gaugebook::script::build_engine(&opts);
/// assert_eq!(engine.eval::<i64>("1 + 2").unwrap(), 3);
/// ```
pub type EngineOptions = SessionOptions;

/// The stdlib folder: `$GAUGEBOOK_STDLIB`, else `stdlib/` beside the running binary, else the
/// crate's own `stdlib/` as it was at build time.
///
/// ```
/// let dir = gaugebook::script::default_stdlib_dir().expect("the crate's stdlib/ exists");
/// assert!(dir.join("table.rhai").is_file());
/// ```
pub fn default_stdlib_dir() -> Option<PathBuf> {
    if let Some(d) = std::env::var_os(STDLIB_ENV) {
        return Some(PathBuf::from(d));
    }
    let beside_binary = std::env::current_exe()
        .ok()
        .and_then(|e| e.parent().map(|p| p.join("stdlib")));
    let built = PathBuf::from(env!("CARGO_MANIFEST_DIR")).join("stdlib");
    beside_binary
        .into_iter()
        .chain([built])
        .find(|d| d.is_dir())
}

/// What a session keeps besides the engine.
pub(crate) struct Parts {
    pub(crate) engine: Engine,
    pub(crate) sink: SinkSlot,
    pub(crate) interrupt: Arc<AtomicBool>,
    pub(crate) sources: SourceMap,
    pub(crate) resolver: Arc<Resolver>,
}

/// A Rhai engine with Gaugebook's package (for tools that need an engine without a session,
/// e.g. to list the reference). Output goes to the process's standard streams.
///
/// ```
/// let engine = gaugebook::script::build_engine(&Default::default());
/// let r: f64 = engine.eval("q(\"2 kN\").value(\"N\")")?;
/// assert_eq!(r, 2000.0);
/// # Ok::<(), Box<gaugebook::script::rhai::EvalAltResult>>(())
/// ```
pub fn build_engine(options: &EngineOptions) -> Engine {
    build(options).engine
}

pub(crate) fn build(options: &SessionOptions) -> Parts {
    let mut engine = Engine::new();
    // Release-build limits in every build: debug Rhai allows only 8 nested calls, too few for
    // stdlib procedures. Run sessions on a thread with a generous stack (16 MB).
    engine.set_max_call_levels(64);
    engine.set_max_expr_depths(64, 32);

    let sink = SinkSlot::default();
    let interrupt = Arc::new(AtomicBool::new(false));
    let sources = SourceMap::default();

    let stdlib = options.stdlib_dir.clone().or_else(default_stdlib_dir);
    let resolver = Arc::new(Resolver::new(
        options.script_dir.clone(),
        stdlib,
        sources.clone(),
    ));
    engine.set_module_resolver(ResolverHandle(resolver.clone()));
    // Native functions that take file paths (`read_log`, `save`) resolve them against the
    // script folder.
    engine.set_default_tag(bind::script_dir_tag(options.script_dir.as_deref()));

    let s = sink.clone();
    engine.on_print(move |text| s.get().stdout(&format!("{text}\n")));
    let s = sink.clone();
    engine.on_debug(move |text, src, pos| {
        let at = match (src, pos.line()) {
            (Some(src), Some(l)) => format!("[{src}:{l}] "),
            (None, Some(l)) => format!("[line {l}] "),
            _ => String::new(),
        };
        s.get().stderr(&format!("{at}{text}\n"));
    });

    // Called before every operation: an atomic load is cheap and stops a loop within
    // microseconds of the request.
    let flag = interrupt.clone();
    engine.on_progress(move |_| {
        flag.load(Ordering::Relaxed)
            .then(|| Dynamic::from("interrupted"))
    });

    // Unit constants by name, everywhere (inside functions and modules too); a variable of the
    // same name wins.
    // `on_var` is marked volatile (not deprecated) in Rhai 1.27; it is the one hook that makes
    // names visible inside functions without a scope entry.
    #[allow(deprecated)]
    engine.on_var(|name, index, ctx| {
        if index > 0 {
            return Ok(None);
        }
        match quantity::unit_constant(name) {
            Some(q) if !ctx.scope().contains(name) => Ok(Some(Dynamic::from(q))),
            _ => Ok(None),
        }
    });

    for register in DOMAINS {
        register(&mut engine);
    }
    core::register(&mut engine, sink.clone());

    Parts {
        engine,
        sink,
        interrupt,
        sources,
        resolver,
    }
}
