//! uom-typed aliases for the Rust API of the physics layer.
//!
//! Physics functions take and return these, so a resistance cannot be passed where a voltage is
//! expected. Values are stored in SI base units (uom's design: store SI, convert at the edges).

pub use uom::si::f64::{
    Acceleration, Angle, Area, ElectricCurrent, ElectricPotential, ElectricalResistance, Energy,
    Force, Frequency, HeatFluxDensity, Length, Mass, MassDensity, Power, Pressure, Ratio,
    TemperatureCoefficient, TemperatureInterval, ThermodynamicTemperature, Time, Torque, Velocity,
    Volume,
};

/// Stress is a pressure in uom's dimension system (N/m²); the alias says what is meant.
///
/// ```
/// use gaugebook::units::Stress;
/// use uom::si::pressure::megapascal;
/// let s = Stress::new::<megapascal>(250.0);
/// assert_eq!(s.get::<megapascal>(), 250.0);
/// ```
pub type Stress = Pressure;

/// Young's and shear moduli are pressures too (N/m²).
pub type Modulus = Pressure;

/// Power per grid area (W/m²): uom's heat-flux density has that dimension.
pub type PowerDensity = HeatFluxDensity;
