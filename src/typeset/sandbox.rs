//! The set of files typst is allowed to see for one document: the generated
//! main source, plots and images. Collected in memory first, then written to
//! a fresh folder that becomes typst's `--root`, so a document can read
//! nothing else on the machine. The fonts normally come from the font cache
//! instead; [`emit_source`] writes them in, so its folder stands alone.

use std::collections::BTreeMap;
use std::io::{self, Write};
use std::path::{Path, PathBuf};

use super::error::TypesetError;
use super::fonts::{FONT_DIR, write_fonts};
use super::interrupt;
use super::leftovers::{LockedDir, sweep};

/// Files for one typst run, keyed by their path relative to the sandbox
/// root (`main.typ`, `plots/anode.svg`). Sorted, so writing is in a fixed
/// order.
#[derive(Debug, Clone, Default, PartialEq, Eq)]
pub struct Sandbox {
    files: BTreeMap<String, FileContents>,
}

/// A file's contents as they were handed over: text (a `String` or
/// `&str`: the generated sources and the charts, known to be UTF-8) or
/// bytes (images, and files read from disk). Text is kept as text so the
/// fonts' check ([`super::fonts::needs_cjk`]) reads it without checking
/// megabytes of it for UTF-8 again; two files with the same bytes are
/// equal either way.
#[derive(Debug, Clone)]
pub enum FileContents {
    Text(String),
    Bytes(Vec<u8>),
    /// An SVG chart whose writer saw that every text it drew was plain
    /// ([`super::fonts::chart_text_is_plain`]): the fonts' check knows it
    /// needs no CJK face without reading it ([`Sandbox::insert_plain_chart`]).
    PlainChart(String),
}

impl FileContents {
    pub fn as_bytes(&self) -> &[u8] {
        match self {
            FileContents::Text(text) | FileContents::PlainChart(text) => text.as_bytes(),
            FileContents::Bytes(bytes) => bytes,
        }
    }
}

impl PartialEq for FileContents {
    fn eq(&self, other: &Self) -> bool {
        self.as_bytes() == other.as_bytes()
    }
}

impl Eq for FileContents {}

impl From<String> for FileContents {
    fn from(text: String) -> Self {
        FileContents::Text(text)
    }
}

impl From<&str> for FileContents {
    fn from(text: &str) -> Self {
        FileContents::Text(text.to_string())
    }
}

impl From<&String> for FileContents {
    fn from(text: &String) -> Self {
        FileContents::Text(text.clone())
    }
}

impl From<Vec<u8>> for FileContents {
    fn from(bytes: Vec<u8>) -> Self {
        FileContents::Bytes(bytes)
    }
}

impl From<&[u8]> for FileContents {
    fn from(bytes: &[u8]) -> Self {
        FileContents::Bytes(bytes.to_vec())
    }
}

impl<const N: usize> From<&[u8; N]> for FileContents {
    fn from(bytes: &[u8; N]) -> Self {
        FileContents::Bytes(bytes.to_vec())
    }
}

impl Sandbox {
    pub fn new() -> Self {
        Self::default()
    }

    /// Adds or replaces a file. The path must be relative, use `/` between
    /// parts, contain no `.`/`..` parts, and stay out of the `fonts/` folder,
    /// which holds the bundled fonts.
    pub fn insert(
        &mut self,
        path: impl Into<String>,
        contents: impl Into<FileContents>,
    ) -> Result<&mut Self, TypesetError> {
        let path = path.into();
        if let Some(reason) = path_problem(&path) {
            return Err(TypesetError::BadSandboxPath { path, reason });
        }
        self.files.insert(path, contents.into());
        Ok(self)
    }

    /// Adds or replaces a chart's SVG, as [`Sandbox::insert`] does; when
    /// `plain` (its writer drew only plain texts:
    /// [`super::fonts::chart_text_is_plain`]) the fonts' check takes it as
    /// needing no CJK face without reading its megabytes again. Debug
    /// builds read it all the same and hold the two answers equal.
    pub(crate) fn insert_plain_chart(
        &mut self,
        path: impl Into<String>,
        svg: String,
        plain: bool,
    ) -> Result<&mut Self, TypesetError> {
        let path = path.into();
        // The writer's word is for an SVG: a file of another name is read
        // as what its name says.
        if !plain || !path.ends_with(".svg") {
            return self.insert(path, svg);
        }
        debug_assert!(
            !super::fonts::text_needs_cjk(&path, &svg),
            "{path}: a chart taken as needing no CJK face needs it"
        );
        if let Some(reason) = path_problem(&path) {
            return Err(TypesetError::BadSandboxPath { path, reason });
        }
        self.files.insert(path, FileContents::PlainChart(svg));
        Ok(self)
    }

    /// The contents stored at `path`, if any.
    pub fn get(&self, path: &str) -> Option<&[u8]> {
        self.files.get(path).map(FileContents::as_bytes)
    }

    /// The contents stored at `path`, to change in place (the path was
    /// checked when the file was inserted).
    pub(crate) fn get_mut(&mut self, path: &str) -> Option<&mut FileContents> {
        self.files.get_mut(path)
    }

    /// All files in path order.
    pub fn files(&self) -> impl Iterator<Item = (&str, &[u8])> {
        self.files.iter().map(|(p, c)| (p.as_str(), c.as_bytes()))
    }

    /// All files in path order, as they were handed over (text or bytes).
    pub(crate) fn contents(&self) -> impl Iterator<Item = (&str, &FileContents)> {
        self.files.iter().map(|(p, c)| (p.as_str(), c))
    }

    pub fn len(&self) -> usize {
        self.files.len()
    }

    pub fn is_empty(&self) -> bool {
        self.files.is_empty()
    }

    /// Writes every file under `dir`, a fresh folder, without the fonts.
    /// Files are created new (never opened through an existing name).
    pub(crate) fn write_files(&self, dir: &Path) -> io::Result<()> {
        // The folders first, each made once: the files are in path order,
        // so the charts of a long document (hundreds in `plots/`) share
        // one, made once rather than looked up again for each.
        let mut made: Option<PathBuf> = None;
        let mut targets = Vec::with_capacity(self.files.len());
        for (path, contents) in &self.files {
            let target = native_path(dir, path);
            if let Some(parent) = target.parent()
                && made.as_deref() != Some(parent)
            {
                std::fs::create_dir_all(parent)?;
                made = Some(parent.to_path_buf());
            }
            targets.push((target, contents.as_bytes()));
        }
        let write = |(target, bytes): &(PathBuf, &[u8])| {
            std::fs::OpenOptions::new()
                .write(true)
                .create_new(true)
                .open(target)?
                .write_all(bytes)
        };
        // A long document's files (its main source is megabytes, and each
        // of hundreds of charts tens of kilobytes) are written on every
        // core: copying them into the file system is the kernel's work,
        // and it is the last thing before typst can start. The first
        // failure in path order is the one told, as when they were
        // written one after another (later files may then be written too,
        // into a folder that is removed with them).
        if targets.len() < PARALLEL_WRITES {
            targets.iter().try_for_each(write)
        } else {
            use rayon::prelude::*;
            let written: Vec<io::Result<()>> = targets.par_iter().map(write).collect();
            written.into_iter().collect()
        }
    }
}

/// From this many files on, [`Sandbox::write_files`] writes them on every
/// core (and the compile removes them beside its check of the PDF); a
/// demo document's dozen are written in order, without starting the pool,
/// and removed after the check.
pub(crate) const PARALLEL_WRITES: usize = 32;

/// `dir` joined with a checked `/`-separated sandbox path.
pub(crate) fn native_path(dir: &Path, path: &str) -> PathBuf {
    path.split('/')
        .fold(dir.to_path_buf(), |acc, part| acc.join(part))
}

/// Why `path` may not be used inside a sandbox (a catalogue key), or
/// `None` if it may.
fn path_problem(path: &str) -> Option<&'static str> {
    if path.is_empty() {
        return Some("cli-typst-path-empty");
    }
    if path.starts_with('/') || path.contains(':') {
        return Some("cli-typst-path-not-relative");
    }
    if path.contains('\\') {
        return Some("cli-typst-path-backslash");
    }
    if path.chars().any(char::is_control) {
        return Some("cli-typst-path-control");
    }
    let mut parts = path.split('/');
    if parts.clone().any(|p| p.is_empty() || p == "." || p == "..") {
        return Some("cli-typst-path-dots");
    }
    if parts
        .next()
        .is_some_and(|first| first == FONT_DIR || first == format!("{FONT_DIR}-cjk"))
    {
        return Some("cli-typst-path-fonts");
    }
    None
}

/// The name a folder being emitted starts with, beside the one it becomes.
pub const EMIT_PREFIX: &str = ".ampreport-emit-";

/// Writes `sandbox` and the bundled fonts to `dir` (created if missing), so
/// that `typst compile --root DIR --font-path DIR/fonts --ignore-system-fonts
/// --ignore-embedded-fonts DIR/main.typ` reproduces the document. Meant for
/// shops adapting templates and for bug reports. `dir` must not exist or be
/// an empty folder; use [`emit_source_replacing`] to replace a folder's
/// contents.
pub fn emit_source(sandbox: &Sandbox, dir: &Path) -> io::Result<()> {
    emit(sandbox, dir, false)
}

/// [`emit_source`] that also replaces a non-empty folder: the new contents
/// are written to a fresh folder beside `dir` and swapped in, and only then
/// is the old folder removed, so nothing of it stays (a planted font, a
/// hand-edited file) and nothing is written through a link in it. Check the
/// folder first with [`super::check_emit_folder`].
pub fn emit_source_replacing(sandbox: &Sandbox, dir: &Path) -> io::Result<()> {
    emit(sandbox, dir, true)
}

fn emit(sandbox: &Sandbox, dir: &Path, replace: bool) -> io::Result<()> {
    let name = dir
        .file_name()
        .ok_or_else(|| io::Error::other("the folder has no name of its own"))?;
    let parent = match dir.parent() {
        Some(p) if !p.as_os_str().is_empty() => p.to_path_buf(),
        _ => std::path::PathBuf::from("."),
    };
    std::fs::create_dir_all(&parent)?;
    sweep(&parent, |n| n.starts_with(EMIT_PREFIX));
    let existing = std::fs::symlink_metadata(dir).ok();
    if let Some(meta) = &existing {
        if !meta.is_dir() {
            return Err(io::Error::other("it exists and is not a folder"));
        }
        if !replace && std::fs::read_dir(dir)?.next().is_some() {
            return Err(io::Error::other("the folder is not empty"));
        }
    }
    // A fresh folder nobody else can write into: nothing in it is a link.
    let staging = LockedDir::new(&parent, EMIT_PREFIX, Some(0o777))?;
    sandbox.write_files(staging.path())?;
    write_fonts(staging.path())?;
    if let Some(signal) = interrupt::received() {
        return Err(io::Error::other(format!("stopped by signal {signal}")));
    }
    if existing.is_none() {
        std::fs::rename(staging.path(), dir)?;
        let _ = staging.keep();
        return Ok(());
    }
    // Move the old folder aside under a name a later run sweeps away, put
    // the new one in its place, then remove the old one.
    let aside = LockedDir::new(&parent, EMIT_PREFIX, None)?;
    let old = aside.path().join(name);
    std::fs::rename(dir, &old)?;
    if let Err(e) = std::fs::rename(staging.path(), dir) {
        let _ = std::fs::rename(&old, dir);
        return Err(e);
    }
    let _ = staging.keep();
    drop(aside);
    Ok(())
}

#[cfg(test)]
mod tests {
    use super::*;

    /// A chart whose writer vouches for it is kept as such, and the fonts'
    /// check leaves it unread; with no word, under another name, or not
    /// plain, it is kept as text and read. The bytes are the same either
    /// way.
    #[test]
    fn only_a_plain_svg_chart_is_left_unread() {
        let plain_svg = "<svg><text font-family=\"Noto Sans\">V3</text></svg>\n";
        for (path, plain, kept) in [
            ("plots/a.svg", true, true),
            ("plots/a.svg", false, false),
            ("plots/a.txt", true, false),
        ] {
            let mut sandbox = Sandbox::new();
            sandbox
                .insert_plain_chart(path, plain_svg.to_string(), plain)
                .unwrap();
            let (_, contents) = sandbox.contents().next().unwrap();
            assert_eq!(
                matches!(contents, FileContents::PlainChart(_)),
                kept,
                "{path} {plain}"
            );
            let mut as_text = Sandbox::new();
            as_text.insert(path, plain_svg).unwrap();
            assert_eq!(sandbox, as_text);
        }
        // A chart not vouched for is read: this one needs the CJK face
        // (vouching for it stops a debug build: the test below).
        let cjk_svg = "<svg><text font-family=\"Noto Sans\">\u{4e2d}</text></svg>\n";
        let mut read = Sandbox::new();
        read.insert_plain_chart("plots/a.svg", cjk_svg.to_string(), false)
            .unwrap();
        assert!(super::super::fonts::needs_cjk(&read));
        assert!(
            Sandbox::new()
                .insert_plain_chart("plots/../a.svg", plain_svg.to_string(), true)
                .is_err()
        );
    }

    /// A chart vouched for that the check would find needing the CJK face
    /// stops a debug build (the test suite's) at once.
    #[test]
    #[cfg(debug_assertions)]
    #[should_panic(expected = "needs it")]
    fn a_chart_wrongly_vouched_for_stops_a_debug_build() {
        let cjk_svg = "<svg><text font-family=\"Noto Sans\">\u{4e2d}</text></svg>\n";
        let _ = Sandbox::new().insert_plain_chart("plots/a.svg", cjk_svg.to_string(), true);
    }

    #[test]
    fn accepts_plain_relative_paths() {
        let mut sandbox = Sandbox::new();
        sandbox
            .insert("main.typ", "hello")
            .unwrap()
            .insert("plots/anode.svg", b"<svg/>".to_vec())
            .unwrap()
            .insert("images/fonts.png", Vec::new())
            .unwrap();
        let names: Vec<&str> = sandbox.files().map(|(p, _)| p).collect();
        assert_eq!(names, ["images/fonts.png", "main.typ", "plots/anode.svg"]);
        assert_eq!(sandbox.get("main.typ"), Some(&b"hello"[..]));
        assert_eq!(sandbox.len(), 3);
    }

    #[test]
    fn refuses_paths_that_escape_or_clash() {
        let mut sandbox = Sandbox::new();
        for bad in [
            "",
            "/etc/passwd",
            "../up.typ",
            "a/../b",
            "a//b",
            "./a",
            "a/",
            "C:/x",
            "a\\b",
            "fonts/extra.ttf",
            "fonts",
            "a\nb",
        ] {
            let err = sandbox.insert(bad, "x").unwrap_err();
            assert!(
                matches!(err, TypesetError::BadSandboxPath { .. }),
                "{bad:?}"
            );
        }
        assert!(sandbox.is_empty());
    }

    #[test]
    fn emit_source_writes_files_and_fonts() {
        let dir = tempfile::tempdir().unwrap();
        let out = dir.path().join("src");
        let mut sandbox = Sandbox::new();
        sandbox.insert("main.typ", "= Hi").unwrap();
        sandbox.insert("plots/p.svg", "<svg/>").unwrap();
        emit_source(&sandbox, &out).unwrap();
        assert_eq!(
            std::fs::read_to_string(out.join("main.typ")).unwrap(),
            "= Hi"
        );
        assert!(out.join("plots").join("p.svg").is_file());
        for (name, bytes) in super::super::fonts::BUNDLED_FONTS {
            // The CJK face in a folder of its own beside the others.
            let folder = if *name == super::super::fonts::CJK_FONT {
                "fonts-cjk"
            } else {
                "fonts"
            };
            assert_eq!(&std::fs::read(out.join(folder).join(name)).unwrap(), bytes);
        }
        assert!(
            !out.join("fonts")
                .join(super::super::fonts::CJK_FONT)
                .exists()
        );
        assert!(out.join("fonts").join("OFL-1.1.txt").is_file());
    }
}
