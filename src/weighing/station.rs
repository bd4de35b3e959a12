//! The check-weighing station and what it needs from the bridge and the signal chain.

use std::fmt;

use uom::si::acceleration::meter_per_second_squared;
use uom::si::electric_potential::volt;
use uom::si::mass::{gram, kilogram};

use crate::OutputRatio;
use crate::bridge::{ArmId, Trim, TrimKind, WheatstoneBridge};
use crate::error::{PhysicsError, check_positive};
use crate::layout::Layout;
use crate::spring::Wrench;
use crate::units::{Acceleration, ElectricPotential, Mass};

/// Standard acceleration of gravity, 9.806 65 m/s², a defined value (3rd CGPM, 1901; SI
/// Brochure, 9th ed., 2019). A station uses its local g where it is known.
///
/// ```
/// assert_eq!(gaugebook::STANDARD_GRAVITY, 9.80665);
/// # Ok::<(), gaugebook::PhysicsError>(())
/// ```
pub const STANDARD_GRAVITY: f64 = 9.806_65;

/// The caution attached to every check-weighing result.
///
/// ```
/// assert!(gaugebook::WEIGHING_CAUTION.contains("legal-for-trade"));
/// # Ok::<(), gaugebook::PhysicsError>(())
/// ```
pub const WEIGHING_CAUTION: &str = "design estimates must be proven by test; legal-for-trade \
use follows local codes and licensed practice";

/// Fraction of the tightest tolerance the signal chain must resolve (one tenth: common
/// practice for a go/no-go decision).
const DEFAULT_RESOLUTION_FRACTION: f64 = 0.1;

/// A check-weighing station: a layout's bridge carrying a platform (tare) and packages of a
/// target mass, accepted within −`below`/+`above` of it.
///
/// The weight W = (tare + m)·g acts on the element as `per_newton` × W (a wrench per newton of
/// weight, so an eccentric platform can be described with [`Wrench::force_at`]). The bridge is
/// balanced at the target with a trim in the chosen arm (series or parallel, whichever the arm
/// needs), so a package on target reads zero.
///
/// Our scenario (invented for this example): a line filling 750 g honey jars on a 1.2 kg
/// conveyor tray, accepting 745 g to 765 g, on a parallelogram cell rated 5 kg (49 N).
///
/// ```
/// use gaugebook::{Arrangement, ArmId, CheckWeigher, Gauge, Layout, LoadComponent, Parallelogram,
///     Wrench, material};
/// use gaugebook::units::{ElectricalResistance, ElectricPotential, Length, Mass};
/// use uom::si::{electric_potential::volt, electrical_resistance::ohm, length::millimeter, mass::gram};
/// let mm = Length::new::<millimeter>;
/// let cell = Parallelogram::new(material("2024-T351")?, mm(40.0), mm(20.0), mm(1.6), mm(24.0), mm(6.0))?;
/// let g = Gauge::new(ElectricalResistance::new::<ohm>(1000.0), 2.0)?;
/// let layout = Layout::standard(cell, &g, Arrangement::FullBending, 5.0 * 9.80665)?;
/// let station = CheckWeigher::new(layout, 0, Wrench::only(LoadComponent::Fz, 1.0),
///     Mass::new::<gram>(1200.0), Mass::new::<gram>(750.0), Mass::new::<gram>(5.0),
///     Mass::new::<gram>(15.0))?
///     .with_trim_arm(ArmId::R4);
/// let w = station.evaluate()?;
/// assert!(w.zero_at_target.value().abs() < 1e-12);
/// assert!(w.accept_low < w.accept_high);
/// let res = w.resolution_voltage(ElectricPotential::new::<volt>(5.0))?;
/// assert!(res.get::<volt>() > 0.0);
/// assert!(w.to_string().contains("legal-for-trade"));
/// # Ok::<(), gaugebook::PhysicsError>(())
/// ```
#[derive(Debug, Clone)]
pub struct CheckWeigher {
    layout: Layout,
    bridge: usize,
    per_newton: Wrench,
    tare: f64,
    target: f64,
    below: f64,
    above: f64,
    gravity: f64,
    trim_arm: ArmId,
    trim_kind: Option<TrimKind>,
    resolution_fraction: f64,
}

impl CheckWeigher {
    /// A station on bridge `bridge` of `layout`. Errors: non-positive target or tolerances,
    /// negative tare, a heaviest accepted load beyond the layout's capacity, or a load that
    /// pushes the element against its rated direction.
    ///
    /// ```
    /// # use gaugebook::{Arrangement, ArmId, CheckWeigher, Gauge, Layout, LoadComponent, Parallelogram, TrimKind, Wrench, material};
    /// # use gaugebook::units::{ElectricalResistance, ElectricPotential, Length, Mass};
    /// # use uom::si::{electric_potential::volt, electrical_resistance::ohm, length::millimeter, mass::gram};
    /// # let mm = Length::new::<millimeter>;
    /// # let cell = Parallelogram::new(material("2024-T351")?, mm(40.0), mm(20.0), mm(1.6), mm(24.0), mm(6.0))?;
    /// # let g = Gauge::new(ElectricalResistance::new::<ohm>(1000.0), 2.0)?;
    /// # let layout = Layout::standard(cell, &g, Arrangement::FullBending, 49.0)?;
    /// # let s = CheckWeigher::new(layout.clone(), 0, Wrench::only(LoadComponent::Fz, 1.0), Mass::new::<gram>(1200.0),
    /// #     Mass::new::<gram>(750.0), Mass::new::<gram>(5.0), Mass::new::<gram>(15.0))?;
    /// // 4.5 kg of jar on a 1.2 kg tray overloads a 5 kg cell.
    /// let too_much = CheckWeigher::new(layout, 0, Wrench::only(LoadComponent::Fz, 1.0),
    ///     Mass::new::<gram>(1200.0), Mass::new::<gram>(4500.0), Mass::new::<gram>(5.0), Mass::new::<gram>(15.0));
    /// assert!(too_much.is_err());
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn new(
        layout: Layout,
        bridge: usize,
        per_newton: Wrench,
        tare: Mass,
        target: Mass,
        below: Mass,
        above: Mass,
    ) -> Result<CheckWeigher, PhysicsError> {
        let kg = |m: Mass| m.get::<kilogram>();
        let tare_kg = kg(tare);
        if !(tare_kg.is_finite() && tare_kg >= 0.0) {
            return Err(PhysicsError::invalid(
                "tare",
                format!("{} g", tare_kg * 1e3),
                "a finite mass ≥ 0 g",
            ));
        }
        let target_kg = check_positive("target mass", kg(target) * 1e3, "g")? * 1e-3;
        let below_kg = check_positive("tolerance below target", kg(below) * 1e3, "g")? * 1e-3;
        let above_kg = check_positive("tolerance above target", kg(above) * 1e3, "g")? * 1e-3;
        if below_kg >= target_kg {
            return Err(PhysicsError::invalid(
                "tolerance below target",
                format!("{} g", below_kg * 1e3),
                format!("below the target {} g", target_kg * 1e3),
            ));
        }
        let s = CheckWeigher {
            layout,
            bridge,
            per_newton,
            tare: tare_kg,
            target: target_kg,
            below: below_kg,
            above: above_kg,
            gravity: STANDARD_GRAVITY,
            trim_arm: ArmId::R4,
            trim_kind: None,
            resolution_fraction: DEFAULT_RESOLUTION_FRACTION,
        };
        s.layout.wiring(bridge)?;
        s.check_capacity()?;
        Ok(s)
    }

    fn check_capacity(&self) -> Result<(), PhysicsError> {
        let primary = self.layout.primary();
        let cap = self.layout.capacity().get(primary);
        let heaviest = (self.tare + self.target + self.above) * self.gravity;
        let along = self.per_newton.get(primary) * heaviest;
        if along * cap <= 0.0 {
            return Err(PhysicsError::invalid(
                "load direction",
                format!("{along:.4} {} along {primary}", primary.unit_symbol()),
                format!(
                    "a load in the rated direction ({cap} {})",
                    primary.unit_symbol()
                ),
            ));
        }
        if along.abs() > cap.abs() {
            return Err(PhysicsError::out_of_range(
                "check-weighing station",
                format!(
                    "the heaviest accepted load gives {along:.4} {} along {primary}, beyond the capacity {cap} {}",
                    primary.unit_symbol(),
                    primary.unit_symbol()
                ),
            ));
        }
        Ok(())
    }

    /// The same station under local gravity `g` (instead of [`STANDARD_GRAVITY`]).
    ///
    /// ```
    /// # use gaugebook::{Arrangement, CheckWeigher, Gauge, Layout, LoadComponent, Parallelogram, Wrench, material};
    /// # use gaugebook::units::{Acceleration, ElectricalResistance, Length, Mass};
    /// # use uom::si::{acceleration::meter_per_second_squared, electrical_resistance::ohm, length::millimeter, mass::gram};
    /// # let mm = Length::new::<millimeter>;
    /// # let cell = Parallelogram::new(material("2024-T351")?, mm(40.0), mm(20.0), mm(1.6), mm(24.0), mm(6.0))?;
    /// # let g = Gauge::new(ElectricalResistance::new::<ohm>(1000.0), 2.0)?;
    /// # let layout = Layout::standard(cell, &g, Arrangement::FullBending, 49.0)?;
    /// let s = CheckWeigher::new(layout, 0, Wrench::only(LoadComponent::Fz, 1.0), Mass::new::<gram>(1200.0),
    ///     Mass::new::<gram>(750.0), Mass::new::<gram>(5.0), Mass::new::<gram>(15.0))?
    ///     .with_gravity(Acceleration::new::<meter_per_second_squared>(9.81))?;
    /// assert!(s.evaluate()?.output_per_gram.value() > 0.0);
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn with_gravity(mut self, g: Acceleration) -> Result<CheckWeigher, PhysicsError> {
        self.gravity = check_positive("gravity", g.get::<meter_per_second_squared>(), "m/s²")?;
        self.check_capacity()?;
        Ok(self)
    }

    /// The same station trimmed in `arm`, with whichever kind (series or parallel) balances it.
    ///
    /// ```
    /// # use gaugebook::{Arrangement, ArmId, CheckWeigher, Gauge, Layout, LoadComponent, Parallelogram, TrimKind, Wrench, material};
    /// # use gaugebook::units::{ElectricalResistance, ElectricPotential, Length, Mass};
    /// # use uom::si::{electric_potential::volt, electrical_resistance::ohm, length::millimeter, mass::gram};
    /// # let mm = Length::new::<millimeter>;
    /// # let cell = Parallelogram::new(material("2024-T351")?, mm(40.0), mm(20.0), mm(1.6), mm(24.0), mm(6.0))?;
    /// # let g = Gauge::new(ElectricalResistance::new::<ohm>(1000.0), 2.0)?;
    /// # let layout = Layout::standard(cell, &g, Arrangement::FullBending, 49.0)?;
    /// # let s = CheckWeigher::new(layout.clone(), 0, Wrench::only(LoadComponent::Fz, 1.0), Mass::new::<gram>(1200.0),
    /// #     Mass::new::<gram>(750.0), Mass::new::<gram>(5.0), Mass::new::<gram>(15.0))?;
    /// assert_eq!(s.with_trim_arm(ArmId::R2).evaluate()?.trim_arm, ArmId::R2);
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn with_trim_arm(mut self, arm: ArmId) -> CheckWeigher {
        self.trim_arm = arm;
        self.trim_kind = None;
        self
    }

    /// The same station trimmed in `arm` with a trim of `kind` (an error at evaluation when that
    /// kind cannot balance that arm).
    ///
    /// ```
    /// # use gaugebook::{Arrangement, ArmId, CheckWeigher, Gauge, Layout, LoadComponent, Parallelogram, TrimKind, Wrench, material};
    /// # use gaugebook::units::{ElectricalResistance, ElectricPotential, Length, Mass};
    /// # use uom::si::{electric_potential::volt, electrical_resistance::ohm, length::millimeter, mass::gram};
    /// # let mm = Length::new::<millimeter>;
    /// # let cell = Parallelogram::new(material("2024-T351")?, mm(40.0), mm(20.0), mm(1.6), mm(24.0), mm(6.0))?;
    /// # let g = Gauge::new(ElectricalResistance::new::<ohm>(1000.0), 2.0)?;
    /// # let layout = Layout::standard(cell, &g, Arrangement::FullBending, 49.0)?;
    /// # let s = CheckWeigher::new(layout.clone(), 0, Wrench::only(LoadComponent::Fz, 1.0), Mass::new::<gram>(1200.0),
    /// #     Mass::new::<gram>(750.0), Mass::new::<gram>(5.0), Mass::new::<gram>(15.0))?;
    /// assert!(s.clone().with_trim(ArmId::R4, TrimKind::Series).evaluate().is_ok());
    /// assert!(s.with_trim(ArmId::R4, TrimKind::Parallel).evaluate().is_err());
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn with_trim(mut self, arm: ArmId, kind: TrimKind) -> CheckWeigher {
        self.trim_arm = arm;
        self.trim_kind = Some(kind);
        self
    }

    /// The same station with the signal chain required to resolve `fraction` of the tightest
    /// tolerance (default 0.1, common practice).
    ///
    /// ```
    /// # use gaugebook::{Arrangement, ArmId, CheckWeigher, Gauge, Layout, LoadComponent, Parallelogram, TrimKind, Wrench, material};
    /// # use gaugebook::units::{ElectricalResistance, ElectricPotential, Length, Mass};
    /// # use uom::si::{electric_potential::volt, electrical_resistance::ohm, length::millimeter, mass::gram};
    /// # let mm = Length::new::<millimeter>;
    /// # let cell = Parallelogram::new(material("2024-T351")?, mm(40.0), mm(20.0), mm(1.6), mm(24.0), mm(6.0))?;
    /// # let g = Gauge::new(ElectricalResistance::new::<ohm>(1000.0), 2.0)?;
    /// # let layout = Layout::standard(cell, &g, Arrangement::FullBending, 49.0)?;
    /// # let s = CheckWeigher::new(layout.clone(), 0, Wrench::only(LoadComponent::Fz, 1.0), Mass::new::<gram>(1200.0),
    /// #     Mass::new::<gram>(750.0), Mass::new::<gram>(5.0), Mass::new::<gram>(15.0))?;
    /// let w = s.with_resolution_fraction(0.2)?.evaluate()?;
    /// assert!((w.resolution_mass.get::<gram>() - 1.0).abs() < 1e-9);
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn with_resolution_fraction(mut self, fraction: f64) -> Result<CheckWeigher, PhysicsError> {
        let f = check_positive("resolution fraction", fraction, "")?;
        if f > 1.0 {
            return Err(PhysicsError::invalid(
                "resolution fraction",
                f,
                "a value in (0, 1]",
            ));
        }
        self.resolution_fraction = f;
        Ok(self)
    }

    fn untrimmed(&self, mass_kg: f64) -> Result<WheatstoneBridge, PhysicsError> {
        let load = self.per_newton.scaled((self.tare + mass_kg) * self.gravity);
        self.layout
            .bridge_at(self.bridge, &load, self.layout.reference_temperature())
    }

    fn trim(&self) -> Result<Trim, PhysicsError> {
        let b = self.untrimmed(self.target)?;
        match self.trim_kind {
            Some(kind) => b.balance_trim(self.trim_arm, kind),
            None => b
                .balance_trim(self.trim_arm, TrimKind::Series)
                .or_else(|_| b.balance_trim(self.trim_arm, TrimKind::Parallel)),
        }
    }

    fn output(&self, trim: Trim, package_kg: f64) -> Result<OutputRatio, PhysicsError> {
        let b = self.untrimmed(package_kg)?;
        let arm = b.arm(self.trim_arm).with_trim(trim);
        Ok(b.with_arm(self.trim_arm, arm).output_ratio())
    }

    /// Balances the bridge at the target and reads off the accept band and the resolution
    /// needed.
    ///
    /// ```
    /// # use gaugebook::{Arrangement, ArmId, CheckWeigher, Gauge, Layout, LoadComponent, Parallelogram, TrimKind, Wrench, material};
    /// # use gaugebook::units::{ElectricalResistance, ElectricPotential, Length, Mass};
    /// # use uom::si::{electric_potential::volt, electrical_resistance::ohm, length::millimeter, mass::gram};
    /// # let mm = Length::new::<millimeter>;
    /// # let cell = Parallelogram::new(material("2024-T351")?, mm(40.0), mm(20.0), mm(1.6), mm(24.0), mm(6.0))?;
    /// # let g = Gauge::new(ElectricalResistance::new::<ohm>(1000.0), 2.0)?;
    /// # let layout = Layout::standard(cell, &g, Arrangement::FullBending, 49.0)?;
    /// # let s = CheckWeigher::new(layout.clone(), 0, Wrench::only(LoadComponent::Fz, 1.0), Mass::new::<gram>(1200.0),
    /// #     Mass::new::<gram>(750.0), Mass::new::<gram>(5.0), Mass::new::<gram>(15.0))?;
    /// let w = s.evaluate()?;
    /// assert!(w.accept_low.value() < 0.0 && w.accept_high.value() > 0.0);
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn evaluate(&self) -> Result<CheckWeighing, PhysicsError> {
        let trim = self.trim()?;
        let h = 0.1 * self.below.min(self.above);
        let up = self.output(trim, self.target + h)?;
        let down = self.output(trim, self.target - h)?;
        let per_kg = (up - down).value() / (2.0 * h);
        let lo = self.output(trim, self.target - self.below)?;
        let hi = self.output(trim, self.target + self.above)?;
        let (accept_low, accept_high) = if lo <= hi { (lo, hi) } else { (hi, lo) };
        let res_kg = self.resolution_fraction * self.below.min(self.above);
        let empty = self.output(trim, -self.tare)?;
        let full = self.output(
            trim,
            self.layout.capacity().get(self.layout.primary()).abs()
                / self.gravity
                / self.per_newton.get(self.layout.primary()).abs()
                - self.tare,
        )?;
        Ok(CheckWeighing {
            trim_arm: self.trim_arm,
            trim,
            zero_at_target: self.output(trim, self.target)?,
            output_per_gram: OutputRatio::new(per_kg * 1e-3),
            accept_low,
            accept_high,
            resolution: OutputRatio::new((per_kg * res_kg).abs()),
            resolution_mass: Mass::new::<kilogram>(res_kg),
            unloaded_output: empty,
            capacity_output: full,
            caution: WEIGHING_CAUTION,
        })
    }
}

/// What a check-weighing station needs and gives (see [`CheckWeigher::evaluate`]).
///
/// ```
/// # use gaugebook::{Arrangement, ArmId, CheckWeigher, Gauge, Layout, LoadComponent, Parallelogram, TrimKind, Wrench, material};
/// # use gaugebook::units::{ElectricalResistance, ElectricPotential, Length, Mass};
/// # use uom::si::{electric_potential::volt, electrical_resistance::ohm, length::millimeter, mass::gram};
/// # let mm = Length::new::<millimeter>;
/// # let cell = Parallelogram::new(material("2024-T351")?, mm(40.0), mm(20.0), mm(1.6), mm(24.0), mm(6.0))?;
/// # let g = Gauge::new(ElectricalResistance::new::<ohm>(1000.0), 2.0)?;
/// # let layout = Layout::standard(cell, &g, Arrangement::FullBending, 49.0)?;
/// # let s = CheckWeigher::new(layout.clone(), 0, Wrench::only(LoadComponent::Fz, 1.0), Mass::new::<gram>(1200.0),
/// #     Mass::new::<gram>(750.0), Mass::new::<gram>(5.0), Mass::new::<gram>(15.0))?;
/// let w = s.evaluate()?;
/// assert!((w.resolution_mass.get::<gram>() - 0.5).abs() < 1e-9);
/// # Ok::<(), gaugebook::PhysicsError>(())
/// ```
#[derive(Debug, Clone, PartialEq)]
pub struct CheckWeighing {
    /// The arm carrying the trim.
    pub trim_arm: ArmId,
    /// The balancing trim.
    pub trim: Trim,
    /// The output with a package on target (zero by construction, to rounding).
    pub zero_at_target: OutputRatio,
    /// The output per gram of package around the target.
    pub output_per_gram: OutputRatio,
    /// The lowest output of an accepted package.
    pub accept_low: OutputRatio,
    /// The highest output of an accepted package; outputs outside the band are rejected.
    pub accept_high: OutputRatio,
    /// The output step the signal chain must resolve.
    pub resolution: OutputRatio,
    /// The mass step that corresponds to.
    pub resolution_mass: Mass,
    /// The output with nothing on the element (no tray, no package).
    pub unloaded_output: OutputRatio,
    /// The output at the element's capacity.
    pub capacity_output: OutputRatio,
    /// [`WEIGHING_CAUTION`].
    pub caution: &'static str,
}

impl CheckWeighing {
    /// The resolution as a voltage at bridge excitation `excitation`.
    ///
    /// ```
    /// # use gaugebook::{Arrangement, ArmId, CheckWeigher, Gauge, Layout, LoadComponent, Parallelogram, TrimKind, Wrench, material};
    /// # use gaugebook::units::{ElectricalResistance, ElectricPotential, Length, Mass};
    /// # use uom::si::{electric_potential::volt, electrical_resistance::ohm, length::millimeter, mass::gram};
    /// # let mm = Length::new::<millimeter>;
    /// # let cell = Parallelogram::new(material("2024-T351")?, mm(40.0), mm(20.0), mm(1.6), mm(24.0), mm(6.0))?;
    /// # let g = Gauge::new(ElectricalResistance::new::<ohm>(1000.0), 2.0)?;
    /// # let layout = Layout::standard(cell, &g, Arrangement::FullBending, 49.0)?;
    /// # let s = CheckWeigher::new(layout.clone(), 0, Wrench::only(LoadComponent::Fz, 1.0), Mass::new::<gram>(1200.0),
    /// #     Mass::new::<gram>(750.0), Mass::new::<gram>(5.0), Mass::new::<gram>(15.0))?;
    /// let w = s.evaluate()?;
    /// let v = w.resolution_voltage(ElectricPotential::new::<volt>(5.0))?;
    /// assert!((v.get::<volt>() - 5.0 * w.resolution.value()).abs() < 1e-18);
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn resolution_voltage(
        &self,
        excitation: ElectricPotential,
    ) -> Result<ElectricPotential, PhysicsError> {
        let v = check_positive("excitation", excitation.get::<volt>(), "V")?;
        Ok(ElectricPotential::new::<volt>(self.resolution.value() * v))
    }

    /// Noise-free bits needed over an input span `span` (for example the amplifier's ± range
    /// in V/V): log₂(span/resolution), rounded up.
    ///
    /// ```
    /// # use gaugebook::{Arrangement, CheckWeigher, Gauge, Layout, LoadComponent, OutputRatio, Parallelogram, Wrench, material};
    /// # use gaugebook::units::{ElectricalResistance, Length, Mass};
    /// # use uom::si::{electrical_resistance::ohm, length::millimeter, mass::gram};
    /// # let mm = Length::new::<millimeter>;
    /// # let cell = Parallelogram::new(material("2024-T351")?, mm(40.0), mm(20.0), mm(1.6), mm(24.0), mm(6.0))?;
    /// # let g = Gauge::new(ElectricalResistance::new::<ohm>(1000.0), 2.0)?;
    /// # let layout = Layout::standard(cell, &g, Arrangement::FullBending, 49.0)?;
    /// # let s = CheckWeigher::new(layout, 0, Wrench::only(LoadComponent::Fz, 1.0), Mass::new::<gram>(1200.0),
    /// #     Mass::new::<gram>(750.0), Mass::new::<gram>(5.0), Mass::new::<gram>(15.0))?;
    /// let w = s.evaluate()?;
    /// let bits = w.bits_over(OutputRatio::from_mv_per_v(4.0))?;
    /// assert!(bits > 10 && bits < 24);
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn bits_over(&self, span: OutputRatio) -> Result<u32, PhysicsError> {
        let s = check_positive("input span", span.value().abs() * 1e3, "mV/V")? * 1e-3;
        Ok((s / self.resolution.value()).log2().ceil().max(0.0) as u32)
    }
}

impl fmt::Display for CheckWeighing {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        writeln!(
            f,
            "trim: {:?} {} Ω in arm {}",
            self.trim.kind(),
            self.trim
                .resistance()
                .get::<uom::si::electrical_resistance::ohm>(),
            self.trim_arm
        )?;
        writeln!(
            f,
            "output per gram: {:.6} µV/V",
            self.output_per_gram.value() * 1e6
        )?;
        writeln!(
            f,
            "accept band: {} to {}",
            self.accept_low, self.accept_high
        )?;
        writeln!(
            f,
            "resolution needed: {:.6} µV/V ({} g)",
            self.resolution.value() * 1e6,
            self.resolution_mass.get::<gram>()
        )?;
        writeln!(
            f,
            "unloaded output {}, at capacity {}",
            self.unloaded_output, self.capacity_output
        )?;
        write!(f, "caution: {}", self.caution)
    }
}
