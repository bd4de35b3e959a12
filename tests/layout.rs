//! Layout checks: the known cancellation properties of the standard arrangements read from the
//! response matrix, the exact bridge law of the bridge module, temperature terms, grid
//! averaging against closed forms, and misplacement against the small-angle identity.

use std::f64::consts::PI;

use gaugebook::units::{
    Angle, ElectricalResistance, Length, TemperatureCoefficient, ThermodynamicTemperature,
};
use gaugebook::{
    Arrangement, Cantilever, Column, ColumnSection, Gauge, Layout, LoadComponent, Parallelogram,
    Placement, PlacementError, ShearWeb, SpringElement, Strain, ThermalOutput, TorqueShaft, Wrench,
    material,
};
use uom::si::angle::degree;
use uom::si::electrical_resistance::ohm;
use uom::si::length::millimeter;
use uom::si::pressure::pascal;
use uom::si::temperature_coefficient::{per_kelvin, ppm_per_kelvin};
use uom::si::thermodynamic_temperature::degree_celsius;

use crate::common::assert_close;

fn mm(v: f64) -> Length {
    Length::new::<millimeter>(v)
}

fn deg(v: f64) -> Angle {
    Angle::new::<degree>(v)
}

/// A gauge with every temperature term switched on, so the cancellations are not trivial.
fn warm_gauge() -> Gauge {
    let t0 = ThermodynamicTemperature::new::<degree_celsius>(20.0);
    Gauge::new(ElectricalResistance::new::<ohm>(350.0), 2.05)
        .unwrap()
        .with_transverse_sensitivity(0.02)
        .unwrap()
        .with_grid(mm(3.0), mm(2.0))
        .unwrap()
        .with_gauge_factor_tc(TemperatureCoefficient::new::<ppm_per_kelvin>(90.0), t0)
        .unwrap()
        .with_thermal_output(ThermalOutput::new(t0, vec![0.0, 1.5e-6, -0.02e-6]).unwrap())
}

fn off_axis_max(per_load: &[f64; 6], primary: LoadComponent) -> f64 {
    LoadComponent::ALL
        .iter()
        .filter(|&&c| c != primary)
        .map(|c| per_load[c.index()].abs())
        .fold(0.0, f64::max)
}

#[test]
fn full_bending_bridge_rejects_axial_load_and_uniform_temperature() {
    // Four equal gauges, two in tension (R1, R3) and two in compression (R2, R4): axial strain
    // and identical thermal output enter all four arms equally and cancel (Dally & Riley,
    // Experimental Stress Analysis, 4th ed., §7 bridge arrangements, from memory).
    let m = material("2024-T351").unwrap();
    let beam = Cantilever::new(m.clone(), mm(120.0), mm(20.0), mm(5.0), mm(40.0)).unwrap();
    let l = Layout::standard(beam, &warm_gauge(), Arrangement::FullBending, 60.0).unwrap();
    let r = l.report(0).unwrap();
    let fz = r.per_load[LoadComponent::Fz.index()];
    assert!(r.per_load[LoadComponent::Fx.index()].abs() < 1e-12 * fz.abs());
    // Side load, torsion and Mz also cancel on the centre line; a tip moment My is bending
    // too and is measured (a bending beam reads the moment at its gauges, not the force).
    for c in [LoadComponent::Fy, LoadComponent::Mx, LoadComponent::Mz] {
        assert!(r.per_load[c.index()].abs() < 1e-12 * fz.abs(), "{c}");
    }
    let my = r.per_load[LoadComponent::My.index()];
    assert_close(my, -fz / 0.08, 1e-9, 0.0);
    assert!(r.zero_per_kelvin.abs() < 1e-15);
    // Rated output: the bridge module's exact full-bending law at the beam's strain with the
    // transverse-sensitivity-corrected factor: x = F_a(ε − K_t·ν·ε).
    let g = warm_gauge();
    let eps = 6.0 * 60.0 * 0.08 / (m.youngs_modulus().get::<pascal>() * 0.02 * 0.005f64.powi(2));
    let x = g.relative_change(Strain::new(eps), Strain::new(-m.poisson() * eps));
    let expected = Arrangement::FullBending
        .output(Strain::new(x / 2.05), 2.05, 0.3)
        .unwrap();
    assert_close(r.rated_output.value(), expected.value(), 1e-12, 0.0);
    assert_close(r.nonlinearity, 0.0, 0.0, 1e-9);
    // Span drift: Vo/V = x_m/(1 + x_t) for four arms that all carry the thermal change x_t
    // (bridge equation), so the span moves by the gauge factor's drift (90 ppm/K) less
    // d x_t/dT = F·1.5 µε/K, less the modulus coefficient β_E (strain ∝ 1/E) and twice the
    // expansion (a force's stress ∝ F/length²; see `span_drift_is_gauge_factor_drift_...`).
    let beta = m.modulus_tc().get::<per_kelvin>();
    let alpha = m.expansion().get::<per_kelvin>();
    assert_close(
        r.span_per_kelvin,
        90e-6 - 2.05 * 1.5e-6 - beta - 2.0 * alpha,
        1e-6,
        0.0,
    );
}

#[test]
fn poisson_column_bridge_rejects_bending() {
    // Axial gauges on opposite faces in R1, R3 and transverse gauges on the other two faces in
    // R2, R4: bending strains are equal and opposite in each opposite pair and cancel; the
    // output is the full-Poisson law Vo/V = (B/4)x/(1 + βx) with B = 2(1 + ν), β = (1 − ν)/2
    // (Dally & Riley 4th ed. §7, from memory; bridge module `Arrangement::FullPoisson`).
    let m = material("17-4 PH H1025").unwrap();
    let col = Column::new(
        m.clone(),
        ColumnSection::Round { diameter: mm(14.0) },
        mm(60.0),
        mm(30.0),
    )
    .unwrap();
    let gauge = Gauge::new(ElectricalResistance::new::<ohm>(350.0), 2.0).unwrap();
    let f = -50e3;
    let l = Layout::standard(col, &gauge, Arrangement::FullPoisson, f).unwrap();
    let r = l.report(0).unwrap();
    let fx = r.per_load[0].abs();
    for c in [
        LoadComponent::Fy,
        LoadComponent::Fz,
        LoadComponent::My,
        LoadComponent::Mz,
    ] {
        assert!(r.per_load[c.index()].abs() < 1e-12 * fx, "{c}");
    }
    let eps = f / (m.youngs_modulus().get::<pascal>() * PI * 0.007f64.powi(2));
    let nu = m.poisson();
    let expected = Arrangement::FullPoisson
        .output(Strain::new(eps), 2.0, nu)
        .unwrap();
    assert_close(r.rated_output.value(), expected.value(), 1e-12, 0.0);
    let eta = Arrangement::FullPoisson
        .nonlinearity(Strain::new(eps), 2.0, nu)
        .unwrap();
    assert_close(r.nonlinearity, eta, 1e-9, 0.0);
    // The same holds with temperature terms: identical gauges, uniform temperature, no zero TC.
    let col = Column::new(
        m,
        ColumnSection::Round { diameter: mm(14.0) },
        mm(60.0),
        mm(30.0),
    )
    .unwrap();
    let l = Layout::standard(col, &warm_gauge(), Arrangement::FullPoisson, f).unwrap();
    assert!(l.report(0).unwrap().zero_per_kelvin.abs() < 1e-15);
}

#[test]
fn torque_shaft_full_shear_bridge() {
    // ±45° gauges on opposite sides: Vo/V = F·γ/2 with γ = 16T/(πGd³) (Timoshenko & Gere,
    // Mechanics of Materials, 4th ed., eq. 3-12, from memory; full-shear law of the bridge
    // module); axial load, bending and shear force cancel.
    let m = material("4340").unwrap();
    let shaft = TorqueShaft::solid(m.clone(), mm(16.0), mm(120.0), mm(60.0)).unwrap();
    let gauge = Gauge::new(ElectricalResistance::new::<ohm>(350.0), 2.1).unwrap();
    let t = 80.0;
    let l = Layout::standard(shaft, &gauge, Arrangement::FullShear, t).unwrap();
    let r = l.report(0).unwrap();
    assert!(off_axis_max(&r.per_load, LoadComponent::Mx) < 1e-12 * r.per_load[3].abs());
    let gamma = 16.0 * t / (PI * m.shear_modulus().get::<pascal>() * 0.016f64.powi(3));
    let expected = Arrangement::FullShear
        .output(Strain::new(gamma / 2.0), 2.1, 0.3)
        .unwrap();
    assert_close(r.rated_output.value(), expected.value(), 1e-12, 0.0);
}

#[test]
fn shear_web_bridge_ignores_load_position_and_side_loads() {
    // The shear force is the same at every section, so moving the load along the beam (adding
    // My = −Fz·Δx) changes nothing; torsion, Fx, Fy and Mz cancel between the web's two faces
    // (common practice of shear-beam design, checked here through the response matrix).
    let m = material("17-4 PH H1025").unwrap();
    let web = ShearWeb::new(m, mm(150.0), mm(40.0), mm(30.0), mm(5.0), mm(4.0), mm(75.0)).unwrap();
    let l = Layout::standard(web, &warm_gauge(), Arrangement::FullShear, 10e3).unwrap();
    let r = l.report(0).unwrap();
    assert!(off_axis_max(&r.per_load, LoadComponent::Fz) < 1e-12 * r.per_load[2].abs());
    assert!(r.rated_output.value() > 0.0);
    assert!(r.zero_per_kelvin.abs() < 1e-15);
}

#[test]
fn parallelogram_bridge_ignores_load_position() {
    // S-bending: the bending at the gauges does not depend on where the load sits along X, and
    // the axial forces that do cancel in the full bridge (Roark 7th ed. table 8.1 guided beam,
    // from memory; common practice of single-point cells).
    let m = material("2024-T351").unwrap();
    let p = Parallelogram::new(m, mm(50.0), mm(20.0), mm(2.0), mm(30.0), mm(8.0)).unwrap();
    let gauge = Gauge::new(ElectricalResistance::new::<ohm>(350.0), 2.0).unwrap();
    let l = Layout::standard(p, &gauge, Arrangement::FullBending, 100.0).unwrap();
    let r = l.report(0).unwrap();
    let fz = r.per_load[LoadComponent::Fz.index()];
    assert!(r.per_load[LoadComponent::My.index()].abs() < 1e-12 * fz.abs());
    assert!(r.per_load[LoadComponent::Fx.index()].abs() < 1e-12 * fz.abs());
    // But a half bridge on the upper flexure does see My through the axial force.
    let p = Parallelogram::new(
        material("2024-T351").unwrap(),
        mm(50.0),
        mm(20.0),
        mm(2.0),
        mm(30.0),
        mm(8.0),
    )
    .unwrap();
    let l = Layout::standard(p, &gauge, Arrangement::Quarter, 100.0).unwrap();
    assert!(l.report(0).unwrap().per_load[LoadComponent::My.index()].abs() > 1e-3 * fz.abs());
}

#[test]
fn quarter_bridge_temperature_terms() {
    // A quarter bridge's zero moves by ∂(Vo/V)/∂x = 1/4 per unit x at balance (bridge equation
    // Vo/V = x/(4 + 2x)); x per kelvin is F·dε_thermal/dT plus F_a(1 + K_t)·Δα for a thermal
    // output referred to a material of another expansion (Dally & Riley 4th ed. §6, from memory).
    let m = material("7075-T6").unwrap();
    let beam = Cantilever::new(m.clone(), mm(100.0), mm(20.0), mm(5.0), mm(30.0)).unwrap();
    let t0 = ThermodynamicTemperature::new::<degree_celsius>(20.0);
    let g = Gauge::new(ElectricalResistance::new::<ohm>(350.0), 2.0)
        .unwrap()
        .with_thermal_output(ThermalOutput::new(t0, vec![0.0, 3e-6]).unwrap());
    let l = Layout::standard(beam.clone(), &g, Arrangement::Quarter, 50.0).unwrap();
    let r = l.report(0).unwrap();
    assert_close(r.zero_per_kelvin, 2.0 * 3e-6 / 4.0, 1e-6, 0.0);
    // Referred to a steel of 10.8 ppm/K instead of the aluminium.
    let mut l = Layout::new(beam.clone(), 50.0).unwrap();
    let alpha_ref = 10.8e-6;
    l.place(
        Placement::new("B1", g.clone(), beam.site("bottom").unwrap(), deg(0.0))
            .with_thermal_output_expansion(TemperatureCoefficient::new::<per_kelvin>(alpha_ref)),
    )
    .unwrap();
    l.wire("q", [&["B1"], &[], &[], &[]]).unwrap();
    let d_alpha = m.expansion().get::<per_kelvin>() - alpha_ref;
    let r = l.report(0).unwrap();
    assert_close(
        r.zero_per_kelvin,
        (2.0 * 3e-6 + 2.0 * d_alpha) / 4.0,
        1e-6,
        0.0,
    );
    // A modulus falling 250 ppm/K raises the strain per newton by as much; the beam's own
    // expansion lowers it by 2α (force load, stress ∝ F/length²).
    let alpha = m.expansion().get::<per_kelvin>();
    let m2 = m
        .with_modulus_tc(TemperatureCoefficient::new::<ppm_per_kelvin>(-250.0))
        .unwrap();
    let beam = Cantilever::new(m2, mm(100.0), mm(20.0), mm(5.0), mm(30.0)).unwrap();
    let plain = Gauge::new(ElectricalResistance::new::<ohm>(350.0), 2.0).unwrap();
    let l = Layout::standard(beam, &plain, Arrangement::FullBending, 50.0).unwrap();
    assert_close(
        l.report(0).unwrap().span_per_kelvin,
        250e-6 - 2.0 * alpha,
        1e-6,
        0.0,
    );
}

#[test]
fn span_drift_is_gauge_factor_drift_less_modulus_coefficient_less_expansion() {
    // Closed-form identity. A full bridge of four equal gauges at ±x reads Vo/V = x exactly
    // (bridge equation), and x = F(T)·ε(T) with F(T) = F(1 + TC_F·ΔT), ε ∝ 1/E(T) =
    // 1/(E(1 + β_E·ΔT)), and every length scaled by s = 1 + α·ΔT: a force's nominal stress
    // ∝ F/length² (s⁻²), a torque's ∝ T/length³ (s⁻³). So at the reference temperature
    //   d ln(RO)/dT = TC_F − β_E − 2α (force),  TC_F − β_E − 3α (torque).
    // The materials' β_E come from the table (ASME B31.3-2004 Table C-6 family rows, from
    // memory); a zero thermal output keeps the bridge's 1/(1 + x_t) term out.
    let t0 = ThermodynamicTemperature::new::<degree_celsius>(20.0);
    let tc_f = 90e-6;
    let g = Gauge::new(ElectricalResistance::new::<ohm>(350.0), 2.0)
        .unwrap()
        .with_gauge_factor_tc(TemperatureCoefficient::new::<per_kelvin>(tc_f), t0)
        .unwrap();
    let steel = material("17-4 PH H1025").unwrap();
    let (beta, alpha) = (
        steel.modulus_tc().get::<per_kelvin>(),
        steel.expansion().get::<per_kelvin>(),
    );
    assert!(
        beta < -3e-4,
        "the table gives 17-4 PH a modulus coefficient"
    );
    let beam = Cantilever::new(steel.clone(), mm(100.0), mm(20.0), mm(5.0), mm(30.0)).unwrap();
    let l = Layout::standard(beam, &g, Arrangement::FullBending, 200.0).unwrap();
    let span = l.report(0).unwrap().span_per_kelvin;
    assert_close(span, tc_f - beta - 2.0 * alpha, 1e-6, 0.0);
    // ≈ 90 + 332 − 21.6 ppm/K: the modulus term dominates an uncompensated steel cell.
    assert!(span > 3.9e-4 && span < 4.1e-4, "{span}");
    let shaft = TorqueShaft::solid(steel, mm(20.0), mm(100.0), mm(50.0)).unwrap();
    let l = Layout::standard(shaft, &g, Arrangement::FullShear, 100.0).unwrap();
    assert_close(
        l.report(0).unwrap().span_per_kelvin,
        tc_f - beta - 3.0 * alpha,
        1e-6,
        0.0,
    );
}

#[test]
fn mismatched_gauge_thermal_output_shows_as_zero_drift() {
    // One gauge of four with a thermal output of 2 µε/K: the full bridge's zero moves by
    // (1/4)·F·2e-6 per K (linearised bridge equation, ∂(Vo/V)/∂x₁ = 1/4 at balance).
    let m = material("2024-T351").unwrap();
    let beam = Cantilever::new(m, mm(100.0), mm(20.0), mm(5.0), mm(30.0)).unwrap();
    let (top, bottom) = (beam.site("top").unwrap(), beam.site("bottom").unwrap());
    let t0 = ThermodynamicTemperature::new::<degree_celsius>(20.0);
    let plain = Gauge::new(ElectricalResistance::new::<ohm>(350.0), 2.0).unwrap();
    let odd = plain
        .clone()
        .with_thermal_output(ThermalOutput::new(t0, vec![0.0, 2e-6]).unwrap());
    let mut l = Layout::new(beam, 50.0).unwrap();
    l.place(Placement::new("B1", odd, bottom.clone(), deg(0.0)))
        .unwrap();
    l.place(Placement::new("T1", plain.clone(), top.clone(), deg(0.0)))
        .unwrap();
    l.place(Placement::new("B2", plain.clone(), bottom, deg(0.0)))
        .unwrap();
    l.place(Placement::new("T2", plain, top, deg(0.0))).unwrap();
    l.wire("full", [&["B1"], &["T1"], &["B2"], &["T2"]])
        .unwrap();
    let m = l.response_matrix().unwrap();
    assert_close(m.per_kelvin[0], 2.0 * 2e-6 / 4.0, 1e-6, 0.0);
}

#[test]
fn grid_averaging_on_a_round_surface() {
    // A circumferential grid of arc length g on a bar bent about Z samples σ ∝ cos φ; its mean
    // over the arc is the centre value times sin(u)/u, u = g/(2r) (integral of cos).
    let m = material("4340").unwrap();
    let shaft = TorqueShaft::solid(m, mm(10.0), mm(100.0), mm(50.0)).unwrap();
    let g = Gauge::new(ElectricalResistance::new::<ohm>(350.0), 2.0)
        .unwrap()
        .with_grid(mm(4.0), mm(2.0))
        .unwrap();
    let site = shaft.site("+y").unwrap();
    let load = Wrench::only(LoadComponent::Mz, 5.0);
    let point = shaft.surface_strain(&site, &load).unwrap();
    let p = Placement::new("C", g, site, deg(90.0));
    let (along, _) = p.grid_strains(&shaft, &load).unwrap();
    let u: f64 = 4.0 / (2.0 * 5.0);
    assert_close(along.value(), point.eyy.value() * u.sin() / u, 1e-9, 0.0);
}

#[test]
fn misplacement_follows_the_small_angle_identity() {
    // Quarter bridge (linear in x near balance), gauge at 30° on a beam's bottom face: a
    // rotation δ changes x by F_a·δ·(dε_a/dθ + K_t·dε_t/dθ) to first order, with
    // dε/dθ = −(εxx − εyy)·sin 2θ + γxy·cos 2θ (derivative of the strain transformation,
    // Timoshenko & Gere 4th ed. eq. 7-71, from memory).
    let m = material("2024-T351").unwrap();
    let beam = Cantilever::new(m, mm(120.0), mm(20.0), mm(5.0), mm(40.0)).unwrap();
    let g = Gauge::new(ElectricalResistance::new::<ohm>(350.0), 2.0)
        .unwrap()
        .with_transverse_sensitivity(0.03)
        .unwrap()
        .with_grid(mm(3.0), mm(2.0))
        .unwrap();
    let site = beam.site("bottom").unwrap();
    let theta = deg(30.0);
    let load = Wrench::only(LoadComponent::Fz, 50.0);
    let s = beam.surface_strain(&site, &load).unwrap();
    let mut l = Layout::new(beam, 50.0).unwrap();
    l.place(Placement::new("G", g, site, theta)).unwrap();
    l.wire("q", [&["G"], &[], &[], &[]]).unwrap();
    let delta = 0.05f64;
    let table = l.placement_sensitivity(0, deg(delta), mm(0.01)).unwrap();
    let row = table
        .rows
        .iter()
        .find(|r| r.error == PlacementError::Angle)
        .unwrap();
    let perp = theta + deg(90.0);
    let kt = 0.03;
    let ea = s.normal(theta).value() + kt * s.normal(perp).value();
    let rate = s.normal_rate(theta).value() + kt * s.normal_rate(perp).value();
    let predicted = 100.0 * delta.to_radians() * rate / ea;
    // Remainder O(δ²): relative 1e-3 at δ = 0.05°.
    assert_close(row.rated_output_change, predicted, 2e-3, 0.0);
    // Moving the grid dx towards the load scales the moment by (L − x − dx)/(L − x).
    let row = table
        .rows
        .iter()
        .find(|r| r.error == PlacementError::Axial)
        .unwrap();
    assert_close(row.rated_output_change, -100.0 * 0.01 / 80.0, 1e-9, 0.0);
}

#[test]
fn placement_table_ranks_the_lateral_error_of_a_column() {
    // A full-Poisson column: the table is sorted, every gauge has three rows, and each change
    // agrees with a direct recomputation of the moved layout.
    let m = material("4340").unwrap();
    let col = Column::new(
        m,
        ColumnSection::Square { side: mm(15.0) },
        mm(60.0),
        mm(30.0),
    )
    .unwrap();
    let gauge = Gauge::new(ElectricalResistance::new::<ohm>(350.0), 2.0).unwrap();
    let l = Layout::standard(col, &gauge, Arrangement::FullPoisson, -40e3).unwrap();
    let t = l.placement_sensitivity(0, deg(2.0), mm(0.5)).unwrap();
    assert_eq!(t.rows.len(), 12);
    // Sorted from the largest error; ties within round-off (1e-9 of the largest) keep the
    // gauges' order.
    let top = t.rows[0].worst;
    assert!(
        t.rows
            .windows(2)
            .all(|w| w[0].worst >= w[1].worst - 1e-9 * top)
    );
    let row = &t.rows[0];
    let i = l
        .placements()
        .iter()
        .position(|p| p.label == row.gauge)
        .unwrap();
    let p = &l.placements()[i];
    let moved = match row.error {
        PlacementError::Angle => p.displaced(deg(2.0), mm(0.0), mm(0.0)),
        PlacementError::Axial => p.displaced(deg(0.0), mm(0.5), mm(0.0)),
        PlacementError::Lateral => p.displaced(deg(0.0), mm(0.0), mm(0.5)),
    };
    let base = l.per_load(0).unwrap()[0];
    let new = l.with_placement(i, moved).unwrap().per_load(0).unwrap()[0];
    assert_close(
        row.rated_output_change,
        100.0 * (new - base) / base,
        1e-9,
        1e-12,
    );
    assert!(t.to_string().contains("angle"));
}

#[test]
fn layout_errors_are_typed() {
    let m = material("2024-T351").unwrap();
    let beam = Cantilever::new(m, mm(100.0), mm(20.0), mm(5.0), mm(30.0)).unwrap();
    let site = beam.site("top").unwrap();
    let g = Gauge::new(ElectricalResistance::new::<ohm>(350.0), 2.0).unwrap();
    let mut l = Layout::new(beam.clone(), 10.0).unwrap();
    l.place(Placement::new("A", g.clone(), site.clone(), deg(0.0)))
        .unwrap();
    assert!(
        l.place(Placement::new("A", g.clone(), site, deg(0.0)))
            .is_err()
    );
    assert!(l.wire("x", [&["A"], &["A"], &[], &[]]).is_err());
    assert!(l.wire("x", [&[], &[], &[], &[]]).is_err());
    assert!(l.report(3).is_err());
    let i = l.wire("q", [&["A"], &[], &[], &[]]).unwrap();
    assert!(l.placement_sensitivity(i, deg(0.0), mm(0.1)).is_err());
    assert!(l.placement_sensitivity(i, deg(1.0), mm(-0.1)).is_err());
    assert!(Layout::new(beam.clone(), f64::NAN).is_err());
    assert!(Layout::standard(beam, &g, Arrangement::FullPoisson, 10.0).is_err());
}

#[test]
fn default_cross_talk_basis_uses_the_element_length() {
    let m = material("4340").unwrap();
    let shaft = TorqueShaft::solid(m, mm(20.0), mm(100.0), mm(50.0)).unwrap();
    let g = Gauge::new(ElectricalResistance::new::<ohm>(350.0), 2.0).unwrap();
    let l = Layout::standard(shaft, &g, Arrangement::FullShear, 100.0).unwrap();
    let b = l.default_cross_talk_basis();
    assert_close(b.get(LoadComponent::My), 100.0, 1e-12, 0.0);
    assert_close(b.get(LoadComponent::Fz), 1000.0, 1e-12, 0.0);
    let _ = l.element().kind();
}

#[test]
fn solver_finds_the_closed_form_depth_and_refuses_an_overstressed_one() {
    // Full bending bridge, K_t = 0: Vo/V = F·6P(L − x)/(E·b·h²) (flexure formula, Timoshenko &
    // Gere 4th ed. §5.5, from memory), so h = √(6·F·P·(L − x)/(E·b·r)) for a target r.
    use gaugebook::{DesignCriteria, OutputRatio, PhysicsError, solve_for_rated_output};
    let m = material("2024-T351").unwrap();
    let e = m.youngs_modulus().get::<pascal>();
    let gauge = Gauge::new(ElectricalResistance::new::<ohm>(350.0), 2.0).unwrap();
    let build = |h: f64| {
        let beam = Cantilever::new(material("2024-T351")?, mm(100.0), mm(20.0), mm(h), mm(30.0))?;
        Layout::standard(beam, &gauge, Arrangement::FullBending, 50.0)
    };
    let target = 1.5e-3;
    let p = solve_for_rated_output(
        3.0,
        10.0,
        OutputRatio::new(target),
        build,
        &DesignCriteria::default(),
    )
    .unwrap();
    let h = (6.0 * 2.0 * 50.0 * 0.07 / (e * 0.02 * target)).sqrt() * 1e3;
    assert_close(p.parameters[0], h, 1e-9, 0.0);
    // 6 mV/V needs ε = 3000 µε, σ ≈ 219 MPa at rated, 329 MPa at 150 %: beyond the 324 MPa
    // yield of the table's 2024-T351, so the solver says no.
    let e = solve_for_rated_output(
        1.0,
        10.0,
        OutputRatio::from_mv_per_v(6.0),
        build,
        &DesignCriteria::default(),
    )
    .unwrap_err();
    assert!(matches!(e, PhysicsError::NoSolution { .. }), "{e}");
    assert!(e.to_string().contains("yield factor"), "{e}");
}
