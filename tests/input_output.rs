//! `kern calc` on what is not a section file, and on outputs that fail: special files
//! (a device, a named pipe) and a file above the 64 MiB limit are refused before any
//! reading, with `FILE:1:1: …` and status 2; a closed pipe ends quietly (status 0, no
//! message); a full disk (`/dev/full`) says so with status 1. These files cannot be
//! committed, so they are made here; hostile files that can be are in `tests/hostile/`.

use std::io::Read;
use std::path::Path;
use std::process::{Command, Output, Stdio};
use std::time::{Duration, Instant};

#[path = "support/scratch.rs"]
mod support_scratch;
use support_scratch::scratch;

/// A bound on hangs (a debug build on a loaded machine), not a speed target.
const WATCHDOG: Duration = Duration::from_secs(60);

fn kern_cmd() -> Command {
    let mut c = Command::new(env!("CARGO_BIN_EXE_kern"));
    c.current_dir(env!("CARGO_MANIFEST_DIR"))
        .stdin(Stdio::null());
    c
}

/// Runs `kern ARGS` under the watchdog; a run past it kills the child and fails.
fn kern(args: &[&str]) -> Output {
    let mut child = kern_cmd()
        .args(args)
        .stdout(Stdio::piped())
        .stderr(Stdio::piped())
        .spawn()
        .expect("kern runs");
    let start = Instant::now();
    while child.try_wait().expect("wait").is_none() {
        if start.elapsed() > WATCHDOG {
            let _ = child.kill();
            let _ = child.wait();
            panic!("kern {args:?} still running after {WATCHDOG:?}");
        }
        std::thread::sleep(Duration::from_millis(10));
    }
    child.wait_with_output().expect("output")
}

fn refused(path: &Path, why: &str) {
    let p = path.to_str().unwrap();
    let out = kern(&["calc", "--json", p]);
    let err = String::from_utf8_lossy(&out.stderr);
    assert_eq!(out.status.code(), Some(2), "{err}");
    assert!(out.stdout.is_empty());
    assert!(err.starts_with(&format!("{p}:1:1: {why}")), "{err}");
}

#[cfg(unix)]
#[test]
fn a_device_is_refused() {
    refused(
        Path::new("/dev/zero"),
        "not a regular file (it is a device); give the path of a section file",
    );
}

#[cfg(unix)]
#[test]
fn a_named_pipe_without_a_writer_is_refused() {
    let dir = scratch("fifo");
    let fifo = dir.join("pipe.toml");
    let made = Command::new("mkfifo").arg(&fifo).status().expect("mkfifo");
    assert!(made.success());
    refused(&fifo, "not a regular file (it is a named pipe)");
    // Through a symbolic link too.
    let link = dir.join("link.toml");
    std::os::unix::fs::symlink(&fifo, &link).unwrap();
    refused(&link, "not a regular file (it is a named pipe)");
    std::fs::remove_dir_all(&dir).unwrap();
}

#[test]
fn a_file_above_64_mib_is_refused_unread() {
    let dir = scratch("large");
    let p = dir.join("huge.toml");
    // Sparse: 65 MiB long, no blocks written.
    let f = std::fs::File::create(&p).unwrap();
    f.set_len(65 * 1024 * 1024).unwrap();
    refused(
        &p,
        "the file is 65.0 MiB, more than the 64 MiB a section file may be",
    );
    std::fs::remove_dir_all(&dir).unwrap();
}

/// `kern calc … | head -c 10`: the reader goes away; kern stops quietly with status 0.
#[cfg(unix)]
#[test]
fn a_closed_pipe_ends_quietly() {
    let mut files = vec!["calc", "--no-torsion"];
    // Enough output to fill the pipe's buffer after the reader has gone.
    files.extend(std::iter::repeat_n("sections/crane-runway.toml", 60));
    let mut child = kern_cmd()
        .args(&files)
        .stdout(Stdio::piped())
        .stderr(Stdio::piped())
        .spawn()
        .unwrap();
    let mut first = [0u8; 10];
    child.stdout.take().unwrap().read_exact(&mut first).unwrap();
    // The read end is dropped here.
    let out = child.wait_with_output().unwrap();
    let err = String::from_utf8_lossy(&out.stderr);
    assert_eq!(out.status.code(), Some(0), "{err}");
    assert!(err.is_empty(), "{err}");
}

#[cfg(target_os = "linux")]
#[test]
fn a_full_disk_is_a_message_and_status_1() {
    for args in [
        &[
            "calc",
            "--json",
            "--no-torsion",
            "sections/garage-lintel.toml",
        ][..],
        &["svg", "--no-torsion", "sections/garage-lintel.toml"],
        &["keys"],
    ] {
        let out = kern_cmd()
            .args(args)
            .stdout(std::fs::File::create("/dev/full").unwrap())
            .output()
            .unwrap();
        let err = String::from_utf8_lossy(&out.stderr);
        assert_eq!(out.status.code(), Some(1), "{args:?}: {err}");
        assert!(
            err.starts_with("kern: cannot write the output: No space left on device"),
            "{args:?}: {err}"
        );
    }
}
