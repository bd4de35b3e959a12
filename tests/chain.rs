//! Reference checks for the signal chain: resolution, quantisation noise, effective and
//! noise-free bits, ratiometric measurement.

use gaugebook::units::{ElectricPotential, Force, Frequency};
use gaugebook::{
    Adc, AdcReference, Amplifier, Arrangement, InputNoise, OutputRatio, PhysicsError, SignalChain,
};
use uom::si::electric_potential::{nanovolt, volt};
use uom::si::force::newton;
use uom::si::frequency::hertz;

use crate::common::assert_close;

fn v(x: f64) -> ElectricPotential {
    ElectricPotential::new::<volt>(x)
}

fn chain(noise_nv: f64, reference: AdcReference) -> SignalChain {
    let n = InputNoise::from_rms(ElectricPotential::new::<nanovolt>(noise_nv)).unwrap();
    SignalChain::new(
        v(5.0),
        Amplifier::new(128.0, n).unwrap(),
        Adc::new(24, reference, true).unwrap(),
    )
    .unwrap()
}

#[test]
fn lsb_and_resolution_closed_forms() {
    // Closed form: a bipolar N-bit converter of reference V_ref resolves 2V_ref/2^N at its
    // input, 2V_ref/(2^N·G) at the bridge (common practice).
    let c = chain(0.0, AdcReference::fixed(v(2.5)).unwrap());
    assert_close(
        c.lsb().unwrap().get::<volt>(),
        5.0 / (16777216.0 * 128.0),
        1e-15,
        0.0,
    );
    assert_close(
        c.resolution().unwrap().value(),
        1.0 / (16777216.0 * 128.0),
        1e-15,
        0.0,
    );
    // Unipolar halves the span.
    let u = SignalChain::new(
        v(5.0),
        Amplifier::new(128.0, InputNoise::none()).unwrap(),
        Adc::new(24, AdcReference::fixed(v(2.5)).unwrap(), false).unwrap(),
    )
    .unwrap();
    assert_close(
        u.lsb().unwrap().get::<volt>(),
        2.5 / (16777216.0 * 128.0),
        1e-15,
        0.0,
    );
}

#[test]
fn strain_and_load_resolution() {
    // Closed form: ε = 4r/(B·F) at balance (the slope of the exact inverse, Dally & Riley,
    // 4th ed., ch. 6, from memory); load = capacity·r/rated output.
    let c = chain(0.0, AdcReference::ratiometric(1.0).unwrap());
    let r = c.resolution().unwrap().value();
    for a in Arrangement::ALL {
        let e = c.strain_resolution(a, 2.05, 0.3).unwrap();
        assert_close(
            e.value(),
            4.0 * r / (a.bridge_factor(0.3).unwrap() * 2.05),
            1e-14,
            0.0,
        );
        // The exact inverse agrees to first order at one step.
        let exact = a
            .strain_from_output(OutputRatio::new(r), 2.05, 0.3)
            .unwrap();
        assert_close(e.value(), exact.value(), 1e-8, 0.0);
    }
    let f = c
        .load_resolution(
            OutputRatio::from_mv_per_v(2.0),
            Force::new::<newton>(5000.0),
        )
        .unwrap();
    assert_close(f.get::<newton>(), 5000.0 * r / 2.0e-3, 1e-14, 0.0);
}

#[test]
fn quantisation_noise_is_lsb_over_root_twelve() {
    // Bennett, Bell Syst. Tech. J. 27 (1948) and Widrow & Kollár, Quantization Noise (2008)
    // (both from memory): a uniform quantiser adds q/√12 rms. With no other noise the effective
    // resolution is then N + log₂√12 bits.
    let c = chain(0.0, AdcReference::ratiometric(1.0).unwrap());
    assert_close(
        c.quantisation_noise().unwrap().get::<volt>(),
        c.lsb().unwrap().get::<volt>() / 12f64.sqrt(),
        1e-15,
        0.0,
    );
    assert_close(
        c.effective_bits().unwrap(),
        24.0 + 0.5 * 12f64.log2(),
        1e-12,
        0.0,
    );
}

#[test]
fn effective_and_noise_free_bits() {
    // Common practice: effective resolution log₂(span/σ), noise-free log₂(span/(6.6σ)).
    let c = chain(200.0, AdcReference::ratiometric(1.0).unwrap());
    let span = 2.0 * 5.0 / 128.0;
    let lsb = span / 16777216.0;
    let sigma = (200.0e-9f64).hypot(lsb / 12f64.sqrt());
    assert_close(c.noise_rms().unwrap().get::<volt>(), sigma, 1e-14, 0.0);
    assert_close(
        c.effective_bits().unwrap(),
        (span / sigma).log2(),
        1e-12,
        0.0,
    );
    assert_close(
        c.noise_free_bits().unwrap(),
        (span / (6.6 * sigma)).log2(),
        1e-12,
        0.0,
    );
    let counts = c
        .noise_free_counts(OutputRatio::from_mv_per_v(2.0))
        .unwrap();
    assert_close(counts, 2.0e-3 * 5.0 / (6.6 * sigma), 1e-12, 0.0);
}

#[test]
fn noise_density_times_root_bandwidth() {
    // Common practice: white noise e_n over a noise-equivalent bandwidth B is e_n·√B rms.
    let n = InputNoise::from_density(8.0e-9, Frequency::new::<hertz>(25.0)).unwrap();
    assert_close(n.rms().get::<nanovolt>(), 40.0, 1e-12, 0.0);
}

#[test]
fn ratiometric_reading_ignores_excitation_drift() {
    // Closed form: with V_ref = k·V_ex the code is G·r/(2k)·2^N, free of V_ex; with a fixed
    // reference a 1 % excitation rise reads 1 % high.
    let r = OutputRatio::from_mv_per_v(1.8);
    let ratio = chain(0.0, AdcReference::ratiometric(0.5).unwrap());
    let fixed = chain(0.0, AdcReference::fixed(v(2.5)).unwrap());
    assert_close(
        ratio.read_back(r, v(5.05)).unwrap().value(),
        r.value(),
        1e-14,
        0.0,
    );
    assert_close(
        fixed.read_back(r, v(5.05)).unwrap().value(),
        r.value() * 1.01,
        1e-14,
        0.0,
    );
    assert_eq!(ratio.excitation_sensitivity(), 0.0);
    assert_eq!(fixed.excitation_sensitivity(), 1.0);
}

#[test]
fn bad_chain_parameters_are_typed_errors() {
    let a = Amplifier::new(1.0, InputNoise::none()).unwrap();
    let adc = Adc::new(16, AdcReference::ratiometric(1.0).unwrap(), true).unwrap();
    for x in [0.0, -5.0, f64::NAN] {
        assert!(matches!(
            SignalChain::new(v(x), a, adc),
            Err(PhysicsError::InvalidParameter { .. })
        ));
        assert!(Amplifier::new(x, InputNoise::none()).is_err());
        assert!(AdcReference::fixed(v(x)).is_err());
        assert!(AdcReference::ratiometric(x).is_err());
    }
    assert!(Adc::new(0, AdcReference::ratiometric(1.0).unwrap(), true).is_err());
    assert!(InputNoise::from_rms(v(f64::NAN)).is_err());
    let c = SignalChain::new(v(5.0), a, adc).unwrap();
    assert!(c.strain_resolution(Arrangement::Quarter, 0.0, 0.3).is_err());
    assert!(
        c.strain_resolution(Arrangement::FullPoisson, 2.0, 0.5)
            .is_err()
    );
    assert!(
        c.load_resolution(OutputRatio::ZERO, Force::new::<newton>(1.0))
            .is_err()
    );
    assert!(
        c.load_resolution(OutputRatio::from_mv_per_v(2.0), Force::new::<newton>(0.0))
            .is_err()
    );
    assert!(c.noise_free_counts(OutputRatio::new(-1e-3)).is_err());
    // A variant built directly is re-checked where it is used.
    let bad = Adc::new(16, AdcReference::Fixed(v(-1.0)), true).unwrap();
    assert!(
        SignalChain::new(v(5.0), a, bad)
            .unwrap()
            .resolution()
            .is_err()
    );
}
