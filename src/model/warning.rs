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
    /// A warning already in words (it carries no figure a view would format).
    Note(String),
}

/// The kinds a [`Warning::More`] counts.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum More {
    PartsWithNoArea,
    Overlaps,
    VoidsOutside,
}

impl From<String> for Warning {
    fn from(s: String) -> Warning {
        Warning::Note(s)
    }
}

impl From<&str> for Warning {
    fn from(s: &str) -> Warning {
        Warning::Note(s.to_string())
    }
}
