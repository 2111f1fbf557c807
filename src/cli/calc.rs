//! `ampreport calc JOB|DIR… --json`: every derived figure as JSON.
//!
//! One job prints one JSON document, as it always has. Several jobs print
//! JSON Lines: one compact document per job, one per line, in the order
//! the jobs were named (each carries its `job.source`). A job that cannot
//! be read prints its diagnostics on standard error and no line, does not
//! stop the others, and makes the exit status 1.

use super::args::CalcArgs;
use super::check::named_jobs;
use super::exit::Exit;
use super::load;
use super::said::Said;
use crate::calc;
use crate::report::json;

pub fn run(args: &CalcArgs) -> Exit {
    let jobs = match named_jobs(&args.job) {
        Ok(jobs) => jobs,
        Err(e) => return e,
    };
    let ratings = match load::ratings(&args.job.ratings) {
        Ok(r) => r,
        Err(e) => return e,
    };
    let lines = jobs.len() > 1 || args.job.jobs.iter().any(|p| p.is_dir());
    let mut exit = Exit::Success;
    for job in &jobs {
        let mut said = Said::default();
        match load::job(&job.path, args.job.shop_choice(), &ratings, &mut said) {
            Ok(loaded) => {
                let mut findings =
                    calc::derive_in(&loaded.decoded.job, &ratings, loaded.catalogue());
                load::stamp(&job.path, &loaded, &mut findings);
                if lines {
                    said.out.push_str(&json::render_line(&findings));
                } else {
                    said.out.push_str(&json::render(&findings));
                }
            }
            Err(e) => exit = e,
        }
        said.print();
    }
    exit
}
