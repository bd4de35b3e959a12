//! Integration tests, one binary so the dependency tree links once. One module per area.

mod bridge;
mod common;
mod gauge;
#[cfg(feature = "plot")]
mod plot;
mod signal;
