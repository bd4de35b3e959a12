//! Rich display: MIME bundles for notebooks (Jupyter and evcxr).
//!
//! A value that a notebook should show as more than text implements [`ToMime`]. The kernel sends
//! the bundle as `execute_result` or `display_data`; in an evcxr Rust notebook,
//! [`MimeBundle::evcxr_display`] prints it in evcxr's content-block convention.

mod calib;

use std::collections::BTreeMap;

// Views of the physics results (issue 8 item 4) and the evcxr display methods (feature `evcxr`).
mod bridge;
#[cfg(feature = "evcxr")]
mod evcxr;
mod grid;
mod layout;
mod spring;
mod weighing;

/// One value's representations, keyed by MIME type (`text/plain` always present).
///
/// ```
/// use gaugebook::MimeBundle;
/// let b = MimeBundle::text("2 mV/V").with("text/html", "<b>2 mV/V</b>");
/// assert_eq!(b.get("text/plain"), Some("2 mV/V"));
/// assert_eq!(b.mime_types().count(), 2);
/// ```
#[derive(Clone, Debug, Default, PartialEq)]
pub struct MimeBundle {
    data: BTreeMap<String, String>,
}

impl MimeBundle {
    /// A bundle holding only `text/plain`.
    ///
    /// ```
    /// let b = gaugebook::MimeBundle::text("350 Ω");
    /// assert_eq!(b.get("text/plain"), Some("350 Ω"));
    /// assert_eq!(b.get("text/html"), None);
    /// ```
    pub fn text(plain: impl Into<String>) -> MimeBundle {
        let mut data = BTreeMap::new();
        data.insert("text/plain".to_string(), plain.into());
        MimeBundle { data }
    }

    /// Adds (or replaces) one representation. Binary types such as `image/png` hold base64 text,
    /// as the Jupyter message format requires.
    ///
    /// ```
    /// let b = gaugebook::MimeBundle::text("a").with("text/html", "<p>a</p>").with("text/html", "<b>a</b>");
    /// assert_eq!(b.get("text/html"), Some("<b>a</b>"));
    /// ```
    pub fn with(mut self, mime: impl Into<String>, content: impl Into<String>) -> MimeBundle {
        self.data.insert(mime.into(), content.into());
        self
    }

    /// The representation for one MIME type.
    ///
    /// ```
    /// let b = gaugebook::MimeBundle::text("1 kN").with("text/latex", "$1\\,\\mathrm{kN}$");
    /// assert_eq!(b.get("text/latex"), Some("$1\\,\\mathrm{kN}$"));
    /// ```
    pub fn get(&self, mime: &str) -> Option<&str> {
        self.data.get(mime).map(String::as_str)
    }

    /// The MIME types present, in sorted order.
    ///
    /// ```
    /// let b = gaugebook::MimeBundle::text("x").with("image/svg+xml", "<svg/>");
    /// assert_eq!(b.mime_types().collect::<Vec<_>>(), ["image/svg+xml", "text/plain"]);
    /// ```
    pub fn mime_types(&self) -> impl Iterator<Item = &str> {
        self.data.keys().map(String::as_str)
    }

    /// All representations, in sorted order of MIME type.
    ///
    /// ```
    /// let b = gaugebook::MimeBundle::text("x");
    /// assert_eq!(b.iter().next(), Some(("text/plain", "x")));
    /// ```
    pub fn iter(&self) -> impl Iterator<Item = (&str, &str)> {
        self.data.iter().map(|(k, v)| (k.as_str(), v.as_str()))
    }

    /// The text evcxr_jupyter reads from a cell's standard output to show rich content: one
    /// `EVCXR_BEGIN_CONTENT <mime>` … `EVCXR_END_CONTENT` block per representation (evcxr's
    /// documented display convention), richest first so the notebook shows it.
    ///
    /// ```
    /// let b = gaugebook::MimeBundle::text("x").with("text/html", "<i>x</i>");
    /// assert!(b.evcxr_text().starts_with("EVCXR_BEGIN_CONTENT text/html\n<i>x</i>\nEVCXR_END_CONTENT\n"));
    /// ```
    pub fn evcxr_text(&self) -> String {
        let mut out = String::new();
        let rich = self.data.iter().filter(|(k, _)| k.as_str() != "text/plain");
        let plain = self.data.iter().filter(|(k, _)| k.as_str() == "text/plain");
        for (mime, content) in rich.chain(plain) {
            out.push_str("EVCXR_BEGIN_CONTENT ");
            out.push_str(mime);
            out.push('\n');
            out.push_str(content);
            out.push_str("\nEVCXR_END_CONTENT\n");
        }
        out
    }

    /// Prints [`MimeBundle::evcxr_text`] to standard output, where evcxr picks it up.
    ///
    /// ```
    /// gaugebook::MimeBundle::text("shown in the notebook").evcxr_display();
    /// ```
    pub fn evcxr_display(&self) {
        print!("{}", self.evcxr_text());
    }
}

/// A value that can show itself in a notebook.
///
/// ```
/// use gaugebook::{MimeBundle, ToMime};
/// struct Note;
/// impl ToMime for Note {
///     fn to_mime(&self) -> MimeBundle { MimeBundle::text("note") }
/// }
/// assert_eq!(Note.to_mime().get("text/plain"), Some("note"));
/// ```
pub trait ToMime {
    /// The value's representations.
    fn to_mime(&self) -> MimeBundle;
}

pub use crate::text::html_escape;
