//! Script-level tests of the test-log bindings (`src/script/data.rs`): paths resolved against the
//! script's folder, errors at the call position naming file, row and column, the frame's text
//! and HTML, strain from bridge output against the closed-form quarter-bridge output, and export
//! round trips.

use std::path::Path;

use gaugebook::script::{ScriptError, Session, SessionOptions};

fn session_in(dir: Option<&Path>) -> Session {
    Session::new(SessionOptions {
        script_dir: dir.map(Path::to_path_buf),
        ..Default::default()
    })
    .expect("session")
}

fn value(s: &mut Session, code: &str, mime: &str) -> String {
    match s.eval_cell(code, "cell[1]") {
        Ok(out) => out
            .value
            .and_then(|b| b.get(mime).map(str::to_string))
            .unwrap_or_default(),
        Err(e) => panic!("{}", e.render()),
    }
}

fn run(s: &mut Session, code: &str) {
    if let Err(e) = s.eval_cell(code, "cell[1]") {
        panic!("{}", e.render());
    }
}

fn err(s: &mut Session, code: &str) -> ScriptError {
    match s.eval_cell(code, "cell[2]") {
        Ok(out) => panic!("expected an error, got {:?}", out.value),
        Err(e) => e,
    }
}

#[test]
fn relative_paths_resolve_against_the_session_script_folder() {
    let dir = tempfile::tempdir().unwrap();
    std::fs::write(dir.path().join("run.csv"), "time_s,load [kN]\n0,1\n1,2\n").unwrap();
    let mut s = session_in(Some(dir.path()));
    run(
        &mut s,
        r#"let f = read_log("run.csv"); assert_eq(f.rows, 2); assert_close(f["load"][1], q("2 kN"), 1e-12);"#,
    );
    // Written relative to the same folder, read back.
    run(
        &mut s,
        r#"write_csv("out.csv", #{ e: column([1.0], "ue") }); assert_eq(read_log("out.csv").rows, 1);"#,
    );
    assert!(dir.path().join("out.csv").is_file());
}

#[test]
fn relative_paths_resolve_against_the_calling_file() {
    let dir = tempfile::tempdir().unwrap();
    std::fs::write(dir.path().join("log.csv"), "x [mm]\n4\n").unwrap();
    let script = dir.path().join("analysis.rhai");
    let code = r#"read_log("log.csv")["x"][0]"#;
    std::fs::write(&script, code).unwrap();
    // No script folder in the session: the origin (a real file) decides.
    let mut s = session_in(None);
    let out = s
        .eval_cell(code, &script.to_string_lossy())
        .unwrap_or_else(|e| panic!("{}", e.render()));
    assert_eq!(out.value.unwrap().get("text/plain"), Some("4 mm"));
}

#[test]
fn a_missing_file_is_an_error_at_the_call_naming_the_file() {
    let dir = tempfile::tempdir().unwrap();
    let mut s = session_in(Some(dir.path()));
    let e = err(&mut s, "let a = 1;\nlet f = read_log(\"nothere.csv\");");
    assert_eq!(e.kind, "DataError");
    assert!(e.message.contains("nothere.csv"), "{}", e.message);
    assert_eq!((e.origin.as_str(), e.line), ("cell[2]", 2));
    assert_eq!(e.column, 9, "{}", e.render());
}

#[test]
fn a_bad_number_names_file_row_and_column() {
    let dir = tempfile::tempdir().unwrap();
    std::fs::write(dir.path().join("bad.csv"), "t,sg1_mVV\n0,0.1\n1,oops\n").unwrap();
    let mut s = session_in(Some(dir.path()));
    let e = err(&mut s, r#"read_log("bad.csv")"#);
    assert_eq!(e.kind, "DataError");
    // Row 3 (header = row 1), column 2 `sg1_mVV`.
    assert!(e.message.contains("bad.csv"), "{}", e.message);
    assert!(e.message.contains("row 3"), "{}", e.message);
    assert!(e.message.contains("column 2"), "{}", e.message);
    assert_eq!(e.line, 1);
    // Typos in option keys and column names are errors naming them.
    let e = err(
        &mut s,
        r#"read_log("bad.csv", #{ skip_nan: true, colums: ["sg1"] })"#,
    );
    assert!(e.message.contains("unknown key `colums`"), "{}", e.message);
    std::fs::write(dir.path().join("good.csv"), "t,sg1_mVV\n0,0.1\n").unwrap();
    let e = err(&mut s, r#"read_log("good.csv")["sg9"]"#);
    assert!(e.message.contains("no column `sg9`"), "{}", e.message);
}

#[test]
fn the_frame_prints_names_units_and_ranges_and_shows_as_a_table() {
    let dir = tempfile::tempdir().unwrap();
    let mut csv = String::from("time_s,sg1_mVV\n");
    for i in 0..25 {
        csv.push_str(&format!("{},{}\n", i as f64 * 0.01, i as f64 * 0.1));
    }
    std::fs::write(dir.path().join("r.csv"), csv).unwrap();
    let mut s = session_in(Some(dir.path()));
    let text = value(&mut s, r#"read_log("r.csv")"#, "text/plain");
    assert!(text.contains("25 rows × 2 columns"), "{text}");
    assert!(text.contains("100 Hz"), "{text}");
    assert!(text.contains("sg1") && text.contains("mV/V"), "{text}");
    assert!(text.contains("max 2.4"), "{text}");
    let html = value(&mut s, r#"read_log("r.csv")"#, "text/html");
    assert!(
        html.starts_with("<table class=\"gaugebook-frame\">"),
        "{html}"
    );
    assert!(
        html.contains("<th>unit</th><td>s</td><td>mV/V</td>"),
        "{html}"
    );
    assert!(html.contains("15 more rows"), "{html}");
}

#[test]
fn strain_from_a_logged_quarter_bridge_matches_the_closed_form() {
    // Quarter bridge, one active arm, equal arms: Vo/V = GF·ε / (4 + 2·GF·ε)
    // (the Wheatstone-bridge law with R1 = R(1 + GF·ε) and three equal arms, a closed-form
    // identity; Dally & Riley, Experimental Stress Analysis, 4th ed., ch. 8, from memory);
    // to_strain must invert it exactly.
    let gf = 2.1;
    let strains = [-2000e-6, -10e-6, 0.0, 500e-6, 3000e-6];
    let mut csv = String::from("time_s,sg1 [mV/V]\n");
    for (i, e) in strains.iter().enumerate() {
        let r = gf * e / (4.0 + 2.0 * gf * e);
        csv.push_str(&format!("{i},{:e}\n", r * 1e3));
    }
    let dir = tempfile::tempdir().unwrap();
    std::fs::write(dir.path().join("sg.csv"), csv).unwrap();
    let mut s = session_in(Some(dir.path()));
    for (i, e) in strains.iter().enumerate() {
        let got = value(
            &mut s,
            &format!(r#"to_strain(read_log("sg.csv")["sg1"], "quarter", 2.1)[{i}].value("ue")"#),
            "text/plain",
        );
        let got: f64 = got.parse().unwrap();
        assert!(
            (got - e * 1e6).abs() < 1e-9,
            "sample {i}: {got} vs {}",
            e * 1e6
        );
    }
    let e = err(
        &mut s,
        r#"to_strain(read_log("sg.csv")["sg1"], "full-poisson", 2.1)"#,
    );
    assert!(e.message.contains("Poisson's ratio"), "{}", e.message);
    let e = err(
        &mut s,
        r#"to_strain(read_log("sg.csv").time, "quarter", 2.1)"#,
    );
    assert_eq!(e.kind, "UnitError");
}

#[test]
fn a_long_log_reads_and_reduces_in_rust() {
    // 200 000 rows: x = i, so the mean is (n − 1)/2 exactly (closed form).
    let n = 200_000usize;
    let mut csv = String::with_capacity(n * 16);
    csv.push_str("time_s,x [N]\n");
    for i in 0..n {
        csv.push_str(&format!("{},{i}\n", i as f64 * 1e-3));
    }
    let dir = tempfile::tempdir().unwrap();
    std::fs::write(dir.path().join("long.csv"), csv).unwrap();
    let mut s = session_in(Some(dir.path()));
    run(
        &mut s,
        r#"let f = read_log("long.csv");
           assert_eq(f.rows, 200000);
           assert_close(f["x"].mean(), q("99999.5 N"), 1e-12);
           assert_close(f.sample_rate, q("1 kHz"), 1e-9);
           assert_eq(f.gaps.len(), 0);"#,
    );
}

#[test]
fn parquet_and_csv_round_trip_with_units() {
    let dir = tempfile::tempdir().unwrap();
    let mut s = session_in(Some(dir.path()));
    run(
        &mut s,
        r#"let cols = #{ a: column([0.5, -1.25], "mV/V"), b: column([20.0, 21.5], "degC") };
           write_parquet("x.parquet", cols);
           write_csv("x.csv", cols);
           for p in ["x.parquet", "x.csv"] {
               let f = read_log(p, #{ time: false });
               assert_eq(f.names, ["a", "b"]);
               assert_eq(f["a"].values("mV/V"), [0.5, -1.25]);
               assert_close(f["b"][1], q("21.5 degC"), 1e-12);
           }"#,
    );
    let e = err(
        &mut s,
        r#"write_csv("y.csv", #{ a: column([1.0], "N"), b: column([1.0, 2.0], "N") })"#,
    );
    assert_eq!(e.kind, "DataError");
    assert!(!dir.path().join("y.csv").exists());
}

#[test]
fn zero_and_drift_against_hand_means() {
    let mut s = session_in(None);
    // zero over [0, 0.3) s: mean of 1, 2, 3 = 2 (hand calculation).
    run(
        &mut s,
        r#"let t = column([0.0, 0.1, 0.2, 0.3, 0.4], "s");
           let x = column([1.0, 2.0, 3.0, 10.0, 20.0], "uV");
           let z = zero(x, t, 0.0 * s, 0.3 * s);
           assert_eq(z.values("uV"), [-1.0, 0.0, 1.0, 8.0, 18.0]);"#,
    );
    let e = err(
        &mut s,
        r#"zero(column([1.0], "V"), column([0.0], "s"), 5.0 * s, 6.0 * s)"#,
    );
    assert_eq!(e.kind, "DataError");
    assert!(e.message.contains("zero window"), "{}", e.message);
}

// ---------------------------------------------------------------------------------------------
// Block by block: blocks(), the running filter, statistics and fit, open_writer()

/// A log of `n` rows at 1 kHz: a strain-like channel (a slow sine and a faster one, plus an
/// offset) and a force proportional to it plus a small wobble, so the fit is not exact.
fn long_log(dir: &Path, n: usize) -> std::path::PathBuf {
    let mut text = String::from("time_s,sg_mVV,force [N]\n");
    for i in 0..n {
        let t = i as f64 * 1e-3;
        let mvv = 0.5 + 0.4 * (t * 0.7).sin() + 0.05 * (t * 31.0).sin();
        let f = 12.5 + 2000.0 * mvv + 0.3 * (t * 7.0).cos();
        text.push_str(&format!("{t:.3},{mvv:.6},{f:.3}\n"));
    }
    let p = dir.join("long.csv");
    std::fs::write(&p, text).unwrap();
    p
}

#[test]
fn a_log_reduced_block_by_block_matches_the_whole_log_reduced_at_once() {
    // The reference is the whole-record path (lowpass, stats and a least-squares line over
    // whole columns; lowpass itself is checked against scipy.signal in tests/signal.rs).
    let dir = tempfile::tempdir().unwrap();
    long_log(dir.path(), 30_000);
    let mut s = session_in(Some(dir.path()));
    run(
        &mut s,
        r#"
        let design = #{ cutoff: 20.0 * Hz, rate: 1000.0 * Hz, order: 4 };
        // Whole record.
        let f = read_log("long.csv");
        let e = to_strain(f["sg"], "quarter", 2.0);
        let y = lowpass(e, design);
        let whole = stats(y);
        let load = lowpass(f["force"], design);
        let dx = y - y.mean();
        let b_whole = (dx * (load - load.mean())).sum() / (dx * dx).sum();
        // Block by block, 4 KiB of file at a time (about 150 blocks).
        let lp = running_lowpass(design);
        let lpf = running_lowpass(design);
        let st = running_stats();
        let fit = running_fit();
        let kept = [];
        let times = [];
        let blocks_seen = 0;
        for b in blocks("long.csv", #{ block_bytes: 4096 }) {
            let yb = lp.apply(to_strain(b["sg"], "quarter", 2.0));
            st.add(yb);
            fit.add(yb, lpf.apply(b["force"]));
            kept.push(yb);
            times.push(b.time);
            blocks_seen += 1;
        }
        assert(blocks_seen > 100);
        let run = st.summary();
        assert_eq(run.count, whole.count);
        assert_close(run.mean, whole.mean, 1e-12);
        assert_close(run.std, whole.std, 1e-11);
        assert_close(run.max, whole.max, 1e-15);
        assert_close(run.min, whole.min, 1e-15);
        assert_close(fit.line().b, b_whole, 1e-11);
        let joined = concat(kept);
        assert_eq(joined.len(), y.len());
        assert_close(joined[29999], y[29999], 1e-13);
        assert_eq(rising_crossings(joined, whole.mean), rising_crossings(y, whole.mean));
        // Rainflow counts and the figure over the blocks are those of the whole record.
        let rf = rainflow(kept);
        let rf_whole = rainflow(y);
        assert(rf.cycles > 10.0);
        assert_eq(rf.cycles, rf_whole.cycles);
        assert_eq(rf.start.values(""), rf_whole.start.values(""));
        assert_eq(rf.range.values("ue"), rf_whole.range.values("ue"));
        let opts = #{ title: "sg", y_name: "strain", names: ["sg"] };
        assert_eq(plot(times, kept, opts).to_svg(), plot(f.time, y, opts).to_svg());
        "#,
    );
}

#[test]
fn a_bad_number_deep_in_a_log_read_in_blocks_names_row_column_and_script_line() {
    let dir = tempfile::tempdir().unwrap();
    let mut text = String::from("t,a\n");
    for i in 0..5000 {
        if i == 4321 {
            text.push_str("4.321,oops\n");
        } else {
            text.push_str(&format!("{},{}\n", i as f64 * 1e-3, i));
        }
    }
    std::fs::write(dir.path().join("bad.csv"), text).unwrap();
    let mut s = session_in(Some(dir.path()));
    let e = err(
        &mut s,
        "let n = 0;\nfor b in blocks(\"bad.csv\", #{ block_bytes: 4096 }) {\n  n += b.rows;\n}",
    );
    assert_eq!(e.kind, "DataError");
    // Data row i sits on file row i + 2.
    assert!(
        e.message.contains("bad.csv")
            && e.message.contains("row 4323")
            && e.message.contains("column 2"),
        "{}",
        e.message
    );
    assert_eq!(e.line, 2, "{}", e.render());
    // The blocks before the bad one were delivered: the loop ran.
    run(&mut s, "assert(n > 3000);");
}

#[test]
fn a_writer_fed_block_by_block_writes_what_a_whole_column_writer_writes() {
    let dir = tempfile::tempdir().unwrap();
    long_log(dir.path(), 5_000);
    let mut s = session_in(Some(dir.path()));
    run(
        &mut s,
        r#"
        for fmt in ["csv", "parquet"] {
            let w = open_writer("blocks." + fmt);
            for b in blocks("long.csv", #{ block_bytes: 4096 }) {
                w.append(#{ t: b.time, e: to_strain(b["sg"], "quarter", 2.0).to("ue") });
            }
            assert(w.finish() > 0);
            let f = read_log("long.csv");
            let cols = #{ t: f.time, e: to_strain(f["sg"], "quarter", 2.0).to("ue") };
            if fmt == "csv" { write_csv("whole.csv", cols); } else { write_parquet("whole.parquet", cols); }
            let a = read_log("blocks." + fmt);
            let c = read_log("whole." + fmt);
            assert_eq(a.names, c.names);
            assert_eq(a["e"].values("ue"), c["e"].values("ue"));
        }
        "#,
    );
}

#[test]
fn a_writer_never_finished_leaves_no_file_and_bad_blocks_are_refused() {
    let dir = tempfile::tempdir().unwrap();
    let mut s = session_in(Some(dir.path()));
    let e = err(
        &mut s,
        r#"let w = open_writer("half.parquet");
w.append(#{ a: column([1.0, 2.0], "N") });
w.append(#{ a: column([1.0], "m") });"#,
    );
    assert_eq!(
        (e.kind.as_str(), e.line),
        ("UnitError", 3),
        "{}",
        e.render()
    );
    assert!(e.message.contains("column `a`"), "{}", e.message);
    let e = err(
        &mut s,
        r#"let w = open_writer("half2.csv");
w.append(#{ a: column([1.0, 2.0], "N"), b: column([1.0], "N") });"#,
    );
    assert!(e.message.contains("one length"), "{}", e.message);
    // Both writers are gone with their cells' scopes: nothing in the folder, not even a
    // temporary file.
    drop(s);
    let left: Vec<_> = std::fs::read_dir(dir.path()).unwrap().collect();
    assert!(left.is_empty(), "{left:?}");
}

/// The benchmark's script (`examples/reanalysis.rhai`, block by block) on a small log of the
/// benchmark's shape, against the same steps over whole columns in a second cell.
#[cfg(feature = "plot")]
#[test]
fn the_reanalysis_example_script_matches_the_whole_record_steps() {
    use gaugebook::script::rhai::Dynamic;
    let dir = tempfile::tempdir().unwrap();
    // Four quarter-bridge channels and a reference load at 1 kHz (a fictional axial rig): a
    // load programme of ramps and a 5 Hz block, the bridge law r = x/(4+2x), x = GF·ε.
    let mut text = String::from("time_s,sg1_mVV,sg2_mVV,sg3_mVV,sg4_mVV,temp_C,load_ref_N\n");
    let n: usize = 30_000;
    for i in 0..n {
        let t = i as f64 * 1e-3;
        let load = if t < 5.0 {
            1600.0 * t
        } else {
            8000.0 + 4000.0 * (t * 31.4159).sin()
        };
        let e = load * 62.5e-9;
        let r = |k: f64| {
            let x = 2.1 * k * e;
            1e3 * x / (4.0 + 2.0 * x) + 0.0002 * ((i * 7919 % 1000) as f64 / 1000.0 - 0.5)
        };
        text.push_str(&format!(
            "{t:.3},{:.6},{:.6},{:.6},{:.6},23.000,{:.2}\n",
            r(1.03),
            r(-0.30),
            r(0.97),
            r(-0.29),
            load + 3.0 * ((i * 104_729 % 1000) as f64 / 1000.0 - 0.5)
        ));
    }
    let log = dir.path().join("rig.csv");
    std::fs::write(&log, text).unwrap();
    let here = std::path::Path::new(env!("CARGO_MANIFEST_DIR")).join("examples");
    let source = std::fs::read_to_string(here.join("reanalysis.rhai")).unwrap();
    let mut s = session_in(Some(dir.path()));
    let path = |p: &Path| Dynamic::from(p.to_string_lossy().into_owned());
    s.set_constant("LOG", path(&log));
    s.set_constant("OUT_DIR", path(dir.path()));
    s.set_constant("STEM", Dynamic::from("rig".to_string()));
    s.set_constant("INPUT", Dynamic::from("rig.csv".to_string()));
    s.set_constant("FORMAT", Dynamic::from("parquet".to_string()));
    s.set_constant("EXTRAS", Dynamic::from(true));
    if let Err(e) = s.eval_cell(&source, &here.join("reanalysis.rhai").to_string_lossy()) {
        panic!("{}", e.render());
    }
    for f in ["rig_strain.parquet", "rig_summary.json", "rig_load.png"] {
        assert!(dir.path().join(f).is_file(), "{f} missing");
    }
    // The reference: the same steps over whole columns, written as JSON beside the summary.
    run(
        &mut s,
        r#"
        let f = read_log("rig.csv");
        let design = #{ cutoff: 50.0 * Hz, rate: 1000.0 * Hz, order: 2 };
        let out = #{};
        for ch in ["sg1", "sg2", "sg3", "sg4"] {
            let e = to_strain(f[ch], "quarter", 2.10);
            let y = lowpass(e - e.slice(0, 1000).mean(), design);
            let st = stats(y);
            out[ch] = #{ mean_ue: st.mean.value("ue"), std_ue: st.std.value("ue"),
                         max_ue: st.max.value("ue"), rising_mean_crossings: rising_crossings(y, st.mean) };
            if ch == "sg1" { out.x = y; }
        }
        let load = lowpass(f["load_ref"], design);
        let dx = out.x - out.x.mean();
        out.b_N_per_ue = ((dx * (load - load.mean())).sum() / (dx * dx).sum()).value("N/ue");
        out.remove("x");
        write_text("reference.json", out.to_json());
        "#,
    );
    let read = |f: &str| -> serde_json::Value {
        serde_json::from_str(&std::fs::read_to_string(dir.path().join(f)).unwrap()).unwrap()
    };
    let (sum, reference) = (read("rig_summary.json"), read("reference.json"));
    let close = |a: &serde_json::Value, b: &serde_json::Value, rel: f64| {
        let (a, b) = (a.as_f64().unwrap(), b.as_f64().unwrap());
        assert!((a - b).abs() <= rel * b.abs(), "{a} against {b}");
    };
    for ch in ["sg1", "sg2", "sg3", "sg4"] {
        let (c, r) = (&sum["channels"][ch], &reference[ch]);
        close(&c["mean_ue"], &r["mean_ue"], 1e-10);
        close(&c["std_ue"], &r["std_ue"], 1e-10);
        close(&c["max_ue"], &r["max_ue"], 1e-12);
        assert_eq!(
            c["rising_mean_crossings"], r["rising_mean_crossings"],
            "{ch}"
        );
    }
    close(&sum["fit"]["b_N_per_ue"], &reference["b_N_per_ue"], 1e-10);
    assert_eq!(sum["rows"], 30_000);
    assert!(sum["load_rainflow"]["cycles"].as_f64().unwrap() > 100.0);
}

/// The README's block-by-block example runs as printed, on a log of its shape.
#[test]
fn the_readme_block_by_block_example_runs() {
    let readme =
        std::fs::read_to_string(concat!(env!("CARGO_MANIFEST_DIR"), "/README.md")).unwrap();
    let from = readme.find("**A long test log, block by block.**").unwrap();
    let start = from + readme[from..].find("```rhai\n").unwrap() + "```rhai\n".len();
    let code = &readme[start..start + readme[start..].find("```").unwrap()];
    let dir = tempfile::tempdir().unwrap();
    let mut text = String::from("time_s,sg1_mVV,load_ref_N\n");
    for i in 0..20_000 {
        let t = i as f64 * 1e-3;
        let load = 4000.0 + 3000.0 * (t * 6.0).sin();
        // 62.5 µε/kN, GF 2.10, the quarter-bridge law r = x/(4 + 2x).
        let x = 2.1 * load * 62.5e-9;
        text.push_str(&format!(
            "{t:.3},{:.6},{load:.2}\n",
            1e3 * x / (4.0 + 2.0 * x)
        ));
    }
    std::fs::write(dir.path().join("run42.csv"), text).unwrap();
    let mut s = session_in(Some(dir.path()));
    run(&mut s, code);
    // 62.5 µε/kN is 16 N/µε; the strain file holds every sample.
    run(
        &mut s,
        r#"assert_close(fit.line().b, q("16 N/ue"), 1e-6);
           assert_eq(read_log("strain.parquet").rows, 20000);"#,
    );
}

#[cfg(feature = "plot")]
#[test]
fn a_figure_saved_by_a_relative_path_lands_in_the_script_folder() {
    let dir = tempfile::tempdir().unwrap();
    let mut s = session_in(Some(dir.path()));
    run(
        &mut s,
        r#"histogram(column([1.0, 2.0, 2.5], "N"), 2).save("fig.svg");"#,
    );
    let svg = std::fs::read_to_string(dir.path().join("fig.svg")).unwrap();
    assert!(svg.starts_with("<svg"), "{}", &svg[..svg.len().min(40)]);
}

#[test]
fn a_column_taken_out_of_a_frame_converts_as_the_shared_one_does() {
    let dir = tempfile::tempdir().unwrap();
    std::fs::write(
        dir.path().join("a.csv"),
        "time_s,sg1_mVV\n0,0.5\n1,-0.25\n2,1.75\n",
    )
    .unwrap();
    let mut s = session_in(Some(dir.path()));
    run(
        &mut s,
        r#"
        let f = read_log("a.csv");
        let copied = to_strain(f["sg1"], "quarter", 2.1);
        let owned = to_strain(f.remove("sg1"), "quarter", 2.1);
        assert_eq(owned.values("ue"), copied.values("ue"));
        assert_eq(f.names, ["time"]);
        "#,
    );
    let e = err(&mut s, r#"let g = read_log("a.csv"); g.remove("time");"#);
    assert!(e.message.contains("stays in the frame"), "{}", e.message);
    let e = err(
        &mut s,
        r#"let g = read_log("a.csv"); g.remove("sg1"); g.remove("sg1");"#,
    );
    assert_eq!(e.kind, "PropertyNotFound", "{}", e.render());
}

#[test]
fn the_blocks_of_one_record_must_agree() {
    // Blocks are parts of one record: one dimension throughout, and as many x blocks as y.
    let mut s = session_in(None);
    let e = err(
        &mut s,
        r#"rainflow([column([1.0, 2.0], "kN"), column([3.0], "mm")])"#,
    )
    .render();
    assert!(
        e.contains("item 1 of the blocks of rainflow() is a column of"),
        "{e}"
    );
    let e = err(&mut s, "rainflow([])").render();
    assert!(
        e.contains("the blocks of rainflow() needs at least one column"),
        "{e}"
    );
    let e = err(
        &mut s,
        r#"plot([column([0.0], "s")], [column([1.0], "N"), column([2.0], "N")], #{})"#,
    )
    .render();
    assert!(e.contains("plot() has 1 x blocks but 2 y blocks"), "{e}");
    let e = err(
        &mut s,
        r#"plot([column([0.0, 1.0], "s")], [column([1.0], "N")], #{})"#,
    )
    .render();
    assert!(e.contains("has 2 x values but 1 y values"), "{e}");
}

#[test]
fn blocks_in_other_units_draw_in_the_first_blocks_unit() {
    // The reference is the joined record (concat shows it in the first block's unit).
    let mut s = session_in(None);
    run(
        &mut s,
        r#"
        let t = [column([0.0, 0.5], "s"), column([1000.0, 1500.0], "ms")];
        let f = [column([0.0, 1.0], "kN"), column([2000.0, 1000.0], "N")];
        let whole = plot(concat(t), concat(f), #{ names: ["F"] });
        let svg = plot(t, f, #{ names: ["F"] }).to_svg();
        assert(svg.contains("(kN)"));
        assert_eq(svg, whole.to_svg());
        "#,
    );
}
