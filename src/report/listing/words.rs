//! Every fixed word the listing prints, in one place: the headings and
//! labels the PDF template and the Markdown share (so the two always say
//! the same), and the sentences the context builds from the findings.
//! Moving the listing to a message catalogue, or to another language,
//! means changing this file only.

use serde::Serialize;

/// The headings and labels of the listing, for the template (as `words`)
/// and the Markdown.
#[derive(Debug, Clone, Copy, Serialize)]
pub struct Words {
    pub kicker: &'static str,
    pub serviced_by: &'static str,
    pub service_record: &'static str,
    pub the_unit: &'static str,
    pub make: &'static str,
    pub model: &'static str,
    pub year: &'static str,
    pub serial: &'static str,
    pub mains: &'static str,
    pub description: &'static str,
    pub condition: &'static str,
    pub health: &'static str,
    pub check: &'static str,
    pub state: &'static str,
    pub in_words: &'static str,
    pub output_valve: &'static str,
    pub valve_type: &'static str,
    pub bias: &'static str,
    pub idle: &'static str,
    pub high_line: &'static str,
    pub safety_tests: &'static str,
    pub no_safety_tests: &'static str,
    pub limit: &'static str,
    pub serviced: &'static str,
    pub part: &'static str,
    pub was: &'static str,
    pub now: &'static str,
    pub why: &'static str,
    pub no_parts: &'static str,
    pub findings: &'static str,
    pub work: &'static str,
    pub originality: &'static str,
    pub item: &'static str,
    pub change: &'static str,
    pub reversible: &'static str,
    pub original_kept: &'static str,
    pub not_listed: &'static str,
    pub notes: &'static str,
    pub photos: &'static str,
    pub made_with: &'static str,
    pub commit: &'static str,
    pub edits: &'static str,
    pub job_file_sha: &'static str,
    pub page: &'static str,
    pub of: &'static str,
}

/// The listing's words, in English.
pub const WORDS: Words = Words {
    kicker: "Condition report",
    serviced_by: "Serviced by",
    service_record: "service record",
    the_unit: "The unit",
    make: "Make",
    model: "Model",
    year: "Year",
    serial: "Serial",
    mains: "Mains",
    description: "Description",
    condition: "Condition",
    health: "Health as it left the bench",
    check: "Check",
    state: "State",
    in_words: "In words",
    output_valve: "Output valve",
    valve_type: "Type",
    bias: "Bias",
    idle: "Idle, % of plate rating",
    high_line: "At high line",
    safety_tests: "Electrical safety tests",
    no_safety_tests: "No electrical safety tests were recorded.",
    limit: "limit",
    serviced: "What was serviced",
    part: "Part",
    was: "Was",
    now: "Now",
    why: "Why",
    no_parts: "No parts were replaced.",
    findings: "Findings",
    work: "Work done",
    originality: "Originality",
    item: "Item",
    change: "Change",
    reversible: "Reversible",
    original_kept: "Original kept",
    not_listed: "Anything not listed was not changed in this service; whether it is the maker's original was not checked.",
    notes: "Notes",
    photos: "Photos",
    made_with: "Made with ampreport",
    commit: "commit",
    edits: "+ edits",
    job_file_sha: "job file SHA-256",
    page: "Page",
    of: "of",
};

/// The PDF's title: "Condition report: Corvane Duet 15 (1964)".
pub fn title(name: &str) -> String {
    format!("{}: {name}", WORDS.kicker)
}

/// The PDF's description.
pub fn description(name: &str) -> String {
    format!("Condition and service summary of a {name}, for a listing")
}

pub const NO_MEASUREMENTS: &str = "No measurements were recorded for this service.";

/// The health headline when nothing still counts against the unit;
/// `accepted` findings the technician judged acceptable.
pub fn all_inside(accepted: usize) -> String {
    format!(
        "As it left the bench, every figure measured is inside its limits{}.",
        match accepted {
            0 => String::new(),
            1 => ", apart from one the technician judged acceptable".to_string(),
            n => format!(", apart from {n} the technician judged acceptable"),
        }
    )
}

/// The health headline when families still need attention.
pub fn needs_attention(families: &str) -> String {
    format!("As it left the bench, still needing attention: {families}.")
}

/// A family whose only findings were judged acceptable.
pub fn accepted_only(what: &str) -> String {
    format!("inside the limits, apart from what the technician judged acceptable: {what}")
}

/// "Readings “as left”".
pub fn readings(label: &str) -> String {
    format!("Readings \u{201c}{label}\u{201d}")
}

/// ", at 121 V mains".
pub fn at_mains(volts: &str) -> String {
    format!(", at {volts} mains")
}

pub const STATE_ACCEPTED: &str = "accepted";
pub const STATE_OK: &str = "ok";
pub const STATE_NOT_MEASURED: &str = "not measured";
pub const CHANGE_REPLACED: &str = "replaced";
pub const CHANGE_MODIFIED: &str = "modified";

/// The ledger's summary pieces.
pub fn parts_replaced(n: usize) -> String {
    match n {
        0 => "no parts replaced".to_string(),
        1 => "1 part replaced".to_string(),
        n => format!("{n} parts replaced"),
    }
}

/// "no modifications", "2 modifications (all reversible)" …
pub fn modifications(n: usize, reversible: usize) -> String {
    if n == 0 {
        return "no modifications".to_string();
    }
    format!(
        "{n} modification{} ({})",
        if n == 1 { "" } else { "s" },
        match (reversible, n) {
            (1, 1) => "reversible".to_string(),
            (r, n) if r == n => "all reversible".to_string(),
            (0, _) => "not stated as reversible".to_string(),
            (r, _) => format!("{r} reversible"),
        }
    )
}

/// "original parts kept: C2; V5".
pub fn originals_kept(list: &str) -> String {
    format!("original parts kept: {list}")
}

/// "a, b and c".
pub fn and_list(items: &[String]) -> String {
    match items {
        [] => String::new(),
        [one] => one.clone(),
        [rest @ .., last] => format!("{} and {last}", rest.join(", ")),
    }
}
