//! Check-weighing station checks: balance at the target, the accept band, resolution, and the
//! refusals. Scenario invented for the tests: 250 g coffee bags on a 0.8 kg tray.

use gaugebook::units::{Acceleration, ElectricPotential, ElectricalResistance, Length, Mass};
use gaugebook::{
    ArmId, Arrangement, CheckWeigher, Gauge, Layout, LoadComponent, OutputRatio, Parallelogram,
    PhysicsError, STANDARD_GRAVITY, TrimKind, Wrench, material,
};
use uom::si::acceleration::meter_per_second_squared;
use uom::si::electric_potential::volt;
use uom::si::electrical_resistance::ohm;
use uom::si::length::millimeter;
use uom::si::mass::gram;

use crate::common::assert_close;

fn g(v: f64) -> Mass {
    Mass::new::<gram>(v)
}

fn layout() -> Layout {
    let mm = Length::new::<millimeter>;
    let cell = Parallelogram::new(
        material("2024-T351").unwrap(),
        mm(36.0),
        mm(16.0),
        mm(1.2),
        mm(20.0),
        mm(5.0),
    )
    .unwrap();
    let gauge = Gauge::new(ElectricalResistance::new::<ohm>(350.0), 2.0).unwrap();
    // Rated 3 kg.
    Layout::standard(
        cell,
        &gauge,
        Arrangement::FullBending,
        3.0 * STANDARD_GRAVITY,
    )
    .unwrap()
}

fn station() -> CheckWeigher {
    CheckWeigher::new(
        layout(),
        0,
        Wrench::only(LoadComponent::Fz, 1.0),
        g(800.0),
        g(250.0),
        g(4.0),
        g(8.0),
    )
    .unwrap()
}

#[test]
fn balanced_at_target_with_a_band_around_zero() {
    let w = station().evaluate().unwrap();
    // Balance: R1·R3 = R2·R4 after the trim (bridge equation), so the target reads zero.
    assert!(w.zero_at_target.value().abs() < 1e-15);
    // The bridge is very nearly linear about the target: the band ends sit at −4 g and +8 g.
    let per_g = w.output_per_gram.value();
    assert_close(w.accept_low.value(), -4.0 * per_g, 1e-3, 0.0);
    assert_close(w.accept_high.value(), 8.0 * per_g, 1e-3, 0.0);
    // Output per gram matches the layout's linear response to Fz times g (within the
    // trim's and the law's O(x) effect, here below 0.5 %).
    let l = layout();
    let per_newton = l.per_load(0).unwrap()[LoadComponent::Fz.index()];
    assert_close(per_g, per_newton * STANDARD_GRAVITY * 1e-3, 5e-3, 0.0);
    // Resolution: a tenth of the tighter tolerance (4 g).
    assert_close(w.resolution_mass.get::<gram>(), 0.4, 1e-12, 0.0);
    assert_close(w.resolution.value(), 0.4 * per_g.abs(), 1e-9, 0.0);
    let v = w
        .resolution_voltage(ElectricPotential::new::<volt>(10.0))
        .unwrap();
    assert_close(v.get::<volt>(), 10.0 * w.resolution.value(), 1e-12, 0.0);
    let bits = w.bits_over(OutputRatio::from_mv_per_v(3.0)).unwrap();
    assert_eq!(bits, (3e-3 / w.resolution.value()).log2().ceil() as u32);
    // The empty platform reads below the band, a full cell above it.
    assert!(w.unloaded_output < w.accept_low && w.capacity_output > w.accept_high);
}

#[test]
fn output_per_gram_scales_with_local_gravity() {
    let a = station()
        .with_gravity(Acceleration::new::<meter_per_second_squared>(9.78))
        .unwrap()
        .evaluate()
        .unwrap();
    let b = station()
        .with_gravity(Acceleration::new::<meter_per_second_squared>(9.83))
        .unwrap()
        .evaluate()
        .unwrap();
    assert_close(
        b.output_per_gram.value() / a.output_per_gram.value(),
        9.83 / 9.78,
        1e-3,
        0.0,
    );
}

#[test]
fn trims_follow_the_arm_and_kind() {
    // At the target the tension arms R1, R3 are high and R2, R4 low: R4 needs a series trim,
    // R1 a parallel one (balance rule R1·R3 = R2·R4 of the bridge module).
    let w = station().with_trim_arm(ArmId::R4).evaluate().unwrap();
    assert_eq!(w.trim.kind(), TrimKind::Series);
    let w = station().with_trim_arm(ArmId::R1).evaluate().unwrap();
    assert_eq!(w.trim.kind(), TrimKind::Parallel);
    let e = station()
        .with_trim(ArmId::R1, TrimKind::Series)
        .evaluate()
        .unwrap_err();
    assert!(matches!(e, PhysicsError::NoSolution { .. }));
}

#[test]
fn refusals_are_typed() {
    let down = Wrench::only(LoadComponent::Fz, 1.0);
    // 2.5 kg package on a 0.8 kg tray exceeds 3 kg.
    let e = CheckWeigher::new(layout(), 0, down, g(800.0), g(2500.0), g(4.0), g(8.0)).unwrap_err();
    assert!(matches!(e, PhysicsError::OutOfRange { .. }), "{e}");
    let up = Wrench::only(LoadComponent::Fz, -1.0);
    assert!(CheckWeigher::new(layout(), 0, up, g(800.0), g(250.0), g(4.0), g(8.0)).is_err());
    assert!(CheckWeigher::new(layout(), 0, down, g(800.0), g(250.0), g(250.0), g(8.0)).is_err());
    assert!(CheckWeigher::new(layout(), 0, down, g(-1.0), g(250.0), g(4.0), g(8.0)).is_err());
    assert!(CheckWeigher::new(layout(), 2, down, g(800.0), g(250.0), g(4.0), g(8.0)).is_err());
    assert!(
        station()
            .with_gravity(Acceleration::new::<meter_per_second_squared>(0.0))
            .is_err()
    );
    assert!(station().with_resolution_fraction(2.0).is_err());
    assert!(
        station()
            .evaluate()
            .unwrap()
            .bits_over(OutputRatio::ZERO)
            .is_err()
    );
}
