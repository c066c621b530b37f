//! The command-line verbs behind `main.rs`: each takes parsed arguments, does its work
//! through the library and returns the process exit status (0 success, 2 an invalid
//! section file, 1 any other failure).

use crate::analysis::{Analysis, Options};
use crate::file::locate;
use crate::model::units::LengthUnit;
use crate::model::Diagnostic;
use crate::report::out::OutUnits;
use crate::report::{html, json::to_json, markdown, svg as drawing, table::to_table, CAUTION};
use crate::text::clean;
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

/// Reads and analyses one file; the error is the line to print on stderr.
pub fn load(path: &Path, opts: &Options) -> Result<Analysis, String> {
    let name = clean(&path.display().to_string());
    let bytes =
        std::fs::read(path).map_err(|e| format!("{name}:1:1: cannot read the file: {e}"))?;
    let text = String::from_utf8(bytes).map_err(|e| {
        let (l, c) = locate(
            &String::from_utf8_lossy(e.as_bytes()),
            e.utf8_error().valid_up_to(),
        );
        format!("{name}:{l}:{c}: the file is not UTF-8 text; save it as UTF-8")
    })?;
    Analysis::of_text(&text, opts).map_err(|d| diagnostic_line(&name, &text, &d))
}

/// `FILE:LINE:COLUMN: message`, cleaned for a terminal.
pub fn diagnostic_line(file: &str, text: &str, d: &Diagnostic) -> String {
    let (l, c) = locate(text, d.span.start);
    clean(&format!("{file}:{l}:{c}: {}", d.message))
}

/// Runs `f` over `items` on every core, keeping the input order of the results.
pub fn parallel_map<T: Sync, R: Send>(items: &[T], f: impl Fn(&T) -> R + Sync) -> Vec<R> {
    let workers = std::thread::available_parallelism()
        .map_or(1, |n| n.get())
        .min(items.len().max(1));
    let next = AtomicUsize::new(0);
    let mut slots: Vec<Option<R>> = Vec::new();
    slots.resize_with(items.len(), || None);
    let done: Vec<Vec<(usize, R)>> = std::thread::scope(|s| {
        let handles: Vec<_> = (0..workers)
            .map(|_| {
                s.spawn(|| {
                    let mut mine = Vec::new();
                    loop {
                        let i = next.fetch_add(1, Ordering::Relaxed);
                        let Some(item) = items.get(i) else { break };
                        mine.push((i, f(item)));
                    }
                    mine
                })
            })
            .collect();
        handles.into_iter().filter_map(|h| h.join().ok()).collect()
    });
    for (i, r) in done.into_iter().flatten() {
        slots[i] = Some(r);
    }
    slots.into_iter().flatten().collect()
}

/// `kern calc`: prints a table (or one JSON line) per file, in input order; invalid
/// files print `FILE:LINE:COLUMN: message` on stderr and make the status 2.
pub fn calc(args: &CalcArgs) -> i32 {
    let results = parallel_map(&args.files, |p| load(p, &args.options));
    let mut status = 0;
    let mut out = String::new();
    for (path, r) in args.files.iter().zip(results) {
        match r {
            Ok(a) => {
                let u = OutUnits::new(a.section.units, args.units);
                let name = path.display().to_string();
                if args.json {
                    out.push_str(&to_json(&name, &a, &u).to_string());
                    out.push('\n');
                } else {
                    if !out.is_empty() {
                        out.push('\n');
                    }
                    out.push_str(&to_table(&name, &a, &u));
                }
            }
            Err(line) => {
                eprintln!("{line}");
                status = 2;
            }
        }
    }
    if !args.json && !out.is_empty() {
        out.push('\n');
        out.push_str(CAUTION);
        out.push('\n');
    }
    print!("{out}");
    status
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
            eprintln!("{line}");
            return 2;
        }
    };
    let u = OutUnits::new(a.section.units, args.units);
    let md = markdown::sheet(&args.file.display().to_string(), &a, &u);
    let text = if args.html {
        let title = a.section.title.as_deref().unwrap_or("(untitled section)");
        html::page(title, &md, &drawing::drawing(&a, &u))
    } else {
        md
    };
    emit(args.out.as_deref(), &text)
}

/// `kern svg`: the drawing of one file, to `out` or stdout.
pub fn svg(file: &Path, out: Option<&Path>, options: &Options) -> i32 {
    match load(file, options) {
        Ok(a) => {
            let u = OutUnits::new(a.section.units, None);
            emit(out, &drawing::drawing(&a, &u))
        }
        Err(line) => {
            eprintln!("{line}");
            2
        }
    }
}

/// Writes `text` to the file `out`, or to stdout; a failure to write is status 1.
fn emit(out: Option<&Path>, text: &str) -> i32 {
    match out {
        None => {
            print!("{text}");
            0
        }
        Some(p) => match std::fs::write(p, text) {
            Ok(()) => 0,
            Err(e) => {
                eprintln!(
                    "{}: cannot write the file: {e}",
                    clean(&p.display().to_string())
                );
                1
            }
        },
    }
}
