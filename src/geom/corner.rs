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
use super::region::Piece;
use super::simple::winding;

/// Probes on the circle about the point.
const PROBES: usize = 72;

/// Radius of the probe circle, relative to the larger side of the section's box: far
/// below any fillet a drawing means, far above rounding in placed coordinates.
const RADIUS: f64 = 1e-6;

/// Greatest angle between the chords that stand in for an arc in the probe (fine, so
/// that a point on a fillet does not look like a corner of its facets).
const FACET: f64 = 0.01;

/// Interior angle above which a corner counts as re-entrant: a half turn and a margin
/// (200°), so a boundary point on a straight edge or a fillet's facets never does.
const REENTRANT_SHARE: f64 = 200.0 / 360.0;

/// Is `p` on the boundary of the material of `pieces` (solids less voids) at a sharp
/// re-entrant corner?
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
    let r = RADIUS * (b[1] - b[0]).max(b[3] - b[2]);
    if !(r.is_finite() && r > 0.0) {
        return false;
    }
    let loops: Vec<(f64, Vec<Vec<Pt>>)> = pieces
        .iter()
        .map(|q| {
            (
                q.sign(),
                q.contours.iter().map(|c| c.facets(FACET)).collect(),
            )
        })
        .collect();
    let inside = (0..PROBES)
        .filter(|&k| {
            let t = std::f64::consts::TAU * (k as f64 + 0.5) / PROBES as f64;
            let at = Pt::new(p.x + r * t.cos(), p.y + r * t.sin());
            let cover: f64 = (loops.iter())
                .filter(|(_, l)| winding(l, at) != 0)
                .map(|(s, _)| s)
                .sum();
            cover > 0.5
        })
        .count();
    inside < PROBES && inside as f64 > REENTRANT_SHARE * PROBES as f64
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
