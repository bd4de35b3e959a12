//! The built-in table of common spring materials, with each value's source.
//!
//! All values are typical (or specification-minimum where the source gives minima) for wrought
//! bar, at room temperature. They were recalled from the handbooks named beside each entry, which
//! cannot be opened here, so every entry says "(from memory)". Where a fatigue strength is not
//! recalled from a handbook, steels get the rotating-beam estimate Se' = 0.5·Su, capped at 700 MPa
//! above Su = 1400 MPa (Budynas & Nisbett, *Shigley's Mechanical Engineering Design*, 9th ed.,
//! eq. 6-8, from memory), and say so; the non-ferrous alloys without a recalled value have none.
//! Use the certified values of the metal actually bought for a design; design estimates must be
//! proven by test.
//!
//! The temperature coefficient of Young's modulus, (1/E)·dE/dT, is the slope between the moduli
//! the source lists at 70 °F and at 200 °F for the alloy's family (ASME B31.3-2004, Appendix C,
//! Table C-6, modulus of elasticity of metals against temperature, from memory): a family value,
//! not the alloy's own curve, and good to perhaps ±20 % near room temperature. Where no family
//! row is recalled (beryllium copper, titanium alloys) the coefficient stays zero and the row's
//! source says so.

use uom::si::mass_density::kilogram_per_cubic_meter;
use uom::si::pressure::{gigapascal, megapascal};
use uom::si::temperature_coefficient::{per_kelvin, ppm_per_kelvin};

use super::Material;
use crate::error::PhysicsError;
use crate::units::{MassDensity, Modulus, Stress, TemperatureCoefficient};

/// Young's modulus of a family at 70 °F and at 200 °F, Msi (ASME B31.3-2004 Table C-6, from
/// memory), from which the modulus coefficient is the slope.
#[derive(Clone, Copy)]
struct ModulusAt70And200F(f64, f64);

/// Carbon and low-alloy steels (the carbon-steel row, C ≤ 0.3 %).
const CARBON_STEELS: ModulusAt70And200F = ModulusAt70And200F(29.5, 28.8);
/// Martensitic stainless steels (12Cr, 17Cr).
const MARTENSITIC_STAINLESS: ModulusAt70And200F = ModulusAt70And200F(29.2, 28.5);
/// Aluminium and aluminium alloys.
const ALUMINIUM_ALLOYS: ModulusAt70And200F = ModulusAt70And200F(10.0, 9.6);

impl ModulusAt70And200F {
    /// (E₂₀₀/E₇₀ − 1)/ΔT with ΔT = 130 °F = 130·5/9 K (a Fahrenheit degree is 5/9 K, NIST SP 811
    /// (2008) appendix B.8).
    fn per_kelvin(self) -> f64 {
        (self.1 / self.0 - 1.0) / (130.0 * 5.0 / 9.0)
    }
}

/// One row of the table: values in GPa, –, ppm/K, MPa, MPa, kg/m³, MPa.
struct Row {
    name: &'static str,
    aliases: &'static [&'static str],
    e_gpa: f64,
    nu: f64,
    alpha_ppm: f64,
    yield_mpa: f64,
    ultimate_mpa: f64,
    density: f64,
    fatigue_mpa: Option<f64>,
    modulus: Option<ModulusAt70And200F>,
    source: &'static str,
}

// Every number below is cited in its row's `source`.
const ROWS: &[Row] = &[
    Row {
        name: "17-4 PH H900",
        aliases: &["630 H900", "S17400 H900"],
        e_gpa: 196.5,
        nu: 0.27,
        alpha_ppm: 10.8,
        yield_mpa: 1172.0,
        ultimate_mpa: 1310.0,
        density: 7780.0,
        fatigue_mpa: Some(655.0),
        modulus: Some(MARTENSITIC_STAINLESS),
        source: "E 28.5 Msi, ν 0.27, Fty 170 ksi, Ftu 190 ksi: MMPDS-01 (2003), §2.6.9, \
                 17-4PH bar H900 (from memory); α (21–93 °C) and density 7.78 g/cm³: ASM Handbook \
                 vol. 1, 10th ed. (1990), wrought stainless steels (from memory); fatigue: estimate \
                 0.5·Su, Shigley's MED 9th ed. eq. 6-8 (from memory); \
                 modulus coefficient: martensitic stainless steels row, 29.2 Msi at 70 °F, \
                 28.5 Msi at 200 °F, \
                 ASME B31.3-2004 Table C-6 (from memory)",
    },
    Row {
        name: "17-4 PH H1025",
        aliases: &["630 H1025", "S17400 H1025"],
        e_gpa: 196.5,
        nu: 0.27,
        alpha_ppm: 10.8,
        yield_mpa: 1000.0,
        ultimate_mpa: 1069.0,
        density: 7780.0,
        fatigue_mpa: Some(534.0),
        modulus: Some(MARTENSITIC_STAINLESS),
        source: "E, ν, Fty 145 ksi, Ftu 155 ksi: MMPDS-01 (2003), §2.6.9, 17-4PH H1025 \
                 (from memory); α and density: ASM Handbook vol. 1, 10th ed. (1990) (from memory); \
                 fatigue: estimate 0.5·Su, Shigley's MED 9th ed. eq. 6-8 (from memory); \
                 modulus coefficient: martensitic stainless steels row, 29.2 Msi at 70 °F, \
                 28.5 Msi at 200 °F, \
                 ASME B31.3-2004 Table C-6 (from memory)",
    },
    Row {
        name: "17-4 PH H1150",
        aliases: &["630 H1150", "S17400 H1150"],
        e_gpa: 196.5,
        nu: 0.27,
        alpha_ppm: 10.8,
        yield_mpa: 724.0,
        ultimate_mpa: 931.0,
        density: 7780.0,
        fatigue_mpa: Some(465.0),
        modulus: Some(MARTENSITIC_STAINLESS),
        source: "E, ν, Fty 105 ksi, Ftu 135 ksi: MMPDS-01 (2003), §2.6.9, 17-4PH H1150 \
                 (from memory); α and density: ASM Handbook vol. 1, 10th ed. (1990) (from memory); \
                 fatigue: estimate 0.5·Su, Shigley's MED 9th ed. eq. 6-8 (from memory); \
                 modulus coefficient: martensitic stainless steels row, 29.2 Msi at 70 °F, \
                 28.5 Msi at 200 °F, \
                 ASME B31.3-2004 Table C-6 (from memory)",
    },
    Row {
        name: "4340 Q&T 1240 MPa",
        aliases: &["4340", "AISI 4340", "4340 Ftu 180 ksi"],
        e_gpa: 200.0,
        nu: 0.32,
        alpha_ppm: 12.3,
        yield_mpa: 1124.0,
        ultimate_mpa: 1241.0,
        density: 7850.0,
        fatigue_mpa: Some(620.0),
        modulus: Some(CARBON_STEELS),
        source: "E 29.0 Msi, ν 0.32, Ftu 180 ksi / Fty 163 ksi heat-treated low-alloy steel: \
                 MMPDS-01 (2003), §2.3.1 (from memory); α and density: ASM Handbook vol. 1, 10th \
                 ed. (1990), carbon and low-alloy steels (from memory); fatigue: estimate 0.5·Su, \
                 Shigley's MED 9th ed. eq. 6-8 (from memory); \
                 modulus coefficient: carbon-steel row used for the family, 29.5 Msi at 70 °F, \
                 28.8 Msi at 200 °F, \
                 ASME B31.3-2004 Table C-6 (from memory)",
    },
    Row {
        name: "H13 tool steel 48 HRC",
        aliases: &["H13", "AISI H13"],
        e_gpa: 210.0,
        nu: 0.30,
        alpha_ppm: 10.4,
        yield_mpa: 1480.0,
        ultimate_mpa: 1790.0,
        density: 7800.0,
        fatigue_mpa: Some(700.0),
        modulus: Some(CARBON_STEELS),
        source: "E, ν, α (20–100 °C), density, typical tensile properties near 48 HRC: ASM \
                 Handbook vol. 1, 10th ed. (1990), tool materials (from memory); fatigue: estimate \
                 capped at 700 MPa above Su = 1400 MPa, Shigley's MED 9th ed. eq. 6-8 (from memory); \
                 modulus coefficient: carbon-steel row used for the family, 29.5 Msi at 70 °F, \
                 28.8 Msi at 200 °F, \
                 ASME B31.3-2004 Table C-6 (from memory)",
    },
    Row {
        name: "2024-T351",
        aliases: &["2024", "2024-T3"],
        e_gpa: 73.1,
        nu: 0.33,
        alpha_ppm: 23.2,
        yield_mpa: 324.0,
        ultimate_mpa: 469.0,
        density: 2780.0,
        fatigue_mpa: Some(138.0),
        modulus: Some(ALUMINIUM_ALLOYS),
        source: "typical E, ν, α (20–100 °C), yield, ultimate, density and fatigue strength at \
                 5×10⁸ cycles (R. R. Moore rotating beam): ASM Handbook vol. 2, 10th ed. (1990), \
                 properties of wrought aluminum alloys (from memory); \
                 modulus coefficient: aluminium alloys row, \
                 10.0 Msi at 70 °F, 9.6 Msi at 200 °F, \
                 ASME B31.3-2004 Table C-6 (from memory)",
    },
    Row {
        name: "7075-T6",
        aliases: &["7075", "7075-T651"],
        e_gpa: 71.7,
        nu: 0.33,
        alpha_ppm: 23.6,
        yield_mpa: 503.0,
        ultimate_mpa: 572.0,
        density: 2810.0,
        fatigue_mpa: Some(159.0),
        modulus: Some(ALUMINIUM_ALLOYS),
        source: "typical E, ν, α (20–100 °C), yield, ultimate, density and fatigue strength at \
                 5×10⁸ cycles (R. R. Moore rotating beam): ASM Handbook vol. 2, 10th ed. (1990), \
                 properties of wrought aluminum alloys (from memory); \
                 modulus coefficient: aluminium alloys row, \
                 10.0 Msi at 70 °F, 9.6 Msi at 200 °F, \
                 ASME B31.3-2004 Table C-6 (from memory)",
    },
    Row {
        name: "C17200 TF00",
        aliases: &["C17200", "beryllium copper", "CuBe2"],
        e_gpa: 128.0,
        nu: 0.30,
        alpha_ppm: 17.8,
        yield_mpa: 1035.0,
        ultimate_mpa: 1240.0,
        density: 8250.0,
        fatigue_mpa: None,
        modulus: None,
        source: "E 18.5 Msi, ν, α (20–200 °C), density 0.298 lb/in³, typical strengths for the \
                 precipitation-hardened temper: ASM Handbook vol. 2, 10th ed. (1990), properties of \
                 wrought copper alloys (from memory); no fatigue strength recalled; \
                 no modulus temperature coefficient recalled (left at zero)",
    },
    Row {
        name: "Ti-6Al-4V annealed",
        aliases: &["Ti-6Al-4V", "Ti64", "grade 5"],
        e_gpa: 113.8,
        nu: 0.342,
        alpha_ppm: 8.6,
        yield_mpa: 880.0,
        ultimate_mpa: 950.0,
        density: 4430.0,
        fatigue_mpa: Some(510.0),
        modulus: None,
        source: "typical E, ν, α (20–100 °C), yield, ultimate, density and unnotched fatigue \
                 strength at 10⁷ cycles: ASM Handbook vol. 2, 10th ed. (1990), titanium alloys \
                 (from memory); \
                 no modulus temperature coefficient recalled (left at zero)",
    },
];

fn normalise(name: &str) -> String {
    name.chars()
        .filter(|c| c.is_alphanumeric() || *c == '&')
        .flat_map(char::to_lowercase)
        .collect()
}

fn build(row: &Row) -> Result<Material, PhysicsError> {
    let m = Material::new(
        row.name,
        Modulus::new::<gigapascal>(row.e_gpa),
        row.nu,
        TemperatureCoefficient::new::<ppm_per_kelvin>(row.alpha_ppm),
        Stress::new::<megapascal>(row.yield_mpa),
        Stress::new::<megapascal>(row.ultimate_mpa),
        MassDensity::new::<kilogram_per_cubic_meter>(row.density),
    )?
    .with_source(row.source);
    let m = match row.modulus {
        Some(e) => m.with_modulus_tc(TemperatureCoefficient::new::<per_kelvin>(e.per_kelvin()))?,
        None => m,
    };
    match row.fatigue_mpa {
        Some(s) => m.with_fatigue_strength(Stress::new::<megapascal>(s)),
        None => Ok(m),
    }
}

/// Every material in the built-in table, in table order.
///
/// ```
/// let all = gaugebook::materials();
/// assert!(all.iter().any(|m| m.name() == "7075-T6"));
/// assert!(all.iter().all(|m| m.source().contains("from memory")));
/// ```
pub fn materials() -> Vec<Material> {
    // Each row passes validation (checked by a unit test), so none is dropped in practice.
    ROWS.iter().filter_map(|r| build(r).ok()).collect()
}

/// Looks a material up by name or alias, ignoring case, spaces and hyphens ("17-4 PH H900",
/// "630 h900", "ti64", "4340").
///
/// ```
/// let m = gaugebook::material("630 h900")?;
/// assert_eq!(m.name(), "17-4 PH H900");
/// assert!(gaugebook::material("unobtainium").is_err());
/// # Ok::<(), gaugebook::PhysicsError>(())
/// ```
pub fn material(name: &str) -> Result<Material, PhysicsError> {
    let key = normalise(name);
    for row in ROWS {
        if normalise(row.name) == key || row.aliases.iter().any(|a| normalise(a) == key) {
            return build(row);
        }
    }
    let known: Vec<&str> = ROWS.iter().map(|r| r.name).collect();
    Err(PhysicsError::invalid(
        "material name",
        name,
        format!("one of {}", known.join(", ")),
    ))
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn every_row_is_valid_and_distinct() {
        for r in ROWS {
            build(r).unwrap();
        }
        assert_eq!(materials().len(), ROWS.len());
        let mut keys: Vec<String> = ROWS
            .iter()
            .flat_map(|r| std::iter::once(r.name).chain(r.aliases.iter().copied()))
            .map(normalise)
            .collect();
        let n = keys.len();
        keys.sort();
        keys.dedup();
        assert_eq!(keys.len(), n, "a name or alias is used twice");
    }

    #[test]
    fn modulus_coefficients_are_the_slopes_of_the_quoted_moduli() {
        // The rows' text quotes the two moduli; the coefficient is their slope over 130 °F.
        let m = material("7075-T6").unwrap();
        let expected = (9.6 / 10.0 - 1.0) / (130.0 / 1.8);
        assert!((m.modulus_tc().get::<per_kelvin>() - expected).abs() < 1e-12);
        assert!(m.source().contains("10.0 Msi at 70 °F, 9.6 Msi at 200 °F"));
        let s = material("17-4 PH H1025").unwrap();
        assert!((s.modulus_tc().get::<ppm_per_kelvin>() - (-332.0)).abs() < 0.5);
        // Metals soften as they warm: every recalled coefficient is negative, and aluminium's
        // is the steeper (common practice).
        for r in ROWS {
            let tc = build(r).unwrap().modulus_tc().get::<per_kelvin>();
            match r.modulus {
                Some(_) => assert!(tc < 0.0, "{}", r.name),
                None => assert_eq!(tc, 0.0, "{}", r.name),
            }
        }
        assert!(m.modulus_tc() < s.modulus_tc());
    }

    #[test]
    fn steel_fatigue_estimates_follow_the_stated_rule() {
        // Shigley's MED 9th ed. eq. 6-8 (from memory): 0.5·Su up to 1400 MPa, else 700 MPa.
        for r in ROWS.iter().filter(|r| r.source.contains("eq. 6-8")) {
            let est = if r.ultimate_mpa <= 1400.0 {
                0.5 * r.ultimate_mpa
            } else {
                700.0
            };
            let f = r.fatigue_mpa.unwrap();
            assert!((f - est).abs() <= 1.0, "{}: {f} vs {est}", r.name);
        }
    }
}
