//! What kind of valve a row describes, and how a rectifier is heated.
//!
//! The class decides which checks apply: output valves get the bias and
//! dissipation checks, rectifiers the current and warm-up checks, preamp
//! triodes feed the gain and corner calculations.

use serde::Serialize;
use std::fmt;

/// The job a valve type does in an amplifier.
///
/// The order of the variants is the order in which [`super::RatingsTable::iter`]
/// lists rows.
#[derive(Debug, Clone, Copy, PartialEq, Eq, PartialOrd, Ord, Hash, Serialize)]
#[serde(rename_all = "snake_case")]
pub enum ValveClass {
    OutputPentode,
    BeamTetrode,
    PowerTriode,
    PreampTriode,
    PreampPentode,
    Rectifier,
}

impl ValveClass {
    /// Every class, in listing order.
    pub const ALL: [ValveClass; 6] = [
        ValveClass::OutputPentode,
        ValveClass::BeamTetrode,
        ValveClass::PowerTriode,
        ValveClass::PreampTriode,
        ValveClass::PreampPentode,
        ValveClass::Rectifier,
    ];

    /// The spelling used in a ratings file: `output-pentode`.
    pub fn file_word(self) -> &'static str {
        match self {
            ValveClass::OutputPentode => "output-pentode",
            ValveClass::BeamTetrode => "beam-tetrode",
            ValveClass::PowerTriode => "power-triode",
            ValveClass::PreampTriode => "preamp-triode",
            ValveClass::PreampPentode => "preamp-pentode",
            ValveClass::Rectifier => "rectifier",
        }
    }

    /// The catalogue's words for the class (`doc-valve-class-…`), so a
    /// problem that quotes it is said in the reader's language.
    pub fn words_key(self) -> &'static str {
        match self {
            ValveClass::OutputPentode => "doc-valve-class-output-pentode",
            ValveClass::BeamTetrode => "doc-valve-class-beam-tetrode",
            ValveClass::PowerTriode => "doc-valve-class-power-triode",
            ValveClass::PreampTriode => "doc-valve-class-preamp-triode",
            ValveClass::PreampPentode => "doc-valve-class-preamp-pentode",
            ValveClass::Rectifier => "doc-valve-class-rectifier",
        }
    }

    /// Reads the ratings-file spelling.
    pub fn from_file_word(word: &str) -> Option<ValveClass> {
        ValveClass::ALL.into_iter().find(|c| c.file_word() == word)
    }

    /// Output (power) valves: pentodes, beam tetrodes and power triodes. These
    /// are the ones whose idle dissipation is checked against a rating.
    pub fn is_output(&self) -> bool {
        matches!(
            self,
            ValveClass::OutputPentode | ValveClass::BeamTetrode | ValveClass::PowerTriode
        )
    }

    /// Valve rectifiers.
    pub fn is_rectifier(&self) -> bool {
        *self == ValveClass::Rectifier
    }

    /// Valves with a screen grid, for which screen ratings make sense.
    pub fn has_screen(self) -> bool {
        matches!(
            self,
            ValveClass::OutputPentode | ValveClass::BeamTetrode | ValveClass::PreampPentode
        )
    }
}

impl fmt::Display for ValveClass {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        f.write_str(match self {
            ValveClass::OutputPentode => "output pentode",
            ValveClass::BeamTetrode => "beam tetrode",
            ValveClass::PowerTriode => "power triode",
            ValveClass::PreampTriode => "preamp triode",
            ValveClass::PreampPentode => "preamp pentode",
            ValveClass::Rectifier => "rectifier",
        })
    }
}

/// How a rectifier's cathode is heated. A directly heated filament conducts
/// within a second or two of switch-on, before the output valves draw
/// current, so the filter capacitors see the no-load peak; an indirectly
/// heated cathode warms up slowly, much as the output valves do.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Hash, Serialize)]
#[serde(rename_all = "snake_case")]
pub enum RectifierHeating {
    Direct,
    Indirect,
}

impl RectifierHeating {
    /// Both kinds, in file order.
    pub const ALL: [RectifierHeating; 2] = [RectifierHeating::Direct, RectifierHeating::Indirect];

    /// The spelling used in a ratings file: `direct` or `indirect`.
    pub fn file_word(self) -> &'static str {
        match self {
            RectifierHeating::Direct => "direct",
            RectifierHeating::Indirect => "indirect",
        }
    }

    /// Reads the ratings-file spelling.
    pub fn from_file_word(word: &str) -> Option<RectifierHeating> {
        RectifierHeating::ALL
            .into_iter()
            .find(|h| h.file_word() == word)
    }
}

impl fmt::Display for RectifierHeating {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        f.write_str(match self {
            RectifierHeating::Direct => "directly heated",
            RectifierHeating::Indirect => "indirectly heated",
        })
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn file_words_round_trip() {
        for class in ValveClass::ALL {
            assert_eq!(ValveClass::from_file_word(class.file_word()), Some(class));
        }
        for heating in RectifierHeating::ALL {
            assert_eq!(
                RectifierHeating::from_file_word(heating.file_word()),
                Some(heating)
            );
        }
        assert_eq!(ValveClass::from_file_word("Output-Pentode"), None);
    }

    #[test]
    fn plain_words_and_groups() {
        assert_eq!(ValveClass::OutputPentode.to_string(), "output pentode");
        assert_eq!(RectifierHeating::Indirect.to_string(), "indirectly heated");
        assert!(ValveClass::PowerTriode.is_output());
        assert!(ValveClass::BeamTetrode.is_output());
        assert!(!ValveClass::PreampTriode.is_output());
        assert!(!ValveClass::Rectifier.is_output());
        assert!(ValveClass::Rectifier.is_rectifier());
        assert!(!ValveClass::PreampPentode.is_rectifier());
    }

    #[test]
    fn serialises_in_snake_case() {
        let json = serde_json::to_string(&ValveClass::OutputPentode).unwrap();
        assert_eq!(json, "\"output_pentode\"");
        let json = serde_json::to_string(&RectifierHeating::Direct).unwrap();
        assert_eq!(json, "\"direct\"");
    }
}
