//! Every fixed word the listing prints: the headings and labels the PDF
//! template and the Markdown share (so the two always say the same), and
//! the sentences the context builds from the findings. All of them are
//! `listing-…` messages of the catalogue, in the shop's language.

use serde::Serialize;

use crate::catalogue::{Arg, Catalogue};

/// The headings and labels of the listing, for the template (as `words`)
/// and the Markdown.
#[derive(Debug, Clone, Serialize)]
pub struct Words {
    pub kicker: String,
    pub serviced_by: String,
    pub service_record: String,
    pub the_unit: String,
    pub make: String,
    pub model: String,
    pub year: String,
    pub serial: String,
    pub mains: String,
    pub description: String,
    pub condition: String,
    pub health: String,
    pub check: String,
    pub state: String,
    pub in_words: String,
    pub output_valve: String,
    pub valve_type: String,
    pub bias: String,
    pub idle: String,
    pub high_line: String,
    pub safety_tests: String,
    pub no_safety_tests: String,
    pub limit: String,
    pub serviced: String,
    pub part: String,
    pub was: String,
    pub now: String,
    pub why: String,
    pub no_parts: String,
    pub findings: String,
    pub work: String,
    pub originality: String,
    pub item: String,
    pub change: String,
    pub reversible: String,
    pub original_kept: String,
    pub not_listed: String,
    pub notes: String,
    pub photos: String,
    pub made_with: String,
    pub commit: String,
    pub edits: String,
    pub job_file_sha: String,
    pub page: String,
    pub of: String,
    /// The state word of a family or valve that is inside its limits.
    pub state_ok: String,
}

impl Words {
    /// The listing's words in `cat`'s language.
    pub fn new(cat: &Catalogue) -> Words {
        Words {
            kicker: cat.text("listing-kicker"),
            serviced_by: cat.text("listing-serviced-by"),
            service_record: cat.text("listing-service-record"),
            the_unit: cat.text("listing-the-unit"),
            make: cat.text("listing-make"),
            model: cat.text("listing-model"),
            year: cat.text("listing-year"),
            serial: cat.text("listing-serial"),
            mains: cat.text("listing-mains"),
            description: cat.text("listing-description"),
            condition: cat.text("listing-condition"),
            health: cat.text("listing-health"),
            check: cat.text("listing-check"),
            state: cat.text("listing-state"),
            in_words: cat.text("listing-in-words"),
            output_valve: cat.text("listing-output-valve"),
            valve_type: cat.text("listing-valve-type"),
            bias: cat.text("listing-bias"),
            idle: cat.text("listing-idle"),
            high_line: cat.text("listing-high-line"),
            safety_tests: cat.text("listing-safety-tests"),
            no_safety_tests: cat.text("listing-no-safety-tests"),
            limit: cat.text("listing-limit"),
            serviced: cat.text("listing-serviced"),
            part: cat.text("listing-part"),
            was: cat.text("listing-was"),
            now: cat.text("listing-now"),
            why: cat.text("listing-why"),
            no_parts: cat.text("listing-no-parts"),
            findings: cat.text("listing-findings"),
            work: cat.text("listing-work"),
            originality: cat.text("listing-originality"),
            item: cat.text("listing-item"),
            change: cat.text("listing-change"),
            reversible: cat.text("listing-reversible"),
            original_kept: cat.text("listing-original-kept"),
            not_listed: cat.text("listing-not-listed"),
            notes: cat.text("listing-notes"),
            photos: cat.text("listing-photos"),
            made_with: cat.text("listing-made-with"),
            commit: cat.text("listing-commit"),
            edits: cat.text("listing-edits"),
            job_file_sha: cat.text("listing-job-file-sha"),
            page: cat.text("listing-page"),
            of: cat.text("listing-of"),
            state_ok: state("ok", cat),
        }
    }
}

/// The PDF's title: "Condition report: Corvane Duet 15 (1964)".
pub fn title(name: &str, cat: &Catalogue) -> String {
    cat.format("listing-title", &[("name", Arg::from(name))])
}

/// The PDF's description.
pub fn description(name: &str, cat: &Catalogue) -> String {
    cat.format("listing-pdf-description", &[("name", Arg::from(name))])
}

/// The health headline when nothing still counts against the unit;
/// `accepted` findings the technician judged acceptable.
pub fn all_inside(accepted: usize, cat: &Catalogue) -> String {
    cat.format("listing-all-inside", &[("accepted", Arg::from(accepted))])
}

/// The health headline when families still need attention.
pub fn needs_attention(families: &str, cat: &Catalogue) -> String {
    cat.format(
        "listing-needs-attention",
        &[("families", Arg::from(families))],
    )
}

/// A family whose only findings were judged acceptable.
pub fn accepted_only(what: &str, cat: &Catalogue) -> String {
    cat.format("listing-accepted-only", &[("what", Arg::from(what))])
}

/// "Readings “as left”".
pub fn readings(label: &str, cat: &Catalogue) -> String {
    cat.format("listing-readings", &[("label", Arg::from(label))])
}

/// ", at 121 V mains".
pub fn at_mains(volts: &str, cat: &Catalogue) -> String {
    cat.format("listing-at-mains", &[("volts", Arg::from(volts))])
}

/// A state in words: "ok", "caution", "accepted", "not measured" (`code`
/// is the status word or `accepted`, `not-measured`).
pub fn state(code: &str, cat: &Catalogue) -> String {
    cat.try_format(
        &format!("listing-state-{}", code.replace(['_', ' '], "-")),
        &[],
    )
    .unwrap_or_else(|| code.to_string())
}

/// "replaced" or "modified".
pub fn change(modified: bool, cat: &Catalogue) -> String {
    cat.text(if modified {
        "listing-change-modified"
    } else {
        "listing-change-replaced"
    })
}

/// The ledger's summary pieces.
pub fn parts_replaced(n: usize, cat: &Catalogue) -> String {
    cat.format("listing-parts-replaced", &[("count", Arg::from(n))])
}

/// "no modifications", "2 modifications (all reversible)" …
pub fn modifications(n: usize, reversible: usize, cat: &Catalogue) -> String {
    if n == 0 {
        return cat.text("listing-no-modifications");
    }
    let how = match (reversible, n) {
        (1, 1) => cat.text("listing-how-reversible"),
        (r, n) if r == n => cat.text("listing-all-reversible"),
        (0, _) => cat.text("listing-not-reversible"),
        (r, _) => cat.format("listing-some-reversible", &[("count", Arg::from(r))]),
    };
    cat.format(
        "listing-modifications",
        &[("count", Arg::from(n)), ("how", Arg::from(how))],
    )
}

/// "original parts kept: C2; V5".
pub fn originals_kept(list: &str, cat: &Catalogue) -> String {
    cat.format("listing-originals-kept", &[("list", Arg::from(list))])
}
