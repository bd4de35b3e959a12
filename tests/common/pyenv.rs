//! The Python virtual environment the Jupyter real-client tests drive (jupyter_client, nbclient,
//! jupyter_kernel_test from PyPI), provisioned once into the target folder (`target/pyenv`,
//! reused when present) and shared by the Gaugebook kernel tests and the evcxr notebook test.

use std::path::{Path, PathBuf};
use std::process::Command;
use std::sync::OnceLock;

/// Packages the client side needs, from PyPI (ipykernel only for the latency comparison).
const PY_PACKAGES: &[&str] = &[
    "jupyter_client",
    "nbclient",
    "nbformat",
    "jupyter_kernel_test",
    "ipykernel",
];

/// The cargo target folder (the test binary lives in target/<profile>/deps/).
pub fn target_dir() -> PathBuf {
    let exe = std::env::current_exe().expect("the test binary knows its own path");
    exe.ancestors()
        .nth(3)
        .map(Path::to_path_buf)
        .unwrap_or_else(|| PathBuf::from("target"))
}

fn find_python() -> Option<PathBuf> {
    let candidates = std::env::var_os("GAUGEBOOK_PYTHON")
        .map(PathBuf::from)
        .into_iter()
        .chain(["python3", "python"].map(PathBuf::from));
    for c in candidates {
        let ok = Command::new(&c)
            .args(["-c", "import sys, venv; assert sys.version_info >= (3, 9)"])
            .output()
            .is_ok_and(|o| o.status.success());
        if ok {
            return Some(c);
        }
    }
    None
}

/// The venv's python, creating and filling the venv on first use. `None` when Python is missing.
pub fn pyenv() -> Option<PathBuf> {
    static ENV: OnceLock<Option<PathBuf>> = OnceLock::new();
    ENV.get_or_init(|| {
        let Some(python) = find_python() else {
            eprintln!(
                "\n\n!!!!!!!! SKIPPED: the Jupyter real-client tests need Python 3 (python3 on \
                 PATH or GAUGEBOOK_PYTHON) and found none !!!!!!!!\n\n"
            );
            return None;
        };
        let dir = target_dir().join("pyenv");
        let bin = if cfg!(windows) {
            dir.join("Scripts").join("python.exe")
        } else {
            dir.join("bin").join("python")
        };
        if !dir.join(".gaugebook-ready").exists() {
            if !bin.exists() {
                let st = Command::new(&python)
                    .args(["-m", "venv"])
                    .arg(&dir)
                    .status()
                    .expect("python -m venv runs");
                assert!(st.success(), "python -m venv {} failed", dir.display());
            }
            pip_install_once(&bin, ".gaugebook-ready", PY_PACKAGES);
        }
        Some(bin)
    })
    .clone()
}

/// Installs `packages` from PyPI into the venv of `python`, once: a marker file `marker` in the
/// venv folder records that it was done.
pub fn pip_install_once(python: &Path, marker: &str, packages: &[&str]) {
    let ready = target_dir().join("pyenv").join(marker);
    if ready.exists() {
        return;
    }
    let st = Command::new(python)
        .args([
            "-m",
            "pip",
            "install",
            "--quiet",
            "--disable-pip-version-check",
        ])
        .args(packages)
        .status()
        .expect("pip runs");
    assert!(st.success(), "pip install {packages:?} failed");
    std::fs::write(&ready, packages.join("\n")).expect("marker file is writable");
}
