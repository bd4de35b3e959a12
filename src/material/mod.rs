//! Spring materials: elastic constants, thermal expansion, strengths, density and fatigue
//! strength, each with the source it came from.
//!
//! A [`Material`] is validated when it is built (E > 0, −1 < ν < 0.5, 0 < yield ≤ ultimate,
//! density > 0, fatigue strength ≤ ultimate), so an element built on it can divide by any of
//! them. The built-in table ([`materials`], [`material`]) holds typical values for common spring
//! alloys; they are design starting points, and a real design uses the certified values of the
//! heat of metal that is bought. Design estimates must be proven by test.

mod table;

pub use table::{material, materials};

use std::fmt;

use uom::si::mass_density::kilogram_per_cubic_meter;
use uom::si::pressure::{gigapascal, megapascal, pascal};
use uom::si::temperature_coefficient::per_kelvin;

use crate::error::{PhysicsError, check_poisson, check_positive};
use crate::units::{MassDensity, Modulus, Stress, TemperatureCoefficient};

/// An isotropic, linear-elastic spring material with the strengths a design is checked against.
///
/// ```
/// use gaugebook::Material;
/// use gaugebook::units::{MassDensity, Pressure, TemperatureCoefficient};
/// use uom::si::{mass_density::kilogram_per_cubic_meter, pressure::{gigapascal, megapascal},
///     temperature_coefficient::ppm_per_kelvin};
/// let m = Material::new(
///     "our bar stock",
///     Pressure::new::<gigapascal>(200.0),
///     0.29,
///     TemperatureCoefficient::new::<ppm_per_kelvin>(11.5),
///     Pressure::new::<megapascal>(900.0),
///     Pressure::new::<megapascal>(1100.0),
///     MassDensity::new::<kilogram_per_cubic_meter>(7850.0),
/// )?
/// .with_fatigue_strength(Pressure::new::<megapascal>(450.0))?
/// .with_source("mill certificate of our own heat");
/// assert!((m.shear_modulus().get::<gigapascal>() - 77.519).abs() < 1e-3);
/// # Ok::<(), gaugebook::PhysicsError>(())
/// ```
#[derive(Debug, Clone, PartialEq)]
pub struct Material {
    name: String,
    youngs_modulus: Modulus,
    poisson: f64,
    expansion: TemperatureCoefficient,
    yield_strength: Stress,
    ultimate_strength: Stress,
    density: MassDensity,
    fatigue_strength: Option<Stress>,
    modulus_tc: TemperatureCoefficient,
    source: String,
}

impl Material {
    /// A material from its constants, validated: E > 0, −1 < ν < 0.5, 0 < yield ≤ ultimate,
    /// density > 0, expansion finite. The fatigue strength is unset (see
    /// [`Material::with_fatigue_strength`]).
    ///
    /// ```
    /// use gaugebook::Material;
    /// use gaugebook::units::{MassDensity, Pressure, TemperatureCoefficient};
    /// use uom::si::{mass_density::kilogram_per_cubic_meter, pressure::megapascal,
    ///     temperature_coefficient::ppm_per_kelvin};
    /// let mpa = Pressure::new::<megapascal>;
    /// // Yield above ultimate is refused.
    /// let bad = Material::new("x", mpa(2.0e5), 0.3, TemperatureCoefficient::new::<ppm_per_kelvin>(12.0),
    ///     mpa(900.0), mpa(800.0), MassDensity::new::<kilogram_per_cubic_meter>(7800.0));
    /// assert!(bad.is_err());
    /// ```
    pub fn new(
        name: impl Into<String>,
        youngs_modulus: Modulus,
        poisson: f64,
        expansion: TemperatureCoefficient,
        yield_strength: Stress,
        ultimate_strength: Stress,
        density: MassDensity,
    ) -> Result<Material, PhysicsError> {
        check_positive("Young's modulus", youngs_modulus.get::<gigapascal>(), "GPa")?;
        check_poisson(poisson)?;
        let a = expansion.get::<per_kelvin>();
        if !a.is_finite() {
            return Err(PhysicsError::invalid(
                "thermal expansion",
                a,
                "a finite value",
            ));
        }
        let sy = check_positive("yield strength", yield_strength.get::<megapascal>(), "MPa")?;
        let su = check_positive(
            "ultimate strength",
            ultimate_strength.get::<megapascal>(),
            "MPa",
        )?;
        if sy > su {
            return Err(PhysicsError::invalid(
                "yield strength",
                format!("{sy} MPa"),
                format!("at most the ultimate strength {su} MPa"),
            ));
        }
        check_positive(
            "density",
            density.get::<kilogram_per_cubic_meter>(),
            "kg/m³",
        )?;
        Ok(Material {
            name: name.into(),
            youngs_modulus,
            poisson,
            expansion,
            yield_strength,
            ultimate_strength,
            density,
            fatigue_strength: None,
            modulus_tc: TemperatureCoefficient::new::<per_kelvin>(0.0),
            source: "user supplied".into(),
        })
    }

    /// Sets the fatigue strength (fully reversed, at the life the source states), validated:
    /// 0 < fatigue strength ≤ ultimate.
    ///
    /// ```
    /// let m = gaugebook::material("7075-T6")?;
    /// use uom::si::pressure::megapascal;
    /// let too_high = m.clone().with_fatigue_strength(gaugebook::units::Pressure::new::<megapascal>(900.0));
    /// assert!(too_high.is_err());
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn with_fatigue_strength(mut self, strength: Stress) -> Result<Material, PhysicsError> {
        let s = check_positive("fatigue strength", strength.get::<megapascal>(), "MPa")?;
        let su = self.ultimate_strength.get::<megapascal>();
        if s > su {
            return Err(PhysicsError::invalid(
                "fatigue strength",
                format!("{s} MPa"),
                format!("at most the ultimate strength {su} MPa"),
            ));
        }
        self.fatigue_strength = Some(strength);
        Ok(self)
    }

    /// Sets the temperature coefficient of Young's modulus, (1/E)·dE/dT (negative for metals).
    /// The built-in table gives the family value of its source where one is recalled (see
    /// [`materials`]); set the alloy's own from a better source before trusting a layout's span
    /// drift with temperature.
    ///
    /// ```
    /// use gaugebook::units::TemperatureCoefficient;
    /// use uom::si::temperature_coefficient::ppm_per_kelvin;
    /// let m = gaugebook::material("4340")?
    ///     .with_modulus_tc(TemperatureCoefficient::new::<ppm_per_kelvin>(-250.0))?;
    /// assert_eq!(m.modulus_tc().get::<ppm_per_kelvin>(), -250.0);
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn with_modulus_tc(mut self, tc: TemperatureCoefficient) -> Result<Material, PhysicsError> {
        let v = tc.get::<per_kelvin>();
        if !(v.is_finite() && v.abs() < 0.01) {
            return Err(PhysicsError::invalid(
                "modulus temperature coefficient",
                format!("{v} 1/K"),
                "a finite value within ±0.01 1/K",
            ));
        }
        self.modulus_tc = tc;
        Ok(self)
    }

    /// The temperature coefficient of Young's modulus, (1/E)·dE/dT (zero unless set or given by
    /// the table).
    ///
    /// ```
    /// use uom::si::temperature_coefficient::ppm_per_kelvin;
    /// // Aluminium alloys: −554 ppm/K (ASME B31.3-2004 Table C-6 family row, from memory).
    /// assert!((gaugebook::material("7075-T6")?.modulus_tc().get::<ppm_per_kelvin>() + 554.0).abs() < 1.0);
    /// assert_eq!(gaugebook::material("ti64")?.modulus_tc().get::<ppm_per_kelvin>(), 0.0);
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn modulus_tc(&self) -> TemperatureCoefficient {
        self.modulus_tc
    }

    /// Records where the values came from (handbook and edition, certificate, test report).
    ///
    /// ```
    /// let m = gaugebook::material("2024-T351")?.with_source("our tensile tests, report 12");
    /// assert_eq!(m.source(), "our tensile tests, report 12");
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn with_source(mut self, source: impl Into<String>) -> Material {
        self.source = source.into();
        self
    }

    /// The material's name.
    ///
    /// ```
    /// assert_eq!(gaugebook::material("ti-6al-4v")?.name(), "Ti-6Al-4V annealed");
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn name(&self) -> &str {
        &self.name
    }

    /// Young's modulus E.
    ///
    /// ```
    /// use uom::si::pressure::gigapascal;
    /// assert!(gaugebook::material("7075-T6")?.youngs_modulus().get::<gigapascal>() > 70.0);
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn youngs_modulus(&self) -> Modulus {
        self.youngs_modulus
    }

    /// Poisson's ratio ν.
    ///
    /// ```
    /// assert_eq!(gaugebook::material("7075-T6")?.poisson(), 0.33);
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn poisson(&self) -> f64 {
        self.poisson
    }

    /// The shear modulus of an isotropic solid, G = E / (2(1 + ν)) (Timoshenko & Gere,
    /// *Mechanics of Materials*, 4th ed., eq. 3-7, from memory).
    ///
    /// ```
    /// use uom::si::pressure::gigapascal;
    /// let m = gaugebook::material("17-4 PH H900")?;
    /// let g = m.shear_modulus().get::<gigapascal>();
    /// assert!((g - m.youngs_modulus().get::<gigapascal>() / (2.0 * (1.0 + m.poisson()))).abs() < 1e-9);
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn shear_modulus(&self) -> Modulus {
        self.youngs_modulus / (2.0 * (1.0 + self.poisson))
    }

    /// The linear thermal expansion coefficient α.
    ///
    /// ```
    /// use uom::si::temperature_coefficient::ppm_per_kelvin;
    /// let a = gaugebook::material("2024-T351")?.expansion().get::<ppm_per_kelvin>();
    /// assert!(a > 20.0 && a < 25.0);
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn expansion(&self) -> TemperatureCoefficient {
        self.expansion
    }

    /// The yield strength (0.2 % offset).
    ///
    /// ```
    /// use uom::si::pressure::megapascal;
    /// assert!(gaugebook::material("17-4 PH H900")?.yield_strength().get::<megapascal>() > 1000.0);
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn yield_strength(&self) -> Stress {
        self.yield_strength
    }

    /// The ultimate tensile strength.
    ///
    /// ```
    /// let m = gaugebook::material("4340")?;
    /// assert!(m.ultimate_strength() >= m.yield_strength());
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn ultimate_strength(&self) -> Stress {
        self.ultimate_strength
    }

    /// The density.
    ///
    /// ```
    /// use uom::si::mass_density::kilogram_per_cubic_meter;
    /// assert!(gaugebook::material("7075-T6")?.density().get::<kilogram_per_cubic_meter>() < 3000.0);
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn density(&self) -> MassDensity {
        self.density
    }

    /// The fully reversed fatigue strength, if known (the life it refers to is in
    /// [`Material::source`]).
    ///
    /// ```
    /// assert!(gaugebook::material("7075-T6")?.fatigue_strength().is_some());
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn fatigue_strength(&self) -> Option<Stress> {
        self.fatigue_strength
    }

    /// Where each value came from.
    ///
    /// ```
    /// assert!(gaugebook::material("7075-T6")?.source().contains("from memory"));
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn source(&self) -> &str {
        &self.source
    }
}

impl fmt::Display for Material {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        write!(
            f,
            "{}: E {} GPa, ν {}, α {} ppm/K, yield {} MPa, ultimate {} MPa, ρ {} kg/m³",
            self.name,
            self.youngs_modulus.get::<gigapascal>(),
            self.poisson,
            self.expansion.get::<per_kelvin>() * 1e6,
            self.yield_strength.get::<megapascal>(),
            self.ultimate_strength.get::<megapascal>(),
            self.density.get::<kilogram_per_cubic_meter>()
        )?;
        if let Some(s) = self.fatigue_strength {
            write!(f, ", fatigue {} MPa", s.get::<pascal>() * 1e-6)?;
        }
        Ok(())
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use uom::si::temperature_coefficient::ppm_per_kelvin;

    fn base(nu: f64, e_gpa: f64, sy: f64, su: f64) -> Result<Material, PhysicsError> {
        Material::new(
            "t",
            Modulus::new::<gigapascal>(e_gpa),
            nu,
            TemperatureCoefficient::new::<ppm_per_kelvin>(12.0),
            Stress::new::<megapascal>(sy),
            Stress::new::<megapascal>(su),
            MassDensity::new::<kilogram_per_cubic_meter>(7800.0),
        )
    }

    #[test]
    fn validation_refuses_impossible_constants() {
        assert!(base(0.3, 200.0, 900.0, 1000.0).is_ok());
        assert!(base(0.5, 200.0, 900.0, 1000.0).is_err());
        assert!(base(-1.0, 200.0, 900.0, 1000.0).is_err());
        assert!(base(0.3, 0.0, 900.0, 1000.0).is_err());
        assert!(base(0.3, f64::NAN, 900.0, 1000.0).is_err());
        assert!(base(0.3, 200.0, 1100.0, 1000.0).is_err());
        assert!(base(0.3, 200.0, -1.0, 1000.0).is_err());
    }

    #[test]
    fn display_names_the_values() {
        let m = base(0.3, 200.0, 900.0, 1000.0).unwrap();
        assert!(m.to_string().contains("E 200 GPa"));
    }
}
