//! The bridge amplifier: voltage gain and input-referred noise.

use uom::si::electric_potential::volt;
use uom::si::frequency::hertz;

use crate::units::{ElectricPotential, Frequency};
use crate::{PhysicsError, check_finite, check_positive};

/// Input-referred noise of the amplifier as an rms voltage, given either directly or as a white
/// noise density (V/√Hz) over a noise-equivalent bandwidth: v_rms = e_n·√B (common practice).
///
/// ```
/// use gaugebook::InputNoise;
/// use gaugebook::units::Frequency;
/// use uom::si::{frequency::hertz, electric_potential::nanovolt};
/// // 10 nV/√Hz over 100 Hz is 100 nV rms.
/// let n = InputNoise::from_density(10.0e-9, Frequency::new::<hertz>(100.0))?;
/// assert!((n.rms().get::<nanovolt>() - 100.0).abs() < 1e-9);
/// # Ok::<(), gaugebook::PhysicsError>(())
/// ```
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct InputNoise {
    rms: ElectricPotential,
}

impl InputNoise {
    /// No amplifier noise (only the converter's quantisation remains).
    ///
    /// ```
    /// use uom::si::electric_potential::volt;
    /// assert_eq!(gaugebook::InputNoise::none().rms().get::<volt>(), 0.0);
    /// ```
    pub fn none() -> InputNoise {
        InputNoise {
            rms: ElectricPotential::new::<volt>(0.0),
        }
    }

    /// Noise given as an rms voltage at the amplifier input (0 V or more).
    ///
    /// ```
    /// use gaugebook::InputNoise;
    /// use gaugebook::units::ElectricPotential;
    /// use uom::si::electric_potential::nanovolt;
    /// assert!(InputNoise::from_rms(ElectricPotential::new::<nanovolt>(-5.0)).is_err());
    /// ```
    pub fn from_rms(rms: ElectricPotential) -> Result<InputNoise, PhysicsError> {
        let v = check_finite("input noise", rms.get::<volt>(), "V")?;
        if v < 0.0 {
            return Err(PhysicsError::invalid(
                "input noise",
                format!("{v} V"),
                "a value of 0 V or more",
            ));
        }
        Ok(InputNoise { rms })
    }

    /// Noise given as a white density `volts_per_root_hz` (V/√Hz, 0 or more) over the
    /// noise-equivalent bandwidth `bandwidth` (above 0).
    ///
    /// ```
    /// use gaugebook::InputNoise;
    /// use gaugebook::units::Frequency;
    /// use uom::si::frequency::hertz;
    /// assert!(InputNoise::from_density(1e-8, Frequency::new::<hertz>(0.0)).is_err());
    /// ```
    pub fn from_density(
        volts_per_root_hz: f64,
        bandwidth: Frequency,
    ) -> Result<InputNoise, PhysicsError> {
        let b = check_positive("noise bandwidth", bandwidth.get::<hertz>(), "Hz")?;
        InputNoise::from_rms(ElectricPotential::new::<volt>(volts_per_root_hz * b.sqrt()))
    }

    /// The rms noise voltage at the amplifier input.
    ///
    /// ```
    /// use gaugebook::InputNoise;
    /// use gaugebook::units::ElectricPotential;
    /// use uom::si::electric_potential::nanovolt;
    /// let n = InputNoise::from_rms(ElectricPotential::new::<nanovolt>(50.0))?;
    /// assert!((n.rms().get::<nanovolt>() - 50.0).abs() < 1e-9);
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn rms(&self) -> ElectricPotential {
        self.rms
    }
}

/// A bridge amplifier: voltage gain G (above 0) and input-referred noise.
///
/// ```
/// use gaugebook::{Amplifier, InputNoise};
/// let a = Amplifier::new(128.0, InputNoise::none())?;
/// assert_eq!(a.gain(), 128.0);
/// assert!(Amplifier::new(0.0, InputNoise::none()).is_err());
/// # Ok::<(), gaugebook::PhysicsError>(())
/// ```
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct Amplifier {
    gain: f64,
    noise: InputNoise,
}

impl Amplifier {
    /// An amplifier of gain `gain` and input noise `noise`.
    ///
    /// ```
    /// use gaugebook::{Amplifier, InputNoise};
    /// assert!(Amplifier::new(f64::NAN, InputNoise::none()).is_err());
    /// ```
    pub fn new(gain: f64, noise: InputNoise) -> Result<Amplifier, PhysicsError> {
        check_positive("amplifier gain", gain, "")?;
        Ok(Amplifier { gain, noise })
    }

    /// The voltage gain.
    ///
    /// ```
    /// use gaugebook::{Amplifier, InputNoise};
    /// assert_eq!(Amplifier::new(64.0, InputNoise::none())?.gain(), 64.0);
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn gain(&self) -> f64 {
        self.gain
    }

    /// The input-referred noise.
    ///
    /// ```
    /// use gaugebook::{Amplifier, InputNoise};
    /// assert_eq!(Amplifier::new(64.0, InputNoise::none())?.noise(), InputNoise::none());
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn noise(&self) -> InputNoise {
        self.noise
    }
}
