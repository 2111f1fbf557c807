//! `ampreport compare OLD NEW` and `compare JOB --sets A B`: the figures
//! that changed between two versions of a job (files, or `REV:PATH` read
//! through git), or between two measurement sets of one job, as a table or
//! as JSON. Each side is decoded and derived like `calc` does it; what
//! changed is worked out by [`crate::report::compare`].
//!
//! Exit statuses: 0 when the comparison was made (whether or not anything
//! changed); 1 when a side is an invalid job or cannot be read from git;
//! 2 when a set named with `--sets` is not in the job.

use std::path::{Path, PathBuf};

use super::args::CompareArgs;
use super::exit::Exit;
use super::load;
use super::said::Said;
use crate::calc::{self, Findings};
use crate::git;
use crate::report::compare::{self, Comparison};

pub fn run(args: &CompareArgs) -> Exit {
    let comparison = match (&args.new, &args.sets) {
        (_, Some(sets)) => {
            let (name, findings) = match side(args, &args.old) {
                Ok(s) => s,
                Err(e) => return e,
            };
            let find = |label: &str| {
                findings.sets.iter().find(|s| s.label == label).ok_or_else(|| {
                    let known: Vec<String> = findings
                        .sets
                        .iter()
                        .map(|s| format!("\u{201c}{}\u{201d}", s.label))
                        .collect();
                    eprintln!(
                        "error: {name} has no measurement set \u{201c}{label}\u{201d}; it has {}",
                        if known.is_empty() {
                            "none".to_string()
                        } else {
                            known.join(", ")
                        }
                    );
                    Exit::Usage
                })
            };
            let (old, new) = match (find(&sets[0]), find(&sets[1])) {
                (Ok(o), Ok(n)) => (o, n),
                (Err(e), _) | (_, Err(e)) => return e,
            };
            compare::compare_sets(&name, old, new)
        }
        (Some(new), None) => {
            let (old_name, old) = match side(args, &args.old) {
                Ok(s) => s,
                Err(e) => return e,
            };
            let (new_name, new) = match side(args, new) {
                Ok(s) => s,
                Err(e) => return e,
            };
            compare::compare_versions(&old_name, &old, &new_name, &new)
        }
        // clap requires NEW unless --sets is given.
        (None, None) => return Exit::Usage,
    };
    print(args, &comparison);
    Exit::Success
}

fn print(args: &CompareArgs, c: &Comparison) {
    if args.json {
        print!("{}", compare::render_json(c));
    } else {
        print!("{}", compare::render_text(c));
    }
}

/// One side, decoded and derived: its name and its findings. A path that
/// does not exist as a file but reads as `REV:PATH` is read through git;
/// the shop profile is then found from PATH as if it were a file of the
/// working folder.
fn side(args: &CompareArgs, given: &Path) -> Result<(String, Findings), Exit> {
    let mut said = Said::default();
    let result = side_said(args, given, &mut said);
    said.print();
    result
}

fn side_said(
    args: &CompareArgs,
    given: &Path,
    said: &mut Said,
) -> Result<(String, Findings), Exit> {
    let spec = git::is_revision_spec(given).then(|| given.to_string_lossy().into_owned());
    let job_path = match spec.as_deref().and_then(git::split_spec) {
        Some((_, path)) => PathBuf::from(path),
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
                said.error(format!("error: {e}"));
                if let Some(hint) = from_here_hint(spec) {
                    said.err(hint);
                }
                Exit::InvalidInput
            })?;
            load::decode_named(spec, text, shop, &ratings, said)?
        }
        None => load::job(&job_path, choice, &ratings, said)?,
    };
    let findings = calc::derive(&loaded.decoded.job, &ratings);
    let name = spec.unwrap_or_else(|| load::job_name(given));
    Ok((name, findings))
}

/// When `REV:PATH` could not be read and PATH is a file named from the
/// current folder (git reads it from the top of the repository), the
/// spelling that names it from here.
fn from_here_hint(spec: &str) -> Option<String> {
    let (rev, path) = git::split_spec(spec)?;
    let file = Path::new(path);
    (!path.starts_with("./") && file.is_relative() && file.is_file()).then(|| {
        format!(
            "note: in REV:PATH, git reads PATH from the top folder of the repository; \
             for the file named from this folder, write {rev}:./{path}"
        )
    })
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn a_path_from_here_gets_its_dot_slash_spelling() {
        // Tests run in the package's folder, where Cargo.toml is.
        let hint = from_here_hint("HEAD:Cargo.toml").unwrap();
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
