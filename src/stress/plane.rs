//! Plane stress from measured strains (Hooke's law), its transformation and principal
//! stresses.
//!
//! Hooke's law for plane stress (σ_z = 0; Timoshenko & Goodier, *Theory of Elasticity*, 3rd
//! ed., 1970, ch. 1; Dally & Riley, *Experimental Stress Analysis*, 4th ed., ch. 2; both from
//! memory): σ_x = E/(1 − ν²)·(ε_x + νε_y), σ_y = E/(1 − ν²)·(ε_y + νε_x), τ_xy = G·γ_xy.

use std::f64::consts::FRAC_PI_2;

use uom::si::angle::radian;
use uom::si::pressure::pascal;

use super::Elastic;
use crate::units::{Angle, Stress};
use crate::{Strain, StrainState};

/// A plane-stress state σ_x, σ_y, τ_xy (σ_z = τ_xz = τ_yz = 0).
///
/// ```
/// use gaugebook::{Elastic, PlaneStress, Strain, StrainState};
/// use gaugebook::units::Modulus;
/// use uom::si::pressure::{gigapascal, megapascal};
/// let steel = Elastic::new(Modulus::new::<gigapascal>(200.0), 0.3)?;
/// // Uniaxial stress: ε_y = −ν·ε_x.
/// let s = PlaneStress::from_strain(&StrainState::new(Strain::new(1e-3), Strain::new(-3e-4), Strain::ZERO), &steel);
/// assert!((s.sx().get::<megapascal>() - 200.0).abs() < 1e-9);
/// assert!(s.sy().get::<megapascal>().abs() < 1e-9);
/// # Ok::<(), gaugebook::PhysicsError>(())
/// ```
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct PlaneStress {
    sx: Stress,
    sy: Stress,
    txy: Stress,
}

/// Principal stresses σ₁ ≥ σ₂ in the plane, the angle from x to σ₁ (same quadrant rule as
/// [`PrincipalStrains`](crate::PrincipalStrains): ½·atan2(2τ_xy, σ_x − σ_y) in (−90°, 90°]) and
/// the maximum in-plane shear stress (σ₁ − σ₂)/2.
///
/// ```
/// use gaugebook::PlaneStress;
/// use gaugebook::units::Stress;
/// use uom::si::pressure::megapascal;
/// let p = PlaneStress::new(Stress::new::<megapascal>(0.0), Stress::new::<megapascal>(0.0), Stress::new::<megapascal>(50.0)).principal();
/// assert!((p.max().get::<megapascal>() - 50.0).abs() < 1e-9);
/// assert!((p.max_shear().get::<megapascal>() - 50.0).abs() < 1e-9);
/// ```
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct PrincipalStresses {
    max: Stress,
    min: Stress,
    angle: Angle,
}

impl PrincipalStresses {
    /// σ₁, the algebraically larger principal stress.
    ///
    /// ```
    /// use gaugebook::PlaneStress;
    /// use gaugebook::units::Stress;
    /// use uom::si::pressure::megapascal;
    /// let p = PlaneStress::new(Stress::new::<megapascal>(10.0), Stress::new::<megapascal>(-5.0), Stress::new::<megapascal>(0.0)).principal();
    /// assert_eq!(p.max().get::<megapascal>(), 10.0);
    /// ```
    pub fn max(&self) -> Stress {
        self.max
    }

    /// σ₂, the algebraically smaller principal stress.
    ///
    /// ```
    /// use gaugebook::PlaneStress;
    /// use gaugebook::units::Stress;
    /// use uom::si::pressure::megapascal;
    /// let p = PlaneStress::new(Stress::new::<megapascal>(10.0), Stress::new::<megapascal>(-5.0), Stress::new::<megapascal>(0.0)).principal();
    /// assert_eq!(p.min().get::<megapascal>(), -5.0);
    /// ```
    pub fn min(&self) -> Stress {
        self.min
    }

    /// Angle from the x axis to σ₁.
    ///
    /// ```
    /// use gaugebook::PlaneStress;
    /// use gaugebook::units::Stress;
    /// use uom::si::{pressure::megapascal, angle::degree};
    /// let p = PlaneStress::new(Stress::new::<megapascal>(-10.0), Stress::new::<megapascal>(5.0), Stress::new::<megapascal>(0.0)).principal();
    /// assert!((p.angle().get::<degree>() - 90.0).abs() < 1e-9);
    /// ```
    pub fn angle(&self) -> Angle {
        self.angle
    }

    /// Maximum in-plane shear stress (σ₁ − σ₂)/2.
    ///
    /// ```
    /// use gaugebook::PlaneStress;
    /// use gaugebook::units::Stress;
    /// use uom::si::pressure::megapascal;
    /// let p = PlaneStress::new(Stress::new::<megapascal>(10.0), Stress::new::<megapascal>(-6.0), Stress::new::<megapascal>(0.0)).principal();
    /// assert!((p.max_shear().get::<megapascal>() - 8.0).abs() < 1e-12);
    /// ```
    pub fn max_shear(&self) -> Stress {
        (self.max - self.min) * 0.5
    }
}

impl PlaneStress {
    /// A plane-stress state from its components.
    ///
    /// ```
    /// use gaugebook::PlaneStress;
    /// use gaugebook::units::Stress;
    /// use uom::si::pressure::megapascal;
    /// let s = PlaneStress::new(Stress::new::<megapascal>(1.0), Stress::new::<megapascal>(2.0), Stress::new::<megapascal>(3.0));
    /// assert_eq!(s.txy().get::<megapascal>(), 3.0);
    /// ```
    pub fn new(sx: Stress, sy: Stress, txy: Stress) -> PlaneStress {
        PlaneStress { sx, sy, txy }
    }

    /// Hooke's law for plane stress (module documentation) from a measured strain state.
    ///
    /// ```
    /// use gaugebook::{Elastic, PlaneStress, Strain, StrainState};
    /// use gaugebook::units::Modulus;
    /// use uom::si::pressure::{gigapascal, megapascal};
    /// let al = Elastic::new(Modulus::new::<gigapascal>(70.0), 0.33)?;
    /// let s = PlaneStress::from_strain(&StrainState::new(Strain::ZERO, Strain::ZERO, Strain::new(1e-3)), &al);
    /// assert!((s.txy().get::<megapascal>() - 70.0e3 / 2.66 * 1e-3).abs() < 1e-9);
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn from_strain(strain: &StrainState, material: &Elastic) -> PlaneStress {
        let e = material.modulus().get::<pascal>();
        let nu = material.poisson();
        let (ex, ey, g) = (
            strain.ex().value(),
            strain.ey().value(),
            strain.gxy().value(),
        );
        // ν ∈ (−1, 0.5) is checked by Elastic, so 1 − ν² > 0.
        let k = e / (1.0 - nu * nu);
        PlaneStress {
            sx: Stress::new::<pascal>(k * (ex + nu * ey)),
            sy: Stress::new::<pascal>(k * (ey + nu * ex)),
            txy: Stress::new::<pascal>(material.shear_modulus().get::<pascal>() * g),
        }
    }

    /// The strain state this stress produces (Hooke's law inverted): ε_x = (σ_x − νσ_y)/E,
    /// ε_y = (σ_y − νσ_x)/E, γ_xy = τ_xy/G.
    ///
    /// ```
    /// use gaugebook::{Elastic, PlaneStress};
    /// use gaugebook::units::{Modulus, Stress};
    /// use uom::si::pressure::{gigapascal, megapascal};
    /// let steel = Elastic::new(Modulus::new::<gigapascal>(200.0), 0.3)?;
    /// let s = PlaneStress::new(Stress::new::<megapascal>(200.0), Stress::new::<megapascal>(0.0), Stress::new::<megapascal>(0.0));
    /// assert!((s.to_strain(&steel).ey().microstrain() + 300.0).abs() < 1e-9);
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn to_strain(&self, material: &Elastic) -> StrainState {
        let e = material.modulus().get::<pascal>();
        let nu = material.poisson();
        let (sx, sy, t) = self.pascals();
        StrainState::new(
            Strain::new((sx - nu * sy) / e),
            Strain::new((sy - nu * sx) / e),
            Strain::new(t / material.shear_modulus().get::<pascal>()),
        )
    }

    /// The strain normal to the plane, ε_z = −ν(σ_x + σ_y)/E.
    ///
    /// ```
    /// use gaugebook::{Elastic, PlaneStress};
    /// use gaugebook::units::{Modulus, Stress};
    /// use uom::si::pressure::{gigapascal, megapascal};
    /// let steel = Elastic::new(Modulus::new::<gigapascal>(200.0), 0.3)?;
    /// let s = PlaneStress::new(Stress::new::<megapascal>(100.0), Stress::new::<megapascal>(100.0), Stress::new::<megapascal>(0.0));
    /// assert!((s.out_of_plane_strain(&steel).microstrain() + 300.0).abs() < 1e-9);
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn out_of_plane_strain(&self, material: &Elastic) -> Strain {
        let (sx, sy, _) = self.pascals();
        Strain::new(-material.poisson() * (sx + sy) / material.modulus().get::<pascal>())
    }

    pub(crate) fn pascals(&self) -> (f64, f64, f64) {
        (
            self.sx.get::<pascal>(),
            self.sy.get::<pascal>(),
            self.txy.get::<pascal>(),
        )
    }

    /// σ_x.
    ///
    /// ```
    /// use gaugebook::PlaneStress;
    /// use gaugebook::units::Stress;
    /// use uom::si::pressure::megapascal;
    /// let m = |v| Stress::new::<megapascal>(v);
    /// assert_eq!(PlaneStress::new(m(1.0), m(2.0), m(3.0)).sx(), m(1.0));
    /// ```
    pub fn sx(&self) -> Stress {
        self.sx
    }

    /// σ_y.
    ///
    /// ```
    /// use gaugebook::PlaneStress;
    /// use gaugebook::units::Stress;
    /// use uom::si::pressure::megapascal;
    /// let m = |v| Stress::new::<megapascal>(v);
    /// assert_eq!(PlaneStress::new(m(1.0), m(2.0), m(3.0)).sy(), m(2.0));
    /// ```
    pub fn sy(&self) -> Stress {
        self.sy
    }

    /// τ_xy.
    ///
    /// ```
    /// use gaugebook::PlaneStress;
    /// use gaugebook::units::Stress;
    /// use uom::si::pressure::megapascal;
    /// let m = |v| Stress::new::<megapascal>(v);
    /// assert_eq!(PlaneStress::new(m(1.0), m(2.0), m(3.0)).txy(), m(3.0));
    /// ```
    pub fn txy(&self) -> Stress {
        self.txy
    }

    /// Normal stress on the plane whose normal is at θ from x:
    /// (σ_x + σ_y)/2 + (σ_x − σ_y)/2·cos 2θ + τ_xy·sin 2θ.
    ///
    /// ```
    /// use gaugebook::PlaneStress;
    /// use gaugebook::units::{Angle, Stress};
    /// use uom::si::{pressure::megapascal, angle::degree};
    /// let m = |v| Stress::new::<megapascal>(v);
    /// let s = PlaneStress::new(m(0.0), m(0.0), m(40.0));
    /// assert!((s.normal_at(Angle::new::<degree>(45.0)).get::<megapascal>() - 40.0).abs() < 1e-9);
    /// ```
    pub fn normal_at(&self, theta: Angle) -> Stress {
        let (sx, sy, t) = self.pascals();
        let a = 2.0 * theta.get::<radian>();
        Stress::new::<pascal>(0.5 * (sx + sy) + 0.5 * (sx - sy) * a.cos() + t * a.sin())
    }

    /// Principal stresses (Mohr's circle: centre (σ_x + σ_y)/2, radius √(((σ_x − σ_y)/2)² + τ²)).
    ///
    /// ```
    /// use gaugebook::PlaneStress;
    /// use gaugebook::units::Stress;
    /// use uom::si::pressure::megapascal;
    /// let m = |v| Stress::new::<megapascal>(v);
    /// let p = PlaneStress::new(m(80.0), m(20.0), m(40.0)).principal();
    /// assert!((p.max().get::<megapascal>() - 100.0).abs() < 1e-9);
    /// assert!((p.min().get::<megapascal>() - 0.0).abs() < 1e-9);
    /// ```
    pub fn principal(&self) -> PrincipalStresses {
        let (sx, sy, t) = self.pascals();
        let centre = 0.5 * (sx + sy);
        let radius = (0.5 * (sx - sy)).hypot(t);
        let mut angle = 0.5 * (2.0 * t).atan2(sx - sy);
        if angle <= -FRAC_PI_2 {
            angle += std::f64::consts::PI;
        }
        PrincipalStresses {
            max: Stress::new::<pascal>(centre + radius),
            min: Stress::new::<pascal>(centre - radius),
            angle: Angle::new::<radian>(angle),
        }
    }
}
