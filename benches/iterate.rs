//! Performance targets of issue 12: a 50-point sweep of a 20-part section without
//! torsion in ≤ 5 ms, and the sensitivities of every param of a 20-part section in
//! ≤ 2 ms. Run with `cargo bench --bench iterate`. The sweep is timed with the whole
//! analysis at each value (what `kern sweep --json` needs) and reading one result
//! (what the workbench's sweep and the table of `kern sweep --result` need).
//!
//! Each figure is the process's CPU time (user + system, every thread's: the sweep
//! and the sensitivities run their values on all cores) per iteration, not the wall
//! clock, which on a machine shared with other work says more about the load than
//! about kern.

use criterion::{criterion_group, criterion_main, Criterion};
use kern::analysis::Options;
use kern::file::parse;
use kern::iterate::sensitivity::sensitivities;
use kern::iterate::sweep::{sweep, values};
use kern::iterate::vary::result_key;
use kern::iterate::Probe;
use std::fmt::Write;
use std::time::Duration;

#[path = "support/cpu.rs"]
mod cpu;
use cpu::on_cpu;

/// A loading-bay plate girder of 20 plates stacked edge to edge: five widths and four
/// thicknesses as params (9 params), each plate centred on the axis.
fn plated() -> String {
    let mut t = String::from("format = 1\ntitle = \"bench\"\nunits = \"mm\"\n[params]\n");
    for i in 0..5 {
        writeln!(t, "b{i} = {}", 150 + 40 * i).unwrap();
    }
    for i in 0..4 {
        writeln!(t, "t{i} = {}", 10 + 2 * i).unwrap();
    }
    t.push_str("[[materials]]\nname = \"steel\"\nE = \"200 GPa\"\nfy = \"355 MPa\"\ndensity = \"7850 kg/m3\"\n");
    let mut y = String::from("0");
    for i in 0..20 {
        let (b, h) = (format!("b{}", i % 5), format!("t{}", i % 4));
        writeln!(
            t,
            "[[parts]]\nname = \"plate {i}\"\nshape = \"rect\"\nb = \"{b}\"\nh = \"{h}\"\nanchor = \"bottom\"\nat = [0, \"{y}\"]"
        )
        .unwrap();
        y = format!("{y} + {h}");
    }
    t.push_str("[member]\nspan = \"6 m\"\nudl = \"20 kN/m\"\ndeflection_limit = 360\n");
    t
}

fn benches(c: &mut Criterion) {
    let doc = parse(&plated()).expect("the bench section reads");
    let opts = Options::default();
    let probe = Probe::new(&doc, "b2", &opts).unwrap();
    let xs = values(150.0, 450.0, 50).unwrap();
    c.bench_function(
        "sweep 50 points, 20 parts, no torsion, whole analysis",
        |b| b.iter_custom(|n| on_cpu(n, || sweep(&probe, &xs))),
    );
    let q = result_key("inertia.xx").unwrap();
    let u = result_key("member.utilization").unwrap();
    for (name, key) in [("Ixx", q), ("utilization", u)] {
        let one = probe.clone().reading(&[key]);
        c.bench_function(
            &format!("sweep 50 points, 20 parts, no torsion, {name}"),
            |b| b.iter_custom(|n| on_cpu(n, || sweep(&one, &xs))),
        );
    }
    c.bench_function("sensitivities of 9 params, 20 parts, no torsion", |b| {
        b.iter_custom(|n| on_cpu(n, || sensitivities(&doc, q, &opts).unwrap()))
    });
}

criterion_group! {
    name = iterate;
    config = Criterion::default().measurement_time(Duration::from_secs(3)).sample_size(20);
    targets = benches
}
criterion_main!(iterate);
