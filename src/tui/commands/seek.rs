//! Seeking a param's value (`/` on a param): the user types a target such as
//! `Ixx = 8e8`, `util = 0.9` or `member.deflection_max = span/500`; the value of the
//! param that reaches it is found by [`crate::iterate::seek`] (bracketing out from the
//! current value, then Brent's method), shown with its result before anything changes,
//! and taken as one undoable edit. No value reaching the target: the message says so,
//! with the range the result runs over.

use crate::analysis::Options;
use crate::file::edit::{number_value, Edit};
use crate::iterate::seek::{seek, Range, SeekError};
use crate::iterate::target::parse_value;
use crate::iterate::vary::{needs_torsion, numeric_keys, result_key, Probe};
use crate::report::out::OutUnits;
use crate::report::rows::{Dim, Notation, Quantity};
use crate::tui::app::{App, Focus, LineEdit, Mode, Target};

/// A value found, waiting for a yes before it is written.
#[derive(Debug, Clone, PartialEq)]
pub struct Found {
    pub param: String,
    pub value: f64,
    /// What the result is with it, and what it was, as shown (with units).
    pub goal: String,
    pub reached: String,
    pub was: String,
}

/// Starts typing a target for the selected param.
pub fn begin(app: &mut App) {
    if app.focus != Focus::Params {
        return app.note("seek works on a param: Tab to the params, then / on one");
    }
    let Some((name, _, _)) = app.analysis.document.params.get(app.param) else {
        return;
    };
    app.mode = Mode::Typing {
        target: Target::Seek(name.clone()),
        line: LineEdit::new(""),
    };
    app.note("type a target: Ixx = 8e8, util = 0.9, δ = span/500, or any key of calc --json");
}

/// The result named by `key`: a symbol of the results panel (`Ixx`, `util`, `δ`) or a
/// dotted key of `kern calc --json` (`inertia.xx`).
pub fn quantity(key: &str) -> Result<&'static Quantity, String> {
    numeric_keys()
        .find(|q| {
            q.shown()
                && [Notation::Xy, Notation::Yz]
                    .iter()
                    .any(|&n| q.symbol_in(n) == key)
        })
        .map_or_else(|| result_key(key), Ok)
}

/// A result's value as the panel shows it: four figures and the unit.
pub fn shown(x: f64, q: &Quantity, u: &OutUnits) -> String {
    match q.dim {
        Dim::Fraction | Dim::One => u.num(x, 4),
        d => format!("{} {}", u.num(x, 4), d.label(u)),
    }
}

/// Solves the typed target `entry` for `param`; on success asks before taking it.
pub fn solve(app: &mut App, param: &str, entry: &str) -> Result<(), String> {
    let Some((key, goal)) = entry.split_once('=') else {
        return Err("type result = target, e.g. Ixx = 8e8 or util = 0.9".into());
    };
    let (key, goal) = (key.trim(), goal.trim());
    let q = quantity(key)?;
    if needs_torsion(q) {
        return Err(format!(
            "`{key}` needs the torsion solve for every value tried; use `kern seek` on the command line"
        ));
    }
    let a = &app.analysis;
    let target = parse_value(goal, q, a)?;
    // Values are read in the file's own units (iterate), so labelled in them too.
    let u = OutUnits::new(a.section.units, None).written(app.config.numbers, app.config.notation);
    let probe = Probe::new(&a.document, param, &Options::default())?;
    let was = crate::iterate::vary::read(q, a).map_or("none".into(), |x| shown(x, q, &u));
    match seek(&probe, q, target, Range::FromCurrent) {
        Ok(s) => {
            app.mode = Mode::AskSeek(Found {
                param: param.to_string(),
                value: s.value,
                goal: format!("{key} = {}", shown(target, q, &u)),
                reached: format!("{key} = {}", shown(s.result, q, &u)),
                was,
            });
            Ok(())
        }
        Err(SeekError::NoRoot(r)) => Err(format!(
            "no value of {param} from {} to {} gives {key} = {}: {key} runs from {} to {} there",
            u.num(r.span.0, 4),
            u.num(r.span.1, 4),
            shown(target, q, &u),
            shown(r.least.1, q, &u),
            shown(r.greatest.1, q, &u),
        )),
        Err(SeekError::Jump { value, result }) => Err(format!(
            "{key} jumps across the target at {param} = {} (it is {} there)",
            u.num(value, 6),
            shown(result, q, &u)
        )),
        Err(SeekError::BadRange(m)) => Err(m),
        Err(SeekError::Start(f)) => Err(format!("no {key} to start from: {}", f.message())),
        Err(SeekError::Inside { value, failure }) => Err(format!(
            "the search reached {param} = {}, where the section does not compute: {}",
            u.num(value, 6),
            failure.message()
        )),
    }
}

/// Takes the value found, as one undoable edit (rounded to 6 figures as every computed
/// number written to a file is).
pub fn apply(app: &mut App, f: Found) {
    let value = f.value;
    if app.edit(Edit::SetParamNumber {
        name: f.param.clone(),
        value,
    }) {
        app.note(format!(
            "{} = {} for {} (u undoes)",
            f.param,
            number_value(value),
            f.goal
        ));
    }
}
