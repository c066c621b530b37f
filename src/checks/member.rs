//! A quick single-span member check: shear, bending moment and deflection of a beam under a
//! uniform load and point loads, for four support cases. The elastic critical moment for
//! lateral-torsional buckling is in [`super::ltb`].
//!
//! Conventions: x runs from 0 to `span`; loads act in −y (gravity) and are given as positive
//! numbers downward (a negative value lifts); deflection is positive downward; the bending
//! moment is positive when sagging (tension at the bottom); the shear force V is the sum of
//! the upward forces left of the section, so that dM/dx = V. Values are in whatever consistent
//! units the caller supplies (e.g. N, mm, N/mm, N·mm²); nothing here converts units.
//!
//! Method: Macaulay's singularity functions (W. H. Macaulay, "Note on the deflection of beams",
//! Messenger of Mathematics 48, 1919; Gere & Goodno, Mechanics of Materials, "method of
//! superposition" and "discontinuity functions"). Everything follows from three values at the
//! left end, x = 0 — the vertical reaction R0, the bending moment M0 and the slope θ0 — by
//! statics and two integrations of `EI·δ'' = −M`; the support conditions fix those three.
//! This is the exact superposition of the standard load cases (Roark's Formulas for Stress and
//! Strain, Table 8.1; AISC Steel Construction Manual, beam diagrams and formulas), without
//! a table of cases to copy.
//!
//! Shear deformation (optional, [`Beam::shear_rigidity`] = G·A_s): the Timoshenko beam, in
//! which the deflection's slope is the rotation of the cross-section plus the shear strain,
//! `δ' = θ + V/(G·A_s)`, with `EI·θ' = −M` (S. P. Timoshenko & J. M. Gere, Mechanics of
//! Materials, "shear deflections"; Roark's Formulas, 8th ed., §8.10 on shear deflection).
//! Integrating, `δ(x) = δ_b(x) + (M(x) − M0)/(G·A_s)`; a pinned end holds δ = 0, a fixed
//! end δ = 0 and θ = 0 (the section does not turn; the deflection's slope is V/(G·A_s)).
//! For the simple span and the cantilever the moments are those of statics and the shear
//! part is the closed form `(M(x) − M0)/(G·A_s)`: w·L²/(8·G·A_s) at midspan of a simple
//! span under a uniform load, P·a·b/(L·G·A_s) under a point load, w·L²/(2·G·A_s) and
//! P·L/(G·A_s) at the tip of a cantilever. For fixed and propped spans the same support
//! conditions also fix the redundant reactions, which then include the shear flexibility.

pub use crate::model::loads::Support;

/// A point load `p` (positive downward) at `a` from x = 0 (for a cantilever, from the fixed end).
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct PointLoad {
    pub p: f64,
    pub a: f64,
}

/// A single-span beam: `udl` per unit length over the whole span (positive downward), point
/// loads, the flexural rigidity `ei` = E·I about the bending axis and, when shear deformation
/// counts, the shear rigidity `shear_rigidity` = G·A_s (`None`: rigid in shear, the
/// Euler–Bernoulli beam).
#[derive(Debug, Clone, PartialEq)]
pub struct Beam {
    pub span: f64,
    pub support: Support,
    pub udl: f64,
    pub points: Vec<PointLoad>,
    pub ei: f64,
    pub shear_rigidity: Option<f64>,
}

/// Peak values (magnitudes, ≥ 0) and where they occur, with the support reactions.
#[derive(Debug, Clone, PartialEq)]
pub struct BeamResult {
    /// Largest |M| and its position.
    pub m_max: f64,
    pub m_max_at: f64,
    /// Largest |V| and its position (a value just beside a point load counts).
    pub v_max: f64,
    pub v_max_at: f64,
    /// Largest |deflection| and its position.
    pub deflection_max: f64,
    pub deflection_at: f64,
    /// (position, upward force) at each support.
    pub reactions: Vec<(f64, f64)>,
    /// (position, bending moment in the beam, sagging positive) at each fixed end; the moment
    /// reaction has the same size.
    pub end_moments: Vec<(f64, f64)>,
}

/// The most samples [`diagrams`] will produce, so a careless request cannot exhaust memory.
pub const MAX_DIAGRAM_SAMPLES: usize = 1_000_000;

/// Grid intervals per load-free stretch of the span for the deflection search.
const GRID_PER_SEGMENT: usize = 64;

/// Shear, moment and deflection of a single-span beam, with their peaks.
///
/// Peaks: |V| and |M| exactly (V is linear and M quadratic between point loads, so they peak
/// at the ends of each stretch or where V = 0); |deflection| at the zeros of the slope found by
/// bisection on a grid of every stretch, at the stretch ends, and by a golden-section search
/// around the largest grid value, which pins the peak to about machine precision.
///
/// `Err` for a span, EI or G·A_s that is not a finite number > 0, a non-finite load, or a
/// point load outside [0, span].
///
/// ```
/// use kern::checks::member::{analyse, Beam, Support};
/// // Simple span, 6 m, 10 kN/m (N and mm): M = wL²/8 = 45 kN·m at midspan.
/// let beam = Beam {
///     span: 6000.0,
///     support: Support::Simple,
///     udl: 10.0,
///     points: vec![],
///     ei: 1e13,
///     shear_rigidity: None,
/// };
/// let r = analyse(&beam).unwrap();
/// assert!((r.m_max - 45e6).abs() < 1e-3 && (r.m_max_at - 3000.0).abs() < 1e-6);
/// ```
pub fn analyse(beam: &Beam) -> Result<BeamResult, String> {
    let sol = Solution::new(beam)?;
    let span = beam.span;
    let mut stations: Vec<f64> = beam.points.iter().map(|pl| pl.a).collect();
    stations.extend([0.0, span]);
    stations.sort_by(f64::total_cmp);
    stations.dedup();

    let mut m = Peak::default();
    let mut v = Peak::default();
    let mut defl = Peak::default();
    let mut grid_best = (0.0, 0.0, span); // (|δ|, bracket start, bracket end)
    for pair in stations.windows(2) {
        let &[s, e] = pair else { continue };
        // Shear: linear between point loads.
        let v_start = sol.shear(s, Side::Right);
        v.consider(s, v_start);
        v.consider(e, sol.shear(e, Side::Left));
        // Moment: a parabola; its vertex is where V = 0.
        m.consider(s, sol.moment(s));
        m.consider(e, sol.moment(e));
        if beam.udl != 0.0 {
            let x = s + v_start / beam.udl;
            if s < x && x < e {
                m.consider(x, sol.moment(x));
            }
        }
        // Deflection: grid, then the slope's zeros by bisection.
        let h = (e - s) / GRID_PER_SEGMENT as f64;
        let mut prev = (s, sol.slope(s));
        defl.consider(s, sol.deflection(s));
        for k in 1..=GRID_PER_SEGMENT {
            let x = if k == GRID_PER_SEGMENT {
                e
            } else {
                s + h * k as f64
            };
            let here = (x, sol.slope(x));
            let d = sol.deflection(x).abs();
            if d > grid_best.0 {
                grid_best = (d, (x - h).max(s), (x + h).min(e));
            }
            if prev.1 * here.1 <= 0.0 {
                let root = bisect(|t| sol.slope(t), prev, here);
                defl.consider(root, sol.deflection(root));
            }
            defl.consider(x, sol.deflection(x));
            prev = here;
        }
    }
    let (_, lo, hi) = grid_best;
    let x = golden_max(|t| sol.deflection(t).abs(), lo, hi);
    defl.consider(x, sol.deflection(x));

    let result = BeamResult {
        m_max: m.value,
        m_max_at: m.at,
        v_max: v.value,
        v_max_at: v.at,
        deflection_max: defl.value,
        deflection_at: defl.at,
        reactions: sol.reactions(),
        end_moments: sol.end_moments(),
    };
    let numbers = [result.m_max, result.v_max, result.deflection_max];
    let pairs = result.reactions.iter().chain(&result.end_moments);
    if numbers.iter().all(|v| v.is_finite()) && pairs.clone().all(|p| p.1.is_finite()) {
        Ok(result)
    } else {
        Err("the loads are too large to give finite results".to_string())
    }
}

/// Diagrams for drawing and reports: `n + 1` equally spaced samples (x, V, M, deflection) from
/// x = 0 to x = span. At a point load V is the value just right of it (at x = span, just left).
/// `Err` as for [`analyse`], and for `n = 0` or `n + 1 >` [`MAX_DIAGRAM_SAMPLES`].
pub fn diagrams(beam: &Beam, n: usize) -> Result<Vec<(f64, f64, f64, f64)>, String> {
    if n == 0 || n >= MAX_DIAGRAM_SAMPLES {
        return Err(format!(
            "the number of diagram intervals must be between 1 and {}",
            MAX_DIAGRAM_SAMPLES - 1
        ));
    }
    let sol = Solution::new(beam)?;
    Ok((0..=n)
        .map(|i| {
            let (x, side) = if i == n {
                (beam.span, Side::Left)
            } else {
                (beam.span * i as f64 / n as f64, Side::Right)
            };
            (x, sol.shear(x, side), sol.moment(x), sol.deflection(x))
        })
        .collect())
}

/// Which side of a point load the shear is taken on.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
enum Side {
    Left,
    Right,
}

/// The largest magnitude seen so far and where; the first of equal values wins, and a NaN
/// sticks so that [`analyse`] can refuse it.
#[derive(Debug, Default)]
struct Peak {
    value: f64,
    at: f64,
}

impl Peak {
    fn consider(&mut self, at: f64, value: f64) {
        if !self.value.is_nan() && (value.is_nan() || value.abs() > self.value) {
            *self = Peak {
                value: value.abs(),
                at,
            };
        }
    }
}

/// The beam with its left-end state: reaction `r0` (upward), bending moment `m0` and
/// rotation `theta0` of the cross-section (of the downward deflection), and the shear
/// flexibility `s` = 1/(G·A_s) (0 without shear deformation). Deflection at x = 0 is zero
/// for every support case.
struct Solution<'a> {
    beam: &'a Beam,
    r0: f64,
    m0: f64,
    theta0: f64,
    s: f64,
}

impl<'a> Solution<'a> {
    /// Validate the beam and fix R0, M0, θ0 from the support conditions. With the load
    /// integrals `Ck = loads(L, k)`, `F(x) = M0·x²/2 + R0·x³/6 − loads(x, 3)` and
    /// `k = EI·s = EI/(G·A_s)` (so that `EI·δ = EI·θ0·x − F + k·(M − M0)`):
    ///
    /// - simple: M0 = 0, M(L) = 0 ⇒ R0 = C1/L; δ(L) = 0 ⇒ θ0 = F(L)/(EI·L)
    /// - cantilever: θ0 = 0, V(L) = 0 ⇒ R0 = wL + ΣP; M(L) = 0 ⇒ M0 = C1 − R0·L
    /// - fixed: θ0 = 0, θ(L) = δ(L) = 0 ⇒ R0 = (6·C2·L − 12·C3 + 12·k·C1)/(L³ + 12·k·L),
    ///   M0 = C2/L − R0·L/2
    /// - propped: θ0 = 0, δ(L) = 0 and M(L) = 0 ⇒
    ///   R0 = (3·C1·L²/2 − 3·C3 + 3·k·C1)/(L³ + 3·k·L), M0 = C1 − R0·L
    ///
    /// With k = 0 these are the Euler–Bernoulli values.
    fn new(beam: &'a Beam) -> Result<Self, String> {
        let span = beam.span;
        if !(span.is_finite() && span > 0.0) {
            return Err(format!("the span must be a finite number > 0, not {span}"));
        }
        if !(beam.ei.is_finite() && beam.ei > 0.0) {
            return Err(format!("EI must be a finite number > 0, not {}", beam.ei));
        }
        let s = match beam.shear_rigidity {
            None => 0.0,
            Some(ga) if ga.is_finite() && ga > 0.0 => 1.0 / ga,
            Some(ga) => {
                return Err(format!(
                    "the shear rigidity G·A_s must be a finite number > 0, not {ga}"
                ))
            }
        };
        if !beam.udl.is_finite() {
            return Err(format!("the uniform load must be finite, not {}", beam.udl));
        }
        for (i, pl) in beam.points.iter().enumerate() {
            if !pl.p.is_finite() {
                return Err(format!(
                    "point load {}: P must be finite, not {}",
                    i + 1,
                    pl.p
                ));
            }
            if !(pl.a >= 0.0 && pl.a <= span) {
                return Err(format!(
                    "point load {}: position a = {} is outside the span 0 to {span}",
                    i + 1,
                    pl.a
                ));
            }
        }
        let mut sol = Solution {
            beam,
            r0: 0.0,
            m0: 0.0,
            theta0: 0.0,
            s,
        };
        let (c1, c2, c3) = (sol.loads(span, 1), sol.loads(span, 2), sol.loads(span, 3));
        let l3 = span * span * span;
        let k = beam.ei * s;
        match beam.support {
            Support::Simple => {
                sol.r0 = c1 / span;
                sol.theta0 = (sol.r0 * l3 / 6.0 - c3) / (beam.ei * span);
            }
            Support::Cantilever => {
                sol.r0 = sol.total_load();
                sol.m0 = c1 - sol.r0 * span;
            }
            Support::Fixed => {
                sol.r0 = (6.0 * c2 * span - 12.0 * c3 + 12.0 * k * c1) / (l3 + 12.0 * k * span);
                sol.m0 = c2 / span - sol.r0 * span / 2.0;
            }
            Support::Propped => {
                sol.r0 = (1.5 * c1 * span * span - 3.0 * c3 + 3.0 * k * c1) / (l3 + 3.0 * k * span);
                sol.m0 = c1 - sol.r0 * span;
            }
        }
        Ok(sol)
    }

    fn total_load(&self) -> f64 {
        self.beam.udl * self.beam.span + self.beam.points.iter().map(|pl| pl.p).sum::<f64>()
    }

    /// `w·x^(k+1)/(k+1)! + Σ P·⟨x − a⟩^k/k!` for k = 1, 2, 3: the k-th integral of the load,
    /// in Macaulay brackets (⟨u⟩ = u for u > 0, else 0).
    fn loads(&self, x: f64, k: i32) -> f64 {
        let fact = |n: i32| (1..=n).product::<i32>() as f64;
        let points: f64 = self
            .beam
            .points
            .iter()
            .filter(|pl| pl.a < x)
            .map(|pl| pl.p * (x - pl.a).powi(k))
            .sum();
        self.beam.udl * x.powi(k + 1) / fact(k + 1) + points / fact(k)
    }

    /// V(x) = R0 − w·x − ΣP over the loads left of x (and at x when `side` is `Right`).
    fn shear(&self, x: f64, side: Side) -> f64 {
        let points: f64 = self
            .beam
            .points
            .iter()
            .filter(|pl| pl.a < x || (side == Side::Right && pl.a == x))
            .map(|pl| pl.p)
            .sum();
        self.r0 - self.beam.udl * x - points
    }

    /// M(x) = M0 + R0·x − loads(x, 1), sagging positive.
    fn moment(&self, x: f64) -> f64 {
        self.m0 + self.r0 * x - self.loads(x, 1)
    }

    /// δ'(x) = θ(x) + s·V(x), with the section's rotation θ(x) = θ0 − (M0·x + R0·x²/2 −
    /// loads(x, 2))/EI and V taken right of a point load (the slope jumps there when s > 0).
    fn slope(&self, x: f64) -> f64 {
        let theta =
            self.theta0 - (self.m0 * x + self.r0 * x * x / 2.0 - self.loads(x, 2)) / self.beam.ei;
        theta + self.s * self.shear(x, Side::Right)
    }

    /// δ(x) = θ0·x − (M0·x²/2 + R0·x³/6 − loads(x, 3))/EI + s·(M(x) − M0), positive
    /// downward.
    fn deflection(&self, x: f64) -> f64 {
        let f = self.m0 * x * x / 2.0 + self.r0 * x * x * x / 6.0 - self.loads(x, 3);
        self.theta0 * x - f / self.beam.ei + self.s * (self.moment(x) - self.m0)
    }

    fn reactions(&self) -> Vec<(f64, f64)> {
        match self.beam.support {
            Support::Cantilever => vec![(0.0, self.r0)],
            _ => vec![
                (0.0, self.r0),
                (self.beam.span, self.total_load() - self.r0),
            ],
        }
    }

    fn end_moments(&self) -> Vec<(f64, f64)> {
        let span = self.beam.span;
        match self.beam.support {
            Support::Simple => Vec::new(),
            Support::Cantilever | Support::Propped => vec![(0.0, self.m0)],
            Support::Fixed => vec![(0.0, self.m0), (span, self.moment(span))],
        }
    }
}

/// A zero of `f` between two points `(x, f(x))` whose values differ in sign (or touch zero),
/// by bisection until the interval stops shrinking.
fn bisect(f: impl Fn(f64) -> f64, lo: (f64, f64), hi: (f64, f64)) -> f64 {
    let (mut lo, mut hi) = (lo, hi);
    if lo.1 == 0.0 {
        return lo.0;
    }
    for _ in 0..200 {
        let mid = 0.5 * (lo.0 + hi.0);
        if mid <= lo.0 || mid >= hi.0 {
            break;
        }
        let fm = f(mid);
        if lo.1 * fm <= 0.0 {
            hi = (mid, fm);
        } else {
            lo = (mid, fm);
        }
    }
    if lo.1.abs() <= hi.1.abs() {
        lo.0
    } else {
        hi.0
    }
}

/// The maximiser of a unimodal `f` on [lo, hi] by golden-section search (Kiefer, 1953; Press
/// et al., Numerical Recipes, "golden section search in one dimension").
fn golden_max(f: impl Fn(f64) -> f64, lo: f64, hi: f64) -> f64 {
    let r = 0.5 * (5f64.sqrt() - 1.0);
    let (mut a, mut b) = (lo, hi);
    let mut c = b - r * (b - a);
    let mut d = a + r * (b - a);
    let (mut fc, mut fd) = (f(c), f(d));
    for _ in 0..200 {
        if b - a <= f64::EPSILON * (a.abs() + b.abs()) {
            break;
        }
        if fc >= fd {
            b = d;
            d = c;
            fd = fc;
            c = b - r * (b - a);
            fc = f(c);
        } else {
            a = c;
            c = d;
            fc = fd;
            d = a + r * (b - a);
            fd = f(d);
        }
    }
    0.5 * (a + b)
}

#[cfg(test)]
mod tests {
    use super::*;

    const L: f64 = 7200.0;
    const EI: f64 = 2.1e5 * 3.6e8; // E = 210 000 N/mm², I = 360e6 mm⁴ (our own garage lintel)
    const W: f64 = 18.5; // N/mm
    const P: f64 = 42_000.0; // N

    fn close(a: f64, b: f64, rel: f64) -> bool {
        (a - b).abs() <= rel * a.abs().max(b.abs()).max(1e-300)
    }

    fn beam(support: Support, udl: f64, points: &[(f64, f64)]) -> Beam {
        Beam {
            span: L,
            support,
            udl,
            points: points.iter().map(|&(p, a)| PointLoad { p, a }).collect(),
            ei: EI,
            shear_rigidity: None,
        }
    }

    /// Bending moment and deflection at x = i·L/n, from the diagram samples.
    fn m_and_delta_at(b: &Beam, i: usize, n: usize) -> (f64, f64) {
        let (_, _, m, delta) = diagrams(b, n).unwrap()[i];
        (m, delta)
    }

    #[test]
    fn simple_span_uniform_load() {
        // AISC Manual Table 3-23 case 1 (numbering from memory); Roark Table 8.1:
        // M = wL²/8 at midspan, V = wL/2 at the ends, δ = 5wL⁴/384EI at midspan.
        let r = analyse(&beam(Support::Simple, W, &[])).unwrap();
        assert!(close(r.m_max, W * L * L / 8.0, 1e-12));
        assert!(close(r.m_max_at, L / 2.0, 1e-12));
        assert!(close(r.v_max, W * L / 2.0, 1e-12));
        assert!(close(
            r.deflection_max,
            5.0 * W * L.powi(4) / (384.0 * EI),
            1e-12
        ));
        assert!(close(r.deflection_at, L / 2.0, 1e-7));
        assert_eq!(r.reactions.len(), 2);
        assert!(close(r.reactions[1].1, W * L / 2.0, 1e-12));
        assert!(r.end_moments.is_empty());
    }

    #[test]
    fn simple_span_central_point_load() {
        // AISC Manual Table 3-23 case 7 (from memory): M = PL/4, V = P/2, δ = PL³/48EI.
        let r = analyse(&beam(Support::Simple, 0.0, &[(P, L / 2.0)])).unwrap();
        assert!(close(r.m_max, P * L / 4.0, 1e-12));
        assert!(close(r.m_max_at, L / 2.0, 1e-12));
        assert!(close(r.v_max, P / 2.0, 1e-12));
        assert!(close(r.deflection_max, P * L.powi(3) / (48.0 * EI), 1e-12));
        assert!(close(r.deflection_at, L / 2.0, 1e-7));
    }

    #[test]
    fn simple_span_eccentric_point_load() {
        // AISC Manual Table 3-23 case 8 (from memory); Gere & Goodno, appendix table of
        // simple-beam deflections: M = Pab/L under the load, V = Pa/L for a > b,
        // δmax = Pb(L² − b²)^{3/2}/(9√3·L·EI) at x = √((L² − b²)/3) from the far support.
        let (a, b) = (5000.0, L - 5000.0);
        let r = analyse(&beam(Support::Simple, 0.0, &[(P, a)])).unwrap();
        assert!(close(r.m_max, P * a * b / L, 1e-12));
        assert!(close(r.m_max_at, a, 1e-12));
        assert!(close(r.v_max, P * a / L, 1e-12));
        let dmax = P * b * (L * L - b * b).powf(1.5) / (9.0 * 3f64.sqrt() * L * EI);
        assert!(close(r.deflection_max, dmax, 1e-12));
        assert!(close(r.deflection_at, ((L * L - b * b) / 3.0).sqrt(), 1e-7));
    }

    #[test]
    fn cantilever_uniform_load_and_end_point_load() {
        // AISC Manual Table 3-23 cases 22 and 24 (from memory); Roark Table 8.1:
        // udl M = wL²/2, V = wL, δ = wL⁴/8EI; end load M = PL, V = P, δ = PL³/3EI; both at
        // the fixed end (moment, shear) and the free end (deflection).
        let r = analyse(&beam(Support::Cantilever, W, &[])).unwrap();
        assert!(close(r.m_max, W * L * L / 2.0, 1e-12));
        assert_eq!(r.m_max_at, 0.0);
        assert!(close(r.v_max, W * L, 1e-12));
        assert!(close(r.deflection_max, W * L.powi(4) / (8.0 * EI), 1e-12));
        assert_eq!(r.deflection_at, L);
        assert_eq!(r.reactions, vec![(0.0, W * L)]);
        assert!(close(r.end_moments[0].1, -W * L * L / 2.0, 1e-12));

        let r = analyse(&beam(Support::Cantilever, 0.0, &[(P, L)])).unwrap();
        assert!(close(r.m_max, P * L, 1e-12));
        assert!(close(r.v_max, P, 1e-12));
        assert!(close(r.deflection_max, P * L.powi(3) / (3.0 * EI), 1e-12));
        assert_eq!(r.deflection_at, L);
    }

    #[test]
    fn fixed_ends_uniform_load() {
        // AISC Manual Table 3-23 case 15 (from memory); Roark Table 8.1:
        // M = wL²/12 at the ends (hogging), wL²/24 at midspan, V = wL/2, δ = wL⁴/384EI.
        let b = beam(Support::Fixed, W, &[]);
        let r = analyse(&b).unwrap();
        assert!(close(r.m_max, W * L * L / 12.0, 1e-12));
        assert!(close(r.v_max, W * L / 2.0, 1e-12));
        assert!(close(r.deflection_max, W * L.powi(4) / (384.0 * EI), 1e-12));
        assert!(close(r.deflection_at, L / 2.0, 1e-7));
        for (_, m) in &r.end_moments {
            assert!(close(*m, -W * L * L / 12.0, 1e-12));
        }
        let (m_mid, _) = m_and_delta_at(&b, 1, 2);
        assert!(close(m_mid, W * L * L / 24.0, 1e-12));
    }

    #[test]
    fn fixed_ends_central_point_load() {
        // AISC Manual Table 3-23 case 16 (from memory): M = PL/8 at the ends and under the
        // load, V = P/2, δ = PL³/192EI.
        let b = beam(Support::Fixed, 0.0, &[(P, L / 2.0)]);
        let r = analyse(&b).unwrap();
        assert!(close(r.m_max, P * L / 8.0, 1e-12));
        assert!(close(r.v_max, P / 2.0, 1e-12));
        assert!(close(r.deflection_max, P * L.powi(3) / (192.0 * EI), 1e-12));
        let (m_mid, _) = m_and_delta_at(&b, 1, 2);
        assert!(close(m_mid, P * L / 8.0, 1e-12));
    }

    #[test]
    fn propped_cantilever_uniform_load() {
        // AISC Manual Table 3-23 case 12 (from memory): R(fixed) = 5wL/8, M = wL²/8 at the
        // fixed end, +9wL²/128 at 3L/8 from the pinned end; δ(x') = wx'(L³ − 3Lx'² + 2x'³)/48EI
        // from the pinned end, largest at x' = L(1 + √33)/16 = 0.4215L, about wL⁴/185EI.
        let b = beam(Support::Propped, W, &[]);
        let r = analyse(&b).unwrap();
        assert!(close(r.m_max, W * L * L / 8.0, 1e-12));
        assert_eq!(r.m_max_at, 0.0);
        assert!(close(r.v_max, 5.0 * W * L / 8.0, 1e-12));
        assert!(close(r.reactions[0].1, 5.0 * W * L / 8.0, 1e-12));
        assert!(close(r.reactions[1].1, 3.0 * W * L / 8.0, 1e-12));
        let (m, _) = m_and_delta_at(&b, 5, 8);
        assert!(close(m, 9.0 * W * L * L / 128.0, 1e-12));
        let xi = (1.0 + 33f64.sqrt()) / 16.0;
        let dmax = W * L.powi(4) * xi * (1.0 - 3.0 * xi * xi + 2.0 * xi.powi(3)) / (48.0 * EI);
        assert!(close(r.deflection_max, dmax, 1e-12));
        assert!(close(r.deflection_at, L * (1.0 - xi), 1e-7));
        assert!(close(r.deflection_max, W * L.powi(4) / (185.0 * EI), 3e-3));
    }

    #[test]
    fn propped_cantilever_central_point_load() {
        // AISC Manual Table 3-23 case 13 (from memory): M = 3PL/16 at the fixed end, 5PL/32
        // under the load, V = 11P/16, δmax = PL³/(48√5·EI) at 0.447L (= L/√5) from the
        // pinned end.
        let b = beam(Support::Propped, 0.0, &[(P, L / 2.0)]);
        let r = analyse(&b).unwrap();
        assert!(close(r.m_max, 3.0 * P * L / 16.0, 1e-12));
        assert_eq!(r.m_max_at, 0.0);
        assert!(close(r.v_max, 11.0 * P / 16.0, 1e-12));
        let (m, _) = m_and_delta_at(&b, 1, 2);
        assert!(close(m, 5.0 * P * L / 32.0, 1e-12));
        let dmax = P * L.powi(3) / (48.0 * 5f64.sqrt() * EI);
        assert!(close(r.deflection_max, dmax, 1e-12));
        assert!(close(r.deflection_at, L - L / 5f64.sqrt(), 1e-7));
    }

    #[test]
    fn superposition_simple_span_against_published_formulas() {
        // Simple span, udl plus two point loads (a mezzanine trimmer of our own): M and δ at
        // chosen points are the sums of AISC Table 3-23 cases 1 and 8 (from memory):
        // udl M = wx(L − x)/2, δ = wx(L³ − 2Lx² + x³)/24EI; point load P at a (b = L − a),
        // for x ≤ a: M = Pbx/L, δ = Pbx(L² − b² − x²)/6EIL (mirror for x > a).
        let loads = [(P, 1800.0), (0.6 * P, 5400.0)];
        let b = beam(Support::Simple, W, &loads);
        let samples = diagrams(&b, 8).unwrap();
        for &(x, _, m, delta) in &samples {
            let mut m_ref = W * x * (L - x) / 2.0;
            let mut d_ref = W * x * (L.powi(3) - 2.0 * L * x * x + x.powi(3)) / (24.0 * EI);
            for (p, a) in loads {
                // Mirror so that the section lies on the short side of the formula.
                let (xs, bs) = if x <= a { (x, L - a) } else { (L - x, a) };
                m_ref += p * bs * xs / L;
                d_ref += p * bs * xs * (L * L - bs * bs - xs * xs) / (6.0 * EI * L);
            }
            assert!(close(m, m_ref, 1e-12), "M at {x}");
            assert!(
                (delta - d_ref).abs() <= 1e-12 * d_ref.abs().max(1.0),
                "δ at {x}"
            );
        }
    }

    #[test]
    fn superposition_fixed_propped_cantilever() {
        // udl plus two point loads; end values are sums of the separate published cases:
        // fixed ends (Roark Table 8.1; AISC case 18, numbering from memory):
        //   M(0) = −(wL²/12 + ΣPab²/L²), M(L) = −(wL²/12 + ΣPa²b/L²);
        // propped (AISC case 14 from memory, a' from the pinned end, b' = L − a'):
        //   M(0) = −(wL²/8 + ΣPa'b'(a' + L)/2L²);
        // cantilever (Roark Table 8.1; AISC cases 22, 23 from memory): M(0) = −(wL²/2 + ΣPa),
        //   δ(L) = wL⁴/8EI + ΣPa²(3L − a)/6EI.
        let loads = [(P, 1500.0), (0.4 * P, 4700.0)];
        let r = analyse(&beam(Support::Fixed, W, &loads)).unwrap();
        let mut left = W * L * L / 12.0;
        let mut right = W * L * L / 12.0;
        for (p, a) in loads {
            let b = L - a;
            left += p * a * b * b / (L * L);
            right += p * a * a * b / (L * L);
        }
        assert!(close(r.end_moments[0].1, -left, 1e-12));
        assert!(close(r.end_moments[1].1, -right, 1e-12));

        let r = analyse(&beam(Support::Propped, W, &loads)).unwrap();
        let mut fixed_end = W * L * L / 8.0;
        for (p, a) in loads {
            let (ap, bp) = (L - a, a);
            fixed_end += p * ap * bp * (ap + L) / (2.0 * L * L);
        }
        assert!(close(r.end_moments[0].1, -fixed_end, 1e-12));

        let r = analyse(&beam(Support::Cantilever, W, &loads)).unwrap();
        let mut m0 = W * L * L / 2.0;
        let mut tip = W * L.powi(4) / (8.0 * EI);
        for (p, a) in loads {
            m0 += p * a;
            tip += p * a * a * (3.0 * L - a) / (6.0 * EI);
        }
        assert!(close(r.end_moments[0].1, -m0, 1e-12));
        assert!(close(r.m_max, m0, 1e-12));
        assert!(close(r.deflection_max, tip, 1e-12));
    }

    #[test]
    fn superposition_of_separate_runs() {
        // Linear elasticity: the combined case is the sum of the separate ones (Gere & Goodno,
        // "method of superposition"), at every diagram sample and for every support.
        let loads = [(P, 2000.0), (-0.3 * P, 6100.0)];
        for support in [
            Support::Simple,
            Support::Cantilever,
            Support::Fixed,
            Support::Propped,
        ] {
            let all = diagrams(&beam(support, W, &loads), 36).unwrap();
            let parts = [
                diagrams(&beam(support, W, &[]), 36).unwrap(),
                diagrams(&beam(support, 0.0, &loads[..1]), 36).unwrap(),
                diagrams(&beam(support, 0.0, &loads[1..]), 36).unwrap(),
            ];
            let scale = all.iter().fold((0.0f64, 0.0f64, 0.0f64), |s, r| {
                (s.0.max(r.1.abs()), s.1.max(r.2.abs()), s.2.max(r.3.abs()))
            });
            for (i, row) in all.iter().enumerate() {
                let sum = parts.iter().fold((0.0, 0.0, 0.0), |s, p| {
                    (s.0 + p[i].1, s.1 + p[i].2, s.2 + p[i].3)
                });
                assert!((row.1 - sum.0).abs() <= 1e-12 * scale.0, "{support:?} V");
                assert!((row.2 - sum.1).abs() <= 1e-12 * scale.1, "{support:?} M");
                assert!((row.3 - sum.2).abs() <= 1e-12 * scale.2, "{support:?} δ");
            }
        }
    }

    #[test]
    fn point_loads_over_supports_and_bad_input() {
        // A load straight over a support goes into the reaction: no shear, moment or deflection
        // (statics).
        let r = analyse(&beam(Support::Simple, 0.0, &[(P, 0.0), (P, L)])).unwrap();
        assert_eq!((r.m_max, r.v_max), (0.0, 0.0));
        assert!(r.deflection_max < 1e-12);
        assert_eq!(r.reactions, vec![(0.0, P), (L, P)]);
        let r = analyse(&beam(Support::Fixed, 0.0, &[])).unwrap();
        assert_eq!((r.m_max, r.v_max, r.deflection_max), (0.0, 0.0, 0.0));

        let mut b = beam(Support::Simple, W, &[(P, L + 1.0)]);
        assert!(analyse(&b).is_err());
        b.points[0].a = f64::NAN;
        assert!(analyse(&b).is_err());
        b.points.clear();
        for bad in [0.0, -1.0, f64::INFINITY, f64::NAN] {
            assert!(analyse(&Beam {
                span: bad,
                ..b.clone()
            })
            .is_err());
            assert!(analyse(&Beam {
                ei: bad,
                ..b.clone()
            })
            .is_err());
        }
        assert!(analyse(&Beam {
            udl: f64::NAN,
            ..b.clone()
        })
        .is_err());
        assert!(analyse(&Beam {
            udl: 1e300,
            ..b.clone()
        })
        .is_err());
        assert!(diagrams(&b, 0).is_err());
        assert!(diagrams(&b, usize::MAX).is_err());
        assert_eq!(diagrams(&b, 4).unwrap().len(), 5);
    }

    /// The same beam with shear rigidity G·A_s.
    fn with_shear(mut b: Beam, ga: f64) -> Beam {
        b.shear_rigidity = Some(ga);
        b
    }

    // G·A_s of our own short deep lintel: G = 81 GPa, A_s = 5/6 of a 200 × 600 mm rectangle.
    const GA: f64 = 81_000.0 * 100_000.0;

    #[test]
    fn shear_deflection_statically_determinate() {
        // Timoshenko & Gere, Mechanics of Materials, shear deflections; Roark's Formulas §8.10:
        // simple span udl δs = wL²/8GA at midspan, point load P at a: δs = Pab/(L·GA) under
        // it; cantilever udl δs = wL²/2GA and end load δs = PL/GA at the tip. The moments
        // do not change (statics).
        let b = beam(Support::Simple, W, &[]);
        let (r0, r) = (analyse(&b).unwrap(), analyse(&with_shear(b, GA)).unwrap());
        let eb = 5.0 * W * L.powi(4) / (384.0 * EI);
        assert!(close(r.deflection_max, eb + W * L * L / (8.0 * GA), 1e-12));
        assert!(close(r.deflection_at, L / 2.0, 1e-7));
        assert_eq!((r.m_max, r.v_max), (r0.m_max, r0.v_max));

        let (a, bb) = (L / 2.0, L / 2.0);
        let b = beam(Support::Simple, 0.0, &[(P, a)]);
        let r = analyse(&with_shear(b, GA)).unwrap();
        let expect = P * L.powi(3) / (48.0 * EI) + P * a * bb / (L * GA);
        assert!(close(r.deflection_max, expect, 1e-12));
        assert!(close(r.deflection_at, L / 2.0, 1e-7));

        let r = analyse(&with_shear(beam(Support::Cantilever, W, &[]), GA)).unwrap();
        let expect = W * L.powi(4) / (8.0 * EI) + W * L * L / (2.0 * GA);
        assert!(close(r.deflection_max, expect, 1e-12));
        assert_eq!(r.deflection_at, L);

        let r = analyse(&with_shear(beam(Support::Cantilever, 0.0, &[(P, L)]), GA)).unwrap();
        let expect = P * L.powi(3) / (3.0 * EI) + P * L / GA;
        assert!(close(r.deflection_max, expect, 1e-12));
    }

    #[test]
    fn shear_deflection_fixed_and_propped() {
        // Fixed ends, symmetric loads: the end moments stay wL²/12 and PL/8 (symmetry), and
        // δs = (M(L/2) − M(0))/GA = wL²/8GA and PL/4GA at midspan (Timoshenko & Gere).
        let r = analyse(&with_shear(beam(Support::Fixed, W, &[]), GA)).unwrap();
        let expect = W * L.powi(4) / (384.0 * EI) + W * L * L / (8.0 * GA);
        assert!(close(r.deflection_max, expect, 1e-12));
        assert!(close(r.m_max, W * L * L / 12.0, 1e-12));
        let r = analyse(&with_shear(beam(Support::Fixed, 0.0, &[(P, L / 2.0)]), GA)).unwrap();
        let expect = P * L.powi(3) / (192.0 * EI) + P * L / (4.0 * GA);
        assert!(close(r.deflection_max, expect, 1e-12));
        assert!(close(r.m_max, P * L / 8.0, 1e-12));

        // Propped cantilever under a udl, by compatibility at the prop (Roark Table 8.1 with
        // §8.10): the cantilever's tip deflection wL⁴/8EI + wL²/2GA is taken back by the prop
        // force R: R·(L³/3EI + L/GA). Our own short span so that shear matters.
        let span = 1800.0;
        let b = Beam {
            span,
            ..with_shear(beam(Support::Propped, W, &[]), GA)
        };
        let r = analyse(&b).unwrap();
        let prop = (W * span.powi(4) / (8.0 * EI) + W * span * span / (2.0 * GA))
            / (span.powi(3) / (3.0 * EI) + span / GA);
        assert!(close(r.reactions[1].1, prop, 1e-12));
        assert!(close(r.reactions[0].1, W * span - prop, 1e-12));
        // A point load P at a on the fixed-ended beam: the fixed end's reaction by the same
        // compatibility, checked through equilibrium of the two reactions.
        let b = with_shear(beam(Support::Fixed, 0.0, &[(P, 2000.0)]), GA);
        let r = analyse(&b).unwrap();
        assert!(close(r.reactions[0].1 + r.reactions[1].1, P, 1e-12));
        // The deflection is zero at both ends and larger than without shear.
        let d = diagrams(&b, 10).unwrap();
        assert!(d[0].3.abs() < 1e-9 && d[10].3.abs() < 1e-9);
        let eb = analyse(&beam(Support::Fixed, 0.0, &[(P, 2000.0)])).unwrap();
        assert!(r.deflection_max > eb.deflection_max);
        // A shear rigidity that is not a finite number > 0 is refused.
        for bad in [0.0, -1.0, f64::NAN, f64::INFINITY] {
            assert!(analyse(&with_shear(beam(Support::Simple, W, &[]), bad)).is_err());
        }
    }

    proptest::proptest! {
        #[test]
        fn never_panics_and_peaks_bound_the_diagrams(
            span in proptest::prop_oneof![proptest::num::f64::ANY, 1.0f64..2e4],
            udl in -1e3f64..1e3,
            loads in proptest::collection::vec((-1e5f64..1e5, -0.1f64..1.1), 0..5),
            kind in 0usize..4,
        ) {
            let support = [Support::Simple, Support::Cantilever, Support::Fixed, Support::Propped][kind];
            let b = Beam {
                span,
                support,
                udl,
                points: loads.iter().map(|&(p, f)| PointLoad { p, a: f * span }).collect(),
                ei: 1e12,
                shear_rigidity: None,
            };
            if let Ok(r) = analyse(&b) {
                // The peaks found are at least as large as any diagram sample (and not much
                // larger than the finest grid suggests).
                for (_, v, m, d) in diagrams(&b, 200).unwrap() {
                    proptest::prop_assert!(v.abs() <= r.v_max * (1.0 + 1e-12) + 1e-9);
                    proptest::prop_assert!(m.abs() <= r.m_max * (1.0 + 1e-12) + 1e-9);
                    proptest::prop_assert!(d.abs() <= r.deflection_max * (1.0 + 1e-12) + 1e-18);
                }
            }
        }
    }
}
