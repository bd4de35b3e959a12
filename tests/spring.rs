//! Reference checks of the spring elements against closed-form results from the
//! strength-of-materials literature (sources beside each check) and of the material table.

use std::f64::consts::PI;

use gaugebook::units::{Angle, Length, Mass};
use gaugebook::{
    AttachedMass, Cantilever, Column, ColumnSection, Face, LoadComponent, Motion, OverloadFactors,
    Parallelogram, PhysicsError, ShearWeb, Site, SpringElement, Stiffness, TorqueShaft, Wrench,
    material,
};
use uom::si::angle::degree;
use uom::si::frequency::hertz;
use uom::si::length::millimeter;
use uom::si::mass::kilogram;
use uom::si::mass_density::kilogram_per_cubic_meter;
use uom::si::pressure::{megapascal, pascal};

use crate::common::assert_close;

fn mm(v: f64) -> Length {
    Length::new::<millimeter>(v)
}

fn deg(v: f64) -> Angle {
    Angle::new::<degree>(v)
}

fn e_of(m: &gaugebook::Material) -> f64 {
    m.youngs_modulus().get::<pascal>()
}

fn g_of(m: &gaugebook::Material) -> f64 {
    m.shear_modulus().get::<pascal>()
}

#[test]
fn cantilever_surface_strain_is_6fl_over_ebh2() {
    // εx = ∓6·F·(L − x)/(E·b·h²) on the top/bottom faces, εy = −ν·εx (Timoshenko & Gere,
    // Mechanics of Materials, 4th ed., §5.5 flexure formula σ = Mc/I with I = bh³/12, and §1.7
    // Poisson, from memory).
    let m = material("2024-T351").unwrap();
    let (l, b, h, x): (f64, f64, f64, f64) = (0.15, 0.02, 0.005, 0.05);
    let beam = Cantilever::new(m.clone(), mm(150.0), mm(20.0), mm(5.0), mm(50.0)).unwrap();
    let f = 40.0;
    let w = Wrench::only(LoadComponent::Fz, f);
    let expected = 6.0 * f * (l - x) / (e_of(&m) * b * h * h);
    let top = beam.surface_strain(&beam.site("top").unwrap(), &w).unwrap();
    let bottom = beam
        .surface_strain(&beam.site("bottom").unwrap(), &w)
        .unwrap();
    assert_close(top.exx.value(), -expected, 1e-12, 0.0);
    assert_close(bottom.exx.value(), expected, 1e-12, 0.0);
    assert_close(bottom.eyy.value(), -m.poisson() * expected, 1e-12, 0.0);
    assert_close(top.gxy.value(), 0.0, 0.0, 1e-18);
}

#[test]
fn cantilever_tip_moment_and_side_load() {
    // A tip moment My gives constant curvature: σ = My·(h/2)/I on the top face (tension for
    // positive My); a side load Fy bends about Z: σ = 6·Fy·(L − x)/(h·b²) on the −Y face
    // (Timoshenko & Gere 4th ed. §5.5, from memory).
    let m = material("7075-T6").unwrap();
    let beam = Cantilever::new(m.clone(), mm(100.0), mm(12.0), mm(6.0), mm(30.0)).unwrap();
    let e = e_of(&m);
    let my = 3.0;
    let s = beam.surface_strain(
        &beam.site("top").unwrap(),
        &Wrench::only(LoadComponent::My, my),
    );
    let i = 0.012 * 0.006f64.powi(3) / 12.0;
    assert_close(s.unwrap().exx.value(), my * 0.003 / (i * e), 1e-12, 0.0);
    let fy = 20.0;
    let s = beam
        .surface_strain(
            &beam.site("side -y").unwrap(),
            &Wrench::only(LoadComponent::Fy, fy),
        )
        .unwrap();
    assert_close(
        s.exx.value(),
        6.0 * fy * 0.07 / (0.006 * 0.012f64.powi(2) * e),
        1e-12,
        0.0,
    );
    // The top face's centre line is on the neutral plane for Fy.
    let s = beam
        .surface_strain(
            &beam.site("top").unwrap(),
            &Wrench::only(LoadComponent::Fy, fy),
        )
        .unwrap();
    assert_close(s.exx.value(), 0.0, 0.0, 1e-18);
}

#[test]
fn cantilever_side_face_shear_is_3v_over_2a_at_the_neutral_axis() {
    // τmax = 3V/(2A) at the neutral axis of a rectangle (Timoshenko & Gere 4th ed. eq. 5-39,
    // from memory); the +Y face's surface y axis is −Z, so an upward V gives −τ there.
    let m = material("4340").unwrap();
    let beam = Cantilever::new(m.clone(), mm(100.0), mm(10.0), mm(20.0), mm(50.0)).unwrap();
    let v = 1000.0;
    let s = beam
        .surface_stress(
            &beam.site("side +y").unwrap(),
            &Wrench::only(LoadComponent::Fz, v),
        )
        .unwrap();
    assert_close(s.txy.get::<pascal>(), -1.5 * v / (0.01 * 0.02), 1e-12, 0.0);
    let s = beam
        .surface_stress(
            &beam.site("side -y").unwrap(),
            &Wrench::only(LoadComponent::Fz, v),
        )
        .unwrap();
    assert_close(s.txy.get::<pascal>(), 1.5 * v / (0.01 * 0.02), 1e-12, 0.0);
}

#[test]
fn cantilever_stiffness_and_deflection() {
    // δ = FL³/(3EI) + FL/(κGA), κ = 5/6 (Timoshenko & Gere 4th ed. §9.4 table and §9.11 shear
    // deflection, from memory).
    let m = material("17-4 PH H1025").unwrap();
    let (l, b, h): (f64, f64, f64) = (0.2, 0.02, 0.004);
    let beam = Cantilever::new(m.clone(), mm(200.0), mm(20.0), mm(4.0), mm(50.0)).unwrap();
    let i = b * h.powi(3) / 12.0;
    let c = l.powi(3) / (3.0 * e_of(&m) * i) + l / (5.0 / 6.0 * g_of(&m) * b * h);
    let Stiffness::Translational(k) = beam.stiffness() else {
        panic!("translational")
    };
    assert_close(k, 1.0 / c, 1e-12, 0.0);
    let Motion::Translation(d) = beam.deflection(&Wrench::only(LoadComponent::Fz, 10.0)) else {
        panic!("translation")
    };
    assert_close(d.get::<millimeter>(), 10.0 * c * 1e3, 1e-12, 0.0);
    // Slender (L/h = 50): the shear term is below 0.1 % of the bending one.
    assert!((k * l.powi(3) / (3.0 * e_of(&m) * i) - 1.0).abs() < 1e-3);
}

#[test]
fn cantilever_frequency_is_a_close_upper_bound_on_the_exact_first_mode() {
    // Uniform cantilever, first mode f = (β₁²/2π)·√(EI/(ρA·L⁴)) with β₁ the first root of
    // cos β·cosh β + 1 = 0 (Timoshenko, Young & Weaver, Vibration Problems in Engineering, 4th
    // ed., §5.3, from memory); β₁ = 1.8751040687119611 from scipy 1.17.1,
    // scipy.optimize.brentq(lambda b: cos(b)*cosh(b) + 1, 1, 3, xtol=1e-15). Rayleigh's estimate with the
    // static shape (33/140 of the mass at the tip) is an upper bound within 1.5 %; a slender beam
    // keeps the shear term negligible.
    let m = material("7075-T6").unwrap();
    let (l, b, h): (f64, f64, f64) = (0.3, 0.02, 0.003);
    let beam = Cantilever::new(m.clone(), mm(300.0), mm(20.0), mm(3.0), mm(50.0)).unwrap();
    let rho = m.density().get::<kilogram_per_cubic_meter>();
    let i = b * h.powi(3) / 12.0;
    let exact = 1.8751040687119611f64.powi(2) / (2.0 * PI)
        * (e_of(&m) * i / (rho * b * h * l.powi(4))).sqrt();
    let f = beam
        .natural_frequency(&AttachedMass::mass(Mass::new::<kilogram>(0.0)))
        .unwrap()
        .get::<hertz>();
    assert!(f > exact && f < exact * 1.016, "{f} vs {exact}");
    // With a tip mass M much heavier than the beam the spring–mass value √(k/M)/2π dominates.
    let big = 100.0 * rho * b * h * l;
    let f = beam
        .natural_frequency(&AttachedMass::mass(Mass::new::<kilogram>(big)))
        .unwrap()
        .get::<hertz>();
    let k = beam.stiffness().value();
    assert_close(
        f,
        (k / (big + 33.0 / 140.0 * big / 100.0)).sqrt() / (2.0 * PI),
        1e-12,
        0.0,
    );
}

#[test]
fn column_in_compression_with_poisson_gauges() {
    // ε_axial = −F/(EA), ε_transverse = +νF/(EA) (Timoshenko & Gere 4th ed. §1.5, §1.7, from
    // memory), on every face of round, hollow round, square and hollow square columns.
    let m = material("17-4 PH H900").unwrap();
    let f = -60e3;
    let w = Wrench::only(LoadComponent::Fx, f);
    let cases = [
        (
            ColumnSection::Round { diameter: mm(16.0) },
            PI / 4.0 * 0.016f64.powi(2),
        ),
        (
            ColumnSection::HollowRound {
                outer: mm(20.0),
                inner: mm(14.0),
            },
            PI / 4.0 * (0.02f64.powi(2) - 0.014f64.powi(2)),
        ),
        (ColumnSection::Square { side: mm(15.0) }, 0.015f64.powi(2)),
        (
            ColumnSection::HollowSquare {
                side: mm(30.0),
                wall: mm(3.0),
            },
            0.03f64.powi(2) - 0.024f64.powi(2),
        ),
    ];
    for (section, area) in cases {
        let col = Column::new(m.clone(), section, mm(100.0), mm(50.0)).unwrap();
        let axial = f / (e_of(&m) * area);
        for site in col.sites() {
            let s = col.surface_strain(&site, &w).unwrap();
            assert_close(s.normal(deg(0.0)).value(), axial, 1e-12, 0.0);
            assert_close(
                s.normal(deg(90.0)).value(),
                -m.poisson() * axial,
                1e-12,
                1e-18,
            );
        }
        let Stiffness::Translational(k) = col.stiffness() else {
            panic!()
        };
        assert_close(k, e_of(&m) * area / 0.1, 1e-12, 0.0);
    }
}

#[test]
fn column_bending_and_buckling() {
    // σ = 32M/(πd³) at the outer fibre of a round bar (Timoshenko & Gere 4th ed. eq. 5-17,
    // from memory); Euler load of a fixed–free column π²EI/(4L²) (Timoshenko & Gere, Theory of
    // Elastic Stability, 2nd ed., §2.1, from memory).
    let m = material("4340").unwrap();
    let d: f64 = 0.02;
    let col = Column::new(
        m.clone(),
        ColumnSection::Round { diameter: mm(20.0) },
        mm(80.0),
        mm(40.0),
    )
    .unwrap();
    let my = 10.0;
    let s = col
        .surface_stress(
            &col.site("+z").unwrap(),
            &Wrench::only(LoadComponent::My, my),
        )
        .unwrap();
    assert_close(
        s.sxx.get::<pascal>(),
        32.0 * my / (PI * d.powi(3)),
        1e-12,
        0.0,
    );
    let pcr = col.buckling_load().unwrap().get::<uom::si::force::newton>();
    assert_close(
        pcr,
        PI * PI * e_of(&m) * PI * d.powi(4) / 64.0 / (4.0 * 0.08f64.powi(2)),
        1e-12,
        0.0,
    );
    let margins = col
        .margins(
            &Wrench::only(LoadComponent::Fx, -10e3),
            &OverloadFactors::default(),
        )
        .unwrap();
    assert_close(
        margins.rated.buckling_factor.unwrap(),
        pcr / 10e3,
        1e-12,
        0.0,
    );
    assert_close(
        margins.ultimate.buckling_factor.unwrap(),
        pcr / 30e3,
        1e-12,
        0.0,
    );
}

#[test]
fn square_column_torsion_matches_the_table() {
    // Square bar of side a: τmax = T/(0.208·a³) at the middle of each face (Roark, Formulas for
    // Stress and Strain, 8th ed., table 10.7 case 4; Timoshenko & Gere 4th ed. table 3-1; both
    // from memory, three figures).
    let m = material("4340").unwrap();
    let col = Column::new(
        m.clone(),
        ColumnSection::Square { side: mm(20.0) },
        mm(100.0),
        mm(50.0),
    )
    .unwrap();
    let t = 50.0;
    for site in col.sites() {
        let s = col
            .surface_stress(&site, &Wrench::only(LoadComponent::Mx, t))
            .unwrap();
        assert_close(
            -s.txy.get::<pascal>(),
            t / (0.208 * 0.02f64.powi(3)),
            2e-3,
            0.0,
        );
    }
    // Thin-walled square tube: Bredt τ = T/(2·A_m·t) (Roark 8th ed. table 10.7, from memory).
    let col = Column::new(
        m,
        ColumnSection::HollowSquare {
            side: mm(40.0),
            wall: mm(2.0),
        },
        mm(120.0),
        mm(60.0),
    )
    .unwrap();
    let s = col
        .surface_stress(
            &col.site("+y").unwrap(),
            &Wrench::only(LoadComponent::Mx, t),
        )
        .unwrap();
    assert_close(
        -s.txy.get::<pascal>(),
        t / (2.0 * 0.038f64.powi(2) * 0.002),
        1e-12,
        0.0,
    );
}

#[test]
fn column_frequency_is_an_upper_bound_on_the_rod_mode() {
    // Fixed–free rod, first axial mode f = √(E/ρ)/(4L) (Timoshenko, Young & Weaver 4th ed. §5.1,
    // from memory); Rayleigh with a linear shape gives √3/(π/2) = 1.103 times that.
    let m = material("2024-T351").unwrap();
    let col = Column::new(
        m.clone(),
        ColumnSection::Round { diameter: mm(10.0) },
        mm(60.0),
        mm(30.0),
    )
    .unwrap();
    let c = (e_of(&m) / m.density().get::<kilogram_per_cubic_meter>()).sqrt();
    let exact = c / (4.0 * 0.06);
    let f = col
        .natural_frequency(&AttachedMass::mass(Mass::new::<kilogram>(0.0)))
        .unwrap()
        .get::<hertz>();
    assert_close(f / exact, 3f64.sqrt() / (PI / 2.0), 1e-12, 0.0);
}

#[test]
fn shaft_in_torsion_with_45_degree_gauges() {
    // γ = 16T/(πGd³) solid, 16T·D/(πG(D⁴ − d⁴)) hollow; ±45° gauges read ±γ/2 (Timoshenko &
    // Gere 4th ed. eq. 3-12, 3-16 and §3.5 pure shear, from memory).
    let m = material("4340").unwrap();
    let g = g_of(&m);
    let t = 120.0;
    let w = Wrench::only(LoadComponent::Mx, t);
    let solid = TorqueShaft::solid(m.clone(), mm(18.0), mm(100.0), mm(50.0)).unwrap();
    let hollow = TorqueShaft::hollow(m.clone(), mm(25.0), mm(19.0), mm(100.0), mm(50.0)).unwrap();
    let gamma_solid = 16.0 * t / (PI * g * 0.018f64.powi(3));
    let gamma_hollow = 16.0 * t * 0.025 / (PI * g * (0.025f64.powi(4) - 0.019f64.powi(4)));
    for (shaft, gamma) in [(&solid, gamma_solid), (&hollow, gamma_hollow)] {
        for site in shaft.sites() {
            let s = shaft.surface_strain(&site, &w).unwrap();
            assert_close(s.gxy.value(), -gamma, 1e-12, 0.0);
            assert_close(s.normal(deg(45.0)).value(), -gamma / 2.0, 1e-12, 0.0);
            assert_close(s.normal(deg(-45.0)).value(), gamma / 2.0, 1e-12, 0.0);
            assert_close(s.exx.value(), 0.0, 0.0, 1e-18);
        }
    }
    let Stiffness::Rotational(k) = solid.stiffness() else {
        panic!()
    };
    assert_close(k, g * PI * 0.018f64.powi(4) / 32.0 / 0.1, 1e-12, 0.0);
    // Peak von Mises in pure shear is √3·τ.
    let p = solid.peak_stress(&w).unwrap();
    assert_close(
        p.von_mises.get::<pascal>(),
        3f64.sqrt() * gamma_solid * g,
        1e-9,
        0.0,
    );
}

#[test]
fn shaft_shear_force_gives_4v_over_3a_at_the_neutral_axis() {
    // Round bar: τ = 4V/(3A) at the neutral axis (Timoshenko & Gere 4th ed. eq. 5-42, from
    // memory); a tube: (4V/3A)(r₂² + r₂r₁ + r₁²)/(r₂² + r₁²) (ibid. eq. 5-44, from memory).
    let m = material("4340").unwrap();
    let v = 500.0;
    let solid = TorqueShaft::solid(m.clone(), mm(20.0), mm(100.0), mm(50.0)).unwrap();
    let s = solid
        .surface_stress(
            &solid.site("+y").unwrap(),
            &Wrench::only(LoadComponent::Fz, v),
        )
        .unwrap();
    assert_close(
        -s.txy.get::<pascal>(),
        4.0 * v / (3.0 * PI * 0.01f64.powi(2)),
        1e-12,
        0.0,
    );
    let tube = TorqueShaft::hollow(m, mm(20.0), mm(16.0), mm(100.0), mm(50.0)).unwrap();
    let s = tube
        .surface_stress(
            &tube.site("+y").unwrap(),
            &Wrench::only(LoadComponent::Fz, v),
        )
        .unwrap();
    let (r2, r1) = (0.01f64, 0.008f64);
    let a = PI * (r2 * r2 - r1 * r1);
    let expected = 4.0 * v / (3.0 * a) * (r2 * r2 + r2 * r1 + r1 * r1) / (r2 * r2 + r1 * r1);
    assert_close(-s.txy.get::<pascal>(), expected, 1e-12, 0.0);
    // The +Z site is on the bending plane's extreme fibre, where this shear vanishes.
    let s = tube
        .surface_stress(
            &tube.site("+z").unwrap(),
            &Wrench::only(LoadComponent::Fz, v),
        )
        .unwrap();
    assert!(s.txy.get::<pascal>().abs() < 1e-9 * expected);
}

#[test]
fn shear_web_neutral_axis_shear() {
    // I-beam web at the neutral axis: τmax = V/(8·I·t_w)·[b(h² − h₁²) + t_w·h₁²], h₁ the web's
    // clear depth (Gere & Timoshenko, Mechanics of Materials, 4th ed., eq. 5-46, from memory).
    let m = material("17-4 PH H1025").unwrap();
    let (h, bf, tf, tw): (f64, f64, f64, f64) = (0.04, 0.03, 0.005, 0.004);
    let web = ShearWeb::new(
        m.clone(),
        mm(160.0),
        mm(40.0),
        mm(30.0),
        mm(5.0),
        mm(4.0),
        mm(80.0),
    )
    .unwrap();
    let h1 = h - 2.0 * tf;
    let i = (bf * h.powi(3) - (bf - tw) * h1.powi(3)) / 12.0;
    let v = 8000.0;
    let tau = v / (8.0 * i * tw) * (bf * (h * h - h1 * h1) + tw * h1 * h1);
    let w = Wrench::only(LoadComponent::Fz, v);
    for name in ["web +y", "web -y"] {
        let s = web.surface_strain(&web.site(name).unwrap(), &w).unwrap();
        assert_close(s.gxy.value().abs(), tau / g_of(&m), 1e-12, 0.0);
        assert_close(s.exx.value(), 0.0, 0.0, 1e-18);
        // ±45°: ±γ/2, with opposite signs on the two faces of the web.
        assert_close(
            s.normal(deg(45.0)).value().abs(),
            tau / (2.0 * g_of(&m)),
            1e-12,
            0.0,
        );
    }
    let a = web
        .surface_strain(&web.site("web +y").unwrap(), &w)
        .unwrap();
    let b = web
        .surface_strain(&web.site("web -y").unwrap(), &w)
        .unwrap();
    assert_close(a.gxy.value(), -b.gxy.value(), 1e-12, 0.0);
    // Flange bending: σ = M·(h/2)/I with M = V·(L − x).
    let s = web
        .surface_stress(&web.site("bottom flange").unwrap(), &w)
        .unwrap();
    assert_close(s.sxx.get::<pascal>(), v * 0.08 * h / 2.0 / i, 1e-12, 0.0);
}

#[test]
fn parallelogram_s_bending_and_stiffness() {
    // Guided flexure pair: m(x) = (F/2)(L/2 − x), so εx = ∓3F(L/2 − x)/(E·b·h²) at the outer
    // surfaces plus the axial part ∓(F·L/2)/(H·E·b·h); stiffness 24EI/L³ (Young & Budynas,
    // Roark's Formulas for Stress and Strain, 7th ed., table 8.1 guided cantilever, from memory).
    let m = material("2024-T351").unwrap();
    let (l, b, h, hh, a): (f64, f64, f64, f64, f64) = (0.05, 0.02, 0.002, 0.03, 0.008);
    let p = Parallelogram::new(m.clone(), mm(50.0), mm(20.0), mm(2.0), mm(30.0), mm(8.0)).unwrap();
    let e = e_of(&m);
    let f = 80.0;
    let w = Wrench::only(LoadComponent::Fz, f);
    let bend = 3.0 * f * (l / 2.0 - a) / (e * b * h * h);
    let axial = f * l / 2.0 / hh / (e * b * h);
    let s = |n: &str| {
        p.surface_strain(&p.site(n).unwrap(), &w)
            .unwrap()
            .exx
            .value()
    };
    assert_close(s("upper root"), -bend - axial, 1e-12, 0.0);
    assert_close(s("upper tip"), bend - axial, 1e-12, 0.0);
    assert_close(s("lower root"), bend + axial, 1e-12, 0.0);
    assert_close(s("lower tip"), -bend + axial, 1e-12, 0.0);
    let k = p.stiffness().value();
    let i = b * h.powi(3) / 12.0;
    let c = l.powi(3) / (24.0 * e * i) + l / (2.0 * 5.0 / 6.0 * g_of(&m) * b * h);
    assert_close(k, 1.0 / c, 1e-12, 0.0);
}

#[test]
fn margins_scale_with_load_and_follow_goodman() {
    // Yield factor Sy/σ; modified Goodman for 0→σ cycling n = 1/(σ/2/Se + σ/2/Su) (Budynas &
    // Nisbett, Shigley's MED, 9th ed., eq. 6-46, from memory).
    let m = material("2024-T351").unwrap();
    let beam = Cantilever::new(m.clone(), mm(100.0), mm(20.0), mm(6.0), mm(30.0)).unwrap();
    let rated = Wrench::only(LoadComponent::Fz, 100.0);
    let f = OverloadFactors::new(1.2, 2.0).unwrap();
    let mg = beam.margins(&rated, &f).unwrap();
    let sigma = 6.0 * 100.0 * 0.1 / (0.02 * 0.006f64.powi(2));
    let sy = m.yield_strength().get::<pascal>();
    let su = m.ultimate_strength().get::<pascal>();
    let se = m.fatigue_strength().unwrap().get::<pascal>();
    assert_close(mg.rated.peak.von_mises.get::<pascal>(), sigma, 1e-9, 0.0);
    assert_close(mg.rated.yield_factor, sy / sigma, 1e-9, 0.0);
    assert_close(mg.safe.yield_factor, sy / (1.2 * sigma), 1e-9, 0.0);
    assert_close(mg.ultimate.ultimate_factor, su / (2.0 * sigma), 1e-9, 0.0);
    let goodman = 1.0 / (0.5 * sigma / se + 0.5 * sigma / su);
    assert_close(mg.rated.fatigue_factor.unwrap(), goodman, 1e-9, 0.0);
    assert!(mg.rated.buckling_factor.is_none());
    assert!(mg.to_string().contains("licensed practice"));
    // No fatigue strength known: no fatigue factor.
    let cube = Cantilever::new(
        material("C17200").unwrap(),
        mm(100.0),
        mm(20.0),
        mm(6.0),
        mm(30.0),
    );
    let mg = cube
        .unwrap()
        .margins(&rated, &OverloadFactors::default())
        .unwrap();
    assert!(mg.rated.fatigue_factor.is_none());
}

#[test]
fn small_angle_strain_transformation_identity() {
    // ε(θ + δ) = ε(θ) + δ·dε/dθ + O(δ²) with dε/dθ = −(εxx − εyy)·sin 2θ + γxy·cos 2θ (derivative
    // of the strain transformation, Timoshenko & Gere 4th ed. eq. 7-71, from memory), on a
    // combined load at every standard site of every element.
    let m = material("17-4 PH H900").unwrap();
    let load = Wrench::zero()
        .with(LoadComponent::Fx, 300.0)
        .with(LoadComponent::Fy, -40.0)
        .with(LoadComponent::Fz, 120.0)
        .with(LoadComponent::Mx, 2.0)
        .with(LoadComponent::My, -1.5)
        .with(LoadComponent::Mz, 0.7);
    let elements: Vec<Box<dyn SpringElement>> = vec![
        Box::new(Cantilever::new(m.clone(), mm(100.0), mm(20.0), mm(6.0), mm(30.0)).unwrap()),
        Box::new(
            Parallelogram::new(m.clone(), mm(50.0), mm(20.0), mm(2.0), mm(30.0), mm(8.0)).unwrap(),
        ),
        Box::new(
            Column::new(
                m.clone(),
                ColumnSection::Square { side: mm(15.0) },
                mm(60.0),
                mm(30.0),
            )
            .unwrap(),
        ),
        Box::new(
            ShearWeb::new(
                m.clone(),
                mm(150.0),
                mm(40.0),
                mm(30.0),
                mm(5.0),
                mm(4.0),
                mm(70.0),
            )
            .unwrap(),
        ),
        Box::new(TorqueShaft::solid(m, mm(20.0), mm(100.0), mm(50.0)).unwrap()),
    ];
    let delta = 0.5f64.to_radians();
    for el in &elements {
        for site in el.sites() {
            let s = el.surface_strain(&site, &load).unwrap();
            for theta in [0.0, 30.0, 45.0, 90.0, -45.0] {
                let th = deg(theta);
                let exact = s.normal(deg(theta + delta.to_degrees())).value();
                let linear = s.normal(th).value() + delta * s.normal_rate(th).value();
                let scale = s.exx.value().abs() + s.eyy.value().abs() + s.gxy.value().abs();
                // Remainder bounded by δ²·max|d²ε/dθ²|/2 ≤ δ²·2·scale/2.
                assert!(
                    (exact - linear).abs() <= delta * delta * scale + 1e-20,
                    "{}",
                    el.kind()
                );
            }
        }
    }
}

#[test]
fn bad_parameters_give_typed_errors() {
    let m = material("7075-T6").unwrap();
    let e = Cantilever::new(m.clone(), mm(20.0), mm(10.0), mm(6.0), mm(5.0)).unwrap_err();
    assert!(matches!(e, PhysicsError::OutOfRange { .. }));
    assert!(e.to_string().contains("L/h = 3.333"), "{e}");
    assert!(matches!(
        Cantilever::new(m.clone(), mm(-20.0), mm(10.0), mm(1.0), mm(5.0)),
        Err(PhysicsError::InvalidParameter { .. })
    ));
    assert!(matches!(
        Cantilever::new(m.clone(), mm(100.0), mm(10.0), mm(5.0), mm(120.0)),
        Err(PhysicsError::OutOfRange { .. })
    ));
    assert!(matches!(
        Column::new(
            m.clone(),
            ColumnSection::Round { diameter: mm(20.0) },
            mm(30.0),
            mm(15.0)
        ),
        Err(PhysicsError::OutOfRange { .. })
    ));
    assert!(matches!(
        Column::new(
            m.clone(),
            ColumnSection::HollowSquare {
                side: mm(20.0),
                wall: mm(5.0)
            },
            mm(100.0),
            mm(50.0)
        ),
        Err(PhysicsError::OutOfRange { .. })
    ));
    assert!(matches!(
        ShearWeb::new(
            m.clone(),
            mm(100.0),
            mm(40.0),
            mm(30.0),
            mm(5.0),
            mm(4.0),
            mm(20.0)
        ),
        Err(PhysicsError::OutOfRange { .. })
    ));
    assert!(matches!(
        Parallelogram::new(m.clone(), mm(50.0), mm(20.0), mm(2.0), mm(4.0), mm(8.0)),
        Err(PhysicsError::OutOfRange { .. })
    ));
    assert!(matches!(
        TorqueShaft::solid(m.clone(), mm(f64::NAN), mm(100.0), mm(50.0)),
        Err(PhysicsError::InvalidParameter { .. })
    ));
    // A site off the face or outside the element.
    let beam = Cantilever::new(m.clone(), mm(100.0), mm(20.0), mm(6.0), mm(30.0)).unwrap();
    let w = Wrench::only(LoadComponent::Fz, 1.0);
    let off = Site::new("off", Face::PlusZ, mm(30.0)).moved(mm(0.0), mm(10.5));
    assert!(matches!(
        beam.surface_strain(&off, &w),
        Err(PhysicsError::OutOfRange { .. })
    ));
    let beyond = Site::new("beyond", Face::PlusZ, mm(101.0));
    assert!(matches!(
        beam.surface_strain(&beyond, &w),
        Err(PhysicsError::OutOfRange { .. })
    ));
    assert!(beam.site("nowhere").is_err());
    assert!(OverloadFactors::new(0.9, 3.0).is_err());
    assert!(
        beam.natural_frequency(&AttachedMass::mass(Mass::new::<kilogram>(-1.0)))
            .is_err()
    );
}

#[test]
fn material_table_values_are_plausible_and_sourced() {
    // Cross-checks within the table that do not depend on the recalled numbers: every entry has
    // a source, ν in (0, 0.5), yield ≤ ultimate, and density ordering Ti < steel (common
    // knowledge of the metals, common practice).
    let all = gaugebook::materials();
    assert!(all.len() >= 9);
    for m in &all {
        assert!(m.source().contains("from memory"), "{}", m.name());
        assert!(m.yield_strength() <= m.ultimate_strength());
        assert!(m.youngs_modulus().get::<megapascal>() > 50e3);
    }
    let ti = material("Ti64").unwrap().density();
    let st = material("4340").unwrap().density();
    assert!(ti < st);
}

#[cfg(feature = "script")]
mod design_cell {
    //! The stdlib module `design_cell.rhai`, run in a session: its sizing must reproduce the
    //! target through the Rust API at the dimension it returns.

    use std::sync::Arc;

    use gaugebook::script::{CaptureSink, Session, SessionOptions};
    use gaugebook::units::{ElectricalResistance, Length};
    use gaugebook::{Arrangement, Gauge, Layout, Parallelogram, material};
    use uom::si::electrical_resistance::ohm;
    use uom::si::length::millimeter;

    use crate::common::assert_close;

    fn run(code: &str) -> Result<String, String> {
        let mut s = Session::new(SessionOptions::default()).map_err(|e| e.to_string())?;
        s.set_output(Arc::new(CaptureSink::default()));
        match s.eval_cell(code, "design_cell test") {
            Ok(out) => Ok(out
                .value
                .map(|b| b.get("text/plain").unwrap_or("").to_string())
                .unwrap_or_default()),
            Err(e) => Err(e.render()),
        }
    }

    #[test]
    fn sizes_a_parallelogram_for_the_target_output() {
        let t = run(r#"
            import "design_cell" as dc;
            let d = dc::size(150.0 * N, 2.0 * mV_per_V, #{ material: "2024-T351" });
            assert_eq(d.kind, "parallelogram");
            assert_eq(d.wiring, "full-bending");
            assert_close(d.rated_output, 2.0 * mV_per_V, 1e-6);
            // The trade-offs: the sized design between its ±15 % neighbours, thinner giving
            // more output (RO ∝ 1/h² for the flexures), with the cautions.
            assert_eq(d.trade_offs.len, 3);
            assert_close(d.trade_offs.rated_output[1], 2.0 * mV_per_V, 1e-6);
            assert_close(d.trade_offs.rated_output[0], 2.0 * mV_per_V / (0.85 * 0.85), 1e-6);
            assert(d.report.contains("design sweep over flexure thickness"));
            assert(d.report.contains("proven by test"));
            assert(d.report.contains("licensed practice"));
            d.dimension.value("mm")
        "#)
        .unwrap();
        let h: f64 = t.trim().parse().unwrap();
        // The same design through the Rust API (the stdlib's fixed proportions).
        let mm = Length::new::<millimeter>;
        let p = Parallelogram::new(
            material("2024-T351").unwrap(),
            mm(40.0),
            mm(20.0),
            mm(h),
            mm(30.0),
            mm(6.0),
        )
        .unwrap();
        let g = Gauge::new(ElectricalResistance::new::<ohm>(350.0), 2.0).unwrap();
        let l = Layout::standard(p, &g, Arrangement::FullBending, 150.0).unwrap();
        assert_close(l.report(0).unwrap().rated_output.mv_per_v(), 2.0, 1e-6, 0.0);
    }

    #[test]
    fn sizes_a_torque_shaft_and_a_column() {
        // Full-shear shaft: RO = GF·γ/2 = GF·8T/(πGd³) (Timoshenko & Gere, Mechanics of
        // Materials, 4th ed., §3.3, from memory), so d = (2·8T/(πG·RO))^(1/3) for GF 2.
        let t = run(r#"
            import "design_cell" as dc;
            let d = dc::size(50.0 * N_m, 1.5 * mV_per_V, #{});
            assert_eq(d.kind, "torque shaft");
            assert_eq(d.wiring, "full-shear");
            d.dimension.value("mm")
        "#)
        .unwrap();
        let d: f64 = t.trim().parse().unwrap();
        let g = material("17-4 PH H1025")
            .unwrap()
            .shear_modulus()
            .get::<uom::si::pressure::pascal>();
        let expected = (2.0 * 8.0 * 50.0 / (std::f64::consts::PI * g * 1.5e-3)).cbrt() * 1e3;
        assert_close(d, expected, 1e-6, 0.0);
        let t = run(r#"
            import "design_cell" as dc;
            let d = dc::size(200.0 * kN, 1.0 * mV_per_V, #{});
            assert_eq(d.wiring, "full-poisson");
            d.kind
        "#)
        .unwrap();
        assert!(t.contains("column"), "{t}");
    }

    #[test]
    fn says_so_when_no_design_meets_the_target() {
        // 5 mV/V from an aluminium column needs ~3.8e-3 strain: it yields at 150 % overload.
        let e = run(r#"
            import "design_cell" as dc;
            dc::size(100.0 * kN, 5.0 * mV_per_V, #{ material: "2024-T351" })
        "#)
        .unwrap_err();
        assert!(
            e.contains("yields at the safe overload") || e.contains("no column"),
            "{e}"
        );
    }
}

#[cfg(feature = "script")]
mod script_sweep {
    //! `sweep` and `solve_for_output` in a session: the table repeats the closed-form rated
    //! output of a full bending bridge on a cantilever, and agrees with the Rust API.

    use std::sync::Arc;

    use gaugebook::script::{CaptureSink, Session, SessionOptions};
    use gaugebook::units::{ElectricalResistance, Length};
    use gaugebook::{
        Arrangement, Cantilever, DesignCriteria, DesignPoint, Gauge, Layout, material,
    };
    use uom::si::electrical_resistance::ohm;
    use uom::si::length::millimeter;
    use uom::si::pressure::pascal;

    use crate::common::assert_close;

    fn session() -> Session {
        let mut s = Session::new(SessionOptions::default()).unwrap();
        s.set_output(Arc::new(CaptureSink::default()));
        s
    }

    fn eval(s: &mut Session, code: &str) -> Result<gaugebook::MimeBundle, String> {
        match s.eval_cell(code, "sweep test") {
            Ok(out) => Ok(out.value.unwrap_or_else(|| gaugebook::MimeBundle::text(""))),
            Err(e) => Err(e.render()),
        }
    }

    const BEAM: &str = r#"
        let beam = |h| layout(cantilever(#{ material: "7075-T6", length: 120.0 * mm,
            width: 25.0 * mm, depth: h, station: 40.0 * mm }), #{ r0: 350.0 * ohm, gf: 2.0 },
            "full-bending", 100.0 * N);
    "#;

    #[test]
    fn sweep_table_repeats_the_closed_form_rated_output() {
        let mut s = session();
        eval(&mut s, BEAM).unwrap();
        let t = eval(
            &mut s,
            r#"let t = sweep(beam, #{ parameter: "depth",
                values: [4.0 * mm, 6.0 * mm, 8.0 * mm, 30.0 * mm] }); t"#,
        )
        .unwrap();
        let text = t.get("text/plain").unwrap();
        assert!(text.starts_with("design sweep over depth"), "{text}");
        assert!(text.contains("skipped depth = 30 mm"), "{text}");
        assert!(text.contains("proven by test"), "{text}");
        let html = t.get("text/html").unwrap();
        assert!(html.contains("<table class=\"gaugebook-sweep\">"), "{html}");
        assert_eq!(html.matches("<tr>").count(), 4, "{html}");
        // Four active arms: RO = GF·ε, ε = 6F(L − x)/(E·b·h²) (Timoshenko & Gere, Mechanics of
        // Materials, 4th ed., §5.5, from memory), at h = 6 mm.
        let ro: f64 = eval(&mut s, "t.rated_output[1].value(\"mV/V\")")
            .unwrap()
            .get("text/plain")
            .unwrap()
            .parse()
            .unwrap();
        let m = material("7075-T6").unwrap();
        let e = m.youngs_modulus().get::<pascal>();
        let eps = 6.0 * 100.0 * 0.08 / (e * 0.025 * 0.006f64.powi(2));
        assert_close(ro, 2.0 * eps * 1e3, 1e-5, 0.0);
        // The peak stress and yield factor agree with the Rust API at that depth.
        let mm = Length::new::<millimeter>;
        let beam = Cantilever::new(m, mm(120.0), mm(25.0), mm(6.0), mm(40.0)).unwrap();
        let g = Gauge::new(ElectricalResistance::new::<ohm>(350.0), 2.0).unwrap();
        let l = Layout::standard(beam, &g, Arrangement::FullBending, 100.0).unwrap();
        let p = DesignPoint::evaluate(&l, &DesignCriteria::default(), vec![]).unwrap();
        let yf: f64 = eval(&mut s, "t.rows[1].yield_factor")
            .unwrap()
            .get("text/plain")
            .unwrap()
            .parse()
            .unwrap();
        assert_close(yf, p.yield_factor, 1e-5, 0.0);
        assert!(p.meets_margins);
    }

    #[test]
    fn solve_finds_the_depth_and_says_when_none_meets_the_margin() {
        let mut s = session();
        eval(&mut s, BEAM).unwrap();
        // RO ∝ 1/h² on this beam, so the depth for 1.5 mV/V is h₆·√(RO₆/1.5).
        let h: f64 = eval(
            &mut s,
            r#"let d = solve_for_output(beam, #{ parameter: "depth", lo: 3.0 * mm, hi: 12.0 * mm,
                target: 1.5 * mV_per_V });
            assert(d.caution.contains("proven by test"));
            d.depth.value("mm")"#,
        )
        .unwrap()
        .get("text/plain")
        .unwrap()
        .parse()
        .unwrap();
        let e = material("7075-T6")
            .unwrap()
            .youngs_modulus()
            .get::<pascal>();
        let ro6 = 2.0 * 6.0 * 100.0 * 0.08 / (e * 0.025 * 0.006f64.powi(2));
        assert_close(h, 6.0 * (ro6 / 1.5e-3).sqrt(), 1e-9, 0.0);
        // 8 mV/V needs a beam so thin that it yields at the 150 % overload: the gauges at
        // x = 40 mm see 2/3 of the root strain, so RO = 2·(2/3)·σ/E reaches the yield point
        // (503 MPa) at 1.5 × capacity near 6.2 mV/V.
        let err = eval(
            &mut s,
            r#"solve_for_output(beam, #{ parameter: "depth", lo: 2.0 * mm, hi: 12.0 * mm,
                target: 8.0 * mV_per_V })"#,
        )
        .unwrap_err();
        assert!(err.contains("yield factor at the safe overload"), "{err}");
        assert!(err.contains("searching `depth`"), "{err}");
        // A target outside what the interval reaches.
        let err = eval(
            &mut s,
            r#"solve_for_output(beam, #{ lo: 6.0 * mm, hi: 12.0 * mm, target: 4.0 * mV_per_V })"#,
        )
        .unwrap_err();
        assert!(err.contains("spans"), "{err}");
        // A build refused at a bound names the value.
        let err = eval(
            &mut s,
            r#"solve_for_output(beam, #{ parameter: "depth", lo: 3.0 * mm, hi: 40.0 * mm,
                target: 1.0 * mV_per_V })"#,
        )
        .unwrap_err();
        assert!(err.contains("at depth = 40 mm"), "{err}");
    }
}
