//! The params list: each named value as written and what it comes to.

use super::{fit, fit_right, pane};
use crate::numfmt::sig;
use crate::text::clean;
use crate::tui::app::{App, Focus};
use ratatui::buffer::Buffer;
use ratatui::layout::Rect;
use ratatui::style::Style;
use ratatui::widgets::Widget;

pub fn render(app: &App, area: Rect, buf: &mut Buffer) {
    let th = &app.theme;
    let focused = app.focus == Focus::Params;
    let block = pane(th, "Params", focused);
    let inner = block.inner(area);
    block.render(area, buf);
    if inner.width < 4 || inner.height == 0 {
        return;
    }
    let doc = &app.analysis.document;
    let unit = app.analysis.section.units.name();
    let rows = inner.height as usize;
    let top = app.param.saturating_sub(rows - 1);
    let w = inner.width as usize;
    let name_w = (w / 3).clamp(3, 12);
    let val_w = 10.min(w.saturating_sub(name_w + 1));
    // The text as written only where it has room; the name and the value always.
    let text_w = w.saturating_sub(name_w + val_w + 2);
    for (i, (name, _, v)) in doc.params.iter().enumerate().skip(top).take(rows) {
        let y = inner.y + (i - top) as u16;
        let value = app
            .analysis
            .section
            .params
            .get(name)
            .map_or(String::new(), |x| format!("{} {unit}", sig(*x, 4)));
        let line = if text_w == 0 {
            format!(
                "{} {}",
                fit(&clean(name), name_w),
                fit_right(&value, w.saturating_sub(name_w + 1))
            )
        } else {
            format!(
                "{} {} {}",
                fit(&clean(name), name_w),
                fit(&clean(&v.value.text()), text_w),
                fit_right(&value, val_w)
            )
        };
        let style = if i == app.param {
            let s = th.row_selected;
            if focused {
                s.patch(th.cell_selected)
            } else {
                s
            }
        } else {
            Style::new()
        };
        buf.set_stringn(inner.x, y, th.text(&line), w, style);
    }
}
