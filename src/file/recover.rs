//! The recovery copy of unsaved edits: `FILE.kern-recover` beside the section file
//! (for the bundled demo, `demo.kern-recover` in the user's data folder), written when
//! the workbench panics or is stopped by a signal, and offered on the next open.

use super::save::write_private;
use std::path::{Path, PathBuf};

/// What a recovery file's name ends with.
pub const SUFFIX: &str = ".kern-recover";

/// Where the recovery copy of the section at `path` (the demo if `None`) goes.
pub fn recovery_path(path: Option<&Path>) -> Option<PathBuf> {
    match path {
        Some(p) => {
            let mut name = p.file_name()?.to_os_string();
            name.push(SUFFIX);
            Some(p.with_file_name(name))
        }
        None => directories::ProjectDirs::from("", "", "kern")
            .map(|d| d.data_local_dir().join(format!("demo{SUFFIX}"))),
    }
}

/// Writes `text` as the recovery copy at `to` (private, atomic; its folder made if need be).
pub fn write(to: &Path, text: &str) -> std::io::Result<()> {
    if let Some(dir) = to.parent().filter(|d| !d.as_os_str().is_empty()) {
        std::fs::create_dir_all(dir)?;
    }
    write_private(to, text)
}

/// Where the recovery copy for the section at `path` is, if there is one.
pub fn find(path: Option<&Path>) -> Option<PathBuf> {
    recovery_path(path).filter(|p| p.is_file())
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn the_copy_sits_beside_the_file_and_is_found_again() {
        let dir = std::env::temp_dir().join(format!("kern-recover-{}", std::process::id()));
        std::fs::create_dir_all(&dir).unwrap();
        let file = dir.join("lintel.toml");
        let at = recovery_path(Some(&file)).unwrap();
        assert_eq!(at, dir.join("lintel.toml.kern-recover"));
        assert_eq!(find(Some(&file)), None);
        write(&at, "unsaved").unwrap();
        assert_eq!(find(Some(&file)), Some(at.clone()));
        assert_eq!(std::fs::read_to_string(&at).unwrap(), "unsaved");
        std::fs::remove_dir_all(&dir).unwrap();
    }
}
