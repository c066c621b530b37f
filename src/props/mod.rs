//! props
