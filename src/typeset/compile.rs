//! Running `typst compile` on a sandbox and putting the PDF in place
//! atomically: the PDF is written to a temporary file beside the destination
//! and renamed over it only when typst succeeded, so a failed run never
//! leaves half a file or replaces a good one. The bundled fonts come from
//! the per-user font cache, or from the sandbox when that cannot be used.

use std::ffi::OsString;
use std::path::{Path, PathBuf};
use std::process::{Command, Stdio};

use chrono::NaiveDate;

use super::error::TypesetError;
use super::font_cache::{ensure_font_cache, user_cache_root};
use super::fonts::{FONT_DIR, write_fonts};
use super::locate::TypstProgram;
use super::sandbox::{Sandbox, native_path};

/// The PDF standard asked for unless the caller says otherwise: PDF/A-2b,
/// for archiving (embedded fonts, no external references).
pub const DEFAULT_PDF_STANDARD: &str = "a-2b";

/// Settings for one compile that are not part of the sources.
#[derive(Debug, Clone, PartialEq, Eq)]
pub struct CompileOptions {
    /// The date stamped into the PDF as its creation time, at 00:00 UTC.
    /// Passing the job date rather than "now" keeps the output reproducible.
    pub creation: NaiveDate,
    /// A `--pdf-standard` value such as `a-2b`; `None` for a plain PDF.
    pub pdf_standard: Option<String>,
    /// Where typst reads the bundled fonts from. The PDF is the same
    /// whichever is used.
    pub fonts: FontPlace,
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
}

/// Compiles `main` (a path inside `sandbox`) into a PDF at `output`.
///
/// The sandbox is written to a fresh temporary folder that becomes typst's
/// root. The bundled fonts come from the font cache ([`FontPlace`]), or are
/// written into that folder when the cache cannot be used; system fonts and
/// typst's own fonts are turned off. On failure the folder is kept (without
/// the fonts) and its path is in the error; `output` is left exactly as it
/// was.
pub fn compile(
    program: &TypstProgram,
    sandbox: &Sandbox,
    main: &str,
    opts: &CompileOptions,
    output: &Path,
) -> Result<CompileOutcome, TypesetError> {
    if sandbox.get(main).is_none() {
        return Err(TypesetError::BadSandboxPath {
            path: main.to_owned(),
            reason: "it is not one of the sandbox files",
        });
    }

    let root = tempfile::Builder::new()
        .prefix("ampreport-typeset-")
        .tempdir()
        .map_err(|e| TypesetError::io("create a folder in", std::env::temp_dir(), e))?;
    sandbox
        .write_files(root.path())
        .map_err(|e| TypesetError::io("write the typesetting files to", root.path(), e))?;
    let fonts = match font_cache(&opts.fonts) {
        Some(dir) => FontsUsed::Cache(dir),
        None => {
            write_fonts(root.path())
                .map_err(|e| TypesetError::io("write the fonts to", root.path(), e))?;
            FontsUsed::Sandbox
        }
    };
    let font_dir = match &fonts {
        FontsUsed::Cache(dir) => dir.clone(),
        FontsUsed::Sandbox => root.path().join(FONT_DIR),
    };

    let out_dir = match output.parent() {
        Some(dir) if !dir.as_os_str().is_empty() => dir,
        _ => Path::new("."),
    };
    let stem = output
        .file_name()
        .map(|n| n.to_string_lossy().into_owned())
        .unwrap_or_default();
    let partial = tempfile::Builder::new()
        .prefix(&format!(".{stem}."))
        .suffix(".part")
        .tempfile_in(out_dir)
        .map_err(|e| TypesetError::io("create a temporary file in", out_dir, e))?;

    let main_path = native_path(root.path(), main);
    let run = Command::new(&program.path)
        .args(arguments(
            root.path(),
            &font_dir,
            &main_path,
            opts,
            partial.path(),
        ))
        .current_dir(root.path())
        // Flags below override their environment twins; these have none.
        .env_remove("TYPST_FEATURES")
        .stdin(Stdio::null())
        .stdout(Stdio::piped())
        .stderr(Stdio::piped())
        .output()
        .map_err(|source| TypesetError::Unusable {
            path: program.path.clone(),
            problem: format!("it failed to start ({source})"),
            source: Some(source),
        })?;
    let stderr = String::from_utf8_lossy(&run.stderr).trim().to_owned();

    let wrote_pdf = std::fs::read(partial.path())
        .map(|bytes| bytes.starts_with(b"%PDF-"))
        .unwrap_or(false);
    if !run.status.success() || !wrote_pdf {
        // `partial` is deleted when it goes out of scope; the sources stay.
        let status = if run.status.success() {
            "it reported success but wrote no PDF".to_owned()
        } else {
            run.status.to_string()
        };
        let _ = std::fs::remove_dir_all(root.path().join(FONT_DIR));
        let kept = root.keep();
        let diagnostics = if stderr.is_empty() {
            "(typst printed no messages)".to_owned()
        } else {
            stderr
        };
        return Err(TypesetError::Compile {
            diagnostics,
            status,
            main: native_path(&kept, main),
            kept,
        });
    }

    match std::fs::metadata(output) {
        Ok(existing) => {
            let _ = std::fs::set_permissions(partial.path(), existing.permissions());
        }
        Err(_) => set_readable(partial.path()),
    }
    partial
        .persist(output)
        .map_err(|e| TypesetError::io("write the PDF to", output, e.error))?;
    Ok(CompileOutcome {
        warnings: stderr,
        fonts,
    })
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
        "--ignore-system-fonts".into(),
        "--ignore-embedded-fonts".into(),
        "--creation-timestamp".into(),
        opts.creation_timestamp().to_string().into(),
        "--format".into(),
        "pdf".into(),
        "--diagnostic-format".into(),
        "human".into(),
    ];
    if let Some(standard) = &opts.pdf_standard {
        args.push("--pdf-standard".into());
        args.push(standard.into());
    }
    args.push(main.into());
    args.push(out.into());
    args
}

/// Temporary files are created private; a finished PDF is an ordinary file.
#[cfg(unix)]
fn set_readable(path: &Path) {
    use std::os::unix::fs::PermissionsExt;
    let _ = std::fs::set_permissions(path, std::fs::Permissions::from_mode(0o644));
}

#[cfg(not(unix))]
fn set_readable(_: &Path) {}

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
            joined.contains("--root /r --font-path /c/fonts-0123"),
            "{joined}"
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
    }
}
