//! How long the tool takes on the inputs technicians give it: decode plus
//! derive of each demo job, of generated jobs with 100, 1,000 and 10,000
//! measurement lines (the cost per line must stay flat: linear growth), and
//! `ampreport check` on a demo job as a whole process.
//!
//! Targets on the project's 2-core machine: a demo job under 1 ms, the
//! 1,000-line job under 10 ms, the whole `check` process under 20 ms.
//! Run with `cargo bench --bench derive`.

use std::hint::black_box;
use std::process::{Command, Stdio};
use std::time::Duration;

use ampreport::{calc, job, ratings::RatingsTable};
use criterion::{BenchmarkId, Criterion, Throughput, criterion_group, criterion_main};

mod common;

const DEMOS: [(&str, &str); 3] = [
    (
        "combo-el84-cathode",
        include_str!("../jobs/combo-el84-cathode.kdl"),
    ),
    (
        "combo-6v6-fixed",
        include_str!("../jobs/combo-6v6-fixed.kdl"),
    ),
    ("head-el34-quad", include_str!("../jobs/head-el34-quad.kdl")),
];

/// The generated job (a 230 V head with four EL34, `scripts/gen-job.sh`)
/// holding exactly `lines` measurement lines.
fn generated_job(lines: usize) -> String {
    common::generated_job_lines(lines)
}

fn decode_and_derive(name: &str, text: &str, ratings: &RatingsTable) -> calc::Findings {
    let decoded = job::decode_with_ratings(name, text, ratings)
        .unwrap_or_else(|d| panic!("{name} does not decode: {:?}", d.problems));
    calc::derive(&decoded.job, ratings)
}

fn demos(c: &mut Criterion) {
    let ratings = RatingsTable::builtin();
    let mut group = c.benchmark_group("demo job: decode + derive");
    for (name, text) in DEMOS {
        group.bench_function(name, |b| {
            b.iter(|| decode_and_derive(name, black_box(text), &ratings))
        });
    }
    group.finish();
}

/// Where a demo job's time goes: the KDL parser alone, the whole decode
/// (parser, schema, cross-references, valve types), and derive alone.
fn stages(c: &mut Criterion) {
    let ratings = RatingsTable::builtin();
    let (name, text) = DEMOS[0];
    let decoded = job::decode_with_ratings(name, text, &ratings).expect("demo decodes");
    let mut group = c.benchmark_group("demo job stages");
    group.bench_function("KDL parse", |b| {
        b.iter(|| ampreport::kdl_fast::parse_document(black_box(text)).expect("parses"))
    });
    group.bench_function("decode", |b| {
        b.iter(|| job::decode_with_ratings(name, black_box(text), &ratings).expect("decodes"))
    });
    group.bench_function("derive", |b| {
        b.iter(|| calc::derive(black_box(&decoded.job), &ratings))
    });
    // Every command that reads a job first builds the ratings table from
    // its embedded KDL file.
    group.bench_function("built-in ratings table", |b| b.iter(RatingsTable::builtin));
    group.finish();
}

fn generated(c: &mut Criterion) {
    let ratings = RatingsTable::builtin();
    let mut group = c.benchmark_group("generated job: decode + derive");
    group
        .sample_size(20)
        .measurement_time(Duration::from_secs(4));
    for lines in [100, 1_000, 10_000] {
        let text = generated_job(lines);
        // The generated job is valid and derives a figure for every valve line.
        let findings = decode_and_derive("generated.kdl", &text, &ratings);
        let valve_lines: usize = findings.sets.iter().map(|s| s.valves.len()).sum();
        assert_eq!(
            valve_lines,
            text.lines()
                .filter(|l| l.trim_start().starts_with("valve V") && l.contains("plate="))
                .count()
        );
        // Throughput in measurement lines: flat elements/s across sizes means linear cost.
        group.throughput(Throughput::Elements(lines as u64));
        group.bench_with_input(BenchmarkId::from_parameter(lines), &text, |b, text| {
            b.iter(|| decode_and_derive("generated.kdl", black_box(text), &ratings))
        });
    }
    group.finish();

    // The KDL parser alone on the same texts, to tell its share apart.
    let mut group = c.benchmark_group("generated job: KDL parse only");
    group
        .sample_size(10)
        .measurement_time(Duration::from_secs(3));
    for lines in [100, 1_000, 10_000] {
        let text = generated_job(lines);
        group.throughput(Throughput::Elements(lines as u64));
        group.bench_with_input(BenchmarkId::from_parameter(lines), &text, |b, text| {
            b.iter(|| ampreport::kdl_fast::parse_document(black_box(text)).expect("parses"))
        });
    }
    group.finish();

    // The whole decode (parser included) without derive.
    let mut group = c.benchmark_group("generated job: decode only");
    group
        .sample_size(10)
        .measurement_time(Duration::from_secs(3));
    for lines in [100, 1_000, 10_000] {
        let text = generated_job(lines);
        group.throughput(Throughput::Elements(lines as u64));
        group.bench_with_input(BenchmarkId::from_parameter(lines), &text, |b, text| {
            b.iter(|| {
                job::decode_with_ratings("generated.kdl", black_box(text), &ratings)
                    .expect("decodes")
            })
        });
    }
    group.finish();

    // Derive alone, on the decoded jobs.
    let mut group = c.benchmark_group("generated job: derive only");
    group
        .sample_size(10)
        .measurement_time(Duration::from_secs(3));
    for lines in [100, 1_000, 10_000] {
        let text = generated_job(lines);
        let decoded = job::decode_with_ratings("generated.kdl", &text, &ratings).expect("decodes");
        group.throughput(Throughput::Elements(lines as u64));
        group.bench_with_input(
            BenchmarkId::from_parameter(lines),
            &decoded.job,
            |b, job| b.iter(|| calc::derive(black_box(job), &ratings)),
        );
    }
    group.finish();
}

fn whole_process(c: &mut Criterion) {
    let bin = env!("CARGO_BIN_EXE_ampreport");
    let job = concat!(env!("CARGO_MANIFEST_DIR"), "/jobs/combo-el84-cathode.kdl");
    let run = || {
        let status = Command::new(bin)
            .args(["check", job])
            .stdout(Stdio::null())
            .stderr(Stdio::null())
            .status()
            .expect("ampreport runs");
        assert!(status.success());
    };
    run();
    let mut group = c.benchmark_group("whole process");
    group.sample_size(30);
    group.bench_function("ampreport check combo-el84-cathode.kdl", |b| b.iter(run));
    group.finish();
}

criterion_group!(benches, demos, stages, generated, whole_process);
criterion_main!(benches);
