//! Flows across the joints of closed cells (and of bridge joints, where the exact V·Q/I
//! is known) from the finite-element flexure solution, against the shear-flow formula
//! and symmetry. Each check names its source.
//!
//! The shear-flow formula (Gere & Goodno, Mechanics of Materials, "shear flow in
//! built-up beams"; the unsymmetric form in docs/format.md `connections`): the part cut
//! off by a cut through the joints is in equilibrium under the change of its bending
//! force, so the flows across the cut sum to `(Vy·Iyy − Vx·Ixy)·Qx + (Vx·Ixx − Vy·Ixy)·Qy`
//! over `Ixx·Iyy − Ixy²`, with Q of that part. For a single joint (a bridge) that is the
//! joint's flow.

use kern::analysis::{Analysis, Options};
use kern::checks::shear_flow::Flow;
use kern::fe::flexure::Flexure;
use kern::fe::TorsionOptions;

fn analyse(body: &str) -> Analysis {
    let text = format!(
        "format = 1\nunits = \"mm\"\n[[materials]]\nname = \"steel\"\nE = \"200 GPa\"\nnu = 0.3\n{body}"
    );
    let opts = Options {
        torsion: Some(TorsionOptions::default()),
        ..Options::default()
    };
    kern::file::load::analyse(&text, &opts).expect("the section computes")
}

/// A rectangular plate `b` wide, `h` high, centred at (x, y).
fn plate(name: &str, b: f64, h: f64, x: f64, y: f64) -> String {
    format!("[[parts]]\nname = \"{name}\"\nshape = \"rect\"\nb = {b}\nh = {h}\nat = [{x}, {y}]\n")
}

fn flexure(a: &Analysis) -> &Flexure {
    a.flexure().expect("the flexure solution")
}

/// The flexure solution of `a`'s section on a mesh that follows every boundary parts
/// share (the analysis asks for that only with a joint on a closed cell).
fn flexure_at_joints(a: &Analysis) -> Flexure {
    let opts = TorsionOptions {
        joints: true,
        ..a.torsion_options(kern::fe::DEFAULT_TOL, None, true)
    };
    let t = kern::fe::torsion(&a.pieces, &opts).expect("torsion solves");
    t.flexure.expect("asked for").expect("the flexure solution")
}

fn index(a: &Analysis, name: &str) -> usize {
    a.pieces
        .iter()
        .position(|p| p.name == name)
        .expect("a part of that name")
}

/// The signed flow out of part `from` across its joint with `to` (per unit Vx, Vy),
/// from the finest mesh.
fn out_of(f: &Flexure, from: usize, to: usize) -> [f64; 2] {
    let level = f.joint_level().expect("levels");
    let j = level.joint(from, to).expect("the parts share a boundary");
    let sign = if j.a as usize == from { 1.0 } else { -1.0 };
    let s = &j.stretches;
    assert_eq!(s.len(), 1, "one stretch");
    s[0].flux.map(|v| sign * v)
}

/// `(Qx, Qy)` of a rectangle `b × h` centred at (x, y) about the centroid (cx, cy).
fn q_rect(b: f64, h: f64, x: f64, y: f64, cx: f64, cy: f64) -> (f64, f64) {
    (b * h * (y - cy), b * h * (x - cx))
}

/// The shear-flow formula's flow for unit shears (vx, vy) and first moments (qx, qy).
fn formula(a: &Analysis, vx: f64, vy: f64, qx: f64, qy: f64) -> f64 {
    let c = a.props.centroidal();
    let d = c.ixx * c.iyy - c.ixy * c.ixy;
    ((vy * c.iyy - vx * c.ixy) * qx + (vx * c.ixx - vy * c.ixy) * qy) / d
}

fn rel(a: f64, b: f64) -> f64 {
    (a - b).abs() / b.abs()
}

/// A welded box: flanges 300 × 20 over and under two 12 × 400 webs set in 24 mm.
fn box_of_plates() -> String {
    [
        plate("top", 300.0, 20.0, 0.0, 210.0),
        plate("bottom", 300.0, 20.0, 0.0, -210.0),
        plate("left", 12.0, 400.0, -120.0, 0.0),
        plate("right", 12.0, 400.0, 120.0, 0.0),
    ]
    .concat()
}

#[test]
fn box_joint_flows_balance_the_flange_they_cut_off() {
    // Cut through both webs just under the top flange: the flows across the two joints
    // sum to V·Q/I of the flange (Gere & Goodno, shear flow in built-up beams), here
    // Q = 300·20·210 about the centroid at the origin. The residual flux is in
    // equilibrium on every mesh, so this holds to the solves' residual: measured 2.4e-10.
    let body = format!("{}[actions]\nVy = \"100 kN\"\n", box_of_plates());
    let a = analyse(&body);
    let f = flexure(&a);
    let (top, left, right) = (index(&a, "top"), index(&a, "left"), index(&a, "right"));
    let (qx, _) = q_rect(300.0, 20.0, 0.0, 210.0, 0.0, 0.0);
    let exact = formula(&a, 0.0, 1.0, qx, 0.0);
    let sum = out_of(f, top, left)[1] + out_of(f, top, right)[1];
    // Out of the flange, against the change of its bending force: the opposite sign.
    assert!(rel(-sum, exact) < 1e-9, "Σq = {sum}, V·Q/I = {exact}");
    // Every joint is on the closed cell, and each is given (the estimate is small).
    for c in &a.connections {
        assert_eq!(c.flow, Flow::ClosedCell);
        let q = a
            .connection_flow(c)
            .expect("a flow from the flexure solution");
        // By symmetry about y each of the four joints carries half the flange's
        // V·Q/I: 100 kN · Q/I / 2, in N/m (the JSON shows it in N/mm).
        let half = 0.5 * 100e3 * exact * 1e3;
        let j = a.cell_flow_under_actions(c).expect("an estimate");
        assert!(
            rel(q, half) <= j.rel_error.max(1e-9),
            "{q} vs {half}, estimate {:.1e}",
            j.rel_error
        );
        assert!(j.rel_error < 1e-3, "estimate {:.1e}", j.rel_error);
    }
    // No warning about cell joints: each flow is given.
    assert!(
        !a.warnings
            .iter()
            .any(|w| w.to_string().contains("closed cell")),
        "{:?}",
        a.warnings
    );
}

#[test]
fn box_flows_are_symmetric_and_give_the_web_its_share_under_vx() {
    // Sideways shear Vx on the same box: each web's change of bending force (Qy of the
    // web over Iyy, the formula with Vy = 0) leaves it through its two joints, equally
    // by symmetry about x (the two flanges are alike).
    let a = analyse(&box_of_plates());
    let f = flexure(&a);
    let n = |s: &str| index(&a, s);
    let (qx, qy) = q_rect(12.0, 400.0, -120.0, 0.0, 0.0, 0.0);
    let exact = formula(&a, 1.0, 0.0, qx, qy);
    let up = out_of(f, n("left"), n("top"))[0];
    let down = out_of(f, n("left"), n("bottom"))[0];
    assert!(rel(-(up + down), exact) < 1e-8, "{up} + {down} vs {exact}");
    let j = f.joint_flow(n("left"), n("top"), 1.0, 0.0).expect("a flow");
    assert!(rel(up, down) <= j.rel_error, "{up} vs {down}");
    assert!(rel(j.value, 0.5 * exact.abs()) <= j.rel_error);
    // Vy: the joints either side of the axis of symmetry x = 0 carry equal flows.
    for (l, r) in [("top", "left"), ("bottom", "left")] {
        let jl = f.joint_flow(n(l), n(r), 0.0, 1.0).expect("a flow");
        let other = if r == "left" { "right" } else { "left" };
        let jr = f.joint_flow(n(l), n(other), 0.0, 1.0).expect("a flow");
        assert!(
            rel(jl.value, jr.value) <= jl.rel_error.max(jr.rel_error),
            "{l}: {} vs {}",
            jl.value,
            jr.value
        );
    }
}

/// An unsymmetric box: a 400 × 25 top flange, a 300 × 16 bottom one, webs 10 and 16
/// thick; `mirror` turns x into −x.
fn lopsided_box(mirror: bool) -> String {
    let s = if mirror { -1.0 } else { 1.0 };
    [
        plate("top", 400.0, 25.0, 20.0 * s, 262.5),
        plate("bottom", 300.0, 16.0, 0.0, -8.0),
        plate("thin web", 10.0, 250.0, -130.0 * s, 125.0),
        plate("thick web", 16.0, 250.0, 120.0 * s, 125.0),
    ]
    .concat()
}

#[test]
fn mirroring_a_box_leaves_its_flows_alone() {
    // Mirror symmetry (x → −x) of the flexure problem: Vx changes sign with x, so under
    // (Vx, Vy) the mirrored section under (−Vx, Vy) carries the same flows, and their
    // magnitudes do not depend on the sign convention of the joints (docs/format.md:
    // the flow is a magnitude). Both within their estimates; the flows also balance
    // each part's change of bending force (Gere & Goodno, general unsymmetric form).
    let (a, m) = (analyse(&lopsided_box(false)), analyse(&lopsided_box(true)));
    let (fa, fm) = (flexure(&a), flexure(&m));
    let pairs = [
        ("top", "thin web"),
        ("top", "thick web"),
        ("bottom", "thin web"),
        ("bottom", "thick web"),
    ];
    for (vx, vy) in [(1.0, 0.0), (0.0, 1.0), (0.6, 0.8)] {
        for (p, q) in pairs {
            let ja = fa
                .joint_flow(index(&a, p), index(&a, q), vx, vy)
                .expect("a flow");
            let jm = fm
                .joint_flow(index(&m, p), index(&m, q), -vx, vy)
                .expect("a flow");
            let tol = ja.rel_error + jm.rel_error;
            assert!(
                rel(ja.value, jm.value) <= tol,
                "{p}–{q} under ({vx}, {vy}): {} vs {}, estimates {:.1e}",
                ja.value,
                jm.value,
                tol
            );
            assert!(ja.rel_error < 1e-3, "estimate {:.1e}", ja.rel_error);
        }
    }
    // The thick web's change of force leaves it across its two joints.
    let c = a.props.centroidal();
    let web = index(&a, "thick web");
    let (qx, qy) = q_rect(16.0, 250.0, 120.0, 125.0, c.cx, c.cy);
    for (k, (vx, vy)) in [(1.0, 0.0), (0.0, 1.0)].into_iter().enumerate() {
        let exact = formula(&a, vx, vy, qx, qy);
        let sum = out_of(fa, web, index(&a, "top"))[k] + out_of(fa, web, index(&a, "bottom"))[k];
        // To the solves' residual (relative 1e-7 of the load vector): measured 1.0e-9.
        assert!(rel(-sum, exact) < 1e-8, "{k}: {sum} vs {exact}");
    }
}

#[test]
fn plate_girder_bridge_joints_agree_with_v_q_over_i() {
    // A plate girder of unequal flanges: each flange–web joint is a bridge, whose flow
    // the shear-flow formula gives exactly (Gere & Goodno). The FE flux across it is the
    // flange's whole change of force (its other boundary is free), so it agrees to the
    // solves' residual, within the reported estimate (which adds that residual, 1e-7).
    let body = [
        plate("top flange", 250.0, 20.0, 0.0, 310.0),
        plate("web", 10.0, 600.0, 0.0, 0.0),
        plate("bottom flange", 350.0, 25.0, 0.0, -312.5),
        "[actions]\nVy = \"250 kN\"\nVx = \"20 kN\"\n".into(),
    ]
    .concat();
    let a = analyse(&body);
    let f = flexure_at_joints(&a);
    assert_eq!(a.connections.len(), 2);
    for c in &a.connections {
        let Flow::Exact(_) = &c.flow else {
            panic!("a bridge joint: {:?}", c.flow)
        };
        let exact = a.connection_flow(c).expect("V·Q/I") / 1e3; // N/mm
        let j = f
            .joint_flow(c.joint.a, c.joint.b, 20e3, 250e3)
            .expect("an FE flow");
        let err = rel(j.value, exact);
        assert!(
            err <= j.rel_error && err < 1e-7,
            "FE {} vs V·Q/I {exact}: {err:.1e}, estimate {:.1e}",
            j.value,
            j.rel_error
        );
    }
}

#[test]
fn cover_plate_on_a_rolled_i_agrees_with_v_q_over_i() {
    // A 220 × 15 cover plate on an I of 300 × 150 with root fillets: the plate–I joint
    // is a bridge (Gere & Goodno's cover-plate case), V·Q/I with Q of the plate about
    // the composite centroid; the FE flux across the joint agrees within its estimate
    // (measured 2.0e-7 on the two meshes torsion stops on, estimate 3.0e-6).
    let body = "[[parts]]\nname = \"I\"\nshape = \"ibeam\"\nd = 300\nb = 150\ntf = 10.7\ntw = 7.1\nr = 15\nanchor = \"bottom\"\nat = [0, 0]\n\
[[parts]]\nname = \"cover\"\nshape = \"rect\"\nb = 220\nh = 15\nanchor = \"bottom\"\nat = [0, 300]\n\
[actions]\nVy = \"120 kN\"\n";
    let a = analyse(body);
    let c = &a.connections[0];
    assert!(matches!(c.flow, Flow::Exact(_)), "{:?}", c.flow);
    let cen = a.props.centroidal();
    let (qx, _) = q_rect(220.0, 15.0, 0.0, 307.5, cen.cx, cen.cy);
    let by_hand = 120e3 * qx / cen.ixx; // N/mm, symmetric section
    let exact = a.connection_flow(c).expect("V·Q/I") / 1e3;
    assert!(rel(exact, by_hand) < 1e-12, "{exact} vs {by_hand}");
    let j = flexure_at_joints(&a)
        .joint_flow(c.joint.a, c.joint.b, 0.0, 120e3)
        .expect("an FE flow");
    let err = rel(j.value, by_hand);
    assert!(
        err <= j.rel_error && err < 1e-6,
        "FE {} vs {by_hand}: {err:.1e}, estimate {:.1e}",
        j.value,
        j.rel_error
    );
}

#[test]
fn without_the_flexure_solution_cell_joints_say_so() {
    // --no-torsion: no flow for a cell joint, and a warning that it needs the FE solution.
    let text = format!(
        "format = 1\nunits = \"mm\"\n{}[actions]\nVy = \"100 kN\"\n",
        box_of_plates()
    );
    let a = kern::file::load::analyse(&text, &Options::default()).expect("computes");
    for c in &a.connections {
        assert_eq!(a.connection_flow(c), None);
    }
    assert!(a
        .warnings
        .iter()
        .any(|w| w.to_string().contains("--no-torsion")));
}

#[test]
fn a_lid_on_a_channel_gives_each_weld_line_its_flow() {
    // A 200 × 10 lid on the tips of a channel 200 wide, 150 deep, walls 10 (one
    // polygon): one joint of two stretches, a cell. Under Vy the lid's change of force
    // (V·Q/I of the lid, Gere & Goodno) leaves it through the two stretches, equally by
    // symmetry about x = 100; the joint's flow is that of one weld line.
    let body = "[[parts]]\nname = \"channel\"\nshape = \"polygon\"\n\
points = [[0, 0], [200, 0], [200, 150], [190, 150], [190, 10], [10, 10], [10, 150], [0, 150]]\n\
[[parts]]\nname = \"lid\"\nshape = \"rect\"\nb = 200\nh = 10\nanchor = \"bottom_left\"\nat = [0, 150]\n\
[actions]\nVy = \"80 kN\"\n";
    let a = analyse(body);
    let c = &a.connections[0];
    assert_eq!(c.flow, Flow::ClosedCell);
    assert_eq!(c.joint.stretches, 2);
    let cen = a.props.centroidal();
    let (qx, _) = q_rect(200.0, 10.0, 100.0, 155.0, cen.cx, cen.cy);
    let half = 0.5 * 80e3 * qx / cen.ixx; // N/mm
    let q = a.connection_flow(c).expect("a flow") / 1e3;
    let j = a.cell_flow_under_actions(c).expect("an estimate");
    assert!(
        rel(q, half) <= j.rel_error && j.rel_error < 1e-3,
        "{q} vs {half}, estimate {:.1e}",
        j.rel_error
    );
}

#[test]
fn a_core_in_a_tube_has_no_one_figure() {
    // A round core filling a pipe shares a closed circle: the flow across it changes
    // around the loop (under Vy it is zero in sum by symmetry), so no figure is given
    // and a warning says why (common practice: such an interface is checked by its
    // shear stress, not a weld flow).
    let body = "[[parts]]\nname = \"tube\"\nshape = \"pipe\"\nd = 100\nt = 8\n\
[[parts]]\nname = \"core\"\nshape = \"circle\"\nd = 84\n\
[actions]\nVy = \"10 kN\"\n";
    let a = analyse(body);
    let c = &a.connections[0];
    assert!(c.joint.closed, "{:?}", c.joint);
    assert_eq!(a.connection_flow(c), None);
    assert!(
        a.warnings
            .iter()
            .any(|w| w.to_string().contains("closed loop")),
        "{:?}",
        a.warnings
    );
}

#[test]
fn the_crane_runway_box_prints_its_weld_flows() {
    // tests/fixtures/crane-runway-box.toml through calc --json: the two top joints
    // together carry Vy·Q/I of the top flange (Gere & Goodno; Vx adds and takes the
    // same from the two sides, since the flange's Qy is zero), Q = 360·25·(512.5 − ȳ).
    let text = std::fs::read_to_string("tests/fixtures/crane-runway-box.toml").expect("fixture");
    let opts = Options {
        torsion: Some(TorsionOptions::default()),
        ..Options::default()
    };
    let a = kern::file::load::analyse(&text, &opts).expect("computes");
    let u = kern::report::out::OutUnits::new(a.section.units, None);
    let j =
        serde_json::from_str::<serde_json::Value>(&kern::report::json::to_json("box.toml", &a, &u))
            .expect("JSON");
    let flow = |x: &str, y: &str| {
        let c = (j["connections"].as_array().expect("connections").iter())
            .find(|c| c["parts"][0] == x && c["parts"][1] == y)
            .expect("the joint");
        c["shear_flow"]
            .as_f64()
            .expect("a flow from the flexure solution")
    };
    let c = a.props.centroidal();
    let by_hand = 180e3 * 360.0 * 25.0 * (512.5 - c.cy) / c.ixx; // N/mm
    let sum = flow("top flange", "left web") + flow("top flange", "right web");
    assert!(rel(sum, by_hand) < 1e-6, "{sum} vs {by_hand}");
    let table = kern::report::table::to_table("box.toml", &a, &u);
    assert!(table.contains("from the flexure solution"), "{table}");
}
