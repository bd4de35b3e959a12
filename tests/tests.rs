//! Integration tests, one binary so the dependency tree links once. One module per area.

mod common;
mod units;
