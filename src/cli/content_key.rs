//! Incremental rendering: a content key over everything that decides the
//! bytes of a job's PDF, and a small manifest beside the PDF recording the
//! key it was made from and the PDF's own hash. `render` skips a job whose
//! manifest matches both; any change to any input, or to the PDF, renders
//! it again.
//!
//! The key is a BLAKE3 hash over, each with its name and length:
//!
//! * this program: its version and the digest of its sources, templates,
//!   ratings table and lock file worked out at build time
//!   (`AMPREPORT_PROGRAM_DIGEST`), and the bundled fonts' digest;
//! * the typst program: the version it reported and the identity of the
//!   program file (see [`program_identity`]: its bytes are not read, a
//!   typst binary being some 60 MB that took longer to hash than the rest
//!   of a render's own work);
//! * the options that change the document (the PDF standard); not the
//!   number of threads typst is given (`--jobs`, which a batch sets):
//!   `tests/render.rs` holds the PDF bytes the same at typst's default,
//!   one and two threads;
//! * every `--ratings` file's bytes, in order;
//! * every file of the `--templates` folder, by path, with its bytes;
//! * the job file's text as it was read for this render;
//! * the shop profile's text, the files the job and the profile name (the
//!   logo, the translation file, the photos: each as it is written in the
//!   job or the profile, with its bytes) and the commit the job's git
//!   repository stands at ([`JobKey::named_file`], fed by `render`).
//!
//! The manifest is `.NAME.ampreport-key` beside `NAME` (the PDF): the
//! format, the key, the BLAKE3 hash of the PDF and one line for each named
//! file (its role and its name as written). It is written after the PDF is
//! in place; a missing, unreadable or different manifest just means the
//! job is rendered.
//!
//! The manifest's list of named files is what makes the skip cheap: which
//! files a job names follows from the job's text and its profile's text
//! alone, and both are in the key, so `render` can work the key out again
//! from the texts and the listed files without decoding the job
//! ([`Manifest::read`]). A list that no longer matches what the texts name
//! can only come with texts that changed, and then the key differs.

use std::path::{Path, PathBuf};

/// The first line of a manifest.
const MANIFEST_HEADER: &str = "ampreport content key 2";

/// What the manifest's name ends in.
pub const MANIFEST_SUFFIX: &str = ".ampreport-key";

/// The hash of a run's shared inputs; each job's key starts from it.
#[derive(Debug, Clone)]
pub struct RunKey {
    hasher: blake3::Hasher,
}

/// The inputs shared by every job of one run.
#[derive(Debug, Clone, Default)]
pub struct RunInputs<'a> {
    /// This program's version and source digest.
    pub program: (&'a str, &'a str),
    /// The bundled fonts' digest.
    pub fonts: &'a str,
    /// The version typst reported.
    pub typst_version: &'a str,
    /// The typst program file.
    pub typst_path: Option<&'a Path>,
    /// The `--ratings` files, in order.
    pub ratings: &'a [PathBuf],
    /// The `--templates` folder.
    pub templates: Option<&'a Path>,
    /// Options that change the document, as `name=value` words.
    pub options: &'a [String],
}

/// An input could not be read for the key: the job cannot be skipped.
#[derive(Debug, thiserror::Error)]
#[error("could not read {path} for the content key: {source}")]
pub struct KeyError {
    pub path: PathBuf,
    #[source]
    pub source: std::io::Error,
}

/// Feeds one named piece into the hash, framed so no two different
/// sequences of pieces hash alike.
fn feed(hasher: &mut blake3::Hasher, name: &str, bytes: &[u8]) {
    hasher.update(&(name.len() as u64).to_le_bytes());
    hasher.update(name.as_bytes());
    hasher.update(&(bytes.len() as u64).to_le_bytes());
    hasher.update(bytes);
}

fn read(path: &Path) -> Result<Vec<u8>, KeyError> {
    std::fs::read(path).map_err(|source| KeyError {
        path: path.to_path_buf(),
        source,
    })
}

impl RunKey {
    /// The program's own identity, from the build.
    pub fn program() -> (&'static str, &'static str) {
        (env!("CARGO_PKG_VERSION"), env!("AMPREPORT_PROGRAM_DIGEST"))
    }

    /// Hashes the shared inputs, reading the files they name.
    pub fn new(inputs: &RunInputs<'_>) -> Result<Self, KeyError> {
        let mut h = blake3::Hasher::new();
        feed(&mut h, "format", MANIFEST_HEADER.as_bytes());
        feed(&mut h, "ampreport version", inputs.program.0.as_bytes());
        feed(&mut h, "ampreport sources", inputs.program.1.as_bytes());
        feed(&mut h, "fonts", inputs.fonts.as_bytes());
        feed(&mut h, "typst version", inputs.typst_version.as_bytes());
        match inputs.typst_path {
            Some(path) => feed(&mut h, "typst program", &program_identity(path)?),
            None => feed(&mut h, "no typst program", b""),
        }
        for option in inputs.options {
            feed(&mut h, "option", option.as_bytes());
        }
        for path in inputs.ratings {
            feed(&mut h, "ratings file", &read(path)?);
        }
        match inputs.templates {
            Some(dir) => {
                let mut files = Vec::new();
                folder_files(dir, Path::new(""), &mut files)?;
                files.sort();
                feed(&mut h, "templates", &(files.len() as u64).to_le_bytes());
                for relative in files {
                    let name = relative.to_string_lossy().into_owned();
                    feed(&mut h, "template path", name.as_bytes());
                    feed(&mut h, "template bytes", &read(&dir.join(&relative))?);
                }
            }
            None => feed(&mut h, "built-in templates", b""),
        }
        Ok(RunKey { hasher: h })
    }

    /// A job's key, starting from the shared inputs.
    pub fn job(&self, job_text: &str) -> JobKey {
        let mut hasher = self.hasher.clone();
        feed(&mut hasher, "job", job_text.as_bytes());
        JobKey {
            hasher,
            named: Vec::new(),
        }
    }
}

/// What tells one state of the typst program file from any other,
/// without reading its bytes: on Unix the file's device and inode, its
/// size and permissions, and the times of the last change to its bytes
/// (`mtime`) and to the file at all (`ctime`), to the nanosecond.
/// Installing, rebuilding, copying over or editing the program changes the
/// `ctime` (which no ordinary tool can set back; `touch` sets only the
/// `mtime`) and usually the inode and size too, so the key changes; what
/// this does not see is a rewrite that keeps the size and falls within the
/// same tick of the file system's clock as the change before it (a few
/// milliseconds), or a clock set back. Elsewhere the bytes are hashed.
fn program_identity(path: &Path) -> Result<Vec<u8>, KeyError> {
    crate::typeset::known_version::program_identity(path).map_err(|source| KeyError {
        path: path.to_path_buf(),
        source,
    })
}

/// Every file under `dir` (relative paths); links and special files are
/// listed by name only (the render refuses them anyway).
fn folder_files(root: &Path, below: &Path, out: &mut Vec<PathBuf>) -> Result<(), KeyError> {
    let dir = root.join(below);
    let failed = |source| KeyError {
        path: dir.clone(),
        source,
    };
    for entry in std::fs::read_dir(&dir).map_err(failed)? {
        let entry = entry.map_err(failed)?;
        let relative = below.join(entry.file_name());
        let kind = entry.file_type().map_err(failed)?;
        if kind.is_dir() {
            folder_files(root, &relative, out)?;
        } else if kind.is_file() {
            out.push(relative);
        } else {
            return Err(KeyError {
                path: root.join(relative),
                source: std::io::Error::other("not a regular file"),
            });
        }
    }
    Ok(())
}

/// One job's key while its inputs are added, with the files it names.
#[derive(Debug, Clone)]
pub struct JobKey {
    hasher: blake3::Hasher,
    named: Vec<NamedFile>,
}

/// A file a job or its shop profile names: its role ("photo", "logo",
/// "translation") and its name as written there, relative to the folder
/// of the file that names it.
#[derive(Debug, Clone, PartialEq, Eq)]
pub struct NamedFile {
    pub role: String,
    pub written: String,
}

impl JobKey {
    /// Adds a file the job or its shop profile names, by role and as
    /// written, with the bytes that were used; the manifest lists it.
    pub fn named_file(&mut self, role: &str, written: &str, bytes: &[u8]) {
        feed(&mut self.hasher, "named file", role.as_bytes());
        feed(&mut self.hasher, "written", written.as_bytes());
        feed(&mut self.hasher, "bytes", bytes);
        self.named.push(NamedFile {
            role: role.to_string(),
            written: written.to_string(),
        });
    }

    /// Adds another file the job's document is made from (its shop
    /// profile, the logo, a photo), by role, with the bytes that were used.
    pub fn file(&mut self, role: &str, bytes: &[u8]) {
        feed(&mut self.hasher, role, bytes);
    }

    /// Adds the absence of an optional input, so that adding it later
    /// changes the key.
    pub fn none(&mut self, role: &str) {
        feed(&mut self.hasher, "none", role.as_bytes());
    }

    /// The key, as 64 hex digits.
    pub fn finish(&self) -> String {
        self.hasher.finalize().to_hex().to_string()
    }
}

/// Where the manifest of `output` lives: `.NAME.ampreport-key` beside it.
pub fn manifest_path(output: &Path) -> PathBuf {
    let name = output
        .file_name()
        .map(|n| n.to_string_lossy().into_owned())
        .unwrap_or_default();
    output.with_file_name(format!(".{name}{MANIFEST_SUFFIX}"))
}

/// The manifest's text for a PDF made from `key`.
fn manifest_text(key: &JobKey, pdf: &[u8]) -> String {
    let mut text = format!(
        "{MANIFEST_HEADER}\nkey {}\npdf {}\n",
        key.finish(),
        blake3::hash(pdf).to_hex()
    );
    for file in &key.named {
        // JSON strings: a name may hold any character, a line break too.
        text.push_str(&format!(
            "file {} {}\n",
            serde_json::Value::from(file.role.as_str()),
            serde_json::Value::from(file.written.as_str())
        ));
    }
    text
}

/// What a manifest recorded.
#[derive(Debug, Clone, PartialEq, Eq)]
pub struct Manifest {
    pub key: String,
    pdf: String,
    /// The files the job and its profile named, in the order they were
    /// fed into the key.
    pub files: Vec<NamedFile>,
}

impl Manifest {
    /// The manifest of `output`; `None` when it is missing, unreadable or
    /// not of this format.
    pub fn read(output: &Path) -> Option<Manifest> {
        let recorded = std::fs::read_to_string(manifest_path(output)).ok()?;
        let mut lines = recorded.lines();
        if lines.next() != Some(MANIFEST_HEADER) {
            return None;
        }
        let key = lines.next()?.strip_prefix("key ")?.to_string();
        let pdf = lines.next()?.strip_prefix("pdf ")?.to_string();
        let mut files = Vec::new();
        for line in lines {
            let mut words = serde_json::Deserializer::from_str(line.strip_prefix("file ")?)
                .into_iter::<String>();
            let role = words.next()?.ok()?;
            let written = words.next()?.ok()?;
            if words.next().is_some() {
                return None;
            }
            files.push(NamedFile { role, written });
        }
        Some(Manifest { key, pdf, files })
    }

    /// True when `output` is a regular file whose hash is the one
    /// recorded and `key` is the key recorded.
    pub fn matches(&self, output: &Path, key: &str) -> bool {
        if self.key != key {
            return false;
        }
        match std::fs::symlink_metadata(output) {
            Ok(meta) if meta.file_type().is_file() => {}
            _ => return false,
        }
        std::fs::read(output).is_ok_and(|bytes| blake3::hash(&bytes).to_hex().as_str() == self.pdf)
    }
}

/// True when `output` is a regular file made from exactly `key`: the
/// manifest names the key, and the PDF's hash is the one recorded.
pub fn up_to_date(output: &Path, key: &str) -> bool {
    Manifest::read(output).is_some_and(|m| m.matches(output, key))
}

/// Records that `written`, the bytes just put in place at `output`, were
/// made from `key` (taken from memory, not read back from the file: a
/// file changed since by someone else fails the hash when it is next
/// looked at, as one changed after a read-back would). Written
/// atomically; a failure leaves no manifest, so the next run renders.
pub fn record(output: &Path, written: &[u8], key: &JobKey) -> std::io::Result<()> {
    let manifest = manifest_path(output);
    crate::typeset::write_small_file(&manifest, manifest_text(key, written).as_bytes())
}

/// Removes the manifest of `output`, so a PDF that is no longer what the
/// key says is never taken as up to date.
pub fn forget(output: &Path) {
    let _ = std::fs::remove_file(manifest_path(output));
}

#[cfg(test)]
mod tests {
    use super::*;

    fn inputs<'a>(ratings: &'a [PathBuf], options: &'a [String]) -> RunInputs<'a> {
        RunInputs {
            program: ("0.1.0", "abc"),
            fonts: "f0",
            typst_version: "0.15.1",
            typst_path: None,
            ratings,
            templates: None,
            options,
        }
    }

    #[test]
    fn every_shared_input_changes_the_key() {
        let base = RunKey::new(&inputs(&[], &[])).unwrap().job("job").finish();
        let changed = [
            RunInputs {
                program: ("0.1.1", "abc"),
                ..inputs(&[], &[])
            },
            RunInputs {
                program: ("0.1.0", "abd"),
                ..inputs(&[], &[])
            },
            RunInputs {
                fonts: "f1",
                ..inputs(&[], &[])
            },
            RunInputs {
                typst_version: "0.15.2",
                ..inputs(&[], &[])
            },
        ];
        for c in &changed {
            assert_ne!(RunKey::new(c).unwrap().job("job").finish(), base, "{c:?}");
        }
        let options = ["pdf-standard=none".to_string()];
        assert_ne!(
            RunKey::new(&inputs(&[], &options))
                .unwrap()
                .job("job")
                .finish(),
            base
        );
        assert_ne!(
            RunKey::new(&inputs(&[], &[])).unwrap().job("job ").finish(),
            base
        );
        // The same inputs give the same key.
        assert_eq!(
            RunKey::new(&inputs(&[], &[])).unwrap().job("job").finish(),
            base
        );
    }

    #[cfg(unix)]
    #[test]
    fn any_change_to_the_typst_program_file_changes_the_key() {
        let dir = tempfile::tempdir().unwrap();
        let typst = dir.path().join("typst");
        std::fs::write(&typst, "#!/bin/sh\necho one\n").unwrap();
        let key = |path: &Path| {
            RunKey::new(&RunInputs {
                typst_path: Some(path),
                ..inputs(&[], &[])
            })
            .unwrap()
            .job("job")
            .finish()
        };
        let first = key(&typst);
        assert_eq!(key(&typst), first, "nothing changed");
        // The file system's clock moves in ticks of at most 10 ms (a
        // kernel's coarse clock); a change in a later tick is always seen.
        let tick = || std::thread::sleep(std::time::Duration::from_millis(30));
        let mut seen = vec![first];
        let mut changed = |what: &str| {
            let now = key(&typst);
            assert!(!seen.contains(&now), "{what}");
            seen.push(now);
        };
        tick();
        // Same size, other bytes, written in place.
        std::fs::write(&typst, "#!/bin/sh\necho two\n").unwrap();
        changed("rewritten in place with the same size");
        tick();
        // Its modification time set back to what it was: the change time moves.
        let before = std::fs::metadata(&typst).unwrap().modified().unwrap();
        std::fs::write(&typst, "#!/bin/sh\necho 333\n").unwrap();
        std::fs::File::options()
            .write(true)
            .open(&typst)
            .unwrap()
            .set_modified(before)
            .unwrap();
        changed("rewritten and its modification time set back");
        tick();
        // Replaced by another file renamed over it.
        let other = dir.path().join("other");
        std::fs::write(&other, "#!/bin/sh\necho 444\n").unwrap();
        std::fs::rename(&other, &typst).unwrap();
        changed("replaced by a rename");
        tick();
        std::fs::set_permissions(&typst, std::os::unix::fs::PermissionsExt::from_mode(0o755))
            .unwrap();
        changed("made executable");
        // A missing program is an error, not a key.
        assert!(
            RunKey::new(&RunInputs {
                typst_path: Some(&dir.path().join("missing")),
                ..inputs(&[], &[])
            })
            .is_err()
        );
    }

    #[test]
    fn files_count_by_content_and_framing_keeps_pieces_apart() {
        let dir = tempfile::tempdir().unwrap();
        let r = dir.path().join("r.kdl");
        std::fs::write(&r, "valve \"X\" {}").unwrap();
        let ratings = [r.clone()];
        let one = RunKey::new(&inputs(&ratings, &[]))
            .unwrap()
            .job("j")
            .finish();
        std::fs::write(&r, "valve \"Y\" {}").unwrap();
        let two = RunKey::new(&inputs(&ratings, &[]))
            .unwrap()
            .job("j")
            .finish();
        assert_ne!(one, two);

        let run = RunKey::new(&inputs(&[], &[])).unwrap();
        let mut a = run.job("j");
        a.file("shop profile", b"ab");
        a.none("logo");
        let mut b = run.job("j");
        b.file("shop profile", b"a");
        b.file("b", b"");
        assert_ne!(a.finish(), b.finish());

        let templates = tempfile::tempdir().unwrap();
        std::fs::write(templates.path().join("handover.typ"), "x").unwrap();
        let with = |dir| RunInputs {
            templates: Some(dir),
            ..inputs(&[], &[])
        };
        let t1 = RunKey::new(&with(templates.path()))
            .unwrap()
            .job("j")
            .finish();
        std::fs::create_dir(templates.path().join("images")).unwrap();
        std::fs::write(templates.path().join("images/logo.png"), "p").unwrap();
        let t2 = RunKey::new(&with(templates.path()))
            .unwrap()
            .job("j")
            .finish();
        assert_ne!(t1, t2);
        assert_ne!(
            t1,
            RunKey::new(&inputs(&[], &[])).unwrap().job("j").finish()
        );
    }

    #[test]
    fn the_manifest_matches_only_its_key_and_its_pdf() {
        let dir = tempfile::tempdir().unwrap();
        let pdf = dir.path().join("a.pdf");
        assert!(!up_to_date(&pdf, "k"));
        std::fs::write(&pdf, b"%PDF-1.7 one").unwrap();
        let mut job = RunKey::new(&inputs(&[], &[])).unwrap().job("j");
        job.named_file("photo", "odd \"name\"\nwith a line break.png", b"p");
        job.named_file("logo", "logo.svg", b"l");
        let k = job.finish();
        record(&pdf, b"%PDF-1.7 one", &job).unwrap();
        assert_eq!(manifest_path(&pdf), dir.path().join(".a.pdf.ampreport-key"));
        assert!(up_to_date(&pdf, &k));
        assert!(!up_to_date(&pdf, "other"));
        // The named files come back as they were written, in order.
        let manifest = Manifest::read(&pdf).unwrap();
        assert_eq!(manifest.key, k);
        let files: Vec<(&str, &str)> = manifest
            .files
            .iter()
            .map(|f| (f.role.as_str(), f.written.as_str()))
            .collect();
        assert_eq!(
            files,
            [
                ("photo", "odd \"name\"\nwith a line break.png"),
                ("logo", "logo.svg")
            ]
        );
        std::fs::write(&pdf, b"%PDF-1.7 two").unwrap();
        assert!(!up_to_date(&pdf, &k));
        record(&pdf, b"%PDF-1.7 two", &job).unwrap();
        assert!(up_to_date(&pdf, &k));
        // A manifest of another format, or a damaged one, matches nothing.
        let text = std::fs::read_to_string(manifest_path(&pdf)).unwrap();
        std::fs::write(
            manifest_path(&pdf),
            text.replace("content key 2", "content key 1"),
        )
        .unwrap();
        assert!(!up_to_date(&pdf, &k));
        std::fs::write(manifest_path(&pdf), format!("{text}file \"photo\"\n")).unwrap();
        assert!(Manifest::read(&pdf).is_none());
        forget(&pdf);
        assert!(!up_to_date(&pdf, &k));
    }
}
