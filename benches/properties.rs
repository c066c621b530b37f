//! Performance targets (issue list): all properties of a 20-part built-up section with
//! fillets in ≤ 50 µs, 1,000 parts in ≤ 5 ms, a 100,000-vertex polygon in ≤ 5 ms, and
//! `kern calc` over many files using every core. Run with `cargo bench`.

use criterion::{black_box, criterion_group, criterion_main, Criterion};
use kern::analysis::Options;
use kern::cli::{load, parallel_map};
use kern::file::parse;
use kern::geom::Piece;
use kern::geom::Resolved;
use kern::props::Properties;
use std::fmt::Write;
use std::path::PathBuf;
use std::time::Duration;

const HEAD: &str = "format = 1\ntitle = \"bench\"\nunits = \"mm\"\n";

/// A crane-runway style built-up member: four rolled I sections with root fillets
/// side by side, a cap plate, a bottom plate, and bolt holes through both plates —
/// 20 parts in all.
fn built_up() -> String {
    let mut t = String::from(HEAD);
    t.push_str("[params]\nd = 400\nbf = 180\ntf = 13.5\ntw = 8.6\nr = 21\ntp = 20\n");
    for i in 0..4 {
        let x = -300.0 + 200.0 * f64::from(i);
        writeln!(
            t,
            "[[parts]]\nname = \"I{i}\"\nshape = \"ibeam\"\nd = \"d\"\nb = \"bf\"\ntf = \"tf\"\ntw = \"tw\"\nr = \"r\"\nat = [{x}, 0]"
        )
        .unwrap();
    }
    t.push_str("[[parts]]\nname = \"cap\"\nshape = \"rect\"\nb = 800\nh = \"tp\"\nanchor = \"bottom\"\nat = [0, \"d/2\"]\n");
    t.push_str("[[parts]]\nname = \"sole\"\nshape = \"rect\"\nb = 800\nh = \"tp\"\nanchor = \"top\"\nat = [0, \"-d/2\"]\n");
    for i in 0..7 {
        let x = -345.0 + 115.0 * f64::from(i);
        writeln!(t, "[[parts]]\nname = \"top hole {i}\"\nshape = \"circle\"\nd = 22\nvoid = true\nat = [{x}, \"d/2 + tp/2\"]").unwrap();
    }
    for i in 0..7 {
        let x = -345.0 + 115.0 * f64::from(i);
        writeln!(t, "[[parts]]\nname = \"bottom hole {i}\"\nshape = \"circle\"\nd = 22\nvoid = true\nat = [{x}, \"-d/2 - tp/2\"]").unwrap();
    }
    t
}

/// A stack of `n` plates, each touching the next (no overlaps).
fn stack(n: usize) -> String {
    let mut t = String::from(HEAD);
    for i in 0..n {
        let w = 100 + (i % 7) * 10;
        writeln!(
            t,
            "[[parts]]\nshape = \"rect\"\nb = {w}\nh = 2\nanchor = \"bottom\"\nat = [0, {}]",
            2 * i
        )
        .unwrap();
    }
    t
}

/// A star-shaped polygon of `n` vertices (radius varying with angle; simple).
fn big_polygon(n: usize) -> String {
    let mut t = String::from(HEAD);
    t.push_str("[[parts]]\nshape = \"polygon\"\npoints = [");
    for i in 0..n {
        let a = i as f64 / n as f64 * std::f64::consts::TAU;
        let r = 100.0 + 20.0 * (7.0 * a).sin();
        write!(t, "[{:.9}, {:.9}],", r * a.cos(), r * a.sin()).unwrap();
    }
    t.push_str("]\n");
    t
}

fn pieces(text: &str) -> Vec<Piece> {
    kern::file::load::analyse(text, &Options::default())
        .expect("valid bench section")
        .pieces
}

fn bench_sections(c: &mut Criterion) {
    let opts = Options::default();
    let mut g = c.benchmark_group("section");
    let b20 = built_up();
    let p20 = pieces(&b20);
    assert_eq!(p20.len(), 20);
    assert!(Properties::compute(&p20).unwrap().plastic.is_some());
    g.bench_function("20 parts: Properties::compute", |b| {
        b.iter(|| Properties::compute(black_box(&p20)))
    });
    g.bench_function("20 parts: file::load::analyse", |b| {
        b.iter(|| kern::file::load::analyse(black_box(&b20), &opts))
    });
    let s1000 = stack(1000);
    let p1000 = pieces(&s1000);
    g.bench_function("1000 parts: Properties::compute", |b| {
        b.iter(|| Properties::compute(black_box(&p1000)))
    });
    g.bench_function("1000 parts: overlap warnings", |b| {
        b.iter(|| kern::props::overlap::warnings(black_box(&p1000)))
    });
    g.bench_function("1000 parts: file::load::analyse", |b| {
        b.iter(|| kern::file::load::analyse(black_box(&s1000), &opts))
    });
    let poly = big_polygon(100_000);
    let ppoly = pieces(&poly);
    g.bench_function("100k-vertex polygon: Properties::compute", |b| {
        b.iter(|| Properties::compute(black_box(&ppoly)))
    });
    let doc = parse(&poly).unwrap();
    g.bench_function("100k-vertex polygon: TOML parse", |b| {
        b.iter(|| parse(black_box(&poly)))
    });
    g.bench_function("100k-vertex polygon: resolve (simplicity check)", |b| {
        b.iter(|| Resolved::resolve(black_box(&doc)))
    });
    g.bench_function("100k-vertex polygon: file::load::analyse", |b| {
        b.iter(|| kern::file::load::analyse(black_box(&poly), &opts))
    });
    g.finish();
}

/// `kern calc` over 1,000 files: the parallel map against a plain loop (the speed-up
/// is the ratio of the two times).
fn bench_files(c: &mut Criterion) {
    let dir = std::env::temp_dir().join(format!("kern-bench-{}", std::process::id()));
    std::fs::create_dir_all(&dir).unwrap();
    let text = built_up();
    let files: Vec<PathBuf> = (0..1000)
        .map(|i| {
            let p = dir.join(format!("s{i}.toml"));
            std::fs::write(&p, &text).unwrap();
            p
        })
        .collect();
    let opts = Options::default();
    let mut g = c.benchmark_group("files");
    g.sample_size(10);
    g.bench_function("1000 files: one thread", |b| {
        b.iter(|| files.iter().map(|p| load(p, &opts)).collect::<Vec<_>>())
    });
    g.bench_function("1000 files: parallel_map", |b| {
        b.iter(|| parallel_map(&files, |p| load(p, &opts)))
    });
    g.finish();
    let _ = std::fs::remove_dir_all(&dir);
}

criterion_group! {
    name = benches;
    config = Criterion::default().measurement_time(Duration::from_secs(2)).warm_up_time(Duration::from_millis(500));
    targets = bench_sections, bench_files
}
criterion_main!(benches);
