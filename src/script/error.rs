//! Script errors: the fault a native function raises inside a script, and the [`ScriptError`] a
//! front-end receives, resolved to a file, line and column with the source line and a caret.
//!
//! Rhai wraps an error raised inside a script function or a module in `ErrorInFunctionCall` /
//! `ErrorInModule` layers, each carrying the call site. [`ScriptError`] points at the innermost
//! place (where the fault happened) and keeps the outer call sites as a trace.

use std::collections::HashMap;
use std::fmt;
use std::sync::{Arc, RwLock};

use rhai::{Dynamic, EvalAltResult, ParseError, Position};
use thiserror::Error;

use crate::{PhysicsError, UnitError};

/// The value a native function throws: a kind name (`"UnitError"`) and a message.
///
/// Scripts can catch it: `try { … } catch (e) { print(e.kind); print(e.message) }`.
#[derive(Clone, Debug, PartialEq)]
pub(crate) struct Fault {
    pub(crate) kind: String,
    pub(crate) message: String,
}

impl fmt::Display for Fault {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        f.write_str(&self.message)
    }
}

/// A catchable script error of the given kind; Rhai fills in the call position.
pub(crate) fn fault(kind: &str, message: impl Into<String>) -> Box<EvalAltResult> {
    let f = Fault {
        kind: kind.to_string(),
        message: message.into(),
    };
    Box::new(EvalAltResult::ErrorRuntime(
        Dynamic::from(f),
        Position::NONE,
    ))
}

impl From<UnitError> for Box<EvalAltResult> {
    fn from(e: UnitError) -> Self {
        fault("UnitError", e.to_string())
    }
}

impl From<PhysicsError> for Box<EvalAltResult> {
    fn from(e: PhysicsError) -> Self {
        fault("PhysicsError", e.to_string())
    }
}

/// One outer call site of an error: where the failing function or module was called from.
///
/// ```
/// use gaugebook::script::{Session, SessionOptions};
/// let mut s = Session::new(SessionOptions::default())?;
/// s.eval_cell("fn half(x) { x / 2 + 1.0 * V }", "cell[1]")?;
/// let e = s.eval_cell("half(q(\"4 N\"))", "cell[2]").unwrap_err();
/// assert_eq!(e.kind, "UnitError");
/// let f = &e.trace[0];
/// assert_eq!((f.called.as_str(), f.origin.as_str(), f.line, f.column), ("half", "cell[2]", 1, 1));
/// # Ok::<(), gaugebook::script::ScriptError>(())
/// ```
#[derive(Clone, Debug, PartialEq, Eq)]
pub struct TraceFrame {
    /// What was called: a function name or `import "path"`.
    pub called: String,
    /// The file or cell holding the call.
    pub origin: String,
    /// Line of the call (1-based; 0 when unknown).
    pub line: usize,
    /// Column of the call (1-based; 0 when unknown).
    pub column: usize,
}

/// An error from compiling or running a script, resolved to its place in the source.
///
/// ```
/// use gaugebook::script::{Session, SessionOptions};
/// let mut s = Session::new(SessionOptions::default())?;
/// let e = s.eval_cell("let r = q(\"350 ohm\");\nr + 5.0 * V", "cell[1]").unwrap_err();
/// assert_eq!(e.kind, "UnitError");
/// assert_eq!((e.line, e.column), (2, 3));
/// assert!(e.render().starts_with("cell[1]:2:3: cannot add 350 Ω and 5 V"));
/// # Ok::<(), gaugebook::script::ScriptError>(())
/// ```
#[derive(Clone, Debug, PartialEq, Eq, Error)]
#[error("{origin}:{line}:{column}: {message}")]
pub struct ScriptError {
    /// The kind of error: `UnitError`, `PhysicsError`, `ArgumentError`, `SyntaxError`,
    /// `TypeError`, `FunctionNotFound`, `VariableNotFound`, `ModuleNotFound`, `Interrupted`,
    /// `RuntimeError` (a script's own `throw`), `Panic` (a bug in a native function) …
    pub kind: String,
    /// What went wrong, lowercase, naming what was expected and found.
    pub message: String,
    /// The file or cell name where the error is.
    pub origin: String,
    /// Line, 1-based (0 when not known).
    pub line: usize,
    /// Column, 1-based (0 when not known).
    pub column: usize,
    /// The text of that line, when the source is known.
    pub source_line: Option<String>,
    /// Outer call sites, innermost first.
    pub trace: Vec<TraceFrame>,
}

impl ScriptError {
    /// An error with no position (setup failures, panics).
    pub(crate) fn bare(kind: &str, message: impl Into<String>, origin: &str) -> ScriptError {
        ScriptError {
            kind: kind.to_string(),
            message: message.into(),
            origin: origin.to_string(),
            line: 0,
            column: 0,
            source_line: None,
            trace: Vec::new(),
        }
    }

    /// `FILE:LINE:COL: message`, then the source line with a caret under the column followed
    /// by the kind, then one `called from` line per outer call site.
    ///
    /// ```
    /// use gaugebook::script::{Session, SessionOptions};
    /// let mut s = Session::new(SessionOptions::default())?;
    /// let e = s.eval_cell("q(\"5 furlong\")", "a.rhai").unwrap_err();
    /// let text = e.render();
    /// assert!(text.starts_with("a.rhai:1:1: unknown unit"), "{text}");
    /// assert!(text.contains("q(\"5 furlong\")\n"), "{text}");
    /// assert!(text.contains("^ UnitError"), "{text}");
    /// # Ok::<(), gaugebook::script::ScriptError>(())
    /// ```
    pub fn render(&self) -> String {
        let mut out = format!(
            "{}:{}:{}: {}\n",
            self.origin, self.line, self.column, self.message
        );
        match &self.source_line {
            Some(src) if self.line > 0 => {
                let gutter = self.line.to_string();
                let pad = " ".repeat(gutter.len());
                out.push_str(&format!("{gutter} | {src}\n"));
                // Keep tabs so the caret lines up under the same characters.
                let lead: String = src
                    .chars()
                    .take(self.column.saturating_sub(1))
                    .map(|c| if c == '\t' { '\t' } else { ' ' })
                    .collect();
                out.push_str(&format!("{pad} | {lead}^ {}\n", self.kind));
            }
            _ => out.push_str(&format!("  ({})\n", self.kind)),
        }
        for f in &self.trace {
            out.push_str(&format!(
                "  called from {} at {}:{}:{}\n",
                f.called, f.origin, f.line, f.column
            ));
        }
        out
    }
}

/// Texts of every cell, file and module the session has seen, so errors can quote the line;
/// and the origin of each script function, so an error inside a function defined in an earlier
/// cell points at that cell.
#[derive(Clone, Debug, Default)]
pub(crate) struct SourceMap {
    inner: Arc<RwLock<SourceMapInner>>,
}

#[derive(Debug, Default)]
struct SourceMapInner {
    texts: HashMap<String, Arc<str>>,
    fn_origins: HashMap<String, String>,
    /// Import path as written → the file it resolved to.
    modules: HashMap<String, String>,
}

impl SourceMap {
    pub(crate) fn add_text(&self, origin: &str, text: &str) {
        if let Ok(mut m) = self.inner.write() {
            m.texts.insert(origin.to_string(), Arc::from(text));
        }
    }

    pub(crate) fn add_fn(&self, name: &str, origin: &str) {
        if let Ok(mut m) = self.inner.write() {
            m.fn_origins.insert(name.to_string(), origin.to_string());
        }
    }

    pub(crate) fn add_module(&self, import_path: &str, file: &str) {
        if let Ok(mut m) = self.inner.write() {
            m.modules.insert(import_path.to_string(), file.to_string());
        }
    }

    fn line(&self, origin: &str, line: usize) -> Option<String> {
        let m = self.inner.read().ok()?;
        let text = m.texts.get(origin)?;
        text.lines().nth(line.checked_sub(1)?).map(str::to_string)
    }

    fn fn_origin(&self, name: &str) -> Option<String> {
        self.inner.read().ok()?.fn_origins.get(name).cloned()
    }

    fn module_file(&self, path: &str) -> Option<String> {
        self.inner.read().ok()?.modules.get(path).cloned()
    }

    fn knows(&self, origin: &str) -> bool {
        self.inner
            .read()
            .map(|m| m.texts.contains_key(origin))
            .unwrap_or(false)
    }

    /// Resolves a Rhai error raised while running `origin`.
    pub(crate) fn resolve(&self, err: &EvalAltResult, origin: &str) -> ScriptError {
        let mut trace = Vec::new();
        let mut origin = origin.to_string();
        let mut e = err;
        loop {
            match e {
                EvalAltResult::ErrorInFunctionCall(name, src, inner, pos) => {
                    trace.push(frame(name, &origin, *pos));
                    // A function from a module names the module's source; a function from an
                    // earlier cell is only known to our own map.
                    origin = if !src.is_empty() && src != &origin && self.knows(src) {
                        src.clone()
                    } else {
                        self.fn_origin(name).unwrap_or(origin)
                    };
                    e = inner;
                }
                EvalAltResult::ErrorInModule(path, inner, pos) => {
                    trace.push(frame(&format!("import \"{path}\""), &origin, *pos));
                    origin = self.module_file(path).unwrap_or_else(|| path.clone());
                    e = inner;
                }
                _ => break,
            }
        }
        trace.reverse();
        let (kind, message) = describe(e);
        let pos = e.position();
        let mut out = ScriptError::bare(&kind, message, &origin);
        out.line = pos.line().unwrap_or(0);
        out.column = pos.position().unwrap_or(0);
        out.source_line = self.line(&origin, out.line);
        out.trace = trace;
        out
    }

    /// Resolves a parse error in `origin`.
    pub(crate) fn resolve_parse(&self, err: &ParseError, origin: &str) -> ScriptError {
        let mut out = ScriptError::bare(
            "SyntaxError",
            lowercase_first(&err.err_type().to_string()),
            origin,
        );
        let pos = err.position();
        out.line = pos.line().unwrap_or(0);
        out.column = pos.position().unwrap_or(0);
        out.source_line = self.line(origin, out.line);
        out
    }
}

fn frame(called: &str, origin: &str, pos: Position) -> TraceFrame {
    TraceFrame {
        called: called.to_string(),
        origin: origin.to_string(),
        line: pos.line().unwrap_or(0),
        column: pos.position().unwrap_or(0),
    }
}

fn lowercase_first(s: &str) -> String {
    let mut c = s.chars();
    match c.next() {
        // Keep acronyms and symbols as they are; only lower an initial capital of a word.
        Some(f) if f.is_uppercase() && c.clone().next().is_some_and(char::is_lowercase) => {
            f.to_lowercase().chain(c).collect()
        }
        _ => s.to_string(),
    }
}

/// Rhai's own messages end with " (line L, position C)"; the position is reported separately.
fn without_position(m: &str) -> String {
    match m.rfind(" (line ") {
        Some(i) if m.ends_with(')') => m[..i].to_string(),
        _ => m.to_string(),
    }
}

/// Registers the `Error` type scripts see in `catch (e)`: `e.kind`, `e.message`, `print(e)`.
pub(crate) fn register(engine: &mut rhai::Engine) {
    engine.register_type_with_name::<Fault>("Error");
    engine.register_get("kind", |f: &mut Fault| f.kind.clone());
    engine.register_get("message", |f: &mut Fault| f.message.clone());
    engine.register_fn("to_string", |f: &mut Fault| {
        format!("{}: {}", f.kind, f.message)
    });
    engine.register_fn("to_debug", |f: &mut Fault| {
        format!("{}: {}", f.kind, f.message)
    });
}

/// The kind name and message of an innermost Rhai error.
fn describe(e: &EvalAltResult) -> (String, String) {
    use EvalAltResult as E;
    let s = |k: &str, m: String| (k.to_string(), m);
    match e {
        E::ErrorRuntime(v, _) => match v.read_lock::<Fault>() {
            Some(f) => (f.kind.clone(), f.message.clone()),
            None => s("RuntimeError", v.to_string()),
        },
        E::ErrorParsing(p, _) => s("SyntaxError", lowercase_first(&p.to_string())),
        E::ErrorFunctionNotFound(sig, _) => s("FunctionNotFound", format!("no function `{sig}`")),
        E::ErrorVariableNotFound(v, _) => s("VariableNotFound", format!("unknown variable `{v}`")),
        E::ErrorPropertyNotFound(p, _) => s("PropertyNotFound", format!("unknown property `{p}`")),
        E::ErrorModuleNotFound(m, _) => s("ModuleNotFound", format!("module `{m}` not found")),
        E::ErrorMismatchDataType(expected, found, _) => {
            s("TypeError", format!("expected {expected}, found {found}"))
        }
        E::ErrorMismatchOutputType(expected, found, _) => s(
            "TypeError",
            format!("expected a result of type {expected}, found {found}"),
        ),
        E::ErrorArrayBounds(len, i, _) => s(
            "IndexError",
            format!("index {i} out of bounds for an array of length {len}"),
        ),
        E::ErrorStringBounds(len, i, _) => s(
            "IndexError",
            format!("index {i} out of bounds for a string of length {len}"),
        ),
        E::ErrorIndexNotFound(k, _) => s("IndexError", format!("no entry {k}")),
        E::ErrorArithmetic(m, _) => s("ArithmeticError", lowercase_first(m)),
        E::ErrorTerminated(..) => s("Interrupted", "interrupted".to_string()),
        E::ErrorStackOverflow(_) => s(
            "StackOverflow",
            "stack overflow (recursion too deep)".to_string(),
        ),
        E::ErrorAssignmentToConstant(v, _) => s(
            "AssignmentError",
            format!("cannot assign to constant `{v}`"),
        ),
        other => s(
            "RuntimeError",
            lowercase_first(&without_position(&other.to_string())),
        ),
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn render_puts_the_caret_under_the_column() {
        let e = ScriptError {
            kind: "UnitError".into(),
            message: "cannot add 5 V and 350 Ω".into(),
            origin: "a.rhai".into(),
            line: 3,
            column: 5,
            source_line: Some("x = v + r;".into()),
            trace: vec![],
        };
        assert_eq!(
            e.render(),
            "a.rhai:3:5: cannot add 5 V and 350 Ω\n3 | x = v + r;\n  |     ^ UnitError\n"
        );
    }

    #[test]
    fn lowercase_only_lowers_words() {
        assert_eq!(lowercase_first("Expecting ')'"), "expecting ')'");
        assert_eq!(lowercase_first("EOF"), "EOF");
    }
}
