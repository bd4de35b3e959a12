//! Reading plain decimal numbers (`-0.052001`, `22.982`, `1500`) straight out of a CSV block,
//! eight digits at a time, with the same result as the standard library's parser.
//!
//! Reading the numbers was most of the time of importing a CSV log (polars' per-block reader
//! took about 2.6 s of a 10 M-row log against 0.3 s for the rest of the pipeline), and almost
//! every field of a test log is a short plain decimal. For those this reads the digits eight at a
//! time into an integer mantissa `m` with `k` digits after the point and returns `m / 10^k`.
//! When `m ≤ 2^53` and `k ≤ 22` both operands are exact doubles and IEEE division rounds
//! once, so the quotient is the correctly rounded value of the decimal: Clinger's fast path
//! (W. D. Clinger, "How to read floating point numbers accurately", PLDI 1990, from memory).
//! Everything else (exponents, more digits, `NaN`, `inf`, spaces, quotes) is left to the
//! caller's slow path, [`str::parse::<f64>`], which rounds correctly too, so either way a field
//! reads as the standard library reads it.

/// Exact powers of ten as doubles: 10^22 is the largest whose value is an integer below 2^53
/// times a power of two, i.e. exactly representable (IEEE 754 binary64, 53-bit significand).
const POW10_F64: [f64; 23] = [
    1e0, 1e1, 1e2, 1e3, 1e4, 1e5, 1e6, 1e7, 1e8, 1e9, 1e10, 1e11, 1e12, 1e13, 1e14, 1e15, 1e16,
    1e17, 1e18, 1e19, 1e20, 1e21, 1e22,
];

/// 10^0 … 10^8 as integers, to append up to eight digits to a mantissa.
const POW10_U64: [u64; 9] = [
    1,
    10,
    100,
    1_000,
    10_000,
    100_000,
    1_000_000,
    10_000_000,
    100_000_000,
];

/// The largest mantissa for which `m as f64` is exact (2^53, IEEE 754 binary64).
const EXACT_MANTISSA: u64 = 1 << 53;

/// The most digits a `u64` mantissa can take without overflow (10^19 − 1 < 2^64).
const MAX_DIGITS: usize = 19;

/// Eight bytes from `at` as a little-endian word, zero bytes past the end of `b` (a zero byte
/// is not a digit, so it ends a number like the end of the block does).
#[inline(always)]
fn word_at(b: &[u8], at: usize) -> u64 {
    match b.get(at..at + 8) {
        Some(w) => u64::from_le_bytes([w[0], w[1], w[2], w[3], w[4], w[5], w[6], w[7]]),
        None => {
            let mut t = [0u8; 8];
            let rest = b.get(at..).unwrap_or(&[]);
            t[..rest.len()].copy_from_slice(rest);
            u64::from_le_bytes(t)
        }
    }
}

/// How many of the word's bytes, from the lowest, are ASCII digits before the first other byte.
#[inline(always)]
fn leading_digits(w: u64) -> usize {
    // A byte is a digit when it is ≥ 0x30 (no borrow out of `b − 0x30`) and ≤ 0x39 (no carry
    // into the top bit of `b + 0x46`); the top bit of either marks a non-digit.
    let not_digit = (w.wrapping_add(0x4646_4646_4646_4646) | w.wrapping_sub(0x3030_3030_3030_3030))
        & 0x8080_8080_8080_8080;
    (not_digit.trailing_zeros() / 8) as usize
}

/// The value of the first `n` (1 to 8) bytes of the word, which are ASCII digits, most
/// significant first.
#[inline(always)]
fn digits_value(w: u64, n: usize) -> u64 {
    // Digits become 0…9, then move to the top bytes so the bytes below read as leading zeros;
    // then pairs, quads and the octet are combined with three multiplications (the SWAR
    // conversion used by simdjson and fast_float, from memory).
    let v = (w ^ 0x3030_3030_3030_3030) << (8 * (8 - n) as u32);
    let v = v.wrapping_mul(10).wrapping_add(v >> 8);
    let lo = (v & 0x0000_00FF_0000_00FF).wrapping_mul(100 + (1_000_000 << 32));
    let hi = ((v >> 16) & 0x0000_00FF_0000_00FF).wrapping_mul(1 + (10_000 << 32));
    lo.wrapping_add(hi) >> 32
}

/// Appends the run of digits at `at` to `m`; returns the new mantissa, the digits read and the
/// position after them, or `None` when the mantissa would pass 19 digits.
#[inline(always)]
fn digit_run(b: &[u8], mut at: usize, mut m: u64, mut count: usize) -> Option<(u64, usize, usize)> {
    let start = count;
    loop {
        let w = word_at(b, at);
        let n = leading_digits(w);
        if n > 0 {
            if count + n > MAX_DIGITS {
                return None;
            }
            m = m * POW10_U64[n] + digits_value(w, n);
            count += n;
            at += n;
        }
        if n < 8 {
            return Some((m, count - start, at));
        }
    }
}

/// Reads a plain decimal (`[+-]digits[.digits]`, at least one digit) starting at `at`.
///
/// Returns the value and the position of the first byte after it (which the caller checks is a
/// separator or a line end), or `None` when the text is not a plain decimal this path reads
/// exactly; the caller then parses the whole field with [`str::parse::<f64>`].
#[inline(always)]
pub(crate) fn plain_decimal(b: &[u8], at: usize) -> Option<(f64, usize)> {
    let (neg, mut p) = match b.get(at) {
        Some(b'-') => (true, at + 1),
        Some(b'+') => (false, at + 1),
        _ => (false, at),
    };
    let (mut m, int_digits, q) = digit_run(b, p, 0, 0)?;
    p = q;
    let mut frac_digits = 0;
    if b.get(p) == Some(&b'.') {
        let (m2, n, q) = digit_run(b, p + 1, m, int_digits)?;
        m = m2;
        frac_digits = n;
        p = q;
    }
    if int_digits + frac_digits == 0 || m > EXACT_MANTISSA || frac_digits >= POW10_F64.len() {
        return None;
    }
    let v = m as f64 / POW10_F64[frac_digits];
    Some((if neg { -v } else { v }, p))
}

#[cfg(test)]
mod tests {
    use super::plain_decimal;

    /// The reference is the standard library's correctly rounded parser.
    /// Below 16 digits every mantissa is under 2^53, so the fast path must take the text.
    fn same_as_std(text: &str) {
        let got = plain_decimal(text.as_bytes(), 0);
        let want: f64 = text.parse().unwrap();
        let digits = text.bytes().filter(u8::is_ascii_digit).count();
        match got {
            Some((v, end)) => {
                assert_eq!(end, text.len(), "{text}: stopped early");
                assert_eq!(v.to_bits(), want.to_bits(), "{text}: {v} against {want}");
            }
            None => assert!(digits >= 16, "{text}: not read on the fast path"),
        }
    }

    #[test]
    fn short_decimals_read_exactly_as_the_standard_parser_reads_them() {
        for t in [
            "0",
            "-0",
            "+7",
            "0.001",
            "-0.000000",
            "22.982",
            "-1.16",
            "0.052001",
            "1034.3268",
            "12345678",
            "123456789",
            "1234567890123456",
            "0.1",
            "0.2",
            "0.3",
            "9007199254740992",
            "4.35",
            "1.",
            ".5",
            "-.25",
        ] {
            same_as_std(t);
        }
    }

    #[test]
    fn random_decimals_agree_bit_for_bit() {
        // A fixed-seed linear congruential generator (Knuth's MMIX constants, from memory): the
        // test needs variety, not quality.
        let mut s: u64 = 0x2545_F491_4F6C_DD1D;
        let mut next = || {
            s = s
                .wrapping_mul(6_364_136_223_846_793_005)
                .wrapping_add(1_442_695_040_888_963_407);
            s >> 11
        };
        for _ in 0..200_000 {
            let int_digits = (next() % 9) as usize;
            let frac_digits = (next() % 10) as usize;
            let mut t = String::new();
            if next() % 2 == 0 {
                t.push('-');
            }
            for _ in 0..int_digits {
                t.push(char::from(b'0' + (next() % 10) as u8));
            }
            if frac_digits > 0 || int_digits == 0 {
                t.push('.');
                for _ in 0..frac_digits.max(1) {
                    t.push(char::from(b'0' + (next() % 10) as u8));
                }
            }
            same_as_std(&t);
        }
    }

    #[test]
    fn stops_at_the_first_byte_after_the_number() {
        assert_eq!(plain_decimal(b"1.5,2", 0), Some((1.5, 3)));
        assert_eq!(plain_decimal(b"x,-2.25\n", 2), Some((-2.25, 7)));
        assert_eq!(plain_decimal(b"7\r\n", 0), Some((7.0, 1)));
    }

    #[test]
    fn leaves_everything_else_to_the_slow_path() {
        for t in [
            "",
            "-",
            ".",
            "+.",
            "1e3",
            "NaN",
            "inf",
            " 1",
            "\"1\"",
            "n/a",
            // beyond 19 digits, or a mantissa above 2^53, or 23 digits after the point
            "12345678901234567890",
            "9007199254740993",
            "99999999.99999999",
            "0.00000000000000000000001",
        ] {
            match plain_decimal(t.as_bytes(), 0) {
                None => {}
                // A number followed by something else is read up to it; the caller sees the
                // byte after it is no separator.
                Some((_, end)) => assert!(end < t.len(), "{t}: read whole"),
            }
        }
    }
}
