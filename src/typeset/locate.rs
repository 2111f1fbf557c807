//! Finding the `typst` program and checking its version, once, before any
//! work is done, so a missing or outdated install is reported up front with
//! the command that fixes it.
//!
//! Search order: the `--typst PATH` option, then the `AMPREPORT_TYPST`
//! environment variable, then `typst` on `PATH`. A value without a path
//! separator (`typst-0.15`) is looked up on `PATH`; anything else is taken as
//! a path to the program.
//!
//! [`start_locate`] starts `typst --version` and returns at once, so the
//! caller can read the job while typst answers; [`PendingTypst::finish`]
//! then waits for the answer and checks it exactly as [`locate`] does.

use std::ffi::OsStr;
use std::fmt;
use std::path::{Path, PathBuf};
use std::process::Command;
use std::time::Duration;

use super::child::{Running, Stopped, status_words};
use super::compile::DEFAULT_TIMEOUT;
use super::error::TypesetError;
use super::known_version;
use super::version::{MAX_TYPST_EXCLUSIVE, MIN_TYPST, TypstVersion};
use crate::catalogue::Msg;

/// The environment variable naming the typst program.
pub const TYPST_ENV: &str = "AMPREPORT_TYPST";

/// A typst program that exists, runs and reported a supported version.
#[derive(Debug, Clone, PartialEq, Eq)]
pub struct TypstProgram {
    pub path: PathBuf,
    pub version: TypstVersion,
}

impl TypstProgram {
    /// A line to show the user when this typst is newer than the tested
    /// series: it is used anyway, but layout may differ.
    pub fn version_warning(&self) -> Option<String> {
        (self.version >= MAX_TYPST_EXCLUSIVE).then(|| {
            // Found before any shop profile is read: English.
            Msg::new("cli-typst-newer")
                .arg("path", self.path.display().to_string())
                .arg("version", self.version.to_string())
                .arg("series", format!("{}.{}", MIN_TYPST.major, MIN_TYPST.minor))
                .english()
        })
    }
}

impl fmt::Display for TypstProgram {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        write!(f, "typst {} ({})", self.version, self.path.display())
    }
}

/// Finds typst and checks its version.
///
/// `explicit` is the `--typst PATH` option. Without it, `AMPREPORT_TYPST` and
/// then `PATH` are consulted.
pub fn locate(explicit: Option<&Path>) -> Result<TypstProgram, TypesetError> {
    locate_in(
        explicit,
        std::env::var_os(TYPST_ENV).as_deref(),
        std::env::var_os("PATH").as_deref(),
    )
}

/// [`locate`] with the environment passed in, so tests need not change the
/// process environment.
pub fn locate_in(
    explicit: Option<&Path>,
    env_value: Option<&OsStr>,
    path_var: Option<&OsStr>,
) -> Result<TypstProgram, TypesetError> {
    start_locate_in(explicit, env_value, path_var).finish()
}

/// A `typst --version` that is running, or its answer remembered from
/// before, or the reason it could not start. Dropping it without
/// [`finish`](PendingTypst::finish) ends the process. The program's path
/// is absolute, so a relative `--typst ./wrapper` runs the same program
/// whatever folder typst is later started in.
#[derive(Debug)]
pub struct PendingTypst {
    /// `None` only once [`PendingTypst::finish`] has taken it.
    state: Option<Result<(PathBuf, Asking), TypesetError>>,
}

/// How the version is being found out.
#[derive(Debug)]
enum Asking {
    /// typst answered this before, and its file is as it was then
    /// ([`known_version`]).
    Known(TypstVersion),
    /// typst is being asked; its answer is kept for the program file's
    /// identity taken before it was asked (`None`: not to be kept), if the
    /// file still has it afterwards.
    Running(
        Running,
        Option<known_version::Identity>,
        known_version::Keep,
    ),
}

/// Finds typst like [`locate`] and starts `typst --version` without waiting
/// for it, unless this very program file answered before
/// ([`known_version`]: in memory or the user's cache folder). Every error
/// (not found, not runnable, wrong answer, too old) is reported by
/// [`PendingTypst::finish`].
pub fn start_locate(explicit: Option<&Path>) -> PendingTypst {
    start_locate_keeping(
        explicit,
        std::env::var_os(TYPST_ENV).as_deref(),
        std::env::var_os("PATH").as_deref(),
        Some(known_version::Keep::user()),
    )
}

/// [`start_locate`] that always asks typst, and keeps its answer for the
/// renders after (what `ampreport --version` does).
pub fn start_locate_afresh(explicit: Option<&Path>) -> PendingTypst {
    let keep = known_version::Keep::user();
    let state = find(
        explicit,
        std::env::var_os(TYPST_ENV).as_deref(),
        std::env::var_os("PATH").as_deref(),
    )
    .and_then(|path| ask(path, keep));
    PendingTypst { state: Some(state) }
}

/// [`start_locate`] with the environment passed in; always asks typst and
/// remembers nothing.
pub fn start_locate_in(
    explicit: Option<&Path>,
    env_value: Option<&OsStr>,
    path_var: Option<&OsStr>,
) -> PendingTypst {
    start_locate_keeping(explicit, env_value, path_var, None)
}

/// [`start_locate_in`], recalling and keeping answers where `keep` says
/// (`None`: always ask, keep nothing).
pub fn start_locate_keeping(
    explicit: Option<&Path>,
    env_value: Option<&OsStr>,
    path_var: Option<&OsStr>,
    keep: Option<known_version::Keep>,
) -> PendingTypst {
    let state = find(explicit, env_value, path_var).and_then(|path| match keep {
        None => {
            let child = spawn_version(&path)?;
            Ok((
                path,
                Asking::Running(child, None, known_version::Keep::Memory),
            ))
        }
        Some(keep) => {
            if let Some(id) = known_version::identity(&path)
                && let Some(version) = known_version::recall(&id, &keep)
            {
                return Ok((path, Asking::Known(version)));
            }
            ask(path, keep)
        }
    });
    PendingTypst { state: Some(state) }
}

/// Starts `path --version`, noting the program file's identity first so
/// the answer can be kept.
fn ask(path: PathBuf, keep: known_version::Keep) -> Result<(PathBuf, Asking), TypesetError> {
    let id = known_version::identity(&path);
    let child = spawn_version(&path)?;
    Ok((path, Asking::Running(child, id, keep)))
}

impl PendingTypst {
    /// Waits for `typst --version` (at most [`DEFAULT_TIMEOUT`]), reads
    /// the answer and checks the version.
    pub fn finish(self) -> Result<TypstProgram, TypesetError> {
        self.finish_within(DEFAULT_TIMEOUT)
    }

    /// [`finish`](Self::finish), stopping typst after `timeout`.
    pub fn finish_within(mut self, timeout: Duration) -> Result<TypstProgram, TypesetError> {
        let (path, asking) = self
            .state
            .take()
            .expect("a pending typst is finished only once")?;
        let version = match asking {
            Asking::Known(version) => version,
            Asking::Running(child, before, keep) => {
                let version = read_version(&path, child, timeout)?;
                // Kept only if the file did not change while typst answered.
                if let Some(before) = before
                    && known_version::identity(&path).as_ref() == Some(&before)
                {
                    known_version::remember(&before, &version, &keep);
                }
                version
            }
        };
        if version < MIN_TYPST {
            return Err(TypesetError::TooOld {
                path,
                found: version,
            });
        }
        Ok(TypstProgram { path, version })
    }
}

/// The program [`locate_in`] would run, without running it.
fn find(
    explicit: Option<&Path>,
    env_value: Option<&OsStr>,
    path_var: Option<&OsStr>,
) -> Result<PathBuf, TypesetError> {
    let env_value = env_value.filter(|v| !v.is_empty());
    let path = match (explicit, env_value) {
        (Some(given), _) => resolve(given.as_os_str(), path_var, "cli-typst-origin-option")?,
        (None, Some(value)) => resolve(value, path_var, "cli-typst-origin-env")?,
        (None, None) => search_path(OsStr::new(program_name()), path_var).ok_or_else(|| {
            TypesetError::NotFound {
                looked: Msg::new("cli-typst-looked-path").arg("program", program_name()),
            }
        })?,
    };
    Ok(path)
}

fn program_name() -> &'static str {
    if cfg!(windows) { "typst.exe" } else { "typst" }
}

/// Turns a `--typst` or `AMPREPORT_TYPST` value into an existing program;
/// `origin` is the catalogue key saying where the value came from.
fn resolve(
    value: &OsStr,
    path_var: Option<&OsStr>,
    origin: &'static str,
) -> Result<PathBuf, TypesetError> {
    let as_path = Path::new(value);
    let shown = as_path.display().to_string();
    let looked = |key: &'static str| {
        Msg::new(key)
            .arg("path", &shown)
            .arg("origin", Msg::new(origin))
    };
    let bare_name = as_path.components().count() == 1 && as_path.parent() == Some(Path::new(""));
    if bare_name && !as_path.exists() {
        return search_path(value, path_var).ok_or_else(|| TypesetError::NotFound {
            looked: looked("cli-typst-looked-path-given"),
        });
    }
    if !as_path.exists() {
        return Err(TypesetError::NotFound {
            looked: looked("cli-typst-looked-missing"),
        });
    }
    if !is_executable(as_path) {
        return Err(TypesetError::NotFound {
            looked: looked("cli-typst-looked-not-executable"),
        });
    }
    Ok(absolute(as_path))
}

/// `path` made absolute against the current folder, links left as they are
/// (a wrapper found through a link stays that wrapper).
fn absolute(path: &Path) -> PathBuf {
    std::path::absolute(path).unwrap_or_else(|_| path.to_path_buf())
}

/// The first executable `name` in the folders of `path_var`.
fn search_path(name: &OsStr, path_var: Option<&OsStr>) -> Option<PathBuf> {
    let path_var = path_var?;
    std::env::split_paths(path_var)
        .filter(|dir| !dir.as_os_str().is_empty())
        .map(|dir| dir.join(name))
        .find(|candidate| is_executable(candidate))
        .map(|found| absolute(&found))
}

#[cfg(unix)]
fn is_executable(path: &Path) -> bool {
    use std::os::unix::fs::PermissionsExt;
    path.metadata()
        .map(|m| m.is_file() && m.permissions().mode() & 0o111 != 0)
        .unwrap_or(false)
}

#[cfg(not(unix))]
fn is_executable(path: &Path) -> bool {
    path.is_file()
}

/// How much of a `--version` answer is read.
const VERSION_OUTPUT_CAP: usize = 4096;

/// Starts `PATH --version`.
fn spawn_version(path: &Path) -> Result<Running, TypesetError> {
    let mut command = Command::new(path);
    command.arg("--version");
    Running::spawn(command, VERSION_OUTPUT_CAP, VERSION_OUTPUT_CAP).map_err(|source| {
        TypesetError::Unusable {
            path: path.to_path_buf(),
            problem: Msg::new("cli-typst-failed-to-start").arg("error", source.to_string()),
            source: Some(source),
        }
    })
}

/// Waits for a `--version` run and reads its answer.
fn read_version(
    path: &Path,
    child: Running,
    timeout: Duration,
) -> Result<TypstVersion, TypesetError> {
    let output = match child.wait(timeout) {
        Ok(output) => output,
        Err(Stopped::Interrupted(signal)) => return Err(TypesetError::Interrupted { signal }),
        Err(Stopped::TimedOut { stderr }) => {
            return Err(TypesetError::TimedOut {
                path: path.to_path_buf(),
                action: "--version",
                seconds: timeout.as_secs_f64(),
                diagnostics: stderr.text(),
            });
        }
        Err(Stopped::Failed(source)) => {
            return Err(TypesetError::Unusable {
                path: path.to_path_buf(),
                problem: Msg::new("cli-typst-version-unreadable").arg("error", source.to_string()),
                source: Some(source),
            });
        }
    };
    let stdout = String::from_utf8_lossy(&output.stdout.bytes);
    match TypstVersion::parse_version_output(&stdout) {
        Some(version) if output.status.success() => Ok(version),
        _ => {
            let mut said = stdout.trim().to_owned();
            if said.is_empty() {
                said = String::from_utf8_lossy(&output.stderr.bytes)
                    .trim()
                    .to_owned();
            }
            let said = said.lines().next().unwrap_or("").chars().take(200);
            Err(TypesetError::Unusable {
                path: path.to_path_buf(),
                problem: Msg::new("cli-typst-version-odd")
                    .arg("status", status_words(&output.status))
                    .arg("said", format!("{:?}", said.collect::<String>())),
                source: None,
            })
        }
    }
}

#[cfg(all(test, unix))]
mod tests {
    use super::*;
    use crate::typeset::error::INSTALL_HINT;
    use miette::Diagnostic;
    use std::os::unix::fs::PermissionsExt;

    /// Writes a shell script that answers `--version` with `answer`.
    fn fake_typst(dir: &Path, name: &str, answer: &str) -> PathBuf {
        script(dir, name, &format!("echo '{answer}'"))
    }

    /// Writes an executable shell script running `body`, ready to run.
    fn script(dir: &Path, name: &str, body: &str) -> PathBuf {
        let path = dir.join(name);
        std::fs::write(&path, format!("#!/bin/sh\n{body}\n")).unwrap();
        std::fs::set_permissions(&path, std::fs::Permissions::from_mode(0o755)).unwrap();
        // A process forked by another test thread while the script was open
        // for writing can hold it open for a moment, and running the script
        // then fails with "text file busy". Wait until it runs.
        for _ in 0..200 {
            match Command::new(&path).arg("--no-such-flag").output() {
                Err(e) if e.raw_os_error() == Some(26) => {
                    std::thread::sleep(std::time::Duration::from_millis(10))
                }
                _ => break,
            }
        }
        path
    }

    fn help_of(err: &TypesetError) -> String {
        err.help().map(|h| h.to_string()).unwrap_or_default()
    }

    #[test]
    fn explicit_missing_path_names_it_and_the_install_command() {
        let err = locate_in(Some(Path::new("/nowhere/typst")), None, None).unwrap_err();
        assert!(err.is_environment());
        assert!(err.to_string().contains("/nowhere/typst"), "{err}");
        assert!(err.to_string().contains("--typst"), "{err}");
        assert!(help_of(&err).contains(INSTALL_HINT));
    }

    #[test]
    fn empty_path_gives_install_hint() {
        let empty = tempfile::tempdir().unwrap();
        let err = locate_in(None, None, Some(empty.path().as_os_str())).unwrap_err();
        assert!(matches!(err, TypesetError::NotFound { .. }), "{err:?}");
        assert!(err.to_string().contains("PATH"));
        assert!(help_of(&err).contains(INSTALL_HINT));
        let err = locate_in(None, None, None).unwrap_err();
        assert!(matches!(err, TypesetError::NotFound { .. }));
    }

    #[test]
    fn finds_on_path_and_reads_version() {
        let dir = tempfile::tempdir().unwrap();
        let other = tempfile::tempdir().unwrap();
        let fake = fake_typst(dir.path(), "typst", "typst 0.15.1 (deadbeef)");
        let path_var = std::env::join_paths([other.path(), dir.path()]).unwrap();
        let found = locate_in(None, None, Some(&path_var)).unwrap();
        assert_eq!(found.path, fake);
        assert_eq!(found.version, TypstVersion::new(0, 15, 1));
        assert_eq!(found.version_warning(), None);
        assert!(found.to_string().starts_with("typst 0.15.1 ("));
    }

    #[test]
    fn explicit_beats_env_beats_path() {
        let dir = tempfile::tempdir().unwrap();
        let a = fake_typst(dir.path(), "a", "typst 0.15.1 (a)");
        let b = fake_typst(dir.path(), "b", "typst 0.15.2 (b)");
        let _c = fake_typst(dir.path(), "typst", "typst 0.15.3 (c)");
        let path_var = dir.path().as_os_str();
        let got = locate_in(Some(&a), Some(b.as_os_str()), Some(path_var)).unwrap();
        assert_eq!(got.path, a);
        let got = locate_in(None, Some(b.as_os_str()), Some(path_var)).unwrap();
        assert_eq!(got.path, b);
        let got = locate_in(None, Some(OsStr::new("")), Some(path_var)).unwrap();
        assert_eq!(got.version, TypstVersion::new(0, 15, 3));
        // A bare name in the variable is looked up on PATH.
        let got = locate_in(None, Some(OsStr::new("b")), Some(path_var)).unwrap();
        assert_eq!(got.path, b);
    }

    #[test]
    fn a_started_query_is_checked_when_finished() {
        let dir = tempfile::tempdir().unwrap();
        let fake = fake_typst(dir.path(), "typst", "typst 0.15.1 (started)");
        let found = start_locate_in(Some(&fake), None, None).finish().unwrap();
        assert_eq!(found, locate_in(Some(&fake), None, None).unwrap());
        // Errors wait for `finish`, and are the same as `locate_in`'s.
        let pending = start_locate_in(Some(Path::new("/nowhere/typst")), None, None);
        assert!(matches!(
            pending.finish(),
            Err(TypesetError::NotFound { .. })
        ));
        let old = fake_typst(dir.path(), "old", "typst 0.14.0 (old)");
        assert!(matches!(
            start_locate_in(Some(&old), None, None).finish(),
            Err(TypesetError::TooOld { .. })
        ));
        // A query dropped unfinished is ended rather than waited for.
        let slow = script(
            dir.path(),
            "slow",
            "if [ \"$1\" = --version ]; then exec sleep 30; fi",
        );
        let start = std::time::Instant::now();
        drop(start_locate_in(Some(&slow), None, None));
        assert!(start.elapsed() < std::time::Duration::from_secs(10));
    }

    #[test]
    fn too_old_is_an_error_naming_path_and_version() {
        let dir = tempfile::tempdir().unwrap();
        let old = fake_typst(dir.path(), "typst", "typst 0.10.0 (old)");
        let err = locate_in(Some(&old), None, None).unwrap_err();
        assert!(matches!(err, TypesetError::TooOld { .. }), "{err:?}");
        let text = err.to_string();
        assert!(
            text.contains(&old.display().to_string()) && text.contains("0.10.0"),
            "{text}"
        );
        assert!(help_of(&err).contains(INSTALL_HINT));
    }

    #[test]
    fn newer_series_is_used_with_a_warning() {
        let dir = tempfile::tempdir().unwrap();
        let new = fake_typst(dir.path(), "typst", "typst 0.16.0 (new)");
        let found = locate_in(Some(&new), None, None).unwrap();
        let warning = found.version_warning().unwrap();
        assert!(warning.contains("0.16.0"), "{warning}");
    }

    #[test]
    fn a_program_that_is_not_typst_is_unusable() {
        let dir = tempfile::tempdir().unwrap();
        let liar = fake_typst(dir.path(), "typst", "hello");
        let err = locate_in(Some(&liar), None, None).unwrap_err();
        assert!(matches!(err, TypesetError::Unusable { .. }), "{err:?}");
        assert!(err.is_environment());
        assert!(err.to_string().contains("hello"));
        let err = locate_in(Some(Path::new("/bin/false")), None, None).unwrap_err();
        assert!(matches!(err, TypesetError::Unusable { .. }), "{err:?}");
    }

    #[test]
    fn a_plain_file_is_not_a_program() {
        let dir = tempfile::tempdir().unwrap();
        let file = dir.path().join("typst");
        std::fs::write(&file, "not a program").unwrap();
        let err = locate_in(Some(&file), None, None).unwrap_err();
        assert!(err.to_string().contains("not an executable"), "{err}");
    }
}
