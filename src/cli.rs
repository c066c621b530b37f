//! The command-line verbs behind `main.rs`: each takes parsed arguments, does its work
//! through the library and returns the process exit status (0 success, 2 an invalid
//! section file, 1 any other failure).

pub mod check;
pub mod diff;
pub mod seek;
pub mod sensitivity;
mod source;
pub mod sweep;

use crate::analysis::Options;
pub use crate::file::load::{diagnostic_line, load, say};
use crate::file::save::{save, Overwrite, SaveError};
use crate::model::units::LengthUnit;
use crate::numfmt::Numbers;
use crate::parallel::parallel_for_each as for_each_in_order;
pub use crate::parallel::parallel_map;
use crate::report::out::OutUnits;
use crate::report::rows::Notation;
use crate::report::{html, json::to_json, markdown, svg as drawing, table::to_table, CAUTION};
use crate::text::clean;
use std::io::{ErrorKind, Write};
use std::path::{Path, PathBuf};

/// How a verb writes numbers and symbols for people (`--numbers`, `--notation`, read
/// once in `main.rs` for every verb). JSON and CSV ignore both: they take values as
/// they stand and name results by their dotted keys.
#[derive(Debug, Clone, Copy, Default, PartialEq)]
pub struct Written {
    pub numbers: Numbers,
    pub notation: Notation,
}

impl Written {
    /// Output units for a section in `file`'s length unit (or `wanted`), written so.
    pub fn units(self, file: LengthUnit, wanted: Option<LengthUnit>) -> OutUnits {
        OutUnits::new(file, wanted).written(self.numbers, self.notation)
    }
}

/// Options of `kern calc`.
#[derive(Debug, Clone, Default)]
pub struct CalcArgs {
    pub files: Vec<PathBuf>,
    pub json: bool,
    pub units: Option<LengthUnit>,
    /// How the table writes numbers and symbols.
    pub written: Written,
    pub options: Options,
}

/// Writes `text` to stdout: status 0, also when the reader has gone (a closed pipe, as
/// with `| head`: the rest is not wanted); any other failure to write is a message on
/// stderr and status 1.
pub fn print_out(text: &str) -> i32 {
    print_all([text])
}

/// Writes `text` as [`print_out`] and gives the verb's own exit `status`, unless the
/// writing failed.
pub fn print_then(text: &str, status: i32) -> i32 {
    match print_out(text) {
        0 => status,
        failed => failed,
    }
}

/// Ends a verb's readable output with the caution, after a blank line.
pub fn push_caution(out: &mut String) {
    out.push('\n');
    out.push_str(CAUTION);
    out.push('\n');
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
        Err(e) => write_failed(&e, say),
    }
}

/// The status of output that could not be written: 0 when the reader has gone (a
/// closed pipe), else 1 with a message through `say`.
fn write_failed(e: &std::io::Error, mut say: impl FnMut(&str)) -> i32 {
    if e.kind() == ErrorKind::BrokenPipe {
        0
    } else {
        say(&format!("kern: cannot write the output: {e}"));
        1
    }
}

/// The bytes `kern calc` gathers before it writes to stdout: some fifty JSON lines of
/// a usual section (a write is a system call).
const OUT_BUFFER: usize = 64 * 1024;

/// `kern calc`: prints a table (or one JSON line) per file, in input order, each as
/// soon as it and the files before it are done (at most [`crate::parallel::WINDOW`]
/// wait, so a huge batch stays in bounded memory); invalid files print
/// `FILE:LINE:COLUMN: message` on stderr and make the status 2; a file whose analysis
/// failed inside kern prints `FILE: internal error: …` and makes the status 1 (which
/// wins over 2: it is kern's fault, not the file's). Each worker thread lays out the
/// files it computed; the calling thread writes them through one buffered, locked
/// stdout. When the output cannot be written (the reader has gone) no more files are
/// started.
pub fn calc(args: &CalcArgs) -> i32 {
    let out = std::io::BufWriter::with_capacity(OUT_BUFFER, std::io::stdout().lock());
    calc_into(args, |p| calc_one(args, p), out, say)
}

/// [`calc`] with each file's work `one`, the output `out` and the error lines to `say`.
fn calc_into(
    args: &CalcArgs,
    one: impl Fn(&PathBuf) -> Result<String, String> + Sync,
    mut out: impl Write,
    mut say: impl FnMut(&str),
) -> i32 {
    let mut status = 0;
    let mut printed = false;
    let mut failed = None;
    for_each_in_order(&args.files, one, |i, r| {
        match r {
            Err(panic) => {
                say(&format!(
                    "{}: internal error: {panic}; please report it with this file",
                    args.files[i].display()
                ));
                status = 1;
            }
            Ok(Err(line)) => {
                say(&line);
                if status == 0 {
                    status = 2;
                }
            }
            Ok(Ok(text)) => {
                // Tables are separated by a blank line.
                let gap = if !args.json && printed { "\n" } else { "" };
                printed = true;
                if let Err(e) = out
                    .write_all(gap.as_bytes())
                    .and_then(|()| out.write_all(text.as_bytes()))
                {
                    failed = Some(e);
                    return false;
                }
            }
        }
        true
    });
    let caution = if !args.json && printed {
        ["\n", CAUTION, "\n"].concat()
    } else {
        String::new()
    };
    let written = match failed {
        Some(e) => Err(e),
        None => out.write_all(caution.as_bytes()).and_then(|()| out.flush()),
    };
    match written {
        Ok(()) => status,
        Err(e) => match write_failed(&e, say) {
            0 => status,
            failed => failed,
        },
    }
}

/// One file of `kern calc`: its JSON line or table, or the line its error prints as.
fn calc_one(args: &CalcArgs, path: &Path) -> Result<String, String> {
    let a = load(path, &args.options)?;
    let u = args.written.units(a.section.units, args.units);
    let name = path.display().to_string();
    Ok(if args.json {
        let mut line = to_json(&name, &a, &u);
        line.push('\n');
        line
    } else {
        to_table(&name, &a, &u)
    })
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
    pub written: Written,
    pub options: Options,
    /// A table of the sensitivities of this result (a dotted JSON key) to every param.
    pub sensitivity: Option<String>,
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
    let u = args.written.units(a.section.units, args.units);
    let mut blocks = markdown::blocks(&args.file.display().to_string(), &a, &u);
    if let Some(key) = &args.sensitivity {
        match sensitivity::sheet_blocks(&a.document, key, &args.options, args.written) {
            // Before the closing caution.
            Ok(table) => {
                let at = blocks.len().saturating_sub(1);
                blocks.splice(at..at, table);
            }
            Err(m) => {
                say(&clean(&format!(
                    "{}: --sensitivity: {m}",
                    args.file.display()
                )));
                return 2;
            }
        }
    }
    let picture = drawing::drawing(&a, &u);
    if args.html {
        let title = a.section.title.as_deref().unwrap_or("(untitled section)");
        return emit(args.out.as_deref(), &html::page(title, &blocks, &picture));
    }
    // A Markdown sheet written to a file gets its drawing beside it, linked by name;
    // the drawing is written first, so the link never points at nothing.
    if let Some(out) = args.out.as_deref() {
        let svg = out.with_extension("svg");
        if svg == out {
            say(&clean(&format!(
                "{}: a Markdown sheet cannot be named .svg (its drawing is written beside it \
under that name); name it .md",
                out.display()
            )));
            return 1;
        }
        let status = emit(Some(&svg), &picture);
        if status != 0 {
            return status;
        }
        let name = svg.file_name().map(|n| n.to_string_lossy().into_owned());
        crate::report::blocks::link_drawing(&mut blocks, &name.unwrap_or_default());
    }
    emit(
        args.out.as_deref(),
        &crate::report::blocks::markdown(&blocks),
    )
}

/// `kern svg`: the drawing of one file, to `out` or stdout, labelled in `units` (the
/// file's own unit when `None`) with numbers and symbols written as `written` says.
pub fn svg(
    file: &Path,
    out: Option<&Path>,
    units: Option<LengthUnit>,
    written: Written,
    options: &Options,
) -> i32 {
    match load(file, options) {
        Ok(a) => {
            let u = written.units(a.section.units, units);
            emit(out, &drawing::drawing(&a, &u))
        }
        Err(line) => {
            say(&line);
            2
        }
    }
}

/// Writes `text` to the file `out` (an atomic, secure save: [`save`]), or to stdout; a
/// failure to write is status 1. A read-only file is refused, never replaced.
fn emit(out: Option<&Path>, text: &str) -> i32 {
    match out {
        None => print_out(text),
        Some(p) => match save(p, text, Overwrite::Writable) {
            Ok(saved) => {
                if let Some(w) = saved.warning {
                    say(&clean(&format!("{}: {w}", p.display())));
                }
                0
            }
            Err(SaveError::ReadOnly(_)) => {
                say(&clean(&format!(
                    "{}: the file is read-only; kern does not replace it (make it writable or \
choose another name with -o)",
                    p.display()
                )));
                1
            }
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
        let mut out = Vec::new();
        let mut errors = Vec::new();
        let status = calc_into(
            &args,
            |p| {
                if p == &files[2] {
                    panic!("injected");
                }
                calc_one(&args, p)
            },
            &mut out,
            |l| errors.push(l.to_string()),
        );
        assert_eq!(status, 1);
        assert_eq!(
            errors,
            vec![format!(
                "{}: internal error: injected; please report it with this file",
                files[2].display()
            )]
        );
        let lines: Vec<serde_json::Value> = String::from_utf8(out)
            .unwrap()
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
