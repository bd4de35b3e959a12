//! Notebook views of a layout's answers: the bridge report, the response matrix, the placement
//! sensitivity table and the design sweep, as HTML tables beside their plain-text form.
//!
//! The numbers are the result's own fields, in the units the plain-text form uses (mV/V per kN
//! for forces, per N·m for moments); nothing is recomputed here.

use uom::si::frequency::hertz;
use uom::si::pressure::megapascal;

use super::grid::{Grid, num, opt};
use crate::{
    BridgeReport, LoadComponent, MARGIN_CAUTION, MimeBundle, ResponseMatrix, SensitivityTable,
    SweepTable, ToMime,
};

/// mV/V per kN (forces) or per N·m (moments) from V/V per N or per N·m.
fn per_unit_load(c: LoadComponent, v_per_v: f64) -> f64 {
    if c.is_moment() {
        v_per_v * 1e3
    } else {
        v_per_v * 1e6
    }
}

fn unit_load(c: LoadComponent) -> &'static str {
    if c.is_moment() { "N·m" } else { "kN" }
}

/// The caution every layout view carries: these are model estimates.
const ESTIMATE_NOTE: &str = "Design estimates must be proven by test.";

impl ToMime for BridgeReport {
    /// Plain text as [`Display`](std::fmt::Display); HTML: one row per load component (output
    /// per unit load, cross-talk and the off-axis load it refers to), then temperature and
    /// linearity.
    ///
    /// ```
    /// use gaugebook::{Arrangement, Gauge, Layout, TorqueShaft, ToMime, material};
    /// use gaugebook::units::{ElectricalResistance, Length};
    /// use uom::si::{electrical_resistance::ohm, length::millimeter};
    /// let mm = Length::new::<millimeter>;
    /// let s = TorqueShaft::solid(material("4340")?, mm(20.0), mm(100.0), mm(50.0))?;
    /// let g = Gauge::new(ElectricalResistance::new::<ohm>(350.0), 2.0)?;
    /// let r = Layout::standard(s, &g, Arrangement::FullShear, 100.0)?.report(0)?;
    /// let html = r.to_mime().get("text/html").unwrap().to_string();
    /// assert!(html.contains("<th style=\"text-align:left\">Mx (N·m)</th>"));
    /// assert!(html.contains("(primary)"));
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    fn to_mime(&self) -> MimeBundle {
        let mut g = Grid::new(
            format!(
                "bridge {}: rated output {} at {}",
                self.bridge, self.rated_output, self.capacity
            ),
            &[
                "component",
                "output (mV/V per kN or N·m)",
                "cross-talk (% RO)",
                "off-axis load",
            ],
        );
        for c in LoadComponent::ALL {
            let k = c.index();
            let (x, at) = match self.cross_talk[k] {
                Some(x) => (
                    num(x),
                    format!("{} {}", num(self.cross_talk_basis.get(c)), c.unit_symbol()),
                ),
                None => ("(primary)".to_string(), String::new()),
            };
            g.row(vec![
                format!("{c} ({})", unit_load(c)),
                num(per_unit_load(c, self.per_load[k])),
                x,
                at,
            ]);
        }
        let mut t = Grid::new("temperature and linearity", &["figure", "value", "unit"]);
        t.row(vec![
            "rated output".into(),
            num(self.rated_output.mv_per_v()),
            "mV/V".into(),
        ]);
        t.row(vec![
            "zero drift".into(),
            num(self.zero_per_kelvin * 1e3),
            "mV/V per K".into(),
        ]);
        t.row(vec![
            "span drift".into(),
            num(self.span_per_kelvin * 100.0),
            "% per K".into(),
        ]);
        t.row(vec![
            "nonlinearity at capacity".into(),
            num(self.nonlinearity),
            "%".into(),
        ]);
        t.row(vec![
            "terminal-line nonlinearity".into(),
            num(self.endpoint_nonlinearity),
            "% RO".into(),
        ]);
        t.note(ESTIMATE_NOTE);
        let mut html = g.to_html();
        html.push_str(&t.to_html());
        MimeBundle::text(self.to_string()).with("text/html", html)
    }
}

impl ToMime for ResponseMatrix {
    /// Plain text as [`Display`](std::fmt::Display); HTML: one row per bridge, one column per
    /// load component and one for temperature.
    ///
    /// ```
    /// use gaugebook::{Arrangement, Gauge, Layout, TorqueShaft, ToMime, material};
    /// use gaugebook::units::{ElectricalResistance, Length};
    /// use uom::si::{electrical_resistance::ohm, length::millimeter};
    /// let mm = Length::new::<millimeter>;
    /// let s = TorqueShaft::solid(material("4340")?, mm(20.0), mm(100.0), mm(50.0))?;
    /// let g = Gauge::new(ElectricalResistance::new::<ohm>(350.0), 2.0)?;
    /// let m = Layout::standard(s, &g, Arrangement::FullShear, 100.0)?.response_matrix()?;
    /// let html = m.to_mime().get("text/html").unwrap().to_string();
    /// assert!(html.contains("<th>Mx (mV/V per N·m)</th>"));
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    fn to_mime(&self) -> MimeBundle {
        let heads: Vec<String> = std::iter::once("bridge".to_string())
            .chain(
                LoadComponent::ALL
                    .iter()
                    .map(|&c| format!("{c} (mV/V per {})", unit_load(c))),
            )
            .chain(std::iter::once("temperature (mV/V per K)".to_string()))
            .collect();
        let heads: Vec<&str> = heads.iter().map(String::as_str).collect();
        let mut g = Grid::new("response matrix", &heads);
        for (i, name) in self.bridges.iter().enumerate() {
            let mut row = vec![name.clone()];
            for c in LoadComponent::ALL {
                row.push(num(per_unit_load(c, self.per_load[i][c.index()])));
            }
            row.push(num(self.per_kelvin[i] * 1e3));
            g.row(row);
        }
        g.note(ESTIMATE_NOTE);
        MimeBundle::text(self.to_string()).with("text/html", g.to_html())
    }
}

impl ToMime for SensitivityTable {
    /// Plain text as [`Display`](std::fmt::Display); HTML: one row per gauge and error, most
    /// important first.
    ///
    /// ```
    /// use gaugebook::{Arrangement, Cantilever, Gauge, Layout, ToMime, material};
    /// use gaugebook::units::{Angle, ElectricalResistance, Length};
    /// use uom::si::{angle::degree, electrical_resistance::ohm, length::millimeter};
    /// let mm = Length::new::<millimeter>;
    /// let beam = Cantilever::new(material("2024-T351")?, mm(100.0), mm(20.0), mm(5.0), mm(30.0))?;
    /// let g = Gauge::new(ElectricalResistance::new::<ohm>(350.0), 2.0)?;
    /// let l = Layout::standard(beam, &g, Arrangement::FullBending, 50.0)?;
    /// let t = l.placement_sensitivity(0, Angle::new::<degree>(2.0), mm(0.5))?;
    /// let html = t.to_mime().get("text/html").unwrap().to_string();
    /// assert_eq!(html.matches("<tr><th style").count(), 12); // one row per gauge and error
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    fn to_mime(&self) -> MimeBundle {
        use uom::si::angle::degree;
        use uom::si::length::millimeter;
        let mut g = Grid::new(
            format!(
                "bridge {}: placement sensitivity at ±{}° angle, ±{} mm position",
                self.bridge,
                num(self.angle_tolerance.get::<degree>()),
                num(self.position_tolerance.get::<millimeter>())
            ),
            &[
                "gauge",
                "error",
                "ΔRO (% RO)",
                "worst cross-talk Δ (% RO)",
                "component",
            ],
        );
        for r in &self.rows {
            g.row(vec![
                r.gauge.clone(),
                r.error.to_string(),
                num(r.rated_output_change),
                num(r.cross_talk_change[r.worst_component.index()]),
                r.worst_component.to_string(),
            ]);
        }
        g.note(ESTIMATE_NOTE);
        MimeBundle::text(self.to_string()).with("text/html", g.to_html())
    }
}

impl ToMime for SweepTable {
    /// Plain text as [`Display`](std::fmt::Display); HTML: one row per design, the refused
    /// parameter values and the margin caution as notes.
    ///
    /// ```
    /// use gaugebook::{Arrangement, Cantilever, DesignCriteria, Gauge, Layout, ToMime, material, sweep};
    /// use gaugebook::units::{ElectricalResistance, Length};
    /// use uom::si::{electrical_resistance::ohm, length::millimeter};
    /// let mm = Length::new::<millimeter>;
    /// let g = Gauge::new(ElectricalResistance::new::<ohm>(350.0), 2.0)?;
    /// let build = |h: f64| {
    ///     let beam = Cantilever::new(material("2024-T351")?, mm(100.0), mm(20.0), mm(h), mm(30.0))?;
    ///     Layout::standard(beam, &g, Arrangement::FullBending, 50.0)
    /// };
    /// let t = sweep("depth (mm)", &[4.0, 5.0, 25.0], build, &DesignCriteria::default());
    /// let html = t.to_mime().get("text/html").unwrap().to_string();
    /// assert!(html.contains("<th>depth (mm)</th>"));
    /// assert!(html.contains("skipped 25"));
    /// assert!(html.contains("licensed practice"));
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    fn to_mime(&self) -> MimeBundle {
        let heads: Vec<String> = self
            .names
            .iter()
            .cloned()
            .chain(
                [
                    "RO (mV/V)",
                    "peak stress (MPa)",
                    "yield factor at safe overload",
                    "fatigue factor",
                    "stiffness",
                    "f1 (Hz)",
                    "meets margins",
                ]
                .map(String::from),
            )
            .collect();
        let heads: Vec<&str> = heads.iter().map(String::as_str).collect();
        let mut g = Grid::new("design sweep", &heads);
        for p in &self.points {
            let mut row: Vec<String> = p.parameters.iter().map(|&v| num(v)).collect();
            row.extend([
                num(p.rated_output.mv_per_v()),
                num(p.peak_stress.get::<megapascal>()),
                num(p.yield_factor),
                opt(p.fatigue_factor),
                p.stiffness.to_string(),
                num(p.frequency.get::<hertz>()),
                if p.meets_margins { "yes" } else { "no" }.to_string(),
            ]);
            g.row(row);
        }
        for (v, e) in &self.skipped {
            let vals: Vec<String> = v.iter().map(|&x| num(x)).collect();
            g.note(format!("skipped {}: {e}", vals.join(", ")));
        }
        g.note(format!("Caution: {MARGIN_CAUTION}."));
        MimeBundle::text(self.to_string()).with("text/html", g.to_html())
    }
}
