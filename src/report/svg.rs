//! `kern svg`: the section drawn to scale as a self-contained SVG image — every
//! enabled part's exact outline (circular arcs as SVG arcs), voids hatched with a dashed
//! outline, the overall width and depth dimensioned, the centroid, the principal axes,
//! the shear centre when torsion is known, the kern, the neutral axis under the
//! actions, a legend and the caution.
//!
//! The file's y axis points up; SVG's points down, so every y is flipped. Coordinates
//! are written with two decimals, so the same section always gives the same bytes.

use super::out::OutUnits;
use super::table::FIGURES;
use super::CAUTION;
use crate::analysis::Analysis;
use crate::geom::contour::clip_line;
use crate::geom::{Contour, Pt, Seg};
use crate::text::xml;
use std::f64::consts::FRAC_PI_2;

/// Width of the image in px.
const WIDTH: f64 = 760.0;
/// The largest the section itself is drawn, px.
const MAX_W: f64 = 540.0;
const MAX_H: f64 = 460.0;
const LEFT: f64 = 70.0;
const TOP: f64 = 50.0;
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
    let v = View {
        k,
        ox: LEFT + (MAX_W - w * k) / 2.0,
        oy: TOP,
        b,
    };
    let bottom = v.y(b[2]);
    // Room below the drawing for the dimension line, up to three lines of legend and
    // the caution.
    let height = bottom + DIM_GAP + 120.0;
    let l = u.length.name();
    let val = |x: f64| u.num(u.geo(x, 1), FIGURES);
    let mut s = String::new();
    s.push_str(&format!(
        "<svg xmlns=\"http://www.w3.org/2000/svg\" width=\"{w}\" height=\"{h}\" viewBox=\"0 0 {w} {h}\" font-family=\"sans-serif\" font-size=\"12\">\n",
        w = n(WIDTH),
        h = n(height)
    ));
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
    // The caution stays whole on one line (10 px type fits it across the page).
    s.push_str(&format!(
        "<text x=\"{}\" y=\"{}\" font-size=\"10\" fill=\"#555555\">{}</text>\n",
        n(LEFT - 50.0),
        n(foot + 3.0),
        xml(CAUTION)
    ));
    s.push_str("</svg>\n");
    s
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
