//! Integration tests, one binary so the dependency tree links once. One module per area.

mod bridge;
mod chain;
mod common;
mod gauge;
mod rosette;
mod signal;
