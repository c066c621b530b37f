//! Warnings (and the reasons a result is not computed) as data: the numbers and the
//! names of what they are about, built by the core, worded in one place for every
//! view ([`crate::report::warnings`], which gives `Warning` its `Display`). Nothing in
//! the core formats a number for a person.

/// What a section's warning is about, with its figures.
#[derive(Debug, Clone, PartialEq)]
pub enum Warning {
    /// A part with no area once placed.
    NoArea { part: String },
    /// Two solid parts share `percent` % of the smaller one's area.
    SolidsOverlap { a: String, b: String, percent: f64 },
    /// Two voids share `percent` % of the smaller one's area.
    VoidsOverlap { a: String, b: String, percent: f64 },
    /// `percent` % of a void lies outside every solid part.
    VoidOutside { void: String, percent: f64 },
    /// `count` more of a kind than the ones listed.
    More { count: usize, kind: More },
    /// The torsion mesh kept `kept` of `corners` corners of straight-edged outlines;
    /// the rest lie within `tol` (file unit) of them.
    MeshSimplified {
        kept: usize,
        corners: usize,
        tol: f64,
    },
    /// The section is in `count` separate pieces.
    SeparatePieces { count: usize },
    /// The region torsion meshes differs in area from the signed sum of the parts by
    /// `percent` %.
    RegionArea { percent: f64 },
    /// Features `ratio` times smaller than the section: a `feature` wide in a section
    /// `span` across (file unit), below the mesh's floor `floor` (a fraction of the span).
    TinyFeature {
        ratio: f64,
        feature: f64,
        span: f64,
        floor: f64,
    },
    /// The base mesh would need more than `nodes` nodes (`corners` of them corners and
    /// graded points, the thinnest feature `1/ratio` of the `span`), over the `budget`.
    MeshBudget {
        nodes: usize,
        corners: usize,
        ratio: f64,
        span: f64,
        budget: usize,
    },
    /// Torsion was not computed, for the reason inside.
    NoTorsion(Box<Warning>),
    /// The torsion solve was cancelled (a newer one replaced it).
    Cancelled,
    /// Grading the mesh at `corners` re-entrant corners would take more than the
    /// `budget` of added nodes.
    TooManyCorners { corners: usize, budget: usize },
    /// The torsion solver failed (it panicked) on this section.
    SolverFailed,
    /// There is no enabled solid part to mesh.
    NoSolidPart,
    /// The mesher refused a point, for the `cause` it gave.
    CannotMesh { cause: String },
    /// The section's extent is not finite, so there is nothing to mesh.
    ExtentNotFinite,
    /// The section has no extent to mesh.
    NoExtent,
    /// The solid parts have no area to mesh.
    NoSolidArea,
    /// The region (solids minus voids) is empty.
    EmptyRegion,
    /// The torsion mesh has a degenerate element.
    DegenerateElement,
    /// The iterative solver did not converge on a mesh of `elements` elements.
    Stalled { elements: usize },
    /// The base mesh's direct solve would hold `entries` entries and take `flops`
    /// operations, past the budget of `max_entries` entries and `max_flops` operations.
    SolveTooLarge {
        entries: usize,
        flops: f64,
        max_entries: usize,
        max_flops: f64,
    },
    /// The estimated relative error `error` is above the tolerance `tol` on the finest
    /// mesh the budget allows.
    AboveTolerance { error: f64, tol: f64 },
    /// An error estimate needs two meshes and the next one (`elements` elements) is
    /// past the budget of `max_elements` elements, `max_nodes` nodes and `mb` MB.
    NextMeshPastBudget {
        elements: usize,
        max_elements: usize,
        max_nodes: usize,
        mb: usize,
    },
    /// The flexure (shear) solution was not computed, for the reason inside.
    NoShear(Box<Warning>),
    /// The section is in `count` separate pieces, which share no shear flow.
    ShearPieces { count: usize },
    /// Shear figures are left out: their estimated errors are above the tolerance, for
    /// the one reason `cause` (one warning a cause, the figures in the order given).
    ShearAboveTolerance {
        figures: Vec<ShearFigure>,
        cause: ShearCause,
    },
    /// More than `max_pairs` pairs of parts lie on one another: no connection looked for.
    ConnectionsNotLooked { max_pairs: usize },
    /// Parts `a` and `b` touch only at a point.
    PointContact { a: String, b: String },
    /// None of the `solids` solid parts shares a boundary with another.
    NoSharedBoundary { solids: usize },
    /// The solid `parts` share no boundary with another solid part (the others do).
    PartsAlone { parts: Vec<String> },
    /// Joints (pairs of part names) on a closed cell, whose flow needs the flexure
    /// solution, which is not there (torsion off, still solving, or failed).
    ClosedCellFlow { joints: Vec<(String, String)> },
    /// The flow across the closed-cell joint `a`–`b` from the flexure solution has an
    /// estimated relative error `error` above the tolerance `tol` (infinite when the
    /// mesh does not follow that boundary): withheld.
    CellFlowWithheld {
        a: String,
        b: String,
        error: f64,
        tol: f64,
    },
    /// The boundary parts `a` and `b` share is a closed loop (a core in a tube): the
    /// flow across it changes around the loop and has no one figure.
    LoopJointFlow { a: String, b: String },
    /// Void `void` lies in parts on both sides of the joint `a`–`b`.
    VoidAcrossJoint { void: String, a: String, b: String },
    /// Void `void` is in no solid part, so the joint `a`–`b` cannot be given its share.
    StrayVoidAtJoint { void: String, a: String, b: String },
    /// `[member] self_weight` is on but not every part has a density.
    SelfWeightNoDensity,
    /// The member check has no modulus of elasticity (no materials).
    MemberNoModulus,
    /// Material `material` (`None`: parts without one) has no fy, among materials that do.
    MaterialNoFy { material: Option<String> },
    /// Mcr was not computed, for a reason the user should hear of.
    McrNotComputed(McrRefusal),
    /// `[member] shear_deformation` is on but there is no shear area A_s,y: the flexure
    /// solution has not run (`solved: false`) or gave none within its tolerance.
    ShearDeflectionWithheld { solved: bool },
}

/// Which result of the flexure solution a warning is about.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum ShearFigure {
    /// The shear areas.
    Areas,
    /// The largest resultant shear stress.
    TauMax,
    /// The largest von Mises stress.
    VonMises,
    /// The member's largest shear stress at Vmax.
    MemberTau,
}

/// Why a shear figure did not converge.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum ShearCause {
    /// The peak is at a sharp re-entrant corner, where the elastic stress is singular, or
    /// the corners' term is what keeps its estimate above the tolerance (the same stress
    /// away from the corners is within it: `Flexure::peaks_away`).
    SharpCorner,
    /// The meshes allowed did not bring the estimate under the tolerance.
    NotSettled,
}

/// Why the elastic critical moment Mcr is not computed.
#[derive(Debug, Clone, PartialEq)]
pub enum McrRefusal {
    /// There is no `[member]`.
    NoMember,
    /// The support is not a simple span.
    NotSimpleSpan,
    /// The load is applied at the top (`top`) or bottom flange, not the shear centre.
    LoadHeight { top: bool },
    /// No material gives a modulus of elasticity.
    NoModulus,
    /// Torsion was not asked for.
    NoTorsion,
    /// Torsion could not be computed.
    TorsionFailed,
    /// The section is in `count` separate pieces.
    SeparatePieces { count: usize },
    /// Ixy ≠ 0: not symmetric about an axis parallel to y.
    Asymmetric,
    /// The shear centre is off the vertical axis through the centroid.
    ShearCentreOff,
    /// The torsion results are missing (no βx).
    NoTorsionResults,
    /// J and Cw are both zero, or a value is not finite.
    NoFiniteValue,
}

impl McrRefusal {
    /// Whether the user should hear of it in the warnings (not for what simply was
    /// not asked, like torsion skipped).
    pub fn warns(&self) -> bool {
        matches!(
            self,
            McrRefusal::LoadHeight { .. }
                | McrRefusal::SeparatePieces { .. }
                | McrRefusal::Asymmetric
                | McrRefusal::ShearCentreOff
        )
    }
}

/// The kinds a [`Warning::More`] counts.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum More {
    PartsWithNoArea,
    Overlaps,
    VoidsOutside,
}
