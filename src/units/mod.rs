//! Units: uom-typed aliases for the Rust API, strain and output-ratio newtypes, and the dynamic
//! [`Quantity`] with its unit table and parser for scripts.
//!
//! This layer depends on std and uom only.

mod dimension;
mod error;
mod format;
mod interop;
mod kind;
mod parse;
mod quantity;
pub mod si;
mod strain;
mod table;
mod unit;

pub use dimension::Dimension;
pub use error::UnitError;
pub use kind::Kind;
pub use quantity::Quantity;
pub use si::*;
pub use strain::{OutputRatio, Strain};
pub use unit::Unit;
