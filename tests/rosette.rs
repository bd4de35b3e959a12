//! Reference checks for rosettes, transverse-sensitivity corrections and plane stress.

use gaugebook::units::{Angle, ElectricalResistance, Modulus, Stress};
use gaugebook::{
    DeltaRosette, Elastic, Gauge, PhysicsError, PlaneStress, RectangularRosette, Strain,
    StrainState, correct_orthogonal, correct_single, correct_uniaxial,
};
use proptest::prelude::*;
use uom::si::angle::degree;
use uom::si::electrical_resistance::ohm;
use uom::si::pressure::{gigapascal, pascal};

use crate::common::assert_close;

fn ue(v: f64) -> Strain {
    Strain::from_microstrain(v)
}

fn deg(v: f64) -> Angle {
    Angle::new::<degree>(v)
}

#[test]
fn rectangular_rosette_matches_numpy_eigh() {
    // numpy 2.4.6: numpy.linalg.eigh([[εx, γ/2], [γ/2, εy]]) with εx = 850, εy = −320,
    // γ = 2(−210) − 850 + 320 µε gives 1018.5582260184013 and −488.55822601840134 µε, and the
    // ε₁ eigenvector at −19.53770900900875° (arctan2 of its components, folded into (−90, 90]).
    let p = RectangularRosette::new(ue(850.0), ue(-210.0), ue(-320.0)).principal();
    assert_close(p.max().microstrain(), 1018.5582260184013, 1e-12, 0.0);
    assert_close(p.min().microstrain(), -488.55822601840134, 1e-12, 0.0);
    assert_close(p.angle().get::<degree>(), -19.53770900900875, 1e-10, 0.0);
    // Same call for 0/45/90 = −400/300/600 µε: 638.5164807134505, −438.51648071345033, 79.09929525682409°.
    let p = RectangularRosette::new(ue(-400.0), ue(300.0), ue(600.0)).principal();
    assert_close(p.max().microstrain(), 638.5164807134505, 1e-12, 0.0);
    assert_close(p.min().microstrain(), -438.51648071345033, 1e-12, 0.0);
    assert_close(p.angle().get::<degree>(), 79.09929525682409, 1e-10, 0.0);
    assert_close(
        p.max_shear().microstrain(),
        638.5164807134505 + 438.51648071345033,
        1e-12,
        0.0,
    );
}

#[test]
fn delta_rosette_matches_numpy() {
    // numpy 2.4.6: numpy.linalg.solve of εθ = εx cos²θ + εy sin²θ + γ sinθ cosθ at 0/60/120° for
    // 620/−140/410 µε gives εy = −26.66666666666653, γ = −635.0852961085886 µε; eigh then gives
    // 749.8529173161958 and −156.5195839828624 µε, ε₁ at −22.241156785415683°.
    let d = DeltaRosette::new(ue(620.0), ue(-140.0), ue(410.0));
    let s = d.strain_state();
    assert_close(s.ey().microstrain(), -26.66666666666653, 1e-12, 0.0);
    assert_close(s.gxy().microstrain(), -635.0852961085886, 1e-12, 0.0);
    let p = d.principal();
    assert_close(p.max().microstrain(), 749.8529173161958, 1e-12, 0.0);
    assert_close(p.min().microstrain(), -156.5195839828624, 1e-12, 0.0);
    assert_close(p.angle().get::<degree>(), -22.241156785415683, 1e-10, 0.0);
}

#[test]
fn principal_angle_quadrant_rule() {
    // Dally & Riley, Experimental Stress Analysis, 4th ed., ch. 9 (from memory): the angle is
    // to ε₁ and its quadrant follows the signs of γ_xy and ε_x − ε_y.
    let cases = [
        ((500.0, 100.0, 0.0), 0.0),
        ((100.0, 500.0, 0.0), 90.0),
        ((100.0, 100.0, 300.0), 45.0),
        ((100.0, 100.0, -300.0), -45.0),
        ((100.0, 500.0, 1.0e-6), 90.0),
        (
            (100.0, 500.0, 200.0),
            0.5 * (200.0f64).atan2(-400.0).to_degrees(),
        ),
    ];
    for ((ex, ey, g), expected) in cases {
        let p = StrainState::new(ue(ex), ue(ey), ue(g)).principal();
        assert_close(p.angle().get::<degree>(), expected, 1e-6, 1e-6);
        // The direction found carries ε₁.
        let along = StrainState::new(ue(ex), ue(ey), ue(g)).normal_at(p.angle());
        assert_close(along.value(), p.max().value(), 1e-12, 1e-18);
    }
}

#[test]
fn transverse_correction_undoes_the_gauge_model() {
    // Closed-form identity: readings made by the Gauge model (ASTM E251 terms) of a known state,
    // corrected, give the state back. The correction formulas are Dally & Riley, 4th ed.,
    // chs. 6 and 9 (from memory).
    let kt = 0.04;
    let g = Gauge::new(ElectricalResistance::new::<ohm>(350.0), 2.1)
        .unwrap()
        .with_transverse_sensitivity(kt)
        .unwrap();
    let s = StrainState::new(ue(900.0), ue(-250.0), ue(480.0));
    let read = |th: f64| g.indicated_strain(s.normal_at(deg(th)), s.normal_at(deg(th + 90.0)));
    let rect = RectangularRosette::new(read(0.0), read(45.0), read(90.0))
        .corrected(kt, 0.285)
        .unwrap();
    for (got, th) in rect.readings().iter().zip([0.0, 45.0, 90.0]) {
        assert_close(got.value(), s.normal_at(deg(th)).value(), 1e-12, 1e-18);
    }
    let delta = DeltaRosette::new(read(0.0), read(60.0), read(120.0))
        .corrected(kt, 0.285)
        .unwrap();
    for (got, th) in delta.readings().iter().zip([0.0, 60.0, 120.0]) {
        assert_close(got.value(), s.normal_at(deg(th)).value(), 1e-12, 1e-18);
    }
    let (x, y) = correct_orthogonal(read(0.0), read(90.0), kt, 0.285).unwrap();
    assert_close(x.value(), s.ex().value(), 1e-12, 0.0);
    assert_close(y.value(), s.ey().value(), 1e-12, 0.0);
    let single = correct_single(read(0.0), kt, 0.285, s.ey()).unwrap();
    assert_close(single.value(), s.ex().value(), 1e-12, 0.0);
    // Uniaxial stress in aluminium (ν = 0.33): ε_y = −0.33 ε_x.
    let (ex, ey) = (ue(1000.0), ue(-330.0));
    let uni = correct_uniaxial(g.indicated_strain(ex, ey), kt, 0.285, 0.33).unwrap();
    assert_close(uni.value(), ex.value(), 1e-12, 0.0);
}

#[test]
fn bad_correction_parameters_are_typed_errors() {
    let r = RectangularRosette::new(ue(1.0), ue(2.0), ue(3.0));
    for (kt, nu0) in [
        (1.0, 0.285),
        (-1.2, 0.285),
        (f64::NAN, 0.285),
        (0.02, 0.5),
        (0.02, -1.0),
    ] {
        assert!(matches!(
            r.corrected(kt, nu0),
            Err(PhysicsError::InvalidParameter { .. })
        ));
        assert!(
            DeltaRosette::new(ue(1.0), ue(2.0), ue(3.0))
                .corrected(kt, nu0)
                .is_err()
        );
    }
    assert!(correct_uniaxial(ue(1.0), 0.02, 0.285, f64::NAN).is_err());
    assert!(correct_single(Strain::new(f64::NAN), 0.02, 0.285, ue(0.0)).is_err());
}

fn steel() -> Elastic {
    Elastic::new(Modulus::new::<pascal>(200.0e9), 0.3).unwrap()
}

#[test]
fn plane_stress_hooke_matches_numpy_solve() {
    // numpy 2.4.6: numpy.linalg.solve(S, [εx, εy, γ]) with the plane-stress compliance
    // S = [[1/E, −ν/E, 0], [−ν/E, 1/E, 0], [0, 0, 2(1+ν)/E]], E = 200 GPa, ν = 0.3,
    // ε = (850, −320, −950) µε gives σ = 165714285.7142857, −14285714.285714297,
    // −73076923.07692307 Pa; numpy.linalg.eigh of the stress tensor gives principal stresses
    // 1.9164632048634744e+08 and −4.0217749057776034e+07 Pa; √(1.5 s:s) of its deviator gives
    // the von Mises stress 214600473.2529639 Pa.
    let e = StrainState::new(ue(850.0), ue(-320.0), ue(2.0 * -210.0 - 850.0 + 320.0));
    let s = PlaneStress::from_strain(&e, &steel());
    assert_close(s.sx().get::<pascal>(), 165714285.7142857, 1e-12, 0.0);
    assert_close(s.sy().get::<pascal>(), -14285714.285714297, 1e-11, 0.0);
    assert_close(s.txy().get::<pascal>(), -73076923.07692307, 1e-12, 0.0);
    let p = s.principal();
    assert_close(p.max().get::<pascal>(), 1.9164632048634744e+08, 1e-12, 0.0);
    assert_close(p.min().get::<pascal>(), -4.0217749057776034e+07, 1e-11, 0.0);
    assert_close(s.von_mises().get::<pascal>(), 214600473.2529639, 1e-12, 0.0);
    assert_close(p.von_mises().get::<pascal>(), 214600473.2529639, 1e-12, 0.0);
}

#[test]
fn principal_stress_direction_is_the_principal_strain_direction() {
    // Closed-form identity for an isotropic material (Timoshenko & Goodier, 3rd ed., from
    // memory): principal directions of stress and strain coincide.
    let e = RectangularRosette::new(ue(-400.0), ue(300.0), ue(600.0));
    let s = PlaneStress::from_strain(&e.strain_state(), &steel());
    assert_close(
        s.principal().angle().get::<degree>(),
        e.principal().angle().get::<degree>(),
        1e-10,
        0.0,
    );
}

#[test]
fn von_mises_of_uniaxial_and_pure_shear() {
    // Distortion-energy criterion (Timoshenko & Goodier, 3rd ed., from memory): uniaxial σ gives
    // σ; pure shear τ gives √3·τ; equal biaxial σ gives σ.
    let m = |v: f64| Stress::new::<pascal>(v * 1e6);
    assert_close(
        PlaneStress::new(m(250.0), m(0.0), m(0.0))
            .von_mises()
            .get::<pascal>(),
        250e6,
        1e-15,
        0.0,
    );
    assert_close(
        PlaneStress::new(m(0.0), m(0.0), m(100.0))
            .von_mises()
            .get::<pascal>(),
        100e6 * 3f64.sqrt(),
        1e-15,
        0.0,
    );
    assert_close(
        PlaneStress::new(m(80.0), m(80.0), m(0.0))
            .von_mises()
            .get::<pascal>(),
        80e6,
        1e-15,
        0.0,
    );
}

#[test]
fn bad_elastic_constants_are_typed_errors() {
    for (e, nu) in [
        (0.0, 0.3),
        (-1.0, 0.3),
        (f64::NAN, 0.3),
        (200.0, 0.5),
        (200.0, -1.0),
        (200.0, f64::NAN),
    ] {
        assert!(matches!(
            Elastic::new(Modulus::new::<gigapascal>(e), nu),
            Err(PhysicsError::InvalidParameter { .. })
        ));
    }
}

proptest! {
    #[test]
    fn rosette_closed_forms_equal_the_tensor_route(
        ex in -3000.0f64..3000.0, ey in -3000.0f64..3000.0, g in -3000.0f64..3000.0,
    ) {
        // Closed-form identity: readings generated from a state by strain transformation give
        // the same principal values through the closed forms and through the strain state.
        let s = StrainState::new(ue(ex), ue(ey), ue(g));
        let tensor = s.principal();
        let rect = RectangularRosette::new(s.normal_at(deg(0.0)), s.normal_at(deg(45.0)), s.normal_at(deg(90.0)));
        let delta = DeltaRosette::new(s.normal_at(deg(0.0)), s.normal_at(deg(60.0)), s.normal_at(deg(120.0)));
        for p in [rect.principal(), delta.principal()] {
            prop_assert!((p.max().microstrain() - tensor.max().microstrain()).abs() < 1e-8);
            prop_assert!((p.min().microstrain() - tensor.min().microstrain()).abs() < 1e-8);
            // Angles agree unless the state is (nearly) isotropic, where any angle is principal.
            if tensor.max_shear().microstrain() > 1e-3 {
                let d = (p.angle().get::<degree>() - tensor.angle().get::<degree>()).abs();
                prop_assert!(d < 1e-6 || (d - 180.0).abs() < 1e-6, "angle {d}");
            }
        }
    }

    #[test]
    fn hooke_round_trips(ex in -3000.0f64..3000.0, ey in -3000.0f64..3000.0, g in -3000.0f64..3000.0, nu in -0.9f64..0.49) {
        // Closed-form identity: stress from strain and back.
        let m = Elastic::new(Modulus::new::<gigapascal>(70.0), nu).unwrap();
        let e = StrainState::new(ue(ex), ue(ey), ue(g));
        let back = PlaneStress::from_strain(&e, &m).to_strain(&m);
        prop_assert!((back.ex().microstrain() - ex).abs() < 1e-7);
        prop_assert!((back.ey().microstrain() - ey).abs() < 1e-7);
        prop_assert!((back.gxy().microstrain() - g).abs() < 1e-7);
    }
}
