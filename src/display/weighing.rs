//! Notebook view of a check-weighing station's evaluation: trim, accept band and the
//! resolution the signal chain needs, with the legal-for-trade caution.

use uom::si::electrical_resistance::ohm;
use uom::si::mass::gram;

use super::grid::{Grid, num};
use crate::{CheckWeighing, MimeBundle, ToMime, TrimKind};

impl ToMime for CheckWeighing {
    /// Plain text as [`Display`](std::fmt::Display); HTML: one row per figure and the caution.
    ///
    /// ```
    /// # use gaugebook::{Arrangement, CheckWeigher, Gauge, Layout, LoadComponent, Parallelogram, ToMime, Wrench, material};
    /// # use gaugebook::units::{ElectricalResistance, Length, Mass};
    /// # use uom::si::{electrical_resistance::ohm, length::millimeter, mass::gram};
    /// # let mm = Length::new::<millimeter>;
    /// # let cell = Parallelogram::new(material("2024-T351")?, mm(40.0), mm(20.0), mm(1.6), mm(24.0), mm(6.0))?;
    /// # let g = Gauge::new(ElectricalResistance::new::<ohm>(1000.0), 2.0)?;
    /// # let layout = Layout::standard(cell, &g, Arrangement::FullBending, 49.0)?;
    /// let s = CheckWeigher::new(layout, 0, Wrench::only(LoadComponent::Fz, 1.0), Mass::new::<gram>(1200.0),
    ///     Mass::new::<gram>(750.0), Mass::new::<gram>(5.0), Mass::new::<gram>(15.0))?;
    /// let html = s.evaluate()?.to_mime().get("text/html").unwrap().to_string();
    /// assert!(html.contains("<th style=\"text-align:left\">resolution needed</th>"));
    /// assert!(html.contains("legal-for-trade"));
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    fn to_mime(&self) -> MimeBundle {
        let kind = match self.trim.kind() {
            TrimKind::Series => "series",
            TrimKind::Parallel => "parallel",
        };
        let mut g = Grid::new("check-weighing station", &["figure", "value"]);
        g.row(vec![
            "balancing trim".into(),
            format!(
                "{} Ω {kind} in arm {}",
                num(self.trim.resistance().get::<ohm>()),
                self.trim_arm
            ),
        ]);
        g.row(vec![
            "output per gram".into(),
            format!("{} µV/V", num(self.output_per_gram.value() * 1e6)),
        ]);
        g.row(vec!["accept from".into(), self.accept_low.to_string()]);
        g.row(vec!["accept to".into(), self.accept_high.to_string()]);
        g.row(vec![
            "resolution needed".into(),
            format!(
                "{} µV/V ({} g)",
                num(self.resolution.value() * 1e6),
                num(self.resolution_mass.get::<gram>())
            ),
        ]);
        g.row(vec![
            "unloaded output".into(),
            self.unloaded_output.to_string(),
        ]);
        g.row(vec![
            "output at capacity".into(),
            self.capacity_output.to_string(),
        ]);
        g.note(format!("Caution: {}.", self.caution));
        MimeBundle::text(self.to_string()).with("text/html", g.to_html())
    }
}
