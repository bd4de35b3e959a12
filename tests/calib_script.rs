//! Script bindings of issue 7 beyond the first set: ISO 376 from a run, creep, TC of zero and
//! span, coverage factor, inverse uncertainty, R 60 creep / Z / temperature options, E74 other
//! components and the report figures. Each repeats one reference value from its source.

use gaugebook::script::{Session, SessionOptions};

fn eval(code: &str) -> String {
    let mut s = Session::new(SessionOptions::default()).expect("session");
    match s.eval_cell(code, "test") {
        Ok(out) => out
            .value
            .and_then(|b| b.get("text/plain").map(str::to_string))
            .unwrap_or_default(),
        Err(e) => panic!("{}", e.render()),
    }
}

fn fails(code: &str) -> String {
    let mut s = Session::new(SessionOptions::default()).expect("session");
    match s.eval_cell(code, "test") {
        Ok(out) => panic!("expected an error, got {:?}", out.value),
        Err(e) => e.render(),
    }
}

/// Five passes of an ISO 376 calibration: X1, X2 (gain 1.0002) at 0°; X3 (gain 1.0006, zero
/// 0.01 mV/V) and its decreasing X4' (gain 1.0012) at 120°; X5 (gain 0.9997) at 240°.
const ISO_RUN: &str = r#"
    let f = column([0.0, 20.0, 40.0, 60.0, 80.0, 100.0], "kN");
    let y = column([0.0, 0.4, 0.8, 1.2, 1.6, 2.0], "mV/V");
    let run = calibration_run(f, y, "ascending");
    run.add_series(f, y * 1.0002, "ascending", 0.0);
    run.add_series(f, y * 1.0006 + 0.01 * mV_per_V, "ascending", 120.0);
    let fd = column([100.0, 80.0, 60.0, 40.0, 20.0, 0.0], "kN");
    let yd = column([2.0, 1.6, 1.2, 0.8, 0.4, 0.0], "mV/V");
    run.add_series(fd, yd * 1.0012 + 0.01 * mV_per_V, "descending", 120.0);
    run.add_series(f, y * 0.9997, "ascending", 240.0);
"#;

/// ISO 376:2011 7.5.1 and 7.5.5 and Table 2 (from memory), in closed form from the gains:
/// b = (max − min)/mean of X1, X3, X5 = 0.09 % (class 0.5: 0.05 < b ≤ 0.10), b′ = |X2 − X1| /
/// ((X1 + X2)/2), v = |X4' − X3|/X3 (one decreasing series).
#[test]
fn iso376_from_script_run() {
    let code = format!(
        "{ISO_RUN}
        let r = run.iso376(#{{ resolution: 1e-5 * mV_per_V }});
        let b = (1.0006 - 0.9997) / ((1.0 + 1.0006 + 0.9997) / 3.0) * 100.0;
        assert_close(r.steps[2].reproducibility, b, 1e-9);
        assert_close(r.steps[0].repeatability, 0.0002 / 1.0001 * 100.0, 1e-9);
        assert_close(r.steps[4].reversibility, (1.0012 - 1.0006) / 1.0006 * 100.0, 1e-9);
        assert_eq(r.class, \"0.5\");
        assert(r.passed);
        assert(r.verdict.deciding.contains(\"reproducibility\"));
        assert_eq(r.zero, ());
        let z = run.iso376(#{{ zero: [0.0 * mV_per_V, 0.001 * mV_per_V], creep: [2.0 * mV_per_V, 2.0002 * mV_per_V] }});
        // f0 = (i_f − i_0)/X_N and c = (i_300 − i_30)/X_N, X_N the mean deflection of X1, X3
        // and X5 at the largest force (7.5.4, 7.5.6, from memory): f0 just under 0.05 %, class 1
        // (≤ 0.050).
        let xn = 2.0 * (1.0 + 1.0006 + 0.9997) / 3.0;
        assert_close(z.zero, 0.001 / xn * 100.0, 1e-9);
        assert_close(z.creep, 0.0002 / xn * 100.0, 1e-9);
        assert_eq(z.class, \"1\");
        r.verdict.standard"
    );
    assert_eq!(eval(&code), "ISO 376:2011");
}

#[test]
fn iso376_bad_script_input() {
    let two_positions = r#"
        let f = column([0.0, 20.0, 40.0, 60.0, 80.0, 100.0], "kN");
        let y = column([0.0, 0.4, 0.8, 1.2, 1.6, 2.0], "mV/V");
        let run = calibration_run(f, y, "ascending");
        run.add_series(f, y, "ascending", 0.0);
        run.add_series(f, y, "ascending", 180.0);
        run.iso376(#{})
    "#;
    assert!(fails(two_positions).contains("mounting positions"));
    let wrong_unit = format!("{ISO_RUN} run.iso376(#{{ resolution: 1.0 * N }})");
    assert!(fails(&wrong_unit).contains("resolution must be convertible to mV/V"));
    let bad_pair = format!("{ISO_RUN} run.iso376(#{{ zero: [0.0 * mV_per_V] }})");
    assert!(fails(&bad_pair).contains("two indications"));
}

/// Creep as the change between two times of a hold (common practice; OIML R 60:2021 creep
/// test, from memory): 0.0005 mV/V of 2 mV/V = 0.025 % RO = 2.5 N on 10 kN.
#[test]
fn creep_from_script() {
    let out = eval(
        r#"
        let t = column([0.0, 600.0, 1200.0, 1800.0], "s");
        let y = column([2.0, 2.0003, 2.0004, 2.0005], "mV/V");
        let c = creep(t, y, #{ from: 10.0 * min, to: 30.0 * min, rated_output: 2.0 * mV_per_V, capacity: 10.0 * kN });
        assert_close(c.change, q("0.0002 mV/V"), 1e-9);
        assert_close(c.percent_ro, 0.01, 1e-9);
        c.load
        "#,
    );
    assert_eq!(out, "1 N");
    assert!(
        fails(r#"creep(column([0.0, 60.0], "s"), column([1.0, 1.0], "mV/V"), #{ from: 0.0 * s, to: 120.0 * s })"#)
            .contains("a time within 0 … 60 s")
    );
}

/// TC of zero and span (common practice definitions): zero 0.0008 mV/V higher at 40 °C than
/// at 20 °C on a 2 mV/V, 1 kN cell: 0.04 % RO over 20 K = 0.002 % RO/K = 0.02 N/K; span
/// 2.0004/2 − 1 = 0.02 % over 20 K = 0.001 %/K. Temperatures given in °F are converted
/// exactly (68 °F = 20 °C, 104 °F = 40 °C; NIST SP 811 B.9, from memory).
#[test]
fn temperature_coefficients_from_script() {
    let out = eval(
        r#"
        let z = tc_zero(0.0 * mV_per_V, 0.0008 * mV_per_V, q("68 degF"), q("104 degF"), 2.0 * mV_per_V, 1.0 * kN);
        assert_close(z.per_k, 0.002, 1e-9);
        assert_close(z.load_per_k, q("0.02 N/K"), 1e-9);
        tc_span(2.0 * mV_per_V, 2.0004 * mV_per_V, q("20 degC"), q("40 degC"))
        "#,
    );
    assert!((out.parse::<f64>().unwrap() - 0.001).abs() < 1e-12, "{out}");
    assert!(
        fails(r#"tc_span(2.0 * mV_per_V, 2.0004 * mV_per_V, 20.0 * K, q("40 degC"))"#)
            .contains("must be a temperature reading")
    );
    assert!(
        fails(r#"tc_span(2.0 * mV_per_V, 2.0 * N, q("20 degC"), q("40 degC"))"#)
            .contains("same unit dimension")
    );
}

/// scipy.stats.t.ppf(0.975, 4) = 2.7764451051977934 (scipy 1.17.1).
#[test]
fn coverage_factor_from_script() {
    let out = eval("coverage_factor(0.95, 4.0)");
    assert!(
        (out.parse::<f64>().unwrap() - 2.7764451051977934).abs() < 1e-9,
        "{out}"
    );
    assert!(fails("coverage_factor(1.5, 4.0)").contains("p in (0, 1)"));
}

/// numpy.polyfit(x, y, 1) (numpy 2.4.6) for x = 0 … 4 kN, y = 0.1, 0.9, 2.1, 2.9, 4.1 mV/V:
/// b = 1.0 mV/V per kN, a = 0.02 mV/V; at y = 2 mV/V the load is 1.98 kN and, with u_y = 0,
/// the classical inverse-prediction formula s/|b| √(1/n + (y − ȳ)²/(b² Sxx)) gives
/// 0.056574199066358896 kN (Draper & Smith, 3rd ed., §3.2, from memory; evaluated with numpy).
#[test]
fn inverse_with_uncertainty_from_script() {
    let out = eval(
        r#"
        let run = calibration_run(column([0.0, 1.0, 2.0, 3.0, 4.0], "kN"), column([0.1, 0.9, 2.1, 2.9, 4.1], "mV/V"), "ascending");
        let r = run.fit(1).inverse_with_uncertainty(2.0 * mV_per_V, 0.0 * mV_per_V);
        assert_close(r.load, q("1.98 kN"), 1e-12);
        r.u.value("kN")
        "#,
    );
    assert!(
        (out.parse::<f64>().unwrap() - 0.056574199066358896).abs() < 1e-12,
        "{out}"
    );
}

/// OIML R 60-1:2021 5.5.1 (creep ≤ 0.7 |MPE| over 30 min, ≤ 0.15 |MPE| between 20 and 30 min,
/// the MPE at D_max with p_LC 0.7, band values from memory), 3.5 (Z) and R 60-3 2.1.4 (minimum
/// dead load output change per 5 °C ≤ p_LC v_min). Class C, n_max 3000 on 10 kN: v = 10/3 N,
/// MPE at 10 kN = 1.05 v = 3.5 N; 2e-4 mV/V per N.
#[test]
fn r60_creep_z_and_temperature_from_script() {
    let setup = r#"
        let l = column([0.0, 2.5, 5.0, 7.5, 10.0], "kN");
        let run = calibration_run(l, column([0.0, 0.5, 1.0, 1.5, 2.0], "mV/V"), "ascending");
        let o = #{ class: "C", n_max: 3000, e_max: 10.0 * kN, v_min: 0.5 * N };
    "#;
    // 0.0004 mV/V over 30 min = 2 N ≤ 2.45 N, but 0.0002 mV/V between 20 and 30 min = 1 N
    // > 0.525 N: the 20–30 min check decides.
    let creep = format!(
        r#"{setup}
        o.creep_time = column([0.0, 1200.0, 1800.0], "s");
        o.creep_indication = column([2.0, 2.0002, 2.0004], "mV/V");
        let v = run.r60(o);
        assert(!v.passed);
        v.deciding"#
    );
    assert!(eval(&creep).starts_with("creep between 20 and 30 min"));
    // Declared Z = 5000: DR ≤ 10 kN/(2 × 5000) = 1 N; DR = 1.2 N fails.
    let z = format!(
        r#"{setup}
        o.z = 5000; o.dead_load_return = 1.2 * N;
        run.r60(o).deciding"#
    );
    assert!(eval(&z).starts_with("DR against the declared Z"));
    // 1 N over 10 K = 0.5 N per 5 °C > 0.35 N.
    let t = format!(
        r#"{setup}
        o.min_load_change = 1.0 * N; o.temperature_change = 10.0 * K;
        run.r60(o).deciding"#
    );
    assert!(eval(&t).starts_with("minimum dead load output change per 5 °C"));
    // Per-point errors against the MPE: 0.35 v at 0 kN and 1.05 v at 10 kN (p_LC 0.7 × 0.5 and
    // × 1.5; Table 4, band values from memory), the checks listed with their sources.
    let points = format!(
        r#"{setup}
        let v = run.r60(o);
        let p = v.points;
        assert_close(p[0].limit, 0.35 * 10.0 / 3.0 * N, 1e-12);
        assert_close(p[4].limit, 1.05 * 10.0 / 3.0 * N, 1e-12);
        assert_eq(p[4].direction, "ascending");
        v.checks[0].source"#
    );
    assert!(eval(&points).starts_with("OIML R 60-1:2021 5.1.2"));
    let half = format!("{setup} o.creep_time = column([0.0, 1800.0], \"s\"); run.r60(o)");
    assert!(fails(&half).contains("both `creep_time` and `creep_indication`"));
}

/// ASTM E74-18 (from memory): further standard deviations combine with s in quadrature before
/// the factor 2.4.
#[test]
fn e74_other_components_from_script() {
    eval(
        r#"
        let f = linspace(1.0 * kN, 10.0 * kN, 10);
        let y = column([0.2, 0.4001, 0.6, 0.7999, 1.0, 1.2001, 1.4, 1.5999, 1.8, 2.0], "mV/V");
        let run = calibration_run(f, y, "ascending");
        let r = run.e74(#{ degree: 2, resolution: 0.1 * N, other: [0.5 * N] });
        assert_close(r.llf, 2.4 * sqrt(r.s * r.s + 0.25 * N * N), 1e-12);
        "#,
    );
}

#[cfg(feature = "plot")]
mod plots {
    use super::{eval, fails};

    #[test]
    fn report_figures_from_script() {
        let svg = eval(
            r#"
            let l = column([0.0, 2.5, 5.0, 7.5, 10.0], "kN");
            let run = calibration_run(l, column([0.0, 0.5, 1.0001, 1.5, 2.0], "mV/V"), "ascending");
            run.add_series(column([10.0, 7.5, 5.0, 2.5, 0.0], "kN"), column([2.0, 1.5002, 1.0003, 0.5002, 0.0], "mV/V"), "descending", 0.0);
            let a = plot_calibration(run.fit(2)).to_svg();
            let b = plot_class_errors(run.r60(#{ class: "C", n_max: 3000, e_max: 10.0 * kN, v_min: 0.5 * N })).to_svg();
            let c = plot_hysteresis(run).to_svg();
            a + b + c
            "#,
        );
        for want in [
            "fit (polynomial of degree 2)",
            "descending residual",
            "+MPE",
            "errors against OIML R 60:2021",
            "descending, series 1 (0°)",
        ] {
            assert!(svg.contains(want), "missing {want}");
        }
    }

    /// A figure returned by a cell shows inline: its bundle carries SVG (the kernel sends it
    /// as display data).
    #[test]
    fn report_figure_is_a_rich_cell_value() {
        let mut s = gaugebook::script::Session::new(gaugebook::script::SessionOptions::default())
            .expect("session");
        let out = s
            .eval_cell(
                r#"
                let run = calibration_run(column([0.0, 5.0, 10.0], "kN"), column([0.0, 1.0, 2.0], "mV/V"), "ascending");
                run.add_series(column([10.0, 5.0, 0.0], "kN"), column([2.0, 1.002, 0.0], "mV/V"), "descending", 0.0);
                plot_hysteresis(run)
                "#,
                "cell",
            )
            .unwrap_or_else(|e| panic!("{}", e.render()));
        let b = out.value.expect("a value");
        assert!(
            b.get("image/svg+xml")
                .is_some_and(|s| s.contains("hysteresis loop"))
        );
    }

    #[test]
    fn monte_carlo_figure_from_script() {
        let svg = eval(
            r#"
            let inputs = [#{ name: "a", value: 10.0 * N, u: 0.3 * N }, #{ name: "b", value: 5.0 * N, u: 0.4 * N }];
            let mc = monte_carlo(inputs, |x| x[0] + x[1], #{ trials: 40000, seed: 2, p: 0.9 });
            assert(!mc.keys().contains("draws")); // kept for the figure, not printed
            plot_monte_carlo(mc).to_svg()
            "#,
        );
        // k = 1.645 for p = 0.9 and ν_eff = ∞ (scipy.stats.norm.ppf(0.95) = 1.6448536,
        // scipy 1.17.1).
        for want in [
            "shortest 90 %",
            "probabilistically symmetric 90 %",
            "k = 1.645",
            "y (N)",
        ] {
            assert!(svg.contains(want), "missing {want}");
        }
        let e = fails(
            r#"plot_monte_carlo(gum([#{ name: "a", value: 1.0 * N, u: 0.1 * N }], |x| x[0], #{}))"#,
        );
        assert!(e.contains("needs the result of monte_carlo()"), "{e}");
        let e = fails(
            r#"
            let f = linspace(1.0 * kN, 10.0 * kN, 10);
            let r = calibration_run(f, f * (0.2 * mV_per_V / kN), "ascending").e74(#{ resolution: 0.1 * N });
            plot_class_errors(r.class_aa)
            "#,
        );
        assert!(e.contains("without per-point errors"), "{e}");
    }
}
