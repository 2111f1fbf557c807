//! Which shop profile a job uses. In order: a `shop.kdl` in the job's own
//! folder or the nearest folder above it (so one file serves a whole jobs
//! repository); else the file named by `--shop`; else `shop.kdl` in the
//! user's configuration folder (`$XDG_CONFIG_HOME/ampreport/` on Linux, the
//! platform's own elsewhere). `--no-shop` uses none.

use std::path::{Path, PathBuf};

/// The file name looked for beside and above the job, and in the user's
/// configuration folder.
pub const SHOP_FILE: &str = "shop.kdl";

/// Where a profile was found.
#[derive(Debug, Clone, PartialEq, Eq)]
pub enum Found {
    /// In the job's folder or a folder above it.
    BesideJob(PathBuf),
    /// Named with `--shop`.
    Named(PathBuf),
    /// In the user's configuration folder.
    UserConfig(PathBuf),
}

impl Found {
    pub fn path(&self) -> &Path {
        match self {
            Found::BesideJob(p) | Found::Named(p) | Found::UserConfig(p) => p,
        }
    }
}

/// The user's configuration folder for ampreport
/// (`$XDG_CONFIG_HOME/ampreport`, else `~/.config/ampreport` on Linux; see
/// [`crate::folders`]).
pub fn user_config_dir() -> Option<PathBuf> {
    crate::folders::config_dir()
}

/// Finds the shop profile for the job at `job`: beside it or above it,
/// else `named`, else in `config_dir`. `None` when there is none.
pub fn discover(job: &Path, named: Option<&Path>, config_dir: Option<&Path>) -> Option<Found> {
    let start = std::path::absolute(job).unwrap_or_else(|_| job.to_path_buf());
    for dir in start.ancestors().skip(1) {
        let candidate = dir.join(SHOP_FILE);
        if candidate.is_file() {
            return Some(Found::BesideJob(candidate));
        }
    }
    if let Some(named) = named {
        return Some(Found::Named(named.to_path_buf()));
    }
    config_dir
        .map(|d| d.join(SHOP_FILE))
        .filter(|p| p.is_file())
        .map(Found::UserConfig)
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn the_nearest_folder_wins_then_the_named_file_then_the_user_config() {
        let root = tempfile::tempdir().unwrap();
        let top = root.path().join("shop-repo");
        let jobs = top.join("jobs").join("2026");
        std::fs::create_dir_all(&jobs).unwrap();
        let job = jobs.join("a.kdl");
        std::fs::write(&job, "").unwrap();
        let named = root.path().join("other.kdl");
        std::fs::write(&named, "").unwrap();
        let config = root.path().join("config");
        std::fs::create_dir_all(&config).unwrap();

        // Nothing anywhere (the temporary folder has no shop.kdl above it).
        assert_eq!(discover(&job, None, Some(&config)), None);
        // The user's config folder is the last resort.
        std::fs::write(config.join(SHOP_FILE), "").unwrap();
        assert_eq!(
            discover(&job, None, Some(&config)),
            Some(Found::UserConfig(config.join(SHOP_FILE)))
        );
        // --shop comes before it.
        assert_eq!(
            discover(&job, Some(&named), Some(&config)),
            Some(Found::Named(named.clone()))
        );
        // A profile two folders up comes before both.
        std::fs::write(top.join(SHOP_FILE), "").unwrap();
        assert_eq!(
            discover(&job, Some(&named), Some(&config)),
            Some(Found::BesideJob(top.join(SHOP_FILE)))
        );
        // The nearest one wins.
        std::fs::write(jobs.join(SHOP_FILE), "").unwrap();
        assert_eq!(
            discover(&job, Some(&named), Some(&config)),
            Some(Found::BesideJob(jobs.join(SHOP_FILE)))
        );
        // A folder named shop.kdl is not a profile.
        std::fs::remove_file(jobs.join(SHOP_FILE)).unwrap();
        std::fs::create_dir(jobs.join(SHOP_FILE)).unwrap();
        assert_eq!(
            discover(&job, None, None),
            Some(Found::BesideJob(top.join(SHOP_FILE)))
        );
    }
}
