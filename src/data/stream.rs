//! Reading a log block by block on a background thread, so parsing the next block overlaps
//! whatever the caller does with this one, and memory beyond the kept columns stays within a
//! few blocks.
//!
//! A CSV file is cut at line ends into blocks of about [`LogOptions::block_bytes`], and each
//! block is read field by field into the kept columns (see `csv_lines`: every kept column is a
//! number, so text in one is an error naming its row and column, not a silently inferred text
//! column). A Parquet file is read through polars in row slices with the kept columns only.

use std::fs::File;
use std::path::Path;
use std::sync::mpsc::{Receiver, SyncSender, sync_channel};
use std::thread::JoinHandle;

use polars::prelude::*;

use super::csv_blocks::{CsvSetup, read_blocks, read_some};
use super::plan::{ColumnPlan, Plan, make_plan, seconds};
use super::time::parse_timestamp_parts;
use super::{Channel, ChannelMeta, DataError, Log, LogFormat, LogOptions, Progress, SkippedRow};

/// One block of samples from a [`LogStream`], columns in the order of the stream's layout.
///
/// ```
/// use gaugebook::{LogOptions, open_log};
/// let dir = tempfile::tempdir()?;
/// let path = dir.path().join("a.csv");
/// std::fs::write(&path, "time,x\n0,1\n1,2\n")?;
/// let chunk = open_log(&path, &LogOptions::new())?.next().unwrap()?;
/// assert_eq!((chunk.first_row, chunk.len()), (2, 2));
/// assert_eq!(chunk.time.unwrap(), vec![0.0, 1.0]);
/// # Ok::<(), Box<dyn std::error::Error>>(())
/// ```
#[derive(Clone, Debug, PartialEq)]
pub struct LogChunk {
    /// The file row (1-based, CSV header = 1) of the first sample.
    pub first_row: usize,
    /// The file row of every sample, present only when they are not consecutive (skipped or
    /// blank rows in this block).
    pub rows: Option<Vec<usize>>,
    /// Time values (seconds since the first sample for timestamps).
    pub time: Option<Vec<f64>>,
    /// One vector per kept channel.
    pub channels: Vec<Vec<f64>>,
    /// Rows dropped under the `skip_nan` policy.
    pub skipped: Vec<SkippedRow>,
    /// Bytes (CSV) or rows (Parquet) of the file consumed so far, for progress.
    pub done: u64,
}

impl LogChunk {
    /// Samples in this chunk.
    ///
    /// ```
    /// let c = gaugebook::LogChunk {
    ///     first_row: 2, rows: None, time: None, channels: vec![vec![1.0, 2.0]], skipped: vec![], done: 0,
    /// };
    /// assert_eq!(c.len(), 2);
    /// ```
    pub fn len(&self) -> usize {
        self.time
            .as_ref()
            .map(Vec::len)
            .or_else(|| self.channels.first().map(Vec::len))
            .unwrap_or(0)
    }

    /// Whether the chunk has no samples.
    ///
    /// ```
    /// let c = gaugebook::LogChunk {
    ///     first_row: 2, rows: None, time: None, channels: vec![], skipped: vec![], done: 0,
    /// };
    /// assert!(c.is_empty());
    /// ```
    pub fn is_empty(&self) -> bool {
        self.len() == 0
    }

    /// The file row of sample `i` of this chunk.
    ///
    /// ```
    /// let c = gaugebook::LogChunk {
    ///     first_row: 10, rows: None, time: None, channels: vec![vec![0.0; 3]], skipped: vec![], done: 0,
    /// };
    /// assert_eq!(c.row(2), 12);
    /// ```
    pub fn row(&self, i: usize) -> usize {
        match &self.rows {
            Some(r) => r[i],
            None => self.first_row + i,
        }
    }
}

/// A log being read block by block: [`layout`](LogStream::layout) describes the channels
/// (values empty), iteration yields [`LogChunk`]s. Parsing runs one block ahead on a background
/// thread.
///
/// ```
/// use gaugebook::{LogOptions, open_log};
/// let dir = tempfile::tempdir()?;
/// let path = dir.path().join("a.csv");
/// std::fs::write(&path, "load [kN]\n1\n2\n3\n")?;
/// let stream = open_log(&path, &LogOptions::new())?;
/// assert_eq!(stream.layout().channels[0].unit.symbol(), "kN");
/// let mut sum = 0.0;
/// for chunk in stream {
///     sum += chunk?.channels[0].iter().sum::<f64>();
/// }
/// assert_eq!(sum, 6.0);
/// # Ok::<(), Box<dyn std::error::Error>>(())
/// ```
#[derive(Debug)]
pub struct LogStream {
    layout: Log,
    total: u64,
    rx: Option<Receiver<Result<LogChunk, DataError>>>,
    worker: Option<JoinHandle<()>>,
    plan: Plan,
}

impl LogStream {
    /// The log's channels and format, with empty values and no time statistics.
    pub fn layout(&self) -> &Log {
        &self.layout
    }

    /// The size of the work in the units of [`LogChunk::done`] (bytes of CSV, rows of Parquet).
    ///
    /// ```
    /// # use gaugebook::{LogOptions, open_log};
    /// # let dir = tempfile::tempdir()?;
    /// # let path = dir.path().join("a.csv");
    /// std::fs::write(&path, "x\n1\n")?;
    /// assert_eq!(open_log(&path, &LogOptions::new())?.total(), 4);
    /// # Ok::<(), Box<dyn std::error::Error>>(())
    /// ```
    pub fn total(&self) -> u64 {
        self.total
    }

    /// The next block as a [`Log`] of its own: the layout's channels holding this block's
    /// values, with the step, rate and gaps of its time axis found within the block. `None`
    /// after the last block or an error.
    ///
    /// ```
    /// use gaugebook::{LogOptions, open_log};
    /// let dir = tempfile::tempdir()?;
    /// let path = dir.path().join("a.csv");
    /// std::fs::write(&path, "time_s,load [kN]\n0,1\n0.5,2\n1.0,3\n")?;
    /// let mut stream = open_log(&path, &LogOptions::new())?;
    /// let block = stream.next_block().unwrap()?;
    /// assert_eq!(block.channel("load").unwrap().values, vec![1.0, 2.0, 3.0]);
    /// assert_eq!(block.time.as_ref().unwrap().sample_rate_hz, 2.0);
    /// assert!(stream.next_block().is_none());
    /// # Ok::<(), Box<dyn std::error::Error>>(())
    /// ```
    pub fn next_block(&mut self) -> Option<Result<Log, DataError>> {
        let chunk = match self.next()? {
            Ok(c) => c,
            Err(e) => return Some(Err(e)),
        };
        let mut log = self.layout.clone();
        let LogChunk {
            first_row,
            rows,
            time,
            channels,
            skipped,
            ..
        } = chunk;
        if let (Some(t), Some(v)) = (log.time.as_mut(), time) {
            t.channel.values = v;
        }
        for (c, v) in log.channels.iter_mut().zip(channels) {
            c.values = v;
        }
        log.skipped = skipped;
        super::timebase::analyse_from(&mut log, rows.as_deref(), self.plan.gap_factor, first_row);
        Some(Ok(log))
    }

    fn stop(&mut self) -> Option<DataError> {
        self.rx = None;
        let handle = self.worker.take()?;
        match handle.join() {
            Ok(()) => None,
            Err(_) => Some(DataError::Engine {
                path: self.plan.path.clone(),
                reason: "the reading thread stopped unexpectedly".into(),
            }),
        }
    }
}

impl Iterator for LogStream {
    type Item = Result<LogChunk, DataError>;

    fn next(&mut self) -> Option<Self::Item> {
        let rx = self.rx.as_ref()?;
        match rx.recv() {
            Ok(Ok(chunk)) => Some(Ok(chunk)),
            Ok(Err(e)) => {
                self.stop();
                Some(Err(e))
            }
            // The worker hung up: either it finished, or it panicked (then say so rather than
            // end the log early without a word).
            Err(_) => self.stop().map(Err),
        }
    }
}

impl Drop for LogStream {
    fn drop(&mut self) {
        // Hanging up makes the worker's next send fail, so it ends after its current block.
        self.stop();
    }
}

/// Opens a log for reading block by block (see [`LogStream`]); [`read_log`] collects it.
///
/// Fails at once on everything the header decides (empty file, duplicate names, unknown units,
/// missing columns); failures in data rows arrive with the chunk that holds them.
///
/// ```
/// use gaugebook::{DataError, LogOptions, open_log};
/// let dir = tempfile::tempdir()?;
/// let path = dir.path().join("a.csv");
/// std::fs::write(&path, "x,x\n1,2\n")?;
/// assert!(matches!(open_log(&path, &LogOptions::new()), Err(DataError::DuplicateColumn { .. })));
/// # Ok::<(), Box<dyn std::error::Error>>(())
/// ```
pub fn open_log(path: impl AsRef<Path>, opts: &LogOptions) -> Result<LogStream, DataError> {
    let path = path.as_ref();
    match format_of(path)? {
        LogFormat::Csv => open_csv(path, opts),
        LogFormat::Parquet => open_parquet(path, opts),
    }
}

/// Reads a whole log into memory: CSV or Parquet (by extension), only the kept columns.
///
/// ```
/// use gaugebook::{LogOptions, read_log};
/// let dir = tempfile::tempdir()?;
/// let path = dir.path().join("run.csv");
/// std::fs::write(&path, "sg1_mVV,load (kN)\n0.25,1.5\n0.5,3.0\n")?;
/// let log = read_log(&path, &LogOptions::new())?;
/// let sg1 = log.channel("sg1").unwrap();
/// assert_eq!((sg1.unit.symbol(), sg1.values.as_slice()), ("mV/V", &[0.25, 0.5][..]));
/// # Ok::<(), Box<dyn std::error::Error>>(())
/// ```
pub fn read_log(path: impl AsRef<Path>, opts: &LogOptions) -> Result<Log, DataError> {
    read_log_with_progress(path, opts, &super::NoProgress)
}

/// [`read_log`] reporting progress (bytes of CSV or rows of Parquet) to `progress`.
///
/// ```
/// use gaugebook::{LogOptions, NoProgress, read_log_with_progress};
/// let dir = tempfile::tempdir()?;
/// let path = dir.path().join("a.csv");
/// std::fs::write(&path, "x\n1\n")?;
/// let log = read_log_with_progress(&path, &LogOptions::new(), &NoProgress)?;
/// assert_eq!(log.rows(), 1);
/// # Ok::<(), Box<dyn std::error::Error>>(())
/// ```
pub fn read_log_with_progress(
    path: impl AsRef<Path>,
    opts: &LogOptions,
    progress: &dyn Progress,
) -> Result<Log, DataError> {
    let path = path.as_ref();
    let mut stream = open_log(path, opts)?;
    let what = format!("reading {}", path.display());
    progress.start(&what, Some(stream.total()));
    let result = collect(&mut stream, progress);
    progress.finish();
    let (mut log, rows) = result?;
    super::timebase::analyse(&mut log, rows.as_deref(), stream.plan.gap_factor);
    Ok(log)
}

/// The log, and the file row of every sample when they are not consecutive.
fn collect(
    stream: &mut LogStream,
    progress: &dyn Progress,
) -> Result<(Log, Option<Vec<usize>>), DataError> {
    let mut log = stream.layout.clone();
    let mut rows: Option<Vec<usize>> = None;
    let mut n = 0usize;
    let total = stream.total;
    for chunk in stream.by_ref() {
        let chunk = chunk?;
        progress.advance(chunk.done);
        let len = chunk.len();
        let affine = chunk.rows.is_none() && chunk.first_row == first_data_row(log.format) + n;
        if !affine && rows.is_none() {
            let base = first_data_row(log.format);
            rows = Some((0..n).map(|i| base + i).collect());
        }
        if let Some(r) = rows.as_mut() {
            r.extend((0..len).map(|i| chunk.row(i)));
        }
        if let (Some(t), Some(v)) = (log.time.as_mut(), chunk.time) {
            reserve_for(&mut t.channel.values, len, chunk.done, total);
            t.channel.values.extend_from_slice(&v);
        }
        for (c, v) in log.channels.iter_mut().zip(chunk.channels) {
            reserve_for(&mut c.values, len, chunk.done, total);
            c.values.extend_from_slice(&v);
        }
        log.skipped.extend(chunk.skipped);
        n += len;
    }
    Ok((log, rows))
}

/// Reserves the expected final length once, from the share of the file read so far, so the
/// columns do not grow by doubling (which would briefly hold 1.5 to 3 times their size).
fn reserve_for(v: &mut Vec<f64>, len: usize, done: u64, total: u64) {
    if v.capacity() == 0 && done > 0 && total > 0 {
        let expected = (len as f64 * total as f64 / done as f64 * 1.01) as usize + 16;
        v.reserve_exact(expected);
    }
}

pub(crate) fn first_data_row(format: LogFormat) -> usize {
    match format {
        LogFormat::Csv => 2,
        LogFormat::Parquet => 1,
    }
}

fn format_of(path: &Path) -> Result<LogFormat, DataError> {
    let ext = path
        .extension()
        .and_then(|e| e.to_str())
        .unwrap_or("")
        .to_ascii_lowercase();
    match ext.as_str() {
        "csv" | "tsv" | "txt" | "dat" => Ok(LogFormat::Csv),
        "parquet" | "pq" => Ok(LogFormat::Parquet),
        _ => Err(DataError::UnsupportedFormat {
            path: path.to_path_buf(),
            extension: ext,
        }),
    }
}

fn layout(plan: &Plan, format: LogFormat) -> Log {
    let channel = |c: &ColumnPlan| Channel {
        name: c.name.clone(),
        header: c.header.clone(),
        column: c.column(),
        unit: c.unit.clone(),
        values: Vec::new(),
        meta: ChannelMeta::default(),
    };
    Log {
        path: plan.path.clone(),
        format,
        time: plan.time.as_ref().map(|t| super::TimeAxis {
            channel: channel(t),
            start_unix_s: None,
            step: f64::NAN,
            sample_rate_hz: f64::NAN,
            gaps: Vec::new(),
        }),
        channels: plan.channels.iter().map(channel).collect(),
        skipped: Vec::new(),
    }
}

// ---------------------------------------------------------------------------------------------
// CSV

/// Splits one line into fields (no quote handling beyond stripping surrounding quotes: test logs
/// are numbers and plain names).
fn split_fields(line: &[u8], sep: u8) -> Vec<&[u8]> {
    let line = line.strip_suffix(b"\r").unwrap_or(line);
    line.split(move |&b| b == sep).collect()
}

fn unquote(field: &[u8]) -> String {
    let s = String::from_utf8_lossy(field);
    let t = s.trim();
    t.strip_prefix('"')
        .and_then(|t| t.strip_suffix('"'))
        .unwrap_or(t)
        .to_string()
}

fn short(field: &[u8]) -> String {
    let s = String::from_utf8_lossy(field.strip_suffix(b"\r").unwrap_or(field));
    s.chars().take(40).collect()
}

fn is_blank(line: &[u8]) -> bool {
    line.iter().all(|b| b.is_ascii_whitespace())
}

fn open_csv(path: &Path, opts: &LogOptions) -> Result<LogStream, DataError> {
    let mut file = File::open(path).map_err(|e| DataError::io(path, "cannot open", e))?;
    let total = file.metadata().map(|m| m.len()).unwrap_or(0);
    // Read until the header and the first data line are in hand.
    let mut buf = Vec::new();
    loop {
        let got = read_some(
            &mut file,
            &mut buf,
            (64 << 10).min(opts.block_bytes.max(4096)),
            path,
        )?;
        // Complete (newline-ended) lines that are not blank: the header and a first data row.
        let complete = buf
            .split(|&b| b == b'\n')
            .rev()
            .skip(1)
            .filter(|l| !is_blank(l))
            .count();
        if got == 0 || complete >= 2 {
            break;
        }
    }
    let mut text: &[u8] = &buf;
    if let Some(t) = text.strip_prefix(b"\xEF\xBB\xBF") {
        text = t; // UTF-8 byte-order mark
    }
    if is_blank(text) {
        return Err(DataError::Empty {
            path: path.to_path_buf(),
        });
    }
    let header_end = text.iter().position(|&b| b == b'\n').unwrap_or(text.len());
    let header_line = &text[..header_end];
    let sep = opts.separator.unwrap_or_else(|| {
        if header_line.contains(&b',') {
            b','
        } else if header_line.contains(&b';') {
            b';'
        } else if header_line.contains(&b'\t') {
            b'\t'
        } else {
            b','
        }
    });
    let headers: Vec<String> = split_fields(header_line, sep)
        .into_iter()
        .map(unquote)
        .collect();
    let mut plan = make_plan(path, headers, opts)?;
    let after = (header_end + 1).min(text.len());
    let rest = text[after..].to_vec();
    let header_bytes = (buf.len() - rest.len()) as u64;
    // The first data line decides whether the time column holds numbers or timestamps.
    let first = rest.split(|&b| b == b'\n').find(|l| !is_blank(l));
    let Some(first) = first else {
        return Err(DataError::NoRows {
            path: path.to_path_buf(),
        });
    };
    let mut t0 = (0, 0.0);
    if let Some(t) = plan.time.as_mut() {
        let fields = split_fields(first, sep);
        if let Some(field) = fields.get(t.index) {
            let s = String::from_utf8_lossy(field);
            if s.trim().parse::<f64>().is_err() {
                match parse_timestamp_parts(&s) {
                    Some(v) => {
                        t.timestamp = true;
                        t.unit = seconds();
                        t0 = v;
                    }
                    None => {
                        let row = 2 + rest
                            .split(|&b| b == b'\n')
                            .take_while(|l| is_blank(l))
                            .count();
                        return Err(DataError::BadTimestamp {
                            path: path.to_path_buf(),
                            row,
                            column: t.column(),
                            name: t.header.clone(),
                            found: short(field),
                        });
                    }
                }
            }
        }
    }
    let setup = CsvSetup {
        plan: plan.clone(),
        sep,
        rest,
        file,
        header_bytes,
        t0,
    };
    let mut log = layout(&plan, LogFormat::Csv);
    if let Some(t) = log.time.as_mut()
        && plan.time.as_ref().is_some_and(|t| t.timestamp)
    {
        t.start_unix_s = Some(t0.0 as f64 + t0.1);
    }
    let (tx, rx) = sync_channel(1);
    let worker = std::thread::Builder::new()
        .name("gaugebook-log-reader".into())
        .spawn(move || read_blocks(setup, tx))
        .map_err(|e| DataError::io(path, "cannot start the reading thread", e))?;
    Ok(LogStream {
        layout: log,
        total,
        rx: Some(rx),
        worker: Some(worker),
        plan,
    })
}

/// Non-finite values: an error naming the first, or (under `skip_nan`) the rows dropped and
/// listed; shared by CSV and Parquet.
pub(super) fn drop_non_finite(
    plan: &Plan,
    chunk: &mut LogChunk,
    time: &mut Option<Vec<f64>>,
    channels: &mut [Vec<f64>],
) -> Result<(), DataError> {
    let path = &plan.path;
    let cols: Vec<(&ColumnPlan, &Vec<f64>)> = plan
        .time
        .iter()
        .zip(time.iter())
        .chain(plan.channels.iter().zip(channels.iter()))
        .collect();
    let any_bad = cols.iter().any(|(_, v)| v.iter().any(|x| !x.is_finite()));
    if any_bad {
        let n = chunk_len(time, channels);
        let mut bad = vec![false; n];
        for i in 0..n {
            if let Some((c, v)) = cols.iter().find(|(_, v)| !v[i].is_finite()) {
                let row = chunk.row(i);
                if !plan.skip_nan {
                    return Err(DataError::NonFinite {
                        path: path.clone(),
                        row,
                        column: c.column(),
                        name: c.header.clone(),
                        value: v[i],
                    });
                }
                bad[i] = true;
                chunk.skipped.push(SkippedRow {
                    row,
                    column: c.column(),
                    name: c.header.clone(),
                    value: v[i],
                });
            }
        }
        let rows: Vec<usize> = (0..n).filter(|&i| !bad[i]).map(|i| chunk.row(i)).collect();
        let keep = |v: &mut Vec<f64>| {
            let mut k = 0;
            v.retain(|_| {
                let ok = !bad[k];
                k += 1;
                ok
            });
        };
        if let Some(t) = time.as_mut() {
            keep(t);
        }
        channels.iter_mut().for_each(keep);
        chunk.first_row = rows.first().copied().unwrap_or(chunk.first_row);
        chunk.rows = Some(rows);
    }
    Ok(())
}

/// Time must rise from sample to sample, across chunks too (`last` is the previous chunk's
/// last time and row); shared by CSV and Parquet, called on chunks in file order.
pub(super) fn check_time_order(
    plan: &Plan,
    chunk: &LogChunk,
    last: &mut Option<(f64, usize)>,
) -> Result<(), DataError> {
    let (Some(tp), Some(t)) = (plan.time.as_ref(), chunk.time.as_ref()) else {
        return Ok(());
    };
    let mut prev = last.map(|(v, _)| v);
    for (i, &v) in t.iter().enumerate() {
        if let Some(p) = prev
            && v <= p
        {
            return Err(DataError::TimeNotIncreasing {
                path: plan.path.clone(),
                row: chunk.row(i),
                column: tp.column(),
                name: tp.header.clone(),
                previous: p,
                found: v,
            });
        }
        prev = Some(v);
    }
    if let Some(&v) = t.last() {
        *last = Some((v, chunk.row(t.len() - 1)));
    }
    Ok(())
}

fn chunk_len(time: &Option<Vec<f64>>, channels: &[Vec<f64>]) -> usize {
    time.as_ref()
        .map(Vec::len)
        .or_else(|| channels.first().map(Vec::len))
        .unwrap_or(0)
}

// ---------------------------------------------------------------------------------------------
// Parquet

fn parquet_err(path: &Path, e: impl std::fmt::Display) -> DataError {
    DataError::Parquet {
        path: path.to_path_buf(),
        reason: e.to_string(),
    }
}

fn open_parquet(path: &Path, opts: &LogOptions) -> Result<LogStream, DataError> {
    let file = File::open(path).map_err(|e| DataError::io(path, "cannot open", e))?;
    if file.metadata().map(|m| m.len()).unwrap_or(0) == 0 {
        return Err(DataError::Empty {
            path: path.to_path_buf(),
        });
    }
    let mut reader = ParquetReader::new(file);
    let schema = reader.schema().map_err(|e| parquet_err(path, e))?;
    let rows = reader.num_rows().map_err(|e| parquet_err(path, e))?;
    let headers: Vec<String> = schema.iter_names().map(|n| n.to_string()).collect();
    let plan = make_plan(path, headers, opts)?;
    if rows == 0 {
        return Err(DataError::NoRows {
            path: path.to_path_buf(),
        });
    }
    let log = layout(&plan, LogFormat::Parquet);
    let (tx, rx) = sync_channel(1);
    let worker_plan = plan.clone();
    let worker = std::thread::Builder::new()
        .name("gaugebook-log-reader".into())
        .spawn(move || parquet_worker(worker_plan, rows, tx))
        .map_err(|e| DataError::io(path, "cannot start the reading thread", e))?;
    Ok(LogStream {
        layout: log,
        total: rows as u64,
        rx: Some(rx),
        worker: Some(worker),
        plan,
    })
}

fn parquet_worker(plan: Plan, rows: usize, tx: SyncSender<Result<LogChunk, DataError>>) {
    let kept = plan.kept().count().max(1);
    let slice = (plan.block_bytes / (8 * kept)).max(1024);
    let mut offset = 0;
    let mut last_time = None;
    while offset < rows {
        let len = slice.min(rows - offset);
        let result = parquet_slice(&plan, offset, len, &mut last_time);
        let failed = result.is_err();
        if tx.send(result).is_err() || failed {
            return;
        }
        offset += len;
    }
}

fn parquet_slice(
    plan: &Plan,
    offset: usize,
    len: usize,
    last_time: &mut Option<(f64, usize)>,
) -> Result<LogChunk, DataError> {
    let path = &plan.path;
    let file = File::open(path).map_err(|e| DataError::io(path, "cannot open", e))?;
    let names: Vec<String> = plan.kept().map(|c| c.header.clone()).collect();
    let df = ParquetReader::new(file)
        .with_columns(Some(names))
        .with_slice(Some((offset, len)))
        .finish()
        .map_err(|e| parquet_err(path, e))?;
    let first_row = offset + 1;
    let extract = |c: &ColumnPlan| -> Result<Vec<f64>, DataError> {
        let col = df
            .column(c.header.as_str())
            .map_err(|e| parquet_err(path, e))?;
        let col = col.cast(&DataType::Float64).map_err(|e| {
            parquet_err(
                path,
                format!("column {} `{}` is not numeric: {e}", c.column(), c.header),
            )
        })?;
        let ca = col.f64().map_err(|e| parquet_err(path, e))?;
        // Nulls become NaN so that the NaN policy decides about them.
        Ok(ca.iter().map(|v| v.unwrap_or(f64::NAN)).collect())
    };
    let mut time = plan.time.as_ref().map(&extract).transpose()?;
    let mut channels: Vec<Vec<f64>> = plan
        .channels
        .iter()
        .map(&extract)
        .collect::<Result<_, _>>()?;
    drop(df);
    let mut chunk = LogChunk {
        first_row,
        rows: None,
        time: None,
        channels: Vec::new(),
        skipped: Vec::new(),
        done: (offset + len) as u64,
    };
    drop_non_finite(plan, &mut chunk, &mut time, &mut channels)?;
    chunk.time = time;
    chunk.channels = channels;
    check_time_order(plan, &chunk, last_time)?;
    Ok(chunk)
}
