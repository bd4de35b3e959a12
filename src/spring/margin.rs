//! Safety factors against yield, fracture, fatigue and buckling at the rated load and at the
//! safe and ultimate overloads.
//!
//! Every margin here is a design estimate from a nominal-stress model: no stress
//! concentration, no surface, size or reliability factors on the fatigue strength, no residual
//! stress. Design estimates must be proven by test; overload and lifting uses follow local
//! codes and licensed practice.

use std::fmt;

use uom::si::force::newton;
use uom::si::pressure::megapascal;

use super::element::{PeakStress, SpringElement, pa};
use super::load::Wrench;
use crate::error::PhysicsError;

/// The caution attached to every reported margin.
///
/// ```
/// assert!(gaugebook::MARGIN_CAUTION.contains("licensed practice"));
/// # Ok::<(), gaugebook::PhysicsError>(())
/// ```
pub const MARGIN_CAUTION: &str = "design estimates must be proven by test; overload and \
lifting uses follow local codes and licensed practice";

/// The overloads margins are evaluated at, as multiples of the rated load.
///
/// The defaults, safe overload 150 % and ultimate overload 300 % of capacity, are common
/// practice for load cells, not a code requirement.
///
/// ```
/// use gaugebook::OverloadFactors;
/// let d = OverloadFactors::default();
/// assert_eq!((d.safe(), d.ultimate()), (1.5, 3.0));
/// assert!(OverloadFactors::new(2.0, 1.5).is_err());
/// # Ok::<(), gaugebook::PhysicsError>(())
/// ```
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct OverloadFactors {
    safe: f64,
    ultimate: f64,
}

impl Default for OverloadFactors {
    fn default() -> OverloadFactors {
        // 150 % safe and 300 % ultimate overload: common practice.
        OverloadFactors {
            safe: 1.5,
            ultimate: 3.0,
        }
    }
}

impl OverloadFactors {
    /// Factors validated: 1 ≤ safe ≤ ultimate, both finite.
    ///
    /// ```
    /// let f = gaugebook::OverloadFactors::new(1.2, 2.5)?;
    /// assert_eq!(f.ultimate(), 2.5);
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn new(safe: f64, ultimate: f64) -> Result<OverloadFactors, PhysicsError> {
        if !(safe.is_finite() && safe >= 1.0) {
            return Err(PhysicsError::invalid(
                "safe overload factor",
                safe,
                "a finite value ≥ 1",
            ));
        }
        if !(ultimate.is_finite() && ultimate >= safe) {
            return Err(PhysicsError::invalid(
                "ultimate overload factor",
                ultimate,
                format!("a finite value ≥ the safe overload factor {safe}"),
            ));
        }
        Ok(OverloadFactors { safe, ultimate })
    }

    /// The safe overload as a multiple of the rated load.
    ///
    /// ```
    /// assert_eq!(gaugebook::OverloadFactors::new(1.25, 2.0)?.safe(), 1.25);
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn safe(&self) -> f64 {
        self.safe
    }

    /// The ultimate overload as a multiple of the rated load.
    ///
    /// ```
    /// assert_eq!(gaugebook::OverloadFactors::default().ultimate(), 3.0);
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn ultimate(&self) -> f64 {
        self.ultimate
    }
}

/// Safety factors at one load level.
///
/// A factor below 1 means the model predicts yield (or fracture, fatigue failure, buckling) at
/// that level; above yield the linear model itself no longer holds.
///
/// ```
/// use gaugebook::{Cantilever, LoadComponent, OverloadFactors, SpringElement, Wrench, material};
/// use gaugebook::units::Length;
/// use uom::si::length::millimeter;
/// let mm = Length::new::<millimeter>;
/// let b = Cantilever::new(material("7075-T6")?, mm(100.0), mm(20.0), mm(6.0), mm(30.0))?;
/// let m = b.margins(&Wrench::only(LoadComponent::Fz, 100.0), &OverloadFactors::default())?;
/// assert_eq!(m.ultimate.level, "ultimate overload");
/// assert!((m.rated.yield_factor / m.ultimate.yield_factor - 3.0).abs() < 1e-9);
/// # Ok::<(), gaugebook::PhysicsError>(())
/// ```
#[derive(Debug, Clone, PartialEq)]
pub struct MarginAt {
    /// "rated", "safe overload" or "ultimate overload".
    pub level: &'static str,
    /// The multiple of the rated load.
    pub factor: f64,
    /// The peak stress and its location.
    pub peak: PeakStress,
    /// Yield strength over the peak von Mises stress.
    pub yield_factor: f64,
    /// Ultimate strength over the peak von Mises stress.
    pub ultimate_factor: f64,
    /// Modified-Goodman factor for loading cycled from zero to this level, n = 1/(σa/Se + σm/Su)
    /// with σa = σm = σ/2 (Budynas & Nisbett, *Shigley's Mechanical Engineering Design*, 9th
    /// ed., eq. 6-46, from memory); `None` when the material has no fatigue strength.
    pub fatigue_factor: Option<f64>,
    /// Buckling load over the applied primary load, where the element models buckling and the
    /// load compresses it.
    pub buckling_factor: Option<f64>,
}

/// Margins at the rated load and the two overloads, with the caution that goes with them.
///
/// ```
/// use gaugebook::{Column, ColumnSection, LoadComponent, OverloadFactors, SpringElement, Wrench, material};
/// use gaugebook::units::Length;
/// use uom::si::length::millimeter;
/// let mm = Length::new::<millimeter>;
/// let col = Column::new(material("17-4 PH H1025")?, ColumnSection::Round { diameter: mm(12.0) },
///     mm(40.0), mm(20.0))?;
/// let m = col.margins(&Wrench::only(LoadComponent::Fx, -20e3), &OverloadFactors::default())?;
/// assert!(m.rated.yield_factor > m.safe.yield_factor);
/// assert!(m.to_string().contains("proven by test"));
/// # Ok::<(), gaugebook::PhysicsError>(())
/// ```
#[derive(Debug, Clone, PartialEq)]
pub struct Margins {
    /// At the rated load.
    pub rated: MarginAt,
    /// At the safe overload.
    pub safe: MarginAt,
    /// At the ultimate overload.
    pub ultimate: MarginAt,
    /// [`MARGIN_CAUTION`].
    pub caution: &'static str,
}

impl Margins {
    pub(crate) fn evaluate<E: SpringElement + ?Sized>(
        element: &E,
        rated: &Wrench,
        factors: &OverloadFactors,
    ) -> Result<Margins, PhysicsError> {
        let m = element.material();
        let sy = pa(m.yield_strength());
        let su = pa(m.ultimate_strength());
        let se = m.fatigue_strength().map(pa);
        let at = |level: &'static str, factor: f64| -> Result<MarginAt, PhysicsError> {
            let load = rated.scaled(factor);
            let peak = element.peak_stress(&load)?;
            let s = pa(peak.von_mises);
            let ratio = |limit: f64| if s > 0.0 { limit / s } else { f64::INFINITY };
            let fatigue_factor = se.map(|se| {
                if s > 0.0 {
                    1.0 / (0.5 * s / se + 0.5 * s / su)
                } else {
                    f64::INFINITY
                }
            });
            let p = load.get(element.primary());
            let buckling_factor = element.buckling_load().and_then(|pcr| {
                // Buckling only under compression along the axis (negative primary force).
                if p < 0.0 {
                    Some(pcr.get::<newton>() / -p)
                } else {
                    None
                }
            });
            Ok(MarginAt {
                level,
                factor,
                yield_factor: ratio(sy),
                ultimate_factor: ratio(su),
                fatigue_factor,
                buckling_factor,
                peak,
            })
        };
        Ok(Margins {
            rated: at("rated", 1.0)?,
            safe: at("safe overload", factors.safe())?,
            ultimate: at("ultimate overload", factors.ultimate())?,
            caution: MARGIN_CAUTION,
        })
    }
}

impl fmt::Display for Margins {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        writeln!(
            f,
            "level              load   peak (MPa)  yield  ultimate  fatigue  buckling"
        )?;
        for m in [&self.rated, &self.safe, &self.ultimate] {
            let opt = |v: Option<f64>| v.map_or("–".to_string(), |v| format!("{v:.2}"));
            writeln!(
                f,
                "{:<17} {:>5.0} % {:>11.1} {:>6.2} {:>9.2} {:>8} {:>9}",
                m.level,
                m.factor * 100.0,
                m.peak.von_mises.get::<megapascal>(),
                m.yield_factor,
                m.ultimate_factor,
                opt(m.fatigue_factor),
                opt(m.buckling_factor)
            )?;
        }
        write!(f, "caution: {}", self.caution)
    }
}
