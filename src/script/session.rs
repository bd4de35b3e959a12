//! A scripting session: the state that persists across cells (variables, functions, imports),
//! with interrupts, panic containment, rich results, completion and inspection. The runner,
//! the REPL and the Jupyter kernel all drive one of these.

use std::collections::BTreeMap;
use std::panic::{AssertUnwindSafe, catch_unwind};
use std::path::PathBuf;
use std::sync::Arc;
use std::sync::atomic::{AtomicBool, Ordering};

use rhai::{
    AST, Dynamic, Engine, EvalAltResult, Module, NativeCallContext, Position, Scope, Shared,
};

use super::engine::{Parts, build};
use super::error::{ScriptError, SourceMap};
use super::lex;
use super::output::{OutputSink, SinkSlot, mime_of};
use super::resolver::Resolver;
use crate::MimeBundle;

/// Where a session looks for modules. Both default to "not set": the stdlib folder is then
/// found by [`default_stdlib_dir`](super::default_stdlib_dir), and the script folder is the
/// current directory's files only through absolute paths.
///
/// ```
/// use gaugebook::script::{Session, SessionOptions};
/// let opts = SessionOptions { stdlib_dir: gaugebook::script::default_stdlib_dir(), script_dir: None };
/// let mut s = Session::new(opts)?;
/// s.eval_cell("import \"table\" as t;", "cell[1]")?;
/// # Ok::<(), gaugebook::script::ScriptError>(())
/// ```
#[derive(Clone, Debug, Default)]
pub struct SessionOptions {
    /// The stdlib folder (`import "table" as t;` finds `table.rhai` there).
    pub stdlib_dir: Option<PathBuf>,
    /// The script's own folder, searched before the stdlib.
    pub script_dir: Option<PathBuf>,
}

/// The result of a cell: its last expression's value as a MIME bundle, or `None` for `()`.
///
/// ```
/// use gaugebook::script::{Session, SessionOptions};
/// let mut s = Session::new(SessionOptions::default())?;
/// assert_eq!(s.eval_cell("let x = 1;", "cell[1]")?.value, None);
/// let out = s.eval_cell("x + 1", "cell[2]")?;
/// assert_eq!(out.value.unwrap().get("text/plain"), Some("2"));
/// # Ok::<(), gaugebook::script::ScriptError>(())
/// ```
#[derive(Clone, Debug, Default, PartialEq)]
pub struct CellOutput {
    /// The value's representations (`text/plain` always).
    pub value: Option<MimeBundle>,
}

/// Stops the cell that is running in the session it came from; safe to use from any thread.
///
/// ```
/// use gaugebook::script::{Session, SessionOptions};
/// let mut s = Session::new(SessionOptions::default())?;
/// let stop = s.interrupt_handle();
/// let t = std::thread::spawn(move || { std::thread::sleep(std::time::Duration::from_millis(50)); stop.interrupt(); });
/// let e = s.eval_cell("loop { }", "cell[1]").unwrap_err();
/// t.join().unwrap();
/// assert_eq!(e.kind, "Interrupted");
/// assert_eq!(s.eval_cell("1 + 1", "cell[2]")?.value.unwrap().get("text/plain"), Some("2"));
/// # Ok::<(), gaugebook::script::ScriptError>(())
/// ```
#[derive(Clone, Debug)]
pub struct InterruptHandle(Arc<AtomicBool>);

impl InterruptHandle {
    /// Asks the running cell to stop; it ends with an `Interrupted` error within microseconds
    /// of its next script operation, and the session stays usable.
    ///
    /// ```
    /// use gaugebook::script::{Session, SessionOptions};
    /// let mut s = Session::new(SessionOptions::default())?;
    /// let stop = s.interrupt_handle();
    /// let t = std::thread::spawn(move || { std::thread::sleep(std::time::Duration::from_millis(20)); stop.interrupt(); });
    /// assert_eq!(s.eval_cell("while true { }", "cell[1]").unwrap_err().kind, "Interrupted");
    /// t.join().unwrap();
    /// # Ok::<(), gaugebook::script::ScriptError>(())
    /// ```
    pub fn interrupt(&self) {
        self.0.store(true, Ordering::SeqCst);
    }
}

/// Completion candidates for the text between `start` and `end` (character offsets).
///
/// ```
/// use gaugebook::script::{Session, SessionOptions};
/// let s = Session::new(SessionOptions::default()).unwrap();
/// let c = s.completions("q(\"350 koh", 10);
/// assert_eq!((c.start, c.end), (7, 10));
/// assert!(c.matches.contains(&"kohm".to_string()));
/// ```
#[derive(Clone, Debug, Default, PartialEq, Eq)]
pub struct Completions {
    /// Start of the text the matches replace (characters, not bytes).
    pub start: usize,
    /// End of that text (the cursor).
    pub end: usize,
    /// Candidates, sorted, without duplicates.
    pub matches: Vec<String>,
}

/// Whether a piece of code can run as it is.
///
/// ```
/// use gaugebook::script::{Completeness, Session};
/// assert_eq!(Session::is_complete("if x > 1 {"), Completeness::Incomplete);
/// ```
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub enum Completeness {
    /// It parses.
    Complete,
    /// It stops inside a string, comment or block, or in the middle of a statement.
    Incomplete,
    /// It has a syntax error that more text cannot fix.
    Invalid,
}

/// A persistent scripting session.
///
/// ```
/// use gaugebook::script::{Session, SessionOptions};
/// let mut s = Session::new(SessionOptions::default())?;
/// s.eval_cell("let r = 350.0 * ohm; fn twice(x) { 2 * x }", "cell[1]")?;
/// let out = s.eval_cell("twice(r).to(\"kohm\")", "cell[2]")?;
/// assert_eq!(out.value.unwrap().get("text/plain"), Some("0.7 kΩ"));
/// # Ok::<(), gaugebook::script::ScriptError>(())
/// ```
pub struct Session {
    engine: Engine,
    scope: Scope<'static>,
    /// Functions defined by earlier cells.
    lib: AST,
    sink: SinkSlot,
    interrupt: Arc<AtomicBool>,
    sources: SourceMap,
    resolver: Arc<Resolver>,
    /// Modules imported at the top level of earlier cells, by alias.
    modules: BTreeMap<String, Shared<Module>>,
    mime_ast: AST,
    /// Function and property names for completion.
    names: Names,
}

#[derive(Default)]
pub(crate) struct Names {
    pub(crate) functions: Vec<String>,
    pub(crate) properties: Vec<String>,
}

/// The MIME bundle of a cell's value, carried out of the engine.
#[derive(Clone)]
struct CellMime(MimeBundle);

impl Session {
    /// A new session with Gaugebook's engine; output goes to standard output until
    /// [`Session::set_output`] is called.
    ///
    /// ```
    /// use gaugebook::script::{Session, SessionOptions};
    /// let mut s = Session::new(SessionOptions::default())?;
    /// s.eval_cell("print(\"to standard output\")", "cell[1]")?;
    /// # Ok::<(), gaugebook::script::ScriptError>(())
    /// ```
    pub fn new(options: SessionOptions) -> Result<Session, ScriptError> {
        let Parts {
            mut engine,
            sink,
            interrupt,
            sources,
            resolver,
        } = build(&options);
        engine.register_fn("__cell_mime", |ctx: NativeCallContext, v: Dynamic| {
            let mut v = v;
            CellMime(mime_of(&ctx, &mut v))
        });
        let mime_ast = engine
            .compile("__cell_mime(__cell_value)")
            .map_err(|e| ScriptError::bare("SyntaxError", e.to_string(), "<session>"))?;
        let names = super::complete::collect_names(&engine);
        Ok(Session {
            engine,
            scope: Scope::new(),
            lib: AST::empty(),
            sink,
            interrupt,
            sources,
            resolver,
            modules: BTreeMap::new(),
            mime_ast,
            names,
        })
    }

    /// Sends `print`, `debug` and `display` output to `sink` from now on.
    ///
    /// ```
    /// use gaugebook::script::{Session, SessionOptions};
    /// let mut s = Session::new(SessionOptions::default())?;
    /// let sink = std::sync::Arc::new(gaugebook::script::CaptureSink::default());
    /// s.set_output(sink.clone());
    /// s.eval_cell("print(2.0 * kN); debug(\"checked\")", "cell[1]")?;
    /// assert_eq!(sink.stdout_text(), "2 kN\n");
    /// assert!(sink.stderr_text().contains("checked"));
    /// # Ok::<(), gaugebook::script::ScriptError>(())
    /// ```
    pub fn set_output(&mut self, sink: Arc<dyn OutputSink>) {
        self.sink.set(sink);
    }

    /// A handle that stops the running cell from another thread.
    ///
    /// ```
    /// use gaugebook::script::{Session, SessionOptions};
    /// let mut s = Session::new(SessionOptions::default())?;
    /// let h = s.interrupt_handle();
    /// h.interrupt(); // no cell is running: the next cell starts afresh
    /// assert!(s.eval_cell("1", "cell[1]").is_ok());
    /// # Ok::<(), gaugebook::script::ScriptError>(())
    /// ```
    pub fn interrupt_handle(&self) -> InterruptHandle {
        InterruptHandle(self.interrupt.clone())
    }

    /// Defines a constant before a script runs (the runner's `--set NAME=VALUE`).
    ///
    /// ```
    /// use gaugebook::script::{Session, SessionOptions};
    /// let mut s = Session::new(SessionOptions::default())?;
    /// s.set_constant("capacity", gaugebook::script::rhai::Dynamic::from(gaugebook::Quantity::parse("5 kN").unwrap()));
    /// let out = s.eval_cell("capacity.to(\"N\")", "cell[1]")?;
    /// assert_eq!(out.value.unwrap().get("text/plain"), Some("5000 N"));
    /// assert!(s.eval_cell("capacity = 1;", "cell[2]").is_err());
    /// # Ok::<(), gaugebook::script::ScriptError>(())
    /// ```
    pub fn set_constant(&mut self, name: &str, value: Dynamic) {
        self.scope.push_constant_dynamic(name.to_string(), value);
    }

    /// The engine, for tools that read its metadata.
    ///
    /// ```
    /// use gaugebook::script::{Session, SessionOptions};
    /// let mut s = Session::new(SessionOptions::default())?;
    /// let docs = gaugebook::script::reference_docs(s.engine());
    /// assert!(docs.iter().any(|d| d.name == "bridge"));
    /// # Ok::<(), gaugebook::script::ScriptError>(())
    /// ```
    pub fn engine(&self) -> &Engine {
        &self.engine
    }

    /// Runs one cell. Variables, functions and top-level imports persist into later cells; the
    /// last expression's value is the result. A failed cell keeps the state from before it
    /// (variables it assigned before failing stay assigned), and its functions are dropped.
    ///
    /// ```
    /// use gaugebook::script::{Session, SessionOptions};
    /// let mut s = Session::new(SessionOptions::default())?;
    /// s.eval_cell("let e = q(\"1000 ue\");", "cell[1]")?;
    /// let bad = s.eval_cell("e + 1.0 * V", "cell[2]").unwrap_err();
    /// assert_eq!((bad.kind.as_str(), bad.line, bad.column), ("UnitError", 1, 3));
    /// let out = s.eval_cell("e * 2", "cell[3]")?;
    /// assert_eq!(out.value.unwrap().get("text/plain"), Some("2000 µε"));
    /// # Ok::<(), gaugebook::script::ScriptError>(())
    /// ```
    pub fn eval_cell(&mut self, code: &str, origin: &str) -> Result<CellOutput, ScriptError> {
        self.interrupt.store(false, Ordering::SeqCst);
        self.sources.add_text(origin, code);
        let mut ast = self
            .engine
            .compile_with_scope(&self.scope, code)
            .map_err(|e| self.sources.resolve_parse(&e, origin))?;
        ast.set_source(origin);
        let merged = self.lib.merge(&ast);

        let (engine, scope) = (&self.engine, &mut self.scope);
        let run = catch_unwind(AssertUnwindSafe(|| {
            engine.eval_ast_with_scope::<Dynamic>(scope, &merged)
        }));
        self.interrupt.store(false, Ordering::SeqCst);
        let value = match run {
            Err(payload) => return Err(panic_error(payload, origin)),
            Ok(Err(e)) => match *e {
                EvalAltResult::Exit(v, _) => v,
                e => return Err(self.explain(self.sources.resolve(&e, origin))),
            },
            Ok(Ok(v)) => v,
        };

        for f in ast.iter_functions() {
            self.sources.add_fn(f.name, origin);
        }
        self.lib = merged.clone_functions_only();
        self.keep_imports(code, origin);
        self.names
            .functions
            .extend(ast.iter_functions().map(|f| f.name.to_string()));
        Ok(CellOutput {
            value: self.bundle(value, origin)?,
        })
    }

    /// A call that matches no overload gets the overloads that exist: a wrong argument type
    /// is then a `TypeError` that says what the function takes.
    fn explain(&self, mut e: ScriptError) -> ScriptError {
        if e.kind != "FunctionNotFound" {
            return e;
        }
        let Some(sig) = e
            .message
            .strip_prefix("no function `")
            .and_then(|m| m.strip_suffix('`'))
        else {
            return e;
        };
        let (name, args) = sig
            .split_once(" (")
            .map_or((sig, ""), |(n, a)| (n, a.trim_end_matches(')')));
        let name = name.rsplit("::").next().unwrap_or(name).trim().to_string();
        let mut takes: Vec<String> = super::doc::reference_docs(&self.engine)
            .into_iter()
            .filter(|d| d.name == name)
            .map(|d| d.signature)
            .collect();
        takes.extend(
            self.lib
                .iter_functions()
                .filter(|f| f.name == name)
                .map(|f| format!("{}({})", f.name, f.params.join(", "))),
        );
        if !takes.is_empty() {
            e.kind = "TypeError".to_string();
            e.message = format!(
                "`{name}` cannot take ({args}); it takes {}",
                takes.join(" or ")
            );
        }
        e
    }

    /// Makes the cell's top-level imports visible to later cells (as static modules).
    fn keep_imports(&mut self, code: &str, origin: &str) {
        for (path, alias) in lex::top_level_imports(code) {
            // The import already ran in the cell, so this is a cache hit.
            if let Ok(m) = rhai::ModuleResolver::resolve(
                &*self.resolver,
                &self.engine,
                Some(origin),
                &path,
                Position::NONE,
            ) {
                self.engine
                    .register_static_module(alias.as_str(), m.clone());
                self.modules.insert(alias, m);
            }
        }
    }

    fn bundle(&self, value: Dynamic, origin: &str) -> Result<Option<MimeBundle>, ScriptError> {
        if value.is_unit() {
            return Ok(None);
        }
        let mut scope = Scope::new();
        scope.push_dynamic("__cell_value", value);
        let run = catch_unwind(AssertUnwindSafe(|| {
            self.engine
                .eval_ast_with_scope::<CellMime>(&mut scope, &self.mime_ast)
        }));
        match run {
            Ok(Ok(m)) => Ok(Some(m.0)),
            Ok(Err(e)) => Err(self.sources.resolve(&e, origin)),
            Err(p) => Err(panic_error(p, origin)),
        }
    }

    /// Completion candidates at `cursor` (a character offset into `code`): functions, methods
    /// and properties after `.`, variables, unit constants, members after `module::`, unit
    /// symbols inside the string of `q("…")`, `.to("…")`, `.value("…")`, and module names inside
    /// `import "…"`.
    ///
    /// ```
    /// use gaugebook::script::{Session, SessionOptions};
    /// let mut s = Session::new(SessionOptions::default())?;
    /// s.eval_cell("let rated = q(\"2 mV/V\");", "cell[1]")?;
    /// let c = s.completions("rat", 3);
    /// assert!(c.matches.contains(&"rated".to_string()));
    /// assert!(s.completions("q(\"1 kN\").t", 11).matches.contains(&"to".to_string()));
    /// # Ok::<(), gaugebook::script::ScriptError>(())
    /// ```
    pub fn completions(&self, code: &str, cursor: usize) -> Completions {
        super::complete::complete(self, code, cursor)
    }

    /// The reference text of the function, variable or module under (or just before) the
    /// cursor (a character offset), as markdown.
    ///
    /// ```
    /// use gaugebook::script::{Session, SessionOptions};
    /// let mut s = Session::new(SessionOptions::default())?;
    /// let doc = s.inspect("bridge(", 6).expect("bridge is documented");
    /// assert!(doc.contains("bridge("));
    /// # Ok::<(), gaugebook::script::ScriptError>(())
    /// ```
    pub fn inspect(&self, code: &str, cursor: usize) -> Option<String> {
        super::complete::inspect(self, code, cursor)
    }

    /// Whether `code` can run as it is, by the Rhai parser.
    ///
    /// ```
    /// use gaugebook::script::{Completeness, Session};
    /// assert_eq!(Session::is_complete("let x = 1;"), Completeness::Complete);
    /// assert_eq!(Session::is_complete("fn f() {"), Completeness::Incomplete);
    /// assert_eq!(Session::is_complete("let s = \"abc"), Completeness::Incomplete);
    /// assert_eq!(Session::is_complete("let = ;"), Completeness::Invalid);
    /// ```
    pub fn is_complete(code: &str) -> Completeness {
        if code.trim().is_empty() {
            return Completeness::Complete;
        }
        if lex::unfinished(code) {
            return Completeness::Incomplete;
        }
        match Engine::new_raw().compile(code) {
            Ok(_) => Completeness::Complete,
            Err(e) if matches!(e.err_type(), rhai::ParseErrorType::UnexpectedEOF) => {
                Completeness::Incomplete
            }
            Err(_) => Completeness::Invalid,
        }
    }

    pub(crate) fn scope(&self) -> &Scope<'static> {
        &self.scope
    }

    pub(crate) fn lib(&self) -> &AST {
        &self.lib
    }

    pub(crate) fn modules(&self) -> &BTreeMap<String, Shared<Module>> {
        &self.modules
    }

    pub(crate) fn names(&self) -> &Names {
        &self.names
    }

    pub(crate) fn resolver(&self) -> &Resolver {
        &self.resolver
    }
}

fn panic_error(payload: Box<dyn std::any::Any + Send>, origin: &str) -> ScriptError {
    let what = payload
        .downcast_ref::<&str>()
        .map(|s| s.to_string())
        .or_else(|| payload.downcast_ref::<String>().cloned())
        .unwrap_or_else(|| "unknown panic".to_string());
    ScriptError::bare(
        "Panic",
        format!("internal error in a native function (please report it): {what}"),
        origin,
    )
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn a_panic_in_a_native_function_is_an_error_and_the_session_lives() {
        let mut s = Session::new(SessionOptions::default()).unwrap();
        s.engine
            .register_fn("boom", || -> rhai::INT { panic!("boom at the bridge") });
        let e = s.eval_cell("let a = 41; boom()", "c").unwrap_err();
        assert_eq!(e.kind, "Panic");
        assert!(e.message.contains("boom at the bridge"), "{}", e.message);
        let out = s.eval_cell("a + 1", "c").unwrap();
        assert_eq!(out.value.unwrap().get("text/plain"), Some("42"));
    }

    #[test]
    fn session_can_move_to_another_thread() {
        fn is_send<T: Send>() {}
        is_send::<Session>();
        fn is_send_sync<T: Send + Sync>() {}
        is_send_sync::<InterruptHandle>();
    }
}
