//! Check-weighing: a station that accepts packages within a tolerance of a target mass, built
//! on a layout's bridge balanced at the target with a trim resistor.
//!
//! Design estimates must be proven by test; legal-for-trade use (type approval, verification
//! of automatic catchweighing instruments) follows local codes and licensed practice.

mod station;

pub use station::{CheckWeigher, CheckWeighing, STANDARD_GRAVITY, WEIGHING_CAUTION};
