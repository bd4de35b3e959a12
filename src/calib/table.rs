//! Plain report tables (rows of name, value, unit, limit, verdict) with markdown, CSV and HTML
//! renderings, for the characterisation, class verdicts and uncertainty budgets.
//!
//! The tables are plain data and text; the notebook display (`ToMime`, text/plain and
//! text/html) is implemented in the display layer (`src/display/calib.rs`), and figures are
//! made from the same numbers in `src/plot/report.rs`.

use std::fmt;

use crate::{
    CalibrationRun, Characterisation, ClassVerdict, Figure, Fit, GumResult, VERDICT_CAUTION,
};

use crate::text::html_escape;

/// One row of a report table.
///
/// ```
/// use gaugebook::ReportRow;
/// let r = ReportRow::new("rated output", 2.0012, "mV/V");
/// assert_eq!(r.value_text(), "2.0012");
/// ```
#[derive(Clone, Debug, PartialEq)]
pub struct ReportRow {
    /// What the value is.
    pub name: String,
    /// The value.
    pub value: f64,
    /// Its unit.
    pub unit: String,
    /// The limit it is checked against, as text with its source, if any.
    pub limit: Option<String>,
    /// Pass (true) or fail (false), if checked.
    pub passed: Option<bool>,
}

impl ReportRow {
    /// A row without a limit.
    ///
    /// ```
    /// let r = gaugebook::ReportRow::new("creep", 0.01, "% RO");
    /// assert!(r.limit.is_none() && r.passed.is_none());
    /// ```
    pub fn new(name: &str, value: f64, unit: &str) -> ReportRow {
        ReportRow {
            name: name.to_string(),
            value,
            unit: unit.to_string(),
            limit: None,
            passed: None,
        }
    }

    /// The value to six significant digits.
    ///
    /// ```
    /// assert_eq!(gaugebook::ReportRow::new("x", 1.0 / 3.0, "").value_text(), "0.333333");
    /// ```
    pub fn value_text(&self) -> String {
        sig(self.value, 6)
    }

    fn verdict_text(&self) -> &'static str {
        match self.passed {
            Some(true) => "pass",
            Some(false) => "fail",
            None => "",
        }
    }
}

/// Formats to `digits` significant digits, trailing zeros trimmed, scientific outside 1e−4 …
/// 1e6.
fn sig(v: f64, digits: i32) -> String {
    if v == 0.0 || !v.is_finite() {
        return if v == 0.0 { "0".into() } else { v.to_string() };
    }
    let e = v.abs().log10().floor() as i32;
    if (-4..6).contains(&e) {
        let decimals = (digits - 1 - e).max(0) as usize;
        let s = format!("{v:.decimals$}");
        if s.contains('.') {
            s.trim_end_matches('0').trim_end_matches('.').to_string()
        } else {
            s
        }
    } else {
        format!("{:.*e}", (digits - 1) as usize, v)
    }
}

/// A titled table of rows with notes (cautions, definitions) below it.
///
/// ```
/// use gaugebook::{ReportRow, ReportTable};
/// let mut t = ReportTable::new("demo");
/// t.rows.push(ReportRow::new("zero, balance", 0.01, "mV/V"));
/// assert!(t.to_markdown().contains("| zero, balance | 0.01 | mV/V |  |  |"));
/// assert!(t.to_csv().starts_with("name,value,unit,limit,verdict\n\"zero, balance\",0.01,mV/V,,\n"));
/// ```
#[derive(Clone, Debug, PartialEq)]
pub struct ReportTable {
    /// Title.
    pub title: String,
    /// Rows.
    pub rows: Vec<ReportRow>,
    /// Notes printed under the table.
    pub notes: Vec<String>,
}

fn csv_field(s: &str) -> String {
    if s.contains([',', '"', '\n']) {
        format!("\"{}\"", s.replace('"', "\"\""))
    } else {
        s.to_string()
    }
}

impl ReportTable {
    /// An empty table.
    ///
    /// ```
    /// assert!(gaugebook::ReportTable::new("t").rows.is_empty());
    /// ```
    pub fn new(title: &str) -> ReportTable {
        ReportTable {
            title: title.to_string(),
            rows: vec![],
            notes: vec![],
        }
    }

    /// Markdown: a title line, a pipe table, notes as a list.
    ///
    /// ```
    /// let t = gaugebook::ReportTable::new("Budget");
    /// assert!(t.to_markdown().starts_with("**Budget**"));
    /// ```
    pub fn to_markdown(&self) -> String {
        let mut s = format!(
            "**{}**\n\n| name | value | unit | limit | verdict |\n|---|---:|---|---|---|\n",
            self.title
        );
        for r in &self.rows {
            let cell = |t: &str| t.replace('|', "\\|");
            s.push_str(&format!(
                "| {} | {} | {} | {} | {} |\n",
                cell(&r.name),
                r.value_text(),
                cell(&r.unit),
                cell(r.limit.as_deref().unwrap_or("")),
                r.verdict_text()
            ));
        }
        for n in &self.notes {
            s.push_str(&format!("\n- {n}"));
        }
        if !self.notes.is_empty() {
            s.push('\n');
        }
        s
    }

    /// CSV (RFC 4180 quoting) with a header row; notes are not included.
    ///
    /// ```
    /// let mut t = gaugebook::ReportTable::new("t");
    /// t.rows.push(gaugebook::ReportRow::new("a \"b\"", 1.0, "N"));
    /// assert!(t.to_csv().ends_with("\"a \"\"b\"\"\",1,N,,\n"));
    /// ```
    pub fn to_csv(&self) -> String {
        let mut s = String::from("name,value,unit,limit,verdict\n");
        for r in &self.rows {
            s.push_str(&format!(
                "{},{},{},{},{}\n",
                csv_field(&r.name),
                r.value_text(),
                csv_field(&r.unit),
                csv_field(r.limit.as_deref().unwrap_or("")),
                r.verdict_text()
            ));
        }
        s
    }

    /// An HTML table with a caption and notes.
    ///
    /// ```
    /// let t = gaugebook::ReportTable::new("a < b");
    /// assert!(t.to_html().contains("<caption>a &lt; b</caption>"));
    /// ```
    pub fn to_html(&self) -> String {
        let mut s = format!(
            "<table class=\"gaugebook-report\">\n<caption>{}</caption>\n<thead><tr><th>name</th><th>value</th><th>unit</th><th>limit</th><th>verdict</th></tr></thead>\n<tbody>\n",
            html_escape(&self.title)
        );
        for r in &self.rows {
            s.push_str(&format!(
                "<tr><td>{}</td><td style=\"text-align:right\">{}</td><td>{}</td><td>{}</td><td>{}</td></tr>\n",
                html_escape(&r.name),
                r.value_text(),
                html_escape(&r.unit),
                html_escape(r.limit.as_deref().unwrap_or("")),
                r.verdict_text()
            ));
        }
        s.push_str("</tbody>\n</table>\n");
        for n in &self.notes {
            s.push_str(&format!("<p><small>{}</small></p>\n", html_escape(n)));
        }
        s
    }

    /// Plain text: the markdown form.
    ///
    /// ```
    /// let t = gaugebook::ReportTable::new("t");
    /// assert_eq!(t.to_text(), t.to_markdown());
    /// ```
    pub fn to_text(&self) -> String {
        self.to_markdown()
    }
}

impl Characterisation {
    /// The characterisation table: each figure in % RO and in load units.
    ///
    /// ```
    /// use gaugebook::{CalibrationRun, Characterisation, CharacteriseOptions, Direction, LoadKind};
    /// let mut run = CalibrationRun::new(LoadKind::Force, "mV/V");
    /// run.push_series(&[0.0, 500.0, 1000.0], &[0.0, 1.001, 2.0], Direction::Ascending, 0.0)?;
    /// let c = Characterisation::from_run(&run, CharacteriseOptions::new(1000.0))?;
    /// let t = c.table();
    /// assert!(t.to_markdown().contains("| nonlinearity (terminal line) | 0.05 | % RO |"));
    /// assert!(t.to_html().contains("<table"));
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn table(&self) -> ReportTable {
        let mut t = ReportTable::new("Characterisation");
        let iu = self.indication_unit.as_str();
        let lu = self.load_unit.as_str();
        t.rows.push(ReportRow::new("capacity", self.capacity, lu));
        t.rows
            .push(ReportRow::new("rated output", self.rated_output, iu));
        t.rows.push(ReportRow::new(
            "sensitivity",
            self.sensitivity,
            &format!("{iu}/{lu}"),
        ));
        let mut fig = |name: &str, f: &crate::Figure| {
            t.rows.push(ReportRow::new(name, f.percent_ro, "% RO"));
            t.rows.push(ReportRow::new(name, f.load, lu));
        };
        fig("zero balance", &self.zero_balance);
        fig("nonlinearity (terminal line)", &self.nonlinearity_terminal);
        fig(
            "nonlinearity (least-squares line)",
            &self.nonlinearity_least_squares,
        );
        fig("nonlinearity (minimax line)", &self.nonlinearity_minimax);
        fig("hysteresis", &self.hysteresis);
        fig("non-repeatability", &self.non_repeatability);
        fig("combined error (terminal line)", &self.combined_error);
        if let Some(z) = &self.zero_return {
            fig("zero return", z);
        }
        t.notes.push("Figures from one calibration run of one specimen; design estimates must be proven by test.".into());
        t
    }
}

impl ClassVerdict {
    /// The verdict table: every check with its limit and source, the deciding check noted, and
    /// the caution.
    ///
    /// ```
    /// use gaugebook::{Check, ClassVerdict};
    /// let v = ClassVerdict::new("ISO 376:2011", "1", vec![Check::at_most("creep c", 0.05, 0.10, "%", "Table 2")]);
    /// let md = v.table().to_markdown();
    /// assert!(md.contains("| creep c | 0.05 | % | ≤ 0.1 % (Table 2) | pass |"));
    /// assert!(md.contains("not a type approval"));
    /// ```
    pub fn table(&self) -> ReportTable {
        let outcome = if self.passed {
            "meets"
        } else {
            "does not meet"
        };
        let mut t = ReportTable::new(&format!(
            "{} class {}: {outcome}",
            self.standard, self.class
        ));
        for c in &self.checks {
            let rel = if c.at_least { "≥" } else { "≤" };
            let mut row = ReportRow::new(&c.name, c.value, &c.unit);
            row.limit = Some(
                format!("{rel} {} {} ({})", sig(c.limit, 6), c.unit, c.source).replace("  ", " "),
            );
            row.passed = Some(c.passed);
            t.rows.push(row);
        }
        if let Some(d) = self.deciding() {
            t.notes
                .push(format!("Deciding limit: {} ({}).", d.name, d.source));
        }
        t.notes.push(format!("Caution: {VERDICT_CAUTION}."));
        t
    }
}

impl GumResult {
    /// The budget table: one row per contribution, then the combined uncertainty and ν_eff.
    ///
    /// ```
    /// use gaugebook::{Budget, Input};
    /// let b = Budget::new(vec![Input::normal("x", 2.0, 0.1, 9.0)?]);
    /// let t = b.evaluate(|x| 3.0 * x[0])?.table("");
    /// assert!(t.to_csv().contains("u_c(y),0.3,,,"));
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn table(&self, unit: &str) -> ReportTable {
        let mut t = ReportTable::new("Uncertainty budget (JCGM 100:2008)");
        for c in &self.contributions {
            t.rows.push(ReportRow::new(
                &format!("|c·u| from {}", c.name),
                c.contribution,
                unit,
            ));
        }
        t.rows.push(ReportRow::new("y", self.value, unit));
        t.rows.push(ReportRow::new("u_c(y)", self.combined, unit));
        t.rows.push(ReportRow::new(
            "effective degrees of freedom",
            self.dof_eff,
            "",
        ));
        t
    }
}

impl fmt::Display for GumResult {
    /// The budget table in markdown.
    ///
    /// ```
    /// use gaugebook::{Budget, Input};
    /// let r = Budget::new(vec![Input::normal("x", 1.0, 0.1, 9.0)?]).evaluate(|x| x[0])?;
    /// assert!(r.to_string().contains("| u_c(y) | 0.1 |"));
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        f.write_str(&self.table("").to_markdown())
    }
}

impl fmt::Display for ReportTable {
    /// The markdown form.
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        f.write_str(&self.to_markdown())
    }
}

impl fmt::Display for Characterisation {
    /// The characterisation table in markdown.
    ///
    /// ```
    /// use gaugebook::{CalibrationRun, Characterisation, CharacteriseOptions, Direction, LoadKind};
    /// let mut run = CalibrationRun::new(LoadKind::Force, "mV/V");
    /// run.push_series(&[0.0, 500.0, 1000.0], &[0.0, 1.0, 2.0], Direction::Ascending, 0.0)?;
    /// let c = Characterisation::from_run(&run, CharacteriseOptions::new(1000.0))?;
    /// assert!(c.to_string().contains("| rated output | 2 | mV/V |"));
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        f.write_str(&self.table().to_markdown())
    }
}

impl fmt::Display for Figure {
    /// `0.05 % RO (2.5 load units)`.
    ///
    /// ```
    /// let f = gaugebook::Figure::from_indication(0.001, 2.0, 5000.0);
    /// assert_eq!(f.to_string(), "0.05 % RO (2.5 in load units)");
    /// ```
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        write!(
            f,
            "{} % RO ({} in load units)",
            sig(self.percent_ro, 6),
            sig(self.load, 6)
        )
    }
}

impl fmt::Display for CalibrationRun {
    /// One line: series, points, units.
    ///
    /// ```
    /// use gaugebook::{CalibrationRun, Direction, LoadKind};
    /// let mut run = CalibrationRun::new(LoadKind::Force, "mV/V");
    /// run.push_series(&[0.0, 100.0], &[0.0, 2.0], Direction::Ascending, 0.0)?;
    /// assert_eq!(run.to_string(), "calibration run: 1 series, 2 points, N against mV/V");
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        write!(
            f,
            "calibration run: {} series, {} points, {} against {}",
            self.series().len(),
            self.points().len(),
            self.load_kind().si_unit(),
            self.indication_unit()
        )
    }
}

impl CalibrationRun {
    /// Every point as a table row: series, direction, rotation and load, with the indication.
    ///
    /// ```
    /// use gaugebook::{CalibrationRun, Direction, LoadKind};
    /// let mut run = CalibrationRun::new(LoadKind::Force, "mV/V");
    /// run.push_series(&[0.0, 100.0], &[0.0, 2.0], Direction::Ascending, 0.0)?;
    /// let md = run.table().to_markdown();
    /// assert!(md.contains("| series 0 (ascending, 0°) at 100 N | 2 | mV/V |"));
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn table(&self) -> ReportTable {
        let mut t = ReportTable::new(&self.to_string());
        for p in self.points() {
            let dir = match p.direction {
                crate::Direction::Ascending => "ascending",
                crate::Direction::Descending => "descending",
            };
            t.rows.push(ReportRow::new(
                &format!(
                    "series {} ({dir}, {}°) at {} {}",
                    p.series,
                    p.rotation_deg,
                    sig(p.load, 6),
                    self.load_kind().si_unit()
                ),
                p.indication,
                self.indication_unit(),
            ));
        }
        t
    }
}

impl Fit {
    /// The fit as a table: coefficients with standard errors, s, ν, R².
    ///
    /// ```
    /// use gaugebook::{Fit, FitModel};
    /// let f = Fit::new(&[0.0, 1.0, 2.0, 3.0], &[0.1, 1.0, 2.1, 2.9], FitModel::Linear)?;
    /// assert!(f.table().to_csv().contains("b1,"));
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn table(&self) -> ReportTable {
        let mut t = ReportTable::new(&format!("least-squares fit ({:?})", self.model()));
        for (k, (c, s)) in self
            .coefficients()
            .iter()
            .zip(self.std_errors())
            .enumerate()
        {
            let mut r = ReportRow::new(&format!("b{k}"), *c, "");
            r.limit = Some(format!("u = {}", sig(*s, 6)));
            t.rows.push(r);
        }
        t.rows.push(ReportRow::new(
            "residual standard deviation",
            self.residual_sd(),
            "",
        ));
        t.rows
            .push(ReportRow::new("degrees of freedom", self.dof() as f64, ""));
        t.rows.push(ReportRow::new("R²", self.r_squared(), ""));
        t
    }
}

impl fmt::Display for Fit {
    /// The fit table in markdown.
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        f.write_str(&self.table().to_markdown())
    }
}

#[cfg(test)]
mod tests {
    use super::sig;

    #[test]
    fn significant_digits() {
        assert_eq!(sig(2.0, 6), "2");
        assert_eq!(sig(0.000123456789, 6), "0.000123457");
        assert_eq!(sig(1.23456789e-7, 6), "1.23457e-7");
        assert_eq!(sig(-1234.5678, 6), "-1234.57");
    }
}
