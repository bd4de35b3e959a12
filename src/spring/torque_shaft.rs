//! The torque shaft: a solid or hollow round shaft with gauges at ±45° to its axis.
//!
//! Frame: X along the axis from the fixed (reaction) end x = 0 to the driven end x = L, where
//! the load point is; Y and Z across. The primary load is the torque Mx. The surface is in pure
//! shear τ = T·r/J, γ = τ/G; a solid shaft gives γ = 16T/(πGd³) and ±45° gauges read ∓γ/2 in
//! the surface frame (whose y axis runs clockwise about +X, so a positive torque gives negative
//! γxy) (Timoshenko & Gere, *Mechanics of Materials*, 4th ed., §3.3 and §3.5, from memory).
//!
//! Model and range of validity: elastic torsion of a circular bar (exact for any wall
//! thickness), Euler–Bernoulli bending and the round-section transverse shear for side loads.
//! The gauge station must be at least one outer diameter from each end (Saint-Venant, common
//! practice). Stiffness G·J/L; the frequency is the attached rotary inertia on that spring plus
//! 1/3 of the shaft's own polar inertia (Rayleigh, linear twist; Timoshenko, Young & Weaver,
//! *Vibration Problems in Engineering*, 4th ed., from memory).

use uom::si::mass_density::kilogram_per_cubic_meter;
use uom::si::pressure::pascal;

use super::bar::{Bar, bar_element};
use super::element::{SpringElement, Stiffness, check_station};
use super::load::LoadComponent;
use super::section::{Section, positive_length, si};
use super::surface::Face;
use crate::error::PhysicsError;
use crate::material::Material;
use crate::units::{Angle, Length};

/// A torque shaft (see the module documentation for the frame, model and range of validity).
/// Design estimates must be proven by test.
///
/// ```
/// use gaugebook::{LoadComponent, SpringElement, TorqueShaft, Wrench, material};
/// use gaugebook::units::{Angle, Length};
/// use uom::si::{angle::degree, length::millimeter};
/// let mm = Length::new::<millimeter>;
/// let s = TorqueShaft::hollow(material("17-4 PH H900")?, mm(30.0), mm(20.0), mm(150.0), mm(75.0))?;
/// let e = s.surface_strain(&s.site("+y")?, &Wrench::only(LoadComponent::Mx, 200.0))?;
/// assert!((e.normal(Angle::new::<degree>(45.0)) + e.normal(Angle::new::<degree>(-45.0))).value().abs() < 1e-15);
/// # Ok::<(), gaugebook::PhysicsError>(())
/// ```
#[derive(Debug, Clone, PartialEq)]
pub struct TorqueShaft {
    bar: Bar,
    station: f64,
}

impl TorqueShaft {
    /// A solid shaft of `diameter` and `length`, standard sites at `station`.
    ///
    /// ```
    /// use gaugebook::{TorqueShaft, material};
    /// use gaugebook::units::Length;
    /// use uom::si::length::millimeter;
    /// let mm = Length::new::<millimeter>;
    /// // Gauges 10 mm from the end of a 20 mm shaft: too close.
    /// assert!(TorqueShaft::solid(material("4340")?, mm(20.0), mm(100.0), mm(10.0)).is_err());
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn solid(
        material: Material,
        diameter: Length,
        length: Length,
        station: Length,
    ) -> Result<TorqueShaft, PhysicsError> {
        TorqueShaft::build(material, diameter, None, length, station)
    }

    /// A hollow shaft of `outer` and `inner` diameter and `length`, standard sites at
    /// `station`.
    ///
    /// ```
    /// use gaugebook::{TorqueShaft, material};
    /// use gaugebook::units::Length;
    /// use uom::si::length::millimeter;
    /// let mm = Length::new::<millimeter>;
    /// assert!(TorqueShaft::hollow(material("4340")?, mm(20.0), mm(25.0), mm(100.0), mm(50.0)).is_err());
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn hollow(
        material: Material,
        outer: Length,
        inner: Length,
        length: Length,
        station: Length,
    ) -> Result<TorqueShaft, PhysicsError> {
        TorqueShaft::build(material, outer, Some(inner), length, station)
    }

    fn build(
        material: Material,
        outer: Length,
        inner: Option<Length>,
        length: Length,
        station: Length,
    ) -> Result<TorqueShaft, PhysicsError> {
        let d = positive_length("shaft diameter", outer)?;
        let di = match inner {
            None => 0.0,
            Some(i) => {
                let di = positive_length("shaft inner diameter", i)?;
                if di >= d {
                    return Err(PhysicsError::invalid(
                        "shaft inner diameter",
                        format!("{} mm", di * 1e3),
                        format!("below the outer diameter {} mm", d * 1e3),
                    ));
                }
                di
            }
        };
        let l = positive_length("shaft length", length)?;
        let x = si(station);
        check_station(
            "torque shaft (Saint-Venant: one diameter from each end)",
            x,
            d,
            l - d,
        )?;
        let section = Section::Circle {
            outer: d,
            inner: di,
        };
        Ok(TorqueShaft {
            bar: Bar {
                section,
                length: l,
                material,
                model: "torque shaft",
            },
            station: x,
        })
    }

    /// The surface shear strain per N·m of torque, γ/T = r/(G·J), in 1/(N·m).
    ///
    /// ```
    /// use gaugebook::{TorqueShaft, material};
    /// use gaugebook::units::Length;
    /// use uom::si::{length::millimeter, pressure::pascal};
    /// let mm = Length::new::<millimeter>;
    /// let m = material("4340")?;
    /// let g = m.shear_modulus().get::<pascal>();
    /// let s = TorqueShaft::solid(m, mm(20.0), mm(100.0), mm(50.0))?;
    /// let expected = 16.0 / (std::f64::consts::PI * g * 0.02f64.powi(3));
    /// assert!((s.shear_strain_per_newton_metre() / expected - 1.0).abs() < 1e-12);
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn shear_strain_per_newton_metre(&self) -> f64 {
        let g = self.bar.material.shear_modulus().get::<pascal>();
        match self.bar.section {
            Section::Circle { outer, .. } => {
                outer / 2.0 / (g * self.bar.section.torsion_constant())
            }
            _ => f64::NAN,
        }
    }
}

impl SpringElement for TorqueShaft {
    bar_element! {
        kind: "torque shaft",
        primary: LoadComponent::Mx,
        sites: [
            ("+y", round(0.0)),
            ("+z", round(90.0)),
            ("-y", round(180.0)),
            ("-z", round(270.0)),
        ]
    }
    fn stiffness(&self) -> Stiffness {
        Stiffness::Rotational(
            self.bar.shear_pa() * self.bar.section.torsion_constant() / self.bar.length,
        )
    }
    fn rayleigh_share(&self) -> (f64, f64) {
        let rho = self
            .bar
            .material
            .density()
            .get::<kilogram_per_cubic_meter>();
        (
            1.0 / 3.0,
            rho * self.bar.length * self.bar.section.torsion_constant(),
        )
    }
    fn frequency_model(&self) -> &'static str {
        "attached rotary inertia on the shaft's torsional stiffness GJ/L, plus 1/3 of the \
         shaft's polar inertia (Rayleigh, linear twist)"
    }
}

/// The round face at `deg` degrees about the axis from +Y.
fn round(deg: f64) -> Face {
    Face::Round(Angle::new::<uom::si::angle::degree>(deg))
}
