//! uom-typed aliases for the Rust API of the physics layer.
//!
//! Physics functions take and return these, so a resistance cannot be passed where a voltage is
//! expected. Values are stored in SI base units (uom's design: store SI, convert at the edges).

/// The uom quantities of the physics API, in SI base units.
///
/// ```
/// use gaugebook::units::{ElectricalResistance, Quantity};
/// use uom::si::electrical_resistance::ohm;
/// let r = ElectricalResistance::new::<ohm>(350.0);
/// assert_eq!(Quantity::from(r).to_string(), "350 Ω");
/// ```
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
///
/// ```
/// use gaugebook::units::Modulus;
/// use uom::si::pressure::gigapascal;
/// let e = Modulus::new::<gigapascal>(200.0);
/// assert_eq!(e.value, 200e9);
/// ```
pub type Modulus = Pressure;

/// Power per grid area (W/m²): uom's heat-flux density has that dimension.
///
/// ```
/// use gaugebook::units::PowerDensity;
/// use uom::si::heat_flux_density::watt_per_square_meter;
/// let p = PowerDensity::new::<watt_per_square_meter>(1550.0);
/// assert_eq!(p.value, 1550.0);
/// ```
pub type PowerDensity = HeatFluxDensity;
