//! Matching valve designations as technicians write them, and saying what
//! was probably meant when nothing matches.
//!
//! Matching is exact after folding case and dropping spaces and hyphens, so
//! "6L6-GC" finds 6L6GC but "6L6GB" does not quietly become some other type:
//! a suffix letter can change the ratings.

use std::fmt;

/// The key a designation is matched by: upper case, without spaces or
/// hyphens.
pub fn designation_key(name: &str) -> String {
    name.chars()
        .filter(|c| !c.is_whitespace() && *c != '-')
        .flat_map(char::to_uppercase)
        .collect()
}

/// The most suggestions ever offered.
pub const MAX_SUGGESTIONS: usize = 3;

/// The designations nearest to `name`, at most [`MAX_SUGGESTIONS`], closest
/// first. Only reasonably close ones are offered: about one edit in three
/// characters.
pub fn nearest<'a>(name: &str, candidates: impl IntoIterator<Item = &'a str>) -> Vec<String> {
    let key = designation_key(name);
    if key.is_empty() {
        return Vec::new();
    }
    let limit = key.chars().count().div_ceil(3);
    let mut scored: Vec<(usize, &str)> = candidates
        .into_iter()
        .filter_map(|c| {
            let d = strsim::osa_distance(&key, &designation_key(c));
            (d > 0 && d <= limit.max(1)).then_some((d, c))
        })
        .collect();
    scored.sort_by(|a, b| a.0.cmp(&b.0).then_with(|| a.1.cmp(b.1)));
    let mut out: Vec<String> = Vec::new();
    for (_, c) in scored {
        if !out.iter().any(|o| o == c) {
            out.push(c.to_string());
        }
        if out.len() == MAX_SUGGESTIONS {
            break;
        }
    }
    out
}

/// A valve type that is not in the ratings table.
#[derive(Debug, Clone, PartialEq, Eq, thiserror::Error)]
pub struct UnknownValve {
    /// The designation as it was asked for.
    pub name: String,
    /// The nearest designations in the table, closest first.
    pub suggestions: Vec<String>,
}

impl fmt::Display for UnknownValve {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        write!(f, "unknown valve type \"{}\"", self.name)?;
        if !self.suggestions.is_empty() {
            write!(f, "; did you mean {}?", self.suggestions.join(", "))?;
        }
        Ok(())
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn keys_fold_case_spaces_and_hyphens() {
        assert_eq!(designation_key("6L6-GC"), "6L6GC");
        assert_eq!(designation_key(" 6l6 gc "), "6L6GC");
        assert_eq!(designation_key("ecc83"), "ECC83");
        assert_ne!(designation_key("6L6GB"), designation_key("6L6GC"));
    }

    #[test]
    fn nearest_ranks_by_distance_then_name() {
        let names = ["EL84", "EL86", "EL34", "EZ81", "12AX7"];
        assert_eq!(nearest("EL8", names), vec!["EL84", "EL86"]);
        assert!(
            !nearest("el-84", names).contains(&"EL84".to_string()),
            "an exact match is not a suggestion"
        );
        assert!(nearest("", names).is_empty());
        assert!(nearest("QQQQQQ", names).is_empty());
        assert!(nearest("EL", names).len() <= MAX_SUGGESTIONS);
    }

    #[test]
    fn message_lists_suggestions() {
        let e = UnknownValve {
            name: "EL8".into(),
            suggestions: vec!["EL84".into(), "EL86".into()],
        };
        assert_eq!(
            e.to_string(),
            "unknown valve type \"EL8\"; did you mean EL84, EL86?"
        );
        let e = UnknownValve {
            name: "XYZ".into(),
            suggestions: vec![],
        };
        assert_eq!(e.to_string(), "unknown valve type \"XYZ\"");
    }
}
