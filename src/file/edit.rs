//! Editing a section file in place: an [`Edit`] says what to change, and
//! [`Edit::apply`] changes only that in a `toml_edit` document the caller keeps —
//! comments, key order, spacing and untouched lines stay as written (a one-value edit
//! is a one-line diff).
//!
//! The edits do not check that the result is a valid section; the caller re-reads
//! the text (`file::load::analyse`) and refuses an edit that does not compute.
//! What lives elsewhere: reading with spans is [`super::read`], saving is [`super::save`].

use crate::model::schema::{is_shape_key, ShapeKind};
use crate::model::units::LengthUnit;
use crate::model::{Anchor, Val};
use toml_edit::{Array, ArrayOfTables, DocumentMut, Item, Key, Table, TableLike, Value};

/// A number-valued place in a part: a named key (`b`, `tf`, `rotate`…) or one
/// coordinate of `at` (0 for x, 1 for y).
#[derive(Debug, Clone, PartialEq, Eq)]
pub enum Slot {
    Key(String),
    At(usize),
}

/// A true/false key of a part.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum Flag {
    Void,
    Enabled,
    FlipX,
    FlipY,
}

impl Flag {
    /// The key in the file.
    pub fn key(self) -> &'static str {
        match self {
            Flag::Void => "void",
            Flag::Enabled => "enabled",
            Flag::FlipX => "flip_x",
            Flag::FlipY => "flip_y",
        }
    }

    /// The value when the key is not written.
    pub fn default(self) -> bool {
        self == Flag::Enabled
    }
}

/// A text key of a part.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum TextKey {
    Name,
    Material,
    Anchor,
}

impl TextKey {
    /// The key in the file.
    pub fn key(self) -> &'static str {
        match self {
            TextKey::Name => "name",
            TextKey::Material => "material",
            TextKey::Anchor => "anchor",
        }
    }
}

/// One change to a section file; parts are counted from 0.
#[derive(Debug, Clone, PartialEq)]
pub enum Edit {
    /// A number slot set to what the user typed: a number stays a number, anything
    /// else becomes an expression.
    SetValue {
        part: usize,
        slot: Slot,
        entry: String,
    },
    /// A number slot set to a computed number (rounded as [`number_value`] does).
    SetNumber {
        part: usize,
        slot: Slot,
        value: f64,
    },
    /// A text key set; an empty text removes the key.
    SetText {
        part: usize,
        key: TextKey,
        text: String,
    },
    /// A polygon's points set to what the user typed, a TOML array of `[x, y]` pairs.
    SetPoints {
        part: usize,
        entry: String,
    },
    /// The part changed to another shape (see [`change_shape`]); new sizes in `unit`.
    SetShape {
        part: usize,
        shape: ShapeKind,
        unit: LengthUnit,
    },
    /// A true/false key flipped.
    Toggle {
        part: usize,
        flag: Flag,
    },
    /// The part made a hole (`hole = true`: a void at some cross-sections only, left
    /// out of the gross section), or a hole made a void everywhere again (`hole =
    /// false`, `void = true`).
    ToggleHole {
        part: usize,
    },
    /// A part of `shape` appended with default sizes (in `unit`), at the origin.
    AddPart {
        shape: ShapeKind,
        name: String,
        unit: LengthUnit,
    },
    /// A copy of the part inserted right after it.
    CopyPart {
        part: usize,
    },
    DeletePart {
        part: usize,
    },
    /// The part swapped with the next one (`down`) or the previous one.
    MovePart {
        part: usize,
        down: bool,
    },
    /// A param set to what the user typed.
    SetParam {
        name: String,
        entry: String,
    },
    /// A param set to a computed number.
    SetParamNumber {
        name: String,
        value: f64,
    },
    /// A new param (refused when the name is taken); `[params]` is made if missing.
    AddParam {
        name: String,
        entry: String,
    },
    /// A param renamed where it stands, and every expression that uses it with it.
    RenameParam {
        from: String,
        to: String,
    },
    /// A param removed; refused while an expression uses it, naming where.
    RemoveParam {
        name: String,
    },
    /// A key of a table other than the parts set to what the user typed (see
    /// [`typed_value`]), added at the table's end when it is not there; a missing
    /// `[actions]` or `[member]` is made.
    SetKey {
        table: Place,
        key: String,
        entry: String,
    },
    /// A key of a table other than the parts removed.
    RemoveKey {
        table: Place,
        key: String,
    },
    /// A `[[materials]]` entry appended with these keys (as typed).
    AddMaterial {
        keys: Vec<(String, String)>,
    },
    /// A whole `[actions]`, `[member]` or material removed.
    RemoveTable {
        table: Place,
    },
}

/// A table of the file other than the parts: where the keys of [`Edit::SetKey`] and
/// [`Edit::RemoveKey`] live. Materials are counted from 0.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum Place {
    /// The top of the file: `format`, `title`, `units`.
    Top,
    Params,
    Material(usize),
    Actions,
    Member,
}

impl Place {
    /// The table as the file writes it (for messages and headings).
    pub fn label(self) -> String {
        match self {
            Place::Top => "top of the file".into(),
            Place::Params => "[params]".into(),
            Place::Material(i) => format!("material {}", i + 1),
            Place::Actions => "[actions]".into(),
            Place::Member => "[member]".into(),
        }
    }

    /// The key of the table in the file's top level.
    fn key(self) -> Option<&'static str> {
        match self {
            Place::Top => None,
            Place::Params => Some("params"),
            Place::Material(_) => Some("materials"),
            Place::Actions => Some("actions"),
            Place::Member => Some("member"),
        }
    }
}

/// Keys whose value is text, never an expression: what is typed is taken as written.
pub const TEXT_KEYS: &[&str] = &[
    "title",
    "units",
    "name",
    "shape",
    "material",
    "anchor",
    "support",
    "load_height",
];

impl Edit {
    /// Makes the change in `doc`. On an error `doc` is unchanged.
    pub fn apply(&self, doc: &mut DocumentMut) -> Result<(), String> {
        match self {
            Edit::SetValue { part, slot, entry } => {
                set_part_number(doc, *part, slot, entry_value(entry)?)
            }
            Edit::SetNumber { part, slot, value } => {
                set_part_number(doc, *part, slot, number_value(*value))
            }
            Edit::SetText { part, key, text } => set_part_text(doc, *part, key.key(), text),
            Edit::SetPoints { part, entry } => {
                let v = points_value(entry)?;
                set_key(part_mut(doc, *part)?, "points", v);
                Ok(())
            }
            Edit::SetShape { part, shape, unit } => change_shape(doc, *part, *shape, *unit),
            Edit::Toggle { part, flag } => {
                let t = part_mut(doc, *part)?;
                let now = t
                    .get(flag.key())
                    .and_then(Item::as_bool)
                    .unwrap_or(flag.default());
                set_key(t, flag.key(), Value::from(!now));
                Ok(())
            }
            Edit::ToggleHole { part } => {
                let t = part_mut(doc, *part)?;
                let hole = t.get("hole").and_then(Item::as_bool).unwrap_or(false);
                set_key(t, "hole", Value::from(!hole));
                // A hole is a void: `void = false` written out would contradict it.
                if hole || t.get("void").is_some() {
                    set_key(t, "void", Value::from(true));
                }
                Ok(())
            }
            Edit::AddPart { shape, name, unit } => add_part(doc, *shape, name, *unit),
            Edit::CopyPart { part } => with_parts(doc, |tables| {
                let t = tables
                    .get(*part)
                    .cloned()
                    .ok_or_else(|| format!("there is no part {}", part + 1))?;
                tables.insert(part + 1, t);
                Ok(())
            }),
            Edit::DeletePart { part } => with_parts(doc, |tables| {
                if *part >= tables.len() {
                    return Err(format!("there is no part {}", part + 1));
                }
                tables.remove(*part);
                Ok(())
            }),
            Edit::MovePart { part, down } => with_parts(doc, |tables| {
                let (i, j) = (
                    *part,
                    if *down {
                        part + 1
                    } else {
                        part.wrapping_sub(1)
                    },
                );
                if i >= tables.len() || j >= tables.len() {
                    return Err("the part is already at that end of the list".into());
                }
                tables.swap(i, j);
                Ok(())
            }),
            Edit::SetParam { name, entry } => set_param(doc, name, entry_value(entry)?),
            Edit::SetParamNumber { name, value } => set_param(doc, name, number_value(*value)),
            Edit::AddParam { name, entry } => add_param(doc, name, entry_value(entry)?),
            Edit::RenameParam { from, to } => rename_param(doc, from, to),
            Edit::RemoveParam { name } => remove_param(doc, name),
            Edit::SetKey { table, key, entry } => {
                let v = typed_value(key, entry)?;
                set_key(table_mut(doc, *table, true)?, key, v);
                Ok(())
            }
            Edit::RemoveKey { table, key } => {
                let t = table_mut(doc, *table, false)?;
                match t.remove(key) {
                    Some(_) => Ok(()),
                    None => Err(format!("{} has no `{key}`", table.label())),
                }
            }
            Edit::AddMaterial { keys } => add_material(doc, keys),
            Edit::RemoveTable { table } => remove_table(doc, *table),
        }
    }

    /// The edit applied to a file's text, for a caller that keeps no document.
    pub fn apply_to_text(&self, text: &str) -> Result<String, String> {
        let mut doc = open(text)?;
        self.apply(&mut doc)?;
        Ok(doc.to_string())
    }
}

/// The document of a file's text.
pub fn open(text: &str) -> Result<DocumentMut, String> {
    text.parse::<DocumentMut>()
        .map_err(|e| format!("not valid TOML: {}", e.message().trim()))
}

/// What the user typed in a number cell: an integer or decimal number stays a number,
/// anything else becomes an expression (a quoted string).
///
/// ```
/// use kern::file::edit::entry_value;
/// assert_eq!(entry_value("300").unwrap().to_string(), "300");
/// assert_eq!(entry_value("12.5").unwrap().to_string(), "12.5");
/// assert_eq!(entry_value(" 2*tf ").unwrap().to_string(), "\"2*tf\"");
/// assert!(entry_value("").is_err());
/// ```
pub fn entry_value(entry: &str) -> Result<Value, String> {
    let t = entry.trim();
    if t.is_empty() {
        return Err("type a number or an expression".into());
    }
    if let Ok(i) = t.parse::<i64>() {
        return Ok(Value::from(i));
    }
    let looks_numeric = t
        .chars()
        .all(|c| c.is_ascii_digit() || matches!(c, '.' | 'e' | 'E' | '+' | '-'));
    match t.parse::<f64>() {
        Ok(x) if looks_numeric && x.is_finite() => Ok(Value::from(x)),
        Ok(_) if looks_numeric => Err(format!("`{t}` is not a finite number")),
        _ => Ok(Value::from(t)),
    }
}

/// A computed number as a file value: rounded to 6 significant figures, written as an
/// integer when whole.
///
/// ```
/// use kern::file::edit::number_value;
/// assert_eq!(number_value(315.0000000001).to_string(), "315");
/// assert_eq!(number_value(16.8).to_string(), "16.8");
/// ```
pub fn number_value(x: f64) -> Value {
    let r = round_sig(x, 6);
    if r.fract() == 0.0 && r.abs() < 1e15 {
        Value::from(r as i64)
    } else {
        Value::from(r)
    }
}

/// `x` rounded to `n` significant figures.
pub fn round_sig(x: f64, n: i32) -> f64 {
    if x == 0.0 || !x.is_finite() {
        return x;
    }
    let p = n - 1 - x.abs().log10().floor() as i32;
    let k = 10f64.powi(p);
    let r = (x * k).round() / k;
    if r.is_finite() {
        r
    } else {
        x
    }
}

/// Puts `new` where `item` was, keeping the spacing and comment around the old value.
fn replace(item: &mut Item, mut new: Value) {
    match item {
        Item::Value(v) => {
            *new.decor_mut() = v.decor().clone();
            *v = new;
        }
        other => *other = Item::Value(new),
    }
}

/// Sets `key` of a table-like to `new`, keeping decor if it is there, appending if not.
fn set_key(t: &mut dyn TableLike, key: &str, new: Value) {
    match t.get_mut(key) {
        Some(item) => replace(item, new),
        None => {
            t.insert(key, Item::Value(new));
        }
    }
}

fn part_mut(doc: &mut DocumentMut, i: usize) -> Result<&mut dyn TableLike, String> {
    entry_mut(doc, "parts", i, &|| format!("there is no part {}", i + 1))
}

/// Entry `i` of the array of tables `key` (`[[key]]`, or an array of inline tables);
/// `missing` says what is not there.
fn entry_mut<'a>(
    doc: &'a mut DocumentMut,
    key: &str,
    i: usize,
    missing: &dyn Fn() -> String,
) -> Result<&'a mut dyn TableLike, String> {
    match doc.get_mut(key).ok_or_else(missing)? {
        Item::ArrayOfTables(a) => a
            .get_mut(i)
            .map(|t| t as &mut dyn TableLike)
            .ok_or_else(missing),
        Item::Value(Value::Array(a)) => a
            .get_mut(i)
            .and_then(Value::as_inline_table_mut)
            .map(|t| t as &mut dyn TableLike)
            .ok_or_else(missing),
        _ => Err(missing()),
    }
}

/// Sets a number-valued slot of part `i` to a value.
fn set_part_number(doc: &mut DocumentMut, i: usize, slot: &Slot, v: Value) -> Result<(), String> {
    let t = part_mut(doc, i)?;
    match slot {
        Slot::Key(k) => set_key(t, k, v),
        Slot::At(c) => {
            let c = (*c).min(1);
            match t.get_mut("at").and_then(Item::as_array_mut) {
                Some(arr) if arr.len() == 2 => {
                    arr.replace(c, v);
                }
                _ => {
                    let mut pair = [Value::from(0), Value::from(0)];
                    pair[c] = v;
                    set_key(t, "at", Value::Array(Array::from_iter(pair)));
                }
            }
        }
    }
    Ok(())
}

/// Sets a text key of part `i` (`name`, `material`); an empty text removes the key.
fn set_part_text(doc: &mut DocumentMut, i: usize, key: &str, value: &str) -> Result<(), String> {
    let t = part_mut(doc, i)?;
    if value.is_empty() {
        t.remove(key);
    } else {
        set_key(t, key, Value::from(value));
    }
    Ok(())
}

/// Sets param `name` to a value.
fn set_param(doc: &mut DocumentMut, name: &str, v: Value) -> Result<(), String> {
    let t = doc
        .get_mut("params")
        .and_then(Item::as_table_like_mut)
        .ok_or("the file has no [params] table")?;
    if t.get(name).is_none() {
        return Err(format!("there is no param `{name}`"));
    }
    set_key(t, name, v);
    Ok(())
}

/// What the user typed for a key: text keys ([`TEXT_KEYS`]) as written, `true` and
/// `false` as booleans, a `[` or `{` as a TOML array or inline table (a point-load
/// list), anything else as a number cell takes it ([`entry_value`]).
///
/// ```
/// use kern::file::edit::typed_value;
/// assert_eq!(typed_value("title", "Bay 3 girder").unwrap().to_string(), "\"Bay 3 girder\"");
/// assert_eq!(typed_value("self_weight", "true").unwrap().to_string(), "true");
/// assert_eq!(typed_value("fy", "355 MPa").unwrap().to_string(), "\"355 MPa\"");
/// assert_eq!(typed_value("deflection_limit", "360").unwrap().to_string(), "360");
/// assert!(typed_value("point", "[{ P = \"30 kN\", a = \"2 m\" }]").unwrap().is_array());
/// ```
pub fn typed_value(key: &str, entry: &str) -> Result<Value, String> {
    let t = entry.trim();
    if TEXT_KEYS.contains(&key) {
        if t.is_empty() {
            return Err(format!("type the text of `{key}`"));
        }
        return Ok(Value::from(t));
    }
    match t {
        "true" => Ok(Value::from(true)),
        "false" => Ok(Value::from(false)),
        _ if t.starts_with(['[', '{']) => toml_value(t, "e.g. [{ P = \"30 kN\", a = \"2 m\" }]"),
        _ => entry_value(t),
    }
}

/// A typed TOML array or inline table as a value; a syntax error names the column of
/// the entry, and `example` shows what to type.
fn toml_value(entry: &str, example: &str) -> Result<Value, String> {
    const LEAD: &str = "v = ";
    let src = format!("{LEAD}{}", entry.trim());
    let doc = src.parse::<DocumentMut>().map_err(|e| {
        let col = e.span().map_or(1, |s| {
            src.get(..s.start)
                .map_or(0, |b| b.chars().count())
                .saturating_sub(LEAD.len())
                + 1
        });
        let why: Vec<&str> = e.message().lines().map(str::trim).collect();
        format!("column {col}: {}; {example}", why.join("; "))
    })?;
    match doc.get("v").and_then(Item::as_value) {
        Some(v) if doc.len() == 1 => Ok(v.clone()),
        _ => Err(format!("type one value, {example}")),
    }
}

/// A table of the file (not a part) to change; `make` creates a missing `[params]`,
/// `[actions]` or `[member]`.
fn table_mut(
    doc: &mut DocumentMut,
    table: Place,
    make: bool,
) -> Result<&mut dyn TableLike, String> {
    let missing = || format!("the file has no {}", table.label());
    let Some(key) = table.key() else {
        return Ok(doc.as_table_mut());
    };
    if let Place::Material(i) = table {
        return entry_mut(doc, key, i, &missing);
    }
    if doc.get(key).is_none() {
        if !make {
            return Err(missing());
        }
        insert_before_parts(doc, key, Item::Table(Table::new()));
    }
    doc.get_mut(key)
        .and_then(Item::as_table_like_mut)
        .ok_or_else(missing)
}

/// Puts a new top-level table `key` into the document ahead of the parts (after them
/// for `[actions]` and `[member]`, which files write last), keeping every other entry
/// where it is.
fn insert_before_parts(doc: &mut DocumentMut, key: &str, item: Item) {
    let root = doc.as_table_mut();
    let ahead = matches!(key, "params" | "materials") && root.contains_key("parts");
    if !ahead {
        root.insert(key, item);
        return;
    }
    let entries: Vec<(Key, Item)> = root
        .iter()
        .filter_map(|(k, _)| root.get_key_value(k))
        .map(|(k, v)| (k.clone(), v.clone()))
        .collect();
    root.clear();
    let mut item = Some(item);
    for (k, v) in entries {
        if k.get() == "parts" {
            if let Some(new) = item.take() {
                root.insert(key, new);
            }
        }
        root.entry_format(&k).or_insert(v);
    }
}

fn params_mut(doc: &mut DocumentMut) -> Result<&mut dyn TableLike, String> {
    doc.get_mut("params")
        .and_then(Item::as_table_like_mut)
        .ok_or_else(|| "the file has no [params] table".to_string())
}

fn add_param(doc: &mut DocumentMut, name: &str, v: Value) -> Result<(), String> {
    let name = name.trim();
    if name.is_empty() {
        return Err("type a name for the param, e.g. tw = 8".into());
    }
    let t = table_mut(doc, Place::Params, true)?;
    if t.contains_key(name) {
        return Err(format!("there is a param `{name}` already"));
    }
    t.insert(name, Item::Value(v));
    Ok(())
}

/// Renames param `from` to `to` in `[params]` (its value, comment and place kept) and
/// in every expression of the file that uses it.
fn rename_param(doc: &mut DocumentMut, from: &str, to: &str) -> Result<(), String> {
    let to = to.trim();
    if to.is_empty() {
        return Err("type the new name".into());
    }
    let t = params_mut(doc)?;
    if !t.contains_key(from) {
        return Err(format!("there is no param `{from}`"));
    }
    if from == to {
        return Ok(());
    }
    if t.contains_key(to) {
        return Err(format!("there is a param `{to}` already"));
    }
    let entries: Vec<(Key, Item)> = t
        .iter()
        .filter_map(|(k, _)| t.get_key_value(k))
        .map(|(k, v)| (k.clone(), v.clone()))
        .collect();
    t.clear();
    for (k, v) in entries {
        let k = if k.get() == from {
            Key::new(to)
                .with_leaf_decor(k.leaf_decor().clone())
                .with_dotted_decor(k.dotted_decor().clone())
        } else {
            k
        };
        t.entry_format(&k).or_insert(v);
    }
    each_expression(doc, &mut |_, v| {
        if let Some(new) = v
            .as_str()
            .and_then(|s| crate::model::expr::rename(s, from, to))
        {
            let decor = v.decor().clone();
            *v = Value::from(new);
            *v.decor_mut() = decor;
        }
    });
    Ok(())
}

/// Removes param `name`, unless an expression uses it.
fn remove_param(doc: &mut DocumentMut, name: &str) -> Result<(), String> {
    let users = uses(doc, name);
    if !users.is_empty() {
        return Err(format!(
            "`{name}` is used by {}; change those first (or rename the param)",
            users.join(", ")
        ));
    }
    match params_mut(doc)?.remove(name) {
        Some(_) => Ok(()),
        None => Err(format!("there is no param `{name}`")),
    }
}

/// Where the file's expressions use `name`: `params.d`, `part 2 b`, `member.span`…
pub fn uses(doc: &mut DocumentMut, name: &str) -> Vec<String> {
    let mut found = Vec::new();
    each_expression(doc, &mut |place, v| {
        let used = v
            .as_str()
            .and_then(|s| crate::model::expr::Expr::parse(s).ok())
            .is_some_and(|e| e.names().iter().any(|n| n == name));
        if used && !found.contains(&place.to_string()) {
            found.push(place.to_string());
        }
    });
    found
}

/// Calls `f` with every string value of the file that may be an expression (not the
/// [`TEXT_KEYS`]), in arrays and inline tables too, and the place it stands in words.
fn each_expression(doc: &mut DocumentMut, f: &mut dyn FnMut(&str, &mut Value)) {
    fn walk(place: &str, v: &mut Value, f: &mut dyn FnMut(&str, &mut Value)) {
        match v {
            Value::Array(a) => a.iter_mut().for_each(|x| walk(place, x, f)),
            Value::InlineTable(t) => {
                for (k, x) in t.iter_mut() {
                    if !TEXT_KEYS.contains(&k.get()) {
                        walk(place, x, f);
                    }
                }
            }
            Value::String(_) => f(place, v),
            _ => {}
        }
    }
    fn table(prefix: &str, t: &mut dyn TableLike, f: &mut dyn FnMut(&str, &mut Value)) {
        for (k, item) in t.iter_mut() {
            if TEXT_KEYS.contains(&k.get()) {
                continue;
            }
            let place = format!("{prefix}{}", k.get());
            match item {
                Item::Value(v) => walk(&place, v, f),
                Item::Table(t) => table(&format!("{place}."), t, f),
                _ => {}
            }
        }
    }
    for (k, item) in doc.as_table_mut().iter_mut() {
        let key = k.get().to_string();
        match item {
            Item::Value(Value::Array(a)) if key == "parts" || key == "materials" => {
                for (i, x) in a.iter_mut().enumerate() {
                    walk(&format!("{} {}", singular(&key), i + 1), x, f);
                }
            }
            Item::ArrayOfTables(a) => {
                for (i, t) in a.iter_mut().enumerate() {
                    table(&format!("{} {} ", singular(&key), i + 1), t, f);
                }
            }
            Item::Table(t) => table(&format!("{key}."), t, f),
            Item::Value(v) if !TEXT_KEYS.contains(&key.as_str()) => walk(&key, v, f),
            _ => {}
        }
    }
}

fn singular(key: &str) -> &str {
    key.strip_suffix('s').unwrap_or(key)
}

/// Appends a `[[materials]]` entry with `keys` (ahead of the parts when it is the first).
fn add_material(doc: &mut DocumentMut, keys: &[(String, String)]) -> Result<(), String> {
    let mut t = Table::new();
    for (k, entry) in keys {
        let k = k.trim();
        if k.is_empty() {
            return Err("a key has no name; type e.g. name = timber, E = 11 GPa".into());
        }
        t.insert(k, Item::Value(typed_value(k, entry)?));
    }
    match doc.get_mut("materials") {
        None => {
            let mut a = ArrayOfTables::new();
            a.push(t);
            insert_before_parts(doc, "materials", Item::ArrayOfTables(a));
            Ok(())
        }
        Some(Item::ArrayOfTables(a)) => {
            let at = a.iter().filter_map(Table::position).max();
            if let Some(p) = at {
                t.set_position(p);
            }
            a.push(t);
            Ok(())
        }
        Some(_) => Err("the materials are written as an inline array; write them as [[materials]] tables to add one".into()),
    }
}

/// Removes `[actions]`, `[member]` or one material.
fn remove_table(doc: &mut DocumentMut, table: Place) -> Result<(), String> {
    let missing = || format!("the file has no {}", table.label());
    match table {
        Place::Top | Place::Params => Err(format!(
            "{} is not removed as a whole; remove its keys one by one",
            table.label()
        )),
        Place::Actions | Place::Member => match table.key().and_then(|k| doc.remove(k)) {
            Some(_) => Ok(()),
            None => Err(missing()),
        },
        Place::Material(i) => {
            let n = match doc.get_mut("materials").ok_or_else(missing)? {
                Item::ArrayOfTables(a) if i < a.len() => {
                    a.remove(i);
                    a.len()
                }
                Item::Value(Value::Array(a)) if i < a.len() => {
                    a.remove(i);
                    a.len()
                }
                _ => return Err(missing()),
            };
            if n == 0 {
                doc.remove("materials");
            }
            Ok(())
        }
    }
}

/// Rebuilds the `[[parts]]` array from `f` applied to its tables, keeping each slot's
/// place among the file's other tables (a table's place is its document position).
/// Inline arrays of parts are refused.
fn with_parts(
    doc: &mut DocumentMut,
    f: impl FnOnce(&mut Vec<Table>) -> Result<(), String>,
) -> Result<(), String> {
    let mut tables: Vec<Table> = match doc.get("parts") {
        None => Vec::new(),
        Some(Item::ArrayOfTables(a)) => a.iter().cloned().collect(),
        Some(_) => return Err("the parts are written as an inline array; write them as [[parts]] tables to add, copy, delete or move parts".into()),
    };
    f(&mut tables)?;
    let aot = doc
        .entry("parts")
        .or_insert(Item::ArrayOfTables(ArrayOfTables::new()))
        .as_array_of_tables_mut()
        .ok_or("the parts are not [[parts]] tables")?;
    let positions: Vec<usize> = aot.iter().filter_map(Table::position).collect();
    aot.clear();
    for (k, mut t) in tables.into_iter().enumerate() {
        if let Some(&p) = positions.get(k).or(positions.last()) {
            t.set_position(p);
        }
        aot.push(t);
    }
    Ok(())
}

fn sized(mm: f64, unit: LengthUnit) -> Value {
    number_value(round_sig(mm * 0.001 / unit.metres(), 3))
}

/// The keys a new part of `shape` is written with, after `name` and `shape`: its
/// required dimensions at the sizes of its spec (converted to `unit`), and a polygon's
/// corners from its spec.
fn default_keys(shape: ShapeKind, unit: LengthUnit) -> Vec<(&'static str, Value)> {
    let spec = shape.spec();
    let mut keys: Vec<(&str, Value)> = spec
        .keys
        .iter()
        .filter(|k| k.default.is_none())
        .map(|k| (k.key, sized(k.new_mm, unit)))
        .collect();
    if spec.points {
        let pts = spec
            .new_points_mm
            .iter()
            .map(|p| Value::Array(Array::from_iter(p.iter().map(|&c| sized(c, unit)))));
        keys.push(("points", Value::Array(Array::from_iter(pts))));
    }
    keys
}

/// Appends a part of `shape` with default sizes (converted to `unit`), named
/// `name`, placed at the origin.
fn add_part(
    doc: &mut DocumentMut,
    shape: ShapeKind,
    name: &str,
    unit: LengthUnit,
) -> Result<(), String> {
    let keys = default_keys(shape, unit);
    with_parts(doc, |tables| {
        let mut t = Table::new();
        t.insert("name", Item::Value(Value::from(name)));
        t.insert("shape", Item::Value(Value::from(shape.as_str())));
        for (k, v) in keys {
            t.insert(k, Item::Value(v));
        }
        tables.push(t);
        Ok(())
    })
}

/// Changes part `i` to `shape`. What places the part stays as written — `name`, `at`,
/// `anchor`, `rotate`, the flips, `void`, `hole`, `enabled`, `material` — and so do the
/// dimension keys the new shape shares (with their comments); the keys it does not have
/// go, and its missing required dimensions come in at the default sizes of a new part
/// (converted to `unit`). The dimensions stand where the old ones stood (right after
/// `shape` if there were none), in the new shape's order. An anchor left to its default
/// is written out when the two shapes' defaults differ, so the part stays where it was.
fn change_shape(
    doc: &mut DocumentMut,
    i: usize,
    shape: ShapeKind,
    unit: LengthUnit,
) -> Result<(), String> {
    let spec = shape.spec();
    let defaults = default_keys(shape, unit);
    let t = part_mut(doc, i)?;
    let old = t
        .get("shape")
        .and_then(Item::as_str)
        .and_then(ShapeKind::parse);
    let entries: Vec<(Key, Item)> = t
        .iter()
        .filter_map(|(k, _)| t.get_key_value(k))
        .map(|(k, v)| (k.clone(), v.clone()))
        .collect();
    let wanted = spec
        .keys
        .iter()
        .map(|k| k.key)
        .chain(spec.points.then_some("points"));
    let mut block: Vec<(Key, Item)> = Vec::new();
    for k in wanted {
        match entries.iter().find(|(e, _)| e.get() == k) {
            Some(kept) => block.push(kept.clone()),
            None => {
                if let Some((_, v)) = defaults.iter().find(|d| d.0 == k) {
                    block.push((Key::new(k), Item::Value(v.clone())));
                }
            }
        }
    }
    let had_dims = entries.iter().any(|(k, _)| is_shape_key(k.get()));
    let mut block = Some(block);
    let mut out: Vec<(Key, Item)> = Vec::new();
    for (k, item) in entries {
        let (shape_key, dim) = (k.get() == "shape", is_shape_key(k.get()));
        if !dim {
            out.push((k, item));
        }
        if (dim || (shape_key && !had_dims)) && block.is_some() {
            out.extend(block.take().unwrap_or_default());
        }
    }
    out.extend(block.unwrap_or_default());
    t.clear();
    for (k, item) in out {
        t.entry_format(&k).or_insert(item);
    }
    set_key(t, "shape", Value::from(shape.as_str()));
    let was = old.map_or(Anchor::Center, ShapeKind::default_anchor);
    if t.get("anchor").is_none() && was != shape.default_anchor() {
        t.insert("anchor", Item::Value(Value::from(was.name())));
    }
    Ok(())
}

/// A typed point list as a TOML value; a syntax error names the column of the entry.
fn points_value(entry: &str) -> Result<Value, String> {
    const HOW: &str =
        "type a list of [x, y] pairs, expressions in quotes, e.g. [[0, 0], [\"b\", 0], [0, \"h\"]]";
    match toml_value(entry, HOW)? {
        v @ Value::Array(_) => Ok(v),
        _ => Err(HOW.to_string()),
    }
}

/// Points as the user would type them: `[[0, 0], [200, "t"]]`.
///
/// ```
/// use kern::file::edit::points_entry;
/// use kern::model::{Val, Value};
/// let v = |x: Value| Val { value: x, span: 0..0 };
/// let pts = [[v(Value::Number(0.0)), v(Value::Expr("t".into()))]];
/// assert_eq!(points_entry(&pts), "[[0, \"t\"]]");
/// ```
pub fn points_entry(points: &[[Val; 2]]) -> String {
    let one = |v: &Val| match &v.value {
        crate::model::Value::Number(x) if x.fract() == 0.0 && x.abs() < 1e15 => {
            format!("{}", *x as i64)
        }
        crate::model::Value::Number(x) => Value::from(*x).to_string(),
        crate::model::Value::Expr(e) => Value::from(e.as_str()).to_string(),
    };
    let pairs: Vec<String> = points
        .iter()
        .map(|[x, y]| format!("[{}, {}]", one(x), one(y)))
        .collect();
    format!("[{}]", pairs.join(", "))
}

#[cfg(test)]
mod tests {
    use super::*;

    const SRC: &str = "# a comment\nformat = 1\nunits = \"mm\"\n\n[params]\nbf = 250   # flange\n\n[[parts]]\nname = \"a\"\nshape = \"rect\"\nb = \"bf\"\nh = 10\n\n# second part\n[[parts]]\nname = \"b\"\nshape = \"rect\"\nb = 10\nh = 100\nat = [0, -55]\n\n[actions]\nMx = \"1 kN*m\"\n";

    fn changed_lines(a: &str, b: &str) -> usize {
        let (la, lb): (Vec<_>, Vec<_>) = (a.lines().collect(), b.lines().collect());
        assert_eq!(la.len(), lb.len());
        la.iter().zip(&lb).filter(|(x, y)| x != y).count()
    }

    fn edit(text: &str, e: Edit) -> Result<String, String> {
        e.apply_to_text(text)
    }

    fn key(k: &str) -> Slot {
        Slot::Key(k.into())
    }

    #[test]
    fn one_value_edit_is_one_line() {
        let t = edit(
            SRC,
            Edit::SetValue {
                part: 1,
                slot: key("h"),
                entry: "120".into(),
            },
        )
        .unwrap();
        assert_eq!(changed_lines(SRC, &t), 1);
        assert!(t.contains("h = 120\nat"));
        let t = edit(
            SRC,
            Edit::SetParam {
                name: "bf".into(),
                entry: "300".into(),
            },
        )
        .unwrap();
        assert_eq!(changed_lines(SRC, &t), 1);
        assert!(t.contains("bf = 300   # flange"));
        let t = edit(
            SRC,
            Edit::SetValue {
                part: 1,
                slot: Slot::At(1),
                entry: "hw/2".into(),
            },
        )
        .unwrap();
        assert_eq!(changed_lines(SRC, &t), 1);
        assert!(t.contains("at = [0, \"hw/2\"]"));
        let t = edit(
            SRC,
            Edit::Toggle {
                part: 0,
                flag: Flag::Void,
            },
        )
        .unwrap();
        assert!(t.contains("h = 10\nvoid = true\n"));
    }

    #[test]
    fn structure_edits_keep_comments_and_other_tables() {
        let t = edit(
            SRC,
            Edit::AddPart {
                shape: ShapeKind::Pipe,
                name: "new pipe".into(),
                unit: LengthUnit::Mm,
            },
        )
        .unwrap();
        assert!(t.contains("at = [0, -55]\n\n[[parts]]\nname = \"new pipe\"\nshape = \"pipe\"\nd = 100\nt = 5\n\n[actions]"));
        let t = edit(
            SRC,
            Edit::AddPart {
                shape: ShapeKind::Rect,
                name: "r".into(),
                unit: LengthUnit::In,
            },
        )
        .unwrap();
        assert!(t.contains("b = 3.94\nh = 1.97"));
        let t = edit(
            SRC,
            Edit::MovePart {
                part: 0,
                down: true,
            },
        )
        .unwrap();
        let (pa, pb) = (
            t.find("name = \"a\"").unwrap(),
            t.find("name = \"b\"").unwrap(),
        );
        assert!(pb < pa && t.starts_with("# a comment") && t.contains("# second part"));
        assert!(t.trim_end().ends_with("Mx = \"1 kN*m\""));
        let t = edit(SRC, Edit::DeletePart { part: 0 }).unwrap();
        assert!(!t.contains("name = \"a\"") && t.contains("[actions]"));
        let t = edit(SRC, Edit::CopyPart { part: 0 }).unwrap();
        assert_eq!(t.matches("name = \"a\"").count(), 2);
        assert!(edit(
            SRC,
            Edit::MovePart {
                part: 1,
                down: true
            }
        )
        .is_err());
    }

    fn shape(part: usize, shape: ShapeKind) -> Edit {
        Edit::SetShape {
            part,
            shape,
            unit: LengthUnit::Mm,
        }
    }

    fn points(entry: &str) -> Edit {
        Edit::SetPoints {
            part: 0,
            entry: entry.into(),
        }
    }

    #[test]
    fn changing_the_shape_keeps_placement_and_shared_sizes() {
        let src = "format = 1\nunits = \"mm\"\n\n[[parts]]\nname = \"a\"\nshape = \"rect\"\nb = 10   # wide\nh = 100\nat = [0, -55]\nrotate = 30\nflip_x = true\nvoid = false\n";
        let t = edit(src, shape(0, ShapeKind::IBeam)).unwrap();
        assert!(
            t.contains("shape = \"ibeam\"\nd = 300\nb = 10   # wide\ntf = 10\ntw = 7\nat = [0, -55]\nrotate = 30\nflip_x = true\nvoid = false\n"),
            "{t}"
        );
        assert!(!t.contains("h = 100") && !t.contains("anchor"));
        // To a polygon: the dimensions go, default corners come, and the anchor that
        // was the default (center) is written out.
        let t = edit(src, shape(0, ShapeKind::Polygon)).unwrap();
        assert!(t.contains("shape = \"polygon\"\npoints = [[0, 0], [100, 0], [0, 100]]\nat"));
        assert!(t.contains("anchor = \"center\"") && !t.contains("b = 10"));
        let back = edit(&t, shape(0, ShapeKind::Rect)).unwrap();
        assert!(back.contains("shape = \"rect\"\nb = 100\nh = 50\nat") && !back.contains("points"));
        assert!(edit(src, shape(3, ShapeKind::Pipe)).is_err());
    }

    #[test]
    fn points_are_typed_as_a_toml_array() {
        let src = "format = 1\nunits = \"mm\"\n[[parts]]\nshape = \"polygon\"\npoints = [[0, 0], [1, 0], [0, 1]]   # corners\nat = [5, 5]\n";
        let t = edit(src, points("[[0, 0], [\"b\", 0], [0, 2.5]]")).unwrap();
        assert_eq!(changed_lines(src, &t), 1);
        assert!(t.contains("points = [[0, 0], [\"b\", 0], [0, 2.5]]   # corners\n"));
        let e = edit(src, points("[[0, 0], [b, 0]]")).unwrap_err();
        assert!(e.starts_with("column 11:"), "{e}");
        assert!(edit(src, points("3")).is_err());
        assert!(edit(src, points("[[0, 0]] x = 1")).is_err());
    }

    #[test]
    fn a_refused_edit_leaves_the_document_as_it_was() {
        let mut doc = open(SRC).unwrap();
        for e in [
            Edit::MovePart {
                part: 1,
                down: true,
            },
            Edit::DeletePart { part: 7 },
            Edit::SetParam {
                name: "nope".into(),
                entry: "1".into(),
            },
            Edit::SetValue {
                part: 9,
                slot: key("b"),
                entry: "1".into(),
            },
            Edit::SetPoints {
                part: 0,
                entry: "[[0, 0], [b, 0]]".into(),
            },
        ] {
            assert!(e.apply(&mut doc).is_err(), "{e:?}");
            assert_eq!(doc.to_string(), SRC);
        }
    }

    #[test]
    fn edits_on_a_kept_document_write_what_edits_on_the_text_write() {
        let edits = [
            Edit::AddPart {
                shape: ShapeKind::Zed,
                name: "z".into(),
                unit: LengthUnit::Mm,
            },
            Edit::SetValue {
                part: 2,
                slot: key("r"),
                entry: "4".into(),
            },
            Edit::MovePart {
                part: 2,
                down: false,
            },
            Edit::Toggle {
                part: 1,
                flag: Flag::FlipX,
            },
            Edit::CopyPart { part: 0 },
            Edit::SetShape {
                part: 0,
                shape: ShapeKind::Polygon,
                unit: LengthUnit::Mm,
            },
            Edit::DeletePart { part: 3 },
            Edit::SetParamNumber {
                name: "bf".into(),
                value: 262.5,
            },
        ];
        let mut doc = open(SRC).unwrap();
        let mut text = SRC.to_string();
        for e in &edits {
            e.apply(&mut doc).unwrap();
            text = e.apply_to_text(&text).unwrap();
            assert_eq!(doc.to_string(), text, "after {e:?}");
        }
        assert!(
            text.contains("shape = \"zed\"\nd = 200\nb = 75\ntf = 8\ntw = 6\nr = 4\n"),
            "{text}"
        );
    }

    #[test]
    fn params_are_added_renamed_with_their_uses_and_removed_only_when_unused() {
        let t = edit(
            SRC,
            Edit::RenameParam {
                from: "bf".into(),
                to: "b_top".into(),
            },
        )
        .unwrap();
        assert_eq!(changed_lines(SRC, &t), 2);
        assert!(t.contains("b_top = 250   # flange\n") && t.contains("b = \"b_top\"\n"));
        let e = edit(SRC, Edit::RemoveParam { name: "bf".into() }).unwrap_err();
        assert!(e.contains("`bf` is used by part 1 b"), "{e}");
        let t = edit(
            SRC,
            Edit::AddParam {
                name: "tw".into(),
                entry: "8".into(),
            },
        )
        .unwrap();
        assert!(t.contains("bf = 250   # flange\ntw = 8\n"), "{t}");
        let t = edit(&t, Edit::RemoveParam { name: "tw".into() }).unwrap();
        assert_eq!(t, SRC);
        assert!(edit(
            SRC,
            Edit::RenameParam {
                from: "bf".into(),
                to: "bf".into()
            }
        )
        .is_ok());
        // A file without params gets the table ahead of its parts.
        let bare = "format = 1\nunits = \"mm\"\n\n[[parts]]\nshape = \"rect\"\nb = 1\nh = 1\n";
        let t = edit(
            bare,
            Edit::AddParam {
                name: "t".into(),
                entry: "2*3".into(),
            },
        )
        .unwrap();
        let (pp, pa) = (t.find("[params]").unwrap(), t.find("[[parts]]").unwrap());
        assert!(pp < pa && t.contains("t = \"2*3\""), "{t}");
    }

    #[test]
    fn every_other_key_is_set_added_and_removed_in_place() {
        let set = |table, key: &str, entry: &str| Edit::SetKey {
            table,
            key: key.into(),
            entry: entry.into(),
        };
        let t = edit(SRC, set(Place::Top, "title", "Bay 3")).unwrap();
        assert!(t.starts_with("# a comment\nformat = 1\nunits = \"mm\"\ntitle = \"Bay 3\"\n"));
        let t = edit(SRC, set(Place::Actions, "Mx", "2 kN*m")).unwrap();
        assert_eq!(changed_lines(SRC, &t), 1);
        let t = edit(SRC, set(Place::Member, "span", "6 m")).unwrap();
        assert!(t.trim_end().ends_with("[member]\nspan = \"6 m\""), "{t}");
        let t = edit(
            SRC,
            Edit::RemoveKey {
                table: Place::Actions,
                key: "Mx".into(),
            },
        )
        .unwrap();
        assert!(!t.contains("Mx"));
        let t = edit(
            SRC,
            Edit::AddMaterial {
                keys: vec![
                    ("name".into(), "timber".into()),
                    ("E".into(), "11 GPa".into()),
                ],
            },
        )
        .unwrap();
        let (pm, pa) = (
            t.find("[[materials]]").unwrap(),
            t.find("[[parts]]").unwrap(),
        );
        assert!(
            pm < pa && t.contains("name = \"timber\"\nE = \"11 GPa\"\n"),
            "{t}"
        );
        let t = edit(&t, set(Place::Material(0), "fy", "24 MPa")).unwrap();
        assert!(t.contains("E = \"11 GPa\"\nfy = \"24 MPa\"\n"));
        let t = edit(
            &t,
            Edit::RemoveTable {
                table: Place::Material(0),
            },
        )
        .unwrap();
        assert_eq!(t, SRC);
        let t = edit(
            SRC,
            Edit::RemoveTable {
                table: Place::Actions,
            },
        )
        .unwrap();
        assert!(!t.contains("[actions]"));
        assert!(edit(
            SRC,
            Edit::RemoveTable {
                table: Place::Member
            }
        )
        .is_err());
    }
}
