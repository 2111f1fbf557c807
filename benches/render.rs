//! How much `ampreport render` adds on top of typst itself, and how much
//! memory the ampreport process needs. Targets (issue 3): the whole render
//! at most 1.15 × a bare `typst compile` of the same document's
//! `--emit-source` folder, and under 100 MB peak memory for ampreport.
//!
//! The two commands are always run alternately, so a slow patch of the
//! machine hits both: the criterion benchmarks interleave a run of the
//! other command before each timed run, and the summary runs them in
//! pairs (AB, BA, AB …) and compares medians. Peak memory is the maximum
//! resident set size `wait4` reports for the ampreport process, measured
//! with a stand-in typst (a shell script) so that typst's own memory, which
//! the kernel folds into its parent's figure, stays out of it.
//!
//! `cargo bench --bench render`; `AMPREPORT_BENCH_PAIRS=N` sets the number
//! of pairs in the summary (default 15). Needs typst on PATH.

mod common;
use common::median;

use std::path::{Path, PathBuf};
use std::process::{Command, Stdio};
use std::time::{Duration, Instant};

use criterion::Criterion;

const BIN: &str = env!("CARGO_BIN_EXE_ampreport");
const JOB: &str = "combo-el84-cathode";

struct Setup {
    _dir: tempfile::TempDir,
    /// A private copy of the binary: the target folder may be shared, and a
    /// build of another branch must not swap it mid-run.
    bin: PathBuf,
    job: PathBuf,
    pdf: PathBuf,
    source: PathBuf,
    typst_pdf: PathBuf,
    timestamp: String,
    stub: PathBuf,
}

impl Setup {
    fn new() -> Setup {
        let dir = tempfile::tempdir().unwrap();
        let bin = dir.path().join("ampreport");
        std::fs::copy(BIN, &bin).expect("copy the binary");
        let job = Path::new(env!("CARGO_MANIFEST_DIR"))
            .join("jobs")
            .join(format!("{JOB}.kdl"));
        let source = dir.path().join("source");
        let pdf = dir.path().join("render.pdf");
        let out = Command::new(&bin)
            .arg("render")
            .arg(&job)
            .arg("-o")
            .arg(&pdf)
            .arg("--emit-source")
            .arg(&source)
            .output()
            .expect("run ampreport");
        assert!(
            out.status.success(),
            "render failed: {}",
            String::from_utf8_lossy(&out.stderr)
        );
        // The command ampreport prints for the emitted folder carries the
        // creation timestamp it used.
        let said = String::from_utf8_lossy(&out.stderr);
        let timestamp = said
            .split("--creation-timestamp ")
            .nth(1)
            .and_then(|s| s.split_whitespace().next())
            .expect("ampreport names the timestamp")
            .to_string();
        // The stand-in copies the real document, which ampreport checks
        // (complete, notice present) as it would typst's own.
        let stub_pdf = dir.path().join("stand-in.pdf");
        std::fs::copy(&pdf, &stub_pdf).expect("keep the first render");
        let stub = dir.path().join("typst-stand-in");
        std::fs::write(
            &stub,
            format!(
                "#!/bin/sh\nif [ \"$1\" = --version ]; then echo 'typst 0.15.1 (stand-in)'; exit 0; fi\n\
                 for a; do out=$a; done\ncp '{}' \"$out\"\n",
                stub_pdf.display()
            ),
        )
        .unwrap();
        make_executable(&stub);
        let typst_pdf = dir.path().join("typst.pdf");
        Setup {
            bin,
            job,
            pdf,
            typst_pdf,
            source,
            timestamp,
            stub,
            _dir: dir,
        }
    }

    fn ampreport(&self) -> Command {
        let mut cmd = Command::new(&self.bin);
        cmd.arg("render").arg(&self.job).arg("-o").arg(&self.pdf);
        cmd
    }

    fn typst(&self) -> Command {
        let root = self.source.to_str().unwrap();
        let mut cmd = Command::new("typst");
        cmd.args([
            "compile",
            "--root",
            root,
            "--font-path",
            &format!("{root}/fonts"),
        ])
        .args(["--ignore-system-fonts", "--ignore-embedded-fonts"])
        .args([
            "--creation-timestamp",
            &self.timestamp,
            "--pdf-standard",
            "a-2b",
        ])
        .arg(self.source.join("main.typ"))
        .arg(&self.typst_pdf);
        cmd
    }
}

#[cfg(unix)]
fn make_executable(path: &Path) {
    use std::os::unix::fs::PermissionsExt;
    std::fs::set_permissions(path, std::fs::Permissions::from_mode(0o755)).unwrap();
}

/// Runs `cmd` to the end; returns its wall time and the peak resident set
/// size `wait4` reports for it, in kilobytes.
fn run(mut cmd: Command) -> (Duration, i64) {
    let log = tempfile::tempfile().unwrap();
    let start = Instant::now();
    let child = cmd
        .stdout(Stdio::null())
        .stderr(log.try_clone().unwrap())
        .spawn()
        .expect("spawn");
    let pid = child.id() as libc::pid_t;
    let mut status = 0;
    // SAFETY: an all-zero rusage is a valid value for wait4 to fill in.
    let mut usage: libc::rusage = unsafe { std::mem::zeroed() };
    // SAFETY: `pid` is our own child, not yet waited for; both pointers
    // point to live locals.
    let waited = unsafe { libc::wait4(pid, &mut status, 0, &mut usage) };
    let elapsed = start.elapsed();
    assert_eq!(waited, pid, "wait4 failed");
    if !(libc::WIFEXITED(status) && libc::WEXITSTATUS(status) == 0) {
        use std::io::{Read, Seek};
        let mut log = log;
        let mut said = String::new();
        log.rewind().unwrap();
        log.read_to_string(&mut said).unwrap();
        panic!("command failed ({status}): {cmd:?}\n{said}");
    }
    drop(child);
    (elapsed, usage.ru_maxrss)
}

/// The closing summary: paired runs, ratio of medians, peak memory.
fn summary(setup: &Setup) {
    let pairs: usize = std::env::var("AMPREPORT_BENCH_PAIRS")
        .ok()
        .and_then(|v| v.parse().ok())
        .unwrap_or(15);
    // One untimed run of each to warm the caches.
    run(setup.ampreport());
    run(setup.typst());
    let (mut ours, mut theirs) = (Vec::new(), Vec::new());
    for i in 0..pairs {
        if i % 2 == 0 {
            ours.push(run(setup.ampreport()).0.as_secs_f64());
            theirs.push(run(setup.typst()).0.as_secs_f64());
        } else {
            theirs.push(run(setup.typst()).0.as_secs_f64());
            ours.push(run(setup.ampreport()).0.as_secs_f64());
        }
    }
    let (a, t) = (median(ours.clone()), median(theirs.clone()));
    let mut own_peak = 0;
    for _ in 0..5 {
        let mut cmd = setup.ampreport();
        cmd.arg("--typst").arg(&setup.stub);
        own_peak = own_peak.max(run(cmd).1);
    }
    let tree_peak = run(setup.ampreport()).1;
    println!();
    println!("render summary ({pairs} alternating pairs, job {JOB}):");
    println!(
        "  ampreport render      median {:7.1} ms  (min {:.1} ms)",
        a * 1e3,
        ours.iter().copied().fold(f64::INFINITY, f64::min) * 1e3
    );
    println!(
        "  typst compile alone   median {:7.1} ms  (min {:.1} ms)",
        t * 1e3,
        theirs.iter().copied().fold(f64::INFINITY, f64::min) * 1e3
    );
    println!(
        "  ratio                 {:.3}  (target at most 1.15)",
        a / t
    );
    println!(
        "  ampreport peak memory {:.1} MB  (target under 100 MB; with a stand-in typst)",
        own_peak as f64 / 1024.0
    );
    println!(
        "  peak of ampreport and the typst it runs {:.1} MB",
        tree_peak as f64 / 1024.0
    );
}

fn main() {
    let setup = Setup::new();
    let mut c = Criterion::default()
        .sample_size(10)
        .warm_up_time(Duration::from_secs(1))
        .measurement_time(Duration::from_secs(8))
        .configure_from_args();
    let mut group = c.benchmark_group("render");
    group.bench_function("ampreport render (alternating)", |b| {
        b.iter_custom(|iters| {
            let mut total = Duration::ZERO;
            for _ in 0..iters {
                run(setup.typst());
                total += run(setup.ampreport()).0;
            }
            total
        })
    });
    group.bench_function("typst compile of --emit-source (alternating)", |b| {
        b.iter_custom(|iters| {
            let mut total = Duration::ZERO;
            for _ in 0..iters {
                run(setup.ampreport());
                total += run(setup.typst()).0;
            }
            total
        })
    });
    group.finish();
    c.final_summary();
    summary(&setup);
}
