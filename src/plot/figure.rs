//! The figure value ([`Plot`]; the name `Figure` belongs to the calibration figures of merit): a title, a size and one or more panels stacked top to bottom, each with
//! unit-labelled axes and its series (lines, points, bars). Data are copied in when a series is
//! added, and long lines are thinned then (min/max per column of a fine grid), so a figure of
//! millions of samples stays small and quick to draw.

use super::error::PlotError;
use super::thin::{join_blocks, thin_blocks};

/// Columns of the grid long line series are thinned to when added: finer than any figure is
/// drawn (so the pixel-column thinning at drawing time still sees every extreme).
const STORE_COLUMNS: usize = 4096;

/// An axis: the quantity's name and its unit, shown as "name (unit)".
///
/// ```
/// assert_eq!(gaugebook::Axis::new("load", "kN").title(), "load (kN)");
/// assert_eq!(gaugebook::Axis::new("count", "").title(), "count");
/// ```
#[derive(Clone, Debug, PartialEq)]
pub struct Axis {
    /// Quantity name ("strain").
    pub name: String,
    /// Unit symbol ("µε"), empty for a plain number.
    pub unit: String,
}

impl Axis {
    /// An axis label.
    ///
    /// ```
    /// let a = gaugebook::Axis::new("strain", "µε");
    /// assert_eq!(a.unit, "µε");
    /// ```
    pub fn new(name: impl Into<String>, unit: impl Into<String>) -> Axis {
        Axis {
            name: name.into(),
            unit: unit.into(),
        }
    }

    /// The text drawn beside the axis.
    ///
    /// ```
    /// assert_eq!(gaugebook::Axis::new("time", "s").title(), "time (s)");
    /// ```
    pub fn title(&self) -> String {
        if self.unit.is_empty() {
            self.name.clone()
        } else {
            format!("{} ({})", self.name, self.unit)
        }
    }
}

/// How a series is drawn.
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub(crate) enum Style {
    Line,
    Points,
    Bars,
}

/// One series of a panel.
#[derive(Clone, Debug, PartialEq)]
pub(crate) struct Series {
    pub name: String,
    pub style: Style,
    /// Line and point x values; for bars, the bin edges (one more than `y`).
    pub x: Vec<f64>,
    pub y: Vec<f64>,
    /// x was non-decreasing when added (lines may then be thinned per pixel column).
    pub sorted: bool,
}

/// One plotting area with its axes and series.
///
/// ```
/// use gaugebook::{Axis, Panel};
/// let p = Panel::new(Axis::new("time", "s"), Axis::new("load", "kN"))
///     .line("ref", &[0.0, 1.0, 2.0], &[0.0, 5.0, 4.0])?
///     .points("read", &[0.5, 1.5], &[2.4, 4.6])?;
/// assert_eq!(p.series_count(), 2);
/// # Ok::<(), gaugebook::PlotError>(())
/// ```
#[derive(Clone, Debug, PartialEq)]
pub struct Panel {
    pub(crate) x_axis: Axis,
    pub(crate) y_axis: Axis,
    pub(crate) series: Vec<Series>,
    pub(crate) weight: f64,
    pub(crate) zero_line: bool,
}

impl Panel {
    /// An empty panel with the given axes.
    ///
    /// ```
    /// use gaugebook::{Axis, Panel};
    /// assert_eq!(Panel::new(Axis::new("x", "m"), Axis::new("y", "m")).series_count(), 0);
    /// ```
    pub fn new(x_axis: Axis, y_axis: Axis) -> Panel {
        Panel {
            x_axis,
            y_axis,
            series: Vec::new(),
            weight: 1.0,
            zero_line: false,
        }
    }

    /// Adds a line through (x, y). A line of more than 16 384 points whose x never decreases (a
    /// time series) is thinned to the first, lowest, highest and last point of each of 4096
    /// columns, which draws identically; others are kept whole.
    ///
    /// Errors: no points, unequal lengths, or a non-finite value.
    ///
    /// ```
    /// use gaugebook::{Axis, Panel};
    /// let p = Panel::new(Axis::new("t", "s"), Axis::new("F", "N"));
    /// assert!(p.clone().line("a", &[0.0, 1.0], &[2.0, 3.0]).is_ok());
    /// assert!(p.clone().line("a", &[0.0, 1.0], &[2.0]).is_err());
    /// assert!(p.line("a", &[0.0, 1.0], &[2.0, f64::NAN]).is_err());
    /// ```
    pub fn line(self, name: &str, x: &[f64], y: &[f64]) -> Result<Panel, PlotError> {
        self.line_blocks(name, &[(x, y)])
    }

    /// Adds a line through a series held as consecutive blocks (x, y), as [`Panel::line`] adds
    /// one through the joined series, without joining a long one: a time series is thinned
    /// block by block. Errors as for [`Panel::line`], naming the block.
    ///
    /// ```
    /// use gaugebook::{Axis, Panel};
    /// let t: Vec<f64> = (0..100_000).map(|k| k as f64 * 1e-3).collect();
    /// let f: Vec<f64> = t.iter().map(|t| (40.0 * t).sin()).collect();
    /// let blocks: Vec<(&[f64], &[f64])> = t.chunks(30_000).zip(f.chunks(30_000)).collect();
    /// let p = Panel::new(Axis::new("time", "s"), Axis::new("load", "kN"));
    /// assert_eq!(p.clone().line_blocks("F", &blocks)?.series_count(), 1);
    /// assert!(p.line_blocks("F", &[(&t[..3], &f[..2])]).is_err());
    /// # Ok::<(), gaugebook::PlotError>(())
    /// ```
    pub fn line_blocks(
        mut self,
        name: &str,
        blocks: &[(&[f64], &[f64])],
    ) -> Result<Panel, PlotError> {
        if blocks.iter().all(|b| b.0.is_empty() && b.1.is_empty()) {
            return Err(PlotError::Empty {
                what: format!("series {name}"),
            });
        }
        let mut prev: Option<f64> = None;
        let mut sorted = true;
        for (i, (x, y)) in blocks.iter().enumerate() {
            if x.is_empty() && y.is_empty() {
                continue;
            }
            if blocks.len() == 1 {
                check_xy(name, x, y)?;
            } else {
                check_xy(&format!("{name} (block {i})"), x, y)?;
            }
            sorted &= prev.is_none_or(|p| p <= x[0]) && x.windows(2).all(|w| w[0] <= w[1]);
            prev = x.last().copied();
        }
        let (x, y) = if sorted {
            thin_blocks(blocks, STORE_COLUMNS)
        } else {
            join_blocks(blocks)
        };
        self.series.push(Series {
            name: name.to_string(),
            style: Style::Line,
            x,
            y,
            sorted,
        });
        Ok(self)
    }

    /// Adds a line of `y` against equally spaced x = `x0 + k·dx` (a channel sampled at a fixed
    /// rate), without building the x vector first. Errors as for [`Panel::line`], and a `dx`
    /// that is not finite and positive.
    ///
    /// ```
    /// use gaugebook::{Axis, Panel};
    /// let y: Vec<f64> = (0..1_000_000).map(|k| (k as f64 * 1e-3).sin()).collect();
    /// let p = Panel::new(Axis::new("time", "s"), Axis::new("strain", "µε")).sampled("sg1", 0.0, 1e-3, &y)?;
    /// assert_eq!(p.series_count(), 1);
    /// # Ok::<(), gaugebook::PlotError>(())
    /// ```
    pub fn sampled(self, name: &str, x0: f64, dx: f64, y: &[f64]) -> Result<Panel, PlotError> {
        if !(dx.is_finite() && dx > 0.0 && x0.is_finite()) {
            return Err(PlotError::Invalid {
                name: format!("sample spacing of {name}"),
                found: format!("start {x0}, step {dx}"),
                expected: "a finite start and a finite step above 0".to_string(),
            });
        }
        let x: Vec<f64> = (0..y.len()).map(|k| x0 + k as f64 * dx).collect();
        self.line(name, &x, y)
    }

    /// Adds points (markers, no line) at (x, y). Errors as for [`Panel::line`].
    ///
    /// ```
    /// use gaugebook::{Axis, Panel};
    /// let p = Panel::new(Axis::new("x", ""), Axis::new("y", "")).points("p", &[1.0], &[2.0])?;
    /// assert_eq!(p.series_count(), 1);
    /// # Ok::<(), gaugebook::PlotError>(())
    /// ```
    pub fn points(mut self, name: &str, x: &[f64], y: &[f64]) -> Result<Panel, PlotError> {
        check_xy(name, x, y)?;
        self.series.push(Series {
            name: name.to_string(),
            style: Style::Points,
            x: x.to_vec(),
            y: y.to_vec(),
            sorted: false,
        });
        Ok(self)
    }

    /// Adds bars: bar k spans `edges[k]..edges[k+1]` with height `heights[k]`. Errors: no bars,
    /// `edges.len() != heights.len() + 1`, non-finite values or edges that do not increase.
    ///
    /// ```
    /// use gaugebook::{Axis, Panel};
    /// let p = Panel::new(Axis::new("range", "MPa"), Axis::new("cycles", "")).bars("count", &[0.0, 5.0, 10.0], &[3.0, 1.5])?;
    /// assert!(p.clone().bars("bad", &[0.0, 5.0], &[1.0, 2.0]).is_err());
    /// # Ok::<(), gaugebook::PlotError>(())
    /// ```
    pub fn bars(mut self, name: &str, edges: &[f64], heights: &[f64]) -> Result<Panel, PlotError> {
        if heights.is_empty() {
            return Err(PlotError::Empty {
                what: format!("series {name}"),
            });
        }
        if edges.len() != heights.len() + 1 {
            return Err(PlotError::Invalid {
                name: format!("bin edges of {name}"),
                found: format!("{} edges for {} bars", edges.len(), heights.len()),
                expected: "one more edge than bars".to_string(),
            });
        }
        check_finite(name, "x", edges)?;
        check_finite(name, "y", heights)?;
        if edges.windows(2).any(|w| w[1] <= w[0]) {
            return Err(PlotError::Invalid {
                name: format!("bin edges of {name}"),
                found: format!("{edges:?}"),
                expected: "strictly increasing edges".to_string(),
            });
        }
        self.series.push(Series {
            name: name.to_string(),
            style: Style::Bars,
            x: edges.to_vec(),
            y: heights.to_vec(),
            sorted: true,
        });
        Ok(self)
    }

    /// Relative height of this panel in a figure of several (default 1).
    ///
    /// ```
    /// use gaugebook::{Axis, Panel};
    /// let p = Panel::new(Axis::new("x", ""), Axis::new("y", "")).with_height(2.0);
    /// assert_eq!(p.series_count(), 0);
    /// ```
    pub fn with_height(mut self, weight: f64) -> Panel {
        self.weight = if weight.is_finite() && weight > 0.0 {
            weight
        } else {
            1.0
        };
        self
    }

    /// Draws a horizontal line at y = 0 (for residuals and errors).
    ///
    /// ```
    /// use gaugebook::{Axis, Panel};
    /// let p = Panel::new(Axis::new("x", ""), Axis::new("error", "N")).with_zero_line();
    /// assert_eq!(p.series_count(), 0);
    /// ```
    pub fn with_zero_line(mut self) -> Panel {
        self.zero_line = true;
        self
    }

    /// Number of series.
    ///
    /// ```
    /// let p = gaugebook::Panel::new(gaugebook::Axis::new("x", ""), gaugebook::Axis::new("y", ""));
    /// assert_eq!(p.series_count(), 0);
    /// ```
    pub fn series_count(&self) -> usize {
        self.series.len()
    }
}

/// A figure: title, size in pixels (SVG user units) and panels stacked top to bottom.
///
/// ```
/// use gaugebook::{Axis, Plot};
/// let t: Vec<f64> = (0..1000).map(|k| k as f64 * 1e-3).collect();
/// let a: Vec<f64> = t.iter().map(|t| (40.0 * t).sin()).collect();
/// let fig = Plot::time_series("bar test", &t, Axis::new("time", "s"), &[("sg1", &a[..])], Axis::new("strain", "µε"))?;
/// let svg = fig.to_svg()?;
/// assert!(svg.starts_with("<svg") && svg.contains("strain (µε)"));
/// # Ok::<(), gaugebook::PlotError>(())
/// ```
#[derive(Clone, Debug, PartialEq)]
pub struct Plot {
    pub(crate) title: String,
    pub(crate) width: u32,
    pub(crate) height: u32,
    pub(crate) panels: Vec<Panel>,
}

impl Plot {
    /// An empty figure of 900 × 500 pixels.
    ///
    /// ```
    /// let f = gaugebook::Plot::new("empty");
    /// assert_eq!(f.size(), (900, 500));
    /// assert!(f.to_svg().is_err()); // nothing to draw
    /// ```
    pub fn new(title: impl Into<String>) -> Plot {
        Plot {
            title: title.into(),
            width: 900,
            height: 500,
            panels: Vec::new(),
        }
    }

    /// Sets the size; each side from 100 to 8000 pixels.
    ///
    /// ```
    /// let f = gaugebook::Plot::new("f").with_size(640, 480)?;
    /// assert_eq!(f.size(), (640, 480));
    /// assert!(gaugebook::Plot::new("f").with_size(10, 480).is_err());
    /// # Ok::<(), gaugebook::PlotError>(())
    /// ```
    pub fn with_size(mut self, width: u32, height: u32) -> Result<Plot, PlotError> {
        // 100 px leaves room for axis labels; 8000 px bounds a PNG buffer at 192 MB.
        for (name, v) in [("figure width", width), ("figure height", height)] {
            if !(100..=8000).contains(&v) {
                return Err(PlotError::Invalid {
                    name: name.to_string(),
                    found: format!("{v} px"),
                    expected: "100 to 8000 px".to_string(),
                });
            }
        }
        self.width = width;
        self.height = height;
        Ok(self)
    }

    /// Adds a panel below the others.
    ///
    /// ```
    /// use gaugebook::{Axis, Plot, Panel};
    /// let f = Plot::new("f").with_panel(Panel::new(Axis::new("x", "m"), Axis::new("y", "m")).line("a", &[0.0, 1.0], &[1.0, 0.0])?);
    /// assert_eq!(f.panel_count(), 1);
    /// # Ok::<(), gaugebook::PlotError>(())
    /// ```
    pub fn with_panel(mut self, panel: Panel) -> Plot {
        self.panels.push(panel);
        self
    }

    /// Width and height in pixels.
    ///
    /// ```
    /// assert_eq!(gaugebook::Plot::new("f").size(), (900, 500));
    /// ```
    pub fn size(&self) -> (u32, u32) {
        (self.width, self.height)
    }

    /// Number of panels.
    ///
    /// ```
    /// assert_eq!(gaugebook::Plot::new("f").panel_count(), 0);
    /// ```
    pub fn panel_count(&self) -> usize {
        self.panels.len()
    }

    /// The title.
    ///
    /// ```
    /// assert_eq!(gaugebook::Plot::new("creep at 20 kN").title(), "creep at 20 kN");
    /// ```
    pub fn title(&self) -> &str {
        &self.title
    }

    /// Several channels against one time axis, in one panel. Errors as for [`Panel::line`].
    ///
    /// ```
    /// use gaugebook::{Axis, Plot};
    /// let t = [0.0, 0.001, 0.002];
    /// let f = Plot::time_series("zero", &t, Axis::new("time", "s"), &[("sg1", &[0.0, 1.0, 0.5][..]), ("sg2", &[1.0, 0.0, 0.2][..])], Axis::new("strain", "µε"))?;
    /// let svg = f.to_svg()?;
    /// assert!(svg.contains("sg1") && svg.contains("sg2")); // legend
    /// # Ok::<(), gaugebook::PlotError>(())
    /// ```
    pub fn time_series(
        title: &str,
        time: &[f64],
        time_axis: Axis,
        channels: &[(&str, &[f64])],
        value_axis: Axis,
    ) -> Result<Plot, PlotError> {
        if channels.is_empty() {
            return Err(PlotError::Empty {
                what: "time series figure (no channels)".to_string(),
            });
        }
        let mut panel = Panel::new(time_axis, value_axis);
        for (name, y) in channels {
            panel = panel.line(name, time, y)?;
        }
        Ok(Plot::new(title).with_panel(panel))
    }

    /// A calibration curve: measured points and the fitted line over `x`, and beneath them the
    /// residuals (measured − fitted) with a zero line. Errors as for [`Panel::line`].
    ///
    /// ```
    /// use gaugebook::{Axis, Plot};
    /// let load = [0.0, 2.0, 4.0, 6.0, 8.0, 10.0];
    /// let out = [0.0001, 0.4003, 0.7998, 1.2004, 1.5999, 2.0002];
    /// let fit: Vec<f64> = load.iter().map(|l| 0.2 * l).collect();
    /// let f = Plot::calibration("sensitivity", &load, &out, &fit, Axis::new("load", "kN"), Axis::new("output", "mV/V"))?;
    /// assert_eq!(f.panel_count(), 2);
    /// assert!(f.to_svg()?.contains("residual (mV/V)"));
    /// # Ok::<(), gaugebook::PlotError>(())
    /// ```
    pub fn calibration(
        title: &str,
        x: &[f64],
        measured: &[f64],
        fitted: &[f64],
        x_axis: Axis,
        y_axis: Axis,
    ) -> Result<Plot, PlotError> {
        check_xy("measured", x, measured)?;
        check_xy("fitted", x, fitted)?;
        let residual: Vec<f64> = measured.iter().zip(fitted).map(|(m, f)| m - f).collect();
        let mut order: Vec<usize> = (0..x.len()).collect();
        order.sort_by(|&a, &b| x[a].total_cmp(&x[b]));
        let xs: Vec<f64> = order.iter().map(|&i| x[i]).collect();
        let fs: Vec<f64> = order.iter().map(|&i| fitted[i]).collect();
        let top = Panel::new(x_axis.clone(), y_axis.clone())
            .points("measured", x, measured)?
            .line("fit", &xs, &fs)?
            .with_height(2.0);
        let bottom = Panel::new(x_axis, Axis::new("residual", y_axis.unit))
            .points("residual", x, &residual)?
            .with_zero_line();
        Ok(Plot::new(title).with_panel(top).with_panel(bottom))
    }

    /// A histogram of `values` in `bins` equal bins spanning their range. Errors: no values, a
    /// non-finite value, or `bins` of 0.
    ///
    /// ```
    /// use gaugebook::{Axis, Plot};
    /// let f = Plot::histogram("noise", &[0.1, 0.2, 0.2, 0.3, 0.9], 4, Axis::new("zero", "µV/V"))?;
    /// assert!(f.to_svg()?.contains("<rect"));
    /// # Ok::<(), gaugebook::PlotError>(())
    /// ```
    pub fn histogram(
        title: &str,
        values: &[f64],
        bins: usize,
        axis: Axis,
    ) -> Result<Plot, PlotError> {
        let (edges, counts) = histogram_bins(values, bins)?;
        let panel = Panel::new(axis, Axis::new("count", "")).bars("count", &edges, &counts)?;
        Ok(Plot::new(title).with_panel(panel))
    }
}

/// Edges (`bins + 1`) and counts of `bins` equal bins spanning the values' range, by
/// numpy.histogram's rule: bins are half-open [a, b) except the last, which includes the
/// maximum; a flat data set gets the range min − 0.5 … max + 0.5. Errors: no values, a
/// non-finite value, or `bins` of 0.
///
/// ```
/// let (edges, counts) = gaugebook::histogram_bins(&[0.0, 0.5, 1.0, 1.0, 2.0, 1.2, 1.7], 4)?;
/// assert_eq!(edges, vec![0.0, 0.5, 1.0, 1.5, 2.0]);
/// assert_eq!(counts, vec![1.0, 1.0, 3.0, 2.0]); // numpy.histogram(..., bins=4), numpy 2.4.6
/// # Ok::<(), gaugebook::PlotError>(())
/// ```
pub fn histogram_bins(values: &[f64], bins: usize) -> Result<(Vec<f64>, Vec<f64>), PlotError> {
    if values.is_empty() {
        return Err(PlotError::Empty {
            what: "histogram".to_string(),
        });
    }
    check_finite("histogram", "x", values)?;
    if bins == 0 {
        return Err(PlotError::Invalid {
            name: "bin count".into(),
            found: "0".into(),
            expected: "1 or more".into(),
        });
    }
    let mut lo = values.iter().copied().fold(f64::INFINITY, f64::min);
    let mut hi = values.iter().copied().fold(f64::NEG_INFINITY, f64::max);
    if hi <= lo {
        lo -= 0.5;
        hi += 0.5;
    }
    let w = (hi - lo) / bins as f64;
    let edges: Vec<f64> = (0..=bins).map(|k| lo + k as f64 * w).collect();
    let mut counts = vec![0.0; bins];
    for v in values {
        let k = (((v - lo) / w) as usize).min(bins - 1);
        counts[k] += 1.0;
    }
    Ok((edges, counts))
}

fn check_xy(name: &str, x: &[f64], y: &[f64]) -> Result<(), PlotError> {
    if x.len() != y.len() {
        return Err(PlotError::LengthMismatch {
            series: name.to_string(),
            x: x.len(),
            y: y.len(),
        });
    }
    if x.is_empty() {
        return Err(PlotError::Empty {
            what: format!("series {name}"),
        });
    }
    check_finite(name, "x", x)?;
    check_finite(name, "y", y)
}

fn check_finite(name: &str, axis: &'static str, v: &[f64]) -> Result<(), PlotError> {
    match crate::error::first_non_finite(v) {
        Some(index) => Err(PlotError::NonFinite {
            series: name.to_string(),
            axis,
            index,
        }),
        None => Ok(()),
    }
}
