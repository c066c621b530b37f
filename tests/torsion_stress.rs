//! Torsion on awkward arrangements of parts — overlaps, touching edges, voids across
//! edges, tiny and huge parts — must give a result or a clear error, never a panic.

use kern::analysis::Options;
use kern::fe::TorsionOptions;
use proptest::prelude::*;

fn part() -> impl Strategy<Value = String> {
    let pos = -50.0..50.0f64;
    prop_oneof![
        (1.0..80.0f64, 1.0..80.0f64, pos.clone(), pos.clone(), -180.0..180.0f64, any::<bool>()).prop_map(
            |(b, h, x, y, r, v)| format!("[[parts]]\nshape = \"rect\"\nb = {b}\nh = {h}\nat = [{x}, {y}]\nrotate = {r}\nvoid = {v}\n")
        ),
        (1.0..60.0f64, pos.clone(), pos.clone(), any::<bool>()).prop_map(|(d, x, y, v)| format!(
            "[[parts]]\nshape = \"circle\"\nd = {d}\nat = [{x}, {y}]\nvoid = {v}\n"
        )),
        (0.0..10.0f64, pos.clone(), pos.clone()).prop_map(|(r, x, y)| format!(
            "[[parts]]\nshape = \"ibeam\"\nd = 60\nb = 40\ntf = 5\ntw = 4\nr = {r}\nat = [{x}, {y}]\n"
        )),
        // Exactly touching and exactly overlapping copies, the hard cases for a mesher.
        (1usize..4).prop_map(|k| format!(
            "[[parts]]\nshape = \"rect\"\nb = 20\nh = 10\nat = [{}, 0]\n",
            10 * k
        )),
    ]
}

proptest! {
    #![proptest_config(ProptestConfig { cases: 48, .. ProptestConfig::default() })]
    #[test]
    fn torsion_never_panics(parts in proptest::collection::vec(part(), 1..5)) {
        let text = format!("format = 1\nunits = \"mm\"\n{}", parts.concat());
        let opts = Options { torsion: Some(TorsionOptions::default()), ..Options::default() };
        if let Ok(a) = kern::file::load::analyse(&text, &opts) {
            if let Some(Ok(t)) = &a.torsion {
                prop_assert!(t.j.is_finite() && t.j >= 0.0, "J = {}", t.j);
                prop_assert!(t.cw.is_finite(), "Cw = {}", t.cw);
            }
        }
    }
}

#[test]
fn tangent_coincident_and_empty_arrangements() {
    let cases = [
        // A bar touching a tube at one point; two discs touching.
        "[[parts]]\nshape = \"pipe\"\nd = 100\nt = 5\n[[parts]]\nshape = \"rect\"\nb = 40\nh = 10\nanchor = \"left\"\nat = [50, 0]\n",
        "[[parts]]\nshape = \"circle\"\nd = 50\nat = [-25, 0]\n[[parts]]\nshape = \"circle\"\nd = 50\nat = [25, 0]\n",
        // The same plate twice, and a plate with itself as a void beside another plate.
        "[[parts]]\nshape = \"rect\"\nb = 50\nh = 10\n[[parts]]\nshape = \"rect\"\nb = 50\nh = 10\n",
        "[[parts]]\nshape = \"rect\"\nb = 50\nh = 10\n[[parts]]\nshape = \"rect\"\nb = 50\nh = 10\nvoid = true\n[[parts]]\nshape = \"rect\"\nb = 5\nh = 5\nat = [100, 0]\n",
        // A void exactly filling a hole's place, and a void bigger than its plate but
        // another solid elsewhere.
        "[[parts]]\nshape = \"box\"\nh = 60\nb = 60\nt = 5\n[[parts]]\nshape = \"rect\"\nb = 50\nh = 50\nvoid = true\n",
        "[[parts]]\nshape = \"rect\"\nb = 10\nh = 10\n[[parts]]\nshape = \"rect\"\nb = 30\nh = 30\nvoid = true\n[[parts]]\nshape = \"rect\"\nb = 200\nh = 20\nat = [0, 100]\n",
        // Very thin and very large.
        "[[parts]]\nshape = \"rect\"\nb = 1000\nh = 0.5\n",
        "[[parts]]\nshape = \"rect\"\nb = 1e6\nh = 3e5\n[[parts]]\nshape = \"circle\"\nd = 1\nvoid = true\n",
    ];
    let opts = Options {
        torsion: Some(TorsionOptions::default()),
        ..Options::default()
    };
    for body in cases {
        let text = format!("format = 1\nunits = \"mm\"\n{body}");
        match kern::file::load::analyse(&text, &opts) {
            Ok(a) => match &a.torsion {
                Some(Ok(t)) => assert!(t.j.is_finite() && t.j > 0.0, "{body}: J = {}", t.j),
                Some(Err(e)) => assert!(!e.to_string().is_empty(), "{body}"),
                None => panic!("torsion was asked for"),
            },
            Err(d) => assert!(!d.message.is_empty()),
        }
    }
}
