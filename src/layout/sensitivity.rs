//! Placement sensitivity: what each gauge's angle and position errors do to a bridge's rated
//! output and cross-talk.

use std::fmt;

use uom::si::angle::degree;
use uom::si::length::{meter, millimeter};

use super::explorer::Layout;
use crate::error::PhysicsError;
use crate::spring::LoadComponent;
use crate::units::{Angle, Length};

/// Which placement error a row of a [`SensitivityTable`] is about.
///
/// ```
/// assert_eq!(gaugebook::PlacementError::Angle.to_string(), "angle");
/// ```
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum PlacementError {
    /// The grid rotated by the angle tolerance.
    Angle,
    /// The grid moved along the element's axis by the position tolerance.
    Axial,
    /// The grid moved across the surface by the position tolerance.
    Lateral,
}

impl fmt::Display for PlacementError {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        f.write_str(match self {
            PlacementError::Angle => "angle",
            PlacementError::Axial => "axial position",
            PlacementError::Lateral => "lateral position",
        })
    }
}

/// One gauge, one error: the change in rated output and cross-talk.
///
/// ```
/// # use gaugebook::{Arrangement, Cantilever, Gauge, Layout, LoadComponent, Wrench, material};
/// # use gaugebook::units::{ElectricalResistance, Length};
/// # use uom::si::{electrical_resistance::ohm, length::millimeter};
/// # let mm = Length::new::<millimeter>;
/// # let beam = Cantilever::new(material("2024-T351")?, mm(100.0), mm(20.0), mm(5.0), mm(30.0))?;
/// # let g = Gauge::new(ElectricalResistance::new::<ohm>(350.0), 2.0)?;
/// # let l = Layout::standard(beam, &g, Arrangement::FullBending, 50.0)?;
/// use gaugebook::units::Angle;
/// use uom::si::angle::degree;
/// let t = l.placement_sensitivity(0, Angle::new::<degree>(1.0), mm(0.2))?;
/// let worst = &t.rows[0];
/// assert!(worst.worst >= worst.rated_output_change.abs());
/// # Ok::<(), gaugebook::PhysicsError>(())
/// ```
#[derive(Debug, Clone, PartialEq)]
pub struct SensitivityRow {
    /// The gauge's label.
    pub gauge: String,
    /// The error.
    pub error: PlacementError,
    /// Change of rated output, % of rated output (linear, small-signal).
    pub rated_output_change: f64,
    /// Change of each component's cross-talk, percentage points of rated output (0 for the
    /// primary).
    pub cross_talk_change: [f64; 6],
    /// The component whose cross-talk changes most.
    pub worst_component: LoadComponent,
    /// The largest of |rated-output change| and |cross-talk changes|, % of rated output.
    pub worst: f64,
}

/// A placement sensitivity table, rows sorted from the error that matters most.
///
/// ```
/// use gaugebook::{Arrangement, Cantilever, Gauge, Layout, material};
/// use gaugebook::units::{Angle, ElectricalResistance, Length};
/// use uom::si::{angle::degree, electrical_resistance::ohm, length::millimeter};
/// let mm = Length::new::<millimeter>;
/// let beam = Cantilever::new(material("2024-T351")?, mm(100.0), mm(20.0), mm(5.0), mm(30.0))?;
/// let g = Gauge::new(ElectricalResistance::new::<ohm>(350.0), 2.0)?;
/// let l = Layout::standard(beam, &g, Arrangement::FullBending, 50.0)?;
/// let t = l.placement_sensitivity(0, Angle::new::<degree>(2.0), mm(0.5))?;
/// assert_eq!(t.rows.len(), 12);
/// assert!(t.rows[0].worst >= t.rows[11].worst);
/// # Ok::<(), gaugebook::PhysicsError>(())
/// ```
#[derive(Debug, Clone, PartialEq)]
pub struct SensitivityTable {
    /// The bridge's name.
    pub bridge: String,
    /// The angle tolerance applied.
    pub angle_tolerance: Angle,
    /// The position tolerance applied.
    pub position_tolerance: Length,
    /// The rows, most important first.
    pub rows: Vec<SensitivityRow>,
}

impl fmt::Display for SensitivityTable {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        writeln!(
            f,
            "bridge {}: ±{}° angle, ±{} mm position",
            self.bridge,
            self.angle_tolerance.get::<degree>(),
            self.position_tolerance.get::<millimeter>()
        )?;
        writeln!(
            f,
            "gauge      error              ΔRO (%)   worst cross-talk Δ (% RO)"
        )?;
        for r in &self.rows {
            writeln!(
                f,
                "{:<10} {:<16} {:>10.4}   {:>10.4} ({})",
                r.gauge,
                r.error.to_string(),
                r.rated_output_change,
                r.cross_talk_change[r.worst_component.index()],
                r.worst_component
            )?;
        }
        Ok(())
    }
}

impl Layout {
    /// Rotates each gauge of bridge `bridge` by `angle`, and moves it by `position` along and
    /// across the surface, one error at a time, and tabulates the change in the linear response.
    /// The change for an error of the opposite sign is the negative of a first-order change; see
    /// the tests for the small-angle identity it follows.
    ///
    /// ```
    /// # use gaugebook::{Arrangement, Cantilever, Gauge, Layout, LoadComponent, Wrench, material};
    /// # use gaugebook::units::{ElectricalResistance, Length};
    /// # use uom::si::{electrical_resistance::ohm, length::millimeter};
    /// # let mm = Length::new::<millimeter>;
    /// # let beam = Cantilever::new(material("2024-T351")?, mm(100.0), mm(20.0), mm(5.0), mm(30.0))?;
    /// # let g = Gauge::new(ElectricalResistance::new::<ohm>(350.0), 2.0)?;
    /// # let l = Layout::standard(beam, &g, Arrangement::FullBending, 50.0)?;
    /// use gaugebook::{PlacementError, units::Angle};
    /// use uom::si::angle::degree;
    /// let t = l.placement_sensitivity(0, Angle::new::<degree>(2.0), mm(0.5))?;
    /// // Moving a grid 0.5 mm along a 70 mm lever changes that gauge's strain by 0.5/70.
    /// let axial = t.rows.iter().find(|r| r.error == PlacementError::Axial).unwrap();
    /// assert!((axial.rated_output_change.abs() - 100.0 * 0.5 / 70.0 / 4.0).abs() < 1e-6);
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn placement_sensitivity(
        &self,
        bridge: usize,
        angle: Angle,
        position: Length,
    ) -> Result<SensitivityTable, PhysicsError> {
        let a = angle.get::<degree>();
        let p = position.get::<meter>();
        if !(a.is_finite() && a > 0.0) {
            return Err(PhysicsError::invalid(
                "angle tolerance",
                format!("{a}°"),
                "a value above 0°",
            ));
        }
        if !(p.is_finite() && p > 0.0) {
            return Err(PhysicsError::invalid(
                "position tolerance",
                format!("{} mm", p * 1e3),
                "a value above 0 mm",
            ));
        }
        let w = self.wiring(bridge)?.clone();
        let base = self.per_load(bridge)?;
        let primary = self.primary();
        let cap = self.capacity().get(primary);
        let ro = base[primary.index()] * cap;
        if ro == 0.0 {
            return Err(PhysicsError::NoSolution {
                what: format!("placement sensitivity of bridge {}", w.name),
                reason: "the bridge does not respond to the rated load".into(),
            });
        }
        let basis = self.default_cross_talk_basis();
        let zero = Length::new::<meter>(0.0);
        let mut rows = Vec::new();
        for &i in w.arms.iter().flatten() {
            let pl = &self.placements()[i];
            for (kind, moved) in [
                (PlacementError::Angle, pl.displaced(angle, zero, zero)),
                (
                    PlacementError::Axial,
                    pl.displaced(Angle::default(), position, zero),
                ),
                (
                    PlacementError::Lateral,
                    pl.displaced(Angle::default(), zero, position),
                ),
            ] {
                let s = self.with_placement(i, moved)?.per_load(bridge)?;
                let rated_output_change =
                    100.0 * (s[primary.index()] - base[primary.index()]) * cap / ro;
                let mut ct = [0.0; 6];
                let mut worst_component = primary;
                let mut worst_ct: f64 = 0.0;
                for c in LoadComponent::ALL {
                    if c == primary {
                        continue;
                    }
                    let d = 100.0 * (s[c.index()] - base[c.index()]) * basis.get(c) / ro.abs();
                    ct[c.index()] = d;
                    if d.abs() > worst_ct.abs() || worst_component == primary {
                        worst_ct = d;
                        worst_component = c;
                    }
                }
                rows.push(SensitivityRow {
                    gauge: pl.label.clone(),
                    error: kind,
                    rated_output_change,
                    cross_talk_change: ct,
                    worst_component,
                    worst: rated_output_change.abs().max(worst_ct.abs()),
                });
            }
        }
        // Symmetric gauges give errors equal but for round-off: compare at 9 significant
        // figures of the largest, so that such ties keep the gauges' order (a stable sort)
        // instead of following the last bits.
        let top = rows.iter().map(|r| r.worst.abs()).fold(0.0, f64::max);
        let key = |v: f64| {
            if top > 0.0 {
                (v / top * 1e9).round()
            } else {
                0.0
            }
        };
        rows.sort_by(|x, y| key(y.worst).total_cmp(&key(x.worst)));
        Ok(SensitivityTable {
            bridge: w.name,
            angle_tolerance: angle,
            position_tolerance: position,
            rows,
        })
    }
}
