//! `ampreport init PATH` and `ampreport init --shop PATH`: an annotated
//! skeleton job file, or shop profile; `init --repo DIR`: the
//! `.gitattributes` and `.gitignore` that keep a folder of jobs tidy in git
//! (see docs/git.md). Never replaces an existing file.

use std::io::Write;

use super::args::InitArgs;
use super::exit::Exit;
use crate::catalogue::{Catalogue, Msg};

/// The skeleton, a valid job file with every node explained: each comment
/// line `// @KEY` stands for the catalogue's message `KEY`
/// (`cli-skeleton-…`), written by [`job_skeleton`] in the reader's
/// language.
pub const SKELETON: &str = include_str!("../../templates/job-skeleton.kdl");

/// The job skeleton with its comments in `catalogue`'s words: each line
/// of a `// @KEY` message becomes a comment line indented as the marker.
pub fn job_skeleton(catalogue: &Catalogue) -> String {
    let mut out = String::with_capacity(SKELETON.len() * 2);
    for line in SKELETON.lines() {
        let trimmed = line.trim_start();
        if trimmed.starts_with("//#") {
            continue;
        }
        match trimmed.strip_prefix("// @") {
            Some(key) => {
                let indent = &line[..line.len() - trimmed.len()];
                for words in catalogue.text(key.trim()).lines() {
                    let words = words.trim_end();
                    if words.is_empty() {
                        out.push_str(&format!("{indent}//\n"));
                    } else {
                        out.push_str(&format!("{indent}// {words}\n"));
                    }
                }
            }
            None => {
                out.push_str(line);
                out.push('\n');
            }
        }
    }
    out
}

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
        exit = write_new(path, &job_skeleton(cat), Msg::new("cli-init-next-job"), cat);
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

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn the_job_skeleton_speaks_each_built_in_language_and_reads_as_a_job() {
        for (tag, _) in crate::catalogue::BUILT_IN {
            let catalogue = Catalogue::built_in(tag).unwrap();
            // Every marker names a message of the catalogue.
            for line in SKELETON.lines() {
                if let Some(key) = line.trim_start().strip_prefix("// @") {
                    assert!(catalogue.has(key.trim()), "{tag}: {key} missing");
                }
            }
            let text = job_skeleton(&catalogue);
            assert!(
                !text.contains("// @") && !text.contains("//#"),
                "{tag}:\n{text}"
            );
            // Comment lines of words (not the commented-out examples) stay
            // short enough to read beside the values.
            for line in text
                .lines()
                .filter(|l| l.trim_start().starts_with("//") && !l.trim_start().starts_with("//  "))
            {
                assert!(line.chars().count() <= 90, "{tag}: {line}");
            }
            let decoded = crate::job::decode("skeleton.kdl", &text);
            assert!(decoded.is_ok(), "{tag}: the skeleton does not decode");
        }
        let english = job_skeleton(Catalogue::english());
        assert!(english.starts_with(
            "// An ampreport job file (KDL 2.0). One file per repair; keep it under\n\
             // version control and regenerate the documents from it.\n//\n// Values:"
        ));
        assert!(english.contains("\n    // cathode or fixed\n    bias fixed\n"));
        let german = job_skeleton(&Catalogue::built_in("de").unwrap());
        assert!(german.contains("\n    // Der Gleichrichter: eine Röhrenposition oder `silicon`"));
        assert!(german.contains("\n    // freiwillig).\n    rectifier V5\n"));
        assert!(!german.contains("The rectifier"));
    }
}
