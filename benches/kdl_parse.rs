//! Times the fast KDL parser against the `kdl` crate's parser on a demo job,
//! the built-in ratings file and a generated 1,000-node document, and the
//! job decode and derive that sit on top of it.
//! `cargo bench --bench kdl_parse`.

use std::hint::black_box;

use ampreport::kdl_fast::{fast_tree, parse_fast};
use ampreport::ratings::RatingsTable;
use criterion::{Criterion, Throughput, criterion_group, criterion_main};

const DEMO_JOB: &str = include_str!("../jobs/combo-el84-cathode.kdl");
const RATINGS: &str = include_str!("../ratings/valves.kdl");

/// A job-like document of `n` nodes: measurement lines inside blocks.
fn generated(n: usize) -> String {
    let mut out = String::from("job-format 1\n");
    let mut written = 1;
    let mut block = 0;
    while written < n {
        out.push_str(&format!(
            "measurements \"set {block}\" mains=\"230V\" date=\"2026-11-02\" {{\n"
        ));
        written += 1;
        for i in 0..20 {
            if written >= n {
                break;
            }
            if i % 2 == 0 {
                out.push_str(&format!("    node B+{i} \"{}V\" // reading\n", 300 + i));
            } else {
                out.push_str(&format!(
                    "    valve V{i} plate=\"{}V\" screen=\"334V\" cathode=11.6 grid=#null\n",
                    330 + i
                ));
            }
            written += 1;
        }
        out.push_str("}\n");
        block += 1;
    }
    out
}

fn count_nodes(doc: &kdl::KdlDocument) -> usize {
    doc.nodes()
        .iter()
        .map(|n| 1 + n.children().map_or(0, count_nodes))
        .sum()
}

fn parsers(c: &mut Criterion) {
    let big = generated(1000);
    for (name, text) in [
        ("demo job", DEMO_JOB),
        ("ratings file", RATINGS),
        ("1000 nodes", big.as_str()),
    ] {
        let nodes = parse_fast(text).map_or(0, |d| count_nodes(&d));
        let mut group = c.benchmark_group(format!(
            "kdl parse: {name} ({} bytes, {nodes} nodes)",
            text.len()
        ));
        group.throughput(Throughput::Elements(nodes as u64));
        group.bench_function("fast", |b| {
            b.iter(|| parse_fast(black_box(text)).expect("valid"))
        });
        // The fast parser's own tree, as the job decode reads it.
        group.bench_function("fast tree", |b| {
            b.iter(|| fast_tree(black_box(text)).expect("valid"))
        });
        group.sample_size(30);
        group.bench_function("kdl crate", |b| {
            b.iter(|| kdl::KdlDocument::parse(black_box(text)).expect("valid"))
        });
        group.finish();
    }
}

fn decoding(c: &mut Criterion) {
    let ratings = RatingsTable::builtin();
    let mut group = c.benchmark_group("job");
    group.bench_function("builtin ratings (cached)", |b| {
        b.iter(RatingsTable::builtin)
    });
    group.bench_function("decode demo job", |b| {
        b.iter(|| {
            ampreport::job::decode_with_ratings("demo.kdl", black_box(DEMO_JOB), &ratings)
                .expect("valid")
        })
    });
    group.bench_function("decode + derive demo job", |b| {
        b.iter(|| {
            let decoded =
                ampreport::job::decode_with_ratings("demo.kdl", black_box(DEMO_JOB), &ratings)
                    .expect("valid");
            ampreport::calc::derive(&decoded.job, &ratings)
        })
    });
    group.finish();
}

criterion_group!(benches, parsers, decoding);
criterion_main!(benches);
