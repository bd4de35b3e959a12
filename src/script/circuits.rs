//! Script bindings for the circuit and gauge domains: gauges, named bridges and the general
//! four-arm bridge, lead wires, shunt calibration, gauge dissipation, rosettes, plane stress and
//! the signal chain.
//!
//! Follows the binding convention in `src/script/mod.rs`: every function registered through
//! `bind::func` with an asserting ```rhai example; quantities (or columns, where a function is
//! evaluated per sample) in and out; options as object maps read by `bind::Options`; results as
//! `Record`s; domain objects (`Gauge`, `Bridge`, `Arm`, `Wheatstone`) as registered types.

use std::fmt;

use rhai::{Array, Dynamic, Engine, INT, Map};
use uom::si::area::square_meter;
use uom::si::electric_current::ampere;
use uom::si::electric_potential::volt;
use uom::si::electrical_resistance::ohm;
use uom::si::force::newton;
use uom::si::frequency::hertz;
use uom::si::heat_flux_density::watt_per_square_meter;
use uom::si::length::meter;
use uom::si::pressure::pascal;
use uom::si::temperature_coefficient::per_kelvin;
use uom::si::temperature_interval::kelvin as kelvin_interval;
use uom::si::thermodynamic_temperature::kelvin;

use super::bind::{self, Options, Record, ScriptResult, Values, fault, func};
use crate::units::{
    Area, ElectricCurrent, ElectricPotential, ElectricalResistance, Force, Frequency, Length,
    Modulus, PowerDensity, Quantity, TemperatureCoefficient, TemperatureInterval,
    ThermodynamicTemperature,
};
use crate::{
    Adc, AdcReference, Amplifier, Arm, ArmId, Arrangement, DeltaRosette, Elastic, Excitation,
    Gauge, GaugeDissipation, InputNoise, LeadWire, MimeBundle, OutputRatio, PlaneStress,
    QuarterLeads, QuarterWiring, RectangularRosette, ShuntCalibration, ShuntDefinition,
    SignalChain, Strain, StrainState, SupplyLeads, SupplyWiring, ThermalOutput, ToMime, Trim,
    TrimKind, WheatstoneBridge, correct_orthogonal, correct_single, correct_uniaxial, html_escape,
};

// ---------------------------------------------------------------------------------------------
// Script types: thin wrappers that print as a person writes them.

/// A gauge in scripts.
#[derive(Clone, Debug)]
pub(crate) struct ScriptGauge(pub(crate) Gauge);

/// A named arrangement built from a gauge, with the specimen's ν.
#[derive(Clone, Debug)]
pub(crate) struct ScriptBridge {
    arrangement: Arrangement,
    gauge: Gauge,
    nu: f64,
}

/// One arm of a general bridge.
#[derive(Clone, Debug)]
pub(crate) struct ScriptArm(Arm);

/// A general four-arm bridge.
#[derive(Clone, Debug)]
pub(crate) struct ScriptWheatstone(WheatstoneBridge);

fn text_bundle(text: String) -> MimeBundle {
    let html = format!("<pre>{}</pre>", html_escape(&text));
    MimeBundle::text(text).with("text/html", html)
}

impl fmt::Display for ScriptGauge {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        let g = &self.0;
        write!(
            f,
            "gauge {}, GF {}",
            Quantity::from(g.resistance()),
            g.gauge_factor()
        )?;
        if g.transverse_sensitivity() != 0.0 {
            write!(f, ", Kt {}", g.transverse_sensitivity())?;
        }
        if let Some(a) = g.grid_area() {
            write!(f, ", grid {}", Quantity::from(a))?;
        }
        Ok(())
    }
}

impl ToMime for ScriptGauge {
    fn to_mime(&self) -> MimeBundle {
        text_bundle(self.to_string())
    }
}

impl fmt::Display for ScriptBridge {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        write!(
            f,
            "{} bridge of {}",
            self.arrangement,
            ScriptGauge(self.gauge.clone())
        )?;
        if self.arrangement.uses_poisson() {
            write!(f, ", ν {}", self.nu)?;
        }
        Ok(())
    }
}

impl ToMime for ScriptBridge {
    fn to_mime(&self) -> MimeBundle {
        text_bundle(self.to_string())
    }
}

impl fmt::Display for ScriptArm {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        let a = &self.0;
        if a.is_gauge() {
            write!(
                f,
                "gauge arm {} (ΔR/R {})",
                Quantity::from(a.nominal()),
                a.relative_change()
            )?;
        } else {
            write!(f, "fixed arm {}", Quantity::from(a.nominal()))?;
        }
        if let Some(t) = a.trim() {
            let k = match t.kind() {
                TrimKind::Series => "series",
                TrimKind::Parallel => "parallel",
            };
            write!(f, " with {k} trim {}", Quantity::from(t.resistance()))?;
        }
        Ok(())
    }
}

impl ToMime for ScriptArm {
    fn to_mime(&self) -> MimeBundle {
        text_bundle(self.to_string())
    }
}

impl fmt::Display for ScriptWheatstone {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        write!(f, "four-arm bridge, output {}", self.0.output_ratio())?;
        for (k, a) in self.0.arms().iter().enumerate() {
            write!(f, "\n  R{}  {}", k + 1, ScriptArm(*a))?;
        }
        Ok(())
    }
}

impl ToMime for ScriptWheatstone {
    fn to_mime(&self) -> MimeBundle {
        text_bundle(self.to_string())
    }
}

// ---------------------------------------------------------------------------------------------
// Small readers.

fn q<T: Into<Quantity>>(x: T) -> Dynamic {
    Dynamic::from(x.into())
}

fn q_in<T: Into<Quantity>>(x: T, unit: &str) -> ScriptResult<Dynamic> {
    let q: Quantity = x.into();
    Ok(Dynamic::from(q.to(unit)?))
}

fn one(v: &Dynamic, what: &str, unit: &str) -> ScriptResult<f64> {
    match bind::values(v, what, unit)? {
        Values::One(x) => Ok(x),
        Values::Many(_) => Err(fault(
            "ArgumentError",
            format!("{what} must be a single value, found a column"),
        )),
    }
}

fn ohms(v: &Dynamic, what: &str) -> ScriptResult<ElectricalResistance> {
    Ok(ElectricalResistance::new::<ohm>(one(v, what, "ohm")?))
}

fn opt_ohms(o: &Options, key: &str) -> ScriptResult<Option<ElectricalResistance>> {
    Ok(o.opt_quantity(key, "ohm")?
        .map(|x| ElectricalResistance::new::<ohm>(x.si())))
}

fn arm_id(n: INT) -> ScriptResult<ArmId> {
    Ok(ArmId::from_number(n)?)
}

fn trim_kind(s: &str) -> ScriptResult<TrimKind> {
    match s.trim().to_ascii_lowercase().as_str() {
        "series" => Ok(TrimKind::Series),
        "parallel" => Ok(TrimKind::Parallel),
        _ => Err(fault(
            "ArgumentError",
            format!("trim kind must be \"series\" or \"parallel\", found \"{s}\""),
        )),
    }
}

/// An excitation from a voltage or a current quantity.
fn excitation(v: &Dynamic) -> ScriptResult<Excitation> {
    if let Some(x) = v.read_lock::<Quantity>() {
        if let Ok(volts) = x.value_in("V") {
            return Ok(Excitation::voltage(ElectricPotential::new::<volt>(volts))?);
        }
        if let Ok(amps) = x.value_in("A") {
            return Ok(Excitation::current(ElectricCurrent::new::<ampere>(amps))?);
        }
    }
    Err(fault(
        "ArgumentError",
        format!(
            "excitation must be a voltage or a current, found {}",
            bind::type_of(v)
        ),
    ))
}

fn arrangement_of(name: &str) -> ScriptResult<Arrangement> {
    Ok(Arrangement::from_name(name)?)
}

fn lead_wire(o: &Options) -> ScriptResult<LeadWire> {
    let r = ElectricalResistance::new::<ohm>(o.quantity("lead", "ohm")?.si());
    Ok(match o.opt_quantity("lead_tc", "1/K")? {
        Some(tc) => LeadWire::new(r, TemperatureCoefficient::new::<per_kelvin>(tc.si()))?,
        None => LeadWire::copper(r)?,
    })
}

fn rise(o: &Options) -> ScriptResult<TemperatureInterval> {
    Ok(TemperatureInterval::new::<kelvin_interval>(
        o.opt_quantity("rise", "K")?.map_or(0.0, |x| x.si()),
    ))
}

fn shunt_definition(o: &Options) -> ScriptResult<ShuntDefinition> {
    Ok(match o.opt_string("definition")? {
        Some(s) => ShuntDefinition::from_name(&s)?,
        None => ShuntDefinition::ResistanceEquivalent,
    })
}

fn shunt_record(c: &ShuntCalibration) -> ScriptResult<Record> {
    Ok(Record::new("shunt calibration")
        .field("definition", c.definition().name().to_string())
        .field("arm", c.arm().number() as INT)
        .field("shunt", q_in(c.shunt(), "kohm")?)
        .field("strain", q_in(c.strain(), "µε")?)
        .field("output", q_in(c.output(), "mV/V")?))
}

fn gauge_from(o: &Options) -> ScriptResult<Gauge> {
    let r = ElectricalResistance::new::<ohm>(o.quantity("r0", "ohm")?.si());
    let mut g = Gauge::new(r, o.f64("gf")?)?;
    if let Some(kt) = o.opt_f64("kt")? {
        g = g.with_transverse_sensitivity(kt)?;
    }
    if let Some(nu0) = o.opt_f64("nu0")? {
        g = g.with_calibration_poisson(nu0)?;
    }
    match (
        o.opt_quantity("length", "m")?,
        o.opt_quantity("width", "m")?,
    ) {
        (Some(l), Some(w)) => {
            g = g.with_grid(Length::new::<meter>(l.si()), Length::new::<meter>(w.si()))?;
        }
        (None, None) => {}
        _ => {
            return Err(fault(
                "ArgumentError",
                "options of gauge() need both `length` and `width` for a grid, or neither",
            ));
        }
    }
    let t_ref = o
        .opt_quantity("t_ref", "degC")?
        .map(|t| ThermodynamicTemperature::new::<kelvin>(t.si()));
    if let Some(tc) = o.opt_quantity("gf_tc", "1/K")? {
        let t0 = t_ref.unwrap_or(g.gauge_factor_reference());
        g = g.with_gauge_factor_tc(TemperatureCoefficient::new::<per_kelvin>(tc.si()), t0)?;
    }
    if let Some(v) = o.raw("thermal") {
        let Some(arr) = v.read_lock::<Array>() else {
            return Err(fault(
                "ArgumentError",
                format!(
                    "key `thermal` in options of gauge() must be an array of numbers in µε/Kᵏ, found {}",
                    bind::type_of(v)
                ),
            ));
        };
        let mut c = Vec::with_capacity(arr.len());
        for (k, x) in arr.iter().enumerate() {
            let n = bind::number(x).ok_or_else(|| {
                fault(
                    "ArgumentError",
                    format!(
                        "thermal coefficient {k} must be a number in µε/Kᵏ, found {}",
                        bind::type_of(x)
                    ),
                )
            })?;
            c.push(n * 1e-6);
        }
        let t0 = t_ref.unwrap_or(g.gauge_factor_reference());
        g = g.with_thermal_output(ThermalOutput::new(t0, c)?);
    }
    Ok(g)
}

fn state_record(title: &str, s: &StrainState) -> ScriptResult<Record> {
    let p = s.principal();
    Ok(Record::new(title)
        .field("e1", q_in(p.max(), "µε")?)
        .field("e2", q_in(p.min(), "µε")?)
        .field("angle", q_in(p.angle(), "°")?)
        .field("max_shear", q_in(p.max_shear(), "µε")?)
        .field("ex", q_in(s.ex(), "µε")?)
        .field("ey", q_in(s.ey(), "µε")?)
        .field("gxy", q_in(s.gxy(), "µε")?))
}

fn strain_arg(v: &Dynamic, what: &str) -> ScriptResult<Strain> {
    Ok(Strain::new(one(v, what, "µε")?))
}

// ---------------------------------------------------------------------------------------------

/// Registers the circuit and gauge domains.
pub(crate) fn register(engine: &mut Engine) {
    register_gauge(engine);
    register_bridge(engine);
    register_wheatstone(engine);
    register_leads(engine);
    register_rosette(engine);
    register_chain(engine);
}

fn register_gauge(engine: &mut Engine) {
    bind::register_display::<ScriptGauge>(engine, "Gauge");
    engine.register_get("resistance", |g: &mut ScriptGauge| q(g.0.resistance()));
    engine.register_get("gauge_factor", |g: &mut ScriptGauge| g.0.gauge_factor());
    engine.register_get("kt", |g: &mut ScriptGauge| g.0.transverse_sensitivity());
    engine.register_get("nu0", |g: &mut ScriptGauge| g.0.calibration_poisson());

    func(
        "gauge",
        &["options: Map"],
        "Gauge",
        r#"
        A strain gauge: `r0` (resistance) and `gf` (gauge factor) required; optional `kt`
        (transverse sensitivity, a plain ratio), `nu0` (Poisson's ratio of the gauge-factor
        calibration beam, default 0.285), `length` and `width` of the grid, `gf_tc` (gauge-factor
        temperature coefficient) and `thermal` (thermal-output polynomial coefficients in µε/Kᵏ,
        lowest power first), both about `t_ref` (default 20 °C).

        Terms as ASTM E251 defines them: ΔR/R = GF·(εa + Kt·εt)/(1 − ν0·Kt).
        ```rhai
        let g = gauge(#{ r0: 350.0 * ohm, gf: 2.1, kt: 0.01 });
        assert_close(g.resistance, q("350 ohm"), 1e-12);
        assert_eq(g.gauge_factor, 2.1);
        ```
    "#,
    )
    .register_into_engine(engine, |m: Map| -> ScriptResult<ScriptGauge> {
        let o = Options::new(
            &m,
            "gauge()",
            &[
                "r0", "gf", "kt", "nu0", "length", "width", "gf_tc", "t_ref", "thermal",
            ],
        )?;
        Ok(ScriptGauge(gauge_from(&o)?))
    });

    func(
        "relative_change",
        &["g: Gauge", "axial: Quantity", "transverse: Quantity"],
        "Quantity",
        r#"
        ΔR/R of the gauge under axial and transverse strain (quantities or columns of strain).
        ```rhai
        let g = gauge(#{ r0: 120.0 * ohm, gf: 2.0 });
        assert_close(g.relative_change(q("1000 ue"), q("0 ue")).value(), 0.002, 1e-12);
        ```
    "#,
    )
    .register_into_engine(
        engine,
        |g: &mut ScriptGauge, a: Dynamic, t: Dynamic| -> ScriptResult<Dynamic> {
            let a = bind::values(&a, "axial strain", "µε")?;
            let t = bind::values(&t, "transverse strain", "µε")?;
            let g = g.0.clone();
            let v = bind::lift2(&a, &t, |a, t| {
                Ok::<f64, crate::PhysicsError>(g.relative_change(Strain::new(a), Strain::new(t)))
            })?;
            bind::shaped(v, "")
        },
    );

    func(
        "thermal_output",
        &["g: Gauge", "t: Quantity"],
        "Quantity",
        r#"
        The gauge's apparent strain at temperature `t` (a reading or a column of readings).
        ```rhai
        let g = gauge(#{ r0: 350.0 * ohm, gf: 2.0, thermal: [0.0, -2.0], t_ref: q("20 degC") });
        assert_close(g.thermal_output(q("30 degC")), q("-20 ue"), 1e-9);
        ```
    "#,
    )
    .register_into_engine(
        engine,
        |g: &mut ScriptGauge, t: Dynamic| -> ScriptResult<Dynamic> {
            let t = bind::values(&t, "temperature", "degC")?;
            let g = g.0.clone();
            let v = bind::lift1(&t, |k| {
                Ok::<f64, crate::PhysicsError>(
                    g.thermal_output(ThermodynamicTemperature::new::<kelvin>(k))
                        .value(),
                )
            })?;
            bind::shaped(v, "µε")
        },
    );

    func(
        "gauge_factor_at",
        &["g: Gauge", "t: Quantity"],
        "f64",
        r#"
        The gauge factor at temperature `t`: GF·(1 + α·(T − T_ref)).
        ```rhai
        let g = gauge(#{ r0: 350.0 * ohm, gf: 2.0, gf_tc: q("100 ppm/K"), t_ref: q("24 degC") });
        assert_close(g.gauge_factor_at(q("124 degC")), 2.02, 1e-12);
        ```
    "#,
    )
    .register_into_engine(
        engine,
        |g: &mut ScriptGauge, t: Dynamic| -> ScriptResult<f64> {
            let k = one(&t, "temperature", "degC")?;
            Ok(g.0.gauge_factor_at(ThermodynamicTemperature::new::<kelvin>(k)))
        },
    );
}

fn register_bridge(engine: &mut Engine) {
    bind::register_display::<ScriptBridge>(engine, "Bridge");
    engine.register_get("name", |b: &mut ScriptBridge| {
        b.arrangement.name().to_string()
    });
    engine.register_get("gauge", |b: &mut ScriptBridge| ScriptGauge(b.gauge.clone()));

    let new_bridge = |name: &str, g: ScriptGauge, nu: f64| -> ScriptResult<ScriptBridge> {
        let arrangement = arrangement_of(name)?;
        // Check ν (and everything else) once, here, rather than at the first output.
        arrangement.bridge_factor(nu)?;
        Ok(ScriptBridge {
            arrangement,
            gauge: g.0,
            nu,
        })
    };

    func(
        "bridge",
        &["name: String", "gauge: Gauge"],
        "Bridge",
        r#"
        A named bridge of equal arms: `"quarter"`, `"half-bending"`, `"half-poisson"`,
        `"full-bending"`, `"full-poisson"` or `"full-shear"`, with `gauge` in every active arm.
        Poisson arrangements need ν: use `bridge(name, gauge, #{ nu: 0.3 })`. The strain is the
        strain along the gauge in arm R1; the output is positive when that gauge is in tension.
        ```rhai
        let b = bridge("quarter", gauge(#{ r0: 350.0 * ohm, gf: 2.0 }));
        assert_close(b.output(q("1000 ue")), q("0.4995004995 mV/V"), 1e-9);
        ```
    "#,
    )
    .register_into_engine(engine, move |name: &str, g: ScriptGauge| {
        // ν is unused by the arrangements that accept this form; 0.3 keeps it valid.
        let a = arrangement_of(name)?;
        if a.uses_poisson() {
            return Err(fault(
                "ArgumentError",
                format!("the {name} bridge needs Poisson's ratio: bridge(\"{name}\", gauge, #{{ nu: 0.3 }})"),
            ));
        }
        new_bridge(name, g, 0.3)
    });

    func(
        "bridge",
        &["name: String", "gauge: Gauge", "options: Map"],
        "Bridge",
        r#"
        A named bridge with options: `nu`, the specimen's Poisson's ratio (for the Poisson
        arrangements; default 0.3 otherwise).
        ```rhai
        let b = bridge("full-poisson", gauge(#{ r0: 350.0 * ohm, gf: 2.0 }), #{ nu: 0.3 });
        assert_close(b.bridge_factor, 2.6, 1e-12);
        ```
    "#,
    )
    .register_into_engine(engine, move |name: &str, g: ScriptGauge, m: Map| {
        let o = Options::new(&m, "bridge()", &["nu"])?;
        let a = arrangement_of(name)?;
        let nu = match o.opt_f64("nu")? {
            Some(nu) => nu,
            None if a.uses_poisson() => o.f64("nu")?,
            None => 0.3,
        };
        new_bridge(name, g, nu)
    });

    engine.register_get(
        "bridge_factor",
        |b: &mut ScriptBridge| -> ScriptResult<f64> { Ok(b.arrangement.bridge_factor(b.nu)?) },
    );

    func(
        "output",
        &["b: Bridge", "strain: Quantity"],
        "Quantity",
        r#"
        Exact output ratio for a strain (quantity or column) at the R1 gauge.
        ```rhai
        let b = bridge("full-bending", gauge(#{ r0: 350.0 * ohm, gf: 2.0 }));
        assert_close(b.output(q("500 ue")), q("1 mV/V"), 1e-12);
        let c = b.output(column([0.0, 250.0, 500.0], "ue"));
        assert_close(c[2], q("1 mV/V"), 1e-12);
        ```
    "#,
    )
    .register_into_engine(
        engine,
        |b: &mut ScriptBridge, e: Dynamic| -> ScriptResult<Dynamic> {
            let e = bind::values(&e, "strain", "µε")?;
            let (a, gf, nu) = (b.arrangement, b.gauge.gauge_factor(), b.nu);
            let v = bind::lift1(&e, |x| a.output(Strain::new(x), gf, nu).map(|r| r.value()))?;
            bind::shaped(v, "mV/V")
        },
    );

    func(
        "strain",
        &["b: Bridge", "ratio: Quantity"],
        "Quantity",
        r#"
        Exact inverse: the strain at the R1 gauge for an output ratio (quantity or column). A
        column is converted with the inverse prepared once; a ratio the bridge cannot produce is
        an error naming the sample.
        ```rhai
        let b = bridge("quarter", gauge(#{ r0: 350.0 * ohm, gf: 2.0 }));
        // ε = 4r/(GF(1 − 2r)).
        assert_close(b.strain(q("1 mV/V")), q("2004.008016 ue"), 1e-9);
        assert_close(b.strain(b.output(q("-3000 ue"))), q("-3000 ue"), 1e-12);
        ```
    "#,
    )
    .register_into_engine(
        engine,
        |b: &mut ScriptBridge, r: Dynamic| -> ScriptResult<Dynamic> {
            let r = bind::values(&r, "output ratio", "mV/V")?;
            let inv = b.arrangement.inverse(b.gauge.gauge_factor(), b.nu)?;
            let v = bind::lift1(&r, |x| {
                inv.apply_checked(OutputRatio::new(x)).map(|e| e.value())
            })?;
            bind::shaped(v, "µε")
        },
    );

    func(
        "linear_output",
        &["b: Bridge", "strain: Quantity"],
        "Quantity",
        r#"
        Linear output ratio B·GF·ε/4 (B the bridge factor).
        ```rhai
        let b = bridge("quarter", gauge(#{ r0: 350.0 * ohm, gf: 2.0 }));
        assert_close(b.linear_output(q("1000 ue")), q("0.5 mV/V"), 1e-12);
        ```
    "#,
    )
    .register_into_engine(
        engine,
        |b: &mut ScriptBridge, e: Dynamic| -> ScriptResult<Dynamic> {
            let e = bind::values(&e, "strain", "µε")?;
            let (a, gf, nu) = (b.arrangement, b.gauge.gauge_factor(), b.nu);
            let v = bind::lift1(&e, |x| {
                a.linear_output(Strain::new(x), gf, nu).map(|r| r.value())
            })?;
            bind::shaped(v, "mV/V")
        },
    );

    func(
        "nonlinearity",
        &["b: Bridge", "strain: Quantity"],
        "Quantity",
        r#"
        Nonlinearity, (linear − exact)/linear, as a percentage of the linear output.
        ```rhai
        let b = bridge("quarter", gauge(#{ r0: 350.0 * ohm, gf: 2.0 }));
        // x/(2 + x) with x = 0.002.
        assert_close(b.nonlinearity(q("1000 ue")).value("%"), 100.0 * 0.002 / 2.002, 1e-9);
        ```
    "#,
    )
    .register_into_engine(
        engine,
        |b: &mut ScriptBridge, e: Dynamic| -> ScriptResult<Dynamic> {
            let e = bind::values(&e, "strain", "µε")?;
            let (a, gf, nu) = (b.arrangement, b.gauge.gauge_factor(), b.nu);
            let v = bind::lift1(&e, |x| {
                a.nonlinearity(Strain::new(x), gf, nu).map(|p| p / 100.0)
            })?;
            bind::shaped(v, "%")
        },
    );

    func(
        "output_range",
        &["b: Bridge"],
        "Array",
        r#"
        The open range of output ratios the bridge can produce with every arm above zero.
        ```rhai
        let b = bridge("quarter", gauge(#{ r0: 350.0 * ohm, gf: 2.0 }));
        let r = b.output_range();
        assert_close(r[1], q("500 mV/V"), 1e-12);
        ```
    "#,
    )
    .register_into_engine(engine, |b: &mut ScriptBridge| -> ScriptResult<Array> {
        let (lo, hi) = b.arrangement.output_range(b.nu)?;
        Ok(vec![q_in(lo, "mV/V")?, q_in(hi, "mV/V")?])
    });

    func(
        "four_arm",
        &["b: Bridge", "strain: Quantity"],
        "Wheatstone",
        r#"
        The general four-arm bridge this named bridge is at a strain.
        ```rhai
        let b = bridge("half-bending", gauge(#{ r0: 350.0 * ohm, gf: 2.0 }));
        let w = b.four_arm(q("1000 ue"));
        assert_close(w.ratio(), b.output(q("1000 ue")), 1e-12);
        ```
    "#,
    )
    .register_into_engine(
        engine,
        |b: &mut ScriptBridge, e: Dynamic| -> ScriptResult<ScriptWheatstone> {
            let e = strain_arg(&e, "strain")?;
            Ok(ScriptWheatstone(b.arrangement.bridge(
                b.gauge.resistance(),
                e,
                b.gauge.gauge_factor(),
                b.nu,
            )?))
        },
    );

    func(
        "shunt_cal",
        &["b: Bridge", "options: Map"],
        "Record",
        r#"
        Shunt calibration: the strain a shunt resistor `shunt` across arm `arm` (1–4) stands
        for. `definition` is `"resistance-equivalent"` (default: −R/(GF(R + Rs)), signed by the
        arm's effect on the output) or `"indicated"` (the bridge's exact output read through its
        exact inverse); the result says which.
        ```rhai
        let b = bridge("quarter", gauge(#{ r0: 350.0 * ohm, gf: 2.0 }));
        let c = b.shunt_cal(#{ arm: 1, shunt: q("174.65 kohm") });
        assert_eq(c.definition, "resistance-equivalent");
        assert_close(c.strain, q("-1000 ue"), 1e-9);
        ```
    "#,
    )
    .register_into_engine(
        engine,
        |b: &mut ScriptBridge, m: Map| -> ScriptResult<Record> {
            let o = Options::new(&m, "shunt_cal()", &["arm", "shunt", "definition"])?;
            let arm = arm_id(o.f64("arm")? as INT)?;
            let rs = ElectricalResistance::new::<ohm>(o.quantity("shunt", "ohm")?.si());
            let c = ShuntCalibration::simulate(
                b.arrangement,
                &b.gauge,
                b.nu,
                arm,
                rs,
                shunt_definition(&o)?,
            )?;
            shunt_record(&c)
        },
    );

    func(
        "shunt_for",
        &["b: Bridge", "options: Map"],
        "Record",
        r#"
        The shunt resistor across arm `arm` that stands for `strain` under `definition`
        (`"resistance-equivalent"`, the default, or `"indicated"`). Across R1 or R3 a shunt
        simulates compression, across R2 or R4 tension.
        ```rhai
        let b = bridge("quarter", gauge(#{ r0: 350.0 * ohm, gf: 2.0 }));
        let c = b.shunt_for(#{ arm: 2, strain: q("1000 ue"), definition: "indicated" });
        assert_eq(c.definition, "indicated");
        assert_close(c.strain, q("1000 ue"), 1e-9);
        ```
    "#,
    )
    .register_into_engine(
        engine,
        |b: &mut ScriptBridge, m: Map| -> ScriptResult<Record> {
            let o = Options::new(&m, "shunt_for()", &["arm", "strain", "definition"])?;
            let arm = arm_id(o.f64("arm")? as INT)?;
            let e = Strain::new(o.quantity("strain", "µε")?.si());
            let c = ShuntCalibration::resistor_for(
                b.arrangement,
                &b.gauge,
                b.nu,
                arm,
                e,
                shunt_definition(&o)?,
            )?;
            shunt_record(&c)
        },
    );

    func(
        "gauge_power",
        &["b: Bridge", "excitation: Quantity"],
        "Record",
        r#"
        Current, power and (with a grid size) power density of the gauge in arm R1 at a voltage
        or current excitation.
        ```rhai
        let g = gauge(#{ r0: 350.0 * ohm, gf: 2.0, length: q("3 mm"), width: q("2 mm") });
        let p = bridge("quarter", g).gauge_power(q("10 V"));
        assert_close(p.power, q("71.42857142857 mW"), 1e-9);
        assert_close(p.power_density.value("W/mm^2"), 0.0714285714285714 / 6.0, 1e-9);
        ```
    "#,
    )
    .register_into_engine(
        engine,
        |b: &mut ScriptBridge, x: Dynamic| -> ScriptResult<Record> {
            let d = GaugeDissipation::in_bridge(&b.gauge, b.arrangement, excitation(&x)?)?;
            let mut r = Record::new("gauge dissipation")
                .field("current", q_in(d.current(), "mA")?)
                .field("power", q_in(d.power(), "mW")?);
            if let Some(pd) = d.power_density() {
                r = r.field("power_density", q(pd));
            }
            Ok(r)
        },
    );

    func(
        "max_excitation",
        &["g: Gauge", "power_density: Quantity"],
        "Quantity",
        r#"
        The largest voltage excitation of an equal-arm bridge that keeps the gauge's power density
        at or below a limit: V = 2·√(q·A·R). The gauge needs a grid size.
        ```rhai
        let g = gauge(#{ r0: 350.0 * ohm, gf: 2.0, length: q("3 mm"), width: q("2 mm") });
        let v = g.max_excitation(q("7750 W/m^2"));
        assert_close(v.value("V"), 2.0 * sqrt(7750.0 * 6.0e-6 * 350.0), 1e-12);
        ```
    "#,
    )
    .register_into_engine(
        engine,
        |g: &mut ScriptGauge, d: Dynamic| -> ScriptResult<Dynamic> {
            let pd = PowerDensity::new::<watt_per_square_meter>(one(&d, "power density", "W/m^2")?);
            q_in(GaugeDissipation::max_excitation(&g.0, pd)?, "V")
        },
    );
}

fn register_wheatstone(engine: &mut Engine) {
    bind::register_display::<ScriptArm>(engine, "Arm");
    bind::register_display::<ScriptWheatstone>(engine, "Wheatstone");
    engine.register_get("resistance", |a: &mut ScriptArm| q(a.0.resistance()));

    func(
        "fixed_arm",
        &["r: Quantity"],
        "Arm",
        r#"
        A fixed-resistor bridge arm.
        ```rhai
        assert_close(fixed_arm(q("350 ohm")).resistance, q("350 ohm"), 1e-12);
        ```
    "#,
    )
    .register_into_engine(engine, |r: Dynamic| -> ScriptResult<ScriptArm> {
        Ok(ScriptArm(Arm::fixed(ohms(&r, "arm resistance")?)?))
    });

    func(
        "gauge_arm",
        &["r: Quantity", "relative_change: f64"],
        "Arm",
        r#"
        A gauge arm of nominal resistance `r` changed by ΔR/R = `relative_change`.
        ```rhai
        assert_close(gauge_arm(q("100 ohm"), 0.01).resistance, q("101 ohm"), 1e-12);
        ```
    "#,
    )
    .register_into_engine(engine, |r: Dynamic, x: f64| -> ScriptResult<ScriptArm> {
        Ok(ScriptArm(Arm::gauge(ohms(&r, "gauge resistance")?, x)?))
    });

    func(
        "series_trim",
        &["a: Arm", "r: Quantity"],
        "Arm",
        r#"
        The arm with a trim resistor in series (replacing any trim it had).
        ```rhai
        assert_close(fixed_arm(q("350 ohm")).series_trim(q("0.7 ohm")).resistance, q("350.7 ohm"), 1e-12);
        ```
    "#,
    )
    .register_into_engine(engine, |a: &mut ScriptArm, r: Dynamic| -> ScriptResult<ScriptArm> {
        let t = Trim::new(TrimKind::Series, ohms(&r, "trim resistance")?)?;
        Ok(ScriptArm(a.0.with_trim(t)))
    });

    func(
        "parallel_trim",
        &["a: Arm", "r: Quantity"],
        "Arm",
        r#"
        The arm with a trim resistor in parallel (replacing any trim it had).
        ```rhai
        assert_close(fixed_arm(q("100 ohm")).parallel_trim(q("100 ohm")).resistance, q("50 ohm"), 1e-12);
        ```
    "#,
    )
    .register_into_engine(engine, |a: &mut ScriptArm, r: Dynamic| -> ScriptResult<ScriptArm> {
        let t = Trim::new(TrimKind::Parallel, ohms(&r, "trim resistance")?)?;
        Ok(ScriptArm(a.0.with_trim(t)))
    });

    func(
        "wheatstone",
        &["arms: Array"],
        "Wheatstone",
        r#"
        A general four-arm bridge from arms `[R1, R2, R3, R4]`. R1 joins E− to S+, R2 S+ to E+,
        R3 E+ to S−, R4 S− to E−; the output S+ − S− over the excitation is
        R1/(R1 + R2) − R4/(R3 + R4), positive when R1 or R3 rises.
        ```rhai
        let r = q("350 ohm");
        let w = wheatstone([gauge_arm(r, 0.002), fixed_arm(r), fixed_arm(r), fixed_arm(r)]);
        assert_close(w.ratio(), q("0.4995004995 mV/V"), 1e-9);
        ```
    "#,
    )
    .register_into_engine(engine, |arms: Array| -> ScriptResult<ScriptWheatstone> {
        if arms.len() != 4 {
            return Err(fault(
                "ArgumentError",
                format!("wheatstone() needs four arms, found {}", arms.len()),
            ));
        }
        let mut a = Vec::with_capacity(4);
        for (i, x) in arms.iter().enumerate() {
            match x.read_lock::<ScriptArm>() {
                Some(arm) => a.push(arm.0),
                None => {
                    return Err(fault(
                        "ArgumentError",
                        format!(
                            "arm {} of wheatstone() must be an Arm (fixed_arm, gauge_arm), found {}",
                            i + 1,
                            bind::type_of(x)
                        ),
                    ));
                }
            }
        }
        Ok(ScriptWheatstone(WheatstoneBridge::new([a[0], a[1], a[2], a[3]])))
    });

    func(
        "ratio",
        &["w: Wheatstone"],
        "Quantity",
        r#"
        Exact output ratio Vo/V of the four-arm bridge.
        ```rhai
        // 100·300 = 200·150: balanced.
        let w = wheatstone([fixed_arm(q("100 ohm")), fixed_arm(q("200 ohm")), fixed_arm(q("300 ohm")), fixed_arm(q("150 ohm"))]);
        assert_close(w.ratio(), q("0 mV/V"), 0.0, q("1e-12 mV/V"));
        ```
    "#,
    )
    .register_into_engine(engine, |w: &mut ScriptWheatstone| -> ScriptResult<Dynamic> {
        q_in(w.0.output_ratio(), "mV/V")
    });

    func(
        "output",
        &["w: Wheatstone", "excitation: Quantity"],
        "Quantity",
        r#"
        Exact output voltage at a voltage or current excitation.
        ```rhai
        let r = q("350 ohm");
        let w = wheatstone([gauge_arm(r, 0.002), fixed_arm(r), fixed_arm(r), fixed_arm(r)]);
        assert_close(w.output(q("10 V")), q("4.995004995 mV"), 1e-9);
        ```
    "#,
    )
    .register_into_engine(
        engine,
        |w: &mut ScriptWheatstone, x: Dynamic| -> ScriptResult<Dynamic> {
            q_in(w.0.output(excitation(&x)?)?, "mV")
        },
    );

    func(
        "is_balanced",
        &["w: Wheatstone", "rel_tol: f64"],
        "bool",
        r#"
        Whether R1·R3 = R2·R4 to within a relative tolerance.
        ```rhai
        let r = fixed_arm(q("120 ohm"));
        assert(wheatstone([r, r, r, r]).is_balanced(1e-12));
        ```
    "#,
    )
    .register_into_engine(engine, |w: &mut ScriptWheatstone, tol: f64| {
        w.0.is_balanced(tol)
    });

    func(
        "balance_trim",
        &["w: Wheatstone", "arm: i64", "kind: String"],
        "Quantity",
        r#"
        The `"series"` or `"parallel"` trim resistor in arm 1–4 that balances the bridge. A
        series trim only raises an arm, a parallel one only lowers it; the other way is an error.
        ```rhai
        let r = q("350 ohm");
        let w = wheatstone([gauge_arm(r, 0.002), fixed_arm(r), fixed_arm(r), fixed_arm(r)]);
        assert_close(w.balance_trim(2, "series"), q("0.7 ohm"), 1e-9);
        ```
    "#,
    )
    .register_into_engine(
        engine,
        |w: &mut ScriptWheatstone, arm: INT, kind: &str| -> ScriptResult<Dynamic> {
            let t = w.0.balance_trim(arm_id(arm)?, trim_kind(kind)?)?;
            Ok(q(t.resistance()))
        },
    );

    func(
        "trim_for_offset",
        &[
            "w: Wheatstone",
            "arm: i64",
            "kind: String",
            "offset: Quantity",
        ],
        "Quantity",
        r#"
        The trim in arm 1–4 that cancels a measured zero offset of a real bridge this bridge
        models (to first order in the offset).
        ```rhai
        let r = fixed_arm(q("350 ohm"));
        let t = wheatstone([r, r, r, r]).trim_for_offset(2, "series", q("0.5 mV/V"));
        assert_close(t, q("0.7 ohm"), 0.01);
        ```
    "#,
    )
    .register_into_engine(
        engine,
        |w: &mut ScriptWheatstone, arm: INT, kind: &str, off: Dynamic| -> ScriptResult<Dynamic> {
            let off = OutputRatio::new(one(&off, "zero offset", "mV/V")?);
            let t = w.0.trim_for_offset(arm_id(arm)?, trim_kind(kind)?, off)?;
            Ok(q(t.resistance()))
        },
    );

    func(
        "input_resistance",
        &["w: Wheatstone"],
        "Quantity",
        r#"
        Resistance across the excitation corners, (R1 + R2)‖(R3 + R4).
        ```rhai
        let r = fixed_arm(q("350 ohm"));
        assert_close(wheatstone([r, r, r, r]).input_resistance(), q("350 ohm"), 1e-12);
        ```
    "#,
    )
    .register_into_engine(engine, |w: &mut ScriptWheatstone| q(w.0.input_resistance()));

    func(
        "output_resistance",
        &["w: Wheatstone"],
        "Quantity",
        r#"
        Source resistance at the output corners, R1‖R2 + R3‖R4.
        ```rhai
        let r = fixed_arm(q("350 ohm"));
        assert_close(wheatstone([r, r, r, r]).output_resistance(), q("350 ohm"), 1e-12);
        ```
    "#,
    )
    .register_into_engine(engine, |w: &mut ScriptWheatstone| {
        q(w.0.output_resistance())
    });

    func(
        "arm_powers",
        &["w: Wheatstone", "excitation: Quantity"],
        "Array",
        r#"
        Power in each arm's element (gauge or resistor, not its trim), R1 first.
        ```rhai
        let r = fixed_arm(q("350 ohm"));
        let p = wheatstone([r, r, r, r]).arm_powers(q("10 V"));
        assert_close(p[0], q("71.42857142857 mW"), 1e-9);
        ```
    "#,
    )
    .register_into_engine(
        engine,
        |w: &mut ScriptWheatstone, x: Dynamic| -> ScriptResult<Array> {
            Ok(w.0
                .element_powers(excitation(&x)?)?
                .into_iter()
                .map(q)
                .collect())
        },
    );
}

fn register_leads(engine: &mut Engine) {
    func(
        "copper_lead",
        &["length: Quantity", "area: Quantity"],
        "Quantity",
        r#"
        Resistance of one copper lead of a length and conductor cross-section at 20 °C
        (1/58 Ω·mm²/m, IEC 60028).
        ```rhai
        assert_close(copper_lead(q("100 m"), q("1 mm^2")), q("1.724137931 ohm"), 1e-9);
        ```
    "#,
    )
    .register_into_engine(engine, |l: Dynamic, a: Dynamic| -> ScriptResult<Dynamic> {
        let w = LeadWire::copper_wire(
            Length::new::<meter>(one(&l, "lead length", "m")?),
            Area::new::<square_meter>(one(&a, "lead cross-section", "m^2")?),
        )?;
        Ok(q(w.resistance()))
    });

    func(
        "quarter_leads",
        &["g: Gauge", "options: Map"],
        "Record",
        r#"
        Lead-wire effects on a quarter bridge: `wiring` `"two-wire"` or `"three-wire"`, `lead`
        (resistance of one lead), optional `rise` (lead temperature rise), `lead_tc` (default
        copper, 0.00393 1/K) and `completion` (completion resistors, default the gauge's R).
        Gives the sensitivity factor, desensitisation, zero offset, the apparent strain of the
        warm leads (for an instrument zeroed cold) and `correction`, the factor that restores
        the span (1 + n·R_L/R_g).
        ```rhai
        let g = gauge(#{ r0: 120.0 * ohm, gf: 2.0 });
        let two = quarter_leads(g, #{ wiring: "two-wire", lead: q("1 ohm"), rise: q("10 K") });
        assert_close(two.desensitization.value("%"), 100.0 * 2.0 / 122.0, 1e-9);
        let three = quarter_leads(g, #{ wiring: "three-wire", lead: q("1 ohm"), rise: q("10 K") });
        assert_close(three.apparent_strain, q("0 ue"), 0.0, q("1e-9 ue"));
        ```
    "#,
    )
    .register_into_engine(engine, |g: ScriptGauge, m: Map| -> ScriptResult<Record> {
        let o = Options::new(
            &m,
            "quarter_leads()",
            &["wiring", "lead", "rise", "lead_tc", "completion"],
        )?;
        let wiring = match o.string("wiring")?.to_ascii_lowercase().as_str() {
            "two-wire" | "2-wire" => QuarterWiring::TwoWire,
            "three-wire" | "3-wire" => QuarterWiring::ThreeWire,
            other => {
                return Err(fault(
                    "ArgumentError",
                    format!("`wiring` must be \"two-wire\" or \"three-wire\", found \"{other}\""),
                ));
            }
        };
        let mut ql = QuarterLeads::new(&g.0, wiring, lead_wire(&o)?);
        if let Some(rc) = opt_ohms(&o, "completion")? {
            ql = ql.with_completion(rc)?;
        }
        let t = rise(&o)?;
        Ok(Record::new("quarter-bridge leads")
            .field("sensitivity_factor", ql.sensitivity_factor())
            .field(
                "desensitization",
                bind::shaped(Values::One(ql.desensitization()), "%")?,
            )
            .field("zero_offset", q_in(ql.zero_offset()?, "mV/V")?)
            .field("apparent_strain", q_in(ql.apparent_strain(t)?, "µε")?)
            .field("correction", 1.0 / ql.sensitivity_factor()))
    });

    func(
        "supply_leads",
        &["bridge_resistance: Quantity", "options: Map"],
        "Record",
        r#"
        Excitation-lead effects on a full bridge of input resistance `bridge_resistance`:
        `wiring` `"four-wire"` or `"six-wire"` (remote sense), `lead`, optional `rise` and
        `lead_tc`. Gives the sensitivity factor, desensitisation, zero offset (none) and the span
        error of warm leads; remote sense removes both.
        ```rhai
        let four = supply_leads(q("350 ohm"), #{ wiring: "four-wire", lead: q("2 ohm") });
        assert_close(four.sensitivity_factor, 350.0 / 354.0, 1e-12);
        let six = supply_leads(q("350 ohm"), #{ wiring: "six-wire", lead: q("2 ohm"), rise: q("30 K") });
        assert_close(six.span_error.value("%"), 0.0, 0.0, 1e-12);
        ```
    "#,
    )
    .register_into_engine(engine, |rb: Dynamic, m: Map| -> ScriptResult<Record> {
        let o = Options::new(&m, "supply_leads()", &["wiring", "lead", "rise", "lead_tc"])?;
        let wiring = match o.string("wiring")?.to_ascii_lowercase().as_str() {
            "four-wire" | "4-wire" => SupplyWiring::FourWire,
            "six-wire" | "6-wire" | "remote-sense" => SupplyWiring::SixWire,
            other => {
                return Err(fault(
                    "ArgumentError",
                    format!("`wiring` must be \"four-wire\" or \"six-wire\", found \"{other}\""),
                ));
            }
        };
        let s = SupplyLeads::new(
            ohms(&rb, "bridge resistance")?,
            wiring,
            lead_wire(&o)?,
        )?;
        let t = rise(&o)?;
        Ok(Record::new("full-bridge supply leads")
            .field("sensitivity_factor", s.sensitivity_factor(t)?)
            .field(
                "desensitization",
                bind::shaped(Values::One(s.desensitization()), "%")?,
            )
            .field("zero_offset", q_in(s.zero_offset(), "mV/V")?)
            .field("span_error", bind::shaped(Values::One(s.span_error(t)?), "%")?))
    });
}

fn register_rosette(engine: &mut Engine) {
    func(
        "rosette",
        &[
            "kind: String",
            "e1: Quantity",
            "e2: Quantity",
            "e3: Quantity",
        ],
        "Record",
        r#"
        Principal strains `e1` ≥ `e2`, the angle from gauge 1 to `e1` (½·atan2(γxy, εx − εy),
        counter-clockwise in the gauges' numbering, in (−90°, 90°]), the maximum in-plane shear
        strain and εx, εy, γxy, from a `"rectangular"` (0/45/90°) or `"delta"` (0/60/120°)
        rosette's readings.
        ```rhai
        let r = rosette("rectangular", q("850 ue"), q("-210 ue"), q("-320 ue"));
        assert_close(r.e1, q("1018.5582260184013 ue"), 1e-12);
        assert_close(r.angle.value("°"), -19.53770900900875, 1e-9);
        ```
    "#,
    )
    .register_into_engine(
        engine,
        |kind: &str, a: Dynamic, b: Dynamic, c: Dynamic| -> ScriptResult<Record> {
            let (a, b, c) = (
                strain_arg(&a, "reading 1")?,
                strain_arg(&b, "reading 2")?,
                strain_arg(&c, "reading 3")?,
            );
            rosette_state(kind, [a, b, c], None)
        },
    );

    func(
        "rosette",
        &[
            "kind: String",
            "e1: Quantity",
            "e2: Quantity",
            "e3: Quantity",
            "options: Map",
        ],
        "Record",
        r#"
        As `rosette(kind, e1, e2, e3)`, with the readings first corrected for the gauges'
        transverse sensitivity `kt` (calibration-beam Poisson's ratio `nu0`, default 0.285).
        ```rhai
        let raw = rosette("delta", q("620 ue"), q("-140 ue"), q("410 ue"));
        let same = rosette("delta", q("620 ue"), q("-140 ue"), q("410 ue"), #{ kt: 0.0 });
        assert_close(same.e1, raw.e1, 1e-12);
        ```
    "#,
    )
    .register_into_engine(
        engine,
        |kind: &str, a: Dynamic, b: Dynamic, c: Dynamic, m: Map| -> ScriptResult<Record> {
            let o = Options::new(&m, "rosette()", &["kt", "nu0"])?;
            let kt = o.f64("kt")?;
            let nu0 = o
                .opt_f64("nu0")?
                .unwrap_or(crate::DEFAULT_CALIBRATION_POISSON);
            let (a, b, c) = (
                strain_arg(&a, "reading 1")?,
                strain_arg(&b, "reading 2")?,
                strain_arg(&c, "reading 3")?,
            );
            rosette_state(kind, [a, b, c], Some((kt, nu0)))
        },
    );

    func(
        "correct_transverse",
        &["reading: Quantity", "options: Map"],
        "Quantity",
        r#"
        One gauge's reading corrected for transverse sensitivity `kt` (with `nu0`, default
        0.285), given either the `transverse` strain across it or the `nu` of a uniaxial stress
        field along it.
        ```rhai
        let e = correct_transverse(q("1000 ue"), #{ kt: 0.03, nu: 0.285 });
        assert_close(e, q("1000 ue"), 1e-12);
        ```
    "#,
    )
    .register_into_engine(engine, |r: Dynamic, m: Map| -> ScriptResult<Dynamic> {
        let o = Options::new(
            &m,
            "correct_transverse()",
            &["kt", "nu0", "transverse", "nu"],
        )?;
        let e = strain_arg(&r, "reading")?;
        let kt = o.f64("kt")?;
        let nu0 = o
            .opt_f64("nu0")?
            .unwrap_or(crate::DEFAULT_CALIBRATION_POISSON);
        let out = match (o.opt_quantity("transverse", "µε")?, o.opt_f64("nu")?) {
            (Some(t), None) => correct_single(e, kt, nu0, Strain::new(t.si()))?,
            (None, Some(nu)) => correct_uniaxial(e, kt, nu0, nu)?,
            _ => {
                return Err(fault(
                    "ArgumentError",
                    "options of correct_transverse() need exactly one of `transverse` and `nu`",
                ));
            }
        };
        q_in(out, "µε")
    });

    func(
        "correct_orthogonal",
        &["ex: Quantity", "ey: Quantity", "options: Map"],
        "Array",
        r#"
        Readings of two orthogonal gauges corrected for transverse sensitivity `kt` (`nu0`
        default 0.285): εx = c(ε̂x − Kt·ε̂y), εy = c(ε̂y − Kt·ε̂x), c = (1 − ν0Kt)/(1 − Kt²).
        ```rhai
        let e = correct_orthogonal(q("1000 ue"), q("-300 ue"), #{ kt: 0.0 });
        assert_close(e[1], q("-300 ue"), 1e-12);
        ```
    "#,
    )
    .register_into_engine(
        engine,
        |x: Dynamic, y: Dynamic, m: Map| -> ScriptResult<Array> {
            let o = Options::new(&m, "correct_orthogonal()", &["kt", "nu0"])?;
            let kt = o.f64("kt")?;
            let nu0 = o
                .opt_f64("nu0")?
                .unwrap_or(crate::DEFAULT_CALIBRATION_POISSON);
            let (a, b) = correct_orthogonal(
                strain_arg(&x, "reading x")?,
                strain_arg(&y, "reading y")?,
                kt,
                nu0,
            )?;
            Ok(vec![q_in(a, "µε")?, q_in(b, "µε")?])
        },
    );

    func(
        "plane_stress",
        &[
            "ex: Quantity",
            "ey: Quantity",
            "gxy: Quantity",
            "options: Map",
        ],
        "Record",
        r#"
        Plane-stress Hooke's law from εx, εy, γxy for a material of Young's modulus `E` and
        Poisson's ratio `nu`: the stresses, principal stresses and angle, maximum in-plane shear
        stress and von Mises stress. Design estimates must be proven by test; overload, lifting
        and legal-for-trade use follow local codes and licensed practice.
        ```rhai
        let s = plane_stress(q("1000 ue"), q("-300 ue"), q("0 ue"), #{ E: q("200 GPa"), nu: 0.3 });
        assert_close(s.sx, q("200 MPa"), 1e-12);
        assert_close(s.von_mises, q("200 MPa"), 1e-9);
        ```
    "#,
    )
    .register_into_engine(
        engine,
        |x: Dynamic, y: Dynamic, g: Dynamic, m: Map| -> ScriptResult<Record> {
            let o = Options::new(&m, "plane_stress()", &["E", "nu"])?;
            let mat = Elastic::new(
                Modulus::new::<pascal>(o.quantity("E", "Pa")?.si()),
                o.f64("nu")?,
            )?;
            let st = StrainState::new(
                strain_arg(&x, "εx")?,
                strain_arg(&y, "εy")?,
                strain_arg(&g, "γxy")?,
            );
            let s = PlaneStress::from_strain(&st, &mat);
            let p = s.principal();
            Ok(Record::new("plane stress")
                .field("sx", q_in(s.sx(), "MPa")?)
                .field("sy", q_in(s.sy(), "MPa")?)
                .field("txy", q_in(s.txy(), "MPa")?)
                .field("s1", q_in(p.max(), "MPa")?)
                .field("s2", q_in(p.min(), "MPa")?)
                .field("angle", q_in(p.angle(), "°")?)
                .field("max_shear", q_in(p.max_shear(), "MPa")?)
                .field("von_mises", q_in(s.von_mises(), "MPa")?))
        },
    );
}

fn rosette_state(
    kind: &str,
    e: [Strain; 3],
    correction: Option<(f64, f64)>,
) -> ScriptResult<Record> {
    match kind.trim().to_ascii_lowercase().as_str() {
        "rectangular" => {
            let mut r = RectangularRosette::new(e[0], e[1], e[2]);
            if let Some((kt, nu0)) = correction {
                r = r.corrected(kt, nu0)?;
            }
            state_record("rectangular rosette", &r.strain_state())
        }
        "delta" => {
            let mut r = DeltaRosette::new(e[0], e[1], e[2]);
            if let Some((kt, nu0)) = correction {
                r = r.corrected(kt, nu0)?;
            }
            state_record("delta rosette", &r.strain_state())
        }
        _ => Err(fault(
            "ArgumentError",
            format!("rosette kind must be \"rectangular\" or \"delta\", found \"{kind}\""),
        )),
    }
}

fn register_chain(engine: &mut Engine) {
    func(
        "signal_chain",
        &["options: Map"],
        "Record",
        r#"
        Resolution and noise of excitation → amplifier → converter. Options: `excitation`,
        `gain`, `bits`, and either `reference` (a fixed voltage) or `ratiometric` (the reference
        as a fraction of the excitation); optional `bipolar` (default true), amplifier input noise
        as `noise` (rms) or `noise_density` (V/√Hz, a number) with `bandwidth`; optional `bridge`
        (a Bridge, for the strain resolution) and `rated_output` with `capacity` (for the load
        resolution and noise-free counts over the rated output).

        Definitions: resolution is one step referred to the bridge, quantisation noise is
        LSB/√12, σ is it and the amplifier noise in quadrature, effective bits log₂(span/σ),
        noise-free bits log₂(span/(6.6σ)) and noise-free counts rated output/(6.6σ), taking
        6.6σ as peak-to-peak (common practice).
        ```rhai
        let c = signal_chain(#{ excitation: q("5 V"), gain: 128, bits: 24, ratiometric: 1.0 });
        assert_close(c.resolution.value("V/V"), 2.0 / (128.0 * 16777216.0), 1e-12);
        assert_close(c.effective_bits, 24.0 + 0.5 * log(12.0) / log(2.0), 1e-9);
        ```
    "#,
    )
    .register_into_engine(engine, |m: Map| -> ScriptResult<Record> {
        let o = Options::new(
            &m,
            "signal_chain()",
            &[
                "excitation",
                "gain",
                "bits",
                "reference",
                "ratiometric",
                "bipolar",
                "noise",
                "noise_density",
                "bandwidth",
                "bridge",
                "rated_output",
                "capacity",
            ],
        )?;
        let noise = match (o.opt_quantity("noise", "V")?, o.opt_f64("noise_density")?) {
            (Some(n), None) => InputNoise::from_rms(ElectricPotential::new::<volt>(n.si()))?,
            (None, Some(d)) => InputNoise::from_density(
                d,
                Frequency::new::<hertz>(o.quantity("bandwidth", "Hz")?.si()),
            )?,
            (None, None) => InputNoise::none(),
            (Some(_), Some(_)) => {
                return Err(fault(
                    "ArgumentError",
                    "options of signal_chain() take `noise` or `noise_density`, not both",
                ));
            }
        };
        let reference = match (o.opt_quantity("reference", "V")?, o.opt_f64("ratiometric")?) {
            (Some(v), None) => AdcReference::fixed(ElectricPotential::new::<volt>(v.si()))?,
            (None, Some(f)) => AdcReference::ratiometric(f)?,
            _ => {
                return Err(fault(
                    "ArgumentError",
                    "options of signal_chain() need exactly one of `reference` and `ratiometric`",
                ));
            }
        };
        let bits = o.f64("bits")?;
        if !(bits.fract() == 0.0 && (1.0..=32.0).contains(&bits)) {
            return Err(fault(
                "PhysicsError",
                format!(
                    "invalid converter bits: expected a whole number from 1 to 32, found {bits}"
                ),
            ));
        }
        let chain = SignalChain::new(
            ElectricPotential::new::<volt>(o.quantity("excitation", "V")?.si()),
            Amplifier::new(o.f64("gain")?, noise)?,
            Adc::new(
                bits as u32,
                reference,
                o.opt_bool("bipolar")?.unwrap_or(true),
            )?,
        )?;
        let mut r = Record::new("signal chain")
            .field("lsb", q_in(chain.lsb()?, "nV")?)
            .field("resolution", q_in(chain.resolution()?, "mV/V")?)
            .field("full_scale", q_in(chain.full_scale()?, "mV/V")?)
            .field("noise", q_in(chain.noise_rms()?, "nV")?)
            .field("effective_bits", chain.effective_bits()?)
            .field("noise_free_bits", chain.noise_free_bits()?);
        if let Some(b) = o.raw("bridge") {
            let Some(b) = b.read_lock::<ScriptBridge>() else {
                return Err(fault(
                    "ArgumentError",
                    format!(
                        "key `bridge` in options of signal_chain() must be a Bridge, found {}",
                        bind::type_of(b)
                    ),
                ));
            };
            let e = chain.strain_resolution(b.arrangement, b.gauge.gauge_factor(), b.nu)?;
            r = r.field("strain_resolution", q_in(e, "µε")?);
        }
        if o.has("rated_output") || o.has("capacity") {
            let ro = OutputRatio::new(o.quantity("rated_output", "mV/V")?.si());
            let cap = Force::new::<newton>(o.quantity("capacity", "N")?.si());
            r = r
                .field("load_resolution", q(chain.load_resolution(ro, cap)?))
                .field("noise_free_counts", chain.noise_free_counts(ro)?);
        }
        Ok(r)
    });
}
