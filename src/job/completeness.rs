//! Completeness of the readings: names a measurement set uses that the job
//! does not declare (a typo such as `B3` for `B+3` would otherwise become a
//! silent new node), and what an earlier set measured that the final set
//! does not (so the state the unit leaves in is not judged on less than was
//! found). Warnings only: the job still runs.

use miette::SourceSpan;

use crate::catalogue::Msg;

use super::decode_error::{DecodeError, did_you_mean};
use super::model::Job;

/// The known names `name` may be a slip for: those equal to it once case,
/// spaces and punctuation are set aside (`B2` for `B+2`), else the nearest
/// by spelling.
fn near<'a>(name: &str, known: &[&'a str]) -> Vec<&'a str> {
    let key = |s: &str| -> String {
        s.chars()
            .filter(|c| c.is_alphanumeric())
            .flat_map(char::to_lowercase)
            .collect()
    };
    let same: Vec<&str> = known
        .iter()
        .copied()
        .filter(|k| *k != name && key(k) == key(name))
        .collect();
    if same.is_empty() {
        did_you_mean(name, known.iter().copied())
    } else {
        same
    }
}

/// Something an earlier set measured that the final set does not.
#[derive(Debug, Clone, PartialEq)]
pub struct NotMeasuredInFinal {
    /// "valve", "node" or "heater".
    pub kind: &'static str,
    /// The position, node name or heater label ("heater" when unlabelled).
    pub name: String,
    /// The earlier set that measured it.
    pub set: String,
    /// The final set.
    pub final_set: String,
    /// The earlier reading.
    pub span: SourceSpan,
}

impl NotMeasuredInFinal {
    /// "V6 is not measured in “as left”, the final set (it was in “as found”)".
    pub fn message(&self) -> String {
        self.msg().english()
    }

    /// [`NotMeasuredInFinal::message`] as a message of the catalogue.
    pub fn msg(&self) -> Msg {
        let what: crate::catalogue::Arg = match self.kind {
            "node" => Msg::new("diag-node-named")
                .arg("name", self.name.as_str())
                .into(),
            _ => self.name.as_str().into(),
        };
        Msg::new("diag-not-in-final")
            .arg("what", what)
            .arg("final", self.final_set.as_str())
            .arg("set", self.set.as_str())
    }
}

/// Every valve, node and heater read in some other set but not in the
/// final one, once each (at its first reading).
pub fn not_measured_in_final(job: &Job) -> Vec<NotMeasuredInFinal> {
    let Some(fi) = job.final_set_index() else {
        return Vec::new();
    };
    let fin = &job.measurements[fi];
    let mut out: Vec<NotMeasuredInFinal> = Vec::new();
    let mut push = |kind: &'static str, name: &str, set: &str, span: SourceSpan| {
        if !out.iter().any(|m| m.kind == kind && m.name == name) {
            out.push(NotMeasuredInFinal {
                kind,
                name: name.to_string(),
                set: set.to_string(),
                final_set: fin.label.clone(),
                span,
            });
        }
    };
    for (i, set) in job.measurements.iter().enumerate() {
        if i == fi {
            continue;
        }
        for v in &set.valves {
            if !fin
                .valves
                .iter()
                .any(|f| f.position.value == v.position.value)
            {
                push("valve", &v.position.value, &set.label, v.position.span);
            }
        }
        for n in &set.nodes {
            if !fin.nodes.iter().any(|f| f.name.value == n.name.value) {
                push("node", &n.name.value, &set.label, n.name.span);
            }
        }
        for h in &set.heaters {
            let label = h.label.as_deref().unwrap_or("heater");
            if !fin
                .heaters
                .iter()
                .any(|f| f.label.as_deref().unwrap_or("heater") == label)
            {
                push("heater", label, &set.label, h.volts.span);
            }
        }
    }
    out
}

/// The decode warnings: undeclared node names with a "did you mean", and
/// readings missing from the final set.
pub fn warnings(job: &Job) -> Vec<DecodeError> {
    let mut out = Vec::new();
    let declared: Vec<&str> = job
        .circuit
        .nodes
        .iter()
        .chain(
            job.measurements
                .iter()
                .flat_map(|m| m.circuit_changes.nodes.iter()),
        )
        .map(|n| n.name.value.as_str())
        .collect();
    for (i, set) in job.measurements.iter().enumerate() {
        for n in &set.nodes {
            let name = n.name.value.as_str();
            if declared.contains(&name) {
                continue;
            }
            if !declared.is_empty() {
                let help = match near(name, &declared).first() {
                    Some(d) => Msg::new("diag-declare-node-or")
                        .arg("near", *d)
                        .arg("name", name),
                    None => Msg::new("diag-declare-node").arg("name", name),
                };
                out.push(
                    DecodeError::warning(
                        "job::undeclared-node",
                        n.name.span,
                        Msg::new("diag-undeclared-node")
                            .arg("name", name)
                            .arg("set", set.label.as_str()),
                        Msg::new("diag-not-declared-node"),
                    )
                    .with_help(help),
                );
                continue;
            }
            // No declarations: a name read in this set only, close to a
            // name read in another set, is likely a typo of it.
            let elsewhere: Vec<&str> = job
                .measurements
                .iter()
                .enumerate()
                .filter(|(j, _)| *j != i)
                .flat_map(|(_, m)| m.nodes.iter().map(|n| n.name.value.as_str()))
                .collect();
            if elsewhere.contains(&name) {
                continue;
            }
            if let Some(d) = near(name, &elsewhere).first() {
                out.push(
                    DecodeError::warning(
                        "job::undeclared-node",
                        n.name.span,
                        Msg::new("diag-node-only-here")
                            .arg("name", name)
                            .arg("set", set.label.as_str())
                            .arg("near", *d),
                        Msg::new("diag-different-name"),
                    )
                    .with_help(Msg::new("diag-did-you-mean").arg("name", *d)),
                );
            }
        }
    }
    for m in not_measured_in_final(job) {
        out.push(
            DecodeError::warning(
                "job::not-measured-in-final",
                m.span,
                m.msg(),
                Msg::new("diag-not-measured-in").arg("final", m.final_set.as_str()),
            )
            .with_help(Msg::new("diag-read-again").arg("final", m.final_set.as_str())),
        );
    }
    out
}
