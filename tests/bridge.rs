//! Reference checks for bridges: the named arrangements against the general four-arm bridge,
//! exact inverses, bridge factors, nonlinearity, balance, trims and excitation.

use gaugebook::units::{ElectricCurrent, ElectricPotential, ElectricalResistance};
use gaugebook::{
    Arm, ArmId, Arrangement, Excitation, OutputRatio, PhysicsError, Strain, TrimKind,
    WheatstoneBridge,
};
use proptest::prelude::*;
use uom::si::electric_current::milliampere;
use uom::si::electric_potential::{millivolt, volt};
use uom::si::electrical_resistance::ohm;

use crate::common::assert_close;

fn ohms(v: f64) -> ElectricalResistance {
    ElectricalResistance::new::<ohm>(v)
}

fn volts(v: f64) -> Excitation {
    Excitation::voltage(ElectricPotential::new::<volt>(v)).unwrap()
}

#[test]
fn quarter_bridge_exact_output_and_inverse() {
    // Dally & Riley, Experimental Stress Analysis, 4th ed., ch. 6 (from memory), with R1 active
    // and equal arms: Vo/V = x/(4 + 2x), x = F·ε; inverse ε = 4r/(F(1 − 2r)).
    let q = Arrangement::Quarter;
    let r = q
        .output(Strain::from_microstrain(1000.0), 2.0, 0.3)
        .unwrap();
    assert_close(r.value(), 0.002 / 4.004, 1e-14, 0.0);
    let e = q
        .strain_from_output(OutputRatio::from_mv_per_v(1.0), 2.0, 0.3)
        .unwrap();
    assert_close(e.value(), 4.0e-3 / (2.0 * (1.0 - 2.0e-3)), 1e-14, 0.0);
}

#[test]
fn quarter_bridge_classic_worked_value() {
    // Perry & Lissner, The Strain Gage Primer, 2nd ed. (from memory): 1000 µε, F = 2, 10 V gives
    // about 5 mV linear; the exact value follows from x/(4+2x): 10 V·0.002/4.004 = 4.995 mV.
    let b = Arrangement::Quarter
        .bridge(ohms(120.0), Strain::from_microstrain(1000.0), 2.0, 0.3)
        .unwrap();
    let vo = b.output(volts(10.0)).unwrap().get::<millivolt>();
    assert_close(vo, 4.995004995004995, 1e-12, 0.0);
    let lin = Arrangement::Quarter
        .linear_output(Strain::from_microstrain(1000.0), 2.0, 0.3)
        .unwrap();
    assert_close(lin.value() * 10.0e3, 5.0, 1e-13, 0.0);
}

#[test]
fn bridge_factors_of_the_named_arrangements() {
    // Window, Strain Gauge Technology, 2nd ed., ch. 3 and Dally & Riley, 4th ed., ch. 7 (both
    // from memory): 1 (quarter), 2 (half bending), 1 + ν (half Poisson), 4 (full bending and
    // shear), 2(1 + ν) (full Poisson).
    let nu = 0.3;
    let expected = [1.0, 2.0, 1.3, 4.0, 2.6, 4.0];
    for (a, b) in Arrangement::ALL.into_iter().zip(expected) {
        assert_close(a.bridge_factor(nu).unwrap(), b, 1e-15, 0.0);
    }
}

#[test]
fn general_bridge_reproduces_each_named_arrangement() {
    // Closed-form identity: the closed forms are the general bridge with equal arms.
    for a in Arrangement::ALL {
        for ue in [-20000.0, -1500.0, -1.0, 0.0, 3.0, 800.0, 25000.0] {
            let e = Strain::from_microstrain(ue);
            let named = a.output(e, 2.13, 0.29).unwrap().value();
            let c = a.arm_coefficients(0.29).unwrap();
            let x = 2.13 * e.value();
            let arm = |ci: f64| Arm::gauge(ohms(350.0), ci * x).unwrap();
            let b = WheatstoneBridge::new([arm(c[0]), arm(c[1]), arm(c[2]), arm(c[3])]);
            // The general bridge subtracts products of nearly equal arms, so its error is
            // absolute (about 1e-16 V/V), not relative.
            assert_close(named, b.output_ratio().value(), 1e-12, 1e-15);
        }
    }
}

#[test]
fn bending_and_shear_arrangements_are_exactly_linear() {
    // Dally & Riley, 4th ed., ch. 6 (from memory): equal and opposite changes in adjacent arms
    // give an output linear in ΔR/R.
    for a in [
        Arrangement::HalfBending,
        Arrangement::FullBending,
        Arrangement::FullShear,
    ] {
        let e = Strain::from_microstrain(30000.0);
        assert_eq!(a.nonlinearity(e, 2.0, 0.3).unwrap(), 0.0);
        assert_close(
            a.output(e, 2.0, 0.3).unwrap().value(),
            a.linear_output(e, 2.0, 0.3).unwrap().value(),
            1e-14,
            0.0,
        );
    }
}

#[test]
fn quarter_bridge_nonlinearity() {
    // Dally & Riley, 4th ed., ch. 6 (from memory): η = x/(2 + x) for the quarter bridge with
    // equal arms; here in percent of the linear output.
    for ue in [100.0, 1000.0, 10000.0, -5000.0] {
        let x = 2.0 * ue * 1e-6;
        let n = Arrangement::Quarter
            .nonlinearity(Strain::from_microstrain(ue), 2.0, 0.3)
            .unwrap();
        assert_close(n, 100.0 * x / (2.0 + x), 1e-12, 0.0);
        // Definition check: 100·(linear − exact)/linear.
        let e = Strain::from_microstrain(ue);
        let lin = Arrangement::Quarter
            .linear_output(e, 2.0, 0.3)
            .unwrap()
            .value();
        let ex = Arrangement::Quarter.output(e, 2.0, 0.3).unwrap().value();
        assert_close(n, 100.0 * (lin - ex) / lin, 1e-9, 0.0);
    }
}

#[test]
fn balanced_bridge_gives_zero_output() {
    // Closed-form identity: R1·R3 = R2·R4 ⇒ Vo = 0 (Dally & Riley, 4th ed., ch. 6, from memory).
    let a = |v: f64| Arm::fixed(ohms(v)).unwrap();
    let b = WheatstoneBridge::new([a(120.0), a(350.0), a(1050.0), a(360.0)]);
    assert!(b.is_balanced(1e-14));
    assert_eq!(b.output(volts(10.0)).unwrap().get::<volt>(), 0.0);
    let i = Excitation::current(ElectricCurrent::new::<milliampere>(5.0)).unwrap();
    assert_eq!(b.output(i).unwrap().get::<volt>(), 0.0);
}

#[test]
fn current_excitation_output() {
    // Closed form: with current I into E+, Vo = I·(R1R3 − R2R4)/(R1 + R2 + R3 + R4).
    let a = |v: f64| Arm::fixed(ohms(v)).unwrap();
    let b = WheatstoneBridge::new([a(351.0), a(349.0), a(350.5), a(350.0)]);
    let i = Excitation::current(ElectricCurrent::new::<milliampere>(10.0)).unwrap();
    let vo = b.output(i).unwrap().get::<volt>();
    let expected = 0.01 * (351.0 * 350.5 - 349.0 * 350.0) / (351.0 + 349.0 + 350.5 + 350.0);
    assert_close(vo, expected, 1e-12, 0.0);
}

#[test]
fn balance_trims_null_the_output_in_every_arm() {
    // Closed-form identity: after the trim, R1·R3 = R2·R4.
    let r = ohms(350.0);
    for (off_arm, dr) in [
        (ArmId::R1, 0.003),
        (ArmId::R2, -0.002),
        (ArmId::R3, 0.0015),
        (ArmId::R4, 0.001),
    ] {
        let b = WheatstoneBridge::equal_arms(r)
            .unwrap()
            .with_arm(off_arm, Arm::gauge(r, dr).unwrap());
        let mut solved = 0;
        for arm in ArmId::ALL {
            for kind in [TrimKind::Series, TrimKind::Parallel] {
                match b.balanced(arm, kind) {
                    Ok(bal) => {
                        solved += 1;
                        assert!(bal.output_ratio().value().abs() < 1e-15, "{arm} {kind:?}");
                    }
                    Err(e) => assert!(matches!(e, PhysicsError::NoSolution { .. })),
                }
            }
        }
        // Every arm can be balanced by exactly one of the two kinds.
        assert_eq!(solved, 4);
    }
}

#[test]
fn series_trim_equals_the_offset_resistance_in_an_adjacent_arm() {
    // Closed form: R1 = R(1 + δ) is balanced by R·δ in series with R2 (R1R3 = (R2 + Rs)R4).
    let r = ohms(350.0);
    let b = WheatstoneBridge::equal_arms(r)
        .unwrap()
        .with_arm(ArmId::R1, Arm::gauge(r, 0.004).unwrap());
    let t = b.balance_trim(ArmId::R2, TrimKind::Series).unwrap();
    assert_close(t.resistance().get::<ohm>(), 1.4, 1e-12, 0.0);
}

#[test]
fn output_range_of_half_and_full_bridges() {
    // Closed form: with every arm above zero, a half bridge's |Vo/V| < 1/2, a full bridge's < 1.
    for a in Arrangement::ALL {
        let (lo, hi) = a.output_range(0.3).unwrap();
        let half = a.active_gauges() < 4;
        let lim = if half { 0.5 } else { 1.0 };
        assert_close(lo.value(), -lim, 1e-15, 0.0);
        assert_close(hi.value(), lim, 1e-15, 0.0);
        assert!(a.strain_from_output(hi, 2.0, 0.3).is_err());
    }
}

#[test]
fn bad_bridge_parameters_are_typed_errors() {
    let e = Strain::from_microstrain(100.0);
    for a in Arrangement::ALL {
        for gf in [0.0, -2.0, f64::NAN] {
            assert!(matches!(
                a.output(e, gf, 0.3),
                Err(PhysicsError::InvalidParameter { .. })
            ));
            assert!(a.inverse(gf, 0.3).is_err());
        }
        assert!(a.output(Strain::new(f64::NAN), 2.0, 0.3).is_err());
        assert!(
            a.strain_from_output(OutputRatio::new(f64::NAN), 2.0, 0.3)
                .is_err()
        );
        assert!(a.bridge(ohms(0.0), e, 2.0, 0.3).is_err());
    }
    for nu in [-1.0, 0.5, 0.6, f64::NAN] {
        assert!(Arrangement::HalfPoisson.output(e, 2.0, nu).is_err());
        assert!(
            Arrangement::FullPoisson
                .strain_from_output(OutputRatio::new(1e-3), 2.0, nu)
                .is_err()
        );
    }
    assert!(Excitation::voltage(ElectricPotential::new::<volt>(-1.0)).is_err());
    assert!(Excitation::current(ElectricCurrent::new::<milliampere>(0.0)).is_err());
    let b = WheatstoneBridge::equal_arms(ohms(350.0)).unwrap();
    // A variant built directly is re-checked where it is used.
    assert!(
        b.output(Excitation::Voltage(ElectricPotential::new::<volt>(0.0)))
            .is_err()
    );
    assert!(WheatstoneBridge::equal_arms(ohms(f64::NAN)).is_err());
    assert!(Arrangement::from_name("eighth").is_err());
}

#[test]
fn prepared_inverse_agrees_with_checked_inverse() {
    // Closed-form identity: the same formula, prepared once.
    for a in Arrangement::ALL {
        let inv = a.inverse(2.05, 0.31).unwrap();
        for r in [-0.2, -1e-3, 0.0, 2e-4, 0.3] {
            let checked = a
                .strain_from_output(OutputRatio::new(r), 2.05, 0.31)
                .unwrap();
            assert_eq!(inv.apply(r), checked.value());
        }
    }
}

proptest! {
    #[test]
    fn exact_inverse_round_trips(
        ai in 0usize..6,
        ue in -50000.0f64..50000.0,
        gf in 0.5f64..4.5,
        nu in -0.9f64..0.49,
    ) {
        // Closed-form identity: strain_from_output(output(ε)) = ε.
        let a = Arrangement::ALL[ai];
        let e = Strain::from_microstrain(ue);
        let r = a.output(e, gf, nu).unwrap();
        let back = a.strain_from_output(r, gf, nu).unwrap();
        prop_assert!((back.value() - e.value()).abs() <= 1e-12 * e.value().abs() + 1e-18);
    }

    #[test]
    fn general_bridge_output_is_antisymmetric_under_arm_swap(
        r1 in 10.0f64..5000.0, r2 in 10.0f64..5000.0, r3 in 10.0f64..5000.0, r4 in 10.0f64..5000.0,
    ) {
        // Closed-form identity: swapping R1↔R2 and R3↔R4 negates Vo/V.
        let a = |v: f64| Arm::fixed(ohms(v)).unwrap();
        let b = WheatstoneBridge::new([a(r1), a(r2), a(r3), a(r4)]);
        let s = WheatstoneBridge::new([a(r2), a(r1), a(r4), a(r3)]);
        prop_assert!((b.output_ratio().value() + s.output_ratio().value()).abs() < 1e-14);
    }
}
