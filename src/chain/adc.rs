//! The analogue-to-digital converter: bits, input range and its reference.

use uom::si::electric_potential::volt;

use crate::units::ElectricPotential;
use crate::{PhysicsError, check_positive};

/// Where the converter's reference comes from.
///
/// A ratiometric converter takes its reference from the bridge excitation (as a fraction of
/// it), so the code measures output over excitation and a drift of the excitation cancels; a
/// fixed reference measures volts, and a drifting excitation reads as a change of load.
///
/// ```
/// use gaugebook::AdcReference;
/// let r = AdcReference::ratiometric(0.5)?;
/// assert!(r.is_ratiometric());
/// assert!(AdcReference::ratiometric(0.0).is_err());
/// # Ok::<(), gaugebook::PhysicsError>(())
/// ```
#[derive(Clone, Copy, Debug, PartialEq)]
pub enum AdcReference {
    /// A fixed reference voltage.
    Fixed(ElectricPotential),
    /// The excitation times this fraction.
    Ratiometric(f64),
}

impl AdcReference {
    /// A fixed reference of `v` (above 0).
    ///
    /// ```
    /// use gaugebook::AdcReference;
    /// use gaugebook::units::ElectricPotential;
    /// use uom::si::electric_potential::volt;
    /// assert!(!AdcReference::fixed(ElectricPotential::new::<volt>(2.5))?.is_ratiometric());
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn fixed(v: ElectricPotential) -> Result<AdcReference, PhysicsError> {
        check_positive("converter reference", v.get::<volt>(), "V")?;
        Ok(AdcReference::Fixed(v))
    }

    /// A reference of `fraction` (above 0) times the excitation.
    ///
    /// ```
    /// assert!(gaugebook::AdcReference::ratiometric(1.0).is_ok());
    /// ```
    pub fn ratiometric(fraction: f64) -> Result<AdcReference, PhysicsError> {
        check_positive("ratiometric reference fraction", fraction, "")?;
        Ok(AdcReference::Ratiometric(fraction))
    }

    /// Whether the reference follows the excitation.
    ///
    /// ```
    /// assert!(gaugebook::AdcReference::ratiometric(1.0)?.is_ratiometric());
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn is_ratiometric(&self) -> bool {
        matches!(self, AdcReference::Ratiometric(_))
    }

    /// The reference voltage at excitation `excitation` (V), re-checked.
    pub(crate) fn volts(&self, excitation: f64) -> Result<f64, PhysicsError> {
        match *self {
            AdcReference::Fixed(v) => check_positive("converter reference", v.get::<volt>(), "V"),
            AdcReference::Ratiometric(f) => {
                Ok(check_positive("ratiometric reference fraction", f, "")? * excitation)
            }
        }
    }
}

/// A converter of `bits` bits whose input spans −V_ref … +V_ref (bipolar) or 0 … V_ref
/// (unipolar); one code step (LSB) is the span over 2^bits.
///
/// ```
/// use gaugebook::{Adc, AdcReference};
/// use gaugebook::units::ElectricPotential;
/// use uom::si::electric_potential::volt;
/// let adc = Adc::new(24, AdcReference::fixed(ElectricPotential::new::<volt>(2.5))?, true)?;
/// assert_eq!(adc.bits(), 24);
/// assert!(Adc::new(0, AdcReference::ratiometric(1.0)?, true).is_err());
/// # Ok::<(), gaugebook::PhysicsError>(())
/// ```
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct Adc {
    bits: u32,
    reference: AdcReference,
    bipolar: bool,
}

impl Adc {
    /// A converter of `bits` (1 to 32), reference `reference`, bipolar or unipolar input.
    ///
    /// ```
    /// use gaugebook::{Adc, AdcReference};
    /// assert!(Adc::new(33, AdcReference::ratiometric(1.0)?, true).is_err());
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn new(bits: u32, reference: AdcReference, bipolar: bool) -> Result<Adc, PhysicsError> {
        if !(1..=32).contains(&bits) {
            return Err(PhysicsError::invalid(
                "converter bits",
                bits,
                "a whole number from 1 to 32",
            ));
        }
        Ok(Adc {
            bits,
            reference,
            bipolar,
        })
    }

    /// Number of bits.
    ///
    /// ```
    /// use gaugebook::{Adc, AdcReference};
    /// assert_eq!(Adc::new(16, AdcReference::ratiometric(1.0)?, false)?.bits(), 16);
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn bits(&self) -> u32 {
        self.bits
    }

    /// The reference.
    ///
    /// ```
    /// use gaugebook::{Adc, AdcReference};
    /// let r = AdcReference::ratiometric(1.0)?;
    /// assert_eq!(Adc::new(16, r, false)?.reference(), r);
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn reference(&self) -> AdcReference {
        self.reference
    }

    /// Whether the input range is bipolar (±V_ref).
    ///
    /// ```
    /// use gaugebook::{Adc, AdcReference};
    /// assert!(Adc::new(16, AdcReference::ratiometric(1.0)?, true)?.is_bipolar());
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn is_bipolar(&self) -> bool {
        self.bipolar
    }

    /// Number of codes, 2^bits.
    ///
    /// ```
    /// use gaugebook::{Adc, AdcReference};
    /// assert_eq!(Adc::new(16, AdcReference::ratiometric(1.0)?, true)?.codes(), 65536.0);
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn codes(&self) -> f64 {
        2f64.powi(self.bits as i32)
    }

    /// Input span in volts at excitation `excitation` (V): 2V_ref bipolar, V_ref unipolar.
    pub(crate) fn span_volts(&self, excitation: f64) -> Result<f64, PhysicsError> {
        let v = self.reference.volts(excitation)?;
        Ok(if self.bipolar { 2.0 * v } else { v })
    }
}
