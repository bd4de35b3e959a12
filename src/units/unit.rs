//! A parsed unit: symbol, SI factor and offset, dimension and kind.
//!
//! PROVISIONAL: the symbol table and parser here are a minimal seed so that other layers compile;
//! the units work item replaces `Unit::parse` with the full table (from uom) and parser.

use std::fmt;

use super::{Dimension, Kind, UnitError};

/// A unit of measurement: `value_si = value * factor + offset`.
///
/// ```
/// use gaugebook::units::Unit;
/// let u = Unit::parse("kN")?;
/// assert_eq!(u.to_si(2.0), 2000.0);
/// assert_eq!(u.symbol(), "kN");
/// # Ok::<(), gaugebook::units::UnitError>(())
/// ```
#[derive(Clone, Debug, PartialEq)]
pub struct Unit {
    symbol: String,
    factor: f64,
    offset: f64,
    dim: Dimension,
    kind: Kind,
}

impl Unit {
    /// A unit from its parts. `offset` is non-zero only for absolute temperature scales.
    ///
    /// ```
    /// use gaugebook::{Dimension, Kind, units::Unit};
    /// let degc = Unit::from_parts("°C", 1.0, 273.15, Dimension::TEMPERATURE, Kind::AbsoluteTemperature);
    /// assert_eq!(degc.to_si(25.0), 298.15);
    /// ```
    pub fn from_parts(
        symbol: impl Into<String>,
        factor: f64,
        offset: f64,
        dim: Dimension,
        kind: Kind,
    ) -> Unit {
        Unit {
            symbol: symbol.into(),
            factor,
            offset,
            dim,
            kind,
        }
    }

    /// Parses a unit expression.
    ///
    /// ```
    /// let u = gaugebook::units::Unit::parse("mV/V")?;
    /// assert_eq!(u.kind(), gaugebook::Kind::OutputRatio);
    /// # Ok::<(), gaugebook::units::UnitError>(())
    /// ```
    pub fn parse(text: &str) -> Result<Unit, UnitError> {
        let t = text.trim();
        let m = Dimension::MASS;
        let l = Dimension::LENGTH;
        let s = Dimension::TIME;
        let a = Dimension::CURRENT;
        let newton = m * l / s.powi(2);
        let volt = m * l.powi(2) / s.powi(3) / a;
        let ohm = volt / a;
        let (factor, dim, kind) = match t {
            "" | "1" => (1.0, Dimension::NONE, Kind::Plain),
            "ohm" | "Ω" => (1.0, ohm, Kind::Plain),
            "kohm" | "kΩ" => (1e3, ohm, Kind::Plain),
            "V" => (1.0, volt, Kind::Plain),
            "mV" => (1e-3, volt, Kind::Plain),
            "N" => (1.0, newton, Kind::Plain),
            "kN" => (1e3, newton, Kind::Plain),
            "m" => (1.0, l, Kind::Plain),
            "mm" => (1e-3, l, Kind::Plain),
            "kg" => (1.0, m, Kind::Plain),
            "MPa" => (1e6, newton / l.powi(2), Kind::Plain),
            "GPa" => (1e9, newton / l.powi(2), Kind::Plain),
            "ue" | "µε" => (1e-6, Dimension::NONE, Kind::Strain),
            "mV/V" => (1e-3, Dimension::NONE, Kind::OutputRatio),
            "V/V" => (1.0, Dimension::NONE, Kind::OutputRatio),
            "K" => (1.0, Dimension::TEMPERATURE, Kind::TemperatureInterval),
            _ => {
                return Err(UnitError::UnknownUnit {
                    text: text.to_string(),
                    symbol: t.to_string(),
                    position: 0,
                });
            }
        };
        let symbol = match t {
            "ohm" => "Ω",
            "kohm" => "kΩ",
            "ue" => "µε",
            other => other,
        };
        Ok(Unit {
            symbol: symbol.to_string(),
            factor,
            offset: 0.0,
            dim,
            kind,
        })
    }

    /// The symbol as displayed (`Ω`, `µε`, `mV/V`).
    pub fn symbol(&self) -> &str {
        &self.symbol
    }

    /// Multiply a value in this unit by this to get SI (before the offset).
    pub fn factor(&self) -> f64 {
        self.factor
    }

    /// Added after the factor to reach SI (273.15 K for °C; 0 for every other unit).
    pub fn offset(&self) -> f64 {
        self.offset
    }

    /// The unit's dimension.
    pub fn dimension(&self) -> Dimension {
        self.dim
    }

    /// The unit's kind.
    pub fn kind(&self) -> Kind {
        self.kind
    }

    /// A value in this unit expressed in SI.
    pub fn to_si(&self, value: f64) -> f64 {
        value * self.factor + self.offset
    }

    /// An SI value expressed in this unit.
    ///
    /// ```
    /// let u = gaugebook::units::Unit::parse("kN")?;
    /// assert_eq!(u.from_si(1500.0), 1.5);
    /// # Ok::<(), gaugebook::units::UnitError>(())
    /// ```
    pub fn from_si(&self, si: f64) -> f64 {
        (si - self.offset) / self.factor
    }
}

impl fmt::Display for Unit {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        f.write_str(&self.symbol)
    }
}
