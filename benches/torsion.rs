//! Time of the torsion solver to the default tolerance (1e-3) on a rolled I with root
//! fillets, a 20-part built-up plate girder, the loading-bay beam of `sections/` and a
//! plate with 300 holes (`benches/sections/`), and of torsion with the flexure (shear)
//! solution on the same meshes for the rolled I and the loading-bay beam (issue 11's
//! target: at most 1.5× torsion alone on the rolled I). Run the pair alone with
//! `cargo bench --bench torsion -- "IPE 300"`.
//!
//! Each figure is the process's CPU time per solve (`benches/support/cpu.rs`), not the
//! wall clock, which on a machine shared with other work says more about the load than
//! about kern. Whole-process figures: `benches/torsion.sh`.

use criterion::{criterion_group, criterion_main, Criterion};
use kern::fe::{torsion, TorsionOptions};
use kern::geom::{Anchor, Piece, Placement, Pt, Shape};
use std::path::Path;

#[path = "support/cpu.rs"]
mod cpu;
use cpu::on_cpu;

fn piece(shape: Shape, at: Pt) -> Piece {
    let pl = Placement {
        at,
        anchor: Anchor::BottomLeft,
        rotate: 0.0,
        flip_x: false,
        flip_y: false,
    };
    Piece::plain("plate", pl.apply(&shape.contours()), false)
}

/// A plate girder built from 20 plates: five side by side in each flange, ten stacked
/// in the web.
pub fn girder() -> Vec<Piece> {
    let mut v = Vec::new();
    for i in 0..5 {
        let x = -100.0 + 40.0 * i as f64;
        v.push(piece(Shape::Rect { b: 40.0, h: 12.0 }, Pt::new(x, 0.0)));
        v.push(piece(Shape::Rect { b: 40.0, h: 12.0 }, Pt::new(x, 292.0)));
    }
    for k in 0..10 {
        v.push(piece(
            Shape::Rect { b: 8.0, h: 28.0 },
            Pt::new(-4.0, 12.0 + 28.0 * k as f64),
        ));
    }
    v
}

/// The placed pieces of a section file of this repository.
fn pieces_of(file: &str) -> Vec<Piece> {
    let path = Path::new(env!("CARGO_MANIFEST_DIR")).join(file);
    kern::file::load::load(&path, &kern::analysis::Options::default())
        .expect("bench section loads")
        .pieces
}

fn bench(c: &mut Criterion) {
    let opts = TorsionOptions::default();
    let with_flexure = TorsionOptions {
        flexure: Some(0.3),
        ..TorsionOptions::default()
    };
    let mut time = |name: &str, pieces: &[Piece], opts: &TorsionOptions| {
        c.bench_function(name, |b| {
            b.iter_custom(|n| on_cpu(n, || torsion(pieces, opts)))
        });
    };
    // The rolled I of benches/sections/ipe300.toml (300 × 150, tw 7.1, tf 10.7, r 15).
    let ipe = pieces_of("benches/sections/ipe300.toml");
    time("torsion IPE 300", &ipe, &opts);
    time("torsion+flexure IPE 300", &ipe, &with_flexure);
    let bay = pieces_of("sections/loading-bay-beam.toml");
    time("torsion loading-bay beam", &bay, &opts);
    time("torsion+flexure loading-bay beam", &bay, &with_flexure);
    time("torsion 20-plate girder", &girder(), &opts);
    let plate = pieces_of("benches/sections/plate-300-holes.toml");
    time("torsion plate with 300 holes", &plate, &opts);
}

criterion_group! {
    name = benches;
    config = Criterion::default().sample_size(10);
    targets = bench
}
criterion_main!(benches);
