//! The Rust notebook `notebooks/05_rust_library.ipynb`, executed by the evcxr_jupyter kernel
//! through nbclient, shows the library's results richly (feature `evcxr`): a quantity as text,
//! results as HTML tables and a figure as SVG.
//!
//! evcxr_jupyter is provisioned with `cargo install` into `target/evcxr` (reused when the binary
//! is there; `.ci/run` installs it before the tests so its build is not part of a test), its
//! kernelspec is written into a temporary Jupyter path, and the Python side is the shared venv
//! of the Jupyter client tests (tests/common/pyenv.rs). The numbers the notebook shows are
//! checked against closed-form torsion and bridge formulas computed here.

use std::path::{Path, PathBuf};
use std::process::Command;

use serde_json::Value;
use uom::si::pressure::pascal;

use crate::common::assert_close;
use crate::common::pyenv::{pyenv, target_dir};

/// The evcxr_jupyter release installed; 0.22.0 builds with rustc 1.95 (`--locked`). Keep in
/// step with `.ci/run`.
const EVCXR_VERSION: &str = "0.22.0";

/// The installed kernel binary, installing it first when missing.
fn evcxr_jupyter() -> PathBuf {
    let root = target_dir().join("evcxr");
    let bin = root.join("bin").join("evcxr_jupyter");
    if !bin.exists() {
        eprintln!(
            "installing evcxr_jupyter {EVCXR_VERSION} into {} (a cold build takes minutes)",
            root.display()
        );
        let cargo = std::env::var_os("CARGO").unwrap_or_else(|| "cargo".into());
        let st = Command::new(cargo)
            .args([
                "install",
                "evcxr_jupyter",
                "--locked",
                "--version",
                EVCXR_VERSION,
            ])
            .arg("--root")
            .arg(&root)
            // A temporary build folder of its own: the running `cargo test` holds the lock on
            // the shared target folder.
            .env_remove("CARGO_TARGET_DIR")
            .env_remove("CARGO_BUILD_TARGET_DIR")
            .status()
            .expect("cargo runs");
        assert!(
            st.success(),
            "cargo install evcxr_jupyter {EVCXR_VERSION} failed"
        );
    }
    bin
}

/// A Jupyter data folder holding the `rust` kernelspec for `bin`, with the argv that
/// `evcxr_jupyter --install` writes (evcxr_jupyter 0.22.0, src/install.rs); written here because
/// `--install` writes into the user's own Jupyter folder.
fn kernelspec(bin: &Path) -> tempfile::TempDir {
    let tmp = tempfile::tempdir().expect("temp dir");
    let dir = tmp.path().join("share/jupyter/kernels/rust");
    std::fs::create_dir_all(&dir).expect("kernel folder");
    let spec = serde_json::json!({
        "argv": [bin.to_string_lossy(), "--control_file", "{connection_file}"],
        "display_name": "Rust",
        "language": "rust",
        "interrupt_mode": "message",
    });
    std::fs::write(dir.join("kernel.json"), spec.to_string()).expect("kernel.json writable");
    tmp
}

/// A notebook field that nbformat writes either as one string or as a list of lines.
fn text(v: &Value) -> String {
    match v {
        Value::String(s) => s.clone(),
        Value::Array(a) => a.iter().filter_map(Value::as_str).collect(),
        _ => String::new(),
    }
}

/// The `mime` representation among the outputs of the code cell with id `id`.
fn shown(nb: &Value, id: &str, mime: &str) -> String {
    let cell = nb["cells"]
        .as_array()
        .and_then(|cells| cells.iter().find(|c| c["id"] == id))
        .unwrap_or_else(|| panic!("no cell {id}"));
    let outputs = cell["outputs"].as_array().cloned().unwrap_or_default();
    outputs
        .iter()
        .find_map(|o| o["data"].get(mime).map(text))
        .unwrap_or_else(|| panic!("cell {id} shows no {mime}: {outputs:?}"))
}

/// The leading number of `s` (after trimming), as the display wrote it.
fn number(s: &str) -> f64 {
    let s = s.trim();
    let end = s
        .find(|c: char| !(c.is_ascii_digit() || "+-.eE".contains(c)))
        .unwrap_or(s.len());
    s[..end]
        .parse()
        .unwrap_or_else(|_| panic!("no number at the start of {s:?}"))
}

/// The cells of the HTML table row labelled `label` (the label cell excluded).
fn row(html: &str, label: &str) -> Vec<String> {
    let head = format!("<th style=\"text-align:left\">{label}</th>");
    let start = html
        .find(&head)
        .unwrap_or_else(|| panic!("no row {label:?} in {html}"))
        + head.len();
    let end = start + html[start..].find("</tr>").expect("row ends");
    html[start..end]
        .split("</td>")
        .filter_map(|c| c.split_once('>').map(|(_, v)| v.to_string()))
        .collect()
}

#[test]
fn rust_notebook_shows_a_quantity_tables_and_a_figure() {
    let Some(python) = pyenv() else {
        return;
    };
    let bin = evcxr_jupyter();
    let jupyter = kernelspec(&bin);
    let manifest = Path::new(env!("CARGO_MANIFEST_DIR"));
    let notebook = manifest.join("notebooks").join("05_rust_library.ipynb");
    let out = target_dir()
        .join("notebook-outputs")
        .join("05_rust_library.ipynb");
    let script = manifest
        .join("tests")
        .join("evcxr_py")
        .join("run_notebook.py");
    let run = Command::new(python)
        .arg(&script)
        .arg(&notebook)
        .arg(&out)
        .env("JUPYTER_PATH", jupyter.path().join("share").join("jupyter"))
        .env("JUPYTER_RUNTIME_DIR", jupyter.path().join("runtime"))
        .env("JUPYTER_PLATFORM_DIRS", "1")
        .env("PYTHONUNBUFFERED", "1")
        // evcxr builds the cells in its own temporary crate; the test's cargo settings must not
        // leak into it.
        .env_remove("CARGO_TARGET_DIR")
        .env_remove("CARGO_BUILD_TARGET_DIR")
        .output()
        .expect("python runs");
    let report = String::from_utf8_lossy(&run.stdout);
    // Shown with --nocapture: the total and per-cell seconds.
    eprintln!(
        "--- run_notebook.py ---\n{report}\n{}",
        String::from_utf8_lossy(&run.stderr)
    );
    assert!(run.status.success(), "the Rust notebook failed: {report}");
    let nb: Value = serde_json::from_str(&std::fs::read_to_string(&out).expect("executed copy"))
        .expect("the executed notebook is JSON");

    // The shaft of the notebook: T = 20 N·m on a 10 mm solid 4340 shaft, GF 2.0.
    let (torque, d, gf): (f64, f64, f64) = (20.0, 0.010, 2.0);
    let m = gaugebook::material("4340").expect("4340 is in the table");
    let e = m.youngs_modulus().get::<pascal>();
    let g = e / (2.0 * (1.0 + m.poisson())); // G = E/(2(1+ν)), isotropic solid
    // τ = 16T/(πd³) and γ = τ/G for a solid round shaft (Timoshenko & Gere, *Mechanics of
    // Materials*, 4th ed., §3.3, from memory).
    let tau = 16.0 * torque / (std::f64::consts::PI * d.powi(3));
    let gamma = tau / g;

    // A quantity as readable text: pure shear reads ±γ/2 at ±45° (strain transformation,
    // ε(θ) = γxy sinθ cosθ when εx = εy = 0); positive torque gives negative γxy in the
    // element's surface frame, so the +45° gauge reads −γ/2.
    let strain = shown(&nb, "r07", "text/plain");
    assert!(strain.trim().ends_with("µε"), "{strain}");
    assert_close(number(&strain), -gamma / 2.0 * 1e6, 1e-5, 0.0);

    // The bridge report as an HTML table. Four active arms R(1 ± x) give an output of exactly
    // x = GF·γ/2 (bridge law identity for equal and opposite arms).
    let html = shown(&nb, "r09", "text/html");
    assert!(html.contains("<table"), "{html}");
    assert!(
        html.contains("<caption>bridge full-shear: rated output"),
        "{html}"
    );
    let ro = gf * gamma / 2.0 * 1e3; // mV/V
    let cells = row(&html, "rated output");
    assert_close(number(&cells[0]), ro, 1e-5, 0.0);
    assert_eq!(cells[1], "mV/V");
    let plain = shown(&nb, "r10", "text/plain");
    assert!(plain.trim().ends_with("mV/V"), "{plain}");
    assert_close(number(&plain), ro, 1e-5, 0.0);

    // The margins as an HTML table: von Mises of pure shear is √3·τ (Budynas & Nisbett,
    // *Shigley's Mechanical Engineering Design*, 9th ed., eq. 5-15, from memory).
    let html = shown(&nb, "r12", "text/html");
    let sy = m.yield_strength().get::<pascal>();
    let rated = row(&html, "rated");
    assert_close(number(&rated[1]), 3f64.sqrt() * tau / 1e6, 1e-5, 0.0);
    assert_close(number(&rated[3]), sy / (3f64.sqrt() * tau), 1e-5, 0.0);
    let ultimate = row(&html, "ultimate overload");
    assert_close(
        number(&ultimate[3]),
        sy / (3.0 * 3f64.sqrt() * tau),
        1e-5,
        0.0,
    );
    assert!(html.contains("licensed practice"), "{html}");

    // The figure as SVG (the notebook loads the `plot` feature).
    let svg = shown(&nb, "r14", "image/svg+xml");
    assert!(
        svg.trim_start().starts_with("<svg"),
        "{}",
        &svg[..svg.len().min(200)]
    );
    let caption = shown(&nb, "r14", "text/plain");
    assert!(
        caption.contains("bridge output over the torque range"),
        "{caption}"
    );
}
