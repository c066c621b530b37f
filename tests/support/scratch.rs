//! A scratch folder for one test, removed when the test ends (pass or fail): a fresh
//! `kern-TAG-RANDOM` under the system's temp folder, used as a `Path` (`dir.join(…)`,
//! `&dir` where a `&Path` is taken).

use std::ops::Deref;
use std::path::Path;

/// A scratch folder, removed on drop.
pub struct Scratch(tempfile::TempDir);

impl Deref for Scratch {
    type Target = Path;
    fn deref(&self) -> &Path {
        self.0.path()
    }
}

impl AsRef<Path> for Scratch {
    fn as_ref(&self) -> &Path {
        self.0.path()
    }
}

/// A new, empty scratch folder named for `tag`.
pub fn scratch(tag: &str) -> Scratch {
    Scratch(
        tempfile::Builder::new()
            .prefix(&format!("kern-{tag}-"))
            .tempdir()
            .expect("a scratch folder in the temp folder"),
    )
}
