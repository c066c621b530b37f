//! Reading one result from the stages of the analysis it needs
//! (`iterate::vary::scope_for`) gives exactly what the whole analysis gives: every
//! numeric key of `kern calc --json`, on every demo section, at the file's values and
//! with each param moved 5 %. The reference is the whole analysis itself (the figures
//! it gives are checked against published values in the other tests); bit-for-bit
//! equality, since the same code computes both.

use kern::analysis::{Analysis, Options, Scope};
use kern::iterate::vary::{numeric_keys, param_values, read, scope_for, Probe};
use std::path::Path;

fn demo_sections() -> Vec<(String, kern::model::Document)> {
    let mut files: Vec<_> =
        std::fs::read_dir(Path::new(env!("CARGO_MANIFEST_DIR")).join("sections"))
            .expect("the demo sections are there")
            .map(|e| e.unwrap().path())
            .filter(|p| p.extension().is_some_and(|x| x == "toml"))
            .collect();
    files.sort();
    assert!(files.len() >= 5, "demo sections: {files:?}");
    files
        .into_iter()
        .map(|p| {
            let text = std::fs::read_to_string(&p).unwrap();
            let doc = kern::file::parse(&text).expect("a demo section reads");
            (p.display().to_string(), doc)
        })
        .collect()
}

fn bits(x: Option<f64>) -> Option<u64> {
    x.map(f64::to_bits)
}

#[test]
fn every_numeric_key_reads_the_same_from_its_scope_as_from_the_whole_analysis() {
    let opts = Options { torsion: None };
    let mut compared = 0;
    for (name, doc) in demo_sections() {
        let full = Analysis::of_document(doc.clone(), &opts).expect("a demo section computes");
        for q in numeric_keys() {
            let part = Analysis::of_document_in(doc.clone(), &opts, scope_for(q)).unwrap();
            assert_eq!(
                bits(read(q, &part)),
                bits(read(q, &full)),
                "{name}: {}",
                q.path
            );
            compared += read(q, &full).is_some() as usize;
        }
        // Each param moved 5 %: the probe's one-result path against the whole analysis.
        for (param, value) in param_values(&doc).unwrap() {
            let probe = Probe::new(&doc, &param, &opts).unwrap();
            let x = 1.05 * value + 1e-3;
            let whole = probe.analyse_with(x, &opts);
            for q in numeric_keys() {
                let one = probe.result(q, x).ok();
                let want = whole.as_ref().ok().and_then(|a| read(q, a));
                assert_eq!(bits(one), bits(want), "{name}: {param} = {x}: {}", q.path);
            }
        }
    }
    assert!(compared > 200, "only {compared} results compared");
}

#[test]
fn a_narrowed_probe_sweeps_the_same_results_and_fails_the_same_way() {
    let opts = Options { torsion: None };
    for (name, doc) in demo_sections() {
        let Some((param, value)) = param_values(&doc).unwrap().into_iter().next() else {
            continue;
        };
        let keys: Vec<_> = [
            "inertia.xx",
            "member.utilization",
            "stress.max_tension.value",
        ]
        .iter()
        .map(|k| kern::iterate::vary::result_key(k).unwrap())
        .collect();
        let probe = Probe::new(&doc, &param, &opts).unwrap();
        let narrow = probe.clone().reading(&keys);
        assert_ne!(narrow.scope, Scope::FULL, "{name}");
        // A negative value fails in both (or computes in both, for a position).
        for x in [value, 0.5 * value, -value] {
            let (a, b) = (probe.analyse(x), narrow.analyse(x));
            assert_eq!(a.is_ok(), b.is_ok(), "{name}: {param} = {x}");
            if let (Ok(a), Ok(b)) = (&a, &b) {
                for q in &keys {
                    assert_eq!(bits(read(q, a)), bits(read(q, b)), "{name}: {}", q.path);
                }
            }
        }
    }
}
