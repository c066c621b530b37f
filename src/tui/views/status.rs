//! The bottom of the screen: the edit line (what the selected cell holds, or the value
//! being typed), the message line (the last result, an error in its own style, or the
//! main keys), and the caution every report carries.

use crate::file::edit::Place;
use crate::model::expr::Expr;
use crate::report::CAUTION;
use crate::text::clean;
use crate::tui::app::{App, Focus, Mode, Target};
use crate::tui::columns::{anchor, cell, number, Col};
use ratatui::buffer::Buffer;
use ratatui::layout::Rect;
use ratatui::text::{Line, Span};
use ratatui::widgets::{Paragraph, Widget, Wrap};

/// The caution in brief, for a screen too narrow for all of it on one line: the same
/// three points (mechanics only, the local code governs, an engineer decides).
const CAUTION_SHORT: &str =
    "Caution: mechanics only. Verify against local code; a licensed engineer decides.";

/// The caution for a screen width: whole if it fits one line, else in brief.
fn caution_text(width: usize) -> &'static str {
    if CAUTION.chars().count() <= width {
        CAUTION
    } else {
        CAUTION_SHORT
    }
}

/// Lines the bottom needs at a screen width: two, plus the caution's (one where the
/// brief form fits, so the results keep the room).
pub fn height(width: u16) -> u16 {
    let w = width.max(1) as usize;
    2 + caution_text(w).chars().count().div_ceil(w).min(2) as u16
}

pub fn render(app: &App, area: Rect, buf: &mut Buffer) {
    if area.height < 2 {
        return;
    }
    let th = &app.theme;
    let w = area.width as usize;
    edit_line(app, area.x, area.y, w, buf);
    let msg_y = area.y + 1;
    match &app.message {
        Some((m, err)) => {
            let style = if *err { th.error } else { th.note };
            buf.set_stringn(area.x, msg_y, th.text(&clean(m)), w, style);
        }
        None => {
            // What the keys do in a window, and a shorter form for a narrow screen.
            let (long, short) = match app.mode {
                Mode::Rates(_) | Mode::Compare(_) => (
                    "Up/Down scroll  PgUp/PgDn a page  Home/End top, end  Esc close",
                    "Up/Down PgUp/PgDn Home/End  Esc close",
                ),
                Mode::Revisions(_) => (
                    "Up/Down choose  Enter compare  e type instead  Esc close",
                    "Up/Down  Enter take  e type  Esc",
                ),
                Mode::Working => ("Esc stops it", "Esc stops it"),
                _ => (
                    "? keys  Enter edit  +/- step  a add part  u undo  s save  q quit",
                    "? keys  Enter edit  +/- step  a add part  u undo  s save  q quit",
                ),
            };
            let hint = if long.chars().count() <= w {
                long
            } else {
                short
            };
            buf.set_stringn(area.x, msg_y, hint, w, th.muted);
        }
    }
    let caution = Rect {
        y: area.y + 2,
        height: area.height - 2,
        ..area
    };
    Paragraph::new(caution_text(w))
        .style(th.caution)
        .wrap(Wrap { trim: true })
        .render(caution, buf);
}

/// What is being typed, or what the selection holds.
fn edit_line(app: &App, x: u16, y: u16, w: usize, buf: &mut Buffer) {
    let th = &app.theme;
    let line = match &app.mode {
        Mode::Typing { target, line } => {
            let what = match target {
                Target::Cell { part, col } => {
                    let name = app
                        .analysis
                        .document
                        .parts
                        .get(*part)
                        .map_or(String::new(), |p| cell(p, *part, Col::Name, th.ascii));
                    format!("{} · {}", clean(&name), col.heading())
                }
                Target::Param(n) => format!("param {}", clean(n)),
                Target::SaveAs => "save as (file name)".into(),
                Target::Key { table, key } => format!("{} · {}", table.label(), clean(key)),
                Target::NewKey(Place::Material(i)) => {
                    format!("material {} (key = value, …)", i + 1)
                }
                Target::NewKey(table) => format!("{} · new key = value", table.label()),
                Target::Rename(n) => format!("new name for param {}", clean(n)),
                Target::Seek(n) => format!("seek {}: result = target", clean(n)),
                Target::Rates => "rank the params by (Ixx, util, mass_per_length…)".into(),
                Target::Baseline => "compare against (file, or REV:; Enter: last commit)".into(),
                Target::Sweep(n) => format!("sweep {}: result [from to [points]]", clean(n)),
            };
            let chars: Vec<char> = line.text.chars().collect();
            // A long entry scrolls so the cursor stays in view.
            let head = format!("{what}: ");
            let room = w.saturating_sub(head.chars().count() + 2).max(1);
            let skip = line.cursor.saturating_sub(room);
            let mut before: String = if skip > 0 {
                "…".into()
            } else {
                String::new()
            };
            before.extend(
                chars
                    .iter()
                    .take(line.cursor)
                    .skip(skip + usize::from(skip > 0)),
            );
            let at: String = chars.get(line.cursor).map_or(" ".into(), |c| c.to_string());
            let after: String = chars.iter().skip(line.cursor + 1).collect();
            Line::from(vec![
                Span::styled(th.text(&head), th.header),
                Span::styled(th.text(&clean(&before)), th.editing),
                Span::styled(th.text(&clean(&at)), th.cell_selected),
                Span::styled(th.text(&clean(&after)), th.editing),
                Span::styled(th.text("  Enter keep · Esc cancel"), th.muted),
            ])
        }
        _ => Line::from(th.text(&describe(app))),
    };
    let area = Rect::new(x, y, w as u16, 1);
    line.render(area, buf);
}

/// The selected cell or param in words, with the value an expression comes to.
fn describe(app: &App) -> String {
    let a = &app.analysis;
    let unit = a.section.units.name();
    let value_of = |e: &str| {
        Expr::parse(e)
            .ok()
            .and_then(|x| x.eval(&|n| a.section.params.get(n).copied()).ok())
    };
    match app.focus {
        Focus::Params => match a.document.params.get(app.param) {
            Some((name, _, v)) => {
                let worth = match (&v.value, a.section.params.get(name)) {
                    (crate::model::Value::Expr(_), Some(x)) => format!(" = {}", short(*x)),
                    _ => String::new(),
                };
                let worth = format!("{worth} {unit}");
                clean(&format!("param {name} = {}{worth}", v.value.text()))
            }
            None => String::new(),
        },
        Focus::Parts => {
            let Some(p) = a.document.parts.get(app.part) else {
                return String::new();
            };
            let col = app.column();
            let name = cell(p, app.part, Col::Name, app.theme.ascii);
            let mut s = format!(
                "{name} · {} {}",
                p.shape,
                if p.void { "void" } else { "solid" }
            );
            if !p.enabled {
                s.push_str(" (left out)");
            }
            if let Some(v) = number(p, col) {
                s.push_str(&format!(" · {} = {}", col.heading(), v.text()));
                if let crate::model::Value::Expr(e) = &v {
                    if let Some(x) = value_of(e) {
                        s.push_str(&format!(" = {}", short(x)));
                    }
                }
                let u = if col == Col::Rotate { "°" } else { unit };
                s.push_str(&format!(" {u}"));
            }
            match (col, &p.points) {
                (Col::Points, Some(pts)) => s.push_str(&format!(
                    " · {} corners: {}",
                    pts.len(),
                    crate::file::edit::points_entry(pts)
                )),
                (Col::Anchor, _) => s.push_str(&format!(
                    " · anchor {} sits at `at` (n/N cycle)",
                    anchor(p).name()
                )),
                (Col::Flip, _) => s.push_str(&format!(
                    " · flip_x = {}, flip_y = {} (f, F)",
                    p.flip_x, p.flip_y
                )),
                _ => {}
            }
            clean(&s)
        }
    }
}

/// A number as briefly as it reads exactly enough (6 significant figures at most).
fn short(x: f64) -> String {
    crate::file::edit::number_value(x).to_string()
}
