//! Windows over the screen: the help (generated from the key table), the shape picker
//! for a new part, and the questions before quitting or overwriting.

use super::{fit, pane};
use crate::geom::shapes::SHAPES;
use crate::tui::app::{App, Mode};
use crate::tui::keys::{groups, keys_label};
use crate::tui::sanitize::clean;
use ratatui::buffer::Buffer;
use ratatui::layout::Rect;
use ratatui::text::{Line, Span};
use ratatui::widgets::{Clear, Paragraph, Widget, Wrap};

/// A window of at most `w × h` centred in `area`.
fn centred(area: Rect, w: u16, h: u16) -> Rect {
    let w = w.min(area.width);
    let h = h.min(area.height);
    Rect::new(
        area.x + (area.width - w) / 2,
        area.y + (area.height - h) / 2,
        w,
        h,
    )
}

/// The help: every key of the table by group, flowed into as many columns as fit.
pub fn render(app: &App, scroll: u16, area: Rect, buf: &mut Buffer) {
    let th = &app.theme;
    let win = area;
    Clear.render(win, buf);
    let block = pane(th, "Keys  (Esc closes, j/k scroll)", true);
    let inner = block.inner(win);
    block.render(win, buf);
    if inner.width < 10 || inner.height == 0 {
        return;
    }
    let key_w = 16;
    let mut lines: Vec<Line> = Vec::new();
    for (group, binds) in groups() {
        if !lines.is_empty() {
            lines.push(Line::raw(""));
        }
        lines.push(Line::styled(group, th.header));
        for bd in binds {
            lines.push(Line::from(vec![
                Span::styled(fit(&keys_label(bd), key_w), th.border_focus),
                Span::raw(th.text(bd.help)),
            ]));
        }
    }
    lines.push(Line::raw(""));
    lines.push(Line::styled(
        th.text("Steps: sizes by a share of their value, positions by a share of the section's size, rotations by 1°, 5°, 15°; set the shares in the config file."),
        th.muted,
    ));
    let col_w: u16 = 58;
    let ncols = (inner.width / col_w).max(1);
    let per_col = (lines.len() as u16).div_ceil(ncols).max(inner.height);
    let scroll = scroll.min(per_col.saturating_sub(inner.height));
    let width = inner.width / ncols;
    let mut chunks = lines.chunks(per_col as usize);
    for c in 0..ncols {
        let Some(chunk) = chunks.next() else { break };
        let r = Rect::new(inner.x + c * width, inner.y, width, inner.height);
        Paragraph::new(chunk.to_vec())
            .wrap(Wrap { trim: false })
            .scroll((scroll, 0))
            .render(r, buf);
    }
}

/// The shape picker: each shape with the dimensions it asks for.
pub fn picker(app: &App, sel: usize, area: Rect, buf: &mut Buffer) {
    let th = &app.theme;
    let win = centred(area, 44, SHAPES.len() as u16 + 2);
    Clear.render(win, buf);
    let block = pane(th, "Add a part: shape", true);
    let inner = block.inner(win);
    block.render(win, buf);
    let top = sel.saturating_sub((inner.height as usize).saturating_sub(1));
    for (i, (name, req, opt)) in SHAPES.iter().enumerate().skip(top) {
        let y = inner.y + (i - top) as u16;
        if y >= inner.bottom() {
            break;
        }
        let mut dims: Vec<String> = req.iter().map(|k| k.to_string()).collect();
        dims.extend(opt.iter().map(|o| format!("({})", o.0)));
        if *name == "polygon" {
            dims.push("points".into());
        }
        let text = format!("{} {}", fit(name, 15), dims.join(" "));
        let style = if i == sel {
            th.cell_selected
        } else {
            th.row_selected
        };
        buf.set_stringn(
            inner.x,
            y,
            fit(&text, inner.width as usize),
            inner.width as usize,
            style,
        );
    }
}

/// The question of the moment.
pub fn question(app: &App, area: Rect, buf: &mut Buffer) {
    let th = &app.theme;
    let text = match &app.mode {
        Mode::AskQuit => "There are unsaved changes.\n\ns  save, then quit\ny  quit without saving\nn  go back".to_string(),
        Mode::AskOverwrite(p) => format!(
            "{} has changed on disk since it was opened (or it is another file).\n\ny  overwrite it\nn  go back (S saves under another name)",
            clean(&p.display().to_string())
        ),
        _ => return,
    };
    let win = centred(area, 56, 8);
    Clear.render(win, buf);
    let block = pane(th, "Question", true);
    let inner = block.inner(win);
    block.render(win, buf);
    Paragraph::new(text)
        .wrap(Wrap { trim: false })
        .render(inner, buf);
}
