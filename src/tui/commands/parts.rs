//! Commands on the parts as a whole: the shape picker (for a new part or a new shape),
//! copying, deleting and reordering parts, and the on/off keys of a part — void,
//! enabled, the flips — and its anchor.

use crate::file::edit;
use crate::geom::Anchor;
use crate::tui::app::{App, Focus, Mode, Picker};
use crate::tui::columns::anchor;

/// Opens the shape picker: for a new part, or (`change`) for the selected part, on its
/// current shape.
pub fn open_picker(app: &mut App, change: bool) {
    if !change {
        app.mode = Mode::Choosing(Picker {
            row: 0,
            change: None,
        });
        return;
    }
    let Some(p) = selected(app) else { return };
    let row = edit::shape_names().position(|s| s == p.shape).unwrap_or(0);
    app.mode = Mode::Choosing(Picker {
        row,
        change: Some(app.part),
    });
}

/// The selected part, or `None` with a note on how to get one.
fn selected(app: &mut App) -> Option<&crate::model::PartDoc> {
    if app.focus != Focus::Parts || app.analysis.document.parts.is_empty() {
        app.note("select a part first (Tab switches to the parts, a adds one)");
        return None;
    }
    app.analysis.document.parts.get(app.part)
}

/// Takes the shape on the picker's highlighted row.
pub fn choose(app: &mut App, pick: Picker) {
    app.mode = Mode::Main;
    let Some(shape) = edit::shape_names().nth(pick.row) else {
        return;
    };
    match pick.change {
        None => add_part(app, shape),
        Some(i) => change_shape(app, i, shape),
    }
}

/// Adds a part of `shape` with default sizes, and selects it.
fn add_part(app: &mut App, shape: &str) {
    let n = app.analysis.document.parts.len();
    let name = format!("{} {}", shape.replace('_', " "), n + 1);
    let r = edit::add_part(&app.text, shape, &name, app.analysis.section.units);
    if app.apply(r) {
        app.focus = Focus::Parts;
        app.part = n;
        app.note(format!("added {name} at the origin"));
    }
}

/// Changes part `i` to `shape` (see [`edit::change_shape`]), in one undoable edit.
fn change_shape(app: &mut App, i: usize, shape: &str) {
    let Some(old) = app.analysis.document.parts.get(i).map(|p| p.shape.clone()) else {
        return;
    };
    if old == shape {
        return app.note(format!("the part is a {shape} already"));
    }
    let r = edit::change_shape(&app.text, i, shape, app.analysis.section.units);
    if app.apply(r) {
        app.note(format!(
            "{old} → {shape}: place and shared sizes kept, new sizes at their defaults (u undoes)"
        ));
    }
}

/// Flips a true/false key of the selected part and says what it is now.
pub fn toggle(app: &mut App, key: &str, default: bool) {
    if selected(app).is_none() {
        return;
    }
    let r = edit::toggle_part_flag(&app.text, app.part, key, default);
    if app.apply(r) {
        let Some(p) = app.analysis.document.parts.get(app.part) else {
            return;
        };
        let state = match key {
            "void" if p.void => "part now a void (subtracted)",
            "void" => "part now solid",
            "enabled" if p.enabled => "part taken back in",
            "enabled" => "part left out (disabled)",
            "flip_x" if p.flip_x => "part mirrored left to right (flip_x = true)",
            "flip_y" if p.flip_y => "part mirrored top to bottom (flip_y = true)",
            _ => "mirror undone",
        };
        app.note(state);
    }
}

/// Sets the selected part's anchor to the next (`by` = 1) or previous (−1) one of
/// [`Anchor::ALL`].
pub fn cycle_anchor(app: &mut App, by: i64) {
    let Some(p) = selected(app) else { return };
    let all = &Anchor::ALL;
    let now = all.iter().position(|a| a.0 == anchor(p)).unwrap_or(0) as i64;
    let n = all.len() as i64;
    let Some((_, name)) = all.get((now + by).rem_euclid(n) as usize) else {
        return;
    };
    let r = edit::set_part_text(&app.text, app.part, "anchor", name);
    if app.apply(r) {
        app.note(format!("anchor: {name} sits at `at` (n next, N back)"));
    }
}

pub fn copy_part(app: &mut App) {
    let r = edit::duplicate_part(&app.text, app.part);
    if app.apply(r) {
        app.part += 1;
        app.note("copied; the copy sits on the original until you move it");
    }
}

pub fn delete_part(app: &mut App) {
    if app.analysis.document.parts.len() <= 1 {
        return app.error("refused: a section needs at least one part");
    }
    let r = edit::delete_part(&app.text, app.part);
    if app.apply(r) {
        app.note("part deleted (u undoes)");
    }
}

pub fn move_part(app: &mut App, down: bool) {
    let r = edit::move_part(&app.text, app.part, down);
    if app.apply(r) {
        app.part = if down {
            app.part + 1
        } else {
            app.part.saturating_sub(1)
        };
    }
}
