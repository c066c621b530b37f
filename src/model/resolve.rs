//! From a document as written to numbers: params and expressions evaluated, units
//! applied, dimensions checked, parts placed.
//!
//! Lengths of the section stay in the file's unit; forces, moments, stresses and the
//! member's lengths are converted to SI base units (N, N·m, Pa, m).

use super::diag::{Diagnostic, Span};
use super::document::{Document, PartDoc, Val, Value};
use super::expr::{resolve_params, Expr, ExprError, ParamValue};
use super::units::{parse_quantity, Kind, LengthUnit, Quantity};
use crate::checks::member::Support;
use crate::geom::{Anchor, Piece, Placement, Pt, Shape};
use std::collections::BTreeMap;

/// A material with SI values: `e` and `fy` in Pa, `density` in kg/m³.
#[derive(Debug, Clone, PartialEq)]
pub struct Material {
    pub name: String,
    pub e: f64,
    pub fy: Option<f64>,
    pub density: Option<f64>,
}

/// A part with its shape and placement in numbers.
#[derive(Debug, Clone, PartialEq)]
pub struct Part {
    pub name: String,
    pub shape: Shape,
    pub placement: Placement,
    pub void: bool,
    pub enabled: bool,
    pub material: Option<usize>,
}

/// Internal forces in N and N·m (tension positive; positive `mx` compresses +y fibres,
/// positive `my` compresses +x fibres).
#[derive(Debug, Clone, Copy, PartialEq, Default)]
pub struct Actions {
    pub n: f64,
    pub mx: f64,
    pub my: f64,
    /// Shear forces along +x and +y, N, when given.
    pub vx: Option<f64>,
    pub vy: Option<f64>,
    /// Torque about the member axis, N·m, counter-clockwise seen from +z, when given.
    pub t: Option<f64>,
}

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

/// Turns an expression error inside a string value into a diagnostic at the right
/// column (one past the opening quote).
fn expr_diag(v: &Val, e: ExprError, key: &str) -> Diagnostic {
    let at = (v.span.start + 1 + e.offset).min(v.span.end.saturating_sub(1).max(v.span.start));
    Diagnostic::new(at..at + 1, format!("`{key}`: {}", e.message))
}

struct Ctx<'a> {
    params: &'a BTreeMap<String, f64>,
}

impl Ctx<'_> {
    /// A length or plain number in the file's unit.
    fn number(&self, v: &Val, key: &str) -> Result<f64, Diagnostic> {
        let x = match &v.value {
            Value::Number(x) => *x,
            Value::Expr(s) => {
                let e = Expr::parse(s).map_err(|e| expr_diag(v, e, key))?;
                e.eval(&|n| self.params.get(n).copied())
                    .map_err(|e| expr_diag(v, e, key))?
            }
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
            Some(u) => Ok(x * u.metres()),
            None => Err(Diagnostic::new(
                v.span.clone(),
                format!("`{key}` needs a unit, e.g. {}", example(kind)),
            )),
        };
        let x = match &v.value {
            Value::Number(x) => bare(*x)?,
            Value::Expr(s) => match parse_quantity(s, kind) {
                Ok(Quantity::Si(x)) => x,
                Ok(Quantity::Bare(x)) => bare(x)?,
                Err(e) => {
                    // A length may also be an expression of params, in the file's unit.
                    match file_unit {
                        Some(u) => self.number(v, key)? * u.metres(),
                        None => {
                            return Err(expr_diag(
                                v,
                                ExprError {
                                    message: e.message,
                                    offset: e.offset,
                                },
                                key,
                            ))
                        }
                    }
                }
            },
        };
        if x.is_finite() {
            Ok(x)
        } else {
            Err(Diagnostic::new(
                v.span.clone(),
                format!("`{key}` is not finite"),
            ))
        }
    }
}

fn example(kind: Kind) -> &'static str {
    match kind {
        Kind::Length => "\"6 m\"",
        Kind::Stress => "\"355 MPa\" or \"50 ksi\"",
        Kind::Density => "\"7850 kg/m3\" or \"490 lb/ft3\"",
        Kind::Force => "\"30 kN\" or \"6.5 kip\"",
        Kind::Moment => "\"85 kN*m\" or \"60 kip*ft\"",
        Kind::LineLoad => "\"15 kN/m\" or \"1.2 kip/ft\"",
    }
}

impl Resolved {
    /// Evaluates every value of the document; the first problem found is returned.
    pub fn resolve(doc: &Document) -> Result<Resolved, Diagnostic> {
        let params = resolve_doc_params(doc)?;
        let ctx = Ctx { params: &params };
        let materials = doc
            .materials
            .iter()
            .map(|m| {
                let e = m.e.as_ref().ok_or_else(|| {
                    Diagnostic::new(
                        m.span.clone(),
                        format!("material `{}` needs `E`, e.g. E = \"200 GPa\"", m.name),
                    )
                })?;
                let e = positive_q(&ctx, e, "E", Kind::Stress)?;
                let fy =
                    m.fy.as_ref()
                        .map(|v| positive_q(&ctx, v, "fy", Kind::Stress))
                        .transpose()?;
                let density = m
                    .density
                    .as_ref()
                    .map(|v| positive_q(&ctx, v, "density", Kind::Density))
                    .transpose()?;
                Ok(Material {
                    name: m.name.clone(),
                    e,
                    fy,
                    density,
                })
            })
            .collect::<Result<Vec<_>, Diagnostic>>()?;
        let parts = doc
            .parts
            .iter()
            .enumerate()
            .map(|(i, p)| resolve_part(&ctx, doc, i, p))
            .collect::<Result<Vec<_>, Diagnostic>>()?;
        let actions = doc
            .actions
            .as_ref()
            .map(|a| -> Result<Actions, Diagnostic> {
                let q = |v: &Option<Val>, k: &str, kind| {
                    v.as_ref()
                        .map_or(Ok(0.0), |v| ctx.quantity(v, k, kind, None))
                };
                Ok(Actions {
                    n: q(&a.n, "N", Kind::Force)?,
                    mx: q(&a.mx, "Mx", Kind::Moment)?,
                    my: q(&a.my, "My", Kind::Moment)?,
                    vx: a
                        .vx
                        .as_ref()
                        .map(|v| ctx.quantity(v, "Vx", Kind::Force, None))
                        .transpose()?,
                    vy: a
                        .vy
                        .as_ref()
                        .map(|v| ctx.quantity(v, "Vy", Kind::Force, None))
                        .transpose()?,
                    t: a.t
                        .as_ref()
                        .map(|v| ctx.quantity(v, "T", Kind::Moment, None))
                        .transpose()?,
                })
            })
            .transpose()?;
        let member = doc
            .member
            .as_ref()
            .map(|m| resolve_member(&ctx, doc.units, m))
            .transpose()?;
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
    /// ratio `n = E/E_ref` (the first material is the reference) and, for the plastic
    /// properties, `fy/fy_ref` when every material in use gives `fy` (otherwise `n`).
    pub fn pieces(&self) -> Vec<Piece> {
        let e_ref = self.materials.first().map_or(1.0, |m| m.e);
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
                let strength = match mat.and_then(|m| m.fy) {
                    Some(fy) if by_strength => fy / fy_ref,
                    _ => n,
                };
                Piece {
                    part: i,
                    name: p.name.clone(),
                    contours: p.placement.apply(&p.shape.contours()),
                    void: p.void,
                    n,
                    strength,
                    density: mat.and_then(|m| m.density),
                    material: p.material,
                }
            })
            .collect()
    }
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
    let list: Vec<(String, ParamValue)> = doc
        .params
        .iter()
        .map(|(k, _, v)| {
            let pv = match &v.value {
                Value::Number(x) => ParamValue::Number(*x),
                Value::Expr(s) => ParamValue::Expr(s.clone()),
            };
            (k.clone(), pv)
        })
        .collect();
    resolve_params(&list).map_err(|(i, e)| match doc.params.get(i) {
        Some((k, _, v)) => expr_diag(v, e, &format!("params.{k}")),
        None => Diagnostic::new(0..1, e.message),
    })
}

fn resolve_part(ctx: &Ctx, doc: &Document, i: usize, p: &PartDoc) -> Result<Part, Diagnostic> {
    let name = p.name.clone().unwrap_or_else(|| format!("part {}", i + 1));
    let Some((_, required, optional)) = crate::geom::shapes::SHAPES.iter().find(|s| s.0 == p.shape)
    else {
        return Err(Diagnostic::new(
            p.shape_span.clone(),
            format!(
                "unknown shape `{}`; use one of {}",
                p.shape,
                crate::geom::shapes::shape_names()
            ),
        ));
    };
    let mut values: Vec<(String, f64)> = Vec::new();
    for k in required.iter() {
        let v = p.dim(k).ok_or_else(|| {
            Diagnostic::new(
                p.span.clone(),
                format!(
                    "part `{name}` ({}) needs `{k}`; its dimensions are {}",
                    p.shape,
                    required.join(", ")
                ),
            )
        })?;
        values.push((k.to_string(), ctx.positive(v, k)?));
    }
    for (k, default) in optional.iter() {
        let x = match p.dim(k) {
            None => *default,
            Some(v) if *k == "apex" => ctx.number(v, k)?,
            Some(v) => {
                let x = ctx.number(v, k)?;
                if x < 0.0 {
                    return Err(Diagnostic::new(
                        v.span.clone(),
                        format!("`{k}` cannot be negative; use 0 for none"),
                    ));
                }
                x
            }
        };
        values.push((k.to_string(), x));
    }
    let points = match &p.points {
        Some(pts) => pts
            .iter()
            .map(|[x, y]| Ok(Pt::new(ctx.number(x, "points")?, ctx.number(y, "points")?)))
            .collect::<Result<Vec<_>, Diagnostic>>()?,
        None if p.shape == "polygon" => {
            return Err(Diagnostic::new(
                p.span.clone(),
                format!("polygon `{name}` needs `points = [[x, y], ...]` with 3 or more points"),
            ))
        }
        None => Vec::new(),
    };
    let dim = |k: &str| values.iter().find(|(n, _)| n == k).map_or(0.0, |v| v.1);
    let shape = Shape::build(&p.shape, &dim, points).map_err(|(key, msg)| {
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
    let anchor = p.anchor.unwrap_or(Anchor::default_for(&p.shape));
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
        enabled: p.enabled,
        material,
    })
}

fn resolve_member(
    ctx: &Ctx,
    unit: LengthUnit,
    m: &super::document::MemberDoc,
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
    Ok(Member {
        length,
        support,
        udl,
        points,
        deflection_limit,
        self_weight: m.self_weight,
    })
}

/// The span of the part's table, for messages about a whole part.
pub fn part_span(doc: &Document, i: usize) -> Span {
    doc.parts.get(i).map_or(0..1, |p| p.span.clone())
}
