//! The README's first command: `gaugebook demo` prints the worked design and writes a report
//! folder (an HTML page with tables and figures, and the notebooks it ran).

use std::process::Command;

fn demo_in(dir: &std::path::Path, args: &[&str]) -> std::process::Output {
    Command::new(env!("CARGO_BIN_EXE_gaugebook"))
        .arg("demo")
        .args(args)
        .current_dir(dir)
        .output()
        .expect("the gaugebook binary runs")
}

#[test]
fn demo_command_prints_the_worked_design_and_writes_the_report() {
    let tmp = tempfile::tempdir().unwrap();
    let out = demo_in(tmp.path(), &[]);
    let stdout = String::from_utf8_lossy(&out.stdout);
    assert!(
        out.status.success(),
        "demo failed: {}",
        String::from_utf8_lossy(&out.stderr)
    );
    // The rated output of the full bending bridge: GF·ε with ε = 6·F·(L − x)/(E·b·h²)
    // (Timoshenko & Gere, Mechanics of Materials, 4th ed., §5.5, from memory) for the embedded
    // beam: 2.05 × 1025.99 µε = 2.10328 mV/V (closed-form identity of the full bending bridge).
    assert!(stdout.contains("rated output (exact)"), "{stdout}");
    assert!(stdout.contains("2.10328 mV/V"), "{stdout}");
    assert!(stdout.contains("Caution:"), "{stdout}");

    // The report folder, by default ./gaugebook-demo, and the line that says where it is.
    let dir = tmp.path().join("gaugebook-demo");
    assert!(
        stdout.contains("Report written: gaugebook-demo/index.html"),
        "{stdout}"
    );
    let page = std::fs::read_to_string(dir.join("index.html")).unwrap();
    assert!(page.starts_with("<!DOCTYPE html>"));
    assert!(page.contains("2.10328 mV/V"), "the design is on the page");
    assert!(
        page.contains("not a type approval"),
        "the cautions are on the page"
    );
    for nb in [
        "01_load_cell_design",
        "02_calibration_reanalysis",
        "03_fatigue_blocks",
        "04_check_weighing",
    ] {
        assert!(
            page.contains(&format!("id=\"{nb}\"")),
            "{nb} is on the page"
        );
        let text =
            std::fs::read_to_string(dir.join("notebooks").join(format!("{nb}.ipynb"))).unwrap();
        assert!(text.contains("\"execution_count\": 1"), "{nb} ran");
    }
    assert!(page.matches("<svg").count() >= 2, "figures are inline SVG");
    assert!(!page.contains("class=\"error\""), "no cell failed");
    // The logs the reanalysis read are the generator's, byte for byte.
    assert_eq!(
        std::fs::read_to_string(dir.join("notebooks/data/lc500_calibration.csv")).unwrap(),
        gaugebook::calibration_log()
    );

    // A second run replaces the report it made; a folder it did not make is left alone.
    std::fs::write(dir.join("notebooks").join("scratch.txt"), "old").unwrap();
    assert!(demo_in(tmp.path(), &[]).status.success());
    assert!(!dir.join("notebooks").join("scratch.txt").exists());
    let mine = tmp.path().join("mine");
    std::fs::create_dir(&mine).unwrap();
    std::fs::write(mine.join("notes.txt"), "keep").unwrap();
    let refused = demo_in(tmp.path(), &["--out", "mine"]);
    assert!(!refused.status.success());
    assert!(
        String::from_utf8_lossy(&refused.stderr).contains("was not made by `gaugebook demo`"),
        "{}",
        String::from_utf8_lossy(&refused.stderr)
    );
    assert_eq!(
        std::fs::read_to_string(mine.join("notes.txt")).unwrap(),
        "keep"
    );
}
