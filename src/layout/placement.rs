//! A gauge placed on an element: which gauge, where, at what angle, and the strain its grid
//! averages.

use uom::si::angle::radian;
use uom::si::length::meter;

use crate::error::PhysicsError;
use crate::gauge::Gauge;
use crate::spring::{Site, SpringElement, SurfaceStrain, Wrench};
use crate::units::{Angle, Length, Strain, TemperatureCoefficient};

/// Five-point Gauss–Legendre nodes and weights on [−1, 1] (Abramowitz & Stegun, *Handbook of
/// Mathematical Functions*, 1964, table 25.4, from memory; the weights sum to 2, checked in a
/// unit test). Exact for fields up to degree 9 along the grid.
const GAUSS5: [(f64, f64); 5] = [
    (-0.906_179_845_938_664, 0.236_926_885_056_189),
    (-0.538_469_310_105_683, 0.478_628_670_499_366),
    (0.0, 0.568_888_888_888_889),
    (0.538_469_310_105_683, 0.478_628_670_499_366),
    (0.906_179_845_938_664, 0.236_926_885_056_189),
];

/// A gauge at a site, its grid at `angle` from the element's axis (counter-clockwise seen from
/// outside the surface; see [`Site`]).
///
/// When the gauge's thermal-output polynomial was measured on a material other than the
/// element's, give that material's expansion with
/// [`Placement::with_thermal_output_expansion`]: the mismatch (α_element − α_reference)·ΔT is
/// then added as a real strain along and across the grid (Dally & Riley, *Experimental Stress
/// Analysis*, 4th ed., §6 temperature effects, from memory).
///
/// ```
/// use gaugebook::{Face, Gauge, Placement, Site};
/// use gaugebook::units::{Angle, ElectricalResistance, Length};
/// use uom::si::{angle::degree, electrical_resistance::ohm, length::millimeter};
/// let g = Gauge::new(ElectricalResistance::new::<ohm>(350.0), 2.0)?;
/// let p = Placement::new("T1", g, Site::new("bottom", Face::MinusZ, Length::new::<millimeter>(30.0)),
///     Angle::new::<degree>(0.0));
/// assert_eq!(p.label, "T1");
/// # Ok::<(), gaugebook::PhysicsError>(())
/// ```
#[derive(Debug, Clone, PartialEq)]
pub struct Placement {
    /// A label the wiring refers to ("T1").
    pub label: String,
    /// The gauge.
    pub gauge: Gauge,
    /// Where the grid's centre is.
    pub site: Site,
    /// The grid's direction from the element's axis.
    pub angle: Angle,
    /// The expansion of the material the gauge's thermal output refers to, when it differs
    /// from the element's.
    pub thermal_output_expansion: Option<TemperatureCoefficient>,
}

impl Placement {
    /// A gauge at `site` with its grid at `angle`.
    ///
    /// ```
    /// # use gaugebook::{Arrangement, Cantilever, Gauge, Layout, LoadComponent, Wrench, material};
    /// # use gaugebook::units::{ElectricalResistance, Length};
    /// # use uom::si::{electrical_resistance::ohm, length::millimeter};
    /// # let mm = Length::new::<millimeter>;
    /// # let beam = Cantilever::new(material("2024-T351")?, mm(100.0), mm(20.0), mm(5.0), mm(30.0))?;
    /// # let g = Gauge::new(ElectricalResistance::new::<ohm>(350.0), 2.0)?;
    /// # let l = Layout::standard(beam, &g, Arrangement::FullBending, 50.0)?;
    /// use gaugebook::{Face, Placement, Site};
    /// use gaugebook::units::Angle;
    /// let p = Placement::new("X", g, Site::new("top", Face::PlusZ, mm(30.0)), Angle::default());
    /// assert!(p.thermal_output_expansion.is_none());
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn new(label: impl Into<String>, gauge: Gauge, site: Site, angle: Angle) -> Placement {
        Placement {
            label: label.into(),
            gauge,
            site,
            angle,
            thermal_output_expansion: None,
        }
    }

    /// The same placement, its gauge's thermal output referring to a material of expansion
    /// `alpha`.
    ///
    /// ```
    /// use gaugebook::{Face, Gauge, Placement, Site};
    /// use gaugebook::units::{Angle, ElectricalResistance, TemperatureCoefficient};
    /// use uom::si::{electrical_resistance::ohm, temperature_coefficient::ppm_per_kelvin};
    /// let g = Gauge::new(ElectricalResistance::new::<ohm>(350.0), 2.0)?;
    /// let p = Placement::new("T1", g, Site::new("top", Face::PlusZ, Default::default()), Angle::default())
    ///     .with_thermal_output_expansion(TemperatureCoefficient::new::<ppm_per_kelvin>(10.8));
    /// assert!(p.thermal_output_expansion.is_some());
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn with_thermal_output_expansion(mut self, alpha: TemperatureCoefficient) -> Placement {
        self.thermal_output_expansion = Some(alpha);
        self
    }

    /// The same placement rotated by `delta` and moved by `dx` along the axis and `dy` across.
    ///
    /// ```
    /// use gaugebook::{Face, Gauge, Placement, Site};
    /// use gaugebook::units::{Angle, ElectricalResistance, Length};
    /// use uom::si::{angle::degree, electrical_resistance::ohm, length::millimeter};
    /// let g = Gauge::new(ElectricalResistance::new::<ohm>(350.0), 2.0)?;
    /// let p = Placement::new("T1", g, Site::new("top", Face::PlusZ, Length::new::<millimeter>(10.0)),
    ///     Angle::new::<degree>(0.0));
    /// let q = p.displaced(Angle::new::<degree>(2.0), Length::new::<millimeter>(0.5), Length::default());
    /// assert!((q.angle.get::<degree>() - 2.0).abs() < 1e-12);
    /// assert!((q.site.x.get::<millimeter>() - 10.5).abs() < 1e-12);
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn displaced(&self, delta: Angle, dx: Length, dy: Length) -> Placement {
        let mut p = self.clone();
        p.angle += delta;
        p.site = p.site.moved(dx, dy);
        p
    }

    /// The strain tensor averaged over the grid length along the grid's direction (five-point
    /// Gauss–Legendre; a point value when the gauge has no grid length).
    ///
    /// ```
    /// # use gaugebook::{Arrangement, Cantilever, Gauge, Layout, LoadComponent, Wrench, material};
    /// # use gaugebook::units::{ElectricalResistance, Length};
    /// # use uom::si::{electrical_resistance::ohm, length::millimeter};
    /// # let mm = Length::new::<millimeter>;
    /// # let beam = Cantilever::new(material("2024-T351")?, mm(100.0), mm(20.0), mm(5.0), mm(30.0))?;
    /// # let g = Gauge::new(ElectricalResistance::new::<ohm>(350.0), 2.0)?;
    /// # let l = Layout::standard(beam, &g, Arrangement::FullBending, 50.0)?;
    /// let p = &l.placements()[0];
    /// let s = p.averaged_strain(l.element(), &Wrench::only(LoadComponent::Fz, 10.0))?;
    /// assert!(s.exx.value() > 0.0);
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn averaged_strain(
        &self,
        element: &dyn SpringElement,
        load: &Wrench,
    ) -> Result<SurfaceStrain, PhysicsError> {
        let Some(grid) = self.gauge.grid_length() else {
            return element.surface_strain(&self.site, load);
        };
        let half = grid.get::<meter>() / 2.0;
        let th = self.angle.get::<radian>();
        let mut acc = SurfaceStrain::default();
        for (node, weight) in GAUSS5 {
            let u = half * node;
            let s = self.site.moved(
                Length::new::<meter>(u * th.cos()),
                Length::new::<meter>(u * th.sin()),
            );
            acc = acc + element.surface_strain(&s, load)? * (weight / 2.0);
        }
        Ok(acc)
    }

    /// The grid-averaged strain along the grid and across it (at +90°).
    ///
    /// ```
    /// use gaugebook::{Cantilever, Gauge, LoadComponent, Placement, SpringElement, Wrench, material};
    /// use gaugebook::units::{Angle, ElectricalResistance, Length};
    /// use uom::si::{electrical_resistance::ohm, length::millimeter};
    /// let mm = Length::new::<millimeter>;
    /// let beam = Cantilever::new(material("2024-T351")?, mm(100.0), mm(20.0), mm(5.0), mm(30.0))?;
    /// let g = Gauge::new(ElectricalResistance::new::<ohm>(350.0), 2.0)?.with_grid(mm(6.0), mm(3.0))?;
    /// let p = Placement::new("T1", g, beam.site("bottom")?, Angle::default());
    /// let (a, _) = p.grid_strains(&beam, &Wrench::only(LoadComponent::Fz, 10.0))?;
    /// // The moment is linear along the grid, so the average is the centre value.
    /// let centre = beam.surface_strain(&beam.site("bottom")?, &Wrench::only(LoadComponent::Fz, 10.0))?;
    /// assert!((a.value() / centre.exx.value() - 1.0).abs() < 1e-12);
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn grid_strains(
        &self,
        element: &dyn SpringElement,
        load: &Wrench,
    ) -> Result<(Strain, Strain), PhysicsError> {
        let s = self.averaged_strain(element, load)?;
        let across = self.angle + Angle::new::<radian>(std::f64::consts::FRAC_PI_2);
        Ok((s.normal(self.angle), s.normal(across)))
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn gauss_rule_matches_numpy() {
        // numpy 2.4.6, numpy.polynomial.legendre.leggauss(5), printed as float().
        let x = [
            -0.906179845938664,
            -0.5384693101056831,
            0.0,
            0.5384693101056831,
            0.906179845938664,
        ];
        let w = [
            0.23692688505618928,
            0.4786286704993663,
            0.5688888888888887,
            0.4786286704993663,
            0.23692688505618928,
        ];
        for (k, (node, weight)) in GAUSS5.iter().enumerate() {
            assert!((node - x[k]).abs() < 1e-14 && (weight - w[k]).abs() < 1e-14);
        }
    }

    #[test]
    fn gauss_rule_integrates_polynomials_exactly() {
        let w: f64 = GAUSS5.iter().map(|(_, w)| w).sum();
        assert!((w - 2.0).abs() < 1e-14);
        // ∫ x⁸ dx over [−1, 1] = 2/9.
        let i: f64 = GAUSS5.iter().map(|(x, w)| w * x.powi(8)).sum();
        assert!((i - 2.0 / 9.0).abs() < 1e-13);
    }
}
