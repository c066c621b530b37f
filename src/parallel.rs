//! One parallel map for every batch (files in `kern calc`, values in a sweep, params
//! in the sensitivities): scoped threads on every core (or `KERN_JOBS` of them), results in input order, a
//! panic caught per item. It names nothing of the crate, so every layer may use it.

use std::panic::{catch_unwind, AssertUnwindSafe};
use std::sync::atomic::{AtomicUsize, Ordering};

/// The most worker threads `KERN_JOBS` may ask for.
const MAX_JOBS: usize = 256;

/// Worker threads for a batch: `KERN_JOBS` when it is a whole number from 1 to
/// [`MAX_JOBS`], else every core this process may run on.
fn jobs() -> usize {
    std::env::var("KERN_JOBS")
        .ok()
        .and_then(|s| s.trim().parse::<usize>().ok())
        .filter(|n| (1..=MAX_JOBS).contains(n))
        .unwrap_or_else(|| std::thread::available_parallelism().map_or(1, |n| n.get()))
}

/// Runs `f` over `items` on [`jobs`] threads, keeping the input order of the results.
/// A panic in `f` is caught for its item alone: that slot holds the panic's message.
pub fn parallel_map<T: Sync, R: Send>(
    items: &[T],
    f: impl Fn(&T) -> R + Sync,
) -> Vec<Result<R, String>> {
    // One item needs no thread count (that reads the environment and the cgroup files).
    let workers = if items.len() <= 1 {
        1
    } else {
        jobs().min(items.len())
    };
    let next = AtomicUsize::new(0);
    let mut slots: Vec<Option<Result<R, String>>> = Vec::new();
    slots.resize_with(items.len(), || None);
    let run = || {
        let mut mine = Vec::new();
        loop {
            let i = next.fetch_add(1, Ordering::Relaxed);
            let Some(item) = items.get(i) else { break };
            let r = catch_unwind(AssertUnwindSafe(|| f(item)));
            mine.push((i, r.map_err(|p| panic_message(p.as_ref()))));
        }
        mine
    };
    let done: Vec<Vec<(usize, Result<R, String>)>> = if workers <= 1 {
        // One worker: no thread to start (a short batch stays cheap).
        vec![run()]
    } else {
        std::thread::scope(|s| {
            let handles: Vec<_> = (0..workers).map(|_| s.spawn(run)).collect();
            // Every panic is caught above, so a worker always returns its results.
            handles.into_iter().filter_map(|h| h.join().ok()).collect()
        })
    };
    for (i, r) in done.into_iter().flatten() {
        slots[i] = Some(r);
    }
    slots
        .into_iter()
        .map(|s| s.unwrap_or_else(|| Err("the worker thread stopped".into())))
        .collect()
}

/// The text of a panic's payload.
fn panic_message(payload: &(dyn std::any::Any + Send)) -> String {
    payload
        .downcast_ref::<&str>()
        .map(|s| s.to_string())
        .or_else(|| payload.downcast_ref::<String>().cloned())
        .unwrap_or_else(|| "a panic".into())
}

#[cfg(test)]
mod tests {
    use super::*;

    /// A panic on one item is that item's error alone: every other result keeps its place.
    #[test]
    fn a_panicking_item_keeps_every_result_in_place() {
        let items: Vec<usize> = (0..40).collect();
        let r = parallel_map(&items, |&i| {
            if i == 2 || i == 17 {
                panic!("injected on item {i}");
            }
            i * 10
        });
        assert_eq!(r.len(), items.len());
        for (i, x) in r.iter().enumerate() {
            match x {
                Ok(v) => assert_eq!(*v, i * 10),
                Err(m) => {
                    assert!(i == 2 || i == 17, "item {i} failed: {m}");
                    assert_eq!(m, &format!("injected on item {i}"));
                }
            }
        }
        assert_eq!(r.iter().filter(|x| x.is_err()).count(), 2);
    }
}
