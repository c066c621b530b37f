//! The section document and the values it is made of.

pub mod expr;
pub mod units;
