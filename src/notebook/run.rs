//! Running a notebook headlessly: every code cell in order in one [`Session`], its output
//! captured the way a Jupyter front-end records it, then written back into the notebook.
//!
//! Recording follows what nbclient does with the kernel's messages: consecutive `print` (or
//! `debug`) text joins one `stream` output per name; `display` adds `display_data`; a display
//! id's `update_display` replaces every earlier output with that id in place, in any cell;
//! `clear_output()` empties the cell's outputs, `clear_output(true)` just before the next one;
//! the cell's value becomes an `execute_result` numbered like `In [n]`.

use std::collections::{BTreeMap, BTreeSet};
use std::path::{Path, PathBuf};
use std::sync::{Arc, Mutex};

use serde_json::{Map, Value};

use super::error::NotebookError;
use super::format::{CellKind, Notebook, Output};
use super::provenance::{Provenance, file_hash, inputs_of};
use crate::MimeBundle;
use crate::script::{OutputSink, Session, SessionOptions};

/// How to run a notebook.
///
/// ```
/// let o = gaugebook::RunOptions { allow_errors: true, ..Default::default() };
/// assert!(o.out.is_none());
/// ```
#[derive(Clone, Debug, Default)]
pub struct RunOptions {
    /// Where to write the result; `None` updates the notebook in place.
    pub out: Option<PathBuf>,
    /// Run every cell and record errors as outputs, instead of stopping at the first one.
    pub allow_errors: bool,
    /// The stdlib folder (default: the session's own search).
    pub stdlib_dir: Option<PathBuf>,
}

/// Runs every code cell of the notebook at `path` in order and writes the outputs and
/// provenance into it (or into `options.out`), atomically. Without `allow_errors`, the first
/// failing cell stops the run with [`NotebookError::CellFailed`] and nothing is written.
///
/// ```
/// let dir = std::env::temp_dir().join(format!("gaugebook-doc-run-{}", std::process::id()));
/// std::fs::create_dir_all(&dir).unwrap();
/// let mut nb = gaugebook::Notebook { cells: vec![gaugebook::Cell::code("a", "print(2 * q(\"1 kN\"));\n350.0 * ohm")],
///     metadata: Default::default() };
/// nb.write(dir.join("n.ipynb"))?;
/// let done = gaugebook::run_notebook(dir.join("n.ipynb"), &Default::default())?;
/// assert_eq!(done.cells[0].outputs.len(), 2);
/// assert_eq!(done.cells[0].execution_count, Some(1));
/// # Ok::<(), gaugebook::NotebookError>(())
/// ```
pub fn run_notebook(
    path: impl AsRef<Path>,
    options: &RunOptions,
) -> Result<Notebook, NotebookError> {
    let path = path.as_ref();
    let mut nb = Notebook::read(path)?;
    execute(&mut nb, path, options)?;
    nb.write(options.out.as_deref().unwrap_or(path))?;
    Ok(nb)
}

/// The folder a notebook's relative paths start from.
pub(crate) fn notebook_dir(path: &Path) -> PathBuf {
    match path.parent() {
        Some(d) if !d.as_os_str().is_empty() => d.to_path_buf(),
        _ => PathBuf::from("."),
    }
}

/// Runs the notebook in memory: outputs, execution counts and provenance are replaced.
pub(crate) fn execute(
    nb: &mut Notebook,
    path: &Path,
    options: &RunOptions,
) -> Result<(), NotebookError> {
    let dir = notebook_dir(path);
    let mut session = Session::new(SessionOptions {
        stdlib_dir: options.stdlib_dir.clone(),
        script_dir: Some(dir.clone()),
    })
    .map_err(|e| NotebookError::Session(e.render()))?;
    let recorder = Arc::new(Recorder::default());
    session.set_output(recorder.clone());

    let mut inputs = BTreeSet::new();
    let mut count = 0;
    let mut all: Vec<Vec<Recorded>> = vec![Vec::new(); nb.cells.len()];
    for i in 0..nb.cells.len() {
        let cell = &nb.cells[i];
        if cell.kind != CellKind::Code {
            continue;
        }
        let code = cell.source.clone();
        if code.trim().is_empty() {
            // Jupyter front-ends do not send empty cells to the kernel.
            nb.cells[i].execution_count = None;
            continue;
        }
        inputs.extend(inputs_of(&code, &dir));
        count += 1;
        recorder.start(std::mem::take(&mut all), i);
        let result = session.eval_cell(&code, &format!("cell[{count}]"));
        match result {
            Ok(out) => {
                if let Some(b) = out.value {
                    recorder.push(Recorded::plain(Output::ExecuteResult {
                        execution_count: Some(count),
                        data: data_of(&b),
                        metadata: Map::new(),
                    }));
                }
            }
            Err(e) => {
                if !options.allow_errors {
                    return Err(NotebookError::CellFailed {
                        path: path.to_path_buf(),
                        cell: i + 1,
                        kind: e.kind.clone(),
                        rendered: e.render(),
                    });
                }
                recorder.push(Recorded::plain(Output::Error {
                    ename: e.kind.clone(),
                    evalue: e.message.clone(),
                    traceback: e.render().lines().map(str::to_string).collect(),
                }));
            }
        }
        all = recorder.finish();
        nb.cells[i].execution_count = Some(count);
    }
    for (cell, outs) in nb.cells.iter_mut().zip(all) {
        if cell.kind == CellKind::Code {
            cell.outputs = outs.into_iter().map(|r| r.output).collect();
        }
    }
    let hashes: BTreeMap<String, String> = inputs
        .into_iter()
        .filter_map(|p| {
            let full = dir.join(&p);
            file_hash(&full).map(|h| (p, h))
        })
        .collect();
    Provenance::current(hashes).store(&mut nb.metadata);
    Ok(())
}

/// A MIME bundle as nbformat output data (all text, `image/png` base64).
fn data_of(b: &MimeBundle) -> BTreeMap<String, Value> {
    b.iter()
        .map(|(k, v)| (k.to_string(), Value::String(v.to_string())))
        .collect()
}

/// An output and, for `display(x, id)`, its display id (not stored in the file: nbformat keeps
/// display ids only while a notebook runs).
#[derive(Clone, Debug)]
struct Recorded {
    output: Output,
    display_id: Option<String>,
}

impl Recorded {
    fn plain(output: Output) -> Recorded {
        Recorded {
            output,
            display_id: None,
        }
    }
}

#[derive(Default)]
struct Recorder {
    state: Mutex<State>,
}

#[derive(Default)]
struct State {
    /// Outputs of every cell so far (updates reach back into earlier cells).
    cells: Vec<Vec<Recorded>>,
    current: usize,
    clear_pending: bool,
}

impl Recorder {
    fn start(&self, cells: Vec<Vec<Recorded>>, current: usize) {
        if let Ok(mut s) = self.state.lock() {
            s.cells = cells;
            s.current = current;
            s.clear_pending = false;
        }
    }

    fn finish(&self) -> Vec<Vec<Recorded>> {
        self.state
            .lock()
            .map(|mut s| std::mem::take(&mut s.cells))
            .unwrap_or_default()
    }

    fn push(&self, r: Recorded) {
        let Ok(mut s) = self.state.lock() else { return };
        let cur = s.current;
        let clear = std::mem::take(&mut s.clear_pending);
        let Some(outs) = s.cells.get_mut(cur) else {
            return;
        };
        if clear {
            outs.clear();
        }
        if let (
            Some(Recorded {
                output: Output::Stream { name, text },
                ..
            }),
            Output::Stream {
                name: new_name,
                text: new_text,
            },
        ) = (outs.last_mut(), &r.output)
            && name == new_name
        {
            text.push_str(new_text);
            return;
        }
        outs.push(r);
    }

    fn stream(&self, name: &str, text: &str) {
        self.push(Recorded::plain(Output::Stream {
            name: name.to_string(),
            text: text.to_string(),
        }));
    }
}

impl OutputSink for Recorder {
    fn stdout(&self, text: &str) {
        self.stream("stdout", text);
    }

    fn stderr(&self, text: &str) {
        self.stream("stderr", text);
    }

    fn display(&self, bundle: MimeBundle, display_id: Option<String>, update: bool) {
        let data = data_of(&bundle);
        if update {
            // An update changes the earlier outputs in place and adds none, as in Jupyter.
            let Ok(mut s) = self.state.lock() else { return };
            let Some(id) = display_id else { return };
            for r in s.cells.iter_mut().flatten() {
                if r.display_id.as_deref() == Some(id.as_str())
                    && let Output::DisplayData { data: d, .. } = &mut r.output
                {
                    *d = data.clone();
                }
            }
            return;
        }
        self.push(Recorded {
            output: Output::DisplayData {
                data,
                metadata: Map::new(),
            },
            display_id,
        });
    }

    fn clear_output(&self, wait: bool) {
        let Ok(mut s) = self.state.lock() else { return };
        if wait {
            s.clear_pending = true;
        } else {
            let cur = s.current;
            if let Some(outs) = s.cells.get_mut(cur) {
                outs.clear();
            }
        }
    }
}
