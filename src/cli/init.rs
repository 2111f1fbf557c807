//! `ampreport init PATH` and `ampreport init --shop PATH`: an annotated
//! skeleton job file, or shop profile; `init --repo DIR`: the
//! `.gitattributes` and `.gitignore` that keep a folder of jobs tidy in git
//! (see docs/git.md). Never replaces an existing file.

use std::io::Write;

use super::args::InitArgs;
use super::exit::Exit;
use crate::catalogue::{Catalogue, Msg};

/// The skeleton, a valid job file with every node explained.
pub const SKELETON: &str = include_str!("../../templates/job-skeleton.kdl");

/// How git treats the files of a job folder.
pub const GITATTRIBUTES: &str = include_str!("../../templates/repo.gitattributes");

/// What git leaves out of a job folder: everything `render` makes again.
pub const GITIGNORE: &str = include_str!("../../templates/repo.gitignore");

/// `init` reads no shop profile, so it speaks English (docs/shop.md, "The
/// terminal's language"); its words are the catalogue's all the same.
pub fn run(args: &InitArgs) -> Exit {
    let cat = Catalogue::english();
    let mut exit = Exit::Success;
    if let Some(path) = &args.path {
        exit = write_new(path, SKELETON, Msg::new("cli-init-next-job"), cat);
    }
    if let Some(path) = &args.shop
        && exit == Exit::Success
    {
        exit = write_new(
            path,
            crate::shop::SKELETON,
            Msg::new("cli-init-next-shop"),
            cat,
        );
    }
    if let Some(dir) = &args.repo
        && exit == Exit::Success
    {
        if let Err(e) = std::fs::create_dir_all(dir) {
            eprintln!(
                "{}",
                cat.say(
                    &Msg::new("cli-init-cannot-make-folder")
                        .arg("folder", dir.display().to_string())
                        .arg("error", e.to_string())
                )
            );
            return Exit::Environment;
        }
        // Both are tried, so one that exists does not keep the other out.
        let attributes = write_new(
            &dir.join(".gitattributes"),
            GITATTRIBUTES,
            Msg::new("cli-init-next-gitattributes"),
            cat,
        );
        let ignore = write_new(
            &dir.join(".gitignore"),
            GITIGNORE,
            Msg::new("cli-init-next-gitignore"),
            cat,
        );
        exit = if attributes != Exit::Success {
            attributes
        } else {
            ignore
        };
    }
    exit
}

/// Writes `text` to a new file at `path`; `next` is what to do next (its
/// `path` argument is given here), said in the words of `cat`.
pub(super) fn write_new(path: &std::path::Path, text: &str, next: Msg, cat: &Catalogue) -> Exit {
    let shown = path.display().to_string();
    let exists = || {
        eprintln!(
            "{}",
            cat.say(&Msg::new("cli-init-exists").arg("path", &shown))
        );
        Exit::InvalidInput
    };
    if path.exists() {
        return exists();
    }
    let dir = match path.parent() {
        Some(p) if !p.as_os_str().is_empty() => p.to_path_buf(),
        _ => std::path::PathBuf::from("."),
    };
    let result = tempfile::NamedTempFile::new_in(&dir).and_then(|mut tmp| {
        tmp.write_all(text.as_bytes())?;
        tmp.as_file().sync_all()?;
        tmp.persist_noclobber(path).map_err(|e| e.error)?;
        Ok(())
    });
    match result {
        Ok(()) => {
            super::ui::wrote(
                cat.say(
                    &Msg::new("cli-init-wrote")
                        .arg("path", &shown)
                        .arg("next", next.arg("path", &shown)),
                ),
            );
            Exit::Success
        }
        Err(e) if e.kind() == std::io::ErrorKind::AlreadyExists => exists(),
        Err(e) => {
            eprintln!(
                "{}",
                cat.say(
                    &Msg::new("cli-init-cannot-write")
                        .arg("path", &shown)
                        .arg("error", e.to_string())
                )
            );
            Exit::Environment
        }
    }
}
