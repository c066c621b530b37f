//! The Saint-Venant flexure problem on the torsion mesh: shear stresses from Vx and Vy,
//! the torsional shear stresses from T, and the energy-consistent shear areas.
//!
//! Method (Pilkey, Analysis and Design of Elastic Beams: Computational Methods, Wiley
//! 2002, ch. 6, "shear stresses"; Timoshenko & Goodier, Theory of Elasticity, flexure of
//! bars; the composite form derived here from the same equations). Coordinates are about
//! the modulus-weighted centroid, second moments `Ixx`, `Iyy`, `Ixy` transformed to the
//! reference material (E_ref), `D = Ixx·Iyy − Ixy²`. For a shear `Vx` through the
//! flexural centre the bending stress changes along the member as ∂σ/∂z = E·(a′x + b′y)
//! with a′, b′ from the resultant conditions, and the shear stresses are
//!
//! ```text
//! τ = Vx/(2(1 + ν_ref)·D) · (g·∇Ψ − g·ν·d),   g = G/G_ref, ν the element's own ratio
//! d = (Ixx(x² − y²)/2 − Ixy·x·y,  Ixy(x² − y²)/2 + Ixx·x·y)
//! ∇·(g∇Ψ − gν·d) = −2(1 + ν)·g·(Ixx·x − Ixy·y)   in the region,   (g∇Ψ − gν·d)·n = 0 on its boundary
//! ```
//!
//! and for `Vy` the same with x and y (and Ixx and Iyy) exchanged:
//! `d = (Ixy(y² − x²)/2 + Iyy·x·y, Iyy(y² − x²)/2 − Ixy·x·y)`, right-hand side
//! `−2(1 + ν)·g·(Iyy·y − Ixy·x)`. Equilibrium (∇·τ = −∂σ/∂z, τ·n = 0) makes
//! ∫τzx dA = Vx exactly; the ν-terms satisfy compatibility (∇²τ constant in each
//! material). With (1 + ν)·g = n·(1 + ν_ref) for isotropic materials (G = E/(2(1 + ν))),
//! each element needs only its two ratios n = E/E_ref and g. The weak form,
//! `∫g∇Ψ·∇v dA = ∫gν·d·∇v dA + ∫2(1 + ν)g·r·v dA`, has the stiffness of the warping
//! function, so the torsion solve's factor and multigrid hierarchy solve it too.
//!
//! Torsion (Pilkey 2002 ch. 6; Timoshenko & Goodier §104): τ = T/J · g·(∂ω/∂x − y,
//! ∂ω/∂y + x) with ω the warping function of the same mesh and J of that mesh.
//!
//! Shear areas, energy-consistent (Pilkey 2002, shear deformation coefficients): the
//! strain energy per length of a unit shear, ∫τ²/(2G) dA, set equal to that of a uniform
//! stress on the shear area, `V²/(2·G_ref·A_s)`, gives `A_s = 1/∫τ²/g dA` (τ from V = 1),
//! transformed to G_ref. For a rectangle with ν = 0 this is 5A/6.
//!
//! Stresses are sampled at the nodes of the mesh, each node's value the area-weighted
//! mean of its elements' gradients (recovered nodal stresses); at a node between two
//! materials every element's own value is kept. Assumptions: isotropic materials,
//! shear forces through the flexural centre, T about the shear centre, a section in one
//! piece (separate pieces do not share a shear flow: refused by the caller).

use super::mesh::Mesh;
use super::p2::{Element, Rule, Straight};
use super::solve::{Multigrid, Prolong};
use super::torsion::{Failure, Ladder, Level};
use crate::geom::Pt;
use std::sync::atomic::AtomicBool;

/// Relative residual of the flexure solves, as for the warping function.
const RTOL: f64 = 1e-7;

/// The smallest relative error any flexure figure is given: the solves stop at the
/// residual [`RTOL`], and unlike J the shear areas and stresses are not stationary in the
/// solution, so the solver's own error (its residual times the matrix's conditioning)
/// stays in them; measured about 1e-6 on a 4:1 rectangle, taken as 100·RTOL.
pub const FLOOR: f64 = 100.0 * RTOL;

/// The shear stresses at one point from unit loads.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct Sample {
    /// Where, in the file frame.
    pub at: Pt,
    /// The mesh node it was recovered at (a node keeps its number in every refinement).
    pub node: u32,
    /// Modular ratio of the material there (for the normal stress).
    pub n: f64,
    /// `[τzx, τzy]` from Vx = 1, from Vy = 1 (per length²) and from T = 1 (per length³).
    pub tau: [[f64; 2]; 3],
}

impl Sample {
    /// The resultant shear stress √(τzx² + τzy²) and the von Mises stress √(σ² + 3τ²)
    /// (σ = n·σ_ref) here under `load`.
    pub fn stresses(&self, load: &Load) -> (f64, f64) {
        let t = self.tau;
        let tx = load.vx * t[0][0] + load.vy * t[1][0] + load.t * t[2][0];
        let ty = load.vx * t[0][1] + load.vy * t[1][1] + load.t * t[2][1];
        let tau = tx.hypot(ty);
        let sigma = self.n * (load.sigma)(self.at);
        (tau, (sigma * sigma + 3.0 * tau * tau).sqrt())
    }
}

/// One mesh's flexure results.
#[derive(Debug, Clone, PartialEq)]
struct FlexLevel {
    /// Shear areas for shear along x and along y (length²).
    area: [f64; 2],
    samples: Vec<Sample>,
    /// The flows across the boundaries pieces share.
    joints: super::joint_flow::Level,
    /// Nodes of the mesh.
    nodes: usize,
    /// Its sharp re-entrant corners ([`reentrant_corners`]), found once the level is to
    /// be refined ([`FlexLadder::refining`]): only the coarser of two levels needs them.
    corners: Option<Vec<Corner>>,
    /// The prolongation from the coarser mesh onto this one (none on the base mesh).
    prolong: Option<Prolong>,
}

/// The flexure results over the meshes solved.
#[derive(Debug, Clone, PartialEq)]
pub struct Flexure {
    /// Shear areas for shear along x and y (length², transformed to G_ref), of the finest
    /// mesh.
    pub shear_area: [f64; 2],
    /// Estimated relative error of the shear areas (the larger of the two).
    pub shear_area_error: f64,
    /// Poisson's ratio of the reference material.
    pub nu_ref: f64,
    /// The tolerance the solve was asked for (the torsion solve's).
    pub tol: f64,
    /// The last three levels (two when only two were solved), coarser first.
    levels: Vec<FlexLevel>,
}

/// The largest value of a stress over the section and where it occurs.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct Peak {
    pub value: f64,
    /// In the file frame.
    pub at: Pt,
    /// Estimated relative error of `value` (the two-mesh estimate, [`FLEX_RATE`]).
    pub rel_error: f64,
}

/// A sharp re-entrant corner of the region, where the elastic shear stress is singular
/// (Williams 1952): a node of the coarser of the last two meshes.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct Corner {
    /// The mesh node (the same node on every finer mesh).
    pub node: u32,
    /// Where, in the file frame.
    pub at: Pt,
    /// The radius about it within which a stress counts as at the corner for
    /// [`Flexure::peaks_away`]: [`AWAY`] times the distance to the nearest other corner
    /// of the outline (convex or re-entrant), a length of the geometry and not of the
    /// mesh: across a web welded to a flange, the web's thickness.
    pub reach: f64,
}

/// The radius about a sharp re-entrant corner left out of [`Flexure::peaks_away`], in
/// distances to the nearest other corner of the outline. The singular term falls off as
/// r^(π/α − 1) (Williams 1952; r^(−1/3) at α = 270°) and dies out within about a wall
/// thickness, where the thin-walled flow takes over (Saint-Venant's principle, common
/// practice); one such distance out, the welded test sections settle within 1e-3
/// (tests/shading.rs).
pub const AWAY: f64 = 1.0;

/// The flow across a joint from [`Flexure::joint_flow`].
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct JointFlow {
    /// Force per length of member (the larger stretch's for a joint of several).
    pub value: f64,
    /// Estimated error relative to the larger of the flow and the largest change of
    /// a piece's bending force under the same shears.
    pub rel_error: f64,
    /// The shared boundary closes on itself (a core in a tube): the flow across it
    /// changes sign around the loop and this figure is its net, not a demand.
    pub closed: bool,
    /// The length of mesh edges between the two pieces on the finest mesh (see
    /// [`super::joint_flow::JointFlux::length`]).
    pub length: f64,
}

/// The combined load on the section for [`Flexure::peaks`]: shear forces, torque and
/// the normal stress of the reference material at a point of the file frame, in one
/// consistent set of units (e.g. `vx` in N/m² per unit² of area gives τ in Pa).
pub struct Load<'a> {
    pub vx: f64,
    pub vy: f64,
    pub t: f64,
    pub sigma: &'a dyn Fn(Pt) -> f64,
}

impl Flexure {
    /// The samples of the finest mesh.
    pub fn samples(&self) -> &[Sample] {
        self.levels.last().map_or(&[], |l| &l.samples)
    }

    /// The longitudinal shear flow across the boundary pieces `a` and `b` share under
    /// shears `vx`, `vy` (force per length of member, in the forces' unit per length
    /// unit), from the finest mesh, with its estimated error (the two-mesh estimate of
    /// the other flexure figures, [`FLEX_RATE`], plus the solves' relative residual
    /// [`RTOL`]: the flux from an
    /// inexact solve differs by about that share, measured 1e-8 on a box) relative to the
    /// larger of the flow and the largest change of a piece's bending force. A joint of
    /// several stretches gives its largest.
    /// `None` when the pieces share no boundary on the mesh.
    pub fn joint_flow(&self, a: usize, b: usize, vx: f64, vy: f64) -> Option<JointFlow> {
        let last_two = self.levels.get(self.levels.len().saturating_sub(2)..)?;
        let per: Vec<(f64, bool, usize, f64)> = (last_two.iter())
            .map(|l| {
                let j = l.joints.joint(a, b)?;
                let q = |s: &super::joint_flow::Stretch| (vx * s.flux[0] + vy * s.flux[1]).abs();
                let value = j.stretches.iter().map(q).fold(0.0, f64::max);
                let closed = j.stretches.iter().any(|s| s.closed);
                Some((value, closed, j.stretches.len(), j.length))
            })
            .collect::<Option<_>>()?;
        let [y, z] = per.get(per.len().checked_sub(2)?..)? else {
            return None;
        };
        if y.2 != z.2 {
            return None;
        }
        let err = (z.0 - y.0).abs() / (2f64.powf(FLEX_RATE) - 1.0);
        let finest = self.levels.last()?;
        let scale = (finest.joints.load.iter())
            .map(|l| (vx * l[0] + vy * l[1]).abs())
            .fold(z.0, f64::max);
        Some(JointFlow {
            value: z.0,
            rel_error: err / scale.max(f64::MIN_POSITIVE) + RTOL,
            closed: z.1,
            length: z.3,
        })
    }

    /// The flows and piece loads of the finest mesh (for checks of equilibrium).
    pub fn joint_level(&self) -> Option<&super::joint_flow::Level> {
        self.levels.last().map(|l| &l.joints)
    }

    /// The largest resultant shear stress √(τzx² + τzy²) and the largest von Mises
    /// stress √(σ² + 3τ²) (σ = n·σ_ref) under `load`, each with its estimated error;
    /// `None` with fewer than two meshes.
    ///
    /// With three meshes solved, where the peak's values on them do not show the rate
    /// the two-mesh estimate assumes, its estimate also covers the change over all three
    /// ([`three_mesh_bound`]), so that a last pair not yet in the asymptotic range does
    /// not give too small an estimate.
    pub fn peaks(&self, load: &Load) -> Option<(Peak, Peak)> {
        peaks_over(&self.levels, load, None, true)
    }

    /// The sharp re-entrant corners of the region (of the coarser of the last two
    /// meshes); empty where there are none, or with fewer than two meshes.
    pub fn corners(&self) -> &[Corner] {
        let n = self.levels.len();
        (self.levels.get(n.wrapping_sub(2)))
            .and_then(|l| l.corners.as_deref())
            .unwrap_or(&[])
    }

    /// As [`Flexure::peaks`], over the samples away from the sharp re-entrant corners
    /// only (beyond each [`Corner::reach`]), with the same two-mesh estimate over those
    /// samples and without the corners' term: the largest stresses the elastic model
    /// bounds where [`Flexure::peaks`] is dominated by a singular corner. `None` when the
    /// region has no such corner (then [`Flexure::peaks`] is the answer).
    pub fn peaks_away(&self, load: &Load) -> Option<(Peak, Peak)> {
        let corners = self.corners();
        let fine = self.levels.last()?;
        if corners.is_empty() {
            return None;
        }
        let mut counted = vec![true; fine.nodes];
        for s in &fine.samples {
            let near = corners.iter().any(|c| s.at.dist(c.at) <= c.reach);
            if let Some(k) = counted.get_mut(s.node as usize).filter(|_| near) {
                *k = false;
            }
        }
        peaks_over(&self.levels, load, Some(&counted), true)
    }
}

/// The convergence rate the flexure figures' two-mesh estimate assumes: p = 1, so that
/// the estimate is the whole last change |q₁ − q₀| (it bounds the error of q₁ whenever
/// a halving of the element size at least halves the error). Measured on the demo,
/// bench and fixture sections against meshes up to four levels finer (DEVELOPERS.md,
/// "Benchmark figures"): the shear areas converge at p ≈ 4 on filleted sections but at
/// p ≈ 1.3–1.6 where plates meet at sharp re-entrant corners (|q₁ − q₀| / true error
/// 1.2–1.9 there, so p = 2, a third of the change, would not be safe), and the nodal
/// stresses at p ≈ 2 where they converge (|q₁ − q₀| / true error 1.9–6 by the node-wise
/// rule of [`peak_two_level`]).
pub const FLEX_RATE: f64 = 1.0;

/// [`Flexure::peaks`] over `levels`, from the last two; with `away`, over the nodes it
/// marks only ([`peak_two_level`]). With `three` and a third level before them, each
/// estimate also covers the change of the peak over the three ([`three_mesh_bound`]).
fn peaks_over(
    levels: &[FlexLevel],
    load: &Load,
    away: Option<&[bool]>,
    three: bool,
) -> Option<(Peak, Peak)> {
    let n = levels.len();
    let [coarse, fine] = levels.get(n.checked_sub(2)?..)? else {
        return None;
    };
    let (vc, vf) = (values_of(coarse, load), values_of(fine, load));
    let first = (n.checked_sub(3).and_then(|i| levels.get(i))).filter(|_| three);
    let v0 = first.map(|l| values_of(l, load));
    let one = |k: usize| {
        let p = peak_two_level(coarse, &vc[k], fine, &vf[k], away);
        let Some((l0, v0)) = first.zip(v0.as_ref()) else {
            return p;
        };
        let q =
            [(l0, &v0[k]), (coarse, &vc[k]), (fine, &vf[k])].map(|(l, v)| largest(l, v, away).0);
        let extra = three_mesh_bound(q) / p.value.abs().max(f64::MIN_POSITIVE);
        Peak {
            rel_error: p.rel_error.max(extra),
            ..p
        }
    };
    Some((one(0), one(1)))
}

/// The largest of `v` (values at the samples of `l`) over the nodes `away` flags (all
/// without it): the value, where, and its node.
fn largest(l: &FlexLevel, v: &[f64], away: Option<&[bool]>) -> (f64, Pt, usize) {
    let counts = |node: usize| away.is_none_or(|a| a.get(node).copied().unwrap_or(false));
    (l.samples.iter().zip(v)).fold((0.0, Pt::new(0.0, 0.0), 0), |best, (s, &x)| {
        if x > best.0 && counts(s.node as usize) {
            (x, s.at, s.node as usize)
        } else {
            best
        }
    })
}

/// A bound on the error of q₂ from the values q₀, q₁, q₂ of a quantity on three meshes,
/// each halving the element size, for when the three do not show the convergence the
/// two-mesh estimate assumes. Where the changes keep their sign and the last is at most
/// 2^−p of the one before ([`FLEX_RATE`]: the rate is observed, Roache, Verification and
/// Validation in Computational Science and Engineering, 1998, §5.4, the asymptotic range
/// from three grids), 0: the two-mesh estimate stands. Otherwise the coarser pair's
/// two-mesh estimate of the error of q₁, |q₁ − q₀|/(2^p − 1), carried to q₂ by the
/// triangle inequality: |q₁ − q₀|/(2^p − 1) + |q₂ − q₁|, which holds where the last
/// change is smaller than the error left (measured at a fillet's peak, the values going
/// down and then up: DEVELOPERS.md, "Shear stress estimates").
fn three_mesh_bound([q0, q1, q2]: [f64; 3]) -> f64 {
    let (d1, d2) = (q1 - q0, q2 - q1);
    let rate = 2f64.powf(FLEX_RATE);
    if d1 * d2 >= 0.0 && d1.abs() >= rate * d2.abs() {
        0.0
    } else {
        d1.abs() / (rate - 1.0) + d2.abs()
    }
}

/// τ = √(τx² + τy²) and von Mises at every sample of a level under `load`.
fn values_of(l: &FlexLevel, load: &Load) -> [Vec<f64>; 2] {
    let mut out = [
        Vec::with_capacity(l.samples.len()),
        Vec::with_capacity(l.samples.len()),
    ];
    for s in &l.samples {
        let (tau, vm) = s.stresses(load);
        out[0].push(tau);
        out[1].push(vm);
    }
    out
}

/// The largest of `fine_v` (values at the samples of `fine`) and the two-mesh estimate
/// of its error. Each node's value is the largest of its samples; each node of the
/// finer mesh gets the change from the coarser field there (interpolated on the coarser
/// mesh's elements, the prolongation) divided by 2^p − 1 ([`FLEX_RATE`]) as its error
/// eᵢ. The largest value p₁ is then at most maxᵢ(f₁ᵢ + eᵢ) and at least p₁ less the
/// error at its own node, and never estimated closer than the change of p₁ itself. So
/// the estimate follows the field near its top rather than one point: it sees a peak
/// that moves between meshes, or a second point about to overtake it, while low
/// stresses converging slowly elsewhere (sharp convex corners) do not count.
///
/// With `away` (a flag per node of the finer mesh, the coarser's nodes keeping their
/// numbers), only the nodes it flags count, for the peak, its reach and the change,
/// and the sharp re-entrant corners' term is left out: [`Flexure::peaks_away`].
fn peak_two_level(
    coarse: &FlexLevel,
    coarse_v: &[f64],
    fine: &FlexLevel,
    fine_v: &[f64],
    away: Option<&[bool]>,
) -> Peak {
    let counts = |node: usize| away.is_none_or(|a| a.get(node).copied().unwrap_or(false));
    let per_node = |l: &FlexLevel, v: &[f64]| {
        let mut out = vec![f64::NAN; l.nodes];
        for (s, &x) in l.samples.iter().zip(v) {
            if let Some(o) = out.get_mut(s.node as usize) {
                *o = if o.is_nan() { x } else { o.max(x) };
            }
        }
        out
    };
    let (c0, c1) = (per_node(coarse, coarse_v), per_node(fine, fine_v));
    // The coarser field at the finer nodes: interpolated where the prolongation is at
    // hand, else only at the nodes both meshes share.
    let mut c0_at = vec![f64::NAN; fine.nodes];
    match &fine.prolong {
        Some(p) if p.coarse == c0.len() && p.fine() == c1.len() => {
            let filled: Vec<f64> = c0
                .iter()
                .map(|v| if v.is_nan() { 0.0 } else { *v })
                .collect();
            p.apply(&filled, &mut c0_at, false);
        }
        _ => {
            for (o, &v) in c0_at.iter_mut().zip(&c0) {
                *o = v;
            }
        }
    }
    let ((p0, _, _), (p1, at, node)) =
        (largest(coarse, coarse_v, away), largest(fine, fine_v, away));
    let div = 2f64.powf(FLEX_RATE) - 1.0;
    let e_at = |i: usize| {
        let e = (c1.get(i).copied().unwrap_or(f64::NAN)
            - c0_at.get(i).copied().unwrap_or(f64::NAN))
        .abs()
            / div;
        if e.is_nan() {
            0.0
        } else {
            e
        }
    };
    let reach = (0..c1.len())
        .filter(|&i| !c1[i].is_nan() && counts(i))
        .map(|i| c1[i] + e_at(i))
        .fold(f64::NEG_INFINITY, f64::max);
    // At a sharp re-entrant corner the stress is singular and grows at every refinement
    // (as h^(1 − π/α) for an interior angle α; Williams 1952): its change counts
    // whatever its value, so a corner that will overtake the peak withholds it.
    // Corners not looked for give no estimate at all.
    let at_corners = match (away, &coarse.corners) {
        (Some(_), _) => 0.0,
        (None, None) => f64::INFINITY,
        (None, Some(c)) => (c.iter())
            .map(|c| e_at(c.node as usize))
            .fold(0.0, f64::max),
    };
    let err = ((p1 - p0).abs() / div)
        .max(FLOOR * p1.abs())
        .max(e_at(node))
        .max(reach - p1)
        .max(at_corners);
    Peak {
        value: p1,
        at,
        rel_error: err / p1.abs().max(f64::MIN_POSITIVE),
    }
}

/// What one level hands to the next: the flexure functions (for the next level's
/// starting guess) and the results so far.
pub struct FlexLadder {
    nu_ref: f64,
    psi: [Vec<f64>; 2],
    levels: Vec<FlexLevel>,
}

impl FlexLadder {
    /// Starts with ν of the reference material.
    pub fn new(nu_ref: f64) -> FlexLadder {
        FlexLadder {
            nu_ref,
            psi: [Vec::new(), Vec::new()],
            levels: Vec::new(),
        }
    }

    /// Solves the flexure problems on `m`, the mesh `ladder` has just solved the warping
    /// function on (its results `level`: J, the centroid and second moments), reusing its
    /// solver.
    /// `prolong` is the prolongation from the previous mesh onto `m` (none on the base
    /// mesh).
    pub fn solve(
        &mut self,
        m: &Mesh,
        ladder: &Ladder,
        level: &Level,
        prolong: Option<Prolong>,
        cancel: Option<&AtomicBool>,
    ) -> Result<(), Failure> {
        let mg = ladder.solver().ok_or(Failure::Degenerate)?;
        let level = solve_level(self, m, mg, ladder.warping(), level, prolong, cancel)?;
        self.levels.push(level);
        if self.levels.len() > 3 {
            self.levels.remove(0);
        }
        Ok(())
    }

    /// The latest level's mesh `m` is about to be refined: it becomes the coarser of
    /// the next pair, whose estimate needs its sharp re-entrant corners.
    pub fn refining(&mut self, m: &Mesh) {
        if let Some(l) = self.levels.last_mut().filter(|l| l.nodes == m.nodes.len()) {
            l.corners = Some(reentrant_corners(m));
        }
    }

    /// Whether the shear areas and the largest shear stress of each unit load (Vx, Vy,
    /// T alone) are within `tol` on the levels so far (two are needed), by the two-mesh
    /// estimates alone: the stopping rule, so that a peak that has not settled costs no
    /// level; the peaks given ([`Flexure::peaks`]) add the three-mesh check.
    pub fn converged(&self, tol: f64) -> bool {
        let zero = |_: Pt| 0.0;
        let unit = |k: usize| Load {
            vx: f64::from(k == 0),
            vy: f64::from(k == 1),
            t: f64::from(k == 2),
            sigma: &zero,
        };
        let peaks_ok = (0..3).all(|k| {
            peaks_over(&self.levels, &unit(k), None, false).is_some_and(|p| p.0.rel_error <= tol)
        });
        peaks_ok && self.area_estimate().is_some_and(|(_, e)| e <= tol)
    }

    /// The shear areas of the finest level, and their estimated relative error (the
    /// two-mesh estimate, [`FLEX_RATE`]).
    fn area_estimate(&self) -> Option<([f64; 2], f64)> {
        let [a, b] = self.levels.get(self.levels.len().checked_sub(2)?..)? else {
            return None;
        };
        let est = [0, 1].map(|k| {
            let (v, e) = super::two_level(a.area[k], b.area[k], FLEX_RATE);
            (v, e.max(FLOOR * v.abs()))
        });
        let err = (est.iter()).fold(0.0, |m: f64, &(v, e)| {
            m.max(e / v.abs().max(f64::MIN_POSITIVE))
        });
        Some((est.map(|(v, _)| v), err))
    }

    /// The results, those of the finest level with their two-mesh estimates; `None` with
    /// fewer than two levels.
    pub fn finish(self, tol: f64) -> Option<Flexure> {
        let (area, err) = self.area_estimate()?;
        Some(Flexure {
            shear_area: area,
            shear_area_error: err,
            nu_ref: self.nu_ref,
            tol,
            levels: self.levels,
        })
    }
}

/// The right-hand side's vector fields and scalars at local point (x, y) about the
/// centroid: `[d for Vx, d for Vy]` and `[r for Vx, r for Vy]`.
fn terms(i: [f64; 3], x: f64, y: f64) -> ([[f64; 2]; 2], [f64; 2]) {
    let [ixx, iyy, ixy] = i;
    let (h, xy) = (0.5 * (x * x - y * y), x * y);
    (
        [
            [ixx * h - ixy * xy, ixy * h + ixx * xy],
            [-ixy * h + iyy * xy, -iyy * h - ixy * xy],
        ],
        [ixx * x - ixy * y, iyy * y - ixy * x],
    )
}

/// The six nodes of the reference triangle as a rule (weights zero), for the gradients
/// at the nodes.
fn node_rule() -> Rule {
    Rule::at_points(&[
        (0.0, 0.0),
        (1.0, 0.0),
        (0.0, 1.0),
        (0.5, 0.0),
        (0.5, 0.5),
        (0.0, 0.5),
    ])
}

fn solve_level(
    fl: &mut FlexLadder,
    m: &Mesh,
    mg: &Multigrid,
    omega: &[f64],
    level: &Level,
    prolong: Option<Prolong>,
    cancel: Option<&AtomicBool>,
) -> Result<FlexLevel, Failure> {
    let nn = m.nodes.len();
    let j = level.j;
    if omega.len() != nn || j.is_nan() || j <= 0.0 {
        return Err(Failure::Degenerate);
    }
    let r4 = Rule::degree4();
    // The centroid and second moments of the torsion solve on the same mesh.
    let (c, mom) = (level.centroid, level.moments);
    let [ixx, iyy, ixy] = mom;
    let d = ixx * iyy - ixy * ixy;
    if level.area.is_nan() || level.area <= 0.0 || d.is_nan() || d <= 0.0 {
        return Err(Failure::Degenerate);
    }
    let k1 = 1.0 + fl.nu_ref;
    // Loads ∫gν·d·∇Nᵢ + 2(1 + ν)g·r·Nᵢ, with gν = n(1 + ν_ref) − g, (1 + ν)g = n(1 + ν_ref);
    // for the energy below, the first term alone (`fd`) and ∫(gν)²|d|²/g dA (`dd`), over
    // the elements with g > 0.
    let mut f = [vec![0.0; nn], vec![0.0; nn]];
    let mut fd = [vec![0.0; nn], vec![0.0; nn]];
    let mut dd = [0.0; 2];
    let straight = Straight::get();
    for (ei, e) in m.elems.iter().enumerate() {
        let p = e.map(|v| m.nodes[v as usize].sub(c));
        let el = Element::new(&p, m.curved[ei]).ok_or(Failure::Degenerate)?;
        let (n, g) = (m.weight[ei], m.shear[ei]);
        let (gnu, w2) = (n * k1 - g, 2.0 * n * k1);
        let stiff = g > 0.0;
        // The element's [from d, from r] loads, per load case and node: on a straight
        // element d and r are quadratics of its own space (p2::Straight::field_integrals).
        let mut le = [[[0.0; 6]; 2]; 2];
        let curved = matches!(el, Element::Curved(_));
        if !curved {
            let (mut dn, mut rn) = ([[[0.0; 2]; 6]; 2], [[0.0; 6]; 2]);
            for (b, pb) in p.iter().enumerate() {
                let (dv, r) = terms(mom, pb.x, pb.y);
                for k in 0..2 {
                    (dn[k][b], rn[k][b]) = (dv[k], r[k]);
                }
            }
            for (k, lk) in le.iter_mut().enumerate() {
                let (ld, lr, dsq) =
                    (straight.field_integrals(&p, &dn[k], &rn[k])).ok_or(Failure::Degenerate)?;
                if stiff {
                    dd[k] += gnu * gnu * dsq / g;
                }
                for a in 0..6 {
                    (lk[0][a], lk[1][a]) = (gnu * ld[a], w2 * lr[a]);
                }
            }
        }
        for q in (0..r4.points()).filter(|_| curved) {
            let at_q = el.at(&r4, q).ok_or(Failure::Degenerate)?;
            let (dv, r) = terms(mom, at_q.x, at_q.y);
            for (k, lk) in le.iter_mut().enumerate() {
                let dk = dv[k];
                if stiff {
                    dd[k] += at_q.da * gnu * gnu * (dk[0] * dk[0] + dk[1] * dk[1]) / g;
                }
                let (sd, sr) = (at_q.da * gnu, at_q.da * w2 * r[k]);
                let [ld, lr] = lk;
                for (a, (l0, l1)) in ld.iter_mut().zip(lr.iter_mut()).enumerate() {
                    *l0 += sd * (dk[0] * at_q.gx[a] + dk[1] * at_q.gy[a]);
                    *l1 += sr * r4.n[q][a];
                }
            }
        }
        for (k, [ld, lr]) in le.iter().enumerate() {
            for (a, &node) in e.iter().enumerate() {
                f[k][node as usize] += ld[a] + lr[a];
                if stiff {
                    fd[k][node as usize] += ld[a];
                }
            }
        }
    }
    for fk in &mut f {
        for &pn in &m.pinned {
            fk[pn as usize] = 0.0;
        }
    }
    let scale = 1.0 / (2.0 * k1 * d);
    let mut psi = [vec![0.0; nn], vec![0.0; nn]];
    for (k, pk) in psi.iter_mut().enumerate() {
        if let Some(p) =
            (prolong.as_ref()).filter(|p| p.fine() == nn && p.coarse == fl.psi[k].len())
        {
            p.apply(&fl.psi[k], pk, false);
            for &pn in &m.pinned {
                pk[pn as usize] = 0.0;
            }
        }
    }
    {
        let [p0, p1] = &mut psi;
        mg.solve_many([&f[0], &f[1]], [p0, p1], RTOL, cancel)?;
    }
    let mut energy = [0.0; 2];
    let kk = mg.finest().ok_or(Failure::Degenerate)?;
    let mut ku = vec![0.0; nn];
    for k in 0..2 {
        kk.mul(&psi[k], &mut ku);
        super::torsion::converged(&ku, &f[k], m.elems.len())?;
        // The energy ∫τ²/g dA of the unit shear, τ = s·(g∇Ψ − gν·d) with s = 1/(2(1 + ν_ref)D):
        // s²·(∫g|∇Ψ|² − 2∫gν·d·∇Ψ + ∫(gν)²|d|²/g) = s²·(ΨᵀKΨ − 2Ψ·fd + dd), the first term
        // from the level's stiffness (assembled with g by the torsion solve, exact for these
        // quadratic integrands; Ψ is zero at the pinned nodes, where K was changed).
        let dot = |a: &[f64], b: &[f64]| a.iter().zip(b).map(|(x, y)| x * y).sum::<f64>();
        energy[k] = scale * scale * (dot(&psi[k], &ku) - 2.0 * dot(&psi[k], &fd[k]) + dd[k]);
    }
    if !(energy[0] > 0.0 && energy[1] > 0.0) {
        return Err(Failure::Degenerate);
    }
    // τ from unit loads at a point of element `ei` with gradients `gx`, `gy`.
    let tau_at = |ei: usize, e: &[u32; 6], x: f64, y: f64, gx: &[f64; 6], gy: &[f64; 6]| {
        let (n, g) = (m.weight[ei], m.shear[ei]);
        let gnu = n * k1 - g;
        let grad = |u: &[f64]| {
            (0..6).fold([0.0, 0.0], |acc, i| {
                let v = u[e[i] as usize];
                [acc[0] + v * gx[i], acc[1] + v * gy[i]]
            })
        };
        let (dv, _) = terms(mom, x, y);
        let mut out = [[0.0; 2]; 3];
        for k in 0..2 {
            let gp = grad(&psi[k]);
            out[k] = [
                scale * (g * gp[0] - gnu * dv[k][0]),
                scale * (g * gp[1] - gnu * dv[k][1]),
            ];
        }
        let gw = grad(omega);
        out[2] = [g / j * (gw[0] - y), g / j * (gw[1] + x)];
        out
    };
    let samples = recover(m, c, &tau_at)?;
    // b = −∇·τ of each unit shear: n·r/D (the right-hand side above, scaled like τ).
    let load = |ei: usize, x: f64, y: f64| {
        let (_, r) = terms(mom, x, y);
        [m.weight[ei] * r[0] / d, m.weight[ei] * r[1] / d]
    };
    let joints = super::joint_flow::level(m, c, &tau_at, &load)?;
    fl.psi = psi;
    Ok(FlexLevel {
        area: [1.0 / energy[0], 1.0 / energy[1]],
        samples,
        joints,
        nodes: nn,
        corners: None,
        prolong,
    })
}

/// τ from the three unit loads at a point of an element: element index, its nodes, the
/// point (local frame) and the shape functions' gradients there.
pub(super) type TauAt<'a> =
    dyn Fn(usize, &[u32; 6], f64, f64, &[f64; 6], &[f64; 6]) -> [[f64; 2]; 3] + 'a;

/// Nodal stresses: each node's elements' values at it, area-weighted; at a node where
/// materials meet, each element's own value.
fn recover(m: &Mesh, c: Pt, tau_at: &TauAt) -> Result<Vec<Sample>, Failure> {
    let rule = node_rule();
    let nn = m.nodes.len();
    // The material of the first element seen at each node, and whether another meets it.
    let mut mat: Vec<Option<[f64; 2]>> = vec![None; nn];
    let mut mixed = vec![false; nn];
    for (ei, e) in m.elems.iter().enumerate() {
        let here = [m.weight[ei], m.shear[ei]];
        for &v in e {
            match mat[v as usize] {
                None => mat[v as usize] = Some(here),
                Some(h) if h != here => mixed[v as usize] = true,
                Some(_) => {}
            }
        }
    }
    let mut sum = vec![[[0.0; 2]; 3]; nn];
    let mut wsum = vec![0.0; nn];
    let mut per_elem = Vec::new();
    for (ei, e) in m.elems.iter().enumerate() {
        let p = e.map(|v| m.nodes[v as usize].sub(c));
        let area = tri_area(&p);
        let el = Element::new(&p, m.curved[ei]).ok_or(Failure::Degenerate)?;
        for q in 0..6 {
            let a = el.at(&rule, q).ok_or(Failure::Degenerate)?;
            let t = tau_at(ei, e, a.x, a.y, &a.gx, &a.gy);
            let node = e[q] as usize;
            if mixed[node] {
                per_elem.push((node, m.weight[ei], t));
                continue;
            }
            for (s, v) in sum[node].iter_mut().zip(&t) {
                s[0] += area * v[0];
                s[1] += area * v[1];
            }
            wsum[node] += area;
        }
    }
    let mut out = Vec::with_capacity(nn + per_elem.len());
    for (i, (s, &w)) in sum.iter().zip(&wsum).enumerate() {
        if mixed[i] || w <= 0.0 {
            continue;
        }
        let n = mat[i].map_or(1.0, |h| h[0]);
        out.push(Sample {
            at: m.nodes[i].add(m.origin),
            node: i as u32,
            n,
            tau: s.map(|v| [v[0] / w, v[1] / w]),
        });
    }
    out.extend(per_elem.into_iter().map(|(node, n, tau)| Sample {
        at: m.nodes[node].add(m.origin),
        node: node as u32,
        n,
        tau,
    }));
    Ok(out)
}

/// Interior angles a boundary node may have and still be smooth (a curved outline's
/// nodes): up to 200°. Past it the node is a sharp re-entrant corner.
const SMOOTH_ANGLE: f64 = 200.0;

/// The nodes of `m` at sharp re-entrant corners of the region: corner nodes whose
/// elements' angles (between the tangents of their curved sides, so a curved outline
/// stays at 180°) add up to more than [`SMOOTH_ANGLE`] and short of the full turn of
/// an interior node; each with its [`Corner::reach`].
fn reentrant_corners(m: &Mesh) -> Vec<Corner> {
    let mut angle = vec![0.0f64; m.nodes.len()];
    for e in &m.elems {
        let p = e.map(|v| m.nodes[v as usize]);
        // Corner a, its edges to b and c with their mid-side nodes.
        for (a, b, mab, c, mac) in [(0, 1, 3, 2, 5), (1, 2, 4, 0, 3), (2, 0, 5, 1, 4)] {
            // The tangent of the quadratic side a–m–b at a: −3a + 4m − b.
            let t = |b: usize, mid: usize| {
                Pt::new(
                    -3.0 * p[a].x + 4.0 * p[mid].x - p[b].x,
                    -3.0 * p[a].y + 4.0 * p[mid].y - p[b].y,
                )
            };
            let (u, v) = (t(b, mab), t(c, mac));
            let turn = (u.x * v.y - u.y * v.x).atan2(u.x * v.x + u.y * v.y).abs();
            angle[e[a] as usize] += turn.to_degrees();
        }
    }
    let reentrant = |a: f64| a > SMOOTH_ANGLE && a < 359.0;
    // Every corner of the outline, convex (short of 360° − SMOOTH_ANGLE) or re-entrant.
    let all: Vec<Pt> = (angle.iter().zip(&m.nodes))
        .filter(|&(&a, _)| a > 0.0 && (a < 360.0 - SMOOTH_ANGLE || reentrant(a)))
        .map(|(_, &p)| p)
        .collect();
    (angle.iter().enumerate())
        .filter(|&(_, &a)| reentrant(a))
        .map(|(i, _)| {
            let p = m.nodes[i];
            let nearest = (all.iter())
                .map(|q| q.dist(p))
                .filter(|&d| d > 0.0)
                .fold(f64::INFINITY, f64::min);
            Corner {
                node: i as u32,
                at: p.add(m.origin),
                reach: AWAY * if nearest.is_finite() { nearest } else { 0.0 },
            }
        })
        .collect()
}

/// Area of the straight triangle through an element's corners.
fn tri_area(p: &[Pt; 6]) -> f64 {
    let (a, b) = (p[1].sub(p[0]), p[2].sub(p[0]));
    0.5 * (a.x * b.y - a.y * b.x).abs()
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::fe::{torsion, TorsionOptions};
    use crate::geom::{Anchor, Piece, Placement, Shape};

    fn flex(shape: Shape, nu: f64) -> Flexure {
        let pl = Placement {
            at: Pt::default(),
            anchor: Anchor::Center,
            rotate: 0.0,
            flip_x: false,
            flip_y: false,
        };
        let p = vec![Piece::plain("p", pl.apply(&shape.contours()), false)];
        let opts = TorsionOptions {
            flexure: Some(nu),
            ..TorsionOptions::default()
        };
        let t = torsion(&p, &opts).expect("torsion solves");
        t.flexure.expect("asked for").expect("flexure solves")
    }

    fn tau_max(f: &Flexure, vx: f64, vy: f64, t: f64) -> Peak {
        let zero = |_: Pt| 0.0;
        let load = Load {
            vx,
            vy,
            t,
            sigma: &zero,
        };
        f.peaks(&load).expect("two levels").0
    }

    #[test]
    fn rectangle_without_poisson_is_the_elementary_parabola() {
        // ν = 0: τ = (3V/2A)(1 − 4y²/h²) exactly (Timoshenko & Goodier, Theory of
        // Elasticity, §124: the elementary solution is exact when ν = 0), and the
        // energy of that parabola gives A_s = 5A/6 (closed form: ∫τ² dA = 6V²/(5A)).
        let (b, h) = (40.0, 100.0);
        let f = flex(Shape::Rect { b, h }, 0.0);
        let a = b * h;
        for (k, name) in [(0, "x"), (1, "y")] {
            let err = (f.shear_area[k] - 5.0 * a / 6.0).abs() / (5.0 * a / 6.0);
            assert!(
                err < 1e-6,
                "shear area {name}: {} vs {}",
                f.shear_area[k],
                5.0 * a / 6.0
            );
        }
        assert!(f.shear_area_error <= 1e-3);
        // τmax from Vx (the peak runs along the whole line x = 0 up to the boundary,
        // where the recovered nodal stresses converge less evenly) is left to the
        // error estimate, which withholds it when it misses the tolerance.
        // Nodal stresses converge as h², slower than the energy: the accuracy asked
        // of every shear figure is 1e-3 (docs/format.md, Accuracy).
        let p = tau_max(&f, 0.0, 1.0, 0.0);
        let exact = 1.5 / a;
        let err = (p.value - exact).abs() / exact;
        assert!(
            err < 1e-3 && p.rel_error < 1e-3,
            "{}: vs {exact}, estimate {:.1e}",
            p.value,
            p.rel_error
        );
        // On the neutral axis, y = 0, to the resolution of the samples (τ falls off as
        // 1 − 4y²/h², so a value within 1e-3 of the peak lies within 0.016·h of it).
        assert!(p.at.y.abs() < 0.02 * h, "{:?}", p.at);
    }

    #[test]
    fn turning_a_rectangle_swaps_its_shear_areas() {
        // A rectangle turned a quarter turn swaps its x and y shear areas (symmetry of
        // the flexure problem under x ↔ y with Ixx ↔ Iyy; Timoshenko & Goodier, flexure
        // of bars), with ν ≠ 0 so that the Poisson terms are exercised too.
        let f = flex(Shape::Rect { b: 30.0, h: 10.0 }, 0.3);
        let g = flex(Shape::Rect { b: 10.0, h: 30.0 }, 0.3);
        for k in 0..2 {
            let e = (f.shear_area[k] - g.shear_area[1 - k]).abs() / f.shear_area[k];
            assert!(e < 1e-5, "{k}: {:?} vs {:?}", f.shear_area, g.shear_area);
        }
    }
}
