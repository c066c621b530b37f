//! Third area moments `∫x³ dA`, `∫x²y dA`, `∫xy² dA`, `∫y³ dA` of a region bounded by
//! straight edges and circular arcs, for the monosymmetry constants of
//! lateral-torsional buckling.
//!
//! By Green's theorem, for a counter-clockwise boundary,
//! `∫ xᵖ yᑫ dA = 1/(p+q+2) ∮ xᵖ yᑫ (x dy − y dx)`, here with `p + q = 3`. On a straight
//! edge from `(x₀, y₀)` to `(x₁, y₁)`, `x dy − y dx = c ds` with `c = x₀y₁ − x₁y₀` and
//! `s ∈ [0, 1]`, and a product of three linear functions integrates exactly by
//! `∫₀¹ (1−s)ⁱ sʲ ds = i! j!/(i+j+1)!`:
//!
//! ```text
//! ∫ f g h ds = (f₀g₀h₀ + f₁g₁h₁)/4 + (f₀g₀h₁ + f₀g₁h₀ + f₁g₀h₀ + f₀g₁h₁ + f₁g₀h₁ + f₁g₁h₀)/12
//! ∫x³ dA += c(x₀³ + x₀²x₁ + x₀x₁² + x₁³)/20        (the other three alike)
//! ```
//!
//! (Steger, "On the calculation of arbitrary moments of polygons", 1996, gives the
//! general polygon sum.) On an arc the integrand is a trigonometric polynomial of degree
//! 4 in the arc angle, integrated exactly by [`crate::geom::trig`]. The moments are about the
//! origin and add part by part with sign (void −1) and modular ratio, like
//! [`super::Moments`]; [`Cubic::central`] carries them to the centroid by the binomial
//! expansion of `(x − x̄)ⁱ(y − ȳ)ʲ`.

use crate::geom::moments::{ArcTerms, Moments};
use crate::geom::trig::TrigPoly;
use crate::geom::{BoundaryIntegral, Seg};

/// Third area moments: `xxx = ∫x³ dA`, `xxy = ∫x²y dA`, `xyy = ∫xy² dA`, `yyy = ∫y³ dA`
/// (about the origin, or about the centroid after [`Cubic::central`]).
///
/// ```
/// use kern::geom::{BoundaryIntegral, Contour};
/// use kern::props::cubic::Cubic;
/// // A 2 × 3 rectangle with a corner at the origin: ∫y³ dA = b·h⁴/4 = 40.5.
/// let c = Cubic::of_contour(&Contour::rounded_rect(0.0, 0.0, 2.0, 3.0, 0.0));
/// assert!((c.yyy - 40.5).abs() < 1e-12);
/// ```
#[derive(Debug, Clone, Copy, PartialEq, Default)]
pub struct Cubic {
    pub xxx: f64,
    pub xxy: f64,
    pub xyy: f64,
    pub yyy: f64,
}

/// `∫₀¹ f g h ds` for three functions linear in s, given by their end values.
fn triple(f: (f64, f64), g: (f64, f64), h: (f64, f64)) -> f64 {
    (f.0 * g.0 * h.0 + f.1 * g.1 * h.1) / 4.0
        + (f.0 * g.0 * h.1
            + f.0 * g.1 * h.0
            + f.1 * g.0 * h.0
            + f.0 * g.1 * h.1
            + f.1 * g.0 * h.1
            + f.1 * g.1 * h.0)
            / 12.0
}

impl BoundaryIntegral for Cubic {
    /// The share of one boundary segment of the closed-contour integral.
    fn of_seg(s: &Seg) -> Cubic {
        match *s {
            Seg::Line(p, q) => {
                let k = p.cross(q) / 5.0;
                let (x, y) = ((p.x, q.x), (p.y, q.y));
                Cubic {
                    xxx: k * triple(x, x, x),
                    xxy: k * triple(x, x, y),
                    xyy: k * triple(x, y, y),
                    yyy: k * triple(y, y, y),
                }
            }
            Seg::Arc { c, r, a0, a1 } => Cubic::of_arc(&ArcTerms::new(c, r, a0, a1)),
        }
    }

    /// `self + w·o`: the composite sum with weight `w` (−1 for a void, the modular
    /// ratio for another material).
    fn plus(&self, o: &Cubic, w: f64) -> Cubic {
        Cubic {
            xxx: self.xxx + w * o.xxx,
            xxy: self.xxy + w * o.xxy,
            xyy: self.xyy + w * o.xyy,
            yyy: self.yyy + w * o.yyy,
        }
    }
}

/// The second and the third moments together: over an arc, the polynomials and
/// integrals both are built from ([`ArcTerms`]) are formed once; the same sums as each
/// alone.
impl BoundaryIntegral for (Moments, Cubic) {
    fn of_seg(s: &Seg) -> (Moments, Cubic) {
        of_seg_keeping(s, |_| {})
    }

    fn plus(&self, o: &(Moments, Cubic), w: f64) -> (Moments, Cubic) {
        (self.0.plus(&o.0, w), self.1.plus(&o.1, w))
    }
}

/// The share of `s` in `<(Moments, Cubic)>::of_seg`, an arc's terms passed to `keep`.
pub fn of_seg_keeping(s: &Seg, mut keep: impl FnMut(&ArcTerms)) -> (Moments, Cubic) {
    match *s {
        Seg::Line(..) => (Moments::of_seg(s), Cubic::of_seg(s)),
        Seg::Arc { c, r, a0, a1 } => {
            let t = ArcTerms::new(c, r, a0, a1);
            keep(&t);
            (Moments::of_arc(&t), Cubic::of_arc(&t))
        }
    }
}

impl Cubic {
    /// Over an arc: `∮x³w/5`, `∮x²y·w/5`, `∮xy²w/5`, `∮y³w/5`.
    pub fn of_arc(t: &ArcTerms) -> Cubic {
        let int = |p: TrigPoly| p.integral(&t.m) / 5.0;
        let xx = t.x.mul(&t.x);
        Cubic {
            xxx: int(xx.mul(&t.xw)),
            xxy: int(xx.mul(&t.yw)),
            xyy: int(t.x.mul(&t.y).mul(&t.yw)),
            yyy: int(t.y.mul(&t.y).mul(&t.yw)),
        }
    }

    /// About the centroid of `m` (the lower moments of the same region, same origin):
    /// `∫X³ = ∫x³ − 3x̄∫x² + 3x̄²∫x − x̄³A` with `X = x − x̄`, and alike for the mixed
    /// ones. `None` when the area is not positive.
    pub fn central(&self, m: &Moments) -> Option<Cubic> {
        let c = m.centroid()?;
        let (a, b) = (c.x, c.y);
        // ∫(x−a)²(y−b) = ∫x²y − b∫x² − 2a∫xy + 2ab∫x + a²∫y − a²bA, and so on.
        let xxx = self.xxx - 3.0 * a * m.iyy + 3.0 * a * a * m.sx - a.powi(3) * m.a;
        let yyy = self.yyy - 3.0 * b * m.ixx + 3.0 * b * b * m.sy - b.powi(3) * m.a;
        let xxy = self.xxy - b * m.iyy - 2.0 * a * m.ixy + 2.0 * a * b * m.sx + a * a * m.sy
            - a * a * b * m.a;
        let xyy = self.xyy - a * m.ixx - 2.0 * b * m.ixy + 2.0 * a * b * m.sy + b * b * m.sx
            - a * b * b * m.a;
        Some(Cubic { xxx, xxy, xyy, yyy })
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::geom::{Contour, Pt};
    use std::f64::consts::PI;

    fn close(a: f64, b: f64, tol: f64, scale: f64) -> bool {
        (a - b).abs() <= tol * scale
    }

    /// Raw cubic moments of the region by direct integration of monomials over a
    /// rectangle [x0, x1] × [y0, y1]: ∫xⁱ dx = (x1ⁱ⁺¹ − x0ⁱ⁺¹)/(i+1).
    fn rect_closed_form(x0: f64, y0: f64, x1: f64, y1: f64) -> Cubic {
        let p = |i: i32, lo: f64, hi: f64| (hi.powi(i + 1) - lo.powi(i + 1)) / (i + 1) as f64;
        Cubic {
            xxx: p(3, x0, x1) * p(0, y0, y1),
            xxy: p(2, x0, x1) * p(1, y0, y1),
            xyy: p(1, x0, x1) * p(2, y0, y1),
            yyy: p(0, x0, x1) * p(3, y0, y1),
        }
    }

    #[test]
    fn rectangle_about_an_offset_origin() {
        // Separable integrals over a rectangle (Fubini), derived above.
        let (x0, y0, x1, y1) = (-3.0, 1.5, 7.0, 4.0);
        let c = Cubic::of_contour(&Contour::rounded_rect(x0, y0, x1, y1, 0.0));
        let r = rect_closed_form(x0, y0, x1, y1);
        for (a, b) in [
            (c.xxx, r.xxx),
            (c.xxy, r.xxy),
            (c.xyy, r.xyy),
            (c.yyy, r.yyy),
        ] {
            assert!(close(a, b, 1e-13, 1e3), "{a} {b}");
        }
        // About its centroid a rectangle is symmetric both ways: all four vanish.
        let m = Moments::of_contour(&Contour::rounded_rect(x0, y0, x1, y1, 0.0));
        let k = c.central(&m).unwrap();
        for v in [k.xxx, k.xxy, k.xyy, k.yyy] {
            assert!(v.abs() < 1e-11, "{v}");
        }
    }

    #[test]
    fn triangle_about_its_centroid() {
        // Right triangle (0,0), (b,0), (0,h), centroid (b/3, h/3), X = x − b/3, Y = y − h/3;
        // derived by direct integration over the triangle: ∫∫ x³ dA = ∫₀ᵇ x³·h(1 − x/b) dx = h·b⁴/20; ∫x² = h·b³/12; ∫x = h·b²/6; A = bh/2.
        // Then ∫X³ = hb⁴/20 − 3(b/3)(hb³/12) + 3(b/3)²(hb²/6) − (b/3)³(bh/2) = hb⁴/270.
        // ∫X²Y: ∫∫x²y dA = ∫₀ᵇ x²·h²(1 − x/b)²/2 dx = h²b³/60; ∫x² = hb³/12; ∫xy = b²h²/24;
        // ∫x = hb²/6; ∫y = bh²/6: ∫X²Y = h²b³/60 − (h/3)(hb³/12) − 2(b/3)(b²h²/24)
        // + 2(b/3)(h/3)(hb²/6) + (b/3)²(bh²/6) − (b/3)²(h/3)(bh/2) = −b³h²/540.
        let (b, h) = (6.0, 4.0);
        let t = Contour::polygon(&[Pt::new(0.0, 0.0), Pt::new(b, 0.0), Pt::new(0.0, h)]);
        let c = Cubic::of_contour(&t)
            .central(&Moments::of_contour(&t))
            .unwrap();
        assert!(close(c.xxx, h * b.powi(4) / 270.0, 1e-13, 1e2));
        assert!(close(c.yyy, b * h.powi(4) / 270.0, 1e-13, 1e2));
        assert!(close(c.xxy, -b.powi(3) * h * h / 540.0, 1e-13, 1e2));
        assert!(close(c.xyy, -b * b * h.powi(3) / 540.0, 1e-13, 1e2));
    }

    #[test]
    fn circle_and_half_circle_about_an_offset_origin() {
        // Full circle of radius r at (a, b): about its centre every odd moment vanishes, so
        // ∫x³ = a³A + 3a·(πr⁴/4), ∫x²y = b(a²A + πr⁴/4), ∫xy² = a(b²A + πr⁴/4),
        // ∫y³ = b³A + 3b·(πr⁴/4) (binomial expansion; Gere & Goodno, Appendix E, case 9
        // for πr⁴/4).
        let (r, a, b) = (2.5, 3.0, -7.0);
        let area = PI * r * r;
        let i0 = PI * r.powi(4) / 4.0;
        let c = Cubic::of_contour(&Contour::circle(Pt::new(a, b), r));
        assert!(close(c.xxx, a.powi(3) * area + 3.0 * a * i0, 1e-13, 1e4));
        assert!(close(c.xxy, b * (a * a * area + i0), 1e-13, 1e4));
        assert!(close(c.xyy, a * (b * b * area + i0), 1e-13, 1e4));
        assert!(close(c.yyy, b.powi(3) * area + 3.0 * b * i0, 1e-13, 1e4));
        // Half circle, flat side on the x axis, centre at the origin: in polar coordinates
        // ∫y³ dA = ∫₀^π sin³θ dθ ∫₀^r ρ⁴ dρ = (4/3)(r⁵/5) = 4r⁵/15, ∫x²y dA =
        // ∫₀^π cos²θ sinθ dθ · r⁵/5 = (2/3)(r⁵/5) = 2r⁵/15, and ∫x³ = ∫xy² = 0 by symmetry.
        let half = Contour {
            segs: vec![
                Seg::arc(Pt::new(0.0, 0.0), r, 0.0, PI),
                Seg::Line(Pt::new(-r, 0.0), Pt::new(r, 0.0)),
            ],
        };
        let c = Cubic::of_contour(&half);
        assert!(close(c.yyy, 4.0 * r.powi(5) / 15.0, 1e-13, 1e2));
        assert!(close(c.xxy, 2.0 * r.powi(5) / 15.0, 1e-13, 1e2));
        assert!(c.xxx.abs() < 1e-12 && c.xyy.abs() < 1e-12);
    }

    #[test]
    fn arc_against_a_fine_polygon() {
        // Independent check: the same quarter-disc as a polygon of 20 000 chords; the chord
        // error in a moment of order 3 is O(n⁻²) (about 1e-8 relative here).
        let (c0, r) = (Pt::new(1.2, 0.7), 3.0);
        let exact = Cubic::of_contour(&Contour {
            segs: vec![
                Seg::Line(c0, Pt::new(c0.x + r, c0.y)),
                Seg::arc(c0, r, 0.0, PI / 2.0),
                Seg::Line(Pt::new(c0.x, c0.y + r), c0),
            ],
        });
        let n = 20_000;
        let mut pts = vec![c0];
        pts.extend((0..=n).map(|k| {
            let t = PI / 2.0 * k as f64 / n as f64;
            Pt::new(c0.x + r * t.cos(), c0.y + r * t.sin())
        }));
        let poly = Cubic::of_contour(&Contour::polygon(&pts));
        for (a, b) in [
            (exact.xxx, poly.xxx),
            (exact.xxy, poly.xxy),
            (exact.xyy, poly.xyy),
            (exact.yyy, poly.yyy),
        ] {
            assert!((a - b).abs() < 1e-7 * a.abs(), "{a} {b}");
        }
    }

    #[test]
    fn a_void_cancels_its_solid() {
        let solid = Contour::circle(Pt::new(3.0, 4.0), 2.0);
        let m = Cubic::of_contour(&solid).plus(&Cubic::of_contour(&solid.reversed()), 1.0);
        assert!(m.xxx.abs() < 1e-11 && m.yyy.abs() < 1e-11 && m.xxy.abs() < 1e-11);
    }
}
