//! Transverse-sensitivity correction of gauge readings: one gauge with the transverse strain
//! known (or a uniaxial field of known ν), and two orthogonal gauges.
//!
//! A reading ε̂ = (ΔR/R)/F of a gauge with transverse sensitivity K_t, calibrated on a beam of
//! Poisson's ratio ν₀, is ε̂ = (ε_a + K_t·ε_t)/(1 − ν₀K_t) (ASTM E251 terms; Dally & Riley,
//! *Experimental Stress Analysis*, 4th ed., ch. 6; both from memory). Inverting it needs the
//! transverse strain, which either is known, follows from a uniaxial field, or is read by a
//! second gauge at 90°.

use crate::{PhysicsError, Strain, check_finite, check_poisson};

fn check_kt(kt: f64) -> Result<f64, PhysicsError> {
    if kt.is_finite() && kt.abs() < 1.0 {
        Ok(kt)
    } else {
        Err(PhysicsError::invalid(
            "transverse sensitivity coefficient",
            kt,
            "a finite value in (-1, 1)",
        ))
    }
}

/// (1 − ν₀K_t)/(1 − K_t²), checked.
pub(crate) fn factor(kt: f64, nu0: f64) -> Result<f64, PhysicsError> {
    let kt = check_kt(kt)?;
    let nu0 = check_poisson(nu0)?;
    Ok((1.0 - nu0 * kt) / (1.0 - kt * kt))
}

/// The axial strain of a single gauge from its reading `indicated` and the transverse strain
/// `transverse` across it: ε_a = ε̂(1 − ν₀K_t) − K_t·ε_t.
///
/// ```
/// use gaugebook::{Strain, correct_single};
/// let e = correct_single(Strain::from_microstrain(1000.0), 0.02, 0.285, Strain::from_microstrain(-300.0))?;
/// assert!((e.microstrain() - (1000.0 * (1.0 - 0.285 * 0.02) + 0.02 * 300.0)).abs() < 1e-9);
/// # Ok::<(), gaugebook::PhysicsError>(())
/// ```
pub fn correct_single(
    indicated: Strain,
    kt: f64,
    nu0: f64,
    transverse: Strain,
) -> Result<Strain, PhysicsError> {
    let kt = check_kt(kt)?;
    let nu0 = check_poisson(nu0)?;
    check_finite("indicated strain", indicated.value(), "m/m")?;
    check_finite("transverse strain", transverse.value(), "m/m")?;
    Ok(indicated * (1.0 - nu0 * kt) - transverse * kt)
}

/// The axial strain of a single gauge aligned with a uniaxial stress in a material of Poisson's
/// ratio `nu` (ε_t = −ν·ε_a): ε_a = ε̂(1 − ν₀K_t)/(1 − νK_t). It is the reading itself when
/// ν = ν₀.
///
/// ```
/// use gaugebook::{Strain, correct_uniaxial};
/// let e = Strain::from_microstrain(1000.0);
/// assert!((correct_uniaxial(e, 0.03, 0.285, 0.285)?.microstrain() - 1000.0).abs() < 1e-9);
/// assert!(correct_uniaxial(e, 0.03, 0.285, 0.5).is_err());
/// # Ok::<(), gaugebook::PhysicsError>(())
/// ```
pub fn correct_uniaxial(
    indicated: Strain,
    kt: f64,
    nu0: f64,
    nu: f64,
) -> Result<Strain, PhysicsError> {
    let kt = check_kt(kt)?;
    let nu0 = check_poisson(nu0)?;
    let nu = check_poisson(nu)?;
    check_finite("indicated strain", indicated.value(), "m/m")?;
    Ok(indicated * ((1.0 - nu0 * kt) / (1.0 - nu * kt)))
}

/// The strains along two orthogonal gauges from their readings: with c = (1 − ν₀K_t)/(1 − K_t²),
/// ε_x = c(ε̂_x − K_t·ε̂_y), ε_y = c(ε̂_y − K_t·ε̂_x) (Dally & Riley, 4th ed., ch. 6, from
/// memory). Both gauges share K_t.
///
/// ```
/// use gaugebook::{Strain, correct_orthogonal};
/// let (x, y) = correct_orthogonal(Strain::from_microstrain(1000.0), Strain::from_microstrain(-300.0), 0.0, 0.285)?;
/// assert_eq!((x.microstrain(), y.microstrain()), (1000.0, -300.0));
/// # Ok::<(), gaugebook::PhysicsError>(())
/// ```
pub fn correct_orthogonal(
    indicated_x: Strain,
    indicated_y: Strain,
    kt: f64,
    nu0: f64,
) -> Result<(Strain, Strain), PhysicsError> {
    let c = factor(kt, nu0)?;
    check_finite("indicated strain", indicated_x.value(), "m/m")?;
    check_finite("indicated strain", indicated_y.value(), "m/m")?;
    Ok((
        (indicated_x - indicated_y * kt) * c,
        (indicated_y - indicated_x * kt) * c,
    ))
}
