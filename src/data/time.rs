//! The time axis of a log: ISO 8601 timestamps, the sample step and rate, and gaps.
//!
//! The sample step is the median of the steps, so a few dropped or doubled samples do not move
//! it (common practice). A step longer than `gap_factor` times the median is a gap.

/// Seconds since 1970-01-01T00:00:00Z of an ISO 8601 date-time (`2026-12-01T20:00:00.125Z`,
/// a space instead of `T`, an optional `Z` or `±hh:mm` offset; no offset means UTC).
///
/// ```
/// use gaugebook::parse_timestamp;
/// assert_eq!(parse_timestamp("1970-01-02T00:00:01.5Z"), Some(86_401.5));
/// assert_eq!(parse_timestamp("2000-03-01 00:00:00+01:00"), Some(951_865_200.0));
/// assert_eq!(parse_timestamp("yesterday"), None);
/// ```
pub fn parse_timestamp(text: &str) -> Option<f64> {
    parse_timestamp_parts(text).map(|(whole, frac)| whole as f64 + frac)
}

/// Whole seconds since the epoch and the fraction of a second, apart, so that differences of
/// nearby timestamps keep their sub-microsecond digits (a double near 1.8·10⁹ s resolves only
/// about 0.24 µs).
pub(crate) fn parse_timestamp_parts(text: &str) -> Option<(i64, f64)> {
    let t = text.trim().trim_matches('"').as_bytes();
    if t.len() < 19 {
        return None;
    }
    let num = |s: &[u8]| -> Option<i64> {
        if s.is_empty() || !s.iter().all(u8::is_ascii_digit) {
            return None;
        }
        Some(s.iter().fold(0i64, |a, &d| a * 10 + i64::from(d - b'0')))
    };
    if t[4] != b'-'
        || t[7] != b'-'
        || !(t[10] == b'T' || t[10] == b' ')
        || t[13] != b':'
        || t[16] != b':'
    {
        return None;
    }
    let (y, mo, d) = (num(&t[0..4])?, num(&t[5..7])?, num(&t[8..10])?);
    let (h, mi, s) = (num(&t[11..13])?, num(&t[14..16])?, num(&t[17..19])?);
    if !(1..=12).contains(&mo) || !(1..=31).contains(&d) || h > 23 || mi > 59 || s > 60 {
        return None;
    }
    let mut rest = &t[19..];
    let mut frac = 0.0;
    if let Some(r) = rest.strip_prefix(b".") {
        let n = r.iter().take_while(|c| c.is_ascii_digit()).count();
        if n == 0 {
            return None;
        }
        let digits = std::str::from_utf8(&r[..n]).ok()?;
        frac = format!("0.{digits}").parse::<f64>().ok()?;
        rest = &r[n..];
    }
    let offset_s = match rest {
        b"" | b"Z" | b"z" => 0,
        [sign @ (b'+' | b'-'), hh @ ..] if hh.len() == 5 && hh[2] == b':' => {
            let off = num(&hh[0..2])? * 3600 + num(&hh[3..5])? * 60;
            if *sign == b'+' { off } else { -off }
        }
        _ => return None,
    };
    let days = days_from_civil(y, mo, d);
    let whole = days * 86_400 + h * 3600 + mi * 60 + s - offset_s;
    Some((whole, frac))
}

/// Days since 1970-01-01 of a proleptic Gregorian date (H. Hinnant, "chrono-Compatible Low-Level
/// Date Algorithms", days_from_civil; from memory).
fn days_from_civil(y: i64, m: i64, d: i64) -> i64 {
    let y = if m <= 2 { y - 1 } else { y };
    let era = if y >= 0 { y } else { y - 399 } / 400;
    let yoe = y - era * 400;
    let mp = (m + 9) % 12;
    let doy = (153 * mp + 2) / 5 + d - 1;
    let doe = yoe * 365 + yoe / 4 - yoe / 100 + doy;
    era * 146_097 + doe - 719_468
}

/// The median step of an increasing time series, in its own unit, or `None` with fewer than
/// two samples.
///
/// ```
/// use gaugebook::median_step;
/// assert_eq!(median_step(&[0.0, 0.001, 0.002, 0.010, 0.011]), Some(0.001));
/// ```
pub fn median_step(times: &[f64]) -> Option<f64> {
    if times.len() < 2 {
        return None;
    }
    let mut steps: Vec<f64> = times.windows(2).map(|w| w[1] - w[0]).collect();
    let mid = steps.len() / 2;
    // total_cmp: steps are finite here (the reader refuses non-finite times).
    let (_, &mut upper, _) = steps.select_nth_unstable_by(mid, f64::total_cmp);
    if steps.len() % 2 == 1 {
        Some(upper)
    } else {
        // numpy.median averages the two middle values of an even count.
        let lower = steps[..mid]
            .iter()
            .copied()
            .fold(f64::NEG_INFINITY, f64::max);
        Some(0.5 * (lower + upper))
    }
}

/// A pause in the recording: a step longer than the gap threshold.
///
/// ```
/// use gaugebook::find_gaps;
/// let t = [0.0, 1.0, 2.0, 7.0, 8.0];
/// let gaps = find_gaps(&t, 1.0, 1.5, 2);
/// assert_eq!(gaps.len(), 1);
/// assert_eq!((gaps[0].row, gaps[0].start, gaps[0].length), (5, 2.0, 5.0));
/// ```
#[derive(Clone, Debug, PartialEq)]
pub struct Gap {
    /// The row (1-based, header = 1) of the first sample after the gap.
    pub row: usize,
    /// The time of the last sample before the gap, in the time column's unit.
    pub start: f64,
    /// The length of the step that makes the gap, in the time column's unit.
    pub length: f64,
}

/// Steps longer than `factor × step`; `first_row` is the file row of `times[0]` (2 for a CSV
/// file with one header line).
///
/// ```
/// use gaugebook::find_gaps;
/// assert!(find_gaps(&[0.0, 0.1, 0.2], 0.1, 1.5, 2).is_empty());
/// ```
pub fn find_gaps(times: &[f64], step: f64, factor: f64, first_row: usize) -> Vec<Gap> {
    let limit = step * factor;
    times
        .windows(2)
        .enumerate()
        .filter(|(_, w)| w[1] - w[0] > limit)
        .map(|(i, w)| Gap {
            row: first_row + i + 1,
            start: w[0],
            length: w[1] - w[0],
        })
        .collect()
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn unix_epoch_and_leap_years() {
        // Closed-form checks: 1970-01-01 is day 0; 2000-02-29 exists (2000 is a leap year);
        // 951782400 = 2000-02-29T00:00:00Z (date -u -d 2000-02-29 +%s, GNU coreutils).
        assert_eq!(parse_timestamp("1970-01-01T00:00:00Z"), Some(0.0));
        assert_eq!(parse_timestamp("2000-02-29T00:00:00"), Some(951_782_400.0));
        assert_eq!(parse_timestamp("2000-03-01T00:00:00Z"), Some(951_868_800.0));
        assert_eq!(parse_timestamp("1969-12-31T23:59:59Z"), Some(-1.0));
        assert_eq!(parse_timestamp("2026-13-01T00:00:00Z"), None);
        assert_eq!(parse_timestamp("2026-12-01T00:00:00+0100"), None);
    }

    #[test]
    fn median_of_even_count_averages_like_numpy() {
        // numpy.median([1, 2, 4, 8]) = 3.0 (numpy 2.4.6); as steps of [0, 1, 3, 7, 15].
        assert_eq!(median_step(&[0.0, 1.0, 3.0, 7.0, 15.0]), Some(3.0));
        assert_eq!(median_step(&[0.0]), None);
    }
}
