//! The columns of the parts table: which there are for a document (the dimension keys
//! of the shapes in use, in the order of [`SHAPES`]), what each cell shows, and which
//! file value a cell edits.

use crate::file::edit::Slot;
use crate::geom::shapes::SHAPES;
use crate::model::{Document, PartDoc, Val, Value};

/// A column of the parts table.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum Col {
    Name,
    Shape,
    /// `+` solid, `−` void.
    Sign,
    Dim(&'static str),
    AtX,
    AtY,
    Rotate,
    Material,
    Enabled,
}

/// The columns for a document: fixed ones around the dimension keys in use.
pub fn columns(doc: &Document) -> Vec<Col> {
    let mut cols = vec![Col::Name, Col::Shape, Col::Sign];
    let mut dims: Vec<&'static str> = Vec::new();
    for (name, req, opt) in SHAPES {
        if doc.parts.iter().any(|p| p.shape == *name) {
            for k in req.iter().copied().chain(opt.iter().map(|o| o.0)) {
                if !dims.contains(&k) {
                    dims.push(k);
                }
            }
        }
    }
    cols.extend(dims.into_iter().map(Col::Dim));
    cols.extend([Col::AtX, Col::AtY, Col::Rotate]);
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
            Col::AtX => "at x",
            Col::AtY => "at y",
            Col::Rotate => "rot°",
            Col::Material => "material",
            Col::Enabled => "on",
        }
    }

    /// Width in cells.
    pub fn width(&self) -> u16 {
        match self {
            Col::Name => 14,
            Col::Shape => 8,
            Col::Sign => 3,
            Col::Dim(_) => 9,
            Col::AtX | Col::AtY => 11,
            Col::Rotate => 5,
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
pub fn dim_default(shape: &str, key: &str) -> Option<Option<f64>> {
    let (_, req, opt) = SHAPES.iter().find(|s| s.0 == shape)?;
    if req.contains(&key) {
        return Some(None);
    }
    opt.iter().find(|o| o.0 == key).map(|o| Some(o.1))
}

/// What a number cell holds: the value as written, a default, or nothing (`None`:
/// the shape has no such key).
pub fn number(p: &PartDoc, col: Col) -> Option<Value> {
    let written =
        |v: Option<&Val>, default: f64| Some(v.map_or(Value::Number(default), |v| v.value.clone()));
    match col {
        Col::Dim(k) => match dim_default(&p.shape, k)? {
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
        Col::Shape => p.shape.clone(),
        Col::Sign => match (p.void, ascii) {
            (false, _) => "+".into(),
            (true, false) => "−".into(),
            (true, true) => "-".into(),
        },
        Col::Material => p.material.as_ref().map_or(String::new(), |m| m.0.clone()),
        Col::Enabled => if p.enabled { "yes" } else { "no" }.into(),
        Col::Dim(_) | Col::AtX | Col::AtY | Col::Rotate => {
            if p.shape == "polygon" && matches!(col, Col::Dim(_)) {
                return String::new();
            }
            number(p, col).map_or(String::new(), |v| v.text())
        }
    }
}
