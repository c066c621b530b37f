//! Commands on the parts as a whole: the shape picker (for a new part or a new shape),
//! copying, deleting and reordering parts, and the on/off keys of a part — void,
//! enabled, the flips — and its anchor.

use crate::file::edit::{Edit, Flag, Slot, TextKey};
use crate::model::schema::{ShapeKind, SPECS};
use crate::model::Anchor;
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
    let row = SPECS.iter().position(|s| s.kind == p.shape).unwrap_or(0);
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
    let Some(shape) = SPECS.get(pick.row).map(|s| s.kind) else {
        return;
    };
    match pick.change {
        None => add_part(app, shape),
        Some(i) => change_shape(app, i, shape),
    }
}

/// Adds a part of `shape` with default sizes, and selects it.
fn add_part(app: &mut App, shape: ShapeKind) {
    let n = app.analysis.document.parts.len();
    let name = format!("{} {}", shape.as_str().replace('_', " "), n + 1);
    let unit = app.analysis.section.units;
    let note = format!("added {name} at the origin");
    if app.edit(Edit::AddPart { shape, name, unit }) {
        app.focus = Focus::Parts;
        app.part = n;
        app.note(note);
    }
}

/// Changes part `i` to `shape` (see [`Edit::SetShape`]), in one undoable edit.
fn change_shape(app: &mut App, i: usize, shape: ShapeKind) {
    let Some(old) = app.analysis.document.parts.get(i).map(|p| p.shape) else {
        return;
    };
    if old == shape {
        return app.note(format!("the part is a {shape} already"));
    }
    let unit = app.analysis.section.units;
    let mut edits = vec![Edit::SetShape {
        part: i,
        shape,
        unit,
    }];
    let mut carried = Vec::new();
    if let Some(p) = app.analysis.document.parts.get(i) {
        for (from, to) in CARRY {
            let fresh = shape.key(to).is_some() && old.key(to).is_none();
            if let (true, Some(v)) = (fresh, p.dim(from)) {
                if carried.iter().all(|(_, t)| t != to) {
                    carried.push((*from, *to));
                    edits.push(Edit::SetValue {
                        part: i,
                        slot: Slot::Key((*to).to_string()),
                        entry: v.value.text(),
                    });
                }
            }
        }
    }
    let carried: Vec<String> = carried.iter().map(|(f, t)| format!("{f} → {t}")).collect();
    let carried = if carried.is_empty() {
        String::new()
    } else {
        format!(", {}", carried.join(", "))
    };
    if app.edit_all(edits) {
        app.note(format!(
            "{old} → {shape}: place and shared sizes kept{carried}, other new sizes at their defaults (u undoes)"
        ));
    }
}

/// Sizes carried over to a new shape that lacks the old key: an overall size stays the
/// overall size (a circle's diameter becomes a rectangle's width and height, a depth a
/// height and back). The first pair for a new key wins.
const CARRY: &[(&str, &str)] = &[("d", "b"), ("d", "h"), ("h", "d"), ("b", "d")];

/// Flips a true/false key of the selected part and says what it is now.
pub fn toggle(app: &mut App, flag: Flag) {
    if selected(app).is_none() {
        return;
    }
    if app.edit(Edit::Toggle {
        part: app.part,
        flag,
    }) {
        let Some(p) = app.analysis.document.parts.get(app.part) else {
            return;
        };
        let state = match flag {
            Flag::Void if p.void => "part now a void (subtracted)",
            Flag::Void => "part now solid",
            Flag::Enabled if p.enabled => "part taken back in",
            Flag::Enabled => "part left out (disabled)",
            Flag::FlipX if p.flip_x => "part mirrored left to right (flip_x = true)",
            Flag::FlipY if p.flip_y => "part mirrored top to bottom (flip_y = true)",
            _ => "mirror undone",
        };
        app.note(state);
    }
}

/// Makes the selected part a hole (net section only) or a void everywhere again.
pub fn toggle_hole(app: &mut App) {
    if selected(app).is_none() {
        return;
    }
    if app.edit(Edit::ToggleHole { part: app.part }) {
        let hole = app
            .analysis
            .document
            .parts
            .get(app.part)
            .is_some_and(|p| p.hole);
        app.note(if hole {
            "part now a hole: subtracted for the net section (stresses), left out of the gross one"
        } else {
            "part now a void everywhere (subtracted from every section)"
        });
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
    if app.edit(Edit::SetText {
        part: app.part,
        key: TextKey::Anchor,
        text: name.to_string(),
    }) {
        app.note(format!("anchor: {name} sits at `at` (n next, N back)"));
    }
}

/// Copies the selected part below itself; a named part's copy gets the next free
/// number (`bolt hole` → `bolt hole 2`, `web 2` → `web 3`), in one undoable edit.
pub fn copy_part(app: &mut App) {
    let part = app.part;
    let mut edits = vec![Edit::CopyPart { part }];
    let names: Vec<&str> = app
        .analysis
        .document
        .parts
        .iter()
        .filter_map(|p| p.name.as_deref())
        .collect();
    let named = app
        .analysis
        .document
        .parts
        .get(part)
        .and_then(|p| p.name.clone());
    if let Some(name) = named {
        edits.push(Edit::SetText {
            part: part + 1,
            key: TextKey::Name,
            text: copy_name(&name, &names),
        });
    }
    if app.edit_all(edits) {
        app.part += 1;
        app.note("copied; the copy sits on the original until you move it");
    }
}

/// The name for a copy of `name`: its stem with the next number no part uses yet.
pub fn copy_name(name: &str, taken: &[&str]) -> String {
    let (stem, n) = match name.rsplit_once(' ') {
        Some((stem, n)) if !stem.is_empty() => match n.parse::<u32>() {
            Ok(n) => (stem, n),
            Err(_) => (name, 1),
        },
        _ => (name, 1),
    };
    (n.saturating_add(1)..)
        .map(|k| format!("{stem} {k}"))
        .find(|c| !taken.contains(&c.as_str()))
        .unwrap_or_else(|| name.to_string())
}

pub fn delete_part(app: &mut App) {
    if app.analysis.document.parts.len() <= 1 {
        return app.error("refused: a section needs at least one part");
    }
    if app.edit(Edit::DeletePart { part: app.part }) {
        app.note("part deleted (u undoes)");
    }
}

pub fn move_part(app: &mut App, down: bool) {
    if app.edit(Edit::MovePart {
        part: app.part,
        down,
    }) {
        app.part = if down {
            app.part + 1
        } else {
            app.part.saturating_sub(1)
        };
    }
}
