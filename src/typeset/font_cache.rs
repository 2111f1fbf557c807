//! The bundled fonts, written once per user into a cache folder instead of
//! into every sandbox: 9.3 MB written and deleted per document was a
//! noticeable share of a render. The folder is named after a SHA-256 of the
//! font bytes (worked out at build time), so a build with other fonts uses
//! another folder, and it appears in one rename, so a run never sees it
//! half-written, even with another run filling it at the same moment.
//!
//! Where: the platform's cache folder ([`crate::folders::cache_dir`]):
//! `$XDG_CACHE_HOME/ampreport/` when that is set to an absolute path, else
//! `~/.cache/ampreport/` on Linux. When the folder cannot be used, the
//! caller writes the fonts into its sandbox as before.

use std::io::{self, Write};
use std::path::{Path, PathBuf};

use super::fonts::{base_files, cjk_files, cjk_folder};

/// SHA-256 of every file in `fonts/` (see `build.rs` and [`digest_of`]), as
/// 64 hex digits.
pub const FONTS_DIGEST: &str = env!("AMPREPORT_FONTS_DIGEST");

/// The folder under the cache root that holds this build's fonts but the
/// CJK one: `fonts-`, the first 16 hex digits of [`FONTS_DIGEST`] and
/// `-base` (the CJK font is in the same name with `-cjk` appended). The
/// `-base` keeps it apart from the folder of builds that kept every font
/// in one folder under `fonts-<hash>`: both can run on one machine
/// without each replacing the other's folder while typst reads it.
pub fn font_cache_folder_name() -> String {
    format!("fonts-{}-base", &FONTS_DIGEST[..16])
}

/// The per-user cache root, `…/ampreport` ([`crate::folders::cache_dir`]),
/// or `None` when the environment names no home folder.
pub fn user_cache_root() -> Option<PathBuf> {
    crate::folders::cache_dir()
}

/// A font folder's files, as (name, contents).
type FileList = Vec<&'static (&'static str, &'static [u8])>;

/// The two folders' files: the font folder (every font but the CJK one,
/// and the licences), and the CJK folder beside it.
fn folders() -> [(FileList, bool); 2] {
    [
        (base_files().collect(), false),
        (cjk_files().collect(), true),
    ]
}

/// Every file of both folders.
#[cfg(test)]
fn files() -> impl Iterator<Item = &'static (&'static str, &'static [u8])> {
    base_files().chain(cjk_files())
}

/// Makes sure `root/fonts-<hash>/` holds exactly the bundled fonts but the
/// CJK one, and the licences, and `root/fonts-<hash>-cjk/` the CJK font
/// ([`super::fonts::cjk_folder`]), writing them if needed, and returns the
/// path of the first.
///
/// A complete folder (every file present with its size, nothing else in
/// it) is used as it is; that check costs a directory listing and a few
/// `stat` calls. Otherwise the files go into a temporary folder beside it,
/// each flushed to disk, which is then renamed into place. If another run
/// renamed its own copy in first, that one is used; a damaged folder is
/// moved aside and replaced.
pub fn ensure_font_cache(root: &Path) -> io::Result<PathBuf> {
    let dir = root.join(font_cache_folder_name());
    for (files, cjk) in folders() {
        let folder = if cjk { cjk_folder(&dir) } else { dir.clone() };
        ensure_folder(root, &folder, &files)?;
    }
    Ok(dir)
}

/// Makes sure `dir`, a folder in `root`, holds exactly `files`.
fn ensure_folder(root: &Path, dir: &Path, files: &FileList) -> io::Result<()> {
    let is_complete = |dir: &Path| holds_exactly(dir, files);
    if is_complete(dir) {
        return Ok(());
    }
    std::fs::create_dir_all(root)?;
    let fresh = tempfile::Builder::new()
        .prefix(".fonts-new-")
        .tempdir_in(root)?;
    for (name, bytes) in files {
        let mut file = std::fs::File::create(fresh.path().join(name))?;
        file.write_all(bytes)?;
        file.sync_all()?;
    }
    if std::fs::rename(fresh.path(), dir).is_ok() {
        // The folder now lives at `dir`; nothing is left to clean up.
        let _ = fresh.keep();
        return Ok(());
    }
    // Something is in the way: another run's copy (then `fresh` is
    // deleted on return) or a damaged folder, which is moved aside into a
    // temporary folder that deletes it.
    if is_complete(dir) {
        return Ok(());
    }
    let stale = tempfile::Builder::new()
        .prefix(".fonts-stale-")
        .tempdir_in(root)?;
    match std::fs::rename(dir, stale.path().join("old")) {
        Ok(()) => {}
        Err(e) if e.kind() == io::ErrorKind::NotFound => {}
        Err(e) => return Err(e),
    }
    match std::fs::rename(fresh.path(), dir) {
        Ok(()) => {
            let _ = fresh.keep();
            Ok(())
        }
        Err(_) if is_complete(dir) => Ok(()),
        Err(e) => Err(e),
    }
}

/// True when the font folder `dir` holds exactly its files (every bundled
/// font but the CJK one, and the licences), each with its size, and the
/// CJK folder beside it ([`super::fonts::cjk_folder`]) the CJK font.
pub fn is_complete(dir: &Path) -> bool {
    folders().iter().all(|(files, cjk)| {
        let folder = if *cjk {
            cjk_folder(dir)
        } else {
            dir.to_path_buf()
        };
        holds_exactly(&folder, files)
    })
}

/// True when `dir` holds exactly `files`, each with its size.
fn holds_exactly(dir: &Path, files: &FileList) -> bool {
    let Ok(entries) = std::fs::read_dir(dir) else {
        return false;
    };
    let mut count = 0;
    for entry in entries {
        let Ok(entry) = entry else { return false };
        let name = entry.file_name();
        let Some(expected) = files.iter().find(|(n, _)| name == *n) else {
            return false;
        };
        match entry.metadata() {
            Ok(meta) if meta.is_file() && meta.len() == expected.1.len() as u64 => count += 1,
            _ => return false,
        }
    }
    count == files.len()
}

/// SHA-256 of `files` in name order, each framed as its name, a NUL byte,
/// its length (8 bytes, little-endian) and its bytes: the framing `build.rs`
/// uses for [`FONTS_DIGEST`]. Used by the test that checks the build-time
/// digest against the embedded files.
#[cfg(test)]
fn digest_of<'a>(files: impl IntoIterator<Item = (&'a str, &'a [u8])>) -> String {
    use sha2::{Digest, Sha256};
    let mut files: Vec<(&str, &[u8])> = files.into_iter().collect();
    files.sort();
    let mut hasher = Sha256::new();
    for (name, bytes) in files {
        hasher.update(name.as_bytes());
        hasher.update([0]);
        hasher.update((bytes.len() as u64).to_le_bytes());
        hasher.update(bytes);
    }
    hasher
        .finalize()
        .iter()
        .map(|b| format!("{b:02x}"))
        .collect()
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::typeset::fonts::{BUNDLED_FONTS, CJK_FONT, FONT_LICENCES};

    /// The two cache folders' names, in name order.
    fn both_names() -> [String; 2] {
        [
            font_cache_folder_name(),
            format!("{}-cjk", font_cache_folder_name()),
        ]
    }

    #[test]
    fn the_build_time_digest_is_that_of_the_embedded_files() {
        assert_eq!(FONTS_DIGEST.len(), 64);
        assert_eq!(digest_of(files().map(|(n, b)| (*n, *b))), FONTS_DIGEST);
        // And it changes with the bytes.
        let mut changed: Vec<(&str, &[u8])> = files().map(|(n, b)| (*n, *b)).collect();
        changed[0].1 = &changed[0].1[1..];
        assert_ne!(digest_of(changed), FONTS_DIGEST);
        assert!(font_cache_folder_name().starts_with("fonts-"));
        assert_eq!(
            font_cache_folder_name().len(),
            "fonts-".len() + 16 + "-base".len()
        );
    }

    #[test]
    fn the_cache_is_written_once_and_then_reused() {
        let root = tempfile::tempdir().unwrap();
        let dir = ensure_font_cache(root.path()).unwrap();
        assert_eq!(dir, root.path().join(font_cache_folder_name()));
        assert!(is_complete(&dir));
        let cjk = cjk_folder(&dir);
        assert_eq!(cjk, root.path().join(&both_names()[1]));
        for (name, bytes) in files() {
            // The CJK font in its own folder, beside (not inside) the other.
            let (inside, not_in) = if *name == CJK_FONT {
                (&cjk, &dir)
            } else {
                (&dir, &cjk)
            };
            assert_eq!(&std::fs::read(inside.join(name)).unwrap(), bytes, "{name}");
            assert!(!not_in.join(name).exists(), "{name}");
        }
        // Reused as it is: the same file, not a new copy.
        let before = std::fs::metadata(dir.join(BUNDLED_FONTS[0].0))
            .unwrap()
            .modified()
            .unwrap();
        std::thread::sleep(std::time::Duration::from_millis(20));
        assert_eq!(ensure_font_cache(root.path()).unwrap(), dir);
        let after = std::fs::metadata(dir.join(BUNDLED_FONTS[0].0))
            .unwrap()
            .modified()
            .unwrap();
        assert_eq!(before, after);
        // Nothing but the two cache folders is left in the root.
        let mut names: Vec<String> = std::fs::read_dir(root.path())
            .unwrap()
            .map(|e| e.unwrap().file_name().to_string_lossy().into_owned())
            .collect();
        names.sort();
        assert_eq!(names, both_names());
    }

    #[test]
    fn a_damaged_cache_is_replaced() {
        let root = tempfile::tempdir().unwrap();
        let dir = ensure_font_cache(root.path()).unwrap();
        // Truncated file.
        std::fs::write(dir.join(BUNDLED_FONTS[1].0), b"short").unwrap();
        assert!(!is_complete(&dir));
        assert_eq!(ensure_font_cache(root.path()).unwrap(), dir);
        assert!(is_complete(&dir));
        // A missing file.
        std::fs::remove_file(dir.join(FONT_LICENCES[0].0)).unwrap();
        assert!(!is_complete(&dir));
        ensure_font_cache(root.path()).unwrap();
        assert!(is_complete(&dir));
        // A stray font typst would pick up.
        std::fs::write(dir.join("Intruder.ttf"), b"x").unwrap();
        assert!(!is_complete(&dir));
        ensure_font_cache(root.path()).unwrap();
        assert!(is_complete(&dir) && !dir.join("Intruder.ttf").exists());
        // The CJK font missing from its folder, or in the other one.
        std::fs::remove_file(cjk_folder(&dir).join(CJK_FONT)).unwrap();
        assert!(!is_complete(&dir));
        ensure_font_cache(root.path()).unwrap();
        assert!(is_complete(&dir));
        std::fs::copy(cjk_folder(&dir).join(CJK_FONT), dir.join(CJK_FONT)).unwrap();
        assert!(!is_complete(&dir));
        ensure_font_cache(root.path()).unwrap();
        assert!(is_complete(&dir) && !dir.join(CJK_FONT).exists());
        // A plain file where the folder should be.
        std::fs::remove_dir_all(&dir).unwrap();
        std::fs::write(&dir, b"not a folder").unwrap();
        ensure_font_cache(root.path()).unwrap();
        assert!(is_complete(&dir));
        assert_eq!(std::fs::read_dir(root.path()).unwrap().count(), 2);
    }

    #[test]
    fn concurrent_runs_all_get_a_complete_folder() {
        let root = tempfile::tempdir().unwrap();
        let path = root.path().to_path_buf();
        let runs: Vec<_> = (0..6)
            .map(|_| {
                let path = path.clone();
                std::thread::spawn(move || {
                    let dir = ensure_font_cache(&path).unwrap();
                    assert!(is_complete(&dir));
                    dir
                })
            })
            .collect();
        for run in runs {
            assert_eq!(run.join().unwrap(), path.join(font_cache_folder_name()));
        }
        assert_eq!(std::fs::read_dir(&path).unwrap().count(), 2);
    }

    #[cfg(unix)]
    #[test]
    fn an_unwritable_root_is_an_error_not_a_panic() {
        let root = tempfile::tempdir().unwrap();
        // A file where the root folder should be: nothing can be created in it.
        let blocked = root.path().join("file");
        std::fs::write(&blocked, b"x").unwrap();
        assert!(ensure_font_cache(&blocked.join("ampreport")).is_err());
    }
}
