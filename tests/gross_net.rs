//! Gross and net sections (FORMAT.md "Gross and net") and the member check with
//! several materials, against hand calculations.
//!
//! Sources: the parallel axis theorem and the closed forms of a rectangle (bh³/12) and
//! a circle (πd⁴/64) (Gere & Goodno, Mechanics of Materials, Appendix E); σ = M·y/I;
//! the transformed-section method for composite beams, σ_i = n_i·M·y/I_T (Gere &
//! Goodno, Mechanics of Materials, "Composite beams"); a simple span under a uniform
//! load, M = wL²/8 (any beam table).

use kern::analysis::{Analysis, Options};
use kern::fe::TorsionOptions;
use std::f64::consts::PI;

fn calc_with(body: &str, opts: &Options) -> Result<Analysis, String> {
    let text = format!("format = 1\nunits = \"mm\"\n{body}");
    kern::file::load::analyse(&text, opts).map_err(|d| d.message)
}

fn calc(body: &str) -> Analysis {
    calc_with(body, &Options::default()).unwrap_or_else(|m| panic!("{m}"))
}

#[track_caller]
fn close(got: f64, want: f64, rel: f64) {
    let err = (got - want).abs() / want.abs().max(1e-300);
    assert!(
        err <= rel,
        "got {got}, want {want} (relative error {err:.2e} > {rel:.0e})"
    );
}

/// A 100 × 200 plate (centred on the origin) with two 20 mm bolt holes at y = ±60.
const PLATE: &str = r#"
[[parts]]
name = "plate"
shape = "rect"
b = 100
h = 200
[[parts]]
name = "hole top"
shape = "circle"
d = 20
at = [0, 60]
hole = true
[[parts]]
name = "hole bottom"
shape = "circle"
d = 20
at = [0, -60]
hole = true
"#;

#[test]
fn plate_with_two_bolt_holes_gross_and_net() {
    let a = calc(&format!("{PLATE}[actions]\nMx = \"10 kN*m\"\n"));
    // Gross: the plate alone.
    close(a.props.area, 100.0 * 200.0, 1e-12);
    close(a.props.ixx, 100.0 * 200f64.powi(3) / 12.0, 1e-12);
    close(a.props.iyy, 200.0 * 100f64.powi(3) / 12.0, 1e-12);
    // Net: each hole removes A = πd²/4 and I = πd⁴/64 + A·60² about x, πd⁴/64 about y.
    let net = a.net.as_ref().expect("a net section");
    let ah = PI * 20f64.powi(2) / 4.0;
    let ih = PI * 20f64.powi(4) / 64.0;
    let ixx_net = 100.0 * 200f64.powi(3) / 12.0 - 2.0 * (ih + ah * 60f64.powi(2));
    let iyy_net = 200.0 * 100f64.powi(3) / 12.0 - 2.0 * ih;
    close(net.props.area, 20_000.0 - 2.0 * ah, 1e-12);
    close(net.props.ixx, ixx_net, 1e-10);
    close(net.props.iyy, iyy_net, 1e-10);
    close(net.props.elastic.x_top, ixx_net / 100.0, 1e-10);
    assert!(net.props.centroid.y.abs() < 1e-9);
    // Stresses on the net section: σ = M·c/I_net, M = 10 kN·m = 1e7 N·mm, in Pa.
    let s = a.stress.as_ref().expect("stresses");
    close(
        s.extremes.max_tension.value,
        1e7 * 100.0 / ixx_net * 1e6,
        1e-9,
    );
}

#[test]
fn holes_do_not_change_torsion() {
    // J and Cw belong to the gross section: the same plate without the holes.
    let opts = Options {
        torsion: Some(TorsionOptions::default()),
        ..Options::default()
    };
    let with = calc_with(PLATE, &opts).unwrap_or_else(|m| panic!("{m}"));
    let plain = calc_with(
        "[[parts]]\nname = \"plate\"\nshape = \"rect\"\nb = 100\nh = 200\n",
        &opts,
    )
    .unwrap_or_else(|m| panic!("{m}"));
    let (t1, t2) = match (&with.torsion, &plain.torsion) {
        (Some(Ok(a)), Some(Ok(b))) => (a, b),
        _ => panic!("torsion not solved"),
    };
    assert_eq!(t1.j, t2.j);
    assert_eq!(t1.cw, t2.cw);
}

#[test]
fn no_holes_no_net() {
    let a = calc("[[parts]]\nshape = \"rect\"\nb = 10\nh = 20\n[[parts]]\nshape = \"circle\"\nd = 2\nvoid = true\n");
    assert!(a.net.is_none());
}

#[test]
fn hole_with_void_false_is_an_error_at_the_key() {
    let text = "format = 1\nunits = \"mm\"\n[[parts]]\nshape = \"rect\"\nb = 10\nh = 20\n[[parts]]\nshape = \"circle\"\nd = 2\nhole = true\nvoid = false\n";
    let d = kern::file::load::analyse(text, &Options::default()).expect_err("an error");
    assert!(d.message.contains("hole = true"), "{}", d.message);
    assert_eq!(&text[d.span.clone()], "false");
    // `hole = true` alone is a void, and `void = true` with it is fine.
    assert!(calc_with(
        "[[parts]]\nshape = \"rect\"\nb = 10\nh = 20\n[[parts]]\nshape = \"circle\"\nd = 2\nhole = true\nvoid = true\n",
        &Options::default()
    )
    .is_ok());
}

/// Two 75 × 250 timbers either side of a 10 × 200 steel plate, all centred on y = 0;
/// the timber is the reference material.
const FLITCH: &str = r#"
[[materials]]
name = "timber"
E = "10 GPa"
fy = "20 MPa"
[[materials]]
name = "steel"
E = "200 GPa"
fy = "250 MPa"
[[parts]]
name = "left timber"
shape = "rect"
b = 75
h = 250
at = [-42.5, 0]
material = "timber"
[[parts]]
name = "plate"
shape = "rect"
b = 10
h = 200
material = "steel"
[[parts]]
name = "right timber"
shape = "rect"
b = 75
h = 250
at = [42.5, 0]
material = "timber"
[member]
span = "3 m"
udl = "30 kN/m"
deflection_limit = 100
"#;

#[test]
fn flitch_beam_each_material_against_its_own_fy() {
    let a = calc(FLITCH);
    let m = a.member.as_ref().expect("member");
    // Transformed to timber: n = 200/10 = 20 for the plate.
    let it = 2.0 * 75.0 * 250f64.powi(3) / 12.0 + 20.0 * 10.0 * 200f64.powi(3) / 12.0;
    close(a.props.ixx, it, 1e-12);
    // M = wL²/8 = 30·3²/8 kN·m = 33.75e6 N·mm; stresses in MPa, then Pa.
    let mm = 30.0 * 9.0 / 8.0 * 1e6;
    let timber = mm * 125.0 / it;
    let steel = 20.0 * mm * 100.0 / it;
    close(m.stress_max, steel * 1e6, 1e-9);
    let by = |name: &str| {
        m.fibres
            .iter()
            .find(|f| f.material.as_deref() == Some(name))
            .map(|f| f.stress)
            .expect("a material")
    };
    close(by("timber"), timber * 1e6, 1e-9);
    close(by("steel"), steel * 1e6, 1e-9);
    // δ = 5wL⁴/(384 E I) with the timber's E and the transformed I: 9.63 mm of 30 mm.
    let delta = 5.0 * 30.0 * 3000f64.powi(4) / (384.0 * 10_000.0 * it);
    close(m.deflection_max.expect("deflection") * 1e3, delta, 1e-9);
    // The steel governs: 205 MPa of 250 MPa against 12.8 MPa of 20 MPa and δ/δallow.
    let u = (steel / 250.0).max(timber / 20.0).max(delta / 30.0);
    close(u, steel / 250.0, 1e-15);
    close(m.utilization.expect("utilization"), u, 1e-9);
    assert_eq!(m.governing_material.as_deref(), Some("steel"));
}

#[test]
fn net_section_json_keys() {
    let a = calc(PLATE);
    let u = kern::report::out::OutUnits::new(a.section.units, None);
    let j = serde_json::from_str::<serde_json::Value>(&kern::report::json::to_json(
        "plate.toml",
        &a,
        &u,
    ))
    .expect("JSON");
    let ah = PI * 100.0;
    close(j["area"].as_f64().unwrap(), 20_000.0, 1e-12);
    close(
        j["net"]["area"].as_f64().unwrap(),
        20_000.0 - 2.0 * ah,
        1e-12,
    );
    for k in [
        "centroid",
        "inertia",
        "principal",
        "elastic_modulus",
        "plastic_modulus",
        "gyration",
    ] {
        assert!(j["net"][k].is_object(), "net.{k}");
    }
}

#[test]
fn torsion_weighs_materials_by_g_not_e() {
    // A 40 mm rod in a 80 × 20 mm tube of another material: the rings do not warp, so
    // J = Σ (Gᵢ/G_ref)·π(rₒ⁴ − rᵢ⁴)/2 (Timoshenko & Goodier, circular shafts). The tube
    // (reference) has E = 200 GPa, ν = 0.3, G = 76.92 GPa; the rod E = 100 GPa,
    // ν = 0.25, G = 40 GPa: G ratio 0.52 where the E ratio is 0.5.
    let body = r#"
[[materials]]
name = "tube"
E = "200 GPa"
nu = 0.3
[[materials]]
name = "rod"
E = "100 GPa"
nu = 0.25
[[parts]]
shape = "pipe"
d = 80
t = 20
material = "tube"
[[parts]]
shape = "circle"
d = 40
material = "rod"
"#;
    let opts = Options {
        torsion: Some(TorsionOptions::default()),
        ..Options::default()
    };
    let a = calc_with(body, &opts).unwrap_or_else(|m| panic!("{m}"));
    let Some(Ok(t)) = &a.torsion else {
        panic!("torsion not solved")
    };
    let ratio = (100.0 / 2.5) / (200.0 / 2.6);
    let annulus = |ro: f64, ri: f64| PI / 2.0 * (ro.powi(4) - ri.powi(4));
    close(t.j, ratio * annulus(20.0, 0.0) + annulus(40.0, 20.0), 1e-3);
    assert!(!a
        .warnings
        .iter()
        .any(|w| w.to_string().contains("approximate")));
}

#[test]
fn the_calc_table_names_each_group_s_section() {
    let a = calc(&format!("{PLATE}[actions]\nMx = \"10 kN*m\"\n"));
    let u = kern::report::out::OutUnits::new(a.section.units, None);
    let t = kern::report::table::to_table("plate.toml", &a, &u);
    for want in [
        "(2 holes)",
        "Second moments (gross)",
        "  Net section  ",
        "Stresses (net)",
        "Ixx,net",
    ] {
        assert!(t.contains(want), "{want} missing in\n{t}");
    }
    // Without holes, one set of properties and no section names.
    let plain = calc("[[parts]]\nshape = \"rect\"\nb = 10\nh = 20\n");
    let t = kern::report::table::to_table("p.toml", &plain, &u);
    assert!(!t.contains("(gross)") && !t.contains("Net section"));
}

#[test]
fn a_material_without_fy_is_named_in_a_warning() {
    let a = calc(&FLITCH.replacen("fy = \"20 MPa\"\n", "", 1));
    assert!(
        a.warnings
            .iter()
            .any(|w| w.to_string().contains("timber") && w.to_string().contains("no fy")),
        "{:?}",
        a.warnings
    );
    assert!(!calc(FLITCH)
        .warnings
        .iter()
        .any(|w| w.to_string().contains("no fy")));
}
