//! Reading an input text file (a job, a shop's ratings file), or a job
//! from standard input, with a bound on its size and a line and column for
//! bytes that are not UTF-8. A job file is a few kilobytes; one of many
//! megabytes is a mistake (the wrong file, a log, a disk image), and reading
//! it whole would cost memory out of all proportion (a 68 MB file once took
//! 790 MB to refuse).

use std::io::Read;
use std::path::{Path, PathBuf};

use crate::catalogue::{Msg, os_error};

/// The largest input text file read: 16 MiB, thousands of times a real
/// job file, far below what would strain memory.
pub const MAX_INPUT_BYTES: u64 = 16 * 1024 * 1024;

/// Why an input file could not be read as text.
#[derive(Debug, thiserror::Error)]
pub enum InputFileError {
    #[error("cannot read the {what} {path}: {source}")]
    Io {
        what: &'static str,
        path: String,
        #[source]
        source: std::io::Error,
    },
    #[error(
        "the {what} {path} is larger than {} MiB; a job or ratings file is a few kilobytes, so this is probably the wrong file",
        MAX_INPUT_BYTES / (1024 * 1024)
    )]
    TooLarge { what: &'static str, path: String },
    #[error(
        "{path}:{line}:{column}: the {what} is not UTF-8 text (byte 0x{byte:02x} here); save it as UTF-8"
    )]
    NotUtf8 {
        what: &'static str,
        path: String,
        line: usize,
        column: usize,
        byte: u8,
    },
}

/// The keys of the three messages a text input's reading problems are
/// said with: it cannot be read (`$path`, `$error`), it is too large
/// (`$path`, `$limit` in MiB), it is not UTF-8 (`$place` as
/// `file:line:column`, `$byte` as `0x9f`). Each kind of input (a job
/// file, a translation file) has its own words with the same arguments.
#[derive(Debug, Clone, Copy)]
pub struct ReadKeys {
    pub cannot_read: &'static str,
    pub too_large: &'static str,
    pub not_utf8: &'static str,
}

/// A job file's reading problems (`cli-job-file-…`).
pub const JOB_FILE_KEYS: ReadKeys = ReadKeys {
    cannot_read: "cli-job-file-cannot-read",
    too_large: "cli-job-file-too-large",
    not_utf8: "cli-job-file-not-utf8",
};

impl InputFileError {
    /// The problem as a catalogue message with `keys`' words, to be said
    /// in the reader's language (a job file's: the language of the shop
    /// profile serving its folder); the path and the line:column are the
    /// same as in English, the operating system's answer is the
    /// catalogue's words for it ([`os_error`]).
    pub fn msg(&self, keys: &ReadKeys) -> Msg {
        match self {
            InputFileError::Io { path, source, .. } => Msg::new(keys.cannot_read)
                .arg("path", path)
                .arg("error", os_error(source)),
            InputFileError::TooLarge { path, .. } => too_large_msg(keys, path),
            InputFileError::NotUtf8 {
                path,
                line,
                column,
                byte,
                ..
            } => Msg::new(keys.not_utf8)
                .arg("place", format!("{path}:{line}:{column}"))
                .arg("byte", format!("0x{byte:02x}")),
        }
    }
}

/// The too-large message of `keys` for the file `path`, with the limit
/// every input text file is held to.
pub fn too_large_msg(keys: &ReadKeys, path: &str) -> Msg {
    Msg::new(keys.too_large)
        .arg("path", path)
        .arg("limit", (MAX_INPUT_BYTES / (1024 * 1024)).to_string())
}

/// The name a job read from standard input has in messages and
/// diagnostics.
pub const STDIN_NAME: &str = "<stdin>";

/// True for the path `-`, which stands for standard input (a job) or
/// standard output (a PDF). A file of that name is written `./-`.
pub fn is_dash(path: &Path) -> bool {
    path.as_os_str() == "-"
}

/// Reads `path` as UTF-8 text of at most [`MAX_INPUT_BYTES`]; `what` names
/// the file in messages ("job file").
pub fn read_text(path: &Path, what: &'static str) -> Result<String, InputFileError> {
    let shown = path.display().to_string();
    let file = std::fs::File::open(path).map_err(|source| InputFileError::Io {
        what,
        path: shown.clone(),
        source,
    })?;
    read_from(file, shown, what)
}

/// Reads standard input as UTF-8 text under the same rules as
/// [`read_text`], named [`STDIN_NAME`] in messages.
pub fn read_stdin(what: &'static str) -> Result<String, InputFileError> {
    read_from(std::io::stdin().lock(), STDIN_NAME.to_owned(), what)
}

/// Reads `source` as UTF-8 text of at most [`MAX_INPUT_BYTES`]; `shown`
/// names it in messages. At most one byte past the limit is read, so an
/// endless pipe or a device is refused without filling memory.
pub fn read_from(
    source: impl Read,
    shown: String,
    what: &'static str,
) -> Result<String, InputFileError> {
    let mut bytes = Vec::new();
    source
        .take(MAX_INPUT_BYTES + 1)
        .read_to_end(&mut bytes)
        .map_err(|source| InputFileError::Io {
            what,
            path: shown.clone(),
            source,
        })?;
    if bytes.len() as u64 > MAX_INPUT_BYTES {
        return Err(InputFileError::TooLarge { what, path: shown });
    }
    String::from_utf8(bytes).map_err(|e| {
        let good = e.utf8_error().valid_up_to();
        let bytes = e.as_bytes();
        let text = std::str::from_utf8(&bytes[..good]).unwrap_or_default();
        let line = text.matches('\n').count() + 1;
        let line_start = text.rfind('\n').map_or(0, |i| i + 1);
        InputFileError::NotUtf8 {
            what,
            path: shown.clone(),
            line,
            column: text[line_start..].chars().count() + 1,
            byte: bytes.get(good).copied().unwrap_or(0),
        }
    })
}

/// Why a file named relative to a folder (a photo beside a job, a logo
/// beside a shop profile) could not be read.
#[derive(Debug, thiserror::Error)]
pub enum InFolderError {
    /// Empty, absolute, or with a `..` part.
    #[error("`{written}` is not a path inside the folder")]
    NotInside { written: String },
    /// A symbolic link on the way leads out of the folder.
    #[error("`{written}` leads outside the folder (to {})", real.display())]
    LeadsOutside { written: String, real: PathBuf },
    #[error("{} is not a regular file", path.display())]
    NotAFile { path: PathBuf },
    #[error("{} is {size} bytes; the limit is {limit}", path.display())]
    TooLarge {
        path: PathBuf,
        size: u64,
        limit: u64,
    },
    #[error("cannot read {}: {source}", path.display())]
    Io {
        path: PathBuf,
        #[source]
        source: std::io::Error,
    },
}

/// A file read from inside a folder.
#[derive(Debug, Clone, PartialEq, Eq)]
pub struct InFolder {
    /// The path as joined to the folder (links not followed).
    pub place: PathBuf,
    /// Where it really is (links followed), inside the folder.
    pub real: PathBuf,
    pub bytes: Vec<u8>,
}

/// Reads `written`, a path relative to `folder`, of at most `limit` bytes.
/// The path must be relative with no `..` part; links are followed but
/// must end inside the folder (a link out is refused, wherever it is on
/// the way); the end must be a regular file, checked on the opened file
/// itself (a FIFO or a device is never read from); the size is checked
/// before reading and again on the bytes read.
pub fn read_in_folder(folder: &Path, written: &str, limit: u64) -> Result<InFolder, InFolderError> {
    use std::path::Component;
    let path = Path::new(written);
    if written.trim().is_empty()
        || !path
            .components()
            .all(|c| matches!(c, Component::Normal(_) | Component::CurDir))
    {
        return Err(InFolderError::NotInside {
            written: written.to_string(),
        });
    }
    let folder = if folder.as_os_str().is_empty() {
        Path::new(".")
    } else {
        folder
    };
    let place = folder.join(path);
    let io = |path: &Path| {
        let path = path.to_path_buf();
        move |source| InFolderError::Io { path, source }
    };
    let real_folder = folder.canonicalize().map_err(io(folder))?;
    let real = place.canonicalize().map_err(io(&place))?;
    if !real.starts_with(&real_folder) {
        return Err(InFolderError::LeadsOutside {
            written: written.to_string(),
            real,
        });
    }
    let mut options = std::fs::OpenOptions::new();
    options.read(true);
    #[cfg(unix)]
    {
        use std::os::unix::fs::OpenOptionsExt;
        options.custom_flags(libc::O_NOFOLLOW | libc::O_NONBLOCK);
    }
    let file = options.open(&real).map_err(io(&place))?;
    let meta = file.metadata().map_err(io(&place))?;
    if !meta.is_file() {
        return Err(InFolderError::NotAFile { path: place });
    }
    let too_large = |size| InFolderError::TooLarge {
        path: place.clone(),
        size,
        limit,
    };
    if meta.len() > limit {
        return Err(too_large(meta.len()));
    }
    let mut bytes = Vec::new();
    file.take(limit + 1)
        .read_to_end(&mut bytes)
        .map_err(io(&place))?;
    if bytes.len() as u64 > limit {
        return Err(too_large(bytes.len() as u64));
    }
    Ok(InFolder { place, real, bytes })
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn a_bad_byte_is_placed_by_line_and_column() {
        let dir = tempfile::tempdir().unwrap();
        let path = dir.path().join("j.kdl");
        std::fs::write(&path, b"job-format 1\nunit make=\"D\xc2\xb5o\xff\"\n").unwrap();
        let e = read_text(&path, "job file").unwrap_err();
        // Line 2: `unit make="Dµo` is 14 characters, so the bad byte is column 15.
        assert!(
            e.to_string()
                .contains("j.kdl:2:15: the job file is not UTF-8 text (byte 0xff here)"),
            "{e}"
        );
    }

    #[test]
    fn a_file_over_the_limit_is_refused_without_reading_it_all() {
        let dir = tempfile::tempdir().unwrap();
        let path = dir.path().join("big.kdl");
        let f = std::fs::File::create(&path).unwrap();
        f.set_len(MAX_INPUT_BYTES + 1).unwrap();
        assert!(matches!(
            read_text(&path, "job file"),
            Err(InputFileError::TooLarge { .. })
        ));
        f.set_len(MAX_INPUT_BYTES).unwrap();
        // Exactly at the limit: read (zeros are valid UTF-8).
        assert!(read_text(&path, "job file").is_ok());
    }

    #[test]
    fn a_stream_is_bounded_and_named_as_given() {
        // An endless stream: refused after one byte past the limit.
        let endless = std::io::repeat(b'a');
        let e = read_from(endless, STDIN_NAME.into(), "job file").unwrap_err();
        assert!(matches!(e, InputFileError::TooLarge { .. }), "{e:?}");
        assert!(
            e.to_string()
                .contains("the job file <stdin> is larger than 16 MiB"),
            "{e}"
        );
        let e = read_from(&b"a\n\xfe"[..], STDIN_NAME.into(), "job file").unwrap_err();
        assert!(
            e.to_string()
                .starts_with("<stdin>:2:1: the job file is not UTF-8"),
            "{e}"
        );
        assert_eq!(
            read_from(&b"job-format 1\n"[..], STDIN_NAME.into(), "job file").unwrap(),
            "job-format 1\n"
        );
        assert!(is_dash(Path::new("-")));
        assert!(!is_dash(Path::new("./-")) && !is_dash(Path::new("--")));
    }
}
