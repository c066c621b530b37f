//! The quick path for long point lists (`src/file/fast_points.rs`) against the full
//! TOML parse: for any long `points` array, plain or not, the values read and the
//! place each one stands in the file must be what the TOML parser itself
//! (`toml_edit`, the reference here) finds in the same text.

use kern::model::Value;
use proptest::prelude::*;
use toml_edit::ImDocument;

/// One coordinate as it may be written: the text and, for the oracle's sake, nothing
/// else — the expected value comes from the TOML parser.
fn coordinate() -> impl Strategy<Value = String> {
    prop_oneof![
        12 => plain_coordinate(),
        // Not plain: these send the array through the TOML parser.
        1 => (1u32..9).prop_map(|i| format!("{i}_000")),
        1 => (1u32..9).prop_map(|i| format!("\"{i}*2\"")),
        1 => Just("\"w/2\"".to_string()),
    ]
}

/// A plain decimal number, the only kind the quick path reads itself.
fn plain_coordinate() -> impl Strategy<Value = String> {
    prop_oneof![
        8 => (-100_000i64..100_000).prop_map(|i| i.to_string()),
        8 => (-1e4f64..1e4).prop_map(|x| format!("{x}")),
        2 => (-1e4f64..1e4).prop_map(|x| format!("{x:e}")),
        1 => (0u32..1000).prop_map(|i| format!("+{i}.5")),
        1 => (1u32..9).prop_map(|i| format!("{i}.25E-3")),
    ]
}

/// What may stand between two numbers of a pair or between pairs.
fn gap() -> impl Strategy<Value = String> {
    prop_oneof![
        6 => Just(", ".to_string()),
        2 => Just(",".to_string()),
        1 => Just(",\n  ".to_string()),
        1 => Just(",\r\n".to_string()),
        1 => Just(" ,\t".to_string()),
        1 => Just(", # a comment\n".to_string()),
    ]
}

/// A polygon part whose `points` array is long enough for the quick path: half the
/// time plain numbers only, half the time with a few that are not.
fn section() -> impl Strategy<Value = String> {
    prop_oneof![
        points_text(plain_coordinate().boxed()),
        points_text(coordinate().boxed())
    ]
}

fn points_text(c: BoxedStrategy<String>) -> impl Strategy<Value = String> {
    prop::collection::vec((c.clone(), gap(), c, gap()), 300..600).prop_map(
        |pairs| {
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
            s
        },
    )
}

/// The points as the TOML parser reads them: each value and the text it spans.
fn oracle(text: &str) -> Vec<(Value, String)> {
    let doc = ImDocument::parse(text).expect("the generated file is valid TOML");
    let pts = doc["parts"][0]["points"]
        .as_array()
        .expect("points is an array");
    let mut out = Vec::new();
    for pair in pts.iter() {
        for v in pair.as_array().expect("a pair").iter() {
            let value = if let Some(i) = v.as_integer() {
                Value::Number(i as f64)
            } else if let Some(x) = v.as_float() {
                Value::Number(x)
            } else {
                Value::Expr(v.as_str().expect("a number or a string").to_string())
            };
            let sp = v.span().expect("a span");
            out.push((value, text[sp].trim().to_string()));
        }
    }
    out
}

proptest! {
    #![proptest_config(ProptestConfig::with_cases(64))]

    #[test]
    fn quick_path_reads_what_toml_reads(text in section()) {
        let want = oracle(&text);
        let doc = kern::file::parse(&text).expect("kern reads the file");
        let got: Vec<(Value, String)> = doc.parts[0]
            .points
            .as_ref()
            .expect("points read")
            .iter()
            .flat_map(|p| p.iter())
            .map(|v| (v.value.clone(), text[v.span.clone()].trim().to_string()))
            .collect();
        // A list of plain numbers must take the quick path, or this test tests nothing.
        let plain = !text.contains('_') && !text.contains("\"w") && !text.contains("*2");
        if plain {
            prop_assert_eq!(kern::file::fast_points::scan(&text).len(), 1);
        }
        prop_assert_eq!(got.len(), want.len());
        for (i, (g, w)) in got.iter().zip(&want).enumerate() {
            prop_assert_eq!(g, w, "coordinate {} differs", i);
        }
    }
}
