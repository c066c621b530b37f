//! A scrolling window ([`Listing`]): the head lines stay at the top, the others scroll
//! (Up/Down, PgUp/PgDn, Home/End), and a line above or below says how many are out
//! of view. A line wider than the window is folded at spaces, the rest indented, never
//! cut. How far it scrolls on a screen depends on the screen, so the commands ask
//! [`most_scroll`] and [`page`] here.

use super::help::{centred, wrap};
use super::{fit, pane, rows};
use crate::tui::app::App;
use crate::tui::listing::Listing;
use crate::tui::theme::Theme;
use ratatui::buffer::Buffer;
use ratatui::layout::Rect;
use ratatui::style::Style;
use ratatui::text::Line;
use ratatui::widgets::{Clear, Widget};

/// The widest the window grows.
const WIDTH: u16 = 76;

/// The window laid out in `area`: where it is, its lines as folded to its width, and
/// the screen lines the scrolled part has.
struct Layout {
    win: Rect,
    head: Vec<String>,
    body: Vec<String>,
    room: usize,
}

impl Layout {
    fn of(th: &Theme, l: &Listing, area: Rect) -> Layout {
        let inner_w = WIDTH.min(area.width).saturating_sub(2) as usize;
        let folded = |lines: &[String]| -> Vec<String> {
            lines
                .iter()
                .flat_map(|s| fold(&th.text(s), inner_w))
                .collect()
        };
        let (mut head, mut body) = (folded(&l.head), folded(&l.lines));
        let want = (head.len() + body.len() + 2).min(u16::MAX as usize) as u16;
        let win = centred(area, WIDTH, want);
        let inner_h = win.height.saturating_sub(2) as usize;
        // Where the head would leave no room for a line between the two hints, it
        // scrolls with the rest.
        if body.len() > inner_h.saturating_sub(head.len()) && inner_h < head.len() + 3 {
            head.append(&mut body);
            body = std::mem::take(&mut head);
        }
        let room = inner_h.saturating_sub(head.len());
        Layout {
            win,
            head,
            body,
            room,
        }
    }

    /// Whether the lines overflow: then the first and last rows of the room say what
    /// is out of view.
    fn overflows(&self) -> bool {
        self.body.len() > self.room
    }

    /// The lines in view at once.
    fn visible(&self) -> usize {
        if self.overflows() {
            self.room.saturating_sub(2).max(1)
        } else {
            self.room
        }
    }

    fn most(&self) -> usize {
        self.body.len().saturating_sub(self.visible())
    }
}

/// `s` as lines of at most `w` columns: itself when it fits (its spacing kept), else
/// broken before the last space that leaves a piece which fits (a table row breaks
/// between its columns, so the columns before the break stay aligned), the following
/// pieces indented by two. A piece with no space to break at is broken at spaces by
/// [`wrap`] (and a word longer than the line cut there).
fn fold(s: &str, w: usize) -> Vec<String> {
    let width = |t: &str| Line::raw(t).width();
    if width(s) <= w || w < 8 {
        return vec![s.to_string()];
    }
    let mut out = Vec::new();
    let mut rest = s.to_string();
    let mut indent = "";
    while width(&format!("{indent}{rest}")) > w {
        let room = w - indent.len();
        // Byte offsets where a run of spaces starts after text, with the width before.
        let mut at = None;
        let mut used = 0;
        let mut prev = ' ';
        for (i, c) in rest.char_indices() {
            if c == ' ' && prev != ' ' && used <= room {
                at = Some(i);
            }
            used += width(&c.to_string());
            prev = c;
        }
        match at {
            Some(i) if i > 0 => {
                out.push(format!("{indent}{}", &rest[..i]));
                rest = rest[i..].trim_start().to_string();
            }
            _ => {
                let mut pieces = wrap(&rest, room).into_iter();
                out.push(format!("{indent}{}", pieces.next().unwrap_or_default()));
                rest = pieces.collect::<Vec<_>>().join(" ");
            }
        }
        indent = "  ";
        if rest.is_empty() {
            return out;
        }
    }
    out.push(format!("{indent}{rest}"));
    out
}

/// The window of the screen last drawn (the commands scroll within it).
fn layout_now(app: &App, l: &Listing) -> Layout {
    let [_, main, _] = rows(app.screen);
    Layout::of(&app.theme, l, main)
}

/// How far `l` scrolls on the screen last drawn.
pub fn most_scroll(app: &App, l: &Listing) -> usize {
    layout_now(app, l).most()
}

/// The lines of `l` in view at once on the screen last drawn (a page for PgDn).
pub fn page(app: &App, l: &Listing) -> usize {
    layout_now(app, l).visible()
}

/// Draws `l` over `area`.
pub fn render(app: &App, l: &Listing, area: Rect, buf: &mut Buffer) {
    let th = &app.theme;
    let lay = Layout::of(th, l, area);
    let win = lay.win;
    Clear.render(win, buf);
    let title = th.text(&format!("{} (Esc closes)", l.title));
    let block = pane(th, &title, true);
    let inner = block.inner(win);
    block.render(win, buf);
    if inner.width == 0 || inner.height == 0 {
        return;
    }
    let w = inner.width as usize;
    let mut y = inner.y;
    let mut put = |text: &str, style: Style| {
        if y < inner.bottom() {
            buf.set_stringn(inner.x, y, fit(text, w), w, style);
            y += 1;
        }
    };
    for h in &lay.head {
        put(h, th.header);
    }
    let scroll = l.scroll.min(lay.most());
    let shown = lay.visible();
    if lay.overflows() {
        let above = match scroll {
            0 => String::new(),
            n => format!("{} {n} more above (Up, PgUp, Home)", th.glyph("▲", "^")),
        };
        put(&above, th.muted);
    }
    for line in lay.body.iter().skip(scroll).take(shown) {
        put(line, Style::default());
    }
    if lay.overflows() {
        let below = lay.body.len().saturating_sub(scroll + shown);
        let text = match below {
            0 => String::new(),
            n => format!("{} {n} more below (Down, PgDn, End)", th.glyph("▼", "v")),
        };
        put(&text, th.muted);
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn a_long_line_is_folded_between_columns_not_cut() {
        let f = fold("Ixx    66.67e6  225.0e6  +238%  mm4", 26);
        assert_eq!(f, ["Ixx    66.67e6  225.0e6", "  +238%  mm4"]);
        let f = fold("one two three four five six seven", 10);
        assert!(f.iter().all(|l| l.chars().count() <= 10), "{f:?}");
        let words: Vec<&str> = f.iter().flat_map(|l| l.split_whitespace()).collect();
        assert_eq!(words.join(" "), "one two three four five six seven");
        // No space to break at: cut, nothing lost.
        let f = fold("abcdefghijklmnop", 10);
        assert_eq!(f.concat().replace(' ', ""), "abcdefghijklmnop");
        // A line that fits keeps its spacing.
        assert_eq!(fold("a    b", 20), ["a    b"]);
    }
}
