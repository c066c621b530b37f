//! From a section file to its analysis, shared by `kern calc` and the workbench:
//! reading within bounds ([`super::input::read_text`]), parsing ([`super::parse`]),
//! computing, and the one line an error prints as (`FILE:LINE:COLUMN: message`).

use super::input::read_text;
use super::{locate, parse};
use crate::analysis::{Analysis, Options};
use crate::model::Diagnostic;
use crate::text::clean;
use std::io::Write;
use std::path::Path;

/// Reads and computes a section from its file text.
pub fn analyse(text: &str, opts: &Options) -> Result<Analysis, Diagnostic> {
    Analysis::of_document(parse(text)?, opts)
}

/// Reads and analyses one file; the error is the line to print on stderr.
pub fn load(path: &Path, opts: &Options) -> Result<Analysis, String> {
    let text = read_text(path).map_err(|e| clean(&e.line(path)))?;
    analyse(&text, opts).map_err(|d| diagnostic_line(&path.display().to_string(), &text, &d))
}

/// `FILE:LINE:COLUMN: message`, cleaned for a terminal.
pub fn diagnostic_line(file: &str, text: &str, d: &Diagnostic) -> String {
    let (l, c) = locate(text, d.span.start);
    clean(&format!("{file}:{l}:{c}: {}", d.message))
}

/// Prints a line on stderr; a stderr that cannot be written to is ignored (there is
/// nowhere left to say so).
pub fn say(line: &str) {
    let _ = writeln!(std::io::stderr().lock(), "{line}");
}
