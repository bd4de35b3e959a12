//! Class evaluations: OIML R 60:2021, ASTM E74-18, ISO 376:2011. Limits as recalled from the
//! standards (marked "from memory" beside each); the synthetic runs are constructed so that
//! each limit is hit from both sides.

use crate::common::assert_close;
use gaugebook::{
    CalibrationRun, CreepHold, Direction, Iso376Class, Iso376Data, LoadKind, OimlClass, R60Extras,
    R60LoadCell, VERDICT_CAUTION, classify_iso376, evaluate_e74, evaluate_r60,
};

/// OIML R 60-1:2021 5.1.2 (values from memory): n_LC ranges per class.
#[test]
fn r60_interval_ranges() {
    assert_eq!(OimlClass::A.interval_range(), (50_000, None));
    assert_eq!(OimlClass::B.interval_range(), (5_000, Some(100_000)));
    assert_eq!(OimlClass::C.interval_range(), (500, Some(10_000)));
    assert_eq!(OimlClass::D.interval_range(), (100, Some(1_000)));
}

/// OIML R 60-1:2021 5.3.2 and Table 4 (band values from memory): MPE = p_LC × 0.5 / 1.0 /
/// 1.5 v with band edges per class; p_LC = 0.7.
#[test]
fn r60_mpe_bands() {
    let cases = [
        (OimlClass::A, 50_000.0, 200_000.0),
        (OimlClass::B, 5_000.0, 20_000.0),
        (OimlClass::C, 500.0, 2_000.0),
        (OimlClass::D, 50.0, 200.0),
    ];
    for (c, e1, e2) in cases {
        assert_close(c.mpe_intervals(e1, 0.7), 0.35, 1e-15, 0.0);
        assert_close(c.mpe_intervals(e1 * 1.0001, 0.7), 0.7, 1e-15, 0.0);
        assert_close(c.mpe_intervals(e2, 0.7), 0.7, 1e-15, 0.0);
        assert_close(c.mpe_intervals(e2 * 1.0001, 0.7), 1.05, 1e-15, 0.0);
    }
    assert_eq!(OimlClass::A.min_load_temperature_step(), 2.0);
    assert_eq!(OimlClass::C.min_load_temperature_step(), 5.0);
}

const EMAX: f64 = 10_000.0;

/// A C3 cell (n_max 3000, E_max 10 kN, v = 3.333 N) whose readings deviate from the
/// reference line by `err_v[i]` test intervals at loads 0, 10, …, 70, 75, 90, 100 % E_max (the
/// reference line passes through 0 and 75 %, so err_v[0] and err_v[8] are 0).
fn c3_run(err_v: &[f64; 11]) -> (R60LoadCell, CalibrationRun) {
    let cell = R60LoadCell::new(OimlClass::C, 3000, EMAX, 0.0, 1.0).unwrap();
    let v = cell.test_interval();
    let s = 2e-7; // V/V per N (2 mV/V at 10 kN)
    let loads = [
        0.0, 1000.0, 2000.0, 3000.0, 4000.0, 5000.0, 6000.0, 7000.0, 7500.0, 9000.0, 10000.0,
    ];
    let y: Vec<f64> = loads
        .iter()
        .zip(err_v)
        .map(|(l, e)| s * (l + e * v))
        .collect();
    let mut run = CalibrationRun::force_in_output_ratio();
    run.push_series(&loads, &y, Direction::Ascending, 0.0)
        .unwrap();
    (cell, run)
}

#[test]
fn r60_passing_cell_and_deciding_limit() {
    // Errors inside the bands: ≤ 0.35 v below 500 v (1667 N), ≤ 0.7 v to 2000 v (6667 N),
    // ≤ 1.05 v above; zero at 0 and 75 % (the reference line passes there).
    let (cell, run) = c3_run(&[0.0, 0.3, 0.5, 0.6, 0.65, 0.6, 0.5, 0.2, 0.0, 0.9, 1.0]);
    let v = evaluate_r60(&cell, &run, &R60Extras::default()).unwrap();
    assert!(v.passed, "{v}");
    let d = v.deciding().unwrap();
    // 1.0 v of 1.05 v at 100 % uses 95 % of its limit: the least margin.
    assert_eq!(d.name, "error at 10000 N (ascending, series 0)");
    assert_close(d.ratio(), 1.0 / 1.05, 1e-9, 0.0);
    assert!(v.to_string().contains(VERDICT_CAUTION));
}

#[test]
fn r60_failing_point_is_named() {
    // 0.8 v at 5000 N (1500 v, band 0.7 v) fails.
    let (cell, run) = c3_run(&[0.0, 0.3, 0.5, 0.6, 0.65, 0.8, 0.5, 0.2, 0.0, 0.9, 1.0]);
    let v = evaluate_r60(&cell, &run, &R60Extras::default()).unwrap();
    assert!(!v.passed);
    let f = v.failures();
    assert_eq!(f.len(), 1);
    assert_eq!(f[0].name, "error at 5000 N (ascending, series 0)");
    assert_close(f[0].limit, 0.7 * cell.test_interval(), 1e-12, 0.0);
}

#[test]
fn r60_creep_dr_and_temperature() {
    let (cell, run) = c3_run(&[0.0; 11]);
    let v = cell.test_interval();
    let s = 2e-7 * EMAX; // output at E_max
    let mpe = 1.05 * v; // at E_max (3000 v > 2000 v)
    // Creep 0.6 |MPE| over 30 min, 0.1 |MPE| from 20 to 30 min: both pass (0.7 and 0.15).
    let t = [0.0, 1200.0, 1800.0];
    let y = [s, s + 2e-7 * 0.5 * mpe, s + 2e-7 * 0.6 * mpe];
    let extras = R60Extras {
        creep: Some(CreepHold::new(&t, &y).unwrap()),
        dead_load_return: Some(0.4 * v),
        min_load_temperature_effect: Some((0.5, 10.0)), // 0.5 N over 10 K: 0.25 N per 5 °C
    };
    let r = evaluate_r60(&cell, &run, &extras).unwrap();
    assert!(r.passed, "{r}");
    // 0.25 N per 5 °C against p_LC v_min = 0.7 N.
    let tc = r
        .checks
        .iter()
        .find(|c| c.name.starts_with("minimum dead load output change"))
        .unwrap();
    assert_close(tc.value, 0.25, 1e-12, 0.0);
    assert_close(tc.limit, 0.7, 1e-12, 0.0);
    // DR of 0.6 v fails the 0.5 v limit.
    let bad = R60Extras {
        dead_load_return: Some(0.6 * v),
        ..extras.clone()
    };
    let r = evaluate_r60(&cell, &run, &bad).unwrap();
    assert_eq!(r.failures()[0].name, "minimum dead load output return DR");
    // Creep 0.2 |MPE| between 20 and 30 min fails the 0.15 limit.
    let y2 = [s, s + 2e-7 * 0.4 * mpe, s + 2e-7 * 0.6 * mpe];
    let bad = R60Extras {
        creep: Some(CreepHold::new(&t, &y2).unwrap()),
        ..extras
    };
    let r = evaluate_r60(&cell, &run, &bad).unwrap();
    assert_eq!(r.failures()[0].name, "creep between 20 and 30 min");
}

/// R 60-3:2021 2.1.2.3: without a test load at 75 % of the range the reference indication is
/// interpolated between the adjacent loads; a straight run then has zero error everywhere.
#[test]
fn r60_reference_line_interpolated() {
    let cell = R60LoadCell::new(OimlClass::C, 3000, EMAX, 0.0, 1.0).unwrap();
    let loads: Vec<f64> = (0..=5).map(|i| i as f64 * 2000.0).collect();
    // A bow: the line through 0 and 7500 N (between 6000 and 8000) sets the errors.
    let y: Vec<f64> = loads
        .iter()
        .map(|l| 2e-7 * l + 1e-13 * l * (EMAX - l))
        .collect();
    let mut run = CalibrationRun::force_in_output_ratio();
    run.push_series(&loads, &y, Direction::Ascending, 0.0)
        .unwrap();
    let v = evaluate_r60(&cell, &run, &R60Extras::default()).unwrap();
    let y75 = 2e-7 * 6000.0
        + 1e-13 * 6000.0 * 4000.0
        + (2e-7 * 8000.0 + 1e-13 * 8000.0 * 2000.0 - 2e-7 * 6000.0 - 1e-13 * 6000.0 * 4000.0)
            * 0.75;
    let slope = y75 / 7500.0;
    let at = |l: f64| (2e-7 * l + 1e-13 * l * (EMAX - l) - slope * l) / slope;
    let e = v
        .checks
        .iter()
        .find(|c| c.name == "error at 4000 N (ascending, series 0)")
        .unwrap();
    assert_close(e.value, at(4000.0), 1e-9, 1e-12);
}

#[test]
fn r60_interval_count_outside_class() {
    let cell = R60LoadCell::new(OimlClass::D, 3000, EMAX, 0.0, 1.0).unwrap();
    let (_, run) = c3_run(&[0.0; 11]);
    let v = evaluate_r60(&cell, &run, &R60Extras::default()).unwrap();
    assert_eq!(v.failures()[0].name, "n_max against the class maximum");
    assert!(
        R60LoadCell::new(OimlClass::C, 3000, EMAX, 0.0, 1.0)
            .unwrap()
            .with_p_lc(0.2)
            .is_err()
    );
}

#[test]
fn r60_rejects_torque_runs() {
    let cell = R60LoadCell::new(OimlClass::C, 3000, EMAX, 0.0, 1.0).unwrap();
    let mut run = CalibrationRun::new(LoadKind::Torque, "mV/V");
    run.push_series(&[0.0, 1.0], &[0.0, 1.0], Direction::Ascending, 0.0)
        .unwrap();
    assert!(evaluate_r60(&cell, &run, &R60Extras::default()).is_err());
}

/// ASTM E74-18 (from memory): LLF = 2.4 s, class AA lower limit 2000 LLF, class A 400 LLF, not
/// below 2000 / 400 resolutions. For a linear curve, s in force units is the residual standard
/// deviation divided by the slope (identity).
#[test]
fn e74_llf_and_ranges() {
    let f: Vec<f64> = (1..=10).map(|i| i as f64 * 10_000.0).collect();
    let e = [3.0, -2.0, 1.0, -4.0, 2.0, 0.0, -1.0, 3.0, -2.0, 0.0]; // N equivalent
    let s0 = 2e-7;
    let y: Vec<f64> = f.iter().zip(&e).map(|(f, e)| s0 * (f + e)).collect();
    let mut run = CalibrationRun::force_in_output_ratio();
    run.push_series(&f, &y, Direction::Ascending, 0.0).unwrap();
    let r = evaluate_e74(&run, 1, 0.01, &[]).unwrap();
    let s_expected = r.fit.residual_sd() / r.fit.coefficients()[1];
    assert_close(r.s, s_expected, 1e-9, 0.0);
    assert_close(r.llf, 2.4 * s_expected, 1e-9, 0.0);
    assert_close(r.class_aa_lower, 2000.0 * r.llf, 1e-12, 0.0);
    assert_close(r.class_a_lower, 400.0 * r.llf, 1e-12, 0.0);
    assert_close(r.upper, 100_000.0, 0.0, 0.0);
    // s ≈ 2.4 N here: class AA lower limit ≈ 11 500 N < 100 kN, so both ranges exist.
    assert!(r.verdict(true).passed && r.verdict(false).passed);
    // A coarse resolution governs the lower limit.
    let coarse = evaluate_e74(&run, 1, 100.0, &[]).unwrap();
    assert_close(coarse.class_aa_lower, 200_000.0, 1e-12, 0.0);
    assert!(!coarse.verdict(true).passed);
    // E74-18: further components in quadrature (from memory).
    let more = evaluate_e74(&run, 1, 0.01, &[r.s]).unwrap();
    assert_close(more.llf, 2.4 * r.s * 2f64.sqrt(), 1e-9, 0.0);
    assert!(evaluate_e74(&run, 6, 0.01, &[]).is_err());
}

fn iso_data(b_pct: f64, bp_pct: f64) -> Iso376Data {
    // Deflections 2e-5 per N; series 3 is higher by b_pct·(X̄) and series 2 by bp_pct.
    let f: Vec<f64> = (1..=8).map(|i| i as f64 * 12_500.0).collect();
    let x: Vec<f64> = f.iter().map(|f| f * 2e-5).collect();
    let x3: Vec<f64> = x.iter().map(|v| v * (1.0 + b_pct / 100.0)).collect();
    let x2: Vec<f64> = x.iter().map(|v| v * (1.0 + bp_pct / 100.0)).collect();
    Iso376Data::new(f, x.clone(), x2, x3, x)
}

/// ISO 376:2011 Table 2 (from memory) limits; closed-form b for one series offset by δ:
/// b = δ·X / X̄_r = δ / (1 + δ/3).
#[test]
fn iso376_classification_by_reproducibility() {
    let r = classify_iso376(&iso_data(0.08, 0.0)).unwrap();
    let b = 0.08 / (1.0 + 0.0008 / 3.0);
    assert_close(r.steps[3].reproducibility, b, 1e-9, 0.0);
    assert_eq!(r.class, Some(Iso376Class::Half)); // 0.05 < b ≤ 0.10
    assert!(r.verdict.passed);
    assert!(r.verdict.to_string().contains("ISO 376:2011 class 0.5"));
    let r = classify_iso376(&iso_data(0.3, 0.0)).unwrap();
    assert_eq!(r.class, Some(Iso376Class::Two));
    let r = classify_iso376(&iso_data(0.5, 0.0)).unwrap();
    assert_eq!(r.class, None);
    assert!(!r.verdict.passed);
}

/// b′ = |X₂ − X₁|/((X₁ + X₂)/2) = δ/(1 + δ/2) for X₂ = X₁(1 + δ).
#[test]
fn iso376_repeatability_zero_creep_reversibility() {
    let mut d = iso_data(0.0, 0.03);
    let r = classify_iso376(&d).unwrap();
    assert_close(r.steps[0].repeatability, 0.03 / (1.0 + 0.00015), 1e-9, 0.0);
    assert_eq!(r.class, Some(Iso376Class::Half)); // 0.025 < b′ ≤ 0.05
    d.x2 = d.x1.clone();
    let xn = *d.x1.last().unwrap();
    d.zero_before_after = Some((0.0, 0.02e-2 * xn)); // f0 = 0.02 %: class 0.5 (≤ 0.025)
    d.creep_30_300 = Some((xn, xn * (1.0 + 0.01e-2))); // c = 0.01 %: class 00
    let r = classify_iso376(&d).unwrap();
    assert_close(r.zero.unwrap(), 0.02, 1e-9, 0.0);
    assert_close(r.creep.unwrap(), 0.01, 1e-9, 0.0);
    assert_eq!(r.class, Some(Iso376Class::Half));
    d.zero_before_after = None;
    d.x4_decreasing = Some(d.x3.iter().map(|v| v * 1.001).collect()); // v = 0.1 %
    let r = classify_iso376(&d).unwrap();
    assert_close(r.steps[2].reversibility.unwrap(), 0.1, 1e-9, 0.0);
    assert_eq!(r.class, Some(Iso376Class::Half)); // 0.07 < v ≤ 0.15
    // Resolution: X_1 = 0.25 at the first step; r = 1e-4 gives 2500 r < 4000 r (class 00).
    let mut d = iso_data(0.0, 0.0);
    d.resolution = Some(1e-4);
    assert_eq!(classify_iso376(&d).unwrap().class, Some(Iso376Class::Half));
}

#[test]
fn iso376_bad_input() {
    let mut d = iso_data(0.0, 0.0);
    d.x5.pop();
    assert!(
        classify_iso376(&d)
            .unwrap_err()
            .to_string()
            .contains("series X5")
    );
    let d = Iso376Data::new(
        vec![1.0, 2.0],
        vec![1.0; 2],
        vec![1.0; 2],
        vec![1.0; 2],
        vec![1.0; 2],
    );
    assert!(classify_iso376(&d).is_err());
}

/// OIML R 60-1:2021 3.5: Z = (E_max − E_min)/(2 DR); a declared Z = 5000 on 10 kN allows
/// DR ≤ 1 N, tighter here than 0.5 v = 1.67 N.
#[test]
fn r60_declared_z() {
    let (mut cell, run) = c3_run(&[0.0; 11]);
    cell.z = Some(5000.0);
    let extras = R60Extras {
        dead_load_return: Some(1.2),
        ..R60Extras::default()
    };
    let v = evaluate_r60(&cell, &run, &extras).unwrap();
    let f = v.failures();
    assert_eq!(f.len(), 1, "{v}");
    assert_eq!(f[0].name, "DR against the declared Z");
    assert_close(f[0].limit, 1.0, 1e-12, 0.0);
}

/// Differential check of the E74 quadratic evaluation against numpy 2.4.6:
/// `p = np.polyfit(f, y, 2); r = y - np.polyval(p, f); sl = np.polyval(np.polyder(p), f);
/// s = sqrt(sum((r/sl)**2)/(n - 3))` = 2.5738233940872988 N for the data below.
#[test]
fn e74_quadratic_against_numpy() {
    let f: Vec<f64> = (1..=10).map(|i| i as f64 * 10_000.0).collect();
    let e = [3.0, -2.0, 1.0, -4.0, 2.0, 0.0, -1.0, 3.0, -2.0, 0.0];
    let y: Vec<f64> = f
        .iter()
        .zip(&e)
        .map(|(f, e)| 2e-7 * (f + e) + 1e-15 * f * f)
        .collect();
    let mut run = CalibrationRun::force_in_output_ratio();
    run.push_series(&f, &y, Direction::Ascending, 0.0).unwrap();
    let r = evaluate_e74(&run, 2, 0.01, &[]).unwrap();
    assert_close(r.s, 2.5738233940872988, 1e-7, 0.0);
    assert_close(r.llf, 6.177176145809517, 1e-7, 0.0);
}

/// Readings of an ISO 376 run: six force steps after a zero reading, each pass with its own
/// zero offset and gain (deflection 2e-5 per N times the gain).
fn iso_pass(zero: f64, gain: f64) -> (Vec<f64>, Vec<f64>) {
    let f: Vec<f64> = (0..=6).map(|i| i as f64 * 20_000.0).collect();
    let y: Vec<f64> = f.iter().map(|f| zero + gain * 2e-5 * f).collect();
    (f, y)
}

fn iso_run(zeros: [f64; 4], gains: [f64; 6]) -> CalibrationRun {
    let mut run = CalibrationRun::new(LoadKind::Force, "mV/V");
    let push = |run: &mut CalibrationRun, z: f64, g: f64, rot: f64, down: Option<f64>| {
        let (f, y) = iso_pass(z, g);
        run.push_series(&f, &y, Direction::Ascending, rot).unwrap();
        if let Some(gd) = down {
            let (mut f, mut y) = iso_pass(z, gd);
            f.reverse();
            y.reverse();
            run.push_series(&f, &y, Direction::Descending, rot).unwrap();
        }
    };
    push(&mut run, zeros[0], gains[0], 0.0, None);
    push(&mut run, zeros[1], gains[1], 0.0, None);
    push(&mut run, zeros[2], gains[2], 120.0, Some(gains[3]));
    push(&mut run, zeros[3], gains[4], 240.0, Some(gains[5]));
    run
}

/// The run form of ISO 376 equals the array form built from the same deflections (ISO
/// 376:2011 7.4 series order, from memory). With zero offsets of 0 the deflections are the
/// readings, so the data and the results are equal exactly.
#[test]
fn iso376_from_run_equals_array_form() {
    let gains = [1.0, 1.0003, 1.0008, 1.0012, 0.9995, 1.0004];
    let run = iso_run([0.0; 4], gains);
    let from_run = Iso376Data::from_run(&run).unwrap();
    let step = |g: f64| -> Vec<f64> { iso_pass(0.0, g).1[1..].to_vec() };
    let forces: Vec<f64> = (1..=6).map(|i| i as f64 * 20_000.0).collect();
    let mut arrays = Iso376Data::new(
        forces,
        step(gains[0]),
        step(gains[1]),
        step(gains[2]),
        step(gains[4]),
    );
    arrays.x4_decreasing = Some(step(gains[3]));
    arrays.x6_decreasing = Some(step(gains[5]));
    assert_eq!(from_run, arrays);
    let (a, b) = (
        classify_iso376(&from_run).unwrap(),
        classify_iso376(&arrays).unwrap(),
    );
    assert_eq!(a, b);
    // Closed form (ISO 376:2011 7.5.1, from memory): b = (max − min)/mean of X1, X3, X5.
    let (hi, lo, mean) = (1.0008, 0.9995, (1.0 + 1.0008 + 0.9995) / 3.0);
    assert_close(
        a.steps[2].reproducibility,
        (hi - lo) / mean * 100.0,
        1e-9,
        0.0,
    );
    // v = mean of |X4' − X3|/X3 and |X6' − X5|/X5 (7.5.5, from memory).
    let v = ((1.0012 - 1.0008) / 1.0008 + (1.0004 - 0.9995) / 0.9995) / 2.0 * 100.0;
    assert_close(a.steps[0].reversibility.unwrap(), v, 1e-9, 0.0);
}

/// Each pass's deflections are its readings minus its own zero reading; the decreasing series
/// is referred to the zero before the increasing series it follows.
#[test]
fn iso376_from_run_subtracts_each_zero() {
    let gains = [1.0, 1.0003, 1.0008, 1.0012, 0.9995, 1.0004];
    let plain = Iso376Data::from_run(&iso_run([0.0; 4], gains)).unwrap();
    let offset = Iso376Data::from_run(&iso_run([0.01, -0.02, 0.003, 0.5], gains)).unwrap();
    let pairs = [
        (&plain.x1, &offset.x1),
        (&plain.x2, &offset.x2),
        (&plain.x3, &offset.x3),
        (&plain.x5, &offset.x5),
        (
            plain.x4_decreasing.as_ref().unwrap(),
            offset.x4_decreasing.as_ref().unwrap(),
        ),
        (
            plain.x6_decreasing.as_ref().unwrap(),
            offset.x6_decreasing.as_ref().unwrap(),
        ),
    ];
    for (a, b) in pairs {
        for (x, y) in a.iter().zip(b) {
            assert_close(*y, *x, 1e-12, 1e-15);
        }
    }
}

#[test]
fn iso376_from_run_bad_input() {
    let msg = |run: &CalibrationRun| Iso376Data::from_run(run).unwrap_err().to_string();
    // Two mounting positions only.
    let mut run = CalibrationRun::new(LoadKind::Force, "mV/V");
    let (f, y) = iso_pass(0.0, 1.0);
    for rot in [0.0, 0.0, 120.0] {
        run.push_series(&f, &y, Direction::Ascending, rot).unwrap();
    }
    assert!(msg(&run).contains("mounting positions"), "{}", msg(&run));
    // One increasing series in the first position.
    let mut run = CalibrationRun::new(LoadKind::Force, "mV/V");
    for rot in [0.0, 120.0, 240.0] {
        run.push_series(&f, &y, Direction::Ascending, rot).unwrap();
    }
    assert!(msg(&run).contains("X1 and X2"), "{}", msg(&run));
    // A pass that does not start at zero load.
    let mut bad = CalibrationRun::new(LoadKind::Force, "mV/V");
    for rot in [0.0, 0.0, 120.0] {
        bad.push_series(&f, &y, Direction::Ascending, rot).unwrap();
    }
    bad.push_series(&f[1..], &y[1..], Direction::Ascending, 240.0)
        .unwrap();
    assert!(
        msg(&bad).contains("no reading at zero load"),
        "{}",
        msg(&bad)
    );
    // A pass missing a force step of X1.
    let mut gap = CalibrationRun::new(LoadKind::Force, "mV/V");
    for rot in [0.0, 0.0, 120.0] {
        gap.push_series(&f, &y, Direction::Ascending, rot).unwrap();
    }
    let (fg, yg): (Vec<f64>, Vec<f64>) = f
        .iter()
        .zip(&y)
        .filter(|(l, _)| **l != 60_000.0)
        .map(|(a, b)| (*a, *b))
        .unzip();
    gap.push_series(&fg, &yg, Direction::Ascending, 240.0)
        .unwrap();
    assert!(
        msg(&gap).contains("no reading at the force step 60000 N"),
        "{}",
        msg(&gap)
    );
}

/// The R 60 verdict carries each reading's error and the MPE envelope: the errors are the
/// checks' values, and the envelope steps from 0.35 v to 0.7 v at 500 v and to 1.05 v at
/// 2000 v (class C, p_LC = 0.7; R 60-1 Table 4, band values from memory).
#[test]
fn r60_verdict_points_and_envelope() {
    let mut err = [0.0; 11];
    err[5] = 0.3;
    let (cell, run) = c3_run(&err);
    let v = evaluate_r60(&cell, &run, &R60Extras::default()).unwrap();
    let tv = cell.test_interval();
    assert_eq!(v.points.len(), 11);
    assert_eq!(v.point_unit, "N");
    let p = v.points[5];
    assert_eq!(
        (p.load, p.direction, p.series),
        (5000.0, Direction::Ascending, 0)
    );
    assert_close(p.error, 0.3 * tv, 1e-9, 0.0);
    let check = v
        .checks
        .iter()
        .find(|c| c.name == "error at 5000 N (ascending, series 0)")
        .unwrap();
    assert_close(check.value, p.error, 1e-12, 0.0);
    assert_close(check.limit, p.limit, 1e-12, 0.0);
    let want = [
        (0.0, 0.35 * tv),
        (500.0 * tv, 0.35 * tv),
        (500.0 * tv, 0.7 * tv),
        (2000.0 * tv, 0.7 * tv),
        (2000.0 * tv, 1.05 * tv),
        (EMAX, 1.05 * tv),
    ];
    assert_eq!(v.envelope.len(), want.len(), "{:?}", v.envelope);
    for ((l, m), (wl, wm)) in v.envelope.iter().zip(want) {
        assert_close(*l, wl, 1e-12, 1e-9);
        assert_close(*m, wm, 1e-12, 0.0);
    }
    // Other standards carry no per-point envelope.
    let iso = classify_iso376(&iso_data(0.0, 0.0)).unwrap();
    assert!(iso.verdict.points.is_empty() && iso.verdict.envelope.is_empty());
}
