//! Reading one result from the stages of the analysis it needs
//! (`iterate::vary::scope_for`) gives exactly what the whole analysis gives: every
//! numeric key of `kern calc --json`, on every demo section, at the file's values and
//! with each param moved 5 %. The reference is the whole analysis itself (the figures
//! it gives are checked against published values in the other tests); bit-for-bit
//! equality, since the same code computes both. The same holds for the resolution of
//! a document with one param changed that keeps what the param does not reach
//! (`geom::Varying`): it is the whole resolution, figures and first error alike.

use kern::analysis::{Analysis, Options, Scope};
use kern::geom::{Resolved, Varying};
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
    let opts = Options::default();
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
            let whole = Analysis::of_document(probe.document_at(x), &opts);
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
    let opts = Options::default();
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

/// Each param's index, name and value in `doc`.
fn params(doc: &kern::model::Document) -> Vec<(usize, String, f64)> {
    let values = param_values(doc).unwrap();
    (doc.params.iter().enumerate())
        .filter_map(|(i, (n, _, _))| {
            let v = values.iter().find(|(m, _)| m == n)?.1;
            Some((i, n.clone(), v))
        })
        .collect()
}

#[test]
fn resolving_again_only_what_a_param_reaches_is_the_whole_resolution() {
    // A chain of params (c reads b reads a), a part that reads none, a part placed by
    // one, the span an expression, and a material whose nu is a param.
    let chain = "format = 1\nunits = \"mm\"\n[params]\na = 10\nb = \"2*a\"\nc = \"b + 1\"\n\
        d = 100\nL = 6000\nnu = 0.3\n[[materials]]\nname = \"steel\"\nE = \"200 GPa\"\n\
        nu = \"nu\"\n[[parts]]\nshape = \"rect\"\nb = \"c\"\nh = \"d\"\n[[parts]]\n\
        shape = \"rect\"\nb = 50\nh = 20\nat = [0, \"d\"]\n[[parts]]\nshape = \"rect\"\n\
        b = 30\nh = 30\nat = [0, -40]\n[member]\nspan = \"L\"\nudl = \"5 kN/m\"\n";
    let doc = kern::file::parse(chain).unwrap();
    // What moves, by the params each part reads: a reaches part 1 through c; d parts 1
    // and 2; the span's L no part.
    let moves = |param: usize| -> Vec<bool> {
        let v = Varying::new(&doc, param);
        (0..3).map(|i| v.part_moves(i)).collect()
    };
    assert_eq!(moves(0), [true, false, false]);
    assert_eq!(moves(3), [true, true, false]);
    assert_eq!(moves(4), [false, false, false]);
    let mut docs = demo_sections();
    docs.push(("chain".into(), doc));
    let mut compared = 0;
    for (name, doc) in docs {
        for (i, param, value) in params(&doc) {
            let varying = Varying::new(&doc, i);
            let probe = Probe::new(&doc, &param, &Options::default()).unwrap();
            // Moved, halved, negated (most dimensions then fail), zero, and an absurd size.
            for x in [1.05 * value + 1e-3, 0.5 * value, -value, 0.0, 1e30] {
                let at = probe.document_at(x);
                let whole = format!("{:?}", Resolved::resolve(&at));
                let kept = format!("{:?}", Resolved::resolve_varying(&at, &varying));
                assert_eq!(kept, whole, "{name}: {param} = {x}");
                compared += 1;
            }
        }
    }
    assert!(compared > 50, "only {compared} values compared");
}
