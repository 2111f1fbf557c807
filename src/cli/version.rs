//! `ampreport --version`: the program's own version, the versions of the
//! job format it reads and the JSON schema it writes, and the typst program
//! `render` would use (found as `render` finds it: `AMPREPORT_TYPST`, else
//! `typst` on `PATH`) with its version, or why there is none and how to
//! install the tested one. Asking typst takes at most the typst time limit
//! (`AMPREPORT_TIMEOUT`, default 120 seconds). typst is always asked here,
//! never answered from what was remembered (`typeset::known_version`),
//! and its answer is kept for the renders after.

use std::time::Duration;

use super::args::parse_timeout;
use super::exit::Exit;
use super::ui;
use crate::typeset::{self, INSTALL_HINT, TypesetError};

/// The script that installs the tested typst from a source checkout.
pub const INSTALL_SCRIPT: &str = "bash scripts/need-typst.sh";

pub fn run() -> Exit {
    let timeout = match std::env::var("AMPREPORT_TIMEOUT") {
        Ok(text) => parse_timeout(&text).unwrap_or_else(|e| {
            ui::warn(format!(
                "warning: AMPREPORT_TIMEOUT: {e}; asking typst with the default limit"
            ));
            typeset::DEFAULT_TIMEOUT
        }),
        Err(_) => typeset::DEFAULT_TIMEOUT,
    };
    print!("{}", report(timeout));
    Exit::Success
}

/// The whole report, one fact a line.
pub fn report(timeout: Duration) -> String {
    let typst = match typeset::start_locate_afresh(None).finish_within(timeout) {
        Ok(program) => {
            let mut line = format!("typst {} at {}", program.version, program.path.display());
            if let Some(warning) = program.version_warning() {
                line.push_str(&format!(" (warning: {warning})"));
            }
            line
        }
        Err(e) => typst_problem(&e),
    };
    format!(
        "ampreport {}\njob format {}\nJSON schema {}\n{typst}\n",
        env!("CARGO_PKG_VERSION"),
        crate::job::FORMAT_VERSION,
        crate::calc::SCHEMA,
    )
}

/// The typst line when no usable typst was found: what went wrong, and how
/// to get the tested version.
fn typst_problem(e: &TypesetError) -> String {
    let install = format!(
        "install typst {} with `{INSTALL_SCRIPT}` in a source checkout, or `{INSTALL_HINT}`",
        typeset::MIN_TYPST
    );
    match e {
        TypesetError::NotFound { looked } => {
            format!("typst not found ({}); {install}", looked.english())
        }
        other => format!("typst unusable: {other}; {install}"),
    }
}
