//! Sections in separate pieces (issue 9, item 4): the shear centre and warping constant
//! of pieces that twist and bend together but are free to slide lengthwise against each
//! other, against thin-walled hand values.
//!
//! Kinematics (Vlasov, Thin-Walled Elastic Beams, 1961, ch. I; Trahair, Flexural-
//! Torsional Buckling of Structures, 1993, ch. 5 and 7): the cross-section keeps its shape
//! in its plane, so every piece i moves with the common lateral displacements u, v and
//! twist θ about one axis S = (xs, ys). Each piece is a beam of its own: its axial
//! displacement is its own constant c_i (no shear connection along the member) plus
//! the plane-sections term of its own bending plus its own warping. Its own bending is
//! not free: its lateral displacements are u_i = u − (ȳ_i − ys)θ, v_i = v + (x̄_i − xs)θ,
//! so the linear (bending) warping terms of each piece ARE set by the connection, while
//! the constant is not. Writing X = x − x̄_i, Y = y − ȳ_i on piece i, the warping function
//! about S is therefore
//!
//! ```text
//! ω_S = ω_i − (ys − b_i)·X + (xs − a_i)·Y        (zero mean over each piece)
//! ```
//!
//! with (a_i, b_i) the piece's own shear centre and ω_i its own warping function about
//! it (zero mean, orthogonal to X and Y over the piece). Cw = Σ ∫ ω_S² dA and the shear
//! centre is where ω_S produces no bending moment, ∫ X·ω_S = ∫ Y·ω_S = 0 summed over the
//! pieces, which is also where Cw is least:
//!
//! ```text
//! Cw(xs, ys) = Σ [ Cw_i + (ys − b_i)²·Iyy_i + (xs − a_i)²·Ixx_i − 2(ys − b_i)(xs − a_i)·Ixy_i ]
//! Σ [ (ys − b_i)·Iyy_i − (xs − a_i)·Ixy_i ] = 0,   Σ [ (xs − a_i)·Ixx_i − (ys − b_i)·Ixy_i ] = 0
//! ```
//!
//! with each piece's OWN centroidal second moments (not the composite's, which would
//! include A_i·d² terms of a shear connection that does not exist). A single connected
//! section is the special case of one piece. This is what the finite-element warping
//! field gives when each piece's mean is removed separately and the Trefftz conditions
//! use the pieces' own second moments, which is what kern computes (src/fe/torsion.rs):
//! the tests compare kern's reported shear centre and Cw with the hand values directly.

use kern::fe::{torsion, Torsion, TorsionOptions};
use kern::geom::{Contour, Piece, Pt};

/// Centroidal second moments by hand: a list of rectangles (x0, y0, x1, y1), summed
/// with the parallel axis theorem (Gere & Goodno, Mechanics of Materials, App. E case 1).
/// Returns (A, x̄, ȳ, Ixx, Iyy, Ixy).
fn rects(rs: &[(f64, f64, f64, f64)]) -> (f64, f64, f64, f64, f64, f64) {
    let a: f64 = rs.iter().map(|r| (r.2 - r.0) * (r.3 - r.1)).sum();
    let cx = rs
        .iter()
        .map(|r| (r.2 - r.0) * (r.3 - r.1) * (r.0 + r.2) / 2.0)
        .sum::<f64>()
        / a;
    let cy = rs
        .iter()
        .map(|r| (r.2 - r.0) * (r.3 - r.1) * (r.1 + r.3) / 2.0)
        .sum::<f64>()
        / a;
    let (mut ixx, mut iyy, mut ixy) = (0.0, 0.0, 0.0);
    for r in rs {
        let (b, h) = (r.2 - r.0, r.3 - r.1);
        let (dx, dy) = ((r.0 + r.2) / 2.0 - cx, (r.1 + r.3) / 2.0 - cy);
        ixx += b * h.powi(3) / 12.0 + b * h * dy * dy;
        iyy += h * b.powi(3) / 12.0 + b * h * dx * dx;
        ixy += b * h * dx * dy;
    }
    (a, cx, cy, ixx, iyy, ixy)
}

/// A piece for the hand side: own centroidal second moments, own shear centre (a, b)
/// and own warping constant, thin-walled.
struct Hand {
    ixx: f64,
    iyy: f64,
    ixy: f64,
    sc: Pt,
    cw: f64,
}

/// The module's formulas: the shear centre solving the two sums, then Cw there.
fn hand_pieces(ps: &[Hand]) -> (Pt, f64) {
    // Σ[(xs − a)Ixx − (ys − b)Ixy] = 0 and Σ[(ys − b)Iyy − (xs − a)Ixy] = 0:
    // [Sxx  −Sxy; −Sxy  Syy]·(xs, ys) = (Σ(a·Ixx − b·Ixy), Σ(b·Iyy − a·Ixy)).
    let sxx: f64 = ps.iter().map(|p| p.ixx).sum();
    let syy: f64 = ps.iter().map(|p| p.iyy).sum();
    let sxy: f64 = ps.iter().map(|p| p.ixy).sum();
    let r1: f64 = ps.iter().map(|p| p.sc.x * p.ixx - p.sc.y * p.ixy).sum();
    let r2: f64 = ps.iter().map(|p| p.sc.y * p.iyy - p.sc.x * p.ixy).sum();
    let det = sxx * syy - sxy * sxy;
    let xs = (r1 * syy + sxy * r2) / det;
    let ys = (sxx * r2 + sxy * r1) / det;
    let cw = ps
        .iter()
        .map(|p| {
            let (dx, dy) = (xs - p.sc.x, ys - p.sc.y);
            p.cw + dy * dy * p.iyy + dx * dx * p.ixx - 2.0 * dy * dx * p.ixy
        })
        .sum();
    (Pt::new(xs, ys), cw)
}

/// kern's pieces from rectangles (each piece the union of its rectangles, drawn as one
/// polygon by the caller).
fn piece(name: &str, pts: &[(f64, f64)]) -> Piece {
    let pts: Vec<Pt> = pts.iter().map(|&(x, y)| Pt::new(x, y)).collect();
    Piece::plain(name, vec![Contour::polygon(&pts)], false)
}

fn fe(pieces: &[Piece]) -> Torsion {
    torsion(pieces, &TorsionOptions::default()).unwrap()
}

#[track_caller]
fn close(got: f64, want: f64, rel: f64, what: &str) {
    let err = (got - want).abs() / want.abs();
    assert!(err <= rel, "{what}: got {got}, want {want} ({err:.2e})");
}

#[test]
fn two_unequal_flat_plates() {
    // Plate 1: 2 × 100 centred at (−20, 0); plate 2: 2 × 60 centred at (30, 10). A flat
    // plate's own shear centre is its centroid and its own Cw is t³h³/144 (Timoshenko &
    // Gere, Theory of Elastic Stability, narrow rectangle; tiny here).
    let t = 2.0;
    let plate = |cx: f64, cy: f64, h: f64| {
        let r = (cx - t / 2.0, cy - h / 2.0, cx + t / 2.0, cy + h / 2.0);
        let (_, _, _, ixx, iyy, ixy) = rects(&[r]);
        (
            Hand {
                ixx,
                iyy,
                ixy,
                sc: Pt::new(cx, cy),
                cw: t.powi(3) * h.powi(3) / 144.0,
            },
            piece("plate", &[(r.0, r.1), (r.2, r.1), (r.2, r.3), (r.0, r.3)]),
        )
    };
    let (h1, p1) = plate(-20.0, 0.0, 100.0);
    let (h2, p2) = plate(30.0, 10.0, 60.0);
    let (sc_hand, cw_hand) = hand_pieces(&[h1, h2]);
    let tor = fe(&[p1, p2]);
    let (sc, cw) = (tor.shear_centre, tor.cw);
    close(cw, cw_hand, 2e-3, "Cw");
    assert!((sc.x - sc_hand.x).abs() < 1e-2, "{sc:?} {sc_hand:?}");
    assert!((sc.y - sc_hand.y).abs() < 1e-1, "{sc:?} {sc_hand:?}");
}

/// An angle with legs `h` (up) and `b` (along +x when `right`, −x otherwise), thickness
/// `t`, heel at (x0, 0) on the inner edge: its rectangles, outline, and thin-walled own
/// shear centre (the legs' centre-lines meet there; Timoshenko & Gere) and own
/// Cw = t³(b'³ + h'³)/36 with centre-line leg lengths b' = b − t/2, h' = h − t/2
/// (Galambos, Guide to Stability Design Criteria, from memory; 0.20 in⁶ per angle at
/// t = 0.3125 in, 0.0036 in⁶ at t = 0.08 in).
fn angle(x0: f64, h: f64, b: f64, t: f64, right: bool) -> (Hand, Piece) {
    let s = if right { 1.0 } else { -1.0 };
    let xs = |x: f64| x0 + s * x;
    let mut rs = [(xs(0.0), 0.0, xs(t), h), (xs(t), 0.0, xs(b), t)];
    for r in &mut rs {
        if r.0 > r.2 {
            std::mem::swap(&mut r.0, &mut r.2);
        }
    }
    let (_, _, _, ixx, iyy, ixy) = rects(&rs);
    let mut pts = vec![
        (xs(0.0), 0.0),
        (xs(b), 0.0),
        (xs(b), t),
        (xs(t), t),
        (xs(t), h),
        (xs(0.0), h),
    ];
    if !right {
        pts.reverse();
    }
    let (bc, hc) = (b - t / 2.0, h - t / 2.0);
    (
        Hand {
            ixx,
            iyy,
            ixy,
            sc: Pt::new(xs(t / 2.0), t / 2.0),
            cw: t.powi(3) * (bc.powi(3) + hc.powi(3)) / 36.0,
        },
        piece("angle", &pts),
    )
}

#[test]
fn two_angles_back_to_back_converge_to_the_hand_value() {
    // The garage lintel's arrangement (6 × 3.5 in legs, vertical legs 0.375 apart, legs
    // pointing outward) without root fillets, at two thicknesses: kern's finite-element
    // field, read with the pieces' own second moments, approaches the thin-walled value
    // as the legs get thinner. (Measured when written, t = 0.3125 in: hand ys = 0.547 in,
    // Cw = 2.107 in⁶; kern 0.570 in, 2.074 in⁶ (before it used the pieces' own moments
    // it reported 1.258 in and 7.74 in⁶). t = 0.08 in: hand 0.2965, 0.2090; kern
    // 0.2980, 0.2086.)
    let gap = 0.375;
    let mut gaps = Vec::new();
    for t in [0.3125, 0.08] {
        let (hl, pl) = angle(-gap / 2.0, 6.0, 3.5, t, false);
        let (hr, pr) = angle(gap / 2.0, 6.0, 3.5, t, true);
        let (sc_hand, cw_hand) = hand_pieces(&[hl, hr]);
        let tor = fe(&[pl, pr]);
        let (sc, cw) = (tor.shear_centre, tor.cw);
        assert!(sc.x.abs() < 1e-6 && sc_hand.x.abs() < 1e-12);
        gaps.push(
            ((cw - cw_hand) / cw_hand)
                .abs()
                .max(((sc.y - sc_hand.y) / 6.0).abs()),
        );
        if t == 0.3125 {
            // The figures of the issue's hand derivation: ys ≈ 0.59 in, Cw ≈ 2.2 in⁶.
            assert!((sc_hand.y - 0.59).abs() < 0.06, "{sc_hand:?}");
            assert!((cw_hand - 2.2).abs() < 0.25, "{cw_hand}");
            // kern's own figures (measured when the pieces' own moments went in):
            // ys ≈ 0.57 in, Cw ≈ 2.07 in⁶ (the pieces are 0.375 in apart about x = 0).
            assert!((sc.y - 0.570).abs() < 0.005, "{sc:?}");
            assert!((cw - 2.074).abs() < 0.01, "{cw}");
        }
    }
    assert!(gaps[1] < 0.02, "{gaps:?}");
    assert!(gaps[1] < gaps[0], "{gaps:?}");
}

#[test]
fn two_channels_back_to_back() {
    // Channels d × b, flanges and web t thick, webs back to back with a gap g, flanges
    // pointing outward. Thin-walled (centre-line b' = b − t/2, h' = d − t): the shear
    // centre lies e = 3b'²/(6b' + h') from the web centre-line on the side away from the
    // flanges (METHODS.md; Roark), own Cw = t·b'³·h'²·(3b' + 2h')/(12(6b' + h'))
    // (Timoshenko & Gere; Galambos, from memory).
    let (d, b, t, g): (f64, f64, f64, f64) = (200.0, 75.0, 2.0, 10.0);
    let (bc, hc) = (b - t / 2.0, d - t);
    let e = 3.0 * bc * bc / (6.0 * bc + hc);
    let cw_own = t * bc.powi(3) * hc * hc * (3.0 * bc + 2.0 * hc) / (12.0 * (6.0 * bc + hc));
    let channel = |right: bool| {
        let s = if right { 1.0 } else { -1.0 };
        let x = |u: f64| s * (g / 2.0 + u);
        let fix = |r: (f64, f64, f64, f64)| (r.0.min(r.2), r.1, r.0.max(r.2), r.3);
        let rs = [
            fix((x(0.0), 0.0, x(t), d)),
            fix((x(t), 0.0, x(b), t)),
            fix((x(t), d - t, x(b), d)),
        ];
        let (_, _, _, ixx, iyy, ixy) = rects(&rs);
        let mut pts = vec![
            (x(0.0), 0.0),
            (x(b), 0.0),
            (x(b), t),
            (x(t), t),
            (x(t), d - t),
            (x(b), d - t),
            (x(b), d),
            (x(0.0), d),
        ];
        if !right {
            pts.reverse();
        }
        (
            Hand {
                ixx,
                iyy,
                ixy,
                sc: Pt::new(x(t / 2.0 - e), d / 2.0),
                cw: cw_own,
            },
            piece("channel", &pts),
        )
    };
    let (hl, pl) = channel(false);
    let (hr, pr) = channel(true);
    let (sc_hand, cw_hand) = hand_pieces(&[hl, hr]);
    let tor = fe(&[pl, pr]);
    let (sc, cw) = (tor.shear_centre, tor.cw);
    close(cw, cw_hand, 2e-2, "Cw");
    assert!((sc.y - sc_hand.y).abs() < 1e-3 * d && sc.x.abs() < 1e-6 * d);
}
