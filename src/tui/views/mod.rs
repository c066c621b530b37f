//! The screen, drawn purely from the [`App`]: a title line, the parts table and the
//! drawing on the left, the params and the results on the right, the edit line, the
//! message line and the caution at the bottom; the help, the shape picker and the
//! questions over it. Each pane is a `render(&App, Rect, &mut Buffer)` function.

pub mod drawing;
pub mod help;
pub mod listing;
pub mod panel;
pub mod params;
pub mod parts;
pub mod status;
pub mod sweep;
pub mod tables;

use super::app::{App, Mode};
use super::theme::Theme;
use crate::text::clean;
use ratatui::buffer::Buffer;
use ratatui::layout::{Constraint, Layout, Rect};
use ratatui::text::Line;
use ratatui::widgets::{Block, Borders, Paragraph, Widget, Wrap};

/// The smallest screen the workbench draws on.
pub const MIN_SIZE: (u16, u16) = (40, 12);

/// Draws the whole screen.
pub fn render(app: &App, area: Rect, buf: &mut Buffer) {
    let area = area.intersection(buf.area);
    if area.width < MIN_SIZE.0 || area.height < MIN_SIZE.1 {
        let note = format!(
            "kern needs a terminal of at least {}×{}; this one is {}×{}.",
            MIN_SIZE.0, MIN_SIZE.1, area.width, area.height
        );
        Paragraph::new(note)
            .wrap(Wrap { trim: true })
            .render(area, buf);
        return;
    }
    let [title, main, foot] = rows(area);
    title_line(app, title, buf);
    let [left, right] =
        Layout::horizontal([Constraint::Percentage(58), Constraint::Percentage(42)]).areas(main);
    left_column(app, left, buf);
    let [params_area, panel_area] = right_panes(app, right);
    let params_h = params_area.height;
    if params_h > 0 {
        params::render(app, params_area, buf);
    }
    panel::render(app, panel_area, buf);
    status::render(app, foot, buf);
    if let Some(row) = app.tables {
        tables::render(app, row, main, buf);
    }
    match &app.mode {
        Mode::Help(scroll) => help::render(app, *scroll, main, buf),
        Mode::Choosing(pick) => help::picker(app, *pick, main, buf),
        Mode::AskQuit
        | Mode::AskOverwrite(_)
        | Mode::AskReadOnly(_)
        | Mode::AskRecover(_)
        | Mode::AskBaseline
        | Mode::AskVoid(_)
        | Mode::AskDisk(_)
        | Mode::AskSeek(_) => help::question(app, main, buf),
        Mode::Rates(l) | Mode::Compare(l) => listing::render(app, l, main, buf),
        Mode::Sweep(s) => sweep::render(app, s, main, buf),
        Mode::Working => sweep::progress(app, main, buf),
        Mode::Revisions(r) => help::revisions(app, r, main, buf),
        Mode::Main | Mode::Typing { .. } => {}
    }
}

/// The parts table over the drawing. Where the drawing has no room even with the table
/// at its smallest, the table takes the column and the last line says why there is no
/// drawing.
fn left_column(app: &App, left: Rect, buf: &mut Buffer) {
    let block = pane(&app.theme, "Section to scale", false);
    let n_parts = app.analysis.document.parts.len() as u16;
    let wanted = n_parts.saturating_add(3).max(5);
    let split = |parts_h: u16| {
        Layout::vertical([Constraint::Max(parts_h), Constraint::Min(3)]).areas::<2>(left)
    };
    let [parts_area, drawing_area] = split(wanted);
    let roomy = |d: Rect| drawing::fits(app, block.inner(d));
    let areas = if roomy(drawing_area) {
        Some((parts_area, drawing_area))
    } else {
        Some(split(5))
            .filter(|[_, d]| roomy(*d))
            .map(|[p, d]| (p, d))
    };
    match areas {
        Some((parts_area, drawing_area)) => {
            parts::render(app, parts_area, buf);
            let inner = block.inner(drawing_area);
            block.render(drawing_area, buf);
            drawing::render(app, inner, buf);
        }
        None => {
            let [parts_area, note] =
                Layout::vertical([Constraint::Min(0), Constraint::Length(1)]).areas(left);
            parts::render(app, parts_area, buf);
            let th = &app.theme;
            let text = fit("drawing needs more room", note.width as usize);
            buf.set_stringn(note.x, note.y, text, note.width as usize, th.muted);
        }
    }
}

/// The params pane and the results pane of the right column.
fn right_panes(app: &App, right: Rect) -> [Rect; 2] {
    let n_params = app.analysis.document.params.len() as u16;
    let params_h = if n_params == 0 {
        0
    } else {
        (n_params + 2).min(right.height / 3).max(3)
    };
    Layout::vertical([Constraint::Length(params_h), Constraint::Min(3)]).areas(right)
}

/// The lines of results in view at once on the screen last drawn (a page for PgDn).
pub fn results_page(app: &App) -> u16 {
    let [_, main, _] = rows(app.screen);
    let [_, right] =
        Layout::horizontal([Constraint::Percentage(58), Constraint::Percentage(42)]).areas(main);
    let [_, panel] = right_panes(app, right);
    panel.height.saturating_sub(2)
}

/// The screen's rows: the title line, the panes (where the windows open too) and the
/// bottom lines.
pub fn rows(area: Rect) -> [Rect; 3] {
    Layout::vertical([
        Constraint::Length(1),
        Constraint::Min(4),
        Constraint::Length(status::height(area.width)),
    ])
    .areas(area)
}

/// A bordered pane with a title; the focused one stands out.
pub fn pane<'a>(th: &Theme, title: &'a str, focused: bool) -> Block<'a> {
    Block::default()
        .borders(Borders::ALL)
        .border_set(th.border_set())
        .border_style(if focused { th.border_focus } else { th.border })
        .title(Line::styled(
            format!(" {title} "),
            if focused { th.border_focus } else { th.header },
        ))
}

fn title_line(app: &App, area: Rect, buf: &mut Buffer) {
    let th = &app.theme;
    let title = app
        .analysis
        .document
        .title
        .as_deref()
        .map_or_else(|| "untitled section".to_string(), clean);
    let (file, name) = match app.path.as_ref() {
        None => (
            "bundled demo (s saves a copy)".to_string(),
            Some("bundled demo".to_string()),
        ),
        Some(p) => (
            clean(&p.display().to_string()),
            p.file_name().map(|n| clean(&n.to_string_lossy())),
        ),
    };
    let changed = if app.modified() { " [changed]" } else { "" };
    let units = format!("lengths in {}", app.units().length.name());
    let text = title_text(
        &th.text(&title),
        changed,
        &units,
        &[Some(th.text(&file)), name.map(|n| th.text(&n))],
        th.glyph(" · ", " - "),
        area.width as usize,
    );
    buf.set_stringn(area.x, area.y, &text, area.width as usize, th.title);
}

/// The title bar in `width` columns, never cut mid-word: `kern · title · units · file`,
/// or with the file's name for its path, or without it, or without the units; as a last
/// resort the title is elided (`…`). An unsaved edit's `[changed]` is always shown.
fn title_text(
    title: &str,
    changed: &str,
    units: &str,
    files: &[Option<String>],
    sep: &str,
    width: usize,
) -> String {
    let head = format!("kern{sep}{title}{changed}");
    let tails = files
        .iter()
        .flatten()
        .map(|f| format!("{sep}{units}{sep}{f}"))
        .chain([format!("{sep}{units}"), String::new()]);
    for tail in tails {
        let text = format!("{head}{tail}");
        if Line::raw(text.as_str()).width() <= width {
            return text;
        }
    }
    let fixed = Line::raw(format!("kern{sep}{changed}")).width();
    let room = width.saturating_sub(fixed);
    format!("kern{sep}{}{changed}", fit(title, room).trim_end())
}

/// Pads `s` to exactly `w` columns, or elides it: a name that does not fit keeps what
/// fits and ends in `…`, so a cut never passes for the whole name.
pub fn fit(s: &str, w: usize) -> String {
    let width = Line::raw(s).width();
    if width <= w {
        return format!("{s}{}", " ".repeat(w - width));
    }
    let mut out = String::new();
    let mut used = 0;
    for c in s.chars() {
        let cw = Line::raw(c.to_string()).width();
        if used + cw + 1 > w {
            break;
        }
        out.push(c);
        used += cw;
    }
    if w > 0 {
        out.push('…');
        used += 1;
    }
    out.push_str(&" ".repeat(w.saturating_sub(used)));
    out
}

/// Pads a value (digits and unit) on the left to `w` columns. A value is never cut —
/// `352.0 m` would read as metres where it was millimetres — so one that does not fit
/// shows as `…`.
pub fn fit_right(s: &str, w: usize) -> String {
    let width = Line::raw(s).width();
    if width > w {
        match w {
            0 => String::new(),
            _ => format!("{}…", " ".repeat(w - 1)),
        }
    } else {
        format!("{}{s}", " ".repeat(w - width))
    }
}

#[cfg(test)]
mod tests {
    use super::title_text;

    fn bar(width: usize, changed: &str) -> String {
        let files = [
            Some("sections/loading-bay-beam.toml".to_string()),
            Some("loading-bay-beam.toml".to_string()),
        ];
        title_text(
            "Door head beam",
            changed,
            "lengths in mm",
            &files,
            " · ",
            width,
        )
    }

    #[test]
    fn title_bar_drops_whole_pieces_before_eliding() {
        assert_eq!(
            bar(80, ""),
            "kern · Door head beam · lengths in mm · sections/loading-bay-beam.toml"
        );
        assert_eq!(
            bar(62, ""),
            "kern · Door head beam · lengths in mm · loading-bay-beam.toml"
        );
        assert_eq!(bar(40, ""), "kern · Door head beam · lengths in mm");
        assert_eq!(bar(31, " [changed]"), "kern · Door head beam [changed]");
        assert_eq!(bar(24, " [changed]"), "kern · Door h… [changed]");
    }
}
