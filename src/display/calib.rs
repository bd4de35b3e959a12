//! Notebook display of the calibration, standards and uncertainty results: each shows as its
//! report table (text/plain markdown and text/html). The tables themselves are built in the
//! physics layer (`src/calib/table.rs`); only the MIME bundles live here, so the physics layer
//! does not depend on the display layer.

use super::{MimeBundle, ToMime};
use crate::{CalibrationRun, Characterisation, ClassVerdict, Figure, Fit, GumResult, ReportTable};

impl ToMime for ReportTable {
    /// Markdown as text/plain, the HTML table as text/html.
    ///
    /// ```
    /// use gaugebook::{ReportRow, ReportTable, ToMime};
    /// let mut t = ReportTable::new("t");
    /// t.rows.push(ReportRow::new("creep", 0.01, "% RO"));
    /// let b = t.to_mime();
    /// assert_eq!(b.get("text/plain"), Some(t.to_markdown().as_str()));
    /// assert!(b.get("text/html").unwrap().contains("<td>creep</td>"));
    /// ```
    fn to_mime(&self) -> MimeBundle {
        MimeBundle::text(self.to_text()).with("text/html", self.to_html())
    }
}

impl ToMime for Characterisation {
    /// The characterisation table.
    ///
    /// ```
    /// use gaugebook::{CalibrationRun, Characterisation, CharacteriseOptions, Direction, LoadKind, ToMime};
    /// let mut run = CalibrationRun::new(LoadKind::Force, "mV/V");
    /// run.push_series(&[0.0, 500.0, 1000.0], &[0.0, 1.001, 2.0], Direction::Ascending, 0.0)?;
    /// let c = Characterisation::from_run(&run, CharacteriseOptions::new(1000.0))?;
    /// assert!(c.to_mime().get("text/html").unwrap().contains("<table"));
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    fn to_mime(&self) -> MimeBundle {
        self.table().to_mime()
    }
}

impl ToMime for ClassVerdict {
    /// The verdict table with the deciding limit and the caution.
    ///
    /// ```
    /// use gaugebook::{Check, ClassVerdict, ToMime};
    /// let v = ClassVerdict::new("ISO 376:2011", "1", vec![Check::at_most("creep c", 0.05, 0.10, "%", "Table 2")]);
    /// assert!(v.to_mime().get("text/plain").unwrap().contains("not a type approval"));
    /// ```
    fn to_mime(&self) -> MimeBundle {
        self.table().to_mime()
    }
}

impl ToMime for GumResult {
    /// The budget table (unit-less: scripts attach units to their own records).
    ///
    /// ```
    /// use gaugebook::{Budget, Input, ToMime};
    /// let r = Budget::new(vec![Input::normal("x", 2.0, 0.1, 9.0)?]).evaluate(|x| 3.0 * x[0])?;
    /// assert!(r.to_mime().get("text/html").unwrap().contains("u_c(y)"));
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    fn to_mime(&self) -> MimeBundle {
        self.table("").to_mime()
    }
}

impl ToMime for Figure {
    /// One line of text.
    ///
    /// ```
    /// use gaugebook::{Figure, ToMime};
    /// let f = Figure::from_indication(0.001, 2.0, 5000.0);
    /// assert_eq!(f.to_mime().get("text/plain"), Some("0.05 % RO (2.5 in load units)"));
    /// ```
    fn to_mime(&self) -> MimeBundle {
        MimeBundle::text(self.to_string())
    }
}

impl ToMime for CalibrationRun {
    /// A one-line summary as text, every point as an HTML table.
    ///
    /// ```
    /// use gaugebook::{CalibrationRun, Direction, LoadKind, ToMime};
    /// let mut run = CalibrationRun::new(LoadKind::Force, "mV/V");
    /// run.push_series(&[0.0, 100.0], &[0.0, 2.0], Direction::Ascending, 0.0)?;
    /// let b = run.to_mime();
    /// assert_eq!(b.get("text/plain"), Some("calibration run: 1 series, 2 points, N against mV/V"));
    /// assert!(b.get("text/html").unwrap().contains("series 0 (ascending, 0°) at 100 N"));
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    fn to_mime(&self) -> MimeBundle {
        self.table().to_mime().with("text/plain", self.to_string())
    }
}

impl ToMime for Fit {
    /// The coefficient table.
    ///
    /// ```
    /// use gaugebook::{Fit, FitModel, ToMime};
    /// let f = Fit::new(&[0.0, 1.0, 2.0, 3.0], &[0.1, 1.0, 2.1, 2.9], FitModel::Linear)?;
    /// assert!(f.to_mime().get("text/html").unwrap().contains("<td>b1</td>"));
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    fn to_mime(&self) -> MimeBundle {
        self.table().to_mime()
    }
}
