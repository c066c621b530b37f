//! `kern report --html`: the sheet's blocks ([`super::blocks`]) as one self-contained
//! HTML page, with the drawing inline where the sheet has it. All text goes out
//! through [`xml`], the one escaper; no Markdown is read.

use super::blocks::{header_rows, Block, Line, Span};
use super::CAUTION;
use crate::text::{clean, xml};

const STYLE: &str = "body{font-family:sans-serif;max-width:60em;margin:2em auto;padding:0 1em;color:#222}\
table{border-collapse:collapse;margin:0.5em 0 1em}th,td{border:1px solid #bbb;padding:0.2em 0.5em;text-align:left}\
th{background:#eef2f6}blockquote{border-left:4px solid #c0392b;margin:1em 0;padding:0.3em 1em;background:#fbefed}\
code{background:#f2f2f2;padding:0 0.2em}figure{margin:1em 0}figure svg{max-width:100%;height:auto}\
table.head{width:100%;margin-top:0}table.head th{width:9em}table.head td{width:40%}td.fill{height:1.4em}";

/// Printing (A4): margins, small type so the widest table fits the width, no page
/// break inside a table row, a figure or right after a heading, header rows repeated
/// on each page, and the caution with the page number in every page's footer (CSS
/// Paged Media margin boxes, which Chromium prints).
const PRINT: &str = "@page{size:A4;margin:16mm 14mm 20mm 14mm;\
@bottom-left{content:\"CAUTION\";font:7pt sans-serif;color:#555;width:80%}\
@bottom-right{content:\"page \" counter(page) \" of \" counter(pages);font:7pt sans-serif;color:#555}}\
@media print{body{max-width:none;margin:0;padding:0;font-size:9pt}\
table{font-size:7.5pt;break-inside:auto}tr,figure,blockquote,table.head{break-inside:avoid}\
thead{display:table-header-group}h1,h2,h3{break-after:avoid}\
th{background:#eef2f6;-webkit-print-color-adjust:exact;print-color-adjust:exact}\
figure svg{max-height:200mm;width:auto}}";

/// The page: `blocks` in order, with `svg` where the drawing stands.
pub fn page(title: &str, blocks: &[Block], svg: &str) -> String {
    let mut out = format!(
        "<!DOCTYPE html>\n<html lang=\"en\">\n<head>\n<meta charset=\"utf-8\">\n<title>{}</title>\n<style>{STYLE}{}</style>\n</head>\n<body>\n",
        xml(title),
        PRINT.replace("CAUTION", CAUTION)
    );
    for b in blocks {
        match b {
            Block::Heading(level, l) => {
                out.push_str(&format!("<h{level}>{}</h{level}>\n", line(l)));
            }
            Block::Para(l) => out.push_str(&format!("<p>{}</p>\n", line(l))),
            Block::Quote(l) => {
                out.push_str(&format!("<blockquote><p>{}</p></blockquote>\n", line(l)));
            }
            Block::List(items) => {
                out.push_str("<ul>\n");
                for i in items {
                    out.push_str(&format!("<li>{}</li>\n", line(i)));
                }
                out.push_str("</ul>\n");
            }
            Block::Table { head, body } => {
                out.push_str("<table>\n<thead>");
                row(&mut out, "th", head);
                out.push_str("</thead>\n<tbody>\n");
                for r in body {
                    row(&mut out, "td", r);
                }
                out.push_str("</tbody>\n</table>\n");
            }
            Block::Header(fields) => {
                out.push_str("<table class=\"head\">\n");
                for r in header_rows(fields) {
                    out.push_str("<tr>");
                    for (label, value) in &r {
                        match value {
                            Some(v) => {
                                out.push_str(&format!("<th>{label}</th><td>{}</td>", xml(v)))
                            }
                            None => {
                                out.push_str(&format!("<th>{label}</th><td class=\"fill\"></td>"))
                            }
                        }
                    }
                    if r.len() == 1 {
                        out.push_str("<th></th><td></td>");
                    }
                    out.push_str("</tr>\n");
                }
                out.push_str("</table>\n");
            }
            Block::Drawing(_) => {
                out.push_str("<h2>Drawing</h2>\n<figure>\n");
                out.push_str(svg);
                out.push_str("</figure>\n");
            }
        }
    }
    out.push_str("</body>\n</html>\n");
    out
}

/// One table row of `tag` cells.
fn row(out: &mut String, tag: &str, cells: &[Line]) {
    out.push_str("<tr>");
    for c in cells {
        out.push_str(&format!("<{tag}>{}</{tag}>", line(c)));
    }
    out.push_str("</tr>\n");
}

/// A line in HTML: every span escaped by [`xml`]; code with no backtick, as the
/// Markdown writer shows it.
fn line(l: &Line) -> String {
    l.iter()
        .map(|s| match s {
            Span::Own(t) | Span::User(t) => xml(t),
            Span::Code(t) => format!("<code>{}</code>", xml(&clean(t).replace('`', "'"))),
            Span::Bold(t) => format!("<strong>{}</strong>", xml(t)),
        })
        .collect()
}
