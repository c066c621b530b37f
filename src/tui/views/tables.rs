//! The window of the file's other keys: each table's heading and its keys as written,
//! the selected row marked; it scrolls to keep the selection in view.

use super::{fit, pane};
use crate::file::edit::Place;
use crate::text::clean;
use crate::tui::app::App;
use crate::tui::commands::tables::{rows, Row};
use ratatui::buffer::Buffer;
use ratatui::layout::Rect;
use ratatui::style::Style;
use ratatui::widgets::{Clear, Widget};

/// Widest the window grows.
const MAX_W: u16 = 72;

pub fn render(app: &App, row: usize, area: Rect, buf: &mut Buffer) {
    let th = &app.theme;
    let w = area.width.min(MAX_W);
    let win = Rect::new(area.x + (area.width - w) / 2, area.y, w, area.height);
    Clear.render(win, buf);
    let block = pane(th, "Keys of the file (Esc closes)", true);
    let inner = block.inner(win);
    block.render(win, buf);
    if inner.width < 4 || inner.height == 0 {
        return;
    }
    let all = rows(app.doc());
    let sel = row.min(all.len().saturating_sub(1));
    let h = inner.height as usize;
    let top = sel.saturating_sub(h - 1);
    let width = inner.width as usize;
    for (i, r) in all.iter().enumerate().skip(top).take(h) {
        let (text, style) = match r {
            Row::Head(p, present) => (heading(app, *p, *present), th.header),
            Row::Key(_, k, v) => (format!("  {} = {}", clean(k), clean(v)), Style::new()),
            Row::NewMaterial => ("+ a new material (Enter)".to_string(), th.muted),
        };
        let style = if i == sel {
            style.patch(th.cell_selected)
        } else {
            style
        };
        let y = inner.y + (i - top) as u16;
        buf.set_stringn(inner.x, y, fit(&th.text(&text), width), width, style);
    }
}

/// A table's heading: its name in the file, a material's own name, and a note on a
/// table the file does not have yet.
fn heading(app: &App, p: Place, present: bool) -> String {
    let name = match p {
        Place::Top => "top of the file".to_string(),
        Place::Material(i) => {
            let m = app.analysis.document.materials.get(i);
            format!(
                "[[materials]] {}",
                m.map_or(String::new(), |m| clean(&m.name))
            )
        }
        other => other.label(),
    };
    if present {
        name
    } else {
        format!("{name} (none: a adds a key)")
    }
}
