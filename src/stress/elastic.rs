//! An isotropic linear-elastic material: Young's modulus and Poisson's ratio.

use uom::si::pressure::pascal;

use crate::units::Modulus;
use crate::{PhysicsError, check_poisson, check_positive};

/// Isotropic elastic constants E and ν (−1 < ν < 0.5), with G = E/(2(1 + ν)).
///
/// ```
/// use gaugebook::Elastic;
/// use gaugebook::units::Modulus;
/// use uom::si::pressure::gigapascal;
/// let steel = Elastic::new(Modulus::new::<gigapascal>(200.0), 0.3)?;
/// assert!((steel.shear_modulus().get::<gigapascal>() - 200.0 / 2.6).abs() < 1e-9);
/// # Ok::<(), gaugebook::PhysicsError>(())
/// ```
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct Elastic {
    modulus: Modulus,
    poisson: f64,
}

impl Elastic {
    /// Elastic constants, checked: E finite and above zero, ν in (−1, 0.5).
    ///
    /// ```
    /// use gaugebook::Elastic;
    /// use gaugebook::units::Modulus;
    /// use uom::si::pressure::gigapascal;
    /// assert!(Elastic::new(Modulus::new::<gigapascal>(0.0), 0.3).is_err());
    /// assert!(Elastic::new(Modulus::new::<gigapascal>(70.0), 0.5).is_err());
    /// ```
    pub fn new(modulus: Modulus, poisson: f64) -> Result<Elastic, PhysicsError> {
        check_positive("Young's modulus", modulus.get::<pascal>(), "Pa")?;
        let poisson = check_poisson(poisson)?;
        Ok(Elastic { modulus, poisson })
    }

    /// Young's modulus E.
    ///
    /// ```
    /// use gaugebook::Elastic;
    /// use gaugebook::units::Modulus;
    /// use uom::si::pressure::gigapascal;
    /// assert_eq!(Elastic::new(Modulus::new::<gigapascal>(70.0), 0.33)?.modulus().get::<gigapascal>(), 70.0);
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn modulus(&self) -> Modulus {
        self.modulus
    }

    /// Poisson's ratio ν.
    ///
    /// ```
    /// use gaugebook::Elastic;
    /// use gaugebook::units::Modulus;
    /// use uom::si::pressure::gigapascal;
    /// assert_eq!(Elastic::new(Modulus::new::<gigapascal>(70.0), 0.33)?.poisson(), 0.33);
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn poisson(&self) -> f64 {
        self.poisson
    }

    /// Shear modulus G = E/(2(1 + ν)).
    ///
    /// ```
    /// use gaugebook::Elastic;
    /// use gaugebook::units::Modulus;
    /// use uom::si::pressure::gigapascal;
    /// let g = Elastic::new(Modulus::new::<gigapascal>(260.0), 0.3)?.shear_modulus();
    /// assert!((g.get::<gigapascal>() - 100.0).abs() < 1e-9);
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn shear_modulus(&self) -> Modulus {
        self.modulus / (2.0 * (1.0 + self.poisson))
    }
}
