//! The overlap warnings on the 300 sections of the throughput batch
//! (`benches/support/sections.rs`: built-up members with fillets, plates, bars, bolt
//! holes, web openings and stiffeners that overlap the web), against a reference: the
//! parts cut into fine chords (0.05°) and clipped by the `geo` crate's polygon boolean
//! operations, and the warnings' rules applied to those areas (a pair of solids, or of
//! voids, that shares more than 10⁻⁶ of the smaller area overlaps; a void with more than
//! 10⁻⁶ of its area in no solid lies partly outside). Every pair warned about must agree,
//! and every percentage to within what the chords can be off: the region between an arc
//! of radius r and its n chords has area `r²(φ − n sin(φ/n))/2` for a sweep φ (the
//! circular segment, e.g. Weisstein, MathWorld "Circular Segment"), so a common area of
//! two chorded parts differs from the exact one by at most the two parts' segments —
//! about 10⁻⁷ of a bar's area at 0.05°, against 5·10⁻⁴ at the 3° of earlier chords. The
//! sweep and the shortcuts of `props::overlap` must not lose or add a warning.

#[path = "../benches/support/sections.rs"]
mod sections;

use geo::{Area, BooleanOps, Coord, LineString, MultiPolygon, Polygon};
use kern::geom::{Piece, Resolved, Seg};
use kern::model::warning::Warning;
use kern::props::overlap;

/// The chord angle of the reference (0.05°).
const FACET: f64 = 0.05 * std::f64::consts::PI / 180.0;

/// A piece as a `geo` region: its one loop cut into chords of at most [`FACET`] (every
/// part of the batch is one loop).
fn region(p: &Piece) -> MultiPolygon<f64> {
    assert_eq!(p.contours.len(), 1, "{}: one loop expected", p.name);
    let ring: Vec<Coord<f64>> = p.contours[0]
        .facets(FACET)
        .iter()
        .map(|q| Coord { x: q.x, y: q.y })
        .collect();
    MultiPolygon::new(vec![Polygon::new(LineString::new(ring), vec![])])
}

/// The area between the piece's arcs and their chords of at most [`FACET`]: on each
/// arc of radius r and sweep φ cut into n = ⌈φ / FACET⌉ chords, `r²(φ − n sin(φ/n))/2`
/// (the circular segments; more chords cut off less, so this bounds any finer cut).
fn chord_error(p: &Piece) -> f64 {
    (p.contours[0].segs.iter())
        .map(|s| match *s {
            Seg::Line(..) => 0.0,
            Seg::Arc { r, a0, a1, .. } => {
                let phi = (a1 - a0).abs();
                let n = (phi / FACET).ceil().max(1.0);
                0.5 * r * r * (phi - n * (phi / n).sin())
            }
        })
        .sum()
}

/// A warning of the reference and how far its percentage may be from the exact one.
struct Expected {
    warning: Warning,
    within: f64,
}

fn boxes_meet(a: [f64; 4], b: [f64; 4]) -> bool {
    a[0] <= b[1] && b[0] <= a[1] && a[2] <= b[3] && b[2] <= a[3]
}

/// The warnings the rules give on the reference areas, in the order `warnings` gives
/// them (pairs by part order, then voids by part order). With C and S the chorded
/// common and smaller areas, off by at most δC and δS, `|C/S − C'/S'| ≤ (δC + δS·C/S)/S`;
/// the bound is taken twice over for the rounding of both sums.
fn reference(pieces: &[Piece]) -> Vec<Expected> {
    let regions: Vec<MultiPolygon<f64>> = pieces.iter().map(region).collect();
    let area: Vec<f64> = regions.iter().map(|r| r.unsigned_area()).collect();
    let err: Vec<f64> = pieces.iter().map(chord_error).collect();
    let bounds: Vec<[f64; 4]> = pieces.iter().map(|p| p.bounds().unwrap()).collect();
    // Parts whose boxes do not meet share nothing (and geo need not be asked).
    let common = |i: usize, j: usize| {
        if boxes_meet(bounds[i], bounds[j]) {
            regions[i].intersection(&regions[j]).unsigned_area()
        } else {
            0.0
        }
    };
    let within =
        |dc: f64, ds: f64, ratio: f64, s: f64| 2.0 * 100.0 * (dc + ds * ratio.max(1.0)) / s;
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
                let warning = if pieces[i].void {
                    Warning::VoidsOverlap { a, b, percent }
                } else {
                    Warning::SolidsOverlap { a, b, percent }
                };
                let e = err[i] + err[j];
                let within = within(e, err[i].max(err[j]), shared / small, small);
                out.push(Expected { warning, within });
            }
        }
    }
    for v in (0..pieces.len()).filter(|&v| pieces[v].void) {
        let solids = (0..pieces.len()).filter(|&s| !pieces[s].void);
        let inside: f64 = solids.clone().map(|s| common(v, s)).sum();
        if inside < (1.0 - 1e-6) * area[v] {
            let de: f64 = solids
                .filter(|&s| boxes_meet(bounds[v], bounds[s]))
                .map(|s| err[v] + err[s])
                .sum();
            out.push(Expected {
                warning: Warning::VoidOutside {
                    void: pieces[v].name.clone(),
                    percent: 100.0 * (1.0 - inside / area[v]),
                },
                within: within(de, err[v], inside / area[v], area[v]),
            });
        }
    }
    out
}

/// Two warnings name the same parts and their percentages agree to within `within`
/// points (and rounding).
fn same(a: &Warning, b: &Warning, within: f64) -> bool {
    let close = |p: f64, q: f64| (p - q).abs() <= within + 1e-9;
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
        let listed: Vec<&Warning> = want.iter().map(|w| &w.warning).collect();
        assert_eq!(got.len(), want.len(), "section {k}: {got:?} vs {listed:?}");
        for (g, w) in got.iter().zip(&want) {
            assert!(
                same(g, &w.warning, w.within),
                "section {k}: {g:?} vs {:?} within {}",
                w.warning,
                w.within
            );
        }
        warned += usize::from(!got.is_empty());
    }
    // The batch is made so that some sections warn (a stiffener through the web).
    assert!(warned > 10, "only {warned} sections warn");
}
