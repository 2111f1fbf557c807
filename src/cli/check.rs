//! `ampreport check JOB`: the terminal summary.

use std::io::IsTerminal;

use super::args::{CheckArgs, StrictSets};
use super::exit::Exit;
use super::load;
use crate::calc::{self, StrictScope};
use crate::report::terminal::{self, TerminalStyle};

pub fn run(args: &CheckArgs) -> Exit {
    let loaded = match load::job(&args.job) {
        Ok(l) => l,
        Err(e) => return e,
    };
    let findings = calc::derive(&loaded.decoded.job, &loaded.ratings);
    let style = TerminalStyle {
        colour: colour_wanted(),
    };
    print!(
        "{}",
        terminal::render(&loaded.decoded.job, &findings, &style)
    );
    let scope = match args.strict {
        None => return Exit::Success,
        Some(StrictSets::Final) => StrictScope::Final,
        Some(StrictSets::All) => StrictScope::All,
    };
    if findings.strict_failures(scope).is_empty() {
        Exit::Success
    } else {
        Exit::StrictFindings
    }
}

/// Colour only on a terminal, and never when NO_COLOR is set.
pub fn colour_wanted() -> bool {
    std::io::stdout().is_terminal() && std::env::var_os("NO_COLOR").is_none_or(|v| v.is_empty())
}
