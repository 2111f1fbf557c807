//! `ampreport watch JOB|DIR…`: renders the jobs, then renders a job again
//! each time it, or anything it is made from, is saved. The same options
//! and the same one-job pipeline as `render` (a job whose PDF is already
//! up to date is not rendered); one line per render with the time it took;
//! a failed render prints its errors and leaves the last good PDF as it
//! was. Ctrl-C (or SIGTERM, SIGHUP) stops a render in progress the way it
//! stops `render` (typst ended, temporary files removed) and ends the
//! watch with status 0.
//!
//! The folders holding the jobs (and the ratings files and the template
//! folder) are watched rather than the files themselves, since editors
//! save by writing a new file and renaming it over the old one. Changes
//! come through `notify`, debounced: a burst of writes to one file is one
//! change, told at most [`DEBOUNCE`] × 2 after the last of them. A changed
//! job file renders that job; a changed ratings file or template, shop
//! profile (any `shop.kdl`, or one a job used) or logo, or a job file added
//! to a watched folder, renders every job (those whose content key still
//! matches are not typeset again).
//!
//! The watcher also tells of files merely opened, the render's own reads
//! among them; a path counts as changed only when its modification time or
//! length differs from when it was last read ([`Stamps`]), or a render
//! would set off the next one for ever.

use std::collections::{HashMap, HashSet};
use std::path::{Path, PathBuf};
use std::sync::mpsc::{RecvTimeoutError, channel};
use std::time::{Duration, SystemTime};

use notify::RecursiveMode;
use notify_debouncer_mini::new_debouncer;

use super::args::RenderArgs;
use super::batch::seconds;
use super::exit::Exit;
use super::render::{Outcome, Plan, Setup, render_one};
use super::ui;
use crate::catalogue::Msg;
use crate::typeset::interrupt;

/// How long a file must be quiet before its change is taken. An editor
/// writes a job file of a few kilobytes in well under a millisecond; a
/// render that still catches a save half-written fails, keeps the last
/// good PDF, and the rest of the save renders again.
pub const DEBOUNCE: Duration = Duration::from_millis(15);

/// How often the loop looks for a stop signal while nothing changes.
const POLL: Duration = Duration::from_millis(100);

pub fn run(args: &RenderArgs) -> Exit {
    // Lives on between saves: freed memory goes back to the system.
    crate::allocator::return_freed_memory();
    if let Err(e) = interrupt::install() {
        ui::warn(ui::english(
            &Msg::new("cli-watch-no-stop-signals").arg("error", e.to_string()),
        ));
    }
    if args.job.jobs.iter().any(|j| crate::input_file::is_dash(j)) {
        eprintln!("{}", ui::english(&Msg::new("cli-watch-no-stdin")));
        return Exit::Usage;
    }
    if args
        .output
        .as_deref()
        .is_some_and(crate::input_file::is_dash)
    {
        eprintln!("{}", ui::english(&Msg::new("cli-watch-no-stdout")));
        return Exit::Usage;
    }
    let mut setup = match Setup::new(args) {
        Ok(s) => s,
        Err(e) => return e,
    };
    let (tx, rx) = channel();
    let mut debouncer = match new_debouncer(DEBOUNCE, tx) {
        Ok(d) => d,
        Err(e) => {
            eprintln!(
                "{}",
                ui::english(&Msg::new("cli-watch-cannot").arg("error", e.to_string()))
            );
            return Exit::Environment;
        }
    };
    let mut watched: HashSet<PathBuf> = HashSet::new();
    if let Err(e) = watch_folders(&folders(&setup), &mut watched, debouncer.watcher()) {
        eprintln!(
            "{}",
            ui::english(&Msg::new("cli-error").arg("error", e.to_string()))
        );
        return Exit::Environment;
    }
    // The shop profiles and logos the jobs were made from.
    let mut depends: HashSet<PathBuf> = HashSet::new();
    let mut stamps = Stamps::default();
    stamps.note_shared(&setup);
    let mut render_all = |setup: &Setup<'_>,
                          depends: &mut HashSet<PathBuf>,
                          stamps: &mut Stamps,
                          watcher: &mut dyn notify::Watcher| {
        for plan in &setup.plans {
            render_and_tell(setup, plan, depends, stamps);
        }
        let more: Vec<(PathBuf, RecursiveMode)> = depends
            .iter()
            .map(|p| (folder_of(p), RecursiveMode::NonRecursive))
            .collect();
        if let Err(e) = watch_folders(&more, &mut watched, watcher) {
            ui::warn(ui::english(
                &Msg::new("cli-warning").arg("warning", e.to_string()),
            ));
        }
    };
    render_all(&setup, &mut depends, &mut stamps, debouncer.watcher());
    ui::warn(ui::english(
        &Msg::new("cli-watching").arg("count", setup.plans.len()),
    ));
    loop {
        if interrupt::received().is_some() {
            ui::warn(ui::english(&Msg::new("cli-watch-stopped")));
            return Exit::Success;
        }
        let events = match rx.recv_timeout(POLL) {
            Ok(Ok(events)) => events,
            Ok(Err(e)) => {
                ui::warn(ui::english(
                    &Msg::new("cli-watch-trouble").arg("error", e.to_string()),
                ));
                continue;
            }
            Err(RecvTimeoutError::Timeout) => continue,
            Err(RecvTimeoutError::Disconnected) => {
                eprintln!("{}", ui::english(&Msg::new("cli-watcher-stopped")));
                return Exit::Environment;
            }
        };
        let changed: Vec<PathBuf> = events
            .into_iter()
            .map(|e| canonical(&e.path))
            .filter(|p| stamps.changed(p))
            .collect();
        match affected(&setup, &depends, &changed) {
            Affected::Nothing => {}
            Affected::Jobs(indices) => {
                // A commit made since the last render moves HEAD, which
                // the content key holds: ask git again.
                setup.forget_heads();
                for i in indices {
                    render_and_tell(&setup, &setup.plans[i], &mut depends, &mut stamps);
                }
            }
            Affected::Everything => {
                // The shared inputs or the set of jobs changed: plan again.
                match Setup::new(args) {
                    Ok(fresh) => setup = fresh,
                    Err(_) => continue,
                }
                stamps.note_shared(&setup);
                render_all(&setup, &mut depends, &mut stamps, debouncer.watcher());
            }
        }
    }
}

/// Renders one job and prints one line about it (what it said first);
/// notes the shop profile and logo it was made from in `depends`.
fn render_and_tell(
    setup: &Setup<'_>,
    plan: &Plan,
    depends: &mut HashSet<PathBuf>,
    stamps: &mut Stamps,
) {
    if interrupt::received().is_some() {
        return;
    }
    // Noted before it is read: a save during the render still counts.
    stamps.note(canonical(&plan.job.path));
    let report = render_one(setup, plan);
    for path in report.depends.iter().map(|p| canonical(p)) {
        stamps.note_if_new(&path);
        depends.insert(path);
    }
    report.said.print();
    let now = chrono::Local::now().format("%H:%M:%S");
    let job = plan.job.path.display().to_string();
    let output = plan.output.display().to_string();
    let time = seconds(report.elapsed);
    // Said in the job's language, as its diagnostics were.
    let line = report.said.say(&match report.outcome {
        Outcome::Rendered => Msg::new("cli-rendered")
            .arg("job", job)
            .arg("output", output)
            .arg("time", time),
        Outcome::Unchanged => Msg::new("cli-unchanged").arg("output", output),
        Outcome::Failed => Msg::new("cli-watch-failed")
            .arg("job", job)
            .arg("output", output)
            .arg("time", time),
    });
    println!("{now} {line}");
}

/// How a file stood: its modification time and length, which a save
/// changes and a read does not; `None` when it is missing.
type Stamp = Option<(SystemTime, u64)>;

fn stamp(path: &Path) -> Stamp {
    let meta = std::fs::metadata(path).ok()?;
    Some((meta.modified().ok()?, meta.len()))
}

/// How each input stood when it was last read, by canonical path.
#[derive(Debug, Default)]
struct Stamps(HashMap<PathBuf, Stamp>);

impl Stamps {
    /// Notes how `path` stands now.
    fn note(&mut self, path: PathBuf) {
        let now = stamp(&path);
        self.0.insert(path, now);
    }

    fn note_if_new(&mut self, path: &Path) {
        if !self.0.contains_key(path) {
            self.note(path.to_path_buf());
        }
    }

    /// Notes the inputs every job shares: the ratings files and the
    /// template folder's files.
    fn note_shared(&mut self, setup: &Setup<'_>) {
        let args = setup.args;
        for r in &args.job.ratings {
            self.note(canonical(r));
        }
        if let Some(dir) = &args.templates {
            let mut stack = vec![dir.clone()];
            while let Some(folder) = stack.pop() {
                for entry in std::fs::read_dir(&folder).into_iter().flatten().flatten() {
                    let path = entry.path();
                    if entry.file_type().is_ok_and(|t| t.is_dir()) {
                        stack.push(path);
                    } else {
                        self.note(canonical(&path));
                    }
                }
            }
        }
    }

    /// True when `path` is not as it was last noted (or was never noted:
    /// a new file); notes how it is now.
    fn changed(&mut self, path: &Path) -> bool {
        let now = stamp(path);
        match self.0.insert(path.to_path_buf(), now) {
            Some(before) => before != now,
            None => true,
        }
    }
}

/// The folders to watch: each job's folder, each folder named on the
/// command line (recursively with `--recursive`), each ratings file's
/// folder and the template folder (recursively).
fn folders(setup: &Setup<'_>) -> Vec<(PathBuf, RecursiveMode)> {
    let args = setup.args;
    let mut out: Vec<(PathBuf, RecursiveMode)> = Vec::new();
    for arg in &args.job.jobs {
        if arg.is_dir() {
            let mode = if args.job.recursive {
                RecursiveMode::Recursive
            } else {
                RecursiveMode::NonRecursive
            };
            out.push((arg.clone(), mode));
        }
    }
    for plan in &setup.plans {
        out.push((folder_of(&plan.job.path), RecursiveMode::NonRecursive));
    }
    for r in &args.job.ratings {
        out.push((folder_of(r), RecursiveMode::NonRecursive));
    }
    if let Some(dir) = &args.templates {
        out.push((dir.clone(), RecursiveMode::Recursive));
    }
    out
}

/// The folder a file is in (`.` for a bare name).
fn folder_of(p: &Path) -> PathBuf {
    match p.parent() {
        Some(d) if !d.as_os_str().is_empty() => d.to_path_buf(),
        _ => PathBuf::from("."),
    }
}

/// The path with links and `..` worked out, or as it is when it does not
/// exist.
fn canonical(p: &Path) -> PathBuf {
    p.canonicalize().unwrap_or_else(|_| p.to_path_buf())
}

/// Starts watching every folder of `folders` not watched yet.
fn watch_folders(
    folders: &[(PathBuf, RecursiveMode)],
    watched: &mut HashSet<PathBuf>,
    watcher: &mut dyn notify::Watcher,
) -> Result<(), String> {
    for (dir, mode) in folders {
        let key = canonical(dir);
        if watched.contains(&key) {
            continue;
        }
        watcher.watch(dir, *mode).map_err(|e| {
            ui::english(
                &Msg::new("cli-watch-folder")
                    .arg("folder", dir.display().to_string())
                    .arg("error", e.to_string()),
            )
        })?;
        watched.insert(key);
    }
    Ok(())
}

/// What a set of changed paths calls for.
#[derive(Debug, PartialEq, Eq)]
enum Affected {
    Nothing,
    /// These jobs (by index in the plans), in order.
    Jobs(Vec<usize>),
    /// The shared inputs changed, or a job file came or went.
    Everything,
}

/// Which jobs the changed paths touch. Outputs, manifests and temporary
/// files (anything that is not an input) are ignored, so a render never
/// sets off another.
fn affected(setup: &Setup<'_>, depends: &HashSet<PathBuf>, changed: &[PathBuf]) -> Affected {
    let args = setup.args;
    let shared: Vec<PathBuf> = args.job.ratings.iter().map(|r| canonical(r)).collect();
    let templates = args.templates.as_deref().map(canonical);
    let jobs: Vec<PathBuf> = setup.plans.iter().map(|p| canonical(&p.job.path)).collect();
    let searched: Vec<PathBuf> = args
        .job
        .jobs
        .iter()
        .filter(|p| p.is_dir())
        .map(|p| canonical(p))
        .collect();
    let mut hit = Vec::new();
    for path in changed {
        let path = canonical(path);
        let a_shop_profile = path
            .file_name()
            .is_some_and(|n| n == super::job_files::SHOP_FILE);
        if shared.contains(&path)
            || depends.contains(&path)
            || a_shop_profile
            || templates.as_ref().is_some_and(|t| path.starts_with(t))
        {
            return Affected::Everything;
        }
        if let Some(i) = jobs.iter().position(|j| *j == path) {
            if !path.exists() {
                return Affected::Everything;
            }
            if !hit.contains(&i) {
                hit.push(i);
            }
            continue;
        }
        // A new job file in a searched folder.
        let is_kdl = path
            .extension()
            .is_some_and(|e| e.eq_ignore_ascii_case("kdl"));
        let name_ok = path
            .file_name()
            .and_then(|n| n.to_str())
            .is_some_and(|n| !n.starts_with('.') && n != super::job_files::SHOP_FILE);
        if is_kdl && name_ok && path.is_file() && searched.iter().any(|d| path.starts_with(d)) {
            return Affected::Everything;
        }
    }
    hit.sort_unstable();
    if hit.is_empty() {
        Affected::Nothing
    } else {
        Affected::Jobs(hit)
    }
}
