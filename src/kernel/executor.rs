//! The execution thread: the one place the language engine lives and runs cells, so the sockets
//! (control above all: interrupt and shutdown) stay responsive while a cell is busy.

use std::panic::{AssertUnwindSafe, catch_unwind};
use std::sync::atomic::{AtomicBool, Ordering};
use std::sync::{Arc, Mutex, OnceLock, mpsc};

use serde_json::{Value, json};
use tokio::sync::oneshot;

use super::KernelError;
use super::backend::{Backend, CellError, CodeStatus, CompletionSet, Interrupter, KernelOutput};
use super::iopub::Iopub;
use crate::MimeBundle;

/// Work for the execution thread; each carries the channel its answer goes back on.
pub(crate) enum Job {
    Execute {
        code: String,
        origin: String,
        parent: Value,
        /// The requesting client's routing identities and whether it takes input requests.
        stdin: Option<Vec<Vec<u8>>>,
        silent: bool,
        reply: oneshot::Sender<Result<Option<MimeBundle>, CellError>>,
    },
    Complete {
        code: String,
        cursor: usize,
        reply: oneshot::Sender<CompletionSet>,
    },
    Inspect {
        code: String,
        cursor: usize,
        reply: oneshot::Sender<Option<String>>,
    },
    IsComplete {
        code: String,
        reply: oneshot::Sender<CodeStatus>,
    },
}

/// A cell's question for the client, for the stdin task to send as an `input_request`.
pub(crate) struct InputRequest {
    pub parent: Value,
    pub identities: Vec<Vec<u8>>,
    pub prompt: String,
    pub password: bool,
    pub answer: mpsc::Sender<String>,
}

/// The output sink a cell writes to: IOPub messages whose parent is the running request.
pub(crate) struct CellOutput {
    iopub: Iopub,
    parent: Mutex<Value>,
    silent: AtomicBool,
    /// Where the running cell's input requests go, when its client allows input.
    stdin: Mutex<Option<Vec<Vec<u8>>>>,
    ask: tokio::sync::mpsc::UnboundedSender<InputRequest>,
    /// Set by an interrupt, so a cell waiting for input stops waiting.
    interrupted: AtomicBool,
}

impl CellOutput {
    fn parent(&self) -> Value {
        // A poisoned lock only means a panic elsewhere while holding it; the header inside is
        // still a whole JSON value, so keep using it.
        self.parent
            .lock()
            .unwrap_or_else(|p| p.into_inner())
            .clone()
    }

    fn send(&self, msg_type: &str, content: Value) {
        if !self.silent.load(Ordering::Relaxed) {
            self.iopub.publish(&self.parent(), msg_type, content);
        }
    }
}

impl KernelOutput for CellOutput {
    fn stdout(&self, text: &str) {
        self.send("stream", json!({"name": "stdout", "text": text}));
    }

    fn stderr(&self, text: &str) {
        self.send("stream", json!({"name": "stderr", "text": text}));
    }

    fn display(&self, bundle: MimeBundle, display_id: Option<String>, update: bool) {
        let transient = match &display_id {
            Some(id) => json!({"display_id": id}),
            None => json!({}),
        };
        let kind = if update && display_id.is_some() {
            "update_display_data"
        } else {
            "display_data"
        };
        self.send(
            kind,
            json!({"data": bundle_json(&bundle), "metadata": {}, "transient": transient}),
        );
    }

    fn clear_output(&self, wait: bool) {
        self.send("clear_output", json!({"wait": wait}));
    }

    fn input(&self, prompt: &str, password: bool) -> Result<String, String> {
        let identities = self
            .stdin
            .lock()
            .unwrap_or_else(|p| p.into_inner())
            .clone()
            .ok_or("the client does not accept input requests (allow_stdin is false)")?;
        let (tx, rx) = mpsc::channel();
        self.ask
            .send(InputRequest {
                parent: self.parent(),
                identities,
                prompt: prompt.to_string(),
                password,
                answer: tx,
            })
            .map_err(|_| "the kernel's stdin channel has stopped".to_string())?;
        // Wait for the answer, but look at the interrupt flag often: an interrupt must end
        // the wait within half a second (issue 4). 20 ms is our polling choice.
        loop {
            match rx.recv_timeout(std::time::Duration::from_millis(20)) {
                Ok(line) => return Ok(line),
                Err(mpsc::RecvTimeoutError::Disconnected) => {
                    return Err("the kernel's stdin channel has stopped".to_string());
                }
                Err(mpsc::RecvTimeoutError::Timeout) => {
                    if self.interrupted.swap(false, Ordering::SeqCst) {
                        return Err("interrupted while waiting for input".to_string());
                    }
                }
            }
        }
    }
}

/// A MIME bundle as the `data` object of a display message.
pub(crate) fn bundle_json(bundle: &MimeBundle) -> Value {
    let mut map = serde_json::Map::new();
    for (mime, content) in bundle.iter() {
        // JSON types (application/json and the +json family) travel as JSON, not as a string.
        let value = if mime == "application/json" || mime.ends_with("+json") {
            serde_json::from_str(content).unwrap_or_else(|_| Value::String(content.to_string()))
        } else {
            Value::String(content.to_string())
        };
        map.insert(mime.to_string(), value);
    }
    Value::Object(map)
}

/// The running engine as the rest of the kernel sees it.
pub(crate) struct Executor {
    pub jobs: mpsc::Sender<Job>,
    interrupter: Arc<OnceLock<Interrupter>>,
    running: Arc<AtomicBool>,
    output: Arc<CellOutput>,
    /// Lets the execution thread start building the engine (see [`Executor::release`]).
    go: Mutex<Option<mpsc::Sender<()>>>,
}

/// How long the execution thread waits for the first request before it builds the engine
/// anyway: our choice, long enough for a client's handshake, short beside the engine's use.
const ENGINE_HOLD: std::time::Duration = std::time::Duration::from_millis(200);

impl Executor {
    /// Starts the thread, which builds the engine with `make`. Returns at once, so the sockets
    /// answer kernel_info while the engine loads; jobs sent meanwhile wait in the queue. If the
    /// engine cannot be built, the error arrives on the returned receiver.
    pub fn start<B, F>(
        make: F,
        iopub: Iopub,
        ask: tokio::sync::mpsc::UnboundedSender<InputRequest>,
    ) -> Result<(Executor, oneshot::Receiver<KernelError>), KernelError>
    where
        B: Backend + 'static,
        F: FnOnce() -> Result<B, KernelError> + Send + 'static,
    {
        let (job_tx, job_rx) = mpsc::channel::<Job>();
        let (fail_tx, fail_rx) = oneshot::channel::<KernelError>();
        let running = Arc::new(AtomicBool::new(false));
        let interrupter = Arc::new(OnceLock::new());
        let (flag, slot) = (running.clone(), interrupter.clone());
        let output = Arc::new(CellOutput {
            iopub,
            parent: Mutex::new(json!({})),
            silent: AtomicBool::new(false),
            stdin: Mutex::new(None),
            ask,
            interrupted: AtomicBool::new(false),
        });
        let kept = output.clone();
        let (go_tx, go_rx) = mpsc::channel::<()>();
        std::thread::Builder::new()
            .name("gaugebook-exec".into())
            .spawn(move || {
                // Building the engine takes both cores' worth of work for a moment; the
                // client's first kernel_info should not wait behind it, so hold until the
                // kernel has answered (or any job arrives, or ENGINE_HOLD passes).
                let _ = go_rx.recv_timeout(ENGINE_HOLD);
                let mut backend = match make() {
                    Ok(b) => b,
                    Err(e) => {
                        let _ = fail_tx.send(e);
                        return;
                    }
                };
                backend.set_output(output.clone());
                let _ = slot.set(backend.interrupter());
                serve(&mut backend, &output, &flag, job_rx);
            })
            .map_err(|e| KernelError::Backend(format!("cannot start the execution thread: {e}")))?;
        Ok((
            Executor {
                jobs: job_tx,
                interrupter,
                running,
                output: kept,
                go: Mutex::new(Some(go_tx)),
            },
            fail_rx,
        ))
    }

    /// Lets the engine build start now (the first reply is out, or a job needs the engine);
    /// later calls do nothing.
    pub fn release(&self) {
        if let Some(go) = self.go.lock().unwrap_or_else(|p| p.into_inner()).take() {
            let _ = go.send(());
        }
    }

    /// Stops the running cell, if one runs (an interrupt while idle is a no-op, so it cannot
    /// break the next cell).
    pub fn interrupt(&self) {
        if self.running.load(Ordering::SeqCst)
            && let Some(stop) = self.interrupter.get()
        {
            self.output.interrupted.store(true, Ordering::SeqCst);
            stop();
        }
    }
}

fn serve<B: Backend>(
    backend: &mut B,
    output: &CellOutput,
    running: &AtomicBool,
    jobs: mpsc::Receiver<Job>,
) {
    while let Ok(job) = jobs.recv() {
        match job {
            Job::Execute {
                code,
                origin,
                parent,
                stdin,
                silent,
                reply,
            } => {
                *output.parent.lock().unwrap_or_else(|p| p.into_inner()) = parent;
                *output.stdin.lock().unwrap_or_else(|p| p.into_inner()) = stdin;
                output.interrupted.store(false, Ordering::SeqCst);
                output.silent.store(silent, Ordering::Relaxed);
                running.store(true, Ordering::SeqCst);
                let result = catch_unwind(AssertUnwindSafe(|| backend.execute(&code, &origin)));
                running.store(false, Ordering::SeqCst);
                output.silent.store(false, Ordering::Relaxed);
                let result = result.unwrap_or_else(|panic| Err(panic_error(&*panic)));
                let _ = reply.send(result);
            }
            Job::Complete {
                code,
                cursor,
                reply,
            } => {
                let r = catch_unwind(AssertUnwindSafe(|| backend.complete(&code, cursor)));
                let _ = reply.send(r.unwrap_or_default());
            }
            Job::Inspect {
                code,
                cursor,
                reply,
            } => {
                let r = catch_unwind(AssertUnwindSafe(|| backend.inspect(&code, cursor)));
                let _ = reply.send(r.unwrap_or(None));
            }
            Job::IsComplete { code, reply } => {
                let r = catch_unwind(AssertUnwindSafe(|| backend.is_complete(&code)));
                let _ = reply.send(r.unwrap_or(CodeStatus::Invalid));
            }
        }
    }
}

/// A panic inside the engine (a native function's bug) as a cell error, so the kernel lives on.
fn panic_error(panic: &(dyn std::any::Any + Send)) -> CellError {
    let what = panic
        .downcast_ref::<&str>()
        .map(|s| s.to_string())
        .or_else(|| panic.downcast_ref::<String>().cloned())
        .unwrap_or_else(|| "unknown panic".to_string());
    CellError {
        ename: "InternalError".into(),
        evalue: format!("a native function panicked: {what}"),
        traceback: vec![format!(
            "internal error: a native function panicked: {what}"
        )],
    }
}
