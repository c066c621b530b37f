//! The parts table: one row a part, one column a key (name, shape, sign, each
//! dimension, a polygon's points, position, anchor, rotation, flips, material, on/off). The name stays in view while the
//! other columns scroll sideways to the selected one; rows scroll to the selected part.

use super::{fit, pane};
use crate::text::clean;
use crate::tui::app::{App, Focus};
use crate::tui::columns::{cell, Col};
use ratatui::buffer::Buffer;
use ratatui::layout::Rect;
use ratatui::widgets::Widget;

pub fn render(app: &App, area: Rect, buf: &mut Buffer) {
    let th = &app.theme;
    let focused = app.focus == Focus::Parts;
    let n = app.analysis.document.parts.len();
    let title = format!("Parts ({n})");
    let block = pane(th, &title, focused);
    let inner = block.inner(area);
    block.render(area, buf);
    if inner.width == 0 || inner.height < 2 {
        return;
    }
    let doc = &app.analysis.document;
    let cols = app.columns();
    let sel_col = app.col.min(cols.len().saturating_sub(1));
    // The first scrolled column: as far left as possible with the selected one in view.
    let room = inner.width.saturating_sub(Col::Name.width(doc));
    let mut first = 1.min(cols.len());
    while first < sel_col {
        let w: u16 = cols[first..=sel_col].iter().map(|c| c.width(doc) + 1).sum();
        if w <= room {
            break;
        }
        first += 1;
    }
    let shown: Vec<(usize, Col)> = std::iter::once((0, Col::Name))
        .chain(cols.iter().copied().enumerate().skip(first))
        .collect();
    let mut x = inner.x;
    let right = inner.right();
    let rows = inner.height as usize - 1;
    let top = app.part.saturating_sub(rows.saturating_sub(1));
    for (ci, col) in shown {
        if x >= right {
            break;
        }
        let w = col.width(doc).min(right - x) as usize;
        let head = if ci == 0 && first > 1 {
            format!("{}{}", col.heading(), th.glyph(" ‹", " <"))
        } else {
            col.heading().to_string()
        };
        buf.set_stringn(x, inner.y, fit(&th.text(&head), w), w, th.header);
        for (row, p) in doc.parts.iter().enumerate().skip(top).take(rows) {
            let y = inner.y + 1 + (row - top) as u16;
            let text = th.text(&clean(&cell(p, row, col, th.ascii)));
            let selected = row == app.part;
            let mut style = if !p.enabled {
                th.muted
            } else {
                ratatui::style::Style::new()
            };
            if selected {
                style = style.patch(th.row_selected);
                if focused && ci == sel_col {
                    style = style.patch(th.cell_selected);
                }
            }
            buf.set_stringn(x, y, fit(&text, w), w, style);
        }
        x = x.saturating_add(col.width(doc) + 1);
    }
    if n == 0 {
        buf.set_stringn(
            inner.x,
            inner.y + 1,
            "no parts: press a to add one",
            inner.width as usize,
            th.muted,
        );
    }
}
