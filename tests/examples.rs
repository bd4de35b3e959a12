//! The example notebooks and their data: the committed logs in `notebooks/data/` are exactly what
//! the generator writes, the generator puts in the figures it states, and every notebook's code
//! runs.
//!
//! To regenerate the logs after changing `src/demo/logs.rs`:
//! `GAUGEBOOK_WRITE_EXAMPLE_DATA=1 cargo test --no-default-features examples::committed`.

use std::path::{Path, PathBuf};

use gaugebook::{
    CalibrationRun, Characterisation, CharacteriseOptions, EXAMPLE_CELL, HoldCriteria, LoadKind,
    example_logs, find_holds,
};

fn notebooks_dir() -> PathBuf {
    Path::new(env!("CARGO_MANIFEST_DIR")).join("notebooks")
}

#[test]
fn generated_logs_are_identical_on_two_runs() {
    let (a, b) = (example_logs(), example_logs());
    assert_eq!(a.len(), b.len());
    for (x, y) in a.iter().zip(&b) {
        assert!(
            x.csv.as_bytes() == y.csv.as_bytes(),
            "{} differs between runs",
            x.file_name
        );
        // Small enough for the repository (the brief's limit, about 2 MB).
        assert!(
            x.csv.len() < 2_000_000,
            "{} is {} bytes",
            x.file_name,
            x.csv.len()
        );
    }
}

#[test]
fn committed_logs_equal_fresh_ones() {
    let dir = notebooks_dir().join("data");
    if std::env::var_os("GAUGEBOOK_WRITE_EXAMPLE_DATA").is_some() {
        gaugebook::write_example_logs(&dir).expect("write the example logs");
    }
    for log in example_logs() {
        let path = dir.join(log.file_name);
        let committed = std::fs::read(&path).unwrap_or_else(|e| {
            panic!(
                "{}: {e} (regenerate, see this file's notes)",
                path.display()
            )
        });
        assert!(
            committed == log.csv.as_bytes(),
            "{} differs from the generator's output (regenerate, see this file's notes)",
            path.display()
        );
    }
}

/// The columns of a generated CSV log (all numeric).
fn columns(csv: &str) -> Vec<Vec<f64>> {
    let mut lines = csv.lines();
    let n = lines.next().map_or(0, |h| h.split(',').count());
    let mut cols = vec![vec![]; n];
    for l in lines {
        for (c, v) in cols.iter_mut().zip(l.split(',')) {
            c.push(v.parse::<f64>().expect("a number"));
        }
    }
    cols
}

/// The calibration log, reanalysed with the library's own hold detection and characterisation,
/// gives back the figures the generator put in (a closed-form check of the generator: each
/// figure is defined in `ExampleCell`, and the noise in a 70-sample hold mean is 5e-6 mV/V,
/// 0.0003 % RO, so 0.002 % RO is several standard deviations).
#[test]
fn calibration_log_gives_back_its_built_in_figures() {
    let c = EXAMPLE_CELL;
    let cols = columns(&gaugebook::calibration_log());
    let (load, out, rot) = (&cols[1], &cols[2], &cols[4]);
    let criteria = HoldCriteria {
        tolerance: 0.1,
        min_samples: 60,
        settle_samples: 5,
    };
    let mut run = CalibrationRun::new(LoadKind::Force, "mV/V");
    for r in [0.0, c.rotation_deg] {
        let keep: Vec<usize> = (0..load.len()).filter(|&i| rot[i] == r).collect();
        let l: Vec<f64> = keep.iter().map(|&i| load[i]).collect();
        let y: Vec<f64> = keep.iter().map(|&i| out[i]).collect();
        let holds = find_holds(&l, &criteria).unwrap();
        let part =
            CalibrationRun::from_holds(LoadKind::Force, "mV/V", &l, &y, &holds, 5, 1.0, r).unwrap();
        for s in part.series() {
            run.push_series(&s.loads(), &s.indications(), s.direction, r)
                .unwrap();
        }
    }
    // Two series up and down at 0°, one up and down at 120°.
    assert_eq!(run.series().len(), 6);
    let mut opts = CharacteriseOptions::new(c.capacity_n);
    opts.level_tolerance = 1.0;
    let ch = Characterisation::from_run(&run, opts).unwrap();
    let tol = 0.002;
    // Rated output: the mean of the three series' spans (0, +0.002, +0.006 % RO).
    let ro = c.rated_output_mv_v * (1.0 + (c.repeat_span_pct_ro + c.rotation_span_pct_ro) / 300.0);
    assert!(
        (ch.rated_output / ro - 1.0).abs() * 100.0 < tol,
        "RO {}",
        ch.rated_output
    );
    assert!(
        (ch.nonlinearity_terminal.percent_ro - c.nonlinearity_pct_ro).abs() < tol,
        "nonlinearity {}",
        ch.nonlinearity_terminal.percent_ro
    );
    assert!(
        (ch.hysteresis.percent_ro - c.hysteresis_pct_ro).abs() < tol,
        "hysteresis {}",
        ch.hysteresis.percent_ro
    );
    assert!(
        (ch.non_repeatability.percent_ro - c.repeat_span_pct_ro).abs() < tol,
        "non-repeatability {}",
        ch.non_repeatability.percent_ro
    );
}

/// Every example notebook in `notebooks/` reruns and matches its recorded outputs
/// (`gaugebook nb verify` through the library). Set `GAUGEBOOK_RECORD_NOTEBOOKS=1` to record
/// them first (`gaugebook nb run`).
#[cfg(feature = "script")]
#[test]
fn every_notebook_reruns_and_verifies() {
    let dir = notebooks_dir();
    let mut paths: Vec<PathBuf> = std::fs::read_dir(&dir)
        .expect("notebooks/ exists")
        .map(|e| e.expect("a directory entry").path())
        .filter(|p| p.extension().is_some_and(|x| x == "ipynb"))
        .collect();
    paths.sort();
    let mut found = 0;
    for path in paths {
        let text = std::fs::read_to_string(&path).unwrap();
        let nb: serde_json::Value = serde_json::from_str(&text).unwrap();
        if nb["metadata"]["kernelspec"]["name"] != "gaugebook" {
            continue; // a Rust (evcxr) notebook is tested elsewhere
        }
        found += 1;
        if std::env::var_os("GAUGEBOOK_RECORD_NOTEBOOKS").is_some() {
            gaugebook::run_notebook(&path, &gaugebook::RunOptions::default())
                .unwrap_or_else(|e| panic!("{}: {e}", path.display()));
        }
        let report = gaugebook::verify_notebook(&path, &gaugebook::VerifyOptions::default())
            .unwrap_or_else(|e| panic!("{}: {e}", path.display()));
        assert!(
            report.outputs > 0,
            "{} has no recorded outputs",
            path.display()
        );
        assert!(report.passed(), "{report}");
    }
    assert!(found >= 2, "expected the example notebooks, found {found}");
}
