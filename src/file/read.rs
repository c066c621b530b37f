//! Reading a section file (docs/format.md, format 1) into a [`Document`], keeping the byte
//! range of every value so that each error can say `line:column`. Unknown keys are
//! errors, so a typo never silently changes a result.

use super::strict;
use super::tree::{self, Item, Kind, Table, Value as TomlValue};
use crate::model::document::{ActionsDoc, LimitsDoc};
use crate::model::schema::{shape_names, ShapeKind, SPECS};
use crate::model::units::LengthUnit;
use crate::model::{
    Anchor, Diagnostic, Document, MaterialDoc, MemberDoc, PartDoc, PointDoc, SheetDoc, Span,
    StringMaps, Val, Value,
};
use std::cell::RefCell;
use toml_edit::ImDocument;

const TOP_KEYS: &[&str] = &[
    "format",
    "title",
    "units",
    "params",
    "materials",
    "parts",
    "actions",
    "member",
    "limits",
    "sheet",
];
const PART_KEYS: &[&str] = &[
    "name", "shape", "at", "anchor", "rotate", "flip_x", "flip_y", "void", "hole", "enabled",
    "material",
];
const MATERIAL_KEYS: &[&str] = &["name", "E", "fy", "density", "G", "nu"];
const ACTION_KEYS: &[&str] = &["N", "Mx", "My", "Vx", "Vy", "T"];
const LIMIT_KEYS: &[&str] = &["utilization", "deflection_limit", "min", "max"];
const SHEET_KEYS: &[&str] = &[
    "project", "job", "element", "by", "checked", "date", "revision",
];
const MEMBER_KEYS: &[&str] = &[
    "span",
    "support",
    "udl",
    "point",
    "deflection_limit",
    "self_weight",
    "shear_deformation",
    "c1",
    "load_height",
];

/// Parses the text of a section file: by the strict parser of the common subset
/// ([`super::strict`]) when it covers the text, else by `toml_edit` ([`parse_full`]).
/// Both fill the same tree, which one reader walks, so the document and every error
/// are the same either way (`tests/strict_toml.rs`).
pub fn parse(text: &str) -> Result<Document, Diagnostic> {
    match strict::parse(text) {
        Some(tree) => read(text, &tree),
        None => parse_full(text),
    }
}

/// Parses the text of a section file with `toml_edit` alone.
pub fn parse_full(text: &str) -> Result<Document, Diagnostic> {
    read(text, &full_tree(text)?)
}

/// The tree `toml_edit` parses from `text`, or the error that makes it not TOML.
pub fn full_tree(text: &str) -> Result<Table<'static>, Diagnostic> {
    let doc = ImDocument::parse(text).map_err(|e| {
        let span = e.span().unwrap_or(0..1);
        let lone_cr = text
            .get(span.start..)
            .is_some_and(|r| r.starts_with('\r') && !r.starts_with("\r\n"));
        let message = match e.message().trim() {
            m if m.is_empty() || lone_cr => toml_fallback(text, span.start),
            m if m.contains("recursion limit") => {
                "tables or arrays nested too deeply; a section file needs at most a few levels"
                    .to_string()
            }
            m => m.lines().map(str::trim).collect::<Vec<_>>().join("; "),
        };
        Diagnostic::new(span, format!("not valid TOML: {message}"))
    })?;
    Ok(tree::from_toml_edit(doc.as_table()))
}

/// The document in the tree of `text`.
fn read(text: &str, root: &Table) -> Result<Document, Diagnostic> {
    let r = Reader {
        text,
        maps: RefCell::new(Vec::new()),
    };
    r.known_keys(root, TOP_KEYS, "the top level", 0..1)?;
    match root.get("format") {
        None => return Err(Diagnostic::new(0..1, "missing `format = 1` at the top of the file")),
        Some(item) => match item.integer() {
            Some(1) => {}
            Some(n) if n > 1 => {
                return Err(Diagnostic::new(span(item, 0..1), format!("format {n} is newer than this kern understands (it reads format 1); update kern")))
            }
            _ => return Err(Diagnostic::new(span(item, 0..1), "`format` must be the integer 1")),
        },
    }
    let title = r.opt_string(root, "title", 0..1)?.map(|s| s.0);
    let (units, units_span) = match r.opt_str(root, "units", 0..1)? {
        None => {
            return Err(Diagnostic::new(
                0..1,
                "missing `units`; add units = \"mm\" (or cm, m, in, ft)",
            ))
        }
        Some((u, sp)) => match LengthUnit::parse(u) {
            Some(unit) => (unit, sp),
            None => {
                return Err(Diagnostic::new(
                    sp,
                    format!("unknown length unit `{u}`; use mm, cm, m, in or ft"),
                ))
            }
        },
    };
    let mut params = Vec::new();
    if let Some(item) = root.get("params") {
        let t = r.table(item, "params", 0..1)?;
        for e in &t.entries {
            let ks = e.key_span.clone().unwrap_or_else(|| span(&e.item, 0..1));
            params.push((e.key.to_string(), ks.clone(), r.val(&e.item, &e.key, ks)?));
        }
    }
    let materials = r
        .tables(root, "materials")?
        .into_iter()
        .map(|(t, sp)| r.material(t, sp))
        .collect::<Result<Vec<_>, _>>()?;
    for (i, m) in materials.iter().enumerate() {
        if materials[..i].iter().any(|o| o.name == m.name) {
            return Err(Diagnostic::new(
                m.span.clone(),
                format!(
                    "material `{}` is defined twice; give each material its own name",
                    m.name
                ),
            ));
        }
    }
    let parts = r
        .tables(root, "parts")?
        .into_iter()
        .map(|(t, sp)| r.part(t, sp))
        .collect::<Result<Vec<_>, _>>()?;
    let actions = match root.get("actions") {
        None => None,
        Some(item) => {
            let t = r.table(item, "actions", 0..1)?;
            let sp = span(item, 0..1);
            r.known_keys(t, ACTION_KEYS, "[actions]", sp.clone())?;
            Some(ActionsDoc {
                n: r.opt_val(t, "N", sp.clone())?,
                mx: r.opt_val(t, "Mx", sp.clone())?,
                my: r.opt_val(t, "My", sp.clone())?,
                vx: r.opt_val(t, "Vx", sp.clone())?,
                vy: r.opt_val(t, "Vy", sp.clone())?,
                t: r.opt_val(t, "T", sp.clone())?,
                span: sp,
            })
        }
    };
    let member = match root.get("member") {
        None => None,
        Some(item) => Some(r.member(r.table(item, "member", 0..1)?, span(item, 0..1))?),
    };
    let limits = match root.get("limits") {
        None => None,
        Some(item) => Some(r.limits(r.table(item, "limits", 0..1)?, span(item, 0..1))?),
    };
    let sheet = match root.get("sheet") {
        None => None,
        Some(item) => Some(r.sheet(r.table(item, "sheet", 0..1)?, span(item, 0..1))?),
    };
    Ok(Document {
        limits,
        title,
        units,
        units_span,
        params,
        materials,
        parts,
        actions,
        member,
        sheet,
        string_maps: r.maps.into_inner(),
    })
}

/// The checkpoints of [`crate::model::StringMaps`] for the string token `raw` that
/// starts at byte `start` of the file; empty for a plain one-line string, whose value
/// starts one past the quote. Follows the TOML 1.0 string rules: basic strings take
/// escapes (`\uXXXX`, `\UXXXXXXXX`, one-letter ones), multi-line strings drop a newline
/// right after the opening quotes and, when basic, a backslash at a line end with the
/// whitespace after it; literal strings take none.
fn string_map(raw: &str, start: usize) -> Vec<(usize, usize)> {
    let (delim, multi) = if raw.starts_with("\"\"\"") || raw.starts_with("'''") {
        (3, true)
    } else if raw.starts_with('"') || raw.starts_with('\'') {
        (1, false)
    } else {
        return Vec::new();
    };
    let basic = raw.starts_with('"');
    let b = raw.as_bytes();
    // A one-line string with no escape maps one to one past its quote: no checkpoints
    // (and nothing allocated for the usual value).
    if !(multi || (basic && b.contains(&b'\\'))) {
        return Vec::new();
    }
    let mut i = delim;
    if multi {
        if raw[i..].starts_with("\r\n") {
            i += 2;
        } else if raw[i..].starts_with('\n') {
            i += 1;
        }
    }
    let mut map = vec![(0, start + i)];
    let end = raw.len().saturating_sub(delim).max(i);
    let mut v = 0;
    while basic && i < end {
        let (raw_len, val_len) = match (b[i], b.get(i + 1)) {
            (b'\\', Some(&e)) if e == b'u' || e == b'U' => {
                let n = if e == b'u' { 4 } else { 8 };
                let c = raw
                    .get(i + 2..i + 2 + n)
                    .and_then(|h| u32::from_str_radix(h, 16).ok())
                    .and_then(char::from_u32);
                (2 + n, c.map_or(1, char::len_utf8))
            }
            (b'\\', Some(b' ' | b'\t' | b'\n' | b'\r')) if multi => {
                let mut j = i + 1;
                while j < end && matches!(b[j], b' ' | b'\t' | b'\n' | b'\r') {
                    j += 1;
                }
                (j - i, 0)
            }
            (b'\\', Some(_)) => (2, 1),
            (b'\r', Some(b'\n')) if multi => (2, 1),
            _ => {
                let n = raw[i..].chars().next().map_or(1, char::len_utf8);
                i += n;
                v += n;
                continue;
            }
        };
        i += raw_len;
        v += val_len;
        map.push((v, start + i));
    }
    if map == [(0, start + 1)] {
        Vec::new()
    } else {
        map
    }
}

/// What is wrong at byte `at` when the TOML parser gives no words for it.
fn toml_fallback(text: &str, at: usize) -> String {
    let rest = text.get(at..).unwrap_or("");
    match rest.chars().next() {
        Some('\r') if !rest.starts_with("\r\n") => "a carriage return without a line feed; \
TOML lines end in LF or CR LF: save the file with Unix (LF) or Windows (CR LF) line ends"
            .to_string(),
        Some(c) if c.is_control() => format!(
            "control character U+{:04X} here; remove it (only tab, LF and CR LF may stand in the file)",
            c as u32
        ),
        Some(c) => format!("unexpected `{c}` here"),
        None => "the file ends too early (an unclosed bracket or quote?)".to_string(),
    }
}

fn span(item: &Item, fallback: Span) -> Span {
    item.span().unwrap_or(fallback)
}

/// Edit distance, for "did you mean" hints.
fn distance(a: &str, b: &str) -> usize {
    strsim::levenshtein(a, b)
}

struct Reader<'a> {
    text: &'a str,
    /// Filled by [`Reader::val`] for strings with escapes or line breaks.
    maps: RefCell<StringMaps>,
}

impl Reader<'_> {
    fn known_keys(
        &self,
        t: &Table,
        allowed: &[&str],
        place: &str,
        fallback: Span,
    ) -> Result<(), Diagnostic> {
        for e in &t.entries {
            let k: &str = &e.key;
            if !allowed.contains(&k) {
                let sp = e
                    .key_span
                    .clone()
                    .unwrap_or_else(|| span(&e.item, fallback.clone()));
                let best = allowed
                    .iter()
                    .min_by_key(|a| distance(k, a))
                    .filter(|a| distance(k, a) <= 2);
                let hint = match best {
                    Some(b) => format!("did you mean `{b}`?"),
                    None => format!("allowed here: {}", allowed.join(", ")),
                };
                return Err(Diagnostic::new(
                    sp,
                    format!("unknown key `{k}` in {place}; {hint}"),
                ));
            }
        }
        Ok(())
    }

    fn table<'a, 't>(
        &self,
        item: &'a Item<'t>,
        name: &str,
        fallback: Span,
    ) -> Result<&'a Table<'t>, Diagnostic> {
        item.table().ok_or_else(|| {
            Diagnostic::new(
                span(item, fallback),
                format!("`{name}` must be a table, e.g. [{name}]"),
            )
        })
    }

    /// `[[name]]` tables (or an inline array of tables) with the span of each.
    fn tables<'a, 't>(
        &self,
        root: &'a Table<'t>,
        name: &str,
    ) -> Result<Vec<(&'a Table<'t>, Span)>, Diagnostic> {
        let Some(item) = root.get(name) else {
            return Ok(Vec::new());
        };
        if let Item::Tables(ts, _) = item {
            return Ok(ts
                .iter()
                .map(|t| (t, t.span.clone().unwrap_or(0..1)))
                .collect());
        }
        if let Some(arr) = item.array() {
            return arr
                .iter()
                .map(|v| match v.inline_table() {
                    Some(t) => Ok((t, v.span.clone().unwrap_or(0..1))),
                    None => Err(Diagnostic::new(
                        v.span.clone().unwrap_or(0..1),
                        format!("each entry of `{name}` must be a table"),
                    )),
                })
                .collect();
        }
        Err(Diagnostic::new(
            span(item, 0..1),
            format!("`{name}` must be written as [[{name}]] tables"),
        ))
    }

    fn val(&self, item: &Item, key: &str, fallback: Span) -> Result<Val, Diagnostic> {
        self.value(item.value(), key, span(item, fallback))
    }

    /// The number or expression `v` (none when the key holds a table), at `sp`.
    fn value(&self, v: Option<&TomlValue>, key: &str, sp: Span) -> Result<Val, Diagnostic> {
        let value = match v.map(|v| &v.kind) {
            Some(Kind::Integer(n)) => Value::Number(*n as f64),
            Some(Kind::Float(x)) => Value::Number(*x),
            Some(Kind::Str(s)) => {
                let map = self
                    .text
                    .get(sp.clone())
                    .map_or_else(Vec::new, |raw| string_map(raw, sp.start));
                if !map.is_empty() {
                    self.maps.borrow_mut().push((sp.start, map));
                }
                Value::Expr(s.to_string())
            }
            _ => {
                return Err(Diagnostic::new(
                    sp,
                    format!("`{key}` must be a number or an expression in quotes, e.g. {key} = 12 or {key} = \"2*tf\""),
                ))
            }
        };
        if let Value::Number(x) = value {
            if !x.is_finite() {
                return Err(Diagnostic::new(
                    sp,
                    format!("`{key}` is not a finite number"),
                ));
            }
        }
        Ok(Val { value, span: sp })
    }

    fn opt_val(&self, t: &Table, key: &str, fallback: Span) -> Result<Option<Val>, Diagnostic> {
        t.get(key).map(|v| self.val(v, key, fallback)).transpose()
    }

    /// The string under `key`, borrowed from the tree.
    fn opt_str<'t>(
        &self,
        t: &'t Table,
        key: &str,
        fallback: Span,
    ) -> Result<Option<(&'t str, Span)>, Diagnostic> {
        match t.get(key) {
            None => Ok(None),
            Some(item) => match item.str() {
                Some(s) => Ok(Some((s, span(item, fallback)))),
                None => Err(Diagnostic::new(
                    span(item, fallback),
                    format!("`{key}` must be a string in quotes"),
                )),
            },
        }
    }

    /// [`Reader::opt_str`] as an owned string, for the document.
    fn opt_string(
        &self,
        t: &Table,
        key: &str,
        fallback: Span,
    ) -> Result<Option<(String, Span)>, Diagnostic> {
        Ok(self
            .opt_str(t, key, fallback)?
            .map(|(s, sp)| (s.to_string(), sp)))
    }

    fn opt_bool(
        &self,
        t: &Table,
        key: &str,
        default: bool,
        fallback: Span,
    ) -> Result<bool, Diagnostic> {
        match t.get(key) {
            None => Ok(default),
            Some(item) => item.bool().ok_or_else(|| {
                Diagnostic::new(
                    span(item, fallback),
                    format!("`{key}` must be true or false"),
                )
            }),
        }
    }

    /// `[x, y]` of two values (`v` at `sp`; none when the key holds a table).
    fn pair(&self, v: Option<&TomlValue>, key: &str, sp: Span) -> Result<[Val; 2], Diagnostic> {
        let bad = || {
            Diagnostic::new(
                sp.clone(),
                format!("`{key}` must be a pair [x, y] of numbers or expressions"),
            )
        };
        let arr = v.and_then(TomlValue::array).ok_or_else(bad)?;
        if arr.len() != 2 {
            return Err(bad());
        }
        let one = |i: usize| -> Result<Val, Diagnostic> {
            let v = arr.get(i).ok_or_else(bad)?;
            self.value(Some(v), key, v.span.clone().unwrap_or(sp.clone()))
        };
        Ok([one(0)?, one(1)?])
    }

    fn material(&self, t: &Table, sp: Span) -> Result<MaterialDoc, Diagnostic> {
        self.known_keys(t, MATERIAL_KEYS, "[[materials]]", sp.clone())?;
        let name = self
            .opt_string(t, "name", sp.clone())?
            .ok_or_else(|| {
                Diagnostic::new(
                    sp.clone(),
                    "a material needs a `name`, e.g. name = \"steel\"",
                )
            })?
            .0;
        Ok(MaterialDoc {
            name,
            e: self.opt_val(t, "E", sp.clone())?,
            fy: self.opt_val(t, "fy", sp.clone())?,
            density: self.opt_val(t, "density", sp.clone())?,
            g: self.opt_val(t, "G", sp.clone())?,
            nu: self.opt_val(t, "nu", sp.clone())?,
            span: sp,
        })
    }

    fn part(&self, t: &Table, sp: Span) -> Result<PartDoc, Diagnostic> {
        let Some((shape, shape_span)) = self.opt_str(t, "shape", sp.clone())? else {
            // A misspelt `shape` is the likely cause: name it if a key is unknown to
            // every shape.
            let mut any: Vec<&str> = PART_KEYS.to_vec();
            any.push("points");
            for s in SPECS {
                any.extend(s.keys.iter().map(|k| k.key));
            }
            self.known_keys(t, &any, "a part", sp.clone())?;
            return Err(Diagnostic::new(
                sp,
                "a part needs a `shape`, e.g. shape = \"rect\"",
            ));
        };
        let Some(kind) = ShapeKind::parse(shape) else {
            let best = SPECS
                .iter()
                .map(|s| s.name)
                .min_by_key(|s| distance(shape, s))
                .filter(|s| distance(shape, s) <= 3);
            let hint = best.map_or(String::new(), |b| format!("did you mean `{b}`? "));
            return Err(Diagnostic::new(
                shape_span,
                format!("unknown shape `{shape}`; {hint}shapes: {}", shape_names()),
            ));
        };
        let allowed_here = |k: &str| {
            PART_KEYS.contains(&k) || kind.key(k).is_some() || (k == "points" && kind.has_points())
        };
        // The list and the place are spelt out only for the message of an unknown key.
        if !t.entries.iter().all(|e| allowed_here(&e.key)) {
            let mut allowed: Vec<&str> = PART_KEYS.to_vec();
            allowed.extend(kind.spec().keys.iter().map(|k| k.key));
            if kind.has_points() {
                allowed.push("points");
            }
            self.known_keys(t, &allowed, &format!("a {shape} part"), sp.clone())?;
        }
        let mut dims = Vec::with_capacity(t.entries.len());
        for e in &t.entries {
            if let Some(k) = kind.key(&e.key) {
                dims.push((k.key, self.val(&e.item, &e.key, sp.clone())?));
            }
        }
        let (points, points_span) = match t.get("points") {
            None => (None, sp.clone()),
            Some(item) => {
                let psp = span(item, sp.clone());
                let arr = item.array().ok_or_else(|| {
                    Diagnostic::new(psp.clone(), "`points` must be a list of [x, y] pairs")
                })?;
                let pts = arr
                    .iter()
                    .map(|v| self.pair(Some(v), "points", v.span.clone().unwrap_or(psp.clone())))
                    .collect::<Result<Vec<_>, _>>()?;
                (Some(pts), psp)
            }
        };
        let anchor = match self.opt_str(t, "anchor", sp.clone())? {
            None => None,
            Some((a, asp)) => Some(Anchor::parse(a).ok_or_else(|| {
                let names: Vec<&str> = Anchor::ALL.iter().map(|a| a.1).collect();
                Diagnostic::new(
                    asp,
                    format!("unknown anchor `{a}`; use one of {}", names.join(", ")),
                )
            })?),
        };
        let hole = self.opt_bool(t, "hole", false, sp.clone())?;
        if hole && !self.opt_bool(t, "void", true, sp.clone())? {
            let at = t.get("void").map_or(sp.clone(), |i| span(i, sp.clone()));
            return Err(Diagnostic::new(
                at,
                "a part with `hole = true` is a void (a hole exists only at some cross-sections); \
remove `void = false` or set `hole = false`",
            ));
        }
        Ok(PartDoc {
            name: self.opt_string(t, "name", sp.clone())?.map(|s| s.0),
            shape: kind,
            shape_span,
            dims,
            points,
            points_span,
            at: t
                .get("at")
                .map(|i| self.pair(i.value(), "at", span(i, sp.clone())))
                .transpose()?,
            anchor,
            rotate: self.opt_val(t, "rotate", sp.clone())?,
            flip_x: self.opt_bool(t, "flip_x", false, sp.clone())?,
            flip_y: self.opt_bool(t, "flip_y", false, sp.clone())?,
            void: self.opt_bool(t, "void", false, sp.clone())? || hole,
            hole,
            enabled: self.opt_bool(t, "enabled", true, sp.clone())?,
            material: self.opt_string(t, "material", sp.clone())?,
            span: sp,
        })
    }

    /// `[limits]`: the two member limits and the `min` / `max` tables of results,
    /// whose nested keys (`inertia.xx = 8e8`, or `inertia = { xx = 8e8 }`) are read
    /// as dotted result keys.
    fn limits(&self, t: &Table, sp: Span) -> Result<LimitsDoc, Diagnostic> {
        self.known_keys(t, LIMIT_KEYS, "[limits]", sp.clone())?;
        let mut bounds = [Vec::new(), Vec::new()];
        for (slot, name) in bounds.iter_mut().zip(["min", "max"]) {
            if let Some(item) = t.get(name) {
                let inner = self.table(item, &format!("limits.{name}"), sp.clone())?;
                self.result_keys(inner, "", sp.clone(), slot, 0)?;
            }
        }
        let [min, max] = bounds;
        Ok(LimitsDoc {
            utilization: self.opt_val(t, "utilization", sp.clone())?,
            deflection_limit: self.opt_val(t, "deflection_limit", sp.clone())?,
            min,
            max,
            span: sp,
        })
    }

    /// The entries of a `[limits]` bound table as (dotted key, key span, value),
    /// descending into nested tables (at most a few levels: result keys have three).
    fn result_keys(
        &self,
        t: &Table,
        prefix: &str,
        fallback: Span,
        out: &mut Vec<(String, Span, Val)>,
        depth: usize,
    ) -> Result<(), Diagnostic> {
        for e in &t.entries {
            let (k, v) = (&e.key, &e.item);
            let ks = e
                .key_span
                .clone()
                .unwrap_or_else(|| span(v, fallback.clone()));
            let path = if prefix.is_empty() {
                k.to_string()
            } else {
                format!("{prefix}.{k}")
            };
            match v.table() {
                Some(inner) if depth < 3 => {
                    self.result_keys(inner, &path, ks, out, depth + 1)?;
                }
                Some(_) => {
                    return Err(Diagnostic::new(
                        ks,
                        format!("`{path}` is nested too deeply to be a result key"),
                    ))
                }
                None => out.push((path.clone(), ks.clone(), self.val(v, &path, ks)?)),
            }
        }
        Ok(())
    }

    /// `[sheet]`: every field an optional string.
    fn sheet(&self, t: &Table, sp: Span) -> Result<SheetDoc, Diagnostic> {
        self.known_keys(t, SHEET_KEYS, "[sheet]", sp.clone())?;
        let f = |key: &str| self.opt_string(t, key, sp.clone());
        Ok(SheetDoc {
            project: f("project")?,
            job: f("job")?,
            element: f("element")?,
            by: f("by")?,
            checked: f("checked")?,
            date: f("date")?,
            revision: f("revision")?,
        })
    }

    fn member(&self, t: &Table, sp: Span) -> Result<MemberDoc, Diagnostic> {
        self.known_keys(t, MEMBER_KEYS, "[member]", sp.clone())?;
        let length = self.opt_val(t, "span", sp.clone())?.ok_or_else(|| {
            Diagnostic::new(sp.clone(), "[member] needs `span`, e.g. span = \"6 m\"")
        })?;
        let support = self
            .opt_string(t, "support", sp.clone())?
            .unwrap_or(("simple".into(), sp.clone()));
        let mut points = Vec::new();
        if let Some(item) = t.get("point") {
            let psp = span(item, sp.clone());
            let bad = || {
                Diagnostic::new(
                    psp.clone(),
                    "`point` must be a list like [{ P = \"30 kN\", a = \"2 m\" }]",
                )
            };
            let arr = item.array().ok_or_else(bad)?;
            for v in arr.iter() {
                let it = v.inline_table().ok_or_else(bad)?;
                let vsp = v.span.clone().unwrap_or(psp.clone());
                self.known_keys(it, &["P", "a"], "a point load", vsp.clone())?;
                let p = self.opt_val(it, "P", vsp.clone())?;
                let a = self.opt_val(it, "a", vsp.clone())?;
                match (p, a) {
                    (Some(p), Some(a)) => points.push(PointDoc { p, a }),
                    _ => return Err(Diagnostic::new(
                        vsp,
                        "a point load needs both `P` and `a`, e.g. { P = \"30 kN\", a = \"2 m\" }",
                    )),
                }
            }
        }
        Ok(MemberDoc {
            length,
            support,
            udl: self.opt_val(t, "udl", sp.clone())?,
            points,
            deflection_limit: self.opt_val(t, "deflection_limit", sp.clone())?,
            self_weight: self.opt_bool(t, "self_weight", false, sp.clone())?,
            shear_deformation: self.opt_bool(t, "shear_deformation", false, sp.clone())?,
            c1: self.opt_val(t, "c1", sp.clone())?,
            load_height: self.opt_string(t, "load_height", sp.clone())?,
            span: sp,
        })
    }
}

#[cfg(test)]
mod tests {

    /// TOML 1.0 string rules (toml.io/en/v1.0.0#string): checkpoints fall after each
    /// escape, and after the newline a multi-line string drops.
    #[test]
    fn string_maps_follow_escapes_and_line_breaks() {
        assert!(string_map("\"a + b\"", 10).is_empty());
        // "\t+x": `+` is at 1 in the value and at 10 + 3 in the file.
        assert_eq!(string_map("\"\\t+x\"", 10), [(0, 11), (1, 13)]);
        // \u00e9 is 6 bytes in the file and 2 in the value.
        assert_eq!(string_map("\"\\u00e9)\"", 0), [(0, 1), (2, 7)]);
        assert_eq!(string_map("\"\"\"\n1 +\"\"\"", 0), [(0, 4)]);
        assert_eq!(string_map("'''\n1 +'''", 0), [(0, 4)]);
        assert!(string_map("'a\\t'", 0).is_empty());
    }
    use super::*;

    fn outline(n: usize) -> String {
        (0..n)
            .map(|i| {
                let t = i as f64 / n as f64 * std::f64::consts::TAU;
                format!("[{:.6}, {:.6}]", 100.0 * t.cos(), 60.0 * t.sin())
            })
            .collect::<Vec<_>>()
            .join(",\n  ")
    }

    #[test]
    fn a_long_outline_reads_by_the_strict_parser_as_by_toml_edit() {
        let text = format!(
            "format = 1\nunits = \"mm\"\n[[parts]]\nshape = \"polygon\"\npoints = [ # traced\n  {},\n]\n[[parts]]\nshape = \"circle\"\nd = 10\nvoid = true\n",
            outline(2000)
        );
        assert!(strict::parse(&text).is_some());
        assert_eq!(parse(&text).unwrap(), parse_full(&text).unwrap());
    }

    #[test]
    fn a_multi_line_string_is_left_to_toml_edit() {
        let text = format!(
            "format = 1\nunits = \"mm\"\ntitle = \"\"\"\npoints = [{}]\n\"\"\"\n[[parts]]\nshape = \"rect\"\nb = 1\nh = 1\n",
            outline(20)
        );
        assert!(strict::parse(&text).is_none());
        let doc = parse(&text).unwrap();
        assert!(doc.title.unwrap().contains("[100.000000, 0.000000]"));
    }
}
