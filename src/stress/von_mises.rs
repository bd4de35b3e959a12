//! The von Mises equivalent stress of a plane-stress state.
//!
//! σ_vM = √(σ_x² − σ_xσ_y + σ_y² + 3τ_xy²) = √(σ₁² − σ₁σ₂ + σ₂²) for σ_z = 0 (the distortion-
//! energy criterion; Timoshenko & Goodier, *Theory of Elasticity*, 3rd ed., and Dally & Riley,
//! 4th ed., both from memory).
//!
//! Equivalent stresses feed margins against yield. Design estimates must be proven by test;
//! overload, lifting and legal-for-trade use follow local codes and licensed practice.

use uom::si::pressure::pascal;

use super::{PlaneStress, PrincipalStresses};
use crate::units::Stress;

impl PlaneStress {
    /// The von Mises equivalent stress (module documentation; a design estimate to be proven
    /// by test).
    ///
    /// ```
    /// use gaugebook::PlaneStress;
    /// use gaugebook::units::Stress;
    /// use uom::si::pressure::megapascal;
    /// let m = |v| Stress::new::<megapascal>(v);
    /// // Pure shear τ: σ_vM = √3·τ.
    /// let vm = PlaneStress::new(m(0.0), m(0.0), m(100.0)).von_mises();
    /// assert!((vm.get::<megapascal>() - 100.0 * 3.0f64.sqrt()).abs() < 1e-9);
    /// ```
    pub fn von_mises(&self) -> Stress {
        let (sx, sy, t) = self.pascals();
        Stress::new::<pascal>((sx * sx - sx * sy + sy * sy + 3.0 * t * t).sqrt())
    }
}

impl PrincipalStresses {
    /// The von Mises equivalent stress from the principal stresses, √(σ₁² − σ₁σ₂ + σ₂²).
    ///
    /// ```
    /// use gaugebook::PlaneStress;
    /// use gaugebook::units::Stress;
    /// use uom::si::pressure::megapascal;
    /// let m = |v| Stress::new::<megapascal>(v);
    /// let s = PlaneStress::new(m(120.0), m(-40.0), m(30.0));
    /// assert!((s.principal().von_mises().get::<megapascal>() - s.von_mises().get::<megapascal>()).abs() < 1e-9);
    /// ```
    pub fn von_mises(&self) -> Stress {
        let (a, b) = (self.max().get::<pascal>(), self.min().get::<pascal>());
        Stress::new::<pascal>((a * a - a * b + b * b).sqrt())
    }
}
