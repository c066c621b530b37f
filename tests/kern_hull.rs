//! The points the kern's hull is taken of (`analysis::outline_points`, which leaves out
//! whole arcs and points well inside an extreme octagon) give the same hull, to the last
//! bit, as every 1° chord point of the solid parts' outlines: the monotone chain over all
//! of them (Andrew 1979) is the reference. Checked on the 300 sections of the throughput
//! batch, on every section of the repository, and on random sections of rounded
//! rectangles, circles and holes.

#[path = "../benches/support/sections.rs"]
mod sections;

use kern::analysis::outline_points;
use kern::checks::stress::convex_hull;
use kern::file::parse;
use kern::geom::{Contour, Piece, Pt, Resolved};
use proptest::prelude::*;
use std::path::Path;

/// Every chord point of the solid parts' outlines, arcs cut at 1°.
fn all_chord_points(pieces: &[Piece]) -> Vec<(f64, f64)> {
    let mut pts = Vec::new();
    for s in pieces
        .iter()
        .filter(|p| !p.void)
        .flat_map(|p| &p.contours)
        .flat_map(|c| &c.segs)
    {
        s.sample_points(1f64.to_radians(), &mut pts);
    }
    pts.into_iter().map(|q| (q.x, q.y)).collect()
}

fn pieces_of(text: &str) -> Vec<Piece> {
    let doc = parse(text).expect("valid section file");
    Resolved::resolve(&doc).expect("section resolves").pieces()
}

#[test]
fn batch_sections_keep_their_hull() {
    for k in 0..sections::COUNT {
        let pieces = pieces_of(&sections::section(k));
        let fewer = outline_points(&pieces);
        let all = all_chord_points(&pieces);
        assert!(fewer.len() <= all.len());
        assert_eq!(convex_hull(&fewer), convex_hull(&all), "batch section {k}");
    }
}

#[test]
fn repository_sections_keep_their_hull() {
    let root = Path::new(env!("CARGO_MANIFEST_DIR"));
    let mut seen = 0;
    for dir in ["sections", "benches/sections"] {
        for entry in std::fs::read_dir(root.join(dir)).expect("section folder") {
            let path = entry.expect("folder entry").path();
            if path.extension().is_none_or(|x| x != "toml") {
                continue;
            }
            let pieces = pieces_of(&std::fs::read_to_string(&path).expect("readable"));
            assert_eq!(
                convex_hull(&outline_points(&pieces)),
                convex_hull(&all_chord_points(&pieces)),
                "{}",
                path.display()
            );
            seen += 1;
        }
    }
    assert!(seen >= 10, "repository sections present");
}

/// A solid rounded rectangle, a solid or void circle, or a rounded rectangle with a round
/// hole (two contours of one part), anywhere in a 1,000-unit square.
fn piece() -> impl Strategy<Value = Piece> {
    (
        0usize..4,
        (-500.0f64..500.0, -500.0f64..500.0),
        (1.0f64..400.0, 1.0f64..400.0),
        0.0f64..1.0,
        any::<bool>(),
    )
        .prop_map(|(kind, (x, y), (w, h), f, void)| {
            let r = f * w.min(h) / 2.0;
            let rect = Contour::rounded_rect(x, y, x + w, y + h, r);
            let circle = Contour::circle(Pt::new(x, y), w / 2.0);
            match kind {
                0 => Piece::plain("plate", vec![rect], false),
                1 => Piece::plain("bar", vec![circle], void),
                2 => {
                    let hole = Contour::circle(Pt::new(x + w / 2.0, y + h / 2.0), r.max(0.5));
                    Piece::plain("tube", vec![rect, hole.reversed()], false)
                }
                _ => Piece::plain("plate", vec![rect], void),
            }
        })
}

proptest! {
    #[test]
    fn random_sections_keep_their_hull(pieces in proptest::collection::vec(piece(), 1..8)) {
        prop_assert_eq!(
            convex_hull(&outline_points(&pieces)),
            convex_hull(&all_chord_points(&pieces))
        );
    }
}
