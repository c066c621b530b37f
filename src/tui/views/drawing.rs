//! The drawing: every enabled part's outline to scale with equal scaling on both axes,
//! voids in their own ink, the selected part highlighted, the centroid, the principal
//! axes, the kern, the neutral axis and the extreme fibres under `[actions]`, the shear
//! centre once torsion is solved, and a labelled scale bar. Braille dots, or one
//! character per cell in ASCII mode.

use crate::geom::solid_bounds;
use crate::tui::app::{App, Focus};
use crate::tui::commands::nice_step;
use crate::tui::raster::{Dash, Raster};
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

/// The drawing's grid, its view and the legend's lines, fitted to `area`: the legend
/// takes the lines it needs at this width, the drawing the rest. `None` when fewer
/// than [`MIN_ROWS`] rows would be left or there is nothing to draw.
fn plan(app: &App, area: Rect) -> Option<(Raster, View, Vec<String>)> {
    let a = &app.analysis;
    let b = a
        .pieces
        .iter()
        .filter_map(|p| p.bounds())
        .reduce(crate::geom::contour::union_bounds)
        .or_else(|| solid_bounds(&a.pieces))?;
    let (w, h) = (area.width as usize, area.height as usize);
    // The scale bar's length follows the fit, and the legend's lines the bar: take the
    // first count of legend lines that holds the legend drawn at that fit.
    for n in 1..h.saturating_sub(MIN_ROWS - 1) {
        let r = Raster::new(w, h - n, !app.theme.ascii);
        let v = View::fit(b, &r)?;
        let lines = legend(app, v.sx * r.kx as f64, area.width);
        if lines.len() <= n {
            return Some((r, v, lines));
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
    let Some((mut r, v, legend)) = plan(app, area) else {
        return;
    };
    let th = &app.theme;
    let a = &app.analysis;
    let vb = v.bounds(&r);
    let line = |r: &mut Raster, p: (f64, f64), q: (f64, f64), ink, dash| {
        r.line(v.at(p.0, p.1), v.at(q.0, q.1), ink, dash)
    };
    if app.show_mesh {
        for (p, q) in app.mesh_lines() {
            line(&mut r, (p.x, p.y), (q.x, q.y), Ink::Mesh, Dash::Solid);
        }
    }
    // The kern.
    for (i, p) in a.kern.iter().enumerate() {
        let q = a.kern[(i + 1) % a.kern.len()];
        line(&mut r, *p, q, Ink::Kern, Dash::Solid);
    }
    // Principal axes through the centroid, across the whole view.
    let c = a.props.centroid;
    let reach = (vb[1] - vb[0]).hypot(vb[3] - vb[2]);
    for extra in [0.0, 90.0] {
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
    if let Some(s) = &a.stress {
        if let Some([p, q]) = s.field.neutral_axis_in_box(vb[0], vb[1], vb[2], vb[3]) {
            line(&mut r, p, q, Ink::Neutral, Dash::Solid);
        }
    }
    let selected = (app.focus == Focus::Parts).then_some(app.part);
    let mut pieces: Vec<_> = a.all_pieces().iter().collect();
    // The selected part last, so that it shows over the others.
    pieces.sort_by_key(|p| Some(p.part) == selected);
    for p in pieces {
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
    if let Some(s) = &a.stress {
        let e = &s.extremes;
        mark(&mut r, e.max_tension.x, e.max_tension.y, 'T');
        mark(&mut r, e.max_compression.x, e.max_compression.y, 'C');
    }
    if let Some(Ok(t)) = &a.torsion {
        mark(&mut r, t.shear_centre.x, t.shear_centre.y, 'S');
    }
    mark(
        &mut r,
        c.x,
        c.y,
        th.glyph("⊕", "+").chars().next().unwrap_or('+'),
    );
    blit(&r, area, buf, th);
    let top = area.bottom() - legend.len() as u16;
    for (i, text) in legend.iter().enumerate() {
        buf.set_stringn(area.x, top + i as u16, text, area.width as usize, th.muted);
    }
}

pub(super) fn blit(r: &Raster, area: Rect, buf: &mut Buffer, th: &Theme) {
    for cy in 0..r.h {
        for cx in 0..r.w {
            let Some(ch) = r.char_at(cx, cy, Theme::ascii_ink) else {
                continue;
            };
            let style = r.cell(cx, cy).and_then(|c| c.ink).map(|i| th.ink(i));
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
fn legend(app: &App, per_cell: f64, width: u16) -> Vec<String> {
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
    let mut keys = vec![
        format!("{bar} {} {unit}", crate::numfmt::sig(len, 3)),
        format!("{} centroid", th.glyph("⊕", "+")),
        format!("{} axes", th.glyph("┄", ".")),
    ];
    if !a.kern.is_empty() {
        keys.push(format!("{} kern", th.glyph("·", ":")));
    }
    if a.stress.is_some() {
        keys.push("T C extreme fibres".into());
        keys.push(format!("{} neutral axis", th.glyph("─", "=")));
    }
    if matches!(a.torsion, Some(Ok(_))) {
        keys.push("S shear centre".into());
    }
    if app.show_mesh {
        keys.push(format!("{} mesh", th.glyph("⠿", ",")));
    }
    if a.all_pieces().iter().any(|p| p.void) {
        keys.push(th.glyph("╌ void", "o void").into());
    }
    let width = width as usize;
    let mut lines: Vec<String> = Vec::new();
    for key in keys.iter().map(|k| th.text(k)) {
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
