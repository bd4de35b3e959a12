//! The reanalysis pipeline of `../shared/bench/peer_reanalysis.py` in Rust and as a Gaugebook
//! script, and a side-by-side benchmark against that Python peer.
//!
//! ```text
//! cargo run --release --no-default-features --features data --example reanalysis -- pipeline LOG --out-dir DIR [--format csv|parquet] [--block-mib N]
//! cargo run --release --no-default-features --features data,script,plot --example reanalysis -- script LOG --out-dir DIR [--format csv|parquet] [--peer-steps]
//! cargo run --release --no-default-features --features data --example reanalysis -- bare-read LOG
//! cargo run --release --no-default-features --features data --example reanalysis -- read-only LOG
//! cargo run --release --no-default-features --features data --example reanalysis -- compare [--rows 1000000,10000000] [--repeat 3] [--only csv-csv,csv-parquet,parquet-parquet]
//! ```
//!
//! `pipeline` does the peer's steps on `sg1_mVV`…`sg4_mVV`: exact quarter-bridge inverse to
//! microstrain, zero from the mean of the first 1000 samples, a one-way 2nd-order Butterworth
//! low-pass at 50 Hz from a zero state (scipy.signal.sosfilt), statistics, a degree-1 fit of the
//! filtered reference load against filtered sg1 strain, then `<stem>_strain.{csv,parquet}` and
//! `<stem>_summary.json` (schema `bench.reanalysis.summary/1`). The log streams in blocks: the
//! next block is parsed on a reading thread while this one is converted, filtered (four channels
//! through the cascade together) and folded into running statistics and a running line fit
//! (`RunningSummary`, `RunningLine`: per-block sums merged by Chan et al.'s update), and the
//! strain file is written by a third thread as the blocks come, so reading, computing and
//! writing overlap. Only the mean crossings and the fit residuals need the final mean and line:
//! one pass over the kept blocks at the end, on two threads. `timings_s` gives the time the main thread spent in each stage (`read` is the time it
//! waited for blocks; `write` the wait for the writer).
//!
//! `script` runs `examples/reanalysis.rhai`, the same steps written as a Gaugebook script (the
//! log read block by block with `blocks`, running filters, statistics and fit, the strain file
//! on the writer's thread), plus three steps the peer does not take: sg1 strain to load through
//! the fit, rainflow cycles of the load and a figure of it (left out with `--peer-steps`). Its
//! strain file follows the script writers' convention (headers `name [unit]`, columns in name
//! order).
//!
//! `compare` generates the logs into `target/benchdata` with `gen_testlog.py` when missing (with
//! the Parquet copy when a pyarrow Python is found), then runs the peer, this pipeline (and the
//! script, with and without its three extra steps, when built with `script` and `plot`) and bare
//! polars reads, each `--repeat` times under
//! `/usr/bin/time -v` (each after a `sync`, so that no run pays for the writeback of the one
//! before), checks that every summary agrees with the peer's, and prints medians of
//! wall time, CPU time and peak memory, their ratios, and the load average at the runs' starts.

use std::collections::BTreeMap;
use std::fmt::Write as _;
use std::path::{Path, PathBuf};
use std::process::Command;
use std::sync::Arc;
use std::sync::mpsc::sync_channel;
use std::time::Instant;

use gaugebook::units::Frequency;
use gaugebook::{
    Arrangement, ColumnWriter, ExportOptions, FilterBand, LogFormat, LogOptions, RunningLine,
    RunningSummary, SosFilter, StreamingBank, open_log, rising_crossings_in_blocks,
};
use uom::si::frequency::hertz;

/// The binary's allocator, so the benchmark runs as `gaugebook run` does (see `mimalloc` in
/// Cargo.toml).
#[global_allocator]
static ALLOCATOR: mimalloc::MiMalloc = mimalloc::MiMalloc;

type Res<T> = Result<T, Box<dyn std::error::Error>>;

const CHANNELS: [&str; 4] = ["sg1", "sg2", "sg3", "sg4"];

pub fn main() {
    let args: Vec<String> = std::env::args().skip(1).collect();
    let result = match args.first().map(String::as_str) {
        Some("pipeline") => pipeline(&args[1..]),
        Some("bare-read") => bare_read(&args[1..]),
        Some("read-only") => read_only(&args[1..]),
        Some("compare") => compare(&args[1..]),
        #[cfg(all(feature = "script", feature = "plot"))]
        Some("script") => script(&args[1..]),
        _ => Err("usage: reanalysis pipeline LOG --out-dir DIR [--format csv|parquet] | bare-read LOG | compare [--rows N,M]".into()),
    };
    if let Err(e) = result {
        eprintln!("error: {e}");
        std::process::exit(1);
    }
}

fn opt<'a>(args: &'a [String], name: &str) -> Option<&'a str> {
    args.iter()
        .position(|a| a == name)
        .and_then(|i| args.get(i + 1))
        .map(String::as_str)
}

// ---------------------------------------------------------------------------------------------
// The filter step

/// The peer's filter: `scipy.signal.butter(order, cutoff, fs=fs, output="sos")` applied one way
/// from a zero state with `sosfilt`; here the signal module's Butterworth design (same sections
/// as scipy 1.17.1) in a streaming bank: a state per channel carried across blocks, four
/// channels run together.
fn butterworth_lowpass_forward(
    order: usize,
    cutoff_hz: f64,
    fs: f64,
    channels: usize,
) -> Res<StreamingBank> {
    let hz = Frequency::new::<hertz>;
    let f = SosFilter::butterworth(order, FilterBand::LowPass, hz(cutoff_hz), hz(fs))?;
    Ok(StreamingBank::new(f, channels))
}

// ---------------------------------------------------------------------------------------------
// Pipeline

#[derive(Default)]
struct Timings {
    read: f64,
    convert_zero: f64,
    filter: f64,
    stats: f64,
    fit: f64,
    write: f64,
}

fn pipeline(args: &[String]) -> Res<()> {
    let t_all = Instant::now();
    let log = PathBuf::from(args.first().ok_or("pipeline needs a log file")?);
    let out_dir = PathBuf::from(opt(args, "--out-dir").unwrap_or("reanalysis_out"));
    let gf: f64 = opt(args, "--gf").unwrap_or("2.10").parse()?;
    let cutoff: f64 = opt(args, "--cutoff-hz").unwrap_or("50").parse()?;
    let order: usize = opt(args, "--order").unwrap_or("2").parse()?;
    let zero_samples: usize = opt(args, "--zero-samples").unwrap_or("1000").parse()?;
    let format = match opt(args, "--format").unwrap_or("csv") {
        "csv" => LogFormat::Csv,
        "parquet" => LogFormat::Parquet,
        other => return Err(format!("unknown --format {other}, expected csv or parquet").into()),
    };
    std::fs::create_dir_all(&out_dir)?;
    let stem = log
        .file_stem()
        .and_then(|s| s.to_str())
        .ok_or("log name")?
        .to_string();
    let mut tm = Timings::default();

    let keep: Vec<String> = CHANNELS
        .iter()
        .map(|c| format!("{c}_mVV"))
        .chain(["load_ref_N".into()])
        .collect();
    let mut opts = LogOptions::new().keep(keep).time("time_s");
    if let Some(mib) = opt(args, "--block-mib") {
        opts.block_bytes = mib.parse::<usize>()? << 20;
    }
    let mut stream = open_log(&log, &opts)?;
    let inv = Arrangement::Quarter.inverse(gf, 0.3)?;

    // The strain file is written on its own thread as blocks arrive.
    let (ext, decimals) = match format {
        LogFormat::Csv => ("csv", Some(4)),
        LogFormat::Parquet => ("parquet", None),
    };
    let strain_name = format!("{stem}_strain.{ext}");
    let strain_path = out_dir.join(&strain_name);
    let columns: Vec<String> = std::iter::once("time_s".to_string())
        .chain(CHANNELS.iter().map(|c| format!("{c}_ue")))
        .collect();
    let names: Vec<&str> = columns.iter().map(String::as_str).collect();
    let export = ExportOptions {
        format: Some(format),
        decimals,
        protect: vec![log.clone()],
    };
    let mut writer = ColumnWriter::create(&strain_path, &names, &export)?;
    // Blocks are shared with the writer, not copied: the filtered strain stays here for the
    // crossing count, which needs the final mean.
    let (wtx, wrx) = sync_channel::<Vec<Arc<Vec<f64>>>>(2);
    // The error is boxed only to keep clippy's large-variant lint quiet on this thread's result.
    let writer_thread = std::thread::spawn(move || -> Result<u64, Box<gaugebook::DataError>> {
        for block in wrx {
            writer.append_shared(&block).map_err(Box::new)?;
        }
        writer.finish().map_err(Box::new)
    });

    let mut kept: Vec<Vec<Arc<Vec<f64>>>> = vec![Vec::new(); 5];
    // Statistics and the fit gathered block by block (the library's running sums, merged by
    // Chan et al.'s update), so they need no pass over the whole record.
    let mut moments = [RunningSummary::new(); 4];
    let mut fit = RunningLine::new();
    let mut zero: Option<[f64; 4]> = None;
    let mut fs = f64::NAN;
    let mut filters: Option<StreamingBank> = None;
    let mut pending: Vec<gaugebook::LogChunk> = Vec::new();
    let mut first_times: Vec<f64> = Vec::new();
    let mut rows = 0usize;

    let mut t = Instant::now();
    loop {
        let next = stream.next().transpose()?;
        tm.read += t.elapsed().as_secs_f64();
        let at_end = next.is_none();
        if let Some(c) = next {
            pending.push(c);
        }
        // The filter needs the sample rate (first 10 000 samples, as the peer) and the zero
        // (first 1000): hold blocks until both are known.
        let held: usize = pending.iter().map(|c| c.len()).sum();
        if zero.is_none() && held < 10_000.max(zero_samples) && !at_end {
            t = Instant::now();
            continue;
        }
        for mut c in std::mem::take(&mut pending) {
            let t0 = Instant::now();
            let ct = c.time.take().ok_or("no time column")?;
            let n = ct.len();
            let mut ch = std::mem::take(&mut c.channels);
            if zero.is_none() {
                first_times.extend_from_slice(&ct[..n.min(10_000 - first_times.len().min(10_000))]);
            }
            // a) mV/V to microstrain with the exact inverse.
            for v in ch.iter_mut().take(4) {
                for x in v.iter_mut() {
                    *x = inv.apply(*x * 1e-3) * 1e6;
                }
            }
            // b) zero: mean of the first samples (of the first block that is held back until it
            //    has them), and the sample rate from the first 10 000 time steps.
            if zero.is_none() {
                if first_times.len() < 2 || ch[0].len() < zero_samples.min(n) {
                    return Err("too few samples for the zero".into());
                }
                let step =
                    gaugebook::median_step(&first_times).ok_or("too few samples for the rate")?;
                fs = ((1.0 / step) * 1000.0).round() / 1000.0;
                filters = Some(butterworth_lowpass_forward(order, cutoff, fs, 5)?);
                let mut z = [0.0; 4];
                for k in 0..4 {
                    let m = zero_samples.min(ch[k].len());
                    z[k] = pairwise_sum(&ch[k][..m]) / m as f64;
                }
                zero = Some(z);
            }
            let z = zero.ok_or("zero")?;
            for k in 0..4 {
                ch[k].iter_mut().for_each(|x| *x -= z[k]);
            }
            tm.convert_zero += t0.elapsed().as_secs_f64();
            // c) one-way Butterworth, its state carried from block to block.
            let t1 = Instant::now();
            let mut parts: Vec<&mut [f64]> = ch.iter_mut().map(|v| &mut v[..]).collect();
            filters.as_mut().ok_or("filter")?.process(&mut parts)?;
            tm.filter += t1.elapsed().as_secs_f64();
            // d) and e): this block's share of the statistics and of the fit.
            let t2 = Instant::now();
            for k in 0..4 {
                moments[k].add(&ch[k]);
            }
            tm.stats += t2.elapsed().as_secs_f64();
            let t3 = Instant::now();
            fit.add(&ch[0], &ch[4])?;
            tm.fit += t3.elapsed().as_secs_f64();
            let t4 = Instant::now();
            rows += n;
            let mut block = Vec::with_capacity(5);
            block.push(Arc::new(ct));
            for (k, v) in ch.into_iter().enumerate() {
                let v = Arc::new(v);
                kept[k].push(v.clone());
                if k < 4 {
                    block.push(v);
                }
            }
            wtx.send(block).map_err(|_| "the writer thread stopped")?;
            tm.write += t4.elapsed().as_secs_f64();
        }
        if at_end {
            break;
        }
        t = Instant::now();
    }
    drop(wtx);
    drop(stream);

    // e) force = a + b·strain, least squares (numpy.polyfit deg 1), from the merged co-moments.
    let t5 = Instant::now();
    let line = fit.fit()?;
    let (a, b) = (line.intercept, line.slope);
    tm.fit += t5.elapsed().as_secs_f64();

    // d) and e): the crossings need the final mean, and r² and the rmse the residuals about the
    //    fitted line (a second pass keeps them free of the one-pass cancellation): one pass over
    //    the kept blocks, on two threads while the writer finishes.
    let t6 = Instant::now();
    let means: Vec<f64> = moments.iter().map(RunningSummary::mean).collect();
    let (crossings, ss_res) = std::thread::scope(|s| {
        let h = s.spawn(|| {
            let c: Vec<usize> = (2..4)
                .map(|k| rising_crossings_in_blocks(kept[k].iter().map(|b| b.as_slice()), means[k]))
                .collect();
            let res: f64 = kept[0]
                .iter()
                .zip(&kept[4])
                .map(|(x, y)| pairwise_by(x.len(), &|i| (y[i] - (a + b * x[i])).powi(2)))
                .sum();
            (c, res)
        });
        let mut c: Vec<usize> = (0..2)
            .map(|k| rising_crossings_in_blocks(kept[k].iter().map(|b| b.as_slice()), means[k]))
            .collect();
        // A counting thread only panics on a bug; pass that panic on.
        let (c2, res) = h.join().unwrap_or_else(|p| std::panic::resume_unwind(p));
        c.extend(c2);
        (c, res)
    });
    drop(kept);
    let line = fit.fit_with_residuals(ss_res)?;
    let (r2, rmse) = (line.r2, line.rmse);
    let mut stats = String::new();
    let z = zero.ok_or("zero")?;
    for (k, name) in CHANNELS.iter().enumerate() {
        let m = moments[k].summary()?;
        let _ = write!(
            stats,
            "{}    \"{name}\": {{\n      \"zero_offset_ue\": {},\n      \"min_ue\": {},\n      \"max_ue\": {},\n      \"mean_ue\": {},\n      \"std_ue\": {},\n      \"rising_mean_crossings\": {}\n    }}",
            if k > 0 { ",\n" } else { "" },
            num(z[k]),
            num(m.min),
            num(m.max),
            num(m.mean),
            num(m.std_dev),
            crossings[k]
        );
    }
    tm.stats += t6.elapsed().as_secs_f64();

    // f) wait for the strain file.
    let t7 = Instant::now();
    writer_thread
        .join()
        .map_err(|_| "the writer thread panicked")??;
    tm.write += t7.elapsed().as_secs_f64();
    let total_s = t_all.elapsed().as_secs_f64();

    let columns_json: Vec<String> = columns.iter().map(|c| format!("\"{c}\"")).collect();
    let input = log.file_name().and_then(|s| s.to_str()).unwrap_or("");
    let r4 = |v: f64| (v * 1e4).round() / 1e4;
    let summary = format!(
        r#"{{
  "schema": "bench.reanalysis.summary/1",
  "input": "{input}",
  "rows": {rows},
  "sample_rate_hz": {fs},
  "bridge": {{
    "type": "quarter",
    "gauge_factor": {gf},
    "formula": "eps = 4*r/(GF*(1-2*r)), r = mVV/1000, tension positive"
  }},
  "zero": {{
    "method": "mean of first samples",
    "samples": {zero_samples}
  }},
  "filter": {{
    "type": "butterworth_lowpass",
    "order": {order},
    "cutoff_hz": {cutoff},
    "implementation": "scipy.signal.sosfilt",
    "direction": "forward",
    "initial_state": "zero"
  }},
  "strain_unit": "microstrain",
  "channels": {{
{stats}
  }},
  "fit": {{
    "x": "sg1 filtered strain (ue)",
    "y": "load_ref_N (same filter)",
    "model": "force_N = a_N + b_N_per_ue * strain_ue",
    "a_N": {a},
    "b_N_per_ue": {b},
    "r2": {r2},
    "rmse_N": {rmse}
  }},
  "outputs": {{
    "strain_file": "{strain_name}",
    "strain_format": "{ext}",
    "strain_columns": [{cols}]
  }},
  "timings_s": {{
    "read": {tr},
    "convert_zero": {tc},
    "filter": {tf},
    "stats": {ts},
    "fit": {tfi},
    "write": {tw},
    "total": {tt}
  }}
}}
"#,
        fs = num(fs),
        gf = num(gf),
        cutoff = num(cutoff),
        a = num(a),
        b = num(b),
        r2 = num(r2),
        rmse = num(rmse),
        cols = columns_json.join(", "),
        tr = num(r4(tm.read)),
        tc = num(r4(tm.convert_zero)),
        tf = num(r4(tm.filter)),
        ts = num(r4(tm.stats)),
        tfi = num(r4(tm.fit)),
        tw = num(r4(tm.write)),
        tt = num(r4(total_s)),
    );
    let summary_path = out_dir.join(format!("{stem}_summary.json"));
    gaugebook::write_text_atomic(&summary_path, &summary)?;
    println!("{}", summary_path.display());
    Ok(())
}

/// The same pipeline as `examples/reanalysis.rhai`, run in a scripting session: the script reads
/// the log block by block. `--peer-steps` leaves out the three steps beyond the peer's (load,
/// rainflow counts and figure), for a like-for-like time.
#[cfg(all(feature = "script", feature = "plot"))]
fn script(args: &[String]) -> Res<()> {
    use gaugebook::script::rhai::Dynamic;
    use gaugebook::script::{Session, SessionOptions};
    let log = PathBuf::from(args.first().ok_or("script needs a log file")?);
    let out_dir = PathBuf::from(opt(args, "--out-dir").unwrap_or("reanalysis_out"));
    let format = opt(args, "--format").unwrap_or("csv");
    if !matches!(format, "csv" | "parquet") {
        return Err(format!("unknown --format {format}, expected csv or parquet").into());
    }
    std::fs::create_dir_all(&out_dir)?;
    let text = |p: &Path| p.to_string_lossy().into_owned();
    let stem = log
        .file_stem()
        .map(|s| text(Path::new(s)))
        .ok_or("log name")?;
    let input = log
        .file_name()
        .map(|s| text(Path::new(s)))
        .ok_or("log name")?;
    let here = Path::new(env!("CARGO_MANIFEST_DIR")).join("examples");
    let source = std::fs::read_to_string(here.join("reanalysis.rhai"))?;
    let mut session = Session::new(SessionOptions {
        stdlib_dir: None,
        script_dir: Some(here.clone()),
    })?;
    let abs = |p: &Path| std::path::absolute(p).map(|p| text(&p));
    session.set_constant("LOG", Dynamic::from(abs(&log)?));
    session.set_constant("OUT_DIR", Dynamic::from(abs(&out_dir)?));
    session.set_constant("STEM", Dynamic::from(stem));
    session.set_constant("INPUT", Dynamic::from(input));
    session.set_constant("FORMAT", Dynamic::from(format.to_string()));
    let extras = !args.iter().any(|a| a == "--peer-steps");
    session.set_constant("EXTRAS", Dynamic::from(extras));
    session.eval_cell(&source, &text(&here.join("reanalysis.rhai")))?;
    Ok(())
}

/// A JSON number: the shortest text that reads back to the same double (Python's repr too).
fn num(v: f64) -> String {
    if v.is_finite() {
        format!("{v:?}")
    } else {
        "null".into()
    }
}

/// Pairwise summation in numpy's layout (blocks of 128 in 8 lanes; numpy
/// `_multiarray_umath` pairwise_sum, numpy 2.4.6), so means agree with numpy's to round-off.
fn pairwise_sum(x: &[f64]) -> f64 {
    pairwise_by(x.len(), &|i| x[i])
}

/// [`pairwise_sum`] of `f(0) … f(n−1)` without building the array (no 80 MB temporaries).
fn pairwise_by(n: usize, f: &impl Fn(usize) -> f64) -> f64 {
    fn go(lo: usize, hi: usize, f: &impl Fn(usize) -> f64) -> f64 {
        let n = hi - lo;
        if n < 8 {
            return (lo..hi).map(f).fold(0.0, |a, b| a + b);
        }
        if n <= 128 {
            let mut r = [0.0; 8];
            for (k, v) in r.iter_mut().enumerate() {
                *v = f(lo + k);
            }
            let mut i = lo + 8;
            while i + 8 <= hi {
                for (k, v) in r.iter_mut().enumerate() {
                    *v += f(i + k);
                }
                i += 8;
            }
            let mut s = ((r[0] + r[1]) + (r[2] + r[3])) + ((r[4] + r[5]) + (r[6] + r[7]));
            for j in i..hi {
                s += f(j);
            }
            return s;
        }
        let mut half = n / 2;
        half -= half % 8;
        go(lo, lo + half, f) + go(lo + half, hi, f)
    }
    go(0, n, f)
}

// ---------------------------------------------------------------------------------------------
// Bare reads: polars' own CSV reader on the whole file (every column, all threads), and, for
// comparison, Gaugebook's block reader of the pipeline's six columns.

fn bare_read(args: &[String]) -> Res<()> {
    use polars::prelude::*;
    let path = args.first().ok_or("bare-read needs a log file")?;
    let t = Instant::now();
    let df = if path.ends_with(".parquet") {
        ParquetReader::new(std::fs::File::open(path)?).finish()?
    } else {
        CsvReadOptions::default()
            .with_has_header(true)
            .try_into_reader_with_file_path(Some(path.into()))?
            .finish()?
    };
    println!(
        "{} rows, {} columns, {:.3} s",
        df.height(),
        df.width(),
        t.elapsed().as_secs_f64()
    );
    Ok(())
}

fn read_only(args: &[String]) -> Res<()> {
    let path = args.first().ok_or("read-only needs a log file")?;
    let t = Instant::now();
    let keep: Vec<String> = CHANNELS
        .iter()
        .map(|c| format!("{c}_mVV"))
        .chain(["load_ref_N".into()])
        .collect();
    let log = gaugebook::read_log(path, &LogOptions::new().keep(keep).time("time_s"))?;
    println!(
        "{} rows, {} channels + time, {:.3} s",
        log.rows(),
        log.channels.len(),
        t.elapsed().as_secs_f64()
    );
    Ok(())
}

// ---------------------------------------------------------------------------------------------
// Side-by-side comparison

struct Run {
    wall_s: f64,
    cpu_s: f64,
    peak_mib: f64,
    stdout: String,
}

/// The 1-minute load average (other work on the machine changes every timing).
fn load_average() -> f64 {
    std::fs::read_to_string("/proc/loadavg")
        .ok()
        .and_then(|s| s.split_whitespace().next().and_then(|v| v.parse().ok()))
        .unwrap_or(f64::NAN)
}

/// Runs a command under `/usr/bin/time -v` and reads its wall time and peak resident memory.
fn timed(cmd: &[&str], cwd: &Path) -> Res<Run> {
    let out = Command::new("/usr/bin/time")
        .arg("-v")
        .args(cmd)
        .current_dir(cwd)
        .output()?;
    let err = String::from_utf8_lossy(&out.stderr).to_string();
    if !out.status.success() {
        return Err(format!("{} failed: {err}", cmd.join(" ")).into());
    }
    let field = |key: &str| {
        err.lines().find_map(|l| {
            l.trim()
                .strip_prefix(key)
                .map(str::trim)
                .map(str::to_string)
        })
    };
    let wall = field("Elapsed (wall clock) time (h:mm:ss or m:ss):").ok_or("no wall time")?;
    let wall_s = wall
        .split(':')
        .fold(0.0, |acc, p| acc * 60.0 + p.parse::<f64>().unwrap_or(0.0));
    let rss_kb: f64 = field("Maximum resident set size (kbytes):")
        .ok_or("no peak memory")?
        .parse()?;
    let cpu = |key: &str| -> f64 { field(key).and_then(|v| v.parse().ok()).unwrap_or(f64::NAN) };
    Ok(Run {
        wall_s,
        cpu_s: cpu("User time (seconds):") + cpu("System time (seconds):"),
        peak_mib: rss_kb / 1024.0,
        stdout: String::from_utf8_lossy(&out.stdout).trim().to_string(),
    })
}

/// Medians over repeated runs, and the range of the load average seen at their starts.
struct Measured {
    wall_s: f64,
    cpu_s: f64,
    peak_mib: f64,
    load: (f64, f64),
    stdout: String,
}

fn median(mut v: Vec<f64>) -> f64 {
    v.sort_by(f64::total_cmp);
    let n = v.len();
    if n == 0 {
        f64::NAN
    } else if n % 2 == 1 {
        v[n / 2]
    } else {
        0.5 * (v[n / 2 - 1] + v[n / 2])
    }
}

fn measured(cmd: &[&str], cwd: &Path, repeat: usize) -> Res<Measured> {
    let mut runs = Vec::new();
    let mut loads = Vec::new();
    for _ in 0..repeat.max(1) {
        // Every run starts with the disk caught up: without this, a run pays for the writeback
        // of the previous run's output (the peer leaves 400 MB unflushed at 10 M rows).
        let _ = Command::new("sync").status();
        loads.push(load_average());
        runs.push(timed(cmd, cwd)?);
    }
    let lo = loads.iter().copied().fold(f64::INFINITY, f64::min);
    let hi = loads.iter().copied().fold(f64::NEG_INFINITY, f64::max);
    Ok(Measured {
        wall_s: median(runs.iter().map(|r| r.wall_s).collect()),
        cpu_s: median(runs.iter().map(|r| r.cpu_s).collect()),
        peak_mib: median(runs.iter().map(|r| r.peak_mib).collect()),
        load: (lo, hi),
        stdout: runs.pop().map(|r| r.stdout).unwrap_or_default(),
    })
}

fn load_text(m: &Measured) -> String {
    format!("{:.1}–{:.1}", m.load.0, m.load.1)
}

fn compare(args: &[String]) -> Res<()> {
    // Defaults for this machine; each can be overridden from the environment.
    let root = PathBuf::from(env!("CARGO_MANIFEST_DIR"));
    let env_or = |k: &str, d: PathBuf| std::env::var_os(k).map(PathBuf::from).unwrap_or(d);
    let bench = env_or("GAUGEBOOK_PEER_DIR", "/work/shared/bench".into());
    let python = env_or("GAUGEBOOK_PEER_PYTHON", "/work/pyref/bin/python".into());
    let python = python.to_string_lossy().into_owned();
    let arrow_python = env_or(
        "GAUGEBOOK_PEER_ARROW_PYTHON",
        root.join("target/pyarrow-venv/bin/python"),
    );
    let data = env_or("GAUGEBOOK_BENCH_DATA", root.join("target/benchdata"));
    std::fs::create_dir_all(&data)?;
    let me = std::env::current_exe()?;
    let me = me.to_str().ok_or("exe path")?;
    let sizes: Vec<usize> = opt(args, "--rows")
        .unwrap_or("1000000,10000000")
        .split(',')
        .map(|s| s.trim().parse())
        .collect::<Result<_, _>>()?;
    let repeat: usize = opt(args, "--repeat").unwrap_or("3").parse()?;
    // Which comparisons: csv-csv (CSV in, CSV out; the peer without pyarrow), csv-parquet and
    // parquet-parquet (the peer with pyarrow).
    let only: Vec<String> = opt(args, "--only")
        .unwrap_or("csv-csv,csv-parquet,parquet-parquet")
        .split(',')
        .map(str::to_string)
        .collect();
    let arrow = arrow_python.exists();
    println!(
        "medians of {repeat} runs (wall, and CPU = user + system); load = 1-minute load average at the starts of the runs (2 cores)\n"
    );
    println!(
        "| rows | in → out | peer s (CPU s) | peer MiB | load | Gaugebook s (CPU s) | Gaugebook MiB | load | bare CSV read s (CPU s) | bare MiB | load | speed-up | memory ratio | pipeline / bare CSV read (CPU) | bare read of the input, pipeline / it |"
    );
    println!("|---|---|---|---|---|---|---|---|---|---|---|---|---|---|---|");
    let mut notes = Vec::new();
    for rows in sizes {
        let tag = if rows % 1_000_000 == 0 {
            format!("{}M", rows / 1_000_000)
        } else {
            rows.to_string()
        };
        let csv = data.join(format!("testlog_{tag}.csv"));
        let pq = data.join(format!("testlog_{tag}.parquet"));
        let want_pq = arrow && only.iter().any(|o| o.starts_with("parquet"));
        if !csv.exists() || (want_pq && !pq.exists()) {
            // The generator writes the same CSV bytes every time; --parquet adds the copy.
            let gen_py = bench.join("gen_testlog.py");
            let (py, extra) = if want_pq {
                (
                    arrow_python.to_string_lossy().into_owned(),
                    vec!["--parquet"],
                )
            } else {
                (python.clone(), vec![])
            };
            let st = Command::new(&py)
                .args([
                    gen_py.to_str().ok_or("path")?,
                    "--rows",
                    &rows.to_string(),
                    "--out",
                    csv.to_str().ok_or("path")?,
                ])
                .args(extra)
                .status()?;
            if !st.success() {
                return Err("gen_testlog.py failed".into());
            }
        }
        let csv_s = csv.to_str().ok_or("path")?;
        let pq_s = pq.to_str().ok_or("path")?;
        let peer_py = bench.join("peer_reanalysis.py");
        let peer_py = peer_py.to_str().ok_or("path")?;
        let mut bare_csv: Option<Measured> = None;
        let mut bare_pq: Option<Measured> = None;
        for variant in &only {
            let (input, output, py) = match variant.as_str() {
                "csv-csv" => (csv_s, "csv", python.clone()),
                "csv-parquet" if arrow => (
                    csv_s,
                    "parquet",
                    arrow_python.to_string_lossy().into_owned(),
                ),
                "parquet-parquet" if arrow && pq.exists() => {
                    (pq_s, "parquet", arrow_python.to_string_lossy().into_owned())
                }
                _ => continue,
            };
            let in_fmt = if input == pq_s { "parquet" } else { "csv" };
            // The goal is set against a bare read of the CSV; a Parquet input also gets a bare
            // read of itself.
            if bare_csv.is_none() {
                bare_csv = Some(measured(&[me, "bare-read", csv_s], &data, repeat)?);
            }
            if in_fmt == "parquet" && bare_pq.is_none() {
                bare_pq = Some(measured(&[me, "bare-read", pq_s], &data, repeat)?);
            }
            let bare = bare_csv.as_ref().ok_or("bare read")?;
            let bare_in = if in_fmt == "parquet" {
                bare_pq.as_ref().ok_or("bare read")?
            } else {
                bare
            };
            let peer_out = data.join(format!("out_peer_{variant}"));
            let rust_out = data.join(format!("out_rust_{variant}"));
            let peer = measured(
                &[
                    py.as_str(),
                    peer_py,
                    input,
                    "--out-dir",
                    peer_out.to_str().ok_or("path")?,
                ],
                &data,
                repeat,
            )?;
            let ours = measured(
                &[
                    me,
                    "pipeline",
                    input,
                    "--out-dir",
                    rust_out.to_str().ok_or("path")?,
                    "--format",
                    output,
                ],
                &data,
                repeat,
            )?;
            #[cfg_attr(not(all(feature = "script", feature = "plot")), allow(unused_mut))]
            let mut rows_out = vec![("Rust", ours)];
            #[cfg(all(feature = "script", feature = "plot"))]
            for (how, extra) in [
                ("script", None),
                ("script, peer's steps", Some("--peer-steps")),
            ] {
                let script_out = data.join(format!("out_script_{variant}"));
                let mut command = vec![
                    me,
                    "script",
                    input,
                    "--out-dir",
                    script_out.to_str().ok_or("path")?,
                    "--format",
                    output,
                ];
                command.extend(extra);
                rows_out.push((how, measured(&command, &data, repeat)?));
            }
            for (how, ours) in rows_out {
                println!(
                    "| {rows} | {in_fmt} → {output} ({how}) | {:.2} ({:.2}) | {:.0} | {} | {:.2} ({:.2}) | {:.0} | {} | {:.2} ({:.2}) | {:.0} | {} | {:.2}× | {:.2}× | {:.2}× ({:.2}×) | {:.2} s, {:.2}× |",
                    peer.wall_s,
                    peer.cpu_s,
                    peer.peak_mib,
                    load_text(&peer),
                    ours.wall_s,
                    ours.cpu_s,
                    ours.peak_mib,
                    load_text(&ours),
                    bare.wall_s,
                    bare.cpu_s,
                    bare.peak_mib,
                    load_text(bare),
                    peer.wall_s / ours.wall_s,
                    ours.peak_mib / peer.peak_mib,
                    ours.wall_s / bare.wall_s,
                    ours.cpu_s / bare.cpu_s,
                    bare_in.wall_s,
                    ours.wall_s / bare_in.wall_s
                );
                notes.push(check_agreement(
                    rows,
                    &format!("{variant} ({how})"),
                    Path::new(&peer.stdout),
                    Path::new(&ours.stdout),
                )?);
            }
        }
    }
    println!();
    for n in notes {
        println!("{n}");
    }
    Ok(())
}

/// Compares the numbers of two summaries: statistics and fit to a relative 1e-9 (round-off
/// between two summation orders and filter arithmetics), crossing counts within 3.
fn check_agreement(rows: usize, format: &str, peer: &Path, ours: &Path) -> Res<String> {
    let p = Json::parse(&std::fs::read_to_string(peer)?)?;
    let o = Json::parse(&std::fs::read_to_string(ours)?)?;
    let mut worst: (f64, String) = (0.0, String::new());
    let mut crossings = Vec::new();
    let mut keys: Vec<Vec<&str>> = Vec::new();
    for ch in CHANNELS {
        for k in ["zero_offset_ue", "min_ue", "max_ue", "mean_ue", "std_ue"] {
            keys.push(vec!["channels", ch, k]);
        }
        let a = p
            .get(&["channels", ch, "rising_mean_crossings"])
            .and_then(Json::num)
            .ok_or("peer crossings")?;
        let b = o
            .get(&["channels", ch, "rising_mean_crossings"])
            .and_then(Json::num)
            .ok_or("our crossings")?;
        crossings.push(format!("{ch} {a}/{b}"));
        if (a - b).abs() > 3.0 {
            return Err(
                format!("{rows} rows: crossings of {ch} differ: peer {a}, ours {b}").into(),
            );
        }
    }
    for k in ["a_N", "b_N_per_ue", "r2", "rmse_N"] {
        keys.push(vec!["fit", k]);
    }
    keys.push(vec!["sample_rate_hz"]);
    keys.push(vec!["rows"]);
    for key in keys {
        let a = p
            .get(&key)
            .and_then(Json::num)
            .ok_or(format!("peer {key:?}"))?;
        let b = o
            .get(&key)
            .and_then(Json::num)
            .ok_or(format!("our {key:?}"))?;
        let rel = (a - b).abs() / a.abs().max(1e-300);
        // Values near zero (a min near 0 µε) compare absolutely at 1e-9 µε.
        let bad = rel > 1e-9 && (a - b).abs() > 1e-9;
        if rel > worst.0 {
            worst = (rel, key.join("."));
        }
        if bad {
            return Err(format!(
                "{rows} rows ({format}): {} differs: peer {a}, ours {b}",
                key.join(".")
            )
            .into());
        }
    }
    Ok(format!(
        "{rows} rows, {format}: summaries agree (largest relative difference {:.1e} in {}); crossings peer/ours: {}",
        worst.0,
        worst.1,
        crossings.join(", ")
    ))
}

/// Just enough JSON to read the two summaries.
#[derive(Debug)]
enum Json {
    Num(f64),
    Str(String),
    Obj(BTreeMap<String, Json>),
    Other,
}

impl Json {
    fn parse(text: &str) -> Res<Json> {
        let b = text.as_bytes();
        let mut i = 0;
        let v = Json::value(b, &mut i)?;
        Ok(v)
    }

    fn ws(b: &[u8], i: &mut usize) {
        while *i < b.len() && b[*i].is_ascii_whitespace() {
            *i += 1;
        }
    }

    fn value(b: &[u8], i: &mut usize) -> Res<Json> {
        Json::ws(b, i);
        match b.get(*i) {
            Some(b'{') => {
                *i += 1;
                let mut m = BTreeMap::new();
                loop {
                    Json::ws(b, i);
                    if b.get(*i) == Some(&b'}') {
                        *i += 1;
                        return Ok(Json::Obj(m));
                    }
                    let Json::Str(k) = Json::value(b, i)? else {
                        return Err("key".into());
                    };
                    Json::ws(b, i);
                    *i += 1; // ':'
                    let v = Json::value(b, i)?;
                    m.insert(k, v);
                    Json::ws(b, i);
                    if b.get(*i) == Some(&b',') {
                        *i += 1;
                    }
                }
            }
            Some(b'[') => {
                *i += 1;
                loop {
                    Json::ws(b, i);
                    if b.get(*i) == Some(&b']') {
                        *i += 1;
                        // Arrays are read past; the comparison needs none of their items.
                        return Ok(Json::Other);
                    }
                    Json::value(b, i)?;
                    Json::ws(b, i);
                    if b.get(*i) == Some(&b',') {
                        *i += 1;
                    }
                }
            }
            Some(b'"') => {
                *i += 1;
                let start = *i;
                while *i < b.len() && b[*i] != b'"' {
                    *i += if b[*i] == b'\\' { 2 } else { 1 };
                }
                let s = String::from_utf8_lossy(&b[start..*i]).into_owned();
                *i += 1;
                Ok(Json::Str(s))
            }
            Some(_) => {
                let start = *i;
                while *i < b.len()
                    && !matches!(b[*i], b',' | b'}' | b']')
                    && !b[*i].is_ascii_whitespace()
                {
                    *i += 1;
                }
                let t = std::str::from_utf8(&b[start..*i])?;
                Ok(t.parse::<f64>().map(Json::Num).unwrap_or(Json::Other))
            }
            None => Err("unexpected end of JSON".into()),
        }
    }

    fn get(&self, path: &[&str]) -> Option<&Json> {
        let mut v = self;
        for k in path {
            match v {
                Json::Obj(m) => v = m.get(*k)?,
                _ => return None,
            }
        }
        Some(v)
    }

    fn num(&self) -> Option<f64> {
        match self {
            Json::Num(n) => Some(*n),
            Json::Str(_) | Json::Obj(_) | Json::Other => None,
        }
    }
}
