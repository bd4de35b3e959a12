//! Integration tests, one binary so the dependency tree links once. One module per area.

mod bridge;
mod calib;
#[cfg(feature = "script")]
mod calib_script;
mod chain;
#[cfg(feature = "cli")]
mod cli;
mod common;
mod data;
#[cfg(feature = "cli")]
mod demo;
#[cfg(feature = "kernel")]
mod evcxr;
mod examples;
mod gauge;
#[cfg(feature = "kernel")]
mod kernel;
mod layout;
#[cfg(feature = "script")]
mod notebook;
#[cfg(feature = "plot")]
mod plot;
#[cfg(feature = "script")]
mod regression;
#[cfg(feature = "plot")]
mod report;
mod rosette;
#[cfg(feature = "script")]
mod script;
#[cfg(all(feature = "script", feature = "data"))]
mod script_data;
mod signal;
mod spring;
mod standards;
mod uncertainty;
mod units;
mod weighing;
