//! Kinds: quantities of one dimension that must still not be mixed.
//!
//! Strain (m/m), bridge output ratio (V/V) and a plain ratio are all dimensionless, and an
//! absolute temperature and a temperature difference share the kelvin. uom separates angle from
//! ratio by a kind; Gaugebook does the same for these.

use std::fmt;

/// What a quantity means beyond its dimension.
///
/// Adding or comparing two quantities needs equal dimensions *and* compatible kinds
/// (see [`Kind::combine_additive`]); multiplying drops the kind unless one side is plain.
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
    /// A thermodynamic temperature on an absolute scale (K, °C, °F as a reading).
    AbsoluteTemperature,
    /// A difference of temperatures (K, Δ°C, Δ°F).
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

    /// The kind of a product or quotient with a plain factor on the other side: a strain times a
    /// number is still a strain; a strain times a length is an ordinary quantity.
    ///
    /// ```
    /// use gaugebook::Kind;
    /// assert_eq!(Kind::Strain.combine_multiplicative(Kind::Plain), Kind::Strain);
    /// assert_eq!(Kind::Strain.combine_multiplicative(Kind::Strain), Kind::Plain);
    /// ```
    pub fn combine_multiplicative(self, other: Kind) -> Kind {
        use Kind::*;
        match (self, other) {
            // An absolute temperature scaled is no longer a reading on a scale; treat it as plain
            // K so that, e.g., `T / 2` cannot silently keep a °C offset.
            (AbsoluteTemperature, _) | (_, AbsoluteTemperature) => Plain,
            (k, Plain) | (Plain, k) => k,
            _ => Plain,
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
