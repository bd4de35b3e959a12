//! The symbol table: every unit symbol the parser knows, with its SI factor, offset, dimension
//! and kind.
//!
//! Factors come from uom's own unit definitions where uom has the unit, so they are not typed
//! twice: each entry names a uom quantity module and the abbreviation (or name) uom uses, and the
//! table asks uom for the SI value of `"1 <abbreviation>"` (and of `"0 <abbreviation>"` for the
//! temperature scales, whose offset that gives). The dimension comes from the uom quantity's type.
//! uom rounds a few US customary factors to about seven digits; [`EXACT`] then replaces those by
//! their exact definitions, and a test checks that each replacement agrees with uom to uom's
//! rounding, so a correction cannot silently change which unit is meant.
//!
//! Units that uom does not define (strain, the explicit temperature differences under our own
//! spellings) are added here with their definitions and sources.

use std::collections::HashMap;
use std::str::FromStr;
use std::sync::OnceLock;

use uom::typenum::Integer;

use super::{Dimension, Kind};

/// One unit symbol of the table, before any SI prefix.
#[derive(Clone, Debug, PartialEq)]
pub(crate) struct Atom {
    /// The canonical symbol used for display (`Ω`, `µε`, `°C`).
    pub display: &'static str,
    /// Multiply a value in this unit by this to get SI (before the offset).
    pub factor: f64,
    /// Added after the factor (273.15 K for °C, 0 otherwise).
    pub offset: f64,
    /// Dimension of the unit.
    pub dim: Dimension,
    /// Kind of the unit.
    pub kind: Kind,
    /// Whether SI prefixes may be attached (SI units only, SI Brochure 9th ed. §3 (from memory)).
    pub prefixable: bool,
}

/// Where an entry's factor comes from.
#[derive(Clone, Copy, Debug)]
enum Source {
    /// Ask uom: a probe function for the quantity and the abbreviation or name uom uses.
    Uom(Probe, &'static str),
    /// Defined here (units uom does not have): SI factor and offset.
    Own(f64, f64),
}

/// Probes a uom quantity: SI value of `"1 <name>"`, of `"0 <name>"`, and the dimension.
type Probe = fn(&str) -> Option<(f64, f64, Dimension)>;

/// One line of the specification from which the table is built.
struct Spec {
    display: &'static str,
    aliases: &'static [&'static str],
    source: Source,
    dim: Option<Dimension>,
    kind: Kind,
    prefixable: bool,
}

/// The exponents of a uom dimension type, read from its typenum parameters.
pub(crate) fn dim_of<D>() -> Dimension
where
    D: uom::si::Dimension + ?Sized,
{
    Dimension([
        D::L::to_i8(),
        D::M::to_i8(),
        D::T::to_i8(),
        D::I::to_i8(),
        D::Th::to_i8(),
        D::N::to_i8(),
        D::J::to_i8(),
    ])
}

fn probe<D>(name: &str) -> Option<(f64, f64, Dimension)>
where
    D: uom::si::Dimension + ?Sized,
    uom::si::Quantity<D, uom::si::SI<f64>, f64>: FromStr,
{
    let one = uom::si::Quantity::<D, uom::si::SI<f64>, f64>::from_str(&format!("1 {name}")).ok()?;
    let zero =
        uom::si::Quantity::<D, uom::si::SI<f64>, f64>::from_str(&format!("0 {name}")).ok()?;
    Some((one.value - zero.value, zero.value, dim_of::<D>()))
}

macro_rules! p {
    ($module:ident) => {
        probe::<uom::si::$module::Dimension> as Probe
    };
}

/// Dimensionless.
const ONE: Dimension = Dimension::NONE;

/// The specification of the table, in the order the trade meets the units.
///
/// Left out on purpose: the coulomb `C` and the farad `F`, because `25 C` and `70 F` are the
/// usual slips for °C and °F and would otherwise be read, silently, as a charge and a
/// capacitance; the kelvin-like `KΩ` (write `kΩ`); the year `a`, the are `a` and the dalton `u`,
/// which would shadow prefixes.
fn specs() -> Vec<Spec> {
    use Kind::*;
    let uom = |display, aliases, probe, name, kind, prefixable| Spec {
        display,
        aliases,
        source: Source::Uom(probe, name),
        dim: None,
        kind,
        prefixable,
    };
    let own = |display, aliases, factor, offset, dim, kind, prefixable| Spec {
        display,
        aliases,
        source: Source::Own(factor, offset),
        dim: Some(dim),
        kind,
        prefixable,
    };
    vec![
        // SI base and derived units with special names (SI Brochure 9th ed. Tables 2 and 4 (from memory)).
        uom("m", &["metre", "meter"], p!(length), "m", Plain, true),
        // The kilogram carries the prefix; prefixes attach to the gram (SI Brochure §3 (from memory)).
        uom("g", &["gram"], p!(mass), "g", Plain, true),
        uom("s", &["sec"], p!(time), "s", Plain, true),
        uom("A", &["amp"], p!(electric_current), "A", Plain, true),
        uom(
            "K",
            &["kelvin"],
            p!(temperature_interval),
            "K",
            TemperatureInterval,
            true,
        ),
        uom("V", &["volt"], p!(electric_potential), "V", Plain, true),
        // U+2126 OHM SIGN is folded to U+03A9 by the parser before lookup.
        uom(
            "Ω",
            &["ohm", "Ohm", "ohms"],
            p!(electrical_resistance),
            "Ω",
            Plain,
            true,
        ),
        uom("W", &["watt"], p!(power), "W", Plain, true),
        uom("J", &["joule"], p!(energy), "J", Plain, true),
        uom("N", &["newton"], p!(force), "N", Plain, true),
        uom("Pa", &["pascal"], p!(pressure), "Pa", Plain, true),
        uom("Hz", &["hertz"], p!(frequency), "Hz", Plain, true),
        uom("rad", &["radian"], p!(angle), "rad", Angle, true),
        // The last two base units, so that every dimension written in base units parses back.
        uom(
            "mol",
            &["mole"],
            p!(amount_of_substance),
            "mol",
            Plain,
            true,
        ),
        uom(
            "cd",
            &["candela"],
            p!(luminous_intensity),
            "cd",
            Plain,
            true,
        ),
        // Non-SI units accepted for use with the SI (SI Brochure 9th ed. Table 8 (from memory)).
        uom("min", &[], p!(time), "min", Plain, false),
        uom("h", &["hour"], p!(time), "h", Plain, false),
        uom("t", &["tonne"], p!(mass), "t", Plain, false),
        uom("L", &["l", "litre", "liter"], p!(volume), "L", Plain, true),
        uom("bar", &[], p!(pressure), "bar", Plain, true),
        uom("°", &["deg", "degree"], p!(angle), "°", Angle, false),
        // Temperature scales (SI Brochure §2.3.1 (from memory); NIST SP 811 Appendix B.9 (from memory)).
        uom(
            "°C",
            &["degC", "celsius", "deg_C"],
            p!(thermodynamic_temperature),
            "°C",
            AbsoluteTemperature,
            false,
        ),
        uom(
            "°F",
            &["degF", "fahrenheit", "deg_F"],
            p!(thermodynamic_temperature),
            "°F",
            AbsoluteTemperature,
            false,
        ),
        uom(
            "Δ°C",
            &["delta_degC", "ΔdegC", "delta_°C"],
            p!(temperature_interval),
            "°C",
            TemperatureInterval,
            false,
        ),
        uom(
            "Δ°F",
            &["delta_degF", "ΔdegF", "delta_°F"],
            p!(temperature_interval),
            "°F",
            TemperatureInterval,
            false,
        ),
        // Plain ratios.
        uom("%", &["percent"], p!(ratio), "%", Plain, false),
        uom("‰", &["permille"], p!(ratio), "‰", Plain, false),
        uom("ppm", &[], p!(ratio), "ppm", Plain, false),
        uom("ppb", &[], p!(ratio), "ppb", Plain, false),
        // Strain: m/m, written ε with a prefix (µε, the microstrain, is the trade's unit;
        // common practice). Not in uom, which has no strain quantity.
        own("ε", &["strain"], 1.0, 0.0, ONE, Strain, true),
        own("µε", &["ue", "microstrain"], 1e-6, 0.0, ONE, Strain, false),
        // Standard acceleration of gravity gn = 9.806 65 m/s² (3rd CGPM 1901; NIST SP 811 B.8 (from memory)).
        // `g` is the gram, so gravity is written `gn`.
        uom("gn", &["g0", "g₀"], p!(acceleration), "g₀", Plain, false),
        // US customary units of the trade (NIST SP 811 Appendix B.8 (from memory)).
        uom("in", &["inch"], p!(length), "in", Plain, false),
        uom("ft", &["foot", "feet"], p!(length), "ft", Plain, false),
        uom("mil", &["thou"], p!(length), "mil", Plain, false),
        uom(
            "µin",
            &["uin", "microinch"],
            p!(length),
            "microinch",
            Plain,
            false,
        ),
        uom("lb", &["lbm", "pound"], p!(mass), "lb", Plain, false),
        uom("lbf", &[], p!(force), "lbf", Plain, false),
        uom("kip", &[], p!(force), "kip", Plain, false),
        uom("ozf", &[], p!(force), "ozf", Plain, false),
        uom("kgf", &["kp"], p!(force), "kgf", Plain, false),
        uom("psi", &[], p!(pressure), "psi", Plain, false),
        uom("ksi", &[], p!(pressure), "kip/in²", Plain, false),
        uom("atm", &[], p!(pressure), "atm", Plain, false),
    ]
}

/// Exact definitions that replace uom's rounded factors (uom stores about seven digits for
/// these). Each line: symbol, exact SI factor, exact SI offset, authority. The authorities could
/// not be opened while this was written; the definitions are recalled, hence `(from memory)`,
/// and the tests check them against pint 0.25.3's registry as an independent source.
pub(crate) const EXACT: &[(&str, f64, f64, &str)] = &[
    // NIST SP 811 (2008) Appendix B.8 (from memory), footnote to "pound (avoirdupois)": 1 lb = 0.453 592 37 kg
    // exactly (international yard and pound agreement, 1959).
    (
        "lb",
        0.453_592_37,
        0.0,
        "NIST SP 811 (2008) B.8 (from memory): lb = 0.453 592 37 kg exactly",
    ),
    // lbf = lb × gn = 0.453 592 37 kg × 9.806 65 m/s² = 4.448 221 615 260 5 N exactly.
    (
        "lbf",
        4.448_221_615_260_5,
        0.0,
        "NIST SP 811 (2008) B.8 (from memory): lbf = lb × gn exactly",
    ),
    (
        "kip",
        4_448.221_615_260_5,
        0.0,
        "NIST SP 811 (2008) B.8 (from memory): kip = 1000 lbf exactly",
    ),
    // ozf = lbf / 16.
    (
        "ozf",
        0.278_013_850_953_781_2, // = 4.448 221 615 260 5 / 16 to f64 precision
        0.0,
        "NIST SP 811 (2008) B.8 (from memory): ozf = lbf/16 exactly",
    ),
    // psi = lbf / in² = 4.448 221 615 260 5 N / (0.0254 m)² = 6 894.757 293 168 36 Pa.
    (
        "psi",
        6_894.757_293_168_361,
        0.0,
        "NIST SP 811 (2008) B.8 (from memory): psi = lbf/in² exactly",
    ),
    (
        "ksi",
        6_894_757.293_168_361,
        0.0,
        "NIST SP 811 (2008) B.8 (from memory): ksi = 1000 lbf/in² exactly",
    ),
    // SI Brochure 9th ed. §2.3.1 (from memory): t/°C = T/K − 273.15.
    (
        "°C",
        1.0,
        273.15,
        "SI Brochure 9th ed. (2019) §2.3.1 (from memory): T/K = t/°C + 273.15",
    ),
    // NIST SP 811 (2008) B.9 (from memory): T/K = (t/°F + 459.67)/1.8.
    (
        "°F",
        1.0 / 1.8,
        459.67 / 1.8,
        "NIST SP 811 (2008) B.9 (from memory): T/K = (t/°F + 459.67)/1.8",
    ),
    (
        "Δ°F",
        1.0 / 1.8,
        0.0,
        "NIST SP 811 (2008) B.9 (from memory): ΔT/K = Δt/°F / 1.8",
    ),
    // NIST SP 811 (2008) B.8 (from memory): degree (angle) = π/180 rad.
    (
        "°",
        std::f64::consts::PI / 180.0,
        0.0,
        "NIST SP 811 (2008) B.8 (from memory): ° = π/180 rad",
    ),
];

/// The built table: symbol → atom, for every canonical symbol and alias.
pub(crate) struct Table {
    map: HashMap<&'static str, Atom>,
    /// Specification lines whose uom probe failed (empty unless uom renamed a unit).
    #[cfg_attr(not(test), allow(dead_code))] // read by the tests, which check the table
    pub missing: Vec<&'static str>,
    /// Factors as uom gave them, before the exact corrections (for the agreement test).
    #[cfg_attr(not(test), allow(dead_code))]
    pub from_uom: HashMap<&'static str, (f64, f64)>,
}

impl Table {
    fn build() -> Table {
        let mut map = HashMap::new();
        let mut missing = Vec::new();
        let mut from_uom = HashMap::new();
        for spec in specs() {
            let (mut factor, mut offset, dim) = match spec.source {
                Source::Uom(probe, name) => match probe(name) {
                    Some((f, o, d)) => {
                        from_uom.insert(spec.display, (f, o));
                        (f, o, d)
                    }
                    None => {
                        missing.push(spec.display);
                        continue;
                    }
                },
                // `dim` is always given for own entries (see `own` in `specs`).
                Source::Own(f, o) => (f, o, spec.dim.unwrap_or_default()),
            };
            // A temperature interval read from uom has no offset, but the difference of two
            // probes may still carry rounding; intervals are offset-free by definition.
            if spec.kind != Kind::AbsoluteTemperature {
                offset = 0.0;
            }
            if let Some(&(_, f, o, _)) = EXACT.iter().find(|e| e.0 == spec.display) {
                factor = f;
                offset = o;
            }
            let atom = Atom {
                display: spec.display,
                factor,
                offset,
                dim,
                kind: spec.kind,
                prefixable: spec.prefixable,
            };
            for name in std::iter::once(spec.display).chain(spec.aliases.iter().copied()) {
                map.insert(name, atom.clone());
            }
        }
        Table {
            map,
            missing,
            from_uom,
        }
    }

    /// The atom for an exact symbol (no prefix).
    pub fn get(&self, symbol: &str) -> Option<&Atom> {
        self.map.get(symbol)
    }

    /// Every symbol and alias in the table.
    pub fn symbols(&self) -> impl Iterator<Item = &'static str> + '_ {
        self.map.keys().copied()
    }
}

/// The table, built once on first use.
pub(crate) fn table() -> &'static Table {
    static TABLE: OnceLock<Table> = OnceLock::new();
    TABLE.get_or_init(Table::build)
}

/// SI prefixes (SI Brochure 9th ed. 2019, Table 7 (from memory)), with `u` accepted for `µ` as ASCII input.
/// The 2022 prefixes ronna, quetta, ronto, quecto are left out: they postdate the 9th edition
/// and would make `R` and `Q` ambiguous for no use in the trade.
pub(crate) const PREFIXES: &[(&str, &str, f64)] = &[
    ("Y", "Y", 1e24),
    ("Z", "Z", 1e21),
    ("E", "E", 1e18),
    ("P", "P", 1e15),
    ("T", "T", 1e12),
    ("G", "G", 1e9),
    ("M", "M", 1e6),
    ("k", "k", 1e3),
    ("h", "h", 1e2),
    ("da", "da", 1e1),
    ("d", "d", 1e-1),
    ("c", "c", 1e-2),
    ("m", "m", 1e-3),
    ("µ", "µ", 1e-6),
    ("u", "µ", 1e-6),
    ("n", "n", 1e-9),
    ("p", "p", 1e-12),
    ("f", "f", 1e-15),
    ("a", "a", 1e-18),
    ("z", "z", 1e-21),
    ("y", "y", 1e-24),
];

/// A symbol resolved against the table, possibly with a prefix.
#[derive(Clone, Debug, PartialEq)]
pub(crate) struct Resolved {
    /// Display form (`kΩ`, `µε`).
    pub display: String,
    pub factor: f64,
    pub offset: f64,
    pub dim: Dimension,
    pub kind: Kind,
}

/// Resolves one symbol: an exact table entry first (so `min`, `Pa`, `ft` are never read as
/// prefixed units), then a prefix on a prefixable entry.
pub(crate) fn resolve(symbol: &str) -> Option<Resolved> {
    let t = table();
    if let Some(a) = t.get(symbol) {
        return Some(Resolved {
            display: a.display.to_string(),
            factor: a.factor,
            offset: a.offset,
            dim: a.dim,
            kind: a.kind,
        });
    }
    // PREFIXES lists `da` before `d`, so `dam` is the decametre.
    for &(p, shown, scale) in PREFIXES {
        if let Some(rest) = symbol.strip_prefix(p)
            && let Some(a) = t.get(rest)
            && a.prefixable
        {
            return Some(Resolved {
                display: format!("{shown}{}", a.display),
                factor: scale * a.factor,
                offset: 0.0,
                dim: a.dim,
                kind: a.kind,
            });
        }
    }
    None
}

/// Every accepted spelling, with prefixed forms of the prefixable units, sorted and unique.
pub(crate) fn known_symbols() -> &'static [String] {
    static SYMBOLS: OnceLock<Vec<String>> = OnceLock::new();
    SYMBOLS.get_or_init(|| {
        let t = table();
        let mut out: Vec<String> = Vec::new();
        for s in t.symbols() {
            out.push(s.to_string());
            // Only the short symbols take prefixes in the completion list; `kohm` is kept
            // because it is the usual ASCII spelling.
            if t.get(s).is_some_and(|a| a.prefixable) && (s.chars().count() <= 3 || s == "ohm") {
                for (p, _, _) in PREFIXES {
                    out.push(format!("{p}{s}"));
                }
            }
        }
        out.sort();
        out.dedup();
        out
    })
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn every_uom_probe_resolves() {
        assert!(
            table().missing.is_empty(),
            "uom does not know {:?}",
            table().missing
        );
    }

    #[test]
    fn exact_corrections_agree_with_uom_to_its_rounding() {
        // uom stores these to about seven significant digits; a correction beyond 1e-6 relative
        // would mean the entry names another unit.
        let t = table();
        for &(sym, f, o, src) in EXACT {
            let &(uf, uo) = t
                .from_uom
                .get(sym)
                .unwrap_or_else(|| panic!("{sym} not from uom"));
            assert!(
                (uf - f).abs() <= 1e-6 * f.abs(),
                "{sym}: uom {uf}, exact {f} ({src})"
            );
            assert!(
                (uo - o).abs() <= 1e-6 * o.abs().max(1.0),
                "{sym}: uom offset {uo}, {o}"
            );
        }
    }

    #[test]
    fn prefixes_agree_with_uoms_prefixed_units() {
        // uom defines the prefixed units itself; our prefix composition must give its numbers.
        use uom::si::f64::{ElectricalResistance, Force, Length, Mass, Pressure};
        let kn: Force = "1 kN".parse().unwrap();
        assert_eq!(resolve("kN").unwrap().factor, kn.value);
        let um: Length = "1 µm".parse().unwrap();
        assert_eq!(resolve("um").unwrap().factor, um.value);
        let kohm: ElectricalResistance = "1 kΩ".parse().unwrap();
        assert_eq!(resolve("kohm").unwrap().factor, kohm.value);
        let mpa: Pressure = "1 MPa".parse().unwrap();
        assert_eq!(resolve("MPa").unwrap().factor, mpa.value);
        let mg: Mass = "1 mg".parse().unwrap();
        assert_eq!(resolve("mg").unwrap().factor, mg.value);
        assert_eq!(resolve("kg").unwrap().factor, 1.0);
    }

    #[test]
    fn two_letter_prefix_comes_before_its_first_letter() {
        let da = PREFIXES.iter().position(|p| p.0 == "da");
        let d = PREFIXES.iter().position(|p| p.0 == "d");
        assert!(da < d);
    }

    #[test]
    fn exact_symbols_win_over_prefixes() {
        assert_eq!(resolve("min").unwrap().factor, 60.0);
        assert_eq!(resolve("Pa").unwrap().factor, 1.0);
        assert_eq!(resolve("ft").unwrap().factor, 0.3048);
        assert_eq!(resolve("dam").unwrap().factor, 10.0);
        assert!(resolve("kpsi").is_none());
        assert!(resolve("mkg").is_none());
    }
}
