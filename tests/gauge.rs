//! Reference checks for the gauge model: ASTM E251 terms, transverse sensitivity, gauge-factor
//! temperature coefficient and thermal output.

use gaugebook::units::{ElectricalResistance, TemperatureCoefficient, ThermodynamicTemperature};
use gaugebook::{Gauge, PhysicsError, Strain, ThermalOutput};
use uom::si::electrical_resistance::ohm;
use uom::si::temperature_coefficient::per_kelvin;
use uom::si::thermodynamic_temperature::degree_celsius;

use crate::common::assert_close;

fn gauge(gf: f64, kt: f64) -> Gauge {
    Gauge::new(ElectricalResistance::new::<ohm>(350.0), gf)
        .unwrap()
        .with_transverse_sensitivity(kt)
        .unwrap()
}

fn celsius(t: f64) -> ThermodynamicTemperature {
    ThermodynamicTemperature::new::<degree_celsius>(t)
}

#[test]
fn gauge_factor_is_defined_in_the_calibration_field() {
    // ASTM E251 (from memory): F = (ΔR/R)/ε_a in a uniaxial stress field on a beam with
    // ε_t = −ν₀·ε_a, ν₀ = 0.285.
    let g = gauge(2.08, 0.025);
    let ea = Strain::from_microstrain(-800.0);
    assert_close(
        g.relative_change(ea, -0.285 * ea),
        2.08 * -800e-6,
        1e-13,
        0.0,
    );
}

#[test]
fn axial_sensitivity_from_gauge_factor() {
    // Dally & Riley, Experimental Stress Analysis, 4th ed., §6 (from memory):
    // S_g = S_a·(1 − ν₀·K_t), and ΔR/R = S_a·(ε_a + K_t·ε_t).
    let g = gauge(2.0, 0.04);
    let sa = 2.0 / (1.0 - 0.285 * 0.04);
    assert_close(g.axial_sensitivity(), sa, 1e-14, 0.0);
    let (ea, et) = (
        Strain::from_microstrain(300.0),
        Strain::from_microstrain(700.0),
    );
    assert_close(
        g.relative_change(ea, et),
        sa * (300e-6 + 0.04 * 700e-6),
        1e-13,
        0.0,
    );
}

#[test]
fn transverse_error_formula() {
    // Dally & Riley, 4th ed., §6 (from memory): the error of a gauge read with F alone is
    // e = K_t·(ε_t/ε_a + ν₀)/(1 − ν₀·K_t).
    for (kt, ratio) in [(0.03, 1.0), (0.03, -1.0), (-0.02, -0.3), (0.05, 0.0)] {
        let g = gauge(2.1, kt);
        let ea = Strain::from_microstrain(1000.0);
        let ind = g.indicated_strain(ea, ea * ratio);
        let e = (ind - ea) / ea;
        assert_close(e, kt * (ratio + 0.285) / (1.0 - 0.285 * kt), 1e-11, 0.0);
    }
}

#[test]
fn gauge_factor_temperature_coefficient_is_linear() {
    // Common practice: F(T) = F·(1 + α·(T − T_ref)).
    let g = gauge(2.0, 0.0)
        .with_gauge_factor_tc(
            TemperatureCoefficient::new::<per_kelvin>(-1.0e-4),
            celsius(24.0),
        )
        .unwrap();
    assert_close(
        g.gauge_factor_at(celsius(74.0)),
        2.0 * (1.0 - 50.0e-4),
        1e-13,
        0.0,
    );
    assert_close(g.gauge_factor_at(celsius(24.0)), 2.0, 1e-15, 0.0);
}

#[test]
fn thermal_output_matches_numpy_polyval() {
    // numpy 2.4.6: numpy.polynomial.polynomial.polyval(150.0 - 24.0, c) = 9.47764e-05 and
    // polyval(-30.0 - 24.0, c) = -0.00037631959999999995, c = [-12.5e-6, 2.25e-6, -0.0615e-6, 0.4e-9].
    let c = vec![-12.5e-6, 2.25e-6, -0.0615e-6, 0.4e-9];
    let to = ThermalOutput::new(celsius(24.0), c).unwrap();
    let g = gauge(2.0, 0.0).with_thermal_output(to);
    assert_close(
        g.thermal_output(celsius(150.0)).value(),
        9.47764e-05,
        1e-12,
        0.0,
    );
    assert_close(
        g.thermal_output(celsius(-30.0)).value(),
        -0.00037631959999999995,
        1e-12,
        0.0,
    );
}

#[test]
fn bad_gauge_parameters_are_typed_errors() {
    let r = |v: f64| ElectricalResistance::new::<ohm>(v);
    for (res, gf) in [
        (0.0, 2.0),
        (-350.0, 2.0),
        (f64::NAN, 2.0),
        (350.0, 0.0),
        (350.0, -2.0),
        (350.0, f64::NAN),
    ] {
        assert!(matches!(
            Gauge::new(r(res), gf),
            Err(PhysicsError::InvalidParameter { .. })
        ));
    }
    let g = gauge(2.0, 0.0);
    for nu in [-1.0, 0.5, 0.7, f64::NAN] {
        assert!(matches!(
            g.clone().with_calibration_poisson(nu),
            Err(PhysicsError::InvalidParameter { .. })
        ));
    }
    assert!(
        g.with_gauge_factor_tc(
            TemperatureCoefficient::new::<per_kelvin>(f64::INFINITY),
            celsius(20.0)
        )
        .is_err()
    );
}
