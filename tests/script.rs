//! Script-level tests of the Rhai surface: quantities, columns, sessions, errors with positions,
//! and every ```rhai example in the registered reference.

use std::sync::Arc;

use gaugebook::script::{
    CaptureSink, Completeness, OutputEvent, ScriptError, Session, SessionOptions, build_engine,
    reference_docs,
};

fn session() -> Session {
    Session::new(SessionOptions::default()).expect("session")
}

fn text(s: &mut Session, code: &str) -> String {
    match s.eval_cell(code, "test") {
        Ok(out) => out
            .value
            .map(|b| b.get("text/plain").unwrap_or("").to_string())
            .unwrap_or_default(),
        Err(e) => panic!("{}", e.render()),
    }
}

fn err(s: &mut Session, code: &str) -> ScriptError {
    match s.eval_cell(code, "cell[7]") {
        Ok(out) => panic!("expected an error, got {:?}", out.value),
        Err(e) => e,
    }
}

/// Runs every ```rhai example of every registered function, each in a fresh session, so a
/// binding added by any domain file is checked without listing it here.
#[test]
fn script_reference_examples() {
    let docs = reference_docs(&build_engine(&Default::default()));
    assert!(docs.len() > 30, "only {} documented functions", docs.len());
    let mut failures = Vec::new();
    let mut ran = 0;
    for d in &docs {
        let examples = d.examples();
        if examples.is_empty() {
            failures.push(format!("{}: no ```rhai example", d.signature));
        }
        for (i, code) in examples.iter().enumerate() {
            let mut s = session();
            s.set_output(Arc::new(CaptureSink::default()));
            ran += 1;
            if let Err(e) = s.eval_cell(code, &format!("{} example {}", d.name, i + 1)) {
                failures.push(format!("{}\n{}", d.signature, e.render()));
            }
        }
    }
    assert!(
        failures.is_empty(),
        "{} of {ran} examples failed:\n{}",
        failures.len(),
        failures.join("\n")
    );
}

#[test]
fn quantities_print_as_written() {
    let mut s = session();
    assert_eq!(text(&mut s, r#"q("350 ohm")"#), "350 Ω");
    assert_eq!(text(&mut s, r#"350.0 * ohm"#), "350 Ω");
    assert_eq!(text(&mut s, r#"q(2, "kN").to("N")"#), "2000 N");
    assert_eq!(text(&mut s, r#"q("2 kN").unit"#), "kN");
}

#[test]
fn unit_mismatch_names_both_sides_at_the_operator() {
    let mut s = session();
    let e = err(
        &mut s,
        "let v = 5.0 * V;\nlet r = q(\"350 ohm\");\nlet x = v + r;",
    );
    assert_eq!(e.kind, "UnitError");
    assert_eq!(e.message, "cannot add 5 V and 350 Ω");
    assert_eq!((e.origin.as_str(), e.line, e.column), ("cell[7]", 3, 11));
    assert_eq!(e.source_line.as_deref(), Some("let x = v + r;"));
    let r = e.render();
    assert!(
        r.starts_with(
            "cell[7]:3:11: cannot add 5 V and 350 Ω\n3 | let x = v + r;\n  |           ^ UnitError"
        ),
        "{r}"
    );
}

#[test]
fn unit_errors_are_catchable() {
    let mut s = session();
    let out = text(
        &mut s,
        r#"let m = ""; try { q("1 V") - q("1 N") } catch (e) { m = e.kind + ": " + e.message } m"#,
    );
    assert_eq!(out, "UnitError: cannot subtract 1 V and 1 N");
}

#[test]
fn comparing_with_a_bare_number_is_an_error() {
    let mut s = session();
    let e = err(&mut s, "let f = q(\"2 kN\");\nif f > 1000.0 { 1 }");
    assert_eq!(e.kind, "UnitError");
    assert!(
        e.message.contains("2 kN") && e.message.contains("1000"),
        "{}",
        e.message
    );
    assert_eq!((e.line, e.column), (2, 6));
    // `==` across types would silently be false in plain Rhai.
    let e = err(&mut s, "q(\"1 V\") == 1");
    assert_eq!(e.kind, "UnitError");
    // Plain dimensionless quantities do compare with numbers.
    assert_eq!(text(&mut s, "q(\"2 kN\") / q(\"1 kN\") > 1.5"), "true");
}

#[test]
fn unknown_unit_error_points_at_the_call() {
    let mut s = session();
    let e = err(&mut s, "let a = 1;\nlet b = q(\"5 furlongs\");");
    assert_eq!(e.kind, "UnitError");
    assert!(e.message.contains("furlongs"), "{}", e.message);
    assert_eq!((e.line, e.column), (2, 9));
}

#[test]
fn wrong_argument_type_is_reported_with_position() {
    let mut s = session();
    let e = err(&mut s, "let x = 1;\n  q(true)");
    assert_eq!(e.kind, "TypeError");
    assert!(
        e.message
            .starts_with("`q` cannot take (bool); it takes q(text: String) -> Quantity"),
        "{}",
        e.message
    );
    assert_eq!((e.line, e.column), (2, 3));
    // A name that exists nowhere stays FunctionNotFound.
    let e = err(&mut s, "no_such_function(1)");
    assert_eq!(e.kind, "FunctionNotFound");
}

#[test]
fn bad_module_name_is_reported() {
    let mut s = session();
    let e = err(&mut s, "import \"no_such_module\" as m;");
    assert_eq!(e.kind, "ModuleNotFound");
    assert!(e.message.contains("no_such_module"), "{}", e.message);
    // Rhai places the position on the path literal.
    assert_eq!((e.line, e.column), (1, 8));
}

#[test]
fn state_persists_and_failed_cells_keep_it() {
    let mut s = session();
    text(&mut s, "let r = 350.0 * ohm; fn double(x) { 2.0 * x }");
    let _ = err(&mut s, "let r2 = r + 1.0 * V; fn nope() { 1 }");
    assert_eq!(text(&mut s, "double(r)"), "700 Ω");
    let e = err(&mut s, "nope()");
    assert_eq!(e.kind, "FunctionNotFound");
}

#[test]
fn errors_inside_functions_of_earlier_cells_point_there() {
    let mut s = session();
    s.eval_cell("fn bad(x) {\n  x + 1.0 * V\n}", "cell[1]")
        .unwrap();
    let e = s
        .eval_cell("let a = 1.0 * ohm;\nbad(a)", "cell[2]")
        .unwrap_err();
    assert_eq!(
        (e.origin.as_str(), e.line, e.column),
        ("cell[1]", 2, 5),
        "{}",
        e.render()
    );
    assert_eq!(e.trace.len(), 1);
    assert_eq!(
        (e.trace[0].origin.as_str(), e.trace[0].line),
        ("cell[2]", 2)
    );
}

#[test]
fn print_and_display_reach_the_sink() {
    let mut s = session();
    let sink = Arc::new(CaptureSink::default());
    s.set_output(sink.clone());
    s.eval_cell(
        "print(q(\"2 mV/V\")); debug(1); display(column([1.0, 2.0], \"V\"), \"c\")",
        "c",
    )
    .unwrap();
    assert_eq!(sink.stdout_text(), "2 mV/V\n");
    assert!(sink.stderr_text().contains('1'));
    let shown = sink.events().into_iter().find_map(|e| match e {
        OutputEvent::Display {
            bundle, display_id, ..
        } => Some((bundle, display_id)),
        _ => None,
    });
    let (bundle, id) = shown.expect("a display event");
    assert_eq!(id.as_deref(), Some("c"));
    assert!(
        bundle
            .get("text/html")
            .is_some_and(|h| h.contains("<table"))
    );
}

#[test]
fn interrupt_stops_a_runaway_cell_and_keeps_the_session() {
    let mut s = session();
    text(&mut s, "let kept = 42;");
    let h = s.interrupt_handle();
    let t = std::thread::spawn(move || {
        std::thread::sleep(std::time::Duration::from_millis(200));
        h.interrupt();
    });
    let start = std::time::Instant::now();
    let e = err(&mut s, "let i = 0; loop { i += 1; }");
    t.join().unwrap();
    assert_eq!(e.kind, "Interrupted");
    // Generous bound: the hook fires on every operation; this only guards against a hang.
    assert!(start.elapsed().as_secs() < 5);
    assert_eq!(text(&mut s, "kept"), "42");
}

#[test]
fn is_complete_follows_the_parser() {
    assert_eq!(Session::is_complete("let x = 1;"), Completeness::Complete);
    assert_eq!(Session::is_complete("fn f() {"), Completeness::Incomplete);
    assert_eq!(Session::is_complete("/* open"), Completeness::Incomplete);
    assert_eq!(
        Session::is_complete("let s = \"abc"),
        Completeness::Incomplete
    );
    assert_eq!(
        Session::is_complete("let x = (1 +"),
        Completeness::Incomplete
    );
    assert_eq!(Session::is_complete("let = ;"), Completeness::Invalid);
}

#[test]
fn column_arithmetic_runs_over_the_whole_column_with_units() {
    let mut s = session();
    text(
        &mut s,
        r#"let x = column([1.0, 2.0, 3.0], "mV"); let r = 2.0 * kohm;"#,
    );
    // Ohm's law sample by sample: i = v / r (closed form).
    let i = text(&mut s, r#"let i = x / r; i.values("uA")"#);
    assert_eq!(i, "[0.5, 1.0, 1.5]");
    assert_eq!(
        text(&mut s, r#"(x + q("1 mV")).values("mV")"#),
        "[2.0, 3.0, 4.0]"
    );
    assert_eq!(text(&mut s, r#"(x - x).values("mV")"#), "[0.0, 0.0, 0.0]");
    assert_eq!(text(&mut s, r#"(-x).values("mV")"#), "[-1.0, -2.0, -3.0]");
    assert_eq!(
        text(&mut s, r#"(x * x / x).values("mV")"#),
        "[1.0, 2.0, 3.0]"
    );
    assert_eq!(
        text(&mut s, r#"x.values("mV")"#),
        "[1.0, 2.0, 3.0]",
        "operands are not changed in place"
    );
    assert_eq!(text(&mut s, r#"x[-1]"#), "3 mV");
    assert_eq!(text(&mut s, r#"x.sum()"#), "6 mV");
    let e = err(&mut s, "x + 1.0 * N");
    assert_eq!(e.kind, "UnitError");
    assert_eq!(e.message, "cannot add a column of 3 values in mV and 1 N");
    let e = err(&mut s, "x + column([1.0], \"mV\")");
    assert!(
        e.message.contains("different lengths, 3 and 1"),
        "{}",
        e.message
    );
    let e = err(&mut s, "x[3]");
    assert_eq!(e.kind, "IndexError");
}

#[test]
fn column_prints_and_converts() {
    let mut s = session();
    assert_eq!(
        text(&mut s, r#"column([1.0, 2.5], "kN")"#),
        "[1, 2.5] kN (2 samples)"
    );
    assert_eq!(text(&mut s, r#"linspace(0.0 * N, 1.0 * N, 21).len"#), "21");
    assert!(text(&mut s, r#"linspace(0.0 * N, 1.0 * N, 21)"#).contains('…'));
    assert_eq!(
        text(&mut s, r#"column([q("1 V"), q("2 V")]).to_array()"#),
        "[1 V, 2 V]"
    );
    let e = err(&mut s, r#"column([q("1 V"), q("2 N")])"#);
    assert_eq!(e.kind, "UnitError");
}

#[test]
fn stdlib_table_prints_units_in_headers() {
    let mut s = session();
    let sink = Arc::new(CaptureSink::default());
    s.set_output(sink.clone());
    s.eval_cell(
        r#"import "table" as table;
let rows = [
    #{ load: q("0 kN"), out: q("0 mV/V"), note: "zero" },
    #{ load: q("5000 N"), out: q("1.0003 mV/V"), note: "half" },
    #{ load: q("10 kN"), out: q("2.0001 mV/V"), note: "rated" },
];
table::show(rows, ["load", "out", "note"]);"#,
        "cell[1]",
    )
    .unwrap_or_else(|e| panic!("{}", e.render()));
    let expected = "\
load [kN]  out [mV/V]  note
---------  ----------  -----
        0           0  zero
        5      1.0003  half
       10      2.0001  rated
";
    assert_eq!(sink.stdout_text(), expected);
    // The import persists into later cells.
    let cols = text(
        &mut s,
        r#"let c = #{ f: column([1.0, 2.0], "N"), e: column([10.0, 20.0], "ue") };
table::format_with(table::rows_of(c, ["f", "e"]), ["f", "e"], #{ units: #{ f: "mN" } })"#,
    );
    assert_eq!(
        cols,
        "f [mN]  e [µε]\n------  ------\n  1000      10\n  2000      20"
    );
}

#[test]
fn completion_covers_functions_variables_units_and_modules() {
    let mut s = session();
    text(
        &mut s,
        "let bridge_out = 1.0 * mV_per_V; import \"table\" as tbl;",
    );
    let c = s.completions("let y = bridge_o", 16);
    assert_eq!(c.matches, vec!["bridge_out".to_string()]);
    assert_eq!((c.start, c.end), (8, 16));
    let c = s.completions("assert_c", 8);
    assert!(c.matches.contains(&"assert_close".to_string()));
    let c = s.completions("let r = q(\"350 koh", 18);
    assert!(c.matches.contains(&"kohm".to_string()), "{:?}", c.matches);
    assert_eq!(c.start, 15);
    let c = s.completions("let k = kN.to(\"lb", 17);
    assert!(c.matches.contains(&"lbf".to_string()), "{:?}", c.matches);
    let c = s.completions("tbl::sh", 7);
    assert_eq!(c.matches, vec!["show".to_string()]);
    let c = s.completions("bridge_out.val", 14);
    assert!(c.matches.contains(&"value".to_string()), "{:?}", c.matches);
    let c = s.completions("import \"ta", 10);
    assert!(c.matches.contains(&"table".to_string()), "{:?}", c.matches);
    // Unicode before the cursor: offsets are characters, not bytes.
    let c = s.completions("// µε\nbridge_o", 14);
    assert_eq!((c.start, c.end), (6, 14));
}

#[test]
fn inspection_shows_the_reference() {
    let mut s = session();
    text(
        &mut s,
        "/// Twice the input.\nfn twice(x) { 2 * x }\nlet r = 350.0 * ohm;",
    );
    let doc = s.inspect("q(\"1 V\")", 1).expect("q has a reference");
    assert!(doc.contains("q(text: String) -> Quantity"), "{doc}");
    let doc = s.inspect("abs(", 4).expect("callee of the open call");
    assert!(doc.starts_with("## abs"), "{doc}");
    assert!(
        s.inspect("twice(r)", 2)
            .is_some_and(|d| d.contains("Twice the input."))
    );
    assert!(s.inspect("r", 1).is_some_and(|d| d.contains("350 Ω")));
    assert!(
        s.inspect("kN", 1)
            .is_some_and(|d| d.contains("unit constant"))
    );
    assert_eq!(s.inspect("   ", 1), None);
}

#[test]
fn record_fields_print_and_show_as_html() {
    let mut s = session();
    s.eval_cell("let x = column([1.0, 2.0, 3.0, 4.0], \"mV\").stats();", "c")
        .unwrap();
    assert_eq!(text(&mut s, "x.mean"), "2.5 mV");
    // numpy 2.4.6: numpy.std([1, 2, 3, 4], ddof=1) = 1.2909944487358056
    assert_close_text(
        &text(&mut s, "x.std.value(\"mV\")"),
        1.2909944487358056,
        1e-12,
    );
    let out = s.eval_cell("x", "c").unwrap().value.unwrap();
    assert!(
        out.get("text/plain").unwrap().contains("\n  mean "),
        "{:?}",
        out.get("text/plain")
    );
    assert!(
        out.get("text/html")
            .unwrap()
            .contains("<th>mean</th><td>2.5 mV</td>"),
        "{:?}",
        out.get("text/html")
    );
    let e = err(&mut s, "x.median");
    assert_eq!(e.kind, "PropertyNotFound");
    assert!(e.message.contains("no field `median`"), "{}", e.message);
}

fn assert_close_text(t: &str, expected: f64, rel: f64) {
    let v: f64 = t.parse().unwrap_or_else(|_| panic!("not a number: {t}"));
    assert!(
        (v - expected).abs() <= rel * expected.abs(),
        "{v} vs {expected}"
    );
}

#[test]
fn reference_markdown_lists_every_function() {
    let e = build_engine(&Default::default());
    let md = gaugebook::script::reference_markdown(&e, None).unwrap();
    for name in [
        "q",
        "column",
        "assert_close",
        "display",
        "format_number",
        "unit_constants",
    ] {
        assert!(md.contains(&format!("\n## {name}\n")), "{name} missing");
    }
    assert!(gaugebook::script::reference_markdown(&e, Some("no_such")).is_none());
}

/// Speed (DESIGN.md §5): one column expression over 10 million samples, against the same loop
/// over plain Rhai arrays and in plain Rust. Prints ratios, asserts only that the three agree.
/// Run: `cargo test --release --no-default-features --features script --test integration
/// bench_column -- --ignored --nocapture` (GB_BENCH_N sets the sample count).
#[test]
#[ignore = "benchmark; run in release with --ignored --nocapture"]
fn bench_column_expression() {
    use gaugebook::script::{Column, rhai::Dynamic};
    use std::time::Instant;

    let n: usize = std::env::var("GB_BENCH_N")
        .ok()
        .and_then(|v| v.parse().ok())
        .unwrap_or(10_000_000);
    let gf = 2.1;
    // Strain samples spread over ±2000 µε.
    let strain: Vec<f64> = (0..n)
        .map(|i| ((i % 4001) as f64 - 2000.0) * 1e-6)
        .collect();

    // Quarter-bridge exact output ratio, GF·ε/4 / (1 + GF·ε/2): the Wheatstone divider identity
    // with one active arm, ΔR/R = GF·ε (closed form); the benchmark only needs the paths to agree.
    let t = Instant::now();
    let rust: Vec<f64> = strain
        .iter()
        .map(|&e| (gf * e / 4.0) / (1.0 + gf * e / 2.0))
        .collect();
    let t_rust = t.elapsed().as_secs_f64();

    let mut s = session();
    s.set_constant("x", Dynamic::from(Column::new(strain.clone(), "").unwrap()));
    s.set_constant("gf", Dynamic::from(gf));
    let t = Instant::now();
    s.eval_cell(
        "let y = (x * (gf / 4.0)) / (1.0 + x * (gf / 2.0));",
        "bench",
    )
    .unwrap();
    let t_col = t.elapsed().as_secs_f64();
    let y = s.eval_cell("y[-1]", "bench").unwrap().value.unwrap();
    let last: f64 = y.get("text/plain").unwrap().parse().unwrap();
    assert!(
        (last - rust[n - 1]).abs() <= 1e-6 * rust[n - 1].abs(),
        "{last} vs {}",
        rust[n - 1]
    );

    // A simpler chain: scale and offset (raw output to strain to load).
    let t = Instant::now();
    let rust2: Vec<f64> = strain.iter().map(|&e| e * 2.0e8 + 5.0).collect();
    let t_rust2 = t.elapsed().as_secs_f64();
    let t = Instant::now();
    s.eval_cell("let z = x * 2.0e8 + 5.0;", "bench").unwrap();
    let t_col2 = t.elapsed().as_secs_f64();
    assert_eq!(rust2.len(), n);

    let arrays: Vec<Dynamic> = strain.iter().map(|&v| Dynamic::from(v)).collect();
    s.set_constant("a", Dynamic::from_array(arrays));
    let t = Instant::now();
    s.eval_cell(
        "let y2 = []; let k1 = gf / 4.0; let k2 = gf / 2.0; for e in a { y2.push((e * k1) / (1.0 + e * k2)); } y2.len()",
        "bench",
    )
    .unwrap();
    let t_rhai = t.elapsed().as_secs_f64();

    println!("samples: {n}");
    println!(
        "quarter-bridge output: plain Rust {:.4} s, Column {:.4} s, Rhai array loop {:.3} s",
        t_rust, t_col, t_rhai
    );
    println!(
        "  Column / Rust = {:.2}   Rhai loop / Column = {:.1}",
        t_col / t_rust,
        t_rhai / t_col
    );
    println!(
        "scale and offset: plain Rust {:.4} s, Column {:.4} s; Column / Rust = {:.2}",
        t_rust2,
        t_col2,
        t_col2 / t_rust2
    );
}

/// The stdlib's excitation procedure (stdlib/excitation.rhai) against the closed forms it
/// combines: the power-density limit of an equal-arm bridge V = 2·√(q·A·R) (each gauge carries
/// half the excitation, P = V²/(4R)); Johnson-Nyquist noise 4kTR of the bridge's output
/// resistance R (Nyquist, Phys. Rev. 32, 110, 1928, from memory) with k exact (SI Brochure,
/// 9th edition, 2019); quantisation noise LSB/√12 (Bennett, Bell Syst. Tech. J. 27, 446, 1948,
/// from memory); noise-free counts = rated output / (6.6 σ) (common practice).
#[test]
fn stdlib_excitation_matches_the_closed_forms() {
    let mut s = session();
    let rows = text(
        &mut s,
        r#"import "excitation" as ex;
let d = ex::choose(#{
    length: q("3 mm"), width: q("2.5 mm"), gf: 2.0, power_density: q("1.5 kW/m^2"),
    supply: q("10 V"), rated_output: q("2 mV/V"), capacity: q("500 N"),
    gain: 128, bits: 24, ratiometric: 1.0, noise_density: 8e-9, bandwidth: q("10 Hz"),
    counts: 30000,
});
let out = [];
for r in d.rows { out.push([r.resistance.value("ohm"), r.excitation.value("V"), r.power.value("W"), r.counts]); }
out.push(d.choice.resistance.value("ohm"));
out"#,
    );
    let k = 1.380649e-23;
    let t = 296.15;
    let (area, q_lim, supply, step) = (3e-3 * 2.5e-3, 1500.0, 10.0, 0.5);
    let mut expected = Vec::new();
    for r in [120.0_f64, 350.0, 700.0, 1000.0] {
        let v_max = 2.0 * (q_lim * area * r).sqrt();
        let v = (v_max.min(supply) / step).floor() * step;
        let power = v * v / (4.0 * r);
        let density = (8e-9_f64.powi(2) + 4.0 * k * t * r).sqrt();
        let amp = density * 10.0_f64.sqrt();
        let lsb = 2.0 * v / (128.0 * 2f64.powi(24));
        let sigma = amp.hypot(lsb / 12.0_f64.sqrt());
        let counts = 2e-3 * v / (6.6 * sigma);
        expected.push((r, v, power, counts));
    }
    let got: Vec<f64> = rows
        .trim_matches(|c| c == '[' || c == ']')
        .split(|c| c == ',' || c == '[' || c == ']')
        .filter_map(|x| x.trim().parse().ok())
        .collect();
    assert_eq!(got.len(), 17, "{rows}");
    for (i, (r, v, p, n)) in expected.iter().enumerate() {
        let g = &got[4 * i..4 * i + 4];
        assert_eq!(g[0], *r);
        assert!((g[1] - v).abs() < 1e-12, "excitation {} vs {v}", g[1]);
        assert!((g[2] - p).abs() < 1e-6 * p, "power {} vs {p}", g[2]);
        assert!((g[3] - n).abs() < 1e-3 * n, "counts {} vs {n}", g[3]);
    }
    // 120 Ω reaches only ~23 600 counts: the least-power candidate that reaches 30 000 is 350 Ω.
    assert!(expected[0].3 < 30000.0 && expected[1].3 > 30000.0);
    assert_eq!(got[16], 350.0);
    // No candidate reaches a million counts: the error names the best one.
    let e = err(
        &mut s,
        r#"ex::choose(#{ length: q("3 mm"), width: q("2.5 mm"), power_density: q("1.5 kW/m^2"),
    supply: q("10 V"), rated_output: q("2 mV/V"), capacity: q("500 N"), gain: 128, bits: 24,
    noise_density: 8e-9, bandwidth: q("10 Hz"), counts: 1000000 })"#,
    );
    assert!(
        e.message
            .contains("no candidate reaches 1000000 noise-free counts")
            && e.message.contains("1000 Ω"),
        "{}",
        e.message
    );
}
