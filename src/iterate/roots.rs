//! Pure numerics for seeking a value: find where a sampled function changes sign
//! ([`first_bracket`]) and close in on the root with Brent's method ([`brent`]).
//! No I/O; the function is any closure, which may fail (a value where the section
//! does not compute).

/// A function value at `x`, or why there is none.
pub type Sample = (f64, Option<f64>);

/// The first neighbouring pair of `samples` (in the given order) whose values differ
/// in sign or where one is zero: `(a, g(a), b, g(b))`. A failed sample breaks the chain.
pub fn first_bracket(samples: &[Sample]) -> Option<(f64, f64, f64, f64)> {
    samples.windows(2).find_map(|w| match (w[0], w[1]) {
        ((a, Some(ga)), (b, Some(gb))) if ga == 0.0 || gb == 0.0 || (ga < 0.0) != (gb < 0.0) => {
            Some((a, ga, b, gb))
        }
        _ => None,
    })
}

/// How a root search ended.
#[derive(Debug, Clone, Copy, PartialEq)]
pub enum Found {
    /// `|g(x)| ≤ gtol`.
    Root { x: f64, g: f64 },
    /// The bracket closed to the last representable numbers without `|g| ≤ gtol`: the
    /// function jumps across zero at `x` (a discontinuity, not a root).
    Jump { x: f64, g: f64 },
    /// `g` failed at `x`, inside the bracket.
    Failed { x: f64 },
}

/// Most evaluations [`brent`] makes (Brent's method needs at most about the square of
/// the bisection count, here far fewer; this only bounds a pathological function).
pub const MAX_EVALUATIONS: usize = 400;

/// Brent's method (R. P. Brent, Algorithms for Minimization without Derivatives,
/// 1973, ch. 4, procedure `zero`): inverse quadratic interpolation or a secant step
/// when it stays inside the bracket and shrinks it fast enough, bisection otherwise,
/// so it never converges slower than bisection. `g(a)` and `g(b)` (given as `ga`,
/// `gb`) must differ in sign; stops when `|g| ≤ gtol` or the bracket is as narrow as
/// the numbers allow.
pub fn brent(
    g: &mut dyn FnMut(f64) -> Option<f64>,
    (mut a, mut ga): (f64, f64),
    (mut b, mut gb): (f64, f64),
    gtol: f64,
) -> Found {
    if ga.abs() <= gtol && ga.abs() <= gb.abs() {
        return Found::Root { x: a, g: ga };
    }
    let (mut c, mut gc) = (a, ga);
    let mut d = b - a;
    let mut e = d;
    for _ in 0..MAX_EVALUATIONS {
        if (gb > 0.0) == (gc > 0.0) && gb != 0.0 {
            c = a;
            gc = ga;
            d = b - a;
            e = d;
        }
        if gc.abs() < gb.abs() {
            a = b;
            b = c;
            c = a;
            ga = gb;
            gb = gc;
            gc = ga;
        }
        let tol = 2.0 * f64::EPSILON * b.abs() + f64::MIN_POSITIVE;
        let m = 0.5 * (c - b);
        if gb.abs() <= gtol {
            return Found::Root { x: b, g: gb };
        }
        if m.abs() <= tol {
            return Found::Jump { x: b, g: gb };
        }
        if e.abs() < tol || ga.abs() <= gb.abs() {
            d = m;
            e = m;
        } else {
            let s = gb / ga;
            let (mut p, mut q);
            if a == c {
                // Secant.
                p = 2.0 * m * s;
                q = 1.0 - s;
            } else {
                // Inverse quadratic interpolation.
                let qq = ga / gc;
                let r = gb / gc;
                p = s * (2.0 * m * qq * (qq - r) - (b - a) * (r - 1.0));
                q = (qq - 1.0) * (r - 1.0) * (s - 1.0);
            }
            if p > 0.0 {
                q = -q;
            } else {
                p = -p;
            }
            let last = e;
            e = d;
            if 2.0 * p < 3.0 * m * q - (tol * q).abs() && p < (0.5 * last * q).abs() {
                d = p / q;
            } else {
                d = m;
                e = m;
            }
        }
        a = b;
        ga = gb;
        b += if d.abs() > tol {
            d
        } else if m > 0.0 {
            tol
        } else {
            -tol
        };
        match g(b) {
            Some(v) => gb = v,
            None => return Found::Failed { x: b },
        }
    }
    Found::Jump { x: b, g: gb }
}

#[cfg(test)]
mod tests {
    use super::*;

    fn solve(f: fn(f64) -> f64, a: f64, b: f64, tol: f64) -> (Found, usize) {
        let mut n = 0;
        let mut g = |x: f64| {
            n += 1;
            Some(f(x))
        };
        let r = brent(&mut g, (a, f(a)), (b, f(b)), tol);
        (r, n)
    }

    #[test]
    fn finds_closed_form_roots_quickly() {
        // x³ − 2 = 0 at ∛2.
        let (r, n) = solve(|x| x * x * x - 2.0, 0.0, 4.0, 1e-13);
        let Found::Root { x, .. } = r else {
            panic!("{r:?}")
        };
        assert!((x - 2f64.cbrt()).abs() < 1e-13, "{x}");
        assert!(n < 40, "{n} evaluations");
        // cos x = x at 0.7390851332151607 (the Dottie number).
        let (r, _) = solve(|x| x.cos() - x, 0.0, 1.0, 1e-15);
        let Found::Root { x, .. } = r else {
            panic!("{r:?}")
        };
        assert!((x - 0.739_085_133_215_160_7).abs() < 1e-14, "{x}");
    }

    #[test]
    fn a_step_is_a_jump_not_a_root() {
        let (r, n) = solve(|x| if x < 1.0 { -1.0 } else { 1.0 }, 0.0, 3.0, 1e-9);
        let Found::Jump { x, .. } = r else {
            panic!("{r:?}")
        };
        assert!((x - 1.0).abs() < 1e-12, "{x}");
        assert!(n <= MAX_EVALUATIONS);
    }

    #[test]
    fn a_failing_value_inside_the_bracket_is_reported() {
        let mut g = |x: f64| (!(0.5..=0.6).contains(&x)).then_some(x - 0.55);
        assert!(matches!(
            brent(&mut g, (0.0, -0.55), (1.0, 0.45), 1e-12),
            Found::Failed { .. }
        ));
    }

    #[test]
    fn the_first_sign_change_is_taken() {
        let s = [
            (1.0, Some(-2.0)),
            (2.0, None),
            (3.0, Some(1.0)),
            (4.0, Some(-1.0)),
        ];
        assert_eq!(first_bracket(&s), Some((3.0, 1.0, 4.0, -1.0)));
        assert_eq!(first_bracket(&s[..3]), None);
    }
}
