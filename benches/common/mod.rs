//! Helpers shared by the benches (each bench is its own crate and takes
//! this file in with `mod common;`, and not every bench uses all of it).

#![allow(dead_code)]

/// The median of a sample; the mean of the middle two for an even count.
pub fn median(mut xs: Vec<f64>) -> f64 {
    xs.sort_by(f64::total_cmp);
    let n = xs.len();
    if n % 2 == 1 {
        xs[n / 2]
    } else {
        (xs[n / 2 - 1] + xs[n / 2]) / 2.0
    }
}

/// Measurement lines in each set of the generated job: four nodes, four
/// valves and the heater.
pub const GENERATED_LINES_PER_SET: usize = 9;

/// The generated job of `sets` measurement sets (a 230 V head with four
/// EL34), from `scripts/gen-job.sh`, the one generator of it: perf.sh,
/// the tests and the benches all measure the same job.
pub fn generated_job(sets: usize) -> String {
    let script = concat!(env!("CARGO_MANIFEST_DIR"), "/scripts/gen-job.sh");
    let out = std::process::Command::new("bash")
        .arg(script)
        .arg(sets.to_string())
        .output()
        .expect("run scripts/gen-job.sh");
    assert!(out.status.success(), "gen-job.sh failed");
    String::from_utf8(out.stdout).expect("the job is text")
}

/// The generated job cut to exactly `lines` measurement lines: as many
/// whole sets as that takes, the last one's surplus lines (from its end)
/// left out.
pub fn generated_job_lines(lines: usize) -> String {
    let sets = lines.div_ceil(GENERATED_LINES_PER_SET);
    let text = generated_job(sets);
    let surplus = sets * GENERATED_LINES_PER_SET - lines;
    if surplus == 0 {
        return text;
    }
    let mut all: Vec<&str> = text.lines().collect();
    // The job ends with the last set's closing `}`.
    let close = all.len() - 1;
    assert_eq!(all[close], "}", "the generated job ends with a set");
    all.drain(close - surplus..close);
    all.join("\n") + "\n"
}
