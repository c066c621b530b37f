//! Longitudinal shear flow across the joints between parts: the weld or bolt demand per
//! unit length of member.
//!
//! Parts are the nodes of a graph and joints ([`crate::geom::joints`]) its edges. A
//! joint that is a *bridge* of that graph (Tarjan, "Depth-first search and linear graph
//! algorithms", SIAM J. Comput. 1972) separates the section in two when cut; the side
//! cut off is then in equilibrium under the change of its bending stresses alone, so
//! (the shear-flow formula of built-up beams, e.g. Gere & Goodno, Mechanics of
//! Materials, "shear flow in built-up beams", generalised to unsymmetric sections)
//!
//! ```text
//! q = |(Vy·Iyy − Vx·Ixy)·Qx + (Vx·Ixx − Vy·Ixy)·Qy| / (Ixx·Iyy − Ixy²)
//! Qx = ∫(y − ȳ) dA,  Qy = ∫(x − x̄) dA   over the side cut off
//! ```
//!
//! with modular ratios and the gross section; it is exact, whatever the stress
//! distribution. Two parts sharing several separate stretches of boundary (a lid on a
//! channel) or a closed loop (a core in a tube) enclose a cell: that joint counts as
//! parallel edges, which are never bridges. Joints on a closed cell are statically
//! indeterminate and get no flow here ([`Flow::ClosedCell`]): their flow is the
//! finite-element flexure solution's boundary flux ([`crate::fe::joint_flow`], read
//! through `Analysis::connection_flow`), given when its estimate meets the tolerance;
//! a shared boundary that closes on itself has no one figure and gets none.
//!
//! Voids: a void belongs to the side whose solid parts contain it. A void that lies in
//! parts on both sides of a joint cuts that joint: no flow is given for it. A void in
//! no solid part leaves every flow out (the section's properties then include material
//! no part carries).

use crate::geom::contour::ArcOffsets;
use crate::geom::joints::{Contacts, Joint};
use crate::geom::moments::FirstMoments;
use crate::geom::simple::winding;
use crate::geom::BoundaryIntegral;
use crate::geom::{Piece, Pt};
use crate::model::Warning;
use crate::props::Centroidal;
use std::cell::OnceCell;

/// The part of the section on one side of a bridge joint, about the section centroid
/// (transformed by modular ratios, voids inside subtracted).
#[derive(Debug, Clone, PartialEq)]
pub struct Cut {
    /// Pieces of the side cut off (indices into the pieces).
    pub side: Vec<usize>,
    /// Transformed area of the side.
    pub area: f64,
    /// Its centroid, in the file frame.
    pub centroid: Pt,
    /// `Qx = ∫(y − ȳ) dA`, `Qy = ∫(x − x̄) dA` over the side.
    pub qx: f64,
    pub qy: f64,
}

/// Whether a joint's flow follows from statics.
#[derive(Debug, Clone, PartialEq)]
pub enum Flow {
    /// The joint separates the section: the side cut off.
    Exact(Cut),
    /// The joint is on a closed cell: statically indeterminate.
    ClosedCell,
    /// A void (piece index) lies across the joint.
    VoidAcross(usize),
    /// A void lies in no solid part, so no side can be told its material.
    StrayVoid(usize),
}

/// One joint with what statics says about it.
#[derive(Debug, Clone, PartialEq)]
pub struct Connection {
    pub joint: Joint,
    pub flow: Flow,
}

impl Connection {
    /// The flow in force per length unit (forces in N give N per file length unit)
    /// under shears `vx`, `vy` on a section with centroidal properties `c`; `None`
    /// unless the joint separates the section.
    pub fn q(&self, c: &Centroidal, vx: f64, vy: f64) -> Option<f64> {
        let Flow::Exact(cut) = &self.flow else {
            return None;
        };
        shear_flow(c, vx, vy, cut.qx, cut.qy)
    }
}

/// `q = |(Vy·Iyy − Vx·Ixy)·Qx + (Vx·Ixx − Vy·Ixy)·Qy| / (Ixx·Iyy − Ixy²)`; `None` when
/// the determinant is not positive.
///
/// ```
/// use kern::checks::shear_flow::shear_flow;
/// use kern::props::Centroidal;
/// // Symmetric section: q = V·Q/I, here 1000·2000/80000 = 25.
/// let c = Centroidal { area: 1.0, cx: 0.0, cy: 0.0, ixx: 8e4, iyy: 3e4, ixy: 0.0 };
/// assert_eq!(shear_flow(&c, 0.0, 1000.0, 2000.0, 0.0), Some(25.0));
/// ```
pub fn shear_flow(c: &Centroidal, vx: f64, vy: f64, qx: f64, qy: f64) -> Option<f64> {
    let det = c.ixx * c.iyy - c.ixy * c.ixy;
    let q = ((vy * c.iyy - vx * c.ixy) * qx + (vx * c.ixx - vy * c.ixy) * qy).abs() / det;
    (det > 0.0 && q.is_finite()).then_some(q)
}

/// Every joint of `contacts` with its flow kind, in the joints' order.
pub fn connections(pieces: &[Piece], contacts: &Contacts, c: &Centroidal) -> Vec<Connection> {
    let joints = &contacts.joints;
    if joints.is_empty() {
        return Vec::new();
    }
    // Edges: a joint of several stretches (or a closed loop) is two parallel edges.
    let mut edges: Vec<(usize, usize, usize)> = Vec::new();
    for (k, j) in joints.iter().enumerate() {
        edges.push((j.a, j.b, k));
        if !j.is_single_open() {
            edges.push((j.a, j.b, k));
        }
    }
    let n = pieces.len();
    let mut adj: Vec<Vec<(usize, usize)>> = vec![Vec::new(); n];
    for (e, &(a, b, _)) in edges.iter().enumerate() {
        adj[a].push((b, e));
        adj[b].push((a, e));
    }
    let bridge = bridges(&adj, edges.len());
    let origin = Pt::new(c.cx, c.cy);
    // The first moments of a part about the centroid, found the first time a side cut
    // off holds it (most parts are on the larger side of every joint).
    let moments: Vec<OnceCell<FirstMoments>> = pieces.iter().map(|_| OnceCell::new()).collect();
    let moment = |i: usize| *moments[i].get_or_init(|| piece_moments(&pieces[i], origin));
    let homes = void_homes(pieces);
    joints
        .iter()
        .enumerate()
        .map(|(k, j)| {
            let e = edges.iter().position(|&(_, _, jk)| jk == k).unwrap_or(0);
            let flow = if !bridge[e] || !j.is_single_open() {
                Flow::ClosedCell
            } else {
                cut_off(&adj, e, j, &moment, &homes, origin)
            };
            Connection {
                joint: j.clone(),
                flow,
            }
        })
        .collect()
}

/// The area and first moments of piece `p` about `origin`, signed and weighted by its
/// modular ratio: each segment shifted by `−origin` as it is integrated (the sums of
/// [`BoundaryIntegral::of_contours`], in its order).
fn piece_moments(p: &Piece, origin: Pt) -> FirstMoments {
    let back = Pt::new(-origin.x, -origin.y);
    let of_contour = |k: &crate::geom::Contour| {
        (k.segs.iter())
            .map(|s| FirstMoments::of_seg(&s.shifted(back)))
            .fold(FirstMoments::default(), |m, o| m.plus(&o, 1.0))
    };
    let all = (p.contours.iter())
        .map(of_contour)
        .fold(FirstMoments::default(), |m, o| m.plus(&o, 1.0));
    FirstMoments::default().plus(&all, p.sign() * p.n)
}

/// The side of bridge edge `e` with fewer parts (the later part's side on a tie), its
/// voids, and its first moments.
fn cut_off(
    adj: &[Vec<(usize, usize)>],
    e: usize,
    j: &Joint,
    moment: &dyn Fn(usize) -> FirstMoments,
    homes: &[(usize, Vec<usize>)],
    origin: Pt,
) -> Flow {
    let reach = |from: usize| {
        let mut seen = vec![false; adj.len()];
        let mut stack = vec![from];
        seen[from] = true;
        while let Some(v) = stack.pop() {
            for &(w, f) in &adj[v] {
                if f != e && !seen[w] {
                    seen[w] = true;
                    stack.push(w);
                }
            }
        }
        seen
    };
    let (sa, sb) = (reach(j.a), reach(j.b));
    let count = |s: &[bool]| s.iter().filter(|&&x| x).count();
    let side = if count(&sa) < count(&sb) { sa } else { sb };
    let mut m = FirstMoments::default();
    for (i, _) in side.iter().enumerate().filter(|(_, &s)| s) {
        m = m.plus(&moment(i), 1.0);
    }
    for (v, inside) in homes {
        if inside.is_empty() {
            return Flow::StrayVoid(*v);
        }
        let on = inside.iter().filter(|&&i| side[i]).count();
        if on == inside.len() {
            m = m.plus(&moment(*v), 1.0);
        } else if on > 0 {
            return Flow::VoidAcross(*v);
        }
    }
    let side: Vec<usize> = (0..side.len()).filter(|&i| side[i]).collect();
    let centroid = if m.a != 0.0 {
        Pt::new(origin.x + m.sx / m.a, origin.y + m.sy / m.a)
    } else {
        origin
    };
    Flow::Exact(Cut {
        side,
        area: m.a,
        centroid,
        qx: m.sy,
        qy: m.sx,
    })
}

/// A solid's outline as closed polygons, each with the range of its points' `y`.
type Loops = Vec<(Vec<Pt>, [f64; 2])>;

/// The winding number of `loops` about `q`: a loop whose points all lie above `q`, or
/// none above it, is not crossed by the ray from `q` (the half-open rule of
/// [`winding`]) and adds nothing.
fn winding_in(loops: &Loops, q: Pt) -> i32 {
    (loops.iter())
        .filter(|(_, y)| q.y >= y[0] && q.y < y[1])
        .map(|(l, _)| winding(std::slice::from_ref(l), q))
        .sum()
}

thread_local! {
    /// The arcs [`void_homes`] has cut into chords on this thread, kept from one section
    /// to the next (a batch's bolt holes and bars recur): the same points as cutting
    /// them afresh.
    static ARCS: std::cell::RefCell<ArcOffsets> = std::cell::RefCell::default();
}

/// For each void, the solid pieces that hold some of it: tested at points just inside
/// the void's boundary (chords of at most 5°, offset inward by 10⁻⁶ of the section's
/// size), against each solid's outline cut into chords of at most 1°. A solid whose box
/// stays clear of the void's (widened by twice that offset) holds none of it and is
/// not tested.
fn void_homes(pieces: &[Piece]) -> Vec<(usize, Vec<usize>)> {
    if !pieces.iter().any(|p| p.void) {
        return Vec::new();
    }
    let bounds: Vec<Option<[f64; 4]>> = pieces.iter().map(Piece::bounds).collect();
    // `geom::solid_bounds`, from the boxes above.
    let size = (pieces.iter().zip(&bounds))
        .filter(|(p, _)| !p.void)
        .filter_map(|(_, b)| *b)
        .reduce(crate::geom::contour::union_bounds)
        .map_or(1.0, |b| (b[1] - b[0]).max(b[3] - b[2]));
    let delta = 1e-6 * size;
    // A solid's outline is cut into chords the first time a void comes near it.
    let solids: Vec<(usize, [f64; 4], OnceCell<Loops>)> = (pieces.iter().zip(&bounds))
        .enumerate()
        .filter(|(_, (p, _))| !p.void)
        .filter_map(|(i, (_, b))| Some((i, (*b)?, OnceCell::new())))
        .collect();
    let facets = |c: &crate::geom::Contour, memo: &mut ArcOffsets| {
        let f = c.facets_in(1f64.to_radians(), memo);
        let y = (f.iter()).fold([f64::INFINITY, f64::NEG_INFINITY], |y, q| {
            [y[0].min(q.y), y[1].max(q.y)]
        });
        (f, y)
    };
    ARCS.with_borrow_mut(|memo| {
        pieces
            .iter()
            .enumerate()
            .filter(|(_, p)| p.void)
            .map(|(v, p)| {
                let rings: Vec<Vec<Pt>> = (p.contours.iter())
                    .map(|c| c.facets_in(5f64.to_radians(), memo))
                    .collect();
                // The probes in order, each made when it is asked for (the first one inside
                // a solid settles it).
                let probes = || {
                    rings.iter().flat_map(|f| {
                        (0..f.len()).filter_map(move |k| {
                            let (a, b) = (f[k], f[(k + 1) % f.len()]);
                            let d = b.sub(a);
                            let len = d.x.hypot(d.y);
                            (len > 0.0).then(|| {
                                let mid = a.add(d.scale(0.5));
                                mid.add(Pt::new(-d.y, d.x).scale(delta / len))
                            })
                        })
                    })
                };
                let reach = bounds[v].map(|b| {
                    let w = 2.0 * delta;
                    [b[0] - w, b[1] + w, b[2] - w, b[3] + w]
                });
                let near = |s: &[f64; 4]| {
                    reach.is_none_or(|v| {
                        s[0] <= v[1] && v[0] <= s[1] && s[2] <= v[3] && v[2] <= s[3]
                    })
                };
                let inside = solids
                    .iter()
                    .filter(|(_, b, _)| near(b))
                    .filter(|(i, _, cell)| {
                        let loops = cell.get_or_init(|| {
                            (pieces[*i].contours.iter())
                                .map(|c| facets(c, memo))
                                .collect()
                        });
                        probes().any(|q| winding_in(loops, q) != 0)
                    })
                    .map(|(i, _, _)| *i)
                    .collect();
                (v, inside)
            })
            .collect()
    })
}

/// Which edges are bridges: an iterative form of Tarjan's low-link search, so that a
/// long chain of parts cannot exhaust the stack. Parallel edges carry their own ids, so
/// only the edge used to arrive is skipped and a doubled edge is never a bridge.
fn bridges(adj: &[Vec<(usize, usize)>], edges: usize) -> Vec<bool> {
    let n = adj.len();
    let mut is_bridge = vec![false; edges];
    let mut disc = vec![usize::MAX; n];
    let mut low = vec![0; n];
    let mut time = 0;
    for root in 0..n {
        if disc[root] != usize::MAX {
            continue;
        }
        // (vertex, edge used to arrive, next neighbour to look at)
        let mut stack = vec![(root, usize::MAX, 0usize)];
        disc[root] = time;
        low[root] = time;
        time += 1;
        while let Some(top) = stack.last_mut() {
            let (v, via) = (top.0, top.1);
            if let Some(&(w, e)) = adj[v].get(top.2) {
                top.2 += 1;
                if e == via {
                    continue;
                }
                if disc[w] == usize::MAX {
                    disc[w] = time;
                    low[w] = time;
                    time += 1;
                    stack.push((w, e, 0));
                } else {
                    low[v] = low[v].min(disc[w]);
                }
            } else {
                stack.pop();
                if let Some(&(u, _, _)) = stack.last() {
                    low[u] = low[u].min(low[v]);
                    if low[v] > disc[u] {
                        is_bridge[via] = true;
                    }
                }
            }
        }
    }
    is_bridge
}

/// Warnings about how the parts are joined: contacts at a point only, parts joined to
/// nothing, and (when a shear force is given) joints a void lies across. Joints on a
/// closed cell are the flexure solution's (`Analysis::cell_flow_notes`).
pub fn warnings(
    pieces: &[Piece],
    contacts: &Contacts,
    conns: &[Connection],
    shear_given: bool,
) -> Vec<Warning> {
    let name = |i: usize| pieces[i].name.clone();
    let mut out = Vec::new();
    if contacts.gave_up {
        out.push(Warning::ConnectionsNotLooked {
            max_pairs: crate::geom::joints::MAX_PAIRS,
        });
        return out;
    }
    for &(a, b) in &contacts.points {
        out.push(Warning::PointContact {
            a: name(a),
            b: name(b),
        });
    }
    let solids: Vec<usize> = (0..pieces.len()).filter(|&i| !pieces[i].void).collect();
    let alone: Vec<usize> = solids
        .iter()
        .copied()
        .filter(|&i| !contacts.joints.iter().any(|j| j.a == i || j.b == i))
        .collect();
    if solids.len() > 1 && alone.len() == solids.len() {
        out.push(Warning::NoSharedBoundary {
            solids: solids.len(),
        });
    } else if solids.len() > 1 && !alone.is_empty() {
        out.push(Warning::PartsAlone {
            parts: alone.iter().map(|&i| name(i)).collect(),
        });
    }
    if !shear_given {
        return out;
    }
    for c in conns {
        let (a, b) = (name(c.joint.a), name(c.joint.b));
        match c.flow {
            Flow::VoidAcross(v) => out.push(Warning::VoidAcrossJoint {
                void: name(v),
                a,
                b,
            }),
            Flow::StrayVoid(v) => out.push(Warning::StrayVoidAtJoint {
                void: name(v),
                a,
                b,
            }),
            _ => {}
        }
    }
    out
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::geom::Contour;

    #[test]
    fn winding_skipping_loops_out_of_range_matches_the_crossing_rule() {
        // A square ring, outline 0..10 counter-clockwise and hole 3..7 clockwise: by the
        // crossing-number rule with a half-open y test (Hormann & Agathos, "The point
        // in polygon problem for arbitrary polygons", 2001) the winding number is 1 in
        // the ring, 0 in the hole and outside, and 0 on the top edge y = 10 but 1 on
        // the bottom edge y = 0 (left of the right side).
        let outline = Contour::rounded_rect(0.0, 0.0, 10.0, 10.0, 0.0);
        let hole = Contour::rounded_rect(3.0, 3.0, 7.0, 7.0, 0.0).reversed();
        let loops: Loops = [outline, hole]
            .iter()
            .map(|c| {
                let f = c.facets(1f64.to_radians());
                let lo = f.iter().map(|p| p.y).fold(f64::INFINITY, f64::min);
                let hi = f.iter().map(|p| p.y).fold(f64::NEG_INFINITY, f64::max);
                (f, [lo, hi])
            })
            .collect();
        for (q, w) in [
            (Pt::new(1.0, 5.0), 1),
            (Pt::new(5.0, 5.0), 0),
            (Pt::new(5.0, 1.0), 1),
            (Pt::new(5.0, -1.0), 0),
            (Pt::new(5.0, 11.0), 0),
            (Pt::new(5.0, 10.0), 0),
            (Pt::new(5.0, 0.0), 1),
            (Pt::new(5.0, f64::NAN), 0),
        ] {
            assert_eq!(winding_in(&loops, q), w, "{q:?}");
        }
    }
}
