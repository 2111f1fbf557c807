//! Reading KDL 2.0 text quickly. Job files and the ratings table are read
//! on every run, and the `kdl` crate's own parser spends most of a `check`
//! on them; this parser reads the same document (names, types, values and
//! spans) in a fraction of the time, into a flat [`Tree`] of its own that
//! the job decode reads directly, or, for other readers, into the `kdl`
//! crate's `KdlDocument`.
//!
//! It reads all of KDL 2.0 as the `kdl` crate reads it and declines only
//! broken text (the differential tests in `tests/kdl_differential.rs` hold
//! it to that, nesting up to [`MAX_FALLBACK_DEPTH`] included). Declined
//! text goes to the `kdl` crate's parser for its full syntax report, so
//! every syntax diagnostic is the one that crate gives; on a large file,
//! where that parser's error recovery is slow, only the first break is
//! reported.

mod chars;
mod depth;
mod parser;
mod tokens;
mod tree;

#[cfg(test)]
mod tests;

use kdl::{KdlDocument, KdlError};

pub use depth::{Depths, TooDeep, measure, too_deep};
pub use tree::{Doc, Entry, Ident, Node, Tree, Value, differs as tree_differs};

/// Parses KDL 2.0 text: the fast parser first, the `kdl` crate's parser
/// for anything the fast one declines (which is broken). The result is
/// always what `KdlDocument::parse` would give, apart from formatting
/// details, and for a broken text over [`MAX_FALLBACK_SIZE`] its first
/// error only.
pub fn parse_document(text: &str) -> Result<KdlDocument, KdlError> {
    match parse_fast(text) {
        Some(doc) => Ok(doc),
        None => parse_declined(text),
    }
}

/// [`parse_document`] for a reader that looks only at names, types, values
/// and spans (a job file's or shop profile's decode): the fast parser's own
/// [`Tree`], with no `KdlDocument` built. Text the fast parser declines is
/// parsed as by [`parse_document`]; a valid one becomes a tree holding its
/// own copies of the names and text.
pub fn parse_tree(text: &str) -> Result<Tree<'_>, KdlError> {
    match fast_tree(text) {
        Some(tree) => Ok(tree),
        None => parse_declined(text).map(|doc| Tree::from_document(&doc)),
    }
}

/// The fast parser's tree alone: `None` when it declines the text.
pub fn fast_tree(text: &str) -> Option<Tree<'_>> {
    parser::Parser::new(text).document().ok()
}

/// What [`parse_document`] gives for a text the fast parser declined.
fn parse_declined(text: &str) -> Result<KdlDocument, KdlError> {
    match measure(text) {
        // The `kdl` crate's parser recurses once per nesting level (of
        // blocks, of `/* */` comments, of `/-` comments in a row) and
        // overflows the stack on very deep input; refuse it here.
        Depths {
            too_deep: Some(deep),
            ..
        } => Err(KdlError {
            input: std::sync::Arc::new(text.to_string()),
            diagnostics: vec![kdl::KdlDiagnostic {
                input: std::sync::Arc::new(text.to_string()),
                span: deep_span(text, deep.offset),
                message: Some(deep.kind.message()),
                label: Some("too deep".to_string()),
                help: Some(deep.kind.help().to_string()),
                severity: miette::Severity::Error,
            }],
        }),
        // Its error recovery takes several times as long for each
        // further level of blocks (more still for `/-` blocks), and
        // falls over on a large broken text: only the first error,
        // found in linear time.
        Depths {
            dashed_blocks,
            blocks,
            ..
        } if dashed_blocks > MAX_FALLBACK_DASHED_BLOCKS || blocks > MAX_FALLBACK_BLOCKS => {
            Err(first_break(text, FirstBreakWhy::Nesting))
        }
        _ if text.len() > MAX_FALLBACK_SIZE => Err(first_break(text, FirstBreakWhy::Size)),
        _ => KdlDocument::parse(text),
    }
}

/// The span marking where nesting went too deep: the two characters from
/// `offset` (`/*`, `/-`, `{{`), never splitting a character, whatever
/// follows (a `{` may be followed by a letter of any script).
fn deep_span(text: &str, offset: usize) -> miette::SourceSpan {
    let mut at = offset.min(text.len());
    while !text.is_char_boundary(at) {
        at -= 1;
    }
    let len: usize = text[at..].chars().take(2).map(char::len_utf8).sum();
    miette::SourceSpan::new(at.into(), len)
}

/// The largest broken text handed to the `kdl` crate's parser for its full
/// syntax report. On garbage that parser's error recovery costs far more
/// than linear time (a 1 MB file of `x=1 ` took over a minute), while a job
/// file is a few kilobytes; past this size only the first place the text
/// stops being KDL is reported, found by the fast parser in linear time.
/// Only broken text is affected: the fast parser reads every valid text
/// that passes [`too_deep`], whatever its size.
pub const MAX_FALLBACK_SIZE: usize = 16 * 1024;

/// The deepest nesting of blocks, and of children blocks commented out with
/// `/-`, in a broken text handed to the `kdl` crate's parser for its full
/// syntax report. On some broken texts its error recovery takes two to
/// four times as long for each further level (`a; /-1 /-{` nested 9 deep
/// took 140 s in an optimised build, `a /- {` 10 deep 5 s unoptimised; the
/// 48 levels of blocks otherwise allowed would never end). Past these the
/// first place the text stops being KDL is reported, as for a large text.
/// The demo jobs nest blocks 4 deep at most.
pub const MAX_FALLBACK_BLOCKS: usize = 6;
/// See [`MAX_FALLBACK_BLOCKS`].
pub const MAX_FALLBACK_DASHED_BLOCKS: usize = 2;

/// Why only the first syntax error is reported.
#[derive(Debug, Clone, Copy)]
enum FirstBreakWhy {
    /// The text is over [`MAX_FALLBACK_SIZE`].
    Size,
    /// Blocks nest over [`MAX_FALLBACK_BLOCKS`] deep, or `/-` blocks over
    /// [`MAX_FALLBACK_DASHED_BLOCKS`].
    Nesting,
}

/// One syntax error where the fast parser had to stop reading `text`.
fn first_break(text: &str, why: FirstBreakWhy) -> KdlError {
    let mut parser = parser::Parser::new(text);
    let _ = parser.document();
    let mut at = parser.pos.min(text.len());
    while !text.is_char_boundary(at) {
        at -= 1;
    }
    let len = text[at..].chars().next().map_or(0, char::len_utf8);
    let input = std::sync::Arc::new(text.to_string());
    KdlError {
        input: input.clone(),
        diagnostics: vec![kdl::KdlDiagnostic {
            input,
            span: miette::SourceSpan::new(at.into(), len),
            message: Some("the text stops being KDL here".to_string()),
            label: Some("cannot be read from here".to_string()),
            help: Some(match why {
                FirstBreakWhy::Size => format!(
                    "the file is larger than {} KiB, so only its first syntax error is reported; \
                     fix it and run again",
                    MAX_FALLBACK_SIZE / 1024
                ),
                FirstBreakWhy::Nesting => format!(
                    "blocks nest more than {MAX_FALLBACK_BLOCKS} deep (or blocks commented out \
                     with `/-` more than {MAX_FALLBACK_DASHED_BLOCKS}), so only the first syntax \
                     error is reported; fix it and run again"
                ),
            }),
            severity: miette::Severity::Error,
        }],
    }
}

/// The deepest nesting handed to the `kdl` crate's parser, of each kind
/// (measured by [`too_deep`]). Its recursion overflows a 2 MB test
/// thread's stack at about 70 levels of blocks; comments cost less per
/// level. Kinds together (blocks, each under a `/-`, with a run of `/-`
/// inside) can pass that on a 2 MB thread, though not on the main
/// thread's 8 MB, where the program reads its files.
pub const MAX_FALLBACK_DEPTH: usize = 48;

/// Which kind of nesting went too deep.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum Nesting {
    /// `{` child blocks.
    Blocks,
    /// `/* /* … */ */` comments inside comments.
    Comments,
    /// `/-` comments one after another, each commenting out the next.
    Slashdash,
}

impl Nesting {
    fn message(self) -> String {
        match self {
            Nesting::Blocks => {
                format!("child blocks are nested more than {MAX_FALLBACK_DEPTH} levels deep")
            }
            Nesting::Comments => {
                format!("`/*` comments are nested more than {MAX_FALLBACK_DEPTH} levels deep")
            }
            Nesting::Slashdash => {
                format!("more than {MAX_FALLBACK_DEPTH} `/-` comments follow one another")
            }
        }
    }

    fn help(self) -> &'static str {
        match self {
            Nesting::Blocks => {
                "a job file nests a few levels at most; check for a run of `{` without `}`"
            }
            Nesting::Comments => {
                "each `/*` needs its `*/`, and a comment inside a comment needs its own; check for a run of `/*`"
            }
            Nesting::Slashdash => {
                "one `/-` comments out the node or value after it; remove the extra ones"
            }
        }
    }
}

/// A syntax diagnostic's span made to point where the trouble is. The
/// `kdl` crate reports some errors (a property with no value at the end of
/// a line, `chart=`) with a span from the start of the document to the
/// place it gave up, which would be shown at 1:1; such a span is narrowed
/// to its last character. Other spans are kept.
pub fn narrow_span(text: &str, span: miette::SourceSpan) -> miette::SourceSpan {
    let end = (span.offset() + span.len()).min(text.len());
    if span.offset() != 0 || !text[..end].contains('\n') {
        return span;
    }
    let body = text[..end].trim_end();
    match body.char_indices().next_back() {
        Some((at, c)) => miette::SourceSpan::new(at.into(), c.len_utf8()),
        None => span,
    }
}

/// The fast parser alone: `None` when it declines the text (which it does
/// for every broken document and for a few rare valid forms).
pub fn parse_fast(text: &str) -> Option<KdlDocument> {
    fast_tree(text).map(|tree| tree.to_document(true))
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
    fn deep_comments_of_every_kind_are_refused_where_they_go_too_deep() {
        let limit = MAX_FALLBACK_DEPTH;
        let cases = [
            // Unclosed `/*`, closed ones with a syntax error after them,
            // and a run of `/-` each commenting out the next.
            ("/*".repeat(3000), Nesting::Comments, 2 * limit),
            (
                format!("{}{}\nnode {{\n", "/*".repeat(3000), "*/".repeat(3000)),
                Nesting::Comments,
                2 * limit,
            ),
            (
                format!("{}node\n", "/- ".repeat(2100)),
                Nesting::Slashdash,
                3 * limit,
            ),
            (
                format!("a {}\n", "/-\n".repeat(3000)),
                Nesting::Slashdash,
                2 + 3 * limit,
            ),
            // A stray `*/` outside any comment is text, so each `*/*` after
            // it opens a comment (found by the long fuzz run).
            (
                format!("x {}", "*/".repeat(3000)),
                Nesting::Comments,
                3 + 2 * limit,
            ),
        ];
        for (text, kind, offset) in cases {
            let err = parse_document(&text).expect_err("refused");
            let d = &err.diagnostics[0];
            assert_eq!(d.span.offset(), offset, "{kind:?}");
            assert_eq!(too_deep(&text), Some(TooDeep { offset, kind }));
        }
    }

    #[test]
    fn nesting_up_to_the_limit_reaches_the_kdl_crate_without_overflowing() {
        // On a test thread's 2 MB stack, which is smaller than the main
        // thread's 8 MB: each kind at the limit, in a broken document so
        // the fast parser declines it and the kdl crate's parser runs.
        let limit = MAX_FALLBACK_DEPTH;
        for text in [
            format!("{}{}\nnode {{\n", "/*".repeat(limit), "*/".repeat(limit)),
            format!("{}node\n{{", "/- ".repeat(limit)),
            format!("{}{}(", "a {".repeat(limit), "}".repeat(limit)),
        ] {
            assert_eq!(too_deep(&text), None);
            assert!(parse_document(&text).is_err());
        }
    }

    #[test]
    fn a_span_from_the_start_of_the_document_is_narrowed_to_its_end() {
        let text = "a 1\nnode B+2 chart=\nb 2\n";
        let e = KdlDocument::parse(text).expect_err("no value");
        let span = narrow_span(text, e.diagnostics[0].span);
        assert_eq!(span.offset(), text.find('=').unwrap());
        // A span that starts later is kept.
        let kept = miette::SourceSpan::new(4.into(), 3);
        assert_eq!(narrow_span(text, kept), kept);
    }

    #[test]
    fn braces_in_strings_and_comments_neither_hide_nor_pile_up_nesting() {
        // Closed in their own string, or inside comments: nothing piles up
        // over many nodes.
        let calm = "n \"{R12}\" #\"{ }\"# /* } { */ // } {\nm { a }\n".repeat(200);
        assert_eq!(too_deep(&calm), None);
        // A `}` in a string, also after a whitespace escape or in a
        // multi-line or raw string, or in a comment, closes no block.
        for unit in [
            "n \"}\" {\n",
            "n \"x\\\r\n}\" {\n",
            "n \"\"\"\n}\n\"\"\" {\n",
            "n ##\"}\"#}\"## {\n",
            "n { /* } */\n",
            "n { // }\n",
        ] {
            let text = unit.repeat(60);
            let found = too_deep(&text).unwrap_or_else(|| panic!("{unit:?}"));
            assert_eq!(found.kind, Nesting::Blocks, "{unit:?}");
            let at = text.match_indices('{').map(|(i, _)| i);
            let first_past = if unit.contains("{ ") {
                at.step_by(1).nth(MAX_FALLBACK_DEPTH)
            } else {
                at.filter(|&i| text.as_bytes()[i + 1] == b'\n')
                    .nth(MAX_FALLBACK_DEPTH)
            };
            assert_eq!(Some(found.offset), first_past, "{unit:?}");
        }
        // A comment left open makes its text count too.
        let open = format!("/*{}", "a {\n".repeat(60));
        assert_eq!(too_deep(&open).map(|d| d.kind), Some(Nesting::Blocks));
    }

    #[test]
    fn ordinary_nesting_still_parses() {
        let text = format!("{}{}", "a {".repeat(10), "}".repeat(10));
        assert!(parse_document(&text).is_ok());
    }
}
