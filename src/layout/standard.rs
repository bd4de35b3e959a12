//! The standard layouts of the trade on each element: where the gauges of a named arrangement
//! go and which arm each is wired into.
//!
//! Arms are numbered as in [`WheatstoneBridge`](crate::WheatstoneBridge): R1 and R3 rise under
//! a positive primary load, R2 and R4 fall, so the output is positive for a positive load (for
//! a column in compression, whose primary load is negative, it is negative). Gauges that share
//! a site in this model sit side by side on it in practice (common practice).

use uom::si::angle::degree;

use super::explorer::Layout;
use super::placement::Placement;
use crate::bridge::Arrangement;
use crate::error::PhysicsError;
use crate::gauge::Gauge;
use crate::spring::SpringElement;
use crate::units::Angle;

/// (label, site name, angle in degrees) for each arm, R1..R4; `None` for a completion arm.
type Plan = [Option<(&'static str, &'static str, f64)>; 4];

fn plan(kind: &str, a: Arrangement) -> Option<Plan> {
    use Arrangement::*;
    Some(match (kind, a) {
        ("cantilever bending beam", Quarter) => [Some(("B1", "bottom", 0.0)), None, None, None],
        ("cantilever bending beam", HalfBending) => [
            Some(("B1", "bottom", 0.0)),
            Some(("T1", "top", 0.0)),
            None,
            None,
        ],
        ("cantilever bending beam", FullBending) => [
            Some(("B1", "bottom", 0.0)),
            Some(("T1", "top", 0.0)),
            Some(("B2", "bottom", 0.0)),
            Some(("T2", "top", 0.0)),
        ],
        ("parallelogram (double-bending) beam", Quarter) => {
            [Some(("UT", "upper tip", 0.0)), None, None, None]
        }
        ("parallelogram (double-bending) beam", HalfBending) => [
            Some(("UT", "upper tip", 0.0)),
            Some(("UR", "upper root", 0.0)),
            None,
            None,
        ],
        ("parallelogram (double-bending) beam", FullBending) => [
            Some(("UT", "upper tip", 0.0)),
            Some(("UR", "upper root", 0.0)),
            Some(("LR", "lower root", 0.0)),
            Some(("LT", "lower tip", 0.0)),
        ],
        ("column", Quarter) => [Some(("A1", "+y", 0.0)), None, None, None],
        ("column", HalfPoisson) => [
            Some(("A1", "+y", 0.0)),
            Some(("P1", "+y", 90.0)),
            None,
            None,
        ],
        ("column", FullPoisson) => [
            Some(("A1", "+y", 0.0)),
            Some(("P1", "+z", 90.0)),
            Some(("A2", "-y", 0.0)),
            Some(("P2", "-z", 90.0)),
        ],
        ("shear web (I-section shear beam)", FullShear) => [
            Some(("S1", "web +y", -45.0)),
            Some(("S2", "web +y", 45.0)),
            Some(("S3", "web -y", 45.0)),
            Some(("S4", "web -y", -45.0)),
        ],
        ("torque shaft", Quarter) => [Some(("S1", "+z", -45.0)), None, None, None],
        ("torque shaft", FullShear) => [
            Some(("S1", "+z", -45.0)),
            Some(("S2", "+z", 45.0)),
            Some(("S3", "-z", -45.0)),
            Some(("S4", "-z", 45.0)),
        ],
        _ => return None,
    })
}

impl Layout {
    /// The standard layout of `arrangement` on `element` with identical gauges `gauge`, rated at
    /// `capacity` along the primary component, wired as one bridge named after the arrangement.
    ///
    /// Supported: cantilever (quarter, half-bending, full-bending), parallelogram (quarter,
    /// half-bending, full-bending), column (quarter, half-poisson, full-poisson), shear web
    /// (full-shear), torque shaft (quarter, full-shear).
    ///
    /// ```
    /// use gaugebook::{Arrangement, Column, ColumnSection, Gauge, Layout, material};
    /// use gaugebook::units::{ElectricalResistance, Length};
    /// use uom::si::{electrical_resistance::ohm, length::millimeter};
    /// let mm = Length::new::<millimeter>;
    /// let col = Column::new(material("4340")?, ColumnSection::Round { diameter: mm(20.0) }, mm(60.0), mm(30.0))?;
    /// let g = Gauge::new(ElectricalResistance::new::<ohm>(350.0), 2.0)?;
    /// assert!(Layout::standard(col.clone(), &g, Arrangement::FullShear, -50e3).is_err());
    /// let l = Layout::standard(col, &g, Arrangement::FullPoisson, -50e3)?;
    /// assert_eq!(l.placements().len(), 4);
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn standard(
        element: impl SpringElement + Send + Sync + 'static,
        gauge: &Gauge,
        arrangement: Arrangement,
        capacity: f64,
    ) -> Result<Layout, PhysicsError> {
        let kind = element.kind();
        let Some(p) = plan(kind, arrangement) else {
            return Err(PhysicsError::invalid(
                "arrangement",
                format!("{arrangement} on a {kind}"),
                "a standard arrangement for this element (see Layout::standard)",
            ));
        };
        let mut sites = Vec::new();
        for (label, site, deg) in p.iter().flatten() {
            sites.push((*label, element.site(site)?, *deg));
        }
        let mut layout = Layout::new(element, capacity)?;
        for (label, site, deg) in sites {
            layout.place(Placement::new(
                label,
                gauge.clone(),
                site,
                Angle::new::<degree>(deg),
            ))?;
        }
        let labels: Vec<Vec<&str>> = p
            .iter()
            .map(|a| a.map(|(l, _, _)| vec![l]).unwrap_or_default())
            .collect();
        layout.wire(
            arrangement.name(),
            [
                &labels[0][..],
                &labels[1][..],
                &labels[2][..],
                &labels[3][..],
            ],
        )?;
        Ok(layout)
    }
}
