//! The longitudinal shear flow across the boundaries that pieces share (welds, bolt
//! lines), from one mesh's flexure solution: the variationally consistent boundary flux.
//!
//! The flexure stress of a unit shear satisfies, in weak form on the whole section,
//! `∫τ·∇v dA = ∫b·v dA` for every v, with `b = −∇·τ = n·r/D` the change of bending
//! stress along the member ([`super::flexure`]). For a piece A and a node i on its
//! boundary, integration by parts of the exact τ gives
//!
//! ```text
//! F_i = ∫_A (τ·∇N_i − b·N_i) dA = ∫_∂A τ·n N_i ds
//! ```
//!
//! the flux out of A weighted by the node's shape function: the restricted residual of
//! the assembled equations, formed here from the finite-element τ_h (so the Poisson
//! term of τ, which is not in the unknown's gradient, is in it too). Summed over the
//! nodes of a stretch of shared boundary (Σ N_i = 1 there) it is the flow across that
//! stretch. Summed over every node of A it is exactly `−∫_A b dA` (the N_i sum to 1 on
//! A): the flows out of a piece over all its joints balance the change of its bending
//! force on every mesh, as the shear-flow formula's equilibrium of a cut-off part does
//! (Carey, Chow & Seager, "Approximate boundary-flux calculations", Comput. Methods
//! Appl. Mech. Engrg. 50, 1985; Hughes, The Finite Element Method, 1987, §1.16 — both
//! cited from memory). The flux converges like the energy, faster than the nodal
//! stresses.
//!
//! Each joint edge of the mesh (an element edge with elements of two pieces on its
//! sides) gives its three nodes' fluxes to its pair of pieces; a corner node shared by
//! joint edges of several pairs gives each the share of the edge lengths there. The
//! value of a node is the mean of the two sides' (F from A, −F from B), which agree to
//! the solver's tolerance, so that naming A or B first makes no difference. A node
//! where two pieces touch only at a point gives nothing (no shear crosses a point).

use super::flexure::TauAt;
use super::mesh::Mesh;
use super::p2::{Element, Rule};
use super::torsion::Failure;
use crate::geom::Pt;
use std::collections::HashMap;

/// One connected stretch of the boundary two pieces share.
#[derive(Debug, Clone, PartialEq)]
pub struct Stretch {
    /// The smallest corner node on it: refinement keeps node numbers, so this names
    /// the same stretch on every level.
    pub key: u32,
    /// The stretch closes on itself (a core in a tube).
    pub closed: bool,
    /// Flow out of the lower-numbered piece across the stretch, per unit Vx and Vy
    /// (force per length of member per unit force: 1/length).
    pub flux: [f64; 2],
}

/// The boundary shared by pieces `a < b` on one mesh.
#[derive(Debug, Clone, PartialEq)]
pub struct JointFlux {
    pub a: u32,
    pub b: u32,
    /// Ordered by key.
    pub stretches: Vec<Stretch>,
    /// The length of the element edges between the two pieces (chords): the shared
    /// boundary's length when the mesh follows it, longer when it does not (a jagged
    /// line between elements of overlapping parts).
    pub length: f64,
}

/// One mesh's joint flows and each piece's load.
#[derive(Debug, Clone, PartialEq, Default)]
pub struct Level {
    /// Ordered by `(a, b)`.
    pub joints: Vec<JointFlux>,
    /// `∫b dA` over each piece (by piece index), per unit Vx and Vy: the change of its
    /// bending force along the member, which its joints' flows balance.
    pub load: Vec<[f64; 2]>,
}

impl Level {
    /// The joint between pieces `a` and `b` (either order).
    pub fn joint(&self, a: usize, b: usize) -> Option<&JointFlux> {
        let (a, b) = (a.min(b) as u32, a.max(b) as u32);
        self.joints.iter().find(|j| j.a == a && j.b == b)
    }
}

/// An element edge with elements of two pieces on its sides.
struct Edge {
    pair: (u32, u32),
    /// Corner, corner, mid-side.
    nodes: [u32; 3],
    length: f64,
}

/// The joint flows on mesh `m`, whose flexure stresses of unit loads `tau` and loads
/// `load(element, x, y)` (`b` for Vx = 1 and Vy = 1) are taken at points about `c`.
pub fn level(
    m: &Mesh,
    c: Pt,
    tau: &TauAt,
    load: &dyn Fn(usize, f64, f64) -> [f64; 2],
) -> Result<Level, Failure> {
    let pieces = m.piece.iter().max().map_or(0, |&p| p as usize + 1);
    if m.piece.windows(2).all(|w| w[0] == w[1]) {
        return Ok(Level::default());
    }
    let edges = joint_edges(m);
    // The stretches of each pair: joint edges joined at their corners (union–find).
    let mut parent: Vec<usize> = (0..edges.len()).collect();
    fn root(parent: &mut [usize], mut i: usize) -> usize {
        while parent[i] != i {
            parent[i] = parent[parent[i]];
            i = parent[i];
        }
        i
    }
    let mut by_corner: HashMap<(u32, (u32, u32)), usize> = HashMap::new();
    let mut corner_uses: HashMap<(u32, (u32, u32)), u32> = HashMap::new();
    for (k, e) in edges.iter().enumerate() {
        for &v in &e.nodes[..2] {
            *corner_uses.entry((v, e.pair)).or_default() += 1;
            if let Some(&other) = by_corner.get(&(v, e.pair)) {
                let (r1, r2) = (root(&mut parent, k), root(&mut parent, other));
                parent[r1] = r2;
            } else {
                by_corner.insert((v, e.pair), k);
            }
        }
    }
    // Stretches in order of (pair, key); `slot[k]` is edge k's stretch.
    let mut heads: Vec<(u32, u32, u32, usize)> = Vec::new();
    let mut key_of: HashMap<usize, u32> = HashMap::new();
    for (k, e) in edges.iter().enumerate() {
        let r = root(&mut parent, k);
        let key = key_of.entry(r).or_insert(u32::MAX);
        *key = (*key).min(e.nodes[0]).min(e.nodes[1]);
    }
    for (&r, &key) in &key_of {
        heads.push((edges[r].pair.0, edges[r].pair.1, key, r));
    }
    heads.sort_unstable();
    let index: HashMap<usize, usize> = heads.iter().enumerate().map(|(i, h)| (h.3, i)).collect();
    let slot: Vec<usize> = (0..edges.len())
        .map(|k| index[&root(&mut parent, k)])
        .collect();
    let mut closed = vec![true; heads.len()];
    for (k, e) in edges.iter().enumerate() {
        if e.nodes[..2].iter().any(|&v| corner_uses[&(v, e.pair)] < 2) {
            closed[slot[k]] = false;
        }
    }
    // For each (node, piece on one side): the stretches it gives to, with the length
    // of joint edge behind each share.
    let mut shares: HashMap<(u32, u32), Vec<(usize, f64)>> = HashMap::new();
    for (k, e) in edges.iter().enumerate() {
        for &v in &e.nodes {
            for side in [e.pair.0, e.pair.1] {
                shares
                    .entry((v, side))
                    .or_default()
                    .push((slot[k], e.length));
            }
        }
    }
    let rule = Rule::degree4();
    let mut flux = vec![[0.0; 2]; heads.len()];
    let mut length = vec![0.0; heads.len()];
    for (k, e) in edges.iter().enumerate() {
        length[slot[k]] += e.length;
    }
    let mut piece_load = vec![[0.0; 2]; pieces];
    for (ei, e) in m.elems.iter().enumerate() {
        let piece = m.piece[ei];
        let p = e.map(|v| m.nodes[v as usize].sub(c));
        let touches = e.iter().any(|&v| shares.contains_key(&(v, piece)));
        let el = Element::new(&p, m.curved[ei]).ok_or(Failure::Degenerate)?;
        let mut f = [[0.0; 2]; 6];
        for q in 0..rule.points() {
            let g = el.at(&rule, q).ok_or(Failure::Degenerate)?;
            let b = load(ei, g.x, g.y);
            for k in 0..2 {
                piece_load[piece as usize][k] += g.da * b[k];
            }
            if !touches {
                continue;
            }
            let t = tau(ei, e, g.x, g.y, &g.gx, &g.gy);
            for (i, fi) in f.iter_mut().enumerate() {
                for k in 0..2 {
                    fi[k] += g.da * (t[k][0] * g.gx[i] + t[k][1] * g.gy[i] - b[k] * rule.n[q][i]);
                }
            }
        }
        if !touches {
            continue;
        }
        for (i, &v) in e.iter().enumerate() {
            let Some(list) = shares.get(&(v, piece)) else {
                continue;
            };
            let total: f64 = list.iter().map(|s| s.1).sum();
            for &(s, len) in list {
                // Out of the pair's first piece: half from each side.
                let sign = if heads[s].0 == piece { 0.5 } else { -0.5 };
                let w = sign * len / total;
                for k in 0..2 {
                    flux[s][k] += w * f[i][k];
                }
            }
        }
    }
    let mut joints: Vec<JointFlux> = Vec::new();
    for (s, &(a, b, key, _)) in heads.iter().enumerate() {
        let stretch = Stretch {
            key,
            closed: closed[s],
            flux: flux[s],
        };
        match joints.last_mut() {
            Some(j) if (j.a, j.b) == (a, b) => {
                j.stretches.push(stretch);
                j.length += length[s];
            }
            _ => joints.push(JointFlux {
                a,
                b,
                stretches: vec![stretch],
                length: length[s],
            }),
        }
    }
    Ok(Level {
        joints,
        load: piece_load,
    })
}

/// The element edges with elements of two different pieces on their sides.
fn joint_edges(m: &Mesh) -> Vec<Edge> {
    let mut seen: HashMap<(u32, u32), u32> = HashMap::new();
    let mut out = Vec::new();
    for (ei, e) in m.elems.iter().enumerate() {
        let piece = m.piece[ei];
        for k in 0..3 {
            let (a, b) = (e[k], e[(k + 1) % 3]);
            let key = (a.min(b), a.max(b));
            match seen.get(&key) {
                None => {
                    seen.insert(key, piece);
                }
                Some(&other) if other != piece => {
                    let length = m.nodes[a as usize].dist(m.nodes[b as usize]);
                    out.push(Edge {
                        pair: (other.min(piece), other.max(piece)),
                        nodes: [key.0, key.1, e[3 + k]],
                        length,
                    });
                }
                Some(_) => {}
            }
        }
    }
    out
}
