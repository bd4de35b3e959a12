//! Verifying a notebook: rerun a copy in memory and compare every recorded output with the new
//! one (numbers within tolerance, words exactly, SVG figures by their numbers, PNG by bytes),
//! and check the recorded input hashes against the files as they are now.
//!
//! Tolerances, most specific first: cell metadata `gaugebook.rtol` / `gaugebook.atol`, then the
//! notebook metadata's `gaugebook.rtol` / `gaugebook.atol`, then [`VerifyOptions`].

use std::fmt;
use std::path::{Path, PathBuf};

use serde_json::{Map, Value};

use super::compare::{TextDiff, Tolerance, compare_text, relative_change};
use super::error::NotebookError;
use super::format::{CellKind, Notebook, Output, is_json_mime};
use super::provenance::{Provenance, file_hash};
use super::run::{RunOptions, execute, notebook_dir};

/// Default tolerances of [`VerifyOptions`]: printed values carry about six significant digits,
/// so a relative 1e-6 separates a real change from the last printed digit (common practice for
/// regression comparison of printed results).
const DEFAULT_RTOL: f64 = 1e-6;

/// How closely numbers must agree: `|new - old| <= atol + rtol * |old|`.
///
/// ```
/// let o = gaugebook::VerifyOptions::default();
/// assert_eq!((o.rtol, o.atol), (1e-6, 0.0));
/// ```
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct VerifyOptions {
    /// Relative tolerance.
    pub rtol: f64,
    /// Absolute tolerance, in the printed unit of each number.
    pub atol: f64,
}

impl Default for VerifyOptions {
    fn default() -> Self {
        VerifyOptions {
            rtol: DEFAULT_RTOL,
            atol: 0.0,
        }
    }
}

/// One number that moved beyond its tolerance.
///
/// ```
/// let c = gaugebook::NumberChange { context: "span".into(), old: "2".into(), new: "2.1".into(),
///     relative: Some(0.05) };
/// assert_eq!(c.relative, Some(0.05));
/// ```
#[derive(Clone, Debug, PartialEq)]
pub struct NumberChange {
    /// The text just before the number on its line, to say which it is.
    pub context: String,
    /// The recorded number as printed.
    pub old: String,
    /// The rerun's number as printed.
    pub new: String,
    /// `(new - old) / |old|`; `None` when the recorded number is zero.
    pub relative: Option<f64>,
}

/// What drifted.
///
/// ```
/// let k = gaugebook::DriftKind::Missing { what: "stream stdout".into() };
/// assert!(matches!(k, gaugebook::DriftKind::Missing { .. }));
/// ```
#[derive(Clone, Debug, PartialEq)]
#[non_exhaustive]
pub enum DriftKind {
    /// Numbers beyond tolerance in one representation (`what` is a MIME type or stream name).
    Numbers {
        /// `text/plain`, `image/svg+xml`, `stdout` …
        what: String,
        /// The numbers that moved.
        changes: Vec<NumberChange>,
    },
    /// Words changed: the first differing line of each.
    Text {
        /// The representation or field.
        what: String,
        /// The recorded line.
        old: String,
        /// The rerun's line.
        new: String,
    },
    /// A PNG (or other binary) image's bytes changed.
    Bytes {
        /// The MIME type.
        what: String,
    },
    /// The recording has this output (or representation) and the rerun does not.
    Missing {
        /// The output type or MIME type.
        what: String,
    },
    /// The rerun has this output (or representation) and the recording does not.
    Unexpected {
        /// The output type or MIME type.
        what: String,
    },
    /// The output's type changed (an error where a result was, …).
    TypeChanged {
        /// The recorded output type.
        old: String,
        /// The rerun's output type.
        new: String,
    },
    /// An input file's content changed since the recording (`new` is `None` if it is gone).
    InputChanged {
        /// The file as the notebook names it.
        path: String,
        /// The recorded hash.
        old: String,
        /// The hash now.
        new: Option<String>,
    },
}

/// One difference between the recording and the rerun.
///
/// ```
/// let d = gaugebook::Drift { cell: Some(3), cell_id: "sizing".into(), output: Some(1),
///     kind: gaugebook::DriftKind::Bytes { what: "image/png".into() } };
/// assert_eq!(d.to_string(), "cell 3 (id sizing), output 1: image/png bytes changed");
/// ```
#[derive(Clone, Debug, PartialEq)]
pub struct Drift {
    /// 1-based position of the cell (markdown cells counted); `None` for input files.
    pub cell: Option<usize>,
    /// The cell's id.
    pub cell_id: String,
    /// 1-based position of the output in the cell.
    pub output: Option<usize>,
    /// What drifted.
    pub kind: DriftKind,
}

/// The result of [`verify_notebook`]: the drifts found and notes that do not fail it.
///
/// ```
/// let r = gaugebook::VerifyReport { path: "n.ipynb".into(), cells: 2, outputs: 3,
///     drifts: vec![], notes: vec![] };
/// assert!(r.passed());
/// assert!(r.to_string().starts_with("n.ipynb: verified"));
/// ```
#[derive(Clone, Debug, PartialEq)]
pub struct VerifyReport {
    /// The notebook verified.
    pub path: PathBuf,
    /// Code cells compared.
    pub cells: usize,
    /// Recorded outputs compared.
    pub outputs: usize,
    /// Every difference, in notebook order, input files first.
    pub drifts: Vec<Drift>,
    /// Remarks that do not fail the check (no provenance recorded, another version, …).
    pub notes: Vec<String>,
}

impl VerifyReport {
    /// True when nothing drifted (notes do not count).
    ///
    /// ```
    /// let r = gaugebook::VerifyReport { path: "n.ipynb".into(), cells: 1, outputs: 1,
    ///     drifts: vec![], notes: vec!["no gaugebook provenance recorded".into()] };
    /// assert!(r.passed());
    /// ```
    pub fn passed(&self) -> bool {
        self.drifts.is_empty()
    }
}

/// Reruns a copy of the notebook at `path` (the file is not changed) and compares every
/// recorded output with the new one.
///
/// ```
/// let dir = std::env::temp_dir().join(format!("gaugebook-doc-verify-{}", std::process::id()));
/// std::fs::create_dir_all(&dir).unwrap();
/// let nb = gaugebook::Notebook { cells: vec![gaugebook::Cell::code("a", "2.0 * q(\"1 kN\")")],
///     metadata: Default::default() };
/// nb.write(dir.join("n.ipynb"))?;
/// gaugebook::run_notebook(dir.join("n.ipynb"), &Default::default())?;
/// let report = gaugebook::verify_notebook(dir.join("n.ipynb"), &Default::default())?;
/// assert!(report.passed(), "{report}");
/// # Ok::<(), gaugebook::NotebookError>(())
/// ```
pub fn verify_notebook(
    path: impl AsRef<Path>,
    options: &VerifyOptions,
) -> Result<VerifyReport, NotebookError> {
    let path = path.as_ref();
    let recorded = Notebook::read(path)?;
    let mut rerun = recorded.clone();
    let run = RunOptions {
        allow_errors: true,
        ..RunOptions::default()
    };
    execute(&mut rerun, path, &run)?;

    let mut report = VerifyReport {
        path: path.to_path_buf(),
        cells: 0,
        outputs: 0,
        drifts: Vec::new(),
        notes: Vec::new(),
    };
    check_inputs(&recorded, &rerun, &notebook_dir(path), &mut report);
    let base = tolerance(
        &recorded.metadata,
        Tolerance {
            rtol: options.rtol,
            atol: options.atol,
        },
    );
    for (i, (old, new)) in recorded.cells.iter().zip(&rerun.cells).enumerate() {
        if old.kind != CellKind::Code {
            continue;
        }
        report.cells += 1;
        report.outputs += old.outputs.len();
        let tol = tolerance(&old.metadata, base);
        let n = old.outputs.len().max(new.outputs.len());
        for j in 0..n {
            let drift = |kind| Drift {
                cell: Some(i + 1),
                cell_id: old.id.clone(),
                output: Some(j + 1),
                kind,
            };
            match (old.outputs.get(j), new.outputs.get(j)) {
                (Some(a), Some(b)) => {
                    for kind in compare_output(a, b, tol) {
                        report.drifts.push(drift(kind));
                    }
                }
                (Some(a), None) => report
                    .drifts
                    .push(drift(DriftKind::Missing { what: describe(a) })),
                (None, Some(b)) => report
                    .drifts
                    .push(drift(DriftKind::Unexpected { what: describe(b) })),
                (None, None) => {}
            }
        }
    }
    Ok(report)
}

/// The tolerance in `metadata.gaugebook`, each of `rtol` and `atol` falling back to `base`.
fn tolerance(metadata: &Map<String, Value>, base: Tolerance) -> Tolerance {
    let g = metadata.get("gaugebook");
    let get = |k: &str| g.and_then(|g| g.get(k)).and_then(Value::as_f64);
    Tolerance {
        rtol: get("rtol").unwrap_or(base.rtol),
        atol: get("atol").unwrap_or(base.atol),
    }
}

fn check_inputs(recorded: &Notebook, rerun: &Notebook, dir: &Path, report: &mut VerifyReport) {
    let Some(old) = Provenance::from_metadata(&recorded.metadata) else {
        report
            .notes
            .push("no gaugebook provenance recorded: input files not checked".into());
        return;
    };
    let now = Provenance::from_metadata(&rerun.metadata).unwrap_or_default();
    if old.gaugebook != now.gaugebook || old.rhai != now.rhai {
        report.notes.push(format!(
            "recorded with gaugebook {} (rhai {}), rerun with gaugebook {} (rhai {})",
            old.gaugebook, old.rhai, now.gaugebook, now.rhai
        ));
    }
    for (p, h) in &old.inputs {
        let current = file_hash(&dir.join(p));
        if current.as_deref() != Some(h.as_str()) {
            report.drifts.push(Drift {
                cell: None,
                cell_id: String::new(),
                output: None,
                kind: DriftKind::InputChanged {
                    path: p.clone(),
                    old: h.clone(),
                    new: current,
                },
            });
        }
    }
    for p in now.inputs.keys().filter(|p| !old.inputs.contains_key(*p)) {
        report
            .notes
            .push(format!("input {p} is read now but was not recorded"));
    }
}

/// The output type, with the MIME types of rich outputs.
fn describe(o: &Output) -> String {
    match o {
        Output::Stream { name, .. } => format!("stream {name}"),
        Output::DisplayData { data, .. } | Output::ExecuteResult { data, .. } => format!(
            "{} ({})",
            o.output_type(),
            data.keys().cloned().collect::<Vec<_>>().join(", ")
        ),
        Output::Error { ename, .. } => format!("error {ename}"),
    }
}

fn text_drift(what: &str, old: &str, new: &str, tol: Tolerance) -> Option<DriftKind> {
    match compare_text(old, new, tol) {
        TextDiff::Same => None,
        TextDiff::Numbers(d) => Some(DriftKind::Numbers {
            what: what.to_string(),
            changes: d
                .into_iter()
                .map(|d| NumberChange {
                    relative: relative_change(d.old_value, d.new_value),
                    context: d.context,
                    old: d.old,
                    new: d.new,
                })
                .collect(),
        }),
        TextDiff::Text { old_line, new_line } => Some(DriftKind::Text {
            what: what.to_string(),
            old: old_line,
            new: new_line,
        }),
    }
}

fn compare_output(a: &Output, b: &Output, tol: Tolerance) -> Vec<DriftKind> {
    let mut out = Vec::new();
    match (a, b) {
        (Output::Stream { name: n1, text: t1 }, Output::Stream { name: n2, text: t2 })
            if n1 == n2 =>
        {
            out.extend(text_drift(n1, t1, t2, tol));
        }
        (
            Output::DisplayData { data: d1, .. } | Output::ExecuteResult { data: d1, .. },
            Output::DisplayData { data: d2, .. } | Output::ExecuteResult { data: d2, .. },
        ) if a.output_type() == b.output_type() => {
            for (mime, v1) in d1 {
                let Some(v2) = d2.get(mime) else {
                    out.push(DriftKind::Missing { what: mime.clone() });
                    continue;
                };
                match (v1, v2) {
                    _ if is_json_mime(mime) && v1 != v2 => {
                        out.push(DriftKind::Text {
                            what: mime.clone(),
                            old: v1.to_string(),
                            new: v2.to_string(),
                        });
                    }
                    (Value::String(s1), Value::String(s2)) if mime.starts_with("image/png") => {
                        let strip = |s: &str| s.split_whitespace().collect::<String>();
                        if strip(s1) != strip(s2) {
                            out.push(DriftKind::Bytes { what: mime.clone() });
                        }
                    }
                    (Value::String(s1), Value::String(s2)) => {
                        out.extend(text_drift(mime, s1, s2, tol));
                    }
                    _ if v1 != v2 => out.push(DriftKind::Bytes { what: mime.clone() }),
                    _ => {}
                }
            }
            for mime in d2.keys().filter(|m| !d1.contains_key(*m)) {
                out.push(DriftKind::Unexpected { what: mime.clone() });
            }
        }
        (
            Output::Error {
                ename: e1,
                evalue: v1,
                ..
            },
            Output::Error {
                ename: e2,
                evalue: v2,
                ..
            },
        ) => {
            if e1 != e2 {
                out.push(DriftKind::Text {
                    what: "ename".into(),
                    old: e1.clone(),
                    new: e2.clone(),
                });
            }
            out.extend(text_drift("evalue", v1, v2, tol));
        }
        _ => out.push(DriftKind::TypeChanged {
            old: describe(a),
            new: describe(b),
        }),
    }
    out
}

/// How many changed numbers of one output the report lists before summarising the rest.
const NUMBERS_SHOWN: usize = 5;

fn short(hash: &str) -> &str {
    // `sha256:` and 12 hex digits are enough to tell two versions apart in a report.
    hash.get(..19).unwrap_or(hash)
}

impl fmt::Display for Drift {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        if let DriftKind::InputChanged { path, old, new } = &self.kind {
            return match new {
                Some(n) => write!(
                    f,
                    "input {path} changed since the recording ({} -> {})",
                    short(old),
                    short(n)
                ),
                None => write!(f, "input {path} is missing (recorded {})", short(old)),
            };
        }
        if let Some(c) = self.cell {
            write!(f, "cell {c}")?;
            if !self.cell_id.is_empty() {
                write!(f, " (id {})", self.cell_id)?;
            }
        }
        if let Some(o) = self.output {
            write!(f, ", output {o}")?;
        }
        match &self.kind {
            DriftKind::Numbers { what, changes } => {
                write!(f, ": {what}: {} number(s) beyond tolerance", changes.len())?;
                for c in changes.iter().take(NUMBERS_SHOWN) {
                    let rel = match c.relative {
                        Some(r) => format!("{r:+.3e}"),
                        None => "from zero".to_string(),
                    };
                    let at = if c.context.is_empty() {
                        String::new()
                    } else {
                        format!("after \"{}\": ", c.context)
                    };
                    write!(f, "\n    {at}{} -> {} (relative {rel})", c.old, c.new)?;
                }
                if changes.len() > NUMBERS_SHOWN {
                    write!(f, "\n    … and {} more", changes.len() - NUMBERS_SHOWN)?;
                }
                Ok(())
            }
            DriftKind::Text { what, old, new } => {
                write!(f, ": {what} changed\n    - {old}\n    + {new}")
            }
            DriftKind::Bytes { what } => write!(f, ": {what} bytes changed"),
            DriftKind::Missing { what } => {
                write!(f, ": recorded {what} is missing from the rerun")
            }
            DriftKind::Unexpected { what } => {
                write!(f, ": rerun has {what}, not in the recording")
            }
            DriftKind::TypeChanged { old, new } => {
                write!(f, ": output changed from {old} to {new}")
            }
            DriftKind::InputChanged { .. } => Ok(()),
        }
    }
}

impl fmt::Display for VerifyReport {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        let head = if self.passed() {
            "verified".to_string()
        } else {
            format!("DRIFT ({} difference(s))", self.drifts.len())
        };
        writeln!(
            f,
            "{}: {head}: {} output(s) in {} code cell(s) compared",
            self.path.display(),
            self.outputs,
            self.cells
        )?;
        for d in &self.drifts {
            writeln!(f, "  {d}")?;
        }
        for n in &self.notes {
            writeln!(f, "  note: {n}")?;
        }
        Ok(())
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    fn shown(mime: &str, content: &str) -> Output {
        Output::DisplayData {
            data: [(mime.to_string(), Value::String(content.to_string()))].into(),
            metadata: Map::new(),
        }
    }

    const TOL: Tolerance = Tolerance {
        rtol: 1e-6,
        atol: 0.0,
    };

    #[test]
    fn svg_figures_compare_by_their_coordinates() {
        let old = shown(
            "image/svg+xml",
            "<svg><path d=\"M 10 20 L 30.5 40\"/></svg>",
        );
        let near = shown(
            "image/svg+xml",
            "<svg><path d=\"M 10 20 L 30.5000001 40\"/></svg>",
        );
        let far = shown(
            "image/svg+xml",
            "<svg><path d=\"M 10 20 L 31.5 40\"/></svg>",
        );
        assert!(compare_output(&old, &near, TOL).is_empty());
        match &compare_output(&old, &far, TOL)[..] {
            [DriftKind::Numbers { what, changes }] => {
                assert_eq!(what, "image/svg+xml");
                assert_eq!(
                    (changes[0].old.as_str(), changes[0].new.as_str()),
                    ("30.5", "31.5")
                );
            }
            other => panic!("{other:?}"),
        }
        // A different element is a text change, whatever the tolerance.
        let other = shown(
            "image/svg+xml",
            "<svg><circle d=\"M 10 20 L 30.5 40\"/></svg>",
        );
        assert!(matches!(
            compare_output(&old, &other, TOL)[..],
            [DriftKind::Text { .. }]
        ));
    }

    #[test]
    fn png_compares_bytes_ignoring_line_breaks() {
        let old = shown("image/png", "iVBORw0KGgo=\n");
        assert!(compare_output(&old, &shown("image/png", "iVBORw0KGgo="), TOL).is_empty());
        assert!(matches!(
            compare_output(&old, &shown("image/png", "iVBORw0KGgp="), TOL)[..],
            [DriftKind::Bytes { .. }]
        ));
    }

    #[test]
    fn a_result_turned_error_is_a_type_change() {
        let err = Output::Error {
            ename: "UnitError".into(),
            evalue: "x".into(),
            traceback: vec![],
        };
        let old = shown("text/plain", "1");
        assert!(matches!(
            compare_output(&old, &err, TOL)[..],
            [DriftKind::TypeChanged { .. }]
        ));
    }

    #[test]
    fn long_number_lists_are_summarised() {
        let d = Drift {
            cell: Some(2),
            cell_id: "a".into(),
            output: Some(1),
            kind: DriftKind::Numbers {
                what: "image/svg+xml".into(),
                changes: (0..8)
                    .map(|i| NumberChange {
                        context: String::new(),
                        old: i.to_string(),
                        new: (i + 1).to_string(),
                        relative: None,
                    })
                    .collect(),
            },
        };
        let s = d.to_string();
        assert!(s.contains("8 number(s) beyond tolerance"), "{s}");
        assert!(s.contains("… and 3 more"), "{s}");
    }
}
