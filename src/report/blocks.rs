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
    /// The sheet's header (project, job, element, by, checked, date, revision): each
    /// label with the file's text, or `None` for a line to fill in by hand.
    Header(Vec<(&'static str, Option<String>)>),
    /// Where the drawing goes: the HTML page holds it inline; Markdown links the
    /// image file named here, or marks the place with [`DRAWING_MARK`] when there is none.
    Drawing(Option<String>),
}

/// The line where the Markdown sheet marks the drawing (an HTML comment, invisible in
/// Markdown).
pub const DRAWING_MARK: &str = "<!-- drawing -->";

/// The sheet with its drawing linked as the image file `svg` (a name relative to the
/// sheet), in place of the mark.
pub fn link_drawing(blocks: &mut [Block], svg: &str) {
    for b in blocks {
        if let Block::Drawing(d) = b {
            *d = Some(svg.to_string());
        }
    }
}

/// What a blank header field shows in Markdown: a line to write on (escaped
/// underscores, so no emphasis starts).
const FILL_MD: &str = "\\_\\_\\_\\_\\_\\_\\_\\_\\_\\_\\_\\_\\_\\_\\_\\_";

/// The header's fields two to a row: `[label, value, label, value]`.
pub fn header_rows(
    fields: &[(&'static str, Option<String>)],
) -> Vec<Vec<(&'static str, Option<String>)>> {
    fields.chunks(2).map(<[_]>::to_vec).collect()
}

/// User text in a Markdown code span: cleaned, with no backtick to end the span
/// early and `|` escaped for table cells (GitHub tables read `\|` inside code too).
fn md_code(t: &str) -> String {
    format!("`{}`", clean(t).replace('`', "'").replace('|', "\\|"))
}

/// A relative file name as a Markdown link target: cleaned, with every character
/// outside a safe set percent-encoded (so no `)` or space ends the link early).
fn md_link(t: &str) -> String {
    let mut out = String::new();
    for b in clean(t).bytes() {
        if b.is_ascii_alphanumeric() || b"-_./~".contains(&b) {
            out.push(b as char);
        } else {
            out.push_str(&format!("%{b:02X}"));
        }
    }
    out
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
            Block::Header(fields) => {
                let cell = |(label, value): &(&str, Option<String>)| {
                    let v = value
                        .as_deref()
                        .map_or(FILL_MD.to_string(), crate::text::markdown);
                    format!("**{label}** | {v}")
                };
                for (i, r) in header_rows(fields).iter().enumerate() {
                    let mut cells: Vec<String> = r.iter().map(cell).collect();
                    if cells.len() == 1 {
                        cells.push(" | ".into());
                    }
                    s.push_str(&format!("| {} |\n", cells.join(" | ")));
                    if i == 0 {
                        s.push_str("|---|---|---|---|\n");
                    }
                }
            }
            Block::Drawing(None) => s.push_str(&format!(
                "{DRAWING_MARK}\n*The drawing is not in this text: `kern report FILE -o sheet.md` \
writes it beside the sheet as sheet.svg, and `kern svg FILE` draws it alone.*\n"
            )),
            Block::Drawing(Some(file)) => s.push_str(&format!(
                "![The section drawn to scale]({})\n",
                md_link(file)
            )),
        }
        parts.push(s);
    }
    parts.join("\n")
}
