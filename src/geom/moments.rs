//! Additive area moments of a region bounded by straight edges and circular arcs.
//!
//! By Green's theorem, for a counter-clockwise boundary,
//! `∫ xᵖ yᑫ dA = 1/(p+q+2) ∮ xᵖ yᑫ (x dy − y dx)`. Over a straight edge from
//! `(x₀, y₀)` to `(x₁, y₁)` this gives the polygon sums (Steger, "On the calculation of
//! arbitrary moments of polygons", 1996), with `c = x₀y₁ − x₁y₀`:
//!
//! ```text
//! A    += c/2              ∫x dA  += (x₀ + x₁)c/6          ∫y dA += (y₀ + y₁)c/6
//! ∫x² dA += (x₀² + x₀x₁ + x₁²)c/12                       ∫y² dA += (y₀² + y₀y₁ + y₁²)c/12
//! ∫xy dA += (2x₀y₀ + x₀y₁ + x₁y₀ + 2x₁y₁)c/24
//! ```
//!
//! Over an arc the same integrand is a trigonometric polynomial in the arc angle and
//! is integrated exactly ([`super::trig`]). The moments are about the origin and add
//! up part by part; [`Moments::centroidal`] applies the parallel axis theorem,
//! `I_c = I_o − A·d²`.

use super::trig::{Angle, Monomials, TrigPoly};
use super::{Contour, Pt, Seg};

/// Area moments about the origin: `a = ∫dA`, `sx = ∫x dA`, `sy = ∫y dA`,
/// `ixx = ∫y² dA`, `iyy = ∫x² dA`, `ixy = ∫xy dA`.
///
/// ```
/// use kern::geom::{BoundaryIntegral, Contour, Pt};
/// use kern::props::Moments;
/// // A 5 × 6 rectangle with a corner at the origin: A = 30, ∫y² dA = b·h³/3 = 360.
/// let r = Contour::rounded_rect(0.0, 0.0, 5.0, 6.0, 0.0);
/// let m = Moments::of_contour(&r);
/// assert_eq!(m.a, 30.0);
/// assert!((m.ixx - 360.0).abs() < 1e-12);
/// ```
#[derive(Debug, Clone, Copy, PartialEq, Default)]
pub struct Moments {
    pub a: f64,
    pub sx: f64,
    pub sy: f64,
    pub ixx: f64,
    pub iyy: f64,
    pub ixy: f64,
}

/// Area, centroid and second moments about centroidal axes parallel to x and y:
/// `ixx = ∫(y−ȳ)² dA`, `iyy = ∫(x−x̄)² dA`, `ixy = ∫(x−x̄)(y−ȳ) dA`.
#[derive(Debug, Clone, Copy, PartialEq, Default)]
pub struct Centroidal {
    pub area: f64,
    pub cx: f64,
    pub cy: f64,
    pub ixx: f64,
    pub iyy: f64,
    pub ixy: f64,
}

/// An area integral that adds up: over a closed boundary segment by segment (Green's
/// theorem, each segment's share exact), and over parts with a weight (−1 for a void,
/// the modular ratio for another material). The second moments ([`Moments`]) and the
/// third ([`crate::props::cubic::Cubic`]) are two of them.
pub trait BoundaryIntegral: Default {
    /// The share of one boundary segment of the closed-contour integral.
    fn of_seg(s: &Seg) -> Self;

    /// `self + w·o`: the composite sum with weight `w`.
    fn plus(&self, o: &Self, w: f64) -> Self;

    /// Over one closed contour.
    fn of_contour(c: &Contour) -> Self {
        summed(c.segs.iter().map(Self::of_seg))
    }

    /// Over several contours (an outline and its holes).
    fn of_contours(cs: &[Contour]) -> Self {
        Self::of_contours_by(cs, Self::of_seg)
    }

    /// [`BoundaryIntegral::of_contours`] with each segment's share from `share` (the
    /// same sums in the same order), for a caller that keeps something of each segment.
    fn of_contours_by(cs: &[Contour], mut share: impl FnMut(&Seg) -> Self) -> Self {
        summed(cs.iter().map(|c| summed(c.segs.iter().map(&mut share))))
    }
}

/// The sum of `shares` with weight 1, from zero, in their order.
fn summed<T: BoundaryIntegral>(shares: impl Iterator<Item = T>) -> T {
    shares.fold(T::default(), |s, m| s.plus(&m, 1.0))
}

/// The polynomials every moment over one arc is built from, and the integrals of the
/// monomials over it ([`Monomials`]: the sines and cosines of its two ends): formed once
/// an arc, however many moments are taken over it. On `x = cx + r cos t`,
/// `y = cy + r sin t`: `x`, `y`, the weight `w` of `x dy − y dx = w dt`, `x·w`, `y·w`.
pub struct ArcTerms {
    pub x: TrigPoly,
    pub y: TrigPoly,
    pub w: TrigPoly,
    pub xw: TrigPoly,
    pub yw: TrigPoly,
    pub m: Monomials,
    /// The end angles with their cosines and sines, from which `m` was formed.
    pub ends: [Angle; 2],
}

impl ArcTerms {
    /// The arc about `c` of radius `r` from `a0` to `a1` (radians).
    pub fn new(c: Pt, r: f64, a0: f64, a1: f64) -> ArcTerms {
        let [x, y, w] = TrigPoly::arc(c, r);
        // `Monomials::new(a0, a1)`, its angles kept.
        let ends = [Angle::new(a0), Angle::new(a1)];
        ArcTerms {
            x,
            y,
            w,
            xw: x.mul(&w),
            yw: y.mul(&w),
            m: Monomials::between(&ends[0], &ends[1]),
            ends,
        }
    }
}

/// The area and first moments alone, `a = ∫dA`, `sx = ∫x dA`, `sy = ∫y dA` (the first
/// three of [`Moments`], the same sums), for what needs no second moments.
#[derive(Debug, Clone, Copy, PartialEq, Default)]
pub struct FirstMoments {
    pub a: f64,
    pub sx: f64,
    pub sy: f64,
}

impl FirstMoments {
    /// Over the straight edge `p`–`q`: `c/2`, `(x₀ + x₁)c/6`, `(y₀ + y₁)c/6`.
    fn of_line(p: Pt, q: Pt) -> FirstMoments {
        let c = p.cross(q);
        FirstMoments {
            a: c / 2.0,
            sx: (p.x + q.x) * c / 6.0,
            sy: (p.y + q.y) * c / 6.0,
        }
    }

    /// Over an arc: `∮w/2`, `∮x·w/3`, `∮y·w/3`.
    fn of_arc(t: &ArcTerms) -> FirstMoments {
        FirstMoments {
            a: t.w.integral(&t.m) / 2.0,
            sx: t.xw.integral(&t.m) / 3.0,
            sy: t.yw.integral(&t.m) / 3.0,
        }
    }

    /// `(x̄, ȳ) = (∫x dA / A, ∫y dA / A)`; `None` when the area is not positive.
    pub fn centroid(&self) -> Option<Pt> {
        (self.a > 0.0 && self.a.is_finite()).then(|| Pt::new(self.sx / self.a, self.sy / self.a))
    }
}

impl BoundaryIntegral for FirstMoments {
    fn of_seg(s: &Seg) -> FirstMoments {
        match *s {
            Seg::Line(p, q) => FirstMoments::of_line(p, q),
            Seg::Arc { c, r, a0, a1 } => FirstMoments::of_arc(&ArcTerms::new(c, r, a0, a1)),
        }
    }

    fn plus(&self, o: &FirstMoments, w: f64) -> FirstMoments {
        FirstMoments {
            a: self.a + w * o.a,
            sx: self.sx + w * o.sx,
            sy: self.sy + w * o.sy,
        }
    }
}

impl BoundaryIntegral for Moments {
    /// Moments of the region to the left of one boundary segment (its share of the
    /// closed-contour integral).
    fn of_seg(s: &Seg) -> Moments {
        match *s {
            Seg::Line(p, q) => {
                let FirstMoments { a, sx, sy } = FirstMoments::of_line(p, q);
                let c = p.cross(q);
                Moments {
                    a,
                    sx,
                    sy,
                    ixx: (p.y * p.y + p.y * q.y + q.y * q.y) * c / 12.0,
                    iyy: (p.x * p.x + p.x * q.x + q.x * q.x) * c / 12.0,
                    ixy: (2.0 * p.x * p.y + p.x * q.y + q.x * p.y + 2.0 * q.x * q.y) * c / 24.0,
                }
            }
            Seg::Arc { c, r, a0, a1 } => Moments::of_arc(&ArcTerms::new(c, r, a0, a1)),
        }
    }

    /// `self + w·o`: the composite sum with weight `w` (−1 for a void, the modular
    /// ratio for another material).
    fn plus(&self, o: &Moments, w: f64) -> Moments {
        Moments {
            a: self.a + w * o.a,
            sx: self.sx + w * o.sx,
            sy: self.sy + w * o.sy,
            ixx: self.ixx + w * o.ixx,
            iyy: self.iyy + w * o.iyy,
            ixy: self.ixy + w * o.ixy,
        }
    }
}

impl Moments {
    /// Over an arc: the first moments of [`FirstMoments`], then `∮y²w/4`, `∮x²w/4`,
    /// `∮xyw/4`.
    pub fn of_arc(t: &ArcTerms) -> Moments {
        let FirstMoments { a, sx, sy } = FirstMoments::of_arc(t);
        Moments {
            a,
            sx,
            sy,
            ixx: t.y.mul(&t.yw).integral(&t.m) / 4.0,
            iyy: t.x.mul(&t.xw).integral(&t.m) / 4.0,
            ixy: t.x.mul(&t.yw).integral(&t.m) / 4.0,
        }
    }

    /// [`FirstMoments::centroid`] of the first three.
    pub fn centroid(&self) -> Option<Pt> {
        let (a, sx, sy) = (self.a, self.sx, self.sy);
        FirstMoments { a, sx, sy }.centroid()
    }

    /// Carried to the centroid by the parallel axis theorem; `None` when `A ≤ 0`.
    pub fn centroidal(&self) -> Option<Centroidal> {
        let c = self.centroid()?;
        Some(Centroidal {
            area: self.a,
            cx: c.x,
            cy: c.y,
            ixx: self.ixx - self.a * c.y * c.y,
            iyy: self.iyy - self.a * c.x * c.x,
            ixy: self.ixy - self.a * c.x * c.y,
        })
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use std::f64::consts::PI;

    fn close(a: f64, b: f64, tol: f64) -> bool {
        (a - b).abs() <= tol * b.abs().max(1e-300)
    }

    #[test]
    fn rectangle_about_its_base_and_centroid() {
        // b·h³/3 about the base, b·h³/12 about the centroid (any mechanics of materials
        // text, e.g. Gere & Goodno, Mechanics of Materials, Appendix E, case 1).
        let (b, h) = (120.0, 300.0);
        let m = Moments::of_contour(&Contour::rounded_rect(0.0, 0.0, b, h, 0.0));
        assert!(close(m.ixx, b * h.powi(3) / 3.0, 1e-14));
        let c = m.centroidal().unwrap();
        assert!(close(c.ixx, b * h.powi(3) / 12.0, 1e-13));
        assert!(close(c.iyy, h * b.powi(3) / 12.0, 1e-13));
        assert!(c.ixy.abs() < 1e-6);
    }

    #[test]
    fn circle_offset_from_origin() {
        // πd⁴/64 about a diameter (Gere & Goodno, Appendix E, case 9).
        let (d, c0) = (80.0, Pt::new(250.0, -130.0));
        let m = Moments::of_contour(&Contour::circle(c0, d / 2.0));
        let c = m.centroidal().unwrap();
        assert!(close(c.area, PI * d * d / 4.0, 1e-14));
        assert!(close(c.cx, c0.x, 1e-14) && close(c.cy, c0.y, 1e-14));
        assert!(close(c.ixx, PI * d.powi(4) / 64.0, 1e-10));
        assert!(close(c.iyy, PI * d.powi(4) / 64.0, 1e-10));
        assert!(c.ixy.abs() < 1e-6 * c.ixx);
    }

    #[test]
    fn full_circle_as_one_arc_and_as_three() {
        // A = πr², I = πr⁴/4 about any diameter, Ixy = 0 (Gere & Goodno, Mechanics of
        // Materials, Appendix E, case 9), whether the boundary is one arc or three.
        let r = 7.5;
        let one = Moments::of_seg(&Seg::arc(Pt::new(0.0, 0.0), r, 0.0, 2.0 * PI));
        let three = [(0.4, 2.1), (2.1, 4.0), (4.0, 0.4 + 2.0 * PI)]
            .iter()
            .map(|&(a0, a1)| Moments::of_seg(&Seg::arc(Pt::new(0.0, 0.0), r, a0, a1)))
            .fold(Moments::default(), |s, m| s.plus(&m, 1.0));
        for m in [one, three] {
            assert!(close(m.a, PI * r * r, 1e-15));
            assert!(close(m.ixx, PI * r.powi(4) / 4.0, 1e-15));
            assert!(close(m.iyy, PI * r.powi(4) / 4.0, 1e-15));
            assert!(m.sx.abs() < 1e-12 && m.sy.abs() < 1e-12 && m.ixy.abs() < 1e-10);
        }
        // Travelled clockwise, the same circle is a hole: every moment changes sign.
        let cw = Moments::of_seg(&Seg::arc(Pt::new(0.0, 0.0), r, 2.0 * PI, 0.0));
        assert!(close(-cw.a, PI * r * r, 1e-15) && close(-cw.ixx, PI * r.powi(4) / 4.0, 1e-15));
    }

    #[test]
    fn half_circle_centroid_and_second_moments() {
        // Flat side on the x axis: A = πr²/2, ȳ = 4r/(3π), Ix about the diameter = πr⁴/8,
        // about the centroid (9π² − 64)r⁴/(72π) (Gere & Goodno, Appendix E, case 10).
        let (r, c0) = (3.0, Pt::new(-40.0, 25.0));
        let half = Contour {
            segs: vec![
                Seg::arc(c0, r, 0.0, PI),
                Seg::Line(Pt::new(c0.x - r, c0.y), Pt::new(c0.x + r, c0.y)),
            ],
        };
        let c = Moments::of_contour(&half).centroidal().unwrap();
        assert!(close(c.area, PI * r * r / 2.0, 1e-14));
        assert!(close(c.cx, c0.x, 1e-14));
        assert!(close(c.cy - c0.y, 4.0 * r / (3.0 * PI), 1e-12));
        let ix = (9.0 * PI * PI - 64.0) * r.powi(4) / (72.0 * PI);
        assert!(close(c.ixx, ix, 1e-11));
        assert!(close(c.iyy, PI * r.powi(4) / 8.0, 1e-11));
        assert!(c.ixy.abs() < 1e-9);
        // About the diameter itself (moments taken with the centre as origin).
        let at = Contour {
            segs: vec![
                Seg::arc(Pt::new(0.0, 0.0), r, 0.0, PI),
                Seg::Line(Pt::new(-r, 0.0), Pt::new(r, 0.0)),
            ],
        };
        assert!(close(
            Moments::of_contour(&at).ixx,
            PI * r.powi(4) / 8.0,
            1e-15
        ));
    }

    #[test]
    fn quarter_circle_product_of_inertia() {
        // Quarter disc in the first quadrant, corner at the origin: A = πr²/4,
        // x̄ = ȳ = 4r/(3π), Ix = Iy = πr⁴/16 and Ixy = r⁴/8 about the straight edges
        // (Gere & Goodno, Appendix E, case 11).
        let r = 12.0;
        let o = Pt::new(0.0, 0.0);
        let quarter = Contour {
            segs: vec![
                Seg::Line(o, Pt::new(r, 0.0)),
                Seg::arc(o, r, 0.0, PI / 2.0),
                Seg::Line(Pt::new(0.0, r), o),
            ],
        };
        let m = Moments::of_contour(&quarter);
        assert!(close(m.a, PI * r * r / 4.0, 1e-15));
        let c = m.centroid().unwrap();
        assert!(close(c.x, 4.0 * r / (3.0 * PI), 1e-14));
        assert!(close(c.y, 4.0 * r / (3.0 * PI), 1e-14));
        assert!(close(m.ixx, PI * r.powi(4) / 16.0, 1e-15));
        assert!(close(m.iyy, PI * r.powi(4) / 16.0, 1e-15));
        assert!(close(m.ixy, r.powi(4) / 8.0, 1e-15));
    }

    #[test]
    fn first_moments_are_those_of_the_second_moments_pass() {
        // A rounded rectangle (lines and quarter arcs) off the origin: A, ∫x dA, ∫y dA
        // from either pass are the same sums; A = bh − (4 − π)r² (four corners cut).
        let k = Contour::rounded_rect(2.0, -1.0, 12.0, 5.0, 1.5);
        let (f, m) = (FirstMoments::of_contour(&k), Moments::of_contour(&k));
        assert_eq!((f.a, f.sx, f.sy), (m.a, m.sx, m.sy));
        assert!(close(f.a, 60.0 - (4.0 - PI) * 2.25, 1e-14));
        // The shape is symmetric about its middle (7, 2): the centroid.
        assert!(close(f.sx / f.a, 7.0, 1e-14) && close(f.sy / f.a, 2.0, 1e-14));
    }

    #[test]
    fn a_hole_cancels_its_solid() {
        let solid = Contour::circle(Pt::new(3.0, 4.0), 2.0);
        let m = Moments::of_contour(&solid).plus(&Moments::of_contour(&solid.reversed()), 1.0);
        assert!(m.a.abs() < 1e-14 && m.ixx.abs() < 1e-12 && m.ixy.abs() < 1e-12);
    }
}
