//! Warnings about how parts sit together: solids that overlap (and so count twice),
//! voids that are not wholly inside solid material, voids that overlap each other, and
//! parts with no area.
//!
//! The area shared by two regions P and Q is found with Green's theorem, `A = ∮ x dy`
//! over the boundary of P ∩ Q, which is made of the pieces of ∂P inside Q and of ∂Q
//! inside P (edges the two share in the same direction are counted once). The edges are
//! the boundaries' own straight lines and circular arcs, cut exactly where they meet
//! ([`crate::geom::meet`]), so the area is exact to rounding. The edges of Q that may
//! cut an edge of P come from a sort and sweep over the edges' boxes, and a run of P's
//! edges away from ∂Q is placed inside or outside Q once, so a pair costs about
//! `n log n` in its edges rather than `n²`.

use crate::geom::contour::union_bounds;
use crate::geom::meet::{self, Edge};
use crate::geom::moments::FirstMoments;
use crate::geom::{BoundaryIntegral, Piece};
use crate::geom::{Pt, Seg};
use crate::model::warning::{More, Warning};
use std::cell::OnceCell;

/// Warnings of one kind shown in full; the rest are counted in one line.
pub const SHOWN: usize = 20;

/// A region by its boundary segments (outlines counter-clockwise, holes clockwise).
struct Shape<'a> {
    piece: &'a Piece,
    /// Every edge of every loop in loop order, arcs in quarter turns at most.
    edges: Vec<Edge>,
    /// Whether each edge starts its loop (its start does not continue the edge before).
    first: Vec<bool>,
    /// `∮ x dy` along each whole edge (`Edge::x_dy(0, 1)`), the area its sum.
    whole: Vec<f64>,
    bounds: [f64; 4],
    area: f64,
    /// A point inside and its distance to the boundary (> 0), when the centroid is one;
    /// found the first time it is asked for ([`Shape::core`]).
    core: OnceCell<Option<(Pt, f64)>>,
}

impl<'a> Shape<'a> {
    fn of(p: &'a Piece) -> Option<Shape<'a>> {
        // Room for a line an edge and an arc four (a full turn in quarters).
        let room: usize = (p.contours.iter().flat_map(|c| &c.segs))
            .map(|s| if matches!(s, Seg::Arc { .. }) { 4 } else { 1 })
            .sum();
        let (mut edges, mut first) = (Vec::with_capacity(room), Vec::with_capacity(room));
        // `Piece::bounds`: a segment kept whole as one edge has that edge's box (the same
        // ends and extreme points), an arc cut in several its own.
        let mut bounds: Option<[f64; 4]> = None;
        for c in &p.contours {
            let n = edges.len();
            for s in &c.segs {
                let m = edges.len();
                Edge::split(s, &mut edges);
                // An arc cut in several: its ends are the first piece's start and the
                // last one's end (the same angles, a finite sweep).
                let b = if edges.len() == m + 1 {
                    edges[m].bbox
                } else {
                    s.bounds_between(edges[m].from, edges[edges.len() - 1].to)
                };
                bounds = Some(bounds.map_or(b, |u| union_bounds(u, b)));
            }
            first.extend((n..edges.len()).map(|k| k == n));
        }
        let bounds = bounds?;
        // `Edge::x_dy(0, 1)` of each edge; a piece of an arc starts where the one before
        // ends (`Edge::split`), its sines found there.
        let mut arc_end: Option<[f64; 3]> = None;
        let whole: Vec<f64> = (edges.iter())
            .map(|e| {
                let start = e.x_dy_end_or(0.0, arc_end);
                let end = e.x_dy_end(1.0);
                arc_end = matches!(e.seg, Seg::Arc { .. }).then_some(end);
                e.x_dy_between(start, end)
            })
            .collect();
        let area = whole.iter().sum();
        Some(Shape {
            piece: p,
            edges,
            first,
            whole,
            bounds,
            area,
            core: OnceCell::new(),
        })
    }

    /// A point inside and its distance to the boundary (> 0): the centroid, when it is
    /// inside.
    fn core(&self) -> Option<(Pt, f64)> {
        *self.core.get_or_init(|| {
            // The first moments alone: the centroid of the full moments, bit for bit.
            let c = FirstMoments::of_contours(&self.piece.contours).centroid()?;
            let r = self.clearance(c);
            (self.winding(c) > 0 && r > 0.0).then_some((c, r))
        })
    }

    /// Distance from `p` to the nearest edge.
    fn clearance(&self, p: Pt) -> f64 {
        self.edges
            .iter()
            .map(|e| e.dist(p))
            .fold(f64::INFINITY, f64::min)
    }

    /// A lower bound on the area shared with `q` from the cores: a disc about one's
    /// core point clear of both boundaries lies in both (0 when neither core helps).
    fn shared_at_least(&self, q: &Shape) -> f64 {
        [(self, q), (q, self)]
            .iter()
            .filter_map(|(a, b)| {
                let (c, r) = a.core()?;
                (b.winding(c) > 0).then(|| {
                    let rr = r.min(b.clearance(c));
                    std::f64::consts::PI * rr * rr
                })
            })
            .fold(0.0, f64::max)
    }

    /// Winding number of the region about `p` (outline +1, hole −1), `p` off ∂.
    fn winding(&self, p: Pt) -> i32 {
        meet::winding(&self.edges, p)
    }

    /// The direction of travel of the first of the edges `near` (indices in edge
    /// order, every edge within `tol` of `p` among them) that `p` lies on, if any
    /// (within `tol`).
    fn edge_at(&self, near: &[u32], p: Pt, tol: f64) -> Option<Pt> {
        near.iter().find_map(|&i| {
            let e = &self.edges[i as usize];
            let (t, q) = e.nearest(p);
            let d = e.tangent(t);
            (d != Pt::default() && q.dist(p) <= tol).then_some(d)
        })
    }
}

/// Buffers reused from one pair of shapes to the next.
#[derive(Default)]
struct Scratch {
    pairs: Vec<(u32, u32)>,
    p_by_x: Vec<(f64, u32)>,
    q_by_x: Vec<(f64, u32)>,
    active_p: Vec<u32>,
    active_q: Vec<u32>,
    near: Vec<u32>,
    ts: Vec<f64>,
}

/// Into `w.pairs`: the pairs `(i, j)` of an edge of `p` and an edge of `q` whose boxes,
/// `p`'s widened by `tol`, meet — by sort and sweep along x over both sets — sorted by
/// `i`, then `j`. Every edge of `q` that an edge of `p` crosses, touches or runs along
/// within `tol` is among its pairs.
fn edge_pairs(p: &Shape, q: &Shape, tol: f64, w: &mut Scratch) {
    w.pairs.clear();
    w.active_p.clear();
    w.active_q.clear();
    let pe = |k: u32| &p.edges[k as usize].bbox;
    let qe = |k: u32| &q.edges[k as usize].bbox;
    let meet = |a: &[f64; 4], b: &[f64; 4]| {
        a[0] - tol <= b[1] && b[0] <= a[1] + tol && a[2] - tol <= b[3] && b[2] <= a[3] + tol
    };
    // Only edges whose boxes meet the other shape's box (widened by `tol`) can be in a
    // pair.
    let near = |b: [f64; 4]| {
        move |e: &[f64; 4]| {
            e[0] - tol <= b[1] && b[0] <= e[1] + tol && e[2] - tol <= b[3] && b[2] <= e[3] + tol
        }
    };
    let (near_q, near_p) = (near(q.bounds), near(p.bounds));
    // Those edges by the left ends of their boxes, sorted on (key, index) pairs.
    let by_x = |s: &Shape, near: &dyn Fn(&[f64; 4]) -> bool, keyed: &mut Vec<(f64, u32)>| {
        keyed.clear();
        keyed.extend(
            (s.edges.iter().enumerate())
                .filter(|(_, e)| near(&e.bbox))
                .map(|(i, e)| (e.bbox[0], i as u32)),
        );
        keyed.sort_unstable_by(|a, b| a.0.total_cmp(&b.0));
    };
    by_x(p, &near_q, &mut w.p_by_x);
    if w.p_by_x.is_empty() {
        return;
    }
    by_x(q, &near_p, &mut w.q_by_x);
    if w.q_by_x.is_empty() {
        return;
    }
    let (p_by_x, q_by_x) = (&w.p_by_x, &w.q_by_x);
    let (active_p, active_q, pairs) = (&mut w.active_p, &mut w.active_q, &mut w.pairs);
    let (mut i, mut j) = (0, 0);
    while i < p_by_x.len() || j < q_by_x.len() {
        let take_p = j == q_by_x.len()
            || (i < p_by_x.len() && pe(p_by_x[i].1)[0] - tol <= qe(q_by_x[j].1)[0]);
        if take_p {
            let e = p_by_x[i].1;
            i += 1;
            let x0 = pe(e)[0] - tol;
            active_q.retain(|&f| qe(f)[1] >= x0);
            pairs.extend(
                active_q
                    .iter()
                    .filter(|&&f| meet(pe(e), qe(f)))
                    .map(|&f| (e, f)),
            );
            active_p.push(e);
        } else {
            let f = q_by_x[j].1;
            j += 1;
            let x0 = qe(f)[0];
            active_p.retain(|&e| pe(e)[1] + tol >= x0);
            pairs.extend(
                active_p
                    .iter()
                    .filter(|&&e| meet(pe(e), qe(f)))
                    .map(|&e| (e, f)),
            );
            active_q.push(f);
        }
    }
    pairs.sort_unstable();
}

fn boxes_overlap(a: [f64; 4], b: [f64; 4]) -> bool {
    a[0] < b[1] && b[0] < a[1] && a[2] < b[3] && b[2] < a[3]
}

/// `∮ x dy` over the pieces of ∂P inside Q; pieces along ∂Q count only if `shared`
/// and running the same way.
///
/// Each edge of P is cut where edges of Q (the candidates of [`edge_pairs`]) cross or
/// touch it ([`Edge::cuts`]), and each piece is classified by its midpoint: on ∂Q
/// (within `tol`) or by Q's winding number. An edge with no candidate is away from ∂Q,
/// so it lies on the same side as the end of the piece before it in its loop: a run of
/// such edges is classified once.
fn boundary_inside(p: &Shape, q: &Shape, shared: bool, tol: f64, w: &mut Scratch) -> f64 {
    let mut sum = 0.0;
    // An edge wholly outside Q's box (widened by `tol`) is neither inside Q nor on ∂Q.
    let qb = [
        q.bounds[0] - tol,
        q.bounds[1] + tol,
        q.bounds[2] - tol,
        q.bounds[3] + tol,
    ];
    edge_pairs(p, q, tol, w);
    let (pairs, near, ts) = (&w.pairs, &mut w.near, &mut w.ts);
    let mut next_pair = 0;
    // Whether the end of the last piece is inside Q, when known and off ∂Q.
    let mut side: Option<bool> = None;
    for (k, edge) in p.edges.iter().enumerate() {
        near.clear();
        while let Some(&(e, f)) = pairs.get(next_pair).filter(|pr| pr.0 as usize == k) {
            debug_assert_eq!(e as usize, k);
            near.push(f);
            next_pair += 1;
        }
        if p.first[k] {
            side = None;
        }
        let b = edge.bbox;
        if b[1] < qb[0] || b[0] > qb[1] || b[3] < qb[2] || b[2] > qb[3] {
            side = Some(false);
            continue;
        }
        // Away from ∂Q after a piece whose side is known: the whole edge is one piece on
        // that side (the same sum as the general case below, which it skips).
        if let (true, Some(inside)) = (near.is_empty(), side) {
            if inside {
                sum += p.whole[k];
            }
            continue;
        }
        ts.clear();
        ts.extend([0.0, 1.0]);
        for &f in near.iter() {
            edge.cuts(&q.edges[f as usize], tol, ts);
        }
        ts.sort_by(f64::total_cmp);
        // The `Edge::x_dy_end` of the end of the last piece kept, shared with the next
        // piece when it starts there.
        let mut last_end: Option<(f64, [f64; 3])> = None;
        for w in ts.windows(2) {
            if w[1] - w[0] <= 1e-12 {
                continue;
            }
            let t = 0.5 * (w[0] + w[1]);
            let mid = edge.at(t);
            let keep = match q.edge_at(near, mid, tol) {
                Some(dir) => {
                    side = None;
                    let d = edge.tangent(t);
                    shared && dir.x * d.x + dir.y * d.y > 0.0
                }
                None => {
                    let inside = match side.filter(|_| near.is_empty()) {
                        Some(known) => known,
                        None => q.winding(mid) > 0,
                    };
                    side = Some(inside);
                    inside
                }
            };
            if keep {
                // A piece that is the whole edge (from +0 to 1) has its sum already.
                sum += if w[0].to_bits() == 0 && w[1] == 1.0 {
                    p.whole[k]
                } else {
                    let start = match last_end {
                        Some((t, e)) if t.to_bits() == w[0].to_bits() => e,
                        _ => edge.x_dy_end(w[0]),
                    };
                    let end = edge.x_dy_end(w[1]);
                    last_end = Some((w[1], end));
                    edge.x_dy_between(start, end)
                };
            }
        }
    }
    sum
}

/// Area common to two regions.
fn common_area(p: &Shape, q: &Shape, w: &mut Scratch) -> f64 {
    if !boxes_overlap(p.bounds, q.bounds) {
        return 0.0;
    }
    let size = (p.bounds[1] - p.bounds[0])
        .max(p.bounds[3] - p.bounds[2])
        .max(q.bounds[1] - q.bounds[0])
        .max(q.bounds[3] - q.bounds[2]);
    let tol = meet::tolerance(size);
    boundary_inside(p, q, true, tol, w) + boundary_inside(q, p, false, tol, w)
}

/// Calls `f(i, j)`, `i < j`, for the shapes whose boxes overlap, by sort and sweep
/// along the axis on which the parts are most spread out (a stack of plates is swept
/// vertically): about `n log n` plus the pairs found, in no particular order.
fn box_pairs(shapes: &[Option<Shape>], mut f: impl FnMut(usize, usize)) {
    let boxes: Vec<(usize, [f64; 4])> = shapes
        .iter()
        .enumerate()
        .filter_map(|(i, s)| s.as_ref().map(|s| (i, s.bounds)))
        .collect();
    let spread = |lo: usize| {
        let (min, max) = boxes.iter().fold((f64::MAX, f64::MIN), |(a, b), (_, x)| {
            (a.min(x[lo]), b.max(x[lo + 1]))
        });
        let sizes: f64 = boxes.iter().map(|(_, x)| x[lo + 1] - x[lo]).sum();
        (max - min) / sizes.max(f64::MIN_POSITIVE)
    };
    let lo = if spread(2) > spread(0) { 2 } else { 0 };
    let mut order = boxes;
    order.sort_by(|a, b| a.1[lo].total_cmp(&b.1[lo]));
    for (k, (i, a)) in order.iter().enumerate() {
        for (j, b) in &order[k + 1..] {
            if b[lo] >= a[lo + 1] {
                break;
            }
            if boxes_overlap(*a, *b) {
                f((*i).min(*j), (*i).max(*j));
            }
        }
    }
}

/// Whether two shapes share more than the warning's threshold of area: the cores
/// decide most pairs at once, the exact common area the rest.
fn overlaps(a: &Shape, b: &Shape, w: &mut Scratch) -> bool {
    let threshold = 1e-6 * a.area.min(b.area);
    a.shared_at_least(b) > threshold || common_area(a, b, w) > threshold
}

/// The first [`SHOWN`] of `lines`, then one counting the rest.
fn capped(out: &mut Vec<Warning>, lines: Vec<Warning>, total: usize, kind: More) {
    out.extend(lines.into_iter().take(SHOWN));
    if total > SHOWN {
        out.push(Warning::More {
            count: total - SHOWN,
            kind,
        });
    }
}

/// Warnings about the arrangement of the pieces; of each kind the first [`SHOWN`] in
/// the order of the parts, then a count of the rest.
pub fn warnings(pieces: &[Piece]) -> Vec<Warning> {
    let shapes: Vec<Option<Shape>> = pieces.iter().map(Shape::of).collect();
    let total: f64 = shapes.iter().flatten().map(|s| s.area.abs()).sum();
    let mut out = Vec::new();
    let empty: Vec<usize> = (0..pieces.len())
        .filter(|&i| {
            shapes[i]
                .as_ref()
                .is_none_or(|s| s.area.abs() <= 1e-12 * total)
        })
        .collect();
    let lines = empty
        .iter()
        .take(SHOWN)
        .map(|&i| Warning::NoArea {
            part: pieces[i].name.clone(),
        })
        .collect();
    capped(&mut out, lines, empty.len(), More::PartsWithNoArea);
    // The overlapping pairs: all counted, the first SHOWN (by part order) kept.
    let mut w = Scratch::default();
    let mut first = std::collections::BinaryHeap::new();
    let mut count = 0usize;
    box_pairs(&shapes, |i, j| {
        let (Some(a), Some(b)) = (&shapes[i], &shapes[j]) else {
            return;
        };
        if pieces[i].void != pieces[j].void || !overlaps(a, b, &mut w) {
            return;
        }
        count += 1;
        first.push((i, j));
        if first.len() > SHOWN {
            first.pop();
        }
    });
    let lines = first
        .into_sorted_vec()
        .into_iter()
        .filter_map(|(i, j)| {
            let (a, b) = (shapes[i].as_ref()?, shapes[j].as_ref()?);
            let common = common_area(a, b, &mut w).max(a.shared_at_least(b));
            let pct = 100.0 * common / a.area.min(b.area);
            let (pi, pj) = (&pieces[i], &pieces[j]);
            let (a, b, percent) = (pi.name.clone(), pj.name.clone(), pct);
            Some(if pi.void {
                Warning::VoidsOverlap { a, b, percent }
            } else {
                Warning::SolidsOverlap { a, b, percent }
            })
        })
        .collect();
    capped(&mut out, lines, count, More::Overlaps);
    let solids: Vec<&Shape> = pieces
        .iter()
        .zip(&shapes)
        .filter(|(p, _)| !p.void)
        .filter_map(|(_, s)| s.as_ref())
        .collect();
    let mut outside = Vec::new();
    let mut count = 0usize;
    for (i, v) in pieces.iter().enumerate().filter(|(_, p)| p.void) {
        let Some(vs) = &shapes[i] else { continue };
        let inside: f64 = solids.iter().map(|s| common_area(vs, s, &mut w)).sum();
        if inside < (1.0 - 1e-6) * vs.area {
            count += 1;
            if outside.len() < SHOWN {
                let pct = 100.0 * (1.0 - inside / vs.area);
                outside.push(Warning::VoidOutside {
                    void: v.name.clone(),
                    percent: pct,
                });
            }
        }
    }
    capped(&mut out, outside, count, More::VoidsOutside);
    out
}

#[cfg(test)]
mod tests {
    /// The warnings in words (as every view prints them).
    fn worded(pieces: &[Piece]) -> Vec<String> {
        warnings(pieces).iter().map(ToString::to_string).collect()
    }

    use super::*;
    use crate::geom::Contour;

    fn piece(name: &str, c: Contour, void: bool) -> Piece {
        Piece::plain(name, vec![c], void)
    }

    #[test]
    fn touching_plates_do_not_warn_overlapping_ones_do() {
        let web = piece(
            "web",
            Contour::rounded_rect(-5.0, 0.0, 5.0, 100.0, 0.0),
            false,
        );
        let flange = piece(
            "flange",
            Contour::rounded_rect(-50.0, 100.0, 50.0, 110.0, 0.0),
            false,
        );
        assert!(warnings(&[web.clone(), flange]).is_empty());
        let low = piece(
            "low flange",
            Contour::rounded_rect(-50.0, 95.0, 50.0, 105.0, 0.0),
            false,
        );
        let w = worded(&[web, low]);
        assert_eq!(w.len(), 1);
        assert!(w[0].contains("`web` and `low flange` overlap"), "{w:?}");
    }

    #[test]
    fn hole_inside_passes_hole_at_edge_and_outside_warn() {
        let plate = piece(
            "plate",
            Contour::rounded_rect(0.0, 0.0, 100.0, 100.0, 0.0),
            false,
        );
        let inside = piece(
            "bolt hole",
            Contour::circle(Pt::new(50.0, 50.0), 10.0),
            true,
        );
        assert!(warnings(&[plate.clone(), inside]).is_empty());
        // A notch flush with the edge is still wholly inside the plate.
        let notch = piece(
            "notch",
            Contour::rounded_rect(0.0, 0.0, 20.0, 20.0, 0.0),
            true,
        );
        assert!(warnings(&[plate.clone(), notch]).is_empty());
        let stray = piece(
            "stray",
            Contour::rounded_rect(90.0, 40.0, 110.0, 60.0, 0.0),
            true,
        );
        let w = worded(&[plate, stray]);
        assert!(
            w.len() == 1 && w[0].contains("50.0% of it lies outside"),
            "{w:?}"
        );
    }

    #[test]
    fn a_part_minus_itself_is_inside() {
        let c = Contour::circle(Pt::new(0.0, 0.0), 25.0);
        let w = worded(&[piece("bar", c.clone(), false), piece("same", c, true)]);
        assert!(w.is_empty(), "{w:?}");
    }

    #[test]
    fn sweep_finds_the_same_pairs_as_brute_force() {
        // Random boxes from a small linear congruential generator (Knuth's MMIX
        // constants); the reference is the plain check of every pair.
        let mut seed = 12345u64;
        let mut next = || {
            seed = seed
                .wrapping_mul(6364136223846793005)
                .wrapping_add(1442695040888963407);
            (seed >> 11) as f64 / (1u64 << 53) as f64
        };
        for round in 0..20 {
            let n = 5 + round * 7;
            let pieces: Vec<Piece> = (0..n)
                .map(|_| {
                    let (x, y) = (100.0 * next(), 100.0 * next());
                    let (w, h) = (1.0 + 30.0 * next(), 1.0 + 30.0 * next());
                    piece("box", Contour::rounded_rect(x, y, x + w, y + h, 0.0), false)
                })
                .collect();
            let shapes: Vec<Option<Shape>> = pieces.iter().map(Shape::of).collect();
            let mut swept = Vec::new();
            box_pairs(&shapes, |i, j| swept.push((i, j)));
            swept.sort_unstable();
            let mut brute = Vec::new();
            for i in 0..n {
                for j in i + 1..n {
                    let (a, b) = (shapes[i].as_ref().unwrap(), shapes[j].as_ref().unwrap());
                    if boxes_overlap(a.bounds, b.bounds) {
                        brute.push((i, j));
                    }
                }
            }
            assert_eq!(swept, brute, "round {round}");
        }
    }

    #[test]
    fn many_overlaps_are_counted_past_the_first_ones() {
        // 30 identical plates: 435 pairs, SHOWN of them named, the rest counted.
        let plates: Vec<Piece> = (0..30)
            .map(|k| {
                piece(
                    &format!("plate {k}"),
                    Contour::rounded_rect(0.0, 0.0, 10.0, 10.0, 0.0),
                    false,
                )
            })
            .collect();
        let w = worded(&plates);
        assert_eq!(w.len(), SHOWN + 1, "{w:?}");
        assert!(w[0].contains("`plate 0` and `plate 1` overlap (100% of the smaller)"));
        assert_eq!(
            w[SHOWN],
            format!("… and {} more pairs of parts overlap", 435 - SHOWN)
        );
    }
}
