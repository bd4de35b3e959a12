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

mod leads_and_shunts {
    use gaugebook::units::{Area, ElectricalResistance, Length, PowerDensity, TemperatureInterval};
    use gaugebook::{
        ArmId, Arrangement, Excitation, Gauge, GaugeDissipation, LeadWire, OutputRatio,
        PhysicsError, QuarterLeads, QuarterWiring, ShuntCalibration, ShuntDefinition, Strain,
        SupplyLeads, SupplyWiring,
    };
    use uom::si::area::square_millimeter;
    use uom::si::electric_potential::volt;
    use uom::si::electrical_resistance::{kiloohm, ohm};
    use uom::si::heat_flux_density::watt_per_square_meter;
    use uom::si::length::{meter, millimeter};
    use uom::si::power::watt;
    use uom::si::temperature_interval::kelvin;

    use crate::common::assert_close;

    fn ohms(v: f64) -> ElectricalResistance {
        ElectricalResistance::new::<ohm>(v)
    }

    fn dk(v: f64) -> TemperatureInterval {
        TemperatureInterval::new::<kelvin>(v)
    }

    fn gauge(r: f64) -> Gauge {
        Gauge::new(ohms(r), 2.0).unwrap()
    }

    #[test]
    fn copper_wire_resistance_per_metre() {
        // IEC 60028 (from memory): annealed copper 1/58 Ω·mm²/m at 20 °C, so 100 m of 1 mm²
        // is 1.724 14 Ω.
        let w = LeadWire::copper_wire(
            Length::new::<meter>(100.0),
            Area::new::<square_millimeter>(1.0),
        )
        .unwrap();
        assert_close(w.resistance().get::<ohm>(), 100.0 / 58.0, 1e-14, 0.0);
        // IEC 60028 / NIST Handbook 100 (from memory): α20 = 0.003 93 K⁻¹.
        assert_close(
            w.resistance_after(dk(50.0)).unwrap().get::<ohm>(),
            100.0 / 58.0 * 1.1965,
            1e-14,
            0.0,
        );
    }

    #[test]
    fn two_wire_desensitisation_and_apparent_strain() {
        // Dally & Riley, 4th ed., ch. 6 and Window, 2nd ed., ch. 3 (from memory): two-wire leads
        // desensitise by R_g/(R_g + 2R_L) and, warming by ΔT, read ε ≈ 2R_L·α·ΔT/(F·R_g).
        let q = QuarterLeads::new(
            &gauge(350.0),
            QuarterWiring::TwoWire,
            LeadWire::copper(ohms(0.2)).unwrap(),
        );
        assert_close(q.sensitivity_factor(), 350.0 / 350.4, 1e-15, 0.0);
        let app = q.apparent_strain(dk(20.0)).unwrap();
        assert_close(
            app.value(),
            2.0 * 0.2 * 0.00393 * 20.0 / (2.0 * 350.0),
            2e-3,
            0.0,
        );
        // And the span: a true 1000 µε reads R_g/(R_g + 2R_L) of it, to within the bridge's
        // nonlinearity with unequal arms (well under 0.1 %).
        let ind = q
            .indicated_strain(Strain::from_microstrain(1000.0), dk(0.0))
            .unwrap();
        assert_close(ind.microstrain(), 1000.0 * 350.0 / 350.4, 1e-3, 0.0);
        assert_close(q.corrected_strain(ind).microstrain(), 1000.0, 1e-3, 0.0);
    }

    #[test]
    fn three_wire_cancels_lead_temperature() {
        // Window, 2nd ed., ch. 3 (from memory): with a lead in each of the adjacent arms R1 and R2
        // and R1 = R2 at the start, a lead temperature change leaves the bridge balanced.
        let q = QuarterLeads::new(
            &gauge(120.0),
            QuarterWiring::ThreeWire,
            LeadWire::copper(ohms(2.0)).unwrap(),
        );
        for t in [-40.0, 10.0, 80.0] {
            assert!(q.apparent_strain(dk(t)).unwrap().value().abs() < 1e-15);
        }
        assert_close(q.sensitivity_factor(), 120.0 / 122.0, 1e-15, 0.0);
        assert!(q.zero_offset().unwrap().value().abs() < 1e-16);
        // The cancellation needs matched arms: an 121 Ω completion leaves a residue.
        let q = q.with_completion(ohms(121.0)).unwrap();
        assert!(q.apparent_strain(dk(30.0)).unwrap().value().abs() > 1e-8);
    }

    #[test]
    fn remote_sense_removes_supply_lead_effects() {
        // Window, 2nd ed., ch. 3 (from memory); common practice: four-wire span factor
        // R_b/(R_b + 2R_L), none with six wires, and no zero shift in either.
        let lead = LeadWire::copper(ohms(1.5)).unwrap();
        let four = SupplyLeads::new(ohms(350.0), SupplyWiring::FourWire, lead).unwrap();
        let six = SupplyLeads::new(ohms(350.0), SupplyWiring::SixWire, lead).unwrap();
        assert_close(
            four.sensitivity_factor(dk(0.0)).unwrap(),
            350.0 / 353.0,
            1e-15,
            0.0,
        );
        assert_eq!(six.span_error(dk(40.0)).unwrap(), 0.0);
        // Linear form of the span change: ≈ −2R_L·α·ΔT/(R_b + 2R_L).
        assert_close(
            four.span_error(dk(40.0)).unwrap(),
            -2.0 * 1.5 * 0.00393 * 40.0 / 353.0,
            2e-3,
            0.0,
        );
        let r = OutputRatio::from_mv_per_v(2.0);
        let back = four
            .corrected_ratio(four.seen_ratio(r, dk(25.0)).unwrap(), dk(25.0))
            .unwrap();
        assert_close(back.value(), r.value(), 1e-14, 0.0);
    }

    #[test]
    fn shunt_resistance_equivalent_worked_value() {
        // Dally & Riley, 4th ed., ch. 6 (from memory): ε = −R/(F(R + R_s)); for R = 350 Ω and
        // F = 2 a 174.65 kΩ shunt simulates −1000 µε.
        let c = ShuntCalibration::simulate(
            Arrangement::Quarter,
            &gauge(350.0),
            0.3,
            ArmId::R1,
            ElectricalResistance::new::<kiloohm>(174.65),
            ShuntDefinition::ResistanceEquivalent,
        )
        .unwrap();
        assert_close(c.strain().microstrain(), -1000.0, 1e-12, 0.0);
        assert_eq!(c.definition(), ShuntDefinition::ResistanceEquivalent);
    }

    #[test]
    fn shunt_definitions_agree_on_the_active_quarter_arm() {
        // Closed-form identity: the quarter-bridge exact inverse undoes a change in R1 exactly.
        for rs in [10.0e3, 59.65e3, 174.65e3, 1.0e6] {
            let sim = |d| {
                ShuntCalibration::simulate(
                    Arrangement::Quarter,
                    &gauge(350.0),
                    0.3,
                    ArmId::R1,
                    ohms(rs),
                    d,
                )
                .unwrap()
                .strain()
                .value()
            };
            assert_close(
                sim(ShuntDefinition::IndicatedReading),
                sim(ShuntDefinition::ResistanceEquivalent),
                1e-12,
                0.0,
            );
        }
    }

    #[test]
    fn shunt_in_a_full_bridge_reads_a_quarter_of_its_arm_strain() {
        // Closed form: one arm of a full bending bridge moved by x reads x/(4+2x) = F·ε_ind, so
        // the indicated strain is about the resistance-equivalent one over the bridge factor 4.
        let g = gauge(350.0);
        let rs = ElectricalResistance::new::<kiloohm>(87.15);
        let re = ShuntCalibration::simulate(
            Arrangement::FullBending,
            &g,
            0.3,
            ArmId::R2,
            rs,
            ShuntDefinition::ResistanceEquivalent,
        )
        .unwrap();
        let ind = ShuntCalibration::simulate(
            Arrangement::FullBending,
            &g,
            0.3,
            ArmId::R2,
            rs,
            ShuntDefinition::IndicatedReading,
        )
        .unwrap();
        assert_close(ind.strain().value(), re.strain().value() / 4.0, 3e-3, 0.0);
        let x = -350.0 / (350.0 + 87150.0);
        // R2 falls by x: output −x/(4+2x) > 0, read through F·ε = r.
        assert_close(ind.strain().value(), -x / (4.0 + 2.0 * x) / 2.0, 1e-12, 0.0);
    }

    #[test]
    fn shunt_for_target_round_trips() {
        // Closed-form identity: simulate(resistor_for(ε)) = ε, for every arrangement, arm and
        // definition where a shunt can reach the target.
        let g = gauge(350.0);
        for a in Arrangement::ALL {
            for arm in [ArmId::R1, ArmId::R2, ArmId::R3, ArmId::R4] {
                for d in [
                    ShuntDefinition::ResistanceEquivalent,
                    ShuntDefinition::IndicatedReading,
                ] {
                    for ue in [-2000.0, -500.0, 500.0, 2000.0] {
                        match ShuntCalibration::resistor_for(
                            a,
                            &g,
                            0.3,
                            arm,
                            Strain::from_microstrain(ue),
                            d,
                        ) {
                            Ok(c) => assert_close(c.strain().microstrain(), ue, 1e-9, 0.0),
                            Err(e) => assert!(matches!(e, PhysicsError::NoSolution { .. }), "{e}"),
                        }
                    }
                }
            }
        }
        // And a tension target across R2 works where across R1 it cannot.
        let ok = ShuntCalibration::resistor_for(
            Arrangement::Quarter,
            &g,
            0.3,
            ArmId::R2,
            Strain::from_microstrain(1000.0),
            ShuntDefinition::IndicatedReading,
        );
        assert!(ok.is_ok());
    }

    #[test]
    fn gauge_power_and_power_density() {
        // Closed form: an equal-arm bridge at V puts V/2 across each arm, P = V²/(4R).
        let g = gauge(350.0)
            .with_grid(
                Length::new::<millimeter>(6.0),
                Length::new::<millimeter>(2.5),
            )
            .unwrap();
        let ex =
            Excitation::voltage(gaugebook::units::ElectricPotential::new::<volt>(5.0)).unwrap();
        for a in Arrangement::ALL {
            let d = GaugeDissipation::in_bridge(&g, a, ex).unwrap();
            assert_close(d.power().get::<watt>(), 25.0 / 1400.0, 1e-14, 0.0);
            assert_close(
                d.power_density().unwrap().get::<watt_per_square_meter>(),
                25.0 / 1400.0 / 15.0e-6,
                1e-12,
                0.0,
            );
        }
        // Round trip: at the maximum excitation the density equals the limit.
        let lim = PowerDensity::new::<watt_per_square_meter>(3100.0);
        let v = GaugeDissipation::max_excitation(&g, lim).unwrap();
        let d =
            GaugeDissipation::in_bridge(&g, Arrangement::Quarter, Excitation::voltage(v).unwrap())
                .unwrap();
        assert_close(
            d.power_density().unwrap().get::<watt_per_square_meter>(),
            3100.0,
            1e-12,
            0.0,
        );
    }

    #[test]
    fn bad_lead_and_shunt_parameters_are_typed_errors() {
        assert!(LeadWire::copper(ohms(-0.1)).is_err());
        assert!(LeadWire::copper(ohms(f64::NAN)).is_err());
        assert!(
            SupplyLeads::new(
                ohms(0.0),
                SupplyWiring::FourWire,
                LeadWire::copper(ohms(1.0)).unwrap()
            )
            .is_err()
        );
        let q = QuarterLeads::new(
            &gauge(350.0),
            QuarterWiring::TwoWire,
            LeadWire::copper(ohms(1.0)).unwrap(),
        );
        assert!(q.apparent_strain(dk(f64::NAN)).is_err());
        // 1 + αΔT ≤ 0 is outside the linear model.
        assert!(matches!(
            q.apparent_strain(dk(-300.0)),
            Err(PhysicsError::OutOfRange { .. })
        ));
        for rs in [0.0, -10.0, f64::NAN] {
            assert!(matches!(
                ShuntCalibration::simulate(
                    Arrangement::Quarter,
                    &gauge(350.0),
                    0.3,
                    ArmId::R1,
                    ohms(rs),
                    ShuntDefinition::IndicatedReading
                ),
                Err(PhysicsError::InvalidParameter { .. })
            ));
        }
        assert!(
            GaugeDissipation::max_excitation(
                &gauge(350.0),
                PowerDensity::new::<watt_per_square_meter>(1000.0)
            )
            .is_err()
        );
    }
}

#[test]
fn offset_trim_from_the_nominal_model_cancels_a_real_offset_to_first_order() {
    // Common practice: a zero offset r₀ is trimmed from the nominal equal-arm model; the real
    // bridge (imbalance in R3, unknown to the model) then reads zero up to terms in r₀².
    let r = ohms(350.0);
    let real = WheatstoneBridge::equal_arms(r)
        .unwrap()
        .with_arm(ArmId::R3, Arm::gauge(r, 0.002).unwrap());
    let offset = real.output_ratio();
    let nominal = WheatstoneBridge::equal_arms(r).unwrap();
    let t = nominal
        .trim_for_offset(ArmId::R2, TrimKind::Series, offset)
        .unwrap();
    let trimmed = real.with_arm(ArmId::R2, real.arm(ArmId::R2).with_trim(t));
    let residual = trimmed.output_ratio().value();
    assert!(
        residual.abs() < 2.0 * offset.value().powi(2) + 1e-18,
        "residual {residual}"
    );
    // Exact when the imbalance is in the model.
    let t = real.balance_trim(ArmId::R2, TrimKind::Series).unwrap();
    let exact = real.with_arm(ArmId::R2, real.arm(ArmId::R2).with_trim(t));
    assert!(exact.output_ratio().value().abs() < 1e-16);
}

/// The stdlib's arm-by-arm arrangements (stdlib/bridges.rhai) against the closed forms of
/// `bridge()`: closed-form identity through the script surface.
#[cfg(feature = "script")]
#[test]
fn stdlib_bridges_reproduce_the_named_arrangements() {
    use gaugebook::script::{Session, SessionOptions};
    let mut s = Session::new(SessionOptions::default()).expect("session");
    let code = r#"
        import "bridges" as b;
        let g = gauge(#{ r0: 350.0 * ohm, gf: 2.1 });
        let worst = 0.0;
        for name in ["quarter", "half-bending", "half-poisson", "full-bending", "full-poisson", "full-shear"] {
            for ue in [-3000.0, -10.0, 0.0, 750.0, 20000.0] {
                let e = q(ue, "ue");
                let closed = bridge(name, g, #{ nu: 0.3 }).output(e);
                let built = b::named(name, g, e, 0.3).ratio();
                let d = abs((built - closed).value("V/V"));
                if d > worst { worst = d; }
            }
        }
        worst
    "#;
    let out = s
        .eval_cell(code, "stdlib test")
        .unwrap_or_else(|e| panic!("{}", e.render()));
    let text = out
        .value
        .and_then(|b| b.get("text/plain").map(str::to_string))
        .unwrap_or_default();
    let worst: f64 = text
        .trim()
        .parse()
        .unwrap_or_else(|_| panic!("not a number: {text}"));
    // The general bridge's rounding near balance is absolute, about 1e-16 V/V.
    assert!(worst < 1e-15, "largest difference {worst} V/V");
    let bad = s.eval_cell(r#"import "bridges" as b; b::named("eighth", gauge(#{ r0: 350.0 * ohm, gf: 2.0 }), q("1 ue"), 0.3)"#, "bad");
    assert!(bad.is_err());
}

/// Bad parameters through the script surface are catchable errors of the physics kind.
#[cfg(feature = "script")]
#[test]
fn script_bad_parameters_are_typed_errors() {
    use gaugebook::script::{Session, SessionOptions};
    let mut s = Session::new(SessionOptions::default()).expect("session");
    let cases = [
        (r#"gauge(#{ r0: -350.0 * ohm, gf: 2.0 })"#, "PhysicsError"),
        (r#"gauge(#{ r0: 350.0 * ohm, gf: 0.0 })"#, "PhysicsError"),
        (
            r#"gauge(#{ r0: 350.0 * ohm, gf: 2.0, gain: 3 })"#,
            "ArgumentError",
        ),
        (
            r#"bridge("half-poisson", gauge(#{ r0: 350.0 * ohm, gf: 2.0 }))"#,
            "ArgumentError",
        ),
        (
            r#"bridge("full-poisson", gauge(#{ r0: 350.0 * ohm, gf: 2.0 }), #{ nu: 0.5 })"#,
            "PhysicsError",
        ),
        (
            r#"bridge("quarter", gauge(#{ r0: 350.0 * ohm, gf: 2.0 })).strain(q("600 mV/V"))"#,
            "PhysicsError",
        ),
        (
            r#"bridge("quarter", gauge(#{ r0: 350.0 * ohm, gf: 2.0 })).gauge_power(q("-5 V"))"#,
            "PhysicsError",
        ),
        (
            r#"signal_chain(#{ excitation: q("0 V"), gain: 128, bits: 24, ratiometric: 1.0 })"#,
            "PhysicsError",
        ),
        (
            r#"plane_stress(q("1 ue"), q("1 ue"), q("0 ue"), #{ E: q("200 GPa"), nu: 0.7 })"#,
            "PhysicsError",
        ),
    ];
    for (code, kind) in cases {
        match s.eval_cell(code, "bad") {
            Ok(out) => panic!("{code}: expected an error, got {:?}", out.value),
            Err(e) => {
                if !kind.is_empty() {
                    assert_eq!(e.kind, kind, "{code}: {}", e.render());
                }
            }
        }
    }
}

#[cfg(feature = "script")]
#[test]
fn script_values_print_readably() {
    use gaugebook::script::{Session, SessionOptions};
    let mut s = Session::new(SessionOptions::default()).expect("session");
    let mut show = |code: &str| {
        let out = s
            .eval_cell(code, "show")
            .unwrap_or_else(|e| panic!("{}", e.render()));
        out.value
            .and_then(|b| b.get("text/plain").map(str::to_string))
            .unwrap_or_default()
    };
    let g = r#"let g = gauge(#{ r0: 350.0 * ohm, gf: 2.0 }); "#;
    assert_eq!(show(&format!("{g} g")), "gauge 350 Ω, GF 2");
    assert_eq!(
        show(&format!(r#"{g} bridge("quarter", g).output(q("1000 ue"))"#)),
        "0.4995 mV/V"
    );
    let c = show(&format!(
        r#"{g} bridge("quarter", g).shunt_cal(#{{ arm: 1, shunt: q("174.65 kohm") }})"#
    ));
    assert!(
        c.starts_with("shunt calibration")
            && c.contains("resistance-equivalent")
            && c.contains("-1000 µε"),
        "{c}"
    );
}
