//! Which job files a command line names: job files as given, and folders
//! searched for them (every `*.kdl` file except `shop.kdl`, ratings files
//! and hidden files; sub-folders with `--recursive`). Each job keeps the
//! folder it was found under, so `render --out-dir` can mirror the tree.

use std::path::{Path, PathBuf};

pub use crate::shop::SHOP_FILE;

/// A job file to work on.
#[derive(Debug, Clone, PartialEq, Eq)]
pub struct JobFile {
    /// The job file, as named or as found (the folder joined with the
    /// names below it).
    pub path: PathBuf,
    /// Where it sits under the folder it was found in (`amps/a.kdl` for
    /// `DIR/amps/a.kdl`); its file name alone when named directly.
    pub relative: PathBuf,
}

/// A folder that could not be searched.
#[derive(Debug, thiserror::Error)]
#[error("could not search the folder {path}: {source}")]
pub struct SearchError {
    pub path: PathBuf,
    #[source]
    pub source: std::io::Error,
}

/// The jobs that `arguments` name, in order: each file as given; each
/// folder's job files sorted by name, a folder's own files before its
/// sub-folders'. `skip` lists files never taken as jobs (the `--ratings`
/// files, the `--shop` profile). The same file named twice is kept once, where it first came.
pub fn find(
    arguments: &[PathBuf],
    recursive: bool,
    skip: &[PathBuf],
) -> Result<Vec<JobFile>, SearchError> {
    let skip: Vec<PathBuf> = skip.iter().filter_map(|p| p.canonicalize().ok()).collect();
    let mut out = Vec::new();
    for arg in arguments {
        if arg.is_dir() {
            search(arg, Path::new(""), recursive, &skip, &mut out)?;
        } else {
            let relative = arg
                .file_name()
                .map(PathBuf::from)
                .unwrap_or_else(|| arg.clone());
            out.push(JobFile {
                path: arg.clone(),
                relative,
            });
        }
    }
    let mut seen = std::collections::HashSet::new();
    out.retain(|j| seen.insert(j.path.canonicalize().unwrap_or_else(|_| j.path.clone())));
    Ok(out)
}

fn search(
    root: &Path,
    below: &Path,
    recursive: bool,
    skip: &[PathBuf],
    out: &mut Vec<JobFile>,
) -> Result<(), SearchError> {
    let dir = root.join(below);
    let failed = |source| SearchError {
        path: dir.clone(),
        source,
    };
    let mut files = Vec::new();
    let mut folders = Vec::new();
    for entry in std::fs::read_dir(&dir).map_err(failed)? {
        let entry = entry.map_err(failed)?;
        let name = entry.file_name();
        let Some(text) = name.to_str() else { continue };
        if text.starts_with('.') {
            continue;
        }
        // Links are followed as the file or folder they name, but a folder
        // reached through a link is not searched (no loops).
        let kind = entry.file_type().map_err(failed)?;
        if kind.is_dir() {
            folders.push(name);
        } else if is_job_name(text) {
            files.push(name);
        }
    }
    files.sort();
    folders.sort();
    for name in files {
        let path = dir.join(&name);
        if path.canonicalize().is_ok_and(|c| skip.contains(&c)) || is_other_input(&path) {
            continue;
        }
        out.push(JobFile {
            path,
            relative: below.join(&name),
        });
    }
    if recursive {
        for name in folders {
            search(root, &below.join(name), recursive, skip, out)?;
        }
    }
    Ok(())
}

/// `*.kdl`, not `shop.kdl`.
fn is_job_name(name: &str) -> bool {
    name != SHOP_FILE
        && Path::new(name)
            .extension()
            .is_some_and(|e| e.eq_ignore_ascii_case("kdl"))
}

/// True for a ratings file (its first node is `ratings-format` or
/// `valve`) or a shop profile under another name (`shop-format`). A file
/// that cannot be read is taken as a job, so its error is reported.
fn is_other_input(path: &Path) -> bool {
    let Ok(text) = std::fs::read_to_string(path) else {
        return false;
    };
    matches!(
        first_node(&text),
        Some("ratings-format" | "valve" | "shop-format")
    )
}

/// The name of the first node of a KDL text, past blank space and
/// comments; `None` when there is none or the text starts otherwise.
pub fn first_node(text: &str) -> Option<&str> {
    let mut rest = text.trim_start_matches('\u{feff}');
    loop {
        rest = rest.trim_start();
        if let Some(after) = rest.strip_prefix("//") {
            rest = after.split_once('\n').map_or("", |(_, r)| r);
        } else if rest.starts_with("/*") {
            // Block comments nest in KDL.
            let mut depth = 0usize;
            let mut i = 0;
            let bytes = rest.as_bytes();
            loop {
                if i + 1 >= bytes.len() {
                    return None;
                }
                match (bytes[i], bytes[i + 1]) {
                    (b'/', b'*') => {
                        depth += 1;
                        i += 2;
                    }
                    (b'*', b'/') => {
                        depth -= 1;
                        i += 2;
                        if depth == 0 {
                            break;
                        }
                    }
                    _ => i += 1,
                }
            }
            rest = &rest[i..];
        } else {
            break;
        }
    }
    let end = rest
        .find(|c: char| c.is_whitespace() || matches!(c, '{' | ';' | '='))
        .unwrap_or(rest.len());
    let name = rest[..end].trim_matches('"');
    (!name.is_empty()).then_some(name)
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn the_first_node_is_found_past_comments() {
        assert_eq!(first_node("job-format 1\n"), Some("job-format"));
        assert_eq!(
            first_node("\u{feff}// a\n/* b /* c */ d */\n  valve \"EL84\" {}"),
            Some("valve")
        );
        assert_eq!(first_node("ratings-format 1"), Some("ratings-format"));
        assert_eq!(first_node("// only a comment"), None);
        assert_eq!(first_node("/* open"), None);
    }

    #[test]
    fn folders_give_their_jobs_in_order_without_shop_ratings_or_hidden_files() {
        let dir = tempfile::tempdir().unwrap();
        let root = dir.path();
        let job = "job-format 1\n";
        std::fs::write(root.join("b.kdl"), job).unwrap();
        std::fs::write(root.join("a.kdl"), job).unwrap();
        std::fs::write(root.join("shop.kdl"), "shop name=\"x\"\n").unwrap();
        std::fs::write(root.join("own-ratings.kdl"), "// mine\nvalve \"X1\" {}\n").unwrap();
        std::fs::write(root.join("other-shop.kdl"), "shop-format 1\nshop \"x\"\n").unwrap();
        std::fs::write(root.join(".hidden.kdl"), job).unwrap();
        std::fs::write(root.join("notes.txt"), "x").unwrap();
        std::fs::create_dir(root.join("sub")).unwrap();
        std::fs::write(root.join("sub/c.kdl"), job).unwrap();
        std::fs::write(root.join("listed.kdl"), job).unwrap();

        let flat = find(&[root.to_path_buf()], false, &[root.join("listed.kdl")]).unwrap();
        let names: Vec<_> = flat.iter().map(|j| j.relative.clone()).collect();
        assert_eq!(names, [PathBuf::from("a.kdl"), PathBuf::from("b.kdl")]);
        assert_eq!(flat[0].path, root.join("a.kdl"));

        let deep = find(&[root.to_path_buf()], true, &[]).unwrap();
        let names: Vec<_> = deep.iter().map(|j| j.relative.clone()).collect();
        assert_eq!(
            names,
            [
                PathBuf::from("a.kdl"),
                PathBuf::from("b.kdl"),
                PathBuf::from("listed.kdl"),
                PathBuf::from("sub/c.kdl")
            ]
        );

        // A file named directly is taken as it is, once.
        let named = find(
            &[
                root.join("sub/c.kdl"),
                root.to_path_buf(),
                root.join("a.kdl"),
            ],
            true,
            &[],
        )
        .unwrap();
        assert_eq!(named.len(), 4);
        assert_eq!(named[0].relative, PathBuf::from("c.kdl"));
    }

    #[test]
    fn a_missing_folder_entry_is_named_as_a_job() {
        // A path that does not exist is passed on as a job file, whose
        // reading then fails with the usual message.
        let jobs = find(&[PathBuf::from("no/such/job.kdl")], false, &[]).unwrap();
        assert_eq!(jobs[0].path, PathBuf::from("no/such/job.kdl"));
    }
}
