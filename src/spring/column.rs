//! The column: a short bar loaded along its axis, solid or hollow, round or square, with gauges
//! along the axis and across it (the Poisson gauges).
//!
//! Frame: X along the axis from the fixed base (x = 0) to the load point, the centre of the
//! loaded end (x = L); Y and Z across (for a square, parallel to its sides). The primary load is
//! Fx, negative in compression. Axial gauges read ε = Fx/(E·A), transverse gauges −ν·Fx/(E·A)
//! (Timoshenko & Gere, *Mechanics of Materials*, 4th ed., §1.5 and §1.7, from memory).
//!
//! Model and range of validity: uniform axial stress plus Euler–Bernoulli bending from side
//! loads and moments (the column is a cantilever from its base), Jourawski or thin-wall shear,
//! torsion by τ = Tr/J (round), Saint-Venant's series (solid square) or Bredt (hollow square,
//! thin wall t ≤ B/10, common practice). Saint-Venant's principle: the gauge station must be at
//! least one width (diameter or side) from each end, so L ≥ 2 widths (common practice). Stiffness
//! EA/L; the frequency is the attached mass on that spring plus 1/3 of the column's mass
//! (Rayleigh, linear axial displacement; Timoshenko, Young & Weaver, *Vibration Problems in
//! Engineering*, 4th ed., from memory). Buckling: Euler's load of a column fixed at the base and
//! free at the top, π²·E·I/(4L²) (Timoshenko & Gere, *Theory of Elastic Stability*, 2nd ed.,
//! §2.1, from memory), reported in the margins.

use std::f64::consts::PI;

use uom::si::force::newton;

use super::bar::{Bar, bar_element};
use super::element::{SpringElement, Stiffness, check_station};
use super::load::LoadComponent;
use super::section::{Section, positive_length, si};
use super::surface::Face;
use crate::error::PhysicsError;
use crate::material::Material;
use crate::units::{Force, Length};

/// Largest wall-to-side ratio of a hollow square for Bredt's thin-wall torsion (common
/// practice).
const THIN_WALL_MAX: f64 = 0.1;

/// A column's cross-section.
///
/// ```
/// use gaugebook::ColumnSection;
/// use gaugebook::units::Length;
/// use uom::si::length::millimeter;
/// let s = ColumnSection::HollowRound { outer: Length::new::<millimeter>(30.0), inner: Length::new::<millimeter>(24.0) };
/// assert!(matches!(s, ColumnSection::HollowRound { .. }));
/// ```
#[derive(Debug, Clone, Copy, PartialEq)]
pub enum ColumnSection {
    /// A solid round bar.
    Round {
        /// Diameter.
        diameter: Length,
    },
    /// A round tube.
    HollowRound {
        /// Outer diameter.
        outer: Length,
        /// Inner diameter (below the outer).
        inner: Length,
    },
    /// A solid square bar.
    Square {
        /// Side.
        side: Length,
    },
    /// A thin-walled square tube.
    HollowSquare {
        /// Outer side.
        side: Length,
        /// Wall thickness (at most a tenth of the side).
        wall: Length,
    },
}

/// A column element (see the module documentation for the frame, model and range of validity).
/// Design estimates must be proven by test.
///
/// ```
/// use gaugebook::{Column, ColumnSection, LoadComponent, SpringElement, Wrench, material};
/// use gaugebook::units::{Angle, Length};
/// use uom::si::{angle::degree, length::millimeter};
/// let mm = Length::new::<millimeter>;
/// let col = Column::new(material("4340")?, ColumnSection::Round { diameter: mm(20.0) }, mm(60.0), mm(30.0))?;
/// let e = col.surface_strain(&col.site("+y")?, &Wrench::only(LoadComponent::Fx, -50e3))?;
/// // −F/(E·A) = −50e3/(200e9·π·0.01²) = −795.8 µε; across it +0.32 times that.
/// assert!((e.normal(Angle::new::<degree>(0.0)).microstrain() + 795.8).abs() < 0.1);
/// assert!((e.normal(Angle::new::<degree>(90.0)).microstrain() - 254.6).abs() < 0.1);
/// # Ok::<(), gaugebook::PhysicsError>(())
/// ```
#[derive(Debug, Clone, PartialEq)]
pub struct Column {
    bar: Bar,
    shape: ColumnSection,
    station: f64,
}

impl Column {
    /// A column of `length` with the standard sites at `station` from the base. Errors:
    /// non-positive dimensions, inner ≥ outer, a thick-walled square tube, a station closer than
    /// one width to either end.
    ///
    /// ```
    /// # use gaugebook::{Column, ColumnSection, material};
    /// # use gaugebook::units::Length;
    /// # use uom::si::length::millimeter;
    /// # let mm = Length::new::<millimeter>;
    /// let tube = ColumnSection::HollowRound { outer: mm(20.0), inner: mm(16.0) };
    /// assert!(Column::new(material("4340")?, tube, mm(60.0), mm(30.0)).is_ok());
    /// // Gauges 10 mm from the end of a 20 mm tube: too close (Saint-Venant).
    /// assert!(Column::new(material("4340")?, tube, mm(60.0), mm(10.0)).is_err());
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn new(
        material: Material,
        section: ColumnSection,
        length: Length,
        station: Length,
    ) -> Result<Column, PhysicsError> {
        let model = "column";
        let (sec, width) = match section {
            ColumnSection::Round { diameter } => {
                let d = positive_length("column diameter", diameter)?;
                (
                    Section::Circle {
                        outer: d,
                        inner: 0.0,
                    },
                    d,
                )
            }
            ColumnSection::HollowRound { outer, inner } => {
                let d = positive_length("column outer diameter", outer)?;
                let di = positive_length("column inner diameter", inner)?;
                if di >= d {
                    return Err(PhysicsError::invalid(
                        "column inner diameter",
                        format!("{} mm", di * 1e3),
                        format!("below the outer diameter {} mm", d * 1e3),
                    ));
                }
                (
                    Section::Circle {
                        outer: d,
                        inner: di,
                    },
                    d,
                )
            }
            ColumnSection::Square { side } => {
                let b = positive_length("column side", side)?;
                (Section::Rectangle { b, h: b }, b)
            }
            ColumnSection::HollowSquare { side, wall } => {
                let b = positive_length("column side", side)?;
                let t = positive_length("column wall", wall)?;
                if t / b > THIN_WALL_MAX {
                    return Err(PhysicsError::out_of_range(
                        "thin-walled square column",
                        format!(
                            "Bredt's torsion needs wall/side ≤ {THIN_WALL_MAX}, found {:.3}",
                            t / b
                        ),
                    ));
                }
                (Section::Tube { b, h: b, t }, b)
            }
        };
        let l = positive_length("column length", length)?;
        let x = si(station);
        check_station(
            "column (Saint-Venant: one width from each end)",
            x,
            width,
            l - width,
        )?;
        Ok(Column {
            bar: Bar {
                section: sec,
                length: l,
                material,
                model,
            },
            shape: section,
            station: x,
        })
    }

    /// The cross-section.
    ///
    /// ```
    /// # use gaugebook::{Column, ColumnSection, material};
    /// # use gaugebook::units::Length;
    /// # use uom::si::length::millimeter;
    /// # let mm = Length::new::<millimeter>;
    /// let s = ColumnSection::Square { side: mm(12.0) };
    /// assert_eq!(Column::new(material("4340")?, s, mm(60.0), mm(30.0))?.section(), s);
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn section(&self) -> ColumnSection {
        self.shape
    }

    /// The cross-sectional area.
    ///
    /// ```
    /// # use gaugebook::{Column, ColumnSection, material};
    /// # use gaugebook::units::Length;
    /// # use uom::si::length::millimeter;
    /// # let mm = Length::new::<millimeter>;
    /// let c = Column::new(material("4340")?, ColumnSection::Square { side: mm(10.0) }, mm(60.0), mm(30.0))?;
    /// assert!((c.area().get::<uom::si::area::square_millimeter>() - 100.0).abs() < 1e-9);
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn area(&self) -> uom::si::f64::Area {
        uom::si::f64::Area::new::<uom::si::area::square_meter>(self.bar.section.area())
    }
}

impl SpringElement for Column {
    bar_element! {
        kind: "column",
        primary: LoadComponent::Fx,
        sites: [
            ("+y", Face::PlusY),
            ("+z", Face::PlusZ),
            ("-y", Face::MinusY),
            ("-z", Face::MinusZ),
        ]
    }
    fn stiffness(&self) -> Stiffness {
        Stiffness::Translational(self.bar.youngs_pa() * self.bar.section.area() / self.bar.length)
    }
    fn rayleigh_share(&self) -> (f64, f64) {
        (1.0 / 3.0, self.bar.mass())
    }
    fn frequency_model(&self) -> &'static str {
        "attached mass on the column's axial stiffness EA/L, plus 1/3 of the column's mass \
         (Rayleigh, linear axial displacement)"
    }
    fn buckling_load(&self) -> Option<Force> {
        let e = self.bar.youngs_pa();
        let i = self.bar.section.iyy().min(self.bar.section.izz());
        let l = self.bar.length;
        Some(Force::new::<newton>(PI * PI * e * i / (4.0 * l * l)))
    }
}
