//! Shell completion: `ampreport completions SHELL` prints a short script
//! for bash, zsh, fish, PowerShell or elvish that asks the program itself what to
//! offer each time Tab is pressed (clap_complete's dynamic engine: the
//! script runs `AMPREPORT_COMPLETE=SHELL ampreport -- WORDS…`, and
//! [`complete_if_asked`] answers before anything else runs).
//!
//! Dynamic rather than a fixed script, so that what is offered is worked out
//! at the moment: the valve types of the built-in ratings table (and their
//! equivalents) for `tubes`; job files (`.kdl`, folders to walk into, and
//! `-` for standard input) for the commands that take a job and for
//! `--ratings`; `.pdf` files and `-` for `render -o`; folders for
//! `--templates`, `--emit-source` and `man`; programs for `--typst`;
//! subcommands, options and the values of `--color` and `completions`
//! everywhere. Every shell listed gets the same answers. The cost: the
//! program must be on `PATH` under the name `ampreport`, and it runs once
//! per Tab (a few milliseconds). Valve types added by a shop's
//! `--ratings` file are not offered: the engine hands a completer only the
//! word being completed, not the rest of the line.

use std::ffi::OsStr;
use std::io::Write;

use clap::CommandFactory;
use clap_complete::engine::{CompletionCandidate, PathCompleter};
use clap_complete::env::{Bash, CompleteEnv, Elvish, EnvCompleter, Fish, Powershell, Shells, Zsh};

use super::args::{Cli, CompletionsArgs};
use super::exit::Exit;
use crate::ratings::RatingsTable;

/// The environment variable through which a completion script asks the
/// program for candidates. A name of the program's own, so that a
/// `COMPLETE` set for some other tool never changes what ampreport does.
pub const COMPLETE_ENV: &str = "AMPREPORT_COMPLETE";

/// The name the scripts call the program by.
const PROGRAM: &str = "ampreport";

/// The shells a script can be printed for.
#[derive(Debug, Clone, Copy, PartialEq, Eq, clap::ValueEnum)]
pub enum Shell {
    Bash,
    Zsh,
    Fish,
    #[value(alias = "pwsh")]
    Powershell,
    Elvish,
}

impl Shell {
    fn completer(self) -> &'static dyn EnvCompleter {
        match self {
            Shell::Bash => &Bash,
            Shell::Zsh => &Zsh,
            Shell::Fish => &Fish,
            Shell::Powershell => &Powershell,
            Shell::Elvish => &Elvish,
        }
    }
}

/// Every shell a completion request may come from.
const SHELLS: Shells<'static> = Shells(&[&Bash, &Zsh, &Fish, &Powershell, &Elvish]);

/// Answers a completion request from one of the scripts and exits, when
/// [`COMPLETE_ENV`] is set; returns at once otherwise. Called first thing,
/// before anything is written to standard output.
pub fn complete_if_asked() {
    CompleteEnv::with_factory(Cli::command)
        .var(COMPLETE_ENV)
        .shells(SHELLS)
        .complete();
}

/// The completion script for `shell`.
pub fn script(shell: Shell) -> Vec<u8> {
    let mut buf = Vec::new();
    shell
        .completer()
        .write_registration(COMPLETE_ENV, PROGRAM, PROGRAM, PROGRAM, &mut buf)
        .expect("writing to memory does not fail");
    buf
}

pub fn run(args: &CompletionsArgs) -> Exit {
    let mut out = std::io::stdout().lock();
    match out
        .write_all(&script(args.shell))
        .and_then(|()| out.flush())
    {
        Ok(()) => Exit::Success,
        Err(e) => {
            eprintln!("error: could not write the completion script: {e}");
            Exit::Environment
        }
    }
}

/// Job and ratings files: `.kdl` files, folders to walk into, and `-`.
pub fn job_files() -> PathCompleter {
    PathCompleter::any()
        .filter(|p| p.is_file() && p.extension().is_some_and(|e| e == "kdl"))
        .stdio()
}

/// Where a PDF may go: `.pdf` files, folders, and `-`.
pub fn pdf_files() -> PathCompleter {
    PathCompleter::any()
        .filter(|p| p.is_file() && p.extension().is_some_and(|e| e == "pdf"))
        .stdio()
}

/// The built-in valve types and their equivalents that begin with
/// `current` (in any case), each with its class, or the type it is an
/// equivalent of, as help.
pub fn valve_types(current: &OsStr) -> Vec<CompletionCandidate> {
    let typed = current.to_string_lossy().to_uppercase();
    let table = RatingsTable::builtin();
    let mut out = Vec::new();
    for rating in table.iter() {
        let mut offer = |name: &str, help: String| {
            if name.to_uppercase().starts_with(&typed) {
                out.push(CompletionCandidate::new(name).help(Some(help.into())));
            }
        };
        offer(&rating.name, rating.class.to_string());
        for equivalent in &rating.equivalents {
            offer(equivalent, format!("{} ({})", rating.name, rating.class));
        }
    }
    out
}

#[cfg(test)]
mod tests {
    use super::*;

    fn names(candidates: &[CompletionCandidate]) -> Vec<String> {
        candidates
            .iter()
            .map(|c| c.get_value().to_string_lossy().into_owned())
            .collect()
    }

    #[test]
    fn valve_types_are_offered_by_prefix_in_any_case() {
        let all = valve_types(OsStr::new(""));
        assert!(all.len() > RatingsTable::builtin().len(), "equivalents too");
        let el8 = names(&valve_types(OsStr::new("el8")));
        assert!(el8.contains(&"EL84".to_owned()), "{el8:?}");
        assert!(
            el8.iter().all(|n| n.to_uppercase().starts_with("EL8")),
            "{el8:?}"
        );
        // An equivalent is offered under its own name, pointing at its row.
        let bq5 = valve_types(OsStr::new("6BQ5"));
        assert_eq!(names(&bq5), ["6BQ5"]);
        assert!(
            bq5[0].get_help().unwrap().to_string().starts_with("EL84 ("),
            "{:?}",
            bq5[0].get_help()
        );
        assert!(valve_types(OsStr::new("no-such")).is_empty());
    }

    #[test]
    fn each_script_calls_the_program_back_through_its_own_variable() {
        for shell in [
            Shell::Bash,
            Shell::Zsh,
            Shell::Fish,
            Shell::Powershell,
            Shell::Elvish,
        ] {
            let text = String::from_utf8(script(shell)).unwrap();
            assert!(text.contains(COMPLETE_ENV), "{shell:?}:\n{text}");
            assert!(text.contains(PROGRAM), "{shell:?}:\n{text}");
        }
    }
}
