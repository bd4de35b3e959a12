//! The parallelogram (double-bending) beam: two parallel flexures joined by rigid end blocks,
//! which bend in an S so that the bending strain does not depend on where along the beam the
//! load is applied.
//!
//! Frame: X along the flexures from the fixed block (x = 0) to the free block (x = L, the free
//! end of the flexures); the load point is on the mid-plane between the flexures at x = L; Z
//! across the flexures (the upper flexure's mid-plane at z = +H/2, the lower at −H/2), Y along
//! their width b. The primary load is Fz.
//!
//! Model (statics of the guided pair, Euler–Bernoulli flexures; Young & Budynas, *Roark's
//! Formulas for Stress and Strain*, 7th ed., table 8.1 guided cantilever, from memory): each
//! flexure carries Fz/2 and bends as a guided beam, m(x) = −(Fz/2)(L/2 − x), so the outer-surface
//! strain is ∓3·Fz·(L/2 − x)/(E·b·h²); the moment My − Fz·L/2 at the mid-plane is carried by
//! equal and opposite axial forces (My − Fz·L/2)/H in the flexures; Fx is shared equally; Fy and
//! Mz bend both flexures in their plane as cantilevers (each half); Mx is carried by opposite
//! lateral forces ∓Mx/H bending the flexures in their plane as guided beams (each flexure's own
//! twisting stiffness is neglected; it is (4G/3E)(h·L/(b·H))² of the pair's, small for thin
//! flexures).
//!
//! Range of validity: thin flexures, L/h ≥ 5 (common practice); flexures far enough apart that
//! the end blocks stay rigid and the pair carries moment by axial force, H ≥ 3h (common
//! practice); the gauge station a in [0, L/2). Deflection along Z: Fz·L³/(24·E·I) for the pair
//! plus the shear term Fz·L/(2κGA) with κ = 5/6 (Timoshenko & Gere 4th ed. §9.11, from memory).
//! The frequency is the attached mass on that spring plus 13/35 of the flexures' mass
//! (Rayleigh, static guided-beam shape, from memory); add the free block's mass to the attached
//! mass.

use uom::si::length::meter;
use uom::si::mass_density::kilogram_per_cubic_meter;
use uom::si::pressure::pascal;

use super::bar::{len, peak_over};
use super::element::{PeakStress, SpringElement, Stiffness, check_station};
use super::load::{LoadComponent, Wrench};
use super::section::{Resultants, Section, positive_length, si};
use super::surface::{Face, Part, Site, SurfaceStress};
use crate::error::PhysicsError;
use crate::material::Material;
use crate::units::Length;

/// Timoshenko's shear coefficient for a rectangle (Timoshenko & Gere 4th ed. §9.11, from
/// memory).
const KAPPA_RECT: f64 = 5.0 / 6.0;

/// Smallest spacing of the flexures in flexure thicknesses (common practice).
const SPACING_MIN: f64 = 3.0;

/// A parallelogram (double-bending) beam (see the module documentation for the frame, model and
/// range of validity). Design estimates must be proven by test.
///
/// ```
/// use gaugebook::{LoadComponent, Parallelogram, SpringElement, Wrench, material};
/// use gaugebook::units::{Force, Length};
/// use uom::si::{force::newton, length::millimeter};
/// let mm = Length::new::<millimeter>;
/// let p = Parallelogram::new(material("2024-T351")?, mm(40.0), mm(20.0), mm(2.0), mm(30.0), mm(8.0))?;
/// let load = Wrench::only(LoadComponent::Fz, 100.0);
/// let root = p.surface_strain(&p.site("upper root")?, &load)?.exx;
/// let tip = p.surface_strain(&p.site("upper tip")?, &load)?.exx;
/// // Bending is equal and opposite at the two stations; only the (equal) axial part differs.
/// let axial = (root + tip) * 0.5;
/// assert!(((root - axial) + (tip - axial)).value().abs() < 1e-15);
/// assert!(root.value() < 0.0 && tip.value() > 0.0);
/// // Moving the load 10 mm further out along X changes neither the bending part.
/// let moved = Wrench::force_at([Force::new::<newton>(0.0), Force::new::<newton>(0.0),
///     Force::new::<newton>(100.0)], [mm(10.0), mm(0.0), mm(0.0)]);
/// let root2 = p.surface_strain(&p.site("upper root")?, &moved)?.exx;
/// let tip2 = p.surface_strain(&p.site("upper tip")?, &moved)?.exx;
/// assert!(((root2 - tip2) - (root - tip)).value().abs() < 1e-15);
/// # Ok::<(), gaugebook::PhysicsError>(())
/// ```
#[derive(Debug, Clone, PartialEq)]
pub struct Parallelogram {
    material: Material,
    length: f64,
    width: f64,
    thickness: f64,
    spacing: f64,
    station: f64,
}

impl Parallelogram {
    /// Flexures of `length`, `width` (Y) and `thickness` h (Z), mid-planes `spacing` H apart,
    /// gauge stations `station` a from each end of the flexures.
    ///
    /// ```
    /// use gaugebook::{Parallelogram, material};
    /// use gaugebook::units::Length;
    /// use uom::si::length::millimeter;
    /// let mm = Length::new::<millimeter>;
    /// // Flexures 2 mm thick only 4 mm apart: the pair is not a parallelogram.
    /// assert!(Parallelogram::new(material("2024")?, mm(40.0), mm(20.0), mm(2.0), mm(4.0), mm(8.0)).is_err());
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn new(
        material: Material,
        length: Length,
        width: Length,
        thickness: Length,
        spacing: Length,
        station: Length,
    ) -> Result<Parallelogram, PhysicsError> {
        let model = "parallelogram beam";
        let l = positive_length("flexure length", length)?;
        let b = positive_length("flexure width", width)?;
        let h = positive_length("flexure thickness", thickness)?;
        let spacing_m = positive_length("flexure spacing", spacing)?;
        if l / h < super::cantilever::SLENDER_MIN {
            return Err(PhysicsError::out_of_range(
                model,
                format!(
                    "thin flexures need L/h ≥ {}, found L/h = {:.3}",
                    super::cantilever::SLENDER_MIN,
                    l / h
                ),
            ));
        }
        if spacing_m / h < SPACING_MIN {
            return Err(PhysicsError::out_of_range(
                model,
                format!(
                    "flexure spacing needs H/h ≥ {SPACING_MIN}, found {:.3}",
                    spacing_m / h
                ),
            ));
        }
        let a = si(station);
        check_station(model, a, 0.0, l / 2.0)?;
        if a >= l / 2.0 {
            return Err(PhysicsError::out_of_range(
                model,
                format!(
                    "gauge station must be short of mid-flexure {:.4} mm",
                    l * 500.0
                ),
            ));
        }
        Ok(Parallelogram {
            material,
            length: l,
            width: b,
            thickness: h,
            spacing: spacing_m,
            station: a,
        })
    }

    fn section(&self) -> Section {
        Section::Rectangle {
            b: self.width,
            h: self.thickness,
        }
    }

    /// Resultants in one flexure (`upper`: the +Z one) at station x.
    fn flexure_resultants(&self, load: &Wrench, upper: bool, x: f64) -> Resultants {
        use LoadComponent::*;
        let (l, hh) = (self.length, self.spacing);
        let sign = if upper { 1.0 } else { -1.0 };
        let nc = (load.get(My) - load.get(Fz) * l / 2.0) / hh;
        let lateral = -sign * load.get(Mx) / hh;
        Resultants {
            n: load.get(Fx) / 2.0 + sign * nc,
            vy: load.get(Fy) / 2.0 + lateral,
            vz: load.get(Fz) / 2.0,
            t: 0.0,
            my: -(load.get(Fz) / 2.0) * (l / 2.0 - x),
            mz: (load.get(Mz) + (l - x) * load.get(Fy)) / 2.0 + lateral * (l / 2.0 - x),
        }
    }

    /// The bending strain of one flexure's outer surface per newton of Fz at the gauge station,
    /// 3·(L/2 − a)/(E·b·h²).
    ///
    /// ```
    /// use gaugebook::{Parallelogram, material};
    /// use gaugebook::units::Length;
    /// use uom::si::length::millimeter;
    /// let mm = Length::new::<millimeter>;
    /// let p = Parallelogram::new(material("2024-T351")?, mm(40.0), mm(20.0), mm(2.0), mm(30.0), mm(8.0))?;
    /// let expected = 3.0 * 0.012 / (73.1e9 * 0.02 * 0.002f64.powi(2));
    /// assert!((p.bending_strain_per_newton() / expected - 1.0).abs() < 1e-12);
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn bending_strain_per_newton(&self) -> f64 {
        let e = self.material.youngs_modulus().get::<pascal>();
        3.0 * (self.length / 2.0 - self.station) / (e * self.width * self.thickness.powi(2))
    }
}

impl SpringElement for Parallelogram {
    fn kind(&self) -> &'static str {
        "parallelogram (double-bending) beam"
    }
    fn material(&self) -> &Material {
        &self.material
    }
    fn length(&self) -> Length {
        Length::new::<meter>(self.length)
    }
    fn primary(&self) -> LoadComponent {
        LoadComponent::Fz
    }
    fn sites(&self) -> Vec<Site> {
        let (a, b) = (len(self.station), len(self.length - self.station));
        vec![
            Site::new("upper root", Face::PlusZ, a).on(Part::UpperFlexure),
            Site::new("upper tip", Face::PlusZ, b).on(Part::UpperFlexure),
            Site::new("lower root", Face::MinusZ, a).on(Part::LowerFlexure),
            Site::new("lower tip", Face::MinusZ, b).on(Part::LowerFlexure),
        ]
    }
    fn surface_stress(&self, site: &Site, load: &Wrench) -> Result<SurfaceStress, PhysicsError> {
        let upper = match site.part {
            Part::UpperFlexure => true,
            Part::LowerFlexure => false,
            Part::Body => {
                return Err(PhysicsError::invalid(
                    "site part",
                    "Body",
                    "the upper or lower flexure of a parallelogram beam",
                ));
            }
        };
        let x = site.x.get::<meter>();
        check_station("parallelogram beam", x, 0.0, self.length)?;
        let sec = self.section();
        let p = sec.point(site.face, site.offset.get::<meter>())?;
        Ok(sec.stress(p, &self.flexure_resultants(load, upper, x)))
    }
    fn peak_stress(&self, load: &Wrench) -> Result<PeakStress, PhysicsError> {
        let sec = self.section();
        let stations = [0.0, self.length];
        let up = peak_over(&sec, stations, Part::UpperFlexure, |x| {
            self.flexure_resultants(load, true, x)
        });
        let down = peak_over(&sec, stations, Part::LowerFlexure, |x| {
            self.flexure_resultants(load, false, x)
        });
        Ok(if down.von_mises > up.von_mises {
            down
        } else {
            up
        })
    }
    fn stiffness(&self) -> Stiffness {
        let e = self.material.youngs_modulus().get::<pascal>();
        let g = self.material.shear_modulus().get::<pascal>();
        let sec = self.section();
        let l = self.length;
        let compliance =
            l.powi(3) / (24.0 * e * sec.iyy()) + l / (2.0 * KAPPA_RECT * g * sec.area());
        Stiffness::Translational(1.0 / compliance)
    }
    fn rayleigh_share(&self) -> (f64, f64) {
        let rho = self.material.density().get::<kilogram_per_cubic_meter>();
        (
            13.0 / 35.0,
            2.0 * rho * self.width * self.thickness * self.length,
        )
    }
    fn frequency_model(&self) -> &'static str {
        "attached mass (include the free block) on the pair's guided stiffness, plus 13/35 of \
         the flexures' mass (Rayleigh, static guided-beam shape)"
    }
}
