//! Kinds: quantities of one dimension that must still not be mixed.
//!
//! Strain (m/m), bridge output ratio (V/V) and a plain ratio are all dimensionless, and an
//! absolute temperature and a temperature difference share the kelvin. uom separates angle from
//! ratio by a kind; Gaugebook does the same for these.

use std::fmt;

use super::Dimension;

/// What a quantity means beyond its dimension.
///
/// The rules, all enforced by [`Quantity`](crate::Quantity):
///
/// - **Adding, subtracting, comparing** need equal dimensions and, by
///   [`Kind::combine_additive`], equal kinds: µε + mV/V, µε + a plain number, rad + a plain
///   number are errors; % + a plain number is fine (both plain). Temperatures follow their own
///   rule below.
/// - **Multiplying and dividing** ([`Kind::combine_multiplicative`], [`Kind::combine_quotient`])
///   keep a strain, output ratio or angle through plain factors (2 × 500 µε is a strain,
///   µε/K × K is a strain), and give a plain number for strain/strain, (mV/V)/µε, 1/ε.
///   [`Kind::fit`] then drops a kind that no longer suits the dimension (strain × length is a
///   plain length).
/// - **Temperatures.** A reading on a scale (`°C`, `°F`, written `degC`, `degF`) is an
///   [`AbsoluteTemperature`](Kind::AbsoluteTemperature); a difference (`K`, `Δ°C`, `Δ°F`,
///   written `delta_degC`, `delta_degF`) is a
///   [`TemperatureInterval`](Kind::TemperatureInterval). Reading ± difference is a reading;
///   reading − reading is a difference; reading + reading is refused. The kelvin is the unit of
///   differences. A reading may be expressed in kelvin ([`Quantity::to`]: 25 °C is 298.15 K,
///   still a reading), but a difference is never turned into a reading by a conversion:
///   `5 K` to °C is refused, because nothing tells 5 K from 5 Δ°C once parsed. A thermodynamic
///   temperature in kelvin is built with `Quantity::from_si(t, Dimension::TEMPERATURE,
///   Kind::AbsoluteTemperature)` or `.with_kind(Kind::AbsoluteTemperature)`, or written in °C.
///   Inside a compound unit a scale means a difference (`ppm/°C`).
///
/// [`Quantity::to`]: crate::Quantity::to
///
/// ```
/// use gaugebook::Kind;
/// assert_eq!(Kind::Strain.combine_additive(Kind::Strain), Some(Kind::Strain));
/// assert_eq!(Kind::Strain.combine_additive(Kind::OutputRatio), None);
/// ```
#[derive(Clone, Copy, Debug, PartialEq, Eq, Hash, Default)]
#[non_exhaustive]
pub enum Kind {
    /// An ordinary quantity or plain ratio (%, ppm, a bare number).
    #[default]
    Plain,
    /// Mechanical strain, m/m (ε, µε).
    Strain,
    /// Bridge output over excitation, V/V (mV/V).
    OutputRatio,
    /// Plane angle (rad, °).
    Angle,
    /// A temperature reading on a scale (°C, °F; shown in K on request).
    AbsoluteTemperature,
    /// A difference of temperatures, or any kelvin value (K, Δ°C, Δ°F).
    TemperatureInterval,
}

impl Kind {
    /// The kind of `a + b` or `a - b`, or `None` when the two must not be added.
    ///
    /// Rules: equal kinds add to themselves; an absolute temperature plus or minus an interval
    /// stays absolute; everything else is refused. Subtracting two absolute temperatures gives an
    /// interval, which [`Kind::combine_difference`] handles.
    ///
    /// ```
    /// use gaugebook::Kind;
    /// assert_eq!(
    ///     Kind::AbsoluteTemperature.combine_additive(Kind::TemperatureInterval),
    ///     Some(Kind::AbsoluteTemperature)
    /// );
    /// assert_eq!(Kind::AbsoluteTemperature.combine_additive(Kind::AbsoluteTemperature), None);
    /// ```
    pub fn combine_additive(self, other: Kind) -> Option<Kind> {
        use Kind::*;
        match (self, other) {
            (AbsoluteTemperature, AbsoluteTemperature) => None,
            (a, b) if a == b => Some(a),
            (AbsoluteTemperature, TemperatureInterval)
            | (TemperatureInterval, AbsoluteTemperature) => Some(AbsoluteTemperature),
            _ => None,
        }
    }

    /// The kind of `a - b`: like [`Kind::combine_additive`], except that the difference of two
    /// absolute temperatures is an interval and an interval minus an absolute temperature is refused.
    ///
    /// ```
    /// use gaugebook::Kind;
    /// assert_eq!(
    ///     Kind::AbsoluteTemperature.combine_difference(Kind::AbsoluteTemperature),
    ///     Some(Kind::TemperatureInterval)
    /// );
    /// ```
    pub fn combine_difference(self, other: Kind) -> Option<Kind> {
        use Kind::*;
        match (self, other) {
            (AbsoluteTemperature, AbsoluteTemperature) => Some(TemperatureInterval),
            (TemperatureInterval, AbsoluteTemperature) => None,
            _ => self.combine_additive(other),
        }
    }

    /// The kind of a product `a · b` (before [`Kind::fit`] checks it against the product's
    /// dimension).
    ///
    /// Rules: a strain, output ratio or angle times a plain factor keeps its kind (a strain
    /// times 2 is a strain; µε/K times K is a strain); two such kinds multiply to a plain number
    /// (strain², µε·mV/V). A temperature (absolute or interval) counts as a plain factor
    /// measured in kelvin, except that a temperature times a plain number is still a
    /// temperature difference in kelvin (2 × 5 K = 10 K); an absolute reading scaled is no
    /// longer a reading on its scale, so `T × 2` is a kelvin value, never a doubled °C.
    ///
    /// ```
    /// use gaugebook::Kind;
    /// assert_eq!(Kind::Strain.combine_multiplicative(Kind::Plain), Kind::Strain);
    /// assert_eq!(Kind::Strain.combine_multiplicative(Kind::Strain), Kind::Plain);
    /// assert_eq!(Kind::Strain.combine_multiplicative(Kind::TemperatureInterval), Kind::Strain);
    /// assert_eq!(
    ///     Kind::AbsoluteTemperature.combine_multiplicative(Kind::Plain),
    ///     Kind::TemperatureInterval
    /// );
    /// ```
    pub fn combine_multiplicative(self, other: Kind) -> Kind {
        use Kind::*;
        match (self.as_factor(), other.as_factor()) {
            (TemperatureInterval, TemperatureInterval)
            | (TemperatureInterval, Plain)
            | (Plain, TemperatureInterval) => TemperatureInterval,
            (k, TemperatureInterval) | (TemperatureInterval, k) => k,
            (k, Plain) | (Plain, k) => k,
            _ => Plain,
        }
    }

    /// The kind of a quotient `a / b` (before [`Kind::fit`]).
    ///
    /// Like [`Kind::combine_multiplicative`], except that a plain number divided by a strain,
    /// output ratio or angle is plain: a gauge factor (ΔR/R)/ε is a number, not a strain.
    /// A kind divided by itself is plain (strain/strain).
    ///
    /// ```
    /// use gaugebook::Kind;
    /// assert_eq!(Kind::Strain.combine_quotient(Kind::Plain), Kind::Strain);
    /// assert_eq!(Kind::Plain.combine_quotient(Kind::Strain), Kind::Plain);
    /// assert_eq!(Kind::Strain.combine_quotient(Kind::Strain), Kind::Plain);
    /// ```
    pub fn combine_quotient(self, other: Kind) -> Kind {
        use Kind::*;
        match (self.as_factor(), other.as_factor()) {
            (Plain, Strain | OutputRatio | Angle) => Plain,
            (TemperatureInterval, Strain | OutputRatio | Angle) => TemperatureInterval,
            (a, b) => a.combine_multiplicative(b),
        }
    }

    /// Temperature kinds count as kelvin values inside products.
    fn as_factor(self) -> Kind {
        match self {
            Kind::AbsoluteTemperature => Kind::TemperatureInterval,
            k => k,
        }
    }

    /// The kind a quantity of dimension `dim` can carry: `self` when it fits, else the nearest
    /// kind that does.
    ///
    /// Rules: the two temperature kinds belong to the dimension K alone, and a plain quantity of
    /// dimension K is a temperature difference (a kelvin value). Strain, output ratio and angle
    /// survive only in dimensions built from time and temperature (µε, µε/K, (mV/V)/K, rad/s);
    /// a strain times a length is a plain length, a strain times a modulus a plain stress.
    ///
    /// ```
    /// use gaugebook::{Dimension, Kind};
    /// assert_eq!(Kind::Plain.fit(Dimension::TEMPERATURE), Kind::TemperatureInterval);
    /// assert_eq!(Kind::Strain.fit(Dimension::LENGTH), Kind::Plain);
    /// assert_eq!(Kind::Strain.fit(Dimension::TEMPERATURE.powi(-1)), Kind::Strain);
    /// ```
    pub fn fit(self, dim: Dimension) -> Kind {
        use Kind::*;
        let temperature_only = dim == Dimension::TEMPERATURE;
        match self {
            Plain | AbsoluteTemperature | TemperatureInterval if temperature_only => {
                if self == Plain {
                    TemperatureInterval
                } else {
                    self
                }
            }
            AbsoluteTemperature | TemperatureInterval => Plain,
            Strain | OutputRatio | Angle => {
                // Exponents of length, mass, current, amount and luminous intensity must be 0.
                let d = dim.0;
                if d[0] == 0 && d[1] == 0 && d[3] == 0 && d[5] == 0 && d[6] == 0 {
                    self
                } else {
                    Plain
                }
            }
            Plain => Plain,
        }
    }
}

impl fmt::Display for Kind {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        f.write_str(match self {
            Kind::Plain => "plain",
            Kind::Strain => "strain",
            Kind::OutputRatio => "output ratio",
            Kind::Angle => "angle",
            Kind::AbsoluteTemperature => "temperature",
            Kind::TemperatureInterval => "temperature difference",
        })
    }
}
