//! ampreport's own work on the hand-over document, before typst: decoding
//! the job, deriving its figures, drawing the charts, building the template
//! context and filling the template, on generated jobs of 1 to 1,000
//! measurement sets (`scripts/gen-job.sh`: a head with four EL34, four
//! nodes, droppers, filter capacitors and a heater reading per set).
//!
//! Targets (docs/performance.md): the whole of it on a 1,000-set job
//! within 100 ms, and each stage's cost per set flat from 1 to 1,000 sets.
//!
//! Every figure is processor time of the benchmark's own thread
//! (`CLOCK_THREAD_CPUTIME_ID`), not wall clock: the project's machine is
//! shared, and the processor time hardly depends on what else runs. The
//! closing table prints the median per stage, per set, of
//! `AMPREPORT_BENCH_ROUNDS` rounds (default 5).
//!
//! `cargo bench --bench document`.

mod common;
use common::median;

use std::hint::black_box;
use std::time::Duration;

use ampreport::calc::{self, Findings};
use ampreport::catalogue::Catalogue;
use ampreport::job::{self, Job};
use ampreport::ratings::RatingsTable;
use ampreport::report::handover::{self, HandoverInput};
use ampreport::report::plots;
use ampreport::typeset::TemplateSource;
use criterion::{BenchmarkId, Criterion};

const SIZES: [usize; 4] = [1, 10, 100, 1000];

/// Processor time this thread has used.
fn thread_cpu() -> Duration {
    // SAFETY: an all-zero timespec is a valid value for clock_gettime to
    // fill in, and the pointer is to a live local.
    let mut t: libc::timespec = unsafe { std::mem::zeroed() };
    // SAFETY: as above.
    let rc = unsafe { libc::clock_gettime(libc::CLOCK_THREAD_CPUTIME_ID, &mut t) };
    assert_eq!(rc, 0, "clock_gettime");
    Duration::new(t.tv_sec as u64, t.tv_nsec as u32)
}

/// Processor time of one call of `f`.
fn cpu<T>(f: impl FnOnce() -> T) -> (Duration, T) {
    let start = thread_cpu();
    let out = f();
    (thread_cpu() - start, out)
}

fn decode(text: &str, ratings: &RatingsTable) -> Job {
    job::decode_with_ratings("generated.kdl", text, ratings)
        .expect("the generated job decodes")
        .job
}

fn charts(findings: &Findings) -> usize {
    let cat = Catalogue::english();
    let mut bytes = 0;
    if let Some(chart) = plots::dissipation_chart(findings, cat) {
        for part in plots::split_dissipation(&chart) {
            bytes += plots::dissipation_svg(&part.chart).unwrap().len();
        }
    }
    if let Some(chart) = plots::supply_chart(findings, cat) {
        for part in plots::split_supply(&chart) {
            bytes += plots::supply_svg(&part.chart).unwrap().len();
        }
    }
    bytes
}

fn document(job: &Job, findings: &Findings, text: &str) -> handover::Document {
    let input = HandoverInput::new(job, findings, text, "0.15.1");
    handover::build(
        &input,
        &TemplateSource::embedded(handover::EMBEDDED_TEMPLATES),
    )
    .expect("the document builds")
}

/// Processor time of each stage for one job: decode, derive, charts, the
/// whole document build (charts, context, template) and the template fill
/// alone.
fn stages(text: &str, ratings: &RatingsTable) -> [Duration; 5] {
    let (t_decode, job) = cpu(|| decode(text, ratings));
    let (t_derive, findings) = cpu(|| calc::derive(&job, ratings));
    let (t_charts, _) = cpu(|| black_box(charts(&findings)));
    let (t_build, doc) = cpu(|| document(&job, &findings, text));
    let (t_fill, _) = cpu(|| {
        black_box(
            handover::render_template(
                &doc.context,
                &TemplateSource::embedded(handover::EMBEDDED_TEMPLATES),
            )
            .unwrap(),
        )
    });
    [t_decode, t_derive, t_charts, t_build, t_fill]
}

fn summary(jobs: &[(usize, String)], ratings: &RatingsTable) {
    let rounds: usize = std::env::var("AMPREPORT_BENCH_ROUNDS")
        .ok()
        .and_then(|v| v.parse().ok())
        .unwrap_or(5);
    println!();
    println!(
        "processor time per set, µs (median of {rounds} rounds; whole = decode + derive + document build):"
    );
    println!("sets | decode | derive | charts | template fill | document build | whole | whole ms");
    for (sets, text) in jobs {
        let mut per: [Vec<f64>; 6] = Default::default();
        for _ in 0..rounds {
            let t = stages(text, ratings);
            let whole = t[0] + t[1] + t[3];
            for (i, d) in [t[0], t[1], t[2], t[4], t[3], whole].iter().enumerate() {
                per[i].push(d.as_secs_f64() * 1e6 / *sets as f64);
            }
        }
        let m: Vec<f64> = per.into_iter().map(median).collect();
        println!(
            "{sets} | {:.0} | {:.0} | {:.0} | {:.0} | {:.0} | {:.0} | {:.1}",
            m[0],
            m[1],
            m[2],
            m[3],
            m[4],
            m[5],
            m[5] * *sets as f64 / 1000.0
        );
    }
}

fn main() {
    let ratings = RatingsTable::builtin();
    let jobs: Vec<(usize, String)> = SIZES
        .iter()
        .map(|&n| (n, common::generated_job(n)))
        .collect();
    let mut c = Criterion::default()
        .sample_size(10)
        .warm_up_time(Duration::from_secs(1))
        .measurement_time(Duration::from_secs(5))
        .configure_from_args();
    let mut group = c.benchmark_group("document, processor time");
    for (sets, text) in &jobs {
        let job = decode(text, &ratings);
        let findings = calc::derive(&job, &ratings);
        group.bench_with_input(BenchmarkId::new("document build", sets), text, |b, text| {
            b.iter_custom(|iters| {
                (0..iters)
                    .map(|_| cpu(|| black_box(document(&job, &findings, text))).0)
                    .sum()
            })
        });
        group.bench_with_input(BenchmarkId::new("derive", sets), &job, |b, job| {
            b.iter_custom(|iters| {
                (0..iters)
                    .map(|_| cpu(|| black_box(calc::derive(job, &ratings))).0)
                    .sum()
            })
        });
    }
    group.finish();
    c.final_summary();
    summary(&jobs, &ratings);
}
