//! Views of an [`crate::analysis::Analysis`] for people and programs: the aligned
//! table of `kern calc`, the JSON of `kern calc --json`, and the output units they
//! share. Nothing here computes a property.

pub mod json;
pub mod out;
pub mod rows;
pub mod table;

/// The caution every report carries.
pub const CAUTION: &str =
    "Caution: section mechanics only. Verify every result against the governing local code; \
design decisions rest with a licensed engineer.";
