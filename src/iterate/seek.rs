//! Seeking the value of a param for which a result reaches a target: sample the
//! param's range for a change of sign of `result − target`, then Brent's method
//! ([`super::roots::brent`]) to a relative [`REL_TOL`] of the target.
//!
//! The range: `A..B` when given (sampled at [`SAMPLES`] + 1 evenly spaced values);
//! otherwise the param's valid range found from its current value `x0 > 0` by
//! doubling and halving (`x0·2^k`, `x0/2^k`, k up to [`DOUBLINGS`]), in each direction
//! until the file stops computing there (a dimension that would not be positive, a
//! part that no longer fits) — so the root nearest the current value, on a
//! logarithmic scale, is the one found. Two roots closer together than one step
//! of the samples can be missed; a result that jumps across the target is refused.

use super::roots::{brent, first_bracket, Found, Sample};
use super::vary::{read, Failure, Probe};
use crate::analysis::Analysis;
use crate::report::rows::Quantity;

/// The target is reached to this fraction of its magnitude (FORMAT.md asks 1e-9; the
/// margin covers the last rounding of the result).
pub const REL_TOL: f64 = 1e-10;
/// Intervals sampled over a given range.
pub const SAMPLES: usize = 16;
/// Doublings (and halvings) tried from the current value: a factor of about 1e12
/// each way.
pub const DOUBLINGS: i32 = 40;

/// Where to look.
#[derive(Debug, Clone, Copy, PartialEq)]
pub enum Range {
    /// Between two values, inclusive.
    Within(f64, f64),
    /// Out from the current value, over the positive values that compute.
    FromCurrent,
}

/// The results seen while searching: the least and greatest, each with its param value.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct Reach {
    pub least: (f64, f64),
    pub greatest: (f64, f64),
    /// The param values tried ran from `span.0` to `span.1`.
    pub span: (f64, f64),
}

/// A solution: the param's value, the result there, and the whole analysis there
/// with the probe's own options.
#[derive(Debug, Clone)]
pub struct Solved {
    pub value: f64,
    pub result: f64,
    pub analysis: Analysis,
    pub evaluations: usize,
}

/// Why there is no solution.
#[derive(Debug, Clone, PartialEq)]
pub enum SeekError {
    /// `result − target` keeps one sign over every value tried.
    NoRoot(Reach),
    /// The result crosses the target with a jump at this value (result there).
    Jump { value: f64, result: f64 },
    /// The range is not usable (empty, reversed, or the current value is not positive).
    BadRange(String),
    /// The file gives no result at the starting value.
    Start(Failure),
    /// A value inside the bracket failed.
    Inside { value: f64, failure: Failure },
}

/// The value of the probe's param for which `q` equals `target`, searched over `range`.
pub fn seek(probe: &Probe, q: &Quantity, target: f64, range: Range) -> Result<Solved, SeekError> {
    let mut evaluations = 0;
    let mut samples: Vec<(f64, f64)> = Vec::new();
    let mut eval = |x: f64| -> Option<f64> {
        evaluations += 1;
        let r = probe.result(q, x).ok()?;
        samples.push((x, r));
        Some(r - target)
    };
    let bracket = match range {
        Range::Within(a, b) => {
            if !(a.is_finite() && b.is_finite() && a < b) {
                return Err(SeekError::BadRange(format!(
                    "the range {a}..{b} must run from a lower to a higher finite value"
                )));
            }
            let s: Vec<Sample> = (0..=SAMPLES)
                .map(|i| {
                    let x = a + (b - a) * i as f64 / SAMPLES as f64;
                    (x, eval(x))
                })
                .collect();
            first_bracket(&s)
        }
        Range::FromCurrent => {
            let x0 = probe.current;
            if !(x0.is_finite() && x0 > 0.0) {
                return Err(SeekError::BadRange(format!(
                    "`{}` is {x0} now; the search goes out from a positive value, so give a \
                     range with --within A..B",
                    probe.name()
                )));
            }
            let g0 = eval(x0);
            if g0.is_none() {
                let f = probe
                    .result(q, x0)
                    .err()
                    .unwrap_or(Failure::NoResult(q.path.into()));
                return Err(SeekError::Start(f));
            }
            let mut last = [(x0, g0), (x0, g0)];
            let mut alive = [true, true];
            let mut found = None;
            'out: for k in 1..=DOUBLINGS {
                for (dir, factor) in [2f64, 0.5].into_iter().enumerate() {
                    if !alive[dir] {
                        continue;
                    }
                    let x = x0 * factor.powi(k);
                    let gx = eval(x);
                    alive[dir] = gx.is_some();
                    let pair = [last[dir], (x, gx)];
                    last[dir] = (x, gx);
                    if let Some(b) = first_bracket(&pair) {
                        found = Some(b);
                        break 'out;
                    }
                }
                if !alive[0] && !alive[1] {
                    break;
                }
            }
            found
        }
    };
    let Some((a, ga, b, gb)) = bracket else {
        return Err(match reach(&samples) {
            Some(r) => SeekError::NoRoot(r),
            None => SeekError::Start(
                probe
                    .result(q, probe.current)
                    .err()
                    .unwrap_or(Failure::NoResult(q.path.into())),
            ),
        });
    };
    let gtol = REL_TOL * target.abs().max(f64::MIN_POSITIVE);
    let found = brent(&mut eval, (a, ga), (b, gb), gtol);
    match found {
        Found::Root { x, g } => {
            let analysis = probe
                .analyse(x)
                .map_err(|failure| SeekError::Inside { value: x, failure })?;
            Ok(Solved {
                value: x,
                result: read(q, &analysis).unwrap_or(target + g),
                analysis,
                evaluations,
            })
        }
        Found::Jump { x, g } => Err(SeekError::Jump {
            value: x,
            result: target + g,
        }),
        Found::Failed { x } => Err(SeekError::Inside {
            value: x,
            failure: probe
                .result(q, x)
                .err()
                .unwrap_or(Failure::NoResult(q.path.into())),
        }),
    }
}

/// The least and greatest results among `samples`, and the span of values tried.
fn reach(samples: &[(f64, f64)]) -> Option<Reach> {
    let first = *samples.first()?;
    let mut r = Reach {
        least: first,
        greatest: first,
        span: (first.0, first.0),
    };
    for &(x, v) in samples {
        if v < r.least.1 {
            r.least = (x, v);
        }
        if v > r.greatest.1 {
            r.greatest = (x, v);
        }
        r.span = (r.span.0.min(x), r.span.1.max(x));
    }
    Some(r)
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::analysis::Options;
    use crate::iterate::vary::result_key;

    const PLATE: &str = "format = 1\nunits = \"mm\"\n[params]\nh = 200\n[[parts]]\nshape = \"rect\"\nb = 100\nh = \"h\"\n";

    #[test]
    fn seeks_the_depth_of_a_rectangle_for_an_inertia() {
        let d = crate::file::parse(PLATE).unwrap();
        let p = Probe::new(&d, "h", &Options::default()).unwrap();
        let q = result_key("inertia.xx").unwrap();
        // Ixx = b·h³/12 (Gere & Goodno, App. E case 1), so h = (12·I/b)^(1/3).
        let target = 8e8;
        let s = seek(&p, q, target, Range::FromCurrent).unwrap();
        let want = (12.0 * target / 100.0_f64).cbrt();
        assert!(
            (s.value - want).abs() <= 1e-9 * want,
            "{} vs {want}",
            s.value
        );
        assert!((s.result - target).abs() <= 1e-9 * target);
        let s = seek(&p, q, target, Range::Within(100.0, 1000.0)).unwrap();
        assert!((s.value - want).abs() <= 1e-9 * want);
    }

    #[test]
    fn no_root_says_what_the_result_reaches() {
        let d = crate::file::parse(PLATE).unwrap();
        let p = Probe::new(&d, "h", &Options::default()).unwrap();
        let q = result_key("inertia.xx").unwrap();
        let Err(SeekError::NoRoot(r)) = seek(&p, q, 1e12, Range::Within(100.0, 300.0)) else {
            panic!("a root where there is none")
        };
        // b·h³/12 at h = 100 and 300.
        assert!((r.least.1 - 100.0 * 1e6 / 12.0).abs() < 1e-3);
        assert!((r.greatest.1 - 100.0 * 2.7e7 / 12.0).abs() < 1e-3);
        // Depth ≤ 0 does not compute, so the search below stops there: negative
        // target is out of reach.
        assert!(matches!(
            seek(&p, q, -5.0, Range::FromCurrent),
            Err(SeekError::NoRoot(_))
        ));
        assert!(matches!(
            seek(&p, q, 1.0, Range::Within(3.0, 1.0)),
            Err(SeekError::BadRange(_))
        ));
    }
}
