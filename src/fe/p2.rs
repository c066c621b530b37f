//! The 6-node (quadratic, isoparametric) triangle: shape functions, quadrature rules
//! and the geometry of one element at a quadrature point.
//!
//! Node order: corners 0, 1, 2 counter-clockwise, then the mid-side nodes of edges
//! 0–1, 1–2, 2–0. With area coordinates L₁ = 1 − ξ − η, L₂ = ξ, L₃ = η the shape
//! functions are Nᵢ = Lᵢ(2Lᵢ − 1) at the corners and 4LᵢLⱼ at the mid-sides
//! (Zienkiewicz & Taylor, The Finite Element Method, vol. 1, §8.8). A mid-side node
//! placed on a circular boundary makes the element curved; its Jacobian then varies
//! over the element and the 6-point rule is used for everything on it.

use crate::geom::Pt;

/// Area coordinates of a point and the six shape-function values there.
pub fn shape(l: [f64; 3]) -> [f64; 6] {
    let [a, b, c] = l;
    [
        a * (2.0 * a - 1.0),
        b * (2.0 * b - 1.0),
        c * (2.0 * c - 1.0),
        4.0 * a * b,
        4.0 * b * c,
        4.0 * c * a,
    ]
}

/// Shape-function values and reference derivatives at the points of a rule, with the
/// weights normalised to sum to 1 (so Σ wᵢ·detJ/2 is the element area).
pub struct Rule {
    pub w: Vec<f64>,
    /// The points' reference coordinates (ξ, η).
    pub xi: Vec<(f64, f64)>,
    pub n: Vec<[f64; 6]>,
    pub dxi: Vec<[f64; 6]>,
    pub deta: Vec<[f64; 6]>,
}

impl Rule {
    fn from_points(pts: &[(f64, f64, f64)]) -> Rule {
        let mut r = Rule {
            w: Vec::new(),
            xi: Vec::new(),
            n: Vec::new(),
            dxi: Vec::new(),
            deta: Vec::new(),
        };
        for &(xi, eta, w) in pts {
            let l1 = 1.0 - xi - eta;
            r.w.push(w);
            r.xi.push((xi, eta));
            r.n.push(shape([l1, xi, eta]));
            r.dxi.push([
                -(4.0 * l1 - 1.0),
                4.0 * xi - 1.0,
                0.0,
                4.0 * (l1 - xi),
                4.0 * eta,
                -4.0 * eta,
            ]);
            r.deta.push([
                -(4.0 * l1 - 1.0),
                0.0,
                4.0 * eta - 1.0,
                -4.0 * xi,
                4.0 * xi,
                4.0 * (l1 - eta),
            ]);
        }
        r
    }

    /// Three interior points, exact for quadratics (Strang & Fix, An Analysis of the
    /// Finite Element Method, Table 4.1): enough for the stiffness and load of a
    /// straight-sided 6-node triangle, whose integrands are of degree 2.
    pub fn degree2() -> Rule {
        let (a, b, w) = (1.0 / 6.0, 2.0 / 3.0, 1.0 / 3.0);
        Rule::from_points(&[(a, a, w), (b, a, w), (a, b, w)])
    }

    /// Six points, exact for quartics (Dunavant, "High degree efficient symmetrical
    /// Gaussian quadrature rules for the triangle", IJNME 21, 1985): ∫xω and ∫ω² on
    /// straight elements are of degree 3 and 4.
    pub fn degree4() -> Rule {
        let (a, wa) = (0.445_948_490_915_965, 0.223_381_589_678_011);
        let (b, wb) = (0.091_576_213_509_771, 0.109_951_743_655_322);
        Rule::from_points(&[
            (a, a, wa),
            (1.0 - 2.0 * a, a, wa),
            (a, 1.0 - 2.0 * a, wa),
            (b, b, wb),
            (1.0 - 2.0 * b, b, wb),
            (b, 1.0 - 2.0 * b, wb),
        ])
    }

    /// Shape functions and their reference derivatives at the given `(ξ, η)` points,
    /// with weight zero (for values at points rather than integrals).
    pub fn at_points(pts: &[(f64, f64)]) -> Rule {
        let with_w: Vec<(f64, f64, f64)> = pts.iter().map(|&(a, b)| (a, b, 0.0)).collect();
        Rule::from_points(&with_w)
    }

    /// Number of points.
    pub fn points(&self) -> usize {
        self.w.len()
    }
}

/// One element at one quadrature point: position, area weight `w·detJ/2` and the
/// gradients of the six shape functions.
pub struct At {
    pub x: f64,
    pub y: f64,
    pub da: f64,
    pub gx: [f64; 6],
    pub gy: [f64; 6],
}

/// Maps quadrature point `q` of `rule` onto the element with nodes `p`. `None` when
/// the element is inverted or degenerate there (detJ ≤ 0).
pub fn at(p: &[Pt; 6], rule: &Rule, q: usize) -> Option<At> {
    let (n, dxi, deta) = (&rule.n[q], &rule.dxi[q], &rule.deta[q]);
    let (mut x, mut y, mut xx, mut xe, mut yx, mut ye) = (0.0, 0.0, 0.0, 0.0, 0.0, 0.0);
    for i in 0..6 {
        x += n[i] * p[i].x;
        y += n[i] * p[i].y;
        xx += dxi[i] * p[i].x;
        xe += deta[i] * p[i].x;
        yx += dxi[i] * p[i].y;
        ye += deta[i] * p[i].y;
    }
    let det = xx * ye - xe * yx;
    if det.is_nan() || det <= 0.0 {
        return None;
    }
    let inv = 1.0 / det;
    let mut gx = [0.0; 6];
    let mut gy = [0.0; 6];
    for i in 0..6 {
        gx[i] = (ye * dxi[i] - yx * deta[i]) * inv;
        gy[i] = (-xe * dxi[i] + xx * deta[i]) * inv;
    }
    Some(At {
        x,
        y,
        da: 0.5 * rule.w[q] * det,
        gx,
        gy,
    })
}

/// One element's map from the reference triangle, for [`Element::at`]: a straight
/// element's is affine, x = x₀ + J·(ξ, η) with J from its corners, constant over it
/// (Zienkiewicz & Taylor, The Finite Element Method, vol. 1, §9.3), so its inverse is
/// taken once and a point costs the corners' interpolation and ∇N = J⁻ᵀ∇̂N; a curved
/// one is mapped point by point ([`at`]).
pub enum Element<'a> {
    Straight {
        /// The first corner, and J = [[x₁₀, x₂₀], [y₁₀, y₂₀]] as (xx, xe, yx, ye).
        o: Pt,
        j: [f64; 4],
        det: f64,
    },
    Curved(&'a [Pt; 6]),
}

impl<'a> Element<'a> {
    /// The map of the element with nodes `p`, straight unless `curved` (the mesh's
    /// flag); `None` when a straight one is inverted or degenerate (det J ≤ 0).
    pub fn new(p: &'a [Pt; 6], curved: bool) -> Option<Element<'a>> {
        if curved {
            return Some(Element::Curved(p));
        }
        let (a, b) = (p[1].sub(p[0]), p[2].sub(p[0]));
        let det = a.x * b.y - b.x * a.y;
        if det.is_nan() || det <= 0.0 {
            return None;
        }
        Some(Element::Straight {
            o: p[0],
            j: [a.x, b.x, a.y, b.y],
            det,
        })
    }

    /// The element at point `q` of `rule`, as [`at`] gives it; `None` where a curved
    /// element is inverted or degenerate.
    pub fn at(&self, rule: &Rule, q: usize) -> Option<At> {
        let (o, j, det) = match *self {
            Element::Curved(p) => return at(p, rule, q),
            Element::Straight { o, j, det } => (o, j, det),
        };
        let [xx, xe, yx, ye] = j;
        let (s, t) = rule.xi[q];
        let (dxi, deta) = (&rule.dxi[q], &rule.deta[q]);
        let inv = 1.0 / det;
        let mut gx = [0.0; 6];
        let mut gy = [0.0; 6];
        for i in 0..6 {
            gx[i] = (ye * dxi[i] - yx * deta[i]) * inv;
            gy[i] = (xx * deta[i] - xe * dxi[i]) * inv;
        }
        Some(At {
            x: o.x + xx * s + xe * t,
            y: o.y + yx * s + ye * t,
            da: 0.5 * rule.w[q] * det,
            gx,
            gy,
        })
    }
}

/// A straight-sided element (mid-side nodes at the middles of its sides) is the affine
/// image x = x₀ + J·(ξ, η) of the reference triangle, with J = [[x₁ − x₀, x₂ − x₀],
/// [y₁ − y₀, y₂ − y₀]] constant, so ∇N = J⁻ᵀ∇̂N and its integrals are fixed
/// combinations of integrals over the reference triangle, computed once
/// ([`Straight::get`]; Zienkiewicz & Taylor, The Finite Element Method, vol. 1, §8.8 and
/// §9.3 on the Jacobian of the mapping). With dA = det J dξ dη:
///
///   ∫∇Nₐ·∇N_b dA = [(x₂₀² + y₂₀²)·S_ξξ − (x₁₀x₂₀ + y₁₀y₂₀)·(S_ξη + S_ηξ) + (x₁₀² + y₁₀²)·S_ηη]ₐ_b / det J
///
/// (x₁₀ = x₁ − x₀ and so on; S_ab = ∫ ∂N/∂a ∂N/∂b dξ dη), and the torsion load
///
///   ∫(y ∂Nₐ/∂x − x ∂Nₐ/∂y) dA = ∫ ∂Nₐ/∂ξ·(y₂₀y + x₂₀x) − ∂Nₐ/∂η·(y₁₀y + x₁₀x) dξ dη
///
/// with x, y linear in ξ, η (det J cancels). The integrands are of degree 2, so the
/// reference integrals by [`Rule::degree2`] are exact.
pub struct Straight {
    /// S_ξξ, S_ξη + S_ηξ, S_ηη.
    s: [[[f64; 6]; 6]; 3],
    /// ∫ ∂Nₐ/∂ξ·(1, ξ, η) and ∫ ∂Nₐ/∂η·(1, ξ, η).
    lxi: [[f64; 6]; 3],
    leta: [[f64; 6]; 3],
    /// ∫ N_b ∂Nₐ/∂ξ and ∫ N_b ∂Nₐ/∂η, as `[b][a]`.
    nd: [[[f64; 6]; 6]; 2],
    /// The reference mass ∫ Nₐ N_b.
    mass: [[f64; 6]; 6],
}

impl Straight {
    /// The reference integrals, computed on first use.
    pub fn get() -> &'static Straight {
        static REF: std::sync::OnceLock<Straight> = std::sync::OnceLock::new();
        REF.get_or_init(|| {
            let r = Rule::degree2();
            let mut t = Straight {
                s: [[[0.0; 6]; 6]; 3],
                lxi: [[0.0; 6]; 3],
                leta: [[0.0; 6]; 3],
                nd: [[[0.0; 6]; 6]; 2],
                mass: [[0.0; 6]; 6],
            };
            // The reference element itself: x = ξ, y = η, ∇N = ∇̂N, dA = dξ dη.
            let h = 0.5;
            let unit = [
                (0.0, 0.0),
                (1.0, 0.0),
                (0.0, 1.0),
                (h, 0.0),
                (h, h),
                (0.0, h),
            ];
            let unit = unit.map(|(x, y)| Pt::new(x, y));
            for g in (0..r.points()).filter_map(|q| at(&unit, &r, q)) {
                let (w, dx, de) = (g.da, &g.gx, &g.gy);
                for a in 0..6 {
                    for b in 0..6 {
                        t.s[0][a][b] += w * dx[a] * dx[b];
                        t.s[1][a][b] += w * (dx[a] * de[b] + de[a] * dx[b]);
                        t.s[2][a][b] += w * de[a] * de[b];
                    }
                    for (m, v) in [1.0, g.x, g.y].into_iter().enumerate() {
                        t.lxi[m][a] += w * dx[a] * v;
                        t.leta[m][a] += w * de[a] * v;
                    }
                }
            }
            // Degree 3 and 4 integrands: the degree-4 rule is exact.
            let r4 = Rule::degree4();
            for (q, g) in (0..r4.points()).filter_map(|q| Some((q, at(&unit, &r4, q)?))) {
                let n = &r4.n[q];
                for b in 0..6 {
                    for a in 0..6 {
                        t.nd[0][b][a] += g.da * n[b] * g.gx[a];
                        t.nd[1][b][a] += g.da * n[b] * g.gy[a];
                        t.mass[b][a] += g.da * n[b] * n[a];
                    }
                }
            }
            t
        })
    }

    /// For a vector field `v` and a scalar `s` of the element's own (quadratic) space,
    /// given by their values at its nodes `p` (exact for any quadratic v and s on a
    /// straight element, where such polynomials are Σ N_b·v_b): ∫ v·∇Nₐ dA, ∫ s·Nₐ dA
    /// and ∫ |v|² dA. With ∇N = J⁻ᵀ∇̂N, v·∇Nₐ = (J⁻¹v)·∇̂Nₐ and det J cancels in the
    /// first; the others are det J times the reference mass. `None` when the element is
    /// inverted or degenerate.
    pub fn field_integrals(
        &self,
        p: &[Pt; 6],
        v: &[[f64; 2]; 6],
        s: &[f64; 6],
    ) -> Option<([f64; 6], [f64; 6], f64)> {
        let (x0, y0) = (p[0].x, p[0].y);
        let (xx, yx, xe, ye) = (p[1].x - x0, p[1].y - y0, p[2].x - x0, p[2].y - y0);
        let det = xx * ye - xe * yx;
        if det.is_nan() || det <= 0.0 {
            return None;
        }
        let (mut dv, mut sn, mut vv) = ([0.0; 6], [0.0; 6], 0.0);
        for (b, vb) in v.iter().enumerate() {
            // det J·J⁻¹v at node b.
            let (u0, u1) = (ye * vb[0] - xe * vb[1], xx * vb[1] - yx * vb[0]);
            let (nx, ny, mb) = (&self.nd[0][b], &self.nd[1][b], &self.mass[b]);
            let mut mv = [0.0; 2];
            for a in 0..6 {
                dv[a] += u0 * nx[a] + u1 * ny[a];
                sn[a] += s[b] * mb[a];
                mv[0] += mb[a] * v[a][0];
                mv[1] += mb[a] * v[a][1];
            }
            vv += vb[0] * mv[0] + vb[1] * mv[1];
        }
        Some((dv, sn.map(|x| x * det), vv * det))
    }

    /// The stiffness ∫∇Nₐ·∇N_b dA and the torsion load ∫(y ∂Nₐ/∂x − x ∂Nₐ/∂y) dA of
    /// the straight element with nodes `p` (its corners are read); `None` when it is
    /// inverted or degenerate (det J ≤ 0), as [`at`] says.
    pub fn stiffness_and_load(&self, p: &[Pt; 6]) -> Option<([[f64; 6]; 6], [f64; 6])> {
        let (x0, y0) = (p[0].x, p[0].y);
        let (x1, y1, x2, y2) = (p[1].x - x0, p[1].y - y0, p[2].x - x0, p[2].y - y0);
        let det = x1 * y2 - x2 * y1;
        if det.is_nan() || det <= 0.0 {
            return None;
        }
        let c = [
            (x2 * x2 + y2 * y2) / det,
            -(x1 * x2 + y1 * y2) / det,
            (x1 * x1 + y1 * y1) / det,
        ];
        let mut k = [[0.0; 6]; 6];
        for (a, row) in k.iter_mut().enumerate() {
            for (b, v) in row.iter_mut().enumerate() {
                *v = c[0] * self.s[0][a][b] + c[1] * self.s[1][a][b] + c[2] * self.s[2][a][b];
            }
        }
        // y₂₀y + x₂₀x and y₁₀y + x₁₀x as (constant, ξ, η) coefficients.
        let u = [y2 * y0 + x2 * x0, y2 * y1 + x2 * x1, y2 * y2 + x2 * x2];
        let v = [y1 * y0 + x1 * x0, y1 * y1 + x1 * x1, y1 * y2 + x1 * x2];
        let mut f = [0.0; 6];
        for (a, fa) in f.iter_mut().enumerate() {
            *fa = (0..3)
                .map(|m| u[m] * self.lxi[m][a] - v[m] * self.leta[m][a])
                .sum();
        }
        Some((k, f))
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn rules_integrate_monomials_exactly() {
        // ∫ ξ^a η^b over the unit right triangle = a! b! / (a + b + 2)! (a standard
        // result, e.g. Zienkiewicz & Taylor vol. 1, §8.9).
        let fact = |k: u32| (1..=k).map(f64::from).product::<f64>();
        for (rule, deg) in [(Rule::degree2(), 2), (Rule::degree4(), 4)] {
            for a in 0..=deg {
                for b in 0..=(deg - a) {
                    let mut s = 0.0;
                    let p = [
                        Pt::new(0.0, 0.0),
                        Pt::new(1.0, 0.0),
                        Pt::new(0.0, 1.0),
                        Pt::new(0.5, 0.0),
                        Pt::new(0.5, 0.5),
                        Pt::new(0.0, 0.5),
                    ];
                    for q in 0..rule.points() {
                        let g = at(&p, &rule, q).expect("valid element");
                        s += g.da * g.x.powi(a as i32) * g.y.powi(b as i32);
                    }
                    let exact = fact(a) * fact(b) / fact(a + b + 2);
                    assert!((s - exact).abs() < 1e-14, "{a} {b}: {s} vs {exact}");
                }
            }
        }
    }

    #[test]
    fn a_straight_element_from_the_reference_matches_its_quadrature() {
        // The affine map of the reference integrals against the isoparametric
        // quadrature of the same element (exact for it: degree-2 integrands).
        let (a, b, c) = (Pt::new(-3.0, 1.0), Pt::new(4.0, -2.5), Pt::new(0.5, 6.0));
        let mid = |p: Pt, q: Pt| Pt::new(0.5 * (p.x + q.x), 0.5 * (p.y + q.y));
        let p = [a, b, c, mid(a, b), mid(b, c), mid(c, a)];
        let (k, f) = Straight::get()
            .stiffness_and_load(&p)
            .expect("valid element");
        let rule = Rule::degree2();
        let (mut kq, mut fq) = ([[0.0; 6]; 6], [0.0; 6]);
        for q in 0..rule.points() {
            let g = at(&p, &rule, q).expect("valid element");
            for i in 0..6 {
                fq[i] += g.da * (g.y * g.gx[i] - g.x * g.gy[i]);
                for (j, v) in kq[i].iter_mut().enumerate() {
                    *v += g.da * (g.gx[i] * g.gx[j] + g.gy[i] * g.gy[j]);
                }
            }
        }
        for i in 0..6 {
            assert!(
                (f[i] - fq[i]).abs() < 1e-12 * 50.0,
                "f[{i}] {} vs {}",
                f[i],
                fq[i]
            );
            for j in 0..6 {
                assert!((k[i][j] - kq[i][j]).abs() < 1e-13 * 10.0, "k[{i}][{j}]");
            }
        }
        // Rows of a stiffness sum to zero (a constant has no gradient).
        assert!(k.iter().all(|r| r.iter().sum::<f64>().abs() < 1e-13));
        let flipped = [a, c, b, mid(a, c), mid(c, b), mid(b, a)];
        assert!(Straight::get().stiffness_and_load(&flipped).is_none());
    }

    #[test]
    fn a_straight_elements_affine_map_matches_the_isoparametric_one() {
        // On a straight element the isoparametric map is the affine one (Zienkiewicz &
        // Taylor vol. 1, §9.3): same point, weight and gradients to rounding.
        let (a, b, c) = (Pt::new(-3.0, 1.0), Pt::new(4.0, -2.5), Pt::new(0.5, 6.0));
        let mid = |p: Pt, q: Pt| Pt::new(0.5 * (p.x + q.x), 0.5 * (p.y + q.y));
        let p = [a, b, c, mid(a, b), mid(b, c), mid(c, a)];
        let rule = Rule::degree4();
        let e = Element::new(&p, false).expect("valid element");
        for q in 0..rule.points() {
            let (g, h) = (
                at(&p, &rule, q).expect("valid"),
                e.at(&rule, q).expect("valid"),
            );
            let close = |u: f64, v: f64| (u - v).abs() < 1e-13 * (1.0 + u.abs());
            assert!(close(g.x, h.x) && close(g.y, h.y) && close(g.da, h.da));
            assert!((0..6).all(|i| close(g.gx[i], h.gx[i]) && close(g.gy[i], h.gy[i])));
        }
        let flipped = [a, c, b, mid(a, c), mid(c, b), mid(b, a)];
        assert!(Element::new(&flipped, false).is_none());
    }

    #[test]
    fn field_integrals_match_the_quadrature_of_the_quadratics() {
        // v = (x² − y, xy), s = 1 + x − y² on a straight element: ∫v·∇Nₐ, ∫s·Nₐ and
        // ∫|v|² against the degree-4 rule (exact for these degree ≤ 4 integrands,
        // Dunavant 1985).
        let (a, b, c) = (Pt::new(-3.0, 1.0), Pt::new(4.0, -2.5), Pt::new(0.5, 6.0));
        let mid = |p: Pt, q: Pt| Pt::new(0.5 * (p.x + q.x), 0.5 * (p.y + q.y));
        let p = [a, b, c, mid(a, b), mid(b, c), mid(c, a)];
        let v = |x: f64, y: f64| [x * x - y, x * y];
        let s = |x: f64, y: f64| 1.0 + x - y * y;
        let (dv, sn, vv) = Straight::get()
            .field_integrals(&p, &p.map(|q| v(q.x, q.y)), &p.map(|q| s(q.x, q.y)))
            .expect("valid element");
        let rule = Rule::degree4();
        let (mut dq, mut sq, mut vq) = ([0.0; 6], [0.0; 6], 0.0);
        for q in 0..rule.points() {
            let g = at(&p, &rule, q).expect("valid element");
            let (vg, sg) = (v(g.x, g.y), s(g.x, g.y));
            vq += g.da * (vg[0] * vg[0] + vg[1] * vg[1]);
            for i in 0..6 {
                dq[i] += g.da * (vg[0] * g.gx[i] + vg[1] * g.gy[i]);
                sq[i] += g.da * sg * rule.n[q][i];
            }
        }
        let close = |u: f64, w: f64| (u - w).abs() < 1e-11 * (1.0 + w.abs());
        assert!(close(vv, vq), "{vv} vs {vq}");
        for i in 0..6 {
            assert!(close(dv[i], dq[i]) && close(sn[i], sq[i]), "{i}");
        }
    }

    #[test]
    fn shape_functions_partition_unity_and_gradients_sum_to_zero() {
        let rule = Rule::degree4();
        let p = [
            Pt::new(0.0, 0.0),
            Pt::new(2.0, 0.1),
            Pt::new(0.3, 1.5),
            Pt::new(1.0, 0.05),
            Pt::new(1.15, 0.8),
            Pt::new(0.15, 0.75),
        ];
        for q in 0..rule.points() {
            assert!((rule.n[q].iter().sum::<f64>() - 1.0).abs() < 1e-14);
            let g = at(&p, &rule, q).expect("valid element");
            assert!(g.gx.iter().sum::<f64>().abs() < 1e-12);
            // The gradient of x = Σ xᵢNᵢ is (1, 0).
            let dxdx: f64 = (0..6).map(|i| p[i].x * g.gx[i]).sum();
            let dxdy: f64 = (0..6).map(|i| p[i].x * g.gy[i]).sum();
            assert!((dxdx - 1.0).abs() < 1e-12 && dxdy.abs() < 1e-12);
        }
    }
}
