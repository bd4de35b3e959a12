//! What the kernel needs from a language engine, as a trait, so the protocol can be driven by the
//! Rhai session in production and by a small fake in the protocol tests.

use std::sync::Arc;

use crate::MimeBundle;

/// Where a running cell sends its output; the kernel turns each call into an IOPub message.
///
/// ```
/// use gaugebook::{KernelOutput, MimeBundle};
/// struct Quiet;
/// impl KernelOutput for Quiet {
///     fn stdout(&self, _: &str) {}
///     fn stderr(&self, _: &str) {}
///     fn display(&self, _: MimeBundle, _: Option<String>, _: bool) {}
///     fn clear_output(&self, _: bool) {}
/// }
/// Quiet.stdout("nothing");
/// ```
pub trait KernelOutput: Send + Sync {
    /// Text on standard output (a `stream` message named `stdout`).
    fn stdout(&self, text: &str);
    /// Text on standard error (a `stream` message named `stderr`).
    fn stderr(&self, text: &str);
    /// A rich value: `display_data`, or `update_display_data` when `update` is set and a
    /// display id names the earlier output to replace.
    fn display(&self, bundle: MimeBundle, display_id: Option<String>, update: bool);
    /// Clears the cell's output (`wait`: only when the next output arrives).
    fn clear_output(&self, wait: bool);
    /// Asks the client for a line of input (an `input_request` on the stdin channel) and waits
    /// for the answer; an error says why there is none (the client does not allow input, the
    /// cell was interrupted). The default has no client to ask.
    fn input(&self, prompt: &str, password: bool) -> Result<String, String> {
        let _ = (prompt, password);
        Err("this kernel front-end cannot ask for input".to_string())
    }
}

/// A failed cell, as Jupyter shows it.
///
/// ```
/// let e = gaugebook::CellError { ename: "UnitError".into(), evalue: "m + s".into(), traceback: vec![] };
/// assert_eq!(e.ename, "UnitError");
/// ```
#[derive(Clone, Debug, PartialEq)]
pub struct CellError {
    /// The error's kind name.
    pub ename: String,
    /// The one-line message.
    pub evalue: String,
    /// The rendered report, one entry per line (source line and caret included).
    pub traceback: Vec<String>,
}

/// Whether a piece of code is ready to run (the `is_complete_request` answer).
///
/// ```
/// assert_ne!(gaugebook::CodeStatus::Complete, gaugebook::CodeStatus::Incomplete);
/// ```
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub enum CodeStatus {
    /// Runs as it is.
    Complete,
    /// Needs more lines (an open block, string or comment).
    Incomplete,
    /// Can never run (a syntax error more lines will not fix).
    Invalid,
}

/// Completion candidates for the text between `start` and `end` (character offsets into the code, as the protocol counts them since 5.2).
///
/// ```
/// let c = gaugebook::CompletionSet { start: 0, end: 2, matches: vec!["sqrt".into()] };
/// assert_eq!(c.matches.len(), 1);
/// ```
#[derive(Clone, Debug, Default, PartialEq)]
pub struct CompletionSet {
    /// First character replaced.
    pub start: usize,
    /// One past the last character replaced.
    pub end: usize,
    /// The candidates.
    pub matches: Vec<String>,
}

/// Stops the running cell; callable from any thread.
///
/// ```
/// use std::sync::{Arc, atomic::{AtomicBool, Ordering}};
/// let flag = Arc::new(AtomicBool::new(false));
/// let f = flag.clone();
/// let stop: gaugebook::Interrupter = Arc::new(move || f.store(true, Ordering::SeqCst));
/// std::thread::spawn(move || stop()).join().unwrap();
/// assert!(flag.load(Ordering::SeqCst));
/// ```
pub type Interrupter = Arc<dyn Fn() + Send + Sync>;

/// A language engine the kernel can serve. It lives on the kernel's execution thread, so it need
/// not be `Send`; only its [`Interrupter`] crosses threads.
///
/// ```
/// use std::sync::Arc;
/// use gaugebook::{Backend, CellError, CodeStatus, CompletionSet, Interrupter, KernelOutput, MimeBundle};
/// struct Echo;
/// impl Backend for Echo {
///     fn set_output(&mut self, _: Arc<dyn KernelOutput>) {}
///     fn execute(&mut self, code: &str, _: &str) -> Result<Option<MimeBundle>, CellError> {
///         Ok(Some(MimeBundle::text(code)))
///     }
///     fn interrupter(&self) -> Interrupter { Arc::new(|| {}) }
///     fn complete(&self, _: &str, cursor: usize) -> CompletionSet {
///         CompletionSet { start: cursor, end: cursor, matches: vec![] }
///     }
///     fn inspect(&self, _: &str, _: usize) -> Option<String> { None }
///     fn is_complete(&self, _: &str) -> CodeStatus { CodeStatus::Complete }
/// }
/// let mut e = Echo;
/// assert_eq!(e.execute("1", "cell")?.unwrap().get("text/plain"), Some("1"));
/// # Ok::<(), gaugebook::CellError>(())
/// ```
pub trait Backend {
    /// Routes the output of every later cell to `output`.
    fn set_output(&mut self, output: Arc<dyn KernelOutput>);
    /// Runs one cell; `origin` names it in error reports. `Ok(Some(v))` is the cell's value.
    fn execute(&mut self, code: &str, origin: &str) -> Result<Option<MimeBundle>, CellError>;
    /// A handle that stops the running cell.
    fn interrupter(&self) -> Interrupter;
    /// Completion candidates at character offset `cursor`.
    fn complete(&self, code: &str, cursor: usize) -> CompletionSet;
    /// The reference text for the name at character offset `cursor`, if it names something.
    fn inspect(&self, code: &str, cursor: usize) -> Option<String>;
    /// Whether `code` is ready to run.
    fn is_complete(&self, code: &str) -> CodeStatus;
}

impl std::fmt::Display for CellError {
    fn fmt(&self, f: &mut std::fmt::Formatter<'_>) -> std::fmt::Result {
        write!(f, "{}: {}", self.ename, self.evalue)
    }
}

impl std::error::Error for CellError {}
