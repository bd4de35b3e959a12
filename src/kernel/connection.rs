//! The connection file: the five ports, the address and the signing key a Jupyter client hands
//! the kernel at launch (messaging specification, "Connection files").

use std::path::Path;

use serde_json::Value;

use super::KernelError;

/// What a connection file says.
#[derive(Clone, Debug, PartialEq)]
pub(crate) struct ConnectionInfo {
    pub ip: String,
    pub key: String,
    pub shell_port: u16,
    pub iopub_port: u16,
    pub stdin_port: u16,
    pub control_port: u16,
    pub hb_port: u16,
}

impl ConnectionInfo {
    /// Reads and checks a connection file: transport `tcp` and scheme `hmac-sha256` only.
    pub fn read(path: &Path) -> Result<ConnectionInfo, KernelError> {
        let text = std::fs::read_to_string(path).map_err(|e| KernelError::Connection {
            path: path.to_path_buf(),
            message: e.to_string(),
        })?;
        ConnectionInfo::parse(&text).map_err(|message| KernelError::Connection {
            path: path.to_path_buf(),
            message,
        })
    }

    /// Parses the JSON text of a connection file.
    pub fn parse(text: &str) -> Result<ConnectionInfo, String> {
        let v: Value = serde_json::from_str(text).map_err(|e| format!("invalid json: {e}"))?;
        let s = |name: &str, default: &str| -> Result<String, String> {
            match v.get(name) {
                None | Some(Value::Null) => Ok(default.to_string()),
                Some(Value::String(x)) => Ok(x.clone()),
                Some(other) => Err(format!("expected a string for {name}, found {other}")),
            }
        };
        let port = |name: &str| -> Result<u16, String> {
            v.get(name)
                .and_then(Value::as_u64)
                .and_then(|p| u16::try_from(p).ok())
                .ok_or_else(|| {
                    format!(
                        "expected a port number 0..=65535 for {name}, found {}",
                        v.get(name).map_or("nothing".to_string(), Value::to_string)
                    )
                })
        };
        let transport = s("transport", "tcp")?;
        if transport != "tcp" {
            return Err(format!("expected transport \"tcp\", found {transport:?}"));
        }
        let key = s("key", "")?;
        let scheme = s("signature_scheme", "hmac-sha256")?;
        if scheme != "hmac-sha256" && !key.is_empty() {
            return Err(format!(
                "expected signature_scheme \"hmac-sha256\", found {scheme:?}"
            ));
        }
        Ok(ConnectionInfo {
            ip: s("ip", "127.0.0.1")?,
            key,
            shell_port: port("shell_port")?,
            iopub_port: port("iopub_port")?,
            stdin_port: port("stdin_port")?,
            control_port: port("control_port")?,
            hb_port: port("hb_port")?,
        })
    }

    /// A fresh connection on loopback with system-chosen ports (0) and a random key, for a
    /// kernel started without a client's connection file.
    pub fn fresh() -> ConnectionInfo {
        ConnectionInfo {
            ip: "127.0.0.1".into(),
            key: uuid::Uuid::new_v4().to_string(),
            shell_port: 0,
            iopub_port: 0,
            stdin_port: 0,
            control_port: 0,
            hb_port: 0,
        }
    }

    /// Writes the connection file, readable and writable by its owner alone (mode 0600 on
    /// Unix): the key in it lets anyone who reads it run code in the kernel.
    pub fn write(&self, path: &Path) -> Result<(), KernelError> {
        let text = serde_json::json!({
            "shell_port": self.shell_port, "iopub_port": self.iopub_port,
            "stdin_port": self.stdin_port, "control_port": self.control_port,
            "hb_port": self.hb_port, "ip": self.ip, "key": self.key, "transport": "tcp",
            "signature_scheme": "hmac-sha256", "kernel_name": super::KERNEL_NAME,
        });
        let fail = |e: std::io::Error| KernelError::Connection {
            path: path.to_path_buf(),
            message: format!("cannot write: {e}"),
        };
        let mut options = std::fs::OpenOptions::new();
        options.write(true).create_new(true);
        #[cfg(unix)]
        std::os::unix::fs::OpenOptionsExt::mode(&mut options, 0o600);
        let mut file = options.open(path).map_err(fail)?;
        std::io::Write::write_all(&mut file, format!("{text:#}\n").as_bytes()).map_err(fail)
    }

    /// The zeromq endpoint for one port, on the connection file's address only.
    pub fn endpoint(&self, port: u16) -> String {
        if self.ip.contains(':') {
            format!("tcp://[{}]:{port}", self.ip)
        } else {
            format!("tcp://{}:{port}", self.ip)
        }
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    const SAMPLE: &str = r#"{"shell_port": 5001, "iopub_port": 5002, "stdin_port": 5003,
        "control_port": 5004, "hb_port": 5005, "ip": "127.0.0.1", "key": "k",
        "transport": "tcp", "signature_scheme": "hmac-sha256", "kernel_name": "gaugebook"}"#;

    #[test]
    fn parses_a_client_connection_file() {
        let c = ConnectionInfo::parse(SAMPLE).unwrap();
        assert_eq!(c.shell_port, 5001);
        assert_eq!(c.hb_port, 5005);
        assert_eq!(c.endpoint(c.iopub_port), "tcp://127.0.0.1:5002");
    }

    #[test]
    fn rejects_other_transports_and_bad_ports() {
        let ipc = SAMPLE.replace("\"tcp\"", "\"ipc\"");
        assert!(
            ConnectionInfo::parse(&ipc)
                .unwrap_err()
                .contains("transport")
        );
        let big = SAMPLE.replace("5001", "70000");
        assert!(
            ConnectionInfo::parse(&big)
                .unwrap_err()
                .contains("shell_port")
        );
        assert!(ConnectionInfo::parse("[1]").is_err());
    }

    #[test]
    fn written_files_are_private_and_read_back() {
        let tmp = tempfile::tempdir().unwrap();
        let path = tmp.path().join("kernel-own.json");
        let mut c = ConnectionInfo::fresh();
        c.shell_port = 6001;
        c.write(&path).unwrap();
        assert_eq!(ConnectionInfo::read(&path).unwrap(), c);
        #[cfg(unix)]
        {
            use std::os::unix::fs::PermissionsExt;
            let mode = std::fs::metadata(&path).unwrap().permissions().mode();
            assert_eq!(mode & 0o777, 0o600);
        }
        assert!(
            c.write(&path).is_err(),
            "an existing file is never overwritten"
        );
    }
}
