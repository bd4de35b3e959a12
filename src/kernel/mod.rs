//! The Jupyter kernel: Gaugebook's Rhai sessions served to any Jupyter client over the
//! messaging protocol 5.3 (pure-Rust zeromq, HMAC-SHA256 signed messages).
//!
//! How it works: one tokio thread serves the five sockets (shell, control, stdin, IOPub,
//! heartbeat); cells run on a dedicated execution thread that owns the [`Backend`], so interrupt
//! and shutdown requests on the control channel are answered while a cell runs. All IOPub traffic
//! goes through one queue, which keeps busy → input → outputs → result → idle in order.

mod backend;
mod connection;
mod executor;
mod history;
mod iopub;
mod logo;
mod server;
mod session;
mod spec;
mod wire;

use std::path::{Path, PathBuf};

pub use backend::{Backend, CellError, CodeStatus, CompletionSet, Interrupter, KernelOutput};
pub use session::run_kernel;
pub use spec::{
    KERNEL_NAME, KernelspecTarget, install_kernelspec, install_kernelspec_with,
    uninstall_kernelspec,
};

/// What can stop the kernel from starting or serving.
///
/// ```
/// let e = gaugebook::KernelError::Socket("cannot bind tcp://127.0.0.1:1".into());
/// assert!(e.to_string().starts_with("socket error"));
/// ```
#[derive(Debug, thiserror::Error)]
#[non_exhaustive]
pub enum KernelError {
    /// The connection file is missing or invalid.
    #[error("connection file {}: {message}", path.display())]
    Connection {
        /// The file.
        path: PathBuf,
        /// What is wrong with it.
        message: String,
    },
    /// A socket could not be bound or the runtime could not start.
    #[error("socket error: {0}")]
    Socket(String),
    /// The language engine could not start.
    #[error("engine error: {0}")]
    Backend(String),
    /// The kernelspec could not be written or removed.
    #[error("kernelspec error: {0}")]
    Spec(String),
}

/// Serves a kernel for the client that wrote `connection_file`, with the engine built by `make`
/// on the execution thread, until a shutdown request. When the file does not exist, the kernel
/// binds loopback ports of its own choosing and writes it (owner-only permissions).
///
/// ```no_run
/// # use std::sync::Arc;
/// # use gaugebook::{Backend, CellError, CodeStatus, CompletionSet, Interrupter, KernelOutput, MimeBundle};
/// # struct Echo;
/// # impl Backend for Echo {
/// #     fn set_output(&mut self, _: Arc<dyn KernelOutput>) {}
/// #     fn execute(&mut self, code: &str, _: &str) -> Result<Option<MimeBundle>, CellError> { Ok(Some(MimeBundle::text(code))) }
/// #     fn interrupter(&self) -> Interrupter { Arc::new(|| {}) }
/// #     fn complete(&self, _: &str, c: usize) -> CompletionSet { CompletionSet { start: c, end: c, matches: vec![] } }
/// #     fn inspect(&self, _: &str, _: usize) -> Option<String> { None }
/// #     fn is_complete(&self, _: &str) -> CodeStatus { CodeStatus::Complete }
/// # }
/// gaugebook::run_kernel_with(std::path::Path::new("kernel-1.json"), || Ok(Echo))?;
/// # Ok::<(), gaugebook::KernelError>(())
/// ```
pub fn run_kernel_with<B, F>(connection_file: &Path, make: F) -> Result<(), KernelError>
where
    B: Backend + 'static,
    F: FnOnce() -> Result<B, KernelError> + Send + 'static,
{
    if connection_file.exists() {
        let info = connection::ConnectionInfo::read(connection_file)?;
        server::serve(info, None, make)
    } else {
        // No client wrote the file: choose ports, then write it for clients to connect with.
        server::serve(
            connection::ConnectionInfo::fresh(),
            Some(connection_file),
            make,
        )
    }
}
