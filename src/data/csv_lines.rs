//! Reading the data lines of a CSV block into the kept columns, in one pass over the bytes,
//! naming the row and column of anything that is not a number.
//!
//! Fields are separated by one byte and lines end in `\n` or `\r\n`. A field is read where it
//! starts: a plain decimal through [`plain_decimal`](super::decimal::plain_decimal), anything
//! else (an exponent, `NaN`, `inf`, surrounding spaces or quotes) through the standard
//! library's parser after trimming; columns that are not kept are stepped over, not read, so
//! text in them is no error. Policies (tested in `tests/data.rs`): a line of nothing but white
//! space is no sample, and the file row of every sample is then kept; a line with another number
//! of fields than the header is an error naming the row; an empty field is not a number.

use super::DataError;
use super::decimal::plain_decimal;
use super::plan::Plan;
use super::time::parse_timestamp_parts;

/// What [`LineFormat::read`] found besides the values.
pub(crate) struct ReadLines {
    /// The file row of every sample, when blank lines made them not consecutive.
    pub rows: Option<Vec<usize>>,
    /// Whether a value read is NaN or infinite.
    pub non_finite: bool,
}

/// Lines read side by side (see [`LineFormat::read`]).
const LANES: usize = 4;

/// What becomes of one field of a line.
#[derive(Clone, Copy, Debug)]
enum Role {
    /// Not kept: stepped over.
    Skip,
    /// A number for output column `k`.
    Number(usize),
    /// An ISO 8601 timestamp for output column `k`, as seconds after the log's first.
    Timestamp(usize),
}

/// How to read the lines of one file: its separator, the role of each field and the first
/// timestamp. Outputs are in the order of [`Plan::kept`] (time first).
#[derive(Clone, Debug)]
pub(crate) struct LineFormat {
    sep: u8,
    roles: Vec<Role>,
    /// Whole seconds and fraction of the first timestamp.
    t0: (i64, f64),
    plan: Plan,
}

impl LineFormat {
    pub(crate) fn new(plan: &Plan, sep: u8, t0: (i64, f64)) -> LineFormat {
        let mut roles = vec![Role::Skip; plan.headers.len()];
        for (k, c) in plan.kept().enumerate() {
            roles[c.index] = if c.timestamp {
                Role::Timestamp(k)
            } else {
                Role::Number(k)
            };
        }
        LineFormat {
            sep,
            roles,
            t0,
            plan: plan.clone(),
        }
    }

    /// Columns the block is read into (the kept ones, time first).
    pub(crate) fn outputs(&self) -> usize {
        self.plan.kept().count()
    }

    /// Reads every line of `block` (whole lines; the last may lack its line end) into `out`,
    /// one vector per kept column, appending. `first_row` is the file row of the first line.
    /// Returns the file row of every sample when blank lines made them not consecutive, and
    /// whether any value read is NaN or infinite (only the slow path can read one, so the
    /// caller's scan for them is skipped otherwise).
    ///
    /// Lines go in groups of [`LANES`]: their starts are found first (a vectorised search for
    /// line ends), then field by field the group's lines are read side by side. Reading one
    /// number needs the end of the one before it, so one line is a chain of dependent steps;
    /// four lines are four chains the processor overlaps (about 1.5 times faster here). A group
    /// with anything but plain numbers in the expected places (a blank line, a number the fast
    /// path leaves alone, a wrong field count) is read again line by line, which also finds
    /// and names any error.
    pub(crate) fn read(
        &self,
        block: &[u8],
        first_row: usize,
        out: &mut [Vec<f64>],
    ) -> Result<ReadLines, DataError> {
        let n = block.len();
        let mut non_finite = false;
        let grouped = self.roles.iter().all(|r| !matches!(r, Role::Timestamp(_)));
        let mut lanes = vec![[0.0f64; LANES]; out.len()];
        let mut rows: Option<Vec<usize>> = None;
        let mut samples = 0usize;
        let mut line = 0usize;
        let mut p = 0usize;
        while p < n {
            let mut starts = [0usize; LANES];
            let mut ends = [0usize; LANES];
            let mut count = 0;
            let mut q = p;
            while count < LANES && q < n {
                starts[count] = q;
                ends[count] = memchr::memchr(b'\n', &block[q..]).map_or(n, |k| q + k);
                q = ends[count] + 1;
                count += 1;
            }
            if grouped && count == LANES && self.group(block, &starts, &ends, &mut lanes) {
                for (o, v) in out.iter_mut().zip(&lanes) {
                    o.extend_from_slice(v);
                }
                if let Some(r) = rows.as_mut() {
                    r.extend((0..LANES).map(|j| first_row + line + j));
                }
                samples += LANES;
                line += LANES;
                p = q;
                continue;
            }
            for &start in &starts[..count] {
                let row = first_row + line;
                line += 1;
                if self.line(block, start, row, out, &mut non_finite)? {
                    samples += 1;
                    if let Some(r) = rows.as_mut() {
                        r.push(row);
                    }
                } else {
                    // Policy: a blank line is not a sample; from here on, rows are listed.
                    rows.get_or_insert_with(|| (0..samples).map(|i| first_row + i).collect());
                }
            }
            p = q;
        }
        Ok(ReadLines { rows, non_finite })
    }

    /// Reads the [`LANES`] lines starting at `starts` (ending at `ends`) side by side into
    /// `lanes`, when every kept field is a plain number and every line has the header's fields;
    /// false (with `lanes` partly written) when one is not.
    #[inline]
    fn group(
        &self,
        block: &[u8],
        starts: &[usize; LANES],
        ends: &[usize; LANES],
        lanes: &mut [[f64; LANES]],
    ) -> bool {
        let sep = self.sep;
        let last = self.roles.len() - 1;
        let mut ps = *starts;
        for (f, role) in self.roles.iter().enumerate() {
            for j in 0..LANES {
                let q = match *role {
                    Role::Number(k) => match plain_decimal(block, ps[j]) {
                        Some((v, q)) => {
                            lanes[k][j] = v;
                            q
                        }
                        None => return false,
                    },
                    Role::Skip => field_end(block, ps[j], sep),
                    Role::Timestamp(_) => return false,
                };
                if f < last {
                    if q >= ends[j] || block[q] != sep {
                        return false;
                    }
                    ps[j] = q + 1;
                } else if !(q == ends[j] || (q + 1 == ends[j] && block[q] == b'\r')) {
                    return false;
                }
            }
        }
        true
    }

    /// Reads the line starting at `p` into `out`: true for a sample, false for a blank line.
    fn line(
        &self,
        block: &[u8],
        mut p: usize,
        row: usize,
        out: &mut [Vec<f64>],
        non_finite: &mut bool,
    ) -> Result<bool, DataError> {
        let n = block.len();
        let sep = self.sep;
        let fields = self.roles.len();
        if block[p].is_ascii_whitespace() {
            let end = memchr::memchr(b'\n', &block[p..]).map_or(n, |k| p + k);
            if block[p..end].iter().all(u8::is_ascii_whitespace) {
                return Ok(false);
            }
        }
        for (f, role) in self.roles.iter().enumerate() {
            let q = match *role {
                Role::Number(k) => match plain_decimal(block, p) {
                    Some((v, q)) if field_ends(block, q, sep) => {
                        out[k].push(v);
                        q
                    }
                    _ => {
                        let e = field_end(block, p, sep);
                        let v = self.slow_number(&block[p..e], row, k)?;
                        *non_finite |= !v.is_finite();
                        out[k].push(v);
                        e
                    }
                },
                Role::Skip => field_end(block, p, sep),
                Role::Timestamp(k) => {
                    let e = field_end(block, p, sep);
                    out[k].push(self.timestamp(&block[p..e], row, k)?);
                    e
                }
            };
            let last = f + 1 == fields;
            match block.get(q) {
                Some(&c) if c == sep && !last => p = q + 1,
                Some(&c) if c == sep => {
                    let end = memchr::memchr(b'\n', &block[q..]).map_or(n, |k| q + k);
                    let extra = memchr::memchr_iter(sep, &block[q..end]).count();
                    return Err(DataError::Ragged {
                        path: self.plan.path.clone(),
                        row,
                        expected: fields,
                        found: fields + extra,
                    });
                }
                _ if !last => {
                    return Err(DataError::Ragged {
                        path: self.plan.path.clone(),
                        row,
                        expected: fields,
                        found: f + 1,
                    });
                }
                // The line end: `\n`, `\r\n`, or the end of the block.
                _ => {}
            }
        }
        Ok(true)
    }

    /// A field the fast path did not take: trimmed of white space and surrounding quotes, then
    /// read by the standard library (exponents, `NaN`, `inf`, a leading `+`).
    fn slow_number(&self, field: &[u8], row: usize, k: usize) -> Result<f64, DataError> {
        let text = String::from_utf8_lossy(field);
        let t = text.trim();
        let t = t
            .strip_prefix('"')
            .and_then(|t| t.strip_suffix('"'))
            .unwrap_or(t)
            .trim();
        t.parse::<f64>().map_err(|_| {
            let c = self.column(k);
            DataError::NotANumber {
                path: self.plan.path.clone(),
                row,
                column: c.column(),
                name: c.header.clone(),
                found: shown(field),
            }
        })
    }

    fn timestamp(&self, field: &[u8], row: usize, k: usize) -> Result<f64, DataError> {
        let text = String::from_utf8_lossy(field);
        match parse_timestamp_parts(&text) {
            Some((w, f)) => Ok((w - self.t0.0) as f64 + (f - self.t0.1)),
            None => {
                let c = self.column(k);
                Err(DataError::BadTimestamp {
                    path: self.plan.path.clone(),
                    row,
                    column: c.column(),
                    name: c.header.clone(),
                    found: shown(field),
                })
            }
        }
    }

    fn column(&self, k: usize) -> &super::plan::ColumnPlan {
        self.plan
            .kept()
            .nth(k)
            .expect("an output column is a kept column")
    }
}

/// Whether a number read on the fast path ends its field: a separator, a line end or the end
/// of the block follows (a `\r` only as part of `\r\n` or at the very end).
#[inline(always)]
fn field_ends(block: &[u8], q: usize, sep: u8) -> bool {
    match block.get(q) {
        None => true,
        Some(&c) if c == sep || c == b'\n' => true,
        Some(b'\r') => matches!(block.get(q + 1), None | Some(b'\n')),
        _ => false,
    }
}

/// The position of the separator or line end after the field starting at `p` (a `\r` before a
/// `\n` belongs to the line end).
#[inline]
fn field_end(block: &[u8], p: usize, sep: u8) -> usize {
    let e = memchr::memchr2(sep, b'\n', &block[p..]).map_or(block.len(), |k| p + k);
    let at_line_end = e == block.len() || block[e] == b'\n';
    if at_line_end && e > p && block[e - 1] == b'\r' {
        e - 1
    } else {
        e
    }
}

/// A field as shown in a message: without its line end, at most 40 characters.
fn shown(field: &[u8]) -> String {
    let f = field.strip_suffix(b"\r").unwrap_or(field);
    String::from_utf8_lossy(f).chars().take(40).collect()
}
