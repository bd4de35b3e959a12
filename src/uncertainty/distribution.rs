//! Probability distributions assigned to input quantities (GUM type B, JCGM 101 §6.4).

use crate::PhysicsError;
use rand::Rng;
use rand_distr::{Distribution as _, StandardNormal, StudentT};

/// A distribution for one input quantity.
///
/// Standard uncertainties: normal σ; rectangular a/√3; symmetric triangular a/√6; arcsine
/// (U-shaped) a/√2 (JCGM 100:2008, 4.3.7, 4.3.9 and JCGM 101:2008, 6.4.2–6.4.6, from memory);
/// scaled and shifted t: s·√(ν/(ν − 2)) for ν > 2 (JCGM 101:2008, 6.4.9.4, from memory).
///
/// ```
/// use gaugebook::Distribution;
/// let d = Distribution::Rectangular { mean: 0.0, half_width: 3f64.sqrt() };
/// assert!((d.standard_uncertainty()? - 1.0).abs() < 1e-15);
/// # Ok::<(), gaugebook::PhysicsError>(())
/// ```
#[derive(Clone, Copy, Debug, PartialEq)]
pub enum Distribution {
    /// Gaussian with mean and standard deviation.
    Normal {
        /// Expectation.
        mean: f64,
        /// Standard deviation.
        sd: f64,
    },
    /// Uniform on [mean − a, mean + a].
    Rectangular {
        /// Centre.
        mean: f64,
        /// Half-width a.
        half_width: f64,
    },
    /// Symmetric triangular on [mean − a, mean + a].
    Triangular {
        /// Centre (mode).
        mean: f64,
        /// Half-width a.
        half_width: f64,
    },
    /// Arcsine (U-shaped) on [mean − a, mean + a], e.g. a sinusoidally varying quantity.
    Arcsine {
        /// Centre.
        mean: f64,
        /// Half-width a.
        half_width: f64,
    },
    /// Scaled and shifted t: mean + scale · T_ν, JCGM 101's choice for a type A input from
    /// n observations (scale = s/√n, ν = n − 1).
    StudentT {
        /// Location (the mean of the observations).
        mean: f64,
        /// Scale (the standard uncertainty s/√n of the mean).
        scale: f64,
        /// Degrees of freedom.
        dof: f64,
    },
}

impl Distribution {
    /// The expectation (best estimate).
    ///
    /// ```
    /// assert_eq!(gaugebook::Distribution::Arcsine { mean: 3.0, half_width: 1.0 }.mean(), 3.0);
    /// ```
    pub fn mean(&self) -> f64 {
        match *self {
            Distribution::Normal { mean, .. }
            | Distribution::Rectangular { mean, .. }
            | Distribution::Triangular { mean, .. }
            | Distribution::Arcsine { mean, .. }
            | Distribution::StudentT { mean, .. } => mean,
        }
    }

    /// The standard deviation of the distribution.
    ///
    /// ```
    /// use gaugebook::Distribution;
    /// let t = Distribution::StudentT { mean: 0.0, scale: 1.0, dof: 2.0 };
    /// assert!(t.standard_uncertainty().is_err()); // infinite variance at ν ≤ 2
    /// ```
    pub fn standard_uncertainty(&self) -> Result<f64, PhysicsError> {
        self.validate()?;
        Ok(match *self {
            Distribution::Normal { sd, .. } => sd,
            Distribution::Rectangular { half_width, .. } => half_width / 3f64.sqrt(),
            Distribution::Triangular { half_width, .. } => half_width / 6f64.sqrt(),
            Distribution::Arcsine { half_width, .. } => half_width / 2f64.sqrt(),
            Distribution::StudentT { scale, dof, .. } => {
                if dof <= 2.0 {
                    return Err(PhysicsError::invalid(
                        "degrees of freedom of a t distribution",
                        dof,
                        "more than 2 for a finite standard deviation",
                    ));
                }
                scale * (dof / (dof - 2.0)).sqrt()
            }
        })
    }

    fn validate(&self) -> Result<(), PhysicsError> {
        let (name, m, w) = match *self {
            Distribution::Normal { mean, sd } => ("standard deviation", mean, sd),
            Distribution::Rectangular { mean, half_width }
            | Distribution::Triangular { mean, half_width }
            | Distribution::Arcsine { mean, half_width } => ("half-width", mean, half_width),
            Distribution::StudentT { mean, scale, dof } => {
                crate::check_positive("degrees of freedom", dof, "")?;
                ("scale", mean, scale)
            }
        };
        crate::check_finite("distribution mean", m, "")?;
        if !(w.is_finite() && w >= 0.0) {
            return Err(PhysicsError::invalid(
                name,
                w,
                "a finite value of 0 or more",
            ));
        }
        Ok(())
    }

    /// Fills `out` with independent draws (JCGM 101:2008, 6.4 and Annex C, from memory).
    pub(crate) fn sample_into<R: Rng>(&self, rng: &mut R, out: &mut [f64]) {
        match *self {
            Distribution::Normal { mean, sd } => {
                for v in out {
                    let z: f64 = StandardNormal.sample(rng);
                    *v = mean + sd * z;
                }
            }
            Distribution::Rectangular { mean, half_width } => {
                for v in out {
                    *v = mean + half_width * (2.0 * rng.random::<f64>() - 1.0);
                }
            }
            Distribution::Triangular { mean, half_width } => {
                // The sum of two independent uniforms on [0, 1) less 1 is triangular on (−1, 1).
                for v in out {
                    *v = mean + half_width * (rng.random::<f64>() + rng.random::<f64>() - 1.0);
                }
            }
            Distribution::Arcsine { mean, half_width } => {
                for v in out {
                    *v = mean
                        + half_width * (2.0 * std::f64::consts::PI * rng.random::<f64>()).sin();
                }
            }
            Distribution::StudentT { mean, scale, dof } => {
                // Validated before sampling (dof > 0), so the constructor cannot fail; a
                // degenerate dof falls back to the normal limit rather than panicking.
                match StudentT::new(dof) {
                    Ok(t) => {
                        for v in out {
                            *v = mean + scale * t.sample(rng);
                        }
                    }
                    Err(_) => {
                        for v in out {
                            let z: f64 = StandardNormal.sample(rng);
                            *v = mean + scale * z;
                        }
                    }
                }
            }
        }
    }
}
