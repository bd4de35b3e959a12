//! Progress of long imports, reported through a trait so each front-end shows it its own way:
//! the terminal draws a bar on stderr, the kernel updates a display in the notebook.

use std::io::{IsTerminal, Write};
use std::sync::Mutex;
use std::time::{Duration, Instant};

/// Receives progress of a long operation. Methods take `&self` so one reporter can be shared;
/// implementations use interior mutability.
///
/// ```
/// use std::sync::atomic::{AtomicU64, Ordering};
/// use gaugebook::Progress;
/// struct Count(AtomicU64);
/// impl Progress for Count {
///     fn start(&self, _what: &str, _total: Option<u64>) {}
///     fn advance(&self, done: u64) { self.0.store(done, Ordering::Relaxed); }
///     fn finish(&self) {}
/// }
/// let c = Count(AtomicU64::new(0));
/// c.advance(42);
/// assert_eq!(c.0.load(Ordering::Relaxed), 42);
/// ```
pub trait Progress {
    /// The operation begins; `total` is its size in the units of `advance` (bytes for a read),
    /// when known.
    fn start(&self, what: &str, total: Option<u64>);
    /// `done` units are complete so far (not an increment).
    fn advance(&self, done: u64);
    /// The operation ended (successfully or not).
    fn finish(&self);
}

/// Reports nothing.
///
/// ```
/// use gaugebook::{NoProgress, Progress};
/// NoProgress.start("read", Some(10));
/// NoProgress.finish();
/// ```
#[derive(Clone, Copy, Debug, Default)]
pub struct NoProgress;

impl Progress for NoProgress {
    fn start(&self, _what: &str, _total: Option<u64>) {}
    fn advance(&self, _done: u64) {}
    fn finish(&self) {}
}

/// A text bar on stderr, drawn only when stderr is a terminal (so logs and pipes stay clean),
/// redrawn at most ten times a second.
///
/// ```
/// use gaugebook::{Progress, TerminalProgress};
/// let p = TerminalProgress::new();
/// p.start("reading run7.csv", Some(1000));
/// p.advance(500);
/// p.finish();
/// ```
#[derive(Debug)]
pub struct TerminalProgress {
    enabled: bool,
    state: Mutex<BarState>,
}

#[derive(Debug)]
struct BarState {
    what: String,
    total: Option<u64>,
    started: Instant,
    last_draw: Option<Instant>,
}

impl TerminalProgress {
    /// A bar that draws when stderr is a terminal.
    ///
    /// ```
    /// use gaugebook::{Progress, TerminalProgress};
    /// let bar = TerminalProgress::new(); // silent when stderr is not a terminal (as under tests)
    /// bar.start("reading log.csv", Some(1024));
    /// bar.advance(512);
    /// bar.finish();
    /// ```
    pub fn new() -> TerminalProgress {
        TerminalProgress::with_enabled(std::io::stderr().is_terminal())
    }

    /// Whether this bar draws at all.
    ///
    /// ```
    /// // Under `cargo test` stderr is captured, so the bar stays silent.
    /// let p = gaugebook::TerminalProgress::new();
    /// let _ = p.is_enabled();
    /// ```
    pub fn is_enabled(&self) -> bool {
        self.enabled
    }

    fn with_enabled(enabled: bool) -> TerminalProgress {
        TerminalProgress {
            enabled,
            state: Mutex::new(BarState {
                what: String::new(),
                total: None,
                started: Instant::now(),
                last_draw: None,
            }),
        }
    }

    fn draw(state: &BarState, done: u64) {
        let secs = state.started.elapsed().as_secs_f64();
        let line = match state.total {
            Some(total) if total > 0 => {
                let frac = (done as f64 / total as f64).clamp(0.0, 1.0);
                let width = 30;
                let filled = (frac * width as f64).round() as usize;
                format!(
                    "\r{} [{}{}] {:5.1} % {:6.1} s",
                    state.what,
                    "#".repeat(filled),
                    " ".repeat(width - filled),
                    frac * 100.0,
                    secs
                )
            }
            _ => format!("\r{} {} {:6.1} s", state.what, done, secs),
        };
        let mut err = std::io::stderr().lock();
        // A failed progress write must not fail the import: ignore it.
        let _ = err.write_all(line.as_bytes());
        let _ = err.flush();
    }
}

impl Default for TerminalProgress {
    fn default() -> Self {
        TerminalProgress::new()
    }
}

impl Progress for TerminalProgress {
    fn start(&self, what: &str, total: Option<u64>) {
        if !self.enabled {
            return;
        }
        if let Ok(mut s) = self.state.lock() {
            s.what = what.to_string();
            s.total = total;
            s.started = Instant::now();
            s.last_draw = None;
            TerminalProgress::draw(&s, 0);
        }
    }

    fn advance(&self, done: u64) {
        if !self.enabled {
            return;
        }
        if let Ok(mut s) = self.state.lock() {
            let now = Instant::now();
            if s.last_draw
                .is_none_or(|t| now - t >= Duration::from_millis(100))
            {
                s.last_draw = Some(now);
                TerminalProgress::draw(&s, done);
            }
        }
    }

    fn finish(&self) {
        if !self.enabled {
            return;
        }
        if let Ok(s) = self.state.lock() {
            if let Some(total) = s.total {
                TerminalProgress::draw(&s, total);
            }
            let _ = std::io::stderr().write_all(b"\n");
        }
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn disabled_bar_is_silent_and_does_not_panic() {
        let p = TerminalProgress::with_enabled(false);
        p.start("x", None);
        p.advance(3);
        p.finish();
        assert!(!p.is_enabled());
    }
}
