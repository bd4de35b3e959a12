//! Cutting a CSV file into blocks of whole lines and reading them on several threads at once,
//! handing the chunks on in file order.
//!
//! Reading the numbers of a block takes several times as long as reading its bytes from the
//! file, so one thread reads bytes and cuts blocks while `workers` threads turn blocks into
//! chunks. A worker that has finished a block waits for its turn (blocks leave in file order),
//! checks time order against the previous block there, and sends the chunk on. The text buffers
//! go back to the cutting thread, so the file is read into the same pages again and again (fresh
//! pages for every block cost a page fault each: a measurable share of the reading time on the
//! machines this was measured on).

use std::fs::File;
use std::io::Read;
use std::path::Path;
use std::sync::mpsc::{Receiver, SyncSender, sync_channel};
use std::sync::{Arc, Condvar, Mutex};

use super::csv_lines::LineFormat;
use super::plan::Plan;
use super::stream::{check_time_order, drop_non_finite};
use super::{DataError, LogChunk};

/// A CSV file with its header read, ready for its data lines.
pub(crate) struct CsvSetup {
    pub plan: Plan,
    pub sep: u8,
    /// Bytes after the header line that were read while looking at the header.
    pub rest: Vec<u8>,
    pub file: File,
    pub header_bytes: u64,
    /// The first timestamp (whole seconds, fraction) when the time column holds timestamps.
    pub t0: (i64, f64),
}

/// Appends up to `want` bytes of the file to `buf`; the count read (less than `want` only at
/// the end of the file).
pub(crate) fn read_some(
    file: &mut File,
    buf: &mut Vec<u8>,
    want: usize,
    path: &Path,
) -> Result<usize, DataError> {
    // `take` + `read_to_end` reads into the spare capacity without zero-filling it first, and
    // retries on `Interrupted`.
    let start = buf.len();
    buf.reserve(want);
    let mut part = Read::by_ref(file).take(want as u64);
    part.read_to_end(buf)
        .map_err(|e| DataError::io(path, "cannot read", e))?;
    Ok(buf.len() - start)
}

/// One block of whole lines for a worker.
struct Job {
    seq: usize,
    text: Vec<u8>,
    first_row: usize,
    /// Bytes of the file consumed up to the end of this block, for progress.
    done: u64,
}

/// Whose turn it is to send, and what the order check needs from the block before.
struct Turn {
    next: usize,
    last_time: Option<(f64, usize)>,
    /// Set when the consumer hung up or a block failed: every worker stops.
    stopped: bool,
}

/// Threads that read numbers: as many as there are cores, at most four (the cutting thread
/// and the consumer need some of the machine too, and beyond four blocks in flight memory
/// grows without gain).
fn worker_count() -> usize {
    std::thread::available_parallelism().map_or(1, |n| n.get().min(4))
}

/// Reads the file's data lines into chunks sent on `tx` in file order; runs on the log's
/// reading thread until the file ends, a block fails or the receiver hangs up.
pub(crate) fn read_blocks(mut s: CsvSetup, tx: SyncSender<Result<LogChunk, DataError>>) {
    let format = LineFormat::new(&s.plan, s.sep, s.t0);
    let workers = worker_count();
    let turn = (
        Mutex::new(Turn {
            next: 0,
            last_time: None,
            stopped: false,
        }),
        Condvar::new(),
    );
    let (job_tx, job_rx) = sync_channel::<Job>(workers);
    // Shared by the workers only: when the last one stops, the cutting thread's next send
    // fails and it stops too.
    let job_rx = Arc::new(Mutex::new(job_rx));
    // Free text buffers: one per worker, one being filled, one queued.
    let (free_tx, free_rx) = sync_channel::<Vec<u8>>(workers + 2);
    for _ in 0..workers + 1 {
        let _ = free_tx.send(Vec::new());
    }
    let plan = s.plan.clone();
    std::thread::scope(|scope| {
        for _ in 0..workers {
            let (format, plan, turn, job_rx, tx, free_tx) = (
                &format,
                &plan,
                &turn,
                job_rx.clone(),
                tx.clone(),
                free_tx.clone(),
            );
            scope.spawn(move || work(format, plan, turn, &job_rx, &tx, &free_tx));
        }
        drop((free_tx, job_rx));
        cut(&mut s, &tx, &job_tx, &free_rx, &turn);
        drop(job_tx);
    });
}

/// The cutting thread's part: fill a free buffer with the unfinished line of the last block and
/// the next bytes of the file, cut it after its last line end and queue it.
fn cut(
    s: &mut CsvSetup,
    tx: &SyncSender<Result<LogChunk, DataError>>,
    jobs: &SyncSender<Job>,
    free: &Receiver<Vec<u8>>,
    turn: &(Mutex<Turn>, Condvar),
) {
    let path = s.plan.path.clone();
    let mut carry = std::mem::take(&mut s.rest);
    let mut first_row = 2usize;
    let mut done = s.header_bytes;
    for seq in 0.. {
        let Ok(mut buf) = free.recv() else { return };
        buf.clear();
        buf.extend_from_slice(&carry);
        let mut at_end = false;
        let whole = loop {
            let want = s.plan.block_bytes.saturating_sub(buf.len()).max(4096);
            let got = match read_some(&mut s.file, &mut buf, want, &path) {
                Ok(g) => g,
                Err(e) => {
                    // Deliver the error in its turn, after the blocks before it.
                    if wait_turn(turn, seq) {
                        let _ = tx.send(Err(e));
                    }
                    stop(turn);
                    return;
                }
            };
            if got < want {
                at_end = true;
                break buf.len();
            }
            // A line longer than a block: read on until it ends.
            if let Some(p) = memchr::memrchr(b'\n', &buf) {
                break p + 1;
            }
        };
        if buf.is_empty() {
            return;
        }
        carry.clear();
        carry.extend_from_slice(&buf[whole..]);
        buf.truncate(whole);
        let lines =
            memchr::memchr_iter(b'\n', &buf).count() + usize::from(buf.last() != Some(&b'\n'));
        done += whole as u64;
        let job = Job {
            seq,
            text: buf,
            first_row,
            done,
        };
        first_row += lines;
        if jobs.send(job).is_err() || at_end {
            return;
        }
    }
}

/// Waits until block `seq` may send; false when the reading has stopped.
fn wait_turn(turn: &(Mutex<Turn>, Condvar), seq: usize) -> bool {
    let cv = &turn.1;
    let mut t = lock_turn(turn);
    while t.next != seq && !t.stopped {
        t = cv.wait(t).unwrap_or_else(|p| p.into_inner());
    }
    !t.stopped
}

fn stop(turn: &(Mutex<Turn>, Condvar)) {
    lock_turn(turn).stopped = true;
    turn.1.notify_all();
}

/// The turn, also after a worker panicked holding it (the panic reaches the consumer as a
/// stopped reading thread; the others only need to see `stopped` or their turn).
fn lock_turn(turn: &(Mutex<Turn>, Condvar)) -> std::sync::MutexGuard<'_, Turn> {
    turn.0.lock().unwrap_or_else(|p| p.into_inner())
}

/// A worker: take a block, read it, return the buffer, then send the chunk in its turn.
fn work(
    format: &LineFormat,
    plan: &Plan,
    turn: &(Mutex<Turn>, Condvar),
    jobs: &Mutex<Receiver<Job>>,
    tx: &SyncSender<Result<LogChunk, DataError>>,
    free: &SyncSender<Vec<u8>>,
) {
    loop {
        let job = {
            let rx = jobs.lock().unwrap_or_else(|p| p.into_inner());
            rx.recv()
        };
        let Ok(job) = job else { return };
        if lock_turn(turn).stopped {
            return;
        }
        let mut result = read_block(plan, format, &job.text, job.first_row);
        let _ = free.send(job.text);
        let cv = &turn.1;
        let mut t = lock_turn(turn);
        while t.next != job.seq && !t.stopped {
            t = cv.wait(t).unwrap_or_else(|p| p.into_inner());
        }
        if t.stopped {
            return;
        }
        if let Ok(chunk) = result.as_mut() {
            chunk.done = job.done;
            if let Err(e) = check_time_order(plan, chunk, &mut t.last_time) {
                result = Err(e);
            }
        }
        let failed = result.is_err();
        // Sent while holding the turn, so chunks leave in order; the others wait for it anyway.
        if tx.send(result).is_err() || failed {
            t.stopped = true;
        }
        t.next += 1;
        drop(t);
        cv.notify_all();
    }
}

/// One block of whole lines into a chunk (non-finite values handled; time order is checked in
/// turn).
fn read_block(
    plan: &Plan,
    format: &LineFormat,
    block: &[u8],
    first_row: usize,
) -> Result<LogChunk, DataError> {
    // About 60 bytes make a line of a typical log; reserving for 32 avoids regrowing.
    let guess = block.len() / 32 + 16;
    let mut columns: Vec<Vec<f64>> = (0..format.outputs())
        .map(|_| Vec::with_capacity(guess))
        .collect();
    let read = format.read(block, first_row, &mut columns)?;
    let mut time = None;
    let mut channels = columns;
    if plan.time.is_some() {
        time = Some(channels.remove(0));
    }
    let mut chunk = LogChunk {
        first_row,
        rows: read.rows,
        time: None,
        channels: Vec::new(),
        skipped: Vec::new(),
        done: 0,
    };
    if read.non_finite {
        drop_non_finite(plan, &mut chunk, &mut time, &mut channels)?;
    }
    chunk.time = time;
    chunk.channels = channels;
    Ok(chunk)
}
