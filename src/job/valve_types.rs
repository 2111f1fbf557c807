//! Checks the valve line-up against the ratings table: every type must be
//! known (with the nearest names suggested when not), and the rectifier
//! named in the circuit must be a rectifier.

use super::decode_error::DecodeError;
use super::model::{Job, RectifierKind, Role};
use crate::ratings::RatingsTable;

pub fn check(job: &Job, ratings: &RatingsTable) -> Vec<DecodeError> {
    let mut out = Vec::new();
    for v in job.valves.iter().filter(|v| !v.type_name.value.is_empty()) {
        match ratings.lookup(&v.type_name.value) {
            Ok(rating) => {
                let output_class = rating.class.is_output();
                if v.role == Role::Output && !output_class {
                    out.push(DecodeError::warning(
                        "job::role-mismatch",
                        v.type_name.span,
                        format!(
                            "{} is listed as an output valve, but the ratings table has {} as a {}",
                            v.position.value, rating.name, rating.class
                        ),
                        "unusual role for this type",
                    ));
                }
                if v.role == Role::Rectifier && !rating.class.is_rectifier() {
                    out.push(DecodeError::error(
                        "job::role-mismatch",
                        v.type_name.span,
                        format!(
                            "{} is listed as the rectifier, but {} is a {}",
                            v.position.value, rating.name, rating.class
                        ),
                        "not a rectifier",
                    ));
                }
            }
            Err(unknown) => {
                let help = if unknown.suggestions.is_empty() {
                    "see `ampreport tubes` for the known types, or add it with a shop ratings file (--ratings FILE)".to_string()
                } else {
                    format!(
                        "did you mean {}? (`ampreport tubes` lists every type; a shop ratings file can add one)",
                        unknown.suggestions.join(", ")
                    )
                };
                out.push(
                    DecodeError::error(
                        "job::unknown-valve-type",
                        v.type_name.span,
                        format!(
                            "unknown valve type \"{}\" at {}",
                            v.type_name.value, v.position.value
                        ),
                        "not in the ratings table",
                    )
                    .with_help(help),
                );
            }
        }
    }
    for c in
        std::iter::once(&job.circuit).chain(job.measurements.iter().map(|m| &m.circuit_changes))
    {
        if let Some(rect) = &c.rectifier
            && let RectifierKind::Valve(pos) = &rect.kind
            && let Some(v) = job.valve(&pos.value)
            && let Ok(rating) = ratings.lookup(&v.type_name.value)
            && !rating.class.is_rectifier()
        {
            out.push(
                DecodeError::error(
                    "job::not-a-rectifier",
                    pos.span,
                    format!(
                        "the rectifier is {} ({}), which is not a rectifier valve",
                        pos.value, rating.name
                    ),
                    "not a rectifier",
                )
                .with_help("write `rectifier silicon` for a solid-state rectifier"),
            );
        }
    }
    out
}
