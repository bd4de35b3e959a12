//! Integration tests, one binary so the dependency tree links once. One module per area.

mod calib;
mod common;
mod standards;
mod uncertainty;
