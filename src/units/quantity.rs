//! The dynamic quantity of the scripting layer: an SI value with its dimension, kind and a
//! preferred display unit.
//!
//! Store SI, convert at the edges: construction, parsing, [`Quantity::to`] and display are the
//! only places a unit's factor appears. The kind rules are those of [`Kind`].

use std::cmp::Ordering;
use std::fmt;
use std::sync::Arc;

use super::{Dimension, Kind, Unit, UnitError, format, parse};

/// A value with a unit, checked at run time.
///
/// Stores SI; the display unit only decides how the value is printed.
///
/// ```
/// use gaugebook::units::Quantity;
/// let r = Quantity::parse("350 ohm")?;
/// let v = Quantity::parse("5 V")?;
/// let i = v.div(&r);
/// assert_eq!(i.to_string(), "14.2857 mA");
/// assert!((r.value_in("kohm")? - 0.35).abs() < 1e-12);
/// assert_eq!(r.try_add(&v).unwrap_err().to_string(), "cannot add 350 Ω and 5 V");
/// # Ok::<(), gaugebook::units::UnitError>(())
/// ```
///
/// The physics API takes uom quantities and the [`Strain`](crate::Strain) and
/// [`OutputRatio`](crate::OutputRatio) newtypes; `From` and `TryFrom` bridge them, checking
/// dimension and kind:
///
/// ```
/// use gaugebook::Strain;
/// use gaugebook::units::{Force, Quantity};
/// use uom::si::force::newton;
/// let f = Force::try_from(&Quantity::parse("2 kN")?)?;
/// assert_eq!(f.get::<newton>(), 2000.0);
/// assert_eq!(Quantity::from(f).to_string(), "2 kN");
/// let e = Strain::try_from(Quantity::parse("0.5 mV/V")?).unwrap_err();
/// assert_eq!(e.to_string(), "expected a strain (µε, ε), found 0.5 mV/V");
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
    /// A quantity from an SI value, with no preferred display unit. The kind is fitted to the
    /// dimension ([`Kind::fit`]): a plain quantity in kelvin is a temperature difference.
    ///
    /// ```
    /// use gaugebook::{Dimension, Kind, units::Quantity};
    /// let e = Quantity::from_si(1e-3, Dimension::NONE, Kind::Strain);
    /// assert_eq!(e.si(), 1e-3);
    /// assert_eq!(e.to_string(), "1000 µε");
    /// ```
    pub fn from_si(si: f64, dim: Dimension, kind: Kind) -> Quantity {
        Quantity {
            si,
            dim,
            kind: kind.fit(dim),
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

    /// A value in a named unit: `Quantity::new(350.0, "ohm")`. The unit becomes the display
    /// unit.
    ///
    /// ```
    /// let r = gaugebook::units::Quantity::new(350.0, "ohm")?;
    /// assert_eq!(r.si(), 350.0);
    /// assert_eq!(r.to_string(), "350 Ω");
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
            unit: if unit.symbol().is_empty() {
                None
            } else {
                Some(unit)
            },
        }
    }

    /// Parses a number followed by a unit: `"350 ohm"`, `"2.5 mV/V"`, `"-40 degC"`,
    /// `"1.5e3 N*m"`, `"12 lbf·in"`. The space is optional (`"350Ω"`); a number alone is
    /// plain. Error positions count characters of `text`.
    ///
    /// ```
    /// use gaugebook::{Kind, units::Quantity};
    /// let v = Quantity::parse("2.5 mV/V")?;
    /// assert_eq!((v.si(), v.kind()), (2.5e-3, Kind::OutputRatio));
    /// assert!((Quantity::parse("-40 degC")?.si() - 233.15).abs() < 1e-12);
    /// assert_eq!(Quantity::parse("1.5e3 N*m")?.to_string(), "1500 N·m");
    /// let e = Quantity::parse("12 lbf·inch·furlong").unwrap_err();
    /// assert_eq!(e.to_string(), "unknown unit `furlong` in `12 lbf·inch·furlong` at character 12");
    /// # Ok::<(), gaugebook::units::UnitError>(())
    /// ```
    pub fn parse(text: &str) -> Result<Quantity, UnitError> {
        let chars: Vec<char> = text.chars().collect();
        let mut i = 0;
        while i < chars.len() && chars[i].is_whitespace() {
            i += 1;
        }
        let start = i;
        let mut num = String::new();
        if i < chars.len() && matches!(chars[i], '+' | '-' | '−') {
            num.push(if chars[i] == '+' { '+' } else { '-' });
            i += 1;
        }
        let mut digits = 0;
        while i < chars.len() && (chars[i].is_ascii_digit() || chars[i] == '.' || chars[i] == '_') {
            if chars[i] != '_' {
                num.push(chars[i]);
            }
            digits += usize::from(chars[i].is_ascii_digit());
            i += 1;
        }
        // An exponent only when digits follow it, so `2 e` is not read as `2e`.
        if i < chars.len() && matches!(chars[i], 'e' | 'E') {
            let mut j = i + 1;
            let mut exp = String::from("e");
            if j < chars.len() && matches!(chars[j], '+' | '-' | '−') {
                exp.push(if chars[j] == '+' { '+' } else { '-' });
                j += 1;
            }
            let k = j;
            while j < chars.len() && chars[j].is_ascii_digit() {
                exp.push(chars[j]);
                j += 1;
            }
            if j > k {
                num.push_str(&exp);
                i = j;
            }
        }
        if digits == 0 {
            return Err(UnitError::BadQuantity {
                text: text.to_string(),
                reason: format!("expected a number at character {start}"),
            });
        }
        let value: f64 = num.parse().map_err(|_| UnitError::BadQuantity {
            text: text.to_string(),
            reason: format!("`{num}` is not a number"),
        })?;
        if !value.is_finite() {
            return Err(UnitError::BadQuantity {
                text: text.to_string(),
                reason: format!("`{num}` is too large for a 64-bit float"),
            });
        }
        let unit = parse::parse_unit_in(text, i)?;
        Ok(Quantity::in_unit(value, Arc::new(unit)))
    }

    /// The value in SI base units (kelvin for temperatures, m/m for strain, V/V for output
    /// ratio, rad for angles).
    ///
    /// ```
    /// assert_eq!(gaugebook::units::Quantity::parse("1 psi")?.si(), 6894.757293168361);
    /// # Ok::<(), gaugebook::units::UnitError>(())
    /// ```
    pub fn si(&self) -> f64 {
        self.si
    }

    /// The dimension.
    ///
    /// ```
    /// use gaugebook::{Dimension, units::Quantity};
    /// assert_eq!(Quantity::parse("3 mm")?.dimension(), Dimension::LENGTH);
    /// # Ok::<(), gaugebook::units::UnitError>(())
    /// ```
    pub fn dimension(&self) -> Dimension {
        self.dim
    }

    /// The kind.
    ///
    /// ```
    /// use gaugebook::{Kind, units::Quantity};
    /// assert_eq!(Quantity::parse("500 ue")?.kind(), Kind::Strain);
    /// # Ok::<(), gaugebook::units::UnitError>(())
    /// ```
    pub fn kind(&self) -> Kind {
        self.kind
    }

    /// The preferred display unit, if one was given.
    ///
    /// ```
    /// use gaugebook::units::Quantity;
    /// assert_eq!(Quantity::parse("3 mm")?.unit().map(|u| u.symbol()), Some("mm"));
    /// assert!(Quantity::number(3.0).unit().is_none());
    /// # Ok::<(), gaugebook::units::UnitError>(())
    /// ```
    pub fn unit(&self) -> Option<&Unit> {
        self.unit.as_deref()
    }

    /// The unit the quantity is shown in: its display unit if it has one, else the SI unit that
    /// [`Display`](fmt::Display) chooses from its dimension, kind and size (a product of a
    /// strain and a modulus shows in `MPa`). `None` for a plain number, or for a dimension that
    /// shows in base units only.
    ///
    /// ```
    /// use gaugebook::units::Quantity;
    /// let s = Quantity::parse("100 ue")?.mul(&Quantity::parse("210 GPa")?);
    /// assert!(s.unit().is_none());
    /// assert_eq!(s.shown_unit().map(|u| u.symbol().to_string()), Some("MPa".to_string()));
    /// assert!(Quantity::number(2.0).shown_unit().is_none());
    /// # Ok::<(), gaugebook::units::UnitError>(())
    /// ```
    pub fn shown_unit(&self) -> Option<Unit> {
        if let Some(u) = &self.unit {
            return Some(u.as_ref().clone());
        }
        let (_, symbol) = format::auto(self.si, self.dim, self.kind);
        if symbol.is_empty() {
            return None;
        }
        Unit::parse(&symbol)
            .ok()
            .filter(|u| u.dimension() == self.dim && u.kind() == self.kind)
    }

    /// The same quantity with another kind (same dimension, same SI value, no display unit):
    /// how a script says that a computed ratio is a strain. A kind that does not suit the
    /// dimension is fitted to it ([`Kind::fit`]).
    ///
    /// ```
    /// use gaugebook::{Kind, units::Quantity};
    /// let e = Quantity::number(1e-3).with_kind(Kind::Strain);
    /// assert_eq!(e.kind(), Kind::Strain);
    /// assert_eq!(e.to_string(), "1000 µε");
    /// ```
    pub fn with_kind(mut self, kind: Kind) -> Quantity {
        self.kind = kind.fit(self.dim);
        self.unit = None;
        self
    }

    /// Re-expresses the quantity in another unit, which becomes its display unit.
    ///
    /// The unit must have the same dimension and a compatible kind: the same kind; or a named
    /// plain ratio (`%`, `ppm`) for a strain or output ratio (`1000 µε` in `%` is `0.1 %`, still
    /// a strain; a bare number is refused, so a strain cannot pass for a plain ratio); or, for a
    /// temperature reading, a difference unit counted from absolute zero (`25 °C` in `K` is
    /// `298.15 K`, still a reading). A difference is never converted to a reading (`5 K` in
    /// `degC` is refused; see [`Kind`]).
    ///
    /// ```
    /// use gaugebook::units::Quantity;
    /// let r = Quantity::parse("174650 ohm")?.to("kohm")?;
    /// assert_eq!(r.to_string(), "174.65 kΩ");
    /// assert_eq!(Quantity::parse("25 degC")?.to("K")?.to_string(), "298.15 K");
    /// assert!(Quantity::parse("5 K")?.to("degC").is_err());
    /// let e = Quantity::parse("500 ue")?.to("mV/V").unwrap_err();
    /// assert_eq!(e.to_string(), "cannot express 500 µε in mV/V");
    /// # Ok::<(), gaugebook::units::UnitError>(())
    /// ```
    pub fn to(&self, unit: &str) -> Result<Quantity, UnitError> {
        let u = Unit::parse(unit)?;
        self.to_unit(Arc::new(u))
    }

    /// [`Quantity::to`] with an already parsed unit.
    ///
    /// ```
    /// use std::sync::Arc;
    /// use gaugebook::units::{Quantity, Unit};
    /// let mm = Arc::new(Unit::parse("mm")?);
    /// assert_eq!(Quantity::parse("0.35 m")?.to_unit(mm)?.to_string(), "350 mm");
    /// # Ok::<(), gaugebook::units::UnitError>(())
    /// ```
    pub fn to_unit(&self, unit: Arc<Unit>) -> Result<Quantity, UnitError> {
        let kind = self.converted_kind(&unit)?;
        Ok(Quantity {
            si: self.si,
            dim: self.dim,
            kind,
            unit: Some(unit),
        })
    }

    /// The number this quantity is in the given unit (the rules of [`Quantity::to`]).
    ///
    /// ```
    /// use gaugebook::units::Quantity;
    /// let f = Quantity::parse("2.5 kN")?;
    /// assert_eq!(f.value_in("N")?, 2500.0);
    /// assert!(f.value_in("V").is_err());
    /// assert!((Quantity::parse("25 degC")?.value_in("degF")? - 77.0).abs() < 1e-12);
    /// # Ok::<(), gaugebook::units::UnitError>(())
    /// ```
    pub fn value_in(&self, unit: &str) -> Result<f64, UnitError> {
        let u = Unit::parse(unit)?;
        self.converted_kind(&u)?;
        Ok(u.from_si(self.si))
    }

    /// The kind after re-expressing in `u`, or why it cannot be.
    fn converted_kind(&self, u: &Unit) -> Result<Kind, UnitError> {
        use Kind::*;
        let kind = if self.dim != u.dimension() {
            None
        } else {
            match (self.kind, u.kind()) {
                (a, b) if a == b => Some(a),
                (Strain | OutputRatio, Plain) if !u.symbol().is_empty() => Some(self.kind),
                (AbsoluteTemperature, TemperatureInterval) => Some(AbsoluteTemperature),
                _ => None,
            }
        };
        if kind.is_none() && self.kind == TemperatureInterval && u.kind() == AbsoluteTemperature {
            return Err(UnitError::DifferenceAsReading {
                quantity: self.to_string(),
                unit: u.symbol().into(),
            });
        }
        kind.ok_or_else(|| UnitError::NotConvertible {
            quantity: self.to_string(),
            unit: if u.symbol().is_empty() {
                "a plain number".into()
            } else {
                u.symbol().into()
            },
        })
    }

    fn incompatible(&self, op: &'static str, other: &Quantity) -> UnitError {
        let (left, right) = (self.to_string(), other.to_string());
        if self.kind == Kind::AbsoluteTemperature && other.kind == Kind::AbsoluteTemperature {
            UnitError::TemperatureReadings { op, left, right }
        } else {
            UnitError::Incompatible { op, left, right }
        }
    }

    /// `self + other`: equal dimensions and kinds ([`Kind::combine_additive`]); a temperature
    /// reading plus a difference is a reading. The result keeps the left operand's display
    /// unit when it suits the result.
    ///
    /// ```
    /// use gaugebook::units::Quantity;
    /// let a = Quantity::parse("1.5 kN")?.try_add(&Quantity::parse("500 N")?)?;
    /// assert_eq!(a.to_string(), "2 kN");
    /// let t = Quantity::parse("20 degC")?.try_add(&Quantity::parse("5 K")?)?;
    /// assert_eq!(t.to_string(), "25 °C");
    /// let e = Quantity::parse("20 degC")?.try_add(&Quantity::parse("5 degC")?).unwrap_err();
    /// assert!(e.to_string().starts_with("cannot add 20 °C and 5 °C"));
    /// let e = Quantity::parse("1000 ue")?.try_add(&Quantity::parse("2 mV/V")?).unwrap_err();
    /// assert_eq!(e.to_string(), "cannot add 1000 µε and 2 mV/V");
    /// # Ok::<(), gaugebook::units::UnitError>(())
    /// ```
    pub fn try_add(&self, other: &Quantity) -> Result<Quantity, UnitError> {
        let kind = (self.dim == other.dim)
            .then(|| self.kind.combine_additive(other.kind))
            .flatten()
            .ok_or_else(|| self.incompatible("add", other))?;
        Ok(Quantity {
            si: self.si + other.si,
            dim: self.dim,
            kind,
            unit: self.unit_for(kind, other),
        })
    }

    /// `self - other`; two temperature readings give a difference, shown in the difference
    /// unit of the left reading's scale.
    ///
    /// ```
    /// use gaugebook::units::Quantity;
    /// let d = Quantity::parse("80 degF")?.try_sub(&Quantity::parse("62 degF")?)?;
    /// assert_eq!(d.to_string(), "18 Δ°F");
    /// assert_eq!(d.value_in("K")?, 10.0);
    /// # Ok::<(), gaugebook::units::UnitError>(())
    /// ```
    pub fn try_sub(&self, other: &Quantity) -> Result<Quantity, UnitError> {
        let kind = (self.dim == other.dim)
            .then(|| self.kind.combine_difference(other.kind))
            .flatten()
            .ok_or_else(|| self.incompatible("subtract", other))?;
        Ok(Quantity {
            si: self.si - other.si,
            dim: self.dim,
            kind,
            unit: self.unit_for(kind, other),
        })
    }

    /// The display unit of a sum or difference: the first operand unit that suits `kind`, a
    /// reading's scale turned into its difference unit for a difference of readings.
    fn unit_for(&self, kind: Kind, other: &Quantity) -> Option<Arc<Unit>> {
        let mut candidates = [&self.unit, &other.unit].into_iter().flatten();
        if kind == Kind::TemperatureInterval
            && self.kind == Kind::AbsoluteTemperature
            && other.kind == Kind::AbsoluteTemperature
        {
            return self.unit.as_ref().map(|u| Arc::new(u.difference()));
        }
        candidates
            .find(|u| match (u.kind(), kind) {
                (a, b) if a == b => true,
                // A strain shown in % stays in %.
                (Kind::Plain, Kind::Strain | Kind::OutputRatio) => true,
                _ => false,
            })
            .cloned()
    }

    /// `self * other`: dimensions multiply, kinds combine by [`Kind::combine_multiplicative`]
    /// and [`Kind::fit`]. The result has no display unit (it is shown by its dimension).
    ///
    /// ```
    /// use gaugebook::units::Quantity;
    /// let m = Quantity::parse("2 kN")?.mul(&Quantity::parse("150 mm")?);
    /// assert_eq!(m.to_string(), "300 N·m");
    /// let s = Quantity::parse("200 GPa")?.mul(&Quantity::parse("1000 ue")?);
    /// assert_eq!(s.to_string(), "200 MPa");
    /// # Ok::<(), gaugebook::units::UnitError>(())
    /// ```
    pub fn mul(&self, other: &Quantity) -> Quantity {
        let kind = self.kind.combine_multiplicative(other.kind);
        Quantity::from_si(self.si * other.si, self.dim * other.dim, kind)
    }

    /// `self / other`: kinds combine by [`Kind::combine_quotient`] (strain/strain is plain).
    ///
    /// ```
    /// use gaugebook::{Kind, units::Quantity};
    /// let r = Quantity::parse("300 ue")?.div(&Quantity::parse("1000 ue")?);
    /// assert_eq!((r.kind(), r.to_string()), (Kind::Plain, "0.3".to_string()));
    /// # Ok::<(), gaugebook::units::UnitError>(())
    /// ```
    pub fn div(&self, other: &Quantity) -> Quantity {
        let kind = self.kind.combine_quotient(other.kind);
        Quantity::from_si(self.si / other.si, self.dim / other.dim, kind)
    }

    /// Multiplies by a plain number, keeping kind and display unit; a temperature reading
    /// scaled becomes a kelvin value (a difference), because `2 × 20 °C` has no meaning on the
    /// Celsius scale.
    ///
    /// ```
    /// use gaugebook::units::Quantity;
    /// let f = Quantity::parse("2 kN")?.scale(3.0);
    /// assert_eq!(f.to_string(), "6 kN");
    /// assert_eq!(Quantity::parse("-3 degC")?.scale(1.0).to_string(), "270.15 K");
    /// # Ok::<(), gaugebook::units::UnitError>(())
    /// ```
    pub fn scale(&self, k: f64) -> Quantity {
        if self.kind == Kind::AbsoluteTemperature {
            return Quantity::from_si(self.si * k, self.dim, Kind::TemperatureInterval);
        }
        Quantity {
            si: self.si * k,
            ..self.clone()
        }
    }

    /// Integer power. `n = 1` is the quantity itself; otherwise kinds other than a
    /// temperature difference become plain (strain² is a number), and temperatures count in
    /// kelvin.
    ///
    /// ```
    /// use gaugebook::units::Quantity;
    /// let a = Quantity::parse("5 mm")?.powi(2);
    /// assert_eq!(a.to_string(), "25 mm²");
    /// assert_eq!(Quantity::parse("2 s")?.powi(-1).to_string(), "500 mHz");
    /// # Ok::<(), gaugebook::units::UnitError>(())
    /// ```
    pub fn powi(&self, n: i32) -> Quantity {
        if n == 1 {
            return self.clone();
        }
        let kind = match self.kind {
            Kind::TemperatureInterval | Kind::AbsoluteTemperature => Kind::TemperatureInterval,
            _ => Kind::Plain,
        };
        Quantity::from_si(self.si.powi(n), self.dim.powi(n), kind)
    }

    /// Square root; refused when an exponent of the dimension is odd (√m³) or the value is
    /// negative.
    ///
    /// ```
    /// use gaugebook::units::Quantity;
    /// assert_eq!(Quantity::parse("25 mm^2")?.sqrt()?.to_string(), "5 mm");
    /// let e = Quantity::parse("8 m^3")?.sqrt().unwrap_err();
    /// assert_eq!(e.to_string(), "cannot take the square root of 8 m³: its dimension m³ has an odd exponent");
    /// # Ok::<(), gaugebook::units::UnitError>(())
    /// ```
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

    /// The magnitude. A temperature reading is stored as its thermodynamic temperature, which
    /// is never negative, so it comes back unchanged (|−40 °C| is still −40 °C).
    ///
    /// ```
    /// use gaugebook::units::Quantity;
    /// assert_eq!(Quantity::parse("-500 ue")?.abs().to_string(), "500 µε");
    /// # Ok::<(), gaugebook::units::UnitError>(())
    /// ```
    pub fn abs(&self) -> Quantity {
        Quantity {
            si: self.si.abs(),
            ..self.clone()
        }
    }

    /// Negation. The negative of a temperature reading is no reading; it comes back as the
    /// negative kelvin value (a difference).
    ///
    /// ```
    /// use gaugebook::units::Quantity;
    /// assert_eq!(Quantity::parse("2 mV/V")?.neg().to_string(), "-2 mV/V");
    /// assert_eq!(Quantity::parse("0 degC")?.neg().to_string(), "-273.15 K");
    /// # Ok::<(), gaugebook::units::UnitError>(())
    /// ```
    pub fn neg(&self) -> Quantity {
        if self.kind == Kind::AbsoluteTemperature {
            return Quantity::from_si(-self.si, self.dim, Kind::TemperatureInterval);
        }
        Quantity {
            si: -self.si,
            ..self.clone()
        }
    }

    /// Compares two quantities of one dimension and one kind; a NaN compares with nothing.
    ///
    /// ```
    /// use std::cmp::Ordering;
    /// use gaugebook::units::Quantity;
    /// let a = Quantity::parse("1 in")?;
    /// assert_eq!(a.try_cmp(&Quantity::parse("25 mm")?)?, Ordering::Greater);
    /// let e = a.try_cmp(&Quantity::parse("1 V")?).unwrap_err();
    /// assert_eq!(e.to_string(), "cannot compare 1 in and 1 V");
    /// # Ok::<(), gaugebook::units::UnitError>(())
    /// ```
    pub fn try_cmp(&self, other: &Quantity) -> Result<Ordering, UnitError> {
        if self.dim != other.dim || self.kind != other.kind {
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

/// Writes the value in its display unit, else in a unit chosen from its dimension and kind,
/// with 6 significant figures (`{:.3}` asks for 3): `0.4995 mV/V`, `1000 µε`, `174.65 kΩ`.
///
/// ```
/// use gaugebook::units::Quantity;
/// let r = Quantity::parse("350 ohm")?.scale(1.0 / 3.0);
/// assert_eq!(r.to_string(), "116.667 Ω");
/// assert_eq!(format!("{r:.3}"), "117 Ω");
/// # Ok::<(), gaugebook::units::UnitError>(())
/// ```
impl fmt::Display for Quantity {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        let sig = f
            .precision()
            .map_or(format::SIGNIFICANT, |p| p.min(17) as i32);
        let s = match &self.unit {
            Some(u) => format::join_sig(u.from_si(self.si), u.symbol(), sig),
            None => {
                let (v, u) = format::auto(self.si, self.dim, self.kind);
                format::join_sig(v, &u, sig)
            }
        };
        f.write_str(&s)
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    fn q(s: &str) -> Quantity {
        Quantity::parse(s).unwrap_or_else(|e| panic!("{s}: {e}"))
    }

    #[test]
    fn parses_the_forms_scripts_use() {
        assert_eq!(q("350 ohm").to_string(), "350 Ω");
        assert_eq!(q("2.5 mV/V").to_string(), "2.5 mV/V");
        assert_eq!(q("-40 degC").to_string(), "-40 °C");
        assert_eq!(q("1.5e3 N*m").si(), 1500.0);
        assert!((q("12 lbf·in").si() - 12.0 * 0.112_984_829_027_616_7).abs() < 1e-14);
        assert_eq!(q("350Ω").si(), 350.0);
        assert_eq!(q(" 2 ").to_string(), "2");
        assert_eq!(q("1_000 ue").si(), 1e-3);
    }

    #[test]
    fn bad_numbers() {
        assert!(matches!(
            Quantity::parse("ohm"),
            Err(UnitError::BadQuantity { .. })
        ));
        assert!(matches!(
            Quantity::parse("1.2.3 V"),
            Err(UnitError::BadQuantity { .. })
        ));
        assert!(matches!(
            Quantity::parse(""),
            Err(UnitError::BadQuantity { .. })
        ));
    }

    #[test]
    fn overflowing_numbers() {
        let e = Quantity::parse("1e400 V").unwrap_err();
        assert_eq!(
            e.to_string(),
            "cannot read `1e400 V` as a quantity: `1e400` is too large for a 64-bit float"
        );
    }

    #[test]
    fn readings_and_differences() {
        let d = q("30 degC").try_sub(&q("20 degC")).unwrap();
        assert_eq!(d.kind(), Kind::TemperatureInterval);
        assert_eq!(d.to_string(), "10 Δ°C");
        assert!(q("5 K").try_sub(&q("20 degC")).is_err());
        assert!(q("5 K").try_add(&q("20 degC")).is_ok());
        assert!(q("5 K").try_cmp(&q("20 degC")).is_err());
    }

    #[test]
    fn strain_in_percent_stays_a_strain() {
        let e = q("1000 ue").to("%").unwrap();
        assert_eq!(
            (e.kind(), e.to_string()),
            (Kind::Strain, "0.1 %".to_string())
        );
        assert!(q("0.001").to("ue").is_err());
    }
}
