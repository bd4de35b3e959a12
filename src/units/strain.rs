//! Strain and bridge output ratio as distinct dimensionless types.
//!
//! Both are "a number" in SI, and both are routinely quoted in millionths or thousandths, which
//! is exactly how they get mixed up: 2 mV/V is not 2000 µε. Separate newtypes make the Rust API
//! refuse the mix at compile time; the scripting layer refuses it at run time through
//! [`Kind`](crate::Kind).

use std::fmt;
use std::ops::{Add, AddAssign, Div, Mul, Neg, Sub, SubAssign};

/// Mechanical strain ε in m/m (positive in tension).
///
/// ```
/// use gaugebook::Strain;
/// let e = Strain::from_microstrain(1000.0);
/// assert_eq!(e.value(), 1.0e-3);
/// assert_eq!(e.to_string(), "1000 µε");
/// assert_eq!((e * 2.0).microstrain(), 2000.0);
/// ```
#[derive(Clone, Copy, Debug, PartialEq, PartialOrd, Default)]
pub struct Strain(f64);

impl Strain {
    /// No strain.
    ///
    /// ```
    /// assert_eq!(gaugebook::Strain::ZERO.value(), 0.0);
    /// ```
    pub const ZERO: Strain = Strain(0.0);

    /// Strain from its value in m/m.
    ///
    /// ```
    /// assert_eq!(gaugebook::Strain::new(1e-3).microstrain(), 1000.0);
    /// ```
    pub const fn new(value: f64) -> Strain {
        Strain(value)
    }

    /// Strain from microstrain (µε, 10⁻⁶ m/m).
    ///
    /// ```
    /// assert_eq!(gaugebook::Strain::from_microstrain(500.0).value(), 5e-4);
    /// ```
    pub fn from_microstrain(ue: f64) -> Strain {
        Strain(ue * 1e-6)
    }

    /// The value in m/m.
    ///
    /// ```
    /// assert_eq!(gaugebook::Strain::new(2e-4).value(), 2e-4);
    /// ```
    pub const fn value(self) -> f64 {
        self.0
    }

    /// The value in microstrain.
    ///
    /// ```
    /// assert_eq!(gaugebook::Strain::new(5e-4).microstrain(), 500.0);
    /// ```
    pub fn microstrain(self) -> f64 {
        self.0 * 1e6
    }

    /// The magnitude.
    ///
    /// ```
    /// use gaugebook::Strain;
    /// assert_eq!(Strain::new(-1e-3).abs(), Strain::new(1e-3));
    /// ```
    pub fn abs(self) -> Strain {
        Strain(self.0.abs())
    }
}

/// Bridge output over excitation, V/V (usually quoted in mV/V).
///
/// ```
/// use gaugebook::OutputRatio;
/// let r = OutputRatio::from_mv_per_v(2.0);
/// assert_eq!(r.value(), 2.0e-3);
/// assert_eq!(r.to_string(), "2 mV/V");
/// ```
#[derive(Clone, Copy, Debug, PartialEq, PartialOrd, Default)]
pub struct OutputRatio(f64);

impl OutputRatio {
    /// A balanced bridge.
    ///
    /// ```
    /// assert_eq!(gaugebook::OutputRatio::ZERO.value(), 0.0);
    /// ```
    pub const ZERO: OutputRatio = OutputRatio(0.0);

    /// Output ratio from its value in V/V.
    ///
    /// ```
    /// assert_eq!(gaugebook::OutputRatio::new(2e-3).mv_per_v(), 2.0);
    /// ```
    pub const fn new(value: f64) -> OutputRatio {
        OutputRatio(value)
    }

    /// Output ratio from mV/V.
    ///
    /// ```
    /// assert_eq!(gaugebook::OutputRatio::from_mv_per_v(1.5).value(), 1.5e-3);
    /// ```
    pub fn from_mv_per_v(mv_per_v: f64) -> OutputRatio {
        OutputRatio(mv_per_v * 1e-3)
    }

    /// The value in V/V.
    ///
    /// ```
    /// assert_eq!(gaugebook::OutputRatio::new(1e-3).value(), 1e-3);
    /// ```
    pub const fn value(self) -> f64 {
        self.0
    }

    /// The value in mV/V.
    ///
    /// ```
    /// assert_eq!(gaugebook::OutputRatio::new(1.5e-3).mv_per_v(), 1.5);
    /// ```
    pub fn mv_per_v(self) -> f64 {
        self.0 * 1e3
    }

    /// The magnitude.
    ///
    /// ```
    /// use gaugebook::OutputRatio;
    /// assert_eq!(OutputRatio::new(-1e-3).abs(), OutputRatio::new(1e-3));
    /// ```
    pub fn abs(self) -> OutputRatio {
        OutputRatio(self.0.abs())
    }
}

macro_rules! linear_newtype_ops {
    ($t:ident) => {
        impl Add for $t {
            type Output = $t;
            fn add(self, rhs: $t) -> $t {
                $t(self.0 + rhs.0)
            }
        }
        impl Sub for $t {
            type Output = $t;
            fn sub(self, rhs: $t) -> $t {
                $t(self.0 - rhs.0)
            }
        }
        impl AddAssign for $t {
            fn add_assign(&mut self, rhs: $t) {
                self.0 += rhs.0;
            }
        }
        impl SubAssign for $t {
            fn sub_assign(&mut self, rhs: $t) {
                self.0 -= rhs.0;
            }
        }
        impl Neg for $t {
            type Output = $t;
            fn neg(self) -> $t {
                $t(-self.0)
            }
        }
        impl Mul<f64> for $t {
            type Output = $t;
            fn mul(self, rhs: f64) -> $t {
                $t(self.0 * rhs)
            }
        }
        impl Mul<$t> for f64 {
            type Output = $t;
            fn mul(self, rhs: $t) -> $t {
                $t(self * rhs.0)
            }
        }
        impl Div<f64> for $t {
            type Output = $t;
            fn div(self, rhs: f64) -> $t {
                $t(self.0 / rhs)
            }
        }
        /// The ratio of two values of the same kind is a plain number.
        impl Div for $t {
            type Output = f64;
            fn div(self, rhs: $t) -> f64 {
                self.0 / rhs.0
            }
        }
        impl std::iter::Sum for $t {
            fn sum<I: Iterator<Item = $t>>(iter: I) -> $t {
                $t(iter.map(|x| x.0).sum())
            }
        }
    };
}

linear_newtype_ops!(Strain);
linear_newtype_ops!(OutputRatio);

/// Six significant figures, trailing zeros trimmed (the quantity display's rule).
fn short(v: f64) -> String {
    super::format::number(v)
}

impl fmt::Display for Strain {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        write!(f, "{} µε", short(self.microstrain()))
    }
}

impl fmt::Display for OutputRatio {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        write!(f, "{} mV/V", short(self.mv_per_v()))
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn display_is_short_and_readable() {
        assert_eq!(Strain::from_microstrain(-12.5).to_string(), "-12.5 µε");
        assert_eq!(
            OutputRatio::from_mv_per_v(0.4995).to_string(),
            "0.4995 mV/V"
        );
        assert_eq!(OutputRatio::ZERO.to_string(), "0 mV/V");
    }

    #[test]
    fn ratio_of_like_values_is_plain() {
        let a = Strain::from_microstrain(300.0);
        let b = Strain::from_microstrain(1000.0);
        assert!((a / b - 0.3).abs() < 1e-15);
    }
}
