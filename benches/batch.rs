//! The throughput batch (`support/sections.rs`: 300 built-up members of about eight
//! parts with root fillets, plates, bars and holes) through the in-process pipeline,
//! stage by stage: each figure is for the whole batch, so µs a section is it / 300.
//! The whole-process figure is `benches/batch.sh`. Run with `cargo bench --bench batch`.

#[path = "support/sections.rs"]
mod sections;

use criterion::{black_box, criterion_group, criterion_main, Criterion};
use kern::analysis::{outline_points, Analysis, Options};
use kern::checks::kern::kern_polygon;
use kern::file::parse;
use kern::file::read::parse_full;
use kern::geom::Resolved;
use kern::props::{overlap, Properties};
use kern::report::{json::to_json, out::OutUnits};
use std::time::Duration;

fn bench_batch(c: &mut Criterion) {
    let texts: Vec<String> = (0..sections::COUNT).map(sections::section).collect();
    let opts = Options::default();
    let docs: Vec<_> = texts
        .iter()
        .map(|t| parse(t).expect("valid batch file"))
        .collect();
    let resolved: Vec<Resolved> = docs
        .iter()
        .map(|d| Resolved::resolve(d).expect("batch file resolves"))
        .collect();
    let pieces: Vec<_> = resolved.iter().map(Resolved::pieces).collect();
    let props: Vec<Properties> = pieces
        .iter()
        .map(|p| Properties::compute(p).expect("batch section computes"))
        .collect();
    let analyses: Vec<Analysis> = docs
        .iter()
        .map(|d| Analysis::of_document(d.clone(), &opts).expect("batch section analyses"))
        .collect();
    let mut g = c.benchmark_group("batch of 300");
    g.sample_size(20);
    // The strict parser of the common subset, and toml_edit alone (what reads a file
    // the strict parser gives up on; every file before it came).
    for (name, read) in [
        ("TOML parse", parse as fn(&str) -> _),
        ("TOML parse, toml_edit alone", parse_full),
    ] {
        g.bench_function(name, |b| {
            b.iter(|| {
                texts
                    .iter()
                    .map(|t| read(black_box(t)).is_ok())
                    .filter(|&ok| ok)
                    .count()
            })
        });
    }
    g.bench_function("resolve and place", |b| {
        b.iter(|| {
            docs.iter()
                .map(|d| {
                    Resolved::resolve(black_box(d))
                        .map(|r| r.pieces().len())
                        .unwrap_or(0)
                })
                .sum::<usize>()
        })
    });
    g.bench_function("Properties::compute", |b| {
        b.iter(|| {
            pieces
                .iter()
                .map(|p| Properties::compute(black_box(p)).is_ok())
                .filter(|&ok| ok)
                .count()
        })
    });
    g.bench_function("overlap warnings", |b| {
        b.iter(|| {
            pieces
                .iter()
                .map(|p| overlap::warnings(black_box(p)).len())
                .sum::<usize>()
        })
    });
    g.bench_function("kern (outline points and hull)", |b| {
        b.iter(|| {
            pieces
                .iter()
                .zip(&props)
                .map(|(p, s)| kern_polygon(&s.centroidal(), &outline_points(black_box(p))).len())
                .sum::<usize>()
        })
    });
    g.bench_function("JSON build and text", |b| {
        b.iter(|| {
            analyses
                .iter()
                .map(|a| {
                    let u = OutUnits::new(a.section.units, None);
                    to_json("member.toml", black_box(a), &u).len()
                })
                .sum::<usize>()
        })
    });
    g.bench_function("whole analysis from text", |b| {
        b.iter(|| {
            texts
                .iter()
                .map(|t| kern::file::load::analyse(black_box(t), &opts).is_ok())
                .filter(|&ok| ok)
                .count()
        })
    });
    g.finish();
}

criterion_group! {
    name = benches;
    config = Criterion::default().measurement_time(Duration::from_secs(3)).warm_up_time(Duration::from_millis(500));
    targets = bench_batch
}
criterion_main!(benches);
