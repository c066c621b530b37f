//! The section document and the values it is made of.
//!
//! [`document`] holds a section file as written (numbers and expressions with the
//! place in the file each came from); [`resolve`] evaluates it into numbers
//! ([`Resolved`]) and places its parts ([`Resolved::pieces`]). Reading TOML is not
//! here but in [`crate::file`]; the expression language is [`expr`], units are
//! [`units`].

pub mod diag;
pub mod document;
pub mod expr;
pub mod resolve;
pub mod units;

pub use diag::{Diagnostic, Span};
pub use document::{ActionsDoc, Document, MaterialDoc, MemberDoc, PartDoc, PointDoc, Val, Value};
pub use resolve::{Actions, LoadHeight, Material, Member, Part, Resolved, ShearModulus};
