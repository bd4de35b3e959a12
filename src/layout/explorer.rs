//! A layout: gauges placed on one spring element and wired into the arms of one or more
//! bridges, and the bridge outputs that follow for any load and temperature.

use std::fmt;
use std::sync::Arc;

use uom::si::electrical_resistance::ohm;
use uom::si::temperature_coefficient::per_kelvin;
use uom::si::thermodynamic_temperature::{degree_celsius, kelvin};

use super::placement::Placement;
use crate::bridge::{Arm, WheatstoneBridge};
use crate::error::PhysicsError;
use crate::spring::{LoadComponent, SpringElement, Wrench};
use crate::units::{ElectricalResistance, ThermodynamicTemperature};
use crate::{OutputRatio, Strain};

/// One bridge of a layout: which placements are in each arm (in series), and the completion
/// resistance of arms without gauges.
///
/// ```
/// use gaugebook::BridgeWiring;
/// use gaugebook::units::ElectricalResistance;
/// use uom::si::electrical_resistance::ohm;
/// let w = BridgeWiring { name: "Fz".into(), arms: [vec![0], vec![1], vec![], vec![]],
///     completion: ElectricalResistance::new::<ohm>(350.0) };
/// assert_eq!(w.gauge_count(), 2);
/// ```
#[derive(Debug, Clone, PartialEq)]
pub struct BridgeWiring {
    /// The bridge's name.
    pub name: String,
    /// Placement indices in arms R1..R4 (numbering of [`WheatstoneBridge`]); an empty arm is a
    /// fixed completion resistor.
    pub arms: [Vec<usize>; 4],
    /// The resistance of each completion resistor.
    pub completion: ElectricalResistance,
}

impl BridgeWiring {
    /// How many gauges the bridge uses.
    ///
    /// ```
    /// # use gaugebook::{Arrangement, Cantilever, Gauge, Layout, LoadComponent, Wrench, material};
    /// # use gaugebook::units::{ElectricalResistance, Length};
    /// # use uom::si::{electrical_resistance::ohm, length::millimeter};
    /// # let mm = Length::new::<millimeter>;
    /// # let beam = Cantilever::new(material("2024-T351")?, mm(100.0), mm(20.0), mm(5.0), mm(30.0))?;
    /// # let g = Gauge::new(ElectricalResistance::new::<ohm>(350.0), 2.0)?;
    /// # let l = Layout::standard(beam, &g, Arrangement::FullBending, 50.0)?;
    /// let w = &l.bridges()[0];
    /// assert_eq!(w.gauge_count(), 4);
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn gauge_count(&self) -> usize {
        self.arms.iter().map(Vec::len).sum()
    }
}

/// Gauges at sites on a spring element, wired into bridges, with the element's rated load.
///
/// Temperature: each gauge's relative resistance change is
/// x = (F(T)/F)·(1 + β_E·ΔT)⁻¹·ΔR/R(ε_a, ε_t under the expanded load) + F·ε_thermal(T) +
/// ΔR/R(Δα·ΔT, Δα·ΔT), with F(T) the gauge factor's drift, β_E the material's modulus
/// coefficient (strain ∝ 1/E), ε_thermal the gauge's thermal-output polynomial and Δα the
/// mismatch between the element's expansion and the thermal output's reference material, ΔT from
/// the layout's reference temperature (20 °C unless set; ISO 1:2016 standard reference
/// temperature). The element's own expansion α·ΔT scales every length by s = 1 + α·ΔT, so the
/// nominal stress of a force (∝ F/length²) falls as s⁻² and that of a moment (∝ M/length³) as
/// s⁻³ (dimensional analysis of the closed forms); the strain is taken under the wrench with
/// its forces scaled by s⁻² and its moments by s⁻³. The span drift of a bridge whose output is
/// linear in x is therefore TC_F − β_E − 2α for a force and TC_F − β_E − 3α for a moment.
/// Series gauges in an arm add their resistances. Design estimates must be proven by test.
///
/// ```
/// use gaugebook::{Arrangement, Cantilever, Gauge, Layout, LoadComponent, Wrench, material};
/// use gaugebook::units::{ElectricalResistance, Length};
/// use uom::si::{electrical_resistance::ohm, length::millimeter};
/// let mm = Length::new::<millimeter>;
/// let beam = Cantilever::new(material("2024-T351")?, mm(100.0), mm(20.0), mm(5.0), mm(30.0))?;
/// let g = Gauge::new(ElectricalResistance::new::<ohm>(350.0), 2.0)?;
/// let layout = Layout::standard(beam, &g, Arrangement::FullBending, 50.0)?;
/// let r = layout.report(0)?;
/// // Four active arms: Vo/V = F·ε, ε = 6·50·0.07/(73.1e9·0.02·0.005²) = 574.6 µε.
/// assert!((r.rated_output.mv_per_v() - 2.0 * 0.5746).abs() < 1e-3);
/// assert!(r.cross_talk[LoadComponent::Fx.index()].unwrap().abs() < 1e-9);
/// # Ok::<(), gaugebook::PhysicsError>(())
/// ```
#[derive(Clone)]
pub struct Layout {
    element: Arc<dyn SpringElement + Send + Sync>,
    capacity: Wrench,
    placements: Vec<Placement>,
    bridges: Vec<BridgeWiring>,
    reference: ThermodynamicTemperature,
}

impl fmt::Debug for Layout {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        f.debug_struct("Layout")
            .field("element", &self.element.kind())
            .field("capacity", &self.capacity)
            .field("placements", &self.placements)
            .field("bridges", &self.bridges)
            .finish()
    }
}

impl Layout {
    /// An empty layout on `element` rated at `capacity` (N or N·m, signed) along the element's
    /// primary component.
    ///
    /// ```
    /// use gaugebook::{Column, ColumnSection, Layout, material};
    /// use gaugebook::units::Length;
    /// use uom::si::length::millimeter;
    /// let mm = Length::new::<millimeter>;
    /// let col = Column::new(material("4340")?, ColumnSection::Round { diameter: mm(20.0) }, mm(60.0), mm(30.0))?;
    /// assert!(Layout::new(col.clone(), 0.0).is_err());
    /// let l = Layout::new(col, -50e3)?;
    /// assert_eq!(l.placements().len(), 0);
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn new(
        element: impl SpringElement + Send + Sync + 'static,
        capacity: f64,
    ) -> Result<Layout, PhysicsError> {
        let primary = element.primary();
        if !(capacity.is_finite() && capacity != 0.0) {
            return Err(PhysicsError::invalid(
                "capacity",
                format!("{capacity} {}", primary.unit_symbol()),
                "a finite, non-zero load",
            ));
        }
        Ok(Layout {
            element: Arc::new(element),
            capacity: Wrench::only(primary, capacity),
            placements: Vec::new(),
            bridges: Vec::new(),
            reference: ThermodynamicTemperature::new::<degree_celsius>(20.0),
        })
    }

    /// The same layout with a full rated wrench (for elements rated under combined load).
    ///
    /// ```
    /// # use gaugebook::{Arrangement, Cantilever, Gauge, Layout, LoadComponent, Wrench, material};
    /// # use gaugebook::units::{ElectricalResistance, Length};
    /// # use uom::si::{electrical_resistance::ohm, length::millimeter};
    /// # let mm = Length::new::<millimeter>;
    /// # let beam = Cantilever::new(material("2024-T351")?, mm(100.0), mm(20.0), mm(5.0), mm(30.0))?;
    /// # let g = Gauge::new(ElectricalResistance::new::<ohm>(350.0), 2.0)?;
    /// # let l = Layout::standard(beam, &g, Arrangement::FullBending, 50.0)?;
    /// let l = l.with_capacity_load(Wrench::only(LoadComponent::Fz, 40.0).with(LoadComponent::Fx, 5.0));
    /// assert_eq!(l.capacity().get(LoadComponent::Fx), 5.0);
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn with_capacity_load(mut self, rated: Wrench) -> Layout {
        self.capacity = rated;
        self
    }

    /// The same layout with another reference temperature (where the zero and span are
    /// referred to).
    ///
    /// ```
    /// # use gaugebook::{Arrangement, Cantilever, Gauge, Layout, LoadComponent, Wrench, material};
    /// # use gaugebook::units::{ElectricalResistance, Length};
    /// # use uom::si::{electrical_resistance::ohm, length::millimeter};
    /// # let mm = Length::new::<millimeter>;
    /// # let beam = Cantilever::new(material("2024-T351")?, mm(100.0), mm(20.0), mm(5.0), mm(30.0))?;
    /// # let g = Gauge::new(ElectricalResistance::new::<ohm>(350.0), 2.0)?;
    /// # let l = Layout::standard(beam, &g, Arrangement::FullBending, 50.0)?;
    /// use gaugebook::units::ThermodynamicTemperature;
    /// use uom::si::thermodynamic_temperature::degree_celsius;
    /// let l = l.with_reference_temperature(ThermodynamicTemperature::new::<degree_celsius>(23.0));
    /// assert!((l.reference_temperature().get::<degree_celsius>() - 23.0).abs() < 1e-9);
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn with_reference_temperature(mut self, t: ThermodynamicTemperature) -> Layout {
        self.reference = t;
        self
    }

    /// Places a gauge; errors if the label is taken or the grid does not fit on the element.
    /// Returns the placement's index.
    ///
    /// ```
    /// use gaugebook::{Cantilever, Gauge, Layout, Placement, SpringElement, material};
    /// use gaugebook::units::{Angle, ElectricalResistance, Length};
    /// use uom::si::{electrical_resistance::ohm, length::millimeter};
    /// let mm = Length::new::<millimeter>;
    /// let beam = Cantilever::new(material("7075-T6")?, mm(100.0), mm(20.0), mm(5.0), mm(30.0))?;
    /// let top = beam.site("top")?;
    /// let mut l = Layout::new(beam, 20.0)?;
    /// let g = Gauge::new(ElectricalResistance::new::<ohm>(350.0), 2.0)?.with_grid(mm(80.0), mm(2.0))?;
    /// // An 80 mm grid centred 30 mm from the root hangs off the beam.
    /// assert!(l.place(Placement::new("T1", g, top, Angle::default())).is_err());
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn place(&mut self, placement: Placement) -> Result<usize, PhysicsError> {
        if self.placements.iter().any(|p| p.label == placement.label) {
            return Err(PhysicsError::invalid(
                "gauge label",
                &placement.label,
                "a label not used by another gauge of the layout",
            ));
        }
        placement.averaged_strain(self.element.as_ref(), &self.capacity)?;
        self.placements.push(placement);
        Ok(self.placements.len() - 1)
    }

    /// Wires placed gauges (by label) into arms R1..R4 of a new bridge; an empty arm is a fixed
    /// completion resistor equal to the first gauge's resistance. Returns the bridge's index.
    ///
    /// ```
    /// use gaugebook::{Cantilever, Gauge, Layout, Placement, SpringElement, material};
    /// use gaugebook::units::{Angle, ElectricalResistance, Length};
    /// use uom::si::{electrical_resistance::ohm, length::millimeter};
    /// let mm = Length::new::<millimeter>;
    /// let beam = Cantilever::new(material("7075-T6")?, mm(100.0), mm(20.0), mm(5.0), mm(30.0))?;
    /// let (top, bottom) = (beam.site("top")?, beam.site("bottom")?);
    /// let g = Gauge::new(ElectricalResistance::new::<ohm>(350.0), 2.0)?;
    /// let mut l = Layout::new(beam, 20.0)?;
    /// l.place(Placement::new("B", g.clone(), bottom, Angle::default()))?;
    /// l.place(Placement::new("T", g, top, Angle::default()))?;
    /// let i = l.wire("half", [&["B"], &["T"], &[], &[]])?;
    /// assert!(l.wire("bad", [&["X"], &[], &[], &[]]).is_err());
    /// assert!(l.report(i)?.rated_output.mv_per_v() > 0.0);
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn wire(&mut self, name: &str, arms: [&[&str]; 4]) -> Result<usize, PhysicsError> {
        let mut idx: [Vec<usize>; 4] = Default::default();
        let mut used = Vec::new();
        for (k, labels) in arms.iter().enumerate() {
            for label in labels.iter() {
                let i = self.index_of(label)?;
                if used.contains(&i) {
                    return Err(PhysicsError::invalid(
                        "bridge wiring",
                        format!("gauge {label} in two arms of bridge {name}"),
                        "each gauge in one arm",
                    ));
                }
                used.push(i);
                idx[k].push(i);
            }
        }
        let Some(&first) = used.first() else {
            return Err(PhysicsError::invalid(
                "bridge wiring",
                "no gauges",
                "at least one gauge",
            ));
        };
        let completion = self.placements[first].gauge.resistance();
        self.bridges.push(BridgeWiring {
            name: name.to_string(),
            arms: idx,
            completion,
        });
        Ok(self.bridges.len() - 1)
    }

    fn index_of(&self, label: &str) -> Result<usize, PhysicsError> {
        self.placements
            .iter()
            .position(|p| p.label == label)
            .ok_or_else(|| {
                let labels: Vec<&str> = self.placements.iter().map(|p| p.label.as_str()).collect();
                PhysicsError::invalid(
                    "gauge label",
                    label,
                    format!("one of {}", labels.join(", ")),
                )
            })
    }

    /// The element.
    ///
    /// ```
    /// # use gaugebook::{Arrangement, Cantilever, Gauge, Layout, LoadComponent, Wrench, material};
    /// # use gaugebook::units::{ElectricalResistance, Length};
    /// # use uom::si::{electrical_resistance::ohm, length::millimeter};
    /// # let mm = Length::new::<millimeter>;
    /// # let beam = Cantilever::new(material("2024-T351")?, mm(100.0), mm(20.0), mm(5.0), mm(30.0))?;
    /// # let g = Gauge::new(ElectricalResistance::new::<ohm>(350.0), 2.0)?;
    /// # let l = Layout::standard(beam, &g, Arrangement::FullBending, 50.0)?;
    /// assert_eq!(l.element().kind(), "cantilever bending beam");
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn element(&self) -> &dyn SpringElement {
        self.element.as_ref()
    }

    /// The rated load.
    ///
    /// ```
    /// # use gaugebook::{Arrangement, Cantilever, Gauge, Layout, LoadComponent, Wrench, material};
    /// # use gaugebook::units::{ElectricalResistance, Length};
    /// # use uom::si::{electrical_resistance::ohm, length::millimeter};
    /// # let mm = Length::new::<millimeter>;
    /// # let beam = Cantilever::new(material("2024-T351")?, mm(100.0), mm(20.0), mm(5.0), mm(30.0))?;
    /// # let g = Gauge::new(ElectricalResistance::new::<ohm>(350.0), 2.0)?;
    /// # let l = Layout::standard(beam, &g, Arrangement::FullBending, 50.0)?;
    /// assert_eq!(l.capacity().get(LoadComponent::Fz), 50.0);
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn capacity(&self) -> Wrench {
        self.capacity
    }

    /// The reference temperature.
    ///
    /// ```
    /// # use gaugebook::{Arrangement, Cantilever, Gauge, Layout, LoadComponent, Wrench, material};
    /// # use gaugebook::units::{ElectricalResistance, Length};
    /// # use uom::si::{electrical_resistance::ohm, length::millimeter};
    /// # let mm = Length::new::<millimeter>;
    /// # let beam = Cantilever::new(material("2024-T351")?, mm(100.0), mm(20.0), mm(5.0), mm(30.0))?;
    /// # let g = Gauge::new(ElectricalResistance::new::<ohm>(350.0), 2.0)?;
    /// # let l = Layout::standard(beam, &g, Arrangement::FullBending, 50.0)?;
    /// use uom::si::thermodynamic_temperature::degree_celsius;
    /// assert!((l.reference_temperature().get::<degree_celsius>() - 20.0).abs() < 1e-9);
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn reference_temperature(&self) -> ThermodynamicTemperature {
        self.reference
    }

    /// The placed gauges.
    ///
    /// ```
    /// # use gaugebook::{Arrangement, Cantilever, Gauge, Layout, LoadComponent, Wrench, material};
    /// # use gaugebook::units::{ElectricalResistance, Length};
    /// # use uom::si::{electrical_resistance::ohm, length::millimeter};
    /// # let mm = Length::new::<millimeter>;
    /// # let beam = Cantilever::new(material("2024-T351")?, mm(100.0), mm(20.0), mm(5.0), mm(30.0))?;
    /// # let g = Gauge::new(ElectricalResistance::new::<ohm>(350.0), 2.0)?;
    /// # let l = Layout::standard(beam, &g, Arrangement::FullBending, 50.0)?;
    /// assert_eq!(l.placements().len(), 4);
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn placements(&self) -> &[Placement] {
        &self.placements
    }

    /// The bridges.
    ///
    /// ```
    /// # use gaugebook::{Arrangement, Cantilever, Gauge, Layout, LoadComponent, Wrench, material};
    /// # use gaugebook::units::{ElectricalResistance, Length};
    /// # use uom::si::{electrical_resistance::ohm, length::millimeter};
    /// # let mm = Length::new::<millimeter>;
    /// # let beam = Cantilever::new(material("2024-T351")?, mm(100.0), mm(20.0), mm(5.0), mm(30.0))?;
    /// # let g = Gauge::new(ElectricalResistance::new::<ohm>(350.0), 2.0)?;
    /// # let l = Layout::standard(beam, &g, Arrangement::FullBending, 50.0)?;
    /// assert_eq!(l.bridges()[0].name, "full-bending");
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn bridges(&self) -> &[BridgeWiring] {
        &self.bridges
    }

    /// The same layout with placement `index` replaced (for tolerance studies).
    ///
    /// ```
    /// # use gaugebook::{Arrangement, Cantilever, Gauge, Layout, LoadComponent, Wrench, material};
    /// # use gaugebook::units::{ElectricalResistance, Length};
    /// # use uom::si::{electrical_resistance::ohm, length::millimeter};
    /// # let mm = Length::new::<millimeter>;
    /// # let beam = Cantilever::new(material("2024-T351")?, mm(100.0), mm(20.0), mm(5.0), mm(30.0))?;
    /// # let g = Gauge::new(ElectricalResistance::new::<ohm>(350.0), 2.0)?;
    /// # let l = Layout::standard(beam, &g, Arrangement::FullBending, 50.0)?;
    /// use gaugebook::units::Angle;
    /// use uom::si::angle::degree;
    /// let p = l.placements()[0].displaced(Angle::new::<degree>(3.0), mm(0.0), mm(0.0));
    /// let moved = l.with_placement(0, p)?;
    /// assert!(moved.report(0)?.rated_output < l.report(0)?.rated_output);
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn with_placement(
        &self,
        index: usize,
        placement: Placement,
    ) -> Result<Layout, PhysicsError> {
        if index >= self.placements.len() {
            return Err(PhysicsError::invalid(
                "placement index",
                index,
                format!("below {}", self.placements.len()),
            ));
        }
        placement.averaged_strain(self.element.as_ref(), &self.capacity)?;
        let mut l = self.clone();
        l.placements[index] = placement;
        Ok(l)
    }

    pub(crate) fn wiring(&self, bridge: usize) -> Result<&BridgeWiring, PhysicsError> {
        self.bridges.get(bridge).ok_or_else(|| {
            PhysicsError::invalid(
                "bridge index",
                bridge,
                format!("below {}", self.bridges.len()),
            )
        })
    }

    /// The relative resistance change of placement `i` under `load` at temperature `t`.
    ///
    /// ```
    /// use gaugebook::{Arrangement, Cantilever, Gauge, Layout, LoadComponent, Wrench, material};
    /// use gaugebook::units::{ElectricalResistance, Length};
    /// use uom::si::{electrical_resistance::ohm, length::millimeter};
    /// let mm = Length::new::<millimeter>;
    /// let beam = Cantilever::new(material("2024-T351")?, mm(100.0), mm(20.0), mm(5.0), mm(30.0))?;
    /// let g = Gauge::new(ElectricalResistance::new::<ohm>(350.0), 2.0)?;
    /// let l = Layout::standard(beam, &g, Arrangement::Quarter, 50.0)?;
    /// let x = l.relative_change(0, &Wrench::only(LoadComponent::Fz, 50.0), l.reference_temperature())?;
    /// assert!(x > 0.0);
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn relative_change(
        &self,
        i: usize,
        load: &Wrench,
        t: ThermodynamicTemperature,
    ) -> Result<f64, PhysicsError> {
        let p = self.placements.get(i).ok_or_else(|| {
            PhysicsError::invalid(
                "placement index",
                i,
                format!("below {}", self.placements.len()),
            )
        })?;
        let dt = t.get::<kelvin>() - self.reference.get::<kelvin>();
        let m = self.element.material();
        let expanded = expanded_load(load, m.expansion().get::<per_kelvin>() * dt);
        let (ea, et) = p.grid_strains(self.element.as_ref(), &expanded)?;
        let g = &p.gauge;
        let modulus = 1.0 + m.modulus_tc().get::<per_kelvin>() * dt;
        let mech = g.gauge_factor_at(t) / g.gauge_factor() * g.relative_change(ea, et) / modulus;
        let thermal = g.gauge_factor() * g.thermal_output(t).value();
        let mismatch = match p.thermal_output_expansion {
            None => 0.0,
            Some(a_ref) => {
                let d = Strain::new(
                    (m.expansion().get::<per_kelvin>() - a_ref.get::<per_kelvin>()) * dt,
                );
                g.relative_change(d, d)
            }
        };
        Ok(mech + thermal + mismatch)
    }

    fn arm_changes(
        &self,
        w: &BridgeWiring,
        load: &Wrench,
        t: ThermodynamicTemperature,
    ) -> Result<[Option<(f64, f64)>; 4], PhysicsError> {
        let mut out = [None; 4];
        for (k, arm) in w.arms.iter().enumerate() {
            if arm.is_empty() {
                continue;
            }
            let mut total = 0.0;
            let mut change = 0.0;
            for &i in arm {
                let r = self.placements[i].gauge.resistance().get::<ohm>();
                total += r;
                change += r * self.relative_change(i, load, t)?;
            }
            out[k] = Some((total, change / total));
        }
        Ok(out)
    }

    /// The bridge `bridge` under `load` at temperature `t`, as a [`WheatstoneBridge`] (so trims,
    /// excitation and the exact law come from the bridge module).
    ///
    /// ```
    /// use gaugebook::{Arrangement, Cantilever, Gauge, Layout, LoadComponent, Wrench, material};
    /// use gaugebook::units::{ElectricalResistance, Length};
    /// use uom::si::{electrical_resistance::ohm, length::millimeter};
    /// let mm = Length::new::<millimeter>;
    /// let beam = Cantilever::new(material("2024-T351")?, mm(100.0), mm(20.0), mm(5.0), mm(30.0))?;
    /// let g = Gauge::new(ElectricalResistance::new::<ohm>(350.0), 2.0)?;
    /// let l = Layout::standard(beam, &g, Arrangement::HalfBending, 50.0)?;
    /// let b = l.bridge_at(0, &Wrench::zero(), l.reference_temperature())?;
    /// assert!(b.output_ratio().value().abs() < 1e-15);
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn bridge_at(
        &self,
        bridge: usize,
        load: &Wrench,
        t: ThermodynamicTemperature,
    ) -> Result<WheatstoneBridge, PhysicsError> {
        let w = self.wiring(bridge)?;
        let changes = self.arm_changes(w, load, t)?;
        let arm = |c: Option<(f64, f64)>| match c {
            None => Arm::fixed(w.completion),
            Some((total, x)) => Arm::gauge(ElectricalResistance::new::<ohm>(total), x),
        };
        Ok(WheatstoneBridge::new([
            arm(changes[0])?,
            arm(changes[1])?,
            arm(changes[2])?,
            arm(changes[3])?,
        ]))
    }

    /// The exact output ratio of bridge `bridge` under `load` at temperature `t`.
    ///
    /// ```
    /// # use gaugebook::{Arrangement, Cantilever, Gauge, Layout, LoadComponent, Wrench, material};
    /// # use gaugebook::units::{ElectricalResistance, Length};
    /// # use uom::si::{electrical_resistance::ohm, length::millimeter};
    /// # let mm = Length::new::<millimeter>;
    /// # let beam = Cantilever::new(material("2024-T351")?, mm(100.0), mm(20.0), mm(5.0), mm(30.0))?;
    /// # let g = Gauge::new(ElectricalResistance::new::<ohm>(350.0), 2.0)?;
    /// # let l = Layout::standard(beam, &g, Arrangement::FullBending, 50.0)?;
    /// let r = l.output(0, &Wrench::only(LoadComponent::Fz, 50.0), l.reference_temperature())?;
    /// assert!(r.mv_per_v() > 1.0);
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn output(
        &self,
        bridge: usize,
        load: &Wrench,
        t: ThermodynamicTemperature,
    ) -> Result<OutputRatio, PhysicsError> {
        Ok(self.bridge_at(bridge, load, t)?.output_ratio())
    }

    /// The linearised output (small-signal, about the unstrained bridge) under `load` at the
    /// reference temperature: Σ ∂(Vo/V)/∂xᵢ · xᵢ with ∂/∂x₁ = R₁R₂/(R₁+R₂)², ∂/∂x₂ = −R₁R₂/(R₁+R₂)²,
    /// ∂/∂x₃ = R₃R₄/(R₃+R₄)², ∂/∂x₄ = −R₃R₄/(R₃+R₄)² (derivatives of the bridge equation).
    ///
    /// ```
    /// # use gaugebook::{Arrangement, Cantilever, Gauge, Layout, LoadComponent, Wrench, material};
    /// # use gaugebook::units::{ElectricalResistance, Length};
    /// # use uom::si::{electrical_resistance::ohm, length::millimeter};
    /// # let mm = Length::new::<millimeter>;
    /// # let beam = Cantilever::new(material("2024-T351")?, mm(100.0), mm(20.0), mm(5.0), mm(30.0))?;
    /// # let g = Gauge::new(ElectricalResistance::new::<ohm>(350.0), 2.0)?;
    /// # let l = Layout::standard(beam, &g, Arrangement::FullBending, 50.0)?;
    /// let w = Wrench::only(LoadComponent::Fz, 50.0);
    /// let lin = l.linear_output(0, &w)?;
    /// let exact = l.output(0, &w, l.reference_temperature())?;
    /// // A full bending bridge is exactly linear.
    /// assert!((lin - exact).value().abs() < 1e-15);
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn linear_output(&self, bridge: usize, load: &Wrench) -> Result<OutputRatio, PhysicsError> {
        let w = self.wiring(bridge)?;
        let zero = self.arm_changes(w, &Wrench::zero(), self.reference)?;
        let loaded = self.arm_changes(w, load, self.reference)?;
        let c = w.completion.get::<ohm>();
        let r: Vec<f64> = zero
            .iter()
            .map(|a| a.map_or(c, |(total, _)| total))
            .collect();
        let s12 = r[0] * r[1] / (r[0] + r[1]).powi(2);
        let s34 = r[2] * r[3] / (r[2] + r[3]).powi(2);
        let partial = [s12, -s12, s34, -s34];
        let mut v = 0.0;
        for k in 0..4 {
            if let (Some((_, x1)), Some((_, x0))) = (loaded[k], zero[k]) {
                v += partial[k] * (x1 - x0);
            }
        }
        Ok(OutputRatio::new(v))
    }

    /// The primary load component.
    ///
    /// ```
    /// # use gaugebook::{Arrangement, Cantilever, Gauge, Layout, LoadComponent, Wrench, material};
    /// # use gaugebook::units::{ElectricalResistance, Length};
    /// # use uom::si::{electrical_resistance::ohm, length::millimeter};
    /// # let mm = Length::new::<millimeter>;
    /// # let beam = Cantilever::new(material("2024-T351")?, mm(100.0), mm(20.0), mm(5.0), mm(30.0))?;
    /// # let g = Gauge::new(ElectricalResistance::new::<ohm>(350.0), 2.0)?;
    /// # let l = Layout::standard(beam, &g, Arrangement::FullBending, 50.0)?;
    /// assert_eq!(l.primary(), LoadComponent::Fz);
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn primary(&self) -> LoadComponent {
        self.element.primary()
    }
}

/// The wrench that gives, on the element as it was, the stresses `load` gives on the element
/// expanded by `strain` (α·ΔT) in every length: forces scale by s⁻², moments by s⁻³, s = 1 +
/// strain (nominal stress ∝ F/length² and M/length³, dimensional analysis).
fn expanded_load(load: &Wrench, strain: f64) -> Wrench {
    if strain == 0.0 {
        return *load;
    }
    let s = 1.0 + strain;
    LoadComponent::ALL.iter().fold(*load, |w, &c| {
        let k = if c.is_moment() {
            s.powi(-3)
        } else {
            s.powi(-2)
        };
        w.with(c, load.get(c) * k)
    })
}
