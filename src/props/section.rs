//! All section properties of a composite, from its placed pieces.
//!
//! Moments are taken about a reference point at the middle of the section's extent,
//! not the file origin, so a section drawn far from its origin loses no digits to the
//! parallel axis theorem.

use super::cubic::of_seg_keeping;
use super::cubic::Cubic;
use super::plastic::{plastic_axis_x, plastic_axis_y, ArcEnds, Weighted};
use super::principal::Principal;
use crate::geom::contour::{union_bounds, Turn};
use crate::geom::moments::{Centroidal, Moments};
use crate::geom::BoundaryIntegral;
use crate::geom::{solid_bounds, Contour, Piece, Pt, Seg};

/// Elastic section moduli to the extreme fibres: `Ixx/(ymax − ȳ)`, `Ixx/(ȳ − ymin)`,
/// `Iyy/(x̄ − xmin)`, `Iyy/(xmax − x̄)`.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct Elastic {
    pub x_top: f64,
    pub x_bottom: f64,
    pub y_left: f64,
    pub y_right: f64,
}

/// Elastic section moduli about the principal axes, to the extreme fibres in the
/// principal frame. With the centroid as origin, `u` along axis 1 (at θ from +x) and
/// `v` along axis 2 (at θ + 90°), bending about axis 1 gives σ = M₁·v/I₁ and about axis
/// 2 σ = M₂·u/I₂ (the flexure formula in the principal frame, where the product of
/// inertia vanishes: Gere & Goodno, Mechanics of Materials, §6.5), so
/// `s1_pos = I₁/v_max`, `s1_neg = I₁/(−v_min)`, `s2_pos = I₂/u_max`, `s2_neg = I₂/(−u_min)`
/// over the solid material's outline (arcs exact).
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct PrincipalElastic {
    pub s1_pos: f64,
    pub s1_neg: f64,
    pub s2_pos: f64,
    pub s2_neg: f64,
}

impl PrincipalElastic {
    /// The moduli of the solid `pieces` (contours about the same origin as the
    /// centroid `c`) about the principal axes `p`.
    fn of(pieces: &[Piece], local: &[Vec<Contour>], c: Pt, p: &Principal) -> Option<Self> {
        let turn = Turn::degrees(-p.angle_deg);
        let back = Pt::new(-c.x, -c.y);
        let [umin, umax, vmin, vmax] = pieces
            .iter()
            .zip(local)
            .filter(|(q, _)| !q.void)
            .flat_map(|(_, cs)| cs.iter().flat_map(|k| &k.segs))
            .map(|s| s.shifted(back).moved(turn, Pt::new(0.0, 0.0)).bounds())
            .reduce(union_bounds)?;
        Some(PrincipalElastic {
            s1_pos: p.i1 / vmax,
            s1_neg: p.i1 / -vmin,
            s2_pos: p.i2 / umax,
            s2_neg: p.i2 / -umin,
        })
    }
}

/// Plastic moduli about the plastic neutral axes parallel to x (`zx`, at height `y`)
/// and parallel to y (`zy`, at `x`).
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct Plastic {
    pub zx: f64,
    pub zy: f64,
    pub y: f64,
    pub x: f64,
}

/// Radii of gyration `√(Ixx/A)`, `√(Iyy/A)`, `√(I₂/A)`.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct Gyration {
    pub x: f64,
    pub y: f64,
    pub min: f64,
}

/// Every closed-form property of a section, in the file's length unit (areas in
/// unit², second moments in unit⁴…), transformed to the reference material.
#[derive(Debug, Clone, PartialEq)]
pub struct Properties {
    pub area: f64,
    pub centroid: Pt,
    /// Extent of the solid parts `[xmin, xmax, ymin, ymax]`.
    pub bounds: [f64; 4],
    pub ixx: f64,
    pub iyy: f64,
    pub ixy: f64,
    pub principal: Principal,
    pub elastic: Elastic,
    /// About the principal axes; `None` when they are the x and y axes (θ = 0° or
    /// 90°: the moduli are those of `elastic`).
    pub principal_elastic: Option<PrincipalElastic>,
    pub plastic: Option<Plastic>,
    pub gyration: Gyration,
    /// Third moments about the centroid (`∫(x−x̄)³ dA`…), for the monosymmetry constants.
    pub cubic: Cubic,
    /// `Σ ±A·ρ` in (length unit)²·kg/m³, when every piece has a density.
    pub mass_area: Option<f64>,
}

impl Properties {
    /// Computes the properties of the pieces; the error says why there are none (no
    /// solid part, or a net area that is not positive).
    pub fn compute(pieces: &[Piece]) -> Result<Properties, String> {
        Properties::compute_with(pieces, true)
    }

    /// The properties of the pieces, with the plastic moduli and axes only when
    /// `plastic` (else `plastic` is `None`); every other figure, and every error, is
    /// that of [`Properties::compute`], bit for bit (the plastic axes are formed last,
    /// from nothing the others use, and never fail the computation).
    pub fn compute_with(pieces: &[Piece], plastic: bool) -> Result<Properties, String> {
        let b = solid_bounds(pieces)
            .ok_or("the section has no enabled solid part; add one or enable one")?;
        let origin = Pt::new(0.5 * (b[0] + b[1]), 0.5 * (b[2] + b[3]));
        let local: Vec<Vec<Contour>> = pieces
            .iter()
            .map(|p| shifted(&p.contours, origin))
            .collect();
        // Second and third moments of each piece in one pass over its arcs; the arcs'
        // ends kept for the plastic axis parallel to x.
        let mut arcs: Vec<ArcEnds> = Vec::with_capacity(if plastic {
            (local.iter().flatten().flat_map(|c| &c.segs))
                .filter(|s| matches!(s, Seg::Arc { .. }))
                .count()
        } else {
            0
        });
        let each: Vec<(Moments, Cubic)> = local
            .iter()
            .map(|c| {
                <(Moments, Cubic)>::of_contours_by(c, |s| {
                    of_seg_keeping(s, |t| {
                        if plastic {
                            arcs.push((t.ends, t.m));
                        }
                    })
                })
            })
            .collect();
        let m = pieces
            .iter()
            .zip(&each)
            .fold(Moments::default(), |s, (p, pm)| {
                s.plus(&pm.0, p.sign() * p.n)
            });
        let cubic = pieces
            .iter()
            .zip(&each)
            .fold(Cubic::default(), |s, (p, pc)| s.plus(&pc.1, p.sign() * p.n))
            .central(&m)
            .unwrap_or_default();
        let finite = [m.a, m.sx, m.sy, m.ixx, m.iyy, m.ixy]
            .iter()
            .chain(&b)
            .all(|v| v.is_finite());
        if !finite {
            return Err("the section is too large to compute with (its second moments overflow); check the dimensions and the length unit".into());
        }
        let c = m.centroidal().filter(|c| c.area > 1e-12 * (b[1] - b[0]) * (b[3] - b[2])).ok_or_else(|| {
            if pieces.iter().any(|p| p.void) {
                format!("the net area of the section is not positive ({:.6e}); voids remove all the solid material", m.a)
            } else {
                "the parts have no area at this scale (too small, or too far from the origin for their size); use a smaller length unit or move them nearer the origin".to_string()
            }
        })?;
        let Centroidal {
            area,
            cx,
            cy,
            ixx,
            iyy,
            mut ixy,
        } = c;
        // A section of positive area has positive second moments; where they come out as
        // zero or subnormal, double precision has lost them, and zero would be printed.
        if !(ixx.is_normal() && iyy.is_normal()) {
            return Err("the section is too small to compute with (its second moments underflow to zero); check the dimensions and the length unit".into());
        }
        // Rounding leaves about 1e-16 of the moments in Ixy of a symmetric section.
        if ixy.abs() <= 1e-13 * (ixx * iyy).abs().sqrt() {
            ixy = 0.0;
        }
        let principal = Principal::new(ixx, iyy, ixy);
        let lb = [
            b[0] - origin.x,
            b[1] - origin.x,
            b[2] - origin.y,
            b[3] - origin.y,
        ];
        let elastic = Elastic {
            x_top: ixx / (lb[3] - cy),
            x_bottom: ixx / (cy - lb[2]),
            y_left: iyy / (cx - lb[0]),
            y_right: iyy / (lb[1] - cx),
        };
        let principal_elastic = (principal.angle_deg != 0.0 && principal.angle_deg != 90.0)
            .then(|| PrincipalElastic::of(pieces, &local, Pt::new(cx, cy), &principal))
            .flatten();
        let size = (b[1] - b[0]).max(b[3] - b[2]);
        let plastic = if plastic {
            plastic_moduli(pieces, &local, &arcs, lb, origin, size)
        } else {
            None
        };
        let mass_area = pieces
            .iter()
            .zip(&each)
            .map(|(p, pm)| p.density.map(|rho| p.sign() * rho * pm.0.a))
            .sum::<Option<f64>>();
        Ok(Properties {
            area,
            centroid: Pt::new(snap(cx + origin.x, size), snap(cy + origin.y, size)),
            bounds: b,
            ixx,
            iyy,
            ixy,
            principal,
            elastic,
            principal_elastic,
            plastic,
            gyration: Gyration {
                x: (ixx / area).sqrt(),
                y: (iyy / area).sqrt(),
                min: (principal.i2.max(0.0) / area).sqrt(),
            },
            cubic,
            mass_area,
        })
    }

    /// Centroidal values, for the checks.
    pub fn centroidal(&self) -> Centroidal {
        Centroidal {
            area: self.area,
            cx: self.centroid.x,
            cy: self.centroid.y,
            ixx: self.ixx,
            iyy: self.iyy,
            ixy: self.ixy,
        }
    }
}

/// The plastic moduli and axes of the pieces (`local`: their contours about `origin`;
/// `lb`: the solid extent about it; `size`: the larger side of the extent), `None`
/// when the weighted area is not positive (see [`super::plastic`]).
fn plastic_moduli(
    pieces: &[Piece],
    local: &[Vec<Contour>],
    arcs: &[ArcEnds],
    lb: [f64; 4],
    origin: Pt,
    size: f64,
) -> Option<Plastic> {
    let weighted: Vec<Weighted> = pieces
        .iter()
        .zip(local)
        .map(|(p, c)| Weighted {
            contours: c,
            weight: p.sign() * p.strength,
        })
        .collect();
    let px = plastic_axis_x(&weighted, arcs, lb[2], lb[3])?;
    let py = plastic_axis_y(&weighted, lb[0], lb[1])?;
    Some(Plastic {
        zx: px.z,
        zy: py.z,
        y: snap(px.level + origin.y, size),
        x: snap(py.level + origin.x, size),
    })
}

/// A coordinate within rounding noise of the origin (relative to the section's size
/// `size`) is the origin: symmetric sections centred on it report exactly 0.
pub fn snap(x: f64, size: f64) -> f64 {
    if x.abs() <= 1e-12 * size {
        0.0
    } else {
        x
    }
}

/// Contours translated so that `origin` becomes (0, 0).
pub fn shifted(cs: &[Contour], origin: Pt) -> Vec<Contour> {
    let back = Pt::new(-origin.x, -origin.y);
    cs.iter()
        .map(|c| Contour {
            segs: c.segs.iter().map(|s| s.shifted(back)).collect(),
        })
        .collect()
}
