//! Sparse linear algebra for the warping problem: a symmetric matrix in compressed rows,
//! an envelope Cholesky factorisation for the base mesh, and conjugate gradients
//! preconditioned by a geometric multigrid V-cycle for its refinements.
//!
//! - Conjugate gradients: Hestenes & Stiefel 1952; Saad, Iterative Methods for Sparse
//!   Linear Systems, 2nd ed., Alg. 9.1.
//! - Multigrid: the meshes are nested (each splits every triangle of the previous into
//!   four), so the coarse quadratic field interpolated at the fine nodes is the
//!   prolongation P, and its transpose the restriction. One V-cycle with one forward
//!   Gauss–Seidel sweep before and one backward sweep after the coarse correction is a
//!   symmetric positive definite preconditioner (Briggs, Henson & McCormick, A Multigrid
//!   Tutorial, 2nd ed., ch. 3 and 5; Saad §13). The coarse matrices are those assembled
//!   on the coarser meshes (not Galerkin products). The iteration count then stays
//!   about constant as the mesh is refined (about ten to a relative residual of 1e-7,
//!   starting from the prolonged coarse solution).
//! - The base mesh is solved directly: reverse Cuthill–McKee ordering and an envelope
//!   (profile) Cholesky factor (George & Liu, Computer Solution of Large Sparse Positive
//!   Definite Systems, 1981, ch. 4), which also serves as the V-cycle's coarsest solve.
//!   A large base mesh is iterated instead, with the Galerkin product Pᵀ·A·P of its
//!   linear (3-node) elements factored beneath it ([`Csr::galerkin`]).
//!   A refinement whose factor is cheap (at most `DIRECT_FLOPS_PER_ENTRY`
//!   multiply-adds per matrix entry) is factored too and becomes the coarsest level.
//!
//! Why our own code rather than a sparse-matrix crate: the pattern comes straight from
//! the element connectivity, the multigrid needs the mesh hierarchy, and the solver
//! needs a cancellation check inside its loop.

use std::cell::RefCell;
use std::sync::atomic::{AtomicBool, Ordering};

/// A square sparse matrix, both triangles stored, columns sorted within each row.
#[derive(Clone)]
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
        Csr::pattern_mapped(nodes, elems, None)
    }

    /// The matrix of a mesh in one pass over its elements: the pattern, with for every
    /// element where each of its 36 entries lies in `val` (found while the rows are
    /// built: each column's place in its sorted row, noted once per row), then `element(k)`'s matrix (full
    /// 6 × 6, row-major) added through that map, elements in order: the same sums in
    /// the same order as [`Csr::add_element`] element by element, without a search
    /// per entry. An `Err` from `element` stops the assembly and is returned.
    pub fn assemble<E>(
        nodes: usize,
        elems: &[[u32; 6]],
        mut element: impl FnMut(usize) -> Result<[[f64; 6]; 6], E>,
    ) -> Result<Csr, E> {
        let mut map = Vec::new();
        let mut a = Csr::pattern_mapped(nodes, elems, Some(&mut map));
        if map.len() != elems.len() {
            // A row longer than a `u8` offset reaches (a node of hundreds of elements).
            for (k, e) in elems.iter().enumerate() {
                a.add_element(e, &element(k)?);
            }
            return Ok(a);
        }
        for ((k, at), e) in map.iter().enumerate().zip(elems) {
            let ke = element(k)?;
            for ((row, &v), &node) in at.chunks_exact(6).zip(&ke).zip(e) {
                let start = a.ptr[node as usize];
                for (&off, &x) in row.iter().zip(v.iter()) {
                    a.val[start + off as usize] += x;
                }
            }
        }
        Ok(a)
    }

    /// [`Csr::pattern`], and with `map` where every element's entries lie: entry
    /// `(a, b)` at offset `map[k][6a + b]` within row `elems[k][a]` (a byte each, a
    /// quarter of the memory of an absolute position; left empty when some row holds
    /// more entries than a byte counts).
    fn pattern_mapped(nodes: usize, elems: &[[u32; 6]], map: Option<&mut Vec<[u8; 36]>>) -> Csr {
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
        // Each row's columns as they are met (each once: `listed` holds the last row
        // that listed a column), a node of no element coupled to itself alone.
        let mut ptr = Vec::with_capacity(nodes + 1);
        ptr.push(0);
        let mut met: Vec<u32> = Vec::with_capacity(nodes * 16);
        let mut listed = vec![u32::MAX; nodes];
        for i in 0..nodes {
            let before = met.len();
            for &k in &adj[count[i]..count[i + 1]] {
                for &v in &elems[k as usize] {
                    if listed[v as usize] != i as u32 {
                        listed[v as usize] = i as u32;
                        met.push(v);
                    }
                }
            }
            if met.len() == before {
                met.push(i as u32);
            }
            ptr.push(met.len());
        }
        // Sorted by one transposition: the pattern is symmetric, so row c of the
        // transpose is row c itself, its columns met in increasing order.
        let nnz = met.len();
        let mut col = vec![0u32; nnz];
        let mut diag = vec![0usize; nodes];
        drop(listed);
        // `fill` is spent: it holds each row's next free place now.
        let mut next = fill;
        next.truncate(nodes);
        next.copy_from_slice(&ptr[..nodes]);
        for i in 0..nodes {
            // Rows before i have placed row i's columns below i: its diagonal is next.
            diag[i] = next[i];
            for &c in &met[ptr[i]..ptr[i + 1]] {
                let c = c as usize;
                col[next[c]] = i as u32;
                next[c] += 1;
            }
        }
        drop(met);
        if let Some(m) = map {
            m.clear();
            if (0..nodes).all(|i| ptr[i + 1] - ptr[i] <= 1 << u8::BITS) {
                m.resize(elems.len(), [0; 36]);
                // Each column's offset in the current row.
                let mut place = vec![0u8; nodes];
                for i in 0..nodes {
                    // At most 256 entries a row (checked above): each offset fits a byte.
                    for (at, &c) in col[ptr[i]..ptr[i + 1]].iter().enumerate() {
                        place[c as usize] = at as u8;
                    }
                    for &k in &adj[count[i]..count[i + 1]] {
                        let e = &elems[k as usize];
                        let at = &mut m[k as usize];
                        for a in (0..6).filter(|&a| e[a] as usize == i) {
                            for b in 0..6 {
                                at[6 * a + b] = place[e[b] as usize];
                            }
                        }
                    }
                }
            }
        }
        Csr {
            ptr,
            col,
            val: vec![0.0; nnz],
            diag,
        }
    }

    /// The Galerkin coarse matrix Pᵀ·A·P (Briggs, Henson & McCormick, A Multigrid
    /// Tutorial, 2nd ed., ch. 5), for a prolongation whose rows couple only coarse
    /// nodes that A already couples among its first `p.coarse` rows, as the corner
    /// prolongation does (a mid-side node's two ends share its element): the coarse
    /// pattern is A's restricted to those rows and columns. `None` when an entry falls
    /// outside it or the sizes differ.
    pub fn galerkin(&self, p: &Prolong) -> Option<Csr> {
        let (n, nc) = (self.rows(), p.coarse);
        if p.fine() != n || nc > n {
            return None;
        }
        let mut ptr = Vec::with_capacity(nc + 1);
        ptr.push(0);
        let (mut col, mut diag) = (Vec::new(), Vec::with_capacity(nc));
        for i in 0..nc {
            let r = &self.col[self.ptr[i]..self.ptr[i + 1]];
            let keep = r.partition_point(|&c| (c as usize) < nc);
            diag.push(col.len() + self.diag[i] - self.ptr[i]);
            col.extend_from_slice(&r[..keep]);
            ptr.push(col.len());
        }
        let val = vec![0.0; col.len()];
        let mut c = Csr {
            ptr,
            col,
            val,
            diag,
        };
        // Row i of P: the coarse nodes and weights it takes.
        let row = |i: usize| -> Option<([(u32, f64); 6], usize)> {
            Some(match i.checked_sub(nc) {
                None => ([(i as u32, 1.0); 6], 1),
                Some(k) => (p.row(k)?, 6),
            })
        };
        for i in 0..n {
            let (ri, ni) = row(i)?;
            for k in self.ptr[i]..self.ptr[i + 1] {
                let v = self.val[k];
                if v == 0.0 {
                    continue;
                }
                let (rj, nj) = row(self.col[k] as usize)?;
                for &(a, wa) in ri[..ni].iter().filter(|t| t.1 != 0.0) {
                    for &(b, wb) in rj[..nj].iter().filter(|t| t.1 != 0.0) {
                        let at = c.find(a as usize, b)?;
                        c.val[at] += wa * wb * v;
                    }
                }
            }
        }
        Some(c)
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
        for (yi, at) in y.iter_mut().zip(self.ptr.windows(2)) {
            let mut s = 0.0;
            for (&c, &v) in self.col[at[0]..at[1]].iter().zip(&self.val[at[0]..at[1]]) {
                s += v * x[c as usize];
            }
            *yi = s;
        }
    }

    /// One backward Gauss–Seidel sweep on `A·x = b` (rows in decreasing order).
    fn gauss_seidel_back(&self, b: &[f64], x: &mut [f64]) {
        for i in (0..self.rows()).rev() {
            let (from, to) = (self.ptr[i], self.ptr[i + 1]);
            let mut s = b[i];
            for (&c, &v) in self.col[from..to].iter().zip(&self.val[from..to]) {
                s -= v * x[c as usize];
            }
            let d = self.val[self.diag[i]];
            x[i] += s / d;
        }
    }

    /// One forward Gauss–Seidel sweep on `A·x = b` from `x = 0`, and the residual
    /// `res = b − A·x` after it, in one pass over the lower triangle. From zero, row i
    /// sees only its columns j < i (the later unknowns are still 0), so `x` is the
    /// sweep's to the bit; after the sweep, row i of the residual is −Σ_{j>i} a_ij·x_j
    /// (the sweep zeroed the rest of it), gathered by symmetry (a_ij = a_ji) as each x_j
    /// is set. The same as the sweep and then `res = b − A·x` but for rounding, at about
    /// half the cost (Saad, Iterative Methods for Sparse Linear Systems, §4.1).
    fn forward_from_zero(&self, b: &[f64], x: &mut [f64], res: &mut [f64]) {
        res.iter_mut().for_each(|v| *v = 0.0);
        for i in 0..self.rows() {
            let (from, d) = (self.ptr[i], self.diag[i]);
            let (col, val) = (&self.col[from..d], &self.val[from..d]);
            let mut s = b[i];
            for (&c, &v) in col.iter().zip(val) {
                s -= v * x[c as usize];
            }
            let xi = s / self.val[d];
            x[i] = xi;
            for (&c, &v) in col.iter().zip(val) {
                res[c as usize] -= v * xi;
            }
        }
    }
}

/// The prolongation from a mesh to its refinement: the first `coarse` fine nodes are
/// the coarse nodes and keep their values; each later fine node takes the weighted sum
/// of its parent element's nodes in its row.
#[derive(Debug, Clone, PartialEq)]
pub struct Prolong {
    pub coarse: usize,
    /// The coarse nodes of each later fine node's row.
    pub nodes: Vec<[u32; 6]>,
    /// Which of `weights` each row takes (a refinement has few distinct rows of
    /// weights, so a byte a row in place of six weights).
    pub kind: Vec<u8>,
    pub weights: Vec<[f64; 6]>,
}

impl Prolong {
    /// Number of fine nodes.
    pub fn fine(&self) -> usize {
        self.coarse + self.nodes.len()
    }

    /// Row `k` of the later fine nodes: the coarse nodes and the weights they take
    /// (`None` for a `kind` past `weights`).
    fn row(&self, k: usize) -> Option<[(u32, f64); 6]> {
        let w = self.weights.get(*self.kind.get(k)? as usize)?;
        Some(std::array::from_fn(|i| (self.nodes[k][i], w[i])))
    }

    /// The rows in order.
    fn rows(&self) -> impl Iterator<Item = [(u32, f64); 6]> + '_ {
        (0..self.nodes.len()).map_while(|k| self.row(k))
    }

    /// `out += P·u` (`add`) or `out = P·u`.
    pub fn apply(&self, u: &[f64], out: &mut [f64], add: bool) {
        let (old, new) = out.split_at_mut(self.coarse);
        for (o, row) in new.iter_mut().zip(self.rows()) {
            let s: f64 = row.iter().map(|&(j, w)| w * u[j as usize]).sum();
            *o = if add { *o + s } else { s };
        }
        for (o, &v) in old.iter_mut().zip(u) {
            *o = if add { *o + v } else { v };
        }
    }

    /// `out = Pᵀ·r`.
    pub fn restrict(&self, r: &[f64], out: &mut [f64]) {
        out.copy_from_slice(&r[..self.coarse]);
        for (row, &ri) in self.rows().zip(&r[self.coarse..]) {
            for &(j, w) in &row {
                out[j as usize] += w * ri;
            }
        }
    }
}

/// Cholesky factor `L` of a symmetric positive definite matrix, rows renumbered by
/// reverse Cuthill–McKee and each stored from its first nonzero column to the diagonal.
pub struct Envelope {
    /// New position → original row.
    perm: Vec<u32>,
    /// The ordering's roots ([`Plan::seeded`]).
    roots: Vec<u32>,
    first: Vec<usize>,
    start: Vec<usize>,
    val: Vec<f64>,
    /// Multiply-adds the factorisation took ([`Plan::flops`]).
    flops: f64,
    /// The permuted right-hand side, kept between solves.
    work: RefCell<Vec<f64>>,
}

/// Why the base matrix was not factored.
#[derive(Debug, PartialEq)]
pub enum FactorError {
    /// Not numerically positive definite.
    NotPositive,
    /// The factor would hold this many entries, or take this many multiplications,
    /// past the budget (decided before allocating).
    TooLarge {
        entries: usize,
        flops: f64,
    },
    Cancelled,
}

/// Largest envelope factor allowed: 2.5e7 entries (200 MB of f64) …
pub const MAX_ENVELOPE: usize = 25_000_000;
/// … and 1e10 multiply-adds (a few seconds).
pub const MAX_FLOPS: f64 = 1e10;

/// The shape of an envelope factor, known before any value is computed: the ordering,
/// each row's first column and where it starts, and its cost.
pub struct Plan {
    perm: Vec<u32>,
    /// The ordering's root in each connected component ([`rcm`]).
    roots: Vec<u32>,
    /// Original row → new position.
    inv: Vec<u32>,
    first: Vec<usize>,
    start: Vec<usize>,
    /// Entries of the factor.
    pub entries: usize,
    /// Multiply-adds the factorisation takes (about Σ width²/2).
    pub flops: f64,
}

impl Plan {
    /// Orders `a` by reverse Cuthill–McKee and measures the envelope of its factor.
    pub fn of(a: &Csr) -> Plan {
        Plan::seeded(a, &[])
    }

    /// [`Plan::of`] with the ordering started from `seeds` (see [`rcm`]): for a
    /// refinement, the roots of the coarser level's ordering, whose nodes keep their
    /// numbers and are as peripheral in the finer mesh, which saves their searches.
    pub fn seeded(a: &Csr, seeds: &[u32]) -> Plan {
        let n = a.rows();
        let (perm, roots) = rcm(a, seeds);
        let mut inv = vec![0u32; n];
        for (k, &o) in perm.iter().enumerate() {
            inv[o as usize] = k as u32;
        }
        let mut first: Vec<usize> = (0..n).collect();
        for (i, f) in first.iter_mut().enumerate() {
            let r = a.ptr[perm[i] as usize]..a.ptr[perm[i] as usize + 1];
            for (&c, &v) in a.col[r.clone()].iter().zip(&a.val[r]) {
                if v != 0.0 {
                    *f = (*f).min(inv[c as usize] as usize);
                }
            }
        }
        let mut start = Vec::with_capacity(n + 1);
        start.push(0);
        // Row i costs about (its width)² / 2 multiply-adds.
        let mut flops = 0.0;
        for (i, &f) in first.iter().enumerate() {
            start.push(start[i] + i + 1 - f);
            flops += 0.5 * ((i + 1 - f) as f64).powi(2);
        }
        Plan {
            entries: start[n],
            perm,
            roots,
            inv,
            first,
            start,
            flops,
        }
    }

    /// Whether the factor is within [`MAX_ENVELOPE`] and [`MAX_FLOPS`].
    pub fn fits(&self) -> bool {
        self.entries <= MAX_ENVELOPE && self.flops <= MAX_FLOPS
    }
}

impl Envelope {
    /// Factors `a`, checking `cancel` every 256 rows; refuses a factor past
    /// [`MAX_ENVELOPE`] or [`MAX_FLOPS`] before allocating it.
    pub fn factor(a: &Csr, cancel: Option<&AtomicBool>) -> Result<Envelope, FactorError> {
        Envelope::factor_planned(a, Plan::of(a), cancel)
    }

    /// Factors `a` in the ordering and envelope of `plan` (made by [`Plan::of`] from a
    /// matrix of the same pattern).
    pub fn factor_planned(
        a: &Csr,
        plan: Plan,
        cancel: Option<&AtomicBool>,
    ) -> Result<Envelope, FactorError> {
        if !plan.fits() {
            return Err(FactorError::TooLarge {
                entries: plan.entries,
                flops: plan.flops,
            });
        }
        let Plan {
            perm,
            roots,
            inv,
            first,
            start,
            flops,
            ..
        } = plan;
        let n = a.rows();
        let mut val = vec![0.0; start[n]];
        for i in 0..n {
            let r = a.ptr[perm[i] as usize]..a.ptr[perm[i] as usize + 1];
            let row = &mut val[start[i]..start[i + 1]];
            for (&c, &v) in a.col[r.clone()].iter().zip(&a.val[r]) {
                let j = inv[c as usize] as usize;
                if j <= i && v != 0.0 {
                    row[j - first[i]] = v;
                }
            }
        }
        // Row by row (George & Liu ch. 4, the bordering form): L[i][j] = (A[i][j] −
        // Σ_k L[i][k]·L[j][k]) / L[j][j] over the columns both rows hold, then the
        // diagonal; the reciprocals of the diagonal are kept for the rows after.
        let mut recip = vec![0.0; n];
        for i in 0..n {
            if i % 256 == 255 && cancel.is_some_and(|c| c.load(Ordering::Relaxed)) {
                return Err(FactorError::Cancelled);
            }
            let fi = first[i];
            let (done, rest) = val.split_at_mut(start[i]);
            let (off, diag) = rest[..start[i + 1] - start[i]].split_at_mut(i - fi);
            // Column j = fi + k: rows i and j share the columns max(fi, fj)..j, the
            // last `len` of row i's before j and of row j's before its diagonal (which
            // ends row j, at start[j + 1] − 1).
            for (k, (at, &rj)) in start[fi..=i].windows(2).zip(&recip[fi..i]).enumerate() {
                let end = at[1] - 1;
                let len = k.min(end - at[0]);
                let s = dot(&off[k - len..k], &done[end - len..end]);
                off[k] = (off[k] - s) * rj;
            }
            let s = diag[0] - dot(off, off);
            if !(s > 0.0 && s.is_finite()) {
                return Err(FactorError::NotPositive);
            }
            diag[0] = s.sqrt();
            recip[i] = 1.0 / diag[0];
        }
        Ok(Envelope {
            perm,
            roots,
            first,
            start,
            val,
            flops,
            work: RefCell::new(Vec::new()),
        })
    }

    /// `x = A⁻¹·b`.
    pub fn solve(&self, b: &[f64], x: &mut [f64]) {
        let n = self.perm.len();
        let mut y = self.work.borrow_mut();
        y.clear();
        y.extend(self.perm.iter().map(|&o| b[o as usize]));
        for i in 0..n {
            let row = &self.val[self.start[i]..self.start[i + 1]];
            let f = self.first[i];
            let s = dot(&row[..i - f], &y[f..i]);
            y[i] = (y[i] - s) / row[i - f];
        }
        for i in (0..n).rev() {
            let row = &self.val[self.start[i]..self.start[i + 1]];
            let f = self.first[i];
            y[i] /= row[i - f];
            let yi = y[i];
            for (v, l) in y[f..i].iter_mut().zip(&row[..i - f]) {
                *v -= l * yi;
            }
        }
        for (k, &o) in self.perm.iter().enumerate() {
            x[o as usize] = y[k];
        }
    }
}

impl Envelope {
    /// `x[c] = A⁻¹·b[c]` for `K` right-hand sides in one pass over the factor, each
    /// column with the arithmetic of [`Envelope::solve`] (the same result to the bit).
    #[inline]
    pub fn solve_many<const K: usize>(&self, b: [&[f64]; K], x: [&mut [f64]; K]) {
        let n = self.perm.len();
        // Row i of the permuted block at y[K·i .. K·i + K].
        let mut y = vec![0.0; K * n];
        for (i, &o) in self.perm.iter().enumerate() {
            for c in 0..K {
                y[K * i + c] = b[c][o as usize];
            }
        }
        for i in 0..n {
            let row = &self.val[self.start[i]..self.start[i + 1]];
            let f = self.first[i];
            // [`dot`] for each column: four interleaved parts, then the rest.
            let (mut lq, mut yq) = (
                row[..i - f].chunks_exact(4),
                y[K * f..K * i].chunks_exact(4 * K),
            );
            let mut p = [[0.0; 4]; K];
            for (l, yj) in (&mut lq).zip(&mut yq) {
                for q in 0..4 {
                    for c in 0..K {
                        p[c][q] += l[q] * yj[K * q + c];
                    }
                }
            }
            let mut s = p.map(|p| (p[0] + p[2]) + (p[1] + p[3]));
            for (l, yj) in lq.remainder().iter().zip(yq.remainder().chunks_exact(K)) {
                for c in 0..K {
                    s[c] += l * yj[c];
                }
            }
            for c in 0..K {
                y[K * i + c] = (y[K * i + c] - s[c]) / row[i - f];
            }
        }
        for i in (0..n).rev() {
            let row = &self.val[self.start[i]..self.start[i + 1]];
            let f = self.first[i];
            let mut yi = [0.0; K];
            for c in 0..K {
                y[K * i + c] /= row[i - f];
                yi[c] = y[K * i + c];
            }
            for (v, l) in y[K * f..K * i].chunks_exact_mut(K).zip(&row[..i - f]) {
                for c in 0..K {
                    v[c] -= l * yi[c];
                }
            }
        }
        for (c, xc) in x.into_iter().enumerate() {
            for (k, &o) in self.perm.iter().enumerate() {
                xc[o as usize] = y[K * k + c];
            }
        }
    }
}

/// Reverse Cuthill–McKee ordering of the graph of `a` (George & Liu §4.3): breadth-first
/// from a root in each connected component, neighbours in order of increasing degree;
/// the order is then reversed. The roots are those of `seeds` (in order, each starting
/// the component it lies in unless that is numbered already), then for the components
/// left a pseudo-peripheral node ([`peripheral`]) found from each node in turn in order
/// of increasing degree. Returns the order and the roots it started from.
fn rcm(a: &Csr, seeds: &[u32]) -> (Vec<u32>, Vec<u32>) {
    let n = a.rows();
    let degree = |i: usize| a.ptr[i + 1] - a.ptr[i];
    let mut seen = vec![false; n];
    let mut order: Vec<u32> = Vec::with_capacity(n);
    let mut roots = Vec::new();
    // Each neighbour as its degree above its number: sorted as integers, by degree and
    // then by number, the order of a stable sort by degree of the row's sorted columns.
    let mut nbr: Vec<u64> = Vec::new();
    let mut number = |s: usize, seen: &mut [bool], order: &mut Vec<u32>| {
        seen[s] = true;
        let mut head = order.len();
        order.push(s as u32);
        while head < order.len() {
            let i = order[head] as usize;
            head += 1;
            nbr.clear();
            nbr.extend(
                a.col[a.ptr[i]..a.ptr[i + 1]]
                    .iter()
                    .filter(|&&j| !seen[j as usize])
                    .map(|&j| (degree(j as usize) as u64) << 32 | u64::from(j)),
            );
            nbr.sort_unstable();
            for &j in &nbr {
                let j = j as u32;
                seen[j as usize] = true;
                order.push(j);
            }
        }
    };
    for &s in seeds {
        let s = s as usize;
        if s < n && !seen[s] {
            roots.push(s as u32);
            number(s, &mut seen, &mut order);
        }
    }
    if order.len() < n {
        let mut trial = Trial {
            reached: vec![usize::MAX; n],
            count: 0,
            queue: Vec::new(),
        };
        for s in by_degree(a) {
            if seen[s] {
                continue;
            }
            let s = peripheral(a, s, &seen, &mut trial);
            roots.push(s as u32);
            number(s, &mut seen, &mut order);
        }
    }
    order.reverse();
    (order, roots)
}

/// The rows of `a` in order of increasing degree (entries a row), rows of one degree in
/// increasing order: a stable counting sort.
fn by_degree(a: &Csr) -> Vec<usize> {
    let n = a.rows();
    let degree = |i: usize| a.ptr[i + 1] - a.ptr[i];
    let top = (0..n).map(degree).max().unwrap_or(0);
    let mut at = vec![0usize; top + 2];
    for i in 0..n {
        at[degree(i) + 1] += 1;
    }
    for d in 0..=top {
        at[d + 1] += at[d];
    }
    let mut out = vec![0usize; n];
    for i in 0..n {
        let d = degree(i);
        out[at[d]] = i;
        at[d] += 1;
    }
    out
}

/// Scratch of [`levels`]: which trial last reached each node, and its queue.
struct Trial {
    reached: Vec<usize>,
    count: usize,
    queue: Vec<usize>,
}

/// The rooted level structure from `root` over the nodes not `seen` (breadth-first):
/// its depth (eccentricity of `root` in its component) and a node of least degree in
/// its last level.
fn levels(a: &Csr, root: usize, seen: &[bool], t: &mut Trial) -> (usize, usize) {
    t.count += 1;
    t.queue.clear();
    t.queue.push(root);
    t.reached[root] = t.count;
    let (mut depth, mut lo) = (0, 0);
    loop {
        let hi = t.queue.len();
        for q in lo..hi {
            let i = t.queue[q];
            for &j in &a.col[a.ptr[i]..a.ptr[i + 1]] {
                let j = j as usize;
                // Most neighbours are reached already: that test first.
                if t.reached[j] != t.count && !seen[j] {
                    t.reached[j] = t.count;
                    t.queue.push(j);
                }
            }
        }
        if t.queue.len() == hi {
            let far = (t.queue[lo..hi].iter().copied())
                .min_by_key(|&i| a.ptr[i + 1] - a.ptr[i])
                .unwrap_or(root);
            return (depth, far);
        }
        depth += 1;
        lo = hi;
    }
}

/// A pseudo-peripheral node of the component of `start` among the nodes not `seen`
/// (George & Liu §4.3.2, after Gibbs, Poole & Stockmeyer): from the root, a node of
/// least degree in the last level becomes the root while its level structure is
/// deeper. Each step deepens it, so it ends within the component's diameter.
fn peripheral(a: &Csr, start: usize, seen: &[bool], t: &mut Trial) -> usize {
    let (mut root, (mut depth, mut far)) = (start, levels(a, start, seen, t));
    loop {
        let (d, f) = levels(a, far, seen, t);
        if d <= depth {
            return root;
        }
        (root, depth, far) = (far, d, f);
    }
}

/// The multigrid hierarchy: the factor of its coarsest matrix (the base mesh's, or a
/// refinement's whose envelope is small enough to factor directly), then the matrix of
/// each finer mesh with the prolongation onto it. Pinned unknowns (identity rows) are
/// the same nodes on every level. Built once, it solves any number of right-hand sides
/// with the finest matrix ([`Multigrid::solve`]).
pub struct Multigrid {
    base: Envelope,
    base_matrix: Csr,
    levels: Vec<(Prolong, Csr)>,
    pinned: Vec<u32>,
    /// Vectors of each level's V-cycle (residual, coarse residual, coarse correction)
    /// and of the conjugate gradients, kept between calls.
    work: RefCell<Vec<[Vec<f64>; 3]>>,
    cg: RefCell<[Vec<f64>; 4]>,
    /// Right-hand sides each level is to be solved for ([`Multigrid::expect_rhs`]).
    rhs: usize,
}

/// A refinement is factored directly, and becomes the coarsest level, when its factor
/// takes at most this many multiply-adds per stored matrix entry (for each right-hand
/// side): measured in instructions (callgrind) on the bench sections, the iterations
/// cost about 700 a matrix entry (the loading-bay beam's first refinement), the factor
/// about 3 a multiply-add and 40 a factor entry besides its ordering, so that it is the
/// cheaper up to about 150. In CPU time the factor's dependent inner products run
/// slower an instruction: for one right-hand side the loading-bay beam came out even,
/// with three (the flexure problem's) the factor was well ahead (DEVELOPERS.md).
const DIRECT_FLOPS_PER_ENTRY: f64 = 150.0;
/// The envelope factor of a refinement takes at least this many times the coarser
/// factor's multiply-adds a matrix entry (a 2-D mesh's envelope widens with its rows:
/// measured 3.1–3.9 on the bench sections' first refinements). Too low a figure only
/// costs an ordering; too high leaves to the iterations a level cheaper to factor.
const FACTOR_GROWTH: f64 = 3.0;
/// Refinements with more rows than this are not considered for a direct factor (its
/// ordering alone would cost a good part of an iterative solve, and the factor of a
/// 2-D mesh grows faster than its rows).
pub const DIRECT_MAX_ROWS: usize = 8_000;

impl Multigrid {
    /// Starts the hierarchy at the base mesh's matrix.
    pub fn new(
        a: Csr,
        pinned: &[u32],
        cancel: Option<&AtomicBool>,
    ) -> Result<Multigrid, FactorError> {
        Ok(Multigrid {
            base: Envelope::factor(&a, cancel)?,
            base_matrix: a,
            levels: Vec::new(),
            pinned: pinned.to_vec(),
            work: RefCell::new(Vec::new()),
            cg: RefCell::new(Default::default()),
            rhs: 1,
        })
    }

    /// Adds the matrix of the next finer mesh. When its envelope factor is cheap (see
    /// `DIRECT_FLOPS_PER_ENTRY`) it is factored and becomes the coarsest level; then
    /// [`Multigrid::solve`] is direct. A factor that fails (not positive, cancelled)
    /// leaves the matrix to the iterations.
    pub fn push(&mut self, p: Prolong, a: Csr, cancel: Option<&AtomicBool>) {
        let per_entry = DIRECT_FLOPS_PER_ENTRY * self.rhs as f64;
        // Only the refinement of a factored level may be cheap enough (a level left to
        // the iterations was too dear, and this one is dearer), and only when the
        // coarser factor's cost a matrix entry, times FACTOR_GROWTH, is within the limit:
        // else the ordering is not even made.
        let coarse = self.base.flops / self.base_matrix.val.len().max(1) as f64;
        if a.rows() <= DIRECT_MAX_ROWS
            && self.levels.is_empty()
            && FACTOR_GROWTH * coarse <= per_entry
        {
            // The refinement keeps the coarse nodes' numbers: the coarse roots seed it.
            let plan = Plan::seeded(&a, &self.base.roots);
            if plan.fits() && plan.flops <= per_entry * a.val.len() as f64 {
                if let Ok(f) = Envelope::factor_planned(&a, plan, cancel) {
                    self.base = f;
                    self.base_matrix = a;
                    self.levels.clear();
                    return;
                }
            }
        }
        self.levels.push((p, a));
    }

    /// Each finer level will be solved for `rhs` right-hand sides (1 unless told): the
    /// iterations cost that many times over while a factor is made once, so
    /// [`Multigrid::push`] allows a factor that many times dearer.
    pub fn expect_rhs(&mut self, rhs: usize) {
        self.rhs = rhs.max(1);
    }

    /// The finest matrix.
    pub fn finest(&self) -> Option<&Csr> {
        Some(self.levels.last().map_or(&self.base_matrix, |(_, a)| a))
    }

    /// The prolongation onto the finest matrix's mesh, or `None` while only the base is
    /// held (for starting another right-hand side from its coarser solution).
    pub fn finest_prolong(&self) -> Option<&Prolong> {
        self.levels.last().map(|(p, _)| p)
    }

    /// Whether the finest matrix is solved directly (it is factored).
    pub fn direct(&self) -> bool {
        self.levels.is_empty()
    }

    /// Solves with the finest matrix: directly when it is factored, else by conjugate
    /// gradients from `x` with one V-cycle as preconditioner, to ‖r‖ ≤ `rtol`·‖b‖.
    /// Returns the number of iterations (1 for a direct solve).
    pub fn solve(
        &self,
        b: &[f64],
        x: &mut [f64],
        rtol: f64,
        cancel: Option<&AtomicBool>,
    ) -> Result<usize, Cancelled> {
        match self.levels.last() {
            None => {
                self.base.solve(b, x);
                Ok(1)
            }
            Some((_, a)) => {
                let mut cg = self.cg.borrow_mut();
                pcg_in(&mut cg, a, b, x, rtol, MAX_ITERATIONS, cancel, |r, z| {
                    self.vcycle(self.levels.len(), r, z)
                })
            }
        }
    }

    /// [`Multigrid::solve`] for `K` right-hand sides: one pass over the factor for all
    /// of them when the finest matrix is factored, else one after another. Returns the
    /// iterations of each.
    #[inline]
    pub fn solve_many<const K: usize>(
        &self,
        b: [&[f64]; K],
        x: [&mut [f64]; K],
        rtol: f64,
        cancel: Option<&AtomicBool>,
    ) -> Result<[usize; K], Cancelled> {
        if self.direct() {
            self.base.solve_many(b, x);
            return Ok([1; K]);
        }
        let mut it = [0; K];
        for (c, xc) in x.into_iter().enumerate() {
            it[c] = self.solve(b[c], xc, rtol, cancel)?;
        }
        Ok(it)
    }

    /// `z ≈ A_l⁻¹·r` by one V-cycle from level `l` (0 is the coarsest).
    fn vcycle(&self, l: usize, r: &[f64], z: &mut [f64]) {
        let Some((p, a)) = l.checked_sub(1).and_then(|k| self.levels.get(k)) else {
            self.base.solve(r, z);
            return;
        };
        // This level's vectors, taken out for the recursion and put back after.
        let [mut res, mut rc, mut zc] = {
            let mut w = self.work.borrow_mut();
            if w.len() < l {
                w.resize_with(l, Default::default);
            }
            std::mem::take(&mut w[l - 1])
        };
        res.resize(r.len(), 0.0);
        a.forward_from_zero(r, z, &mut res);
        rc.resize(p.coarse, 0.0);
        p.restrict(&res, &mut rc);
        for &i in &self.pinned {
            rc[i as usize] = 0.0;
        }
        zc.resize(p.coarse, 0.0);
        self.vcycle(l - 1, &rc, &mut zc);
        p.apply(&zc, z, true);
        a.gauss_seidel_back(r, z);
        self.work.borrow_mut()[l - 1] = [res, rc, zc];
    }
}

/// Iterations a refined level may take (7–10 is usual; more means the matrix is
/// indefinite or badly conditioned, and the caller reports it).
pub const MAX_ITERATIONS: usize = 150;

/// The dot product over the shorter of `a` and `b`, summed in four interleaved parts
/// (two vector registers of two), added lane by lane ((s₀ + s₂) + (s₁ + s₃), so that
/// the compiler keeps the lanes in place), then the rest.
#[inline]
fn dot(a: &[f64], b: &[f64]) -> f64 {
    let n = a.len().min(b.len());
    let (a, b) = (&a[..n], &b[..n]);
    let (mut ca, mut cb) = (a.chunks_exact(4), b.chunks_exact(4));
    let mut s = [0.0; 4];
    for (x, y) in (&mut ca).zip(&mut cb) {
        for k in 0..4 {
            s[k] += x[k] * y[k];
        }
    }
    let mut t = (s[0] + s[2]) + (s[1] + s[3]);
    let (ra, rb) = (ca.remainder(), cb.remainder());
    for k in 0..ra.len().min(rb.len()) {
        t += ra[k] * rb[k];
    }
    t
}

/// Solves `A·x = b` for a symmetric positive definite `A`, starting from the given
/// `x`, until ‖r‖ ≤ `rtol`·‖b‖, with `precond(r, z)` setting z = M⁻¹·r for a symmetric
/// positive definite M. Returns the number of iterations. Checks `cancel` every 10
/// iterations.
pub fn pcg(
    a: &Csr,
    b: &[f64],
    x: &mut [f64],
    rtol: f64,
    max_iter: usize,
    cancel: Option<&AtomicBool>,
    precond: impl Fn(&[f64], &mut [f64]),
) -> Result<usize, Cancelled> {
    pcg_in(
        &mut Default::default(),
        a,
        b,
        x,
        rtol,
        max_iter,
        cancel,
        precond,
    )
}

/// [`pcg`] with its four vectors (r, z, p, q) in `work`, resized as needed.
#[allow(clippy::too_many_arguments)]
fn pcg_in(
    work: &mut [Vec<f64>; 4],
    a: &Csr,
    b: &[f64],
    x: &mut [f64],
    rtol: f64,
    max_iter: usize,
    cancel: Option<&AtomicBool>,
    precond: impl Fn(&[f64], &mut [f64]),
) -> Result<usize, Cancelled> {
    let n = a.rows();
    let bnorm = dot(b, b).sqrt();
    if bnorm == 0.0 {
        x.iter_mut().for_each(|v| *v = 0.0);
        return Ok(0);
    }
    let [r, z, p, q] = work;
    for v in [&mut *r, &mut *z, &mut *p, &mut *q] {
        v.resize(n, 0.0);
    }
    a.mul(x, r);
    for i in 0..n {
        r[i] = b[i] - r[i];
    }
    precond(r, z);
    p.copy_from_slice(z);
    let mut rz = dot(r, z);
    for it in 0..max_iter {
        if dot(r, r).sqrt() <= rtol * bnorm {
            return Ok(it);
        }
        if it % 10 == 9 && cancel.is_some_and(|c| c.load(Ordering::Relaxed)) {
            return Err(Cancelled);
        }
        a.mul(p, q);
        let pq = dot(p, q);
        if pq <= 0.0 || !pq.is_finite() {
            return Ok(it);
        }
        let alpha = rz / pq;
        for i in 0..n {
            x[i] += alpha * p[i];
            r[i] -= alpha * q[i];
        }
        precond(r, z);
        let rz_new = dot(r, z);
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

    /// Two overlapping "elements" give a 7 × 7 pattern, filled with a diagonally
    /// dominant symmetric matrix (positive definite by Gershgorin's theorem).
    fn small() -> (Csr, Vec<f64>) {
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
        (a, b)
    }

    /// ‖A·x − b‖∞.
    fn residual(a: &Csr, x: &[f64], b: &[f64]) -> f64 {
        let mut ax = vec![0.0; b.len()];
        a.mul(x, &mut ax);
        ax.iter()
            .zip(b)
            .map(|(p, q)| (p - q).abs())
            .fold(0.0, f64::max)
    }

    #[test]
    fn assembly_through_the_map_adds_what_add_element_adds() {
        // The same element matrices by both paths: the same sums, bit for bit.
        let elems = [[0, 1, 2, 3, 4, 5], [1, 2, 6, 3, 5, 4], [6, 2, 7, 5, 8, 9]];
        let ke = |k: usize| {
            let mut m = [[0.0; 6]; 6];
            for (a, row) in m.iter_mut().enumerate() {
                for (b, v) in row.iter_mut().enumerate() {
                    *v = ((k * 36 + a * 6 + b) as f64).sin() + if a == b { 3.0 } else { 0.0 };
                }
            }
            m
        };
        let mut one = Csr::pattern(10, &elems);
        for (k, e) in elems.iter().enumerate() {
            one.add_element(e, &ke(k));
        }
        let both = Csr::assemble(10, &elems, |k| Ok::<_, ()>(ke(k))).unwrap();
        assert_eq!(
            (&one.ptr, &one.col, &one.diag),
            (&both.ptr, &both.col, &both.diag)
        );
        assert_eq!(one.val, both.val);
        assert_eq!(
            Csr::assemble(10, &elems, |k| if k == 1 { Err(k) } else { Ok(ke(k)) }).err(),
            Some(1)
        );
    }

    #[test]
    fn galerkin_product_is_p_transpose_a_p() {
        // Against the dense product Pᵀ·A·P formed entry by entry.
        let (a, _) = small();
        let p = Prolong {
            coarse: 4,
            nodes: vec![[1, 2, 0, 0, 0, 0], [3, 1, 0, 0, 0, 0], [2, 3, 0, 0, 0, 0]],
            kind: vec![0; 3],
            weights: vec![[0.5, 0.5, 0.0, 0.0, 0.0, 0.0]],
        };
        let c = a.galerkin(&p).expect("pattern holds it");
        let dense = |m: &Csr, i: usize, j: usize| m.find(i, j as u32).map_or(0.0, |k| m.val[k]);
        let pm = |i: usize, j: usize| {
            if i < 4 {
                f64::from(u8::from(i == j))
            } else {
                p.row(i - 4)
                    .expect("a row of weights")
                    .iter()
                    .filter(|t| t.0 as usize == j)
                    .map(|t| t.1)
                    .sum()
            }
        };
        for i in 0..4 {
            for j in 0..4 {
                let mut s = 0.0;
                for k in 0..7 {
                    for l in 0..7 {
                        s += pm(k, i) * dense(&a, k, l) * pm(l, j);
                    }
                }
                assert!(
                    (dense(&c, i, j) - s).abs() < 1e-12,
                    "({i}, {j}): {} vs {s}",
                    dense(&c, i, j)
                );
            }
        }
    }

    #[test]
    fn conjugate_gradients_solve_a_small_spd_system() {
        // A·x = b to the tolerance is the defining property of the solution.
        let (a, b) = small();
        let mut x = vec![0.0; 7];
        let jacobi = |r: &[f64], z: &mut [f64]| {
            for i in 0..r.len() {
                z[i] = r[i] / a.val[a.diag[i]];
            }
        };
        let it = pcg(&a, &b, &mut x, 1e-12, 100, None, jacobi).expect("not cancelled");
        assert!(it > 0);
        assert!(residual(&a, &x, &b) < 1e-10);
    }

    #[test]
    fn envelope_cholesky_solves_directly() {
        let (mut a, b) = small();
        let mut x = vec![0.0; 7];
        Envelope::factor(&a, None)
            .expect("positive definite")
            .solve(&b, &mut x);
        assert!(residual(&a, &x, &b) < 1e-12);
        // An indefinite matrix is refused.
        let d = a.diag[3];
        a.val[d] = -1.0;
        assert_eq!(
            Envelope::factor(&a, None).err(),
            Some(FactorError::NotPositive)
        );
    }

    #[test]
    fn a_block_of_right_hand_sides_solves_as_each_alone() {
        // Each column of the block is solved with the same arithmetic as a single
        // right-hand side, so to the bit; and A·x = b for each (the definition).
        let (a, b) = small();
        let c: Vec<f64> = b.iter().map(|v| v * v - 0.5).collect();
        let f = Envelope::factor(&a, None).expect("positive definite");
        let (mut x, mut y) = (vec![0.0; 7], vec![0.0; 7]);
        f.solve_many([&b, &c], [&mut x, &mut y]);
        for (rhs, got) in [(&b, &x), (&c, &y)] {
            let mut alone = vec![0.0; 7];
            f.solve(rhs, &mut alone);
            assert_eq!(&alone, got);
            assert!(residual(&a, got, rhs) < 1e-12);
        }
    }

    #[test]
    fn restriction_is_the_transpose_of_prolongation() {
        // (P·u)·r = u·(Pᵀ·r) for any u and r: the V-cycle is symmetric only if so.
        let p = Prolong {
            coarse: 3,
            nodes: vec![[0, 1, 2, 0, 0, 0], [0, 1, 2, 0, 1, 2]],
            kind: vec![0, 1],
            weights: vec![
                [0.5, 0.5, 0.0, 0.0, 0.0, 0.0],
                [0.25, -0.125, 0.875, 0.0, 0.0, 0.0],
            ],
        };
        let u = [1.0, -2.0, 3.0];
        let r = [0.5, 1.5, -1.0, 2.0, 0.25];
        let mut pu = [0.0; 5];
        p.apply(&u, &mut pu, false);
        let mut rt = [0.0; 3];
        p.restrict(&r, &mut rt);
        let lhs: f64 = pu.iter().zip(&r).map(|(a, b)| a * b).sum();
        let rhs: f64 = u.iter().zip(&rt).map(|(a, b)| a * b).sum();
        assert!((lhs - rhs).abs() < 1e-14);
    }
}
