//! The `gaugebook` binary's runner, reference and prompt: exit codes and messages.

use std::io::Write;
use std::process::{Command, Output, Stdio};

fn gaugebook(args: &[&str], stdin: Option<&str>) -> Output {
    let mut cmd = Command::new(env!("CARGO_BIN_EXE_gaugebook"));
    cmd.args(args)
        .stdin(Stdio::piped())
        .stdout(Stdio::piped())
        .stderr(Stdio::piped());
    // Keep the REPL's history out of the user's home.
    cmd.env(
        "XDG_STATE_HOME",
        std::env::temp_dir().join("gaugebook-cli-test-state"),
    );
    let mut child = cmd.spawn().expect("the binary runs");
    if let Some(text) = stdin {
        child
            .stdin
            .take()
            .unwrap()
            .write_all(text.as_bytes())
            .unwrap();
    } else {
        drop(child.stdin.take());
    }
    child.wait_with_output().unwrap()
}

fn script(dir: &tempfile::TempDir, name: &str, text: &str) -> String {
    let p = dir.path().join(name);
    std::fs::write(&p, text).unwrap();
    p.to_string_lossy().to_string()
}

#[test]
fn run_prints_output_and_exits_zero() {
    let dir = tempfile::tempdir().unwrap();
    let f = script(
        &dir,
        "ok.rhai",
        "let r = q(\"350 ohm\");\nprint(r.to(\"kohm\"));\n",
    );
    let out = gaugebook(&["run", &f], None);
    assert!(
        out.status.success(),
        "{}",
        String::from_utf8_lossy(&out.stderr)
    );
    assert_eq!(String::from_utf8_lossy(&out.stdout), "0.35 kΩ\n");
}

#[test]
fn run_reports_file_line_column_and_caret() {
    let dir = tempfile::tempdir().unwrap();
    let f = script(
        &dir,
        "bad.rhai",
        "let v = 5.0 * V;\nlet r = 350.0 * ohm;\nprint(v + r);\n",
    );
    let out = gaugebook(&["run", &f], None);
    assert_eq!(out.status.code(), Some(1));
    let err = String::from_utf8_lossy(&out.stderr);
    assert!(
        err.starts_with(&format!("{f}:3:9: cannot add 5 V and 350 Ω\n")),
        "{err}"
    );
    assert!(
        err.contains("3 | print(v + r);\n  |         ^ UnitError\n"),
        "{err}"
    );
    assert!(out.stdout.is_empty());
}

#[test]
fn run_reads_standard_input_and_takes_set_values() {
    let out = gaugebook(
        &["run", "-", "--set", "load=2 kN", "--set", "n=3"],
        Some("print(load.to(\"N\")); print(n * 2);"),
    );
    assert!(
        out.status.success(),
        "{}",
        String::from_utf8_lossy(&out.stderr)
    );
    assert_eq!(String::from_utf8_lossy(&out.stdout), "2000 N\n6\n");
    let out = gaugebook(&["run", "-"], Some("let x = ;"));
    assert_eq!(out.status.code(), Some(1));
    assert!(
        String::from_utf8_lossy(&out.stderr).starts_with("<stdin>:1:9: "),
        "{}",
        String::from_utf8_lossy(&out.stderr)
    );
}

#[test]
fn run_imports_from_the_scripts_folder_and_the_stdlib() {
    let dir = tempfile::tempdir().unwrap();
    script(&dir, "helpers.rhai", "fn double(x) { 2.0 * x }\n");
    let f = script(
        &dir,
        "main.rhai",
        "import \"helpers\" as h;\nimport \"table\" as t;\nprint(h::double(q(\"1 kN\")));\nt::show([#{ f: q(\"1 N\") }], [\"f\"]);\n",
    );
    let out = gaugebook(&["run", &f], None);
    assert!(
        out.status.success(),
        "{}",
        String::from_utf8_lossy(&out.stderr)
    );
    assert_eq!(
        String::from_utf8_lossy(&out.stdout),
        "2 kN\nf [N]\n-----\n    1\n"
    );
}

#[test]
fn missing_file_and_bad_set_fail_with_a_message() {
    let out = gaugebook(&["run", "/no/such/file.rhai"], None);
    assert_eq!(out.status.code(), Some(1));
    assert!(
        String::from_utf8_lossy(&out.stderr).contains("cannot read script `/no/such/file.rhai`")
    );
    let out = gaugebook(&["run", "-", "--set", "novalue"], Some(""));
    assert_eq!(out.status.code(), Some(1));
    assert!(String::from_utf8_lossy(&out.stderr).contains("--set expects NAME=VALUE"));
}

#[test]
fn doc_prints_markdown_reference() {
    let out = gaugebook(&["doc", "q"], None);
    assert!(out.status.success());
    let text = String::from_utf8_lossy(&out.stdout);
    assert!(text.starts_with("## q\n"), "{text}");
    assert!(text.contains("```rhai"));
    let out = gaugebook(&["doc"], None);
    assert!(String::from_utf8_lossy(&out.stdout).contains("## column\n"));
    let out = gaugebook(&["doc", "colum"], None);
    assert_eq!(out.status.code(), Some(1));
    assert!(String::from_utf8_lossy(&out.stderr).contains("did you mean column"));
}

#[test]
fn repl_evaluates_lines_and_continues_open_blocks() {
    let out = gaugebook(
        &["repl"],
        Some("let r = 350.0 * ohm;\nfn f(x) {\n  2.0 * x\n}\nf(r)\nr + 1.0 * V\n"),
    );
    assert!(out.status.success());
    let stdout = String::from_utf8_lossy(&out.stdout);
    assert!(stdout.contains("700 Ω"), "{stdout}");
    assert!(String::from_utf8_lossy(&out.stderr).contains("cannot add 350 Ω and 1 V"));
}

#[test]
fn repl_leaves_on_exit_before_later_lines() {
    let out = gaugebook(&["repl"], Some("1 + 1\nexit()\nprint(\"after\")\n"));
    assert!(out.status.success());
    let text = String::from_utf8_lossy(&out.stdout);
    assert!(text.contains('2') && !text.contains("after"), "{text}");
}
