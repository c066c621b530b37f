//! Atomic, secure saves: write a temporary file beside the target, flush it to disk,
//! then rename it over the target, so a crash leaves either the old file or the new one.
//!
//! The temporary file has a random name (`.NAME.kern-PID-RANDOM.tmp`) and is created with
//! `O_CREAT | O_EXCL`, which never follows a symbolic link planted at that name. It is
//! private (0600) while it is written; the old file's owner, group and mode are set on
//! the open descriptor (`fchown`, `fchmod`) before the rename. Stale temporary files of
//! our own naming, left by a process that is gone, are removed on the next save.

use std::fs::{self, File};
use std::io::{self, Write};
use std::path::{Path, PathBuf};
use std::time::{Duration, SystemTime};

/// Why a save did not happen.
#[derive(Debug)]
pub enum SaveError {
    /// The file exists and has no write permission: ask before replacing it (then save
    /// again with [`Overwrite::ReadOnly`]).
    ReadOnly(PathBuf),
    /// The file system said no.
    Io(io::Error),
}

impl std::fmt::Display for SaveError {
    fn fmt(&self, f: &mut std::fmt::Formatter<'_>) -> std::fmt::Result {
        match self {
            SaveError::ReadOnly(p) => write!(f, "{} is read-only", p.display()),
            SaveError::Io(e) => e.fmt(f),
        }
    }
}

impl From<io::Error> for SaveError {
    fn from(e: io::Error) -> SaveError {
        SaveError::Io(e)
    }
}

/// Whether a save may replace a read-only file.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum Overwrite {
    /// Refuse with [`SaveError::ReadOnly`].
    Writable,
    /// The user said yes.
    ReadOnly,
}

/// What a save did beyond writing the text.
#[derive(Debug, Default, Clone, PartialEq, Eq)]
pub struct Saved {
    /// The file written (the target of a symbolic link, if one was given).
    pub path: PathBuf,
    /// Something the user should know (an owner that could not be kept).
    pub warning: Option<String>,
}

/// How many symbolic links are followed before a save gives up (as Linux's `ELOOP`).
const MAX_LINKS: usize = 40;

/// A temporary file of ours older than this is stale even if its process number is in use.
const STALE_AFTER: Duration = Duration::from_secs(24 * 3600);

/// Writes `text` to `path` atomically; refuses a read-only file unless `overwrite` says so.
/// Through a symbolic link, the file it points to is replaced (and created if the link
/// dangles); the link stays a link.
pub fn save(path: &Path, text: &str, overwrite: Overwrite) -> Result<Saved, SaveError> {
    let target = resolve_links(path)?;
    let old = match fs::metadata(&target) {
        Ok(m) => Some(m),
        Err(e) if e.kind() == io::ErrorKind::NotFound => None,
        Err(e) => return Err(e.into()),
    };
    if let Some(m) = &old {
        if !m.is_file() {
            return Err(io::Error::other("it is not a regular file").into());
        }
        if m.permissions().readonly() && overwrite == Overwrite::Writable {
            return Err(SaveError::ReadOnly(target));
        }
    }
    let warning = write_replacing(&target, text, old.as_ref(), None)?;
    Ok(Saved {
        path: target,
        warning,
    })
}

/// Writes `text` to `path` atomically as a private file (0600), whatever was there:
/// for the recovery copy of unsaved edits.
pub fn write_private(path: &Path, text: &str) -> io::Result<()> {
    write_replacing(path, text, None, Some(0o600)).map(|_| ())
}

/// The file a chain of symbolic links ends at (which may not exist yet), each relative
/// link taken from the folder of the link.
fn resolve_links(path: &Path) -> io::Result<PathBuf> {
    let mut p = path.to_path_buf();
    for _ in 0..MAX_LINKS {
        match fs::symlink_metadata(&p) {
            Ok(m) if m.file_type().is_symlink() => {
                let to = fs::read_link(&p)?;
                p = match p.parent() {
                    Some(dir) => dir.join(to),
                    None => to,
                };
            }
            Ok(_) => return Ok(p),
            Err(e) if e.kind() == io::ErrorKind::NotFound => return Ok(p),
            Err(e) => return Err(e),
        }
    }
    Err(io::Error::other(format!(
        "more than {MAX_LINKS} symbolic links in a row"
    )))
}

/// The folder of `path` (`.` for a bare name).
fn folder(path: &Path) -> PathBuf {
    match path.parent() {
        Some(d) if !d.as_os_str().is_empty() => d.to_path_buf(),
        _ => PathBuf::from("."),
    }
}

/// The start of our temporary names for a file called `name`.
fn temp_prefix(name: &str) -> String {
    format!(".{name}.kern-")
}

/// Temp file, fsync, owner and mode, rename, fsync of the folder. `old` is the file being
/// replaced (its owner and mode are kept); `mode` forces a mode instead. Returns a
/// warning when the owner could not be kept.
fn write_replacing(
    path: &Path,
    text: &str,
    old: Option<&fs::Metadata>,
    mode: Option<u32>,
) -> io::Result<Option<String>> {
    let dir = folder(path);
    let name = path
        .file_name()
        .map_or("section".into(), |n| n.to_string_lossy().into_owned());
    remove_stale_temps(&dir, &name);
    let prefix = format!("{}{}-", temp_prefix(&name), std::process::id());
    let mut builder = tempfile::Builder::new();
    builder.prefix(&prefix).suffix(".tmp").rand_bytes(8);
    #[cfg(unix)]
    {
        use std::os::unix::fs::PermissionsExt;
        // A new file gets the usual 0666 less the umask; a replacement stays private
        // until its owner and mode are those of the old file.
        let create = if old.is_none() && mode.is_none() {
            0o666
        } else {
            0o600
        };
        builder.permissions(fs::Permissions::from_mode(create));
    }
    let mut tmp = builder.tempfile_in(&dir)?;
    tmp.write_all(text.as_bytes())?;
    tmp.as_file().sync_all()?;
    let warning = match old {
        Some(m) => keep_owner_and_mode(tmp.as_file(), m)?,
        None => None,
    };
    #[cfg(unix)]
    if let Some(mode) = mode {
        use std::os::unix::fs::PermissionsExt;
        tmp.as_file()
            .set_permissions(fs::Permissions::from_mode(mode))?;
    }
    tmp.persist(path).map_err(|e| e.error)?;
    if let Ok(d) = File::open(&dir) {
        // Not every platform can sync a directory; the rename is done either way.
        let _ = d.sync_all();
    }
    Ok(warning)
}

/// Gives the open file `f` the owner, group and mode of `old` (`fchown`, then `fchmod`,
/// since a change of owner may clear set-id bits). Where the process may not give the
/// file away, the group alone is tried and a warning says whose the file now is.
#[cfg(unix)]
fn keep_owner_and_mode(f: &File, old: &fs::Metadata) -> io::Result<Option<String>> {
    use std::os::unix::fs::{fchown, MetadataExt, PermissionsExt};
    let mine = f.metadata()?;
    let mut warning = None;
    if (mine.uid(), mine.gid()) != (old.uid(), old.gid())
        && fchown(f, Some(old.uid()), Some(old.gid())).is_err()
    {
        let group_kept = fchown(f, None, Some(old.gid())).is_ok();
        warning = Some(if group_kept {
            format!(
                "the file belonged to user {}; it is now yours (user {}), group kept",
                old.uid(),
                mine.uid()
            )
        } else {
            format!(
                "the file belonged to user {}, group {}; it is now yours (user {}, group {})",
                old.uid(),
                old.gid(),
                mine.uid(),
                mine.gid()
            )
        });
    }
    f.set_permissions(fs::Permissions::from_mode(old.mode() & 0o7777))?;
    Ok(warning)
}

#[cfg(not(unix))]
fn keep_owner_and_mode(f: &File, old: &fs::Metadata) -> io::Result<Option<String>> {
    f.set_permissions(old.permissions())?;
    Ok(None)
}

/// Removes our own stale temporary files for `name` in `dir`: regular files owned by
/// this user, named `.NAME.kern-PID[-RANDOM].tmp`, whose process is gone (or that are
/// older than a day). Anything else, a symbolic link included, is left alone.
fn remove_stale_temps(dir: &Path, name: &str) {
    let Ok(entries) = fs::read_dir(dir) else {
        return;
    };
    let prefix = temp_prefix(name);
    for e in entries.flatten() {
        let file_name = e.file_name();
        let Some(pid) = file_name
            .to_str()
            .and_then(|n| n.strip_prefix(&prefix))
            .and_then(|rest| rest.strip_suffix(".tmp"))
            .and_then(|rest| rest.split('-').next())
            .and_then(|pid| pid.parse::<u32>().ok())
        else {
            continue;
        };
        let Ok(meta) = fs::symlink_metadata(e.path()) else {
            continue;
        };
        if !meta.file_type().is_file() || !owned_by_me(&meta) {
            continue;
        }
        let old = meta
            .modified()
            .ok()
            .and_then(|t| SystemTime::now().duration_since(t).ok())
            .is_some_and(|age| age > STALE_AFTER);
        if old || (pid != std::process::id() && !process_alive(pid)) {
            let _ = fs::remove_file(e.path());
        }
    }
}

#[cfg(unix)]
fn owned_by_me(meta: &fs::Metadata) -> bool {
    use std::os::unix::fs::MetadataExt;
    // SAFETY: geteuid has no preconditions and cannot fail.
    meta.uid() == unsafe { libc::geteuid() }
}

#[cfg(not(unix))]
fn owned_by_me(_: &fs::Metadata) -> bool {
    true
}

/// Is process `pid` running? (`kill(pid, 0)`: EPERM means it exists under another user.)
#[cfg(unix)]
fn process_alive(pid: u32) -> bool {
    let Ok(pid) = libc::pid_t::try_from(pid) else {
        return false;
    };
    if pid <= 0 {
        return false;
    }
    // SAFETY: signal 0 only checks that the process exists; nothing is sent.
    let r = unsafe { libc::kill(pid, 0) };
    r == 0 || io::Error::last_os_error().raw_os_error() == Some(libc::EPERM)
}

#[cfg(not(unix))]
fn process_alive(_: u32) -> bool {
    true
}

#[cfg(test)]
mod tests {
    use super::*;

    fn scratch(tag: &str) -> PathBuf {
        let dir = std::env::temp_dir().join(format!("kern-save-{tag}-{}", std::process::id()));
        let _ = fs::remove_dir_all(&dir);
        fs::create_dir_all(&dir).unwrap();
        dir
    }

    fn write(p: &Path, text: &str) -> Saved {
        save(p, text, Overwrite::Writable).unwrap()
    }

    #[test]
    fn writes_and_replaces() {
        let dir = scratch("replace");
        let p = dir.join("s.toml");
        write(&p, "one");
        write(&p, "two");
        assert_eq!(fs::read_to_string(&p).unwrap(), "two");
        let leftovers = fs::read_dir(&dir).unwrap().count();
        assert_eq!(leftovers, 1);
        fs::remove_dir_all(&dir).unwrap();
    }

    #[cfg(unix)]
    #[test]
    fn a_link_stays_a_link() {
        let dir = scratch("link");
        let real = dir.join("real.toml");
        let link = dir.join("link.toml");
        fs::write(&real, "old").unwrap();
        std::os::unix::fs::symlink(&real, &link).unwrap();
        write(&link, "new");
        assert!(fs::symlink_metadata(&link)
            .unwrap()
            .file_type()
            .is_symlink());
        assert_eq!(fs::read_to_string(&real).unwrap(), "new");
        fs::remove_dir_all(&dir).unwrap();
    }

    #[cfg(unix)]
    #[test]
    fn a_dangling_link_gets_its_target_created() {
        let dir = scratch("dangling");
        let link = dir.join("link.toml");
        std::os::unix::fs::symlink("real.toml", &link).unwrap();
        let saved = write(&link, "new");
        assert_eq!(saved.path, dir.join("real.toml"));
        assert_eq!(fs::read_to_string(dir.join("real.toml")).unwrap(), "new");
        assert!(fs::symlink_metadata(&link)
            .unwrap()
            .file_type()
            .is_symlink());
        fs::remove_dir_all(&dir).unwrap();
    }

    /// Symbolic links planted at the old predictable temp name (`.NAME.kern-PID.tmp`, for
    /// this process and its neighbours) and at names of the new pattern: the file they
    /// point to is never written, and the links are left alone.
    #[cfg(unix)]
    #[test]
    fn planted_links_at_temp_names_are_never_followed() {
        let dir = scratch("planted");
        let victim = dir.join("victim.txt");
        fs::write(&victim, "precious").unwrap();
        let me = std::process::id();
        let mut planted = Vec::new();
        for pid in me.saturating_sub(3)..=me + 3 {
            planted.push(dir.join(format!(".s.toml.kern-{pid}.tmp")));
            planted.push(dir.join(format!(".s.toml.kern-{pid}-AAAAAAAA.tmp")));
        }
        planted.push(dir.join(".s.toml.kern-1.tmp"));
        for p in &planted {
            std::os::unix::fs::symlink(&victim, p).unwrap();
        }
        let p = dir.join("s.toml");
        write(&p, "one");
        write(&p, "two");
        assert_eq!(fs::read_to_string(&victim).unwrap(), "precious");
        assert_eq!(fs::read_to_string(&p).unwrap(), "two");
        for l in &planted {
            assert!(fs::symlink_metadata(l).unwrap().file_type().is_symlink());
        }
        fs::remove_dir_all(&dir).unwrap();
    }

    #[cfg(unix)]
    #[test]
    fn the_mode_and_owner_survive() {
        use std::os::unix::fs::{chown, MetadataExt, PermissionsExt};
        let dir = scratch("mode");
        let p = dir.join("s.toml");
        fs::write(&p, "old").unwrap();
        fs::set_permissions(&p, fs::Permissions::from_mode(0o640)).unwrap();
        // As root, give the file to another user first: the save keeps that owner.
        let root = unsafe { libc::geteuid() } == 0;
        if root {
            chown(&p, Some(4242), Some(4343)).unwrap();
        }
        let saved = write(&p, "new");
        let m = fs::metadata(&p).unwrap();
        assert_eq!(m.mode() & 0o7777, 0o640);
        assert_eq!(fs::read_to_string(&p).unwrap(), "new");
        if root {
            assert_eq!((m.uid(), m.gid()), (4242, 4343));
            assert_eq!(saved.warning, None);
        }
        fs::remove_dir_all(&dir).unwrap();
    }

    #[cfg(unix)]
    #[test]
    fn a_read_only_file_is_replaced_only_when_allowed() {
        use std::os::unix::fs::{MetadataExt, PermissionsExt};
        let dir = scratch("readonly");
        let p = dir.join("s.toml");
        fs::write(&p, "old").unwrap();
        fs::set_permissions(&p, fs::Permissions::from_mode(0o444)).unwrap();
        let r = save(&p, "new", Overwrite::Writable);
        assert!(matches!(r, Err(SaveError::ReadOnly(_))), "{r:?}");
        assert_eq!(fs::read_to_string(&p).unwrap(), "old");
        save(&p, "new", Overwrite::ReadOnly).unwrap();
        assert_eq!(fs::read_to_string(&p).unwrap(), "new");
        assert_eq!(fs::metadata(&p).unwrap().mode() & 0o777, 0o444);
        fs::remove_dir_all(&dir).unwrap();
    }

    #[cfg(unix)]
    #[test]
    fn only_our_stale_temps_are_removed() {
        let dir = scratch("stale");
        // No process has a number this large (Linux's limit is 2^22).
        let gone = dir.join(".s.toml.kern-99999999-abcdefgh.tmp");
        let old_style = dir.join(".s.toml.kern-99999998.tmp");
        let alive = dir.join(format!(".s.toml.kern-{}-zzzzzzzz.tmp", std::process::id()));
        let other = dir.join(".t.toml.kern-99999999-abcdefgh.tmp");
        let unrelated = dir.join(".s.toml.swp");
        for p in [&gone, &old_style, &alive, &other, &unrelated] {
            fs::write(p, "x").unwrap();
        }
        write(&dir.join("s.toml"), "new");
        assert!(!gone.exists() && !old_style.exists());
        assert!(alive.exists() && other.exists() && unrelated.exists());
        fs::remove_dir_all(&dir).unwrap();
    }

    #[cfg(unix)]
    #[test]
    fn the_recovery_copy_is_private() {
        use std::os::unix::fs::{MetadataExt, PermissionsExt};
        let dir = scratch("private");
        let p = dir.join("s.toml.kern-recover");
        fs::write(&p, "old").unwrap();
        fs::set_permissions(&p, fs::Permissions::from_mode(0o644)).unwrap();
        write_private(&p, "unsaved").unwrap();
        assert_eq!(fs::metadata(&p).unwrap().mode() & 0o777, 0o600);
        assert_eq!(fs::read_to_string(&p).unwrap(), "unsaved");
        fs::remove_dir_all(&dir).unwrap();
    }
}
