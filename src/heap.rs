//! The process heap, set up once at start. On Linux with glibc, blocks up to 32 MiB (glibc's most) come
//! from the one heap of the main thread (not a fresh `mmap` each, which the kernel must
//! map and zero page by page again after every free), the heap is not trimmed below
//! 128 MiB, it grows 8 MiB at a time, and its first 16 MiB are advised onto transparent
//! huge pages (`madvise(MADV_HUGEPAGE)`, honoured where the kernel's
//! `transparent_hugepage/enabled` is `always` or `madvise`). A torsion solve touches a
//! few megabytes of fresh memory: as 4 KiB pages that is one page fault per page, about
//! a thousand on the loading-bay beam; on huge pages, a few. This is what glibc's own
//! `glibc.malloc.hugetlb=1` tunable does, set from inside because a program cannot set
//! its own tunables. Elsewhere, nothing is changed. Figures: DEVELOPERS.md, "Benchmark
//! figures".

/// Sets up the heap as described above; call it first thing in `main`, before any thread
/// starts.
#[cfg(all(target_os = "linux", target_env = "gnu"))]
pub fn set_up() {
    use std::ffi::c_void;
    extern "C" {
        fn sbrk(increment: isize) -> *mut c_void;
    }
    /// Heap growth past each request, and the block that grows it now.
    const PAD: usize = 8 << 20;
    /// Transparent huge page size on x86-64 and most aarch64 kernels.
    const HUGE: usize = 2 << 20;
    // SAFETY: mallopt, sbrk(0), malloc and free are called before any other thread exists;
    // sbrk(0) only reads the break; madvise only advises pages of the heap's own mapping.
    unsafe {
        libc::mallopt(libc::M_MMAP_THRESHOLD, 32 << 20);
        libc::mallopt(libc::M_TRIM_THRESHOLD, 128 << 20);
        libc::mallopt(libc::M_TOP_PAD, PAD as i32);
        let before = sbrk(0) as usize;
        // black_box: the compiler may otherwise drop a malloc whose block is only freed.
        let block = std::hint::black_box(libc::malloc(PAD));
        if block.is_null() {
            return;
        }
        libc::free(block);
        let after = sbrk(0) as usize;
        let lo = before.next_multiple_of(HUGE);
        if before != usize::MAX && after != usize::MAX && after > lo {
            libc::madvise(lo as *mut c_void, after - lo, libc::MADV_HUGEPAGE);
        }
    }
}

/// Elsewhere the system allocator is left as it is.
#[cfg(not(all(target_os = "linux", target_env = "gnu")))]
pub fn set_up() {}
