//! Connections between parts and the longitudinal shear flow they carry, against the
//! shear-flow formula of built-up beams worked by hand (Gere & Goodno, Mechanics of
//! Materials, "shear flow in built-up beams": q = V·Q/I for a symmetric section; the
//! unsymmetric form q = [(Vy·Iyy − Vx·Ixy)·Qx + (Vx·Ixx − Vy·Ixy)·Qy]/(Ixx·Iyy − Ixy²)
//! follows from the generalised flexure formula, e.g. Boresi & Schmidt, Advanced
//! Mechanics of Materials, unsymmetric bending).

use kern::analysis::{Analysis, Options};
use kern::report::json::to_json;
use kern::report::out::OutUnits;

fn calc(body: &str) -> Analysis {
    let text = format!("format = 1\nunits = \"mm\"\n{body}");
    match kern::file::load::analyse(&text, &Options::default()) {
        Ok(a) => a,
        Err(d) => panic!("{}: {}", d.message, text),
    }
}

/// A rectangle `b × h` with its lower left corner at `(x, y)`.
fn rect(name: &str, x: f64, y: f64, b: f64, h: f64) -> String {
    format!("[[parts]]\nname = \"{name}\"\nshape = \"rect\"\nb = {b}\nh = {h}\nanchor = \"bottom_left\"\nat = [{x}, {y}]\n")
}

#[track_caller]
fn close(got: f64, want: f64, rel: f64) {
    let err = (got - want).abs() / want.abs().max(1e-300);
    assert!(
        err <= rel,
        "got {got}, want {want} (relative error {err:.2e})"
    );
}

/// The flows in N/mm of the connections, in order, from `calc --json`.
fn json_flows(a: &Analysis) -> Vec<(String, String, f64, Option<f64>)> {
    let j = to_json("t.toml", a, &OutUnits::new(a.section.units, None));
    assert_eq!(j["quantity_units"]["shear_flow"], "N/mm");
    j["connections"]
        .as_array()
        .unwrap()
        .iter()
        .map(|c| {
            (
                c["parts"][0].as_str().unwrap().to_string(),
                c["parts"][1].as_str().unwrap().to_string(),
                c["length"].as_f64().unwrap(),
                c.get("shear_flow").and_then(|q| q.as_f64()),
            )
        })
        .collect()
}

#[test]
fn welded_plate_girder_flange_to_web() {
    // Flanges 300 × 20, web 10 × 560, overall depth 600, Vy = 500 kN.
    // I = tw·hw³/12 + 2·(b·tf³/12 + b·tf·(hw/2 + tf/2)²)
    //   = 10·560³/12 + 2·(300·20³/12 + 6000·290²) = 1.155946667e9 mm⁴;
    // Q of one flange about the centroid = 6000 · 290 = 1.74e6 mm³;
    // q = V·Q/I = 500e3 · 1.74e6 / 1.155946667e9 = 752.63 N/mm at each flange–web joint.
    let a = calc(&format!(
        "{}{}{}[actions]\nVy = \"500 kN\"\n",
        rect("top flange", -150.0, 280.0, 300.0, 20.0),
        rect("web", -5.0, -280.0, 10.0, 560.0),
        rect("bottom flange", -150.0, -300.0, 300.0, 20.0)
    ));
    let i = 10.0 * 560f64.powi(3) / 12.0 + 2.0 * (300.0 * 8000.0 / 12.0 + 6000.0 * 290f64.powi(2));
    let q = 500e3 * 6000.0 * 290.0 / i;
    let flows = json_flows(&a);
    assert_eq!(flows.len(), 2);
    assert_eq!(
        (flows[0].0.as_str(), flows[0].1.as_str()),
        ("top flange", "web")
    );
    assert_eq!(
        (flows[1].0.as_str(), flows[1].1.as_str()),
        ("web", "bottom flange")
    );
    for f in &flows {
        close(f.2, 10.0, 1e-12);
        close(f.3.unwrap(), q, 1e-9);
    }
    assert!(a.warnings.is_empty(), "{:?}", a.warnings);
}

#[test]
fn cover_plate_on_a_rolled_beam() {
    // An I-beam d = 300, b = 150, tf = 10, tw = 6 (no fillets), centred on the origin,
    // with a 200 × 12 cover plate on its top flange; Vy = 120 kN.
    // Beam: A = 2·1500 + 6·280 = 4680, I = (150·300³ − 144·280³)/12 = 73.3440e6 mm⁴.
    // Plate: A = 2400 at y = 156, own I = 200·12³/12 = 28800.
    // ȳ = 2400·156/7080; I = I_beam + 4680·ȳ² + 28800 + 2400·(156 − ȳ)²;
    // Q of the plate = 2400·(156 − ȳ); q = V·Q/I at the plate–flange joint (length 150).
    let a = calc(&format!(
        "[[parts]]\nname = \"beam\"\nshape = \"ibeam\"\nd = 300\nb = 150\ntf = 10\ntw = 6\n{}[actions]\nVy = \"120 kN\"\n",
        rect("cover", -100.0, 150.0, 200.0, 12.0)
    ));
    let yb = 2400.0 * 156.0 / 7080.0;
    let ib = (150.0 * 300f64.powi(3) - 144.0 * 280f64.powi(3)) / 12.0;
    let i = ib + 4680.0 * yb * yb + 28800.0 + 2400.0 * (156.0 - yb).powi(2);
    let q = 120e3 * 2400.0 * (156.0 - yb) / i;
    let flows = json_flows(&a);
    assert_eq!(flows.len(), 1);
    close(flows[0].2, 150.0, 1e-12);
    close(flows[0].3.unwrap(), q, 1e-9);
}

/// An unequal angle of two plates: a leg 10 × 100 at x 0..10, y 0..100, and a leg
/// 90 × 10 at x 10..100, y 0..10; they share the edge x = 10, y 0..10.
fn angle(mirror: bool) -> Analysis {
    let x = |x0: f64, b: f64| if mirror { -(x0 + b) } else { x0 };
    calc(&format!(
        "{}{}[actions]\nVy = \"10 kN\"\n",
        rect("upright", x(0.0, 10.0), 0.0, 10.0, 100.0),
        rect("foot", x(10.0, 90.0), 0.0, 90.0, 10.0),
    ))
}

/// The angle's flow by hand: composite of two rectangles (parallel axis theorem).
fn angle_by_hand() -> f64 {
    // upright: A1 = 1000, centroid (5, 50), own Ixx = 10·100³/12, Iyy = 100·10³/12
    // foot:    A2 = 900,  centroid (55, 5), own Ixx = 90·10³/12,  Iyy = 10·90³/12
    let (a1, x1, y1): (f64, f64, f64) = (1000.0, 5.0, 50.0);
    let (a2, x2, y2): (f64, f64, f64) = (900.0, 55.0, 5.0);
    let a = a1 + a2;
    let (xc, yc) = ((a1 * x1 + a2 * x2) / a, (a1 * y1 + a2 * y2) / a);
    let ixx =
        10.0 * 1e6 / 12.0 + a1 * (y1 - yc).powi(2) + 90.0 * 1e3 / 12.0 + a2 * (y2 - yc).powi(2);
    let iyy =
        100.0 * 1e3 / 12.0 + a1 * (x1 - xc).powi(2) + 10.0 * 729e3 / 12.0 + a2 * (x2 - xc).powi(2);
    let ixy = a1 * (x1 - xc) * (y1 - yc) + a2 * (x2 - xc) * (y2 - yc);
    // The foot cut off: Qx = A2·(y2 − ȳ), Qy = A2·(x2 − x̄); Vx = 0, Vy = 10 kN.
    let (qx, qy) = (a2 * (y2 - yc), a2 * (x2 - xc));
    let vy: f64 = 10e3;
    (vy * iyy * qx - vy * ixy * qy).abs() / (ixx * iyy - ixy * ixy)
}

#[test]
fn angle_of_two_plates_with_vertical_shear() {
    let a = angle(false);
    let flows = json_flows(&a);
    assert_eq!(flows.len(), 1);
    close(flows[0].2, 10.0, 1e-12);
    close(flows[0].3.unwrap(), angle_by_hand(), 1e-9);
}

#[test]
fn mirroring_leaves_the_flows_alone() {
    let (a, b) = (angle(false), angle(true));
    let (fa, fb) = (json_flows(&a), json_flows(&b));
    close(fb[0].3.unwrap(), fa[0].3.unwrap(), 1e-12);
}

#[test]
fn box_of_four_plates_is_a_closed_cell() {
    // Flanges 200 × 10 over and under two webs 10 × 180: four joints around one cell.
    // The flow there is statically indeterminate: without the flexure solution (torsion
    // off here) none is given, and a note says so (tests/cell_joints.rs has the flows).
    let a = calc(&format!(
        "{}{}{}{}[actions]\nVy = \"50 kN\"\n",
        rect("top", 0.0, 190.0, 200.0, 10.0),
        rect("left web", 0.0, 10.0, 10.0, 180.0),
        rect("right web", 190.0, 10.0, 10.0, 180.0),
        rect("bottom", 0.0, 0.0, 200.0, 10.0),
    ));
    let flows = json_flows(&a);
    assert_eq!(flows.len(), 4);
    assert!(flows
        .iter()
        .all(|f| f.3.is_none() && (f.2 - 10.0).abs() < 1e-12));
    assert!(
        a.warnings.iter().any(
            |w| w.to_string().contains("closed cell") && w.to_string().contains("--no-torsion")
        ),
        "{:?}",
        a.warnings
    );
}

#[test]
fn no_shear_force_no_flow() {
    let a = calc(&format!(
        "{}{}",
        rect("a", 0.0, 0.0, 10.0, 10.0),
        rect("b", 0.0, 10.0, 10.0, 10.0)
    ));
    let flows = json_flows(&a);
    assert_eq!(flows.len(), 1);
    assert!(flows[0].3.is_none());
}

#[test]
fn corner_contact_and_isolated_parts_are_warned_about() {
    let a = calc(&format!(
        "{}{}",
        rect("a", 0.0, 0.0, 10.0, 10.0),
        rect("b", 10.0, 10.0, 10.0, 10.0)
    ));
    assert!(a.connections.is_empty());
    assert!(
        a.warnings
            .iter()
            .any(|w| w.to_string().contains("touch only at a point")),
        "{:?}",
        a.warnings
    );
    let b = calc(&format!(
        "{}{}{}",
        rect("a", 0.0, 0.0, 10.0, 10.0),
        rect("b", 0.0, 10.0, 10.0, 10.0),
        rect("loose", 50.0, 0.0, 10.0, 10.0)
    ));
    assert_eq!(b.connections.len(), 1);
    assert!(
        b.warnings
            .iter()
            .any(|w| w.to_string().contains("`loose` shares no boundary")),
        "{:?}",
        b.warnings
    );
}

#[test]
fn void_inside_one_part_goes_with_its_side() {
    // Two 100 × 50 blocks stacked, a 20 × 10 void in the top one at y 70..80.
    // Net: A = 10000 − 200 = 9800, ȳ = (10000·50 − 200·75)/9800;
    // top side: A′ = 5000 − 200, Q = 5000·(75 − ȳ) − 200·(75 − ȳ) = 4800·(75 − ȳ);
    // I = 100·100³/12 + 10000·(50 − ȳ)² − (20·10³/12 + 200·(75 − ȳ)²).
    let a = calc(&format!(
        "{}{}[[parts]]\nname = \"cut\"\nshape = \"rect\"\nb = 20\nh = 10\nvoid = true\nanchor = \"bottom_left\"\nat = [40, 70]\n[actions]\nVy = \"1 kN\"\n",
        rect("low", 0.0, 0.0, 100.0, 50.0),
        rect("high", 0.0, 50.0, 100.0, 50.0)
    ));
    let yc: f64 = (10000.0 * 50.0 - 200.0 * 75.0) / 9800.0;
    let i = 1e8 / 12.0 + 10000.0 * (50.0 - yc).powi(2) - (2e4 / 12.0 + 200.0 * (75.0 - yc).powi(2));
    let q = 1e3 * 4800.0 * (75.0 - yc) / i;
    close(json_flows(&a)[0].3.unwrap(), q, 1e-9);
}

/// `calc` with the flexure solution (torsion on), for the closed-cell joints and τ.
fn calc_fe(body: &str) -> Analysis {
    let text = format!("format = 1\nunits = \"mm\"\n{body}");
    let opts = Options {
        torsion: Some(kern::fe::TorsionOptions::default()),
        ..Options::default()
    };
    kern::file::load::analyse(&text, &opts).unwrap_or_else(|d| panic!("{}", d.message))
}

#[test]
fn member_check_gives_each_joint_its_flow_at_vmax() {
    // Our own mezzanine girder, 300 × 20 flanges on a 10 × 560 web, a 200 × 12 cover
    // plate on the top flange, on a simple 8 m span under 45 kN/m (no self-weight):
    // Vmax = w·L/2 = 180 kN at the supports (statics). Each joint separates the section,
    // so q@Vmax = Vmax·Q/I (Gere & Goodno, shear flow in built-up beams), Q of the side
    // cut off about the centroid; here worked with the parallel-axis theorem.
    let parts = [
        ("cover", -100.0, 300.0, 200.0, 12.0),
        ("top flange", -150.0, 280.0, 300.0, 20.0),
        ("web", -5.0, -280.0, 10.0, 560.0),
        ("bottom flange", -150.0, -300.0, 300.0, 20.0),
    ];
    let body: String = parts
        .iter()
        .map(|p| rect(p.0, p.1, p.2, p.3, p.4))
        .collect();
    let a = calc(&format!(
        "{body}[member]\nspan = \"8 m\"\nsupport = \"simple\"\nudl = \"45 kN/m\"\n"
    ));
    let m = a.member.as_ref().expect("member check");
    close(m.v_max, 45e3 * 8.0 / 2.0, 1e-12);
    let mid = |p: &(&str, f64, f64, f64, f64)| p.2 + p.4 / 2.0;
    let area: f64 = parts.iter().map(|p| p.3 * p.4).sum();
    let ybar = parts.iter().map(|p| p.3 * p.4 * mid(p)).sum::<f64>() / area;
    let i: f64 = (parts.iter())
        .map(|p| p.3 * p.4.powi(3) / 12.0 + p.3 * p.4 * (mid(p) - ybar).powi(2))
        .sum();
    let q = |p: &(&str, f64, f64, f64, f64)| (p.3 * p.4 * (mid(p) - ybar)).abs();
    let want = [q(&parts[0]), q(&parts[0]) + q(&parts[1]), q(&parts[3])];
    assert_eq!(a.connections.len(), 3);
    for (c, qw) in a.connections.iter().zip(want) {
        // N/m from N and mm: V·Q/I in N/mm, times 1000.
        let got = a.connection_flow_at_vmax(c).expect("flow at Vmax");
        close(got, 180e3 * qw / i * 1e3, 1e-9);
    }
    // No Vx or Vy in [actions]: no flow under the actions, the one at Vmax only.
    assert!(a.connections.iter().all(|c| a.connection_flow(c).is_none()));
}

#[test]
fn member_check_box_joints_at_vmax_balance_the_flange() {
    // Our own runway box: 250 × 12 flanges on two 8 × 300 webs at x = ±80 (a closed
    // cell), cantilever 3 m with a 60 kN point load at the tip: Vmax = 60 kN. The flows at
    // Vmax of the two top joints come from the flexure solution; equilibrium of the top
    // flange along the member makes their sum Vmax·Q/I of that flange (Gere & Goodno).
    let a = calc_fe(&format!(
        "{}{}{}{}[member]\nspan = \"3 m\"\nsupport = \"cantilever\"\npoint = [{{ P = \"60 kN\", a = \"3 m\" }}]\n",
        rect("top", -125.0, 150.0, 250.0, 12.0),
        rect("left", -84.0, -150.0, 8.0, 300.0),
        rect("right", 76.0, -150.0, 8.0, 300.0),
        rect("bottom", -125.0, -162.0, 250.0, 12.0)
    ));
    let m = a.member.as_ref().expect("member check");
    close(m.v_max, 60e3, 1e-12);
    let i = 2.0 * (250.0 * 12f64.powi(3) / 12.0 + 3000.0 * 156f64.powi(2))
        + 2.0 * 8.0 * 300f64.powi(3) / 12.0;
    let q = 60e3 * 3000.0 * 156.0 / i * 1e3; // N/m
    let flow = |x: &str, y: &str| {
        let c = (a.connections.iter())
            .find(|c| {
                let name = |i: usize| a.pieces[i].name.as_str();
                (name(c.joint.a), name(c.joint.b)) == (x, y)
            })
            .unwrap_or_else(|| panic!("{x}–{y}"));
        a.connection_flow_at_vmax(c)
            .expect("given within the tolerance")
    };
    // The flows' estimate is within the tolerance 1e-3 where they are given.
    close(flow("top", "left") + flow("top", "right"), q, 2e-3);
    close(flow("left", "bottom") + flow("right", "bottom"), q, 2e-3);
}

#[test]
fn member_check_tau_at_vmax_is_one_and_a_half_vmax_over_a() {
    // Our own garage lintel, a 75 × 150 mm steel bar with ν = 0, simply supported over
    // 2.4 m under 30 kN/m: Vmax = w·L/2 = 36 kN; τ from Vmax = 1.5·Vmax/A on the neutral
    // axis (Timoshenko & Goodier §124, exact for ν = 0), in the calc table as τ@Vmax.
    let a = calc_fe(&format!(
        "[[materials]]\nname = \"steel\"\nE = \"210 GPa\"\nnu = 0\n{}[member]\nspan = \"2.4 m\"\nsupport = \"simple\"\nudl = \"30 kN/m\"\n",
        rect("lintel", -37.5, -75.0, 75.0, 150.0)
    ));
    let m = a.member.as_ref().expect("member check");
    close(m.v_max, 36e3, 1e-12);
    let tau = (a.shear.as_ref())
        .and_then(|s| s.member_tau)
        .expect("τ at Vmax within the tolerance");
    let exact = 1.5 * 36e3 / (75.0 * 150.0) * 1e6; // Pa
    close(tau.value, exact, 1e-3);
    // On the neutral axis to the samples' resolution: τ falls off as 1 − 4y²/h², so a
    // value within 1e-3 of the peak lies within 0.016·h of it.
    assert!(tau.at.y.abs() < 0.02 * 150.0, "{:?}", tau.at);
    let j = to_json("t.toml", &a, &OutUnits::new(a.section.units, None));
    close(
        j["member"]["tau_max"].as_f64().expect("member.tau_max"),
        exact * 1e-6,
        1e-3,
    );
}
