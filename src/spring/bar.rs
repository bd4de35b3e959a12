//! The prismatic bar fixed at x = 0 and loaded at its free end x = L, shared by the cantilever,
//! column, shear web and torque shaft: resultants by statics, stress by [`Section`], the
//! peak-stress search, and [`bar_element!`], which writes the [`SpringElement`] methods those
//! four answer alike, so that each element's file holds only what differs (its kind, sites,
//! stiffness and frequency model).
//!
//! [`SpringElement`]: super::SpringElement

use std::f64::consts::PI;

use uom::si::angle::radian;
use uom::si::length::meter;
use uom::si::mass_density::kilogram_per_cubic_meter;
use uom::si::pressure::pascal;

use super::element::{PeakStress, check_station};
use super::load::Wrench;
use super::section::{Point, Resultants, Section, cantilever_resultants};
use super::surface::{Face, Part, Site, SurfaceStress};
use crate::error::PhysicsError;
use crate::material::Material;
use crate::units::{Angle, Length};

#[derive(Debug, Clone, PartialEq)]
pub(crate) struct Bar {
    pub section: Section,
    pub length: f64,
    pub material: Material,
    pub model: &'static str,
}

impl Bar {
    pub fn stress(&self, site: &Site, load: &Wrench) -> Result<SurfaceStress, PhysicsError> {
        if site.part != Part::Body {
            return Err(PhysicsError::invalid(
                "site part",
                format!("{:?}", site.part),
                format!("the body of a {}", self.model),
            ));
        }
        let x = site.x.get::<meter>();
        check_station(self.model, x, 0.0, self.length)?;
        let p = self.section.point(site.face, site.offset.get::<meter>())?;
        Ok(self
            .section
            .stress(p, &cantilever_resultants(load, self.length - x)))
    }

    pub fn peak(&self, load: &Wrench) -> PeakStress {
        peak_over(&self.section, [0.0, self.length], Part::Body, |x| {
            cantilever_resultants(load, self.length - x)
        })
    }

    /// Young's modulus of the bar's material, Pa.
    pub fn youngs_pa(&self) -> f64 {
        self.material.youngs_modulus().get::<pascal>()
    }

    /// Shear modulus of the bar's material, Pa.
    pub fn shear_pa(&self) -> f64 {
        self.material.shear_modulus().get::<pascal>()
    }

    /// Mass of the bar, kg.
    pub fn mass(&self) -> f64 {
        self.material.density().get::<kilogram_per_cubic_meter>()
            * self.section.area()
            * self.length
    }
}

/// The largest von Mises stress over the section's sample points at the given stations (the
/// bending moment is linear in x and the shear constant, so the ends bound it).
pub(crate) fn peak_over(
    section: &Section,
    stations: [f64; 2],
    part: Part,
    resultants: impl Fn(f64) -> Resultants,
) -> PeakStress {
    let mut best: Option<(f64, SurfaceStress, f64, Point)> = None;
    for x in stations {
        let r = resultants(x);
        for p in section.sample_points() {
            let s = section.stress(p, &r);
            let vm = s.von_mises().get::<uom::si::pressure::pascal>();
            if best.as_ref().is_none_or(|b| vm > b.0) {
                best = Some((vm, s, x, p));
            }
        }
    }
    // sample_points is never empty, so `best` is set.
    let (_, stress, x, p) = best.unwrap_or((
        0.0,
        SurfaceStress::from_pa(0.0, 0.0, 0.0),
        0.0,
        Point {
            y: 0.0,
            z: 0.0,
            phi: 0.0,
        },
    ));
    let (face, offset) = face_of(section, p);
    PeakStress {
        von_mises: stress.von_mises(),
        stress,
        site: Site::new("peak", face, Length::new::<meter>(x))
            .moved(Length::new::<meter>(0.0), Length::new::<meter>(offset))
            .on(part),
    }
}

/// The face and offset a section surface point lies on (the inverse of `Section::point`).
pub(crate) fn face_of(section: &Section, p: Point) -> (Face, f64) {
    if let Section::Circle { .. } = section {
        return (
            Face::Round(Angle::new::<radian>(p.phi.rem_euclid(2.0 * PI))),
            0.0,
        );
    }
    let (s, c) = (p.phi.sin(), p.phi.cos());
    if s > 0.5 {
        (Face::PlusZ, p.y)
    } else if s < -0.5 {
        (Face::MinusZ, -p.y)
    } else if c > 0.0 {
        (Face::PlusY, -p.z)
    } else {
        (Face::MinusY, p.z)
    }
}

pub(crate) fn len(v: f64) -> Length {
    Length::new::<meter>(v)
}

/// Writes the [`SpringElement`](super::SpringElement) methods of an element that is a [`Bar`]
/// (field `bar`) with its standard sites at one station (field `station`, m): `kind`,
/// `material`, `length`, `primary`, `sites`, `surface_stress` and `peak_stress`. Used inside
/// the element's `impl SpringElement` block, which adds the rest.
macro_rules! bar_element {
    (kind: $kind:expr, primary: $primary:expr, sites: [$(($name:expr, $face:expr)),+ $(,)?]) => {
        fn kind(&self) -> &'static str {
            $kind
        }
        fn material(&self) -> &$crate::material::Material {
            &self.bar.material
        }
        fn length(&self) -> $crate::units::Length {
            $crate::units::Length::new::<uom::si::length::meter>(self.bar.length)
        }
        fn primary(&self) -> $crate::spring::LoadComponent {
            $primary
        }
        fn sites(&self) -> Vec<$crate::spring::Site> {
            let x = $crate::units::Length::new::<uom::si::length::meter>(self.station);
            vec![$($crate::spring::Site::new($name, $face, x)),+]
        }
        fn surface_stress(
            &self,
            site: &$crate::spring::Site,
            load: &$crate::spring::Wrench,
        ) -> Result<$crate::spring::SurfaceStress, $crate::error::PhysicsError> {
            self.bar.stress(site, load)
        }
        fn peak_stress(
            &self,
            load: &$crate::spring::Wrench,
        ) -> Result<$crate::spring::PeakStress, $crate::error::PhysicsError> {
            Ok(self.bar.peak(load))
        }
    };
}
pub(crate) use bar_element;
