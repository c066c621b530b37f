//! Placing a shape in the section: flip in its own frame, put its anchor point at `at`,
//! then rotate about `at` (docs/format.md, "Placement").

use super::contour::{union_bounds, Contour, Pt, Turn};
use crate::geom::BoundaryIntegral;

pub use crate::model::anchor::Anchor;

/// The anchor point given the shape's bounding box and centroid.
fn anchor_point(anchor: Anchor, b: [f64; 4], centroid: Pt) -> Pt {
    let (xm, ym) = ((b[0] + b[1]) / 2.0, (b[2] + b[3]) / 2.0);
    let p = Pt::new;
    match anchor {
        Anchor::Center => p(xm, ym),
        Anchor::Centroid => centroid,
        Anchor::Origin => p(0.0, 0.0),
        Anchor::BottomLeft => p(b[0], b[2]),
        Anchor::Bottom => p(xm, b[2]),
        Anchor::BottomRight => p(b[1], b[2]),
        Anchor::Left => p(b[0], ym),
        Anchor::Right => p(b[1], ym),
        Anchor::TopLeft => p(b[0], b[3]),
        Anchor::Top => p(xm, b[3]),
        Anchor::TopRight => p(b[1], b[3]),
    }
}

/// Where and how a part sits in the section.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct Placement {
    pub at: Pt,
    pub anchor: Anchor,
    /// Degrees, counter-clockwise, about `at`.
    pub rotate: f64,
    pub flip_x: bool,
    pub flip_y: bool,
}

impl Placement {
    /// Places contours given in the shape's own frame: `p ↦ at + R(rotate)·(F(p) − anchor)`.
    /// A single mirror reverses the direction of travel, so those loops are reversed to
    /// keep outlines counter-clockwise.
    pub fn apply(&self, own: &[Contour]) -> Vec<Contour> {
        self.place(own.to_vec())
    }

    /// [`Placement::apply`] to contours the caller owns, placed where they are (no copy).
    pub fn place(&self, mut placed: Vec<Contour>) -> Vec<Contour> {
        if self.flip_x || self.flip_y {
            for c in &mut placed {
                for s in &mut c.segs {
                    *s = s.mirrored(self.flip_x, self.flip_y);
                }
                if self.flip_x != self.flip_y {
                    *c = c.reversed();
                }
            }
        }
        // The origin and the centroid need no bounding box (an arc's ends cost a sine
        // and cosine each).
        let bounds = if matches!(self.anchor, Anchor::Origin | Anchor::Centroid) {
            [0.0; 4]
        } else {
            placed
                .iter()
                .filter_map(Contour::bounds)
                .reduce(union_bounds)
                .unwrap_or([0.0; 4])
        };
        let centroid = if self.anchor == Anchor::Centroid {
            super::moments::Moments::of_contours(&placed)
                .centroid()
                .unwrap_or_default()
        } else {
            Pt::default()
        };
        let anchor = anchor_point(self.anchor, bounds, centroid);
        let turn = Turn::degrees(self.rotate);
        let shift = self.at.sub(turn.apply(anchor));
        for c in &mut placed {
            for s in &mut c.segs {
                *s = s.moved(turn, shift);
            }
        }
        placed
    }
}
