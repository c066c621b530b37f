//! The sweep overlay (`p`): a result plotted against a param (a braille line, plain
//! dots in ASCII mode) over the table of values, the current value marked in both;
//! Esc closes.

use super::drawing::blit;
use super::help::centred;
use super::{fit, pane};
use crate::text::clean;
use crate::tui::app::App;
use crate::tui::commands::sweep::Swept;
use crate::tui::raster::{Dash, Raster};
use crate::tui::theme::Ink;
use ratatui::buffer::Buffer;
use ratatui::layout::Rect;
use ratatui::style::Style;
use ratatui::widgets::{Clear, Widget};

/// Rows the plot keeps however long the table is.
const MIN_PLOT: u16 = 3;

/// Draws the overlay of sweep `s` over `area`.
pub fn render(app: &App, s: &Swept, area: Rect, buf: &mut Buffer) {
    let th = &app.theme;
    let win = centred(area, 76, area.height);
    Clear.render(win, buf);
    let param = clean(&s.param);
    let key = clean(&s.key);
    let title = th.text(&format!("{key} against {param} (Esc closes)"));
    let block = pane(th, &title, true);
    let inner = block.inner(win);
    block.render(win, buf);
    if inner.width < 8 || inner.height < 2 {
        return;
    }
    let w = inner.width as usize;
    let mut put = |y: u16, text: &str, style| {
        if y < inner.bottom() {
            buf.set_stringn(inner.x, y, fit(&th.text(text), w), w, style);
        }
    };

    let failed = s.samples.iter().filter(|p| p.result.is_err()).count();
    let head = match s.extent() {
        Some((lo, hi)) => format!("{key} from {} to {}", s.shown(lo), s.shown(hi)),
        None => format!("no value of {param} here gives {key}"),
    };
    let tail = match failed {
        0 => String::new(),
        n => format!("; {n} of {} do not compute", s.samples.len()),
    };
    put(inner.y, &format!("{head}{tail}"), th.header);

    // The table: as many columns of entries as fit, rows as many as needed.
    let mark = th.glyph("▸", ">");
    let entries: Vec<String> = s
        .samples
        .iter()
        .enumerate()
        .map(|(i, p)| {
            let m = if s.marked == Some(i) { mark } else { " " };
            let r = p.result.as_ref().map_or("none".into(), |&y| s.shown(y));
            format!("{m}{} {r}", s.units.num(p.value, 4))
        })
        .collect();
    let cell_w = entries.iter().map(|e| e.chars().count()).max().unwrap_or(1) + 2;
    let cols = (w / cell_w).max(1);
    let rows = entries.len().div_ceil(cols) as u16;
    // Header, plot, axis line, then the table with what room is left.
    let room = inner.height.saturating_sub(2);
    let table_h = rows.min(room.saturating_sub(MIN_PLOT));
    let plot_h = room - table_h;
    let plot = Rect::new(inner.x, inner.y + 1, inner.width, plot_h);
    draw_plot(app, s, plot, buf);

    let axis = inner.y + 1 + plot_h;
    let (from, to) = match (s.samples.first(), s.samples.last()) {
        (Some(a), Some(b)) => (s.units.num(a.value, 4), s.units.num(b.value, 4)),
        _ => return,
    };
    let middle = format!("{param} (now {})", s.units.num(s.current, 4));
    let gap = w.saturating_sub(from.chars().count() + to.chars().count());
    let pad = gap.saturating_sub(middle.chars().count());
    let line = if pad >= 2 {
        format!(
            "{from}{}{middle}{}{to}",
            " ".repeat(pad / 2),
            " ".repeat(pad - pad / 2)
        )
    } else {
        format!("{from}{}{to}", " ".repeat(gap))
    };
    let mut put = |y: u16, text: &str, style| {
        if y < inner.bottom() {
            buf.set_stringn(inner.x, y, fit(&th.text(text), w), w, style);
        }
    };
    put(axis, &line, th.muted);

    // Entries run down the columns; when they do not all fit, the last row counts
    // those left out.
    let shown_rows = table_h as usize;
    if shown_rows == 0 {
        return;
    }
    let fits = shown_rows >= rows as usize;
    let per_col = if fits { rows as usize } else { shown_rows - 1 };
    let hidden = entries.len().saturating_sub(per_col * cols);
    for r in 0..per_col {
        let text: String = (0..cols)
            .filter_map(|c| entries.get(c * per_col + r))
            .map(|e| format!("{e:<cell_w$}"))
            .collect();
        put(axis + 1 + r as u16, &text, Style::default());
    }
    if hidden > 0 {
        let more = format!("… {hidden} more (a taller window shows them)");
        put(axis + 1 + per_col as u16, &more, th.muted);
    }
}

/// How far a background job (a sweep, a ranking) has got, and how to stop it.
pub fn progress(app: &App, area: Rect, buf: &mut Buffer) {
    let th = &app.theme;
    let Some(job) = &app.job else {
        return;
    };
    let text = format!(
        "The {}: {} of {} {} done. {} Esc stops it.",
        clean(&job.what),
        job.done(),
        job.total,
        job.pieces,
        job.why
    );
    let win = centred(area, 60, 7);
    Clear.render(win, buf);
    let block = pane(th, "Under way", true);
    let inner = block.inner(win);
    block.render(win, buf);
    ratatui::widgets::Paragraph::new(th.text(&text))
        .wrap(ratatui::widgets::Wrap { trim: true })
        .render(inner, buf);
}

/// The result against the param in `area`: a line through the points that compute,
/// broken where one does not, the current value marked.
fn draw_plot(app: &App, s: &Swept, area: Rect, buf: &mut Buffer) {
    let th = &app.theme;
    let (Some((lo, hi)), Some(first), Some(last)) =
        (s.extent(), s.samples.first(), s.samples.last())
    else {
        return;
    };
    if area.width == 0 || area.height == 0 {
        return;
    }
    let mut r = Raster::new(area.width as usize, area.height as usize, !th.ascii);
    let (dw, dh) = r.dots();
    let (x0, x1) = (first.value, last.value);
    let at = |x: f64, y: f64| {
        let tx = if x1 == x0 { 0.5 } else { (x - x0) / (x1 - x0) };
        let ty = if hi == lo { 0.5 } else { (hi - y) / (hi - lo) };
        (tx * (dw - 1) as f64, ty * (dh - 1) as f64)
    };
    let mut prev: Option<(f64, f64)> = None;
    for p in &s.samples {
        let here = p.result.as_ref().ok().map(|&y| at(p.value, y));
        match (prev, here) {
            (Some(a), Some(b)) => r.line(a, b, Ink::Solid, Dash::Solid),
            (None, Some(b)) => r.line(b, b, Ink::Solid, Dash::Solid),
            _ => {}
        }
        prev = here;
    }
    if let Some(p) = s.marked.and_then(|i| s.samples.get(i)) {
        if let Ok(y) = p.result {
            let (x, y) = at(p.value, y);
            r.mark(x, y, th.glyph("●", "*").chars().next().unwrap_or('*'));
        }
    }
    blit(&r, area, buf, th);
}
