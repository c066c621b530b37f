//! A quick path for long polygon outlines: `points = [[x, y], ...]` arrays of plain
//! numbers, read by a small scanner instead of the general TOML parser (which takes
//! about a microsecond a pair, 0.1 s for a traced outline of 100,000 corners).
//!
//! The scanner is strict: any array that is not plain decimal numbers in pairs (an
//! expression in quotes, `1_000`, `inf`, a stray character) is left to the TOML parser.
//! The arrays it reads are blanked out of the text (newlines kept, so every line and
//! column stays where it was) and the rest is parsed as usual; [`super::read`] then
//! takes the scanned points for an empty array found exactly where a scanned one
//! stood, and falls back to the full parse if any scanned array was not so used.

use crate::model::{Val, Value};

/// Arrays shorter than this go through the TOML parser, which is quick enough.
const MIN_BYTES: usize = 4096;

/// A `points` array read by the scanner: where its brackets stand and its pairs.
#[derive(Debug, Clone, PartialEq)]
pub struct Scanned {
    /// Byte offset of the outer `[`.
    pub open: usize,
    /// Byte offset just past the outer `]`.
    pub close: usize,
    pub points: Vec<[Val; 2]>,
}

/// Every long, plain `points = [...]` array of `text`.
pub fn scan(text: &str) -> Vec<Scanned> {
    let mut out = Vec::new();
    let mut line_start = 0;
    while line_start < text.len() {
        let line_end = text[line_start..]
            .find('\n')
            .map_or(text.len(), |i| line_start + i);
        if let Some(open) = array_after_key(text, line_start, line_end) {
            if let Some(s) = read_array(text, open) {
                if s.close - s.open >= MIN_BYTES {
                    line_start = s.close;
                    out.push(s);
                    continue;
                }
            }
        }
        line_start = line_end + 1;
    }
    out
}

/// The text with the inside of each scanned array blanked (newlines kept).
pub fn mask(text: &str, found: &[Scanned]) -> String {
    let mut bytes = text.as_bytes().to_vec();
    for s in found {
        for b in &mut bytes[s.open + 1..s.close - 1] {
            if *b != b'\n' && *b != b'\r' {
                *b = b' ';
            }
        }
    }
    // Only ASCII characters of plain numbers and brackets were replaced.
    String::from_utf8(bytes).unwrap_or_else(|_| text.to_string())
}

/// `points = [` at the start of a line (after indentation): the offset of `[`.
fn array_after_key(text: &str, start: usize, end: usize) -> Option<usize> {
    let line = &text[start..end];
    let rest = line.trim_start_matches([' ', '\t']);
    let rest = rest.strip_prefix("points")?;
    let after_key = rest.trim_start_matches([' ', '\t']);
    let after_eq = after_key.strip_prefix('=')?.trim_start_matches([' ', '\t']);
    after_eq.starts_with('[').then(|| end - after_eq.len())
}

struct Cursor<'a> {
    b: &'a [u8],
    i: usize,
}

impl Cursor<'_> {
    /// Skips white space, newlines and comments.
    fn skip(&mut self) {
        while let Some(&c) = self.b.get(self.i) {
            match c {
                b' ' | b'\t' | b'\n' | b'\r' => self.i += 1,
                b'#' => {
                    while self.b.get(self.i).is_some_and(|&c| c != b'\n') {
                        self.i += 1;
                    }
                }
                _ => break,
            }
        }
    }

    fn eat(&mut self, c: u8) -> bool {
        self.skip();
        if self.b.get(self.i) == Some(&c) {
            self.i += 1;
            true
        } else {
            false
        }
    }

    /// A TOML decimal integer or float without underscores: `-12`, `3.5`, `1e-3`.
    fn number(&mut self) -> Option<Val> {
        self.skip();
        let start = self.i;
        let digits = |c: &mut Cursor| {
            let s = c.i;
            while c.b.get(c.i).is_some_and(u8::is_ascii_digit) {
                c.i += 1;
            }
            c.i - s
        };
        if matches!(self.b.get(self.i), Some(b'+' | b'-')) {
            self.i += 1;
        }
        let int_start = self.i;
        let n = digits(self);
        // No leading zeros, as in TOML.
        if n == 0 || (n > 1 && self.b[int_start] == b'0') {
            return None;
        }
        if self.b.get(self.i) == Some(&b'.') {
            self.i += 1;
            if digits(self) == 0 {
                return None;
            }
        }
        if matches!(self.b.get(self.i), Some(b'e' | b'E')) {
            self.i += 1;
            if matches!(self.b.get(self.i), Some(b'+' | b'-')) {
                self.i += 1;
            }
            if digits(self) == 0 {
                return None;
            }
        }
        let tok = std::str::from_utf8(&self.b[start..self.i]).ok()?;
        let x: f64 = tok.parse().ok()?;
        x.is_finite().then_some(Val {
            value: Value::Number(x),
            span: start..self.i,
        })
    }
}

/// Reads `[[x, y], ...]` starting at the outer `[`; `None` if it is anything else.
fn read_array(text: &str, open: usize) -> Option<Scanned> {
    let mut c = Cursor {
        b: text.as_bytes(),
        i: open + 1,
    };
    let mut points = Vec::new();
    loop {
        if c.eat(b']') {
            break;
        }
        if !c.eat(b'[') {
            return None;
        }
        let x = c.number()?;
        if !c.eat(b',') {
            return None;
        }
        let y = c.number()?;
        c.eat(b',');
        if !c.eat(b']') {
            return None;
        }
        points.push([x, y]);
        if !c.eat(b',') {
            if c.eat(b']') {
                break;
            }
            return None;
        }
    }
    Some(Scanned {
        open,
        close: c.i,
        points,
    })
}

#[cfg(test)]
mod tests {
    use super::*;

    fn long_array(n: usize) -> String {
        let pts: Vec<String> = (0..n).map(|i| format!("[{i}.5, -{i}e-1]")).collect();
        format!(
            "[[parts]]\nshape = \"polygon\"\npoints = [ # outline\n  {},\n]\n",
            pts.join(", ")
        )
    }

    #[test]
    fn reads_plain_pairs_with_their_places() {
        let text = long_array(600);
        let found = scan(&text);
        assert_eq!(found.len(), 1);
        let s = &found[0];
        assert_eq!(s.points.len(), 600);
        let [x, y] = &s.points[7];
        assert_eq!(
            (x.value.clone(), y.value.clone()),
            (Value::Number(7.5), Value::Number(-0.7))
        );
        assert_eq!(&text[x.span.clone()], "7.5");
        let masked = mask(&text, &found);
        assert_eq!(masked.len(), text.len());
        assert_eq!(masked.lines().count(), text.lines().count());
    }

    #[test]
    fn leaves_anything_unusual_to_the_toml_parser() {
        for odd in ["\"2*t\"", "1_000", "inf", "01", ".5", "1.", "nan"] {
            let text = long_array(600).replacen("[3.5,", &format!("[{odd},"), 1);
            assert!(scan(&text).is_empty(), "{odd}");
        }
        // Short arrays are not worth it.
        assert!(scan(&long_array(3)).is_empty());
    }
}
