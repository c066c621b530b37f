//! Checks that put a section to work: stresses under actions, the kern, a single-span
//! member, the shear flow across joints between parts.

pub mod kern;
pub mod ltb;
pub mod member;
pub mod shear_flow;
pub mod stress;
