//! The Jupyter wire format: multipart frames, HMAC-SHA256 signatures and message headers.
//!
//! A message on a ROUTER socket is `[identities…, "<IDS|MSG>", signature, header, parent_header,
//! metadata, content, buffers…]` (Jupyter messaging specification, "The Wire Protocol"). The
//! signature is the hex HMAC of the four JSON frames in that order under the connection file's
//! key; an empty key disables signing. Every incoming message is checked here, before anything
//! else looks at it, and a message that fails is never handed on.

use std::collections::{HashSet, VecDeque};
use std::time::{SystemTime, UNIX_EPOCH};

use hmac::{Hmac, KeyInit, Mac};
use serde_json::{Value, json};
use sha2::Sha256;

/// The frame that separates routing identities from the message (messaging specification).
pub(crate) const DELIMITER: &[u8] = b"<IDS|MSG>";

/// The protocol version this kernel speaks. Clients validate headers against their schema and
/// reject versions older than 5.3 for some message types, so every header carries this one.
pub(crate) const PROTOCOL_VERSION: &str = "5.3";

/// How many recent signatures are remembered to refuse replays (ipykernel keeps a similar
/// bounded digest history; the size is our choice: far more than a session's in-flight messages).
const REPLAY_MEMORY: usize = 4096;

/// One decoded Jupyter message.
#[derive(Clone, Debug)]
pub(crate) struct Message {
    /// Routing identities (ROUTER sockets) or the topic (IOPub).
    pub identities: Vec<Vec<u8>>,
    pub header: Value,
    pub parent_header: Value,
    pub metadata: Value,
    pub content: Value,
    pub buffers: Vec<Vec<u8>>,
}

impl Message {
    /// The header's `msg_type`, or "" when missing.
    pub fn msg_type(&self) -> &str {
        self.header
            .get("msg_type")
            .and_then(Value::as_str)
            .unwrap_or("")
    }
}

/// Why an incoming frame set was refused.
#[derive(Debug, PartialEq, Eq)]
pub(crate) enum Rejection {
    /// No `<IDS|MSG>` delimiter or too few frames after it.
    Malformed(String),
    /// Missing or wrong HMAC signature.
    BadSignature,
    /// A signature already seen: a replayed message.
    Replayed,
    /// A frame is not a JSON object.
    BadJson(String),
}

impl std::fmt::Display for Rejection {
    fn fmt(&self, f: &mut std::fmt::Formatter<'_>) -> std::fmt::Result {
        match self {
            Rejection::Malformed(why) => write!(f, "malformed message: {why}"),
            Rejection::BadSignature => write!(f, "missing or invalid signature"),
            Rejection::Replayed => write!(f, "replayed signature"),
            Rejection::BadJson(why) => write!(f, "invalid json: {why}"),
        }
    }
}

/// Signs outgoing and verifies incoming messages with the connection file's key.
pub(crate) struct Signer {
    key: Vec<u8>,
    seen: HashSet<Vec<u8>>,
    order: VecDeque<Vec<u8>>,
}

impl Signer {
    /// A signer for `key` (empty: messages are neither signed nor checked, as the specification
    /// allows when the connection file has no key).
    pub fn new(key: &[u8]) -> Signer {
        Signer {
            key: key.to_vec(),
            seen: HashSet::new(),
            order: VecDeque::new(),
        }
    }

    fn mac(&self) -> Option<Hmac<Sha256>> {
        if self.key.is_empty() {
            return None;
        }
        // HMAC takes keys of any length (RFC 2104 §2: longer keys are hashed first), so
        // new_from_slice cannot fail here.
        Hmac::<Sha256>::new_from_slice(&self.key).ok()
    }

    /// The hex signature of the four JSON frames.
    pub fn sign(&self, parts: [&[u8]; 4]) -> String {
        match self.mac() {
            None => String::new(),
            Some(mut mac) => {
                for p in parts {
                    mac.update(p);
                }
                hex(&mac.finalize().into_bytes())
            }
        }
    }

    /// Checks a signature in constant time (through `Mac::verify_slice`).
    fn verify(&self, signature: &[u8], parts: [&[u8]; 4]) -> bool {
        let Some(mut mac) = self.mac() else {
            return true;
        };
        let Some(tag) = unhex(signature) else {
            return false;
        };
        for p in parts {
            mac.update(p);
        }
        mac.verify_slice(&tag).is_ok()
    }

    /// Decodes and verifies one multipart message.
    pub fn decode(&mut self, frames: Vec<Vec<u8>>) -> Result<Message, Rejection> {
        let Some(split) = frames.iter().position(|f| f.as_slice() == DELIMITER) else {
            return Err(Rejection::Malformed("no <IDS|MSG> delimiter".into()));
        };
        let rest = &frames[split + 1..];
        if rest.len() < 5 {
            return Err(Rejection::Malformed(format!(
                "expected at least 5 frames after the delimiter, found {}",
                rest.len()
            )));
        }
        let parts = [
            rest[1].as_slice(),
            rest[2].as_slice(),
            rest[3].as_slice(),
            rest[4].as_slice(),
        ];
        if !self.verify(&rest[0], parts) {
            return Err(Rejection::BadSignature);
        }
        if !self.key.is_empty() {
            let sig = rest[0].to_vec();
            if self.seen.contains(&sig) {
                return Err(Rejection::Replayed);
            }
            self.seen.insert(sig.clone());
            self.order.push_back(sig);
            if self.order.len() > REPLAY_MEMORY
                && let Some(old) = self.order.pop_front()
            {
                self.seen.remove(&old);
            }
        }
        let object = |i: usize, name: &str| -> Result<Value, Rejection> {
            let v: Value = serde_json::from_slice(&rest[i])
                .map_err(|e| Rejection::BadJson(format!("{name}: {e}")))?;
            if v.is_object() {
                Ok(v)
            } else {
                Err(Rejection::BadJson(format!(
                    "{name}: expected an object, found {v}"
                )))
            }
        };
        let header = object(1, "header")?;
        if header.get("msg_type").and_then(Value::as_str).is_none() {
            return Err(Rejection::BadJson("header: no msg_type".into()));
        }
        Ok(Message {
            identities: frames[..split].to_vec(),
            header,
            parent_header: object(2, "parent_header")?,
            metadata: object(3, "metadata")?,
            content: object(4, "content")?,
            buffers: rest[5..].to_vec(),
        })
    }

    /// Encodes a message into signed frames.
    pub fn encode(&self, msg: &Message) -> Vec<Vec<u8>> {
        let header = msg.header.to_string().into_bytes();
        let parent = msg.parent_header.to_string().into_bytes();
        let metadata = msg.metadata.to_string().into_bytes();
        let content = msg.content.to_string().into_bytes();
        let signature = self.sign([&header, &parent, &metadata, &content]);
        let mut frames = msg.identities.clone();
        frames.push(DELIMITER.to_vec());
        frames.push(signature.into_bytes());
        frames.push(header);
        frames.push(parent);
        frames.push(metadata);
        frames.push(content);
        frames.extend(msg.buffers.iter().cloned());
        frames
    }
}

/// Builds headers with a fresh msg_id for one kernel session.
#[derive(Clone, Debug)]
pub(crate) struct HeaderMaker {
    pub session: String,
}

impl HeaderMaker {
    /// A header for a new message of `msg_type`.
    pub fn header(&self, msg_type: &str) -> Value {
        json!({
            "msg_id": uuid::Uuid::new_v4().to_string(),
            "session": self.session,
            "username": "kernel",
            "date": now_iso8601(),
            "msg_type": msg_type,
            "version": PROTOCOL_VERSION,
        })
    }

    /// A reply or broadcast whose parent is `parent`, sent to `identities`.
    pub fn child(
        &self,
        parent: &Value,
        identities: Vec<Vec<u8>>,
        msg_type: &str,
        content: Value,
    ) -> Message {
        Message {
            identities,
            header: self.header(msg_type),
            parent_header: parent.clone(),
            metadata: json!({}),
            content,
            buffers: Vec::new(),
        }
    }
}

fn hex(bytes: &[u8]) -> String {
    const DIGITS: &[u8; 16] = b"0123456789abcdef";
    let mut s = String::with_capacity(bytes.len() * 2);
    for b in bytes {
        s.push(DIGITS[usize::from(b >> 4)] as char);
        s.push(DIGITS[usize::from(b & 15)] as char);
    }
    s
}

fn unhex(text: &[u8]) -> Option<Vec<u8>> {
    if text.is_empty() || !text.len().is_multiple_of(2) {
        return None;
    }
    let digit = |c: u8| (c as char).to_digit(16).map(|d| d as u8);
    text.chunks(2)
        .map(|p| Some(digit(p[0])? << 4 | digit(p[1])?))
        .collect()
}

/// The current UTC time as ISO 8601 with microseconds, e.g. `2026-12-01T20:53:00.123456Z`
/// (the messaging specification asks for ISO 8601 dates in headers).
pub(crate) fn now_iso8601() -> String {
    let now = SystemTime::now()
        .duration_since(UNIX_EPOCH)
        .unwrap_or_default();
    format_utc(now.as_secs() as i64, now.subsec_micros())
}

/// Formats seconds since the Unix epoch. The calendar conversion is Howard Hinnant's
/// `civil_from_days` algorithm ("chrono-Compatible Low-Level Date Algorithms", from memory).
fn format_utc(secs: i64, micros: u32) -> String {
    let days = secs.div_euclid(86_400);
    let tod = secs.rem_euclid(86_400);
    let z = days + 719_468;
    let era = z.div_euclid(146_097);
    let doe = z - era * 146_097;
    let yoe = (doe - doe / 1460 + doe / 36_524 - doe / 146_096) / 365;
    let doy = doe - (365 * yoe + yoe / 4 - yoe / 100);
    let mp = (5 * doy + 2) / 153;
    let day = doy - (153 * mp + 2) / 5 + 1;
    let month = if mp < 10 { mp + 3 } else { mp - 9 };
    let year = yoe + era * 400 + i64::from(month <= 2);
    format!(
        "{year:04}-{month:02}-{day:02}T{:02}:{:02}:{:02}.{micros:06}Z",
        tod / 3600,
        tod % 3600 / 60,
        tod % 60
    )
}

/// Reads a whole message's frames out of a zeromq message.
pub(crate) fn frames_of(msg: &zeromq::ZmqMessage) -> Vec<Vec<u8>> {
    msg.iter().map(|f| f.to_vec()).collect()
}

/// Wraps frames into a zeromq message (`None` for no frames, which zeromq cannot send).
pub(crate) fn to_zmq(frames: Vec<Vec<u8>>) -> Option<zeromq::ZmqMessage> {
    let mut it = frames.into_iter();
    let mut msg = zeromq::ZmqMessage::from(it.next()?);
    for f in it {
        msg.push_back(f.into());
    }
    Some(msg)
}

#[cfg(test)]
mod tests {
    use super::*;

    fn sample(signer: &Signer) -> Vec<Vec<u8>> {
        let maker = HeaderMaker {
            session: "s".into(),
        };
        let m = maker.child(
            &json!({}),
            vec![b"peer".to_vec()],
            "kernel_info_request",
            json!({}),
        );
        signer.encode(&m)
    }

    #[test]
    fn round_trip_with_key() {
        let mut s = Signer::new(b"secret");
        let frames = sample(&s);
        let m = s.decode(frames).unwrap();
        assert_eq!(m.msg_type(), "kernel_info_request");
        assert_eq!(m.identities, vec![b"peer".to_vec()]);
        assert_eq!(m.header["version"], "5.3");
    }

    #[test]
    fn forged_signature_is_rejected() {
        let mut s = Signer::new(b"secret");
        let mut frames = sample(&Signer::new(b"other key"));
        assert!(matches!(
            s.decode(frames.clone()),
            Err(Rejection::BadSignature)
        ));
        frames[2] = Vec::new();
        assert!(matches!(s.decode(frames), Err(Rejection::BadSignature)));
    }

    #[test]
    fn replay_is_rejected() {
        let mut s = Signer::new(b"secret");
        let frames = sample(&s);
        assert!(s.decode(frames.clone()).is_ok());
        assert!(matches!(s.decode(frames), Err(Rejection::Replayed)));
    }

    #[test]
    fn malformed_frames_are_rejected() {
        let mut s = Signer::new(b"");
        assert!(matches!(
            s.decode(vec![b"x".to_vec()]),
            Err(Rejection::Malformed(_))
        ));
        let bad = vec![
            DELIMITER.to_vec(),
            Vec::new(),
            b"{not json".to_vec(),
            b"{}".to_vec(),
            b"{}".to_vec(),
            b"{}".to_vec(),
        ];
        assert!(matches!(s.decode(bad), Err(Rejection::BadJson(_))));
    }

    #[test]
    fn hmac_matches_rfc4231_case_2() {
        // RFC 4231 §4.3, test case 2: key "Jefe", data "what do ya want for nothing?".
        let s = Signer::new(b"Jefe");
        assert_eq!(
            s.sign([b"what do ya ", b"want ", b"for nothing?", b""]),
            "5bdcc146bf60754e6a042426089575c75a003f089d2739839dec58b964ec3843"
        );
    }

    #[test]
    fn dates_are_iso8601() {
        // 2000-03-01T00:00:00Z is 951868800 s after the epoch (a closed-form day count:
        // 30 years of 365 days + 7 leap days + 59 days of 2000 = 11017 days).
        assert_eq!(format_utc(951_868_800, 5), "2000-03-01T00:00:00.000005Z");
        assert_eq!(format_utc(0, 0), "1970-01-01T00:00:00.000000Z");
        assert_eq!(format_utc(86_399, 0), "1970-01-01T23:59:59.000000Z");
    }
}
