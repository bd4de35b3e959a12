//! `gaugebook run FILE.rhai [--set NAME=VALUE]...`: a script run headless.

use std::io::Read;
use std::path::{Path, PathBuf};
use std::process::ExitCode;
use std::sync::Arc;

use anyhow::{Context, bail};

use crate::Quantity;
use crate::script::rhai::Dynamic;
use crate::script::{Session, SessionOptions, StdSink};

/// A `--set` value: an integer, a float, `true`/`false`, a quantity (`2 kN`), else a string.
pub(crate) fn parse_value(text: &str) -> Dynamic {
    let t = text.trim();
    if let Ok(i) = t.parse::<i64>() {
        return Dynamic::from(i);
    }
    if let Ok(f) = t.parse::<f64>() {
        return Dynamic::from(f);
    }
    match t {
        "true" => return Dynamic::from(true),
        "false" => return Dynamic::from(false),
        _ => {}
    }
    match Quantity::parse(t) {
        Ok(q) => Dynamic::from(q),
        Err(_) => Dynamic::from(text.to_string()),
    }
}

fn parse_set(s: &str) -> anyhow::Result<(String, Dynamic)> {
    let Some((name, value)) = s.split_once('=') else {
        bail!("--set expects NAME=VALUE, found `{s}`");
    };
    let name = name.trim();
    let ok = name.starts_with(|c: char| c.is_alphabetic() || c == '_')
        && name.chars().all(|c| c.is_alphanumeric() || c == '_');
    if !ok {
        bail!("--set name `{name}` is not a valid script name (letters, digits, `_`)");
    }
    Ok((name.to_string(), parse_value(value)))
}

/// Runs the script; exit code 0 on success, 1 on a script error (already printed).
pub(crate) fn run(
    file: &str,
    sets: &[String],
    stdlib: Option<PathBuf>,
) -> anyhow::Result<ExitCode> {
    let constants = sets
        .iter()
        .map(|s| parse_set(s))
        .collect::<anyhow::Result<Vec<_>>>()?;
    let (code, origin, dir) = if file == "-" {
        let mut code = String::new();
        std::io::stdin()
            .read_to_string(&mut code)
            .context("cannot read the script from standard input")?;
        (code, "<stdin>".to_string(), std::env::current_dir().ok())
    } else {
        let code = std::fs::read_to_string(file)
            .with_context(|| format!("cannot read script `{file}`"))?;
        let dir = Path::new(file).parent().map(|p| {
            if p.as_os_str().is_empty() {
                PathBuf::from(".")
            } else {
                p.to_path_buf()
            }
        });
        (code, file.to_string(), dir)
    };
    let mut session = Session::new(SessionOptions {
        stdlib_dir: stdlib,
        script_dir: dir,
    })?;
    session.set_output(Arc::new(StdSink));
    for (name, value) in constants {
        session.set_constant(&name, value);
    }
    match session.eval_cell(&code, &origin) {
        Ok(_) => Ok(ExitCode::SUCCESS),
        Err(e) => {
            eprint!("{}", e.render());
            Ok(ExitCode::FAILURE)
        }
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn set_values_take_the_natural_type() {
        assert!(parse_value("10").is_int());
        assert!(parse_value("2.5").is_float());
        assert!(parse_value("true").is_bool());
        assert!(parse_value("2 kN").is::<Quantity>());
        assert!(parse_value("quarter").is_string());
        assert!(parse_set("1x=2").is_err());
        assert!(parse_set("x").is_err());
    }
}
