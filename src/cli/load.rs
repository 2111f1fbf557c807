//! Reading a job file (or a job on standard input, named `-`), its shop
//! profile and the ratings it needs, shared by every command that takes
//! jobs. Problems are gathered as diagnostics in a [`Said`], so that jobs
//! read side by side report whole blocks; `--verbose` says what was read
//! from where.

use std::io::IsTerminal;
use std::path::{Path, PathBuf};

use super::args::{JobArgs, OneJobArgs};
use super::exit::Exit;
use super::said::Said;
use super::ui;
use crate::catalogue::{Catalogue, Msg};
use crate::input_file::{STDIN_NAME, is_dash};
use crate::job::{self, Decoded};
use crate::ratings::RatingsTable;
use crate::shop::{self, Found, Logo, ShopProfile};

/// The built-in ratings plus any shop files named on the command line.
pub fn ratings(files: &[std::path::PathBuf]) -> Result<RatingsTable, Exit> {
    let mut table = RatingsTable::builtin();
    ui::read(
        "cli-read-what-ratings",
        Msg::new("cli-read-from-ratings-built-in").arg("count", table.len()),
    );
    for f in files {
        if let Err(report) = table.load_shop_file(f) {
            eprintln!("{report:?}");
            return Err(Exit::InvalidInput);
        }
        ui::read(
            "cli-read-what-ratings",
            Msg::new("cli-read-from-ratings-file").arg("path", f.display().to_string()),
        );
    }
    Ok(table)
}

/// How the command line chose the shop profile: `--shop FILE` where no
/// `shop.kdl` is found beside or above the job, or `--no-shop`.
#[derive(Debug, Clone, Copy, Default)]
pub struct ShopChoice<'a> {
    pub named: Option<&'a Path>,
    pub none: bool,
}

impl JobArgs {
    pub fn shop_choice(&self) -> ShopChoice<'_> {
        ShopChoice {
            named: self.shop.as_deref(),
            none: self.no_shop,
        }
    }
}

impl OneJobArgs {
    pub fn shop_choice(&self) -> ShopChoice<'_> {
        ShopChoice {
            named: self.shop.as_deref(),
            none: self.no_shop,
        }
    }
}

/// A decoded job whose valve types are all known, with its text and its
/// shop profile; warnings are in the [`Said`] it was read with.
pub struct Loaded {
    pub decoded: Decoded,
    /// The shop profile in use, if any.
    pub shop: Option<LoadedShop>,
    /// The job file as read, for the document footer's checksum and the
    /// content key.
    pub text: String,
}

/// A decoded shop profile, where it was found, its text as read and its
/// checked logo.
pub struct LoadedShop {
    pub profile: ShopProfile,
    pub found: Found,
    /// The profile's text, the very bytes it was decoded from (for the
    /// content key).
    pub text: String,
    pub logo: Option<Logo>,
    /// The fixed words in the profile's language (English when it names
    /// none).
    pub catalogue: Catalogue,
    /// The translation file read, if the profile names one.
    pub translation: Option<PathBuf>,
}

impl Loaded {
    /// The words of the job's documents and reasons: its shop's language,
    /// English without a shop profile.
    pub fn catalogue(&self) -> &Catalogue {
        self.shop
            .as_ref()
            .map_or(Catalogue::english(), |s| &s.catalogue)
    }
}

impl LoadedShop {
    pub fn path(&self) -> &Path {
        self.found.path()
    }
}

/// Reads the shop profile of the job at `path` and the job itself, and
/// decodes the job against `ratings` and the profile's defaults.
pub fn job(
    path: &Path,
    choice: ShopChoice<'_>,
    ratings: &RatingsTable,
    said: &mut Said,
) -> Result<Loaded, Exit> {
    let shop = shop_profile(path, choice, said, &mut Vec::new())?;
    let text = read_job(path, said)?;
    decode(path, text, shop, ratings, said)
}

/// Decodes `text`, read from the job file at `path`, against `ratings`
/// and the defaults of `shop`.
pub fn decode(
    path: &Path,
    text: String,
    shop: Option<LoadedShop>,
    ratings: &RatingsTable,
    said: &mut Said,
) -> Result<Loaded, Exit> {
    decode_named(&job_name(path), text, shop, ratings, said)
}

/// Decodes `text` as [`decode`] does, for a job called `name` in messages
/// (a file's path, or `REV:PATH` for one read from git).
pub fn decode_named(
    name: &str,
    text: String,
    shop: Option<LoadedShop>,
    ratings: &RatingsTable,
    said: &mut Said,
) -> Result<Loaded, Exit> {
    let defaults = shop
        .as_ref()
        .map(|s| s.profile.defaults.clone())
        .unwrap_or_default();
    let catalogue = language(shop.as_ref());
    let mut decoded = match job::decode_with_defaults(name, &text, ratings, &defaults) {
        Ok(d) => d,
        Err(diagnostics) => {
            refused(name, &text, diagnostics.localized(catalogue), said);
            return Err(Exit::InvalidInput);
        }
    };
    decoded.diagnostics.localize(catalogue);
    if !decoded.diagnostics.problems.is_empty() {
        said.warn(format!(
            "{:?}",
            miette::Report::new(decoded.diagnostics.clone())
        ));
    }
    Ok(Loaded {
        decoded,
        shop,
        text,
    })
}

/// The shop profile for the job at `job_path`, found as [`shop::discover`]
/// says, decoded, with its logo read and checked; `None` with `--no-shop`
/// or when there is none. The files it reads (the profile, the logo) are
/// added to `read`, even when they are refused.
pub fn shop_profile(
    job_path: &Path,
    choice: ShopChoice<'_>,
    said: &mut Said,
    read: &mut Vec<PathBuf>,
) -> Result<Option<LoadedShop>, Exit> {
    if choice.none {
        said.read("cli-read-what-shop", Msg::new("cli-read-from-shop-refused"));
        return Ok(None);
    }
    let config = shop::user_config_dir();
    let Some(found) = shop::discover(job_path, choice.named, config.as_deref()) else {
        said.read(
            "cli-read-what-shop",
            Msg::new("cli-read-from-shop-none").arg("file", shop::SHOP_FILE),
        );
        return Ok(None);
    };
    if let (Found::BesideJob(used), Some(named)) = (&found, choice.named) {
        // Before the profile is read: English.
        said.warn(super::ui::english(
            &Msg::new("cli-shop-beside-job")
                .arg("used", used.display().to_string())
                .arg("named", named.display().to_string()),
        ));
    }
    let path: PathBuf = found.path().to_path_buf();
    read.push(path.clone());
    let text = read_text(&path, "shop profile", said)?;
    let name = path.display().to_string();
    // The profile's own problems are said in the language it names, when
    // that line can be read and the language is built in; else in English.
    let own_language = shop::named_language(&text)
        .and_then(|tag| Catalogue::built_in(&tag))
        .unwrap_or_else(|| Catalogue::english().clone());
    let mut decoded = match shop::decode(&name, &text) {
        Ok(d) => d,
        Err(diagnostics) => {
            refused(&name, &text, diagnostics.localized(&own_language), said);
            return Err(Exit::InvalidInput);
        }
    };
    decoded.diagnostics.localize(&own_language);
    // Where the profile came from, in the language it names.
    said.read_in(
        Some(&own_language),
        "cli-read-what-shop",
        Msg::new("cli-read-from-shop")
            .arg("path", path.display().to_string())
            .arg(
                "how",
                match &found {
                    Found::BesideJob(_) => "beside",
                    Found::Named(_) => "named",
                    Found::UserConfig(_) => "config",
                },
            ),
    );
    if !decoded.diagnostics.problems.is_empty() {
        said.warn(format!(
            "{:?}",
            miette::Report::new(decoded.diagnostics.clone())
        ));
    }
    if let Some(written) = &decoded.profile.logo {
        let folder = path.parent().unwrap_or(Path::new("."));
        read.push(folder.join(&written.value));
    }
    let logo = match &decoded.profile.logo {
        Some(written) => match shop::read_logo(&path, written) {
            Ok(logo) => Some(logo),
            Err(problem) => {
                let diagnostics =
                    job::JobDiagnostics::new(decoded.diagnostics.source.clone(), vec![*problem]);
                refused(&name, &text, diagnostics.localized(&own_language), said);
                return Err(Exit::InvalidInput);
            }
        },
        None => None,
    };
    if let Some(logo) = &logo {
        said.read_in(
            Some(&own_language),
            "cli-read-what-logo",
            Msg::new("cli-read-from-path").arg("path", logo.source.display().to_string()),
        );
    }
    let folder = path.parent().unwrap_or(Path::new(".")).to_path_buf();
    let (catalogue, translation) = match &decoded.profile.language {
        Some(language) => {
            let file = language.file.as_ref().map(|f| folder.join(f.value.trim()));
            read.extend(file.iter().cloned());
            match shop::read_translation(&path, language) {
                Ok(c) => {
                    if let Some(f) = &file {
                        said.read_in(
                            Some(&own_language),
                            "cli-read-what-translation",
                            Msg::new("cli-read-from-path").arg("path", f.display().to_string()),
                        );
                    }
                    (c, file)
                }
                Err(shop::TranslationError::Profile(problem)) => {
                    let diagnostics = job::JobDiagnostics::new(
                        decoded.diagnostics.source.clone(),
                        vec![*problem],
                    );
                    refused(&name, &text, diagnostics.localized(&own_language), said);
                    return Err(Exit::InvalidInput);
                }
                Err(shop::TranslationError::File(diagnostics)) => {
                    let diagnostics = diagnostics.localized(&own_language);
                    said.error(format!("{:?}", miette::Report::new(diagnostics)));
                    return Err(Exit::InvalidInput);
                }
            }
        }
        None => (Catalogue::english().clone(), None),
    };
    // From here on the job's messages are in the profile's language.
    said.language = Some(catalogue.clone());
    Ok(Some(LoadedShop {
        profile: decoded.profile,
        found,
        text,
        logo,
        catalogue,
        translation,
    }))
}

/// The language the terminal speaks for a job: its shop profile's, else
/// English.
pub fn language(shop: Option<&LoadedShop>) -> &Catalogue {
    shop.map_or(Catalogue::english(), |s| &s.catalogue)
}

/// Tells why the file `name` (read as `text`) was refused; its first
/// error, with its line and column, is the one-line form for a batch's
/// summary.
fn refused(name: &str, text: &str, diagnostics: job::JobDiagnostics, said: &mut Said) {
    let title = diagnostics.errors().next().map(|p| {
        let (line, column) = job::line_column(text, p.span.offset());
        format!("{name}:{line}:{column}: {}", p.message)
    });
    let report = format!("{:?}", miette::Report::new(diagnostics));
    match title {
        Some(title) => said.error_titled(report, title),
        None => said.error(report),
    }
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
pub fn read_job(path: &Path, said: &mut Said) -> Result<String, Exit> {
    let read = if is_dash(path) {
        if std::io::stdin().is_terminal() {
            ui::warn(ui::english(&Msg::new("cli-reading-stdin")));
        }
        crate::input_file::read_stdin("job file")
    } else {
        crate::input_file::read_text(path, "job file")
    };
    // Said in the language of the shop profile read for the job's folder
    // (English without one).
    let text = read.map_err(|e| {
        let words = said.say(&e.msg(&crate::input_file::JOB_FILE_KEYS));
        said.error(words);
        Exit::InvalidInput
    })?;
    let from = if is_dash(path) {
        Msg::new("cli-read-from-stdin")
    } else {
        Msg::new("cli-read-from-job").arg("path", path.display().to_string())
    };
    said.read(
        "cli-read-what-job",
        from.arg("bytes", text.len().to_string()),
    );
    // A long job's decode, derive and document touch tens of megabytes:
    // in large pages from here on (every command that reads a job).
    crate::allocator::large_pages_for(text.len());
    Ok(text)
}

/// The job's photos, checked and prepared for a document; every problem
/// is told at its `photo` line.
pub fn photos(
    job_file: &Path,
    loaded: &Loaded,
    said: &mut Said,
) -> Result<Vec<crate::photo::PreparedPhoto>, Exit> {
    if loaded.decoded.job.photos.is_empty() {
        return Ok(Vec::new());
    }
    // Prepared pictures are kept in the user's cache between renders.
    let cache = crate::photo::PhotoCache::user();
    if let Some(cache) = &cache {
        said.read(
            "cli-read-what-photo-cache",
            Msg::new("cli-read-from-path").arg("path", cache.dir().display().to_string()),
        );
    }
    crate::photo::prepare_cached(&loaded.decoded.job, job_file, cache.as_ref()).map_err(
        |problems| {
            let name = job_name(job_file);
            let diagnostics =
                job::JobDiagnostics::new(loaded.decoded.diagnostics.source.clone(), problems);
            let diagnostics = diagnostics.localized(language(loaded.shop.as_ref()));
            refused(&name, &loaded.text, diagnostics, said);
            Exit::InvalidInput
        },
    )
}

/// Records where the job file came from in its findings: the SHA-256 of
/// its bytes and, when it is in a git repository, the commit that last
/// changed it and whether the bytes read differ from it.
pub fn stamp(job: &Path, loaded: &Loaded, findings: &mut crate::calc::Findings) {
    // A job from standard input has no file git could know.
    let lookup = if is_dash(job) {
        None
    } else {
        crate::git::look_up(job)
    };
    stamp_from(loaded, findings, lookup.as_ref());
}

/// [`stamp`] with what git holds of the job file already asked
/// ([`crate::git::look_up`], `None` for no repository or a job from
/// standard input).
pub fn stamp_from(
    loaded: &Loaded,
    findings: &mut crate::calc::Findings,
    lookup: Option<&crate::git::Lookup>,
) {
    use sha2::{Digest, Sha256};
    let digest = Sha256::digest(loaded.text.as_bytes());
    findings.job.file_sha256 = Some(digest.iter().map(|b| format!("{b:02x}")).collect());
    findings.job.git = lookup.and_then(|l| l.revision(loaded.text.as_bytes()));
}

/// A file's text; `what` names it in the message ("shop profile").
pub fn read_text(path: &Path, what: &'static str, said: &mut Said) -> Result<String, Exit> {
    crate::input_file::read_text(path, what).map_err(|e| {
        said.error(format!("error: {e}"));
        Exit::InvalidInput
    })
}
