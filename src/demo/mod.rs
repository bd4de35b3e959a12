//! The embedded worked example behind `gaugebook demo`: a bridge designed end to end on a
//! scenario of our own, with every figure in units.
//!
//! The scenario is invented for the demo: the Ashgrove seed-tray filler (a fictional machine)
//! weighs each tray on a 200 N aluminium bending beam. The report walks from the beam's surface
//! strain to bridge output, nonlinearity, gauge self-heating, cable effects, a shunt-calibration
//! resistor, the signal chain's resolution and the stress margins.

// Deterministic test logs for the example notebooks (area: examples).
mod logs;
pub use logs::{
    EXAMPLE_CELL, EXAMPLE_SPECTRUM, ExampleCell, ExampleLog, ExampleSpectrum, calibration_log,
    creep_log, example_logs, fatigue_log, temperature_log, write_example_logs,
};

use std::fmt;

use uom::si::area::square_millimeter;
use uom::si::electric_potential::{microvolt, millivolt, nanovolt, volt};
use uom::si::electrical_resistance::{kiloohm, ohm};
use uom::si::force::newton;
use uom::si::heat_flux_density::watt_per_square_meter;
use uom::si::length::{meter, millimeter};
use uom::si::power::milliwatt;
use uom::si::pressure::megapascal;
use uom::si::temperature_interval::kelvin;

use crate::display::{MimeBundle, ToMime, html_escape};
use crate::error::PhysicsError;
use crate::spring::{Cantilever, LoadComponent, MARGIN_CAUTION, Motion, SpringElement, Wrench};
use crate::units::{Area, ElectricPotential, ElectricalResistance, Length, TemperatureInterval};
use crate::{
    Adc, AdcReference, Amplifier, ArmId, Arrangement, Excitation, Gauge, GaugeDissipation,
    InputNoise, LeadWire, ShuntCalibration, ShuntDefinition, SignalChain, Strain, SupplyLeads,
    SupplyWiring, material,
};

/// A worked design: titled sections of labelled figures, printable as text and as HTML.
///
/// ```
/// let report = gaugebook::bridge_design_demo()?;
/// let text = report.to_string();
/// assert!(text.contains("rated output"));
/// assert!(text.contains("mV/V"));
/// # Ok::<(), gaugebook::PhysicsError>(())
/// ```
#[derive(Clone, Debug, PartialEq)]
pub struct DesignReport {
    /// The report's title.
    pub title: String,
    /// One paragraph saying what is designed (the scenario).
    pub scenario: String,
    /// Sections in reading order.
    pub sections: Vec<ReportSection>,
    /// Cautions printed at the end.
    pub cautions: Vec<String>,
}

/// One section of a [`DesignReport`]: a heading and rows of (figure, value, note).
///
/// ```
/// let r = gaugebook::bridge_design_demo()?;
/// assert!(r.sections.iter().any(|s| s.heading == "Bridge"));
/// # Ok::<(), gaugebook::PhysicsError>(())
/// ```
#[derive(Clone, Debug, PartialEq)]
pub struct ReportSection {
    /// The heading.
    pub heading: String,
    /// Rows: what, the value with its unit, and a short note (may be empty).
    pub rows: Vec<(String, String, String)>,
}

impl ReportSection {
    fn new(heading: &str) -> ReportSection {
        ReportSection {
            heading: heading.into(),
            rows: Vec::new(),
        }
    }

    fn row(&mut self, what: &str, value: impl fmt::Display, note: &str) {
        self.rows
            .push((what.into(), value.to_string(), note.into()));
    }
}

impl fmt::Display for DesignReport {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        writeln!(f, "{}", self.title)?;
        writeln!(f, "{}", "=".repeat(self.title.chars().count()))?;
        writeln!(f, "{}", self.scenario)?;
        for s in &self.sections {
            writeln!(f)?;
            writeln!(f, "{}", s.heading)?;
            let w = s
                .rows
                .iter()
                .map(|r| r.0.chars().count())
                .max()
                .unwrap_or(0);
            let v = s
                .rows
                .iter()
                .map(|r| r.1.chars().count())
                .max()
                .unwrap_or(0);
            for (what, value, note) in &s.rows {
                let pad_w = w - what.chars().count();
                let pad_v = v - value.chars().count();
                write!(f, "  {what}{}  {value}", " ".repeat(pad_w))?;
                if note.is_empty() {
                    writeln!(f)?;
                } else {
                    writeln!(f, "{}  {note}", " ".repeat(pad_v))?;
                }
            }
        }
        writeln!(f)?;
        for c in &self.cautions {
            writeln!(f, "Caution: {c}")?;
        }
        Ok(())
    }
}

impl ToMime for DesignReport {
    fn to_mime(&self) -> MimeBundle {
        let mut html = format!(
            "<div class=\"gaugebook-report\"><h3>{}</h3><p>{}</p>",
            html_escape(&self.title),
            html_escape(&self.scenario)
        );
        for s in &self.sections {
            html.push_str(&format!(
                "<table><caption>{}</caption><tbody>",
                html_escape(&s.heading)
            ));
            for (what, value, note) in &s.rows {
                html.push_str(&format!(
                    "<tr><th style=\"text-align:left\">{}</th><td style=\"text-align:right\">{}</td><td>{}</td></tr>",
                    html_escape(what),
                    html_escape(value),
                    html_escape(note)
                ));
            }
            html.push_str("</tbody></table>");
        }
        for c in &self.cautions {
            html.push_str(&format!(
                "<p><strong>Caution:</strong> {}</p>",
                html_escape(c)
            ));
        }
        html.push_str("</div>");
        MimeBundle::text(self.to_string()).with("text/html", html)
    }
}

/// The worked bridge design printed by `gaugebook demo` (an invented scenario; see the module
/// documentation). Every number comes from the library's models; none is typed in as a result.
///
/// ```
/// let r = gaugebook::bridge_design_demo()?;
/// assert!(!r.cautions.is_empty());
/// # Ok::<(), gaugebook::PhysicsError>(())
/// ```
pub fn bridge_design_demo() -> Result<DesignReport, PhysicsError> {
    let mm = Length::new::<millimeter>;
    let capacity = 200.0; // N, the filler's rated load (scenario input)
    let mut sections = Vec::new();

    // Spring element: a 2024-T351 cantilever, gauges 20 mm from the clamp on both faces.
    let beam = Cantilever::new(
        material("2024-T351")?,
        mm(100.0),
        mm(20.0),
        mm(8.0),
        mm(20.0),
    )?;
    let rated = Wrench::only(LoadComponent::Fz, capacity);
    let bottom = beam.surface_strain(&beam.site("bottom")?, &rated)?;
    let top = beam.surface_strain(&beam.site("top")?, &rated)?;
    let mut s = ReportSection::new("Spring element");
    s.row(
        "element",
        "cantilever, 2024-T351",
        "L 100 mm, b 20 mm, h 8 mm",
    );
    s.row(
        "capacity",
        format!("{capacity} N"),
        "along Z at the free end",
    );
    s.row(
        "surface strain, tension face",
        bottom.exx,
        "at the gauge station, x = 20 mm",
    );
    s.row("surface strain, compression face", top.exx, "");
    if let Motion::Translation(d) = beam.deflection(&rated) {
        s.row(
            "deflection at capacity",
            format!("{:.4} mm", d.get::<millimeter>()),
            "bending + shear",
        );
    }
    sections.push(s);

    // Gauges and bridge: four active gauges in a full bending bridge.
    let gauge =
        Gauge::new(ElectricalResistance::new::<ohm>(350.0), 2.05)?.with_grid(mm(3.0), mm(2.4))?;
    let nu = beam.material().poisson();
    let arrangement = Arrangement::FullBending;
    let strain = bottom.exx;
    let exact = arrangement.output(strain, gauge.gauge_factor(), nu)?;
    let linear = arrangement.linear_output(strain, gauge.gauge_factor(), nu)?;
    let nonlin = arrangement.nonlinearity(strain, gauge.gauge_factor(), nu)?;
    let mut s = ReportSection::new("Bridge");
    s.row("gauges", "350 Ω, gauge factor 2.05", "grid 3.0 × 2.4 mm");
    s.row(
        "arrangement",
        arrangement.name(),
        "two gauges in tension, two in compression",
    );
    s.row(
        "bridge factor",
        format!("{}", arrangement.bridge_factor(nu)?),
        "",
    );
    s.row("rated output (exact)", exact, "at capacity");
    s.row("rated output (linear)", linear, "GF·ε·(bridge factor)/4");
    s.row(
        "bridge nonlinearity",
        format!("{:.4} %", nonlin),
        "of the output",
    );
    let back = arrangement.strain_from_output(exact, gauge.gauge_factor(), nu)?;
    s.row("strain read back by the exact inverse", back, "round trip");
    sections.push(s);

    // Excitation and self-heating.
    let excitation = ElectricPotential::new::<volt>(5.0);
    let heat = GaugeDissipation::in_bridge(&gauge, arrangement, Excitation::voltage(excitation)?)?;
    let mut s = ReportSection::new("Excitation and self-heating");
    s.row("excitation", format!("{} V", excitation.get::<volt>()), "");
    s.row(
        "gauge current",
        format!(
            "{:.4} mA",
            heat.current()
                .get::<uom::si::electric_current::milliampere>()
        ),
        "",
    );
    s.row(
        "gauge power",
        format!("{:.4} mW", heat.power().get::<milliwatt>()),
        "",
    );
    if let Some(pd) = heat.power_density() {
        s.row(
            "power density on the grid",
            format!("{:.2} kW/m²", pd.get::<watt_per_square_meter>() / 1e3),
            "compare with the allowable density for the mounting",
        );
    }
    let output_mv = exact.value() * excitation.get::<millivolt>();
    s.row(
        "output voltage at capacity",
        format!("{output_mv:.4} mV"),
        "",
    );
    sections.push(s);

    // Cable: 12 m of 0.22 mm² copper to the controller, four-wire versus six-wire.
    let lead = LeadWire::copper_wire(
        Length::new::<meter>(12.0),
        Area::new::<square_millimeter>(0.22),
    )?;
    let bridge = arrangement.bridge(gauge.resistance(), Strain::ZERO, gauge.gauge_factor(), nu)?;
    let rb = bridge.input_resistance();
    let four = SupplyLeads::new(rb, SupplyWiring::FourWire, lead)?;
    let six = SupplyLeads::new(rb, SupplyWiring::SixWire, lead)?;
    let warm = TemperatureInterval::new::<kelvin>(10.0);
    let mut s = ReportSection::new("Cable");
    s.row(
        "lead resistance, each",
        format!("{:.4} Ω", lead.resistance().get::<ohm>()),
        "12 m, 0.22 mm² copper",
    );
    s.row(
        "four-wire desensitisation",
        format!("{:.4} %", four.desensitization() * 100.0),
        "of span, correctable by calibration",
    );
    s.row(
        "four-wire span change, leads +10 K",
        format!("{:.4} %", four.span_error(warm)? * 100.0),
        "not correctable: drifts with the cable",
    );
    s.row(
        "six-wire span change, leads +10 K",
        format!("{:.4} %", six.span_error(warm)? * 100.0),
        "remote sense follows the bridge",
    );
    sections.push(s);

    // Shunt calibration: the resistor that simulates the rated strain on one gauge arm.
    let target = Strain::new(-strain.abs().value());
    let mut s = ReportSection::new("Shunt calibration (across arm R1)");
    for def in [
        ShuntDefinition::ResistanceEquivalent,
        ShuntDefinition::IndicatedReading,
    ] {
        let c = ShuntCalibration::resistor_for(arrangement, &gauge, nu, ArmId::R1, target, def)?;
        s.row(
            &format!("shunt for {target}, {} definition", def.name()),
            format!("{:.3} kΩ", c.shunt().get::<kiloohm>()),
            &format!("bridge reads {}", c.output()),
        );
    }
    sections.push(s);

    // Signal chain: gain 128, 24-bit ratiometric converter, 40 nV rms input noise.
    let chain = SignalChain::new(
        excitation,
        Amplifier::new(
            128.0,
            InputNoise::from_rms(ElectricPotential::new::<nanovolt>(40.0))?,
        )?,
        Adc::new(24, AdcReference::ratiometric(1.0)?, true)?,
    )?;
    let mut s = ReportSection::new("Signal chain");
    s.row(
        "converter step",
        format!("{:.4} µV", chain.lsb()?.get::<microvolt>()),
        "referred to the bridge output",
    );
    s.row(
        "resolution",
        format!("{:.4} nV/V", chain.resolution()?.value() * 1e9),
        "one converter step",
    );
    s.row(
        "noise, rms",
        format!("{:.3} nV/V", chain.noise_ratio()?.value() * 1e9),
        "amplifier + quantisation",
    );
    s.row(
        "effective bits",
        format!("{:.2}", chain.effective_bits()?),
        "",
    );
    s.row(
        "noise-free counts over the rated output",
        format!("{:.0}", chain.noise_free_counts(exact)?),
        "peak-to-peak noise = 6.6 σ (common practice)",
    );
    let strain_res = chain.strain_resolution(arrangement, gauge.gauge_factor(), nu)?;
    s.row(
        "strain resolution",
        format!("{:.5} µε", strain_res.microstrain()),
        "one converter step",
    );
    let load_res = chain.load_resolution(exact, crate::units::Force::new::<newton>(capacity))?;
    s.row(
        "load resolution",
        format!("{:.4} mN", load_res.get::<newton>() * 1e3),
        "one converter step",
    );
    sections.push(s);

    // Margins at rated, safe and ultimate overload.
    let margins = beam.margins(&rated, &Default::default())?;
    let mut s = ReportSection::new("Stress margins");
    for m in [&margins.rated, &margins.safe, &margins.ultimate] {
        s.row(
            &format!("{} ({:.0} %)", m.level, m.factor * 100.0),
            format!("{:.1} MPa", m.peak.von_mises.get::<megapascal>()),
            &format!(
                "yield factor {:.2}{}",
                m.yield_factor,
                m.fatigue_factor
                    .map(|f| format!(", fatigue factor {f:.2}"))
                    .unwrap_or_default()
            ),
        );
    }
    sections.push(s);

    Ok(DesignReport {
        title: "Worked bridge design: Ashgrove seed-tray filler, 200 N bending beam".into(),
        scenario: "An invented example: a fictional filling line weighs each seed tray on an \
                   aluminium cantilever with four 350 Ω foil gauges in a full bending bridge."
            .into(),
        sections,
        cautions: vec![
            MARGIN_CAUTION.to_string(),
            "a weighing instrument used for trade needs type approval and verification under \
             local regulation; nothing here replaces it"
                .into(),
        ],
    })
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn demo_figures_agree_with_closed_forms() {
        let r = bridge_design_demo().expect("the embedded example is valid");
        println!("{r}");
        let find = |what: &str| {
            r.sections
                .iter()
                .flat_map(|s| s.rows.iter())
                .find(|row| row.0 == what)
                .map(|row| row.1.clone())
                .unwrap_or_else(|| panic!("row {what} missing"))
        };
        // Surface strain 6·F·(L − x)/(E·b·h²) with E = 73.1 GPa from the material table
        // (Timoshenko & Gere, Mechanics of Materials, 4th ed., §5.5, from memory):
        // 6·200·0.08/(73.1e9·0.02·0.008²) = 1026.0 µε.
        let e: f64 = find("surface strain, tension face")
            .trim_end_matches(" µε")
            .parse()
            .unwrap();
        assert!((e - 1026.0).abs() < 0.1, "{e}");
        // A full bending bridge is linear in strain: exact and linear outputs agree
        // (closed-form identity, the four arms change by ±x so Vo/Vex = x exactly).
        assert_eq!(find("rated output (exact)"), find("rated output (linear)"));
        assert!(
            r.to_mime()
                .get("text/html")
                .is_some_and(|h| h.contains("<table>"))
        );
    }
}
