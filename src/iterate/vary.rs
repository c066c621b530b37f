//! One param changed, the section analysed again, one result read: the step every
//! iteration repeats. Results are named by their dotted key in `kern calc --json`
//! (`inertia.xx`, `member.utilization`) and read in that output's units (lengths in
//! the file's unit, forces, moments and stresses in its `quantity_units`) through
//! the one table of results, [`QUANTITIES`].

use crate::analysis::{Analysis, Options, Scope};
use crate::geom::{Resolved, Varying};
use crate::model::expr::resolve_params;
use crate::model::{Diagnostic, Document, Value};
use crate::report::out::OutUnits;
use crate::report::rows::{Cell, Dim, Quantity, QUANTITIES};

/// Why a value of the param gives no result.
#[derive(Debug, Clone, PartialEq)]
pub enum Failure {
    /// The file does not compute with that value (a dimension ≤ 0, say): where and why.
    Invalid(Diagnostic),
    /// The section computes but does not have the result (no `[member]`, a modulus
    /// with no fibre beyond the centroid): the key.
    NoResult(String),
    /// The analysis failed inside kern (a caught panic): its message.
    Internal(String),
}

impl Failure {
    /// The message, without a place.
    pub fn message(&self) -> String {
        match self {
            Failure::Invalid(d) => d.message.clone(),
            Failure::NoResult(key) => format!("the section has no `{key}` there"),
            Failure::Internal(m) => format!("internal error: {m}"),
        }
    }
}

/// The numeric results, by dotted key: every quantity of the table that holds a number.
pub fn numeric_keys() -> impl Iterator<Item = &'static Quantity> {
    QUANTITIES.iter().filter(|q| q.dim != Dim::None)
}

/// The result named by a dotted `key` of `kern calc --json`; an unknown key is an
/// error with the nearest known one.
pub fn result_key(key: &str) -> Result<&'static Quantity, String> {
    if let Some(q) = numeric_keys().find(|q| q.path == key) {
        return Ok(q);
    }
    let best = numeric_keys()
        .map(|q| (strsim::levenshtein(key, q.path), q.path))
        .min();
    Err(match best {
        Some((d, p)) if d <= 3 => format!("unknown result `{key}`; did you mean `{p}`?"),
        _ => format!(
            "unknown result `{key}`; use a numeric key of `kern calc --json`, e.g. inertia.xx, \
             elastic_modulus.x_top, plastic_modulus.x, torsion.j, mass_per_length, \
             member.utilization, member.deflection_max"
        ),
    })
}

/// Whether reading `q` needs the torsion solve (the torsion results, Mcr with the βx
/// it uses, and the shear areas and stresses of the flexure solution that comes with
/// it); every other result is the same without it.
pub fn needs_torsion(q: &Quantity) -> bool {
    [
        "torsion",
        "shear",
        "member.mcr",
        "member.beta_x",
        "member.tau_max",
    ]
    .iter()
    .any(|p| q.path.starts_with(p))
}

/// The stages of the analysis reading `q` needs, the one place that says so: the
/// whole analysis with torsion; the stresses for `stress.*`; the member check for
/// `member.*`; the plastic moduli for `plastic_modulus.*` and `plastic_axis.*`; else
/// the section's properties alone (every other numeric key of [`QUANTITIES`] reads
/// `Analysis::props` or the mass from it).
pub fn scope_for(q: &Quantity) -> Scope {
    if needs_torsion(q) {
        Scope::FULL
    } else if q.path.starts_with("plastic_") {
        Scope {
            plastic: true,
            ..Scope::PROPERTIES
        }
    } else if q.path.starts_with("stress.") {
        Scope {
            stress: true,
            ..Scope::PROPERTIES
        }
    } else if q.path.starts_with("member.") {
        Scope {
            member: true,
            ..Scope::PROPERTIES
        }
    } else {
        Scope::PROPERTIES
    }
}

/// The options for reading `q` alone: `opts` without the torsion solve when `q` does
/// not depend on it.
pub fn options_for(q: &Quantity, opts: &Options) -> Options {
    Options {
        torsion: opts.torsion.clone().filter(|_| needs_torsion(q)),
        shear: opts.shear,
    }
}

/// The value of `q` in `a`, in the units `kern calc --json` gives it (file lengths);
/// `None` when `a` does not have it or it is not a finite number.
pub fn read(q: &Quantity, a: &Analysis) -> Option<f64> {
    let u = OutUnits::new(a.section.units, None);
    match (q.get)(a) {
        Cell::Num(x) => Some(q.dim.json(x, &u)).filter(|v| v.is_finite()),
        _ => None,
    }
}

/// Every param's current value, in file order.
pub fn param_values(doc: &Document) -> Result<Vec<(String, f64)>, Diagnostic> {
    let list: Vec<(String, Value)> = doc
        .params
        .iter()
        .map(|(n, _, v)| (n.clone(), v.value.clone()))
        .collect();
    let values = resolve_params(&list).map_err(|(i, e)| {
        let span = doc.params.get(i).map_or(0..1, |p| p.2.span.clone());
        Diagnostic::new(span, format!("`{}`: {}", list[i].0, e.message))
    })?;
    Ok(list
        .into_iter()
        .filter_map(|(n, _)| values.get(&n).map(|&v| (n, v)))
        .collect())
}

/// A document and one of its params, ready to be analysed at any value of it: what
/// the param does not reach is resolved once ([`Varying`]).
#[derive(Debug, Clone)]
pub struct Probe {
    doc: Document,
    /// Index of the param in `doc.params`.
    index: usize,
    /// What each value's resolution keeps of the document's.
    varying: Varying,
    /// The param's value as the file has it.
    pub current: f64,
    pub opts: Options,
    /// The stages [`Probe::analyse`] runs ([`Scope::FULL`] unless [`Probe::reading`]
    /// narrowed them).
    pub scope: Scope,
}

impl Probe {
    /// The probe of param `name` of `doc`; an unknown name is an error with the
    /// nearest param (or the list of them).
    pub fn new(doc: &Document, name: &str, opts: &Options) -> Result<Probe, String> {
        let Some(index) = doc.params.iter().position(|(n, _, _)| n == name) else {
            let names: Vec<&str> = doc.params.iter().map(|(n, _, _)| n.as_str()).collect();
            if names.is_empty() {
                return Err(format!(
                    "the file has no [params]; `{name}` must be a param to be varied"
                ));
            }
            let near = names
                .iter()
                .min_by_key(|n| strsim::levenshtein(name, n))
                .filter(|n| strsim::levenshtein(name, n) <= 2);
            return Err(match near {
                Some(n) => format!("no param `{name}`; did you mean `{n}`?"),
                None => format!("no param `{name}`; the params are {}", names.join(", ")),
            });
        };
        let values = param_values(doc).map_err(|d| d.message)?;
        let current = values
            .iter()
            .find(|(n, _)| n == name)
            .map_or(f64::NAN, |v| v.1);
        let varying = Varying::new(doc, index);
        Ok(Probe::with_varying(
            doc,
            varying,
            current,
            opts,
            Scope::FULL,
        ))
    }

    /// The probe of the param `varying` was made for in `doc` (by `Varying::new` or
    /// `Varying::of`), whose value is `current`, analysing the stages `scope` with
    /// `opts`.
    pub fn with_varying(
        doc: &Document,
        varying: Varying,
        current: f64,
        opts: &Options,
        scope: Scope,
    ) -> Probe {
        Probe {
            doc: doc.clone(),
            index: varying.param(),
            varying,
            current,
            opts: opts.clone(),
            scope,
        }
    }

    /// The probe for reading only the results `qs`: its analyses run the stages they
    /// need ([`scope_for`]) and the torsion solve only if one of them needs it.
    pub fn reading(mut self, qs: &[&Quantity]) -> Probe {
        self.scope = qs
            .iter()
            .map(|q| scope_for(q))
            .fold(Scope::PROPERTIES, Scope::and);
        if !qs.iter().any(|q| needs_torsion(q)) {
            self.opts.torsion = None;
        }
        self
    }

    /// The param's name.
    pub fn name(&self) -> &str {
        &self.doc.params[self.index].0
    }

    /// The document with the param set to `x` (written as that number; a param that
    /// was an expression becomes the number).
    pub fn document_at(&self, x: f64) -> Document {
        let mut d = self.doc.clone();
        d.params[self.index].2.value = Value::Number(x);
        d
    }

    /// The analysis with the param at `x`, with the probe's options and scope.
    pub fn analyse(&self, x: f64) -> Result<Analysis, Failure> {
        self.analyse_in(x, &self.opts, self.scope)
    }

    /// The whole analysis with the param at `x` and options `opts`.
    pub fn analyse_with(&self, x: f64, opts: &Options) -> Result<Analysis, Failure> {
        self.analyse_in(x, opts, Scope::FULL)
    }

    /// The stages `scope` of the analysis with the param at `x` and options `opts`.
    /// The document is the probe's with the one param changed, resolved again where
    /// the param reaches (the file is not read or parsed again).
    pub fn analyse_in(&self, x: f64, opts: &Options, scope: Scope) -> Result<Analysis, Failure> {
        if !x.is_finite() {
            return Err(Failure::Invalid(Diagnostic::new(
                self.doc.params[self.index].1.clone(),
                format!("`{}` must be a finite number", self.name()),
            )));
        }
        let doc = self.document_at(x);
        let section = Resolved::resolve_varying(&doc, &self.varying).map_err(Failure::Invalid)?;
        Analysis::of_resolved_in(doc, section, opts, scope).map_err(Failure::Invalid)
    }

    /// Result `q` with the param at `x`, from the stages `q` needs alone (the torsion
    /// solve only if `q` needs it).
    pub fn result(&self, q: &Quantity, x: f64) -> Result<f64, Failure> {
        let a = self.analyse_in(x, &options_for(q, &self.opts), scope_for(q))?;
        read(q, &a).ok_or_else(|| Failure::NoResult(q.path.to_string()))
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    fn doc(text: &str) -> Document {
        crate::file::parse(text).unwrap()
    }

    const PLATE: &str = "format = 1\nunits = \"mm\"\n[params]\nb = 100\nh = \"2*b\"\n[[parts]]\nshape = \"rect\"\nb = \"b\"\nh = \"h\"\n";

    #[test]
    fn a_param_changed_is_read_back_through_the_table() {
        let d = doc(PLATE);
        let p = Probe::new(&d, "b", &Options::default()).unwrap();
        assert_eq!(p.current, 100.0);
        let q = result_key("inertia.xx").unwrap();
        // Rectangle Ixx = b·h³/12 with h = 2b (Gere & Goodno, App. E case 1).
        let b: f64 = 50.0;
        let want = b * (2.0 * b).powi(3) / 12.0;
        let got = p.result(q, b).unwrap();
        assert!((got - want).abs() <= 1e-12 * want, "{got} vs {want}");
    }

    #[test]
    fn unknown_names_say_what_is_near() {
        let d = doc(PLATE);
        let e = Probe::new(&d, "bb", &Options::default()).unwrap_err();
        assert!(e.contains("did you mean `b`"), "{e}");
        let Err(e) = result_key("inertia.x") else {
            panic!("an unknown key was found")
        };
        assert!(e.contains("did you mean `inertia.xx`"), "{e}");
        assert!(
            result_key("torsion.method").is_err(),
            "text is not a result"
        );
    }

    #[test]
    fn an_invalid_value_is_a_failure_not_a_panic() {
        let d = doc(PLATE);
        let p = Probe::new(&d, "b", &Options::default()).unwrap();
        let q = result_key("area").unwrap();
        assert!(matches!(p.result(q, -1.0), Err(Failure::Invalid(_))));
        assert!(matches!(p.result(q, f64::NAN), Err(Failure::Invalid(_))));
        let q = result_key("member.utilization").unwrap();
        assert!(matches!(p.result(q, 10.0), Err(Failure::NoResult(_))));
    }
}
