//! Script bindings for logs too long to hold: `blocks(...)` reads a log block by block (each a
//! `Frame`), `open_writer(...)` writes columns block by block on a thread of its own.
//!
//! With the running filter, statistics and fit of `running.rs`, a script reduces a log of tens
//! of millions of rows while holding only the blocks in flight and what it chooses to keep. The
//! writer converts and encodes on its own thread, so the script's next block is read, converted
//! and filtered meanwhile; its file appears only when `finish()` succeeds (written beside the
//! target, then renamed), and a script that stops before that leaves no file behind.

use std::fmt;
use std::path::PathBuf;
use std::sync::mpsc::{SyncSender, sync_channel};
use std::sync::{Arc, Mutex};
use std::thread::JoinHandle;

use rhai::{Engine, INT, Map, NativeCallContext};

use super::bind::{Options, ScriptResult, fault, func, resolve};
use super::data::{Frame, decimals_option, header_and_unit, log_options, map_columns};
use crate::units::Unit;
use crate::{
    ColumnWriter, DataError, Dimension, ExportOptions, LogFormat, LogOptions, LogStream,
    MimeBundle, ToMime, open_log,
};

/// A log being read block by block; iterating it in a `for` loop yields one `Frame` per block.
/// Clones share the one reading, so the file is read once.
#[derive(Clone)]
pub(crate) struct Blocks {
    stream: Arc<Mutex<Option<LogStream>>>,
    path: PathBuf,
    names: Vec<String>,
}

impl fmt::Debug for Blocks {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        f.debug_struct("Blocks").field("path", &self.path).finish()
    }
}

impl fmt::Display for Blocks {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        write!(
            f,
            "blocks of {}: {}",
            self.path.display(),
            self.names.join(", ")
        )
    }
}

impl ToMime for Blocks {
    fn to_mime(&self) -> MimeBundle {
        MimeBundle::text(self.to_string())
    }
}

/// The iterator a `for` loop takes from [`Blocks`].
pub(crate) struct BlockIter {
    stream: Arc<Mutex<Option<LogStream>>>,
}

impl IntoIterator for Blocks {
    type Item = ScriptResult<Frame>;
    type IntoIter = BlockIter;

    fn into_iter(self) -> BlockIter {
        BlockIter {
            stream: self.stream,
        }
    }
}

impl Iterator for BlockIter {
    type Item = ScriptResult<Frame>;

    fn next(&mut self) -> Option<ScriptResult<Frame>> {
        let mut guard = self.stream.lock().unwrap_or_else(|p| p.into_inner());
        let stream = guard.as_mut()?;
        match stream.next_block() {
            Some(Ok(log)) => Some(Ok(Frame::from_log(log))),
            Some(Err(e)) => {
                *guard = None;
                Some(Err(e.into()))
            }
            None => {
                *guard = None;
                None
            }
        }
    }
}

fn open_blocks(ctx: &NativeCallContext, path: &str, opts: &LogOptions) -> ScriptResult<Blocks> {
    let path = resolve(ctx, path);
    let stream = open_log(&path, opts)?;
    let layout = stream.layout();
    let names = layout
        .time
        .iter()
        .map(|t| &t.channel)
        .chain(&layout.channels)
        .map(|c| c.name.clone())
        .collect();
    Ok(Blocks {
        stream: Arc::new(Mutex::new(Some(stream))),
        path,
        names,
    })
}

// ---------------------------------------------------------------------------------------------
// Writer

/// One block for the writing thread: each column's SI values and the unit to write them in.
type Block = Vec<(Arc<Vec<f64>>, Option<Unit>)>;

enum Message {
    Block(Block),
    Finish,
}

/// A writer whose file is open: its columns and its thread.
struct Open {
    keys: Vec<String>,
    dims: Vec<Dimension>,
    tx: Option<SyncSender<Message>>,
    thread: Option<JoinHandle<Result<u64, Box<DataError>>>>,
}

impl Open {
    /// Hangs up and waits for the thread: its result, or its failure as an error.
    fn join(&mut self, path: &std::path::Path) -> Result<u64, Box<DataError>> {
        self.tx = None;
        match self.thread.take().map(JoinHandle::join) {
            Some(Ok(r)) => r,
            Some(Err(_)) | None => Err(Box::new(DataError::Engine {
                path: path.to_path_buf(),
                reason: "the writing thread stopped unexpectedly".into(),
            })),
        }
    }
}

impl Drop for Open {
    fn drop(&mut self) {
        // Not finished: the thread sees the hang-up, drops its unfinished temporary file, and
        // is waited for so that no file is left behind when the script ends.
        self.tx = None;
        if let Some(t) = self.thread.take() {
            let _ = t.join();
        }
    }
}

enum State {
    Waiting(ExportOptions),
    Open(Open),
    Done(u64),
}

/// A file being written block by block (`open_writer`). Clones share the one file.
#[derive(Clone)]
pub(crate) struct LogWriter {
    path: PathBuf,
    state: Arc<Mutex<State>>,
}

impl fmt::Debug for LogWriter {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        f.debug_struct("LogWriter")
            .field("path", &self.path)
            .finish()
    }
}

impl fmt::Display for LogWriter {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        let state = self.state.lock().unwrap_or_else(|p| p.into_inner());
        let what = match &*state {
            State::Waiting(_) => "nothing written yet".to_string(),
            State::Open(o) => format!("writing {}", o.keys.join(", ")),
            State::Done(bytes) => format!("finished, {bytes} bytes"),
        };
        write!(f, "writer of {}: {what}", self.path.display())
    }
}

impl ToMime for LogWriter {
    fn to_mime(&self) -> MimeBundle {
        MimeBundle::text(self.to_string())
    }
}

/// The writing thread: converts each block to its units and appends it; completes the file on
/// `Finish`, drops it on a hang-up. (The error is boxed only to keep the thread's result small.)
fn write_blocks(
    mut w: ColumnWriter,
    rx: std::sync::mpsc::Receiver<Message>,
    path: PathBuf,
) -> Result<u64, Box<DataError>> {
    for message in rx {
        match message {
            Message::Block(cols) => {
                // Columns shown in their SI unit go as they are; others are converted into a
                // buffer of their own, which the Parquet encoder then reads without a copy.
                let parts: Vec<Arc<Vec<f64>>> = cols
                    .into_iter()
                    .map(|(data, unit)| match unit {
                        Some(u) if u.factor() != 1.0 || u.offset() != 0.0 => {
                            Arc::new(data.iter().map(|&si| u.from_si(si)).collect())
                        }
                        _ => data,
                    })
                    .collect();
                w.append_shared(&parts)?;
            }
            Message::Finish => return Ok(w.finish()?),
        }
    }
    Err(Box::new(DataError::Engine {
        path,
        reason: "the writer was dropped before finish(); nothing was written".into(),
    }))
}

fn export_options(path: &std::path::Path, opts: Option<&Map>) -> ScriptResult<ExportOptions> {
    let name = "open_writer()";
    let mut eo = ExportOptions::default();
    let Some(m) = opts else {
        return Ok(eo);
    };
    let o = Options::new(m, name, &["format", "decimals"])?;
    if let Some(f) = o.opt_string("format")? {
        eo.format = Some(match f.as_str() {
            "csv" => LogFormat::Csv,
            "parquet" => LogFormat::Parquet,
            other => {
                return Err(fault(
                    "ArgumentError",
                    format!(
                        "key `format` in options of {name} must be \"csv\" or \"parquet\", found \"{other}\" (for {})",
                        path.display()
                    ),
                ));
            }
        });
    }
    eo.decimals = decimals_option(&o, name)?;
    Ok(eo)
}

impl LogWriter {
    fn append(&self, cols: &Map) -> ScriptResult<()> {
        let columns = map_columns(cols)?;
        let rows = columns.first().map_or(0, |(_, c)| c.len());
        if let Some((k, c)) = columns.iter().find(|(_, c)| c.len() != rows) {
            return Err(fault(
                "ArgumentError",
                format!(
                    "column `{k}` has {} samples, column `{}` {rows}: a block's columns must have one length",
                    c.len(),
                    columns[0].0
                ),
            ));
        }
        let mut state = self.state.lock().unwrap_or_else(|p| p.into_inner());
        if let State::Waiting(opts) = &*state {
            if columns.is_empty() {
                return Err(fault("ArgumentError", "append() needs at least one column"));
            }
            let (headers, _): (Vec<String>, Vec<_>) =
                columns.iter().map(|(k, c)| header_and_unit(k, c)).unzip();
            let names: Vec<&str> = headers.iter().map(String::as_str).collect();
            let w = ColumnWriter::create(&self.path, &names, opts)?;
            let (tx, rx) = sync_channel(2);
            let path = self.path.clone();
            let thread = std::thread::Builder::new()
                .name("gaugebook-writer".into())
                .spawn(move || write_blocks(w, rx, path))
                .map_err(|e| DataError::io(&self.path, "cannot start the writing thread", e))?;
            *state = State::Open(Open {
                keys: columns.iter().map(|(k, _)| k.clone()).collect(),
                dims: columns.iter().map(|(_, c)| c.dimension()).collect(),
                tx: Some(tx),
                thread: Some(thread),
            });
        }
        let open = match &mut *state {
            State::Open(o) => o,
            State::Done(_) => {
                return Err(fault(
                    "ArgumentError",
                    format!("the writer of {} is finished", self.path.display()),
                ));
            }
            State::Waiting(_) => unreachable!("opened above"),
        };
        let keys: Vec<&String> = columns.iter().map(|(k, _)| k).collect();
        if keys.len() != open.keys.len() || keys.iter().zip(&open.keys).any(|(a, b)| *a != b) {
            return Err(fault(
                "ArgumentError",
                format!(
                    "append() to {} takes the columns of the first block ({}), found {}",
                    self.path.display(),
                    open.keys.join(", "),
                    keys.iter()
                        .map(|k| k.as_str())
                        .collect::<Vec<_>>()
                        .join(", ")
                ),
            ));
        }
        for ((k, c), d) in columns.iter().zip(&open.dims) {
            if c.dimension() != *d {
                return Err(fault(
                    "UnitError",
                    format!(
                        "column `{k}` was a column of {d} in the first block, now one of {}",
                        c.dimension()
                    ),
                ));
            }
        }
        let block: Block = columns
            .iter()
            .map(|(k, c)| (c.data().clone(), header_and_unit(k, c).1))
            .collect();
        let sent = open
            .tx
            .as_ref()
            .is_some_and(|tx| tx.send(Message::Block(block)).is_ok());
        if !sent {
            // The thread stopped on an error: that error is the answer.
            let r = open.join(&self.path);
            *state = State::Done(0);
            r.map_err(|e| *e)?;
        }
        Ok(())
    }

    fn finish(&self) -> ScriptResult<INT> {
        let mut state = self.state.lock().unwrap_or_else(|p| p.into_inner());
        match &mut *state {
            State::Waiting(_) => Err(fault(
                "ArgumentError",
                format!(
                    "nothing was appended to the writer of {}",
                    self.path.display()
                ),
            )),
            State::Done(_) => Err(fault(
                "ArgumentError",
                format!("the writer of {} is already finished", self.path.display()),
            )),
            State::Open(open) => {
                if let Some(tx) = open.tx.as_ref() {
                    let _ = tx.send(Message::Finish);
                }
                let r = open.join(&self.path);
                *state = State::Done(*r.as_ref().unwrap_or(&0));
                Ok(r.map_err(|e| *e)? as INT)
            }
        }
    }
}

fn writer(ctx: &NativeCallContext, path: &str, opts: Option<&Map>) -> ScriptResult<LogWriter> {
    let path = resolve(ctx, path);
    let eo = export_options(&path, opts)?;
    Ok(LogWriter {
        path,
        state: Arc::new(Mutex::new(State::Waiting(eo))),
    })
}

/// Registers `blocks`, `open_writer` and the writer's methods.
pub(crate) fn register(engine: &mut Engine) {
    super::bind::register_display::<Blocks>(engine, "Blocks");
    super::bind::register_display::<LogWriter>(engine, "LogWriter");
    engine.register_iterator_result::<Blocks, Frame>();

    func(
        "blocks",
        &["path: String"],
        "Blocks",
        r#"
        Reads a log block by block: `for b in blocks(path) { … }` gives each block as a `Frame`
        (its channels in their units, `b.time`, `b.rows`, and the rate and gaps within the
        block), so only the blocks in flight are held. Errors in the file arrive with the block
        that holds them and name its row and column; a header error at once.
        ```rhai
        let p = temp_path("run.csv");
        write_text(p, "time_s,load [kN]\n0,1\n1,2\n2,3\n");
        let n = 0;
        let total = 0.0 * kN;
        for b in blocks(p) {
            n += b.rows;
            total += b["load"].sum();
        }
        assert_eq(n, 3);
        assert_close(total, q("6 kN"), 1e-12);
        ```
    "#,
    )
    .register_into_engine(
        engine,
        |ctx: NativeCallContext, path: &str| -> ScriptResult<Blocks> {
            open_blocks(&ctx, path, &LogOptions::new())
        },
    );

    func(
        "blocks",
        &["path: String", "options: Map"],
        "Blocks",
        r#"
        `blocks` with the options of `read_log` (`columns`, `units`, `time`, `skip_nan`,
        `separator`, `gap_factor`) and `block_bytes`, the size of a block of the file (default
        8 MiB).
        ```rhai
        let p = temp_path("run.csv");
        let text = "t,a,b\n";
        for i in 0..1000 { text += `${i},${i * 2},x` + "\n"; }
        write_text(p, text);
        let count = 0;
        for b in blocks(p, #{ columns: ["a"], block_bytes: 4096 }) {
            assert_eq(b.names, ["t", "a"]);
            count += 1;
        }
        assert(count > 1);
        ```
    "#,
    )
    .register_into_engine(
        engine,
        |ctx: NativeCallContext, path: &str, options: Map| -> ScriptResult<Blocks> {
            let opts = log_options(&options, "blocks()")?;
            open_blocks(&ctx, path, &opts)
        },
    );

    func(
        "open_writer",
        &["path: String"],
        "LogWriter",
        r#"
        Writes columns block by block to CSV or Parquet (by extension): `w.append(#{ … })` takes
        a map of name to `Column` (written `name [unit]`, in name order, values in each column's
        unit; every block with the first one's columns), `w.finish()` completes the file and
        returns its size in bytes. Encoding runs on a thread of its own. The file appears only
        when `finish()` succeeds; a writer never finished leaves no file.
        ```rhai
        let p = temp_path("out.csv");
        let w = open_writer(p);
        w.append(#{ load: column([1.0, 2.0], "kN") });
        w.append(#{ load: column([3.0], "kN") });
        assert(w.finish() > 0);
        assert_eq(read_log(p)["load"].values("kN"), [1.0, 2.0, 3.0]);
        ```
    "#,
    )
    .register_into_engine(
        engine,
        |ctx: NativeCallContext, path: &str| -> ScriptResult<LogWriter> {
            writer(&ctx, path, None)
        },
    );

    func(
        "open_writer",
        &["path: String", "options: Map"],
        "LogWriter",
        r#"
        `open_writer` with options: `format` (`"csv"` or `"parquet"`, instead of the extension)
        and `decimals` (fixed decimals for CSV, as C's `%.4f` for 4).
        ```rhai
        let p = temp_path("out.txt");
        let w = open_writer(p, #{ format: "csv", decimals: 2 });
        w.append(#{ x: column([1.0 / 3.0], "") });
        w.finish();
        assert_eq(read_log(p)["x"].values(""), [0.33]);
        ```
    "#,
    )
    .register_into_engine(
        engine,
        |ctx: NativeCallContext, path: &str, options: Map| -> ScriptResult<LogWriter> {
            writer(&ctx, path, Some(&options))
        },
    );

    func(
        "append",
        &["writer: LogWriter", "columns: Map"],
        "()",
        r#"
        Appends a block (a map of name to `Column`, all of one length) to a writer.
        ```rhai
        let w = open_writer(temp_path("o.parquet"));
        w.append(#{ a: column([1.0], "N") });
        let refused = false;
        try { w.append(#{ b: column([1.0], "N") }); } catch { refused = true; }
        assert(refused); // the first block's columns, or none
        w.finish();
        ```
    "#,
    )
    .register_into_engine(engine, |w: &mut LogWriter, cols: Map| -> ScriptResult<()> {
        w.append(&cols)
    });

    func(
        "finish",
        &["writer: LogWriter"],
        "i64",
        r#"
        Completes a writer's file (flushed to disk, then renamed into place); its size in bytes.
        ```rhai
        let p = temp_path("o.csv");
        let w = open_writer(p);
        w.append(#{ a: column([1.0, 2.0], "") });
        let bytes = w.finish();
        assert(bytes > 0);
        assert_eq(read_log(p)["a"].values(""), [1.0, 2.0]);
        ```
    "#,
    )
    .register_into_engine(engine, |w: &mut LogWriter| -> ScriptResult<INT> {
        w.finish()
    });
}
