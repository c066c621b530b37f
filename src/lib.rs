//! kern — section properties and checks for beam and column cross-sections.
//!
//! Data flows one way: file text → [`model`] document → resolved section
//! (every expression evaluated) → [`geom`] boundaries → [`props`] properties,
//! [`fe`] torsion and [`checks`] → views ([`report`], [`tui`]).
//!
//! The core (`model`, `geom`, `props`, `fe`, `checks`) does no terminal or file I/O.

pub mod checks;
pub mod fe;
pub mod geom;
pub mod model;
pub mod numfmt;
pub mod props;
