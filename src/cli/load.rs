//! Reading a job file (or a job on standard input, named `-`) and the
//! ratings it needs, shared by every command that takes a job. Problems are
//! printed here as diagnostics; `--verbose` says what was read from where.

use std::io::IsTerminal;
use std::path::Path;

use super::args::JobArgs;
use super::exit::Exit;
use super::ui;
use crate::input_file::{STDIN_NAME, is_dash};
use crate::job::{self, Decoded};
use crate::ratings::RatingsTable;

/// The built-in ratings plus any shop files named on the command line.
pub fn ratings(files: &[std::path::PathBuf]) -> Result<RatingsTable, Exit> {
    let mut table = RatingsTable::builtin();
    ui::read(
        "ratings",
        format!("built in ({} types, embedded in the program)", table.len()),
    );
    for f in files {
        if let Err(report) = table.load_shop_file(f) {
            eprintln!("{report:?}");
            return Err(Exit::InvalidInput);
        }
        ui::read(
            "ratings",
            format!("{} (a shop's ratings file)", f.display()),
        );
    }
    Ok(table)
}

/// A decoded job whose valve types are all known, with its text and
/// ratings; warnings are printed to standard error.
pub struct Loaded {
    pub decoded: Decoded,
    /// The job file as read, for the document footer's checksum.
    #[allow(dead_code)]
    pub text: String,
    pub ratings: RatingsTable,
}

pub fn job(args: &JobArgs) -> Result<Loaded, Exit> {
    let ratings = ratings(&args.ratings)?;
    let text = read_job(&args.job)?;
    let name = job_name(&args.job);
    let decoded = match job::decode_with_ratings(&name, &text, &ratings) {
        Ok(d) => d,
        Err(diagnostics) => {
            eprintln!("{:?}", miette::Report::new(diagnostics));
            return Err(Exit::InvalidInput);
        }
    };
    if !decoded.diagnostics.problems.is_empty() {
        ui::warn(format!(
            "{:?}",
            miette::Report::new(decoded.diagnostics.clone())
        ));
    }
    Ok(Loaded {
        decoded,
        text,
        ratings,
    })
}

/// The name a job has in messages: its path, or `<stdin>` for `-`.
pub fn job_name(path: &Path) -> String {
    if is_dash(path) {
        STDIN_NAME.to_owned()
    } else {
        path.display().to_string()
    }
}

/// The job's text, from its file or, for `-`, from standard input, under
/// the same size and UTF-8 rules.
pub fn read_job(path: &Path) -> Result<String, Exit> {
    let read = if is_dash(path) {
        if std::io::stdin().is_terminal() {
            ui::warn("note: reading the job from standard input; end it with Ctrl-D");
        }
        crate::input_file::read_stdin("job file")
    } else {
        crate::input_file::read_text(path, "job file")
    };
    let text = read.map_err(|e| {
        eprintln!("error: {e}");
        Exit::InvalidInput
    })?;
    let whence = if is_dash(path) {
        "standard input".to_owned()
    } else {
        path.display().to_string()
    };
    ui::read("job", format!("{whence} ({} bytes)", text.len()));
    Ok(text)
}
