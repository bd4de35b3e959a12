//! Dimension exponents over the seven SI base quantities.
//!
//! The dynamic [`Quantity`](crate::Quantity) of the scripting layer carries one of these so that
//! `350 Ω + 5 V` is caught at run time, the way uom catches it at compile time in the Rust API.

use std::fmt;

/// Exponents of the seven SI base dimensions, in the order of the SI Brochure (from memory)
/// (9th edition, 2019, §2.3.3): length, mass, time, electric current, thermodynamic temperature,
/// amount of substance, luminous intensity.
///
/// ```
/// use gaugebook::Dimension;
/// let force = Dimension::MASS * Dimension::LENGTH / Dimension::TIME.powi(2);
/// assert_eq!(force.to_string(), "m·kg·s⁻²");
/// assert!((force / force).is_dimensionless());
/// ```
#[derive(Clone, Copy, Debug, PartialEq, Eq, Hash, Default)]
pub struct Dimension(pub [i8; 7]);

impl Dimension {
    /// No dimension: ratios, strain, bridge output ratio, angles.
    ///
    /// ```
    /// assert_eq!(gaugebook::Dimension::NONE.to_string(), "1");
    /// ```
    pub const NONE: Dimension = Dimension([0; 7]);
    /// Length (m).
    ///
    /// ```
    /// assert_eq!(gaugebook::Dimension::LENGTH.to_string(), "m");
    /// ```
    pub const LENGTH: Dimension = Dimension([1, 0, 0, 0, 0, 0, 0]);
    /// Mass (kg).
    ///
    /// ```
    /// assert_eq!(gaugebook::Dimension::MASS.to_string(), "kg");
    /// ```
    pub const MASS: Dimension = Dimension([0, 1, 0, 0, 0, 0, 0]);
    /// Time (s).
    ///
    /// ```
    /// assert_eq!(gaugebook::Dimension::TIME.to_string(), "s");
    /// ```
    pub const TIME: Dimension = Dimension([0, 0, 1, 0, 0, 0, 0]);
    /// Electric current (A).
    ///
    /// ```
    /// assert_eq!(gaugebook::Dimension::CURRENT.to_string(), "A");
    /// ```
    pub const CURRENT: Dimension = Dimension([0, 0, 0, 1, 0, 0, 0]);
    /// Thermodynamic temperature (K), absolute or as an interval (see [`Kind`](crate::Kind)).
    ///
    /// ```
    /// assert_eq!(gaugebook::Dimension::TEMPERATURE.to_string(), "K");
    /// ```
    pub const TEMPERATURE: Dimension = Dimension([0, 0, 0, 0, 1, 0, 0]);
    /// Amount of substance (mol).
    ///
    /// ```
    /// assert_eq!(gaugebook::Dimension::AMOUNT.to_string(), "mol");
    /// ```
    pub const AMOUNT: Dimension = Dimension([0, 0, 0, 0, 0, 1, 0]);
    /// Luminous intensity (cd).
    ///
    /// ```
    /// assert_eq!(gaugebook::Dimension::LUMINOUS.to_string(), "cd");
    /// ```
    pub const LUMINOUS: Dimension = Dimension([0, 0, 0, 0, 0, 0, 1]);

    /// SI base-unit symbols in the same order as the exponents.
    ///
    /// ```
    /// assert_eq!(gaugebook::Dimension::BASE_SYMBOLS[1], "kg");
    /// ```
    pub const BASE_SYMBOLS: [&'static str; 7] = ["m", "kg", "s", "A", "K", "mol", "cd"];

    /// True when every exponent is zero.
    ///
    /// ```
    /// assert!(gaugebook::Dimension::NONE.is_dimensionless());
    /// ```
    pub fn is_dimensionless(self) -> bool {
        self.0.iter().all(|&e| e == 0)
    }

    /// The dimension raised to an integer power.
    ///
    /// ```
    /// use gaugebook::Dimension;
    /// assert_eq!(Dimension::LENGTH.powi(2), Dimension([2, 0, 0, 0, 0, 0, 0]));
    /// ```
    pub fn powi(self, n: i32) -> Dimension {
        let mut out = [0i8; 7];
        for (o, e) in out.iter_mut().zip(self.0) {
            // Exponents in engineering units stay far below i8's range; saturate rather than wrap.
            *o = (i32::from(e) * n).clamp(i8::MIN.into(), i8::MAX.into()) as i8;
        }
        Dimension(out)
    }

    /// The square root, when every exponent is even.
    ///
    /// ```
    /// use gaugebook::Dimension;
    /// assert_eq!(Dimension::LENGTH.powi(2).sqrt(), Some(Dimension::LENGTH));
    /// assert_eq!(Dimension::LENGTH.sqrt(), None);
    /// ```
    pub fn sqrt(self) -> Option<Dimension> {
        if self.0.iter().any(|e| e % 2 != 0) {
            return None;
        }
        let mut out = self.0;
        out.iter_mut().for_each(|e| *e /= 2);
        Some(Dimension(out))
    }
}

impl std::ops::Mul for Dimension {
    type Output = Dimension;
    fn mul(self, rhs: Dimension) -> Dimension {
        let mut out = self.0;
        for (o, e) in out.iter_mut().zip(rhs.0) {
            *o = o.saturating_add(e);
        }
        Dimension(out)
    }
}

impl std::ops::Div for Dimension {
    type Output = Dimension;
    fn div(self, rhs: Dimension) -> Dimension {
        let mut out = self.0;
        for (o, e) in out.iter_mut().zip(rhs.0) {
            *o = o.saturating_sub(e);
        }
        Dimension(out)
    }
}

/// Writes the dimension as a product of SI base units with superscript exponents, `1` when
/// dimensionless.
impl fmt::Display for Dimension {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        if self.is_dimensionless() {
            return f.write_str("1");
        }
        let mut first = true;
        for (sym, &e) in Self::BASE_SYMBOLS.iter().zip(self.0.iter()) {
            if e == 0 {
                continue;
            }
            if !first {
                f.write_str("·")?;
            }
            first = false;
            f.write_str(sym)?;
            if e != 1 {
                f.write_str(&superscript(e))?;
            }
        }
        Ok(())
    }
}

fn superscript(e: i8) -> String {
    const DIGITS: [char; 10] = ['⁰', '¹', '²', '³', '⁴', '⁵', '⁶', '⁷', '⁸', '⁹'];
    let mut s = String::new();
    if e < 0 {
        s.push('⁻');
    }
    for c in e.unsigned_abs().to_string().chars() {
        // `c` is an ASCII digit produced by `to_string`, so the index is in 0..10.
        s.push(DIGITS[(c as u8 - b'0') as usize]);
    }
    s
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn algebra_of_derived_units() {
        // SI Brochure (9th ed., 2019) Table 4 (from memory): N = kg·m·s⁻², Pa = N/m², V = W/A, Ω = V/A.
        let newton = Dimension::MASS * Dimension::LENGTH / Dimension::TIME.powi(2);
        let pascal = newton / Dimension::LENGTH.powi(2);
        assert_eq!(pascal, Dimension([-1, 1, -2, 0, 0, 0, 0]));
        let watt = newton * Dimension::LENGTH / Dimension::TIME;
        let volt = watt / Dimension::CURRENT;
        let ohm = volt / Dimension::CURRENT;
        assert_eq!(ohm, Dimension([2, 1, -3, -2, 0, 0, 0]));
        assert_eq!(ohm.to_string(), "m²·kg·s⁻³·A⁻²");
    }
}
