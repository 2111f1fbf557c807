//! ampreport's own time per phase on one job, before typst: reading the
//! ratings, decoding, deriving, the charts, the whole document build
//! (charts, context, template fill) and the terminal summary.
//!
//! `cargo run --release --example phases -- JOB [ROUNDS]` prints one line
//! per round with the processor time of the whole process in each phase
//! (`CLOCK_PROCESS_CPUTIME_ID`: every thread, so the sets derived and drawn
//! on the other core count too; it depends far less on what else the
//! shared machine runs than the wall clock), then the medians; and after
//! each round the page faults of each phase (memory touched for the first
//! time, which the system time pays for; later rounds reuse the memory of
//! earlier ones, so the first round's figures are the ones a render
//! takes), and each phase's wall clock (on an idle machine, how long the
//! phase keeps a render waiting while its parts run on every core). Keep a
//! copy
//! of the binary before a change and run both alternately to compare.
use ampreport::report::handover::{self, HandoverInput};

/// The binary's allocator (src/main.rs), so the phases cost what they
/// cost in `ampreport`.
#[global_allocator]
static ALLOCATOR: ampreport::allocator::Allocator = ampreport::allocator::Allocator;
use ampreport::typeset::TemplateSource;
use std::time::Duration;

/// Processor time all threads of this process have used.
fn process_cpu() -> Duration {
    // SAFETY: an all-zero timespec is a valid value for clock_gettime to
    // fill in, and the pointer is to a live local.
    let mut t: libc::timespec = unsafe { std::mem::zeroed() };
    // SAFETY: as above.
    let rc = unsafe { libc::clock_gettime(libc::CLOCK_PROCESS_CPUTIME_ID, &mut t) };
    assert_eq!(rc, 0, "clock_gettime");
    Duration::new(t.tv_sec as u64, t.tv_nsec as u32)
}

/// Page faults the process has taken so far (minor ones: memory touched
/// for the first time, on every thread).
fn process_faults() -> i64 {
    // SAFETY: an all-zero rusage is a valid value for getrusage to fill
    // in, and the pointer is to a live local.
    let mut u: libc::rusage = unsafe { std::mem::zeroed() };
    // SAFETY: as above.
    let rc = unsafe { libc::getrusage(libc::RUSAGE_SELF, &mut u) };
    assert_eq!(rc, 0, "getrusage");
    u.ru_minflt
}

thread_local! {
    /// The page faults of each phase of the round under way, in order.
    static FAULTS: std::cell::RefCell<Vec<i64>> = const { std::cell::RefCell::new(Vec::new()) };
    /// The wall-clock milliseconds of each phase of the round under way,
    /// in order: on an idle machine, what the phase keeps the render
    /// waiting while its parts run on every core.
    static WALL: std::cell::RefCell<Vec<f64>> = const { std::cell::RefCell::new(Vec::new()) };
}

/// Processor milliseconds of one call of `f`, and its result; its page
/// faults are noted in [`FAULTS`].
fn cpu<T>(f: impl FnOnce() -> T) -> (f64, T) {
    let faults = process_faults();
    let start = process_cpu();
    let wall = std::time::Instant::now();
    let out = f();
    let ms = (process_cpu() - start).as_secs_f64() * 1e3;
    let wall_ms = wall.elapsed().as_secs_f64() * 1e3;
    FAULTS.with(|v| v.borrow_mut().push(process_faults() - faults));
    WALL.with(|v| v.borrow_mut().push(wall_ms));
    (ms, out)
}

const PHASES: [&str; 8] = [
    "ratings",
    "decode",
    "derive",
    "diss charts",
    "supply charts",
    "build(all)",
    "terminal",
    "decode+derive+build",
];

fn round(path: &str, text: &str) -> [f64; 8] {
    let english = ampreport::catalogue::Catalogue::english();
    let (t_r, ratings) = cpu(ampreport::ratings::RatingsTable::builtin);
    let (t_d, decoded) = cpu(|| ampreport::job::decode_with_ratings(path, text, &ratings).unwrap());
    let (t_c, findings) = cpu(|| ampreport::calc::derive(&decoded.job, &ratings));
    let (t_p1, _) = cpu(|| {
        if let Some(d) = ampreport::report::plots::dissipation_chart(&findings, english) {
            // As the document build draws them: one after another with a
            // cache on each thread.
            let mut cache = ampreport::report::plots::ChartCache::default();
            for p in &ampreport::report::plots::split_dissipation(&d) {
                ampreport::report::plots::dissipation_svg_with(&p.chart, &mut cache).unwrap();
            }
        }
    });
    let (t_p2, _) = cpu(|| {
        if let Some(s) = ampreport::report::plots::supply_chart(&findings, english) {
            let mut cache = ampreport::report::plots::ChartCache::default();
            for p in &ampreport::report::plots::split_supply(&s) {
                ampreport::report::plots::supply_svg_with(&p.chart, &mut cache).unwrap();
            }
        }
    });
    let input = HandoverInput::new(&decoded.job, &findings, text, "0.15.1");
    let (t_b, doc) = cpu(|| {
        handover::build(
            &input,
            &TemplateSource::embedded(handover::EMBEDDED_TEMPLATES),
        )
        .unwrap()
    });
    std::hint::black_box(doc.sandbox.len());
    let (t_term, _) = cpu(|| {
        ampreport::report::terminal::render(
            &decoded.job,
            &findings,
            &ampreport::report::terminal::TerminalStyle {
                colour: false,
                catalogue: english.clone(),
            },
        )
    });
    [t_r, t_d, t_c, t_p1, t_p2, t_b, t_term, t_d + t_c + t_b]
}

fn main() {
    ampreport::allocator::keep_freed_memory();
    let mut args = std::env::args().skip(1);
    let path = args.next().expect("usage: phases JOB [ROUNDS]");
    let rounds: usize = args
        .next()
        .map_or(1, |r| r.parse().expect("ROUNDS is a number"));
    let text = std::fs::read_to_string(&path).unwrap();
    // As `render` does once it has the job's text.
    ampreport::allocator::large_pages_for(text.len());
    let mut all: Vec<[f64; 8]> = Vec::new();
    for _ in 0..rounds {
        FAULTS.with(|v| v.borrow_mut().clear());
        WALL.with(|v| v.borrow_mut().clear());
        let r = round(&path, &text);
        println!(
            "processor ms: {}",
            named(r.iter().map(|ms| format!("{ms:.1}")))
        );
        let faults = FAULTS.with(|v| named(v.borrow().iter().map(i64::to_string)));
        println!("page faults: {faults}");
        let wall = WALL.with(|v| named(v.borrow().iter().map(|ms| format!("{ms:.1}"))));
        println!("wall ms: {wall}");
        all.push(r);
    }
    if rounds > 1 {
        let medians = (0..PHASES.len()).map(|i| {
            let mut v: Vec<f64> = all.iter().map(|r| r[i]).collect();
            v.sort_by(f64::total_cmp);
            format!("{:.1}", v[v.len() / 2])
        });
        println!("median of {rounds}: {}", named(medians));
    }
}

/// Each phase's name with its figure, in order: "decode 12.5, derive …".
fn named(figures: impl Iterator<Item = String>) -> String {
    PHASES
        .iter()
        .zip(figures)
        .map(|(name, figure)| format!("{name} {figure}"))
        .collect::<Vec<_>>()
        .join(", ")
}
