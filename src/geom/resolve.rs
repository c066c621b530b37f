//! From a document as written to numbers: params and expressions evaluated, units
//! applied, dimensions checked, parts placed.
//!
//! Lengths of the section stay in the file's unit; forces, moments, stresses and the
//! member's lengths are converted to SI base units (N, N·m, Pa, m) here, the member's
//! lengths written as bare numbers by [`LengthUnit::to_si`] (see [`crate::model::units`]).

use super::{Piece, Placement, Pt, Shape};
use crate::model::diag::Diagnostic;
use crate::model::document::{Document, PartDoc, StringMaps, Val, Value};
use crate::model::expr::{resolve_params, Expr, ExprError};
use crate::model::schema::{Dims, KeySpec, Rule};
use crate::model::units::{parse_quantity, Dim, Kind, LengthUnit, Quantity};
use std::cell::RefCell;
use std::collections::{BTreeMap, BTreeSet};
use std::sync::Arc;

/// A material with SI values: `e`, `fy` and `g` in Pa, `density` in kg/m³.
#[derive(Debug, Clone, PartialEq)]
pub struct Material {
    pub name: String,
    pub e: f64,
    pub fy: Option<f64>,
    pub density: Option<f64>,
    /// Shear modulus: as given, or `E/(2(1 + ν))` (docs/format.md "Materials").
    pub g: f64,
    /// Where `g` comes from.
    pub g_source: ShearModulus,
}

/// Poisson's ratio assumed when a material gives neither `G` nor `nu` (common practice
/// for structural steel; no source).
pub const DEFAULT_NU: f64 = 0.3;

/// How a material's shear modulus was found.
#[derive(Debug, Clone, Copy, PartialEq)]
pub enum ShearModulus {
    /// `G` written in the file (with `nu` too, when they agree).
    Given,
    /// `E/(2(1 + ν))` with the `nu` written in the file.
    FromNu(f64),
    /// `E/(2(1 + ν))` with ν = [`DEFAULT_NU`].
    DefaultNu,
}

/// Where transverse loads act, for the elastic critical moment.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum LoadHeight {
    ShearCentre,
    Top,
    Bottom,
}

/// The names of `load_height`.
pub const LOAD_HEIGHTS: [(&str, LoadHeight); 3] = [
    ("shear_centre", LoadHeight::ShearCentre),
    ("top", LoadHeight::Top),
    ("bottom", LoadHeight::Bottom),
];

/// A part with its shape and placement in numbers.
#[derive(Debug, Clone, PartialEq)]
pub struct Part {
    pub name: String,
    pub shape: Shape,
    pub placement: Placement,
    pub void: bool,
    /// A local void (FORMAT.md "Gross and net"); `hole` implies `void`.
    pub hole: bool,
    pub enabled: bool,
    pub material: Option<usize>,
}

/// `[actions]` in SI (N, N·m): the one actions type, the stress code's own.
pub use crate::model::loads::Actions;
use crate::model::loads::Support;

/// The single-span member, SI: lengths in m, loads in N and N/m.
#[derive(Debug, Clone, PartialEq)]
pub struct Member {
    pub length: f64,
    pub support: Support,
    pub udl: f64,
    /// `(P, a)`: force and its distance from the left support (cantilever: fixed end).
    pub points: Vec<(f64, f64)>,
    pub deflection_limit: f64,
    pub self_weight: bool,
    /// Add the shear deformation (Timoshenko) to the deflection.
    pub shear_deformation: bool,
    /// Moment-gradient factor for Mcr (1 for uniform moment, the default).
    pub c1: f64,
    pub load_height: LoadHeight,
}

/// A section in numbers.
#[derive(Debug, Clone, PartialEq)]
pub struct Resolved {
    pub title: Option<String>,
    pub units: LengthUnit,
    pub params: BTreeMap<String, f64>,
    pub materials: Vec<Material>,
    pub parts: Vec<Part>,
    pub actions: Option<Actions>,
    pub member: Option<Member>,
}

/// The support names of `[member]`.
pub const SUPPORTS: [(&str, Support); 4] = [
    ("simple", Support::Simple),
    ("cantilever", Support::Cantilever),
    ("fixed", Support::Fixed),
    ("propped", Support::Propped),
];

/// Turns an expression error inside a string value into a diagnostic where the
/// offending character stands in the file: through `maps` for strings with escapes or
/// line breaks, otherwise one past the opening quote.
fn expr_diag(v: &Val, maps: &StringMaps, e: ExprError, key: &str) -> Diagnostic {
    let (from_value, from_file) = maps
        .iter()
        .find(|(start, _)| *start == v.span.start)
        .and_then(|(_, m)| m.iter().rev().find(|(at, _)| *at <= e.offset).copied())
        .unwrap_or((0, v.span.start + 1));
    let at =
        (from_file + (e.offset - from_value)).min(v.span.end.saturating_sub(1).max(v.span.start));
    Diagnostic::new(at..at + 1, format!("`{key}`: {}", e.message))
}

struct Ctx<'a> {
    params: &'a BTreeMap<String, f64>,
    maps: &'a StringMaps,
    /// Where to note every param read and expression parsed ([`Varying::new`]).
    notes: Option<&'a RefCell<Notes>>,
    /// Expressions parsed before, by where their value starts ([`Varying`]).
    parsed: Option<&'a Parsed>,
    /// The expressions evaluated so far by their text, at most [`MEMO`] of them, when
    /// no notes are taken: with the params fixed, a text the file repeats (`d/2 + 15`
    /// for a pair of holes) has one value, or one error for [`expr_diag`] to place at
    /// each use.
    memo: RefCell<Vec<(String, Result<f64, ExprError>)>>,
}

/// The most expression texts a [`Ctx`] remembers the value of (a short list to search).
const MEMO: usize = 16;

impl Ctx<'_> {
    /// The finite value of the param `s` names alone ([`Expr::lone_name`]), unless
    /// notes are taken (they record every param read).
    fn lone_param(&self, s: &str) -> Option<f64> {
        let name = Expr::lone_name(s).filter(|_| self.notes.is_none())?;
        self.params.get(name).copied().filter(|x| x.is_finite())
    }

    /// The value of expression `s`, whose value starts at byte `start` of the file,
    /// from [`Ctx::memo`] when it holds the text.
    fn remembered(&self, s: &str, start: usize) -> Result<f64, ExprError> {
        if self.notes.is_some() {
            return self.evaluate(s, start);
        }
        if let Some((_, r)) = self.memo.borrow().iter().find(|(t, _)| *t == s) {
            return r.clone();
        }
        let r = self.evaluate(s, start);
        let mut memo = self.memo.borrow_mut();
        if memo.len() < MEMO {
            memo.push((s.to_string(), r.clone()));
        }
        r
    }

    /// The value of expression `s` (starting at byte `start`), parsed unless
    /// [`Ctx::parsed`] holds it, noting what it parses and reads when notes are taken.
    fn evaluate(&self, s: &str, start: usize) -> Result<f64, ExprError> {
        let before = (self.parsed)
            .and_then(|p| p.get(&start))
            .filter(|(text, _)| text == s);
        let parsed;
        let e = match before {
            Some((_, e)) => e,
            None => {
                parsed = Expr::parse(s)?;
                if let Some(n) = self.notes {
                    let entry = (start, s.to_string(), parsed.clone());
                    n.borrow_mut().parsed.push(entry);
                }
                &parsed
            }
        };
        e.eval(&|n| {
            if let Some(notes) = self.notes {
                notes.borrow_mut().read.push(n.to_owned());
            }
            self.params.get(n).copied()
        })
    }

    /// A length or plain number in the file's unit.
    fn number(&self, v: &Val, key: &str) -> Result<f64, Diagnostic> {
        let x = match &v.value {
            Value::Number(x) => *x,
            // A lone param name (most values of a parametric file) is the param's
            // value, looked up without parsing; when it is not a param, or notes are
            // taken, the expression is parsed and its error is the parser's.
            Value::Expr(s) => match self.lone_param(s) {
                Some(x) => x,
                None => (self.remembered(s, v.span.start))
                    .map_err(|e| expr_diag(v, self.maps, e, key))?,
            },
        };
        if x.is_finite() {
            Ok(x)
        } else {
            Err(Diagnostic::new(
                v.span.clone(),
                format!("`{key}` is not a finite number; write an ordinary number such as 12.5"),
            ))
        }
    }

    fn positive(&self, v: &Val, key: &str) -> Result<f64, Diagnostic> {
        let x = self.number(v, key)?;
        if x > 0.0 {
            Ok(x)
        } else {
            Err(Diagnostic::new(
                v.span.clone(),
                format!("`{key}` must be greater than 0, but it is {x}"),
            ))
        }
    }

    /// A quantity with a unit, in SI. `file_unit` lets a bare number stand for a
    /// length in the file's unit.
    fn quantity(
        &self,
        v: &Val,
        key: &str,
        kind: Kind,
        file_unit: Option<LengthUnit>,
    ) -> Result<f64, Diagnostic> {
        let bare = |x: f64| match file_unit {
            Some(u) => Ok(u.to_si(x, Dim::Length)),
            None => {
                let [metric, us] = kind.examples();
                Err(Diagnostic::new(
                    v.span.clone(),
                    format!("`{key}` needs a unit, e.g. \"{metric}\" or \"{us}\""),
                ))
            }
        };
        let x = match &v.value {
            Value::Number(x) => bare(*x)?,
            Value::Expr(s) => match parse_quantity(s, kind) {
                Ok(Quantity::Si(x)) => x,
                Ok(Quantity::Bare(x)) => bare(x)?,
                Err(e) => {
                    // A length may also be an expression of params, in the file's unit.
                    match file_unit {
                        Some(u) => u.to_si(self.number(v, key)?, Dim::Length),
                        None => return Err(expr_diag(v, self.maps, e, key)),
                    }
                }
            },
        };
        let (low, high, sensible) = range(kind);
        if !x.is_finite() {
            Err(Diagnostic::new(
                v.span.clone(),
                format!("`{key}` is not a finite number; {sensible}"),
            ))
        } else if x.abs() > high || (x != 0.0 && x.abs() < low) {
            Err(Diagnostic::new(
                v.span.clone(),
                format!(
                    "`{key}` = {} is out of range: {sensible}; check the unit and the exponent",
                    written(&v.value)
                ),
            ))
        } else {
            Ok(x)
        }
    }
}

/// A value as a message quotes it: an expression as written, a large or small number
/// in exponent form (`1e300`, not 301 digits).
fn written(v: &Value) -> String {
    match v {
        Value::Number(x) if x.abs() >= 1e6 || (*x != 0.0 && x.abs() < 1e-4) => format!("{x:e}"),
        v => v.text(),
    }
}

/// The magnitudes (SI) a quantity of `kind` may have, and the sentence that says so.
///
/// The bounds are far outside anything built (common practice, chosen here, no
/// source): they exist so that the products the checks form (M·c/I, w·L⁴/(E·I),
/// π²·E·I/L², ρ·A·g) stay finite in double precision (about 1.8e308), and a value
/// written with a wrong unit or exponent is refused at its key instead of silently
/// turning a result into nothing.
fn range(kind: Kind) -> (f64, f64, &'static str) {
    match kind {
        Kind::Length => (
            1e-6,
            1e5,
            "a length between 1 µm and 100 km is sensible (e.g. \"6 m\")",
        ),
        Kind::Stress => (
            1e3,
            1e13,
            "a stress or modulus between 1 kPa and 10 000 GPa is sensible (steel: E = \"200 GPa\")",
        ),
        Kind::Density => (
            1e-2,
            1e5,
            "a density between 0.01 and 100 000 kg/m3 is sensible (steel: \"7850 kg/m3\")",
        ),
        Kind::Force => (
            0.0,
            1e12,
            "a force up to 1e9 kN is sensible (e.g. \"30 kN\")",
        ),
        Kind::Moment => (
            0.0,
            1e13,
            "a moment up to 1e10 kN*m is sensible (e.g. \"85 kN*m\")",
        ),
        Kind::LineLoad => (
            0.0,
            1e12,
            "a line load up to 1e9 kN/m is sensible (e.g. \"15 kN/m\")",
        ),
    }
}
impl Resolved {
    /// Evaluates every value of the document; the first problem found is returned.
    pub fn resolve(doc: &Document) -> Result<Resolved, Diagnostic> {
        Resolved::resolve_keeping(doc, None)
    }

    /// [`Resolved::resolve`] of `doc`, the document `varying` was made from with only
    /// its param changed, evaluating again only what that param reaches and taking the
    /// rest as `varying` found it: the same section and the same first problem, bit
    /// for bit. A document of another layout (other counts of materials or parts, no
    /// such param) is resolved whole.
    pub fn resolve_varying(doc: &Document, varying: &Varying) -> Result<Resolved, Diagnostic> {
        Resolved::resolve_keeping(doc, varying.fits(doc).then_some(varying))
    }

    /// The resolution, in file order (params, materials, parts, `[actions]`,
    /// `[member]`), each item taken from `keep` where it holds one.
    fn resolve_keeping(doc: &Document, keep: Option<&Varying>) -> Result<Resolved, Diagnostic> {
        let params = resolve_doc_params(doc)?;
        let ctx = Ctx {
            params: &params,
            maps: &doc.string_maps,
            notes: None,
            parsed: keep.map(|k| &*k.parsed),
            memo: RefCell::new(Vec::new()),
        };
        let materials = (doc.materials.iter().enumerate())
            .map(|(i, m)| {
                let kept = keep.and_then(|k| k.materials.get(i));
                or_again(kept, || resolve_material(&ctx, m))
            })
            .collect::<Result<Vec<_>, Diagnostic>>()?;
        let parts = (doc.parts.iter().enumerate())
            .map(|(i, p)| {
                let kept = keep.and_then(|k| k.parts.get(i));
                or_again(kept, || resolve_part(&ctx, doc, i, p))
            })
            .collect::<Result<Vec<_>, Diagnostic>>()?;
        let actions = or_again(keep.map(|k| &k.actions), || {
            (doc.actions.as_ref())
                .map(|a| resolve_actions(&ctx, a))
                .transpose()
        })?;
        let member = or_again(keep.map(|k| &k.member), || {
            (doc.member.as_ref())
                .map(|m| resolve_member(&ctx, doc.units, m))
                .transpose()
        })?;
        Ok(Resolved {
            title: doc.title.clone(),
            units: doc.units,
            params,
            materials,
            parts,
            actions,
            member,
        })
    }

    /// The enabled parts placed in the section frame, with their weights: modular
    /// ratio `n = E/E_ref` (the first material is the reference), the shear modulus
    /// ratio `G/G_ref` for torsion (FORMAT.md "Materials") and, for the plastic
    /// properties, `fy/fy_ref` when every material in use gives `fy` (otherwise `n`).
    pub fn pieces(&self) -> Vec<Piece> {
        let e_ref = self.materials.first().map_or(1.0, |m| m.e);
        let g_ref = self.materials.first().map_or(1.0, |m| m.g);
        let used: Vec<&Material> = self
            .parts
            .iter()
            .filter(|p| p.enabled)
            .filter_map(|p| p.material.and_then(|i| self.materials.get(i)))
            .collect();
        let by_strength = !used.is_empty() && used.iter().all(|m| m.fy.is_some());
        let fy_ref = self
            .materials
            .first()
            .and_then(|m| m.fy)
            .or_else(|| used.first().and_then(|m| m.fy))
            .unwrap_or(1.0);
        self.parts
            .iter()
            .enumerate()
            .filter(|(_, p)| p.enabled)
            .map(|(i, p)| {
                let mat = p.material.and_then(|m| self.materials.get(m));
                let n = mat.map_or(1.0, |m| m.e / e_ref);
                let g = mat.map_or(1.0, |m| m.g / g_ref);
                let strength = match mat.and_then(|m| m.fy) {
                    Some(fy) if by_strength => fy / fy_ref,
                    _ => n,
                };
                Piece {
                    part: i,
                    name: p.name.clone(),
                    contours: p.placement.place(p.shape.contours()),
                    void: p.void,
                    n,
                    g,
                    strength,
                    density: mat.and_then(|m| m.density),
                    material: p.material,
                }
            })
            .collect()
    }
}

/// What resolving a document again with one param changed can keep: each material,
/// part, `[actions]` and `[member]` whose values read no param that depends on that
/// one (the param itself, and every param whose expression names one of those), with
/// its result as resolved once; and, for the items evaluated again, their expressions
/// as parsed once. Which params an item reads is noted while resolving it: its result
/// is a function of those values alone, so an item that reads none of the varied ones
/// resolves the same at any value of the param.
#[derive(Debug, Clone)]
pub struct Varying {
    /// Index of the param in `Document::params`.
    param: usize,
    /// Per item, `Some(result)` to keep, `None` to evaluate again.
    materials: Vec<Option<Result<Material, Diagnostic>>>,
    parts: Vec<Option<Result<Part, Diagnostic>>>,
    actions: Option<Result<Option<Actions>, Diagnostic>>,
    member: Option<Result<Option<Member>, Diagnostic>>,
    /// Every expression of the items that parsed, by where its value starts in the
    /// file, with its text (an entry is used only for the same text).
    parsed: Arc<Parsed>,
}

/// Parsed expressions by the start of their value's span, with their text.
type Parsed = BTreeMap<usize, (String, Expr)>;

/// What resolving noted: the params read and the expressions parsed.
#[derive(Debug, Default)]
struct Notes {
    read: Vec<String>,
    parsed: Vec<(usize, String, Expr)>,
}

/// One item resolved, with the names of the params it read.
struct Noted<T> {
    result: Result<T, Diagnostic>,
    read: Vec<String>,
}

impl<T: Clone> Noted<T> {
    /// The result to keep, unless the item read a param that moves.
    fn kept(&self, moved: &BTreeSet<String>) -> Option<Result<T, Diagnostic>> {
        let touched = self.read.iter().any(|r| moved.contains(r));
        (!touched).then(|| self.result.clone())
    }
}

/// Every item of a document resolved once, noted.
struct Items {
    materials: Vec<Noted<Material>>,
    parts: Vec<Noted<Part>>,
    actions: Noted<Option<Actions>>,
    member: Noted<Option<Member>>,
    parsed: Arc<Parsed>,
}

/// A document resolved once, noting the params each item reads, and the params each
/// param's expression names: what the [`Varying`] of each of its params is made from.
pub struct Resolution {
    /// `None` when the params do not resolve.
    items: Option<Items>,
    /// Per param, the names its expression uses (`None`: it does not parse).
    uses: Vec<Option<Vec<String>>>,
    /// By name, the params whose expression uses it.
    users: BTreeMap<String, Vec<usize>>,
}

impl Resolution {
    /// The resolution of `doc`, noted.
    pub fn new(doc: &Document) -> Resolution {
        let uses = (doc.params.iter())
            .map(|(_, _, v)| match &v.value {
                Value::Number(_) => Some(Vec::new()),
                Value::Expr(s) => Expr::parse(s).ok().map(|e| e.names()),
            })
            .collect::<Vec<Option<Vec<String>>>>();
        let mut users: BTreeMap<String, Vec<usize>> = BTreeMap::new();
        for (j, names) in uses.iter().enumerate() {
            for n in names.iter().flatten() {
                users.entry(n.clone()).or_default().push(j);
            }
        }
        Resolution {
            items: Items::of(doc),
            uses,
            users,
        }
    }

    /// The names of param `param` of `doc` and of every param that depends on it, in
    /// any number of steps; `None` when there is no such param. A param whose
    /// expression does not parse counts as depending on it (it fails at every value).
    fn dependents(&self, doc: &Document, param: usize) -> Option<BTreeSet<String>> {
        let start = &doc.params.get(param)?.0;
        let mut moved: BTreeSet<String> = (self.uses.iter().zip(&doc.params))
            .filter(|(u, _)| u.is_none())
            .map(|(_, p)| p.0.clone())
            .collect();
        moved.insert(start.clone());
        let mut todo: Vec<String> = moved.iter().cloned().collect();
        while let Some(n) = todo.pop() {
            for &j in self.users.get(n.as_str()).into_iter().flatten() {
                let Some((name, _, _)) = doc.params.get(j) else {
                    continue;
                };
                if moved.insert(name.clone()) {
                    todo.push(name.clone());
                }
            }
        }
        Some(moved)
    }
}

impl Items {
    /// The items resolved with the document's own params; `None` when they do not
    /// resolve.
    fn of(doc: &Document) -> Option<Items> {
        let params = resolve_doc_params(doc).ok()?;
        let notes = RefCell::new(Notes::default());
        let ctx = Ctx {
            params: &params,
            maps: &doc.string_maps,
            notes: Some(&notes),
            parsed: None,
            memo: RefCell::new(Vec::new()),
        };
        // The params read since the last call.
        let read = || std::mem::take(&mut notes.borrow_mut().read);
        let materials = (doc.materials.iter())
            .map(|m| {
                let result = resolve_material(&ctx, m);
                Noted {
                    result,
                    read: read(),
                }
            })
            .collect();
        let parts = (doc.parts.iter().enumerate())
            .map(|(i, p)| {
                let result = resolve_part(&ctx, doc, i, p);
                Noted {
                    result,
                    read: read(),
                }
            })
            .collect();
        let result = (doc.actions.as_ref())
            .map(|a| resolve_actions(&ctx, a))
            .transpose();
        let actions = Noted {
            result,
            read: read(),
        };
        let result = (doc.member.as_ref())
            .map(|m| resolve_member(&ctx, doc.units, m))
            .transpose();
        let member = Noted {
            result,
            read: read(),
        };
        let parsed = (notes.into_inner().parsed.into_iter())
            .map(|(at, text, e)| (at, (text, e)))
            .collect();
        Some(Items {
            materials,
            parts,
            actions,
            member,
            parsed: Arc::new(parsed),
        })
    }
}

impl Varying {
    /// What `doc` keeps when param `param` (an index in `doc.params`) varies; nothing
    /// when its params do not resolve.
    pub fn new(doc: &Document, param: usize) -> Varying {
        Varying::of(&Resolution::new(doc), doc, param)
    }

    /// [`Varying::new`] from the resolution `r` of `doc`, made once for all its params.
    pub fn of(r: &Resolution, doc: &Document, param: usize) -> Varying {
        let nothing = Varying {
            param,
            materials: vec![None; doc.materials.len()],
            parts: vec![None; doc.parts.len()],
            actions: None,
            member: None,
            parsed: Arc::default(),
        };
        let (Some(items), Some(moved)) = (&r.items, r.dependents(doc, param)) else {
            return nothing;
        };
        Varying {
            materials: items.materials.iter().map(|n| n.kept(&moved)).collect(),
            parts: items.parts.iter().map(|n| n.kept(&moved)).collect(),
            actions: items.actions.kept(&moved),
            member: items.member.kept(&moved),
            parsed: Arc::clone(&items.parsed),
            ..nothing
        }
    }

    /// The index of the varied param in `Document::params`.
    pub fn param(&self) -> usize {
        self.param
    }

    /// Whether `doc` has the layout this was made from.
    fn fits(&self, doc: &Document) -> bool {
        self.param < doc.params.len()
            && self.materials.len() == doc.materials.len()
            && self.parts.len() == doc.parts.len()
    }

    /// Whether part `i` is resolved again at each value (it reads a varied param).
    pub fn part_moves(&self, i: usize) -> bool {
        self.parts.get(i).is_none_or(Option::is_none)
    }
}

/// The kept result, or `again()` when there is none.
fn or_again<T: Clone>(
    kept: Option<&Option<Result<T, Diagnostic>>>,
    again: impl FnOnce() -> Result<T, Diagnostic>,
) -> Result<T, Diagnostic> {
    match kept {
        Some(Some(r)) => r.clone(),
        _ => again(),
    }
}

fn resolve_material(
    ctx: &Ctx,
    m: &crate::model::document::MaterialDoc,
) -> Result<Material, Diagnostic> {
    let e = m.e.as_ref().ok_or_else(|| {
        Diagnostic::new(
            m.span.clone(),
            format!("material `{}` needs `E`, e.g. E = \"200 GPa\"", m.name),
        )
    })?;
    let e = positive_q(ctx, e, "E", Kind::Stress)?;
    let fy =
        m.fy.as_ref()
            .map(|v| positive_q(ctx, v, "fy", Kind::Stress))
            .transpose()?;
    let density = m
        .density
        .as_ref()
        .map(|v| positive_q(ctx, v, "density", Kind::Density))
        .transpose()?;
    let (g, g_source) = shear_modulus(ctx, m, e)?;
    Ok(Material {
        name: m.name.clone(),
        e,
        fy,
        density,
        g,
        g_source,
    })
}

fn resolve_actions(
    ctx: &Ctx,
    a: &crate::model::document::ActionsDoc,
) -> Result<Actions, Diagnostic> {
    let q = |v: &Option<Val>, k: &str, kind| {
        v.as_ref()
            .map_or(Ok(0.0), |v| ctx.quantity(v, k, kind, None))
    };
    let some = |v: &Option<Val>, k: &str, kind| {
        v.as_ref()
            .map(|v| ctx.quantity(v, k, kind, None))
            .transpose()
    };
    Ok(Actions {
        n: q(&a.n, "N", Kind::Force)?,
        mx: q(&a.mx, "Mx", Kind::Moment)?,
        my: q(&a.my, "My", Kind::Moment)?,
        vx: some(&a.vx, "Vx", Kind::Force)?,
        vy: some(&a.vy, "Vy", Kind::Force)?,
        t: some(&a.t, "T", Kind::Moment)?,
    })
}

fn positive_q(ctx: &Ctx, v: &Val, key: &str, kind: Kind) -> Result<f64, Diagnostic> {
    let x = ctx.quantity(v, key, kind, None)?;
    if x > 0.0 {
        Ok(x)
    } else {
        Err(Diagnostic::new(
            v.span.clone(),
            format!("`{key}` must be greater than 0"),
        ))
    }
}

fn resolve_doc_params(doc: &Document) -> Result<BTreeMap<String, f64>, Diagnostic> {
    let list: Vec<(String, Value)> = doc
        .params
        .iter()
        .map(|(k, _, v)| (k.clone(), v.value.clone()))
        .collect();
    resolve_params(&list).map_err(|(i, e)| match doc.params.get(i) {
        Some((k, _, v)) => expr_diag(v, &doc.string_maps, e, &format!("params.{k}")),
        None => Diagnostic::new(0..1, e.message),
    })
}

/// A dimension's value under its rule ([`Rule`]).
fn ruled(ctx: &Ctx, v: &Val, k: &KeySpec) -> Result<f64, Diagnostic> {
    match k.rule {
        Rule::Positive => ctx.positive(v, k.key),
        Rule::Any => ctx.number(v, k.key),
        Rule::NonNegative => {
            let x = ctx.number(v, k.key)?;
            if x < 0.0 {
                return Err(Diagnostic::new(
                    v.span.clone(),
                    format!("`{}` cannot be negative; use 0 for none", k.key),
                ));
            }
            Ok(x)
        }
    }
}

fn resolve_part(ctx: &Ctx, doc: &Document, i: usize, p: &PartDoc) -> Result<Part, Diagnostic> {
    let name = p.name.clone().unwrap_or_else(|| format!("part {}", i + 1));
    let kind = p.shape;
    let keys = kind.spec().keys;
    let mut values: Vec<(&'static str, f64)> = Vec::with_capacity(keys.len());
    for k in keys {
        let x = match (p.dim(k.key), k.default) {
            (None, Some(default)) => default,
            (None, None) => {
                let required: Vec<&str> = kind.required().collect();
                return Err(Diagnostic::new(
                    p.span.clone(),
                    format!(
                        "part `{name}` ({kind}) needs `{}`; its dimensions are {}",
                        k.key,
                        required.join(", ")
                    ),
                ));
            }
            (Some(v), _) => ruled(ctx, v, k)?,
        };
        values.push((k.key, x));
    }
    let points = match &p.points {
        Some(pts) => pts
            .iter()
            .map(|[x, y]| Ok(Pt::new(ctx.number(x, "points")?, ctx.number(y, "points")?)))
            .collect::<Result<Vec<_>, Diagnostic>>()?,
        None if kind.has_points() => {
            return Err(Diagnostic::new(
                p.span.clone(),
                format!("polygon `{name}` needs `points = [[x, y], ...]` with 3 or more points"),
            ))
        }
        None => Vec::new(),
    };
    let shape = Shape::build(kind, &Dims(values), points).map_err(|(key, msg)| {
        let span = match key.as_str() {
            "points" => p.points_span.clone(),
            k => p.dim(k).map_or(p.span.clone(), |v| v.span.clone()),
        };
        Diagnostic::new(span, format!("part `{name}`: {msg}"))
    })?;
    let at = match &p.at {
        Some([x, y]) => Pt::new(ctx.number(x, "at")?, ctx.number(y, "at")?),
        None => Pt::default(),
    };
    let anchor = p.anchor.unwrap_or(kind.default_anchor());
    let rotate = p
        .rotate
        .as_ref()
        .map_or(Ok(0.0), |v| ctx.number(v, "rotate"))?;
    let material = match &p.material {
        Some((m, span)) => Some(doc.materials.iter().position(|x| &x.name == m).ok_or_else(|| {
            let names: Vec<&str> = doc.materials.iter().map(|x| x.name.as_str()).collect();
            Diagnostic::new(
                span.clone(),
                if names.is_empty() {
                    format!("material `{m}` is not defined; add a [[materials]] entry named \"{m}\"")
                } else {
                    format!("material `{m}` is not defined; defined: {}", names.join(", "))
                },
            )
        })?),
        None => (!doc.materials.is_empty()).then_some(0),
    };
    Ok(Part {
        name,
        shape,
        placement: Placement {
            at,
            anchor,
            rotate,
            flip_x: p.flip_x,
            flip_y: p.flip_y,
        },
        void: p.void,
        hole: p.hole,
        enabled: p.enabled,
        material,
    })
}

/// `G` of a material from `G` or `nu` (docs/format.md "Materials"): G as written, else
/// `E/(2(1 + ν))` with the written ν in [0, 0.5) or ν = 0.3; both written must agree to a
/// relative 1e-6.
fn shear_modulus(
    ctx: &Ctx,
    m: &crate::model::document::MaterialDoc,
    e: f64,
) -> Result<(f64, ShearModulus), Diagnostic> {
    let nu = match &m.nu {
        Some(v) => {
            let nu = ctx.number(v, "nu")?;
            if !(0.0..0.5).contains(&nu) {
                return Err(Diagnostic::new(
                    v.span.clone(),
                    format!("`nu` (Poisson's ratio) must be at least 0 and less than 0.5, but it is {nu}"),
                ));
            }
            Some(nu)
        }
        None => None,
    };
    let from_nu = |nu: f64| e / (2.0 * (1.0 + nu));
    match (&m.g, nu) {
        (Some(v), nu) => {
            let g = positive_q(ctx, v, "G", Kind::Stress)?;
            if let Some(nu) = nu {
                let implied = from_nu(nu);
                if (g - implied).abs() > 1e-6 * g {
                    return Err(Diagnostic::new(
                        v.span.clone(),
                        format!(
                            "`G` and `nu` = {nu} disagree: G differs from E/(2(1 + nu)) by {:.3} %; give only one of them, or make them agree to 1e-6",
                            100.0 * (g - implied).abs() / implied
                        ),
                    ));
                }
            }
            Ok((g, ShearModulus::Given))
        }
        (None, Some(nu)) => Ok((from_nu(nu), ShearModulus::FromNu(nu))),
        (None, None) => Ok((from_nu(DEFAULT_NU), ShearModulus::DefaultNu)),
    }
}

fn resolve_member(
    ctx: &Ctx,
    unit: LengthUnit,
    m: &crate::model::document::MemberDoc,
) -> Result<Member, Diagnostic> {
    let length = ctx.quantity(&m.length, "span", Kind::Length, Some(unit))?;
    if length <= 0.0 {
        return Err(Diagnostic::new(
            m.length.span.clone(),
            "`span` must be greater than 0",
        ));
    }
    let support = SUPPORTS
        .iter()
        .find(|s| s.0 == m.support.0)
        .map(|s| s.1)
        .ok_or_else(|| {
            Diagnostic::new(
                m.support.1.clone(),
                format!(
                    "unknown support `{}`; use simple, cantilever, fixed or propped",
                    m.support.0
                ),
            )
        })?;
    let udl = m
        .udl
        .as_ref()
        .map_or(Ok(0.0), |v| ctx.quantity(v, "udl", Kind::LineLoad, None))?;
    let points = m
        .points
        .iter()
        .map(|pt| {
            let p = ctx.quantity(&pt.p, "P", Kind::Force, None)?;
            let a = ctx.quantity(&pt.a, "a", Kind::Length, Some(unit))?;
            if !(0.0..=length * (1.0 + 1e-12)).contains(&a) {
                return Err(Diagnostic::new(
                    pt.a.span.clone(),
                    "point load position `a` must lie on the span, from 0 to the span length",
                ));
            }
            Ok((p, a.min(length)))
        })
        .collect::<Result<Vec<_>, Diagnostic>>()?;
    let deflection_limit = match &m.deflection_limit {
        Some(v) => ctx.positive(v, "deflection_limit")?,
        None => 360.0,
    };
    let c1 = match &m.c1 {
        Some(v) => ctx.positive(v, "c1")?,
        None => 1.0,
    };
    let load_height = match &m.load_height {
        None => LoadHeight::ShearCentre,
        Some((name, span)) => LOAD_HEIGHTS
            .iter()
            .find(|h| h.0 == name)
            .map(|h| h.1)
            .ok_or_else(|| {
                Diagnostic::new(
                    span.clone(),
                    format!("unknown load_height `{name}`; use shear_centre, top or bottom"),
                )
            })?,
    };
    Ok(Member {
        length,
        support,
        udl,
        points,
        deflection_limit,
        self_weight: m.self_weight,
        shear_deformation: m.shear_deformation,
        c1,
        load_height,
    })
}
