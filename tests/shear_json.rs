//! `kern calc --json`, the built binary on files of our own, against hand values of the
//! shear keys (FORMAT.md: `shear_area {x, y}` energy-consistent, `shear {tau_max,
//! von_mises_max}` in the stress unit of `quantity_units`, `connections [{parts, length,
//! shear_flow}]` with the flow a magnitude in `quantity_units.shear_flow`). Each check
//! names its source. The same figures are checked in process, on other dimensions, in
//! tests/shear_stress.rs (rectangle with ν ≠ 0 against Cowper, the rolled I, the channel),
//! tests/shear_flow.rs and tests/cell_joints.rs; here they go through the file, the
//! command line and the JSON, keys, units and signs as the format fixes them.

use serde_json::Value;
use std::f64::consts::PI;
use std::process::Command;

/// `kern calc --json` on `body` (after the header, lengths in mm), parsed.
fn calc(name: &str, body: &str) -> Value {
    let dir = tempfile::tempdir().expect("temp dir");
    let path = dir.path().join(format!("{name}.toml"));
    std::fs::write(&path, format!("format = 1\nunits = \"mm\"\n{body}")).expect("written");
    let out = Command::new(env!("CARGO_BIN_EXE_kern"))
        .args(["calc", "--json"])
        .arg(&path)
        .output()
        .expect("kern runs");
    assert!(
        out.status.success(),
        "{}",
        String::from_utf8_lossy(&out.stderr)
    );
    let j: Value = serde_json::from_slice(&out.stdout).expect("one JSON object");
    // Every figure below is in these units (FORMAT.md, quantity_units for mm files).
    assert_eq!(j["quantity_units"]["stress"], "MPa", "{j}");
    assert_eq!(j["quantity_units"]["shear_flow"], "N/mm", "{j}");
    j
}

fn num(v: &Value) -> f64 {
    v.as_f64().unwrap_or_else(|| panic!("a number: {v}"))
}

fn close(what: &str, got: f64, want: f64, rel: f64) {
    let e = (got - want).abs() / want.abs();
    assert!(e <= rel, "{what}: {got} vs {want} ({e:.2e} > {rel:.0e})");
}

fn steel(nu: f64) -> String {
    format!("[[materials]]\nname = \"steel\"\nE = \"210 GPa\"\nnu = {nu}\n")
}

fn plate(name: &str, b: f64, h: f64, x: f64, y: f64) -> String {
    format!("[[parts]]\nname = \"{name}\"\nshape = \"rect\"\nb = {b}\nh = {h}\nat = [{x}, {y}]\n")
}

#[test]
fn rectangle_with_nu_zero_is_one_and_a_half_v_over_a_and_five_sixths_of_a() {
    // ν = 0: τ = 3V/(2A)·(1 − 4y²/h²) is exact (Timoshenko & Goodier, Theory of
    // Elasticity, §124), its peak 1.5·V/A on the neutral axis; its energy
    // ∫τ² dA = 6V²/(5A) gives the energy-consistent shear area A_s = 5A/6 (FORMAT.md).
    let j = calc(
        "lintel",
        &format!(
            "{}{}[actions]\nVy = \"25 kN\"\n",
            steel(0.0),
            plate("lintel", 50.0, 140.0, 0.0, 0.0)
        ),
    );
    let a = 50.0 * 140.0;
    for k in ["x", "y"] {
        close(k, num(&j["shear_area"][k]), 5.0 * a / 6.0, 1e-4);
    }
    let t = &j["shear"]["tau_max"];
    close("τmax", num(&t["value"]), 1.5 * 25e3 / a, 1e-3);
    assert!(num(&t["y"]).abs() < 1e-6, "on the neutral axis: {t}");
    // No bending in [actions]: von Mises is √3·τ at the same point.
    close(
        "σvM",
        num(&j["shear"]["von_mises_max"]["value"]),
        3f64.sqrt() * 1.5 * 25e3 / a,
        1e-3,
    );
}

/// The energy-consistent shear coefficient k = A_s/A of a circle from the exact flexure
/// solution (Timoshenko & Goodier §121): with V = 1, I = πR⁴/4,
/// τzx = a(R² − x² − c·y²), τzy = −b·x·y, a = (3 + 2ν)/(8(1 + ν)I), c = (1 − 2ν)/(3 + 2ν),
/// b = (1 + 2ν)/(4(1 + ν)I). Over the disk ∫x² = πR⁴/4, ∫x⁴ = πR⁶/8, ∫x²y² = πR⁶/24,
/// so ∫τzx² = a²πR⁶(5/8 − 5c/12 + c²/8), ∫τzy² = b²πR⁶/24 and k = 1/(πR²·∫τ²)
/// (6/7 at ν = 0, worked here by hand: bracket 1/2, ∫τ² = 7/(6πR²)).
fn circle_k(nu: f64) -> f64 {
    let r = 1.0_f64;
    let i = PI * r.powi(4) / 4.0;
    let a = (3.0 + 2.0 * nu) / (8.0 * (1.0 + nu) * i);
    let c = (1.0 - 2.0 * nu) / (3.0 + 2.0 * nu);
    let b = (1.0 + 2.0 * nu) / (4.0 * (1.0 + nu) * i);
    let e = a * a * PI * r.powi(6) * (5.0 / 8.0 - 5.0 * c / 12.0 + c * c / 8.0)
        + b * b * PI * r.powi(6) / 24.0;
    1.0 / (PI * r * r * e)
}

#[test]
fn circle_with_poisson_against_the_exact_energy_and_cowper() {
    // FORMAT.md: shear_area is energy-consistent, so it is checked against the energy of
    // the exact solution (circle_k) to 1e-3. Cowper, "The shear coefficient in
    // Timoshenko's beam theory", J. Appl. Mech. 33 (1966), gives k = 6(1 + ν)/(7 + 6ν)
    // from the mean displacement, not the energy: it agrees at ν = 0 (6/7 both) and is
    // checked at ν = 0.3 to the gap between the two definitions (computed here) plus 1e-3.
    assert!((circle_k(0.0) - 6.0 / 7.0).abs() < 1e-12);
    let area = PI * 60.0 * 60.0;
    for nu in [0.0, 0.3] {
        let j = calc(
            "hanger",
            &format!(
                "{}[[parts]]\nname = \"hanger\"\nshape = \"circle\"\nd = 120\n[actions]\nVy = \"30 kN\"\n",
                steel(nu)
            ),
        );
        let k = num(&j["shear_area"]["y"]) / area;
        close(&format!("k energy ν={nu}"), k, circle_k(nu), 1e-3);
        let cowper = 6.0 * (1.0 + nu) / (7.0 + 6.0 * nu);
        let gap = (circle_k(nu) - cowper).abs() / cowper;
        close(&format!("k Cowper ν={nu}"), k, cowper, gap + 1e-3);
        // τmax = (3 + 2ν)/(2(1 + ν))·V/A at the centre (Timoshenko & Goodier §121).
        let t = num(&j["shear"]["tau_max"]["value"]);
        close(
            "τmax",
            t,
            (3.0 + 2.0 * nu) / (2.0 * (1.0 + nu)) * 30e3 / area,
            1e-3,
        );
    }
}

#[test]
fn circle_and_pipe_in_torsion_are_t_r_over_j() {
    // τ = T·r/J, J = π(d⁴ − di⁴)/32, largest at the outer surface (Gere & Goodno,
    // Mechanics of Materials, torsion of circular bars).
    for (shape, dims, d, di) in [
        ("circle", "d = 100", 100.0_f64, 0.0_f64),
        ("pipe", "d = 100\nt = 8", 100.0, 84.0),
    ] {
        let j = calc(
            shape,
            &format!("[[parts]]\nname = \"post\"\nshape = \"{shape}\"\n{dims}\n[actions]\nT = \"3 kN*m\"\n"),
        );
        let jj = PI * (d.powi(4) - di.powi(4)) / 32.0;
        let t = &j["shear"]["tau_max"];
        close(shape, num(&t["value"]), 3e6 * (d / 2.0) / jj, 1e-3);
        close("r", num(&t["x"]).hypot(num(&t["y"])), d / 2.0, 1e-6);
    }
}

#[test]
fn rectangle_in_torsion_from_the_saint_venant_series() {
    // Saint-Venant's rectangle, sides t (short) and b (Timoshenko & Goodier §109, the
    // stress function in cos(nπx/t), n odd):
    //   τmax = T·t/J · (1 − (8/π²)·Σ 1/(n² cosh(nπb/2t))),
    //   J = (b·t³/3)·(1 − (192t/(π⁵b))·Σ tanh(nπb/2t)/n⁵),
    // at the middle of a long side. The series are summed here to n = 401.
    let (t, b) = (25.0_f64, 100.0_f64);
    let (mut s1, mut s2) = (0.0, 0.0);
    for n in (1..=401).step_by(2).map(f64::from) {
        let z = n * PI * b / (2.0 * t);
        s1 += 1.0 / (n * n * z.cosh());
        s2 += z.tanh() / n.powi(5);
    }
    let jj = b * t.powi(3) / 3.0 * (1.0 - 192.0 * t / (PI.powi(5) * b) * s2);
    let tau = 0.8e6 * t / jj * (1.0 - 8.0 / (PI * PI) * s1);
    let j = calc(
        "nosing",
        &format!(
            "{}[actions]\nT = \"0.8 kN*m\"\n",
            plate("nosing", b, t, 0.0, 0.0)
        ),
    );
    close("J", num(&j["torsion"]["j"]), jj, 1e-3);
    let p = &j["shear"]["tau_max"];
    close("τmax", num(&p["value"]), tau, 1e-3);
    assert!(
        num(&p["x"]).abs() < 1e-6 && (num(&p["y"]).abs() - t / 2.0).abs() < 1e-6,
        "{p}"
    );
}

#[test]
fn plate_girder_welds_and_a_cover_plate_carry_v_q_over_i() {
    // Our own mezzanine girder with a cover plate: flanges 250 × 16, web 8 × 500, a
    // 180 × 12 cover plate on the top flange; Vy = 300 kN. Each joint separates the
    // section, so q = V·Q/I (FORMAT.md's formula with Vx = 0, Ixy = 0; the textbook
    // shear-flow formula, Gere & Goodno), Q of the side cut off about the centroid.
    let parts = [
        ("cover", 180.0, 12.0, 0.0, 272.0),
        ("top flange", 250.0, 16.0, 0.0, 258.0),
        ("web", 8.0, 500.0, 0.0, 0.0),
        ("bottom flange", 250.0, 16.0, 0.0, -258.0),
    ];
    let body: String = parts
        .iter()
        .map(|p| plate(p.0, p.1, p.2, p.3, p.4))
        .collect();
    let j = calc("girder", &format!("{body}[actions]\nVy = \"300 kN\"\n"));
    let area: f64 = parts.iter().map(|p| p.1 * p.2).sum();
    let ybar = parts.iter().map(|p| p.1 * p.2 * p.4).sum::<f64>() / area;
    let i: f64 = (parts.iter())
        .map(|p| p.1 * p.2.powi(3) / 12.0 + p.1 * p.2 * (p.4 - ybar).powi(2))
        .sum();
    let q_of = |upto: usize| -> f64 {
        (parts[..upto].iter())
            .map(|p| p.1 * p.2 * (p.4 - ybar))
            .sum()
    };
    // The side cut off: the cover; the cover and the top flange; the bottom flange.
    let want = [
        ("cover", "top flange", 180.0, q_of(1)),
        ("top flange", "web", 8.0, q_of(2)),
        (
            "web",
            "bottom flange",
            8.0,
            -(parts[3].1 * parts[3].2 * (parts[3].4 - ybar)),
        ),
    ];
    let conns = j["connections"].as_array().expect("connections");
    assert_eq!(conns.len(), 3, "{j}");
    for (c, (a, b, len, q)) in conns.iter().zip(want) {
        assert_eq!(c["parts"], serde_json::json!([a, b]), "{c}");
        close("length", num(&c["length"]), len, 1e-12);
        close(
            &format!("{a}–{b}"),
            num(&c["shear_flow"]),
            300e3 * q / i,
            1e-9,
        );
    }
}

#[test]
fn welded_box_joint_flows_balance_the_flange_cut_off() {
    // Our own crane-runway box: flanges 300 × 15 on two webs 10 × 370 at x = ±100 (a
    // closed cell: the joint flows come from the flexure solution). A cut through both
    // webs just below the top flange takes off the flange (with its overhangs), and
    // equilibrium of that free body along the member gives the two web joints' flows
    // summing to V·Q/I of it (Gere & Goodno, shear flow in built-up beams; symmetric,
    // so each carries half).
    let body = format!(
        "{}{}{}{}[actions]\nVy = \"400 kN\"\n",
        plate("top", 300.0, 15.0, 0.0, 192.5),
        plate("left web", 10.0, 370.0, -100.0, 0.0),
        plate("right web", 10.0, 370.0, 100.0, 0.0),
        plate("bottom", 300.0, 15.0, 0.0, -192.5)
    );
    let j = calc("box", &body);
    let i = 2.0 * (300.0 * 15f64.powi(3) / 12.0 + 4500.0 * 192.5f64.powi(2))
        + 2.0 * 10.0 * 370f64.powi(3) / 12.0;
    let q = 400e3 * 4500.0 * 192.5 / i;
    let conns = j["connections"].as_array().expect("connections");
    let flow = |a: &str, b: &str| {
        let c = (conns.iter())
            .find(|c| c["parts"] == serde_json::json!([a, b]))
            .unwrap_or_else(|| panic!("{a}–{b}: {j}"));
        num(&c["shear_flow"])
    };
    let (l, r) = (flow("top", "left web"), flow("top", "right web"));
    // The flows' own estimate is within the tolerance 1e-3 when they are given.
    close("sum", l + r, q, 2e-3);
    close("symmetry", l, r, 1e-6);
    close(
        "bottom",
        flow("left web", "bottom") + flow("right web", "bottom"),
        q,
        2e-3,
    );
}

/// `calc --json` of our own canopy-bracket angle (120 × 80 × 10, root fillet 12, heel at
/// the origin), mirrored about the y axis by `flip_x` or not, under `actions`.
fn angle(flip: bool, actions: &str) -> Value {
    calc(
        "angle",
        &format!(
            "[[parts]]\nname = \"angle\"\nshape = \"angle\"\nh = 120\nb = 80\nt = 10\nr = 12\n\
             anchor = \"origin\"\nflip_x = {flip}\n[actions]\n{actions}\n"
        ),
    )
}

/// The mirror checks: the flexure problem under x → −x maps τzx to −τzx, so |τ| and von
/// Mises keep their values at mirrored points and the shear areas do not change
/// (Timoshenko & Goodier, flexure of bars; symmetry of the equations). A reflection
/// turns the sense of a twist and of a shear along x: the mirror image of the load
/// (Vx, Vy, T) is (−Vx, Vy, −T), so the mirrored section gets `mirrored_actions` (the
/// same T on both would add the torsional stress to Vy's on one side of the web and take
/// it off on the other). The two meshes are not exact mirror images (the triangulation
/// breaks ties its own way), so the figures agree to their error estimates, not to
/// rounding: 1e-5 for the areas (solver floor 1e-6), the tolerance 1e-3 for the peaks.
fn mirrored(actions: &str, mirrored_actions: &str) {
    let (a, b) = (angle(false, actions), angle(true, mirrored_actions));
    for k in ["x", "y"] {
        close(k, num(&b["shear_area"][k]), num(&a["shear_area"][k]), 1e-5);
    }
    for key in ["tau_max", "von_mises_max"] {
        let (p, q) = (&a["shear"][key], &b["shear"][key]);
        close(key, num(&q["value"]), num(&p["value"]), 1e-3);
        assert!((num(&q["x"]) + num(&p["x"])).abs() < 1e-6, "{p} {q}");
        assert!((num(&q["y"]) - num(&p["y"])).abs() < 1e-6, "{p} {q}");
    }
}

#[test]
fn mirroring_the_section_mirrors_the_stresses_and_keeps_the_areas() {
    // An unequal angle with a root fillet (no sharp inside corner) under Vy.
    let vy = "Vy = \"40 kN\"";
    mirrored(vy, vy);
}

#[test]
fn mirroring_the_section_under_shear_and_torque() {
    // The peak is at the fillet, where Vy's and T's stresses add (78.5 MPa; under the
    // same T the mirrored angle's is 77.2 at the heel, measured: DEVELOPERS.md).
    mirrored(
        "Vy = \"40 kN\"\nT = \"0.2 kN*m\"",
        "Vy = \"40 kN\"\nT = \"-0.2 kN*m\"",
    );
}
