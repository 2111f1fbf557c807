//! The errors a ratings file can produce, shaped for miette so that a
//! technician sees the line, the offending value underlined, what belongs
//! there and how to fix it. Every problem in a file is gathered into one
//! report rather than stopping at the first.

use miette::{Diagnostic, NamedSource, SourceSpan};
use std::fmt;
use std::sync::Arc;

/// One thing wrong in a ratings file.
#[derive(Debug, Clone, PartialEq, Eq, thiserror::Error, Diagnostic)]
#[error("{message}")]
#[diagnostic(code(ampreport::ratings::invalid))]
pub struct RatingProblem {
    message: String,
    #[label("{label}")]
    span: SourceSpan,
    label: String,
    #[help]
    help: Option<String>,
}

impl RatingProblem {
    /// A problem at `span` (byte offsets into the file).
    pub(crate) fn new(
        message: impl Into<String>,
        span: SourceSpan,
        label: impl Into<String>,
    ) -> Self {
        RatingProblem {
            message: message.into(),
            span,
            label: label.into(),
            help: None,
        }
    }

    /// The same problem with a hint on how to fix it.
    pub(crate) fn with_help(mut self, help: impl Into<String>) -> Self {
        self.help = Some(help.into());
        self
    }

    /// What is wrong.
    pub fn message(&self) -> &str {
        &self.message
    }

    /// The byte range of the file that is underlined.
    pub fn span(&self) -> SourceSpan {
        self.span
    }

    /// The text under the underline.
    pub fn label(&self) -> &str {
        &self.label
    }

    /// The hint, if any.
    pub fn help(&self) -> Option<&str> {
        self.help.as_deref()
    }
}

/// Every problem found in one ratings file.
#[derive(Debug, thiserror::Error)]
pub struct RatingsFileError {
    file_name: String,
    source_code: crate::problem_cap::ClippedSource,
    problems: Vec<RatingProblem>,
    not_shown: std::sync::OnceLock<crate::problem_cap::NotShown>,
}

impl Diagnostic for RatingsFileError {
    fn code<'a>(&'a self) -> Option<Box<dyn fmt::Display + 'a>> {
        Some(Box::new("ampreport::ratings::file"))
    }
    fn help<'a>(&'a self) -> Option<Box<dyn fmt::Display + 'a>> {
        Some(Box::new(
            "nothing from this file was used; fix the problems below and run again",
        ))
    }
    fn source_code(&self) -> Option<&dyn miette::SourceCode> {
        Some(&self.source_code)
    }
    fn related<'a>(&'a self) -> Option<Box<dyn Iterator<Item = &'a dyn Diagnostic> + 'a>> {
        Some(crate::problem_cap::shown(
            &self.problems,
            &self.not_shown,
            crate::catalogue::Catalogue::english(),
        ))
    }
}

impl RatingsFileError {
    pub(crate) fn new(file_name: &str, text: Arc<String>, problems: Vec<RatingProblem>) -> Self {
        RatingsFileError {
            file_name: file_name.to_string(),
            source_code: crate::problem_cap::ClippedSource(
                NamedSource::new(file_name, text).with_language("kdl"),
            ),
            problems,
            not_shown: Default::default(),
        }
    }

    /// The name the file was reported under.
    pub fn file_name(&self) -> &str {
        &self.file_name
    }

    /// The problems, in the order they occur in the file.
    pub fn problems(&self) -> &[RatingProblem] {
        &self.problems
    }
}

impl fmt::Display for RatingsFileError {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        match self.problems.len() {
            1 => write!(f, "1 problem in ratings file {}", self.file_name),
            n => write!(f, "{n} problems in ratings file {}", self.file_name),
        }
    }
}

/// A ratings file that could not be read from disk at all.
#[derive(Debug, thiserror::Error, Diagnostic)]
#[error("cannot read ratings file {path}")]
#[diagnostic(
    code(ampreport::ratings::unreadable),
    help("check the path and that the file is readable text (UTF-8)")
)]
pub struct UnreadableRatingsFile {
    pub path: String,
    #[source]
    pub cause: std::io::Error,
}
