//! Time of the torsion solver to the default tolerance (1e-3) on a rolled I with root
//! fillets, a 20-part built-up plate girder, the loading-bay beam of `sections/` and a
//! plate with 300 holes (`benches/sections/`), and of torsion with the flexure (shear)
//! solution on the same meshes for the rolled I (target: at most 1.5× torsion alone).
//! Whole-process figures: `benches/torsion.sh`.

use criterion::{criterion_group, criterion_main, Criterion};
use kern::fe::{torsion, TorsionOptions};
use kern::geom::{Anchor, Piece, Placement, Pt, Shape};

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

fn bench(c: &mut Criterion) {
    let ipe = vec![piece(
        Shape::IBeam {
            d: 300.0,
            b: 150.0,
            tf: 10.7,
            tw: 7.1,
            r: 15.0,
        },
        Pt::default(),
    )];
    let opts = TorsionOptions::default();
    c.bench_function("torsion IPE 300", |b| b.iter(|| torsion(&ipe, &opts)));
    let with_flexure = TorsionOptions {
        flexure: Some(0.3),
        ..TorsionOptions::default()
    };
    c.bench_function("torsion+flexure IPE 300", |b| {
        b.iter(|| torsion(&ipe, &with_flexure))
    });
    let g = girder();
    c.bench_function("torsion 20-plate girder", |b| b.iter(|| torsion(&g, &opts)));
    for (name, file) in [
        ("torsion loading-bay beam", "sections/loading-bay-beam.toml"),
        (
            "torsion plate with 300 holes",
            "benches/sections/plate-300-holes.toml",
        ),
    ] {
        let path = std::path::Path::new(env!("CARGO_MANIFEST_DIR")).join(file);
        let a = kern::file::load::load(&path, &kern::analysis::Options { torsion: None })
            .expect("bench section loads");
        c.bench_function(name, |b| b.iter(|| torsion(&a.pieces, &opts)));
    }
}

criterion_group! {
    name = benches;
    config = Criterion::default().sample_size(10);
    targets = bench
}
criterion_main!(benches);
