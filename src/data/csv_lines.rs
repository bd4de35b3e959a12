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

use super::decimal::plain_decimal;
use super::plan::Plan;
use super::time::parse_timestamp_parts;
use super::DataError;

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
    /// Returns the file row of every sample when blank lines made them not consecutive.
    pub(crate) fn read(
        &self,
        block: &[u8],
        first_row: usize,
        out: &mut [Vec<f64>],
    ) -> Result<Option<Vec<usize>>, DataError> {
        let n = block.len();
        let sep = self.sep;
        let fields = self.roles.len();
        let mut rows: Option<Vec<usize>> = None;
        let mut samples = 0usize;
        let mut line = 0usize;
        let mut p = 0usize;
        while p < n {
            let row = first_row + line;
            line += 1;
            if block[p].is_ascii_whitespace() {
                let end = memchr::memchr(b'\n', &block[p..]).map_or(n, |k| p + k);
                if block[p..end].iter().all(u8::is_ascii_whitespace) {
                    // Policy: a blank line is not a sample; from here on, rows are listed.
                    rows.get_or_insert_with(|| (0..samples).map(|i| first_row + i).collect());
                    p = end + 1;
                    continue;
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
                            out[k].push(self.slow_number(&block[p..e], row, k)?);
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
                    Some(b'\r') => p = q + 2,
                    _ => p = q + 1,
                }
            }
            samples += 1;
            if let Some(r) = rows.as_mut() {
                r.push(row);
            }
        }
        Ok(rows)
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
