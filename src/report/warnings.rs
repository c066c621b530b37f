//! The words of every warning ([`Warning`]), in one place for every view: the calc
//! table, the JSON, the calculation sheet and the workbench all print `Display`.
//! Figures get significant figures here ([`sig`]), never in the core.

use crate::model::warning::{McrRefusal, More, ShearCause, ShearFigure, Warning};
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
            Warning::Cancelled => f.write_str("cancelled"),
            Warning::TooManyCorners { corners, budget } => write!(
                f,
                "the section has {corners} re-entrant corners, and grading the torsion mesh at them \
                 would take more than the solver's budget of {budget} added nodes: simplify the \
                 section (fewer holes or parts)"
            ),
            Warning::SolverFailed => f.write_str("the torsion solver failed on this section"),
            Warning::NoSolidPart => {
                f.write_str("there is no enabled solid part to mesh for torsion")
            }
            Warning::CannotMesh { cause } => {
                write!(f, "cannot mesh the section for torsion: {cause}")
            }
            Warning::ExtentNotFinite => f.write_str("the section extent is not finite"),
            Warning::NoExtent => f.write_str("the section has no extent to mesh for torsion"),
            Warning::NoSolidArea => {
                f.write_str("the solid parts have no area to mesh for torsion")
            }
            Warning::EmptyRegion => {
                f.write_str("the region of the section (solids minus voids) is empty")
            }
            Warning::DegenerateElement => f.write_str("the torsion mesh has a degenerate element"),
            Warning::Stalled { elements } => write!(
                f,
                "the solver did not converge on the mesh of {elements} elements (outlines that \
                 touch at a point or meet at a hairline angle make cusps); move the parts apart \
                 or overlap them clearly"
            ),
            Warning::SolveTooLarge {
                entries,
                flops,
                max_entries,
                max_flops,
            } => write!(
                f,
                "the base mesh's direct solve would hold {entries} entries and take {flops:.0e} operations, \
                 past the solver's budget ({max_entries} entries, {max_flops:.0e} operations); simplify the section \
                 (fewer holes or corners)"
            ),
            Warning::AboveTolerance { error, tol } => write!(
                f,
                "torsion: the estimated error {error:.1e} is above the tolerance {tol:.1e} on the finest mesh allowed"
            ),
            Warning::NextMeshPastBudget {
                elements,
                max_elements,
                max_nodes,
                mb,
            } => write!(
                f,
                "an error estimate needs two meshes, and the next ({elements} elements) is past \
                 the solver's budget of {max_elements} elements, {max_nodes} nodes and {mb} MB; simplify the \
                 section (fewer holes or corners)"
            ),
            Warning::NoShear(why) => {
                write!(f, "shear stresses and shear areas not computed: {why}")
            }
            Warning::ShearPieces { count } => write!(
                f,
                "the section is {count} separate pieces, which share no shear flow: shear \
                 stresses and shear areas are not given (check each piece as its own member, \
                 or join them)"
            ),
            Warning::ShearAboveTolerance { figures, cause } => {
                let names: Vec<&str> = (figures.iter())
                    .map(|figure| match figure {
                        ShearFigure::Areas => "shear areas",
                        ShearFigure::TauMax => "largest shear stress",
                        ShearFigure::VonMises => "largest von Mises stress",
                        ShearFigure::MemberTau => "member shear stress at Vmax",
                    })
                    .collect();
                let what = match names.split_last() {
                    Some((last, [])) => last.to_string(),
                    Some((last, rest)) => format!("{} and {last}", rest.join(", ")),
                    None => "shear figures".to_string(),
                };
                let why = match cause {
                    ShearCause::SharpCorner => {
                        "sharp re-entrant corner (the elastic peak there is singular; \
                         a fillet radius on the parts gives a finite one)"
                    }
                    ShearCause::NotSettled => {
                        "the meshes allowed did not bring the error within the tolerance"
                    }
                };
                write!(f, "{what} not given: {why}")
            }
            Warning::ConnectionsNotLooked { max_pairs } => write!(
                f,
                "connections not looked for: more than {max_pairs} pairs of parts lie on one another (stacked or overlapping parts); no joint or shear flow is given"
            ),
            Warning::PointContact { a, b } => write!(
                f,
                "parts `{a}` and `{b}` touch only at a point: no joint there can carry longitudinal shear"
            ),
            Warning::NoSharedBoundary { solids } => write!(
                f,
                "no two of the {solids} solid parts share a boundary: the properties assume they act together, which needs connections along the member (battens, packs, bolts)"
            ),
            Warning::PartsAlone { parts } => {
                let names: Vec<String> = parts.iter().map(|n| format!("`{n}`")).collect();
                let (kind, verb) = if names.len() == 1 {
                    ("part", "shares")
                } else {
                    ("parts", "share")
                };
                write!(
                    f,
                    "{kind} {} {verb} no boundary with another solid part: each needs its own connection to the rest, or is a separate member (the properties assume the parts act together)",
                    names.join(", ")
                )
            }
            Warning::ClosedCellFlow { joints } => {
                let names: Vec<String> = joints.iter().map(|(a, b)| joint(a, b)).collect();
                write!(
                    f,
                    "the shear flow across joints on a closed cell ({}) comes from the finite-element flexure solution, which is not there (torsion is off with --no-torsion, the shear with --no-shear, still solving, or not computed): no flow is given for them",
                    names.join(", ")
                )
            }
            Warning::CellFlowWithheld { a, b, error, .. } if !error.is_finite() => write!(
                f,
                "the shear flow across the joint {} (on a closed cell) is not given: the finite-element mesh does not follow that shared boundary (the parts overlap there)",
                joint(a, b)
            ),
            Warning::CellFlowWithheld { a, b, error, tol } => write!(
                f,
                "the shear flow across the joint {} (on a closed cell) from the flexure solution has an estimated error of {error:.1e} against the tolerance {tol:.1e}: withheld",
                joint(a, b)
            ),
            Warning::LoopJointFlow { a, b } => write!(
                f,
                "the joint {} is a closed loop: the shear flow across it changes around the loop and has no one figure (none is given); see the shear stresses",
                joint(a, b)
            ),
            Warning::VoidAcrossJoint { void, a, b } => write!(
                f,
                "void `{void}` lies in parts on both sides of the joint {}: the flow across it is not computed",
                joint(a, b)
            ),
            Warning::StrayVoidAtJoint { void, a, b } => write!(
                f,
                "void `{void}` is in no solid part, so the sides of the joint {} cannot be told its share: the flow across it is not computed",
                joint(a, b)
            ),
            Warning::SelfWeightNoDensity => f.write_str(
                "self_weight is on but not every part has a material with a density; self-weight left out",
            ),
            Warning::MemberNoModulus => f.write_str(
                "the member check has no modulus of elasticity: add [[materials]] with E for deflections",
            ),
            Warning::MaterialNoFy { material } => write!(
                f,
                "material {} has no fy: its bending stress is not in the member's \
utilization; give its fy",
                material.as_deref().unwrap_or("(none)")
            ),
            Warning::McrNotComputed(why) => write!(f, "Mcr not computed: {why}"),
            Warning::ShearDeflectionWithheld { solved } => write!(
                f,
                "shear_deformation is on but there is no shear area A_s,y ({}): the deflection \
is not given, since leaving shear out would understate it, and the utilization leaves \
deflection out",
                if *solved {
                    "the flexure solution gave none within its tolerance; see the warning on shear"
                } else {
                    "the flexure solution has not run: torsion or shear skipped (--no-torsion, --no-shear), or still solving"
                }
            ),
        }
    }
}

/// A joint between parts `a` and `b`: `` `a`–`b` ``.
fn joint(a: &str, b: &str) -> String {
    format!("`{a}`–`{b}`")
}

/// Why Mcr is absent, in the words of the member check and of its warning.
impl fmt::Display for McrRefusal {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        match self {
            McrRefusal::NoMember => f.write_str("no [member]"),
            McrRefusal::NotSimpleSpan => f.write_str(
                "the formula is for a simple span (ends free to warp, twist prevented); other \
end conditions need effective lengths and a published method that kern does not apply",
            ),
            McrRefusal::LoadHeight { top } => write!(
                f,
                "[member] load_height = \"{}\": a load above or below \
the shear centre needs a load-height method (tabulated for given load cases, e.g. in the SSRC \
guide) that kern does not implement; use load_height = \"shear_centre\" for the value with \
the load at the shear centre",
                if *top { "top" } else { "bottom" }
            ),
            McrRefusal::NoModulus => {
                f.write_str("it needs a modulus of elasticity: add [[materials]] with E")
            }
            McrRefusal::NoTorsion => {
                f.write_str("it needs the torsion results (J, Cw, shear centre)")
            }
            McrRefusal::TorsionFailed => {
                f.write_str("the torsion results (J, Cw, shear centre) could not be computed")
            }
            McrRefusal::SeparatePieces { count } => write!(
                f,
                "the section is {count} separate pieces; how they buckle \
together depends on how and how often they are connected along the span (each piece also \
buckles on its own between connections), and no single Mcr of the cross-section describes \
that; check the pieces and their connections by a method for built-up members"
            ),
            McrRefusal::Asymmetric => f.write_str(
                "the section is not symmetric about an axis parallel to y \
(Ixy ≠ 0), and the formula kern uses holds only for such sections",
            ),
            McrRefusal::ShearCentreOff => f.write_str(
                "the shear centre is off the vertical axis through the \
centroid, so the section is not symmetric about an axis parallel to y, and the formula kern \
uses holds only for such sections",
            ),
            McrRefusal::NoTorsionResults => f.write_str("no torsion results"),
            McrRefusal::NoFiniteValue => {
                f.write_str("J and Cw are both zero, or a value is not finite")
            }
        }
    }
}
