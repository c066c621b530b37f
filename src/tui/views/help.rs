//! Windows over the screen: the help (generated from the key table), the shape picker
//! for a new part or a new shape, and the questions before quitting or overwriting.

use super::{fit, pane, rows};
use crate::model::schema::SPECS;
use crate::text::clean;
use crate::tui::app::{App, Mode, Picker};
use crate::tui::columns::{cell, Col};
use crate::tui::keys::{groups, keys_label};
use crate::tui::theme::Theme;
use ratatui::buffer::Buffer;
use ratatui::layout::Rect;
use ratatui::text::{Line, Span};
use ratatui::widgets::{Block as Frame, Clear, Paragraph, Widget, Wrap};

/// A window of at most `w × h` centred in `area`.
pub(super) fn centred(area: Rect, w: u16, h: u16) -> Rect {
    let w = w.min(area.width);
    let h = h.min(area.height);
    Rect::new(
        area.x + (area.width - w) / 2,
        area.y + (area.height - h) / 2,
        w,
        h,
    )
}

/// Width of the keys at the left of a help line.
const KEY_W: usize = 18;
/// The narrowest column of the help; a wider window takes more columns.
const COL_W: u16 = 58;

/// A piece of the help that stays together in one column: a group's heading with all
/// its keys (a group is never split from its heading), the note on steps; `gap` puts a
/// blank line before it, unless it tops a column.
struct Block {
    gap: bool,
    lines: Vec<Line<'static>>,
}

/// `text` broken at spaces into lines of at most `width` characters (a longer word is
/// cut).
pub(super) fn wrap(text: &str, width: usize) -> Vec<String> {
    let width = width.max(1);
    let mut out: Vec<String> = Vec::new();
    let mut line = String::new();
    for word in text.split(' ').filter(|w| !w.is_empty()) {
        let mut word: Vec<char> = word.chars().collect();
        loop {
            let used = line.chars().count();
            let room = if used == 0 {
                width
            } else {
                width.saturating_sub(used + 1)
            };
            if word.len() <= room {
                if used > 0 {
                    line.push(' ');
                }
                line.extend(word);
                break;
            }
            if used > 0 {
                out.push(std::mem::take(&mut line));
                continue;
            }
            let rest = word.split_off(width);
            out.push(word.into_iter().collect());
            word = rest;
        }
    }
    if !line.is_empty() || out.is_empty() {
        out.push(line);
    }
    out
}

/// The help for columns `width` wide: every key of the table by group, each
/// description wrapped in its own column, under itself.
fn blocks(th: &Theme, width: usize) -> Vec<Block> {
    let desc_w = width.saturating_sub(KEY_W).max(10);
    let mut out: Vec<Block> = Vec::new();
    for (group, binds) in groups() {
        let mut lines = vec![Line::styled(group, th.header)];
        for bd in binds {
            for (i, part) in wrap(&th.text(bd.help), desc_w).into_iter().enumerate() {
                let keys = if i == 0 {
                    keys_label(bd)
                } else {
                    String::new()
                };
                lines.push(Line::from(vec![
                    Span::styled(fit(&th.text(&keys), KEY_W), th.border_focus),
                    Span::raw(part),
                ]));
            }
        }
        let gap = !out.is_empty();
        out.push(Block { gap, lines });
    }
    let note = th.text("Steps: sizes by a share of their value, positions by a share of the section's size, rotations by 1°, 5°, 15°; set the shares in the config file.");
    out.push(Block {
        gap: true,
        lines: wrap(&note, width)
            .into_iter()
            .map(|l| Line::styled(l, th.muted))
            .collect(),
    });
    out
}

/// The shapes, each with its keys and what they measure (optional ones with their
/// default), from the schema.
fn shapes(th: &Theme, width: usize) -> Vec<Block> {
    let desc_w = width.saturating_sub(KEY_W).max(10);
    let mut heading = Some(Line::styled("Shapes and their keys", th.header));
    SPECS
        .iter()
        .map(|spec| {
            let mut keys: Vec<String> = spec
                .keys
                .iter()
                .map(|k| match k.default {
                    None => format!("{} {}", k.key, k.meaning),
                    Some(d) => format!("{} {} (default {d})", k.key, k.meaning),
                })
                .collect();
            if spec.points {
                keys.push("points [[x, y], ...], 3 or more".into());
            }
            let mut lines: Vec<Line> = heading.take().into_iter().collect();
            let gap = !lines.is_empty();
            for (i, part) in wrap(&th.text(&keys.join(", ")), desc_w)
                .into_iter()
                .enumerate()
            {
                let name = if i == 0 { spec.name } else { "" };
                lines.push(Line::from(vec![
                    Span::styled(fit(name, KEY_W), th.border_focus),
                    Span::raw(part),
                ]));
            }
            Block { gap, lines }
        })
        .collect()
}

/// The help laid out in the columns that fit `inner`: the lines of each column. The
/// keys are balanced over the columns; the shapes follow at the foot of the last.
fn columns(th: &Theme, inner: Rect) -> Vec<Vec<Line<'static>>> {
    let ncols = (inner.width / COL_W).max(1) as usize;
    let width = (inner.width as usize / ncols).saturating_sub(1);
    let blocks = blocks(th, width);
    let total: usize = blocks
        .iter()
        .map(|b| b.lines.len() + usize::from(b.gap))
        .sum();
    let target = total.div_ceil(ncols).max(inner.height as usize);
    let mut cols: Vec<Vec<Line>> = vec![Vec::new()];
    for b in blocks {
        let used = cols.last().map_or(0, Vec::len);
        if used > 0 && used + usize::from(b.gap) + b.lines.len() > target && cols.len() < ncols {
            cols.push(Vec::new());
        }
        if let Some(col) = cols.last_mut() {
            if b.gap && !col.is_empty() {
                col.push(Line::raw(""));
            }
            col.extend(b.lines);
        }
    }
    if let Some(col) = cols.last_mut() {
        for b in shapes(th, width) {
            if b.gap {
                col.push(Line::raw(""));
            }
            col.extend(b.lines);
        }
    }
    cols
}

/// Where the help's text goes on a screen of `screen`'s size.
fn text_area(screen: Rect) -> Rect {
    let [_, main, _] = rows(screen);
    Frame::bordered().inner(main)
}

/// How far the help scrolls on a screen of `screen`'s size.
pub fn max_scroll(th: &Theme, screen: Rect) -> u16 {
    let inner = text_area(screen);
    let longest = columns(th, inner).iter().map(Vec::len).max().unwrap_or(0);
    (longest as u16).saturating_sub(inner.height)
}

/// The lines of help in view at once on a screen of `screen`'s size.
pub fn page_height(screen: Rect) -> u16 {
    text_area(screen).height
}

/// The help: every key of the table by group, in as many columns as fit; it scrolls
/// when it does not fit, and says so at the bottom.
pub fn render(app: &App, scroll: u16, area: Rect, buf: &mut Buffer) {
    let th = &app.theme;
    Clear.render(area, buf);
    let block = pane(th, "Keys  (Esc closes, j/k/PgDn scroll)", true);
    let inner = block.inner(area);
    block.render(area, buf);
    if inner.width < 10 || inner.height == 0 {
        return;
    }
    let cols = columns(th, inner);
    let longest = cols.iter().map(Vec::len).max().unwrap_or(0) as u16;
    let max = longest.saturating_sub(inner.height);
    let scroll = scroll.min(max);
    let width = inner.width / cols.len().max(1) as u16;
    for (c, lines) in cols.into_iter().enumerate() {
        let r = Rect::new(inner.x + c as u16 * width, inner.y, width, inner.height);
        Paragraph::new(lines).scroll((scroll, 0)).render(r, buf);
    }
    if scroll < max {
        let more = th.glyph(" more ▾ ", " more v ");
        let w = Line::raw(more).width() as u16;
        let x = inner.right().saturating_sub(w + 1);
        buf.set_stringn(
            x,
            area.bottom().saturating_sub(1),
            more,
            w as usize,
            th.border,
        );
    }
}

/// The shape picker: each shape with the dimensions it asks for.
pub fn picker(app: &App, pick: Picker, area: Rect, buf: &mut Buffer) {
    let th = &app.theme;
    let sel = pick.row;
    let win = centred(area, 44, SPECS.len() as u16 + 2);
    Clear.render(win, buf);
    let title = match pick
        .change
        .and_then(|i| app.analysis.document.parts.get(i).map(|p| (i, p)))
    {
        Some((i, p)) => format!("New shape for {}", clean(&cell(p, i, Col::Name, th.ascii))),
        None => "Add a part: shape".to_string(),
    };
    let title = th.text(&title);
    let block = pane(th, &title, true);
    let inner = block.inner(win);
    block.render(win, buf);
    let top = sel.saturating_sub((inner.height as usize).saturating_sub(1));
    for (i, spec) in SPECS.iter().enumerate().skip(top) {
        let y = inner.y + (i - top) as u16;
        if y >= inner.bottom() {
            break;
        }
        let mut dims: Vec<String> = spec
            .keys
            .iter()
            .map(|k| match k.default {
                None => k.key.to_string(),
                Some(_) => format!("({})", k.key),
            })
            .collect();
        if spec.points {
            dims.push("points".into());
        }
        let text = format!("{} {}", fit(spec.name, 15), dims.join(" "));
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

/// The open file's commits to compare with, the last first, one highlighted, and a
/// line saying what the keys do.
pub fn revisions(
    app: &App,
    r: &crate::tui::commands::compare::Revisions,
    area: Rect,
    buf: &mut Buffer,
) {
    let th = &app.theme;
    let win = centred(area, 76, r.commits.len() as u16 + 3);
    Clear.render(win, buf);
    let block = pane(th, "Compare with a commit of this file", true);
    let inner = block.inner(win);
    block.render(win, buf);
    if inner.height == 0 {
        return;
    }
    let w = inner.width as usize;
    let rows = inner.height.saturating_sub(1) as usize;
    let top = r.row.saturating_sub(rows.saturating_sub(1));
    for (i, c) in r.commits.iter().enumerate().skip(top).take(rows) {
        let text = format!(
            "{}  {}  {}",
            clean(&c.hash),
            clean(&c.date),
            clean(&c.subject)
        );
        let style = if i == r.row {
            th.cell_selected
        } else {
            th.row_selected
        };
        let y = inner.y + (i - top) as u16;
        buf.set_stringn(inner.x, y, fit(&th.text(&text), w), w, style);
    }
    let long = "Enter compare with it · e type a file or revision · Esc close";
    let keys = if long.chars().count() <= w {
        long
    } else {
        "Enter take · e type · Esc close"
    };
    let keys = keys.replace('·', th.glyph("·", "-"));
    let y = inner.bottom() - 1;
    buf.set_stringn(inner.x, y, fit(&keys, w), w, th.muted);
}

/// The question of the moment.
pub fn question(app: &App, area: Rect, buf: &mut Buffer) {
    let th = &app.theme;
    let text = match &app.mode {
        Mode::AskQuit => "There are unsaved changes.\n\ns  save, then quit\ny  quit without saving\nn  go back".to_string(),
        Mode::AskOverwrite(p) if app.path.as_deref() == Some(p.as_path()) => format!(
            "{} has changed on disk since it was opened or last saved.\n\ny  overwrite it\nn  go back (S saves under another name)",
            clean(&p.display().to_string())
        ),
        Mode::AskOverwrite(p) => format!(
            "{} exists; overwrite? y/n\n\ny  overwrite it\nn  go back (S saves under another name)",
            clean(&p.display().to_string())
        ),
        Mode::AskReadOnly(p) => format!(
            "{} is read-only (no one may write to it).\n\ny  replace it anyway (its mode is kept)\nn  go back (S saves under another name)",
            clean(&p.display().to_string())
        ),
        Mode::AskBaseline => format!(
            "Compare against the section as it is now? The changes shown against the {} are lost (B goes back to the file as opened).\n\ny  yes, make this the baseline\nn  go back",
            app.baseline_label
        ),
        Mode::AskVoid(i) => match app.analysis.document.parts.get(*i) {
            Some(p) => format!(
                "{} is {}. Make it {}?\n\ny  {}\nn  keep it {}",
                clean(&cell(p, *i, Col::Name, th.ascii)),
                if p.void { "a void (subtracted)" } else { "solid" },
                if p.void { "solid" } else { "a void (subtracted)" },
                if p.void { "solid" } else { "void" },
                if p.void { "a void" } else { "solid" },
            ),
            None => return,
        },
        Mode::AskDisk(_) => format!(
            "{} changed on disk, and there are unsaved edits here.\n\ny  take the disk's (mine stay one undo away)\nn  keep mine (saving asks before overwriting)",
            clean(&app.path.as_ref().map_or(String::new(), |p| p.display().to_string()))
        ),
        Mode::AskSeek(f) => format!(
            "{} = {} gives {} (now {}).\n\ny  take it (one edit, u undoes)\nn  go back",
            clean(&f.param),
            crate::file::edit::number_value(f.value),
            f.reached,
            f.was,
        ),
        Mode::AskRecover(p) => format!(
            "Unsaved edits were kept in {} when kern last stopped.\n\ny  take them (as unsaved edits; s saves)\nn  open as saved, keep the copy",
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

#[cfg(test)]
mod tests {
    use super::wrap;

    #[test]
    fn wraps_at_spaces_and_cuts_only_words_longer_than_a_line() {
        assert_eq!(
            wrap("quit (asks first if there are unsaved changes)", 20),
            ["quit (asks first if", "there are unsaved", "changes)"]
        );
        assert_eq!(wrap("abcdefgh ij", 3), ["abc", "def", "gh", "ij"]);
        assert_eq!(wrap("", 5), [""]);
    }
}
