//! Reading a section file as a git revision has it, with `git show`'s object syntax
//! (`REV:PATH`) through `git cat-file`, within the same size bound as a file on disk.

use super::input::MAX_BYTES;
use std::path::{Path, PathBuf};
use std::process::Command;

/// The text of `spec` = `REV:PATH` in the git repository holding `a`: PATH as git
/// names it from the repository's top, or `./PATH` from A's folder; an empty PATH is
/// A itself.
pub fn git_text(a: &Path, spec: &str) -> Result<String, String> {
    let (rev, path) = spec.split_once(':').unwrap_or((spec, ""));
    let dir = match a.parent() {
        Some(p) if !p.as_os_str().is_empty() => p.to_path_buf(),
        _ => PathBuf::from("."),
    };
    let path = if path.is_empty() {
        let name = a
            .file_name()
            .map(|n| n.to_string_lossy().into_owned())
            .unwrap_or_default();
        format!("./{name}")
    } else {
        path.to_string()
    };
    let object = format!("{rev}:{path}");
    let git = |args: &[&str]| {
        Command::new("git")
            .arg("-C")
            .arg(&dir)
            .args(args)
            .output()
            .map_err(|e| format!("cannot run git to read `{spec}`: {e}"))
    };
    let failed = |o: &std::process::Output| {
        let why = String::from_utf8_lossy(&o.stderr);
        let why = why.trim();
        if why.contains("not a git repository") {
            format!(
                "`{spec}` names a git revision, but {} is not in a git repository",
                a.display()
            )
        } else {
            format!("git cannot read `{object}`: {why}")
        }
    };
    let size = git(&["cat-file", "-s", &object])?;
    if !size.status.success() {
        return Err(failed(&size));
    }
    let bytes: u64 = String::from_utf8_lossy(&size.stdout)
        .trim()
        .parse()
        .unwrap_or(u64::MAX);
    if bytes > MAX_BYTES {
        return Err(format!(
            "`{object}` is {bytes} bytes; a section file may be at most {MAX_BYTES}"
        ));
    }
    let shown = git(&["cat-file", "blob", &object])?;
    if !shown.status.success() {
        return Err(failed(&shown));
    }
    String::from_utf8(shown.stdout).map_err(|e| {
        format!(
            "`{object}` is not UTF-8 text (byte {} is not)",
            e.utf8_error().valid_up_to()
        )
    })
}
