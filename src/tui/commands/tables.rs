//! Commands on the file's keys outside the parts: the title, the units, the params
//! (added, renamed with every use, removed when unused), the materials, `[actions]` and
//! `[member]`. They are listed as rows ([`rows`]) in a window (`o`); each change is an
//! [`Edit`] on the kept document, so comments and layout stay as written.

use crate::file::edit::{Edit, Place};
use crate::tui::app::{App, LineEdit, Mode, Target};
use toml_edit::{DocumentMut, Item, TableLike, Value};

/// One row of the window.
#[derive(Debug, Clone, PartialEq)]
pub enum Row {
    /// A table's heading, and whether the file has the table.
    Head(Place, bool),
    /// A key of a table with its value as written.
    Key(Place, String, String),
    /// The row that adds a material.
    NewMaterial,
}

/// The rows of the window, in file order of the tables: the top of the file, the
/// params, each material and a row to add one, the actions, the member.
pub fn rows(doc: &DocumentMut) -> Vec<Row> {
    let mut out = vec![Row::Head(Place::Top, true)];
    let root = doc.as_table();
    for (k, item) in root.iter() {
        if let Item::Value(v) = item {
            if k != "parts" && k != "materials" {
                out.push(Row::Key(Place::Top, k.to_string(), written(v)));
            }
        }
    }
    let table = |out: &mut Vec<Row>, place: Place, t: Option<&dyn TableLike>| {
        out.push(Row::Head(place, t.is_some()));
        for (k, item) in t.into_iter().flat_map(TableLike::iter) {
            let text = item.as_value().map_or_else(|| item.to_string(), written);
            out.push(Row::Key(place, k.to_string(), text));
        }
    };
    table(
        &mut out,
        Place::Params,
        root.get("params").and_then(Item::as_table_like),
    );
    let materials: Vec<&dyn TableLike> = match root.get("materials") {
        Some(Item::ArrayOfTables(a)) => a.iter().map(|t| t as &dyn TableLike).collect(),
        Some(Item::Value(Value::Array(a))) => a
            .iter()
            .filter_map(Value::as_inline_table)
            .map(|t| t as &dyn TableLike)
            .collect(),
        _ => Vec::new(),
    };
    for (i, t) in materials.into_iter().enumerate() {
        table(&mut out, Place::Material(i), Some(t));
    }
    out.push(Row::NewMaterial);
    for (place, key) in [(Place::Actions, "actions"), (Place::Member, "member")] {
        table(&mut out, place, root.get(key).and_then(Item::as_table_like));
    }
    out
}

/// A value as the file writes it, without the spacing and comment around it.
fn written(v: &Value) -> String {
    let mut v = v.clone();
    v.decor_mut().clear();
    v.to_string()
}

/// What a value is typed as: a string's text without quotes, anything else as written.
fn entry_of(text: &str) -> String {
    match text.parse::<Value>() {
        Ok(Value::String(s)) => s.value().clone(),
        _ => text.to_string(),
    }
}

/// The number of materials in the file.
fn material_count(rows: &[Row]) -> usize {
    rows.iter()
        .filter(|r| matches!(r, Row::Head(Place::Material(_), _)))
        .count()
}

/// Opens the window on its first row.
pub fn open(app: &mut App) {
    app.tables = Some(0);
    app.note("Enter edits · a adds · x removes · R renames a param · Esc closes");
}

/// The selected row of the window, if it is open.
pub fn selected(app: &App) -> Option<Row> {
    let all = rows(app.doc());
    let i = app.tables?.min(all.len().saturating_sub(1));
    all.into_iter().nth(i)
}

/// Moves the window's selection by `by` rows (clamped).
pub fn move_row(app: &mut App, by: i64) {
    let n = rows(app.doc()).len() as i64;
    if let Some(r) = &mut app.tables {
        *r = (*r as i64 + by).clamp(0, (n - 1).max(0)) as usize;
    }
}

fn typing(app: &mut App, target: Target, start: &str) {
    app.mode = Mode::Typing {
        target,
        line: LineEdit::new(start),
    };
}

/// Enter on a row: types a new value for a key, or adds a key on a heading.
pub fn edit(app: &mut App) {
    match selected(app) {
        Some(Row::Key(table, key, text)) => {
            typing(app, Target::Key { table, key }, &entry_of(&text));
        }
        Some(_) => add(app),
        None => {}
    }
}

/// Starts typing a new key for the selected row's table (`name = value` for a param;
/// `name = …, E = …` for a new material).
pub fn add(app: &mut App) {
    let all = rows(app.doc());
    match selected(app) {
        Some(Row::NewMaterial) => {
            let n = material_count(&all);
            typing(app, Target::NewKey(Place::Material(n)), "name = , E = ");
            if let Mode::Typing { line, .. } = &mut app.mode {
                line.cursor = "name = ".len();
            }
        }
        Some(Row::Head(p, _) | Row::Key(p, _, _)) => typing(app, Target::NewKey(p), ""),
        None => {}
    }
}

/// Removes the selected key, or the selected material, `[actions]` or `[member]`.
pub fn remove(app: &mut App) {
    let e = match selected(app) {
        Some(Row::Key(Place::Params, name, _)) => Edit::RemoveParam { name },
        Some(Row::Key(table, key, _)) => Edit::RemoveKey { table, key },
        Some(Row::Head(table @ (Place::Material(_) | Place::Actions | Place::Member), true)) => {
            Edit::RemoveTable { table }
        }
        Some(Row::Head(table, _)) => {
            return app.note(format!(
                "{} is not removed as a whole; remove its keys (x on each)",
                table.label()
            ))
        }
        _ => return,
    };
    let what = match &e {
        Edit::RemoveTable { table } => table.label(),
        Edit::RemoveParam { name } | Edit::RemoveKey { key: name, .. } => format!("`{name}`"),
        _ => String::new(),
    };
    if app.edit(e) {
        app.note(format!("removed {what} (u undoes)"));
    }
}

/// Starts typing a new name for the selected param of the window.
pub fn rename(app: &mut App) {
    match selected(app) {
        Some(Row::Key(Place::Params, name, _)) => typing(app, Target::Rename(name.clone()), &name),
        _ => app.note("only a param is renamed here (a part's name is its name cell)"),
    }
}

/// Starts typing a new param (`name = value`), from the params list.
pub fn add_param(app: &mut App) {
    typing(app, Target::NewKey(Place::Params), "");
}

/// Removes the selected param of the params list (refused while an expression uses it).
pub fn remove_param(app: &mut App) {
    let Some((name, _, _)) = app.analysis.document.params.get(app.param) else {
        return;
    };
    let name = name.clone();
    if app.edit(Edit::RemoveParam { name: name.clone() }) {
        app.note(format!("removed param `{name}` (u undoes)"));
    }
}

/// `key = value` pairs typed on one line, separated by commas outside quotes and
/// brackets: `name = timber, E = 11 GPa`.
pub fn pairs(line: &str) -> Result<Vec<(String, String)>, String> {
    let mut parts = Vec::new();
    let (mut depth, mut quote, mut start) = (0i32, false, 0);
    for (i, c) in line.char_indices() {
        match c {
            '"' => quote = !quote,
            '[' | '{' if !quote => depth += 1,
            ']' | '}' if !quote => depth -= 1,
            ',' if !quote && depth == 0 => {
                parts.push(&line[start..i]);
                start = i + 1;
            }
            _ => {}
        }
    }
    parts.push(&line[start..]);
    parts
        .into_iter()
        .filter(|p| !p.trim().is_empty())
        .map(|p| match p.split_once('=') {
            Some((k, v)) if !k.trim().is_empty() && !v.trim().is_empty() => {
                Ok((k.trim().to_string(), v.trim().to_string()))
            }
            _ => Err(format!(
                "`{}`: type key = value, e.g. fy = 355 MPa",
                p.trim()
            )),
        })
        .collect()
}

/// The edit a typed line makes for a target of this window, and what to say when it
/// is taken; `Err` says what to type instead.
pub fn typed_edit(target: &Target, entry: &str) -> Result<(Edit, String), String> {
    Ok(match target {
        Target::Key {
            table: Place::Params,
            key,
        } => (
            Edit::SetParam {
                name: key.clone(),
                entry: entry.to_string(),
            },
            format!("param {key} changed"),
        ),
        Target::Key { table, key } => (
            Edit::SetKey {
                table: *table,
                key: key.clone(),
                entry: entry.to_string(),
            },
            format!("{key} changed"),
        ),
        Target::Rename(from) => (
            Edit::RenameParam {
                from: from.clone(),
                to: entry.to_string(),
            },
            format!("param {from} renamed {entry}, with every use (u undoes)"),
        ),
        Target::NewKey(Place::Material(i)) => (
            Edit::AddMaterial {
                keys: pairs(entry)?,
            },
            format!("material {} added", i + 1),
        ),
        Target::NewKey(table) => {
            let mut all = pairs(entry)?;
            let (Some((key, value)), true) = (all.pop(), all.is_empty()) else {
                return Err("type one key = value, e.g. tw = 8".into());
            };
            let note = format!("{key} added to {}", table.label());
            match table {
                Place::Params => (
                    Edit::AddParam {
                        name: key,
                        entry: value,
                    },
                    note,
                ),
                _ => (
                    Edit::SetKey {
                        table: *table,
                        key,
                        entry: value,
                    },
                    note,
                ),
            }
        }
        _ => return Err("this line is not for a key of the file".into()),
    })
}

#[cfg(test)]
mod tests {
    use super::pairs;

    #[test]
    fn pairs_split_at_commas_outside_quotes_and_brackets() {
        let p = pairs("name = timber, E = 11 GPa").unwrap();
        assert_eq!(
            p,
            [
                ("name".into(), "timber".into()),
                ("E".into(), "11 GPa".into())
            ]
        );
        let p = pairs("point = [{ P = \"3 kN\", a = \"1 m\" }]").unwrap();
        assert_eq!(p.len(), 1);
        assert!(pairs("name = , E = 1 GPa").is_err());
    }
}
