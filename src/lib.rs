//! kern — section properties and checks for beam and column cross-sections.
//!
//! Data flows one way: file text → [`model`] document → resolved section
//! (every expression evaluated) → [`geom`] boundaries → [`props`] properties,
//! [`fe`] torsion and [`checks`] → views ([`report`], [`tui`]).
//!
//! The core (`model`, `geom`, `props`, `fe`, `checks`) does no terminal or file I/O.
//! Each module names only modules below it (DEVELOPERS.md, "Layers"; kept by
//! `tests/layers.rs`): model < geom < props < fe < checks < analysis < file < numfmt
//! < report < iterate < tui, cli, with `text`, `parallel`, `blocks` and `heap` leaves for
//! all.

pub mod analysis;
pub mod blocks;
pub mod checks;
pub mod cli;
pub mod fe;
pub mod file;
pub mod geom;
pub mod heap;
pub mod iterate;
pub mod model;
pub mod numfmt;
pub mod parallel;
pub mod props;
pub mod report;
pub mod text;
pub mod tui;
