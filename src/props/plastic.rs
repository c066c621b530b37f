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

use crate::geom::trig::TrigPoly;
use crate::geom::{Contour, Seg};
use std::f64::consts::TAU;

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

/// The plastic axis parallel to x of a weighted region spanning `ymin..ymax`.
/// `None` if the weighted area is not positive.
pub fn plastic_axis_x(parts: &[Weighted], ymin: f64, ymax: f64) -> Option<PlasticAxis> {
    let total = below(parts, f64::INFINITY);
    if total.a.is_nan() || total.a <= 0.0 || ymax.is_nan() || ymin.is_nan() || ymax <= ymin {
        return None;
    }
    let half = total.a / 2.0;
    let (mut lo, mut hi) = (ymin, ymax);
    // Start at mid-depth; Newton needs only a few steps on the piecewise polynomial.
    let mut c = 0.5 * (lo + hi);
    let mut at = below(parts, c);
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
        at = below(parts, c);
    }
    let z = total.q - 2.0 * at.q - c * (total.a - 2.0 * at.a);
    Some(PlasticAxis { level: c, z })
}

/// The plastic axis parallel to y: the same problem after `(x, y) ↦ (y, −x)`; the
/// level returned is the x of the axis.
pub fn plastic_axis_y(parts: &[Weighted], xmin: f64, xmax: f64) -> Option<PlasticAxis> {
    let turned: Vec<Vec<Contour>> = parts
        .iter()
        .map(|p| {
            p.contours
                .iter()
                .map(|c| Contour {
                    segs: c.segs.iter().map(Seg::quarter_turn_cw).collect(),
                })
                .collect()
        })
        .collect();
    let weighted: Vec<Weighted> = turned
        .iter()
        .zip(parts)
        .map(|(c, p)| Weighted {
            contours: c,
            weight: p.weight,
        })
        .collect();
    plastic_axis_x(&weighted, -xmax, -xmin).map(|p| PlasticAxis {
        level: -p.level,
        z: p.z,
    })
}

fn below(parts: &[Weighted], c: f64) -> Below {
    let mut sum = Below::default();
    for p in parts {
        for contour in p.contours {
            for s in &contour.segs {
                let b = seg_below(s, c);
                sum.a += p.weight * b.a;
                sum.q += p.weight * b.q;
                sum.width += p.weight * b.width;
            }
        }
    }
    sum
}

/// `∮ x dy`, `∮ x·y dy` over the part of a segment with `y ≤ c`, and its crossing of
/// the level (`x·sign(dy)`), whose sum over a closed boundary is the width at `c`.
fn seg_below(s: &Seg, c: f64) -> Below {
    match *s {
        Seg::Line(p, q) => {
            let (pb, qb) = (p.y <= c, q.y <= c);
            if pb && qb {
                return line_part(p.x, p.y, q.x, q.y, 0.0);
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
        Seg::Arc { c: o, r, a0, a1 } => {
            let (lo, hi) = (a0.min(a1), a0.max(a1));
            let s = (c - o.y) / r;
            if s >= 1.0 {
                return arc_part(o.x, o.y, r, a0, a1);
            }
            if s <= -1.0 {
                return Below::default();
            }
            // Angles where the circle meets y = c, within the sweep.
            let base = s.asin();
            let mut cuts = vec![lo];
            let k0 = ((lo - base) / TAU).floor() as i64 - 1;
            for k in k0..k0 + 4 {
                for t in [
                    base + k as f64 * TAU,
                    std::f64::consts::PI - base + k as f64 * TAU,
                ] {
                    if t > lo && t < hi {
                        cuts.push(t);
                    }
                }
            }
            cuts.push(hi);
            cuts.sort_by(f64::total_cmp);
            let dir = if a1 >= a0 { 1.0 } else { -1.0 };
            let mut out = Below::default();
            for w in cuts.windows(2) {
                let mid = 0.5 * (w[0] + w[1]);
                if o.y + r * mid.sin() <= c {
                    let (t0, t1) = if dir > 0.0 {
                        (w[0], w[1])
                    } else {
                        (w[1], w[0])
                    };
                    let b = arc_part(o.x, o.y, r, t0, t1);
                    out.a += b.a;
                    out.q += b.q;
                }
            }
            for &t in &cuts[1..cuts.len() - 1] {
                out.width += (o.x + r * t.cos()) * (dir * t.cos()).signum();
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

/// The same integrals over an arc, exactly: `dy = r cos t dt`.
fn arc_part(cx: f64, cy: f64, r: f64, t0: f64, t1: f64) -> Below {
    let x = TrigPoly::linear(cx, r, 0.0);
    let y = TrigPoly::linear(cy, 0.0, r);
    let dy = TrigPoly::linear(0.0, r, 0.0);
    let xdy = x.mul(&dy);
    Below {
        a: xdy.integral(t0, t1),
        q: xdy.mul(&y).integral(t0, t1),
        width: 0.0,
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::geom::Pt;

    #[test]
    fn rectangle_plastic_modulus_is_bh2_over_4() {
        // Z = b·h²/4 for a rectangle (Neal, The Plastic Methods of Structural Analysis).
        let (b, h) = (40.0, 90.0);
        let r = [Contour::rounded_rect(10.0, -20.0, 10.0 + b, -20.0 + h, 0.0)];
        let w = [Weighted {
            contours: &r,
            weight: 1.0,
        }];
        let px = plastic_axis_x(&w, -20.0, 70.0).unwrap();
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
        let px = plastic_axis_x(&w, 7.0 - 30.0, 37.0).unwrap();
        assert!((px.level - 7.0).abs() < 1e-10);
        assert!((px.z - d.powi(3) / 6.0).abs() < 1e-9 * d.powi(3));
    }
}
