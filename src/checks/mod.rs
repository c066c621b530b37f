//! Checks that put a section to work: stresses under actions, the kern, a single-span member.

pub mod kern;
pub mod ltb;
pub mod member;
pub mod stress;
