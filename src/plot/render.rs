//! Drawing a [`Plot`] with plotters onto any backend (SVG text or an RGB buffer), and the
//! PNG encoding of that buffer.
//!
//! Layout and colours are this project's own: a white ground, a thin grey frame and light grid,
//! dark axis text, and a seven-colour palette of strong, print-distinguishable hues (deep blue,
//! burnt orange, green, violet, ochre, teal, grey) that stay apart in greyscale by lightness.

use super::error::PlotError;
use super::figure::{Panel, Plot, Style};
use super::thin::thin;
use plotters::coord::Shift;
use plotters::prelude::*;
use std::sync::OnceLock;

/// DejaVu Sans 2.37 (Debian fonts-dejavu-core 2.37-6; Bitstream Vera licence with public-domain
/// DejaVu changes, see DejaVuSans-LICENSE.txt beside it), so PNG text needs no system fonts.
static FONT: &[u8] = include_bytes!("DejaVuSans.ttf");
/// The family name plotters looks the font up by; SVG output names the same generic family.
const FAMILY: &str = "sans-serif";

const PALETTE: [RGBColor; 7] = [
    RGBColor(0x1f, 0x4e, 0x79),
    RGBColor(0xc4, 0x55, 0x1c),
    RGBColor(0x2e, 0x7d, 0x32),
    RGBColor(0x7b, 0x3f, 0x98),
    RGBColor(0x9a, 0x7b, 0x0a),
    RGBColor(0x00, 0x83, 0x8f),
    RGBColor(0x5a, 0x5a, 0x5a),
];
const INK: RGBColor = RGBColor(0x22, 0x22, 0x22);
const FRAME: RGBColor = RGBColor(0x99, 0x99, 0x99);
const GRID: RGBColor = RGBColor(0xe4, 0xe4, 0xe4);

/// Registers the embedded font with plotters once per process.
fn ensure_font() -> Result<(), PlotError> {
    static DONE: OnceLock<Result<(), String>> = OnceLock::new();
    DONE.get_or_init(|| {
        plotters::style::register_font(FAMILY, FontStyle::Normal, FONT)
            .map_err(|_| "the embedded DejaVu Sans font could not be read".to_string())
    })
    .clone()
    .map_err(PlotError::Render)
}

fn render_err(e: impl std::fmt::Display) -> PlotError {
    PlotError::Render(e.to_string())
}

/// Draws the figure on a backend.
pub(crate) fn draw<DB: DrawingBackend>(fig: &Plot, backend: DB) -> Result<(), PlotError> {
    ensure_font()?;
    if fig.panels.iter().all(|p| p.series.is_empty()) {
        return Err(PlotError::Empty {
            what: format!("figure {}", fig.title),
        });
    }
    let root = backend.into_drawing_area();
    root.fill(&WHITE).map_err(render_err)?;
    let body = if fig.title.is_empty() {
        root.clone()
    } else {
        root.titled(&fig.title, (FAMILY, 20).into_font().color(&INK))
            .map_err(render_err)?
    };
    let total: f64 = fig.panels.iter().map(|p| p.weight).sum();
    let (_, h) = body.dim_in_pixel();
    let mut rest = body;
    let mut colour = 0;
    for (k, panel) in fig.panels.iter().enumerate() {
        let area = if k + 1 == fig.panels.len() {
            rest.clone()
        } else {
            let px = (h as f64 * panel.weight / total).round() as i32;
            let (top, bottom) = rest.split_vertically(px);
            rest = bottom;
            top
        };
        draw_panel(&area, panel, &mut colour)?;
    }
    root.present().map_err(render_err)
}

/// Data extent with a margin; a flat extent is widened so the axis has a span.
fn extent(values: impl Iterator<Item = f64>, margin: f64, include_zero: bool) -> (f64, f64) {
    let (mut lo, mut hi) = values.fold((f64::INFINITY, f64::NEG_INFINITY), |(l, h), v| {
        (l.min(v), h.max(v))
    });
    if include_zero {
        lo = lo.min(0.0);
        hi = hi.max(0.0);
    }
    if !(lo.is_finite() && hi.is_finite()) {
        return (0.0, 1.0);
    }
    if hi <= lo {
        let pad = if lo == 0.0 { 1.0 } else { lo.abs() * 0.05 };
        return (lo - pad, hi + pad);
    }
    let pad = (hi - lo) * margin;
    (
        if include_zero && lo == 0.0 {
            0.0
        } else {
            lo - pad
        },
        hi + pad,
    )
}

/// Tick text for an axis spanning `span`: enough decimals to tell ticks about span/6 apart,
/// trailing zeros trimmed, round-off near zero shown as 0, exponent form for magnitudes of a
/// million or more and for spans below a millionth.
fn tick(v: f64, span: f64) -> String {
    let span = if span > 0.0 && span.is_finite() {
        span
    } else {
        1.0
    };
    if v.abs() < span * 1e-9 {
        return "0".to_string();
    }
    if v.abs() >= 1e6 || span < 1e-6 {
        return format!("{v:.2e}");
    }
    let step = span / 6.0;
    let digits = (1 - step.log10().floor() as i32).clamp(0, 12) as usize;
    let s = format!("{v:.digits$}");
    if s.contains('.') {
        s.trim_end_matches('0').trim_end_matches('.').to_string()
    } else {
        s
    }
}

fn draw_panel<DB: DrawingBackend>(
    area: &DrawingArea<DB, Shift>,
    panel: &Panel,
    colour: &mut usize,
) -> Result<(), PlotError> {
    let has_bars = panel.series.iter().any(|s| s.style == Style::Bars);
    let lines_only = panel.series.iter().all(|s| s.style == Style::Line);
    let xm = if lines_only { 0.0 } else { 0.03 };
    let (x0, x1) = extent(
        panel.series.iter().flat_map(|s| s.x.iter().copied()),
        xm,
        false,
    );
    let ys = panel.series.iter().flat_map(|s| s.y.iter().copied());
    let (y0, y1) = extent(ys.chain(panel.zero_line.then_some(0.0)), 0.05, has_bars);
    let mut chart = ChartBuilder::on(area)
        .margin(10)
        .margin_right(24)
        .x_label_area_size(46)
        .y_label_area_size(78)
        .build_cartesian_2d(x0..x1, y0..y1)
        .map_err(render_err)?;
    let fmt_x = |v: &f64| tick(*v, x1 - x0);
    let fmt_y = |v: &f64| tick(*v, y1 - y0);
    chart
        .configure_mesh()
        .x_desc(panel.x_axis.title())
        .y_desc(panel.y_axis.title())
        .x_label_formatter(&fmt_x)
        .y_label_formatter(&fmt_y)
        .label_style((FAMILY, 13).into_font().color(&INK))
        .axis_desc_style((FAMILY, 15).into_font().color(&INK))
        .axis_style(FRAME)
        .bold_line_style(GRID)
        .max_light_lines(0)
        .x_labels(8)
        .y_labels(6)
        .draw()
        .map_err(render_err)?;
    if panel.zero_line {
        chart
            .draw_series(LineSeries::new(
                [(x0, 0.0), (x1, 0.0)],
                FRAME.stroke_width(1),
            ))
            .map_err(render_err)?;
    }
    let columns = chart.plotting_area().dim_in_pixel().0.max(1) as usize;
    let mut labelled = 0;
    // Bars under lines under points, so markers stay visible on a fitted line.
    let mut order: Vec<&super::figure::Series> = panel.series.iter().collect();
    order.sort_by_key(|s| match s.style {
        Style::Bars => 0,
        Style::Line => 1,
        Style::Points => 2,
    });
    for s in order {
        let c = PALETTE[*colour % PALETTE.len()];
        *colour += 1;
        match s.style {
            Style::Line => {
                let (xs, ys) = if s.sorted {
                    thin(&s.x, &s.y, columns)
                } else {
                    (s.x.clone(), s.y.clone())
                };
                chart
                    .draw_series(LineSeries::new(xs.into_iter().zip(ys), c.stroke_width(2)))
                    .map_err(render_err)?
                    .label(s.name.as_str())
                    .legend(move |(x, y)| {
                        PathElement::new(vec![(x, y), (x + 18, y)], c.stroke_width(2))
                    });
            }
            Style::Points => {
                chart
                    .draw_series(
                        s.x.iter()
                            .zip(&s.y)
                            .map(|(&x, &y)| Circle::new((x, y), 3, c.filled())),
                    )
                    .map_err(render_err)?
                    .label(s.name.as_str())
                    .legend(move |(x, y)| Circle::new((x + 9, y), 3, c.filled()));
            }
            Style::Bars => {
                chart
                    .draw_series(s.x.windows(2).zip(&s.y).map(|(e, &h)| {
                        Rectangle::new([(e[0], 0.0), (e[1], h)], c.mix(0.8).filled())
                    }))
                    .map_err(render_err)?
                    .label(s.name.as_str())
                    .legend(move |(x, y)| {
                        Rectangle::new([(x, y - 5), (x + 14, y + 5)], c.mix(0.8).filled())
                    });
                chart
                    .draw_series(s.x.windows(2).zip(&s.y).map(|(e, &h)| {
                        Rectangle::new([(e[0], 0.0), (e[1], h)], WHITE.stroke_width(1))
                    }))
                    .map_err(render_err)?;
            }
        }
        labelled += 1;
    }
    if labelled > 1 {
        chart
            .configure_series_labels()
            .position(legend_corner(panel, (x0, x1), (y0, y1)))
            .background_style(WHITE.mix(0.9))
            .border_style(FRAME)
            .label_font((FAMILY, 13).into_font().color(&INK))
            .draw()
            .map_err(render_err)?;
    }
    Ok(())
}

/// The upper corner whose quarter of the plot holds fewer data points, for the legend.
fn legend_corner(panel: &Panel, (x0, x1): (f64, f64), (y0, y1): (f64, f64)) -> SeriesLabelPosition {
    let (mut left, mut right) = (0usize, 0usize);
    for s in &panel.series {
        for (&x, &y) in s.x.iter().zip(&s.y) {
            let (fx, fy) = ((x - x0) / (x1 - x0), (y - y0) / (y1 - y0));
            if fy > 0.7 {
                if fx < 0.35 {
                    left += 1;
                } else if fx > 0.65 {
                    right += 1;
                }
            }
        }
    }
    if left < right {
        SeriesLabelPosition::UpperLeft
    } else {
        SeriesLabelPosition::UpperRight
    }
}

/// The figure as SVG text.
pub(crate) fn svg(fig: &Plot) -> Result<String, PlotError> {
    let mut out = String::new();
    draw(
        fig,
        SVGBackend::with_string(&mut out, (fig.width, fig.height)),
    )?;
    Ok(out)
}

/// The figure as PNG bytes (8-bit RGB).
pub(crate) fn png(fig: &Plot) -> Result<Vec<u8>, PlotError> {
    let (w, h) = (fig.width, fig.height);
    let mut rgb = vec![255u8; w as usize * h as usize * 3];
    draw(fig, BitMapBackend::with_buffer(&mut rgb, (w, h)))?;
    let mut bytes = Vec::new();
    {
        let mut enc = ::png::Encoder::new(&mut bytes, w, h);
        enc.set_color(::png::ColorType::Rgb);
        enc.set_depth(::png::BitDepth::Eight);
        let mut writer = enc.write_header().map_err(render_err)?;
        writer.write_image_data(&rgb).map_err(render_err)?;
        writer.finish().map_err(render_err)?;
    }
    Ok(bytes)
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn tick_text_is_short() {
        assert_eq!(tick(0.0, 10.0), "0");
        assert_eq!(tick(2.5, 10.0), "2.5");
        assert_eq!(tick(1000.0, 5000.0), "1000");
        assert_eq!(tick(-0.125, 0.5), "-0.125");
        assert_eq!(tick(1.0e7, 1e7), "1.00e7");
        assert_eq!(tick(0.30000000000000004, 1.0), "0.3");
        assert_eq!(tick(2e-4, 8e-4), "0.0002");
        assert_eq!(tick(-1.08e-19, 8e-4), "0");
    }
}
