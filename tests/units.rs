//! Units layer: conversion factors against NIST SP 811 and the SI Brochure, differential checks
//! against pint, property tests of the parser, display and dimension algebra, and error tests.
//!
//! NIST SP 811 (2008) Appendix B.8 lists factors to seven significant figures unless the factor
//! is exact; those are checked to 5e-7 relative (half a unit in the seventh figure), exact ones to
//! 1e-15. Neither document could be opened while these tests were written: every value cited
//! from them is recalled, hence `(from memory)`; the pint checks below are an independent source
//! computed with pint 0.25.3 in /work/pyref.

use gaugebook::units::{Force, Length, Pressure, Quantity, Unit, UnitError};
use gaugebook::{Dimension, Kind, OutputRatio, Strain};
use proptest::prelude::*;

use crate::common::assert_close;

/// Seven-figure factors of NIST SP 811 Appendix B.8 are rounded: half a unit in the 7th figure.
const B8: f64 = 5e-7;
/// Exact factors, up to floating-point rounding of the product.
const EXACT: f64 = 1e-15;

fn si(text: &str) -> f64 {
    Quantity::parse(text)
        .unwrap_or_else(|e| panic!("{text}: {e}"))
        .si()
}

fn factor(unit: &str) -> f64 {
    Unit::parse(unit)
        .unwrap_or_else(|e| panic!("{unit}: {e}"))
        .factor()
}

// ---------------------------------------------------------------------------------------------
// Reference checks: NIST SP 811 (2008) Appendix B.8 / B.9 and the SI Brochure (9th ed., 2019).

#[test]
fn nist_b8_lengths() {
    // NIST SP 811 (2008) B.8 (from memory): inch → metre 2.54 E-02 (exact).
    assert_close(factor("in"), 2.54e-2, EXACT, 0.0);
    // NIST SP 811 (2008) B.8 (from memory): foot → metre 3.048 E-01 (exact).
    assert_close(factor("ft"), 3.048e-1, EXACT, 0.0);
    // NIST SP 811 (2008) B.8 (from memory): mil → metre 2.54 E-05 (exact).
    assert_close(factor("mil"), 2.54e-5, EXACT, 0.0);
    // NIST SP 811 (2008) B.8 (from memory): microinch → metre 2.54 E-08 (exact).
    assert_close(factor("uin"), 2.54e-8, EXACT, 0.0);
}

#[test]
fn nist_b8_mass_and_force() {
    // NIST SP 811 (2008) B.8 (from memory): pound (avoirdupois) → kg 4.535 924 E-01; its
    // footnote gives the exact 0.453 592 37 kg.
    assert_close(factor("lb"), 4.535_924e-1, B8, 0.0);
    assert_close(factor("lb"), 0.453_592_37, EXACT, 0.0);
    // NIST SP 811 (2008) B.8 (from memory): pound-force → N 4.448 222 E+00.
    assert_close(factor("lbf"), 4.448_222, B8, 0.0);
    // Exact: lbf = 0.453 592 37 kg × 9.806 65 m/s² (the definitions of lb and gn).
    assert_close(factor("lbf"), 0.453_592_37 * 9.806_65, EXACT, 0.0);
    // NIST SP 811 (2008) B.8 (from memory): kilogram-force → N 9.806 65 E+00 (exact).
    assert_close(factor("kgf"), 9.806_65, EXACT, 0.0);
    // NIST SP 811 (2008) B.8 (from memory): kip (1000 lbf) → N 4.448 222 E+03.
    assert_close(factor("kip"), 4.448_222e3, B8, 0.0);
    // NIST SP 811 (2008) B.8 (from memory): ounce-force → N 2.780 139 E-01.
    assert_close(factor("ozf"), 2.780_139e-1, B8, 0.0);
}

#[test]
fn nist_b8_pressure_and_stress() {
    // NIST SP 811 (2008) B.8 (from memory): pound-force per square inch (psi) → Pa 6.894 757 E+03.
    assert_close(factor("psi"), 6.894_757e3, B8, 0.0);
    // psi written as a compound must agree with the symbol.
    assert_close(factor("lbf/in^2"), factor("psi"), 1e-15, 0.0);
    // NIST SP 811 (2008) B.8 (from memory): kip per square inch (ksi) → Pa 6.894 757 E+06.
    assert_close(factor("ksi"), 6.894_757e6, B8, 0.0);
    // NIST SP 811 (2008) B.8 (from memory): kilogram-force per square millimeter → Pa
    // 9.806 65 E+06 (exact).
    assert_close(factor("kgf/mm^2"), 9.806_65e6, EXACT, 0.0);
    // NIST SP 811 (2008) B.8 (from memory): kilogram-force per square centimeter → Pa
    // 9.806 65 E+04 (exact).
    assert_close(factor("kgf/cm²"), 9.806_65e4, EXACT, 0.0);
    // NIST SP 811 (2008) B.8 (from memory): pound-force per square foot → Pa 4.788 026 E+01.
    assert_close(factor("lbf/ft^2"), 4.788_026e1, B8, 0.0);
    // SI Brochure 9th ed. Table 8 (from memory): bar = 100 000 Pa; NIST SP 811 B.8 (from
    // memory): standard atmosphere → Pa 1.013 25 E+05 (exact).
    assert_close(factor("bar"), 1e5, EXACT, 0.0);
    assert_close(factor("atm"), 1.013_25e5, EXACT, 0.0);
}

#[test]
fn nist_b8_torque_density_power_density() {
    // NIST SP 811 (2008) B.8 (from memory): pound-force inch → N·m 1.129 848 E-01.
    assert_close(factor("lbf·in"), 1.129_848e-1, B8, 0.0);
    // NIST SP 811 (2008) B.8 (from memory): pound-force foot → N·m 1.355 818 E+00.
    assert_close(factor("lbf*ft"), 1.355_818, B8, 0.0);
    // NIST SP 811 (2008) B.8 (from memory): kilogram-force meter → N·m 9.806 65 E+00 (exact).
    assert_close(factor("kgf m"), 9.806_65, EXACT, 0.0);
    // NIST SP 811 (2008) B.8 (from memory): pound per cubic inch → kg/m³ 2.767 990 E+04.
    assert_close(factor("lb/in^3"), 2.767_990e4, B8, 0.0);
    // NIST SP 811 (2008) B.8 (from memory): pound per cubic foot → kg/m³ 1.601 846 E+01.
    assert_close(factor("lb/ft³"), 1.601_846e1, B8, 0.0);
    // NIST SP 811 (2008) B.8 (from memory): watt per square inch → W/m² 1.550 003 E+03.
    assert_close(factor("W/in^2"), 1.550_003e3, B8, 0.0);
}

#[test]
fn nist_b8_gravity_and_angle() {
    // NIST SP 811 (2008) B.8 (from memory): standard acceleration of gravity → m/s²
    // 9.806 65 E+00 (exact).
    assert_close(si("1 gn"), 9.806_65, EXACT, 0.0);
    // NIST SP 811 (2008) B.8 (from memory): degree (of angle) → rad 1.745 329 E-02.
    assert_close(factor("°"), 1.745_329e-2, B8, 0.0);
    assert_eq!(Unit::parse("deg").unwrap().kind(), Kind::Angle);
}

#[test]
fn temperatures_si_brochure_and_nist_b9() {
    // SI Brochure 9th ed. §2.3.1 (from memory): t/°C = T/K − 273.15.
    assert_close(si("0 degC"), 273.15, EXACT, 0.0);
    assert_close(si("-40 °C"), 233.15, EXACT, 0.0);
    // NIST SP 811 (2008) B.9 (from memory): T/K = (t/°F + 459.67)/1.8.
    assert_close(si("32 degF"), 273.15, 1e-15, 0.0);
    assert_close(si("212 °F"), 373.15, 1e-15, 0.0);
    // NIST SP 811 (2008) B.9 (from memory): −40 °F = −40 °C, the crossing of the two scales.
    assert_close(
        Quantity::parse("-40 degF")
            .unwrap()
            .value_in("degC")
            .unwrap(),
        -40.0,
        0.0,
        1e-12,
    );
    // NIST SP 811 (2008) B.8 (from memory): degree Fahrenheit (interval) → K 5.555 556 E-01.
    assert_close(factor("delta_degF"), 5.555_556e-1, B8, 0.0);
    // SI Brochure 9th ed. §2.3.1 (from memory): a Celsius difference equals a kelvin difference.
    assert_close(factor("Δ°C"), 1.0, EXACT, 0.0);
}

#[test]
fn si_brochure_table8_and_prefixes() {
    // SI Brochure 9th ed. Table 8 (from memory): min = 60 s, h = 3600 s, L = 10⁻³ m³, t = 10³ kg.
    assert_close(factor("min"), 60.0, EXACT, 0.0);
    assert_close(factor("h"), 3600.0, EXACT, 0.0);
    assert_close(factor("L"), 1e-3, EXACT, 0.0);
    assert_close(factor("t"), 1e3, EXACT, 0.0);
    // SI Brochure 9th ed. Table 7 (from memory): k = 10³, M = 10⁶, G = 10⁹, m = 10⁻³, µ = 10⁻⁶.
    assert_close(factor("kohm"), 1e3, EXACT, 0.0);
    assert_close(factor("MPa"), 1e6, EXACT, 0.0);
    assert_close(factor("GPa"), 1e9, EXACT, 0.0);
    assert_close(factor("mV"), 1e-3, EXACT, 0.0);
    assert_close(factor("µm"), 1e-6, EXACT, 0.0);
    assert_close(factor("um"), 1e-6, EXACT, 0.0);
    // SI Brochure 9th ed. §3 (from memory): prefixes attach to the gram, so mg = 10⁻⁶ kg.
    assert_close(factor("mg"), 1e-6, EXACT, 0.0);
    // SI Brochure 9th ed. Table 7 (from memory): mm² is (mm)², 10⁻⁶ m².
    assert_close(factor("mm²"), 1e-6, EXACT, 0.0);
}

#[test]
fn si_brochure_table4_dimensions() {
    // SI Brochure 9th ed. Table 4 (from memory): Ω = V/A, W = V·A, Pa = N/m², J = N·m, Hz = s⁻¹.
    let dim = |s: &str| Unit::parse(s).unwrap().dimension();
    assert_eq!(dim("ohm"), dim("V/A"));
    assert_eq!(dim("W"), dim("V*A"));
    assert_eq!(dim("Pa"), dim("N/m^2"));
    assert_eq!(dim("J"), dim("N·m"));
    assert_eq!(dim("Hz"), dim("s^-1"));
    assert_eq!(dim("N"), dim("kg·m/s²"));
    assert_eq!(dim("V"), Dimension([2, 1, -3, -1, 0, 0, 0]));
}

#[test]
fn ratios_and_strain() {
    // SI Brochure 9th ed. §5.4.7 (from memory): % = 0.01. NIST SP 811 §7.10.3 (from memory):
    // ppm stands for 10⁻⁶.
    assert_close(factor("%"), 0.01, EXACT, 0.0);
    assert_close(factor("ppm"), 1e-6, EXACT, 0.0);
    // Microstrain is 10⁻⁶ m/m (common practice), in every spelling.
    for s in ["µε", "με", "ue", "uε", "microstrain"] {
        let u = Unit::parse(s).unwrap();
        assert_eq!(
            (u.factor(), u.kind(), u.symbol()),
            (1e-6, Kind::Strain, "µε"),
            "{s}"
        );
    }
    // µin/in is the US spelling of microstrain (common practice).
    let u = Unit::parse("µin/in").unwrap();
    assert_close(u.factor(), 1e-6, 1e-12, 0.0);
    assert_eq!(u.kind(), Kind::Strain);
    // mV/V is 10⁻³ V/V, an output ratio (common practice).
    let u = Unit::parse("mV/V").unwrap();
    assert_eq!((u.factor(), u.kind()), (1e-3, Kind::OutputRatio));
}

// ---------------------------------------------------------------------------------------------
// Differential checks against pint 0.25.3 (`pint.UnitRegistry().Quantity(text).to(unit)
// .magnitude`, run in /work/pyref); each line gives the pint call and the number it printed.

#[test]
fn against_pint_0_25_3() {
    let cases: &[(&str, &str, f64)] = &[
        // Q("1 lbf*inch").to("N*m") → 0.11298482902761671
        ("1 lbf*in", "N*m", 0.112_984_829_027_616_71),
        // Q("1 psi").to("Pa") → 6894.7572931683635
        ("1 psi", "Pa", 6_894.757_293_168_363_5),
        // Q("1 ksi").to("MPa") → 6.894757293168363
        ("1 ksi", "MPa", 6.894_757_293_168_363),
        // Q("1 lbf").to("N") → 4.4482216152605005
        ("1 lbf", "N", 4.448_221_615_260_500_5),
        // Q("1 kgf/mm**2").to("MPa") → 9.80665
        ("1 kgf/mm**2", "MPa", 9.806_65),
        // Q("1 lb/inch**3").to("kg/m**3") → 27679.90471020313
        ("1 lb/in**3", "kg/m**3", 27_679.904_710_203_13),
        // Q("1 W/inch**2").to("W/m**2") → 1550.0031000062002
        ("1 W/in**2", "W/m**2", 1_550.003_100_006_200_2),
        // Q("1 lbf*ft").to("N*m") → 1.3558179483314006
        ("1 lbf*ft", "N*m", 1.355_817_948_331_400_6),
        // Q("1 kip").to("kN") → 4.4482216152605005
        ("1 kip", "kN", 4.448_221_615_260_500_5),
        // Q("1 thou").to("um") → 25.4
        ("1 mil", "um", 25.4),
        // Q("1 microinch").to("nm") → 25.39999999999999
        ("1 uin", "nm", 25.4),
        // Q("1 force_ounce").to("N") → 0.2780138509537813
        ("1 ozf", "N", 0.278_013_850_953_781_3),
        // Q("1 lb").to("kg") → 0.4535923700000001
        ("1 lb", "kg", 0.453_592_37),
        // Q("2.5 kip/inch**2").to("MPa") → 17.236893232920906
        ("2.5 kip/in^2", "MPa", 17.236_893_232_920_906),
        // Q(12, "lbf*inch").to("N*m") → 1.3558179483314006
        ("12 lbf·in", "N·m", 1.355_817_948_331_400_6),
        // Q(350, "kgf/cm**2").to("MPa") → 34.323275
        ("350 kgf/cm^2", "MPa", 34.323_275),
        // Q(7.85, "g/cm**3").to("kg/m**3") → 7849.999999999999
        ("7.85 g/cm^3", "kg/m^3", 7_850.0),
        // Q(0.0016, "W/mm**2").to("W/inch**2") → 1.032256
        ("0.0016 W/mm^2", "W/in^2", 1.032_256),
        // Q(1, "degree").to("rad") → 0.017453292519943295
        ("1 deg", "rad", 0.017_453_292_519_943_295),
        // Q(1, "ppm/kelvin").to("1/K") → 1e-06
        ("1 ppm/K", "1/K", 1e-6),
        // Q(77, "degF").to("degC") → 25.000000000000057
        ("77 degF", "degC", 25.0),
        // Q(-40, "degC").to("degF") → -40.000000000000064
        ("-40 degC", "degF", -40.0),
        // Q(25, "degC").to("K") → 298.15
        ("25 degC", "K", 298.15),
        // Q(98.6, "degF").to("K") → 310.15000000000003
        ("98.6 degF", "K", 310.15),
        // Q(18, "delta_degF").to("K") → 10.0
        ("18 delta_degF", "K", 10.0),
    ];
    for &(from, to, expected) in cases {
        let got = Quantity::parse(from).unwrap().value_in(to).unwrap();
        // pint and Gaugebook compose the same exact definitions; allow a few ulps of difference
        // in the order of the floating-point operations.
        assert_close(got, expected, 1e-13, 1e-12);
    }
}

#[test]
fn temperature_arithmetic_where_pint_agrees() {
    // pint 0.25.3: Q(80, "degF") - Q(62, "degF") → <Quantity(18, 'delta_degree_Fahrenheit')>
    let d = Quantity::parse("80 degF")
        .unwrap()
        .try_sub(&Quantity::parse("62 degF").unwrap());
    assert_eq!(d.unwrap().to_string(), "18 Δ°F");
    // pint 0.25.3: Q(25, "degC") + Q(5, "delta_degC") → <Quantity(30, 'degree_Celsius')>
    let t = Quantity::parse("25 degC")
        .unwrap()
        .try_add(&Quantity::parse("5 delta_degC").unwrap());
    assert_eq!(t.unwrap().to_string(), "30 °C");
    // pint 0.25.3: Q(25, "degC") + Q(5, "degC") raises OffsetUnitCalculusError; so do we.
    let e = Quantity::parse("25 degC")
        .unwrap()
        .try_add(&Quantity::parse("5 degC").unwrap());
    assert!(matches!(e, Err(UnitError::TemperatureReadings { .. })));
    // pint 0.25.3: Q(5, "delta_degC").to("degC") raises DimensionalityError; so do we.
    let e = Quantity::parse("5 delta_degC")
        .unwrap()
        .to("degC")
        .unwrap_err();
    assert!(matches!(e, UnitError::DifferenceAsReading { .. }), "{e}");
    // Deliberate difference: pint 0.25.3 converts Q(300, "K").to("degC") → 26.850000000000023,
    // because its kelvin is absolute; Gaugebook's K is the unit of differences and refuses it.
    let e = Quantity::parse("300 K")
        .unwrap()
        .value_in("degC")
        .unwrap_err();
    assert_eq!(
        e.to_string(),
        "cannot express the temperature difference 300 K in °C: add it to a reading \
         (20 °C + 300 K) instead"
    );
    // Deliberate difference: pint 0.25.3 calls Q(25, "degC") + Q(5, "K") ambiguous and refuses
    // it; Gaugebook reads K as the unit of differences (DESIGN.md §3), so it is 30 °C.
    let t = Quantity::parse("25 degC")
        .unwrap()
        .try_add(&Quantity::parse("5 K").unwrap());
    assert_eq!(t.unwrap().to_string(), "30 °C");
}

// ---------------------------------------------------------------------------------------------
// Display.

#[test]
fn display_as_a_person_writes_it() {
    let q = |s: &str| Quantity::parse(s).unwrap();
    assert_eq!(q("0.4995 mV/V").to_string(), "0.4995 mV/V");
    assert_eq!(q("1000 ue").to_string(), "1000 µε");
    // No display unit: the prefix follows the value.
    let r = Quantity::from_si(174_650.0, q("1 ohm").dimension(), Kind::Plain);
    assert_eq!(r.to_string(), "174.65 kΩ");
    let s = q("250 N").div(&q("1 mm^2"));
    assert_eq!(s.to_string(), "250 MPa");
    let e = q("70 GPa").mul(&q("1 ue").scale(1000.0));
    assert_eq!(e.to_string(), "70 MPa");
    let ratio = q("1.2 mV").div(&q("5 V"));
    assert_eq!(ratio.to_string(), "0.00024");
    assert_eq!(ratio.with_kind(Kind::OutputRatio).to_string(), "0.24 mV/V");
    let p = q("5 V").powi(2).div(&q("350 ohm"));
    assert_eq!(p.to_string(), "71.4286 mW");
    let tc = q("11 ppm/K").mul(&q("1 ue").div(&q("1 ue")));
    assert_eq!(tc.to_string(), "11 ppm/K");
    assert_eq!(
        q("2 ue/K").scale(1.0).to_string(),
        "2 ue/K".replace("ue", "µε")
    );
    assert_eq!(q("5 kg/m^3").to_string(), "5 kg/m³");
    assert_eq!(
        Quantity::from(Strain::from_microstrain(-12.5)).to_string(),
        "-12.5 µε"
    );
    assert_eq!(
        Quantity::from(OutputRatio::from_mv_per_v(2.0)).to_string(),
        "2 mV/V"
    );
    // The kind survives a rate: (mV/V)/K.
    let zero_tc = q("0.02 mV/V").div(&q("10 K"));
    assert_eq!(zero_tc.to_string(), "0.002 mV/V/K");
    assert_eq!(
        Quantity::parse(&zero_tc.to_string()).unwrap().kind(),
        Kind::OutputRatio
    );
}

// ---------------------------------------------------------------------------------------------
// Kind rules.

#[test]
fn kinds_do_not_mix_silently() {
    let q = |s: &str| Quantity::parse(s).unwrap();
    assert!(q("500 ue").try_add(&q("1 mV/V")).is_err());
    assert!(q("500 ue").try_add(&Quantity::number(1e-3)).is_err());
    assert!(q("1 rad").try_add(&Quantity::number(1.0)).is_err());
    // A percentage is a plain ratio: it adds to a plain number.
    let s = q("5 %").try_add(&Quantity::number(0.01)).unwrap();
    assert_close(s.si(), 0.06, 1e-15, 0.0);
    assert_eq!(s.to_string(), "6 %");
    // strain/strain is plain; a gauge factor (ΔR/R)/ε is plain.
    assert_eq!(q("300 ue").div(&q("1000 ue")).kind(), Kind::Plain);
    assert_eq!(
        Quantity::number(2e-3).div(&q("1000 ue")).kind(),
        Kind::Plain
    );
    // A strain scaled, or per kelvin and back, stays a strain.
    assert_eq!(q("300 ue").scale(2.0).kind(), Kind::Strain);
    assert_eq!(q("11 ue/K").mul(&q("20 K")).kind(), Kind::Strain);
    // Strain times a length is a plain length that adds to a length.
    let dl = q("1000 ue").mul(&q("100 mm"));
    assert_eq!(dl.kind(), Kind::Plain);
    assert_close(q("100 mm").try_add(&dl).unwrap().si(), 0.1001, 1e-12, 0.0);
    // Comparing needs the same kind too.
    assert!(q("500 ue").try_cmp(&q("0.5 mV/V")).is_err());
    assert!(q("1 %").try_cmp(&Quantity::number(0.5)).is_ok());
}

// ---------------------------------------------------------------------------------------------
// Errors.

#[test]
fn unknown_unit_names_symbol_and_position() {
    let e = Quantity::parse("350 ohmz").unwrap_err();
    assert_eq!(
        e.to_string(),
        "unknown unit `ohmz` in `350 ohmz` at character 4"
    );
    match Quantity::parse("5 kg/m^3/furlong").unwrap_err() {
        UnitError::UnknownUnit {
            symbol, position, ..
        } => {
            assert_eq!((symbol.as_str(), position), ("furlong", 9));
        }
        other => panic!("{other:?}"),
    }
    // Positions count characters, not bytes: `µ` and `·` are two bytes each in UTF-8.
    match Quantity::parse("1 µε·zz").unwrap_err() {
        UnitError::UnknownUnit { position, .. } => assert_eq!(position, 5),
        other => panic!("{other:?}"),
    }
    let e = Unit::parse("N·m^").unwrap_err();
    assert_eq!(
        e.to_string(),
        "cannot read unit `N·m^` at character 4: expected an integer exponent"
    );
}

#[test]
fn mismatched_add_and_compare_messages() {
    let q = |s: &str| Quantity::parse(s).unwrap();
    let e = q("350 ohm").try_add(&q("5 V")).unwrap_err();
    assert_eq!(e.to_string(), "cannot add 350 Ω and 5 V");
    let e = q("5 V").try_sub(&q("350 ohm")).unwrap_err();
    assert_eq!(e.to_string(), "cannot subtract 5 V and 350 Ω");
    let e = q("1000 ue").try_cmp(&q("2 mV/V")).unwrap_err();
    assert_eq!(e.to_string(), "cannot compare 1000 µε and 2 mV/V");
    let e = q("2 kN").value_in("MPa").unwrap_err();
    assert_eq!(e.to_string(), "cannot express 2 kN in MPa");
    let e = Force::try_from(&q("2 mm")).unwrap_err();
    assert_eq!(e.to_string(), "expected a force (N), found 2 mm");
    let e = Strain::try_from(&q("2 mV/V")).unwrap_err();
    assert_eq!(e.to_string(), "expected a strain (µε, ε), found 2 mV/V");
}

#[test]
fn celsius_plus_celsius_is_refused() {
    let e = Quantity::parse("20 degC")
        .unwrap()
        .try_add(&Quantity::parse("5 °C").unwrap());
    assert_eq!(
        e.unwrap_err().to_string(),
        "cannot add 20 °C and 5 °C: both are temperature readings; add a difference (K, Δ°C) \
         to a reading, or subtract two readings"
    );
}

#[test]
fn sqrt_of_cubic_metres_is_refused() {
    let e = Quantity::parse("8 m^3").unwrap().sqrt().unwrap_err();
    assert!(matches!(e, UnitError::Undefined { .. }));
    assert!(e.to_string().contains("odd exponent"), "{e}");
    let e = Quantity::parse("-4 m^2").unwrap().sqrt().unwrap_err();
    assert!(e.to_string().ends_with("it is negative"), "{e}");
}

#[test]
fn uom_bridges_round_trip() {
    let l = Length::try_from(&Quantity::parse("12 in").unwrap()).unwrap();
    assert_close(l.value, 0.3048, 1e-15, 0.0);
    let p = Pressure::try_from(Quantity::parse("1 ksi").unwrap()).unwrap();
    assert_close(
        Quantity::from(p).value_in("psi").unwrap(),
        1000.0,
        1e-14,
        0.0,
    );
}

// ---------------------------------------------------------------------------------------------
// Property tests.

/// Dimensions and kinds that display and parse back, with a range of SI values for each.
fn displayable() -> impl Strategy<Value = (Dimension, Kind)> {
    let base = prop::array::uniform7(-3i8..=3).prop_map(Dimension);
    let rate = (-2i8..=2, -2i8..=2).prop_map(|(t, th)| Dimension([0, 0, t, 0, th, 0, 0]));
    prop_oneof![
        base.prop_map(|d| (d, Kind::Plain)),
        rate.clone().prop_map(|d| (d, Kind::Strain)),
        rate.clone().prop_map(|d| (d, Kind::OutputRatio)),
        rate.prop_map(|d| (d, Kind::Angle)),
    ]
}

fn magnitude() -> impl Strategy<Value = f64> {
    (-12.0f64..12.0, prop::bool::ANY).prop_map(|(e, neg)| {
        let v = 10f64.powf(e);
        if neg { -v } else { v }
    })
}

proptest! {
    #[test]
    fn format_then_parse_round_trips((dim, kind) in displayable(), v in magnitude()) {
        let q = Quantity::from_si(v, dim, kind);
        let text = q.to_string();
        let back = Quantity::parse(&text).map_err(|e| TestCaseError::fail(format!("{text}: {e}")))?;
        prop_assert_eq!(back.dimension(), q.dimension(), "{}", text);
        prop_assert_eq!(back.kind(), q.kind(), "{}", text);
        // Six significant figures: the relative error is at most 5e-6.
        prop_assert!((back.si() - q.si()).abs() <= 5e-6 * q.si().abs(), "{} → {}", text, back.si());
    }

    #[test]
    fn temperatures_round_trip(t in 1.0f64..2000.0, d in -500.0f64..500.0) {
        let reading = Quantity::from_si(t, Dimension::TEMPERATURE, Kind::AbsoluteTemperature);
        let back = Quantity::parse(&reading.to_string()).unwrap();
        prop_assert_eq!(back.kind(), Kind::AbsoluteTemperature);
        prop_assert!((back.si() - t).abs() <= 5e-3);
        let diff = Quantity::from_si(d, Dimension::TEMPERATURE, Kind::TemperatureInterval);
        let back = Quantity::parse(&diff.to_string()).unwrap();
        prop_assert_eq!(back.kind(), Kind::TemperatureInterval);
        prop_assert!((back.si() - d).abs() <= 5e-6 * d.abs());
    }

    #[test]
    fn dimension_algebra(a in prop::array::uniform7(-3i8..=3), b in prop::array::uniform7(-3i8..=3), n in -3i32..=3) {
        let (a, b) = (Dimension(a), Dimension(b));
        prop_assert_eq!((a * b) / b, a);
        prop_assert_eq!(a * b, b * a);
        prop_assert_eq!(a.powi(2).sqrt(), Some(a));
        prop_assert_eq!(a.powi(n) * a.powi(-n), Dimension::NONE);
        // Quantities follow the same algebra.
        let qa = Quantity::from_si(2.0, a, Kind::Plain);
        let qb = Quantity::from_si(4.0, b, Kind::Plain);
        prop_assert_eq!(qa.mul(&qb).dimension(), a * b);
        prop_assert_eq!(qa.div(&qb).dimension(), a / b);
        prop_assert_eq!(qa.powi(n).dimension(), a.powi(n));
        prop_assert!((qa.mul(&qb).div(&qb).si() - 2.0).abs() < 1e-15);
    }

    #[test]
    fn conversions_round_trip(v in -1e6f64..1e6, family in 0usize..6, i in 0usize..7, j in 0usize..7) {
        const FAMILIES: [&[&str]; 6] = [
            &["m", "mm", "in", "ft", "uin", "mil", "km"],
            &["N", "kN", "lbf", "kgf", "kip", "ozf", "MN"],
            &["Pa", "MPa", "psi", "ksi", "bar", "kgf/mm^2", "N/mm²"],
            &["degC", "degF", "K", "degC", "degF", "K", "degC"],
            &["ue", "ε", "%", "ppm", "µin/in", "m/m", "mm/m"],
            &["N·m", "lbf·in", "lbf*ft", "kgf m", "kN·m", "N·mm", "ozf·in"],
        ];
        let units = FAMILIES[family];
        let (a, b) = (units[i], units[j]);
        let q = Quantity::new(v, a).unwrap();
        // A strain given in a plain-ratio unit (%, ppm) is plain: express strains from ue.
        // A difference never becomes a reading: express temperatures from a reading.
        let q = match family {
            3 => Quantity::new(v, "degC").unwrap().to(a).unwrap(),
            4 => Quantity::new(v, "ue").unwrap().to(a).unwrap(),
            _ => q,
        };
        let there = q.to(b).unwrap();
        let back = there.value_in(a).unwrap();
        let orig = q.value_in(a).unwrap();
        prop_assert!((back - orig).abs() <= 1e-12 * orig.abs().max(1.0), "{} {} → {} → {}", orig, a, b, back);
    }
}
