//! The per-user folders ampreport reads and writes outside the job's own
//! folder, where each platform keeps them (the `directories` crate): the
//! configuration folder (a shop profile used when a job has none beside
//! it) and the cache folder (the bundled fonts written once, see
//! `typeset::font_cache`).
//!
//! | platform | configuration | cache |
//! | --- | --- | --- |
//! | Linux and other Unix | `$XDG_CONFIG_HOME/ampreport`, else `~/.config/ampreport` | `$XDG_CACHE_HOME/ampreport`, else `~/.cache/ampreport` |
//! | macOS | `~/Library/Application Support/ampreport` | `~/Library/Caches/ampreport` |
//! | Windows | `%APPDATA%\ampreport\config` | `%LOCALAPPDATA%\ampreport\cache` |
//!
//! A relative `XDG_…` value is ignored, as the XDG base-directory rules
//! say. Without a home folder there is neither; callers then do without
//! (no user shop profile; the fonts go into each run's own folder).

use std::path::{Path, PathBuf};

/// The application's name in every folder.
const APPLICATION: &str = "ampreport";

fn project() -> Option<directories::ProjectDirs> {
    directories::ProjectDirs::from("", "", APPLICATION)
}

/// The user's configuration folder for ampreport, or `None` when the
/// environment names no home folder.
pub fn config_dir() -> Option<PathBuf> {
    project().map(|p| p.config_dir().to_path_buf())
}

/// The user's cache folder for ampreport, or `None` when the environment
/// names no home folder.
pub fn cache_dir() -> Option<PathBuf> {
    project().map(|p| p.cache_dir().to_path_buf())
}

/// The folder `name` under the cache root `root`, made if needed (private
/// to the user, `0700`), for a cache of work saved between runs; `None`
/// when it cannot be made, or when it is a link, not a folder, belongs to
/// another user or may be written by others (the cache is then not used).
pub fn private_folder(root: &Path, name: &str) -> Option<PathBuf> {
    let dir = root.join(name);
    if std::fs::symlink_metadata(&dir).is_err() {
        std::fs::create_dir_all(root).ok()?;
        let mut builder = std::fs::DirBuilder::new();
        #[cfg(unix)]
        {
            use std::os::unix::fs::DirBuilderExt;
            builder.mode(0o700);
        }
        // Another run may make it at the same moment.
        if let Err(e) = builder.create(&dir)
            && e.kind() != std::io::ErrorKind::AlreadyExists
        {
            return None;
        }
    }
    trusted_folder(&dir).then_some(dir)
}

/// True when `dir` is a real folder (not a link) that only its owner,
/// the user running this, may write to.
fn trusted_folder(dir: &Path) -> bool {
    let Ok(meta) = std::fs::symlink_metadata(dir) else {
        return false;
    };
    if !meta.is_dir() {
        return false;
    }
    #[cfg(unix)]
    {
        use std::os::unix::fs::MetadataExt;
        // SAFETY: geteuid has no preconditions and touches no memory.
        let me = unsafe { libc::geteuid() };
        meta.uid() == me && meta.mode() & 0o022 == 0
    }
    #[cfg(not(unix))]
    true
}
