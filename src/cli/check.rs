//! `ampreport check JOB`: the terminal summary.

use super::args::{CheckArgs, StrictSets};
use super::exit::Exit;
use super::load;
use crate::calc::{self, StrictScope};
use crate::catalogue::Catalogue;
use crate::report::terminal::{self, TerminalStyle};

pub fn run(args: &CheckArgs) -> Exit {
    let loaded = match load::job(&args.job) {
        Ok(l) => l,
        Err(e) => return e,
    };
    let findings = calc::derive(&loaded.decoded.job, &loaded.ratings);
    let style = TerminalStyle {
        colour: colour_wanted(),
        catalogue: loaded
            .shop
            .as_ref()
            .map_or_else(|| Catalogue::english().clone(), |s| s.catalogue.clone()),
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

/// Colour as `--color` and NO_COLOR say, for standard output.
pub fn colour_wanted() -> bool {
    super::ui::colour(super::ui::Stream::Stdout)
}
