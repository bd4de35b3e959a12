//! Cross-sections of prismatic bars and the surface stress a set of section resultants causes.
//!
//! Internal: elements keep their geometry as uom lengths and hand this module SI numbers.
//! Models (all from memory of the books named):
//! - normal stress σ = N/A + My·z/Iyy − Mz·y/Izz (Euler–Bernoulli bending; Timoshenko & Gere,
//!   *Mechanics of Materials*, 4th ed., §5.5, from memory), with My = ∫zσ dA, Mz = −∫yσ dA;
//! - transverse shear by Jourawski's formula τ = VQ/(Ib) (ibid. §5.8) on rectangles, thin-wall
//!   shear flow q = VQ/I on tubes and I-sections (ibid. §6.8), and the tangential surface shear
//!   τ_NA·cos of the angle from the neutral axis on round sections with τ_NA = 4V/(3A) solid and
//!   (4V/3A)(r₂² + r₂r₁ + r₁²)/(r₂² + r₁²) hollow (ibid. eq. 5-42 and 5-44);
//! - torsion: τ = Tr/J on round sections (ibid. §3.3); Saint-Venant's series for the solid
//!   rectangle (Timoshenko & Goodier, *Theory of Elasticity*, 3rd ed., §109, from memory);
//!   Bredt's τ = T/(2·A_m·t) on thin-walled rectangular tubes (ibid. §115; Roark's *Formulas for
//!   Stress and Strain*, 8th ed., table 10.7, from memory); τ = T·t/J with J = Σ b t³/3 on the
//!   thin-walled open I-section with free warping (Roark 8th ed. table 10.7, from memory).

use std::f64::consts::PI;

use uom::si::angle::radian;
use uom::si::length::meter;

use super::surface::{Face, SurfaceStress};
use crate::error::PhysicsError;

/// Internal resultants on a cross-section (on the face whose outward normal is +X), SI units.
#[derive(Debug, Clone, Copy, Default, PartialEq)]
pub(crate) struct Resultants {
    pub n: f64,
    pub vy: f64,
    pub vz: f64,
    pub t: f64,
    pub my: f64,
    pub mz: f64,
}

/// A surface point of a section: coordinates and the outward-normal angle of its face.
#[derive(Debug, Clone, Copy, PartialEq)]
pub(crate) struct Point {
    pub y: f64,
    pub z: f64,
    pub phi: f64,
}

#[derive(Debug, Clone, Copy, PartialEq)]
pub(crate) enum Section {
    /// Width b along Y, depth h along Z.
    Rectangle { b: f64, h: f64 },
    /// Thin-walled rectangular tube: outer width b (Y), depth h (Z), wall t.
    Tube { b: f64, h: f64, t: f64 },
    /// Solid (inner 0) or hollow circle.
    Circle { outer: f64, inner: f64 },
    /// Symmetric I-section: depth h, flange width bf, flange thickness tf, web thickness tw.
    IBeam { h: f64, bf: f64, tf: f64, tw: f64 },
}

impl Section {
    pub fn area(&self) -> f64 {
        match *self {
            Section::Rectangle { b, h } => b * h,
            Section::Tube { b, h, t } => b * h - (b - 2.0 * t) * (h - 2.0 * t),
            Section::Circle { outer, inner } => PI / 4.0 * (outer * outer - inner * inner),
            Section::IBeam { h, bf, tf, tw } => 2.0 * bf * tf + (h - 2.0 * tf) * tw,
        }
    }

    /// ∫ z² dA (bending about Y).
    pub fn iyy(&self) -> f64 {
        match *self {
            Section::Rectangle { b, h } => b * h.powi(3) / 12.0,
            Section::Tube { b, h, t } => {
                (b * h.powi(3) - (b - 2.0 * t) * (h - 2.0 * t).powi(3)) / 12.0
            }
            Section::Circle { outer, inner } => PI / 64.0 * (outer.powi(4) - inner.powi(4)),
            Section::IBeam { h, bf, tf, tw } => {
                (bf * h.powi(3) - (bf - tw) * (h - 2.0 * tf).powi(3)) / 12.0
            }
        }
    }

    /// ∫ y² dA (bending about Z).
    pub fn izz(&self) -> f64 {
        match *self {
            Section::Rectangle { b, h } => h * b.powi(3) / 12.0,
            Section::Tube { b, h, t } => {
                (h * b.powi(3) - (h - 2.0 * t) * (b - 2.0 * t).powi(3)) / 12.0
            }
            Section::Circle { .. } => self.iyy(),
            Section::IBeam { h, bf, tf, tw } => {
                (2.0 * tf * bf.powi(3) + (h - 2.0 * tf) * tw.powi(3)) / 12.0
            }
        }
    }

    /// Saint-Venant torsion constant J (T = G·J·dθ/dx).
    pub fn torsion_constant(&self) -> f64 {
        match *self {
            Section::Rectangle { b, h } => {
                let (short, long) = if b <= h { (b, h) } else { (h, b) };
                rect_torsion_k1(short / 2.0, long / 2.0) * short.powi(3) * long
            }
            Section::Tube { b, h, t } => {
                // Bredt–Batho J = 4A_m² t / s_m for a constant wall (Roark 8th ed. table 10.7).
                let am = (b - t) * (h - t);
                4.0 * am * am * t / (2.0 * ((b - t) + (h - t)))
            }
            Section::Circle { outer, inner } => PI / 32.0 * (outer.powi(4) - inner.powi(4)),
            Section::IBeam { h, bf, tf, tw } => {
                (2.0 * bf * tf.powi(3) + (h - 2.0 * tf) * tw.powi(3)) / 3.0
            }
        }
    }

    /// The surface point of a face at `offset` along the surface y axis from its centre line.
    pub fn point(&self, face: Face, offset: f64) -> Result<Point, PhysicsError> {
        let half = |s: f64| s / 2.0;
        let check = |limit: f64, what: &str| {
            if offset.abs() <= limit * (1.0 + 1e-12) {
                Ok(())
            } else {
                Err(PhysicsError::out_of_range(
                    "gauge site",
                    format!(
                        "offset {:.4} mm is off the {what} (half-width {:.4} mm)",
                        offset * 1e3,
                        limit * 1e3
                    ),
                ))
            }
        };
        match *self {
            Section::Circle { outer, .. } => {
                let r = outer / 2.0;
                let phi0 = face.normal_angle().get::<radian>();
                let phi = phi0 - offset / r;
                check(PI * r, "circumference")?;
                Ok(Point {
                    y: r * phi.cos(),
                    z: r * phi.sin(),
                    phi,
                })
            }
            Section::Rectangle { b, h } | Section::Tube { b, h, .. } => match face {
                Face::PlusZ => {
                    check(half(b), "+Z face")?;
                    Ok(Point {
                        y: offset,
                        z: half(h),
                        phi: 0.5 * PI,
                    })
                }
                Face::MinusZ => {
                    check(half(b), "−Z face")?;
                    Ok(Point {
                        y: -offset,
                        z: -half(h),
                        phi: 1.5 * PI,
                    })
                }
                Face::PlusY => {
                    check(half(h), "+Y face")?;
                    Ok(Point {
                        y: half(b),
                        z: -offset,
                        phi: 0.0,
                    })
                }
                Face::MinusY => {
                    check(half(h), "−Y face")?;
                    Ok(Point {
                        y: -half(b),
                        z: offset,
                        phi: PI,
                    })
                }
                Face::Round(_) => Err(not_round()),
            },
            Section::IBeam { h, bf, tf, tw } => match face {
                Face::PlusZ => {
                    check(half(bf), "top flange")?;
                    Ok(Point {
                        y: offset,
                        z: half(h),
                        phi: 0.5 * PI,
                    })
                }
                Face::MinusZ => {
                    check(half(bf), "bottom flange")?;
                    Ok(Point {
                        y: -offset,
                        z: -half(h),
                        phi: 1.5 * PI,
                    })
                }
                Face::PlusY => {
                    check(half(h) - tf, "web")?;
                    Ok(Point {
                        y: half(tw),
                        z: -offset,
                        phi: 0.0,
                    })
                }
                Face::MinusY => {
                    check(half(h) - tf, "web")?;
                    Ok(Point {
                        y: -half(tw),
                        z: offset,
                        phi: PI,
                    })
                }
                Face::Round(_) => Err(not_round()),
            },
        }
    }

    /// Surface points sampled for the peak-stress search.
    pub fn sample_points(&self) -> Vec<Point> {
        let mut pts = Vec::new();
        let n = 20;
        let mut face_pts = |face: Face, half: f64| {
            for i in 0..=n {
                let s = -half + 2.0 * half * i as f64 / n as f64;
                // The offset is within the face by construction.
                if let Ok(p) = self.point(face, s) {
                    pts.push(p);
                }
            }
        };
        match *self {
            Section::Circle { .. } => {
                for i in 0..72 {
                    let phi = 2.0 * PI * i as f64 / 72.0;
                    face_pts(Face::Round(uom::si::f64::Angle::new::<radian>(phi)), 0.0);
                }
            }
            Section::Rectangle { b, h } | Section::Tube { b, h, .. } => {
                face_pts(Face::PlusZ, b / 2.0);
                face_pts(Face::MinusZ, b / 2.0);
                face_pts(Face::PlusY, h / 2.0);
                face_pts(Face::MinusY, h / 2.0);
            }
            Section::IBeam { h, bf, tf, .. } => {
                face_pts(Face::PlusZ, bf / 2.0);
                face_pts(Face::MinusZ, bf / 2.0);
                face_pts(Face::PlusY, h / 2.0 - tf);
                face_pts(Face::MinusY, h / 2.0 - tf);
            }
        }
        pts
    }

    /// The surface stress at a point under the given resultants.
    pub fn stress(&self, p: Point, r: &Resultants) -> SurfaceStress {
        let sxx = r.n / self.area() + r.my * p.z / self.iyy() - r.mz * p.y / self.izz();
        let txy_s = self.transverse_shear(p, r) + self.torsion_shear(p, r.t);
        SurfaceStress::from_pa(sxx, 0.0, txy_s)
    }

    /// In-surface shear (surface frame) from the shear forces Vy, Vz.
    fn transverse_shear(&self, p: Point, r: &Resultants) -> f64 {
        let (s, c) = (p.phi.sin(), p.phi.cos());
        let project = |txy: f64, txz: f64| txy * s - txz * c;
        match *self {
            Section::Circle { outer, inner } => {
                let (r2, r1) = (outer / 2.0, inner / 2.0);
                let f =
                    4.0 / (3.0 * self.area()) * (r2 * r2 + r2 * r1 + r1 * r1) / (r2 * r2 + r1 * r1);
                r.vy * f * s - r.vz * f * c
            }
            Section::Rectangle { b, h } => {
                let txz = r.vz / (2.0 * self.iyy()) * (h * h / 4.0 - p.z * p.z);
                let txy = r.vy / (2.0 * self.izz()) * (b * b / 4.0 - p.y * p.y);
                project(txy, txz)
            }
            Section::Tube { b, h, t } => {
                let (sy, sz) = (b - t, h - t);
                let (iy, iz) = (self.iyy(), self.izz());
                let horizontal = p.phi.sin().abs() > 0.5;
                if horizontal {
                    // Flange (wall at z = ±sz/2): flow along y.
                    let zw = sz / 2.0 * p.z.signum();
                    let y = p.y.clamp(-sy / 2.0, sy / 2.0);
                    let txy = -r.vz * zw * y / iy
                        + r.vy / iz * ((sy / 2.0) * (sz / 2.0) + (sy * sy / 4.0 - y * y) / 2.0);
                    project(txy, 0.0)
                } else {
                    let yw = sy / 2.0 * p.y.signum();
                    let z = p.z.clamp(-sz / 2.0, sz / 2.0);
                    let txz = r.vz / iy * ((sz / 2.0) * (sy / 2.0) + (sz * sz / 4.0 - z * z) / 2.0)
                        - r.vy * yw * z / iz;
                    project(0.0, txz)
                }
            }
            Section::IBeam { h, bf, tf, tw } => {
                let (iy, iz) = (self.iyy(), self.izz());
                if p.phi.sin().abs() > 0.5 {
                    // Flange outer surface: shear flow from the tips along y.
                    let zf = (h - tf) / 2.0 * p.z.signum();
                    let rest = (bf / 2.0 - p.y.abs()).max(0.0);
                    let txy = p.y.signum() * r.vz * zf * rest / iy
                        + r.vy / (2.0 * iz) * (bf * bf / 4.0 - p.y * p.y);
                    project(txy, 0.0)
                } else {
                    let hw = h / 2.0 - tf;
                    let q = bf * tf * (h - tf) / 2.0 + tw * (hw * hw - p.z * p.z) / 2.0;
                    project(0.0, r.vz * q / (iy * tw))
                }
            }
        }
    }

    /// In-surface shear (surface frame) from the torque T; positive torque gives negative shear
    /// in the surface frame (the frame's y axis runs clockwise about +X).
    fn torsion_shear(&self, p: Point, t: f64) -> f64 {
        if t == 0.0 {
            return 0.0;
        }
        match *self {
            Section::Circle { outer, .. } => -t * (outer / 2.0) / self.torsion_constant(),
            Section::Tube { b, h, t: wall } => -t / (2.0 * (b - wall) * (h - wall) * wall),
            Section::IBeam { tf, tw, .. } => {
                let local = if p.phi.sin().abs() > 0.5 { tf } else { tw };
                -t * local / self.torsion_constant()
            }
            Section::Rectangle { b, h } => {
                let (a, c) = if b <= h {
                    (b / 2.0, h / 2.0)
                } else {
                    (h / 2.0, b / 2.0)
                };
                // Position along the face and whether the face is a long one.
                let on_z_face = p.phi.sin().abs() > 0.5;
                let along = if on_z_face { p.y } else { p.z };
                let long_face = (on_z_face && b > h) || (!on_z_face && h >= b);
                let g_theta = t / (rect_torsion_k1(a, c) * (2.0 * a).powi(3) * (2.0 * c));
                -g_theta * rect_torsion_shear(a, c, along, long_face)
            }
        }
    }
}

fn not_round() -> PhysicsError {
    PhysicsError::invalid(
        "gauge face",
        "a round-surface angle",
        "one of the four flat faces",
    )
}

/// Number of odd terms kept in the Saint-Venant series (the shear series' terms fall as 1/n²;
/// 400 odd terms leave a truncation below 1e-4 of the face-centre value).
const SERIES_TERMS: usize = 400;

/// k₁ in T = k₁·Gθ·(2a)³·(2c) for a rectangle 2a × 2c, a ≤ c (Timoshenko & Goodier 3rd ed.
/// §109, from memory): k₁ = (1/3)[1 − (192/π⁵)(a/c) Σ tanh(nπc/2a)/n⁵], n odd.
pub(crate) fn rect_torsion_k1(a: f64, c: f64) -> f64 {
    let mut s = 0.0;
    for i in 0..SERIES_TERMS {
        let n = (2 * i + 1) as f64;
        s += (n * PI * c / (2.0 * a)).tanh() / n.powi(5);
    }
    (1.0 - 192.0 / PI.powi(5) * (a / c) * s) / 3.0
}

/// Surface shear over Gθ on a rectangle 2a × 2c (a ≤ c), at position `s` along a face from its
/// centre; on a long face (distance a from the centre, |s| ≤ c):
/// (16a/π²) Σ [1 − cosh(nπs/2a)/cosh(nπc/2a)]/n²; on a short face (|s| ≤ a):
/// (16a/π²) Σ (−1)^((n−1)/2) tanh(nπc/2a) cos(nπs/2a)/n² (Timoshenko & Goodier 3rd ed. §109,
/// from memory).
pub(crate) fn rect_torsion_shear(a: f64, c: f64, s: f64, long_face: bool) -> f64 {
    let mut sum = 0.0;
    for i in 0..SERIES_TERMS {
        let n = (2 * i + 1) as f64;
        let k = n * PI / (2.0 * a);
        if long_face {
            // cosh(k s)/cosh(k c) without overflow.
            let u = k * s.abs();
            let v = k * c;
            let ratio = (u - v).exp() * (1.0 + (-2.0 * u).exp()) / (1.0 + (-2.0 * v).exp());
            sum += (1.0 - ratio) / (n * n);
        } else {
            let sign = if i % 2 == 0 { 1.0 } else { -1.0 };
            sum += sign * (k * c).tanh() * (k * s).cos() / (n * n);
        }
    }
    16.0 * a / (PI * PI) * sum
}

/// Resultants at the section `arm` behind the load point of a bar loaded at its free end.
pub(crate) fn cantilever_resultants(load: &super::Wrench, arm: f64) -> Resultants {
    use super::LoadComponent::*;
    Resultants {
        n: load.get(Fx),
        vy: load.get(Fy),
        vz: load.get(Fz),
        t: load.get(Mx),
        my: load.get(My) - arm * load.get(Fz),
        mz: load.get(Mz) + arm * load.get(Fy),
    }
}

pub(crate) fn si(l: uom::si::f64::Length) -> f64 {
    l.get::<meter>()
}

/// A dimension checked to be positive and finite (the error shows it in mm), in metres.
pub(crate) fn positive_length(
    name: &str,
    l: uom::si::f64::Length,
) -> Result<f64, crate::error::PhysicsError> {
    Ok(crate::error::check_positive(name, si(l) * 1e3, "mm")? * 1e-3)
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn rectangle_torsion_matches_the_handbook_table() {
        // τmax = T/(α·b·c²) and J = β·b·c³ for a b × c rectangle, b ≥ c: α = 0.208, β = 0.141
        // at b/c = 1; α = 0.246, β = 0.229 at b/c = 2; α = 0.282, β = 0.281 at b/c = 4
        // (Timoshenko & Gere, Mechanics of Materials, 4th ed., table 3-1 and eq. 3-71, from
        // memory; also Roark 8th ed. table 10.7).
        for (ratio, alpha, beta) in [
            (1.0, 0.208, 0.141),
            (2.0, 0.246, 0.229),
            (4.0, 0.282, 0.281),
        ] {
            let (c, b) = (1.0, ratio);
            let sec = Section::Rectangle { b, h: c };
            let j = sec.torsion_constant();
            assert!(
                (j / (b * c.powi(3)) - beta).abs() < 1.5e-3,
                "β at {ratio}: {}",
                j / b
            );
            // Long face is the ±Z face here (b > h): centre is the maximum.
            let p = sec.point(Face::PlusZ, 0.0).unwrap();
            let tau = -sec.torsion_shear(p, 1.0);
            assert!(
                (1.0 / (tau * b * c * c) - alpha).abs() < 1.5e-3,
                "α at {ratio}"
            );
        }
    }

    #[test]
    fn rectangle_torsion_vanishes_at_corners_and_is_lower_on_short_faces() {
        let sec = Section::Rectangle { b: 1.0, h: 2.0 };
        let long_c = -sec.torsion_shear(sec.point(Face::PlusY, 0.0).unwrap(), 1.0);
        let short_c = -sec.torsion_shear(sec.point(Face::PlusZ, 0.0).unwrap(), 1.0);
        let corner = -sec.torsion_shear(sec.point(Face::PlusY, 1.0).unwrap(), 1.0);
        assert!(short_c < long_c);
        assert!(corner.abs() < 1e-3 * long_c);
    }

    #[test]
    fn section_properties_reduce_to_the_solid_cases() {
        let tube = Section::Circle {
            outer: 0.02,
            inner: 0.0,
        };
        assert!((tube.torsion_constant() - 2.0 * tube.iyy()).abs() < 1e-20);
        let i = Section::IBeam {
            h: 0.05,
            bf: 0.02,
            tf: 0.025,
            tw: 0.02,
        };
        let r = Section::Rectangle { b: 0.02, h: 0.05 };
        assert!((i.area() - r.area()).abs() < 1e-15);
        assert!((i.iyy() - r.iyy()).abs() < 1e-15);
    }

    #[test]
    fn shear_forces_integrate_to_the_applied_force_on_a_rectangle() {
        // Jourawski τxz on the side face follows the parabola with mean V/A across the depth.
        let sec = Section::Rectangle { b: 0.01, h: 0.03 };
        let r = Resultants {
            vz: 300.0,
            ..Default::default()
        };
        let n = 2000;
        let mut sum = 0.0;
        for i in 0..n {
            let z = -0.015 + 0.03 * (i as f64 + 0.5) / n as f64;
            let p = Point {
                y: 0.005,
                z,
                phi: 0.0,
            };
            sum += -sec.transverse_shear(p, &r) * 0.03 / n as f64;
        }
        assert!((sum * 0.01 - 300.0).abs() < 1e-3);
    }
}
