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
        None => match too_deep(text) {
            // The `kdl` crate's parser recurses once per nesting level and
            // overflows the stack on very deep input; refuse it here.
            Some(offset) => Err(KdlError {
                input: std::sync::Arc::new(text.to_string()),
                diagnostics: vec![kdl::KdlDiagnostic {
                    input: std::sync::Arc::new(text.to_string()),
                    span: miette::SourceSpan::new(offset.into(), 1),
                    message: Some(format!(
                        "child blocks are nested more than {MAX_FALLBACK_DEPTH} levels deep"
                    )),
                    label: Some("too deep".to_string()),
                    help: Some(
                        "a job file nests a few levels at most; check for a run of `{` without `}`"
                            .to_string(),
                    ),
                    severity: miette::Severity::Error,
                }],
            }),
            None => KdlDocument::parse(text),
        },
    }
}

/// The deepest nesting of `{` handed to the `kdl` crate's parser. Its
/// recursion overflows a small thread stack at about 70 levels.
pub const MAX_FALLBACK_DEPTH: usize = 48;

/// The byte offset of the first `{` that opens a block more than
/// [`MAX_FALLBACK_DEPTH`] deep, counting braces naively (strings and
/// comments included, which can only over-count).
fn too_deep(text: &str) -> Option<usize> {
    let mut depth = 0usize;
    for (i, b) in text.bytes().enumerate() {
        match b {
            b'{' => {
                depth += 1;
                if depth > MAX_FALLBACK_DEPTH {
                    return Some(i);
                }
            }
            b'}' => depth = depth.saturating_sub(1),
            _ => {}
        }
    }
    None
}

/// The fast parser alone: `None` when it declines the text (which it does
/// for every broken document and for a few rare valid forms).
pub fn parse_fast(text: &str) -> Option<KdlDocument> {
    parser::Parser::new(text).document().ok()
}

#[cfg(test)]
mod depth_tests {
    use super::*;

    #[test]
    fn very_deep_input_is_refused_without_recursing() {
        // Unclosed and closed runs of blocks, far deeper than the kdl
        // crate's parser can recurse on a test thread.
        for text in [
            "a {".repeat(5000),
            format!("{}{}", "a {".repeat(5000), "}".repeat(5000)),
        ] {
            let err = parse_document(&text).expect_err("refused");
            let d = &err.diagnostics[0];
            assert!(
                d.message
                    .as_deref()
                    .unwrap_or("")
                    .contains("nested more than")
            );
            assert_eq!(d.span.offset(), 3 * MAX_FALLBACK_DEPTH + 2); // the first `{` past the limit
        }
    }

    #[test]
    fn ordinary_nesting_still_parses() {
        let text = format!("{}{}", "a {".repeat(10), "}".repeat(10));
        assert!(parse_document(&text).is_ok());
    }
}
