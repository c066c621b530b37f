//! Comparing against another design (`C`): the user types a section file, or `REV:`
//! for this file at a git revision (nothing typed: `HEAD:`, the last commit), read
//! through [`crate::file::git`] as `kern diff` reads it. That design becomes the
//! baseline, and a window shows both designs' results side by side
//! ([`crate::iterate::compare`]) with the change of each ([`crate::numfmt::change`]).

use super::rates::Rates;
use crate::analysis::Options;
use crate::file::git::git_text;
use crate::file::input::read_text;
use crate::file::load::{analyse, diagnostic_line};
use crate::iterate::compare::compare;
use crate::numfmt::change;
use crate::text::clean;
use crate::tui::app::{App, LineEdit, Mode, Target};
use std::path::Path;

/// Starts typing what to compare against.
pub fn begin(app: &mut App) {
    app.mode = Mode::Typing {
        target: Target::Baseline,
        line: LineEdit::new(""),
    };
    app.note("type a section file, or REV: for this file at a git revision (Enter alone: the last commit)");
}

/// The text of what `entry` names, and the baseline's label.
fn fetch(app: &App, entry: &str) -> Result<(String, &'static str), String> {
    let path = Path::new(entry);
    if !entry.is_empty() && (path.exists() || !entry.contains(':')) {
        return read_text(path)
            .map(|t| (t, "other file"))
            .map_err(|e| e.line(path));
    }
    let Some(own) = app.path.as_deref() else {
        return Err("the demo is in no git repository; type a section file".into());
    };
    let spec = if entry.is_empty() { "HEAD:" } else { entry };
    let label = if spec == "HEAD:" {
        "last commit"
    } else {
        "git revision"
    };
    git_text(own, spec).map(|t| (t, label))
}

/// Makes the design `entry` names the baseline and opens the side-by-side window.
pub fn open(app: &mut App, entry: &str) -> Result<(), String> {
    let entry = entry.trim();
    let (text, label) = fetch(app, entry)?;
    let name = if entry.is_empty() { "HEAD:" } else { entry };
    let base = analyse(&text, &Options::default())
        .map_err(|d| diagnostic_line(&clean(name), &text, &d))?;
    let rows = compare(&base, &app.analysis, app.config.units);
    let u = app.units();
    let mut lines = vec![format!(
        "{:<8} {:>13} {:>13} {:>8}  unit",
        "", "baseline", "now", "change"
    )];
    for r in &rows {
        let c = &r.change;
        let v = |x: Option<f64>| x.map_or("—".to_string(), |x| u.num(x, 4));
        let moved = change(c.b, c.a, c.compare).signed();
        lines.push(format!(
            "{:<8} {:>13} {:>13} {:>8}  {}",
            c.symbol,
            v(c.a),
            v(c.b),
            moved,
            c.unit
        ));
    }
    app.baseline = base;
    app.baseline_text = text;
    app.baseline_label = label;
    app.message = None;
    app.mode = Mode::Compare(Rates {
        title: format!("This design against the {label} ({})", clean(name)),
        lines,
    });
    Ok(())
}
