//! The calculation sheet as blocks — headings, paragraphs, quotes, lists, tables and
//! the drawing — built once from the analysis ([`super::markdown::blocks`]) and
//! written two ways: as Markdown here ([`markdown`]) and as HTML by [`super::html`].
//! Each writer escapes text its own way; neither reads the other's output.

use crate::text::clean;

/// A run of text within a line.
#[derive(Debug, Clone, PartialEq)]
pub enum Span {
    /// kern's own words, numbers and units: written as they stand in Markdown (they
    /// hold no Markdown syntax), escaped in HTML.
    Own(String),
    /// Text from the file (a name, a title, a warning): cleaned and made literal by
    /// each writer.
    User(String),
    /// Text from the file shown as code (a file name, a parameter as written).
    Code(String),
    /// kern's own text in bold.
    Bold(String),
}

/// One line of text: a table cell, a list item, a paragraph.
pub type Line = Vec<Span>;

/// kern's own text as a line.
pub fn own(t: impl Into<String>) -> Line {
    vec![Span::Own(t.into())]
}

/// Text from the file as a line.
pub fn user(t: &str) -> Line {
    vec![Span::User(t.to_string())]
}

/// One block of the sheet.
#[derive(Debug, Clone, PartialEq)]
pub enum Block {
    /// Level 1 to 3.
    Heading(u8, Line),
    Para(Line),
    Quote(Line),
    List(Vec<Line>),
    Table {
        head: Vec<Line>,
        body: Vec<Vec<Line>>,
    },
    /// Where the drawing goes (the HTML page holds it inline).
    Drawing,
}

/// The line where the Markdown sheet marks the drawing (an HTML comment, invisible in
/// Markdown).
pub const DRAWING_MARK: &str = "<!-- drawing -->";

/// User text in a Markdown code span: cleaned, with no backtick to end the span
/// early and `|` escaped for table cells (GitHub tables read `\|` inside code too).
fn md_code(t: &str) -> String {
    format!("`{}`", clean(t).replace('`', "'").replace('|', "\\|"))
}

/// A line in Markdown.
fn md_line(l: &Line) -> String {
    l.iter()
        .map(|s| match s {
            Span::Own(t) => t.clone(),
            Span::User(t) => crate::text::markdown(t),
            Span::Code(t) => md_code(t),
            Span::Bold(t) => format!("**{t}**"),
        })
        .collect()
}

/// The blocks as Markdown: each block's lines, a blank line between blocks.
pub fn markdown(blocks: &[Block]) -> String {
    let mut parts = Vec::with_capacity(blocks.len());
    for b in blocks {
        let mut s = String::new();
        match b {
            Block::Heading(level, l) => {
                s.push_str(&format!("{} {}\n", "#".repeat(*level as usize), md_line(l)))
            }
            Block::Para(l) => s.push_str(&format!("{}\n", md_line(l))),
            Block::Quote(l) => s.push_str(&format!("> {}\n", md_line(l))),
            Block::List(items) => {
                for i in items {
                    s.push_str(&format!("- {}\n", md_line(i)));
                }
            }
            Block::Table { head, body } => {
                let row = |r: &[Line]| {
                    format!(
                        "| {} |\n",
                        r.iter().map(md_line).collect::<Vec<_>>().join(" | ")
                    )
                };
                s.push_str(&row(head));
                s.push_str(&format!(
                    "|{}|\n",
                    head.iter().map(|_| "---").collect::<Vec<_>>().join("|")
                ));
                for r in body {
                    s.push_str(&row(r));
                }
            }
            Block::Drawing => s.push_str(&format!("{DRAWING_MARK}\n")),
        }
        parts.push(s);
    }
    parts.join("\n")
}
