//! Exact integrals of trigonometric polynomials, for area moments over circular arcs.
//!
//! On an arc `x = cx + r cos t`, `y = cy + r sin t`, every moment integrand is a
//! polynomial in `cos t` and `sin t`; each monomial `cosⁱ t sinʲ t` integrates exactly
//! by the standard reduction formulas (e.g. Gradshteyn & Ryzhik, Table of Integrals,
//! 2.510–2.513), so arcs need no facets. The integrals of all the monomials up to
//! degree 5 over one arc ([`Monomials`]) come from the cosines and sines of its two end
//! angles alone, so an arc costs two `sin_cos` however many moments are taken over it.

/// A polynomial `Σ c[i][j] cosⁱ t sinʲ t` of total degree `deg` below 6 (every
/// coefficient of a higher total degree is zero), `c[i][j]` stored at `6i + j`, so
/// that the product of two terms is stored at the sum of their places.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct TrigPoly {
    c: [f64; 36],
    deg: usize,
}

impl TrigPoly {
    /// `a + b cos t + c sin t`
    pub fn linear(a: f64, b: f64, c: f64) -> TrigPoly {
        let mut p = TrigPoly {
            c: [0.0; 36],
            deg: 1,
        };
        p.c[0] = a;
        p.c[6] = b;
        p.c[1] = c;
        p
    }

    /// On the arc `x = cx + r cos t`, `y = cy + r sin t`: the polynomials `x(t)`, `y(t)`
    /// and the Green's-theorem weight `w(t)` with `x dy − y dx = w dt`,
    /// `w = r² + r·cx·cos t + r·cy·sin t`.
    pub fn arc(c: super::Pt, r: f64) -> [TrigPoly; 3] {
        [
            TrigPoly::linear(c.x, r, 0.0),
            TrigPoly::linear(c.y, 0.0, r),
            TrigPoly::linear(r * r, r * c.x, r * c.y),
        ]
    }

    /// The product; terms beyond degree 5 are dropped (no caller makes them). Each
    /// nonzero coefficient of `self` (in the order of `i`, then `j`) times every term
    /// of `o` that stays within degree 5.
    #[inline]
    pub fn mul(&self, o: &TrigPoly) -> TrigPoly {
        // The degrees the moments multiply (linear and quadratic factors) as constants,
        // so that the loops below unroll; any other pair as it comes.
        match (self.deg, o.deg) {
            (1, 1) => self.product(o, 1, 1),
            (1, 2) => self.product(o, 1, 2),
            (2, 1) => self.product(o, 2, 1),
            (2, 2) => self.product(o, 2, 2),
            (d, e) => self.product(o, d, e),
        }
    }

    /// [`TrigPoly::mul`] for `self` of degree `ds` and `o` of degree `od`.
    #[inline(always)]
    fn product(&self, o: &TrigPoly, ds: usize, od: usize) -> TrigPoly {
        let mut out = TrigPoly {
            c: [0.0; 36],
            deg: (ds + od).min(5),
        };
        for i in 0..=ds {
            for j in 0..=ds - i {
                let a = self.c[6 * i + j];
                if a == 0.0 {
                    continue;
                }
                let room = od.min(5 - i - j);
                for &at in &BY_DEGREE[..(room + 1) * (room + 2) / 2] {
                    out.c[6 * i + j + at] += a * o.c[at];
                }
            }
        }
        out
    }

    /// `∫ p(t) dt` over the arc of `m`, exactly: `Σ c[i][j]·∫cosⁱ t sinʲ t dt`.
    pub fn integral(&self, m: &Monomials) -> f64 {
        // Each degree as a constant, so that the loops below unroll.
        match self.deg {
            0 => self.sum_with(m, 0),
            1 => self.sum_with(m, 1),
            2 => self.sum_with(m, 2),
            3 => self.sum_with(m, 3),
            4 => self.sum_with(m, 4),
            d => self.sum_with(m, d),
        }
    }

    /// [`TrigPoly::integral`] of `self`, of degree `deg`.
    #[inline(always)]
    fn sum_with(&self, m: &Monomials, deg: usize) -> f64 {
        let mut sum = 0.0;
        for i in 0..=deg {
            for j in 0..=deg - i {
                let a = self.c[6 * i + j];
                if a != 0.0 {
                    sum += a * m.0[i][j];
                }
            }
        }
        sum
    }
}

/// The places `6k + l` of the terms `cosᵏ sinˡ` in order of total degree `k + l`:
/// those up to degree `d` are the first `(d + 1)(d + 2)/2`.
const BY_DEGREE: [usize; 21] = [
    0, 1, 6, 2, 7, 12, 3, 8, 13, 18, 4, 9, 14, 19, 24, 5, 10, 15, 20, 25, 30,
];

/// An end angle `t` of an arc with its cosine and sine.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct Angle {
    pub t: f64,
    pub cos: f64,
    pub sin: f64,
}

impl Angle {
    pub fn new(t: f64) -> Angle {
        let (sin, cos) = t.sin_cos();
        Angle { t, cos, sin }
    }

    /// `[1, v, v², v³, v⁴]`, each power formed as repeated squaring forms it
    /// (`v³ = v·v²`, `v⁴ = v²·v²`).
    fn powers(v: f64) -> [f64; 5] {
        let v2 = v * v;
        [1.0, v, v2, v * v2, v2 * v2]
    }
}

/// `∫ cosⁱ t sinʲ t dt` from `t0` to `t1` for every `i + j ≤ 5`, exactly, from the
/// cosines and sines of the two ends, by the reductions (Gradshteyn & Ryzhik 2.510–2.513)
/// `Iᵢⱼ = −[cosⁱ⁺¹ sinʲ⁻¹]/(i+j) + (j−1)/(i+j)·Iᵢ,ⱼ₋₂` (for `j ≥ 2`) and
/// `Iᵢⱼ = [cosⁱ⁻¹ sinʲ⁺¹]/(i+j) + (i−1)/(i+j)·Iᵢ₋₂,ⱼ` (for `i ≥ 2`), from
/// `I₀₀ = t₁ − t₀`, `I₁₀ = [sin]`, `I₀₁ = −[cos]`, `I₁₁ = [sin²]/2`, where `[f]` is
/// `f(t₁) − f(t₀)`.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct Monomials([[f64; 6]; 6]);

impl Monomials {
    /// Over `t0..t1` (the direction of travel: reversed, every integral changes sign).
    pub fn new(t0: f64, t1: f64) -> Monomials {
        Monomials::between(&Angle::new(t0), &Angle::new(t1))
    }

    /// Over `e0.t..e1.t`, from the ends' cosines and sines.
    pub fn between(e0: &Angle, e1: &Angle) -> Monomials {
        let (c0, s0) = (Angle::powers(e0.cos), Angle::powers(e0.sin));
        let (c1, s1) = (Angle::powers(e1.cos), Angle::powers(e1.sin));
        // `[cosⁱ sinʲ]`, for the `i, j ≤ 4` the reductions reach.
        let bracket = |i: usize, j: usize| c1[i] * s1[j] - c0[i] * s0[j];
        let mut m = [[0.0; 6]; 6];
        m[0][0] = e1.t - e0.t;
        m[1][0] = e1.sin - e0.sin;
        m[0][1] = -(e1.cos - e0.cos);
        for d in 2..6 {
            let n = d as f64;
            for i in 0..=d {
                let j = d - i;
                m[i][j] = if j >= 2 {
                    -bracket(i + 1, j - 1) / n + (j as f64 - 1.0) / n * m[i][j - 2]
                } else if i >= 2 {
                    bracket(i - 1, j + 1) / n + (i as f64 - 1.0) / n * m[i - 2][j]
                } else {
                    bracket(0, 2) / 2.0
                };
            }
        }
        Monomials(m)
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use std::f64::consts::{PI, TAU};

    fn mono(i: usize, j: usize) -> TrigPoly {
        let mut p = TrigPoly {
            c: [0.0; 36],
            deg: i + j,
        };
        p.c[6 * i + j] = 1.0;
        p
    }

    fn int(p: &TrigPoly, t0: f64, t1: f64) -> f64 {
        p.integral(&Monomials::new(t0, t1))
    }

    #[test]
    fn full_period_integrals_match_the_beta_function_values() {
        // ∫₀²ᵖ cos²t dt = π, ∫ cos⁴ = 3π/4, ∫ cos²sin² = π/4 (Gradshteyn & Ryzhik 3.621)
        assert!((int(&mono(2, 0), 0.0, TAU) - PI).abs() < 1e-14);
        assert!((int(&mono(4, 0), 0.0, TAU) - 0.75 * PI).abs() < 1e-14);
        assert!((int(&mono(2, 2), 0.0, TAU) - 0.25 * PI).abs() < 1e-14);
        assert!(int(&mono(3, 1), 0.0, TAU).abs() < 1e-14);
    }

    #[test]
    fn partial_integrals_match_simpson_quadrature() {
        for i in 0..5 {
            for j in 0..5 - i {
                let (t0, t1) = (0.3, 2.1);
                let f = |t: f64| t.cos().powi(i as i32) * t.sin().powi(j as i32);
                let n = 2000;
                let h = (t1 - t0) / n as f64;
                let s: f64 = (0..=n)
                    .map(|k| {
                        let w = if k == 0 || k == n {
                            1.0
                        } else if k % 2 == 1 {
                            4.0
                        } else {
                            2.0
                        };
                        w * f(t0 + k as f64 * h)
                    })
                    .sum::<f64>()
                    * h
                    / 3.0;
                assert!((int(&mono(i, j), t0, t1) - s).abs() < 1e-11, "{i} {j}");
            }
        }
    }

    #[test]
    fn quarter_period_integrals_match_the_beta_function() {
        // ∫₀^{π/2} cosⁱt sinʲt dt = B((i+1)/2, (j+1)/2)/2 (Gradshteyn & Ryzhik 3.621.5):
        // cos⁵ → 8/15, cos³sin² → 2/15, cos²sin³ → 2/15, sin⁴ → 3π/16, cos sin → 1/2,
        // cos² sin² → π/16; over the same quarter travelled backwards, the negatives.
        let q = Monomials::new(0.0, PI / 2.0);
        let back = Monomials::new(PI / 2.0, 0.0);
        for (i, j, v) in [
            (5, 0, 8.0 / 15.0),
            (3, 2, 2.0 / 15.0),
            (2, 3, 2.0 / 15.0),
            (0, 4, 3.0 * PI / 16.0),
            (1, 1, 0.5),
            (2, 2, PI / 16.0),
            (0, 0, PI / 2.0),
        ] {
            assert!((mono(i, j).integral(&q) - v).abs() < 1e-15, "{i} {j}");
            assert!((mono(i, j).integral(&back) + v).abs() < 1e-15, "{i} {j}");
        }
    }

    #[test]
    fn products_of_every_degree_pair_integrate_as_their_expansions() {
        // (1 + cos t)² = 1 + 2cos t + cos²t; over [0, π/2] (the quarter-period values
        // above: ∫cos = 1, ∫cos² = π/4, ∫cos³ = 2/3, ∫cos⁴ = 3π/16) it is 3π/4 + 2;
        // times cos t: ∫(cos + 2cos² + cos³) = 1 + π/2 + 2/3; squared again:
        // ∫(1 + 4cos + 6cos² + 4cos³ + cos⁴) = π/2 + 4 + 3π/2 + 8/3 + 3π/16.
        let q = (0.0, PI / 2.0);
        let (one_cos, cos) = (TrigPoly::linear(1.0, 1.0, 0.0), mono(1, 0));
        let sq = one_cos.mul(&one_cos);
        assert!((int(&sq, q.0, q.1) - (0.75 * PI + 2.0)).abs() < 1e-14);
        for p in [sq.mul(&cos), cos.mul(&sq)] {
            assert!((int(&p, q.0, q.1) - (1.0 + PI / 2.0 + 2.0 / 3.0)).abs() < 1e-14);
        }
        let fourth = 2.0 * PI + 4.0 + 8.0 / 3.0 + 3.0 * PI / 16.0;
        assert!((int(&sq.mul(&sq), q.0, q.1) - fourth).abs() < 1e-13);
        let cubed = sq.mul(&one_cos);
        assert!((int(&cubed.mul(&one_cos), q.0, q.1) - fourth).abs() < 1e-13);
    }

    #[test]
    fn a_product_integrates_as_its_expansion() {
        // (1 + 2cos t)(3 − sin t) = 3 + 6cos t − sin t − 2cos t sin t, termwise over
        // [0, π/2]: 3π/2 + 6 − 1 − 1 (the values above).
        let p = TrigPoly::linear(1.0, 2.0, 0.0).mul(&TrigPoly::linear(3.0, 0.0, -1.0));
        let want = 1.5 * PI + 4.0;
        assert!((int(&p, 0.0, PI / 2.0) - want).abs() < 1e-14);
    }
}
