//! The workbench's commands as plain functions over [`App`], one per named command of
//! the key table ([`run`] dispatches), so every one of them can be tested without a
//! terminal: moving, typing and stepping values, history, baseline and saving here;
//! commands on whole parts in [`parts`].

pub mod background;
pub mod compare;
pub mod parts;
pub mod rates;
pub mod seek;
pub mod sweep;
pub mod tables;

use super::app::{App, Focus, LineEdit, Mode, Target};
use super::columns::{anchor, number, Col};
use super::keys::Cmd;
use super::views::{help, listing};
use crate::analysis::Options;
use crate::file::edit::{self, number_value, round_sig, Edit, Flag, Slot, TextKey};
use crate::file::input::read_text;
use crate::file::save::{self as disk, Overwrite, SaveError};
use crate::model::Value;
use std::path::{Path, PathBuf};

/// Runs a command.
pub fn run(app: &mut App, cmd: Cmd) {
    match cmd {
        Cmd::Left => app.col = app.col.saturating_sub(1),
        Cmd::Right => app.col = (app.col + 1).min(app.columns().len().saturating_sub(1)),
        Cmd::Up => move_row(app, -1),
        Cmd::Down => move_row(app, 1),
        Cmd::First => move_row(app, i64::MIN / 2),
        Cmd::Last => move_row(app, i64::MAX / 2),
        Cmd::FirstColumn if app.focus == Focus::Parts && app.mode == Mode::Main => app.col = 0,
        Cmd::LastColumn if app.focus == Focus::Parts && app.mode == Mode::Main => {
            app.col = app.columns().len().saturating_sub(1)
        }
        Cmd::FirstColumn => move_row(app, i64::MIN / 2),
        Cmd::LastColumn => move_row(app, i64::MAX / 2),
        Cmd::SwitchList => switch_list(app),
        Cmd::PageDown => page(app, 1),
        Cmd::PageUp => page(app, -1),
        Cmd::Edit if matches!(app.mode, Mode::Revisions(_)) => compare::type_instead(app),
        Cmd::Edit if app.tables.is_some() => tables::edit(app),
        Cmd::Edit => begin_edit(app),
        Cmd::StepUp => step(app, 1, 1.0),
        Cmd::StepDown => step(app, 1, -1.0),
        Cmd::FineUp => step(app, 0, 1.0),
        Cmd::FineDown => step(app, 0, -1.0),
        Cmd::CoarseUp => step(app, 2, 1.0),
        Cmd::CoarseDown => step(app, 2, -1.0),
        Cmd::ToggleVoid => parts::toggle(app, Flag::Void),
        Cmd::ToggleHole => parts::toggle_hole(app),
        Cmd::ToggleEnabled => parts::toggle(app, Flag::Enabled),
        Cmd::AddPart if app.focus == Focus::Params => tables::add_param(app),
        Cmd::AddPart => parts::open_picker(app, false),
        Cmd::ChangeShape => parts::open_picker(app, true),
        Cmd::NextAnchor => parts::cycle_anchor(app, 1),
        Cmd::PrevAnchor => parts::cycle_anchor(app, -1),
        Cmd::FlipX => parts::toggle(app, Flag::FlipX),
        Cmd::FlipY => parts::toggle(app, Flag::FlipY),
        Cmd::CopyPart => parts::copy_part(app),
        Cmd::DeletePart if app.focus == Focus::Params => tables::remove_param(app),
        Cmd::DeletePart => parts::delete_part(app),
        Cmd::MoveUp => parts::move_part(app, false),
        Cmd::MoveDown => parts::move_part(app, true),
        Cmd::Undo => undo(app),
        Cmd::Redo => redo(app),
        Cmd::SetBaseline => app.mode = Mode::AskBaseline,
        Cmd::ResetBaseline => reset_baseline(app),
        Cmd::Save => save(app),
        Cmd::SaveAs => begin_save_as(app),
        Cmd::Quit => quit(app),
        Cmd::Help => app.mode = Mode::Help(0),
        Cmd::ToggleMesh => {
            app.show_mesh = !app.show_mesh;
            app.note(if app.show_mesh {
                "torsion mesh shown"
            } else {
                "torsion mesh hidden"
            });
        }
        Cmd::Shade => {
            app.shading = app.shading.next();
            app.note(super::shade::status(
                &app.analysis,
                app.shading,
                app.solving,
            ));
        }
        Cmd::ToggleAscii => {
            app.theme.ascii = !app.theme.ascii;
            app.config.ascii = app.theme.ascii;
        }
        Cmd::Commit => commit(app),
        Cmd::Cancel => cancel(app),
        Cmd::CursorLeft => with_line(app, LineEdit::left),
        Cmd::CursorRight => with_line(app, LineEdit::right),
        Cmd::CursorHome => with_line(app, |l| l.cursor = 0),
        Cmd::CursorEnd => with_line(app, |l| l.cursor = l.len()),
        Cmd::Backspace => with_line(app, LineEdit::backspace),
        Cmd::DeleteChar => with_line(app, LineEdit::delete),
        Cmd::WordLeft => with_line(app, |l| l.cursor = l.word_start()),
        Cmd::WordRight => with_line(app, |l| l.cursor = l.word_end()),
        Cmd::DeleteWordBack => with_line(app, |l| l.cut(l.word_start(), l.cursor)),
        Cmd::KillToStart => with_line(app, |l| l.cut(0, l.cursor)),
        Cmd::KillToEnd => with_line(app, |l| l.cut(l.cursor, l.len())),
        Cmd::Yes => answer_yes(app),
        Cmd::SaveAndQuit if app.mode == Mode::AskQuit => {
            app.mode = Mode::Main;
            app.quit_after_save = true;
            save(app);
        }
        Cmd::SaveAndQuit => {}
        Cmd::OpenTables => tables::open(app),
        Cmd::Seek => seek::begin(app),
        Cmd::Rates => rates::begin(app),
        Cmd::Sweep => sweep::begin(app),
        Cmd::Compare => compare::begin(app),
        Cmd::AddKey => tables::add(app),
        Cmd::RemoveKey => tables::remove(app),
        Cmd::Rename => tables::rename(app),
    }
}

/// Types a character into the line being edited.
pub fn type_char(app: &mut App, c: char) {
    with_line(app, |l| l.insert(c));
}

fn with_line(app: &mut App, f: impl FnOnce(&mut LineEdit)) {
    if let Mode::Typing { line, .. } = &mut app.mode {
        f(line);
    }
}

fn move_row(app: &mut App, by: i64) {
    match &mut app.mode {
        Mode::Choosing(pick) => {
            let n = crate::model::schema::SPECS.len() as i64;
            pick.row = (pick.row as i64 + by).clamp(0, n - 1) as usize;
        }
        Mode::Help(s) => {
            let max = help::max_scroll(&app.theme, app.screen);
            *s = (*s as i64 + by).clamp(0, max as i64) as u16;
        }
        Mode::Revisions(r) => compare::move_row(r, by),
        Mode::Rates(_) | Mode::Compare(_) => scroll_listing(app, by),
        _ if app.tables.is_some() => tables::move_row(app, by),
        _ => {
            let (row, n) = match app.focus {
                Focus::Parts => (&mut app.part, app.analysis.document.parts.len()),
                Focus::Params => (&mut app.param, app.analysis.document.params.len()),
            };
            *row = (*row as i64 + by).clamp(0, n.saturating_sub(1) as i64) as usize;
            // The same column by its key on the new row (a dimension it lacks: its first).
            if app.focus == Focus::Parts {
                let col = app.column();
                app.keep_column(col);
            }
        }
    }
}

/// Scrolls the window of results open by `by` lines, within what it holds on the
/// screen last drawn.
fn scroll_listing(app: &mut App, by: i64) {
    let most = match &app.mode {
        Mode::Rates(l) | Mode::Compare(l) => listing::most_scroll(app, l),
        _ => return,
    };
    if let Mode::Rates(l) | Mode::Compare(l) = &mut app.mode {
        l.scroll_by(by, most);
    }
}

/// Scrolls the help, a window of results, or the results, by a page.
fn page(app: &mut App, dir: i64) {
    match &app.mode {
        Mode::Help(_) => {
            let page = help::page_height(app.screen).max(1) as i64;
            move_row(app, dir * page);
        }
        Mode::Rates(l) | Mode::Compare(l) => {
            let page = listing::page(app, l).max(1) as i64;
            scroll_listing(app, dir * page);
        }
        _ => {
            // No further than the results could run (rows, group headings, a few lines
            // a warning), so scrolling back up answers at once.
            let rows = crate::report::rows::rows(&app.analysis, &app.units());
            let groups = rows.windows(2).filter(|w| w[0].group != w[1].group).count() + 1;
            let most = rows.len() + groups + 3 * app.analysis.warnings.len() + 2;
            let page = super::views::results_page(app).max(1) as i64;
            let next = app.results_scroll as i64 + page * dir;
            app.results_scroll = next.clamp(0, most as i64) as u16;
        }
    }
}

fn switch_list(app: &mut App) {
    app.focus = match app.focus {
        Focus::Parts if !app.analysis.document.params.is_empty() => Focus::Params,
        Focus::Parts => {
            app.note("this section has no [params]");
            Focus::Parts
        }
        Focus::Params => Focus::Parts,
    };
}

/// Starts typing in the selected cell or param (on/off cells toggle, the shape cell
/// opens the shape picker).
pub fn begin_edit(app: &mut App) {
    if app.focus == Focus::Params {
        let Some((name, _, v)) = app.analysis.document.params.get(app.param) else {
            return;
        };
        app.mode = Mode::Typing {
            target: Target::Param(name.clone()),
            line: LineEdit::new(&v.value.text()),
        };
        return;
    }
    let Some(p) = app.analysis.document.parts.get(app.part) else {
        app.note("no parts yet: press a to add one");
        return;
    };
    let col = app.column();
    let start = match col {
        Col::Name => p.name.clone().unwrap_or_default(),
        Col::Material => p.material.as_ref().map_or(String::new(), |m| m.0.clone()),
        Col::Sign => {
            app.mode = Mode::AskVoid(app.part);
            return;
        }
        Col::Enabled => return parts::toggle(app, Flag::Enabled),
        Col::Shape => return parts::open_picker(app, true),
        Col::Flip => return app.note("f mirrors the part left to right, F top to bottom"),
        Col::Anchor => anchor(p).name().to_string(),
        Col::Points => match &p.points {
            Some(pts) => edit::points_entry(pts),
            None => return app.note(format!("a {} has no points; only a polygon has", p.shape)),
        },
        Col::Dim(k) if p.shape.has_points() => {
            return app.note(format!(
                "a polygon has no `{k}`; its corners are in the points column"
            ))
        }
        _ => match number(p, col) {
            Some(v) => v.text(),
            None => {
                return app.note(format!(
                    "a {} has no `{}`; that column belongs to other shapes",
                    p.shape,
                    col.heading()
                ))
            }
        },
    };
    app.mode = Mode::Typing {
        target: Target::Cell {
            part: app.part,
            col,
        },
        line: LineEdit::new(&start),
    };
}

/// Keeps what was typed (an invalid entry is refused with the reason, nothing changes).
pub fn commit(app: &mut App) {
    match std::mem::replace(&mut app.mode, Mode::Main) {
        Mode::Typing { target, line } => {
            let entry = line.text.trim().to_string();
            let part = match &target {
                Target::Cell { part, .. } => *part,
                _ => 0,
            };
            let text = entry.clone();
            let new = match &target {
                Target::Cell { col, .. } => match col {
                    Col::Name => Edit::SetText {
                        part,
                        key: TextKey::Name,
                        text,
                    },
                    Col::Material => Edit::SetText {
                        part,
                        key: TextKey::Material,
                        text,
                    },
                    Col::Anchor => Edit::SetText {
                        part,
                        key: TextKey::Anchor,
                        text,
                    },
                    Col::Points => Edit::SetPoints { part, entry },
                    c => match c.slot() {
                        Some(slot) => Edit::SetValue { part, slot, entry },
                        None => {
                            app.error("refused: this cell is not typed into");
                            app.mode = Mode::Typing { target, line };
                            return;
                        }
                    },
                },
                Target::Param(name) => Edit::SetParam {
                    name: name.clone(),
                    entry,
                },
                Target::SaveAs => {
                    if entry.is_empty() {
                        app.error("type a file name, e.g. girder.toml");
                        app.mode = Mode::Typing { target, line };
                        return;
                    }
                    return save_to(app, PathBuf::from(entry), false);
                }
                Target::Rates => {
                    if let Err(m) = rates::open(app, &entry) {
                        app.error(format!("refused: {m}"));
                        app.mode = Mode::Typing { target, line };
                    }
                    return;
                }
                Target::Baseline => {
                    if let Err(m) = compare::open(app, &entry) {
                        app.error(format!("refused: {m}"));
                        app.mode = Mode::Typing { target, line };
                    }
                    return;
                }
                Target::Sweep(param) => {
                    if let Err(m) = sweep::open(app, param, &entry) {
                        app.error(format!("refused: {m}"));
                        app.mode = Mode::Typing { target, line };
                    }
                    return;
                }
                Target::Seek(param) => {
                    if let Err(m) = seek::solve(app, param, &entry) {
                        app.error(format!("refused: {m}"));
                        app.mode = Mode::Typing { target, line };
                    }
                    return;
                }
                Target::Key { .. } | Target::NewKey(_) | Target::Rename(_) => {
                    let taken = match tables::typed_edit(&target, &entry) {
                        Ok((e, note)) => app.edit(e).then(|| app.note(note)).is_some(),
                        Err(m) => {
                            app.error(format!("refused: {m}"));
                            false
                        }
                    };
                    if !taken {
                        app.mode = Mode::Typing { target, line };
                    }
                    return;
                }
            };
            if app.edit(new) {
                app.note("changed");
            } else {
                // Keep the line so the entry can be corrected.
                app.mode = Mode::Typing { target, line };
            }
        }
        Mode::Choosing(pick) => parts::choose(app, pick),
        Mode::Revisions(r) => compare::choose(app, r),
        other => app.mode = other,
    }
}

/// Leaves typing, the picker, a question or the help without changing anything.
pub fn cancel(app: &mut App) {
    if matches!(
        app.mode,
        Mode::AskQuit | Mode::AskOverwrite(_) | Mode::AskReadOnly(_)
    ) {
        app.quit_after_save = false;
    }
    if app.mode == Mode::Main {
        app.tables = None;
    }
    if let Mode::AskDisk(_) = app.mode {
        return keep_mine(app);
    }
    if app.mode == Mode::Working {
        app.mode = Mode::Main;
        return background::stop(app);
    }
    app.mode = Mode::Main;
    app.message = None;
}

/// Looks at the open file on disk (one `stat`; the text is read only when its time or
/// size changed). Text that differs from what was last read or written there is taken
/// when there are no unsaved edits (selection and baseline kept, the old text one undo
/// away); with unsaved edits the workbench asks. Nothing happens while a line is typed
/// or a question is open: the next look after that sees the change.
pub fn follow_disk(app: &mut App) {
    let Some(path) = app.path.clone() else { return };
    if app.mode != Mode::Main {
        return;
    }
    let Some(stamp) = app.watch.look(&path) else {
        return;
    };
    app.watch.seen(stamp);
    let Ok(text) = read_text(&path) else { return };
    if app.disk.as_deref() == Some(text.as_str()) {
        return;
    }
    let name = path.display().to_string();
    if !app.modified() {
        if app.take_disk(text) {
            app.note(format!("{name} changed on disk: reloaded (u goes back)"));
        }
    } else if app.text == text {
        // The file now holds exactly our edits: nothing is unsaved any more.
        app.disk = Some(text.clone());
        app.saved = text;
    } else {
        app.mode = Mode::AskDisk(text);
    }
}

/// Keeps the unsaved edits over a file changed on disk; saving then asks before it
/// overwrites the file.
fn keep_mine(app: &mut App) {
    if let Mode::AskDisk(_) = app.mode {
        app.mode = Mode::Main;
        app.note("kept your edits; the file on disk differs: saving asks before overwriting it");
    }
}

/// Takes the file's text from disk over the unsaved edits (they stay one undo away).
fn take_disk(app: &mut App, text: String) {
    if app.take_disk(text) {
        app.note("took the file from disk; your edits are one undo (u) away");
    }
}

/// The size of a step: the largest 1, 2 or 5 × 10ⁿ not above `x` (x > 0).
///
/// ```
/// use kern::tui::commands::nice_step;
/// assert_eq!(nice_step(15.0), 10.0);
/// assert_eq!(nice_step(0.8), 0.5);
/// assert_eq!(nice_step(26.6), 20.0);
/// ```
pub fn nice_step(x: f64) -> f64 {
    if !(x > 0.0 && x.is_finite()) {
        return 1.0;
    }
    let p = 10f64.powf(x.log10().floor());
    let m = x / p;
    let k = if m >= 5.0 {
        5.0
    } else if m >= 2.0 {
        2.0
    } else {
        1.0
    };
    k * p
}

/// Rotation steps in degrees: fine, normal, coarse.
const ANGLE_STEPS: [f64; 3] = [1.0, 5.0, 15.0];

/// What kind of number is being stepped, for the size of the step.
#[derive(Clone, Copy, PartialEq)]
enum Kind {
    Size,
    Position,
    Angle,
}

/// Steps the selected number by the fine (0), normal (1) or coarse (2) step, in
/// direction `dir`: sizes by a percentage of their value (stepping down, of the value an
/// up step would have started from, so the two reverse each other), positions by a percentage of
/// the section's size, rotations by 1°, 5° or 15°; the step is rounded to 1, 2 or 5 × 10ⁿ
/// and the result to a multiple of it. An expression that is a bare param name steps
/// that param; any other expression is refused.
pub fn step(app: &mut App, level: usize, dir: f64) {
    let doc = &app.analysis.document;
    let (value, kind, what) = match app.focus {
        Focus::Params => match doc.params.get(app.param) {
            Some((name, _, v)) => (v.value.clone(), Kind::Size, Stepped::Param(name.clone())),
            None => return,
        },
        Focus::Parts => {
            let Some(p) = doc.parts.get(app.part) else {
                return app.note("no parts yet: press a to add one");
            };
            let col = app.column();
            if col == Col::Anchor {
                return parts::cycle_anchor(app, dir as i64);
            }
            let (Some(slot), Some(v)) = (col.slot(), number(p, col)) else {
                return app
                    .note("only numbers step; move to a dimension, a position or the rotation");
            };
            let kind = match col {
                Col::AtX | Col::AtY => Kind::Position,
                Col::Rotate => Kind::Angle,
                _ => Kind::Size,
            };
            (v, kind, Stepped::Cell(app.part, slot))
        }
    };
    let (x, what) = match value {
        Value::Number(x) => (x, what),
        Value::Expr(e) => match param_behind(app, &e) {
            Some((name, x)) => (x, Stepped::Param(name)),
            None => {
                return app.error(format!(
                    "`{e}` is an expression; step the param it uses, or type a new value (Enter)"
                ))
            }
        },
    };
    let pct = app.config.steps.get(level).copied().unwrap_or(5.0) / 100.0;
    let b = app.analysis.props.bounds;
    let size = (b[1] - b[0]).max(b[3] - b[2]).abs();
    let raw = match kind {
        Kind::Angle => ANGLE_STEPS.get(level).copied().unwrap_or(5.0),
        Kind::Position => pct * size,
        // Down, the step is the one an up step to `x` would take (it starts from
        // x/(1 + share)), so that an up and a down step undo each other.
        Kind::Size if x != 0.0 && dir < 0.0 => pct * x.abs() / (1.0 + pct),
        Kind::Size if x != 0.0 => pct * x.abs(),
        Kind::Size => pct * size,
    };
    // A hair over, so that a share landing on 1, 2 or 5 × 10ⁿ in exact arithmetic is
    // not rounded below it.
    let s = nice_step(raw * (1.0 + 1e-9));
    let new = round_sig(((x + dir * s) / s).round() * s, 12);
    let v = number_value(new);
    let unit = if kind == Kind::Angle {
        "°"
    } else {
        app.analysis.section.units.name()
    };
    let (label, result) = match what {
        Stepped::Param(name) => (name.clone(), Edit::SetParamNumber { name, value: new }),
        Stepped::Cell(part, slot) => (
            app.column().heading().to_string(),
            Edit::SetNumber {
                part,
                slot,
                value: new,
            },
        ),
    };
    if app.edit(result) {
        app.note(format!(
            "{label}: {} → {v} {unit} (step {s} {unit})",
            number_value(x)
        ));
    }
}

/// What a step changes.
enum Stepped {
    Cell(usize, Slot),
    Param(String),
}

/// The param a bare-name expression stands for (following names to names), with its
/// number; `None` if the expression is anything else.
fn param_behind(app: &App, expr: &str) -> Option<(String, f64)> {
    let params = &app.analysis.document.params;
    let mut name = expr.trim().to_string();
    for _ in 0..params.len().max(1) {
        let (_, _, v) = params.iter().find(|(n, _, _)| *n == name)?;
        match &v.value {
            Value::Number(x) => return Some((name, *x)),
            Value::Expr(e) => name = e.trim().to_string(),
        }
    }
    None
}

pub fn undo(app: &mut App) {
    match app.undo.pop() {
        Some(t) => {
            let now = std::mem::replace(&mut app.text, t.clone());
            app.redo.push(now);
            app.restore(t);
            app.note(format!("undone ({} more)", app.undo.len()));
        }
        None => app.note("nothing to undo"),
    }
}

pub fn redo(app: &mut App) {
    match app.redo.pop() {
        Some(t) => {
            let now = std::mem::replace(&mut app.text, t.clone());
            app.undo.push(now);
            app.restore(t);
            app.note("redone");
        }
        None => app.note("nothing to redo"),
    }
}

fn reset_baseline(app: &mut App) {
    match crate::file::load::analyse(&app.opened, &Options::default()) {
        Ok(a) => {
            app.baseline = a;
            app.baseline_text = app.opened.clone();
            app.baseline_label = "file as opened";
            app.note("changes are shown against the file as opened");
        }
        Err(d) => app.error(d.message),
    }
}

/// Saves to the file (the demo asks for a name first).
pub fn save(app: &mut App) {
    match app.path.clone() {
        Some(p) => save_to(app, p, false),
        None => begin_save_as(app),
    }
}

fn begin_save_as(app: &mut App) {
    let start = app
        .path
        .as_ref()
        .map_or(String::new(), |p| p.display().to_string());
    app.mode = Mode::Typing {
        target: Target::SaveAs,
        line: LineEdit::new(&start),
    };
}

/// Writes the text to `path` atomically; unless `force`, first checks that the file on
/// disk is the one that was opened (or does not exist), and asks otherwise.
pub fn save_to(app: &mut App, path: PathBuf, force: bool) {
    write_to(app, path, force, Overwrite::Writable);
}

/// [`save_to`], asking before replacing a read-only file unless `overwrite` says so.
fn write_to(app: &mut App, path: PathBuf, force: bool, overwrite: Overwrite) {
    app.mode = Mode::Main;
    if !force && changed_on_disk(app, &path) {
        app.mode = Mode::AskOverwrite(path);
        return;
    }
    match disk::save(&path, &app.text, overwrite) {
        Ok(saved) => {
            match saved.warning {
                Some(w) => app.error(format!("saved {}, but {w}", path.display())),
                None => app.note(format!("saved {}", path.display())),
            }
            app.disk = Some(app.text.clone());
            app.saved = app.text.clone();
            app.path = Some(path);
            if app.quit_after_save {
                app.quit = true;
            }
        }
        Err(SaveError::ReadOnly(_)) => app.mode = Mode::AskReadOnly(path),
        Err(e) => {
            app.quit_after_save = false;
            app.error(format!("could not save {}: {e}", path.display()));
        }
    }
}

/// Does `path` hold something other than what this workbench last read or wrote there?
fn changed_on_disk(app: &App, path: &Path) -> bool {
    let ours = app.path.as_deref() == Some(path);
    match read_text(path) {
        Err(_) => false,
        Ok(text) => !ours || app.disk.as_deref() != Some(text.as_str()),
    }
}

fn quit(app: &mut App) {
    if app.modified() {
        app.mode = Mode::AskQuit;
    } else {
        app.quit = true;
    }
}

fn answer_yes(app: &mut App) {
    match std::mem::replace(&mut app.mode, Mode::Main) {
        Mode::AskQuit => app.quit = true,
        Mode::AskOverwrite(p) => save_to(app, p, true),
        Mode::AskReadOnly(p) => write_to(app, p, true, Overwrite::ReadOnly),
        Mode::AskRecover(p) => app.take_recovery(&p),
        Mode::AskBaseline => {
            app.set_baseline("your baseline");
            app.note("baseline set: changes are now shown against the section as it is now (B: the file as opened)");
        }
        Mode::AskVoid(part) if part == app.part => parts::toggle(app, Flag::Void),
        Mode::AskDisk(text) => take_disk(app, text),
        Mode::AskSeek(found) => seek::apply(app, found),
        other => app.mode = other,
    }
}
