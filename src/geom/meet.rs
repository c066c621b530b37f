//! Where boundary segments meet, exactly: straight lines and circular arcs as they are
//! (no chords), their crossings, the nearest point of a segment, the integral `∫ x dy`
//! along a piece of one, and the winding number of a boundary made of them.
//!
//! The crossings are the closed forms: two lines by Cramer's rule on
//! `a + t·(b − a) = c + u·(d − c)`; a line and a circle by the foot of the perpendicular
//! from the centre and `h = √(r² − dist²)` either side of it; two circles by the radical
//! line, `a = (d² + r₁² − r₂²) / 2d` from the first centre and `h = √(r₁² − a²)` across
//! it (e.g. Bourke, "Intersection of two circles", 1997). Rounding and exact touching
//! (a bar resting on a plate, a hole flush with an edge) are settled by one tolerance,
//! [`tolerance`]: a point counts as on a segment when it is within it.

use super::contour::{Pt, Seg};
use std::f64::consts::{FRAC_PI_2, TAU};

/// The one tolerance of meeting segments: `10⁻⁹` of the size of what is compared (the
/// largest side of the boxes of the two regions), far above rounding (about 10⁻¹⁶) and
/// far below any dimension a drawing gives.
pub fn tolerance(size: f64) -> f64 {
    1e-9 * size
}

/// A boundary segment with its ends and box worked out once. Arcs are kept to at most
/// a quarter turn ([`Edge::split`]), so an arc and its chord bound a minor segment of
/// the circle and every box is tight.
#[derive(Debug, Clone, Copy)]
pub struct Edge {
    pub seg: Seg,
    pub from: Pt,
    pub to: Pt,
    /// `[xmin, xmax, ymin, ymax]`, exact for an arc.
    pub bbox: [f64; 4],
}

impl Edge {
    /// The edges of one segment: a line as it is, an arc in equal pieces of at most a
    /// quarter turn (at most eight: a sweep is at most a full turn).
    pub fn split(s: &Seg, out: &mut Vec<Edge>) {
        match *s {
            Seg::Line(..) => out.push(Edge::new(*s)),
            Seg::Arc { c, r, a0, a1 } => {
                let n = ((a1 - a0).abs() / FRAC_PI_2 - 1e-9).ceil();
                let n = if n.is_finite() {
                    n.clamp(1.0, 8.0)
                } else {
                    1.0
                };
                let step = (a1 - a0) / n;
                // A piece starts at the angle the one before ends at: its start is that
                // one's end, the same numbers.
                let mut from: Option<Pt> = None;
                for k in 0..n as usize {
                    let lo = a0 + step * k as f64;
                    let hi = if k + 1 == n as usize {
                        a1
                    } else {
                        a0 + step * (k + 1) as f64
                    };
                    let seg = Seg::arc(c, r, lo, hi);
                    let to = seg.end();
                    out.push(Edge::with_ends(
                        seg,
                        from.unwrap_or_else(|| seg.start()),
                        to,
                    ));
                    from = Some(to);
                }
            }
        }
    }

    fn new(seg: Seg) -> Edge {
        Edge::with_ends(seg, seg.start(), seg.end())
    }

    /// `from` and `to` must be `seg.start()` and `seg.end()`.
    fn with_ends(seg: Seg, from: Pt, to: Pt) -> Edge {
        Edge {
            seg,
            from,
            to,
            bbox: seg.bounds_between(from, to),
        }
    }

    /// The point at parameter `t` ∈ [0, 1]: along a line `a + t·(b − a)`, along an arc
    /// at the angle `a₀ + t·(a₁ − a₀)`.
    pub fn at(&self, t: f64) -> Pt {
        match self.seg {
            Seg::Line(a, b) => a.add(b.sub(a).scale(t)),
            Seg::Arc { c, r, a0, a1 } => {
                let (s, k) = (a0 + t * (a1 - a0)).sin_cos();
                c.add(Pt::new(r * k, r * s))
            }
        }
    }

    /// The direction of travel at parameter `t` (not of unit length).
    pub fn tangent(&self, t: f64) -> Pt {
        match self.seg {
            Seg::Line(a, b) => b.sub(a),
            Seg::Arc { a0, a1, .. } => {
                let (s, k) = (a0 + t * (a1 - a0)).sin_cos();
                Pt::new(-s, k).scale((a1 - a0).signum())
            }
        }
    }

    /// The parameter of the point of the segment nearest to `p`, and that point: for a
    /// line the foot of the perpendicular clamped to the segment, for an arc the point
    /// at `p`'s angle about the centre when the arc spans it, else the nearer end.
    pub fn nearest(&self, p: Pt) -> (f64, Pt) {
        match self.seg {
            Seg::Line(a, b) => {
                let t = p.param_on_segment(a, b);
                (t, a.add(b.sub(a).scale(t)))
            }
            Seg::Arc { c, r, a0, a1 } => {
                let v = p.sub(c);
                let len = v.x.hypot(v.y);
                let sweep = a1 - a0;
                // The angle from the start in the direction of travel, in [0, 2π).
                let phi = v.y.atan2(v.x);
                let rel = (sweep.signum() * (phi - a0)).rem_euclid(TAU);
                if len > 0.0 && rel <= sweep.abs() {
                    (rel / sweep.abs(), c.add(v.scale(r / len)))
                } else if p.dist(self.from) <= p.dist(self.to) {
                    (0.0, self.from)
                } else {
                    (1.0, self.to)
                }
            }
        }
    }

    /// Distance from `p` to the segment.
    pub fn dist(&self, p: Pt) -> f64 {
        p.dist(self.nearest(p).1)
    }

    /// `∫ x dy` along the piece from parameter `t0` to `t1`: `(x₀ + x₁)(y₁ − y₀)/2` on
    /// a line; on an arc, with `x = cₓ + r cos θ`, `dy = r cos θ dθ`,
    /// `cₓ r (sin θ₁ − sin θ₀) + r²(θ₁ − θ₀)/2 + r²(sin 2θ₁ − sin 2θ₀)/4`.
    pub fn x_dy(&self, t0: f64, t1: f64) -> f64 {
        self.x_dy_between(self.x_dy_end(t0), self.x_dy_end(t1))
    }

    /// What [`Edge::x_dy`] takes from the parameter `t` of one end: on a line the point
    /// `[x, y, 0]`, on an arc the angle θ there and `[θ, sin θ, sin 2θ]` (so that pieces
    /// meeting at `t` share its sines).
    pub fn x_dy_end(&self, t: f64) -> [f64; 3] {
        match self.seg {
            Seg::Line(..) => {
                let p = self.at(t);
                [p.x, p.y, 0.0]
            }
            Seg::Arc { a0, a1, .. } => {
                let th = a0 + t * (a1 - a0);
                [th, th.sin(), (2.0 * th).sin()]
            }
        }
    }

    /// [`Edge::x_dy_end`] at `t`, on an arc taken from `known` (the end of an arc
    /// found before) when that is at the same angle, bit for bit: the same numbers
    /// without their sines.
    pub fn x_dy_end_or(&self, t: f64, known: Option<[f64; 3]>) -> [f64; 3] {
        match (self.seg, known) {
            (Seg::Arc { a0, a1, .. }, Some(k))
                if (a0 + t * (a1 - a0)).to_bits() == k[0].to_bits() =>
            {
                k
            }
            _ => self.x_dy_end(t),
        }
    }

    /// [`Edge::x_dy`] between two ends of [`Edge::x_dy_end`].
    pub fn x_dy_between(&self, e0: [f64; 3], e1: [f64; 3]) -> f64 {
        match self.seg {
            Seg::Line(..) => 0.5 * (e0[0] + e1[0]) * (e1[1] - e0[1]),
            Seg::Arc { c, r, .. } => {
                c.x * r * (e1[1] - e0[1])
                    + 0.5 * r * r * (e1[0] - e0[0])
                    + 0.25 * r * r * (e1[2] - e0[2])
            }
        }
    }

    /// Pushes onto `out` the parameters in (0, 1) of this segment where `o` crosses or
    /// touches it, or where an end of `o` lies on it (so a run along `o` is cut at its
    /// ends), each within `tol` of both segments. Nothing is missed that is within
    /// `tol`; a point pushed twice or a touch without a crossing only cuts a piece in two.
    pub fn cuts(&self, o: &Edge, tol: f64, out: &mut Vec<f64>) {
        let mut push = |p: Pt| {
            let (t, q) = self.nearest(p);
            if t > 0.0 && t < 1.0 && q.dist(p) <= tol && o.dist(p) <= tol {
                out.push(t);
            }
        };
        match (self.seg, o.seg) {
            (Seg::Line(a, b), Seg::Line(c, e)) => {
                let (d, f) = (b.sub(a), e.sub(c));
                let den = d.cross(f);
                if den != 0.0 {
                    push(a.add(d.scale(c.sub(a).cross(f) / den)));
                }
            }
            (Seg::Line(a, b), Seg::Arc { c, r, .. }) | (Seg::Arc { c, r, .. }, Seg::Line(a, b)) => {
                let [p, q] = line_circle(a, b, c, r, tol);
                p.into_iter().chain(q).for_each(&mut push);
            }
            (Seg::Arc { c: c1, r: r1, .. }, Seg::Arc { c: c2, r: r2, .. }) => {
                let [p, q] = circle_circle(c1, r1, c2, r2, tol);
                p.into_iter().chain(q).for_each(&mut push);
            }
        }
        push(o.from);
        push(o.to);
    }

    /// This segment's share of the winding number about `p` (counter-clockwise +1):
    /// its chord's by the crossing rule of a ray to +x (half-open in y), plus, for an
    /// arc, ±1 when `p` lies strictly between the arc and its chord (the arc and the
    /// chord back wind once about that minor segment of the circle, in the arc's sense).
    pub fn winding(&self, p: Pt) -> i32 {
        let (a, b) = (self.from, self.to);
        let side = b.sub(a).cross(p.sub(a));
        let mut w = 0;
        if a.y <= p.y {
            if b.y > p.y && side > 0.0 {
                w += 1;
            }
        } else if b.y <= p.y && side < 0.0 {
            w -= 1;
        }
        if let Seg::Arc { c, r, a0, a1 } = self.seg {
            let v = p.sub(c);
            // A counter-clockwise arc lies to the right of its chord, a clockwise one
            // to the left.
            let sense = (a1 - a0).signum();
            if v.x * v.x + v.y * v.y < r * r && sense * side < 0.0 {
                w += sense as i32;
            }
        }
        w
    }
}

/// Where the line through `a` and `b` meets the circle of centre `c` and radius `r`:
/// the foot of the perpendicular from `c`, `h` either side of it; the foot alone when
/// the line passes within `tol` outside the circle (touching).
fn line_circle(a: Pt, b: Pt, c: Pt, r: f64, tol: f64) -> [Option<Pt>; 2] {
    let d = b.sub(a);
    let len2 = d.x * d.x + d.y * d.y;
    if len2.is_nan() || len2 <= 0.0 {
        return [None, None];
    }
    let m = a.sub(c);
    let foot = a.add(d.scale(-(m.x * d.x + m.y * d.y) / len2));
    let dist = m.cross(d).abs() / len2.sqrt();
    if dist > r {
        return [(dist - r <= tol).then_some(foot), None];
    }
    let h = ((r - dist) * (r + dist)).sqrt() / len2.sqrt();
    [Some(foot.add(d.scale(h))), Some(foot.sub(d.scale(h)))]
}

/// Where two circles meet: on their radical line, at `a = (d² + r₁² − r₂²)/2d` from the
/// first centre, `h = √(r₁² − a²)` either side; the one point at `h = 0` when they
/// miss each other by no more than `tol` (touching); none for concentric circles (a
/// run along the same circle is cut at the ends of the segments instead).
fn circle_circle(c1: Pt, r1: f64, c2: Pt, r2: f64, tol: f64) -> [Option<Pt>; 2] {
    let v = c2.sub(c1);
    let d = v.x.hypot(v.y);
    if d.is_nan() || d <= 0.0 || d > r1 + r2 + tol || d < (r1 - r2).abs() - tol {
        return [None, None];
    }
    let a = (d * d + r1 * r1 - r2 * r2) / (2.0 * d);
    let h = (r1 * r1 - a * a).max(0.0).sqrt();
    let u = v.scale(1.0 / d);
    let base = c1.add(u.scale(a));
    let across = Pt::new(-u.y, u.x).scale(h);
    [Some(base.add(across)), (h > 0.0).then(|| base.sub(across))]
}

/// Winding number about `p` of closed boundaries given as edges (outlines
/// counter-clockwise +1, holes −1); exact for arcs, `p` off the boundary.
pub fn winding(edges: &[Edge], p: Pt) -> i32 {
    edges.iter().map(|e| e.winding(p)).sum()
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::geom::Contour;
    use std::f64::consts::PI;

    fn edges(c: &Contour) -> Vec<Edge> {
        let mut out = Vec::new();
        c.segs.iter().for_each(|s| Edge::split(s, &mut out));
        out
    }

    #[test]
    fn area_of_a_circle_and_a_rounded_rectangle() {
        // ∮ x dy is the enclosed area (Green's theorem): πr² for a circle; for a
        // rectangle with corner radius r, b·h − (4 − π)r².
        let circle = edges(&Contour::circle(Pt::new(3.0, -2.0), 5.0));
        assert_eq!(circle.len(), 4);
        let a: f64 = circle.iter().map(|e| e.x_dy(0.0, 1.0)).sum();
        assert!((a - PI * 25.0).abs() < 1e-12, "{a}");
        let rr = edges(&Contour::rounded_rect(0.0, 0.0, 40.0, 20.0, 5.0));
        let a: f64 = rr.iter().map(|e| e.x_dy(0.0, 1.0)).sum();
        assert!((a - (800.0 - (4.0 - PI) * 25.0)).abs() < 1e-10, "{a}");
    }

    #[test]
    fn winding_of_a_circle_exact_near_its_arc() {
        // Points just inside and just outside the true circle, where a 3° chord would
        // already be outside: (r − 1e-6) vs r·cos(1.5°) ≈ r − 3.4e-4·r.
        let circle = edges(&Contour::circle(Pt::new(0.0, 0.0), 10.0));
        for k in 0..36 {
            let t = k as f64 * 10f64.to_radians() + 0.013;
            let u = Pt::new(t.cos(), t.sin());
            assert_eq!(winding(&circle, u.scale(10.0 - 1e-6)), 1, "{k}");
            assert_eq!(winding(&circle, u.scale(10.0 + 1e-6)), 0, "{k}");
        }
        assert_eq!(winding(&circle, Pt::new(0.0, 0.0)), 1);
        let hole = edges(&Contour::circle(Pt::new(0.0, 0.0), 10.0).reversed());
        assert_eq!(winding(&hole, Pt::new(9.9, 0.5)), -1);
    }

    #[test]
    fn crossings_of_lines_and_circles() {
        // The unit circle and the line y = 0.6 meet at x = ±0.8 (3-4-5 triangle).
        let line = Edge::new(Seg::Line(Pt::new(-2.0, 0.6), Pt::new(2.0, 0.6)));
        let arc = Edge::new(Seg::arc(Pt::new(0.0, 0.0), 1.0, 0.0, PI));
        let mut ts = Vec::new();
        line.cuts(&arc, 1e-9, &mut ts);
        ts.sort_by(f64::total_cmp);
        let xs: Vec<f64> = ts.iter().map(|&t| line.at(t).x).collect();
        assert!(xs.len() == 2 && (xs[0] + 0.8).abs() < 1e-12 && (xs[1] - 0.8).abs() < 1e-12);
        // Circles of radius 5 about (0, 0) and (8, 0) meet at (4, ±3).
        let a = Edge::new(Seg::arc(Pt::new(0.0, 0.0), 5.0, -FRAC_PI_2, FRAC_PI_2));
        let b = Edge::new(Seg::arc(Pt::new(8.0, 0.0), 5.0, FRAC_PI_2, 1.5 * PI));
        ts.clear();
        a.cuts(&b, 1e-9, &mut ts);
        assert_eq!(ts.len(), 2);
        for t in &ts {
            let p = a.at(*t);
            assert!((p.x - 4.0).abs() < 1e-12 && (p.y.abs() - 3.0).abs() < 1e-12);
        }
        // A line touching the circle at its top is cut at the touching point.
        let top = Edge::new(Seg::Line(Pt::new(-2.0, 1.0), Pt::new(2.0, 1.0)));
        ts.clear();
        top.cuts(&arc, 1e-9, &mut ts);
        assert!(ts.iter().any(|&t| (t - 0.5).abs() < 1e-9), "{ts:?}");
    }
}
