//! A section file as written: every value keeps its text and where it stands, so
//! that errors can point at it and the workbench can show and edit it.

use super::anchor::Anchor;
use super::diag::Span;
use super::schema::ShapeKind;
use super::units::LengthUnit;

pub use super::expr::Value;

/// A value with its place in the file.
#[derive(Debug, Clone, PartialEq)]
pub struct Val {
    pub value: Value,
    pub span: Span,
}

/// `[[materials]]`: quantities are kept as written, with their units.
#[derive(Debug, Clone, PartialEq)]
pub struct MaterialDoc {
    pub name: String,
    pub span: Span,
    pub e: Option<Val>,
    pub fy: Option<Val>,
    pub density: Option<Val>,
    /// Shear modulus `G`, with a unit.
    pub g: Option<Val>,
    /// Poisson's ratio `nu`, a plain number.
    pub nu: Option<Val>,
}

/// `[[parts]]`.
#[derive(Debug, Clone, PartialEq)]
pub struct PartDoc {
    pub name: Option<String>,
    pub shape: ShapeKind,
    pub shape_span: Span,
    /// Dimension keys in file order (`b`, `h`, `tf`…), as the shape's schema spells them.
    pub dims: Vec<(&'static str, Val)>,
    /// `points` of a polygon.
    pub points: Option<Vec<[Val; 2]>>,
    pub points_span: Span,
    pub at: Option<[Val; 2]>,
    pub anchor: Option<Anchor>,
    pub rotate: Option<Val>,
    pub flip_x: bool,
    pub flip_y: bool,
    /// Subtracted everywhere, or (with `hole`) at some cross-sections only.
    pub void: bool,
    /// A local void (bolt hole, web opening): left out of the gross section,
    /// subtracted for the net one. `hole` implies `void`.
    pub hole: bool,
    pub enabled: bool,
    pub material: Option<(String, Span)>,
    /// The part's table in the file.
    pub span: Span,
}

impl PartDoc {
    /// The value of dimension `key`, if written.
    pub fn dim(&self, key: &str) -> Option<&Val> {
        self.dims.iter().find(|(k, _)| *k == key).map(|(_, v)| v)
    }
}

/// One point load of `[member]`.
#[derive(Debug, Clone, PartialEq)]
pub struct PointDoc {
    pub p: Val,
    pub a: Val,
}

/// `[member]`.
#[derive(Debug, Clone, PartialEq)]
pub struct MemberDoc {
    pub span: Span,
    pub length: Val,
    pub support: (String, Span),
    pub udl: Option<Val>,
    pub points: Vec<PointDoc>,
    pub deflection_limit: Option<Val>,
    pub self_weight: bool,
    /// Add the shear deformation (Timoshenko) to the deflection.
    pub shear_deformation: bool,
    /// Moment-gradient factor for Mcr.
    pub c1: Option<Val>,
    /// Where transverse loads act, for Mcr: `shear_centre`, `top` or `bottom`.
    pub load_height: Option<(String, Span)>,
}

/// `[actions]`.
#[derive(Debug, Clone, PartialEq)]
pub struct ActionsDoc {
    pub span: Span,
    pub n: Option<Val>,
    pub mx: Option<Val>,
    pub my: Option<Val>,
    pub vx: Option<Val>,
    pub vy: Option<Val>,
    pub t: Option<Val>,
}

/// `[limits]`: what `kern check` holds the section to, beyond utilization ≤ 1 and
/// no stress above fy (docs/format.md "Limits"). Values are kept as written; the
/// keys of `min` and `max` are dotted result keys of `kern calc --json`, checked
/// against the table of results where the limits are enforced.
#[derive(Debug, Clone, PartialEq)]
pub struct LimitsDoc {
    pub span: Span,
    /// The largest member utilization allowed (at most 1).
    pub utilization: Option<Val>,
    /// The member's deflection may be at most span / this.
    pub deflection_limit: Option<Val>,
    /// Lower bounds: (dotted result key, span of the key, bound).
    pub min: Vec<(String, Span, Val)>,
    /// Upper bounds, as `min`.
    pub max: Vec<(String, Span, Val)>,
}

/// `[sheet]`: the calculation sheet's header, each field as written (a string) with its
/// place in the file; a field not given is `None` and the sheet leaves a line to fill in.
#[derive(Debug, Clone, PartialEq, Default)]
pub struct SheetDoc {
    pub project: Option<(String, Span)>,
    /// The job number, as written (it may hold letters: "2026-014/B").
    pub job: Option<(String, Span)>,
    pub element: Option<(String, Span)>,
    pub by: Option<(String, Span)>,
    pub checked: Option<(String, Span)>,
    pub date: Option<(String, Span)>,
    pub revision: Option<(String, Span)>,
}

impl SheetDoc {
    /// The keys of `[sheet]` in the order the header shows them, with their labels and
    /// values.
    pub fn fields(&self) -> [(&'static str, Option<&str>); 7] {
        fn v(f: &Option<(String, Span)>) -> Option<&str> {
            f.as_ref().map(|(s, _)| s.as_str())
        }
        [
            ("Project", v(&self.project)),
            ("Job no.", v(&self.job)),
            ("Element", v(&self.element)),
            ("Revision", v(&self.revision)),
            ("By", v(&self.by)),
            ("Checked", v(&self.checked)),
            ("Date", v(&self.date)),
        ]
    }
}

/// Where the text of string values stands in the file, for each string whose value is
/// not simply the bytes between one pair of quotes (escapes such as `\t` or `\u00e9`,
/// multi-line strings): keyed by the start of the string's span, checkpoints
/// `(byte offset in the value, byte offset in the file)` from which both advance
/// together. Plain strings are not listed: their value starts one past the quote.
pub type StringMaps = Vec<(usize, Vec<(usize, usize)>)>;

/// A whole section file.
#[derive(Debug, Clone, PartialEq)]
pub struct Document {
    pub title: Option<String>,
    pub units: LengthUnit,
    pub units_span: Span,
    /// `[params]` in file order, with the span of each key.
    pub params: Vec<(String, Span, Val)>,
    pub materials: Vec<MaterialDoc>,
    pub parts: Vec<PartDoc>,
    pub actions: Option<ActionsDoc>,
    pub member: Option<MemberDoc>,
    /// `[limits]`, for `kern check`.
    pub limits: Option<LimitsDoc>,
    /// `[sheet]`, the calculation sheet's header (absent in older files).
    pub sheet: Option<SheetDoc>,
    /// Positions of the strings with escapes or line breaks, for error columns.
    pub string_maps: StringMaps,
}
