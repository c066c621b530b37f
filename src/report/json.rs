//! `kern calc --json`: one object per section, keys and conventions exactly as in
//! FORMAT.md. Values that cannot be formed (a modulus with no fibre beyond the
//! centroid) are `null`. Text from the file (title, names, warnings) is cleaned
//! ([`clean`]): serde escapes control characters, but a `\u001b` read back by another
//! tool must not become a live escape either.

use super::out::OutUnits;
use crate::analysis::Analysis;
use crate::checks::stress::StressPoint;
use crate::text::clean;
use serde_json::{json, Value};

/// The JSON object for one analysed file.
pub fn to_json(file: &str, a: &Analysis, u: &OutUnits) -> Value {
    let g = |x: f64, pw: i32| u.geo(x, pw);
    let mut o = json!({
        "file": clean(file),
        "title": clean(a.section.title.as_deref().unwrap_or_default()),
        "units": u.length.name(),
    });
    if let (Some(obj), Value::Object(props)) = (o.as_object_mut(), section_json(&a.props, u)) {
        obj.extend(props);
    }
    let Some(obj) = o.as_object_mut() else {
        return o;
    };
    match &a.torsion {
        Some(Ok(t)) => {
            obj.insert(
                "torsion".into(),
                json!({
                    "j": g(t.j, 4), "cw": g(t.cw, 6),
                    "shear_centre": { "x": g(t.shear_centre.x, 1), "y": g(t.shear_centre.y, 1) },
                    "method": t.method, "rel_error": t.rel_error, "elements": t.elements,
                    "beta": a.beta().map(|(x, y)| json!({ "x": g(x, 1), "y": g(y, 1) })),
                }),
            );
        }
        Some(Err(_)) => {
            obj.insert("torsion".into(), Value::Null);
        }
        None => {}
    }
    if let Some(n) = &a.net {
        let mut net = section_json(&n.props, u);
        if let Some(o) = net.as_object_mut() {
            o.remove("bounds");
            o.remove("plastic_axis");
        }
        obj.insert("net".into(), net);
    }
    if let Some(m) = a.mass_per_metre() {
        obj.insert("mass_per_length".into(), json!(u.mass().from_si(m)));
    }
    let stress_unit = u.stress();
    if let Some(s) = &a.stress {
        let pt = |sp: &StressPoint| json!({ "value": stress_unit.from_si(sp.value), "x": g(sp.x, 1), "y": g(sp.y, 1) });
        let mut st = json!({
            "max_tension": pt(&s.extremes.max_tension),
            "max_compression": pt(&s.extremes.max_compression),
            "neutral_axis_angle_deg": s.neutral_axis_angle_deg,
        });
        if !s.per_material.is_empty() {
            st["per_material"] = s
                .per_material
                .iter()
                .map(|(name, e)| json!({ "material": clean(name), "max_tension": pt(&e.max_tension), "max_compression": pt(&e.max_compression) }))
                .collect();
        }
        obj.insert("stress".into(), st);
    }
    if let Some(m) = &a.member {
        let d = u.deflection();
        obj.insert(
            "member".into(),
            json!({
                "m_max": u.moment().from_si(m.m_max),
                "v_max": u.force().from_si(m.v_max),
                "deflection_max": m.deflection_max.map(|x| d.from_si(x)),
                "deflection_allowed": d.from_si(m.deflection_allowed),
                "stress_max": stress_unit.from_si(m.stress_max),
                "utilization": m.utilization,
                "mcr": m.mcr.map(|x| u.moment().from_si(x)),
                "beta_x": m.beta_x.map(|x| u.metres(x)),
            }),
        );
        if let (Some(gm), Some(mo)) = (&m.governing_material, obj.get_mut("member")) {
            mo["governing_material"] = json!(clean(gm));
        }
    }
    let qu = u.shear_flow();
    let connections: Vec<Value> = a
        .connections
        .iter()
        .map(|c| {
            let mut j = json!({
                "parts": [&a.pieces[c.joint.a].name, &a.pieces[c.joint.b].name],
                "length": g(c.joint.length, 1),
            });
            if let Some(q) = a.connection_flow(c) {
                j["shear_flow"] = json!(qu.from_si(q));
            }
            j
        })
        .collect();
    obj.insert("connections".into(), Value::Array(connections));
    obj.insert(
        "quantity_units".into(),
        json!({ "force": u.force().name, "moment": u.moment().name, "stress": stress_unit.name, "deflection": u.deflection().name, "shear_flow": qu.name }),
    );
    obj.insert(
        "warnings".into(),
        json!(a.warnings.iter().map(|w| clean(w)).collect::<Vec<_>>()),
    );
    o
}

/// The properties of one section (gross or net) under FORMAT.md's keys.
fn section_json(p: &crate::props::Properties, u: &OutUnits) -> Value {
    let g = |x: f64, pw: i32| u.geo(x, pw);
    json!({
        "area": g(p.area, 2),
        "centroid": { "x": g(p.centroid.x, 1), "y": g(p.centroid.y, 1) },
        "bounds": { "xmin": g(p.bounds[0], 1), "xmax": g(p.bounds[1], 1), "ymin": g(p.bounds[2], 1), "ymax": g(p.bounds[3], 1) },
        "inertia": { "xx": g(p.ixx, 4), "yy": g(p.iyy, 4), "xy": g(p.ixy, 4) },
        "principal": { "i1": g(p.principal.i1, 4), "i2": g(p.principal.i2, 4), "angle_deg": p.principal.angle_deg },
        "elastic_modulus": {
            "x_top": g(p.elastic.x_top, 3), "x_bottom": g(p.elastic.x_bottom, 3),
            "y_left": g(p.elastic.y_left, 3), "y_right": g(p.elastic.y_right, 3)
        },
        "plastic_modulus": p.plastic.map(|z| json!({ "x": g(z.zx, 3), "y": g(z.zy, 3) })),
        "plastic_axis": p.plastic.map(|z| json!({ "y": g(z.y, 1), "x": g(z.x, 1) })),
        "gyration": { "x": g(p.gyration.x, 1), "y": g(p.gyration.y, 1), "min": g(p.gyration.min, 1) },
    })
}
