//! Temporary files and folders that a later run can clean up when the run
//! that made them was killed outright (`kill -9`, a power cut), without ever
//! touching one that a live run is still using.
//!
//! Each temporary has a recognisable name and its owner holds an exclusive
//! lock (`flock`) on it for as long as it lives. The lock goes away with the
//! process however it ends, so [`sweep`] removes every entry with such a
//! name that it can lock: those are the ones whose owner is gone. An owner
//! checks, once it holds its lock, that the name still leads to what it
//! locked, and starts again with a new name if a sweep got there first.

use std::fs::File;
use std::io;
use std::path::{Path, PathBuf};

/// How many fresh names to try when sweeps keep winning the race.
const ATTEMPTS: usize = 8;

/// A temporary folder whose owner holds its lock; removed when dropped.
#[derive(Debug)]
pub(crate) struct LockedDir {
    // Dropped first: the folder goes while its lock is still held.
    dir: Option<tempfile::TempDir>,
    _lock: File,
}

impl LockedDir {
    /// A new folder `PREFIX<random>` in `parent`, locked. With `mode`, the
    /// folder is made with those permission bits (less the umask); otherwise
    /// it is private to the user.
    pub fn new(parent: &Path, prefix: &str, mode: Option<u32>) -> io::Result<Self> {
        for _ in 0..ATTEMPTS {
            let mut builder = tempfile::Builder::new();
            builder.prefix(prefix);
            #[cfg(unix)]
            {
                use std::os::unix::fs::PermissionsExt;
                builder.permissions(std::fs::Permissions::from_mode(mode.unwrap_or(0o700)));
            }
            #[cfg(not(unix))]
            let _ = mode;
            let dir = builder.tempdir_in(parent)?;
            let lock = match File::open(dir.path()) {
                Ok(lock) => lock,
                // Another run's sweep (or another worker's, in a batch)
                // removed it before it could be opened: make another.
                Err(e) if e.kind() == io::ErrorKind::NotFound => {
                    let _ = dir.keep();
                    continue;
                }
                Err(e) => return Err(e),
            };
            if try_lock(&lock) && same_entry(dir.path(), &lock) {
                return Ok(Self {
                    dir: Some(dir),
                    _lock: lock,
                });
            }
            // A sweep took it between its creation and the lock.
            let _ = dir.keep();
        }
        Err(io::Error::other("could not lock a temporary folder"))
    }

    pub fn path(&self) -> &Path {
        self.dir.as_ref().expect("present until dropped").path()
    }

    /// Gives the folder up without removing it; the lock is released.
    pub fn keep(mut self) -> PathBuf {
        self.dir.take().expect("present until dropped").keep()
    }
}

/// A temporary file whose owner holds its lock; removed when dropped unless
/// persisted.
pub(crate) fn locked_file(
    parent: &Path,
    prefix: &str,
    suffix: &str,
    mode: u32,
) -> io::Result<tempfile::NamedTempFile> {
    for _ in 0..ATTEMPTS {
        let mut builder = tempfile::Builder::new();
        builder.prefix(prefix).suffix(suffix);
        #[cfg(unix)]
        {
            use std::os::unix::fs::PermissionsExt;
            builder.permissions(std::fs::Permissions::from_mode(mode));
        }
        #[cfg(not(unix))]
        let _ = mode;
        let file = builder.tempfile_in(parent)?;
        if try_lock(file.as_file()) && same_entry(file.path(), file.as_file()) {
            return Ok(file);
        }
        let _ = file.keep();
    }
    Err(io::Error::other("could not lock a temporary file"))
}

/// A second, locked name for the file at `original`, beside it in
/// `parent` (a hard link, else a copy with its permissions), removed when
/// dropped unless persisted: what a group of files being put in place
/// keeps of a file it replaces, to put it back if a later file fails.
pub(crate) fn locked_copy(
    parent: &Path,
    prefix: &str,
    suffix: &str,
    original: &Path,
) -> io::Result<tempfile::NamedTempFile<File>> {
    for _ in 0..ATTEMPTS {
        let linked = tempfile::Builder::new()
            .prefix(prefix)
            .suffix(suffix)
            .make_in(parent, |path| {
                std::fs::hard_link(original, path)?;
                File::open(path).inspect_err(|_| {
                    // Not left behind under a temporary's name.
                    let _ = std::fs::remove_file(path);
                })
            });
        let file = match linked {
            Ok(file) => file,
            // No hard links here: a copy, made under a locked name.
            Err(e) if e.kind() != io::ErrorKind::NotFound => {
                let mut copy = locked_file(parent, prefix, suffix, 0o600)?;
                std::io::copy(&mut File::open(original)?, copy.as_file_mut())?;
                let permissions = std::fs::metadata(original)?.permissions();
                std::fs::set_permissions(copy.path(), permissions)?;
                return Ok(copy);
            }
            Err(e) => return Err(e),
        };
        if try_lock(file.as_file()) && same_entry(file.path(), file.as_file()) {
            return Ok(file);
        }
        let _ = file.keep();
    }
    Err(io::Error::other("could not lock a temporary file"))
}

/// Removes every entry of `parent` whose name `is_ours` and that nobody
/// holds locked. Errors are ignored: a sweep is housekeeping.
pub(crate) fn sweep(parent: &Path, is_ours: impl Fn(&str) -> bool) {
    if cfg!(not(unix)) {
        // No lock tells a leftover from a live run's temporary.
        return;
    }
    let Ok(entries) = std::fs::read_dir(parent) else {
        return;
    };
    for entry in entries.flatten() {
        let name = entry.file_name();
        let Some(name) = name.to_str() else { continue };
        if !is_ours(name) {
            continue;
        }
        let Ok(kind) = entry.file_type() else {
            continue;
        };
        if !(kind.is_dir() || kind.is_file()) {
            continue;
        }
        let path = entry.path();
        let Ok(lock) = open_no_follow(&path) else {
            continue;
        };
        if !try_lock(&lock) || !same_entry(&path, &lock) {
            continue;
        }
        let _ = if kind.is_dir() {
            std::fs::remove_dir_all(&path)
        } else {
            std::fs::remove_file(&path)
        };
    }
}

/// Takes an exclusive `flock` on `file` without waiting; true when held.
/// The lock lasts until every descriptor of this open file is closed.
#[cfg(unix)]
pub(crate) fn try_lock(file: &File) -> bool {
    use std::os::unix::io::AsRawFd;
    // SAFETY: flock on a descriptor `file` owns; no memory is involved.
    unsafe { libc::flock(file.as_raw_fd(), libc::LOCK_EX | libc::LOCK_NB) == 0 }
}

/// Without `flock` there is no lock to take (and [`sweep`] removes nothing).
#[cfg(not(unix))]
pub(crate) fn try_lock(_: &File) -> bool {
    true
}

/// Opens a file or folder for reading without following a final link.
fn open_no_follow(path: &Path) -> io::Result<File> {
    let mut options = std::fs::OpenOptions::new();
    options.read(true);
    #[cfg(unix)]
    {
        use std::os::unix::fs::OpenOptionsExt;
        options.custom_flags(libc::O_NOFOLLOW | libc::O_NONBLOCK);
    }
    options.open(path)
}

/// True when `path` still names the file `open` refers to.
#[cfg(unix)]
fn same_entry(path: &Path, open: &File) -> bool {
    use std::os::unix::fs::MetadataExt;
    match (std::fs::symlink_metadata(path), open.metadata()) {
        (Ok(a), Ok(b)) => a.dev() == b.dev() && a.ino() == b.ino(),
        _ => false,
    }
}

#[cfg(not(unix))]
fn same_entry(path: &Path, _: &File) -> bool {
    path.exists()
}

#[cfg(test)]
mod tests {
    use super::*;

    fn names(dir: &Path) -> Vec<String> {
        let mut v: Vec<String> = std::fs::read_dir(dir)
            .unwrap()
            .map(|e| e.unwrap().file_name().to_string_lossy().into_owned())
            .collect();
        v.sort();
        v
    }

    #[test]
    fn a_sweep_removes_only_unlocked_leftovers_of_ours() {
        let dir = tempfile::tempdir().unwrap();
        let live = LockedDir::new(dir.path(), "x-work-", None).unwrap();
        let live_file = locked_file(dir.path(), ".x-", ".part", 0o600).unwrap();
        // Leftovers of a killed run: the same names, nobody holding them.
        let dead = LockedDir::new(dir.path(), "x-work-", None).unwrap().keep();
        std::fs::write(dead.join("inside"), "x").unwrap();
        let dead_file = locked_file(dir.path(), ".x-", ".part", 0o600).unwrap();
        let (_, dead_file) = dead_file.keep().unwrap();
        std::fs::write(dir.path().join("unrelated.part"), "mine").unwrap();

        sweep(dir.path(), |n| {
            n.starts_with("x-work-") || (n.starts_with(".x-") && n.ends_with(".part"))
        });
        assert!(!dead.exists() && !dead_file.exists());
        assert!(live.path().is_dir() && live_file.path().is_file());
        let live_path = live.path().to_path_buf();
        drop(live);
        drop(live_file);
        assert!(!live_path.exists());
        assert_eq!(names(dir.path()), ["unrelated.part"]);
    }

    #[cfg(unix)]
    #[test]
    fn a_sweep_does_not_follow_links() {
        let dir = tempfile::tempdir().unwrap();
        let elsewhere = tempfile::tempdir().unwrap();
        std::fs::write(elsewhere.path().join("keep"), "x").unwrap();
        std::os::unix::fs::symlink(elsewhere.path(), dir.path().join("x-work-link")).unwrap();
        sweep(dir.path(), |n| n.starts_with("x-work-"));
        assert!(elsewhere.path().join("keep").is_file());
    }

    #[cfg(unix)]
    #[test]
    fn modes_follow_the_request() {
        use std::os::unix::fs::PermissionsExt;
        let dir = tempfile::tempdir().unwrap();
        let private = LockedDir::new(dir.path(), "p-", None).unwrap();
        let mode = std::fs::metadata(private.path())
            .unwrap()
            .permissions()
            .mode();
        assert_eq!(mode & 0o077, 0, "{mode:o}");
    }
}
