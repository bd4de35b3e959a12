//! Class verdicts: a list of checks, each a value against a cited limit, and the one that
//! decides the outcome.

use std::fmt;

use crate::Direction;

/// The caution every verdict carries.
///
/// ```
/// assert!(gaugebook::VERDICT_CAUTION.contains("not a type approval"));
/// ```
pub const VERDICT_CAUTION: &str = "a computed class verdict is not a type approval or a \
legal-for-trade certificate; that follows local regulation";

/// One value checked against one limit.
///
/// ```
/// use gaugebook::Check;
/// let c = Check::at_most("creep over 30 min", 0.3, 0.35, "N", "OIML R 60:2021 (from memory)");
/// assert!(c.passed && (c.ratio() - 0.3 / 0.35).abs() < 1e-12);
/// ```
#[derive(Clone, Debug, PartialEq)]
pub struct Check {
    /// What is checked, with the load or step it refers to.
    pub name: String,
    /// The value found (magnitude where the limit is on a magnitude).
    pub value: f64,
    /// The limit.
    pub limit: f64,
    /// Unit of value and limit.
    pub unit: String,
    /// The clause and table the limit comes from.
    pub source: String,
    /// Whether the check passed.
    pub passed: bool,
    /// True for "value ≥ limit" checks (e.g. a count of intervals), false for "|value| ≤ limit".
    pub at_least: bool,
}

impl Check {
    /// A check that passes when |value| ≤ limit.
    ///
    /// ```
    /// let c = gaugebook::Check::at_most("error", -0.8, 0.7, "v", "Table 5");
    /// assert!(!c.passed); // the limit is on the magnitude
    /// ```
    pub fn at_most(name: &str, value: f64, limit: f64, unit: &str, source: &str) -> Check {
        Check {
            name: name.to_string(),
            value,
            limit,
            unit: unit.to_string(),
            source: source.to_string(),
            passed: value.abs() <= limit,
            at_least: false,
        }
    }

    /// A check that passes when value ≥ limit.
    ///
    /// ```
    /// let c = gaugebook::Check::at_least("intervals", 3000.0, 5000.0, "", "R 60");
    /// assert!(!c.passed);
    /// ```
    pub fn at_least(name: &str, value: f64, limit: f64, unit: &str, source: &str) -> Check {
        Check {
            name: name.to_string(),
            value,
            limit,
            unit: unit.to_string(),
            source: source.to_string(),
            passed: value >= limit,
            at_least: true,
        }
    }

    /// How much of the limit is used: |value|/limit (or limit/value for "at least" checks);
    /// above 1 fails.
    ///
    /// ```
    /// let c = gaugebook::Check::at_least("n", 4000.0, 500.0, "", "Table 2");
    /// assert_eq!(c.ratio(), 0.125);
    /// ```
    pub fn ratio(&self) -> f64 {
        if self.at_least {
            if self.value > 0.0 {
                self.limit / self.value
            } else {
                f64::INFINITY
            }
        } else if self.limit > 0.0 {
            self.value.abs() / self.limit
        } else if self.value == 0.0 {
            0.0
        } else {
            f64::INFINITY
        }
    }
}

/// One reading's error against the permissible error at its load, for plots of a run against
/// its class envelope (filled by OIML R 60 evaluations; empty where a standard has no per-point
/// envelope).
///
/// ```
/// use gaugebook::{Direction, ErrorPoint};
/// let p = ErrorPoint { load: 5000.0, direction: Direction::Ascending, series: 0, error: 0.4, limit: 0.7 };
/// assert!(p.error.abs() <= p.limit);
/// ```
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct ErrorPoint {
    /// Applied load (N or N·m).
    pub load: f64,
    /// Direction of the reading's series.
    pub direction: Direction,
    /// Index of the reading's series in the run.
    pub series: usize,
    /// Error of the reading, in the verdict's `point_unit`.
    pub error: f64,
    /// Permissible error (magnitude) at this load, in the same unit.
    pub limit: f64,
}

/// The outcome of a class evaluation against one standard.
///
/// The deciding check is the one using the largest share of its limit: the worst failure if
/// any check fails, otherwise the check with the least margin.
///
/// A computed class verdict is not a type approval or a legal-for-trade certificate; that
/// follows local regulation ([`VERDICT_CAUTION`], printed by `Display`).
///
/// ```
/// use gaugebook::{Check, ClassVerdict};
/// let v = ClassVerdict::new("OIML R 60:2021", "C3", vec![
///     Check::at_most("error at 50 %", 0.4, 0.7, "v", "Table 5"),
///     Check::at_most("repeatability", 0.9, 0.7, "v", "5.3.2"),
/// ]);
/// assert!(!v.passed);
/// assert_eq!(v.deciding().unwrap().name, "repeatability");
/// assert!(v.to_string().contains("not a type approval"));
/// ```
#[derive(Clone, Debug, PartialEq)]
pub struct ClassVerdict {
    /// Standard and edition.
    pub standard: String,
    /// Class evaluated (or found).
    pub class: String,
    /// Every check.
    pub checks: Vec<Check>,
    /// All checks passed (and there was at least one).
    pub passed: bool,
    /// Per-reading errors against the permissible error (empty unless the standard has a
    /// per-point envelope, as OIML R 60 does).
    pub points: Vec<ErrorPoint>,
    /// The permissible error (magnitude) against load as a polyline of (load, limit) pairs over
    /// the tested range, steps drawn as two pairs at the same load; empty with `points`.
    pub envelope: Vec<(f64, f64)>,
    /// Unit of `points` errors and of `envelope` limits (`"N"` for R 60), empty without them.
    pub point_unit: String,
}

impl ClassVerdict {
    /// A verdict from its checks.
    ///
    /// ```
    /// let v = gaugebook::ClassVerdict::new("ISO 376:2011", "1", vec![]);
    /// assert!(!v.passed); // no checks, no pass
    /// ```
    pub fn new(standard: &str, class: &str, checks: Vec<Check>) -> ClassVerdict {
        let passed = !checks.is_empty() && checks.iter().all(|c| c.passed);
        ClassVerdict {
            standard: standard.to_string(),
            class: class.to_string(),
            checks,
            passed,
            points: vec![],
            envelope: vec![],
            point_unit: String::new(),
        }
    }

    /// The check that decides the verdict.
    ///
    /// ```
    /// use gaugebook::{Check, ClassVerdict};
    /// let v = ClassVerdict::new("s", "c", vec![Check::at_most("a", 1.0, 2.0, "", ""), Check::at_most("b", 1.9, 2.0, "", "")]);
    /// assert_eq!(v.deciding().unwrap().name, "b");
    /// ```
    pub fn deciding(&self) -> Option<&Check> {
        self.checks
            .iter()
            .max_by(|a, b| a.ratio().total_cmp(&b.ratio()))
    }

    /// The checks that failed.
    ///
    /// ```
    /// let v = gaugebook::ClassVerdict::new("x", "y", vec![]);
    /// assert!(v.failures().is_empty() && !v.passed);
    /// ```
    pub fn failures(&self) -> Vec<&Check> {
        self.checks.iter().filter(|c| !c.passed).collect()
    }
}

impl fmt::Display for ClassVerdict {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        let outcome = if self.passed {
            "meets"
        } else {
            "does not meet"
        };
        write!(f, "{outcome} {} class {}", self.standard, self.class)?;
        if let Some(d) = self.deciding() {
            let rel = if d.at_least { "≥" } else { "≤" };
            write!(
                f,
                "; deciding: {} = {} {} (limit {rel} {} {}, {})",
                d.name, d.value, d.unit, d.limit, d.unit, d.source
            )?;
        }
        write!(f, ". Caution: {VERDICT_CAUTION}")
    }
}
