//! The unit-expression parser: products, quotients, integer powers and parentheses of table
//! symbols, in Unicode or ASCII spelling.
//!
//! Grammar (left-associative, powers bind tightest):
//!
//! ```text
//! expr    := power (op power | power)*      op: * · ⋅ × /   (juxtaposition or `-` between
//!                                                             symbols multiplies: `N m`, `lbf-in`)
//! power   := factor (('^' | '**') int | superscript-int)?
//! factor  := symbol | '(' expr ')' | '1'
//! ```
//!
//! `a/b*c` is `(a/b)·c`, as in most calculators; write `W/(m·K)` for a compound denominator.
//!
//! Two quotients name a kind rather than a plain ratio, because that is what the trade means by
//! them: a voltage over a voltage (`mV/V`, `V/V`, `µV/V`) is a bridge output ratio, and a length
//! over a length (`m/m`, `µin/in`) is a strain. Arithmetic on quantities does not guess kinds
//! this way; only a unit written out does.
//!
//! A temperature scale with an offset (`°C`, `°F`) keeps its offset only when it is the whole
//! unit (`-40 degC`). Inside a compound (`ppm/°C`, `W/(m·°C)`) it means a temperature
//! difference, as it does in every data sheet (common practice).

use super::table::{self, Resolved};
use super::{Dimension, Kind, Unit, UnitError};

/// Voltage, m²·kg·s⁻³·A⁻¹ (SI Brochure 9th ed. Table 4 (from memory): V = W/A).
const VOLTAGE: Dimension = Dimension([2, 1, -3, -1, 0, 0, 0]);

/// Largest exponent accepted; engineering units never need more, and it keeps the i8
/// exponents of [`Dimension`] far from overflow.
const MAX_EXPONENT: i32 = 12;

#[derive(Clone, Debug, PartialEq)]
enum Tok {
    Sym(String),
    Num(String),
    Mul,
    Div,
    Pow,
    Minus,
    Plus,
    Super(i32),
    LParen,
    RParen,
}

/// Folds look-alike characters to the table's spelling, keeping each character's position in
/// the original text.
fn normalise(text: &str, start: usize) -> Vec<(char, usize)> {
    let mut out = Vec::new();
    for (i, c) in text.chars().enumerate() {
        let pos = start + i;
        match c {
            // GREEK SMALL LETTER MU → MICRO SIGN (the table's µ).
            'μ' => out.push(('µ', pos)),
            // OHM SIGN → GREEK CAPITAL LETTER OMEGA.
            'Ω' => out.push(('Ω', pos)),
            // DEGREE CELSIUS / FAHRENHEIT signs → degree sign + letter.
            '℃' => out.extend([('°', pos), ('C', pos)]),
            '℉' => out.extend([('°', pos), ('F', pos)]),
            // MASCULINE ORDINAL and RING ABOVE are often typed for the degree sign.
            'º' | '˚' => out.push(('°', pos)),
            // MINUS SIGN and the dashes → ASCII hyphen-minus.
            '−' | '–' => out.push(('-', pos)),
            // GREEK SMALL LETTER LUNATE EPSILON → GREEK SMALL LETTER EPSILON.
            'ϵ' => out.push(('ε', pos)),
            _ => out.push((c, pos)),
        }
    }
    out
}

fn superscript_digit(c: char) -> Option<i32> {
    "⁰¹²³⁴⁵⁶⁷⁸⁹".chars().position(|d| d == c).map(|p| p as i32)
}

fn is_symbol_char(c: char) -> bool {
    !(c.is_whitespace()
        || matches!(
            c,
            '*' | '·' | '⋅' | '×' | '/' | '^' | '(' | ')' | '-' | '+' | '⁻' | '⁺'
        )
        || superscript_digit(c).is_some())
}

struct Lexer<'a> {
    text: &'a str,
    chars: Vec<(char, usize)>,
}

impl Lexer<'_> {
    fn tokens(&self) -> Result<Vec<(Tok, usize)>, UnitError> {
        let cs = &self.chars;
        let mut out = Vec::new();
        let mut i = 0;
        while i < cs.len() {
            let (c, pos) = cs[i];
            if c.is_whitespace() {
                i += 1;
                continue;
            }
            let tok = match c {
                '*' if cs.get(i + 1).map(|x| x.0) == Some('*') => {
                    i += 1;
                    Tok::Pow
                }
                '*' | '·' | '⋅' | '×' => Tok::Mul,
                '/' => Tok::Div,
                '^' => Tok::Pow,
                '(' => Tok::LParen,
                ')' => Tok::RParen,
                '-' => Tok::Minus,
                '+' => Tok::Plus,
                '⁻' | '⁺' => {
                    let neg = c == '⁻';
                    let mut j = i + 1;
                    let mut n: i32 = 0;
                    while let Some(d) = cs.get(j).and_then(|x| superscript_digit(x.0)) {
                        n = n.saturating_mul(10).saturating_add(d);
                        j += 1;
                    }
                    if j == i + 1 {
                        return Err(self.malformed(pos, "a superscript sign needs digits after it"));
                    }
                    i = j;
                    out.push((Tok::Super(if neg { -n } else { n }), pos));
                    continue;
                }
                c if superscript_digit(c).is_some() => {
                    let mut j = i;
                    let mut n: i32 = 0;
                    while let Some(d) = cs.get(j).and_then(|x| superscript_digit(x.0)) {
                        n = n.saturating_mul(10).saturating_add(d);
                        j += 1;
                    }
                    i = j;
                    out.push((Tok::Super(n), pos));
                    continue;
                }
                c if c.is_ascii_digit() || c == '.' => {
                    let mut j = i;
                    let mut s = String::new();
                    while let Some(&(d, _)) = cs.get(j) {
                        if d.is_ascii_digit() || d == '.' {
                            s.push(d);
                            j += 1;
                        } else {
                            break;
                        }
                    }
                    i = j;
                    out.push((Tok::Num(s), pos));
                    continue;
                }
                _ => {
                    let mut j = i;
                    let mut s = String::new();
                    while let Some(&(d, _)) = cs.get(j) {
                        if is_symbol_char(d) {
                            s.push(d);
                            j += 1;
                        } else {
                            break;
                        }
                    }
                    i = j;
                    out.push((Tok::Sym(s), pos));
                    continue;
                }
            };
            out.push((tok, pos));
            i += 1;
        }
        Ok(out)
    }

    fn malformed(&self, position: usize, reason: &str) -> UnitError {
        UnitError::Malformed {
            text: self.text.to_string(),
            position,
            reason: reason.to_string(),
        }
    }
}

/// A partly parsed expression.
#[derive(Clone, Debug)]
struct Term {
    factor: f64,
    offset: f64,
    dim: Dimension,
    kind: Kind,
    symbol: String,
    /// 0: a symbol, a power or a parenthesised group; 1: a product; 2: a quotient.
    prec: u8,
}

impl Term {
    fn one() -> Term {
        Term {
            factor: 1.0,
            offset: 0.0,
            dim: Dimension::NONE,
            kind: Kind::Plain,
            symbol: "1".into(),
            prec: 0,
        }
    }

    fn from_resolved(r: Resolved) -> Term {
        Term {
            factor: r.factor,
            offset: r.offset,
            dim: r.dim,
            kind: r.kind,
            symbol: r.display,
            prec: 0,
        }
    }

    /// Inside a compound, a temperature scale means a difference on that scale.
    fn into_factor(mut self) -> Term {
        if self.kind == Kind::AbsoluteTemperature {
            self.kind = Kind::TemperatureInterval;
            self.offset = 0.0;
        }
        self
    }

    fn mul(self, rhs: Term) -> Term {
        let (a, b) = (self.into_factor(), rhs.into_factor());
        let dim = a.dim * b.dim;
        let rs = if b.prec >= 2 {
            format!("({})", b.symbol)
        } else {
            b.symbol
        };
        Term {
            factor: a.factor * b.factor,
            offset: 0.0,
            dim,
            kind: a.kind.combine_multiplicative(b.kind).fit(dim),
            symbol: format!("{}·{}", a.symbol, rs),
            prec: 1,
        }
    }

    fn div(self, rhs: Term) -> Term {
        let (a, b) = (self.into_factor(), rhs.into_factor());
        let dim = a.dim / b.dim;
        let named = if a.kind == Kind::Plain && b.kind == Kind::Plain && a.dim == b.dim {
            match a.dim {
                VOLTAGE => Some(Kind::OutputRatio),
                Dimension::LENGTH => Some(Kind::Strain),
                _ => None,
            }
        } else {
            None
        };
        let kind = named.unwrap_or_else(|| a.kind.combine_quotient(b.kind).fit(dim));
        let rs = if b.prec >= 1 {
            format!("({})", b.symbol)
        } else {
            b.symbol
        };
        Term {
            factor: a.factor / b.factor,
            offset: 0.0,
            dim,
            kind,
            symbol: format!("{}/{}", a.symbol, rs),
            prec: 2,
        }
    }

    fn powi(self, n: i32) -> Term {
        if n == 1 {
            return self;
        }
        let a = self.into_factor();
        let dim = a.dim.powi(n);
        let kind = match a.kind {
            Kind::TemperatureInterval => Kind::TemperatureInterval,
            _ => Kind::Plain,
        }
        .fit(dim);
        let base = if a.prec >= 1 {
            format!("({})", a.symbol)
        } else {
            a.symbol
        };
        Term {
            factor: a.factor.powi(n),
            offset: 0.0,
            dim,
            kind,
            symbol: format!("{base}{}", superscript(n)),
            prec: 0,
        }
    }
}

/// `n` in superscript digits (`⁻¹`, `²`).
pub(crate) fn superscript(n: i32) -> String {
    const DIGITS: [char; 10] = ['⁰', '¹', '²', '³', '⁴', '⁵', '⁶', '⁷', '⁸', '⁹'];
    let mut s = String::new();
    if n < 0 {
        s.push('⁻');
    }
    for c in n.unsigned_abs().to_string().chars() {
        // `c` is an ASCII digit from `to_string`, so the index is in 0..10.
        s.push(DIGITS[(c as u8 - b'0') as usize]);
    }
    s
}

struct Parser<'a> {
    lex: &'a Lexer<'a>,
    toks: Vec<(Tok, usize)>,
    i: usize,
}

impl Parser<'_> {
    fn peek(&self) -> Option<&Tok> {
        self.toks.get(self.i).map(|t| &t.0)
    }

    fn pos(&self) -> usize {
        self.toks
            .get(self.i)
            .map(|t| t.1)
            .unwrap_or_else(|| self.lex.chars.last().map(|c| c.1 + 1).unwrap_or(0))
    }

    fn expr(&mut self) -> Result<Term, UnitError> {
        let mut acc = self.power()?;
        loop {
            match self.peek() {
                Some(Tok::Mul) => {
                    self.i += 1;
                    acc = acc.mul(self.power()?);
                }
                Some(Tok::Div) => {
                    self.i += 1;
                    acc = acc.div(self.power()?);
                }
                // `lbf-in`: a hyphen between two symbols multiplies.
                Some(Tok::Minus) if matches!(self.toks.get(self.i + 1), Some((Tok::Sym(_), _))) => {
                    self.i += 1;
                    acc = acc.mul(self.power()?);
                }
                Some(Tok::Minus) if matches!(self.toks.get(self.i + 1), Some((Tok::Num(_), _))) => {
                    return Err(self
                        .lex
                        .malformed(self.pos(), "write a negative power as `^-2` or `⁻²`"));
                }
                Some(Tok::Sym(_)) | Some(Tok::LParen) => acc = acc.mul(self.power()?),
                _ => return Ok(acc),
            }
        }
    }

    fn power(&mut self) -> Result<Term, UnitError> {
        let base = self.factor()?;
        let at = self.pos();
        let n = match self.peek() {
            Some(Tok::Super(n)) => {
                let n = *n;
                self.i += 1;
                n
            }
            Some(Tok::Pow) => {
                self.i += 1;
                self.exponent()?
            }
            _ => return Ok(base),
        };
        if n == 0 || n.abs() > MAX_EXPONENT {
            return Err(self
                .lex
                .malformed(at, &format!("exponent {n} is outside ±1..±{MAX_EXPONENT}")));
        }
        Ok(base.powi(n))
    }

    fn exponent(&mut self) -> Result<i32, UnitError> {
        let paren = self.peek() == Some(&Tok::LParen);
        if paren {
            self.i += 1;
        }
        let neg = match self.peek() {
            Some(Tok::Minus) => {
                self.i += 1;
                true
            }
            Some(Tok::Plus) => {
                self.i += 1;
                false
            }
            _ => false,
        };
        let at = self.pos();
        let n: i32 = match self.peek() {
            Some(Tok::Num(s)) => s.parse().map_err(|_| {
                self.lex
                    .malformed(at, &format!("`{s}` is not an integer exponent"))
            })?,
            _ => return Err(self.lex.malformed(at, "expected an integer exponent")),
        };
        self.i += 1;
        if paren {
            if self.peek() != Some(&Tok::RParen) {
                return Err(self
                    .lex
                    .malformed(self.pos(), "expected `)` after the exponent"));
            }
            self.i += 1;
        }
        Ok(if neg { -n } else { n })
    }

    fn factor(&mut self) -> Result<Term, UnitError> {
        let at = self.pos();
        match self.peek().cloned() {
            Some(Tok::Sym(s)) => {
                self.i += 1;
                match table::resolve(&s) {
                    Some(r) => Ok(Term::from_resolved(r)),
                    // `m2`, `mm3`: a known symbol with digits glued on is a power written
                    // without `^`; say so rather than "unknown unit".
                    None if power_without_caret(&s) => Err(self.lex.malformed(
                        at,
                        &format!(
                            "write a power with `^` or superscripts (`{}`), not `{s}`",
                            {
                                let stem = s.trim_end_matches(|c: char| c.is_ascii_digit());
                                format!("{stem}^{}", &s[stem.len()..])
                            }
                        ),
                    )),
                    None => Err(UnitError::UnknownUnit {
                        text: self.lex.text.to_string(),
                        symbol: s,
                        position: at,
                    }),
                }
            }
            Some(Tok::Num(s)) if s == "1" => {
                self.i += 1;
                Ok(Term::one())
            }
            Some(Tok::Num(s)) => Err(self.lex.malformed(
                at,
                &format!("a number (`{s}`) inside a unit; only `1` is allowed, as in `1/K`"),
            )),
            Some(Tok::LParen) => {
                self.i += 1;
                let inner = self.expr()?;
                if self.peek() != Some(&Tok::RParen) {
                    return Err(self.lex.malformed(self.pos(), "expected `)`"));
                }
                self.i += 1;
                Ok(inner)
            }
            Some(t) => Err(self
                .lex
                .malformed(at, &format!("unexpected {}", describe(&t)))),
            None => Err(self.lex.malformed(at, "the unit ends early")),
        }
    }
}

/// True for a known symbol followed by digits (`m2`, `mm3`), but not for a table symbol that
/// contains digits itself (`g0`).
fn power_without_caret(s: &str) -> bool {
    let stem = s.trim_end_matches(|c: char| c.is_ascii_digit());
    stem.len() < s.len() && !stem.is_empty() && table::resolve(stem).is_some()
}

fn describe(t: &Tok) -> String {
    match t {
        Tok::Sym(s) => format!("`{s}`"),
        Tok::Num(s) => format!("`{s}`"),
        Tok::Mul => "`*`".into(),
        Tok::Div => "`/`".into(),
        Tok::Pow => "`^`".into(),
        Tok::Minus => "`-`".into(),
        Tok::Plus => "`+`".into(),
        Tok::Super(n) => format!("exponent {}", superscript(*n)),
        Tok::LParen => "`(`".into(),
        Tok::RParen => "`)`".into(),
    }
}

/// Parses the unit part of `text`, which starts at character `start` of `text`; error
/// positions are character offsets in `text`.
pub(crate) fn parse_unit_in(text: &str, start: usize) -> Result<Unit, UnitError> {
    let unit_part: String = text.chars().skip(start).collect();
    let lex = Lexer {
        text,
        chars: normalise(&unit_part, start),
    };
    if lex.chars.iter().all(|c| c.0.is_whitespace()) {
        return Ok(Unit::from_parts("", 1.0, 0.0, Dimension::NONE, Kind::Plain));
    }
    let toks = lex.tokens()?;
    let mut p = Parser {
        lex: &lex,
        toks,
        i: 0,
    };
    let t = p.expr()?;
    if p.i < p.toks.len() {
        let at = p.pos();
        let what = describe(&p.toks[p.i].0);
        return Err(lex.malformed(at, &format!("unexpected {what}")));
    }
    let symbol = if t.symbol == "1" {
        String::new()
    } else {
        t.symbol
    };
    Ok(Unit::from_parts(symbol, t.factor, t.offset, t.dim, t.kind))
}

#[cfg(test)]
mod tests {
    use super::*;

    fn unit(s: &str) -> Unit {
        parse_unit_in(s, 0).unwrap_or_else(|e| panic!("{s}: {e}"))
    }

    #[test]
    fn canonical_symbols() {
        assert_eq!(unit("N*m").symbol(), "N·m");
        assert_eq!(unit("kg/m^3").symbol(), "kg/m³");
        assert_eq!(unit("W/mm**2").symbol(), "W/mm²");
        assert_eq!(unit("ohm").symbol(), "Ω");
        assert_eq!(unit("kohm").symbol(), "kΩ");
        assert_eq!(unit("ue").symbol(), "µε");
        assert_eq!(unit("uε").symbol(), "µε");
        assert_eq!(unit("με").symbol(), "µε");
        assert_eq!(unit("W/(m*K)").symbol(), "W/(m·K)");
        assert_eq!(unit("m^-1").symbol(), "m⁻¹");
        assert_eq!(unit("(mV/V)/K").symbol(), "mV/V/K");
        assert_eq!(unit("lbf-in").symbol(), "lbf·in");
        assert_eq!(unit("N m").symbol(), "N·m");
        assert_eq!(unit("1/K").symbol(), "1/K");
    }

    #[test]
    fn kinds_named_by_quotients() {
        assert_eq!(unit("mV/V").kind(), Kind::OutputRatio);
        assert_eq!(unit("V/V").kind(), Kind::OutputRatio);
        assert_eq!(unit("µin/in").kind(), Kind::Strain);
        assert_eq!(unit("mV/V/K").kind(), Kind::OutputRatio);
        assert_eq!(unit("ue/K").kind(), Kind::Strain);
        assert_eq!(unit("ppm/K").kind(), Kind::Plain);
        assert_eq!(unit("N·mV/V").kind(), Kind::Plain);
    }

    #[test]
    fn offsets_only_for_a_bare_scale() {
        let c = unit("degC");
        assert_eq!((c.offset(), c.kind()), (273.15, Kind::AbsoluteTemperature));
        let per = unit("ppm/°C");
        assert_eq!((per.offset(), per.factor()), (0.0, 1e-6));
        assert_eq!(unit("(°C)").offset(), 273.15);
        assert_eq!(unit("°C^2").offset(), 0.0);
    }

    #[test]
    fn errors_carry_positions() {
        match parse_unit_in("kg/furlong", 0) {
            Err(UnitError::UnknownUnit {
                symbol, position, ..
            }) => {
                assert_eq!((symbol.as_str(), position), ("furlong", 3));
            }
            other => panic!("{other:?}"),
        }
        match parse_unit_in("N·m^", 0) {
            Err(UnitError::Malformed { position, .. }) => assert_eq!(position, 4),
            other => panic!("{other:?}"),
        }
        assert!(matches!(
            parse_unit_in("(N", 0),
            Err(UnitError::Malformed { position: 2, .. })
        ));
        assert!(matches!(
            parse_unit_in("m^99", 0),
            Err(UnitError::Malformed { .. })
        ));
        assert!(matches!(
            parse_unit_in("2 m", 0),
            Err(UnitError::Malformed { position: 0, .. })
        ));
    }
}
