//! Notebook views of the bridge results that are not plain quantities: a shunt-calibration
//! point (with the definition its strain follows, stated in the view) and a gauge's dissipation.

use uom::si::electric_current::milliampere;
use uom::si::electrical_resistance::kiloohm;
use uom::si::heat_flux_density::watt_per_square_meter;
use uom::si::power::milliwatt;

use super::grid::{Grid, num};
use crate::{GaugeDissipation, MimeBundle, ShuntCalibration, ToMime};

impl ToMime for ShuntCalibration {
    /// Plain text: one line; HTML: shunt, arm, arrangement, definition, strain and output.
    ///
    /// ```
    /// use gaugebook::{ArmId, Arrangement, Gauge, ShuntCalibration, ShuntDefinition, ToMime};
    /// use gaugebook::units::ElectricalResistance;
    /// use uom::si::electrical_resistance::{kiloohm, ohm};
    /// let g = Gauge::new(ElectricalResistance::new::<ohm>(350.0), 2.0)?;
    /// let c = ShuntCalibration::simulate(Arrangement::Quarter, &g, 0.3, ArmId::R1,
    ///     ElectricalResistance::new::<kiloohm>(174.65), ShuntDefinition::ResistanceEquivalent)?;
    /// let b = c.to_mime();
    /// // −350/(2·(350 + 174 650)) = −1000 µε (the resistance-equivalent definition).
    /// assert!(b.get("text/plain").unwrap().contains("-1000 µε"));
    /// assert!(b.get("text/html").unwrap().contains("resistance-equivalent"));
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    fn to_mime(&self) -> MimeBundle {
        let shunt = num(self.shunt().get::<kiloohm>());
        let plain = format!(
            "shunt {shunt} kΩ across {} of a {} bridge: {} ({} definition), {}",
            self.arm(),
            self.arrangement(),
            self.strain(),
            self.definition().name(),
            self.output()
        );
        let mut g = Grid::new("shunt calibration", &["figure", "value"]);
        g.row(vec!["shunt".into(), format!("{shunt} kΩ")]);
        g.row(vec!["across arm".into(), self.arm().to_string()]);
        g.row(vec!["arrangement".into(), self.arrangement().to_string()]);
        g.row(vec!["definition".into(), self.definition().name().into()]);
        g.row(vec!["equivalent strain".into(), self.strain().to_string()]);
        g.row(vec!["bridge output".into(), self.output().to_string()]);
        MimeBundle::text(plain).with("text/html", g.to_html())
    }
}

impl ToMime for GaugeDissipation {
    /// Plain text: one line; HTML: current, power and (when the grid size is known) power
    /// density.
    ///
    /// ```
    /// use gaugebook::{Arrangement, Excitation, Gauge, GaugeDissipation, ToMime};
    /// use gaugebook::units::{ElectricalResistance, ElectricPotential};
    /// use uom::si::{electric_potential::volt, electrical_resistance::ohm};
    /// let g = Gauge::new(ElectricalResistance::new::<ohm>(350.0), 2.0)?;
    /// let d = GaugeDissipation::in_bridge(&g, Arrangement::Quarter,
    ///     Excitation::voltage(ElectricPotential::new::<volt>(10.0))?)?;
    /// // V/(2R) = 10/700 A = 14.2857 mA through the gauge.
    /// assert!(d.to_mime().get("text/plain").unwrap().starts_with("gauge current 14.2857 mA"));
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    fn to_mime(&self) -> MimeBundle {
        let i = num(self.current().get::<milliampere>());
        let p = num(self.power().get::<milliwatt>());
        let q = self
            .power_density()
            .map(|q| num(q.get::<watt_per_square_meter>() * 1e-6));
        let mut plain = format!("gauge current {i} mA, power {p} mW");
        let mut g = Grid::new("gauge dissipation", &["figure", "value", "unit"]);
        g.row(vec!["current".into(), i, "mA".into()]);
        g.row(vec!["power".into(), p, "mW".into()]);
        match q {
            Some(q) => {
                plain.push_str(&format!(", {q} W/mm²"));
                g.row(vec!["power density".into(), q, "W/mm²".into()]);
            }
            None => g.note("Power density needs the gauge's grid size."),
        }
        MimeBundle::text(plain).with("text/html", g.to_html())
    }
}
