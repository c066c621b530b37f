//! Any bytes as a section file: the reader and the calculation (without torsion) must
//! refuse or accept them, never panic; and the strict TOML parser must give up or build
//! exactly the tree toml_edit builds.
#![no_main]

use kern::analysis::{Analysis, Options};
use libfuzzer_sys::fuzz_target;

fuzz_target!(|data: &[u8]| {
    if let Ok(text) = std::str::from_utf8(data) {
        if let Some(tree) = kern::file::strict::parse(text) {
            assert_eq!(kern::file::read::full_tree(text).ok().as_ref(), Some(&tree));
        }
        if let Err(d) = kern::file::load::analyse(text, &Options::default()) {
            let _ = kern::file::locate(text, d.span.start);
        }
    }
});
