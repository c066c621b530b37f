//! The process's CPU time for criterion's custom timing: on a machine shared with other
//! work the wall clock says more about the load than about kern.

use criterion::black_box;
use std::time::Duration;

/// The CPU time the process has used so far, every thread's (POSIX
/// `CLOCK_PROCESS_CPUTIME_ID`).
pub fn cpu_time() -> Duration {
    let mut t = libc::timespec {
        tv_sec: 0,
        tv_nsec: 0,
    };
    // SAFETY: `t` is a valid timespec for the call to write.
    let rc = unsafe { libc::clock_gettime(libc::CLOCK_PROCESS_CPUTIME_ID, &mut t) };
    assert_eq!(rc, 0, "the process CPU clock is readable");
    Duration::new(t.tv_sec as u64, t.tv_nsec as u32)
}

/// Times `f` by the CPU time of `iters` runs (criterion's `iter_custom`).
pub fn on_cpu<T>(iters: u64, mut f: impl FnMut() -> T) -> Duration {
    let start = cpu_time();
    for _ in 0..iters {
        black_box(f());
    }
    cpu_time() - start
}
