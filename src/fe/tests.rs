//! Checks of the torsion solver against closed forms and handbook values.

use super::*;
use crate::geom::{Anchor, Placement, Shape};

fn piece(shape: Shape, at: Pt, rotate: f64, flip_x: bool) -> Piece {
    let pl = Placement {
        at,
        anchor: Anchor::Center,
        rotate,
        flip_x,
        flip_y: false,
    };
    Piece::plain("p", pl.apply(&shape.contours()), false)
}

fn solid(shape: Shape) -> Vec<Piece> {
    vec![piece(shape, Pt::default(), 0.0, false)]
}

fn run(p: &[Piece]) -> Torsion {
    torsion(p, &TorsionOptions::default()).expect("torsion solves")
}

/// Checks J against `exact`: the true error is below the reported estimate (an
/// honest estimate) and below the tolerance.
fn check_j(name: &str, t: &Torsion, exact: f64) {
    let err = (t.j - exact).abs() / exact;
    assert!(
        err <= t.rel_error.max(1e-9) && err <= DEFAULT_TOL,
        "{name}: J = {} vs {exact}, error {err:.2e}, estimate {:.2e}",
        t.j,
        t.rel_error
    );
    assert!(
        t.rel_error <= DEFAULT_TOL,
        "{name}: estimate {:.2e}",
        t.rel_error
    );
}

/// Saint-Venant's series for a b × t rectangle (b ≥ t):
/// J = (b t³/3)[1 − (192/π⁵)(t/b) Σ_{n odd} tanh(nπb/2t)/n⁵]
/// (Timoshenko & Goodier, Theory of Elasticity, 3rd ed., §109).
fn rect_series(b: f64, t: f64) -> f64 {
    let s: f64 = (0..200)
        .map(|k| {
            let n = (2 * k + 1) as f64;
            (n * PI * b / (2.0 * t)).tanh() / n.powi(5)
        })
        .sum();
    b * t.powi(3) / 3.0 * (1.0 - 192.0 / PI.powi(5) * (t / b) * s)
}

use std::f64::consts::PI;

#[test]
fn rectangles_match_saint_venant_series() {
    for ratio in [1.0, 0.5, 0.25, 0.1] {
        let (b, t) = (120.0, 120.0 * ratio);
        let r = run(&solid(Shape::Rect { b, h: t }));
        check_j(&format!("rect t/b = {ratio}"), &r, rect_series(b, t));
        // Doubly symmetric: the shear centre is the centroid (at the placement point).
        assert!(r.shear_centre.x.abs() < 1e-6 * b && r.shear_centre.y.abs() < 1e-6 * b);
    }
}

#[test]
fn circle_pipe_ellipse_triangle_match_closed_forms() {
    // Timoshenko & Goodier §§108–109 and any mechanics text: circle πd⁴/32, tube
    // π(D⁴ − d⁴)/32, ellipse πa³b³/(a² + b²), equilateral triangle √3·a⁴/80.
    let c = run(&solid(Shape::Circle { d: 80.0 }));
    check_j("circle", &c, PI * 80f64.powi(4) / 32.0);
    // Cw of a circle is zero (relative to Ip·r²).
    assert!(c.cw.abs() < 1e-6 * (PI * 80f64.powi(4) / 32.0) * 40.0 * 40.0);
    let p = run(&solid(Shape::Pipe { d: 100.0, t: 8.0 }));
    check_j("pipe", &p, PI * (100f64.powi(4) - 84f64.powi(4)) / 32.0);
    let (a, b) = (60.0, 25.0);
    let n = 720;
    let pts: Vec<Pt> = (0..n)
        .map(|i| {
            let t = 2.0 * PI * i as f64 / n as f64;
            Pt::new(a * t.cos(), b * t.sin())
        })
        .collect();
    let e = run(&solid(Shape::Polygon { points: pts }));
    // The polygon's own J differs from the ellipse's by about its area defect, 1e-5.
    let exact = PI * a.powi(3) * b.powi(3) / (a * a + b * b);
    assert!(
        (e.j - exact).abs() / exact < 1e-3,
        "ellipse {} vs {exact}",
        e.j
    );
    let s = 90.0;
    let tri = run(&solid(Shape::Triangle {
        b: s,
        h: s * 3f64.sqrt() / 2.0,
        apex: s / 2.0,
    }));
    check_j("triangle", &tri, 3f64.sqrt() * s.powi(4) / 80.0);
}

#[test]
fn thin_channel_shear_centre_and_warping_constant() {
    // Roark's Formulas for Stress and Strain (Young & Budynas, 7th ed.), shear centres
    // and warping constants of thin-walled open sections, channel with equal
    // thicknesses on centre-line dimensions: e = 3b²/(6b + h) from the web centre
    // line, Cw = t b³ h² (3b + 2h) / (12 (6b + h)). Thickness effects allowed: 5%.
    let (d, bf, t) = (200.0, 80.0, 4.0);
    let shape = Shape::Channel {
        d,
        b: bf,
        tf: t,
        tw: t,
        r: 0.0,
    };
    let p = vec![piece(shape, Pt::new(0.0, 0.0), 0.0, false)];
    let r = run(&p);
    let (b, h) = (bf - t / 2.0, d - t);
    let e = 3.0 * b * b / (6.0 * b + h);
    // Anchor centre: the back of the web is at x = −bf/2, its centre line at −bf/2 + t/2.
    let web = -bf / 2.0 + t / 2.0;
    let got = web - r.shear_centre.x;
    assert!((got - e).abs() / e < 0.05, "e = {got} vs {e}");
    assert!(r.shear_centre.y.abs() < 1e-6 * d);
    let cw = t * b.powi(3) * h * h * (3.0 * b + 2.0 * h) / (12.0 * (6.0 * b + h));
    assert!((r.cw - cw).abs() / cw < 0.05, "Cw = {} vs {cw}", r.cw);
    // The mirrored channel (flanges toward −x) has its shear centre mirrored.
    let m = run(&[piece(
        Shape::Channel {
            d,
            b: bf,
            tf: t,
            tw: t,
            r: 0.0,
        },
        Pt::new(0.0, 0.0),
        0.0,
        true,
    )]);
    assert!((m.shear_centre.x + r.shear_centre.x).abs() < 1e-4 * d);
    assert!((m.j - r.j).abs() < 2e-4 * r.j && (m.cw - r.cw).abs() < 2e-4 * r.cw);
}

#[test]
fn i_section_warping_constant() {
    // Timoshenko & Gere, Theory of Elastic Stability, §5.10: Cw = Iy·h²/4 for an I with
    // h between flange centroids (thin walls).
    let (d, b, tf, tw) = (300.0, 150.0, 6.0, 4.0);
    let r = run(&solid(Shape::IBeam {
        d,
        b,
        tf,
        tw,
        r: 0.0,
    }));
    let h = d - tf;
    let iy = 2.0 * tf * b.powi(3) / 12.0 + (d - 2.0 * tf) * tw.powi(3) / 12.0;
    let cw = iy * h * h / 4.0;
    assert!((r.cw - cw).abs() / cw < 0.02, "Cw = {} vs {cw}", r.cw);
}

#[test]
fn rolled_ipe300_matches_section_tables() {
    // IPE 300 (d 300, b 150, tw 7.1, tf 10.7, r 15): It ≈ 20.1 cm⁴, Iw ≈ 125.9e3 cm⁶,
    // from memory of the European section tables (ArcelorMittal sales programme).
    // Tables use an approximate fillet formula for It: 3% on It, 2% on Iw.
    let r = run(&solid(Shape::IBeam {
        d: 300.0,
        b: 150.0,
        tf: 10.7,
        tw: 7.1,
        r: 15.0,
    }));
    assert!(
        (r.j / 1e4 - 20.1).abs() / 20.1 < 0.03,
        "It = {} cm4",
        r.j / 1e4
    );
    assert!(
        (r.cw / 1e6 - 125.9e3).abs() / 125.9e3 < 0.02,
        "Iw = {} cm6",
        r.cw / 1e6
    );
    assert!(r.rel_error <= DEFAULT_TOL);
}

#[test]
fn translation_and_rotation_change_nothing_but_the_shear_centre() {
    // A rigid motion of the section moves the shear centre with it and leaves J and Cw
    // unchanged (definition of section constants).
    let shape = || Shape::Channel {
        d: 120.0,
        b: 60.0,
        tf: 8.0,
        tw: 6.0,
        r: 6.0,
    };
    let a = run(&[piece(shape(), Pt::new(0.0, 0.0), 0.0, false)]);
    let at = Pt::new(350.0, -120.0);
    let b = run(&[piece(shape(), at, 30.0, false)]);
    assert!((a.j - b.j).abs() / a.j < 2e-4, "{} vs {}", a.j, b.j);
    assert!((a.cw - b.cw).abs() / a.cw < 2e-4, "{} vs {}", a.cw, b.cw);
    let expect = a.shear_centre.rotated(30f64.to_radians()).add(at);
    assert!(
        expect.dist(b.shear_centre) < 1e-3 * 120.0,
        "{:?} vs {expect:?}",
        b.shear_centre
    );
}

#[test]
fn refinement_converges_at_a_consistent_rate() {
    // On a 2:1 rectangle (smooth solution, Saint-Venant's series as the reference) the
    // error of J falls at a steady rate as the mesh is split: each level's error is a
    // large, nearly constant factor below the previous (P2: up to 2⁴ for J).
    let (b, t) = (100.0, 50.0);
    let exact = rect_series(b, t);
    let mut m = mesh::base(&solid(Shape::Rect { b, h: t }), 1.0, false)
        .expect("mesh")
        .mesh;
    let mut errs = Vec::new();
    let mut ladder = torsion::Ladder::default();
    let mut step = None;
    for _ in 0..3 {
        let l = ladder.solve(&m, step.take(), None).expect("solves");
        errs.push((l.j - exact).abs() / exact);
        let fine = m.refine();
        step = Some(m.prolongation(&fine));
        m = fine;
    }
    let (r1, r2) = (errs[0] / errs[1], errs[1] / errs[2]);
    assert!(
        r1 > 6.0 && r2 > 6.0 && (r1 / r2 - 1.0).abs() < 0.6,
        "{errs:?}"
    );
}

#[test]
fn cancellation_flag_stops_the_solver() {
    let flag = Arc::new(AtomicBool::new(true));
    let opts = TorsionOptions {
        tol: 1e-3,
        cancel: Some(flag),
        flexure: None,
        joints: false,
    };
    let r = torsion(&solid(Shape::Rect { b: 10.0, h: 5.0 }), &opts);
    assert_eq!(r, Err(crate::model::Warning::Cancelled));
}

#[test]
fn nothing_to_mesh_is_an_error() {
    assert!(torsion(&[], &TorsionOptions::default()).is_err());
    let mut v = solid(Shape::Rect { b: 10.0, h: 5.0 });
    v[0].void = true;
    assert!(torsion(&v, &TorsionOptions::default()).is_err());
}

#[test]
fn outline_covers_the_region() {
    // The drawn triangles tile the rectangle: their areas sum to b·h.
    let tris = mesh_outline(&solid(Shape::Rect { b: 30.0, h: 20.0 }), 1000);
    assert!(!tris.is_empty() && tris.len() <= 1000);
    let a: f64 = tris
        .iter()
        .map(|t| 0.5 * t[1].sub(t[0]).cross(t[2].sub(t[0])))
        .sum();
    assert!((a - 600.0).abs() < 1e-9 * 600.0);
    assert!(mesh_outline(&[], 1000).is_empty());
}

/// A solid part of modular ratio `n` and the same shear modulus ratio (one ν).
fn with_n(mut p: Piece, n: f64) -> Piece {
    p.n = n;
    p.g = n;
    p
}

#[test]
fn bimetal_rectangle_lies_between_the_homogeneous_values() {
    // J = min over ω of ∫n|∇ω + (−y, x)|² dA (minimum potential energy, e.g. Pilkey,
    // Analysis and Design of Elastic Beams, ch. 6) is nondecreasing in every n, and
    // strictly between the bounds here: halves of n = 1 and n = 2 give
    // J(1) < J < 2·J(1), with J(1) from Saint-Venant's series.
    let (b, h) = (60.0, 40.0);
    let half = |x: f64, n: f64| {
        with_n(
            piece(Shape::Rect { b: b / 2.0, h }, Pt::new(x, 0.0), 0.0, false),
            n,
        )
    };
    let r = run(&[half(-b / 4.0, 1.0), half(b / 4.0, 2.0)]);
    let j1 = rect_series(b, h);
    assert!(r.j > 1.01 * j1 && r.j < 0.99 * 2.0 * j1, "{} vs {j1}", r.j);
    assert!(r.rel_error <= 1e-3);
    // The stiffer half pulls the shear centre toward it.
    assert!(r.shear_centre.x > 0.0 && r.shear_centre.y.abs() < 1e-6 * b);
}

#[test]
fn concentric_rings_of_two_materials_add_up() {
    // A bar of concentric rings does not warp (ω = 0 in each ring), so
    // J = Σ nᵢ·π(rₒ⁴ − rᵢ⁴)/2 exactly (Timoshenko & Goodier, Theory of Elasticity,
    // circular shafts; the rings share one twist).
    let core = with_n(solid(Shape::Circle { d: 40.0 }).remove(0), 2.0);
    let ring = solid(Shape::Pipe { d: 80.0, t: 20.0 }).remove(0);
    let r = run(&[ring, core]);
    let annulus = |ro: f64, ri: f64| PI / 2.0 * (ro.powi(4) - ri.powi(4));
    let exact = 2.0 * annulus(20.0, 0.0) + annulus(40.0, 20.0);
    check_j("rings", &r, exact);
}

#[test]
fn concentric_rings_weigh_torsion_by_shear_modulus() {
    // The same rings with a core of another Poisson's ratio: E_core/E_ref = 2 but
    // G_core/G_ref = 1.5. The Saint-Venant shear stresses are G·θ′·r in each ring, so
    // J = Σ (Gᵢ/G_ref)·π(rₒ⁴ − rᵢ⁴)/2 (Timoshenko & Goodier, circular shafts); E plays
    // no part.
    let mut core = solid(Shape::Circle { d: 40.0 }).remove(0);
    core.n = 2.0;
    core.g = 1.5;
    let ring = solid(Shape::Pipe { d: 80.0, t: 20.0 }).remove(0);
    let r = run(&[ring, core]);
    let annulus = |ro: f64, ri: f64| PI / 2.0 * (ro.powi(4) - ri.powi(4));
    check_j(
        "rings, two ν",
        &r,
        1.5 * annulus(20.0, 0.0) + annulus(40.0, 20.0),
    );
}

#[test]
fn built_up_plates_equal_the_same_section_as_one_polygon() {
    // J, Cw and the shear centre are properties of the region (Saint-Venant's
    // definition), so an I welded from five touching plates and the same I drawn as one
    // outline must agree within the tolerance of each.
    let (d, b, tf, tw) = (200.0, 100.0, 10.0, 8.0);
    let rect =
        |w: f64, h: f64, x: f64, y: f64| piece(Shape::Rect { b: w, h }, Pt::new(x, y), 0.0, false);
    let hw = (d - 2.0 * tf) / 2.0;
    let plates = [
        rect(b, tf, 0.0, (d - tf) / 2.0),
        rect(b, tf, 0.0, -(d - tf) / 2.0),
        rect(tw, hw, 0.0, hw / 2.0),
        rect(tw, hw, 0.0, -hw / 2.0),
        rect(tw, tf, 0.0, (d - tf) / 2.0),
    ];
    let (x1, x2, y1, y2) = (b / 2.0, tw / 2.0, d / 2.0, d / 2.0 - tf);
    let outline = [
        (-x1, -y1),
        (x1, -y1),
        (x1, -y2),
        (x2, -y2),
        (x2, y2),
        (x1, y2),
        (x1, y1),
        (-x1, y1),
        (-x1, y2),
        (-x2, y2),
        (-x2, -y2),
        (-x1, -y2),
    ];
    let polygon = Shape::Polygon {
        points: outline.iter().map(|&(x, y)| Pt::new(x, y)).collect(),
    };
    let a = run(&plates);
    let p = run(&solid(polygon));
    let tol = a.rel_error + p.rel_error;
    assert!((a.j - p.j).abs() / p.j <= tol, "J {} vs {}", a.j, p.j);
    assert!((a.cw - p.cw).abs() / p.cw <= tol, "Cw {} vs {}", a.cw, p.cw);
    assert!(a.shear_centre.dist(p.shear_centre) < 1e-6 * d);
}

#[test]
fn separate_pieces_add_their_torsion_constants_and_say_so() {
    // Two unconnected 60 × 20 bars: each twists freely, so J is twice the
    // Saint-Venant value of one (Timoshenko & Goodier §109), and the user is told.
    let bar = || Shape::Rect { b: 60.0, h: 20.0 };
    let p = vec![
        piece(bar(), Pt::new(-50.0, 0.0), 0.0, false),
        piece(bar(), Pt::new(50.0, 0.0), 0.0, false),
    ];
    let t = run(&p);
    check_j("two bars", &t, 2.0 * rect_series(60.0, 20.0));
    assert!(
        t.warnings
            .iter()
            .any(|w| w.to_string().contains("2 separate pieces")),
        "{:?}",
        t.warnings
    );
}

#[test]
fn says_when_the_region_differs_from_the_signed_sum() {
    // docs/format.md, "How parts combine": a void half outside the plate removes area the plate
    // does not have; torsion sees the plate with a notch, and says so.
    let plate = piece(
        Shape::Rect { b: 100.0, h: 100.0 },
        Pt::default(),
        0.0,
        false,
    );
    let mut stray = piece(
        Shape::Rect { b: 40.0, h: 40.0 },
        Pt::new(50.0, 0.0),
        0.0,
        false,
    );
    stray.void = true;
    let t = run(&[plate.clone(), stray]);
    assert!(
        t.warnings
            .iter()
            .any(|w| w.to_string().contains("differs from the signed sum")),
        "{:?}",
        t.warnings
    );
    let t = run(&[plate]);
    assert!(t.warnings.is_empty(), "{:?}", t.warnings);
}

#[test]
fn a_traced_outline_of_many_corners_is_simplified_honestly() {
    // A disc traced by 20,000 straight edges: J = πr⁴/2 for the polygon's own disc
    // (Timoshenko & Goodier §109, circular shaft), reached within the reported error,
    // which includes the simplification of the outline.
    let n = 20_000;
    let r = 50.0;
    let pts: Vec<Pt> = (0..n)
        .map(|i| {
            let t = i as f64 / n as f64 * std::f64::consts::TAU;
            Pt::new(r * t.cos(), r * t.sin())
        })
        .collect();
    let t = run(&solid(Shape::Polygon { points: pts }));
    let exact = PI * r.powi(4) / 2.0;
    let err = (t.j - exact).abs() / exact;
    assert!(
        err <= t.rel_error && t.rel_error <= 1e-3,
        "error {err:.2e}, estimate {:.2e}",
        t.rel_error
    );
    assert!(
        t.warnings
            .iter()
            .any(|w| w.to_string().contains("of their 20000 corners")),
        "{:?}",
        t.warnings
    );
}

#[test]
fn budget_admits_within_and_refuses_past_each_limit() {
    // The budget is ours (no outside source): each limit alone refuses.
    let b = Budget {
        elements: 1000,
        nodes: 2500,
        bytes: Budget::bytes_for(1000),
    };
    assert!(b.admits(1000, 2500));
    assert!(!b.admits(1001, 2000));
    assert!(!b.admits(900, 2501));
    let tight = Budget {
        bytes: Budget::bytes_for(500),
        ..b
    };
    assert!(!tight.admits(600, 1000));
    // Refining quadruples both counts.
    assert!(b.admits_refinement(250, 600));
    assert!(!b.admits_refinement(251, 600));
    assert!(!b.admits_refinement(200, 700));
}

#[test]
fn features_below_the_floor_are_refused_with_the_ratio() {
    // A pipe 100 across with a wall of 1e-6: a ratio of 1e8, past the floor of 1e-5.
    let pipe = Piece::plain(
        "pipe",
        vec![
            crate::geom::Contour::circle(Pt::new(0.0, 0.0), 50.0),
            crate::geom::Contour::circle(Pt::new(0.0, 0.0), 50.0 - 1e-6).reversed(),
        ],
        false,
    );
    let e = torsion(&[pipe], &TorsionOptions::default()).unwrap_err();
    assert!(
        e.to_string()
            .contains("features 1e8 times smaller than the section"),
        "{e}"
    );
}

/// The base mesh's area (exact for straight-sided pieces), the same with the boundaries
/// pieces share kept as element edges (`joints`) as without.
fn base_area(p: &[Piece]) -> f64 {
    let area = |joints: bool| {
        let m = mesh::base(p, BASE_SIZE, joints).expect("meshes").mesh;
        mesh_area(&m)
    };
    let (plain, joined) = (area(false), area(true));
    assert!(
        (plain - joined).abs() <= 1e-9 * plain,
        "{plain} vs {joined}"
    );
    plain
}

fn mesh_area(m: &mesh::Mesh) -> f64 {
    m.elems
        .iter()
        .map(|e| {
            let [a, b, c] = [0, 1, 2].map(|k| m.nodes[e[k] as usize]);
            0.5 * b.sub(a).cross(c.sub(a))
        })
        .sum()
}

#[test]
fn base_mesh_covers_the_region_of_overlaps_voids_and_shared_edges() {
    // Areas of unions and differences of rectangles, by plain geometry: the triangles
    // classified as region (one classification per patch between constraint edges)
    // add up to them exactly.
    let rect =
        |b: f64, h: f64, x: f64, y: f64| piece(Shape::Rect { b, h }, Pt::new(x, y), 0.0, false);
    let void = |mut p: Piece| {
        p.void = true;
        p
    };
    let cases: Vec<(&str, Vec<Piece>, f64)> = vec![
        // Two plates sharing a whole edge: 2 × 40 × 10.
        (
            "shared edge",
            vec![rect(40.0, 10.0, 0.0, 0.0), rect(40.0, 10.0, 0.0, 10.0)],
            800.0,
        ),
        // Two plates overlapping by 10 × 10: 2 × 400 − 100.
        (
            "overlap",
            vec![rect(20.0, 20.0, 0.0, 0.0), rect(20.0, 20.0, 10.0, 10.0)],
            700.0,
        ),
        // A 100 × 100 plate, a 20 × 20 core, a void half outside: 10,000 − 400 − 400.
        (
            "voids",
            vec![
                rect(100.0, 100.0, 0.0, 0.0),
                void(rect(20.0, 20.0, 0.0, 0.0)),
                void(rect(40.0, 20.0, 50.0, 20.0)),
            ],
            9_200.0,
        ),
        // A plate lying wholly inside another counts once.
        (
            "inside",
            vec![rect(60.0, 30.0, 0.0, 0.0), rect(20.0, 10.0, 5.0, 5.0)],
            1_800.0,
        ),
        // Two plates touching at a corner only, and one apart: 3 × 100.
        (
            "corner and apart",
            vec![
                rect(10.0, 10.0, 0.0, 0.0),
                rect(10.0, 10.0, 10.0, 10.0),
                rect(10.0, 10.0, 40.0, 0.0),
            ],
            300.0,
        ),
    ];
    for (name, p, exact) in cases {
        let a = base_area(&p);
        assert!((a - exact).abs() <= 1e-9 * exact, "{name}: {a} vs {exact}");
    }
    // Two materials sharing an edge (an interface): each element keeps its own ratio,
    // areas 400 of n = 1 and 400 of n = 3.
    let p = vec![
        rect(40.0, 10.0, 0.0, 0.0),
        with_n(rect(40.0, 10.0, 0.0, 10.0), 3.0),
    ];
    let m = mesh::base(&p, BASE_SIZE, false).expect("meshes").mesh;
    let mut by_n = [0.0; 2];
    for (e, &n) in m.elems.iter().zip(&m.weight) {
        let [a, b, c] = [0, 1, 2].map(|k| m.nodes[e[k] as usize]);
        by_n[usize::from(n == 3.0)] += 0.5 * b.sub(a).cross(c.sub(a));
    }
    assert!(
        (by_n[0] - 400.0).abs() < 1e-9 && (by_n[1] - 400.0).abs() < 1e-9,
        "{by_n:?}"
    );
}

#[test]
fn a_large_base_mesh_is_solved_in_two_levels() {
    // A base mesh past the factor's size (solve::DIRECT_MAX_ROWS unknowns) is iterated
    // over its linear elements; J then agrees with Saint-Venant's series for the
    // rectangle (Timoshenko & Goodier §109) to the fine mesh's discretisation error.
    let (b, t) = (120.0, 60.0);
    let base = mesh::base(&solid(Shape::Rect { b, h: t }), 0.01, false).expect("meshes");
    let m = &base.mesh;
    assert!(
        m.nodes.len() > solve::DIRECT_MAX_ROWS,
        "{} nodes",
        m.nodes.len()
    );
    let mut ladder = torsion::Ladder::solving(1);
    let level = ladder.solve(m, None, None).expect("solves");
    assert!(!ladder.solver().expect("a solver").direct());
    assert!(
        level.iterations > 1 && level.iterations < 60,
        "{} iterations",
        level.iterations
    );
    let exact = rect_series(b, t);
    let err = (level.j - exact).abs() / exact;
    assert!(err < 1e-6, "J = {} vs {exact}: {err:.1e}", level.j);
}
