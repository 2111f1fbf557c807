//! A misbehaving typst and an interrupted render: a typst that crashes,
//! hangs, floods its output, or says it succeeded while writing nothing or
//! half a file never replaces the good PDF, is stopped at `--timeout`, and
//! is named as the one at fault; SIGINT, SIGTERM and `kill -9` never leave a
//! partial file, and whatever a killed run leaves is cleaned up by the next
//! one. A template that hides the mains-safety notice is refused. Stand-in
//! typst scripts make the timing deterministic.

#![cfg(unix)]

mod support;

use std::os::unix::process::ExitStatusExt;
use std::path::Path;
use std::time::{Duration, Instant};

use support::{NOTICE_PHRASES, Scene, real_typst, says, stderr};

/// Runs a render with a stand-in typst whose compile runs `body`, and
/// checks that it failed with status 3, left the folder and the good PDF as
/// they were and left no typesetting folder behind; returns stderr.
fn failing_render(scene: &Scene, body: &str, extra: &[&str]) -> String {
    let typst = scene.fake_typst("bad-typst", body);
    let before = scene.listing();
    let out = scene.render(&typst, extra);
    let err = stderr(&out);
    assert_eq!(out.status.code(), Some(3), "{err}");
    assert!(scene.pdf_is_the_good_old_one(), "{err}");
    assert_eq!(scene.listing(), before, "{err}");
    assert!(
        !scene
            .temp_listing()
            .iter()
            .any(|n| n.starts_with("ampreport-typeset-")),
        "{:?}",
        scene.temp_listing()
    );
    assert!(says(&err, "was left as it was"), "{err}");
    err
}

#[test]
fn a_typst_that_lies_about_success_is_named_and_replaces_nothing() {
    let scene = Scene::new();
    let real = scene.bin.join("real.pdf");
    let bytes = support::pdf_with_text(NOTICE_PHRASES);
    std::fs::write(&real, &bytes).unwrap();
    let cases = [
        ("exit 0", "reported success but wrote no file"),
        (
            "printf '%%PDF-1.7\\n' > \"$out\"",
            "reported success but wrote an incomplete file",
        ),
        (
            &format!(
                "head -c {} '{}' > \"$out\"",
                bytes.len() * 2 / 3,
                real.display()
            ),
            "wrote an incomplete file",
        ),
        (
            "printf '<html>not a pdf</html>' > \"$out\"",
            "does not start like a PDF",
        ),
    ];
    let kept_folders = || -> std::collections::BTreeSet<String> {
        scene
            .temp_listing()
            .into_iter()
            .filter(|n| n.starts_with("ampreport-source-"))
            .collect()
    };
    for (body, words) in cases {
        let before = kept_folders();
        let err = failing_render(&scene, body, &[]);
        assert!(says(&err, words), "{body}: {err}");
        assert!(says(&err, "the typst program"), "{body}: {err}");
        assert!(says(&err, "not at the job"), "{body}: {err}");
        assert!(!says(&err, "fault in ampreport"), "{body}: {err}");
        // The source typst was given is kept whole for inspection,
        // without the fonts (a long document's, removed beside the
        // check, is written again: the test after this one).
        let new: Vec<String> = kept_folders().difference(&before).cloned().collect();
        assert_eq!(new.len(), 1, "{body}: {new:?}");
        let kept = scene.tmp.join(&new[0]);
        let main = std::fs::read_to_string(kept.join("main.typ")).unwrap();
        assert!(main.contains("mains-safety.typ"), "{body}: {main}");
        assert!(kept.join("mains-safety.typ").is_file(), "{body}");
        assert!(!kept.join("fonts").exists(), "{body}");
    }
}

/// A long document's source is removed beside the PDF's check; when the
/// check fails it is kept all the same, every file of it, written again.
#[test]
fn a_long_documents_source_is_kept_whole_after_a_failed_check() {
    let scene = Scene::new();
    // 140 sets: 36 charts, so the sandbox holds more than 32 files.
    let generated = std::process::Command::new("bash")
        .arg(support::repo().join("scripts/gen-job.sh"))
        .arg("140")
        .output()
        .unwrap();
    assert!(generated.status.success());
    std::fs::write(&scene.job, &generated.stdout).unwrap();
    for body in [
        "printf '%%PDF-1.7\\n%%%%EOF\\n' > \"$out\"",
        &format!(
            "cp '{}' \"$out\"",
            scene.bin.join("no-notice.pdf").display()
        ),
    ] {
        std::fs::write(
            scene.bin.join("no-notice.pdf"),
            support::pdf_with_text(&["a page without the notice"]),
        )
        .unwrap();
        let before: std::collections::BTreeSet<String> = scene.temp_listing();
        let err = failing_render(&scene, body, &[]);
        assert!(says(&err, "kept"), "{body}: {err}");
        let new: Vec<String> = scene
            .temp_listing()
            .difference(&before)
            .filter(|n| n.starts_with("ampreport-source-"))
            .cloned()
            .collect();
        assert_eq!(new.len(), 1, "{body}: {new:?}");
        let kept = scene.tmp.join(&new[0]);
        let main = std::fs::read_to_string(kept.join("main.typ")).unwrap();
        assert!(main.contains("mains-safety.typ"), "{body}");
        let charts = std::fs::read_dir(kept.join("plots")).unwrap().count();
        assert!(charts >= 32, "{body}: {charts} charts kept");
        assert!(!kept.join("fonts").exists(), "{body}");
    }
}

#[test]
fn a_crashing_typst_says_how_it_ended() {
    let scene = Scene::new();
    let cases = [
        ("kill -SEGV $$", "was killed by signal 11 (SIGSEGV)"),
        (
            "echo 'thread main panicked' >&2; exit 101",
            "exited with status 101",
        ),
        ("exit 1", "exited with status 1 and printed no messages"),
    ];
    for (body, words) in cases {
        let err = failing_render(&scene, body, &[]);
        assert!(says(&err, words), "{body}: {err}");
        assert!(says(&err, "not at the job"), "{body}: {err}");
    }
    // A document error (status 1 with typst's reasons) in the built-in
    // template is ampreport's own fault.
    let err = failing_render(
        &scene,
        "echo 'error: unknown variable: oops' >&2; exit 1",
        &[],
    );
    assert!(says(&err, "exited with status 1"), "{err}");
    assert!(says(&err, "unknown variable: oops"), "{err}");
    assert!(says(&err, "fault in ampreport"), "{err}");
    // The failed run's source is kept, under a name no later run removes.
    let kept: Vec<String> = scene
        .temp_listing()
        .into_iter()
        .filter(|n| n.starts_with("ampreport-source-"))
        .collect();
    assert!(!kept.is_empty());
}

#[test]
fn a_flood_of_typst_output_is_cut() {
    let scene = Scene::new();
    // 64 MB on standard error, then a failure.
    let err = failing_render(
        &scene,
        "echo 'error: first words' >&2; head -c 64000000 /dev/zero | tr '\\0' x >&2; exit 1",
        &[],
    );
    assert!(
        says(&err, "error: first words"),
        "{}",
        &err[..200.min(err.len())]
    );
    assert!(says(&err, "more bytes of output not shown"));
    assert!(err.len() < 2_000_000, "{} bytes of errors", err.len());
}

#[test]
fn a_hanging_typst_is_stopped_at_the_time_limit() {
    let scene = Scene::new();
    let pid_file = scene.bin.join("compile.pid");
    let body = format!("echo $$ > '{}'; exec sleep 60", pid_file.display());
    let start = Instant::now();
    let err = failing_render(&scene, &body, &["--timeout", "1"]);
    assert!(start.elapsed() < Duration::from_secs(30));
    assert!(says(&err, "did not finish `compile` within 1 s"), "{err}");
    assert!(says(&err, "--timeout"), "{err}");
    let pid: i32 = std::fs::read_to_string(&pid_file)
        .unwrap()
        .trim()
        .parse()
        .unwrap();
    assert!(support::wait_gone(pid), "typst {pid} still runs");

    // The version check is limited too, here through the environment.
    let hang = scene.bin.join("hang");
    std::fs::write(
        &hang,
        "#!/bin/sh\n[ -n \"$FAKE_TYPST_PROBE\" ] && exit 0\nexec sleep 60\n",
    )
    .unwrap();
    support::make_executable(&hang);
    let start = Instant::now();
    let out = scene
        .render_command(&scene.pdf, &hang, &[])
        .env("AMPREPORT_TIMEOUT", "0.5")
        .output()
        .unwrap();
    assert!(start.elapsed() < Duration::from_secs(30));
    let err = stderr(&out);
    assert_eq!(out.status.code(), Some(3), "{err}");
    assert!(
        says(&err, "did not finish `--version` within 0.5 s"),
        "{err}"
    );
    assert!(scene.pdf_is_the_good_old_one());

    // A nonsense limit is a command-line error.
    for bad in ["0", "-3", "soon", "NaN", "1e9"] {
        let out = scene.render(&hang, &["--timeout", bad]);
        assert_eq!(out.status.code(), Some(2), "{bad}: {}", stderr(&out));
    }
}

/// Starts a render whose typst writes half a PDF into its output, notes its
/// process id and sleeps; returns the running ampreport and typst's pid.
fn start_slow_render(scene: &Scene) -> (support::KilledOnDrop, i32) {
    let pid_file = scene.bin.join("slow.pid");
    let _ = std::fs::remove_file(&pid_file);
    let typst = scene.fake_typst(
        "slow-typst",
        &format!(
            "printf '%%PDF-1.7 half' > \"$out\"; echo $$ > '{p}.new'; mv '{p}.new' '{p}'; exec sleep 60",
            p = pid_file.display()
        ),
    );
    let child = support::KilledOnDrop::spawn(
        scene
            .render_command(&scene.pdf, &typst, &[])
            .stdout(std::process::Stdio::null())
            .stderr(std::process::Stdio::piped()),
    );
    support::wait_for_file(&pid_file);
    let pid = std::fs::read_to_string(&pid_file)
        .unwrap()
        .trim()
        .parse()
        .unwrap();
    (child, pid)
}

fn typesetting_folders(scene: &Scene) -> Vec<String> {
    scene
        .temp_listing()
        .into_iter()
        .filter(|n| n.starts_with("ampreport-"))
        .collect()
}

#[test]
fn sigint_and_sigterm_remove_everything_and_stop_typst() {
    for signal in [libc::SIGINT, libc::SIGTERM, libc::SIGHUP] {
        let scene = Scene::new();
        let before = scene.listing();
        let (mut child, typst_pid) = start_slow_render(&scene);
        // SAFETY: signalling our own child.
        assert_eq!(unsafe { libc::kill(child.id() as i32, signal) }, 0);
        let status = support::wait_with_limit(&mut child, Duration::from_secs(30));
        let mut err = String::new();
        std::io::Read::read_to_string(&mut child.stderr.take().unwrap(), &mut err).unwrap();
        // It ends as the signal would have ended it, so a shell loop stops.
        assert_eq!(status.signal(), Some(signal), "{status:?}: {err}");
        assert!(says(&err, "typst was stopped"), "{err}");
        assert!(scene.pdf_is_the_good_old_one());
        assert_eq!(scene.listing(), before);
        assert!(
            typesetting_folders(&scene).is_empty(),
            "{:?}",
            scene.temp_listing()
        );
        assert!(
            support::wait_gone(typst_pid),
            "typst {typst_pid} still runs"
        );
    }
}

#[test]
fn after_kill_9_the_next_run_cleans_up() {
    let scene = Scene::new();
    let before = scene.listing();
    let (mut child, typst_pid) = start_slow_render(&scene);
    child.kill().unwrap();
    let status = child.wait().unwrap();
    assert_eq!(status.signal(), Some(libc::SIGKILL));
    // typst dies with ampreport; the PDF and its folder are untouched.
    assert!(
        support::wait_gone(typst_pid),
        "typst {typst_pid} still runs"
    );
    assert!(scene.pdf_is_the_good_old_one());
    assert_eq!(scene.listing(), before);
    // A killed run's temporary file beside the output (had it been killed
    // while placing the PDF) and its typesetting folder are left…
    let stale = scene.dir.join(".job.pdf.Ab12Cd.ampreport-part");
    std::fs::write(&stale, "%PDF-1.7 half").unwrap();
    // …while one that a live run holds locked must survive a sweep.
    let live = scene.dir.join(".other.pdf.Xy34Zw.ampreport-part");
    let live_file = std::fs::File::create(&live).unwrap();
    // SAFETY: flock on a descriptor the test owns.
    let locked = unsafe {
        libc::flock(
            std::os::unix::io::AsRawFd::as_raw_fd(&live_file),
            libc::LOCK_EX | libc::LOCK_NB,
        )
    };
    assert_eq!(locked, 0);
    assert!(!typesetting_folders(&scene).is_empty());

    let good = scene.good_typst();
    let out = scene.render(&good, &[]);
    assert!(out.status.success(), "{}", stderr(&out));
    assert!(!scene.pdf_is_the_good_old_one());
    assert!(!stale.exists());
    assert!(live.exists());
    drop(live_file);
    std::fs::remove_file(&live).unwrap();
    // Only the new PDF's manifest (what it was made from) was added.
    let mut with_manifest = before.clone();
    with_manifest.insert(".job.pdf.ampreport-key".to_string());
    assert_eq!(scene.listing(), with_manifest);
    assert!(
        typesetting_folders(&scene).is_empty(),
        "{:?}",
        scene.temp_listing()
    );
}

#[test]
fn a_template_that_hides_the_notice_is_refused() {
    if !real_typst() {
        return;
    }
    let scene = Scene::new();
    let templates = scene.dir.join("templates");
    std::fs::create_dir(&templates).unwrap();
    let hidden = [
        "#if false [\n#include \"mains-safety.typ\"\n]\n",
        "#show <mains-safety>: none\n#include \"mains-safety.typ\"\n",
        "#show \"Local electrical codes come first.\": \"Anything goes.\"\n#include \"mains-safety.typ\"\n",
    ];
    for body in hidden {
        std::fs::write(
            templates.join("handover.typ"),
            format!("{{{{ font_rules }}}}\nShop sheet.\n{body}"),
        )
        .unwrap();
        let before = scene.listing();
        let out = scene.render(
            Path::new("typst"),
            &["--templates", templates.to_str().unwrap()],
        );
        let err = stderr(&out);
        assert_eq!(out.status.code(), Some(1), "{body}: {err}");
        assert!(says(&err, "does not show the mains-safety notice"), "{err}");
        assert!(scene.pdf_is_the_good_old_one());
        assert_eq!(scene.listing(), before);
    }
    // Justified, hyphenated text around it does not break the check.
    std::fs::write(
        templates.join("handover.typ"),
        "{{ font_rules }}\n#set par(justify: true)\n#set text(hyphenate: true, size: 7pt)\n\
         #box(width: 6cm)[\n#include \"mains-safety.typ\"\n]\n",
    )
    .unwrap();
    let out = scene.render(
        Path::new("typst"),
        &["--templates", templates.to_str().unwrap()],
    );
    assert!(out.status.success(), "{}", stderr(&out));
}

#[test]
fn reports_are_read_through_their_wrapping() {
    let report = "  × the typst program /tmp/a-very-long-folder-\n  │ name/bin/bad-typst reported success but\n  │ wrote no file\n  help: try the kept source in /tmp/x/tmp/\n        ampreport-source-j4shCm, or inst\n        all a fresh one\n";
    for words in [
        "the typst program /tmp/a-very-long-folder-name/bin/bad-typst reported",
        "reported success but wrote no file",
        "/tmp/x/tmp/ampreport-source-j4shCm, or install a fresh one",
    ] {
        assert!(says(report, words), "{words}");
    }
    for words in [
        "successbut",
        "wrote nofile",
        "wrote no file at all",
        "reported  success",
        "program/tmp",
        "the typst program wrote",
    ] {
        assert!(!says(report, words), "{words}");
    }
}
