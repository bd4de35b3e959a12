//! The command line: argument parsing and `anyhow` reporting over the library's front-ends.
//!
//! Only this layer uses `anyhow`; everything below returns typed errors.

use std::process::ExitCode;

use clap::{Parser, Subcommand};

// Jupyter kernel subcommand (area: kernel).
mod kernel;

/// Gaugebook: strain-gauge transducer design and test-data reanalysis.
#[derive(Parser, Debug)]
#[command(name = "gaugebook", version, about)]
struct Args {
    #[command(subcommand)]
    command: Command,
}

#[derive(Subcommand, Debug)]
enum Command {
    /// Run the main job on an embedded example and print the results.
    Demo,
    /// Serve the Jupyter kernel, or install / remove its kernelspec.
    Kernel {
        #[command(subcommand)]
        command: kernel::KernelCommand,
    },
}

/// Parses the command line, runs the command, and maps any error to exit code 1 with its chain
/// of causes on standard error.
pub fn main() -> ExitCode {
    let args = Args::parse();
    let result: anyhow::Result<()> = match args.command {
        Command::Demo => demo(),
        Command::Kernel { command } => kernel::kernel(command).map(|_| ()),
    };
    match result {
        Ok(()) => ExitCode::SUCCESS,
        Err(e) => {
            eprintln!("error: {e:#}");
            ExitCode::FAILURE
        }
    }
}

/// Prints the embedded worked design.
fn demo() -> anyhow::Result<()> {
    let report = gaugebook_demo()?;
    println!("{report}");
    Ok(())
}

fn gaugebook_demo() -> anyhow::Result<crate::DesignReport> {
    Ok(crate::bridge_design_demo()?)
}
