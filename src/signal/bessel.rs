//! The analog Bessel (maximally flat group delay) low-pass prototype, phase-normalised: the
//! phase response reaches half its final value at 1 rad/s, so the magnitude asymptotes match a
//! Butterworth of the same order and cutoff (scipy.signal.besselap's default `norm="phase"`).
//!
//! The poles are the roots of the reverse Bessel polynomial
//! θ_N(s) = Σ_k (2N−k)! / (2^(N−k) k! (N−k)!) s^k (W. E. Thomson, "Delay networks having maximally
//! flat frequency characteristics", *Proc. IEE* 96 (1949), from memory), scaled by
//! a_0^(−1/N) with a_0 = (2N)!/(2^N N!), exactly as scipy.signal.besselap 1.17.1 does. They are
//! found by the Aberth–Ehrlich simultaneous iteration from the Campos–Calderón (2011) starting
//! points that scipy also uses, then polished by Newton steps.

use super::complex::C;
use super::design::Zpk;
use crate::PhysicsError;

/// Poles of the order-`order` phase-normalised Bessel prototype (gain 1, no finite zeros).
pub(crate) fn prototype(order: usize) -> Result<Zpk, PhysicsError> {
    let n = order;
    // Coefficients a_k of θ_N, lowest power first, in f64 (exact up to N ≈ 12, then rounded to
    // f64's 16 digits, which the root finder does not need beyond).
    let a: Vec<f64> = (0..=n)
        .map(|k| {
            let mut v = 1.0;
            // (2N−k)!/(N−k)! = (N−k+1)(N−k+2)…(2N−k): the falling factorial scipy uses.
            for j in (n - k + 1)..=(2 * n - k) {
                v *= j as f64;
            }
            let mut den = 2f64.powi((n - k) as i32);
            for j in 1..=k {
                den *= j as f64;
            }
            v / den
        })
        .collect();
    // Scale s = g·w with g = a_0^(1/N) so the polynomial in w has d_0 = d_N = 1 and its roots
    // (the phase-normalised poles) lie near the unit circle, where the iteration is well conditioned.
    let g = a[0].powf(1.0 / n as f64);
    let d: Vec<f64> = (0..=n)
        .map(|k| a[k] * g.powi(k as i32 - n as i32))
        .collect();
    let start: Vec<C> = campos_zeros(n)
        .into_iter()
        .map(|x| (C::real(1.0) / x) / g)
        .collect();
    let fail = || PhysicsError::Numerical {
        what: format!("Bessel prototype of order {order}"),
        reason: "the pole iteration did not converge".to_string(),
    };
    let w = aberth(&d, start).ok_or_else(fail)?;
    // Polish each root by Newton steps on θ_N itself, whose integer coefficients are exact in f64
    // up to N ≈ 14, evaluated in double-double arithmetic (compensated Horner): f64 evaluation
    // of the scaled polynomial loses about half a digit per order to cancellation.
    let mut w: Vec<C> = w
        .into_iter()
        .map(|wk| polish(&a, wk * g).map(|s| s / g))
        .collect::<Option<Vec<C>>>()
        .ok_or_else(fail)?;
    // Make conjugate pairs exact (the starting points come in conjugate order k ↔ N+1−k), so the
    // middle pole of an odd order is exactly real, as in scipy's _bessel_zeros.
    let mirrored: Vec<C> = w.iter().rev().map(|x| x.conj()).collect();
    for (x, m) in w.iter_mut().zip(mirrored) {
        *x = (*x + m) * 0.5;
    }
    Ok(Zpk {
        zeros: Vec::new(),
        poles: w,
        gain: 1.0,
    })
}

/// Campos–Calderón polynomial-fit estimates of the zeros of the ordinary Bessel polynomial y_n
/// (R. G. Campos, L. A. Calderón, "Approximate closed-form formulas for the zeros of the Bessel
/// polynomials", arXiv:1105.0957, 2011; the same fit as scipy's `_campos_zeros`).
fn campos_zeros(n: usize) -> Vec<C> {
    if n == 1 {
        return vec![C::real(-1.0)];
    }
    let nf = n as f64;
    let pv = |c: &[f64], x: f64| c.iter().rev().fold(0.0, |acc, &ci| acc * x + ci);
    let s = pv(&[0.0, 0.0, 2.0, 0.0, -3.0, 1.0], nf);
    let b3 = pv(&[16.0, -8.0], nf) / s;
    let b2 = pv(&[-24.0, -12.0, 12.0], nf) / s;
    let b1 = pv(&[8.0, 24.0, -12.0, -2.0], nf) / s;
    let b0 = pv(&[0.0, -6.0, 0.0, 5.0, -1.0], nf) / s;
    let r = pv(&[0.0, 0.0, 2.0, 1.0], nf);
    let a1 = pv(&[-6.0, -6.0], nf) / r;
    let a2 = 6.0 / r;
    (1..=n)
        .map(|k| {
            let k = k as f64;
            C::new(pv(&[0.0, a1, a2], k), pv(&[b0, b1, b2, b3], k))
        })
        .collect()
}

/// Value and derivative of the real polynomial `c` (lowest power first) at `x` (Horner).
fn eval(c: &[f64], x: C) -> (C, C) {
    let mut p = C::real(0.0);
    let mut dp = C::real(0.0);
    for &ci in c.iter().rev() {
        dp = dp * x + p;
        p = p * x + C::real(ci);
    }
    (p, dp)
}

/// Newton steps on the polynomial `c` (lowest power first) from `s`, with the value computed
/// in double-double; None if the last step is not below 1e-13 relative.
fn polish(c: &[f64], mut s: C) -> Option<C> {
    let mut last = f64::INFINITY;
    for _ in 0..6 {
        let (p, dp) = eval_dd(c, s);
        if dp.abs() == 0.0 {
            break;
        }
        let step = p / dp;
        s = s - step;
        last = step.abs() / s.abs();
        if last < 1e-17 {
            break;
        }
    }
    (last < 1e-13 && s.is_finite()).then_some(s)
}

/// Error-free sum of two f64 (Knuth's TwoSum): a + b = s + e exactly.
fn two_sum(a: f64, b: f64) -> (f64, f64) {
    let s = a + b;
    let bb = s - a;
    (s, (a - (s - bb)) + (b - bb))
}

/// Error-free product (with a fused multiply–add): a·b = p + e exactly.
fn two_prod(a: f64, b: f64) -> (f64, f64) {
    let p = a * b;
    (p, a.mul_add(b, -p))
}

/// A double-double number hi + lo.
#[derive(Clone, Copy)]
struct Dd(f64, f64);

impl Dd {
    fn add(self, o: Dd) -> Dd {
        let (s, e) = two_sum(self.0, o.0);
        let (s, e2) = two_sum(s, e + self.1 + o.1);
        Dd(s, e2)
    }
    fn mul_f(self, b: f64) -> Dd {
        let (p, e) = two_prod(self.0, b);
        let (p, e2) = two_sum(p, e + self.1 * b);
        Dd(p, e2)
    }
    fn neg(self) -> Dd {
        Dd(-self.0, -self.1)
    }
}

/// Value (double-double, rounded to f64 at the end) and derivative (f64) of `c` at `x`.
fn eval_dd(c: &[f64], x: C) -> (C, C) {
    let (mut pr, mut pi) = (Dd(0.0, 0.0), Dd(0.0, 0.0));
    let mut dp = C::real(0.0);
    for &ci in c.iter().rev() {
        dp = dp * x + C::new(pr.0 + pr.1, pi.0 + pi.1);
        let nr = pr.mul_f(x.re).add(pi.mul_f(x.im).neg()).add(Dd(ci, 0.0));
        let ni = pr.mul_f(x.im).add(pi.mul_f(x.re));
        pr = nr;
        pi = ni;
    }
    (C::new(pr.0 + pr.1, pi.0 + pi.1), dp)
}

/// Aberth–Ehrlich iteration for all roots at once (f64 arithmetic).
fn aberth(c: &[f64], mut x: Vec<C>) -> Option<Vec<C>> {
    // Stop when no root moves by more than 1e-15 (scipy's `_aberth` tolerance, on roots of
    // modulus about 1) or after MAX_ITER sweeps, when f64 round-off in the scaled polynomial
    // leaves steps of up to ~1e-7 at order 20; a larger last step means no convergence. The
    // roots are then polished in double-double (`polish`), which decides their final accuracy.
    const TOL: f64 = 1e-15;
    const ACCEPT: f64 = 1e-6;
    const MAX_ITER: usize = 100;
    let n = x.len();
    let mut last_step = f64::INFINITY;
    for _ in 0..MAX_ITER {
        let mut max_step: f64 = 0.0;
        for k in 0..n {
            let (p, dp) = eval(c, x[k]);
            let alpha = -(p / dp);
            let mut beta = C::real(0.0);
            for j in 0..n {
                if j != k {
                    beta = beta + C::real(1.0) / (x[k] - x[j]);
                }
            }
            let step = alpha / (C::real(1.0) + alpha * beta);
            x[k] = x[k] + step;
            if !x[k].is_finite() {
                return None;
            }
            max_step = max_step.max(alpha.abs());
        }
        last_step = max_step;
        if max_step <= TOL {
            break;
        }
    }
    if last_step.is_nan() || last_step > ACCEPT {
        return None;
    }
    Some(x)
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn second_order_poles_match_the_closed_form() {
        // θ_2(s) = s² + 3s + 3 (Thomson 1949, from memory): roots (−3 ± i√3)/2, scaled by 3^(−1/2).
        let z = prototype(2).unwrap();
        let g = 3f64.sqrt();
        let mut p = z.poles.clone();
        p.sort_by(|a, b| a.im.total_cmp(&b.im));
        assert!((p[0].re - (-1.5 / g)).abs() < 1e-14);
        assert!((p[0].im - (-(3f64.sqrt()) / 2.0 / g)).abs() < 1e-14);
        assert_eq!(p[1], p[0].conj());
    }

    #[test]
    fn poles_satisfy_the_scaled_polynomial_up_to_order_20() {
        // The product of the poles' moduli equals d_0/d_N = 1 after phase scaling (Vieta).
        for order in 1..=20 {
            let z = prototype(order).unwrap();
            let prod: f64 = z.poles.iter().map(|p| p.abs()).product();
            assert!((prod - 1.0).abs() < 1e-11, "order {order}: {prod}");
            assert!(z.poles.iter().all(|p| p.re < 0.0));
        }
    }
}
