//! `gaugebook repl`: an interactive prompt with history and Tab completion, for quick
//! calculations. A statement that is not finished (open block, string or bracket) continues on
//! the next line; `exit()` or end of input (Ctrl-D) leaves.

use std::path::PathBuf;
use std::process::ExitCode;
use std::sync::Arc;

use anyhow::Context;
use rustyline::completion::{Completer, Pair};
use rustyline::error::ReadlineError;
use rustyline::highlight::Highlighter;
use rustyline::hint::Hinter;
use rustyline::history::FileHistory;
use rustyline::validate::Validator;
use rustyline::{Editor, Helper};

use crate::script::{Completeness, Session, SessionOptions, StdSink};

/// The line editor's helper: it owns the session, so Tab completes against the variables,
/// functions and imports of the cells run so far (the same completion as the kernel's).
struct Prompt {
    session: Session,
}

impl Completer for Prompt {
    type Candidate = Pair;

    fn complete(
        &self,
        line: &str,
        pos: usize,
        _ctx: &rustyline::Context<'_>,
    ) -> rustyline::Result<(usize, Vec<Pair>)> {
        Ok(complete_line(&self.session, line, pos))
    }
}

/// Completion at byte offset `pos` of `line`: the session counts in characters, the editor in
/// bytes.
fn complete_line(session: &Session, line: &str, pos: usize) -> (usize, Vec<Pair>) {
    let pos = pos.min(line.len());
    let cursor = line[..pos].chars().count();
    let c = session.completions(line, cursor);
    let start = line
        .char_indices()
        .nth(c.start)
        .map_or(line.len(), |(b, _)| b);
    let pairs = c
        .matches
        .into_iter()
        .map(|m| Pair {
            display: m.clone(),
            replacement: m,
        })
        .collect();
    (start, pairs)
}

impl Hinter for Prompt {
    type Hint = String;
}
impl Highlighter for Prompt {}
impl Validator for Prompt {}
impl Helper for Prompt {}

fn history_file() -> Option<PathBuf> {
    let base = std::env::var_os("XDG_STATE_HOME")
        .map(PathBuf::from)
        .or_else(|| std::env::var_os("HOME").map(|h| PathBuf::from(h).join(".local/state")))?;
    Some(base.join("gaugebook").join("history"))
}

pub(crate) fn repl(stdlib: Option<PathBuf>) -> anyhow::Result<ExitCode> {
    let mut session = Session::new(SessionOptions {
        stdlib_dir: stdlib,
        script_dir: std::env::current_dir().ok(),
    })?;
    session.set_output(Arc::new(StdSink));
    let mut rl: Editor<Prompt, FileHistory> =
        Editor::new().context("cannot start the line editor")?;
    rl.set_helper(Some(Prompt { session }));
    let history = history_file();
    if let Some(h) = &history {
        // No history yet is normal on the first run.
        let _ = rl.load_history(h);
    }
    let mut n = 0;
    let mut pending = String::new();
    loop {
        let prompt = if pending.is_empty() { "gb> " } else { "... " };
        match rl.readline(prompt) {
            Ok(line) => {
                pending.push_str(&line);
                pending.push('\n');
                if Session::is_complete(&pending) == Completeness::Incomplete {
                    continue;
                }
                let code = std::mem::take(&mut pending);
                if code.trim().is_empty() {
                    continue;
                }
                let _ = rl.add_history_entry(code.trim_end());
                // Rhai's `exit` ends a script with a value, which a prompt cannot tell from a
                // result; a line that is only a leave word leaves.
                if matches!(
                    code.trim().trim_end_matches(';'),
                    "exit" | "exit()" | "quit"
                ) {
                    break;
                }
                n += 1;
                let Some(prompt) = rl.helper_mut() else {
                    // set_helper above put it there and nothing takes it out.
                    break;
                };
                match prompt.session.eval_cell(&code, &format!("repl[{n}]")) {
                    Ok(out) => {
                        if let Some(text) = out.value.as_ref().and_then(|b| b.get("text/plain")) {
                            println!("{text}");
                        }
                    }
                    Err(e) => eprint!("{}", e.render()),
                }
            }
            Err(ReadlineError::Interrupted) => pending.clear(),
            Err(ReadlineError::Eof) => break,
            Err(e) => return Err(e).context("cannot read the input line"),
        }
    }
    if let Some(h) = &history {
        if let Some(dir) = h.parent() {
            let _ = std::fs::create_dir_all(dir);
        }
        let _ = rl.save_history(h);
    }
    Ok(ExitCode::SUCCESS)
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn completion_counts_bytes_for_the_editor() {
        let mut s = Session::new(SessionOptions::default()).expect("session");
        s.eval_cell("let r_gain = 2.0;", "repl[1]").expect("cell");
        // "µ" is two bytes: the match starts after the two-character prefix "µ;", at byte 4.
        let line = "\"µ\"; r_ga";
        let (start, pairs) = complete_line(&s, line, line.len());
        assert_eq!(&line[start..], "r_ga");
        assert!(
            pairs.iter().any(|p| p.replacement == "r_gain"),
            "{:?}",
            pairs.iter().map(|p| &p.replacement).collect::<Vec<_>>()
        );
        // Inside a unit string after a multi-byte prefix.
        let line = "let x = q(\"5 µ";
        let (start, pairs) = complete_line(&s, line, line.len());
        assert_eq!(&line[start..], "µ");
        assert!(
            pairs.iter().any(|p| p.replacement.starts_with('µ')),
            "{:?}",
            pairs.iter().map(|p| &p.replacement).collect::<Vec<_>>()
        );
    }
}
