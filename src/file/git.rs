//! Reading a section file as a git revision has it, with `git show`'s object syntax
//! (`REV:PATH`) through `git cat-file`, within the same size bound as a file on disk;
//! and the file's recent commits (`git log` of its path), for choosing one.

use super::input::MAX_BYTES;
use std::path::{Path, PathBuf};
use std::process::Command;

/// The text of `spec` = `REV:PATH` in the git repository holding `a`: PATH as git
/// names it from the repository's top, or `./PATH` from A's folder; an empty PATH is
/// A itself.
pub fn git_text(a: &Path, spec: &str) -> Result<String, String> {
    let (rev, path) = spec.split_once(':').unwrap_or((spec, ""));
    let (dir, own) = place(a);
    let path = if path.is_empty() {
        own
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

/// The folder git runs in for file `a` (its own), and `a` named from there (`./NAME`).
fn place(a: &Path) -> (PathBuf, String) {
    let dir = match a.parent() {
        Some(p) if !p.as_os_str().is_empty() => p.to_path_buf(),
        _ => PathBuf::from("."),
    };
    let name = a
        .file_name()
        .map(|n| n.to_string_lossy().into_owned())
        .unwrap_or_default();
    (dir, format!("./{name}"))
}

/// One commit of a file's history, as the workbench lists it.
#[derive(Debug, Clone, PartialEq, Eq)]
pub struct Commit {
    /// The abbreviated hash (`git log %h`), a revision `git_text` takes.
    pub hash: String,
    /// The commit date, `YYYY-MM-DD`.
    pub date: String,
    /// The first line of the message, as git has it (sanitise it before showing it).
    pub subject: String,
}

/// The longest subject read of a commit (git cuts a longer one and ends it in `..`).
const SUBJECT_CHARS: usize = 120;

/// The last `most` commits that changed file `a`, the last one first (`git log` of
/// that path). `Err` says why there are none: git cannot be run, A is in no git
/// repository, or git has no commit of it (untracked, or never committed).
pub fn log(a: &Path, most: usize) -> Result<Vec<Commit>, String> {
    let (dir, name) = place(a);
    let format = format!("--format=%h%x1f%ad%x1f%<({SUBJECT_CHARS},trunc)%s");
    let out = Command::new("git")
        .arg("-C")
        .arg(&dir)
        .args(["log", "--date=short", "--no-color", "-n"])
        .arg(most.to_string())
        .arg(format)
        .arg("--")
        .arg(&name)
        .output()
        .map_err(|e| format!("cannot run git to list the commits of {}: {e}", a.display()))?;
    if !out.status.success() {
        let why = String::from_utf8_lossy(&out.stderr);
        let why = why.trim();
        return Err(if why.contains("not a git repository") {
            format!("{} is not in a git repository", a.display())
        } else if why.contains("does not have any commits") {
            format!("the git repository of {} has no commits yet", a.display())
        } else {
            format!("git cannot list the commits of {}: {why}", a.display())
        });
    }
    let text = String::from_utf8_lossy(&out.stdout);
    let commits: Vec<Commit> = text
        .lines()
        .filter_map(|l| {
            let mut f = l.splitn(3, '\u{1f}');
            Some(Commit {
                hash: f.next()?.to_string(),
                date: f.next()?.to_string(),
                subject: f.next()?.trim_end().to_string(),
            })
        })
        .collect();
    if commits.is_empty() {
        return Err(format!(
            "git has no commit of {} (not added and committed yet)",
            a.display()
        ));
    }
    Ok(commits)
}
