//! A sweep: the section analysed at evenly spaced values of one param, in parallel
//! over the values ([`crate::parallel::parallel_map`]), results in order.

use super::vary::{Failure, Probe};
use crate::analysis::Analysis;
use crate::parallel::parallel_map;
use std::sync::atomic::{AtomicUsize, Ordering};

/// Most values a sweep takes (each is a whole analysis).
pub const MAX_STEPS: usize = 10_000;

/// `steps` values evenly spaced from `from` to `to`, both included (FORMAT.md: N ≥ 2).
pub fn values(from: f64, to: f64, steps: usize) -> Result<Vec<f64>, String> {
    if !(from.is_finite() && to.is_finite()) {
        return Err("--from and --to must be finite numbers".into());
    }
    if !(2..=MAX_STEPS).contains(&steps) {
        return Err(format!(
            "--steps must be from 2 to {MAX_STEPS} (the values include both ends)"
        ));
    }
    let n = (steps - 1) as f64;
    Ok((0..steps)
        .map(|i| match i {
            0 => from,
            _ if i == steps - 1 => to,
            _ => from + (to - from) * (i as f64 / n),
        })
        .collect())
}

/// One value of a sweep and what the section gives there.
#[derive(Debug, Clone)]
pub struct Point {
    pub value: f64,
    pub outcome: Result<Analysis, Failure>,
}

/// The probe's section at each of `values`, with the probe's options, in order.
pub fn sweep(probe: &Probe, values: &[f64]) -> Vec<Point> {
    sweep_counting(probe, values, &AtomicUsize::new(0))
}

/// [`sweep`], counting in `done` the values analysed so far (for a progress line
/// while it runs on another thread).
pub fn sweep_counting(probe: &Probe, values: &[f64], done: &AtomicUsize) -> Vec<Point> {
    parallel_map(values, |&x| {
        let r = probe.analyse(x);
        done.fetch_add(1, Ordering::Relaxed);
        r
    })
    .into_iter()
    .zip(values)
    .map(|(r, &value)| Point {
        value,
        outcome: r.unwrap_or_else(|panic| Err(Failure::Internal(panic))),
    })
    .collect()
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn values_include_both_ends_and_are_even() {
        assert_eq!(values(1.0, 2.0, 3).unwrap(), vec![1.0, 1.5, 2.0]);
        assert_eq!(values(0.1, 0.3, 2).unwrap(), vec![0.1, 0.3]);
        assert!(values(0.0, 1.0, 1).is_err());
        assert!(values(0.0, f64::INFINITY, 5).is_err());
    }
}
