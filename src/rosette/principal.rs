//! Principal strains and the principal direction, with the quadrant rule stated once.

use std::f64::consts::FRAC_PI_2;

use uom::si::angle::radian;

use crate::Strain;
use crate::units::Angle;

/// Principal strains ε₁ ≥ ε₂, the angle φ from the x axis (the rosette's gauge 0 or a) to the
/// direction of ε₁, and the maximum in-plane shear strain γ_max = ε₁ − ε₂.
///
/// Quadrant rule: φ = ½·atan2(γ_xy, ε_x − ε_y), counter-clockwise positive (in the direction in
/// which the rosette's gauges are numbered), in (−90°, 90°]. Equivalently, from
/// tan 2φ = γ_xy/(ε_x − ε_y): when ε_x > ε_y, |φ| < 45°; when ε_x < ε_y, 45° < |φ| ≤ 90°
/// with the sign of γ_xy; when ε_x = ε_y, φ = ±45° with the sign of γ_xy. This is the
/// assignment Dally & Riley, *Experimental Stress Analysis*, 4th ed., ch. 9, make with their
/// sign tests (from memory). A state with ε_x = ε_y and γ_xy = 0 has every direction principal;
/// φ is then 0.
///
/// ```
/// use gaugebook::{Strain, StrainState};
/// use uom::si::angle::degree;
/// // ε_y > ε_x and no shear: ε₁ lies along y.
/// let p = StrainState::new(Strain::from_microstrain(-100.0), Strain::from_microstrain(300.0), Strain::ZERO).principal();
/// assert!((p.angle().get::<degree>() - 90.0).abs() < 1e-9);
/// assert!((p.max_shear().microstrain() - 400.0).abs() < 1e-9);
/// ```
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct PrincipalStrains {
    max: Strain,
    min: Strain,
    angle: Angle,
}

impl PrincipalStrains {
    /// From ε₁, ε₂ and φ in radians as atan2 gives it halved, (−π/2, π/2]; −π/2 folds to π/2.
    pub(crate) fn from_parts(max: f64, min: f64, angle: f64) -> PrincipalStrains {
        let a = if angle <= -FRAC_PI_2 {
            angle + std::f64::consts::PI
        } else {
            angle
        };
        PrincipalStrains {
            max: Strain::new(max),
            min: Strain::new(min),
            angle: Angle::new::<radian>(a),
        }
    }

    /// The algebraically larger principal strain ε₁.
    ///
    /// ```
    /// use gaugebook::{Strain, StrainState};
    /// let p = StrainState::new(Strain::new(1e-3), Strain::new(-2e-3), Strain::ZERO).principal();
    /// assert_eq!(p.max().value(), 1e-3);
    /// ```
    pub fn max(&self) -> Strain {
        self.max
    }

    /// The algebraically smaller principal strain ε₂.
    ///
    /// ```
    /// use gaugebook::{Strain, StrainState};
    /// let p = StrainState::new(Strain::new(1e-3), Strain::new(-2e-3), Strain::ZERO).principal();
    /// assert_eq!(p.min().value(), -2e-3);
    /// ```
    pub fn min(&self) -> Strain {
        self.min
    }

    /// Angle φ from the x axis to ε₁ (quadrant rule above).
    ///
    /// ```
    /// use gaugebook::{Strain, StrainState};
    /// use uom::si::angle::degree;
    /// let p = StrainState::new(Strain::new(1e-3), Strain::new(-2e-3), Strain::ZERO).principal();
    /// assert_eq!(p.angle().get::<degree>(), 0.0);
    /// ```
    pub fn angle(&self) -> Angle {
        self.angle
    }

    /// Maximum in-plane shear strain γ_max = ε₁ − ε₂ (engineering shear strain).
    ///
    /// ```
    /// use gaugebook::{Strain, StrainState};
    /// let p = StrainState::new(Strain::new(1e-3), Strain::new(-2e-3), Strain::ZERO).principal();
    /// assert!((p.max_shear().value() - 3e-3).abs() < 1e-18);
    /// ```
    pub fn max_shear(&self) -> Strain {
        self.max - self.min
    }
}
