//! The shapes of format 1 as data: for each shape its file name, its dimension keys
//! with their meaning, rule and default, the sizes (or corners) a new part gets, its
//! default anchor and whether it is drawn from `points`. The reader, the resolver, the editor, the
//! workbench's columns, picker and help, and the reports all take the shapes from
//! [`SPECS`]; [`crate::geom::shapes`] draws the boundary of each kind.
//!
//! Adding a shape is one row here and its boundary in `geom::shapes`.

use super::anchor::Anchor;
use std::fmt;

/// The kind of a shape, as named in the file.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Hash)]
pub enum ShapeKind {
    Rect,
    Triangle,
    Circle,
    HalfCircle,
    QuarterCircle,
    Polygon,
    IBeam,
    Channel,
    Angle,
    Tee,
    Box,
    Pipe,
    Zed,
}

/// What values a dimension may take.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum Rule {
    /// Greater than 0 (a size).
    Positive,
    /// 0 or more (a radius that may be absent).
    NonNegative,
    /// Any real number (a position).
    Any,
}

/// One dimension key of a shape.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct KeySpec {
    pub key: &'static str,
    /// What the key measures, in a few words.
    pub meaning: &'static str,
    pub rule: Rule,
    /// `None`: the key is required; `Some(x)`: optional, `x` when not written.
    pub default: Option<f64>,
    /// The size, in millimetres, a new part is written with (required keys only; common
    /// practice: round sizes of the order of a rolled section).
    pub new_mm: f64,
}

/// One shape of the file format.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct ShapeSpec {
    pub kind: ShapeKind,
    /// The name in the file.
    pub name: &'static str,
    /// Dimension keys: the required ones first, then the optional ones.
    pub keys: &'static [KeySpec],
    /// Drawn from `points = [[x, y], ...]` rather than from dimensions.
    pub points: bool,
    /// The corners, in millimetres, a new part of a shape drawn from points gets.
    pub new_points_mm: &'static [[f64; 2]],
    /// The anchor of a part that names none.
    pub anchor: Anchor,
    /// Where the shape lies in its own frame.
    pub frame: &'static str,
}

const fn req(key: &'static str, meaning: &'static str, new_mm: f64) -> KeySpec {
    KeySpec {
        key,
        meaning,
        rule: Rule::Positive,
        default: None,
        new_mm,
    }
}

/// An optional radius, 0 (none) by default.
const fn radius(key: &'static str, meaning: &'static str) -> KeySpec {
    KeySpec {
        key,
        meaning,
        rule: Rule::NonNegative,
        default: Some(0.0),
        new_mm: 0.0,
    }
}

const fn shape(
    kind: ShapeKind,
    name: &'static str,
    keys: &'static [KeySpec],
    frame: &'static str,
) -> ShapeSpec {
    ShapeSpec {
        kind,
        name,
        keys,
        points: false,
        new_points_mm: &[],
        anchor: Anchor::Center,
        frame,
    }
}

/// Every shape, in the order the picker and the documentation list them.
pub const SPECS: &[ShapeSpec] = &[
    shape(
        ShapeKind::Rect,
        "rect",
        &[req("b", "width", 100.0), req("h", "height", 50.0)],
        "corners (0,0) and (b,h)",
    ),
    shape(
        ShapeKind::Triangle,
        "triangle",
        &[
            req("b", "base", 100.0),
            req("h", "height", 100.0),
            KeySpec {
                key: "apex",
                meaning: "x of the top corner",
                rule: Rule::Any,
                default: Some(0.0),
                new_mm: 0.0,
            },
        ],
        "corners (0,0), (b,0), (apex,h)",
    ),
    shape(
        ShapeKind::Circle,
        "circle",
        &[req("d", "diameter", 100.0)],
        "centre (d/2, d/2)",
    ),
    shape(
        ShapeKind::HalfCircle,
        "half_circle",
        &[req("d", "diameter", 100.0)],
        "flat side on y = 0 from 0 to d, round side up",
    ),
    shape(
        ShapeKind::QuarterCircle,
        "quarter_circle",
        &[req("r", "radius", 50.0)],
        "square corner at (0,0), round side in the first quadrant",
    ),
    ShapeSpec {
        kind: ShapeKind::Polygon,
        name: "polygon",
        keys: &[],
        points: true,
        // A right triangle.
        new_points_mm: &[[0.0, 0.0], [100.0, 0.0], [0.0, 100.0]],
        anchor: Anchor::Origin,
        frame: "as given",
    },
    shape(
        ShapeKind::IBeam,
        "ibeam",
        &[
            req("d", "depth", 300.0),
            req("b", "flange width", 150.0),
            req("tf", "flange thickness", 10.0),
            req("tw", "web thickness", 7.0),
            radius("r", "root radius"),
        ],
        "box (0,0)–(b,d), symmetric both ways",
    ),
    shape(
        ShapeKind::Channel,
        "channel",
        &[
            req("d", "depth", 200.0),
            req("b", "flange width", 75.0),
            req("tf", "flange thickness", 10.0),
            req("tw", "web thickness", 6.0),
            radius("r", "root radius"),
        ],
        "back of the web on x = 0, flanges toward +x",
    ),
    shape(
        ShapeKind::Angle,
        "angle",
        &[
            req("h", "vertical leg", 100.0),
            req("b", "horizontal leg", 100.0),
            req("t", "thickness", 10.0),
            radius("r", "root radius"),
        ],
        "heel at (0,0), legs along +x and +y",
    ),
    shape(
        ShapeKind::Tee,
        "tee",
        &[
            req("d", "depth", 150.0),
            req("b", "flange width", 150.0),
            req("tf", "flange thickness", 10.0),
            req("tw", "stem thickness", 8.0),
            radius("r", "root radius"),
        ],
        "flange on top, stem down to y = 0",
    ),
    shape(
        ShapeKind::Box,
        "box",
        &[
            req("h", "height", 200.0),
            req("b", "width", 100.0),
            req("t", "wall", 8.0),
            radius("ro", "outer corner radius"),
        ],
        "box (0,0)–(b,h)",
    ),
    shape(
        ShapeKind::Pipe,
        "pipe",
        &[req("d", "outside diameter", 100.0), req("t", "wall", 5.0)],
        "centre (d/2, d/2)",
    ),
    shape(
        ShapeKind::Zed,
        "zed",
        &[
            req("d", "depth", 200.0),
            req("b", "flange width", 75.0),
            req("tf", "flange thickness", 8.0),
            req("tw", "web thickness", 6.0),
            radius("r", "root radius"),
        ],
        "box (0,0)–(2b − tw, d); web from x = b − tw to b, top flange toward +x, bottom flange toward −x",
    ),
];

impl ShapeKind {
    /// The shape's row of [`SPECS`].
    pub fn spec(self) -> &'static ShapeSpec {
        SPECS.iter().find(|s| s.kind == self).unwrap_or(&SPECS[0])
    }

    /// The kind named `name` in the file.
    pub fn parse(name: &str) -> Option<ShapeKind> {
        SPECS.iter().find(|s| s.name == name).map(|s| s.kind)
    }

    /// The name in the file.
    pub fn as_str(self) -> &'static str {
        self.spec().name
    }

    /// The spec of dimension `key`, if the shape has it.
    pub fn key(self, key: &str) -> Option<&'static KeySpec> {
        self.spec().keys.iter().find(|k| k.key == key)
    }

    /// The required dimension keys.
    pub fn required(self) -> impl Iterator<Item = &'static str> {
        self.spec()
            .keys
            .iter()
            .filter(|k| k.default.is_none())
            .map(|k| k.key)
    }

    /// Is the shape drawn from `points`?
    pub fn has_points(self) -> bool {
        self.spec().points
    }

    /// The anchor of a part of this shape that names none.
    pub fn default_anchor(self) -> Anchor {
        self.spec().anchor
    }
}

impl fmt::Display for ShapeKind {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        f.write_str(self.as_str())
    }
}

impl PartialEq<&str> for ShapeKind {
    fn eq(&self, other: &&str) -> bool {
        self.as_str() == *other
    }
}

/// The names of every shape, for messages: `rect, triangle, …`.
pub fn shape_names() -> String {
    SPECS.iter().map(|s| s.name).collect::<Vec<_>>().join(", ")
}

/// Is `key` a key that describes a shape rather than places it (a dimension of some
/// shape, or `points`)?
pub fn is_shape_key(key: &str) -> bool {
    key == "points" || SPECS.iter().any(|s| s.keys.iter().any(|k| k.key == key))
}

/// The resolved dimensions of one part, in the order of its shape's keys (defaults
/// applied), in the file's length unit.
#[derive(Debug, Clone, PartialEq, Default)]
pub struct Dims(pub Vec<(&'static str, f64)>);

impl Dims {
    /// The value of `key`, `None` if the shape has no such key.
    pub fn get(&self, key: &str) -> Option<f64> {
        self.0.iter().find(|(k, _)| *k == key).map(|(_, v)| *v)
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn every_shape_has_one_row_with_required_keys_first() {
        for s in SPECS {
            assert_eq!(SPECS.iter().filter(|o| o.kind == s.kind).count(), 1);
            assert_eq!(ShapeKind::parse(s.name), Some(s.kind));
            assert_eq!(s.kind.spec().name, s.name);
            let first_optional = s.keys.iter().position(|k| k.default.is_some());
            if let Some(i) = first_optional {
                assert!(
                    s.keys[i..].iter().all(|k| k.default.is_some()),
                    "{}",
                    s.name
                );
            }
            for k in s.keys.iter().filter(|k| k.default.is_none()) {
                assert!(
                    k.new_mm > 0.0 && k.rule == Rule::Positive,
                    "{}.{}",
                    s.name,
                    k.key
                );
            }
            assert_eq!(s.points, s.keys.is_empty(), "{}", s.name);
            assert_eq!(s.points, s.new_points_mm.len() >= 3, "{}", s.name);
        }
    }
}
