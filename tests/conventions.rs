//! Output conventions, through the real binary: `--color` beside
//! `NO_COLOR`, `--quiet` (errors only) and `--verbose` (what was read from
//! where, the configuration and cache folders of the platform), a job read
//! from standard input with `-` (its diagnostics at `<stdin>:line:column`,
//! the same size and UTF-8 rules as a file), and `render -o -`, which writes
//! the PDF to standard output, byte for byte the PDF `-o FILE` writes, and
//! nothing at all when a check on the PDF fails.

mod support;

use std::io::Write;
use std::path::Path;
use std::process::{Command, Output, Stdio};

use support::{Scene, bin, demo, stderr};

fn stdout(o: &Output) -> String {
    String::from_utf8_lossy(&o.stdout).into_owned()
}

fn ampreport() -> Command {
    let mut c = Command::new(bin());
    c.env_remove("NO_COLOR")
        .env_remove("AMPREPORT_TYPST")
        .env_remove("AMPREPORT_TIMEOUT")
        .env_remove("AMPREPORT_COMPLETE");
    c
}

/// Runs `command` with `input` on its standard input.
fn with_stdin(mut command: Command, input: &[u8]) -> Output {
    let mut child = command
        .stdin(Stdio::piped())
        .stdout(Stdio::piped())
        .stderr(Stdio::piped())
        .spawn()
        .unwrap();
    let mut pipe = child.stdin.take().unwrap();
    let input = input.to_vec();
    // Written from another thread: the program may stop reading early (a
    // stream over the size limit), which must not block the test.
    let writer = std::thread::spawn(move || {
        let _ = pipe.write_all(&input);
    });
    let out = child.wait_with_output().unwrap();
    writer.join().unwrap();
    out
}

/// 1-based line and column of the first `needle` in `text`, worked out
/// here rather than taken from the program.
fn line_col(text: &str, needle: &str) -> (usize, usize) {
    let offset = text.find(needle).expect("needle in text");
    let before = &text[..offset];
    let line = before.matches('\n').count() + 1;
    let start = before.rfind('\n').map_or(0, |i| i + 1);
    (line, before[start..].chars().count() + 1)
}

const ESC: char = '\u{1b}';

/// The demo job with one implausible reading, which is a warning.
fn job_with_a_warning() -> String {
    let text = std::fs::read_to_string(demo("combo-el84-cathode")).unwrap();
    let first = text.find("plate=\"").expect("a plate reading");
    let end = first + text[first + 7..].find('"').unwrap() + 8;
    format!("{}plate=\"1800V\"{}", &text[..first], &text[end..])
}

// ----- colour ----------------------------------------------------------------

#[test]
fn color_always_and_never_beat_the_terminal_test_and_no_color() {
    let job = demo("combo-el84-cathode");
    for no_color in [None, Some("1")] {
        let mut c = ampreport();
        if let Some(v) = no_color {
            c.env("NO_COLOR", v);
        }
        let o = c
            .args(["--color", "always", "check"])
            .arg(&job)
            .output()
            .unwrap();
        assert_eq!(o.status.code(), Some(0), "{}", stderr(&o));
        assert!(
            stdout(&o).contains(ESC),
            "--color always into a pipe, NO_COLOR={no_color:?}: no colour"
        );
    }
    // After the subcommand too: the option is global.
    let o = ampreport()
        .args(["check"])
        .arg(&job)
        .args(["--color=never"])
        .output()
        .unwrap();
    assert!(!stdout(&o).contains(ESC));
    // Diagnostics follow the same option.
    let broken = tempfile::tempdir().unwrap();
    std::fs::write(broken.path().join("b.kdl"), "job-format 1\nunit make=1 {\n").unwrap();
    let o = ampreport()
        .current_dir(broken.path())
        .args(["--color", "always", "check", "b.kdl"])
        .output()
        .unwrap();
    assert_eq!(o.status.code(), Some(1));
    assert!(stderr(&o).contains(ESC), "{}", stderr(&o));
    let o = ampreport()
        .current_dir(broken.path())
        .args(["check", "b.kdl"])
        .output()
        .unwrap();
    assert!(
        !stderr(&o).contains(ESC),
        "auto into a pipe: {}",
        stderr(&o)
    );
    let o = ampreport()
        .args(["--color", "sometimes", "check"])
        .arg(&job)
        .output()
        .unwrap();
    assert_eq!(o.status.code(), Some(2));
}

/// `ampreport ARGS` on a pseudo-terminal through `script` (util-linux);
/// `None` where that cannot be run.
fn on_a_terminal(args: &str) -> Option<String> {
    let o = Command::new("script")
        .args(["-qec", &format!("{} {args}", bin()), "/dev/null"])
        .env_remove("NO_COLOR")
        .output()
        .ok()?;
    o.status
        .success()
        .then(|| String::from_utf8_lossy(&o.stdout).into_owned())
}

#[test]
fn color_never_on_a_terminal_is_plain() {
    let job = demo("combo-el84-cathode");
    let Some(auto) = on_a_terminal(&format!("check {}", job.display())) else {
        eprintln!("note: skipped: `script` cannot give ampreport a terminal here");
        return;
    };
    assert!(auto.contains(ESC), "auto on a terminal is in colour");
    let never = on_a_terminal(&format!("--color never check {}", job.display())).unwrap();
    assert!(
        never.contains("as found") && !never.contains(ESC),
        "{never}"
    );
}

// ----- quiet and verbose ---------------------------------------------------------

#[test]
fn quiet_leaves_errors_only_and_the_summary_still_prints() {
    let dir = tempfile::tempdir().unwrap();
    std::fs::write(dir.path().join("odd.kdl"), job_with_a_warning()).unwrap();
    let loud = ampreport()
        .current_dir(dir.path())
        .args(["check", "odd.kdl"])
        .output()
        .unwrap();
    assert_eq!(loud.status.code(), Some(0), "{}", stderr(&loud));
    assert!(
        stderr(&loud).contains("unusually high"),
        "{}",
        stderr(&loud)
    );
    let quiet = ampreport()
        .current_dir(dir.path())
        .args(["check", "odd.kdl", "--quiet"])
        .output()
        .unwrap();
    assert_eq!(quiet.status.code(), Some(0));
    assert_eq!(stderr(&quiet), "", "--quiet prints no warnings");
    assert_eq!(
        quiet.stdout, loud.stdout,
        "the summary is what was asked for"
    );
    // Errors still show.
    let o = ampreport()
        .current_dir(dir.path())
        .args(["-q", "check", "missing.kdl"])
        .output()
        .unwrap();
    assert_eq!(o.status.code(), Some(1));
    assert!(stderr(&o).contains("missing.kdl"), "{}", stderr(&o));
    // Both at once is a usage error.
    let o = ampreport().args(["-q", "-v", "tubes"]).output().unwrap();
    assert_eq!(o.status.code(), Some(2));
    assert!(stderr(&o).contains("cannot be used with"), "{}", stderr(&o));
}

#[test]
fn quiet_render_prints_nothing_and_still_writes_the_pdf() {
    let scene = Scene::new();
    let typst = scene.good_typst();
    let o = scene.render(&typst, &["--quiet"]);
    assert_eq!(o.status.code(), Some(0), "{}", stderr(&o));
    assert!(
        o.stdout.is_empty() && o.stderr.is_empty(),
        "{}{}",
        stdout(&o),
        stderr(&o)
    );
    assert!(!scene.pdf_is_the_good_old_one(), "the PDF was written");
    // Without --quiet (and --force, as the PDF is now up to date) the
    // "wrote" line is back.
    let o = scene.render(&typst, &["--force"]);
    assert_eq!(stdout(&o), format!("wrote {}\n", scene.pdf.display()));
}

#[test]
fn verbose_says_what_was_read_from_where_and_the_platform_folders() {
    let scene = Scene::new();
    let typst = scene.good_typst();
    let config = scene.root.path().join("config-home");
    let cache = scene.root.path().join("cache-home");
    let ratings = scene.dir.join("shop-ratings.kdl");
    std::fs::write(
        &ratings,
        "ratings-format 1\nvalve EL84 {\n    source \"bench sheet\"\n    plate-dissipation \"12W\"\n}\n",
    )
    .unwrap();
    let shop = scene.dir.join("shop.kdl");
    let init = scene.run(&["init", "--shop", shop.to_str().unwrap()]);
    assert_eq!(init.status.code(), Some(0), "{}", stderr(&init));
    let o = scene
        .render_command(
            &scene.pdf,
            &typst,
            &["--verbose", "--ratings", ratings.to_str().unwrap()],
        )
        .env("XDG_CONFIG_HOME", &config)
        .env("XDG_CACHE_HOME", &cache)
        .output()
        .unwrap();
    assert_eq!(o.status.code(), Some(0), "{}", stderr(&o));
    let err = stderr(&o);
    let fonts = cache
        .join("ampreport")
        .join(ampreport::typeset::font_cache_folder_name());
    for line in [
        format!(
            "read: config folder: {}",
            config.join("ampreport").display()
        ),
        format!("read: cache folder: {}", cache.join("ampreport").display()),
        format!("read: job: {} (", scene.job.display()),
        format!(
            "read: shop profile: {} (beside the job or above it)",
            shop.display()
        ),
        "read: ratings: built in (".to_owned(),
        format!(
            "read: ratings: {} (a shop's ratings file)",
            ratings.display()
        ),
        "read: template: handover.typ (built in".to_owned(),
        format!("read: typst: {} (version 0.15.1)", typst.display()),
        format!("read: fonts: {} (cache)", fonts.display()),
    ] {
        assert!(err.contains(&line), "missing `{line}` in:\n{err}");
    }
    // The fonts really went to the cache folder named.
    assert!(ampreport::typeset::font_cache_is_complete(&fonts));
    // The job's size is the file's.
    let size = std::fs::metadata(&scene.job).unwrap().len();
    assert!(err.contains(&format!("({size} bytes)")), "{err}");
}

#[test]
fn the_platform_folders_follow_xdg_and_ignore_relative_values() {
    let home = tempfile::tempdir().unwrap();
    let o = ampreport()
        .args(["-v", "tubes", "EL84"])
        .env("HOME", home.path())
        .env("XDG_CONFIG_HOME", "relative/config")
        .env("XDG_CACHE_HOME", "relative/cache")
        .output()
        .unwrap();
    assert_eq!(o.status.code(), Some(0), "{}", stderr(&o));
    let err = stderr(&o);
    // A relative value is ignored (XDG base-directory rules): ~/.config.
    for line in [
        format!(
            "read: config folder: {}",
            home.path().join(".config/ampreport").display()
        ),
        format!(
            "read: cache folder: {}",
            home.path().join(".cache/ampreport").display()
        ),
    ] {
        assert!(err.contains(&line), "missing `{line}` in:\n{err}");
    }
    // A job command says when there is no shop profile.
    let dir = tempfile::tempdir().unwrap();
    std::fs::copy(demo("combo-el84-cathode"), dir.path().join("job.kdl")).unwrap();
    let o = ampreport()
        .current_dir(dir.path())
        .args(["check", "job.kdl", "-v"])
        .env("HOME", home.path())
        .output()
        .unwrap();
    assert!(
        stderr(&o).contains("read: shop profile: none (no shop.kdl beside the job"),
        "{}",
        stderr(&o)
    );
    // Where the profile came from, for each way of finding one.
    let config = home.path().join(".config/ampreport");
    std::fs::create_dir_all(&config).unwrap();
    let init = ampreport()
        .arg("init")
        .arg("--shop")
        .arg(config.join("shop.kdl"))
        .output()
        .unwrap();
    assert_eq!(init.status.code(), Some(0), "{}", stderr(&init));
    let named = dir.path().join("other-shop.kdl");
    std::fs::copy(config.join("shop.kdl"), &named).unwrap();
    let says = |extra: &[&str], line: String| {
        let o = ampreport()
            .current_dir(dir.path())
            .args(["check", "job.kdl", "-v"])
            .args(extra)
            .env("HOME", home.path())
            .env_remove("XDG_CONFIG_HOME")
            .output()
            .unwrap();
        assert_eq!(o.status.code(), Some(0), "{extra:?}: {}", stderr(&o));
        assert!(stderr(&o).contains(&line), "`{line}` in:\n{}", stderr(&o));
    };
    says(
        &[],
        format!(
            "read: shop profile: {} (the config folder)",
            config.join("shop.kdl").display()
        ),
    );
    says(
        &["--shop", "other-shop.kdl"],
        "read: shop profile: other-shop.kdl (named with --shop)".to_owned(),
    );
    says(
        &["--no-shop"],
        "read: shop profile: none (--no-shop)".to_owned(),
    );
    // Without --verbose, none of it.
    let o = ampreport().args(["tubes", "EL84"]).output().unwrap();
    assert!(!stderr(&o).contains("read:"), "{}", stderr(&o));
}

// ----- a job on standard input -----------------------------------------------------

#[test]
fn calc_and_check_read_a_job_from_standard_input() {
    let path = demo("combo-el84-cathode");
    let text = std::fs::read(&path).unwrap();
    let from_file = ampreport()
        .args(["calc", "--json"])
        .arg(&path)
        .output()
        .unwrap();
    let from_stdin = {
        let mut c = ampreport();
        c.args(["calc", "--json", "-"]);
        with_stdin(c, &text)
    };
    assert_eq!(from_stdin.status.code(), Some(0), "{}", stderr(&from_stdin));
    let mut a: serde_json::Value = serde_json::from_slice(&from_file.stdout).unwrap();
    let b: serde_json::Value = serde_json::from_slice(&from_stdin.stdout).unwrap();
    assert_eq!(b["job"]["source"], "<stdin>");
    a["job"]["source"] = "<stdin>".into();
    // A job from a pipe has no file git could know; the file's commit, if
    // any, is the one difference.
    assert!(b["job"]["git"].is_null());
    a["job"]["git"] = serde_json::Value::Null;
    assert_eq!(a, b, "the same figures from a pipe as from the file");

    let from_file = ampreport().arg("check").arg(&path).output().unwrap();
    let from_stdin = {
        let mut c = ampreport();
        c.args(["check", "-"]);
        with_stdin(c, &text)
    };
    assert_eq!(from_stdin.status.code(), Some(0), "{}", stderr(&from_stdin));
    assert_eq!(from_stdin.stdout, from_file.stdout);
}

#[test]
fn a_broken_job_on_standard_input_is_reported_at_stdin_line_and_column() {
    let good = std::fs::read_to_string(demo("combo-el84-cathode")).unwrap();
    let broken = good.replacen("cathode=\"11.6V\"", "cathode=\"11.6mA\"", 1);
    assert_ne!(broken, good);
    let mut c = ampreport();
    c.args(["check", "-"]);
    let o = with_stdin(c, broken.as_bytes());
    assert_eq!(o.status.code(), Some(1));
    // The diagnostic points at the unit that does not fit: the `A`.
    let (line, column) = line_col(&broken, "A\"\n");
    let err = stderr(&o);
    assert!(
        err.contains(&format!("<stdin>:{line}:{column}")),
        "expected <stdin>:{line}:{column} in:\n{err}"
    );
    // Not UTF-8: the place of the bad byte.
    let mut bytes = b"job-format 1\njob id=\"A".to_vec();
    bytes.push(0xff);
    bytes.extend_from_slice(b"\"\n");
    let mut c = ampreport();
    c.args(["calc", "--json", "-"]);
    let o = with_stdin(c, &bytes);
    assert_eq!(o.status.code(), Some(1));
    // Line 2, after `job id="A` (9 characters).
    assert!(
        stderr(&o).contains("<stdin>:2:10: the job file is not UTF-8 text (byte 0xff here)"),
        "{}",
        stderr(&o)
    );
    assert!(o.stdout.is_empty());
}

#[test]
fn standard_input_has_the_size_limit_of_a_file() {
    let limit = ampreport::input_file::MAX_INPUT_BYTES as usize;
    let mut big = b"job-format 1\n".to_vec();
    big.resize(limit + 1, b'\n');
    let mut c = ampreport();
    c.args(["check", "-"]);
    let o = with_stdin(c, &big);
    assert_eq!(o.status.code(), Some(1));
    assert!(
        stderr(&o).contains("the job file <stdin> is larger than 16 MiB"),
        "{}",
        stderr(&o)
    );
}

#[test]
fn render_from_standard_input_needs_an_output() {
    let text = std::fs::read(demo("combo-el84-cathode")).unwrap();
    let dir = tempfile::tempdir().unwrap();
    let mut c = ampreport();
    c.current_dir(dir.path()).args(["render", "-"]);
    let o = with_stdin(c, &text);
    assert_eq!(o.status.code(), Some(2), "{}", stderr(&o));
    assert!(
        stderr(&o).contains("name the output with `-o FILE`"),
        "{}",
        stderr(&o)
    );
    assert_eq!(std::fs::read_dir(dir.path()).unwrap().count(), 0);
}

// ----- the PDF on standard output --------------------------------------------------

#[test]
fn render_to_standard_output_is_byte_identical_to_the_file() {
    if !support::real_typst() {
        return;
    }
    let scene = Scene::new();
    let typst = Path::new("typst");
    let file = scene.render(typst, &[]);
    assert_eq!(file.status.code(), Some(0), "{}", stderr(&file));
    let written = std::fs::read(&scene.pdf).unwrap();
    let before = scene.listing();
    let piped = scene.render_to(Path::new("-"), typst, &[]);
    assert_eq!(piped.status.code(), Some(0), "{}", stderr(&piped));
    assert!(
        piped.stdout.starts_with(b"%PDF-"),
        "a PDF on standard output"
    );
    assert!(
        piped.stdout == written,
        "`-o -` gave {} bytes, `-o FILE` {} bytes, not the same",
        piped.stdout.len(),
        written.len()
    );
    assert_eq!(scene.listing(), before, "no file named `-` or other left");
    assert!(!stderr(&piped).contains("wrote"), "{}", stderr(&piped));
    // From standard input to standard output.
    let text = std::fs::read(&scene.job).unwrap();
    let mut c = scene.command(&["render", "-", "-o", "-", "--typst", "typst"]);
    c.current_dir(&scene.dir);
    let o = with_stdin(c, &text);
    assert_eq!(o.status.code(), Some(0), "{}", stderr(&o));
    // The document shows the job's contents and checksum, not its file
    // name, so it is the same PDF again.
    assert!(o.stdout == written, "from standard input: not the same PDF");
}

#[test]
fn nothing_reaches_standard_output_when_a_pdf_check_fails() {
    let scene = Scene::new();
    // A PDF without the mains-safety notice, and half a PDF.
    let no_notice = scene.bin.join("plain.pdf");
    std::fs::write(&no_notice, support::pdf_with_text(&["no cautions here"])).unwrap();
    let cases = [
        scene.fake_typst(
            "no-notice",
            &format!("cp '{}' \"$out\"", no_notice.display()),
        ),
        scene.fake_typst("half", "printf '%%PDF-1.7\\n1 0 obj' > \"$out\""),
    ];
    for typst in cases {
        let o = scene.render_to(Path::new("-"), &typst, &[]);
        assert_eq!(o.status.code(), Some(3), "{}", stderr(&o));
        assert!(
            o.stdout.is_empty(),
            "{} bytes on standard output",
            o.stdout.len()
        );
    }
    // And nothing else: a good run puts the PDF alone there.
    let good = scene.good_typst();
    let o = scene.render_to(Path::new("-"), &good, &["--verbose"]);
    assert_eq!(o.status.code(), Some(0), "{}", stderr(&o));
    assert_eq!(
        o.stdout,
        support::pdf_with_text(support::NOTICE_PHRASES),
        "exactly the PDF typst wrote"
    );
    assert!(stderr(&o).contains("wrote the PDF to standard output"));
}

#[test]
fn a_file_named_dash_is_written_as_dot_slash_dash() {
    let scene = Scene::new();
    let good = scene.good_typst();
    let o = scene
        .render_command(Path::new("./-"), &good, &[])
        .current_dir(&scene.dir)
        .output()
        .unwrap();
    assert_eq!(o.status.code(), Some(0), "{}", stderr(&o));
    assert!(o.stdout.starts_with(b"wrote ./-"));
    assert!(scene.dir.join("-").is_file());
}

#[test]
fn the_pdf_is_not_sent_to_a_terminal() {
    let scene = Scene::new();
    let good = scene.good_typst();
    let command = format!(
        "{} render {} -o - --typst {}; echo status=$?",
        bin(),
        scene.job.display(),
        good.display()
    );
    let Ok(o) = Command::new("script")
        .args(["-qec", &command, "/dev/null"])
        .env("TMPDIR", &scene.tmp)
        .output()
    else {
        eprintln!("note: skipped: `script` is not here");
        return;
    };
    let text = String::from_utf8_lossy(&o.stdout);
    assert!(text.contains("status=2"), "{text}");
    assert!(
        text.contains("standard output, which is a terminal"),
        "{text}"
    );
    assert!(!text.contains("%PDF"), "{text}");
}

#[test]
fn netlist_takes_dash_for_standard_output_and_never_writes_over_its_job() {
    let dir = tempfile::tempdir().unwrap();
    let job = dir.path().join("job.kdl");
    std::fs::copy(demo("combo-6v6-fixed"), &job).unwrap();
    let before = std::fs::read(&job).unwrap();
    // The demo's third mod carries a network.
    let run = |extra: &[&str]| {
        ampreport()
            .current_dir(dir.path())
            .args(["netlist", "job.kdl", "--mod", "3"])
            .args(extra)
            .output()
            .unwrap()
    };
    let plain = run(&[]);
    assert_eq!(plain.status.code(), Some(0), "{}", stderr(&plain));
    assert!(
        stdout(&plain).starts_with("* network"),
        "{}",
        stdout(&plain)
    );
    let dash = run(&["-o", "-"]);
    assert_eq!(dash.stdout, plain.stdout);
    for over in ["job.kdl", "./job.kdl"] {
        let o = run(&["-o", over]);
        assert_eq!(o.status.code(), Some(2), "{over}: {}", stderr(&o));
        assert!(stderr(&o).contains("is the job file"), "{}", stderr(&o));
        assert_eq!(std::fs::read(&job).unwrap(), before, "{over}");
    }
}
