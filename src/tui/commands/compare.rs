//! Comparing against another design (`C`). For a file in a git repository, a list of
//! its recent commits opens, the last one first ([`crate::file::git::log`]): Enter
//! takes the highlighted one, `e` types instead. Typed: a section file, or `REV:` for
//! this file at a git revision (nothing typed: `HEAD:`, the last commit), read through
//! [`crate::file::git`] as `kern diff` reads it. That design becomes the baseline, and
//! a window shows both designs' results side by side ([`crate::iterate::compare`])
//! with the change of each ([`crate::numfmt::change`]); it scrolls.

use crate::analysis::Options;
use crate::file::git::{git_text, log, Commit};
use crate::file::input::read_text;
use crate::file::load::{analyse, diagnostic_line};
use crate::iterate::compare::compare;
use crate::numfmt::change;
use crate::text::clean;
use crate::tui::app::{App, LineEdit, Mode, Solver, Target};
use crate::tui::listing::Listing;
use std::path::Path;

/// Most commits listed.
pub const MOST_COMMITS: usize = 30;

/// The open file's recent commits, one highlighted.
#[derive(Debug, Clone, PartialEq)]
pub struct Revisions {
    /// The last commit first.
    pub commits: Vec<Commit>,
    pub row: usize,
}

/// Lists the open file's commits to choose from; without any (the demo, no git
/// repository, an untracked file), starts typing and says why.
pub fn begin(app: &mut App) {
    let why = match app.path.as_deref() {
        None => "the demo is in no git repository".to_string(),
        Some(p) => match log(p, MOST_COMMITS) {
            Ok(commits) => {
                app.message = None;
                app.mode = Mode::Revisions(Revisions { commits, row: 0 });
                return;
            }
            Err(m) => clean(&m),
        },
    };
    app.mode = Mode::Typing {
        target: Target::Baseline,
        line: LineEdit::new(""),
    };
    app.note(format!(
        "{why}: type a section file to compare with (or REV: for a git revision)"
    ));
}

/// Starts typing what to compare with (from the list of commits: `e`).
pub fn type_instead(app: &mut App) {
    app.mode = Mode::Typing {
        target: Target::Baseline,
        line: LineEdit::new(""),
    };
    app.note("type a section file, or REV: for this file at a git revision (Enter alone: the last commit)");
}

/// Moves the highlight of the list of commits by `by` rows.
pub fn move_row(r: &mut Revisions, by: i64) {
    let n = r.commits.len().max(1) as i64;
    r.row = (r.row as i64).saturating_add(by).clamp(0, n - 1) as usize;
}

/// Compares with the highlighted commit.
pub fn choose(app: &mut App, r: Revisions) {
    let Some(c) = r.commits.get(r.row) else {
        return;
    };
    let label = if r.row == 0 {
        "last commit"
    } else {
        "earlier commit"
    };
    let what = format!(
        "the {label}, {} of {} ({})",
        clean(&c.hash),
        clean(&c.date),
        clean(&c.subject)
    );
    let spec = format!("{}:", c.hash);
    let fetched = match app.path.as_deref() {
        Some(own) => git_text(own, &spec).map_err(|m| clean(&m)),
        None => Err("the demo is in no git repository".into()),
    };
    let opened = fetched.and_then(|text| open_text(app, &spec, text, label, &what));
    if let Err(m) = opened {
        app.error(format!("refused: {m}"));
        app.mode = Mode::Revisions(r);
    }
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

/// Makes the design `entry` (as typed) names the baseline and opens the side-by-side
/// window.
pub fn open(app: &mut App, entry: &str) -> Result<(), String> {
    let entry = entry.trim();
    let (text, label) = fetch(app, entry)?;
    let name = if entry.is_empty() { "HEAD:" } else { entry };
    let what = format!("the {label} ({})", clean(name));
    open_text(app, name, text, label, &what)
}

/// Makes `text` (read from `name`) the baseline, called `label`, and opens the window
/// of this design against `what`.
fn open_text(
    app: &mut App,
    name: &str,
    text: String,
    label: &'static str,
    what: &str,
) -> Result<(), String> {
    let base = analyse(&text, &Options::default())
        .map_err(|d| diagnostic_line(&clean(name), &text, &d))?;
    app.baseline = base;
    app.baseline_text = text;
    app.baseline_label = label;
    app.message = None;
    // The baseline's torsion is solved like any other's, after the current one's.
    if !app.solving {
        app.solve_baseline();
    }
    let (columns, lines) = side_by_side(app);
    app.mode = Mode::Compare(Listing::new(
        "Two designs side by side".into(),
        vec![
            format!("Baseline: {what}. Now: the design as edited here."),
            columns,
        ],
        lines,
    ));
    Ok(())
}

/// Renews the side-by-side window when a torsion solve has come in since it opened
/// (its J, Cw and shear rows join then), keeping where it is scrolled.
pub fn refresh(app: &mut App) {
    if !matches!(app.mode, Mode::Compare(_)) {
        return;
    }
    let (columns, lines) = side_by_side(app);
    if let Mode::Compare(l) = &mut app.mode {
        if let Some(h) = l.head.get_mut(1) {
            *h = columns;
        }
        l.lines = lines;
    }
}

/// The column headings and the rows of the baseline against this design, in the
/// workbench's units and form of numbers; while either side's torsion solve is under
/// way, a last line says its results follow.
fn side_by_side(app: &App) -> (String, Vec<String>) {
    let u = app.units();
    let rows = compare(&app.baseline, &app.analysis, app.config.units, u.notation);
    let cells: Vec<[String; 5]> = rows
        .iter()
        .map(|r| {
            let c = &r.change;
            let v = |x: Option<f64>| x.map_or("—".to_string(), |x| u.num(x, 4));
            let moved = change(c.b, c.a, c.compare).signed();
            [clean(&c.symbol), v(c.a), v(c.b), moved, c.unit.clone()]
        })
        .collect();
    let head = ["", "baseline", "now", "change", "unit"].map(String::from);
    let mut lines = columns(&head, &cells).into_iter();
    let heading = lines.next().unwrap_or_default();
    let mut lines: Vec<String> = lines.collect();
    let pending = |a: &crate::analysis::Analysis| a.torsion.is_none();
    if !matches!(app.solver, Solver::Off) && (pending(&app.baseline) || pending(&app.analysis)) {
        lines.push(String::new());
        lines.push(
            "The torsion solve is under way: J, Cw and the shear results join when it is done."
                .into(),
        );
    }
    (heading, lines)
}

/// The heading and the rows as lines of columns as wide as their widest entry, two
/// spaces apart: the symbol left-aligned, the numbers right-aligned, the unit last.
fn columns(head: &[String; 5], rows: &[[String; 5]]) -> Vec<String> {
    let width = |s: &str| ratatui::text::Line::raw(s).width();
    let mut w = head.clone().map(|h| width(&h));
    for r in rows {
        for (i, c) in r.iter().enumerate() {
            w[i] = w[i].max(width(c));
        }
    }
    std::iter::once(head)
        .chain(rows)
        .map(|r| {
            let pad = |i: usize| " ".repeat(w[i] - width(&r[i]));
            format!(
                "{}{}  {}{}  {}{}  {}{}  {}",
                r[0],
                pad(0),
                pad(1),
                r[1],
                pad(2),
                r[2],
                pad(3),
                r[3],
                r[4]
            )
            .trim_end()
            .to_string()
        })
        .collect()
}
