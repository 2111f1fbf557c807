//! Where a repository's `HEAD` stands, read from the repository's own
//! files instead of a `git rev-parse` run, in the plain cases where the
//! answer cannot differ from git's; every other case is left to git.
//!
//! A render asks where the job's repository stands on every run (for the
//! content key and the footer). One `git rev-parse` was about 1.7 ms of
//! processor time, and a render of a demo job in a repository cost
//! 2.7 ms more than the same render outside one (docs/performance.md,
//! "Where HEAD stands, read without git"); reading two small files costs
//! a few microseconds.
//!
//! What is read here is what git reads for `rev-parse --show-prefix
//! --verify HEAD` run in a folder (with the environment that could name
//! another repository removed, as [`super::git_command`] does): upward
//! from the folder's real path, the first folder holding a `.git` entry
//! is the top of the working tree; `.git` is the repository's folder, or
//! a file `gitdir: PATH` naming it (a linked working tree, a submodule);
//! its `commondir` file, if any, names the folder shared by the working
//! trees, where branches live; `HEAD` holds a commit id or `ref: NAME`,
//! and the branch `NAME` is a file of that name or a line of
//! `packed-refs`. The folder's prefix is its path below the top.
//!
//! Anything else is [`Direct::AskGit`]: a repository whose configuration
//! could change the answer (extensions such as another ref store,
//! `core.worktree`, `core.bare`, includes, a per-worktree configuration),
//! one owned by another user (git may refuse it as of dubious ownership),
//! a walk that crosses into another file system, a branch that is not
//! there yet (git says "no commit yet" its own way), a symbolic branch,
//! a name that is not plain UTF-8. The unit tests hold every answer given
//! here to git's own for the same folder.

use std::path::{Path, PathBuf};

use super::Head;

/// What reading the files said.
#[derive(Debug, PartialEq, Eq)]
pub(crate) enum Direct {
    /// `HEAD` and the folder's place, as git would print them.
    Found(Head),
    /// A case left to git.
    AskGit,
}

/// The longest `HEAD`, ref file or `.git` file read: each is one line.
const SMALL_FILE: u64 = 4096;

/// The longest `packed-refs` read (a large repository's is some
/// megabytes; longer ones are left to git).
const PACKED_REFS: u64 = 32 * 1024 * 1024;

/// The longest configuration file read.
const CONFIG: u64 = 1024 * 1024;

/// Where the repository holding `folder` stands, read from its files.
pub(crate) fn head(folder: &Path) -> Direct {
    read(folder).map_or(Direct::AskGit, Direct::Found)
}

fn read(folder: &Path) -> Option<Head> {
    let real = std::fs::canonicalize(folder).ok()?;
    let me = owner_id()?;
    let device = device_of(&real)?;
    let (top, dot_git) = real.ancestors().find_map(|dir| {
        let dot_git = dir.join(".git");
        std::fs::symlink_metadata(&dot_git)
            .is_ok()
            .then(|| (dir.to_path_buf(), dot_git))
    })?;
    // Every folder from the job's up to the top on the same file system,
    // none of them a repository's own folder, none inside a `.git`.
    for dir in real.ancestors().take_while(|d| d.starts_with(&top)) {
        if device_of(dir)? != device
            || dir.file_name().is_some_and(|n| n == ".git")
            || (dir != top && dir.join("HEAD").exists())
        {
            return None;
        }
    }
    let git_dir = git_dir_of(&top, &dot_git)?;
    let common = match small_text(&git_dir.join("commondir")) {
        // A relative path is from the repository's folder.
        Some(text) => git_dir.join(text.strip_suffix('\n')?),
        None if git_dir.join("commondir").exists() => return None,
        None => git_dir.clone(),
    };
    for dir in [&top, &git_dir, &common] {
        if owner(dir)? != me {
            return None;
        }
    }
    if git_dir.join("config.worktree").exists() || !plain_config(&common.join("config"))? {
        return None;
    }
    let commit = resolve_head(&git_dir, &common)?;
    let prefix = prefix(&real, &top)?;
    Some(Head { commit, prefix })
}

/// The repository's folder named by the working tree's `.git` entry.
fn git_dir_of(top: &Path, dot_git: &Path) -> Option<PathBuf> {
    let meta = std::fs::symlink_metadata(dot_git).ok()?;
    if meta.is_dir() {
        return Some(dot_git.to_path_buf());
    }
    if !meta.is_file() {
        return None;
    }
    let text = small_text(dot_git)?;
    let named = text.strip_prefix("gitdir: ")?.strip_suffix('\n')?;
    if named.is_empty() || named.contains(['\n', '\r']) {
        return None;
    }
    // A relative path is from the working tree's top.
    let dir = std::fs::canonicalize(top.join(named)).ok()?;
    dir.is_dir().then_some(dir)
}

/// True when the repository's configuration holds nothing that changes
/// where `HEAD` is read or where the working tree's top is: no
/// `[extensions]` section (another ref store, worktree configuration),
/// no `worktree` or `bare = true` setting, no includes. A missing file is
/// plain; one that cannot be read is not.
fn plain_config(path: &Path) -> Option<bool> {
    let text = match std::fs::metadata(path) {
        Err(e) if e.kind() == std::io::ErrorKind::NotFound => return Some(true),
        Err(_) => return None,
        Ok(meta) if meta.len() > CONFIG => return None,
        Ok(_) => std::fs::read_to_string(path).ok()?,
    };
    Some(text.lines().all(|line| {
        let line: String = line
            .chars()
            .filter(|c| !c.is_whitespace())
            .collect::<String>()
            .to_ascii_lowercase();
        let bare_true = line == "bare"
            || line
                .strip_prefix("bare=")
                .is_some_and(|v| !matches!(v, "false" | "no" | "off" | "0"));
        !line.starts_with("[extensions")
            && !line.starts_with("[include")
            && !line.contains("worktree")
            && !bare_true
            && !line.contains('\\')
    }))
}

/// The commit `HEAD` names: directly (a detached `HEAD`) or through a
/// branch under `refs/heads/`, read from its file in the shared folder
/// or from `packed-refs`.
fn resolve_head(git_dir: &Path, common: &Path) -> Option<String> {
    let head = small_text(&git_dir.join("HEAD"))?;
    let head = head.strip_suffix('\n')?;
    let Some(name) = head.strip_prefix("ref: ") else {
        return commit_id(head);
    };
    if !name.starts_with("refs/heads/")
        || name
            .split('/')
            .any(|part| part.is_empty() || part.starts_with('.') || part.ends_with(".lock"))
        || name.contains(['\\', '\n', '\r', ' ', '~', '^', ':', '?', '*', '[', '\0'])
    {
        return None;
    }
    let loose = common.join(name);
    match std::fs::symlink_metadata(&loose) {
        Ok(meta) if meta.is_file() => {
            let text = small_text(&loose)?;
            return commit_id(text.strip_suffix('\n')?);
        }
        Ok(_) => return None,
        Err(e) if e.kind() == std::io::ErrorKind::NotFound => {}
        Err(_) => return None,
    }
    packed(&common.join("packed-refs"), name)
}

/// The commit `name` has in a `packed-refs` file; `None` when it is not
/// there (a branch with no commit yet: git's to say).
fn packed(path: &Path, name: &str) -> Option<String> {
    let meta = std::fs::metadata(path).ok()?;
    if meta.len() > PACKED_REFS {
        return None;
    }
    let text = std::fs::read_to_string(path).ok()?;
    text.lines()
        .filter(|line| !line.starts_with('#') && !line.starts_with('^'))
        .find_map(|line| {
            let (id, named) = line.split_once(' ')?;
            (named == name).then(|| commit_id(id)).flatten()
        })
}

/// `text` when it is a whole commit id (SHA-1 or SHA-256, lower case, as
/// git writes them).
fn commit_id(text: &str) -> Option<String> {
    (matches!(text.len(), 40 | 64)
        && text
            .bytes()
            .all(|b| b.is_ascii_digit() || (b'a'..=b'f').contains(&b)))
    .then(|| text.to_string())
}

/// The folder's path below the top, `/`-separated with a trailing `/`,
/// empty at the top: what `git rev-parse --show-prefix` prints.
fn prefix(real: &Path, top: &Path) -> Option<String> {
    let below = real.strip_prefix(top).ok()?;
    let mut prefix = String::new();
    for part in below.components() {
        prefix.push_str(part.as_os_str().to_str()?);
        prefix.push('/');
    }
    Some(prefix)
}

/// A file of one short line or so, as text.
fn small_text(path: &Path) -> Option<String> {
    use std::io::Read;
    let file = std::fs::File::open(path).ok()?;
    let mut text = String::new();
    file.take(SMALL_FILE + 1).read_to_string(&mut text).ok()?;
    (text.len() as u64 <= SMALL_FILE).then_some(text)
}

#[cfg(unix)]
fn owner_id() -> Option<u32> {
    // SAFETY: geteuid has no preconditions and touches no memory.
    Some(unsafe { libc::geteuid() })
}

#[cfg(unix)]
fn owner(path: &Path) -> Option<u32> {
    use std::os::unix::fs::MetadataExt;
    std::fs::metadata(path).ok().map(|m| m.uid())
}

#[cfg(unix)]
fn device_of(path: &Path) -> Option<u64> {
    use std::os::unix::fs::MetadataExt;
    std::fs::metadata(path).ok().map(|m| m.dev())
}

// Elsewhere git's ownership and file-system rules are not mirrored here:
// git is asked.
#[cfg(not(unix))]
fn owner_id() -> Option<u32> {
    None
}

#[cfg(not(unix))]
fn owner(_: &Path) -> Option<u32> {
    None
}

#[cfg(not(unix))]
fn device_of(_: &Path) -> Option<u64> {
    None
}

#[cfg(test)]
mod tests {
    use super::super::tests::git_in;
    use super::*;

    /// A repository at `top` with one commit holding `jobs/2026/a.kdl`.
    fn repository(top: &Path) {
        git_in(top, &["init", "-q"]);
        let jobs = top.join("jobs/2026");
        std::fs::create_dir_all(&jobs).unwrap();
        std::fs::write(jobs.join("a.kdl"), "job-format 1\n").unwrap();
        git_in(top, &["add", "."]);
        git_in(top, &["commit", "-q", "-m", "first"]);
    }

    /// The answer read from the files, which must be given (not left to
    /// git) and be git's own (`git rev-parse`, held as the reference).
    fn found_as_git_says(folder: &Path) -> Head {
        let from_git = super::super::head_from_git(folder).expect("git finds HEAD");
        assert_eq!(head(folder), Direct::Found(from_git.clone()), "{folder:?}");
        from_git
    }

    #[test]
    fn head_and_prefix_are_read_as_git_reads_them() {
        let place = tempfile::tempdir().unwrap();
        let top = place.path().join("shop");
        std::fs::create_dir(&top).unwrap();
        repository(&top);
        let at_top = found_as_git_says(&top);
        assert_eq!(at_top.prefix, "");
        assert_eq!(at_top.commit.len(), 40);
        let below = found_as_git_says(&top.join("jobs/2026"));
        assert_eq!(below.prefix, "jobs/2026/");
        assert_eq!(below.commit, at_top.commit);

        // Reached through a link: the prefix is the real folder's.
        let link = place.path().join("link");
        std::os::unix::fs::symlink(top.join("jobs"), &link).unwrap();
        assert_eq!(found_as_git_says(&link).prefix, "jobs/");

        // A second commit moves the branch; then the branch only in
        // packed-refs (its loose file gone); then a detached HEAD.
        std::fs::write(top.join("jobs/2026/b.kdl"), "job-format 1\n").unwrap();
        git_in(&top, &["add", "."]);
        git_in(&top, &["commit", "-q", "-m", "second"]);
        let second = found_as_git_says(&top.join("jobs"));
        assert_ne!(second.commit, at_top.commit);
        git_in(&top, &["pack-refs", "--all"]);
        assert!(!top.join(".git/refs/heads/main").exists());
        assert_eq!(found_as_git_says(&top.join("jobs")).commit, second.commit);
        git_in(&top, &["checkout", "-q", "--detach", &at_top.commit]);
        assert_eq!(found_as_git_says(&top).commit, at_top.commit);
    }

    #[test]
    fn linked_working_trees_and_separate_repository_folders_are_followed() {
        let place = tempfile::tempdir().unwrap();
        let top = place.path().join("shop");
        std::fs::create_dir(&top).unwrap();
        repository(&top);
        let main = found_as_git_says(&top);

        // A linked working tree on a branch of its own, one commit ahead.
        let linked = place.path().join("linked");
        git_in(
            &top,
            &[
                "worktree",
                "add",
                "-q",
                "-b",
                "other",
                linked.to_str().unwrap(),
            ],
        );
        std::fs::write(linked.join("jobs/2026/c.kdl"), "job-format 1\n").unwrap();
        git_in(&linked, &["add", "."]);
        git_in(&linked, &["commit", "-q", "-m", "other"]);
        let other = found_as_git_says(&linked.join("jobs/2026"));
        assert_eq!(other.prefix, "jobs/2026/");
        assert_ne!(other.commit, main.commit);
        assert_eq!(found_as_git_says(&top).commit, main.commit);

        // `.git` a file naming the repository's folder elsewhere.
        let apart = place.path().join("apart");
        std::fs::create_dir(&apart).unwrap();
        let store = place.path().join("store.git");
        git_in(
            &apart,
            &["init", "-q", "--separate-git-dir", store.to_str().unwrap()],
        );
        std::fs::write(apart.join("a.kdl"), "job-format 1\n").unwrap();
        git_in(&apart, &["add", "."]);
        git_in(&apart, &["commit", "-q", "-m", "first"]);
        assert!(apart.join(".git").is_file());
        found_as_git_says(&apart);
    }

    #[test]
    fn cases_that_could_read_differently_are_left_to_git() {
        let place = tempfile::tempdir().unwrap();

        // No commit yet: git's "no HEAD" is git's to say.
        let empty = place.path().join("empty");
        std::fs::create_dir(&empty).unwrap();
        git_in(&empty, &["init", "-q"]);
        assert_eq!(head(&empty), Direct::AskGit);
        assert_eq!(super::super::head_from_git(&empty), None);

        // Settings that move where HEAD or the top are read from.
        for (key, value) in [
            ("extensions.worktreeConfig", "true"),
            ("core.worktree", "/elsewhere"),
        ] {
            let top = place.path().join(key);
            std::fs::create_dir(&top).unwrap();
            repository(&top);
            assert!(matches!(head(&top), Direct::Found(_)));
            git_in(&top, &["config", key, value]);
            assert_eq!(head(&top), Direct::AskGit, "{key}");
        }

        // An include, whose file could say anything.
        let top = place.path().join("include");
        std::fs::create_dir(&top).unwrap();
        repository(&top);
        git_in(&top, &["config", "include.path", "../extra"]);
        assert_eq!(head(&top), Direct::AskGit);

        // A folder inside the repository's own folder.
        assert_eq!(head(&top.join(".git/refs")), Direct::AskGit);

        // A HEAD that names something other than a branch.
        let top = place.path().join("odd-head");
        std::fs::create_dir(&top).unwrap();
        repository(&top);
        std::fs::write(top.join(".git/HEAD"), "ref: refs/remotes/x\n").unwrap();
        assert_eq!(head(&top), Direct::AskGit);
        std::fs::write(top.join(".git/HEAD"), "not a commit\n").unwrap();
        assert_eq!(head(&top), Direct::AskGit);
    }

    #[test]
    fn commit_ids_are_whole_lower_case_hex() {
        let sha1 = "2444dd4a4c879eda84b0699625aa059a0839a51a";
        assert_eq!(commit_id(sha1).as_deref(), Some(sha1));
        let sha256 = "a".repeat(64);
        assert_eq!(commit_id(&sha256).as_deref(), Some(sha256.as_str()));
        assert_eq!(commit_id(&sha1[..39]), None);
        assert_eq!(commit_id(&sha1.to_uppercase()), None);
        assert_eq!(commit_id(""), None);
    }

    #[test]
    fn the_configuration_is_plain_only_without_settings_that_move_head() {
        let dir = tempfile::tempdir().unwrap();
        let config = dir.path().join("config");
        assert_eq!(plain_config(&config), Some(true));
        let plain =
            "[core]\n\trepositoryformatversion = 0\n\tbare = false\n\tlogallrefupdates = true\n";
        std::fs::write(&config, plain).unwrap();
        assert_eq!(plain_config(&config), Some(true));
        for odd in [
            "[core]\n\tbare\n",
            "[core]\n\tbare = true\n",
            "[core]\n\tBare = Yes\n",
            "[core]\n\tworktree = /x\n",
            "[extensions]\n\trefStorage = reftable\n",
            "[includeIf \"gitdir:/x/\"]\n\tpath = y\n",
            "[core]\n\tbare = \\\nfalse\n",
        ] {
            std::fs::write(&config, format!("{plain}{odd}")).unwrap();
            assert_eq!(plain_config(&config), Some(false), "{odd}");
        }
    }
}
