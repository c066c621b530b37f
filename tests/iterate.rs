//! The iterating verbs end to end (FORMAT.md "Other verbs"): `seek`, `sweep`, `diff`,
//! `check`, `calc --sensitivity`, and the git textconv recipe of README.md. Every value
//! is checked against a closed form (source named beside it) or against `kern calc`.

use serde_json::Value;
use std::path::{Path, PathBuf};
use std::process::{Command, Output};

#[path = "support/scratch.rs"]
mod support_scratch;
use support_scratch::scratch;

/// `kern` run in `dir` on a command line of words separated by spaces.
fn kern_line(dir: &Path, line: &str) -> Output {
    kern_in(dir, &line.split_whitespace().collect::<Vec<_>>())
}

fn kern_in(dir: &Path, args: &[&str]) -> Output {
    Command::new(env!("CARGO_BIN_EXE_kern"))
        .args(args)
        .current_dir(dir)
        .output()
        .expect("kern runs")
}

fn stdout(o: &Output) -> String {
    String::from_utf8(o.stdout.clone()).expect("UTF-8 output")
}

fn stderr(o: &Output) -> String {
    String::from_utf8_lossy(&o.stderr).into_owned()
}

fn json_lines(o: &Output) -> Vec<Value> {
    stdout(o)
        .lines()
        .map(|l| serde_json::from_str(l).unwrap_or_else(|e| panic!("{e}: {l}")))
        .collect()
}

fn num(v: &Value, path: &str) -> f64 {
    let mut x = v;
    for k in path.split('.') {
        x = &x[k];
    }
    x.as_f64()
        .unwrap_or_else(|| panic!("{path} is not a number in {v}"))
}

/// A garage lintel plate: b = 100 mm, depth h a param, with a comment and a blank line
/// the edits must keep.
const PLATE: &str = "format = 1\ntitle = \"garage lintel plate\"\nunits = \"mm\"\n\n[params]\nh = 200   # depth\nb = 100\n\n[[parts]]\nshape = \"rect\"\nb = \"b\"\nh = \"h\"\n";

fn plate(dir: &Path) -> PathBuf {
    let p = dir.join("plate.toml");
    std::fs::write(&p, PLATE).unwrap();
    p
}

#[test]
fn seek_finds_the_depth_a_hand_calculation_gives() {
    let d = scratch("seek");
    plate(&d);
    let o = kern_line(
        &d,
        "seek plate.toml --param h --target inertia.xx=8e8 --json",
    );
    assert_eq!(o.status.code(), Some(0), "{}", stderr(&o));
    let v = &json_lines(&o)[0];
    // Rectangle Ixx = b·h³/12 (Gere & Goodno, Mechanics of Materials, App. E case 1),
    // so h = (12·I/b)^(1/3).
    let want = (12.0 * 8e8 / 100.0f64).cbrt();
    let h = num(v, "value");
    assert!((h - want).abs() <= 1e-9 * want, "{h} vs {want}");
    assert_eq!(v["param"], "h");
    let ixx = num(&v["result"], "inertia.xx");
    assert!((ixx - 8e8).abs() <= 1e-9 * 8e8, "{ixx}");
    // The same with a unit and a range: 80 000 cm⁴ = 8e8 mm⁴.
    let o = kern_in(
        &d,
        &[
            "seek",
            "plate.toml",
            "--param",
            "h",
            "--target",
            "inertia.xx=80000 cm4",
            "--within",
            "100..1000",
        ],
    );
    assert_eq!(o.status.code(), Some(0), "{}", stderr(&o));
    assert!(stdout(&o).contains("h = 457.88"), "{}", stdout(&o));
}

#[test]
fn seek_refuses_cleanly_without_a_root() {
    let d = scratch("noroot");
    plate(&d);
    let o = kern_line(
        &d,
        "seek plate.toml --param h --target inertia.xx=1e9 --within 100..300",
    );
    assert_eq!(o.status.code(), Some(1));
    assert!(stdout(&o).is_empty());
    let e = stderr(&o);
    // The reachable range: b·h³/12 at h = 100 and 300 is 8.33e6 and 2.25e8 mm⁴.
    assert!(
        e.contains("no value of h")
            && e.contains("from 100 to 300")
            && e.contains("8.33333×10⁶ mm⁴ (at h = 100)")
            && e.contains("225.000×10⁶ mm⁴ (at h = 300)"),
        "{e}"
    );
    // An unknown result key is an error with a hint.
    let o = kern_line(&d, "seek plate.toml --param h --target inertia.x=1");
    assert_eq!(o.status.code(), Some(2));
    assert!(
        stderr(&o).contains("did you mean `inertia.xx`"),
        "{}",
        stderr(&o)
    );
}

#[test]
fn seek_write_changes_exactly_one_line() {
    let d = scratch("write");
    let p = plate(&d);
    let o = kern_line(
        &d,
        "seek plate.toml --param h --target inertia.xx=8e8 --write",
    );
    assert_eq!(o.status.code(), Some(0), "{}", stderr(&o));
    let after = std::fs::read_to_string(&p).unwrap();
    let (old, new): (Vec<&str>, Vec<&str>) = (PLATE.lines().collect(), after.lines().collect());
    assert_eq!(old.len(), new.len());
    let changed: Vec<usize> = (0..old.len()).filter(|&i| old[i] != new[i]).collect();
    assert_eq!(changed.len(), 1, "{after}");
    assert!(
        new[changed[0]].starts_with("h = 457.88"),
        "{}",
        new[changed[0]]
    );
    assert!(
        new[changed[0]].ends_with("# depth"),
        "the comment stays: {}",
        new[changed[0]]
    );
    // The file as written reaches the target (b·h³/12 = 8e8 to 1e-9).
    let o = kern_in(&d, &["calc", "--json", "--no-torsion", "plate.toml"]);
    let ixx = num(&json_lines(&o)[0], "inertia.xx");
    assert!((ixx - 8e8).abs() <= 1e-9 * 8e8, "{ixx}");
}

#[test]
fn sweep_is_monotone_in_depth_and_matches_calc() {
    let d = scratch("sweep");
    let p = plate(&d);
    let o = kern_line(
        &d,
        "sweep plate.toml --param h --from 100 --to 300 --steps 5 --json --no-torsion",
    );
    assert_eq!(o.status.code(), Some(0), "{}", stderr(&o));
    let lines = json_lines(&o);
    assert_eq!(lines.len(), 5);
    let mut last = 0.0;
    for (i, v) in lines.iter().enumerate() {
        let h = 100.0 + 50.0 * i as f64;
        assert_eq!(v["sweep"]["param"], "h");
        assert_eq!(num(v, "sweep.value"), h);
        let ixx = num(v, "inertia.xx");
        // Ixx = b·h³/12 grows with h (Gere & Goodno, App. E case 1).
        assert!(ixx > last, "not monotone at h = {h}");
        last = ixx;
        // The same as `kern calc` of the file with that value written in.
        std::fs::write(&p, PLATE.replace("h = 200", &format!("h = {h}"))).unwrap();
        let c = kern_in(&d, &["calc", "--json", "--no-torsion", "plate.toml"]);
        let mut want = json_lines(&c).remove(0);
        want["sweep"] = v["sweep"].clone();
        assert_eq!(&want, v, "at h = {h}");
    }
    std::fs::write(&p, PLATE).unwrap();
    // The readable table marks the current value.
    let o = kern_line(
        &d,
        "sweep plate.toml --param h --from 100 --to 300 --steps 5 --no-torsion",
    );
    assert!(
        stdout(&o).contains("◀ now") && stdout(&o).contains("Caution"),
        "{}",
        stdout(&o)
    );
}

#[test]
fn sweep_csv_parses() {
    let d = scratch("csv");
    plate(&d);
    let o = kern_line(&d, "sweep plate.toml --param b --from 50 --to 150 --steps 3 --csv --result inertia.xx --result area");
    assert_eq!(o.status.code(), Some(0), "{}", stderr(&o));
    let text = stdout(&o);
    let rows: Vec<Vec<&str>> = text.lines().map(|l| l.split(',').collect()).collect();
    assert_eq!(rows.len(), 4);
    assert!(rows[0][0].starts_with('b') && rows[0][1].starts_with("inertia.xx"));
    for (r, b) in rows[1..].iter().zip([50.0, 100.0, 150.0]) {
        assert_eq!(r.len(), 3);
        let x: Vec<f64> = r.iter().map(|c| c.parse().unwrap()).collect();
        assert_eq!(x[0], b);
        // A = b·h, Ixx = b·h³/12 with h = 200.
        assert!((x[1] - b * 8e6 / 12.0).abs() <= 1e-9 * x[1]);
        assert!((x[2] - b * 200.0).abs() <= 1e-9 * x[2]);
    }
}

fn git(dir: &Path, args: &[&str]) -> Option<Output> {
    Command::new("git")
        .args(args)
        .current_dir(dir)
        .output()
        .ok()
}

/// Git is present and can commit here (name and e-mail set for this repository only).
fn git_repo(dir: &Path) -> bool {
    let ok = |o: Option<Output>| o.is_some_and(|o| o.status.success());
    ok(git(dir, &["init", "-q"]))
        && ok(git(dir, &["config", "user.email", "test@example.invalid"]))
        && ok(git(dir, &["config", "user.name", "kern test"]))
        && ok(git(dir, &["config", "commit.gpgsign", "false"]))
}

#[test]
fn diff_against_a_git_revision() {
    let d = scratch("diff");
    if !git_repo(&d) {
        eprintln!("git is not available: skipped");
        return;
    }
    let p = plate(&d);
    assert!(git(&d, &["add", "plate.toml"]).unwrap().status.success());
    assert!(git(&d, &["commit", "-q", "-m", "plate"])
        .unwrap()
        .status
        .success());
    std::fs::write(&p, PLATE.replace("h = 200", "h = 300")).unwrap();
    let o = kern_in(
        &d,
        &["diff", "plate.toml", "HEAD:", "--json", "--no-torsion"],
    );
    assert_eq!(o.status.code(), Some(0), "{}", stderr(&o));
    let v = &json_lines(&o)[0];
    // b·h³/12 now (h = 300) and at the commit (h = 200).
    assert!((num(&v["a"], "inertia.xx") - 100.0 * 2.7e7 / 12.0).abs() < 1e-3);
    assert!((num(&v["b"], "inertia.xx") - 100.0 * 8e6 / 12.0).abs() < 1e-3);
    let o = kern_in(
        &d,
        &["diff", "plate.toml", "HEAD:plate.toml", "--no-torsion"],
    );
    assert_eq!(o.status.code(), Some(0), "{}", stderr(&o));
    let t = stdout(&o);
    assert!(
        t.lines()
            .any(|l| l.starts_with("Ixx") && l.contains("lower")),
        "{t}"
    );
    // A revision outside a repository says so.
    let lone = scratch("diff-lone");
    plate(&lone);
    let o = kern_in(&lone, &["diff", "plate.toml", "HEAD:"]);
    assert_eq!(o.status.code(), Some(2));
    assert!(
        stderr(&o).contains("not in a git repository") || stderr(&o).contains("git"),
        "{}",
        stderr(&o)
    );
}

#[test]
fn the_textconv_recipe_shows_property_changes() {
    let d = scratch("textconv");
    if !git_repo(&d) {
        eprintln!("git is not available: skipped");
        return;
    }
    let p = plate(&d);
    std::fs::write(d.join(".gitattributes"), "*.toml diff=kern\n").unwrap();
    let conv = format!("{} calc --no-torsion", env!("CARGO_BIN_EXE_kern"));
    assert!(git(&d, &["config", "diff.kern.textconv", &conv])
        .unwrap()
        .status
        .success());
    git(&d, &["add", "."]).unwrap();
    assert!(git(&d, &["commit", "-q", "-m", "plate"])
        .unwrap()
        .status
        .success());
    std::fs::write(&p, PLATE.replace("h = 200", "h = 300")).unwrap();
    let o = git(&d, &["diff", "--no-color"]).unwrap();
    let t = stdout(&o);
    // Ixx = 100·200³/12 = 66.67×10⁶ before, 100·300³/12 = 225.0×10⁶ after (engineering form).
    assert!(
        t.lines()
            .any(|l| l.starts_with('-') && l.contains("Ixx") && l.contains("66.67×10⁶")),
        "{t}"
    );
    assert!(
        t.lines()
            .any(|l| l.starts_with('+') && l.contains("Ixx") && l.contains("225.0×10⁶")),
        "{t}"
    );
}

fn beam(depth: f64, extra: &str) -> String {
    format!(
        "format = 1\ntitle = \"loading bay beam\"\nunits = \"mm\"\n[params]\nd = {depth}\n[[materials]]\nname = \"steel\"\nE = \"200 GPa\"\nfy = \"350 MPa\"\n[[parts]]\nshape = \"rect\"\nb = 100\nh = \"d\"\n[member]\nspan = \"4 m\"\nsupport = \"simple\"\nudl = \"10 kN/m\"\ndeflection_limit = 360\n{extra}"
    )
}

#[test]
fn check_exit_codes_and_limits() {
    let d = scratch("check");
    // M = wL²/8 = 20 kN·m; S = b·d²/6. d = 300: σ = 13.3 MPa, δ = 5wL⁴/384EI = 0.74 mm
    // (Gere & Goodno, App. G case 1): passes. d = 60: σ = 333 MPa, δ = 93 mm > L/360: fails.
    std::fs::write(d.join("good.toml"), beam(300.0, "")).unwrap();
    std::fs::write(d.join("weak.toml"), beam(60.0, "")).unwrap();
    std::fs::write(
        d.join("bad.toml"),
        "format = 1\nunits = \"mm\"\n[[parts]]\nshape = \"rect\"\nb = -1\nh = 2\n",
    )
    .unwrap();
    let o = kern_in(&d, &["check", "good.toml"]);
    assert_eq!(o.status.code(), Some(0), "{}{}", stdout(&o), stderr(&o));
    assert!(stdout(&o).contains("good.toml: pass"), "{}", stdout(&o));
    let o = kern_in(&d, &["check", "good.toml", "weak.toml"]);
    assert_eq!(o.status.code(), Some(1));
    assert!(
        stdout(&o).contains("weak.toml: FAIL — util (member.utilization)"),
        "{}",
        stdout(&o)
    );
    let o = kern_in(
        &d,
        &["check", "good.toml", "weak.toml", "bad.toml", "--json"],
    );
    assert_eq!(o.status.code(), Some(2));
    let v = json_lines(&o);
    assert_eq!(
        v.iter()
            .map(|x| x["status"].as_str().unwrap())
            .collect::<Vec<_>>(),
        ["pass", "fail", "invalid"]
    );
    // [limits]: Ixx = 100·300³/12 = 2.25e8 mm⁴, below 3e8: fails; above 2e8: passes.
    std::fs::write(
        d.join("lim.toml"),
        beam(
            300.0,
            "[limits]\nutilization = 0.95\n[limits.min]\ninertia.xx = \"3e8 mm4\"\n",
        ),
    )
    .unwrap();
    let o = kern_in(&d, &["check", "lim.toml"]);
    assert_eq!(o.status.code(), Some(1), "{}", stdout(&o));
    assert!(
        stdout(&o).contains("Ixx (inertia.xx) 225.0×10⁶ < 300.0×10⁶ mm⁴"),
        "{}",
        stdout(&o)
    );
    // The lines honour --numbers and --notation as calc's table does.
    let o = kern_line(&d, "check lim.toml --numbers scientific --notation yz");
    assert!(
        stdout(&o).contains("Iy (inertia.xx) 2.250e8 < 3.000e8 mm⁴"),
        "{}",
        stdout(&o)
    );
    std::fs::write(
        d.join("lim.toml"),
        beam(
            300.0,
            "[limits]\ndeflection_limit = 500\n[limits.min]\ninertia.xx = 2e8\n",
        ),
    )
    .unwrap();
    assert_eq!(kern_in(&d, &["check", "lim.toml"]).status.code(), Some(0));
    // δ = 0.74 mm ≤ L/500 = 8 mm; but L/10000 = 0.4 mm is exceeded.
    std::fs::write(
        d.join("lim.toml"),
        beam(300.0, "[limits]\ndeflection_limit = 10000\n"),
    )
    .unwrap();
    assert_eq!(kern_in(&d, &["check", "lim.toml"]).status.code(), Some(1));
    // An unknown key in [limits] gets the usual hint, at its line.
    std::fs::write(
        d.join("typo.toml"),
        beam(300.0, "[limits]\nutilisation = 0.9\n"),
    )
    .unwrap();
    let o = kern_in(&d, &["check", "typo.toml"]);
    assert_eq!(o.status.code(), Some(2));
    assert!(
        stderr(&o).contains(
            "typo.toml:20:1: unknown key `utilisation` in [limits]; did you mean `utilization`?"
        ),
        "{}",
        stderr(&o)
    );
    // Files valid before still compute in calc with [limits] present.
    std::fs::write(
        d.join("lim.toml"),
        beam(300.0, "[limits]\nutilization = 0.9\n"),
    )
    .unwrap();
    assert_eq!(
        kern_in(&d, &["calc", "--no-torsion", "lim.toml"])
            .status
            .code(),
        Some(0)
    );
}

#[test]
fn sensitivities_agree_with_finite_differences_of_calc() {
    let d = scratch("sens");
    let text = "format = 1\nunits = \"mm\"\n[params]\nbf = 200\ntf = 12\nd = 400\ntw = 8\n[[materials]]\nname = \"steel\"\nE = \"200 GPa\"\ndensity = \"7850 kg/m3\"\n[[parts]]\nshape = \"ibeam\"\nd = \"d\"\nb = \"bf\"\ntf = \"tf\"\ntw = \"tw\"\n";
    let p = d.join("girder.toml");
    std::fs::write(&p, text).unwrap();
    let o = kern_line(
        &d,
        "calc girder.toml --sensitivity --result inertia.xx --json --no-torsion",
    );
    assert_eq!(o.status.code(), Some(0), "{}", stderr(&o));
    let v = &json_lines(&o)[0];
    let rates = v["sensitivities"].as_array().unwrap();
    assert_eq!(rates.len(), 4);
    for r in rates {
        let name = r["param"].as_str().unwrap();
        let x = num(r, "value");
        // Our own central difference of `kern calc` with a step of 1e-3·x: the results
        // are polynomials in the dimensions of degree 3 (Ixx of plates, Gere & Goodno
        // App. E case 1, with the parallel-axis theorem), so the central difference is
        // exact but for the term h²·f'''/6 (≈ 1e-7 relative here) and rounding.
        let h = 1e-3 * x;
        let at = |y: f64| {
            let t = text.replace(&format!("\n{name} = {x}\n"), &format!("\n{name} = {y}\n"));
            std::fs::write(&p, t).unwrap();
            let c = kern_in(&d, &["calc", "--json", "--no-torsion", "girder.toml"]);
            let c = json_lines(&c).remove(0);
            (num(&c, "inertia.xx"), num(&c, "mass_per_length"))
        };
        let ((il, ml), (ih, mh)) = (at(x - h), at(x + h));
        let want = (ih - il) / (2.0 * h);
        let got = num(r, "per_unit");
        assert!(
            (got - want).abs() <= 1e-6 * want.abs(),
            "{name}: {got} vs {want}"
        );
        let per_mass = want / ((mh - ml) / (2.0 * h));
        let got = num(r, "per_mass");
        assert!(
            (got - per_mass).abs() <= 1e-6 * per_mass.abs(),
            "{name}: {got} vs {per_mass}"
        );
    }
    std::fs::write(&p, text).unwrap();
    // Depth buys the most Ixx per kg of an I section (common practice): ranked first.
    assert_eq!(rates[0]["param"], "d");
}

#[test]
fn the_report_can_carry_a_sensitivity_table() {
    let d = scratch("report");
    plate(&d);
    let o = kern_line(
        &d,
        "report plate.toml --no-torsion --sensitivity inertia.xx",
    );
    assert_eq!(o.status.code(), Some(0), "{}", stderr(&o));
    let t = stdout(&o);
    let at = t.find("## Sensitivities").expect("a sensitivity section");
    // Before the closing caution, which stays last.
    assert!(t[at..].contains("Caution"), "{t}");
    // ∂(b·h³/12)/∂h = b·h²/4 = 1.000×10⁶ mm⁴/mm at b = 100, h = 200 (Gere & Goodno, App. E case 1).
    assert!(
        t[at..]
            .lines()
            .any(|l| l.contains("| h ") && l.contains("1.000×10⁶")),
        "{}",
        &t[at..]
    );
    let o = kern_in(&d, &["report", "plate.toml", "--sensitivity", "inertia.x"]);
    assert_eq!(o.status.code(), Some(2));
}

#[test]
fn every_table_honours_numbers_and_notation_and_json_does_not() {
    // The numbers are those of the tests above (b·h³/12, Gere & Goodno, App. E case 1);
    // here the snapshots pin how each verb's table writes them in each form.
    let d = scratch("forms");
    plate(&d);
    std::fs::write(d.join("deeper.toml"), PLATE.replace("h = 200", "h = 300")).unwrap();
    std::fs::write(d.join("beam.toml"), beam(300.0, "")).unwrap();
    let verbs: [(&str, Vec<&str>); 5] = [
        (
            "diff",
            vec!["diff", "plate.toml", "deeper.toml", "--no-torsion"],
        ),
        (
            "sweep",
            vec![
                "sweep",
                "plate.toml",
                "--param",
                "h",
                "--from",
                "100",
                "--to",
                "300",
                "--steps",
                "3",
                "--no-torsion",
            ],
        ),
        (
            "seek",
            vec![
                "seek",
                "plate.toml",
                "--param",
                "h",
                "--target",
                "inertia.xx=8e8",
            ],
        ),
        ("check", vec!["check", "beam.toml"]),
        (
            "sensitivity",
            vec!["calc", "plate.toml", "--sensitivity", "--no-torsion"],
        ),
    ];
    for (name, args) in &verbs {
        for (form, extra) in [
            ("engineering", vec![]),
            ("plain-yz", vec!["--numbers", "plain", "--notation", "yz"]),
        ] {
            let all: Vec<&str> = args.iter().copied().chain(extra).collect();
            let o = kern_in(&d, &all);
            assert_eq!(o.status.code(), Some(0), "{all:?}: {}", stderr(&o));
            insta::assert_snapshot!(format!("{name}-{form}"), stdout(&o));
        }
    }
    // JSON is the same whatever the form of numbers or the notation.
    for args in [&verbs[0].1, &verbs[1].1, &verbs[3].1, &verbs[4].1] {
        let json: Vec<&str> = args.iter().copied().chain(["--json"]).collect();
        let other: Vec<&str> = json
            .iter()
            .copied()
            .chain(["--numbers", "scientific", "--notation", "yz"])
            .collect();
        assert_eq!(
            stdout(&kern_in(&d, &json)),
            stdout(&kern_in(&d, &other)),
            "{json:?}"
        );
    }
}
