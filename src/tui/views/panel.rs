//! The results: every row of `kern calc` with its unit and its change against the
//! baseline (matched by symbol), warnings first and plainly, and the state of the
//! torsion solve (solving, failed, or done).

use super::{fit, fit_right, pane};
use crate::numfmt::{change, sig};
use crate::report::rows::{rows, Row};
use crate::text::clean;
use crate::tui::app::App;
use ratatui::buffer::Buffer;
use ratatui::layout::Rect;
use ratatui::text::{Line, Span};
use ratatui::widgets::{Paragraph, Widget};

/// The change of a row against the baseline: a percentage, or a difference for angles.
pub fn row_change(row: &Row, base: Option<&Row>) -> Option<String> {
    let (v, b) = (row.value?, base?.value?);
    if row.unit == "°" {
        let d = v - b;
        return Some(if d.abs() < 0.05 {
            "±0°".into()
        } else {
            format!("{}{}°", if d > 0.0 { "+" } else { "" }, sig(d, 3))
        });
    }
    change(v, b)
}

pub fn render(app: &App, area: Rect, buf: &mut Buffer) {
    let th = &app.theme;
    let title = format!("Results  (change vs {})", app.baseline_label);
    let block = pane(th, &title, false);
    let inner = block.inner(area);
    block.render(area, buf);
    if inner.width < 8 || inner.height == 0 {
        return;
    }
    let u = app.units();
    let now = rows(&app.analysis, &u);
    let base = rows(&app.baseline, &u);
    let mut lines: Vec<Line> = Vec::new();
    let w = inner.width as usize;
    let warn = th.glyph("⚠ ", "! ");
    let mut plain = |text: String, style| {
        for l in wrap(&th.text(&text), w) {
            lines.push(Line::styled(l, style));
        }
    };
    for m in &app.analysis.warnings {
        plain(format!("{warn}{}", clean(&m.to_string())), th.warning);
    }
    if app.solving {
        plain(
            "Torsion: solving… (J, Cw, shear centre follow)".into(),
            th.note,
        );
    } else if let Some(Err(m)) = &app.analysis.torsion {
        plain(format!("Torsion: {}", clean(&m.to_string())), th.muted);
    }
    // Symbol, value, unit and change; narrower on a narrow panel.
    // A unit is never cut: its column is as wide as the widest unit shown. Where the
    // columns do not fit, the change goes first, then value and unit share one field
    // (a value that still does not fit shows as `…`, never in part).
    let (sym_w, val_w) = if w >= 33 { (8, 10) } else { (7, 10) };
    let unit_w = now
        .iter()
        .map(|r| Line::raw(th.text(&r.unit)).width())
        .max()
        .unwrap_or(0);
    let columns = sym_w + val_w + 1 + unit_w;
    let (show_change, together) = (w >= columns + 8, w < columns);
    let sym_w = if together { sym_w.min(w / 3) } else { sym_w };
    let meaning_w = w.saturating_sub(columns + 8 + 2);
    let mut group = "";
    for r in &now {
        if r.group != group && meaning_w < 20 {
            group = r.group;
        } else if r.group != group {
            group = r.group;
            lines.push(Line::styled(r.group.to_string(), th.header));
        }
        let b = base.iter().find(|x| x.symbol == r.symbol);
        let chg = row_change(r, b).unwrap_or_default();
        let chg_style = if chg.starts_with('+') {
            th.up
        } else if chg.starts_with('-') {
            th.down
        } else {
            th.muted
        };
        let value = r
            .value
            .map_or(th.glyph("—", "-").to_string(), |v| sig(v, 4));
        let mut spans = vec![Span::raw(fit(&th.text(&r.symbol), sym_w))];
        if together {
            let both = format!("{value} {}", th.text(&r.unit));
            spans.push(Span::raw(fit_right(both.trim_end(), w - sym_w)));
        } else {
            spans.push(Span::raw(fit_right(&value, val_w)));
            spans.push(Span::raw(" "));
            spans.push(Span::styled(fit(&th.text(&r.unit), unit_w), th.muted));
        }
        if show_change {
            spans.push(Span::styled(fit_right(&th.text(&chg), 8), chg_style));
        }
        if show_change && meaning_w >= 20 {
            spans.push(Span::raw("  "));
            spans.push(Span::styled(fit(&th.text(r.meaning), meaning_w), th.muted));
        }
        lines.push(Line::from(spans));
    }
    let total = lines.len() as u16;
    let scroll = app.results_scroll.min(total.saturating_sub(inner.height));
    Paragraph::new(lines).scroll((scroll, 0)).render(inner, buf);
    // The markers only where there is more to see.
    let marks = [
        (scroll > 0, th.glyph("PgUp ▴", "PgUp ^"), area.y),
        (
            scroll + inner.height < total,
            th.glyph("PgDn ▾", "PgDn v"),
            area.bottom().saturating_sub(1),
        ),
    ];
    for (shown, more, y) in marks {
        if shown {
            let w = Line::raw(more).width() as u16;
            let x = inner.right().saturating_sub(w + 1);
            buf.set_stringn(x, y, more, inner.width as usize, th.border);
        }
    }
}

/// `s` cut into lines of at most `w` characters, at spaces where possible.
pub fn wrap(s: &str, w: usize) -> Vec<String> {
    let w = w.max(1);
    let mut out = Vec::new();
    let mut line = String::new();
    for word in s.split(' ') {
        let (ll, wl) = (line.chars().count(), word.chars().count());
        if ll > 0 && ll + 1 + wl > w {
            out.push(std::mem::take(&mut line));
        }
        if !line.is_empty() {
            line.push(' ');
        }
        line.push_str(word);
        while line.chars().count() > w {
            let head: String = line.chars().take(w).collect();
            line = line.chars().skip(w).collect();
            out.push(head);
        }
    }
    if !line.is_empty() {
        out.push(line);
    }
    out
}
