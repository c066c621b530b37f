//! Plastic neutral axes and plastic section moduli.
//!
//! The plastic neutral axis parallel to x lies at the level `c` that halves the
//! weighted area (`A_below(c) = A/2`; weights are −1 for voids and the strength ratio
//! for other materials), and `Z = ∫|y − c| dA = Q − 2·Q_below − c·(A − 2·A_below)` with
//! `Q = ∫y dA` (Neal, The Plastic Methods of Structural Analysis, ch. 1; any steel
//! design handbook). `A_below` and `Q_below` come from Green's theorem in the forms
//! `A = ∮ x dy` and `∫y dA = ∮ x·y dy`, in which the cutting line `y = c` (where
//! `dy = 0`) contributes nothing: each boundary segment is simply clipped to `y ≤ c`.
//! The level is found by Newton's method on `A_below(c) − A/2`, whose derivative is the
//! width of the section at `c`, safeguarded by bisection. Z is stationary at the root,
//! so the modulus is accurate to rounding. The axis parallel to y is found the same way
//! after a quarter turn of the section.

use crate::geom::trig::{Angle, Monomials, TrigPoly};
use crate::geom::{Contour, Pt, Seg};
use std::f64::consts::{PI, TAU};

/// A set of boundaries with a weight (sign × strength ratio).
pub struct Weighted<'a> {
    pub contours: &'a [Contour],
    pub weight: f64,
}

/// The plastic neutral axis level and plastic modulus about an axis parallel to x.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct PlasticAxis {
    pub level: f64,
    pub z: f64,
}

/// Area, first moment `∫y dA` below `c`, and the width at `c`, weighted.
#[derive(Debug, Clone, Copy, Default)]
struct Below {
    a: f64,
    q: f64,
    width: f64,
}

/// The end angles of an arc and the integrals of the monomials between them
/// (`Monomials::between` of the two), when already formed.
pub type ArcEnds = ([Angle; 2], Monomials);

/// The plastic axis parallel to x of a weighted region spanning `ymin..ymax`; `known`:
/// the [`ArcEnds`] of the parts' arcs in order, as far as they are at hand (the rest are
/// formed here, the same numbers). `None` if the weighted area is not positive.
pub fn plastic_axis_x(
    parts: &[Weighted],
    known: &[ArcEnds],
    ymin: f64,
    ymax: f64,
) -> Option<PlasticAxis> {
    search(&edges(parts, |s| *s, known), ymin, ymax)
}

/// The plastic axis parallel to y: the same problem after `(x, y) ↦ (y, −x)`; the
/// level returned is the x of the axis.
pub fn plastic_axis_y(parts: &[Weighted], xmin: f64, xmax: f64) -> Option<PlasticAxis> {
    search(&edges(parts, Seg::quarter_turn_cw, &[]), -xmax, -xmin).map(|p| PlasticAxis {
        level: -p.level,
        z: p.z,
    })
}

/// The level halving the weighted area of `edges` within `ymin..ymax`, and `Z` there.
fn search(edges: &Edges, ymin: f64, ymax: f64) -> Option<PlasticAxis> {
    let total = below(edges, f64::INFINITY);
    if total.a.is_nan() || total.a <= 0.0 || ymax.is_nan() || ymin.is_nan() || ymax <= ymin {
        return None;
    }
    let half = total.a / 2.0;
    let (mut lo, mut hi) = (ymin, ymax);
    // Start at mid-depth; Newton needs only a few steps on the piecewise polynomial.
    let mut c = 0.5 * (lo + hi);
    let mut at = below(edges, c);
    for _ in 0..200 {
        let f = at.a - half;
        if f.abs() <= 1e-15 * total.a {
            break;
        }
        if f < 0.0 {
            lo = c;
        } else {
            hi = c;
        }
        let newton = c - f / at.width;
        let next = if at.width > 0.0 && newton > lo && newton < hi {
            newton
        } else {
            0.5 * (lo + hi)
        };
        if next == c || hi - lo <= 1e-15 * (ymax - ymin) {
            break;
        }
        c = next;
        at = below(edges, c);
    }
    let z = total.q - 2.0 * at.q - c * (total.a - 2.0 * at.a);
    Some(PlasticAxis { level: c, z })
}

/// The weighted boundary segments of a section in order, prepared once for every level
/// of the search: each one's whole share, and the arcs' integrands and end angles.
struct Edges {
    edges: Vec<Edge>,
    arcs: Vec<ArcEdge>,
}

struct Edge {
    weight: f64,
    whole: Below,
    shape: Shape,
}

enum Shape {
    Line(Pt, Pt),
    /// Index into [`Edges::arcs`].
    Arc(usize),
}

/// An arc about `o` of radius `r` from `a0` to `a1`, with `x dy = xdy(t) dt` and
/// `x·y dy = xydy(t) dt` (`dy = r cos t dt`).
struct ArcEdge {
    o: Pt,
    r: f64,
    a0: Angle,
    a1: Angle,
    xdy: TrigPoly,
    xydy: TrigPoly,
}

impl ArcEdge {
    /// `∮ x dy`, `∮ x·y dy` from `e0` to `e1` along the arc, exactly.
    fn part(&self, e0: &Angle, e1: &Angle) -> Below {
        self.part_over(&Monomials::between(e0, e1))
    }

    /// [`ArcEdge::part`] between the ends of `m`.
    fn part_over(&self, m: &Monomials) -> Below {
        Below {
            a: self.xdy.integral(m),
            q: self.xydy.integral(m),
            width: 0.0,
        }
    }
}

/// The edges of every part, each segment mapped by `turn` first; the `k`-th arc's ends
/// are `known[k]` when there is one.
fn edges(parts: &[Weighted], turn: impl Fn(&Seg) -> Seg, known: &[ArcEnds]) -> Edges {
    let segs = parts.iter().flat_map(|p| p.contours).flat_map(|c| &c.segs);
    let arcs = segs
        .clone()
        .filter(|s| matches!(s, Seg::Arc { .. }))
        .count();
    let mut out = Edges {
        edges: Vec::with_capacity(segs.count()),
        arcs: Vec::with_capacity(arcs),
    };
    for p in parts {
        for contour in p.contours {
            for s in &contour.segs {
                let (whole, shape) = match turn(s) {
                    Seg::Line(a, b) => (line_part(a.x, a.y, b.x, b.y, 0.0), Shape::Line(a, b)),
                    Seg::Arc { c: o, r, a0, a1 } => {
                        let x = TrigPoly::linear(o.x, r, 0.0);
                        let y = TrigPoly::linear(o.y, 0.0, r);
                        let xdy = x.mul(&TrigPoly::linear(0.0, r, 0.0));
                        let (ends, m) = match known.get(out.arcs.len()) {
                            Some((ends, m)) => (*ends, Some(m)),
                            None => ([Angle::new(a0), Angle::new(a1)], None),
                        };
                        let arc = ArcEdge {
                            o,
                            r,
                            a0: ends[0],
                            a1: ends[1],
                            xdy,
                            xydy: xdy.mul(&y),
                        };
                        let whole = match m {
                            Some(m) => arc.part_over(m),
                            None => arc.part(&arc.a0, &arc.a1),
                        };
                        out.arcs.push(arc);
                        (whole, Shape::Arc(out.arcs.len() - 1))
                    }
                };
                out.edges.push(Edge {
                    weight: p.weight,
                    whole,
                    shape,
                });
            }
        }
    }
    out
}

fn below(edges: &Edges, c: f64) -> Below {
    let mut sum = Below::default();
    for e in &edges.edges {
        let b = edge_below(e, &edges.arcs, c);
        sum.a += e.weight * b.a;
        sum.q += e.weight * b.q;
        sum.width += e.weight * b.width;
    }
    sum
}

/// `∮ x dy`, `∮ x·y dy` over the part of an edge with `y ≤ c`, and its crossing of
/// the level (`x·sign(dy)`), whose sum over a closed boundary is the width at `c`.
fn edge_below(e: &Edge, arcs: &[ArcEdge], c: f64) -> Below {
    match e.shape {
        Shape::Line(p, q) => {
            let (pb, qb) = (p.y <= c, q.y <= c);
            if pb && qb {
                return e.whole;
            }
            if !pb && !qb {
                return Below::default();
            }
            let t = (c - p.y) / (q.y - p.y);
            let xc = p.x + t * (q.x - p.x);
            let cross = xc * (q.y - p.y).signum();
            if pb {
                line_part(p.x, p.y, xc, c, cross)
            } else {
                line_part(xc, c, q.x, q.y, cross)
            }
        }
        Shape::Arc(i) => {
            let arc = &arcs[i];
            let (o, r) = (arc.o, arc.r);
            let forward = arc.a1.t >= arc.a0.t;
            let (lo, hi) = if forward {
                (arc.a0, arc.a1)
            } else {
                (arc.a1, arc.a0)
            };
            let s = (c - o.y) / r;
            if s >= 1.0 {
                return e.whole;
            }
            if s <= -1.0 {
                return Below::default();
            }
            // Angles where the circle meets y = c, within the sweep: at most two a
            // turn, over the four turns looked at.
            let base = s.asin();
            let mut cuts = [lo; 10];
            let mut n = 1;
            let k0 = ((lo.t - base) / TAU).floor() as i64 - 1;
            for k in k0..k0 + 4 {
                for t in [base + k as f64 * TAU, PI - base + k as f64 * TAU] {
                    if t > lo.t && t < hi.t {
                        cuts[n] = Angle::new(t);
                        n += 1;
                    }
                }
            }
            cuts[n] = hi;
            let cuts = &mut cuts[..n + 1];
            cuts.sort_by(|a, b| a.t.total_cmp(&b.t));
            let mut out = Below::default();
            for w in cuts.windows(2) {
                let mid = 0.5 * (w[0].t + w[1].t);
                if o.y + r * mid.sin() <= c {
                    let b = if forward {
                        arc.part(&w[0], &w[1])
                    } else {
                        arc.part(&w[1], &w[0])
                    };
                    out.a += b.a;
                    out.q += b.q;
                }
            }
            let dir = if forward { 1.0 } else { -1.0 };
            for t in &cuts[1..cuts.len() - 1] {
                out.width += (o.x + r * t.cos) * (dir * t.cos).signum();
            }
            out
        }
    }
}

/// `∮ x dy = (x₀ + x₁)/2·Δy`, `∮ x·y dy = Δy·(x₀y₀ + (x₀Δy + y₀Δx)/2 + ΔxΔy/3)` over a
/// straight piece.
fn line_part(x0: f64, y0: f64, x1: f64, y1: f64, width: f64) -> Below {
    let (dx, dy) = (x1 - x0, y1 - y0);
    Below {
        a: 0.5 * (x0 + x1) * dy,
        q: dy * (x0 * y0 + 0.5 * (x0 * dy + y0 * dx) + dx * dy / 3.0),
        width,
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn rectangle_plastic_modulus_is_bh2_over_4() {
        // Z = b·h²/4 for a rectangle (Neal, The Plastic Methods of Structural Analysis).
        let (b, h) = (40.0, 90.0);
        let r = [Contour::rounded_rect(10.0, -20.0, 10.0 + b, -20.0 + h, 0.0)];
        let w = [Weighted {
            contours: &r,
            weight: 1.0,
        }];
        let px = plastic_axis_x(&w, &[], -20.0, 70.0).unwrap();
        assert!((px.level - 25.0).abs() < 1e-12);
        assert!((px.z - b * h * h / 4.0).abs() < 1e-9 * b * h * h);
        let py = plastic_axis_y(&w, 10.0, 50.0).unwrap();
        assert!((py.level - 30.0).abs() < 1e-12);
        assert!((py.z - h * b * b / 4.0).abs() < 1e-9 * h * b * b);
    }

    #[test]
    fn circle_plastic_modulus_is_d3_over_6() {
        // Z = d³/6 for a solid circle: two half discs of area πd²/8 whose centroids lie
        // 2d/(3π) from the diameter (Gere & Goodno, Mechanics of Materials, App. E, case 10).
        let d = 60.0;
        let c = [Contour::circle(Pt::new(5.0, 7.0), d / 2.0)];
        let w = [Weighted {
            contours: &c,
            weight: 1.0,
        }];
        let px = plastic_axis_x(&w, &[], 7.0 - 30.0, 37.0).unwrap();
        assert!((px.level - 7.0).abs() < 1e-10);
        assert!((px.z - d.powi(3) / 6.0).abs() < 1e-9 * d.powi(3));
    }

    #[test]
    fn tube_plastic_modulus_is_the_difference_of_the_discs() {
        // Z = (d³ − dᵢ³)/6 for a circular tube (the solid disc's d³/6 less the bore's;
        // Gere & Goodno, App. E, case 10, as above), the bore a clockwise arc of the same
        // part, both axes.
        let (d, di, o) = (50.0, 38.0, Pt::new(-3.0, 11.0));
        let c = [
            Contour::circle(o, d / 2.0),
            Contour::circle(o, di / 2.0).reversed(),
        ];
        let w = [Weighted {
            contours: &c,
            weight: 1.0,
        }];
        let z = (d.powi(3) - di.powi(3)) / 6.0;
        let px = plastic_axis_x(&w, &[], o.y - 25.0, o.y + 25.0).unwrap();
        assert!((px.level - o.y).abs() < 1e-10);
        assert!((px.z - z).abs() < 1e-12 * z);
        let py = plastic_axis_y(&w, o.x - 25.0, o.x + 25.0).unwrap();
        assert!((py.level - o.x).abs() < 1e-10);
        assert!((py.z - z).abs() < 1e-12 * z);
    }
}
