//! `kern diff A B`: two sections' results side by side with the change of each
//! ([`crate::iterate::compare`]). B may be `REV:PATH`, the file at a revision of the
//! git repository that holds A, read with `git show` (`REV:` alone is A itself at
//! that revision, e.g. `HEAD:` for the last commit).

use super::source::Source;
use super::{print_out, say, Written};
use crate::analysis::{Analysis, Options};
use crate::file::git::git_text;
use crate::iterate::compare::{compare, Trend};
use crate::model::units::LengthUnit;
use crate::numfmt::change;
use crate::report::json::{members, Writer};
use crate::report::out::OutUnits;
use crate::report::table::FIGURES;
use crate::report::CAUTION;
use crate::text::clean;
use std::path::{Path, PathBuf};

/// Options of `kern diff`.
#[derive(Debug, Clone, Default)]
pub struct DiffArgs {
    pub a: PathBuf,
    /// A file, or `REV:PATH`.
    pub b: String,
    pub json: bool,
    pub units: Option<LengthUnit>,
    /// How the table writes numbers and symbols.
    pub written: Written,
    pub options: Options,
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
    let ua = args.written.units(a.section.units, args.units);
    let out = if args.json {
        let ub = OutUnits::new(b.section.units, Some(ua.length));
        let mut w = Writer::new();
        w.open();
        w.key("a").open();
        members(&mut w, &sa.name, &a, &ua);
        w.close().key("b").open();
        members(&mut w, &sb.name, &b, &ub);
        w.close().close();
        let mut o = w.finish();
        o.push('\n');
        o
    } else {
        table(&sa.name, &sb.name, &a, &b, &ua)
    };
    print_out(&out)
}

/// The side-by-side table, in A's output units `u` (B's lengths in the same unit),
/// numbers to the figures of `kern calc`'s table.
fn table(na: &str, nb: &str, a: &Analysis, b: &Analysis, u: &OutUnits) -> String {
    let rows = compare(a, b, Some(u.length), u.notation);
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
        let v = |x: Option<f64>| x.map_or("—".to_string(), |x| u.num(x, FIGURES));
        let pct = change(c.b, c.a, c.compare).signed();
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
            pct,
            words.into(),
        ]);
    }
    let mut out = format!(
        "A: {}\nB: {}\n{}{} of {} results differ{}\n\n",
        clean(na),
        clean(nb),
        super::source::notation_line(u),
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
