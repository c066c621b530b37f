//! Any bytes as a section file, with torsion on: the reader, the properties and the
//! finite-element torsion (its budget bounds the mesh and the memory) must refuse or
//! accept them, never panic, hang or abort.
#![no_main]

use kern::analysis::{Analysis, Options};
use kern::fe::TorsionOptions;
use libfuzzer_sys::fuzz_target;

fuzz_target!(|data: &[u8]| {
    if let Ok(text) = std::str::from_utf8(data) {
        // A looser tolerance than the default keeps each run short; the budget is the
        // solver's own.
        let opts = Options {
            torsion: Some(TorsionOptions {
                tol: 1e-2,
                ..TorsionOptions::default()
            }),
            ..Options::default()
        };
        if let Err(d) = kern::file::load::analyse(text, &opts) {
            let _ = kern::file::locate(text, d.span.start);
        }
    }
});
