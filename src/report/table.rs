//! The aligned, unit-labelled table that `kern calc` prints for people.

use super::out::OutUnits;
use super::rows::{rows, Notation, Row};
use crate::analysis::Analysis;
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
    let count = |hole: bool| {
        a.section
            .parts
            .iter()
            .filter(|p| p.void && p.enabled && p.hole == hole)
            .count()
    };
    let (voids, holes) = (count(false), count(true));
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
    if holes > 0 {
        s.push_str(&format!(
            " ({holes} hole{})",
            if holes == 1 { "" } else { "s" }
        ));
    }
    s.push('\n');
    if a.net.is_some() {
        s.push_str(
            "  holes present: each group says its section — gross (holes left out) or net (holes subtracted)\n",
        );
    }
    if u.notation == Notation::Yz {
        s.push_str(&format!("  axes and symbols: {}\n", u.notation.note()));
    }
    let rs = rows(a, u);
    // Symbols may hold part names (a joint's): cleaned like every text from the file.
    let syms: Vec<String> = rs.iter().map(|r| clean(&r.symbol)).collect();
    let wsym = syms.iter().map(|s| s.chars().count()).max().unwrap_or(0);
    let vals: Vec<String> = rs
        .iter()
        .map(|r| r.value.map_or("—".into(), |v| u.num(v, FIGURES)))
        .collect();
    let wval = vals.iter().map(|v| v.chars().count()).max().unwrap_or(0);
    let heads = group_heads(&rs, a.net.is_some());
    let whead = heads
        .iter()
        .map(|h| h.chars().count())
        .max()
        .unwrap_or(0)
        .max(18);
    for (((r, v), sym), head) in rs.iter().zip(&vals).zip(&syms).zip(&heads) {
        s.push_str(&format!(
            "  {head:<whead$} {sym:<wsym$}  {v:>wval$} {unit}\n",
            unit = r.unit
        ));
    }
    if let Some(gm) = a
        .member
        .as_ref()
        .and_then(|m| m.governing_material.as_deref())
    {
        s.push_str(&format!("  member: governing material {}\n", clean(gm)));
    }
    if let Some(Ok(t)) = &a.torsion {
        s.push_str(&format!(
            "  torsion: {}, {} elements\n",
            t.method, t.elements
        ));
    }
    // Which flows came from the finite elements, and how good they are.
    let cells = (a.connections.iter())
        .filter(|c| a.connection_flow(c).is_some())
        .filter_map(|c| a.cell_flow_under_actions(c));
    if let Some(worst) = cells.map(|j| j.rel_error).reduce(f64::max) {
        s.push_str(&format!(
            "  connections: q across joints on a closed cell from the flexure solution (boundary flux), estimated relative error {worst:.1e} at most\n"
        ));
    }
    for w in &a.warnings {
        s.push_str(&format!("  warning: {}\n", clean(&w.to_string())));
    }
    // A "—" for Mcr says why, unless a warning above already did.
    if let Some(why) = (a.member.as_ref())
        .and_then(|m| m.mcr_note.as_ref())
        .filter(|r| !r.warns())
    {
        s.push_str(&format!("  note: Mcr —: not computed: {why}\n"));
    }
    s
}

/// Which section (FORMAT.md "Gross and net") a group of rows is taken on, when the
/// section has holes.
pub fn section_of(group: &str) -> &'static str {
    match group {
        "Net section" | "Stresses" => "net",
        "Member" => "σb net, deflection gross",
        _ => "gross",
    }
}

/// The group heading each row stands under: the group's name on its first row (with
/// the section it is taken on when there are holes), empty on the others.
pub fn group_heads(rows: &[Row], holes: bool) -> Vec<String> {
    let mut group = "";
    rows.iter()
        .map(|r| {
            let head = match (r.group != group, holes) {
                (false, _) => String::new(),
                (true, true) if r.group != "Net section" => {
                    format!("{} ({})", r.group, section_of(r.group))
                }
                (true, _) => r.group.to_string(),
            };
            group = r.group;
            head
        })
        .collect()
}
