//! Iterating a design: one param of a document changed, the section analysed again,
//! and a result read by its dotted JSON key ([`vary`]); over a range of values
//! ([`sweep`]), toward a target ([`seek`], on the pure numerics of [`roots`]), as the
//! rate of change per param ([`sensitivity`]), and two analyses side by side
//! ([`compare`]), a typed target value ([`target`]) and the verdict of `kern check`
//! ([`check`]). The workbench and the command line both call these; nothing here
//! prints or touches files.
//!
//! Layer: above `report` (the results are read through `report::rows::QUANTITIES`,
//! the one table of JSON paths and accessors), below `tui` and `cli`.

pub mod check;
pub mod compare;
pub mod roots;
pub mod seek;
pub mod sensitivity;
pub mod sweep;
pub mod target;
pub mod vary;

pub use vary::{Failure, Probe};
