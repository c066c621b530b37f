//! The strict parser of the common TOML subset (`src/file/strict.rs`) against the
//! reference, `toml_edit` 0.22 (the parser kern read every file with before, and still
//! reads every file with that the strict one gives up on): on every `.toml` file of
//! the repository, the 300 files of the throughput batch, byte-level mutations of them
//! and generated documents, the strict parser either gives up or builds exactly the
//! tree `toml_edit` builds — every key, value and byte range — and a file then reads as
//! the same document, or fails with the same error, either way. The grammar the cases
//! are drawn from is TOML 1.0 (toml.io/en/v1.0.0).

#[path = "../benches/support/sections.rs"]
mod sections;

use kern::analysis::{Analysis, Options};
use kern::file::read::{full_tree, parse, parse_full};
use kern::file::strict;
use proptest::prelude::*;
use std::path::{Path, PathBuf};

/// Checks one text; says whether the strict parser took it.
fn agrees(text: &str) -> bool {
    let quick = strict::parse(text);
    if let Some(tree) = &quick {
        let full = full_tree(text);
        assert_eq!(
            full.as_ref().ok(),
            Some(tree),
            "the strict parser took a text toml_edit reads otherwise ({full:?}):\n{text}"
        );
    }
    assert_eq!(parse(text), parse_full(text), "read differently:\n{text}");
    quick.is_some()
}

/// Every `.toml` file under the repository (not `target/`), with its text when UTF-8.
fn repository_files() -> Vec<(PathBuf, String)> {
    fn walk(dir: &Path, out: &mut Vec<(PathBuf, String)>) {
        let Ok(entries) = std::fs::read_dir(dir) else {
            return;
        };
        let mut paths: Vec<PathBuf> = entries.filter_map(|e| e.ok()).map(|e| e.path()).collect();
        paths.sort();
        for p in paths {
            let name = p.file_name().and_then(|n| n.to_str()).unwrap_or("");
            if p.is_dir() {
                if name != "target" && !name.starts_with('.') {
                    walk(&p, out);
                }
            } else if name.ends_with(".toml") {
                if let Ok(text) = std::fs::read_to_string(&p) {
                    out.push((p, text));
                }
            }
        }
    }
    let mut out = Vec::new();
    walk(Path::new(env!("CARGO_MANIFEST_DIR")), &mut out);
    out
}

#[test]
fn every_toml_file_of_the_repository_reads_the_same() {
    let files = repository_files();
    assert!(files.len() >= 50, "only {} files found", files.len());
    let mut taken = 0;
    for (path, text) in &files {
        eprintln!("{}", path.display());
        taken += usize::from(agrees(text));
    }
    // The demo sections, bench sections and fixtures are all in the subset.
    for (path, text) in &files {
        let p = path.to_string_lossy();
        if p.contains("/sections/") || p.contains("/fixtures/") {
            assert!(strict::parse(text).is_some(), "{p} left to toml_edit");
        }
    }
    assert!(taken > files.len() / 2, "{taken} of {} taken", files.len());
}

#[test]
fn the_batch_reads_the_same_and_computes_the_same_json() {
    let opts = Options {
        torsion: None,
        ..Options::default()
    };
    for k in 0..sections::COUNT {
        let text = sections::section(k);
        assert!(agrees(&text), "batch file {k} left to toml_edit");
        if k % 10 == 0 {
            let json = |doc| {
                let a = Analysis::of_document(doc, &opts).expect("a batch file computes");
                let u = kern::report::out::OutUnits::new(a.section.units, None);
                kern::report::json::to_json("f.toml", &a, &u).to_string()
            };
            let quick = json(parse(&text).unwrap());
            let full = json(parse_full(&text).unwrap());
            assert_eq!(quick, full, "batch file {k}");
        }
    }
}

/// What a mutation puts into a file: each is a way a text can stop being valid TOML,
/// or leave the subset, or stay in it.
const INSERTS: &[&str] = &[
    "\"", "'", "[", "]", "{", "}", ",", "=", "#", ".", "\r", "\n", "\u{1}", "\u{7f}", "_", " x",
    "e", "0", "-", "\\", "\u{feff}", "é", "\t",
];

/// Byte-level mutations of the repository's smaller files and of a few batch files: a
/// character deleted, or one of [`INSERTS`] put in, at places spread over the text.
#[test]
fn mutated_files_read_the_same() {
    let mut texts: Vec<String> = repository_files()
        .into_iter()
        .map(|(_, t)| t)
        .filter(|t| t.len() < 12_000)
        .collect();
    texts.extend((0..300).step_by(50).map(sections::section));
    let mut taken = 0;
    let mut tried = 0;
    for text in &texts {
        let cuts: Vec<usize> = text.char_indices().map(|(i, _)| i).collect();
        let step = (cuts.len() / 24).max(1);
        for &at in cuts.iter().step_by(step) {
            let next = text[at..].chars().next().map_or(at, |c| at + c.len_utf8());
            let deleted = format!("{}{}", &text[..at], &text[next..]);
            taken += usize::from(agrees(&deleted));
            tried += 1;
            for ins in INSERTS {
                let m = format!("{}{ins}{}", &text[..at], &text[at..]);
                taken += usize::from(agrees(&m));
                tried += 1;
            }
        }
    }
    // Some mutations stay valid (a digit added, a comment lengthened): the strict
    // parser must take a good share of them, or the test shows nothing.
    assert!(taken * 20 > tried, "{taken} of {tried} taken");
}

#[test]
fn deep_nesting_and_huge_strings_are_bounded() {
    for n in [7, 8, 9, 100, 100_000] {
        let text = format!("a = {}1{}\n", "[".repeat(n), "]".repeat(n));
        let took = strict::parse(&text).is_some();
        assert_eq!(took, n <= strict::MAX_DEPTH, "depth {n}");
        let text = format!("a = {}\n", "{ b = ".repeat(n) + "1" + &" }".repeat(n));
        assert_eq!(strict::parse(&text).is_some(), n <= strict::MAX_DEPTH);
    }
    let huge = format!("title = \"{}\"\n", "x".repeat(10_000_000));
    assert!(agrees(&huge));
    let unclosed = format!("title = \"{}\n", "x".repeat(1_000_000));
    assert!(strict::parse(&unclosed).is_none());
}

/// A scalar as it may be written, valid or not in TOML 1.0.
fn scalar() -> impl Strategy<Value = String> {
    let odd = [
        "0",
        "-0",
        "+12",
        "012",
        "1_000",
        "0x1f",
        "0o7",
        "0b1",
        "9223372036854775807",
        "9223372036854775808",
        "-9223372036854775808",
        "1.5",
        "-2e3",
        "3.0E+2",
        "1e05",
        "1e400",
        "-1e400",
        "1.",
        ".5",
        "1e",
        "1.e3",
        "inf",
        "-inf",
        "nan",
        "+nan",
        "1979-05-27",
        "07:32:00",
        "1979-05-27T07:32:00Z",
        "\"a\"",
        "\"a\\tb\\\"c\\\\\"",
        "\"\\u00e9\\U0001F600\"",
        "\"\\uD800\"",
        "\"\\u00\"",
        "\"\\x41\"",
        "\"\\e\"",
        "'lit\\'",
        "''",
        "\"\"",
        "\"\"\"ml\"\"\"",
        "'''ml'''",
        "\"unterminated",
        "\"ctl\u{1}\"",
        "\"tab\t\"",
        "\"del\u{7f}\"",
        "'é ü'",
        "true",
        "false",
        "truex",
        "True",
        "tru",
        "\"2*tf + 3\"",
        "\"85 kN*m\"",
    ];
    prop_oneof![
        4 => prop::sample::select(odd.to_vec()).prop_map(str::to_string),
        2 => (-1_000_000i64..1_000_000).prop_map(|i| i.to_string()),
        2 => (-1e6f64..1e6).prop_map(|x| format!("{x}")),
        1 => (-1e6f64..1e6).prop_map(|x| format!("{x:e}")),
    ]
}

/// Between the values of an array.
fn gap() -> impl Strategy<Value = String> {
    prop::sample::select(vec![
        ", ",
        ",",
        ",\n  ",
        ",\r\n",
        " ,\t",
        ", # a comment\n",
        ",#\u{7f}\n",
        " , ",
        "\n,",
        ",\r",
    ])
    .prop_map(str::to_string)
}

fn key() -> impl Strategy<Value = String> {
    prop::sample::select(vec![
        "b", "h", "d", "t", "tf", "E", "name", "shape", "points", "at", "a-b", "_x", "1", "\"q\"",
        "'q'", "a.b", "x y", "", "é",
    ])
    .prop_map(str::to_string)
}

/// A value: a scalar, or arrays and inline tables of values.
fn value() -> impl Strategy<Value = String> {
    scalar().prop_recursive(4, 48, 6, |inner| {
        prop_oneof![
            (
                prop::collection::vec((inner.clone(), gap()), 0..6),
                any::<bool>()
            )
                .prop_map(|(items, trailing)| {
                    let mut s = String::from("[");
                    for (i, (v, g)) in items.iter().enumerate() {
                        s.push_str(v);
                        if i + 1 < items.len() || trailing {
                            s.push_str(g);
                        }
                    }
                    s.push(']');
                    s
                }),
            (
                prop::collection::vec((key(), inner), 0..4),
                prop::sample::select(vec![", ", ",", " , ", ",\n"]),
                any::<bool>()
            )
                .prop_map(|(items, sep, trailing)| {
                    let body: Vec<String> =
                        items.iter().map(|(k, v)| format!("{k} = {v}")).collect();
                    let comma = if trailing && !items.is_empty() {
                        ","
                    } else {
                        ""
                    };
                    format!("{{ {}{comma} }}", body.join(sep))
                }),
        ]
    })
}

/// A line of a file: a key and value, a header, a comment or nothing, and its end.
fn line() -> impl Strategy<Value = String> {
    let header = prop::sample::select(vec![
        "[params]",
        "[[parts]]",
        "[[materials]]",
        "[actions]",
        "[member]",
        "[ member ]",
        "[[ parts ]]",
        "[limits.min]",
        "[\"q\"]",
        "[[parts]] # c",
        "[parts]",
        "[b]",
        "[[b]]",
        "[ [parts] ]",
        "[]",
    ])
    .prop_map(str::to_string);
    let body = prop_oneof![
        6 => (key(), prop::sample::select(vec![" = ", "=", " =\t", " "]), value(),
              prop::sample::select(vec!["", " # note", "\t#", " x", "#\u{1}"]))
            .prop_map(|(k, eq, v, tail)| format!("{k}{eq}{v}{tail}")),
        2 => header,
        1 => Just("# a comment".to_string()),
        1 => Just(String::new()),
        1 => Just("  ".to_string()),
    ];
    let end = prop::sample::select(vec!["\n", "\n", "\n", "\r\n", "\r", ""]);
    (body, end).prop_map(|(b, e)| format!("{b}{e}"))
}

proptest! {
    #![proptest_config(ProptestConfig::with_cases(1000))]

    #[test]
    fn generated_documents_read_the_same(lines in prop::collection::vec(line(), 0..14)) {
        agrees(&lines.concat());
    }

    /// Section-like files: a header and a few good lines, then anything.
    #[test]
    fn generated_sections_read_the_same(
        lines in prop::collection::vec(line(), 0..8),
        at in any::<prop::sample::Index>(),
        ch in any::<char>(),
    ) {
        let mut text = String::from("format = 1\nunits = \"mm\"\n[[parts]]\nshape = \"rect\"\nb = 10\nh = 20\n");
        text.push_str(&lines.concat());
        let cuts: Vec<usize> = text.char_indices().map(|(i, _)| i).collect();
        let i = cuts[at.index(cuts.len())];
        agrees(&text);
        text.insert(i, ch);
        agrees(&text);
    }

    /// Long outlines (what the strict parser replaces the former quick path for points
    /// with): half of them plain numbers in good layout, half with anything in them.
    #[test]
    fn long_outlines_read_the_same(
        plain in prop::collection::vec((number(), good_gap(), number(), good_gap()), 300..600),
        odd in prop::collection::vec((scalar(), gap(), scalar(), gap()), 300..600),
    ) {
        for pairs in [plain, odd] {
            let mut s = String::from(
                "format = 1\nunits = \"mm\"\n[params]\nw = 10\n\n[[parts]]\nshape = \"polygon\"\npoints = [\n",
            );
            for (i, (x, g1, y, g2)) in pairs.iter().enumerate() {
                s.push_str(&format!("  [{x}{g1}{y}]"));
                if i + 1 < pairs.len() {
                    s.push_str(g2);
                }
            }
            s.push_str("\n]\n");
            agrees(&s);
        }
    }
}

fn number() -> impl Strategy<Value = String> {
    prop_oneof![
        (-100_000i64..100_000).prop_map(|i| i.to_string()),
        (-1e4f64..1e4).prop_map(|x| format!("{x}")),
        (-1e4f64..1e4).prop_map(|x| format!("{x:e}")),
        (0u32..1000).prop_map(|i| format!("+{i}.5")),
        (1u32..9).prop_map(|i| format!("{i}.25E-3")),
    ]
}

fn good_gap() -> impl Strategy<Value = String> {
    prop::sample::select(vec![", ", ",", ",\n  ", ",\r\n", " ,\t", ", # a comment\n"])
        .prop_map(str::to_string)
}
