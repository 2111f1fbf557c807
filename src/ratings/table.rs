//! The ratings table: the rows built into the program, plus whatever a
//! shop's own ratings files add or correct, found by designation.

use std::collections::{HashMap, HashSet};
use std::path::Path;
use std::sync::{Arc, OnceLock};

use super::decode::read_file;
use super::designation::{UnknownValve, designation_key, nearest};
use super::diagnostic::{RatingProblem, RatingsFileError, UnreadableRatingsFile};
use super::draft::{Draft, check_row};
use super::rating::{Rating, RatingOrigin};

/// The built-in ratings file, which the rows the program is built with
/// (`builtin_rows.rs`) are held to.
#[cfg(test)]
pub const BUILTIN_TEXT: &str = include_str!("../../ratings/valves.kdl");

/// The name the built-in file is reported under.
#[cfg(test)]
pub const BUILTIN_NAME: &str = "ratings/valves.kdl";

/// Every known valve type, listed by class then name, and found by any of
/// its designations.
#[derive(Debug, Clone, Default)]
pub struct RatingsTable {
    /// Sorted by class, then name.
    rows: Vec<Rating>,
    /// Designation key (see [`designation_key`]) to row index.
    index: HashMap<String, usize>,
}

impl RatingsTable {
    /// The table built into the program: the rows of the embedded file,
    /// written out as Rust values (`builtin_rows.rs`, held to what
    /// [`RatingsTable::from_kdl_text`] reads from the file by
    /// `builtin_rows_tests.rs`), so that a run does not parse the file
    /// (a ninth of a render's own instructions). Made once per process;
    /// later calls get a copy of that table.
    pub fn builtin() -> RatingsTable {
        static BUILTIN: OnceLock<RatingsTable> = OnceLock::new();
        BUILTIN
            .get_or_init(|| {
                let rows = super::builtin_rows::rows();
                let mut table = RatingsTable {
                    rows,
                    index: HashMap::new(),
                };
                table.reindex();
                table
            })
            .clone()
    }

    /// Reads complete rows from KDL text in the ratings-file format. `name`
    /// is the file name shown in error messages. Every row must be complete
    /// and no designation may appear twice; all problems are reported in one
    /// report.
    pub fn from_kdl_text(
        name: &str,
        text: &str,
        origin: RatingOrigin,
    ) -> Result<Vec<Rating>, miette::Report> {
        let (drafts, mut problems) = read_file(text);
        let mut owners: HashMap<String, String> = HashMap::new();
        let mut rows = Vec::new();
        for draft in drafts {
            if owners
                .get(&designation_key(&draft.name))
                .is_some_and(|o| designation_key(o) == designation_key(&draft.name))
            {
                problems.push(
                    RatingProblem::new(
                        format!("{} is listed twice", draft.name),
                        draft.name_span,
                        "second listing here",
                    )
                    .with_help("keep one valve block per type"),
                );
                continue;
            }
            problems.extend(claim_designations(&draft, &draft.name, &mut owners));
            let check_draft = draft.clone();
            match draft.into_new_rating(origin.clone()) {
                Ok(row) => {
                    problems.extend(check_row(&row, &check_draft));
                    rows.push(row);
                }
                Err(p) => problems.push(p),
            }
        }
        if problems.is_empty() {
            Ok(rows)
        } else {
            Err(file_error(name, text, problems))
        }
    }

    /// Reads a shop's ratings file. A `valve` node whose designation is
    /// already in the table corrects that row: the fields it gives replace
    /// the existing ones, equivalents are added, and the row is marked as
    /// coming from this file. Any other `valve` node adds a new type and
    /// must be complete. If the file has any problem, all of them are
    /// reported at once and the table is left as it was.
    pub fn load_shop_file(&mut self, path: &Path) -> Result<(), miette::Report> {
        let text = crate::input_file::read_text(path, "ratings file").map_err(|e| match e {
            crate::input_file::InputFileError::Io { source, .. } => {
                miette::Report::new(UnreadableRatingsFile {
                    path: path.display().to_string(),
                    cause: source,
                })
            }
            other => miette::miette!("{other}"),
        })?;
        self.apply_shop_text(
            &path.display().to_string(),
            &text,
            RatingOrigin::Shop(path.to_path_buf()),
        )
    }

    /// The work of [`RatingsTable::load_shop_file`] on text already read.
    pub(super) fn apply_shop_text(
        &mut self,
        name: &str,
        text: &str,
        origin: RatingOrigin,
    ) -> Result<(), miette::Report> {
        let (drafts, mut problems) = read_file(text);
        // Who each designation belongs to, starting from the table.
        let mut owners: HashMap<String, String> = self
            .index
            .iter()
            .map(|(key, &i)| (key.clone(), self.rows[i].name.clone()))
            .collect();
        let mut corrected: HashMap<usize, Rating> = HashMap::new();
        let mut added: Vec<Rating> = Vec::new();
        let mut added_keys: HashSet<String> = HashSet::new();
        for draft in drafts {
            let key = designation_key(&draft.name);
            match self.index.get(&key).copied() {
                Some(i) => {
                    if corrected.contains_key(&i) {
                        problems.push(
                            RatingProblem::new(
                                format!("{} is corrected twice in this file", self.rows[i].name),
                                draft.name_span,
                                "second correction here",
                            )
                            .with_help("put all corrections of one type in one valve block"),
                        );
                        continue;
                    }
                    let owner = self.rows[i].name.clone();
                    problems.extend(claim_designations(&draft, &owner, &mut owners));
                    let row = draft.correct(&self.rows[i], origin.clone());
                    problems.extend(check_row(&row, &draft));
                    corrected.insert(i, row);
                }
                None => {
                    if added_keys.contains(&key) {
                        problems.push(
                            RatingProblem::new(
                                format!("{} is listed twice in this file", draft.name),
                                draft.name_span,
                                "second listing here",
                            )
                            .with_help("keep one valve block per type"),
                        );
                        continue;
                    }
                    added_keys.insert(key);
                    let owner = draft.name.clone();
                    problems.extend(claim_designations(&draft, &owner, &mut owners));
                    let check_draft = draft.clone();
                    match draft.into_new_rating(origin.clone()) {
                        Ok(row) => {
                            problems.extend(check_row(&row, &check_draft));
                            added.push(row);
                        }
                        Err(p) => problems.push(p),
                    }
                }
            }
        }
        if !problems.is_empty() {
            return Err(file_error(name, text, problems));
        }
        for (i, row) in corrected {
            self.rows[i] = row;
        }
        self.rows.extend(added);
        self.reindex();
        Ok(())
    }

    /// Finds a row by any of its designations, ignoring case, spaces and
    /// hyphens. A designation the table lacks is an error even when a close
    /// one exists (a suffix letter can change the ratings); the error
    /// carries the nearest designations.
    pub fn lookup(&self, name: &str) -> Result<&Rating, UnknownValve> {
        self.index
            .get(&designation_key(name))
            .map(|&i| &self.rows[i])
            .ok_or_else(|| UnknownValve {
                name: name.to_string(),
                suggestions: self.suggest(name),
            })
    }

    /// The designations nearest to `name`, closest first, at most three.
    pub fn suggest(&self, name: &str) -> Vec<String> {
        nearest(name, self.rows.iter().flat_map(Rating::designations))
    }

    /// Every row, by class then name.
    pub fn iter(&self) -> impl Iterator<Item = &Rating> {
        self.rows.iter()
    }

    /// The number of valve types.
    pub fn len(&self) -> usize {
        self.rows.len()
    }

    /// Whether the table has no rows.
    pub fn is_empty(&self) -> bool {
        self.rows.is_empty()
    }

    /// Sorts the rows and rebuilds the designation index.
    fn reindex(&mut self) {
        // Each row's key worked out once, not again for every comparison.
        self.rows
            .sort_by_cached_key(|row| (row.class, designation_parts(&row.name), row.name.clone()));
        self.index.clear();
        for (i, row) in self.rows.iter().enumerate() {
            for d in row.designations() {
                self.index.entry(designation_key(d)).or_insert(i);
            }
        }
    }
}

/// A designation's runs of digits (as numbers) and of other characters
/// (in capitals): rows are ordered by these, then by the name as text,
/// so that 6V6 comes before 12AX7.
fn designation_parts(s: &str) -> Vec<(u8, u64, String)> {
    let mut out = Vec::new();
    let mut chars = s.chars().peekable();
    while let Some(&c) = chars.peek() {
        let digit = c.is_ascii_digit();
        let mut run = String::new();
        while let Some(&c) = chars.peek() {
            if c.is_ascii_digit() != digit {
                break;
            }
            run.push(c);
            chars.next();
        }
        if digit {
            out.push((0, run.parse().unwrap_or(u64::MAX), run));
        } else {
            out.push((1, 0, run.to_uppercase()));
        }
    }
    out
}

/// Records that `owner` holds the draft's designations, reporting any that
/// another type already holds, and equivalents that repeat the draft's own
/// designation.
fn claim_designations(
    draft: &Draft,
    owner: &str,
    owners: &mut HashMap<String, String>,
) -> Vec<RatingProblem> {
    let owner_key = designation_key(owner);
    let name_key = designation_key(&draft.name);
    let mut problems = Vec::new();
    let all = std::iter::once((&draft.name, draft.name_span, false))
        .chain(draft.equivalents.iter().map(|(e, s)| (e, *s, true)));
    for (d, span, is_equivalent) in all {
        let key = designation_key(d);
        if is_equivalent && key == name_key {
            problems.push(
                RatingProblem::new(
                    format!("{d} is the type's own designation"),
                    span,
                    "listed again",
                )
                .with_help("list only other designations in equivalents"),
            );
            continue;
        }
        match owners.get(&key) {
            Some(holder) if designation_key(holder) != owner_key => problems.push(
                RatingProblem::new(
                    format!("{d} is already a designation of {holder}"),
                    span,
                    format!("belongs to {holder}"),
                )
                .with_help(format!(
                    "each designation names one type; to change {holder}, write a valve \"{holder}\" block"
                )),
            ),
            Some(_) => {}
            None => {
                owners.insert(key, owner.to_string());
            }
        }
    }
    problems
}

/// Wraps the problems of one file into a single report.
fn file_error(name: &str, text: &str, problems: Vec<RatingProblem>) -> miette::Report {
    miette::Report::new(RatingsFileError::new(
        name,
        Arc::new(text.to_string()),
        problems,
    ))
}
