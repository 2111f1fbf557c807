//! Checks the valve line-up against the ratings table: every type must be
//! known (with the nearest names suggested when not), and the rectifier
//! named in the circuit must be a rectifier.

use super::decode_error::DecodeError;
use super::model::{Job, RectifierKind, Role};
use crate::catalogue::Msg;
use crate::ratings::RatingsTable;

pub fn check(job: &Job, ratings: &RatingsTable) -> Vec<DecodeError> {
    let mut out = Vec::new();
    // The line-up, and each type a set fits instead (with its role).
    let mut fitted: Vec<super::model::ValvePosition> = job.valves.clone();
    for set in &job.measurements {
        for c in &set.valve_types {
            if let Some(v) = job.valve(&c.position.value) {
                let mut v = v.clone();
                v.type_name = c.type_name.clone();
                fitted.push(v);
            }
        }
    }
    for v in fitted.iter().filter(|v| !v.type_name.value.is_empty()) {
        match ratings.lookup(&v.type_name.value) {
            Ok(rating) => {
                let output_class = rating.class.is_output();
                if v.role == Role::Output && !output_class {
                    out.push(DecodeError::warning(
                        "job::role-mismatch",
                        v.type_name.span,
                        Msg::new("diag-output-role-mismatch")
                            .arg("position", v.position.value.as_str())
                            .arg("type", rating.name.to_string())
                            .arg("class", Msg::new(rating.class.words_key())),
                        Msg::new("diag-unusual-role"),
                    ));
                }
                if v.role == Role::Rectifier && !rating.class.is_rectifier() {
                    out.push(DecodeError::error(
                        "job::role-mismatch",
                        v.type_name.span,
                        Msg::new("diag-rectifier-mismatch")
                            .arg("position", v.position.value.as_str())
                            .arg("type", rating.name.to_string())
                            .arg("class", Msg::new(rating.class.words_key())),
                        Msg::new("diag-not-a-rectifier"),
                    ));
                }
            }
            Err(unknown) => {
                let help = if unknown.suggestions.is_empty() {
                    Msg::new("diag-valve-type-help")
                } else {
                    Msg::new("diag-valve-type-did-you-mean")
                        .arg("names", unknown.suggestions.join(", "))
                };
                out.push(
                    DecodeError::error(
                        "job::unknown-valve-type",
                        v.type_name.span,
                        Msg::new("diag-unknown-valve-type")
                            .arg("type", v.type_name.value.as_str())
                            .arg("position", v.position.value.as_str()),
                        Msg::new("diag-not-in-ratings"),
                    )
                    .with_help(help),
                );
            }
        }
    }
    // The rectifier as each set fits it (and as the circuit block states it).
    let mut fitted_rectifiers: Vec<(super::model::Spanned<String>, super::model::ValvePosition)> =
        Vec::new();
    let base = std::iter::once((std::borrow::Cow::Borrowed(&job.circuit), None));
    let sets = job
        .measurements
        .iter()
        .map(|s| (job.circuit_for(s), Some(s)));
    for (c, set) in base.chain(sets) {
        if let Some(rect) = &c.rectifier
            && let RectifierKind::Valve(pos) = &rect.kind
        {
            let v = match set {
                Some(set) => job.valve_in(set, &pos.value),
                None => job.valve(&pos.value).cloned(),
            };
            if let Some(v) = v {
                fitted_rectifiers.push((pos.clone(), v));
            }
        }
    }
    for (pos, v) in fitted_rectifiers {
        if let Ok(rating) = ratings.lookup(&v.type_name.value)
            && !rating.class.is_rectifier()
            && !out
                .iter()
                .any(|e| e.span == pos.span && e.code == "job::not-a-rectifier")
        {
            out.push(
                DecodeError::error(
                    "job::not-a-rectifier",
                    pos.span,
                    Msg::new("diag-rectifier-not-rectifier")
                        .arg("position", pos.value.as_str())
                        .arg("type", rating.name.to_string()),
                    Msg::new("diag-not-a-rectifier"),
                )
                .with_help(Msg::new("diag-write-silicon")),
            );
        }
    }
    out
}

#[cfg(test)]
mod tests {
    use crate::ratings::RatingsTable;

    /// The codes and places of the problems decoding `text` gives.
    fn problems(text: &str) -> Vec<(&'static str, usize)> {
        let ratings = RatingsTable::builtin();
        match super::super::decode_with_ratings("j.kdl", text, &ratings) {
            Ok(d) => d
                .diagnostics
                .problems
                .iter()
                .map(|p| (p.code, p.span.offset()))
                .collect(),
            Err(d) => d
                .problems
                .iter()
                .map(|p| (p.code, p.span.offset()))
                .collect(),
        }
    }

    #[test]
    fn the_rectifier_is_checked_as_each_set_fits_it() {
        let demo = include_str!("../../jobs/combo-6v6-fixed.kdl");
        let named = demo.find("rectifier V5").expect("the circuit names V5") + "rectifier ".len();
        let fits = |text: &str| {
            problems(text)
                .into_iter()
                .filter(|&(code, _)| code == "job::not-a-rectifier")
                .map(|(_, at)| at)
                .collect::<Vec<_>>()
        };
        // The demo fits a 5V4G for its later set: no complaint.
        assert_eq!(fits(demo), Vec::<usize>::new());
        // A set that fits an output valve in the rectifier's place: one
        // problem, at the circuit's naming of V5 (said once, whatever the
        // number of sets that fit it).
        let swapped = demo.replace("    valve V5 type=\"5V4G\"", "    valve V5 type=\"6V6GT\"");
        assert_ne!(swapped, demo);
        assert_eq!(fits(&swapped), vec![named]);
        // The line-up itself holding an output valve there, listed as a
        // preamp (so the role check is quiet): the same problem, once.
        let lineup = swapped.replace(
            "valve V5 type=\"5Y3GT\" role=rectifier",
            "valve V5 type=\"6L6GC\" role=preamp",
        );
        assert_ne!(lineup, swapped);
        assert_eq!(fits(&lineup), vec![named + lineup.len() - swapped.len()]);
    }
}
