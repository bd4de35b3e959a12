//! Headless notebooks: run a small notebook, verify an unchanged rerun, and catch each kind of
//! drift (number, text, input file, missing output), per-cell tolerance, malformed JSON, and the
//! nbformat 4.5 shape of the written file (checked structurally against the schema's rules:
//! nbformat `v4/nbformat.v4.5.schema.json`, from memory).

use std::path::{Path, PathBuf};

use gaugebook::{
    DriftKind, NotebookError, RunOptions, VerifyOptions, run_notebook, verify_notebook,
};
use serde_json::{Value, json};

/// A fresh folder under the system temp dir with a helper module and a small notebook.
fn setup(name: &str) -> (tempfile::TempDir, PathBuf) {
    let dir = tempfile::Builder::new()
        .prefix(&format!("gaugebook-nb-{name}-"))
        .tempdir()
        .unwrap();
    std::fs::write(
        dir.path().join("rig.rhai"),
        "fn nominal() { q(\"350 ohm\") }\n",
    )
    .unwrap();
    let src = |s: &str| Value::Array(s.split_inclusive('\n').map(|l| json!(l)).collect());
    let code = |id: &str, s: &str| {
        json!({"cell_type": "code", "id": id, "metadata": {}, "source": src(s),
               "outputs": [], "execution_count": null})
    };
    let nb = json!({
        "nbformat": 4, "nbformat_minor": 4,
        "metadata": {"kernelspec": {"name": "gaugebook", "display_name": "Gaugebook"}},
        "cells": [
            {"cell_type": "markdown", "metadata": {}, "source": "# Rig check\nInvented data."},
            code("imports", "import \"rig\" as rig;\nlet r0 = rig::nominal();\nprint(\"gauge ready\");\nprint(r0);"),
            code("twice", "r0 * 2.0"),
            code("views", "display(\"loading\", \"p\");\nprint(\"between\");\nupdate_display(q(\"5 kN\"), \"p\");"),
            code("cleared", "print(\"gone\");\nclear_output();\nprint(\"kept\");\neprint(\"careful\");"),
            code("empty", "  \n"),
            code("ratio", "q(\"2.5 mV/V\")"),
        ]
    });
    let path = dir.path().join("rig.ipynb");
    std::fs::write(&path, serde_json::to_string_pretty(&nb).unwrap()).unwrap();
    (dir, path)
}

fn read_json(path: &Path) -> Value {
    serde_json::from_str(&std::fs::read_to_string(path).unwrap()).unwrap()
}

fn write_json(path: &Path, v: &Value) {
    std::fs::write(path, serde_json::to_string_pretty(v).unwrap()).unwrap();
}

fn text(v: &Value) -> String {
    match v {
        Value::String(s) => s.clone(),
        Value::Array(a) => a.iter().map(|l| l.as_str().unwrap()).collect(),
        other => panic!("not a multiline string: {other}"),
    }
}

fn run(path: &Path) {
    run_notebook(path, &RunOptions::default()).unwrap();
}

#[test]
fn run_records_outputs_like_jupyter() {
    let (_dir, path) = setup("run");
    let nb = run_notebook(&path, &RunOptions::default()).unwrap();
    let cells = &nb.cells;
    assert_eq!(cells.len(), 7);
    // Cell 2: one stream output for two prints (Jupyter merges consecutive stream text).
    let v = read_json(&path);
    let c = &v["cells"];
    assert_eq!(c[1]["execution_count"], json!(1));
    assert_eq!(c[1]["outputs"].as_array().unwrap().len(), 1);
    assert_eq!(c[1]["outputs"][0]["name"], "stdout");
    assert_eq!(text(&c[1]["outputs"][0]["text"]), "gauge ready\n350 Ω\n");
    // Cell 3: the value as execute_result, numbered like In [2].
    let r = &c[2]["outputs"][0];
    assert_eq!(r["output_type"], "execute_result");
    assert_eq!(r["execution_count"], json!(2));
    assert_eq!(text(&r["data"]["text/plain"]), "700 Ω");
    // Cell 4: update_display replaced the earlier view in place; the print stays after it.
    let o = c[3]["outputs"].as_array().unwrap();
    assert_eq!(o.len(), 2, "{o:?}");
    assert_eq!(o[0]["output_type"], "display_data");
    assert_eq!(text(&o[0]["data"]["text/plain"]), "5 kN");
    assert_eq!(text(&o[1]["text"]), "between\n");
    // Cell 5: clear_output() dropped "gone"; stderr is its own stream.
    let o = c[4]["outputs"].as_array().unwrap();
    assert_eq!(text(&o[0]["text"]), "kept\n");
    assert_eq!(o[1]["name"], "stderr");
    assert!(text(&o[1]["text"]).contains("careful"));
    // Cell 6 is empty: not executed, so the next cell is In [5].
    assert_eq!(c[5]["execution_count"], Value::Null);
    assert_eq!(c[6]["execution_count"], json!(5));
    // Provenance: versions and the imported module's hash.
    let g = &v["metadata"]["gaugebook"];
    assert_eq!(g["version"], env!("CARGO_PKG_VERSION"));
    assert!(g["rhai"].as_str().unwrap().starts_with("1."));
    let h = g["inputs"]["rig.rhai"].as_str().unwrap();
    assert_eq!(
        h,
        gaugebook::file_hash(&path.with_file_name("rig.rhai")).unwrap()
    );
    // The kernelspec and other metadata are kept.
    assert_eq!(v["metadata"]["kernelspec"]["name"], "gaugebook");
}

#[test]
fn unchanged_rerun_verifies() {
    let (_dir, path) = setup("same");
    run(&path);
    let before = std::fs::read(&path).unwrap();
    let report = verify_notebook(&path, &VerifyOptions::default()).unwrap();
    assert!(report.passed(), "{report}");
    assert_eq!(report.cells, 6);
    assert!(report.outputs >= 6, "{report}");
    assert!(report.to_string().contains("verified"));
    // Verify reruns a copy: the file is not touched.
    assert_eq!(std::fs::read(&path).unwrap(), before);
    // A second run writes the same bytes (deterministic ids and outputs).
    run(&path);
    assert_eq!(std::fs::read(&path).unwrap(), before);
}

#[test]
fn out_leaves_the_input_untouched() {
    let (dir, path) = setup("out");
    let before = std::fs::read(&path).unwrap();
    let out = dir.path().join("ran.ipynb");
    run_notebook(
        &path,
        &RunOptions {
            out: Some(out.clone()),
            ..Default::default()
        },
    )
    .unwrap();
    assert_eq!(std::fs::read(&path).unwrap(), before);
    assert!(
        verify_notebook(&out, &VerifyOptions::default())
            .unwrap()
            .passed()
    );
    // No temporary file is left behind.
    let names: Vec<_> = std::fs::read_dir(dir.path())
        .unwrap()
        .map(|e| e.unwrap().file_name().to_string_lossy().to_string())
        .collect();
    assert!(names.iter().all(|n| !n.contains(".tmp-")), "{names:?}");
}

/// Replaces the recorded `text/plain` of cell `cell`'s first output.
fn edit_result(path: &Path, cell: usize, new: &str) {
    let mut v = read_json(path);
    v["cells"][cell]["outputs"][0]["data"]["text/plain"] = json!(new);
    write_json(path, &v);
}

#[test]
fn a_changed_number_is_caught_with_its_relative_change() {
    let (_dir, path) = setup("number");
    run(&path);
    edit_result(&path, 2, "710 Ω");
    let report = verify_notebook(&path, &VerifyOptions::default()).unwrap();
    assert!(!report.passed());
    assert_eq!(report.drifts.len(), 1, "{report}");
    let d = &report.drifts[0];
    assert_eq!(
        (d.cell, d.output, d.cell_id.as_str()),
        (Some(3), Some(1), "twice")
    );
    match &d.kind {
        DriftKind::Numbers { what, changes } => {
            assert_eq!(what, "text/plain");
            assert_eq!(
                (changes[0].old.as_str(), changes[0].new.as_str()),
                ("710", "700")
            );
            // (700 - 710) / 710, exact arithmetic.
            let rel = changes[0].relative.unwrap();
            assert!((rel - (-10.0 / 710.0)).abs() < 1e-15, "{rel}");
        }
        other => panic!("{other:?}"),
    }
    let shown = report.to_string();
    assert!(shown.contains("cell 3 (id twice), output 1"), "{shown}");
    assert!(shown.contains("710 -> 700"), "{shown}");
    // Within a loose enough tolerance the same edit passes.
    let loose = VerifyOptions {
        rtol: 0.02,
        atol: 0.0,
    };
    assert!(verify_notebook(&path, &loose).unwrap().passed());
    let abs = VerifyOptions {
        rtol: 0.0,
        atol: 10.0,
    };
    assert!(verify_notebook(&path, &abs).unwrap().passed());
}

#[test]
fn per_cell_and_per_notebook_tolerance_are_honoured() {
    let (_dir, path) = setup("tol");
    run(&path);
    // 2.5 -> 2.5005 is a relative 2e-4.
    edit_result(&path, 6, "2.5005 mV/V");
    assert!(
        !verify_notebook(&path, &VerifyOptions::default())
            .unwrap()
            .passed()
    );
    let mut v = read_json(&path);
    v["cells"][6]["metadata"] = json!({"gaugebook": {"rtol": 1e-3}});
    write_json(&path, &v);
    let r = verify_notebook(&path, &VerifyOptions::default()).unwrap();
    assert!(r.passed(), "{r}");
    // A per-cell tolerance tighter than the notebook's wins for that cell.
    let mut v = read_json(&path);
    v["cells"][6]["metadata"] = json!({"gaugebook": {"rtol": 1e-5}});
    v["metadata"]["gaugebook"]["rtol"] = json!(1e-2);
    write_json(&path, &v);
    assert!(
        !verify_notebook(&path, &VerifyOptions::default())
            .unwrap()
            .passed()
    );
    // The notebook's tolerance applies where the cell states none.
    let mut v = read_json(&path);
    v["cells"][6]["metadata"] = json!({});
    write_json(&path, &v);
    assert!(
        verify_notebook(&path, &VerifyOptions::default())
            .unwrap()
            .passed()
    );
    // And a rerun keeps the notebook's tolerance beside the provenance.
    run(&path);
    assert_eq!(
        read_json(&path)["metadata"]["gaugebook"]["rtol"],
        json!(1e-2)
    );
}

#[test]
fn a_changed_text_is_caught() {
    let (_dir, path) = setup("text");
    run(&path);
    let mut v = read_json(&path);
    v["cells"][1]["outputs"][0]["text"] = json!(["gauge steady\n", "350 Ω\n"]);
    write_json(&path, &v);
    let report = verify_notebook(&path, &VerifyOptions::default()).unwrap();
    assert_eq!(report.drifts.len(), 1, "{report}");
    match &report.drifts[0].kind {
        DriftKind::Text { what, old, new } => {
            assert_eq!(
                (what.as_str(), old.as_str(), new.as_str()),
                ("stdout", "gauge steady", "gauge ready")
            );
        }
        other => panic!("{other:?}"),
    }
    // A changed unit is a text change even when the number is the same.
    run(&path);
    edit_result(&path, 2, "700 kΩ");
    let report = verify_notebook(
        &path,
        &VerifyOptions {
            rtol: 1.0,
            atol: 1.0,
        },
    )
    .unwrap();
    assert!(
        matches!(report.drifts[0].kind, DriftKind::Text { .. }),
        "{report}"
    );
}

#[test]
fn a_changed_input_file_is_reported() {
    let (dir, path) = setup("input");
    run(&path);
    std::fs::write(
        dir.path().join("rig.rhai"),
        "fn nominal() { q(\"120 ohm\") }\n",
    )
    .unwrap();
    let report = verify_notebook(&path, &VerifyOptions::default()).unwrap();
    assert!(!report.passed());
    assert!(
        matches!(&report.drifts[0].kind, DriftKind::InputChanged { path, new: Some(_), .. } if path == "rig.rhai"),
        "{report}"
    );
    // The outputs that depend on it drift too: 350 -> 120 and 700 -> 240.
    assert!(report.drifts.len() >= 3, "{report}");
    assert!(
        report
            .to_string()
            .contains("input rig.rhai changed since the recording")
    );
    // A deleted input is reported as missing.
    std::fs::remove_file(dir.path().join("rig.rhai")).unwrap();
    let report = verify_notebook(&path, &VerifyOptions::default()).unwrap();
    assert!(
        matches!(
            &report.drifts[0].kind,
            DriftKind::InputChanged { new: None, .. }
        ),
        "{report}"
    );
}

#[test]
fn missing_outputs_are_caught_both_ways() {
    let (_dir, path) = setup("missing");
    run(&path);
    // Deleted from the recording: the rerun has an output the recording lacks.
    let mut v = read_json(&path);
    v["cells"][2]["outputs"] = json!([]);
    write_json(&path, &v);
    let report = verify_notebook(&path, &VerifyOptions::default()).unwrap();
    assert_eq!(report.drifts.len(), 1, "{report}");
    assert!(
        matches!(report.drifts[0].kind, DriftKind::Unexpected { .. }),
        "{report}"
    );
    // The rerun no longer produces a recorded output (the cell lost its last expression).
    run(&path);
    let mut v = read_json(&path);
    v["cells"][2]["source"] = json!("let unused = r0 * 2.0;");
    write_json(&path, &v);
    let report = verify_notebook(&path, &VerifyOptions::default()).unwrap();
    assert_eq!(report.drifts.len(), 1, "{report}");
    assert!(
        matches!(report.drifts[0].kind, DriftKind::Missing { .. }),
        "{report}"
    );
    assert!(
        report
            .to_string()
            .contains("recorded execute_result (text/plain) is missing")
    );
}

#[test]
fn a_failing_cell_stops_the_run_and_writes_nothing() {
    let (_dir, path) = setup("fail");
    let mut v = read_json(&path);
    v["cells"][2]["source"] = json!("r0 + 5.0 * V");
    write_json(&path, &v);
    let before = std::fs::read(&path).unwrap();
    let e = run_notebook(&path, &RunOptions::default()).unwrap_err();
    match &e {
        NotebookError::CellFailed {
            cell,
            kind,
            rendered,
            ..
        } => {
            assert_eq!((*cell, kind.as_str()), (3, "UnitError"));
            assert!(rendered.starts_with("cell[2]:1:"), "{rendered}");
        }
        other => panic!("{other:?}"),
    }
    assert_eq!(std::fs::read(&path).unwrap(), before);
    // With errors allowed, the error is an output and later cells still run.
    let nb = run_notebook(
        &path,
        &RunOptions {
            allow_errors: true,
            ..Default::default()
        },
    )
    .unwrap();
    match &nb.cells[2].outputs[0] {
        gaugebook::Output::Error {
            ename, traceback, ..
        } => {
            assert_eq!(ename, "UnitError");
            assert!(
                traceback.iter().any(|l| l.contains("^ UnitError")),
                "{traceback:?}"
            );
        }
        other => panic!("{other:?}"),
    }
    assert!(!nb.cells[6].outputs.is_empty());
    // A recorded error reruns to the same error and verifies.
    assert!(
        verify_notebook(&path, &VerifyOptions::default())
            .unwrap()
            .passed()
    );
}

#[test]
fn malformed_json_names_the_file_line_and_column() {
    let (dir, _) = setup("bad");
    let bad = dir.path().join("broken.ipynb");
    std::fs::write(&bad, "{\n  \"nbformat\": 4,\n  \"cells\": [,]\n}\n").unwrap();
    let e = run_notebook(&bad, &RunOptions::default()).unwrap_err();
    match &e {
        NotebookError::Json { line, column, .. } => assert_eq!((*line, *column), (3, 13)),
        other => panic!("{other:?}"),
    }
    let msg = e.to_string();
    assert!(
        msg.contains("broken.ipynb:3:13: malformed notebook JSON"),
        "{msg}"
    );
    // Valid JSON that is not a notebook says what it expected.
    std::fs::write(
        &bad,
        "{\"nbformat\": 4, \"cells\": [{\"cell_type\": \"code\"}]}",
    )
    .unwrap();
    let msg = verify_notebook(&bad, &VerifyOptions::default())
        .unwrap_err()
        .to_string();
    assert!(
        msg.contains("broken.ipynb: not an nbformat 4 notebook: cell 1: the cell has no `source`"),
        "{msg}"
    );
}

// ---- nbformat 4.5 structure (the schema's required keys, types and closed objects) ----

fn is_multiline(v: &Value) -> bool {
    v.is_string() || v.as_array().is_some_and(|a| a.iter().all(Value::is_string))
}

fn keys_within(o: &serde_json::Map<String, Value>, allowed: &[&str], required: &[&str], at: &str) {
    for k in o.keys() {
        assert!(allowed.contains(&k.as_str()), "{at}: unexpected key `{k}`");
    }
    for k in required {
        assert!(o.contains_key(*k), "{at}: missing required key `{k}`");
    }
}

fn check_mimebundle(v: &Value, at: &str) {
    for (k, d) in v
        .as_object()
        .unwrap_or_else(|| panic!("{at}: data must be an object"))
    {
        let json_type = k.starts_with("application/") && k.ends_with("json");
        assert!(
            json_type || is_multiline(d),
            "{at}: data `{k}` must be a multiline string"
        );
    }
}

fn check_output(o: &Value, at: &str) {
    let o = o.as_object().unwrap();
    match o["output_type"].as_str().unwrap() {
        "stream" => {
            keys_within(
                o,
                &["output_type", "name", "text"],
                &["output_type", "name", "text"],
                at,
            );
            assert!(is_multiline(&o["text"]), "{at}");
        }
        "display_data" => {
            keys_within(
                o,
                &["output_type", "data", "metadata", "transient"],
                &["output_type", "data", "metadata"],
                at,
            );
            check_mimebundle(&o["data"], at);
            assert!(o["metadata"].is_object(), "{at}");
        }
        "execute_result" => {
            let req = ["output_type", "execution_count", "data", "metadata"];
            keys_within(o, &req, &req, at);
            assert!(
                o["execution_count"].is_null() || o["execution_count"].is_u64(),
                "{at}"
            );
            check_mimebundle(&o["data"], at);
        }
        "error" => {
            let req = ["output_type", "ename", "evalue", "traceback"];
            keys_within(o, &req, &req, at);
            assert!(
                o["traceback"]
                    .as_array()
                    .unwrap()
                    .iter()
                    .all(Value::is_string),
                "{at}"
            );
        }
        other => panic!("{at}: unknown output_type {other}"),
    }
}

fn check_nbformat_45(v: &Value) {
    let top = v.as_object().unwrap();
    let req = ["metadata", "nbformat_minor", "nbformat", "cells"];
    keys_within(top, &req, &req, "notebook");
    assert_eq!(v["nbformat"], json!(4));
    assert!(v["nbformat_minor"].as_u64().unwrap() >= 5);
    assert!(v["metadata"].is_object());
    let mut ids = std::collections::HashSet::new();
    for (i, c) in v["cells"].as_array().unwrap().iter().enumerate() {
        let at = format!("cell {i}");
        let o = c.as_object().unwrap();
        let id = o["id"].as_str().unwrap();
        assert!(
            (1..=64).contains(&id.len())
                && id
                    .chars()
                    .all(|c| c.is_ascii_alphanumeric() || c == '-' || c == '_'),
            "{at}: id `{id}` does not match ^[a-zA-Z0-9-_]+$ (1-64)"
        );
        assert!(ids.insert(id.to_string()), "{at}: duplicate id {id}");
        assert!(
            is_multiline(&o["source"]) && o["metadata"].is_object(),
            "{at}"
        );
        match o["cell_type"].as_str().unwrap() {
            "code" => {
                let req = [
                    "id",
                    "cell_type",
                    "metadata",
                    "source",
                    "outputs",
                    "execution_count",
                ];
                keys_within(o, &req, &req, &at);
                assert!(
                    o["execution_count"].is_null() || o["execution_count"].is_u64(),
                    "{at}"
                );
                for (j, out) in o["outputs"].as_array().unwrap().iter().enumerate() {
                    check_output(out, &format!("{at} output {j}"));
                }
            }
            "markdown" | "raw" => {
                keys_within(
                    o,
                    &["id", "cell_type", "metadata", "source", "attachments"],
                    &["id", "cell_type", "metadata", "source"],
                    &at,
                );
            }
            other => panic!("{at}: unknown cell_type {other}"),
        }
    }
}

#[test]
fn written_notebook_has_the_nbformat_45_shape() {
    let (_dir, path) = setup("schema");
    run_notebook(
        &path,
        &RunOptions {
            allow_errors: true,
            ..Default::default()
        },
    )
    .unwrap();
    let v = read_json(&path);
    check_nbformat_45(&v);
    // The markdown cell had no id (nbformat 4.4): it got one, and the file is 4.5 now.
    assert_eq!(v["nbformat_minor"], json!(5));
    assert_eq!(v["cells"][0]["id"], "cell-1");
    // An error output has the shape too.
    let mut w = v.clone();
    w["cells"][2]["source"] = json!("q(\"5 furlong\")");
    write_json(&path, &w);
    run_notebook(
        &path,
        &RunOptions {
            allow_errors: true,
            ..Default::default()
        },
    )
    .unwrap();
    let v = read_json(&path);
    check_nbformat_45(&v);
    assert_eq!(v["cells"][2]["outputs"][0]["output_type"], "error");
}

/// The same file through the reference validator, the `nbformat` package (PyPI) in
/// `target/nbformat-venv` when a developer has made one (`python3 -m venv
/// target/nbformat-venv && target/nbformat-venv/bin/pip install nbformat`); skipped otherwise,
/// so CI does not depend on it.
#[test]
fn written_notebook_passes_the_nbformat_validator_when_present() {
    let python = Path::new(env!("CARGO_MANIFEST_DIR")).join("target/nbformat-venv/bin/python");
    if !python.is_file() {
        eprintln!("skipped: no {}", python.display());
        return;
    }
    let (_dir, path) = setup("validator");
    let mut v = read_json(&path);
    v["cells"][2]["source"] = json!("r0 + 5.0 * V");
    write_json(&path, &v);
    run_notebook(
        &path,
        &RunOptions {
            allow_errors: true,
            ..Default::default()
        },
    )
    .unwrap();
    let script = "import json, sys, nbformat\n\
                  nb = json.load(open(sys.argv[1], encoding='utf-8'))\n\
                  nbformat.validate(nb, version=4, version_minor=5)\n\
                  print(nbformat.__version__)";
    let out = std::process::Command::new(&python)
        .args(["-c", script])
        .arg(&path)
        .output()
        .unwrap();
    assert!(
        out.status.success(),
        "nbformat.validate refused the file:\n{}",
        String::from_utf8_lossy(&out.stderr)
    );
}
