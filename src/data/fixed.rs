//! Fixed-decimal text of a number, as C's `printf("%.*f")` writes it, without its cost.
//!
//! The exact decimal rounding of a double (round half to even on exact ties, as glibc does) is
//! what `format!("{:.4}")` computes; that is slow for tens of millions of values. Scaling by
//! 10^d in floating point and rounding gives the same digits except when the scaled value lies
//! within a few units in the last place of a half: those rare cases take the exact path.

use std::io::Write;

/// Powers of ten exactly representable in f64 (10^22 < 2^53 · 2^22; IEEE 754 binary64).
const POW10: [f64; 16] = [
    1e0, 1e1, 1e2, 1e3, 1e4, 1e5, 1e6, 1e7, 1e8, 1e9, 1e10, 1e11, 1e12, 1e13, 1e14, 1e15,
];

/// Appends `x` with `decimals` digits after the point, exactly as `format!("{x:.decimals$}")`.
pub(crate) fn push_fixed(buf: &mut Vec<u8>, x: f64, decimals: usize) {
    if !x.is_finite() {
        let text = if x.is_nan() {
            "NaN"
        } else if x > 0.0 {
            "inf"
        } else {
            "-inf"
        };
        buf.extend_from_slice(text.as_bytes());
        return;
    }
    if decimals < POW10.len() {
        let v = x.abs() * POW10[decimals];
        // Below 2^52 every double has a fractional ulp, so `v` is within half an ulp of the exact
        // product and its rounding is the exact one unless a half lies within that distance.
        if v < 4.0e15 {
            let r = v.round();
            let frac = v - v.trunc();
            let ulp = f64::EPSILON * v.max(1.0);
            if (frac - 0.5).abs() > 4.0 * ulp {
                let mut n = r as u64;
                if x.is_sign_negative() {
                    buf.push(b'-');
                }
                let scale = 10u64.pow(decimals as u32);
                let int = n / scale;
                n %= scale;
                let mut digits = itoa_u64(int);
                buf.append(&mut digits);
                if decimals > 0 {
                    buf.push(b'.');
                    let start = buf.len();
                    buf.resize(start + decimals, b'0');
                    for k in (0..decimals).rev() {
                        buf[start + k] = b'0' + (n % 10) as u8;
                        n /= 10;
                    }
                }
                return;
            }
        }
    }
    let _ = write!(buf, "{x:.decimals$}");
}

fn itoa_u64(mut n: u64) -> Vec<u8> {
    let mut tmp = [0u8; 20];
    let mut i = tmp.len();
    loop {
        i -= 1;
        tmp[i] = b'0' + (n % 10) as u8;
        n /= 10;
        if n == 0 {
            break;
        }
    }
    tmp[i..].to_vec()
}

#[cfg(test)]
mod tests {
    use super::*;

    fn fixed(x: f64, d: usize) -> String {
        let mut b = Vec::new();
        push_fixed(&mut b, x, d);
        String::from_utf8(b).unwrap()
    }

    #[test]
    fn agrees_with_exact_formatting_on_random_values() {
        // Rust's `{:.d}` is the exact decimal rounding; the fast path must never differ.
        let mut s: u64 = 0x9E37_79B9_7F4A_7C15;
        for i in 0..200_000 {
            s ^= s << 13;
            s ^= s >> 7;
            s ^= s << 17;
            let mag = 10f64.powi((i % 12) as i32 - 4);
            let x = ((s >> 11) as f64 / (1u64 << 53) as f64 - 0.5) * mag;
            for d in [0, 2, 4, 6] {
                assert_eq!(fixed(x, d), format!("{x:.d$}"), "x = {x:e}, d = {d}");
            }
        }
    }

    #[test]
    fn ties_and_signs_like_c_printf() {
        // glibc printf("%.4f"): 0.03125 (exactly representable) -> "0.0312" (half to even);
        // -0.00004 -> "-0.0000"; 1e-5 -> "0.0000" (C99 7.19.6.1, from memory; glibc behaviour).
        assert_eq!(fixed(0.03125, 4), "0.0312");
        assert_eq!(fixed(0.09375, 4), "0.0938");
        assert_eq!(fixed(-0.00004, 4), "-0.0000");
        assert_eq!(fixed(1e-5, 4), "0.0000");
        assert_eq!(fixed(2.5, 0), "2");
        assert_eq!(fixed(123456.78915, 4), format!("{:.4}", 123456.78915));
        assert_eq!(fixed(f64::NAN, 4), "NaN");
    }
}
