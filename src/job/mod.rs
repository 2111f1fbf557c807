//! The job file: decoding KDL into a typed [`Job`] whose values keep their
//! source spans. Every problem is collected into one [`JobDiagnostics`].

mod bare_value;
pub(crate) mod charges;
mod completeness;
pub(crate) mod decode;
mod decode_bench;
mod decode_error;
mod kdl_words;
mod model;
pub mod network;
pub mod numbering;
pub(crate) mod reader;
mod validate;
mod valve_types;

pub use charges::{
    CENT_PLACES, CHARGE_NODES, ChargeKind, ChargeLine, ChargeTerms, ChargeTotals, Charges,
    LineAmount, to_cents,
};
pub use completeness::{NotMeasuredInFinal, not_measured_in_final};
pub use decode::{
    BENCH_CHECKS, CIRCUIT_NODES, FORMAT_VERSION, MOD_FIGURES, SAFETY_TESTS, SET_NODES, SETTINGS,
    TOP_LEVEL, VALVE_CHECKS,
};
pub use decode_bench::{BENCH_NODES, DEFAULT_FREQUENCY};
pub use decode_error::{
    DecodeError, JobDiagnostics, did_you_mean, line_column, suggestion, suggestion_help,
};
pub use model::*;

use crate::catalogue::{Arg, Msg};
use decode_error::Text;
use miette::{NamedSource, SourceSpan};
use std::sync::Arc;

/// A decoded job and any warnings found on the way.
#[derive(Debug, Clone)]
pub struct Decoded {
    pub job: Job,
    /// Warnings only; errors would have stopped the decode.
    pub diagnostics: JobDiagnostics,
}

/// Decodes job-file text and checks every valve type against `ratings`.
/// Never panics, whatever the text.
pub fn decode_with_ratings(
    name: &str,
    text: &str,
    ratings: &crate::ratings::RatingsTable,
) -> Result<Decoded, JobDiagnostics> {
    decode_inner(name, text, Some(ratings), &JobDefaults::default())
}

/// Decodes job-file text over a shop profile's `defaults` (bands, safety
/// limits, technician; the job's own entries win) and checks every valve
/// type against `ratings`. Never panics, whatever the text.
pub fn decode_with_defaults(
    name: &str,
    text: &str,
    ratings: &crate::ratings::RatingsTable,
    defaults: &JobDefaults,
) -> Result<Decoded, JobDiagnostics> {
    decode_inner(name, text, Some(ratings), defaults)
}

/// Decodes job-file text without checking valve types. `name` is the file
/// name used in messages. Never panics, whatever the text.
pub fn decode(name: &str, text: &str) -> Result<Decoded, JobDiagnostics> {
    decode_inner(name, text, None, &JobDefaults::default())
}

fn decode_inner(
    name: &str,
    text: &str,
    ratings: Option<&crate::ratings::RatingsTable>,
    defaults: &JobDefaults,
) -> Result<Decoded, JobDiagnostics> {
    let source = crate::problem_cap::ClippedSource(
        NamedSource::new(name, Arc::new(text.to_string())).with_language("kdl"),
    );
    let mut problems = Vec::new();
    let job = match crate::kdl_fast::parse_tree(text) {
        Ok(tree) => {
            let mut reader = reader::Reader::new(text);
            let job = decode::decode_document(tree.doc(), name, defaults, &mut reader);
            problems.append(&mut reader.problems);
            if let Some(job) = &job {
                problems.extend(validate::cross_references(job));
                problems.extend(network::check::check(job, ratings));
                problems.extend(completeness::warnings(job));
                if let Some(ratings) = ratings {
                    problems.extend(valve_types::check(job, ratings));
                }
            }
            job
        }
        Err(e) => {
            problems.extend(syntax_problems(text, &e));
            None
        }
    };
    problems.sort_by_key(|p| p.span.offset());
    let diagnostics = JobDiagnostics::new(source, problems);
    match job {
        Some(job) if !diagnostics.has_errors() => Ok(Decoded { job, diagnostics }),
        _ => {
            let mut diagnostics = diagnostics;
            if !diagnostics.has_errors() {
                // Defensive: a job that could not be built always says why.
                diagnostics.problems.push(DecodeError::error(
                    "job::incomplete",
                    SourceSpan::new(0.into(), 0),
                    Msg::new("diag-incomplete").arg("file", "job"),
                    Msg::new("diag-here"),
                ));
            }
            Err(diagnostics)
        }
    }
}

/// KDL syntax errors, as our own problems so they render alike. Values
/// written without quotes (`nominal=120V`) are found by a scan of their own
/// and replace the parser's report of them, whose span covers the whole
/// document.
pub(crate) fn syntax_problems(text: &str, e: &kdl::KdlError) -> Vec<DecodeError> {
    let bare = bare_value::find(text);
    let covers_bare = |span: &SourceSpan| {
        bare.iter()
            .any(|b| span.offset() <= b.offset() && b.offset() < span.offset() + span.len().max(1))
    };
    let mut out: Vec<DecodeError> = bare
        .iter()
        .map(|&span| {
            let value = &text[span.offset()..span.offset() + span.len()];
            DecodeError::error(
                "job::syntax",
                span,
                Msg::new("diag-bare-value").arg("value", value),
                Msg::new("diag-needs-quotes"),
            )
            .with_help(Msg::new("diag-bare-value-help").arg("value", value))
        })
        .collect();
    // The parser can tell one slip twice (a block left open: "no closing
    // `}`" at its `{`, and "`}` not found" over the block after it, both
    // labelled "not closed"); a report with the same label as an earlier
    // one, over text that reaches or touches it, is left out.
    let told_before = |i: usize| {
        let d = &e.diagnostics[i];
        let (start, end) = (d.span.offset(), d.span.offset() + d.span.len());
        e.diagnostics[..i].iter().any(|b| {
            d.label.is_some()
                && b.label == d.label
                && b.span.offset() <= end
                && start <= b.span.offset() + b.span.len()
        })
    };
    out.extend(
        e.diagnostics
            .iter()
            .enumerate()
            .filter(|&(i, d)| !covers_bare(&d.span) && !told_before(i))
            .map(|(_, d)| {
                // The parser's words the catalogue knows are said from it;
                // any other stays as the parser gives it.
                let problem: Arg = match &d.message {
                    Some(m) => kdl_words::message(m),
                    None => Msg::new("diag-kdl-broken").into(),
                };
                let label: Text = match &d.label {
                    Some(l) => kdl_words::label(l),
                    None => Msg::new("diag-here").into(),
                };
                let help: Text = match &d.help {
                    Some(h) => kdl_words::help(h),
                    None => Msg::new("diag-kdl-help").into(),
                };
                DecodeError::error(
                    "job::syntax",
                    crate::kdl_fast::narrow_span(text, d.span),
                    Msg::new("diag-kdl-syntax").arg("problem", problem),
                    label,
                )
                .with_help(help)
            }),
    );
    out
}
