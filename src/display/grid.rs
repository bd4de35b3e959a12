//! A plain HTML grid (caption, header row, body rows, notes) for results that read as a matrix
//! rather than as a list of named values, and the number format the grids share.

use crate::html_escape;

/// A table built cell by cell; the first column is a row label, the others are right-aligned.
pub(crate) struct Grid {
    caption: String,
    header: Vec<String>,
    rows: Vec<Vec<String>>,
    notes: Vec<String>,
}

impl Grid {
    pub(crate) fn new(caption: impl Into<String>, header: &[&str]) -> Grid {
        Grid {
            caption: caption.into(),
            header: header.iter().map(|h| h.to_string()).collect(),
            rows: vec![],
            notes: vec![],
        }
    }

    pub(crate) fn row(&mut self, cells: Vec<String>) {
        self.rows.push(cells);
    }

    pub(crate) fn note(&mut self, note: impl Into<String>) {
        self.notes.push(note.into());
    }

    /// The table; every cell and note is escaped, so labels with `<` or `&` stay text.
    pub(crate) fn to_html(&self) -> String {
        let mut s = format!(
            "<table class=\"gaugebook-grid\">\n<caption>{}</caption>\n<thead><tr>",
            html_escape(&self.caption)
        );
        for h in &self.header {
            s.push_str(&format!("<th>{}</th>", html_escape(h)));
        }
        s.push_str("</tr></thead>\n<tbody>\n");
        for r in &self.rows {
            s.push_str("<tr>");
            for (i, c) in r.iter().enumerate() {
                if i == 0 {
                    s.push_str(&format!(
                        "<th style=\"text-align:left\">{}</th>",
                        html_escape(c)
                    ));
                } else {
                    s.push_str(&format!(
                        "<td style=\"text-align:right\">{}</td>",
                        html_escape(c)
                    ));
                }
            }
            s.push_str("</tr>\n");
        }
        s.push_str("</tbody>\n</table>\n");
        for n in &self.notes {
            s.push_str(&format!("<p><small>{}</small></p>\n", html_escape(n)));
        }
        s
    }
}

/// Six significant digits, trailing zeros trimmed, scientific outside 1e−4 … 1e6 (the rule the
/// report tables use), and a dash for a missing value.
pub(crate) fn num(v: f64) -> String {
    if v == 0.0 {
        return "0".into();
    }
    if !v.is_finite() {
        return if v.is_nan() {
            "–".into()
        } else if v > 0.0 {
            "∞".into()
        } else {
            "−∞".into()
        };
    }
    let e = v.abs().log10().floor() as i32;
    if (-4..6).contains(&e) {
        let decimals = (5 - e).max(0) as usize;
        let s = format!("{v:.decimals$}");
        if s.contains('.') {
            s.trim_end_matches('0').trim_end_matches('.').to_string()
        } else {
            s
        }
    } else {
        format!("{v:.5e}")
    }
}

/// [`num`] of an optional value, a dash when absent.
pub(crate) fn opt(v: Option<f64>) -> String {
    v.map_or_else(|| "–".into(), num)
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn numbers_keep_six_significant_digits() {
        assert_eq!(num(1.0 / 3.0), "0.333333");
        assert_eq!(num(2.5), "2.5");
        assert_eq!(num(123456.7), "123457");
        assert_eq!(num(1.5e-7), "1.50000e-7");
        assert_eq!(num(f64::INFINITY), "∞");
        assert_eq!(opt(None), "–");
    }

    #[test]
    fn cells_are_escaped_and_labels_are_header_cells() {
        let mut g = Grid::new("a < b", &["x", "y"]);
        g.row(vec!["r&d".into(), "1".into()]);
        g.note("n > m");
        let h = g.to_html();
        assert!(h.contains("<caption>a &lt; b</caption>"));
        assert!(h.contains(
            "<th style=\"text-align:left\">r&amp;d</th><td style=\"text-align:right\">1</td>"
        ));
        assert!(h.contains("<small>n &gt; m</small>"));
    }
}
