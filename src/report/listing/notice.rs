//! The mains-safety notice in plain words, for the listing's Markdown. The
//! words come from the message catalogue, the same keys that fill
//! `templates/mains-safety.typ` in every PDF, so the two can never say
//! different things: its heading, each point's title and body, and the
//! closing deferral to local codes.

use crate::catalogue::Catalogue;

/// The notice, piece by piece.
#[derive(Debug, Clone, PartialEq, Eq)]
pub struct Notice {
    pub heading: String,
    /// Each point's title and body.
    pub points: Vec<(String, String)>,
    /// The deferral's bold opening sentence and the rest.
    pub codes_lead: String,
    pub codes_rest: String,
}

/// The points of the notice, in the order the PDF prints them.
const POINTS: [&str; 6] = ["deadly", "stored", "who", "earth", "fuses", "document"];

/// The notice in a catalogue's language.
pub fn notice_in(catalogue: &Catalogue) -> Notice {
    Notice {
        heading: catalogue.text("notice-heading"),
        points: POINTS
            .iter()
            .map(|p| {
                (
                    catalogue.text(&format!("notice-{p}-title")),
                    catalogue.text(&format!("notice-{p}")),
                )
            })
            .collect(),
        codes_lead: catalogue.text("notice-codes-title"),
        codes_rest: catalogue.text("notice-codes"),
    }
}

/// The program's notice, in English.
pub fn notice() -> Notice {
    notice_in(Catalogue::english())
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::report::handover::NOTICE_PHRASES;

    #[test]
    fn every_checked_phrase_and_point_comes_out_of_the_notice_file() {
        let n = notice();
        let all = format!(
            "{} {} {} {}",
            n.heading,
            n.points
                .iter()
                .map(|(t, b)| format!("{t} {b}"))
                .collect::<Vec<_>>()
                .join(" "),
            n.codes_lead,
            n.codes_rest
        );
        for phrase in NOTICE_PHRASES {
            assert!(all.contains(phrase), "{phrase} missing from {all}");
        }
        let titles: Vec<&str> = n.points.iter().map(|(t, _)| t.as_str()).collect();
        assert_eq!(
            titles,
            [
                "Deadly voltages",
                "Stored charge",
                "Who may open it",
                "Earth",
                "Fuses",
                "This document"
            ]
        );
        // Nothing of the Typst code comes through.
        assert!(!all.contains('#') && !all.contains("text("), "{all}");
    }
}
