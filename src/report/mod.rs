//! Views of an [`crate::analysis::Analysis`] for people and programs: the aligned
//! table of `kern calc`, the JSON of `kern calc --json`, the calculation sheet of
//! `kern report` (Markdown or HTML), the drawing of `kern svg`, and the output units
//! they share. Nothing here computes a property; [`composite`] only lays the
//! composite-area sums out part by part.

pub mod blocks;
pub mod composite;
pub mod html;
pub mod json;
pub mod markdown;
pub mod out;
pub mod rows;
pub mod svg;
pub mod table;
pub mod warnings;

/// The caution every report carries.
pub const CAUTION: &str =
    "Caution: section mechanics only. Verify every result against the governing local code; \
design decisions rest with a licensed engineer.";
