//! Reading a job file and the ratings it needs, shared by every command
//! that takes jobs. Problems are gathered as diagnostics in a [`Said`], so
//! that jobs read side by side report whole blocks.

use std::path::Path;

use super::exit::Exit;
use super::said::Said;
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

/// A decoded job whose valve types are all known, with its text; warnings
/// are in the [`Said`] it was read with.
pub struct Loaded {
    pub decoded: Decoded,
    /// The job file as read, for the document footer's checksum and the
    /// content key.
    pub text: String,
}

/// Reads and decodes the job at `path` against `ratings`.
pub fn job(path: &Path, ratings: &RatingsTable, said: &mut Said) -> Result<Loaded, Exit> {
    let text = read_text(path, said)?;
    decode(path, text, ratings, said)
}

/// Decodes `text`, read from the job file at `path`, against `ratings`.
pub fn decode(
    path: &Path,
    text: String,
    ratings: &RatingsTable,
    said: &mut Said,
) -> Result<Loaded, Exit> {
    let name = path.display().to_string();
    let decoded = match job::decode_with_ratings(&name, &text, ratings) {
        Ok(d) => d,
        Err(diagnostics) => {
            let title = diagnostics.errors().next().map(|p| {
                let (line, column) = job::line_column(&text, p.span.offset());
                format!("{name}:{line}:{column}: {}", p.message)
            });
            let report = format!("{:?}", miette::Report::new(diagnostics));
            match title {
                Some(title) => said.error_titled(report, title),
                None => said.error(report),
            }
            return Err(Exit::InvalidInput);
        }
    };
    if !decoded.diagnostics.problems.is_empty() {
        said.err(format!(
            "{:?}",
            miette::Report::new(decoded.diagnostics.clone())
        ));
    }
    Ok(Loaded { decoded, text })
}

pub fn read_text(path: &Path, said: &mut Said) -> Result<String, Exit> {
    crate::input_file::read_text(path, "job file").map_err(|e| {
        said.error(format!("error: {e}"));
        Exit::InvalidInput
    })
}
