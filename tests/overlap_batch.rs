//! The overlap warnings on the 300 sections of the throughput batch
//! (`benches/support/sections.rs`: built-up members with fillets, plates, bars, bolt
//! holes, web openings and stiffeners that overlap the web), against a reference: the
//! same 3° chords clipped by the `geo` crate's polygon boolean operations, and the
//! warnings' rules applied to those areas (a pair of solids, or of voids, that shares
//! more than 10⁻⁶ of the smaller area overlaps; a void with more than 10⁻⁶ of its area in
//! no solid lies partly outside). Every pair warned about, and every percentage, must
//! agree; the sweep and the shortcuts of `props::overlap` must not lose or add one.

#[path = "../benches/support/sections.rs"]
mod sections;

use geo::{Area, BooleanOps, Coord, LineString, MultiPolygon, Polygon};
use kern::geom::{Piece, Resolved};
use kern::model::warning::Warning;
use kern::props::overlap;

/// The chord angle of the warnings (3°).
const FACET: f64 = 3.0 * std::f64::consts::PI / 180.0;

/// A piece as a `geo` region: its one loop cut into 3° chords (every part of the batch
/// is one loop).
fn region(p: &Piece) -> MultiPolygon<f64> {
    assert_eq!(p.contours.len(), 1, "{}: one loop expected", p.name);
    let ring: Vec<Coord<f64>> = p.contours[0]
        .facets(FACET)
        .iter()
        .map(|q| Coord { x: q.x, y: q.y })
        .collect();
    MultiPolygon::new(vec![Polygon::new(LineString::new(ring), vec![])])
}

/// The warnings the rules give on the reference areas, in the order `warnings` gives
/// them (pairs by part order, then voids by part order).
fn reference(pieces: &[Piece]) -> Vec<Warning> {
    let regions: Vec<MultiPolygon<f64>> = pieces.iter().map(region).collect();
    let area: Vec<f64> = regions.iter().map(|r| r.unsigned_area()).collect();
    let common = |i: usize, j: usize| regions[i].intersection(&regions[j]).unsigned_area();
    let mut out = Vec::new();
    for i in 0..pieces.len() {
        for j in i + 1..pieces.len() {
            if pieces[i].void != pieces[j].void {
                continue;
            }
            let small = area[i].min(area[j]);
            let shared = common(i, j);
            if shared > 1e-6 * small {
                let (a, b, percent) = (
                    pieces[i].name.clone(),
                    pieces[j].name.clone(),
                    100.0 * shared / small,
                );
                out.push(if pieces[i].void {
                    Warning::VoidsOverlap { a, b, percent }
                } else {
                    Warning::SolidsOverlap { a, b, percent }
                });
            }
        }
    }
    for v in (0..pieces.len()).filter(|&v| pieces[v].void) {
        let inside: f64 = (0..pieces.len())
            .filter(|&s| !pieces[s].void)
            .map(|s| common(v, s))
            .sum();
        if inside < (1.0 - 1e-6) * area[v] {
            out.push(Warning::VoidOutside {
                void: pieces[v].name.clone(),
                percent: 100.0 * (1.0 - inside / area[v]),
            });
        }
    }
    out
}

/// Two warnings name the same parts and their percentages agree to 10⁻⁶ of a point
/// (the two sums of the same clipped polygons differ only by rounding).
fn same(a: &Warning, b: &Warning) -> bool {
    let close = |p: f64, q: f64| (p - q).abs() <= 1e-6;
    match (a, b) {
        (
            Warning::SolidsOverlap { a, b, percent: p },
            Warning::SolidsOverlap {
                a: a2,
                b: b2,
                percent: q,
            },
        )
        | (
            Warning::VoidsOverlap { a, b, percent: p },
            Warning::VoidsOverlap {
                a: a2,
                b: b2,
                percent: q,
            },
        ) => a == a2 && b == b2 && close(*p, *q),
        (
            Warning::VoidOutside { void, percent: p },
            Warning::VoidOutside {
                void: v2,
                percent: q,
            },
        ) => void == v2 && close(*p, *q),
        _ => false,
    }
}

#[test]
fn batch_overlap_warnings_match_polygon_clipping() {
    let mut warned = 0;
    for k in 0..sections::COUNT {
        let doc = kern::file::parse(&sections::section(k)).expect("valid batch file");
        let pieces = Resolved::resolve(&doc)
            .expect("batch file resolves")
            .pieces();
        let got = overlap::warnings(&pieces);
        let want = reference(&pieces);
        assert_eq!(got.len(), want.len(), "section {k}: {got:?} vs {want:?}");
        for (g, w) in got.iter().zip(&want) {
            assert!(same(g, w), "section {k}: {g:?} vs {w:?}");
        }
        warned += usize::from(!got.is_empty());
    }
    // The batch is made so that some sections warn (a stiffener through the web).
    assert!(warned > 10, "only {warned} sections warn");
}
