//! The five sockets and the request handlers: shell and control (ROUTER), IOPub (PUB), stdin
//! (ROUTER) and heartbeat (REP), each served by its own task on one tokio thread while cells
//! run on the execution thread.

use std::sync::atomic::{AtomicBool, Ordering};
use std::sync::{Arc, Mutex, mpsc};
use std::time::Duration;

use serde_json::{Value, json};
use tokio::sync::{Notify, oneshot};
use zeromq::{PubSocket, RepSocket, RouterSocket, Socket, SocketRecv, SocketSend};

use super::KernelError;
use super::backend::{Backend, CodeStatus};
use super::connection::ConnectionInfo;
use super::executor::{Executor, Job, bundle_json};
use super::history::History;
use super::iopub::{self, Iopub};
use super::wire::{self, HeaderMaker, Message, PROTOCOL_VERSION, Signer};

/// State shared by the shell and control tasks.
struct Kernel {
    signer: Arc<Mutex<Signer>>,
    maker: HeaderMaker,
    iopub: Iopub,
    exec: Executor,
    shutdown: Notify,
    stopping: AtomicBool,
    state: Mutex<ShellState>,
}

/// Which ROUTER socket a request came in on.
#[derive(Clone, Copy, PartialEq, Eq)]
enum Channel {
    Shell,
    Control,
}

/// Serves one kernel until a shutdown request, on the current thread.
///
/// With `write_to`, the kernel chose its own ports (0 in `info`) and writes the connection file
/// there once they are bound.
pub(crate) fn serve<B, F>(
    info: ConnectionInfo,
    write_to: Option<&std::path::Path>,
    make: F,
) -> Result<(), KernelError>
where
    B: Backend + 'static,
    F: FnOnce() -> Result<B, KernelError> + Send + 'static,
{
    let runtime = tokio::runtime::Builder::new_current_thread()
        .enable_all()
        .build()
        .map_err(|e| KernelError::Socket(format!("cannot start the async runtime: {e}")))?;
    runtime.block_on(serve_async(info, write_to, make))
}

/// Binds one socket on the connection file's address and returns the port actually bound (the
/// same, or the one the system chose for port 0).
async fn bind<S: Socket>(
    socket: &mut S,
    info: &ConnectionInfo,
    port: u16,
) -> Result<u16, KernelError> {
    let endpoint = info.endpoint(port);
    match socket.bind(&endpoint).await {
        Ok(zeromq::Endpoint::Tcp(_, bound)) => Ok(bound),
        Ok(_) => Ok(port),
        Err(e) => Err(KernelError::Socket(format!("cannot bind {endpoint}: {e}"))),
    }
}

async fn serve_async<B, F>(
    mut info: ConnectionInfo,
    write_to: Option<&std::path::Path>,
    make: F,
) -> Result<(), KernelError>
where
    B: Backend + 'static,
    F: FnOnce() -> Result<B, KernelError> + Send + 'static,
{
    #[cfg(unix)]
    let signals = tokio::signal::unix::signal(tokio::signal::unix::SignalKind::interrupt())
        .map_err(|e| KernelError::Socket(format!("cannot handle SIGINT: {e}")))?;
    #[cfg(not(unix))]
    let signals = ();
    let mut shell = RouterSocket::new();
    let mut control = RouterSocket::new();
    let mut stdin = RouterSocket::new();
    let mut iopub_socket = PubSocket::new();
    let mut hb = RepSocket::new();
    info.shell_port = bind(&mut shell, &info, info.shell_port).await?;
    info.control_port = bind(&mut control, &info, info.control_port).await?;
    info.stdin_port = bind(&mut stdin, &info, info.stdin_port).await?;
    info.iopub_port = bind(&mut iopub_socket, &info, info.iopub_port).await?;
    info.hb_port = bind(&mut hb, &info, info.hb_port).await?;
    if let Some(path) = write_to {
        info.write(path)?;
    }

    let signer = Arc::new(Mutex::new(Signer::new(info.key.as_bytes())));
    let maker = HeaderMaker {
        session: uuid::Uuid::new_v4().to_string(),
    };
    let iopub = iopub::start(iopub_socket, signer.clone(), maker.clone());
    let (ask_tx, ask_rx) = tokio::sync::mpsc::unbounded_channel();
    let (exec, mut failed) = Executor::start(make, iopub.clone(), ask_tx)?;
    iopub.status(&json!({}), "starting");
    let kernel = Arc::new(Kernel {
        signer,
        maker,
        iopub,
        exec,
        shutdown: Notify::new(),
        stopping: AtomicBool::new(false),
        state: Mutex::new(ShellState {
            count: 0,
            history: History::default(),
        }),
    });

    tokio::spawn(heartbeat(hb));
    tokio::spawn(serve_stdin(stdin, ask_rx, kernel.clone()));
    tokio::spawn(serve_router(control, kernel.clone(), Channel::Control));
    tokio::spawn(serve_router(shell, kernel.clone(), Channel::Shell));
    tokio::spawn(sigint(signals, kernel.clone()));

    tokio::select! {
        _ = kernel.shutdown.notified() => {}
        Ok(e) = &mut failed => return Err(e),
    }
    kernel.iopub.flush().await;
    // The PUB and ROUTER sockets write on background tasks; give them a moment to put the last
    // replies on the wire before the runtime (and the process) goes away. 50 ms is our choice.
    tokio::time::sleep(Duration::from_millis(50)).await;
    Ok(())
}

/// Echoes every heartbeat ping (messaging specification, "Heartbeat for kernels").
async fn heartbeat(mut hb: RepSocket) {
    loop {
        match hb.recv().await {
            Ok(ping) => {
                if let Err(e) = hb.send(ping).await {
                    eprintln!("gaugebook kernel: heartbeat send failed: {e}");
                }
            }
            Err(e) => {
                eprintln!("gaugebook kernel: heartbeat receive failed: {e}");
                tokio::time::sleep(Duration::from_millis(10)).await;
            }
        }
    }
}

/// The stdin channel: sends a cell's `input_request` to the client that ran it and hands the
/// `input_reply` back to the waiting cell. Replies nobody waits for (after an interrupt) and
/// badly signed messages are dropped.
async fn serve_stdin(
    mut stdin: RouterSocket,
    mut asks: tokio::sync::mpsc::UnboundedReceiver<super::executor::InputRequest>,
    kernel: Arc<Kernel>,
) {
    let mut waiting: Option<mpsc::Sender<String>> = None;
    loop {
        tokio::select! {
            ask = asks.recv() => {
                let Some(ask) = ask else { return };
                let request = kernel.maker.child(
                    &ask.parent,
                    ask.identities,
                    "input_request",
                    json!({"prompt": ask.prompt, "password": ask.password}),
                );
                let frames = kernel.signer.lock().unwrap_or_else(|p| p.into_inner()).encode(&request);
                match wire::to_zmq(frames) {
                    Some(z) => match stdin.send(z).await {
                        Ok(()) => waiting = Some(ask.answer),
                        // Dropping the answer channel tells the cell there will be no reply.
                        Err(e) => eprintln!("gaugebook kernel: input request send failed: {e}"),
                    },
                    None => eprintln!("gaugebook kernel: input request had no frames"),
                }
            }
            z = stdin.recv() => match z {
                Ok(z) => match kernel.decode(&z) {
                    Ok(m) if m.msg_type() == "input_reply" => {
                        let value = m.content.get("value").and_then(Value::as_str).unwrap_or("");
                        match waiting.take() {
                            Some(tx) => { let _ = tx.send(value.to_string()); }
                            None => eprintln!("gaugebook kernel: dropped an input reply nobody waits for"),
                        }
                    }
                    Ok(m) => eprintln!("gaugebook kernel: ignored stdin message {:?}", m.msg_type()),
                    Err(r) => eprintln!("gaugebook kernel: dropped stdin message: {r}"),
                },
                Err(_) => tokio::time::sleep(Duration::from_millis(10)).await,
            },
        }
    }
}

/// SIGINT must not kill the kernel (clients may send it before a shutdown): it interrupts the
/// running cell instead. The handler is installed before the sockets are bound, so no client
/// can signal the kernel before it is in place.
#[cfg(unix)]
async fn sigint(mut signals: tokio::signal::unix::Signal, kernel: Arc<Kernel>) {
    while signals.recv().await.is_some() {
        kernel.exec.interrupt();
    }
}

#[cfg(not(unix))]
async fn sigint(_: (), kernel: Arc<Kernel>) {
    while tokio::signal::ctrl_c().await.is_ok() {
        kernel.exec.interrupt();
    }
}

async fn serve_router(mut socket: RouterSocket, kernel: Arc<Kernel>, channel: Channel) {
    let name = if channel == Channel::Shell {
        "shell"
    } else {
        "control"
    };
    loop {
        let z = match socket.recv().await {
            Ok(z) => z,
            Err(e) => {
                eprintln!("gaugebook kernel: receive failed: {e}");
                tokio::time::sleep(Duration::from_millis(10)).await;
                continue;
            }
        };
        let msg = match kernel.decode(&z) {
            Ok(m) => m,
            Err(r) => {
                eprintln!("gaugebook kernel: dropped {name} message: {r}");
                continue;
            }
        };
        kernel.iopub.status(&msg.header, "busy");
        let reply = kernel.handle(&msg, channel).await;
        // The queue is drained before the failed cell's reply goes out: a client that waits
        // for that reply (or for idle) and then sends the next cell must see it run.
        if reply.as_ref().is_some_and(|r| stops_queue(&msg, r)) {
            abort_queued(&mut socket, &kernel, channel).await;
        }
        if let Some(reply) = reply {
            send(&mut socket, &kernel, &reply).await;
        }
        kernel.iopub.status(&msg.header, "idle");
        kernel.exec.release();
        if kernel.stopping.load(Ordering::SeqCst) {
            kernel.shutdown.notify_one();
            return;
        }
    }
}

async fn send(socket: &mut RouterSocket, kernel: &Kernel, reply: &Message) {
    let frames = kernel
        .signer
        .lock()
        .unwrap_or_else(|p| p.into_inner())
        .encode(reply);
    if let Some(z) = wire::to_zmq(frames)
        && let Err(e) = socket.send(z).await
    {
        eprintln!("gaugebook kernel: reply send failed: {e}");
    }
}

/// Whether a reply ends the run of queued cells: a failed execute_request that did not ask
/// `stop_on_error: false` (the messaging specification's default is true) and was not silent.
fn stops_queue(msg: &Message, reply: &Message) -> bool {
    let c = &msg.content;
    msg.msg_type() == "execute_request"
        && reply.content.get("status").and_then(Value::as_str) == Some("error")
        && c.get("stop_on_error")
            .and_then(Value::as_bool)
            .unwrap_or(true)
        && !c.get("silent").and_then(Value::as_bool).unwrap_or(false)
}

/// After a failed cell, before its reply, the execute_requests already waiting on the socket
/// are answered `aborted` without running (what "Run all" expects: later cells must not run on a broken
/// state); other requests waiting there are served as usual. A request that arrives after the
/// queue ran dry runs normally.
async fn abort_queued(socket: &mut RouterSocket, kernel: &Kernel, channel: Channel) {
    loop {
        // A zero timeout still polls the receive once, so it takes exactly what is already
        // buffered; the zeromq receive is a stream read, safe to drop when nothing is there.
        let z = match tokio::time::timeout(Duration::ZERO, socket.recv()).await {
            Ok(Ok(z)) => z,
            Ok(Err(_)) | Err(_) => return,
        };
        let Ok(msg) = kernel.decode(&z) else {
            eprintln!("gaugebook kernel: dropped a queued message with a bad signature");
            continue;
        };
        kernel.iopub.status(&msg.header, "busy");
        let reply = if msg.msg_type() == "execute_request" {
            let count = kernel.state().count;
            Some(kernel.reply(
                &msg,
                "execute_reply",
                json!({"status": "aborted", "execution_count": count}),
            ))
        } else {
            kernel.handle(&msg, channel).await
        };
        if let Some(reply) = reply {
            send(socket, kernel, &reply).await;
        }
        kernel.iopub.status(&msg.header, "idle");
        if kernel.stopping.load(Ordering::SeqCst) {
            return;
        }
    }
}

/// Mutable state of the shell channel: the execution counter and the history.
struct ShellState {
    count: i64,
    history: History,
}

impl Kernel {
    fn state(&self) -> std::sync::MutexGuard<'_, ShellState> {
        // Poisoning only records a panic elsewhere; the counter and history stay consistent.
        self.state.lock().unwrap_or_else(|p| p.into_inner())
    }

    fn decode(&self, z: &zeromq::ZmqMessage) -> Result<Message, wire::Rejection> {
        self.signer
            .lock()
            .unwrap_or_else(|p| p.into_inner())
            .decode(wire::frames_of(z))
    }

    fn reply(&self, msg: &Message, msg_type: &str, content: Value) -> Message {
        self.maker
            .child(&msg.header, msg.identities.clone(), msg_type, content)
    }

    /// Sends a job to the execution thread and waits for its answer.
    async fn ask<T>(&self, job: impl FnOnce(oneshot::Sender<T>) -> Job) -> Option<T> {
        let (tx, rx) = oneshot::channel();
        self.exec.release();
        self.exec.jobs.send(job(tx)).ok()?;
        rx.await.ok()
    }

    async fn handle(&self, msg: &Message, channel: Channel) -> Option<Message> {
        let c = &msg.content;
        let text = |k: &str| c.get(k).and_then(Value::as_str).unwrap_or("").to_string();
        match msg.msg_type() {
            "kernel_info_request" => Some(self.reply(msg, "kernel_info_reply", kernel_info())),
            "shutdown_request" => {
                let restart = c.get("restart").and_then(Value::as_bool).unwrap_or(false);
                self.stopping.store(true, Ordering::SeqCst);
                self.exec.interrupt();
                Some(self.reply(
                    msg,
                    "shutdown_reply",
                    json!({"status": "ok", "restart": restart}),
                ))
            }
            "interrupt_request" => {
                self.exec.interrupt();
                Some(self.reply(msg, "interrupt_reply", json!({"status": "ok"})))
            }
            _ if channel == Channel::Control => {
                eprintln!(
                    "gaugebook kernel: ignored control message {:?}",
                    msg.msg_type()
                );
                None
            }
            "execute_request" => Some(self.execute(msg).await),
            "is_complete_request" => {
                let code = text("code");
                let status = self
                    .ask(|reply| Job::IsComplete { code, reply })
                    .await
                    .unwrap_or(CodeStatus::Invalid);
                let content = match status {
                    CodeStatus::Complete => json!({"status": "complete"}),
                    CodeStatus::Incomplete => json!({"status": "incomplete", "indent": ""}),
                    CodeStatus::Invalid => json!({"status": "invalid"}),
                };
                Some(self.reply(msg, "is_complete_reply", content))
            }
            "complete_request" => {
                let code = text("code");
                let cursor = cursor_chars(&code, c.get("cursor_pos"));
                let code2 = code.clone();
                let set = self
                    .ask(|reply| Job::Complete {
                        code: code2,
                        cursor,
                        reply,
                    })
                    .await
                    .unwrap_or_default();
                let start = set.start.min(cursor);
                let end = set.end.clamp(start, code.chars().count());
                Some(self.reply(
                    msg,
                    "complete_reply",
                    json!({"status": "ok", "matches": set.matches, "cursor_start": start,
                           "cursor_end": end, "metadata": {}}),
                ))
            }
            "inspect_request" => {
                let code = text("code");
                let cursor = cursor_chars(&code, c.get("cursor_pos"));
                let found = self
                    .ask(|reply| Job::Inspect {
                        code,
                        cursor,
                        reply,
                    })
                    .await
                    .flatten();
                let content = match found {
                    Some(doc) => json!({"status": "ok", "found": true,
                                        "data": {"text/plain": doc}, "metadata": {}}),
                    None => json!({"status": "ok", "found": false, "data": {}, "metadata": {}}),
                };
                Some(self.reply(msg, "inspect_reply", content))
            }
            "history_request" => {
                let history = self.state().history.query(c);
                Some(self.reply(
                    msg,
                    "history_reply",
                    json!({"status": "ok", "history": history}),
                ))
            }
            "comm_info_request" => {
                Some(self.reply(msg, "comm_info_reply", json!({"status": "ok", "comms": {}})))
            }
            "comm_open" => {
                // No comm targets are registered: close the comm at once, as the specification
                // asks of a kernel that cannot open one.
                let id = c.get("comm_id").cloned().unwrap_or(Value::Null);
                self.iopub.publish(
                    &msg.header,
                    "comm_close",
                    json!({"comm_id": id, "data": {}}),
                );
                None
            }
            "comm_msg" | "comm_close" => None,
            other => {
                eprintln!("gaugebook kernel: ignored shell message {other:?}");
                None
            }
        }
    }

    async fn execute(&self, msg: &Message) -> Message {
        let c = &msg.content;
        let code = c
            .get("code")
            .and_then(Value::as_str)
            .unwrap_or("")
            .to_string();
        let silent = c.get("silent").and_then(Value::as_bool).unwrap_or(false);
        let store = !silent
            && c.get("store_history")
                .and_then(Value::as_bool)
                .unwrap_or(true);
        let count = {
            let mut s = self.state();
            if store {
                s.count += 1;
            }
            s.count
        };
        if !silent {
            self.iopub.publish(
                &msg.header,
                "execute_input",
                json!({"code": code, "execution_count": count}),
            );
        }

        // `help(NAME)` opens the reference in the pager (a payload) instead of printing it.
        let mut payload = Vec::new();
        let mut result = None;
        if let Some(name) = help_target(&code) {
            let query = name.to_string();
            let cursor = query.len();
            if let Some(doc) = self
                .ask(|reply| Job::Inspect {
                    code: query,
                    cursor,
                    reply,
                })
                .await
                .flatten()
            {
                payload.push(json!({"source": "page", "data": {"text/plain": doc}, "start": 0}));
                result = Some(Ok(None));
            }
        }
        let result = match result {
            Some(r) => r,
            None => {
                let origin = format!("cell[{count}]");
                let parent = msg.header.clone();
                let code2 = code.clone();
                let allow_stdin = c
                    .get("allow_stdin")
                    .and_then(Value::as_bool)
                    .unwrap_or(false);
                let stdin = allow_stdin.then(|| msg.identities.clone());
                self.ask(|reply| Job::Execute {
                    code: code2,
                    origin,
                    parent,
                    stdin,
                    silent,
                    reply,
                })
                .await
                .unwrap_or_else(|| {
                    Err(super::backend::CellError {
                        ename: "KernelError".into(),
                        evalue: "the execution thread has stopped".into(),
                        traceback: vec!["the execution thread has stopped".into()],
                    })
                })
            }
        };

        let user_expressions = if result.is_ok() {
            self.user_expressions(c.get("user_expressions"), &msg.header)
                .await
        } else {
            json!({})
        };

        match result {
            Ok(value) => {
                let plain = value
                    .as_ref()
                    .and_then(|b| b.get("text/plain").map(str::to_string));
                if let Some(bundle) = value
                    && !silent
                {
                    self.iopub.publish(
                        &msg.header,
                        "execute_result",
                        json!({"execution_count": count, "data": bundle_json(&bundle),
                               "metadata": {}}),
                    );
                }
                if store {
                    self.state().history.push(count, &code, plain);
                }
                self.reply(
                    msg,
                    "execute_reply",
                    json!({"status": "ok", "execution_count": count, "payload": payload,
                           "user_expressions": user_expressions}),
                )
            }
            Err(e) => {
                if !silent {
                    self.iopub.publish(
                        &msg.header,
                        "error",
                        json!({"ename": e.ename, "evalue": e.evalue, "traceback": e.traceback}),
                    );
                }
                if store {
                    self.state().history.push(count, &code, None);
                }
                self.reply(
                    msg,
                    "execute_reply",
                    json!({"status": "error", "execution_count": count, "ename": e.ename,
                           "evalue": e.evalue, "traceback": e.traceback}),
                )
            }
        }
    }

    /// Evaluates `user_expressions` silently after a successful cell.
    async fn user_expressions(&self, exprs: Option<&Value>, parent: &Value) -> Value {
        let mut out = serde_json::Map::new();
        let Some(Value::Object(map)) = exprs else {
            return Value::Object(out);
        };
        for (name, expr) in map {
            let code = expr.as_str().unwrap_or("").to_string();
            let parent = parent.clone();
            let r = self
                .ask(|reply| Job::Execute {
                    code,
                    origin: format!("user_expressions[{name}]"),
                    parent,
                    stdin: None,
                    silent: true,
                    reply,
                })
                .await;
            let v = match r {
                Some(Ok(v)) => json!({"status": "ok",
                    "data": v.map(|b| bundle_json(&b)).unwrap_or_else(|| json!({"text/plain": "()"})),
                    "metadata": {}}),
                Some(Err(e)) => json!({"status": "error", "ename": e.ename, "evalue": e.evalue,
                                       "traceback": e.traceback}),
                None => json!({"status": "error", "ename": "KernelError",
                               "evalue": "the execution thread has stopped", "traceback": []}),
            };
            out.insert(name.clone(), v);
        }
        Value::Object(out)
    }
}

/// The kernel_info_reply content.
fn kernel_info() -> Value {
    json!({
        "status": "ok",
        "protocol_version": PROTOCOL_VERSION,
        "implementation": "gaugebook",
        "implementation_version": env!("CARGO_PKG_VERSION"),
        "language_info": {
            "name": "rhai",
            "version": "1",
            "mimetype": "text/x-rhai",
            "file_extension": ".rhai",
            // Rhai's syntax is close to Rust's; the Rust modes highlight it well enough.
            "pygments_lexer": "rust",
            "codemirror_mode": "rust",
        },
        "banner": concat!("Gaugebook ", env!("CARGO_PKG_VERSION"),
            ": strain-gauge transducer design and test data in Rhai. help(NAME) shows a function's reference."),
        "help_links": [],
        "debugger": false,
    })
}

/// The name in a cell that is exactly `help(NAME)` (or `help("NAME")`).
fn help_target(code: &str) -> Option<&str> {
    let inner = code
        .trim()
        .trim_end_matches(';')
        .trim_end()
        .strip_prefix("help(")?
        .strip_suffix(')')?
        .trim();
    let name = inner.trim_matches('"');
    let ok = !name.is_empty()
        && name
            .chars()
            .all(|c| c.is_alphanumeric() || c == '_' || c == ':' || c == '.');
    ok.then_some(name)
}

/// A protocol cursor (unicode code points since protocol 5.2), clamped to the code; a missing
/// cursor means the end of the code.
fn cursor_chars(code: &str, pos: Option<&Value>) -> usize {
    let len = code.chars().count();
    pos.and_then(Value::as_u64)
        .map_or(len, |p| usize::try_from(p).unwrap_or(len).min(len))
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn help_cells_are_recognised() {
        assert_eq!(help_target("help(bridge_output)"), Some("bridge_output"));
        assert_eq!(help_target("  help(\"q\");\n"), Some("q"));
        assert_eq!(help_target("help(1 + 2)"), None);
        assert_eq!(help_target("x = help(a)"), None);
    }

    #[test]
    fn cursors_count_characters_and_are_clamped() {
        let code = "µε + ab";
        assert_eq!(cursor_chars(code, Some(&json!(2))), 2);
        assert_eq!(cursor_chars(code, None), 7);
        assert_eq!(cursor_chars(code, Some(&json!(99))), 7);
    }

    #[test]
    fn kernel_info_has_status_and_version() {
        let k = kernel_info();
        assert_eq!(k["status"], "ok");
        assert_eq!(k["protocol_version"], "5.3");
        assert_eq!(k["language_info"]["name"], "rhai");
    }
}
