//! Exit statuses, distinct and documented in `--help` and the README.

use std::process::ExitCode;

/// Why the program stopped.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum Exit {
    Success,
    /// The job file or a ratings file is invalid or unreadable.
    InvalidInput,
    /// The command line is wrong: it could not be parsed (clap's own
    /// status), or it names an output that must not be written.
    Usage,
    /// The tool's environment failed: a missing program, an unwritable folder.
    Environment,
    /// `--strict` and some figure is over its limit.
    StrictFindings,
    /// A stop signal (its number) came; the process ends as that signal
    /// would end it, or with 128 + the number.
    Interrupted(i32),
}

impl Exit {
    pub fn code(self) -> u8 {
        match self {
            Exit::Success => 0,
            Exit::InvalidInput => 1,
            Exit::Usage => 2,
            Exit::Environment => 3,
            Exit::StrictFindings => 4,
            Exit::Interrupted(signal) => u8::try_from(128 + signal).unwrap_or(255),
        }
    }
}

impl From<Exit> for ExitCode {
    fn from(e: Exit) -> ExitCode {
        ExitCode::from(e.code())
    }
}
