//! Decode errors are data: a kind of problem, the span of the text that
//! caused it, what was expected and a hint. They are collected, not thrown,
//! so one run reports every problem in a file.

use miette::{Diagnostic, LabeledSpan, Severity, SourceSpan};
use std::fmt;

/// One problem in a job file.
#[derive(Debug, Clone)]
pub struct DecodeError {
    /// A stable code such as `job::unknown-node`.
    pub code: &'static str,
    pub message: String,
    pub span: SourceSpan,
    /// Short text under the underline: what was expected.
    pub label: String,
    pub help: Option<String>,
    pub severity: Severity,
    /// The kind of file the problem is in, when not a job file ("shop"):
    /// it replaces the `job` part of the code shown.
    pub file_kind: Option<&'static str>,
}

impl DecodeError {
    pub fn error(
        code: &'static str,
        span: SourceSpan,
        message: impl Into<String>,
        label: impl Into<String>,
    ) -> Self {
        DecodeError {
            code,
            message: message.into(),
            span,
            label: label.into(),
            help: None,
            severity: Severity::Error,
            file_kind: None,
        }
    }

    pub fn warning(
        code: &'static str,
        span: SourceSpan,
        message: impl Into<String>,
        label: impl Into<String>,
    ) -> Self {
        DecodeError {
            severity: Severity::Warning,
            ..DecodeError::error(code, span, message, label)
        }
    }

    pub fn with_help(mut self, help: impl Into<String>) -> Self {
        self.help = Some(help.into());
        self
    }

    /// The same problem, found in another kind of file than a job file
    /// (the shop profile, which shares the job file's readers).
    pub fn in_file_kind(mut self, kind: &'static str) -> Self {
        self.file_kind = Some(kind);
        self
    }

    /// The code as shown: `job::unknown-node`, or `shop::unknown-node` in
    /// a shop profile.
    pub fn shown_code(&self) -> String {
        match self.file_kind {
            Some(kind) => {
                let rest = self.code.split_once("::").map_or(self.code, |(_, r)| r);
                format!("{kind}::{rest}")
            }
            None => self.code.to_string(),
        }
    }

    pub fn is_error(&self) -> bool {
        self.severity == Severity::Error
    }
}

impl fmt::Display for DecodeError {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        f.write_str(&self.message)
    }
}

impl std::error::Error for DecodeError {}

impl Diagnostic for DecodeError {
    fn code<'a>(&'a self) -> Option<Box<dyn fmt::Display + 'a>> {
        Some(Box::new(format!("ampreport::{}", self.shown_code())))
    }
    fn severity(&self) -> Option<Severity> {
        Some(self.severity)
    }
    fn help<'a>(&'a self) -> Option<Box<dyn fmt::Display + 'a>> {
        self.help
            .as_ref()
            .map(|h| Box::new(h) as Box<dyn fmt::Display>)
    }
    fn labels(&self) -> Option<Box<dyn Iterator<Item = LabeledSpan> + '_>> {
        Some(Box::new(std::iter::once(LabeledSpan::new_with_span(
            Some(self.label.clone()),
            self.span,
        ))))
    }
}

/// Every problem found in one job file, rendered as one report whose
/// related diagnostics are the individual problems.
#[derive(Debug, Clone)]
pub struct JobDiagnostics {
    pub source: crate::problem_cap::ClippedSource,
    pub problems: Vec<DecodeError>,
    /// The line counting problems past the first few, made when drawn.
    pub not_shown: std::sync::OnceLock<crate::problem_cap::NotShown>,
}

impl JobDiagnostics {
    pub fn errors(&self) -> impl Iterator<Item = &DecodeError> {
        self.problems.iter().filter(|p| p.is_error())
    }
    pub fn warnings(&self) -> impl Iterator<Item = &DecodeError> {
        self.problems.iter().filter(|p| !p.is_error())
    }
    pub fn error_count(&self) -> usize {
        self.errors().count()
    }
    pub fn has_errors(&self) -> bool {
        self.errors().next().is_some()
    }

    /// (line, column), both 1-based, of a byte offset in the source.
    pub fn line_column(&self, offset: usize) -> (usize, usize) {
        line_column(self.source.inner(), offset)
    }
}

/// (line, column), both 1-based and counting characters, of a byte offset.
pub fn line_column(text: &str, offset: usize) -> (usize, usize) {
    let offset = offset.min(text.len());
    let mut line = 1;
    let mut col = 1;
    for (i, c) in text.char_indices() {
        if i >= offset {
            break;
        }
        if c == '\n' {
            line += 1;
            col = 1;
        } else {
            col += 1;
        }
    }
    (line, col)
}

impl fmt::Display for JobDiagnostics {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        let errors = self.error_count();
        let warnings = self.problems.len() - errors;
        let name = self.source.name();
        let file = if self.problems.iter().any(|p| p.file_kind == Some("shop")) {
            "shop profile"
        } else {
            "job file"
        };
        match (errors, warnings) {
            (0, 1) => write!(f, "{name}: 1 warning"),
            (0, w) => write!(f, "{name}: {w} warnings"),
            (1, 0) => write!(f, "{name}: 1 problem stops this {file} from being read"),
            (e, 0) => write!(f, "{name}: {e} problems stop this {file} from being read"),
            (e, w) => write!(
                f,
                "{name}: {e} problem{} stop{} this {file} from being read ({w} warning{} too)",
                if e == 1 { "" } else { "s" },
                if e == 1 { "s" } else { "" },
                if w == 1 { "" } else { "s" }
            ),
        }
    }
}

impl std::error::Error for JobDiagnostics {}

impl Diagnostic for JobDiagnostics {
    fn source_code(&self) -> Option<&dyn miette::SourceCode> {
        Some(&self.source)
    }
    fn severity(&self) -> Option<Severity> {
        Some(if self.has_errors() {
            Severity::Error
        } else {
            Severity::Warning
        })
    }
    fn related<'a>(&'a self) -> Option<Box<dyn Iterator<Item = &'a dyn Diagnostic> + 'a>> {
        Some(crate::problem_cap::shown(&self.problems, &self.not_shown))
    }
}

/// Up to three known names close to `name`, nearest first.
pub fn did_you_mean<'a>(name: &str, known: impl IntoIterator<Item = &'a str>) -> Vec<&'a str> {
    let mut scored: Vec<(f64, &str)> = known
        .into_iter()
        .map(|k| {
            (
                strsim::jaro_winkler(&name.to_lowercase(), &k.to_lowercase()),
                k,
            )
        })
        .filter(|(s, _)| *s > 0.75)
        .collect();
    scored.sort_by(|a, b| b.0.total_cmp(&a.0).then(a.1.cmp(b.1)));
    scored.dedup_by(|a, b| a.1 == b.1);
    scored.into_iter().take(3).map(|(_, k)| k).collect()
}

/// "did you mean `a` or `b`?" or a list of every allowed name.
pub fn suggestion_help(name: &str, known: &[&str]) -> String {
    let near = did_you_mean(name, known.iter().copied());
    match near.as_slice() {
        [] => format!("allowed here: {}", known.join(", ")),
        [one] => format!("did you mean `{one}`?"),
        many => {
            let (last, rest) = many.split_last().unwrap_or((&"", &[]));
            let rest: Vec<String> = rest.iter().map(|n| format!("`{n}`")).collect();
            format!("did you mean {} or `{last}`?", rest.join(", "))
        }
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn line_and_column_count_characters_from_one() {
        let text = "job-format 1\nunit model=\"Dµet\" year=x\r\nmains\n";
        assert_eq!(line_column(text, 0), (1, 1));
        assert_eq!(line_column(text, text.find("unit").unwrap()), (2, 1));
        // µ is two bytes but one column.
        assert_eq!(line_column(text, text.find("year").unwrap()), (2, 19));
        // CRLF ends a line like LF.
        assert_eq!(line_column(text, text.find("mains").unwrap()), (3, 1));
        // Past the end: the end.
        assert_eq!(line_column(text, 10_000), (4, 1));
    }

    #[test]
    fn suggestions_name_the_nearest_known_names() {
        let known = ["frequency", "nominal", "tolerance", "design"];
        assert_eq!(did_you_mean("frequncy", known), ["frequency"]);
        assert!(did_you_mean("zzzz", known).is_empty());
        assert_eq!(
            suggestion_help("tolerence", &known),
            "did you mean `tolerance`?"
        );
        assert_eq!(
            suggestion_help("zzzz", &known),
            "allowed here: frequency, nominal, tolerance, design"
        );
    }
}
