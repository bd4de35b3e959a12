//! Deterministic test logs for the example notebooks: a calibration, creep and temperature test
//! of an invented 500 N load cell, and a fatigue log of an invented bracket under block loading.
//!
//! Everything here is invented for the examples; no record of a real instrument is behind it.
//! Each log is built from a stated model ([`ExampleCell`], [`ExampleSpectrum`]) with known
//! nonlinearity, hysteresis, creep and temperature coefficients, plus Gaussian noise from a
//! xoshiro256++ stream with a fixed seed, so that a reanalysis can be checked against the
//! figures that were put in, and so that the files are the same bytes on every run. xoshiro's
//! output is fixed by its published algorithm (Blackman and Vigna, 2018), unlike rand's
//! `StdRng`, whose algorithm may change between releases.
//!
//! Simplifications, stated so that nobody reads more into the data than is there:
//! - creep is modelled in the creep hold only; the 40 s calibration holds are taken as
//!   creep-free (a real cell creeps a little in every hold and its hysteresis shows some of it);
//! - nonlinearity and hysteresis are parabolic in the load fraction x = F/Fmax:
//!   sag −N·RO·4x(1−x) on every reading, and +H·RO·4x(1−x) added on descending readings only;
//! - temperature acts linearly on zero and span about the reference temperature;
//! - the load channel is the invented deadweight machine's nominal force (exact at the holds,
//!   linear in the ramps); the thermometer carries its own small noise.
//!
//! CSV headers state their units (`time [s]`, `load [N]`, `sg_out [mV/V]`, `temp [°C]`,
//! `strain [µε]`) as the log import reads them. Numbers are written with fixed decimals through
//! Rust's correctly rounded formatting, so the text depends only on the generated values.

use std::fmt::Write as _;
use std::io;
use std::path::{Path, PathBuf};

use rand::SeedableRng;
use rand_distr::{Distribution, Normal};
use rand_xoshiro::Xoshiro256PlusPlus;

/// The built-in truth of the invented 500 N load cell behind the calibration, creep and
/// temperature logs. All figures of merit are in % of rated output (% RO) unless stated.
///
/// ```
/// let c = gaugebook::EXAMPLE_CELL;
/// assert_eq!(c.capacity_n, 500.0);
/// assert_eq!(c.reading(0.0, c.reference_temp_c, false, 0.0), c.zero_balance_mv_v);
/// ```
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct ExampleCell {
    /// Rated capacity, N.
    pub capacity_n: f64,
    /// Rated output at the reference temperature, mV/V (reading at capacity minus zero).
    pub rated_output_mv_v: f64,
    /// Zero balance at the reference temperature, mV/V.
    pub zero_balance_mv_v: f64,
    /// Terminal nonlinearity at half capacity (a sag), % RO.
    pub nonlinearity_pct_ro: f64,
    /// Hysteresis at half capacity (descending reads higher), % RO.
    pub hysteresis_pct_ro: f64,
    /// Span change of the second series against the first (non-repeatability at capacity), % RO.
    pub repeat_span_pct_ro: f64,
    /// Span change after the mounting rotation (third series), % RO.
    pub rotation_span_pct_ro: f64,
    /// Zero shift after the mounting rotation (third series), mV/V.
    pub rotation_zero_mv_v: f64,
    /// Mounting rotation of the third series, degrees.
    pub rotation_deg: f64,
    /// Creep over the 30 min hold at capacity, % RO.
    pub creep_pct_ro: f64,
    /// Time constant of the exponential creep and its recovery, s.
    pub creep_tau_s: f64,
    /// Temperature coefficient of zero, % RO per K.
    pub tc_zero_pct_ro_per_k: f64,
    /// Temperature coefficient of span, % per K.
    pub tc_span_pct_per_k: f64,
    /// Reference temperature, °C.
    pub reference_temp_c: f64,
    /// Standard deviation of the bridge-output noise per sample, mV/V.
    pub noise_mv_v: f64,
    /// Standard deviation of the reference-load channel's noise, N (zero: the log records the
    /// deadweight machine's nominal force).
    pub load_noise_n: f64,
    /// Standard deviation of the thermometer's noise, K.
    pub temp_noise_k: f64,
}

/// The invented 500 N load cell of the example notebooks (a plausible OIML class C cell; the
/// values are chosen for the example, not taken from any instrument).
///
/// ```
/// let c = gaugebook::EXAMPLE_CELL;
/// assert_eq!(c.capacity_n, 500.0);
/// assert!(gaugebook::calibration_log().contains(",500.000,")); // the log reaches capacity
/// ```
pub const EXAMPLE_CELL: ExampleCell = ExampleCell {
    capacity_n: 500.0,
    rated_output_mv_v: 1.9950,
    zero_balance_mv_v: 0.0120,
    nonlinearity_pct_ro: 0.012,
    hysteresis_pct_ro: 0.010,
    repeat_span_pct_ro: 0.002,
    rotation_span_pct_ro: 0.006,
    rotation_zero_mv_v: 0.0004,
    rotation_deg: 120.0,
    creep_pct_ro: 0.015,
    creep_tau_s: 420.0,
    tc_zero_pct_ro_per_k: 0.0015,
    tc_span_pct_per_k: 0.0010,
    reference_temp_c: 23.0,
    noise_mv_v: 0.00004,
    load_noise_n: 0.0,
    temp_noise_k: 0.02,
};

impl ExampleCell {
    /// The noise-free reading (mV/V) at `load_n` and cell temperature `temp_c`, on a descending
    /// branch or not, with `extra_span_pct_ro` added to the span (series and mounting effects).
    ///
    /// ```
    /// let c = gaugebook::EXAMPLE_CELL;
    /// let t = c.reference_temp_c;
    /// let ro = c.reading(500.0, t, false, 0.0) - c.reading(0.0, t, false, 0.0);
    /// assert!((ro - c.rated_output_mv_v).abs() < 1e-12);
    /// // The descending reading at half capacity is higher by the hysteresis.
    /// let h = c.reading(250.0, t, true, 0.0) - c.reading(250.0, t, false, 0.0);
    /// assert!((h / ro * 100.0 - c.hysteresis_pct_ro).abs() < 1e-9);
    /// ```
    pub fn reading(
        &self,
        load_n: f64,
        temp_c: f64,
        descending: bool,
        extra_span_pct_ro: f64,
    ) -> f64 {
        let ro = self.rated_output_mv_v;
        let x = load_n / self.capacity_n;
        let bow = 4.0 * x * (1.0 - x);
        let dt = temp_c - self.reference_temp_c;
        let span = ro * (1.0 + self.tc_span_pct_per_k / 100.0 * dt + extra_span_pct_ro / 100.0);
        let zero = self.zero_balance_mv_v + self.tc_zero_pct_ro_per_k / 100.0 * ro * dt;
        let sag = -self.nonlinearity_pct_ro / 100.0 * ro * bow;
        let hyst = if descending {
            self.hysteresis_pct_ro / 100.0 * ro * bow
        } else {
            0.0
        };
        zero + span * x + sag + hyst
    }

    /// Indication change from the end of loading to `t_s` seconds later under constant load
    /// (the creep curve, mV/V): exponential, scaled so that it reaches `creep_pct_ro` at 30 min.
    ///
    /// ```
    /// let c = gaugebook::EXAMPLE_CELL;
    /// let at30 = c.creep_at(1800.0) / c.rated_output_mv_v * 100.0;
    /// assert!((at30 - c.creep_pct_ro).abs() < 1e-12);
    /// assert_eq!(c.creep_at(0.0), 0.0);
    /// ```
    pub fn creep_at(&self, t_s: f64) -> f64 {
        let full = self.creep_pct_ro / 100.0 * self.rated_output_mv_v;
        full * (1.0 - (-t_s / self.creep_tau_s).exp())
            / (1.0 - (-CREEP_HOLD_S / self.creep_tau_s).exp())
    }

    /// The zero's offset `t_s` seconds after unloading from the 30 min creep hold (creep
    /// recovery, mV/V): the creep at 30 min decaying with the same time constant.
    ///
    /// ```
    /// let c = gaugebook::EXAMPLE_CELL;
    /// assert_eq!(c.recovery_at(0.0), c.creep_at(1800.0));
    /// assert!(c.recovery_at(1800.0) < 0.02 * c.creep_at(1800.0));
    /// ```
    pub fn recovery_at(&self, t_s: f64) -> f64 {
        self.creep_at(CREEP_HOLD_S) * (-t_s / self.creep_tau_s).exp()
    }
}

/// Length of the creep hold at capacity, s (30 min: OIML R 60 and common practice).
const CREEP_HOLD_S: f64 = 1800.0;

/// The block-loading spectrum behind the fatigue log: a strain channel on the web of an invented
/// sprayer-boom hinge bracket, loaded on a rig in repeated blocks of sinusoidal cycles.
///
/// ```
/// let s = gaugebook::EXAMPLE_SPECTRUM;
/// assert_eq!(s.sample_rate_hz, 1000.0);
/// // Each repeat lasts its blocks' cycles at the loading frequency plus the dwell.
/// let cycles: u32 = s.blocks.iter().map(|b| b.1).sum();
/// assert_eq!(cycles as f64 / s.cycle_hz + s.dwell_s, s.repeat_s());
/// ```
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct ExampleSpectrum {
    /// Sampling rate, Hz.
    pub sample_rate_hz: f64,
    /// Loading frequency of every block, Hz.
    pub cycle_hz: f64,
    /// Mean strain, µε.
    pub mean_ue: f64,
    /// Blocks of one repeat: (amplitude in µε, number of cycles).
    pub blocks: [(f64, u32); 4],
    /// Dwell at the mean strain at the end of each repeat, s.
    pub dwell_s: f64,
    /// Number of repeats of the block sequence.
    pub repeats: u32,
    /// Amplitude of the mains hum picked up by the gauge leads, µε.
    pub hum_ue: f64,
    /// Frequency of the hum, Hz.
    pub hum_hz: f64,
    /// Standard deviation of the broadband noise, µε.
    pub noise_ue: f64,
}

/// The spectrum of the example fatigue log.
///
/// ```
/// let s = gaugebook::EXAMPLE_SPECTRUM;
/// let cycles: u32 = s.blocks.iter().map(|b| b.1).sum();
/// assert_eq!(cycles, 74);
/// assert!(gaugebook::fatigue_log().starts_with("time"));
/// ```
pub const EXAMPLE_SPECTRUM: ExampleSpectrum = ExampleSpectrum {
    sample_rate_hz: 1000.0,
    cycle_hz: 5.0,
    mean_ue: 300.0,
    blocks: [(100.0, 40), (200.0, 20), (300.0, 10), (400.0, 4)],
    dwell_s: 0.2,
    repeats: 4,
    hum_ue: 12.0,
    hum_hz: 50.0,
    noise_ue: 6.0,
};

impl ExampleSpectrum {
    /// Duration of one repeat of the block sequence, s.
    ///
    /// ```
    /// assert_eq!(gaugebook::EXAMPLE_SPECTRUM.repeat_s(), 15.0);
    /// ```
    pub fn repeat_s(&self) -> f64 {
        let cycles: u32 = self.blocks.iter().map(|b| b.1).sum();
        f64::from(cycles) / self.cycle_hz + self.dwell_s
    }

    /// The noise-free strain (µε) at time `t_s`.
    ///
    /// ```
    /// let s = gaugebook::EXAMPLE_SPECTRUM;
    /// assert_eq!(s.strain_at(0.0), s.mean_ue);
    /// // A quarter cycle into the first block: the peak of its first cycle.
    /// assert!((s.strain_at(0.05) - (s.mean_ue + s.blocks[0].0)).abs() < 1e-9);
    /// ```
    pub fn strain_at(&self, t_s: f64) -> f64 {
        let mut t = t_s % self.repeat_s();
        for &(amp, n) in &self.blocks {
            let len = f64::from(n) / self.cycle_hz;
            if t < len {
                return self.mean_ue + amp * (std::f64::consts::TAU * self.cycle_hz * t).sin();
            }
            t -= len;
        }
        self.mean_ue
    }

    /// Number of samples in the log.
    ///
    /// ```
    /// assert_eq!(gaugebook::EXAMPLE_SPECTRUM.samples(), 60_000);
    /// ```
    pub fn samples(&self) -> usize {
        (f64::from(self.repeats) * self.repeat_s() * self.sample_rate_hz).round() as usize
    }
}

/// One generated log: its file name in `notebooks/data/`, what it holds, and its CSV text.
///
/// ```
/// let logs = gaugebook::example_logs();
/// assert!(logs.iter().any(|l| l.file_name == "lc500_calibration.csv"));
/// assert!(logs.iter().all(|l| l.csv.len() < 2_000_000));
/// ```
#[derive(Clone, Debug, PartialEq)]
pub struct ExampleLog {
    /// File name (no folder).
    pub file_name: &'static str,
    /// One line saying what the log holds.
    pub description: &'static str,
    /// The CSV text, header first, `\n` line ends.
    pub csv: String,
}

// Fixed seeds, one stream per log so that changing one log leaves the others' bytes alone.
// The numbers are arbitrary (any fixed u64 would do).
const SEED_CALIBRATION: u64 = 0x6761_7567_6562_0001;
const SEED_CREEP: u64 = 0x6761_7567_6562_0002;
const SEED_TEMPERATURE: u64 = 0x6761_7567_6562_0003;
const SEED_FATIGUE: u64 = 0x6761_7567_6562_0004;

/// Normal noise of standard deviation `sd` (a constant of this file, finite and ≥ 0, so `new`
/// cannot fail); a zero sd gives exact values and draws nothing from the stream.
fn noise(rng: &mut Xoshiro256PlusPlus, sd: f64) -> f64 {
    if sd == 0.0 {
        return 0.0;
    }
    match Normal::new(0.0, sd) {
        Ok(n) => n.sample(rng),
        Err(_) => 0.0,
    }
}

/// A row writer for the cell logs: time, load, bridge output and temperature with their noise.
struct CellLog {
    cell: ExampleCell,
    rng: Xoshiro256PlusPlus,
    dt: f64,
    t: f64,
    csv: String,
}

impl CellLog {
    fn new(seed: u64, dt: f64, with_rotation: bool) -> CellLog {
        let mut csv = String::from("time [s],load [N],sg_out [mV/V],temp [°C]");
        if with_rotation {
            csv.push_str(",rotation [°]");
        }
        csv.push('\n');
        CellLog {
            cell: EXAMPLE_CELL,
            rng: Xoshiro256PlusPlus::seed_from_u64(seed),
            dt,
            t: 0.0,
            csv,
        }
    }

    /// Writes one sample at the current time and advances the clock. `offset` is added to the
    /// bridge output (creep, mounting zero shift).
    fn sample(
        &mut self,
        load: f64,
        temp: f64,
        descending: bool,
        span: f64,
        offset: f64,
        rotation: Option<f64>,
    ) {
        let c = self.cell;
        let out =
            c.reading(load, temp, descending, span) + offset + noise(&mut self.rng, c.noise_mv_v);
        let load_read = load + noise(&mut self.rng, c.load_noise_n);
        let temp_read = temp + noise(&mut self.rng, c.temp_noise_k);
        // Writing to a String cannot fail.
        let _ = write!(
            self.csv,
            "{:.1},{:.3},{:.6},{:.2}",
            self.t, load_read, out, temp_read
        );
        if let Some(r) = rotation {
            let _ = write!(self.csv, ",{r:.0}");
        }
        self.csv.push('\n');
        self.t += self.dt;
    }

    /// Number of samples in `seconds`.
    fn count(&self, seconds: f64) -> usize {
        (seconds / self.dt).round() as usize
    }
}

/// Laboratory temperature during the calibration: 23 °C with a slow ±0.05 K swing (invented).
fn lab_temp(t: f64) -> f64 {
    EXAMPLE_CELL.reference_temp_c + 0.05 * (std::f64::consts::TAU * t / 3600.0).sin()
}

/// The calibration log: three series of eleven steps (0, 50, … 500 N) up and back down, 40 s
/// holds sampled at 2 Hz, 10 s ramps; a preload to capacity before the first and the third
/// series; the third series after a 120° mounting rotation (column `rotation [°]`).
///
/// ```
/// let csv = gaugebook::calibration_log();
/// assert!(csv.starts_with("time [s],load [N],sg_out [mV/V],temp [°C],rotation [°]\n"));
/// assert_eq!(csv, gaugebook::calibration_log()); // byte for byte
/// ```
pub fn calibration_log() -> String {
    let c = EXAMPLE_CELL;
    let mut log = CellLog::new(SEED_CALIBRATION, 0.5, true);
    let levels: Vec<f64> = (0..=10).map(|k| 50.0 * f64::from(k)).collect();
    let hold = log.count(40.0);
    let ramp = log.count(10.0);
    // Series: (span change % RO, zero shift mV/V, rotation °, preload first).
    let series = [
        (0.0, 0.0, 0.0, true),
        (c.repeat_span_pct_ro, 0.0, 0.0, false),
        (
            c.rotation_span_pct_ro,
            c.rotation_zero_mv_v,
            c.rotation_deg,
            true,
        ),
    ];
    for (span, zero, rot, preload) in series {
        let emit = |log: &mut CellLog, load: f64, desc: bool| {
            let temp = lab_temp(log.t);
            log.sample(load, temp, desc, span, zero, Some(rot));
        };
        if preload {
            // Preload: zero, ramp to capacity, a short 5 s dwell (too short to count as a hold),
            // ramp back, and settle at zero.
            for _ in 0..hold {
                emit(&mut log, 0.0, false);
            }
            for i in 1..=ramp {
                emit(&mut log, c.capacity_n * i as f64 / (ramp + 1) as f64, false);
            }
            for _ in 0..log.count(5.0) {
                emit(&mut log, c.capacity_n, false);
            }
            for i in 1..=ramp {
                emit(
                    &mut log,
                    c.capacity_n * (1.0 - i as f64 / (ramp + 1) as f64),
                    true,
                );
            }
        }
        let mut path: Vec<(f64, bool)> = levels.iter().map(|&l| (l, false)).collect();
        path.extend(levels.iter().rev().skip(1).map(|&l| (l, true)));
        let mut prev: Option<f64> = None;
        for (level, desc) in path {
            if let Some(p) = prev {
                for i in 1..=ramp {
                    emit(
                        &mut log,
                        p + (level - p) * i as f64 / (ramp + 1) as f64,
                        desc,
                    );
                }
            }
            for _ in 0..hold {
                emit(&mut log, level, desc);
            }
            prev = Some(level);
        }
        // Zero between series.
        for _ in 0..hold {
            emit(&mut log, 0.0, true);
        }
    }
    log.csv
}

/// The creep log: 2 min at zero, a 10 s ramp to capacity, 30 min at capacity, a 10 s ramp back
/// and 30 min of creep recovery at zero, sampled every 10 s.
///
/// ```
/// let csv = gaugebook::creep_log();
/// assert!(csv.starts_with("time [s],load [N],sg_out [mV/V],temp [°C]\n"));
/// assert!(csv.lines().count() < 400);
/// ```
pub fn creep_log() -> String {
    let c = EXAMPLE_CELL;
    let dt = 10.0;
    let mut log = CellLog::new(SEED_CREEP, dt, false);
    let t_ref = c.reference_temp_c;
    let zero_end = 120.0;
    let ramp = 10.0;
    let load_end = zero_end + ramp; // creep clock starts here
    let unload_start = load_end + CREEP_HOLD_S;
    let unload_end = unload_start + ramp; // recovery clock starts here
    let end = unload_end + CREEP_HOLD_S;
    let n = (end / dt).round() as usize;
    for _ in 0..=n {
        let t = log.t;
        let (load, desc, offset) = if t < zero_end {
            (0.0, false, 0.0)
        } else if t < load_end {
            (c.capacity_n * (t - zero_end) / ramp, false, 0.0)
        } else if t <= unload_start {
            (c.capacity_n, false, c.creep_at(t - load_end))
        } else if t < unload_end {
            let f = c.capacity_n * (1.0 - (t - unload_start) / ramp);
            (f, true, c.creep_at(CREEP_HOLD_S))
        } else {
            (0.0, true, c.recovery_at(t - unload_end))
        };
        log.sample(load, t_ref, desc, 0.0, offset, None);
    }
    log.csv
}

/// Soak temperatures of the temperature test, °C, in order (invented; the first is the
/// reference temperature, the others the ends of a −10 … 40 °C range, OIML R 60's default
/// range from memory).
const SOAK_TEMPS_C: [f64; 3] = [23.0, 40.0, -10.0];

/// The temperature log, sampled every 5 s: at each soak temperature a 5 min zero hold, a 10 s
/// ramp to capacity, a 5 min hold, a ramp back and a 5 min zero hold; between soaks the cell
/// follows the chamber with a 12 min time constant for 90 min.
///
/// ```
/// let csv = gaugebook::temperature_log();
/// assert!(csv.starts_with("time [s],load [N],sg_out [mV/V],temp [°C]\n"));
/// ```
pub fn temperature_log() -> String {
    let c = EXAMPLE_CELL;
    let dt = 5.0;
    let mut log = CellLog::new(SEED_TEMPERATURE, dt, false);
    let tau_thermal = 720.0; // the cell's thermal time constant, s (invented)
    let transition = 5400.0;
    let hold = log.count(300.0);
    let ramp = log.count(10.0);
    let mut temp = SOAK_TEMPS_C[0];
    for (k, &target) in SOAK_TEMPS_C.iter().enumerate() {
        if k > 0 {
            let from = temp;
            for i in 0..log.count(transition) {
                let t = i as f64 * dt;
                temp = target + (from - target) * (-t / tau_thermal).exp();
                log.sample(0.0, temp, false, 0.0, 0.0, None);
            }
        }
        for _ in 0..hold {
            log.sample(0.0, temp, false, 0.0, 0.0, None);
        }
        for i in 1..=ramp {
            let f = c.capacity_n * i as f64 / (ramp + 1) as f64;
            log.sample(f, temp, false, 0.0, 0.0, None);
        }
        for _ in 0..hold {
            log.sample(c.capacity_n, temp, false, 0.0, 0.0, None);
        }
        for i in 1..=ramp {
            let f = c.capacity_n * (1.0 - i as f64 / (ramp + 1) as f64);
            log.sample(f, temp, true, 0.0, 0.0, None);
        }
        for _ in 0..hold {
            log.sample(0.0, temp, true, 0.0, 0.0, None);
        }
    }
    log.csv
}

/// The fatigue log: `time [s]` and `strain [µε]` at 1 kHz, four repeats of the block sequence
/// of [`EXAMPLE_SPECTRUM`] with 50 Hz hum and broadband noise.
///
/// ```
/// let csv = gaugebook::fatigue_log();
/// assert!(csv.starts_with("time [s],strain [µε]\n"));
/// assert_eq!(csv.lines().count(), 1 + gaugebook::EXAMPLE_SPECTRUM.samples());
/// ```
pub fn fatigue_log() -> String {
    let s = EXAMPLE_SPECTRUM;
    let mut rng = Xoshiro256PlusPlus::seed_from_u64(SEED_FATIGUE);
    let n = s.samples();
    let mut csv = String::with_capacity(n * 14 + 32);
    csv.push_str("time [s],strain [µε]\n");
    for i in 0..n {
        // Time from the sample index (not by accumulation) so that it does not drift.
        let t = i as f64 / s.sample_rate_hz;
        let hum = s.hum_ue * (std::f64::consts::TAU * s.hum_hz * t).sin();
        let e = s.strain_at(t) + hum + noise(&mut rng, s.noise_ue);
        // Writing to a String cannot fail.
        let _ = writeln!(csv, "{t:.3},{e:.1}");
    }
    csv
}

/// Every example log, in the order the notebooks use them.
///
/// ```
/// let logs = gaugebook::example_logs();
/// assert!(logs.iter().all(|l| l.file_name.ends_with(".csv") && l.csv.ends_with('\n')));
/// assert_eq!(logs[0].csv, gaugebook::calibration_log());
/// ```
pub fn example_logs() -> Vec<ExampleLog> {
    vec![
        ExampleLog {
            file_name: "lc500_calibration.csv",
            description: "500 N load cell: three calibration series, the third after a 120° rotation",
            csv: calibration_log(),
        },
        ExampleLog {
            file_name: "lc500_creep.csv",
            description: "500 N load cell: 30 min creep hold at capacity and 30 min recovery",
            csv: creep_log(),
        },
        ExampleLog {
            file_name: "lc500_temperature.csv",
            description: "500 N load cell: zero and span at 23, 40 and -10 °C",
            csv: temperature_log(),
        },
        ExampleLog {
            file_name: "bracket_fatigue.csv",
            description: "hinge bracket: web strain at 1 kHz under block loading",
            csv: fatigue_log(),
        },
    ]
}

/// Writes every example log into `dir` (created if missing), each through a temporary file
/// renamed into place so that no half-written log is left behind. Returns the paths written.
///
/// ```
/// let dir = std::env::temp_dir().join(format!("gaugebook-logs-doc-{}", std::process::id()));
/// let paths = gaugebook::write_example_logs(&dir)?;
/// assert_eq!(std::fs::read_to_string(&paths[0])?, gaugebook::calibration_log());
/// std::fs::remove_dir_all(&dir)?;
/// # Ok::<(), std::io::Error>(())
/// ```
pub fn write_example_logs(dir: &Path) -> io::Result<Vec<PathBuf>> {
    std::fs::create_dir_all(dir)?;
    let mut written = vec![];
    for log in example_logs() {
        let path = dir.join(log.file_name);
        let tmp = dir.join(format!(".{}.tmp", log.file_name));
        std::fs::write(&tmp, log.csv.as_bytes())?;
        std::fs::rename(&tmp, &path)?;
        written.push(path);
    }
    Ok(written)
}

#[cfg(test)]
mod tests {
    use super::*;

    fn column(csv: &str, k: usize) -> Vec<f64> {
        csv.lines()
            .skip(1)
            .map(|l| l.split(',').nth(k).unwrap().parse().unwrap())
            .collect()
    }

    #[test]
    fn byte_for_byte_reproducible() {
        assert_eq!(example_logs(), example_logs());
    }

    #[test]
    fn sizes_stay_small() {
        for l in example_logs() {
            assert!(
                l.csv.len() < 2_000_000,
                "{} is {} bytes",
                l.file_name,
                l.csv.len()
            );
        }
    }

    #[test]
    fn noise_has_its_stated_spread() {
        // The first 80 samples of the calibration log are a zero hold: their sample standard
        // deviation must be near the stated noise (80 samples: the sd's relative standard
        // error is about 1/sqrt(2·79) = 8 %, so 30 % is a wide bound).
        let csv = calibration_log();
        let y = &column(&csv, 2)[..80];
        let m = y.iter().sum::<f64>() / 80.0;
        let sd = (y.iter().map(|v| (v - m).powi(2)).sum::<f64>() / 79.0).sqrt();
        assert!((sd / EXAMPLE_CELL.noise_mv_v - 1.0).abs() < 0.3, "sd {sd}");
        assert!(
            (m - EXAMPLE_CELL.zero_balance_mv_v).abs() < 2e-5,
            "mean {m}"
        );
    }

    #[test]
    fn creep_log_shows_the_built_in_creep() {
        // Readings at 130 s (end of loading) and 1930 s (30 min later): their difference is the
        // stated creep; two samples of 4e-5 mV/V noise give a difference sd of 5.7e-5 mV/V,
        // i.e. 0.003 % RO, so 0.012 % RO is four sd.
        let csv = creep_log();
        let t = column(&csv, 0);
        let y = column(&csv, 2);
        let at = |s: f64| y[t.iter().position(|&v| (v - s).abs() < 1e-9).unwrap()];
        let creep = (at(1930.0) - at(130.0)) / EXAMPLE_CELL.rated_output_mv_v * 100.0;
        assert!(
            (creep - EXAMPLE_CELL.creep_pct_ro).abs() < 0.012,
            "creep {creep} % RO"
        );
    }

    #[test]
    fn fatigue_log_mean_and_extremes_follow_the_spectrum() {
        let csv = fatigue_log();
        let e = column(&csv, 1);
        let s = EXAMPLE_SPECTRUM;
        let max = e.iter().copied().fold(f64::MIN, f64::max);
        let peak = s.mean_ue + s.blocks[3].0;
        // Peak plus hum plus at most about 5 sd of noise.
        assert!(
            max > peak && max < peak + s.hum_ue + 5.0 * s.noise_ue + 1.0,
            "max {max}"
        );
    }
}
