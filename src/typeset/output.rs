//! Where a document may be written. One check, [`check_output`], for every
//! command that writes a file from inputs: it is given every input path the
//! run reads (job, ratings, template folder, shop file, photos, the typst
//! program) and refuses an output that would destroy one of them or that is
//! not an ordinary file. [`check_emit_folder`] does the same for the
//! `--emit-source` folder, whose old contents are replaced.
//!
//! The rules, in order:
//!
//! * `-` is standard output: no file is written or replaced, so it passes
//!   (the PDF checks still run before a byte is written, see
//!   [`super::compile`]); a file of that name is written as `./-`;
//! * a path that ends in a folder (`out/`, `.`, `..`) is refused;
//! * a symbolic link is refused, wherever it points: renaming the new PDF
//!   into place would replace the link itself, and following it would write
//!   somewhere the command line does not name. Name the link's target with
//!   `-o` instead;
//! * anything that exists and is not a regular file (a folder, a FIFO, a
//!   device such as `/dev/null`, a socket) is refused;
//! * the output's folder must exist;
//! * an output that is the same file as an input (also through another
//!   name: a hard link, a symbolic link to the input, `./job.kdl`) is
//!   refused, and so is an output inside an input folder (the `--templates`
//!   folder, whose files are all read).

use std::fmt;
use std::path::{Path, PathBuf};

use miette::Diagnostic;

use crate::catalogue::{Catalogue, Msg};

/// A path the run reads, with what it is in words ("the job file", a
/// `cli-input-…` message).
#[derive(Debug, Clone, PartialEq)]
pub struct Input {
    pub path: PathBuf,
    pub what: Msg,
}

impl Input {
    /// `path`, read as `what` (the key of a `cli-input-…` message).
    pub fn new(path: impl Into<PathBuf>, what: &'static str) -> Self {
        Self {
            path: path.into(),
            what: Msg::new(what),
        }
    }

    /// `message` about the output `path` and this input: its `path`,
    /// `input` and `what` arguments.
    fn named_in(&self, message: Msg, path: &Path) -> Msg {
        message
            .arg("path", shown(path))
            .arg("input", shown(&self.path))
            .arg("what", self.what.clone())
    }
}

/// Why an output path is refused. Nothing has been written when this is
/// returned. Its words are the catalogue's (`cli-output-…`): `Display` and
/// the help are English, [`OutputRefused::in_language`] says them in the
/// reader's language.
#[derive(Debug, Clone, PartialEq)]
pub enum OutputRefused {
    Folder {
        path: PathBuf,
    },
    Link {
        path: PathBuf,
        target: PathBuf,
    },
    /// `kind` is the key of the kind's words (`cli-kind-fifo`).
    NotAFile {
        path: PathBuf,
        kind: &'static str,
    },
    NoFolder {
        path: PathBuf,
    },
    /// The output is the file `input` reads.
    IsInput {
        path: PathBuf,
        input: Input,
    },
    /// The output lies inside the folder `input` reads.
    InsideInput {
        path: PathBuf,
        input: Input,
    },
    EmitFolder {
        path: PathBuf,
        problem: Msg,
        help: Msg,
    },
}

fn shown(path: &Path) -> String {
    path.display().to_string()
}

impl OutputRefused {
    /// The diagnostic's code, the message and its help, not yet said.
    fn words(&self) -> (&'static str, Msg, Msg) {
        match self {
            Self::Folder { path } => (
                "ampreport::output::folder",
                Msg::new("cli-output-folder").arg("path", shown(path)),
                Msg::new("cli-output-folder-help").arg("example", shown(&path.join("report.pdf"))),
            ),
            Self::Link { path, target } => (
                "ampreport::output::link",
                Msg::new("cli-output-link")
                    .arg("path", shown(path))
                    .arg("target", shown(target)),
                Msg::new("cli-output-link-help"),
            ),
            Self::NotAFile { path, kind } => (
                "ampreport::output::not_a_file",
                Msg::new("cli-output-not-a-file")
                    .arg("path", shown(path))
                    .arg("kind", Msg::new(kind)),
                Msg::new("cli-output-not-a-file-help"),
            ),
            Self::NoFolder { path } => (
                "ampreport::output::no_folder",
                Msg::new("cli-output-no-folder").arg("path", shown(path)),
                Msg::new("cli-output-no-folder-help"),
            ),
            Self::IsInput { path, input } => (
                "ampreport::output::is_input",
                input.named_in(Msg::new("cli-output-is-input"), path),
                Msg::new("cli-output-is-input-help"),
            ),
            Self::InsideInput { path, input } => (
                "ampreport::output::inside_input",
                input.named_in(Msg::new("cli-output-inside-input"), path),
                Msg::new("cli-output-inside-input-help"),
            ),
            Self::EmitFolder {
                path,
                problem,
                help,
            } => (
                "ampreport::output::emit_folder",
                Msg::new("cli-emit-folder")
                    .arg("path", shown(path))
                    .arg("problem", problem.clone()),
                help.clone(),
            ),
        }
    }

    /// The diagnostic's code.
    fn code_words(&self) -> &'static str {
        self.words().0
    }

    /// The message in the words of `catalogue`.
    pub fn message_in(&self, catalogue: &Catalogue) -> String {
        catalogue.say(&self.words().1)
    }

    /// The help in the words of `catalogue`.
    pub fn help_in(&self, catalogue: &Catalogue) -> String {
        catalogue.say(&self.words().2)
    }

    /// The same refusal, code and all, in the words of `catalogue`.
    pub fn in_language(self, catalogue: &Catalogue) -> RefusedInLanguage {
        RefusedInLanguage {
            refused: self,
            catalogue: catalogue.clone(),
        }
    }
}

impl fmt::Display for OutputRefused {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        f.write_str(&self.message_in(Catalogue::english()))
    }
}

impl std::error::Error for OutputRefused {}

impl Diagnostic for OutputRefused {
    fn code<'a>(&'a self) -> Option<Box<dyn fmt::Display + 'a>> {
        Some(Box::new(self.code_words()))
    }

    fn help<'a>(&'a self) -> Option<Box<dyn fmt::Display + 'a>> {
        Some(Box::new(self.help_in(Catalogue::english())))
    }
}

/// An output refusal said in a reader's language
/// ([`OutputRefused::in_language`]).
#[derive(Debug)]
pub struct RefusedInLanguage {
    refused: OutputRefused,
    catalogue: Catalogue,
}

impl fmt::Display for RefusedInLanguage {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        f.write_str(&self.refused.message_in(&self.catalogue))
    }
}

impl std::error::Error for RefusedInLanguage {}

impl Diagnostic for RefusedInLanguage {
    fn code<'a>(&'a self) -> Option<Box<dyn fmt::Display + 'a>> {
        Some(Box::new(self.refused.code_words()))
    }

    fn help<'a>(&'a self) -> Option<Box<dyn fmt::Display + 'a>> {
        Some(Box::new(self.refused.help_in(&self.catalogue)))
    }
}

/// Checks that a file may be written at `output` by a run that reads
/// `inputs`. See the module documentation for the rules.
pub fn check_output(output: &Path, inputs: &[Input]) -> Result<(), OutputRefused> {
    if crate::input_file::is_dash(output) {
        return Ok(());
    }
    if names_a_folder(output) {
        return Err(OutputRefused::Folder {
            path: output.to_path_buf(),
        });
    }
    let existing = std::fs::symlink_metadata(output).ok();
    if let Some(meta) = &existing {
        let kind = meta.file_type();
        if kind.is_symlink() {
            return Err(OutputRefused::Link {
                path: output.to_path_buf(),
                target: std::fs::read_link(output).unwrap_or_default(),
            });
        }
        if !kind.is_file() {
            return Err(OutputRefused::NotAFile {
                path: output.to_path_buf(),
                kind: kind_words(&kind),
            });
        }
    }
    let folder = parent_folder(output);
    if !folder.is_dir() {
        return Err(OutputRefused::NoFolder {
            path: output.to_path_buf(),
        });
    }
    let resolved = resolved(output);
    for input in inputs {
        let Ok(meta) = std::fs::metadata(&input.path) else {
            continue;
        };
        if meta.is_dir() {
            if let (Some(out), Ok(dir)) = (&resolved, input.path.canonicalize())
                && out.starts_with(&dir)
            {
                return Err(OutputRefused::InsideInput {
                    path: output.to_path_buf(),
                    input: input.clone(),
                });
            }
            continue;
        }
        let same = match &existing {
            Some(out_meta) => same_file(out_meta, &meta),
            None => false,
        } || (resolved.is_some() && resolved == input.path.canonicalize().ok());
        if same {
            return Err(OutputRefused::IsInput {
                path: output.to_path_buf(),
                input: input.clone(),
            });
        }
    }
    Ok(())
}

/// Many file inputs (a batch's job files, say), indexed by what they are
/// rather than compared one by one, so that checking every output of a
/// batch against every job's inputs costs time in step with the batch.
/// Folders are not indexed: pass them to [`check_output`].
#[derive(Debug, Default)]
pub struct InputIndex {
    inputs: Vec<Input>,
    by_path: std::collections::HashMap<PathBuf, usize>,
    by_file: std::collections::HashMap<(u64, u64), usize>,
}

impl InputIndex {
    /// Indexes `inputs` by their resolved path and, on Unix, their file
    /// identity (device and inode), so hard links are found too.
    pub fn new(inputs: Vec<Input>) -> Self {
        let mut index = InputIndex::default();
        for (i, input) in inputs.iter().enumerate() {
            if let Ok(path) = input.path.canonicalize() {
                index.by_path.entry(path).or_insert(i);
            }
            if let Some(id) = std::fs::metadata(&input.path)
                .ok()
                .and_then(|m| file_id(&m))
            {
                index.by_file.entry(id).or_insert(i);
            }
        }
        index.inputs = inputs;
        index
    }

    /// Refuses an `output` that is one of the indexed inputs, under any
    /// name. Only that: the other checks are [`check_output`]'s.
    pub fn check(&self, output: &Path) -> Result<(), OutputRefused> {
        let by_file = std::fs::symlink_metadata(output)
            .ok()
            .filter(|m| m.file_type().is_file())
            .and_then(|m| file_id(&m))
            .and_then(|id| self.by_file.get(&id));
        let by_path = || resolved(output).and_then(|p| self.by_path.get(&p));
        match by_file.or_else(by_path) {
            Some(&i) => Err(OutputRefused::IsInput {
                path: output.to_path_buf(),
                input: self.inputs[i].clone(),
            }),
            None => Ok(()),
        }
    }
}

#[cfg(unix)]
fn file_id(meta: &std::fs::Metadata) -> Option<(u64, u64)> {
    use std::os::unix::fs::MetadataExt;
    Some((meta.dev(), meta.ino()))
}

#[cfg(not(unix))]
fn file_id(_: &std::fs::Metadata) -> Option<(u64, u64)> {
    None
}

/// Checks that the `--emit-source` folder `dir` may be filled by a run that
/// reads `inputs` and writes `output`: it is not a link or a file, is empty
/// or missing unless `force`, holds none of the inputs or the output and
/// lies inside no input folder, and is not the current folder, one above
/// it, or the home folder (which `force` would empty).
pub fn check_emit_folder(
    dir: &Path,
    inputs: &[Input],
    output: &Path,
    force: bool,
) -> Result<(), OutputRefused> {
    let refuse = |problem: Msg, help: &'static str| OutputRefused::EmitFolder {
        path: dir.to_path_buf(),
        problem,
        help: Msg::new(help),
    };
    if let Ok(meta) = std::fs::symlink_metadata(dir) {
        let kind = meta.file_type();
        if kind.is_symlink() {
            return Err(refuse(
                Msg::new("cli-emit-folder-link"),
                "cli-emit-folder-link-help",
            ));
        }
        if !kind.is_dir() {
            return Err(refuse(
                Msg::new("cli-emit-folder-not-a-folder").arg("kind", Msg::new(kind_words(&kind))),
                "cli-emit-folder-new-help",
            ));
        }
        let has_entries = std::fs::read_dir(dir)
            .map(|mut e| e.next().is_some())
            .unwrap_or(true);
        if has_entries && !force {
            return Err(refuse(
                Msg::new("cli-emit-folder-not-empty"),
                "cli-emit-folder-not-empty-help",
            ));
        }
    }
    let target = match resolved(dir) {
        Some(t) => t,
        // `/`, `.`, `..`: the folder itself.
        None => match dir.canonicalize() {
            Ok(t) => t,
            Err(_) => return Ok(()),
        },
    };
    let home = std::env::var_os("HOME")
        .map(PathBuf::from)
        .and_then(|h| h.canonicalize().ok());
    let cwd = std::env::current_dir()
        .ok()
        .and_then(|c| c.canonicalize().ok());
    if target.parent().is_none()
        || home.as_ref() == Some(&target)
        || cwd.as_ref().is_some_and(|c| c.starts_with(&target))
    {
        return Err(refuse(
            Msg::new("cli-emit-folder-too-wide"),
            "cli-emit-folder-too-wide-help",
        ));
    }
    let mut touched: Vec<(PathBuf, Msg)> = inputs
        .iter()
        .map(|i| (i.path.clone(), i.what.clone()))
        .collect();
    if !crate::input_file::is_dash(output) {
        touched.push((output.to_path_buf(), Msg::new("cli-input-pdf-output")));
    }
    for (path, what) in touched {
        let Some(other) = resolved(&path) else {
            continue;
        };
        if other.starts_with(&target) || (path.is_dir() && target.starts_with(&other)) {
            return Err(refuse(
                Msg::new("cli-emit-folder-overlaps")
                    .arg("what", what)
                    .arg("path", shown(&path)),
                "cli-emit-folder-overlaps-help",
            ));
        }
    }
    Ok(())
}

/// True when the path's last part is a folder name (`out/`, `.`, `..`).
fn names_a_folder(path: &Path) -> bool {
    let text = path.as_os_str().as_encoded_bytes();
    text.is_empty()
        || text.ends_with(b"/")
        || (cfg!(windows) && text.ends_with(b"\\"))
        || path.file_name().is_none()
}

/// The folder a path's last part sits in (`.` for a bare name).
pub(crate) fn parent_folder(path: &Path) -> &Path {
    match path.parent() {
        Some(dir) if !dir.as_os_str().is_empty() => dir,
        _ => Path::new("."),
    }
}

/// The absolute path with every folder resolved, and the last part as
/// given (it may not exist yet, and a link there is not followed).
fn resolved(path: &Path) -> Option<PathBuf> {
    let name = path.file_name()?;
    Some(parent_folder(path).canonicalize().ok()?.join(name))
}

#[cfg(unix)]
fn same_file(a: &std::fs::Metadata, b: &std::fs::Metadata) -> bool {
    use std::os::unix::fs::MetadataExt;
    a.dev() == b.dev() && a.ino() == b.ino()
}

#[cfg(not(unix))]
fn same_file(_: &std::fs::Metadata, _: &std::fs::Metadata) -> bool {
    false
}

/// The key of the words for what a file is ("a FIFO (named pipe)").
fn kind_words(kind: &std::fs::FileType) -> &'static str {
    #[cfg(unix)]
    {
        use std::os::unix::fs::FileTypeExt;
        if kind.is_fifo() {
            return "cli-kind-fifo";
        }
        if kind.is_char_device() || kind.is_block_device() {
            return "cli-kind-device";
        }
        if kind.is_socket() {
            return "cli-kind-socket";
        }
    }
    if kind.is_dir() {
        "cli-kind-folder"
    } else if kind.is_symlink() {
        "cli-kind-link"
    } else {
        "cli-kind-other"
    }
}

#[cfg(all(test, unix))]
mod tests {
    use super::*;

    fn job_in(dir: &Path) -> (PathBuf, Vec<Input>) {
        let job = dir.join("job.kdl");
        std::fs::write(&job, "job").unwrap();
        let inputs = vec![Input::new(&job, "cli-input-job-file")];
        (job, inputs)
    }

    #[test]
    fn a_plain_new_or_existing_pdf_is_fine() {
        let dir = tempfile::tempdir().unwrap();
        let (_, inputs) = job_in(dir.path());
        check_output(&dir.path().join("job.pdf"), &inputs).unwrap();
        std::fs::write(dir.path().join("old.pdf"), "%PDF-").unwrap();
        check_output(&dir.path().join("old.pdf"), &inputs).unwrap();
    }

    #[test]
    fn the_input_itself_under_any_name_is_refused() {
        let dir = tempfile::tempdir().unwrap();
        let (job, inputs) = job_in(dir.path());
        std::fs::create_dir(dir.path().join("sub")).unwrap();
        let hard = dir.path().join("hard.pdf");
        std::fs::hard_link(&job, &hard).unwrap();
        for output in [
            job.clone(),
            dir.path().join("sub/../job.kdl"),
            dir.path().join("./job.kdl"),
            hard,
        ] {
            let err = check_output(&output, &inputs).unwrap_err();
            assert!(
                matches!(err, OutputRefused::IsInput { .. }),
                "{output:?}: {err:?}"
            );
            assert!(err.to_string().contains("the job file"), "{err}");
        }
    }

    #[test]
    fn links_folders_and_special_files_are_refused() {
        let dir = tempfile::tempdir().unwrap();
        let (_, inputs) = job_in(dir.path());
        let pdf = dir.path().join("real.pdf");
        std::fs::write(&pdf, "%PDF-").unwrap();
        let link = dir.path().join("link.pdf");
        std::os::unix::fs::symlink(&pdf, &link).unwrap();
        let err = check_output(&link, &inputs).unwrap_err();
        assert!(matches!(err, OutputRefused::Link { .. }), "{err:?}");
        assert!(err.to_string().contains("real.pdf"), "{err}");
        let dangling = dir.path().join("dangling.pdf");
        std::os::unix::fs::symlink(dir.path().join("nowhere"), &dangling).unwrap();
        assert!(matches!(
            check_output(&dangling, &inputs),
            Err(OutputRefused::Link { .. })
        ));
        assert!(matches!(
            check_output(Path::new("/dev/null"), &inputs),
            Err(OutputRefused::NotAFile {
                kind: "cli-kind-device",
                ..
            })
        ));
        let fifo = dir.path().join("fifo.pdf");
        let c = std::ffi::CString::new(fifo.as_os_str().as_encoded_bytes()).unwrap();
        // SAFETY: a valid NUL-terminated path.
        assert_eq!(unsafe { libc::mkfifo(c.as_ptr(), 0o600) }, 0);
        let err = check_output(&fifo, &inputs).unwrap_err();
        assert!(err.to_string().contains("FIFO"), "{err}");
        for folder in [
            dir.path().to_path_buf(),
            dir.path().join("x/"),
            PathBuf::from("."),
        ] {
            assert!(check_output(&folder, &inputs).is_err(), "{folder:?}");
        }
        assert!(matches!(
            check_output(&dir.path().join("missing/x.pdf"), &inputs),
            Err(OutputRefused::NoFolder { .. })
        ));
    }

    #[test]
    fn a_dash_is_standard_output_and_dot_slash_dash_a_file() {
        let dir = tempfile::tempdir().unwrap();
        let (_, inputs) = job_in(dir.path());
        check_output(Path::new("-"), &inputs).unwrap();
        // Standard output is no file in the source folder.
        check_emit_folder(&dir.path().join("src"), &inputs, Path::new("-"), false).unwrap();
        // `./-` is a file like any other: refused when it is an input.
        std::fs::write(dir.path().join("-"), "job").unwrap();
        let dash_file = vec![Input::new(dir.path().join("-"), "cli-input-job-file")];
        let err = check_output(&dir.path().join("./-"), &dash_file).unwrap_err();
        assert!(matches!(err, OutputRefused::IsInput { .. }), "{err:?}");
    }

    #[test]
    fn inside_an_input_folder_is_refused() {
        let dir = tempfile::tempdir().unwrap();
        let templates = dir.path().join("templates");
        std::fs::create_dir_all(templates.join("images")).unwrap();
        let inputs = vec![Input::new(&templates, "cli-input-template-folder")];
        let err = check_output(&templates.join("images/x.pdf"), &inputs).unwrap_err();
        assert!(matches!(err, OutputRefused::InsideInput { .. }), "{err:?}");
        check_output(&dir.path().join("x.pdf"), &inputs).unwrap();
    }

    #[test]
    fn the_source_folder_must_be_new_empty_or_forced_and_apart() {
        let dir = tempfile::tempdir().unwrap();
        let (job, inputs) = job_in(dir.path());
        let pdf = dir.path().join("job.pdf");
        let src = dir.path().join("src");
        check_emit_folder(&src, &inputs, &pdf, false).unwrap();
        std::fs::create_dir(&src).unwrap();
        check_emit_folder(&src, &inputs, &pdf, false).unwrap();
        std::fs::write(src.join("main.typ"), "hand-edited").unwrap();
        let err = check_emit_folder(&src, &inputs, &pdf, false).unwrap_err();
        assert!(err.to_string().contains("not empty"), "{err}");
        assert!(
            miette::Diagnostic::help(&err)
                .unwrap()
                .to_string()
                .contains("--force")
        );
        check_emit_folder(&src, &inputs, &pdf, true).unwrap();
        // The folder holding the job, or the PDF, is never replaced.
        let err = check_emit_folder(dir.path(), &inputs, &pdf, true).unwrap_err();
        assert!(err.to_string().contains("the job file"), "{err}");
        let err = check_emit_folder(&src, &inputs, &src.join("x.pdf"), true).unwrap_err();
        assert!(err.to_string().contains("the PDF output"), "{err}");
        let _ = job;
        // Nor a link, a file, or the root.
        let link = dir.path().join("link");
        std::os::unix::fs::symlink(&src, &link).unwrap();
        assert!(check_emit_folder(&link, &inputs, &pdf, true).is_err());
        assert!(check_emit_folder(&src.join("main.typ"), &inputs, &pdf, true).is_err());
        assert!(check_emit_folder(Path::new("/"), &[], &pdf, true).is_err());
    }
}
