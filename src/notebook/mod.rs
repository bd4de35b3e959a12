//! Headless notebooks: run a Gaugebook `.ipynb` natively (no Python, no kernel process), write
//! its outputs and provenance back in nbformat 4.5, and verify a recorded notebook by rerunning
//! it and comparing every output, numbers within a tolerance.
//!
//! | file            | holds |
//! |-----------------|-------|
//! | `format.rs`     | [`Notebook`], [`Cell`], [`Output`]: nbformat 4 reading and atomic writing |
//! | `run.rs`        | [`run_notebook`]: cells in one session, outputs recorded as Jupyter does |
//! | `provenance.rs` | [`Provenance`]: versions and input-file SHA-256 in the metadata |
//! | `compare.rs`    | number-aware text comparison |
//! | `verify.rs`     | [`verify_notebook`] and its [`VerifyReport`] |
//! | `html.rs`       | [`Notebook::to_html_section`] and [`html_page`]: a static report page |
//! | `error.rs`      | [`NotebookError`] |

mod compare;
mod error;
mod format;
mod html;
mod provenance;
mod run;
mod verify;

pub use error::NotebookError;
pub use format::{Cell, CellKind, Notebook, Output};
pub use html::html_page;
pub use provenance::{Provenance, file_hash, rhai_version};
pub use run::{RunOptions, run_notebook};
pub use verify::{Drift, DriftKind, NumberChange, VerifyOptions, VerifyReport, verify_notebook};
