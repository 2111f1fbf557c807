//! `ampreport check JOB|DIR…`: the terminal summary of each job.
//!
//! With several jobs each summary comes under a line naming its file; a
//! job that cannot be read does not stop the others. The exit status is 1
//! when some job could not be read, else 4 when `--strict` found an
//! un-accepted figure over its limit in some job, else 0.

use super::args::{CheckArgs, StrictSets};
use super::exit::Exit;
use super::job_files::{self, JobFile};
use super::load;
use super::said::Said;
use crate::calc::{self, StrictScope};
use crate::catalogue::Msg;
use crate::ratings::RatingsTable;
use crate::report::terminal::{self, TerminalStyle};

pub fn run(args: &CheckArgs) -> Exit {
    let jobs = match named_jobs(&args.job) {
        Ok(jobs) => jobs,
        Err(e) => return e,
    };
    let ratings = match load::ratings(&args.job.ratings) {
        Ok(r) => r,
        Err(e) => return e,
    };
    let colour = colour_wanted();
    let several = jobs.len() > 1 || args.job.jobs.iter().any(|p| p.is_dir());
    let mut unreadable = false;
    let mut strict = false;
    for (i, job) in jobs.iter().enumerate() {
        let mut said = Said::default();
        if several {
            if i > 0 {
                said.out("");
            }
            said.out(format!("━━ {}", job.path.display()));
        }
        match check_one(
            job,
            args.job.shop_choice(),
            &ratings,
            colour,
            args.strict,
            &mut said,
        ) {
            Ok(over) => strict |= over,
            Err(_) => unreadable = true,
        }
        said.print();
    }
    if unreadable {
        Exit::InvalidInput
    } else if strict {
        Exit::StrictFindings
    } else {
        Exit::Success
    }
}

/// Prints one job's summary into `said`; true when `--strict` counts
/// something against it.
fn check_one(
    job: &JobFile,
    choice: load::ShopChoice<'_>,
    ratings: &RatingsTable,
    colour: bool,
    strict: Option<StrictSets>,
    said: &mut Said,
) -> Result<bool, Exit> {
    let loaded = load::job(&job.path, choice, ratings, said)?;
    // Each job in the language of its own shop profile.
    let findings = calc::derive_in(&loaded.decoded.job, ratings, loaded.catalogue());
    let style = TerminalStyle {
        colour,
        catalogue: loaded.catalogue().clone(),
    };
    said.out
        .push_str(&terminal::render(&loaded.decoded.job, &findings, &style));
    let scope = match strict {
        None => return Ok(false),
        Some(StrictSets::Final) => StrictScope::Final,
        Some(StrictSets::All) => StrictScope::All,
    };
    Ok(!findings.strict_failures(scope).is_empty())
}

/// The job files the command line names, or the exit status after saying
/// why there are none.
pub fn named_jobs(args: &super::args::JobArgs) -> Result<Vec<JobFile>, Exit> {
    let mut skip = args.ratings.clone();
    skip.extend(args.shop.iter().cloned());
    let jobs = match job_files::find(&args.jobs, args.recursive, &skip) {
        Ok(jobs) => jobs,
        Err(e) => {
            eprintln!(
                "{}",
                super::ui::english(&Msg::new("cli-error").arg("error", e.to_string()))
            );
            return Err(Exit::InvalidInput);
        }
    };
    if jobs.is_empty() {
        let names: Vec<String> = args.jobs.iter().map(|p| p.display().to_string()).collect();
        let key = if args.recursive {
            "cli-no-job-files"
        } else {
            "cli-no-job-files-here"
        };
        eprintln!(
            "{}",
            super::ui::english(&Msg::new(key).arg("folders", names.join(", ")))
        );
        return Err(Exit::InvalidInput);
    }
    Ok(jobs)
}

/// Colour as `--color` and NO_COLOR say, for standard output.
pub fn colour_wanted() -> bool {
    super::ui::colour(super::ui::Stream::Stdout)
}
