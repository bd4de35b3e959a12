//! Bridge excitation: a voltage across the bridge or a current through it.

use uom::si::electric_current::ampere;
use uom::si::electric_potential::volt;

use crate::units::{ElectricCurrent, ElectricPotential};
use crate::{PhysicsError, check_positive};

/// How the bridge is driven, between its corners E+ and E−.
///
/// ```
/// use gaugebook::Excitation;
/// use gaugebook::units::ElectricPotential;
/// use uom::si::electric_potential::volt;
/// let e = Excitation::voltage(ElectricPotential::new::<volt>(5.0))?;
/// assert!(Excitation::voltage(ElectricPotential::new::<volt>(0.0)).is_err());
/// # let _ = e;
/// # Ok::<(), gaugebook::PhysicsError>(())
/// ```
#[derive(Clone, Copy, Debug, PartialEq)]
pub enum Excitation {
    /// A constant voltage across E+ and E−.
    Voltage(ElectricPotential),
    /// A constant current into E+ and out of E−.
    Current(ElectricCurrent),
}

impl Excitation {
    /// Voltage excitation, checked to be finite and above zero.
    ///
    /// ```
    /// use gaugebook::Excitation;
    /// use gaugebook::units::ElectricPotential;
    /// use uom::si::electric_potential::volt;
    /// assert!(Excitation::voltage(ElectricPotential::new::<volt>(f64::NAN)).is_err());
    /// ```
    pub fn voltage(v: ElectricPotential) -> Result<Excitation, PhysicsError> {
        check_positive("excitation voltage", v.get::<volt>(), "V")?;
        Ok(Excitation::Voltage(v))
    }

    /// Current excitation, checked to be finite and above zero.
    ///
    /// ```
    /// use gaugebook::Excitation;
    /// use gaugebook::units::ElectricCurrent;
    /// use uom::si::electric_current::milliampere;
    /// assert!(Excitation::current(ElectricCurrent::new::<milliampere>(10.0)).is_ok());
    /// ```
    pub fn current(i: ElectricCurrent) -> Result<Excitation, PhysicsError> {
        check_positive("excitation current", i.get::<ampere>(), "A")?;
        Ok(Excitation::Current(i))
    }

    /// Re-checks a value that may have been built directly from the public variants.
    pub(crate) fn checked(self) -> Result<Excitation, PhysicsError> {
        match self {
            Excitation::Voltage(v) => Excitation::voltage(v),
            Excitation::Current(i) => Excitation::current(i),
        }
    }
}
