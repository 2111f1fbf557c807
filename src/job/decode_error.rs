//! Decode errors are data: a kind of problem, the span of the text that
//! caused it, what was expected and a hint. They are collected, not thrown,
//! so one run reports every problem in a file.

use miette::{Diagnostic, LabeledSpan, Severity, SourceSpan};
use std::fmt;

use crate::catalogue::{Catalogue, Msg};

/// Words of a diagnostic as they are made: a message of the catalogue by
/// key (said in the reader's language when shown), or plain text the
/// program has no message for (a parser's own words).
#[derive(Debug, Clone)]
pub enum Text {
    Plain(String),
    Said(Msg),
}

impl Text {
    fn english(self) -> (String, Option<Msg>) {
        match self {
            Text::Plain(s) => (s, None),
            Text::Said(m) => (m.english(), Some(m)),
        }
    }
}

impl From<&str> for Text {
    fn from(s: &str) -> Self {
        Text::Plain(s.to_owned())
    }
}
impl From<String> for Text {
    fn from(s: String) -> Self {
        Text::Plain(s)
    }
}
impl From<&String> for Text {
    fn from(s: &String) -> Self {
        Text::Plain(s.clone())
    }
}
impl From<Msg> for Text {
    fn from(m: Msg) -> Self {
        Text::Said(m)
    }
}

/// The catalogue messages behind a problem's words, where it has them.
#[derive(Debug, Clone, Default)]
pub struct Keyed {
    pub message: Option<Msg>,
    pub label: Option<Msg>,
    pub help: Option<Msg>,
}

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
    /// The messages `message`, `label` and `help` were said from, in
    /// English; [`DecodeError::localize`] says them again in another
    /// language.
    pub keyed: Option<Box<Keyed>>,
}

impl DecodeError {
    pub fn error(
        code: &'static str,
        span: SourceSpan,
        message: impl Into<Text>,
        label: impl Into<Text>,
    ) -> Self {
        let (message, message_key) = message.into().english();
        let (label, label_key) = label.into().english();
        let keyed = (message_key.is_some() || label_key.is_some()).then(|| {
            Box::new(Keyed {
                message: message_key,
                label: label_key,
                help: None,
            })
        });
        DecodeError {
            code,
            message,
            span,
            label,
            help: None,
            severity: Severity::Error,
            file_kind: None,
            keyed,
        }
    }

    pub fn warning(
        code: &'static str,
        span: SourceSpan,
        message: impl Into<Text>,
        label: impl Into<Text>,
    ) -> Self {
        DecodeError {
            severity: Severity::Warning,
            ..DecodeError::error(code, span, message, label)
        }
    }

    pub fn with_help(mut self, help: impl Into<Text>) -> Self {
        let (help, help_key) = help.into().english();
        self.help = Some(help);
        match (&mut self.keyed, help_key) {
            (Some(keyed), key) => keyed.help = key,
            (None, Some(key)) => {
                self.keyed = Some(Box::new(Keyed {
                    help: Some(key),
                    ..Keyed::default()
                }))
            }
            (None, None) => {}
        }
        self
    }

    /// Says the problem's words again from `catalogue`, where they came
    /// from the catalogue; plain words stay as they are.
    pub fn localize(&mut self, catalogue: &Catalogue) {
        let Some(keyed) = &self.keyed else { return };
        if let Some(m) = &keyed.message {
            self.message = catalogue.say(m);
        }
        if let Some(m) = &keyed.label {
            self.label = catalogue.say(m);
        }
        if let Some(m) = &keyed.help {
            self.help = Some(catalogue.say(m));
        }
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
    /// The language the report's own lines are said in (English until
    /// [`JobDiagnostics::localize`]).
    pub catalogue: Catalogue,
}

impl JobDiagnostics {
    /// The problems of the file read as `source`, said in English.
    pub fn new(source: crate::problem_cap::ClippedSource, problems: Vec<DecodeError>) -> Self {
        JobDiagnostics {
            source,
            problems,
            not_shown: Default::default(),
            catalogue: Catalogue::english().clone(),
        }
    }

    /// The same problems said in `catalogue`'s language.
    pub fn localize(&mut self, catalogue: &Catalogue) {
        for p in &mut self.problems {
            p.localize(catalogue);
        }
        self.not_shown = Default::default();
        self.catalogue = catalogue.clone();
    }

    /// [`JobDiagnostics::localize`], by value.
    pub fn localized(mut self, catalogue: &Catalogue) -> Self {
        self.localize(catalogue);
        self
    }

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
        let file = if self.problems.iter().any(|p| p.file_kind == Some("shop")) {
            "shop"
        } else if self
            .problems
            .iter()
            .any(|p| p.code.starts_with("catalogue::"))
        {
            "translation"
        } else {
            "job"
        };
        let msg = match (errors, warnings) {
            (0, w) => Msg::new("diag-file-warnings").arg("warnings", w),
            (e, 0) => Msg::new("diag-file-refused")
                .arg("errors", e)
                .arg("file", file),
            (e, w) => Msg::new("diag-file-refused-warnings")
                .arg("errors", e)
                .arg("warnings", w)
                .arg("file", file),
        };
        let msg = msg.arg("name", self.source.name());
        f.write_str(&self.catalogue.say(&msg))
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
        Some(crate::problem_cap::shown(
            &self.problems,
            &self.not_shown,
            &self.catalogue,
        ))
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

/// "did you mean `a` or `b`?" or a list of every allowed name, in
/// English.
pub fn suggestion_help(name: &str, known: &[&str]) -> String {
    suggestion(name, known).english()
}

/// "did you mean `a` or `b`?" or a list of every allowed name, as a
/// message to be said in the reader's language.
pub fn suggestion(name: &str, known: &[&str]) -> Msg {
    let near = did_you_mean(name, known.iter().copied());
    match near.as_slice() {
        [] => Msg::new("diag-allowed-here").arg("names", known.join(", ")),
        [one] => Msg::new("diag-did-you-mean").arg("name", *one),
        many => {
            let (last, rest) = many.split_last().unwrap_or((&"", &[]));
            let rest: Vec<String> = rest.iter().map(|n| format!("`{n}`")).collect();
            Msg::new("diag-did-you-mean-either")
                .arg("names", rest.join(", "))
                .arg("last", *last)
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
