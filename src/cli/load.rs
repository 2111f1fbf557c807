//! Reading a job file and the ratings it needs, shared by every command
//! that takes a job. Problems are printed here as diagnostics.

use std::path::Path;

use super::args::JobArgs;
use super::exit::Exit;
use crate::job::{self, Decoded};
use crate::ratings::RatingsTable;

/// The built-in ratings plus any shop files named on the command line.
pub fn ratings(files: &[std::path::PathBuf]) -> Result<RatingsTable, Exit> {
    let mut table = RatingsTable::builtin();
    for f in files {
        if let Err(report) = table.load_shop_file(f) {
            eprintln!("{report:?}");
            return Err(Exit::InvalidInput);
        }
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
    let text = read_text(&args.job)?;
    let name = args.job.display().to_string();
    let decoded = match job::decode_with_ratings(&name, &text, &ratings) {
        Ok(d) => d,
        Err(diagnostics) => {
            eprintln!("{:?}", miette::Report::new(diagnostics));
            return Err(Exit::InvalidInput);
        }
    };
    if !decoded.diagnostics.problems.is_empty() {
        eprintln!("{:?}", miette::Report::new(decoded.diagnostics.clone()));
    }
    Ok(Loaded {
        decoded,
        text,
        ratings,
    })
}

pub fn read_text(path: &Path) -> Result<String, Exit> {
    crate::input_file::read_text(path, "job file").map_err(|e| {
        eprintln!("error: {e}");
        Exit::InvalidInput
    })
}
