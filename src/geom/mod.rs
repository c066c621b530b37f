//! Geometry: shapes turned into closed boundaries of straight segments and circular arcs.
//!
//! A [`Contour`] is a closed loop; counter-clockwise loops enclose material, clockwise
//! loops are holes (the inside of a pipe or a box). Arcs are kept exact — nothing here
//! approximates a curve by facets except [`Contour::facets`], which the mesher and the
//! drawing use. The area integrals over these boundaries are in [`moments`] (with
//! [`trig`]); placing a part (anchor, flip, rotate) is in [`place`]; a document
//! evaluated into numbers and its parts placed ([`Resolved`]) is in [`resolve`].

pub mod contour;
pub mod corner;
pub mod joints;
pub mod meet;
pub mod moments;
pub mod place;
pub mod region;
pub mod resolve;
pub mod shapes;
pub mod simple;
pub mod trig;

pub use contour::{Contour, Pt, Seg, Turn};
pub use moments::BoundaryIntegral;
pub use place::{Anchor, Placement};
pub use region::{solid_bounds, Cover, Piece};
pub use resolve::{
    LoadHeight, Material, Member, Part, Resolution, Resolved, ShearModulus, Varying,
};
pub use shapes::Shape;
