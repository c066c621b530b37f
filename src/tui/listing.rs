//! The text of a window over the screen that scrolls (what buys the most, `w`; the
//! two designs side by side, `C`): a title, lines that stay at the top (column
//! headings), the lines that scroll, and how far they are scrolled. The window's
//! layout, and so how far it can scroll on a given screen, is
//! [`super::views::listing`]'s.

/// A scrolling window's text, made when it opens.
#[derive(Debug, Clone, PartialEq, Default)]
pub struct Listing {
    pub title: String,
    /// Lines kept in view above the scrolled ones.
    pub head: Vec<String>,
    pub lines: Vec<String>,
    /// Screen lines scrolled past (the lines as wrapped to the window).
    pub scroll: usize,
}

impl Listing {
    /// A window of `lines` under `head`, scrolled to the top.
    pub fn new(title: String, head: Vec<String>, lines: Vec<String>) -> Listing {
        Listing {
            title,
            head,
            lines,
            scroll: 0,
        }
    }

    /// Scrolls by `by` screen lines (negative: back up), within `0..=most`.
    pub fn scroll_by(&mut self, by: i64, most: usize) {
        self.scroll = (self.scroll as i64)
            .saturating_add(by)
            .clamp(0, most as i64) as usize;
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn scrolling_stays_within_the_lines() {
        let mut l = Listing::new("t".into(), vec![], vec!["a".into(); 10]);
        l.scroll_by(3, 6);
        assert_eq!(l.scroll, 3);
        l.scroll_by(i64::MAX / 2, 6);
        assert_eq!(l.scroll, 6);
        l.scroll_by(-100, 6);
        assert_eq!(l.scroll, 0);
    }
}
