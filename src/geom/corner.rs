//! Sharp re-entrant corners: points of the section's boundary where the material turns
//! through more than a half turn (the inside corner where a web meets a flange, the
//! inner corner of an angle).
//!
//! At such a corner of interior angle α > π the elastic stresses of the Saint-Venant
//! torsion and flexure problems grow like r^(π/α − 1) as the distance r from the
//! corner goes to zero (Williams, "Stress singularities resulting from various boundary
//! conditions in angular corners of plates in extension", J. Appl. Mech. 1952; for
//! α = 3π/2, r^(−1/3)): the peak stress there is unbounded and a finer mesh only gives a
//! larger figure. A fillet of any radius removes the singularity.
//!
//! The test probes a small circle about the point: the share of it that lies in
//! material is the interior angle over a full turn.

use super::contour::Pt;
use super::region::{Cover, Piece};

/// Probes on the circle about a corner.
const PROBES: usize = 72;

/// Radius of the probe circle, relative to the larger side of the section's box: far
/// below any fillet a drawing means, far above rounding in placed coordinates.
const RADIUS: f64 = 1e-6;

/// How near a corner a point must be to count as at it, relative to the larger side of
/// the section's box (the meshes are graded towards such corners, so the largest
/// recovered stress is at the corner's node or one beside it).
const NEAR: f64 = 1e-3;

/// Greatest angle between the chords that stand in for an arc in the probe (fine, so
/// that the point where a fillet meets a straight edge does not look like a corner).
const FACET: f64 = 0.01;

/// Interior angle above which a corner counts as re-entrant: a half turn and a margin
/// (200°), so a boundary point on a straight edge or where a fillet meets one never does.
const REENTRANT_SHARE: f64 = 200.0 / 360.0;

/// Is `p` at (or within [`NEAR`] of) a sharp re-entrant corner of the material of
/// `pieces` (solids less voids)? The corners looked at are the ends of the pieces'
/// boundary segments (exact lines and arcs), so a fillet's own ends, where it meets
/// the straight edges tangentially, are not sharp.
///
/// ```
/// use kern::geom::{corner::is_reentrant, Contour, Piece, Pt};
/// // An L of two rectangles: the inside corner (10, 10) is re-entrant (270°), the outer
/// // corner (0, 0) is not (90°).
/// let rect = |x0, y0, x1, y1| Piece::plain("p", vec![Contour::rounded_rect(x0, y0, x1, y1, 0.0)], false);
/// let l = [rect(0.0, 0.0, 100.0, 10.0), rect(0.0, 10.0, 10.0, 100.0)];
/// assert!(is_reentrant(&l, Pt::new(10.0, 10.0)));
/// assert!(!is_reentrant(&l, Pt::new(0.0, 0.0)));
/// ```
pub fn is_reentrant(pieces: &[Piece], p: Pt) -> bool {
    let Some(b) = super::solid_bounds(pieces) else {
        return false;
    };
    let size = (b[1] - b[0]).max(b[3] - b[2]);
    let r = RADIUS * size;
    if !(r.is_finite() && r > 0.0 && p.x.is_finite() && p.y.is_finite()) {
        return false;
    }
    let cover = Cover::new(pieces, FACET);
    let sharp = |v: Pt| {
        let inside = (0..PROBES)
            .filter(|&k| {
                let t = std::f64::consts::TAU * (k as f64 + 0.5) / PROBES as f64;
                cover.contains(Pt::new(v.x + r * t.cos(), v.y + r * t.sin()))
            })
            .count();
        inside < PROBES && inside as f64 > REENTRANT_SHARE * PROBES as f64
    };
    (pieces.iter())
        .flat_map(|q| q.contours.iter().flat_map(|c| &c.segs))
        .map(|s| s.start())
        .filter(|v| v.dist(p) <= NEAR * size)
        .any(sharp)
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::geom::Contour;

    fn rect(x0: f64, y0: f64, x1: f64, y1: f64, r: f64) -> Piece {
        Piece::plain("p", vec![Contour::rounded_rect(x0, y0, x1, y1, r)], false)
    }

    #[test]
    fn the_inside_corner_of_a_tee_is_reentrant_and_its_edges_are_not() {
        // A flange 100 × 10 on a web 10 × 50 (our own tee): the web meets the flange's
        // underside at x = ±5 (interior angle 270°, by construction).
        let tee = [
            rect(-5.0, 0.0, 5.0, 50.0, 0.0),
            rect(-50.0, 50.0, 50.0, 60.0, 0.0),
        ];
        assert!(is_reentrant(&tee, Pt::new(5.0, 50.0)));
        assert!(is_reentrant(&tee, Pt::new(-5.0, 50.0)));
        for p in [
            (20.0, 50.0),
            (5.0, 20.0),
            (50.0, 60.0),
            (0.0, 55.0),
            (0.0, 0.0),
        ] {
            assert!(!is_reentrant(&tee, Pt::new(p.0, p.1)), "{p:?}");
        }
    }

    #[test]
    fn fillets_make_no_corner_and_a_point_beside_a_sharp_one_counts() {
        // A rolled I's root fillets (r = 15 mm) meet web and flange tangentially: no
        // sharp corner anywhere on them. A point 0.1 mm from the tee's inside corner
        // (0.1 mm < 1e-3 of its 100 mm size) is at that corner.
        let i = crate::geom::Shape::IBeam {
            d: 300.0,
            b: 150.0,
            tf: 10.7,
            tw: 7.1,
            r: 15.0,
        };
        let p = [Piece::plain("i", i.contours(), false)];
        let mut arcs = 0;
        for s in p[0].contours.iter().flat_map(|c| &c.segs) {
            if let crate::geom::Seg::Arc { c, r, a0, a1 } = *s {
                arcs += 1;
                let mid = 0.5 * (a0 + a1);
                let m = Pt::new(c.x + r * mid.cos(), c.y + r * mid.sin());
                for q in [s.start(), s.end(), m] {
                    assert!(!is_reentrant(&p, q), "{q:?}");
                }
            }
        }
        assert_eq!(arcs, 4);
        let tee = [
            rect(-5.0, 0.0, 5.0, 50.0, 0.0),
            rect(-50.0, 50.0, 50.0, 60.0, 0.0),
        ];
        assert!(is_reentrant(&tee, Pt::new(5.05, 49.95)));
        assert!(!is_reentrant(&tee, Pt::new(5.5, 49.0)));
    }

    #[test]
    fn a_hole_makes_no_corner_on_a_round_edge() {
        // A round hole's edge is smooth (interior angle 180° at every point of it).
        let hole = Piece::plain("h", vec![Contour::circle(Pt::new(0.0, 0.0), 5.0)], true);
        let plate = [rect(-20.0, -20.0, 20.0, 20.0, 0.0), hole];
        assert!(!is_reentrant(&plate, Pt::new(5.0, 0.0)));
        // The corner of a square hole is re-entrant for the plate around it (270°).
        let sq = Piece::plain(
            "s",
            vec![Contour::rounded_rect(-5.0, -5.0, 5.0, 5.0, 0.0)],
            true,
        );
        let plate = [rect(-20.0, -20.0, 20.0, 20.0, 0.0), sq];
        assert!(is_reentrant(&plate, Pt::new(5.0, 5.0)));
    }
}
