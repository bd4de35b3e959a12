//! A prepared exact inverse from output ratio to strain, for converting long records.
//!
//! The parameters (gauge factor, arrangement, ν) are checked once when the inverse is made by
//! [`Arrangement::inverse`](crate::Arrangement::inverse); each sample then costs a multiply, a
//! multiply-add and a divide, with no allocation and no error path, so the same inverse serves
//! one design point or a million-sample column.

use crate::{OutputRatio, PhysicsError, Strain};

/// ε = c·r/(B − d·r) with c = 4/F, d = 4β, valid for r in the open range (lo, hi).
///
/// ```
/// use gaugebook::Arrangement;
/// let inv = Arrangement::FullBending.inverse(2.0, 0.3)?;
/// let f = inv.as_fn();
/// assert!((f(2.0e-3) - 1.0e-3).abs() < 1e-18);
/// # Ok::<(), gaugebook::PhysicsError>(())
/// ```
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct StrainInverse {
    c: f64,
    b: f64,
    d: f64,
    lo: f64,
    hi: f64,
}

impl StrainInverse {
    /// Built only by `Arrangement::inverse`, which has checked every part.
    pub(crate) fn from_parts(c: f64, b: f64, d: f64, lo: f64, hi: f64) -> StrainInverse {
        StrainInverse { c, b, d, lo, hi }
    }

    /// Strain (m/m) for output ratio `r` (V/V), unchecked: inside
    /// [`valid_range`](StrainInverse::valid_range) it is exact; outside it the number has no
    /// physical meaning (it may be negative of the right sign, huge or infinite).
    ///
    /// ```
    /// use gaugebook::Arrangement;
    /// let inv = Arrangement::Quarter.inverse(2.0, 0.3)?;
    /// assert!((inv.apply(1.0e-3) - 4.0e-3 / (2.0 * 0.998)).abs() < 1e-18);
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    #[inline]
    pub fn apply(&self, r: f64) -> f64 {
        self.c * r / (self.b - self.d * r)
    }

    /// Like [`apply`](StrainInverse::apply) but NaN for a ratio outside the valid range (or NaN),
    /// so that impossible samples in a record stay visibly missing instead of turning into
    /// numbers.
    ///
    /// ```
    /// use gaugebook::Arrangement;
    /// let inv = Arrangement::Quarter.inverse(2.0, 0.3)?;
    /// assert!(inv.apply_or_nan(0.7).is_nan());
    /// assert!(inv.apply_or_nan(0.0) == 0.0);
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    #[inline]
    pub fn apply_or_nan(&self, r: f64) -> f64 {
        if r > self.lo && r < self.hi {
            self.apply(r)
        } else {
            f64::NAN
        }
    }

    /// Checked conversion of one output ratio to a strain.
    ///
    /// ```
    /// use gaugebook::{Arrangement, OutputRatio};
    /// let inv = Arrangement::HalfBending.inverse(2.0, 0.3)?;
    /// assert!((inv.apply_checked(OutputRatio::from_mv_per_v(1.0))?.microstrain() - 1000.0).abs() < 1e-9);
    /// assert!(inv.apply_checked(OutputRatio::new(f64::NAN)).is_err());
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn apply_checked(&self, ratio: OutputRatio) -> Result<Strain, PhysicsError> {
        let r = ratio.value();
        if r > self.lo && r < self.hi {
            Ok(Strain::new(self.apply(r)))
        } else {
            Err(PhysicsError::out_of_range(
                "the exact bridge inverse",
                format!(
                    "output ratio {r} V/V is outside the range the bridge can produce, ({} V/V, {} V/V)",
                    self.lo, self.hi
                ),
            ))
        }
    }

    /// Converts `input` (V/V) into `output` (m/m) in place, unchecked as
    /// [`apply`](StrainInverse::apply). Errors only if the lengths differ.
    ///
    /// ```
    /// use gaugebook::Arrangement;
    /// let inv = Arrangement::Quarter.inverse(2.0, 0.3)?;
    /// let r = vec![1.0e-4; 1000];
    /// let mut e = vec![0.0; 1000];
    /// inv.apply_slice(&r, &mut e)?;
    /// assert_eq!(e[999], inv.apply(1.0e-4));
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn apply_slice(&self, input: &[f64], output: &mut [f64]) -> Result<(), PhysicsError> {
        if input.len() != output.len() {
            return Err(PhysicsError::Mismatch {
                what: "output-ratio and strain buffer lengths".into(),
                left: input.len().to_string(),
                right: output.len().to_string(),
            });
        }
        for (o, &r) in output.iter_mut().zip(input) {
            *o = self.apply(r);
        }
        Ok(())
    }

    /// The inverse as a plain closure `Fn(f64) -> f64` (V/V to m/m, unchecked).
    ///
    /// ```
    /// use gaugebook::Arrangement;
    /// let f = Arrangement::Quarter.inverse(2.0, 0.3)?.as_fn();
    /// let e: Vec<f64> = [0.0, 5.0e-4].into_iter().map(f).collect();
    /// assert_eq!(e[0], 0.0);
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn as_fn(self) -> impl Fn(f64) -> f64 + Copy + Send + Sync {
        move |r| self.apply(r)
    }

    /// The open interval of output ratios (V/V) for which the inverse is exact and physical.
    ///
    /// ```
    /// use gaugebook::Arrangement;
    /// assert_eq!(Arrangement::Quarter.inverse(2.0, 0.3)?.valid_range(), (-0.5, 0.5));
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn valid_range(&self) -> (f64, f64) {
        (self.lo, self.hi)
    }
}
