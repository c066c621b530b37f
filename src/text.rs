//! Text from files made safe for every output: the one sanitiser ([`clean`]) removes
//! control characters, terminal escape sequences and bidirectional overrides, so a
//! crafted title or part name cannot move the cursor, recolour the screen, retitle the
//! terminal, set the clipboard or reorder what is shown. [`xml`] and [`markdown`] build
//! on it for the SVG and HTML outputs and the Markdown sheet.
//!
//! This module is below every other: the core uses it for the names it puts into
//! diagnostics, the views for everything they print.

/// `s` without escape sequences (CSI, OSC and other ESC-introduced ones) and without
/// control characters (C0, DEL, C1), nor bidirectional controls; tabs and newlines
/// become spaces.
///
/// ```
/// use kern::text::clean;
/// assert_eq!(clean("web\x1b[31m plate\x07"), "web plate");
/// assert_eq!(clean("a\x1b]0;evil\x07b\tc"), "ab c");
/// ```
pub fn clean(s: &str) -> String {
    // Printable ASCII (space to `~`) holds nothing to remove: copied as it stands.
    if s.bytes().fold(true, |ok, b| ok & (0x20..0x7f).contains(&b)) {
        return s.to_string();
    }
    let mut out = String::with_capacity(s.len());
    let mut it = s.chars().peekable();
    while let Some(c) = it.next() {
        match c {
            '\x1b' | '\u{9b}' | '\u{9d}' => skip_sequence(c, &mut it),
            '\t' | '\n' | '\r' => out.push(' '),
            c if c.is_control() => {}
            // Bidirectional embeddings, overrides, isolates and marks can reorder what
            // is shown around them.
            '\u{202a}'..='\u{202e}'
            | '\u{2066}'..='\u{2069}'
            | '\u{200e}'
            | '\u{200f}'
            | '\u{61c}' => {}
            c => out.push(c),
        }
    }
    out
}

/// `s` cleaned and escaped for XML 1.0 character data and attribute values (SVG, HTML):
/// `& < > " '` become references; the characters XML forbids even as references (C0
/// controls, U+FFFE, U+FFFF) are gone with the rest of what [`clean`] removes.
///
/// ```
/// use kern::text::xml;
/// assert_eq!(xml("<b>\x01&\"'"), "&lt;b&gt;&amp;&quot;&#39;");
/// ```
pub fn xml(s: &str) -> String {
    escaped(s, |c| match c {
        '&' => Some("&amp;"),
        '<' => Some("&lt;"),
        '>' => Some("&gt;"),
        '"' => Some("&quot;"),
        '\'' => Some("&#39;"),
        '\u{fffe}' | '\u{ffff}' => Some(""),
        _ => None,
    })
}

/// `s` cleaned and made literal text in Markdown (one line, one table cell): `< > &`
/// become entities so no raw HTML passes, and the characters that start emphasis,
/// code, links, headings or cells (`` \ ` * _ | [ ] # ~ ! ``) are escaped with a
/// backslash, so a name cannot change the page.
///
/// ```
/// use kern::text::markdown;
/// assert_eq!(markdown("<img onerror=x>"), "&lt;img onerror=x&gt;");
/// assert_eq!(markdown("a|b*c_`"), "a\\|b\\*c\\_\\`");
/// ```
pub fn markdown(s: &str) -> String {
    escaped(s, |c| match c {
        '&' => Some("&amp;"),
        '<' => Some("&lt;"),
        '>' => Some("&gt;"),
        '\\' => Some("\\\\"),
        '`' => Some("\\`"),
        '*' => Some("\\*"),
        '_' => Some("\\_"),
        '|' => Some("\\|"),
        '[' => Some("\\["),
        ']' => Some("\\]"),
        '#' => Some("\\#"),
        '~' => Some("\\~"),
        '!' => Some("\\!"),
        _ => None,
    })
}

/// [`clean`]`(s)` with each character that `esc` names replaced by its escaped form;
/// the one loop behind [`xml`] and [`markdown`].
fn escaped(s: &str, esc: impl Fn(char) -> Option<&'static str>) -> String {
    let mut out = String::with_capacity(s.len());
    for c in clean(s).chars() {
        match esc(c) {
            Some(e) => out.push_str(e),
            None => out.push(c),
        }
    }
    out
}

/// Skips the rest of an escape sequence that began with `first`.
fn skip_sequence(first: char, it: &mut std::iter::Peekable<std::str::Chars<'_>>) {
    let kind = if first == '\x1b' {
        match it.next() {
            Some('[') => '[',
            Some(']') | Some('P') | Some('_') | Some('^') | Some('X') => ']',
            _ => return,
        }
    } else if first == '\u{9b}' {
        '['
    } else {
        ']'
    };
    if kind == '[' {
        // CSI: parameter and intermediate bytes, then one final byte in @..~.
        for c in it.by_ref() {
            if ('@'..='~').contains(&c) {
                break;
            }
        }
    } else {
        // OSC and string sequences: up to BEL or ST (ESC \).
        while let Some(c) = it.next() {
            if c == '\x07' || c == '\u{9c}' {
                break;
            }
            if c == '\x1b' {
                if it.peek() == Some(&'\\') {
                    it.next();
                }
                break;
            }
        }
    }
}

#[cfg(test)]
mod tests {
    use super::clean;

    #[test]
    fn strips_sequences_and_controls() {
        assert_eq!(clean("plain"), "plain");
        assert_eq!(clean("x\x1b[2J\x1b[Hy"), "xy");
        assert_eq!(clean("t\x1bP1;2q\x1b\\u"), "tu");
        assert_eq!(clean("a\u{202e}b\u{0}\u{7f}\u{85}c"), "abc");
        assert_eq!(clean("x\u{200f}\u{200e}\u{61c}\u{2067}y"), "xy");
        assert_eq!(clean("ends with escape\x1b"), "ends with escape");
    }

    #[test]
    fn xml_has_no_forbidden_characters() {
        let x = super::xml("a\u{1}\u{8}\u{b}\u{c}\u{1f}\u{fffe}\u{ffff}<&>b");
        assert_eq!(x, "a&lt;&amp;&gt;b");
    }

    #[test]
    fn markdown_passes_no_html() {
        let m = super::markdown("<script>alert(1)</script> **x**");
        assert!(!m.contains('<') && !m.contains("**"), "{m}");
    }
}
