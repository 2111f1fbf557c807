//! Running `typst compile` on a sandbox and putting the PDF in place
//! atomically. typst writes into the sandbox folder; what it wrote must be
//! a complete PDF (and carry any required text) before it is copied to a
//! temporary file beside the destination, flushed to disk and renamed over
//! it. So a failed, killed, hung or misbehaving typst, a stop signal or a
//! `kill -9` never leaves half a file at the destination or replaces a good
//! one, and whatever a killed run leaves behind is removed by the next run
//! ([`super::leftovers`]). The bundled fonts come from the per-user font
//! cache, or from the sandbox when that cannot be used.

use std::ffi::OsString;
use std::io::Write;
use std::num::NonZeroUsize;
use std::path::{Path, PathBuf};
use std::process::Command;
use std::time::Duration;

use chrono::NaiveDate;

use super::child::{Running, Stopped, status_words};
use super::error::TypesetError;
use super::font_cache::{ensure_font_cache, user_cache_root};
use super::fonts::{FONT_DIR, cjk_folder, write_fonts};
use super::interrupt;
use super::leftovers::{LockedDir, locked_copy, locked_file, sweep};
use super::locate::TypstProgram;
use super::output::{check_output, parent_folder};
use super::pdf_check::{MAX_PDF_BYTES, incomplete, missing_phrases};
use super::sandbox::{Sandbox, native_path};
use crate::catalogue::Msg;

/// How long typst may take for one run (`--version` or a compile) before it
/// is stopped, unless the caller says otherwise.
pub const DEFAULT_TIMEOUT: Duration = Duration::from_secs(120);

/// The name a typesetting folder starts with in the temporary folder.
pub const WORK_PREFIX: &str = "ampreport-typeset-";

/// The name a failed run's kept source folder starts with.
pub const KEPT_PREFIX: &str = "ampreport-source-";

/// The end of the name of the temporary file beside the destination.
pub const PARTIAL_SUFFIX: &str = ".ampreport-part";

/// How much of typst's standard error is kept; the rest is counted.
const STDERR_CAP: usize = 256 * 1024;
/// How much of typst's standard output is kept (it prints nothing useful).
const STDOUT_CAP: usize = 16 * 1024;

/// Text a finished document must show, checked in the PDF itself.
#[derive(Debug, Clone, PartialEq)]
pub struct RequiredText {
    /// What the text is, for the error: "the mains-safety notice".
    pub what: Msg,
    /// Phrases that must each appear (whitespace does not matter).
    pub phrases: Vec<String>,
}

/// The PDF standard asked for unless the caller says otherwise: PDF/A-2b,
/// for archiving (embedded fonts, no external references).
pub const DEFAULT_PDF_STANDARD: &str = "a-2b";

/// Settings for one compile that are not part of the sources.
#[derive(Debug, Clone, PartialEq)]
pub struct CompileOptions {
    /// The date stamped into the PDF as its creation time, at 00:00 UTC.
    /// Passing the job date rather than "now" keeps the output reproducible.
    pub creation: NaiveDate,
    /// A `--pdf-standard` value such as `a-2b`; `None` for a plain PDF.
    pub pdf_standard: Option<String>,
    /// Where typst reads the bundled fonts from. The PDF is the same
    /// whichever is used.
    pub fonts: FontPlace,
    /// How long typst may run before it is stopped.
    pub timeout: Duration,
    /// Text the PDF must show, or `None`.
    pub required_text: Option<RequiredText>,
    /// How many threads typst may use for its own work (`--jobs`), or
    /// `None` for typst's default (one per core). A batch running several
    /// typst processes side by side holds each to its share of the cores
    /// ([`threads_per_worker`]). The PDF is the same whichever is used
    /// (`tests/render.rs` compares the bytes), so this is not part of the
    /// content key.
    pub threads: Option<NonZeroUsize>,
    /// Whether typst is handed the CJK font ([`super::fonts::CJK_FONT`],
    /// from the folder beside the others): `false` only for a document
    /// that does not need it ([`super::fonts::fit_fonts`]), whose font
    /// rules then leave its families out. The PDF is the same either way.
    pub cjk: bool,
}

/// typst's `--jobs` for each of `workers` typst processes running side by
/// side on `cores` cores: `None` (typst's default, one thread per core)
/// for a single worker, else each worker's whole share of the cores, at
/// least one. With as many workers as cores or more, each typst gets one
/// thread: the cores are already busy, and typst's own threads then only
/// add contention (docs/performance.md, "Batch").
pub fn threads_per_worker(workers: usize, cores: usize) -> Option<NonZeroUsize> {
    (workers > 1).then(|| NonZeroUsize::new(cores / workers).unwrap_or(NonZeroUsize::MIN))
}

/// Where the bundled fonts are put for typst.
#[derive(Debug, Clone, PartialEq, Eq, Default)]
pub enum FontPlace {
    /// The per-user font cache (`$XDG_CACHE_HOME/ampreport/fonts-<hash>/`,
    /// else `~/.cache/…`), written on first use; the sandbox when it cannot
    /// be written.
    #[default]
    UserCache,
    /// A font cache under this root folder instead of the user's, with the
    /// same fallback (for tests and programs that embed ampreport).
    CacheIn(PathBuf),
    /// Always written into the sandbox's `fonts/` folder and deleted with it.
    Sandbox,
}

/// Where a compile found the fonts.
#[derive(Debug, Clone, PartialEq, Eq, Default)]
pub enum FontsUsed {
    /// The cache folder at this path.
    Cache(PathBuf),
    /// The sandbox's own `fonts/` folder.
    #[default]
    Sandbox,
}

impl CompileOptions {
    /// Options with the default PDF standard ([`DEFAULT_PDF_STANDARD`]).
    pub fn new(creation: NaiveDate) -> Self {
        Self {
            creation,
            pdf_standard: Some(DEFAULT_PDF_STANDARD.to_owned()),
            fonts: FontPlace::UserCache,
            timeout: DEFAULT_TIMEOUT,
            required_text: None,
            threads: None,
            cjk: true,
        }
    }

    /// `creation` as seconds since 1970-01-01 00:00 UTC.
    pub fn creation_timestamp(&self) -> i64 {
        self.creation
            .and_hms_opt(0, 0, 0)
            .expect("midnight exists on every date")
            .and_utc()
            .timestamp()
    }
}

/// What a successful compile has to say.
#[derive(Debug, Clone, Default, PartialEq, Eq)]
pub struct CompileOutcome {
    /// typst's warnings, verbatim; empty when it had none.
    pub warnings: String,
    /// Where typst read the fonts from.
    pub fonts: FontsUsed,
    /// The PDF as it was put in place (or written to standard output).
    pub pdf: Vec<u8>,
}

/// Compiles `main` (a path inside `sandbox`) into a PDF at `output`, or on
/// standard output when `output` is `-` (written in one piece once every
/// check below has passed).
///
/// The sandbox is written to a fresh temporary folder that becomes typst's
/// root. The bundled fonts come from the font cache ([`FontPlace`]), or are
/// written into that folder when the cache cannot be used; system fonts and
/// typst's own fonts are turned off. typst gets `opts.timeout`; its output is
/// read with a bound. On failure the source folder is kept (without the
/// fonts) and its path is in the error; `output` is left exactly as it was.
/// `output` must pass [`check_output`] (checked here again just before the
/// rename, without inputs; the caller checks it against its inputs first).
pub fn compile(
    program: &TypstProgram,
    sandbox: &Sandbox,
    main: &str,
    opts: &CompileOptions,
    output: &Path,
) -> Result<CompileOutcome, TypesetError> {
    compile_with(program, sandbox, main, opts, output, &[])
}

/// [`compile`], with files that go beside the PDF (a listing's Markdown
/// and photos, each a path and its bytes) and land with it or not at all:
/// each is written to a temporary file beside its destination while the
/// PDF is checked, and only when every one is written and the PDF passed
/// are they all renamed into place ([`put_in_place`]). On any failure
/// every temporary file is removed and every previous output is left as
/// it was. Each path must have passed [`check_output`] against the
/// command's inputs.
pub fn compile_with(
    program: &TypstProgram,
    sandbox: &Sandbox,
    main: &str,
    opts: &CompileOptions,
    output: &Path,
    beside: &[(PathBuf, Vec<u8>)],
) -> Result<CompileOutcome, TypesetError> {
    if sandbox.get(main).is_none() {
        return Err(TypesetError::BadSandboxPath {
            path: main.to_owned(),
            reason: "cli-typst-path-not-in-sandbox",
        });
    }
    check_output(output, &[])?;
    stop_if_interrupted()?;

    let temp = std::env::temp_dir();
    sweep(&temp, |name| name.starts_with(WORK_PREFIX));
    let work = LockedDir::new(&temp, WORK_PREFIX, None)
        .map_err(|e| TypesetError::io("cli-typst-io-create-folder", &temp, e))?;
    let root = work.path().join("source");
    std::fs::create_dir(&root)
        .and_then(|()| sandbox.write_files(&root))
        .map_err(|e| TypesetError::io("cli-typst-io-write-files", &root, e))?;
    let fonts = match font_cache(&opts.fonts) {
        Some(dir) => FontsUsed::Cache(dir),
        None => {
            write_fonts(&root)
                .map_err(|e| TypesetError::io("cli-typst-io-write-fonts", &root, e))?;
            FontsUsed::Sandbox
        }
    };
    let font_dir = match &fonts {
        FontsUsed::Cache(dir) => dir.clone(),
        FontsUsed::Sandbox => root.join(FONT_DIR),
    };

    let written = work.path().join("document.pdf");
    let main_path = native_path(&root, main);
    let mut command = Command::new(&program.path);
    command
        .args(arguments(&root, &font_dir, &main_path, opts, &written))
        .current_dir(&root)
        // Flags below override their environment twins; these have none.
        .env_remove("TYPST_FEATURES");
    let run = Running::spawn(command, STDOUT_CAP, STDERR_CAP).map_err(|source| {
        TypesetError::Unusable {
            path: program.path.clone(),
            problem: Msg::new("cli-typst-failed-to-start").arg("error", source.to_string()),
            source: Some(source),
        }
    })?;
    let keep = |work: LockedDir| keep_source(work, &root);
    let finished = match run.wait(opts.timeout) {
        Ok(finished) => finished,
        Err(Stopped::Interrupted(signal)) => return Err(TypesetError::Interrupted { signal }),
        Err(Stopped::TimedOut { stderr }) => {
            return Err(TypesetError::TimedOut {
                path: program.path.clone(),
                action: "compile",
                seconds: opts.timeout.as_secs_f64(),
                diagnostics: stderr.text(),
            });
        }
        Err(Stopped::Failed(e)) => {
            return Err(TypesetError::io("cli-typst-io-wait", &main_path, e));
        }
    };
    let stderr = finished.stderr.text();
    // The program at fault, with the source kept for inspection.
    let misbehaved = |kept: PathBuf, what: Msg, diagnostics: String| TypesetError::Misbehaved {
        path: program.path.clone(),
        what,
        diagnostics,
        kept,
    };

    if !finished.status.success() {
        let status = status_words(&finished.status);
        // typst reports a document it cannot compile with status 1 and its
        // reasons; anything else is the program failing.
        if finished.status.code() == Some(1) && !stderr.is_empty() {
            let kept = keep(work);
            return Err(TypesetError::Compile {
                diagnostics: stderr,
                status,
                main: native_path(&kept, main),
                kept,
            });
        }
        let what = match finished.status.code() {
            Some(1) => Msg::new("cli-typst-no-messages").arg("status", status),
            Some(101) => Msg::new("cli-typst-crashed").arg("status", status),
            Some(_) => Msg::new("cli-typst-odd-status").arg("status", status),
            None => status,
        };
        return Err(misbehaved(keep(work), what, stderr));
    }

    let size = match std::fs::metadata(&written) {
        Ok(meta) if meta.is_file() => meta.len(),
        _ => {
            return Err(misbehaved(
                keep(work),
                Msg::new("cli-typst-no-file"),
                stderr,
            ));
        }
    };
    if size > MAX_PDF_BYTES {
        return Err(misbehaved(
            keep(work),
            Msg::new("cli-typst-too-big")
                .arg("size", size.to_string())
                .arg("limit", MAX_PDF_BYTES.to_string()),
            stderr,
        ));
    }
    let bytes = std::fs::read(&written)
        .map_err(|e| TypesetError::io("cli-typst-io-read-pdf", &written, e))?;
    // The PDF is checked while it is written beside the output and
    // flushed to disk; it is renamed into place only once both are done
    // and the check passed. A failed check removes the staged file, and
    // its error wins over one of staging. The check runs on this thread
    // and the writing on another: the check is what allocates (lopdf's
    // objects, the page's text), and this thread's heap has room freed
    // by the document's build, where a new thread's heap would grow a
    // page at a time (an `mprotect` and a page fault each). A panic in
    // lopdf is caught as before, when the check had a thread of its own.
    //
    // The typst source is not needed once the PDF is read, unless the
    // check fails and it is kept for inspection: a long document's
    // (megabytes in hundreds of files, some milliseconds of the kernel's
    // work) is removed beside the check, and written again from the
    // sandbox, the same files, if the check fails. A short one's goes
    // with the work folder after the check, without a thread of its own.
    let remove_beside = sandbox.len() >= super::sandbox::PARALLEL_WRITES;
    let (checked, staged) = std::thread::scope(|s| {
        if remove_beside {
            s.spawn(|| {
                let _ = std::fs::remove_dir_all(&root);
            });
        }
        let staging = s.spawn(|| {
            std::iter::once((output, bytes.as_slice()))
                .chain(
                    beside
                        .iter()
                        .map(|(path, b)| (path.as_path(), b.as_slice())),
                )
                .map(|(path, b)| Ok((stage(b, path, true)?, path)))
                .collect::<Result<Vec<_>, TypesetError>>()
        });
        let checked = std::panic::catch_unwind(std::panic::AssertUnwindSafe(|| {
            check_document(&bytes, opts.required_text.as_ref())
        }))
        .unwrap_or_else(|_| Err(Failed::Incomplete(Msg::new("cli-typst-pdf-reader-stopped"))));
        let staged = staging
            .join()
            .unwrap_or_else(|panic| std::panic::resume_unwind(panic));
        (checked, staged)
    });
    // The source, if it was removed beside the check, written again to
    // be kept.
    let rewritten = |work: LockedDir| {
        if remove_beside {
            let _ = std::fs::remove_dir_all(&root);
            let _ = std::fs::create_dir(&root).and_then(|()| sandbox.write_files(&root));
        }
        keep(work)
    };
    match checked {
        Ok(()) => {}
        Err(Failed::Incomplete(why)) => {
            return Err(misbehaved(
                rewritten(work),
                Msg::new("cli-typst-incomplete").arg("why", why),
                stderr,
            ));
        }
        Err(Failed::Missing { what, missing }) => {
            return Err(TypesetError::MissingText {
                what,
                missing,
                kept: rewritten(work),
            });
        }
    }
    put_in_place(staged?)?;
    drop(work);
    Ok(CompileOutcome {
        warnings: stderr,
        fonts,
        pdf: bytes,
    })
}

/// Why a PDF typst wrote may not be used.
enum Failed {
    /// Not a complete PDF, in words.
    Incomplete(Msg),
    /// The required phrases its text lacks, and what they are.
    Missing { what: Msg, missing: Vec<String> },
}

/// Checks a PDF typst wrote: complete, and showing the required text.
fn check_document(bytes: &[u8], required: Option<&RequiredText>) -> Result<(), Failed> {
    let mut document = incomplete(bytes).map_err(Failed::Incomplete)?;
    if let Some(required) = required {
        let missing = missing_phrases(&mut document, &required.phrases);
        if !missing.is_empty() {
            return Err(Failed::Missing {
                what: required.what.clone(),
                missing: missing.into_iter().map(str::to_owned).collect(),
            });
        }
    }
    Ok(())
}

/// Writes `bytes` to a locked temporary file beside `output`, flushes it to
/// disk and renames it over `output`, unless a stop signal came first. A new
/// file gets the usual permissions less the umask; a replaced one keeps its
/// permissions. `-` writes them to standard output instead. For a single
/// file a command writes; files that must land together go through
/// [`compile_with`]. `output` must have passed [`check_output`] against
/// the command's inputs.
pub fn place(bytes: &[u8], output: &Path) -> Result<(), TypesetError> {
    place_with(bytes, output, true)
}

/// Writes a small file the way the PDF is written (a locked temporary
/// file beside it, renamed over it, never through a link), without
/// flushing it to disk: for a file whose loss only costs a later run some
/// work, such as an incremental render's manifest.
pub fn write_small_file(path: &Path, bytes: &[u8]) -> std::io::Result<()> {
    place_with(bytes, path, false).map_err(std::io::Error::other)
}

fn place_with(bytes: &[u8], output: &Path, sync: bool) -> Result<(), TypesetError> {
    put_in_place(vec![(stage(bytes, output, sync)?, output)])
}

/// A file written whole beside its destination (or, for `-`, held for
/// standard output), waiting to be put in place by [`put_in_place`];
/// removed if dropped before that.
struct Staged<'a> {
    bytes: &'a [u8],
    partial: Option<tempfile::NamedTempFile>,
    sync: bool,
}

/// Writes `bytes` to a locked temporary file beside `output` (flushed to
/// disk when `sync`), with the permissions of the file it will replace.
/// For `-` nothing is written yet.
fn stage<'a>(bytes: &'a [u8], output: &Path, sync: bool) -> Result<Staged<'a>, TypesetError> {
    if crate::input_file::is_dash(output) {
        return Ok(Staged {
            bytes,
            partial: None,
            sync,
        });
    }
    let out_dir = parent_folder(output);
    sweep_partials(out_dir);
    let stem = output
        .file_name()
        .map(|n| n.to_string_lossy().into_owned())
        .unwrap_or_default();
    let mut partial = locked_file(out_dir, &format!(".{stem}."), PARTIAL_SUFFIX, 0o666)
        .map_err(|e| TypesetError::io("cli-typst-io-create-temporary", out_dir, e))?;
    partial
        .write_all(bytes)
        .and_then(|()| {
            if sync {
                partial.as_file().sync_all()
            } else {
                Ok(())
            }
        })
        .map_err(|e| TypesetError::io("cli-typst-io-write", partial.path().to_path_buf(), e))?;
    if let Ok(existing) = std::fs::metadata(output) {
        let _ = std::fs::set_permissions(partial.path(), existing.permissions());
    }
    Ok(Staged {
        bytes,
        partial: Some(partial),
        sync,
    })
}

/// Puts staged files in place together, or none of them: unless a stop
/// signal came first or a destination has become a link, a folder or a
/// special file meanwhile, renames each over its destination (files
/// first, then `-`, written to standard output), and flushes the folders
/// to disk where a file asked for it. Should a rename or standard output
/// fail after earlier files were renamed, those are put back as they were
/// (the file that stood there, kept under a second name beside it until
/// the group is done, or no file), so every previous output is left as it
/// was. A `kill -9` between two renames of one group can leave the earlier
/// files new and the later ones old, each whole; their manifests say so
/// (each names its own file's hash), and the next run renders again.
fn put_in_place(staged: Vec<(Staged<'_>, &Path)>) -> Result<(), TypesetError> {
    put_in_place_with(staged, |_| {})
}

/// [`put_in_place`], calling `before_rename` with each destination just
/// before its rename (for the tests, which make a rename fail there).
fn put_in_place_with(
    staged: Vec<(Staged<'_>, &Path)>,
    mut before_rename: impl FnMut(&Path),
) -> Result<(), TypesetError> {
    stop_if_interrupted()?;
    for (_, output) in &staged {
        check_output(output, &[])?;
    }
    let count = staged.len();
    let (files, to_stdout): (Vec<_>, Vec<_>) =
        staged.into_iter().partition(|(s, _)| s.partial.is_some());
    let mut placed: Vec<(&Path, Kept, bool)> = Vec::new();
    let mut result = Ok(());
    for (i, (staged, output)) in files.into_iter().enumerate() {
        let Some(partial) = staged.partial else {
            continue;
        };
        // Only a file with another after it may have to be put back.
        let kept = if i + 1 < count {
            match Kept::before(output) {
                Ok(kept) => kept,
                Err(e) => {
                    result = Err(e);
                    break;
                }
            }
        } else {
            Kept::Unneeded
        };
        before_rename(output);
        match partial.persist(output) {
            Ok(_) => placed.push((output, kept, staged.sync)),
            Err(e) => {
                result = Err(TypesetError::io("cli-typst-io-write", output, e.error));
                break;
            }
        }
    }
    if result.is_ok() {
        for (staged, _) in to_stdout {
            let mut stdout = std::io::stdout().lock();
            if let Err(e) = stdout.write_all(staged.bytes).and_then(|()| stdout.flush()) {
                result = Err(TypesetError::io("cli-typst-io-write-stdout", "", e));
                break;
            }
        }
    }
    if result.is_err() {
        for (output, kept, _) in placed.iter_mut().rev() {
            kept.put_back(output);
        }
    }
    let mut synced: Vec<&Path> = Vec::new();
    for (output, _, sync) in &placed {
        let folder = parent_folder(output);
        if *sync && !synced.contains(&folder) {
            sync_folder(folder);
            synced.push(folder);
        }
    }
    result
}

/// What stood at a destination before a group of files was put in place,
/// for putting it back should a later file of the group fail.
enum Kept {
    /// The last file of a group is never put back.
    Unneeded,
    /// No file stood there: putting back removes the new one.
    Nothing,
    /// The file that stood there, under a second, locked name beside it
    /// (a hard link, else a copy); removed with the group.
    File(tempfile::NamedTempFile<std::fs::File>),
    /// Already put back (or that failed).
    Done,
}

impl Kept {
    fn before(output: &Path) -> Result<Self, TypesetError> {
        match std::fs::symlink_metadata(output) {
            Ok(meta) if meta.is_file() => {}
            _ => return Ok(Kept::Nothing),
        }
        let folder = parent_folder(output);
        let stem = output
            .file_name()
            .map(|n| n.to_string_lossy().into_owned())
            .unwrap_or_default();
        locked_copy(folder, &format!(".{stem}."), PARTIAL_SUFFIX, output)
            .map(Kept::File)
            .map_err(|e| TypesetError::io("cli-typst-io-create-temporary", folder, e))
    }

    /// Puts the file that stood at `output` back (or removes the new one).
    fn put_back(&mut self, output: &Path) {
        match std::mem::replace(self, Kept::Done) {
            Kept::Nothing => {
                let _ = std::fs::remove_file(output);
            }
            Kept::File(file) => {
                let _ = file.persist(output);
            }
            Kept::Unneeded | Kept::Done => {}
        }
    }
}

/// Removes the temporary files ([`PARTIAL_SUFFIX`]) that killed runs left
/// in `dir`, leaving those a live run holds.
pub(crate) fn sweep_partials(dir: &Path) {
    sweep(dir, |name| {
        name.starts_with('.') && name.ends_with(PARTIAL_SUFFIX)
    });
}

/// A locked temporary file `.STEM.*.ampreport-part` in `dir`, private to
/// the user, for writing a file that is then renamed into place.
pub(crate) fn locked_partial(dir: &Path, stem: &str) -> std::io::Result<tempfile::NamedTempFile> {
    locked_file(dir, &format!(".{stem}."), PARTIAL_SUFFIX, 0o600)
}

/// Flushes a folder's entries (the rename) to disk, where that is possible.
fn sync_folder(dir: &Path) {
    #[cfg(unix)]
    if let Ok(folder) = std::fs::File::open(dir) {
        let _ = folder.sync_all();
    }
    #[cfg(not(unix))]
    let _ = dir;
}

/// The error for a stop signal, if one came.
fn stop_if_interrupted() -> Result<(), TypesetError> {
    match interrupt::received() {
        Some(signal) => Err(TypesetError::Interrupted { signal }),
        None => Ok(()),
    }
}

/// Moves a failed run's source folder out of its work folder, to a name no
/// sweep removes, without the bulky fonts, and returns where it is.
fn keep_source(work: LockedDir, root: &Path) -> PathBuf {
    let _ = std::fs::remove_dir_all(root.join(FONT_DIR));
    let _ = std::fs::remove_dir_all(cjk_folder(&root.join(FONT_DIR)));
    let parent = work
        .path()
        .parent()
        .map(Path::to_path_buf)
        .unwrap_or_default();
    let name = work
        .path()
        .file_name()
        .map(|n| n.to_string_lossy().replacen(WORK_PREFIX, KEPT_PREFIX, 1))
        .unwrap_or_else(|| KEPT_PREFIX.to_owned());
    let kept = parent.join(name);
    if std::fs::rename(root, &kept).is_ok() {
        drop(work);
        kept
    } else {
        // Could not move it: keep the whole work folder instead.
        let _ = std::fs::remove_file(work.path().join("document.pdf"));
        work.keep().join("source")
    }
}

/// The font cache folder to use, or `None` to write the fonts into the
/// sandbox (asked for, no cache root known, or the cache not writable).
fn font_cache(place: &FontPlace) -> Option<PathBuf> {
    let root = match place {
        FontPlace::UserCache => user_cache_root()?,
        FontPlace::CacheIn(root) => root.clone(),
        FontPlace::Sandbox => return None,
    };
    ensure_font_cache(&root).ok()
}

/// The `typst compile` command line, without the program.
fn arguments(
    root: &Path,
    fonts: &Path,
    main: &Path,
    opts: &CompileOptions,
    out: &Path,
) -> Vec<OsString> {
    let mut args: Vec<OsString> = vec![
        "compile".into(),
        "--root".into(),
        root.into(),
        "--font-path".into(),
        fonts.into(),
    ];
    if opts.cjk {
        args.push("--font-path".into());
        args.push(cjk_folder(fonts).into());
    }
    let rest: [OsString; 8] = [
        "--ignore-system-fonts".into(),
        "--ignore-embedded-fonts".into(),
        "--creation-timestamp".into(),
        opts.creation_timestamp().to_string().into(),
        "--format".into(),
        "pdf".into(),
        "--diagnostic-format".into(),
        "human".into(),
    ];
    args.extend(rest);
    if let Some(threads) = opts.threads {
        args.push("--jobs".into());
        args.push(threads.to_string().into());
    }
    if let Some(standard) = &opts.pdf_standard {
        args.push("--pdf-standard".into());
        args.push(standard.into());
    }
    args.push(main.into());
    args.push(out.into());
    args
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn creation_is_midnight_utc() {
        let opts = CompileOptions::new(NaiveDate::from_ymd_opt(2024, 3, 1).unwrap());
        assert_eq!(opts.creation_timestamp(), 1_709_251_200);
        assert_eq!(opts.pdf_standard.as_deref(), Some("a-2b"));
        let epoch = CompileOptions::new(NaiveDate::from_ymd_opt(1970, 1, 1).unwrap());
        assert_eq!(epoch.creation_timestamp(), 0);
    }

    #[test]
    fn command_line_shuts_out_other_fonts() {
        let mut opts = CompileOptions::new(NaiveDate::from_ymd_opt(2024, 3, 1).unwrap());
        let args = arguments(
            Path::new("/r"),
            Path::new("/c/fonts-0123"),
            Path::new("/r/main.typ"),
            &opts,
            Path::new("/o/x"),
        );
        let args: Vec<String> = args
            .iter()
            .map(|a| a.to_string_lossy().into_owned())
            .collect();
        for flag in ["--ignore-system-fonts", "--ignore-embedded-fonts"] {
            assert!(args.iter().any(|a| a == flag), "{flag}");
        }
        let joined = args.join(" ");
        assert!(
            joined.contains(
                "--root /r --font-path /c/fonts-0123 --font-path /c/fonts-0123-cjk --ignore"
            ),
            "{joined}"
        );
        // Without the CJK folder for a document that does not need it.
        let lean = CompileOptions {
            cjk: false,
            ..opts.clone()
        };
        let lean_args: Vec<String> = arguments(
            Path::new("/r"),
            Path::new("/c/fonts-0123"),
            Path::new("/r/main.typ"),
            &lean,
            Path::new("/o/x"),
        )
        .iter()
        .map(|a| a.to_string_lossy().into_owned())
        .collect();
        assert!(
            lean_args
                .join(" ")
                .contains("--root /r --font-path /c/fonts-0123 --ignore"),
            "{lean_args:?}"
        );
        assert!(
            joined.contains("--creation-timestamp 1709251200"),
            "{joined}"
        );
        assert!(
            joined.ends_with("--pdf-standard a-2b /r/main.typ /o/x"),
            "{joined}"
        );
        opts.pdf_standard = None;
        let args = arguments(
            Path::new("/r"),
            Path::new("/r/fonts"),
            Path::new("/r/m"),
            &opts,
            Path::new("/o"),
        );
        assert!(!args.iter().any(|a| a == "--pdf-standard"));
        assert!(
            !args.iter().any(|a| a == "--jobs"),
            "typst's default threads"
        );
        opts.threads = NonZeroUsize::new(3);
        let joined = arguments(
            Path::new("/r"),
            Path::new("/r/fonts"),
            Path::new("/r/m"),
            &opts,
            Path::new("/o"),
        )
        .iter()
        .map(|a| a.to_string_lossy().into_owned())
        .collect::<Vec<_>>()
        .join(" ");
        assert!(
            joined.ends_with("--diagnostic-format human --jobs 3 /r/m /o"),
            "{joined}"
        );
    }

    fn names(dir: &Path) -> Vec<String> {
        let mut names: Vec<String> = std::fs::read_dir(dir)
            .unwrap()
            .map(|e| e.unwrap().file_name().to_string_lossy().into_owned())
            .collect();
        names.sort();
        names
    }

    #[cfg(unix)]
    #[test]
    fn a_group_that_fails_part_way_puts_back_what_it_replaced() {
        use std::os::unix::fs::MetadataExt;
        let dir = tempfile::tempdir().unwrap();
        let pdf = dir.path().join("x.pdf");
        let markdown = dir.path().join("x.md");
        let last = dir.path().join("x-photo-1.png");
        std::fs::write(&pdf, "old pdf").unwrap();
        let inode = std::fs::metadata(&pdf).unwrap().ino();
        let group = |pdf_bytes: &'static [u8]| {
            vec![
                (stage(pdf_bytes, &pdf, true).unwrap(), pdf.as_path()),
                (
                    stage(b"new md", &markdown, true).unwrap(),
                    markdown.as_path(),
                ),
                (stage(b"new photo", &last, true).unwrap(), last.as_path()),
            ]
        };
        // The last rename fails (its name has become a folder with a file
        // in it) after the PDF and the Markdown were renamed into place.
        let err = put_in_place_with(group(b"new pdf"), |output| {
            if output == last {
                std::fs::create_dir(&last).unwrap();
                std::fs::write(last.join("inside"), "x").unwrap();
            }
        })
        .unwrap_err();
        assert!(matches!(err, TypesetError::Io { .. }), "{err:?}");
        assert_eq!(std::fs::read(&pdf).unwrap(), b"old pdf");
        assert_eq!(
            std::fs::metadata(&pdf).unwrap().ino(),
            inode,
            "the very file"
        );
        assert!(!markdown.exists(), "a file that was not there is removed");
        assert_eq!(names(dir.path()), ["x-photo-1.png", "x.pdf"]);

        // A destination that became a folder before the group started:
        // nothing is renamed at all.
        let err = put_in_place_with(group(b"new pdf"), |_| {}).unwrap_err();
        assert!(matches!(err, TypesetError::Output(_)), "{err:?}");
        assert_eq!(std::fs::read(&pdf).unwrap(), b"old pdf");
        assert_eq!(names(dir.path()), ["x-photo-1.png", "x.pdf"]);

        // With the way clear, all three land and nothing else is left.
        std::fs::remove_dir_all(&last).unwrap();
        put_in_place(group(b"new pdf")).unwrap();
        assert_eq!(std::fs::read(&pdf).unwrap(), b"new pdf");
        assert_eq!(std::fs::read(&markdown).unwrap(), b"new md");
        assert_eq!(std::fs::read(&last).unwrap(), b"new photo");
        assert_eq!(names(dir.path()), ["x-photo-1.png", "x.md", "x.pdf"]);
    }

    #[test]
    fn each_of_several_typst_processes_gets_its_share_of_the_cores() {
        let threads = |workers, cores| threads_per_worker(workers, cores).map(usize::from);
        // One job at a time: typst's own default.
        assert_eq!(threads(1, 2), None);
        assert_eq!(threads(1, 16), None);
        assert_eq!(threads(0, 2), None);
        // As many workers as cores, or more: one thread each.
        assert_eq!(threads(2, 2), Some(1));
        assert_eq!(threads(4, 2), Some(1));
        assert_eq!(threads(64, 2), Some(1));
        assert_eq!(threads(3, 0), Some(1));
        // Fewer workers than cores: each its whole share, rounded down.
        assert_eq!(threads(2, 8), Some(4));
        assert_eq!(threads(3, 8), Some(2));
        assert_eq!(threads(2, 3), Some(1));
    }
}
