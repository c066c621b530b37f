//! fe
