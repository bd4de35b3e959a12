//! Comparing a recorded output text with a rerun's: the words and symbols must be equal, the
//! numbers in between may differ within a tolerance. A number is an optionally signed decimal
//! with optional exponent that does not continue a name (`x2` is a name; the `3` of `cell[3]`
//! is a number); the unit after it is part of the text, so `2 kN` against
//! `2 N` is a text change, not a number within tolerance.

/// Absolute and relative tolerance: `|new - old| <= atol + rtol * |old|`.
#[derive(Clone, Copy, Debug, PartialEq)]
pub(crate) struct Tolerance {
    pub(crate) rtol: f64,
    pub(crate) atol: f64,
}

impl Tolerance {
    pub(crate) fn accepts(&self, old: f64, new: f64) -> bool {
        if old == new || (old.is_nan() && new.is_nan()) {
            return true;
        }
        (new - old).abs() <= self.atol + self.rtol * old.abs()
    }
}

/// A piece of text: a number (its spelling and value) or anything else.
#[derive(Clone, Debug, PartialEq)]
pub(crate) enum Token<'a> {
    Text(&'a str),
    Number(&'a str, f64),
}

/// One number that moved beyond the tolerance.
#[derive(Clone, Debug, PartialEq)]
pub(crate) struct NumberDrift {
    pub(crate) old: String,
    pub(crate) new: String,
    pub(crate) old_value: f64,
    pub(crate) new_value: f64,
    /// The text just before the number (what it is), trimmed.
    pub(crate) context: String,
}

/// How two texts differ.
#[derive(Clone, Debug, PartialEq)]
pub(crate) enum TextDiff {
    /// Equal within tolerance.
    Same,
    /// Same words, some numbers beyond tolerance.
    Numbers(Vec<NumberDrift>),
    /// The words differ: the first differing line of each.
    Text { old_line: String, new_line: String },
}

/// Splits text into numbers and the text between them.
pub(crate) fn tokens(s: &str) -> Vec<Token<'_>> {
    let b = s.as_bytes();
    let mut out = Vec::new();
    let mut text_start = 0;
    let mut i = 0;
    while i < b.len() {
        let starts_number = (b[i].is_ascii_digit()
            || ((b[i] == b'-' || b[i] == b'+' || b[i] == b'.')
                && b.get(i + 1)
                    .is_some_and(|c| c.is_ascii_digit() || *c == b'.')))
            && !(i > 0 && (b[i - 1].is_ascii_alphanumeric() || b[i - 1] == b'_'));
        if !starts_number {
            i += 1;
            continue;
        }
        let end = number_end(b, i);
        match s[i..end].parse::<f64>() {
            Ok(v) if end > i => {
                if text_start < i {
                    out.push(Token::Text(&s[text_start..i]));
                }
                out.push(Token::Number(&s[i..end], v));
                text_start = end;
                i = end;
            }
            _ => i += 1,
        }
    }
    if text_start < s.len() {
        out.push(Token::Text(&s[text_start..]));
    }
    out
}

/// The end of the number starting at `i`: sign, digits, fraction, exponent.
fn number_end(b: &[u8], mut i: usize) -> usize {
    if b[i] == b'-' || b[i] == b'+' {
        i += 1;
    }
    let digits = |b: &[u8], mut i: usize| {
        while i < b.len() && b[i].is_ascii_digit() {
            i += 1;
        }
        i
    };
    i = digits(b, i);
    if i < b.len() && b[i] == b'.' && b.get(i + 1).is_some_and(u8::is_ascii_digit) {
        i = digits(b, i + 1);
    }
    if i < b.len() && (b[i] == b'e' || b[i] == b'E') {
        let mut j = i + 1;
        if j < b.len() && (b[j] == b'-' || b[j] == b'+') {
            j += 1;
        }
        if j < b.len() && b[j].is_ascii_digit() {
            i = digits(b, j);
        }
    }
    i
}

/// Compares two texts, numbers within `tol`.
pub(crate) fn compare_text(old: &str, new: &str, tol: Tolerance) -> TextDiff {
    if old == new {
        return TextDiff::Same;
    }
    let (a, b) = (tokens(old), tokens(new));
    let same_shape = a.len() == b.len()
        && a.iter().zip(&b).all(|(x, y)| match (x, y) {
            (Token::Text(x), Token::Text(y)) => x == y,
            (Token::Number(..), Token::Number(..)) => true,
            _ => false,
        });
    if !same_shape {
        return first_line_diff(old, new);
    }
    let mut drifts = Vec::new();
    let mut before = "";
    for (x, y) in a.iter().zip(&b) {
        match (x, y) {
            (Token::Number(xs, xv), Token::Number(ys, yv)) if !tol.accepts(*xv, *yv) => {
                drifts.push(NumberDrift {
                    old: xs.to_string(),
                    new: ys.to_string(),
                    old_value: *xv,
                    new_value: *yv,
                    context: context_of(before),
                });
            }
            (Token::Text(t), _) => before = t,
            _ => {}
        }
    }
    if drifts.is_empty() {
        TextDiff::Same
    } else {
        TextDiff::Numbers(drifts)
    }
}

/// The last few words before a number, to say which number it is.
fn context_of(before: &str) -> String {
    let line = before.rsplit('\n').next().unwrap_or("");
    let chars: Vec<char> = line.chars().collect();
    let start = chars.len().saturating_sub(40);
    chars[start..].iter().collect::<String>().trim().to_string()
}

fn first_line_diff(old: &str, new: &str) -> TextDiff {
    let mut a = old.lines();
    let mut b = new.lines();
    loop {
        match (a.next(), b.next()) {
            (Some(x), Some(y)) if x == y => continue,
            (x, y) => {
                return TextDiff::Text {
                    old_line: x.unwrap_or("<end of text>").to_string(),
                    new_line: y.unwrap_or("<end of text>").to_string(),
                };
            }
        }
    }
}

/// The relative change `(new - old) / |old|`, or `None` when `old` is zero.
pub(crate) fn relative_change(old: f64, new: f64) -> Option<f64> {
    (old != 0.0).then(|| (new - old) / old.abs())
}

#[cfg(test)]
mod tests {
    use super::*;

    const TIGHT: Tolerance = Tolerance {
        rtol: 1e-6,
        atol: 0.0,
    };

    #[test]
    fn numbers_split_from_words_and_units() {
        let t = tokens("x2 = -1.5e-3 mV/V at cell[3]");
        assert_eq!(
            t,
            vec![
                Token::Text("x2 = "),
                Token::Number("-1.5e-3", -1.5e-3),
                Token::Text(" mV/V at cell["),
                Token::Number("3", 3.0),
                Token::Text("]"),
            ]
        );
    }

    #[test]
    fn within_tolerance_is_same_and_beyond_is_reported() {
        assert_eq!(
            compare_text("0.4995 mV/V", "0.49950001 mV/V", TIGHT),
            TextDiff::Same
        );
        match compare_text("rated 0.4995 mV/V", "rated 0.5100 mV/V", TIGHT) {
            TextDiff::Numbers(d) => {
                assert_eq!(d.len(), 1);
                assert_eq!((d[0].old.as_str(), d[0].new.as_str()), ("0.4995", "0.5100"));
                assert_eq!(d[0].context, "rated");
            }
            other => panic!("{other:?}"),
        }
    }

    #[test]
    fn a_changed_unit_is_a_text_change() {
        assert!(matches!(
            compare_text("2 kN\n", "2 N\n", TIGHT),
            TextDiff::Text { .. }
        ));
    }

    #[test]
    fn absolute_tolerance_covers_zero() {
        let t = Tolerance {
            rtol: 0.0,
            atol: 1e-9,
        };
        assert!(t.accepts(0.0, 5e-10));
        assert!(!t.accepts(0.0, 2e-9));
        assert_eq!(
            relative_change(2.0, 2.2).map(|r| (r * 1e6).round()),
            Some(100000.0)
        );
    }
}
