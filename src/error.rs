//! The physics layer's error: bad parameters, models used outside their range, no solution.
//!
//! One enum for the whole physics layer (bridge, gauge, rosette, spring, layout, chain, calib,
//! standards, uncertainty, signal) so that a design procedure that strings several of them
//! together returns one error type. Variants carry the data a message needs; messages are
//! lowercase, without a trailing period, and say what was expected and what was found.

use thiserror::Error;

/// An error from a physics or analysis function.
///
/// ```
/// use gaugebook::PhysicsError;
/// let e = PhysicsError::invalid("gauge resistance", "-350 Ω", "a resistance above 0 Ω");
/// assert_eq!(e.to_string(), "invalid gauge resistance: expected a resistance above 0 Ω, found -350 Ω");
/// ```
#[derive(Debug, Clone, PartialEq, Error)]
#[non_exhaustive]
pub enum PhysicsError {
    /// A parameter outside its physical domain (R ≤ 0, GF ≤ 0, ν ∉ (−1, 0.5), NaN …).
    #[error("invalid {name}: expected {expected}, found {found}")]
    InvalidParameter {
        /// What the parameter is, in words ("gauge factor").
        name: String,
        /// What was given, with its unit.
        found: String,
        /// What is allowed ("a value above 0").
        expected: String,
    },
    /// A closed-form model asked for a case outside the assumptions it is valid under.
    #[error("{model} is outside its range of validity: {reason}")]
    OutOfRange {
        /// The model ("slender cantilever").
        model: String,
        /// Which assumption fails, with numbers.
        reason: String,
    },
    /// A search or an inverse found no value that meets the target.
    #[error("no solution for {what}: {reason}")]
    NoSolution {
        /// What was sought.
        what: String,
        /// Why nothing qualifies.
        reason: String,
    },
    /// Too few points, samples or repeats for the method.
    #[error("not enough data for {what}: needs at least {needed}, found {found}")]
    NotEnoughData {
        /// The method or figure.
        what: String,
        /// The minimum.
        needed: usize,
        /// What was given.
        found: usize,
    },
    /// Two inputs that must agree (lengths, units, series) do not.
    #[error("{what} do not match: {left} versus {right}")]
    Mismatch {
        /// What must agree ("load and output series lengths").
        what: String,
        /// The first side.
        left: String,
        /// The second side.
        right: String,
    },
    /// A numerical procedure failed (singular system, no convergence).
    #[error("numerical failure in {what}: {reason}")]
    Numerical {
        /// The procedure.
        what: String,
        /// What went wrong.
        reason: String,
    },
}

impl PhysicsError {
    /// Shorthand for [`PhysicsError::InvalidParameter`].
    ///
    /// ```
    /// let e = gaugebook::PhysicsError::invalid("gauge factor", 0.0, "a value above 0");
    /// assert!(e.to_string().contains("gauge factor"));
    /// ```
    pub fn invalid(
        name: impl Into<String>,
        found: impl ToString,
        expected: impl Into<String>,
    ) -> PhysicsError {
        PhysicsError::InvalidParameter {
            name: name.into(),
            found: found.to_string(),
            expected: expected.into(),
        }
    }

    /// Shorthand for [`PhysicsError::OutOfRange`].
    ///
    /// ```
    /// let e = gaugebook::PhysicsError::out_of_range("slender beam", "length/depth = 3 < 5");
    /// assert!(e.to_string().starts_with("slender beam is outside"));
    /// ```
    pub fn out_of_range(model: impl Into<String>, reason: impl Into<String>) -> PhysicsError {
        PhysicsError::OutOfRange {
            model: model.into(),
            reason: reason.into(),
        }
    }
}

/// Checks that a parameter is finite and above zero; `unit` is appended to the value in the message.
///
/// ```
/// use gaugebook::check_positive;
/// assert!(check_positive("excitation", 5.0, "V").is_ok());
/// let e = check_positive("excitation", -5.0, "V").unwrap_err();
/// assert_eq!(e.to_string(), "invalid excitation: expected a finite value above 0, found -5 V");
/// ```
pub fn check_positive(name: &str, value: f64, unit: &str) -> Result<f64, PhysicsError> {
    if value.is_finite() && value > 0.0 {
        Ok(value)
    } else {
        Err(PhysicsError::invalid(
            name,
            with_unit(value, unit),
            "a finite value above 0",
        ))
    }
}

/// Checks that a parameter is finite.
///
/// ```
/// assert!(gaugebook::check_finite("zero offset", f64::NAN, "mV/V").is_err());
/// ```
pub fn check_finite(name: &str, value: f64, unit: &str) -> Result<f64, PhysicsError> {
    if value.is_finite() {
        Ok(value)
    } else {
        Err(PhysicsError::invalid(
            name,
            with_unit(value, unit),
            "a finite value",
        ))
    }
}

/// Checks Poisson's ratio against the bounds of an isotropic elastic solid, −1 < ν < 0.5.
///
/// Source: the bounds follow from positive bulk and shear moduli (Timoshenko & Goodier,
/// *Theory of Elasticity*, 3rd ed., 1970, §6).
///
/// ```
/// assert!(gaugebook::check_poisson(0.3).is_ok());
/// assert!(gaugebook::check_poisson(0.5).is_err());
/// ```
pub fn check_poisson(nu: f64) -> Result<f64, PhysicsError> {
    if nu.is_finite() && nu > -1.0 && nu < 0.5 {
        Ok(nu)
    } else {
        Err(PhysicsError::invalid(
            "Poisson's ratio",
            nu,
            "a value in (-1, 0.5)",
        ))
    }
}

fn with_unit(value: f64, unit: &str) -> String {
    if unit.is_empty() {
        format!("{value}")
    } else {
        format!("{value} {unit}")
    }
}

/// The index of the first NaN or infinite value of `x`, if any.
///
/// Long channels are checked before every filter, count and figure, so the common case (all
/// finite) is a pass the compiler vectorises: a value is not finite exactly when its exponent
/// bits are all ones (IEEE 754-2019 §3.4), and OR-ing that test over a chunk needs no early
/// exit. Only a chunk that fails is searched for the index.
pub(crate) fn first_non_finite(x: &[f64]) -> Option<usize> {
    const EXPONENT: u64 = 0x7FF0_0000_0000_0000;
    const CHUNK: usize = 256;
    x.chunks(CHUNK).enumerate().find_map(|(k, c)| {
        let bad = c
            .iter()
            .fold(false, |any, v| any | (v.to_bits() & EXPONENT == EXPONENT));
        if bad {
            c.iter().position(|v| !v.is_finite()).map(|i| k * CHUNK + i)
        } else {
            None
        }
    })
}

#[cfg(test)]
mod tests {
    use super::first_non_finite;

    #[test]
    fn finds_the_first_nan_or_infinity_in_any_chunk() {
        let mut x = vec![1.0; 1000];
        assert_eq!(first_non_finite(&x), None);
        assert_eq!(first_non_finite(&[]), None);
        // The largest finite value and the subnormals are finite.
        x[3] = f64::MAX;
        x[4] = f64::MIN_POSITIVE / 2.0;
        assert_eq!(first_non_finite(&x), None);
        for (at, v) in [
            (0, f64::NAN),
            (255, f64::INFINITY),
            (256, f64::NEG_INFINITY),
            (999, -f64::NAN),
        ] {
            let mut y = x.clone();
            y[at] = v;
            y[at.min(998) + 1..].iter_mut().for_each(|e| *e = f64::NAN);
            assert_eq!(first_non_finite(&y), Some(at), "{v} at {at}");
        }
    }
}
