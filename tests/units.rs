//! One section written in each length unit, end to end through the file format: the SI
//! results (stresses, member forces, deflection, mass, Mcr) must not depend on the unit
//! the geometry is written in. Each path from file lengths to SI is one check here, so a
//! wrong power of the unit (a factor of 10³ between mm and m per power) cannot pass.

use kern::analysis::{Analysis, Options};
use kern::fe::TorsionOptions;
use std::f64::consts::PI;

#[track_caller]
fn close(got: f64, want: f64, rel: f64) {
    let err = (got - want).abs() / want.abs();
    assert!(
        err <= rel,
        "got {got}, want {want} (relative error {err:.2e} > {rel:.0e})"
    );
}

/// Millimetres per unit as an expression, so that every dimension is exact in its unit.
fn per_mm(unit: &str) -> &'static str {
    match unit {
        "mm" => "1",
        "cm" => "10",
        "m" => "1000",
        "in" => "25.4",
        _ => unreachable!(),
    }
}

const UNITS: [&str; 4] = ["mm", "cm", "m", "in"];

fn calc(text: &str, opts: &Options) -> Analysis {
    match kern::file::load::analyse(text, opts) {
        Ok(a) => a,
        Err(d) => panic!("{}: {}", d.message, text),
    }
}

/// A 100 × 200 mm steel rectangle on a 6 m simple span (span written as a bare
/// number in the file's unit), 10 kN/m, E = 200 GPa, ρ = 7850 kg/m³, Mx = 10 kN·m.
fn rectangle(unit: &str) -> String {
    let k = per_mm(unit);
    format!(
        "format = 1\nunits = \"{unit}\"\n\
         [[materials]]\nname = \"steel\"\nE = \"200 GPa\"\nfy = \"355 MPa\"\ndensity = \"7850 kg/m3\"\n\
         [[parts]]\nshape = \"rect\"\nb = \"100/{k}\"\nh = \"200/{k}\"\n\
         [actions]\nMx = \"10 kN*m\"\n\
         [member]\nspan = \"6000/{k}\"\nsupport = \"simple\"\nudl = \"10 kN/m\"\n"
    )
}

#[test]
fn rectangle_gives_the_same_si_results_in_every_unit() {
    // Ixx = b·h³/12 = 6.667e7 mm⁴ = 6.667e-5 m⁴, S = b·h²/6 = 6.667e-4 m³ (Gere & Goodno,
    // Mechanics of Materials, App. E case 1).
    let i = 0.1 * 0.2f64.powi(3) / 12.0;
    let s = 0.1 * 0.2 * 0.2 / 6.0;
    let (w, l, e) = (1e4, 6.0, 200e9);
    for unit in UNITS {
        let a = calc(&rectangle(unit), &Options::default());
        // σ = ∓Mx·c/I = ∓6·M/(b·h²) = ∓15 MPa at the top and bottom fibres (flexure formula).
        let st = a.stress.as_ref().unwrap();
        close(st.extremes.max_compression.value, -1e4 / s, 1e-12);
        close(st.extremes.max_tension.value, 1e4 / s, 1e-12);
        let m = a.member.as_ref().unwrap();
        // Simple span, uniform load: M = wL²/8, V = wL/2, δ = 5wL⁴/(384EI) (AISC Manual,
        // beam diagrams and formulas, case 1; Roark's Formulas for Stress and Strain, table
        // of beam cases, simply supported with uniform load).
        close(m.m_max, w * l * l / 8.0, 1e-12);
        close(m.v_max, w * l / 2.0, 1e-12);
        close(
            m.deflection_max.unwrap(),
            5.0 * w * l.powi(4) / (384.0 * e * i),
            1e-9,
        );
        close(m.deflection_allowed, l / 360.0, 1e-12);
        close(m.stress_max, w * l * l / 8.0 / s, 1e-12);
        // Mass per length ρ·A = 7850 × 0.02 = 157 kg/m.
        close(a.mass_per_metre().unwrap(), 157.0, 1e-12);
    }
}

/// An I 400 mm deep: two 200 × 10 flanges (390 mm apart, centre to centre) and a
/// 380 × 8 web, in the given unit, on a 5 m simple span.
fn ibeam(unit: &str) -> String {
    let k = per_mm(unit);
    format!(
        "format = 1\nunits = \"{unit}\"\n\
         [[materials]]\nname = \"steel\"\nE = \"200 GPa\"\n\
         [[parts]]\nshape = \"ibeam\"\nd = \"400/{k}\"\nb = \"200/{k}\"\ntf = \"10/{k}\"\ntw = \"8/{k}\"\n\
         [member]\nspan = \"5 m\"\nsupport = \"simple\"\nudl = \"1 kN/m\"\n"
    )
}

#[test]
fn lateral_torsional_buckling_is_the_same_in_every_unit() {
    // Mcr takes Iy (m⁴), J (m⁴) and Cw (m⁶) into SI: the one path with a sixth power.
    // Thin-walled estimates of our I (AISC Design Guide 9): J ≈ Σ b·t³/3 =
    // (2·200·10³ + 380·8³)/3 mm⁴, Cw ≈ Iy·h0²/4 with h0 = 390 mm; the finite-element values
    // differ from these by the web-flange junctions; Mcr comes within 1 % of the estimate.
    let opts = Options {
        torsion: Some(TorsionOptions {
            tol: 1e-2,
            ..TorsionOptions::default()
        }),
        ..Options::default()
    };
    let iy_flanges = 2.0 * 0.010 * 0.2f64.powi(3) / 12.0;
    let j_thin = (2.0 * 0.2 * 0.01f64.powi(3) + 0.38 * 0.008f64.powi(3)) / 3.0;
    let cw_thin = iy_flanges * 0.39 * 0.39 / 4.0;
    let (e, g, l) = (200e9, 200e9 / 2.6, 5.0);
    // Timoshenko & Gere, Theory of Elastic Stability, uniform moment:
    // Mcr = (π/L)·√(E·Iy·G·J)·√(1 + π²·E·Cw/(L²·G·J)).
    let mcr_thin = PI / l
        * (e * iy_flanges * g * j_thin).sqrt()
        * (1.0 + PI * PI * e * cw_thin / (l * l * g * j_thin)).sqrt();
    let mut first = None;
    for unit in UNITS {
        let a = calc(&ibeam(unit), &opts);
        let mcr = a.member.as_ref().unwrap().mcr.unwrap();
        close(mcr, mcr_thin, 0.01);
        let first = *first.get_or_insert(mcr);
        // The meshes differ a little with the unit's figures; the torsion solve is to 1e-2.
        close(mcr, first, 1e-4);
    }
}

#[test]
fn format_doc_lists_the_parsers_units() {
    // docs/format.md lists the accepted units once more for readers; it must be the
    // parser's table (model::units), not a copy that drifts from it.
    use kern::model::units::{accepted_units, parse_quantity, Kind, Quantity};
    let doc = std::fs::read_to_string("docs/format.md").unwrap();
    let flat = doc.replace('\n', " ");
    for (label, kind) in [
        ("Stresses: ", Kind::Stress),
        ("densities: ", Kind::Density),
        ("Forces: ", Kind::Force),
        ("moments: ", Kind::Moment),
        ("line loads: ", Kind::LineLoad),
    ] {
        let at = flat
            .find(label)
            .unwrap_or_else(|| panic!("{label} not in format.md"));
        let listed: Vec<&str> = flat[at + label.len()..]
            .trim_start_matches('`')
            .split('`')
            .next()
            .unwrap()
            .split(' ')
            .collect();
        for unit in accepted_units(kind).split(' ') {
            assert!(
                listed.contains(&unit),
                "format.md misses `{unit}` in {label}"
            );
        }
        for unit in listed {
            let q = parse_quantity(&format!("1 {unit}"), kind);
            assert!(matches!(q, Ok(Quantity::Si(_))), "format.md lists `{unit}`");
        }
    }
}
