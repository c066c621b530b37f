//! Malformed section files are refused cleanly: no panic, an error whose message says
//! what is wrong and how to fix it, at a sane `line:column` (FORMAT.md: "Unknown keys
//! are an error (with line and column)", "Nothing panics, whatever the input").

use kern::analysis::Options;
use kern::file::locate;
use kern::model::schema::SPECS;
use proptest::prelude::*;

const HEAD: &str = "format = 1\nunits = \"mm\"\n";

/// The error of a text as `(line, column, message)`; fails the test if it is accepted.
fn err(text: &str) -> (usize, usize, String) {
    match kern::file::load::analyse(text, &Options::default()) {
        Ok(_) => panic!("accepted:\n{text}"),
        Err(d) => {
            let (l, c) = locate(text, d.span.start);
            assert!(
                d.span.start <= text.len(),
                "span {:?} beyond the text",
                d.span
            );
            assert!(!d.message.trim().is_empty());
            (l, c, d.message)
        }
    }
}

/// A file of the standard head and a body.
fn with(body: &str) -> String {
    format!("{HEAD}{body}")
}

fn rect(extra: &str) -> String {
    with(&format!(
        "[[parts]]\nshape = \"rect\"\nb = 100\nh = 200\n{extra}"
    ))
}

#[track_caller]
fn expect(text: &str, line: usize, col: Option<usize>, words: &[&str]) {
    let (l, c, m) = err(text);
    assert_eq!(l, line, "line of `{m}` in\n{text}");
    if let Some(col) = col {
        assert_eq!(c, col, "column of `{m}` in\n{text}");
    }
    for w in words {
        assert!(m.contains(w), "`{m}` should mention `{w}`");
    }
}

#[test]
fn typos_in_keys_are_named_with_a_hint() {
    // The key of the typo, not the part, is pointed at, with the likely key.
    expect(
        &with("[[parts]]\nshpae = \"rect\"\nb = 1\nh = 1\n"),
        4,
        Some(1),
        &["shpae", "did you mean `shape`"],
    );
    expect(
        &with("[[parts]]\nshape = \"rect\"\nwith = 100\nh = 200\n"),
        5,
        Some(1),
        &["unknown key `with`", "b, h"],
    );
    expect(
        &rect("hieght = 3\n"),
        7,
        Some(1),
        &["hieght", "allowed here", "b, h"],
    );
    expect(
        &with("unit = \"mm\"\n"),
        3,
        Some(1),
        &["`unit`", "did you mean `units`"],
    );
    expect(
        &rect("[[materials]]\nname = \"s\"\nEE = \"200 GPa\"\n"),
        9,
        Some(1),
        &["`EE`"],
    );
    expect(&rect("[actions]\nMz = \"1 kN*m\"\n"), 8, Some(1), &["`Mz`"]);
    expect(
        &rect("[member]\nspan = \"6 m\"\nudl2 = \"1 kN/m\"\n"),
        9,
        Some(1),
        &["`udl2`", "did you mean `udl`"],
    );
}

#[test]
fn unknown_names_of_things() {
    expect(
        &with("[[parts]]\nshape = \"rectangle\"\nb = 1\nh = 1\n"),
        4,
        Some(9),
        &["unknown shape `rectangle`", "rect"],
    );
    expect(
        &rect("anchor = \"middle\"\n"),
        7,
        Some(10),
        &["unknown anchor `middle`", "center"],
    );
    expect(
        "format = 1\nunits = \"furlong\"\n[[parts]]\nshape = \"rect\"\nb = 1\nh = 1\n",
        2,
        Some(9),
        &["furlong", "mm"],
    );
    expect(
        &rect("[member]\nspan = \"6 m\"\nsupport = \"hinged\"\n"),
        9,
        Some(11),
        &["hinged", "simple"],
    );
    expect(
        &rect("[actions]\nN = \"30 kNN\"\n"),
        8,
        None,
        &["unknown unit `kNN`", "kN"],
    );
    expect(
        &rect("[[materials]]\nname = \"s\"\nE = \"200 GPaa\"\n"),
        9,
        None,
        &["GPaa", "GPa"],
    );
    // A quantity of the wrong kind says which kind is wanted.
    expect(
        &rect("[actions]\nMx = \"30 kN\"\n"),
        8,
        None,
        &["moment", "kN*m"],
    );
    expect(
        &rect("[member]\nspan = \"6 m\"\nudl = \"5 kN\"\n"),
        9,
        None,
        &["line load", "kN/m"],
    );
}

#[test]
fn missing_pieces() {
    expect("units = \"mm\"\n", 1, Some(1), &["format = 1"]);
    expect("", 1, Some(1), &["format = 1"]);
    expect(
        "format = 1\n[[parts]]\nshape = \"rect\"\nb = 1\nh = 1\n",
        1,
        Some(1),
        &["units"],
    );
    expect(&with("[[parts]]\nb = 1\nh = 1\n"), 3, Some(1), &["shape"]);
    expect(
        &with("[[parts]]\nshape = \"rect\"\nb = 1\n"),
        3,
        Some(1),
        &["needs `h`"],
    );
    expect(
        &with("[[parts]]\nshape = \"polygon\"\n"),
        3,
        Some(1),
        &["points"],
    );
    expect(HEAD, 1, Some(1), &["no enabled solid part"]);
    expect(
        &rect("enabled = false\n"),
        1,
        Some(1),
        &["no enabled solid part"],
    );
    expect(
        &rect("[[materials]]\nname = \"s\"\nfy = \"200 MPa\"\n"),
        7,
        Some(1),
        &["needs `E`"],
    );
    expect(
        &rect("[member]\nsupport = \"simple\"\n"),
        7,
        Some(1),
        &["needs `span`"],
    );
    expect(
        &rect("[member]\nspan = \"6 m\"\npoint = [{ P = \"30 kN\" }]\n"),
        9,
        None,
        &["`P` and `a`"],
    );
}

#[test]
fn format_versions() {
    expect(
        "format = 2\nunits = \"mm\"\n",
        1,
        Some(10),
        &["format 2", "update kern"],
    );
    expect(
        "format = 1.0\nunits = \"mm\"\n",
        1,
        Some(10),
        &["integer 1"],
    );
    expect(
        "format = \"1\"\nunits = \"mm\"\n",
        1,
        Some(10),
        &["integer 1"],
    );
    expect("format = -1\nunits = \"mm\"\n", 1, Some(10), &["integer 1"]);
    expect(
        "format = 99999999999999999999\nunits = \"mm\"\n",
        1,
        Some(10),
        &["not valid TOML"],
    );
}

#[test]
fn non_finite_numbers_are_refused() {
    // `nan`, `inf` and `-inf` are valid TOML floats (TOML v1.0.0, "Float").
    for v in ["nan", "inf", "-inf", "+nan"] {
        expect(
            &with(&format!("[[parts]]\nshape = \"rect\"\nb = {v}\nh = 1\n")),
            5,
            Some(5),
            &["`b`", "finite"],
        );
    }
    expect(
        &rect("rotate = nan\n"),
        7,
        Some(10),
        &["`rotate`", "finite"],
    );
    expect(&rect("at = [0, inf]\n"), 7, Some(10), &["`at`", "finite"]);
    expect(
        &with("[params]\nk = nan\n[[parts]]\nshape = \"rect\"\nb = \"k\"\nh = 1\n"),
        4,
        Some(5),
        &["`k`", "finite"],
    );
    expect(
        &with("[[parts]]\nshape = \"rect\"\nb = \"1e308*10\"\nh = 1\n"),
        5,
        None,
        &["`b`", "not a finite number"],
    );
    expect(
        &with("[[parts]]\nshape = \"rect\"\nb = \"1e999\"\nh = 1\n"),
        5,
        Some(6),
        &["too large"],
    );
    expect(
        &rect("[[materials]]\nname = \"s\"\nE = \"1e999 GPa\"\n"),
        9,
        None,
        &["`E`"],
    );
}

#[test]
fn sizes_must_be_positive() {
    for (shape, dims, bad) in [
        ("rect", "b = -3\nh = 1\n", "b"),
        ("rect", "b = 0\nh = 1\n", "b"),
        ("rect", "b = 1\nh = \"-1\"\n", "h"),
        ("circle", "d = 0.0\n", "d"),
        ("half_circle", "d = -2\n", "d"),
        ("quarter_circle", "r = 0\n", "r"),
        ("triangle", "b = 1\nh = 0\n", "h"),
        ("pipe", "d = 100\nt = 0\n", "t"),
        ("angle", "h = 100\nb = -100\nt = 10\n", "b"),
    ] {
        let text = with(&format!("[[parts]]\nshape = \"{shape}\"\n{dims}"));
        let (_, _, m) = err(&text);
        assert!(m.contains(&format!("`{bad}`")), "{shape}: `{m}`");
    }
    // A negative root radius is refused; zero means none.
    expect(
        &with("[[parts]]\nshape = \"ibeam\"\nd = 300\nb = 150\ntf = 10\ntw = 6\nr = -1\n"),
        9,
        Some(5),
        &["`r`", "negative"],
    );
    assert!(kern::file::load::analyse(
        &with("[[parts]]\nshape = \"ibeam\"\nd = 300\nb = 150\ntf = 10\ntw = 6\nr = 0\n"),
        &Options::default()
    )
    .is_ok());
    // Dimensions that do not make the shape.
    expect(
        &with("[[parts]]\nshape = \"pipe\"\nd = 100\nt = 50\n"),
        6,
        None,
        &["bore", "circle"],
    );
    expect(
        &with("[[parts]]\nshape = \"box\"\nh = 100\nb = 100\nt = 60\n"),
        7,
        None,
        &["hollow"],
    );
    expect(
        &with("[[parts]]\nshape = \"ibeam\"\nd = 300\nb = 150\ntf = 10\ntw = 6\nr = 100\n"),
        9,
        None,
        &["root radius"],
    );
    // A zed: the web thinner than the flange width, both flanges leaving a web, each
    // root fillet within its outstand and the web.
    let zed = |dims: &str| with(&format!("[[parts]]\nshape = \"zed\"\n{dims}"));
    expect(
        &zed("d = 200\nb = 6\ntf = 8\ntw = 6\n"),
        8,
        Some(6),
        &["tw", "flange width"],
    );
    expect(
        &zed("d = 16\nb = 75\ntf = 8\ntw = 6\n"),
        7,
        Some(6),
        &["tf", "no web"],
    );
    expect(
        &zed("d = 200\nb = 75\ntf = 8\ntw = 6\nr = 70\n"),
        9,
        Some(5),
        &["root radius"],
    );
    expect(
        &zed("d = 200\nb = 75\ntf = 8\ntw = 6\nr = -1\n"),
        9,
        Some(5),
        &["negative"],
    );
}

#[test]
fn any_apex_is_a_triangle() {
    // FORMAT.md: `apex` may be any real; the area stays b·h/2 (shear of a triangle
    // preserves area: Cavalieri's principle).
    for apex in ["0", "-1e6", "1e6", "50", "-3.5"] {
        let t = with(&format!(
            "[[parts]]\nshape = \"triangle\"\nb = 100\nh = 60\napex = {apex}\n"
        ));
        let a = kern::file::load::analyse(&t, &Options::default()).expect("valid triangle");
        assert!(
            (a.props.area - 3000.0).abs() <= 1e-9 * 3000.0,
            "apex {apex}"
        );
    }
}

#[test]
fn expression_errors_name_the_key_and_place() {
    expect(
        &with("[params]\na = \"b\"\nb = \"a\"\n[[parts]]\nshape = \"rect\"\nb = \"a\"\nh = 1\n"),
        4,
        None,
        &["cycle", "a → b → a"],
    );
    expect(
        &with("[params]\na = \"2*a\"\n[[parts]]\nshape = \"rect\"\nb = 1\nh = 1\n"),
        4,
        None,
        &["cycle"],
    );
    expect(
        &with("[[parts]]\nshape = \"rect\"\nb = \"wdth\"\nh = 1\n"),
        5,
        Some(6),
        &["unknown name `wdth`", "[params]"],
    );
    expect(
        &with("[[parts]]\nshape = \"rect\"\nb = \"1/0\"\nh = 1\n"),
        5,
        Some(7),
        &["division by zero"],
    );
    expect(
        &with("[params]\nz = 0\n[[parts]]\nshape = \"rect\"\nb = \"10/(z - z)\"\nh = 1\n"),
        7,
        None,
        &["division by zero"],
    );
    expect(
        &with("[[parts]]\nshape = \"rect\"\nb = \"sqrt(-1)\"\nh = 1\n"),
        5,
        None,
        &["negative"],
    );
    expect(
        &with("[[parts]]\nshape = \"rect\"\nb = \"\"\nh = 1\n"),
        5,
        None,
        &["empty"],
    );
    expect(
        &with("[[parts]]\nshape = \"rect\"\nb = \"1 +\"\nh = 1\n"),
        5,
        None,
        &["ends too early"],
    );
    expect(
        &with("[[parts]]\nshape = \"rect\"\nb = \"(1\"\nh = 1\n"),
        5,
        None,
        &["`b`"],
    );
    expect(
        &with("[[parts]]\nshape = \"rect\"\nb = \"2 mm\"\nh = 1\n"),
        5,
        Some(8),
        &["`mm`", "operator"],
    );
    expect(
        &with("[[parts]]\nshape = \"rect\"\nb = \"max()\"\nh = 1\n"),
        5,
        None,
        &["max"],
    );
    expect(
        &with("[params]\npi = 3\n[[parts]]\nshape = \"rect\"\nb = 1\nh = 1\n"),
        4,
        None,
        &["built-in"],
    );
}

#[test]
fn deep_nesting_is_refused_without_overflowing_the_stack() {
    let deep = |n: usize| format!("{}1{}", "(".repeat(n), ")".repeat(n));
    for n in [100, 2_000, 10_000, 100_000] {
        let t = with(&format!(
            "[[parts]]\nshape = \"rect\"\nb = \"{}\"\nh = 1\n",
            deep(n)
        ));
        let (l, _, m) = err(&t);
        assert_eq!(l, 5, "{m}");
        assert!(m.contains("split it into params"), "{m}");
    }
    let unary = format!("{}1", "-".repeat(5_000));
    let (_, _, m) = err(&with(&format!(
        "[[parts]]\nshape = \"rect\"\nb = \"{unary}\"\nh = 1\n"
    )));
    assert!(m.contains("`b`"), "{m}");
    let power = format!("2{}", "^2".repeat(1_500));
    let (_, _, m) = err(&with(&format!(
        "[[parts]]\nshape = \"rect\"\nb = \"{power}\"\nh = 1\n"
    )));
    assert!(m.contains("`b`"), "{m}");
    for n in [50, 10_000, 200_000] {
        let arr = format!("{}1{}", "[".repeat(n), "]".repeat(n));
        let (l, _, m) = err(&rect(&format!("at = {arr}\n")));
        assert_eq!(l, 7, "{m}");
        let tbl = format!("{}1{}", "{a=".repeat(n), "}".repeat(n));
        let (l, _, _) = err(&rect(&format!("name = {tbl}\n")));
        assert_eq!(l, 7);
    }
}

#[test]
fn wrong_types() {
    expect(
        &with("[[parts]]\nshape = \"rect\"\nb = true\nh = 1\n"),
        5,
        Some(5),
        &["`b` must be a number or an expression"],
    );
    expect(&rect("at = [1]\n"), 7, Some(6), &["pair [x, y]"]);
    expect(&rect("at = [1, 2, 3]\n"), 7, Some(6), &["pair [x, y]"]);
    expect(&rect("at = \"origin\"\n"), 7, Some(6), &["pair [x, y]"]);
    expect(&rect("at = [true, 1]\n"), 7, Some(7), &["`at`"]);
    expect(
        &with("[[parts]]\nshape = \"polygon\"\npoints = 3\n"),
        5,
        Some(10),
        &["list of [x, y] pairs"],
    );
    expect(
        &with("[[parts]]\nshape = \"polygon\"\npoints = [3, 4, 5]\n"),
        5,
        Some(11),
        &["pair [x, y]"],
    );
    expect(&rect("void = \"yes\"\n"), 7, Some(8), &["true or false"]);
    expect(&rect("shape = 3\n"), 7, None, &["not valid TOML"]);
    expect(
        &rect("name = 3\n"),
        7,
        Some(8),
        &["`name` must be a string"],
    );
    expect(
        "format = 1\nunits = \"mm\"\n[parts]\nshape = \"rect\"\n",
        3,
        Some(1),
        &["[[parts]]"],
    );
    expect(
        "format = 1\nunits = \"mm\"\nparams = 3\n",
        3,
        Some(10),
        &["[params]"],
    );
    expect(
        "format = 1\nunits = 25.4\n",
        2,
        Some(9),
        &["`units`", "string"],
    );
    expect(
        "format = 1\nunits = \"mm\"\n[params]\na = [1, 2]\n",
        4,
        Some(5),
        &["`a` must be a number"],
    );
    expect(
        &rect("[member]\nspan = \"6 m\"\npoint = 3\n"),
        9,
        None,
        &["`point`"],
    );
}

#[test]
fn materials() {
    expect(
        &rect("material = \"steel\"\n"),
        7,
        Some(12),
        &["`steel` is not defined", "[[materials]]"],
    );
    expect(
        &rect(
            "[[materials]]\nname = \"s\"\nE = \"200 GPa\"\n[[materials]]\nname = \"s\"\nE = \"200 GPa\"\n",
        ),
        10,
        Some(1),
        &["defined twice"],
    );
    expect(
        &rect("[[materials]]\nE = \"200 GPa\"\n"),
        7,
        Some(1),
        &["`name`"],
    );
    expect(
        &rect("[[materials]]\nname = \"s\"\nE = \"-200 GPa\"\n"),
        9,
        None,
        &["`E`"],
    );
    expect(
        &rect("[[materials]]\nname = \"s\"\nE = \"200\"\n"),
        9,
        None,
        &["`E`"],
    );
}

#[test]
fn polygons() {
    expect(
        &with("[[parts]]\nshape = \"polygon\"\npoints = [[0,0],[1,1],[1,0],[0,1]]\n"),
        5,
        None,
        &["crosses itself"],
    );
    expect(
        &with("[[parts]]\nshape = \"polygon\"\npoints = [[0,0],[1,1]]\n"),
        5,
        None,
        &["3 or more points"],
    );
    expect(
        &with("[[parts]]\nshape = \"polygon\"\npoints = []\n"),
        5,
        None,
        &["3 or more points"],
    );
    // Collinear points enclose nothing.
    let (_, _, m) = err(&with(
        "[[parts]]\nshape = \"polygon\"\npoints = [[0,0],[1,1],[2,2]]\n",
    ));
    assert!(m.contains("polygon") || m.contains("area"), "{m}");
    // A repeated point.
    let (_, _, m) = err(&with(
        "[[parts]]\nshape = \"polygon\"\npoints = [[0,0],[1,0],[1,0],[0,1]]\n",
    ));
    assert!(m.contains("polygon"), "{m}");
}

#[test]
fn voids_that_remove_everything() {
    // FORMAT.md, Composition: a net area that is not positive is an error.
    for vb in ["200", "100"] {
        let t = rect(&format!(
            "[[parts]]\nshape = \"rect\"\nb = {vb}\nh = 200\nvoid = true\n"
        ));
        let (_, _, m) = err(&t);
        assert!(m.contains("net area") && m.contains("not positive"), "{m}");
    }
    // With nothing solid, the message points at the void that is all there is.
    let t = rect("void = true\n");
    let part_line = t.lines().position(|l| l == "[[parts]]").unwrap() + 1;
    expect(&t, part_line, Some(1), &["no enabled solid part"]);
}

#[test]
fn extreme_magnitudes_say_what_is_wrong() {
    // The product overflows; the message must not blame voids that are not there.
    for body in [
        "b = 1e300\nh = 1e300\n",
        "b = 1e-300\nh = 1e-300\n",
        "b = 1\nh = 1\nat = [1e300, 0]\n",
    ] {
        let (_, _, m) = err(&with(&format!("[[parts]]\nshape = \"rect\"\n{body}")));
        assert!(!m.contains("voids remove"), "{body}: {m}");
    }
    // Large but representable sections are fine.
    let a = kern::file::load::analyse(
        &with("[[parts]]\nshape = \"rect\"\nb = 1e60\nh = 1e60\n"),
        &Options::default(),
    )
    .expect("1e60 is a size");
    assert!(a.props.ixx.is_finite() && a.props.area > 0.0);
}

#[test]
fn member_loads() {
    expect(
        &rect("[member]\nspan = \"6 m\"\npoint = [{ P = \"30 kN\", a = \"7 m\" }]\n"),
        9,
        None,
        &["on the span"],
    );
    expect(
        &rect("[member]\nspan = \"6 m\"\npoint = [{ P = \"30 kN\", a = \"-1 m\" }]\n"),
        9,
        None,
        &["on the span"],
    );
    expect(&rect("[member]\nspan = \"0 m\"\n"), 8, Some(8), &["`span`"]);
    expect(
        &rect("[member]\nspan = \"6 m\"\ndeflection_limit = 0\n"),
        9,
        Some(20),
        &["deflection_limit"],
    );
}

#[test]
fn self_weight_without_density_is_not_silently_dropped() {
    let t = rect("[member]\nspan = \"6 m\"\nself_weight = true\n");
    match kern::file::load::analyse(&t, &Options::default()) {
        Ok(a) => assert!(
            a.warnings.iter().any(|w| w.to_string().contains("density")),
            "{:?}",
            a.warnings
        ),
        Err(d) => assert!(d.message.contains("density"), "{}", d.message),
    }
}

#[test]
fn many_parts_do_not_panic() {
    // A stack of 2,000 touching plates: no overlap, so no warning.
    let mut t = String::from(HEAD);
    for i in 0..2_000 {
        t.push_str(&format!(
            "[[parts]]\nshape = \"rect\"\nb = 100\nh = 2\nanchor = \"bottom_left\"\nat = [0, {}]\n",
            2 * i
        ));
    }
    let a = kern::file::load::analyse(&t, &Options::default()).expect("valid");
    assert!((a.props.area - 400_000.0).abs() < 1e-6);
    assert!(
        a.warnings.is_empty(),
        "{:?}",
        &a.warnings[..a.warnings.len().min(3)]
    );
    // The same part 60 times in one place: every pair overlaps and warns, no panic.
    let mut t = String::from(HEAD);
    for _ in 0..60 {
        t.push_str("[[parts]]\nshape = \"circle\"\nd = 10\n");
    }
    let a = kern::file::load::analyse(&t, &Options::default()).expect("valid");
    assert!(!a.warnings.is_empty());
}

#[test]
fn control_characters_and_line_endings() {
    expect(&rect("\0\u{1}"), 7, Some(1), &["not valid TOML"]);
    // CRLF counts lines like LF.
    expect(
        "format = 1\r\nunits = \"mm\"\r\n[[parts]]\r\nshape = \"rect\"\r\nb = 1\r\nh = -1\r\n",
        6,
        Some(5),
        &["`h`"],
    );
    // Columns count characters, not bytes (FORMAT.md: UTF-8 text).
    expect(
        &with("title = \"Träger\"\n[[parts]]\nshape = \"rect\"\nb = \"é\"\nh = 1\n"),
        6,
        Some(6),
        &["`é`"],
    );
}

/// Accepts or refuses a text; an accepted one has finite core results and serialises.
fn survives(text: &str) {
    match kern::file::load::analyse(text, &Options::default()) {
        Err(d) => {
            assert!(d.span.start <= text.len() && !d.message.is_empty());
            let _ = locate(text, d.span.start);
        }
        Ok(a) => {
            let p = &a.props;
            for v in [
                p.area,
                p.centroid.x,
                p.centroid.y,
                p.ixx,
                p.iyy,
                p.principal.i1,
            ] {
                assert!(v.is_finite(), "{v} from\n{text}");
            }
            let u = kern::report::out::OutUnits::new(a.section.units, None);
            let j = kern::report::json::to_json("f.toml", &a, &u);
            assert!(serde_json::from_str::<serde_json::Value>(&j).is_ok());
        }
    }
}

fn demo_texts() -> Vec<String> {
    let dir = std::path::Path::new(env!("CARGO_MANIFEST_DIR")).join("sections");
    let mut v: Vec<String> = std::fs::read_dir(dir)
        .unwrap()
        .filter_map(|e| e.ok())
        .filter_map(|e| std::fs::read_to_string(e.path()).ok())
        .collect();
    v.sort();
    v
}

#[derive(Debug, Clone)]
enum Mutation {
    DeleteLine(usize),
    DuplicateLine(usize),
    FlipChar(usize, char),
    Truncate(usize),
    SwapLines(usize, usize),
}

fn mutate(text: &str, m: &Mutation) -> String {
    let mut lines: Vec<&str> = text.lines().collect();
    let n = lines.len().max(1);
    match *m {
        Mutation::DeleteLine(i) => {
            if !lines.is_empty() {
                lines.remove(i % n);
            }
            lines.join("\n")
        }
        Mutation::DuplicateLine(i) => {
            if let Some(l) = lines.get(i % n).copied() {
                lines.insert(i % n, l);
            }
            lines.join("\n")
        }
        Mutation::SwapLines(i, j) => {
            if !lines.is_empty() {
                lines.swap(i % n, j % n);
            }
            lines.join("\n")
        }
        Mutation::FlipChar(i, c) => {
            let mut chars: Vec<char> = text.chars().collect();
            if !chars.is_empty() {
                let k = i % chars.len();
                chars[k] = c;
            }
            chars.into_iter().collect()
        }
        Mutation::Truncate(i) => {
            let k = i % (text.len() + 1);
            let mut k = k;
            while !text.is_char_boundary(k) {
                k -= 1;
            }
            text[..k].to_string()
        }
    }
}

fn mutation() -> impl Strategy<Value = Mutation> {
    prop_oneof![
        any::<usize>().prop_map(Mutation::DeleteLine),
        any::<usize>().prop_map(Mutation::DuplicateLine),
        (any::<usize>(), any::<usize>()).prop_map(|(i, j)| Mutation::SwapLines(i, j)),
        (
            any::<usize>(),
            prop_oneof![
                Just('0'),
                Just('-'),
                Just('"'),
                Just('['),
                Just(']'),
                Just('='),
                Just('\n'),
                Just('é'),
                any::<char>()
            ]
        )
            .prop_map(|(i, c)| Mutation::FlipChar(i, c)),
        any::<usize>().prop_map(Mutation::Truncate),
    ]
}

/// A number of any magnitude and sign, as TOML.
fn wild_number() -> impl Strategy<Value = String> {
    prop_oneof![
        (-300i32..300, -9.9..9.9f64).prop_map(|(e, m)| format!("{m}e{e}")),
        (-1000.0..1000.0f64).prop_map(|x| format!("{x}")),
        Just("0".to_string()),
        Just("1e308".to_string()),
        Just("-1e-300".to_string()),
        Just("\"1/3\"".to_string()),
        Just("\"p\"".to_string()),
    ]
}

fn wild_part() -> impl Strategy<Value = String> {
    // Every shape drawn from dimensions, with its keys, from the schema.
    let shape = prop::sample::select(
        SPECS
            .iter()
            .filter(|s| !s.points)
            .map(|s| (s.name, s.keys.iter().map(|k| k.key).collect::<Vec<_>>()))
            .collect::<Vec<_>>(),
    );
    (
        shape,
        prop::collection::vec(wild_number(), 5),
        wild_number(),
        wild_number(),
        wild_number(),
        any::<bool>(),
    )
        .prop_map(|((name, keys), vals, x, y, rot, void)| {
            let mut t = format!("[[parts]]\nshape = \"{name}\"\n");
            for (k, v) in keys.iter().zip(&vals) {
                t.push_str(&format!("{k} = {v}\n"));
            }
            t.push_str(&format!("at = [{x}, {y}]\nrotate = {rot}\nvoid = {void}\n"));
            t
        })
}

proptest! {
    #![proptest_config(ProptestConfig::with_cases(256))]

    /// Any text at all: refused or accepted, never a panic (FORMAT.md).
    #[test]
    fn arbitrary_strings_do_not_panic(s in "\\PC{0,200}") {
        survives(&s);
        survives(&format!("{HEAD}{s}"));
    }

    /// The demo files, damaged: a line deleted, doubled or swapped, a character
    /// changed, the file cut short.
    #[test]
    fn damaged_demo_files_do_not_panic(
        which in any::<usize>(),
        ms in prop::collection::vec(mutation(), 1..4),
    ) {
        let demos = demo_texts();
        let mut t = demos[which % demos.len()].clone();
        for m in &ms {
            t = mutate(&t, m);
        }
        survives(&t);
    }
}

proptest! {
    #![proptest_config(ProptestConfig::with_cases(128))]

    /// Structured sections with numbers from 1e-300 to 1e300 of either sign.
    #[test]
    fn wild_numbers_do_not_panic(
        p in wild_number(),
        parts in prop::collection::vec(wild_part(), 1..4),
        span in wild_number(),
        mx in wild_number(),
    ) {
        let mut t = format!("{HEAD}[params]\np = {p}\n");
        for part in &parts {
            t.push_str(part);
        }
        t.push_str(&format!("[actions]\nMx = {mx}\n[member]\nspan = {span}\n"));
        survives(&t);
    }
}

/// `[sheet]` (docs/format.md "Sheet"): a typo gets the likely key, a value that is not a
/// string says so, both at the value's line; a file without `[sheet]` stays valid.
#[test]
fn sheet_fields_are_checked_like_the_rest() {
    let body = "[[parts]]\nshape = \"rect\"\nb = 100\nh = 200\n[sheet]\n";
    expect(
        &with(&format!("{body}projcet = \"Bay 4\"\n")),
        8,
        Some(1),
        &["projcet", "did you mean `project`"],
    );
    expect(
        &with(&format!("{body}job = 2026\n")),
        8,
        Some(7),
        &["`job` must be a string"],
    );
    expect(
        &with("sheet = 3\n"),
        3,
        Some(9),
        &["`sheet` must be a table"],
    );
    let doc = kern::file::read::parse(&with(body)).expect("an empty [sheet] is valid");
    assert!(doc
        .sheet
        .is_some_and(|s| s.fields().iter().all(|f| f.1.is_none())));
    let old = kern::file::read::parse(&rect("")).expect("no [sheet] is valid");
    assert!(old.sheet.is_none());
}
