//! Units hidden in column headers: `load [kN]`, `load (kN)`, `load / kN`, `load_kN`, `sg1_mVV`.
//!
//! Bracketed and slashed forms state a unit on purpose, so a unit there that the table does not
//! know is an error. The underscore form is only a habit of naming, so its last part is taken as
//! a unit only when it reads as one (`time_s`, `temp_C`); otherwise (`sample_index`) the column
//! is dimensionless and keeps its whole header as its name. Log headers write a few units in a
//! short form without `/` or `°`; those are spelled out before parsing (`mVV` → `mV/V`,
//! `C` → `°C`, `Nm` → `N·m`; common practice in data-logger headers).

use crate::{Unit, UnitError};

/// A header split into a channel name and the unit it states.
///
/// ```
/// use gaugebook::HeaderUnit;
/// let h = HeaderUnit::parse("load [kN]")?;
/// assert_eq!(h.name, "load");
/// assert_eq!(h.unit.unwrap().symbol(), "kN");
/// let h = HeaderUnit::parse("sg1_mVV")?;
/// assert_eq!((h.name.as_str(), h.unit.unwrap().symbol()), ("sg1", "mV/V"));
/// let h = HeaderUnit::parse("sample_index")?;
/// assert_eq!(h.name, "sample_index");
/// assert!(h.unit.is_none());
/// # Ok::<(), gaugebook::UnitError>(())
/// ```
#[derive(Clone, Debug, PartialEq)]
pub struct HeaderUnit {
    /// The header without its unit part (`load` for `load [kN]`).
    pub name: String,
    /// The unit the header states, if it states one.
    pub unit: Option<Unit>,
}

impl HeaderUnit {
    /// Splits a header. Errors only when a bracketed or slashed unit does not parse.
    ///
    /// ```
    /// use gaugebook::HeaderUnit;
    /// assert!(HeaderUnit::parse("load [kilo-bananas]").is_err());
    /// assert_eq!(HeaderUnit::parse("time (s)")?.name, "time");
    /// # Ok::<(), gaugebook::UnitError>(())
    /// ```
    pub fn parse(header: &str) -> Result<HeaderUnit, UnitError> {
        let h = header.trim();
        for (open, close) in [('[', ']'), ('(', ')')] {
            if let Some(body) = h.strip_suffix(close)
                && let Some(at) = body.rfind(open)
            {
                let name = body[..at].trim();
                let unit_text = body[at + open.len_utf8()..].trim();
                if !name.is_empty() {
                    return Ok(HeaderUnit {
                        name: name.to_string(),
                        unit: Some(parse_unit(unit_text)?),
                    });
                }
            }
        }
        // ISO 80000-1, 7.1 (from memory): a column headed "quantity / unit".
        if let Some((name, unit_text)) = h.rsplit_once(" / ") {
            let name = name.trim();
            if !name.is_empty() {
                return Ok(HeaderUnit {
                    name: name.to_string(),
                    unit: Some(parse_unit(unit_text)?),
                });
            }
        }
        if let Some((name, suffix)) = h.rsplit_once('_')
            && !name.is_empty()
            && !suffix.is_empty()
            && let Ok(unit) = parse_unit(&spell_out(suffix))
        {
            return Ok(HeaderUnit {
                name: name.to_string(),
                unit: Some(unit),
            });
        }
        Ok(HeaderUnit {
            name: h.to_string(),
            unit: None,
        })
    }
}

/// The name part of a header whatever its unit part holds (`load` for `load [kilobananas]`).
pub(crate) fn name_part(header: &str) -> String {
    let h = header.trim();
    for (open, close) in [('[', ']'), ('(', ')')] {
        if let Some(body) = h.strip_suffix(close)
            && let Some(at) = body.rfind(open)
            && !body[..at].trim().is_empty()
        {
            return body[..at].trim().to_string();
        }
    }
    if let Some((name, _)) = h.rsplit_once(" / ")
        && !name.trim().is_empty()
    {
        return name.trim().to_string();
    }
    h.to_string()
}

/// Short spellings seen in log headers, where `/`, `°` and `·` cannot be written (common practice).
fn spell_out(suffix: &str) -> String {
    match suffix {
        "mVV" | "mVperV" | "mV_V" => "mV/V".into(),
        "uVV" | "uVperV" => "µV/V".into(),
        "VV" => "V/V".into(),
        "C" | "degC" | "degc" => "°C".into(),
        "F" | "degF" | "degf" => "°F".into(),
        "Nm" => "N·m".into(),
        "kNm" => "kN·m".into(),
        "pct" => "%".into(),
        "ustrain" | "microstrain" => "µε".into(),
        other => other.into(),
    }
}

/// Parses a unit, trying the common alternative spellings the unit table may hold.
pub(crate) fn parse_unit(text: &str) -> Result<Unit, UnitError> {
    let first = Unit::parse(text);
    if first.is_ok() {
        return first;
    }
    let alternatives: &[&str] = match text {
        "°C" => &["degC", "℃"],
        "°F" => &["degF", "℉"],
        "N·m" => &["N*m", "N m"],
        "kN·m" => &["kN*m"],
        "µV/V" => &["uV/V"],
        "µε" => &["ue", "microstrain"],
        _ => &[],
    };
    for alt in alternatives {
        if let Ok(u) = Unit::parse(alt) {
            return Ok(u);
        }
    }
    first
}

/// The dimensionless unit a column without a stated unit gets.
pub(crate) fn plain_unit() -> Unit {
    // The units layer reads "1" as the plain dimensionless unit; from_parts is the fallback so
    // this never fails.
    Unit::parse("1").unwrap_or_else(|_| {
        Unit::from_parts("1", 1.0, 0.0, crate::Dimension::NONE, crate::Kind::Plain)
    })
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn bracket_paren_slash_and_suffix_forms() {
        for (text, name, sym) in [
            ("load [kN]", "load", "kN"),
            ("load (kN)", "load", "kN"),
            ("load / kN", "load", "kN"),
            ("load_kN", "load", "kN"),
            ("sg1_mVV", "sg1", "mV/V"),
            ("load_ref_N", "load_ref", "N"),
            ("  strain [µε] ", "strain", "µε"),
        ] {
            let h = HeaderUnit::parse(text).unwrap();
            assert_eq!(h.name, name, "{text}");
            assert_eq!(h.unit.unwrap().symbol(), sym, "{text}");
        }
    }

    #[test]
    fn suffix_that_is_no_unit_keeps_the_name() {
        let h = HeaderUnit::parse("run_id").unwrap();
        assert_eq!(h.name, "run_id");
        assert!(h.unit.is_none());
        let h = HeaderUnit::parse("temperature").unwrap();
        assert_eq!(h.name, "temperature");
    }

    #[test]
    fn unknown_bracketed_unit_is_an_error() {
        let e = HeaderUnit::parse("load [kNN]").unwrap_err();
        assert!(e.to_string().contains("kNN"), "{e}");
    }
}
