//! The plot layer's error.

use thiserror::Error;

/// An error from building, drawing or saving a figure.
///
/// ```
/// let e = gaugebook::PlotError::LengthMismatch { series: "sg1".into(), x: 3, y: 2 };
/// assert_eq!(e.to_string(), "series sg1 has 3 x values but 2 y values");
/// ```
#[derive(Debug, Error)]
#[non_exhaustive]
pub enum PlotError {
    /// A series, panel or figure with nothing to draw.
    #[error("nothing to plot in {what}: expected at least one point")]
    Empty {
        /// What is empty ("series sg1", "figure").
        what: String,
    },
    /// x and y of a series differ in length.
    #[error("series {series} has {x} x values but {y} y values")]
    LengthMismatch {
        /// The series name.
        series: String,
        /// Number of x values.
        x: usize,
        /// Number of y values.
        y: usize,
    },
    /// A NaN or infinite value.
    #[error(
        "series {series} has a non-finite {axis} value at index {index}: expected finite values"
    )]
    NonFinite {
        /// The series name.
        series: String,
        /// "x" or "y".
        axis: &'static str,
        /// Position in the series.
        index: usize,
    },
    /// A bad parameter (size, bin count, edges).
    #[error("invalid {name}: expected {expected}, found {found}")]
    Invalid {
        /// The parameter.
        name: String,
        /// What was given.
        found: String,
        /// What is allowed.
        expected: String,
    },
    /// plotters or the PNG encoder failed.
    #[error("drawing failed: {0}")]
    Render(String),
    /// The file extension names no format this module writes.
    #[error("cannot tell the image format of {path}: expected a name ending in .svg or .png")]
    UnknownFormat {
        /// The path given.
        path: String,
    },
    /// Writing the file failed.
    #[error("cannot write {path}: {source}")]
    Io {
        /// The target path.
        path: String,
        /// The operating system's error.
        source: std::io::Error,
    },
}
