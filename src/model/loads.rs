//! What a section file asks of the member, in SI: the actions on the section and the
//! member's end conditions. The checks compute with these ([`crate::checks`]); they are
//! here, with the document, because the file names them.

/// Internal forces on the section in SI, `n` in N, `mx` and `my` in N·m (the file's
/// `[actions]`): `n` tension positive; positive `mx` compresses the fibres on the +y side;
/// positive `my` compresses the fibres on the +x side.
#[derive(Debug, Clone, Copy, Default, PartialEq)]
pub struct Actions {
    pub n: f64,
    pub mx: f64,
    pub my: f64,
    /// Shear forces along +x and +y, N, when given.
    pub vx: Option<f64>,
    pub vy: Option<f64>,
    /// Torque about the member axis through the shear centre, N·m, counter-clockwise
    /// seen from +z, when given.
    pub t: Option<f64>,
}

/// End conditions of the span.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum Support {
    /// Pinned at x = 0, on a roller at x = L.
    Simple,
    /// Fixed at x = 0, free at x = L.
    Cantilever,
    /// Fixed at both ends.
    Fixed,
    /// Propped cantilever: fixed at x = 0, simply supported at x = L.
    Propped,
}
