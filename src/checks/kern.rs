//! The kern (core) of a section: where a compressive axial load may act without putting any
//! fibre in tension.
//!
//! With a compressive load P at e (measured from the centroid) the stress is
//! `σ(r) = −(P/A)·(1 + A·eᵀM⁻¹r)`, `M = ∫r rᵀ dA = [[Iyy, Ixy], [Ixy, Ixx]]`, which follows from
//! the generalised flexure formula in [`super::stress`] with `N = −P`, `Mx = P·e_y`,
//! `My = P·e_x` (a load on the +y side compresses the +y fibres). No tension at a hull vertex r_i means `1 + A·eᵀM⁻¹r_i ≥ 0`, one half-plane
//! in e per vertex; the kern is their intersection (Gere & Goodno, Mechanics of Materials,
//! "core of a section").

use super::stress::{convex_hull, det, Centroidal};

/// The kern: points e where an axial compressive load causes no tension anywhere, as a
/// counter-clockwise convex polygon in the file frame.
///
/// The boundary lines of the half-planes belong to the hull's vertices, and adjacent lines
/// meet at the pole of the hull edge between them: for the edge line `n·r = d` (outward
/// normal n, r from the centroid, d > 0) the pole is `e = −M·n/(A·d)`, the load position whose
/// neutral axis is that edge. Since M is positive definite the poles turn the same way as the
/// edges, so the kern's vertices are the poles of the hull's edges in hull order.
///
/// `hull` may be any point set of the section's outline; its convex hull is taken here.
/// Empty when the section data is not usable (area ≤ 0, `D ≤ 0`, fewer than three hull
/// vertices) or the centroid is not strictly inside the hull, where no kern exists.
///
/// ```
/// use kern::checks::{kern::kern_polygon, stress::Centroidal};
/// // 60 × 120 rectangle centred on the origin: a rhombus with half-diagonals b/6 and h/6.
/// let (b, h) = (60.0_f64, 120.0_f64);
/// let sec = Centroidal { area: b * h, cx: 0.0, cy: 0.0,
///                        ixx: b * h.powi(3) / 12.0, iyy: h * b.powi(3) / 12.0, ixy: 0.0 };
/// let hull = [(-30.0, -60.0), (30.0, -60.0), (30.0, 60.0), (-30.0, 60.0)];
/// let kern = kern_polygon(&sec, &hull);
/// assert_eq!(kern.len(), 4);
/// assert!(kern.iter().any(|&(x, y)| (x - 10.0).abs() < 1e-12 && y.abs() < 1e-12));
/// assert!(kern.iter().any(|&(x, y)| x.abs() < 1e-12 && (y - 20.0).abs() < 1e-12));
/// ```
pub fn kern_polygon(sec: &Centroidal, hull: &[(f64, f64)]) -> Vec<(f64, f64)> {
    let d = det(sec);
    if !(sec.area > 0.0 && d > 0.0 && sec.cx.is_finite() && sec.cy.is_finite()) {
        return Vec::new();
    }
    let hull = convex_hull(hull);
    let mut kern = Vec::with_capacity(hull.len());
    for (i, &p) in hull.iter().enumerate() {
        let Some(&q) = hull.get((i + 1) % hull.len()) else {
            return Vec::new();
        };
        // Outward normal of a counter-clockwise edge p → q, and its distance measure.
        let n = (q.1 - p.1, p.0 - q.0);
        let dist = n.0 * (p.0 - sec.cx) + n.1 * (p.1 - sec.cy);
        if dist.is_nan() || dist <= 0.0 {
            return Vec::new();
        }
        let mn = (sec.iyy * n.0 + sec.ixy * n.1, sec.ixy * n.0 + sec.ixx * n.1);
        let scale = sec.area * dist;
        kern.push((sec.cx - mn.0 / scale, sec.cy - mn.1 / scale));
    }
    if kern.len() < 3 || !kern.iter().all(|p| p.0.is_finite() && p.1.is_finite()) {
        return Vec::new();
    }
    kern
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::checks::stress::test_support::{polygon_centroidal, rectangle};
    use crate::checks::stress::{Actions, StressField};

    /// The defining property, checked directly with the flexure formula: a compressive load at
    /// each kern vertex leaves every hull vertex at σ ≤ 0 with at least two of them at σ = 0,
    /// and a load a little beyond the vertex puts some fibre in tension.
    fn assert_is_kern(sec: &Centroidal, hull: &[(f64, f64)], kern: &[(f64, f64)]) {
        let p = 1e5;
        let scale = hull
            .iter()
            .map(|v| v.0.abs().max(v.1.abs()))
            .fold(0.0, f64::max);
        let stress = |e: (f64, f64), v: (f64, f64)| {
            let act = Actions {
                n: -p,
                mx: p * (e.1 - sec.cy),
                my: p * (e.0 - sec.cx),
                ..Default::default()
            };
            StressField::new(sec, &act, 1.0).unwrap().at(v.0, v.1)
        };
        let tol = 1e-9 * p / sec.area;
        for &e in kern {
            let sig: Vec<f64> = hull.iter().map(|&v| stress(e, v)).collect();
            assert!(sig.iter().all(|&s| s <= tol), "tension with load at {e:?}");
            assert!(sig.iter().filter(|s| s.abs() <= tol).count() >= 2);
            let beyond = (
                sec.cx + 1.001 * (e.0 - sec.cx),
                sec.cy + 1.001 * (e.1 - sec.cy),
            );
            assert!(hull.iter().any(|&v| stress(beyond, v) > tol));
            assert!(e.0.abs() <= 2.0 * scale && e.1.abs() <= 2.0 * scale);
        }
        assert!(
            polygon_centroidal(kern).area > 0.0,
            "kern must be counter-clockwise"
        );
    }

    fn has_point(poly: &[(f64, f64)], p: (f64, f64), tol: f64) -> bool {
        poly.iter()
            .any(|q| (q.0 - p.0).abs() <= tol && (q.1 - p.1).abs() <= tol)
    }

    #[test]
    fn rectangle_middle_third_rule() {
        // Rectangle b × h: a rhombus with half-diagonals b/6 and h/6 (the middle-third rule;
        // Gere & Goodno, Mechanics of Materials, "core of a section").
        let (b, h, cx, cy) = (250.0, 400.0, 30.0, -70.0);
        let hull = rectangle(b, h, cx, cy, 0.0);
        let sec = polygon_centroidal(&hull);
        let kern = kern_polygon(&sec, &hull);
        assert_eq!(kern.len(), 4);
        for p in [
            (cx + b / 6.0, cy),
            (cx - b / 6.0, cy),
            (cx, cy + h / 6.0),
            (cx, cy - h / 6.0),
        ] {
            assert!(has_point(&kern, p, 1e-9 * h), "missing {p:?} in {kern:?}");
        }
        assert_is_kern(&sec, &hull, &kern);
    }

    #[test]
    fn rotated_rectangle_gives_rotated_rhombus() {
        // The kern is a property of the shape, so it turns with it (middle-third rule in the
        // rectangle's own axes, Gere & Goodno, "core of a section").
        let (b, h, deg) = (180.0, 420.0, 35.0_f64);
        let hull = rectangle(b, h, 10.0, 20.0, deg);
        let sec = polygon_centroidal(&hull);
        let kern = kern_polygon(&sec, &hull);
        assert_eq!(kern.len(), 4);
        let (s, c) = deg.to_radians().sin_cos();
        for (u, v) in [
            (b / 6.0, 0.0),
            (-b / 6.0, 0.0),
            (0.0, h / 6.0),
            (0.0, -h / 6.0),
        ] {
            let p = (10.0 + u * c - v * s, 20.0 + u * s + v * c);
            assert!(has_point(&kern, p, 1e-9 * h), "missing {p:?} in {kern:?}");
        }
        assert_is_kern(&sec, &hull, &kern);
    }

    #[test]
    fn solid_circle_has_kern_of_radius_d_over_8() {
        // Solid circle of diameter d: a circle of radius d/8 (Gere & Goodno, "core of a
        // section"). The hull is a fine inscribed polygon; the section data are the exact
        // circle's, A = πd²/4, I = πd⁴/64.
        let d = 500.0;
        let n = 3600;
        let hull: Vec<(f64, f64)> = (0..n)
            .map(|k| {
                let t = std::f64::consts::TAU * k as f64 / n as f64;
                (d / 2.0 * t.cos(), d / 2.0 * t.sin())
            })
            .collect();
        let i = std::f64::consts::PI * d.powi(4) / 64.0;
        let sec = Centroidal {
            area: std::f64::consts::PI * d * d / 4.0,
            cx: 0.0,
            cy: 0.0,
            ixx: i,
            iyy: i,
            ixy: 0.0,
        };
        let kern = kern_polygon(&sec, &hull);
        assert_eq!(kern.len(), n);
        // Edges of the inscribed polygon sit at (d/2)·cos(π/n) from the centre.
        for (x, y) in kern {
            let r = x.hypot(y);
            assert!((r / (d / 8.0) - 1.0).abs() < 1e-6, "r = {r}");
        }
    }

    #[test]
    fn triangle_kern_is_the_quarter_scale_triangle() {
        // A triangle's kern is the triangle itself scaled by 1/4 about its centroid (from
        // memory; confirmed here by the defining property as well).
        let tri = [(0.0, 0.0), (300.0, 0.0), (80.0, 240.0)];
        let sec = polygon_centroidal(&tri);
        let kern = kern_polygon(&sec, &tri);
        assert_eq!(kern.len(), 3);
        for (x, y) in tri {
            let p = (sec.cx + (x - sec.cx) / 4.0, sec.cy + (y - sec.cy) / 4.0);
            assert!(has_point(&kern, p, 1e-9), "missing {p:?} in {kern:?}");
        }
        assert_is_kern(&sec, &tri, &kern);
    }

    #[test]
    fn unsymmetric_angle_satisfies_the_definition() {
        // Unequal-leg angle (our own dimensions; Ixy ≠ 0, centroid near the re-entrant corner):
        // only the defining property applies.
        let angle = [
            (0.0, 0.0),
            (120.0, 0.0),
            (120.0, 10.0),
            (10.0, 10.0),
            (10.0, 200.0),
            (0.0, 200.0),
        ];
        let sec = polygon_centroidal(&angle);
        let hull = convex_hull(&angle);
        let kern = kern_polygon(&sec, &angle);
        assert_eq!(kern.len(), hull.len());
        assert_is_kern(&sec, &hull, &kern);
    }

    #[test]
    fn unusable_input_gives_no_kern() {
        let hull = rectangle(100.0, 100.0, 0.0, 0.0, 0.0);
        let sec = polygon_centroidal(&hull);
        assert!(kern_polygon(&sec, &hull[..2]).is_empty());
        assert!(kern_polygon(&Centroidal { area: -1.0, ..sec }, &hull).is_empty());
        assert!(kern_polygon(&Centroidal { ixy: 1e12, ..sec }, &hull).is_empty());
        // Centroid outside the hull (possible with voids that stick out).
        assert!(kern_polygon(&Centroidal { cx: 500.0, ..sec }, &hull).is_empty());
        assert!(kern_polygon(
            &Centroidal {
                cy: f64::NAN,
                ..sec
            },
            &hull
        )
        .is_empty());
    }
}
