//! A parsed unit: symbol, SI factor and offset, dimension and kind.
//!
//! The symbols come from the table in `table.rs`; `parse.rs` reads compound expressions.

use std::fmt;

use super::{Dimension, Kind, UnitError, parse, table};

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

/// The unit constants a script gets as variables: (name, unit expression). Names are ASCII
/// identifiers that are not Rhai keywords (`inch`, not `in`); each is `1` of its unit, so
/// `350.0 * ohm` reads naturally. Offset scales (°C, °F) are left out on purpose: `25 * degC`
/// would have to mean a difference, which is exactly the mix-up the kinds exist to stop.
const CONSTANTS: &[(&str, &str)] = &[
    ("V", "V"),
    ("mV", "mV"),
    ("uV", "µV"),
    ("A", "A"),
    ("mA", "mA"),
    ("uA", "µA"),
    ("ohm", "Ω"),
    ("kohm", "kΩ"),
    ("Mohm", "MΩ"),
    ("mohm", "mΩ"),
    ("W", "W"),
    ("mW", "mW"),
    ("N", "N"),
    ("kN", "kN"),
    ("MN", "MN"),
    ("N_m", "N·m"),
    ("kN_m", "kN·m"),
    ("lbf", "lbf"),
    ("kip", "kip"),
    ("lbf_in", "lbf·in"),
    ("lbf_ft", "lbf·ft"),
    ("kgf", "kgf"),
    ("kg", "kg"),
    ("g", "g"),
    ("lb", "lb"),
    ("gn", "gn"),
    ("m", "m"),
    ("cm", "cm"),
    ("mm", "mm"),
    ("um", "µm"),
    ("inch", "in"),
    ("ft", "ft"),
    ("mm2", "mm²"),
    ("m2", "m²"),
    ("Pa", "Pa"),
    ("kPa", "kPa"),
    ("MPa", "MPa"),
    ("GPa", "GPa"),
    ("bar", "bar"),
    ("psi", "psi"),
    ("ksi", "ksi"),
    ("s", "s"),
    ("ms", "ms"),
    ("us", "µs"),
    ("min", "min"),
    ("h", "h"),
    ("Hz", "Hz"),
    ("kHz", "kHz"),
    ("K", "K"),
    ("rad", "rad"),
    ("deg", "°"),
    ("percent", "%"),
    ("ppm", "ppm"),
    ("strain", "ε"),
    ("ue", "µε"),
    ("V_per_V", "V/V"),
    ("mV_per_V", "mV/V"),
    ("uV_per_V", "µV/V"),
];

impl Unit {
    /// A unit from its parts. `offset` is non-zero only for absolute temperature scales; the
    /// kind is fitted to the dimension ([`Kind::fit`]).
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
            kind: kind.fit(dim),
        }
    }

    /// Parses a unit expression: table symbols with SI prefixes, products (`N·m`, `N*m`,
    /// `N m`, `lbf-in`), quotients (`mV/V`, `W/(m·K)`), integer powers (`m^2`, `m**2`, `m²`,
    /// `s⁻¹`) and parentheses. See the parser module for the grammar and the kind rules.
    ///
    /// ```
    /// use gaugebook::{Kind, units::Unit};
    /// let u = Unit::parse("mV/V")?;
    /// assert_eq!(u.kind(), Kind::OutputRatio);
    /// assert_eq!(Unit::parse("kg/m^3")?.symbol(), "kg/m³");
    /// // NIST SP 811 (2008) B.8 (from memory): lbf·in = 0.112 984 829 027 616 7 N·m (= lbf × 0.0254 m).
    /// assert!((Unit::parse("lbf*in")?.factor() - 0.112_984_829_027_616_7).abs() < 1e-16);
    /// let e = Unit::parse("kg/furlong").unwrap_err();
    /// assert_eq!(e.to_string(), "unknown unit `furlong` in `kg/furlong` at character 3");
    /// # Ok::<(), gaugebook::units::UnitError>(())
    /// ```
    pub fn parse(text: &str) -> Result<Unit, UnitError> {
        parse::parse_unit_in(text, 0)
    }

    /// The symbol as displayed (`Ω`, `µε`, `mV/V`, `kg/m³`).
    ///
    /// ```
    /// assert_eq!(gaugebook::units::Unit::parse("kohm")?.symbol(), "kΩ");
    /// # Ok::<(), gaugebook::units::UnitError>(())
    /// ```
    pub fn symbol(&self) -> &str {
        &self.symbol
    }

    /// Multiply a value in this unit by this to get SI (before the offset).
    ///
    /// ```
    /// assert_eq!(gaugebook::units::Unit::parse("in")?.factor(), 0.0254);
    /// # Ok::<(), gaugebook::units::UnitError>(())
    /// ```
    pub fn factor(&self) -> f64 {
        self.factor
    }

    /// Added after the factor to reach SI (273.15 K for °C; 0 for every unit but a scale).
    ///
    /// ```
    /// assert_eq!(gaugebook::units::Unit::parse("degC")?.offset(), 273.15);
    /// # Ok::<(), gaugebook::units::UnitError>(())
    /// ```
    pub fn offset(&self) -> f64 {
        self.offset
    }

    /// The unit's dimension.
    ///
    /// ```
    /// use gaugebook::{Dimension, units::Unit};
    /// assert_eq!(Unit::parse("mm^2")?.dimension(), Dimension::LENGTH.powi(2));
    /// # Ok::<(), gaugebook::units::UnitError>(())
    /// ```
    pub fn dimension(&self) -> Dimension {
        self.dim
    }

    /// The unit's kind.
    ///
    /// ```
    /// use gaugebook::{Kind, units::Unit};
    /// assert_eq!(Unit::parse("ue")?.kind(), Kind::Strain);
    /// # Ok::<(), gaugebook::units::UnitError>(())
    /// ```
    pub fn kind(&self) -> Kind {
        self.kind
    }

    /// A value in this unit expressed in SI.
    ///
    /// ```
    /// assert!((gaugebook::units::Unit::parse("degF")?.to_si(32.0) - 273.15).abs() < 1e-12);
    /// # Ok::<(), gaugebook::units::UnitError>(())
    /// ```
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

    /// The difference unit of a temperature scale (`°C` → `Δ°C`); any other unit unchanged.
    ///
    /// ```
    /// use gaugebook::{Kind, units::Unit};
    /// let d = Unit::parse("degF")?.difference();
    /// assert_eq!((d.symbol(), d.offset(), d.kind()), ("Δ°F", 0.0, Kind::TemperatureInterval));
    /// # Ok::<(), gaugebook::units::UnitError>(())
    /// ```
    pub fn difference(&self) -> Unit {
        if self.kind != Kind::AbsoluteTemperature {
            return self.clone();
        }
        Unit {
            symbol: format!("Δ{}", self.symbol),
            factor: self.factor,
            offset: 0.0,
            dim: self.dim,
            kind: Kind::TemperatureInterval,
        }
    }

    /// Every symbol the parser accepts on its own (with prefixed forms of the SI units), sorted:
    /// for completion in editors and notebooks.
    ///
    /// ```
    /// let all = gaugebook::units::Unit::known_symbols();
    /// assert!(all.iter().any(|s| s == "kohm"));
    /// assert!(all.iter().any(|s| s == "µε"));
    /// assert!(all.iter().all(|s| gaugebook::units::Unit::parse(s).is_ok()));
    /// ```
    pub fn known_symbols() -> &'static [String] {
        table::known_symbols()
    }

    /// The unit constants scripts get as variables, as (name, unit): `V`, `mV`, `ohm`, `kohm`,
    /// `N`, `kN`, `kg`, `mm`, `MPa`, `GPa`, `ue`, … Each stands for 1 of its unit.
    ///
    /// ```
    /// use gaugebook::units::Unit;
    /// let c = Unit::constants();
    /// let (_, kohm) = c.iter().find(|(n, _)| *n == "kohm").unwrap();
    /// assert_eq!(kohm.factor(), 1e3);
    /// assert!(c.iter().any(|(n, _)| *n == "ue"));
    /// ```
    pub fn constants() -> Vec<(&'static str, Unit)> {
        CONSTANTS
            .iter()
            // Every entry is a table symbol (tested below), so parsing does not fail; an entry
            // that did would be left out rather than panic.
            .filter_map(|&(name, text)| Unit::parse(text).ok().map(|u| (name, u)))
            .collect()
    }
}

impl fmt::Display for Unit {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        f.write_str(&self.symbol)
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn every_constant_parses() {
        assert_eq!(Unit::constants().len(), CONSTANTS.len());
    }

    #[test]
    fn constant_names_are_identifiers() {
        for (name, _) in CONSTANTS {
            assert!(
                name.chars().all(|c| c.is_ascii_alphanumeric() || c == '_'),
                "{name}"
            );
            assert!(!name.starts_with(|c: char| c.is_ascii_digit()), "{name}");
        }
    }
}
