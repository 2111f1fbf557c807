//! The footer's look-up ([`super::look_up`]) remembered against where the
//! repository stands, so rendering a job again (an edit, `watch`, `--force`)
//! need not walk its history once more: `git log -1 -- FILE` reads every
//! commit back to the last one that changed the file, some 4–8 ms of
//! processor time in a repository of a few hundred commits and more in a
//! larger one, where asking for `HEAD` is about 1 ms.
//!
//! The answer is taken from history **at a given commit** (the `HEAD` the
//! render's content key was made from: [`super::Head`]), and a commit's
//! history never changes: its id is a hash of its parents' ids. So the
//! answer is remembered against the job folder (its path, links followed),
//! the file's name, that commit's id and the folder's place in the
//! repository, and used only when all four are the same. **Not seen**, as
//! the content key does not see them either: history rewritten without
//! moving `HEAD` by the repository's own grafts or replacement objects, or
//! a shallow clone deepened (`git fetch --deepen`), which can make an
//! older commit the one that last changed the file.
//!
//! **Where:** the per-user cache folder ([`crate::folders::cache_dir`]
//! `/git/`, private to the user, not used when it is a link, someone
//! else's or writable by others), one small text file per job file (named
//! by the BLAKE3 hash of its folder and name, so it is replaced when
//! `HEAD` moves): a fixed first line and the key and answer, each on a
//! line of its own. An entry that does not read exactly so, or whose key
//! is not the render's, is ignored and replaced. Only an answer git gave
//! is kept: a run that failed, timed out or was interrupted is not.

use std::io::Write;
use std::path::{Path, PathBuf};

use super::{Head, Lookup};

/// The first line of an entry; a change to the layout raises its number.
const MARK: &str = "ampreport git look-up 1";

/// The name of the cache's folder under the per-user cache root.
pub const FOLDER: &str = "git";

/// The largest entry read: a path's worth of key and two ids.
const MAX_ENTRY_BYTES: u64 = 64 * 1024;

/// What an answer is remembered against.
#[derive(Debug, Clone, PartialEq, Eq)]
struct Key {
    /// The job's folder, links followed.
    folder: PathBuf,
    name: String,
    head: Head,
}

/// Where the job file `file` stands in git at `head` (the commit the
/// repository holding its folder stood at, asked for the content key):
/// remembered under `cache_root` (the per-user cache root; `None`: not
/// remembered) when it was asked before for the same folder, name and
/// `head`. Without a `head` (no repository, no commit yet, or git could
/// not say), git is asked as [`super::look_up`] asks.
pub fn look_up_at(file: &Path, head: Option<&Head>, cache_root: Option<&Path>) -> Option<Lookup> {
    let Some(head) = head else {
        return super::look_up(file);
    };
    let (dir, name) = super::folder_and_name(file)?;
    let folder = cache_root.and_then(|root| crate::folders::private_folder(root, FOLDER));
    let key = std::fs::canonicalize(&dir).ok().map(|folder| Key {
        folder,
        name: name.clone(),
        head: head.clone(),
    });
    if let (Some(cache), Some(key)) = (&folder, &key)
        && let Some(answer) = recall(cache, key)
    {
        return answer;
    }
    ask_and_keep(&dir, &name, head, folder.as_deref(), key.as_ref())
}

/// [`look_up_at`]'s answer when it was remembered (`Some` of it, which
/// may itself be none), else `None`: git would have to be asked. Cheap
/// (one small file read), so a render asks it before it starts a thread
/// for the look-up.
pub fn remembered_at(
    file: &Path,
    head: &Head,
    cache_root: Option<&Path>,
) -> Option<Option<Lookup>> {
    let (dir, name) = super::folder_and_name(file)?;
    let cache = cache_root.and_then(|root| crate::folders::private_folder(root, FOLDER))?;
    let key = Key {
        folder: std::fs::canonicalize(&dir).ok()?,
        name,
        head: head.clone(),
    };
    recall(&cache, &key)
}

/// git asked at `head`, its answer kept under `folder` (the cache's
/// folder) for `key` when it is settled.
fn ask_and_keep(
    dir: &Path,
    name: &str,
    head: &Head,
    folder: Option<&Path>,
    key: Option<&Key>,
) -> Option<Lookup> {
    let asked = super::ask(dir, name, &head.commit);
    if asked.settled
        && let (Some(cache), Some(key)) = (folder, key)
    {
        remember(cache, key, asked.answer.as_ref());
    }
    asked.answer
}

/// The entry's file name for `key`.
fn entry_name(key: &Key) -> String {
    let mut hasher = blake3::Hasher::new();
    hasher.update(key.folder.as_os_str().as_encoded_bytes());
    hasher.update(b"\0");
    hasher.update(key.name.as_bytes());
    hasher.finalize().to_hex().to_string()
}

fn hex(bytes: &[u8]) -> String {
    bytes.iter().map(|b| format!("{b:02x}")).collect()
}

/// The entry's text: the key, then the answer (`-` for none).
fn entry_text(key: &Key, answer: Option<&Lookup>) -> String {
    let commit = answer.map_or("-", |a| a.commit.as_str());
    let committed = answer.and_then(|a| a.committed.as_deref()).unwrap_or("-");
    format!(
        "{MARK}\nfolder {}\nname {}\nhead {}\nprefix {}\ncommit {commit}\ncommitted {committed}\n",
        hex(key.folder.as_os_str().as_encoded_bytes()),
        hex(key.name.as_bytes()),
        key.head.commit,
        hex(key.head.prefix.as_bytes()),
    )
}

/// The answer an entry holds, when it is exactly an entry for `key`:
/// `Some(None)` when it says no commit holds the file.
fn parse_entry(text: &str, key: &Key) -> Option<Option<Lookup>> {
    let expected = entry_text(key, None);
    // The key's lines are the first five of the entry for no answer.
    let key_lines: String = expected.split_inclusive('\n').take(5).collect();
    let rest = text.strip_prefix(key_lines.as_str())?;
    let mut lines = rest.split_terminator('\n');
    let commit = lines.next()?.strip_prefix("commit ")?;
    let committed = lines.next()?.strip_prefix("committed ")?;
    if lines.next().is_some() || !text.ends_with('\n') {
        return None;
    }
    let id = |s: &str| {
        (s.len() >= super::SHORT_ID_DIGITS
            && s.len() <= 64
            && s.chars().all(|c| c.is_ascii_hexdigit()))
        .then(|| s.to_string())
    };
    if commit == "-" {
        return (committed == "-").then_some(None);
    }
    let commit = id(commit)?;
    let committed = if committed == "-" {
        None
    } else {
        Some(id(committed)?)
    };
    Some(Some(Lookup { commit, committed }))
}

/// The answer kept for `key` in `cache`, if any.
fn recall(cache: &Path, key: &Key) -> Option<Option<Lookup>> {
    let read = crate::input_file::read_in_folder(cache, &entry_name(key), MAX_ENTRY_BYTES).ok()?;
    parse_entry(std::str::from_utf8(&read.bytes).ok()?, key)
}

/// Keeps `answer` for `key` in `cache`, replacing the file's entry in one
/// rename. Errors are ignored: the cache only saves asking.
fn remember(cache: &Path, key: &Key, answer: Option<&Lookup>) {
    let name = entry_name(key);
    crate::typeset::sweep_partials(cache);
    let Ok(mut partial) = crate::typeset::locked_partial(cache, &name) else {
        return;
    };
    if partial
        .write_all(entry_text(key, answer).as_bytes())
        .is_ok()
    {
        let _ = partial.persist(cache.join(&name));
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    fn key() -> Key {
        Key {
            folder: PathBuf::from("/shop/jobs\n2026"),
            name: "D-2611-014.kdl".into(),
            head: Head {
                commit: "2444dd4a4c879eda84b0699625aa059a0839a51a".into(),
                prefix: "jobs\n2026/".into(),
            },
        }
    }

    fn answer() -> Lookup {
        Lookup {
            commit: "90c6c3dd5246531b9e153ee1d21bf5533ea3478f".into(),
            committed: Some("8ee8ca4fa74b5a3f0eaaa488d7f8a22e802846eb".into()),
        }
    }

    #[test]
    fn an_entry_reads_back_only_for_its_own_key() {
        let k = key();
        for a in [
            Some(answer()),
            Some(Lookup {
                committed: None,
                ..answer()
            }),
            None,
        ] {
            let text = entry_text(&k, a.as_ref());
            assert_eq!(parse_entry(&text, &k), Some(a.clone()), "{text}");
            // Any other folder, name, commit or place in the repository.
            let mut others = vec![k.clone(); 4];
            others[0].folder = PathBuf::from("/shop/jobs\n2027");
            others[1].name = "D-2611-015.kdl".into();
            others[2].head.commit = "3444dd4a4c879eda84b0699625aa059a0839a51a".into();
            others[3].head.prefix = "jobs/".into();
            for other in &others {
                assert_eq!(parse_entry(&text, other), None, "{other:?}");
            }
            // Every entry cut short, lengthened or with one byte changed.
            for cut in 0..text.len() {
                assert_eq!(parse_entry(&text[..cut], &k), None, "cut at {cut}");
            }
            assert_eq!(parse_entry(&format!("{text}x\n"), &k), None);
            for at in 0..text.len() {
                let mut bytes = text.clone().into_bytes();
                bytes[at] = if bytes[at] == b'0' { b'1' } else { b'0' };
                let Ok(changed) = String::from_utf8(bytes) else {
                    continue;
                };
                assert_ne!(parse_entry(&changed, &k), Some(a.clone()), "byte {at}");
            }
        }
    }

    #[test]
    fn a_kept_answer_is_used_for_the_same_head_and_asked_again_for_another() {
        let repo = tempfile::tempdir().unwrap();
        let cache = tempfile::tempdir().unwrap();
        let git = |args: &[&str]| {
            let out = std::process::Command::new("git")
                .arg("-C")
                .arg(repo.path())
                .args([
                    "-c",
                    "user.name=Bench",
                    "-c",
                    "user.email=bench@example.invalid",
                ])
                .args(["-c", "commit.gpgSign=false"])
                .args(args)
                .output();
            match out {
                Ok(o) if o.status.success() => Some(String::from_utf8(o.stdout).unwrap()),
                _ => None,
            }
        };
        if git(&["init", "-q"]).is_none() {
            return;
        }
        let job = repo.path().join("job.kdl");
        std::fs::write(&job, "job 1\n").unwrap();
        git(&["add", "job.kdl"]).unwrap();
        git(&["commit", "-q", "-m", "Take in"]).unwrap();
        let head = super::super::head(repo.path()).unwrap();
        let asked = super::super::look_up(&job).unwrap();
        let cache_root = Some(cache.path());
        // Nothing kept yet: a render starts git's look-up.
        assert_eq!(remembered_at(&job, &head, cache_root), None);
        assert_eq!(
            look_up_at(&job, Some(&head), cache_root),
            Some(asked.clone())
        );
        // Kept now: read without git, the same answer.
        assert_eq!(
            remembered_at(&job, &head, cache_root),
            Some(Some(asked.clone()))
        );
        let entries: Vec<_> = std::fs::read_dir(cache.path().join(FOLDER))
            .unwrap()
            .map(|e| e.unwrap().path())
            .collect();
        assert_eq!(entries.len(), 1, "{entries:?}");
        let entry = std::fs::read_to_string(&entries[0]).unwrap();
        assert!(
            entry.contains(&format!("commit {}\n", asked.commit)),
            "{entry}"
        );

        // The kept answer is what is used: an entry altered to name another
        // commit (as a test of which is read; a real entry is git's answer)
        // is believed for the same head …
        let other = "1".repeat(40);
        let altered = entry.replace(
            &format!("\ncommit {}\n", asked.commit),
            &format!("\ncommit {other}\n"),
        );
        assert_ne!(altered, entry);
        std::fs::write(&entries[0], altered).unwrap();
        assert_eq!(
            look_up_at(&job, Some(&head), cache_root).unwrap().commit,
            other
        );
        assert_eq!(
            remembered_at(&job, &head, cache_root)
                .unwrap()
                .unwrap()
                .commit,
            other
        );
        // … and not for another: a new commit asks git again and replaces
        // the entry.
        std::fs::write(&job, "job 1, as left\n").unwrap();
        git(&["commit", "-q", "-a", "-m", "As left"]).unwrap();
        let moved = super::super::head(repo.path()).unwrap();
        let now = super::super::look_up(&job).unwrap();
        assert_ne!(now, asked);
        assert_eq!(remembered_at(&job, &moved, cache_root), None);
        assert_eq!(
            look_up_at(&job, Some(&moved), cache_root),
            Some(now.clone())
        );
        assert_eq!(look_up_at(&job, Some(&moved), cache_root), Some(now));
        // A damaged entry is asked again.
        std::fs::write(&entries[0], "ampreport git look-up 1\nnonsense\n").unwrap();
        assert_eq!(
            look_up_at(&job, Some(&moved), cache_root),
            super::super::look_up(&job)
        );
        // A file no commit holds: that is kept too.
        let new = repo.path().join("new.kdl");
        std::fs::write(&new, "job 2\n").unwrap();
        assert_eq!(look_up_at(&new, Some(&moved), cache_root), None);
        assert_eq!(
            std::fs::read_dir(cache.path().join(FOLDER))
                .unwrap()
                .count(),
            2
        );
        // Without a head or a cache: git is asked.
        assert_eq!(look_up_at(&new, None, None), None);
        assert_eq!(look_up_at(&job, None, None), super::super::look_up(&job));
    }
}
