//! A test log in memory: channels with units and owned values, an optional time axis, and what
//! the reader noticed (gaps, skipped rows).

use std::path::PathBuf;

use super::{Calibration, DataError, Gap, LeadWires};
use crate::units::{ElectricPotential, ElectricalResistance};
use crate::{Arrangement, Unit};

/// What is known about a channel beyond its values: the gauge and bridge it came from, and its
/// calibration. Everything is optional; conversions ask for what they need.
///
/// ```
/// use gaugebook::ChannelMeta;
/// use gaugebook::units::ElectricPotential;
/// use uom::si::electric_potential::volt;
/// let m = ChannelMeta { gauge_factor: Some(2.1), excitation: Some(ElectricPotential::new::<volt>(5.0)), ..Default::default() };
/// assert_eq!(m.gauge_factor, Some(2.1));
/// ```
#[derive(Clone, Debug, Default, PartialEq)]
pub struct ChannelMeta {
    /// Gauge factor of the channel's gauges.
    pub gauge_factor: Option<f64>,
    /// Bridge excitation.
    pub excitation: Option<ElectricPotential>,
    /// Nominal gauge resistance.
    pub gauge_resistance: Option<ElectricalResistance>,
    /// The lead wires (for the lead-wire correction).
    pub leads: Option<LeadWires>,
    /// The bridge arrangement.
    pub arrangement: Option<Arrangement>,
    /// Poisson's ratio of the specimen (for the Poisson arrangements).
    pub poisson: Option<f64>,
    /// The calibration from this channel's signal to a load.
    pub calibration: Option<Calibration>,
    /// Free text (serial number, position on the part).
    pub note: Option<String>,
}

/// One column of a log: its name, unit and values, as written in the file (not converted to SI).
///
/// ```
/// use gaugebook::{Channel, Unit};
/// let c = Channel::new("load", Unit::parse("kN")?, vec![1.0, 2.5]);
/// assert_eq!(c.si_values(), vec![1000.0, 2500.0]);
/// # Ok::<(), gaugebook::UnitError>(())
/// ```
#[derive(Clone, Debug, PartialEq)]
pub struct Channel {
    /// The name: the header without its unit (`load` for `load [kN]`).
    pub name: String,
    /// The header as written in the file.
    pub header: String,
    /// The column in the file (1-based); 0 for a channel made in memory.
    pub column: usize,
    /// The unit of `values`.
    pub unit: Unit,
    /// The samples, in `unit`.
    pub values: Vec<f64>,
    /// Gauge, bridge and calibration data attached to the channel.
    pub meta: ChannelMeta,
}

impl Channel {
    /// A channel made in memory (header = name, column 0, no metadata).
    ///
    /// ```
    /// let c = gaugebook::Channel::new("x", gaugebook::Unit::parse("mm")?, vec![1.0]);
    /// assert_eq!((c.header.as_str(), c.column), ("x", 0));
    /// # Ok::<(), gaugebook::UnitError>(())
    /// ```
    pub fn new(name: impl Into<String>, unit: Unit, values: Vec<f64>) -> Channel {
        let name = name.into();
        Channel {
            header: name.clone(),
            name,
            column: 0,
            unit,
            values,
            meta: ChannelMeta::default(),
        }
    }

    /// The number of samples.
    ///
    /// ```
    /// let c = gaugebook::Channel::new("x", gaugebook::Unit::parse("mm")?, vec![1.0, 2.0]);
    /// assert_eq!(c.len(), 2);
    /// # Ok::<(), gaugebook::UnitError>(())
    /// ```
    pub fn len(&self) -> usize {
        self.values.len()
    }

    /// Whether there are no samples.
    ///
    /// ```
    /// let c = gaugebook::Channel::new("x", gaugebook::Unit::parse("mm")?, vec![]);
    /// assert!(c.is_empty());
    /// # Ok::<(), gaugebook::UnitError>(())
    /// ```
    pub fn is_empty(&self) -> bool {
        self.values.is_empty()
    }

    /// The values in SI (`value × factor + offset`).
    ///
    /// ```
    /// let c = gaugebook::Channel::new("e", gaugebook::Unit::parse("µε")?, vec![500.0]);
    /// assert!((c.si_values()[0] - 5e-4).abs() < 1e-18);
    /// # Ok::<(), gaugebook::UnitError>(())
    /// ```
    pub fn si_values(&self) -> Vec<f64> {
        let (f, o) = (self.unit.factor(), self.unit.offset());
        self.values.iter().map(|v| v * f + o).collect()
    }

    /// Attaches metadata, returning the channel.
    ///
    /// ```
    /// use gaugebook::{Channel, ChannelMeta, Unit};
    /// let c = Channel::new("sg1", Unit::parse("mV/V")?, vec![0.1])
    ///     .with_meta(ChannelMeta { gauge_factor: Some(2.0), ..Default::default() });
    /// assert_eq!(c.meta.gauge_factor, Some(2.0));
    /// # Ok::<(), gaugebook::UnitError>(())
    /// ```
    pub fn with_meta(mut self, meta: ChannelMeta) -> Channel {
        self.meta = meta;
        self
    }
}

/// The time axis of a log: its channel and what the reader found out about the sampling.
///
/// ```
/// use gaugebook::{LogOptions, read_log};
/// let dir = tempfile::tempdir()?;
/// let path = dir.path().join("t.csv");
/// std::fs::write(&path, "time [s],load [kN]\n0,1\n0.5,2\n1.0,3\n3.0,4\n")?;
/// let log = read_log(&path, &LogOptions::new())?;
/// let t = log.time.as_ref().unwrap();
/// assert_eq!((t.step, t.sample_rate_hz), (0.5, 2.0));
/// assert_eq!(t.gaps[0].row, 5);
/// # Ok::<(), Box<dyn std::error::Error>>(())
/// ```
#[derive(Clone, Debug, PartialEq)]
pub struct TimeAxis {
    /// The time values (for timestamps: seconds since the first sample, unit s).
    pub channel: Channel,
    /// For timestamps: the first sample's time in seconds since 1970-01-01T00:00:00Z.
    pub start_unix_s: Option<f64>,
    /// The median step, in the channel's unit (NaN with fewer than two samples).
    pub step: f64,
    /// 1 / median step in hertz (NaN when the unit is not a time or there are too few samples).
    pub sample_rate_hz: f64,
    /// Steps longer than `gap_factor` median steps.
    pub gaps: Vec<Gap>,
}

/// A row the reader dropped under the `skip_nan` policy.
///
/// ```
/// let s = gaugebook::SkippedRow { row: 7, column: 2, name: "sg1_mVV".into(), value: f64::NAN };
/// assert_eq!(s.row, 7);
/// ```
#[derive(Clone, Debug, PartialEq)]
pub struct SkippedRow {
    /// The row (1-based, header = 1).
    pub row: usize,
    /// The first column (1-based) with a non-finite value.
    pub column: usize,
    /// That column's header.
    pub name: String,
    /// The value found.
    pub value: f64,
}

/// The file format of a log.
///
/// ```
/// assert_ne!(gaugebook::LogFormat::Csv, gaugebook::LogFormat::Parquet);
/// ```
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub enum LogFormat {
    /// Delimited text with one header line.
    Csv,
    /// Apache Parquet.
    Parquet,
}

/// A test log read into memory.
///
/// ```
/// use gaugebook::{LogOptions, read_log};
/// let dir = tempfile::tempdir()?;
/// let path = dir.path().join("run.csv");
/// std::fs::write(&path, "sg1_mVV,load [kN],note\n0.5,1,a\n1.0,2,b\n")?;
/// let log = read_log(&path, &LogOptions::new().keep(["sg1", "load"]))?;
/// assert_eq!(log.rows(), 2);
/// assert_eq!(log.channel("load").unwrap().values, vec![1.0, 2.0]);
/// assert!(log.channel("note").is_none());
/// # Ok::<(), Box<dyn std::error::Error>>(())
/// ```
#[derive(Clone, Debug, PartialEq)]
pub struct Log {
    /// The file read.
    pub path: PathBuf,
    /// Its format.
    pub format: LogFormat,
    /// The time axis, if there is one.
    pub time: Option<TimeAxis>,
    /// The kept columns other than time, in the order asked for (or the file's order).
    pub channels: Vec<Channel>,
    /// Rows dropped under the `skip_nan` policy.
    pub skipped: Vec<SkippedRow>,
}

impl Log {
    /// The number of samples per channel.
    ///
    /// ```
    /// # use gaugebook::{LogOptions, read_log};
    /// # let dir = tempfile::tempdir()?;
    /// # let path = dir.path().join("a.csv");
    /// std::fs::write(&path, "x\n1\n2\n3\n")?;
    /// assert_eq!(read_log(&path, &LogOptions::new())?.rows(), 3);
    /// # Ok::<(), Box<dyn std::error::Error>>(())
    /// ```
    pub fn rows(&self) -> usize {
        self.time
            .as_ref()
            .map(|t| t.channel.len())
            .or_else(|| self.channels.first().map(Channel::len))
            .unwrap_or(0)
    }

    /// A channel by name or header text (the time channel included).
    ///
    /// ```
    /// # use gaugebook::{LogOptions, read_log};
    /// # let dir = tempfile::tempdir()?;
    /// # let path = dir.path().join("a.csv");
    /// std::fs::write(&path, "time_s,load_N\n0,5\n")?;
    /// let log = read_log(&path, &LogOptions::new())?;
    /// assert!(log.channel("load").is_some() && log.channel("load_N").is_some());
    /// # Ok::<(), Box<dyn std::error::Error>>(())
    /// ```
    pub fn channel(&self, name: &str) -> Option<&Channel> {
        self.channels
            .iter()
            .chain(self.time.as_ref().map(|t| &t.channel))
            .find(|c| c.name == name || c.header == name)
    }

    /// A channel by name or header text, to change it.
    ///
    /// ```
    /// # use gaugebook::{LogOptions, read_log};
    /// # let dir = tempfile::tempdir()?;
    /// # let path = dir.path().join("a.csv");
    /// std::fs::write(&path, "load_N\n5\n")?;
    /// let mut log = read_log(&path, &LogOptions::new())?;
    /// log.channel_mut("load").unwrap().values[0] = 6.0;
    /// assert_eq!(log.channel("load").unwrap().values[0], 6.0);
    /// # Ok::<(), Box<dyn std::error::Error>>(())
    /// ```
    pub fn channel_mut(&mut self, name: &str) -> Option<&mut Channel> {
        self.channels
            .iter_mut()
            .chain(self.time.as_mut().map(|t| &mut t.channel))
            .find(|c| c.name == name || c.header == name)
    }

    /// Removes a channel (not the time axis) and returns it, values moved, not copied.
    ///
    /// ```
    /// # use gaugebook::{LogOptions, read_log};
    /// # let dir = tempfile::tempdir()?;
    /// # let path = dir.path().join("a.csv");
    /// std::fs::write(&path, "a,b\n1,2\n")?;
    /// let mut log = read_log(&path, &LogOptions::new())?;
    /// let b = log.take("b").unwrap();
    /// assert_eq!((b.values, log.channels.len()), (vec![2.0], 1));
    /// # Ok::<(), Box<dyn std::error::Error>>(())
    /// ```
    pub fn take(&mut self, name: &str) -> Option<Channel> {
        let at = self
            .channels
            .iter()
            .position(|c| c.name == name || c.header == name)?;
        Some(self.channels.remove(at))
    }

    /// Attaches metadata to a channel.
    ///
    /// ```
    /// # use gaugebook::{ChannelMeta, LogOptions, read_log};
    /// # let dir = tempfile::tempdir()?;
    /// # let path = dir.path().join("a.csv");
    /// std::fs::write(&path, "sg1_mVV\n0.1\n")?;
    /// let mut log = read_log(&path, &LogOptions::new())?;
    /// log.set_meta("sg1", ChannelMeta { gauge_factor: Some(2.1), ..Default::default() })?;
    /// assert_eq!(log.channel("sg1").unwrap().meta.gauge_factor, Some(2.1));
    /// assert!(log.set_meta("sg9", ChannelMeta::default()).is_err());
    /// # Ok::<(), Box<dyn std::error::Error>>(())
    /// ```
    pub fn set_meta(&mut self, name: &str, meta: ChannelMeta) -> Result<(), DataError> {
        let path = self.path.clone();
        let available = self.names().join(", ");
        match self.channel_mut(name) {
            Some(c) => {
                c.meta = meta;
                Ok(())
            }
            None => Err(DataError::NoSuchColumn {
                path,
                name: name.to_string(),
                available,
            }),
        }
    }

    /// The channel names, time first.
    ///
    /// ```
    /// # use gaugebook::{LogOptions, read_log};
    /// # let dir = tempfile::tempdir()?;
    /// # let path = dir.path().join("a.csv");
    /// std::fs::write(&path, "b,time,a\n1,0,2\n")?;
    /// assert_eq!(read_log(&path, &LogOptions::new())?.names(), vec!["time", "b", "a"]);
    /// # Ok::<(), Box<dyn std::error::Error>>(())
    /// ```
    pub fn names(&self) -> Vec<&str> {
        self.time
            .as_ref()
            .map(|t| t.channel.name.as_str())
            .into_iter()
            .chain(self.channels.iter().map(|c| c.name.as_str()))
            .collect()
    }
}
