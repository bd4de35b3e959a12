//! Units: uom-typed aliases for the Rust API, strain and output-ratio newtypes, and the dynamic
//! [`Quantity`] with its unit table and parser for scripts.
//!
//! This layer depends on std and uom only.
//!
//! - `si.rs`: the uom aliases of the physics API; `strain.rs`: [`Strain`] and [`OutputRatio`].
//! - `table.rs`: the symbol table, built from uom's unit definitions and corrected to the exact
//!   definitions of NIST SP 811 and the SI Brochure; `parse.rs`: compound unit expressions;
//!   `unit.rs`: [`Unit`].
//! - `quantity.rs`: [`Quantity`], with the kind rules of [`Kind`]; `format.rs`: how it prints;
//!   `interop.rs`: `From`/`TryFrom` between [`Quantity`] and the uom types.
//!
//! ```
//! use gaugebook::units::Quantity;
//! let r = Quantity::parse("350 ohm")?;
//! let v = Quantity::parse("2.5 mV/V")?.mul(&Quantity::parse("5 V")?);
//! assert_eq!(v.to_string(), "12.5 mV");
//! assert_eq!(v.div(&r).to_string(), "35.7143 µA");
//! # Ok::<(), gaugebook::units::UnitError>(())
//! ```

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
