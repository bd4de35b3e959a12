//! Writing columns to Parquet or CSV atomically: into a temporary file in the target's folder,
//! then renamed over the target, so a reader never sees half a file and a failure leaves the
//! old file (if any) in place. Input logs are never written.

use std::fs::File;
use std::io::{BufWriter, Write};
use std::path::{Path, PathBuf};
use std::sync::Arc;
use std::sync::atomic::{AtomicU64, Ordering};

use polars::prelude::*;

use super::parquet_sink::ParquetSink;
use super::{DataError, Log, LogFormat};

/// How to write.
///
/// ```
/// use gaugebook::{ExportOptions, LogFormat};
/// let o = ExportOptions { format: Some(LogFormat::Csv), decimals: Some(4), ..Default::default() };
/// assert_eq!(o.decimals, Some(4));
/// ```
#[derive(Clone, Debug, Default, PartialEq)]
pub struct ExportOptions {
    /// The format; `None` takes it from the extension (`.parquet`/`.pq`, else CSV).
    pub format: Option<LogFormat>,
    /// CSV only: fixed decimals (as C's `%.4f` for 4); `None` writes the shortest text that reads
    /// back to the same number.
    pub decimals: Option<usize>,
    /// Files that must not be written over (the inputs); `write_log` adds the log's own file.
    pub protect: Vec<PathBuf>,
}

/// Writes `columns` (name, values; equal lengths) to `path` atomically. Returns the bytes written.
///
/// ```
/// use gaugebook::{ExportOptions, read_log, write_columns, LogOptions};
/// let dir = tempfile::tempdir()?;
/// let out = dir.path().join("strain.csv");
/// let t = [0.0, 0.001];
/// let e = [12.34567, -0.00004];
/// let opts = ExportOptions { decimals: Some(4), ..Default::default() };
/// write_columns(&out, &[("time_s", &t), ("sg1_ue", &e)], &opts)?;
/// assert_eq!(std::fs::read_to_string(&out)?, "time_s,sg1_ue\n0.0000,12.3457\n0.0010,-0.0000\n");
/// let pq = dir.path().join("strain.parquet");
/// write_columns(&pq, &[("time_s", &t), ("sg1_ue", &e)], &ExportOptions::default())?;
/// assert_eq!(read_log(&pq, &LogOptions::new())?.channel("sg1_ue").unwrap().values, e);
/// # Ok::<(), Box<dyn std::error::Error>>(())
/// ```
pub fn write_columns(
    path: impl AsRef<Path>,
    columns: &[(&str, &[f64])],
    opts: &ExportOptions,
) -> Result<u64, DataError> {
    let path = path.as_ref();
    let rows = columns.first().map_or(0, |c| c.1.len());
    for (name, v) in columns {
        if v.len() != rows {
            return Err(DataError::LengthMismatch {
                what: format!("column `{}` and column `{name}`", columns[0].0),
                left: rows,
                right: v.len(),
            });
        }
    }
    let names: Vec<&str> = columns.iter().map(|c| c.0).collect();
    let mut w = ColumnWriter::create(path, &names, opts)?;
    let mut start = 0;
    // Appended in groups so a Parquet row group (and its copy) stays small.
    while start < rows || (rows == 0 && start == 0) {
        let stop = (start + PARQUET_GROUP_ROWS).min(rows);
        let parts: Vec<&[f64]> = columns.iter().map(|c| &c.1[start..stop]).collect();
        w.append(&parts)?;
        start = stop;
        if rows == 0 {
            break;
        }
    }
    w.finish()
}

/// Writes columns block by block into a temporary file beside the target; [`finish`]
/// renames it over the target. Dropped without `finish` (an error on the way), it removes the
/// temporary file and leaves the target as it was.
///
/// [`finish`]: ColumnWriter::finish
///
/// ```
/// use gaugebook::{ColumnWriter, ExportOptions};
/// let dir = tempfile::tempdir()?;
/// let out = dir.path().join("o.csv");
/// let mut w = ColumnWriter::create(&out, &["a", "b"], &ExportOptions::default())?;
/// w.append(&[&[1.0, 2.0], &[0.5, 0.25]])?;
/// w.append(&[&[3.0], &[0.125]])?;
/// assert!(!out.exists());
/// w.finish()?;
/// assert_eq!(std::fs::read_to_string(&out)?, "a,b\n1,0.5\n2,0.25\n3,0.125\n");
/// # Ok::<(), Box<dyn std::error::Error>>(())
/// ```
pub struct ColumnWriter {
    path: PathBuf,
    temp: TempFile,
    /// A second handle on the temporary file, to flush it to disk after the writer is done.
    handle: File,
    names: Vec<String>,
    sink: Sink,
    decimals: Option<usize>,
    /// Bytes of the file handed to the kernel's writeback so far.
    writeback_mark: u64,
}

/// Bytes written after which the kernel is asked to start writing them to disk, so that the
/// flush before the rename waits only for the last few (a 400 MB file waited 0.3 s for it at the
/// end on the benchmark machine; a blocking flush every so often made the writer fall behind).
const WRITEBACK_EVERY: u64 = 32 << 20;

/// Asks the kernel to start writing bytes `from..to` of `file` to disk, without waiting.
/// Best effort: the flush in `finish` still reports any failure.
fn start_writeback(file: &File, from: u64, to: u64) {
    #[cfg(target_os = "linux")]
    {
        // On Linux POSIX_FADV_DONTNEED starts asynchronous writeback of the range's dirty pages
        // (mm/fadvise.c: a WB_SYNC_NONE write of the range) and drops the clean ones from the
        // page cache; it never waits for the disk.
        let _ = rustix::fs::fadvise(
            file,
            from,
            std::num::NonZeroU64::new(to.saturating_sub(from)),
            rustix::fs::Advice::DontNeed,
        );
    }
    #[cfg(not(target_os = "linux"))]
    let _ = (file, from, to);
}

enum Sink {
    Csv(BufWriter<File>),
    Parquet(Box<ParquetSink>),
}

impl std::fmt::Debug for ColumnWriter {
    fn fmt(&self, f: &mut std::fmt::Formatter<'_>) -> std::fmt::Result {
        f.debug_struct("ColumnWriter")
            .field("path", &self.path)
            .field("names", &self.names)
            .finish()
    }
}

impl ColumnWriter {
    /// Starts writing columns `names` to `path` (format from `opts` or the extension).
    ///
    /// ```
    /// use gaugebook::{ColumnWriter, DataError, ExportOptions};
    /// let dir = tempfile::tempdir()?;
    /// let input = dir.path().join("log.csv");
    /// std::fs::write(&input, "t,x\n0,1\n")?;
    /// // Writing over a protected input is refused before anything is written.
    /// let opts = ExportOptions { protect: vec![input.clone()], ..Default::default() };
    /// let e = ColumnWriter::create(&input, &["t"], &opts).unwrap_err();
    /// assert!(matches!(e, DataError::WouldOverwriteInput { .. }));
    /// assert_eq!(std::fs::read_to_string(&input)?, "t,x\n0,1\n");
    /// # Ok::<(), Box<dyn std::error::Error>>(())
    /// ```
    pub fn create(
        path: impl AsRef<Path>,
        names: &[&str],
        opts: &ExportOptions,
    ) -> Result<ColumnWriter, DataError> {
        let path = path.as_ref();
        for p in &opts.protect {
            if same_file(p, path) {
                return Err(DataError::WouldOverwriteInput {
                    path: path.to_path_buf(),
                });
            }
        }
        let format = opts.format.unwrap_or_else(|| {
            match path
                .extension()
                .and_then(|e| e.to_str())
                .map(str::to_ascii_lowercase)
                .as_deref()
            {
                Some("parquet" | "pq") => LogFormat::Parquet,
                _ => LogFormat::Csv,
            }
        });
        let temp = TempFile::create(path)?;
        let file = temp.file()?;
        let handle = file
            .try_clone()
            .map_err(|e| DataError::io(path, "cannot write", e))?;
        let out = BufWriter::with_capacity(1 << 20, file);
        let sink = match format {
            LogFormat::Csv => {
                let mut out = out;
                let header = names.join(",") + "\n";
                out.write_all(header.as_bytes())
                    .map_err(|e| DataError::io(path, "cannot write", e))?;
                Sink::Csv(out)
            }
            LogFormat::Parquet => {
                let w = ParquetSink::create(out, names).map_err(|e| engine(path, e))?;
                Sink::Parquet(Box::new(w))
            }
        };
        Ok(ColumnWriter {
            path: path.to_path_buf(),
            temp,
            handle,
            names: names.iter().map(|n| n.to_string()).collect(),
            sink,
            decimals: opts.decimals,
            writeback_mark: 0,
        })
    }

    /// Appends one block: a slice per column, all of one length.
    ///
    /// ```
    /// use gaugebook::{ColumnWriter, ExportOptions};
    /// let dir = tempfile::tempdir()?;
    /// let mut w = ColumnWriter::create(dir.path().join("o.csv"), &["a", "b"], &ExportOptions::default())?;
    /// w.append(&[&[1.0], &[2.0]])?;
    /// assert!(w.append(&[&[1.0, 2.0], &[3.0]]).is_err()); // ragged block
    /// # Ok::<(), Box<dyn std::error::Error>>(())
    /// ```
    pub fn append(&mut self, columns: &[&[f64]]) -> Result<(), DataError> {
        let rows = self.check_block(columns.iter().map(|c| c.len()))?;
        match &mut self.sink {
            Sink::Csv(out) => write_csv_rows(out, columns, self.decimals)
                .map_err(|e| DataError::io(&self.path, "cannot write", e))?,
            Sink::Parquet(w) => {
                let owned: Vec<Arc<Vec<f64>>> =
                    columns.iter().map(|c| Arc::new(c.to_vec())).collect();
                w.write(rows, &owned).map_err(|e| engine(&self.path, e))?
            }
        }
        self.after_block();
        Ok(())
    }

    /// Appends one block of shared buffers, as [`ColumnWriter::append`] appends slices; the
    /// Parquet encoder reads them where they are instead of copying them first.
    ///
    /// ```
    /// use std::sync::Arc;
    /// use gaugebook::{ColumnWriter, ExportOptions, LogOptions, read_log};
    /// let dir = tempfile::tempdir()?;
    /// let out = dir.path().join("o.parquet");
    /// let mut w = ColumnWriter::create(&out, &["t", "x"], &ExportOptions::default())?;
    /// w.append_shared(&[Arc::new(vec![0.0, 0.5]), Arc::new(vec![2.0, 3.0])])?;
    /// assert!(w.append_shared(&[Arc::new(vec![1.0]), Arc::new(vec![])]).is_err()); // ragged
    /// w.finish()?;
    /// assert_eq!(read_log(&out, &LogOptions::new().time("t"))?.channel("x").unwrap().values, [2.0, 3.0]);
    /// # Ok::<(), Box<dyn std::error::Error>>(())
    /// ```
    pub fn append_shared(&mut self, columns: &[Arc<Vec<f64>>]) -> Result<(), DataError> {
        let rows = self.check_block(columns.iter().map(|c| c.len()))?;
        match &mut self.sink {
            Sink::Csv(out) => {
                let parts: Vec<&[f64]> = columns.iter().map(|c| c.as_slice()).collect();
                write_csv_rows(out, &parts, self.decimals)
                    .map_err(|e| DataError::io(&self.path, "cannot write", e))?
            }
            Sink::Parquet(w) => w.write(rows, columns).map_err(|e| engine(&self.path, e))?,
        }
        self.after_block();
        Ok(())
    }

    /// The block's row count, or an error when it has the wrong number of columns or ragged ones.
    fn check_block(
        &self,
        lengths: impl ExactSizeIterator<Item = usize>,
    ) -> Result<usize, DataError> {
        if lengths.len() != self.names.len() {
            return Err(DataError::LengthMismatch {
                what: "columns given and columns of the writer".into(),
                left: lengths.len(),
                right: self.names.len(),
            });
        }
        let mut rows = None;
        for (k, n) in lengths.enumerate() {
            match rows {
                None => rows = Some(n),
                Some(r) if r != n => {
                    return Err(DataError::LengthMismatch {
                        what: format!("column `{}` and column `{}`", self.names[0], self.names[k]),
                        left: r,
                        right: n,
                    });
                }
                Some(_) => {}
            }
        }
        Ok(rows.unwrap_or(0))
    }

    /// Hands what the block added to the kernel's writeback every [`WRITEBACK_EVERY`] bytes.
    fn after_block(&mut self) {
        let written = self.handle.metadata().map_or(0, |m| m.len());
        if written >= self.writeback_mark + WRITEBACK_EVERY {
            start_writeback(&self.handle, self.writeback_mark, written);
            self.writeback_mark = written;
        }
    }

    /// Completes the file, flushes it to disk and renames it over the target. Returns its size.
    ///
    /// ```
    /// use gaugebook::{ColumnWriter, ExportOptions};
    /// let dir = tempfile::tempdir()?;
    /// let out = dir.path().join("o.csv");
    /// let mut w = ColumnWriter::create(&out, &["load"], &ExportOptions::default())?;
    /// w.append(&[&[5.0]])?;
    /// let bytes = w.finish()?;
    /// assert_eq!(bytes, std::fs::metadata(&out)?.len());
    /// # Ok::<(), Box<dyn std::error::Error>>(())
    /// ```
    pub fn finish(self) -> Result<u64, DataError> {
        let path = self.path;
        match self.sink {
            Sink::Csv(out) => {
                out.into_inner()
                    .map_err(|e| DataError::io(&path, "cannot write", e.into_error()))?;
            }
            // The footer write ends with a flush of the buffered file (polars-parquet FileWriter::end).
            Sink::Parquet(w) => {
                w.finish().map_err(|e| engine(&path, e))?;
            }
        }
        let file = self.handle;
        file.sync_all()
            .map_err(|e| DataError::io(&path, "cannot write", e))?;
        let bytes = file.metadata().map(|m| m.len()).unwrap_or(0);
        drop(file);
        self.temp.commit()?;
        Ok(bytes)
    }
}

fn engine(path: &Path, e: PolarsError) -> DataError {
    DataError::Engine {
        path: path.to_path_buf(),
        reason: e.to_string(),
    }
}

/// Writes a log's time and channels (headers `name [unit]`, values as stored) atomically;
/// refuses to write over the file the log came from.
///
/// ```
/// use gaugebook::{ExportOptions, LogOptions, read_log, write_log};
/// let dir = tempfile::tempdir()?;
/// let src = dir.path().join("in.csv");
/// std::fs::write(&src, "load [kN],sg1_mVV\n1,0.5\n2,1.0\n")?;
/// let log = read_log(&src, &LogOptions::new())?;
/// let out = dir.path().join("out.parquet");
/// write_log(&log, &out, &ExportOptions::default())?;
/// let back = read_log(&out, &LogOptions::new())?;
/// assert_eq!(back.channel("load").unwrap().unit.symbol(), "kN");
/// assert!(write_log(&log, &src, &ExportOptions::default()).is_err());
/// # Ok::<(), Box<dyn std::error::Error>>(())
/// ```
pub fn write_log(
    log: &Log,
    path: impl AsRef<Path>,
    opts: &ExportOptions,
) -> Result<u64, DataError> {
    let headers: Vec<String> = log
        .time
        .iter()
        .map(|t| &t.channel)
        .chain(log.channels.iter())
        .map(|c| {
            let sym = c.unit.symbol();
            if sym.is_empty() || sym == "1" {
                c.name.clone()
            } else {
                format!("{} [{sym}]", c.name)
            }
        })
        .collect();
    let values = log
        .time
        .iter()
        .map(|t| &t.channel)
        .chain(log.channels.iter())
        .map(|c| c.values.as_slice());
    let columns: Vec<(&str, &[f64])> = headers.iter().map(String::as_str).zip(values).collect();
    let mut opts = opts.clone();
    opts.protect.push(log.path.clone());
    write_columns(path, &columns, &opts)
}

/// Writes a small text file (a summary, a report) atomically, like the column writers.
///
/// ```
/// let dir = tempfile::tempdir()?;
/// let p = dir.path().join("summary.json");
/// gaugebook::write_text_atomic(&p, "{}\n")?;
/// assert_eq!(std::fs::read_to_string(&p)?, "{}\n");
/// # Ok::<(), Box<dyn std::error::Error>>(())
/// ```
pub fn write_text_atomic(path: impl AsRef<Path>, text: &str) -> Result<(), DataError> {
    let path = path.as_ref();
    let temp = TempFile::create(path)?;
    let mut f = temp.file()?;
    f.write_all(text.as_bytes())
        .map_err(|e| DataError::io(path, "cannot write", e))?;
    f.sync_all()
        .map_err(|e| DataError::io(path, "cannot write", e))?;
    drop(f);
    temp.commit()
}

fn same_file(a: &Path, b: &Path) -> bool {
    match (a.canonicalize(), b.canonicalize()) {
        (Ok(x), Ok(y)) => x == y,
        _ => a == b,
    }
}

/// A temporary file beside the target, removed on drop unless committed.
struct TempFile {
    temp: PathBuf,
    target: PathBuf,
    committed: bool,
}

impl TempFile {
    fn create(target: &Path) -> Result<TempFile, DataError> {
        static COUNTER: AtomicU64 = AtomicU64::new(0);
        let dir = match target.parent() {
            Some(d) if !d.as_os_str().is_empty() => d.to_path_buf(),
            _ => PathBuf::from("."),
        };
        let name = target
            .file_name()
            .map(|n| n.to_string_lossy().into_owned())
            .unwrap_or_default();
        let k = COUNTER.fetch_add(1, Ordering::Relaxed);
        let temp = dir.join(format!(".{name}.{}-{k}.tmp", std::process::id()));
        File::create_new(&temp)
            .map_err(|e| DataError::io(target, "cannot create a temporary file beside", e))?;
        Ok(TempFile {
            temp,
            target: target.to_path_buf(),
            committed: false,
        })
    }

    fn file(&self) -> Result<File, DataError> {
        File::options()
            .write(true)
            .truncate(true)
            .open(&self.temp)
            .map_err(|e| DataError::io(&self.target, "cannot write", e))
    }

    fn commit(mut self) -> Result<(), DataError> {
        std::fs::rename(&self.temp, &self.target)
            .map_err(|e| DataError::io(&self.target, "cannot rename the temporary file to", e))?;
        self.committed = true;
        Ok(())
    }
}

impl Drop for TempFile {
    fn drop(&mut self) {
        if !self.committed {
            // Best effort: the error that brought us here matters more than this one.
            let _ = std::fs::remove_file(&self.temp);
        }
    }
}

/// Rows formatted per task; large enough to amortise a thread, small enough to bound memory.
const CSV_BLOCK_ROWS: usize = 1 << 16;

/// Rows per Parquet row group when writing whole columns.
const PARQUET_GROUP_ROWS: usize = 1 << 19;

fn write_csv_rows(
    out: &mut impl Write,
    columns: &[&[f64]],
    decimals: Option<usize>,
) -> std::io::Result<()> {
    let rows = columns.first().map_or(0, |c| c.len());
    let threads = std::thread::available_parallelism()
        .map_or(1, |n| n.get())
        .clamp(1, 8);
    let mut start = 0;
    while start < rows {
        let stop = (start + CSV_BLOCK_ROWS * threads).min(rows);
        let ranges: Vec<(usize, usize)> = (start..stop)
            .step_by(CSV_BLOCK_ROWS)
            .map(|a| (a, (a + CSV_BLOCK_ROWS).min(stop)))
            .collect();
        if ranges.len() == 1 {
            out.write_all(&format_rows(columns, ranges[0], decimals))?;
        } else {
            let texts: Vec<Vec<u8>> = std::thread::scope(|s| {
                let handles: Vec<_> = ranges
                    .iter()
                    .map(|&r| s.spawn(move || format_rows(columns, r, decimals)))
                    .collect();
                // A formatting thread only panics on a bug; pass that panic on.
                handles
                    .into_iter()
                    .map(|h| h.join().unwrap_or_else(|p| std::panic::resume_unwind(p)))
                    .collect()
            });
            for t in &texts {
                out.write_all(t)?;
            }
        }
        start = stop;
    }
    Ok(())
}

fn format_rows(columns: &[&[f64]], (a, b): (usize, usize), decimals: Option<usize>) -> Vec<u8> {
    let mut buf = Vec::with_capacity((b - a) * columns.len() * 12);
    for i in a..b {
        for (j, v) in columns.iter().enumerate() {
            if j > 0 {
                buf.push(b',');
            }
            match decimals {
                Some(d) => super::fixed::push_fixed(&mut buf, v[i], d),
                None => {
                    // Display of f64 is the shortest text that parses back to the same value.
                    let _ = write!(buf, "{}", v[i]);
                }
            }
        }
        buf.push(b'\n');
    }
    buf
}
