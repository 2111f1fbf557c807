//! What needs attention, grouped so a reader can take it in: the final
//! set's open findings first, each part or valve once with its reasons in
//! words; then what the technician accepted; then job-wide findings; then,
//! per earlier set, what was found, one line per part or valve (V3's plate,
//! screen and voltage findings form one entry). Built from the findings'
//! warnings; decides nothing.

use std::collections::HashMap;

use crate::calc::{Findings, Status, ValveFindings, Verdict, Warning};
use crate::catalogue::{Arg, Catalogue};

/// The state a table shows for a figure: its status word, or `accepted`
/// when it is off its limit and the technician accepted it.
pub fn state(v: &Verdict) -> &'static str {
    if v.accepted {
        "accepted"
    } else {
        v.status.word()
    }
}

/// A valve's state over all its checks: the worst that still counts, else
/// `accepted` when every check that is off was accepted.
pub fn valve_state(v: &ValveFindings) -> &'static str {
    if v.open_status != Status::Ok {
        v.open_status.word()
    } else if v.status != Status::Ok {
        "accepted"
    } else {
        "ok"
    }
}

/// Why a figure is not ok, in a few words; empty when it is ok.
pub fn why(v: &Verdict) -> String {
    if v.status == Status::Ok {
        String::new()
    } else {
        v.brief.clone()
    }
}

/// Why a valve is not ok: the deciding figure of each check that still
/// counts (or, when all are accepted, of the accepted ones).
pub fn valve_why(v: &ValveFindings) -> String {
    let open: Vec<&str> = v
        .checks
        .iter()
        .filter(|c| c.verdict.is_open())
        .map(|c| c.verdict.brief.as_str())
        .collect();
    let shown: Vec<&str> = if open.is_empty() {
        v.checks
            .iter()
            .filter(|c| c.verdict.status != Status::Ok)
            .map(|c| c.verdict.brief.as_str())
            .collect()
    } else {
        open
    };
    shown.join(", ")
}

/// One part or valve with what is wrong with it.
#[derive(Debug, Clone, PartialEq)]
pub struct Entry {
    /// "V3 (6V6GT)", "R31", "B+3", "safety".
    pub subject: String,
    /// The worst status among its findings.
    pub status: Status,
    /// For the final set: each finding's reason in words. For an earlier
    /// set: each finding's deciding figure in a few words.
    pub lines: Vec<String>,
}

/// A finding the technician accepted.
#[derive(Debug, Clone, PartialEq)]
pub struct AcceptedEntry {
    /// "V3 (6V6GT) screen voltage", "C30".
    pub subject: String,
    pub status: Status,
    /// The deciding figure, "Vg2 111 % of max".
    pub brief: String,
    /// Why the figure is off, in words.
    pub reason: String,
    pub accepted_reason: String,
    pub by: String,
    /// ISO 8601.
    pub date: String,
}

/// What one earlier set showed.
#[derive(Debug, Clone, PartialEq)]
pub struct HistorySet {
    pub label: String,
    pub entries: Vec<Entry>,
}

#[derive(Debug, Clone, PartialEq, Default)]
pub struct Attention {
    /// The final set's label.
    pub final_label: Option<String>,
    /// Open findings of the final set.
    pub open: Vec<Entry>,
    /// Accepted findings of the final set and the job-wide tests.
    pub accepted: Vec<AcceptedEntry>,
    /// Findings that belong to no set: safety tests, the sign-off, the data.
    pub job_wide: Vec<Entry>,
    /// Each earlier (or later) set, in file order.
    pub history: Vec<HistorySet>,
}

impl Attention {
    /// Whether nothing still counts against the unit.
    pub fn all_clear(&self) -> bool {
        self.open.is_empty() && self.job_wide.iter().all(|e| e.status == Status::Ok)
    }
}

/// Adds `w` to the entry for its subject, creating it when new.
fn add(entries: &mut Vec<Entry>, w: &Warning, line: String) {
    match entries.iter_mut().find(|e| e.subject == w.subject) {
        Some(e) => {
            e.status = e.status.worst(w.status);
            if !e.lines.contains(&line) {
                e.lines.push(line);
            }
        }
        None => entries.push(Entry {
            subject: w.subject.clone(),
            status: w.status,
            lines: vec![line],
        }),
    }
}

fn accepted_entry(w: &Warning, cat: &Catalogue) -> AcceptedEntry {
    let subject = match w.check {
        Some(check) if check != "rectifier_load" => {
            format!("{} {}", w.subject, crate::calc::check_words(check, cat))
        }
        _ => w.subject.clone(),
    };
    AcceptedEntry {
        subject,
        status: w.status,
        brief: w.brief.clone(),
        reason: w.reason.clone(),
        accepted_reason: w.accepted_reason.clone().unwrap_or_default(),
        by: w.accepted_by.clone().unwrap_or_default(),
        date: w.accepted_date.clone().unwrap_or_default(),
    }
}

/// Groups the findings' warnings.
pub fn attention(findings: &Findings, cat: &Catalogue) -> Attention {
    let mut out = Attention {
        final_label: findings.final_set.clone(),
        ..Attention::default()
    };
    // Each earlier set's place in `out.history`, found by its label in
    // constant time however many sets the job has.
    let mut history_at: HashMap<&str, usize> = HashMap::new();
    for w in &findings.warnings {
        match &w.set {
            None if w.accepted => out.accepted.push(accepted_entry(w, cat)),
            None => add(&mut out.job_wide, w, w.reason.clone()),
            Some(_) if w.in_final_set && w.accepted => out.accepted.push(accepted_entry(w, cat)),
            Some(_) if w.in_final_set => add(&mut out.open, w, w.reason.clone()),
            Some(label) => {
                let line = if w.brief.is_empty() {
                    w.reason.trim_end_matches('.').to_string()
                } else if w.accepted {
                    cat.format("attention-accepted", &[("brief", Arg::from(&w.brief))])
                } else {
                    w.brief.clone()
                };
                let i = *history_at.entry(label.as_str()).or_insert_with(|| {
                    out.history.push(HistorySet {
                        label: label.clone(),
                        entries: Vec::new(),
                    });
                    out.history.len() - 1
                });
                add(&mut out.history[i].entries, w, line);
            }
        }
    }
    // History in file order of the sets (a label's first set decides).
    let mut first_set: HashMap<&str, usize> = HashMap::with_capacity(findings.sets.len());
    for (i, s) in findings.sets.iter().enumerate() {
        first_set.entry(s.label.as_str()).or_insert(i);
    }
    out.history
        .sort_by_key(|h| first_set.get(h.label.as_str()).copied());
    out
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::job;
    use crate::ratings::RatingsTable;

    fn findings(text: &str) -> Findings {
        let ratings = RatingsTable::builtin();
        let decoded = job::decode_with_ratings("t.kdl", text, &ratings)
            .unwrap_or_else(|d| panic!("{:?}", d.problems));
        crate::calc::derive(&decoded.job, &ratings)
    }

    #[test]
    fn a_valve_is_one_line_per_earlier_set_and_its_reasons_in_the_final_set() {
        let text = std::fs::read_to_string(
            std::path::Path::new(env!("CARGO_MANIFEST_DIR")).join("jobs/combo-6v6-fixed.kdl"),
        )
        .unwrap();
        let f = findings(&text);
        let a = attention(&f, Catalogue::english());
        assert_eq!(a.final_label.as_deref(), Some("as left"));
        // As found, V3 has four findings (plate, high-line plate, plate
        // voltage, screen voltage): one entry with four briefs.
        let found = &a.history[0];
        assert_eq!(found.label, "as found");
        let v3: Vec<&Entry> = found
            .entries
            .iter()
            .filter(|e| e.subject.starts_with("V3"))
            .collect();
        assert_eq!(v3.len(), 1);
        let v3_warnings = f
            .warnings
            .iter()
            .filter(|w| w.set.as_deref() == Some("as found") && w.subject.starts_with("V3"))
            .count();
        assert_eq!(v3[0].lines.len(), v3_warnings);
        assert!(
            v3[0].lines.iter().any(|l| l.starts_with("plate ")),
            "{:?}",
            v3[0].lines
        );
        // The final set's entries carry sentences.
        assert!(
            a.open
                .iter()
                .all(|e| e.lines.iter().all(|l| l.ends_with('.')))
        );
        assert!(a.history.iter().all(|h| h.label != "as left"));
    }

    #[test]
    fn earlier_sets_keep_file_order_whatever_order_their_findings_come_in() {
        let out = std::process::Command::new("bash")
            .arg(std::path::Path::new(env!("CARGO_MANIFEST_DIR")).join("scripts/gen-job.sh"))
            .arg("40")
            .output()
            .unwrap();
        let mut f = findings(&String::from_utf8(out.stdout).unwrap());
        let labels =
            |a: &Attention| -> Vec<String> { a.history.iter().map(|h| h.label.clone()).collect() };
        let earlier: Vec<String> = f.sets[..39].iter().map(|s| s.label.clone()).collect();
        let in_order = attention(&f, Catalogue::english());
        assert_eq!(labels(&in_order), earlier, "every earlier set has findings");
        f.warnings.reverse();
        let reversed = attention(&f, Catalogue::english());
        assert_eq!(labels(&reversed), earlier);
        for (a, b) in in_order.history.iter().zip(&reversed.history) {
            let subjects = |h: &HistorySet| {
                let mut s: Vec<String> = h.entries.iter().map(|e| e.subject.clone()).collect();
                s.sort();
                s
            };
            assert_eq!(subjects(a), subjects(b), "{}", a.label);
        }
    }
}
