//! Hostile inputs: every file in `tests/hostile/` is run through `kern calc` (torsion
//! on) in its own process under a watchdog. Each must finish within the watchdog's
//! bound, exit 0, 1 or 2 (never a panic or an abort), and print no terminal control
//! characters, whatever the file holds.
//!
//! A file states what it expects in comment lines at its top:
//!
//! ```toml
//! # exit: 2
//! # expect: not a regular file
//! # args: --json
//! ```
//!
//! `exit` is the status (default: any of 0, 1, 2); each `expect` is a substring that
//! must appear in stdout or stderr; `args` are extra arguments for `kern calc`.
//! The watchdog is a bound on hangs, not a speed target: the performance targets live
//! in `benches/`.

use std::io::Read;
use std::path::{Path, PathBuf};
use std::process::{Command, Stdio};
use std::time::{Duration, Instant};

/// How long one file may run before the watchdog calls it a hang (debug build, loaded
/// machine: generous on purpose).
const WATCHDOG: Duration = Duration::from_secs(60);

/// What a hostile file expects of its run.
#[derive(Default)]
struct Expect {
    exit: Option<i32>,
    contains: Vec<String>,
    args: Vec<String>,
}

fn expectations(text: &str) -> Expect {
    let mut e = Expect::default();
    for line in text.lines().take_while(|l| l.starts_with('#')) {
        let body = line.trim_start_matches('#').trim();
        if let Some(v) = body.strip_prefix("exit:") {
            e.exit = v.trim().parse().ok();
        } else if let Some(v) = body.strip_prefix("expect:") {
            e.contains.push(v.trim().to_string());
        } else if let Some(v) = body.strip_prefix("args:") {
            e.args.extend(v.split_whitespace().map(str::to_string));
        }
    }
    e
}

/// Runs `kern calc FILE` with a watchdog; `Err` says what went wrong.
fn run_one(path: &Path) -> Result<(), String> {
    let text =
        String::from_utf8_lossy(&std::fs::read(path).map_err(|e| e.to_string())?).into_owned();
    let want = expectations(&text);
    let mut child = Command::new(env!("CARGO_BIN_EXE_kern"))
        .arg("calc")
        .args(&want.args)
        .arg(path)
        .stdin(Stdio::null())
        .stdout(Stdio::piped())
        .stderr(Stdio::piped())
        .spawn()
        .map_err(|e| e.to_string())?;
    let mut out_pipe = child.stdout.take().expect("stdout piped");
    let mut err_pipe = child.stderr.take().expect("stderr piped");
    let out_reader = std::thread::spawn(move || {
        let mut v = Vec::new();
        let _ = out_pipe.read_to_end(&mut v);
        v
    });
    let err_reader = std::thread::spawn(move || {
        let mut v = Vec::new();
        let _ = err_pipe.read_to_end(&mut v);
        v
    });
    let start = Instant::now();
    let status = loop {
        if let Some(s) = child.try_wait().map_err(|e| e.to_string())? {
            break s;
        }
        if start.elapsed() > WATCHDOG {
            let _ = child.kill();
            let _ = child.wait();
            return Err(format!("still running after {WATCHDOG:?}: a hang"));
        }
        std::thread::sleep(Duration::from_millis(20));
    };
    let out = out_reader.join().unwrap_or_default();
    let err = err_reader.join().unwrap_or_default();
    let all = format!(
        "{}{}",
        String::from_utf8_lossy(&out),
        String::from_utf8_lossy(&err)
    );
    let code = status
        .code()
        .ok_or_else(|| format!("killed by a signal ({status}); output:\n{all}"))?;
    if all.contains("panicked") {
        return Err(format!("panicked:\n{all}"));
    }
    match want.exit {
        Some(w) if w != code => return Err(format!("exit {code}, expected {w}; output:\n{all}")),
        None if !(0..=2).contains(&code) => return Err(format!("exit {code}; output:\n{all}")),
        _ => {}
    }
    if let Some(c) = all
        .chars()
        .find(|&c| (c.is_control() && c != '\n' && c != '\t') || is_bidi(c))
    {
        return Err(format!("printed control character {:?}", c as u32));
    }
    for s in &want.contains {
        if !all.contains(s.as_str()) {
            return Err(format!("output lacks {s:?}; output:\n{all}"));
        }
    }
    Ok(())
}

/// Bidirectional overrides and isolates, which reorder what a terminal shows.
fn is_bidi(c: char) -> bool {
    matches!(c, '\u{202A}'..='\u{202E}' | '\u{2066}'..='\u{2069}' | '\u{200E}' | '\u{200F}')
}

fn hostile_files() -> Vec<PathBuf> {
    let dir = Path::new(env!("CARGO_MANIFEST_DIR")).join("tests/hostile");
    let mut v: Vec<PathBuf> = std::fs::read_dir(&dir)
        .expect("tests/hostile/")
        .filter_map(|e| e.ok())
        .map(|e| e.path())
        .filter(|p| p.extension().is_some_and(|x| x == "toml"))
        .collect();
    v.sort();
    v
}

#[test]
fn every_hostile_file_ends_cleanly() {
    let files = hostile_files();
    assert!(!files.is_empty(), "tests/hostile/ holds files");
    // Two at a time: the machine has two cores, and each file is its own process.
    let failures: Vec<String> = std::thread::scope(|s| {
        let chunks: Vec<_> = files.chunks(files.len().div_ceil(2)).collect();
        let handles: Vec<_> = chunks
            .into_iter()
            .map(|chunk| {
                s.spawn(move || {
                    chunk
                        .iter()
                        .filter_map(|p| {
                            run_one(p).err().map(|e| {
                                format!("{}: {e}", p.file_name().unwrap().to_string_lossy())
                            })
                        })
                        .collect::<Vec<_>>()
                })
            })
            .collect();
        handles
            .into_iter()
            .flat_map(|h| h.join().expect("watchdog thread"))
            .collect()
    });
    assert!(failures.is_empty(), "{}", failures.join("\n\n"));
}
