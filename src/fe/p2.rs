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
    pub n: Vec<[f64; 6]>,
    pub dxi: Vec<[f64; 6]>,
    pub deta: Vec<[f64; 6]>,
}

impl Rule {
    fn from_points(pts: &[(f64, f64, f64)]) -> Rule {
        let mut r = Rule {
            w: Vec::new(),
            n: Vec::new(),
            dxi: Vec::new(),
            deta: Vec::new(),
        };
        for &(xi, eta, w) in pts {
            let l1 = 1.0 - xi - eta;
            r.w.push(w);
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
