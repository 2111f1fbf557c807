//! Reading KDL 2.0 text into `kdl::KdlDocument` quickly. Job files and the
//! ratings table are read on every run, and the `kdl` crate's own parser
//! spends most of a `check` on them; this parser builds the same document
//! (names, types, values and spans) in a fraction of the time.
//!
//! Text this parser is not certain about, including every broken
//! document, goes to the `kdl` crate's parser instead, so the result (and
//! every syntax diagnostic) is always the one that crate gives.

mod chars;
mod parser;
mod tokens;

#[cfg(test)]
mod tests;

use kdl::{KdlDocument, KdlError};

/// Parses KDL 2.0 text: the fast parser first, the `kdl` crate's parser
/// for anything the fast one declines. The result is always what
/// `KdlDocument::parse` would give, apart from formatting details.
pub fn parse_document(text: &str) -> Result<KdlDocument, KdlError> {
    match parse_fast(text) {
        Some(doc) => Ok(doc),
        None => KdlDocument::parse(text),
    }
}

/// The fast parser alone: `None` when it declines the text (which it does
/// for every broken document and for a few rare valid forms).
pub fn parse_fast(text: &str) -> Option<KdlDocument> {
    parser::Parser::new(text).document().ok()
}
