//! Joints: where two enabled solid parts share a stretch of boundary of positive length
//! (a flange on a web, a cover plate on a flange), and where they touch only at a point.
//!
//! Two straight edges share a stretch when they are collinear and their projections on
//! that line overlap; two arcs when they have the same centre and radius and their
//! sweeps overlap (the shared length is `r·Δθ`). A line and an arc can only touch at a
//! point. Coincidence is judged to [`JOINT_TOL`] of the section's size. Candidate pairs
//! come from a sort and sweep over the parts' bounding boxes, so a section of many
//! parts costs about `n log n` plus the pairs whose boxes meet. Voids and the area
//! integrals are not here: the flows are in [`crate::checks::shear_flow`].

use super::contour::{union_bounds, Pt, Seg};
use super::region::Piece;
use std::f64::consts::TAU;

/// Distance, relative to the larger side of the section's bounding box, within which
/// two boundaries count as coinciding (far above rounding in placed coordinates, far
/// below any gap a drawing means).
pub const JOINT_TOL: f64 = 1e-9;

/// The boundary shared by two solid pieces `a < b` (indices into the pieces).
#[derive(Debug, Clone, PartialEq)]
pub struct Joint {
    pub a: usize,
    pub b: usize,
    /// Total shared length, in the file's length unit.
    pub length: f64,
    /// How many separate stretches make up the shared boundary (two for a plate that
    /// closes a channel, say).
    pub stretches: usize,
    /// The shared boundary is a closed loop (a core filling a tube).
    pub closed: bool,
    /// The middle of each shared piece of boundary (where a drawing marks the joint).
    pub marks: Vec<Pt>,
}

impl Joint {
    /// One open stretch: only such a joint can be the single link between two sides.
    pub fn is_single_open(&self) -> bool {
        self.stretches == 1 && !self.closed
    }
}

/// Joints and point contacts among the solid pieces.
#[derive(Debug, Clone, Default, PartialEq)]
pub struct Contacts {
    /// In order of `(a, b)`.
    pub joints: Vec<Joint>,
    /// Pairs `(a, b)`, `a < b`, that touch only at points.
    pub points: Vec<(usize, usize)>,
    /// The search stopped after [`MAX_PAIRS`] pairs of parts whose boxes touch (parts
    /// stacked on one another): `joints` and `points` are then empty.
    pub gave_up: bool,
}

/// The most pairs of parts with touching bounding boxes that are examined for joints.
/// Real built-up sections have a few joints a part; thousands of parts stacked in one
/// place would otherwise make the search (and the flows after it) quadratic or worse.
pub const MAX_PAIRS: usize = 20_000;

/// A solid piece's boundary segments, each with its box, and the piece's box: worked
/// out once a piece however many pairs it is in.
struct Outline {
    segs: Vec<(Seg, [f64; 4])>,
    bounds: [f64; 4],
}

impl Outline {
    /// `None` for a piece with no segments or a box that is not finite.
    fn of(p: &Piece) -> Option<Outline> {
        let segs: Vec<(Seg, [f64; 4])> = (p.contours.iter().flat_map(|c| &c.segs))
            .map(|s| (*s, s.bounds()))
            .collect();
        // The union of the segments' boxes is the piece's box (`Piece::bounds`: min and
        // max do not depend on how they are grouped).
        let bounds = segs.iter().map(|(_, b)| *b).reduce(union_bounds)?;
        bounds
            .iter()
            .all(|v| v.is_finite())
            .then_some(Outline { segs, bounds })
    }
}

/// Whether box `a` widened by `w` meets box `b`.
fn near(a: &[f64; 4], b: &[f64; 4], w: f64) -> bool {
    !(b[0] > a[1] + w || a[0] > b[1] + w || b[2] > a[3] + w || a[2] > b[3] + w)
}

/// Finds every joint and point contact between enabled solid pieces (voids are skipped).
pub fn contacts(pieces: &[Piece]) -> Contacts {
    let outlines: Vec<(usize, Outline)> = pieces
        .iter()
        .enumerate()
        .filter(|(_, p)| !p.void)
        .filter_map(|(i, p)| Some((i, Outline::of(p)?)))
        .collect();
    let Some(all) = outlines.iter().map(|(_, o)| o.bounds).reduce(union_bounds) else {
        return Contacts::default();
    };
    let tol = JOINT_TOL * (all[1] - all[0]).max(all[3] - all[2]);
    let mut order: Vec<&(usize, Outline)> = outlines.iter().collect();
    order.sort_by(|a, b| a.1.bounds[0].total_cmp(&b.1.bounds[0]));
    let mut out = Contacts::default();
    let mut pairs = 0;
    let mut bits = Vec::new();
    for (k, &(i, ref oi)) in order.iter().copied().enumerate() {
        let bi = &oi.bounds;
        for &(j, ref oj) in order[k + 1..].iter().copied() {
            let bj = &oj.bounds;
            if bj[0] > bi[1] + tol {
                break;
            }
            if bj[2] > bi[3] + tol || bi[2] > bj[3] + tol {
                continue;
            }
            pairs += 1;
            if pairs > MAX_PAIRS {
                return Contacts {
                    gave_up: true,
                    ..Contacts::default()
                };
            }
            let ((a, oa), (b, ob)) = if i < j {
                ((i, oi), (j, oj))
            } else {
                ((j, oj), (i, oi))
            };
            match shared(oa, ob, tol, &mut bits) {
                Some(joint) => out.joints.push(Joint { a, b, ..joint }),
                None if touch_at_point(oa, ob, tol) => out.points.push((a, b)),
                None => {}
            }
        }
    }
    out.joints.sort_by_key(|j| (j.a, j.b));
    out.points.sort_unstable();
    out
}

/// The boundary two pieces share, if it has positive length (`bits` is scratch).
fn shared(p: &Outline, q: &Outline, tol: f64, bits: &mut Vec<Bit>) -> Option<Joint> {
    bits.clear();
    for (s, bs) in &p.segs {
        for (t, bt) in &q.segs {
            if near(bs, bt, tol) {
                overlap(s, t, tol, bits);
            }
        }
    }
    if bits.is_empty() {
        return None;
    }
    let (stretches, closed) = stretches(bits, tol);
    Some(Joint {
        a: 0,
        b: 0,
        length: bits.iter().map(|b| b.2).sum(),
        stretches,
        closed,
        marks: bits.iter().map(|b| b.3).collect(),
    })
}

/// A shared piece of boundary: from, to, length and its middle point.
type Bit = (Pt, Pt, f64, Pt);

/// Appends the stretches that segments `s` and `t` share.
fn overlap(s: &Seg, t: &Seg, tol: f64, out: &mut Vec<Bit>) {
    match (*s, *t) {
        (Seg::Line(p, q), Seg::Line(r, w)) => {
            let len = p.dist(q);
            if len <= tol {
                return;
            }
            let d = q.sub(p).scale(1.0 / len);
            if d.cross(r.sub(p)).abs() > tol || d.cross(w.sub(p)).abs() > tol {
                return;
            }
            let (tr, tw) = (dot(d, r.sub(p)), dot(d, w.sub(p)));
            let lo = tr.min(tw).max(0.0);
            let hi = tr.max(tw).min(len);
            if hi - lo > tol {
                let mid = p.add(d.scale(0.5 * (lo + hi)));
                out.push((p.add(d.scale(lo)), p.add(d.scale(hi)), hi - lo, mid));
            }
        }
        (
            Seg::Arc {
                c: c1,
                r: r1,
                a0: s0,
                a1: s1,
            },
            Seg::Arc {
                c: c2,
                r: r2,
                a0: t0,
                a1: t1,
            },
        ) => {
            if c1.dist(c2) > tol || (r1 - r2).abs() > tol {
                return;
            }
            let (lo1, hi1) = (s0.min(s1), s0.max(s1));
            let (lo2, hi2) = (t0.min(t1), t0.max(t1));
            // Bring the second sweep next to the first, then try one turn either side.
            let k = ((lo1 - lo2) / TAU).round();
            if !k.is_finite() || k.abs() > 1e6 {
                return;
            }
            for turn in [-1.0, 0.0, 1.0] {
                let shift = (k + turn) * TAU;
                let lo = lo1.max(lo2 + shift);
                let hi = hi1.min(hi2 + shift);
                if r1 * (hi - lo) > tol {
                    let at = |a: f64| c1.add(Pt::new(r1 * a.cos(), r1 * a.sin()));
                    out.push((at(lo), at(hi), r1 * (hi - lo), at(0.5 * (lo + hi))));
                }
            }
        }
        _ => {}
    }
}

/// Counts the separate stretches among the shared pieces (pieces meeting end to end
/// form one stretch), and says whether they close into a loop (no free end).
fn stretches(bits: &[Bit], tol: f64) -> (usize, bool) {
    let n = bits.len();
    let mut parent: Vec<usize> = (0..n).collect();
    fn root(parent: &mut [usize], mut i: usize) -> usize {
        while parent[i] != i {
            parent[i] = parent[parent[i]];
            i = parent[i];
        }
        i
    }
    let ends = |i: usize| [bits[i].0, bits[i].1];
    let mut free_ends = 0;
    for (i, bit) in bits.iter().enumerate() {
        for e in [bit.0, bit.1] {
            let mut matched = false;
            for j in (0..n).filter(|&j| j != i) {
                if ends(j).iter().any(|f| f.dist(e) <= tol) {
                    matched = true;
                    let (ri, rj) = (root(&mut parent, i), root(&mut parent, j));
                    parent[ri] = rj;
                }
            }
            // A full circle shared as one piece closes on itself.
            if !matched && bit.0.dist(bit.1) > tol {
                free_ends += 1;
            }
        }
    }
    let groups = (0..n).filter(|&i| root(&mut parent, i) == i).count();
    (groups, free_ends == 0)
}

/// Does a vertex of either piece lie on the other's boundary? A segment whose box,
/// widened by twice `tol`, leaves the vertex out is farther than `tol` from it.
fn touch_at_point(p: &Outline, q: &Outline, tol: f64) -> bool {
    let on = |a: &Outline, b: &Outline| {
        a.segs.iter().any(|(s, _)| {
            let v = s.start();
            let at = [v.x, v.x, v.y, v.y];
            (b.segs.iter()).any(|(t, bt)| near(bt, &at, 2.0 * tol) && distance(v, t) <= tol)
        })
    };
    on(p, q) || on(q, p)
}

/// Distance from a point to a segment.
fn distance(v: Pt, s: &Seg) -> f64 {
    match *s {
        Seg::Line(a, b) => v.dist_to_segment(a, b),
        Seg::Arc { c, r, a0, a1 } => {
            let ang = (v.y - c.y).atan2(v.x - c.x);
            let (lo, hi) = (a0.min(a1), a0.max(a1));
            let k = ((lo - ang) / TAU).ceil();
            if ang + k * TAU <= hi {
                (v.dist(c) - r).abs()
            } else {
                v.dist(s.start()).min(v.dist(s.end()))
            }
        }
    }
}

fn dot(a: Pt, b: Pt) -> f64 {
    a.x * b.x + a.y * b.y
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::geom::Contour;

    fn rect(name: &str, x0: f64, y0: f64, x1: f64, y1: f64) -> Piece {
        Piece::plain(
            name,
            vec![Contour::rounded_rect(x0, y0, x1, y1, 0.0)],
            false,
        )
    }

    #[test]
    fn flange_on_web_shares_the_web_width() {
        // A 10 wide web under a 100 wide flange: they share the web's top edge, 10 long.
        let c = contacts(&[
            rect("w", -5.0, 0.0, 5.0, 50.0),
            rect("f", -50.0, 50.0, 50.0, 60.0),
        ]);
        assert_eq!(c.joints.len(), 1);
        let j = &c.joints[0];
        assert_eq!((j.a, j.b), (0, 1));
        assert!((j.length - 10.0).abs() < 1e-12);
        assert!(j.is_single_open());
        // Marked at the middle of the shared edge, (0, 50).
        assert_eq!(j.marks.len(), 1);
        assert!(j.marks[0].dist(Pt::new(0.0, 50.0)) < 1e-12, "{:?}", j.marks);
        assert!(c.points.is_empty());
    }

    #[test]
    fn corner_contact_is_a_point() {
        let c = contacts(&[rect("a", 0.0, 0.0, 1.0, 1.0), rect("b", 1.0, 1.0, 2.0, 2.0)]);
        assert!(c.joints.is_empty());
        assert_eq!(c.points, vec![(0, 1)]);
    }

    #[test]
    fn vertex_on_an_edge_is_a_point_contact_one_just_clear_is_none() {
        // A square standing on its corner at the middle of a plate's top edge touches
        // it at (5, 1); lifted by 10 joint tolerances it touches
        // nothing (the section is 10 wide).
        let diamond = |lift: f64| {
            Piece::plain(
                "d",
                vec![Contour::polygon(&[
                    Pt::new(5.0, 1.0 + lift),
                    Pt::new(6.0, 2.0 + lift),
                    Pt::new(5.0, 3.0 + lift),
                    Pt::new(4.0, 2.0 + lift),
                ])],
                false,
            )
        };
        let plate = rect("p", 0.0, 0.0, 10.0, 1.0);
        let c = contacts(&[plate.clone(), diamond(0.0)]);
        assert!(c.joints.is_empty());
        assert_eq!(c.points, vec![(0, 1)]);
        let c = contacts(&[plate, diamond(10.0 * JOINT_TOL * 10.0)]);
        assert!(c.joints.is_empty() && c.points.is_empty(), "{c:?}");
    }

    #[test]
    fn core_in_a_tube_shares_a_closed_circle() {
        // Circumference of the shared circle: 2πr = 2π·5.
        let tube = Piece::plain(
            "tube",
            vec![
                Contour::circle(Pt::new(0.0, 0.0), 6.0),
                Contour::circle(Pt::new(0.0, 0.0), 5.0).reversed(),
            ],
            false,
        );
        let core = Piece::plain("core", vec![Contour::circle(Pt::new(0.0, 0.0), 5.0)], false);
        let c = contacts(&[tube, core]);
        assert_eq!(c.joints.len(), 1);
        assert!((c.joints[0].length - TAU * 5.0).abs() < 1e-9);
        assert!(c.joints[0].closed);
    }

    #[test]
    fn plate_closing_a_channel_shares_two_stretches() {
        // Channel of plates as one polygon, open at the top; a lid on both flange tips.
        let ch = Piece::plain(
            "ch",
            vec![Contour::polygon(&[
                Pt::new(0.0, 0.0),
                Pt::new(10.0, 0.0),
                Pt::new(10.0, 10.0),
                Pt::new(9.0, 10.0),
                Pt::new(9.0, 1.0),
                Pt::new(1.0, 1.0),
                Pt::new(1.0, 10.0),
                Pt::new(0.0, 10.0),
            ])],
            false,
        );
        let c = contacts(&[ch, rect("lid", 0.0, 10.0, 10.0, 11.0)]);
        assert_eq!(c.joints[0].stretches, 2);
        assert!((c.joints[0].length - 2.0).abs() < 1e-12);
        assert!(!c.joints[0].is_single_open());
    }
}
