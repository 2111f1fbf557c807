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

use std::path::PathBuf;

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
