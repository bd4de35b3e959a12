//! The shear web: an I-section beam whose gauges sit on the web at the neutral axis, at ±45°,
//! where bending strain vanishes and the transverse shear is largest.
//!
//! Frame: X along the beam from the fixed end (x = 0) to the load point, the centre of the free
//! end (x = L); Z along the depth h (the load direction), Y across the flanges. The primary load
//! is Fz. At the neutral axis of the web the surface is in pure shear τ = V·Q/(I·t_w), so a
//! gauge at ±45° reads ±γ/2 = ±τ/(2G) whatever the gauge's distance from the load (Timoshenko &
//! Gere, *Mechanics of Materials*, 4th ed., §5.10 shear in webs, from memory). In the surface
//! frame of the +Y web face (surface y along −Z) a positive Fz gives negative shear.
//!
//! Model and range of validity: Euler–Bernoulli bending; thin-wall shear flow q = VQ/I in web
//! and flanges; Saint-Venant torsion of the open section J = Σ b t³/3 with free warping (the
//! warping restraint at the clamp is ignored). Thin walls: flange and web thickness at most h/4
//! (common practice); web no wider than the flanges; gauge station at least one depth h from the
//! fixed end and from the load point (Saint-Venant, common practice). Deflection adds the web's
//! shear term F·L/(G·A_web) to F·L³/(3EI) (Timoshenko & Gere 4th ed. §9.11, from memory). The
//! frequency is the tip-mass spring plus 33/140 of the beam's mass (Rayleigh).

use super::bar::{Bar, bar_element};
use super::element::{SpringElement, Stiffness, check_station};
use super::load::LoadComponent;
use super::section::{Section, positive_length, si};
use super::surface::Face;
use crate::error::PhysicsError;
use crate::material::Material;
use crate::units::Length;

/// Largest wall thickness over depth for the thin-wall model (common practice).
const THIN_MAX: f64 = 0.25;

/// An I-section shear beam (see the module documentation for the frame, model and range of
/// validity). Design estimates must be proven by test.
///
/// ```
/// use gaugebook::{LoadComponent, ShearWeb, SpringElement, Wrench, material};
/// use gaugebook::units::{Angle, Length};
/// use uom::si::{angle::degree, length::millimeter};
/// let mm = Length::new::<millimeter>;
/// let web = ShearWeb::new(material("17-4 PH H1025")?, mm(120.0), mm(40.0), mm(30.0), mm(6.0),
///     mm(3.0), mm(60.0))?;
/// let s = web.surface_strain(&web.site("web +y")?, &Wrench::only(LoadComponent::Fz, 5e3))?;
/// assert!(s.exx.value().abs() < 1e-12); // neutral axis: no bending strain
/// assert!(s.normal(Angle::new::<degree>(-45.0)).value() > 0.0);
/// # Ok::<(), gaugebook::PhysicsError>(())
/// ```
#[derive(Debug, Clone, PartialEq)]
pub struct ShearWeb {
    bar: Bar,
    station: f64,
}

impl ShearWeb {
    /// A beam of `length`, overall `depth` h, `flange_width`, `flange_thickness`,
    /// `web_thickness`, with the standard sites at `station` from the fixed end.
    ///
    /// ```
    /// use gaugebook::{ShearWeb, material};
    /// use gaugebook::units::Length;
    /// use uom::si::length::millimeter;
    /// let mm = Length::new::<millimeter>;
    /// // A 15 mm thick web on a 40 mm deep beam is not thin-walled.
    /// assert!(ShearWeb::new(material("4340")?, mm(150.0), mm(40.0), mm(30.0), mm(5.0), mm(15.0), mm(75.0)).is_err());
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn new(
        material: Material,
        length: Length,
        depth: Length,
        flange_width: Length,
        flange_thickness: Length,
        web_thickness: Length,
        station: Length,
    ) -> Result<ShearWeb, PhysicsError> {
        let model = "shear web";
        let l = positive_length("beam length", length)?;
        let h = positive_length("beam depth", depth)?;
        let bf = positive_length("flange width", flange_width)?;
        let tf = positive_length("flange thickness", flange_thickness)?;
        let tw = positive_length("web thickness", web_thickness)?;
        for (name, t) in [("flange thickness", tf), ("web thickness", tw)] {
            if t / h > THIN_MAX {
                return Err(PhysicsError::out_of_range(
                    "thin-walled I-section",
                    format!("{name}/depth ≤ {THIN_MAX} needed, found {:.3}", t / h),
                ));
            }
        }
        if tw > bf {
            return Err(PhysicsError::invalid(
                "web thickness",
                format!("{} mm", tw * 1e3),
                format!("at most the flange width {} mm", bf * 1e3),
            ));
        }
        let x = si(station);
        check_station(
            "shear web (Saint-Venant: one depth from each end)",
            x,
            h,
            l - h,
        )?;
        let section = Section::IBeam { h, bf, tf, tw };
        Ok(ShearWeb {
            bar: Bar {
                section,
                length: l,
                material,
                model,
            },
            station: x,
        })
    }

    /// The shear stress at the neutral axis per newton of Fz, τ/V = Q/(I·t_w), in Pa/N.
    ///
    /// ```
    /// use gaugebook::{ShearWeb, material};
    /// use gaugebook::units::Length;
    /// use uom::si::length::millimeter;
    /// let mm = Length::new::<millimeter>;
    /// let w = ShearWeb::new(material("7075-T6")?, mm(100.0), mm(30.0), mm(20.0), mm(5.0), mm(2.0), mm(50.0))?;
    /// assert!(w.neutral_axis_shear_per_newton() > 0.0);
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn neutral_axis_shear_per_newton(&self) -> f64 {
        match self.bar.section {
            Section::IBeam { h, bf, tf, tw } => {
                let hw = h / 2.0 - tf;
                let q = bf * tf * (h - tf) / 2.0 + tw * hw * hw / 2.0;
                q / (self.bar.section.iyy() * tw)
            }
            _ => f64::NAN,
        }
    }
}

impl SpringElement for ShearWeb {
    bar_element! {
        kind: "shear web (I-section shear beam)",
        primary: LoadComponent::Fz,
        sites: [
            ("web +y", Face::PlusY),
            ("web -y", Face::MinusY),
            ("top flange", Face::PlusZ),
            ("bottom flange", Face::MinusZ),
        ]
    }
    fn stiffness(&self) -> Stiffness {
        let (e, g) = (self.bar.youngs_pa(), self.bar.shear_pa());
        let l = self.bar.length;
        let a_web = match self.bar.section {
            Section::IBeam { h, tf, tw, .. } => (h - 2.0 * tf) * tw,
            _ => f64::NAN,
        };
        Stiffness::Translational(
            1.0 / (l.powi(3) / (3.0 * e * self.bar.section.iyy()) + l / (g * a_web)),
        )
    }
    fn rayleigh_share(&self) -> (f64, f64) {
        (33.0 / 140.0, self.bar.mass())
    }
    fn frequency_model(&self) -> &'static str {
        "attached mass at the tip on the beam's stiffness (bending plus web shear), plus 33/140 \
         of the beam's mass (Rayleigh, static deflection shape)"
    }
}
