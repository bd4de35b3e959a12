//! A minimal complex number for filter design (poles and zeros); private to the signal module.
//!
//! Design needs only a handful of operations on at most a few dozen values, so a small `Copy`
//! type here is simpler than a dependency.

use std::ops::{Add, Div, Mul, Neg, Sub};

#[derive(Clone, Copy, Debug, PartialEq)]
pub(crate) struct C {
    pub re: f64,
    pub im: f64,
}

impl C {
    pub const fn new(re: f64, im: f64) -> C {
        C { re, im }
    }
    pub const fn real(re: f64) -> C {
        C { re, im: 0.0 }
    }
    pub fn abs(self) -> f64 {
        self.re.hypot(self.im)
    }
    pub fn conj(self) -> C {
        C::new(self.re, -self.im)
    }
    /// Exactly real, as numpy's `isreal` tests it (imaginary part == 0).
    pub fn is_real(self) -> bool {
        self.im == 0.0
    }
    pub fn is_finite(self) -> bool {
        self.re.is_finite() && self.im.is_finite()
    }
    /// e^{iθ}.
    pub fn cis(theta: f64) -> C {
        C::new(theta.cos(), theta.sin())
    }
}

impl Add for C {
    type Output = C;
    fn add(self, o: C) -> C {
        C::new(self.re + o.re, self.im + o.im)
    }
}
impl Sub for C {
    type Output = C;
    fn sub(self, o: C) -> C {
        C::new(self.re - o.re, self.im - o.im)
    }
}
impl Mul for C {
    type Output = C;
    fn mul(self, o: C) -> C {
        C::new(
            self.re * o.re - self.im * o.im,
            self.re * o.im + self.im * o.re,
        )
    }
}
impl Mul<f64> for C {
    type Output = C;
    fn mul(self, k: f64) -> C {
        C::new(self.re * k, self.im * k)
    }
}
impl Div for C {
    type Output = C;
    fn div(self, o: C) -> C {
        // Smith's algorithm: avoids overflow in |o|² for large or small denominators.
        if o.re.abs() >= o.im.abs() {
            let r = o.im / o.re;
            let d = o.re + o.im * r;
            C::new((self.re + self.im * r) / d, (self.im - self.re * r) / d)
        } else {
            let r = o.re / o.im;
            let d = o.re * r + o.im;
            C::new((self.re * r + self.im) / d, (self.im * r - self.re) / d)
        }
    }
}
impl Div<f64> for C {
    type Output = C;
    fn div(self, k: f64) -> C {
        C::new(self.re / k, self.im / k)
    }
}
impl Neg for C {
    type Output = C;
    fn neg(self) -> C {
        C::new(-self.re, -self.im)
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn division_inverts_multiplication() {
        // Closed-form identity: (a·b)/b = a.
        let a = C::new(1.5, -2.25);
        let b = C::new(-0.3, 4.0);
        let q = (a * b) / b;
        assert!((q - a).abs() < 1e-15);
        let b2 = C::new(7.0, 0.1);
        assert!(((a * b2) / b2 - a).abs() < 1e-15);
    }
}
