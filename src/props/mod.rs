//! Section properties by the composite-area method: additive area moments of every
//! part (exact over straight edges and circular arcs), summed with signs and modular
//! ratios, then carried to the centroid and to principal axes; elastic and plastic
//! moduli; radii of gyration; and the warnings a composite deserves (overlaps, stray
//! voids). Torsion is not here: see [`crate::fe`].

pub mod cubic;
pub mod overlap;
pub mod plastic;
pub mod principal;
pub mod section;

pub use crate::geom::moments::{Centroidal, Moments};
pub use principal::Principal;
pub use section::{Elastic, Gyration, Plastic, Properties};
