//! `kern check FILE...`: for CI. Exit 0 when every file computes and passes (member
//! utilization ≤ 1, no stress above fy, the file's own `[limits]`), 1 when any falls
//! short, 2 when any is invalid (2 wins over 1: an invalid file was not checked at
//! all). One line per file with the figures that decided, or one JSON object per file.

use super::source::{named, Source};
use super::{parallel_map, print_then, say, Written};
use crate::analysis::{Analysis, Options};
use crate::fe::TorsionOptions;
use crate::iterate::check::{check as verdict, Bound, Figure, Verdict};
use crate::iterate::vary::{needs_torsion, result_key};
use crate::report::CAUTION;
use crate::text::clean;
use serde_json::{json, Value};
use std::path::PathBuf;

/// Options of `kern check`.
#[derive(Debug, Clone, Default)]
pub struct CheckArgs {
    pub files: Vec<PathBuf>,
    pub json: bool,
    /// How the lines write numbers and symbols.
    pub written: Written,
}

/// What became of one file.
enum Outcome {
    Checked(Verdict),
    /// The error line.
    Invalid(String),
}

/// The torsion solve runs only when a limit names a result that needs it.
fn options(src: &Source) -> Options {
    let wants = src.doc.limits.as_ref().is_some_and(|l| {
        l.min
            .iter()
            .chain(&l.max)
            .any(|(k, _, _)| result_key(k).is_ok_and(needs_torsion))
    });
    Options {
        torsion: wants.then(TorsionOptions::default),
        ..Options::default()
    }
}

fn one(path: &std::path::Path) -> Outcome {
    let src = match Source::open(path) {
        Ok(s) => s,
        Err(line) => return Outcome::Invalid(line),
    };
    let a = match Analysis::of_document(src.doc.clone(), &options(&src)) {
        Ok(a) => a,
        Err(d) => return Outcome::Invalid(src.line(&d)),
    };
    match verdict(&a) {
        Ok(v) => Outcome::Checked(v),
        Err(d) => Outcome::Invalid(src.line(&d)),
    }
}

/// A figure in words, the key after the symbol it has in the notation:
/// `util (member.utilization) 0.8200 ≤ 0.9500`, `Ixx (inertia.xx) 66.67×10⁶ ≥ …`.
fn words(f: &Figure, w: Written) -> String {
    let key = match result_key(&f.key) {
        Ok(q) => named(q, &f.key, w.notation),
        Err(_) => f.key.clone(),
    };
    let what = match &f.material {
        Some(m) => format!("{key} ({})", clean(m)),
        None => key,
    };
    let unit = if f.unit.is_empty() {
        String::new()
    } else {
        format!(" {}", f.unit)
    };
    let (ok, bad) = match f.bound {
        Bound::AtMost => ("≤", ">"),
        Bound::AtLeast => ("≥", "<"),
    };
    match (f.value, &f.missing) {
        (Some(v), _) => format!(
            "{what} {} {} {}{unit}",
            w.numbers.show(v, 4),
            if f.pass { ok } else { bad },
            w.numbers.show(f.limit, 4)
        ),
        (None, why) => format!(
            "{what}: not formed ({})",
            why.as_deref().unwrap_or("no value")
        ),
    }
}

fn figure_json(f: &Figure) -> Value {
    json!({
        "key": f.key,
        "material": f.material.as_deref().map(clean),
        "value": f.value,
        "limit": f.limit,
        "bound": match f.bound { Bound::AtMost => "max", Bound::AtLeast => "min" },
        "unit": f.unit,
        "pass": f.pass,
        "missing": f.missing,
    })
}

/// `kern check`.
pub fn check(args: &CheckArgs) -> i32 {
    let results = parallel_map(&args.files, |p| one(p));
    let mut out = String::new();
    let (mut failed, mut invalid) = (0, 0);
    for (path, r) in args.files.iter().zip(results) {
        let name = clean(&path.display().to_string());
        let r = r.unwrap_or_else(|panic| {
            Outcome::Invalid(format!(
                "{name}: internal error: {panic}; please report it with this file"
            ))
        });
        match r {
            Outcome::Invalid(line) => {
                invalid += 1;
                say(&line);
                if args.json {
                    out.push_str(
                        &json!({ "file": name, "status": "invalid", "error": line }).to_string(),
                    );
                } else {
                    out.push_str(&format!("{name}: invalid (the message above says where)"));
                }
            }
            Outcome::Checked(v) => {
                let pass = v.pass();
                if !pass {
                    failed += 1;
                }
                let status = if pass { "pass" } else { "fail" };
                if args.json {
                    let o = json!({
                        "file": name,
                        "status": status,
                        "checks": v.figures.iter().map(figure_json).collect::<Vec<_>>(),
                        "notes": v.notes,
                    });
                    out.push_str(&o.to_string());
                } else {
                    let mut parts: Vec<String> =
                        v.figures.iter().map(|f| words(f, args.written)).collect();
                    if parts.is_empty() {
                        parts.push("computes; nothing to check against (no [member], no fy under [actions], no [limits])".into());
                    }
                    parts.extend(v.notes.iter().cloned());
                    out.push_str(&format!(
                        "{name}: {} — {}",
                        if pass { "pass" } else { "FAIL" },
                        parts.join("; ")
                    ));
                }
            }
        }
        out.push('\n');
    }
    if !args.json {
        let n = args.files.len();
        out.push_str(&format!(
            "\n{n} file{}: {} pass, {failed} fail, {invalid} invalid\n{CAUTION}\n",
            if n == 1 { "" } else { "s" },
            n - failed - invalid
        ));
    }
    let status = if invalid > 0 {
        2
    } else if failed > 0 {
        1
    } else {
        0
    };
    print_then(&out, status)
}
