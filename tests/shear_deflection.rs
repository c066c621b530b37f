//! Shear deformation in the member check (`[member] shear_deformation = true`): the
//! Timoshenko beam's added deflection against closed forms by hand, and the refusal of a
//! deflection figure when there is no shear area to form it with.

use kern::analysis::{Analysis, Options};
use kern::fe::TorsionOptions;
use kern::model::Warning;

/// A 60 × 120 mm rectangle of steel with ν = 0 (G = E/2 = 100 GPa), our own short deep
/// lintel, with the member table `member`.
fn lintel(member: &str, torsion: bool) -> Analysis {
    let text = format!(
        "format = 1\nunits = \"mm\"\n[[materials]]\nname = \"steel\"\nE = \"200 GPa\"\nnu = 0\n\
[[parts]]\nshape = \"rect\"\nb = 60\nh = 120\n[member]\n{member}"
    );
    let opts = Options {
        torsion: torsion.then(TorsionOptions::default),
        ..Options::default()
    };
    kern::file::load::analyse(&text, &opts).expect("the section computes")
}

const G: f64 = 100e9; // Pa: E/(2(1 + ν)) with ν = 0
const E: f64 = 200e9; // Pa
const AREA: f64 = 0.060 * 0.120; // m²
const I: f64 = 0.060 * 0.120 * 0.120 * 0.120 / 12.0; // m⁴, b·h³/12

/// Shear area of a rectangle with ν = 0: 5A/6 (Timoshenko & Goodier, Theory of
/// Elasticity, §124; the energy-consistent value of Cowper 1966 at ν = 0).
const AS: f64 = 5.0 * AREA / 6.0;

fn rel(a: f64, b: f64) -> f64 {
    (a - b).abs() / b.abs()
}

#[test]
fn simple_span_uniform_load_adds_w_l2_over_8_g_as() {
    // Simple span, udl: δ = 5wL⁴/384EI + wL²/(8·G·A_s) at midspan (Timoshenko & Gere,
    // Mechanics of Materials, shear deflections; Roark's Formulas §8.10).
    let (w, l) = (50e3, 1.2);
    let a = lintel(
        "span = \"1.2 m\"\nsupport = \"simple\"\nudl = \"50 kN/m\"\nshear_deformation = true\n",
        true,
    );
    let m = a.member.as_ref().expect("member");
    let shear = w * l * l / (8.0 * G * AS);
    let bending = 5.0 * w * l.powi(4) / (384.0 * E * I);
    let ds = m.deflection_shear.expect("deflection_shear");
    // The FE shear area is within 1e-4 of 5A/6 (tests/shear_stress.rs).
    assert!(rel(ds, shear) < 1e-3, "δs = {ds} vs {shear}");
    let d = m.deflection_max.expect("deflection_max");
    assert!(
        rel(d, bending + shear) < 1e-3,
        "δ = {d} vs {}",
        bending + shear
    );
    assert!(!a
        .warnings
        .iter()
        .any(|w| matches!(w, Warning::ShearDeflectionWithheld { .. })));

    // The same file without the key keeps the bending deflection alone (old files valid).
    let a = lintel(
        "span = \"1.2 m\"\nsupport = \"simple\"\nudl = \"50 kN/m\"\n",
        true,
    );
    let m = a.member.as_ref().expect("member");
    assert!(m.deflection_shear.is_none());
    assert!(rel(m.deflection_max.unwrap(), bending) < 1e-12);
}

#[test]
fn cantilever_end_load_adds_p_l_over_g_as() {
    // Cantilever, end load: δ = PL³/3EI + PL/(G·A_s) at the tip (Timoshenko & Gere; Roark
    // §8.10).
    let (p, l) = (20e3, 0.6);
    let a = lintel(
        "span = \"600 mm\"\nsupport = \"cantilever\"\npoint = [{ P = \"20 kN\", a = \"600 mm\" }]\n\
shear_deformation = true\n",
        true,
    );
    let m = a.member.as_ref().expect("member");
    let shear = p * l / (G * AS);
    let bending = p * l.powi(3) / (3.0 * E * I);
    assert!(rel(m.deflection_shear.unwrap(), shear) < 1e-3);
    assert!(rel(m.deflection_max.unwrap(), bending + shear) < 1e-3);
    assert!((m.result.as_ref().unwrap().deflection_at - l).abs() < 1e-12);
}

#[test]
fn without_the_flexure_solution_the_deflection_is_refused() {
    // --no-torsion: no shear area, so no deflection figure (leaving shear out would
    // understate it), and a warning says why.
    let a = lintel(
        "span = \"1.2 m\"\nsupport = \"simple\"\nudl = \"50 kN/m\"\nshear_deformation = true\n",
        false,
    );
    let m = a.member.as_ref().expect("member");
    assert!(m.deflection_max.is_none() && m.deflection_shear.is_none());
    let w: Vec<_> = a
        .warnings
        .iter()
        .filter(|w| matches!(w, Warning::ShearDeflectionWithheld { solved: false }))
        .collect();
    assert_eq!(w.len(), 1, "{:?}", a.warnings);
    let text = w[0].to_string();
    assert!(text.contains("understate"), "{text}");
    // The utilization cannot include a deflection that is not there.
    assert!(m.utilization.is_none() || m.fibres.iter().any(|f| f.fy.is_some()));
}

#[test]
fn calc_json_gives_the_total_and_the_shear_share() {
    // `member.deflection_max` stays the total; `member.deflection_shear` is what shear
    // adds (kern's own key): wL²/(8·G·A_s) = 72 000 N / 4.8×10⁹ N = 0.015 mm for the lintel above, by hand.
    let dir = std::env::temp_dir().join(format!("kern-shear-defl-{}", std::process::id()));
    std::fs::create_dir_all(&dir).unwrap();
    let file = dir.join("lintel.toml");
    let text = "format = 1\nunits = \"mm\"\n[[materials]]\nname = \"steel\"\nE = \"200 GPa\"\n\
nu = 0\n[[parts]]\nshape = \"rect\"\nb = 60\nh = 120\n[member]\nspan = \"1.2 m\"\n\
support = \"simple\"\nudl = \"50 kN/m\"\nshear_deformation = true\n";
    std::fs::write(&file, text).unwrap();
    let run = |extra: &[&str]| {
        let out = std::process::Command::new(env!("CARGO_BIN_EXE_kern"))
            .args(["calc", "--json"])
            .args(extra)
            .arg(&file)
            .output()
            .expect("kern runs");
        let line = String::from_utf8(out.stdout).unwrap();
        serde_json::from_str::<serde_json::Value>(line.trim()).expect("one JSON line")
    };
    let v = run(&[]);
    let ds = v["member"]["deflection_shear"]
        .as_f64()
        .expect("deflection_shear");
    assert!(rel(ds, 0.015) < 1e-3, "δs = {ds} mm");
    let d = v["member"]["deflection_max"].as_f64().unwrap();
    let bending = 5.0 * 50e3 * 1.2f64.powi(4) / (384.0 * E * I) * 1e3; // mm
    assert!(rel(d, bending + 0.015) < 1e-3, "δ = {d} mm");
    // --no-torsion: the total is refused (null), not given without shear.
    let v = run(&["--no-torsion"]);
    assert!(v["member"]["deflection_max"].is_null(), "{}", v["member"]);
    let _ = std::fs::remove_dir_all(&dir);
}
