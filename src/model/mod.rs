//! The section document and the values it is made of.
//!
//! [`document`] holds a section file as written (numbers and expressions with the
//! place in the file each came from); [`resolve`] evaluates it into numbers
//! ([`Resolved`]) and places its parts ([`Resolved::pieces`]). Reading TOML is not
//! here but in [`crate::file`]; the expression language is [`expr`], units are
//! [`units`]; the shapes and their keys are [`schema`].

pub mod anchor;
pub mod diag;
pub mod document;
pub mod expr;
pub mod resolve;
pub mod schema;
pub mod units;

pub use anchor::Anchor;
pub use diag::{Diagnostic, Span};
pub use document::{
    ActionsDoc, Document, MaterialDoc, MemberDoc, PartDoc, PointDoc, StringMaps, Val, Value,
};
pub use resolve::{Actions, LoadHeight, Material, Member, Part, Resolved, ShearModulus};
pub use schema::{Dims, ShapeKind};
