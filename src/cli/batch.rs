//! Rendering many jobs at once: a pool of `-j N` worker threads (rayon),
//! each driving one typst at a time through the one-job pipeline
//! ([`super::render::render_one`]). A failing job never stops the others;
//! each job's diagnostics print as one block when it ends, with a line
//! saying how it ended, and a summary closes the run (rendered, unchanged,
//! failed with the first error of each). Exit status 1 when any job
//! failed; on a stop signal the jobs running end cleanly, no new one
//! starts, and the process ends as the signal would end it.
//!
//! On a terminal a progress bar (`indicatif`) stands under the lines;
//! elsewhere, or with `NO_COLOR`, `TERM=dumb` or `--quiet`, there are only
//! the lines. `--quiet` leaves out the lines of jobs rendered or unchanged
//! and the warnings, as it leaves out "wrote" lines and warnings
//! elsewhere; failures and the summary still print.

use std::io::IsTerminal;
use std::sync::Mutex;
use std::time::{Duration, Instant};

use indicatif::{ProgressBar, ProgressDrawTarget, ProgressStyle};
use rayon::prelude::*;

use super::exit::Exit;
use super::render::{JobReport, Outcome, Plan, Setup, render_one};
use crate::catalogue::{Arg, Catalogue, Msg};
use crate::typeset::interrupt;

/// The number of worker threads by default: the machine's cores.
pub fn default_workers() -> usize {
    std::thread::available_parallelism().map_or(1, usize::from)
}

/// How a finished job is told: on a progress bar, or in plain lines.
struct Progress {
    bar: Option<ProgressBar>,
    quiet: bool,
    /// The language the bar speaks: English until a job has finished,
    /// then the one every finished job was said in, English once they
    /// differ (as the closing summary, [`shared_language`]).
    language: std::sync::Mutex<BarLanguage>,
}

/// What the bar's words follow so far.
enum BarLanguage {
    NoJobYet,
    Shared(Catalogue),
    Mixed,
}

/// The progress bar's template with its words from `catalogue`
/// (`cli-progress-jobs`: "3/8 jobs").
fn bar_template(catalogue: &Catalogue) -> String {
    let jobs: String = catalogue
        .text("cli-progress-jobs")
        .chars()
        .filter(|c| !matches!(c, '{' | '}'))
        .collect();
    format!("{{bar:30}} {{pos}}/{{len}} {jobs}, {{elapsed}} {{msg}}")
}

fn bar_style(catalogue: &Catalogue) -> ProgressStyle {
    ProgressStyle::with_template(&bar_template(catalogue))
        .unwrap_or_else(|_| ProgressStyle::default_bar())
        .progress_chars("=> ")
}

/// A progress bar only on a terminal, and not with `NO_COLOR`, `TERM=dumb`
/// or `--quiet`.
fn bar_wanted(terminal: bool, no_color: Option<&str>, term: Option<&str>, quiet: bool) -> bool {
    terminal && no_color.is_none_or(str::is_empty) && term != Some("dumb") && !quiet
}

impl Progress {
    fn new(total: usize, quiet: bool) -> Self {
        let no_color = std::env::var("NO_COLOR").ok();
        let term = std::env::var("TERM").ok();
        let wanted = bar_wanted(
            std::io::stderr().is_terminal(),
            no_color.as_deref(),
            term.as_deref(),
            quiet,
        );
        let bar = wanted.then(|| {
            let bar = ProgressBar::with_draw_target(
                Some(total as u64),
                ProgressDrawTarget::stderr_with_hz(8),
            );
            bar.set_style(bar_style(Catalogue::english()));
            bar
        });
        Progress {
            bar,
            quiet,
            language: std::sync::Mutex::new(BarLanguage::NoJobYet),
        }
    }

    /// The bar's words after `catalogue`'s job has finished.
    fn speak(&self, bar: &ProgressBar, catalogue: &Catalogue) {
        let Ok(mut language) = self.language.lock() else {
            return;
        };
        let same = |c: &Catalogue| {
            c.language() == catalogue.language() && c.origin() == catalogue.origin()
        };
        let next = match &*language {
            BarLanguage::NoJobYet => BarLanguage::Shared(catalogue.clone()),
            BarLanguage::Shared(c) if same(c) => return,
            BarLanguage::Shared(_) => BarLanguage::Mixed,
            BarLanguage::Mixed => return,
        };
        bar.set_style(bar_style(match &next {
            BarLanguage::Shared(c) => c,
            _ => Catalogue::english(),
        }));
        *language = next;
    }

    /// Prints what a job said and how it ended, above the bar if there is
    /// one.
    fn finished(&self, plan: &Plan, report: &JobReport) {
        let print = || {
            report.said.print();
            if !self.quiet || report.outcome == Outcome::Failed {
                println!("{}", outcome_line(plan, report));
            }
        };
        match &self.bar {
            Some(bar) => {
                bar.suspend(print);
                self.speak(bar, report.said.catalogue());
                bar.inc(1);
            }
            None => print(),
        }
    }

    fn done(&self) {
        if let Some(bar) = &self.bar {
            bar.finish_and_clear();
        }
    }
}

/// One line per job: "rendered jobs/a.kdl → jobs/a.pdf in 1.24 s",
/// "unchanged jobs/b.pdf", "failed jobs/c.kdl: the first error".
/// Said in the job's language.
fn outcome_line(plan: &Plan, report: &JobReport) -> String {
    let job = plan.job.path.display().to_string();
    let output = plan.output.display().to_string();
    report.said.say(&match report.outcome {
        Outcome::Rendered => Msg::new("cli-rendered")
            .arg("job", job)
            .arg("output", output)
            .arg("time", seconds(report.elapsed)),
        Outcome::Unchanged => Msg::new("cli-unchanged").arg("output", output),
        Outcome::Failed => Msg::new("cli-failed").arg("job", job).arg(
            "error",
            match report.said.first_error() {
                Some(e) => Arg::from(e),
                None => Msg::new("cli-see-above").into(),
            },
        ),
    })
}

/// "0.84 s", "12.3 s".
pub fn seconds(d: Duration) -> String {
    let s = d.as_secs_f64();
    if s < 10.0 {
        format!("{s:.2} s")
    } else {
        format!("{s:.1} s")
    }
}

/// Renders every job of `setup` and prints the summary. With more than
/// one worker, each typst is held to its share of the cores
/// ([`crate::typeset::threads_per_worker`]).
pub fn run(setup: &mut Setup<'_>) -> Exit {
    let workers = setup
        .args
        .parallel
        .map_or_else(default_workers, usize::from)
        .min(setup.plans.len().max(1));
    setup.typst_threads = crate::typeset::threads_per_worker(workers, default_workers());
    let setup = &*setup;
    let pool = match rayon::ThreadPoolBuilder::new()
        .num_threads(workers)
        .thread_name(|i| format!("ampreport-render-{i}"))
        // Jobs are read on these threads: a worker gets the program's
        // stack, not the 2 MiB default, or a deeply nested job aborts the
        // whole batch.
        .stack_size(super::PROGRAM_STACK)
        .build()
    {
        Ok(pool) => pool,
        Err(e) => {
            eprintln!(
                "{}",
                super::ui::english(
                    &Msg::new("cli-no-workers")
                        .arg("workers", workers)
                        .arg("error", e.to_string())
                )
            );
            return Exit::Environment;
        }
    };
    let start = Instant::now();
    let progress = Progress::new(setup.plans.len(), !super::ui::chatty());
    let reports: Mutex<Vec<Option<JobReport>>> =
        Mutex::new((0..setup.plans.len()).map(|_| None).collect());
    pool.install(|| {
        setup
            .plans
            .par_iter()
            .enumerate()
            .with_max_len(1)
            .for_each(|(i, plan)| {
                if interrupt::received().is_some() {
                    return;
                }
                let report = render_one(setup, plan);
                progress.finished(plan, &report);
                if let Ok(mut all) = reports.lock() {
                    all[i] = Some(report);
                }
            });
    });
    progress.done();
    let reports = reports.into_inner().unwrap_or_default();
    let summary = Summary::of(&setup.plans, &reports, start.elapsed());
    print!("{}", summary.text);
    if let Some(signal) = interrupt::received() {
        return Exit::Interrupted(signal);
    }
    if summary.failed > 0 {
        Exit::InvalidInput
    } else {
        Exit::Success
    }
}

/// The closing summary of a batch.
struct Summary {
    failed: usize,
    text: String,
}

/// The language a batch's summary is said in: the one every job that
/// started was said in, English when they differ.
fn shared_language(reports: &[Option<JobReport>]) -> &Catalogue {
    let mut languages = reports.iter().flatten().map(|r| r.said.catalogue());
    let Some(first) = languages.next() else {
        return Catalogue::english();
    };
    let same = |c: &Catalogue| c.language() == first.language() && c.origin() == first.origin();
    if languages.all(same) {
        first
    } else {
        Catalogue::english()
    }
}

impl Summary {
    fn of(plans: &[Plan], reports: &[Option<JobReport>], elapsed: Duration) -> Self {
        let count = |o: Outcome| reports.iter().flatten().filter(|r| r.outcome == o).count();
        let (rendered, unchanged, failed) = (
            count(Outcome::Rendered),
            count(Outcome::Unchanged),
            count(Outcome::Failed),
        );
        let not_run = reports.iter().filter(|r| r.is_none()).count();
        let catalogue = shared_language(reports);
        let mut text = String::from("\n");
        text.push_str(
            &catalogue.say(
                &Msg::new("cli-summary")
                    .arg("jobs", plans.len())
                    .arg("time", seconds(elapsed))
                    .arg("rendered", rendered)
                    .arg("unchanged", unchanged)
                    .arg("failed", failed),
            ),
        );
        if not_run > 0 {
            text.push_str(&catalogue.say(&Msg::new("cli-summary-stopped").arg("count", not_run)));
        }
        text.push('\n');
        for (plan, report) in plans.iter().zip(reports) {
            if let Some(report) = report
                && report.outcome == Outcome::Failed
            {
                let error: Arg = match report.said.first_error() {
                    Some(e) => e.into(),
                    None => Msg::new("cli-no-message").into(),
                };
                text.push_str("  ");
                text.push_str(
                    &catalogue.say(
                        &Msg::new("cli-failed")
                            .arg("job", plan.job.path.display().to_string())
                            .arg("error", error),
                    ),
                );
                text.push('\n');
            }
        }
        Summary { failed, text }
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn the_bar_speaks_the_jobs_language() {
        assert_eq!(
            bar_template(Catalogue::english()),
            "{bar:30} {pos}/{len} jobs, {elapsed} {msg}"
        );
        let de = Catalogue::built_in("de").unwrap();
        assert_eq!(
            bar_template(&de),
            "{bar:30} {pos}/{len} Aufträge, {elapsed} {msg}"
        );
        // A hidden bar takes the languages of the jobs as they finish.
        let progress = Progress {
            bar: None,
            quiet: true,
            language: std::sync::Mutex::new(BarLanguage::NoJobYet),
        };
        let bar = ProgressBar::hidden();
        progress.speak(&bar, &de);
        assert!(
            matches!(*progress.language.lock().unwrap(), BarLanguage::Shared(ref c) if c.language() == "de")
        );
        progress.speak(&bar, &de);
        assert!(matches!(
            *progress.language.lock().unwrap(),
            BarLanguage::Shared(_)
        ));
        progress.speak(&bar, Catalogue::english());
        assert!(matches!(
            *progress.language.lock().unwrap(),
            BarLanguage::Mixed
        ));
    }

    #[test]
    fn the_bar_is_drawn_only_on_a_terminal_without_no_color_or_quiet() {
        assert!(bar_wanted(true, None, Some("xterm"), false));
        assert!(bar_wanted(true, Some(""), None, false));
        assert!(!bar_wanted(false, None, Some("xterm"), false));
        assert!(!bar_wanted(true, Some("1"), Some("xterm"), false));
        assert!(!bar_wanted(true, None, Some("dumb"), false));
        assert!(!bar_wanted(true, None, Some("xterm"), true));
    }
}
