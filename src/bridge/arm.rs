//! One arm of a four-arm bridge: a fixed resistor or a gauge, optionally with a trim resistor
//! in series or in parallel with it.

use std::fmt;

use uom::si::electrical_resistance::ohm;

use crate::units::ElectricalResistance;
use crate::{Gauge, PhysicsError, Strain, check_finite, check_positive};

/// Which arm of a [`WheatstoneBridge`](crate::WheatstoneBridge) (numbering in its doc comment).
///
/// ```
/// use gaugebook::ArmId;
/// assert_eq!(ArmId::from_number(3)?, ArmId::R3);
/// assert_eq!(ArmId::R3.number(), 3);
/// assert!(ArmId::from_number(5).is_err());
/// # Ok::<(), gaugebook::PhysicsError>(())
/// ```
#[derive(Clone, Copy, Debug, PartialEq, Eq, Hash)]
pub enum ArmId {
    /// E− to S+.
    R1,
    /// S+ to E+.
    R2,
    /// E+ to S−.
    R3,
    /// S− to E−.
    R4,
}

impl ArmId {
    /// All four arms in order.
    ///
    /// ```
    /// assert_eq!(gaugebook::ArmId::ALL[3], gaugebook::ArmId::R4);
    /// ```
    pub const ALL: [ArmId; 4] = [ArmId::R1, ArmId::R2, ArmId::R3, ArmId::R4];

    /// The arm numbered `n` (1 to 4).
    ///
    /// ```
    /// assert!(gaugebook::ArmId::from_number(0).is_err());
    /// ```
    pub fn from_number(n: i64) -> Result<ArmId, PhysicsError> {
        match n {
            1 => Ok(ArmId::R1),
            2 => Ok(ArmId::R2),
            3 => Ok(ArmId::R3),
            4 => Ok(ArmId::R4),
            _ => Err(PhysicsError::invalid(
                "bridge arm",
                n,
                "an arm number from 1 to 4",
            )),
        }
    }

    /// The arm's number, 1 to 4.
    ///
    /// ```
    /// assert_eq!(gaugebook::ArmId::R1.number(), 1);
    /// ```
    pub fn number(self) -> usize {
        self.index() + 1
    }

    pub(crate) fn index(self) -> usize {
        match self {
            ArmId::R1 => 0,
            ArmId::R2 => 1,
            ArmId::R3 => 2,
            ArmId::R4 => 3,
        }
    }
}

impl fmt::Display for ArmId {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        write!(f, "R{}", self.number())
    }
}

/// How a trim resistor is connected to an arm's element.
///
/// ```
/// use gaugebook::TrimKind;
/// assert_ne!(TrimKind::Series, TrimKind::Parallel);
/// ```
#[derive(Clone, Copy, Debug, PartialEq, Eq, Hash)]
pub enum TrimKind {
    /// In series: raises the arm's resistance.
    Series,
    /// In parallel (a shunt across the element): lowers the arm's resistance.
    Parallel,
}

/// A trim resistor and how it is connected.
///
/// ```
/// use gaugebook::{Trim, TrimKind};
/// use gaugebook::units::ElectricalResistance;
/// use uom::si::electrical_resistance::ohm;
/// let t = Trim::new(TrimKind::Series, ElectricalResistance::new::<ohm>(0.5))?;
/// assert_eq!(t.kind(), TrimKind::Series);
/// assert_eq!(t.resistance().get::<ohm>(), 0.5);
/// # Ok::<(), gaugebook::PhysicsError>(())
/// ```
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct Trim {
    kind: TrimKind,
    resistance: ElectricalResistance,
}

impl Trim {
    /// A trim of `kind` and value `resistance` (finite, above zero).
    ///
    /// ```
    /// use gaugebook::{Trim, TrimKind};
    /// use gaugebook::units::ElectricalResistance;
    /// use uom::si::electrical_resistance::ohm;
    /// assert!(Trim::new(TrimKind::Parallel, ElectricalResistance::new::<ohm>(-1.0)).is_err());
    /// ```
    pub fn new(kind: TrimKind, resistance: ElectricalResistance) -> Result<Trim, PhysicsError> {
        check_positive("trim resistance", resistance.get::<ohm>(), "Ω")?;
        Ok(Trim { kind, resistance })
    }

    /// Series or parallel.
    ///
    /// ```
    /// use gaugebook::{Arm, Trim, TrimKind};
    /// use gaugebook::units::ElectricalResistance;
    /// use uom::si::electrical_resistance::ohm;
    /// let r = ElectricalResistance::new::<ohm>(350.0);
    /// assert_eq!(Trim::new(TrimKind::Parallel, r)?.kind(), TrimKind::Parallel);
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn kind(&self) -> TrimKind {
        self.kind
    }

    /// The trim resistor's value.
    ///
    /// ```
    /// use gaugebook::{Arm, Trim, TrimKind};
    /// use gaugebook::units::ElectricalResistance;
    /// use uom::si::electrical_resistance::ohm;
    /// let r = ElectricalResistance::new::<ohm>(350.0);
    /// assert_eq!(Trim::new(TrimKind::Series, r)?.resistance(), r);
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn resistance(&self) -> ElectricalResistance {
        self.resistance
    }

    /// The combined resistance of an element `element` (Ω) with this trim.
    pub(crate) fn combine(&self, element: f64) -> f64 {
        let t = self.resistance.get::<ohm>();
        match self.kind {
            TrimKind::Series => element + t,
            TrimKind::Parallel => element * t / (element + t),
        }
    }
}

/// One bridge arm: an element (a fixed resistor, or a gauge of nominal resistance R with a
/// relative change ΔR/R) and an optional trim resistor.
///
/// ```
/// use gaugebook::Arm;
/// use gaugebook::units::ElectricalResistance;
/// use uom::si::electrical_resistance::ohm;
/// let a = Arm::gauge(ElectricalResistance::new::<ohm>(350.0), 2.0e-3)?;
/// assert!((a.resistance().get::<ohm>() - 350.7).abs() < 1e-12);
/// # Ok::<(), gaugebook::PhysicsError>(())
/// ```
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct Arm {
    nominal: ElectricalResistance,
    relative_change: f64,
    is_gauge: bool,
    trim: Option<Trim>,
}

impl Arm {
    /// A fixed resistor.
    ///
    /// ```
    /// use gaugebook::Arm;
    /// use gaugebook::units::ElectricalResistance;
    /// use uom::si::electrical_resistance::ohm;
    /// assert!(!Arm::fixed(ElectricalResistance::new::<ohm>(350.0))?.is_gauge());
    /// assert!(Arm::fixed(ElectricalResistance::new::<ohm>(0.0)).is_err());
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn fixed(resistance: ElectricalResistance) -> Result<Arm, PhysicsError> {
        check_positive("arm resistance", resistance.get::<ohm>(), "Ω")?;
        Ok(Arm {
            nominal: resistance,
            relative_change: 0.0,
            is_gauge: false,
            trim: None,
        })
    }

    /// A gauge of nominal resistance `nominal` changed by `relative_change` = ΔR/R.
    ///
    /// Errors unless the nominal is above zero and 1 + ΔR/R > 0.
    ///
    /// ```
    /// use gaugebook::Arm;
    /// use gaugebook::units::ElectricalResistance;
    /// use uom::si::electrical_resistance::ohm;
    /// assert!(Arm::gauge(ElectricalResistance::new::<ohm>(350.0), -1.0).is_err());
    /// ```
    pub fn gauge(nominal: ElectricalResistance, relative_change: f64) -> Result<Arm, PhysicsError> {
        check_positive("gauge resistance", nominal.get::<ohm>(), "Ω")?;
        check_finite("gauge ΔR/R", relative_change, "")?;
        if relative_change <= -1.0 {
            return Err(PhysicsError::invalid(
                "gauge ΔR/R",
                relative_change,
                "a value above -1",
            ));
        }
        Ok(Arm {
            nominal,
            relative_change,
            is_gauge: true,
            trim: None,
        })
    }

    /// The arm of `gauge` under axial and transverse strain (ΔR/R from
    /// [`Gauge::relative_change`]).
    ///
    /// ```
    /// use gaugebook::{Arm, Gauge, Strain};
    /// use gaugebook::units::ElectricalResistance;
    /// use uom::si::electrical_resistance::ohm;
    /// let g = Gauge::new(ElectricalResistance::new::<ohm>(120.0), 2.0)?;
    /// let a = Arm::strained(&g, Strain::from_microstrain(1000.0), Strain::ZERO)?;
    /// assert!((a.relative_change() - 2.0e-3).abs() < 1e-15);
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn strained(gauge: &Gauge, axial: Strain, transverse: Strain) -> Result<Arm, PhysicsError> {
        Arm::gauge(gauge.resistance(), gauge.relative_change(axial, transverse))
    }

    /// The same arm with trim `trim` (replacing any trim it had).
    ///
    /// ```
    /// use gaugebook::{Arm, Trim, TrimKind};
    /// use gaugebook::units::ElectricalResistance;
    /// use uom::si::electrical_resistance::ohm;
    /// let a = Arm::fixed(ElectricalResistance::new::<ohm>(100.0))?
    ///     .with_trim(Trim::new(TrimKind::Parallel, ElectricalResistance::new::<ohm>(100.0))?);
    /// assert!((a.resistance().get::<ohm>() - 50.0).abs() < 1e-12);
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn with_trim(mut self, trim: Trim) -> Arm {
        self.trim = Some(trim);
        self
    }

    /// The same arm without trim.
    ///
    /// ```
    /// use gaugebook::Arm;
    /// use gaugebook::units::ElectricalResistance;
    /// use uom::si::electrical_resistance::ohm;
    /// assert!(Arm::fixed(ElectricalResistance::new::<ohm>(100.0))?.without_trim().trim().is_none());
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn without_trim(mut self) -> Arm {
        self.trim = None;
        self
    }

    /// Whether the element is a gauge.
    ///
    /// ```
    /// use gaugebook::{Arm, Trim, TrimKind};
    /// use gaugebook::units::ElectricalResistance;
    /// use uom::si::electrical_resistance::ohm;
    /// let r = ElectricalResistance::new::<ohm>(350.0);
    /// assert!(Arm::gauge(r, 0.0)?.is_gauge());
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn is_gauge(&self) -> bool {
        self.is_gauge
    }

    /// The element's nominal resistance (a gauge's unstrained resistance).
    ///
    /// ```
    /// use gaugebook::{Arm, Trim, TrimKind};
    /// use gaugebook::units::ElectricalResistance;
    /// use uom::si::electrical_resistance::ohm;
    /// let r = ElectricalResistance::new::<ohm>(350.0);
    /// assert_eq!(Arm::gauge(r, 0.01)?.nominal(), r);
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn nominal(&self) -> ElectricalResistance {
        self.nominal
    }

    /// ΔR/R of the element (0 for a fixed resistor).
    ///
    /// ```
    /// use gaugebook::{Arm, Trim, TrimKind};
    /// use gaugebook::units::ElectricalResistance;
    /// use uom::si::electrical_resistance::ohm;
    /// let r = ElectricalResistance::new::<ohm>(350.0);
    /// assert_eq!(Arm::fixed(r)?.relative_change(), 0.0);
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn relative_change(&self) -> f64 {
        self.relative_change
    }

    /// The trim, if any.
    ///
    /// ```
    /// use gaugebook::{Arm, Trim, TrimKind};
    /// use gaugebook::units::ElectricalResistance;
    /// use uom::si::electrical_resistance::ohm;
    /// let r = ElectricalResistance::new::<ohm>(350.0);
    /// assert!(Arm::fixed(r)?.trim().is_none());
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn trim(&self) -> Option<Trim> {
        self.trim
    }

    /// The element's present resistance R·(1 + ΔR/R), without trim.
    ///
    /// ```
    /// use gaugebook::Arm;
    /// use gaugebook::units::ElectricalResistance;
    /// use uom::si::electrical_resistance::ohm;
    /// let a = Arm::gauge(ElectricalResistance::new::<ohm>(100.0), 0.01)?;
    /// assert!((a.element_resistance().get::<ohm>() - 101.0).abs() < 1e-12);
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn element_resistance(&self) -> ElectricalResistance {
        ElectricalResistance::new::<ohm>(self.element_ohms())
    }

    /// The arm's total resistance: element with trim.
    ///
    /// ```
    /// use gaugebook::{Arm, Trim, TrimKind};
    /// use gaugebook::units::ElectricalResistance;
    /// use uom::si::electrical_resistance::ohm;
    /// let r = ElectricalResistance::new::<ohm>(350.0);
    /// let a = Arm::fixed(r)?.with_trim(Trim::new(TrimKind::Series, ElectricalResistance::new::<ohm>(1.0))?);
    /// assert!((a.resistance().get::<ohm>() - 351.0).abs() < 1e-12);
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn resistance(&self) -> ElectricalResistance {
        ElectricalResistance::new::<ohm>(self.ohms())
    }

    pub(crate) fn element_ohms(&self) -> f64 {
        self.nominal.get::<ohm>() * (1.0 + self.relative_change)
    }

    pub(crate) fn ohms(&self) -> f64 {
        let e = self.element_ohms();
        match self.trim {
            Some(t) => t.combine(e),
            None => e,
        }
    }
}
