//! `kern calc --sensitivity`: for every param, the rate of change of one result per
//! unit of the param and per kg/m of mass it adds, ranked
//! ([`crate::iterate::sensitivity`]).

use super::source::{columns, named, Source};
use super::{print_then, push_caution, say, Written};
use crate::analysis::Options;
use crate::iterate::sensitivity::{sensitivities, Difference, Sensitivities, STEP};
use crate::iterate::vary::result_key;
use crate::numfmt::plain;
use crate::report::out::OutUnits;
use crate::report::rows::Quantity;
use serde_json::json;
use std::path::PathBuf;

/// The result whose sensitivities are shown when none is asked for.
pub const DEFAULT_RESULT: &str = "inertia.xx";

/// Options of `kern calc --sensitivity`.
#[derive(Debug, Clone, Default)]
pub struct SensitivityArgs {
    pub files: Vec<PathBuf>,
    pub result: Option<String>,
    pub json: bool,
    /// How the table writes numbers and symbols.
    pub written: Written,
    pub options: Options,
}

/// How the rates were formed, in words.
pub fn method(size_note: &str) -> String {
    format!(
        "central differences (R(p+h) − R(p−h))/2h with h = {STEP:e}·max(|p|, {size_note}); \
         one-sided where p±h does not compute; per kg/m: (dR/dp)/(dm/dp)"
    )
}

/// The table rows of the sensitivities of `q`: param, value, per unit, per kg/m, how.
pub fn table_rows(s: &Sensitivities, q: &Quantity, u: &OutUnits) -> Vec<Vec<String>> {
    let unit = q.dim.label(u);
    let per = |what: &str| {
        if unit.is_empty() {
            format!("per {what}")
        } else {
            format!("{unit} per {what}")
        }
    };
    let mut rows = vec![vec![
        "param".to_string(),
        "value".into(),
        format!("d{}/dp [{}]", q.name_in(u.notation), per(&u.label(1))),
        format!("d{}/dm [{}]", q.name_in(u.notation), per(u.mass().name)),
        "how".into(),
    ]];
    for r in &s.rates {
        let how = match (r.difference, &r.failure) {
            (Some(Difference::Central), _) => "central".to_string(),
            (Some(Difference::Forward), _) => "forward (p−h does not compute)".into(),
            (Some(Difference::Backward), _) => "backward (p+h does not compute)".into(),
            (None, Some(f)) => format!("not formed: {}", f.message()),
            (None, None) => "not formed".into(),
        };
        rows.push(vec![
            r.param.clone(),
            plain(r.value, 6),
            r.per_unit.map_or("—".into(), |v| u.num(v, 4)),
            match (r.per_mass, s.mass) {
                (Some(v), _) => u.num(v, 4),
                (None, None) => "— (no density)".into(),
                (None, Some(_)) => "— (adds no mass)".into(),
            },
            how,
        ]);
    }
    rows
}

/// `kern calc --sensitivity`: status 0, 2 for an invalid file, 1 when a file has no
/// such result.
pub fn sensitivity(args: &SensitivityArgs) -> i32 {
    let key = args.result.as_deref().unwrap_or(DEFAULT_RESULT);
    let q = match result_key(key) {
        Ok(q) => q,
        Err(m) => {
            say(&format!("kern calc: --result: {m}"));
            return 2;
        }
    };
    let mut out = String::new();
    let mut status = 0;
    for path in &args.files {
        let src = match Source::open(path) {
            Ok(s) => s,
            Err(line) => {
                say(&line);
                status = 2;
                continue;
            }
        };
        let s = match sensitivities(&src.doc, q, &args.options) {
            Ok(s) => s,
            Err(crate::iterate::Failure::Invalid(d)) => {
                say(&src.line(&d));
                status = 2;
                continue;
            }
            Err(f) => {
                say(&src.say_line(&f.message()));
                status = status.max(1);
                continue;
            }
        };
        let u = args.written.units(src.doc.units, None);
        if args.json {
            let o = json!({
                "file": src.name,
                "result": key,
                "value": s.result,
                "mass_per_length": s.mass,
                "method": method("section size"),
                "sensitivities": s.rates.iter().map(|r| json!({
                    "param": r.param,
                    "value": r.value,
                    "step": r.step,
                    "per_unit": r.per_unit,
                    "per_mass": r.per_mass,
                    "difference": r.difference.map(|d| match d {
                        Difference::Central => "central",
                        Difference::Forward => "forward",
                        Difference::Backward => "backward",
                    }),
                })).collect::<Vec<_>>(),
            });
            out.push_str(&o.to_string());
            out.push('\n');
            continue;
        }
        if !out.is_empty() {
            out.push('\n');
        }
        let unit = q.dim.label(&u);
        out.push_str(&src.say_line(&format!(
            "sensitivities of {} = {} {unit}{}",
            named(q, key, u.notation),
            u.num(s.result, 5),
            s.mass
                .map(|m| format!(" (mass {} {})", u.num(m, 4), u.mass().name))
                .unwrap_or_default()
        )));
        out.push('\n');
        out.push_str(&super::source::notation_line(&u));
        out.push_str(&columns(&table_rows(&s, q, &u)));
        out.push_str(&format!(
            "ranked by the rate per kg/m, then per unit; {}\n",
            method("the section's larger side")
        ));
    }
    if !args.json && !out.is_empty() {
        push_caution(&mut out);
    }
    print_then(&out, status)
}

/// The sheet's table of sensitivities of result `key` (`kern report --sensitivity`),
/// in the file's own units, written as the sheet is; `Err` is the message for an
/// unknown key or a file without that result.
pub fn sheet_blocks(
    doc: &crate::model::Document,
    key: &str,
    opts: &Options,
    written: Written,
) -> Result<Vec<crate::report::blocks::Block>, String> {
    use crate::report::blocks::{own, user, Block};
    let q = result_key(key)?;
    let s = sensitivities(doc, q, opts).map_err(|f| f.message())?;
    let u = written.units(doc.units, None);
    let mut rows = table_rows(&s, q, &u).into_iter();
    let head = rows.next().unwrap_or_default();
    let body = rows
        .map(|r| {
            r.into_iter()
                .enumerate()
                .map(|(i, c)| if i == 0 { user(&c) } else { own(c) })
                .collect()
        })
        .collect();
    Ok(vec![
        Block::Heading(2, own("Sensitivities")),
        Block::Para(own(format!(
            "The rate of change of {key} ({} {}) with each param, in the file's units, \
             ranked by the rate per kg/m of added mass, then per unit: {}.",
            u.num(s.result, 5),
            q.dim.label(&u),
            method("the section's larger side")
        ))),
        Block::Table {
            head: head.into_iter().map(own).collect(),
            body,
        },
    ])
}
