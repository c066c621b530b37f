//! Following the open file on disk: the event loop asks now and then whether the file
//! has changed ([`Watch::look`]). Each look is one `stat` (modification time and size);
//! only when either differs from the last look is the file read, and only text that
//! differs from what the workbench last read or wrote there counts as a change (so our
//! own saves, and a `touch`, change nothing).

use std::path::Path;
use std::time::SystemTime;

/// The file's modification time and size at the last look.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub struct Stamp {
    modified: Option<SystemTime>,
    len: u64,
}

impl Stamp {
    /// The stamp of the file at `path` now; `None` when it cannot be looked at (gone, or
    /// not yet created).
    pub fn of(path: &Path) -> Option<Stamp> {
        let m = std::fs::metadata(path).ok()?;
        Some(Stamp {
            modified: m.modified().ok(),
            len: m.len(),
        })
    }
}

/// What the file looked like at the last look.
#[derive(Debug, Clone, Default)]
pub struct Watch {
    seen: Option<Stamp>,
}

impl Watch {
    /// The file's stamp when it differs from the one last [`seen`](Watch::seen).
    pub fn look(&self, path: &Path) -> Option<Stamp> {
        Stamp::of(path).filter(|s| self.seen != Some(*s))
    }

    /// Notes that the file as stamped `s` has been dealt with.
    pub fn seen(&mut self, s: Stamp) {
        self.seen = Some(s);
    }
}
