//! The results: every row of `kern calc` with its unit and its change against the
//! baseline (matched by symbol), warnings first and plainly, and the state of the
//! torsion solve (solving, failed, or done).

use super::{fit, fit_right, pane};
use crate::numfmt::{change, Change};
use crate::report::rows::{rows, Row};
use crate::text::clean;
use crate::tui::app::App;
use crate::tui::theme::Theme;
use ratatui::buffer::Buffer;
use ratatui::layout::Rect;
use ratatui::style::Style;
use ratatui::text::{Line, Span};
use ratatui::widgets::{Paragraph, Widget};

/// Width of the change column, with its leading space.
const CHANGE_W: usize = 8;

/// The change of a row against the baseline row of the same symbol (`None`: the
/// baseline has no such row), as drawn: `↑`/`↓` and the amount, `=` for no change,
/// `n/a` where either has no value.
pub fn row_change(th: &Theme, row: &Row, base: Option<&Row>) -> (String, Style) {
    let c = match base {
        Some(b) => change(row.value, b.value, row.compare),
        None => Change::NotComparable,
    };
    match c {
        Change::Up(a) => (format!("{}{a}", th.glyph("↑", "^")), th.up),
        Change::Down(a) => (format!("{}{a}", th.glyph("↓", "v")), th.down),
        Change::Same => ("=".into(), th.muted),
        Change::NotComparable => ("n/a".into(), th.muted),
        Change::Blank => (String::new(), th.muted),
    }
}

/// The pane's title: the longest of its forms that fits `width` columns of border.
fn title(label: &str, width: u16) -> String {
    let forms = [
        format!("Results  (change vs {label})"),
        format!("Results  (vs {label})"),
        "Results".to_string(),
    ];
    let room = usize::from(width).saturating_sub(4);
    let fits = |t: &&String| Line::raw(t.as_str()).width() <= room;
    forms.iter().find(fits).unwrap_or(&forms[2]).clone()
}

pub fn render(app: &App, area: Rect, buf: &mut Buffer) {
    let th = &app.theme;
    let title = title(app.baseline_label, area.width);
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
    // A unit is never cut: its column is as wide as the widest unit shown, and the
    // value's as the widest value. Where the columns do not fit, the change goes first,
    // then value and unit share one field (a value that still does not fit shows as
    // `…`, never in part). Symbols are elided before either.
    let width = |s: &str| Line::raw(s).width();
    let values: Vec<String> = now
        .iter()
        .map(|r| {
            r.value
                .map_or(th.glyph("—", "-").to_string(), |v| th.text(&u.num(v, 4)))
        })
        .collect();
    let val_w = values.iter().map(|v| width(v)).max().unwrap_or(0).max(5);
    let unit_w = now
        .iter()
        .map(|r| width(&th.text(&r.unit)))
        .max()
        .unwrap_or(0);
    let sym_full = now
        .iter()
        .map(|r| width(&th.text(&r.symbol)))
        .max()
        .unwrap_or(0);
    let columns = val_w + 1 + unit_w;
    let sym_w = sym_full
        .clamp(4, 12)
        .min(w.saturating_sub(columns + CHANGE_W))
        .max(6);
    let (show_change, together) = (w >= sym_w + columns + CHANGE_W, w < sym_w + columns);
    let sym_w = if together { sym_w.min(w / 3) } else { sym_w };
    let meaning_w = w.saturating_sub(sym_w + columns + CHANGE_W + 2);
    if show_change {
        plain(
            format!(
                "{} higher {} lower (σ as |σ|)",
                th.glyph("↑", "^"),
                th.glyph("↓", "v")
            ),
            th.muted,
        );
    }
    let mut group = "";
    for (r, value) in now.iter().zip(&values) {
        if r.group != group && meaning_w < 20 {
            group = r.group;
        } else if r.group != group {
            group = r.group;
            lines.push(Line::styled(r.group.to_string(), th.header));
        }
        let b = base.iter().find(|x| x.symbol == r.symbol);
        let (chg, chg_style) = row_change(th, r, b);
        let mut spans = vec![Span::raw(fit(&th.text(&r.symbol), sym_w))];
        if together {
            let both = format!("{value} {}", th.text(&r.unit));
            spans.push(Span::raw(fit_right(both.trim_end(), w - sym_w)));
        } else {
            spans.push(Span::raw(fit_right(value, val_w)));
            spans.push(Span::raw(" "));
            spans.push(Span::styled(fit(&th.text(&r.unit), unit_w), th.muted));
        }
        if show_change {
            spans.push(Span::styled(fit(&format!(" {chg}"), CHANGE_W), chg_style));
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
