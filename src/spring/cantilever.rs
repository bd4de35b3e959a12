//! The cantilever bending beam: a rectangular bar fixed at one end, loaded at the other.
//!
//! Frame: X along the beam from the fixed end (x = 0) to the load point, the centre of the free
//! end (x = L); Z along the depth h (the bending direction the beam is made for), Y along the
//! width b. The primary load is Fz; an upward Fz puts the top (+Z) face in compression, with
//! surface strain εxx = −6·Fz·(L − x)/(E·b·h²) (Timoshenko & Gere, *Mechanics of Materials*,
//! 4th ed., §5.5, from memory).
//!
//! Model and range of validity: Euler–Bernoulli bending, Jourawski transverse shear,
//! Saint-Venant torsion of the rectangle (see the section models), all nominal stresses with no
//! concentration at the clamp. Slender beam: L/h ≥ 5 (common practice; below it shear
//! deformation and the clamp's local field change the strain by more than a few per cent). The
//! gauge station must lie within the beam. Deflection adds Timoshenko's shear term F·L/(κGA)
//! with κ = 5/6 (Timoshenko & Gere 4th ed. §9.11, from memory) to F·L³/(3EI). The frequency is
//! the tip-mass spring plus 33/140 of the beam's mass (Rayleigh's method with the static
//! deflection shape; Timoshenko, Young & Weaver, *Vibration Problems in Engineering*, 4th ed.,
//! from memory).

use super::bar::{Bar, bar_element, len};
use super::element::{SpringElement, Stiffness, check_station};
use super::load::LoadComponent;
use super::section::{Section, positive_length, si};
use super::surface::Face;
use crate::error::PhysicsError;
use crate::material::Material;
use crate::units::Length;

/// Timoshenko's shear coefficient for a rectangle (Timoshenko & Gere 4th ed. §9.11, from
/// memory; the ν-dependent refinement is ignored).
const KAPPA_RECT: f64 = 5.0 / 6.0;

/// Smallest length-to-depth ratio the slender-beam model is used at (common practice).
pub(crate) const SLENDER_MIN: f64 = 5.0;

/// A cantilever bending beam of rectangular section (see the module documentation for the
/// frame, model and range of validity). Design estimates must be proven by test.
///
/// ```
/// use gaugebook::{Cantilever, LoadComponent, SpringElement, Wrench, material};
/// use gaugebook::units::Length;
/// use uom::si::length::millimeter;
/// let mm = Length::new::<millimeter>;
/// let beam = Cantilever::new(material("2024-T351")?, mm(120.0), mm(25.0), mm(8.0), mm(40.0))?;
/// let e = beam.surface_strain(&beam.site("bottom")?, &Wrench::only(LoadComponent::Fz, 50.0))?;
/// // 6·F·(L − x)/(E·b·h²) = 6·50·0.08/(73.1e9·0.025·0.008²) = 205.2 µε
/// assert!((e.exx.microstrain() - 205.2).abs() < 0.1);
/// # Ok::<(), gaugebook::PhysicsError>(())
/// ```
#[derive(Debug, Clone, PartialEq)]
pub struct Cantilever {
    bar: Bar,
    station: f64,
}

impl Cantilever {
    /// A beam of `length` (fixed end to load point), `width` (Y), `depth` (Z, bending), with the
    /// standard gauge sites at `station` from the fixed end. Errors: non-positive dimensions,
    /// L/h below 5, a station outside the beam.
    ///
    /// ```
    /// # use gaugebook::{Cantilever, material};
    /// # use gaugebook::units::Length;
    /// # use uom::si::length::millimeter;
    /// # let mm = Length::new::<millimeter>;
    /// assert!(Cantilever::new(material("4340")?, mm(30.0), mm(10.0), mm(8.0), mm(10.0)).is_err());
    /// assert!(Cantilever::new(material("4340")?, mm(80.0), mm(10.0), mm(8.0), mm(10.0)).is_ok());
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn new(
        material: Material,
        length: Length,
        width: Length,
        depth: Length,
        station: Length,
    ) -> Result<Cantilever, PhysicsError> {
        let model = "cantilever bending beam";
        let l = positive_length("beam length", length)?;
        let b = positive_length("beam width", width)?;
        let h = positive_length("beam depth", depth)?;
        if l / h < SLENDER_MIN {
            return Err(PhysicsError::out_of_range(
                model,
                format!(
                    "slender beam needs L/h ≥ {SLENDER_MIN}, found L/h = {:.3}",
                    l / h
                ),
            ));
        }
        let x = si(station);
        check_station(model, x, 0.0, l)?;
        Ok(Cantilever {
            bar: Bar {
                section: Section::Rectangle { b, h },
                length: l,
                material,
                model,
            },
            station: x,
        })
    }

    /// The width b (along Y).
    ///
    /// ```
    /// # use gaugebook::{Cantilever, material};
    /// # use gaugebook::units::Length;
    /// # use uom::si::length::millimeter;
    /// # let mm = Length::new::<millimeter>;
    /// let b = Cantilever::new(material("4340")?, mm(80.0), mm(10.0), mm(8.0), mm(10.0))?;
    /// assert!((b.width().get::<millimeter>() - 10.0).abs() < 1e-12);
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn width(&self) -> Length {
        match self.bar.section {
            Section::Rectangle { b, .. } => len(b),
            _ => len(f64::NAN),
        }
    }

    /// The depth h (along Z).
    ///
    /// ```
    /// # use gaugebook::{Cantilever, material};
    /// # use gaugebook::units::Length;
    /// # use uom::si::length::millimeter;
    /// # let mm = Length::new::<millimeter>;
    /// let b = Cantilever::new(material("4340")?, mm(80.0), mm(10.0), mm(8.0), mm(10.0))?;
    /// assert!((b.depth().get::<millimeter>() - 8.0).abs() < 1e-12);
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn depth(&self) -> Length {
        match self.bar.section {
            Section::Rectangle { h, .. } => len(h),
            _ => len(f64::NAN),
        }
    }

    /// The standard gauge station, from the fixed end.
    ///
    /// ```
    /// # use gaugebook::{Cantilever, material};
    /// # use gaugebook::units::Length;
    /// # use uom::si::length::millimeter;
    /// # let mm = Length::new::<millimeter>;
    /// let b = Cantilever::new(material("4340")?, mm(80.0), mm(10.0), mm(8.0), mm(10.0))?;
    /// assert!((b.station().get::<millimeter>() - 10.0).abs() < 1e-12);
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn station(&self) -> Length {
        len(self.station)
    }
}

impl SpringElement for Cantilever {
    bar_element! {
        kind: "cantilever bending beam",
        primary: LoadComponent::Fz,
        sites: [
            ("top", Face::PlusZ),
            ("bottom", Face::MinusZ),
            ("side +y", Face::PlusY),
            ("side -y", Face::MinusY),
        ]
    }
    fn stiffness(&self) -> Stiffness {
        let (e, g) = (self.bar.youngs_pa(), self.bar.shear_pa());
        let l = self.bar.length;
        let s = &self.bar.section;
        let compliance = l.powi(3) / (3.0 * e * s.iyy()) + l / (KAPPA_RECT * g * s.area());
        Stiffness::Translational(1.0 / compliance)
    }
    fn rayleigh_share(&self) -> (f64, f64) {
        (33.0 / 140.0, self.bar.mass())
    }
    fn frequency_model(&self) -> &'static str {
        "attached mass at the tip on the beam's stiffness (bending plus shear), plus 33/140 of \
         the beam's mass (Rayleigh, static deflection shape)"
    }
}
