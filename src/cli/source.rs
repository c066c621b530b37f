//! A section file as the iterating verbs need it: its name, its text (to place an
//! error at `FILE:LINE:COLUMN`) and its document (to change a param without writing
//! the text again).

use crate::file::input::read_text;
use crate::file::load::diagnostic_line;
use crate::file::parse;
use crate::iterate::Failure;
use crate::model::{Diagnostic, Document};
use crate::text::clean;

use std::path::Path;

/// One section file, read and parsed.
pub struct Source {
    /// The name to print (the path as given).
    pub name: String,
    pub text: String,
    pub doc: Document,
}

impl Source {
    /// Reads and parses `path`; the error is the line to print (status 2).
    pub fn open(path: &Path) -> Result<Source, String> {
        let name = path.display().to_string();
        let text = read_text(path).map_err(|e| clean(&e.line(path)))?;
        Source::of_text(name, text)
    }

    /// A source from text read elsewhere (a git revision), named `name`.
    pub fn of_text(name: String, text: String) -> Result<Source, String> {
        let doc = parse(&text).map_err(|d| diagnostic_line(&name, &text, &d))?;
        Ok(Source { name, text, doc })
    }

    /// The line that says where and why `d` stands in this file.
    pub fn line(&self, d: &Diagnostic) -> String {
        diagnostic_line(&self.name, &self.text, d)
    }

    /// The line for a failed value of a param: `FILE:LINE:COLUMN: message (at NAME = X)`.
    pub fn failure_line(&self, f: &Failure, param: &str, x: f64) -> String {
        let at = format!("with {param} = {x}");
        clean(&match f {
            Failure::Invalid(d) => format!("{} ({at})", self.line(d)),
            other => format!("{}: {} ({at})", self.name, other.message()),
        })
    }

    /// `FILE: message`, cleaned.
    pub fn say_line(&self, message: &str) -> String {
        clean(&format!("{}: {message}", self.name))
    }
}

/// Result `q` of `a` as the views show it (output units, fractions in percent).
pub fn shown(
    q: &crate::report::rows::Quantity,
    a: &crate::analysis::Analysis,
    u: &crate::report::out::OutUnits,
) -> Option<f64> {
    match (q.get)(a) {
        crate::report::rows::Cell::Num(x) => Some(q.dim.shown(x, u)).filter(|v| v.is_finite()),
        _ => None,
    }
}

/// The heading of a result in a table: its symbol (or key) and unit, `Ixx [mm⁴]`.
pub fn heading(q: &crate::report::rows::Quantity, u: &crate::report::out::OutUnits) -> String {
    let name = q.name_in(u.notation);
    let unit = q.dim.label(u);
    if unit.is_empty() {
        name.to_string()
    } else {
        format!("{name} [{unit}]")
    }
}

/// A result named for a line of text: its symbol in `notation`, then the dotted key it
/// was asked by, `Ixx (inertia.xx)`; the key alone when it has no symbol of its own.
pub fn named(
    q: &crate::report::rows::Quantity,
    key: &str,
    notation: crate::report::rows::Notation,
) -> String {
    let symbol = q.symbol_in(notation);
    if q.shown() && symbol != key {
        format!("{symbol} ({key})")
    } else {
        key.to_string()
    }
}

/// The line a table in the y–z notation starts with, saying its axes and symbols (as
/// `kern calc`'s table says them); nothing in the default x–y notation.
pub fn notation_line(u: &crate::report::out::OutUnits) -> String {
    match u.notation {
        crate::report::rows::Notation::Xy => String::new(),
        n => format!("axes and symbols: {}\n", n.note()),
    }
}

/// The columns `s` takes on a terminal: its characters less the combining marks
/// (U+0300–U+036F), which sit on the one before (`x̄` is x and U+0304).
fn width(s: &str) -> usize {
    s.chars()
        .filter(|c| !('\u{300}'..='\u{36f}').contains(c))
        .count()
}

/// Text columns padded to their widths (counted in terminal columns), the first column and
/// those in `left` left-aligned, the rest right-aligned, two spaces apart.
pub fn columns(rows: &[Vec<String>]) -> String {
    columns_left(rows, &[])
}

/// [`columns`] with more left-aligned columns.
pub fn columns_left(rows: &[Vec<String>], left: &[usize]) -> String {
    let n = rows.iter().map(Vec::len).max().unwrap_or(0);
    let widths: Vec<usize> = (0..n)
        .map(|i| {
            rows.iter()
                .filter_map(|r| r.get(i))
                .map(|c| width(c))
                .max()
                .unwrap_or(0)
        })
        .collect();
    let mut out = String::new();
    for r in rows {
        let cells: Vec<String> = r
            .iter()
            .enumerate()
            .map(|(i, c)| {
                let pad = widths[i].saturating_sub(width(c));
                if i == 0 || left.contains(&i) {
                    format!("{c}{}", " ".repeat(pad))
                } else {
                    format!("{}{c}", " ".repeat(pad))
                }
            })
            .collect();
        out.push_str(cells.join("  ").trim_end());
        out.push('\n');
    }
    out
}
