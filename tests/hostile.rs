//! Hostile inputs: every file in `tests/hostile/` is run through `kern calc` (torsion
//! on) in its own process under a watchdog. Each must finish within the watchdog's
//! bound, exit 0, 1 or 2 (never a panic or an abort), and print no terminal control
//! characters, whatever the file holds. Every file that calculates is also run through
//! `kern report`, `kern report --html` and `kern svg`: no control characters, no raw HTML
//! from the file in the Markdown, and well-formed XML in the drawing and the page.
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

/// What one run printed and how it ended.
struct Run {
    code: i32,
    out: String,
    err: String,
}

/// Runs `kern ARGS...` with a watchdog; `Err` says what went wrong.
fn run_kern(args: &[&std::ffi::OsStr]) -> Result<Run, String> {
    let mut child = Command::new(env!("CARGO_BIN_EXE_kern"))
        .args(args)
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
    let out = String::from_utf8_lossy(&out_reader.join().unwrap_or_default()).into_owned();
    let err = String::from_utf8_lossy(&err_reader.join().unwrap_or_default()).into_owned();
    let code = status
        .code()
        .ok_or_else(|| format!("killed by a signal ({status}); output:\n{out}{err}"))?;
    if format!("{out}{err}").contains("panicked") {
        return Err(format!("panicked:\n{out}{err}"));
    }
    Ok(Run { code, out, err })
}

/// The first character a terminal would act on (or reorder by), if any.
fn control_char(text: &str) -> Option<char> {
    text.chars()
        .find(|&c| (c.is_control() && c != '\n' && c != '\t') || is_bidi(c))
}

/// Runs `kern calc FILE` with a watchdog; `Err` says what went wrong.
fn run_one(path: &Path) -> Result<(), String> {
    let text =
        String::from_utf8_lossy(&std::fs::read(path).map_err(|e| e.to_string())?).into_owned();
    let want = expectations(&text);
    let mut args: Vec<&std::ffi::OsStr> = vec!["calc".as_ref()];
    args.extend(want.args.iter().map(std::ffi::OsStr::new));
    args.push(path.as_os_str());
    let run = run_kern(&args)?;
    let code = run.code;
    let all = format!("{}{}", run.out, run.err);
    match want.exit {
        Some(w) if w != code => return Err(format!("exit {code}, expected {w}; output:\n{all}")),
        None if !(0..=2).contains(&code) => return Err(format!("exit {code}; output:\n{all}")),
        _ => {}
    }
    if let Some(c) = control_char(&all) {
        return Err(format!("printed control character {:?}", c as u32));
    }
    for s in &want.contains {
        if !all.contains(s.as_str()) {
            return Err(format!("output lacks {s:?}; output:\n{all}"));
        }
    }
    Ok(())
}

/// Runs `kern report`, `kern report --html` and `kern svg` on a file that calculates:
/// no control characters in any of them, no raw HTML from the file in the Markdown,
/// and the SVG (alone and inside the page) well-formed XML.
fn report_one(path: &Path) -> Result<(), String> {
    let p = path.as_os_str();
    if run_kern(&["calc".as_ref(), p])?.code != 0 {
        return Ok(());
    }
    let md = run_kern(&["report".as_ref(), p])?;
    let html = run_kern(&["report".as_ref(), "--html".as_ref(), p])?;
    let svg = run_kern(&["svg".as_ref(), p])?;
    for (verb, r) in [("report", &md), ("report --html", &html), ("svg", &svg)] {
        if r.code != 0 {
            return Err(format!("{verb}: exit {}; {}", r.code, r.err));
        }
        if let Some(c) = control_char(&format!("{}{}", r.out, r.err)) {
            return Err(format!("{verb}: printed control character {:?}", c as u32));
        }
    }
    for tag in ["<script", "<img", "<SCRIPT"] {
        if md.out.contains(tag) {
            return Err(format!("report: raw HTML {tag:?} from the file"));
        }
    }
    well_formed(&svg.out).map_err(|e| format!("svg: not well-formed XML: {e}"))?;
    let body = html
        .out
        .split_once("<body>")
        .and_then(|(_, b)| b.split_once("</body>"))
        .map(|(b, _)| b)
        .ok_or("report --html: no <body>…</body>")?;
    well_formed(&format!("<body>{body}</body>")).map_err(|e| format!("report --html: {e}"))?;
    Ok(())
}

/// A small well-formedness check of XML 1.0 (enough for what kern writes): only
/// allowed characters, `&` only in the five predefined references or a numeric one,
/// quoted attributes, and every element closed in order. Comments, `<?…?>` and
/// `<!DOCTYPE …>` are skipped. The rules are those of the XML 1.0 specification
/// (W3C, 5th edition, sections 2.2 Characters, 2.4 Character Data, 3.1 Tags).
fn well_formed(x: &str) -> Result<(), String> {
    if let Some(c) = x.chars().find(|&c| {
        !matches!(c, '\t' | '\n' | '\r' | '\u{20}'..='\u{d7ff}' | '\u{e000}'..='\u{fffd}' | '\u{10000}'..)
    }) {
        return Err(format!("character {:?} is not allowed", c as u32));
    }
    let mut stack: Vec<&str> = Vec::new();
    let mut rest = x;
    while let Some(i) = rest.find(['<', '&']) {
        rest = &rest[i..];
        if rest.starts_with('&') {
            let end = rest.find(';').ok_or("& without ;")?;
            let name = &rest[1..end];
            let ok = ["amp", "lt", "gt", "quot", "apos"].contains(&name)
                || name.strip_prefix('#').is_some_and(|n| {
                    n.strip_prefix('x').map_or_else(
                        || n.parse::<u32>().is_ok(),
                        |h| u32::from_str_radix(h, 16).is_ok(),
                    )
                });
            if !ok {
                return Err(format!("bad reference &{name};"));
            }
            rest = &rest[end + 1..];
            continue;
        }
        for (open, close) in [("<!--", "-->"), ("<?", "?>"), ("<!", ">")] {
            if let Some(r) = rest.strip_prefix(open) {
                let end = r.find(close).ok_or(format!("{open} not closed"))?;
                rest = &r[end + close.len()..];
                break;
            }
        }
        if !rest.starts_with('<') {
            continue;
        }
        let end = rest.find('>').ok_or("< without >")?;
        let tag = &rest[1..end];
        rest = &rest[end + 1..];
        if let Some(name) = tag.strip_prefix('/') {
            match stack.pop() {
                Some(open) if open == name.trim() => {}
                other => return Err(format!("</{name}> closes {other:?}")),
            }
            continue;
        }
        let self_closing = tag.ends_with('/');
        let tag = tag.trim_end_matches('/');
        let name = tag.split_whitespace().next().ok_or("empty tag")?;
        if tag.contains('<') || !tag.matches('"').count().is_multiple_of(2) {
            return Err(format!("bad attributes in <{tag}>"));
        }
        // HTML void elements the page writes.
        if !self_closing && !["meta", "br", "hr"].contains(&name) {
            stack.push(name);
        }
    }
    match stack.last() {
        None => Ok(()),
        Some(open) => Err(format!("<{open}> not closed")),
    }
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
    on_two_cores(run_one);
}

#[test]
fn every_hostile_file_reports_cleanly() {
    on_two_cores(report_one);
}

#[test]
fn the_well_formedness_check_rejects_what_it_should() {
    assert!(well_formed("<svg><text a=\"1\">x &amp; y</text></svg>").is_ok());
    assert!(well_formed("<svg><text>\u{1}</text></svg>").is_err());
    assert!(well_formed("<svg><text>a & b</text></svg>").is_err());
    assert!(well_formed("<svg><title><script></title></svg>").is_err());
}

/// Runs `check` over every hostile file, two files at a time, and fails with every
/// file's complaint.
fn on_two_cores(check: fn(&Path) -> Result<(), String>) {
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
                            check(p).err().map(|e| {
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

/// A cycle through 10,000 params once printed a 90 KB line: the message shows the first
/// few names and the count. The file (about 200 KB) is written to a temporary folder.
#[test]
fn a_long_param_cycle_gives_a_short_message() {
    let n = 10_000;
    let mut text = String::from("format = 1\nunits = \"mm\"\n[params]\n");
    for i in 0..n {
        text.push_str(&format!("p{i} = \"p{} + 1\"\n", (i + 1) % n));
    }
    text.push_str("[[parts]]\nshape = \"rect\"\nb = \"p0\"\nh = 10\n");
    let dir = std::env::temp_dir().join(format!("kern-hostile-{}", std::process::id()));
    std::fs::create_dir_all(&dir).expect("temporary folder");
    let path = dir.join("long-cycle.toml");
    std::fs::write(&path, text).expect("write the file");
    let run = run_kern(&["calc".as_ref(), path.as_os_str()]);
    let _ = std::fs::remove_dir_all(&dir);
    let run = run.expect("kern calc runs");
    assert_eq!(run.code, 2, "{}", run.err);
    assert!(
        run.err.contains("(10000 params in the cycle)"),
        "{}",
        run.err
    );
    assert!(run.err.len() < 300, "{} bytes: {}", run.err.len(), run.err);
}
