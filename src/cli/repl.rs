//! `gaugebook repl`: an interactive prompt with history, for quick calculations. A statement
//! that is not finished (open block, string or bracket) continues on the next line.

use std::path::PathBuf;
use std::process::ExitCode;
use std::sync::Arc;

use anyhow::Context;
use rustyline::DefaultEditor;
use rustyline::error::ReadlineError;

use crate::script::{Completeness, Session, SessionOptions, StdSink};

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
    let mut rl = DefaultEditor::new().context("cannot start the line editor")?;
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
                n += 1;
                match session.eval_cell(&code, &format!("repl[{n}]")) {
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
