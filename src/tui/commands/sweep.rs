//! Sweeping a param (`p` on a param): the user types a result (`Ixx`, or a dotted key
//! of `kern calc --json`, as seek takes it) and optionally a range and a number of
//! points (`Ixx 200 400 11`); by default the range is ±50 % of the param's current
//! value in 21 points. [`crate::iterate::sweep`] analyses the section at each value and
//! the overlay shows the result plotted against the param, with the table of values
//! and the current value marked.
//!
//! A sweep of results without torsion runs inline, before the key returns: 21 analyses
//! take milliseconds, well inside a frame. One that needs the torsion solve at every
//! value (J, Cw, the shear areas…) runs on a thread of its own, itself parallel over
//! the values ([`sweep_counting`]), as a [`background`] job: the screen shows how far
//! it has got and Esc stops it.

use super::background;
use super::seek::quantity;
use crate::analysis::Options;
use crate::fe::TorsionOptions;
use crate::iterate::sweep::{sweep, sweep_counting, values, Point};
use crate::iterate::vary::{needs_torsion, read, Probe};
use crate::report::out::OutUnits;
use crate::report::rows::{Dim, Quantity};
use crate::tui::app::{App, Focus, LineEdit, Mode, Target};
use std::sync::atomic::AtomicBool;
use std::sync::Arc;

/// Points of a sweep when none are typed.
pub const DEFAULT_POINTS: usize = 21;
/// The default range: the current value ± this fraction of it.
pub const DEFAULT_SPAN: f64 = 0.5;
/// Most points the overlay takes (each is a whole analysis, run inline).
pub const MAX_POINTS: usize = 201;

/// One value of the param and the result there (`Err`: why there is none).
#[derive(Debug, Clone, PartialEq)]
pub struct Sample {
    pub value: f64,
    pub result: Result<f64, String>,
}

/// A finished sweep, as the overlay shows it.
#[derive(Debug, Clone, PartialEq)]
pub struct Swept {
    pub param: String,
    /// The result as typed (`Ixx`) and its unit label (empty for a pure number).
    pub key: String,
    pub unit: String,
    pub samples: Vec<Sample>,
    /// The param's value in the file, and the sample nearest it when it lies in range.
    pub current: f64,
    pub marked: Option<usize>,
    /// Output units of the numbers (the file's own: the results are read in them).
    pub units: OutUnits,
}

impl Swept {
    /// A result value as shown: four figures and the unit.
    pub fn shown(&self, x: f64) -> String {
        let n = self.units.num(x, 4);
        match self.unit.as_str() {
            "" => n,
            u => format!("{n} {u}"),
        }
    }

    /// The least and greatest result of the sweep, if any point has one.
    pub fn extent(&self) -> Option<(f64, f64)> {
        let mut it = self.samples.iter().filter_map(|s| s.result.as_ref().ok());
        let first = *it.next()?;
        Some(it.fold((first, first), |(lo, hi), &y| (lo.min(y), hi.max(y))))
    }
}

/// Starts typing the result (and range) to sweep the selected param over.
pub fn begin(app: &mut App) {
    if app.focus != Focus::Params {
        return app.note("sweep works on a param: Tab to the params, then p on one");
    }
    let Some((name, _, _)) = app.analysis.document.params.get(app.param) else {
        return;
    };
    app.mode = Mode::Typing {
        target: Target::Sweep(name.clone()),
        line: LineEdit::new(""),
    };
    app.note(format!(
        "type a result (Enter alone: Ixx), then optionally from, to and points (default ±{:.0} %, {DEFAULT_POINTS} points)",
        100.0 * DEFAULT_SPAN
    ));
}

/// What was typed: the result, and the range and points if given.
type Asked<'a> = (&'a str, Option<(f64, f64)>, Option<usize>);

/// Reads `result [from to [points]]` (spaces or commas between).
fn parse(entry: &str) -> Result<Asked<'_>, String> {
    let words: Vec<&str> = entry
        .split(|c: char| c.is_whitespace() || c == ',')
        .filter(|w| !w.is_empty())
        .collect();
    let number = |w: &str| {
        w.parse::<f64>()
            .ok()
            .filter(|x| x.is_finite())
            .ok_or_else(|| format!("`{w}` is not a number"))
    };
    match words.as_slice() {
        [] => Ok(("Ixx", None, None)),
        [key] => Ok((key, None, None)),
        [key, from, to] => Ok((key, Some((number(from)?, number(to)?)), None)),
        [key, from, to, n] => {
            let n = n
                .parse::<usize>()
                .map_err(|_| format!("`{n}` is not a whole number of points"))?;
            Ok((key, Some((number(from)?, number(to)?)), Some(n)))
        }
        _ => Err("type result [from to [points]], e.g. Ixx or Ixx 200 400 11".into()),
    }
}

/// What a sweep asked for, ready to be shown once its points are in.
struct Plan {
    param: String,
    key: String,
    q: &'static Quantity,
    current: f64,
    range: (f64, f64),
    units: OutUnits,
}

/// Sweeps `param` as `entry` asks and opens the overlay; a result that needs the
/// torsion solve starts the sweep in the background and returns at once.
pub fn open(app: &mut App, param: &str, entry: &str) -> Result<(), String> {
    let (key, range, points) = parse(entry)?;
    let q = quantity(key)?;
    let torsion = needs_torsion(q);
    let cancel = Arc::new(AtomicBool::new(false));
    let opts = Options {
        torsion: torsion.then(|| TorsionOptions {
            cancel: Some(cancel.clone()),
            ..TorsionOptions::default()
        }),
        ..Options::default()
    };
    let a = &app.analysis;
    let probe = Probe::new(&a.document, param, &opts)?.reading(&[q]);
    let current = probe.current;
    let (from, to) = match range {
        Some(r) => r,
        None if current != 0.0 && current.is_finite() => (
            current * (1.0 - DEFAULT_SPAN),
            current * (1.0 + DEFAULT_SPAN),
        ),
        None => {
            return Err(format!(
                "{param} is 0, so ±{:.0} % is no range: type one, e.g. {key} -10 10",
                100.0 * DEFAULT_SPAN
            ))
        }
    };
    let n = points.unwrap_or(DEFAULT_POINTS);
    if n > MAX_POINTS {
        return Err(format!(
            "at most {MAX_POINTS} points here; `kern sweep` takes more"
        ));
    }
    let xs = values(from, to, n).map_err(|m| {
        m.replace("--steps", "points")
            .replace("--from and --to", "from and to")
    })?;
    let plan = Plan {
        param: param.to_string(),
        key: key.to_string(),
        q,
        current,
        range: (from, to),
        units: OutUnits::new(a.section.units, None)
            .written(app.config.numbers, app.config.notation),
    };
    app.message = None;
    if !torsion {
        let points = sweep(&probe, &xs);
        show(app, &plan, points);
        return Ok(());
    }
    background::start(
        app,
        format!("sweep of {key} over {param}"),
        "values",
        "Each value needs its own torsion solve, so this takes longer than a sweep without torsion.",
        n,
        cancel,
        move |done| {
            let points = sweep_counting(&probe, &xs, done);
            Box::new(move |app: &mut App| show(app, &plan, points))
        },
    );
    Ok(())
}

/// Opens the overlay on the points of `plan`.
fn show(app: &mut App, plan: &Plan, points: Vec<Point>) {
    let (q, key) = (plan.q, &plan.key);
    let samples = points
        .into_iter()
        .map(|p| Sample {
            value: p.value,
            result: p
                .outcome
                .map_err(|f| f.message())
                .and_then(|an| read(q, &an).ok_or_else(|| format!("no {key} there"))),
        })
        .collect::<Vec<_>>();
    let (from, to) = plan.range;
    let (lo, hi) = (from.min(to), from.max(to));
    let marked = (lo..=hi)
        .contains(&plan.current)
        .then(|| nearest(&samples, plan.current));
    app.mode = Mode::Sweep(Swept {
        param: plan.param.clone(),
        key: key.clone(),
        unit: unit_label(q, &plan.units),
        samples,
        current: plan.current,
        marked,
        units: plan.units,
    });
}

/// The unit a result is read in (`kern calc --json`'s, the file's own lengths); a
/// fraction (a utilization) is a bare number, as seek shows it.
fn unit_label(q: &Quantity, u: &OutUnits) -> String {
    match q.dim {
        Dim::Fraction | Dim::One => String::new(),
        d => d.label(u),
    }
}

/// The index of the sample whose value is nearest `x`.
fn nearest(samples: &[Sample], x: f64) -> usize {
    samples
        .iter()
        .enumerate()
        .min_by(|a, b| (a.1.value - x).abs().total_cmp(&(b.1.value - x).abs()))
        .map_or(0, |(i, _)| i)
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn reads_a_result_with_or_without_a_range() {
        assert_eq!(parse("Ixx").unwrap(), ("Ixx", None, None));
        assert_eq!(
            parse("Ixx 200, 400 11").unwrap(),
            ("Ixx", Some((200.0, 400.0)), Some(11))
        );
        assert!(parse("Ixx 200").is_err());
        assert!(parse("Ixx a b").is_err());
        // Enter alone takes the default result.
        assert_eq!(parse("").unwrap(), ("Ixx", None, None));
    }
}
