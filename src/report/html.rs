//! `kern report --html`: the Markdown sheet as one self-contained HTML page, with the
//! drawing inline where the sheet marks it.
//!
//! The renderer knows only what [`super::markdown`] writes: `#`–`###` headings,
//! paragraphs, `>` quotes, `-` lists, pipe tables, and inline `code`, `**bold**`,
//! backslash escapes and the entities [`crate::text::markdown`] writes. It is not a
//! general Markdown reader. All text goes out through [`xml`], the one escaper.

use super::markdown::DRAWING_MARK;
use crate::text::xml;

const STYLE: &str = "body{font-family:sans-serif;max-width:60em;margin:2em auto;padding:0 1em;color:#222}\
table{border-collapse:collapse;margin:0.5em 0 1em}th,td{border:1px solid #bbb;padding:0.2em 0.5em;text-align:left}\
th{background:#eef2f6}blockquote{border-left:4px solid #c0392b;margin:1em 0;padding:0.3em 1em;background:#fbefed}\
code{background:#f2f2f2;padding:0 0.2em}figure{margin:1em 0}";

/// The page: `md` rendered, with `svg` where the drawing mark stands.
pub fn page(title: &str, md: &str, svg: &str) -> String {
    let mut out = format!(
        "<!DOCTYPE html>\n<html lang=\"en\">\n<head>\n<meta charset=\"utf-8\">\n<title>{}</title>\n<style>{STYLE}</style>\n</head>\n<body>\n",
        xml(title)
    );
    let lines: Vec<&str> = md.lines().collect();
    let mut i = 0;
    while let Some(&line) = lines.get(i) {
        if line.trim().is_empty() {
            i += 1;
        } else if line == DRAWING_MARK {
            out.push_str("<h2>Drawing</h2>\n<figure>\n");
            out.push_str(svg);
            out.push_str("</figure>\n");
            i += 1;
        } else if let Some((level, text)) = heading(line) {
            out.push_str(&format!("<h{level}>{}</h{level}>\n", inline(text)));
            i += 1;
        } else if let Some(text) = line.strip_prefix("> ") {
            out.push_str(&format!(
                "<blockquote><p>{}</p></blockquote>\n",
                inline(text)
            ));
            i += 1;
        } else if line.starts_with("- ") {
            out.push_str("<ul>\n");
            while let Some(item) = lines.get(i).and_then(|l| l.strip_prefix("- ")) {
                out.push_str(&format!("<li>{}</li>\n", inline(item)));
                i += 1;
            }
            out.push_str("</ul>\n");
        } else if line.starts_with('|') {
            let start = i;
            while lines.get(i).is_some_and(|l| l.starts_with('|')) {
                i += 1;
            }
            table(&mut out, lines.get(start..i).unwrap_or_default());
        } else {
            let mut para = Vec::new();
            while let Some(&l) = lines.get(i) {
                if l.trim().is_empty() || l == DRAWING_MARK || heading(l).is_some() {
                    break;
                }
                para.push(inline(l));
                i += 1;
            }
            out.push_str(&format!("<p>{}</p>\n", para.join("\n")));
        }
    }
    out.push_str("</body>\n</html>\n");
    out
}

fn heading(line: &str) -> Option<(usize, &str)> {
    let level = line.chars().take_while(|&c| c == '#').count();
    let text = line.get(level..)?.strip_prefix(' ')?;
    (1..=3).contains(&level).then_some((level, text))
}

/// Splits a table row on the `|` that are not escaped.
fn cells(row: &str) -> Vec<String> {
    let inner = row.trim().trim_start_matches('|');
    let inner = inner.strip_suffix('|').unwrap_or(inner);
    let mut out = Vec::new();
    let mut cur = String::new();
    let mut chars = inner.chars().peekable();
    while let Some(c) = chars.next() {
        match c {
            '\\' if chars.peek() == Some(&'|') => {
                cur.push_str("\\|");
                chars.next();
            }
            '|' => out.push(std::mem::take(&mut cur)),
            _ => cur.push(c),
        }
    }
    out.push(cur);
    out.into_iter().map(|c| c.trim().to_string()).collect()
}

/// A pipe table: the first row is the header, the second the rule.
fn table(out: &mut String, rows: &[&str]) {
    out.push_str("<table>\n");
    for (k, row) in rows.iter().enumerate() {
        if k == 1 {
            continue;
        }
        let tag = if k == 0 { "th" } else { "td" };
        out.push_str("<tr>");
        for c in cells(row) {
            out.push_str(&format!("<{tag}>{}</{tag}>", inline(&c)));
        }
        out.push_str("</tr>\n");
    }
    out.push_str("</table>\n");
}

/// The entities [`crate::text::markdown`] writes, passed through as they stand.
const ENTITIES: [&str; 3] = ["&amp;", "&lt;", "&gt;"];

/// Inline Markdown: `code`, **bold**, backslash escapes of punctuation and the
/// entities of [`ENTITIES`]; everything else is text, escaped by [`xml`].
fn inline(t: &str) -> String {
    let mut out = String::new();
    let mut code = false;
    let mut bold = false;
    let mut rest = t;
    while let Some(c) = rest.chars().next() {
        let escaped = rest[c.len_utf8()..]
            .chars()
            .next()
            .filter(|e| c == '\\' && e.is_ascii_punctuation() && (!code || *e == '|'));
        if let Some(e) = escaped {
            out.push_str(&xml(&e.to_string()));
            rest = &rest[1 + e.len_utf8()..];
        } else if let Some(ent) = ENTITIES.iter().find(|x| !code && rest.starts_with(**x)) {
            out.push_str(ent);
            rest = &rest[ent.len()..];
        } else if !code && rest.starts_with("**") {
            out.push_str(if bold { "</strong>" } else { "<strong>" });
            bold = !bold;
            rest = &rest[2..];
        } else if c == '`' {
            out.push_str(if code { "</code>" } else { "<code>" });
            code = !code;
            rest = &rest[1..];
        } else {
            out.push_str(&xml(&c.to_string()));
            rest = &rest[c.len_utf8()..];
        }
    }
    if code {
        out.push_str("</code>");
    }
    if bold {
        out.push_str("</strong>");
    }
    out
}
