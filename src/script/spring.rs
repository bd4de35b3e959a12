//! Spring elements, materials, gauge layouts and check-weighing in scripts.
//!
//! Elements are built from option maps (`cantilever(#{ material: "7075-T6", length: 100.0 * mm,
//! ... })`) and answer as methods (`e.strain("top", #{ Fz: 50.0 * N })`); loads are maps with
//! keys `Fx Fy Fz` (forces) and `Mx My Mz` (moments), each optional. A layout is a standard
//! arrangement of gauges on an element (`layout(e, #{ r0: 350.0 * ohm, gf: 2.0 },
//! "full-bending", 50.0 * N)`) and reports its rated output, cross-talk, temperature response
//! and placement sensitivity. Every margin carries the caution: design estimates must be proven
//! by test; overload and lifting uses follow local codes and licensed practice.

use std::sync::Arc;

use rhai::{Array, Dynamic, Engine, Map};
use uom::si::electrical_resistance::ohm;
use uom::si::length::meter;
use uom::si::mass::kilogram;
use uom::si::moment_of_inertia::kilogram_square_meter;

use super::bind::{Options, Record, ScriptResult, fault, func, number};
use crate::units::{ElectricalResistance, Length, Mass, MassDensity, Quantity, Stress};
use crate::{
    ArmId, Arrangement, AttachedMass, Cantilever, CheckWeigher, Column, ColumnSection, Gauge,
    Layout, LoadComponent, MARGIN_CAUTION, MarginAt, Material, OverloadFactors, Parallelogram,
    ShearWeb, SpringElement, Stiffness, TorqueShaft, Wrench, material,
};

mod sweep;

/// An element in a script (shared, so copies are cheap).
#[derive(Clone)]
pub(crate) struct Element(Arc<dyn SpringElement + Send + Sync>);

fn q(si: f64, si_unit: &str, show: &str) -> ScriptResult<Dynamic> {
    let v = Quantity::new(si, si_unit)?;
    Ok(Dynamic::from(v.to(show).unwrap_or(v)))
}

fn len(o: &Options, key: &str) -> ScriptResult<Length> {
    Ok(Length::new::<meter>(o.quantity(key, "m")?.si()))
}

fn material_arg(v: Option<&Dynamic>) -> ScriptResult<Material> {
    let Some(v) = v else {
        return Err(fault("ArgumentError", "missing key `material`"));
    };
    if let Some(m) = v.read_lock::<Material>() {
        return Ok(m.clone());
    }
    if let Some(s) = v.read_lock::<rhai::ImmutableString>() {
        return Ok(material(s.as_str())?);
    }
    Err(fault(
        "ArgumentError",
        "`material` must be a material or a material name",
    ))
}

fn wrench(load: &Map) -> ScriptResult<Wrench> {
    let o = Options::new(load, "a load", &["Fx", "Fy", "Fz", "Mx", "My", "Mz"])?;
    let mut w = Wrench::zero();
    for c in LoadComponent::ALL {
        let key = c.to_string();
        let unit = if c.is_moment() { "N*m" } else { "N" };
        if let Some(v) = o.opt_quantity(&key, unit)? {
            w = w.with(c, v.si());
        }
    }
    Ok(w)
}

fn gauge_arg(g: &Dynamic) -> ScriptResult<Gauge> {
    if let Some(g) = g.read_lock::<Gauge>() {
        return Ok(g.clone());
    }
    let Some(map) = g.read_lock::<Map>() else {
        return Err(fault(
            "ArgumentError",
            "the gauge must be a gauge or a map #{ r0, gf, kt, grid }",
        ));
    };
    let o = Options::new(&map, "a layout's gauge", &["r0", "gf", "kt", "grid"])?;
    let r0 = ElectricalResistance::new::<ohm>(o.quantity("r0", "ohm")?.si());
    let mut gauge = Gauge::new(r0, o.f64("gf")?)?;
    if let Some(kt) = o.opt_f64("kt")? {
        gauge = gauge.with_transverse_sensitivity(kt)?;
    }
    if let Some(l) = o.opt_quantity("grid", "m")? {
        let l = Length::new::<meter>(l.si());
        gauge = gauge.with_grid(l, l)?;
    }
    Ok(gauge)
}

/// What sits at the load point for a frequency estimate: a mass (kg), or for an element rated
/// in torque a rotary inertia (kg·m²).
fn attached_arg(attached: &Quantity) -> ScriptResult<AttachedMass> {
    Ok(if let Ok(m) = attached.value_in("kg") {
        AttachedMass::mass(Mass::new::<kilogram>(m))
    } else {
        AttachedMass::inertia(uom::si::f64::MomentOfInertia::new::<kilogram_square_meter>(
            attached.value_in("kg*m^2")?,
        ))
    })
}

fn margin_record(m: &MarginAt) -> ScriptResult<Record> {
    let opt = |v: Option<f64>| v.map_or(Dynamic::UNIT, Dynamic::from);
    Ok(Record::new(format!("margins at {}", m.level))
        .field("load_factor", m.factor)
        .field(
            "peak_stress",
            q(
                m.peak.von_mises.get::<uom::si::pressure::pascal>(),
                "Pa",
                "MPa",
            )?,
        )
        .field("where", m.peak.site.to_string())
        .field("yield_factor", m.yield_factor)
        .field("ultimate_factor", m.ultimate_factor)
        .field("fatigue_factor", opt(m.fatigue_factor))
        .field("buckling_factor", opt(m.buckling_factor)))
}

fn margins_of(e: &dyn SpringElement, rated: &Wrench) -> ScriptResult<Record> {
    let m = e.margins(rated, &OverloadFactors::default())?;
    Ok(Record::new(format!("margins of the {}", e.kind()))
        .field("rated", Dynamic::from(margin_record(&m.rated)?))
        .field("safe_overload", Dynamic::from(margin_record(&m.safe)?))
        .field(
            "ultimate_overload",
            Dynamic::from(margin_record(&m.ultimate)?),
        )
        .field("caution", MARGIN_CAUTION))
}

/// Registers materials, elements, layouts, design sweeps and the check-weighing station.
pub(crate) fn register(engine: &mut Engine) {
    sweep::register(engine);
    engine.register_type_with_name::<Material>("Material");
    engine.register_fn("to_string", |m: &mut Material| m.to_string());
    engine.register_fn("to_debug", |m: &mut Material| m.to_string());
    engine.register_get("name", |m: &mut Material| m.name().to_string());
    engine.register_get("source", |m: &mut Material| m.source().to_string());
    engine.register_type_with_name::<Element>("Element");
    engine.register_fn("to_string", |e: &mut Element| e.0.kind().to_string());
    engine.register_fn("to_debug", |e: &mut Element| e.0.kind().to_string());
    engine.register_type_with_name::<Layout>("Layout");
    engine.register_fn("to_string", |l: &mut Layout| {
        format!("layout on a {}", l.element().kind())
    });
    engine.register_fn("to_debug", |l: &mut Layout| format!("{l:?}"));

    func(
        "material",
        &["name: String"],
        "Material",
        r#"
        A material from the built-in table by name or alias ("17-4 PH H900", "7075-T6", "ti64").
        Every value carries its source (`m.source`); all were recalled from handbooks.
        ```rhai
        let m = material("7075-T6");
        assert_eq(m.name, "7075-T6");
        assert(m.source.contains("from memory"));
        ```
    "#,
    )
    .register_into_engine(engine, |name: &str| -> ScriptResult<Material> {
        Ok(material(name)?)
    });

    func(
        "material",
        &["options: Map"],
        "Material",
        r#"
        A material of your own: `name`, `E`, `nu`, `alpha` (per kelvin, a plain number),
        `yield_strength`, `ultimate_strength`, `density`, and optionally `fatigue_strength` and `source`; validated
        (E > 0, ν in (−1, 0.5), yield ≤ ultimate …).
        ```rhai
        let m = material(#{ name: "bar stock", E: 200.0 * GPa, nu: 0.29, alpha: 11.5e-6,
            yield_strength: 900.0 * MPa, ultimate_strength: 1100.0 * MPa, density: q("7850 kg/m^3") });
        assert_eq(m.name, "bar stock");
        ```
    "#,
    )
    .register_into_engine(engine, |opts: Map| -> ScriptResult<Material> {
        let o = Options::new(
            &opts,
            "material()",
            &["name", "E", "nu", "alpha", "yield_strength", "ultimate_strength", "density", "fatigue_strength", "source"],
        )?;
        let pa = |k: &str| -> ScriptResult<Stress> { Ok(Stress::new::<uom::si::pressure::pascal>(o.quantity(k, "Pa")?.si())) };
        let m = Material::new(
            o.string("name")?,
            pa("E")?,
            o.f64("nu")?,
            crate::units::TemperatureCoefficient::new::<uom::si::temperature_coefficient::per_kelvin>(o.f64("alpha")?),
            pa("yield_strength")?,
            pa("ultimate_strength")?,
            MassDensity::new::<uom::si::mass_density::kilogram_per_cubic_meter>(o.quantity("density", "kg/m^3")?.si()),
        )?;
        let m = match o.opt_quantity("fatigue_strength", "Pa")? {
            Some(f) => m.with_fatigue_strength(Stress::new::<uom::si::pressure::pascal>(f.si()))?,
            None => m,
        };
        Ok(match o.opt_string("source")? {
            Some(s) => m.with_source(s),
            None => m,
        })
    });

    func(
        "cantilever",
        &["options: Map"],
        "Element",
        r#"
        A cantilever bending beam: `material`, `length`, `width`, `depth`, `station` (gauge
        distance from the fixed end). Slender-beam model, L/h ≥ 5. Sites "top", "bottom",
        "side +y", "side -y".
        ```rhai
        let b = cantilever(#{ material: "2024-T351", length: 120.0 * mm, width: 25.0 * mm,
            depth: 8.0 * mm, station: 40.0 * mm });
        let e = b.strain("bottom", #{ Fz: 50.0 * N });
        assert_close(e.exx, 205.2 * ue, 1e-3);
        ```
    "#,
    )
    .register_into_engine(engine, |opts: Map| -> ScriptResult<Element> {
        let o = Options::new(
            &opts,
            "cantilever()",
            &["material", "length", "width", "depth", "station"],
        )?;
        let c = Cantilever::new(
            material_arg(o.raw("material"))?,
            len(&o, "length")?,
            len(&o, "width")?,
            len(&o, "depth")?,
            len(&o, "station")?,
        )?;
        Ok(Element(Arc::new(c)))
    });

    func(
        "parallelogram",
        &["options: Map"],
        "Element",
        r#"
        A parallelogram (double-bending) beam: `material`, `length` (flexures), `width`,
        `thickness`, `spacing` (between flexure mid-planes), `station` (gauge distance from each
        end). Sites "upper root", "upper tip", "lower root", "lower tip".
        ```rhai
        let p = parallelogram(#{ material: "2024-T351", length: 40.0 * mm, width: 20.0 * mm,
            thickness: 2.0 * mm, spacing: 30.0 * mm, station: 8.0 * mm });
        assert(p.strain("upper tip", #{ Fz: 100.0 * N }).exx > 0.0 * ue);
        ```
    "#,
    )
    .register_into_engine(engine, |opts: Map| -> ScriptResult<Element> {
        let o = Options::new(
            &opts,
            "parallelogram()",
            &[
                "material",
                "length",
                "width",
                "thickness",
                "spacing",
                "station",
            ],
        )?;
        let p = Parallelogram::new(
            material_arg(o.raw("material"))?,
            len(&o, "length")?,
            len(&o, "width")?,
            len(&o, "thickness")?,
            len(&o, "spacing")?,
            len(&o, "station")?,
        )?;
        Ok(Element(Arc::new(p)))
    });

    func(
        "column",
        &["options: Map"],
        "Element",
        r#"
        A column: `material`, `length`, `station`, and one of `diameter` (round), `outer` +
        `inner` (tube), `side` (square), `side` + `wall` (thin square tube). Sites "+y", "+z",
        "-y", "-z"; gauges at 0° are axial, at 90° transverse (Poisson).
        ```rhai
        let c = column(#{ material: "4340", diameter: 20.0 * mm, length: 60.0 * mm, station: 30.0 * mm });
        let e = c.strain("+y", #{ Fx: -50.0 * kN });
        assert_close(e.exx, -795.8 * ue, 1e-3);
        ```
    "#,
    )
    .register_into_engine(engine, |opts: Map| -> ScriptResult<Element> {
        let o = Options::new(
            &opts,
            "column()",
            &["material", "length", "station", "diameter", "outer", "inner", "side", "wall"],
        )?;
        let section = if o.has("diameter") {
            ColumnSection::Round { diameter: len(&o, "diameter")? }
        } else if o.has("outer") {
            ColumnSection::HollowRound { outer: len(&o, "outer")?, inner: len(&o, "inner")? }
        } else if o.has("wall") {
            ColumnSection::HollowSquare { side: len(&o, "side")?, wall: len(&o, "wall")? }
        } else {
            ColumnSection::Square { side: len(&o, "side")? }
        };
        let c = Column::new(material_arg(o.raw("material"))?, section, len(&o, "length")?, len(&o, "station")?)?;
        Ok(Element(Arc::new(c)))
    });

    func(
        "shear_web",
        &["options: Map"],
        "Element",
        r#"
        An I-section shear beam: `material`, `length`, `depth`, `flange_width`,
        `flange_thickness`, `web_thickness`, `station`. Sites "web +y", "web -y" (at the neutral
        axis), "top flange", "bottom flange".
        ```rhai
        let w = shear_web(#{ material: "17-4 PH H1025", length: 120.0 * mm, depth: 40.0 * mm,
            flange_width: 30.0 * mm, flange_thickness: 6.0 * mm, web_thickness: 3.0 * mm,
            station: 60.0 * mm });
        let e = w.strain("web +y", #{ Fz: 5.0 * kN });
        assert(e.gxy < 0.0 * ue);
        ```
    "#,
    )
    .register_into_engine(engine, |opts: Map| -> ScriptResult<Element> {
        let o = Options::new(
            &opts,
            "shear_web()",
            &[
                "material",
                "length",
                "depth",
                "flange_width",
                "flange_thickness",
                "web_thickness",
                "station",
            ],
        )?;
        let w = ShearWeb::new(
            material_arg(o.raw("material"))?,
            len(&o, "length")?,
            len(&o, "depth")?,
            len(&o, "flange_width")?,
            len(&o, "flange_thickness")?,
            len(&o, "web_thickness")?,
            len(&o, "station")?,
        )?;
        Ok(Element(Arc::new(w)))
    });

    func(
        "torque_shaft",
        &["options: Map"],
        "Element",
        r#"
        A torque shaft: `material`, `diameter` (outer), optional `inner`, `length`, `station`.
        Sites "+y", "+z", "-y", "-z"; a positive torque Mx stretches the −45° direction.
        ```rhai
        let s = torque_shaft(#{ material: "4340", diameter: 20.0 * mm, length: 100.0 * mm, station: 50.0 * mm });
        let e = s.strain("+z", #{ Mx: 50.0 * N_m });
        assert(e.gxy < 0.0 * ue);
        ```
    "#,
    )
    .register_into_engine(engine, |opts: Map| -> ScriptResult<Element> {
        let o = Options::new(&opts, "torque_shaft()", &["material", "diameter", "inner", "length", "station"])?;
        let m = material_arg(o.raw("material"))?;
        let s = match o.opt_quantity("inner", "m")? {
            Some(i) => TorqueShaft::hollow(
                m,
                len(&o, "diameter")?,
                Length::new::<meter>(i.si()),
                len(&o, "length")?,
                len(&o, "station")?,
            )?,
            None => TorqueShaft::solid(m, len(&o, "diameter")?, len(&o, "length")?, len(&o, "station")?)?,
        };
        Ok(Element(Arc::new(s)))
    });

    func(
        "sites",
        &["element: Element"],
        "Array",
        r#"
        The names of an element's standard gauge sites.
        ```rhai
        let s = torque_shaft(#{ material: "4340", diameter: 20.0 * mm, length: 100.0 * mm, station: 50.0 * mm });
        assert_eq(s.sites().len(), 4);
        ```
    "#,
    )
    .register_into_engine(engine, |e: &mut Element| -> Array {
        e.0.sites().into_iter().map(|s| Dynamic::from(s.name)).collect()
    });

    func(
        "strain",
        &["element: Element", "site: String", "load: Map"],
        "Record",
        r#"
        The surface strain tensor (εxx, εyy, γxy in the site's surface frame) at a named site
        under a load map (`Fx Fy Fz` forces, `Mx My Mz` moments, each optional).
        ```rhai
        let b = cantilever(#{ material: "2024-T351", length: 100.0 * mm, width: 20.0 * mm,
            depth: 5.0 * mm, station: 30.0 * mm });
        let e = b.strain("top", #{ Fz: 10.0 * N });
        assert(e.exx < 0.0 * ue);
        assert_close(e.eyy, -0.33 * e.exx, 1e-9);
        ```
    "#,
    )
    .register_into_engine(
        engine,
        |e: &mut Element, site: &str, load: Map| -> ScriptResult<Record> {
            let s = e.0.surface_strain(&e.0.site(site)?, &wrench(&load)?)?;
            Ok(Record::new(format!("strain at {site}"))
                .field("exx", q(s.exx.microstrain(), "ue", "ue")?)
                .field("eyy", q(s.eyy.microstrain(), "ue", "ue")?)
                .field("gxy", q(s.gxy.microstrain(), "ue", "ue")?))
        },
    );

    func(
        "peak_stress",
        &["element: Element", "load: Map"],
        "Record",
        r#"
        The largest von Mises stress on the surface under a load, and where it is.
        ```rhai
        let b = cantilever(#{ material: "2024-T351", length: 100.0 * mm, width: 20.0 * mm,
            depth: 6.0 * mm, station: 30.0 * mm });
        let p = b.peak_stress(#{ Fz: 100.0 * N });
        assert_close(p.von_mises, 83.333 * MPa, 1e-4);
        ```
    "#,
    )
    .register_into_engine(
        engine,
        |e: &mut Element, load: Map| -> ScriptResult<Record> {
            let p = e.0.peak_stress(&wrench(&load)?)?;
            Ok(Record::new("peak stress")
                .field(
                    "von_mises",
                    q(p.von_mises.get::<uom::si::pressure::pascal>(), "Pa", "MPa")?,
                )
                .field("where", p.site.to_string()))
        },
    );

    func(
        "stiffness",
        &["element: Element"],
        "Quantity",
        r#"
        The stiffness along (N/mm) or about (N·m per radian) the element's primary load.
        ```rhai
        let c = column(#{ material: "4340", diameter: 20.0 * mm, length: 60.0 * mm, station: 30.0 * mm });
        assert(c.stiffness() > q("1e5 N/mm"));
        ```
    "#,
    )
    .register_into_engine(engine, |e: &mut Element| -> ScriptResult<Dynamic> {
        match e.0.stiffness() {
            Stiffness::Translational(k) => q(k, "N/m", "N/mm"),
            Stiffness::Rotational(k) => q(k, "N*m", "N*m"),
        }
    });

    func(
        "frequency",
        &["element: Element", "attached: Quantity"],
        "Quantity",
        r#"
        A first natural-frequency estimate with a mass (kg) or, for a torque shaft, a rotary
        inertia (kg·m²) at the load point, plus a Rayleigh share of the element's own mass.
        ```rhai
        let b = cantilever(#{ material: "2024-T351", length: 100.0 * mm, width: 20.0 * mm,
            depth: 6.0 * mm, station: 30.0 * mm });
        assert(b.frequency(0.5 * kg) > b.frequency(2.0 * kg));
        ```
    "#,
    )
    .register_into_engine(
        engine,
        |e: &mut Element, attached: Quantity| -> ScriptResult<Dynamic> {
            let a = attached_arg(&attached)?;
            q(
                e.0.natural_frequency(&a)?
                    .get::<uom::si::frequency::hertz>(),
                "Hz",
                "Hz",
            )
        },
    );

    func(
        "margins",
        &["element: Element", "rated: Map"],
        "Record",
        r#"
        Yield, ultimate, fatigue (and buckling) factors at the rated load and at the safe (150 %)
        and ultimate (300 %) overloads (common practice). Design estimates must be proven by
        test; overload and lifting uses follow local codes and licensed practice.
        ```rhai
        let c = column(#{ material: "17-4 PH H1025", diameter: 12.0 * mm, length: 40.0 * mm, station: 20.0 * mm });
        let m = c.margins(#{ Fx: -20.0 * kN });
        assert(m.rated.yield_factor > m.safe_overload.yield_factor);
        assert(m.caution.contains("proven by test"));
        ```
    "#,
    )
    .register_into_engine(engine, |e: &mut Element, rated: Map| -> ScriptResult<Record> {
        margins_of(e.0.as_ref(), &wrench(&rated)?)
    });

    func(
        "layout",
        &[
            "element: Element",
            "gauge: Dynamic",
            "arrangement: String",
            "capacity: Quantity",
        ],
        "Layout",
        r#"
        The standard layout of a named arrangement ("quarter", "half-bending", "full-bending",
        "half-poisson", "full-poisson", "full-shear") on an element, rated at `capacity` along
        its primary load. The gauge is a gauge object or a map `#{ r0, gf, kt, grid }`.
        ```rhai
        let b = cantilever(#{ material: "2024-T351", length: 100.0 * mm, width: 20.0 * mm,
            depth: 5.0 * mm, station: 30.0 * mm });
        let l = layout(b, #{ r0: 350.0 * ohm, gf: 2.0 }, "full-bending", 50.0 * N);
        assert_close(l.report().rated_output, 1.1492 * mV_per_V, 1e-3);
        ```
    "#,
    )
    .register_into_engine(
        engine,
        |e: Element,
         gauge: Dynamic,
         arrangement: &str,
         capacity: Quantity|
         -> ScriptResult<Layout> {
            let g = gauge_arg(&gauge)?;
            let a = Arrangement::from_name(arrangement)?;
            let unit = if e.0.primary().is_moment() {
                "N*m"
            } else {
                "N"
            };
            Ok(Layout::standard(
                e.0.clone(),
                &g,
                a,
                capacity.value_in(unit)?,
            )?)
        },
    );

    func(
        "report",
        &["layout: Layout"],
        "Record",
        r#"
        The layout's first bridge: rated output at capacity, the response to each load
        component (mV/V per kN or per N·m), cross-talk of each off-axis component in % of rated
        output, zero and span drift per kelvin, and nonlinearity at capacity.
        ```rhai
        let s = torque_shaft(#{ material: "4340", diameter: 20.0 * mm, length: 100.0 * mm, station: 50.0 * mm });
        let r = layout(s, #{ r0: 350.0 * ohm, gf: 2.0 }, "full-shear", 100.0 * N_m).report();
        assert(r.rated_output > 0.0 * mV_per_V);
        assert(r.cross_talk_percent.Fz.abs() < 1e-9);
        ```
    "#,
    )
    .register_into_engine(engine, |l: &mut Layout| -> ScriptResult<Record> {
        let r = l.report(0)?;
        let mut per = Record::new("mV/V per kN (forces) or per N·m (moments)");
        let mut ct = Record::new("cross-talk, % of rated output");
        for c in LoadComponent::ALL {
            let k = c.index();
            let scale = if c.is_moment() { 1e3 } else { 1e6 };
            per = per.field(&c.to_string(), r.per_load[k] * scale);
            ct = ct.field(&c.to_string(), r.cross_talk[k].map_or(Dynamic::UNIT, Dynamic::from));
        }
        Ok(Record::new(format!("bridge {}", r.bridge))
            .field("rated_output", q(r.rated_output.mv_per_v(), "mV/V", "mV/V")?)
            .field("sensitivity", Dynamic::from(per))
            .field("cross_talk_percent", Dynamic::from(ct))
            .field("zero_mv_per_v_per_kelvin", r.zero_per_kelvin * 1e3)
            .field("span_percent_per_kelvin", r.span_per_kelvin * 100.0)
            .field("nonlinearity_percent", r.nonlinearity))
    });

    func(
        "sensitivity",
        &["layout: Layout", "angle: Quantity", "position: Quantity"],
        "Record",
        r#"
        The placement sensitivity of the layout's first bridge: each gauge rotated by `angle`
        and moved by `position` along and across, one error at a time; the table is sorted, the
        error that matters most first.
        ```rhai
        let b = cantilever(#{ material: "2024-T351", length: 100.0 * mm, width: 20.0 * mm,
            depth: 5.0 * mm, station: 30.0 * mm });
        let t = layout(b, #{ r0: 350.0 * ohm, gf: 2.0 }, "full-bending", 50.0 * N)
            .sensitivity(2.0 * deg, 0.5 * mm);
        assert(t.worst_percent > 0.0);
        assert(t.table.contains("axial position"));
        ```
    "#,
    )
    .register_into_engine(
        engine,
        |l: &mut Layout, angle: Quantity, position: Quantity| -> ScriptResult<Record> {
            let t = l.placement_sensitivity(
                0,
                crate::units::Angle::new::<uom::si::angle::radian>(angle.value_in("rad")?),
                Length::new::<meter>(position.value_in("m")?),
            )?;
            let Some(w) = t.rows.first() else {
                return Err(fault("PhysicsError", "the bridge has no gauges"));
            };
            Ok(Record::new("placement sensitivity")
                .field("worst_gauge", w.gauge.clone())
                .field("worst_error", w.error.to_string())
                .field("worst_percent", w.worst)
                .field("table", t.to_string()))
        },
    );

    func(
        "margins",
        &["layout: Layout"],
        "Record",
        r#"
        The margins of the layout's element at its capacity (see the element's `margins`).
        ```rhai
        let b = cantilever(#{ material: "2024-T351", length: 100.0 * mm, width: 20.0 * mm,
            depth: 5.0 * mm, station: 30.0 * mm });
        let m = layout(b, #{ r0: 350.0 * ohm, gf: 2.0 }, "full-bending", 50.0 * N).margins();
        assert(m.rated.yield_factor > 1.0);
        ```
    "#,
    )
    .register_into_engine(engine, |l: &mut Layout| -> ScriptResult<Record> {
        margins_of(l.element(), &l.capacity())
    });

    func(
        "check_weigher",
        &["layout: Layout", "options: Map"],
        "Record",
        r#"
        A check-weighing station on the layout's first bridge: `tare`, `target`, `below`,
        `above` (masses), optional `arm` (1–4, the trim arm; default 4) and `gravity`. The weight
        acts along the element's primary direction. Gives the trim, the output per gram, the
        accept band and the resolution the signal chain needs (a tenth of the tighter tolerance,
        common practice). Legal-for-trade use follows local codes and licensed practice.
        ```rhai
        let p = parallelogram(#{ material: "2024-T351", length: 40.0 * mm, width: 20.0 * mm,
            thickness: 1.6 * mm, spacing: 24.0 * mm, station: 6.0 * mm });
        let l = layout(p, #{ r0: 1000.0 * ohm, gf: 2.0 }, "full-bending", 49.0 * N);
        let s = check_weigher(l, #{ tare: 1200.0 * g, target: 750.0 * g, below: 5.0 * g, above: 15.0 * g });
        assert(s.accept_low < s.accept_high);
        assert_close(s.resolution_mass, 0.5 * g, 1e-9);
        ```
    "#,
    )
    .register_into_engine(engine, |l: Layout, opts: Map| -> ScriptResult<Record> {
        let o = Options::new(&opts, "check_weigher()", &["tare", "target", "below", "above", "arm", "gravity"])?;
        let mass = |k: &str| -> ScriptResult<Mass> { Ok(Mass::new::<kilogram>(o.quantity(k, "kg")?.si())) };
        let unit = Wrench::only(l.primary(), l.capacity().get(l.primary()).signum());
        let mut s = CheckWeigher::new(l, 0, unit, mass("tare")?, mass("target")?, mass("below")?, mass("above")?)?;
        if let Some(a) = o.raw("arm") {
            let n = number(a).ok_or_else(|| fault("ArgumentError", "`arm` must be 1, 2, 3 or 4"))?;
            s = s.with_trim_arm(ArmId::from_number(n as i64)?);
        }
        if let Some(gv) = o.opt_quantity("gravity", "m/s^2")? {
            s = s.with_gravity(crate::units::Acceleration::new::<uom::si::acceleration::meter_per_second_squared>(gv.si()))?;
        }
        let w = s.evaluate()?;
        Ok(Record::new("check-weighing station")
            .field("trim", format!("{:?} {:.4} Ω in arm {}", w.trim.kind(), w.trim.resistance().get::<ohm>(), w.trim_arm))
            .field("output_per_gram", q(w.output_per_gram.value() * 1e6, "uV/V", "uV/V")?)
            .field("accept_low", q(w.accept_low.mv_per_v(), "mV/V", "mV/V")?)
            .field("accept_high", q(w.accept_high.mv_per_v(), "mV/V", "mV/V")?)
            .field("resolution", q(w.resolution.value() * 1e6, "uV/V", "uV/V")?)
            .field("resolution_mass", q(w.resolution_mass.get::<uom::si::mass::gram>(), "g", "g")?)
            .field("caution", w.caution))
    });
}
