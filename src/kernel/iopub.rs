//! The IOPub broadcast: every status, input echo, output and result goes through one queue and
//! one publishing task, so subscribers see them in the order they were made.

use std::sync::{Arc, Mutex};

use serde_json::{Value, json};
use tokio::sync::{mpsc, oneshot};
use zeromq::{PubSocket, SocketSend};

use super::wire::{HeaderMaker, Message, Signer};

/// At most this many queued messages are merged into one batch (our choice: bounds the delay a
/// burst of output adds to the status that follows it).
const BATCH: usize = 256;

enum Item {
    Msg(Message),
    Flush(oneshot::Sender<()>),
}

/// A cloneable handle that queues IOPub messages from any thread.
#[derive(Clone)]
pub(crate) struct Iopub {
    tx: mpsc::UnboundedSender<Item>,
    maker: HeaderMaker,
}

impl Iopub {
    /// Queues a message of `msg_type` whose parent is `parent`.
    pub fn publish(&self, parent: &Value, msg_type: &str, content: Value) {
        let topic = format!("kernel.{}.{msg_type}", self.maker.session).into_bytes();
        let msg = self.maker.child(parent, vec![topic], msg_type, content);
        // A closed queue means the kernel is shutting down; the message has nowhere to go.
        let _ = self.tx.send(Item::Msg(msg));
    }

    /// Queues `status` (busy, idle, starting).
    pub fn status(&self, parent: &Value, state: &str) {
        self.publish(parent, "status", json!({"execution_state": state}));
    }

    /// Waits until everything queued so far was handed to the socket.
    pub async fn flush(&self) {
        let (tx, rx) = oneshot::channel();
        if self.tx.send(Item::Flush(tx)).is_ok() {
            let _ = rx.await;
        }
    }
}

/// Creates the queue and spawns the task that drains it into `socket`.
pub(crate) fn start(socket: PubSocket, signer: Arc<Mutex<Signer>>, maker: HeaderMaker) -> Iopub {
    let (tx, rx) = mpsc::unbounded_channel();
    tokio::spawn(run(socket, signer, rx));
    Iopub { tx, maker }
}

async fn run(
    mut socket: PubSocket,
    signer: Arc<Mutex<Signer>>,
    mut rx: mpsc::UnboundedReceiver<Item>,
) {
    while let Some(first) = rx.recv().await {
        let mut batch = vec![first];
        while batch.len() < BATCH {
            match rx.try_recv() {
                Ok(item) => batch.push(item),
                Err(_) => break,
            }
        }
        for item in coalesce(batch) {
            match item {
                Item::Flush(done) => {
                    let _ = done.send(());
                }
                Item::Msg(msg) => {
                    let frames = signer
                        .lock()
                        .unwrap_or_else(|p| p.into_inner())
                        .encode(&msg);
                    if let Some(z) = super::wire::to_zmq(frames)
                        && let Err(e) = socket.send(z).await
                    {
                        eprintln!("gaugebook kernel: iopub send failed: {e}");
                    }
                }
            }
        }
    }
}

/// Merges runs of `stream` messages with the same name and parent into one, so a chatty loop
/// sends few large messages instead of many small ones; the order of everything else is kept.
fn coalesce(batch: Vec<Item>) -> Vec<Item> {
    let mut out: Vec<Item> = Vec::with_capacity(batch.len());
    for item in batch {
        if let (Some(Item::Msg(last)), Item::Msg(next)) = (out.last_mut(), &item)
            && last.msg_type() == "stream"
            && next.msg_type() == "stream"
            && last.content["name"] == next.content["name"]
            && last.parent_header == next.parent_header
        {
            let add = next.content["text"].as_str().unwrap_or("").to_string();
            let mut text = last.content["text"].as_str().unwrap_or("").to_string();
            text.push_str(&add);
            last.content["text"] = Value::String(text);
            continue;
        }
        out.push(item);
    }
    out
}

#[cfg(test)]
mod tests {
    use super::*;

    fn stream(name: &str, text: &str, parent: &str) -> Item {
        let maker = HeaderMaker {
            session: "s".into(),
        };
        Item::Msg(maker.child(
            &json!({"msg_id": parent}),
            vec![],
            "stream",
            json!({"name": name, "text": text}),
        ))
    }

    fn texts(items: &[Item]) -> Vec<String> {
        items
            .iter()
            .map(|i| match i {
                Item::Msg(m) => m.content["text"].as_str().unwrap_or("-").to_string(),
                Item::Flush(_) => "flush".into(),
            })
            .collect()
    }

    #[test]
    fn merges_only_neighbouring_streams_of_one_kind() {
        let (tx, _rx) = oneshot::channel();
        let batch = vec![
            stream("stdout", "a", "p"),
            stream("stdout", "b", "p"),
            stream("stderr", "c", "p"),
            stream("stdout", "d", "p"),
            stream("stdout", "e", "q"),
            Item::Flush(tx),
            stream("stdout", "f", "q"),
        ];
        assert_eq!(texts(&coalesce(batch)), ["ab", "c", "d", "e", "flush", "f"]);
    }
}
