//! From an analog low-pass prototype to digital second-order sections: frequency scaling or the
//! low-to-high-pass substitution s → ω₀/s, the bilinear transform with prewarping, and the
//! pairing of poles and zeros into sections.
//!
//! Each step follows scipy.signal 1.17.1 (`iirfilter`, `lp2lp_zpk`, `lp2hp_zpk`, `bilinear_zpk`,
//! `zpk2sos` with its default `pairing="nearest"`) so the sections agree with
//! `scipy.signal.butter(..., output="sos", fs=...)` term by term, not only in response. The
//! bilinear transform s = 2f_s (z−1)/(z+1) and the prewarp ω_a = 2f_s tan(ω_d/(2f_s)) are
//! textbook (Oppenheim & Schafer, *Discrete-Time Signal Processing*, 3rd ed., §7.1.2, from memory).

use super::complex::C;

/// Zeros, poles and gain of a transfer function.
#[derive(Clone, Debug)]
pub(crate) struct Zpk {
    pub zeros: Vec<C>,
    pub poles: Vec<C>,
    pub gain: f64,
}

/// Which side of the cutoff passes.
///
/// ```
/// use gaugebook::{FilterBand, SosFilter};
/// use gaugebook::units::Frequency;
/// use uom::si::frequency::hertz;
/// let hz = Frequency::new::<hertz>;
/// let hp = SosFilter::butterworth(2, FilterBand::HighPass, hz(10.0), hz(1000.0))?;
/// assert!(hp.response(hz(0.0), hz(1000.0))?.magnitude < 1e-12); // blocks DC
/// # Ok::<(), gaugebook::PhysicsError>(())
/// ```
#[derive(Clone, Copy, Debug, PartialEq, Eq, Hash)]
pub enum FilterBand {
    /// Passes below the cutoff.
    LowPass,
    /// Passes above the cutoff.
    HighPass,
}

/// Digital sections for a prototype, cutoff given as a fraction of Nyquist in (0, 1).
pub(crate) fn digital_sections(proto: Zpk, band: FilterBand, wn: f64) -> Vec<[f64; 6]> {
    // scipy designs at a normalised sample rate of 2 (Nyquist 1), so warped = 4 tan(π Wn / 2).
    let fs = 2.0;
    let warped = 2.0 * fs * (std::f64::consts::PI * wn / fs).tan();
    let analog = match band {
        FilterBand::LowPass => lowpass(proto, warped),
        FilterBand::HighPass => highpass(proto, warped),
    };
    to_sections(bilinear(analog, fs))
}

fn lowpass(z: Zpk, wo: f64) -> Zpk {
    let degree = z.poles.len() as i32 - z.zeros.len() as i32;
    Zpk {
        zeros: z.zeros.iter().map(|&x| x * wo).collect(),
        poles: z.poles.iter().map(|&x| x * wo).collect(),
        gain: z.gain * wo.powi(degree),
    }
}

fn highpass(z: Zpk, wo: f64) -> Zpk {
    let degree = z.poles.len() - z.zeros.len();
    let w = C::real(wo);
    let mut zeros: Vec<C> = z.zeros.iter().map(|&x| w / x).collect();
    // Zeros at infinity of the low-pass move to the origin.
    zeros.extend(std::iter::repeat_n(C::real(0.0), degree));
    let num = z.zeros.iter().fold(C::real(1.0), |acc, &x| acc * -x);
    let den = z.poles.iter().fold(C::real(1.0), |acc, &x| acc * -x);
    Zpk {
        zeros,
        poles: z.poles.iter().map(|&x| w / x).collect(),
        gain: z.gain * (num / den).re,
    }
}

fn bilinear(z: Zpk, fs: f64) -> Zpk {
    let degree = z.poles.len() - z.zeros.len();
    let fs2 = C::real(2.0 * fs);
    let mut zeros: Vec<C> = z.zeros.iter().map(|&x| (fs2 + x) / (fs2 - x)).collect();
    // Zeros at infinity map to Nyquist, z = −1.
    zeros.extend(std::iter::repeat_n(C::real(-1.0), degree));
    let num = z.zeros.iter().fold(C::real(1.0), |acc, &x| acc * (fs2 - x));
    let den = z.poles.iter().fold(C::real(1.0), |acc, &x| acc * (fs2 - x));
    Zpk {
        zeros,
        poles: z.poles.iter().map(|&x| (fs2 + x) / (fs2 - x)).collect(),
        gain: z.gain * (num / den).re,
    }
}

/// scipy's `_cplxreal`: one representative (positive imaginary part) per conjugate pair, sorted
/// by real part then |imag|, followed by the real values sorted. Returns them concatenated.
fn cplxreal(mut z: Vec<C>) -> Vec<C> {
    // 100 machine epsilons: scipy's default tolerance for realness and conjugate matching.
    let tol = 100.0 * f64::EPSILON;
    z.sort_by(|a, b| {
        a.re.total_cmp(&b.re)
            .then(a.im.abs().total_cmp(&b.im.abs()))
    });
    let (real, cplx): (Vec<C>, Vec<C>) = z.into_iter().partition(|x| x.im.abs() <= tol * x.abs());
    let mut zp: Vec<C> = cplx.iter().copied().filter(|x| x.im > 0.0).collect();
    let mut zn: Vec<C> = cplx.iter().copied().filter(|x| x.im < 0.0).collect();
    // Within runs of (nearly) equal real part, order by |imag| so conjugates line up.
    let mut start = 0;
    while start < zp.len() {
        let mut stop = start + 1;
        while stop < zp.len() && zp[stop].re - zp[stop - 1].re <= tol * zp[stop - 1].abs() {
            stop += 1;
        }
        zp[start..stop].sort_by(|a, b| a.im.abs().total_cmp(&b.im.abs()));
        let end = stop.min(zn.len());
        if start < end {
            zn[start..end].sort_by(|a, b| a.im.abs().total_cmp(&b.im.abs()));
        }
        start = stop;
    }
    // Designed filters always come in exact conjugate pairs; average to cancel round-off.
    let mut out: Vec<C> = zp
        .iter()
        .zip(&zn)
        .map(|(&p, &n)| (p + n.conj()) * 0.5)
        .collect();
    out.extend(real.into_iter().map(|x| C::real(x.re)));
    out
}

/// Index of the entry of `from` nearest to `to` among those of the wanted kind (scipy's
/// `_nearest_real_complex_idx`; a stable sort, as numpy's argsort is for such short arrays).
fn nearest(from: &[C], to: C, want: Want) -> Option<usize> {
    let mut order: Vec<usize> = (0..from.len()).collect();
    order.sort_by(|&i, &j| (from[i] - to).abs().total_cmp(&(from[j] - to).abs()));
    order.into_iter().find(|&i| match want {
        Want::Any => true,
        Want::Real => from[i].is_real(),
        Want::Complex => !from[i].is_real(),
    })
}

#[derive(Clone, Copy)]
enum Want {
    Any,
    Real,
    Complex,
}

/// Index of the pole closest to the unit circle (first on ties, like numpy's argmin).
fn worst(p: &[C]) -> usize {
    let mut best = 0;
    for (i, x) in p.iter().enumerate() {
        if (1.0 - x.abs()).abs() < (1.0 - p[best].abs()).abs() {
            best = i;
        }
    }
    best
}

/// Coefficients [b0 b1 b2 1 a1 a2] of one section from up to two zeros and poles, gain 1,
/// right-aligned as scipy's `_single_zpksos` does.
fn section(z: &[C], p: &[C]) -> [f64; 6] {
    let mut s = [0.0; 6];
    let b = poly(z);
    let a = poly(p);
    s[3 - b.len()..3].copy_from_slice(&b);
    s[6 - a.len()..6].copy_from_slice(&a);
    s
}

/// Real coefficients (highest power first) of ∏(x − r) for one real root or a conjugate pair.
fn poly(roots: &[C]) -> Vec<f64> {
    let mut c = vec![C::real(1.0)];
    for &r in roots {
        let mut next = vec![C::real(0.0); c.len() + 1];
        for (i, &ci) in c.iter().enumerate() {
            next[i] = next[i] + ci;
            next[i + 1] = next[i + 1] - ci * r;
        }
        c = next;
    }
    c.into_iter().map(|x| x.re).collect()
}

/// scipy's `zpk2sos(z, p, k, pairing="nearest")` for a digital system.
fn to_sections(zpk: Zpk) -> Vec<[f64; 6]> {
    let Zpk {
        mut zeros,
        mut poles,
        gain,
    } = zpk;
    if zeros.is_empty() && poles.is_empty() {
        return vec![[gain, 0.0, 0.0, 1.0, 0.0, 0.0]];
    }
    while poles.len() < zeros.len() {
        poles.push(C::real(0.0));
    }
    while zeros.len() < poles.len() {
        zeros.push(C::real(0.0));
    }
    let n_sections = poles.len().div_ceil(2);
    if poles.len() % 2 == 1 {
        poles.push(C::real(0.0));
        zeros.push(C::real(0.0));
    }
    let mut z = cplxreal(zeros);
    let mut p = cplxreal(poles);
    let mut sos = vec![[0.0; 6]; n_sections];
    // Built from the last section back, so the poles nearest the unit circle come last.
    for si in (0..n_sections).rev() {
        let p1 = p.remove(worst(&p));
        let reals_left = p.iter().filter(|x| x.is_real()).count();
        if p1.is_real() && reals_left == 0 {
            // The last real pole: a first-order section (padded with a pole and zero at 0).
            // `nearest` finds a real zero: zeros and poles were padded to equal real counts.
            let zi = nearest(&z, p1, Want::Real).unwrap_or(0);
            let z1 = z.remove(zi);
            sos[si] = section(&[z1, C::real(0.0)], &[p1, C::real(0.0)]);
        } else if p.len() + 1 == z.len()
            && !p1.is_real()
            && reals_left == 1
            && z.iter().filter(|x| x.is_real()).count() == 1
        {
            // One real pole and one real zero remain: this complex pole must take a complex zero.
            let zi = nearest(&z, p1, Want::Complex).unwrap_or(0);
            let z1 = z.remove(zi);
            sos[si] = section(&[z1, z1.conj()], &[p1, p1.conj()]);
        } else {
            let p2 = if p1.is_real() {
                let real_idx: Vec<usize> = (0..p.len()).filter(|&i| p[i].is_real()).collect();
                let reals: Vec<C> = real_idx.iter().map(|&i| p[i]).collect();
                p.remove(real_idx[worst(&reals)])
            } else {
                p1.conj()
            };
            if let Some(zi) = nearest(&z, p1, Want::Any) {
                let z1 = z.remove(zi);
                if !z1.is_real() {
                    sos[si] = section(&[z1, z1.conj()], &[p1, p2]);
                } else if let Some(zj) = nearest(&z, p1, Want::Real) {
                    let z2 = z.remove(zj);
                    sos[si] = section(&[z1, z2], &[p1, p2]);
                } else {
                    sos[si] = section(&[z1], &[p1, p2]);
                }
            } else {
                sos[si] = section(&[], &[p1, p2]);
            }
        }
    }
    for c in &mut sos[0][..3] {
        *c *= gain;
    }
    sos
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn pairing_matches_the_scipy_docstring_example() {
        // scipy.signal.zpk2sos docstring (1.17.1): z = [-1, -0.5±0.5j], p = [0.75, 0.8±0.1j], k = 1
        // gives [[1, 1, 0.5, 1, -0.75, 0], [1, 1, 0, 1, -1.6, 0.65]].
        let zpk = Zpk {
            zeros: vec![C::real(-1.0), C::new(-0.5, -0.5), C::new(-0.5, 0.5)],
            poles: vec![C::real(0.75), C::new(0.8, 0.1), C::new(0.8, -0.1)],
            gain: 1.0,
        };
        let s = to_sections(zpk);
        let want = [
            [1.0, 1.0, 0.5, 1.0, -0.75, 0.0],
            [1.0, 1.0, 0.0, 1.0, -1.6, 0.65],
        ];
        for (a, b) in s.iter().zip(want.iter()) {
            for (x, y) in a.iter().zip(b.iter()) {
                assert!((x - y).abs() < 1e-14, "{s:?}");
            }
        }
    }
}
