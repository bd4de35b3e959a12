//! Writing a quantity as a person writes it: `0.4995 mV/V`, `1000 µε`, `174.65 kΩ`.
//!
//! A display unit the user chose is kept. Without one, the unit follows from the dimension and
//! kind: µε for strain, mV/V for output ratio, ° for angle, °C for a temperature reading, K for
//! a difference; the named SI units (N, Pa, N·m, W, V, Ω, Hz …) and a few compounds of the trade
//! (m/s², N/m, W/m², kg/m³, ppm/K) are recognised, with an engineering prefix (a power of 1000,
//! SI Brochure 9th ed. §3, from memory) chosen so the number lies in 1 … 999.999; anything else is written
//! in SI base units. Numbers carry 6 significant figures with trailing zeros trimmed. Every
//! form written here parses back ([`Quantity::parse`](crate::Quantity::parse)).

use super::parse::superscript;
use super::{Dimension, Kind};

/// Significant figures in displayed numbers: enough for a 0.02 % calibration, few enough to
/// read (common practice).
pub(crate) const SIGNIFICANT: i32 = 6;

/// A number with [`SIGNIFICANT`] figures, trailing zeros trimmed; scientific notation outside
/// 1e-4 … 1e9.
pub(crate) fn number(v: f64) -> String {
    number_sig(v, SIGNIFICANT)
}

/// [`number`] with `sig` significant figures (1 … 17).
pub(crate) fn number_sig(v: f64, sig: i32) -> String {
    let sig = sig.clamp(1, 17);
    if v == 0.0 {
        return "0".into();
    }
    if !v.is_finite() {
        return format!("{v}");
    }
    let mag = v.abs().log10().floor() as i32;
    if !(-4..9).contains(&mag) {
        let s = format!("{:.*e}", (sig - 1) as usize, v);
        // `{:e}` writes `1.23400e-5`: trim the mantissa's trailing zeros.
        return match s.split_once('e') {
            Some((m, e)) => format!("{}e{e}", trim(m)),
            None => s,
        };
    }
    let decimals = (sig - 1 - mag).max(0) as usize;
    let s = trim(&format!("{v:.decimals$}"));
    if s == "-0" { "0".into() } else { s }
}

fn trim(s: &str) -> String {
    if s.contains('.') {
        s.trim_end_matches('0').trim_end_matches('.').to_string()
    } else {
        s.to_string()
    }
}

/// Engineering prefixes from pico to tera.
const ENGINEERING: [(i32, &str); 9] = [
    (-12, "p"),
    (-9, "n"),
    (-6, "µ"),
    (-3, "m"),
    (0, ""),
    (3, "k"),
    (6, "M"),
    (9, "G"),
    (12, "T"),
];

/// How a display unit takes a prefix.
#[derive(Clone, Copy)]
enum Prefix {
    /// None: the number is shown in the unit as it is.
    No,
    /// A power of 1000 between `min` and `max` (exponents of ten) on the first symbol.
    Eng(i32, i32),
    /// The metre raised to `n` (`mm²`): the prefix is applied before the power.
    Metre(i32),
    /// The kilogram: kg from 1 kg up, g with a prefix below.
    Kilogram,
}

/// Named display units by dimension, for plain quantities.
fn named(dim: Dimension) -> Option<(&'static str, Prefix)> {
    use Prefix::*;
    const TABLE: &[([i8; 7], &str, Prefix)] = &[
        ([1, 0, 0, 0, 0, 0, 0], "m", Metre(1)),
        ([2, 0, 0, 0, 0, 0, 0], "m²", Metre(2)),
        ([3, 0, 0, 0, 0, 0, 0], "m³", Metre(3)),
        ([0, 1, 0, 0, 0, 0, 0], "kg", Kilogram),
        ([0, 0, 1, 0, 0, 0, 0], "s", Eng(-12, 0)),
        ([0, 0, 0, 1, 0, 0, 0], "A", Eng(-12, 12)),
        // SI Brochure 9th ed. Table 4 (from memory): the units with special names, by dimension.
        ([2, 1, -3, -1, 0, 0, 0], "V", Eng(-12, 12)),
        ([2, 1, -3, -2, 0, 0, 0], "Ω", Eng(-12, 12)),
        ([2, 1, -3, 0, 0, 0, 0], "W", Eng(-12, 12)),
        ([1, 1, -2, 0, 0, 0, 0], "N", Eng(-12, 12)),
        ([-1, 1, -2, 0, 0, 0, 0], "Pa", Eng(-12, 12)),
        // Torque and energy share m²·kg·s⁻²; the trade measures torque far more often, so
        // N·m is shown (write `.to("J")` for an energy).
        ([2, 1, -2, 0, 0, 0, 0], "N·m", Eng(-12, 12)),
        ([0, 0, -1, 0, 0, 0, 0], "Hz", Eng(-12, 12)),
        ([1, 0, -1, 0, 0, 0, 0], "m/s", Eng(-12, 12)),
        ([1, 0, -2, 0, 0, 0, 0], "m/s²", Eng(-12, 12)),
        ([0, 1, -2, 0, 0, 0, 0], "N/m", Eng(-12, 12)),
        ([0, 1, -3, 0, 0, 0, 0], "W/m²", Eng(-12, 12)),
        ([-3, 1, 0, 0, 0, 0, 0], "kg/m³", No),
        ([2, 1, -3, -1, -1, 0, 0], "V/K", Eng(-12, 12)),
        ([2, 1, -3, -2, -1, 0, 0], "Ω/K", Eng(-12, 12)),
    ];
    TABLE.iter().find(|e| e.0 == dim.0).map(|e| (e.1, e.2))
}

/// Rounds `v` to [`SIGNIFICANT`] figures, so that 999.9999 counts as 1000 when a prefix is
/// chosen.
fn rounded(v: f64) -> f64 {
    if v == 0.0 || !v.is_finite() {
        return v;
    }
    let mag = v.abs().log10().floor() as i32;
    let scale = 10f64.powi(SIGNIFICANT - 1 - mag);
    (v * scale).round() / scale
}

/// The engineering exponent (a multiple of 3 in `min..=max`) for a value shown with `power`
/// applied to the prefix (1 normally, 2 for m²).
fn engineering(v: f64, power: i32, min: i32, max: i32) -> i32 {
    if v == 0.0 || !v.is_finite() {
        return 0.clamp(min, max);
    }
    let mut e = (rounded(v).abs().log10() / (3 * power) as f64).floor() as i32 * 3;
    e = e.clamp(min, max);
    // Rounding to 6 figures may carry into the next thousand.
    if e < max && rounded(v / 10f64.powi(e * power)).abs() >= 1000f64.powi(power) {
        e += 3;
    }
    e
}

fn prefix_symbol(e: i32) -> &'static str {
    ENGINEERING
        .iter()
        .find(|p| p.0 == e)
        .map(|p| p.1)
        .unwrap_or("")
}

/// The dimension as a suffix after a ratio unit: `/K`, `/s²`, `/(K·s)`, or `·s` for positive
/// exponents.
fn suffix(dim: Dimension) -> String {
    if dim.is_dimensionless() {
        return String::new();
    }
    if dim.0.iter().all(|&e| e <= 0) {
        let inv = dim.powi(-1);
        let several = inv.0.iter().filter(|&&e| e != 0).count() > 1;
        if several {
            format!("/({inv})")
        } else {
            format!("/{inv}")
        }
    } else {
        format!("·{dim}")
    }
}

/// The value and unit symbol to show for an SI value with no display unit.
pub(crate) fn auto(si: f64, dim: Dimension, kind: Kind) -> (f64, String) {
    match kind {
        Kind::Strain => (si * 1e6, format!("µε{}", suffix(dim))),
        Kind::OutputRatio => (si * 1e3, format!("mV/V{}", suffix(dim))),
        Kind::Angle if dim.is_dimensionless() => (si.to_degrees(), "°".into()),
        Kind::Angle => (si, format!("rad{}", suffix(dim))),
        // SI Brochure 9th ed. §2.3.1 (from memory): t/°C = T/K − 273.15.
        Kind::AbsoluteTemperature => (si - 273.15, "°C".into()),
        Kind::TemperatureInterval => {
            let e = engineering(si, 1, -6, 0);
            (si / 10f64.powi(e), format!("{}K", prefix_symbol(e)))
        }
        _ if dim.is_dimensionless() => (si, String::new()),
        // Coefficients of expansion and of resistance: ppm/K as on every data sheet.
        _ if dim == Dimension::TEMPERATURE.powi(-1) && si.abs() < 1e-2 => {
            (si * 1e6, "ppm/K".into())
        }
        _ if dim == Dimension::TEMPERATURE.powi(-1) => (si, "1/K".into()),
        _ => match named(dim) {
            Some((sym, Prefix::No)) => (si, sym.into()),
            Some((sym, Prefix::Eng(min, max))) => {
                let e = engineering(si, 1, min, max);
                (si / 10f64.powi(e), format!("{}{sym}", prefix_symbol(e)))
            }
            Some((sym, Prefix::Metre(n))) => {
                let e = engineering(si, n, -9, 3);
                (si / 10f64.powi(e * n), format!("{}{sym}", prefix_symbol(e)))
            }
            Some((_, Prefix::Kilogram)) if rounded(si).abs() >= 1.0 || si == 0.0 => {
                (si, "kg".into())
            }
            Some((_, Prefix::Kilogram)) => {
                let g = si * 1e3;
                let e = engineering(g, 1, -9, 0);
                (g / 10f64.powi(e), format!("{}g", prefix_symbol(e)))
            }
            None => (si, compound(dim).unwrap_or_else(|| dim.to_string())),
        },
    }
}

/// Named units that may appear in a compound display, in order of preference.
const COMPOUND_NAMED: [(&str, Dimension); 7] = [
    ("W", Dimension([2, 1, -3, 0, 0, 0, 0])),
    ("V", Dimension([2, 1, -3, -1, 0, 0, 0])),
    ("Ω", Dimension([2, 1, -3, -2, 0, 0, 0])),
    ("A", Dimension([0, 0, 0, 1, 0, 0, 0])),
    ("N", Dimension([1, 1, -2, 0, 0, 0, 0])),
    ("Pa", Dimension([-1, 1, -2, 0, 0, 0, 0])),
    ("J", Dimension([2, 1, -2, 0, 0, 0, 0])),
];

/// A short compound for a dimension with no named unit: at most two named units (each to the
/// power ±1) times powers of m, kg, s and K, choosing the fewest symbols (`W/(m·K)`, `V/N`,
/// `Ω·m`, `1/Ω`). `None` when nothing beats the base-unit form.
fn compound(dim: Dimension) -> Option<String> {
    let base = |d: Dimension| d.0[3] == 0 && d.0[5] == 0 && d.0[6] == 0;
    let weight = |d: Dimension| d.0.iter().map(|e| i32::from(e.unsigned_abs())).sum::<i32>();
    // (score, named units with their powers, remaining base dimension)
    type Candidate = (i32, Vec<(&'static str, i32)>, Dimension);
    let mut best: Option<Candidate> = None;
    let mut consider = |named: Vec<(&'static str, i32)>, rest: Dimension| {
        if !base(rest) {
            return;
        }
        let score = named.len() as i32 + weight(rest);
        if best.as_ref().is_none_or(|b| score < b.0) {
            best = Some((score, named, rest));
        }
    };
    for (i, &(a, da)) in COMPOUND_NAMED.iter().enumerate() {
        for pa in [1, -1] {
            let r1 = dim / da.powi(pa);
            consider(vec![(a, pa)], r1);
            for &(b, db) in &COMPOUND_NAMED[i + 1..] {
                for pb in [1, -1] {
                    consider(vec![(a, pa), (b, pb)], r1 / db.powi(pb));
                }
            }
        }
    }
    let (score, named, rest) = best?;
    if score >= weight(dim) {
        return None;
    }
    let mut num: Vec<String> = Vec::new();
    let mut den: Vec<String> = Vec::new();
    for (sym, p) in named {
        if p > 0 {
            num.push(sym.into())
        } else {
            den.push(sym.into())
        }
    }
    for (sym, &e) in Dimension::BASE_SYMBOLS.iter().zip(rest.0.iter()) {
        let e = i32::from(e);
        let part = |n: i32| {
            if n == 1 {
                sym.to_string()
            } else {
                format!("{sym}{}", superscript(n))
            }
        };
        match e.signum() {
            1 => num.push(part(e)),
            -1 => den.push(part(-e)),
            _ => {}
        }
    }
    let num = if num.is_empty() {
        "1".to_string()
    } else {
        num.join("·")
    };
    Some(match den.len() {
        0 => num,
        1 => format!("{num}/{}", den[0]),
        _ => format!("{num}/({})", den.join("·")),
    })
}

/// `value unit`, or the bare number for an empty unit (the tests' shorthand).
#[cfg(test)]
fn join(value: f64, unit: &str) -> String {
    join_sig(value, unit, SIGNIFICANT)
}

/// `value unit` with `sig` significant figures, or the bare number for an empty unit.
pub(crate) fn join_sig(value: f64, unit: &str, sig: i32) -> String {
    let n = number_sig(value, sig);
    if unit.is_empty() {
        n
    } else {
        format!("{n} {unit}")
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn numbers_have_six_figures() {
        assert_eq!(number(0.4995), "0.4995");
        assert_eq!(number(1000.0), "1000");
        assert_eq!(number(1.0 / 3.0), "0.333333");
        assert_eq!(number(-12.5), "-12.5");
        assert_eq!(number(123456789.0), "123456789");
        assert_eq!(number(1.234e-5), "1.234e-5");
        assert_eq!(number(2.0e12), "2e12");
        assert_eq!(number(-0.0), "0");
        assert_eq!(number(-1e-7 / 3.0), "-3.33333e-8");
        assert_eq!(number_sig(2.0 / 3.0, 3), "0.667");
        assert_eq!(number_sig(123456.0, 2), "123456");
        assert_eq!(number_sig(1.5e-6, 1), "2e-6");
    }

    #[test]
    fn prefixes_carry_at_the_thousand() {
        let ohm = Dimension([2, 1, -3, -2, 0, 0, 0]);
        assert_eq!(auto(174_650.0, ohm, Kind::Plain), (174.65, "kΩ".into()));
        let (v, u) = auto(999_999.96, ohm, Kind::Plain);
        assert_eq!((join(v, &u)), "1 MΩ");
        let pa = Dimension([-1, 1, -2, 0, 0, 0, 0]);
        assert_eq!(auto(250e6, pa, Kind::Plain).1, "MPa");
        assert_eq!(auto(200e9, pa, Kind::Plain).1, "GPa");
    }

    #[test]
    fn areas_take_the_prefix_before_the_power() {
        let (v, u) = auto(3e-5, Dimension::LENGTH.powi(2), Kind::Plain);
        assert_eq!(join(v, &u), "30 mm²");
    }

    #[test]
    fn masses_below_a_kilogram_in_grams() {
        assert_eq!(join_auto(0.5, Dimension::MASS), "500 g");
        assert_eq!(join_auto(2.5, Dimension::MASS), "2.5 kg");
        assert_eq!(join_auto(1e-6, Dimension::MASS), "1 mg");
    }

    #[test]
    fn compounds_with_named_units() {
        let w = Dimension([2, 1, -3, 0, 0, 0, 0]);
        let k = Dimension::TEMPERATURE;
        let m = Dimension::LENGTH;
        assert_eq!(compound(w / (m * k)).as_deref(), Some("W/(m·K)"));
        let v = Dimension([2, 1, -3, -1, 0, 0, 0]);
        let n = Dimension([1, 1, -2, 0, 0, 0, 0]);
        assert_eq!(compound(v / n).as_deref(), Some("V/N"));
        let ohm = Dimension([2, 1, -3, -2, 0, 0, 0]);
        assert_eq!(compound(ohm * m).as_deref(), Some("Ω·m"));
        assert_eq!(compound(ohm.powi(-1)).as_deref(), Some("1/Ω"));
        // Nothing shorter than the base units for m·s.
        assert_eq!(compound(m * Dimension::TIME), None);
    }

    fn join_auto(si: f64, dim: Dimension) -> String {
        let (v, u) = auto(si, dim, Kind::Plain);
        join(v, &u)
    }
}
