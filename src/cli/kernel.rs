//! `gaugebook kernel …`: serve the Jupyter kernel, and install or remove its kernelspec.

use std::path::PathBuf;
use std::process::ExitCode;

use anyhow::Context;
use clap::{Args, Subcommand};

use crate::KernelspecTarget;

/// What `gaugebook kernel` does.
#[derive(Subcommand, Debug)]
pub(crate) enum KernelCommand {
    /// Serve the kernel for a Jupyter client (the command the kernelspec's argv names).
    Run {
        /// The connection file the client wrote (created with owner-only access if missing).
        connection_file: PathBuf,
    },
    /// Install the `gaugebook` kernelspec where Jupyter looks (default: for this user).
    Install(Where),
    /// Remove the `gaugebook` kernelspec (default: this user's).
    Uninstall(Where),
}

/// Which Jupyter data folder to use.
#[derive(Args, Debug)]
#[group(multiple = false)]
pub(crate) struct Where {
    /// This user's Jupyter data folder (the default).
    #[arg(long)]
    user: bool,
    /// The active Python environment's (VIRTUAL_ENV or CONDA_PREFIX) share/jupyter.
    #[arg(long)]
    sys_prefix: bool,
    /// DIR/share/jupyter.
    #[arg(long, value_name = "DIR")]
    prefix: Option<PathBuf>,
}

impl Where {
    fn target(&self) -> KernelspecTarget {
        match (&self.prefix, self.sys_prefix, self.user) {
            (Some(dir), _, _) => KernelspecTarget::Prefix(dir.clone()),
            (None, true, _) => KernelspecTarget::SysPrefix,
            _ => KernelspecTarget::User,
        }
    }
}

/// Runs one `kernel` subcommand.
pub(crate) fn kernel(command: KernelCommand) -> anyhow::Result<ExitCode> {
    match command {
        KernelCommand::Run { connection_file } => {
            crate::run_kernel(&connection_file)
                .with_context(|| format!("kernel for {}", connection_file.display()))?;
        }
        KernelCommand::Install(w) => {
            let dir = crate::install_kernelspec(w.target()).context("installing the kernelspec")?;
            println!(
                "installed kernelspec {} in {}",
                crate::KERNEL_NAME,
                dir.display()
            );
        }
        KernelCommand::Uninstall(w) => {
            let target = w.target();
            if crate::uninstall_kernelspec(target.clone()).context("removing the kernelspec")? {
                println!("removed kernelspec {}", crate::KERNEL_NAME);
            } else {
                println!(
                    "no kernelspec {} in {}",
                    crate::KERNEL_NAME,
                    target.kernels_dir()?.display()
                );
            }
        }
    }
    Ok(ExitCode::SUCCESS)
}
