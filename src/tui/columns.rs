//! The columns of the parts table: which there are for a document (the dimension keys
//! of the shapes in use, in the order of [`SPECS`], and a polygon's points), what each
//! cell shows, and which file value a cell edits.

use crate::file::edit::Slot;
use crate::model::schema::{ShapeKind, SPECS};
use crate::model::{Anchor, Document, PartDoc, Val, Value};

/// Width of the points column.
const POINTS_WIDTH: u16 = 24;

/// A column of the parts table.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum Col {
    Name,
    Shape,
    /// `+` solid, `−` void.
    Sign,
    Dim(&'static str),
    /// A polygon's corners.
    Points,
    AtX,
    AtY,
    Anchor,
    Rotate,
    /// `flip_x` and `flip_y`.
    Flip,
    Material,
    Enabled,
}

/// The columns for a document: fixed ones around the dimension keys in use.
pub fn columns(doc: &Document) -> Vec<Col> {
    let mut cols = vec![Col::Name, Col::Shape, Col::Sign];
    let mut dims: Vec<&'static str> = Vec::new();
    for s in SPECS {
        if doc.parts.iter().any(|p| p.shape == s.kind) {
            for k in s.keys {
                if !dims.contains(&k.key) {
                    dims.push(k.key);
                }
            }
        }
    }
    cols.extend(dims.into_iter().map(Col::Dim));
    if doc.parts.iter().any(|p| p.shape.has_points()) {
        cols.push(Col::Points);
    }
    cols.extend([Col::AtX, Col::AtY, Col::Anchor, Col::Rotate, Col::Flip]);
    if !doc.materials.is_empty() {
        cols.push(Col::Material);
    }
    cols.push(Col::Enabled);
    cols
}

impl Col {
    /// The column heading.
    pub fn heading(&self) -> &'static str {
        match self {
            Col::Name => "part",
            Col::Shape => "shape",
            Col::Sign => "±",
            Col::Dim(k) => k,
            Col::Points => "points",
            Col::AtX => "at x",
            Col::AtY => "at y",
            Col::Anchor => "anchor",
            Col::Rotate => "rot°",
            Col::Flip => "flip",
            Col::Material => "material",
            Col::Enabled => "on",
        }
    }

    /// Width in cells; the shape column is as wide as the longest shape name in `doc`.
    pub fn width(&self, doc: &Document) -> u16 {
        match self {
            Col::Name => 14,
            Col::Shape => doc
                .parts
                .iter()
                .map(|p| p.shape.as_str().chars().count())
                .max()
                .unwrap_or(0)
                .clamp(5, 14) as u16,
            Col::Sign => 3,
            Col::Dim(_) => 9,
            Col::Points => POINTS_WIDTH,
            Col::AtX | Col::AtY => 11,
            Col::Anchor => 12,
            Col::Rotate => 5,
            Col::Flip => 4,
            Col::Material => 9,
            Col::Enabled => 3,
        }
    }

    /// The file value a number cell edits.
    pub fn slot(&self) -> Option<Slot> {
        match self {
            Col::Dim(k) => Some(Slot::Key((*k).to_string())),
            Col::AtX => Some(Slot::At(0)),
            Col::AtY => Some(Slot::At(1)),
            Col::Rotate => Some(Slot::Key("rotate".into())),
            _ => None,
        }
    }
}

/// The default of an optional dimension of a shape, `None` if the shape has no such key.
pub fn dim_default(shape: ShapeKind, key: &str) -> Option<Option<f64>> {
    shape.key(key).map(|k| k.default)
}

/// What a number cell holds: the value as written, a default, or nothing (`None`:
/// the shape has no such key).
pub fn number(p: &PartDoc, col: Col) -> Option<Value> {
    let written =
        |v: Option<&Val>, default: f64| Some(v.map_or(Value::Number(default), |v| v.value.clone()));
    match col {
        Col::Dim(k) => match dim_default(p.shape, k)? {
            None => p.dim(k).map(|v| v.value.clone()),
            Some(d) => written(p.dim(k), d),
        },
        Col::AtX => written(p.at.as_ref().map(|a| &a[0]), 0.0),
        Col::AtY => written(p.at.as_ref().map(|a| &a[1]), 0.0),
        Col::Rotate => written(p.rotate.as_ref(), 0.0),
        _ => None,
    }
}

/// The text of a cell (unsanitised; views clean it before drawing).
pub fn cell(p: &PartDoc, index: usize, col: Col, ascii: bool) -> String {
    match col {
        Col::Name => p
            .name
            .clone()
            .unwrap_or_else(|| format!("part {}", index + 1)),
        Col::Shape => p.shape.to_string(),
        Col::Sign => match (p.void, ascii) {
            (false, _) => "+".into(),
            (true, false) => "−".into(),
            (true, true) => "-".into(),
        },
        Col::Material => p.material.as_ref().map_or(String::new(), |m| m.0.clone()),
        Col::Enabled => if p.enabled { "yes" } else { "no" }.into(),
        Col::Points => p.points.as_deref().map_or(String::new(), points_cell),
        Col::Anchor => anchor(p).name().into(),
        Col::Flip => match (p.flip_x, p.flip_y) {
            (false, false) => "-",
            (true, false) => "x",
            (false, true) => "y",
            (true, true) => "xy",
        }
        .into(),
        Col::Dim(_) | Col::AtX | Col::AtY | Col::Rotate => {
            if p.shape.has_points() && matches!(col, Col::Dim(_)) {
                return String::new();
            }
            number(p, col).map_or(String::new(), |v| v.text())
        }
    }
}

/// The anchor of a part, written or by default.
pub fn anchor(p: &PartDoc) -> Anchor {
    p.anchor.unwrap_or(p.shape.default_anchor())
}

/// Points in brief, as many whole pairs as fit the column: `(0,0) (200,0) (200,t) …`.
fn points_cell(points: &[[Val; 2]]) -> String {
    let room = POINTS_WIDTH as usize;
    let mut out = String::new();
    for (i, [x, y]) in points.iter().enumerate() {
        let pair = format!("({},{})", x.value.text(), y.value.text());
        let sep = usize::from(!out.is_empty());
        // Room for " …" unless this is the last pair.
        let limit = if i + 1 == points.len() {
            room
        } else {
            room - 2
        };
        if out.chars().count() + sep + pair.chars().count() > limit {
            out.push_str(if out.is_empty() { "…" } else { " …" });
            break;
        }
        if sep == 1 {
            out.push(' ');
        }
        out.push_str(&pair);
    }
    out
}
