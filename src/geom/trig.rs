//! Exact integrals of trigonometric polynomials, for area moments over circular arcs.
//!
//! On an arc `x = cx + r cos t`, `y = cy + r sin t`, every moment integrand is a
//! polynomial in `cos t` and `sin t`; each monomial `cosⁱ t sinʲ t` integrates exactly
//! by the standard reduction formulas (e.g. Gradshteyn & Ryzhik, Table of Integrals,
//! 2.510–2.513), so arcs need no facets.

/// A polynomial `Σ c[i][j] cosⁱ t sinʲ t` of total degree below 6.
#[derive(Debug, Clone, Copy, PartialEq, Default)]
pub struct TrigPoly(pub [[f64; 6]; 6]);

impl TrigPoly {
    /// `a + b cos t + c sin t`
    pub fn linear(a: f64, b: f64, c: f64) -> TrigPoly {
        let mut p = TrigPoly::default();
        p.0[0][0] = a;
        p.0[1][0] = b;
        p.0[0][1] = c;
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

    /// The product; terms beyond degree 5 would be dropped, and no caller makes them.
    pub fn mul(&self, o: &TrigPoly) -> TrigPoly {
        let mut out = TrigPoly::default();
        for (i, row) in self.0.iter().enumerate() {
            for (j, &a) in row.iter().enumerate() {
                if a == 0.0 {
                    continue;
                }
                for (k, orow) in o.0.iter().take(6 - i).enumerate() {
                    for (l, &b) in orow.iter().take(6 - j).enumerate() {
                        out.0[i + k][j + l] += a * b;
                    }
                }
            }
        }
        out
    }

    /// `∫ p(t) dt` from `t0` to `t1`, exactly.
    pub fn integral(&self, t0: f64, t1: f64) -> f64 {
        let ends = Ends::new(t0, t1);
        let mut sum = 0.0;
        for (i, row) in self.0.iter().enumerate() {
            for (j, &a) in row.iter().enumerate() {
                if a != 0.0 {
                    sum += a * monomial(i, j, &ends);
                }
            }
        }
        sum
    }
}

struct Ends {
    t: (f64, f64),
    c: (f64, f64),
    s: (f64, f64),
}

impl Ends {
    fn new(t0: f64, t1: f64) -> Ends {
        Ends {
            t: (t0, t1),
            c: (t0.cos(), t1.cos()),
            s: (t0.sin(), t1.sin()),
        }
    }
    /// `[cosⁱ t sinʲ t]` from t0 to t1.
    fn bracket(&self, i: i32, j: i32) -> f64 {
        self.c.1.powi(i) * self.s.1.powi(j) - self.c.0.powi(i) * self.s.0.powi(j)
    }
}

/// `∫ cosⁱ t sinʲ t dt` by reduction:
/// `Iᵢⱼ = −[cosⁱ⁺¹ sinʲ⁻¹]/(i+j) + (j−1)/(i+j)·Iᵢ,ⱼ₋₂` and
/// `Iᵢⱼ = [cosⁱ⁻¹ sinʲ⁺¹]/(i+j) + (i−1)/(i+j)·Iᵢ₋₂,ⱼ`.
fn monomial(i: usize, j: usize, e: &Ends) -> f64 {
    let (ii, jj) = (i as i32, j as i32);
    let n = (i + j) as f64;
    if j >= 2 {
        -e.bracket(ii + 1, jj - 1) / n + (j as f64 - 1.0) / n * monomial(i, j - 2, e)
    } else if i >= 2 {
        e.bracket(ii - 1, jj + 1) / n + (i as f64 - 1.0) / n * monomial(i - 2, j, e)
    } else {
        match (i, j) {
            (0, 0) => e.t.1 - e.t.0,
            (1, 0) => e.s.1 - e.s.0,
            (0, 1) => -(e.c.1 - e.c.0),
            _ => e.bracket(0, 2) / 2.0,
        }
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use std::f64::consts::{PI, TAU};

    fn mono(i: usize, j: usize) -> TrigPoly {
        let mut p = TrigPoly::default();
        p.0[i][j] = 1.0;
        p
    }

    #[test]
    fn full_period_integrals_match_the_beta_function_values() {
        // ∫₀²ᵖ cos²t dt = π, ∫ cos⁴ = 3π/4, ∫ cos²sin² = π/4 (Gradshteyn & Ryzhik 3.621)
        assert!((mono(2, 0).integral(0.0, TAU) - PI).abs() < 1e-14);
        assert!((mono(4, 0).integral(0.0, TAU) - 0.75 * PI).abs() < 1e-14);
        assert!((mono(2, 2).integral(0.0, TAU) - 0.25 * PI).abs() < 1e-14);
        assert!(mono(3, 1).integral(0.0, TAU).abs() < 1e-14);
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
                assert!((mono(i, j).integral(t0, t1) - s).abs() < 1e-11, "{i} {j}");
            }
        }
    }
}
