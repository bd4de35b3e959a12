//! From a file's header to a reading plan: which columns are kept, their names and units, and
//! which one is the time axis. Shared by the CSV and Parquet readers.

use std::path::{Path, PathBuf};

use super::header::{HeaderUnit, parse_unit, plain_unit};
use super::{DataError, LogOptions, TimeColumn};
use crate::{Dimension, Kind, Unit};

/// One kept column.
#[derive(Clone, Debug)]
pub(crate) struct ColumnPlan {
    /// 0-based position in the file.
    pub index: usize,
    pub header: String,
    pub name: String,
    pub unit: Unit,
    /// Only for the time column of a CSV file: values are ISO 8601 text.
    pub timestamp: bool,
}

impl ColumnPlan {
    /// The 1-based column number used in messages.
    pub fn column(&self) -> usize {
        self.index + 1
    }
}

/// What to read and how.
#[derive(Clone, Debug)]
pub(crate) struct Plan {
    pub path: PathBuf,
    pub headers: Vec<String>,
    pub time: Option<ColumnPlan>,
    pub channels: Vec<ColumnPlan>,
    pub skip_nan: bool,
    pub gap_factor: f64,
    pub block_bytes: usize,
}

impl Plan {
    /// Every kept column, time first.
    pub fn kept(&self) -> impl Iterator<Item = &ColumnPlan> {
        self.time.iter().chain(self.channels.iter())
    }
}

/// The second, a unit a time column without a stated unit is taken in (common practice).
pub(crate) fn seconds() -> Unit {
    Unit::parse("s")
        .unwrap_or_else(|_| Unit::from_parts("s", 1.0, 0.0, Dimension::TIME, Kind::Plain))
}

fn is_time_name(name: &str) -> bool {
    matches!(
        name.to_ascii_lowercase().as_str(),
        "time" | "t" | "timestamp" | "datetime" | "date_time" | "elapsed"
    )
}

/// Builds the plan from the header names.
pub(crate) fn make_plan(
    path: &Path,
    headers: Vec<String>,
    opts: &LogOptions,
) -> Result<Plan, DataError> {
    // Duplicates first: with two columns of one name, nothing below is well defined.
    for (j, h) in headers.iter().enumerate() {
        if let Some(i) = headers[..j].iter().position(|g| g == h) {
            return Err(DataError::DuplicateColumn {
                path: path.to_path_buf(),
                name: h.clone(),
                first: i + 1,
                second: j + 1,
            });
        }
    }
    let parsed: Vec<(String, Result<Option<Unit>, crate::UnitError>)> = headers
        .iter()
        .map(|h| match HeaderUnit::parse(h) {
            Ok(hu) => (hu.name, Ok(hu.unit)),
            Err(e) => (super::header::name_part(h), Err(e)),
        })
        .collect();
    let available = || headers.join(", ");
    let find = |key: &str| -> Result<usize, DataError> {
        headers
            .iter()
            .position(|h| h == key || h.trim() == key)
            .or_else(|| parsed.iter().position(|(n, _)| n == key))
            .ok_or_else(|| DataError::NoSuchColumn {
                path: path.to_path_buf(),
                name: key.to_string(),
                available: available(),
            })
    };

    let mut overrides: Vec<Option<Unit>> = vec![None; headers.len()];
    for (key, text) in &opts.units {
        let i = find(key)?;
        let unit = parse_unit(text.trim()).map_err(|source| DataError::UnknownUnit {
            path: path.to_path_buf(),
            column: i + 1,
            header: headers[i].clone(),
            source,
        })?;
        overrides[i] = Some(unit);
    }
    let unit_of = |i: usize| -> Result<Option<Unit>, DataError> {
        if let Some(u) = &overrides[i] {
            return Ok(Some(u.clone()));
        }
        parsed[i]
            .1
            .clone()
            .map_err(|source| DataError::UnknownUnit {
                path: path.to_path_buf(),
                column: i + 1,
                header: headers[i].clone(),
                source,
            })
    };

    let time_index = match &opts.time {
        TimeColumn::None => None,
        TimeColumn::Named(key) => Some(find(key)?),
        TimeColumn::Auto => (0..headers.len()).find(|&i| {
            let by_unit = matches!(unit_of(i), Ok(Some(u)) if u.dimension() == Dimension::TIME);
            by_unit || is_time_name(&parsed[i].0)
        }),
    };

    let mut wanted: Vec<usize> = match &opts.columns {
        Some(keys) => keys.iter().map(|k| find(k)).collect::<Result<_, _>>()?,
        None => (0..headers.len()).collect(),
    };
    wanted.retain(|&i| Some(i) != time_index);
    let mut seen = Vec::new();
    wanted.retain(|i| {
        let fresh = !seen.contains(i);
        seen.push(*i);
        fresh
    });

    let time = match time_index {
        Some(i) => {
            let unit = match unit_of(i)? {
                Some(u) => u,
                None => seconds(),
            };
            Some(ColumnPlan {
                index: i,
                header: headers[i].clone(),
                name: parsed[i].0.clone(),
                unit,
                timestamp: false,
            })
        }
        None => None,
    };
    let mut channels = Vec::with_capacity(wanted.len());
    for &i in &wanted {
        let unit = unit_of(i)?.unwrap_or_else(plain_unit);
        channels.push(ColumnPlan {
            index: i,
            header: headers[i].clone(),
            name: parsed[i].0.clone(),
            unit,
            timestamp: false,
        });
    }
    // Two headers may strip to one name (`load [N]`, `load [kN]`): those keep their headers.
    let names: Vec<String> = time
        .iter()
        .chain(channels.iter())
        .map(|c| c.name.clone())
        .collect();
    for c in &mut channels {
        if names.iter().filter(|n| **n == c.name).count() > 1 {
            c.name = c.header.trim().to_string();
        }
    }
    Ok(Plan {
        path: path.to_path_buf(),
        headers,
        time,
        channels,
        skip_nan: opts.skip_nan,
        gap_factor: opts.gap_factor,
        block_bytes: opts.block_bytes.max(4096),
    })
}
