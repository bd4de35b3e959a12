//! What to read from a log: the columns kept, the time axis, unit overrides, the NaN policy.

/// Which column is the time axis.
///
/// ```
/// use gaugebook::TimeColumn;
/// assert_eq!(TimeColumn::default(), TimeColumn::Auto);
/// ```
#[derive(Clone, Debug, Default, PartialEq)]
pub enum TimeColumn {
    /// The first column whose unit is a time (`time_s`, `t [ms]`) or whose name is `time`, `t`,
    /// `timestamp` or `datetime` (any case); none if there is no such column.
    #[default]
    Auto,
    /// This column (header text or name).
    Named(String),
    /// No time axis: every kept column is a channel.
    None,
}

/// Options of [`read_log`](crate::read_log).
///
/// ```
/// use gaugebook::LogOptions;
/// let o = LogOptions::new().keep(["sg1", "load"]).time("time_s").unit("load", "kN").skip_nan(true);
/// assert_eq!(o.columns.as_deref().map(<[String]>::len), Some(2));
/// assert!(o.skip_nan);
/// ```
#[derive(Clone, Debug, PartialEq)]
pub struct LogOptions {
    /// Columns to keep (header text or name), in this order; `None` keeps every column. The time
    /// column is kept in any case. Only kept columns are parsed and held in memory.
    pub columns: Option<Vec<String>>,
    /// The time axis.
    pub time: TimeColumn,
    /// Units that override the headers: (column header or name, unit text).
    pub units: Vec<(String, String)>,
    /// Rows with NaN or an infinity in a kept column: `false` (default) stops with an error naming
    /// the row and column; `true` drops those rows and lists them in [`Log::skipped`](crate::Log).
    pub skip_nan: bool,
    /// The field separator; `None` takes `,` unless the header has none and has `;` or a tab.
    pub separator: Option<u8>,
    /// A step longer than this many median steps is reported as a gap (default 1.5).
    pub gap_factor: f64,
    /// Bytes of CSV text (or rows of Parquet, times 64) parsed per block; memory beyond the kept
    /// columns stays within a few blocks (default 8 MiB).
    pub block_bytes: usize,
}

impl Default for LogOptions {
    fn default() -> Self {
        LogOptions {
            columns: None,
            time: TimeColumn::Auto,
            units: Vec::new(),
            skip_nan: false,
            separator: None,
            // A step half again as long as the usual one is already a lost sample (common practice).
            gap_factor: 1.5,
            block_bytes: 8 << 20,
        }
    }
}

impl LogOptions {
    /// The defaults: every column, automatic time axis, units from the headers, NaN is an error.
    ///
    /// ```
    /// let o = gaugebook::LogOptions::new();
    /// assert!(o.columns.is_none() && !o.skip_nan);
    /// ```
    pub fn new() -> LogOptions {
        LogOptions::default()
    }

    /// Keeps only these columns (header text or name), in this order.
    ///
    /// ```
    /// let o = gaugebook::LogOptions::new().keep(["sg1_mVV"]);
    /// assert_eq!(o.columns.unwrap(), vec!["sg1_mVV".to_string()]);
    /// ```
    pub fn keep<I, S>(mut self, columns: I) -> LogOptions
    where
        I: IntoIterator<Item = S>,
        S: Into<String>,
    {
        self.columns = Some(columns.into_iter().map(Into::into).collect());
        self
    }

    /// Uses this column as the time axis.
    ///
    /// ```
    /// use gaugebook::{LogOptions, TimeColumn};
    /// assert_eq!(LogOptions::new().time("t").time, TimeColumn::Named("t".into()));
    /// ```
    pub fn time(mut self, column: impl Into<String>) -> LogOptions {
        self.time = TimeColumn::Named(column.into());
        self
    }

    /// Reads without a time axis.
    ///
    /// ```
    /// use gaugebook::{LogOptions, TimeColumn};
    /// assert_eq!(LogOptions::new().no_time().time, TimeColumn::None);
    /// ```
    pub fn no_time(mut self) -> LogOptions {
        self.time = TimeColumn::None;
        self
    }

    /// Gives a column's unit, overriding its header.
    ///
    /// ```
    /// let o = gaugebook::LogOptions::new().unit("ch3", "mV/V");
    /// assert_eq!(o.units, vec![("ch3".to_string(), "mV/V".to_string())]);
    /// ```
    pub fn unit(mut self, column: impl Into<String>, unit: impl Into<String>) -> LogOptions {
        self.units.push((column.into(), unit.into()));
        self
    }

    /// Sets the NaN policy (see [`LogOptions::skip_nan`](LogOptions#structfield.skip_nan)).
    ///
    /// ```
    /// assert!(gaugebook::LogOptions::new().skip_nan(true).skip_nan);
    /// ```
    pub fn skip_nan(mut self, skip: bool) -> LogOptions {
        self.skip_nan = skip;
        self
    }

    /// Sets the field separator.
    ///
    /// ```
    /// assert_eq!(gaugebook::LogOptions::new().separator(b';').separator, Some(b';'));
    /// ```
    pub fn separator(mut self, separator: u8) -> LogOptions {
        self.separator = Some(separator);
        self
    }
}
