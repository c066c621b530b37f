//! `kern seek`: the value of a param for which a result reaches a target
//! ([`crate::iterate::seek`]); `--write` puts it into the file, one line changed.

use super::source::{named, Source};
use super::{print_then, say, Written};
use crate::analysis::Options;
use crate::file::edit::Edit;
use crate::file::load::analyse;
use crate::file::save::{save, Overwrite};
use crate::iterate::seek::{seek as solve, Range, SeekError, REL_TOL};
use crate::iterate::target::parse_value;
use crate::iterate::vary::{needs_torsion, read, result_key};
use crate::iterate::Probe;
use crate::numfmt::{plain, sig};
use crate::report::json::{members, Writer};
use std::path::PathBuf;

/// Options of `kern seek`.
#[derive(Debug, Clone, Default)]
pub struct SeekArgs {
    pub file: PathBuf,
    pub param: String,
    /// `KEY=VALUE`.
    pub target: String,
    /// `A..B`.
    pub within: Option<String>,
    pub json: bool,
    pub write: bool,
    /// How the line writes numbers.
    pub written: Written,
    pub options: Options,
}

/// `A..B` as two numbers.
pub fn parse_range(s: &str) -> Result<(f64, f64), String> {
    let (a, b) = s
        .split_once("..")
        .ok_or_else(|| format!("--within `{s}`: write the range as A..B, e.g. 100..900"))?;
    let num = |t: &str| {
        crate::model::expr::eval_str(t.trim())
            .map_err(|e| format!("--within `{s}`: `{}`: {}", t.trim(), e.message))
    };
    Ok((num(a)?, num(b)?))
}

/// `kern seek`: status 0 with a solution, 1 when there is none in the range (or the
/// file cannot be written), 2 for an invalid file or arguments that do not fit it.
pub fn seek(args: &SeekArgs) -> i32 {
    let src = match Source::open(&args.file) {
        Ok(s) => s,
        Err(line) => {
            say(&line);
            return 2;
        }
    };
    let fail = |m: &str| {
        say(&src.say_line(m));
        2
    };
    let Some((key, value)) = args.target.split_once('=') else {
        return fail(&format!(
            "--target `{}`: write KEY=VALUE, e.g. inertia.xx=8e8",
            args.target
        ));
    };
    let key = key.trim();
    let q = match result_key(key) {
        Ok(q) => q,
        Err(m) => return fail(&m),
    };
    let probe = match Probe::new(&src.doc, &args.param, &args.options) {
        Ok(p) => p,
        Err(m) => return fail(&m),
    };
    let now = match probe.analyse_with(probe.current, &Options::default()) {
        Ok(a) => a,
        Err(f) => {
            say(&src.failure_line(&f, &args.param, probe.current));
            return 2;
        }
    };
    let target = match parse_value(value, q, &now) {
        Ok(t) => t,
        Err(m) => return fail(&format!("--target: {m}")),
    };
    let range = match &args.within {
        None => Range::FromCurrent,
        Some(w) => match parse_range(w) {
            Ok((a, b)) => Range::Within(a, b),
            Err(m) => return fail(&m),
        },
    };
    let u = args.written.units(now.section.units, None);
    let unit = q.dim.label(&u);
    let show = |x: f64| format!("{} {unit}", u.num(x, 6)).trim_end().to_string();
    let solved = match solve(&probe, q, target, range) {
        Ok(s) => s,
        Err(e) => {
            say(&src.say_line(&refusal(&e, &args.param, key, target, &show, &src)));
            return match e {
                SeekError::BadRange(_) | SeekError::Start(_) => 2,
                _ => 1,
            };
        }
    };
    let mut out = String::new();
    if args.json {
        let mut w = Writer::new();
        w.open();
        w.key("param").str(&args.param);
        w.key("value").num(solved.value);
        w.key("result").open();
        members(&mut w, &src.name, &solved.analysis, &u);
        w.close().close();
        out.push_str(&w.finish());
        out.push('\n');
    } else {
        out.push_str(&src.say_line(&format!(
            "{} = {} gives {} = {} (target {}, reached to {:.0e} relative; {} analyses)",
            args.param,
            plain(solved.value, 10),
            named(q, key, u.notation),
            show(solved.result),
            show(target),
            REL_TOL,
            solved.evaluations
        )));
        out.push('\n');
        if needs_torsion(q) {
            out.push_str(&src.say_line(&format!(
                "{key} is a finite-element estimate: the target is met to the figures above, \
                 the result itself only to the solve's estimated error (torsion.rel_error)"
            )));
            out.push('\n');
        }
    }
    let mut status = 0;
    if args.write {
        status = write(&src, args, solved.value, q, target, &mut out);
    }
    print_then(&out, status)
}

/// Puts `value` into the param's line of the file (the rest of the text unchanged),
/// after checking the new text computes and still reaches the target.
fn write(
    src: &Source,
    args: &SeekArgs,
    value: f64,
    q: &crate::report::rows::Quantity,
    target: f64,
    out: &mut String,
) -> i32 {
    // The shortest text that reads back as exactly this number.
    let edit = Edit::SetParam {
        name: args.param.clone(),
        entry: format!("{value}"),
    };
    let new = match edit.apply_to_text(&src.text) {
        Ok(t) => t,
        Err(m) => {
            say(&src.say_line(&format!("not written: {m}")));
            return 1;
        }
    };
    let check = analyse(&new, &crate::iterate::vary::options_for(q, &args.options));
    let reached = check
        .as_ref()
        .ok()
        .and_then(|a| read(q, a))
        .is_some_and(|r| (r - target).abs() <= 1e-9 * target.abs().max(f64::MIN_POSITIVE));
    if !reached {
        say(&src.say_line(
            "not written: the file with the new value does not reach the target (please report this)",
        ));
        return 1;
    }
    match save(&args.file, &new, Overwrite::Writable) {
        Ok(saved) => {
            if !args.json {
                out.push_str(&src.say_line(&format!("written: {} = {value}", args.param)));
                out.push('\n');
            }
            if let Some(w) = saved.warning {
                say(&src.say_line(&w));
            }
            0
        }
        Err(e) => {
            say(&src.say_line(&format!("not written: {e}")));
            1
        }
    }
}

/// Why there is no value, in words.
fn refusal(
    e: &SeekError,
    param: &str,
    key: &str,
    target: f64,
    show: &dyn Fn(f64) -> String,
    src: &Source,
) -> String {
    match e {
        SeekError::NoRoot(r) => format!(
            "no value of {param} from {} to {} gives {key} = {}: over the values tried {key} \
             runs from {} (at {param} = {}) to {} (at {param} = {})",
            r.span.0,
            r.span.1,
            show(target),
            show(r.least.1),
            r.least.0,
            show(r.greatest.1),
            r.greatest.0,
        ),
        SeekError::Jump { value, result } => format!(
            "{key} jumps across {} at {param} = {} (it is {} there) instead of reaching it",
            show(target),
            sig(*value, 10),
            show(*result)
        ),
        SeekError::BadRange(m) => m.clone(),
        SeekError::Start(f) => format!("no {key} to start from: {}", f.message()),
        SeekError::Inside { value, failure } => {
            let at = match failure {
                crate::iterate::Failure::Invalid(d) => src.line(d),
                f => f.message(),
            };
            format!(
                "the search reached {param} = {}, where the section does not compute: {at}",
                sig(*value, 10)
            )
        }
    }
}
