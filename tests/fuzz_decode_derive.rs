//! The decode + derive fuzz target, run without nightly: proptest picks
//! the seeds of generated and edited job files (see `fuzz_support`), and
//! every file kept in `tests/fuzz-corpus/` is checked on each run. The same
//! body runs under cargo-fuzz (`fuzz/`) and in the long run:
//!
//! ```sh
//! FUZZ_CASES=1000000 cargo test --release --test fuzz_decode_derive -- --ignored --nocapture
//! ```
//!
//! which counts panics, unsound outputs and runs over one second, and keeps
//! each failing file under `target/fuzz-found/` (add it to the corpus).

mod fuzz_support;

use std::path::{Path, PathBuf};
use std::time::{Duration, Instant};

use fuzz_support::{check_job_text, generated_job};
use proptest::prelude::*;

fn corpus() -> Vec<PathBuf> {
    let dir = Path::new(env!("CARGO_MANIFEST_DIR")).join("tests/fuzz-corpus");
    let mut files: Vec<PathBuf> = std::fs::read_dir(dir)
        .expect("tests/fuzz-corpus exists")
        .map(|e| e.expect("entry").path())
        // `.txt`, not `.kdl`: most are broken on purpose, and every `.kdl`
        // file of the repository must be valid KDL (tests/kdl_differential.rs).
        .filter(|p| p.extension().is_some_and(|e| e == "txt"))
        .collect();
    files.sort();
    files
}

/// Writes the job file of seed FUZZ_SEED to FUZZ_WRITE, to look at a case.
#[test]
#[ignore]
fn write_case() {
    let seed: u64 = std::env::var("FUZZ_SEED")
        .ok()
        .and_then(|v| v.parse().ok())
        .unwrap_or(0);
    let path = std::env::var("FUZZ_WRITE").unwrap_or_else(|_| "case.kdl".into());
    std::fs::write(path, generated_job(seed)).expect("write the case");
}

/// Each file found by an earlier run: sound output, and quick.
#[test]
fn every_corpus_file_gives_sound_output() {
    let files = corpus();
    assert!(!files.is_empty(), "the corpus holds the cases found so far");
    for path in files {
        let bytes = std::fs::read(&path).expect("read corpus file");
        let text = String::from_utf8_lossy(&bytes);
        if let Err(e) = check_job_text(&text, true) {
            panic!("{}: {e}", path.display());
        }
    }
}

proptest! {
    #![proptest_config(ProptestConfig {
        cases: std::env::var("PROPTEST_CASES").ok().and_then(|v| v.parse().ok()).unwrap_or(96),
        failure_persistence: None,
        ..ProptestConfig::default()
    })]

    /// The short run that CI does: generated and edited job files, every
    /// eighth also built into the document's Typst source and charts.
    #[test]
    fn generated_job_files_give_sound_output(seed in any::<u64>()) {
        let text = generated_job(seed);
        check_job_text(&text, seed % 8 == 0)
            .map_err(|e| TestCaseError::fail(format!("seed {seed}: {e}")))?;
    }
}

/// The long run (not part of `cargo test`): `FUZZ_CASES` files from seed
/// `FUZZ_SEED` on, every `FUZZ_SOURCE_EVERY`th also built into Typst
/// source. Prints its figures; fails if any case panicked, gave unsound
/// output or took over a second.
#[test]
#[ignore]
fn long_run() {
    let env = |name: &str, default: u64| {
        std::env::var(name)
            .ok()
            .and_then(|v| v.replace('_', "").parse().ok())
            .unwrap_or(default)
    };
    let cases = env("FUZZ_CASES", 1_000_000);
    let first = env("FUZZ_SEED", 0);
    let source_every = env("FUZZ_SOURCE_EVERY", 100).max(1);
    let found = Path::new(env!("CARGO_MANIFEST_DIR")).join("target/fuzz-found");
    std::panic::set_hook(Box::new(|_| {}));
    let started = Instant::now();
    let (mut derived, mut refused, mut sources) = (0u64, 0u64, 0u64);
    let (mut panics, mut unsound, mut slow) = (0u64, 0u64, 0u64);
    let mut slowest = Duration::ZERO;
    let mut bytes = 0u64;
    // FUZZ_TRACE=1 writes each seed before its case, so a case that
    // aborts the process (a stack overflow) can be found again.
    let trace = std::env::var_os("FUZZ_TRACE").is_some();
    let _ = std::fs::create_dir_all(&found);
    for seed in first..first + cases {
        if trace {
            let _ = std::fs::write(found.join("current-seed"), seed.to_string());
        }
        let text = generated_job(seed);
        bytes += text.len() as u64;
        let build = seed % source_every == 0;
        let t = Instant::now();
        let result = std::panic::catch_unwind(|| check_job_text(&text, build));
        let took = t.elapsed();
        slowest = slowest.max(took);
        let failure = match result {
            Err(_) => {
                panics += 1;
                Some("panic".to_string())
            }
            Ok(Err(e)) => {
                unsound += 1;
                Some(e)
            }
            Ok(Ok(outcome)) => {
                if outcome.derived {
                    derived += 1;
                } else {
                    refused += 1;
                }
                sources += u64::from(outcome.built_source);
                None
            }
        };
        let failure = failure.or_else(|| {
            (took > Duration::from_secs(1)).then(|| {
                slow += 1;
                format!("took {took:?}")
            })
        });
        if let Some(why) = failure {
            let _ = std::fs::create_dir_all(&found);
            let _ = std::fs::write(found.join(format!("{seed}.kdl")), &text);
            eprintln!("seed {seed}: {why}");
        }
        if (seed - first + 1) % 50_000 == 0 {
            eprintln!(
                "{} cases, {:?}: {derived} derived, {refused} refused, {panics} panics, {unsound} unsound, {slow} over 1 s",
                seed - first + 1,
                started.elapsed()
            );
        }
    }
    let _ = std::panic::take_hook();
    println!(
        "long run: {cases} job files from seed {first} ({} MB), {derived} derived, {refused} refused with errors, \
         {sources} also built into Typst source; {panics} panics, {unsound} unsound outputs, \
         {slow} over 1 s (slowest {slowest:?}); {:?} in all",
        bytes / 1_000_000,
        started.elapsed()
    );
    assert_eq!((panics, unsound, slow), (0, 0, 0));
}
