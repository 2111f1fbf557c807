//! typst's answer to `--version`, remembered for as long as the program
//! file stays exactly as it was, so a render need not start typst once
//! more only to ask (some 5 ms of a render's own time).
//!
//! The answer is part of every content key, so remembering it wrongly
//! would skip renders that are due: it is remembered only against the
//! program file's **identity** ([`identity`]): the path it resolves to
//! (links followed) and that file's device, inode, size, permissions and
//! the times its bytes (`mtime`) and the file (`ctime`) last changed, to
//! the nanosecond, the same identity the content key takes for typst
//! itself. Installing, rebuilding, copying over or editing typst changes
//! the `ctime` (which `touch` cannot set back) and usually the inode and
//! size, and pointing a link elsewhere changes the resolved path: each
//! means typst is asked again. What this does not see is what the content
//! key does not see either: a rewrite keeping the size within one tick of
//! the file system's clock, or a clock set back.
//!
//! **Only typst itself is remembered.** A program that runs another one
//! answers for whatever it runs, which can change while its own file stays
//! the same, so these are asked every time: a file that starts with `#!`
//! (a wrapper script such as `exec /opt/typst-0.15/typst "$@"`, or a
//! version manager's shell shim), and a file whose name, links followed,
//! does not start with `typst` (a version manager's shim that is a link
//! to its own dispatching program). So is any program whose file cannot
//! be read, and anything off Unix. **Not seen:** a dispatching program
//! that is itself a binary file named `typst…` (a copied shim) and picks
//! another typst by a setting or the current folder; for such a set-up,
//! name the real typst with `--typst` or `AMPREPORT_TYPST`.
//!
//! **Where:** in memory for the life of the process (a batch or `watch`
//! planning again after a shared input changed), and in the per-user cache
//! folder ([`crate::folders::cache_dir`]`/typst/`, private to the user, not
//! used when it is a link, someone else's or writable by others), one
//! small text file per resolved program path: a fixed first line, the
//! identity in hex and the version. An entry whose identity is not the
//! program's as it is now, or that does not read exactly so, is ignored
//! and replaced once typst has answered. The identity is taken before
//! typst is asked and again after it answered; the answer is kept only
//! when the two are the same, so a typst replaced while it answered is
//! asked again next time. `ampreport --version` always asks typst itself
//! (and keeps its answer).

use std::collections::HashMap;
use std::io::{Read, Write};
use std::path::{Path, PathBuf};
use std::sync::{Mutex, OnceLock};

use super::version::TypstVersion;

/// The first line of an entry; a change to the layout raises its number.
const MARK: &str = "ampreport typst version 1";

/// The name of the cache's folder under the per-user cache root.
pub const FOLDER: &str = "typst";

/// The largest entry read: a path's worth of identity and a version.
const MAX_ENTRY_BYTES: u64 = 64 * 1024;

/// What tells one state of a program file from any other without reading
/// its bytes: on Unix its device and inode, size, permissions, and the
/// times its bytes and the file last changed, to the nanosecond (links
/// followed); elsewhere its bytes.
pub fn program_identity(path: &Path) -> std::io::Result<Vec<u8>> {
    #[cfg(unix)]
    {
        use std::os::unix::fs::MetadataExt;
        let meta = std::fs::metadata(path)?;
        let fields = [
            meta.dev(),
            meta.ino(),
            meta.size(),
            u64::from(meta.mode()),
            meta.mtime() as u64,
            meta.mtime_nsec() as u64,
            meta.ctime() as u64,
            meta.ctime_nsec() as u64,
        ];
        Ok(fields.iter().flat_map(|f| f.to_le_bytes()).collect())
    }
    #[cfg(not(unix))]
    {
        std::fs::read(path)
    }
}

/// The identity under which `program`'s answer may be remembered: the
/// path it resolves to and that file's [`program_identity`]; `None` for
/// a script (`#!`), a file whose resolved name does not start with
/// `typst`, a file that cannot be read, and off Unix.
pub fn identity(program: &Path) -> Option<Identity> {
    if !cfg!(unix) {
        return None;
    }
    let real = std::fs::canonicalize(program).ok()?;
    if !real.file_name()?.as_encoded_bytes().starts_with(b"typst") {
        return None;
    }
    let mut start = [0u8; 2];
    std::fs::File::open(&real)
        .and_then(|mut f| f.read_exact(&mut start))
        .ok()?;
    if &start == b"#!" {
        return None;
    }
    let mut bytes = real.as_os_str().as_encoded_bytes().to_vec();
    bytes.push(0);
    bytes.extend(program_identity(&real).ok()?);
    Some(Identity { real, bytes })
}

/// A program file's identity ([`identity`]).
#[derive(Debug, Clone, PartialEq, Eq)]
pub struct Identity {
    /// The path the program resolves to.
    real: PathBuf,
    /// The resolved path and the file's state.
    bytes: Vec<u8>,
}

/// Where answers are remembered besides memory: a cache root folder.
#[derive(Debug, Clone, PartialEq, Eq)]
pub enum Keep {
    /// Memory only.
    Memory,
    /// Memory, and `FOLDER` under this cache root.
    In(PathBuf),
}

impl Keep {
    /// The user's cache root ([`crate::folders::cache_dir`]), or memory
    /// only without one.
    pub fn user() -> Keep {
        crate::folders::cache_dir().map_or(Keep::Memory, Keep::In)
    }

    fn folder(&self) -> Option<PathBuf> {
        match self {
            Keep::Memory => None,
            Keep::In(root) => crate::folders::private_folder(root, FOLDER),
        }
    }
}

fn memory() -> &'static Mutex<HashMap<Vec<u8>, TypstVersion>> {
    static KNOWN: OnceLock<Mutex<HashMap<Vec<u8>, TypstVersion>>> = OnceLock::new();
    KNOWN.get_or_init(Default::default)
}

/// The version typst gave for exactly this identity, if it was kept.
pub fn recall(id: &Identity, keep: &Keep) -> Option<TypstVersion> {
    if let Some(known) = memory().lock().ok()?.get(&id.bytes) {
        return Some(known.clone());
    }
    let folder = keep.folder()?;
    let read = crate::input_file::read_in_folder(&folder, &entry_name(id), MAX_ENTRY_BYTES).ok()?;
    let version = parse_entry(&read.bytes, id)?;
    if let Ok(mut known) = memory().lock() {
        known.insert(id.bytes.clone(), version.clone());
    }
    Some(version)
}

/// Keeps `version` as typst's answer for `id`, in memory and (replacing
/// the entry of the same program path in one rename) in the cache folder.
/// Errors are ignored: the cache only saves asking.
pub fn remember(id: &Identity, version: &TypstVersion, keep: &Keep) {
    if let Ok(mut known) = memory().lock() {
        known.insert(id.bytes.clone(), version.clone());
    }
    let Some(folder) = keep.folder() else {
        return;
    };
    let name = entry_name(id);
    super::sweep_partials(&folder);
    let Ok(mut partial) = super::locked_partial(&folder, &name) else {
        return;
    };
    if partial
        .write_all(entry_text(id, version).as_bytes())
        .is_ok()
    {
        let _ = partial.persist(folder.join(&name));
    }
}

/// Forgets every answer kept in memory (the cache folder stays).
pub fn forget_in_memory() {
    if let Ok(mut known) = memory().lock() {
        known.clear();
    }
}

/// An entry's file name: the BLAKE3 hash of the resolved program path,
/// in hex, so each program has one entry, replaced when it changes.
fn entry_name(id: &Identity) -> String {
    blake3::hash(id.real.as_os_str().as_encoded_bytes())
        .to_hex()
        .to_string()
}

fn hex(bytes: &[u8]) -> String {
    bytes.iter().map(|b| format!("{b:02x}")).collect()
}

fn entry_text(id: &Identity, version: &TypstVersion) -> String {
    format!("{MARK}\nidentity {}\nversion {version}\n", hex(&id.bytes))
}

/// The version an entry holds, when it is exactly an entry for `id`.
fn parse_entry(bytes: &[u8], id: &Identity) -> Option<TypstVersion> {
    let text = std::str::from_utf8(bytes).ok()?;
    let mut lines = text.split_terminator('\n');
    if lines.next()? != MARK || lines.next()?.strip_prefix("identity ")? != hex(&id.bytes) {
        return None;
    }
    let version = TypstVersion::parse(lines.next()?.strip_prefix("version ")?)?;
    lines.next().is_none().then_some(version)
}

#[cfg(all(test, unix))]
mod tests {
    use super::*;
    use std::os::unix::fs::PermissionsExt;

    /// A program file that is not a script (the bytes an ELF file starts
    /// with); it is never run here.
    fn binary(path: &Path, filler: &str) {
        std::fs::write(path, format!("\x7fELF{filler}")).unwrap();
        std::fs::set_permissions(path, std::fs::Permissions::from_mode(0o755)).unwrap();
    }

    /// The file system's clock moves in ticks of at most 10 ms (a
    /// kernel's coarse clock); a change in a later tick is always seen.
    fn tick() {
        std::thread::sleep(std::time::Duration::from_millis(30));
    }

    fn v(text: &str) -> TypstVersion {
        TypstVersion::parse(text).unwrap()
    }

    #[test]
    fn an_answer_is_kept_for_exactly_the_file_it_came_from() {
        let dir = tempfile::tempdir().unwrap();
        let keep = Keep::In(dir.path().join("cache"));
        let typst = dir.path().join("typst");
        binary(&typst, "one");
        let id = identity(&typst).unwrap();
        assert_eq!(recall(&id, &keep), None, "nothing kept yet");
        remember(&id, &v("0.15.1"), &keep);
        assert_eq!(recall(&id, &keep), Some(v("0.15.1")));
        // Kept on disk too: a later process (no memory) finds it.
        let entry = dir.path().join("cache").join(FOLDER).join(entry_name(&id));
        let text = std::fs::read_to_string(&entry).unwrap();
        assert!(
            text.starts_with(MARK) && text.ends_with("version 0.15.1\n"),
            "{text}"
        );
        assert_eq!(parse_entry(text.as_bytes(), &id), Some(v("0.15.1")));
        // The same file through a link is the same program.
        let link = dir.path().join("link");
        std::os::unix::fs::symlink(&typst, &link).unwrap();
        assert_eq!(identity(&link), Some(id.clone()));

        // Each change to the file gives another identity, never recalled.
        let mut seen = vec![id];
        let mut changed = |what: &str| {
            let now = identity(&typst).unwrap();
            assert!(!seen.contains(&now), "{what}");
            assert_eq!(recall(&now, &keep), None, "{what}");
            assert_eq!(parse_entry(text.as_bytes(), &now), None, "{what}");
            seen.push(now);
        };
        tick();
        binary(&typst, "two");
        changed("rewritten in place with the same size");
        tick();
        let before = std::fs::metadata(&typst).unwrap().modified().unwrap();
        binary(&typst, "333");
        std::fs::File::options()
            .write(true)
            .open(&typst)
            .unwrap()
            .set_modified(before)
            .unwrap();
        changed("rewritten and its modification time set back");
        tick();
        let other = dir.path().join("typst-other");
        binary(&other, "444");
        std::fs::rename(&other, &typst).unwrap();
        changed("replaced by a rename");
        tick();
        std::fs::set_permissions(&typst, std::fs::Permissions::from_mode(0o700)).unwrap();
        changed("its permissions changed");
        // A link pointed at another program.
        let second = dir.path().join("typst-second");
        binary(&second, "555");
        std::fs::remove_file(&link).unwrap();
        std::os::unix::fs::symlink(&second, &link).unwrap();
        let through_link = identity(&link).unwrap();
        assert_eq!(through_link, identity(&second).unwrap());
        assert!(!seen.contains(&through_link), "a link pointed elsewhere");
    }

    #[test]
    fn a_script_or_a_missing_file_is_never_kept() {
        let dir = tempfile::tempdir().unwrap();
        let script = dir.path().join("typst-wrapper");
        std::fs::write(&script, "#!/bin/sh\nexec /opt/typst/typst \"$@\"\n").unwrap();
        assert_eq!(identity(&script), None);
        assert_eq!(identity(&dir.path().join("missing")), None);
        let empty = dir.path().join("typst-empty");
        std::fs::write(&empty, "").unwrap();
        assert_eq!(identity(&empty), None, "too short to tell");
        // A program of another name, or a link to one (a version
        // manager's dispatching program), is asked every time; a link
        // named otherwise to a typst is typst.
        let typst = dir.path().join("typst-0.15");
        binary(&typst, "typst");
        let dispatcher = dir.path().join("manager");
        binary(&dispatcher, "dispatch");
        assert_eq!(identity(&dispatcher), None);
        let shim = dir.path().join("typst");
        std::os::unix::fs::symlink(&dispatcher, &shim).unwrap();
        assert_eq!(identity(&shim), None, "a link to a dispatcher");
        let named = dir.path().join("t");
        std::os::unix::fs::symlink(&typst, &named).unwrap();
        assert_eq!(identity(&named), identity(&typst));
        assert!(identity(&typst).is_some());
    }

    #[test]
    fn an_entry_that_does_not_read_exactly_right_is_ignored() {
        let dir = tempfile::tempdir().unwrap();
        let root = dir.path().join("cache");
        let keep = Keep::In(root.clone());
        let typst = dir.path().join("typst");
        binary(&typst, "x");
        let id = identity(&typst).unwrap();
        remember(&id, &v("0.15.1"), &keep);
        let entry = root.join(FOLDER).join(entry_name(&id));
        let good = std::fs::read_to_string(&entry).unwrap();
        let identity_line = format!("identity {}", hex(&id.bytes));
        for bad in [
            good.replace(MARK, "ampreport typst version 2"),
            good.replace(&identity_line, &format!("{identity_line}00")),
            good.replace("version 0.15.1", "version 0.15"),
            good.replace("version 0.15.1", "0.15.1"),
            good.clone() + "more\n",
            String::new(),
        ] {
            forget_in_memory();
            std::fs::write(&entry, &bad).unwrap();
            assert_eq!(recall(&id, &keep), None, "{bad:?}");
        }
        // A link in place of the entry is not followed out of the folder.
        forget_in_memory();
        let outside = dir.path().join("outside");
        std::fs::write(&outside, &good).unwrap();
        std::fs::remove_file(&entry).unwrap();
        std::os::unix::fs::symlink(&outside, &entry).unwrap();
        assert_eq!(recall(&id, &keep), None, "a link out of the folder");
        // Remembering again replaces whatever is there.
        remember(&id, &v("0.15.2"), &keep);
        forget_in_memory();
        assert_eq!(recall(&id, &keep), Some(v("0.15.2")));
        // A cache folder others may write to is not used.
        forget_in_memory();
        std::fs::set_permissions(root.join(FOLDER), std::fs::Permissions::from_mode(0o777))
            .unwrap();
        assert_eq!(recall(&id, &keep), None);
        // Memory alone keeps nothing on disk.
        binary(&typst, "y");
        let other = identity(&typst).unwrap();
        remember(&other, &v("0.15.3"), &Keep::Memory);
        assert_eq!(recall(&other, &Keep::Memory), Some(v("0.15.3")));
    }
}
