//! The aligned, unit-labelled table that `kern calc` prints for people.

use super::out::OutUnits;
use super::rows::rows;
use crate::analysis::Analysis;
use crate::numfmt::sig;
use crate::text::clean;

/// Significant figures shown in tables.
pub const FIGURES: usize = 4;

/// The table for one section: a heading, one line a result grouped by quantity,
/// then the warnings.
pub fn to_table(file: &str, a: &Analysis, u: &OutUnits) -> String {
    let mut s = String::new();
    let title = clean(a.section.title.as_deref().unwrap_or("(untitled section)"));
    let file = clean(file);
    let n = a.section.parts.len();
    let voids = a
        .section
        .parts
        .iter()
        .filter(|p| p.void && p.enabled)
        .count();
    s.push_str(&format!(
        "{title}\n  {file} · lengths in {} · {n} part{}",
        u.length.name(),
        if n == 1 { "" } else { "s" }
    ));
    if voids > 0 {
        s.push_str(&format!(
            " ({voids} void{})",
            if voids == 1 { "" } else { "s" }
        ));
    }
    s.push('\n');
    let rs = rows(a, u);
    // Symbols may hold part names (a joint's): cleaned like every text from the file.
    let syms: Vec<String> = rs.iter().map(|r| clean(&r.symbol)).collect();
    let wsym = syms.iter().map(|s| s.chars().count()).max().unwrap_or(0);
    let vals: Vec<String> = rs
        .iter()
        .map(|r| r.value.map_or("—".into(), |v| sig(v, FIGURES)))
        .collect();
    let wval = vals.iter().map(|v| v.chars().count()).max().unwrap_or(0);
    let mut group = "";
    for ((r, v), sym) in rs.iter().zip(&vals).zip(&syms) {
        let head = if r.group != group { r.group } else { "" };
        group = r.group;
        s.push_str(&format!(
            "  {head:<18} {sym:<wsym$}  {v:>wval$} {unit}\n",
            unit = r.unit
        ));
    }
    if let Some(Ok(t)) = &a.torsion {
        s.push_str(&format!(
            "  torsion: {}, {} elements\n",
            t.method, t.elements
        ));
    }
    for w in &a.warnings {
        s.push_str(&format!("  warning: {}\n", clean(&w.to_string())));
    }
    s
}
