//! GUM budgets and Monte Carlo against JCGM 100:2008 Annex H, JCGM 101:2008 §9, scipy and the
//! `uncertainties` package.

use crate::common::assert_close;
use gaugebook::{
    Budget, Distribution, Input, IntervalKind, MonteCarlo, coverage_factor, sample_correlation,
    student_t_quantile,
};

/// Student t quantiles: scipy.stats.t.ppf((1 + p)/2, nu), scipy 1.17.1.
#[test]
fn t_quantiles_match_scipy() {
    let table: &[(f64, f64, f64)] = &[
        (0.6827, 1.0, 1.837409429490547),
        (0.6827, 4.5, 1.1241827191648746),
        (0.6827, 25.6, 1.0199390242209307),
        (0.6827, 1e6, 1.0000222133449634),
        (0.95, 1.0, 12.706204736174694),
        (0.95, 2.0, 4.302652729749462),
        (0.95, 3.0, 3.1824463052837078),
        (0.95, 5.0, 2.5705818356363146),
        (0.95, 16.0, 2.1199052992212546),
        (0.95, 50.0, 2.008559112100761),
        (0.95, 100.0, 1.9839715185235518),
        (0.95, 1e6, 1.959966356814107),
        (0.99, 1.0, 63.656741162871526),
        (0.99, 4.5, 4.272823993011293),
        (0.99, 16.0, 2.9207816224251),
        (0.99, 25.6, 2.7821154363016474),
        (0.9973, 1.0, 235.78368715849922),
        (0.9973, 2.0, 19.206015887811365),
        (0.9973, 10.0, 3.9568899895110556),
        (0.9973, 1e6, 2.9999844925596015),
    ];
    for &(p, nu, want) in table {
        let k = coverage_factor(p, nu).unwrap();
        assert_close(k, want, 1e-11, 0.0);
    }
    // scipy.stats.norm.ppf(0.995) = 2.5758293035489004; t.ppf(0.9999, 1) = 3183.098757118502
    assert_close(
        coverage_factor(0.99, f64::INFINITY).unwrap(),
        2.5758293035489004,
        1e-12,
        0.0,
    );
    assert_close(
        student_t_quantile(0.9999, 1.0).unwrap(),
        3183.098757118502,
        1e-10,
        0.0,
    );
    assert_close(
        student_t_quantile(0.0001, 1.0).unwrap(),
        -3183.098757118502,
        1e-10,
        0.0,
    );
    assert!(coverage_factor(1.0, 3.0).is_none() && coverage_factor(0.95, 0.0).is_none());
}

/// JCGM 100:2008 H.1, end-gauge calibration (first-order model, eq. H.3):
/// l = l_s + d − l_s (δα θ + α_s δθ). Inputs and results from H.1.3–H.1.6 (from memory):
/// u_c = 32 nm, ν_eff = 16 (16.7 truncated), k = t₉₉(16) = 2.92, U₉₉ = 93 nm,
/// l = 50.000 838 mm.
#[test]
fn gum_h1_end_gauge() {
    let inputs = vec![
        Input::normal("l_s / mm", 50.000623, 25e-6, 18.0).unwrap(),
        Input::normal("d / mm", 215e-6, 9.7e-6, 25.6).unwrap(),
        Input::normal("alpha_s / (1/°C)", 11.5e-6, 1.2e-6, f64::INFINITY).unwrap(),
        Input::normal("theta / °C", -0.1, 0.41, f64::INFINITY).unwrap(),
        Input::normal("delta alpha / (1/°C)", 0.0, 0.58e-6, 50.0).unwrap(),
        Input::normal("delta theta / °C", 0.0, 0.029, 2.0).unwrap(),
    ];
    let b = Budget::new(inputs);
    let r = b
        .evaluate(|x| x[0] + x[1] - x[0] * (x[4] * x[3] + x[2] * x[5]))
        .unwrap();
    assert_close(r.value, 50.000838, 0.0, 1e-10);
    assert_eq!((r.combined * 1e6).round(), 32.0); // nm, H.1.4
    assert_eq!(r.dof_eff.floor(), 16.0); // H.1.6
    let e = r.expanded(0.99).unwrap();
    assert_close(e.k, 2.9207816224251, 1e-11, 0.0); // scipy.stats.t.ppf(0.995, 16), 1.17.1
    assert_eq!((e.expanded * 1e6).round(), 93.0); // nm, H.1.6
    // Contributions of H.1 Table H.1 (from memory): δα 2.9 nm, δθ 16.6 nm (rounded 17).
    assert_close(r.contributions[4].contribution * 1e6, 2.9, 0.0, 0.05);
    assert_close(r.contributions[5].contribution * 1e6, 16.6, 0.0, 0.1);
    assert_eq!(r.contributions[2].sensitivity, 0.0); // c = −l_s δθ = 0 at the estimates
}

fn h2_data() -> [Vec<f64>; 3] {
    // JCGM 100:2008 H.2, Table H.2 (from memory): five simultaneous sets of V (V), I (mA), φ (rad).
    [
        vec![5.007, 4.994, 5.005, 4.990, 4.999],
        vec![19.663e-3, 19.639e-3, 19.640e-3, 19.685e-3, 19.678e-3],
        vec![1.0456, 1.0438, 1.0468, 1.0428, 1.0433],
    ]
}

/// JCGM 100:2008 H.2, simultaneous resistance and reactance (approach 1, correlated type A
/// inputs). Differential reference: uncertainties 3.2.3 `correlated_values(mean, cov/5)` with
/// numpy 2.4.6 `np.cov`: R = 127.73216992810208 ± 0.0710714073969951 Ω,
/// X = 219.84651191263848 ± 0.29558167735863833 Ω, Z = 254.25970194801894 ± 0.2363361300823703 Ω
/// (the GUM's Table H.3 gives 127.732 ± 0.071, 219.847 ± 0.295, 254.260 ± 0.236, from memory).
#[test]
fn gum_h2_resistance_reactance() {
    let d = h2_data();
    let names = ["V", "I", "phi"];
    let inputs: Vec<Input> = (0..3)
        .map(|i| Input::type_a(names[i], &d[i]).unwrap())
        .collect();
    let mut b = Budget::new(inputs);
    for (i, j) in [(0, 1), (0, 2), (1, 2)] {
        b.correlate(i, j, sample_correlation(&d[i], &d[j]).unwrap())
            .unwrap();
    }
    // numpy.corrcoef: r(V,I) = −0.35531122, r(V,φ) = 0.85762421, r(I,φ) = −0.64511122
    assert_close(b.correlation(0, 2), 0.85762421, 0.0, 1e-8);
    let r = b.evaluate(|x| x[0] / x[1] * x[2].cos()).unwrap();
    let xr = b.evaluate(|x| x[0] / x[1] * x[2].sin()).unwrap();
    let z = b.evaluate(|x| x[0] / x[1]).unwrap();
    // Central differences of step u on a smooth model: agreement to ~1e-5 relative.
    assert_close(r.value, 127.73216992810208, 1e-12, 0.0);
    assert_close(r.combined, 0.0710714073969951, 1e-5, 0.0);
    assert_close(xr.value, 219.84651191263848, 1e-12, 0.0);
    assert_close(xr.combined, 0.29558167735863833, 1e-5, 0.0);
    assert_close(z.value, 254.25970194801894, 1e-12, 0.0);
    assert_close(z.combined, 0.2363361300823703, 1e-5, 0.0);
}

/// Differential check against uncertainties 3.2.3 on a nonlinear model:
/// a = 3.2 ± 0.05, b = 1.7 ± 0.02, c = 0.4 ± 0.01, y = a·exp(−b c) + √a / b:
/// `y.n = 2.6734416590991996`, `y.s = 0.05027762626115669`.
#[test]
fn differential_against_uncertainties_package() {
    let b = Budget::new(vec![
        Input::normal("a", 3.2, 0.05, f64::INFINITY).unwrap(),
        Input::normal("b", 1.7, 0.02, f64::INFINITY).unwrap(),
        Input::normal("c", 0.4, 0.01, f64::INFINITY).unwrap(),
    ]);
    let r = b
        .evaluate(|x| x[0] * (-x[1] * x[2]).exp() + x[0].sqrt() / x[1])
        .unwrap();
    assert_close(r.value, 2.6734416590991996, 1e-14, 0.0);
    assert_close(r.combined, 0.05027762626115669, 1e-4, 0.0);
}

/// Welch–Satterthwaite (JCGM 100:2008, eq. G.2b) closed form: two equal contributions with
/// ν = 4 each give ν_eff = (2u²)²/(2u⁴/4) = 8.
#[test]
fn welch_satterthwaite_closed_form() {
    let b = Budget::new(vec![
        Input::normal("a", 0.0, 1.0, 4.0).unwrap(),
        Input::normal("b", 0.0, 1.0, 4.0).unwrap(),
    ]);
    let r = b.evaluate_with_sensitivities(0.0, &[1.0, 1.0]).unwrap();
    assert_close(r.dof_eff, 8.0, 1e-12, 0.0);
    // scipy.stats.t.ppf(0.975, 8) = 2.306004135204166 (scipy 1.17.1)
    assert_close(r.expanded(0.95).unwrap().k, 2.306004135204166, 1e-11, 0.0);
}

fn sum_columns(c: &[Vec<f64>]) -> Vec<f64> {
    (0..c[0].len())
        .map(|k| c.iter().map(|col| col[k]).sum())
        .collect()
}

/// JCGM 101:2008 9.2.2: Y = X1 + X2 + X3 + X4, X_i ~ N(0, 1): GUM and MCM both give
/// u(y) = 2.00 and the 95 % interval [−3.92, 3.92] (Table 2, from memory); GUM validated.
#[test]
fn jcgm101_9_2_2_additive_normal() {
    let inputs: Vec<Input> = (1..=4)
        .map(|i| {
            Input::type_b(
                &format!("X{i}"),
                Distribution::Normal { mean: 0.0, sd: 1.0 },
            )
            .unwrap()
        })
        .collect();
    let b = Budget::new(inputs);
    let gum = b.evaluate(|x| x.iter().sum()).unwrap();
    assert_close(gum.combined, 2.0, 1e-12, 0.0);
    let e = gum.expanded(0.95).unwrap();
    assert_eq!(((e.high) * 100.0).round() / 100.0, 3.92);
    let mc = MonteCarlo::new(1_000_000, 20261201)
        .run(&b, sum_columns)
        .unwrap();
    assert_close(mc.standard_uncertainty, 2.0, 0.0, 0.005);
    let (lo, hi) = mc.coverage_interval(0.95, IntervalKind::Symmetric).unwrap();
    assert_close(lo, -3.92, 0.0, 0.015);
    assert_close(hi, 3.92, 0.0, 0.015);
    assert!(
        mc.validate(&gum, 0.95, 1, IntervalKind::Symmetric)
            .unwrap()
            .validated
    );
}

/// JCGM 101:2008 9.2.3: the same model with rectangular X_i of standard deviation 1: GUM
/// [−3.92, 3.92], MCM [−3.88, 3.88] (Table 3, from memory). The exact 97.5 % point of a sum of
/// four such uniforms (Irwin–Hall, closed-form CDF solved with scipy.optimize.brentq 1.17.1) is
/// 3.87940674134783. With ndig = 2, u(y) = 2.0 gives δ = 0.05 (8.2), and the end-point
/// differences of about 0.04 pass; with ndig = 3 (δ = 0.005) they do not.
#[test]
fn jcgm101_9_2_3_additive_rectangular() {
    let a = 3f64.sqrt();
    let inputs: Vec<Input> = (1..=4)
        .map(|i| {
            Input::type_b(
                &format!("X{i}"),
                Distribution::Rectangular {
                    mean: 0.0,
                    half_width: a,
                },
            )
            .unwrap()
        })
        .collect();
    let b = Budget::new(inputs);
    let gum = b.evaluate(|x| x.iter().sum()).unwrap();
    let mc = MonteCarlo::new(1_000_000, 7).run(&b, sum_columns).unwrap();
    let (lo, hi) = mc.coverage_interval(0.95, IntervalKind::Symmetric).unwrap();
    assert_close(hi, 3.87940674134783, 0.0, 0.01);
    assert_close(lo, -3.87940674134783, 0.0, 0.01);
    let v = mc.validate(&gum, 0.95, 2, IntervalKind::Symmetric).unwrap();
    assert_close(v.delta, 0.05, 1e-12, 0.0);
    assert!(v.validated && v.d_high > 0.03, "{v:?}");
    let v3 = mc.validate(&gum, 0.95, 3, IntervalKind::Symmetric).unwrap();
    assert_close(v3.delta, 0.005, 1e-12, 0.0);
    assert!(!v3.validated, "{v3:?}");
    // Shortest and symmetric intervals coincide for a symmetric output (to sampling noise).
    let (slo, shi) = mc.coverage_interval(0.95, IntervalKind::Shortest).unwrap();
    assert_close(shi - slo, hi - lo, 0.0, 0.01);
}

/// JCGM 101:2008 9.3, mass calibration: δm = (m_Rc + δm_Rc)(1 + (ρ_a − ρ_a0)(1/ρ_W − 1/ρ_R))
/// − m_nom with m_nom = 100 g, ρ_a0 = 1.2 kg/m³. Inputs (Table 9, from memory): m_Rc ~
/// N(100 000.000, 0.050) mg, δm_Rc ~ N(1.234, 0.020) mg, ρ_a ~ R(1.10, 1.30), ρ_W ~ R(7000,
/// 9000), ρ_R ~ R(7950, 8050) kg/m³. Results (Table 10, from memory): GUM first order 1.2340 mg,
/// u = 0.0539 mg; MCM 1.2341 mg, u = 0.0754 mg, 95 % shortest interval [1.0834, 1.3825] mg;
/// the first-order GUM interval is not validated.
#[test]
fn jcgm101_9_3_mass_calibration() {
    let b = Budget::new(vec![
        Input::type_b(
            "m_Rc / mg",
            Distribution::Normal {
                mean: 100_000.0,
                sd: 0.050,
            },
        )
        .unwrap(),
        Input::type_b(
            "dm_Rc / mg",
            Distribution::Normal {
                mean: 1.234,
                sd: 0.020,
            },
        )
        .unwrap(),
        Input::type_b(
            "rho_a",
            Distribution::Rectangular {
                mean: 1.2,
                half_width: 0.1,
            },
        )
        .unwrap(),
        Input::type_b(
            "rho_W",
            Distribution::Rectangular {
                mean: 8000.0,
                half_width: 1000.0,
            },
        )
        .unwrap(),
        Input::type_b(
            "rho_R",
            Distribution::Rectangular {
                mean: 8000.0,
                half_width: 50.0,
            },
        )
        .unwrap(),
    ]);
    let model = |c: &[Vec<f64>]| -> Vec<f64> {
        (0..c[0].len())
            .map(|k| {
                (c[0][k] + c[1][k]) * (1.0 + (c[2][k] - 1.2) * (1.0 / c[3][k] - 1.0 / c[4][k]))
                    - 100_000.0
            })
            .collect()
    };
    let gum = b.evaluate_columns(model).unwrap();
    assert_close(gum.value, 1.2340, 0.0, 5e-5);
    assert_close(gum.combined, 0.0539, 0.0, 5e-5);
    let mc = MonteCarlo::new(1_000_000, 101).run(&b, model).unwrap();
    assert_close(mc.value, 1.2341, 0.0, 3e-4);
    assert_close(mc.standard_uncertainty, 0.0754, 0.0, 5e-4);
    let (lo, hi) = mc.coverage_interval(0.95, IntervalKind::Shortest).unwrap();
    assert_close(lo, 1.0834, 0.0, 2e-3);
    assert_close(hi, 1.3825, 0.0, 2e-3);
    assert!(
        !mc.validate(&gum, 0.95, 2, IntervalKind::Shortest)
            .unwrap()
            .validated
    );
}

/// Reproducibility: the same seed gives the same draws (xoshiro256++ is fixed by its algorithm).
#[test]
fn seeded_runs_repeat() {
    let b = Budget::new(vec![
        Input::type_b(
            "x",
            Distribution::Arcsine {
                mean: 1.0,
                half_width: 0.5,
            },
        )
        .unwrap(),
    ]);
    let one = MonteCarlo::new(1000, 42).draw(&b).unwrap();
    let two = MonteCarlo::new(1000, 42).draw(&b).unwrap();
    assert_eq!(one, two);
    // Arcsine standard deviation a/√2 (JCGM 101:2008, 6.4.6, from memory).
    let r = MonteCarlo::new(400_000, 5)
        .run(&b, |c: &[Vec<f64>]| c[0].clone())
        .unwrap();
    assert_close(r.standard_uncertainty, 0.5 / 2f64.sqrt(), 0.0, 0.002);
}

/// Triangular draws: standard deviation a/√6 (JCGM 100:2008, 4.3.9, from memory).
#[test]
fn triangular_sd() {
    let b = Budget::new(vec![
        Input::type_b(
            "x",
            Distribution::Triangular {
                mean: 0.0,
                half_width: 6f64.sqrt(),
            },
        )
        .unwrap(),
    ]);
    assert_close(b.inputs()[0].standard_uncertainty, 1.0, 1e-15, 0.0);
    let r = MonteCarlo::new(400_000, 9)
        .run(&b, |c: &[Vec<f64>]| c[0].clone())
        .unwrap();
    assert_close(r.standard_uncertainty, 1.0, 0.0, 0.004);
}

/// Correlated normal inputs in Monte Carlo: Y = X1 − X2 with r = 0.8, u = 1 each: u(y) =
/// √(2 − 2·0.8) = 0.632 (closed form, JCGM 100:2008 eq. 13).
#[test]
fn correlated_monte_carlo() {
    let mut b = Budget::new(vec![
        Input::normal("x1", 0.0, 1.0, f64::INFINITY).unwrap(),
        Input::normal("x2", 0.0, 1.0, f64::INFINITY).unwrap(),
    ]);
    b.correlate(0, 1, 0.8).unwrap();
    let gum = b.evaluate(|x| x[0] - x[1]).unwrap();
    assert_close(gum.combined, 0.4f64.sqrt(), 1e-12, 0.0);
    let mc = MonteCarlo::new(400_000, 11)
        .run(&b, |c: &[Vec<f64>]| {
            c[0].iter().zip(&c[1]).map(|(a, b)| a - b).collect()
        })
        .unwrap();
    assert_close(mc.standard_uncertainty, 0.4f64.sqrt(), 0.0, 0.003);
}

#[test]
fn bad_inputs_are_errors() {
    assert!(Input::type_a("x", &[1.0]).is_err());
    assert!(
        Input::type_b(
            "x",
            Distribution::Rectangular {
                mean: 0.0,
                half_width: -1.0
            }
        )
        .is_err()
    );
    let mut b = Budget::new(vec![
        Input::type_b(
            "x",
            Distribution::Rectangular {
                mean: 0.0,
                half_width: 1.0,
            },
        )
        .unwrap(),
        Input::normal("y", 0.0, 1.0, f64::INFINITY).unwrap(),
    ]);
    b.correlate(0, 1, 0.5).unwrap();
    let e = MonteCarlo::new(100, 1).draw(&b).unwrap_err();
    assert!(e.to_string().contains("correlated input x"), "{e}");
    assert!(b.correlate(0, 1, 1.5).is_err());
    let short = MonteCarlo::new(10, 1).run(&b, |_c: &[Vec<f64>]| vec![0.0; 3]);
    assert!(short.is_err());
}

/// JCGM 100:2008 H.3, calibration of a thermometer: b(t) = y₁ + y₂ (t − t₀), t₀ = 20 °C, fitted
/// to 11 readings (Table H.6, from memory). The GUM gives y₁ = −0.1712 °C, y₂ = 0.00218,
/// s(y₁) = 0.0029 °C, s(y₂) = 0.00067, r(y₁, y₂) = −0.930, s = 0.0035 °C, and for t = 30 °C
/// b = −0.1494 °C with u = 0.0041 °C (H.3.4, from memory). Differential reference:
/// statsmodels 0.15.0 `OLS(b, add_constant(t - 20)).fit()`: params [−0.17120379, 0.0021827],
/// bse [0.0028776, 0.00066794], √scale 0.0034975639635052925, r −0.930429603093446,
/// b(30) −0.14937681273247716, u 0.004138595752854957.
#[test]
fn gum_h3_thermometer() {
    use gaugebook::{Fit, FitModel};
    let t = [
        21.521, 22.012, 22.512, 23.003, 23.507, 23.999, 24.513, 25.002, 25.503, 26.010, 26.511,
    ];
    let b = [
        -0.171, -0.169, -0.166, -0.159, -0.164, -0.165, -0.156, -0.157, -0.159, -0.161, -0.160,
    ];
    let x: Vec<f64> = t.iter().map(|v| v - 20.0).collect();
    let f = Fit::new(&x, &b, FitModel::Linear).unwrap();
    let (y1, y2) = (f.coefficients()[0], f.coefficients()[1]);
    let (u1, u2) = (f.std_errors()[0], f.std_errors()[1]);
    let r = f.covariance()[0][1] / (u1 * u2);
    assert_close(y1, -0.17120379, 0.0, 5e-9);
    assert_close(y2, 0.0021827, 0.0, 5e-8);
    assert_close(u1, 0.0028776, 0.0, 5e-8);
    assert_close(u2, 0.00066794, 0.0, 5e-9);
    assert_close(f.residual_sd(), 0.0034975639635052925, 1e-10, 0.0);
    assert_close(r, -0.930429603093446, 1e-9, 0.0);
    // The GUM's rounded figures.
    assert_eq!((y1 * 1e4).round() / 1e4, -0.1712);
    assert_eq!((r * 1e3).round() / 1e3, -0.930);
    // Correction at 30 °C through a budget with correlated inputs (JCGM 100 eq. 16 / H.3.4).
    let mut budget = Budget::new(vec![
        Input::normal("y1", y1, u1, f64::INFINITY).unwrap(),
        Input::normal("y2", y2, u2, f64::INFINITY).unwrap(),
    ]);
    budget.correlate(0, 1, r).unwrap();
    let g = budget.evaluate(|p| p[0] + p[1] * 10.0).unwrap();
    assert_close(g.value, -0.14937681273247716, 1e-9, 0.0);
    assert_close(g.combined, 0.004138595752854957, 1e-8, 0.0);
    assert_eq!((g.combined * 1e4).round() / 1e4, 0.0041);
}
