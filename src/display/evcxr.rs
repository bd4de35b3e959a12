//! Rich display in evcxr_jupyter Rust notebooks (feature `evcxr`).
//!
//! evcxr shows the last expression of a cell by calling an inherent method named
//! `evcxr_display` when the type has one (otherwise it prints `Debug`); the method prints
//! `EVCXR_BEGIN_CONTENT <mime>` … `EVCXR_END_CONTENT` blocks to standard output, which the
//! kernel turns into a display bundle (evcxr's documented display convention). Quantities and
//! the strain and output-ratio newtypes print their readable text (`1000 µε`, `2 mV/V`);
//! results that have a [`ToMime`] view print its HTML table (or, for figures, SVG and PNG)
//! beside the text. The methods are inherent, not a trait, because that is what evcxr looks
//! for; one macro writes them all so the text and the rich view cannot drift apart.

use std::fmt::Display;

use crate::{MimeBundle, ToMime};

/// What a text-only value shows: its `Display` form as `text/plain`.
fn text_bundle(value: &impl Display) -> MimeBundle {
    MimeBundle::text(value.to_string())
}

/// What a value with a rich view shows: every representation of its bundle.
fn rich_bundle(value: &impl ToMime) -> MimeBundle {
    value.to_mime()
}

/// `evcxr_display` from `Display`, for values a person reads as one line of text.
macro_rules! evcxr_text {
    ($($t:ty => $example:literal),* $(,)?) => {$(
        impl $t {
            #[doc = concat!(
                "Shows the value in an evcxr_jupyter notebook as readable text (its `Display` ",
                "form); evcxr calls this for a cell's last expression.\n\n```\n",
                $example,
                "\n```"
            )]
            pub fn evcxr_display(&self) {
                text_bundle(self).evcxr_display();
            }
        }
    )*};
}

/// `evcxr_display` from [`ToMime`], for results shown as an HTML table or a figure.
macro_rules! evcxr_rich {
    ($($t:ty => $example:literal),* $(,)?) => {$(
        impl $t {
            #[doc = concat!(
                "Shows the value in an evcxr_jupyter notebook through its [`ToMime`] view ",
                "(an HTML table or a figure, with the plain text beside it); evcxr calls this ",
                "for a cell's last expression.\n\n```\n",
                $example,
                "\n```"
            )]
            pub fn evcxr_display(&self) {
                rich_bundle(self).evcxr_display();
            }
        }
    )*};
}

evcxr_text! {
    crate::Strain => "gaugebook::Strain::from_microstrain(1000.0).evcxr_display(); // 1000 µε",
    crate::OutputRatio => "gaugebook::OutputRatio::from_mv_per_v(2.0).evcxr_display(); // 2 mV/V",
    crate::Quantity => "gaugebook::Quantity::parse(\"350 ohm\")?.evcxr_display();
# Ok::<(), gaugebook::UnitError>(())",
    crate::Unit => "gaugebook::Unit::parse(\"mV/V\")?.evcxr_display();
# Ok::<(), gaugebook::UnitError>(())",
    crate::Material => "gaugebook::material(\"17-4 PH H1025\")?.evcxr_display();
# Ok::<(), gaugebook::PhysicsError>(())",
    crate::Stiffness => "gaugebook::Stiffness::Translational(2.0e6).evcxr_display(); // 2000 N/mm",
    crate::SurfaceStrain => "use gaugebook::{LoadComponent, SpringElement, TorqueShaft, Wrench, material};
use gaugebook::units::Length;
use uom::si::length::millimeter;
let mm = Length::new::<millimeter>;
let s = TorqueShaft::solid(material(\"4340\")?, mm(20.0), mm(100.0), mm(50.0))?;
s.surface_strain(&s.site(\"+z\")?, &Wrench::only(LoadComponent::Mx, 50.0))?.evcxr_display();
# Ok::<(), gaugebook::PhysicsError>(())",
    crate::Wrench => "use gaugebook::{LoadComponent, Wrench};
Wrench::only(LoadComponent::Fz, 500.0).evcxr_display();",
    crate::Site => "use gaugebook::{SpringElement, TorqueShaft, material};
use gaugebook::units::Length;
use uom::si::length::millimeter;
let mm = Length::new::<millimeter>;
TorqueShaft::solid(material(\"4340\")?, mm(20.0), mm(100.0), mm(50.0))?.site(\"+z\")?.evcxr_display();
# Ok::<(), gaugebook::PhysicsError>(())",
}

evcxr_rich! {
    crate::ReportTable => "gaugebook::ReportTable::new(\"figures\").evcxr_display();",
    crate::CalibrationRun => "use gaugebook::{CalibrationRun, Direction, LoadKind};
let mut run = CalibrationRun::new(LoadKind::Force, \"mV/V\");
run.push_series(&[0.0, 500.0, 1000.0], &[0.0, 1.001, 2.0], Direction::Ascending, 0.0)?;
run.evcxr_display();
# Ok::<(), gaugebook::PhysicsError>(())",
    crate::Characterisation => "use gaugebook::{CalibrationRun, Characterisation, CharacteriseOptions, Direction, LoadKind};
let mut run = CalibrationRun::new(LoadKind::Force, \"mV/V\");
run.push_series(&[0.0, 500.0, 1000.0], &[0.0, 1.001, 2.0], Direction::Ascending, 0.0)?;
let c = Characterisation::from_run(&run, CharacteriseOptions::new(1000.0))?;
c.evcxr_display();
c.nonlinearity_terminal.evcxr_display(); // one Figure
# Ok::<(), gaugebook::PhysicsError>(())",
    crate::Figure => "# use gaugebook::{CalibrationRun, Characterisation, CharacteriseOptions, Direction, LoadKind};
# let mut run = CalibrationRun::new(LoadKind::Force, \"mV/V\");
# run.push_series(&[0.0, 500.0, 1000.0], &[0.0, 1.001, 2.0], Direction::Ascending, 0.0)?;
let c = Characterisation::from_run(&run, CharacteriseOptions::new(1000.0))?;
c.hysteresis.evcxr_display();
# Ok::<(), gaugebook::PhysicsError>(())",
    crate::Fit => "use gaugebook::{Fit, FitModel};
Fit::new(&[0.0, 1.0, 2.0, 3.0], &[1.0, 3.0, 5.0, 7.0], FitModel::Linear)?.evcxr_display();
# Ok::<(), gaugebook::PhysicsError>(())",
    crate::ClassVerdict => "use gaugebook::{Check, ClassVerdict};
ClassVerdict::new(\"ISO 376:2011\", \"1\", vec![Check::at_most(\"creep c\", 0.05, 0.10, \"%\", \"Table 2\")])
    .evcxr_display();",
    crate::GumResult => "use gaugebook::{Budget, Input};
Budget::new(vec![Input::normal(\"x\", 2.0, 0.1, 9.0)?]).evaluate(|x| 3.0 * x[0])?.evcxr_display();
# Ok::<(), gaugebook::PhysicsError>(())",
    crate::DesignReport => "gaugebook::bridge_design_demo()?.evcxr_display();
# Ok::<(), gaugebook::PhysicsError>(())",
    crate::BridgeReport => "use gaugebook::{Arrangement, Gauge, Layout, TorqueShaft, material};
use gaugebook::units::{ElectricalResistance, Length};
use uom::si::{electrical_resistance::ohm, length::millimeter};
let mm = Length::new::<millimeter>;
let s = TorqueShaft::solid(material(\"4340\")?, mm(20.0), mm(100.0), mm(50.0))?;
let g = Gauge::new(ElectricalResistance::new::<ohm>(350.0), 2.0)?;
Layout::standard(s, &g, Arrangement::FullShear, 100.0)?.report(0)?.evcxr_display();
# Ok::<(), gaugebook::PhysicsError>(())",
    crate::ResponseMatrix => "use gaugebook::{Arrangement, Gauge, Layout, TorqueShaft, material};
use gaugebook::units::{ElectricalResistance, Length};
use uom::si::{electrical_resistance::ohm, length::millimeter};
let mm = Length::new::<millimeter>;
let s = TorqueShaft::solid(material(\"4340\")?, mm(20.0), mm(100.0), mm(50.0))?;
let g = Gauge::new(ElectricalResistance::new::<ohm>(350.0), 2.0)?;
Layout::standard(s, &g, Arrangement::FullShear, 100.0)?.response_matrix()?.evcxr_display();
# Ok::<(), gaugebook::PhysicsError>(())",
    crate::SensitivityTable => "use gaugebook::{Arrangement, Cantilever, Gauge, Layout, material};
use gaugebook::units::{Angle, ElectricalResistance, Length};
use uom::si::{angle::degree, electrical_resistance::ohm, length::millimeter};
let mm = Length::new::<millimeter>;
let beam = Cantilever::new(material(\"2024-T351\")?, mm(100.0), mm(20.0), mm(5.0), mm(30.0))?;
let g = Gauge::new(ElectricalResistance::new::<ohm>(350.0), 2.0)?;
let l = Layout::standard(beam, &g, Arrangement::FullBending, 50.0)?;
l.placement_sensitivity(0, Angle::new::<degree>(2.0), mm(0.5))?.evcxr_display();
# Ok::<(), gaugebook::PhysicsError>(())",
    crate::SweepTable => "use gaugebook::{Arrangement, Cantilever, DesignCriteria, Gauge, Layout, material, sweep};
use gaugebook::units::{ElectricalResistance, Length};
use uom::si::{electrical_resistance::ohm, length::millimeter};
let mm = Length::new::<millimeter>;
let g = Gauge::new(ElectricalResistance::new::<ohm>(350.0), 2.0)?;
let build = |h: f64| {
    let beam = Cantilever::new(material(\"2024-T351\")?, mm(100.0), mm(20.0), mm(h), mm(30.0))?;
    Layout::standard(beam, &g, Arrangement::FullBending, 50.0)
};
sweep(\"depth (mm)\", &[4.0, 5.0, 6.0], build, &DesignCriteria::default()).evcxr_display();
# Ok::<(), gaugebook::PhysicsError>(())",
    crate::Margins => "use gaugebook::{LoadComponent, OverloadFactors, SpringElement, TorqueShaft, Wrench, material};
use gaugebook::units::Length;
use uom::si::length::millimeter;
let mm = Length::new::<millimeter>;
let s = TorqueShaft::solid(material(\"4340\")?, mm(20.0), mm(100.0), mm(50.0))?;
s.margins(&Wrench::only(LoadComponent::Mx, 100.0), &OverloadFactors::default())?.evcxr_display();
# Ok::<(), gaugebook::PhysicsError>(())",
    crate::ShuntCalibration => "use gaugebook::{ArmId, Arrangement, Gauge, ShuntCalibration, ShuntDefinition};
use gaugebook::units::ElectricalResistance;
use uom::si::electrical_resistance::{kiloohm, ohm};
let g = Gauge::new(ElectricalResistance::new::<ohm>(350.0), 2.0)?;
ShuntCalibration::simulate(Arrangement::Quarter, &g, 0.3, ArmId::R1,
    ElectricalResistance::new::<kiloohm>(174.65), ShuntDefinition::ResistanceEquivalent)?.evcxr_display();
# Ok::<(), gaugebook::PhysicsError>(())",
    crate::GaugeDissipation => "use gaugebook::{Arrangement, Excitation, Gauge, GaugeDissipation};
use gaugebook::units::{ElectricalResistance, ElectricPotential};
use uom::si::{electric_potential::volt, electrical_resistance::ohm};
let g = Gauge::new(ElectricalResistance::new::<ohm>(350.0), 2.0)?;
GaugeDissipation::in_bridge(&g, Arrangement::Quarter,
    Excitation::voltage(ElectricPotential::new::<volt>(10.0))?)?.evcxr_display();
# Ok::<(), gaugebook::PhysicsError>(())",
    crate::CheckWeighing => "use gaugebook::{Arrangement, CheckWeigher, Gauge, Layout, LoadComponent, Parallelogram, Wrench, material};
use gaugebook::units::{ElectricalResistance, Length, Mass};
use uom::si::{electrical_resistance::ohm, length::millimeter, mass::gram};
let mm = Length::new::<millimeter>;
let cell = Parallelogram::new(material(\"2024-T351\")?, mm(40.0), mm(20.0), mm(1.6), mm(24.0), mm(6.0))?;
let g = Gauge::new(ElectricalResistance::new::<ohm>(1000.0), 2.0)?;
let layout = Layout::standard(cell, &g, Arrangement::FullBending, 49.0)?;
CheckWeigher::new(layout, 0, Wrench::only(LoadComponent::Fz, 1.0), Mass::new::<gram>(1200.0),
    Mass::new::<gram>(750.0), Mass::new::<gram>(5.0), Mass::new::<gram>(15.0))?
    .evaluate()?
    .evcxr_display();
# Ok::<(), gaugebook::PhysicsError>(())",
}

#[cfg(feature = "plot")]
evcxr_rich! {
    crate::Plot => "use gaugebook::{Axis, Plot};
Plot::histogram(\"noise\", &[1.0, 2.0, 2.5], 3, Axis::new(\"x\", \"mm\"))?.evcxr_display();
# Ok::<(), gaugebook::PlotError>(())",
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::{OutputRatio, Strain};

    #[test]
    fn text_values_print_one_plain_block() {
        let t = text_bundle(&Strain::from_microstrain(1000.0)).evcxr_text();
        assert_eq!(
            t,
            "EVCXR_BEGIN_CONTENT text/plain\n1000 µε\nEVCXR_END_CONTENT\n"
        );
        let t = text_bundle(&OutputRatio::from_mv_per_v(2.0)).evcxr_text();
        assert!(t.contains("\n2 mV/V\n"));
    }

    #[test]
    fn results_print_html_before_text() {
        let t = rich_bundle(&crate::ReportTable::new("figures")).evcxr_text();
        let html = t.find("EVCXR_BEGIN_CONTENT text/html\n<table").unwrap();
        let plain = t.find("EVCXR_BEGIN_CONTENT text/plain\n").unwrap();
        assert!(html < plain, "{t}");
    }
}
