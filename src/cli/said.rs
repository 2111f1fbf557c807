//! What one job's run has to say, gathered rather than printed at once, so
//! that jobs rendered side by side print whole blocks, and a batch's
//! summary can quote the first error of each job that failed.

use std::fmt::Display;
use std::io::Write;

/// Standard output and standard error of one job, in order.
#[derive(Debug, Default, Clone)]
pub struct Said {
    pub out: String,
    pub err: String,
    first_error: Option<String>,
    /// The language the job's messages are said in: its shop profile's
    /// once that is read ([`super::load::shop_profile`]), English before.
    pub language: Option<crate::catalogue::Catalogue>,
}

impl Said {
    /// The job's language: its shop profile's, or English.
    pub fn catalogue(&self) -> &crate::catalogue::Catalogue {
        self.language
            .as_ref()
            .unwrap_or(crate::catalogue::Catalogue::english())
    }

    /// A message of the catalogue in the job's language.
    pub fn say(&self, msg: &crate::catalogue::Msg) -> String {
        self.catalogue().say(msg)
    }

    /// A line for standard output.
    pub fn out(&mut self, line: impl Display) {
        self.out.push_str(&format!("{line}\n"));
    }

    /// A line (or a rendered diagnostic) for standard error.
    pub fn err(&mut self, text: impl Display) {
        self.err.push_str(&format!("{text}\n"));
    }

    /// A warning or a note for standard error (the text carries its own
    /// `warning:` or `note:`); nothing under `--quiet`, as
    /// [`super::ui::warn`].
    pub fn warn(&mut self, text: impl Display) {
        if super::ui::chatty() {
            self.err(text);
        }
    }

    /// With `--verbose`, a line saying what was read from where, as
    /// [`super::ui::read`], in the job's language.
    pub fn read(&mut self, what: &'static str, from: crate::catalogue::Msg) {
        self.read_in(None, what, from);
    }

    /// [`Said::read`] in `catalogue`'s words rather than the job's (a shop
    /// profile's line, said in the language the profile names).
    pub fn read_in(
        &mut self,
        catalogue: Option<&crate::catalogue::Catalogue>,
        what: &'static str,
        from: crate::catalogue::Msg,
    ) {
        if super::ui::verbose() {
            let line = super::ui::read_line(catalogue.unwrap_or(self.catalogue()), what, from);
            self.err(line);
        }
    }

    /// An error for standard error; the first one is remembered in one line
    /// for a batch's summary.
    pub fn error(&mut self, text: impl Display) {
        let text = text.to_string();
        if self.first_error.is_none() {
            self.first_error = headline(&text);
        }
        self.err(text);
    }

    /// An error whose one-line form for the summary is given, not taken
    /// from its first line.
    pub fn error_titled(&mut self, text: impl Display, title: impl Into<String>) {
        if self.first_error.is_none() {
            self.first_error = Some(title.into());
        }
        self.err(text);
    }

    /// The first error in one line, if there was one.
    pub fn first_error(&self) -> Option<&str> {
        self.first_error.as_deref()
    }

    /// Prints what was gathered: standard output, then standard error.
    pub fn print(&self) {
        if !self.out.is_empty() {
            let mut out = std::io::stdout().lock();
            let _ = out.write_all(self.out.as_bytes());
            let _ = out.flush();
        }
        if !self.err.is_empty() {
            let _ = std::io::stderr().lock().write_all(self.err.as_bytes());
        }
    }
}

/// The first line of a message that says something: terminal colours,
/// diagnostic frames and an `error:` prefix taken off, cut to 200
/// characters.
pub fn headline(text: &str) -> Option<String> {
    let plain = strip_escapes(text);
    let line = plain
        .lines()
        .map(|l| {
            let l = l.trim_start_matches(|c: char| {
                c.is_whitespace()
                    || matches!(c, '×' | '│' | '╭' | '─' | '┬' | '·' | '|' | '!' | '⚠')
            });
            let l = l.trim_end();
            l.strip_prefix("error: ")
                .or_else(|| l.strip_prefix("Error: "))
                .unwrap_or(l)
        })
        .find(|l| !l.is_empty())?;
    let mut cut: String = line.chars().take(200).collect();
    if line.chars().count() > 200 {
        cut.push('…');
    }
    Some(cut)
}

/// The text without ANSI escape sequences.
fn strip_escapes(text: &str) -> String {
    let mut out = String::with_capacity(text.len());
    let mut chars = text.chars().peekable();
    while let Some(c) = chars.next() {
        if c == '\u{1b}' {
            if chars.peek() == Some(&'[') {
                chars.next();
                for c in chars.by_ref() {
                    if c.is_ascii_alphabetic() {
                        break;
                    }
                }
            } else {
                chars.next();
            }
        } else {
            out.push(c);
        }
    }
    out
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn the_headline_is_the_first_line_with_words() {
        assert_eq!(
            headline("\n  \u{1b}[31m×\u{1b}[0m the job file is not valid KDL\n   ╭─[a.kdl:1:1]")
                .as_deref(),
            Some("the job file is not valid KDL")
        );
        assert_eq!(
            headline("error: no such file").as_deref(),
            Some("no such file")
        );
        assert_eq!(headline("  \n "), None);
        let long = "x".repeat(300);
        assert_eq!(headline(&long).unwrap().chars().count(), 201);
    }

    #[test]
    fn the_first_error_is_kept() {
        let mut said = Said::default();
        said.err("warning: something");
        said.error("error: the first");
        said.error("error: the second");
        assert_eq!(said.first_error(), Some("the first"));
        assert_eq!(
            said.err,
            "warning: something\nerror: the first\nerror: the second\n"
        );
    }
}
