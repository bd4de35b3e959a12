//! Helpers shared by the integration tests.

/// Asserts `|actual - expected| <= rel * |expected| + abs`, naming both numbers on failure.
#[track_caller]
pub fn assert_close(actual: f64, expected: f64, rel: f64, abs: f64) {
    let tol = rel * expected.abs() + abs;
    assert!(
        (actual - expected).abs() <= tol,
        "expected {expected} (±{tol}), found {actual}"
    );
}

/// The Jupyter clients' Python environment (the kernel and evcxr notebook tests).
#[cfg(feature = "kernel")]
pub mod pyenv;
