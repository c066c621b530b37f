//! Saint-Venant torsion on one mesh: the warping function, J, the shear centre and the
//! warping constant: Saint-Venant torsion by the warping function, the shear centre
//! after Trefftz and the warping constant about it (Pilkey, Analysis and Design of
//! Elastic Beams, Wiley 2002, ch. 6; cited from memory).
//!
//! Coordinates are about the centroid of the mesh itself, and the second moments in the
//! formulas are those of the mesh, from the same quadrature, so that J, the shear
//! centre and Cw are consistent with the geometry actually solved. The Saint-Venant
//! problem (stiffness, load, J) carries each element's shear modulus ratio G_i/G_ref
//! (the shear stresses are G·θ′·(∇ω + (−y, x))); the warping normal stresses are
//! E·θ″·ω_S, so the Trefftz integrals, the second moments and Cw carry the modular
//! ratio n_i = E_i/E_ref (FORMAT.md "Materials").
//!
//! Separate pieces (components of the mesh) bend together but warp separately, so
//! the shear centre and Cw use each component's own centroidal second moments
//! (docs/separate-pieces.md): with ω of zero mean on each component,
//! I_ωx = ∫x·ω, I_ωy = ∫y·ω, Sxx, Syy, Sxy the sums of the components' own
//! moments, D′ = Sxx·Syy − Sxy², xs = (Sxy·I_ωx − Syy·I_ωy)/D′,
//! ys = (Sxx·I_ωx − Sxy·I_ωy)/D′, ω_S = ω − ys·X_i + xs·Y_i on component i (X_i, Y_i
//! about its own centroid) and Cw = Σ_i ∫_i ω_S². One component is the ordinary
//! Trefftz definition (Trefftz 1935; Pilkey, Analysis and Design of Elastic Beams, 2002,
//! ch. 6).

use super::mesh::Mesh;
use super::p2::{at, Rule, Straight};
use super::solve::{Cancelled, Csr, FactorError, Multigrid, Prolong};
use crate::geom::Pt;
use std::sync::atomic::AtomicBool;

/// The results on one mesh, in the mesh's local frame.
#[derive(Debug, Clone, Copy)]
pub struct Level {
    pub j: f64,
    pub cw: f64,
    /// Shear centre in the local frame of the mesh.
    pub sc: Pt,
    pub area: f64,
    /// Polar moment about the centroid, Ixx + Iyy.
    pub ip: f64,
    /// The modulus-weighted centroid in the local frame of the mesh, and the second
    /// moments `[Ixx, Iyy, Ixy]` about it (n-weighted, the same quadrature): what the
    /// flexure problem on the same mesh needs.
    pub centroid: Pt,
    pub moments: [f64; 3],
    pub elements: usize,
    pub iterations: usize,
}

/// Why a level could not be solved.
#[derive(Debug)]
pub enum Failure {
    Cancelled,
    Degenerate,
    /// The iterations did not reach the tolerance (an indefinite or badly
    /// conditioned matrix: elements in a cusp where outlines touch).
    Stalled {
        elements: usize,
    },
    /// The base matrix's direct factor is past the budget.
    TooLarge {
        entries: usize,
        flops: f64,
    },
}

impl From<Cancelled> for Failure {
    fn from(_: Cancelled) -> Failure {
        Failure::Cancelled
    }
}

/// The degree-4 quadrature points of every element: `[n·dA, x, y]` in the mesh's
/// local frame, element by element. A straight element's Jacobian is constant (twice
/// its corners' area; p2::Straight), so only a curved one is mapped point by point.
fn points(m: &Mesh, rule: &Rule) -> Result<Vec<[f64; 3]>, Failure> {
    let mut out = Vec::with_capacity(m.elems.len() * rule.points());
    for ((e, &n), &curved) in m.elems.iter().zip(&m.weight).zip(&m.curved) {
        let p = e.map(|v| m.nodes[v as usize]);
        if curved {
            for q in 0..rule.points() {
                let g = at(&p, rule, q).ok_or(Failure::Degenerate)?;
                out.push([n * g.da, g.x, g.y]);
            }
            continue;
        }
        let det = p[1].sub(p[0]).cross(p[2].sub(p[0]));
        if det.is_nan() || det <= 0.0 {
            return Err(Failure::Degenerate);
        }
        for (w, nq) in rule.w.iter().zip(&rule.n) {
            let (mut x, mut y) = (0.0, 0.0);
            for (ni, pi) in nq.iter().zip(&p) {
                x += ni * pi.x;
                y += ni * pi.y;
            }
            out.push([n * 0.5 * w * det, x, y]);
        }
    }
    Ok(out)
}

/// Relative residual to which the refined levels are solved. J is stationary in ω, so
/// its error from the solver is of the order of the square of this.
const RTOL: f64 = 1e-7;

/// What one level hands to the next: the multigrid hierarchy so far and the solution.
#[derive(Default)]
pub struct Ladder {
    mg: Option<Multigrid>,
    u: Vec<f64>,
    /// Right-hand sides each level's solver serves (the warping function and any the
    /// caller adds: [`Ladder::solving`]).
    rhs: usize,
}

impl Ladder {
    /// A ladder whose solver will serve `rhs` right-hand sides on each level (1 for the
    /// warping function alone, 3 with the flexure problem's two), so that a level is
    /// factored directly when that is cheaper for all of them together.
    pub fn solving(rhs: usize) -> Ladder {
        Ladder {
            rhs,
            ..Ladder::default()
        }
    }

    /// Solves the warping problem on `m`: the base mesh when `step` is `None` (a
    /// direct solve), else the refinement of the previous mesh that `step` prolongs onto
    /// (multigrid-preconditioned conjugate gradients from the prolonged solution).
    pub fn solve(
        &mut self,
        m: &Mesh,
        step: Option<Prolong>,
        cancel: Option<&AtomicBool>,
    ) -> Result<Level, Failure> {
        solve(self, m, step, cancel)
    }

    /// The solver of the latest level (its finest matrix is that level's stiffness),
    /// for further right-hand sides on the same mesh (the flexure problem).
    pub fn solver(&self) -> Option<&Multigrid> {
        self.mg.as_ref()
    }

    /// The warping function of the latest level, at its nodes.
    pub fn warping(&self) -> &[f64] {
        &self.u
    }
}

fn solve(
    ladder: &mut Ladder,
    m: &Mesh,
    step: Option<Prolong>,
    cancel: Option<&AtomicBool>,
) -> Result<Level, Failure> {
    let r4 = Rule::degree4();
    let pts = points(m, &r4)?;
    // Area moments [A, ∫x, ∫y, ∫x², ∫y², ∫xy] about the local origin.
    let mut s = [0.0; 6];
    for &[da, x, y] in &pts {
        s[0] += da;
        s[1] += da * x;
        s[2] += da * y;
        s[3] += da * x * x;
        s[4] += da * y * y;
        s[5] += da * x * y;
    }
    if s[0] <= 0.0 {
        return Err(Failure::Degenerate);
    }
    let c = Pt::new(s[1] / s[0], s[2] / s[0]);
    // About the centroid: Iyy = ∫x², Ixx = ∫y², Ixy = ∫xy.
    // The polar moment ∫(G/G_ref)·r² dA about that centroid, for J.
    let nq = r4.points();
    let ip: f64 = pts
        .chunks_exact(nq)
        .zip(m.weight.iter().zip(&m.shear))
        .map(|(pe, (&n, &g))| {
            let r2: f64 = pe
                .iter()
                .map(|&[da, x, y]| da * ((x - c.x).powi(2) + (y - c.y).powi(2)))
                .sum();
            if n > 0.0 {
                r2 * g / n
            } else {
                0.0
            }
        })
        .sum();
    let nn = m.nodes.len();
    let mut f = vec![0.0; nn];
    // Stiffness ∫g∇Nᵢ·∇Nⱼ dA and load ∫g(y ∂Nᵢ/∂x − x ∂Nᵢ/∂y) dA, g = G/G_ref: a
    // straight element from the reference integrals (p2::Straight), a curved one by
    // quadrature.
    let straight = Straight::get();
    let mut k = Csr::assemble(nn, &m.elems, |ei| {
        let e = &m.elems[ei];
        let p = e.map(|v| m.nodes[v as usize].sub(c));
        let n = m.shear[ei];
        let (mut ke, mut fe) = ([[0.0; 6]; 6], [0.0; 6]);
        if m.curved[ei] {
            for q in 0..r4.points() {
                let g = at(&p, &r4, q).ok_or(Failure::Degenerate)?;
                for (a, row) in ke.iter_mut().enumerate() {
                    fe[a] += g.da * (g.y * g.gx[a] - g.x * g.gy[a]);
                    for (b, v) in row.iter_mut().enumerate() {
                        *v += g.da * (g.gx[a] * g.gx[b] + g.gy[a] * g.gy[b]);
                    }
                }
            }
        } else {
            (ke, fe) = straight.stiffness_and_load(&p).ok_or(Failure::Degenerate)?;
        }
        for (a, row) in ke.iter_mut().enumerate() {
            f[e[a] as usize] += n * fe[a];
            row.iter_mut().for_each(|v| *v *= n);
        }
        Ok::<_, Failure>(ke)
    })?;
    for &pn in &m.pinned {
        k.pin(pn as usize);
        f[pn as usize] = 0.0;
    }
    let mut u = vec![0.0; nn];
    let mut ku = vec![0.0; nn];
    let iterations = match step {
        None => {
            let mg = base_solver(k, m, ladder.rhs, cancel)?;
            let it = mg.solve(&f, &mut u, RTOL, cancel)?;
            mg.finest().ok_or(Failure::Degenerate)?.mul(&u, &mut ku);
            ladder.mg = Some(mg);
            it
        }
        Some(p) => {
            let mg = ladder
                .mg
                .as_mut()
                .filter(|_| p.fine() == nn && p.coarse == ladder.u.len())
                .ok_or(Failure::Degenerate)?;
            p.apply(&ladder.u, &mut u, false);
            for &pn in &m.pinned {
                u[pn as usize] = 0.0;
            }
            mg.push(p, k, cancel);
            let it = mg.solve(&f, &mut u, RTOL, cancel)?;
            mg.finest().ok_or(Failure::Degenerate)?.mul(&u, &mut ku);
            it
        }
    };
    // A solve that stopped short (iteration limit, or an indefinite matrix) is not
    // worth a figure: the residual is checked against the tolerance, with margin.
    converged(&ku, &f, m.elems.len())?;
    // J = Ip − ∫n(x ∂ω/∂y − y ∂ω/∂x)… written as the stationary value
    // Ip − (2fᵀu − uᵀKu), whose error is second order in the solver's error.
    let fu: f64 = f.iter().zip(&u).map(|(a, b)| a * b).sum();
    let uku: f64 = ku.iter().zip(&u).map(|(a, b)| a * b).sum();
    let j = ip - (2.0 * fu - uku);
    // ω at the quadrature points; each component's warping made zero-mean (the
    // constant is arbitrary), with each component's own n-weighted area moments
    // [A, ∫x, ∫y, ∫x², ∫y², ∫xy] about the mesh centroid.
    let mut w = Vec::with_capacity(pts.len());
    let mut own = vec![[0.0; 7]; m.pinned.len()];
    let comp_of = |e: &[u32; 6]| m.component[e[0] as usize] as usize;
    for (e, pe) in m.elems.iter().zip(pts.chunks_exact(nq)) {
        let comp = comp_of(e);
        let ue = e.map(|v| u[v as usize]);
        for (q, &[da, x, y]) in pe.iter().enumerate() {
            let wq: f64 = (0..6).map(|i| r4.n[q][i] * ue[i]).sum();
            w.push(wq);
            if let Some(o) = own.get_mut(comp) {
                let (x, y) = (x - c.x, y - c.y);
                for (v, t) in o.iter_mut().zip([wq, 1.0, x, y, x * x, y * y, x * y]) {
                    *v += da * t;
                }
            }
        }
    }
    // Per component: [∫ω, A, x̄_i, ȳ_i, Iyy_i, Ixx_i, Ixy_i], its own centroid and moments.
    let own: Vec<[f64; 7]> = own
        .iter()
        .map(|o| {
            if o[1] <= 0.0 {
                return [0.0; 7];
            }
            let (cx, cy) = (o[2] / o[1], o[3] / o[1]);
            [
                o[0] / o[1],
                o[1],
                cx,
                cy,
                o[4] - o[1] * cx * cx,
                o[5] - o[1] * cy * cy,
                o[6] - o[1] * cx * cy,
            ]
        })
        .collect();
    let zero = [0.0; 7];
    let own_of = |e: &[u32; 6]| own.get(comp_of(e)).unwrap_or(&zero);
    for (we, e) in w.chunks_exact_mut(nq).zip(&m.elems) {
        let mean = own_of(e)[0];
        we.iter_mut().for_each(|wq| *wq -= mean);
    }
    // Trefftz with the components' own second moments: I_ωx = ∫xω, I_ωy = ∫yω.
    let (mut iwx, mut iwy) = (0.0, 0.0);
    for (&[da, x, y], &wq) in pts.iter().zip(&w) {
        iwx += da * (x - c.x) * wq;
        iwy += da * (y - c.y) * wq;
    }
    let (syy, sxx, sxy) = own
        .iter()
        .fold((0.0, 0.0, 0.0), |s, o| (s.0 + o[4], s.1 + o[5], s.2 + o[6]));
    let d = sxx * syy - sxy * sxy;
    let (xs, ys) = if d > 0.0 {
        ((sxy * iwx - syy * iwy) / d, (sxx * iwx - sxy * iwy) / d)
    } else {
        (0.0, 0.0)
    };
    // Cw = Σ_i [∫_i ω_S² − (∫_i ω_S)²/A_i], ω_S = ω − ys·X_i + xs·Y_i on component i.
    let mut sums = vec![[0.0; 2]; own.len()];
    for ((pe, we), e) in pts.chunks_exact(nq).zip(w.chunks_exact(nq)).zip(&m.elems) {
        let o = own_of(e);
        let Some(sm) = sums.get_mut(comp_of(e)) else {
            continue;
        };
        for (&[da, x, y], &wq) in pe.iter().zip(we) {
            let (xi, yi) = (x - c.x - o[2], y - c.y - o[3]);
            let ws = wq - ys * xi + xs * yi;
            sm[0] += da * ws;
            sm[1] += da * ws * ws;
        }
    }
    let cw: f64 = sums
        .iter()
        .zip(&own)
        .map(|(sm, o)| {
            if o[1] > 0.0 {
                sm[1] - sm[0] * sm[0] / o[1]
            } else {
                sm[1]
            }
        })
        .sum();
    ladder.u = u;
    Ok(Level {
        j,
        cw,
        sc: Pt::new(c.x + xs, c.y + ys),
        area: s[0],
        ip,
        centroid: c,
        moments: [
            s[4] - s[0] * c.y * c.y,
            s[3] - s[0] * c.x * c.x,
            s[5] - s[0] * c.x * c.y,
        ],
        elements: m.elems.len(),
        iterations,
    })
}

/// The solver of the base mesh's matrix `k` (pinned): its envelope factor, or, past
/// [`TWO_LEVEL_ROWS`] unknowns, where that factor grows to most of the run (the
/// 300-hole plate: 41,000 unknowns; DEVELOPERS.md, "Benchmark figures"), conjugate
/// gradients with a two-level V-cycle: Gauss–Seidel on the 6-node matrix, and beneath
/// it the linear (3-node) elements on the same corners, Pᵀ·K·P with P the corner
/// prolongation (the linear elements' own stiffness on straight elements), factored.
/// The solve then stops at the same relative residual as the refinements ([`RTOL`]).
/// A mesh whose nodes do not allow it is factored as before.
fn base_solver(
    k: Csr,
    m: &Mesh,
    rhs: usize,
    cancel: Option<&AtomicBool>,
) -> Result<Multigrid, Failure> {
    let factor_error = |e| match e {
        FactorError::NotPositive => Failure::Degenerate,
        FactorError::Cancelled => Failure::Cancelled,
        FactorError::TooLarge { entries, flops } => Failure::TooLarge { entries, flops },
    };
    let coarse = (k.rows() > TWO_LEVEL_ROWS)
        .then(|| m.corner_prolongation())
        .flatten()
        .and_then(|p| {
            let mut c = k.galerkin(&p)?;
            for &pn in &m.pinned {
                c.pin(pn as usize);
            }
            Some((p, c))
        });
    let mut mg = match coarse {
        Some((p, c)) => {
            let mut mg = Multigrid::new(c, &m.pinned, cancel).map_err(factor_error)?;
            mg.push(p, k, cancel);
            mg
        }
        None => Multigrid::new(k, &m.pinned, cancel).map_err(factor_error)?,
    };
    mg.expect_rhs(rhs);
    Ok(mg)
}

/// Unknowns past which the base mesh is solved by the two-level iteration rather than
/// factored ([`base_solver`]): those of a refinement that is no longer considered for
/// a factor (`solve::DIRECT_MAX_ROWS`).
const TWO_LEVEL_ROWS: usize = super::solve::DIRECT_MAX_ROWS;

/// `Ok` when the residual ‖K·u − f‖ of a solve is within the solver's tolerance, with a
/// margin of 100 (`RTOL`); otherwise the solve stopped short (iteration limit, or an
/// indefinite matrix) and is not worth a figure.
pub(super) fn converged(ku: &[f64], f: &[f64], elements: usize) -> Result<(), Failure> {
    let fnorm = f.iter().map(|v| v * v).sum::<f64>().sqrt();
    let rnorm = (ku.iter().zip(f))
        .map(|(a, b)| (a - b) * (a - b))
        .sum::<f64>()
        .sqrt();
    if rnorm.is_nan() || rnorm > 100.0 * RTOL * fnorm {
        return Err(Failure::Stalled { elements });
    }
    Ok(())
}
