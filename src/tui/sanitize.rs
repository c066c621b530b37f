//! Text from files made safe to draw: control characters and terminal escape sequences
//! are removed, so a crafted title or part name cannot move the cursor, recolour the
//! screen or retitle the terminal.

/// `s` without escape sequences (CSI, OSC and other ESC-introduced ones) and without
/// control characters (C0, DEL, C1); tabs and newlines become spaces.
///
/// ```
/// use kern::tui::sanitize::clean;
/// assert_eq!(clean("web\x1b[31m plate\x07"), "web plate");
/// assert_eq!(clean("a\x1b]0;evil\x07b\tc"), "ab c");
/// ```
pub fn clean(s: &str) -> String {
    let mut out = String::with_capacity(s.len());
    let mut it = s.chars().peekable();
    while let Some(c) = it.next() {
        match c {
            '\x1b' | '\u{9b}' | '\u{9d}' => skip_sequence(c, &mut it),
            '\t' | '\n' | '\r' => out.push(' '),
            c if c.is_control() => {}
            // Bidirectional overrides can reorder what is shown around them.
            '\u{202a}'..='\u{202e}' | '\u{2066}'..='\u{2069}' => {}
            c => out.push(c),
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
        assert_eq!(clean("ends with escape\x1b"), "ends with escape");
    }
}
