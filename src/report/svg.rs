//! `kern svg`: the section drawn to scale as a self-contained SVG image — every
//! enabled part's exact outline (circular arcs as SVG arcs), voids hatched with a dashed
//! outline, the overall width and depth dimensioned, each part's own sizes (chains of
//! the parts' edges above and left of the section, the holes' centres in an outer
//! chain, each round hole's diameter beside it, the parts numbered and listed with
//! their dimensions below), the centroid, the principal axes, the shear centre when
//! torsion is known, the kern, the neutral axis under the actions, a legend and the
//! caution.
//!
//! The file's y axis points up; SVG's points down, so every y is flipped. Coordinates
//! are written with two decimals, so the same section always gives the same bytes.

use super::markdown::{dimensions, plain};
use super::out::OutUnits;
use super::table::FIGURES;
use super::CAUTION;
use crate::analysis::Analysis;
use crate::geom::contour::clip_line;
use crate::geom::moments::Moments;
use crate::geom::BoundaryIntegral;
use crate::geom::{Contour, Pt, Seg};
use crate::text::xml;
use std::f64::consts::FRAC_PI_2;

/// Width of the image in px.
const WIDTH: f64 = 760.0;
/// The largest the section itself is drawn, px.
const MAX_W: f64 = 520.0;
const MAX_H: f64 = 460.0;
const LEFT: f64 = 90.0;
const TOP: f64 = 60.0;
/// Gap from the section to a dimension line, px.
const DIM_GAP: f64 = 34.0;
/// How far the axes reach beyond the section, px.
const PAD: f64 = 14.0;
/// Characters a legend line holds across the drawing's width (11 px sans-serif).
const LEGEND_CHARS: usize = 115;

/// Maps the file frame to the image.
struct View {
    k: f64,
    ox: f64,
    oy: f64,
    b: [f64; 4],
}

impl View {
    fn x(&self, x: f64) -> f64 {
        self.ox + (x - self.b[0]) * self.k
    }
    fn y(&self, y: f64) -> f64 {
        self.oy + (self.b[3] - y) * self.k
    }
    /// `x y` of a point, in px.
    fn pt(&self, p: Pt) -> String {
        format!("{} {}", n(self.x(p.x)), n(self.y(p.y)))
    }
}

/// A coordinate with two decimals, never `-0.00`.
fn n(v: f64) -> String {
    let s = format!("{v:.2}");
    if s == "-0.00" {
        "0.00".into()
    } else {
        s
    }
}

/// The SVG path data of one closed contour: lines as `L`, each arc as SVG `A` pieces of
/// at most a quarter turn (so the large-arc flag is always 0 and a full circle needs
/// no special case).
fn contour_path(c: &Contour, v: &View) -> String {
    let Some(first) = c.segs.first() else {
        return String::new();
    };
    let mut d = format!("M {}", v.pt(first.start()));
    for s in &c.segs {
        match *s {
            Seg::Line(_, q) => d.push_str(&format!(" L {}", v.pt(q))),
            Seg::Arc { c, r, a0, a1 } => {
                let pieces = ((a1 - a0).abs() / FRAC_PI_2).ceil().clamp(1.0, 8.0) as usize;
                // Counter-clockwise in the file frame is counter-clockwise on screen,
                // which is SVG's negative sweep once y is flipped.
                let sweep = if a1 > a0 { 0 } else { 1 };
                let rr = n(r * v.k);
                for i in 1..=pieces {
                    let t = a0 + (a1 - a0) * i as f64 / pieces as f64;
                    let q = Pt::new(c.x + r * t.cos(), c.y + r * t.sin());
                    d.push_str(&format!(" A {rr} {rr} 0 0 {sweep} {}", v.pt(q)));
                }
            }
        }
    }
    d.push_str(" Z");
    d
}

/// The drawing of one analysed section.
pub fn drawing(a: &Analysis, u: &OutUnits) -> String {
    let p = &a.props;
    let b = p.bounds;
    let (w, h) = (
        (b[1] - b[0]).max(f64::MIN_POSITIVE),
        (b[3] - b[2]).max(f64::MIN_POSITIVE),
    );
    let k = (MAX_W / w).min(MAX_H / h);
    let chains = Chains::of(a, w.max(h));
    let v = View {
        k,
        ox: LEFT + (MAX_W - w * k) / 2.0,
        oy: TOP + CHAIN_STEP * chains.x.len() as f64,
        b,
    };
    let bottom = v.y(b[2]);
    let l = u.length.name();
    let val = |x: f64| u.num(u.geo(x, 1), FIGURES);
    let mut s = String::new();
    s.push_str(concat!(
        "<defs>\n",
        "<pattern id=\"hatch\" patternUnits=\"userSpaceOnUse\" width=\"6\" height=\"6\" patternTransform=\"rotate(45)\">",
        "<rect width=\"6\" height=\"6\" fill=\"#ffffff\"/><line x1=\"0\" y1=\"0\" x2=\"0\" y2=\"6\" stroke=\"#8a96a3\" stroke-width=\"1\"/></pattern>\n",
        "<marker id=\"arrow\" viewBox=\"0 0 10 10\" refX=\"10\" refY=\"5\" markerWidth=\"8\" markerHeight=\"8\" orient=\"auto-start-reverse\">",
        "<path d=\"M 0 0 L 10 5 L 0 10 Z\" fill=\"#333333\"/></marker>\n",
        "</defs>\n",
        "<rect width=\"100%\" height=\"100%\" fill=\"#ffffff\"/>\n",
    ));
    let title = a.section.title.as_deref().unwrap_or("(untitled section)");
    s.push_str(&format!(
        "<text x=\"{}\" y=\"24\" font-size=\"15\" font-weight=\"bold\">{}</text>\n",
        n(LEFT),
        xml(title)
    ));
    // Parts: solids first, then voids over them.
    for void in [false, true] {
        for piece in a.all_pieces().iter().filter(|q| q.void == void) {
            let d: Vec<String> = piece.contours.iter().map(|c| contour_path(c, &v)).collect();
            let style = if void {
                "fill=\"url(#hatch)\" stroke=\"#1f3550\" stroke-width=\"1.2\" stroke-dasharray=\"5 3\""
            } else {
                "fill=\"#c9d6e3\" stroke=\"#1f3550\" stroke-width=\"1.4\""
            };
            s.push_str(&format!(
                "<path d=\"{}\" fill-rule=\"evenodd\" {style}><title>{}</title></path>\n",
                d.join(" "),
                xml(&piece.name)
            ));
        }
    }
    // Overall dimensions.
    let (x0, x1, y0, y1) = (v.x(b[0]), v.x(b[1]), v.y(b[3]), bottom);
    let dim = "stroke=\"#333333\" stroke-width=\"0.8\"";
    let yd = y1 + DIM_GAP;
    s.push_str(&format!(
        "<g {dim} fill=\"none\"><line x1=\"{a}\" y1=\"{t}\" x2=\"{a}\" y2=\"{e}\"/><line x1=\"{c}\" y1=\"{t}\" x2=\"{c}\" y2=\"{e}\"/>\
<line x1=\"{a}\" y1=\"{yd}\" x2=\"{c}\" y2=\"{yd}\" marker-start=\"url(#arrow)\" marker-end=\"url(#arrow)\"/></g>\n",
        a = n(x0),
        c = n(x1),
        t = n(y1 + 4.0),
        e = n(yd + 4.0),
        yd = n(yd)
    ));
    s.push_str(&format!(
        "<text x=\"{}\" y=\"{}\" text-anchor=\"middle\">{} {l}</text>\n",
        n((x0 + x1) / 2.0),
        n(yd + 16.0),
        val(w)
    ));
    let xd = x1 + DIM_GAP;
    s.push_str(&format!(
        "<g {dim} fill=\"none\"><line x1=\"{s0}\" y1=\"{a}\" x2=\"{e}\" y2=\"{a}\"/><line x1=\"{s0}\" y1=\"{c}\" x2=\"{e}\" y2=\"{c}\"/>\
<line x1=\"{xd}\" y1=\"{a}\" x2=\"{xd}\" y2=\"{c}\" marker-start=\"url(#arrow)\" marker-end=\"url(#arrow)\"/></g>\n",
        s0 = n(x1 + 4.0),
        e = n(xd + 4.0),
        a = n(y0),
        c = n(y1),
        xd = n(xd)
    ));
    let (tx, ty) = (n(xd + 16.0), n((y0 + y1) / 2.0));
    s.push_str(&format!(
        "<text x=\"{tx}\" y=\"{ty}\" text-anchor=\"middle\" transform=\"rotate(-90 {tx} {ty})\">{} {l}</text>\n",
        val(h)
    ));
    // Each part's own sizes: chains of the parts' edges above and left of the
    // section, the holes' centres in a chain of their own, and each round hole's
    // diameter beside it.
    let short = |x: f64| plain(u.geo(x, 1));
    for (i, lv) in chains.x.iter().enumerate() {
        let at = y0 - DIM_GAP - 2.0 - CHAIN_STEP * i as f64;
        chain(&mut s, &v, lv, true, at, y0, &short);
    }
    for (i, lv) in chains.y.iter().enumerate() {
        let at = x0 - DIM_GAP - 2.0 - CHAIN_STEP * i as f64;
        chain(&mut s, &v, lv, false, at, x0, &short);
    }
    for &(c, d) in &chains.round {
        let (px, py, r) = (v.x(c.x), v.y(c.y), d / 2.0 * k);
        s.push_str(&format!(
            "<g stroke=\"#1f3550\" stroke-width=\"0.6\"><line x1=\"{}\" y1=\"{y}\" x2=\"{}\" y2=\"{y}\"/><line x1=\"{x}\" y1=\"{}\" x2=\"{x}\" y2=\"{}\"/></g>\n",
            n(px - r - 3.0),
            n(px + r + 3.0),
            n(py - r - 3.0),
            n(py + r + 3.0),
            x = n(px),
            y = n(py)
        ));
        s.push_str(&format!(
            "<text x=\"{}\" y=\"{}\" font-size=\"10\">⌀{}</text>\n",
            n(px + r * 0.71 + 4.0),
            n(py - r * 0.71 - 4.0),
            short(d)
        ));
    }
    // Numbers of the solid parts (as in the table of parts below), when there are
    // several, at each part's own centroid (moved off the section's centroid mark).
    let solids: Vec<&crate::geom::Piece> = a.all_pieces().iter().filter(|q| !q.void).collect();
    if solids.len() > 1 {
        let (cx, cy) = (v.x(p.centroid.x), v.y(p.centroid.y));
        for q in &solids {
            let Some(m) = Moments::of_contours(&q.contours).centroid() else {
                continue;
            };
            let (mut bx, mut by) = (v.x(m.x), v.y(m.y));
            if (bx - cx).hypot(by - cy) < 18.0 {
                let e = q.bounds().unwrap_or(b);
                if e[1] - e[0] >= e[3] - e[2] {
                    bx += (e[1] - e[0]) * k / 4.0;
                } else {
                    by -= (e[3] - e[2]) * k / 4.0;
                }
            }
            s.push_str(&format!(
                "<g><circle cx=\"{x}\" cy=\"{y}\" r=\"7\" fill=\"#ffffff\" stroke=\"#1f3550\" stroke-width=\"0.8\"/>\
<text x=\"{x}\" y=\"{ty}\" font-size=\"9\" text-anchor=\"middle\">{}</text></g>\n",
                q.part + 1,
                x = n(bx),
                y = n(by),
                ty = n(by + 3.0)
            ));
        }
    }
    let mut legend = vec!["filled: solid", "hatched, dashed: void"];
    // The kern, dotted.
    if a.kern.len() >= 3 {
        let pts: Vec<String> = a
            .kern
            .iter()
            .map(|&(x, y)| v.pt(Pt::new(x, y)).replace(' ', ","))
            .collect();
        s.push_str(&format!(
            "<polygon points=\"{}\" fill=\"none\" stroke=\"#2a7a2a\" stroke-width=\"1.2\" stroke-dasharray=\"1.5 3\"/>\n",
            pts.join(" ")
        ));
        legend.push("dotted: kern");
    }
    // Principal axes through the centroid, dash-dot, clipped a little beyond the section.
    let c = p.centroid;
    let pad = PAD / k;
    let frame = [b[0] - pad, b[1] + pad, b[2] - pad, b[3] + pad];
    for (label, deg) in [
        ("1", p.principal.angle_deg),
        ("2", p.principal.angle_deg + 90.0),
    ] {
        let t = deg.to_radians();
        let Some((e0, e1)) = clip_line(c, Pt::new(t.cos(), t.sin()), frame) else {
            continue;
        };
        s.push_str(&format!(
            "<line x1=\"{}\" y1=\"{}\" x2=\"{}\" y2=\"{}\" stroke=\"#7a3d9a\" stroke-width=\"0.9\" stroke-dasharray=\"12 3 2 3\"/>\n",
            n(v.x(e0.x)),
            n(v.y(e0.y)),
            n(v.x(e1.x)),
            n(v.y(e1.y))
        ));
        s.push_str(&format!(
            "<text x=\"{}\" y=\"{}\" fill=\"#7a3d9a\">{label}</text>\n",
            n(v.x(e1.x) + 4.0),
            n(v.y(e1.y) - 4.0)
        ));
    }
    legend.push("dash-dot: principal axes 1, 2");
    // The neutral axis under the actions.
    if let Some(st) = &a.stress {
        if let Some([q0, q1]) = st
            .field
            .neutral_axis_in_box(frame[0], frame[1], frame[2], frame[3])
        {
            s.push_str(&format!(
                "<line x1=\"{}\" y1=\"{}\" x2=\"{}\" y2=\"{}\" stroke=\"#c0392b\" stroke-width=\"1.4\"/>\n",
                n(v.x(q0.0)),
                n(v.y(q0.1)),
                n(v.x(q1.0)),
                n(v.y(q1.1))
            ));
            s.push_str(&format!(
                "<text x=\"{}\" y=\"{}\" fill=\"#c0392b\">NA</text>\n",
                n(v.x(q1.0) + 4.0),
                n(v.y(q1.1) + 12.0)
            ));
            legend.push("red: neutral axis under the actions");
        }
    }
    // The joints between parts (their shear flow is in the Connections table): a
    // cross at the middle of each shared stretch of boundary.
    let marks: Vec<Pt> = (a.connections.iter())
        .flat_map(|c| c.joint.marks.iter().copied())
        .collect();
    for m in &marks {
        let (jx, jy) = (v.x(m.x), v.y(m.y));
        s.push_str(&format!(
            "<path d=\"M{} {}L{} {}M{} {}L{} {}\" stroke=\"#117a65\" stroke-width=\"1.6\"/>\n",
            n(jx - 4.0),
            n(jy - 4.0),
            n(jx + 4.0),
            n(jy + 4.0),
            n(jx - 4.0),
            n(jy + 4.0),
            n(jx + 4.0),
            n(jy - 4.0)
        ));
    }
    if !marks.is_empty() {
        legend.push("green cross: joint between parts (its shear flow under Connections)");
    }
    // The shear centre, when torsion is known.
    if let Some(sc) = super::rows::shear_centre(a) {
        let (sx, sy) = (v.x(sc.x), v.y(sc.y));
        s.push_str(&format!(
            "<rect x=\"{}\" y=\"{}\" width=\"8\" height=\"8\" fill=\"none\" stroke=\"#b36b00\" stroke-width=\"1.4\" transform=\"rotate(45 {} {})\"/>\n",
            n(sx - 4.0),
            n(sy - 4.0),
            n(sx),
            n(sy)
        ));
        s.push_str(&format!(
            "<text x=\"{}\" y=\"{}\" fill=\"#b36b00\">S ({}, {}) {l}</text>\n",
            n(sx + 9.0),
            n(sy + 16.0),
            val(sc.x),
            val(sc.y)
        ));
        legend.push("S: shear centre");
    }
    // The centroid: a circle with a cross.
    let (cx, cy) = (v.x(c.x), v.y(c.y));
    s.push_str(&format!(
        "<g stroke=\"#000000\" stroke-width=\"1.2\" fill=\"none\"><circle cx=\"{x}\" cy=\"{y}\" r=\"6\"/>\
<line x1=\"{xa}\" y1=\"{y}\" x2=\"{xb}\" y2=\"{y}\"/><line x1=\"{x}\" y1=\"{ya}\" x2=\"{x}\" y2=\"{yb}\"/></g>\n",
        x = n(cx),
        y = n(cy),
        xa = n(cx - 9.0),
        xb = n(cx + 9.0),
        ya = n(cy - 9.0),
        yb = n(cy + 9.0)
    ));
    s.push_str(&format!(
        "<text x=\"{}\" y=\"{}\">⊕ ({}, {}) {l}</text>\n",
        n(cx + 10.0),
        n(cy - 8.0),
        val(c.x),
        val(c.y)
    ));
    legend.push("⊕: centroid");
    if !chains.x.is_empty() || !chains.y.is_empty() {
        legend.push("top and left: each part's edges, hole centres in the outer row");
    }
    if solids.len() > 1 {
        legend.push("circled: part number");
    }
    legend.push("drawn to scale");
    let mut foot = yd + 46.0;
    for line in wrap(
        &format!("{}; lengths in {l}.", legend.join("; ")),
        LEGEND_CHARS,
    ) {
        s.push_str(&format!(
            "<text x=\"{}\" y=\"{}\" font-size=\"11\">{}</text>\n",
            n(LEFT - 50.0),
            n(foot),
            xml(&line)
        ));
        foot += 15.0;
    }
    // The parts with their own dimensions, numbered as in the sheet.
    foot += 6.0;
    for (i, part) in a
        .section
        .parts
        .iter()
        .enumerate()
        .filter(|(_, q)| q.enabled)
    {
        let kind = if part.hole {
            "hole"
        } else if part.void {
            "void"
        } else {
            "solid"
        };
        let pl = &part.placement;
        let mut line = format!(
            "{}  {}: {} {} ({kind}), at ({}, {}) {}",
            i + 1,
            part.name,
            part.shape.kind(),
            dimensions(&part.shape, u),
            short(pl.at.x),
            short(pl.at.y),
            pl.anchor.name()
        );
        if pl.rotate != 0.0 {
            line.push_str(&format!(", rotated {}°", plain(pl.rotate)));
        }
        s.push_str(&format!(
            "<text x=\"{}\" y=\"{}\" font-size=\"11\">{}</text>\n",
            n(LEFT - 50.0),
            n(foot),
            xml(&clip(&line, LEGEND_CHARS))
        ));
        foot += 14.0;
    }
    // The caution stays whole on one line (10 px type fits it across the page).
    s.push_str(&format!(
        "<text x=\"{}\" y=\"{}\" font-size=\"10\" fill=\"#555555\">{}</text>\n",
        n(LEFT - 50.0),
        n(foot + 3.0),
        xml(CAUTION)
    ));
    s.push_str("</svg>\n");
    format!(
        "<svg xmlns=\"http://www.w3.org/2000/svg\" width=\"{w}\" height=\"{h}\" viewBox=\"0 0 {w} {h}\" font-family=\"sans-serif\" font-size=\"12\">\n{s}",
        w = n(WIDTH),
        h = n(foot + 14.0)
    )
}

/// `text` cut to `width` characters, with `…` where it was cut.
fn clip(text: &str, width: usize) -> String {
    if text.chars().count() <= width {
        return text.to_string();
    }
    let mut t: String = text.chars().take(width.saturating_sub(1)).collect();
    t.push('…');
    t
}

/// The chains of dimensions a section gets: rows of x levels above it and of y levels
/// left of it (innermost first), and the round holes (centre, diameter).
struct Chains {
    x: Vec<Vec<f64>>,
    y: Vec<Vec<f64>>,
    round: Vec<(Pt, f64)>,
}

impl Chains {
    /// The parts' edges (a row only when it says more than the overall size), then the
    /// voids' centres (round ones) or edges from the section's edges.
    fn of(a: &Analysis, size: f64) -> Chains {
        let eps = 1e-9 * size;
        let b = a.props.bounds;
        let pieces = a.all_pieces();
        let mut round = Vec::new();
        let (mut hx, mut hy) = (vec![b[0], b[1]], vec![b[2], b[3]]);
        let (mut sx, mut sy) = (Vec::new(), Vec::new());
        for q in pieces {
            let Some(e) = q.bounds() else { continue };
            if !q.void {
                sx.extend([e[0], e[1]]);
                sy.extend([e[2], e[3]]);
                continue;
            }
            match a.section.parts.get(q.part).map(|p| &p.shape) {
                Some(crate::geom::Shape::Circle { d }) => {
                    let c = Pt::new((e[0] + e[1]) / 2.0, (e[2] + e[3]) / 2.0);
                    round.push((c, *d));
                    hx.push(c.x);
                    hy.push(c.y);
                }
                _ => {
                    hx.extend([e[0], e[1]]);
                    hy.extend([e[2], e[3]]);
                }
            }
        }
        let rows = |parts: Vec<f64>, holes: Vec<f64>| {
            let mut out = Vec::new();
            let parts = levels(parts, eps);
            if parts.len() > 2 {
                out.push(parts);
            }
            let holes = levels(holes, eps);
            if holes.len() > 2 {
                out.push(holes);
            }
            out
        };
        Chains {
            x: rows(sx, hx),
            y: rows(sy, hy),
            round,
        }
    }
}

/// Rows of chain dimensions, px apart.
const CHAIN_STEP: f64 = 24.0;
/// Width of one character of 10 px type, px (for fitting a label between its ticks).
const CHAR_W: f64 = 5.6;

/// Distinct values of `xs`, sorted, closer than `eps` counted once.
fn levels(mut xs: Vec<f64>, eps: f64) -> Vec<f64> {
    xs.retain(|x| x.is_finite());
    xs.sort_by(f64::total_cmp);
    xs.dedup_by(|a, b| (*a - *b).abs() <= eps);
    xs
}

/// A chain of dimensions between consecutive `lv` (file coordinates) along one side:
/// above the section when `horizontal` (the line at height `at` px, extension lines from
/// `from` px), left of it otherwise. Each step is labelled with its length; a label too
/// long for its step is staggered one line further out, alternately, so neighbours do
/// not collide.
fn chain(
    s: &mut String,
    v: &View,
    lv: &[f64],
    horizontal: bool,
    at: f64,
    from: f64,
    label: &dyn Fn(f64) -> String,
) {
    let px = |t: f64| if horizontal { v.x(t) } else { v.y(t) };
    let line = |s: &mut String, a: (f64, f64), b: (f64, f64)| {
        let (a, b) = if horizontal {
            (a, b)
        } else {
            ((a.1, a.0), (b.1, b.0))
        };
        s.push_str(&format!(
            "<line x1=\"{}\" y1=\"{}\" x2=\"{}\" y2=\"{}\"/>",
            n(a.0),
            n(a.1),
            n(b.0),
            n(b.1)
        ));
    };
    s.push_str("<g stroke=\"#333333\" stroke-width=\"0.7\" fill=\"none\">");
    let out = if from > at { -1.0 } else { 1.0 };
    for &t in lv {
        let p = px(t);
        line(s, (p, from + 3.0 * out), (p, at + 4.0 * out));
        // A 45° tick where the extension line meets the dimension line.
        line(s, (p - 3.0, at + 3.0), (p + 3.0, at - 3.0));
    }
    if let (Some(&a), Some(&b)) = (lv.first(), lv.last()) {
        line(s, (px(a), at), (px(b), at));
    }
    s.push_str("</g>\n");
    let mut staggered = false;
    for w in lv.windows(2) {
        let (p0, p1) = (px(w[0]), px(w[1]));
        let text = label(w[1] - w[0]);
        let fits = (p1 - p0).abs() >= text.chars().count() as f64 * CHAR_W + 6.0;
        let off = if fits || !staggered { 4.0 } else { 15.0 };
        staggered = !fits && !staggered;
        let mid = (p0 + p1) / 2.0;
        let d = at + off * out;
        if horizontal {
            s.push_str(&format!(
                "<text x=\"{}\" y=\"{}\" font-size=\"10\" text-anchor=\"middle\">{}</text>\n",
                n(mid),
                n(d),
                xml(&text)
            ));
        } else {
            let (tx, ty) = (n(d), n(mid));
            s.push_str(&format!(
                "<text x=\"{tx}\" y=\"{ty}\" font-size=\"10\" text-anchor=\"middle\" transform=\"rotate(-90 {tx} {ty})\">{}</text>\n",
                xml(&text)
            ));
        }
    }
}

/// `text` broken at spaces into lines of at most `width` characters.
fn wrap(text: &str, width: usize) -> Vec<String> {
    let mut lines: Vec<String> = Vec::new();
    for word in text.split(' ') {
        match lines.last_mut() {
            Some(l) if l.chars().count() + 1 + word.chars().count() <= width => {
                l.push(' ');
                l.push_str(word);
            }
            _ => lines.push(word.to_string()),
        }
    }
    lines
}
