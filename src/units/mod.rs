//! Units: uom-typed aliases for the Rust API, strain and output-ratio newtypes, and the dynamic
//! [`Quantity`] with its unit table and parser for scripts.
//!
//! This layer depends on std and uom only.

mod dimension;
mod kind;
pub mod si;
mod strain;

pub use dimension::Dimension;
pub use kind::Kind;
pub use si::*;
pub use strain::{OutputRatio, Strain};
