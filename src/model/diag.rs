//! A problem found in a section file, tied to the place it was found.

/// A byte range in the file text.
pub type Span = std::ops::Range<usize>;

/// What is wrong (and how to fix it), and where: a byte range of the file text that
/// [`crate::file::locate`] turns into line and column.
#[derive(Debug, Clone, PartialEq)]
pub struct Diagnostic {
    pub span: Span,
    pub message: String,
}

impl Diagnostic {
    /// The message is cleaned ([`crate::text::clean`]): it quotes names and keys from
    /// the file, and must not carry their escape sequences to a terminal.
    pub fn new(span: Span, message: impl Into<String>) -> Diagnostic {
        Diagnostic {
            span,
            message: crate::text::clean(&message.into()),
        }
    }
}

impl std::fmt::Display for Diagnostic {
    fn fmt(&self, f: &mut std::fmt::Formatter<'_>) -> std::fmt::Result {
        f.write_str(&self.message)
    }
}
