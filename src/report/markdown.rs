//! `kern report`: the calculation sheet — inputs, the composite-area table part by
//! part with its check, every result row, the stress and member checks with their
//! assumptions, the warnings, and the caution at both ends — built once as blocks
//! ([`blocks`]) and written as Markdown ([`sheet`]) or HTML ([`super::html::page`]).
//!
//! The sheet carries no date, so the same file always gives the same sheet.

use super::blocks::{self, own, user, Block, Line, Span};
use super::composite::{terms, totals};
use super::out::OutUnits;
use super::rows::rows;
use super::table::{group_heads, FIGURES};
use super::CAUTION;
use crate::analysis::{Analysis, GRAVITY};
use crate::checks::ltb::Compressed;
use crate::checks::member::Support;
use crate::checks::shear_flow::Flow;
use crate::checks::stress::Extremes;
use crate::geom::resolve::DEFAULT_NU;
use crate::geom::Shape;
use crate::geom::ShearModulus;
use crate::model::units::{display_unit, Kind};
use crate::model::SheetDoc;
use crate::numfmt::sig;

pub use super::blocks::DRAWING_MARK;

/// The whole sheet for one analysed file, named `file`, in Markdown.
pub fn sheet(file: &str, a: &Analysis, u: &OutUnits) -> String {
    blocks::markdown(&blocks(file, a, u))
}

/// The sheet's blocks for one analysed file, named `file`.
pub fn blocks(file: &str, a: &Analysis, u: &OutUnits) -> Vec<Block> {
    let mut s = Vec::new();
    let title = a.section.title.as_deref().unwrap_or("(untitled section)");
    s.push(Block::Header(header(a.document.sheet.as_ref())));
    s.push(Block::Heading(1, user(title)));
    s.push(Block::Para(vec![
        Span::Own("Calculation sheet for ".into()),
        Span::Code(file.into()),
        Span::Own(format!(
            ", prepared by kern {}. Lengths in {}, forces in {}, moments in {}, stresses in {}.",
            env!("CARGO_PKG_VERSION"),
            u.length.name(),
            u.force().name,
            u.moment().name,
            u.stress().name
        )),
    ]));
    s.push(Block::Quote(own(CAUTION)));
    inputs(&mut s, a, u);
    s.push(Block::Drawing(None));
    composite(&mut s, a, u);
    results(&mut s, a, u);
    checks(&mut s, a, u);
    shear(&mut s, a, u);
    connections(&mut s, a, u);
    s.push(Block::Heading(2, own("Warnings")));
    if a.warnings.is_empty() {
        s.push(Block::Para(own("None.")));
    } else {
        s.push(Block::List(
            a.warnings.iter().map(|w| user(&w.to_string())).collect(),
        ));
    }
    s.push(Block::Quote(own(CAUTION)));
    s
}

/// The header's fields from `[sheet]`, every one present (`None` to fill in by hand).
fn header(sheet: Option<&SheetDoc>) -> Vec<(&'static str, Option<String>)> {
    sheet
        .cloned()
        .unwrap_or_default()
        .fields()
        .iter()
        .map(|(label, v)| (*label, v.map(str::to_string)))
        .collect()
}

/// A number as an input is usually written: up to 6 significant figures, trailing
/// zeros dropped ([`crate::numfmt::plain`]).
pub(super) fn plain(x: f64) -> String {
    crate::numfmt::plain(x, 6)
}

/// A result to the sheet's significant figures, in the chosen form of numbers.
fn fig(u: &OutUnits, x: f64) -> String {
    u.num(x, FIGURES)
}

/// A table from a header of kern's own words and rows of lines.
fn table(s: &mut Vec<Block>, head: &[&str], body: Vec<Vec<Line>>) {
    s.push(Block::Table {
        head: head.iter().map(|h| own(*h)).collect(),
        body,
    });
}

/// Cells of kern's own text.
fn cells(v: Vec<String>) -> Vec<Line> {
    v.into_iter().map(own).collect()
}

/// The dimensions of a shape, `key = value` in the output length unit (a polygon's
/// corners as `(x, y)`).
pub(super) fn dimensions(shape: &Shape, u: &OutUnits) -> String {
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

fn inputs(s: &mut Vec<Block>, a: &Analysis, u: &OutUnits) {
    let sec = &a.section;
    s.push(Block::Heading(2, own("Inputs")));
    s.push(Block::Para(own(format!(
        "The file's lengths are in {}; they are shown here in {}.",
        sec.units.name(),
        u.length.name()
    ))));
    if !a.document.params.is_empty() {
        s.push(Block::Heading(3, own("Parameters")));
        let body: Vec<Vec<Line>> = a
            .document
            .params
            .iter()
            .map(|(name, _, v)| {
                let value = sec
                    .params
                    .get(name)
                    .map_or("—".into(), |x| plain(u.geo(*x, 1)));
                vec![
                    vec![Span::Code(name.to_string())],
                    own(value),
                    vec![Span::Code(v.value.text())],
                ]
            })
            .collect();
        table(
            s,
            &[
                "name",
                &format!("value ({})", u.length.name()),
                "as written",
            ],
            body,
        );
    }
    if !sec.materials.is_empty() {
        s.push(Block::Heading(3, own("Materials")));
        let st = u.stress();
        let rho = display_unit(Kind::Density, u.system);
        let body: Vec<Vec<Line>> = sec
            .materials
            .iter()
            .map(|m| {
                let mut row = vec![user(&m.name)];
                row.extend(cells(vec![
                    fig(u, st.from_si(m.e)),
                    m.fy.map_or("—".into(), |f| fig(u, st.from_si(f))),
                    m.density.map_or("—".into(), |d| fig(u, rho.from_si(d))),
                    fig(u, st.from_si(m.g)),
                    match m.g_source {
                        ShearModulus::Given => "as given".to_string(),
                        ShearModulus::FromNu(nu) => format!("E/(2(1 + ν)), ν = {}", plain(nu)),
                        ShearModulus::DefaultNu => format!(
                            "E/(2(1 + ν)), ν = {DEFAULT_NU} assumed (the default, common practice for steel; give nu or G otherwise)"
                        ),
                    },
                ]));
                row
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
            body,
        );
        if sec.materials.len() > 1 {
            s.push(Block::Para(vec![
                Span::Own("The section is transformed to the first material, ".into()),
                Span::User(sec.materials[0].name.clone()),
                Span::Own(": each part counts with its modular ratio n = E / E_ref.".into()),
            ]));
        }
    }
    s.push(Block::Heading(3, own("Parts")));
    let body: Vec<Vec<Line>> = sec
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
            let mut row = vec![own(format!("{}", i + 1)), user(&p.name)];
            row.extend(cells(vec![
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
            ]));
            row.push(
                p.material
                    .and_then(|m| sec.materials.get(m))
                    .map_or(own("—"), |m| user(&m.name)),
            );
            row
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
        body,
    );
}

fn composite(s: &mut Vec<Block>, a: &Analysis, u: &OutUnits) {
    let ts = terms(a);
    let tot = totals(&ts);
    let (l1, l2, l4) = (u.label(1), u.label(2), u.label(4));
    s.push(Block::Heading(2, own("Composite-area method")));
    s.push(Block::Para(own(
        "Each enabled part counts with the weight w = ±n: minus for a void, times its modular \
ratio n. A is the weighted area, (x_i, y_i) the part's own centroid, Ixx,own and Iyy,own its \
weighted second moments about its own centroid, dy = y_i − ȳ and dx = x_i − x̄. The parallel \
axis theorem then gives I = Σ(I_own + A·d²).",
    )));
    let g = |x: f64, p: i32| fig(u, u.geo(x, p));
    let mut body: Vec<Vec<Line>> = ts
        .iter()
        .map(|t| {
            let mut name = user(&t.name);
            if t.void {
                name.push(Span::Own(" (void)".into()));
            }
            let mut row = vec![name];
            row.extend(cells(vec![
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
            ]));
            row
        })
        .collect();
    let bold = |t: String| vec![Span::Bold(t)];
    body.push(vec![
        bold("Σ".into()),
        own(""),
        bold(g(tot.a, 2)),
        own(""),
        own(""),
        bold(g(tot.ixx_own, 4)),
        bold(g(tot.iyy_own, 4)),
        own(""),
        own(""),
        bold(g(tot.a_dy2, 4)),
        bold(g(tot.a_dx2, 4)),
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
        body,
    );
    let p = &a.props;
    let (xbar, ybar) = if tot.a > 0.0 {
        (tot.ax / tot.a, tot.ay / tot.a)
    } else {
        (f64::NAN, f64::NAN)
    };
    s.push(Block::Para(own(
        "Check of the method against the section's own results:",
    )));
    // `a + b` written as `a − |b|` when b is negative.
    let sum = |x: f64, y: f64| {
        let (op, y) = if y < 0.0 { ("−", -y) } else { ("+", y) };
        format!("{} {op} {}", g(x, 4), g(y, 4))
    };
    s.push(Block::List(vec![
        own(format!(
            "x̄ = ΣA·x_i / ΣA = {} {l1}, ȳ = ΣA·y_i / ΣA = {} {l1} (section: {}, {})",
            g(xbar, 1),
            g(ybar, 1),
            g(p.centroid.x, 1),
            g(p.centroid.y, 1)
        )),
        own(format!(
            "Ixx = ΣIxx,own + ΣA·dy² = {} = {} {l4} (section: {})",
            sum(tot.ixx_own, tot.a_dy2),
            g(tot.ixx(), 4),
            g(p.ixx, 4)
        )),
        own(format!(
            "Iyy = ΣIyy,own + ΣA·dx² = {} = {} {l4} (section: {})",
            sum(tot.iyy_own, tot.a_dx2),
            g(tot.iyy(), 4),
            g(p.iyy, 4)
        )),
    ]));
}

fn results(s: &mut Vec<Block>, a: &Analysis, u: &OutUnits) {
    s.push(Block::Heading(2, own("Results")));
    let rs = rows(a, u);
    let heads = group_heads(&rs, a.net.is_some());
    let body: Vec<Vec<Line>> = rs
        .iter()
        .zip(heads)
        .map(|(r, head)| {
            vec![
                own(head),
                user(&r.symbol),
                own(r.value.map_or("—".into(), |v| fig(u, v))),
                own(r.unit.clone()),
                own(r.meaning),
            ]
        })
        .collect();
    if a.net.is_some() {
        s.push(Block::Para(own(
            "The section has holes: the gross section leaves them out and gives stiffness, \
torsion, the shear centre, Mcr, self-weight and deflections; the net section subtracts them and \
gives the stresses and the member's bending stress. Each group names its section.",
        )));
    }
    s.push(Block::Para(own(format!(
        "Axes and symbols: {}.",
        u.notation.note()
    ))));
    table(s, &["group", "symbol", "value", "unit", "meaning"], body);
    s.push(Block::Para(match &a.torsion {
        None => own("Torsion was not computed for this sheet."),
        Some(Err(e)) => vec![
            Span::Own("Torsion is not available: ".into()),
            Span::User(e.to_string()),
        ],
        Some(Ok(t)) => vec![
            Span::Own("Torsion by ".into()),
            Span::User(t.method.clone()),
            Span::Own(format!(
                " ({} elements), estimated relative error {}.",
                t.elements,
                sig(t.rel_error, 2)
            )),
        ],
    }));
}

/// One line per extreme: value and point.
fn extreme_lines(out: &mut Vec<Line>, e: &Extremes, u: &OutUnits, prefix: &Line) {
    let st = u.stress();
    let l = u.length.name();
    for (what, p) in [
        ("largest σ", &e.max_tension),
        ("smallest σ", &e.max_compression),
    ] {
        let mut line = prefix.clone();
        line.push(Span::Own(format!(
            "{what} = {} {} at ({}, {}) {l}",
            fig(u, st.from_si(p.value)),
            st.name,
            fig(u, u.geo(p.x, 1)),
            fig(u, u.geo(p.y, 1)),
        )));
        out.push(line);
    }
}

/// The joints between parts, with the side each bridge cuts off, so the flow can be
/// redone by hand.
fn connections(s: &mut Vec<Block>, a: &Analysis, u: &OutUnits) {
    if a.connections.is_empty() {
        return;
    }
    let (l, qu) = (u.length.name(), u.shear_flow());
    s.push(Block::Heading(2, own("Connections")));
    s.push(Block::Para(own(format!(
        "Joints are boundaries of positive length that two solid parts share. Where cutting a \
joint separates the section in two, the longitudinal shear flow it carries follows from \
the equilibrium of the side cut off (gross section, modular ratios, voids inside that side \
subtracted): q = |(Vy·Iyy − Vx·Ixy)·Qx + (Vx·Ixx − Vy·Ixy)·Qy| / (Ixx·Iyy − Ixy²), with \
Qx = A′·(ȳ′ − ȳ) and Qy = A′·(x̄′ − x̄) of that side (area A′, centroid x̄′, ȳ′). {}Flows \
in {}.",
        cell_method(a),
        qu.name
    ))));
    let name = |i: usize| Span::User(a.pieces[i].name.clone());
    let body: Vec<Vec<Line>> = a
        .connections
        .iter()
        .map(|c| {
            let none = || cells(vec!["—".into(); 5]);
            let (side, rest) = match &c.flow {
                Flow::Exact(cut) => {
                    let mut side = Vec::new();
                    for (k, &i) in cut.side.iter().enumerate() {
                        if k > 0 {
                            side.push(Span::Own(", ".into()));
                        }
                        side.push(name(i));
                    }
                    (
                        side,
                        cells(vec![
                            fig(u, u.geo(cut.area, 2)),
                            fig(u, u.geo(cut.centroid.x, 1)),
                            fig(u, u.geo(cut.centroid.y, 1)),
                            fig(u, u.geo(cut.qx, 3)),
                            fig(u, u.geo(cut.qy, 3)),
                        ]),
                    )
                }
                Flow::ClosedCell => (
                    own(match a.cell_flow_under_actions(c) {
                        Some(j) => format!(
                            "closed cell: from the flexure solution, estimate {}",
                            sig(j.rel_error, 2)
                        ),
                        None if a.flexure().is_some() => {
                            "closed cell: from the flexure solution".into()
                        }
                        None => "closed cell: needs the flexure solution".into(),
                    }),
                    none(),
                ),
                Flow::VoidAcross(_) | Flow::StrayVoid(_) => (own("a void lies across"), none()),
            };
            let q = |v: Option<f64>| own(v.map_or("—".into(), |q| fig(u, qu.from_si(q))));
            let mut row = vec![
                vec![name(c.joint.a), Span::Own(" – ".into()), name(c.joint.b)],
                own(fig(u, u.geo(c.joint.length, 1))),
                side,
            ];
            row.extend(rest);
            row.push(q(a.connection_flow(c)));
            row.push(q(a.connection_flow_at_vmax(c)));
            row
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
        body,
    );
}

/// How the flows of joints on a closed cell are found (empty without such joints).
fn cell_method(a: &Analysis) -> &'static str {
    if !a.connections.iter().any(|c| c.flow == Flow::ClosedCell) {
        return "";
    }
    if a.flexure().is_some() {
        "Joints on a closed cell are statically indeterminate: their flow is taken from the \
finite-element flexure solution, as the flux across the shared boundary that balances the \
change of each part's bending force (the flows out of a part sum to it on every mesh), \
with its estimated error (Richardson over the last three meshes, relative to the larger \
of the flow and the largest part's change of force); a flow whose estimate is above the \
tolerance is not given. "
    } else {
        "Joints on a closed cell are statically indeterminate: their flow needs the \
finite-element flexure solution, which was not run for this sheet (torsion off), so none \
is given. "
    }
}

/// The shear stresses and shear areas: how they were found, or why they are not given.
fn shear(s: &mut Vec<Block>, a: &Analysis, u: &OutUnits) {
    s.push(Block::Heading(2, own("Shear")));
    let Some(sh) = &a.shear else {
        s.push(Block::Para(own(match &a.torsion {
            None => {
                "The shear areas and shear stresses need the finite-element solution, which \
was not run for this sheet (torsion off): they are not given."
            }
            _ => "The shear areas and shear stresses are not available (the warnings say why).",
        })));
        return;
    };
    let nu = a.flexure().map_or(f64::NAN, |f| f.nu_ref);
    let mut text = format!(
        "Saint-Venant flexure solved by finite elements on the torsion mesh (Pilkey, Analysis \
and Design of Elastic Beams, 2002, ch. 6), ν = {} for the first material. Shear areas are \
energy-consistent, A_s = V²/(G·∫τ²/G dA), transformed to G of the first material. Shear \
forces act through the flexural centre and T about the shear centre; the stresses are on \
the gross region (holes left out), sampled at the mesh nodes; materials are taken as \
isotropic. The von Mises stress √(σ² + 3τ²) adds the normal stress of N, Mx, My.",
        fig(u, nu)
    );
    if let (Some(act), Some(p)) = (&a.section.actions, &sh.tau_max) {
        let (f, m, st) = (u.force(), u.moment(), u.stress());
        text.push_str(&format!(
            " Under Vx = {} {f}, Vy = {} {f}, T = {} {m}: τmax = {} {st} at ({}, {}).",
            fig(u, f.from_si(act.vx.unwrap_or(0.0))),
            fig(u, f.from_si(act.vy.unwrap_or(0.0))),
            fig(u, m.from_si(act.t.unwrap_or(0.0))),
            fig(u, st.from_si(p.value)),
            fig(u, u.geo(p.at.x, 1)),
            fig(u, u.geo(p.at.y, 1)),
            f = f.name,
            m = m.name,
            st = st.name,
        ));
    }
    s.push(Block::Para(own(text)));
}

fn checks(s: &mut Vec<Block>, a: &Analysis, u: &OutUnits) {
    if a.stress.is_none() && a.member.is_none() {
        return;
    }
    s.push(Block::Heading(2, own("Checks")));
    if let (Some(st), Some(act)) = (&a.stress, &a.section.actions) {
        let (f, m) = (u.force(), u.moment());
        s.push(Block::Heading(3, own("Stresses under the actions")));
        s.push(Block::Para(own(format!(
            "N = {} {}, Mx = {} {}, My = {} {} (tension positive; positive Mx compresses the \
+y fibres, positive My the +x fibres). σ = N/A + a·(x − x̄) + b·(y − ȳ), the flexure \
formula for unsymmetric sections{}.",
            fig(u, f.from_si(act.n)),
            f.name,
            fig(u, m.from_si(act.mx)),
            m.name,
            fig(u, m.from_si(act.my)),
            m.name,
            if a.net.is_some() {
                ", on the net section (holes subtracted)"
            } else {
                ""
            }
        ))));
        let mut items = Vec::new();
        extreme_lines(&mut items, &st.extremes, u, &Vec::new());
        items.push(own(match st.neutral_axis_angle_deg {
            Some(d) => format!("neutral axis at {}° from +x, counter-clockwise", fig(u, d)),
            None => "no neutral axis (axial force only)".into(),
        }));
        for (name, e) in &st.per_material {
            let prefix = vec![Span::User(name.clone()), Span::Own(": ".into())];
            extreme_lines(&mut items, e, u, &prefix);
        }
        s.push(Block::List(items));
    }
    if let (Some(mr), Some(mb)) = (&a.member, &a.section.member) {
        s.push(Block::Heading(3, own("Member")));
        s.push(Block::List(member_lines(a, mr, mb, u)));
    }
}

/// The member check line by line, with its assumptions.
fn member_lines(
    a: &Analysis,
    mr: &crate::analysis::MemberResult,
    mb: &crate::geom::resolve::Member,
    u: &OutUnits,
) -> Vec<Line> {
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
    let mut out = vec![own(format!(
        "{support}, span L = {} {l}",
        plain(u.metres(mb.length))
    ))];
    let mut load = format!("uniform load {} {}", fig(u, w.from_si(mb.udl)), w.name);
    if mb.self_weight {
        load.push_str(&format!(
            ", plus self-weight {} {} (mass × g, g = {GRAVITY} m/s²)",
            fig(u, w.from_si(mr.self_weight)),
            w.name
        ));
    }
    out.push(own(load));
    for (p, at) in &mb.points {
        out.push(own(format!(
            "point load {} {} at {} {l}",
            fig(u, f.from_si(*p)),
            f.name,
            plain(u.metres(*at))
        )));
    }
    let at = |x: Option<f64>| {
        x.map_or(String::new(), |x| {
            format!(" at x = {} {l}", fig(u, u.metres(x)))
        })
    };
    let r = mr.result.as_ref();
    out.push(own(format!(
        "Mmax = {} {}{}",
        fig(u, m.from_si(mr.m_max)),
        m.name,
        at(r.map(|r| r.m_max_at)),
    )));
    out.push(own(format!(
        "Vmax = {} {}{}",
        fig(u, f.from_si(mr.v_max)),
        f.name,
        at(r.map(|r| r.v_max_at)),
    )));
    out.push(own(match mr.deflection_max {
        Some(dm) => format!(
            "δmax = {} {}{} against δallow = L/{} = {} {} (ratio {})",
            fig(u, d.from_si(dm)),
            d.name,
            at(r.map(|r| r.deflection_at)),
            plain(mb.deflection_limit),
            fig(u, d.from_si(mr.deflection_allowed)),
            d.name,
            fig(u, dm / mr.deflection_allowed)
        ),
        None if mr.shear_deflection_note.is_some() => {
            "deflection not computed: shear deformation is asked for but there is no shear area \
(see the warnings)"
                .into()
        }
        None => "deflection not computed: no modulus of elasticity given".into(),
    }));
    if let (Some(ds), Some(dm)) = (mr.deflection_shear, mr.deflection_max) {
        let bending = dm - ds;
        let share = if bending > 0.0 {
            format!(
                ", {} % of the bending deflection",
                fig(u, 100.0 * ds / bending)
            )
        } else {
            String::new()
        };
        let redundants = match mb.support {
            Support::Fixed | Support::Propped => {
                "; the reactions and moments include the shear flexibility"
            }
            Support::Simple | Support::Cantilever => "",
        };
        out.push(own(format!(
            "shear deformation (Timoshenko beam, G·A_s,y from the flexure solution's shear area) \
adds {} {}{share}{redundants}",
            fig(u, d.from_si(ds)),
            d.name,
        )));
    }
    let net = if a.net.is_some() { ", net section" } else { "" };
    for fb in &mr.fibres {
        let mut line = vec![Span::Own("σb".into())];
        if let Some(name) = &fb.material {
            line.push(Span::Own(" in ".into()));
            line.push(Span::User(name.clone()));
        }
        let mut rest = format!(
            " = n·Mmax·c/Ixx = {} {} (c to its own farthest fibre{net})",
            fig(u, st.from_si(fb.stress)),
            st.name
        );
        match fb.fy {
            Some(fy) => rest.push_str(&format!(
                " against fy = {} {} (ratio {})",
                fig(u, st.from_si(fy)),
                st.name,
                fig(u, fb.stress / fy)
            )),
            None => rest.push_str(" (no fy given: not in the utilisation)"),
        }
        line.push(Span::Own(rest));
        out.push(line);
    }
    if let Some(gm) = &mr.governing_material {
        out.push(vec![
            Span::Own("governing material: ".into()),
            Span::User(gm.clone()),
        ]);
    }
    out.push(own(match mr.utilization {
        Some(x) => format!(
            "utilisation = max(σb/fy of each material, δmax/δallow) = {}",
            fig(u, x)
        ),
        None => "utilisation not formed (neither fy nor E given)".into(),
    }));
    out.push(match (mr.mcr, mr.beta_x, a.section.materials.first()) {
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
            vec![
                Span::Own(format!(
                    "Mcr = {} {}: elastic lateral-torsional buckling of the simple span, \
Mcr = c1·(π²EIy/L²)·(s·βx/2 + √((βx/2)² + Cw/Iy + GJL²/(π²EIy))) (Trahair, Flexural-Torsional \
Buckling of Structures, ch. 7; Timoshenko & Gere when βx = 0). Assumed: ends free to warp and \
prevented from twisting, load at the shear centre, c1 = {} ({}), G = {} {} of ",
                    fig(u, m.from_si(x)),
                    m.name,
                    plain(mb.c1),
                    if mb.c1 == 1.0 {
                        "uniform moment, the least favourable diagram for a simple span"
                    } else {
                        "moment-gradient factor as given"
                    },
                    fig(u, st.from_si(mat.g)),
                    st.name,
                )),
                Span::User(mat.name.clone()),
                Span::Own(format!(
                    " ({g_from}), βx = {} {l} with the finite-element shear centre, {side}",
                    fig(u, u.metres(bx)),
                )),
            ]
        }
        _ => own(format!(
            "Mcr not computed: {}",
            mr.mcr_note.as_ref().map_or("no value".to_string(), |r| r.to_string())
        )),
    });
    out
}
