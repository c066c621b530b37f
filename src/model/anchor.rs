//! The anchor of a part: which point of its shape is put at `at` (docs/format.md,
//! "Placement"). The names are file vocabulary; where each point lies on a placed
//! shape is worked out in [`crate::geom::place`].

/// The point of a shape that is put at `at`.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum Anchor {
    Center,
    Centroid,
    Origin,
    BottomLeft,
    Bottom,
    BottomRight,
    Left,
    Right,
    TopLeft,
    Top,
    TopRight,
}

impl Anchor {
    /// Every anchor with its name in the file.
    pub const ALL: [(Anchor, &'static str); 11] = [
        (Anchor::Center, "center"),
        (Anchor::Centroid, "centroid"),
        (Anchor::Origin, "origin"),
        (Anchor::BottomLeft, "bottom_left"),
        (Anchor::Bottom, "bottom"),
        (Anchor::BottomRight, "bottom_right"),
        (Anchor::Left, "left"),
        (Anchor::Right, "right"),
        (Anchor::TopLeft, "top_left"),
        (Anchor::Top, "top"),
        (Anchor::TopRight, "top_right"),
    ];

    pub fn parse(s: &str) -> Option<Anchor> {
        Anchor::ALL.iter().find(|a| a.1 == s).map(|a| a.0)
    }

    pub fn name(self) -> &'static str {
        Anchor::ALL
            .iter()
            .find(|a| a.0 == self)
            .map_or("center", |a| a.1)
    }
}
