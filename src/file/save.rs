//! Atomic saves: write a temporary file beside the target, flush it to disk, then
//! rename it over the target, so a crash leaves either the old file or the new one.

use std::fs;
use std::io::Write;
use std::path::Path;

/// Writes `text` to `path` atomically (temp file, fsync, rename, fsync of the folder).
pub fn write_atomic(path: &Path, text: &str) -> std::io::Result<()> {
    // Through a symbolic link, replace the file it points to, not the link.
    let target = match fs::symlink_metadata(path) {
        Ok(m) if m.file_type().is_symlink() => fs::canonicalize(path)?,
        _ => path.to_path_buf(),
    };
    let path = target.as_path();
    let dir = match path.parent() {
        Some(d) if !d.as_os_str().is_empty() => d.to_path_buf(),
        _ => std::path::PathBuf::from("."),
    };
    let name = path
        .file_name()
        .map_or("section".into(), |n| n.to_string_lossy().into_owned());
    let tmp = dir.join(format!(".{name}.kern-{}.tmp", std::process::id()));
    let result = (|| {
        let mut f = fs::File::create(&tmp)?;
        f.write_all(text.as_bytes())?;
        f.sync_all()?;
        if let Ok(meta) = fs::metadata(path) {
            fs::set_permissions(&tmp, meta.permissions())?;
        }
        fs::rename(&tmp, path)?;
        if let Ok(d) = fs::File::open(&dir) {
            // Not every platform can sync a directory; the rename is done either way.
            let _ = d.sync_all();
        }
        Ok(())
    })();
    if result.is_err() {
        let _ = fs::remove_file(&tmp);
    }
    result
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn writes_and_replaces() {
        let dir = std::env::temp_dir().join(format!("kern-save-{}", std::process::id()));
        fs::create_dir_all(&dir).unwrap();
        let p = dir.join("s.toml");
        write_atomic(&p, "one").unwrap();
        write_atomic(&p, "two").unwrap();
        assert_eq!(fs::read_to_string(&p).unwrap(), "two");
        let leftovers = fs::read_dir(&dir).unwrap().count();
        assert_eq!(leftovers, 1);
        fs::remove_dir_all(&dir).unwrap();
    }

    #[cfg(unix)]
    #[test]
    fn a_link_stays_a_link() {
        let dir = std::env::temp_dir().join(format!("kern-link-{}", std::process::id()));
        fs::create_dir_all(&dir).unwrap();
        let real = dir.join("real.toml");
        let link = dir.join("link.toml");
        fs::write(&real, "old").unwrap();
        std::os::unix::fs::symlink(&real, &link).unwrap();
        write_atomic(&link, "new").unwrap();
        assert!(fs::symlink_metadata(&link)
            .unwrap()
            .file_type()
            .is_symlink());
        assert_eq!(fs::read_to_string(&real).unwrap(), "new");
        fs::remove_dir_all(&dir).unwrap();
    }
}
