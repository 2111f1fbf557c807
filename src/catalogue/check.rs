//! Checking a translation against the English catalogue before it is used:
//! Fluent syntax errors, keys English does not have (with a did-you-mean),
//! arguments a message is never given, references to messages that do not
//! exist, and every English key that is missing. The mains-safety notice is
//! translated whole or not at all. Problems are `DecodeError`s, so they are
//! shown like a job file's, at `file:line:column`.

use std::collections::{BTreeMap, BTreeSet};
use std::sync::Arc;

use fluent_syntax::ast::{Entry, Expression, InlineExpression, Pattern, PatternElement};
use miette::{NamedSource, SourceSpan};

use super::{ENGLISH, Msg, NOTICE_KEYS, message_lines};
use crate::job::{DecodeError, JobDiagnostics, suggestion};

/// Every problem found in one translation file.
pub type CatalogueDiagnostics = JobDiagnostics;

/// What one message uses.
#[derive(Debug, Default)]
struct Uses {
    /// `{ $name }` arguments.
    variables: BTreeSet<String>,
    /// `{ other-message }` references.
    messages: BTreeSet<String>,
    /// Whether it has a value (not only attributes).
    has_value: bool,
}

fn uses_of(
    text: &str,
) -> (
    BTreeMap<String, Uses>,
    Vec<fluent_syntax::parser::ParserError>,
) {
    let (resource, errors) = match fluent_syntax::parser::parse(text) {
        Ok(r) => (r, Vec::new()),
        Err((r, e)) => (r, e),
    };
    let mut map = BTreeMap::new();
    for entry in &resource.body {
        if let Entry::Message(m) = entry {
            let mut uses = Uses {
                has_value: m.value.is_some(),
                ..Uses::default()
            };
            if let Some(p) = &m.value {
                pattern_uses(p, &mut uses);
            }
            for a in &m.attributes {
                pattern_uses(&a.value, &mut uses);
            }
            map.insert(m.id.name.to_string(), uses);
        }
    }
    (map, errors)
}

fn pattern_uses(p: &Pattern<&str>, uses: &mut Uses) {
    for element in &p.elements {
        if let PatternElement::Placeable { expression } = element {
            expression_uses(expression, uses);
        }
    }
}

fn expression_uses(e: &Expression<&str>, uses: &mut Uses) {
    match e {
        Expression::Select { selector, variants } => {
            inline_uses(selector, uses);
            for v in variants {
                pattern_uses(&v.value, uses);
            }
        }
        Expression::Inline(i) => inline_uses(i, uses),
    }
}

fn inline_uses(i: &InlineExpression<&str>, uses: &mut Uses) {
    match i {
        InlineExpression::VariableReference { id } => {
            uses.variables.insert(id.name.to_string());
        }
        InlineExpression::MessageReference { id, .. } => {
            uses.messages.insert(id.name.to_string());
        }
        InlineExpression::FunctionReference { arguments, .. } => {
            for a in &arguments.positional {
                inline_uses(a, uses);
            }
            for a in &arguments.named {
                inline_uses(&a.value, uses);
            }
        }
        InlineExpression::TermReference {
            arguments: Some(arguments),
            ..
        } => {
            for a in &arguments.positional {
                inline_uses(a, uses);
            }
        }
        InlineExpression::Placeable { expression } => expression_uses(expression, uses),
        _ => {}
    }
}

/// (line, text) of an English message, for the help of a missing key.
fn english_line(key: &str) -> Option<(usize, String)> {
    let offset = *message_lines(ENGLISH).get(key)?;
    let line = ENGLISH[..offset].matches('\n').count() + 1;
    let text = ENGLISH[offset..]
        .lines()
        .next()
        .and_then(|l| l.split_once('='))
        .map(|(_, t)| t.trim().to_owned())
        .unwrap_or_default();
    Some((line, text))
}

/// Checks a translation's text against the English catalogue. `name` is
/// the file name shown in messages.
pub fn check_translation(name: &str, text: &str) -> Result<(), CatalogueDiagnostics> {
    let (english, _) = uses_of(ENGLISH);
    let (theirs, syntax) = uses_of(text);
    let lines = message_lines(text);
    let at = |key: &str| -> SourceSpan {
        let offset = lines.get(key).copied().unwrap_or(0);
        SourceSpan::new(
            offset.into(),
            key.len().min(text.len() - offset.min(text.len())),
        )
    };
    let start = SourceSpan::new(0.into(), 0);
    let mut problems = Vec::new();

    for e in &syntax {
        let offset = e.pos.start.min(text.len());
        let len = (e.pos.end.min(text.len())).saturating_sub(offset);
        problems.push(
            DecodeError::error(
                "catalogue::syntax",
                SourceSpan::new(offset.into(), len),
                Msg::new("diag-ftl-syntax").arg("problem", e.kind.to_string()),
                Msg::new("diag-here"),
            )
            .with_help(Msg::new("diag-ftl-syntax-help")),
        );
    }

    let known: Vec<&str> = english.keys().map(String::as_str).collect();
    for (key, uses) in &theirs {
        let Some(reference) = english.get(key) else {
            problems.push(
                DecodeError::error(
                    "catalogue::unknown-key",
                    at(key),
                    Msg::new("diag-ftl-unknown-key").arg("key", key.as_str()),
                    Msg::new("diag-ftl-unknown-key-label"),
                )
                .with_help(suggestion(key, &known)),
            );
            continue;
        };
        if !uses.has_value {
            problems.push(DecodeError::error(
                "catalogue::no-text",
                at(key),
                Msg::new("diag-ftl-no-text").arg("key", key.as_str()),
                Msg::new("diag-ftl-no-text-label"),
            ));
        }
        for v in uses.variables.difference(&reference.variables) {
            let given: Vec<String> = reference
                .variables
                .iter()
                .map(|v| format!("`{{ ${v} }}`"))
                .collect();
            problems.push(
                DecodeError::error(
                    "catalogue::unknown-argument",
                    at(key),
                    Msg::new("diag-ftl-unknown-argument")
                        .arg("key", key.as_str())
                        .arg("argument", format!("{{ ${v} }}")),
                    Msg::new("diag-ftl-unknown-argument-label"),
                )
                .with_help(if given.is_empty() {
                    Msg::new("diag-ftl-no-arguments")
                } else {
                    Msg::new("diag-ftl-given").arg("arguments", given.join(", "))
                }),
            );
        }
        for m in &uses.messages {
            if !theirs.contains_key(m) {
                problems.push(DecodeError::error(
                    "catalogue::unknown-reference",
                    at(key),
                    Msg::new("diag-ftl-unknown-reference")
                        .arg("key", key.as_str())
                        .arg("reference", m.as_str()),
                    Msg::new("diag-ftl-unknown-message"),
                ));
            }
        }
    }

    let notice_missing: Vec<&str> = NOTICE_KEYS
        .iter()
        .copied()
        .filter(|k| !theirs.contains_key(*k))
        .collect();
    if !notice_missing.is_empty() {
        problems.push(
            DecodeError::error(
                "catalogue::notice-incomplete",
                start,
                Msg::new("diag-ftl-notice-incomplete").arg("keys", notice_missing.join(", ")),
                Msg::new("diag-ftl-in-this-file"),
            )
            .with_help(Msg::new("diag-ftl-notice-help")),
        );
    }
    for key in english.keys() {
        if theirs.contains_key(key) || NOTICE_KEYS.contains(&key.as_str()) {
            continue;
        }
        let help = match english_line(key) {
            Some((line, words)) => Msg::new("diag-ftl-add-key-english")
                .arg("key", key.as_str())
                .arg("line", line.to_string())
                .arg("english", words),
            None => Msg::new("diag-ftl-add-key").arg("key", key.as_str()),
        };
        problems.push(
            DecodeError::error(
                "catalogue::missing-key",
                start,
                Msg::new("diag-ftl-missing-key").arg("key", key.as_str()),
                Msg::new("diag-ftl-in-this-file"),
            )
            .with_help(help),
        );
    }

    if problems.is_empty() {
        return Ok(());
    }
    problems.sort_by_key(|p| p.span.offset());
    Err(diagnostics(name, text, problems))
}

fn diagnostics(name: &str, text: &str, problems: Vec<DecodeError>) -> CatalogueDiagnostics {
    JobDiagnostics::new(
        crate::problem_cap::ClippedSource(NamedSource::new(name, Arc::new(text.to_string()))),
        problems,
    )
}

/// One problem at the start of a file, as diagnostics.
pub(super) fn single(name: &str, text: &str, message: Msg) -> CatalogueDiagnostics {
    diagnostics(
        name,
        text,
        vec![DecodeError::error(
            "catalogue::unreadable",
            SourceSpan::new(0.into(), 0),
            message,
            Msg::new("diag-here"),
        )],
    )
}
