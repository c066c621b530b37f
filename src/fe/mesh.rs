//! The region to mesh and its meshes: a quality base triangulation of the union of the
//! solid pieces minus the voids, and nested refinements of it.
//!
//! The base mesh: every piece's boundary, arcs cut into chords of at most
//! [`ARC_FACET`], goes into a constrained Delaunay triangulation as constraint edges
//! (crossing edges of overlapping parts are split where they cross). A triangle belongs
//! to the region when its centroid is inside some solid piece and inside no void
//! (nonzero winding number), so overlapping solids count once; the triangles between
//! constraint edges share that answer, so it is asked once per such patch (at its
//! largest triangle), not per triangle. Only the outline of the
//! region (and interfaces between materials) is then triangulated again and refined,
//! the faces outside it left alone; a region whose thinnest triangle is below
//! [`FEATURE_FLOOR`] of the section, or whose refinement would pass [`BASE_VERTICES`],
//! is refused with a message saying so. Points are added in
//! rings about re-entrant corners (where the warping function is singular), but not
//! where two facets of one arc meet (a fillet or a hole is smooth: the solution is not
//! singular there), then the triangulation is refined to a minimum angle of 20° and a
//! maximum area.
//!
//! Refinement splits every triangle into four through its mid-sides, so each mesh
//! holds the previous one and the element size halves per level. A new node on an edge
//! that lies on a circular arc goes on the arc, so curved boundaries converge with the
//! mesh instead of staying faceted.

use super::grid::{dist2, MixMap, Near, Spans};
use super::p2::shape;
use super::solve::Prolong;
use crate::geom::{Piece, Pt, Seg};
use crate::model::Warning;
use spade::{
    AngleLimit, ConstrainedDelaunayTriangulation, Point2, RefinementParameters, Triangulation,
};
use std::f64::consts::{PI, TAU};

/// Largest angle an arc facet of the base mesh spans (radians); refinement then puts
/// the new nodes on the arc.
pub const ARC_FACET: f64 = PI / 8.0;
/// No arc on this edge.
pub const NO_ARC: u32 = u32::MAX;
/// Straight-edged outlines with more corners than this are simplified for meshing …
const SIMPLIFY_ABOVE: usize = 256;
/// … dropping corners within this fraction of the section's size of the outline …
const SIMPLIFY: f64 = 1e-5;
/// … and, for rough outlines, a wider tolerance until at most this many corners stay.
const MAX_CORNERS: usize = 4000;
/// Features (walls, gaps, tips) thinner than this fraction of the section's size are
/// not meshed: torsion is then not computed, and the message says why.
pub const FEATURE_FLOOR: f64 = 1e-5;
/// Points the quality refinement of the base mesh may add; a section that needs more
/// is past the solver's budget (the base mesh is factored directly).
pub const BASE_VERTICES: usize = 20_000;

/// A circle that boundary edges follow.
#[derive(Debug, Clone, Copy)]
pub struct Arc {
    pub c: Pt,
    pub r: f64,
}

impl Arc {
    /// The point of the circle in the direction of `p` from the centre.
    pub fn project(&self, p: Pt) -> Pt {
        let d = p.sub(self.c);
        let l = d.x.hypot(d.y);
        if l > 0.0 {
            self.c.add(d.scale(self.r / l))
        } else {
            p
        }
    }
}

/// A mesh of 6-node triangles in a local frame (the file frame shifted by `origin`).
#[derive(Debug, Clone)]
pub struct Mesh {
    pub origin: Pt,
    pub nodes: Vec<Pt>,
    /// Corners counter-clockwise, then the mid-sides of edges 0–1, 1–2, 2–0.
    pub elems: Vec<[u32; 6]>,
    /// Modular ratio `E/E_ref` of each element's material (warping normal stresses).
    pub weight: Vec<f64>,
    /// Shear modulus ratio `G/G_ref` of each element's material (the Saint-Venant
    /// shear stresses).
    pub shear: Vec<f64>,
    /// The piece (index into the pieces meshed) each element belongs to: the solid
    /// listed last in its patch of the triangulation. Built with `joints` ([`base`]),
    /// the boundaries two pieces share are mesh edges and each element lies in its own
    /// piece; without, pieces of one material that abut may share a patch and its tag
    /// (only the joint flows read it, and they are asked for only with `joints`).
    pub piece: Vec<u32>,
    /// The arc each element edge lies on, or [`NO_ARC`].
    pub edge_arc: Vec<[u32; 3]>,
    /// Whether the element may be curved (a mid-side off its chord).
    pub curved: Vec<bool>,
    pub arcs: Vec<Arc>,
    /// Connected component of each node.
    pub component: Vec<u32>,
    /// One node per component, where the warping function is held at zero.
    pub pinned: Vec<u32>,
}

/// The base mesh and the warnings its region deserves.
pub struct Base {
    pub mesh: Mesh,
    pub warnings: Vec<Warning>,
    /// Relative error in J and Cw from simplifying long straight-edged outlines.
    pub geometry_error: f64,
}

/// Faceted boundaries of one piece, in the local frame.
struct Outline {
    loops: Vec<Vec<Pt>>,
    /// `[xmin, xmax, ymin, ymax]` of the loops: points outside are outside.
    bounds: [f64; 4],
    void: bool,
    /// `[E/E_ref, G/G_ref]` of the piece.
    n: [f64; 2],
    /// Index of the piece among those meshed.
    piece: u32,
}

impl Outline {
    /// Winding number of the piece's loops about `p` (nonzero: inside).
    fn winding(&self, p: Pt) -> i32 {
        let b = self.bounds;
        if p.x < b[0] || p.x > b[1] || p.y < b[2] || p.y > b[3] {
            return 0;
        }
        crate::geom::simple::winding(&self.loops, p)
    }
}

/// What the region holds at a point: `None` outside, else the ratios `[E/E_ref,
/// G/G_ref]` of the part on top there.
fn classify(outlines: &[Outline], p: Pt) -> Option<[f64; 2]> {
    top(outlines, p).map(|o| o.n)
}

/// The solid piece on top at a point (the one listed last), `None` outside the region.
fn top(outlines: &[Outline], p: Pt) -> Option<&Outline> {
    top_index(outlines, p).map(|i| &outlines[i as usize])
}

/// The index among `outlines` of [`top`].
fn top_index(outlines: &[Outline], p: Pt) -> Option<u32> {
    let mut solid = None;
    for (i, o) in outlines.iter().enumerate() {
        if o.winding(p) != 0 {
            if o.void {
                return None;
            }
            // Later parts lie on top of earlier ones.
            solid = Some(i as u32);
        }
    }
    solid
}

type Cdt = ConstrainedDelaunayTriangulation<Point2<f64>>;

/// Builds the base mesh of the region of `pieces`. `size` scales the largest element
/// area allowed (1 for the default); with `joints` the boundaries pieces share are
/// element edges too.
pub fn base(pieces: &[Piece], size: f64, joints: bool) -> Result<Base, Warning> {
    let bounds = crate::geom::solid_bounds(pieces).ok_or(Warning::NoSolidPart)?;
    if !bounds.iter().all(|v| v.is_finite()) {
        return Err(Warning::ExtentNotFinite);
    }
    let origin = Pt::new(0.5 * (bounds[0] + bounds[1]), 0.5 * (bounds[2] + bounds[3]));
    let span = (bounds[1] - bounds[0]).max(bounds[3] - bounds[2]);
    if span <= 0.0 {
        return Err(Warning::NoExtent);
    }
    let eps = 1e-9 * span;
    let mut simplified = (0usize, 0usize);
    let mut tol = SIMPLIFY * span;
    let mut outlines = Vec::new();
    let mut arcs = Vec::new();
    let mut arc_sweeps = Vec::new();
    let mut chords = Vec::new();
    for (index, p) in pieces.iter().enumerate() {
        let mut loops = Vec::new();
        for c in &p.contours {
            let mut pts: Vec<Pt> = Vec::new();
            for s in &c.segs {
                let s = s.shifted(origin.scale(-1.0));
                let first = pts.len();
                s.facet_points(ARC_FACET, &mut pts);
                if let Seg::Arc { c, r, a0, a1 } = s {
                    if r > eps {
                        let id = arcs.len() as u32;
                        arcs.push(Arc { c, r });
                        arc_sweeps.push((a0.min(a1), a0.max(a1)));
                        let mut ends = pts[first..].to_vec();
                        ends.push(s.end());
                        chords.extend(ends.windows(2).map(|w| (w[0], w[1], id)));
                    }
                }
            }
            pts.dedup_by(|a, b| a.dist(*b) <= eps);
            while pts.len() > 1 && pts[0].dist(pts[pts.len() - 1]) <= eps {
                pts.pop();
            }
            // A traced outline of thousands of straight edges would make thousands of
            // slivers; corners closer than SIMPLIFY·span to the line are left out.
            let straight = c.segs.iter().all(|s| matches!(s, Seg::Line(..)));
            if straight && pts.len() > SIMPLIFY_ABOVE {
                let before = pts.len();
                let mut kept = crate::geom::simple::simplify_closed(&pts, tol);
                // A rough outline keeps too many corners: widen the tolerance (up to
                // 1e-3 of the section) rather than mesh tens of thousands of slivers.
                while kept.len() > MAX_CORNERS && tol < 1e-3 * span {
                    tol *= 4.0;
                    kept = crate::geom::simple::simplify_closed(&pts, tol);
                }
                pts = kept;
                simplified = (simplified.0 + before, simplified.1 + pts.len());
            }
            if pts.len() >= 3 {
                loops.push(pts);
            }
        }
        if !loops.is_empty() {
            let bounds = loops.iter().flatten().fold(
                [
                    f64::INFINITY,
                    f64::NEG_INFINITY,
                    f64::INFINITY,
                    f64::NEG_INFINITY,
                ],
                |b, q| [b[0].min(q.x), b[1].max(q.x), b[2].min(q.y), b[3].max(q.y)],
            );
            outlines.push(Outline {
                loops,
                bounds,
                void: p.void,
                n: [p.n, p.g],
                piece: index as u32,
            });
        }
    }
    if !outlines.iter().any(|o| !o.void) {
        return Err(Warning::NoSolidArea);
    }
    let mut all = Cdt::new();
    let mut snap = Snap::new(eps);
    for o in &outlines {
        for l in &o.loops {
            let handles: Vec<_> = l
                .iter()
                .map(|&p| snap.insert(&mut all, p))
                .collect::<Result<_, _>>()?;
            for i in 0..handles.len() {
                let (a, b) = (handles[i], handles[(i + 1) % handles.len()]);
                if a != b {
                    all.add_constraint_and_split(a, b, |p| p);
                }
            }
        }
    }
    // Only the outline of the region itself (and interfaces between materials or
    // parts) is meshed: edges of one part inside another, or of a void outside every
    // solid, are dropped with the corners only they had.
    let (edges, interfaces) = union_outline(&all, &outlines, joints);
    let mut cdt = Cdt::new();
    let mut snap = Snap::new(eps);
    for (p, q) in edges {
        let (a, b) = (snap.insert(&mut cdt, p)?, snap.insert(&mut cdt, q)?);
        if a != b {
            cdt.add_constraint_and_split(a, b, |p| p);
        }
    }
    let region = region_triangles(&cdt, &outlines);
    let area: f64 = region.iter().map(|t| t.area).sum();
    if area <= 0.0 {
        return Err(Warning::EmptyRegion);
    }
    // The thinnest feature: the smallest altitude of the region's triangles before
    // refinement (a wall, a sliver between an outline and a hole, a needle's tip).
    let pos0: Vec<Pt> = cdt.vertices().map(|v| pt(v.position())).collect();
    let feature = region
        .iter()
        .map(|t| {
            let [a, b, c] = t.v.map(|i| pos0[i]);
            let longest = a.dist(b).max(b.dist(c)).max(c.dist(a));
            2.0 * t.area / longest
        })
        .fold(f64::INFINITY, f64::min);
    if feature < FEATURE_FLOOR * span {
        return Err(Warning::TinyFeature {
            ratio: span / feature,
            feature,
            span,
            floor: FEATURE_FLOOR,
        });
    }
    grade_corners(&mut cdt, &region, &outlines, &chords, eps, &mut snap)?;
    let before_refine = cdt.num_vertices();
    let floor = FEATURE_FLOOR * span;
    let params = RefinementParameters::<f64>::new()
        .with_angle_limit(AngleLimit::from_deg(20.0))
        .with_max_allowed_area(size * area / 60.0)
        .with_min_required_area((area * 1e-12).max(floor * floor))
        .exclude_outer_faces(!interfaces)
        .with_max_additional_vertices(BASE_VERTICES);
    let refined = cdt.refine(params);
    if !refined.refinement_complete && cdt.num_vertices() >= before_refine + BASE_VERTICES {
        return Err(Warning::MeshBudget {
            nodes: before_refine + BASE_VERTICES,
            corners: before_refine,
            ratio: span / feature,
            span,
            budget: BASE_VERTICES,
        });
    }
    let tris = region_triangles(&cdt, &outlines);
    let mut warnings = Vec::new();
    let mut geometry_error = 0.0;
    if simplified.0 > 0 {
        // The region moved by at most `tol` along the simplified edges; J and Cw
        // change by about twice the relative area so moved (conservative).
        let perimeter: f64 = outlines
            .iter()
            .flat_map(|o| o.loops.iter())
            .map(|l| {
                (0..l.len())
                    .map(|i| l[i].dist(l[(i + 1) % l.len()]))
                    .sum::<f64>()
            })
            .sum();
        geometry_error = 2.0 * tol * perimeter / area;
        warnings.push(Warning::MeshSimplified {
            kept: simplified.1,
            corners: simplified.0,
            tol,
        });
    }
    let mut pos: Vec<Pt> = cdt.vertices().map(|v| pt(v.position())).collect();
    snap_to_arcs(&cdt, &mut pos, before_refine, &chords, &arcs, eps);
    let mesh = build(&pos, &tris, origin, arcs, &arc_sweeps, eps);
    if mesh.pinned.len() > 1 {
        warnings.push(Warning::SeparatePieces {
            count: mesh.pinned.len(),
        });
    }
    Ok(Base {
        mesh,
        warnings,
        geometry_error,
    })
}

/// Merges input points closer than `eps` so that parts meeting at a corner share it.
struct Snap {
    grid: Near<spade::handles::FixedVertexHandle>,
}

impl Snap {
    fn new(eps: f64) -> Snap {
        Snap {
            grid: Near::new(eps),
        }
    }

    fn insert(
        &mut self,
        cdt: &mut Cdt,
        p: Pt,
    ) -> Result<spade::handles::FixedVertexHandle, Warning> {
        if let Some(h) = self.grid.find(p) {
            return Ok(h);
        }
        let h = cdt
            .insert(Point2::new(p.x, p.y))
            .map_err(|e| Warning::CannotMesh {
                cause: format!("{e:?}"),
            })?;
        self.grid.insert(p, h);
        Ok(h)
    }
}

/// A triangle of the triangulation that lies in the region.
struct Tri {
    v: [usize; 3],
    /// Whether each edge (0–1, 1–2, 2–0) is a constraint edge.
    constraint: [bool; 3],
    /// `[E/E_ref, G/G_ref]`.
    n: [f64; 2],
    /// The piece on top at the centroid.
    piece: u32,
    area: f64,
}

fn pt(p: Point2<f64>) -> Pt {
    Pt::new(p.x, p.y)
}

fn region_triangles(cdt: &Cdt, outlines: &[Outline]) -> Vec<Tri> {
    let labels = face_labels(cdt, outlines);
    let mut out = Vec::new();
    for f in cdt.inner_faces() {
        if let Some((i, _)) = labels[f.fix().index()] {
            let o = &outlines[i as usize];
            let [a, b, c] = f.positions().map(pt);
            let e = f.adjacent_edges();
            out.push(Tri {
                v: f.vertices().map(|v| v.fix().index()),
                constraint: e.map(|e| cdt.is_constraint_edge(e.as_undirected().fix())),
                n: o.n,
                piece: o.piece,
                area: 0.5 * b.sub(a).cross(c.sub(a)),
            });
        }
    }
    out
}

/// What the region holds in each face of `cdt`, by face index (the outer face `None`),
/// when every outline edge (or at least every edge where the region or its material
/// changes) is a constraint edge: the faces that meet across edges that are not
/// constraints form patches of one classification, so each patch is classified once,
/// at the centroid of its largest triangle (the one least likely to be a sliver whose
/// centroid rounds across a boundary), instead of every triangle by winding numbers.
/// A label is the index of the solid on top ([`top_index`]) and the point classified.
fn face_labels(cdt: &Cdt, outlines: &[Outline]) -> Vec<Option<(u32, Pt)>> {
    let n = cdt.num_all_faces();
    let mut labels = vec![None; n];
    let mut seen = vec![false; n];
    let mut stack = Vec::new();
    let mut patch = Vec::new();
    for f in cdt.inner_faces() {
        if std::mem::replace(&mut seen[f.fix().index()], true) {
            continue;
        }
        stack.push(f);
        patch.clear();
        let mut largest = (f64::NEG_INFINITY, Pt::default());
        while let Some(g) = stack.pop() {
            patch.push(g.fix().index());
            let [a, b, c] = g.positions().map(pt);
            let area = b.sub(a).cross(c.sub(a));
            if area > largest.0 {
                largest = (area, a.add(b).add(c).scale(1.0 / 3.0));
            }
            for e in g.adjacent_edges() {
                if cdt.is_constraint_edge(e.as_undirected().fix()) {
                    continue;
                }
                if let Some(h) = e.rev().face().as_inner() {
                    if !std::mem::replace(&mut seen[h.fix().index()], true) {
                        stack.push(h);
                    }
                }
            }
        }
        let label = top_index(outlines, largest.1).map(|i| (i, largest.1));
        for &i in &patch {
            labels[i] = label;
        }
    }
    labels
}

/// Adds rings of points about every re-entrant corner of the region: at radii
/// ρ/2, ρ/4, … ρ/32 (ρ the shortest boundary edge at the corner), eight per ring, kept
/// where they fall in the region well clear of its boundary. The warping function
/// behaves like r^(π/α) at a corner of interior angle α > π (Grisvard, Elliptic
/// Problems in Nonsmooth Domains, §2.7), so small elements there keep the error small.
/// `tris` are the region's triangles of `cdt` as it is on entry.
fn grade_corners(
    cdt: &mut Cdt,
    tris: &[Tri],
    outlines: &[Outline],
    chords: &[(Pt, Pt, u32)],
    eps: f64,
    snap: &mut Snap,
) -> Result<(), Warning> {
    let nv = cdt.num_vertices();
    let mut angle = vec![0.0; nv];
    let mut shortest = vec![f64::INFINITY; nv];
    let pos: Vec<Pt> = cdt.vertices().map(|v| pt(v.position())).collect();
    for t in tris {
        for k in 0..3 {
            let (a, b, c) = (t.v[k], t.v[(k + 1) % 3], t.v[(k + 2) % 3]);
            let (u, w) = (pos[b].sub(pos[a]), pos[c].sub(pos[a]));
            angle[a] += u.cross(w).atan2(u.x * w.x + u.y * w.y);
            shortest[a] = shortest[a].min(u.x.hypot(u.y)).min(w.x.hypot(w.y));
        }
    }
    let mut ends = ArcEnds::new(eps);
    for &(a, b, id) in chords {
        ends.insert(a, (id, true));
        ends.insert(b, (id, false));
    }
    // A boundary vertex with more than 200° of region about it.
    let corners: Vec<usize> = (0..nv)
        .filter(|&v| {
            angle[v] > PI * 200.0 / 180.0 && angle[v] < TAU - 1e-6 && !inside_arc(&ends, pos[v])
        })
        .collect();
    if corners.len() * 40 > BASE_VERTICES {
        return Err(Warning::TooManyCorners {
            corners: corners.len(),
            budget: BASE_VERTICES,
        });
    }
    let mut extra = Vec::new();
    for v in corners {
        {
            let mut rho = shortest[v] / 2.0;
            for _ in 0..5 {
                for k in 0..8 {
                    let t = TAU * (k as f64 + 0.5) / 8.0;
                    let p = pos[v].add(Pt::new(rho * t.cos(), rho * t.sin()));
                    if classify(outlines, p).is_some() && clear_of(outlines, p, 0.3 * rho) {
                        extra.push(p);
                    }
                }
                rho /= 2.0;
            }
        }
    }
    for p in extra {
        snap.insert(cdt, p)?;
    }
    Ok(())
}

/// Whether `p` joins two facets of the same arc: the boundary there is smooth, and the
/// angle the facets make is not a corner. `ends` holds each facet end with its arc and
/// whether a facet starts there.
fn inside_arc(ends: &ArcEnds, p: Pt) -> bool {
    ends.within(p)
        .any(|(id, start)| !start && ends.within(p).any(|(other, s)| s && other == id))
}

/// Facet ends: the arc and whether a facet starts (`true`) or ends there.
type ArcEnds = Near<(u32, bool)>;

/// The edges of the region's outline, from a triangulation of every part's boundary:
/// the constraint edges with the region on one side only, other materials on its two
/// sides, or (with `joints`) two pieces that abut there (neither holds the other side);
/// and whether any is such an interface inside the region.
fn union_outline(cdt: &Cdt, outlines: &[Outline], joints: bool) -> (Vec<(Pt, Pt)>, bool) {
    let labels = face_labels(cdt, outlines);
    let side = |f: spade::handles::FaceHandle<'_, spade::handles::PossiblyOuterTag, _, _, _, _>| {
        labels[f.fix().index()].map(|(i, g)| (&outlines[i as usize], g))
    };
    let mut edges = Vec::new();
    let mut interfaces = false;
    for e in cdt.undirected_edges() {
        if !cdt.is_constraint_edge(e.fix()) {
            continue;
        }
        let d = e.as_directed();
        let (l, r) = (side(d.face()), side(d.rev().face()));
        let joint = |(p, gp): (&Outline, Pt), (q, gq): (&Outline, Pt)| {
            p.n != q.n || (joints && p.piece != q.piece && p.winding(gq) == 0 && q.winding(gp) == 0)
        };
        let keep = match (l, r) {
            (Some(a), Some(b)) => joint(a, b),
            (None, None) => false,
            _ => true,
        };
        if keep {
            interfaces |= l.is_some() && r.is_some();
            let [p, q] = d.positions().map(pt);
            edges.push((p, q));
        }
    }
    (edges, interfaces)
}

/// Whether every boundary edge of every piece is farther than `min` from `p` (by
/// [`Pt::dist_to_segment`]). An edge, or a whole piece, whose box lies more than `2·min`
/// from `p` along x or y is farther than `min` without the distance being computed (the
/// box's gap is a lower bound of the distance, and both are exact to rounding).
fn clear_of(outlines: &[Outline], p: Pt, min: f64) -> bool {
    let far = 2.0 * min;
    let gap =
        |x0: f64, x1: f64, y0: f64, y1: f64| (x0 - p.x).max(p.x - x1).max(y0 - p.y).max(p.y - y1);
    outlines.iter().all(|o| {
        let b = o.bounds;
        gap(b[0], b[1], b[2], b[3]) > far
            || o.loops.iter().all(|l| {
                l.iter().zip(l.iter().cycle().skip(1)).all(|(&a, &b)| {
                    gap(a.x.min(b.x), a.x.max(b.x), a.y.min(b.y), a.y.max(b.y)) > far
                        || p.dist_to_segment(a, b) > min
                })
            })
    })
}

/// Moves the points that refinement put on an arc's chord (splitting a boundary
/// edge) onto the arc itself, so that every boundary vertex lies on the true boundary.
/// Only points refinement added (index `from` on) move: a corner where an arc's chord
/// crosses another outline stays where the outlines cross.
fn snap_to_arcs(
    cdt: &Cdt,
    pos: &mut [Pt],
    from: usize,
    chords: &[(Pt, Pt, u32)],
    arcs: &[Arc],
    eps: f64,
) {
    let spans = Spans::new(chords.iter().map(|&(a, b, _)| (a.x.min(b.x), a.x.max(b.x))));
    let eps2 = eps * eps;
    for v in cdt.vertices().skip(from) {
        if !v
            .out_edges()
            .any(|e| cdt.is_constraint_edge(e.as_undirected().fix()))
        {
            continue;
        }
        let i = v.fix().index();
        let p = pos[i];
        // The first chord (in their order) that `p` lies on, strictly between its ends.
        let on = spans.near(p.x, eps).filter(|&k| {
            let (a, b, _) = chords[k as usize];
            let ab = b.sub(a);
            let len2 = ab.x * ab.x + ab.y * ab.y;
            if len2 <= 0.0 || dist2(p, a) <= eps2 || dist2(p, b) <= eps2 {
                return false;
            }
            let t = (p.sub(a).x * ab.x + p.sub(a).y * ab.y) / len2;
            let off = ab.cross(p.sub(a));
            t > 0.0 && t < 1.0 && off * off <= eps2 * len2
        });
        if let Some(k) = on.min() {
            if let Some(arc) = arcs.get(chords[k as usize].2 as usize) {
                pos[i] = arc.project(p);
            }
        }
    }
}

/// The arcs of a mesh with their sweeps (`[lo, hi]` radians), found by x.
struct ArcIndex<'a> {
    arcs: &'a [Arc],
    sweeps: &'a [(f64, f64)],
    spans: Spans,
}

impl<'a> ArcIndex<'a> {
    fn new(arcs: &'a [Arc], sweeps: &'a [(f64, f64)]) -> ArcIndex<'a> {
        ArcIndex {
            arcs,
            sweeps,
            spans: Spans::new(arcs.iter().map(|a| (a.c.x - a.r, a.c.x + a.r))),
        }
    }

    /// The index of the first arc that the chord `p`–`q` follows, if any.
    fn arc_of(&self, p: Pt, q: Pt, eps: f64) -> u32 {
        self.spans
            .near(p.x, eps)
            .filter(|&i| follows(&self.arcs[i as usize], self.sweeps[i as usize], p, q, eps))
            .min()
            .unwrap_or(NO_ARC)
    }
}

/// Whether the chord `p`–`q` follows the arc `a` of sweep `(lo, hi)`: both ends on
/// its circle (within `eps`), the chord's mid-direction within the sweep.
fn follows(a: &Arc, (lo, hi): (f64, f64), p: Pt, q: Pt, eps: f64) -> bool {
    let off = |x: Pt| (dist2(x, a.c).sqrt() - a.r).abs();
    if off(p) > eps || off(q) > eps {
        return false;
    }
    // A chord of a facet spans a small angle; its mid-direction must be in the sweep.
    let m = p.add(q).scale(0.5).sub(a.c);
    if m.x * m.x + m.y * m.y < 0.25 * a.r * a.r {
        return false;
    }
    let t = m.y.atan2(m.x);
    (-2..=2).any(|k| {
        let t = t + TAU * k as f64;
        t >= lo && t <= hi
    })
}

/// Turns the region's triangles into 6-node elements, numbers components and pins.
fn build(
    pos: &[Pt],
    tris: &[Tri],
    origin: Pt,
    arcs: Vec<Arc>,
    sweeps: &[(f64, f64)],
    eps: f64,
) -> Mesh {
    // Splitting crossing constraints can leave a vertex a rounding error away from
    // another; such twins are merged and the slivers between them dropped.
    let mut map = vec![u32::MAX; pos.len()];
    // Corners, then a mid-side node per element edge (about 1.5 an element).
    let mut nodes: Vec<Pt> = Vec::with_capacity(pos.len() + 2 * tris.len());
    let mut grid = Near::with_capacity(eps, pos.len());
    for t in tris {
        for &v in &t.v {
            if map[v] != u32::MAX {
                continue;
            }
            let p = pos[v];
            map[v] = grid.find(p).unwrap_or_else(|| {
                nodes.push(p);
                let id = nodes.len() as u32 - 1;
                grid.insert(p, id);
                id
            });
        }
    }
    let tris: Vec<&Tri> = tris
        .iter()
        .filter(|t| {
            let c = t.v.map(|v| map[v]);
            c[0] != c[1] && c[1] != c[2] && c[2] != c[0]
        })
        .collect();
    let index = ArcIndex::new(&arcs, sweeps);
    let mut mids: MixMap<(u32, u32), u32> =
        MixMap::with_capacity_and_hasher(2 * tris.len(), Default::default());
    let mut elems = Vec::with_capacity(tris.len());
    let mut edge_arc = Vec::with_capacity(tris.len());
    let mut curved = Vec::with_capacity(tris.len());
    for t in &tris {
        let c = t.v.map(|v| map[v]);
        let mut e = [c[0], c[1], c[2], 0, 0, 0];
        let mut ea = [NO_ARC; 3];
        for k in 0..3 {
            let (a, b) = (c[k], c[(k + 1) % 3]);
            let (p, q) = (nodes[a as usize], nodes[b as usize]);
            let arc = if t.constraint[k] {
                index.arc_of(p, q, eps)
            } else {
                NO_ARC
            };
            ea[k] = arc;
            let key = (a.min(b), a.max(b));
            let id = *mids.entry(key).or_insert_with(|| {
                let m = p.add(q).scale(0.5);
                nodes.push(arcs.get(arc as usize).map_or(m, |a| a.project(m)));
                nodes.len() as u32 - 1
            });
            e[3 + k] = id;
        }
        elems.push(e);
        edge_arc.push(ea);
        curved.push(ea.iter().any(|&a| a != NO_ARC));
    }
    let (component, pinned) = components(nodes.len(), &elems);
    Mesh {
        origin,
        nodes,
        elems,
        weight: tris.iter().map(|t| t.n[0]).collect(),
        shear: tris.iter().map(|t| t.n[1]).collect(),
        piece: tris.iter().map(|t| t.piece).collect(),
        edge_arc,
        curved,
        arcs,
        component,
        pinned,
    }
}

/// Connected components of the mesh (union–find over element nodes) and the smallest
/// node of each.
fn components(nodes: usize, elems: &[[u32; 6]]) -> (Vec<u32>, Vec<u32>) {
    let mut parent: Vec<u32> = (0..nodes as u32).collect();
    fn root(parent: &mut [u32], mut i: u32) -> u32 {
        while parent[i as usize] != i {
            let g = parent[parent[i as usize] as usize];
            parent[i as usize] = g;
            i = g;
        }
        i
    }
    for e in elems {
        let r0 = root(&mut parent, e[0]);
        for &v in &e[1..] {
            let r = root(&mut parent, v);
            if r != r0 {
                let (lo, hi) = (r.min(r0), r.max(r0));
                parent[hi as usize] = lo;
            }
        }
    }
    let mut comp = vec![0u32; nodes];
    // The component of each root, numbered in the order the roots are met.
    let mut ids = vec![u32::MAX; nodes];
    let mut pinned = Vec::new();
    for i in 0..nodes as u32 {
        let r = root(&mut parent, i);
        if ids[r as usize] == u32::MAX {
            ids[r as usize] = pinned.len() as u32;
            pinned.push(r);
        }
        comp[i as usize] = ids[r as usize];
    }
    (comp, pinned)
}

/// Area coordinates, in the parent, of the new nodes of a four-way split: the halves of
/// edges 0–1, 1–2, 2–0 (near the first corner, then the second), and the mid-sides
/// of the inner triangle's edges (01–20, 01–12, 12–20).
const NEW: [[f64; 3]; 9] = [
    [0.75, 0.25, 0.0],
    [0.25, 0.75, 0.0],
    [0.0, 0.75, 0.25],
    [0.0, 0.25, 0.75],
    [0.25, 0.0, 0.75],
    [0.75, 0.0, 0.25],
    [0.5, 0.25, 0.25],
    [0.25, 0.5, 0.25],
    [0.25, 0.25, 0.5],
];

/// The nine new-node weights on the parent's six nodes.
fn new_weights() -> [[f64; 6]; 9] {
    NEW.map(shape)
}

/// Where the new node of edge `k` of a parent lies: the half of edge `k` near corner
/// `a` is `NEW[2k]` if `a` is the edge's first corner.
fn half_index(k: usize, near_first: bool) -> usize {
    2 * k + usize::from(!near_first)
}

impl Mesh {
    /// Splits every element into four; old nodes keep their numbers. Returns the finer
    /// mesh.
    pub fn refine(&self) -> Mesh {
        let w = new_weights();
        let old = self.nodes.len();
        let ne = self.elems.len();
        // Two new nodes per old mid-side node (fewer than `old`), three inside each element.
        let mut nodes = Vec::with_capacity(3 * old + 3 * ne);
        nodes.extend_from_slice(&self.nodes);
        // First of the two half-edge nodes of each old mid-side node.
        let mut half = vec![u32::MAX; old];
        let mut elems = Vec::with_capacity(4 * ne);
        let mut edge_arc = Vec::with_capacity(4 * ne);
        let mut curved = Vec::with_capacity(4 * ne);
        let mut weight = Vec::with_capacity(4 * ne);
        let mut shear = Vec::with_capacity(4 * ne);
        let mut piece = Vec::with_capacity(4 * ne);
        let place = |e: &[u32; 6], k: usize, nodes: &[Pt]| -> Pt {
            let mut p = Pt::default();
            for i in 0..6 {
                p = p.add(nodes[e[i] as usize].scale(w[k][i]));
            }
            p
        };
        for (ei, e) in self.elems.iter().enumerate() {
            let ea = self.edge_arc[ei];
            // h[2k], h[2k+1]: halves of edge k near its first and second corner.
            let mut h = [0u32; 6];
            for k in 0..3 {
                let (a, b, m) = (e[k], e[(k + 1) % 3], e[3 + k] as usize);
                if half[m] == u32::MAX {
                    half[m] = nodes.len() as u32;
                    // The half near the smaller corner number comes first.
                    let (lo, hi) = if a < b { (true, false) } else { (false, true) };
                    for near_first in [lo, hi] {
                        let p = place(e, half_index(k, near_first), &self.nodes);
                        let p = self
                            .arcs
                            .get(ea[k] as usize)
                            .map_or(p, |arc| arc.project(p));
                        nodes.push(p);
                    }
                }
                let first_is_lo = a < b;
                h[2 * k] = half[m] + u32::from(!first_is_lo);
                h[2 * k + 1] = half[m] + u32::from(first_is_lo);
            }
            let base = nodes.len() as u32;
            for k in 6..9 {
                nodes.push(place(e, k, &self.nodes));
            }
            let (i1, i2, i3) = (base, base + 1, base + 2);
            let [a, b, c, mab, mbc, mca] = *e;
            elems.push([a, mab, mca, h[0], i1, h[5]]);
            elems.push([mab, b, mbc, h[1], h[2], i2]);
            elems.push([mca, mbc, c, i3, h[3], h[4]]);
            elems.push([mbc, mca, mab, i3, i1, i2]);
            edge_arc.push([ea[0], NO_ARC, ea[2]]);
            edge_arc.push([ea[0], ea[1], NO_ARC]);
            edge_arc.push([NO_ARC, ea[1], ea[2]]);
            edge_arc.push([NO_ARC; 3]);
            for _ in 0..4 {
                curved.push(self.curved[ei]);
                weight.push(self.weight[ei]);
                shear.push(self.shear[ei]);
                piece.push(self.piece[ei]);
            }
        }
        let mut component = self.component.clone();
        component.resize(nodes.len(), 0);
        for e in &elems {
            let c = component[e[0] as usize];
            for &v in &e[3..] {
                component[v as usize] = c;
            }
        }
        Mesh {
            origin: self.origin,
            nodes,
            elems,
            weight,
            shear,
            piece,
            edge_arc,
            curved,
            arcs: self.arcs.clone(),
            component,
            pinned: self.pinned.clone(),
        }
    }

    /// The prolongation from the linear (3-node) elements on this mesh's corners onto
    /// its 6-node elements: a corner keeps its value, a mid-side node takes the mean of
    /// its side's two ends (the linear field there; exact on a straight side). `None`
    /// unless the corners are numbered before the mid-side nodes, as [`base`] numbers
    /// them, and every node is a corner or a mid-side node of some element.
    pub fn corner_prolongation(&self) -> Option<Prolong> {
        let corners = (self.elems.iter())
            .flat_map(|e| e[..3].iter())
            .max()
            .map_or(0, |&c| c as usize + 1);
        let mids = self.nodes.len().checked_sub(corners)?;
        let mut nodes = vec![[0u32; 6]; mids];
        let mut set = vec![false; mids];
        for e in &self.elems {
            for k in 0..3 {
                let (a, b) = (e[k], e[(k + 1) % 3]);
                let i = (e[3 + k] as usize).checked_sub(corners)?;
                nodes[i] = [a, b, a, a, a, a];
                set[i] = true;
            }
        }
        set.iter().all(|&s| s).then_some(Prolong {
            coarse: corners,
            kind: vec![0; mids],
            nodes,
            weights: vec![[0.5, 0.5, 0.0, 0.0, 0.0, 0.0]],
        })
    }

    /// The prolongation onto this mesh's refinement `fine`: the quadratic field of each
    /// parent element at its children's new nodes (exact for straight elements, whose
    /// finer space holds the coarser one).
    pub fn prolongation(&self, fine: &Mesh) -> Prolong {
        let w = new_weights();
        let old = self.nodes.len();
        let new = fine.nodes.len().saturating_sub(old);
        let mut nodes = vec![[0u32; 6]; new];
        // A node no parent sets takes the last row of weights: zeros.
        let mut kind = vec![w.len() as u8; new];
        for (e, children) in self.elems.iter().zip(fine.elems.chunks_exact(4)) {
            // Children hold the new nodes at known places (see `refine`).
            let set = [
                (children[0][3], 0),
                (children[1][3], 1),
                (children[1][4], 2),
                (children[2][4], 3),
                (children[2][5], 4),
                (children[0][5], 5),
                (children[0][4], 6),
                (children[1][5], 7),
                (children[2][3], 8),
            ];
            for (node, k) in set {
                if let Some(i) = (node as usize).checked_sub(old).filter(|&i| i < new) {
                    nodes[i] = *e;
                    kind[i] = k as u8;
                }
            }
        }
        let mut weights = w.to_vec();
        weights.push([0.0; 6]);
        Prolong {
            coarse: old,
            nodes,
            kind,
            weights,
        }
    }
}
