//! Editing a section file in place: every operation takes the file text and returns
//! new text in which only what was asked for changed — comments, key order, spacing
//! and untouched lines stay as written (a one-value edit is a one-line diff).
//!
//! The operations do not check that the result is a valid section; the caller
//! re-reads the text (`Analysis::of_text`) and refuses an edit that does not compute.
//! What lives elsewhere: reading with spans is [`super::read`], saving is [`super::save`].

use crate::geom::shapes::SHAPES;
use crate::geom::Anchor;
use crate::model::units::LengthUnit;
use crate::model::Val;
use toml_edit::{Array, ArrayOfTables, DocumentMut, Item, Key, Table, TableLike, Value};

/// A number-valued place in a part: a named key (`b`, `tf`, `rotate`…) or one
/// coordinate of `at` (0 for x, 1 for y).
#[derive(Debug, Clone, PartialEq, Eq)]
pub enum Slot {
    Key(String),
    At(usize),
}

/// Default sizes in millimetres for a newly added part of each shape (common practice:
/// round sizes of the order of a rolled section); converted to the file's unit.
const DEFAULT_MM: &[(&str, &[(&str, f64)])] = &[
    ("rect", &[("b", 100.0), ("h", 50.0)]),
    ("triangle", &[("b", 100.0), ("h", 100.0)]),
    ("circle", &[("d", 100.0)]),
    ("half_circle", &[("d", 100.0)]),
    ("quarter_circle", &[("r", 50.0)]),
    ("polygon", &[]),
    (
        "ibeam",
        &[("d", 300.0), ("b", 150.0), ("tf", 10.0), ("tw", 7.0)],
    ),
    (
        "channel",
        &[("d", 200.0), ("b", 75.0), ("tf", 10.0), ("tw", 6.0)],
    ),
    ("angle", &[("h", 100.0), ("b", 100.0), ("t", 10.0)]),
    (
        "tee",
        &[("d", 150.0), ("b", 150.0), ("tf", 10.0), ("tw", 8.0)],
    ),
    ("box", &[("h", 200.0), ("b", 100.0), ("t", 8.0)]),
    ("pipe", &[("d", 100.0), ("t", 5.0)]),
];

/// The corners of a new polygon part, in millimetres (a right triangle).
const DEFAULT_POLYGON_MM: [[f64; 2]; 3] = [[0.0, 0.0], [100.0, 0.0], [0.0, 100.0]];

fn open(text: &str) -> Result<DocumentMut, String> {
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
    let missing = || format!("there is no part {}", i + 1);
    match doc.get_mut("parts").ok_or_else(missing)? {
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

/// Sets a number-valued slot of part `i` (0-based) to what the user typed.
pub fn set_part_value(text: &str, i: usize, slot: &Slot, entry: &str) -> Result<String, String> {
    set_part_number(text, i, slot, entry_value(entry)?)
}

/// Sets a number-valued slot of part `i` to a value.
pub fn set_part_number(text: &str, i: usize, slot: &Slot, v: Value) -> Result<String, String> {
    let mut doc = open(text)?;
    let t = part_mut(&mut doc, i)?;
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
    Ok(doc.to_string())
}

/// Sets a text key of part `i` (`name`, `material`); an empty text removes the key.
pub fn set_part_text(text: &str, i: usize, key: &str, value: &str) -> Result<String, String> {
    let mut doc = open(text)?;
    let t = part_mut(&mut doc, i)?;
    if value.is_empty() {
        t.remove(key);
    } else {
        set_key(t, key, Value::from(value));
    }
    Ok(doc.to_string())
}

/// Flips a true/false key of part `i`; `default` is its value when not written.
pub fn toggle_part_flag(text: &str, i: usize, key: &str, default: bool) -> Result<String, String> {
    let mut doc = open(text)?;
    let t = part_mut(&mut doc, i)?;
    let now = t.get(key).and_then(Item::as_bool).unwrap_or(default);
    set_key(t, key, Value::from(!now));
    Ok(doc.to_string())
}

/// Sets param `name` to what the user typed.
pub fn set_param(text: &str, name: &str, entry: &str) -> Result<String, String> {
    set_param_value(text, name, entry_value(entry)?)
}

/// Sets param `name` to a value.
pub fn set_param_value(text: &str, name: &str, v: Value) -> Result<String, String> {
    let mut doc = open(text)?;
    let t = doc
        .get_mut("params")
        .and_then(Item::as_table_like_mut)
        .ok_or("the file has no [params] table")?;
    if t.get(name).is_none() {
        return Err(format!("there is no param `{name}`"));
    }
    set_key(t, name, v);
    Ok(doc.to_string())
}

/// The `[[parts]]` tables, for operations that reorder them; inline arrays are refused.
fn parts_tables(doc: &mut DocumentMut) -> Result<&mut ArrayOfTables, String> {
    if doc.get("parts").is_none() {
        doc.insert("parts", Item::ArrayOfTables(ArrayOfTables::new()));
    }
    doc.get_mut("parts")
        .and_then(Item::as_array_of_tables_mut)
        .ok_or_else(|| {
            "the parts are written as an inline array; write them as [[parts]] tables to add, copy, delete or move parts".into()
        })
}

/// Rebuilds the `[[parts]]` array from `f` applied to its tables, keeping each slot's
/// place among the file's other tables (a table's place is its document position).
fn with_parts(
    text: &str,
    f: impl FnOnce(&mut Vec<Table>) -> Result<(), String>,
) -> Result<String, String> {
    let mut doc = open(text)?;
    let aot = parts_tables(&mut doc)?;
    let positions: Vec<usize> = aot.iter().filter_map(Table::position).collect();
    let mut tables: Vec<Table> = aot.iter().cloned().collect();
    f(&mut tables)?;
    aot.clear();
    for (k, mut t) in tables.into_iter().enumerate() {
        if let Some(&p) = positions.get(k).or(positions.last()) {
            t.set_position(p);
        }
        aot.push(t);
    }
    Ok(doc.to_string())
}

fn sized(mm: f64, unit: LengthUnit) -> Value {
    number_value(round_sig(mm * 0.001 / unit.metres(), 3))
}

/// The keys a new part of `shape` is written with, after `name` and `shape`: its
/// required dimensions at their default sizes (converted to `unit`), and a polygon's
/// default corners.
fn default_keys(shape: &str, unit: LengthUnit) -> Result<Vec<(&'static str, Value)>, String> {
    let dims = DEFAULT_MM
        .iter()
        .find(|(s, _)| *s == shape)
        .map(|(_, d)| *d)
        .ok_or_else(|| format!("unknown shape `{shape}`"))?;
    let mut keys: Vec<(&str, Value)> = dims.iter().map(|&(k, mm)| (k, sized(mm, unit))).collect();
    if shape == "polygon" {
        let pts = DEFAULT_POLYGON_MM
            .iter()
            .map(|p| Value::Array(Array::from_iter(p.iter().map(|&c| sized(c, unit)))));
        keys.push(("points", Value::Array(Array::from_iter(pts))));
    }
    Ok(keys)
}

/// Appends a part of `shape` with default sizes (converted to `unit`), named
/// `name`, placed at the origin.
pub fn add_part(text: &str, shape: &str, name: &str, unit: LengthUnit) -> Result<String, String> {
    let keys = default_keys(shape, unit)?;
    with_parts(text, |tables| {
        let mut t = Table::new();
        t.insert("name", Item::Value(Value::from(name)));
        t.insert("shape", Item::Value(Value::from(shape)));
        for (k, v) in keys {
            t.insert(k, Item::Value(v));
        }
        tables.push(t);
        Ok(())
    })
}

/// The keys that describe a shape rather than place it: the dimension keys of every
/// shape, and `points`.
fn is_shape_key(key: &str) -> bool {
    key == "points"
        || SHAPES
            .iter()
            .any(|(_, req, opt)| req.contains(&key) || opt.iter().any(|o| o.0 == key))
}

/// Changes part `i` to `shape`. What places the part stays as written — `name`, `at`,
/// `anchor`, `rotate`, the flips, `void`, `enabled`, `material` — and so do the
/// dimension keys the new shape shares (with their comments); the keys it does not have
/// go, and its missing required dimensions come in at the default sizes of a new part
/// (converted to `unit`). The dimensions stand where the old ones stood (right after
/// `shape` if there were none), in the new shape's order. An anchor left to its default
/// is written out when the two shapes' defaults differ, so the part stays where it was.
pub fn change_shape(text: &str, i: usize, shape: &str, unit: LengthUnit) -> Result<String, String> {
    let (_, req, opt) = SHAPES
        .iter()
        .find(|s| s.0 == shape)
        .ok_or_else(|| format!("unknown shape `{shape}`"))?;
    let defaults = default_keys(shape, unit)?;
    let mut doc = open(text)?;
    let t = part_mut(&mut doc, i)?;
    let old = t
        .get("shape")
        .and_then(Item::as_str)
        .unwrap_or_default()
        .to_string();
    let entries: Vec<(Key, Item)> = t
        .iter()
        .filter_map(|(k, _)| t.get_key_value(k))
        .map(|(k, v)| (k.clone(), v.clone()))
        .collect();
    let wanted = req
        .iter()
        .copied()
        .chain(opt.iter().map(|o| o.0))
        .chain((shape == "polygon").then_some("points"));
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
    set_key(t, "shape", Value::from(shape));
    let (was, will) = (Anchor::default_for(&old), Anchor::default_for(shape));
    if t.get("anchor").is_none() && was != will {
        t.insert("anchor", Item::Value(Value::from(was.name())));
    }
    Ok(doc.to_string())
}

/// Sets the `points` of part `i` to what the user typed: a TOML array of `[x, y]`
/// pairs, each a number or an expression in quotes. The new list stands where the old
/// one stood; the reader then checks the pairs and the polygon.
pub fn set_part_points(text: &str, i: usize, entry: &str) -> Result<String, String> {
    let v = points_value(entry)?;
    let mut doc = open(text)?;
    set_key(part_mut(&mut doc, i)?, "points", v);
    Ok(doc.to_string())
}

/// A typed point list as a TOML value; a syntax error names the column of the entry.
fn points_value(entry: &str) -> Result<Value, String> {
    const LEAD: &str = "points = ";
    const EXAMPLE: &str = "e.g. [[0, 0], [\"b\", 0], [0, \"h\"]]";
    let src = format!("{LEAD}{}", entry.trim());
    let doc = src.parse::<DocumentMut>().map_err(|e| {
        let col = e.span().map_or(1, |s| {
            src.get(..s.start)
                .map_or(0, |b| b.chars().count())
                .saturating_sub(LEAD.len())
                + 1
        });
        let why: Vec<&str> = e.message().lines().map(str::trim).collect();
        format!(
            "column {col}: {}; type a list of [x, y] pairs, expressions in quotes, {EXAMPLE}",
            why.join("; ")
        )
    })?;
    match doc.get("points").and_then(Item::as_value) {
        Some(Value::Array(a)) if doc.len() == 1 => Ok(Value::Array(a.clone())),
        _ => Err(format!("type a list of [x, y] pairs, {EXAMPLE}")),
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

/// Inserts a copy of part `i` right after it.
pub fn duplicate_part(text: &str, i: usize) -> Result<String, String> {
    with_parts(text, |tables| {
        let t = tables
            .get(i)
            .cloned()
            .ok_or_else(|| format!("there is no part {}", i + 1))?;
        tables.insert(i + 1, t);
        Ok(())
    })
}

/// Removes part `i`.
pub fn delete_part(text: &str, i: usize) -> Result<String, String> {
    with_parts(text, |tables| {
        if i >= tables.len() {
            return Err(format!("there is no part {}", i + 1));
        }
        tables.remove(i);
        Ok(())
    })
}

/// Swaps part `i` with the next one (`down`) or the previous one.
pub fn move_part(text: &str, i: usize, down: bool) -> Result<String, String> {
    with_parts(text, |tables| {
        let j = if down { i + 1 } else { i.wrapping_sub(1) };
        if i >= tables.len() || j >= tables.len() {
            return Err("the part is already at that end of the list".into());
        }
        tables.swap(i, j);
        Ok(())
    })
}

/// The shapes a part can be added as, in the order of [`SHAPES`].
pub fn shape_names() -> impl Iterator<Item = &'static str> {
    SHAPES.iter().map(|s| s.0)
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

    #[test]
    fn one_value_edit_is_one_line() {
        let t = set_part_value(SRC, 1, &Slot::Key("h".into()), "120").unwrap();
        assert_eq!(changed_lines(SRC, &t), 1);
        assert!(t.contains("h = 120\nat"));
        let t = set_param(SRC, "bf", "300").unwrap();
        assert_eq!(changed_lines(SRC, &t), 1);
        assert!(t.contains("bf = 300   # flange"));
        let t = set_part_value(SRC, 1, &Slot::At(1), "hw/2").unwrap();
        assert_eq!(changed_lines(SRC, &t), 1);
        assert!(t.contains("at = [0, \"hw/2\"]"));
        let t = toggle_part_flag(SRC, 0, "void", false).unwrap();
        assert!(t.contains("h = 10\nvoid = true\n"));
    }

    #[test]
    fn structure_edits_keep_comments_and_other_tables() {
        let t = add_part(SRC, "pipe", "new pipe", LengthUnit::Mm).unwrap();
        assert!(t.contains("at = [0, -55]\n\n[[parts]]\nname = \"new pipe\"\nshape = \"pipe\"\nd = 100\nt = 5\n\n[actions]"));
        let t = add_part(SRC, "rect", "r", LengthUnit::In).unwrap();
        assert!(t.contains("b = 3.94\nh = 1.97"));
        let t = move_part(SRC, 0, true).unwrap();
        let (pa, pb) = (
            t.find("name = \"a\"").unwrap(),
            t.find("name = \"b\"").unwrap(),
        );
        assert!(pb < pa && t.starts_with("# a comment") && t.contains("# second part"));
        assert!(t.trim_end().ends_with("Mx = \"1 kN*m\""));
        let t = delete_part(SRC, 0).unwrap();
        assert!(!t.contains("name = \"a\"") && t.contains("[actions]"));
        let t = duplicate_part(SRC, 0).unwrap();
        assert_eq!(t.matches("name = \"a\"").count(), 2);
        assert!(move_part(SRC, 1, true).is_err());
    }

    #[test]
    fn changing_the_shape_keeps_placement_and_shared_sizes() {
        let src = "format = 1\nunits = \"mm\"\n\n[[parts]]\nname = \"a\"\nshape = \"rect\"\nb = 10   # wide\nh = 100\nat = [0, -55]\nrotate = 30\nflip_x = true\nvoid = false\n";
        let t = change_shape(src, 0, "ibeam", LengthUnit::Mm).unwrap();
        assert!(
            t.contains("shape = \"ibeam\"\nd = 300\nb = 10   # wide\ntf = 10\ntw = 7\nat = [0, -55]\nrotate = 30\nflip_x = true\nvoid = false\n"),
            "{t}"
        );
        assert!(!t.contains("h = 100") && !t.contains("anchor"));
        // To a polygon: the dimensions go, default corners come, and the anchor that
        // was the default (center) is written out.
        let t = change_shape(src, 0, "polygon", LengthUnit::Mm).unwrap();
        assert!(t.contains("shape = \"polygon\"\npoints = [[0, 0], [100, 0], [0, 100]]\nat"));
        assert!(t.contains("anchor = \"center\"") && !t.contains("b = 10"));
        let back = change_shape(&t, 0, "rect", LengthUnit::Mm).unwrap();
        assert!(back.contains("shape = \"rect\"\nb = 100\nh = 50\nat") && !back.contains("points"));
        assert!(change_shape(src, 0, "hexagon", LengthUnit::Mm).is_err());
        assert!(change_shape(src, 3, "pipe", LengthUnit::Mm).is_err());
    }

    #[test]
    fn points_are_typed_as_a_toml_array() {
        let src = "format = 1\nunits = \"mm\"\n[[parts]]\nshape = \"polygon\"\npoints = [[0, 0], [1, 0], [0, 1]]   # corners\nat = [5, 5]\n";
        let t = set_part_points(src, 0, "[[0, 0], [\"b\", 0], [0, 2.5]]").unwrap();
        assert_eq!(changed_lines(src, &t), 1);
        assert!(t.contains("points = [[0, 0], [\"b\", 0], [0, 2.5]]   # corners\n"));
        let e = set_part_points(src, 0, "[[0, 0], [b, 0]]").unwrap_err();
        assert!(e.starts_with("column 11:"), "{e}");
        assert!(set_part_points(src, 0, "3").is_err());
        assert!(set_part_points(src, 0, "[[0, 0]] x = 1").is_err());
    }

    #[test]
    fn every_shape_has_default_sizes() {
        for (shape, required, _) in SHAPES {
            let d = DEFAULT_MM.iter().find(|s| s.0 == *shape).unwrap();
            for k in *required {
                assert!(d.1.iter().any(|x| x.0 == *k), "{shape}.{k}");
            }
        }
    }
}
