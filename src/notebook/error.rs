//! The notebook layer's error: what went wrong reading, running or writing a notebook, with
//! the file (and, for malformed JSON, the line and column) it concerns.

use std::path::PathBuf;

use thiserror::Error;

/// An error from [`run_notebook`](crate::run_notebook) or
/// [`verify_notebook`](crate::verify_notebook).
///
/// ```
/// let e = gaugebook::run_notebook("no/such.ipynb", &Default::default()).unwrap_err();
/// assert!(matches!(e, gaugebook::NotebookError::Io { .. }));
/// assert!(e.to_string().starts_with("cannot read no/such.ipynb"));
/// ```
#[derive(Debug, Error)]
#[non_exhaustive]
pub enum NotebookError {
    /// A file could not be read or written.
    #[error("cannot {action} {}: {source}", path.display())]
    Io {
        /// `read`, `write` or `rename into place`.
        action: &'static str,
        /// The file concerned.
        path: PathBuf,
        /// The operating system's error.
        source: std::io::Error,
    },
    /// The file is not valid JSON.
    #[error("{}:{line}:{column}: malformed notebook JSON: {message}", path.display())]
    Json {
        /// The notebook file.
        path: PathBuf,
        /// Line of the fault, 1-based.
        line: usize,
        /// Column of the fault, 1-based.
        column: usize,
        /// serde_json's description.
        message: String,
    },
    /// The JSON is valid but is not an nbformat 4 notebook.
    #[error("{}: not an nbformat 4 notebook: {message}", path.display())]
    Format {
        /// The notebook file.
        path: PathBuf,
        /// What was expected and what was found.
        message: String,
    },
    /// The scripting session could not start.
    #[error("cannot start a scripting session: {0}")]
    Session(String),
    /// A cell failed and errors were not allowed; nothing was written.
    #[error("{}: cell {cell} failed (nothing written):\n{rendered}", path.display())]
    CellFailed {
        /// The notebook file.
        path: PathBuf,
        /// 1-based position of the cell in the notebook (markdown cells counted).
        cell: usize,
        /// The error kind (`UnitError`, `SyntaxError` …).
        kind: String,
        /// The error rendered with its source line and caret.
        rendered: String,
    },
}

impl NotebookError {
    pub(crate) fn io(
        action: &'static str,
        path: impl Into<PathBuf>,
        source: std::io::Error,
    ) -> Self {
        NotebookError::Io {
            action,
            path: path.into(),
            source,
        }
    }

    pub(crate) fn format(path: impl Into<PathBuf>, message: impl Into<String>) -> Self {
        NotebookError::Format {
            path: path.into(),
            message: message.into(),
        }
    }
}
