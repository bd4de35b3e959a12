//! `gaugebook doc [NAME]`: the script reference as markdown, from the registered metadata.

use std::process::ExitCode;

use anyhow::bail;

use crate::script::{build_engine, reference_docs, reference_markdown};

pub(crate) fn doc(name: Option<&str>) -> anyhow::Result<ExitCode> {
    let engine = build_engine(&Default::default());
    match reference_markdown(&engine, name) {
        Some(text) => {
            print!("{text}");
            Ok(ExitCode::SUCCESS)
        }
        None => {
            let wanted = name.unwrap_or_default();
            let mut near: Vec<String> = reference_docs(&engine)
                .into_iter()
                .map(|d| d.name)
                .filter(|n| n.contains(wanted))
                .collect();
            near.dedup();
            if near.is_empty() {
                bail!("no function named `{wanted}`");
            }
            bail!(
                "no function named `{wanted}`; did you mean {}?",
                near.join(", ")
            )
        }
    }
}
