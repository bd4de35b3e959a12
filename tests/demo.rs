//! The README's first command: `gaugebook demo` runs the embedded worked example.

use std::process::Command;

#[test]
fn demo_command_prints_the_worked_design_with_units() {
    let out = Command::new(env!("CARGO_BIN_EXE_gaugebook"))
        .arg("demo")
        .output()
        .expect("the gaugebook binary runs");
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
}
