//! `kern calc --json`: one object per section, keys and conventions exactly as in
//! FORMAT.md. Each quantity of [`QUANTITIES`] goes in at its dotted path, in table
//! order, between the keys that are not quantities (file, title and units first; the
//! per-material stresses, connections, quantity units and warnings after). Values that
//! cannot be formed (a modulus with no fibre beyond the centroid) are `null`. Text from
//! the file (title, names, warnings) is cleaned ([`clean`]): serde escapes control
//! characters, but a `\u001b` read back by another tool must not become a live escape
//! either.

use super::out::OutUnits;
use super::rows::{net_view, Cell, Quantity, QUANTITIES};
use crate::analysis::Analysis;
use crate::checks::stress::StressPoint;
use crate::text::clean;
use serde_json::{json, Map, Value};

/// Puts `v` at the dotted `path` under `o`, making the objects on the way (a `null`
/// on the way becomes an object).
fn insert(o: &mut Map<String, Value>, path: &str, v: Value) {
    match path.split_once('.') {
        None => {
            o.insert(path.into(), v);
        }
        Some((head, rest)) => {
            let slot = o.entry(head).or_insert(Value::Null);
            if !slot.is_object() {
                *slot = Value::Object(Map::new());
            }
            if let Value::Object(m) = slot {
                insert(m, rest, v);
            }
        }
    }
}

/// The JSON value of quantity `q` of `a`, if `a` has it.
fn value(q: &Quantity, a: &Analysis, u: &OutUnits) -> Option<Value> {
    Some(match (q.get)(a) {
        Cell::Absent => return None,
        Cell::Null => Value::Null,
        Cell::Num(x) => json!(q.dim.json(x, u)),
        Cell::Text(t) => json!(clean(&t)),
        Cell::Count(n) => json!(n),
    })
}

/// The JSON object for one analysed file.
pub fn to_json(file: &str, a: &Analysis, u: &OutUnits) -> Value {
    let mut o = Map::new();
    o.insert("file".into(), json!(clean(file)));
    o.insert(
        "title".into(),
        json!(clean(a.section.title.as_deref().unwrap_or_default())),
    );
    o.insert("units".into(), json!(u.length.name()));
    for q in QUANTITIES {
        if let Some(v) = value(q, a, u) {
            insert(&mut o, q.path, v);
        }
    }
    let g = |x: f64, pw: i32| u.geo(x, pw);
    let stress_unit = u.stress();
    if let Some(s) = a.stress.as_ref().filter(|s| !s.per_material.is_empty()) {
        let pt = |sp: &StressPoint| json!({ "value": stress_unit.from_si(sp.value), "x": g(sp.x, 1), "y": g(sp.y, 1) });
        let per: Vec<Value> = s
            .per_material
            .iter()
            .map(|(name, e)| json!({ "material": clean(name), "max_tension": pt(&e.max_tension), "max_compression": pt(&e.max_compression) }))
            .collect();
        insert(&mut o, "stress.per_material", Value::Array(per));
    }
    let qu = u.shear_flow();
    let connections: Vec<Value> = a
        .connections
        .iter()
        .map(|c| {
            let mut j = json!({
                "parts": [clean(&a.pieces[c.joint.a].name), clean(&a.pieces[c.joint.b].name)],
                "length": g(c.joint.length, 1),
            });
            if let Some(q) = a.connection_flow(c) {
                j["shear_flow"] = json!(qu.from_si(q));
            }
            j
        })
        .collect();
    o.insert("connections".into(), Value::Array(connections));
    if let Some(n) = net_view(a) {
        let mut net = Map::new();
        for q in QUANTITIES.iter().filter(|q| q.in_net()) {
            if let Some(v) = value(q, &n, u) {
                insert(&mut net, q.path, v);
            }
        }
        o.insert("net".into(), Value::Object(net));
    }
    o.insert(
        "quantity_units".into(),
        json!({ "force": u.force().name, "moment": u.moment().name, "stress": stress_unit.name, "deflection": u.deflection().name, "shear_flow": qu.name }),
    );
    o.insert(
        "warnings".into(),
        json!(a
            .warnings
            .iter()
            .map(|w| clean(&w.to_string()))
            .collect::<Vec<_>>()),
    );
    Value::Object(o)
}
