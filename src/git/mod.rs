//! Where a job file stands in git, read through the `git` command: the
//! commit that last changed it and whether the file on disk differs from
//! that commit (for the document's footer and the JSON), and a job file's
//! text at a revision (`REV:PATH`, for `compare`). Where `HEAD` stands,
//! asked on every render, is read from the repository's own files where
//! git's answer cannot differ (`direct.rs`).
//!
//! git is treated like any outside program: it runs with a time limit and
//! bounded output (the same child runner as typst), never asks for input,
//! and is told to run nothing the repository's own configuration might
//! name (no fsmonitor, hooks, pager, signature check, external diff or
//! content filter): a job folder cloned from someone else cannot make a
//! render run their commands. Whether the file changed is worked out here
//! from the very bytes that were read, hashed the way git names a blob, so
//! the mark says whether *those* bytes are the committed ones.
//!
//! Without git, outside a repository, or for a file git does not track,
//! there is no revision and the documents fall back to the file's SHA-256.

use std::path::{Path, PathBuf};
use std::process::Command;
use std::time::Duration;

use serde::Serialize;
use sha1::Sha1;
use sha2::{Digest, Sha256};

use crate::typeset::{Running, Stopped, describe_status};

mod direct;
pub mod remembered;
pub use remembered::{look_up_at, remembered_at};

/// How long one git command may take.
pub const GIT_TIMEOUT: Duration = Duration::from_secs(20);

/// How many hex digits of a commit id the documents show.
pub const SHORT_ID_DIGITS: usize = 12;

/// Where a job file stands in git.
#[derive(Debug, Clone, PartialEq, Eq, Serialize)]
pub struct Revision {
    /// The first [`SHORT_ID_DIGITS`] hex digits of the commit that last
    /// changed the file.
    pub commit: String,
    /// True when the bytes read differ from the file in `HEAD` (edited and
    /// not committed yet, or removed from `HEAD`).
    pub uncommitted_changes: bool,
}

/// Why a file could not be read from git. Said from the catalogue
/// ([`GitError::msg`], `cli-git-…`): the program's own sentence for each
/// case it can tell apart, git's own words only as a quoted detail.
#[derive(Debug)]
pub enum GitError {
    /// The `git` command could not be run.
    Missing {
        spec: String,
        source: std::io::Error,
    },
    /// git ran and refused; `refusal` is what its words (`detail`) say.
    Failed {
        spec: String,
        refusal: Refusal,
        detail: String,
    },
    TimedOut {
        spec: String,
    },
    Interrupted {
        spec: String,
        signal: i32,
    },
    TooLarge {
        spec: String,
    },
    NotUtf8 {
        spec: String,
    },
}

/// The cases of git refusing `REV:PATH` that the program tells apart.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum Refusal {
    /// The current folder is not inside a repository.
    NotRepository,
    /// The repository has no such revision.
    NoRevision,
    /// The revision has no such path.
    NotInRevision,
    /// Something else: git's words say what.
    Other,
}

/// What git's message (run with `LC_ALL=C`, so in English) says.
fn refusal(detail: &str) -> Refusal {
    let d = detail.to_ascii_lowercase();
    if d.contains("not a git repository") {
        Refusal::NotRepository
    } else if d.contains("does not exist in") || d.contains("exists on disk, but not in") {
        Refusal::NotInRevision
    } else if d.contains("invalid object name")
        || d.contains("not a valid object name")
        || d.contains("unknown revision")
        || d.contains("bad revision")
    {
        Refusal::NoRevision
    } else {
        Refusal::Other
    }
}

impl GitError {
    /// The problem as a catalogue message, to be said in the reader's
    /// language.
    pub fn msg(&self) -> crate::catalogue::Msg {
        use crate::catalogue::Msg;
        match self {
            GitError::Missing { spec, source } => Msg::new("cli-git-missing")
                .arg("spec", spec)
                .arg("error", crate::catalogue::os_error(source)),
            GitError::Failed {
                spec,
                refusal,
                detail,
            } => {
                let (rev, path) = split_spec(spec).unwrap_or((spec.as_str(), ""));
                let key = match refusal {
                    Refusal::NotRepository => "cli-git-not-repository",
                    Refusal::NoRevision => "cli-git-no-revision",
                    Refusal::NotInRevision => "cli-git-not-in-revision",
                    Refusal::Other => "cli-git-failed",
                };
                Msg::new(key)
                    .arg("spec", spec)
                    .arg("rev", rev)
                    .arg("path", path)
                    .arg("detail", detail.trim())
            }
            GitError::TimedOut { spec } => Msg::new("cli-git-timed-out")
                .arg("spec", spec)
                .arg("seconds", GIT_TIMEOUT.as_secs().to_string()),
            GitError::Interrupted { spec, signal } => Msg::new("cli-git-interrupted")
                .arg("spec", spec)
                .arg("signal", signal.to_string()),
            GitError::TooLarge { spec } => Msg::new("cli-git-too-large").arg("spec", spec).arg(
                "limit",
                (crate::input_file::MAX_INPUT_BYTES / (1024 * 1024)).to_string(),
            ),
            GitError::NotUtf8 { spec } => Msg::new("cli-git-not-utf8").arg("spec", spec),
        }
    }
}

/// In English, as the catalogue says it.
impl std::fmt::Display for GitError {
    fn fmt(&self, f: &mut std::fmt::Formatter<'_>) -> std::fmt::Result {
        f.write_str(&self.msg().english())
    }
}

impl std::error::Error for GitError {
    fn source(&self) -> Option<&(dyn std::error::Error + 'static)> {
        match self {
            GitError::Missing { source, .. } => Some(source),
            _ => None,
        }
    }
}

/// A git command in `dir` that runs nothing the repository names.
fn git_command(dir: &Path) -> Command {
    let mut c = Command::new("git");
    c.arg("--no-pager")
        .arg("--literal-pathspecs")
        .args(["-c", "core.fsmonitor=false"])
        .args(["-c", "core.hooksPath=/dev/null"])
        .args(["-c", "log.showSignature=false"])
        .args(["-c", "diff.external="])
        .arg("-C")
        .arg(dir)
        .env("GIT_TERMINAL_PROMPT", "0")
        .env("GIT_OPTIONAL_LOCKS", "0")
        .env("LC_ALL", "C");
    // The repository is the one holding the file, not one named by the
    // environment the command happens to run in.
    for var in [
        "GIT_DIR",
        "GIT_WORK_TREE",
        "GIT_INDEX_FILE",
        "GIT_OBJECT_DIRECTORY",
        "GIT_ALTERNATE_OBJECT_DIRECTORIES",
        "GIT_NAMESPACE",
        "GIT_CEILING_DIRECTORIES",
        "GIT_EXTERNAL_DIFF",
        "GIT_PAGER",
    ] {
        c.env_remove(var);
    }
    c
}

/// What one git run ended with.
enum Ran {
    Ok(Vec<u8>),
    /// git ran and refused (not a repository, no such revision …).
    Refused(String),
    /// The output was longer than the cap.
    TooLong,
    NotRun(std::io::Error),
    TimedOut,
    Interrupted(i32),
}

fn run(dir: &Path, args: &[&str], cap: usize) -> Ran {
    finish(start(dir, args, cap), cap)
}

/// Starts one git run; [`finish`] waits for it. Two started before either
/// is waited for run side by side.
fn start(dir: &Path, args: &[&str], cap: usize) -> std::io::Result<Running> {
    let mut c = git_command(dir);
    c.args(args);
    Running::spawn_short(c, cap + 1, 4096)
}

fn finish(started: std::io::Result<Running>, cap: usize) -> Ran {
    let child = match started {
        Ok(c) => c,
        Err(e) => return Ran::NotRun(e),
    };
    match child.wait(GIT_TIMEOUT) {
        Ok(done) if done.status.success() => {
            if done.stdout.dropped > 0 || done.stdout.bytes.len() > cap {
                Ran::TooLong
            } else {
                Ran::Ok(done.stdout.bytes)
            }
        }
        Ok(done) => {
            let text = done.stderr.text();
            Ran::Refused(if text.is_empty() {
                format!("git {}", describe_status(&done.status))
            } else {
                text
            })
        }
        Err(Stopped::TimedOut { .. }) => Ran::TimedOut,
        Err(Stopped::Interrupted(signal)) => Ran::Interrupted(signal),
        Err(Stopped::Failed(e)) => Ran::NotRun(e),
    }
}

/// The folder holding `file` and its name in it.
fn folder_and_name(file: &Path) -> Option<(PathBuf, String)> {
    let name = file.file_name()?.to_str()?.to_string();
    let dir = match file.parent() {
        Some(p) if !p.as_os_str().is_empty() => p.to_path_buf(),
        _ => PathBuf::from("."),
    };
    Some((dir, name))
}

/// The git object id of a blob holding `bytes`, in the hash of `id_len`
/// hex digits (40: SHA-1, 64: SHA-256).
fn blob_id(bytes: &[u8], id_len: usize) -> Option<String> {
    let header = format!("blob {}\0", bytes.len());
    let hex = |d: &[u8]| d.iter().map(|b| format!("{b:02x}")).collect::<String>();
    match id_len {
        40 => {
            let mut h = Sha1::new();
            h.update(header.as_bytes());
            h.update(bytes);
            Some(hex(&h.finalize()))
        }
        64 => {
            let mut h = Sha256::new();
            h.update(header.as_bytes());
            h.update(bytes);
            Some(hex(&h.finalize()))
        }
        _ => None,
    }
}

/// Where `file`, read as `bytes`, stands in git: none without git, outside
/// a repository, or when no commit holds the file yet.
pub fn revision(file: &Path, bytes: &[u8]) -> Option<Revision> {
    look_up(file)?.revision(bytes)
}

/// What git holds of a file, before its bytes are compared with it
/// ([`Lookup::revision`]): asked from the path alone, so a render can ask
/// while it reads and works out the job.
#[derive(Debug, Clone, PartialEq, Eq)]
pub struct Lookup {
    /// The commit that last changed the file (its full id).
    commit: String,
    /// The id of the file's blob in `HEAD`; none when `HEAD` lacks it.
    committed: Option<String>,
}

/// What git holds of `file`: none without git, outside a repository, or
/// when no commit holds the file yet.
///
/// One git run answers both questions: `git log -1 --raw` names the
/// commit that last changed the file and, in its raw diff line, the
/// file's blob in that commit, which is its blob in `HEAD` too (history
/// is followed from `HEAD` only through commits whose file is the same as
/// their parent's, so the first commit shown holds `HEAD`'s file; a file
/// removed in `HEAD` shows as removed). Where the line does not say it
/// plainly (the commit is a merge, whose diff `log` does not show, or the
/// name is quoted or is a folder in git), `HEAD`'s blob is asked for by
/// a second run, as before (`rev-parse HEAD:./NAME`). The repository's
/// `log.follow` and `log.showRoot` settings are overridden, so the
/// answer does not depend on them.
pub fn look_up(file: &Path) -> Option<Lookup> {
    let (dir, name) = folder_and_name(file)?;
    if !may_be_in_repository(&dir) {
        return None;
    }
    ask(&dir, &name, "HEAD").answer
}

/// False when git could find no repository holding `folder`: neither it
/// nor any folder above it holds a `.git` entry or is itself a
/// repository's own folder (a `HEAD` file beside an `objects` folder, as
/// a bare repository has). git looks for exactly these, upward from the
/// folder (the environment that could name another is removed from its
/// runs), and stops sooner (at another file system, at a folder it may
/// not read); so where this says false, git would have found nothing, and
/// it is not started: a job kept outside git costs no git run. A folder
/// that cannot be resolved counts as possibly in a repository.
fn may_be_in_repository(folder: &Path) -> bool {
    let Ok(real) = std::fs::canonicalize(folder) else {
        return true;
    };
    real.ancestors().any(|dir| {
        std::fs::symlink_metadata(dir.join(".git")).is_ok()
            || (dir.join("HEAD").is_file() && dir.join("objects").is_dir())
    })
}

/// What git said of a file at a revision.
struct Asked {
    answer: Option<Lookup>,
    /// True when every run ended with git's own answer (none failed,
    /// timed out or was stopped), so the answer may be kept.
    settled: bool,
}

/// [`look_up`] of the file `name` in the folder `dir`, with history
/// read from `rev` (`HEAD`, or a commit's id).
fn ask(dir: &Path, name: &str, rev: &str) -> Asked {
    let unsettled = Asked {
        answer: None,
        settled: false,
    };
    let Ran::Ok(out) = run(dir, &last_change_args(rev, name), LOG_CAP) else {
        return unsettled;
    };
    let Ok(out) = String::from_utf8(out) else {
        return unsettled;
    };
    if out.trim().is_empty() {
        // No commit holds the file.
        return Asked {
            answer: None,
            settled: true,
        };
    }
    let Some((commit, blob)) = parse_last_change(&out, name) else {
        return unsettled;
    };
    let (committed, settled) = match blob {
        Blob::Id(id) => (Some(id), true),
        Blob::Removed => (None, true),
        Blob::Unsaid => committed_blob(dir, name, rev),
    };
    Asked {
        answer: Some(Lookup { commit, committed }),
        settled,
    }
}

/// The most a `log -1 --raw` answer may print: an id and one raw line per
/// parent or file, with a long path.
const LOG_CAP: usize = 64 * 1024;

/// `git log` for the commit that last changed `name` in the folder, in
/// the history of `rev`, with the file's raw diff line.
fn last_change_args<'a>(rev: &'a str, name: &'a str) -> [&'a str; 15] {
    [
        "-c",
        "log.follow=false",
        "-c",
        "log.showRoot=true",
        "log",
        "-1",
        "--no-show-signature",
        "--format=%H",
        "--raw",
        "--no-abbrev",
        "--no-renames",
        "--relative",
        rev,
        "--",
        name,
    ]
}

/// The id of `name`'s blob at `rev`, asked of git by itself (none when
/// `rev` lacks it), and whether git answered (rather than failing).
fn committed_blob(dir: &Path, name: &str, rev: &str) -> (Option<String>, bool) {
    let spec = format!("{rev}:./{name}");
    match run(dir, &["rev-parse", "--verify", "--quiet", &spec], 256) {
        Ran::Ok(out) => match String::from_utf8(out) {
            Ok(id) => (Some(id.trim().to_string()), true),
            Err(_) => (None, false),
        },
        // `--verify --quiet` says nothing of a path the revision lacks.
        Ran::Refused(detail) => (None, detail.starts_with("git exited with status 1")),
        _ => (None, false),
    }
}

/// What a `log -1 --raw` answer says of the file's blob.
#[derive(Debug, PartialEq, Eq)]
enum Blob {
    /// The file's blob in the commit shown (and so in `HEAD`).
    Id(String),
    /// The commit shown removed the file: `HEAD` lacks it.
    Removed,
    /// The answer does not say plainly; ask `HEAD` itself.
    Unsaid,
}

/// The commit and the file's blob from `log -1 --raw --relative`'s answer
/// for the file `name`: none when git named no commit.
fn parse_last_change(out: &str, name: &str) -> Option<(String, Blob)> {
    let mut lines = out.lines();
    let commit = lines.next()?.trim().to_string();
    if commit.len() < SHORT_ID_DIGITS || !commit.chars().all(|c| c.is_ascii_hexdigit()) {
        return None;
    }
    let raw: Vec<&str> = lines.filter(|l| l.starts_with(':')).collect();
    let blob = match raw.as_slice() {
        [line] => raw_line_blob(line, name, commit.len()).unwrap_or(Blob::Unsaid),
        _ => Blob::Unsaid,
    };
    Some((commit, blob))
}

/// The new side of a raw diff line (`:OLDMODE NEWMODE OLDID NEWID
/// STATUS<TAB>PATH`) when it is exactly the file `name` (not quoted, not
/// a file inside a folder of that name) with ids of `id_len` digits.
fn raw_line_blob(line: &str, name: &str, id_len: usize) -> Option<Blob> {
    let (fields, path) = line.strip_prefix(':')?.split_once('\t')?;
    if path != name {
        return None;
    }
    let fields: Vec<&str> = fields.split(' ').collect();
    let [_, new_mode, _, new_id, status] = fields.as_slice() else {
        return None;
    };
    if new_id.len() != id_len || !new_id.chars().all(|c| c.is_ascii_hexdigit()) {
        return None;
    }
    if status.starts_with('D') && new_id.chars().all(|c| c == '0') && *new_mode == "000000" {
        return Some(Blob::Removed);
    }
    if new_id.chars().all(|c| c == '0') {
        return None;
    }
    Some(Blob::Id(new_id.to_string()))
}

impl Lookup {
    /// Where the file stands when its bytes are `bytes`.
    pub fn revision(&self, bytes: &[u8]) -> Option<Revision> {
        // No blob in HEAD (the file was removed there) counts as a change.
        let uncommitted_changes = self
            .committed
            .as_deref()
            .and_then(|id| Some(blob_id(bytes, id.len())? != id))
            .unwrap_or(true);
        Some(Revision {
            commit: self.commit[..SHORT_ID_DIGITS].to_string(),
            uncommitted_changes,
        })
    }
}

/// Where the repository holding a folder stands, and where the folder lies
/// in it: what a job's footer line follows from, besides the job's bytes
/// and name.
#[derive(Debug, Clone, PartialEq, Eq)]
pub struct Head {
    /// The commit `HEAD` (its full id).
    pub commit: String,
    /// The folder's path from the top of the repository, with a trailing
    /// `/` (empty at the top), as git prints it.
    pub prefix: String,
}

/// Where the repository holding `folder` stands: none without git, outside
/// a repository or before its first commit. Two renders of a job whose
/// bytes, name and [`Head`] are the same get the same [`revision`].
pub fn head(folder: &Path) -> Option<Head> {
    if let direct::Direct::Found(head) = direct::head(folder) {
        return Some(head);
    }
    if !may_be_in_repository(folder) {
        return None;
    }
    head_from_git(folder)
}

/// [`head`] asked of `git rev-parse`.
fn head_from_git(folder: &Path) -> Option<Head> {
    let Ran::Ok(out) = run(
        folder,
        &["rev-parse", "--show-prefix", "--verify", "--quiet", "HEAD"],
        8192,
    ) else {
        return None;
    };
    parse_head(&String::from_utf8(out).ok()?)
}

/// `git rev-parse --show-prefix --verify HEAD`'s answer: the prefix line
/// (which may itself hold line breaks), then the commit's id.
fn parse_head(out: &str) -> Option<Head> {
    let (prefix, id) = out.strip_suffix('\n')?.rsplit_once('\n')?;
    (id.len() >= SHORT_ID_DIGITS && id.chars().all(|c| c.is_ascii_hexdigit())).then(|| Head {
        commit: id.to_string(),
        prefix: prefix.to_string(),
    })
}

/// Where the file `PATH` of a `REV:PATH` read from the current folder lies
/// in the working folder, by git's rules: from the top of the repository,
/// unless it starts with `./` or `../` (then from the current folder). The
/// path as given when git cannot say where the top is.
pub fn working_path_of_spec(path: &str) -> PathBuf {
    let given = Path::new(path);
    if given.is_absolute() || path.starts_with("./") || path.starts_with("../") {
        return given.to_path_buf();
    }
    match run(Path::new("."), &["rev-parse", "--show-toplevel"], 4096) {
        Ran::Ok(out) => match String::from_utf8(out) {
            Ok(top) if !top.trim_end_matches('\n').is_empty() => {
                PathBuf::from(top.trim_end_matches('\n')).join(given)
            }
            _ => given.to_path_buf(),
        },
        _ => given.to_path_buf(),
    }
}

/// Whether `arg` names a file at a git revision (`REV:PATH`) rather than a
/// file: it holds a colon and no file of that name exists.
pub fn is_revision_spec(arg: &Path) -> bool {
    !arg.exists() && arg.to_str().is_some_and(|s| split_spec(s).is_some())
}

/// `REV:PATH` split at its first colon, both parts present.
pub fn split_spec(spec: &str) -> Option<(&str, &str)> {
    let (rev, path) = spec.split_once(':')?;
    (!rev.is_empty() && !path.is_empty()).then_some((rev, path))
}

/// The text of `REV:PATH` as git reads it from the repository holding the
/// current folder (the same path rules as `git show REV:PATH`: a path is
/// from the top of the repository unless it starts with `./`).
pub fn read_at_revision(spec: &str) -> Result<String, GitError> {
    let cap = crate::input_file::MAX_INPUT_BYTES as usize;
    match run(Path::new("."), &["cat-file", "blob", spec], cap) {
        Ran::Ok(bytes) => String::from_utf8(bytes).map_err(|_| GitError::NotUtf8 {
            spec: spec.to_string(),
        }),
        Ran::Refused(detail) => Err(GitError::Failed {
            spec: spec.to_string(),
            refusal: refusal(&detail),
            detail,
        }),
        Ran::TooLong => Err(GitError::TooLarge {
            spec: spec.to_string(),
        }),
        Ran::NotRun(source) => Err(GitError::Missing {
            spec: spec.to_string(),
            source,
        }),
        Ran::TimedOut => Err(GitError::TimedOut {
            spec: spec.to_string(),
        }),
        Ran::Interrupted(signal) => Err(GitError::Interrupted {
            spec: spec.to_string(),
            signal,
        }),
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn the_folder_and_the_commit_are_read_from_rev_parse() {
        let id = "2444dd4a4c879eda84b0699625aa059a0839a51a";
        let head = parse_head(&format!("jobs/2026/\n{id}\n")).unwrap();
        assert_eq!(head.prefix, "jobs/2026/");
        assert_eq!(head.commit, id);
        assert_eq!(parse_head(&format!("\n{id}\n")).unwrap().prefix, "");
        let odd = parse_head(&format!("a\nb/\n{id}\n")).unwrap();
        assert_eq!(odd.prefix, "a\nb/");
        assert_eq!(parse_head("jobs/\nnot-an-id\n"), None);
        assert_eq!(parse_head(""), None);
    }

    /// The look-up as it was made before, in two git runs: the commit of
    /// `log -1 -- NAME` and the blob of `rev-parse HEAD:./NAME`; with
    /// `settings` (`-c` pairs) before the command.
    fn look_up_in_two_runs(file: &Path, settings: &[&str]) -> Option<Lookup> {
        let (dir, name) = folder_and_name(file)?;
        let mut args = settings.to_vec();
        args.extend([
            "log",
            "-1",
            "--no-show-signature",
            "--format=%H",
            "--",
            &name,
        ]);
        let Ran::Ok(out) = run(&dir, &args, 256) else {
            return None;
        };
        let commit = String::from_utf8(out).ok()?.trim().to_string();
        if commit.len() < SHORT_ID_DIGITS {
            return None;
        }
        Some(Lookup {
            commit,
            committed: committed_blob(&dir, &name, "HEAD").0,
        })
    }

    pub(super) fn git_in(dir: &Path, args: &[&str]) -> String {
        let out = Command::new("git")
            .arg("-C")
            .arg(dir)
            .args([
                "-c",
                "user.name=Bench",
                "-c",
                "user.email=bench@example.invalid",
            ])
            .args([
                "-c",
                "commit.gpgSign=false",
                "-c",
                "init.defaultBranch=main",
            ])
            .args(args)
            .env("GIT_COMMITTER_DATE", "2026-11-02T10:00:00Z")
            .env("GIT_AUTHOR_DATE", "2026-11-02T10:00:00Z")
            .output()
            .unwrap();
        assert!(
            out.status.success(),
            "git {args:?}: {}",
            String::from_utf8_lossy(&out.stderr)
        );
        String::from_utf8(out.stdout).unwrap()
    }

    fn have_git() -> bool {
        Command::new("git")
            .arg("--version")
            .output()
            .is_ok_and(|o| o.status.success())
    }

    /// Every state a job file can be in, in a repository whose settings
    /// would change `log`'s answer if they were followed: the one-run
    /// look-up gives what the two runs gave, and each answer is the one
    /// worked out by hand.
    #[test]
    fn one_git_run_answers_as_two_did() {
        if !have_git() {
            return;
        }
        let repo = tempfile::tempdir().unwrap();
        let top = repo.path();
        git_in(top, &["init", "-q"]);
        // Followed, these would change what `log` shows.
        git_in(top, &["config", "log.follow", "true"]);
        git_in(top, &["config", "log.showRoot", "false"]);
        git_in(top, &["config", "diff.renames", "copies"]);
        git_in(top, &["config", "core.quotePath", "true"]);
        let jobs = top.join("jobs");
        std::fs::create_dir(&jobs).unwrap();
        let file = |name: &str| jobs.join(name);
        let write = |name: &str, text: &str| std::fs::write(file(name), text).unwrap();
        let commit = |message: &str| {
            git_in(top, &["add", "-A"]);
            git_in(top, &["commit", "-q", "-m", message]);
            git_in(top, &["rev-parse", "HEAD"]).trim().to_string()
        };
        let blob = |rev_path: &str| git_in(top, &["rev-parse", rev_path]).trim().to_string();
        // The two runs as they were made, but without the repository's
        // `log` settings, which the one run overrides.
        let plain = ["-c", "log.follow=false", "-c", "log.showRoot=true"];
        let check = |name: &str, commit: &str, committed: Option<String>| {
            let one = look_up(&file(name));
            let two = look_up_in_two_runs(&file(name), &plain);
            assert_eq!(one, two, "{name}");
            let one = one.unwrap_or_else(|| panic!("{name}: no answer"));
            assert_eq!(one.commit, commit, "{name}");
            assert_eq!(one.committed, committed, "{name}");
        };

        // Taken in by the first commit (the root, whose diff the
        // repository's `log.showRoot=false` would hide), with a name git
        // quotes and a name of a folder holding a file of the same name.
        write("a.kdl", "job 1\n");
        write("späte Arbeit.kdl", "job 2\n");
        std::fs::create_dir(file("dir.kdl")).unwrap();
        write("dir.kdl/dir.kdl", "inside\n");
        let root = commit("Take in");
        check("a.kdl", &root, Some(blob("HEAD:jobs/a.kdl")));
        // Following those settings, the two runs found no commit for a
        // file the root commit took in.
        assert_eq!(look_up_in_two_runs(&file("a.kdl"), &[]), None);
        check(
            "späte Arbeit.kdl",
            &root,
            Some(blob("HEAD:jobs/späte Arbeit.kdl")),
        );
        check("dir.kdl", &root, Some(blob("HEAD:jobs/dir.kdl")));

        // Changed, then a commit that leaves it alone on top.
        write("a.kdl", "job 1, as left\n");
        let changed = commit("As left");
        write("b.kdl", "job 3\n");
        commit("Another job");
        check("a.kdl", &changed, Some(blob("HEAD:jobs/a.kdl")));

        // Renamed into place: the commit that made the name.
        git_in(top, &["mv", "jobs/b.kdl", "jobs/c.kdl"]);
        let renamed = commit("Rename");
        check("c.kdl", &renamed, Some(blob("HEAD:jobs/c.kdl")));

        // Changed on two branches and merged with a third text: the merge
        // is the commit, and its blob is asked of HEAD.
        git_in(top, &["checkout", "-q", "-b", "side"]);
        write("a.kdl", "job 1, side\n");
        commit("Side");
        git_in(top, &["checkout", "-q", "main"]);
        write("a.kdl", "job 1, main\n");
        commit("Main");
        let _ = Command::new("git")
            .arg("-C")
            .arg(top)
            .args([
                "-c",
                "user.name=Bench",
                "-c",
                "user.email=bench@example.invalid",
            ])
            .args(["merge", "-q", "side", "-m", "Merge"])
            .output()
            .unwrap();
        write("a.kdl", "job 1, merged\n");
        let merged = commit("Merge side");
        assert_eq!(
            git_in(top, &["rev-list", "--parents", "-1", "HEAD"])
                .split(' ')
                .count(),
            3
        );
        check("a.kdl", &merged, Some(blob("HEAD:jobs/a.kdl")));

        // A merge that takes one side as it was: the commit of that side.
        git_in(top, &["checkout", "-q", "-b", "other"]);
        write("c.kdl", "job 3, other\n");
        let other = commit("Other");
        git_in(top, &["checkout", "-q", "main"]);
        write("b.kdl", "unrelated\n");
        commit("Unrelated");
        git_in(top, &["merge", "-q", "--no-edit", "other"]);
        check("c.kdl", &other, Some(blob("HEAD:jobs/c.kdl")));

        // Removed in HEAD: the commit that removed it, no blob.
        std::fs::remove_file(file("a.kdl")).unwrap();
        let removed = commit("Remove");
        check("a.kdl", &removed, None);

        // Never committed: no answer.
        write("new.kdl", "job 4\n");
        assert_eq!(look_up(&file("new.kdl")), None);
        assert_eq!(look_up_in_two_runs(&file("new.kdl"), &plain), None);
    }

    #[test]
    fn a_folder_git_could_find_no_repository_for_is_told_without_git() {
        let top = tempfile::tempdir().unwrap();
        let jobs = top.path().join("shop").join("jobs");
        std::fs::create_dir_all(&jobs).unwrap();
        let outside = std::fs::canonicalize(top.path())
            .unwrap()
            .ancestors()
            .all(|d| !d.join(".git").exists() && !d.join("HEAD").is_file());
        if !outside {
            // The temporary folder is itself inside a repository.
            return;
        }
        assert!(!may_be_in_repository(&jobs));
        assert_eq!(head(&jobs), None);
        assert_eq!(look_up(&jobs.join("job.kdl")), None);
        // A `.git` folder, a `.git` file (a worktree's, a submodule's) or
        // a repository's own folder above it: git is asked.
        std::fs::create_dir(top.path().join("shop").join(".git")).unwrap();
        assert!(may_be_in_repository(&jobs));
        std::fs::remove_dir(top.path().join("shop").join(".git")).unwrap();
        std::fs::write(jobs.join(".git"), "gitdir: /elsewhere\n").unwrap();
        assert!(may_be_in_repository(&jobs));
        std::fs::remove_file(jobs.join(".git")).unwrap();
        std::fs::write(top.path().join("HEAD"), "ref: refs/heads/main\n").unwrap();
        std::fs::create_dir(top.path().join("objects")).unwrap();
        assert!(may_be_in_repository(&jobs));
        // A folder that cannot be resolved: git is asked.
        assert!(may_be_in_repository(&top.path().join("gone")));
        // In a real repository, from a folder below its top.
        if have_git() {
            let repo = tempfile::tempdir().unwrap();
            git_in(repo.path(), &["init", "-q"]);
            let below = repo.path().join("a").join("b");
            std::fs::create_dir_all(&below).unwrap();
            assert!(may_be_in_repository(&below));
        }
    }

    #[test]
    fn a_raw_line_is_taken_only_when_it_plainly_names_the_file() {
        let id = "8ee8ca4fa74b5a3f0eaaa488d7f8a22e802846eb";
        let old = "d9bd46c1cb079ea69470cf7805bf1bcb3572cc14";
        let zero = "0".repeat(40);
        let commit = "90c6c3dd5246531b9e153ee1d21bf5533ea3478f";
        let answer = |lines: &str| parse_last_change(&format!("{commit}\n\n{lines}"), "a.kdl");
        assert_eq!(
            answer(&format!(":100644 100644 {old} {id} M\ta.kdl\n")),
            Some((commit.to_string(), Blob::Id(id.to_string())))
        );
        assert_eq!(
            answer(&format!(":000000 100644 {zero} {id} A\ta.kdl\n")),
            Some((commit.to_string(), Blob::Id(id.to_string())))
        );
        assert_eq!(
            answer(&format!(":100644 000000 {old} {zero} D\ta.kdl\n")),
            Some((commit.to_string(), Blob::Removed))
        );
        // Not plainly the file: a quoted name, a file in a folder of that
        // name, two lines, none, a short id.
        for lines in [
            format!(":100644 100644 {old} {id} M\t\"a.kdl\"\n"),
            format!(":100644 100644 {old} {id} M\ta.kdl/a.kdl\n"),
            format!(":100644 100644 {old} {id} M\ta.kdl\n:100644 100644 {old} {id} M\ta.kdl\n"),
            String::new(),
            format!(":100644 100644 {old} 8ee8ca4 M\ta.kdl\n"),
        ] {
            assert_eq!(
                answer(&lines),
                Some((commit.to_string(), Blob::Unsaid)),
                "{lines}"
            );
        }
        assert_eq!(parse_last_change("", "a.kdl"), None);
        assert_eq!(parse_last_change("not-an-id\n", "a.kdl"), None);
    }

    #[test]
    fn gits_refusals_are_told_apart_and_said_in_the_readers_language() {
        // git's words, as git 2.x prints them under LC_ALL=C.
        for (detail, expected) in [
            (
                "fatal: not a git repository (or any of the parent directories): .git",
                Refusal::NotRepository,
            ),
            ("fatal: invalid object name 'nope'.", Refusal::NoRevision),
            (
                "fatal: path 'b.kdl' does not exist in 'HEAD'",
                Refusal::NotInRevision,
            ),
            (
                "fatal: path 'b.kdl' exists on disk, but not in 'HEAD~1'",
                Refusal::NotInRevision,
            ),
            ("fatal: something else entirely", Refusal::Other),
        ] {
            assert_eq!(refusal(detail), expected, "{detail}");
        }
        let e = GitError::Failed {
            spec: "HEAD:b.kdl".into(),
            refusal: Refusal::NotInRevision,
            detail: "fatal: path 'b.kdl' does not exist in 'HEAD'\n".into(),
        };
        assert_eq!(
            e.to_string(),
            "cannot read HEAD:b.kdl: `b.kdl` is not in revision `HEAD` (git said: “fatal: path 'b.kdl' does not exist in 'HEAD'”)"
        );
        let de = crate::catalogue::Catalogue::built_in("de").unwrap();
        assert_eq!(
            de.say(&e.msg()),
            "HEAD:b.kdl kann nicht gelesen werden: `b.kdl` ist in der Revision `HEAD` nicht vorhanden (git sagte: „fatal: path 'b.kdl' does not exist in 'HEAD'“)"
        );
    }
}
