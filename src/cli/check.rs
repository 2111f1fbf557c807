//! `ampreport check JOB`: the terminal summary.

use std::io::IsTerminal;

use super::args::CheckArgs;
use super::exit::Exit;
use super::load;
use crate::calc::{self, Status};
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
    let over = findings.warnings.iter().any(|w| w.status == Status::Over);
    if args.strict && over {
        Exit::StrictFindings
    } else {
        Exit::Success
    }
}

/// Colour only on a terminal, and never when NO_COLOR is set.
pub fn colour_wanted() -> bool {
    std::io::stdout().is_terminal() && std::env::var_os("NO_COLOR").is_none_or(|v| v.is_empty())
}
