//! How many problems of one input file are printed. A file of garbage can
//! hold hundreds of thousands of problems; drawing each with its source
//! line costs time and floods the terminal, and after the first few the
//! rest only repeat them. The first [`SHOWN_PROBLEMS`] are printed in full
//! and the rest are counted in one closing line ([`NotShown`]); very long
//! lines are cut to a window around each problem ([`ClippedSource`]).

use miette::{
    Diagnostic, MietteError, MietteSpanContents, NamedSource, Severity, SourceCode, SourceSpan,
    SpanContents,
};
use std::fmt;
use std::sync::Arc;

/// Problems printed in full for one file.
pub const SHOWN_PROBLEMS: usize = 20;

/// The closing line that counts the problems not printed.
#[derive(Debug, Clone)]
pub struct NotShown {
    pub count: usize,
    /// The language the line is said in.
    pub catalogue: crate::catalogue::Catalogue,
}

impl NotShown {
    /// The line for `count` problems not shown, said in `catalogue`.
    pub fn new(count: usize, catalogue: &crate::catalogue::Catalogue) -> Self {
        NotShown {
            count,
            catalogue: catalogue.clone(),
        }
    }
}

impl fmt::Display for NotShown {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        f.write_str(
            &self.catalogue.say(
                &crate::catalogue::Msg::new("diag-not-shown")
                    .arg("count", self.count)
                    .arg("shown", SHOWN_PROBLEMS),
            ),
        )
    }
}

impl std::error::Error for NotShown {}

impl Diagnostic for NotShown {
    fn severity(&self) -> Option<Severity> {
        Some(Severity::Advice)
    }
}

/// The first [`SHOWN_PROBLEMS`] of `problems` and, when there are more,
/// the `not_shown` line counting the rest (made on first use).
pub fn shown<'a, T: Diagnostic>(
    problems: &'a [T],
    not_shown: &'a std::sync::OnceLock<NotShown>,
    catalogue: &crate::catalogue::Catalogue,
) -> Box<dyn Iterator<Item = &'a dyn Diagnostic> + 'a> {
    let rest = problems.len().saturating_sub(SHOWN_PROBLEMS);
    let tail = (rest > 0)
        .then(|| not_shown.get_or_init(|| NotShown::new(rest, catalogue)) as &dyn Diagnostic);
    Box::new(
        problems
            .iter()
            .take(SHOWN_PROBLEMS)
            .map(|p| p as &dyn Diagnostic)
            .chain(tail),
    )
}

/// A file's text for drawing problems, with very long lines cut to a
/// window around each underline. miette prints every line a problem
/// touches in full; a file of one 1 MB line would be printed whole for each
/// problem. Lines up to [`LONG_LINE`] bytes are drawn as they are.
#[derive(Debug, Clone)]
pub struct ClippedSource(pub NamedSource<Arc<String>>);

/// Context longer than this (in bytes) is cut to a window.
pub const LONG_LINE: usize = 400;

/// Bytes of context kept on each side of an underline in a cut window.
const WINDOW: usize = 120;

impl std::ops::Deref for ClippedSource {
    type Target = NamedSource<Arc<String>>;
    fn deref(&self) -> &Self::Target {
        &self.0
    }
}

impl SourceCode for ClippedSource {
    fn read_span<'a>(
        &'a self,
        span: &SourceSpan,
        before: usize,
        after: usize,
    ) -> Result<Box<dyn SpanContents<'a> + 'a>, MietteError> {
        let contents = self.0.read_span(span, before, after)?;
        if contents.data().len() <= LONG_LINE {
            return Ok(contents);
        }
        let text: &'a str = self.0.inner().as_str();
        let from = contents.span().offset();
        let to = from + contents.data().len();
        let start = span.offset().saturating_sub(WINDOW).max(from);
        let end = (span.offset() + span.len().min(2 * WINDOW) + WINDOW).min(to);
        let start = (0..=start)
            .rev()
            .find(|&i| text.is_char_boundary(i))
            .unwrap_or(0);
        let end = (end.max(start)..=text.len())
            .find(|&i| text.is_char_boundary(i))
            .unwrap_or(text.len());
        let before_text = &text[..start];
        let line = before_text.matches('\n').count();
        let line_start = before_text.rfind('\n').map_or(0, |i| i + 1);
        let column = before_text[line_start..].chars().count();
        let data = &text.as_bytes()[start..end];
        let lines = text[start..end].matches('\n').count() + 1;
        Ok(Box::new(MietteSpanContents::new_named(
            self.0.name().to_string(),
            data,
            SourceSpan::new(start.into(), end - start),
            line,
            column,
            lines,
        )))
    }
}
