//! `kern diff A B`: two sections' results side by side with the change of each
//! ([`crate::iterate::compare`]). B may be `REV:PATH`, the file at a revision of the
//! git repository that holds A, read with `git show` (`REV:` alone is A itself at
//! that revision, e.g. `HEAD:` for the last commit).

use super::source::Source;
use super::{print_out, say};
use crate::analysis::{Analysis, Options};
use crate::file::input::MAX_BYTES;
use crate::iterate::compare::{compare, Trend};
use crate::model::units::LengthUnit;
use crate::numfmt::{change, sig};
use crate::report::json::to_json;
use crate::report::out::OutUnits;
use crate::report::CAUTION;
use crate::text::clean;
use serde_json::json;
use std::path::{Path, PathBuf};
use std::process::Command;

/// Options of `kern diff`.
#[derive(Debug, Clone, Default)]
pub struct DiffArgs {
    pub a: PathBuf,
    /// A file, or `REV:PATH`.
    pub b: String,
    pub json: bool,
    pub units: Option<LengthUnit>,
    pub options: Options,
}

/// The text of `spec` = `REV:PATH` in the git repository holding `a`: PATH as git
/// names it from the repository's top, or `./PATH` from A's folder; an empty PATH is
/// A itself.
pub fn git_text(a: &Path, spec: &str) -> Result<String, String> {
    let (rev, path) = spec.split_once(':').unwrap_or((spec, ""));
    let dir = match a.parent() {
        Some(p) if !p.as_os_str().is_empty() => p.to_path_buf(),
        _ => PathBuf::from("."),
    };
    let path = if path.is_empty() {
        let name = a
            .file_name()
            .map(|n| n.to_string_lossy().into_owned())
            .unwrap_or_default();
        format!("./{name}")
    } else {
        path.to_string()
    };
    let object = format!("{rev}:{path}");
    let git = |args: &[&str]| {
        Command::new("git")
            .arg("-C")
            .arg(&dir)
            .args(args)
            .output()
            .map_err(|e| format!("cannot run git to read `{spec}`: {e}"))
    };
    let failed = |o: &std::process::Output| {
        let why = String::from_utf8_lossy(&o.stderr);
        let why = why.trim();
        if why.contains("not a git repository") {
            format!(
                "`{spec}` names a git revision, but {} is not in a git repository",
                a.display()
            )
        } else {
            format!("git cannot read `{object}`: {why}")
        }
    };
    let size = git(&["cat-file", "-s", &object])?;
    if !size.status.success() {
        return Err(failed(&size));
    }
    let bytes: u64 = String::from_utf8_lossy(&size.stdout)
        .trim()
        .parse()
        .unwrap_or(u64::MAX);
    if bytes > MAX_BYTES {
        return Err(format!(
            "`{object}` is {bytes} bytes; a section file may be at most {MAX_BYTES}"
        ));
    }
    let shown = git(&["cat-file", "blob", &object])?;
    if !shown.status.success() {
        return Err(failed(&shown));
    }
    String::from_utf8(shown.stdout).map_err(|e| {
        format!(
            "`{object}` is not UTF-8 text (byte {} is not)",
            e.utf8_error().valid_up_to()
        )
    })
}

/// Reads B: a file when one exists at that path (or it has no `:`), else a git revision.
fn open_b(a: &Path, b: &str) -> Result<Source, String> {
    if Path::new(b).exists() || !b.contains(':') {
        return Source::open(Path::new(b));
    }
    let text = git_text(a, b).map_err(|m| clean(&format!("kern diff: {m}")))?;
    Source::of_text(b.to_string(), text)
}

/// The analysis of a source, or the line that says why not.
fn analysed(s: &Source, opts: &Options) -> Result<Analysis, String> {
    Analysis::of_document(s.doc.clone(), opts).map_err(|d| s.line(&d))
}

/// `kern diff`: status 0, 2 when either side is invalid or cannot be read.
pub fn diff(args: &DiffArgs) -> i32 {
    let a = Source::open(&args.a).and_then(|s| analysed(&s, &args.options).map(|x| (s, x)));
    let b = open_b(&args.a, &args.b).and_then(|s| analysed(&s, &args.options).map(|x| (s, x)));
    let ((sa, a), (sb, b)) = match (a, b) {
        (Ok(a), Ok(b)) => (a, b),
        (a, b) => {
            for e in [a.err(), b.err()].into_iter().flatten() {
                say(&e);
            }
            return 2;
        }
    };
    let ua = OutUnits::new(a.section.units, args.units);
    let out = if args.json {
        let ub = OutUnits::new(b.section.units, Some(ua.length));
        let o = json!({ "a": to_json(&sa.name, &a, &ua), "b": to_json(&sb.name, &b, &ub) });
        format!("{o}\n")
    } else {
        table(&sa.name, &sb.name, &a, &b, args.units)
    };
    print_out(&out)
}

/// The side-by-side table.
fn table(na: &str, nb: &str, a: &Analysis, b: &Analysis, units: Option<LengthUnit>) -> String {
    let rows = compare(a, b, units);
    let mut t = vec![vec![
        "result".to_string(),
        "unit".into(),
        "A".into(),
        "B".into(),
        "change".into(),
        String::new(),
    ]];
    let mut changed = 0;
    for r in &rows {
        let c = &r.change;
        let v = |x: Option<f64>| x.map_or("—".to_string(), |x| sig(x, 5));
        let pct = match (c.a, c.b) {
            (Some(x), Some(y)) if c.stress => change(y.abs(), x.abs()),
            (Some(x), Some(y)) => change(y, x),
            _ => None,
        };
        let words = match r.trend {
            Trend::Same => "",
            Trend::Higher => "higher",
            Trend::Lower => "lower",
            Trend::LargerMagnitude => "|σ| higher",
            Trend::SmallerMagnitude => "|σ| lower",
            Trend::OnlyA => "only in A",
            Trend::OnlyB => "only in B",
            Trend::NotFormed => "not formed on one side",
        };
        if r.trend != Trend::Same {
            changed += 1;
        }
        t.push(vec![
            clean(&c.symbol),
            c.unit.clone(),
            v(c.a),
            v(c.b),
            pct.unwrap_or_default(),
            words.into(),
        ]);
    }
    let mut out = format!(
        "A: {}\nB: {}\n{} of {} results differ{}\n\n",
        clean(na),
        clean(nb),
        changed,
        rows.len(),
        if rows.iter().any(|r| r.change.stress) {
            " (stresses compared by magnitude)"
        } else {
            ""
        }
    );
    out.push_str(&super::source::columns_left(&t, &[5]));
    out.push('\n');
    out.push_str(CAUTION);
    out.push('\n');
    out
}
