//! The in-plane strain state at a point (ε_x, ε_y, γ_xy) and the normal strain along any
//! direction in the plane.

use uom::si::angle::radian;

use super::PrincipalStrains;
use crate::Strain;
use crate::units::Angle;

/// In-plane strain: normal strains ε_x, ε_y and the engineering shear strain γ_xy (= 2ε_xy).
///
/// Angles are measured from the x axis, positive counter-clockwise (from x towards y).
///
/// ```
/// use gaugebook::{Strain, StrainState};
/// use gaugebook::units::Angle;
/// use uom::si::angle::degree;
/// let s = StrainState::new(Strain::from_microstrain(1000.0), Strain::from_microstrain(-300.0), Strain::ZERO);
/// let e90 = s.normal_at(Angle::new::<degree>(90.0));
/// assert!((e90.microstrain() + 300.0).abs() < 1e-9);
/// ```
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct StrainState {
    ex: Strain,
    ey: Strain,
    gxy: Strain,
}

impl StrainState {
    /// A strain state from ε_x, ε_y and γ_xy.
    ///
    /// ```
    /// use gaugebook::{Strain, StrainState};
    /// let s = StrainState::new(Strain::ZERO, Strain::ZERO, Strain::new(2e-4));
    /// assert_eq!(s.gxy().value(), 2e-4);
    /// ```
    pub fn new(ex: Strain, ey: Strain, gxy: Strain) -> StrainState {
        StrainState { ex, ey, gxy }
    }

    /// ε_x.
    ///
    /// ```
    /// use gaugebook::{Strain, StrainState};
    /// assert_eq!(StrainState::new(Strain::new(1e-3), Strain::ZERO, Strain::ZERO).ex().value(), 1e-3);
    /// ```
    pub fn ex(&self) -> Strain {
        self.ex
    }

    /// ε_y.
    ///
    /// ```
    /// use gaugebook::{Strain, StrainState};
    /// assert_eq!(StrainState::new(Strain::ZERO, Strain::new(1e-3), Strain::ZERO).ey().value(), 1e-3);
    /// ```
    pub fn ey(&self) -> Strain {
        self.ey
    }

    /// γ_xy (engineering shear strain).
    ///
    /// ```
    /// use gaugebook::{Strain, StrainState};
    /// assert_eq!(StrainState::new(Strain::ZERO, Strain::ZERO, Strain::new(1e-3)).gxy().value(), 1e-3);
    /// ```
    pub fn gxy(&self) -> Strain {
        self.gxy
    }

    /// Normal strain along direction θ: (ε_x + ε_y)/2 + (ε_x − ε_y)/2·cos 2θ + γ_xy/2·sin 2θ
    /// (strain transformation; Dally & Riley, *Experimental Stress Analysis*, 4th ed., ch. 2,
    /// from memory).
    ///
    /// ```
    /// use gaugebook::{Strain, StrainState};
    /// use gaugebook::units::Angle;
    /// use uom::si::angle::degree;
    /// // Pure shear: the ±45° directions carry ±γ/2.
    /// let s = StrainState::new(Strain::ZERO, Strain::ZERO, Strain::from_microstrain(400.0));
    /// assert!((s.normal_at(Angle::new::<degree>(45.0)).microstrain() - 200.0).abs() < 1e-9);
    /// ```
    pub fn normal_at(&self, theta: Angle) -> Strain {
        let t = 2.0 * theta.get::<radian>();
        let (ex, ey, g) = (self.ex.value(), self.ey.value(), self.gxy.value());
        Strain::new(0.5 * (ex + ey) + 0.5 * (ex - ey) * t.cos() + 0.5 * g * t.sin())
    }

    /// Principal strains, principal angle and maximum in-plane shear strain (see
    /// [`PrincipalStrains`] for the angle rule).
    ///
    /// ```
    /// use gaugebook::{Strain, StrainState};
    /// use uom::si::angle::degree;
    /// let p = StrainState::new(Strain::ZERO, Strain::ZERO, Strain::from_microstrain(400.0)).principal();
    /// assert!((p.max().microstrain() - 200.0).abs() < 1e-9);
    /// assert!((p.angle().get::<degree>() - 45.0).abs() < 1e-9);
    /// ```
    pub fn principal(&self) -> PrincipalStrains {
        let (ex, ey, g) = (self.ex.value(), self.ey.value(), self.gxy.value());
        let centre = 0.5 * (ex + ey);
        let radius = (0.5 * (ex - ey)).hypot(0.5 * g);
        let angle = 0.5 * g.atan2(ex - ey);
        PrincipalStrains::from_parts(centre + radius, centre - radius, angle)
    }
}
