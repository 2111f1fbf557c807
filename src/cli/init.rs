//! `ampreport init PATH` and `ampreport init --shop PATH`: an annotated
//! skeleton job file, or shop profile; `init --repo DIR`: the
//! `.gitattributes` and `.gitignore` that keep a folder of jobs tidy in git
//! (see docs/git.md). Never replaces an existing file.

use std::io::Write;

use super::args::InitArgs;
use super::exit::Exit;

/// The skeleton, a valid job file with every node explained.
pub const SKELETON: &str = include_str!("../../templates/job-skeleton.kdl");

/// How git treats the files of a job folder.
pub const GITATTRIBUTES: &str = include_str!("../../templates/repo.gitattributes");

/// What git leaves out of a job folder: everything `render` makes again.
pub const GITIGNORE: &str = include_str!("../../templates/repo.gitignore");

pub fn run(args: &InitArgs) -> Exit {
    let mut exit = Exit::Success;
    if let Some(path) = &args.path {
        exit = write_new(path, SKELETON, "fill it in, then run `ampreport check {}`");
    }
    if let Some(path) = &args.shop
        && exit == Exit::Success
    {
        exit = write_new(
            path,
            crate::shop::SKELETON,
            "fill it in; jobs in its folder and below use it (see docs/shop.md)",
        );
    }
    if let Some(dir) = &args.repo
        && exit == Exit::Success
    {
        if let Err(e) = std::fs::create_dir_all(dir) {
            eprintln!("error: cannot make the folder {}: {e}", dir.display());
            return Exit::Environment;
        }
        // Both are tried, so one that exists does not keep the other out.
        let attributes = write_new(
            &dir.join(".gitattributes"),
            GITATTRIBUTES,
            "PDFs and photos are binary to git, job files are text",
        );
        let ignore = write_new(
            &dir.join(".gitignore"),
            GITIGNORE,
            "rendered documents stay out of git; see docs/git.md",
        );
        exit = if attributes != Exit::Success {
            attributes
        } else {
            ignore
        };
    }
    exit
}

/// Writes `text` to a new file at `path`; `next` is what to do next (`{}`
/// stands for the path).
pub(super) fn write_new(path: &std::path::Path, text: &str, next: &str) -> Exit {
    if path.exists() {
        eprintln!(
            "error: {} already exists; ampreport never replaces a file",
            path.display()
        );
        return Exit::InvalidInput;
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
            super::ui::wrote(format!(
                "wrote {}; {}",
                path.display(),
                next.replace("{}", &path.display().to_string())
            ));
            Exit::Success
        }
        Err(e) if e.kind() == std::io::ErrorKind::AlreadyExists => {
            eprintln!(
                "error: {} already exists; ampreport never replaces a file",
                path.display()
            );
            Exit::InvalidInput
        }
        Err(e) => {
            eprintln!("error: cannot write {}: {e}", path.display());
            Exit::Environment
        }
    }
}
