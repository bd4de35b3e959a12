//! Figures: SVG and PNG output, thinning of long series, atomic saving, MIME bundles, errors.
//! The PNG checks decode the image again with the png crate (0.17) and look at its pixels.

use gaugebook::{Axis, MimeBundle, Panel, Plot, PlotError, ToMime, base64_encode, histogram_bins};

fn sine_figure() -> Plot {
    let t: Vec<f64> = (0..2000).map(|k| k as f64 * 1e-3).collect();
    let a: Vec<f64> = t.iter().map(|t| 100.0 * (6.0 * t).sin()).collect();
    let b: Vec<f64> = t.iter().map(|t| 60.0 * (9.0 * t).cos()).collect();
    Plot::time_series(
        "creep hold",
        &t,
        Axis::new("time", "s"),
        &[("sg1", &a[..]), ("sg2", &b[..])],
        Axis::new("strain", "µε"),
    )
    .unwrap()
}

fn decode(png: &[u8]) -> (u32, u32, Vec<u8>) {
    let dec = png::Decoder::new(png);
    let mut reader = dec.read_info().unwrap();
    let mut buf = vec![0; reader.output_buffer_size()];
    let info = reader.next_frame(&mut buf).unwrap();
    assert_eq!(info.color_type, png::ColorType::Rgb);
    buf.truncate(info.buffer_size());
    (info.width, info.height, buf)
}

#[test]
fn svg_has_title_axes_and_legend() {
    let svg = sine_figure().to_svg().unwrap();
    assert!(svg.starts_with("<svg") && svg.trim_end().ends_with("</svg>"));
    for text in ["creep hold", "time (s)", "strain (µε)", "sg1", "sg2"] {
        assert!(svg.contains(text), "missing {text}");
    }
    // The first palette colour (deep blue #1F4E79) draws the first channel.
    assert!(svg.to_ascii_uppercase().contains("#1F4E79"));
}

#[test]
fn png_decodes_with_drawn_lines_and_text() {
    let f = sine_figure().with_size(640, 400).unwrap();
    let (w, h, rgb) = decode(&f.to_png().unwrap());
    assert_eq!((w, h), (640, 400));
    let px: Vec<&[u8]> = rgb.chunks(3).collect();
    let blue = px
        .iter()
        .filter(|p| p[0] == 0x1f && p[1] == 0x4e && p[2] == 0x79)
        .count();
    assert!(blue > 200, "first channel drawn: {blue} pixels");
    // Title text is drawn with the embedded font: dark pixels in the top 30 rows.
    let dark_top = px[..(30 * w as usize)]
        .iter()
        .filter(|p| p[0] < 100 && p[1] < 100 && p[2] < 100)
        .count();
    assert!(dark_top > 50, "title text: {dark_top} dark pixels");
}

#[test]
fn millions_of_points_stay_small_and_keep_spikes() {
    let n = 2_000_000;
    let mut y: Vec<f64> = (0..n).map(|k| (k as f64 * 1e-4).sin()).collect();
    y[1_234_567] = 100.0; // one-sample spike
    let panel = Panel::new(Axis::new("time", "s"), Axis::new("load", "kN"))
        .sampled("load", 0.0, 1e-3, &y)
        .unwrap();
    let f = Plot::new("long").with_panel(panel);
    let svg = f.to_svg().unwrap();
    // Thinned per pixel column: about 4 points per column of a 900-px figure, not 2 M.
    assert!(svg.len() < 400_000, "svg is {} bytes", svg.len());
    // The spike sets the axis top, so its tick is labelled.
    let ticks: Vec<String> = svg
        .split("<text")
        .skip(1)
        .filter_map(|t| t.split('>').nth(1))
        .map(|t| t.split('<').next().unwrap_or("").trim().to_string())
        .collect();
    assert!(ticks.iter().any(|t| t == "100"), "no 100 tick in {ticks:?}");
}

#[test]
fn a_series_in_blocks_draws_the_figure_of_the_joined_series() {
    // Thinning block by block keeps the points thinning the joined series keeps, so the two
    // figures are the same text; a bad block is named.
    let n = 1_500_000;
    let t: Vec<f64> = (0..n).map(|k| k as f64 * 1e-3).collect();
    let mut y: Vec<f64> = t
        .iter()
        .map(|t| (3.0 * t).sin() + (50.0 * t).cos())
        .collect();
    y[777_777] = -40.0;
    let axes = || Panel::new(Axis::new("time", "s"), Axis::new("load", "kN"));
    let whole = Plot::new("f").with_panel(axes().line("load", &t, &y).unwrap());
    for size in [1_000, 65_536, 400_001] {
        let blocks: Vec<(&[f64], &[f64])> = t.chunks(size).zip(y.chunks(size)).collect();
        let parts = Plot::new("f").with_panel(axes().line_blocks("load", &blocks).unwrap());
        assert_eq!(
            parts.to_svg().unwrap(),
            whole.to_svg().unwrap(),
            "blocks of {size}"
        );
    }
    let e = axes()
        .line_blocks("load", &[(&t[..2], &y[..2]), (&t[2..4], &y[2..3])])
        .unwrap_err();
    assert_eq!(
        e.to_string(),
        "series load (block 1) has 2 x values but 1 y values"
    );
}

#[test]
fn calibration_figure_has_residual_panel() {
    let load = [0.0, 2.0, 4.0, 6.0, 8.0, 10.0];
    let out = [0.0002, 0.4001, 0.7996, 1.2003, 1.6001, 1.9998];
    let fit: Vec<f64> = load.iter().map(|l| 0.2 * l).collect();
    let f = Plot::calibration(
        "cal",
        &load,
        &out,
        &fit,
        Axis::new("load", "kN"),
        Axis::new("output", "mV/V"),
    )
    .unwrap();
    assert_eq!(f.panel_count(), 2);
    let svg = f.to_svg().unwrap();
    assert!(svg.contains("residual (mV/V)") && svg.contains("load (kN)"));
    assert!(f.to_png().is_ok());
}

#[test]
fn histogram_counts_every_value() {
    // numpy.histogram rule: bins [lo, hi) except the last, which includes the maximum.
    let (edges, counts) = histogram_bins(&[0.0, 0.5, 1.0, 1.0, 2.0, 1.2, 1.7], 4).unwrap();
    // numpy.histogram([0, 0.5, 1, 1, 2, 1.2, 1.7], bins=4), numpy 2.4.6.
    assert_eq!(counts, [1.0, 1.0, 3.0, 2.0]);
    assert_eq!(edges, [0.0, 0.5, 1.0, 1.5, 2.0]);
    // numpy.histogram([3.0, 3.0], bins=2), numpy 2.4.6: a flat set spans 2.5..3.5.
    assert_eq!(
        histogram_bins(&[3.0, 3.0], 2).unwrap(),
        (vec![2.5, 3.0, 3.5], vec![0.0, 2.0])
    );
    let f = Plot::histogram(
        "h",
        &[0.0, 0.5, 1.0, 1.0, 2.0],
        2,
        Axis::new("range", "MPa"),
    )
    .unwrap();
    assert!(f.to_svg().unwrap().contains("<rect"));
    assert!(Plot::histogram("h", &[], 2, Axis::new("x", "")).is_err());
    assert!(Plot::histogram("h", &[1.0], 0, Axis::new("x", "")).is_err());
}

#[test]
fn save_is_atomic_and_picks_the_format() {
    let dir = tempfile::tempdir().unwrap();
    let f = sine_figure();
    let svg = dir.path().join("a.svg");
    let png = dir.path().join("a.PNG");
    std::fs::write(&svg, "old").unwrap();
    f.save(&svg).unwrap();
    f.save(&png).unwrap();
    assert!(std::fs::read_to_string(&svg).unwrap().starts_with("<svg"));
    assert_eq!(&std::fs::read(&png).unwrap()[..4], b"\x89PNG");
    // No temporary file left behind.
    let names: Vec<String> = std::fs::read_dir(dir.path())
        .unwrap()
        .map(|e| e.unwrap().file_name().to_string_lossy().into_owned())
        .collect();
    assert_eq!(names.len(), 2, "{names:?}");
    assert!(matches!(
        f.save(dir.path().join("a.jpg")),
        Err(PlotError::UnknownFormat { .. })
    ));
    let missing = dir.path().join("no-such-dir").join("a.svg");
    assert!(matches!(f.save(&missing), Err(PlotError::Io { .. })));
    assert!(!missing.exists());
}

#[test]
fn mime_bundle_carries_svg_and_base64_png() {
    let f = sine_figure();
    let b: MimeBundle = f.to_mime();
    assert_eq!(
        b.mime_types().collect::<Vec<_>>(),
        ["image/png", "image/svg+xml", "text/plain"]
    );
    let png = f.to_png().unwrap();
    assert_eq!(b.get("image/png").unwrap(), base64_encode(&png));
    assert_eq!(b.get("image/png").unwrap().len(), png.len().div_ceil(3) * 4);
    // An empty figure shows its reason as text only.
    let e = Plot::new("empty").to_mime();
    assert_eq!(e.mime_types().count(), 1);
    assert!(e.get("text/plain").unwrap().contains("nothing to plot"));
}

#[test]
fn bad_series_are_typed_errors() {
    let p = Panel::new(Axis::new("x", ""), Axis::new("y", ""));
    let e = p.clone().line("sg1", &[0.0, 1.0], &[1.0]).unwrap_err();
    assert_eq!(e.to_string(), "series sg1 has 2 x values but 1 y values");
    let e = p
        .clone()
        .points("sg1", &[0.0, f64::INFINITY], &[1.0, 2.0])
        .unwrap_err();
    assert_eq!(
        e.to_string(),
        "series sg1 has a non-finite x value at index 1: expected finite values"
    );
    assert!(matches!(
        p.clone().line("a", &[], &[]),
        Err(PlotError::Empty { .. })
    ));
    assert!(p.sampled("a", 0.0, 0.0, &[1.0]).is_err());
    assert!(Plot::new("f").with_size(9000, 100).is_err());
}
