//! The data layer's error: what went wrong with which file, and where in it.
//!
//! Rows are counted as a text editor counts lines: 1-based, the header is row 1, so the first
//! data row of a CSV file is row 2. In a Parquet file there is no header line and rows count
//! records from 1. Columns are counted from 1 (as a spreadsheet does) and named as well.

use std::path::{Path, PathBuf};

use thiserror::Error;

use crate::{PhysicsError, UnitError};

/// An error from reading, converting or writing a test log.
///
/// ```
/// use gaugebook::DataError;
/// let e = DataError::NotANumber {
///     path: "run7.csv".into(),
///     row: 12,
///     column: 3,
///     name: "sg2_mVV".into(),
///     found: "n/a".into(),
/// };
/// assert_eq!(e.to_string(), "run7.csv, row 12, column 3 `sg2_mVV`: expected a number, found `n/a`");
/// ```
#[derive(Debug, Error)]
#[non_exhaustive]
pub enum DataError {
    /// The file could not be opened, read or written.
    #[error("{}: {action}: {source}", path.display())]
    Io {
        /// The file.
        path: PathBuf,
        /// What was being done ("cannot open", "cannot write").
        action: &'static str,
        /// The operating system's error.
        #[source]
        source: std::io::Error,
    },
    /// The file has no bytes at all.
    #[error("{}: the file is empty, expected a header line with column names", path.display())]
    Empty {
        /// The file.
        path: PathBuf,
    },
    /// A header line and no data rows.
    #[error("{}: found only the header line, expected data rows from row 2 on", path.display())]
    NoRows {
        /// The file.
        path: PathBuf,
    },
    /// A file type that is neither CSV nor Parquet.
    #[error(
        "{}: cannot tell the format from `{extension}`, expected .csv, .tsv, .txt or .parquet",
        path.display()
    )]
    UnsupportedFormat {
        /// The file.
        path: PathBuf,
        /// Its extension as found.
        extension: String,
    },
    /// Two columns with the same name in the header.
    #[error(
        "{}, row 1: column name `{name}` appears twice (columns {first} and {second}), expected unique names",
        path.display()
    )]
    DuplicateColumn {
        /// The file.
        path: PathBuf,
        /// The repeated name.
        name: String,
        /// Its first column (1-based).
        first: usize,
        /// Its second column (1-based).
        second: usize,
    },
    /// A unit written in a header (or given in the unit map) that the unit table does not know.
    #[error("{}, row 1, column {column} `{header}`: {source}", path.display())]
    UnknownUnit {
        /// The file.
        path: PathBuf,
        /// The column (1-based).
        column: usize,
        /// The column's header text.
        header: String,
        /// The units layer's error.
        #[source]
        source: UnitError,
    },
    /// A column asked for (to keep, as the time axis, or in the unit map) is not in the file.
    #[error("{}: no column `{name}`, found {available}", path.display())]
    NoSuchColumn {
        /// The file.
        path: PathBuf,
        /// The name asked for.
        name: String,
        /// The columns the file has, comma separated.
        available: String,
    },
    /// A data row with more or fewer fields than the header.
    #[error("{}, row {row}: expected {expected} fields as in the header, found {found}", path.display())]
    Ragged {
        /// The file.
        path: PathBuf,
        /// The row (1-based, header = 1).
        row: usize,
        /// Fields in the header.
        expected: usize,
        /// Fields in this row.
        found: usize,
    },
    /// Text where a number belongs (an empty field counts too).
    #[error("{}, row {row}, column {column} `{name}`: expected a number, found `{found}`", path.display())]
    NotANumber {
        /// The file.
        path: PathBuf,
        /// The row (1-based, header = 1).
        row: usize,
        /// The column (1-based).
        column: usize,
        /// The column's header.
        name: String,
        /// The text found (cut to 40 characters).
        found: String,
    },
    /// NaN or an infinity in a kept column while `skip_nan` is off.
    #[error(
        "{}, row {row}, column {column} `{name}`: expected a finite number, found {value} (set skip_nan to report and skip such rows)",
        path.display()
    )]
    NonFinite {
        /// The file.
        path: PathBuf,
        /// The row (1-based, header = 1).
        row: usize,
        /// The column (1-based).
        column: usize,
        /// The column's header.
        name: String,
        /// The value (NaN, inf or -inf).
        value: f64,
    },
    /// A time column that does not increase from one row to the next.
    #[error(
        "{}, row {row}, column {column} `{name}`: time goes from {previous} to {found}, expected it to increase",
        path.display()
    )]
    TimeNotIncreasing {
        /// The file.
        path: PathBuf,
        /// The row (1-based, header = 1).
        row: usize,
        /// The column (1-based).
        column: usize,
        /// The column's header.
        name: String,
        /// The time in the row before, as written (seconds for timestamps).
        previous: f64,
        /// The time in this row.
        found: f64,
    },
    /// A time field that is neither a number nor an ISO 8601 timestamp.
    #[error(
        "{}, row {row}, column {column} `{name}`: cannot read `{found}` as a time, expected seconds or an ISO 8601 timestamp such as 2026-12-01T20:00:00.125Z",
        path.display()
    )]
    BadTimestamp {
        /// The file.
        path: PathBuf,
        /// The row (1-based, header = 1).
        row: usize,
        /// The column (1-based).
        column: usize,
        /// The column's header.
        name: String,
        /// The text found.
        found: String,
    },
    /// A Parquet file that cannot be decoded (truncated, not Parquet, unsupported column type).
    #[error("{}: cannot read as Parquet: {reason}", path.display())]
    Parquet {
        /// The file.
        path: PathBuf,
        /// What the decoder reported.
        reason: String,
    },
    /// Another failure reported by polars while reading or writing, with its text.
    #[error("{}: {reason}", path.display())]
    Engine {
        /// The file.
        path: PathBuf,
        /// What polars reported.
        reason: String,
    },
    /// An output path that is the input itself.
    #[error("{}: refusing to write over an input log, expected another output path", path.display())]
    WouldOverwriteInput {
        /// The path.
        path: PathBuf,
    },
    /// Columns or series whose lengths must agree but do not.
    #[error("{what} do not match in length: {left} versus {right}")]
    LengthMismatch {
        /// What must agree.
        what: String,
        /// One length.
        left: usize,
        /// The other length.
        right: usize,
    },
    /// A window, hold or index range outside the data.
    #[error("invalid {what}: expected {expected}, found {found}")]
    BadRange {
        /// What the range is for.
        what: String,
        /// What is allowed.
        expected: String,
        /// What was given.
        found: String,
    },
    /// A conversion parameter rejected by the physics layer.
    #[error(transparent)]
    Physics(#[from] PhysicsError),
}

impl DataError {
    /// The file the error is about, if it is about one.
    ///
    /// ```
    /// use gaugebook::DataError;
    /// let e = DataError::Empty { path: "a.csv".into() };
    /// assert_eq!(e.path().unwrap().to_str(), Some("a.csv"));
    /// ```
    pub fn path(&self) -> Option<&Path> {
        use DataError::*;
        match self {
            Io { path, .. }
            | Empty { path }
            | NoRows { path }
            | UnsupportedFormat { path, .. }
            | DuplicateColumn { path, .. }
            | UnknownUnit { path, .. }
            | NoSuchColumn { path, .. }
            | Ragged { path, .. }
            | NotANumber { path, .. }
            | NonFinite { path, .. }
            | TimeNotIncreasing { path, .. }
            | BadTimestamp { path, .. }
            | Parquet { path, .. }
            | Engine { path, .. }
            | WouldOverwriteInput { path } => Some(path),
            LengthMismatch { .. } | BadRange { .. } | Physics(_) => None,
        }
    }

    /// The row (1-based, header = 1) the error points at, if it points at one.
    ///
    /// ```
    /// use gaugebook::DataError;
    /// let e = DataError::Ragged { path: "a.csv".into(), row: 5, expected: 3, found: 2 };
    /// assert_eq!(e.row(), Some(5));
    /// ```
    pub fn row(&self) -> Option<usize> {
        use DataError::*;
        match self {
            Ragged { row, .. }
            | NotANumber { row, .. }
            | NonFinite { row, .. }
            | TimeNotIncreasing { row, .. }
            | BadTimestamp { row, .. } => Some(*row),
            DuplicateColumn { .. } | UnknownUnit { .. } => Some(1),
            _ => None,
        }
    }

    /// The column (1-based) the error points at, if it points at one.
    ///
    /// ```
    /// use gaugebook::DataError;
    /// let e = DataError::NotANumber {
    ///     path: "a.csv".into(), row: 4, column: 2, name: "load_N".into(), found: "x".into(),
    /// };
    /// assert_eq!(e.column(), Some(2));
    /// ```
    pub fn column(&self) -> Option<usize> {
        use DataError::*;
        match self {
            NotANumber { column, .. }
            | NonFinite { column, .. }
            | TimeNotIncreasing { column, .. }
            | BadTimestamp { column, .. }
            | UnknownUnit { column, .. } => Some(*column),
            DuplicateColumn { second, .. } => Some(*second),
            _ => None,
        }
    }

    pub(crate) fn io(path: &Path, action: &'static str, source: std::io::Error) -> DataError {
        DataError::Io {
            path: path.to_path_buf(),
            action,
            source,
        }
    }
}
