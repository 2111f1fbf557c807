//! The typed shop profile: what a decoded `shop.kdl` holds.

use serde::Serialize;

pub use crate::job::ChargeTerms;
use crate::job::{JobDefaults, Spanned};

/// One shop's profile: who the shop is, how its documents look, and the
/// defaults its jobs start from.
#[derive(Debug, Clone, Serialize)]
pub struct ShopProfile {
    /// The file the profile came from, for messages.
    pub source_name: String,
    pub format_version: u32,
    pub name: String,
    /// Address lines, in order.
    pub address: Vec<String>,
    /// Contact lines (telephone, e-mail, web), in order.
    pub contact: Vec<String>,
    /// The logo file as written, relative to the profile's folder.
    pub logo: Option<Spanned<String>>,
    /// The paper size; when absent, the mains nominal decides.
    pub paper: Option<Paper>,
    /// Bands, safety limits and technician a job starts from.
    #[serde(skip)]
    pub defaults: JobDefaults,
    /// The `settings` children the profile gives.
    pub settings_given: Vec<String>,
    pub warranty: Option<Warranty>,
    /// Terms shown on the document.
    pub terms: Option<String>,
    /// The pattern of the shop's job ids (`D-{yymm}-{nnn}`), checked; see
    /// [`crate::job::numbering`].
    pub job_numbers: Option<String>,
    /// The documents' language and the shop's translation file, if any;
    /// none for English.
    pub language: Option<Language>,
}

/// `language "de" file="…"` of a profile.
#[derive(Debug, Clone, Serialize)]
pub struct Language {
    /// The language tag as written: "de", "de-AT".
    pub tag: Spanned<String>,
    /// A translation file relative to the profile's folder.
    pub file: Option<Spanned<String>>,
}

/// The page size of the document.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Serialize)]
#[serde(rename_all = "snake_case")]
pub enum Paper {
    A4,
    Letter,
}

impl Paper {
    pub const NAMES: [&'static str; 2] = ["a4", "letter"];

    pub fn from_name(name: &str) -> Option<Paper> {
        match name.to_ascii_lowercase().as_str() {
            "a4" => Some(Paper::A4),
            "letter" | "us-letter" => Some(Paper::Letter),
            _ => None,
        }
    }

    /// The paper name typst knows.
    pub fn typst_name(self) -> &'static str {
        match self {
            Paper::A4 => "a4",
            Paper::Letter => "us-letter",
        }
    }

    /// The default for a mains nominal: US Letter where the mains is
    /// 100–130 V (North and Central America, Japan and others that use
    /// that paper or sit beside countries that do), A4 elsewhere.
    pub fn for_mains(nominal_volts: f64) -> Paper {
        if (100.0..=130.0).contains(&nominal_volts) {
            Paper::Letter
        } else {
            Paper::A4
        }
    }
}

/// The shop's warranty on its work.
#[derive(Debug, Clone, Serialize)]
pub struct Warranty {
    pub text: String,
    pub period: Option<Period>,
}

/// A length of time: "90 days", "6 months", "1 year".
#[derive(Debug, Clone, Copy, PartialEq, Eq, Serialize)]
pub struct Period {
    pub count: u32,
    pub unit: PeriodUnit,
}

#[derive(Debug, Clone, Copy, PartialEq, Eq, Serialize)]
#[serde(rename_all = "snake_case")]
pub enum PeriodUnit {
    Days,
    Weeks,
    Months,
    Years,
}

impl Period {
    /// Reads "90 days", "1 year", "6 months", "12 weeks".
    pub fn parse(text: &str) -> Option<Period> {
        let mut words = text.split_whitespace();
        let count: u32 = words.next()?.parse().ok()?;
        let unit = match words.next()?.to_ascii_lowercase().as_str() {
            "day" | "days" => PeriodUnit::Days,
            "week" | "weeks" => PeriodUnit::Weeks,
            "month" | "months" => PeriodUnit::Months,
            "year" | "years" => PeriodUnit::Years,
            _ => return None,
        };
        if words.next().is_some() || count == 0 || count > 3650 {
            return None;
        }
        Some(Period { count, unit })
    }

    /// "90 days", "1 year".
    pub fn words(self) -> String {
        let (one, many) = match self.unit {
            PeriodUnit::Days => ("day", "days"),
            PeriodUnit::Weeks => ("week", "weeks"),
            PeriodUnit::Months => ("month", "months"),
            PeriodUnit::Years => ("year", "years"),
        };
        format!(
            "{} {}",
            self.count,
            if self.count == 1 { one } else { many }
        )
    }

    /// The last day covered when the period starts on `start`: a period
    /// of 90 days from 9 November covers up to 7 February (the day 90 days
    /// on), a month from 31 January ends on the last day of February.
    pub fn end_from(self, start: chrono::NaiveDate) -> Option<chrono::NaiveDate> {
        use chrono::{Days, Months};
        match self.unit {
            PeriodUnit::Days => start.checked_add_days(Days::new(u64::from(self.count))),
            PeriodUnit::Weeks => start.checked_add_days(Days::new(7 * u64::from(self.count))),
            PeriodUnit::Months => start.checked_add_months(Months::new(self.count)),
            PeriodUnit::Years => start.checked_add_months(Months::new(12 * self.count)),
        }
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use chrono::NaiveDate;

    #[test]
    fn periods_read_and_end_on_the_calendar() {
        let p = Period::parse("90 days").unwrap();
        assert_eq!(p.words(), "90 days");
        let start = NaiveDate::from_ymd_opt(2026, 11, 9).unwrap();
        // 9 November + 90 days: 21 days to 30 November, 31 in December,
        // 31 in January (83), so 7 more: 7 February 2027.
        assert_eq!(p.end_from(start), NaiveDate::from_ymd_opt(2027, 2, 7));
        let m = Period::parse("1 Month").unwrap();
        assert_eq!(m.words(), "1 month");
        // chrono clamps to the last day of a shorter month.
        assert_eq!(
            m.end_from(NaiveDate::from_ymd_opt(2027, 1, 31).unwrap()),
            NaiveDate::from_ymd_opt(2027, 2, 28)
        );
        assert_eq!(
            Period::parse("2 years").unwrap().end_from(start),
            NaiveDate::from_ymd_opt(2028, 11, 9)
        );
        for bad in [
            "",
            "days",
            "0 days",
            "ninety days",
            "3 fortnights",
            "1 year extra",
            "-1 days",
        ] {
            assert_eq!(Period::parse(bad), None, "{bad}");
        }
    }

    #[test]
    fn paper_follows_the_mains_nominal() {
        assert_eq!(Paper::for_mains(120.0), Paper::Letter);
        assert_eq!(Paper::for_mains(100.0), Paper::Letter);
        assert_eq!(Paper::for_mains(130.0), Paper::Letter);
        assert_eq!(Paper::for_mains(230.0), Paper::A4);
        assert_eq!(Paper::for_mains(220.0), Paper::A4);
        assert_eq!(Paper::from_name("Letter"), Some(Paper::Letter));
        assert_eq!(Paper::Letter.typst_name(), "us-letter");
    }
}
