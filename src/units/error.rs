//! Errors of the units layer: unknown units, malformed quantities, incompatible operands.

use thiserror::Error;

/// An error from parsing a unit or quantity, or from combining quantities.
///
/// Messages name both sides in units a person reads.
///
/// ```
/// use gaugebook::units::Quantity;
/// let r = Quantity::parse("350 ohm")?;
/// let v = Quantity::parse("5 V")?;
/// let e = r.try_add(&v).unwrap_err();
/// assert_eq!(e.to_string(), "cannot add 350 Ω and 5 V");
/// # Ok::<(), gaugebook::units::UnitError>(())
/// ```
#[derive(Debug, Clone, PartialEq, Error)]
#[non_exhaustive]
pub enum UnitError {
    /// A unit symbol that is not in the table.
    #[error("unknown unit `{symbol}` in `{text}` at character {position}")]
    UnknownUnit {
        /// The whole text being parsed.
        text: String,
        /// The symbol that was not recognised.
        symbol: String,
        /// Character offset of the symbol in `text` (0-based).
        position: usize,
    },
    /// Text that is not a number followed by a unit.
    #[error("cannot read `{text}` as a quantity: {reason}")]
    BadQuantity {
        /// The text.
        text: String,
        /// What is wrong with it.
        reason: String,
    },
    /// Two operands whose dimensions or kinds do not allow the operation.
    #[error("cannot {op} {left} and {right}")]
    Incompatible {
        /// The operation in words: "add", "subtract", "compare".
        op: &'static str,
        /// The left operand as written for a person.
        left: String,
        /// The right operand as written for a person.
        right: String,
    },
    /// A quantity asked for in a unit of another dimension or kind.
    #[error("cannot express {quantity} in {unit}")]
    NotConvertible {
        /// The quantity as written for a person.
        quantity: String,
        /// The unit asked for.
        unit: String,
    },
    /// An operation with no meaning for this quantity (square root of m³, a power of °C …).
    #[error("cannot {op} {operand}: {reason}")]
    Undefined {
        /// The operation.
        op: &'static str,
        /// The operand as written for a person.
        operand: String,
        /// Why.
        reason: String,
    },
    /// A unit expression that is not well formed (a dangling operator, a missing parenthesis,
    /// a number inside the unit).
    #[error("cannot read unit `{text}` at character {position}: {reason}")]
    Malformed {
        /// The whole text being parsed.
        text: String,
        /// Character offset of the problem in `text` (0-based).
        position: usize,
        /// What is wrong.
        reason: String,
    },
    /// Two temperature readings added (or a reading subtracted from a difference): readings on
    /// a scale do not add.
    #[error(
        "cannot {op} {left} and {right}: both are temperature readings; add a difference (K, Δ°C) to a reading, or subtract two readings"
    )]
    TemperatureReadings {
        /// The operation in words.
        op: &'static str,
        /// The left operand as written for a person.
        left: String,
        /// The right operand as written for a person.
        right: String,
    },
    /// A temperature difference asked for on a temperature scale: a conversion never turns a
    /// difference into a reading.
    #[error(
        "cannot express the temperature difference {quantity} in {unit}: add it to a reading (20 °C + {quantity}) instead"
    )]
    DifferenceAsReading {
        /// The difference as written for a person.
        quantity: String,
        /// The scale asked for.
        unit: String,
    },
    /// A quantity handed to the Rust API as a uom quantity or newtype of another dimension or
    /// kind.
    #[error("expected {expected}, found {found}")]
    WrongQuantity {
        /// What was expected, in words with its SI unit ("a force (N)").
        expected: &'static str,
        /// The quantity found, as written for a person.
        found: String,
    },
}
