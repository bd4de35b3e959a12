//! The nbformat 4 document: reading a `.ipynb` file into cells and outputs, and writing it back
//! in the shape the nbformat 4.5 schema requires (cell ids, metadata on every cell and rich
//! output, text as lists of lines), atomically.
//!
//! Fields this module does not interpret (notebook and cell metadata, attachments) are kept as
//! they were read, so a run changes only outputs, execution counts, ids and provenance.

use std::collections::{BTreeMap, HashSet};
use std::io::Write;
use std::path::{Path, PathBuf};
use std::sync::atomic::{AtomicU64, Ordering};

use serde_json::{Map, Value, json};

use super::error::NotebookError;

/// The nbformat minor version written: 4.5 is the first with cell ids.
const NBFORMAT_MINOR: u64 = 5;

/// A notebook: its cells and metadata (nbformat 4).
///
/// ```
/// let nb = gaugebook::Notebook::from_json_str(
///     r#"{"nbformat": 4, "nbformat_minor": 5, "metadata": {},
///         "cells": [{"cell_type": "code", "id": "a", "metadata": {},
///                    "source": ["let x = 1;\n", "x + 1"], "outputs": [], "execution_count": null}]}"#,
///     "demo.ipynb",
/// )?;
/// assert_eq!(nb.cells[0].source, "let x = 1;\nx + 1");
/// assert!(nb.to_json_string().contains("\"nbformat_minor\": 5"));
/// # Ok::<(), gaugebook::NotebookError>(())
/// ```
#[derive(Clone, Debug, PartialEq)]
pub struct Notebook {
    /// The cells, in order.
    pub cells: Vec<Cell>,
    /// Notebook metadata (kernelspec, language_info, `gaugebook` provenance …), kept as read.
    pub metadata: Map<String, Value>,
}

/// The kind of a cell.
///
/// ```
/// assert_eq!(gaugebook::Cell::code("a", "1").kind, gaugebook::CellKind::Code);
/// ```
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub enum CellKind {
    /// Script code, executed in order.
    Code,
    /// Markdown text.
    Markdown,
    /// Raw text, passed through.
    Raw,
}

/// One cell.
///
/// ```
/// use gaugebook::{Cell, CellKind};
/// let c = Cell::code("id-1", "print(1)");
/// assert_eq!(c.kind, CellKind::Code);
/// assert!(c.outputs.is_empty());
/// ```
#[derive(Clone, Debug, PartialEq)]
pub struct Cell {
    /// The cell id (nbformat 4.5: 1 to 64 letters, digits, `-` or `_`).
    pub id: String,
    /// Code, markdown or raw.
    pub kind: CellKind,
    /// The source text, lines joined.
    pub source: String,
    /// Cell metadata (`gaugebook.rtol` / `gaugebook.atol` set per-cell tolerances).
    pub metadata: Map<String, Value>,
    /// Code cells: the `In [n]` number of the last run, `None` when not run.
    pub execution_count: Option<u64>,
    /// Code cells: the recorded outputs.
    pub outputs: Vec<Output>,
    /// Markdown and raw cells: attachments, kept as read.
    pub attachments: Option<Value>,
}

impl Cell {
    /// A code cell with no outputs, not yet run.
    ///
    /// ```
    /// let c = gaugebook::Cell::code("a", "1 + 1");
    /// assert_eq!((c.source.as_str(), c.execution_count), ("1 + 1", None));
    /// ```
    pub fn code(id: impl Into<String>, source: impl Into<String>) -> Cell {
        Cell {
            id: id.into(),
            kind: CellKind::Code,
            source: source.into(),
            metadata: Map::new(),
            execution_count: None,
            outputs: Vec::new(),
            attachments: None,
        }
    }
}

/// One recorded output of a code cell. Rich data maps a MIME type to its content: text as one
/// string (lines joined), `image/png` as base64 text, JSON types as JSON.
///
/// ```
/// let o = gaugebook::Output::Stream { name: "stdout".into(), text: "2 kN\n".into() };
/// assert_eq!(o.output_type(), "stream");
/// ```
#[derive(Clone, Debug, PartialEq)]
pub enum Output {
    /// Text printed to `stdout` or `stderr`.
    Stream {
        /// `stdout` or `stderr`.
        name: String,
        /// The text.
        text: String,
    },
    /// A value shown with `display`.
    DisplayData {
        /// MIME type → content.
        data: BTreeMap<String, Value>,
        /// Output metadata.
        metadata: Map<String, Value>,
    },
    /// The value of the cell's last expression.
    ExecuteResult {
        /// The cell's execution count.
        execution_count: Option<u64>,
        /// MIME type → content.
        data: BTreeMap<String, Value>,
        /// Output metadata.
        metadata: Map<String, Value>,
    },
    /// A script error.
    Error {
        /// The error kind (`UnitError` …).
        ename: String,
        /// The message.
        evalue: String,
        /// The rendered error, one line per entry.
        traceback: Vec<String>,
    },
}

impl Output {
    /// The nbformat `output_type` name.
    ///
    /// ```
    /// let e = gaugebook::Output::Error { ename: "UnitError".into(), evalue: "x".into(), traceback: vec![] };
    /// assert_eq!(e.output_type(), "error");
    /// ```
    pub fn output_type(&self) -> &'static str {
        match self {
            Output::Stream { .. } => "stream",
            Output::DisplayData { .. } => "display_data",
            Output::ExecuteResult { .. } => "execute_result",
            Output::Error { .. } => "error",
        }
    }

    fn to_json(&self) -> Value {
        match self {
            Output::Stream { name, text } => {
                json!({"output_type": "stream", "name": name, "text": lines(text)})
            }
            Output::DisplayData { data, metadata } => json!({
                "output_type": "display_data", "data": data_json(data), "metadata": metadata,
            }),
            Output::ExecuteResult {
                execution_count,
                data,
                metadata,
            } => json!({
                "output_type": "execute_result", "execution_count": execution_count,
                "data": data_json(data), "metadata": metadata,
            }),
            Output::Error {
                ename,
                evalue,
                traceback,
            } => json!({
                "output_type": "error", "ename": ename, "evalue": evalue, "traceback": traceback,
            }),
        }
    }
}

impl Notebook {
    /// Reads and parses a notebook file.
    ///
    /// ```
    /// let e = gaugebook::Notebook::read("missing.ipynb").unwrap_err();
    /// assert!(e.to_string().contains("missing.ipynb"));
    /// ```
    pub fn read(path: impl AsRef<Path>) -> Result<Notebook, NotebookError> {
        let path = path.as_ref();
        let text = std::fs::read_to_string(path).map_err(|e| NotebookError::io("read", path, e))?;
        Notebook::from_json_str(&text, path)
    }

    /// Parses notebook JSON; `path` names the file in errors.
    ///
    /// ```
    /// let e = gaugebook::Notebook::from_json_str("{\n  \"cells\": [,]\n}", "bad.ipynb").unwrap_err();
    /// assert!(e.to_string().starts_with("bad.ipynb:2:13: malformed notebook JSON"), "{e}");
    /// ```
    pub fn from_json_str(text: &str, path: impl AsRef<Path>) -> Result<Notebook, NotebookError> {
        let path = path.as_ref();
        let value: Value = serde_json::from_str(text).map_err(|e| NotebookError::Json {
            path: path.to_path_buf(),
            line: e.line(),
            column: e.column(),
            message: e
                .to_string()
                .split(" at line ")
                .next()
                .unwrap_or("")
                .to_string(),
        })?;
        parse(&value).map_err(|m| NotebookError::format(path, m))
    }

    /// The notebook as nbformat 4.5 JSON text (sorted keys, two-space indent,
    /// trailing newline). Cells without a valid, unique id get one.
    ///
    /// ```
    /// let nb = gaugebook::Notebook { cells: vec![gaugebook::Cell::code("", "1")], metadata: Default::default() };
    /// assert!(nb.to_json_string().contains("\"id\": \"cell-1\""));
    /// ```
    pub fn to_json_string(&self) -> String {
        let mut seen = HashSet::new();
        let cells: Vec<Value> = self
            .cells
            .iter()
            .enumerate()
            .map(|(i, c)| {
                let id = unique_id(&c.id, i, &mut seen);
                cell_json(c, &id)
            })
            .collect();
        let nb = json!({
            "nbformat": 4, "nbformat_minor": NBFORMAT_MINOR,
            "metadata": self.metadata, "cells": cells,
        });
        // Serialising a `Value` cannot fail: every map key is a string.
        let mut s = serde_json::to_string_pretty(&nb).unwrap_or_default();
        s.push('\n');
        s
    }

    /// Writes the notebook atomically: to a temporary file in the same folder, then renamed over
    /// `path`, so a reader never sees a half-written notebook.
    ///
    /// ```
    /// let dir = std::env::temp_dir().join("gaugebook-doc-write");
    /// std::fs::create_dir_all(&dir).unwrap();
    /// let nb = gaugebook::Notebook { cells: vec![gaugebook::Cell::code("a", "1")], metadata: Default::default() };
    /// nb.write(dir.join("n.ipynb"))?;
    /// assert_eq!(gaugebook::Notebook::read(dir.join("n.ipynb"))?.cells.len(), 1);
    /// # Ok::<(), gaugebook::NotebookError>(())
    /// ```
    pub fn write(&self, path: impl AsRef<Path>) -> Result<(), NotebookError> {
        write_atomic(path.as_ref(), self.to_json_string().as_bytes())
    }
}

/// Writes `bytes` to a temporary sibling of `path`, flushes it to disk, then renames it over
/// `path`; on any failure the temporary file is removed and `path` is untouched.
pub(crate) fn write_atomic(path: &Path, bytes: &[u8]) -> Result<(), NotebookError> {
    static COUNTER: AtomicU64 = AtomicU64::new(0);
    let dir = match path.parent() {
        Some(d) if !d.as_os_str().is_empty() => d.to_path_buf(),
        _ => PathBuf::from("."),
    };
    let name = path.file_name().map(|n| n.to_string_lossy().to_string());
    let name = name.unwrap_or_else(|| "notebook".to_string());
    let tmp = dir.join(format!(
        ".{name}.tmp-{}-{}",
        std::process::id(),
        COUNTER.fetch_add(1, Ordering::Relaxed)
    ));
    let result = (|| {
        let mut f = std::fs::File::create(&tmp).map_err(|e| NotebookError::io("write", &tmp, e))?;
        f.write_all(bytes)
            .and_then(|()| f.sync_all())
            .map_err(|e| NotebookError::io("write", &tmp, e))?;
        std::fs::rename(&tmp, path).map_err(|e| NotebookError::io("rename into place", path, e))
    })();
    if result.is_err() {
        let _ = std::fs::remove_file(&tmp);
    }
    result
}

/// Splits text into lines that keep their `\n`, the way Jupyter stores multiline strings.
fn lines(text: &str) -> Value {
    Value::Array(
        text.split_inclusive('\n')
            .map(|l| Value::String(l.to_string()))
            .collect(),
    )
}

/// JSON MIME types hold JSON; base64 images hold one string; other text is split into lines.
fn data_json(data: &BTreeMap<String, Value>) -> Value {
    let mut m = Map::new();
    for (k, v) in data {
        let v = match v {
            Value::String(s) if !is_json_mime(k) && !k.starts_with("image/png") => lines(s),
            other => other.clone(),
        };
        m.insert(k.clone(), v);
    }
    Value::Object(m)
}

pub(crate) fn is_json_mime(mime: &str) -> bool {
    mime.starts_with("application/") && (mime.ends_with("/json") || mime.ends_with("+json"))
}

fn valid_id(id: &str) -> bool {
    (1..=64).contains(&id.len())
        && id
            .chars()
            .all(|c| c.is_ascii_alphanumeric() || c == '-' || c == '_')
}

/// The cell's id if it is valid and unused, else a deterministic new one (`cell-<n>`), so an
/// unchanged notebook reruns to the same file.
fn unique_id(id: &str, index: usize, seen: &mut HashSet<String>) -> String {
    if valid_id(id) && seen.insert(id.to_string()) {
        return id.to_string();
    }
    let mut n = index + 1;
    loop {
        let candidate = format!("cell-{n}");
        if seen.insert(candidate.clone()) {
            return candidate;
        }
        n += 1;
    }
}

fn cell_json(c: &Cell, id: &str) -> Value {
    let mut m = Map::new();
    m.insert("id".into(), json!(id));
    m.insert("metadata".into(), Value::Object(c.metadata.clone()));
    m.insert("source".into(), lines(&c.source));
    let kind = match c.kind {
        CellKind::Code => {
            m.insert("execution_count".into(), json!(c.execution_count));
            let outs = c.outputs.iter().map(Output::to_json).collect();
            m.insert("outputs".into(), Value::Array(outs));
            "code"
        }
        CellKind::Markdown => "markdown",
        CellKind::Raw => "raw",
    };
    if let (false, Some(a)) = (c.kind == CellKind::Code, &c.attachments) {
        m.insert("attachments".into(), a.clone());
    }
    m.insert("cell_type".into(), json!(kind));
    Value::Object(m)
}

/// A multiline string: one string, or a list of strings joined.
fn multiline(v: &Value, what: &str) -> Result<String, String> {
    match v {
        Value::String(s) => Ok(s.clone()),
        Value::Array(parts) => parts
            .iter()
            .map(|p| {
                p.as_str()
                    .ok_or_else(|| format!("{what} must be a string or a list of strings"))
            })
            .collect(),
        other => Err(format!(
            "{what} must be a string or a list of strings, found {other}"
        )),
    }
}

fn object(v: Option<&Value>, what: &str) -> Result<Map<String, Value>, String> {
    match v {
        None | Some(Value::Null) => Ok(Map::new()),
        Some(Value::Object(m)) => Ok(m.clone()),
        Some(other) => Err(format!("{what} must be an object, found {other}")),
    }
}

fn text_field(o: &Map<String, Value>, key: &str, what: &str) -> Result<String, String> {
    match o.get(key) {
        Some(v) => multiline(v, &format!("{what} `{key}`")),
        None => Err(format!("{what} has no `{key}`")),
    }
}

fn parse(v: &Value) -> Result<Notebook, String> {
    let top = v.as_object().ok_or("the top level must be an object")?;
    match top.get("nbformat").and_then(Value::as_u64) {
        Some(4) => {}
        Some(n) => return Err(format!("expected nbformat 4, found nbformat {n}")),
        None => return Err("expected a numeric `nbformat` field".into()),
    }
    let cells = top
        .get("cells")
        .and_then(Value::as_array)
        .ok_or("expected a `cells` list")?;
    let cells = cells
        .iter()
        .enumerate()
        .map(|(i, c)| parse_cell(c).map_err(|m| format!("cell {}: {m}", i + 1)))
        .collect::<Result<Vec<_>, _>>()?;
    Ok(Notebook {
        cells,
        metadata: object(top.get("metadata"), "notebook metadata")?,
    })
}

fn parse_cell(v: &Value) -> Result<Cell, String> {
    let c = v.as_object().ok_or("a cell must be an object")?;
    let kind = match c.get("cell_type").and_then(Value::as_str) {
        Some("code") => CellKind::Code,
        Some("markdown") => CellKind::Markdown,
        Some("raw") => CellKind::Raw,
        Some(other) => return Err(format!("unknown cell_type `{other}`")),
        None => return Err("missing `cell_type`".into()),
    };
    let outputs = match c.get("outputs") {
        Some(Value::Array(outs)) if kind == CellKind::Code => outs
            .iter()
            .enumerate()
            .map(|(j, o)| parse_output(o).map_err(|m| format!("output {}: {m}", j + 1)))
            .collect::<Result<Vec<_>, _>>()?,
        _ => Vec::new(),
    };
    Ok(Cell {
        id: c
            .get("id")
            .and_then(Value::as_str)
            .unwrap_or("")
            .to_string(),
        kind,
        source: text_field(c, "source", "the cell")?,
        metadata: object(c.get("metadata"), "cell metadata")?,
        execution_count: c.get("execution_count").and_then(Value::as_u64),
        outputs,
        attachments: c.get("attachments").cloned(),
    })
}

fn parse_data(o: &Map<String, Value>) -> Result<BTreeMap<String, Value>, String> {
    let mut data = BTreeMap::new();
    for (k, v) in object(o.get("data"), "output data")? {
        let v = if is_json_mime(&k) {
            v
        } else {
            Value::String(multiline(&v, &format!("data `{k}`"))?)
        };
        data.insert(k, v);
    }
    Ok(data)
}

fn parse_output(v: &Value) -> Result<Output, String> {
    let o = v.as_object().ok_or("an output must be an object")?;
    let s = |k: &str| o.get(k).and_then(Value::as_str).unwrap_or("").to_string();
    match o.get("output_type").and_then(Value::as_str) {
        Some("stream") => Ok(Output::Stream {
            name: s("name"),
            text: text_field(o, "text", "a stream output")?,
        }),
        Some("display_data") => Ok(Output::DisplayData {
            data: parse_data(o)?,
            metadata: object(o.get("metadata"), "output metadata")?,
        }),
        Some("execute_result") => Ok(Output::ExecuteResult {
            execution_count: o.get("execution_count").and_then(Value::as_u64),
            data: parse_data(o)?,
            metadata: object(o.get("metadata"), "output metadata")?,
        }),
        Some("error") => Ok(Output::Error {
            ename: s("ename"),
            evalue: s("evalue"),
            traceback: o
                .get("traceback")
                .and_then(Value::as_array)
                .map(|t| {
                    t.iter()
                        .map(|l| l.as_str().unwrap_or("").to_string())
                        .collect()
                })
                .unwrap_or_default(),
        }),
        Some(other) => Err(format!("unknown output_type `{other}`")),
        None => Err("missing `output_type`".into()),
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn lines_keep_their_newlines() {
        assert_eq!(lines("a\nb\n"), json!(["a\n", "b\n"]));
        assert_eq!(lines("a\nb"), json!(["a\n", "b"]));
        assert_eq!(lines(""), json!([]));
    }

    #[test]
    fn round_trip_keeps_outputs() {
        let mut c = Cell::code("x", "1 + 1");
        c.execution_count = Some(1);
        c.outputs.push(Output::ExecuteResult {
            execution_count: Some(1),
            data: [("text/plain".to_string(), json!("2\nlines"))].into(),
            metadata: Map::new(),
        });
        c.outputs.push(Output::Stream {
            name: "stdout".into(),
            text: "hi\n".into(),
        });
        let nb = Notebook {
            cells: vec![c],
            metadata: Map::new(),
        };
        let back = Notebook::from_json_str(&nb.to_json_string(), "x.ipynb").unwrap();
        assert_eq!(back, nb);
    }

    #[test]
    fn duplicate_and_invalid_ids_are_replaced() {
        let mut seen = HashSet::new();
        assert_eq!(unique_id("a", 0, &mut seen), "a");
        assert_eq!(unique_id("a", 1, &mut seen), "cell-2");
        assert_eq!(unique_id("bad id!", 2, &mut seen), "cell-3");
        assert_eq!(unique_id("", 3, &mut seen), "cell-4");
    }

    #[test]
    fn wrong_version_is_refused() {
        let e = Notebook::from_json_str(r#"{"nbformat": 3, "cells": []}"#, "old.ipynb");
        assert!(
            e.unwrap_err()
                .to_string()
                .contains("expected nbformat 4, found nbformat 3")
        );
    }
}
