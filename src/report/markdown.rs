//! `kern report`: the calculation sheet in Markdown — inputs, the composite-area table
//! part by part with its check, every result row, the stress and member checks with
//! their assumptions, the warnings, and the caution at both ends.
//!
//! The sheet carries no date, so the same file always gives the same sheet.

use super::composite::{terms, totals};
use super::out::OutUnits;
use super::rows::rows;
use super::table::{section_of, FIGURES};
use super::CAUTION;
use crate::analysis::{Analysis, GRAVITY};
use crate::checks::ltb::Compressed;
use crate::checks::member::Support;
use crate::checks::shear_flow::Flow;
use crate::checks::stress::Extremes;
use crate::geom::Shape;
use crate::model::resolve::DEFAULT_NU;
use crate::model::units::{display_unit, Kind};
use crate::model::ShearModulus;
use crate::numfmt::sig;

/// The line where the HTML page puts the drawing (an HTML comment, invisible in Markdown).
pub const DRAWING_MARK: &str = "<!-- drawing -->";

/// The whole sheet for one analysed file, named `file`.
pub fn sheet(file: &str, a: &Analysis, u: &OutUnits) -> String {
    let mut s = String::new();
    let title = a.section.title.as_deref().unwrap_or("(untitled section)");
    s.push_str(&format!("# {}\n\n", inline(title)));
    s.push_str(&format!(
        "Calculation sheet for {}, prepared by kern {}. Lengths in {}, forces in {}, \
moments in {}, stresses in {}.\n\n",
        code(file),
        env!("CARGO_PKG_VERSION"),
        u.length.name(),
        u.force().name,
        u.moment().name,
        u.stress().name
    ));
    s.push_str(&format!("> {CAUTION}\n\n"));
    inputs(&mut s, a, u);
    s.push_str(DRAWING_MARK);
    s.push_str("\n\n");
    composite(&mut s, a, u);
    results(&mut s, a, u);
    checks(&mut s, a, u);
    connections(&mut s, a, u);
    s.push_str("## Warnings\n\n");
    if a.warnings.is_empty() {
        s.push_str("None.\n\n");
    }
    for w in &a.warnings {
        s.push_str(&format!("- {}\n", inline(w)));
    }
    if !a.warnings.is_empty() {
        s.push('\n');
    }
    s.push_str(&format!("> {CAUTION}\n"));
    s
}

/// A number as an input is usually written: up to 6 significant figures, trailing
/// zeros dropped.
fn plain(x: f64) -> String {
    let s = sig(x, 6);
    if s.contains('.') && !s.contains('e') {
        s.trim_end_matches('0').trim_end_matches('.').to_string()
    } else {
        s
    }
}

/// A result to the sheet's significant figures.
fn fig(x: f64) -> String {
    sig(x, FIGURES)
}

/// User text made literal for one table cell or line.
fn inline(t: &str) -> String {
    crate::text::markdown(t)
}

/// User text in a code span: cleaned, with no backtick to end the span early and `|`
/// escaped for table cells (GitHub tables read `\|` inside code too). Inside a span
/// `<` is literal text to Markdown, and the HTML sheet escapes it.
fn code(t: &str) -> String {
    format!(
        "`{}`",
        crate::text::clean(t).replace('`', "'").replace('|', "\\|")
    )
}

/// A Markdown table from a header and rows.
fn table(s: &mut String, head: &[&str], body: &[Vec<String>]) {
    s.push_str(&format!("| {} |\n", head.join(" | ")));
    s.push_str(&format!(
        "|{}|\n",
        head.iter().map(|_| "---").collect::<Vec<_>>().join("|")
    ));
    for r in body {
        s.push_str(&format!("| {} |\n", r.join(" | ")));
    }
    s.push('\n');
}

/// The dimensions of a shape, `key = value` in the output length unit (a polygon's
/// corners as `(x, y)`).
fn dimensions(shape: &Shape, u: &OutUnits) -> String {
    let l = |x: f64| plain(u.geo(x, 1));
    if let Shape::Polygon { points } = shape {
        return points
            .iter()
            .map(|p| format!("({}, {})", l(p.x), l(p.y)))
            .collect::<Vec<_>>()
            .join(" ");
    }
    shape
        .dims()
        .iter()
        .map(|(k, v)| format!("{k} = {}", l(*v)))
        .collect::<Vec<_>>()
        .join(", ")
}

fn inputs(s: &mut String, a: &Analysis, u: &OutUnits) {
    let sec = &a.section;
    s.push_str("## Inputs\n\n");
    s.push_str(&format!(
        "The file's lengths are in {}; they are shown here in {}.\n\n",
        sec.units.name(),
        u.length.name()
    ));
    if !a.document.params.is_empty() {
        s.push_str("### Parameters\n\n");
        let body: Vec<Vec<String>> = a
            .document
            .params
            .iter()
            .map(|(name, _, v)| {
                let value = sec
                    .params
                    .get(name)
                    .map_or("—".into(), |x| plain(u.geo(*x, 1)));
                vec![code(name), value, code(&v.value.text())]
            })
            .collect();
        table(
            s,
            &[
                "name",
                &format!("value ({})", u.length.name()),
                "as written",
            ],
            &body,
        );
    }
    if !sec.materials.is_empty() {
        s.push_str("### Materials\n\n");
        let st = u.stress();
        let rho = display_unit(Kind::Density, u.system);
        let body: Vec<Vec<String>> = sec
            .materials
            .iter()
            .map(|m| {
                vec![
                    inline(&m.name),
                    fig(st.from_si(m.e)),
                    m.fy.map_or("—".into(), |f| fig(st.from_si(f))),
                    m.density.map_or("—".into(), |d| fig(rho.from_si(d))),
                    fig(st.from_si(m.g)),
                    match m.g_source {
                        ShearModulus::Given => "as given".to_string(),
                        ShearModulus::FromNu(nu) => format!("E/(2(1 + ν)), ν = {}", plain(nu)),
                        ShearModulus::DefaultNu => format!(
                            "E/(2(1 + ν)), ν = {DEFAULT_NU} assumed (the default, common practice for steel; give nu or G otherwise)"
                        ),
                    },
                ]
            })
            .collect();
        table(
            s,
            &[
                "material",
                &format!("E ({})", st.name),
                &format!("fy ({})", st.name),
                &format!("density ({})", rho.name),
                &format!("G ({})", st.name),
                "G from",
            ],
            &body,
        );
        if sec.materials.len() > 1 {
            s.push_str(&format!(
                "The section is transformed to the first material, {}: each part counts \
with its modular ratio n = E / E_ref.\n\n",
                inline(&sec.materials[0].name)
            ));
        }
    }
    s.push_str("### Parts\n\n");
    let body: Vec<Vec<String>> = sec
        .parts
        .iter()
        .enumerate()
        .map(|(i, p)| {
            let pl = &p.placement;
            let mut flips = Vec::new();
            if pl.flip_x {
                flips.push("x");
            }
            if pl.flip_y {
                flips.push("y");
            }
            let kind = match (p.enabled, p.void, p.hole) {
                (false, _, _) => "disabled",
                (true, _, true) => "hole (net section only)",
                (true, true, false) => "void",
                (true, false, false) => "solid",
            };
            vec![
                format!("{}", i + 1),
                inline(&p.name),
                p.shape.kind().to_string(),
                dimensions(&p.shape, u),
                format!(
                    "({}, {}) {}",
                    plain(u.geo(pl.at.x, 1)),
                    plain(u.geo(pl.at.y, 1)),
                    pl.anchor.name()
                ),
                plain(pl.rotate),
                if flips.is_empty() {
                    "—".into()
                } else {
                    flips.join(", ")
                },
                kind.to_string(),
                p.material
                    .and_then(|m| sec.materials.get(m))
                    .map_or("—".into(), |m| inline(&m.name)),
            ]
        })
        .collect();
    table(
        s,
        &[
            "#",
            "name",
            "shape",
            &format!("dimensions ({})", u.length.name()),
            "at, anchor",
            "rotate (°)",
            "flip",
            "kind",
            "material",
        ],
        &body,
    );
}

fn composite(s: &mut String, a: &Analysis, u: &OutUnits) {
    let ts = terms(a);
    let tot = totals(&ts);
    let (l1, l2, l4) = (u.label(1), u.label(2), u.label(4));
    s.push_str("## Composite-area method\n\n");
    s.push_str(
        "Each enabled part counts with the weight w = ±n: minus for a void, times its modular \
ratio n. A is the weighted area, (x_i, y_i) the part's own centroid, Ixx,own and Iyy,own its \
weighted second moments about its own centroid, dy = y_i − ȳ and dx = x_i − x̄. The parallel \
axis theorem then gives I = Σ(I_own + A·d²).\n\n",
    );
    let g = |x: f64, p: i32| fig(u.geo(x, p));
    let mut body: Vec<Vec<String>> = ts
        .iter()
        .map(|t| {
            vec![
                format!("{}{}", inline(&t.name), if t.void { " (void)" } else { "" }),
                plain(t.n),
                g(t.a, 2),
                g(t.x, 1),
                g(t.y, 1),
                g(t.ixx_own, 4),
                g(t.iyy_own, 4),
                g(t.dy, 1),
                g(t.dx, 1),
                g(t.a_dy2(), 4),
                g(t.a_dx2(), 4),
            ]
        })
        .collect();
    body.push(vec![
        "**Σ**".into(),
        String::new(),
        format!("**{}**", g(tot.a, 2)),
        String::new(),
        String::new(),
        format!("**{}**", g(tot.ixx_own, 4)),
        format!("**{}**", g(tot.iyy_own, 4)),
        String::new(),
        String::new(),
        format!("**{}**", g(tot.a_dy2, 4)),
        format!("**{}**", g(tot.a_dx2, 4)),
    ]);
    table(
        s,
        &[
            "part",
            "n",
            &format!("A ({l2})"),
            &format!("x_i ({l1})"),
            &format!("y_i ({l1})"),
            &format!("Ixx,own ({l4})"),
            &format!("Iyy,own ({l4})"),
            &format!("dy ({l1})"),
            &format!("dx ({l1})"),
            &format!("A·dy² ({l4})"),
            &format!("A·dx² ({l4})"),
        ],
        &body,
    );
    let p = &a.props;
    let (xbar, ybar) = if tot.a > 0.0 {
        (tot.ax / tot.a, tot.ay / tot.a)
    } else {
        (f64::NAN, f64::NAN)
    };
    s.push_str("Check of the method against the section's own results:\n\n");
    s.push_str(&format!(
        "- x̄ = ΣA·x_i / ΣA = {} {l1}, ȳ = ΣA·y_i / ΣA = {} {l1} (section: {}, {})\n",
        g(xbar, 1),
        g(ybar, 1),
        g(p.centroid.x, 1),
        g(p.centroid.y, 1)
    ));
    // `a + b` written as `a − |b|` when b is negative.
    let sum = |x: f64, y: f64| {
        let (op, y) = if y < 0.0 { ("−", -y) } else { ("+", y) };
        format!("{} {op} {}", g(x, 4), g(y, 4))
    };
    s.push_str(&format!(
        "- Ixx = ΣIxx,own + ΣA·dy² = {} = {} {l4} (section: {})\n",
        sum(tot.ixx_own, tot.a_dy2),
        g(tot.ixx(), 4),
        g(p.ixx, 4)
    ));
    s.push_str(&format!(
        "- Iyy = ΣIyy,own + ΣA·dx² = {} = {} {l4} (section: {})\n\n",
        sum(tot.iyy_own, tot.a_dx2),
        g(tot.iyy(), 4),
        g(p.iyy, 4)
    ));
}

fn results(s: &mut String, a: &Analysis, u: &OutUnits) {
    s.push_str("## Results\n\n");
    let rs = rows(a, u);
    let mut group = "";
    let body: Vec<Vec<String>> = rs
        .iter()
        .map(|r| {
            let head = match (r.group != group, a.net.is_some()) {
                (false, _) => String::new(),
                (true, false) => r.group.to_string(),
                (true, true) => format!("{} ({})", r.group, section_of(r.group)),
            };
            group = r.group;
            vec![
                head,
                inline(&r.symbol),
                r.value.map_or("—".into(), fig),
                r.unit.clone(),
                r.meaning.to_string(),
            ]
        })
        .collect();
    if a.net.is_some() {
        s.push_str(
            "The section has holes: the gross section leaves them out and gives stiffness, \
torsion, the shear centre, Mcr, self-weight and deflections; the net section subtracts them and \
gives the stresses and the member's bending stress. Each group names its section.\n\n",
        );
    }
    table(s, &["group", "symbol", "value", "unit", "meaning"], &body);
    match &a.torsion {
        None => s.push_str("Torsion was not computed for this sheet.\n\n"),
        Some(Err(e)) => s.push_str(&format!("Torsion is not available: {}\n\n", inline(e))),
        Some(Ok(t)) => s.push_str(&format!(
            "Torsion by {} ({} elements), estimated relative error {}.\n\n",
            inline(&t.method),
            t.elements,
            sig(t.rel_error, 2)
        )),
    }
}

/// One line per extreme: value and point.
fn extreme_lines(s: &mut String, e: &Extremes, u: &OutUnits, prefix: &str) {
    let st = u.stress();
    let l = u.length.name();
    for (what, p) in [
        ("largest σ", &e.max_tension),
        ("smallest σ", &e.max_compression),
    ] {
        s.push_str(&format!(
            "- {prefix}{what} = {} {} at ({}, {}) {l}\n",
            fig(st.from_si(p.value)),
            st.name,
            fig(u.geo(p.x, 1)),
            fig(u.geo(p.y, 1)),
        ));
    }
}

/// The joints between parts, with the side each bridge cuts off, so the flow can be
/// redone by hand.
fn connections(s: &mut String, a: &Analysis, u: &OutUnits) {
    if a.connections.is_empty() {
        return;
    }
    let (l, qu) = (u.length.name(), u.shear_flow());
    s.push_str("## Connections\n\n");
    s.push_str(&format!(
        "Joints are boundaries of positive length that two solid parts share. Where cutting a \
joint separates the section in two, the longitudinal shear flow it carries follows from \
the equilibrium of the side cut off (gross section, modular ratios, voids inside that side \
subtracted): q = |(Vy·Iyy − Vx·Ixy)·Qx + (Vx·Ixx − Vy·Ixy)·Qy| / (Ixx·Iyy − Ixy²), with \
Qx = A′·(ȳ′ − ȳ) and Qy = A′·(x̄′ − x̄) of that side (area A′, centroid x̄′, ȳ′). Joints \
on a closed cell are statically indeterminate: their flow needs the flexure solution and \
is not given. Flows in {}.\n\n",
        qu.name
    ));
    let name = |i: usize| inline(&a.pieces[i].name);
    let body: Vec<Vec<String>> = a
        .connections
        .iter()
        .map(|c| {
            let (side, area, xc, yc, qx, qy) = match &c.flow {
                Flow::Exact(cut) => (
                    cut.side
                        .iter()
                        .map(|&i| name(i))
                        .collect::<Vec<_>>()
                        .join(", "),
                    fig(u.geo(cut.area, 2)),
                    fig(u.geo(cut.centroid.x, 1)),
                    fig(u.geo(cut.centroid.y, 1)),
                    fig(u.geo(cut.qx, 3)),
                    fig(u.geo(cut.qy, 3)),
                ),
                Flow::ClosedCell => (
                    "closed cell".into(),
                    "—".into(),
                    "—".into(),
                    "—".into(),
                    "—".into(),
                    "—".into(),
                ),
                Flow::VoidAcross(_) | Flow::StrayVoid(_) => (
                    "a void lies across".into(),
                    "—".into(),
                    "—".into(),
                    "—".into(),
                    "—".into(),
                    "—".into(),
                ),
            };
            let q = |v: Option<f64>| v.map_or("—".into(), |q| fig(qu.from_si(q)));
            vec![
                format!("{} – {}", name(c.joint.a), name(c.joint.b)),
                fig(u.geo(c.joint.length, 1)),
                side,
                area,
                xc,
                yc,
                qx,
                qy,
                q(a.connection_flow(c)),
                q(a.connection_flow_at_vmax(c)),
            ]
        })
        .collect();
    let (h_len, h_a, h_x, h_y, h_qx, h_qy) = (
        format!("length ({l})"),
        format!("A′ ({l}²)"),
        format!("x̄′ ({l})"),
        format!("ȳ′ ({l})"),
        format!("Qx ({l}³)"),
        format!("Qy ({l}³)"),
    );
    table(
        s,
        &[
            "joint",
            &h_len,
            "side cut off",
            &h_a,
            &h_x,
            &h_y,
            &h_qx,
            &h_qy,
            "q, [actions]",
            "q at Vmax",
        ],
        &body,
    );
}

fn checks(s: &mut String, a: &Analysis, u: &OutUnits) {
    if a.stress.is_none() && a.member.is_none() {
        return;
    }
    s.push_str("## Checks\n\n");
    if let (Some(st), Some(act)) = (&a.stress, &a.section.actions) {
        let (f, m) = (u.force(), u.moment());
        s.push_str("### Stresses under the actions\n\n");
        s.push_str(&format!(
            "N = {} {}, Mx = {} {}, My = {} {} (tension positive; positive Mx compresses the \
+y fibres, positive My the +x fibres). σ = N/A + a·(x − x̄) + b·(y − ȳ), the flexure \
formula for unsymmetric sections{}.\n\n",
            fig(f.from_si(act.n)),
            f.name,
            fig(m.from_si(act.mx)),
            m.name,
            fig(m.from_si(act.my)),
            m.name,
            if a.net.is_some() {
                ", on the net section (holes subtracted)"
            } else {
                ""
            }
        ));
        extreme_lines(s, &st.extremes, u, "");
        match st.neutral_axis_angle_deg {
            Some(d) => s.push_str(&format!(
                "- neutral axis at {}° from +x, counter-clockwise\n",
                fig(d)
            )),
            None => s.push_str("- no neutral axis (axial force only)\n"),
        }
        for (name, e) in &st.per_material {
            extreme_lines(s, e, u, &format!("{}: ", inline(name)));
        }
        s.push('\n');
    }
    if let (Some(mr), Some(mb)) = (&a.member, &a.section.member) {
        let (f, m, w, d, st) = (
            u.force(),
            u.moment(),
            u.line_load(),
            u.deflection(),
            u.stress(),
        );
        let l = u.length.name();
        let support = match mb.support {
            Support::Simple => "simply supported",
            Support::Cantilever => "cantilever (fixed at x = 0)",
            Support::Fixed => "fixed at both ends",
            Support::Propped => "propped cantilever (fixed at x = 0)",
        };
        s.push_str("### Member\n\n");
        s.push_str(&format!(
            "- {support}, span L = {} {l}\n",
            plain(u.metres(mb.length))
        ));
        s.push_str(&format!(
            "- uniform load {} {}",
            fig(w.from_si(mb.udl)),
            w.name
        ));
        if mb.self_weight {
            s.push_str(&format!(
                ", plus self-weight {} {} (mass × g, g = {GRAVITY} m/s²)",
                fig(w.from_si(mr.self_weight)),
                w.name
            ));
        }
        s.push('\n');
        for (p, at) in &mb.points {
            s.push_str(&format!(
                "- point load {} {} at {} {l}\n",
                fig(f.from_si(*p)),
                f.name,
                plain(u.metres(*at))
            ));
        }
        let at = |x: Option<f64>| {
            x.map_or(String::new(), |x| {
                format!(" at x = {} {l}", fig(u.metres(x)))
            })
        };
        let r = mr.result.as_ref();
        s.push_str(&format!(
            "- Mmax = {} {}{}\n- Vmax = {} {}{}\n",
            fig(m.from_si(mr.m_max)),
            m.name,
            at(r.map(|r| r.m_max_at)),
            fig(f.from_si(mr.v_max)),
            f.name,
            at(r.map(|r| r.v_max_at)),
        ));
        match mr.deflection_max {
            Some(dm) => s.push_str(&format!(
                "- δmax = {} {}{} against δallow = L/{} = {} {} (ratio {})\n",
                fig(d.from_si(dm)),
                d.name,
                at(r.map(|r| r.deflection_at)),
                plain(mb.deflection_limit),
                fig(d.from_si(mr.deflection_allowed)),
                d.name,
                fig(dm / mr.deflection_allowed)
            )),
            None => s.push_str("- deflection not computed: no modulus of elasticity given\n"),
        }
        let net = if a.net.is_some() { ", net section" } else { "" };
        for f in &mr.fibres {
            let name = f
                .material
                .as_deref()
                .map_or(String::new(), |m| format!(" in {}", inline(m)));
            s.push_str(&format!(
                "- σb{name} = n·Mmax·c/Ixx = {} {} (c to its own farthest fibre{net})",
                fig(st.from_si(f.stress)),
                st.name
            ));
            match f.fy {
                Some(fy) => s.push_str(&format!(
                    " against fy = {} {} (ratio {})\n",
                    fig(st.from_si(fy)),
                    st.name,
                    fig(f.stress / fy)
                )),
                None => s.push_str(" (no fy given: not in the utilisation)\n"),
            }
        }
        if let Some(gm) = &mr.governing_material {
            s.push_str(&format!("- governing material: {}\n", inline(gm)));
        }
        match mr.utilization {
            Some(x) => s.push_str(&format!(
                "- utilisation = max(σb/fy of each material, δmax/δallow) = {}\n",
                fig(x)
            )),
            None => s.push_str("- utilisation not formed (neither fy nor E given)\n"),
        }
        match (mr.mcr, mr.beta_x, a.section.materials.first()) {
            (Some(x), Some(bx), Some(mat)) => {
                let side = match mr.mcr_side {
                    Some(Compressed::PlusY) => "+y side in compression (sagging, s = −1)",
                    Some(Compressed::MinusY) => "−y side in compression (hogging, s = +1)",
                    None => "the lower of the values for either side in compression (the moment takes both signs, or none)",
                };
                let g_from = match mat.g_source {
                    ShearModulus::Given => "as given".to_string(),
                    ShearModulus::FromNu(nu) => format!("E/(2(1 + ν)), ν = {}", plain(nu)),
                    ShearModulus::DefaultNu => format!("E/(2(1 + ν)), ν = {DEFAULT_NU} assumed"),
                };
                s.push_str(&format!(
                    "- Mcr = {} {}: elastic lateral-torsional buckling of the simple span, \
Mcr = c1·(π²EIy/L²)·(s·βx/2 + √((βx/2)² + Cw/Iy + GJL²/(π²EIy))) (Trahair, Flexural-Torsional \
Buckling of Structures, ch. 7; Timoshenko & Gere when βx = 0). Assumed: ends free to warp and \
prevented from twisting, load at the shear centre, c1 = {} ({}), G = {} {} of {} ({g_from}), \
βx = {} {l} with the finite-element shear centre, {side}\n",
                    fig(m.from_si(x)),
                    m.name,
                    plain(mb.c1),
                    if mb.c1 == 1.0 {
                        "uniform moment, the least favourable diagram for a simple span"
                    } else {
                        "moment-gradient factor as given"
                    },
                    fig(st.from_si(mat.g)),
                    st.name,
                    inline(&mat.name),
                    fig(u.metres(bx)),
                ));
            }
            _ => s.push_str(&format!(
                "- Mcr not computed: {}\n",
                mr.mcr_note.as_deref().unwrap_or("no value")
            )),
        }
        s.push('\n');
    }
}
