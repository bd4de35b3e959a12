//! What every spring element answers: surface strain and stress at gauge sites, peak stress,
//! stiffness and deflection, a first natural frequency, and margins.

use std::f64::consts::PI;
use std::fmt;

use uom::si::angle::radian;
use uom::si::frequency::hertz;
use uom::si::length::meter;
use uom::si::mass::kilogram;
use uom::si::moment_of_inertia::kilogram_square_meter;
use uom::si::pressure::pascal;

use super::load::{LoadComponent, Wrench};
use super::margin::{Margins, OverloadFactors};
use super::surface::{Site, SurfaceStrain, SurfaceStress};
use crate::error::PhysicsError;
use crate::material::Material;
use crate::units::{Angle, Force, Frequency, Length, Mass, Stress};
use uom::si::f64::MomentOfInertia;

/// Stiffness along or about an element's primary load component.
///
/// ```
/// use gaugebook::Stiffness;
/// let k = Stiffness::Translational(2.0e6);
/// assert_eq!(k.value(), 2.0e6);
/// assert_eq!(k.to_string(), "2000 N/mm");
/// ```
#[derive(Debug, Clone, Copy, PartialEq)]
pub enum Stiffness {
    /// Force per displacement, N/m.
    Translational(f64),
    /// Moment per rotation, N·m/rad.
    Rotational(f64),
}

impl Stiffness {
    /// The value in SI (N/m or N·m/rad).
    ///
    /// ```
    /// assert_eq!(gaugebook::Stiffness::Rotational(12.0).value(), 12.0);
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn value(&self) -> f64 {
        match *self {
            Stiffness::Translational(k) | Stiffness::Rotational(k) => k,
        }
    }
}

impl fmt::Display for Stiffness {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        match *self {
            Stiffness::Translational(k) => write!(f, "{} N/mm", k * 1e-3),
            Stiffness::Rotational(k) => write!(f, "{} N·m/rad", k),
        }
    }
}

/// Displacement of the load point along, or rotation about, the primary load component.
///
/// ```
/// use gaugebook::Motion;
/// use gaugebook::units::Length;
/// use uom::si::length::millimeter;
/// let m = Motion::Translation(Length::new::<millimeter>(0.2));
/// assert_eq!(m.to_string(), "0.2 mm");
/// ```
#[derive(Debug, Clone, Copy, PartialEq)]
pub enum Motion {
    /// A displacement.
    Translation(Length),
    /// A rotation.
    Rotation(Angle),
}

impl fmt::Display for Motion {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        match self {
            Motion::Translation(l) => write!(f, "{} mm", l.get::<meter>() * 1e3),
            Motion::Rotation(a) => write!(f, "{} mrad", a.get::<radian>() * 1e3),
        }
    }
}

/// What the element carries at its load point when its natural frequency is estimated: a mass
/// (for translation) and a mass moment of inertia (for rotation about the primary axis).
///
/// ```
/// use gaugebook::AttachedMass;
/// use gaugebook::units::Mass;
/// use uom::si::mass::kilogram;
/// let a = AttachedMass::mass(Mass::new::<kilogram>(2.0));
/// assert_eq!(a.mass.get::<kilogram>(), 2.0);
/// ```
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct AttachedMass {
    /// Mass carried at the load point.
    pub mass: Mass,
    /// Mass moment of inertia about the primary axis, carried at the load point.
    pub inertia: MomentOfInertia,
}

impl AttachedMass {
    /// A point mass and no rotary inertia.
    ///
    /// ```
    /// use gaugebook::AttachedMass;
    /// use gaugebook::units::Mass;
    /// use uom::si::{mass::kilogram, moment_of_inertia::kilogram_square_meter};
    /// let a = AttachedMass::mass(Mass::new::<kilogram>(0.5));
    /// assert_eq!(a.inertia.get::<kilogram_square_meter>(), 0.0);
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn mass(mass: Mass) -> AttachedMass {
        AttachedMass {
            mass,
            inertia: MomentOfInertia::new::<kilogram_square_meter>(0.0),
        }
    }

    /// A rotary inertia and no mass.
    ///
    /// ```
    /// use gaugebook::AttachedMass;
    /// use uom::si::{f64::MomentOfInertia, moment_of_inertia::kilogram_square_meter};
    /// let a = AttachedMass::inertia(MomentOfInertia::new::<kilogram_square_meter>(1e-3));
    /// assert_eq!(a.inertia.get::<kilogram_square_meter>(), 1e-3);
    /// ```
    pub fn inertia(inertia: MomentOfInertia) -> AttachedMass {
        AttachedMass {
            mass: Mass::new::<kilogram>(0.0),
            inertia,
        }
    }

    pub(crate) fn checked_mass(&self) -> Result<f64, PhysicsError> {
        let m = self.mass.get::<kilogram>();
        if m.is_finite() && m >= 0.0 {
            Ok(m)
        } else {
            Err(PhysicsError::invalid(
                "attached mass",
                format!("{m} kg"),
                "a finite value ≥ 0",
            ))
        }
    }

    pub(crate) fn checked_inertia(&self) -> Result<f64, PhysicsError> {
        let j = self.inertia.get::<kilogram_square_meter>();
        if j.is_finite() && j >= 0.0 {
            Ok(j)
        } else {
            Err(PhysicsError::invalid(
                "attached inertia",
                format!("{j} kg·m²"),
                "a finite value ≥ 0",
            ))
        }
    }
}

/// The largest von Mises stress found on the element's surface under a load, and where.
///
/// ```
/// use gaugebook::{Cantilever, LoadComponent, SpringElement, Wrench, material};
/// use gaugebook::units::Length;
/// use uom::si::{length::millimeter, pressure::megapascal};
/// let mm = Length::new::<millimeter>;
/// let beam = Cantilever::new(material("2024-T351")?, mm(100.0), mm(20.0), mm(6.0), mm(30.0))?;
/// let p = beam.peak_stress(&Wrench::only(LoadComponent::Fz, 100.0))?;
/// // 6FL/(bh²) at the root: 6·100·0.1/(0.02·0.006²) = 83.3 MPa.
/// assert!((p.von_mises.get::<megapascal>() - 83.333).abs() < 0.01);
/// assert!(p.site.x.get::<millimeter>().abs() < 1e-9);
/// # Ok::<(), gaugebook::PhysicsError>(())
/// ```
#[derive(Debug, Clone, PartialEq)]
pub struct PeakStress {
    /// The von Mises equivalent stress.
    pub von_mises: Stress,
    /// The stress components there.
    pub stress: SurfaceStress,
    /// Where it is.
    pub site: Site,
}

/// A spring element: a closed-form model of a bar, beam or shaft that carries the load and
/// carries the gauges.
///
/// Frame: X along the element's axis from its fixed end (x = 0) to its loaded end (x = L); the
/// load point and the directions of Y and Z are stated by each element. Loads are a [`Wrench`]
/// at the load point. The trait is object-safe, so layouts hold `&dyn SpringElement`.
///
/// Design estimates must be proven by test; overload and lifting uses follow local codes and
/// licensed practice.
///
/// ```
/// use gaugebook::{LoadComponent, SpringElement, TorqueShaft, Wrench, material};
/// use gaugebook::units::Length;
/// use uom::si::length::millimeter;
/// let mm = Length::new::<millimeter>;
/// let shaft = TorqueShaft::solid(material("4340")?, mm(20.0), mm(100.0), mm(50.0))?;
/// let e: &dyn SpringElement = &shaft;
/// assert_eq!(e.primary(), LoadComponent::Mx);
/// let s = e.surface_strain(&e.site("+z")?, &Wrench::only(LoadComponent::Mx, 50.0))?;
/// assert!(s.gxy.value() < 0.0);
/// # Ok::<(), gaugebook::PhysicsError>(())
/// ```
pub trait SpringElement {
    /// What kind of element this is ("cantilever bending beam").
    fn kind(&self) -> &'static str;

    /// The element's material.
    fn material(&self) -> &Material;

    /// The length from the fixed end to the load point.
    fn length(&self) -> Length;

    /// The load component the element is designed to measure.
    fn primary(&self) -> LoadComponent;

    /// The standard gauge sites, by name.
    fn sites(&self) -> Vec<Site>;

    /// A standard site by name.
    fn site(&self, name: &str) -> Result<Site, PhysicsError> {
        let sites = self.sites();
        sites
            .iter()
            .find(|s| s.name == name)
            .cloned()
            .ok_or_else(|| {
                let names: Vec<&str> = sites.iter().map(|s| s.name.as_str()).collect();
                PhysicsError::invalid("site name", name, format!("one of {}", names.join(", ")))
            })
    }

    /// The surface stress at a site under a load (the model's nominal stress, no stress
    /// concentration).
    fn surface_stress(&self, site: &Site, load: &Wrench) -> Result<SurfaceStress, PhysicsError>;

    /// The surface strain tensor at a site under a load (plane-stress Hooke's law on
    /// [`SpringElement::surface_stress`]).
    fn surface_strain(&self, site: &Site, load: &Wrench) -> Result<SurfaceStrain, PhysicsError> {
        Ok(self.surface_stress(site, load)?.to_strain(self.material()))
    }

    /// The largest von Mises stress on the surface and its location.
    fn peak_stress(&self, load: &Wrench) -> Result<PeakStress, PhysicsError>;

    /// The stiffness along or about the primary component.
    fn stiffness(&self) -> Stiffness;

    /// The load point's motion along or about the primary component under the load's primary
    /// component (`load / stiffness`).
    fn deflection(&self, load: &Wrench) -> Motion {
        let p = load.get(self.primary());
        match self.stiffness() {
            Stiffness::Translational(k) => Motion::Translation(Length::new::<meter>(p / k)),
            Stiffness::Rotational(k) => Motion::Rotation(Angle::new::<radian>(p / k)),
        }
    }

    /// The fraction of the element's own mass (or rotary inertia) added to the attached one in
    /// the frequency estimate, and the element's mass (kg) or rotary inertia (kg·m²).
    fn rayleigh_share(&self) -> (f64, f64);

    /// The model behind [`SpringElement::natural_frequency`], in words.
    fn frequency_model(&self) -> &'static str;

    /// A first natural-frequency estimate in the primary direction: f = √(k/m_eff)/(2π), the
    /// element a spring with the attached mass at its load point plus a Rayleigh share of its own
    /// mass (see [`SpringElement::frequency_model`]).
    fn natural_frequency(&self, attached: &AttachedMass) -> Result<Frequency, PhysicsError> {
        let (share, own) = self.rayleigh_share();
        let k = self.stiffness();
        let m = match k {
            Stiffness::Translational(_) => attached.checked_mass()?,
            Stiffness::Rotational(_) => attached.checked_inertia()?,
        } + share * own;
        if m <= 0.0 {
            return Err(PhysicsError::invalid(
                "effective mass",
                m,
                "a value above 0",
            ));
        }
        Ok(Frequency::new::<hertz>((k.value() / m).sqrt() / (2.0 * PI)))
    }

    /// The load at which the element buckles, where the model includes buckling.
    fn buckling_load(&self) -> Option<Force> {
        None
    }

    /// Margins against yield, ultimate strength, fatigue (and buckling where modelled) at the
    /// rated load and at the safe and ultimate overloads. Design estimates must be proven by
    /// test; overload and lifting uses follow local codes and licensed practice.
    fn margins(&self, rated: &Wrench, factors: &OverloadFactors) -> Result<Margins, PhysicsError> {
        Margins::evaluate(self, rated, factors)
    }
}

pub(crate) fn pa(s: Stress) -> f64 {
    s.get::<pascal>()
}

pub(crate) fn check_station(model: &str, x: f64, lo: f64, hi: f64) -> Result<(), PhysicsError> {
    if x.is_finite() && x >= lo - 1e-12 * hi.abs().max(1e-9) && x <= hi + 1e-12 * hi.abs() {
        Ok(())
    } else {
        Err(PhysicsError::out_of_range(
            model,
            format!(
                "site at x = {:.4} mm, outside {:.4}..{:.4} mm",
                x * 1e3,
                lo * 1e3,
                hi * 1e3
            ),
        ))
    }
}

/// A shared element is an element: layouts and scripts can hold one element behind an `Arc`.
///
/// ```
/// use std::sync::Arc;
/// use gaugebook::{Cantilever, SpringElement, material};
/// use gaugebook::units::Length;
/// use uom::si::length::millimeter;
/// let mm = Length::new::<millimeter>;
/// let e: Arc<dyn SpringElement + Send + Sync> =
///     Arc::new(Cantilever::new(material("7075-T6")?, mm(100.0), mm(20.0), mm(5.0), mm(30.0))?);
/// assert_eq!(e.kind(), "cantilever bending beam");
/// # Ok::<(), gaugebook::PhysicsError>(())
/// ```
impl SpringElement for std::sync::Arc<dyn SpringElement + Send + Sync> {
    fn kind(&self) -> &'static str {
        self.as_ref().kind()
    }
    fn material(&self) -> &Material {
        self.as_ref().material()
    }
    fn length(&self) -> Length {
        self.as_ref().length()
    }
    fn primary(&self) -> LoadComponent {
        self.as_ref().primary()
    }
    fn sites(&self) -> Vec<Site> {
        self.as_ref().sites()
    }
    fn surface_stress(&self, site: &Site, load: &Wrench) -> Result<SurfaceStress, PhysicsError> {
        self.as_ref().surface_stress(site, load)
    }
    fn surface_strain(&self, site: &Site, load: &Wrench) -> Result<SurfaceStrain, PhysicsError> {
        self.as_ref().surface_strain(site, load)
    }
    fn peak_stress(&self, load: &Wrench) -> Result<PeakStress, PhysicsError> {
        self.as_ref().peak_stress(load)
    }
    fn stiffness(&self) -> Stiffness {
        self.as_ref().stiffness()
    }
    fn rayleigh_share(&self) -> (f64, f64) {
        self.as_ref().rayleigh_share()
    }
    fn frequency_model(&self) -> &'static str {
        self.as_ref().frequency_model()
    }
    fn buckling_load(&self) -> Option<Force> {
        self.as_ref().buckling_load()
    }
}
