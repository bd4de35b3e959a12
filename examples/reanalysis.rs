//! The reanalysis pipeline of `../shared/bench/peer_reanalysis.py` in Rust, and a side-by-side
//! benchmark against that Python peer.
//!
//! ```text
//! cargo run --release --example reanalysis --features data -- pipeline LOG --out-dir DIR [--format csv|parquet]
//! cargo run --release --example reanalysis --features data -- bare-read LOG
//! cargo run --release --example reanalysis --features data -- compare [--rows 1000000,10000000]
//! ```
//!
//! `pipeline` does the peer's steps on `sg1_mVV`…`sg4_mVV`: exact quarter-bridge inverse to
//! microstrain, zero from the mean of the first 1000 samples, a one-way 2nd-order Butterworth
//! low-pass at 50 Hz from a zero state (scipy.signal.sosfilt), statistics, a degree-1 fit of the
//! filtered reference load against filtered sg1 strain, then `<stem>_strain.{csv,parquet}` and
//! `<stem>_summary.json` (schema `bench.reanalysis.summary/1`). The log streams in blocks: the
//! next block is parsed on a reading thread while this one is converted and filtered, and the
//! strain file is written by a third thread as the blocks come, so reading, computing and writing
//! overlap. `timings_s` therefore gives the time the main thread spent in each stage (`read` is
//! the time it waited for blocks; `write` the wait for the writer to finish after the last block).
//!
//! `compare` generates the logs into `target/benchdata` with `gen_testlog.py` when missing, runs
//! the peer, this pipeline and a bare polars read of the same CSV each under `/usr/bin/time -v`,
//! checks that the summaries agree, and prints wall-time and peak-memory ratios.

use std::collections::BTreeMap;
use std::fmt::Write as _;
use std::path::{Path, PathBuf};
use std::process::Command;
use std::sync::mpsc::sync_channel;
use std::time::Instant;

use gaugebook::units::Frequency;
use gaugebook::{
    Arrangement, ColumnWriter, ExportOptions, FilterBand, LogFormat, LogOptions, SosFilter,
    StreamingFilter, open_log,
};
use uom::si::frequency::hertz;

type Res<T> = Result<T, Box<dyn std::error::Error>>;

const CHANNELS: [&str; 4] = ["sg1", "sg2", "sg3", "sg4"];

pub fn main() {
    let args: Vec<String> = std::env::args().skip(1).collect();
    let result = match args.first().map(String::as_str) {
        Some("pipeline") => pipeline(&args[1..]),
        Some("bare-read") => bare_read(&args[1..]),
        Some("read-only") => read_only(&args[1..]),
        Some("compare") => compare(&args[1..]),
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
/// as scipy 1.17.1) and its streaming filter, whose state carries across blocks.
fn butterworth_lowpass_forward(order: usize, cutoff_hz: f64, fs: f64) -> Res<StreamingFilter> {
    let hz = Frequency::new::<hertz>;
    let f = SosFilter::butterworth(order, FilterBand::LowPass, hz(cutoff_hz), hz(fs))?;
    Ok(StreamingFilter::new(f))
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
    let opts = LogOptions::new().keep(keep).time("time_s");
    let stream = open_log(&log, &opts)?;
    let total = stream.total();
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
    let (wtx, wrx) = sync_channel::<Vec<Vec<f64>>>(2);
    let writer_thread = std::thread::spawn(move || -> Result<u64, gaugebook::DataError> {
        for block in wrx {
            let parts: Vec<&[f64]> = block.iter().map(Vec::as_slice).collect();
            writer.append(&parts)?;
        }
        writer.finish()
    });

    let mut time: Vec<f64> = Vec::new();
    let mut filt: Vec<Vec<f64>> = vec![Vec::new(); 4];
    let mut load: Vec<f64> = Vec::new();
    let mut zero: Option<[f64; 4]> = None;
    let mut fs = f64::NAN;
    let mut filters: Vec<StreamingFilter> = Vec::new();
    let mut pending: Vec<gaugebook::LogChunk> = Vec::new();
    let mut rows = 0usize;

    let mut t = Instant::now();
    let mut stream = stream;
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
            if reserve_once(&mut time, n, c.done, total) {
                for v in filt.iter_mut().chain(std::iter::once(&mut load)) {
                    v.reserve_exact(time.capacity());
                }
            }
            time.extend_from_slice(&ct);
            let mut ch = std::mem::take(&mut c.channels);
            // a) mV/V to microstrain with the exact inverse.
            for v in ch.iter_mut().take(4) {
                for x in v.iter_mut() {
                    *x = inv.apply(*x * 1e-3) * 1e6;
                }
            }
            // b) zero: mean of the first samples, known from the first block.
            if zero.is_none() {
                if time.len() < 2 || ch[0].len() < zero_samples.min(n) {
                    return Err("too few samples for the zero".into());
                }
                let steps = &time[..time.len().min(10_000)];
                let step = gaugebook::median_step(steps).ok_or("too few samples for the rate")?;
                fs = ((1.0 / step) * 1000.0).round() / 1000.0;
                filters = (0..5)
                    .map(|_| butterworth_lowpass_forward(order, cutoff, fs))
                    .collect::<Res<_>>()?;
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
            // c) one-way Butterworth.
            let t1 = Instant::now();
            for (v, f) in ch.iter_mut().zip(filters.iter_mut()) {
                f.process(v)?;
            }
            tm.filter += t1.elapsed().as_secs_f64();
            let t2 = Instant::now();
            for k in 0..4 {
                filt[k].extend_from_slice(&ch[k]);
            }
            load.extend_from_slice(&ch[4]);
            rows += n;
            let mut block = Vec::with_capacity(5);
            block.push(ct);
            block.extend(ch.into_iter().take(4));
            wtx.send(block).map_err(|_| "the writer thread stopped")?;
            tm.write += t2.elapsed().as_secs_f64();
        }
        if at_end {
            break;
        }
        t = Instant::now();
    }
    drop(wtx);

    // d) statistics.
    let t3 = Instant::now();
    let mut stats = String::new();
    for (k, name) in CHANNELS.iter().enumerate() {
        let x = &filt[k];
        let n = x.len() as f64;
        let mean = pairwise_sum(x) / n;
        let (mut lo, mut hi) = (f64::INFINITY, f64::NEG_INFINITY);
        for &v in x {
            lo = lo.min(v);
            hi = hi.max(v);
        }
        let std = (pairwise_by(x.len(), &|i| (x[i] - mean) * (x[i] - mean)) / (n - 1.0)).sqrt();
        let crossings = x.windows(2).filter(|w| w[0] < mean && mean <= w[1]).count();
        let z = zero.ok_or("zero")?[k];
        let _ = write!(
            stats,
            "{}    \"{name}\": {{\n      \"zero_offset_ue\": {},\n      \"min_ue\": {},\n      \"max_ue\": {},\n      \"mean_ue\": {},\n      \"std_ue\": {},\n      \"rising_mean_crossings\": {crossings}\n    }}",
            if k > 0 { ",\n" } else { "" },
            num(z),
            num(lo),
            num(hi),
            num(mean),
            num(std)
        );
    }
    tm.stats = t3.elapsed().as_secs_f64();

    // e) force = a + b·strain, least squares (numpy.polyfit deg 1), r² and rmse.
    let t4 = Instant::now();
    let (x, y) = (&filt[0], &load);
    let n = x.len() as f64;
    let (xm, ym) = (pairwise_sum(x) / n, pairwise_sum(y) / n);
    let sxy = pairwise_by(x.len(), &|i| (x[i] - xm) * (y[i] - ym));
    let sxx = pairwise_by(x.len(), &|i| (x[i] - xm) * (x[i] - xm));
    let b = sxy / sxx;
    let a = ym - b * xm;
    let ss_res = pairwise_by(x.len(), &|i| (y[i] - (a + b * x[i])).powi(2));
    let syy = pairwise_by(y.len(), &|i| (y[i] - ym) * (y[i] - ym));
    let r2 = 1.0 - ss_res / syy;
    let rmse = (ss_res / n).sqrt();
    tm.fit = t4.elapsed().as_secs_f64();

    // f) wait for the strain file.
    let t5 = Instant::now();
    writer_thread
        .join()
        .map_err(|_| "the writer thread panicked")??;
    tm.write += t5.elapsed().as_secs_f64();
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

/// Reserves the expected final length once (from the share of the file read so far).
fn reserve_once(v: &mut Vec<f64>, n: usize, done: u64, total: u64) -> bool {
    if v.capacity() == 0 && done > 0 {
        v.reserve_exact((n as f64 * total as f64 / done as f64 * 1.01) as usize + 16);
        return true;
    }
    false
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
    let df = CsvReadOptions::default()
        .with_has_header(true)
        .try_into_reader_with_file_path(Some(path.into()))?
        .finish()?;
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
    peak_mib: f64,
    stdout: String,
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
    Ok(Run {
        wall_s,
        peak_mib: rss_kb / 1024.0,
        stdout: String::from_utf8_lossy(&out.stdout).trim().to_string(),
    })
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
    println!(
        "| rows | output | peer wall s | peer MiB | rust wall s | rust MiB | bare read s | bare MiB | speed-up | memory ratio | pipeline / bare read |"
    );
    println!("|---|---|---|---|---|---|---|---|---|---|---|");
    let mut notes = Vec::new();
    for rows in sizes {
        let tag = if rows % 1_000_000 == 0 {
            format!("{}M", rows / 1_000_000)
        } else {
            rows.to_string()
        };
        let csv = data.join(format!("testlog_{tag}.csv"));
        if !csv.exists() {
            let gen_py = bench.join("gen_testlog.py");
            let st = Command::new(&python)
                .args([
                    gen_py.to_str().ok_or("path")?,
                    "--rows",
                    &rows.to_string(),
                    "--out",
                    csv.to_str().ok_or("path")?,
                ])
                .status()?;
            if !st.success() {
                return Err("gen_testlog.py failed".into());
            }
        }
        let csv_s = csv.to_str().ok_or("path")?;
        let peer_py = bench.join("peer_reanalysis.py");
        let peer_py = peer_py.to_str().ok_or("path")?;
        let mut variants = vec![("csv", python.clone(), data.join("out_peer_csv"))];
        if arrow_python.exists() {
            variants.push((
                "parquet",
                arrow_python.to_string_lossy().into_owned(),
                data.join("out_peer_parquet"),
            ));
        }
        let bare = timed(&[me, "bare-read", csv_s], &data)?;
        let ro = timed(&[me, "read-only", csv_s], &data)?;
        notes.push(format!(
            "{rows} rows: bare polars read (all 7 columns) {:.2} s, {:.0} MiB; Gaugebook read_log of the 6 pipeline columns {:.2} s, {:.0} MiB",
            bare.wall_s, bare.peak_mib, ro.wall_s, ro.peak_mib
        ));
        for (format, py, peer_out) in variants {
            let rust_out = data.join(format!("out_rust_{format}"));
            let peer = timed(
                &[
                    py.as_str(),
                    peer_py,
                    csv_s,
                    "--out-dir",
                    peer_out.to_str().ok_or("path")?,
                ],
                &data,
            )?;
            let ours = timed(
                &[
                    me,
                    "pipeline",
                    csv_s,
                    "--out-dir",
                    rust_out.to_str().ok_or("path")?,
                    "--format",
                    format,
                ],
                &data,
            )?;
            println!(
                "| {rows} | {format} | {:.2} | {:.0} | {:.2} | {:.0} | {:.2} | {:.0} | {:.2}x | {:.2}x | {:.2}x |",
                peer.wall_s,
                peer.peak_mib,
                ours.wall_s,
                ours.peak_mib,
                bare.wall_s,
                bare.peak_mib,
                peer.wall_s / ours.wall_s,
                ours.peak_mib / peer.peak_mib,
                ours.wall_s / bare.wall_s
            );
            notes.push(check_agreement(
                rows,
                format,
                Path::new(&peer.stdout),
                Path::new(&ours.stdout),
            )?);
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
            worst = (rel, format!("{}", key.join(".")));
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
