//! `kern calc --json` is written straight into text (`report::json::Writer`). Checked
//! against serde_json, the crate that wrote it before (through `serde_json::Value` with
//! an ordered map): on every `.toml` in the repository that computes and on the 300
//! sections of the throughput batch (`benches/support/sections.rs`), each object must
//! parse, and serde_json writing the parsed value again must give the same bytes (so the
//! escaping, the float texts — shortest round-trip, read back exactly with the
//! `float_roundtrip` feature — and the compact layout are serde_json's, and no key is
//! written twice); every quantity of the table must be at its dotted path with its value
//! bit for bit; and the keys of each object must come in the table's order (FORMAT.md's),
//! a key at the place of its first path in the table.

#[path = "../benches/support/sections.rs"]
mod sections;

use kern::analysis::{Analysis, Options};
use kern::fe::TorsionOptions;
use kern::file::load::analyse;
use kern::report::json::to_json;
use kern::report::out::OutUnits;
use kern::report::rows::{net_view, Cell, QUANTITIES};
use kern::text::clean;
use serde_json::Value;
use std::path::{Path, PathBuf};

/// Every `.toml` under `dir`, outside `target/`.
fn tomls(dir: &Path, out: &mut Vec<PathBuf>) {
    let Ok(entries) = std::fs::read_dir(dir) else {
        return;
    };
    for e in entries.flatten() {
        let p = e.path();
        if p.is_dir() {
            if p.file_name().is_some_and(|n| n != "target" && n != ".git") {
                tomls(&p, out);
            }
        } else if p.extension().is_some_and(|x| x == "toml") {
            out.push(p);
        }
    }
}

/// The keys of the quantities' objects in table order at the object `prefix` (`""`
/// the top): each key once, at the place of the first quantity given (not `Absent`)
/// whose path runs through it.
fn expected_keys(cells: &[Cell], prefix: &str) -> Vec<String> {
    let mut keys: Vec<String> = Vec::new();
    for (q, c) in QUANTITIES.iter().zip(cells) {
        if matches!(c, Cell::Absent) {
            continue;
        }
        let rest = if prefix.is_empty() {
            Some(q.path)
        } else {
            q.path
                .strip_prefix(prefix)
                .and_then(|r| r.strip_prefix('.'))
        };
        if let Some(k) = rest.map(|r| r.split('.').next().unwrap_or(r)) {
            if !keys.iter().any(|x| x == k) {
                keys.push(k.to_string());
            }
        }
    }
    keys
}

/// The JSON object at dotted `path` under `v`, if there is one.
fn at<'a>(v: &'a Value, path: &str) -> Option<&'a Value> {
    if path.is_empty() {
        return Some(v);
    }
    path.split('.').try_fold(v, |v, k| v.get(k))
}

/// Checks the quantities of `a` in the object `o` (the whole object, or its `net`:
/// then only those the net section repeats).
fn check_quantities(o: &Value, a: &Analysis, u: &OutUnits, what: &str, net: bool) {
    let cells: Vec<Cell> = QUANTITIES
        .iter()
        .map(|q| {
            if net && !q.in_net() {
                Cell::Absent
            } else {
                (q.get)(a)
            }
        })
        .collect();
    for (q, c) in QUANTITIES.iter().zip(&cells) {
        let got = at(o, q.path);
        match c {
            Cell::Absent => {}
            // A key not formed is null, unless its members are formed (an object).
            Cell::Null => assert!(
                got.is_some_and(|v| v.is_null() || v.is_object()),
                "{what}: {} {got:?}",
                q.path
            ),
            Cell::Num(x) => {
                let want = q.dim.json(*x, u);
                match got {
                    Some(Value::Number(n)) => assert_eq!(
                        n.as_f64().map(f64::to_bits),
                        Some(want.to_bits()),
                        "{what}: {}",
                        q.path
                    ),
                    Some(Value::Null) => assert!(!want.is_finite(), "{what}: {}", q.path),
                    other => panic!("{what}: {} is {other:?}", q.path),
                }
            }
            Cell::Text(t) => assert_eq!(got, Some(&Value::String(clean(t))), "{what}"),
            Cell::Count(n) => assert_eq!(got.and_then(Value::as_u64), Some(*n as u64)),
        }
    }
    // The order of the keys, at every object the table's paths run through.
    let mut objects = vec![String::new()];
    for q in QUANTITIES {
        let mut end = 0;
        for part in q.path.split('.') {
            end += part.len();
            let p = &q.path[..end];
            if !objects.iter().any(|o| o == p) {
                objects.push(p.to_string());
            }
            end += 1;
        }
    }
    for p in objects {
        let Some(Value::Object(m)) = at(o, &p) else {
            continue;
        };
        let want = expected_keys(&cells, &p);
        let got: Vec<&String> = m.keys().filter(|k| want.contains(k)).collect();
        assert_eq!(got, want.iter().collect::<Vec<_>>(), "{what}: at `{p}`");
    }
}

/// One section's text: its object passes every check above.
fn check(name: &str, text: &str, opts: &Options) -> bool {
    let Ok(a) = analyse(text, opts) else {
        return false;
    };
    let u = OutUnits::new(a.section.units, None);
    let line = to_json(name, &a, &u);
    let v: Value = serde_json::from_str(&line).unwrap_or_else(|e| panic!("{name}: {e}"));
    assert_eq!(serde_json::to_string(&v).unwrap(), line, "{name}");
    let top: Vec<&str> = v.as_object().unwrap().keys().map(String::as_str).collect();
    assert_eq!(&top[..3], ["file", "title", "units"], "{name}");
    let tail = ["connections", "net", "quantity_units", "warnings"];
    let tail: Vec<&str> = tail
        .into_iter()
        .filter(|k| *k != "net" || a.net.is_some())
        .collect();
    assert_eq!(&top[top.len() - tail.len()..], &tail[..], "{name}");
    assert_eq!(v["file"], clean(name));
    check_quantities(&v, &a, &u, name, false);
    if let Some(n) = net_view(&a) {
        check_quantities(&v["net"], &n, &u, &format!("{name} (net)"), true);
    }
    true
}

/// Every section file of the repository that computes (sections, bench and test
/// fixtures, hostile files), without torsion; those that do not compute are the
/// malformed-input tests' business.
#[test]
fn every_repository_file_writes_the_json_serde_json_would() {
    let root = Path::new(env!("CARGO_MANIFEST_DIR"));
    let mut files = Vec::new();
    tomls(root, &mut files);
    files.sort();
    let opts = Options::default();
    let mut checked = 0;
    for f in &files {
        let Ok(text) = std::fs::read_to_string(f) else {
            continue;
        };
        let name = f.strip_prefix(root).unwrap_or(f).display().to_string();
        checked += usize::from(check(&name, &text, &opts));
    }
    assert!(checked >= 30, "only {checked} files computed");
}

/// With torsion: the torsion object's text (the method), its count of elements and
/// the shear centre.
#[test]
fn torsion_keys_are_written_as_serde_json_would() {
    let root = Path::new(env!("CARGO_MANIFEST_DIR"));
    let opts = Options {
        torsion: Some(TorsionOptions::default()),
        ..Options::default()
    };
    for f in [
        "sections/garage-lintel.toml",
        "sections/loading-bay-beam.toml",
    ] {
        let Ok(text) = std::fs::read_to_string(root.join(f)) else {
            continue;
        };
        assert!(check(f, &text, &opts), "{f} computes");
    }
}

/// The 300 sections of the throughput batch, without torsion (as `benches/batch.sh`).
#[test]
fn the_batch_writes_the_json_serde_json_would() {
    let opts = Options::default();
    for k in 0..sections::COUNT {
        let name = format!("member-{k:03}.toml");
        assert!(check(&name, &sections::section(k), &opts), "{name}");
    }
}

/// Text that needs escaping — quotes, a backslash, a tab, a DEL, letters outside
/// ASCII — in the title, a part's name and the file name: serde_json's escapes (RFC
/// 8259 §7: `"` and `\` and the controls below U+0020 escaped, the rest as UTF-8).
#[test]
fn strings_are_escaped_as_serde_json_escapes_them() {
    let text = "format = 1\nunits = \"mm\"\ntitle = \"a \\\"quoted\\\" \\\\ title\\t\\u007f é ∑ \
\\u0001\"\n[[parts]]\nname = \"plate \\\"A\\\"\"\nshape = \"rect\"\nb = 100\nh = 10\n\
[[parts]]\nname = \"bar\\\\2\"\nshape = \"rect\"\nb = 10\nh = 50\nat = [0, 30]\n";
    assert!(check("odd \"name\"\\.toml", text, &Options::default()));
}

/// The layout puts a key that is a quantity of its own before its members: a `null`
/// "not formed" entry comes before the paths under it in the table, so the object
/// that replaces it when its members are formed keeps the same rule as serde_json's
/// ordered map had (the object wins when it comes after).
#[test]
fn a_null_key_comes_before_its_members_in_the_table() {
    for (i, q) in QUANTITIES.iter().enumerate() {
        for earlier in &QUANTITIES[..i] {
            assert!(
                !earlier
                    .path
                    .strip_prefix(q.path)
                    .is_some_and(|r| r.starts_with('.')),
                "{} comes after {}",
                q.path,
                earlier.path
            );
        }
    }
}
