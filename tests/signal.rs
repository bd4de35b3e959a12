//! Signal processing against scipy.signal 1.17.1, numpy 2.4.6, rainflow 3.2.0 and
//! ASTM E1049-85 (2017); the reference values and the Python that made them are in
//! `tests/signal/reference.rs` and `tests/signal/gen_reference.py`.

mod reference;

use crate::common::assert_close;
use gaugebook::units::Frequency;
use gaugebook::*;
use reference as r;
use uom::si::frequency::hertz;

fn hz(v: f64) -> Frequency {
    Frequency::new::<hertz>(v)
}

fn band(low: bool) -> FilterBand {
    if low {
        FilterBand::LowPass
    } else {
        FilterBand::HighPass
    }
}

fn design(butter: bool, order: usize, low: bool, fc: f64) -> SosFilter {
    let f = if butter {
        SosFilter::butterworth
    } else {
        SosFilter::bessel
    };
    f(order, band(low), hz(fc), hz(1000.0)).unwrap()
}

/// Coefficients agree to 1e-12 of the section's largest coefficient, or 1e-15 absolute.
fn assert_sections(got: &SosFilter, want: &[f64], what: &str) {
    let flat: Vec<f64> = got.sections().iter().flatten().copied().collect();
    assert_eq!(flat.len(), want.len(), "{what}: section count");
    for (row_got, row_want) in flat.chunks(6).zip(want.chunks(6)) {
        let scale = row_want.iter().fold(0.0f64, |m, v| m.max(v.abs()));
        for (g, w) in row_got.iter().zip(row_want) {
            assert!(
                (g - w).abs() <= 1e-12 * scale + 1e-15,
                "{what}: {row_got:?} vs {row_want:?}"
            );
        }
    }
}

#[test]
fn butterworth_sections_match_scipy_butter() {
    // scipy.signal.butter(N, fc, btype, fs=1000.0, output="sos"), scipy 1.17.1, N = 1..8, 10, 12.
    for &(what, order, low, fc, fs, sos) in r::BUTTER {
        let f = SosFilter::butterworth(order, band(low), hz(fc), hz(fs)).unwrap();
        assert_sections(&f, sos, what);
    }
}

#[test]
fn bessel_sections_match_scipy_bessel() {
    // scipy.signal.bessel(N, fc, btype, fs=1000.0, output="sos"), norm="phase", scipy 1.17.1.
    for &(what, order, low, fc, fs, sos) in r::BESSEL {
        let f = SosFilter::bessel(order, band(low), hz(fc), hz(fs)).unwrap();
        assert_sections(&f, sos, what);
    }
}

#[test]
fn extreme_cutoffs_match_scipy() {
    // Cutoffs near Nyquist and near 0 Hz, scipy 1.17.1 (see EXTREME).
    for &(what, butter, order, low, fc, fs, sos) in r::EXTREME {
        let f = if butter {
            SosFilter::butterworth
        } else {
            SosFilter::bessel
        };
        assert_sections(&f(order, band(low), hz(fc), hz(fs)).unwrap(), sos, what);
    }
}

#[test]
fn causal_filtering_matches_scipy_sosfilt() {
    // scipy.signal.sosfilt(sos, x), zero initial state, scipy 1.17.1; every 7th sample.
    let x = r::test_signal();
    for (k, &(what, butter, order, low, fc)) in r::APPLIED.iter().enumerate() {
        let y = design(butter, order, low, fc).filter(&x).unwrap();
        for (i, &want) in r::SOSFILT[k].iter().enumerate() {
            assert_close(y[7 * i], want, 1e-11, 1e-12);
        }
        let _ = what;
    }
}

#[test]
fn zero_phase_filtering_matches_scipy_sosfiltfilt() {
    // scipy.signal.sosfiltfilt(sos, x) with padtype="odd", padlen=None, scipy 1.17.1.
    let x = r::test_signal();
    for (k, &(_, butter, order, low, fc)) in r::APPLIED.iter().enumerate() {
        let y = design(butter, order, low, fc)
            .filter_zero_phase(&x)
            .unwrap();
        assert_eq!(y.len(), x.len());
        for (i, &want) in r::SOSFILTFILT[k].iter().enumerate() {
            assert_close(y[7 * i], want, 1e-10, 1e-11);
        }
    }
}

#[test]
fn initial_conditions_match_scipy_sosfilt_zi() {
    // scipy.signal.sosfilt_zi(sos), scipy 1.17.1.
    for (k, &(_, butter, order, low, fc)) in r::APPLIED.iter().enumerate() {
        let zi: Vec<f64> = design(butter, order, low, fc)
            .initial_conditions()
            .into_iter()
            .flatten()
            .collect();
        assert_eq!(zi.len(), r::SOSFILT_ZI[k].len());
        for (g, &w) in zi.iter().zip(r::SOSFILT_ZI[k]) {
            assert_close(*g, w, 1e-11, 1e-13);
        }
    }
}

#[test]
fn magnitude_response_matches_scipy_sosfreqz() {
    // abs(scipy.signal.sosfreqz(sos, worN=RESPONSE_HZ, fs=1000.0)[1]), scipy 1.17.1.
    for (k, &(_, butter, order, low, fc)) in r::APPLIED.iter().enumerate() {
        let f = design(butter, order, low, fc);
        for (&fr, &want) in r::RESPONSE_HZ.iter().zip(r::RESPONSE_MAG[k]) {
            let got = f.response(hz(fr), hz(1000.0)).unwrap().magnitude;
            assert_close(got, want, 1e-11, 1e-14);
        }
    }
}

#[test]
fn streaming_in_chunks_equals_filtering_at_once() {
    // Identity: the state carried between chunks makes chunked output equal the one-call output.
    let x = r::test_signal();
    let f = design(true, 6, true, 40.0);
    let whole = f.filter(&x).unwrap();
    let mut s = StreamingFilter::new(f);
    let mut chunked = x.clone();
    for c in chunked.chunks_mut(37) {
        s.process(c).unwrap();
    }
    assert_eq!(chunked, whole);
}

#[test]
fn second_order_bessel_has_minus_90_degrees_at_cutoff() {
    // Closed form: the phase-normalised θ_2 is s² + √3·s + 1 (s² + 3s + 3 with s → √3·s, over 3),
    // whose phase at ω = 1 is −π/2; the bilinear prewarp maps ω = 1 to the digital cutoff.
    let f = SosFilter::bessel(2, FilterBand::LowPass, hz(50.0), hz(1000.0)).unwrap();
    let phase = f.response(hz(50.0), hz(1000.0)).unwrap().phase;
    assert_close(phase, -std::f64::consts::FRAC_PI_2, 1e-12, 1e-12);
}

#[test]
fn decimation_matches_scipy_decimate_with_butterworth() {
    // scipy.signal.decimate(x, 4, ftype=dlti(*butter(8, 0.8/4, output="zpk")), zero_phase=True).
    let y = decimate(&r::test_signal(), 4).unwrap();
    assert_eq!(y.len(), r::DECIMATE_4.len());
    for (g, &w) in y.iter().zip(r::DECIMATE_4) {
        assert_close(*g, w, 1e-9, 1e-10);
    }
    assert!(decimate(&[1.0; 27], 4).is_err());
    assert!(decimate(&[1.0; 100], 1).is_err());
}

#[test]
fn moving_average_matches_numpy_convolve() {
    // numpy.convolve(x, ones(25)/25, mode="valid"), numpy 2.4.6.
    let y = moving_average(&r::test_signal(), 25).unwrap();
    assert_eq!(y.len(), 400 - 25 + 1);
    for (i, &w) in r::MOVING_AVERAGE_25.iter().enumerate() {
        assert_close(y[7 * i], w, 1e-13, 1e-14);
    }
}

#[test]
fn linear_resampling_matches_numpy_interp() {
    // numpy.interp(linspace(0.0013, 0.398, 57), n/1000, x), numpy 2.4.6.
    let t: Vec<f64> = (0..400).map(|i| i as f64 / 1000.0).collect();
    let nt: Vec<f64> = (0..57)
        .map(|k| 0.0013 + (0.398 - 0.0013) * k as f64 / 56.0)
        .collect();
    let y = resample_linear(&t, &r::test_signal(), &nt).unwrap();
    for (g, &w) in y.iter().zip(r::INTERP) {
        assert_close(*g, w, 1e-12, 1e-13);
    }
}

#[test]
fn statistics_match_numpy() {
    // numpy 2.4.6: min, max, mean, std(ddof=1), sqrt(mean(x**2)), ptp of the test signal.
    let s = summarize(&r::test_signal()).unwrap();
    let got = [s.min, s.max, s.mean, s.std_dev, s.rms, s.peak_to_peak];
    for (g, w) in got.iter().zip(r::STATS) {
        assert_close(*g, w, 1e-14, 1e-15);
    }
    let w = summarize_windows(&r::test_signal(), 64).unwrap();
    assert_eq!(w.len(), r::WINDOW_STATS.len());
    for (s, want) in w.iter().zip(r::WINDOW_STATS) {
        let got = [s.min, s.max, s.mean, s.std_dev, s.rms];
        for (g, w) in got.iter().zip(want) {
            assert_close(*g, *w, 1e-13, 1e-15);
        }
    }
    assert_eq!(
        rising_crossings(&r::test_signal(), s_mean()),
        r::RISING_MEAN_CROSSINGS
    );
}

fn s_mean() -> f64 {
    r::STATS[2]
}

#[test]
fn rainflow_counts_the_astm_e1049_example() {
    // ASTM E1049-85 (2017) §5.4.4, Fig. 6 example history -2, 1, -3, 5, -1, 3, -4, 4, -2 (from
    // memory): range 3 → 0.5, 4 → 1.5, 6 → 0.5, 8 → 1.0, 9 → 0.5 cycles, which
    // rainflow.count_cycles 3.2.0 also gives (RAINFLOW_E1049).
    let c = rainflow_cycles(&[-2.0, 1.0, -3.0, 5.0, -1.0, 3.0, -4.0, 4.0, -2.0]).unwrap();
    assert_eq!(
        counts_by_range(&c),
        vec![(3.0, 0.5), (4.0, 1.5), (6.0, 0.5), (8.0, 1.0), (9.0, 0.5)]
    );
    assert_eq!(counts_by_range(&c), r::RAINFLOW_E1049.to_vec());
}

#[test]
fn rainflow_cycles_equal_the_rainflow_package() {
    // list(rainflow.extract_cycles(h)), rainflow 3.2.0, on an integer-valued random history.
    let h = r::lcg_history(1, 40, 10);
    let c = rainflow_cycles(&h).unwrap();
    let got: Vec<(f64, f64, f64, usize, usize)> = c
        .iter()
        .map(|c| (c.range, c.mean, c.count, c.start, c.end))
        .collect();
    assert_eq!(got, r::RAINFLOW_CYCLES_1_40_10.to_vec());
}

#[test]
fn rainflow_counted_in_blocks_equals_the_rainflow_package() {
    // The same reference as above (rainflow 3.2.0, extract_cycles), the history fed to the
    // counter in blocks of every size from 1 to 41 samples, empty blocks in between.
    let h = r::lcg_history(1, 40, 10);
    for size in 1..=41 {
        let mut counter = RainflowCounter::new();
        for block in h.chunks(size) {
            counter.add(block).unwrap();
            counter.add(&[]).unwrap();
        }
        let got: Vec<(f64, f64, f64, usize, usize)> = counter
            .finish()
            .iter()
            .map(|c| (c.range, c.mean, c.count, c.start, c.end))
            .collect();
        assert_eq!(got, r::RAINFLOW_CYCLES_1_40_10.to_vec(), "blocks of {size}");
    }
}

#[test]
fn rainflow_summaries_and_histograms_equal_the_rainflow_package() {
    // rainflow.count_cycles(h) and count_cycles(h, binsize=250.0), rainflow 3.2.0, eight random
    // histories of 2000 integer samples: integers keep both sides exact.
    for &(seed, distinct, total, sum_r, sum_r3, bins) in r::RAINFLOW_SUMMARIES {
        let h = r::lcg_history(seed, 2000, 1000);
        let c = rainflow_cycles(&h).unwrap();
        let by = counts_by_range(&c);
        assert_eq!(by.len(), distinct, "seed {seed}");
        assert_eq!(by.iter().map(|p| p.1).sum::<f64>(), total);
        assert_eq!(by.iter().map(|p| p.0 * p.1).sum::<f64>(), sum_r);
        assert_close(
            by.iter().map(|p| p.1 * p.0.powi(3)).sum::<f64>(),
            sum_r3,
            1e-15,
            0.0,
        );
        let hist = range_histogram(&c, 250.0).unwrap();
        let got: Vec<(f64, f64)> = hist.iter().map(|b| (b.upper, b.count)).collect();
        assert_eq!(got, bins.to_vec(), "seed {seed}");
    }
}

#[test]
fn miner_damage_of_the_astm_example() {
    // Closed form: D = Σ n·S^m / C over the E1049 example counts, C = 1e6, m = 3.
    let c = rainflow_cycles(&[-2.0, 1.0, -3.0, 5.0, -1.0, 3.0, -4.0, 4.0, -2.0]).unwrap();
    let sn = SnCurve::basquin(1e6, 3.0).unwrap();
    let want = (0.5 * 27.0 + 1.5 * 64.0 + 0.5 * 216.0 + 512.0 + 0.5 * 729.0) / 1e6;
    assert_close(miner_damage(&c, &sn), want, 1e-15, 0.0);
    // With an endurance limit of 5, only the ranges 6, 8 and 9 count.
    let limited = sn.with_endurance_limit(5.0).unwrap();
    assert_close(
        miner_damage(&c, &limited),
        (0.5 * 216.0 + 512.0 + 0.5 * 729.0) / 1e6,
        1e-15,
        0.0,
    );
}

#[test]
fn errors_for_bad_input() {
    let f = design(true, 2, true, 50.0);
    assert!(matches!(
        f.filter(&[]),
        Err(PhysicsError::NotEnoughData { .. })
    ));
    assert!(matches!(
        f.filter(&[1.0, f64::NAN]),
        Err(PhysicsError::InvalidParameter { .. })
    ));
    assert!(f.filter_zero_phase(&[1.0; 9]).is_err());
    assert!(SosFilter::butterworth(0, FilterBand::LowPass, hz(10.0), hz(100.0)).is_err());
    assert!(SosFilter::bessel(3, FilterBand::HighPass, hz(50.0), hz(100.0)).is_err());
    assert!(SosFilter::bessel(3, FilterBand::HighPass, hz(10.0), hz(f64::NAN)).is_err());
    assert!(summarize(&[]).is_err());
    assert!(rainflow_cycles(&[f64::INFINITY]).is_err());
    assert!(range_histogram(&[], 0.0).is_err());
}

mod properties {
    use super::*;
    use proptest::prelude::*;

    proptest! {
        #![proptest_config(ProptestConfig::with_cases(64))]

        #[test]
        fn rainflow_counts_every_reversal_range_once(x in proptest::collection::vec(-1e3f64..1e3, 0..300)) {
            // Identity of the three-point method (ASTM E1049-85 (2017) §5.4.4): each range between
            // adjacent reversals is counted once as half a cycle, two halves making a full one,
            // so the counts sum to (reversals − 1) / 2.
            let r = reversals(&x).len();
            let total: f64 = rainflow_cycles(&x).unwrap().iter().map(|c| c.count).sum();
            prop_assert_eq!(total, r.saturating_sub(1) as f64 / 2.0);
        }

        #[test]
        fn rainflow_in_blocks_is_rainflow_of_the_whole(
            x in proptest::collection::vec(-1e3f64..1e3, 0..300),
            cuts in proptest::collection::vec(0usize..300, 0..6),
        ) {
            // Cutting a history anywhere changes nothing: the counter carries the reversal
            // search and the stack across blocks.
            let mut cuts: Vec<usize> = cuts.into_iter().map(|c| c.min(x.len())).collect();
            cuts.sort_unstable();
            let mut counter = RainflowCounter::new();
            let mut from = 0;
            for c in cuts.into_iter().chain([x.len()]) {
                counter.add(&x[from..c]).unwrap();
                from = c;
            }
            prop_assert_eq!(counter.finish(), rainflow_cycles(&x).unwrap());
        }

        #[test]
        fn filtering_is_linear(a in proptest::collection::vec(-10f64..10.0, 50..200), k in -5f64..5.0) {
            // Linearity of an LTI filter from a zero state: H(k·x) = k·H(x).
            let f = design(true, 4, true, 100.0);
            let y = f.filter(&a).unwrap();
            let scaled: Vec<f64> = a.iter().map(|v| k * v).collect();
            let ys = f.filter(&scaled).unwrap();
            for (p, q) in ys.iter().zip(&y) {
                prop_assert!((p - k * q).abs() <= 1e-12 * (1.0 + q.abs() * k.abs()));
            }
        }

        #[test]
        fn zero_phase_keeps_a_constant(c in -1e3f64..1e3, n in 40usize..300) {
            // Odd extension and settled initial states make a constant pass unchanged.
            let f = design(false, 3, true, 60.0);
            let y = f.filter_zero_phase(&vec![c; n]).unwrap();
            for v in y {
                prop_assert!((v - c).abs() <= 1e-10 * (1.0 + c.abs()));
            }
        }
    }
}

/// The script bindings (src/script/signal.rs) give what the Rust functions give.
#[cfg(feature = "script")]
mod script {
    use super::*;
    use gaugebook::script::{Session, SessionOptions};

    fn run(code: &str) {
        let mut s = Session::new(SessionOptions::default()).expect("session");
        if let Err(e) = s.eval_cell(code, "signal test") {
            panic!("{}", e.render());
        }
    }

    #[test]
    fn script_lowpass_matches_scipy_sosfilt() {
        // scipy.signal.sosfilt(butter(4, 50, fs=1000, output="sos"), x) sample 7·10, scipy 1.17.1.
        let x = r::test_signal();
        let values: Vec<String> = x.iter().map(|v| format!("{v:?}")).collect();
        run(&format!(
            "let x = column([{}], \"mV/V\");\n\
             let y = lowpass(x, #{{ cutoff: 50.0 * Hz, rate: 1000.0 * Hz, order: 4 }});\n\
             assert_close(y[70].value(\"mV/V\"), {:?}, 1e-10);",
            values.join(", "),
            r::SOSFILT[0][10]
        ));
    }

    #[test]
    fn script_rainflow_and_stats() {
        // ASTM E1049-85 (2017) Fig. 6 history (from memory); numpy.std([1, 2, 3, 4], ddof=1).
        run(r#"
            let c = rainflow(column([-2.0, 1.0, -3.0, 5.0, -1.0, 3.0, -4.0, 4.0, -2.0], "MPa"));
            assert_close(c.cycles, 4.0, 1e-15);
            let d = miner_damage(c, #{ range: 1.0 * MPa, cycles: 1e6, m: 3.0, endurance_limit: 5.0 * MPa });
            assert_close(d, (0.5 * 216.0 + 512.0 + 0.5 * 729.0) / 1e6, 1e-12);
            let s = stats(column([1.0, 2.0, 3.0, 4.0], "N"));
            assert_close(s.std, q("1.2909944487358056 N"), 1e-14);
            assert_close(s.rms, q("2.7386127875258306 N"), 1e-14);
        "#);
    }

    #[test]
    fn script_errors_are_catchable() {
        run(r#"
            let caught = 0;
            try { lowpass(column([1.0, 2.0], "V"), #{ cutoff: 600.0 * Hz, rate: 1000.0 * Hz }); } catch (e) { caught += 1; }
            try { lowpass(column([1.0, 2.0], "V"), #{ cutoff: 60.0 * Hz, rate: 1000.0 * Hz, design: "fast" }); } catch (e) { caught += 1; }
            try { lowpass(column([1.0, 2.0], "V"), #{ cutof: 60.0 * Hz, rate: 1000.0 * Hz }); } catch (e) { caught += 1; }
            try { stats(column([1.0], "V")); } catch (e) { caught += 1; }
            assert_eq(caught, 4);
        "#);
    }
}
