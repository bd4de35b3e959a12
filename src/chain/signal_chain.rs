//! The signal chain from bridge to code: excitation, amplifier, converter. Resolution in
//! output ratio, strain and load; noise, effective bits and noise-free counts.
//!
//! Definitions used here (state them beside any figure quoted from this module):
//! - *LSB* (resolution): one converter step referred to the bridge output, span/(2^N·G), and
//!   over the excitation in V/V.
//! - *Quantisation noise*: LSB/√12 rms, the standard result for a uniform quantiser (Bennett,
//!   "Spectra of quantized signals", Bell Syst. Tech. J. 27, 1948; Widrow & Kollár,
//!   *Quantization Noise*, 2008; both from memory). It is added in quadrature to the
//!   amplifier's input-referred noise to give the total rms noise σ.
//! - *Effective resolution (effective bits)*: log₂(span/σ), the input span over the rms noise,
//!   both at the input (common practice). This is not IEEE 1241's ENOB, which is defined from
//!   the SINAD of a full-scale sine (from memory).
//! - *Noise-free resolution*: log₂(span/(6.6σ)); 6.6σ is taken as the peak-to-peak noise,
//!   since a Gaussian stays within ±3.3σ for about 99.9 % of samples (common practice).
//! - *Noise-free counts* over a signal range (for example the rated output): range/(6.6σ).

use uom::si::electric_potential::volt;
use uom::si::force::newton;

use super::{Adc, Amplifier};
use crate::units::{ElectricPotential, Force};
use crate::{Arrangement, OutputRatio, PhysicsError, Strain, check_finite, check_positive};

/// Peak-to-peak over rms noise taken for noise-free figures (common practice, see the module
/// documentation).
///
/// ```
/// assert_eq!(gaugebook::PEAK_TO_PEAK_PER_RMS, 6.6);
/// ```
pub const PEAK_TO_PEAK_PER_RMS: f64 = 6.6;

/// Excitation, amplifier and converter.
///
/// ```
/// use gaugebook::{Adc, AdcReference, Amplifier, InputNoise, SignalChain};
/// use gaugebook::units::ElectricPotential;
/// use uom::si::electric_potential::volt;
/// let chain = SignalChain::new(
///     ElectricPotential::new::<volt>(5.0),
///     Amplifier::new(128.0, InputNoise::none())?,
///     Adc::new(24, AdcReference::ratiometric(1.0)?, true)?,
/// )?;
/// // ±5 V/128 over 2^24 codes, per 5 V of excitation.
/// let r = chain.resolution()?;
/// assert!((r.value() - 2.0 / (128.0 * 16777216.0)).abs() < 1e-24);
/// # Ok::<(), gaugebook::PhysicsError>(())
/// ```
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct SignalChain {
    excitation: ElectricPotential,
    amplifier: Amplifier,
    adc: Adc,
}

impl SignalChain {
    /// A chain with bridge excitation `excitation` (above 0).
    ///
    /// ```
    /// use gaugebook::{Adc, AdcReference, Amplifier, InputNoise, SignalChain};
    /// use gaugebook::units::ElectricPotential;
    /// use uom::si::electric_potential::volt;
    /// let a = Amplifier::new(1.0, InputNoise::none())?;
    /// let adc = Adc::new(16, AdcReference::ratiometric(1.0)?, true)?;
    /// assert!(SignalChain::new(ElectricPotential::new::<volt>(0.0), a, adc).is_err());
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn new(
        excitation: ElectricPotential,
        amplifier: Amplifier,
        adc: Adc,
    ) -> Result<SignalChain, PhysicsError> {
        check_positive("excitation voltage", excitation.get::<volt>(), "V")?;
        Ok(SignalChain {
            excitation,
            amplifier,
            adc,
        })
    }

    /// The excitation.
    ///
    /// ```
    /// use gaugebook::{Adc, AdcReference, Amplifier, InputNoise, SignalChain};
    /// use gaugebook::units::ElectricPotential;
    /// use uom::si::electric_potential::volt;
    /// let c = SignalChain::new(ElectricPotential::new::<volt>(10.0), Amplifier::new(1.0, InputNoise::none())?,
    ///     Adc::new(16, AdcReference::ratiometric(1.0)?, true)?)?;
    /// assert_eq!(c.excitation().get::<volt>(), 10.0);
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn excitation(&self) -> ElectricPotential {
        self.excitation
    }

    /// The amplifier.
    ///
    /// ```
    /// use gaugebook::{Adc, AdcReference, Amplifier, InputNoise, SignalChain};
    /// use gaugebook::units::ElectricPotential;
    /// use uom::si::electric_potential::volt;
    /// let c = SignalChain::new(ElectricPotential::new::<volt>(10.0), Amplifier::new(64.0, InputNoise::none())?,
    ///     Adc::new(16, AdcReference::ratiometric(1.0)?, true)?)?;
    /// assert_eq!(c.amplifier().gain(), 64.0);
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn amplifier(&self) -> Amplifier {
        self.amplifier
    }

    /// The converter.
    ///
    /// ```
    /// use gaugebook::{Adc, AdcReference, Amplifier, InputNoise, SignalChain};
    /// use gaugebook::units::ElectricPotential;
    /// use uom::si::electric_potential::volt;
    /// let c = SignalChain::new(ElectricPotential::new::<volt>(10.0), Amplifier::new(64.0, InputNoise::none())?,
    ///     Adc::new(16, AdcReference::ratiometric(1.0)?, true)?)?;
    /// assert_eq!(c.adc().bits(), 16);
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn adc(&self) -> Adc {
        self.adc
    }

    fn vex(&self) -> f64 {
        self.excitation.get::<volt>()
    }

    /// The converter span referred to the bridge output, in volts: span/G.
    fn input_span(&self) -> Result<f64, PhysicsError> {
        Ok(self.adc.span_volts(self.vex())? / self.amplifier.gain())
    }

    /// The bridge-output range the converter spans, over the excitation: +V_ref/(G·V_ex) (the
    /// range is ± that for a bipolar converter, 0 to it for a unipolar one).
    ///
    /// ```
    /// use gaugebook::{Adc, AdcReference, Amplifier, InputNoise, SignalChain};
    /// use gaugebook::units::ElectricPotential;
    /// use uom::si::electric_potential::volt;
    /// let c = SignalChain::new(ElectricPotential::new::<volt>(5.0), Amplifier::new(128.0, InputNoise::none())?,
    ///     Adc::new(24, AdcReference::ratiometric(1.0)?, true)?)?;
    /// assert!((c.full_scale()?.mv_per_v() - 1000.0 / 128.0).abs() < 1e-12);
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn full_scale(&self) -> Result<OutputRatio, PhysicsError> {
        let vref = self.adc.reference().volts(self.vex())?;
        Ok(OutputRatio::new(
            vref / (self.amplifier.gain() * self.vex()),
        ))
    }

    /// One converter step referred to the bridge output, in volts.
    ///
    /// ```
    /// use gaugebook::{Adc, AdcReference, Amplifier, InputNoise, SignalChain};
    /// use gaugebook::units::ElectricPotential;
    /// use uom::si::electric_potential::{volt, nanovolt};
    /// let c = SignalChain::new(ElectricPotential::new::<volt>(5.0), Amplifier::new(128.0, InputNoise::none())?,
    ///     Adc::new(24, AdcReference::fixed(ElectricPotential::new::<volt>(2.5))?, true)?)?;
    /// assert!((c.lsb()?.get::<nanovolt>() - 5.0e9 / (128.0 * 16777216.0)).abs() < 1e-9);
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn lsb(&self) -> Result<ElectricPotential, PhysicsError> {
        Ok(ElectricPotential::new::<volt>(
            self.input_span()? / self.adc.codes(),
        ))
    }

    /// Resolution in output ratio: one step over the excitation (V/V; display in mV/V).
    ///
    /// ```
    /// use gaugebook::{Adc, AdcReference, Amplifier, InputNoise, SignalChain};
    /// use gaugebook::units::ElectricPotential;
    /// use uom::si::electric_potential::volt;
    /// let c = SignalChain::new(ElectricPotential::new::<volt>(10.0), Amplifier::new(1.0, InputNoise::none())?,
    ///     Adc::new(16, AdcReference::ratiometric(1.0)?, true)?)?;
    /// assert!((c.resolution()?.value() - 2.0 / 65536.0).abs() < 1e-18);
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn resolution(&self) -> Result<OutputRatio, PhysicsError> {
        Ok(OutputRatio::new(self.lsb()?.get::<volt>() / self.vex()))
    }

    /// Resolution in strain at the R1 gauge of `arrangement`: the exact inverse's slope at
    /// balance, 4/(B·F), times the resolution ratio.
    ///
    /// ```
    /// use gaugebook::{Adc, AdcReference, Amplifier, Arrangement, InputNoise, SignalChain};
    /// use gaugebook::units::ElectricPotential;
    /// use uom::si::electric_potential::volt;
    /// let c = SignalChain::new(ElectricPotential::new::<volt>(5.0), Amplifier::new(128.0, InputNoise::none())?,
    ///     Adc::new(24, AdcReference::ratiometric(1.0)?, true)?)?;
    /// let e = c.strain_resolution(Arrangement::Quarter, 2.0, 0.3)?;
    /// assert!((e.value() - 2.0 * c.resolution()?.value()).abs() < 1e-24);
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn strain_resolution(
        &self,
        arrangement: Arrangement,
        gf: f64,
        nu: f64,
    ) -> Result<Strain, PhysicsError> {
        let r = self.resolution()?;
        ratio_to_strain(r, arrangement, gf, nu)
    }

    /// Resolution in load for a transducer of rated output `rated_output` at `capacity`
    /// (linear between zero and capacity): capacity·resolution/rated output.
    ///
    /// ```
    /// use gaugebook::{Adc, AdcReference, Amplifier, InputNoise, OutputRatio, SignalChain};
    /// use gaugebook::units::{ElectricPotential, Force};
    /// use uom::si::{electric_potential::volt, force::{newton, kilonewton}};
    /// let c = SignalChain::new(ElectricPotential::new::<volt>(5.0), Amplifier::new(128.0, InputNoise::none())?,
    ///     Adc::new(24, AdcReference::ratiometric(1.0)?, true)?)?;
    /// let f = c.load_resolution(OutputRatio::from_mv_per_v(2.0), Force::new::<kilonewton>(10.0))?;
    /// assert!((f.get::<newton>() - 1.0e4 * c.resolution()?.value() / 2.0e-3).abs() < 1e-12);
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn load_resolution(
        &self,
        rated_output: OutputRatio,
        capacity: Force,
    ) -> Result<Force, PhysicsError> {
        let r = self.resolution()?;
        ratio_to_load(r, rated_output, capacity)
    }

    /// Quantisation noise referred to the bridge output, LSB/√12 rms.
    ///
    /// ```
    /// use gaugebook::{Adc, AdcReference, Amplifier, InputNoise, SignalChain};
    /// use gaugebook::units::ElectricPotential;
    /// use uom::si::electric_potential::volt;
    /// let c = SignalChain::new(ElectricPotential::new::<volt>(5.0), Amplifier::new(1.0, InputNoise::none())?,
    ///     Adc::new(12, AdcReference::ratiometric(1.0)?, true)?)?;
    /// let q = c.quantisation_noise()?.get::<volt>();
    /// assert!((q - c.lsb()?.get::<volt>() / 12f64.sqrt()).abs() < 1e-18);
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn quantisation_noise(&self) -> Result<ElectricPotential, PhysicsError> {
        Ok(self.lsb()? / 12f64.sqrt())
    }

    /// Total rms noise σ at the bridge output: amplifier input noise and quantisation noise in
    /// quadrature.
    ///
    /// ```
    /// use gaugebook::{Adc, AdcReference, Amplifier, InputNoise, SignalChain};
    /// use gaugebook::units::ElectricPotential;
    /// use uom::si::electric_potential::{volt, nanovolt};
    /// let n = InputNoise::from_rms(ElectricPotential::new::<nanovolt>(100.0))?;
    /// let c = SignalChain::new(ElectricPotential::new::<volt>(5.0), Amplifier::new(128.0, n)?,
    ///     Adc::new(24, AdcReference::ratiometric(1.0)?, true)?)?;
    /// assert!(c.noise_rms()?.get::<nanovolt>() > 100.0);
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn noise_rms(&self) -> Result<ElectricPotential, PhysicsError> {
        let a = self.amplifier.noise().rms().get::<volt>();
        let q = self.quantisation_noise()?.get::<volt>();
        Ok(ElectricPotential::new::<volt>(a.hypot(q)))
    }

    /// Total rms noise over the excitation (V/V).
    ///
    /// ```
    /// use gaugebook::{Adc, AdcReference, Amplifier, InputNoise, SignalChain};
    /// use gaugebook::units::ElectricPotential;
    /// use uom::si::electric_potential::{volt, nanovolt};
    /// let n = InputNoise::from_rms(ElectricPotential::new::<nanovolt>(500.0))?;
    /// let c = SignalChain::new(ElectricPotential::new::<volt>(5.0), Amplifier::new(128.0, n)?,
    ///     Adc::new(24, AdcReference::ratiometric(1.0)?, true)?)?;
    /// assert!((c.noise_ratio()?.value() - 1.0e-7).abs() < 1e-10);
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn noise_ratio(&self) -> Result<OutputRatio, PhysicsError> {
        Ok(OutputRatio::new(
            self.noise_rms()?.get::<volt>() / self.vex(),
        ))
    }

    /// Effective resolution in bits, log₂(span/σ) (module documentation).
    ///
    /// ```
    /// use gaugebook::{Adc, AdcReference, Amplifier, InputNoise, SignalChain};
    /// use gaugebook::units::ElectricPotential;
    /// use uom::si::electric_potential::volt;
    /// // Quantisation alone: N + log₂√12 ≈ N + 1.79 bits.
    /// let c = SignalChain::new(ElectricPotential::new::<volt>(5.0), Amplifier::new(1.0, InputNoise::none())?,
    ///     Adc::new(16, AdcReference::ratiometric(1.0)?, true)?)?;
    /// assert!((c.effective_bits()? - (16.0 + 12f64.sqrt().log2())).abs() < 1e-12);
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn effective_bits(&self) -> Result<f64, PhysicsError> {
        Ok((self.input_span()? / self.noise_rms()?.get::<volt>()).log2())
    }

    /// Noise-free resolution in bits, log₂(span/(6.6σ)) (module documentation).
    ///
    /// ```
    /// use gaugebook::{Adc, AdcReference, Amplifier, InputNoise, SignalChain};
    /// use gaugebook::units::ElectricPotential;
    /// use uom::si::electric_potential::volt;
    /// let c = SignalChain::new(ElectricPotential::new::<volt>(5.0), Amplifier::new(1.0, InputNoise::none())?,
    ///     Adc::new(16, AdcReference::ratiometric(1.0)?, true)?)?;
    /// assert!((c.effective_bits()? - c.noise_free_bits()? - 6.6f64.log2()).abs() < 1e-12);
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn noise_free_bits(&self) -> Result<f64, PhysicsError> {
        Ok(self.effective_bits()? - PEAK_TO_PEAK_PER_RMS.log2())
    }

    /// Noise-free counts over the signal range `range` (for example the rated output):
    /// range/(6.6σ), with σ over the excitation.
    ///
    /// ```
    /// use gaugebook::{Adc, AdcReference, Amplifier, InputNoise, OutputRatio, SignalChain};
    /// use gaugebook::units::ElectricPotential;
    /// use uom::si::electric_potential::{volt, nanovolt};
    /// let n = InputNoise::from_rms(ElectricPotential::new::<nanovolt>(100.0))?;
    /// let c = SignalChain::new(ElectricPotential::new::<volt>(5.0), Amplifier::new(128.0, n)?,
    ///     Adc::new(24, AdcReference::ratiometric(1.0)?, true)?)?;
    /// let counts = c.noise_free_counts(OutputRatio::from_mv_per_v(2.0))?;
    /// // About 2e-3·5 V/(6.6·100 nV) ≈ 15 150.
    /// assert!((counts - 10.0e-3 / (6.6 * 100.0e-9)).abs() < 10.0);
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn noise_free_counts(&self, range: OutputRatio) -> Result<f64, PhysicsError> {
        let r = check_positive("signal range", range.value(), "V/V")?;
        Ok(r / (PEAK_TO_PEAK_PER_RMS * self.noise_ratio()?.value()))
    }

    /// Relative change of a reading (in mV/V, computed with the nominal excitation) per
    /// relative change of the excitation: 0 for a ratiometric converter, 1 for a fixed
    /// reference.
    ///
    /// ```
    /// use gaugebook::{Adc, AdcReference, Amplifier, InputNoise, SignalChain};
    /// use gaugebook::units::ElectricPotential;
    /// use uom::si::electric_potential::volt;
    /// let c = SignalChain::new(ElectricPotential::new::<volt>(5.0), Amplifier::new(1.0, InputNoise::none())?,
    ///     Adc::new(16, AdcReference::ratiometric(1.0)?, true)?)?;
    /// assert_eq!(c.excitation_sensitivity(), 0.0);
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn excitation_sensitivity(&self) -> f64 {
        if self.adc.reference().is_ratiometric() {
            0.0
        } else {
            1.0
        }
    }

    /// The code the converter gives for a bridge output ratio `ratio` when the excitation is
    /// `actual_excitation` (which may differ from the nominal), as a real number (no rounding or
    /// clipping), and the ratio a reader recovers from it with the nominal figures. Shows why a
    /// ratiometric converter ignores excitation drift.
    ///
    /// ```
    /// use gaugebook::{Adc, AdcReference, Amplifier, InputNoise, OutputRatio, SignalChain};
    /// use gaugebook::units::ElectricPotential;
    /// use uom::si::electric_potential::volt;
    /// let c = SignalChain::new(ElectricPotential::new::<volt>(5.0), Amplifier::new(128.0, InputNoise::none())?,
    ///     Adc::new(24, AdcReference::ratiometric(1.0)?, true)?)?;
    /// let r = OutputRatio::from_mv_per_v(1.5);
    /// let back = c.read_back(r, ElectricPotential::new::<volt>(5.05))?;
    /// assert!((back.mv_per_v() - 1.5).abs() < 1e-12);
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn read_back(
        &self,
        ratio: OutputRatio,
        actual_excitation: ElectricPotential,
    ) -> Result<OutputRatio, PhysicsError> {
        let va = check_positive("excitation voltage", actual_excitation.get::<volt>(), "V")?;
        let r = check_finite("output ratio", ratio.value(), "V/V")?;
        let g = self.amplifier.gain();
        // Code = G·r·V_act/LSB_adc(V_act); read back with the nominal LSB and excitation.
        let code = g * r * va / (self.adc.span_volts(va)? / self.adc.codes());
        let lsb_nominal = self.adc.span_volts(self.vex())? / self.adc.codes();
        Ok(OutputRatio::new(code * lsb_nominal / (g * self.vex())))
    }
}

/// Output ratio to strain at the R1 gauge through the exact inverse's slope at balance.
pub(crate) fn ratio_to_strain(
    r: OutputRatio,
    arrangement: Arrangement,
    gf: f64,
    nu: f64,
) -> Result<Strain, PhysicsError> {
    check_positive("gauge factor", gf, "")?;
    let b = arrangement.bridge_factor(nu)?;
    Ok(Strain::new(4.0 * r.value() / (b * gf)))
}

/// Output ratio to load for a linear transducer.
pub(crate) fn ratio_to_load(
    r: OutputRatio,
    rated_output: OutputRatio,
    capacity: Force,
) -> Result<Force, PhysicsError> {
    let ro = rated_output.value();
    if !(ro.is_finite() && ro != 0.0) {
        return Err(PhysicsError::invalid(
            "rated output",
            rated_output,
            "a finite, non-zero output ratio",
        ));
    }
    let c = check_positive("capacity", capacity.get::<newton>(), "N")?;
    Ok(Force::new::<newton>(c * r.value() / ro.abs()))
}
