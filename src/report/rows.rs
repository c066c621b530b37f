//! The results of an analysis as labelled rows (quantity, symbol, value, unit), in
//! output units. The `kern calc` table, the Markdown sheet and the workbench's result
//! panel all show these rows, so they always agree.

use super::out::OutUnits;
use crate::analysis::Analysis;
use crate::checks::shear_flow::Flow;

/// One result.
#[derive(Debug, Clone, PartialEq)]
pub struct Row {
    /// The group heading the row belongs to (e.g. "Second moments").
    pub group: &'static str,
    /// Symbol, unique within a section (e.g. "Ixx"); baselines are matched by it.
    pub symbol: String,
    pub value: Option<f64>,
    pub unit: String,
    /// What the row means, in words.
    pub meaning: &'static str,
}

/// Rows for every property, then torsion, stresses and the member check when present.
pub fn rows(a: &Analysis, u: &OutUnits) -> Vec<Row> {
    let p = &a.props;
    let mut out = Vec::new();
    let mut add = |group: &'static str,
                   symbol: &str,
                   value: Option<f64>,
                   unit: String,
                   meaning: &'static str| {
        out.push(Row {
            group,
            symbol: symbol.to_string(),
            value: value.filter(|v| v.is_finite()),
            unit,
            meaning,
        });
    };
    let (l1, l2, l3, l4, l6) = (u.label(1), u.label(2), u.label(3), u.label(4), u.label(6));
    let g = |x: f64, pw| Some(u.geo(x, pw));
    // A finite-element coordinate closer to zero than its estimated error (relative to
    // the section's size) is zero to the figures shown: a symmetric section's shear
    // centre, say.
    let size = (p.bounds[1] - p.bounds[0]).max(p.bounds[3] - p.bounds[2]);
    let fe_coord = |x: f64, err: f64| {
        g(
            if x.abs() < err.max(1e-6) * size {
                0.0
            } else {
                x
            },
            1,
        )
    };
    add(
        "Area",
        "A",
        g(p.area, 2),
        l2.clone(),
        "area (voids subtracted, other materials by modular ratio)",
    );
    add(
        "Centroid",
        "x̄",
        g(p.centroid.x, 1),
        l1.clone(),
        "centroid, x",
    );
    add(
        "Centroid",
        "ȳ",
        g(p.centroid.y, 1),
        l1.clone(),
        "centroid, y",
    );
    add(
        "Second moments",
        "Ixx",
        g(p.ixx, 4),
        l4.clone(),
        "about the centroidal axis parallel to x",
    );
    add(
        "Second moments",
        "Iyy",
        g(p.iyy, 4),
        l4.clone(),
        "about the centroidal axis parallel to y",
    );
    add(
        "Second moments",
        "Ixy",
        g(p.ixy, 4),
        l4.clone(),
        "product of inertia about the centroid",
    );
    add(
        "Principal axes",
        "I1",
        g(p.principal.i1, 4),
        l4.clone(),
        "major principal second moment",
    );
    add(
        "Principal axes",
        "I2",
        g(p.principal.i2, 4),
        l4.clone(),
        "minor principal second moment",
    );
    add(
        "Principal axes",
        "θ",
        Some(p.principal.angle_deg),
        "°".into(),
        "angle from +x to the major axis, counter-clockwise",
    );
    add(
        "Elastic moduli",
        "Sx,top",
        g(p.elastic.x_top, 3),
        l3.clone(),
        "Ixx / (ymax − ȳ)",
    );
    add(
        "Elastic moduli",
        "Sx,bot",
        g(p.elastic.x_bottom, 3),
        l3.clone(),
        "Ixx / (ȳ − ymin)",
    );
    add(
        "Elastic moduli",
        "Sy,left",
        g(p.elastic.y_left, 3),
        l3.clone(),
        "Iyy / (x̄ − xmin)",
    );
    add(
        "Elastic moduli",
        "Sy,right",
        g(p.elastic.y_right, 3),
        l3.clone(),
        "Iyy / (xmax − x̄)",
    );
    if let Some(z) = p.plastic {
        add(
            "Plastic moduli",
            "Zx",
            g(z.zx, 3),
            l3.clone(),
            "plastic modulus about the axis parallel to x",
        );
        add(
            "Plastic moduli",
            "Zy",
            g(z.zy, 3),
            l3.clone(),
            "plastic modulus about the axis parallel to y",
        );
        add(
            "Plastic moduli",
            "yp",
            g(z.y, 1),
            l1.clone(),
            "height of the plastic neutral axis",
        );
        add(
            "Plastic moduli",
            "xp",
            g(z.x, 1),
            l1.clone(),
            "position of the plastic neutral axis parallel to y",
        );
    }
    add(
        "Radii of gyration",
        "rx",
        g(p.gyration.x, 1),
        l1.clone(),
        "√(Ixx/A)",
    );
    add(
        "Radii of gyration",
        "ry",
        g(p.gyration.y, 1),
        l1.clone(),
        "√(Iyy/A)",
    );
    add(
        "Radii of gyration",
        "rmin",
        g(p.gyration.min, 1),
        l1.clone(),
        "√(I2/A)",
    );
    if let Some(n) = &a.net {
        for r in net_rows(&n.props, u) {
            add(r.group, &r.symbol, r.value, r.unit, r.meaning);
        }
    }
    if let Some(m) = a.mass_per_metre() {
        add(
            "Mass",
            "m",
            Some(u.mass().from_si(m)),
            u.mass().name.into(),
            "mass per length",
        );
    }
    if let Some(Ok(t)) = &a.torsion {
        add(
            "Torsion",
            "J",
            g(t.j, 4),
            l4.clone(),
            "Saint-Venant torsion constant",
        );
        add(
            "Torsion",
            "Cw",
            g(t.cw, 6),
            l6.clone(),
            "warping constant about the shear centre",
        );
        add(
            "Torsion",
            "xs",
            fe_coord(t.shear_centre.x, t.rel_error),
            l1.clone(),
            "shear centre, x",
        );
        add(
            "Torsion",
            "ys",
            fe_coord(t.shear_centre.y, t.rel_error),
            l1.clone(),
            "shear centre, y",
        );
        add(
            "Torsion",
            "err",
            Some(100.0 * t.rel_error),
            "%".into(),
            "estimated relative error of J and Cw",
        );
    }
    let su = u.stress();
    if let Some(s) = &a.stress {
        add(
            "Stresses",
            "σmax",
            Some(su.from_si(s.extremes.max_tension.value)),
            su.name.into(),
            "largest normal stress (tension +)",
        );
        add(
            "Stresses",
            "σmin",
            Some(su.from_si(s.extremes.max_compression.value)),
            su.name.into(),
            "smallest normal stress (compression −)",
        );
        add(
            "Stresses",
            "NA",
            s.neutral_axis_angle_deg,
            "°".into(),
            "angle of the neutral axis from +x",
        );
    }
    if let Some(m) = &a.member {
        let d = u.deflection();
        add(
            "Member",
            "Mmax",
            Some(u.moment().from_si(m.m_max)),
            u.moment().name.into(),
            "largest bending moment",
        );
        add(
            "Member",
            "Vmax",
            Some(u.force().from_si(m.v_max)),
            u.force().name.into(),
            "largest shear force",
        );
        add(
            "Member",
            "δmax",
            m.deflection_max.map(|x| d.from_si(x)),
            d.name.into(),
            "largest deflection",
        );
        add(
            "Member",
            "δallow",
            Some(d.from_si(m.deflection_allowed)),
            d.name.into(),
            "span / deflection limit",
        );
        add(
            "Member",
            "σb",
            Some(su.from_si(m.stress_max)),
            su.name.into(),
            "bending stress: the largest n·Mmax·c/Ixx over the materials",
        );
        add(
            "Member",
            "util",
            m.utilization,
            "".into(),
            "utilisation: max(σ/fy of each material, δ/δallow)",
        );
        add(
            "Member",
            "Mcr",
            m.mcr.map(|x| u.moment().from_si(x)),
            u.moment().name.into(),
            "elastic critical moment (LTB), simple span, load at the shear centre",
        );
    }
    let qu = u.shear_flow();
    let shear_given = a
        .section
        .actions
        .is_some_and(|x| x.vx.is_some() || x.vy.is_some());
    for c in &a.connections {
        let pair = format!("{}–{}", a.pieces[c.joint.a].name, a.pieces[c.joint.b].name);
        add(
            "Connections",
            &format!("L {pair}"),
            g(c.joint.length, 1),
            l1.clone(),
            "length of the boundary the two parts share",
        );
        let closed = c.flow == Flow::ClosedCell;
        if shear_given {
            add(
                "Connections",
                &format!("q {pair}"),
                a.connection_flow(c).map(|q| qu.from_si(q)),
                qu.name.into(),
                if closed {
                    "joint on a closed cell: flow needs the flexure solution (not computed)"
                } else {
                    "shear flow across the joint under Vx, Vy of [actions]"
                },
            );
        }
        if a.member.is_some() {
            add(
                "Connections",
                &format!("q@Vmax {pair}"),
                a.connection_flow_at_vmax(c).map(|q| qu.from_si(q)),
                qu.name.into(),
                if closed {
                    "joint on a closed cell: flow needs the flexure solution (not computed)"
                } else {
                    "shear flow across the joint at the member's Vmax (vertical shear)"
                },
            );
        }
    }
    out
}

/// The group of rows for the net section (holes subtracted; FORMAT.md "Gross and
/// net"), symbols marked ",net" so they never match a gross row.
fn net_rows(p: &crate::props::Properties, u: &OutUnits) -> Vec<Row> {
    let g = |x: f64, pw| Some(u.geo(x, pw)).filter(|v| v.is_finite());
    let row = |symbol: &str, value: Option<f64>, pw: i32, meaning: &'static str| Row {
        group: "Net section",
        symbol: format!("{symbol},net"),
        value,
        unit: u.label(pw),
        meaning,
    };
    let mut out = vec![
        row("A", g(p.area, 2), 2, "area with the holes subtracted"),
        row("x̄", g(p.centroid.x, 1), 1, "centroid of the net section, x"),
        row("ȳ", g(p.centroid.y, 1), 1, "centroid of the net section, y"),
        row(
            "Ixx",
            g(p.ixx, 4),
            4,
            "net, about its centroidal axis parallel to x",
        ),
        row(
            "Iyy",
            g(p.iyy, 4),
            4,
            "net, about its centroidal axis parallel to y",
        ),
        row(
            "Ixy",
            g(p.ixy, 4),
            4,
            "net product of inertia about its centroid",
        ),
        row(
            "I1",
            g(p.principal.i1, 4),
            4,
            "net major principal second moment",
        ),
        row(
            "I2",
            g(p.principal.i2, 4),
            4,
            "net minor principal second moment",
        ),
        row("Sx,top", g(p.elastic.x_top, 3), 3, "net Ixx / (ymax − ȳ)"),
        row(
            "Sx,bot",
            g(p.elastic.x_bottom, 3),
            3,
            "net Ixx / (ȳ − ymin)",
        ),
        row("Sy,left", g(p.elastic.y_left, 3), 3, "net Iyy / (x̄ − xmin)"),
        row(
            "Sy,right",
            g(p.elastic.y_right, 3),
            3,
            "net Iyy / (xmax − x̄)",
        ),
    ];
    if let Some(z) = p.plastic {
        out.push(row(
            "Zx",
            g(z.zx, 3),
            3,
            "net plastic modulus, axis parallel to x",
        ));
        out.push(row(
            "Zy",
            g(z.zy, 3),
            3,
            "net plastic modulus, axis parallel to y",
        ));
    }
    out.push(row("rx", g(p.gyration.x, 1), 1, "net √(Ixx/A)"));
    out.push(row("ry", g(p.gyration.y, 1), 1, "net √(Iyy/A)"));
    out.push(row("rmin", g(p.gyration.min, 1), 1, "net √(I2/A)"));
    out
}
