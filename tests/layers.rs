//! The layering rule of DEVELOPERS.md ("Layers"), kept by a scan: every `crate::NAME`
//! in code under src/ (comments and string literals left out) names a module at or
//! below the layer of the module it is written in. Data flows one way, so no module
//! names one above it, and two modules on one layer (tui and cli) do not name each
//! other.

use std::fs;
use std::path::{Path, PathBuf};

/// The layers, low to high. `text` (the sanitiser) is a leaf every module may use.
const LAYERS: &[&[&str]] = &[
    &["model"],
    &["geom"],
    &["props"],
    &["fe"],
    &["checks"],
    &["analysis"],
    &["file"],
    &["numfmt"],
    &["report"],
    &["iterate"],
    &["tui", "cli"],
    &["main", "lib"],
];

/// Modules every module may name (leaves that themselves name nothing of the crate):
/// the sanitiser, the parallel map, the allocator and the heap's set-up.
const LEAVES: &[&str] = &["text", "parallel", "blocks", "heap"];

fn layer(module: &str) -> Option<usize> {
    LAYERS.iter().position(|l| l.contains(&module))
}

/// Whether code in `from` may name `to`.
fn allowed(from: &str, to: &str) -> bool {
    if from == to || LEAVES.contains(&to) {
        return true;
    }
    match (layer(from), layer(to)) {
        (Some(f), Some(t)) => t < f,
        _ => false,
    }
}

/// The code of a Rust source with comments, string and character literals blanked
/// (line breaks kept, so line numbers hold).
fn code_only(src: &str) -> String {
    let b = src.as_bytes();
    let mut out = b.to_vec();
    let mut blank = |from: usize, to: usize| {
        for c in &mut out[from..to.min(b.len())] {
            if *c != b'\n' {
                *c = b' ';
            }
        }
    };
    let mut i = 0;
    while i < b.len() {
        let rest = &b[i..];
        let start = i;
        if rest.starts_with(b"//") {
            while i < b.len() && b[i] != b'\n' {
                i += 1;
            }
        } else if rest.starts_with(b"/*") {
            let mut depth = 0;
            while i < b.len() {
                if b[i..].starts_with(b"/*") {
                    depth += 1;
                    i += 2;
                } else if b[i..].starts_with(b"*/") {
                    depth -= 1;
                    i += 2;
                    if depth == 0 {
                        break;
                    }
                } else {
                    i += 1;
                }
            }
        } else if (rest.starts_with(b"r\"") || rest.starts_with(b"r#"))
            && rest.get(1 + rest[1..].iter().take_while(|&&c| c == b'#').count()) == Some(&b'"')
        {
            let hashes = rest[1..].iter().take_while(|&&c| c == b'#').count();
            let close: Vec<u8> = std::iter::once(b'"')
                .chain(std::iter::repeat_n(b'#', hashes))
                .collect();
            i += 2 + hashes;
            while i < b.len() && !b[i..].starts_with(&close) {
                i += 1;
            }
            i += close.len();
        } else if b[i] == b'"' {
            i += 1;
            while i < b.len() && b[i] != b'"' {
                i += if b[i] == b'\\' { 2 } else { 1 };
            }
            i += 1;
        } else if b[i] == b'\'' && (rest.get(2) == Some(&b'\'') || rest.get(1) == Some(&b'\\')) {
            // A character literal ('x' or '\n'); a lifetime has no closing quote.
            i += 2;
            while i < b.len() && b[i] != b'\'' {
                i += 1;
            }
            i += 1;
        } else {
            i += 1;
            continue;
        }
        blank(start, i);
    }
    // Only ASCII bytes were written over whole characters, so this is still UTF-8.
    String::from_utf8_lossy(&out).into_owned()
}

/// The modules named as `crate::NAME` in `code`, with the line of each.
fn named(code: &str) -> Vec<(usize, String)> {
    let mut found = Vec::new();
    for (n, line) in code.lines().enumerate() {
        let mut rest = line;
        while let Some(at) = rest.find("crate::") {
            let before = rest[..at].chars().next_back();
            rest = &rest[at + "crate::".len()..];
            if before.is_some_and(|c| c.is_alphanumeric() || c == '_') {
                continue; // `$crate::` or `mycrate::`
            }
            let name: String = rest
                .chars()
                .take_while(|c| c.is_alphanumeric() || *c == '_')
                .collect();
            if name.is_empty() {
                // `crate::{a, b}`: every name inside the braces.
                let inner = rest.strip_prefix('{').unwrap_or("");
                let inner = &inner[..inner.find('}').unwrap_or(inner.len())];
                for part in inner.split(',') {
                    let part = part.trim();
                    let head = part.split("::").next().unwrap_or("").trim();
                    if !head.is_empty() {
                        found.push((n + 1, head.to_string()));
                    }
                }
            } else {
                found.push((n + 1, name));
            }
        }
    }
    found
}

/// The top-level module a file under src/ belongs to.
fn module_of(rel: &Path) -> String {
    let first = rel.components().next().map_or(String::new(), |c| {
        c.as_os_str().to_string_lossy().into_owned()
    });
    first.trim_end_matches(".rs").to_string()
}

/// The wrong arrows in one file's source: `(line, named module)`.
fn wrong_arrows(module: &str, src: &str) -> Vec<(usize, String)> {
    named(&code_only(src))
        .into_iter()
        .filter(|(_, to)| !allowed(module, to))
        .collect()
}

fn rust_files(dir: &Path, out: &mut Vec<PathBuf>) {
    for entry in fs::read_dir(dir).expect("src/ is readable").flatten() {
        let p = entry.path();
        if p.is_dir() {
            rust_files(&p, out);
        } else if p.extension().is_some_and(|e| e == "rs") {
            out.push(p);
        }
    }
}

#[test]
fn every_arrow_points_down() {
    let src = Path::new(env!("CARGO_MANIFEST_DIR")).join("src");
    let mut files = Vec::new();
    rust_files(&src, &mut files);
    files.sort();
    let mut wrong = Vec::new();
    for f in &files {
        let rel = f.strip_prefix(&src).unwrap();
        let module = module_of(rel);
        assert!(
            layer(&module).is_some() || LEAVES.contains(&module.as_str()),
            "src/{}: module `{module}` has no layer: add it to DEVELOPERS.md and LAYERS",
            rel.display()
        );
        let text = fs::read_to_string(f).unwrap();
        for (line, to) in wrong_arrows(&module, &text) {
            wrong.push(format!(
                "src/{}:{line}: `{module}` names `crate::{to}`",
                rel.display()
            ));
        }
    }
    assert!(
        wrong.is_empty(),
        "arrows against the flow:\n{}",
        wrong.join("\n")
    );
}

#[test]
fn the_scan_finds_a_wrong_arrow_and_ignores_comments_and_strings() {
    // A wrong arrow in code is found, with its line.
    let src = "/* see\ncrate::tui */\nuse crate::geom::Pt;\nuse crate::tui::app::App;\n";
    assert_eq!(wrong_arrows("props", src), vec![(4, "tui".to_string())]);
    assert_eq!(wrong_arrows("model", src).len(), 2);
    // Braced lists are read name by name.
    let src = "use crate::{props::Moments, geom::Pt};";
    assert_eq!(wrong_arrows("geom", src), vec![(1, "props".to_string())]);
    // Comments, strings and raw strings are not code.
    let src = "/* crate::cli */ let s = \"crate::cli\"; let r = r#\"crate::cli\"#; // crate::cli";
    assert!(wrong_arrows("model", src).is_empty());
    // Siblings on one layer do not name each other; the leaf is open to all.
    assert_eq!(wrong_arrows("tui", "crate::cli::say(x)").len(), 1);
    assert!(wrong_arrows("model", "crate::text::clean(x)").is_empty());
    assert!(wrong_arrows("cli", "crate::report::json(x)").is_empty());
}
