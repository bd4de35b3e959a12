//! Report figures of a calibration (issue 7 item 6): calibration curve with residuals, errors
//! against the class envelope, hysteresis loop, Monte Carlo histogram with its intervals. The
//! figures are checked through their SVG text: titles, axis labels and legend entries name the
//! series they should hold; bad input gives typed errors.

use gaugebook::{
    Axis, Budget, CalibrationRun, Direction, Distribution, Fit, FitModel, Input, LoadKind,
    MonteCarlo, OimlClass, Plot, PlotError, R60Extras, R60LoadCell, evaluate_r60,
};

fn up_down() -> CalibrationRun {
    let mut run = CalibrationRun::force_in_output_ratio();
    let up = [0.0, 2500.0, 5000.0, 7500.0, 10_000.0];
    let y: Vec<f64> = up.iter().map(|l| 2e-7 * l).collect();
    run.push_series(&up, &y, Direction::Ascending, 0.0).unwrap();
    let down: Vec<f64> = up.iter().rev().copied().collect();
    let yd: Vec<f64> = down
        .iter()
        .map(|l| 2e-7 * l + if *l > 0.0 && *l < 10_000.0 { 4e-7 } else { 0.0 })
        .collect();
    run.push_series(&down, &yd, Direction::Descending, 0.0)
        .unwrap();
    run
}

#[test]
fn calibration_curve_has_points_fit_and_residuals() {
    let run = up_down();
    let (x, y) = run.xy(None);
    let fit = Fit::new(&x, &y, FitModel::Polynomial(2)).unwrap();
    let p = Plot::calibration_curve(&run, &fit).unwrap();
    assert_eq!(p.panel_count(), 2);
    let svg = p.to_svg().unwrap();
    // V/V runs are drawn in mV/V, 10 kN loads in kN.
    for want in [
        "calibration curve and residuals",
        "indication (mV/V)",
        "residual (mV/V)",
        "load (kN)",
        "fit (polynomial of degree 2)",
        "ascending residual",
        "descending residual",
    ] {
        assert!(svg.contains(want), "missing {want}");
    }
    let empty = CalibrationRun::new(LoadKind::Force, "mV/V");
    assert!(matches!(
        Plot::calibration_curve(&empty, &fit),
        Err(PlotError::Empty { .. })
    ));
}

#[test]
fn class_errors_show_envelope_and_both_directions() {
    let run = up_down();
    let cell = R60LoadCell::new(OimlClass::C, 3000, 10_000.0, 0.0, 0.5).unwrap();
    let v = evaluate_r60(&cell, &run, &R60Extras::default()).unwrap();
    let svg = Plot::class_errors(&v).unwrap().to_svg().unwrap();
    for want in [
        "+MPE",
        "−MPE",
        "ascending",
        "descending",
        "error (N)",
        "OIML R 60:2021 class C, n_max = 3000",
    ] {
        assert!(svg.contains(want), "missing {want}");
    }
    // An ISO 376 verdict has no envelope: a typed error, not an empty figure.
    let iso = gaugebook::ClassVerdict::new("ISO 376:2011", "1", vec![]);
    let e = Plot::class_errors(&iso).unwrap_err();
    assert!(e.to_string().contains("without per-point errors"), "{e}");
}

#[test]
fn hysteresis_loop_names_each_series() {
    let svg = Plot::hysteresis_loop(&up_down()).unwrap().to_svg().unwrap();
    for want in [
        "hysteresis loop",
        "ascending, series 0 (0°)",
        "descending, series 1 (0°)",
        "deviation from terminal line (mV/V)",
    ] {
        assert!(svg.contains(want), "missing {want}");
    }
    let mut up = CalibrationRun::new(LoadKind::Force, "mV/V");
    up.push_series(&[0.0, 1.0], &[0.0, 2.0], Direction::Ascending, 0.0)
        .unwrap();
    let e = Plot::hysteresis_loop(&up).unwrap_err();
    assert!(
        e.to_string().contains("1 ascending and 0 descending"),
        "{e}"
    );
}

#[test]
fn monte_carlo_histogram_marks_three_intervals() {
    let b = Budget::new(vec![
        Input::type_b(
            "x",
            Distribution::Rectangular {
                mean: 1.0,
                half_width: 0.5,
            },
        )
        .unwrap(),
    ]);
    let gum = b.evaluate(|x| x[0]).unwrap();
    let mc = MonteCarlo::new(50_000, 5)
        .run(&b, |c: &[Vec<f64>]| c[0].clone())
        .unwrap();
    let p = Plot::monte_carlo(&mc, &gum, 0.95, Axis::new("y", "mm"), 1e3).unwrap();
    let svg = p.to_svg().unwrap();
    for want in [
        "Monte Carlo, 50000 trials (JCGM 101:2008)",
        "probabilistically symmetric 95 %",
        "shortest 95 %",
        // k = 1.960 for ν_eff = ∞ (a type B input; scipy.stats.norm.ppf(0.975) = 1.95996,
        // scipy 1.17.1).
        "GUM y ± U, k = 1.960 (95 %)",
        "y (mm)",
        "<rect",
    ] {
        assert!(svg.contains(want), "missing {want}");
    }
    for (p, scale) in [(1.5, 1.0), (0.95, 0.0), (0.95, f64::NAN)] {
        assert!(
            Plot::monte_carlo(&mc, &gum, p, Axis::new("y", ""), scale).is_err(),
            "p {p}, scale {scale}"
        );
    }
}
