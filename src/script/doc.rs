//! The script reference, read from the registered functions' metadata: `gaugebook doc`, the
//! kernel's inspection, `help(name)`, and the test that runs every ```rhai example.

use rhai::{Engine, NativeCallContext};

use super::bind::func;

/// One registered function overload and its reference text.
///
/// ```
/// use gaugebook::script::{build_engine, reference_docs};
/// let docs = reference_docs(&build_engine(&Default::default()));
/// let q = docs.iter().find(|d| d.name == "q").expect("q is registered");
/// assert!(q.signature.starts_with("q("));
/// assert!(!q.examples().is_empty());
/// ```
#[derive(Clone, Debug, PartialEq, Eq)]
pub struct FnDoc {
    /// The name scripts call.
    pub name: String,
    /// `name(param: Type, …) -> Type`.
    pub signature: String,
    /// Markdown reference text (the doc comment without its `///`).
    pub doc: String,
}

impl FnDoc {
    /// The first line of the reference text.
    ///
    /// ```
    /// let d = gaugebook::script::FnDoc { name: "f".into(), signature: "f()".into(), doc: "Does f.\nMore.".into() };
    /// assert_eq!(d.summary(), "Does f.");
    /// ```
    pub fn summary(&self) -> &str {
        self.doc.lines().next().unwrap_or("")
    }

    /// The code of every ` ```rhai ` block in the text.
    ///
    /// ```
    /// let d = gaugebook::script::FnDoc {
    ///     name: "f".into(),
    ///     signature: "f()".into(),
    ///     doc: "Does f.\n```rhai\nf();\n```".into(),
    /// };
    /// assert_eq!(d.examples(), vec!["f();\n".to_string()]);
    /// ```
    pub fn examples(&self) -> Vec<String> {
        let mut out = Vec::new();
        let mut current: Option<String> = None;
        for line in self.doc.lines() {
            let t = line.trim();
            match &mut current {
                None if t.starts_with("```rhai") => current = Some(String::new()),
                Some(code) if t.starts_with("```") => {
                    out.push(std::mem::take(code));
                    current = None;
                }
                Some(code) => {
                    code.push_str(line);
                    code.push('\n');
                }
                None => {}
            }
        }
        out
    }
}

fn strip_comment(c: &str) -> String {
    c.lines()
        .map(|l| {
            let l = l.trim_start();
            let l = l
                .strip_prefix("///")
                .or_else(|| l.strip_prefix("//!"))
                .unwrap_or(l);
            l.strip_prefix(' ').unwrap_or(l)
        })
        .collect::<Vec<_>>()
        .join("\n")
}

/// Internal names (operators, getters, printing hooks) that the reference leaves out.
fn is_internal(name: &str) -> bool {
    name.contains('$')
        || !name.starts_with(|c: char| c.is_alphabetic() || c == '_')
        || matches!(name, "to_string" | "to_debug" | "to_mime")
}

/// Every documented function the engine has (Gaugebook's, not Rhai's standard library), sorted
/// by name.
///
/// ```
/// let e = gaugebook::script::build_engine(&Default::default());
/// let docs = gaugebook::script::reference_docs(&e);
/// let q = docs.iter().find(|d| d.name == "q").expect("q is documented");
/// assert!(!q.examples().is_empty());
/// ```
pub fn reference_docs(engine: &Engine) -> Vec<FnDoc> {
    let Ok(json) = engine.gen_fn_metadata_to_json(false) else {
        return Vec::new();
    };
    let Ok(v) = serde_json::from_str::<serde_json::Value>(&json) else {
        return Vec::new();
    };
    let mut out: Vec<FnDoc> = v["functions"]
        .as_array()
        .into_iter()
        .flatten()
        .filter_map(|f| {
            let name = f["name"].as_str()?.to_string();
            if is_internal(&name) {
                return None;
            }
            let doc = f["docComments"]
                .as_array()
                .map(|c| {
                    c.iter()
                        .filter_map(|s| s.as_str())
                        .map(strip_comment)
                        .collect::<Vec<_>>()
                        .join("\n")
                })
                .unwrap_or_default();
            if doc.is_empty() {
                return None;
            }
            let signature = f["signature"].as_str().unwrap_or(&name).to_string();
            Some(FnDoc {
                name,
                signature,
                doc,
            })
        })
        .collect();
    out.sort_by(|a, b| a.name.cmp(&b.name).then(a.signature.cmp(&b.signature)));
    out.dedup();
    out
}

/// The reference as markdown: one function (all its overloads) when `name` is given, else
/// everything with a short index first. `None` when `name` is not a documented function.
///
/// ```
/// let e = gaugebook::script::build_engine(&Default::default());
/// let md = gaugebook::script::reference_markdown(&e, Some("q")).unwrap();
/// assert!(md.starts_with("## q\n"));
/// assert!(md.contains("```rhai"));
/// ```
pub fn reference_markdown(engine: &Engine, name: Option<&str>) -> Option<String> {
    let docs = reference_docs(engine);
    let mut out = String::new();
    match name {
        Some(n) => {
            let mine: Vec<&FnDoc> = docs.iter().filter(|d| d.name == n).collect();
            if mine.is_empty() {
                return None;
            }
            section(&mut out, &mine);
        }
        None => {
            out.push_str("# Gaugebook script reference\n\n");
            let mut names: Vec<&str> = docs.iter().map(|d| d.name.as_str()).collect();
            names.dedup();
            for n in &names {
                let first = docs
                    .iter()
                    .find(|d| d.name == *n)
                    .map(FnDoc::summary)
                    .unwrap_or("");
                out.push_str(&format!("- `{n}`: {first}\n"));
            }
            out.push('\n');
            for n in &names {
                let mine: Vec<&FnDoc> = docs.iter().filter(|d| d.name == *n).collect();
                section(&mut out, &mine);
            }
        }
    }
    Some(out)
}

fn section(out: &mut String, overloads: &[&FnDoc]) {
    if let Some(first) = overloads.first() {
        out.push_str(&format!("## {}\n\n", first.name));
    }
    for d in overloads {
        out.push_str(&format!("`{}`\n\n{}\n\n", d.signature, d.doc.trim_end()));
    }
}

/// Registers `help(name)`.
pub(crate) fn register(engine: &mut Engine) {
    func(
        "help",
        &["name: String"],
        "String",
        r#"
        The reference text of a function (all its overloads), as markdown.
        ```rhai
        let text = help("q");
        assert(text.contains("q(text"));
        ```
    "#,
    )
    .register_into_engine(engine, |ctx: NativeCallContext, name: &str| {
        reference_markdown(ctx.engine(), Some(name))
            .unwrap_or_else(|| format!("no function named `{name}`"))
    });
}
