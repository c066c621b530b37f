//! Reading a section file's text from disk, shared by `kern calc` and the workbench.
//! What could hang or grow without bound is refused before anything is read: only a
//! regular file (or a symbolic link to one) of at most [`MAX_BYTES`] is read, and its
//! text must be UTF-8.

use super::locate;
use std::fs::{self, File};
use std::io::{self, Read};
use std::path::Path;

/// The largest section file read: 64 MiB (a section file is a few kilobytes; a long
/// polygon outline a few megabytes).
pub const MAX_BYTES: u64 = 64 * 1024 * 1024;

/// Why a file's text could not be had.
#[derive(Debug, Clone, PartialEq, Eq)]
pub enum ReadError {
    /// Nothing is at that path (a new section may start there).
    Missing,
    /// The line to print: `FILE:LINE:COLUMN: what is wrong; how to fix it`.
    Refused(String),
}

impl ReadError {
    /// The line to print, with the missing case spelt out.
    pub fn line(&self, path: &Path) -> String {
        match self {
            ReadError::Missing => format!(
                "{}:1:1: cannot read the file: there is no such file",
                path.display()
            ),
            ReadError::Refused(l) => l.clone(),
        }
    }
}

/// The text of the section file at `path`.
pub fn read_text(path: &Path) -> Result<String, ReadError> {
    let name = path.display();
    let refuse = |line: usize, col: usize, m: String| {
        ReadError::Refused(format!("{name}:{line}:{col}: {m}"))
    };
    let io_err = |e: io::Error| refuse(1, 1, format!("cannot read the file: {e}"));
    // Looked at before opening: opening a named pipe with no writer would block.
    let meta = match fs::metadata(path) {
        Ok(m) => m,
        Err(e) if e.kind() == io::ErrorKind::NotFound => return Err(ReadError::Missing),
        Err(e) => return Err(io_err(e)),
    };
    check(&meta).map_err(|m| refuse(1, 1, m))?;
    let file = open(path).map_err(io_err)?;
    // And again on what was opened, in case the path changed in between.
    check(&file.metadata().map_err(io_err)?).map_err(|m| refuse(1, 1, m))?;
    let mut bytes = Vec::with_capacity(usize::try_from(meta.len()).unwrap_or(0));
    // One byte past the limit tells a file that grew while it was read.
    file.take(MAX_BYTES + 1)
        .read_to_end(&mut bytes)
        .map_err(io_err)?;
    if bytes.len() as u64 > MAX_BYTES {
        return Err(refuse(1, 1, too_large(bytes.len() as u64)));
    }
    String::from_utf8(bytes).map_err(|e| {
        let (l, c) = locate(
            &String::from_utf8_lossy(e.as_bytes()),
            e.utf8_error().valid_up_to(),
        );
        refuse(l, c, "the file is not UTF-8 text; save it as UTF-8".into())
    })
}

/// Opens for reading without blocking on a named pipe put in place after the check.
#[cfg(unix)]
fn open(path: &Path) -> io::Result<File> {
    use std::os::unix::fs::OpenOptionsExt;
    fs::OpenOptions::new()
        .read(true)
        .custom_flags(libc::O_NONBLOCK)
        .open(path)
}

#[cfg(not(unix))]
fn open(path: &Path) -> io::Result<File> {
    File::open(path)
}

/// `Err` with the reason when `meta` is not a regular file of a readable size.
fn check(meta: &fs::Metadata) -> Result<(), String> {
    if !meta.is_file() {
        return Err(format!(
            "not a regular file (it is {}); give the path of a section file",
            kind(meta)
        ));
    }
    if meta.len() > MAX_BYTES {
        return Err(too_large(meta.len()));
    }
    Ok(())
}

fn too_large(len: u64) -> String {
    format!(
        "the file is {:.1} MiB, more than the {} MiB a section file may be; check that \
         this is the right file",
        len as f64 / (1024.0 * 1024.0),
        MAX_BYTES / (1024 * 1024)
    )
}

/// What kind of thing other than a regular file `meta` describes, in words.
fn kind(meta: &fs::Metadata) -> &'static str {
    if meta.is_dir() {
        return "a folder";
    }
    #[cfg(unix)]
    {
        use std::os::unix::fs::FileTypeExt;
        let t = meta.file_type();
        if t.is_fifo() {
            return "a named pipe";
        }
        if t.is_char_device() || t.is_block_device() {
            return "a device";
        }
        if t.is_socket() {
            return "a socket";
        }
    }
    "not a file"
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn reads_text_and_says_where_it_is_not_utf8() {
        let dir = std::env::temp_dir().join(format!("kern-input-{}", std::process::id()));
        fs::create_dir_all(&dir).unwrap();
        let p = dir.join("s.toml");
        fs::write(&p, "a = 1\n").unwrap();
        assert_eq!(read_text(&p).unwrap(), "a = 1\n");
        fs::write(&p, b"a = 1\nb = \"\xff\"\n").unwrap();
        let e = read_text(&p).unwrap_err().line(&p);
        assert!(
            e.ends_with(":2:6: the file is not UTF-8 text; save it as UTF-8"),
            "{e}"
        );
        assert_eq!(read_text(&dir.join("none.toml")), Err(ReadError::Missing));
        let e = read_text(&dir).unwrap_err().line(&dir);
        assert!(e.contains("not a regular file (it is a folder)"), "{e}");
        fs::remove_dir_all(&dir).unwrap();
    }
}
