//! The binary's allocator: the system allocator with a small cache a thread in front.
//! A block of at most [`LARGEST`] bytes that a thread frees is kept on that thread, in
//! a list for its size class (multiples of [`GRAIN`] bytes), and handed out again for
//! the next request of that class, so the churn of small vectors and strings (about
//! 110 k blocks over a 300-file `kern calc` batch) mostly skips malloc and free. Each
//! thread keeps at most [`CACHE_BYTES`]; a block past that goes back at once, and a
//! thread's blocks go back when the thread ends (a `pthread` key's destructor). Every
//! block, cached or not, was made by the system allocator with its class's whole size,
//! so it may go back to it from any thread. It names nothing of the crate.

use std::alloc::{GlobalAlloc, Layout, System};
use std::cell::Cell;
use std::ptr;
use std::sync::atomic::{AtomicBool, AtomicU32, Ordering};
use std::sync::Once;

/// The step between size classes.
const GRAIN: usize = 16;
/// The alignment cached requests may ask for: what malloc gives every block, two words
/// (16 bytes on the 64-bit targets).
const ALIGN: usize = 2 * std::mem::size_of::<usize>();
/// Size classes: blocks of `GRAIN`, `2 GRAIN`, … `CLASSES · GRAIN` bytes.
const CLASSES: usize = 64;
/// The largest block cached; larger ones go straight to the system allocator.
pub const LARGEST: usize = GRAIN * CLASSES;
/// The most bytes a thread keeps cached.
pub const CACHE_BYTES: usize = 1 << 20;

/// The allocator, for `#[global_allocator]`.
pub struct Blocks;

/// Whether a thread's cache may keep blocks.
#[derive(Clone, Copy, PartialEq)]
enum State {
    /// Not used yet: the thread-end hook is not set.
    New,
    /// Keeps blocks; emptied when the thread ends.
    Open,
    /// The thread is ending (or its hook could not be set): blocks go back at once.
    Closed,
}

/// One thread's cached blocks: a list a class, linked through each block's first word.
struct Cache {
    heads: [Cell<*mut u8>; CLASSES],
    bytes: Cell<usize>,
    state: Cell<State>,
}

thread_local! {
    // No destructor, so reaching it is a plain thread-local access that never fails
    // and never allocates; the thread's end is caught by the `pthread` key instead.
    static CACHE: Cache = const {
        Cache {
            heads: [const { Cell::new(ptr::null_mut()) }; CLASSES],
            bytes: Cell::new(0),
            state: Cell::new(State::New),
        }
    };
}

/// The `pthread` key whose destructor empties a thread's cache when it ends.
static KEY: AtomicU32 = AtomicU32::new(0);
static KEY_MADE: Once = Once::new();
/// Whether the key was made (`pthread_key_create` may fail).
static KEY_OK: AtomicBool = AtomicBool::new(false);

/// The size class of a request, when it is cached: `None` for more than [`LARGEST`]
/// bytes, an alignment past [`ALIGN`], or no bytes.
fn class(layout: Layout) -> Option<usize> {
    (layout.align() <= ALIGN && (1..=LARGEST).contains(&layout.size()))
        .then(|| (layout.size() - 1) / GRAIN)
}

/// The whole size and alignment of a block of class `c`.
fn block(c: usize) -> Layout {
    // SAFETY: ALIGN is a power of two and the size, at most LARGEST, cannot overflow.
    unsafe { Layout::from_size_align_unchecked((c + 1) * GRAIN, ALIGN) }
}

/// Empties the calling thread's cache and closes it: the `pthread` key's destructor.
extern "C" fn thread_ends(_: *mut libc::c_void) {
    let _ = CACHE.try_with(|k| {
        k.state.set(State::Closed);
        empty(k);
    });
}

/// Hands every block of `k` back to the system allocator.
fn empty(k: &Cache) {
    for (c, head) in k.heads.iter().enumerate() {
        let mut p = head.replace(ptr::null_mut());
        while !p.is_null() {
            // SAFETY: a listed block holds the next one's address in its first word and
            // was made by `System` with the layout `block(c)`.
            unsafe {
                let next = p.cast::<*mut u8>().read();
                System.dealloc(p, block(c));
                p = next;
            }
        }
    }
    k.bytes.set(0);
}

/// Opens `k` on its first use: sets the thread's end hook. `false` when it cannot.
fn open(k: &Cache) -> bool {
    KEY_MADE.call_once(|| {
        let mut key: libc::pthread_key_t = 0;
        // SAFETY: `key` is a valid place for the new key; the destructor is `extern "C"`.
        if unsafe { libc::pthread_key_create(&mut key, Some(thread_ends)) } == 0 {
            KEY.store(key, Ordering::Relaxed);
            KEY_OK.store(true, Ordering::Relaxed);
        }
    });
    // Any non-null value makes the destructor run when the thread ends.
    let set = KEY_OK.load(Ordering::Relaxed)
        // SAFETY: the key was made above; the value is never read.
        && unsafe { libc::pthread_setspecific(KEY.load(Ordering::Relaxed), ptr::dangling()) } == 0;
    k.state.set(if set { State::Open } else { State::Closed });
    set
}

/// A cached block of class `c`, if the thread has one.
fn take(c: usize) -> Option<*mut u8> {
    CACHE
        .try_with(|k| {
            let p = k.heads[c].get();
            if p.is_null() {
                return None;
            }
            // SAFETY: a listed block holds the next one's address in its first word.
            k.heads[c].set(unsafe { p.cast::<*mut u8>().read() });
            k.bytes.set(k.bytes.get() - block(c).size());
            Some(p)
        })
        .ok()
        .flatten()
}

/// Keeps the block `p` of class `c` in the thread's cache; `false` when the cache is
/// closed or full (the caller hands it back).
fn keep(p: *mut u8, c: usize) -> bool {
    CACHE
        .try_with(|k| {
            if k.state.get() == State::Closed || (k.state.get() == State::New && !open(k)) {
                return false;
            }
            let size = block(c).size();
            if k.bytes.get() + size > CACHE_BYTES {
                return false;
            }
            // SAFETY: the block is the caller's to give up, at least GRAIN bytes and
            // aligned to ALIGN: its first word holds the list's next block.
            unsafe { p.cast::<*mut u8>().write(k.heads[c].get()) };
            k.heads[c].set(p);
            k.bytes.set(k.bytes.get() + size);
            true
        })
        .unwrap_or(false)
}

// SAFETY: a block is handed out once until it is given back; a cached block is a whole
// block of its class made by `System`, at least as large and aligned as the requests of
// that class; every other request goes to `System` unchanged.
unsafe impl GlobalAlloc for Blocks {
    unsafe fn alloc(&self, layout: Layout) -> *mut u8 {
        match class(layout) {
            Some(c) => take(c).unwrap_or_else(|| System.alloc(block(c))),
            None => System.alloc(layout),
        }
    }

    unsafe fn alloc_zeroed(&self, layout: Layout) -> *mut u8 {
        match class(layout) {
            Some(c) => match take(c) {
                Some(p) => {
                    p.write_bytes(0, layout.size());
                    p
                }
                None => System.alloc_zeroed(block(c)),
            },
            None => System.alloc_zeroed(layout),
        }
    }

    unsafe fn dealloc(&self, p: *mut u8, layout: Layout) {
        match class(layout) {
            Some(c) => {
                if !keep(p, c) {
                    System.dealloc(p, block(c));
                }
            }
            None => System.dealloc(p, layout),
        }
    }

    unsafe fn realloc(&self, p: *mut u8, layout: Layout, new_size: usize) -> *mut u8 {
        let new = Layout::from_size_align_unchecked(new_size, layout.align());
        match (class(layout), class(new)) {
            // The block already has the room.
            (Some(a), Some(b)) if a == b => p,
            (None, None) => System.realloc(p, layout, new_size),
            _ => {
                let q = self.alloc(new);
                if !q.is_null() {
                    ptr::copy_nonoverlapping(p, q, layout.size().min(new_size));
                    self.dealloc(p, layout);
                }
                q
            }
        }
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    /// Blocks of every size class and past it, kept, reused, grown, shrunk and
    /// zeroed, hold what was written in them, and the cache stays within its bound.
    #[test]
    fn blocks_keep_their_bytes_and_the_cache_its_bound() {
        let sizes = [1, 7, 16, 17, 100, 255, 1000, LARGEST, LARGEST + 1, 5000];
        for round in 0..3u8 {
            let mut held = Vec::new();
            for (i, &n) in sizes.iter().enumerate() {
                let l = Layout::from_size_align(n, 8).unwrap();
                // SAFETY: a non-zero layout; the block is written within its size.
                let p = unsafe { Blocks.alloc(l) };
                assert!(!p.is_null());
                unsafe { p.write_bytes(i as u8 ^ round, n) };
                held.push((p, l, i as u8 ^ round));
            }
            for (p, l, v) in held.iter_mut() {
                // SAFETY: each block is read within its size, then grown (or moved).
                let bytes = unsafe { std::slice::from_raw_parts(*p, l.size()) };
                assert!(bytes.iter().all(|b| b == v));
                let n = l.size() * 3 + 5;
                *p = unsafe { Blocks.realloc(*p, *l, n) };
                let kept = unsafe { std::slice::from_raw_parts(*p, l.size()) };
                assert!(kept.iter().all(|b| b == v));
                *l = Layout::from_size_align(n, 8).unwrap();
            }
            for (p, l, _) in held {
                unsafe { Blocks.dealloc(p, l) };
            }
            let z = Layout::from_size_align(300, 16).unwrap();
            let p = unsafe { Blocks.alloc_zeroed(z) };
            assert!(unsafe { std::slice::from_raw_parts(p, 300) }
                .iter()
                .all(|&b| b == 0));
            unsafe { Blocks.dealloc(p, z) };
        }
        // Far more freed at once than the bound: the cache keeps no more than it.
        let l = Layout::from_size_align(LARGEST, 8).unwrap();
        let many: Vec<_> = (0..2 * CACHE_BYTES / LARGEST)
            .map(|_| unsafe { Blocks.alloc(l) })
            .collect();
        for p in many {
            unsafe { Blocks.dealloc(p, l) };
        }
        CACHE.with(|k| assert!(k.bytes.get() <= CACHE_BYTES));
    }

    /// A thread's cache is emptied when the thread ends.
    #[test]
    fn a_thread_hands_its_blocks_back_when_it_ends() {
        let left = std::thread::spawn(|| {
            let l = Layout::from_size_align(64, 8).unwrap();
            let p = unsafe { Blocks.alloc(l) };
            unsafe { Blocks.dealloc(p, l) };
            let held = CACHE.with(|k| k.bytes.get());
            thread_ends(ptr::null_mut());
            (
                held,
                CACHE.with(|k| (k.bytes.get(), k.state.get() == State::Closed)),
            )
        })
        .join()
        .unwrap();
        assert_eq!(left, (64, (0, true)));
    }
}
