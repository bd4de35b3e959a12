//! Bridging the dynamic [`Quantity`] of scripts and the static uom types of the physics API.
//!
//! `Quantity::from(force)` and `Force::try_from(&quantity)` for every alias in `si.rs`, and for
//! [`Strain`] and [`OutputRatio`]. The conversion into a static type checks dimension and kind
//! and says what it expected: a strain cannot become a plain [`Ratio`], and an output ratio
//! cannot become a strain.
//!
//! Temperatures: a [`ThermodynamicTemperature`] accepts only a reading and a
//! [`TemperatureInterval`] only a difference, because one passed as the other is the classic
//! °C-offset mistake (see [`Kind`] for how to write a thermodynamic temperature in kelvin).

use super::si::*;
use super::table::dim_of;
use super::{Kind, OutputRatio, Quantity, Strain, UnitError};

macro_rules! bridge {
    ($ty:ident, $module:ident, $kind:expr, [$($accept:pat),+], $expected:literal) => {
        impl From<$ty> for Quantity {
            fn from(v: $ty) -> Quantity {
                Quantity::from_si(v.value, dim_of::<uom::si::$module::Dimension>(), $kind)
            }
        }

        impl TryFrom<&Quantity> for $ty {
            type Error = UnitError;
            fn try_from(q: &Quantity) -> Result<$ty, UnitError> {
                if q.dimension() == dim_of::<uom::si::$module::Dimension>()
                    && matches!(q.kind(), $($accept)|+)
                {
                    // uom stores the value in SI base units, as Quantity does.
                    Ok($ty {
                        dimension: std::marker::PhantomData,
                        units: std::marker::PhantomData,
                        value: q.si(),
                    })
                } else {
                    Err(UnitError::WrongQuantity { expected: $expected, found: q.to_string() })
                }
            }
        }

        impl TryFrom<Quantity> for $ty {
            type Error = UnitError;
            fn try_from(q: Quantity) -> Result<$ty, UnitError> {
                <$ty>::try_from(&q)
            }
        }
    };
}

use Kind::{AbsoluteTemperature, Angle as AngleKind, Plain, TemperatureInterval as Interval};

bridge!(
    Acceleration,
    acceleration,
    Plain,
    [Plain],
    "an acceleration (m/s²)"
);
bridge!(Angle, angle, AngleKind, [AngleKind], "an angle (rad, °)");
bridge!(Area, area, Plain, [Plain], "an area (m²)");
bridge!(
    ElectricCurrent,
    electric_current,
    Plain,
    [Plain],
    "a current (A)"
);
bridge!(
    ElectricPotential,
    electric_potential,
    Plain,
    [Plain],
    "a voltage (V)"
);
bridge!(
    ElectricalResistance,
    electrical_resistance,
    Plain,
    [Plain],
    "a resistance (Ω)"
);
bridge!(Energy, energy, Plain, [Plain], "an energy (J)");
bridge!(Force, force, Plain, [Plain], "a force (N)");
bridge!(Frequency, frequency, Plain, [Plain], "a frequency (Hz)");
bridge!(
    HeatFluxDensity,
    heat_flux_density,
    Plain,
    [Plain],
    "a power density (W/m²)"
);
bridge!(Length, length, Plain, [Plain], "a length (m)");
bridge!(Mass, mass, Plain, [Plain], "a mass (kg)");
bridge!(
    MassDensity,
    mass_density,
    Plain,
    [Plain],
    "a density (kg/m³)"
);
bridge!(Power, power, Plain, [Plain], "a power (W)");
bridge!(
    Pressure,
    pressure,
    Plain,
    [Plain],
    "a pressure or stress (Pa)"
);
bridge!(
    Ratio,
    ratio,
    Plain,
    [Plain],
    "a plain ratio (a number, %, ppm)"
);
bridge!(
    TemperatureCoefficient,
    temperature_coefficient,
    Plain,
    [Plain],
    "a temperature coefficient (1/K, ppm/K)"
);
bridge!(
    TemperatureInterval,
    temperature_interval,
    Interval,
    [Interval],
    "a temperature difference (K, Δ°C)"
);
bridge!(
    ThermodynamicTemperature,
    thermodynamic_temperature,
    AbsoluteTemperature,
    [AbsoluteTemperature],
    "a temperature reading (°C, °F)"
);
bridge!(Time, time, Plain, [Plain], "a time (s)");
bridge!(Torque, torque, Plain, [Plain], "a torque (N·m)");
bridge!(Velocity, velocity, Plain, [Plain], "a velocity (m/s)");
bridge!(Volume, volume, Plain, [Plain], "a volume (m³)");

macro_rules! bridge_ratio {
    ($ty:ident, $kind:ident, $expected:literal) => {
        impl From<$ty> for Quantity {
            fn from(v: $ty) -> Quantity {
                Quantity::from_si(v.value(), super::Dimension::NONE, Kind::$kind)
            }
        }

        impl TryFrom<&Quantity> for $ty {
            type Error = UnitError;
            fn try_from(q: &Quantity) -> Result<$ty, UnitError> {
                if q.dimension().is_dimensionless() && q.kind() == Kind::$kind {
                    Ok($ty::new(q.si()))
                } else {
                    Err(UnitError::WrongQuantity {
                        expected: $expected,
                        found: q.to_string(),
                    })
                }
            }
        }

        impl TryFrom<Quantity> for $ty {
            type Error = UnitError;
            fn try_from(q: Quantity) -> Result<$ty, UnitError> {
                <$ty>::try_from(&q)
            }
        }
    };
}

bridge_ratio!(Strain, Strain, "a strain (µε, ε)");
bridge_ratio!(OutputRatio, OutputRatio, "an output ratio (mV/V)");

#[cfg(test)]
mod tests {
    use super::*;
    use uom::si::{force::newton, thermodynamic_temperature::degree_celsius};

    #[test]
    fn round_trip_through_uom() {
        let q = Quantity::parse("2.5 kN").unwrap();
        let f = Force::try_from(&q).unwrap();
        assert_eq!(f.get::<newton>(), 2500.0);
        assert_eq!(Quantity::from(f).to_string(), "2.5 kN");
    }

    #[test]
    fn dimension_and_kind_are_checked() {
        let r = Quantity::parse("350 ohm").unwrap();
        let e = Force::try_from(&r).unwrap_err();
        assert_eq!(e.to_string(), "expected a force (N), found 350 Ω");
        let s = Quantity::parse("500 ue").unwrap();
        assert!(Ratio::try_from(&s).is_err());
        assert!(OutputRatio::try_from(&s).is_err());
        assert_eq!(Strain::try_from(&s).unwrap().microstrain(), 500.0);
    }

    #[test]
    fn temperatures() {
        let t = ThermodynamicTemperature::try_from(&Quantity::parse("25 degC").unwrap()).unwrap();
        assert!((t.get::<degree_celsius>() - 25.0).abs() < 1e-12);
        let e = ThermodynamicTemperature::try_from(&Quantity::parse("300 K").unwrap());
        assert_eq!(
            e.unwrap_err().to_string(),
            "expected a temperature reading (°C, °F), found 300 K"
        );
        assert!(TemperatureInterval::try_from(&Quantity::parse("25 degC").unwrap()).is_err());
        assert_eq!(Quantity::from(t).kind(), Kind::AbsoluteTemperature);
    }
}
