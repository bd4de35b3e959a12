//! Completion and inspection at a cursor, from the engine's registered functions, the
//! session's variables and functions, imported modules and the unit table.

use rhai::Engine;

use super::doc::reference_markdown;
use super::lex::{TokKind, tokens};
use super::quantity::unit_constant_names;
use super::session::{Completions, Names, Session};

const KEYWORDS: &[&str] = &[
    "let", "const", "fn", "if", "else", "for", "in", "while", "loop", "do", "until", "break",
    "continue", "return", "throw", "try", "catch", "import", "export", "as", "switch", "true",
    "false", "private", "this", "global",
];

/// Calls whose string argument is a unit: `q("…")`, `q(2.5, "…")`, `x.to("…")`, `x.value("…")`.
const UNIT_TAKERS: &[&str] = &["q", "to", "value", "values", "column"];

pub(crate) fn collect_names(engine: &Engine) -> Names {
    let mut functions = Vec::new();
    let mut properties = Vec::new();
    for sig in engine.gen_fn_signatures(true) {
        let name = sig.split('(').next().unwrap_or("").trim();
        let name = name.rsplit("::").next().unwrap_or(name);
        if let Some(p) = name.strip_prefix("get$") {
            properties.push(p.to_string());
        } else if name.starts_with(|c: char| c.is_alphabetic() || c == '_')
            && !name.starts_with("__")
            && !name.contains('$')
        {
            functions.push(name.to_string());
        }
    }
    functions.sort();
    functions.dedup();
    properties.sort();
    properties.dedup();
    Names {
        functions,
        properties,
    }
}

/// Unit symbols the parser knows, for completion inside unit strings.
fn unit_symbols() -> Vec<String> {
    crate::units::Unit::known_symbols().to_vec()
}

fn char_to_byte(code: &str, cursor: usize) -> usize {
    code.char_indices()
        .nth(cursor)
        .map_or(code.len(), |(b, _)| b)
}

fn byte_to_char(code: &str, byte: usize) -> usize {
    code[..byte.min(code.len())].chars().count()
}

fn is_ident(c: char) -> bool {
    c.is_alphanumeric() || c == '_'
}

fn finish(
    code: &str,
    start_byte: usize,
    end_byte: usize,
    prefix: &str,
    cands: impl IntoIterator<Item = String>,
) -> Completions {
    let mut matches: Vec<String> = cands
        .into_iter()
        .filter(|c| c.starts_with(prefix) && !c.starts_with("__"))
        .collect();
    matches.sort();
    matches.dedup();
    Completions {
        start: byte_to_char(code, start_byte),
        end: byte_to_char(code, end_byte),
        matches,
    }
}

pub(crate) fn complete(s: &Session, code: &str, cursor: usize) -> Completions {
    let end = char_to_byte(code, cursor);
    let before = &code[..end];
    let toks = tokens(before);

    // Inside an unfinished string?
    if let Some(last) = toks.last() {
        if let TokKind::Str {
            closed: false,
            content,
        } = &last.kind
        {
            let n = toks.len();
            // Find the name before the innermost open parenthesis.
            let mut depth = 0i32;
            let mut name: Option<String> = None;
            for (i, t) in toks[..n - 1].iter().enumerate().rev() {
                match t.kind {
                    TokKind::Punct(')') => depth += 1,
                    TokKind::Punct('(') if depth == 0 => {
                        if let Some(TokKind::Ident(id)) = i.checked_sub(1).map(|j| &toks[j].kind) {
                            name = Some(id.clone());
                        }
                        break;
                    }
                    TokKind::Punct('(') => depth -= 1,
                    _ => {}
                }
            }
            let import = n >= 2 && matches!(&toks[n - 2].kind, TokKind::Ident(k) if k == "import");
            if import {
                return finish(code, last.start + 1, end, content, module_names(s));
            }
            if name.as_deref().is_some_and(|n| UNIT_TAKERS.contains(&n)) {
                // The unit word being typed: after the number and after any `/`, `*`, `^`, `·`.
                let word_start = content
                    .char_indices()
                    .rev()
                    .find(|&(_, c)| {
                        c.is_whitespace() || "/*^·().".contains(c) || c.is_ascii_digit()
                    })
                    .map_or(0, |(i, c)| i + c.len_utf8());
                let prefix = &content[word_start..];
                return finish(
                    code,
                    last.start + 1 + word_start,
                    end,
                    prefix,
                    unit_symbols(),
                );
            }
            return Completions {
                start: cursor,
                end: cursor,
                matches: vec![],
            };
        }
    }

    let word_start = before
        .char_indices()
        .rev()
        .take_while(|&(_, c)| is_ident(c))
        .last()
        .map_or(end, |(i, _)| i);
    let prefix = &before[word_start..];
    let lead = &before[..word_start];

    if let Some(m) = lead.strip_suffix("::") {
        let alias: String = m
            .chars()
            .rev()
            .take_while(|&c| is_ident(c))
            .collect::<Vec<_>>()
            .into_iter()
            .rev()
            .collect();
        let members = s.modules().get(&alias).map(|m| {
            let mut v: Vec<String> = m
                .gen_fn_signatures_with_mapper(|t| t.into())
                .map(|sig| sig.split('(').next().unwrap_or("").trim().to_string())
                .collect();
            v.extend(m.iter_var().map(|(n, _)| n.to_string()));
            v
        });
        return finish(code, word_start, end, prefix, members.unwrap_or_default());
    }

    let Names {
        functions,
        properties,
    } = s.names();
    if lead.trim_end().ends_with('.') {
        let cands = functions.iter().chain(properties.iter()).cloned();
        return finish(code, word_start, end, prefix, cands);
    }
    if prefix.is_empty() {
        return Completions {
            start: cursor,
            end: cursor,
            matches: vec![],
        };
    }
    let vars = s.scope().iter_raw().map(|(n, _, _)| n.to_string());
    let script_fns = s
        .lib()
        .iter_functions()
        .map(|f| f.name.to_string())
        .collect::<Vec<_>>();
    let modules = s.modules().keys().cloned().collect::<Vec<_>>();
    let cands = vars
        .chain(functions.iter().cloned())
        .chain(script_fns)
        .chain(modules)
        .chain(unit_constant_names().into_iter().map(str::to_string))
        .chain(KEYWORDS.iter().map(|k| k.to_string()));
    finish(code, word_start, end, prefix, cands)
}

fn module_names(s: &Session) -> Vec<String> {
    let mut out = Vec::new();
    for d in s.resolver().dirs() {
        if let Ok(rd) = std::fs::read_dir(d) {
            for e in rd.flatten() {
                let p = e.path();
                if p.extension().is_some_and(|x| x == "rhai") {
                    if let Some(stem) = p.file_stem() {
                        out.push(stem.to_string_lossy().to_string());
                    }
                }
            }
        }
    }
    out
}

pub(crate) fn inspect(s: &Session, code: &str, cursor: usize) -> Option<String> {
    let at = char_to_byte(code, cursor);
    // The identifier under the cursor, or the callee of the call the cursor is in.
    let start = code[..at]
        .char_indices()
        .rev()
        .take_while(|&(_, c)| is_ident(c))
        .last()
        .map_or(at, |(i, _)| i);
    let end = code[at..]
        .char_indices()
        .find(|&(_, c)| !is_ident(c))
        .map_or(code.len(), |(i, _)| at + i);
    let mut name = code[start..end].to_string();
    if name.is_empty() {
        let t = tokens(&code[..at]);
        let mut depth = 0i32;
        for (i, tok) in t.iter().enumerate().rev() {
            match tok.kind {
                TokKind::Punct(')') => depth += 1,
                TokKind::Punct('(') if depth == 0 => {
                    if let Some(TokKind::Ident(id)) = i.checked_sub(1).map(|j| &t[j].kind) {
                        name = id.clone();
                    }
                    break;
                }
                TokKind::Punct('(') => depth -= 1,
                _ => {}
            }
        }
    }
    if name.is_empty() {
        return None;
    }
    if let Some((_, _, v)) = s.scope().iter_raw().find(|(n, _, _)| *n == name) {
        let mut v = v.clone();
        let text = s.engine().eval_fn_text(&mut v);
        return Some(format!(
            "`{name}`: {} = {text}",
            v.type_name().rsplit("::").next().unwrap_or("?")
        ));
    }
    let mut out = String::new();
    for f in s.lib().iter_functions().filter(|f| f.name == name) {
        out.push_str(&format!("`{}({})`\n\n", f.name, f.params.join(", ")));
        for c in f.comments {
            out.push_str(
                c.trim_start_matches("///")
                    .trim_start_matches("/**")
                    .trim_end_matches("*/"),
            );
            out.push('\n');
        }
    }
    if !out.is_empty() {
        return Some(out);
    }
    if let Some(m) = s.modules().get(&name) {
        let sigs: Vec<String> = m.gen_fn_signatures_with_mapper(|t| t.into()).collect();
        return Some(format!(
            "module `{name}`\n\n{}",
            sigs.iter()
                .map(|x| format!("- `{x}`"))
                .collect::<Vec<_>>()
                .join("\n")
        ));
    }
    if let Some(q) = super::quantity::unit_constant(&name) {
        return Some(format!("`{name}`: unit constant, {q}"));
    }
    reference_markdown(s.engine(), Some(&name))
}

/// Text of a value the way `print` shows it, outside a running script.
trait EvalText {
    fn eval_fn_text(&self, v: &mut rhai::Dynamic) -> String;
}

impl EvalText for Engine {
    fn eval_fn_text(&self, v: &mut rhai::Dynamic) -> String {
        let mut scope = rhai::Scope::new();
        scope.push_dynamic("__v", v.clone());
        self.eval_with_scope::<String>(&mut scope, "to_string(__v)")
            .unwrap_or_else(|_| v.to_string())
    }
}
