//! The composite-area method laid out part by part, as a calculation sheet shows it:
//! each enabled part's weighted area, its centroid, its own centroidal second moments
//! and its transfer term `A·d²` to the section's centroid. Summed, the terms give the
//! section's second moments by the parallel axis theorem,
//! `I = Σ (I_own + A·d²)` (Gere & Goodno, Mechanics of Materials, §12.5).
//!
//! Values are in the file's length unit; this is a breakdown of results that
//! [`crate::props`] has already computed, for people to follow the arithmetic.

use crate::analysis::Analysis;
use crate::geom::BoundaryIntegral;
use crate::props::Moments;

/// One part's line of the table. `a`, `ixx_own` and `iyy_own` carry the part's weight
/// `w = ±n` (−1 for a void, times the modular ratio `n`), so that every column adds up.
#[derive(Debug, Clone, PartialEq)]
pub struct Term {
    pub name: String,
    pub void: bool,
    /// Modular ratio `n = E/E_ref`.
    pub n: f64,
    /// `w·A_i`.
    pub a: f64,
    /// The part's own centroid.
    pub x: f64,
    pub y: f64,
    /// `w·∫(y − y_i)² dA` and `w·∫(x − x_i)² dA` over the part.
    pub ixx_own: f64,
    pub iyy_own: f64,
    /// `y_i − ȳ` and `x_i − x̄`.
    pub dy: f64,
    pub dx: f64,
}

impl Term {
    /// `A·dy²`, the transfer term for `Ixx`.
    pub fn a_dy2(&self) -> f64 {
        self.a * self.dy * self.dy
    }
    /// `A·dx²`, the transfer term for `Iyy`.
    pub fn a_dx2(&self) -> f64 {
        self.a * self.dx * self.dx
    }
}

/// Column sums of the table.
#[derive(Debug, Clone, Copy, PartialEq, Default)]
pub struct Totals {
    pub a: f64,
    /// `Σ A·x_i` and `Σ A·y_i` (first moments about the file's axes).
    pub ax: f64,
    pub ay: f64,
    pub ixx_own: f64,
    pub iyy_own: f64,
    pub a_dy2: f64,
    pub a_dx2: f64,
}

impl Totals {
    /// `Σ I_xx,own + Σ A·dy²`: the section's `Ixx` by the parallel axis theorem.
    pub fn ixx(&self) -> f64 {
        self.ixx_own + self.a_dy2
    }
    /// `Σ I_yy,own + Σ A·dx²`: the section's `Iyy`.
    pub fn iyy(&self) -> f64 {
        self.iyy_own + self.a_dx2
    }
}

/// Relative to the section's extent, the size below which a length in the table is
/// floating-point residue: the moments are exact to about 1e-12, FORMAT.md promises 1e-9.
pub const RESIDUE: f64 = 1e-10;

/// The terms of every enabled part with a positive own area, about the section's
/// centroid. A part whose area is not positive (degenerate) contributes nothing and is
/// left out. A coordinate or distance below [`RESIDUE`] of the section's extent is the
/// rounding residue of exact sums (a centred part's x_i comes out as ~1e-15) and is
/// shown as the 0 it is.
pub fn terms(a: &Analysis) -> Vec<Term> {
    let c = a.props.centroid;
    let [x0, x1, y0, y1] = a.props.bounds;
    let floor = RESIDUE * (x1 - x0).abs().max((y1 - y0).abs());
    let clean = |v: f64| if v.abs() < floor { 0.0 } else { v };
    a.pieces
        .iter()
        .filter_map(|p| {
            let own = Moments::of_contours(&p.contours).centroidal()?;
            let w = p.sign() * p.n;
            Some(Term {
                name: p.name.clone(),
                void: p.void,
                n: p.n,
                a: w * own.area,
                x: clean(own.cx),
                y: clean(own.cy),
                ixx_own: w * own.ixx,
                iyy_own: w * own.iyy,
                dy: clean(own.cy - c.y),
                dx: clean(own.cx - c.x),
            })
        })
        .collect()
}

/// The sums of the columns.
pub fn totals(terms: &[Term]) -> Totals {
    terms.iter().fold(Totals::default(), |s, t| Totals {
        a: s.a + t.a,
        ax: s.ax + t.a * t.x,
        ay: s.ay + t.a * t.y,
        ixx_own: s.ixx_own + t.ixx_own,
        iyy_own: s.iyy_own + t.iyy_own,
        a_dy2: s.a_dy2 + t.a_dy2(),
        a_dx2: s.a_dx2 + t.a_dx2(),
    })
}
