//! `ampreport calc JOB --json`: every derived figure as JSON.

use super::args::CalcArgs;
use super::exit::Exit;
use super::load;
use crate::calc;
use crate::report::json;

pub fn run(args: &CalcArgs) -> Exit {
    let loaded = match load::job(&args.job) {
        Ok(l) => l,
        Err(e) => return e,
    };
    let mut findings = calc::derive(&loaded.decoded.job, &loaded.ratings);
    load::stamp(&args.job.job, &loaded, &mut findings);
    print!("{}", json::render(&findings));
    Exit::Success
}
