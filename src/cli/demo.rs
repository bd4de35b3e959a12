//! `gaugebook demo [--out DIR]`: the main job on embedded examples of our own. It prints the
//! worked bridge design, then writes a report folder: the example notebooks (design, calibration
//! reanalysis, fatigue log, check-weighing) run afresh on the generated example logs, with the
//! stdlib they import, and one HTML page with every table and figure.
//!
//! The folder is built beside its destination and renamed into place at the end, so a failed
//! run leaves no half-written report; an existing folder is replaced only when an earlier demo
//! made it (it holds [`MARKER`]), never a folder of the user's.

use std::path::{Path, PathBuf};

use anyhow::{Context, bail};

use crate::{
    DesignReport, Notebook, RunOptions, ToMime, html_escape, html_page, run_notebook,
    write_example_logs,
};

/// The file that marks a folder as a demo report the command may replace.
const MARKER: &str = ".gaugebook-demo";

/// The notebooks the demo runs, embedded so an installed binary needs no checkout.
const NOTEBOOKS: &[(&str, &str)] = &[
    (
        "01_load_cell_design.ipynb",
        include_str!("../../notebooks/01_load_cell_design.ipynb"),
    ),
    (
        "02_calibration_reanalysis.ipynb",
        include_str!("../../notebooks/02_calibration_reanalysis.ipynb"),
    ),
    (
        "03_fatigue_blocks.ipynb",
        include_str!("../../notebooks/03_fatigue_blocks.ipynb"),
    ),
    (
        "04_check_weighing.ipynb",
        include_str!("../../notebooks/04_check_weighing.ipynb"),
    ),
];

/// The stdlib modules the notebooks import, embedded for the same reason.
const STDLIB: &[(&str, &str)] = &[
    ("bridges.rhai", include_str!("../../stdlib/bridges.rhai")),
    (
        "characterise.rhai",
        include_str!("../../stdlib/characterise.rhai"),
    ),
    (
        "design_cell.rhai",
        include_str!("../../stdlib/design_cell.rhai"),
    ),
    (
        "excitation.rhai",
        include_str!("../../stdlib/excitation.rhai"),
    ),
    ("table.rhai", include_str!("../../stdlib/table.rhai")),
];

/// The cautions every report carries (common practice for design and calibration records).
const CAUTIONS: &[&str] = &[
    "All data in this report are invented for the example; no instrument was measured.",
    "Design figures are estimates from closed-form models and must be proven by test on the \
     real element.",
    "Overload, lifting and legal-for-trade use follow local codes and licensed practice; a \
     computed class verdict is not a type approval or a verification certificate.",
];

pub(crate) fn demo(out: Option<PathBuf>) -> anyhow::Result<()> {
    let report = crate::bridge_design_demo()?;
    println!("{report}");
    let dir = out.unwrap_or_else(|| PathBuf::from("gaugebook-demo"));
    let index = write_report(&dir, &report)?;
    println!("Report written: {}", index.display());
    println!("Open it in a browser; the notebooks it ran are beside it.");
    Ok(())
}

/// Builds the report in a fresh sibling folder, then puts it at `dir`. Returns the page's path.
fn write_report(dir: &Path, design: &DesignReport) -> anyhow::Result<PathBuf> {
    if dir.exists() && !dir.join(MARKER).is_file() {
        let empty = std::fs::read_dir(dir)
            .with_context(|| format!("cannot read `{}`", dir.display()))?
            .next()
            .is_none();
        if !empty {
            bail!(
                "`{}` exists and was not made by `gaugebook demo`; choose another folder with --out",
                dir.display()
            );
        }
    }
    let parent = match dir.parent() {
        Some(p) if !p.as_os_str().is_empty() => p.to_path_buf(),
        _ => PathBuf::from("."),
    };
    std::fs::create_dir_all(&parent)
        .with_context(|| format!("cannot create `{}`", parent.display()))?;
    let name = dir
        .file_name()
        .map(|n| n.to_string_lossy().into_owned())
        .unwrap_or_else(|| "gaugebook-demo".into());
    let staging = parent.join(format!(".{name}.partial-{}", std::process::id()));
    let built = build(&staging, design);
    if let Err(e) = built {
        let _ = std::fs::remove_dir_all(&staging);
        return Err(e);
    }
    if dir.exists() {
        std::fs::remove_dir_all(dir)
            .with_context(|| format!("cannot replace the earlier report `{}`", dir.display()))?;
    }
    std::fs::rename(&staging, dir).with_context(|| {
        format!(
            "cannot move the report from `{}` to `{}`",
            staging.display(),
            dir.display()
        )
    })?;
    Ok(dir.join("index.html"))
}

fn build(root: &Path, design: &DesignReport) -> anyhow::Result<()> {
    let nb_dir = root.join("notebooks");
    let lib_dir = root.join("stdlib");
    std::fs::create_dir_all(&nb_dir)
        .and_then(|()| std::fs::create_dir_all(&lib_dir))
        .with_context(|| format!("cannot create the report folder `{}`", root.display()))?;
    std::fs::write(
        root.join(MARKER),
        "made by `gaugebook demo`; safe to delete\n",
    )
    .context("cannot write the report marker")?;
    for (file, text) in STDLIB {
        std::fs::write(lib_dir.join(file), text)
            .with_context(|| format!("cannot write stdlib/{file}"))?;
    }
    write_example_logs(&nb_dir.join("data")).context("cannot write the example logs")?;

    let mut body = String::from("<h1>Gaugebook demo report</h1>\n");
    body.push_str(&format!(
        "<p>Gaugebook {} · the main job on embedded examples of our own.</p>\n",
        env!("CARGO_PKG_VERSION")
    ));
    body.push_str("<div class=\"caution\">\n");
    for c in CAUTIONS {
        body.push_str(&format!("<p>{}</p>\n", html_escape(c)));
    }
    body.push_str(
        "</div>\n<h2>Contents</h2>\n<ul>\n<li><a href=\"#design\">Worked bridge design</a></li>\n",
    );
    for (file, _) in NOTEBOOKS {
        body.push_str(&format!(
            "<li><a href=\"#{}\">{}</a></li>\n",
            anchor(file),
            html_escape(file)
        ));
    }
    body.push_str(
        "</ul>\n<section class=\"notebook\" id=\"design\">\n<h2>Worked bridge design</h2>\n",
    );
    body.push_str(design.to_mime().get("text/html").unwrap_or_default());
    body.push_str("\n</section>\n");

    let options = RunOptions {
        stdlib_dir: Some(lib_dir.clone()),
        ..RunOptions::default()
    };
    for (file, text) in NOTEBOOKS {
        let path = nb_dir.join(file);
        let nb = Notebook::from_json_str(text, &path)
            .with_context(|| format!("the embedded notebook {file} does not parse"))?;
        nb.write(&path)
            .with_context(|| format!("cannot write notebooks/{file}"))?;
        eprintln!("running notebooks/{file} …");
        let ran = run_notebook(&path, &options)
            .with_context(|| format!("the example notebook {file} failed"))?;
        body.push_str(&format!("<div id=\"{}\"></div>\n", anchor(file)));
        body.push_str(&ran.to_html_section(&format!("notebooks/{file}")));
    }
    std::fs::write(
        root.join("index.html"),
        html_page("Gaugebook demo report", &body),
    )
    .context("cannot write index.html")?;
    Ok(())
}

/// An HTML id from a file name.
fn anchor(file: &str) -> String {
    file.trim_end_matches(".ipynb").replace(['.', ' '], "-")
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn refuses_a_folder_it_did_not_make() {
        let tmp = tempfile::tempdir().unwrap();
        std::fs::write(tmp.path().join("thesis.tex"), "mine").unwrap();
        let design = crate::bridge_design_demo().unwrap();
        let e = write_report(tmp.path(), &design).unwrap_err();
        assert!(
            e.to_string().contains("was not made by `gaugebook demo`"),
            "{e}"
        );
        assert_eq!(
            std::fs::read_to_string(tmp.path().join("thesis.tex")).unwrap(),
            "mine"
        );
    }

    #[test]
    fn every_stdlib_module_is_embedded() {
        let dir = Path::new(env!("CARGO_MANIFEST_DIR")).join("stdlib");
        for entry in std::fs::read_dir(&dir).unwrap() {
            let name = entry.unwrap().file_name().to_string_lossy().into_owned();
            if name.ends_with(".rhai") {
                assert!(
                    STDLIB.iter().any(|(f, text)| *f == name
                        && *text == std::fs::read_to_string(dir.join(&name)).unwrap()),
                    "stdlib/{name} is not embedded in the demo"
                );
            }
        }
    }

    #[test]
    fn anchors_are_plain() {
        assert_eq!(anchor("01_load_cell_design.ipynb"), "01_load_cell_design");
    }
}
