//! Regression tests named after the issue they pin: script-binding gaps that notebooks had to
//! work around.

use std::sync::Arc;

use gaugebook::script::{CaptureSink, Session, SessionOptions};

use crate::common::assert_close;

fn session() -> Session {
    let mut s = Session::new(SessionOptions::default()).expect("session");
    s.set_output(Arc::new(CaptureSink::default()));
    s
}

fn eval(code: &str) -> Result<String, String> {
    let mut s = session();
    match s.eval_cell(code, "regression") {
        Ok(out) => Ok(out
            .value
            .map(|b| b.get("text/plain").unwrap_or("").to_string())
            .unwrap_or_default()),
        Err(e) => Err(e.render()),
    }
}

fn number(code: &str) -> f64 {
    let t = eval(code).unwrap_or_else(|e| panic!("{e}"));
    t.trim()
        .parse()
        .unwrap_or_else(|_| panic!("not a number: {t}"))
}

#[test]
fn issue6_product_of_strain_and_modulus_counts_and_damages_without_to() {
    // A strain column times a modulus is a stress column shown in MPa, so rainflow counts it
    // in MPa and miner_damage's reference range in MPa passes its dimension check.
    let unit = eval(r#"(column([100.0, -200.0, 300.0], "ue") * (210.0 * GPa)).unit"#).unwrap();
    assert_eq!(unit.trim(), "MPa");
    // Two cycles of 0 → 500 µε → 0 on steel (200 GPa) are two ranges of 100 MPa. Basquin's
    // curve through (100 MPa, 10⁶ cycles) with m = 3 gives N = 10⁶ at that range, so
    // D = 2/10⁶ (Palmgren–Miner sum, closed form).
    let d = number(
        r#"
        let e = column([0.0, 500.0, 0.0, 500.0, 0.0], "ue");
        let c = rainflow(e * (200.0 * GPa));
        assert_eq(c.range.unit, "MPa");
        assert_close(c.range[0], 100.0 * MPa, 1e-12);
        miner_damage(c, #{ range: 100.0 * MPa, cycles: 1e6, m: 3.0 })
    "#,
    );
    assert_close(d, 2e-6, 1e-12, 0.0);
    // The same with the old workaround `.to("MPa")`: identical.
    let d2 = number(
        r#"
        let e = column([0.0, 500.0, 0.0, 500.0, 0.0], "ue");
        miner_damage(rainflow((e * (200.0 * GPa)).to("MPa")), #{ range: 100.0 * MPa, cycles: 1e6, m: 3.0 })
    "#,
    );
    assert_eq!(d, d2);
    // A quotient too: load over area is a stress.
    let u = eval(r#"(column([1.0, 2.0], "kN") / q("100 mm^2")).unit"#).unwrap();
    assert_eq!(u.trim(), "MPa");
}

#[test]
fn issue6_hold_tolerance_on_temperature_readings_is_a_difference() {
    // Soaks at 20, 40 and 60 °C with 0.1 K of noise: a 0.3 K band finds three holds.
    let n = number(
        r#"
        let t = column([20.0, 20.1, 20.0, 20.1, 30.0, 40.0, 40.1, 40.0, 40.1, 50.0,
            60.0, 60.1, 60.0, 60.1], "degC");
        let h = holds(t, #{ tolerance: 0.3 * K, min_samples: 4 });
        assert_close(h[1].mean, q("40.05 degC"), 1e-9);
        assert_close(h[1].peak_to_peak, q("0.1 K"), 1e-9);
        let r = ramps(t, #{ tolerance: 0.3 * K, min_samples: 4, min_change: 5.0 * K });
        assert_eq(r.len(), 2);
        h.len()
    "#,
    );
    assert_eq!(n, 3.0);
    // A reading as a band (0.2 °C is 273.35 K above absolute zero) is refused, not misread.
    let e = eval(
        r#"holds(column([20.0, 20.1, 20.0], "degC"), #{ tolerance: q("0.2 degC"), min_samples: 2 })"#,
    )
    .unwrap_err();
    assert!(e.contains("must be a temperature difference"), "{e}");
    // Other columns are unchanged: the tolerance is in the column's own unit.
    let e = eval(r#"holds(column([1.0, 1.0], "kN"), #{ tolerance: 0.1 * K, min_samples: 2 })"#)
        .unwrap_err();
    assert!(e.contains("must be convertible to kN"), "{e}");
}

#[cfg(feature = "data")]
#[test]
fn issue6_counts_and_lead_wires_convert_to_strain_in_script() {
    // Quarter bridge, GF 2.1, 800 µε: r = Fε/(4 + 2Fε) (Dally & Riley, Experimental Stress
    // Analysis, 4th ed., ch. 7, quarter-bridge equation, from memory), read by a 24-bit
    // converter of ±2.5 V behind a gain of 128 at 5 V excitation (2^23 counts = 3.90625 mV/V).
    let (f, e) = (2.1, 800e-6);
    let r = f * e / (4.0 + 2.0 * f * e);
    let counts = r / 3.90625e-3 * 8_388_608.0;
    let ue = number(&format!(
        r#"
        let adc = #{{ bits: 24, range: 2.5 * V, gain: 128.0, excitation: 5.0 * V }};
        let c = column([0.0, {counts:.10}], "");
        assert_close(adc_to_ratio(c, adc)[1], q("{} mV/V"), 1e-9);
        to_strain(c, "quarter", 2.1, #{{ adc: adc }})[1].value("ue")
    "#,
        r * 1e3
    ));
    assert_close(ue, 800.0, 1e-9, 0.0);
    // Two-wire leads of 3 Ω on a 120 Ω gauge: the arm changes by R_g·F·ε over R_g + 2R_L, so
    // the linearised reading is ε·120/126 and the correction ×126/120 restores it (closed form,
    // the bridge module's QuarterLeads::sensitivity_factor).
    let ue = number(
        r#"
        let indicated = q("952.380952380952 ue");
        let r = bridge("quarter", gauge(#{ r0: 120.0 * ohm, gf: 2.0 })).output(indicated);
        let leads = #{ wiring: "two-wire", lead: 3.0 * ohm, r0: 120.0 * ohm };
        to_strain(r, "quarter", 2.0, #{ leads: leads }).value("ue")
    "#,
    );
    assert_close(ue, 952.380952380952 * 126.0 / 120.0, 1e-12, 0.0);
    // Six-wire (remote sense) leads need no correction; a typo in the map is named.
    let ue = number(
        r#"
        let leads = #{ wiring: "six-wire", lead: 2.0 * ohm, bridge_resistance: 350.0 * ohm };
        to_strain(q("1 mV/V"), "full-bending", 2.0, #{ leads: leads }).value("ue")
    "#,
    );
    assert_close(ue, 500.0, 1e-12, 0.0);
    let e = eval(
        r#"to_strain(q("1 mV/V"), "quarter", 2.0, #{ leads: #{ wiring: "two-wire", lead: 1.0 * ohm, r: 350.0 * ohm } })"#,
    )
    .unwrap_err();
    assert!(e.contains("unknown key `r`"), "{e}");
}
