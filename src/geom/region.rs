//! The section as placed parts ready for the property engine: each enabled part's
//! boundaries with its sign and material weights.

use super::contour::{union_bounds, Contour, Pt};
use super::simple::winding;

/// One enabled part, placed in the section frame.
#[derive(Debug, Clone, PartialEq)]
pub struct Piece {
    /// Index of the part in the document (for messages and highlighting).
    pub part: usize,
    pub name: String,
    pub contours: Vec<Contour>,
    pub void: bool,
    /// Modular ratio `n = E / E_ref` (1 when no materials are given).
    pub n: f64,
    /// Shear modulus ratio `G / G_ref` (1 when no materials are given), for torsion.
    pub g: f64,
    /// Weight for the plastic properties: `fy / fy_ref` when every material in use has
    /// a yield strength, otherwise the modular ratio.
    pub strength: f64,
    /// Density in kg/m³, when its material gives one.
    pub density: Option<f64>,
    /// Material index, if any.
    pub material: Option<usize>,
}

impl Piece {
    /// A part of the reference material (n = 1, no density), solid or void.
    pub fn plain(name: &str, contours: Vec<Contour>, void: bool) -> Piece {
        Piece {
            part: 0,
            name: name.to_string(),
            contours,
            void,
            n: 1.0,
            g: 1.0,
            strength: 1.0,
            density: None,
            material: None,
        }
    }

    /// +1 for a solid, −1 for a void.
    pub fn sign(&self) -> f64 {
        if self.void {
            -1.0
        } else {
            1.0
        }
    }

    pub fn bounds(&self) -> Option<[f64; 4]> {
        self.contours
            .iter()
            .filter_map(Contour::bounds)
            .reduce(union_bounds)
    }
}

/// The extent of the solid pieces, `[xmin, xmax, ymin, ymax]`.
pub fn solid_bounds(pieces: &[Piece]) -> Option<[f64; 4]> {
    pieces
        .iter()
        .filter(|p| !p.void)
        .filter_map(Piece::bounds)
        .reduce(union_bounds)
}

/// The material of placed pieces as polygons (arcs as chords no more than `facet`
/// radians apart), to tell whether a point lies in it: a point is in the material when
/// more solids than voids cover it (the signs of the composite-area method).
#[derive(Debug, Clone)]
pub struct Cover {
    loops: Vec<(f64, Vec<Vec<Pt>>)>,
}

impl Cover {
    pub fn new(pieces: &[Piece], facet: f64) -> Cover {
        Cover {
            loops: (pieces.iter())
                .map(|q| {
                    (
                        q.sign(),
                        q.contours.iter().map(|c| c.facets(facet)).collect(),
                    )
                })
                .collect(),
        }
    }

    /// Is `p` in the material?
    pub fn contains(&self, p: Pt) -> bool {
        let cover: f64 = (self.loops.iter())
            .filter(|(_, l)| winding(l, p) != 0)
            .map(|(s, _)| s)
            .sum();
        cover > 0.5
    }
}
