//! Reading a job file (or a job on standard input, named `-`), its shop
//! profile and the ratings it needs, shared by every command that takes a
//! job. Problems are printed here as diagnostics; `--verbose` says what was
//! read from where.

use std::io::IsTerminal;
use std::path::{Path, PathBuf};

use super::args::JobArgs;
use super::exit::Exit;
use super::ui;
use crate::catalogue::Catalogue;
use crate::input_file::{STDIN_NAME, is_dash};
use crate::job::{self, Decoded, JobDefaults};
use crate::ratings::RatingsTable;
use crate::shop::{self, Found, Logo, ShopProfile};

/// The built-in ratings plus any shop files named on the command line.
pub fn ratings(files: &[std::path::PathBuf]) -> Result<RatingsTable, Exit> {
    let mut table = RatingsTable::builtin();
    ui::read(
        "ratings",
        format!("built in ({} types, embedded in the program)", table.len()),
    );
    for f in files {
        if let Err(report) = table.load_shop_file(f) {
            eprintln!("{report:?}");
            return Err(Exit::InvalidInput);
        }
        ui::read(
            "ratings",
            format!("{} (a shop's ratings file)", f.display()),
        );
    }
    Ok(table)
}

/// A decoded job whose valve types are all known, with its text and
/// ratings; warnings are printed to standard error.
pub struct Loaded {
    pub decoded: Decoded,
    /// The shop profile in use, if any.
    pub shop: Option<LoadedShop>,
    /// The job file as read, for the document footer's checksum.
    #[allow(dead_code)]
    pub text: String,
    pub ratings: RatingsTable,
}

/// A decoded shop profile, where it was found, its checked logo and the
/// catalogue of its language.
pub struct LoadedShop {
    pub profile: ShopProfile,
    pub found: Found,
    pub logo: Option<Logo>,
    /// The fixed words in the profile's language (English when it names
    /// none).
    pub catalogue: Catalogue,
    /// The translation file read, if the profile names one.
    pub translation: Option<PathBuf>,
}

impl LoadedShop {
    pub fn path(&self) -> &Path {
        self.found.path()
    }
}

pub fn job(args: &JobArgs) -> Result<Loaded, Exit> {
    job_read_by(args, || read_job(&args.job), &job_name(&args.job))
}

/// Decodes the job text `read` gives, a job named `name` in messages (a
/// file's path, or `REV:PATH` for one read from git), over the shop profile
/// found for `args.job` and the ratings of `args` (both read first, so
/// their problems come first).
pub fn job_read_by(
    args: &JobArgs,
    read: impl FnOnce() -> Result<String, Exit>,
    name: &str,
) -> Result<Loaded, Exit> {
    let ratings = ratings(&args.ratings)?;
    let shop = shop_profile(args)?;
    let defaults = shop
        .as_ref()
        .map(|s| s.profile.defaults.clone())
        .unwrap_or_else(JobDefaults::default);
    let text = read()?;
    let decoded = match job::decode_with_defaults(name, &text, &ratings, &defaults) {
        Ok(d) => d,
        Err(diagnostics) => {
            eprintln!("{:?}", miette::Report::new(diagnostics));
            return Err(Exit::InvalidInput);
        }
    };
    if !decoded.diagnostics.problems.is_empty() {
        ui::warn(format!(
            "{:?}",
            miette::Report::new(decoded.diagnostics.clone())
        ));
    }
    Ok(Loaded {
        decoded,
        shop,
        text,
        ratings,
    })
}

/// The name a job has in messages: its path, or `<stdin>` for `-`.
pub fn job_name(path: &Path) -> String {
    if is_dash(path) {
        STDIN_NAME.to_owned()
    } else {
        path.display().to_string()
    }
}

/// The job's text, from its file or, for `-`, from standard input, under
/// the same size and UTF-8 rules.
pub fn read_job(path: &Path) -> Result<String, Exit> {
    let read = if is_dash(path) {
        if std::io::stdin().is_terminal() {
            ui::warn("note: reading the job from standard input; end it with Ctrl-D");
        }
        crate::input_file::read_stdin("job file")
    } else {
        crate::input_file::read_text(path, "job file")
    };
    let text = read.map_err(|e| {
        eprintln!("error: {e}");
        Exit::InvalidInput
    })?;
    let whence = if is_dash(path) {
        "standard input".to_owned()
    } else {
        path.display().to_string()
    };
    ui::read("job", format!("{whence} ({} bytes)", text.len()));
    Ok(text)
}

/// The job's photos, checked and prepared for a document; every problem
/// is printed at its `photo` line.
pub fn photos(job_file: &Path, loaded: &Loaded) -> Result<Vec<crate::photo::PreparedPhoto>, Exit> {
    crate::photo::prepare(&loaded.decoded.job, job_file).map_err(|problems| {
        let diagnostics = job::JobDiagnostics {
            source: loaded.decoded.diagnostics.source.clone(),
            problems,
            not_shown: Default::default(),
        };
        eprintln!("{:?}", miette::Report::new(diagnostics));
        Exit::InvalidInput
    })
}

/// Records where the job file came from in its findings: the SHA-256 of
/// its bytes and, when it is in a git repository, the commit that last
/// changed it and whether the bytes read differ from it.
pub fn stamp(job: &Path, loaded: &Loaded, findings: &mut crate::calc::Findings) {
    use sha2::{Digest, Sha256};
    let digest = Sha256::digest(loaded.text.as_bytes());
    findings.job.file_sha256 = Some(digest.iter().map(|b| format!("{b:02x}")).collect());
    // A job from standard input has no file git could know.
    findings.job.git = if is_dash(job) {
        None
    } else {
        crate::git::revision(job, loaded.text.as_bytes())
    };
}

/// The shop profile for the job, found as [`shop::discover`] says, decoded,
/// with its logo read and checked; `None` with `--no-shop` or when there is
/// none.
pub fn shop_profile(args: &JobArgs) -> Result<Option<LoadedShop>, Exit> {
    if args.no_shop {
        ui::read("shop profile", "none (--no-shop)");
        return Ok(None);
    }
    let config = shop::user_config_dir();
    let Some(found) = shop::discover(&args.job, args.shop.as_deref(), config.as_deref()) else {
        ui::read(
            "shop profile",
            format!(
                "none (no {} beside the job or above it, no --shop, none in the config folder)",
                shop::SHOP_FILE
            ),
        );
        return Ok(None);
    };
    if let (Found::BesideJob(used), Some(named)) = (&found, &args.shop) {
        ui::warn(format!(
            "note: using the shop profile {} found beside the job; --shop {} applies only where there is none",
            used.display(),
            named.display()
        ));
    }
    let path: PathBuf = found.path().to_path_buf();
    let text = read_text(&path, "shop profile")?;
    let name = path.display().to_string();
    let decoded = match shop::decode(&name, &text) {
        Ok(d) => d,
        Err(diagnostics) => {
            eprintln!("{:?}", miette::Report::new(diagnostics));
            return Err(Exit::InvalidInput);
        }
    };
    ui::read(
        "shop profile",
        format!(
            "{} ({})",
            path.display(),
            match &found {
                Found::BesideJob(_) => "beside the job or above it",
                Found::Named(_) => "named with --shop",
                Found::UserConfig(_) => "the config folder",
            }
        ),
    );
    if !decoded.diagnostics.problems.is_empty() {
        ui::warn(format!(
            "{:?}",
            miette::Report::new(decoded.diagnostics.clone())
        ));
    }
    let logo = match &decoded.profile.logo {
        Some(written) => match shop::read_logo(&path, written) {
            Ok(logo) => Some(logo),
            Err(problem) => {
                let diagnostics = job::JobDiagnostics {
                    source: decoded.diagnostics.source.clone(),
                    problems: vec![*problem],
                    not_shown: Default::default(),
                };
                eprintln!("{:?}", miette::Report::new(diagnostics));
                return Err(Exit::InvalidInput);
            }
        },
        None => None,
    };
    if let Some(logo) = &logo {
        ui::read("shop logo", logo.source.display());
    }
    let (catalogue, translation) = match &decoded.profile.language {
        Some(language) => match shop::read_translation(&path, language) {
            Ok(c) => {
                if let Some(f) = &language.file {
                    ui::read(
                        "translation",
                        path.parent()
                            .unwrap_or(Path::new("."))
                            .join(f.value.trim())
                            .display(),
                    );
                }
                (
                    c,
                    language
                        .file
                        .as_ref()
                        .map(|f| path.parent().unwrap_or(Path::new(".")).join(f.value.trim())),
                )
            }
            Err(shop::TranslationError::Profile(problem)) => {
                let diagnostics = job::JobDiagnostics {
                    source: decoded.diagnostics.source.clone(),
                    problems: vec![*problem],
                    not_shown: Default::default(),
                };
                eprintln!("{:?}", miette::Report::new(diagnostics));
                return Err(Exit::InvalidInput);
            }
            Err(shop::TranslationError::File(diagnostics)) => {
                eprintln!("{:?}", miette::Report::new(*diagnostics));
                return Err(Exit::InvalidInput);
            }
        },
        None => (Catalogue::english().clone(), None),
    };
    Ok(Some(LoadedShop {
        profile: decoded.profile,
        found,
        logo,
        catalogue,
        translation,
    }))
}

/// A file's text; `what` names it in the message ("shop profile").
pub fn read_text(path: &Path, what: &'static str) -> Result<String, Exit> {
    crate::input_file::read_text(path, what).map_err(|e| {
        eprintln!("error: {e}");
        Exit::InvalidInput
    })
}
