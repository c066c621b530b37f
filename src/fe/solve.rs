//! A sparse symmetric matrix in compressed rows and the preconditioned conjugate
//! gradient method (Hestenes & Stiefel 1952; Saad, Iterative Methods for Sparse Linear
//! Systems, 2nd ed., Alg. 9.1) with a symmetric successive over-relaxation (SSOR)
//! preconditioner (Saad §10.2).
//!
//! Why our own code rather than a sparse-matrix crate: the pattern comes straight from
//! the element connectivity, assembly adds into known rows, and the solver needs a
//! cancellation check inside its loop — about 150 lines. It has not been timed against
//! nalgebra-sparse; on the meshes this module produces the conjugate-gradient
//! iterations on the finest mesh take most of the time (see the bench
//! `benches/torsion.rs`), so a stronger preconditioner, not the container, is the
//! lever.

use std::sync::atomic::{AtomicBool, Ordering};

/// A square sparse matrix, both triangles stored, columns sorted within each row.
pub struct Csr {
    pub ptr: Vec<usize>,
    pub col: Vec<u32>,
    pub val: Vec<f64>,
    /// Position of the diagonal entry of each row in `col`/`val`.
    pub diag: Vec<usize>,
}

/// The solve was stopped by the caller's flag.
#[derive(Debug, PartialEq, Eq)]
pub struct Cancelled;

impl Csr {
    /// The pattern of a finite-element matrix: `i` and `j` are coupled when some
    /// element holds both. Values start at zero.
    pub fn pattern(nodes: usize, elems: &[[u32; 6]]) -> Csr {
        // Elements touching each node, in compressed form.
        let mut count = vec![0usize; nodes + 1];
        for e in elems {
            for &v in e {
                count[v as usize + 1] += 1;
            }
        }
        for i in 0..nodes {
            count[i + 1] += count[i];
        }
        let mut fill = count.clone();
        let mut adj = vec![0u32; count[nodes]];
        for (k, e) in elems.iter().enumerate() {
            for &v in e {
                adj[fill[v as usize]] = k as u32;
                fill[v as usize] += 1;
            }
        }
        let mut ptr = Vec::with_capacity(nodes + 1);
        ptr.push(0);
        let mut col = Vec::with_capacity(nodes * 16);
        let mut diag = Vec::with_capacity(nodes);
        let mut row: Vec<u32> = Vec::with_capacity(64);
        for i in 0..nodes {
            row.clear();
            for &k in &adj[count[i]..count[i + 1]] {
                row.extend_from_slice(&elems[k as usize]);
            }
            if row.is_empty() {
                row.push(i as u32);
            }
            row.sort_unstable();
            row.dedup();
            let start = col.len();
            diag.push(start + row.partition_point(|&c| c < i as u32));
            col.extend_from_slice(&row);
            ptr.push(col.len());
        }
        let nnz = col.len();
        Csr {
            ptr,
            col,
            val: vec![0.0; nnz],
            diag,
        }
    }

    pub fn rows(&self) -> usize {
        self.diag.len()
    }

    /// Position of entry `(i, j)`, if it is in the pattern.
    pub fn find(&self, i: usize, j: u32) -> Option<usize> {
        let r = &self.col[self.ptr[i]..self.ptr[i + 1]];
        r.binary_search(&j).ok().map(|k| self.ptr[i] + k)
    }

    /// Adds an element matrix (full 6 × 6, row-major) at the element's nodes.
    pub fn add_element(&mut self, nodes: &[u32; 6], ke: &[[f64; 6]; 6]) {
        for a in 0..6 {
            let i = nodes[a] as usize;
            let (s, e) = (self.ptr[i], self.ptr[i + 1]);
            for b in 0..6 {
                // Rows hold about 15 entries; a linear scan beats a binary search.
                let j = nodes[b];
                if let Some(k) = self.col[s..e].iter().position(|&c| c == j) {
                    self.val[s + k] += ke[a][b];
                }
            }
        }
    }

    /// Replaces row and column `i` by those of the identity, so that the unknown `i`
    /// is held at the value the right-hand side gives it.
    pub fn pin(&mut self, i: usize) {
        for k in self.ptr[i]..self.ptr[i + 1] {
            let j = self.col[k] as usize;
            if j != i {
                self.val[k] = 0.0;
                if let Some(t) = self.find(j, i as u32) {
                    self.val[t] = 0.0;
                }
            }
        }
        let d = self.diag[i];
        self.val[d] = 1.0;
    }

    /// `y = A·x`.
    pub fn mul(&self, x: &[f64], y: &mut [f64]) {
        for (i, yi) in y.iter_mut().enumerate() {
            let mut s = 0.0;
            for k in self.ptr[i]..self.ptr[i + 1] {
                s += self.val[k] * x[self.col[k] as usize];
            }
            *yi = s;
        }
    }

    /// `z = M⁻¹·r` for the SSOR preconditioner
    /// M = (D/ω + L)(D/ω)⁻¹(D/ω + U) (the constant factor (2 − ω)/ω is irrelevant to CG).
    fn ssor(&self, omega: f64, r: &[f64], z: &mut [f64]) {
        let n = self.rows();
        for i in 0..n {
            let mut s = r[i];
            for k in self.ptr[i]..self.diag[i] {
                s -= self.val[k] * z[self.col[k] as usize];
            }
            z[i] = s * omega / self.val[self.diag[i]];
        }
        for i in (0..n).rev() {
            let mut s = 0.0;
            for k in self.diag[i] + 1..self.ptr[i + 1] {
                s += self.val[k] * z[self.col[k] as usize];
            }
            z[i] -= s * omega / self.val[self.diag[i]];
        }
    }
}

fn dot(a: &[f64], b: &[f64]) -> f64 {
    a.iter().zip(b).map(|(x, y)| x * y).sum()
}

/// Solves `A·x = b` for a symmetric positive definite `A`, starting from the given
/// `x`, until ‖r‖ ≤ `rtol`·‖b‖. Returns the number of iterations. Checks `cancel`
/// every 50 iterations.
pub fn pcg(
    a: &Csr,
    b: &[f64],
    x: &mut [f64],
    rtol: f64,
    max_iter: usize,
    cancel: Option<&AtomicBool>,
) -> Result<usize, Cancelled> {
    const OMEGA: f64 = 1.2;
    let n = a.rows();
    let bnorm = dot(b, b).sqrt();
    if bnorm == 0.0 {
        x.iter_mut().for_each(|v| *v = 0.0);
        return Ok(0);
    }
    let mut r = vec![0.0; n];
    a.mul(x, &mut r);
    for i in 0..n {
        r[i] = b[i] - r[i];
    }
    let mut z = vec![0.0; n];
    a.ssor(OMEGA, &r, &mut z);
    let mut p = z.clone();
    let mut q = vec![0.0; n];
    let mut rz = dot(&r, &z);
    for it in 0..max_iter {
        if dot(&r, &r).sqrt() <= rtol * bnorm {
            return Ok(it);
        }
        if it % 50 == 49 && cancel.is_some_and(|c| c.load(Ordering::Relaxed)) {
            return Err(Cancelled);
        }
        a.mul(&p, &mut q);
        let pq = dot(&p, &q);
        if pq <= 0.0 || !pq.is_finite() {
            return Ok(it);
        }
        let alpha = rz / pq;
        for i in 0..n {
            x[i] += alpha * p[i];
            r[i] -= alpha * q[i];
        }
        a.ssor(OMEGA, &r, &mut z);
        let rz_new = dot(&r, &z);
        let beta = rz_new / rz;
        rz = rz_new;
        for i in 0..n {
            p[i] = z[i] + beta * p[i];
        }
    }
    Ok(max_iter)
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn solves_a_small_spd_system() {
        // Two overlapping "elements" give a 7 × 7 pattern; fill it with a diagonally
        // dominant symmetric matrix and check A·x = b to the tolerance (the defining
        // property of the solution).
        let elems = [[0, 1, 2, 3, 4, 5], [1, 2, 6, 3, 5, 4]];
        let mut a = Csr::pattern(7, &elems);
        let mut ke = [[-0.1; 6]; 6];
        for (i, row) in ke.iter_mut().enumerate() {
            row[i] = 2.0 + i as f64;
        }
        for e in &elems {
            a.add_element(e, &ke);
        }
        let b: Vec<f64> = (0..7).map(|i| (i as f64).sin() + 1.0).collect();
        let mut x = vec![0.0; 7];
        let it = pcg(&a, &b, &mut x, 1e-12, 100, None).expect("not cancelled");
        assert!(it > 0);
        let mut ax = vec![0.0; 7];
        a.mul(&x, &mut ax);
        for i in 0..7 {
            assert!((ax[i] - b[i]).abs() < 1e-10);
        }
    }
}
