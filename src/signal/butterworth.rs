//! The analog Butterworth low-pass prototype (cutoff 1 rad/s): poles evenly spaced on the left
//! half of the unit circle, no finite zeros, unit gain.
//!
//! Source: S. Butterworth, "On the theory of filter amplifiers", *Wireless Engineer* 7 (1930)
//! (from memory); the pole formula p_m = −exp(iπm/(2N)), m = −N+1, −N+3, …, N−1, is the one
//! scipy.signal.buttap 1.17.1 uses, so designs can be compared against scipy.

use super::complex::C;
use super::design::Zpk;

/// Poles of the order-`order` Butterworth prototype.
pub(crate) fn prototype(order: usize) -> Zpk {
    let n = order as f64;
    let poles = (0..order)
        .map(|i| {
            let m = -(n - 1.0) + 2.0 * i as f64;
            if m == 0.0 {
                // The middle pole of an odd order is exactly −1 (scipy forces it real too).
                C::real(-1.0)
            } else {
                -C::cis(std::f64::consts::PI * m / (2.0 * n))
            }
        })
        .collect();
    Zpk {
        zeros: Vec::new(),
        poles,
        gain: 1.0,
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn poles_lie_on_the_unit_circle_in_the_left_half_plane() {
        // Closed form: |p| = 1 and Re p < 0 for every Butterworth prototype pole.
        for order in 1..=12 {
            let z = prototype(order);
            assert_eq!(z.poles.len(), order);
            for p in &z.poles {
                assert!((p.abs() - 1.0).abs() < 1e-15);
                assert!(p.re < 0.0);
            }
        }
    }
}
