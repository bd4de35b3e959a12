//! What a layout's bridges put out: the response to each load component and to temperature,
//! rated output, cross-talk and nonlinearity.

use std::fmt;

use uom::si::length::meter;
use uom::si::thermodynamic_temperature::kelvin;

use super::explorer::Layout;
use crate::OutputRatio;
use crate::error::PhysicsError;
use crate::spring::{LoadComponent, Wrench};
use crate::units::ThermodynamicTemperature;

/// Half-width of the central difference used for the temperature response, K (the thermal
/// polynomials are smooth on this scale).
const DT: f64 = 0.5;

/// Points of the end-point-line nonlinearity scan from zero to capacity.
const SCAN: usize = 100;

/// One bridge's answers (see [`Layout::report`]). Design estimates must be proven by test.
///
/// ```
/// # use gaugebook::{Arrangement, Cantilever, Gauge, Layout, LoadComponent, Wrench, material};
/// # use gaugebook::units::{ElectricalResistance, Length};
/// # use uom::si::{electrical_resistance::ohm, length::millimeter};
/// # let mm = Length::new::<millimeter>;
/// # let beam = Cantilever::new(material("2024-T351")?, mm(100.0), mm(20.0), mm(5.0), mm(30.0))?;
/// # let g = Gauge::new(ElectricalResistance::new::<ohm>(350.0), 2.0)?;
/// # let l = Layout::standard(beam, &g, Arrangement::FullBending, 50.0)?;
/// let r = l.report(0)?;
/// assert!(r.to_string().contains("rated output"));
/// # Ok::<(), gaugebook::PhysicsError>(())
/// ```
#[derive(Debug, Clone, PartialEq)]
pub struct BridgeReport {
    /// The bridge's name.
    pub bridge: String,
    /// The primary load component.
    pub primary: LoadComponent,
    /// The rated load.
    pub capacity: Wrench,
    /// Linear output per unit of each component, V/V per N or per N·m, Fx..Mz.
    pub per_load: [f64; 6],
    /// Zero drift with a uniform temperature change, V/V per K.
    pub zero_per_kelvin: f64,
    /// Span drift (relative change of rated output) per K.
    pub span_per_kelvin: f64,
    /// Exact rated output at capacity, zero subtracted.
    pub rated_output: OutputRatio,
    /// The off-axis loads the cross-talk refers to.
    pub cross_talk_basis: Wrench,
    /// Output from each off-axis component of the basis, in % of rated output (`None` for the
    /// primary component).
    pub cross_talk: [Option<f64>; 6],
    /// 100·(linear − exact)/linear at capacity (the bridge law's nonlinearity).
    pub nonlinearity: f64,
    /// Largest deviation of the exact output from the line through zero and capacity, % of
    /// rated output.
    pub endpoint_nonlinearity: f64,
}

impl fmt::Display for BridgeReport {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        writeln!(
            f,
            "bridge {}: rated output {} at {}",
            self.bridge, self.rated_output, self.capacity
        )?;
        for c in LoadComponent::ALL {
            let k = c.index();
            let scale = if c.is_moment() { 1.0 } else { 1e3 };
            let unit = if c.is_moment() { "N·m" } else { "kN" };
            write!(
                f,
                "  {c}: {:.6} mV/V per {unit}",
                self.per_load[k] * 1e3 * scale
            )?;
            match self.cross_talk[k] {
                Some(x) => writeln!(
                    f,
                    ", cross-talk {x:.4} % RO at {} {}",
                    self.cross_talk_basis.get(c),
                    c.unit_symbol()
                )?,
                None => writeln!(f, " (primary)")?,
            }
        }
        writeln!(
            f,
            "  temperature: zero {:.6} mV/V per K, span {:.5} % per K",
            self.zero_per_kelvin * 1e3,
            self.span_per_kelvin * 100.0
        )?;
        write!(
            f,
            "  nonlinearity at capacity {:.5} % (terminal line {:.5} % RO)",
            self.nonlinearity, self.endpoint_nonlinearity
        )
    }
}

/// The response of every bridge of a layout to the six load components and to temperature.
///
/// ```
/// use gaugebook::{Arrangement, Gauge, Layout, TorqueShaft, material};
/// use gaugebook::units::{ElectricalResistance, Length};
/// use uom::si::{electrical_resistance::ohm, length::millimeter};
/// let mm = Length::new::<millimeter>;
/// let s = TorqueShaft::solid(material("4340")?, mm(20.0), mm(100.0), mm(50.0))?;
/// let g = Gauge::new(ElectricalResistance::new::<ohm>(350.0), 2.0)?;
/// let m = Layout::standard(s, &g, Arrangement::FullShear, 100.0)?.response_matrix()?;
/// assert_eq!(m.bridges.len(), 1);
/// assert!(m.per_load[0][3] > 0.0); // Mx
/// assert!(m.to_string().contains("mV/V"));
/// # Ok::<(), gaugebook::PhysicsError>(())
/// ```
#[derive(Debug, Clone, PartialEq)]
pub struct ResponseMatrix {
    /// Bridge names, one row each.
    pub bridges: Vec<String>,
    /// V/V per N (forces) or per N·m (moments), columns Fx Fy Fz Mx My Mz.
    pub per_load: Vec<[f64; 6]>,
    /// Zero drift, V/V per K.
    pub per_kelvin: Vec<f64>,
}

impl fmt::Display for ResponseMatrix {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        writeln!(
            f,
            "mV/V per:      Fx (kN)      Fy (kN)      Fz (kN)    Mx (N·m)    My (N·m)    Mz (N·m)        K"
        )?;
        for (i, name) in self.bridges.iter().enumerate() {
            write!(f, "{name:<10}")?;
            for c in LoadComponent::ALL {
                let scale = if c.is_moment() { 1e3 } else { 1e6 };
                write!(f, " {:>12.5e}", self.per_load[i][c.index()] * scale)?;
            }
            writeln!(f, " {:>10.3e}", self.per_kelvin[i] * 1e3)?;
        }
        Ok(())
    }
}

impl Layout {
    fn at(&self, dk: f64) -> ThermodynamicTemperature {
        ThermodynamicTemperature::new::<kelvin>(self.reference_temperature().get::<kelvin>() + dk)
    }

    /// The default cross-talk basis: for a force-rated element, forces equal to the capacity and
    /// moments equal to capacity × element length; for a moment-rated one, moments equal to the
    /// capacity and forces equal to capacity / length (common practice for comparing off-axis
    /// loads of a similar size).
    ///
    /// ```
    /// # use gaugebook::{Arrangement, Cantilever, Gauge, Layout, LoadComponent, Wrench, material};
    /// # use gaugebook::units::{ElectricalResistance, Length};
    /// # use uom::si::{electrical_resistance::ohm, length::millimeter};
    /// # let mm = Length::new::<millimeter>;
    /// # let beam = Cantilever::new(material("2024-T351")?, mm(100.0), mm(20.0), mm(5.0), mm(30.0))?;
    /// # let g = Gauge::new(ElectricalResistance::new::<ohm>(350.0), 2.0)?;
    /// # let l = Layout::standard(beam, &g, Arrangement::FullBending, 50.0)?;
    /// let b = l.default_cross_talk_basis();
    /// // 50 N capacity on a 100 mm beam: moments of 5 N·m.
    /// assert!((b.get(LoadComponent::My) - 5.0).abs() < 1e-12);
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn default_cross_talk_basis(&self) -> Wrench {
        let c = self.capacity().get(self.primary()).abs();
        let l = self.element().length().get::<meter>();
        let mut w = Wrench::zero();
        for k in LoadComponent::ALL {
            let v = match (self.primary().is_moment(), k.is_moment()) {
                (false, false) | (true, true) => c,
                (false, true) => c * l,
                (true, false) => c / l,
            };
            w = w.with(k, v);
        }
        w
    }

    /// The linear response of bridge `bridge` to one unit of each load component (V/V per N or
    /// per N·m).
    ///
    /// ```
    /// # use gaugebook::{Arrangement, Cantilever, Gauge, Layout, LoadComponent, Wrench, material};
    /// # use gaugebook::units::{ElectricalResistance, Length};
    /// # use uom::si::{electrical_resistance::ohm, length::millimeter};
    /// # let mm = Length::new::<millimeter>;
    /// # let beam = Cantilever::new(material("2024-T351")?, mm(100.0), mm(20.0), mm(5.0), mm(30.0))?;
    /// # let g = Gauge::new(ElectricalResistance::new::<ohm>(350.0), 2.0)?;
    /// # let l = Layout::standard(beam, &g, Arrangement::FullBending, 50.0)?;
    /// let s = l.per_load(0)?;
    /// assert!(s[LoadComponent::Fz.index()] > 0.0);
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn per_load(&self, bridge: usize) -> Result<[f64; 6], PhysicsError> {
        let mut out = [0.0; 6];
        for c in LoadComponent::ALL {
            out[c.index()] = self.linear_output(bridge, &Wrench::only(c, 1.0))?.value();
        }
        Ok(out)
    }

    /// The report of bridge `bridge` with the default cross-talk basis.
    ///
    /// ```
    /// # use gaugebook::{Arrangement, Cantilever, Gauge, Layout, LoadComponent, Wrench, material};
    /// # use gaugebook::units::{ElectricalResistance, Length};
    /// # use uom::si::{electrical_resistance::ohm, length::millimeter};
    /// # let mm = Length::new::<millimeter>;
    /// # let beam = Cantilever::new(material("2024-T351")?, mm(100.0), mm(20.0), mm(5.0), mm(30.0))?;
    /// # let g = Gauge::new(ElectricalResistance::new::<ohm>(350.0), 2.0)?;
    /// # let l = Layout::standard(beam, &g, Arrangement::FullBending, 50.0)?;
    /// let r = l.report(0)?;
    /// assert!(r.endpoint_nonlinearity.abs() < 1e-9);
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn report(&self, bridge: usize) -> Result<BridgeReport, PhysicsError> {
        self.report_with(bridge, &self.default_cross_talk_basis())
    }

    /// The report of bridge `bridge`, cross-talk referred to the off-axis loads in `basis`.
    ///
    /// Zero and span drift are central differences of the exact output over ±0.5 K about the
    /// reference temperature.
    ///
    /// ```
    /// use gaugebook::{Arrangement, Cantilever, Gauge, Layout, LoadComponent, Wrench, material};
    /// use gaugebook::units::{ElectricalResistance, Length};
    /// use uom::si::{electrical_resistance::ohm, length::millimeter};
    /// let mm = Length::new::<millimeter>;
    /// let beam = Cantilever::new(material("2024-T351")?, mm(100.0), mm(20.0), mm(5.0), mm(30.0))?;
    /// let g = Gauge::new(ElectricalResistance::new::<ohm>(350.0), 2.0)?;
    /// let l = Layout::standard(beam, &g, Arrangement::Quarter, 50.0)?;
    /// let basis = Wrench::zero().with(LoadComponent::Fx, 500.0);
    /// let r = l.report_with(0, &basis)?;
    /// // A quarter bridge on a bending beam sees axial load: 500 N along the beam.
    /// assert!(r.cross_talk[0].unwrap() > 0.1);
    /// // and its output is not linear (the quarter bridge law).
    /// assert!(r.nonlinearity > 0.0);
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn report_with(&self, bridge: usize, basis: &Wrench) -> Result<BridgeReport, PhysicsError> {
        let name = self.wiring(bridge)?.name.clone();
        let cap = self.capacity();
        let t0 = self.reference_temperature();
        let per_load = self.per_load(bridge)?;
        let zero = self.output(bridge, &Wrench::zero(), t0)?;
        let exact = self.output(bridge, &cap, t0)? - zero;
        let linear = self.linear_output(bridge, &cap)?;
        if linear.value() == 0.0 || exact.value() == 0.0 {
            return Err(PhysicsError::NoSolution {
                what: format!("the rated output of bridge {name}"),
                reason: "the bridge does not respond to the rated load".into(),
            });
        }
        let primary = self.primary();
        let mut cross_talk = [None; 6];
        for c in LoadComponent::ALL {
            if c != primary {
                cross_talk[c.index()] =
                    Some(100.0 * per_load[c.index()] * basis.get(c) / exact.value().abs());
            }
        }
        let (lo, hi) = (self.at(-DT), self.at(DT));
        let zero_per_kelvin = (self.output(bridge, &Wrench::zero(), hi)?
            - self.output(bridge, &Wrench::zero(), lo)?)
        .value()
            / (2.0 * DT);
        let ro = |t| -> Result<f64, PhysicsError> {
            Ok((self.output(bridge, &cap, t)? - self.output(bridge, &Wrench::zero(), t)?).value())
        };
        let span_per_kelvin = (ro(hi)? - ro(lo)?) / (2.0 * DT) / exact.value();
        let mut worst: f64 = 0.0;
        for k in 1..SCAN {
            let f = k as f64 / SCAN as f64;
            let v = (self.output(bridge, &cap.scaled(f), t0)? - zero).value();
            worst = worst.max((v - f * exact.value()).abs());
        }
        Ok(BridgeReport {
            bridge: name,
            primary,
            capacity: cap,
            per_load,
            zero_per_kelvin,
            span_per_kelvin,
            rated_output: exact,
            cross_talk_basis: *basis,
            cross_talk,
            nonlinearity: 100.0 * (linear.value() - exact.value()) / linear.value(),
            endpoint_nonlinearity: 100.0 * worst / exact.value().abs(),
        })
    }

    /// The response matrix of every bridge.
    ///
    /// ```
    /// # use gaugebook::{Arrangement, Cantilever, Gauge, Layout, LoadComponent, Wrench, material};
    /// # use gaugebook::units::{ElectricalResistance, Length};
    /// # use uom::si::{electrical_resistance::ohm, length::millimeter};
    /// # let mm = Length::new::<millimeter>;
    /// # let beam = Cantilever::new(material("2024-T351")?, mm(100.0), mm(20.0), mm(5.0), mm(30.0))?;
    /// # let g = Gauge::new(ElectricalResistance::new::<ohm>(350.0), 2.0)?;
    /// # let l = Layout::standard(beam, &g, Arrangement::FullBending, 50.0)?;
    /// let m = l.response_matrix()?;
    /// assert_eq!(m.per_load.len(), 1);
    /// assert!(m.per_kelvin[0].abs() < 1e-15);
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn response_matrix(&self) -> Result<ResponseMatrix, PhysicsError> {
        let mut m = ResponseMatrix {
            bridges: vec![],
            per_load: vec![],
            per_kelvin: vec![],
        };
        let (lo, hi) = (self.at(-DT), self.at(DT));
        for (i, w) in self.bridges().iter().enumerate() {
            m.bridges.push(w.name.clone());
            m.per_load.push(self.per_load(i)?);
            let z = (self.output(i, &Wrench::zero(), hi)? - self.output(i, &Wrench::zero(), lo)?)
                .value()
                / (2.0 * DT);
            m.per_kelvin.push(z);
        }
        Ok(m)
    }
}
