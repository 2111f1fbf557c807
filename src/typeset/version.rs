//! Typst version numbers: reading what `typst --version` prints and the range
//! of versions the templates are tested with.

use std::cmp::Ordering;
use std::fmt;

/// The oldest typst the bundled templates and command line flags are tested
/// with.
pub const MIN_TYPST: TypstVersion = TypstVersion::new(0, 15, 1);

/// The first version outside the tested series. A typst at or above it is
/// still used, with a warning (see [`super::TypstProgram::version_warning`]):
/// a minor release may change layout or flags, but refusing to run would
/// strand a shop that upgraded typst for another reason.
pub const MAX_TYPST_EXCLUSIVE: TypstVersion = TypstVersion::new(0, 16, 0);

/// A typst release number such as `0.15.1` or `0.16.0-rc1`.
#[derive(Debug, Clone, PartialEq, Eq, Hash)]
pub struct TypstVersion {
    pub major: u64,
    pub minor: u64,
    pub patch: u64,
    /// Text after a `-`, for release candidates; `None` for a release.
    pub pre: Option<String>,
}

impl TypstVersion {
    pub const fn new(major: u64, minor: u64, patch: u64) -> Self {
        Self {
            major,
            minor,
            patch,
            pre: None,
        }
    }

    /// Reads the first line of `typst --version`, which looks like
    /// `typst 0.15.1 (abcdef12)`. Returns `None` if it does not.
    pub fn parse_version_output(output: &str) -> Option<Self> {
        let line = output.lines().next()?.trim();
        let mut words = line.split_whitespace();
        if words.next()? != "typst" {
            return None;
        }
        Self::parse(words.next()?)
    }

    /// Reads a bare version such as `0.15.1`, `v0.15.1` or `0.16.0-rc1`.
    pub fn parse(text: &str) -> Option<Self> {
        let text = text.strip_prefix('v').unwrap_or(text);
        let (numbers, pre) = match text.split_once('-') {
            Some((numbers, pre)) if !pre.is_empty() => (numbers, Some(pre.to_owned())),
            Some(_) => return None,
            None => (text, None),
        };
        let mut parts = numbers.split('.');
        let mut next = || -> Option<u64> {
            let part = parts.next()?;
            if part.is_empty() || !part.bytes().all(|b| b.is_ascii_digit()) {
                return None;
            }
            part.parse().ok()
        };
        let (major, minor, patch) = (next()?, next()?, next()?);
        if parts.next().is_some() {
            return None;
        }
        Some(Self {
            major,
            minor,
            patch,
            pre,
        })
    }

    fn numbers(&self) -> (u64, u64, u64) {
        (self.major, self.minor, self.patch)
    }
}

impl Ord for TypstVersion {
    /// Orders by number; a release candidate comes before its release.
    fn cmp(&self, other: &Self) -> Ordering {
        self.numbers()
            .cmp(&other.numbers())
            .then_with(|| match (&self.pre, &other.pre) {
                (None, None) => Ordering::Equal,
                (None, Some(_)) => Ordering::Greater,
                (Some(_), None) => Ordering::Less,
                (Some(a), Some(b)) => a.cmp(b),
            })
    }
}

impl PartialOrd for TypstVersion {
    fn partial_cmp(&self, other: &Self) -> Option<Ordering> {
        Some(self.cmp(other))
    }
}

impl fmt::Display for TypstVersion {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        write!(f, "{}.{}.{}", self.major, self.minor, self.patch)?;
        if let Some(pre) = &self.pre {
            write!(f, "-{pre}")?;
        }
        Ok(())
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn reads_version_output() {
        let v = TypstVersion::parse_version_output("typst 0.15.1 (8ace67d9)\n").unwrap();
        assert_eq!(v, TypstVersion::new(0, 15, 1));
        assert_eq!(v.to_string(), "0.15.1");
        let rc = TypstVersion::parse_version_output("typst 0.16.0-rc1 (abc)").unwrap();
        assert_eq!(rc.pre.as_deref(), Some("rc1"));
        assert_eq!(rc.to_string(), "0.16.0-rc1");
        assert!(TypstVersion::parse_version_output("typst 0.15.1").is_some());
    }

    #[test]
    fn rejects_other_output() {
        for text in [
            "",
            "other 0.15.1",
            "typst",
            "typst 0.15",
            "typst 0.15.1.2",
            "typst 0.x.1",
            "typst 0.15.1-",
            "typst +0.15.1",
        ] {
            assert_eq!(TypstVersion::parse_version_output(text), None, "{text:?}");
        }
    }

    #[test]
    fn orders_numerically_with_candidates_first() {
        let v = |s| TypstVersion::parse(s).unwrap();
        assert!(v("0.9.0") < v("0.15.1"));
        assert!(v("0.15.1") < v("0.15.10"));
        assert!(v("0.16.0-rc1") < v("0.16.0"));
        assert!(v("0.16.0-rc1") > v("0.15.9"));
        assert!(v("1.0.0") > v("0.99.99"));
    }

    #[test]
    fn range_is_sane() {
        assert!(MIN_TYPST < MAX_TYPST_EXCLUSIVE);
    }
}
