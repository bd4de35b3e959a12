//! The delta (0°/60°/120°) rosette: strain state, closed-form principal strains, and the
//! transverse-sensitivity correction of its three readings.
//!
//! Closed forms (Dally & Riley, *Experimental Stress Analysis*, 4th ed., ch. 9, from memory):
//! ε₁,₂ = (ε₀ + ε₆₀ + ε₁₂₀)/3 ± (√2/3)·√((ε₀ − ε₆₀)² + (ε₆₀ − ε₁₂₀)² + (ε₁₂₀ − ε₀)²),
//! tan 2φ = √3(ε₆₀ − ε₁₂₀)/(2ε₀ − ε₆₀ − ε₁₂₀); quadrant as in [`PrincipalStrains`].

use std::f64::consts::SQRT_2;

use super::{PrincipalStrains, StrainState, transverse};
use crate::{PhysicsError, Strain};

/// Readings of a delta rosette, gauges at 0°, 60° and 120° from its x axis (counter-clockwise).
///
/// ```
/// use gaugebook::{DeltaRosette, Strain};
/// let d = DeltaRosette::new(Strain::new(1e-3), Strain::new(1e-3), Strain::new(1e-3));
/// // Equal readings: equal biaxial strain, no shear.
/// assert!(d.principal().max_shear().value().abs() < 1e-18);
/// ```
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct DeltaRosette {
    e0: Strain,
    e60: Strain,
    e120: Strain,
}

impl DeltaRosette {
    /// Readings at 0°, 60°, 120°.
    ///
    /// ```
    /// use gaugebook::{DeltaRosette, Strain};
    /// assert_eq!(DeltaRosette::new(Strain::ZERO, Strain::ZERO, Strain::new(2e-4)).readings()[2].value(), 2e-4);
    /// ```
    pub fn new(e0: Strain, e60: Strain, e120: Strain) -> DeltaRosette {
        DeltaRosette { e0, e60, e120 }
    }

    /// The readings [ε₀, ε₆₀, ε₁₂₀].
    ///
    /// ```
    /// use gaugebook::{DeltaRosette, Strain};
    /// assert_eq!(DeltaRosette::new(Strain::new(1e-4), Strain::ZERO, Strain::ZERO).readings()[0].value(), 1e-4);
    /// ```
    pub fn readings(&self) -> [Strain; 3] {
        [self.e0, self.e60, self.e120]
    }

    /// The strain state: ε_x = ε₀, ε_y = (2ε₆₀ + 2ε₁₂₀ − ε₀)/3, γ_xy = (2/√3)(ε₆₀ − ε₁₂₀).
    ///
    /// ```
    /// use gaugebook::{DeltaRosette, Strain};
    /// let s = DeltaRosette::new(Strain::new(1e-3), Strain::new(1e-3), Strain::new(1e-3)).strain_state();
    /// assert!((s.ey().value() - 1e-3).abs() < 1e-18);
    /// ```
    pub fn strain_state(&self) -> StrainState {
        let (a, b, c) = (self.e0.value(), self.e60.value(), self.e120.value());
        StrainState::new(
            self.e0,
            Strain::new((2.0 * b + 2.0 * c - a) / 3.0),
            Strain::new(2.0 / 3.0f64.sqrt() * (b - c)),
        )
    }

    /// Principal strains, angle and maximum shear from the closed forms above.
    ///
    /// ```
    /// use gaugebook::{DeltaRosette, Strain};
    /// let d = DeltaRosette::new(Strain::from_microstrain(620.0), Strain::from_microstrain(-140.0), Strain::from_microstrain(410.0));
    /// assert!((d.principal().max().microstrain() - 749.8529173161958).abs() < 1e-9);
    /// ```
    pub fn principal(&self) -> PrincipalStrains {
        let (a, b, c) = (self.e0.value(), self.e60.value(), self.e120.value());
        let centre = (a + b + c) / 3.0;
        let radius = SQRT_2 / 3.0 * ((a - b).powi(2) + (b - c).powi(2) + (c - a).powi(2)).sqrt();
        let angle = 0.5 * (3.0f64.sqrt() * (b - c)).atan2(2.0 * a - b - c);
        PrincipalStrains::from_parts(centre + radius, centre - radius, angle)
    }

    /// The readings corrected for transverse sensitivity K_t (calibration ν₀): with
    /// c = (1 − ν₀K_t)/(1 − K_t²) and ε̂ the readings,
    /// εᵢ = c·((1 + K_t)ε̂ᵢ − (2K_t/3)(ε̂₀ + ε̂₆₀ + ε̂₁₂₀)), e.g.
    /// ε₀ = c((1 + K_t/3)ε̂₀ − (2K_t/3)(ε̂₆₀ + ε̂₁₂₀)) (Dally & Riley, 4th ed., ch. 9, from
    /// memory). It follows because the transverse direction of each gauge carries
    /// ε_x + ε_y − εᵢ and ε_x + ε_y = (2/3)(ε₀ + ε₆₀ + ε₁₂₀) for a delta rosette.
    ///
    /// ```
    /// use gaugebook::{DeltaRosette, Strain};
    /// let d = DeltaRosette::new(Strain::new(1e-3), Strain::new(5e-4), Strain::new(-3e-4));
    /// assert_eq!(d.corrected(0.0, 0.285)?, d);
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn corrected(&self, kt: f64, nu0: f64) -> Result<DeltaRosette, PhysicsError> {
        let c = transverse::factor(kt, nu0)?;
        let sum = self.e0 + self.e60 + self.e120;
        let f = |e: Strain| (e * (1.0 + kt) - sum * (2.0 * kt / 3.0)) * c;
        Ok(DeltaRosette {
            e0: f(self.e0),
            e60: f(self.e60),
            e120: f(self.e120),
        })
    }
}
