//! Performance target (issue 11): the connections and their shear flows of a 20-part
//! built-up section in ≤ 50 µs. Run with `nice cargo bench --bench connections`.
//!
//! The figure is the process's CPU time per run (`benches/support/cpu.rs`), not the wall
//! clock, so that the other work on a shared machine says little about it.

use criterion::{black_box, criterion_group, criterion_main, Criterion};
use kern::checks::shear_flow::{connections, shear_flow, Flow};
use kern::file::parse;
use kern::geom::joints::contacts;
use kern::geom::Resolved;
use kern::props::Properties;
use std::fmt::Write;

#[path = "support/cpu.rs"]
mod cpu;
use cpu::on_cpu;

/// A stack of ten flange plates each carried by a web plate beneath it: 20 plates,
/// every joint a bridge (a tall built-up column of plates).
fn stack() -> String {
    let mut t = String::from("format = 1\ntitle = \"bench\"\nunits = \"mm\"\n");
    for i in 0..10 {
        let y = 60.0 * f64::from(i);
        writeln!(t, "[[parts]]\nname = \"web {i}\"\nshape = \"rect\"\nb = 10\nh = 50\nanchor = \"bottom\"\nat = [0, {y}]").unwrap();
        writeln!(t, "[[parts]]\nname = \"flange {i}\"\nshape = \"rect\"\nb = 200\nh = 10\nanchor = \"bottom\"\nat = [0, {}]", y + 50.0).unwrap();
    }
    t
}

fn bench(c: &mut Criterion) {
    let doc = parse(&stack()).expect("bench section parses");
    let pieces = Resolved::resolve(&doc).expect("resolves").pieces();
    let props = Properties::compute(&pieces).expect("computes").centroidal();
    c.bench_function("connections and flows, 20 parts", |b| {
        b.iter_custom(|n| {
            on_cpu(n, || {
                let k = contacts(black_box(&pieces));
                let conns = connections(&pieces, &k, &props);
                let total: f64 = conns
                    .iter()
                    .filter_map(|c| match &c.flow {
                        Flow::Exact(cut) => shear_flow(&props, 0.0, 1e5, cut.qx, cut.qy),
                        _ => None,
                    })
                    .sum();
                black_box(total)
            })
        })
    });
}

criterion_group!(benches, bench);
criterion_main!(benches);
