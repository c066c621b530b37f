//! `kern sweep`: the section at evenly spaced values of one param — a readable table
//! of the chosen results (default), one `calc --json` object per value with
//! `"sweep": {"param", "value"}` added (FORMAT.md), or CSV for a spreadsheet.

use super::source::{columns, heading, shown, Source};
use super::{print_then, push_caution, say, Written};
use crate::analysis::Options;
use crate::iterate::sweep::{sweep as run, values};
use crate::iterate::vary::{read, result_key};
use crate::iterate::Probe;
use crate::numfmt::plain;
use crate::report::json::{members, Writer};
use crate::report::rows::Quantity;
use std::path::PathBuf;

/// The results a sweep shows when no `--result` is given (those the section has).
pub const DEFAULT_RESULTS: [&str; 9] = [
    "area",
    "inertia.xx",
    "elastic_modulus.x_top",
    "elastic_modulus.x_bottom",
    "plastic_modulus.x",
    "torsion.j",
    "mass_per_length",
    "member.deflection_max",
    "member.utilization",
];

/// Options of `kern sweep`.
#[derive(Debug, Clone, Default)]
pub struct SweepArgs {
    pub file: PathBuf,
    pub param: String,
    pub from: f64,
    pub to: f64,
    pub steps: usize,
    pub json: bool,
    pub csv: bool,
    /// Dotted result keys to show (table and CSV); the defaults when empty.
    pub results: Vec<String>,
    /// How the table writes numbers and symbols.
    pub written: Written,
    pub options: Options,
}

/// `kern sweep`: status 0, 2 for an invalid file or arguments that do not fit it, 1
/// when some values do not compute (each says why on stderr).
pub fn sweep(args: &SweepArgs) -> i32 {
    let src = match Source::open(&args.file) {
        Ok(s) => s,
        Err(line) => {
            say(&line);
            return 2;
        }
    };
    let probe = match Probe::new(&src.doc, &args.param, &args.options) {
        Ok(p) => p,
        Err(m) => {
            say(&src.say_line(&m));
            return 2;
        }
    };
    let xs = match values(args.from, args.to, args.steps) {
        Ok(v) => v,
        Err(m) => {
            say(&format!("kern sweep: {m}"));
            return 2;
        }
    };
    let chosen: Vec<&'static Quantity> = if args.results.is_empty() {
        Vec::new()
    } else {
        match args.results.iter().map(|k| result_key(k)).collect() {
            Ok(v) => v,
            Err(m) => {
                say(&format!("kern sweep: {m}"));
                return 2;
            }
        }
    };
    // The table and the CSV show only their columns: their stages of the analysis.
    let probe = if args.json {
        probe
    } else if chosen.is_empty() {
        let defaults: Vec<_> = DEFAULT_RESULTS
            .iter()
            .filter_map(|k| result_key(k).ok())
            .collect();
        probe.reading(&defaults)
    } else {
        probe.reading(&chosen)
    };
    let points = run(&probe, &xs);
    let mut status = 0;
    for p in &points {
        if let Err(f) = &p.outcome {
            say(&src.failure_line(f, &args.param, p.value));
            status = 1;
        }
    }
    let ok: Vec<(f64, &crate::analysis::Analysis)> = points
        .iter()
        .filter_map(|p| p.outcome.as_ref().ok().map(|a| (p.value, a)))
        .collect();
    let Some(first) = ok.first().map(|p| p.1) else {
        return status.max(1);
    };
    // Everything in the file's own units: the param's values are written in them.
    let u = args.written.units(first.section.units, None);
    let param_out = |x: f64| x;
    let cols: Vec<&'static Quantity> = if chosen.is_empty() {
        DEFAULT_RESULTS
            .iter()
            .filter_map(|k| result_key(k).ok())
            .filter(|q| ok.iter().any(|(_, a)| read(q, a).is_some()))
            .collect()
    } else {
        chosen
    };
    let mut out = String::new();
    if args.json {
        for (x, a) in &ok {
            let mut w = Writer::new();
            w.open();
            members(&mut w, &src.name, a, &u);
            w.key("sweep").open();
            w.key("param").str(&args.param);
            w.key("value").num(*x);
            w.close().close();
            out.push_str(&w.finish());
            out.push('\n');
        }
    } else if args.csv {
        let mut head = vec![format!("{} ({})", args.param, u.label(1))];
        head.extend(cols.iter().map(|q| {
            let unit = q.dim.label(&u);
            if unit.is_empty() {
                q.path.to_string()
            } else {
                format!("{} ({unit})", q.path)
            }
        }));
        out.push_str(&head.join(","));
        out.push('\n');
        for (x, a) in &ok {
            let mut line = vec![format!("{}", param_out(*x))];
            line.extend(
                cols.iter()
                    .map(|q| shown(q, a, &u).map_or(String::new(), |v| format!("{v}"))),
            );
            out.push_str(&line.join(","));
            out.push('\n');
        }
    } else {
        out.push_str(&src.say_line(&format!(
            "{} from {} to {} {} in {} steps{}",
            args.param,
            plain(param_out(args.from), 6),
            plain(param_out(args.to), 6),
            u.label(1),
            args.steps,
            if probe.current.is_finite() {
                format!(" (now {})", plain(param_out(probe.current), 6))
            } else {
                String::new()
            }
        )));
        out.push('\n');
        out.push_str(&super::source::notation_line(&u));
        let mut rows = vec![std::iter::once(format!("{} [{}]", args.param, u.label(1)))
            .chain(cols.iter().map(|q| heading(q, &u)))
            .collect::<Vec<_>>()];
        for (x, a) in &ok {
            let now = (x - probe.current).abs() <= 1e-12 * probe.current.abs().max(1e-300);
            let mut r = vec![format!(
                "{}{}",
                plain(param_out(*x), 6),
                if now { " ◀ now" } else { "" }
            )];
            r.extend(
                cols.iter()
                    .map(|q| shown(q, a, &u).map_or("—".into(), |v| u.num(v, 4))),
            );
            rows.push(r);
        }
        out.push_str(&columns(&rows));
        push_caution(&mut out);
    }
    print_then(&out, status)
}
