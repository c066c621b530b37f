//! The US-customary demo (a garage lintel of two angles, lengths in inches, loads in
//! kip/ft) checked against a hand calculation, end to end through the file format.

use kern::analysis::Options;
use kern::report::out::OutUnits;
use std::f64::consts::PI;

#[track_caller]
fn close(got: f64, want: f64, rel: f64) {
    let err = (got - want).abs() / want.abs();
    assert!(
        err <= rel,
        "got {got}, want {want} (relative error {err:.2e})"
    );
}

#[test]
fn garage_lintel_by_hand() {
    let text = std::fs::read_to_string("sections/garage-lintel.toml").unwrap();
    let a = kern::file::load::analyse(&text, &Options::default()).unwrap();
    let u = OutUnits::new(a.section.units, None);
    // One angle 6 × 3.5 × 5/16 with a 3/8 root fillet: the two legs less their shared
    // square, plus the fillet's spandrel (1 − π/4)r² (Gere & Goodno, App. E cases 1 and
    // 12, by subtraction). Two angles.
    let (h, b, t, r) = (6.0, 3.5, 0.3125, 0.375);
    let area = 2.0 * ((h + b - t) * t + (1.0 - PI / 4.0) * r * r);
    close(a.props.area, area, 1e-12);
    // Mass: A [in²] / 144 [in²/ft²] × 490 lb/ft³ (steel density, AISC Manual).
    let lb_per_ft = area / 144.0 * 490.0;
    close(
        u.mass().from_si(a.mass_per_metre().unwrap()),
        lb_per_ft,
        1e-9,
    );
    // Simple span, uniform load: M = wL²/8, V = wL/2 (AISC Manual, beam diagrams, case 1),
    // with w = 0.45 kip/ft of brick plus the self-weight.
    let w = 0.45 + lb_per_ft / 1000.0;
    let m = a.member.as_ref().unwrap();
    close(u.moment().from_si(m.m_max), w * 9.0 * 9.0 / 8.0, 1e-9);
    close(u.force().from_si(m.v_max), w * 9.0 / 2.0, 1e-9);
    assert_eq!(
        (u.moment().name, u.force().name, u.stress().name),
        ("kip*ft", "kip", "ksi")
    );
    // δ = 5wL⁴/384EI with L in inches and w in kip/in, E = 29 000 ksi.
    let ei = 29_000.0 * a.props.ixx;
    let d = 5.0 * (w / 12.0) * 108f64.powi(4) / (384.0 * ei);
    close(u.deflection().from_si(m.deflection_max.unwrap()), d, 1e-8);
    close(
        u.deflection().from_si(m.deflection_allowed),
        108.0 / 600.0,
        1e-12,
    );
    // σ = M / S_min in ksi: M in kip·in over in³.
    let s_min = a.props.elastic.x_top.min(a.props.elastic.x_bottom);
    close(
        u.stress().from_si(m.stress_max),
        w * 81.0 / 8.0 * 12.0 / s_min,
        1e-9,
    );
}
