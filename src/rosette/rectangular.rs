//! The rectangular (0°/45°/90°) rosette: strain state, closed-form principal strains, and the
//! transverse-sensitivity correction of its three readings.
//!
//! Closed forms (Dally & Riley, *Experimental Stress Analysis*, 4th ed., ch. 9, from memory):
//! ε₁,₂ = (ε₀ + ε₉₀)/2 ± (1/√2)·√((ε₀ − ε₄₅)² + (ε₄₅ − ε₉₀)²),
//! tan 2φ = (2ε₄₅ − ε₀ − ε₉₀)/(ε₀ − ε₉₀); quadrant as in [`PrincipalStrains`].

use std::f64::consts::SQRT_2;

use super::{PrincipalStrains, StrainState, transverse};
use crate::{PhysicsError, Strain};

/// Readings of a rectangular rosette, gauges at 0°, 45° and 90° from its x axis
/// (counter-clockwise).
///
/// ```
/// use gaugebook::{RectangularRosette, Strain};
/// let r = RectangularRosette::new(
///     Strain::from_microstrain(850.0), Strain::from_microstrain(-210.0), Strain::from_microstrain(-320.0));
/// let p = r.principal();
/// assert!(p.max() > p.min());
/// ```
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct RectangularRosette {
    e0: Strain,
    e45: Strain,
    e90: Strain,
}

impl RectangularRosette {
    /// Readings at 0°, 45°, 90°.
    ///
    /// ```
    /// use gaugebook::{RectangularRosette, Strain};
    /// let r = RectangularRosette::new(Strain::new(1e-3), Strain::ZERO, Strain::ZERO);
    /// assert_eq!(r.readings()[0].value(), 1e-3);
    /// ```
    pub fn new(e0: Strain, e45: Strain, e90: Strain) -> RectangularRosette {
        RectangularRosette { e0, e45, e90 }
    }

    /// The readings [ε₀, ε₄₅, ε₉₀].
    ///
    /// ```
    /// use gaugebook::{RectangularRosette, Strain};
    /// let r = RectangularRosette::new(Strain::ZERO, Strain::new(1e-3), Strain::ZERO);
    /// assert_eq!(r.readings()[1].value(), 1e-3);
    /// ```
    pub fn readings(&self) -> [Strain; 3] {
        [self.e0, self.e45, self.e90]
    }

    /// The strain state: ε_x = ε₀, ε_y = ε₉₀, γ_xy = 2ε₄₅ − ε₀ − ε₉₀.
    ///
    /// ```
    /// use gaugebook::{RectangularRosette, Strain};
    /// let s = RectangularRosette::new(Strain::new(1e-3), Strain::new(1e-3), Strain::new(1e-3)).strain_state();
    /// assert_eq!(s.gxy().value(), 0.0);
    /// ```
    pub fn strain_state(&self) -> StrainState {
        StrainState::new(self.e0, self.e90, self.e45 * 2.0 - self.e0 - self.e90)
    }

    /// Principal strains, angle and maximum shear from the closed forms above.
    ///
    /// ```
    /// use gaugebook::{RectangularRosette, Strain};
    /// use uom::si::angle::degree;
    /// let r = RectangularRosette::new(Strain::from_microstrain(-400.0), Strain::from_microstrain(300.0), Strain::from_microstrain(600.0));
    /// let p = r.principal();
    /// assert!((p.angle().get::<degree>() - 79.09929525682409).abs() < 1e-9);
    /// ```
    pub fn principal(&self) -> PrincipalStrains {
        let (a, b, c) = (self.e0.value(), self.e45.value(), self.e90.value());
        let centre = 0.5 * (a + c);
        let radius = (a - b).hypot(b - c) / SQRT_2;
        let angle = 0.5 * (2.0 * b - a - c).atan2(a - c);
        PrincipalStrains::from_parts(centre + radius, centre - radius, angle)
    }

    /// The readings corrected for the gauges' transverse sensitivity K_t, measured with
    /// calibration-beam Poisson's ratio ν₀ (Dally & Riley, 4th ed., ch. 9, from memory):
    /// with c = (1 − ν₀K_t)/(1 − K_t²),
    /// ε₀ = c(ε̂₀ − K_tε̂₉₀), ε₉₀ = c(ε̂₉₀ − K_tε̂₀), ε₄₅ = c(ε̂₄₅ − K_t(ε̂₀ + ε̂₉₀ − ε̂₄₅)),
    /// where ε̂ are the readings (ΔR/R over the gauge factor). All three gauges share K_t.
    ///
    /// ```
    /// use gaugebook::{RectangularRosette, Strain};
    /// let r = RectangularRosette::new(Strain::new(1e-3), Strain::new(5e-4), Strain::new(-3e-4));
    /// assert_eq!(r.corrected(0.0, 0.285)?, r);
    /// assert!(r.corrected(1.0, 0.285).is_err());
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn corrected(&self, kt: f64, nu0: f64) -> Result<RectangularRosette, PhysicsError> {
        let (e0, e90) = transverse::correct_orthogonal(self.e0, self.e90, kt, nu0)?;
        let c = transverse::factor(kt, nu0)?;
        let e45 = (self.e45 - (self.e0 + self.e90 - self.e45) * kt) * c;
        Ok(RectangularRosette { e0, e45, e90 })
    }
}
