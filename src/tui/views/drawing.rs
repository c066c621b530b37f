//! The drawing: every enabled part's outline to scale with equal scaling on both axes,
//! voids in their own ink, the selected part highlighted, the centroid, the principal
//! axes, the kern, the neutral axis and the extreme fibres under `[actions]`, the shear
//! centre once torsion is solved, every joint between parts, and a labelled scale bar.
//! Braille dots, or one character per cell in ASCII mode. Shaded by a stress
//! ([`crate::tui::shade`]), the material's cells show its level instead of outlines and
//! lines (voids keep their outlines, marks stay), with the peak marked; the legend
//! gives each level's range, or says why the stress is not shaded.

use crate::geom::{solid_bounds, Cover, Pt};
use crate::tui::app::{App, Focus};
use crate::tui::commands::nice_step;
use crate::tui::raster::{Dash, Raster};
use crate::tui::shade::{self, Field, Why};
use crate::tui::theme::{Ink, Theme};
use ratatui::buffer::Buffer;
use ratatui::layout::Rect;

/// Greatest angle between the chords that stand in for an arc in the drawing.
const FACET: f64 = 0.1;

/// Maps the file's frame to dot coordinates with one scale on both axes.
struct View {
    x0: f64,
    y1: f64,
    /// File units per dot across and down.
    sx: f64,
    sy: f64,
}

impl View {
    fn fit(b: [f64; 4], r: &Raster) -> Option<View> {
        let (w, h) = (r.w as f64, r.h as f64);
        let (xr, yr) = ((b[1] - b[0]) * 1.08, (b[3] - b[2]) * 1.08);
        if !(xr.is_finite() && yr.is_finite()) || w < 1.0 || h < 1.0 {
            return None;
        }
        // A cell is taken as twice as tall as it is wide.
        let per_cell = (xr / w).max(yr / (2.0 * h)).max(f64::MIN_POSITIVE);
        let (cx, cy) = ((b[0] + b[1]) / 2.0, (b[2] + b[3]) / 2.0);
        Some(View {
            x0: cx - per_cell * w / 2.0,
            y1: cy + per_cell * h,
            sx: per_cell / r.kx as f64,
            sy: 2.0 * per_cell / r.ky as f64,
        })
    }

    fn at(&self, x: f64, y: f64) -> (f64, f64) {
        ((x - self.x0) / self.sx, (self.y1 - y) / self.sy)
    }

    /// The point of the file frame at dot coordinates (x, y).
    fn back(&self, x: f64, y: f64) -> Pt {
        Pt::new(self.x0 + x * self.sx, self.y1 - y * self.sy)
    }

    /// The visible box in file units.
    fn bounds(&self, r: &Raster) -> [f64; 4] {
        let (dw, dh) = r.dots();
        [
            self.x0,
            self.x0 + dw as f64 * self.sx,
            self.y1 - dh as f64 * self.sy,
            self.y1,
        ]
    }
}

/// Fewest rows of drawing worth showing, above the legend.
const MIN_ROWS: usize = 3;

/// What the drawing is shaded by: nothing, a stress, or a stress asked for and why it
/// is not shaded.
type Shaded = Option<Result<Field, Why>>;

/// The drawing's grid, its view and the legend's lines, fitted to `area`, and the
/// shading: the legend takes the lines it needs at this width, the drawing the rest.
/// `None` when fewer than [`MIN_ROWS`] rows would be left or there is nothing to draw.
fn plan(app: &App, area: Rect) -> Option<(Raster, View, Vec<String>, Shaded)> {
    let a = &app.analysis;
    let b = a
        .pieces
        .iter()
        .filter_map(|p| p.bounds())
        .reduce(crate::geom::contour::union_bounds)
        .or_else(|| solid_bounds(&a.pieces))?;
    let (w, h) = (area.width as usize, area.height as usize);
    let shaded = shade::field(a, app.shading, app.solving);
    // The scale bar's length follows the fit, and the legend's lines the bar: take the
    // first count of legend lines that holds the legend drawn at that fit.
    for n in 1..h.saturating_sub(MIN_ROWS - 1) {
        let r = Raster::new(w, h - n, !app.theme.ascii);
        let v = View::fit(b, &r)?;
        let lines = legend(app, v.sx * r.kx as f64, area.width, &shaded);
        if lines.len() <= n {
            return Some((r, v, lines, shaded));
        }
    }
    None
}

/// Whether the drawing has room in `area` (the pane's inside).
pub fn fits(app: &App, area: Rect) -> bool {
    plan(app, area).is_some()
}

/// Draws the section into `area`, the legend on its last lines.
pub fn render(app: &App, area: Rect, buf: &mut Buffer) {
    let Some((mut r, v, legend, shaded)) = plan(app, area) else {
        return;
    };
    let th = &app.theme;
    let a = &app.analysis;
    let vb = v.bounds(&r);
    let line = |r: &mut Raster, p: (f64, f64), q: (f64, f64), ink, dash| {
        r.line(v.at(p.0, p.1), v.at(q.0, q.1), ink, dash)
    };
    let field = shaded.as_ref().and_then(|s| s.as_ref().ok());
    if let Some(f) = field {
        shade_cells(&mut r, &v, f, &Cover::new(&a.pieces, FACET), th.ascii);
    }
    // Shaded, the material shows as its levels: only voids are outlined over them.
    let lines = field.is_none();
    if app.show_mesh && lines {
        for (p, q) in app.mesh_lines() {
            line(&mut r, (p.x, p.y), (q.x, q.y), Ink::Mesh, Dash::Solid);
        }
    }
    // The kern.
    for (i, p) in a.kern.iter().enumerate().filter(|_| lines) {
        let q = a.kern[(i + 1) % a.kern.len()];
        line(&mut r, *p, q, Ink::Kern, Dash::Solid);
    }
    // Principal axes through the centroid, across the whole view.
    let c = a.props.centroid;
    let reach = (vb[1] - vb[0]).hypot(vb[3] - vb[2]);
    for extra in [0.0, 90.0].into_iter().filter(|_| lines) {
        let t = (a.props.principal.angle_deg + extra).to_radians();
        let d = (reach * t.cos(), reach * t.sin());
        line(
            &mut r,
            (c.x - d.0, c.y - d.1),
            (c.x + d.0, c.y + d.1),
            Ink::Axes,
            Dash::Dotted,
        );
    }
    if let Some(s) = a.stress.as_ref().filter(|_| lines) {
        if let Some([p, q]) = s.field.neutral_axis_in_box(vb[0], vb[1], vb[2], vb[3]) {
            line(&mut r, p, q, Ink::Neutral, Dash::Solid);
        }
    }
    let selected = (app.focus == Focus::Parts).then_some(app.part);
    let mut pieces: Vec<_> = a.all_pieces().iter().collect();
    // The selected part last, so that it shows over the others.
    pieces.sort_by_key(|p| Some(p.part) == selected);
    for p in pieces.into_iter().filter(|p| lines || p.void) {
        let ink = if Some(p.part) == selected {
            Ink::Selected
        } else if p.void {
            Ink::Void
        } else {
            Ink::Solid
        };
        // In ASCII mode the void's own character marks it; gaps would only lose it.
        let dash = if p.void && !th.ascii {
            Dash::Dashed
        } else {
            Dash::Solid
        };
        for contour in &p.contours {
            let pts = contour.facets(FACET);
            for (i, q) in pts.iter().enumerate() {
                let n = pts[(i + 1) % pts.len()];
                line(&mut r, (q.x, q.y), (n.x, n.y), ink, dash);
            }
        }
    }
    let mark = |r: &mut Raster, x: f64, y: f64, g: char| {
        let (dx, dy) = v.at(x, y);
        r.mark(dx, dy, g);
    };
    for c in &a.connections {
        let g = joint_glyph(th, a.flow_known(c));
        for p in &c.joint.marks {
            mark(&mut r, p.x, p.y, g);
        }
    }
    if let Some(s) = &a.stress {
        let e = &s.extremes;
        mark(&mut r, e.max_tension.x, e.max_tension.y, 'T');
        mark(&mut r, e.max_compression.x, e.max_compression.y, 'C');
    }
    // With finite-element noise removed, as every view shows it: a symmetric
    // section's shear centre is drawn on its axis of symmetry.
    if let Some(sc) = crate::report::rows::shear_centre(a) {
        mark(&mut r, sc.x, sc.y, 'S');
    }
    mark(
        &mut r,
        c.x,
        c.y,
        th.glyph("⊕", "+").chars().next().unwrap_or('+'),
    );
    if let Some(f) = field {
        for c in &f.corners {
            mark(&mut r, c.x, c.y, shade::corner_glyph(th.ascii));
        }
        mark(
            &mut r,
            f.peak.at.x,
            f.peak.at.y,
            shade::peak_glyph(th.ascii),
        );
    }
    blit(&r, area, buf, th);
    let top = area.bottom() - legend.len() as u16;
    for (i, text) in legend.iter().enumerate() {
        buf.set_stringn(area.x, top + i as u16, text, area.width as usize, th.muted);
    }
}

/// The mark of a joint: one whose flow is given (from statics, or on a closed cell from
/// the flexure solution), or one whose flow is not (a closed cell before that solution,
/// or a void across the joint).
fn joint_glyph(th: &Theme, exact: bool) -> char {
    let g = if exact {
        th.glyph("×", "x")
    } else {
        th.glyph("⊗", "X")
    };
    g.chars().next().unwrap_or('x')
}

/// Shades the cells of `r` in the material by the level of `f` there.
fn shade_cells(r: &mut Raster, v: &View, f: &Field, cover: &Cover, ascii: bool) {
    let (kx, ky) = (r.kx, r.ky);
    let cell_of = |p: Pt| {
        let (dx, dy) = v.at(p.x, p.y);
        (dx >= 0.0 && dy >= 0.0).then(|| (dx as usize / kx, dy as usize / ky))
    };
    let centre =
        |cx: usize, cy: usize| v.back((cx as f64 + 0.5) * kx as f64, (cy as f64 + 0.5) * ky as f64);
    let glyphs = shade::glyphs(ascii);
    let cells = shade::cells(f, r.w, r.h, cell_of, centre, cover);
    let w = r.w;
    for (i, c) in cells.into_iter().enumerate() {
        if let Some(val) = c {
            r.shade(i % w, i / w, glyphs[shade::level(val, f.peak.value)]);
        }
    }
}

pub(super) fn blit(r: &Raster, area: Rect, buf: &mut Buffer, th: &Theme) {
    for cy in 0..r.h {
        for cx in 0..r.w {
            let Some(ch) = r.char_at(cx, cy, Theme::ascii_ink) else {
                continue;
            };
            let style = r.ink_at(cx, cy).map(|i| th.ink(i));
            let pos = (area.x + cx as u16, area.y + cy as u16);
            if let Some(cell) = buf.cell_mut(pos) {
                cell.set_char(ch);
                if let Some(s) = style {
                    cell.set_style(s);
                }
            }
        }
    }
}

/// The legend: a scale bar of a round length, then what each mark drawn means, as
/// whole entries wrapped onto the lines of `width` they need. `per_cell` is the
/// drawing's scale in file units per cell width.
fn legend(app: &App, per_cell: f64, width: u16, shaded: &Shaded) -> Vec<String> {
    let th = &app.theme;
    let len = nice_step(per_cell * (width as f64 / 4.0).max(2.0));
    let cells = ((len / per_cell).round() as usize).clamp(2, width as usize);
    let unit = app.analysis.section.units.name();
    let bar = if th.ascii {
        format!("|{}|", "-".repeat(cells.saturating_sub(2)))
    } else {
        format!("├{}┤", "─".repeat(cells.saturating_sub(2)))
    };
    let a = &app.analysis;
    let lines = !matches!(shaded, Some(Ok(_)));
    let mut keys = vec![format!("{bar} {} {unit}", crate::numfmt::sig(len, 3))];
    keys.extend(shade_keys(app, shaded));
    keys.push(format!("{} centroid", th.glyph("⊕", "+")));
    if lines {
        keys.push(format!("{} axes", th.glyph("┄", ".")));
    }
    if !a.kern.is_empty() && lines {
        keys.push(format!("{} kern", th.glyph("·", ":")));
    }
    if a.stress.is_some() {
        keys.push("T C extreme fibres".into());
        if lines {
            keys.push(format!("{} neutral axis", th.glyph("─", "=")));
        }
    }
    if matches!(a.torsion, Some(Ok(_))) {
        keys.push("S shear centre".into());
    }
    let flows = a.connections.iter().map(|c| a.flow_known(c));
    if flows.clone().any(|exact| exact) {
        keys.push(format!("{} joint", joint_glyph(th, true)));
    }
    if flows.clone().any(|exact| !exact) {
        keys.push(format!("{} joint, flow not given", joint_glyph(th, false)));
    }
    if app.show_mesh && lines {
        keys.push(format!("{} mesh", th.glyph("⠿", ",")));
    }
    if a.all_pieces().iter().any(|p| p.void) {
        keys.push(th.glyph("╌ void", "o void").into());
    }
    wrap(keys.iter().map(|k| th.text(k)), width as usize)
}

/// The shading's entries in the legend: the stress and its unit, each level's range,
/// and the peak with its value and place; or why it is not shaded.
fn shade_keys(app: &App, shaded: &Shaded) -> Vec<String> {
    let Some(shaded) = shaded else {
        return Vec::new();
    };
    // The flexure solution is of the gross section: say so where holes are drawn.
    let name = match app.analysis.net {
        Some(_) => format!("{} (gross section)", app.shading.name()),
        None => app.shading.name().to_string(),
    };
    let f = match shaded {
        Ok(f) => f,
        Err(why) => return vec![format!("{name} not shaded: {}", why.words())],
    };
    let u = app.units();
    let su = u.stress();
    let num = |pa: f64| u.num(su.from_si(pa), 3);
    let max = f.peak.value;
    let mut out = vec![format!("{name} in {}:", su.name)];
    let g = shade::glyphs(app.theme.ascii);
    for (k, ch) in g.iter().enumerate() {
        let (lo, hi) = (k as f64 / g.len() as f64, (k + 1) as f64 / g.len() as f64);
        out.push(format!("{ch} {}–{}", num(lo * max), num(hi * max)));
    }
    let at = |x: f64| u.num(u.geo(x, 1), 4);
    let top = if f.away() {
        "max away from the sharp corners"
    } else {
        "max"
    };
    out.push(format!(
        "{} {top} {} {} at ({}, {}) {}",
        shade::peak_glyph(app.theme.ascii),
        num(max),
        su.name,
        at(f.peak.at.x),
        at(f.peak.at.y),
        u.length.name()
    ));
    if f.away() {
        out.push(format!(
            "{} sharp re-entrant corner: singular, unbounded in the elastic model",
            shade::corner_glyph(app.theme.ascii)
        ));
    }
    out
}

/// Entries joined with two spaces onto lines of `width`, whole entries where they fit;
/// an entry wider than a line takes lines of its own, broken between words.
fn wrap(keys: impl Iterator<Item = String>, width: usize) -> Vec<String> {
    let mut lines: Vec<String> = Vec::new();
    for key in keys {
        if key.chars().count() > width {
            let mut first = true;
            for word in key.split(' ') {
                match lines.last_mut() {
                    Some(l) if !first && l.chars().count() + 1 + word.chars().count() <= width => {
                        l.push(' ');
                        l.push_str(word);
                    }
                    _ => lines.push(word.to_string()),
                }
                first = false;
            }
            continue;
        }
        let gap = |l: &String| l.chars().count() + 2 + key.chars().count() <= width;
        match lines.last_mut() {
            Some(l) if gap(l) => {
                l.push_str("  ");
                l.push_str(&key);
            }
            _ => lines.push(key),
        }
    }
    lines
}
