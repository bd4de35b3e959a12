//! Gauge sites on an element's surface and the plane strain and stress state found there.
//!
//! Every site has a surface frame: x along the element's axis (global X), y in the surface so
//! that x, y and the outward normal are right-handed. Gauge angles are measured from x towards
//! y, counter-clockwise when the surface is viewed from outside. On a face whose outward normal
//! points at angle φ in the Y–Z plane (φ = 0 along +Y, 90° along +Z), the surface y axis is
//! (0, sin φ, −cos φ): +Y on the +Z face, −Z on the +Y face.

use std::fmt;
use std::ops::{Add, Mul};

use uom::si::angle::radian;
use uom::si::length::meter;
use uom::si::pressure::pascal;

use crate::material::Material;
use crate::units::{Angle, Length, Strain, Stress};

/// The surface strain tensor at a point: normal strains along the surface x and y axes and the
/// engineering shear strain γxy (twice the tensor component).
///
/// ```
/// use gaugebook::{Strain, SurfaceStrain};
/// use gaugebook::units::Angle;
/// use uom::si::angle::degree;
/// // Pure shear γ = 1000 µε: the +45° direction stretches by γ/2.
/// let s = SurfaceStrain::new(Strain::ZERO, Strain::ZERO, Strain::from_microstrain(1000.0));
/// assert!((s.normal(Angle::new::<degree>(45.0)).microstrain() - 500.0).abs() < 1e-9);
/// ```
#[derive(Debug, Clone, Copy, PartialEq, Default)]
pub struct SurfaceStrain {
    /// Normal strain along the surface x axis (the element's axis).
    pub exx: Strain,
    /// Normal strain along the surface y axis.
    pub eyy: Strain,
    /// Engineering shear strain γxy.
    pub gxy: Strain,
}

impl SurfaceStrain {
    /// A strain tensor from its components.
    ///
    /// ```
    /// use gaugebook::{Strain, SurfaceStrain};
    /// let s = SurfaceStrain::new(Strain::new(1e-3), Strain::ZERO, Strain::ZERO);
    /// assert_eq!(s.exx.value(), 1e-3);
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn new(exx: Strain, eyy: Strain, gxy: Strain) -> SurfaceStrain {
        SurfaceStrain { exx, eyy, gxy }
    }

    /// The normal strain along a direction at `angle` from the surface x axis (strain
    /// transformation: ε(θ) = (εxx+εyy)/2 + (εxx−εyy)/2·cos 2θ + γxy/2·sin 2θ; Timoshenko &
    /// Gere, *Mechanics of Materials*, 4th ed., §7.7, from memory).
    ///
    /// ```
    /// use gaugebook::{Strain, SurfaceStrain};
    /// use gaugebook::units::Angle;
    /// use uom::si::angle::degree;
    /// let s = SurfaceStrain::new(Strain::from_microstrain(1000.0), Strain::from_microstrain(-300.0), Strain::ZERO);
    /// assert!((s.normal(Angle::new::<degree>(90.0)).microstrain() + 300.0).abs() < 1e-9);
    /// ```
    pub fn normal(&self, angle: Angle) -> Strain {
        let t = 2.0 * angle.get::<radian>();
        let (a, b, g) = (self.exx.value(), self.eyy.value(), self.gxy.value());
        Strain::new(0.5 * (a + b) + 0.5 * (a - b) * t.cos() + 0.5 * g * t.sin())
    }

    /// The rate of change of [`SurfaceStrain::normal`] with the angle, per radian:
    /// dε/dθ = −(εxx − εyy)·sin 2θ + γxy·cos 2θ.
    ///
    /// ```
    /// use gaugebook::{Strain, SurfaceStrain};
    /// use gaugebook::units::Angle;
    /// let s = SurfaceStrain::new(Strain::ZERO, Strain::ZERO, Strain::from_microstrain(200.0));
    /// assert!((s.normal_rate(Angle::default()).microstrain() - 200.0).abs() < 1e-9);
    /// ```
    pub fn normal_rate(&self, angle: Angle) -> Strain {
        let t = 2.0 * angle.get::<radian>();
        let (a, b, g) = (self.exx.value(), self.eyy.value(), self.gxy.value());
        Strain::new(-(a - b) * t.sin() + g * t.cos())
    }
}

impl Add for SurfaceStrain {
    type Output = SurfaceStrain;
    fn add(self, o: SurfaceStrain) -> SurfaceStrain {
        SurfaceStrain::new(self.exx + o.exx, self.eyy + o.eyy, self.gxy + o.gxy)
    }
}

impl Mul<f64> for SurfaceStrain {
    type Output = SurfaceStrain;
    fn mul(self, k: f64) -> SurfaceStrain {
        SurfaceStrain::new(self.exx * k, self.eyy * k, self.gxy * k)
    }
}

impl fmt::Display for SurfaceStrain {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        write!(f, "εxx {}, εyy {}, γxy {}", self.exx, self.eyy, self.gxy)
    }
}

/// The plane stress state at a surface point, in the surface frame.
///
/// ```
/// use gaugebook::SurfaceStress;
/// use gaugebook::units::Stress;
/// use uom::si::pressure::megapascal;
/// let s = SurfaceStress::new(Stress::new::<megapascal>(100.0), Stress::new::<megapascal>(0.0),
///     Stress::new::<megapascal>(0.0));
/// assert!((s.von_mises().get::<megapascal>() - 100.0).abs() < 1e-9);
/// ```
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct SurfaceStress {
    /// Normal stress along the surface x axis.
    pub sxx: Stress,
    /// Normal stress along the surface y axis.
    pub syy: Stress,
    /// Shear stress τxy.
    pub txy: Stress,
}

impl SurfaceStress {
    /// A stress state from its components.
    ///
    /// ```
    /// use gaugebook::SurfaceStress;
    /// use gaugebook::units::Stress;
    /// use uom::si::pressure::megapascal;
    /// let s = SurfaceStress::new(Stress::new::<megapascal>(10.0), Stress::new::<megapascal>(0.0), Stress::new::<megapascal>(0.0));
    /// assert_eq!(s.sxx.get::<megapascal>(), 10.0);
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn new(sxx: Stress, syy: Stress, txy: Stress) -> SurfaceStress {
        SurfaceStress { sxx, syy, txy }
    }

    pub(crate) fn from_pa(sxx: f64, syy: f64, txy: f64) -> SurfaceStress {
        SurfaceStress::new(
            Stress::new::<pascal>(sxx),
            Stress::new::<pascal>(syy),
            Stress::new::<pascal>(txy),
        )
    }

    /// The von Mises equivalent stress of a plane stress state,
    /// √(σx² − σxσy + σy² + 3τ²) (Budynas & Nisbett, *Shigley's Mechanical Engineering Design*,
    /// 9th ed., eq. 5-15, from memory).
    ///
    /// ```
    /// use gaugebook::SurfaceStress;
    /// use gaugebook::units::Stress;
    /// use uom::si::pressure::megapascal;
    /// let mpa = Stress::new::<megapascal>;
    /// let s = SurfaceStress::new(mpa(0.0), mpa(0.0), mpa(100.0));
    /// assert!((s.von_mises().get::<megapascal>() - 100.0 * 3f64.sqrt()).abs() < 1e-9);
    /// ```
    pub fn von_mises(&self) -> Stress {
        let (a, b, t) = (
            self.sxx.get::<pascal>(),
            self.syy.get::<pascal>(),
            self.txy.get::<pascal>(),
        );
        Stress::new::<pascal>((a * a - a * b + b * b + 3.0 * t * t).max(0.0).sqrt())
    }

    /// The strain of an isotropic plane-stress surface under this stress (Hooke's law:
    /// εx = (σx − νσy)/E, εy = (σy − νσx)/E, γ = τ/G; Timoshenko & Gere, 4th ed., §7.5, from
    /// memory).
    ///
    /// ```
    /// use gaugebook::{SurfaceStress, material};
    /// use gaugebook::units::Stress;
    /// use uom::si::pressure::megapascal;
    /// let m = material("7075-T6")?;
    /// let mpa = Stress::new::<megapascal>;
    /// let e = SurfaceStress::new(mpa(71.7), mpa(0.0), mpa(0.0)).to_strain(&m);
    /// assert!((e.exx.microstrain() - 1000.0).abs() < 1e-6);
    /// assert!((e.eyy.microstrain() + 330.0).abs() < 1e-6);
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn to_strain(&self, material: &Material) -> SurfaceStrain {
        let e = material.youngs_modulus().get::<pascal>();
        let g = material.shear_modulus().get::<pascal>();
        let nu = material.poisson();
        let (a, b, t) = (
            self.sxx.get::<pascal>(),
            self.syy.get::<pascal>(),
            self.txy.get::<pascal>(),
        );
        SurfaceStrain::new(
            Strain::new((a - nu * b) / e),
            Strain::new((b - nu * a) / e),
            Strain::new(t / g),
        )
    }
}

/// Which face of a section a site is on.
///
/// For rectangular and I-sections the four faces are named by their outward normals; on an
/// I-section the ±Y faces are the two sides of the web and the ±Z faces the outer surfaces of
/// the flanges. On round sections the face is the direction φ of the outward normal in the
/// Y–Z plane (±Y/±Z mean φ = 0°, 180°, 90°, 270°).
///
/// ```
/// use gaugebook::Face;
/// use uom::si::angle::degree;
/// assert!((Face::PlusZ.normal_angle().get::<degree>() - 90.0).abs() < 1e-12);
/// ```
#[derive(Debug, Clone, Copy, PartialEq)]
pub enum Face {
    /// Outward normal +Z.
    PlusZ,
    /// Outward normal −Z.
    MinusZ,
    /// Outward normal +Y.
    PlusY,
    /// Outward normal −Y.
    MinusY,
    /// A round surface, outward normal at this angle from +Y towards +Z.
    Round(Angle),
}

impl Face {
    /// The direction φ of the outward normal in the Y–Z plane, from +Y towards +Z.
    ///
    /// ```
    /// use uom::si::angle::degree;
    /// assert!((gaugebook::Face::MinusY.normal_angle().get::<degree>() - 180.0).abs() < 1e-12);
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn normal_angle(&self) -> Angle {
        use std::f64::consts::PI;
        match self {
            Face::PlusY => Angle::new::<radian>(0.0),
            Face::PlusZ => Angle::new::<radian>(0.5 * PI),
            Face::MinusY => Angle::new::<radian>(PI),
            Face::MinusZ => Angle::new::<radian>(1.5 * PI),
            Face::Round(a) => *a,
        }
    }
}

impl fmt::Display for Face {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        match self {
            Face::PlusZ => f.write_str("+Z face"),
            Face::MinusZ => f.write_str("−Z face"),
            Face::PlusY => f.write_str("+Y face"),
            Face::MinusY => f.write_str("−Y face"),
            Face::Round(a) => write!(f, "surface at {:.1}°", a.get::<radian>().to_degrees()),
        }
    }
}

/// Which part of an element a site is on (only the parallelogram beam has more than one).
///
/// ```
/// assert_eq!(gaugebook::Part::default(), gaugebook::Part::Body);
/// ```
#[derive(Debug, Clone, Copy, PartialEq, Eq, Default)]
pub enum Part {
    /// The element's single body.
    #[default]
    Body,
    /// The upper flexure of a parallelogram beam (at +Z).
    UpperFlexure,
    /// The lower flexure of a parallelogram beam (at −Z).
    LowerFlexure,
}

/// A place on an element's surface: a part, a face, a position `x` along the element's axis from
/// its fixed end, and an `offset` along the surface y axis from the face's centre line.
///
/// ```
/// use gaugebook::{Face, Site};
/// use gaugebook::units::Length;
/// use uom::si::length::millimeter;
/// let s = Site::new("top", Face::PlusZ, Length::new::<millimeter>(20.0))
///     .moved(Length::new::<millimeter>(0.5), Length::new::<millimeter>(-0.2));
/// assert!((s.x.get::<millimeter>() - 20.5).abs() < 1e-12);
/// assert!((s.offset.get::<millimeter>() + 0.2).abs() < 1e-12);
/// ```
#[derive(Debug, Clone, PartialEq)]
pub struct Site {
    /// The site's name ("top", "web +y").
    pub name: String,
    /// The part of the element.
    pub part: Part,
    /// The face.
    pub face: Face,
    /// Position along the element's axis from its fixed end.
    pub x: Length,
    /// Position along the surface y axis from the face's centre line.
    pub offset: Length,
}

impl Site {
    /// A site on the element's body, on the face's centre line.
    ///
    /// ```
    /// use gaugebook::{Face, Part, Site};
    /// let s = Site::new("top", Face::PlusZ, Default::default());
    /// assert_eq!(s.part, Part::Body);
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn new(name: impl Into<String>, face: Face, x: Length) -> Site {
        Site {
            name: name.into(),
            part: Part::Body,
            face,
            x,
            offset: Length::new::<meter>(0.0),
        }
    }

    /// The same site on another part.
    ///
    /// ```
    /// use gaugebook::{Face, Part, Site};
    /// let s = Site::new("root", Face::PlusZ, Default::default()).on(Part::UpperFlexure);
    /// assert_eq!(s.part, Part::UpperFlexure);
    /// ```
    pub fn on(mut self, part: Part) -> Site {
        self.part = part;
        self
    }

    /// The same site moved by `dx` along the axis and `dy` along the surface y axis.
    ///
    /// ```
    /// use gaugebook::{Face, Site};
    /// use gaugebook::units::Length;
    /// use uom::si::length::millimeter;
    /// let s = Site::new("top", Face::PlusZ, Length::new::<millimeter>(5.0)).moved(Length::new::<millimeter>(1.0), Length::default());
    /// assert!((s.x.get::<millimeter>() - 6.0).abs() < 1e-12);
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn moved(&self, dx: Length, dy: Length) -> Site {
        let mut s = self.clone();
        s.x += dx;
        s.offset += dy;
        s
    }
}

impl fmt::Display for Site {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        let part = match self.part {
            Part::Body => "",
            Part::UpperFlexure => "upper flexure, ",
            Part::LowerFlexure => "lower flexure, ",
        };
        write!(
            f,
            "{} ({part}{}, x = {:.3} mm, offset {:.3} mm)",
            self.name,
            self.face,
            self.x.get::<meter>() * 1e3,
            self.offset.get::<meter>() * 1e3
        )
    }
}
