//! `ampreport compare OLD NEW` and `compare JOB --sets A B`: the figures
//! that changed between two versions of a job (files, or `REV:PATH` read
//! through git), or between two measurement sets of one job, as a table or
//! as JSON. Each side is decoded and derived like `calc` does it; what
//! changed is worked out by [`crate::report::compare`].
//!
//! Exit statuses: 0 when the comparison was made (whether or not anything
//! changed); 1 when a side is an invalid job or cannot be read from git;
//! 2 when a set named with `--sets` is not in the job.

use std::path::Path;

use super::args::CompareArgs;
use super::exit::Exit;
use super::load;
use super::said::Said;
use crate::calc::{self, Findings};
use crate::catalogue::{Catalogue, Msg};
use crate::git;
use crate::report::compare::{self, Comparison};

pub fn run(args: &CompareArgs) -> Exit {
    let (comparison, cat) = match (&args.new, &args.sets) {
        (_, Some(sets)) => {
            let (name, findings, cat) = match side(args, &args.old) {
                Ok(s) => s,
                Err(e) => return e,
            };
            let find = |label: &str| {
                findings
                    .sets
                    .iter()
                    .find(|s| s.label == label)
                    .ok_or_else(|| {
                        let known: Vec<String> = findings
                            .sets
                            .iter()
                            .map(|s| {
                                cat.say(&Msg::new("cli-compare-set-name").arg("label", &s.label))
                            })
                            .collect();
                        let msg = if known.is_empty() {
                            Msg::new("cli-compare-no-such-set-none")
                        } else {
                            Msg::new("cli-compare-no-such-set").arg("known", cat.and_list(&known))
                        };
                        eprintln!("{}", cat.say(&msg.arg("job", &name).arg("label", label)));
                        Exit::Usage
                    })
            };
            let (old, new) = match (find(&sets[0]), find(&sets[1])) {
                (Ok(o), Ok(n)) => (o, n),
                (Err(e), _) | (_, Err(e)) => return e,
            };
            (compare::compare_sets(&name, old, new), cat)
        }
        (Some(new), None) => {
            let (old_name, old, old_cat) = match side(args, &args.old) {
                Ok(s) => s,
                Err(e) => return e,
            };
            let (new_name, new, new_cat) = match side(args, new) {
                Ok(s) => s,
                Err(e) => return e,
            };
            // The two sides' shared language, English when they differ.
            let cat = if old_cat == new_cat {
                new_cat
            } else {
                Catalogue::english().clone()
            };
            (
                compare::compare_versions(&old_name, &old, &new_name, &new),
                cat,
            )
        }
        // clap requires NEW unless --sets is given.
        (None, None) => return Exit::Usage,
    };
    print(args, &comparison, &cat);
    Exit::Success
}

/// The comparison as JSON (the same in every language), or as a table in
/// the words of `cat`.
fn print(args: &CompareArgs, c: &Comparison, cat: &Catalogue) {
    if args.json {
        print!("{}", compare::render_json(c));
    } else {
        print!("{}", compare::render_text(c, cat));
    }
}

/// One side, decoded and derived: its name, its findings and the language
/// of its shop profile (English without one). A path that
/// does not exist as a file but reads as `REV:PATH` is read through git;
/// the shop profile is then found from PATH as if it were a file of the
/// working folder, where git's rules put it (from the top of the
/// repository unless it starts with `./`).
fn side(args: &CompareArgs, given: &Path) -> Result<(String, Findings, Catalogue), Exit> {
    let mut said = Said::default();
    let result = side_said(args, given, &mut said);
    said.print();
    result
}

fn side_said(
    args: &CompareArgs,
    given: &Path,
    said: &mut Said,
) -> Result<(String, Findings, Catalogue), Exit> {
    let spec = git::is_revision_spec(given).then(|| given.to_string_lossy().into_owned());
    let job_path = match spec.as_deref().and_then(git::split_spec) {
        Some((_, path)) => git::working_path_of_spec(path),
        None => given.to_path_buf(),
    };
    let ratings = load::ratings(&args.ratings)?;
    let choice = load::ShopChoice {
        named: args.shop.as_deref(),
        none: args.no_shop,
    };
    let loaded = match &spec {
        Some(spec) => {
            let shop = load::shop_profile(&job_path, choice, said, &mut Vec::new())?;
            let text = git::read_at_revision(spec).map_err(|e| {
                said.error(said.say(&Msg::new("cli-error").arg("error", e.msg())));
                if let Some(hint) = from_here_hint(spec) {
                    said.err(said.say(&hint));
                }
                Exit::InvalidInput
            })?;
            load::decode_named(spec, text, shop, &ratings, said)?
        }
        None => load::job(&job_path, choice, &ratings, said)?,
    };
    let cat = loaded.catalogue().clone();
    let findings = calc::derive_in(&loaded.decoded.job, &ratings, &cat);
    let name = spec.unwrap_or_else(|| load::job_name(given));
    Ok((name, findings, cat))
}

/// When `REV:PATH` could not be read and PATH is a file named from the
/// current folder (git reads it from the top of the repository), the
/// spelling that names it from here.
fn from_here_hint(spec: &str) -> Option<Msg> {
    let (rev, path) = git::split_spec(spec)?;
    let file = Path::new(path);
    (!path.starts_with("./") && file.is_relative() && file.is_file())
        .then(|| Msg::new("cli-compare-path-from-here").arg("spelling", format!("{rev}:./{path}")))
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn a_path_from_here_gets_its_dot_slash_spelling() {
        // Tests run in the package's folder, where Cargo.toml is.
        let hint = from_here_hint("HEAD:Cargo.toml").unwrap().english();
        assert!(hint.ends_with("write HEAD:./Cargo.toml"), "{hint}");
        assert_eq!(from_here_hint("HEAD:./Cargo.toml"), None);
        assert_eq!(from_here_hint("HEAD:no/such/file.kdl"), None);
        let absolute = std::path::absolute("Cargo.toml").unwrap();
        assert_eq!(
            from_here_hint(&format!("HEAD:{}", absolute.display())),
            None
        );
    }
}
