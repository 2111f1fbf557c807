//! The listing's context: what a buyer may read about the unit, taken from
//! the job and its [`Findings`], already formatted as text.
//!
//! What a listing must never show is left out *here*, not hidden by the
//! template: there is no field for the customer or their contacts, the
//! charges, the complaint, a remark, part or mod marked `private`, or the
//! reasons the technician gave when accepting a figure. A template (the
//! built-in one or a shop's own) cannot print what it is not given.
//!
//! Health is judged as calc judged it: the at-a-glance families of the
//! final set, each valve's state over its checks, the safety tests'
//! verdicts. Nothing here decides a status.

use serde::Serialize;

use crate::calc::{FamilyStatus, Findings, Status};
use crate::job::Job;
use crate::report::attention;
use crate::report::handover::{
    DocumentInfo, SafetyContext, ShopBlock, glue_units, paper, pct0, reflow, safety_context, volts,
    yes_no,
};
use crate::report::photos::PhotoRow;
use crate::shop::ShopProfile;

use super::words::{self, Words};
use crate::catalogue::Catalogue;

/// How the unit's serial number is shown.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Default, Serialize)]
#[serde(rename_all = "snake_case")]
pub enum SerialShown {
    /// As written.
    #[default]
    Shown,
    /// Every letter and digit but the last two replaced by a bullet.
    Masked,
    /// Left out.
    Hidden,
}

impl SerialShown {
    pub const NAMES: [&'static str; 3] = ["shown", "masked", "hidden"];

    pub fn from_name(name: &str) -> Option<SerialShown> {
        Some(match name {
            "shown" => SerialShown::Shown,
            "masked" => SerialShown::Masked,
            "hidden" => SerialShown::Hidden,
            _ => return None,
        })
    }

    /// The serial as the listing shows it, or none.
    pub fn apply(self, serial: &str) -> Option<String> {
        match self {
            SerialShown::Shown => Some(serial.to_string()),
            SerialShown::Hidden => None,
            SerialShown::Masked => Some(mask_serial(serial)),
        }
    }
}

/// Every letter and digit but the last two replaced by `•`; separators
/// stay, so the shape of the number still shows.
pub fn mask_serial(serial: &str) -> String {
    let total = serial.chars().filter(|c| c.is_alphanumeric()).count();
    let mut seen = 0;
    serial
        .chars()
        .map(|c| {
            if c.is_alphanumeric() {
                seen += 1;
                if seen + 2 <= total { '\u{2022}' } else { c }
            } else {
                c
            }
        })
        .collect()
}

/// Everything the listing template is given (besides `font_rules`).
#[derive(Debug, Clone, Serialize)]
pub struct ListingContext {
    /// The fixed headings and labels.
    pub words: Words,
    pub document: DocumentInfo,
    pub shop: ShopBlock,
    pub unit: ListingUnit,
    /// The service date in words: the completion date, else the date the
    /// unit came in; none when the job gives neither.
    pub date: Option<String>,
    /// The shop's reference for the service.
    pub job_id: String,
    /// "120 V 60 Hz".
    pub mains: String,
    pub health: Health,
    /// The parts replaced, in plain words.
    pub serviced: Vec<ServicedRow>,
    /// The technician's account of the work and the findings, unless
    /// marked private.
    pub work: Option<String>,
    pub findings: Option<String>,
    pub ledger: Ledger,
    /// Notes not marked private.
    pub notes: Vec<String>,
    /// The photos marked for the listing.
    pub photos: Vec<PhotoRow>,
    pub footer: ListingFooter,
}

#[derive(Debug, Clone, Serialize)]
pub struct ListingUnit {
    pub make: String,
    pub model: String,
    pub year: Option<String>,
    /// As [`SerialShown`] says: shown, masked or none.
    pub serial: Option<String>,
    pub description: Option<String>,
    pub condition: Option<String>,
}

/// The unit's health as it left the bench.
#[derive(Debug, Clone, Serialize)]
pub struct Health {
    /// One sentence on the whole.
    pub headline: String,
    /// True when nothing still counts against the unit.
    pub healthy: bool,
    /// Which readings it speaks for: "Readings “as left”, 12 November 2026,
    /// at 121 V mains".
    pub basis: Option<String>,
    /// One row per family of checks.
    pub families: Vec<FamilyRow>,
    /// The output valves at idle in the final readings.
    pub valves: Vec<ValveHealthRow>,
    /// The safety tests, with their verdicts.
    pub safety: SafetyContext,
    /// When the safety tests were made, in words (the completion date).
    pub safety_date: Option<String>,
}

#[derive(Debug, Clone, Serialize)]
pub struct FamilyRow {
    pub title: String,
    /// ok, cold, caution, over, accepted, or "not measured".
    pub state: String,
    pub words: String,
}

#[derive(Debug, Clone, Serialize)]
pub struct ValveHealthRow {
    pub position: String,
    pub type_name: String,
    /// "cathode" or "fixed".
    pub bias: String,
    /// Plate dissipation as % of the rating, whole percent.
    pub idle_pct: Option<String>,
    pub high_line_pct: Option<String>,
    /// The valve's state over its checks: ok, caution, over, cold or accepted.
    pub state: String,
}

#[derive(Debug, Clone, Serialize)]
pub struct ServicedRow {
    /// "C31", "Power switch".
    pub part: String,
    pub was: Option<String>,
    pub now: Option<String>,
    /// Why, unless the part is marked private.
    pub reason: Option<String>,
}

/// What is original and what is not, as far as this service knows.
#[derive(Debug, Clone, Serialize)]
pub struct Ledger {
    pub rows: Vec<LedgerRow>,
    /// "2 parts replaced; 1 modification (reversible); originals kept: C2, V5."
    pub summary: String,
}

#[derive(Debug, Clone, Serialize)]
pub struct LedgerRow {
    pub item: String,
    /// "replaced" or "modified".
    pub change: String,
    /// "yes", "no", or none when not stated.
    pub reversible: Option<String>,
    pub original_kept: Option<String>,
    /// Why, for a modification not marked private.
    pub why: Option<String>,
}

#[derive(Debug, Clone, Serialize)]
pub struct ListingFooter {
    pub shop: Option<String>,
    pub job_id: String,
    pub tool_version: String,
    pub typst_version: String,
    pub job_digest: String,
    pub commit: Option<String>,
    pub uncommitted_changes: bool,
}

/// A listing photo as a file written beside the Markdown.
#[derive(Debug, Clone, PartialEq, Eq)]
pub struct PhotoFile {
    /// Its name, beside the Markdown: `NAME.listing-photo-1.jpg`.
    pub file_name: String,
    pub caption: Option<String>,
}

/// Inputs of [`build_context`] that do not come from the job.
#[derive(Debug, Clone)]
pub struct ListingInputs<'a> {
    pub shop: ShopBlock,
    pub profile: Option<&'a ShopProfile>,
    pub serial: SerialShown,
    pub tool_version: &'a str,
    pub typst_version: &'a str,
    pub job_digest: &'a str,
    pub revision: Option<&'a crate::git::Revision>,
    /// The photos marked for the listing.
    pub photos: Vec<PhotoRow>,
    /// The listing's words, in the shop's language.
    pub catalogue: &'a Catalogue,
}

/// A family's row: its state as calc left it, and words that never carry
/// the technician's reasons for accepting.
fn family_row(f: &FamilyStatus, cat: &Catalogue) -> FamilyRow {
    let accepted: Vec<String> = f
        .accepted
        .iter()
        .map(|a| match &a.check {
            Some(check) => format!("{} {check}", a.subject),
            None => a.subject.clone(),
        })
        .collect();
    let (state, words) = if f.status != Status::Ok {
        (words::state(f.status.word(), cat), f.worst.clone())
    } else if !accepted.is_empty() {
        (
            words::state("accepted", cat),
            words::accepted_only(&cat.and_list(&accepted), cat),
        )
    } else if f.measured {
        (words::state("ok", cat), f.worst.clone())
    } else {
        (words::state("not-measured", cat), f.worst.clone())
    };
    FamilyRow {
        title: f.title.to_string(),
        state,
        words: glue_units(&words),
    }
}

fn health(job: &Job, findings: &Findings, cat: &Catalogue) -> Health {
    let final_set = findings.sets.iter().find(|s| s.is_final);
    let families: Vec<FamilyRow> = findings
        .at_a_glance
        .iter()
        .map(|f| family_row(f, cat))
        .collect();
    let open: Vec<&FamilyStatus> = findings
        .at_a_glance
        .iter()
        .filter(|f| f.status != Status::Ok)
        .collect();
    let accepted: usize = findings.at_a_glance.iter().map(|f| f.accepted.len()).sum();
    let healthy = final_set.is_some() && open.is_empty();
    let headline = match final_set {
        None => cat.text("listing-no-measurements"),
        Some(_) if open.is_empty() => words::all_inside(accepted, cat),
        Some(_) => {
            let titles: Vec<String> = open.iter().map(|f| f.title.to_lowercase()).collect();
            words::needs_attention(&cat.and_list(&titles), cat)
        }
    };
    let basis = final_set.map(|set| {
        let mut said = words::readings(&set.label, cat);
        if let Some(d) = set
            .date
            .as_deref()
            .and_then(|d| chrono::NaiveDate::parse_from_str(d, "%Y-%m-%d").ok())
        {
            said.push_str(&format!(", {}", cat.date(d)));
        }
        said.push_str(&words::at_mains(&volts(set.mains_volts), cat));
        glue_units(&said)
    });
    let valves = final_set
        .map(|set| {
            set.valves
                .iter()
                .filter(|v| v.is_output)
                .map(|v| ValveHealthRow {
                    position: match &v.channel {
                        Some(channel) => format!("{} ({channel})", v.position),
                        None => v.position.clone(),
                    },
                    type_name: v.valve_type.clone(),
                    bias: cat
                        .try_format(&format!("listing-bias-{}", v.bias), &[])
                        .unwrap_or_else(|| v.bias.clone()),
                    idle_pct: v.plate_dissipation_pct.map(pct0),
                    high_line_pct: v.high_line_plate_dissipation_pct.map(pct0),
                    state: words::state(attention::valve_state(v), cat),
                })
                .collect()
        })
        .unwrap_or_default();
    Health {
        headline,
        healthy,
        basis,
        families,
        valves,
        safety: safety_context(job, findings, cat),
        safety_date: job
            .safety
            .as_ref()
            .and(job.info.completed.or(job.info.received))
            .map(|d| cat.date(d)),
    }
}

fn ledger(job: &Job, cat: &Catalogue) -> Ledger {
    let mut rows: Vec<LedgerRow> = job
        .parts
        .iter()
        .map(|p| LedgerRow {
            item: part_words(p),
            change: words::change(false, cat),
            reversible: None,
            original_kept: yes_no(p.original_kept, cat),
            why: None,
        })
        .collect();
    rows.extend(job.mods.iter().map(|m| {
        LedgerRow {
            item: glue_units(&reflow(&m.what)),
            change: words::change(true, cat),
            reversible: yes_no(m.reversible, cat),
            original_kept: yes_no(m.original_kept, cat),
            why: m
                .why
                .as_deref()
                .filter(|_| !m.private)
                .map(|w| glue_units(&reflow(w))),
        }
    }));
    let reversible = job
        .mods
        .iter()
        .filter(|m| m.reversible == Some(true))
        .count();
    let mut said = vec![
        words::parts_replaced(job.parts.len(), cat),
        words::modifications(job.mods.len(), reversible, cat),
    ];
    let kept: Vec<String> = job
        .parts
        .iter()
        .filter(|p| p.original_kept == Some(true))
        .map(|p| p.name().to_string())
        .chain(
            job.mods
                .iter()
                .filter(|m| m.original_kept == Some(true))
                .map(|m| glue_units(&reflow(&m.what))),
        )
        .collect();
    if !kept.is_empty() {
        said.push(words::originals_kept(&kept.join("; "), cat));
    }
    let mut summary = said.join("; ");
    if let Some(first) = summary.get(..1) {
        summary = first.to_uppercase() + &summary[1..];
    }
    summary.push('.');
    Ledger { rows, summary }
}

/// "C31", "Power switch", or "R31 (dropper)".
fn part_words(p: &crate::job::PartChange) -> String {
    match (&p.reference, &p.what) {
        (Some(r), Some(w)) => format!("{r} ({w})"),
        (Some(r), None) => r.clone(),
        (None, Some(w)) => w.clone(),
        (None, None) => String::new(),
    }
}

/// Builds the listing's context. See the module's notes for what is left
/// out.
pub fn build_context(job: &Job, findings: &Findings, inputs: &ListingInputs<'_>) -> ListingContext {
    let unit = &job.unit;
    let year = unit.year.map(|y| y.to_string());
    let name = match &year {
        Some(y) => format!("{} {} ({y})", unit.make, unit.model),
        None => format!("{} {}", unit.make, unit.model),
    };
    let mut authors = Vec::new();
    if !inputs.shop.neutral {
        authors.push(inputs.shop.name.clone());
    }
    let m = &findings.mains;
    let mut mains = volts(m.nominal_volts);
    if let Some(f) = m.frequency_hz {
        mains.push_str(&format!(" {} Hz", crate::units::format_sig(f, 3)));
    }
    ListingContext {
        words: Words::new(inputs.catalogue),
        document: DocumentInfo {
            title: words::title(&name, inputs.catalogue),
            author: inputs.shop.name.clone(),
            authors,
            description: words::description(&name, inputs.catalogue),
            paper: paper(inputs.profile, job).typst_name().to_string(),
            lang: inputs.catalogue.language().to_string(),
        },
        shop: inputs.shop.clone(),
        unit: ListingUnit {
            make: unit.make.clone(),
            model: unit.model.clone(),
            year,
            serial: unit.serial.as_deref().and_then(|s| inputs.serial.apply(s)),
            description: unit.description.as_deref().map(reflow),
            condition: unit.condition.as_deref().map(reflow),
        },
        date: job
            .info
            .completed
            .or(job.info.received)
            .map(|d| inputs.catalogue.date(d)),
        job_id: job.info.id.clone(),
        mains: glue_units(&mains),
        health: health(job, findings, inputs.catalogue),
        serviced: job
            .parts
            .iter()
            .map(|p| ServicedRow {
                part: part_words(p),
                was: p.was.as_deref().map(glue_units),
                now: p.now.as_deref().map(glue_units),
                reason: p
                    .reason
                    .as_deref()
                    .filter(|_| !p.private)
                    .map(|r| glue_units(&reflow(r))),
            })
            .collect(),
        work: job
            .work
            .as_ref()
            .filter(|r| !r.private)
            .map(|r| glue_units(&reflow(&r.text))),
        findings: job
            .findings
            .as_ref()
            .filter(|r| !r.private)
            .map(|r| glue_units(&reflow(&r.text))),
        ledger: ledger(job, inputs.catalogue),
        notes: job
            .notes
            .iter()
            .filter(|n| !n.private)
            .map(|n| reflow(&n.text))
            .collect(),
        photos: inputs.photos.clone(),
        footer: ListingFooter {
            shop: (!inputs.shop.neutral).then(|| {
                crate::report::plots::label_text(
                    &inputs.shop.name,
                    crate::report::handover::FOOTER_ID_CHARS,
                )
            }),
            job_id: crate::report::plots::label_text(
                &job.info.id,
                crate::report::handover::FOOTER_ID_CHARS,
            ),
            tool_version: inputs.tool_version.to_string(),
            typst_version: inputs.typst_version.to_string(),
            job_digest: inputs.job_digest.to_string(),
            commit: inputs.revision.map(|r| r.commit.clone()),
            uncommitted_changes: inputs.revision.is_some_and(|r| r.uncommitted_changes),
        },
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn a_masked_serial_keeps_its_shape_and_last_two_characters() {
        assert_eq!(mask_serial("PT-2291"), "••-••91");
        assert_eq!(mask_serial("7"), "7");
        assert_eq!(mask_serial(""), "");
        assert_eq!(SerialShown::Hidden.apply("PT-2291"), None);
        assert_eq!(
            SerialShown::Shown.apply("PT-2291").as_deref(),
            Some("PT-2291")
        );
    }
}
