//! Shading the drawing by a stress under `[actions]`: the resultant shear stress
//! |τ| = √(τzx² + τzy²) (Vx, Vy, T) or the von Mises stress √(σ² + 3τ²) (with N, Mx,
//! My too), read from the flexure solution's samples (`Analysis::stress_samples`, the
//! nodes of its finest mesh). Each cell of the drawing takes the largest value of the
//! samples in it, or, with none in it, the nearest sample's when its centre is in the
//! material; four levels split the range from 0 to the peak evenly.
//!
//! A stress is shaded only when the background finite-element solve is done and its
//! peak is within the tolerance: a figure we cannot trust is not drawn as if it were
//! (then [`Why`] says what is missing). Where the peak is withheld because the stress is
//! singular at sharp re-entrant corners (every welded plate girder), the scale's top is
//! the largest value away from the corners when that is within the tolerance
//! (`ShearResult::tau_away`), and the corners are marked as singular ([`corner_glyph`]).
//! Pure: no terminal here.

use crate::analysis::Analysis;
use crate::fe::flexure::Peak;
use crate::geom::{Cover, Pt};
use crate::model::warning::{ShearCause, ShearFigure};
use crate::model::Warning;

/// What the drawing is shaded by.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Default)]
pub enum Shading {
    #[default]
    Off,
    /// The resultant shear stress.
    Tau,
    /// The von Mises stress.
    VonMises,
}

impl Shading {
    /// The next in the cycle none → |τ| → von Mises → none.
    pub fn next(self) -> Shading {
        match self {
            Shading::Off => Shading::Tau,
            Shading::Tau => Shading::VonMises,
            Shading::VonMises => Shading::Off,
        }
    }

    /// The stress's name in the legend.
    pub fn name(self) -> &'static str {
        match self {
            Shading::Off => "no shading",
            Shading::Tau => "|τ|",
            Shading::VonMises => "von Mises",
        }
    }
}

/// Why a stress is not shaded.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum Why {
    /// `[actions]` has no Vx, Vy or T.
    NoShearActions,
    /// The finite elements are not solved in this workbench (solver off or stopped).
    FeOff,
    /// The background solve is under way.
    Running,
    /// Torsion or the flexure solution failed (the warnings say why).
    Failed,
    /// The stress's peak is not within the tolerance (the warnings say why).
    Untrusted,
    /// The stress's peak is at a sharp re-entrant corner, where it is singular, and the
    /// largest value away from the corners is not within the tolerance either.
    Singular,
}

impl Why {
    /// The reason in words, after "not shaded".
    pub fn words(self) -> &'static str {
        match self {
            Why::NoShearActions => "no Vx, Vy or T in [actions]",
            Why::FeOff => "the finite-element solve is off",
            Why::Running => "the finite-element solve is running",
            Why::Failed => "no shear solution (see the warnings)",
            Why::Untrusted => "its peak is not within the tolerance (see the warnings)",
            Why::Singular => {
                "its peak is at a sharp re-entrant corner and the stress away from it is not within the tolerance (see the warnings)"
            }
        }
    }
}

/// A stress to shade: values (Pa) at the sample points and the peak.
#[derive(Debug, Clone, PartialEq)]
pub struct Field {
    pub at: Vec<Pt>,
    pub values: Vec<f64>,
    /// The top of the scale (Pa) and where it is: the analysis's own peak, or with
    /// `corners`, the largest value away from them.
    pub peak: Peak,
    /// The sharp re-entrant corners (file frame) where the stress is singular, when the
    /// scale is of the stress away from them; empty when `peak` is the section's peak.
    pub corners: Vec<Pt>,
}

impl Field {
    /// Whether the scale's top is the largest value away from singular corners.
    pub fn away(&self) -> bool {
        !self.corners.is_empty()
    }
}

/// Number of shading levels.
pub const LEVELS: usize = 4;

/// The characters of the levels, lowest first: blocks, or ASCII that no other mark of
/// the ASCII drawing uses.
pub fn glyphs(ascii: bool) -> [char; LEVELS] {
    if ascii {
        ['-', '~', '*', '%']
    } else {
        ['░', '▒', '▓', '█']
    }
}

/// The mark of the peak.
pub fn peak_glyph(ascii: bool) -> char {
    if ascii {
        'M'
    } else {
        '◆'
    }
}

/// The mark of a sharp re-entrant corner where the stress is singular.
pub fn corner_glyph(ascii: bool) -> char {
    if ascii {
        '!'
    } else {
        '∞'
    }
}

/// The level (0 to `LEVELS − 1`) of `v` on the range 0 to `max`: level k holds
/// k·max/4 ≤ v < (k + 1)·max/4, the peak in the top level.
pub fn level(v: f64, max: f64) -> usize {
    if !(max > 0.0 && v.is_finite()) {
        return 0;
    }
    ((v / max * LEVELS as f64).floor().max(0.0) as usize).min(LEVELS - 1)
}

/// The stress `s` of the analysis to shade with, or why not. `solving` is whether the
/// background solve of the current text is under way.
pub fn field(a: &Analysis, s: Shading, solving: bool) -> Option<Result<Field, Why>> {
    if s == Shading::Off {
        return None;
    }
    let shear_actions = a
        .section
        .actions
        .is_some_and(|x| x.vx.is_some() || x.vy.is_some() || x.t.is_some());
    if !shear_actions {
        return Some(Err(Why::NoShearActions));
    }
    if solving {
        return Some(Err(Why::Running));
    }
    let (Some(shear), Some(samples)) = (&a.shear, a.stress_samples()) else {
        return Some(Err(match a.torsion {
            None => Why::FeOff,
            Some(_) => Why::Failed,
        }));
    };
    let (peak, away, values, figure) = match s {
        Shading::Tau => (
            shear.tau_max,
            shear.tau_away,
            samples.tau,
            ShearFigure::TauMax,
        ),
        _ => (
            shear.von_mises_max,
            shear.von_mises_away,
            samples.von_mises,
            ShearFigure::VonMises,
        ),
    };
    let singular = a.warnings.iter().any(|w| {
        matches!(w, Warning::ShearAboveTolerance { figures, cause: ShearCause::SharpCorner }
            if figures.contains(&figure))
    });
    let corners = || -> Vec<Pt> {
        (a.flexure().into_iter())
            .flat_map(|f| f.corners().iter().map(|c| c.at))
            .collect()
    };
    Some(match (peak, away, values) {
        (Some(peak), _, Some(values)) => Ok(Field {
            at: samples.at,
            values,
            peak,
            corners: Vec::new(),
        }),
        (None, Some(peak), Some(values)) if singular => Ok(Field {
            at: samples.at,
            values,
            peak,
            corners: corners(),
        }),
        _ if singular => Err(Why::Singular),
        _ => Err(Why::Untrusted),
    })
}

/// The message line's words for shading `s` of `a`: what the drawing is shaded by, or
/// why not.
pub fn status(a: &Analysis, s: Shading, solving: bool) -> String {
    match field(a, s, solving) {
        None => "drawing not shaded".to_string(),
        Some(Ok(f)) if f.away() => format!(
            "shaded by {} away from the sharp corners (singular at the marked ones)",
            s.name(),
        ),
        Some(Ok(_)) => format!("drawing shaded by {}", s.name()),
        Some(Err(why)) => format!("{} not shaded: {}", s.name(), why.words()),
    }
}

/// The value of each cell of a `w × h` grid, row by row: that of the sample nearest
/// the cell's centre (`centre`), for a cell whose centre is in the material `cover` or
/// that holds a sample (`cell_of` gives a point's cell, `None` off the grid; a part
/// thinner than a cell still shows); `None` elsewhere. The search looks in rings of
/// cells about the cell, so each costs about the samples of a few cells.
pub fn cells(
    f: &Field,
    w: usize,
    h: usize,
    cell_of: impl Fn(Pt) -> Option<(usize, usize)>,
    centre: impl Fn(usize, usize) -> Pt,
    cover: &Cover,
) -> Vec<Option<f64>> {
    let mut bins: Vec<Vec<usize>> = vec![Vec::new(); w * h];
    for (i, p) in f.at.iter().enumerate() {
        if let Some((cx, cy)) = cell_of(*p).filter(|&(x, y)| x < w && y < h) {
            bins[cy * w + cx].push(i);
        }
    }
    let mut out: Vec<Option<f64>> = vec![None; w * h];
    for cy in 0..h {
        for cx in 0..w {
            let c = centre(cx, cy);
            if bins[cy * w + cx].is_empty() && !cover.contains(c) {
                continue;
            }
            out[cy * w + cx] = nearest(f, &bins, (w, h), (cx, cy), c);
        }
    }
    out
}

/// The value of the sample nearest `c`, searched in rings of cells about `(cx, cy)`:
/// once a ring holds one, the next ring is looked at too (a nearer sample can lie one
/// ring out), then the search stops.
fn nearest(
    f: &Field,
    bins: &[Vec<usize>],
    (w, h): (usize, usize),
    (cx, cy): (usize, usize),
    c: Pt,
) -> Option<f64> {
    let mut best: Option<(f64, usize)> = None;
    let mut last = w.max(h);
    let mut k = 0;
    while k <= last {
        let (x0, x1) = (cx.saturating_sub(k), (cx + k).min(w - 1));
        let (y0, y1) = (cy.saturating_sub(k), (cy + k).min(h - 1));
        for y in y0..=y1 {
            for x in x0..=x1 {
                let ring = x.abs_diff(cx).max(y.abs_diff(cy));
                if ring != k {
                    continue;
                }
                for &i in &bins[y * w + x] {
                    let d = f.at[i].dist(c);
                    if best.is_none_or(|(bd, _)| d < bd) {
                        best = Some((d, i));
                    }
                }
            }
        }
        if best.is_some() && last > k + 1 {
            last = k + 1;
        }
        k += 1;
    }
    best.map(|(_, i)| f.values[i])
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::analysis::Options;
    use crate::fe::TorsionOptions;

    /// A 60 × 120 mm bar (ν = 0) under `actions`, solved with the flexure solution.
    fn bar(actions: &str) -> Analysis {
        let text = format!(
            "format = 1\nunits = \"mm\"\n[[materials]]\nname = \"steel\"\nE = \"200 GPa\"\n\
             nu = 0\n[[parts]]\nname = \"bar\"\nshape = \"rect\"\nb = 60\nh = 120\n\
             [actions]\n{actions}\n"
        );
        let opts = Options {
            torsion: Some(TorsionOptions::default()),
            ..Options::default()
        };
        crate::file::load::analyse(&text, &opts).expect("valid")
    }

    /// One column of 12 cells down the bar's middle, from y = 60 to −60: each cell's
    /// value and its level.
    fn column(f: &Field, a: &Analysis) -> Vec<(f64, usize)> {
        let h = 12;
        let row_of = |y: f64| ((60.0 - y) / 10.0).floor();
        let cell_of = |p: Pt| {
            let r = row_of(p.y);
            (p.x.abs() < 30.0 && (0.0..h as f64).contains(&r)).then_some((0, r as usize))
        };
        let centre = |_: usize, cy: usize| Pt::new(0.0, 55.0 - 10.0 * cy as f64);
        let cover = Cover::new(&a.pieces, 0.1);
        (cells(f, 1, h, cell_of, centre, &cover).into_iter())
            .map(|v| v.expect("every cell is in the bar"))
            .map(|v| (v, level(v, f.peak.value)))
            .collect()
    }

    #[test]
    fn a_bar_under_vy_is_shaded_highest_at_the_neutral_axis_and_lowest_at_its_fibres() {
        // τ = (3V/2A)(1 − 4y²/h²): 1.5·V/A on the neutral axis, 0 at the top and bottom
        // fibres (Timoshenko & Goodier, Theory of Elasticity, §124; exact for ν = 0).
        let a = bar("Vy = \"36 kN\"");
        let f = field(&a, Shading::Tau, false)
            .expect("asked for")
            .expect("trusted");
        let peak = 1.5 * 36e3 / (60.0 * 120.0) * 1e6; // Pa
        assert!((f.peak.value - peak).abs() < 1e-3 * peak, "{:?}", f.peak);
        // The value nearest each fibre is τ = 0 there, the lowest level.
        let near = |y: f64| {
            let i = (0..f.at.len())
                .min_by(|&i, &j| {
                    let d = |k: usize| f.at[k].dist(Pt::new(0.0, y));
                    d(i).total_cmp(&d(j))
                })
                .expect("samples");
            f.values[i]
        };
        for y in [60.0, -60.0] {
            assert!(near(y).abs() < 1e-3 * peak, "τ({y}) = {}", near(y));
            assert_eq!(level(near(y), f.peak.value), 0);
        }
        assert!((near(0.0) - peak).abs() < 1e-3 * peak);
        assert_eq!(level(near(0.0), f.peak.value), LEVELS - 1);
        // Cells 10 mm tall: the top and bottom ones (centres y = ±55, τ = 0.16·τmax)
        // are the lowest level, the two at the axis (y = ±5, 0.99·τmax) the highest,
        // and the levels never fall towards the axis.
        let col = column(&f, &a);
        assert_eq!(col[0].1, 0);
        assert_eq!(col[11].1, 0);
        assert_eq!((col[5].1, col[6].1), (LEVELS - 1, LEVELS - 1));
        for k in 0..5 {
            assert!(
                col[k].1 <= col[k + 1].1 && col[11 - k].1 <= col[10 - k].1,
                "{col:?}"
            );
        }
    }

    #[test]
    fn von_mises_under_bending_alone_is_the_bending_stress_at_the_extreme_fibres() {
        // With no shear (Vy = 0), τ = 0 and √(σ² + 3τ²) = |σ|; at the extreme fibres
        // |σ| = M·c/I = 4e6·60/(60·120³/12) = 27.78 MPa (Navier).
        let a = bar("Vy = \"0 kN\"\nMx = \"4 kN*m\"");
        let f = field(&a, Shading::VonMises, false)
            .expect("asked for")
            .expect("trusted");
        let sigma = 4e6 * 60.0 / (60.0 * 120f64.powi(3) / 12.0) * 1e6; // Pa
        assert!((f.peak.value - sigma).abs() < 1e-9 * sigma, "{:?}", f.peak);
        assert!((f.peak.at.y.abs() - 60.0).abs() < 1e-9, "{:?}", f.peak.at);
        let field = a.stress.as_ref().expect("stresses").field;
        for (p, v) in f.at.iter().zip(&f.values) {
            let s = field.at(p.x, p.y).abs();
            assert!((v - s).abs() <= 1e-9 * sigma, "{p:?}: {v} vs |σ| {s}");
        }
        let col = column(&f, &a);
        assert_eq!((col[0].1, col[11].1), (LEVELS - 1, LEVELS - 1));
    }

    #[test]
    fn the_cycle_and_the_levels() {
        let s = Shading::Off;
        assert_eq!(s.next(), Shading::Tau);
        assert_eq!(s.next().next(), Shading::VonMises);
        assert_eq!(s.next().next().next(), Shading::Off);
        assert_eq!(
            [0.0, 0.24, 0.25, 0.5, 0.99, 1.0, f64::NAN].map(|v| level(v, 1.0)),
            [0, 0, 1, 2, 3, 3, 0]
        );
        assert_eq!(level(1.0, 0.0), 0);
    }
}
