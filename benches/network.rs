//! How long the network solver takes: a 30-node network (a long RC ladder
//! with bridging capacitors, an inductor and a pot, so the matrix is not
//! merely tridiagonal) swept over 400 log-spaced points, from resolving the
//! network to the last solve; and a whole mod's network worked out (the
//! document's sweep, corners, scoop and the phase-shift search).
//!
//! Target on the project's 2-core machine: the 400-point sweep of the
//! 30-node network under 5 ms. The same sweep through nalgebra's dense LU
//! (the reference the solver is held to) is measured beside it. Run with `cargo bench --bench network`;
//! the figure is recorded in docs/performance.md.

use std::hint::black_box;

use ampreport::calc::network::{self, Solver, State, log_sweep};
use ampreport::job;
use ampreport::ratings::RatingsTable;
use criterion::{Criterion, criterion_group, criterion_main};

/// A job whose one mod has a network of `nodes` nodes besides ground.
pub fn job_with_network(nodes: usize) -> String {
    let mut net = String::from("source node=n0 impedance=\"38k\"\n");
    net += &format!("load node=n{} resistance=\"1M\"\n", nodes - 1);
    for k in 1..nodes {
        net += &format!(
            "resistor R{k} value=\"{}k\" from=n{} to=n{k}\n",
            10 + k,
            k - 1
        );
        net += &format!(
            "capacitor C{k} value=\"{}n\" from=n{k} to=ground\n",
            1 + k % 7
        );
        if k >= 2 && k % 3 == 0 {
            net += &format!("capacitor CB{k} value=\"470p\" from=n{} to=n{k}\n", k - 2);
        }
    }
    net += "inductor L1 value=\"2H\" from=n5 to=ground\n";
    net += "pot VR1 value=\"250k\" taper=audio ccw=ground wiper=n10 cw=n12 setting=\"3 7\"\n";
    net += "oscillator\n";
    format!(
        r#"job-format 1
job id="BENCH-NET"
unit make="Benchmark" model="Network"
mains nominal="230V"
mods {{
    mod "generated network" {{
        network {{
{net}
        }}
    }}
}}
"#
    )
}

fn benches(c: &mut Criterion) {
    let ratings = RatingsTable::builtin();
    let text = job_with_network(30);
    let job = job::decode_with_ratings("bench.kdl", &text, &ratings)
        .expect("the generated network decodes")
        .job;
    let net = job.mods[0].network.as_ref().unwrap();
    // 3 decades at 133 points per decade: 400 points from 20 Hz to 20 kHz.
    let freqs = log_sweep(20.0, 20_000.0, 133);
    assert_eq!(freqs.len(), 400);
    let (probe, _) = network::resolve_state(net, State::Before, 0, &job, &ratings).unwrap();
    assert_eq!(probe.nodes.len(), 31, "30 nodes besides ground");

    c.bench_function("network/30 nodes, 400 points", |b| {
        b.iter(|| {
            let (resolved, _) =
                network::resolve_state(net, State::Before, 0, &job, &ratings).unwrap();
            let solver = Solver::new(&resolved);
            let mut acc = 0.0;
            for &f in &freqs {
                acc += solver.response(black_box(f)).unwrap().norm();
            }
            black_box(acc)
        })
    });
    c.bench_function(
        "network/30 nodes, 400 points, nalgebra dense LU (reference)",
        |b| {
            b.iter(|| {
                let (resolved, _) =
                    network::resolve_state(net, State::Before, 0, &job, &ratings).unwrap();
                let solver = Solver::new(&resolved);
                let mut acc = 0.0;
                for &f in &freqs {
                    acc += solver.response_reference(black_box(f)).unwrap().norm();
                }
                black_box(acc)
            })
        },
    );
    c.bench_function(
        "network/30 nodes, whole mod (2 settings, corners, 180° search)",
        |b| b.iter(|| black_box(network::derive(net, &job, &ratings))),
    );
}

/// The thread's own CPU time, which a busy shared machine does not inflate
/// the way it inflates wall-clock time.
fn thread_cpu_seconds() -> f64 {
    let mut t = libc::timespec {
        tv_sec: 0,
        tv_nsec: 0,
    };
    // SAFETY: clock_gettime writes one timespec through a valid pointer.
    unsafe { libc::clock_gettime(libc::CLOCK_THREAD_CPUTIME_ID, &mut t) };
    t.tv_sec as f64 + t.tv_nsec as f64 * 1e-9
}

/// Prints the CPU time per 400-point sweep of the 30-node network, solver
/// and reference, averaged over many sweeps.
fn cpu_time(_: &mut Criterion) {
    let ratings = RatingsTable::builtin();
    let text = job_with_network(30);
    let job = job::decode_with_ratings("bench.kdl", &text, &ratings)
        .unwrap()
        .job;
    let net = job.mods[0].network.as_ref().unwrap();
    let freqs = log_sweep(20.0, 20_000.0, 133);
    let (resolved, _) = network::resolve_state(net, State::Before, 0, &job, &ratings).unwrap();
    let solver = Solver::new(&resolved);
    for (name, reference) in [("solver", false), ("nalgebra dense LU", true)] {
        let runs = if reference { 20 } else { 100 };
        let start = thread_cpu_seconds();
        for _ in 0..runs {
            for &f in &freqs {
                let h = if reference {
                    solver.response_reference(black_box(f))
                } else {
                    solver.response(black_box(f))
                };
                black_box(h.unwrap());
            }
        }
        let per = (thread_cpu_seconds() - start) / f64::from(runs);
        println!(
            "network/30 nodes, 400 points, {name}: {:.3} ms of CPU time per sweep",
            per * 1e3
        );
    }
}

criterion_group!(network_benches, benches, cpu_time);
criterion_main!(network_benches);
