//! One parallel map for every batch (files in `kern calc`, values in a sweep, params
//! in the sensitivities): scoped threads on every core (or `KERN_JOBS` of them), results in input order, a
//! panic caught per item. It names nothing of the crate, so every layer may use it.

use std::collections::VecDeque;
use std::panic::{catch_unwind, AssertUnwindSafe};
use std::sync::{Condvar, Mutex, MutexGuard, PoisonError};

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

/// How many results may be computed ahead of the one [`parallel_for_each`] hands on
/// next (waiting for their turn, or in work): what a huge batch keeps in memory at once.
pub const WINDOW: usize = 64;

/// Runs `f` over `items` on [`jobs`] threads, keeping the input order of the results.
/// A panic in `f` is caught for its item alone: that slot holds the panic's message.
pub fn parallel_map<T: Sync, R: Send>(
    items: &[T],
    f: impl Fn(&T) -> R + Sync,
) -> Vec<Result<R, String>> {
    let mut out = Vec::with_capacity(items.len());
    parallel_for_each(items, f, |_, r| {
        out.push(r);
        true
    });
    out
}

/// Runs `f` over `items` on [`jobs`] threads and hands each result to `take` on the
/// calling thread, in input order, as soon as it and every one before it are done (so
/// `take` may write to a locked stdout). The calling thread is one of the workers: it
/// hands on what is ready and computes an item when nothing is, so `n` jobs are `n`
/// threads in all (no extra thread waking between the workers on a machine of `n`
/// cores). At most [`WINDOW`] items are computed ahead of the one `take` gets next.
/// `take` returns `false` to stop: no item is started after that. A panic in `f` is
/// caught for its item alone: `take` gets its message.
pub fn parallel_for_each<T: Sync, R: Send>(
    items: &[T],
    f: impl Fn(&T) -> R + Sync,
    mut take: impl FnMut(usize, Result<R, String>) -> bool,
) {
    let one = |item: &T| {
        catch_unwind(AssertUnwindSafe(|| f(item))).map_err(|p| panic_message(p.as_ref()))
    };
    // One item needs no thread count (that reads the environment and the cgroup files).
    let workers = if items.len() <= 1 {
        1
    } else {
        jobs().min(items.len())
    };
    if workers <= 1 {
        // One worker: no thread to start (a short batch stays cheap).
        for (i, item) in items.iter().enumerate() {
            if !take(i, one(item)) {
                return;
            }
        }
        return;
    }
    let queue = Queue {
        state: Mutex::new(State {
            waiting: VecDeque::new(),
            taken: 0,
            started: 0,
            stop: false,
            waiting_for_room: 0,
            waiting_for_done: false,
        }),
        room: Condvar::new(),
        done: Condvar::new(),
    };
    std::thread::scope(|s| {
        for _ in 1..workers {
            s.spawn(|| {
                while let Some(i) = queue.start(items.len()) {
                    queue.finish(i, one(&items[i]));
                }
            });
        }
        loop {
            match queue.next_or_start(items.len()) {
                Step::Take(i, r) => {
                    if !take(i, r) {
                        queue.stop();
                        break;
                    }
                }
                Step::Work(i) => queue.finish(i, one(&items[i])),
                Step::Done => break,
            }
        }
    });
}

/// What the calling thread of a [`parallel_for_each`] does next.
enum Step<R> {
    /// Hand on item `i`'s result.
    Take(usize, Result<R, String>),
    /// Compute item `i`.
    Work(usize),
    /// Every result is handed on.
    Done,
}

/// The items of a [`parallel_for_each`] between the one taken next and the last one
/// started, with what the threads wait on. A condition is signalled only when a thread
/// waits on it (a signal is a system call even when nobody waits).
struct Queue<R> {
    state: Mutex<State<R>>,
    /// Signalled when an item may be started (a result taken) or the run stops.
    room: Condvar,
    /// Signalled when the result to take next is done.
    done: Condvar,
}

struct State<R> {
    /// The results of items `taken..started`, `None` while in work.
    waiting: VecDeque<Option<Result<R, String>>>,
    taken: usize,
    started: usize,
    stop: bool,
    /// Workers waiting on `room`.
    waiting_for_room: usize,
    /// Whether the calling thread waits on `done`.
    waiting_for_done: bool,
}

impl<R> State<R> {
    /// Starts the next of `len` items when the run goes on and the window has room.
    fn begin(&mut self, len: usize) -> Option<usize> {
        if self.stop || self.started >= len || self.started - self.taken >= WINDOW {
            return None;
        }
        let i = self.started;
        self.started += 1;
        self.waiting.push_back(None);
        Some(i)
    }
}

impl<R> Queue<R> {
    /// The state; a poisoned lock is taken as it is (nothing panics while holding it).
    fn lock(&self) -> MutexGuard<'_, State<R>> {
        self.state.lock().unwrap_or_else(PoisonError::into_inner)
    }

    /// The next of `len` items for a worker to compute, once the window has room;
    /// `None` when every item is started or the run stops.
    fn start(&self, len: usize) -> Option<usize> {
        let mut st = self.lock();
        loop {
            if st.stop || st.started >= len {
                return None;
            }
            if let Some(i) = st.begin(len) {
                return Some(i);
            }
            st.waiting_for_room += 1;
            st = self.room.wait(st).unwrap_or_else(PoisonError::into_inner);
            st.waiting_for_room -= 1;
        }
    }

    /// Item `i` is done with `r`.
    fn finish(&self, i: usize, r: Result<R, String>) {
        let mut st = self.lock();
        let at = i - st.taken;
        st.waiting[at] = Some(r);
        if at == 0 && st.waiting_for_done {
            self.done.notify_one();
        }
    }

    /// For the calling thread: the next result in input order if it is done, else the
    /// next item to compute if the window has room, else it waits for either; `Done`
    /// after the last of `len` results.
    fn next_or_start(&self, len: usize) -> Step<R> {
        let mut st = self.lock();
        loop {
            if st.taken >= len {
                return Step::Done;
            }
            if let Some(Some(_)) = st.waiting.front() {
                let Some(r) = st.waiting.pop_front().flatten() else {
                    return Step::Done;
                };
                let i = st.taken;
                st.taken += 1;
                if st.waiting_for_room > 0 {
                    self.room.notify_one();
                }
                return Step::Take(i, r);
            }
            if let Some(i) = st.begin(len) {
                return Step::Work(i);
            }
            st.waiting_for_done = true;
            st = self.done.wait(st).unwrap_or_else(PoisonError::into_inner);
            st.waiting_for_done = false;
        }
    }

    /// No item is started after this.
    fn stop(&self) {
        self.lock().stop = true;
        self.room.notify_all();
    }
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

    /// Results come in input order while no item starts more than [`WINDOW`] ahead of
    /// the one taken next, and a `take` that says stop starts nothing more.
    #[test]
    fn results_come_in_order_within_the_window_and_stop_on_request() {
        use std::sync::atomic::{AtomicUsize, Ordering};
        std::env::set_var("KERN_JOBS", "2");
        let items: Vec<usize> = (0..1000).collect();
        let taken = AtomicUsize::new(0);
        let ahead = AtomicUsize::new(0);
        let started = AtomicUsize::new(0);
        let mut order = Vec::new();
        parallel_for_each(
            &items,
            |&i| {
                started.fetch_add(1, Ordering::SeqCst);
                ahead.fetch_max(i - taken.load(Ordering::SeqCst), Ordering::SeqCst);
                i * 2
            },
            |i, r| {
                order.push((i, r.unwrap()));
                taken.store(i + 1, Ordering::SeqCst);
                i < 599
            },
        );
        assert_eq!(order, (0..600).map(|i| (i, i * 2)).collect::<Vec<_>>());
        // `taken` is stored after `take` runs, the queue counts an item taken just
        // before: so one more than the window can show here.
        assert!(ahead.load(Ordering::SeqCst) <= WINDOW);
        assert!(started.load(Ordering::SeqCst) <= 600 + WINDOW);
    }
}
