//! Reading a file of a shop's template folder without ever leaving it: every
//! folder on the way must be a real folder and the file a regular file, none
//! of them a symbolic link, so a link such as `images/leak.txt -> /etc/passwd`
//! or `parts -> /etc` cannot bring an outside file into a document. A FIFO
//! or a device is refused too (reading one could hang or never end).

use std::io::{self, Read};
use std::path::{Path, PathBuf};

/// Why a file inside the folder could not be used.
#[derive(Debug, thiserror::Error)]
pub enum InsideError {
    #[error("{} is a symbolic link; only regular files inside the template folder are used (copy the file in instead of linking it)", path.display())]
    Link { path: PathBuf },
    #[error("{} is not a regular file", path.display())]
    NotAFile { path: PathBuf },
    #[error("`{name}` is not a plain relative path inside the template folder")]
    BadName { name: String },
    #[error("could not read {}: {source}", path.display())]
    Io {
        path: PathBuf,
        #[source]
        source: io::Error,
    },
}

impl InsideError {
    /// The refusal as a catalogue message (`cli-inside-…`), to be said in
    /// the reader's language.
    pub fn msg(&self) -> crate::catalogue::Msg {
        use crate::catalogue::Msg;
        match self {
            InsideError::Link { path } => {
                Msg::new("cli-inside-link").arg("path", path.display().to_string())
            }
            InsideError::NotAFile { path } => {
                Msg::new("cli-inside-not-a-file").arg("path", path.display().to_string())
            }
            InsideError::BadName { name } => Msg::new("cli-inside-bad-name").arg("name", name),
            InsideError::Io { path, source } => Msg::new("cli-inside-cannot-read")
                .arg("path", path.display().to_string())
                .arg("error", crate::catalogue::os_error(source)),
        }
    }
}

/// Reads `dir/name`, where `name` is a `/`-separated relative path with no
/// `.`/`..` parts. `Ok(None)` when there is no such file.
pub fn read_inside(dir: &Path, name: &str) -> Result<Option<Vec<u8>>, InsideError> {
    let bad = name.is_empty()
        || name.starts_with('/')
        || name.contains('\\')
        || name.contains(':')
        || name.chars().any(char::is_control)
        || name
            .split('/')
            .any(|p| p.is_empty() || p == "." || p == "..");
    if bad {
        return Err(InsideError::BadName {
            name: name.to_owned(),
        });
    }
    let parts: Vec<&str> = name.split('/').collect();
    let mut path = dir.to_path_buf();
    for (i, part) in parts.iter().enumerate() {
        path.push(part);
        let meta = match std::fs::symlink_metadata(&path) {
            Ok(meta) => meta,
            Err(e) if e.kind() == io::ErrorKind::NotFound => return Ok(None),
            Err(source) => return Err(InsideError::Io { path, source }),
        };
        let kind = meta.file_type();
        if kind.is_symlink() {
            return Err(InsideError::Link { path });
        }
        let last = i + 1 == parts.len();
        if !last && !kind.is_dir() {
            return Ok(None);
        }
        if last && !kind.is_file() {
            return Err(InsideError::NotAFile { path });
        }
    }
    read_regular(&path).map(Some)
}

/// Reads a file that must be a regular file and not a link, checked on the
/// opened file itself, so a swap after the check above changes nothing.
pub fn read_regular(path: &Path) -> Result<Vec<u8>, InsideError> {
    let mut options = std::fs::OpenOptions::new();
    options.read(true);
    #[cfg(unix)]
    {
        use std::os::unix::fs::OpenOptionsExt;
        options.custom_flags(libc::O_NOFOLLOW | libc::O_NONBLOCK);
    }
    let io_error = |source| InsideError::Io {
        path: path.to_path_buf(),
        source,
    };
    let mut file = match options.open(path) {
        Ok(file) => file,
        #[cfg(unix)]
        Err(e) if e.raw_os_error() == Some(libc::ELOOP) => {
            return Err(InsideError::Link {
                path: path.to_path_buf(),
            });
        }
        Err(e) => return Err(io_error(e)),
    };
    let meta = file.metadata().map_err(io_error)?;
    if !meta.is_file() {
        return Err(InsideError::NotAFile {
            path: path.to_path_buf(),
        });
    }
    let mut bytes = Vec::new();
    file.read_to_end(&mut bytes).map_err(io_error)?;
    Ok(bytes)
}

#[cfg(all(test, unix))]
mod tests {
    use super::*;
    use std::os::unix::fs::symlink;

    #[test]
    fn plain_files_are_read_and_links_refused() {
        let outside = tempfile::tempdir().unwrap();
        std::fs::write(outside.path().join("secret"), "secret").unwrap();
        let dir = tempfile::tempdir().unwrap();
        std::fs::create_dir(dir.path().join("parts")).unwrap();
        std::fs::write(dir.path().join("parts/a.typ"), "part a").unwrap();
        symlink(outside.path().join("secret"), dir.path().join("leak.txt")).unwrap();
        symlink(outside.path(), dir.path().join("linked")).unwrap();
        symlink(dir.path().join("parts/a.typ"), dir.path().join("inner.typ")).unwrap();

        assert_eq!(
            read_inside(dir.path(), "parts/a.typ").unwrap().unwrap(),
            b"part a"
        );
        assert!(read_inside(dir.path(), "missing.typ").unwrap().is_none());
        for name in ["leak.txt", "linked/secret", "inner.typ"] {
            let err = read_inside(dir.path(), name).unwrap_err();
            assert!(matches!(err, InsideError::Link { .. }), "{name}: {err:?}");
            assert!(err.to_string().contains("symbolic link"), "{err}");
        }
        for name in ["../x", "/etc/passwd", "a//b", "./a"] {
            assert!(matches!(
                read_inside(dir.path(), name),
                Err(InsideError::BadName { .. })
            ));
        }
        assert!(matches!(
            read_inside(dir.path(), "parts"),
            Err(InsideError::NotAFile { .. })
        ));
    }
}
