//! `ampreport render JOB|DIR…`: the PDF hand-over document of each job,
//! or with `--listing` the listing for a buyer (a PDF, and Markdown with
//! its photos beside it). Reads and derives a job, finds typst, fills the
//! template, optionally writes the generated source to a folder, and
//! compiles the PDF atomically; the listing's photos and Markdown land
//! with the PDF or not at all (each written beside its destination first,
//! then all renamed into place). A job whose files were already
//! made from exactly the same inputs is skipped ([`super::content_key`]).
//! Several jobs, or a folder of them, run side by side with a summary at
//! the end ([`super::batch`]).
//!
//! Exit statuses for one job: 1 when the job, a ratings file or a shop's
//! own template (`--templates`) is at fault; 2 when the output or the
//! `--emit-source` folder may not be written (it is an input, a link, a
//! device, a folder with other files in it); 3 when the set-up is (typst
//! missing, too old, unusable, crashing, hanging past `--timeout`, a folder
//! that cannot be written) or when typst rejects the built-in template,
//! which is a fault of the tool itself; 128 + N after signal N (SIGINT,
//! SIGTERM, SIGHUP), with the temporary files removed and typst stopped.
//! A batch exits 1 when any job failed.

use std::io::IsTerminal;
use std::path::{Path, PathBuf};
use std::time::{Duration, Instant};

use super::args::{RenderArgs, SerialArg};
use super::batch;
use super::check::named_jobs;
use super::content_key::{self, RunInputs, RunKey};
use super::exit::Exit;
use super::job_files::JobFile;
use super::said::Said;
use super::{load, ui};
use crate::calc;
use crate::catalogue::{Catalogue, Msg};
use crate::input_file::is_dash;
use crate::ratings::RatingsTable;
use crate::report::handover::{self, HandoverError, HandoverInput};
use crate::report::listing::{self, ListingInput, SerialShown};
use crate::typeset::{
    self, CompileOptions, FontsUsed, Input, InputIndex, TemplateSource, TypesetError, TypstProgram,
    interrupt,
};

pub fn run(args: &RenderArgs) -> Exit {
    // From here a stop signal is noted rather than fatal: each step below
    // that makes temporary files or waits on typst ends cleanly on it.
    if let Err(e) = interrupt::install() {
        ui::warn(ui::english(
            &Msg::new("cli-no-stop-signals").arg("error", e.to_string()),
        ));
    }
    let mut setup = match Setup::new(args) {
        Ok(s) => s,
        Err(e) => return e,
    };
    if !setup.batch {
        // The process ends with this job: what it built is left to the
        // exit rather than freed piece by piece.
        setup.ends_after_one = true;
        let report = render_one(&setup, &setup.plans[0]);
        report.said.print();
        let output = &setup.plans[0].output;
        match report.outcome {
            Outcome::Rendered if is_dash(output) => {
                if ui::verbose() {
                    eprintln!("{}", report.said.say(&Msg::new("cli-wrote-stdout")));
                }
            }
            Outcome::Rendered => {
                for path in std::iter::once(output).chain(&report.beside) {
                    ui::wrote(
                        report
                            .said
                            .say(&Msg::new("cli-wrote").arg("path", path.display().to_string())),
                    );
                }
            }
            Outcome::Unchanged => ui::wrote(
                report
                    .said
                    .say(&Msg::new("cli-up-to-date").arg("path", output.display().to_string())),
            ),
            Outcome::Failed => {}
        }
        return report.exit;
    }
    batch::run(&mut setup)
}

/// One job of a run and where its PDF goes.
#[derive(Debug, Clone)]
pub struct Plan {
    pub job: JobFile,
    pub output: PathBuf,
}

/// What every job of a run shares: the options, the ratings, the
/// templates, typst, the content key's shared part, and the jobs.
pub struct Setup<'a> {
    pub args: &'a RenderArgs,
    pub ratings: RatingsTable,
    pub templates: TemplateSource,
    pub program: TypstProgram,
    /// `None` when an input could not be read for the key: every job is
    /// rendered.
    pub run_key: Option<RunKey>,
    pub plans: Vec<Plan>,
    /// Every job file of the run, which no output may be.
    pub job_files: InputIndex,
    /// True for several jobs or a folder: a summary at the end.
    pub batch: bool,
    /// typst's `--jobs` for each render: `None` (typst's default) unless
    /// several renders run side by side ([`batch::run`] sets it).
    pub typst_threads: Option<std::num::NonZeroUsize>,
    /// True when the process ends right after its one job (`render` of a
    /// single job, not `watch` or a batch): the job's findings and document
    /// are then not freed one allocation at a time, which on a 1,000-set
    /// job cost about a tenth of ampreport's own processor time, most of it
    /// returning blocks allocated on the worker threads.
    pub ends_after_one: bool,
    /// The commit each job folder's git repository stands at, asked once
    /// per folder.
    heads: std::sync::Mutex<std::collections::HashMap<PathBuf, Option<crate::git::Head>>>,
}

impl<'a> Setup<'a> {
    /// Finds the jobs and typst, reads the ratings, plans the outputs;
    /// prints why and gives the exit status when the run cannot start.
    pub fn new(args: &'a RenderArgs) -> Result<Self, Exit> {
        let jobs = named_jobs(&args.job)?;
        let batch = jobs.len() > 1 || args.job.jobs.iter().any(|p| p.is_dir());
        if batch && args.output.is_some() {
            eprintln!("{}", ui::english(&Msg::new("cli-output-one-job")));
            return Err(Exit::Usage);
        }
        if batch && args.emit_source.is_some() {
            eprintln!("{}", ui::english(&Msg::new("cli-emit-source-one-job")));
            return Err(Exit::Usage);
        }
        if batch && jobs.iter().any(|j| is_dash(&j.path)) {
            eprintln!("{}", ui::english(&Msg::new("cli-stdin-one-job")));
            return Err(Exit::Usage);
        }
        if !batch {
            single_output_allowed(args, &jobs[0].path)?;
        }
        // Where a lone job's repository stands (for its content key):
        // read from the repository's files, or asked of git where they
        // could read otherwise (`git::head`). Then typst answers
        // `--version` while the ratings are read.
        let head = (!batch && !is_dash(&jobs[0].path)).then(|| {
            let folder = job_folder(&jobs[0].path);
            let answer = crate::git::head(&folder);
            (folder, answer)
        });
        let pending = typeset::start_locate(args.typst.as_deref());
        let ratings = load::ratings(&args.job.ratings)?;
        let templates = template_source(args.templates.as_deref(), args.listing)?;
        let program = match pending.finish_within(args.timeout) {
            Ok(p) => p,
            Err(e) => {
                // A problem with one job named alone is still told first,
                // as it would be with typst at hand.
                if !batch && let Err(exit) = job_readable(args, &jobs[0].path, &ratings) {
                    return Err(exit);
                }
                let mut said = Said::default();
                let exit = report_typeset_error(e, &templates, None, &mut said);
                said.print();
                return Err(exit);
            }
        };
        ui::read(
            "cli-read-what-typst",
            Msg::new("cli-read-from-typst")
                .arg("path", program.path.display().to_string())
                .arg("version", program.version.to_string()),
        );
        if let Some(warning) = program.version_warning() {
            ui::warn(ui::english(
                &Msg::new("cli-warning").arg("warning", warning),
            ));
        }
        let plans: Vec<Plan> = jobs
            .into_iter()
            .map(|job| Plan {
                output: output_for(args, &job),
                job,
            })
            .collect();
        if let Some(message) = shared_outputs(&plans, args.listing) {
            eprintln!("{}", ui::english(&message));
            return Err(Exit::Usage);
        }
        let version = program.version.to_string();
        let options = render_options(args);
        let run_key = match RunKey::new(&RunInputs {
            program: RunKey::program(),
            fonts: typeset::FONTS_DIGEST,
            typst_version: &version,
            typst_path: Some(&program.path),
            ratings: &args.job.ratings,
            templates: args.templates.as_deref(),
            options: &options,
        }) {
            Ok(key) => Some(key),
            Err(e) => {
                ui::warn(ui::english(
                    &Msg::new("cli-no-run-key").arg("error", e.to_string()),
                ));
                None
            }
        };
        let job_files = InputIndex::new(
            plans
                .iter()
                .filter(|p| !is_dash(&p.job.path))
                .map(|p| Input::new(&p.job.path, "cli-input-job-of-run"))
                .collect(),
        );
        let mut heads = std::collections::HashMap::new();
        if let Some((folder, answer)) = head {
            heads.insert(folder, answer);
        }
        Ok(Setup {
            args,
            ratings,
            templates,
            program,
            run_key,
            plans,
            job_files,
            batch,
            typst_threads: None,
            ends_after_one: false,
            heads: std::sync::Mutex::new(heads),
        })
    }
}

impl Setup<'_> {
    /// Forgets the commits asked so far: `watch` asks again after each
    /// save, as a commit made while it watches moves `HEAD`.
    pub fn forget_heads(&self) {
        if let Ok(mut heads) = self.heads.lock() {
            heads.clear();
        }
    }

    /// The commit `HEAD` of the git repository holding the job at
    /// `job_path`, if any; asked once per folder in a run.
    fn repository_head(&self, job_path: &Path) -> Option<crate::git::Head> {
        if is_dash(job_path) {
            return None;
        }
        let folder = job_folder(job_path);
        if let Some(known) = self.heads.lock().ok()?.get(&folder) {
            return known.clone();
        }
        let head = crate::git::head(&folder);
        if let Ok(mut heads) = self.heads.lock() {
            heads.insert(folder, head.clone());
        }
        head
    }
}

/// The folder holding the job file at `path` (`.` for a bare name): the
/// folder whose repository `HEAD` its content key takes.
fn job_folder(path: &Path) -> PathBuf {
    match path.parent() {
        Some(p) if !p.as_os_str().is_empty() => p.to_path_buf(),
        _ => PathBuf::from("."),
    }
}

/// Reads and decodes the job at `path` and checks its photos, printing
/// what it had to say; the exit status when it is at fault.
fn job_readable(args: &RenderArgs, path: &Path, ratings: &RatingsTable) -> Result<(), Exit> {
    let mut said = Said::default();
    let checked = load::job(path, args.job.shop_choice(), ratings, &mut said)
        .and_then(|loaded| load::photos(path, &loaded, &mut said).map(drop));
    said.print();
    checked
}

/// The options that change a document's bytes, for the content key: the
/// listing and the hand-over never pass for each other.
fn render_options(args: &RenderArgs) -> Vec<String> {
    let mut options = vec![
        format!("pdf-standard={}", typeset::DEFAULT_PDF_STANDARD),
        format!("charges={}", !args.no_charges),
        format!(
            "document={}",
            if args.listing { "listing" } else { "hand-over" }
        ),
    ];
    if args.listing {
        options.push(format!("serial={:?}", args.serial));
    }
    options
}

/// How `--serial` asks the listing to show the serial number.
fn serial_shown(args: &RenderArgs) -> SerialShown {
    match args.serial {
        SerialArg::Shown => SerialShown::Shown,
        SerialArg::Masked => SerialShown::Masked,
        SerialArg::Hidden => SerialShown::Hidden,
    }
}

/// Where a job's PDF goes: `-o`, else under `--out-dir` at the job's place
/// below the folder it was found in, else beside the job; `NAME.pdf`, or
/// `NAME.listing.pdf` for the listing.
fn output_for(args: &RenderArgs, job: &JobFile) -> PathBuf {
    if let Some(output) = &args.output {
        return output.clone();
    }
    let beside = match &args.out_dir {
        Some(dir) => dir.join(&job.relative),
        None => job.path.clone(),
    };
    if args.listing {
        default_listing_output(&beside)
    } else {
        default_output(&beside)
    }
}

/// The Markdown of a listing whose PDF is `output`: beside it, `.md`.
fn markdown_for(output: &Path) -> PathBuf {
    output.with_extension("md")
}

/// Names the first output two jobs of a run would both write, if any (a
/// listing's Markdown counts as an output).
fn shared_outputs(plans: &[Plan], listing: bool) -> Option<Msg> {
    let mut seen: std::collections::HashMap<PathBuf, &Path> = std::collections::HashMap::new();
    for plan in plans {
        let markdown = listing.then(|| markdown_for(&plan.output));
        for output in std::iter::once(&plan.output).chain(markdown.as_ref()) {
            if let Some(other) = seen.insert(normalised(output), &plan.job.path) {
                return Some(
                    Msg::new("cli-outputs-clash")
                        .arg("first", other.display().to_string())
                        .arg("second", plan.job.path.display().to_string())
                        .arg("output", output.display().to_string()),
                );
            }
        }
    }
    None
}

/// A path made absolute with `.` and `..` parts worked out by name, for
/// telling two outputs apart before they exist.
fn normalised(path: &Path) -> PathBuf {
    let absolute = std::path::absolute(path).unwrap_or_else(|_| path.to_path_buf());
    let mut out = PathBuf::new();
    for part in absolute.components() {
        match part {
            std::path::Component::ParentDir => {
                out.pop();
            }
            std::path::Component::CurDir => {}
            other => out.push(other),
        }
    }
    out
}

/// How one job's render ended.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum Outcome {
    /// A new PDF is in place.
    Rendered,
    /// The PDF was already made from exactly these inputs.
    Unchanged,
    /// Nothing was written; the error is in the job's [`Said`].
    Failed,
}

/// One job's render: how it ended, its exit status, what it had to say,
/// how long it took, the files besides the job and the run's shared
/// inputs it was made from (its shop profile and logo), for `watch`, and
/// the files written beside the PDF (a listing's photos and Markdown).
#[derive(Debug)]
pub struct JobReport {
    pub outcome: Outcome,
    pub exit: Exit,
    pub said: Said,
    pub elapsed: Duration,
    pub depends: Vec<PathBuf>,
    pub beside: Vec<PathBuf>,
}

/// Renders one job: reads it, checks where its PDF goes, skips it when the
/// PDF is up to date, else derives, fills the template, draws the charts
/// and has typst compile it. Prints nothing: everything it has to say is
/// in the report.
pub fn render_one(setup: &Setup<'_>, plan: &Plan) -> JobReport {
    let start = Instant::now();
    let mut said = Said::default();
    let mut depends = Vec::new();
    let mut beside = Vec::new();
    let (outcome, exit) = match render_job(setup, plan, &mut said, &mut depends, &mut beside) {
        Ok(outcome) => (outcome, Exit::Success),
        Err(exit) => (Outcome::Failed, exit),
    };
    JobReport {
        outcome,
        exit,
        said,
        elapsed: start.elapsed(),
        depends,
        beside,
    }
}

fn render_job(
    setup: &Setup<'_>,
    plan: &Plan,
    said: &mut Said,
    depends: &mut Vec<PathBuf>,
    beside: &mut Vec<PathBuf>,
) -> Result<Outcome, Exit> {
    let args = setup.args;
    let job_path = &plan.job.path;
    let output = &plan.output;
    if !args.force
        && args.emit_source.is_none()
        && !is_dash(output)
        && !args.listing
        && let Some(run) = &setup.run_key
        && unchanged(setup, run, plan, depends)
    {
        return Ok(Outcome::Unchanged);
    }
    // git is asked about the job file (for the footer) while the job is
    // read and worked out, in the history of the commit the content key
    // took (an answer kept from an earlier render of the same commit is
    // used); its answer is taken when the findings are.
    // An answer remembered for this commit is read here; only git's own
    // look-up is worth a thread.
    let lookup = (!is_dash(job_path)).then(|| {
        let path = job_path.clone();
        let head = setup.repository_head(job_path);
        let cache = crate::folders::cache_dir();
        match head
            .as_ref()
            .and_then(|h| crate::git::remembered_at(&path, h, cache.as_deref()))
        {
            Some(answer) => FooterLookup::Known(answer),
            None => FooterLookup::Asking(std::thread::spawn(move || {
                crate::git::look_up_at(&path, head.as_ref(), cache.as_deref())
            })),
        }
    });
    let shop = load::shop_profile(job_path, args.job.shop_choice(), said, depends)?;
    let text = load::read_job(job_path, said)?;

    // Under --out-dir, the job's place in the tree is made as needed.
    if let Some(dir) = &args.out_dir
        && let Some(parent) = output.parent()
        && parent.starts_with(dir)
        && let Err(e) = std::fs::create_dir_all(parent)
    {
        said.error(
            said.say(
                &Msg::new("cli-cannot-make-folder")
                    .arg("folder", parent.display().to_string())
                    .arg("error", crate::catalogue::os_error(&e)),
            ),
        );
        return Err(Exit::Environment);
    }
    let loaded = load::decode(job_path, text, shop, &setup.ratings, said)?;
    let job = &loaded.decoded.job;
    let photo_files = if is_dash(job_path) {
        Vec::new()
    } else {
        crate::photo::photo_paths(job, job_path)
    };
    depends.extend(photo_files.iter().cloned());

    let mut inputs = inputs_read(args, job_path, &setup.program, loaded.shop.as_ref());
    inputs.extend(photo_files.iter().map(|p| Input::new(p, "cli-input-photo")));
    // The listing's Markdown and photos go beside its PDF; the photos'
    // names are known once they are prepared, and checked then.
    let markdown = args.listing.then(|| markdown_for(output));
    if markdown.as_ref() == Some(output) {
        said.error(
            said.say(&Msg::new("cli-listing-name-clash").arg("path", output.display().to_string())),
        );
        return Err(Exit::Usage);
    }
    for path in std::iter::once(output).chain(markdown.as_ref()) {
        if let Err(e) =
            typeset::check_output(path, &inputs).and_then(|()| setup.job_files.check(path))
        {
            said.error(format!(
                "{:?}",
                miette::Report::new(e.in_language(said.catalogue()))
            ));
            return Err(Exit::Usage);
        }
    }

    // The key covers the texts read above (the very bytes the job and its
    // shop profile were decoded from), the logo's checked bytes, the
    // photos' bytes and where the job's repository stands. (An unchanged
    // job was let go before all this, by `unchanged`.)
    let key = setup
        .run_key
        .as_ref()
        .and_then(|run| job_key(setup, run, job_path, &loaded));
    // Reached with --listing (whose files beside the PDF need the decoded
    // job to be told apart), or when the cheap skip found a change.
    if let Some(key) = key.as_ref().map(content_key::JobKey::finish)
        && !args.force
        && args.emit_source.is_none()
        && !is_dash(output)
        && content_key::up_to_date(output, &key)
        && (!args.listing || listing_files_up_to_date(output, job, &key))
    {
        return Ok(Outcome::Unchanged);
    }

    let photos = load::photos(job_path, &loaded, said)?;
    let mut findings = calc::derive_in(job, &setup.ratings, loaded.catalogue());
    let lookup = lookup
        .and_then(|asked| match asked {
            FooterLookup::Known(answer) => Some(answer),
            FooterLookup::Asking(thread) => thread.join().ok(),
        })
        .flatten();
    load::stamp_from(&loaded, &mut findings, lookup.as_ref());
    for warning in undrawable_text(&load::job_name(job_path), &loaded.text, said.catalogue()) {
        said.warn(warning);
    }

    let catalogue = loaded.catalogue();
    let document = if let Some(markdown) = &markdown {
        let input = ListingInput {
            job,
            findings: &findings,
            job_text: &loaded.text,
            typst_version: setup.program.version.to_string(),
            shop: loaded.shop.as_ref().map(|s| &s.profile),
            logo: loaded.shop.as_ref().and_then(|s| s.logo.as_ref()),
            catalogue,
            serial: serial_shown(args),
            photos: &photos,
            markdown_stem: markdown
                .file_stem()
                .map(|s| s.to_string_lossy().into_owned())
                .unwrap_or_default(),
        };
        let d = match listing::build(&input, &setup.templates) {
            Ok(d) => d,
            Err(e) => return Err(report_build_error(e, said)),
        };
        let folder = markdown.parent().unwrap_or(Path::new(""));
        let mut extra: Vec<(PathBuf, Vec<u8>)> = d
            .photo_files
            .into_iter()
            .map(|(name, bytes)| (folder.join(name), bytes))
            .collect();
        for (path, _) in &extra {
            if let Err(e) =
                typeset::check_output(path, &inputs).and_then(|()| setup.job_files.check(path))
            {
                said.error(format!(
                    "{:?}",
                    miette::Report::new(e.in_language(said.catalogue()))
                ));
                return Err(Exit::Usage);
            }
        }
        extra.push((markdown.clone(), d.markdown.into_bytes()));
        Built {
            sandbox: d.sandbox,
            main: d.main,
            options: d.options,
            extra,
        }
    } else {
        let input = HandoverInput {
            job,
            findings: &findings,
            job_text: &loaded.text,
            typst_version: setup.program.version.to_string(),
            shop: loaded.shop.as_ref().map(|s| &s.profile),
            logo: loaded.shop.as_ref().and_then(|s| s.logo.as_ref()),
            include_charges: !args.no_charges,
            catalogue,
            revision: findings.job.git.clone(),
            photos: &photos,
        };
        match handover::build(&input, &setup.templates) {
            Ok(d) => {
                if setup.ends_after_one {
                    // The template's context, a string for every cell of a
                    // long job: freed by the process's end, like the rest.
                    std::mem::forget(d.context);
                }
                Built {
                    sandbox: d.sandbox,
                    main: d.main,
                    options: d.options,
                    extra: Vec::new(),
                }
            }
            Err(e) => return Err(report_build_error(e, said)),
        }
    };

    // typst's threads: its default for a job alone, a share of the cores
    // for each of several side by side (a batch's workers).
    let options = CompileOptions {
        timeout: args.timeout,
        threads: setup.typst_threads,
        ..document.options.clone()
    };
    if let Some(dir) = &args.emit_source {
        if let Err(e) = typeset::check_emit_folder(dir, &inputs, output, args.force) {
            said.error(format!(
                "{:?}",
                miette::Report::new(e.in_language(said.catalogue()))
            ));
            return Err(Exit::Usage);
        }
        let written = if args.force {
            typeset::emit_source_replacing(&document.sandbox, dir)
        } else {
            typeset::emit_source(&document.sandbox, dir)
        };
        if let Some(signal) = interrupt::received() {
            return Err(report_typeset_error(
                TypesetError::Interrupted { signal },
                &setup.templates,
                None,
                said,
            ));
        }
        if let Err(e) = written {
            said.error(
                said.say(
                    &Msg::new("cli-cannot-write-source")
                        .arg("folder", dir.display().to_string())
                        .arg("error", crate::catalogue::os_error(&e)),
                ),
            );
            return Err(Exit::Environment);
        }
        said.warn(said.say(&Msg::new("cli-wrote-source").arg("folder", dir.display().to_string())));
        said.warn(
            "  ".to_owned()
                + &said.say(&Msg::new("cli-same-pdf-from").arg(
                    "command",
                    handover::compile_command(
                        dir,
                        &options,
                        &dir.join(if args.listing {
                            "listing.pdf"
                        } else {
                            "handover.pdf"
                        }),
                    ),
                )),
        );
    }

    // The PDF and the files beside it (the listing's photos and Markdown)
    // land together or not at all.
    match typeset::compile_with(
        &setup.program,
        &document.sandbox,
        document.main,
        &options,
        output,
        &document.extra,
    ) {
        Ok(outcome) => {
            match &outcome.fonts {
                FontsUsed::Cache(dir) => said.read(
                    "cli-read-what-fonts",
                    Msg::new("cli-read-from-fonts-cache").arg("path", dir.display().to_string()),
                ),
                FontsUsed::Sandbox => said.read(
                    "cli-read-what-fonts",
                    Msg::new("cli-read-from-fonts-sandbox"),
                ),
            }
            if !outcome.warnings.is_empty() {
                said.warn(
                    said.say(
                        &Msg::new("cli-typst-warned").arg("warnings", outcome.warnings.as_str()),
                    ),
                );
            }
            beside.extend(document.extra.iter().map(|(path, _)| path.clone()));
            let written = std::iter::once((output, outcome.pdf.as_slice())).chain(
                document
                    .extra
                    .iter()
                    .map(|(p, bytes)| (p, bytes.as_slice())),
            );
            for (path, bytes) in written {
                match &key {
                    _ if is_dash(path) => {}
                    Some(key) => {
                        if let Err(e) = content_key::record(path, bytes, key) {
                            said.warn(
                                said.say(
                                    &Msg::new("cli-cannot-record")
                                        .arg("path", path.display().to_string())
                                        .arg("error", crate::catalogue::os_error(&e)),
                                ),
                            );
                        }
                    }
                    None => content_key::forget(path),
                }
            }
            if setup.ends_after_one {
                // Freed by the process's end (see `Setup::ends_after_one`).
                std::mem::forget(outcome);
                std::mem::forget(document);
                std::mem::forget(findings);
                std::mem::forget(loaded);
                std::mem::forget(photos);
            }
            Ok(Outcome::Rendered)
        }
        Err(e) => Err(report_typeset_error(
            e,
            &setup.templates,
            Some(output),
            said,
        )),
    }
}

/// The footer's look-up in git: remembered, or being asked on a thread.
enum FooterLookup {
    Known(Option<crate::git::Lookup>),
    Asking(std::thread::JoinHandle<Option<crate::git::Lookup>>),
}

/// A document ready to compile, and the files written beside it.
struct Built {
    sandbox: typeset::Sandbox,
    main: &'static str,
    options: CompileOptions,
    /// Put in place with the PDF, or not at all: the listing's photos,
    /// then its Markdown.
    extra: Vec<(PathBuf, Vec<u8>)>,
}

/// True when the files a listing writes beside its PDF `output` were all
/// made from `key`: its Markdown and one file for each photo marked for
/// the listing (PNG or JPEG, as the photo was).
fn listing_files_up_to_date(output: &Path, job: &crate::job::Job, key: &str) -> bool {
    let markdown = markdown_for(output);
    if !content_key::up_to_date(&markdown, key) {
        return false;
    }
    let stem = markdown
        .file_stem()
        .map(|s| s.to_string_lossy().into_owned())
        .unwrap_or_default();
    let listed = job.photos.iter().filter(|p| p.listing).count();
    (1..=listed).all(|i| {
        ["png", "jpg"].iter().any(|extension| {
            content_key::up_to_date(
                &markdown.with_file_name(format!("{stem}-photo-{i}.{extension}")),
                key,
            )
        })
    })
}

/// A job's content key: the run's shared inputs, the job's text, its
/// shop profile's text (or its absence), each file the job or the profile
/// names (the logo, the translation file, the photos) as written with its
/// bytes, and the commit the job's git repository stands at (the footer
/// names the commit that last changed the job and whether the bytes read
/// are that commit's: both follow from that commit and the job's bytes).
/// `None` when a named file cannot be read: the render then reports it.
fn job_key(
    setup: &Setup<'_>,
    run: &RunKey,
    job_path: &Path,
    loaded: &load::Loaded,
) -> Option<content_key::JobKey> {
    let shop = loaded.shop.as_ref();
    let mut named: Vec<(&str, &str, std::borrow::Cow<'_, [u8]>)> = Vec::new();
    if let (Some(logo), Some(written)) = (
        shop.and_then(|s| s.logo.as_ref()),
        shop.and_then(|s| s.profile.logo.as_ref()),
    ) {
        named.push(("logo", written.value.trim(), logo.bytes.as_slice().into()));
    }
    if let (Some(file), Some(written)) = (
        shop.and_then(|s| s.translation.as_ref()),
        shop.and_then(|s| s.profile.language.as_ref())
            .and_then(|l| l.file.as_ref()),
    ) {
        named.push((
            "translation",
            written.value.trim(),
            std::fs::read(file).ok()?.into(),
        ));
    }
    let photos = crate::photo::photo_paths(&loaded.decoded.job, job_path);
    for (photo, path) in loaded.decoded.job.photos.iter().zip(&photos) {
        named.push(("photo", &photo.path.value, std::fs::read(path).ok()?.into()));
    }
    let mut key = run.job(&loaded.text);
    match shop {
        Some(shop) => key.file("shop profile", shop.text.as_bytes()),
        None => key.none("shop profile"),
    }
    for (role, written, bytes) in &named {
        key.named_file(role, written, bytes);
    }
    finish_key(setup, job_path, key)
}

/// The part of a job's key that comes last: where its repository stands.
fn finish_key(
    setup: &Setup<'_>,
    job_path: &Path,
    mut key: content_key::JobKey,
) -> Option<content_key::JobKey> {
    // The footer's line is git's answer for the job's path in the
    // repository: the commit, the folder and the file name all count, so a
    // job moved with its PDF and manifest is rendered again.
    match setup.repository_head(job_path) {
        Some(head) => {
            let name = job_path.file_name().unwrap_or_default().as_encoded_bytes();
            let mut place = format!("{}\n{}", head.commit, head.prefix).into_bytes();
            place.extend_from_slice(name);
            key.file("git head", &place)
        }
        None => key.none("git head"),
    }
    Some(key)
}

/// The cheap skip: true when the PDF of `plan` was made from exactly the
/// inputs there are now, worked out without decoding the job. The texts
/// of the job and of the shop profile it would use are read, the files
/// the manifest lists as named by them are read where the job and the
/// profile would find them, and the key is worked out as [`job_key`] does.
/// Which files the texts name follows from the texts, which are in the
/// key, so a match is as exact as the full key; anything unreadable or
/// out of place just means the job is rendered (and the render says
/// why). The files read are added to `depends`.
fn unchanged(setup: &Setup<'_>, run: &RunKey, plan: &Plan, depends: &mut Vec<PathBuf>) -> bool {
    let job_path = &plan.job.path;
    if is_dash(job_path) {
        return false;
    }
    let Some(manifest) = content_key::Manifest::read(&plan.output) else {
        return false;
    };
    let Ok(text) = crate::input_file::read_text(job_path, "job file") else {
        return false;
    };
    let choice = setup.args.job.shop_choice();
    let shop = if choice.none {
        None
    } else {
        let config = crate::shop::user_config_dir();
        crate::shop::discover(job_path, choice.named, config.as_deref())
            .map(|found| found.path().to_path_buf())
    };
    let mut key = run.job(&text);
    let mut read = Vec::new();
    match &shop {
        Some(path) => {
            let Ok(shop_text) = crate::input_file::read_text(path, "shop profile") else {
                return false;
            };
            key.file("shop profile", shop_text.as_bytes());
            read.push(path.clone());
        }
        None => key.none("shop profile"),
    }
    let job_folder = match job_path.parent() {
        Some(p) if !p.as_os_str().is_empty() => p,
        _ => Path::new("."),
    };
    for file in &manifest.files {
        let folder = match (file.role.as_str(), &shop) {
            ("photo", _) => job_folder,
            ("logo" | "translation", Some(shop)) => shop.parent().unwrap_or(Path::new(".")),
            _ => return false,
        };
        let limit = crate::input_file::MAX_INPUT_BYTES.max(crate::photo::MAX_PHOTO_BYTES);
        let Ok(found) = crate::input_file::read_in_folder(folder, &file.written, limit) else {
            return false;
        };
        key.named_file(&file.role, &file.written, &found.bytes);
        read.push(found.place);
    }
    let Some(key) = finish_key(setup, job_path, key) else {
        return false;
    };
    if !manifest.matches(&plan.output, &key.finish()) {
        return false;
    }
    depends.extend(read);
    true
}

/// Every path the render of `job` reads, for the output checks: an output
/// may be none of them, and the `--emit-source` folder may hold none of
/// them.
fn inputs_read(
    args: &RenderArgs,
    job: &Path,
    program: &TypstProgram,
    shop: Option<&load::LoadedShop>,
) -> Vec<Input> {
    let mut inputs = Vec::new();
    if !is_dash(job) {
        inputs.push(Input::new(job, "cli-input-job-file"));
    }
    inputs.extend(
        args.job
            .ratings
            .iter()
            .map(|r| Input::new(r, "cli-input-ratings-file")),
    );
    if let Some(dir) = &args.templates {
        inputs.push(Input::new(dir, "cli-input-template-folder"));
    }
    if let Some(shop) = shop {
        inputs.push(Input::new(shop.path(), "cli-input-shop-profile"));
        if let Some(logo) = &shop.logo {
            inputs.push(Input::new(&logo.source, "cli-input-logo"));
        }
        if let Some(translation) = &shop.translation {
            inputs.push(Input::new(translation, "cli-input-translation"));
        }
    }
    inputs.push(Input::new(&program.path, "cli-input-typst"));
    inputs
}

/// Prints a typesetting failure with whose fault it likely is, and gives
/// the exit status: 1 when a shop's template is at fault, 2 for an output
/// that may not be written, 3 for typst or the machine (and for the
/// built-in template, a fault of ampreport itself), 128 + N for signal N.
pub(crate) fn report_typeset_error(
    e: TypesetError,
    templates: &TemplateSource,
    output: Option<&Path>,
    said: &mut Said,
) -> Exit {
    let shop = templates.override_dir.as_deref();
    let status = match &e {
        TypesetError::Interrupted { signal } => Exit::Interrupted(*signal),
        TypesetError::Output(_) => Exit::Usage,
        TypesetError::Compile { .. } | TypesetError::MissingText { .. } => match shop {
            Some(dir) => {
                said.err(said.say(
                    &Msg::new("cli-shop-templates-failed").arg("folder", dir.display().to_string()),
                ));
                Exit::InvalidInput
            }
            None => {
                said.err(said.say(&Msg::new("cli-built-in-template-failed")));
                Exit::Environment
            }
        },
        _ => Exit::Environment,
    };
    // Said in the job's language once its shop profile is read.
    let catalogue = said.catalogue().clone();
    said.error(format!(
        "{:?}",
        miette::Report::new(e.in_language(&catalogue))
    ));
    if let Some(output) = output
        && output.exists()
    {
        said.err(
            said.say(&Msg::new("cli-left-as-it-was").arg("path", output.display().to_string())),
        );
    }
    status
}

/// A warning for each text value of the job holding characters the
/// bundled fonts cannot draw, naming the field and where it is; the
/// document prints those characters as the placeholder.
fn undrawable_text(file: &str, text: &str, catalogue: &Catalogue) -> Vec<String> {
    fn walk(
        doc: &kdl::KdlDocument,
        file: &str,
        text: &str,
        catalogue: &Catalogue,
        out: &mut Vec<String>,
    ) {
        for node in doc.nodes() {
            for entry in node.entries() {
                let kdl::KdlValue::String(value) = entry.value() else {
                    continue;
                };
                let lacking = typeset::undrawable(value);
                if lacking.is_empty() {
                    continue;
                }
                let field: crate::catalogue::Arg = match entry.name() {
                    Some(key) => Msg::new("cli-field-of")
                        .arg("key", key.value())
                        .arg("node", node.name().value())
                        .into(),
                    None => format!("`{}`", node.name().value()).into(),
                };
                let (line, column) = crate::job::line_column(text, entry.span().offset());
                let chars: Vec<String> = lacking
                    .iter()
                    .take(5)
                    .map(|c| format!("U+{:04X}", u32::from(*c)))
                    .collect();
                out.push(
                    catalogue.say(
                        &Msg::new("cli-undrawable")
                            .arg("place", format!("{file}:{line}:{column}"))
                            .arg("field", field)
                            .arg(
                                "chars",
                                format!(
                                    "{}{}",
                                    chars.join(", "),
                                    if lacking.len() > 5 { ", …" } else { "" }
                                ),
                            )
                            .arg("placeholder", typeset::placeholder().to_string()),
                    ),
                );
            }
            if let Some(children) = node.children() {
                walk(children, file, text, catalogue, out);
            }
        }
    }
    let mut out = Vec::new();
    // A value's characters are the text's own, but for a `\u{…}` escape:
    // when the text has none and every character of it can be drawn, so
    // can every value, and the job need not be parsed a second time.
    if !text.contains("\\u") && typeset::draws_every_char(text) {
        return out;
    }
    if let Ok(doc) = crate::kdl_fast::parse_document(text) {
        walk(&doc, file, text, catalogue, &mut out);
    }
    out
}

/// Beside the job file, same name, `.pdf`.
fn default_output(job: &Path) -> PathBuf {
    job.with_extension("pdf")
}

/// Beside the job file, same name, `.listing.pdf`.
fn default_listing_output(job: &Path) -> PathBuf {
    job.with_extension("listing.pdf")
}

/// Refuses the output of a one-job run that cannot be: `-o -` (standard
/// output) when standard output is a terminal, and a job read from
/// standard input without `-o`, since it has no file to sit beside.
fn single_output_allowed(args: &RenderArgs, job: &Path) -> Result<(), Exit> {
    match &args.output {
        Some(o) if is_dash(o) && std::io::stdout().is_terminal() => {
            eprintln!("{}", ui::english(&Msg::new("cli-stdout-is-terminal")));
            Err(Exit::Usage)
        }
        Some(o) if is_dash(o) && args.listing => {
            eprintln!("{}", ui::english(&Msg::new("cli-listing-needs-file")));
            Err(Exit::Usage)
        }
        None if is_dash(job) => {
            eprintln!("{}", ui::english(&Msg::new("cli-stdin-needs-output")));
            Err(Exit::Usage)
        }
        _ => Ok(()),
    }
}

/// The built-in templates (the hand-over's, or the listing's), overridden
/// by `--templates DIR` when given.
pub(crate) fn template_source(dir: Option<&Path>, listing: bool) -> Result<TemplateSource, Exit> {
    let embedded = if listing {
        listing::EMBEDDED_TEMPLATES
    } else {
        handover::EMBEDDED_TEMPLATES
    };
    let source = TemplateSource::embedded(embedded);
    for (name, _) in embedded {
        let shop = dir.map(|d| d.join(name)).filter(|p| p.is_file());
        match shop {
            Some(path) => ui::read(
                "cli-read-what-template",
                Msg::new("cli-read-from-template-shop").arg("path", path.display().to_string()),
            ),
            None => ui::read(
                "cli-read-what-template",
                Msg::new("cli-read-from-template-built-in").arg("name", *name),
            ),
        }
    }
    match dir {
        None => Ok(source),
        Some(dir) if dir.is_dir() => Ok(source.with_override_dir(dir)),
        Some(dir) => {
            eprintln!(
                "{}",
                ui::english(
                    &Msg::new("cli-no-template-folder").arg("folder", dir.display().to_string())
                )
            );
            Err(Exit::InvalidInput)
        }
    }
}

fn report_build_error(e: HandoverError, said: &mut Said) -> Exit {
    let status = match &e {
        HandoverError::Template {
            from_override: true,
            ..
        }
        | HandoverError::Image { .. }
        | HandoverError::Refused(_) => Exit::InvalidInput,
        HandoverError::Template {
            from_override: false,
            ..
        } => {
            said.err(said.say(&Msg::new("cli-built-in-template-failed")));
            Exit::Environment
        }
        HandoverError::Plot(_) | HandoverError::Sandbox(_) => Exit::Environment,
    };
    // Said in the job's language; what the template engine, the chart
    // drawing or the operating system said inside it stays as they said it.
    let words = match &e {
        HandoverError::Template { name, detail, .. } => Msg::new("cli-template-not-filled")
            .arg("name", name)
            .arg("detail", detail.clone()),
        HandoverError::Image { path, source } => Msg::new("cli-shop-image-unreadable")
            .arg("path", path)
            .arg("error", crate::catalogue::os_error(source)),
        HandoverError::Refused(inner) => {
            Msg::new("cli-template-file-refused").arg("error", inner.msg())
        }
        HandoverError::Sandbox(t) => {
            Msg::new("cli-error").arg("error", t.message_in(said.catalogue()))
        }
        HandoverError::Plot(p) => Msg::new("cli-error").arg("error", p.msg()),
    };
    said.error(said.say(&words));
    status
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn text_the_fonts_cannot_draw_is_named_with_its_place() {
        let text = "job id=\"J1\"\nparts {\n    part R1 reason=\"hot 🔥\"\n}\nnotes {\n    note \"ก\"\n}\n";
        let warnings = undrawable_text("j.kdl", text, Catalogue::english());
        assert_eq!(warnings.len(), 2, "{warnings:?}");
        assert!(warnings[0].starts_with("warning: j.kdl:3:13: the text of `reason` of `part`"));
        assert!(warnings[0].contains("U+1F525"));
        assert!(warnings[1].contains("j.kdl:6:10: the text of `note`"));
    }

    #[test]
    fn a_character_written_as_an_escape_is_named_too() {
        // Every character of the text itself can be drawn; the escape's
        // cannot.
        let text = "job id=\"J1\"\nnotes {\n    note \"hot \\u{1F525}\"\n}\n";
        assert!(typeset::draws_every_char(text));
        let warnings = undrawable_text("j.kdl", text, Catalogue::english());
        assert_eq!(warnings.len(), 1, "{warnings:?}");
        assert!(warnings[0].contains("j.kdl:3:10: the text of `note`"));
        assert!(warnings[0].contains("U+1F525"));
        // Without anything to name, nothing is said.
        let plain = "job id=\"J1\"\nnotes {\n    note \"caf\u{e9} \\u{e9}\"\n}\n";
        assert!(undrawable_text("j.kdl", plain, Catalogue::english()).is_empty());
    }

    #[test]
    fn output_sits_beside_the_job() {
        assert_eq!(
            default_output(Path::new("jobs/a.kdl")),
            PathBuf::from("jobs/a.pdf")
        );
        assert_eq!(default_output(Path::new("a")), PathBuf::from("a.pdf"));
    }
}
