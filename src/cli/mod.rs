//! The command line: argument parsing and `anyhow` reporting over the library's front-ends.
//!
//! Only this layer uses `anyhow`; everything below returns typed errors. Each subcommand is one
//! variant of [`Command`] and one file here; `main` only dispatches.

use std::path::PathBuf;
use std::process::ExitCode;

use clap::{Parser, Subcommand};

mod demo;
mod doc;
// Jupyter kernel subcommand (area: kernel).
mod kernel;
mod repl;
mod run;

/// Gaugebook: strain-gauge transducer design and test-data reanalysis.
#[derive(Parser, Debug)]
#[command(name = "gaugebook", version, about)]
struct Args {
    #[command(subcommand)]
    command: Command,
}

#[derive(Subcommand, Debug)]
enum Command {
    /// Run the main job on embedded examples: print the worked design, then write a report
    /// folder (an HTML page with the tables and figures, and the notebooks it ran).
    Demo {
        /// The report folder (default: ./gaugebook-demo); replaced only if a demo made it.
        #[arg(long, value_name = "DIR")]
        out: Option<PathBuf>,
    },
    /// Run a Rhai script headless; `-` reads it from standard input.
    Run {
        /// The script file, or `-` for standard input.
        file: String,
        /// Define a constant before the script runs: `--set load="2 kN"`, `--set n=10`.
        #[arg(long = "set", value_name = "NAME=VALUE")]
        set: Vec<String>,
        /// The stdlib folder (default: $GAUGEBOOK_STDLIB, beside the binary, or the built-in one).
        #[arg(long, value_name = "DIR")]
        stdlib: Option<PathBuf>,
    },
    /// An interactive prompt with history, for quick calculations.
    Repl {
        /// The stdlib folder.
        #[arg(long, value_name = "DIR")]
        stdlib: Option<PathBuf>,
    },
    /// Print the script reference (markdown): one function, or everything.
    Doc {
        /// A function name; omit for the whole reference.
        name: Option<String>,
    },
    /// Serve the Jupyter kernel, or install / remove its kernelspec.
    Kernel {
        #[command(subcommand)]
        command: kernel::KernelCommand,
    },
    /// Headless notebooks: run one and write its outputs, or verify its recorded outputs.
    Nb {
        #[command(subcommand)]
        command: NbCommand,
    },
}

/// Parses the command line, runs the command, and maps any error to exit code 1 with its chain
/// of causes on standard error. A script error exits with 1 after printing
/// `FILE:LINE:COL: message`, the source line and a caret.
///
/// ```no_run
/// // src/main.rs is exactly this:
/// fn main() -> std::process::ExitCode {
///     gaugebook::cli::main()
/// }
/// ```
pub fn main() -> ExitCode {
    let args = Args::parse();
    let result: anyhow::Result<ExitCode> = match args.command {
        Command::Demo { out } => demo::demo(out).map(|()| ExitCode::SUCCESS),
        Command::Run { file, set, stdlib } => run::run(&file, &set, stdlib),
        Command::Repl { stdlib } => repl::repl(stdlib),
        Command::Doc { name } => doc::doc(name.as_deref()),
        Command::Kernel { command } => kernel::kernel(command),
        Command::Nb { command } => nb(command).map(|()| ExitCode::SUCCESS),
    };
    match result {
        Ok(code) => code,
        Err(e) => {
            eprintln!("error: {e:#}");
            ExitCode::FAILURE
        }
    }
}

// ---- Headless notebooks (issue 8): `nb run`, `nb verify` ----

#[derive(Subcommand, Debug)]
enum NbCommand {
    /// Run every code cell in order and write the outputs into the notebook (or --out).
    Run {
        /// The notebook (.ipynb, nbformat 4).
        notebook: std::path::PathBuf,
        /// Write the executed notebook here instead of updating NOTEBOOK in place.
        #[arg(long, value_name = "FILE")]
        out: Option<std::path::PathBuf>,
        /// Record errors as outputs and run every cell instead of stopping at the first.
        #[arg(long)]
        allow_errors: bool,
    },
    /// Rerun a notebook and compare every recorded output; exits non-zero on drift.
    Verify {
        /// The notebook (.ipynb) with recorded outputs.
        notebook: std::path::PathBuf,
        /// Relative tolerance for numbers (cell and notebook metadata `gaugebook.rtol` win).
        #[arg(long, value_name = "R", default_value_t = crate::VerifyOptions::default().rtol)]
        rtol: f64,
        /// Absolute tolerance for numbers (cell and notebook metadata `gaugebook.atol` win).
        #[arg(long, value_name = "A", default_value_t = crate::VerifyOptions::default().atol)]
        atol: f64,
    },
}

fn nb(command: NbCommand) -> anyhow::Result<()> {
    use anyhow::Context;
    match command {
        NbCommand::Run {
            notebook,
            out,
            allow_errors,
        } => {
            let target = out.clone().unwrap_or_else(|| notebook.clone());
            let options = crate::RunOptions {
                out,
                allow_errors,
                ..Default::default()
            };
            let nb = crate::run_notebook(&notebook, &options)
                .with_context(|| format!("running {}", notebook.display()))?;
            let errors = nb
                .cells
                .iter()
                .flat_map(|c| &c.outputs)
                .filter(|o| matches!(o, crate::Output::Error { .. }))
                .count();
            println!(
                "wrote {} ({} cell(s), {errors} error output(s))",
                target.display(),
                nb.cells.len()
            );
            Ok(())
        }
        NbCommand::Verify {
            notebook,
            rtol,
            atol,
        } => {
            let report = crate::verify_notebook(&notebook, &crate::VerifyOptions { rtol, atol })
                .with_context(|| format!("verifying {}", notebook.display()))?;
            print!("{report}");
            anyhow::ensure!(report.passed(), "{} drifted", notebook.display());
            Ok(())
        }
    }
}
