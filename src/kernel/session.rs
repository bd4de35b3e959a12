//! The Rhai session as the kernel's engine: [`Backend`] for
//! [`Session`](crate::script::Session), with its output routed to IOPub and its errors turned
//! into Jupyter's ename / evalue / traceback.

use std::path::Path;
use std::sync::Arc;

use super::KernelError;
use super::backend::{Backend, CellError, CodeStatus, CompletionSet, Interrupter, KernelOutput};
use crate::MimeBundle;
use crate::script::{Completeness, OutputSink, ScriptError, Session, SessionOptions};

/// A session served by the kernel.
pub(crate) struct SessionBackend(Session);

/// Forwards the session's output to the kernel's sink.
struct Forward(Arc<dyn KernelOutput>);

impl OutputSink for Forward {
    fn stdout(&self, text: &str) {
        self.0.stdout(text);
    }
    fn stderr(&self, text: &str) {
        self.0.stderr(text);
    }
    fn display(&self, bundle: MimeBundle, display_id: Option<String>, update: bool) {
        self.0.display(bundle, display_id, update);
    }
    fn clear_output(&self, wait: bool) {
        self.0.clear_output(wait);
    }
    fn input(&self, prompt: &str, password: bool) -> Result<String, String> {
        self.0.input(prompt, password)
    }
}

/// A script error as Jupyter shows it: the kind as ename, the message as evalue, and the
/// rendered report (position, source line, caret, call sites) as the traceback.
pub(crate) fn cell_error(e: &ScriptError) -> CellError {
    CellError {
        ename: e.kind.clone(),
        evalue: e.message.clone(),
        traceback: e.render().lines().map(str::to_string).collect(),
    }
}

impl Backend for SessionBackend {
    fn set_output(&mut self, output: Arc<dyn KernelOutput>) {
        self.0.set_output(Arc::new(Forward(output)));
    }

    fn execute(&mut self, code: &str, origin: &str) -> Result<Option<MimeBundle>, CellError> {
        self.0
            .eval_cell(code, origin)
            .map(|out| out.value)
            .map_err(|e| cell_error(&e))
    }

    fn interrupter(&self) -> Interrupter {
        let handle = self.0.interrupt_handle();
        Arc::new(move || handle.interrupt())
    }

    fn complete(&self, code: &str, cursor: usize) -> CompletionSet {
        let c = self.0.completions(code, cursor);
        CompletionSet {
            start: c.start,
            end: c.end,
            matches: c.matches,
        }
    }

    fn inspect(&self, code: &str, cursor: usize) -> Option<String> {
        self.0.inspect(code, cursor)
    }

    fn is_complete(&self, code: &str) -> CodeStatus {
        match Session::is_complete(code) {
            Completeness::Complete => CodeStatus::Complete,
            Completeness::Incomplete => CodeStatus::Incomplete,
            Completeness::Invalid => CodeStatus::Invalid,
        }
    }
}

/// Serves Gaugebook's Rhai session to the Jupyter client that wrote `connection_file` (the
/// command `gaugebook kernel run CONNECTION_FILE`), until a shutdown request.
///
/// ```no_run
/// gaugebook::run_kernel(std::path::Path::new("/run/user/1000/jupyter/kernel-1.json"))?;
/// # Ok::<(), gaugebook::KernelError>(())
/// ```
pub fn run_kernel(connection_file: &Path) -> Result<(), KernelError> {
    super::run_kernel_with(connection_file, || {
        Session::new(SessionOptions::default())
            .map(SessionBackend)
            .map_err(|e| KernelError::Backend(e.render()))
    })
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn errors_carry_kind_message_and_caret() {
        let mut s = SessionBackend(Session::new(SessionOptions::default()).unwrap());
        let e = s
            .execute("let a = 1;\nthrow \"boom\"", "cell[1]")
            .unwrap_err();
        assert_eq!(e.ename, "RuntimeError");
        assert!(
            e.traceback[0].starts_with("cell[1]:2:"),
            "{:?}",
            e.traceback
        );
        assert!(
            e.traceback.iter().any(|l| l.contains('^')),
            "{:?}",
            e.traceback
        );
        assert_eq!(
            s.execute("a + 1", "cell[2]")
                .unwrap()
                .unwrap()
                .get("text/plain"),
            Some("2")
        );
    }
}
