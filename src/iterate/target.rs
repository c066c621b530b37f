//! A value for a result as a person types it, in the units `kern calc --json` gives
//! that result (lengths in the file's unit):
//!
//! - a number or an expression of the file's params (`0.9`, `8e8`, `2*h^3`);
//! - for a length-like result (a deflection, a length), `span` is the member's span in
//!   the result's unit, so `span/500` is a deflection limit;
//! - a number (or expression without names) with a unit: `8e8 mm4` or `800 cm4` for a
//!   length power (the power must be the result's), `250 MPa`, `30 kN`, `85 kN*m`,
//!   `12 mm` for a stress, force, moment or deflection.

use crate::analysis::Analysis;
use crate::model::expr::Expr;
use crate::model::units::{parse_quantity, Kind, LengthUnit, Quantity as Parsed};
use crate::report::out::OutUnits;
use crate::report::rows::{Dim, Quantity};

/// The value `text` gives for result `q` of section `a`.
pub fn parse_value(text: &str, q: &Quantity, a: &Analysis) -> Result<f64, String> {
    let t = text.trim();
    if t.is_empty() {
        return Err("empty value; write a number, e.g. 8e8, or an expression".into());
    }
    let u = OutUnits::new(a.section.units, None);
    if let Dim::L(p) = q.dim {
        if let Some(v) = with_length_unit(t, p, a.section.units)? {
            return Ok(v);
        }
    }
    let kind = match q.dim {
        Dim::Stress => Some(Kind::Stress),
        Dim::Force => Some(Kind::Force),
        Dim::Moment => Some(Kind::Moment),
        Dim::Deflection | Dim::Metres => Some(Kind::Length),
        _ => None,
    };
    if let Some(k) = kind {
        if let Ok(Parsed::Si(si)) = parse_quantity(t, k) {
            return Ok(q.dim.json(si, &u));
        }
    }
    let span_m = a.section.member.as_ref().map(|m| m.length);
    let span = match q.dim {
        Dim::Deflection | Dim::Metres => span_m.map(|s| q.dim.json(s, &u)),
        Dim::L(1) => span_m.map(|s| s / a.section.units.metres()),
        _ => None,
    };
    let expr = Expr::parse(t).map_err(|e| format!("`{t}`: {}", e.message))?;
    let v = expr
        .eval(&|name| match name {
            "span" => span,
            _ => a.section.params.get(name).copied(),
        })
        .map_err(|e| {
            let hint = if t.contains("span") && span.is_none() {
                " (`span` needs a [member] and a result that is a length)"
            } else {
                ""
            };
            format!("`{t}`: {}{hint}", e.message)
        })?;
    if v.is_finite() {
        Ok(v)
    } else {
        Err(format!("`{t}` is not a finite number"))
    }
}

/// `text` ending in a length unit to the power `p` (`mm4`, `cm4`, `in3`; `mm` for
/// `p` = 1), in the file's unit `file`; `None` when it ends in no length unit.
fn with_length_unit(text: &str, p: i32, file: LengthUnit) -> Result<Option<f64>, String> {
    let ends = |s: &str| {
        text.strip_suffix(s)
            .filter(|head| !head.ends_with(|c: char| c.is_ascii_alphabetic()))
    };
    for unit in LengthUnit::ALL {
        let name = unit.name();
        for pw in 1..=6 {
            let spelled = if pw == 1 {
                name.to_string()
            } else {
                format!("{name}{pw}")
            };
            let Some(head) = ends(&spelled) else { continue };
            if pw != p {
                return Err(format!(
                    "`{text}`: this result is a length to the power {p}, not {pw}; write \
                     its unit as {name}{p} (or give a plain number in {}{p})",
                    file.name()
                ));
            }
            let x = crate::model::expr::eval_str(head.trim())
                .map_err(|e| format!("`{text}`: {}", e.message))?;
            return Ok(Some(x * (unit.metres() / file.metres()).powi(p)));
        }
    }
    Ok(None)
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::analysis::Options;
    use crate::iterate::vary::result_key;

    #[test]
    fn values_take_params_span_and_units() {
        let t = "format = 1\nunits = \"mm\"\n[params]\nh = 200\n[[materials]]\nname = \"s\"\nE = \"200 GPa\"\nfy = \"350 MPa\"\n[[parts]]\nshape = \"rect\"\nb = 100\nh = \"h\"\n[member]\nspan = \"5 m\"\nudl = \"10 kN/m\"\n";
        let a = crate::file::load::analyse(t, &Options::default()).unwrap();
        let ixx = result_key("inertia.xx").unwrap();
        assert_eq!(parse_value("8e8", ixx, &a).unwrap(), 8e8);
        assert_eq!(parse_value("h^3", ixx, &a).unwrap(), 8e6);
        // 1 cm⁴ = 10⁴ mm⁴.
        assert!((parse_value("800 cm4", ixx, &a).unwrap() - 8e6).abs() < 1e-6);
        assert!(parse_value("8e8 mm3", ixx, &a).is_err());
        let d = result_key("member.deflection_max").unwrap();
        // 5 m / 500 = 10 mm.
        assert!((parse_value("span/500", d, &a).unwrap() - 10.0).abs() < 1e-12);
        assert!((parse_value("1 cm", d, &a).unwrap() - 10.0).abs() < 1e-12);
        let s = result_key("member.stress_max").unwrap();
        assert!((parse_value("250 MPa", s, &a).unwrap() - 250.0).abs() < 1e-9);
        assert!(parse_value("span/500", ixx, &a).is_err());
        assert!(parse_value("", ixx, &a).is_err());
    }
}
