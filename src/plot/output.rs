//! Getting a figure out: SVG text, PNG bytes, an atomically written file, and the MIME bundle a
//! notebook shows inline.

use super::base64::base64_encode;
use super::error::PlotError;
use super::figure::Plot;
use super::render;
use crate::{MimeBundle, ToMime};
use std::io::Write;
use std::path::Path;

impl Plot {
    /// The figure as SVG text (no font file needed to view it).
    ///
    /// ```
    /// use gaugebook::{Axis, Plot};
    /// let f = Plot::histogram("h", &[1.0, 2.0, 2.5], 3, Axis::new("x", "mm"))?;
    /// assert!(f.to_svg()?.contains("x (mm)"));
    /// # Ok::<(), gaugebook::PlotError>(())
    /// ```
    pub fn to_svg(&self) -> Result<String, PlotError> {
        render::svg(self)
    }

    /// The figure as PNG bytes, text drawn with the embedded DejaVu Sans font.
    ///
    /// ```
    /// use gaugebook::{Axis, Plot};
    /// let f = Plot::histogram("h", &[1.0, 2.0, 2.5], 3, Axis::new("x", "mm"))?;
    /// assert_eq!(&f.to_png()?[..8], b"\x89PNG\r\n\x1a\n");
    /// # Ok::<(), gaugebook::PlotError>(())
    /// ```
    pub fn to_png(&self) -> Result<Vec<u8>, PlotError> {
        render::png(self)
    }

    /// Writes the figure to `path`, SVG or PNG by its extension (`.svg`, `.png`, any case).
    /// The image goes to a temporary file in the same folder, which is then renamed over
    /// `path`, so a reader never sees a half-written file and an old file survives a failure.
    ///
    /// ```
    /// use gaugebook::{Axis, Plot};
    /// let dir = std::env::temp_dir().join(format!("gaugebook-doc-{}", std::process::id()));
    /// std::fs::create_dir_all(&dir).unwrap();
    /// let f = Plot::histogram("h", &[1.0, 2.0, 2.5], 3, Axis::new("x", "mm"))?;
    /// f.save(dir.join("h.svg"))?;
    /// assert!(std::fs::read_to_string(dir.join("h.svg")).unwrap().starts_with("<svg"));
    /// assert!(f.save(dir.join("h.bmp")).is_err());
    /// # std::fs::remove_dir_all(&dir).unwrap();
    /// # Ok::<(), gaugebook::PlotError>(())
    /// ```
    pub fn save(&self, path: impl AsRef<Path>) -> Result<(), PlotError> {
        let path = path.as_ref();
        let shown = path.display().to_string();
        let ext = path
            .extension()
            .and_then(|e| e.to_str())
            .map(str::to_ascii_lowercase);
        let bytes = match ext.as_deref() {
            Some("svg") => self.to_svg()?.into_bytes(),
            Some("png") => self.to_png()?,
            _ => return Err(PlotError::UnknownFormat { path: shown }),
        };
        let io = |source| PlotError::Io {
            path: shown.clone(),
            source,
        };
        let name = path.file_name().ok_or_else(|| PlotError::UnknownFormat {
            path: shown.clone(),
        })?;
        let dir = path
            .parent()
            .filter(|p| !p.as_os_str().is_empty())
            .unwrap_or(Path::new("."));
        let tmp = dir.join(format!(
            ".{}.{}.tmp",
            name.to_string_lossy(),
            std::process::id()
        ));
        let written = (|| {
            let mut f = std::fs::File::create(&tmp)?;
            f.write_all(&bytes)?;
            f.sync_all()?;
            std::fs::rename(&tmp, path)
        })();
        if let Err(e) = written {
            // Best effort: the temporary file may not exist if creating it was what failed.
            let _ = std::fs::remove_file(&tmp);
            return Err(io(e));
        }
        Ok(())
    }
}

impl std::fmt::Display for Plot {
    /// The figure's title and panel count, as notebooks show it in plain text.
    ///
    /// ```
    /// let p = gaugebook::Plot::new("creep");
    /// assert_eq!(p.to_string(), "figure \"creep\" (0 panels)");
    /// ```
    fn fmt(&self, f: &mut std::fmt::Formatter<'_>) -> std::fmt::Result {
        let n = self.panel_count();
        write!(
            f,
            "figure {:?} ({n} panel{})",
            self.title(),
            if n == 1 { "" } else { "s" }
        )
    }
}

impl ToMime for Plot {
    /// `text/plain` (title and panel count), `image/svg+xml` and `image/png` (base64), so the
    /// kernel shows the figure inline. A figure that cannot be drawn shows only the text, with
    /// the reason.
    ///
    /// ```
    /// use gaugebook::{Axis, Plot, ToMime};
    /// let f = Plot::histogram("noise", &[1.0, 2.0, 2.5], 3, Axis::new("x", "mm"))?;
    /// let b = f.to_mime();
    /// assert!(b.get("image/svg+xml").unwrap().starts_with("<svg"));
    /// assert!(b.get("image/png").unwrap().starts_with("iVBORw0KGgo")); // base64 of the PNG signature
    /// assert_eq!(b.get("text/plain"), Some("figure \"noise\" (1 panel)"));
    /// # Ok::<(), gaugebook::PlotError>(())
    /// ```
    fn to_mime(&self) -> MimeBundle {
        let n = self.panel_count();
        let plain = format!(
            "figure {:?} ({n} panel{})",
            self.title(),
            if n == 1 { "" } else { "s" }
        );
        match (self.to_svg(), self.to_png()) {
            (Ok(svg), Ok(png)) => MimeBundle::text(plain)
                .with("image/svg+xml", svg)
                .with("image/png", base64_encode(&png)),
            (Err(e), _) | (_, Err(e)) => MimeBundle::text(format!("{plain}: {e}")),
        }
    }
}
