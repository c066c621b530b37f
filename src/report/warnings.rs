//! The words of every warning ([`Warning`]), in one place for every view: the calc
//! table, the JSON, the calculation sheet and the workbench all print `Display`.
//! Figures get significant figures here ([`sig`]), never in the core.

use crate::model::warning::{More, Warning};
use crate::numfmt::sig;
use std::fmt;

/// A ratio rounded to a power of ten: `1e5`.
fn ratio(r: f64) -> String {
    format!("{:.0e}", r)
}

impl fmt::Display for Warning {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        match self {
            Warning::NoArea { part } => {
                write!(f, "part `{part}` has no area after placement and adds nothing")
            }
            Warning::VoidsOverlap { a, b, percent } => write!(
                f,
                "voids `{a}` and `{b}` overlap ({}% of the smaller): the shared area is removed twice",
                sig(*percent, 3)
            ),
            Warning::SolidsOverlap { a, b, percent } => write!(
                f,
                "solid parts `{a}` and `{b}` overlap ({}% of the smaller): the shared area counts twice; make one of them a void or trim it",
                sig(*percent, 3)
            ),
            Warning::VoidOutside { void, percent } => write!(
                f,
                "void `{void}` is not wholly inside solid material ({}% of it lies outside): it removes area that is not there",
                sig(*percent, 3)
            ),
            Warning::More { count, kind } => {
                let rest = match kind {
                    More::PartsWithNoArea => "parts with no area",
                    More::Overlaps => "pairs of parts overlap",
                    More::VoidsOutside => "voids are not wholly inside solid material",
                };
                write!(f, "… and {count} more {rest}")
            }
            Warning::MeshSimplified { kept, corners, tol } => write!(
                f,
                "torsion meshed the straight-edged outlines with {kept} of their {corners} corners (the rest lie within {} of them); the error estimate includes this",
                sig(*tol, 2)
            ),
            Warning::SeparatePieces { count } => write!(
                f,
                "the section is in {count} separate pieces: torsion takes them as twisting together \
                 but unconnected (J is the sum of theirs); battens or lacing would make it stiffer"
            ),
            Warning::RegionArea { percent } => write!(
                f,
                "torsion uses the region itself (solids united, voids removed once), whose area \
                 differs from the signed sum of the parts by {}%",
                sig(*percent, 2)
            ),
            Warning::TinyFeature { ratio: r, feature, span, floor } => write!(
                f,
                "features {} times smaller than the section (a wall, gap or tip {} wide, the \
                 section {} across); the torsion mesh takes features down to {:.0e} of the \
                 section's size: check the dimensions, or leave the thin part out",
                ratio(*r),
                sig(*feature, 2),
                sig(*span, 3),
                floor
            ),
            Warning::MeshBudget { nodes, corners, ratio: r, span, budget } => write!(
                f,
                "the base mesh would need more than {nodes} nodes ({corners} corners and graded points on \
                 the outlines, the thinnest feature 1/{} of the section's {}); the torsion \
                 solver's budget is {budget} added nodes: simplify the section (fewer holes or parts)",
                ratio(*r),
                sig(*span, 3)
            ),
            Warning::NoTorsion(why) => write!(f, "torsion not computed: {why}"),
            Warning::Note(s) => f.write_str(s),
        }
    }
}
