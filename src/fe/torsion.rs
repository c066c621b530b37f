//! Saint-Venant torsion on one mesh: the warping function, J, the shear centre and the
//! warping constant: Saint-Venant torsion by the warping function, the shear centre
//! after Trefftz and the warping constant about it (Pilkey, Analysis and Design of
//! Elastic Beams, Wiley 2002, ch. 6; cited from memory).
//!
//! Coordinates are about the centroid of the mesh itself, and the second moments in the
//! formulas are those of the mesh, from the same quadrature, so that J, the shear
//! centre and Cw are consistent with the geometry actually solved. Every integral
//! carries the element's modular ratio n: with one Poisson's ratio for all materials
//! G_i/G_ref = E_i/E_ref = n_i, so n weights both the stiffness (shear) and the
//! warping normal stresses.

use super::mesh::Mesh;
use super::p2::{at, Rule};
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
/// local frame, element by element.
fn points(m: &Mesh, rule: &Rule) -> Result<Vec<[f64; 3]>, Failure> {
    let mut out = Vec::with_capacity(m.elems.len() * rule.points());
    for (e, &n) in m.elems.iter().zip(&m.weight) {
        let p = e.map(|v| m.nodes[v as usize]);
        for q in 0..rule.points() {
            let g = at(&p, rule, q).ok_or(Failure::Degenerate)?;
            out.push([n * g.da, g.x, g.y]);
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
}

impl Ladder {
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
}

fn solve(
    ladder: &mut Ladder,
    m: &Mesh,
    step: Option<Prolong>,
    cancel: Option<&AtomicBool>,
) -> Result<Level, Failure> {
    let r4 = Rule::degree4();
    let r2 = Rule::degree2();
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
    let iyy = s[3] - s[0] * c.x * c.x;
    let ixx = s[4] - s[0] * c.y * c.y;
    let ixy = s[5] - s[0] * c.x * c.y;
    let ip = ixx + iyy;
    let nn = m.nodes.len();
    let mut k = Csr::pattern(nn, &m.elems);
    let mut f = vec![0.0; nn];
    // Stiffness ∫n∇Nᵢ·∇Nⱼ dA and load ∫n(y ∂Nᵢ/∂x − x ∂Nᵢ/∂y) dA.
    for (ei, e) in m.elems.iter().enumerate() {
        let p = e.map(|v| m.nodes[v as usize].sub(c));
        let rule = if m.curved[ei] { &r4 } else { &r2 };
        let n = m.weight[ei];
        let mut ke = [[0.0; 6]; 6];
        for q in 0..rule.points() {
            let g = at(&p, rule, q).ok_or(Failure::Degenerate)?;
            let da = n * g.da;
            for (a, row) in ke.iter_mut().enumerate() {
                f[e[a] as usize] += da * (g.y * g.gx[a] - g.x * g.gy[a]);
                for (b, v) in row.iter_mut().enumerate() {
                    *v += da * (g.gx[a] * g.gx[b] + g.gy[a] * g.gy[b]);
                }
            }
        }
        k.add_element(e, &ke);
    }
    for &pn in &m.pinned {
        k.pin(pn as usize);
        f[pn as usize] = 0.0;
    }
    let mut u = vec![0.0; nn];
    let mut ku = vec![0.0; nn];
    let iterations = match step {
        None => {
            let mg = Multigrid::new(&k, &m.pinned, cancel).map_err(|e| match e {
                FactorError::NotPositive => Failure::Degenerate,
                FactorError::Cancelled => Failure::Cancelled,
                FactorError::TooLarge { entries, flops } => Failure::TooLarge { entries, flops },
            })?;
            let it = mg.solve(&f, &mut u, RTOL, cancel)?;
            k.mul(&u, &mut ku);
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
            mg.push(p, k);
            let it = mg.solve(&f, &mut u, RTOL, cancel)?;
            mg.finest().ok_or(Failure::Degenerate)?.mul(&u, &mut ku);
            it
        }
    };
    // A solve that stopped short (iteration limit, or an indefinite matrix) is not
    // worth a figure: the residual is checked against the tolerance, with margin.
    let fnorm = f.iter().map(|v| v * v).sum::<f64>().sqrt();
    let rnorm = ku
        .iter()
        .zip(&f)
        .map(|(a, b)| (a - b) * (a - b))
        .sum::<f64>()
        .sqrt();
    if rnorm.is_nan() || rnorm > 100.0 * RTOL * fnorm {
        return Err(Failure::Stalled {
            elements: m.elems.len(),
        });
    }
    // J = Ip − ∫n(x ∂ω/∂y − y ∂ω/∂x)… written as the stationary value
    // Ip − (2fᵀu − uᵀKu), whose error is second order in the solver's error.
    let fu: f64 = f.iter().zip(&u).map(|(a, b)| a * b).sum();
    let uku: f64 = ku.iter().zip(&u).map(|(a, b)| a * b).sum();
    let j = ip - (2.0 * fu - uku);
    // ω at the quadrature points; each component's warping made zero-mean (the
    // constant is arbitrary).
    let nq = r4.points();
    let mut w = Vec::with_capacity(pts.len());
    let mut mean = vec![[0.0; 2]; m.pinned.len()];
    for (e, pe) in m.elems.iter().zip(pts.chunks_exact(nq)) {
        let comp = m.component[e[0] as usize] as usize;
        for (q, &[da, ..]) in pe.iter().enumerate() {
            let wq: f64 = (0..6).map(|i| r4.n[q][i] * u[e[i] as usize]).sum();
            w.push(wq);
            if let Some(mc) = mean.get_mut(comp) {
                mc[0] += da * wq;
                mc[1] += da;
            }
        }
    }
    let mean: Vec<f64> = mean
        .iter()
        .map(|mc| if mc[1] > 0.0 { mc[0] / mc[1] } else { 0.0 })
        .collect();
    for (k, wq) in w.iter_mut().enumerate() {
        let e = m.elems[k / nq];
        *wq -= mean[m.component[e[0] as usize] as usize];
    }
    // Trefftz: I_ωx = ∫xω, I_ωy = ∫yω about the centroid.
    let (mut iwx, mut iwy) = (0.0, 0.0);
    for (&[da, x, y], &wq) in pts.iter().zip(&w) {
        iwx += da * (x - c.x) * wq;
        iwy += da * (y - c.y) * wq;
    }
    let d = ixx * iyy - ixy * ixy;
    let (xs, ys) = if d > 0.0 {
        ((ixy * iwx - iyy * iwy) / d, (ixx * iwx - ixy * iwy) / d)
    } else {
        (0.0, 0.0)
    };
    // Cw = ∫ω_S² − (∫ω_S)²/A with ω_S = ω − y_s·x + x_s·y.
    let (mut s1, mut s2) = (0.0, 0.0);
    for (&[da, x, y], &wq) in pts.iter().zip(&w) {
        let ws = wq - ys * (x - c.x) + xs * (y - c.y);
        s1 += da * ws;
        s2 += da * ws * ws;
    }
    let cw = s2 - s1 * s1 / s[0];
    ladder.u = u;
    Ok(Level {
        j,
        cw,
        sc: Pt::new(c.x + xs, c.y + ys),
        area: s[0],
        ip,
        elements: m.elems.len(),
        iterations,
    })
}
