//! Where a script's output goes: `print`, `debug`, `display` and `clear_output` all reach one
//! [`OutputSink`], which the front-end chooses (standard streams for the runner, iopub messages
//! for the kernel, a buffer for tests) and may swap between cells.
//!
//! Values become [`MimeBundle`]s through the engine: a type that registers `to_mime` (a map of
//! MIME type → text) shows richly; everything else shows its `to_string`.

use std::io::Write;
use std::sync::{Arc, Mutex, RwLock};

use rhai::{Dynamic, ImmutableString, Map, NativeCallContext};

use crate::MimeBundle;

/// Receives a running script's output.
/// A sink of our own, counting printed lines:
///
/// ```
/// use std::sync::{Arc, atomic::{AtomicUsize, Ordering}};
/// use gaugebook::{MimeBundle, script::{OutputSink, Session, SessionOptions}};
/// #[derive(Default)]
/// struct Lines(AtomicUsize);
/// impl OutputSink for Lines {
///     fn stdout(&self, text: &str) { self.0.fetch_add(text.matches('\n').count(), Ordering::SeqCst); }
///     fn stderr(&self, _: &str) {}
///     fn display(&self, _: MimeBundle, _: Option<String>, _: bool) {}
///     fn clear_output(&self, _: bool) {}
/// }
/// let lines = Arc::new(Lines::default());
/// let mut s = Session::new(SessionOptions::default())?;
/// s.set_output(lines.clone());
/// s.eval_cell("for i in 0..3 { print(i) }", "cell[1]")?;
/// assert_eq!(lines.0.load(Ordering::SeqCst), 3);
/// # Ok::<(), gaugebook::script::ScriptError>(())
/// ```
pub trait OutputSink: Send + Sync {
    /// Text printed with `print` (each call ends with a newline).
    fn stdout(&self, text: &str);
    /// Text printed with `debug` or `eprint`, and warnings.
    fn stderr(&self, text: &str);
    /// A rich value from `display(x)`; `display_id` names a view that later `update` calls
    /// (`update_display(x, id)`) replace in place.
    fn display(&self, bundle: MimeBundle, display_id: Option<String>, update: bool);
    /// `clear_output(wait)`: clear the cell's output (when `wait`, just before the next output).
    fn clear_output(&self, wait: bool);
    /// `input(prompt)`: one line from the person running the script (without its line end),
    /// or why there is none. `password` asks the front-end not to echo it. The default has no
    /// one to ask, so scripts run headless get a clear error instead of waiting forever.
    fn input(&self, prompt: &str, password: bool) -> Result<String, String> {
        let _ = (prompt, password);
        Err("this front-end has no one to ask for input".to_string())
    }
}

/// Writes to the process's standard output and error; `display` prints `text/plain`.
///
/// ```
/// use gaugebook::script::{Session, SessionOptions, StdSink};
/// let mut s = Session::new(SessionOptions::default())?;
/// s.set_output(std::sync::Arc::new(StdSink));
/// s.eval_cell("print(q(\"350 ohm\"))", "cell[1]")?;
/// # Ok::<(), gaugebook::script::ScriptError>(())
/// ```
#[derive(Clone, Copy, Debug, Default)]
pub struct StdSink;

impl OutputSink for StdSink {
    fn stdout(&self, text: &str) {
        let mut out = std::io::stdout().lock();
        // A closed pipe (`gaugebook run x | head`) is not the script's error; drop the text.
        let _ = out.write_all(text.as_bytes()).and_then(|()| out.flush());
    }
    fn stderr(&self, text: &str) {
        let _ = std::io::stderr().lock().write_all(text.as_bytes());
    }
    fn display(&self, bundle: MimeBundle, _id: Option<String>, _update: bool) {
        let mut text = bundle.get("text/plain").unwrap_or_default().to_string();
        text.push('\n');
        self.stdout(&text);
    }
    fn clear_output(&self, _wait: bool) {}
    fn input(&self, prompt: &str, _password: bool) -> Result<String, String> {
        self.stdout(prompt);
        let mut line = String::new();
        match std::io::stdin().read_line(&mut line) {
            Ok(0) => Err("standard input is at its end".to_string()),
            Ok(_) => Ok(line.trim_end_matches(['\n', '\r']).to_string()),
            Err(e) => Err(format!("cannot read standard input: {e}")),
        }
    }
}

/// One event recorded by a [`CaptureSink`].
///
/// ```
/// use std::sync::Arc;
/// use gaugebook::script::{CaptureSink, OutputEvent, Session, SessionOptions};
/// let sink = Arc::new(CaptureSink::default());
/// let mut s = Session::new(SessionOptions::default())?;
/// s.set_output(sink.clone());
/// s.eval_cell("print(1); display(q(\"2 V\")); clear_output(true)", "cell[1]")?;
/// let ev = sink.events();
/// assert_eq!(ev[0], OutputEvent::Stdout("1\n".into()));
/// assert!(matches!(&ev[1], OutputEvent::Display { bundle, update: false, .. } if bundle.get("text/plain") == Some("2 V")));
/// assert_eq!(ev[2], OutputEvent::Clear { wait: true });
/// # Ok::<(), gaugebook::script::ScriptError>(())
/// ```
#[derive(Clone, Debug, PartialEq)]
pub enum OutputEvent {
    /// `print` text.
    Stdout(String),
    /// `debug` text.
    Stderr(String),
    /// A `display` call.
    Display {
        /// The value's representations.
        bundle: MimeBundle,
        /// Its display id, if any.
        display_id: Option<String>,
        /// True for `update_display`.
        update: bool,
    },
    /// A `clear_output` call.
    Clear {
        /// Wait for the next output before clearing.
        wait: bool,
    },
}

/// Records every event, for tests and for front-ends that forward output after a cell.
///
/// ```
/// use std::sync::Arc;
/// use gaugebook::script::{CaptureSink, Session, SessionOptions};
/// let sink = Arc::new(CaptureSink::default());
/// let mut s = Session::new(SessionOptions::default())?;
/// s.set_output(sink.clone());
/// s.eval_cell("print(q(\"2 kN\"))", "cell")?;
/// assert_eq!(sink.stdout_text(), "2 kN\n");
/// # Ok::<(), gaugebook::script::ScriptError>(())
/// ```
#[derive(Debug, Default)]
pub struct CaptureSink {
    events: Mutex<Vec<OutputEvent>>,
}

impl CaptureSink {
    /// Every event so far, in order.
    ///
    /// ```
    /// use std::sync::Arc;
    /// use gaugebook::script::{CaptureSink, OutputEvent, Session, SessionOptions};
    /// let sink = Arc::new(CaptureSink::default());
    /// let mut s = Session::new(SessionOptions::default())?;
    /// s.set_output(sink.clone());
    /// s.eval_cell("print(\"a\"); print(\"b\")", "cell[1]")?;
    /// assert_eq!(sink.events().len(), 2);
    /// # Ok::<(), gaugebook::script::ScriptError>(())
    /// ```
    pub fn events(&self) -> Vec<OutputEvent> {
        self.events.lock().map(|e| e.clone()).unwrap_or_default()
    }

    /// All `print` text so far, concatenated.
    ///
    /// ```
    /// use std::sync::Arc;
    /// use gaugebook::script::{CaptureSink, OutputEvent, Session, SessionOptions};
    /// let sink = Arc::new(CaptureSink::default());
    /// let mut s = Session::new(SessionOptions::default())?;
    /// s.set_output(sink.clone());
    /// s.eval_cell("print(\"a\"); debug(\"d\"); print(\"b\")", "cell[1]")?;
    /// assert_eq!(sink.stdout_text(), "a\nb\n");
    /// # Ok::<(), gaugebook::script::ScriptError>(())
    /// ```
    pub fn stdout_text(&self) -> String {
        self.events()
            .into_iter()
            .filter_map(|e| match e {
                OutputEvent::Stdout(t) => Some(t),
                _ => None,
            })
            .collect()
    }

    /// All `debug` text so far, concatenated.
    ///
    /// ```
    /// use std::sync::Arc;
    /// use gaugebook::script::{CaptureSink, OutputEvent, Session, SessionOptions};
    /// let sink = Arc::new(CaptureSink::default());
    /// let mut s = Session::new(SessionOptions::default())?;
    /// s.set_output(sink.clone());
    /// s.eval_cell("debug(\"check\")", "cell[1]")?;
    /// assert!(sink.stderr_text().contains("check"));
    /// # Ok::<(), gaugebook::script::ScriptError>(())
    /// ```
    pub fn stderr_text(&self) -> String {
        self.events()
            .into_iter()
            .filter_map(|e| match e {
                OutputEvent::Stderr(t) => Some(t),
                _ => None,
            })
            .collect()
    }

    fn push(&self, e: OutputEvent) {
        if let Ok(mut v) = self.events.lock() {
            v.push(e);
        }
    }
}

impl OutputSink for CaptureSink {
    fn stdout(&self, text: &str) {
        self.push(OutputEvent::Stdout(text.to_string()));
    }
    fn stderr(&self, text: &str) {
        self.push(OutputEvent::Stderr(text.to_string()));
    }
    fn display(&self, bundle: MimeBundle, display_id: Option<String>, update: bool) {
        self.push(OutputEvent::Display {
            bundle,
            display_id,
            update,
        });
    }
    fn clear_output(&self, wait: bool) {
        self.push(OutputEvent::Clear { wait });
    }
}

/// The engine's handle on the current sink; the session swaps what it points to.
#[derive(Clone)]
pub(crate) struct SinkSlot(Arc<RwLock<Arc<dyn OutputSink>>>);

impl Default for SinkSlot {
    fn default() -> Self {
        SinkSlot(Arc::new(RwLock::new(Arc::new(StdSink))))
    }
}

impl SinkSlot {
    pub(crate) fn set(&self, sink: Arc<dyn OutputSink>) {
        if let Ok(mut s) = self.0.write() {
            *s = sink;
        }
    }

    pub(crate) fn get(&self) -> Arc<dyn OutputSink> {
        match self.0.read() {
            Ok(s) => s.clone(),
            // A poisoned lock means a sink panicked earlier; keep working with the old value.
            Err(p) => p.into_inner().clone(),
        }
    }
}

/// The MIME bundle of a value: its `to_mime` map when its type registers one, else its
/// `to_string`.
pub(crate) fn mime_of(ctx: &NativeCallContext, value: &mut Dynamic) -> MimeBundle {
    // Call on a copy: a by-value native function takes its argument out of the slot.
    let mut arg = value.clone();
    if let Ok(m) = ctx.call_native_fn_raw("to_mime", false, &mut [&mut arg]) {
        if let Some(map) = m.try_cast::<Map>() {
            let mut b = MimeBundle::default();
            for (k, v) in map {
                b = b.with(k.as_str(), v.to_string());
            }
            if b.get("text/plain").is_none() {
                b = b.with("text/plain", text_of(ctx, value));
            }
            return b;
        }
    }
    MimeBundle::text(text_of(ctx, value))
}

/// The text of a value as `print` shows it.
pub(crate) fn text_of(ctx: &NativeCallContext, value: &mut Dynamic) -> String {
    if value.is_string() {
        return value.to_string();
    }
    let mut arg = value.clone();
    match ctx.call_native_fn_raw("to_string", false, &mut [&mut arg]) {
        Ok(s) => s
            .try_cast::<ImmutableString>()
            .map(|s| s.to_string())
            .unwrap_or_default(),
        Err(_) => value.to_string(),
    }
}
