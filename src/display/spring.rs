//! Notebook view of a spring element's margins: one row per load level, with the caution that
//! every reported margin carries.

use uom::si::pressure::megapascal;

use super::grid::{Grid, num, opt};
use crate::{Margins, MimeBundle, ToMime};

impl ToMime for Margins {
    /// Plain text as [`Display`](std::fmt::Display); HTML: rated, safe and ultimate overload
    /// rows (load, peak von Mises stress and where it is, the four factors) and the caution.
    ///
    /// ```
    /// use gaugebook::{LoadComponent, OverloadFactors, SpringElement, ToMime, TorqueShaft, Wrench, material};
    /// use gaugebook::units::Length;
    /// use uom::si::length::millimeter;
    /// let mm = Length::new::<millimeter>;
    /// let s = TorqueShaft::solid(material("4340")?, mm(20.0), mm(100.0), mm(50.0))?;
    /// let m = s.margins(&Wrench::only(LoadComponent::Mx, 100.0), &OverloadFactors::default())?;
    /// let html = m.to_mime().get("text/html").unwrap().to_string();
    /// assert!(html.contains("<th style=\"text-align:left\">ultimate overload</th>"));
    /// assert!(html.contains("licensed practice"));
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    fn to_mime(&self) -> MimeBundle {
        let mut g = Grid::new(
            "margins (nominal-stress model)",
            &[
                "level",
                "load (% of rated)",
                "peak von Mises (MPa)",
                "at",
                "yield factor",
                "ultimate factor",
                "fatigue factor",
                "buckling factor",
            ],
        );
        for m in [&self.rated, &self.safe, &self.ultimate] {
            g.row(vec![
                m.level.to_string(),
                num(m.factor * 100.0),
                num(m.peak.von_mises.get::<megapascal>()),
                m.peak.site.to_string(),
                num(m.yield_factor),
                num(m.ultimate_factor),
                opt(m.fatigue_factor),
                opt(m.buckling_factor),
            ]);
        }
        g.note(format!("Caution: {}.", self.caution));
        MimeBundle::text(self.to_string()).with("text/html", g.to_html())
    }
}
