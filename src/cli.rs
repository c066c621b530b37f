//! The command-line verbs behind `main.rs`: each takes parsed arguments, does its work
//! through the library and returns the process exit status (0 success, 2 an invalid
//! section file, 1 any other failure).

use crate::analysis::Options;
pub use crate::file::load::{diagnostic_line, load, say};
use crate::model::units::LengthUnit;
use crate::report::out::OutUnits;
use crate::report::{html, json::to_json, markdown, svg as drawing, table::to_table, CAUTION};
use crate::text::clean;
use std::io::{ErrorKind, Write};
use std::panic::{catch_unwind, AssertUnwindSafe};
use std::path::{Path, PathBuf};
use std::sync::atomic::{AtomicUsize, Ordering};

/// Options of `kern calc`.
#[derive(Debug, Clone, Default)]
pub struct CalcArgs {
    pub files: Vec<PathBuf>,
    pub json: bool,
    pub units: Option<LengthUnit>,
    pub options: Options,
}

/// The most worker threads `KERN_JOBS` may ask for.
const MAX_JOBS: usize = 256;

/// Worker threads for a batch: `KERN_JOBS` when it is a whole number from 1 to
/// [`MAX_JOBS`], else every core this process may run on.
fn jobs() -> usize {
    std::env::var("KERN_JOBS")
        .ok()
        .and_then(|s| s.trim().parse::<usize>().ok())
        .filter(|n| (1..=MAX_JOBS).contains(n))
        .unwrap_or_else(|| std::thread::available_parallelism().map_or(1, |n| n.get()))
}

/// Runs `f` over `items` on [`jobs`] threads, keeping the input order of the results.
/// A panic in `f` is caught for its item alone: that slot holds the panic's message.
pub fn parallel_map<T: Sync, R: Send>(
    items: &[T],
    f: impl Fn(&T) -> R + Sync,
) -> Vec<Result<R, String>> {
    let workers = jobs().min(items.len().max(1));
    if workers == 1 {
        // One worker: this thread (a thread of its own costs more than a small file).
        return items
            .iter()
            .map(|item| {
                catch_unwind(AssertUnwindSafe(|| f(item))).map_err(|p| panic_message(p.as_ref()))
            })
            .collect();
    }
    let next = AtomicUsize::new(0);
    let mut slots: Vec<Option<Result<R, String>>> = Vec::new();
    slots.resize_with(items.len(), || None);
    let done: Vec<Vec<(usize, Result<R, String>)>> = std::thread::scope(|s| {
        let handles: Vec<_> = (0..workers)
            .map(|_| {
                s.spawn(|| {
                    let mut mine = Vec::new();
                    loop {
                        let i = next.fetch_add(1, Ordering::Relaxed);
                        let Some(item) = items.get(i) else { break };
                        let r = catch_unwind(AssertUnwindSafe(|| f(item)));
                        mine.push((i, r.map_err(|p| panic_message(p.as_ref()))));
                    }
                    mine
                })
            })
            .collect();
        // Every panic is caught above, so a worker always returns its results.
        handles.into_iter().filter_map(|h| h.join().ok()).collect()
    });
    for (i, r) in done.into_iter().flatten() {
        slots[i] = Some(r);
    }
    slots
        .into_iter()
        .map(|s| s.unwrap_or_else(|| Err("the worker thread stopped".into())))
        .collect()
}

/// The text of a panic's payload.
fn panic_message(payload: &(dyn std::any::Any + Send)) -> String {
    payload
        .downcast_ref::<&str>()
        .map(|s| s.to_string())
        .or_else(|| payload.downcast_ref::<String>().cloned())
        .unwrap_or_else(|| "a panic".into())
}

/// Writes `text` to stdout: status 0, also when the reader has gone (a closed pipe, as
/// with `| head`: the rest is not wanted); any other failure to write is a message on
/// stderr and status 1.
pub fn print_out(text: &str) -> i32 {
    print_all([text])
}

/// Writes `texts` one after the other to stdout through one buffer, as [`print_out`].
fn print_all<'a>(texts: impl IntoIterator<Item = &'a str>) -> i32 {
    let mut out = std::io::BufWriter::new(std::io::stdout().lock());
    let written = texts
        .into_iter()
        .try_for_each(|t| out.write_all(t.as_bytes()))
        .and_then(|()| out.flush());
    match written {
        Ok(()) => 0,
        Err(e) if e.kind() == ErrorKind::BrokenPipe => 0,
        Err(e) => {
            say(&format!("kern: cannot write the output: {e}"));
            1
        }
    }
}

/// `kern calc`: prints a table (or one JSON line) per file, in input order; invalid
/// files print `FILE:LINE:COLUMN: message` on stderr and make the status 2; a file whose
/// analysis failed inside kern prints `FILE: internal error: …` and makes the status 1
/// (which wins over 2: it is kern's fault, not the file's). Each worker thread lays out
/// the files it computed.
pub fn calc(args: &CalcArgs) -> i32 {
    let results = parallel_map(&args.files, |p| calc_one(args, p));
    let done = calc_output(args, results);
    for line in &done.errors {
        say(line);
    }
    let caution = (!args.json && !done.out.is_empty()).then_some(["\n", CAUTION, "\n"]);
    let texts = done.out.iter().map(String::as_str);
    match print_all(texts.chain(caution.into_iter().flatten())) {
        0 => done.status,
        failed => failed,
    }
}

/// One file of `kern calc`: its JSON line or table, or the line its error prints as.
fn calc_one(args: &CalcArgs, path: &Path) -> Result<String, String> {
    let a = load(path, &args.options)?;
    let u = OutUnits::new(a.section.units, args.units);
    let name = path.display().to_string();
    Ok(if args.json {
        let mut line = to_json(&name, &a, &u).to_string();
        line.push('\n');
        line
    } else {
        to_table(&name, &a, &u)
    })
}

/// What `kern calc` prints and returns: the texts of the files that computed, in
/// order (tables separated by a blank line), the error lines, and the status.
struct CalcOutput {
    out: Vec<String>,
    errors: Vec<String>,
    status: i32,
}

/// Lays out the results of `kern calc`, one per file of `args.files` in order.
fn calc_output(
    args: &CalcArgs,
    results: Vec<Result<Result<String, String>, String>>,
) -> CalcOutput {
    let mut done = CalcOutput {
        out: Vec::new(),
        errors: Vec::new(),
        status: 0,
    };
    for (path, r) in args.files.iter().zip(results) {
        match r {
            Err(panic) => {
                done.errors.push(format!(
                    "{}: internal error: {panic}; please report it with this file",
                    path.display()
                ));
                done.status = 1;
            }
            Ok(Ok(mut text)) => {
                if !args.json && !done.out.is_empty() {
                    text.insert(0, '\n');
                }
                done.out.push(text);
            }
            Ok(Err(line)) => {
                done.errors.push(line);
                if done.status == 0 {
                    done.status = 2;
                }
            }
        }
    }
    done
}

/// Options of `kern report`.
#[derive(Debug, Clone, Default)]
pub struct ReportArgs {
    pub file: PathBuf,
    /// Where to write; stdout when `None`.
    pub out: Option<PathBuf>,
    /// A self-contained HTML page instead of Markdown.
    pub html: bool,
    pub units: Option<LengthUnit>,
    pub options: Options,
}

/// `kern report`: the calculation sheet of one file, Markdown or HTML.
pub fn report(args: &ReportArgs) -> i32 {
    let a = match load(&args.file, &args.options) {
        Ok(a) => a,
        Err(line) => {
            say(&line);
            return 2;
        }
    };
    let u = OutUnits::new(a.section.units, args.units);
    let blocks = markdown::blocks(&args.file.display().to_string(), &a, &u);
    let text = if args.html {
        let title = a.section.title.as_deref().unwrap_or("(untitled section)");
        html::page(title, &blocks, &drawing::drawing(&a, &u))
    } else {
        crate::report::blocks::markdown(&blocks)
    };
    emit(args.out.as_deref(), &text)
}

/// `kern svg`: the drawing of one file, to `out` or stdout, labelled in `units` (the
/// file's own unit when `None`).
pub fn svg(file: &Path, out: Option<&Path>, units: Option<LengthUnit>, options: &Options) -> i32 {
    match load(file, options) {
        Ok(a) => {
            let u = OutUnits::new(a.section.units, units);
            emit(out, &drawing::drawing(&a, &u))
        }
        Err(line) => {
            say(&line);
            2
        }
    }
}

/// Writes `text` to the file `out`, or to stdout; a failure to write is status 1.
fn emit(out: Option<&Path>, text: &str) -> i32 {
    match out {
        None => print_out(text),
        Some(p) => match std::fs::write(p, text) {
            Ok(()) => 0,
            Err(e) => {
                say(&clean(&format!(
                    "{}: cannot write the file: {e}",
                    p.display()
                )));
                1
            }
        },
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    /// A panic on one item is that item's error alone: every other result keeps its place.
    #[test]
    fn a_panicking_item_keeps_every_result_in_place() {
        let items: Vec<usize> = (0..40).collect();
        let r = parallel_map(&items, |&i| {
            if i == 2 || i == 17 {
                panic!("injected on item {i}");
            }
            i * 10
        });
        assert_eq!(r.len(), items.len());
        for (i, x) in r.iter().enumerate() {
            match x {
                Ok(v) => assert_eq!(*v, i * 10),
                Err(m) => {
                    assert!(i == 2 || i == 17, "item {i} failed: {m}");
                    assert_eq!(m, &format!("injected on item {i}"));
                }
            }
        }
        assert_eq!(r.iter().filter(|x| x.is_err()).count(), 2);
    }

    /// `kern calc` over five files whose analysis panics on the third: the others print
    /// under their own names, the third says `FILE: internal error`, and the status is 1.
    #[test]
    fn calc_names_every_result_right_after_a_panic() {
        let dir = std::env::temp_dir().join(format!("kern-batch-{}", std::process::id()));
        std::fs::create_dir_all(&dir).unwrap();
        let files: Vec<PathBuf> = (0..5)
            .map(|i| dir.join(format!("plate-{i}.toml")))
            .collect();
        for (i, f) in files.iter().enumerate() {
            let b = 100 * (i + 1);
            let text = format!(
                "format = 1\nunits = \"mm\"\n[[parts]]\nshape = \"rect\"\nb = {b}\nh = 10\n"
            );
            std::fs::write(f, text).unwrap();
        }
        let args = CalcArgs {
            files: files.clone(),
            json: true,
            ..CalcArgs::default()
        };
        let results = parallel_map(&files, |p| {
            if p == &files[2] {
                panic!("injected");
            }
            calc_one(&args, p)
        });
        let done = calc_output(&args, results);
        assert_eq!(done.status, 1);
        assert_eq!(
            done.errors,
            vec![format!(
                "{}: internal error: injected; please report it with this file",
                files[2].display()
            )]
        );
        let lines: Vec<serde_json::Value> = done
            .out
            .concat()
            .lines()
            .map(|l| serde_json::from_str(l).unwrap())
            .collect();
        assert_eq!(lines.len(), 4);
        for (v, i) in lines.iter().zip([0, 1, 3, 4]) {
            assert_eq!(v["file"], files[i].display().to_string());
            // A = b·h of a rectangle (Gere & Goodno, App. E case 1).
            assert_eq!(
                v["area"].as_f64(),
                Some(100.0 * (i as f64 + 1.0) * 10.0),
                "{v}"
            );
        }
        std::fs::remove_dir_all(&dir).unwrap();
    }
}
