//! Finite-element torsion: the Saint-Venant torsion constant J, the shear centre and
//! the warping constant Cw of any section, from the warping function.
//!
//! The region is the union of the solid pieces minus the voids (not the signed sum the
//! composite-area method uses); overlapping solids count once, and where they overlap
//! the part listed last gives the material. Each element carries its shear modulus
//! ratio G_i/G_ref for the Saint-Venant problem (J, transformed to the reference
//! material's G) and its modular ratio n_i = E_i/E_ref for the warping normal stresses
//! (the shear centre and Cw, transformed to the reference E like the second moments).
//!
//! Parts that do not touch (disconnected components of the region) share the twist,
//! the centroid and the bending axes, but each warps freely: its warping function has
//! its own arbitrary constant, held at zero at one node and then set so that its mean
//! over the component is zero. J is then the sum of the components' own J; the shear
//! centre and Cw come from the combined warping field by the Trefftz formulas with the
//! components' own second moments (they bend together but warp apart; see [`torsion`]). Parts
//! joined by battens or lacing, which the region does not show, are stiffer than this.
//!
//! Outlines traced with hundreds of straight edges (a polygon from a drawing) are
//! meshed with the corners that matter (Douglas–Peucker within 1e-5 of the section's
//! size, wider for rough outlines); the area so moved is added to the error estimate
//! and a warning says how many corners were kept.
//!
//! Method: 6-node triangles ([`p2`]) on a quality mesh of the region ([`mesh`]); the
//! base mesh solved directly (a large one by conjugate gradients over its linear
//! elements, [`torsion`](mod@torsion)), each refinement by conjugate gradients with a multigrid
//! V-cycle over the nested meshes as preconditioner ([`solve`]); J, the shear centre
//! (Trefftz) and Cw on each mesh ([`torsion`](mod@torsion)). The mesh is refined by
//! splitting every triangle into four until the estimated error is below the
//! tolerance, tested after every level from the second on:
//! - with two levels, the error of the finer is taken as |q₁ − q₀|/(2^p − 1) with the
//!   rate p = 2 assumed ([`ASSUMED_RATE`]), and the finer mesh's values are reported
//!   (not for a section of several materials, whose interface corners converge more
//!   slowly: it always takes three levels).
//!   The graded meshes converge faster than that (P2 on smooth solutions: p = 4), so
//!   the estimate is conservative; measured 1.2–3.6× above the true error on 14 level
//!   pairs (issue 10), and `tests/torsion_error.rs` checks it on every demo, bench and
//!   fixture section against a reference two or three levels finer (one open case, a
//!   section of several materials, is marked there);
//! - with three or more, Richardson extrapolation over the last three with the observed
//!   rate (capped at 4): the values reported are the extrapolated ones, `rel_error` the
//!   estimated error of the finest mesh, which the extrapolated value is expected to
//!   beat.
//!
//! Where the time goes is measured by `benches/torsion.rs`; the figures are in
//! DEVELOPERS.md ("Benchmark figures").
//!
//! Budget: features below 1e-5 of the section, a base mesh past 20,000 added nodes or
//! a direct factor past 2.5e7 entries / 1e10 operations are refused before anything
//! is allocated ("torsion not computed: …" says which); a refinement past [`Budget`]
//! (800,000 elements, 1.7 million nodes, 1 GiB estimated) is not tried. Iterations
//! that do not converge (cusps where outlines touch) are reported, not used. The
//! cancel flag is checked between levels, in the direct factor and in the iterations.
//!
//! Layout: [`mesh`] (region, base mesh, refinement), [`p2`] (element), [`solve`]
//! (sparse matrix and PCG), [`torsion`](mod@torsion) (one mesh's results); this file holds the
//! public API, the refinement loop and the error estimate.

pub mod flexure;
mod grid;
pub mod joint_flow;
pub mod mesh;
pub mod p2;
pub mod solve;
pub mod torsion;

use crate::geom::BoundaryIntegral;
use crate::geom::{Piece, Pt};
use crate::model::Warning;
use std::sync::atomic::{AtomicBool, Ordering};
use std::sync::Arc;
use torsion::{Failure, Level};

/// Levels the flexure solution may add past the one where torsion meets its
/// tolerance (each costs four times the last), only when every one of its estimates
/// is within reach of the tolerance on the levels left (a quarter a level: 16× with two
/// to go, 4× with one), so that a figure that does not converge (a singular corner)
/// never costs a level.
const MAX_FLEXURE_LEVELS: usize = 2;

/// The target relative error of J and Cw unless asked otherwise, by `kern calc`
/// (`--torsion-tol`) and the workbench alike (docs/format.md, Accuracy).
pub const DEFAULT_TOL: f64 = 1e-3;

/// The base mesh's largest element area, as a fraction of [`mesh::base`]'s default
/// (the region's area / 60): a quarter, so that one refinement of it usually meets the
/// default tolerance by the two-level estimate. Measured on the bench sections
/// (DEVELOPERS.md, "Benchmark figures"): half the time of the default base mesh and
/// three levels.
pub const BASE_SIZE: f64 = 0.25;

/// Options of the torsion solver.
#[derive(Debug, Clone)]
pub struct TorsionOptions {
    /// Target relative error of J and Cw (default [`DEFAULT_TOL`]).
    pub tol: f64,
    /// When set to true by another thread, the solver stops with
    /// `Err(Warning::Cancelled)`.
    pub cancel: Option<Arc<AtomicBool>>,
    /// Also solve the flexure problem ([`flexure`]) on the same meshes, with this
    /// Poisson's ratio of the reference material; `None` for torsion alone.
    pub flexure: Option<f64>,
    /// Mesh the boundaries solid pieces share as element edges, so that the flexure
    /// solution gives the flow across them ([`flexure::Flexure::joint_flow`]); it costs
    /// elements (measured 7–28 % more on the built-up demo sections, 11 % on
    /// tests/fixtures/crane-runway-box.toml), so it is asked for only when a joint is
    /// on a closed cell (`Analysis::torsion_options`).
    pub joints: bool,
}

impl Default for TorsionOptions {
    fn default() -> Self {
        TorsionOptions {
            tol: DEFAULT_TOL,
            cancel: None,
            flexure: None,
            joints: false,
        }
    }
}

/// Torsion and warping properties of a section.
#[derive(Debug, Clone, PartialEq)]
pub struct Torsion {
    /// Saint-Venant torsion constant (length⁴), transformed to the reference material.
    pub j: f64,
    /// Warping constant about the shear centre (length⁶).
    pub cw: f64,
    /// Shear centre in the file frame.
    pub shear_centre: Pt,
    /// Estimated relative error, the larger of J's and Cw's (Cw's relative to
    /// max(|Cw|, Ip·c²/100), c the largest distance from the centroid to the extent).
    pub rel_error: f64,
    /// Elements of the finest mesh.
    pub elements: usize,
    pub method: String,
    pub warnings: Vec<Warning>,
    /// Shear stresses and shear areas on the same meshes, when asked for
    /// ([`TorsionOptions::flexure`]); `Err` says why there are none.
    pub flexure: Option<Result<flexure::Flexure, Warning>>,
}

/// What the solver may spend, decided before a mesh is refined or a matrix allocated.
/// A refinement past it is not tried: with two levels solved the result says the
/// tolerance was missed; with one there is no error estimate, and torsion is not
/// computed.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct Budget {
    /// Elements of the finest mesh.
    pub elements: usize,
    /// Nodes (unknowns) of the finest mesh.
    pub nodes: usize,
    /// Bytes the hierarchy of meshes and matrices would hold.
    pub bytes: usize,
}

/// Bytes one element of the finest mesh costs, measured loosely from the structures
/// (matrix rows of about 19 entries for 2 nodes, 6 quadrature points, the mesh, the
/// prolongation rows and 6 solver vectors): about 1.1 kB, rounded up.
const BYTES_PER_ELEMENT: usize = 1_200;

impl Budget {
    /// 800,000 elements, 1.7 million nodes, 1 GiB.
    pub const DEFAULT: Budget = Budget {
        elements: 800_000,
        nodes: 1_700_000,
        bytes: 1 << 30,
    };

    /// Estimated bytes of the whole hierarchy when the finest mesh has `elements`:
    /// each coarser level is a quarter of the next, so 4/3 of the finest.
    pub fn bytes_for(elements: usize) -> usize {
        elements.saturating_mul(BYTES_PER_ELEMENT) / 3 * 4
    }

    /// Whether a mesh of `elements` and `nodes` fits.
    pub fn admits(&self, elements: usize, nodes: usize) -> bool {
        elements <= self.elements
            && nodes <= self.nodes
            && Budget::bytes_for(elements) <= self.bytes
    }

    /// Whether the refinement of a mesh of `elements` and `nodes` (four times the
    /// elements; a 6-node mesh of n nodes gains at most 3n) fits.
    pub fn admits_refinement(&self, elements: usize, nodes: usize) -> bool {
        self.admits(elements.saturating_mul(4), nodes.saturating_mul(4))
    }
}

/// Computes J, the shear centre and Cw of the region of `pieces` to the tolerance of
/// `opts`. Errors: [`Warning::Cancelled`], or why there is nothing to mesh or solve.
pub fn torsion(pieces: &[Piece], opts: &TorsionOptions) -> Result<Torsion, Warning> {
    let tol = if opts.tol.is_finite() && opts.tol > 0.0 {
        opts.tol
    } else {
        DEFAULT_TOL
    };
    run(
        pieces,
        Stop::Tolerance(tol),
        opts.cancel.as_deref(),
        opts.flexure,
        opts.joints,
    )
}

/// The solution refined until its finest mesh has at least `elements` elements (and
/// at least three levels exist), extrapolated by Richardson over the last three: a
/// reference far finer than [`torsion`] stops at, for checking its estimate. With
/// `flexure` (Poisson's ratio, as [`TorsionOptions::flexure`]) the flexure solution of
/// the finest mesh comes too, with its two-mesh estimate. A refinement past the
/// [`Budget`] stops it early with [`Warning::AboveTolerance`] (tolerance 0) among the
/// warnings.
pub fn reference(
    pieces: &[Piece],
    elements: usize,
    flexure: Option<f64>,
) -> Result<Torsion, Warning> {
    run(pieces, Stop::Elements(elements), None, flexure, false)
}

/// When the refinement stops.
#[derive(Clone, Copy)]
enum Stop {
    /// When the estimated relative error is at most this.
    Tolerance(f64),
    /// Once the finest mesh has at least this many elements.
    Elements(usize),
}

/// The refinement loop of [`torsion`] and [`reference`]; `flexure` (Poisson's ratio of
/// the first material) also solves the flexure problem on the same meshes.
fn run(
    pieces: &[Piece],
    stop: Stop,
    cancel: Option<&AtomicBool>,
    flexure: Option<f64>,
    joints: bool,
) -> Result<Torsion, Warning> {
    let cancelled = || cancel.is_some_and(|c| c.load(Ordering::Relaxed));
    let fail = |f: Failure| match f {
        Failure::Cancelled => Warning::Cancelled,
        Failure::Degenerate => Warning::DegenerateElement,
        Failure::Stalled { elements } => Warning::Stalled { elements },
        Failure::TooLarge { entries, flops } => Warning::SolveTooLarge {
            entries,
            flops,
            max_entries: solve::MAX_ENVELOPE,
            max_flops: solve::MAX_FLOPS,
        },
    };
    let budget = Budget::DEFAULT;
    if cancelled() {
        return Err(Warning::Cancelled);
    }
    let base = mesh::base(pieces, BASE_SIZE, joints)?;
    let mut warnings = base.warnings;
    let geometry_error = base.geometry_error;
    let span = extent(&base.mesh);
    // Corners of interfaces between materials are singular and not graded: there the
    // two-level estimate's assumed rate was measured barely safe (a flitch beam's Cw),
    // so such a section waits for three levels and the observed rate.
    let one_material = |v: &[f64]| v.windows(2).all(|w| w[0] == w[1]);
    let interfaces = !(one_material(&base.mesh.weight) && one_material(&base.mesh.shear));
    let min_levels = if !interfaces { 2 } else { 3 };
    let mut mesh = base.mesh;
    let mut levels: Vec<Level> = Vec::new();
    // The flexure problem adds two right-hand sides to each level's solver.
    let mut ladder = torsion::Ladder::solving(if flexure.is_some() { 3 } else { 1 });
    let mut step = None;
    let mut flex = flexure.map(flexure::FlexLadder::new);
    let mut flex_fail = None;
    let mut extra = 0;
    // The tolerance the flexure figures are held to (none for a reference solve).
    let tol = match stop {
        Stop::Tolerance(tol) => tol,
        Stop::Elements(_) => 0.0,
    };
    loop {
        if cancelled() {
            return Err(Warning::Cancelled);
        }
        let prolong = step.take();
        // The flexure solution keeps its own copy (its start and its estimate).
        let flex_prolong = flex.is_some().then(|| prolong.clone()).flatten();
        let level = ladder.solve(&mesh, prolong, cancel).map_err(fail)?;
        if let Some(fl) = flex.as_mut() {
            let pieces = mesh.pinned.len();
            let solved = if pieces > 1 {
                Err(Warning::ShearPieces { count: pieces })
            } else {
                fl.solve(&mesh, &ladder, &level, flex_prolong, cancel)
                    .map_err(fail)
            };
            match solved {
                Err(Warning::Cancelled) => return Err(Warning::Cancelled),
                Err(w) => {
                    flex = None;
                    flex_fail = Some(w);
                }
                Ok(()) => {}
            }
        }
        if levels.is_empty() {
            warnings.extend(region_note(pieces, level.area));
        }
        levels.push(level);
        let mut flex_more = false;
        // A reference solve keeps Richardson's extrapolated value: it is checked against, not printed.
        let careful = interfaces && matches!(stop, Stop::Tolerance(_));
        if let Some(est) = estimate(&levels, span, careful) {
            let est = Estimate {
                rel_error: est.rel_error + geometry_error,
                ..est
            };
            let torsion_done = match stop {
                Stop::Tolerance(tol) => est.rel_error <= tol && levels.len() >= min_levels,
                Stop::Elements(n) => levels.len() >= 3 && mesh.elems.len() >= n,
            };
            // The flexure figures' estimate is the two-mesh one too (flexure::FLEX_RATE),
            // so they are ready on torsion's levels. Their stresses converge as h², slower
            // than J: they may ask for levels more than torsion alone, when those levels
            // (a quarter of the error each) can bring them within the tolerance.
            let reach = 4f64.powi(MAX_FLEXURE_LEVELS.saturating_sub(extra) as i32);
            flex_more = torsion_done
                && extra < MAX_FLEXURE_LEVELS
                && flex
                    .as_ref()
                    .is_some_and(|f| !f.converged(tol) && f.converged(reach * tol));
            if torsion_done && !flex_more {
                return Ok(finish(est, &mesh, warnings).with_flexure(flex, flex_fail, tol));
            }
            if !budget.admits_refinement(mesh.elems.len(), mesh.nodes.len()) {
                if est.rel_error > tol {
                    warnings.push(Warning::AboveTolerance {
                        error: est.rel_error,
                        tol,
                    });
                }
                return Ok(finish(est, &mesh, warnings).with_flexure(flex, flex_fail, tol));
            }
        } else if !budget.admits_refinement(mesh.elems.len(), mesh.nodes.len()) {
            return Err(Warning::NextMeshPastBudget {
                elements: 4 * mesh.elems.len(),
                max_elements: budget.elements,
                max_nodes: budget.nodes,
                mb: budget.bytes >> 20,
            });
        }
        if flex_more {
            extra += 1;
        }
        if let Some(fl) = flex.as_mut() {
            fl.refining(&mesh);
        }
        let fine = mesh.refine();
        step = Some(mesh.prolongation(&fine));
        mesh = fine;
    }
}

/// A note when the region (solids united, voids removed once) has another area than
/// the composite-area method's signed sum — overlapping solids, voids that overlap or
/// stick out — since torsion and the other properties then describe different
/// sections (docs/format.md, "How parts combine").
fn region_note(pieces: &[Piece], region_area: f64) -> Option<Warning> {
    let signed: f64 = pieces
        .iter()
        .map(|p| p.sign() * p.n * crate::props::Moments::of_contours(&p.contours).a)
        .sum();
    let diff = (region_area - signed).abs() / signed.abs().max(f64::MIN_POSITIVE);
    (diff > 1e-4).then_some(Warning::RegionArea {
        percent: 100.0 * diff,
    })
}

/// A mesh of the region for drawing: the corners of each triangle in the file frame,
/// from the base mesh refined while it stays within `max_elements` (the base mesh
/// itself if that is already larger). Empty when there is nothing to mesh. Curved
/// element sides are drawn as chords.
pub fn mesh_outline(pieces: &[Piece], max_elements: usize) -> Vec<[Pt; 3]> {
    let Ok(base) = mesh::base(pieces, 1.0, false) else {
        return Vec::new();
    };
    let mut m = base.mesh;
    while 4 * m.elems.len() <= max_elements
        && Budget::DEFAULT.admits_refinement(m.elems.len(), m.nodes.len())
    {
        m = m.refine();
    }
    m.elems
        .iter()
        .map(|e| [0, 1, 2].map(|k| m.nodes[e[k] as usize].add(m.origin)))
        .collect()
}

/// The largest distance from the local origin to the mesh's nodes.
fn extent(m: &mesh::Mesh) -> f64 {
    m.nodes.iter().map(|p| p.x.hypot(p.y)).fold(0.0, f64::max)
}

/// Extrapolated values and the estimated relative error.
struct Estimate {
    j: f64,
    cw: f64,
    sc: Pt,
    rel_error: f64,
    /// Whether it is Richardson's over three levels (else the two-level estimate).
    richardson: bool,
}

fn finish(est: Estimate, m: &mesh::Mesh, warnings: Vec<Warning>) -> Torsion {
    let method = if est.richardson {
        "FE warping function, 6-node triangles, Richardson estimate over three meshes"
    } else {
        "FE warping function, 6-node triangles, two-mesh estimate (rate 2 assumed)"
    };
    Torsion {
        j: est.j,
        cw: est.cw,
        shear_centre: est.sc.add(m.origin),
        rel_error: est.rel_error,
        elements: m.elems.len(),
        method: method.into(),
        warnings,
        flexure: None,
    }
}

impl Torsion {
    /// The flexure results from the ladder that solved alongside (or why there are none).
    fn with_flexure(
        self,
        flex: Option<flexure::FlexLadder>,
        fail: Option<Warning>,
        tol: f64,
    ) -> Torsion {
        let flexure = match (flex, fail) {
            (_, Some(w)) => Some(Err(w)),
            // Fewer than two levels: the budget stopped the refinement first.
            (Some(fl), None) => {
                let budget = Budget::DEFAULT;
                Some(fl.finish(tol).ok_or(Warning::NextMeshPastBudget {
                    elements: 4 * self.elements,
                    max_elements: budget.elements,
                    max_nodes: budget.nodes,
                    mb: budget.bytes >> 20,
                }))
            }
            (None, None) => None,
        };
        Torsion { flexure, ..self }
    }
}

/// The convergence rate the two-level estimate assumes: p = 2 (a quarter of the error
/// per halving of the element size), below what the graded P2 meshes show (issue 10:
/// p = 4 was not safe on every section, p = 2 was).
pub const ASSUMED_RATE: f64 = 2.0;

/// The estimate after the latest level: Richardson extrapolation over the last three
/// levels (element size halving), the two-level estimate with two, `None` with one.
fn estimate(levels: &[Level], span: f64, interfaces: bool) -> Option<Estimate> {
    let (c, est) = match levels {
        [.., a, b, c] => {
            // Across material interfaces the convergence is irregular (their corners are
            // singular and not graded): the estimate is then the whole last change
            // |q2 − q1|, which bounds the error of q2 whenever each level at least halves
            // it, rather than Richardson's extrapolated share of it.
            let r = |f: fn(&Level) -> f64| {
                let (v, e) = richardson(f(a), f(b), f(c), 4.0);
                if interfaces {
                    (f(c), e.max((f(c) - f(b)).abs()))
                } else {
                    (v, e)
                }
            };
            (c, [r(|l| l.j), r(|l| l.cw), r(|l| l.sc.x), r(|l| l.sc.y)])
        }
        [b, c] => {
            let t = |f: fn(&Level) -> f64| two_level(f(b), f(c), ASSUMED_RATE);
            (c, [t(|l| l.j), t(|l| l.cw), t(|l| l.sc.x), t(|l| l.sc.y)])
        }
        _ => return None,
    };
    let [(j, ej), (cw, ecw), (sx, _), (sy, _)] = est;
    let c_dist = span.max(c.ip.max(0.0).sqrt() / c.area.max(f64::MIN_POSITIVE).sqrt());
    let cw_scale = cw.abs().max(0.01 * c.ip * c_dist * c_dist);
    let rel = (ej / j.abs().max(f64::MIN_POSITIVE)).max(ecw / cw_scale.max(f64::MIN_POSITIVE));
    Some(Estimate {
        j,
        cw,
        sc: Pt::new(sx, sy),
        rel_error: rel,
        richardson: levels.len() >= 3,
    })
}

/// The error of `q1` estimated from two nested meshes (element size h and h/2) with the
/// assumed rate `p`: |q1 − q0|/(2^p − 1) (Richardson 1911; Roache, Verification and
/// Validation in Computational Science and Engineering, §5.4, the two-grid form with
/// the order assumed). Returns `q1` unchanged, not extrapolated: the rate is assumed,
/// so only the bound is used.
fn two_level(q0: f64, q1: f64, p: f64) -> (f64, f64) {
    let floor = 1e-12 * q1.abs().max(q0.abs());
    (q1, ((q1 - q0).abs() / (2f64.powf(p) - 1.0)).max(floor))
}

/// Richardson extrapolation of a quantity from three nested meshes `q0, q1, q2`
/// (element size h, h/2, h/4): with the observed rate p = log₂((q1 − q0)/(q2 − q1)),
/// the error of q2 is about (q2 − q1)/(2^p − 1) (Richardson 1911; Roache,
/// Verification and Validation in Computational Science and Engineering, §5.4).
/// Returns the extrapolated value and the estimated error of `q2`. The rate is capped
/// at `p_max` (the theoretical rate) so a lucky ratio cannot shrink the estimate; when
/// the differences do not shrink, or shrink slower than p = 1, the estimate falls back
/// to the larger of the last two differences and the finest value is returned.
fn richardson(q0: f64, q1: f64, q2: f64, p_max: f64) -> (f64, f64) {
    let (d1, d2) = (q1 - q0, q2 - q1);
    let floor = 1e-12 * q2.abs().max(q1.abs());
    if d2.abs() <= floor {
        return (q2, d2.abs().max(floor));
    }
    let ratio = d1 / d2;
    if !(ratio.is_finite() && ratio >= 2.0) {
        return (q2, d1.abs().max(d2.abs()));
    }
    let p = ratio.log2().min(p_max);
    let err = d2 / (2f64.powf(p) - 1.0);
    (q2 + err, err.abs())
}

#[cfg(test)]
mod tests;
