//! The verdict of `kern check` on one section: every member utilization at most 1 (or
//! the file's `[limits] utilization`), no stress under `[actions]` beyond fy (as a
//! ratio, held to the same limit), and the file's own `[limits]`: a deflection limit
//! and lower or upper bounds on any result by its dotted key (docs/format.md
//! "Limits"). A limit that cannot be checked (no `[member]` for a deflection limit, a
//! result the section does not have) fails: a check never passes by leaving
//! something out.

use super::target::parse_value;
use super::vary::{read, result_key};
use crate::analysis::Analysis;
use crate::model::expr::Expr;
use crate::model::{Diagnostic, Val, Value};
use crate::report::out::OutUnits;
use crate::report::rows::{Dim, Quantity};

/// Which side of the limit passes.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum Bound {
    AtMost,
    AtLeast,
}

/// One figure that decided, or could not be formed.
#[derive(Debug, Clone, PartialEq)]
pub struct Figure {
    /// A dotted result key, or `stress_ratio` (with the material).
    pub key: String,
    pub material: Option<String>,
    pub value: Option<f64>,
    pub limit: f64,
    pub bound: Bound,
    /// The unit label of value and limit (empty for ratios).
    pub unit: String,
    pub pass: bool,
    /// Why there is no value, when there is none.
    pub missing: Option<String>,
}

impl Figure {
    fn new(key: &str, value: Option<f64>, limit: f64, bound: Bound, unit: String) -> Figure {
        let pass = value.is_some_and(|v| match bound {
            Bound::AtMost => v <= limit,
            Bound::AtLeast => v >= limit,
        });
        Figure {
            key: key.into(),
            material: None,
            value,
            limit,
            bound,
            unit,
            pass,
            missing: None,
        }
    }

    fn missing(mut self, why: &str) -> Figure {
        if self.value.is_none() {
            self.missing = Some(why.into());
        }
        self
    }
}

/// What a check found: every figure (pass when all pass) and what was not checked.
#[derive(Debug, Clone, PartialEq)]
pub struct Verdict {
    pub figures: Vec<Figure>,
    /// Things not checked and why (no fy for the stresses): information, not a failure.
    pub notes: Vec<String>,
}

impl Verdict {
    pub fn pass(&self) -> bool {
        self.figures.iter().all(|f| f.pass)
    }
}

fn key_quantity(key: &str) -> &'static Quantity {
    result_key(key).unwrap_or_else(|_| unreachable!("`{key}` is in the table"))
}

/// A limit written as a number or an expression of the params, finite and > 0.
fn positive(v: &Val, key: &str, a: &Analysis) -> Result<f64, Diagnostic> {
    let x = match &v.value {
        Value::Number(x) => *x,
        Value::Expr(s) => Expr::parse(s)
            .and_then(|e| e.eval(&|n| a.section.params.get(n).copied()))
            .map_err(|e| Diagnostic::new(v.span.clone(), format!("`{key}`: {}", e.message)))?,
    };
    if x.is_finite() && x > 0.0 {
        Ok(x)
    } else {
        Err(Diagnostic::new(
            v.span.clone(),
            format!("`{key}` in [limits] must be a number > 0"),
        ))
    }
}

/// The verdict on `a`; `Err` for a `[limits]` table that is wrong (an unknown result
/// key, a utilization limit above 1), which makes the file invalid for `check`.
pub fn check(a: &Analysis) -> Result<Verdict, Diagnostic> {
    let u = OutUnits::new(a.section.units, None);
    let limits = a.document.limits.as_ref();
    let mut figures = Vec::new();
    let mut notes = Vec::new();
    let max_ratio = match limits.and_then(|l| l.utilization.as_ref()) {
        None => 1.0,
        Some(v) => {
            let x = positive(v, "utilization", a)?;
            if x > 1.0 {
                return Err(Diagnostic::new(
                    v.span.clone(),
                    "`utilization` in [limits] must be at most 1: a higher limit would pass \
                     an overstressed member",
                ));
            }
            x
        }
    };
    if a.member.is_some() {
        let q = key_quantity("member.utilization");
        figures.push(
            Figure::new(q.path, read(q, a), max_ratio, Bound::AtMost, String::new())
                .missing("no fy and no E: the member's utilization cannot be formed"),
        );
    }
    if let Some(s) = &a.stress {
        let per: Vec<(Option<&str>, f64, f64)> = if s.per_material.is_empty() {
            let e = &s.extremes;
            vec![(None, e.max_tension.value, e.max_compression.value)]
        } else {
            s.per_material
                .iter()
                .map(|(n, e)| {
                    (
                        Some(n.as_str()),
                        e.max_tension.value,
                        e.max_compression.value,
                    )
                })
                .collect()
        };
        for (name, t, c) in per {
            let m = match name {
                None => a.section.materials.first(),
                Some(n) => a.section.materials.iter().find(|m| m.name == n),
            };
            match m.and_then(|m| m.fy) {
                Some(fy) => {
                    let mut f = Figure::new(
                        "stress_ratio",
                        Some(t.abs().max(c.abs()) / fy),
                        max_ratio,
                        Bound::AtMost,
                        String::new(),
                    );
                    f.material = m.map(|m| m.name.clone());
                    figures.push(f);
                }
                None => notes.push(match name {
                    Some(n) => format!("stresses in `{n}` not checked: it gives no fy"),
                    None => "stresses under [actions] not checked: no material gives fy".into(),
                }),
            }
        }
    }
    if let Some(l) = limits {
        if let Some(v) = &l.deflection_limit {
            let n = positive(v, "deflection_limit", a)?;
            let q = key_quantity("member.deflection_max");
            let (value, allowed) = match (&a.member, &a.section.member) {
                (Some(m), Some(mb)) => (
                    m.deflection_max.map(|d| Dim::Deflection.json(d, &u)),
                    Dim::Deflection.json(mb.length / n, &u),
                ),
                _ => (None, f64::NAN),
            };
            figures.push(
                Figure::new(q.path, value, allowed, Bound::AtMost, q.dim.label(&u)).missing(
                    if a.member.is_none() {
                        "a deflection limit needs a [member]"
                    } else {
                        "no E: the deflection cannot be formed"
                    },
                ),
            );
        }
        for (bounds, bound) in [(&l.min, Bound::AtLeast), (&l.max, Bound::AtMost)] {
            for (key, key_span, v) in bounds {
                let q = result_key(key).map_err(|m| Diagnostic::new(key_span.clone(), m))?;
                let limit = match &v.value {
                    Value::Number(x) => *x,
                    Value::Expr(s) => {
                        parse_value(s, q, a).map_err(|m| Diagnostic::new(v.span.clone(), m))?
                    }
                };
                let unit = if q.dim == Dim::Fraction {
                    String::new()
                } else {
                    q.dim.label(&u)
                };
                figures.push(
                    Figure::new(q.path, read(q, a), limit, bound, unit)
                        .missing("the section has no such result (torsion not solved, say)"),
                );
            }
        }
    }
    Ok(Verdict { figures, notes })
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::analysis::Options;

    fn verdict(extra: &str) -> Result<Verdict, Diagnostic> {
        let t = format!("format = 1\nunits = \"mm\"\n[[materials]]\nname = \"steel\"\nE = \"200 GPa\"\nfy = \"350 MPa\"\n[[parts]]\nshape = \"rect\"\nb = 100\nh = 300\n{extra}");
        check(&crate::file::load::analyse(&t, &Options::default()).unwrap())
    }

    #[test]
    fn limits_are_enforced() {
        // Ixx = 100·300³/12 = 2.25e8 mm⁴ (Gere & Goodno, App. E case 1).
        let v = verdict("[limits]\nmin = { \"inertia.xx\" = 2.2e8 }\n").unwrap();
        assert!(v.pass(), "{v:?}");
        let v = verdict("[limits.min]\ninertia.xx = \"2.3e8 mm4\"\n").unwrap();
        assert!(!v.pass());
        assert_eq!(v.figures[0].value, Some(2.25e8));
        // σ = M/S = 10 kN·m / (100·300²/6 mm³) = 6.67 MPa: 0.019 of fy.
        let v = verdict("[actions]\nMx = \"10 kN*m\"\n[limits]\nutilization = 0.01\n").unwrap();
        assert!(!v.pass());
        let r = v.figures[0].value.unwrap();
        assert!((r - 1e7 / (100.0 * 9e4 / 6.0) / 350.0).abs() < 1e-12, "{r}");
        // A deflection limit without a member cannot pass.
        let v = verdict("[limits]\ndeflection_limit = 500\n").unwrap();
        assert!(!v.pass());
        assert!(v.figures[0].missing.is_some());
        let e = verdict("[limits.max]\ninertia.x = 1\n").unwrap_err();
        assert!(
            e.message.contains("did you mean `inertia.xx`"),
            "{}",
            e.message
        );
        assert!(verdict("[limits]\nutilization = 1.2\n").is_err());
    }
}
