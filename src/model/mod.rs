//! The section document and the values it is made of.
//!
//! [`document`] holds a section file as written (numbers and expressions with the
//! place in the file each came from); what it asks of the member is in [`loads`];
//! evaluating it into numbers and placing its parts is the next layer's job
//! ([`crate::geom::resolve`]). Reading TOML is not
//! here but in [`crate::file`]; the expression language is [`expr`], units are
//! [`units`]; the shapes and their keys are [`schema`].

pub mod anchor;
pub mod diag;
pub mod document;
pub mod expr;
pub mod loads;
pub mod schema;
pub mod units;
pub mod warning;

pub use anchor::Anchor;
pub use diag::{Diagnostic, Span};
pub use document::{
    ActionsDoc, Document, LimitsDoc, MaterialDoc, MemberDoc, PartDoc, PointDoc, StringMaps, Val,
    Value,
};
pub use loads::{Actions, Support};
pub use schema::{Dims, ShapeKind};
pub use warning::Warning;
