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
    let findings = calc::derive(&loaded.decoded.job, &loaded.ratings);
    print!("{}", json::render(&findings));
    Exit::Success
}
