//! A shop's job numbering: a pattern such as `D-{yymm}-{nnn}` (from the
//! shop profile's `job-numbers`), and the next id in it for a given day,
//! counting on from the highest id of that period already used.
//!
//! Pieces: `{yyyy}` the year, `{yy}` its last two digits, `{mm}` the month,
//! `{dd}` the day, `{yymm}` both; `{n…}` (one to nine `n`) the count,
//! zero-padded to that many digits (it grows past them rather than wrap).
//! Everything else is written as it is. The count restarts whenever the
//! date pieces differ: with `{yymm}` each month starts at 1.

use chrono::{Datelike, NaiveDate};

use crate::catalogue::Msg;

/// The pattern used without a shop profile or `job-numbers`.
pub const DEFAULT_PATTERN: &str = "{yyyy}-{nnn}";

/// A piece of a pattern.
#[derive(Debug, Clone, PartialEq, Eq)]
enum Piece {
    Text(String),
    Year4,
    Year2,
    Month,
    Day,
    Count(usize),
}

/// A checked numbering pattern.
#[derive(Debug, Clone, PartialEq, Eq)]
pub struct Numbering {
    pieces: Vec<Piece>,
}

impl Numbering {
    /// Reads a pattern; the error says what is wrong in a sentence (a
    /// message of the catalogue).
    pub fn parse(pattern: &str) -> Result<Numbering, Msg> {
        let mut pieces = Vec::new();
        let mut rest = pattern;
        let mut counts = 0;
        while !rest.is_empty() {
            match rest.find('{') {
                Some(0) => {
                    let close = rest
                        .find('}')
                        .ok_or_else(|| Msg::new("diag-pattern-not-closed"))?;
                    let name = &rest[1..close];
                    let piece = match name {
                        "yyyy" => Piece::Year4,
                        "yy" => Piece::Year2,
                        "mm" => Piece::Month,
                        "dd" => Piece::Day,
                        "yymm" => {
                            pieces.push(Piece::Year2);
                            Piece::Month
                        }
                        n if !n.is_empty() && n.len() <= 9 && n.chars().all(|c| c == 'n') => {
                            counts += 1;
                            Piece::Count(n.len())
                        }
                        other => {
                            return Err(Msg::new("diag-pattern-unknown-piece")
                                .arg("piece", format!("{{{other}}}")));
                        }
                    };
                    pieces.push(piece);
                    rest = &rest[close + 1..];
                }
                found => {
                    let end = found.unwrap_or(rest.len());
                    let text = &rest[..end];
                    if text.contains('}') {
                        return Err(Msg::new("diag-pattern-not-opened"));
                    }
                    if text
                        .chars()
                        .any(|c| c.is_control() || c == '/' || c == '\\')
                    {
                        return Err(Msg::new("diag-pattern-slash"));
                    }
                    pieces.push(Piece::Text(text.to_string()));
                    rest = &rest[end..];
                }
            }
        }
        if counts != 1 {
            return Err(Msg::new("diag-pattern-one-count").arg("count", i64::from(counts)));
        }
        Ok(Numbering { pieces })
    }

    /// The text before and after the count on `day`.
    fn around_count(&self, day: NaiveDate) -> (String, usize, String) {
        let (mut before, mut after, mut width) = (String::new(), String::new(), 0);
        let mut seen = false;
        for piece in &self.pieces {
            let text = match piece {
                Piece::Text(t) => t.clone(),
                Piece::Year4 => format!("{:04}", day.year()),
                Piece::Year2 => format!("{:02}", day.year().rem_euclid(100)),
                Piece::Month => format!("{:02}", day.month()),
                Piece::Day => format!("{:02}", day.day()),
                Piece::Count(w) => {
                    width = *w;
                    seen = true;
                    continue;
                }
            };
            if seen {
                after.push_str(&text);
            } else {
                before.push_str(&text);
            }
        }
        (before, width, after)
    }

    /// The count of `id` if it is a number of this pattern on `day`'s
    /// period.
    pub fn count_of(&self, id: &str, day: NaiveDate) -> Option<u64> {
        let (before, _, after) = self.around_count(day);
        let digits = id.strip_prefix(&before)?.strip_suffix(&after)?;
        if digits.is_empty() || digits.len() > 18 || !digits.chars().all(|c| c.is_ascii_digit()) {
            return None;
        }
        digits.parse().ok()
    }

    /// The next id on `day`, after the highest of `existing` in its period.
    pub fn next_id<'a>(
        &self,
        day: NaiveDate,
        existing: impl IntoIterator<Item = &'a str>,
    ) -> String {
        let highest = existing
            .into_iter()
            .filter_map(|id| self.count_of(id, day))
            .max()
            .unwrap_or(0);
        let (before, width, after) = self.around_count(day);
        format!("{before}{:0width$}{after}", highest + 1)
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    fn day(y: i32, m: u32, d: u32) -> NaiveDate {
        NaiveDate::from_ymd_opt(y, m, d).unwrap()
    }

    #[test]
    fn the_count_goes_on_from_the_highest_of_the_period() {
        let n = Numbering::parse("D-{yymm}-{nnn}").unwrap();
        let ids = [
            "D-2611-014",
            "D-2611-031",
            "D-2611-022",
            "D-2610-099",
            "X-2611-500",
        ];
        assert_eq!(n.next_id(day(2026, 11, 30), ids), "D-2611-032");
        // A new month starts again at 1.
        assert_eq!(n.next_id(day(2026, 12, 1), ids), "D-2612-001");
        // The count grows past its width rather than wrap.
        assert_eq!(n.next_id(day(2026, 11, 1), ["D-2611-999"]), "D-2611-1000");
    }

    #[test]
    fn every_date_piece_is_filled_in() {
        let n = Numbering::parse("{yyyy}/{nn}").unwrap_err().english();
        assert!(n.contains("slash"), "{n}");
        let n = Numbering::parse("J{yyyy}{mm}{dd}-{nn}").unwrap();
        assert_eq!(n.next_id(day(2027, 3, 9), []), "J20270309-01");
        let n = Numbering::parse(DEFAULT_PATTERN).unwrap();
        assert_eq!(
            n.next_id(day(2027, 3, 9), ["2027-007", "2026-100"]),
            "2027-008"
        );
    }

    #[test]
    fn a_bad_pattern_is_refused_in_words() {
        for (pattern, words) in [
            ("D-{yymm}", "exactly one count"),
            ("{nn}-{nnn}", "this pattern has 2"),
            ("D-{week}-{nn}", "`{week}` is not a piece"),
            ("D-{nn", "not closed"),
            ("D-nn}", "no `{`"),
        ] {
            let e = Numbering::parse(pattern).unwrap_err().english();
            assert!(e.contains(words), "{pattern}: {e}");
        }
    }
}
