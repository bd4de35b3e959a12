//! Provenance: which Gaugebook and Rhai produced a notebook's outputs, and the SHA-256 of every
//! input file its cells read, recorded in the notebook metadata under `gaugebook`.
//!
//! The session has no hook that reports the files a script opens, so the inputs are found in the
//! cells' source: every string literal (`"…"` or `` `…` ``, comments skipped) that names an
//! existing file relative to the notebook's folder (or an absolute path) is an input, and so is
//! `NAME.rhai` there for `import "NAME"`. A path the script builds at run time (`dir + "/x.csv"`)
//! is not seen; write file names as literals.

use std::collections::BTreeMap;
use std::path::Path;

use serde_json::{Map, Value, json};
use sha2::{Digest, Sha256};

/// The Rhai version this binary was built with, read from the checked-in `Cargo.lock` (Rhai
/// exposes no version constant of its own).
///
/// ```
/// assert!(gaugebook::rhai_version().starts_with("1."));
/// ```
pub fn rhai_version() -> &'static str {
    const LOCK: &str = include_str!("../../Cargo.lock");
    let mut lines = LOCK.lines();
    while let Some(l) = lines.next() {
        if l.trim() == "name = \"rhai\""
            && let Some(v) = lines
                .next()
                .and_then(|v| v.trim().strip_prefix("version = \""))
        {
            return v.trim_end_matches('"');
        }
    }
    "unknown"
}

/// The provenance a run records: versions and input hashes.
///
/// ```
/// let p = gaugebook::Provenance::current(Default::default());
/// assert_eq!(p.gaugebook, env!("CARGO_PKG_VERSION"));
/// assert!(p.inputs.is_empty());
/// ```
#[derive(Clone, Debug, Default, PartialEq, Eq)]
pub struct Provenance {
    /// Gaugebook's version.
    pub gaugebook: String,
    /// Rhai's version.
    pub rhai: String,
    /// Input file (as written in the notebook) → `sha256:<hex>`.
    pub inputs: BTreeMap<String, String>,
}

impl Provenance {
    /// This build's versions with the given input hashes.
    ///
    /// ```
    /// let p = gaugebook::Provenance::current([("a.csv".to_string(), "sha256:00".to_string())].into());
    /// assert_eq!(p.rhai, gaugebook::rhai_version());
    /// ```
    pub fn current(inputs: BTreeMap<String, String>) -> Provenance {
        Provenance {
            gaugebook: env!("CARGO_PKG_VERSION").to_string(),
            rhai: rhai_version().to_string(),
            inputs,
        }
    }

    /// Reads the `gaugebook` entry of notebook metadata; `None` when there is none.
    ///
    /// ```
    /// let meta = serde_json::json!({"gaugebook": {"version": "0.1.0", "rhai": "1.27.0",
    ///     "inputs": {"log.csv": "sha256:00"}}});
    /// let p = gaugebook::Provenance::from_metadata(meta.as_object().unwrap()).unwrap();
    /// assert_eq!(p.inputs["log.csv"], "sha256:00");
    /// ```
    pub fn from_metadata(metadata: &Map<String, Value>) -> Option<Provenance> {
        let g = metadata.get("gaugebook")?.as_object()?;
        let s = |k: &str| g.get(k).and_then(Value::as_str).unwrap_or("").to_string();
        let inputs = g
            .get("inputs")
            .and_then(Value::as_object)
            .map(|m| {
                m.iter()
                    .map(|(k, v)| (k.clone(), v.as_str().unwrap_or("").to_string()))
                    .collect()
            })
            .unwrap_or_default();
        Some(Provenance {
            gaugebook: s("version"),
            rhai: s("rhai"),
            inputs,
        })
    }

    /// Stores itself in notebook metadata under `gaugebook`, keeping other keys there (such as
    /// `rtol` and `atol`).
    ///
    /// ```
    /// let mut meta = serde_json::json!({"gaugebook": {"rtol": 1e-3}}).as_object().unwrap().clone();
    /// gaugebook::Provenance::current(Default::default()).store(&mut meta);
    /// assert_eq!(meta["gaugebook"]["rtol"], 1e-3);
    /// assert_eq!(meta["gaugebook"]["version"], env!("CARGO_PKG_VERSION"));
    /// ```
    pub fn store(&self, metadata: &mut Map<String, Value>) {
        let entry = metadata
            .entry("gaugebook")
            .or_insert_with(|| Value::Object(Map::new()));
        if !entry.is_object() {
            *entry = Value::Object(Map::new());
        }
        if let Value::Object(g) = entry {
            g.insert("version".into(), json!(self.gaugebook));
            g.insert("rhai".into(), json!(self.rhai));
            g.insert("inputs".into(), json!(self.inputs));
        }
    }
}

/// `sha256:<hex>` of a file's bytes, or `None` when it cannot be read.
///
/// ```
/// let dir = std::env::temp_dir();
/// std::fs::write(dir.join("gaugebook-abc.txt"), "abc").unwrap();
/// // FIPS 180-2 appendix B.1 (from memory): SHA-256("abc").
/// assert_eq!(gaugebook::file_hash(&dir.join("gaugebook-abc.txt")).unwrap(),
///     "sha256:ba7816bf8f01cfea414140de5dae2223b00361a396177a9cb410ff61f20015ad");
/// ```
pub fn file_hash(path: &Path) -> Option<String> {
    let bytes = std::fs::read(path).ok()?;
    let digest = Sha256::digest(&bytes);
    let mut hex = String::with_capacity(71);
    hex.push_str("sha256:");
    for b in digest.iter() {
        hex.push_str(&format!("{b:02x}"));
    }
    Some(hex)
}

/// The input files a cell's source names (see the module text), relative to `dir`.
pub(crate) fn inputs_of(code: &str, dir: &Path) -> Vec<String> {
    let mut found = Vec::new();
    for lit in string_literals(code) {
        if lit.is_empty() || lit.contains('\n') || lit.len() > 4096 {
            continue;
        }
        let p = Path::new(&lit);
        let full = if p.is_absolute() {
            p.to_path_buf()
        } else {
            dir.join(p)
        };
        if full.is_file() {
            found.push(lit.clone());
        } else if !p.is_absolute() && dir.join(format!("{lit}.rhai")).is_file() {
            found.push(format!("{lit}.rhai"));
        }
    }
    found
}

/// The contents of the string literals of Rhai source, comments and character literals skipped.
pub(crate) fn string_literals(code: &str) -> Vec<String> {
    let mut out = Vec::new();
    let mut chars = code.chars().peekable();
    while let Some(c) = chars.next() {
        match c {
            '/' if chars.peek() == Some(&'/') => {
                for c in chars.by_ref() {
                    if c == '\n' {
                        break;
                    }
                }
            }
            '/' if chars.peek() == Some(&'*') => {
                chars.next();
                // Rhai block comments nest.
                let mut depth = 1;
                let mut prev = ' ';
                for c in chars.by_ref() {
                    match (prev, c) {
                        ('/', '*') => {
                            depth += 1;
                            prev = ' ';
                            continue;
                        }
                        ('*', '/') => {
                            depth -= 1;
                            if depth == 0 {
                                break;
                            }
                            prev = ' ';
                            continue;
                        }
                        _ => {}
                    }
                    prev = c;
                }
            }
            '"' | '`' | '\'' => {
                let quote = c;
                let mut s = String::new();
                while let Some(c) = chars.next() {
                    if c == quote {
                        break;
                    }
                    if c == '\\' && quote != '`' {
                        match chars.next() {
                            Some('n') => s.push('\n'),
                            Some('t') => s.push('\t'),
                            Some(e) => s.push(e),
                            None => {}
                        }
                    } else {
                        s.push(c);
                    }
                }
                if quote != '\'' {
                    out.push(s);
                }
            }
            _ => {}
        }
    }
    out
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn literals_skip_comments_and_chars() {
        let code = "let a = \"x.csv\"; // \"not.csv\"\n/* \"no\" /* \"nested\" */ */ let c = 'q';\nlet b = `y\\z`; \"e\\\"q\"";
        assert_eq!(string_literals(code), vec!["x.csv", "y\\z", "e\"q"]);
    }

    #[test]
    fn rhai_version_comes_from_the_lock_file() {
        // Cargo.lock pins the resolved version; the manifest asks for 1.27.
        assert!(rhai_version().starts_with("1.27"), "{}", rhai_version());
    }

    #[test]
    fn inputs_are_existing_files_only() {
        let dir = std::env::temp_dir().join(format!("gaugebook-prov-{}", std::process::id()));
        std::fs::create_dir_all(&dir).unwrap();
        std::fs::write(dir.join("log.csv"), "t\n").unwrap();
        std::fs::write(dir.join("helpers.rhai"), "fn f() { 1 }").unwrap();
        let found = inputs_of(
            "let d = read_log(\"log.csv\"); import \"helpers\" as h; print(\"kN\");",
            &dir,
        );
        assert_eq!(found, vec!["log.csv", "helpers.rhai"]);
        let _ = std::fs::remove_dir_all(&dir);
    }
}
