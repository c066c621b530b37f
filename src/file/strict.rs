//! A strict, quick parser for the part of TOML 1.0 (toml.io/en/v1.0.0) that section
//! files use: `key = value` lines, `[name]` and `[[name]]` headers with one bare name,
//! bare keys, basic and literal one-line strings, decimal integers and floats,
//! booleans, arrays, inline tables and comments. It fills the same [`Table`] tree as
//! `toml_edit` with the same byte ranges, in one pass over the bytes.
//!
//! It gives up (`None`) on anything else — an error of any kind, a quoted or dotted
//! key, a dotted header, a multi-line string, `inf`, `nan`, `1_000`, `0x1f`, a date,
//! a byte order mark, arrays or tables nested deeper than [`MAX_DEPTH`] levels — and the
//! caller parses the text with `toml_edit`, so every message about a file that is not
//! valid TOML stays that parser's. Work and memory are linear in the text's length.

use super::tree::{Entry, Item, Kind, Table, Value};
use std::borrow::Cow;

/// Arrays and inline tables inside one another deeper than this are left to `toml_edit`
/// (a section file needs two: a list of `[x, y]` pairs).
pub const MAX_DEPTH: usize = 8;

/// Room reserved for the entries of a `[name]` table or the root, so that the usual
/// few (a part's shape, dimensions and placement) are pushed without growing.
const ENTRIES: usize = 8;

/// The tree of `text`, or `None` when the strict subset does not cover it.
pub fn parse(text: &str) -> Option<Table<'_>> {
    let mut p = Parser {
        text,
        b: text.as_bytes(),
        i: 0,
    };
    let mut root = Table {
        entries: Vec::with_capacity(ENTRIES),
        // As toml_edit: the root's range runs from 0 to the end of its last value.
        span: Some(0..0),
    };
    // Where `key = value` lines go: the root (None) or the root's entry at this index.
    let mut current: Option<usize> = None;
    loop {
        p.skip_ws();
        match p.peek() {
            None => break,
            Some(b'\n') => p.i += 1,
            Some(b'\r') => p.newline()?,
            Some(b'#') => {
                p.comment()?;
                p.line_end()?;
            }
            Some(b'[') => current = Some(p.header(&mut root)?),
            Some(_) => {
                let table = match current {
                    None => &mut root,
                    Some(k) => match &mut root.entries[k].item {
                        Item::Table(t) => t,
                        Item::Tables(ts, _) => ts.last_mut()?,
                        Item::Value(_) => return None,
                    },
                };
                let end = p.keyval(table, 0)?;
                p.line_end()?;
                if let Some(t) = &table.span {
                    table.span = Some(t.start..end);
                }
            }
        }
    }
    for e in &mut root.entries {
        if let Item::Tables(ts, span) = &mut e.item {
            let first = ts.first().and_then(|t| t.span.clone());
            let last = ts.last().and_then(|t| t.span.clone());
            if let (Some(f), Some(l)) = (first, last) {
                *span = Some(f.start..l.end);
            }
        }
    }
    Some(root)
}

struct Parser<'a> {
    text: &'a str,
    b: &'a [u8],
    i: usize,
}

/// A byte that may end a number or a boolean.
fn ends_scalar(c: Option<u8>) -> bool {
    matches!(
        c,
        None | Some(b' ' | b'\t' | b'\n' | b'\r' | b',' | b']' | b'}' | b'#')
    )
}

/// Classes of bytes, one bit each in [`CLASS`]: a bare key's letters, digits, `-` and
/// `_`; a space or tab; a decimal digit; what a comment may hold (tab, printable ASCII
/// and every byte of a multi-byte UTF-8 character); and that less `"` and `\\` (what a
/// basic string holds unescaped) or less `'` (a literal string's).
const BARE: u8 = 1;
const BLANK: u8 = 2;
const DIGIT: u8 = 4;
const COMMENT: u8 = 8;
const BASIC: u8 = 16;
const LITERAL: u8 = 32;

/// The classes of each byte, looked up once a byte in the loops over runs.
static CLASS: [u8; 256] = {
    let mut t = [0u8; 256];
    let mut c = 0;
    while c < 256 {
        let b = c as u8;
        let mut k = 0;
        if b.is_ascii_alphanumeric() || b == b'_' || b == b'-' {
            k |= BARE;
        }
        if b == b' ' || b == b'\t' {
            k |= BLANK;
        }
        if b.is_ascii_digit() {
            k |= DIGIT;
        }
        if b == b'\t' || (b >= 0x20 && b <= 0x7e) || b >= 0x80 {
            k |= COMMENT;
            if b != b'"' && b != b'\\' {
                k |= BASIC;
            }
            if b != b'\'' {
                k |= LITERAL;
            }
        }
        t[c] = k;
        c += 1;
    }
    t
};

impl<'a> Parser<'a> {
    fn peek(&self) -> Option<u8> {
        self.b.get(self.i).copied()
    }

    /// Steps over the bytes of `class` from here; how many there were.
    fn run(&mut self, class: u8) -> usize {
        let n = self.b[self.i..]
            .iter()
            .take_while(|&&c| CLASS[usize::from(c)] & class != 0)
            .count();
        self.i += n;
        n
    }

    fn skip_ws(&mut self) {
        self.run(BLANK);
    }

    /// A line end: LF or CR LF.
    fn newline(&mut self) -> Option<()> {
        match (self.peek(), self.b.get(self.i + 1)) {
            (Some(b'\n'), _) => self.i += 1,
            (Some(b'\r'), Some(b'\n')) => self.i += 2,
            _ => return None,
        }
        Some(())
    }

    /// A comment from `#` to the line end (not taken): tab and printable characters
    /// only (TOML 1.0: no control characters but tab in a comment).
    fn comment(&mut self) -> Option<()> {
        self.i += 1;
        self.run(COMMENT);
        match self.peek() {
            None | Some(b'\n') => Some(()),
            Some(b'\r') => (self.b.get(self.i + 1) == Some(&b'\n')).then_some(()),
            Some(_) => None,
        }
    }

    /// The rest of a line after a value or header: white space, a comment, the end.
    fn line_end(&mut self) -> Option<()> {
        self.skip_ws();
        if self.peek() == Some(b'#') {
            self.comment()?;
        }
        match self.peek() {
            None => Some(()),
            _ => self.newline(),
        }
    }

    /// White space, newlines and comments, as between the values of an array.
    fn skip_ws_comments(&mut self) -> Option<()> {
        loop {
            self.skip_ws();
            match self.peek() {
                Some(b'#') => self.comment()?,
                Some(b'\n' | b'\r') => self.newline()?,
                _ => return Some(()),
            }
        }
    }

    /// A bare key and its range.
    fn key(&mut self) -> Option<(&'a str, std::ops::Range<usize>)> {
        let start = self.i;
        (self.run(BARE) > 0).then(|| (&self.text[start..self.i], start..self.i))
    }

    /// `[name]` or `[[name]]`, with its line: the index of its table in the root.
    fn header(&mut self, root: &mut Table<'a>) -> Option<usize> {
        let start = self.i;
        let many = self.b.get(self.i + 1) == Some(&b'[');
        self.i += if many { 2 } else { 1 };
        self.skip_ws();
        let (key, key_span) = self.key()?;
        self.skip_ws();
        let close: &[u8] = if many { b"]]" } else { b"]" };
        if !self.b[self.i..].starts_with(close) {
            return None;
        }
        self.i += close.len();
        let table = Table {
            entries: Vec::with_capacity(ENTRIES),
            span: Some(start..self.i),
        };
        self.line_end()?;
        let at = root.entries.iter().position(|e| e.key == key);
        match (at, many) {
            (None, _) => {
                let item = if many {
                    Item::Tables(vec![table], None)
                } else {
                    Item::Table(table)
                };
                root.entries.push(Entry {
                    key: Cow::Borrowed(key),
                    key_span: Some(key_span),
                    item,
                });
                Some(root.entries.len() - 1)
            }
            (Some(k), true) => match &mut root.entries[k].item {
                Item::Tables(ts, _) => {
                    ts.push(table);
                    Some(k)
                }
                _ => None,
            },
            // A table defined twice, or a key then a table of the same name.
            (Some(_), false) => None,
        }
    }

    /// `key = value` (the line's end not taken), its value nested `depth` deep, put at
    /// the end of `table` (no copy of the entry on the way): where the value ends; `None`
    /// for a key already in `table`.
    fn keyval(&mut self, table: &mut Table<'a>, depth: usize) -> Option<usize> {
        let (key, key_span) = self.key()?;
        self.skip_ws();
        if self.peek() != Some(b'=') {
            return None;
        }
        self.i += 1;
        self.skip_ws();
        let value = self.value(depth)?;
        if table.entries.iter().any(|e| e.key == key) {
            return None;
        }
        table.entries.push(Entry {
            key: Cow::Borrowed(key),
            key_span: Some(key_span),
            item: Item::Value(value),
        });
        Some(self.i)
    }

    fn value(&mut self, depth: usize) -> Option<Value<'a>> {
        let start = self.i;
        let kind = match self.peek()? {
            b'"' => Kind::Str(self.basic_string()?),
            b'\'' => Kind::Str(self.literal_string()?),
            b'[' if depth < MAX_DEPTH => Kind::Array(self.array(depth + 1)?),
            b'{' if depth < MAX_DEPTH => Kind::Table(self.inline_table(depth + 1)?),
            b't' => self.word("true", Kind::Bool(true))?,
            b'f' => self.word("false", Kind::Bool(false))?,
            b'+' | b'-' | b'0'..=b'9' => self.number()?,
            _ => return None,
        };
        Some(Value {
            kind,
            span: Some(start..self.i),
        })
    }

    fn word(&mut self, w: &str, kind: Kind<'a>) -> Option<Kind<'a>> {
        if !self.b[self.i..].starts_with(w.as_bytes()) {
            return None;
        }
        self.i += w.len();
        ends_scalar(self.peek()).then_some(kind)
    }

    fn digits(&mut self) -> usize {
        self.run(DIGIT)
    }

    /// A decimal integer or float without underscores (TOML 1.0: no leading zeros in
    /// the integer part; a fraction and an exponent need a digit each).
    fn number(&mut self) -> Option<Kind<'a>> {
        let start = self.i;
        if matches!(self.peek(), Some(b'+' | b'-')) {
            self.i += 1;
        }
        let int_start = self.i;
        let n = self.digits();
        if n == 0 || (n > 1 && self.b[int_start] == b'0') {
            return None;
        }
        let mut float = false;
        if self.peek() == Some(b'.') {
            self.i += 1;
            if self.digits() == 0 {
                return None;
            }
            float = true;
        }
        if matches!(self.peek(), Some(b'e' | b'E')) {
            self.i += 1;
            if matches!(self.peek(), Some(b'+' | b'-')) {
                self.i += 1;
            }
            if self.digits() == 0 {
                return None;
            }
            float = true;
        }
        if !ends_scalar(self.peek()) {
            return None;
        }
        let tok = &self.text[start..self.i];
        if float {
            let x: f64 = tok.parse().ok()?;
            x.is_finite().then_some(Kind::Float(x))
        } else {
            tok.parse().ok().map(Kind::Integer)
        }
    }

    /// `"..."` on one line, with TOML 1.0's escapes; borrowed from the text when it
    /// has none.
    fn basic_string(&mut self) -> Option<Cow<'a, str>> {
        if self.b[self.i..].starts_with(b"\"\"\"") {
            return None;
        }
        self.i += 1;
        let mut run = self.i;
        let mut owned: Option<String> = None;
        loop {
            self.run(BASIC);
            match self.peek()? {
                b'"' => {
                    let tail = &self.text[run..self.i];
                    self.i += 1;
                    return Some(match owned {
                        None => Cow::Borrowed(tail),
                        Some(mut s) => {
                            s.push_str(tail);
                            Cow::Owned(s)
                        }
                    });
                }
                b'\\' => {
                    let s = owned.get_or_insert_with(String::new);
                    s.push_str(&self.text[run..self.i]);
                    let e = *self.b.get(self.i + 1)?;
                    self.i += 2;
                    let ch = match e {
                        b'b' => '\u{8}',
                        b't' => '\t',
                        b'n' => '\n',
                        b'f' => '\u{c}',
                        b'r' => '\r',
                        b'"' => '"',
                        b'\\' => '\\',
                        b'u' => self.hex(4)?,
                        b'U' => self.hex(8)?,
                        _ => return None,
                    };
                    s.push(ch);
                    run = self.i;
                }
                _ => return None,
            }
        }
    }

    /// `n` hex digits naming a Unicode scalar value.
    fn hex(&mut self, n: usize) -> Option<char> {
        let h = self.b.get(self.i..self.i + n)?;
        if !h.iter().all(u8::is_ascii_hexdigit) {
            return None;
        }
        let code = u32::from_str_radix(&self.text[self.i..self.i + n], 16).ok()?;
        self.i += n;
        char::from_u32(code)
    }

    /// `'...'` on one line: no escapes.
    fn literal_string(&mut self) -> Option<Cow<'a, str>> {
        if self.b[self.i..].starts_with(b"'''") {
            return None;
        }
        self.i += 1;
        let start = self.i;
        self.run(LITERAL);
        if self.peek()? != b'\'' {
            return None;
        }
        self.i += 1;
        Some(Cow::Borrowed(&self.text[start..self.i - 1]))
    }

    /// `[a, b, ...]`, over lines and with comments, a trailing comma allowed.
    fn array(&mut self, depth: usize) -> Option<Vec<Value<'a>>> {
        self.i += 1;
        // The room a first push would make (a point's two coordinates fit), made at once.
        let mut out = Vec::with_capacity(4);
        loop {
            self.skip_ws_comments()?;
            if self.peek() == Some(b']') {
                self.i += 1;
                return Some(out);
            }
            out.push(self.value(depth)?);
            self.skip_ws_comments()?;
            match self.peek()? {
                b',' => self.i += 1,
                b']' => {
                    self.i += 1;
                    return Some(out);
                }
                _ => return None,
            }
        }
    }

    /// `{ k = v, ... }` on one line, no trailing comma (TOML 1.0).
    fn inline_table(&mut self, depth: usize) -> Option<Table<'a>> {
        let start = self.i;
        self.i += 1;
        let mut t = Table {
            entries: Vec::new(),
            span: None,
        };
        self.skip_ws();
        if self.peek() == Some(b'}') {
            self.i += 1;
            t.span = Some(start..self.i);
            return Some(t);
        }
        loop {
            self.skip_ws();
            self.keyval(&mut t, depth)?;
            self.skip_ws();
            match self.peek()? {
                b',' => self.i += 1,
                b'}' => {
                    self.i += 1;
                    t.span = Some(start..self.i);
                    return Some(t);
                }
                _ => return None,
            }
        }
    }
}
