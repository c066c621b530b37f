//! Section files on disk and in text: reading TOML into a [`crate::model::Document`]
//! with the place of every value ([`read`], over the tree of [`tree`] that the strict
//! parser of the common subset ([`strict`]) or `toml_edit` fills), turning byte offsets into line and
//! column ([`locate`]), editing text in place keeping its layout ([`edit`]), reading a
//! file's text within bounds ([`input`]), from a file to its analysis and the line
//! an error prints as ([`load`]), saving atomically and securely ([`save`]) and
//! the recovery copy of unsaved edits ([`recover`]); a file at a git revision
//! ([`git`]).

pub mod edit;
pub mod git;
pub mod input;
pub mod load;
pub mod read;
pub mod recover;
pub mod save;
pub mod strict;
pub mod tree;

pub use read::parse;

/// Line and column (both from 1, columns counted in characters) of a byte offset.
///
/// ```
/// assert_eq!(kern::file::locate("a = 1\nbb = 2\n", 8), (2, 3));
/// ```
pub fn locate(text: &str, offset: usize) -> (usize, usize) {
    let mut off = offset.min(text.len());
    while !text.is_char_boundary(off) {
        off -= 1;
    }
    let before = &text[..off];
    let line = before.matches('\n').count() + 1;
    let col = before.rsplit('\n').next().map_or(0, |l| l.chars().count()) + 1;
    (line, col)
}
