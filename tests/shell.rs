//! How ampreport fits a shell and a system, through the real binary: the
//! completion scripts for bash, zsh, fish, PowerShell and elvish parse
//! and, in the shells installed here, really complete (sourced into the shell, asked
//! for the candidates of a half-typed line); the manual pages render
//! through groff and man without a warning, one per command; `--version`
//! reports the program, the job format, the JSON schema and the typst
//! found, or why there is none, within the typst time limit.

mod support;

use std::path::{Path, PathBuf};
use std::process::{Command, Output};
use std::time::{Duration, Instant};

use clap::CommandFactory;
use support::{bin, make_executable, stderr};

fn ampreport() -> Command {
    let mut c = Command::new(bin());
    c.env_remove("AMPREPORT_TYPST")
        .env_remove("AMPREPORT_TIMEOUT")
        .env_remove("AMPREPORT_COMPLETE");
    c
}

fn stdout(o: &Output) -> String {
    String::from_utf8_lossy(&o.stdout).into_owned()
}

fn ok(o: &Output, what: &str) {
    assert!(
        o.status.success(),
        "{what} failed ({}):\n{}",
        o.status,
        stderr(o)
    );
}

/// True when `tool` runs here; false, with a note, where it is missing,
/// except under CI, whose test script installs it.
fn have(tool: &str) -> bool {
    let found = Command::new("sh")
        .args(["-c", &format!("command -v {tool}")])
        .output()
        .is_ok_and(|o| o.status.success());
    if !found {
        assert!(
            std::env::var_os("CI").is_none(),
            "{tool} is needed under CI (scripts/test.sh installs it)"
        );
        eprintln!("note: skipping the {tool} checks: {tool} is not installed");
    }
    found
}

/// The completion script for `shell`, written to a file in `dir`.
fn script(shell: &str, dir: &Path) -> PathBuf {
    let o = ampreport().args(["completions", shell]).output().unwrap();
    ok(&o, &format!("completions {shell}"));
    assert!(stderr(&o).is_empty(), "{}", stderr(&o));
    let path = dir.join(format!("ampreport.{shell}"));
    std::fs::write(&path, &o.stdout).unwrap();
    path
}

/// A PATH on which `ampreport` is this build's binary, as the scripts
/// call it by name.
fn path_with_binary(dir: &Path) -> std::ffi::OsString {
    let bin_dir = dir.join("bin");
    std::fs::create_dir_all(&bin_dir).unwrap();
    let link = bin_dir.join("ampreport");
    if !link.exists() {
        std::os::unix::fs::symlink(bin(), &link).unwrap();
    }
    let mut parts = vec![bin_dir];
    parts.extend(std::env::split_paths(
        &std::env::var_os("PATH").unwrap_or_default(),
    ));
    std::env::join_paths(parts).unwrap()
}

/// A folder to complete in: two job files, a note, a PDF and a folder.
fn workbench() -> tempfile::TempDir {
    let dir = tempfile::tempdir().unwrap();
    for name in ["bench-a.kdl", "bench-b.kdl", "notes.txt", "old.pdf"] {
        std::fs::write(dir.path().join(name), "x").unwrap();
    }
    std::fs::create_dir(dir.path().join("archive")).unwrap();
    dir
}

/// The valve types and equivalents of the built-in table that start with
/// `prefix` (in any case), from the library itself.
fn builtin_types_starting(prefix: &str) -> Vec<String> {
    let table = ampreport::ratings::RatingsTable::builtin();
    let mut names: Vec<String> = table
        .iter()
        .flat_map(|r| std::iter::once(r.name.clone()).chain(r.equivalents.clone()))
        .filter(|n| n.to_uppercase().starts_with(&prefix.to_uppercase()))
        .collect();
    names.sort();
    names
}

fn sorted(lines: impl IntoIterator<Item = String>) -> Vec<String> {
    let mut v: Vec<String> = lines.into_iter().filter(|l| !l.is_empty()).collect();
    v.sort();
    v
}

/// What the job-file completion must offer in [`workbench`] for an empty
/// word: the job files, the folder, and `-` for standard input; not the
/// note or the PDF.
fn check_job_candidates(got: &[String], shell: &str) {
    for want in ["bench-a.kdl", "bench-b.kdl", "-"] {
        assert!(got.iter().any(|g| g == want), "{shell}: {want} in {got:?}");
    }
    assert!(
        got.iter().any(|g| g.starts_with("archive")),
        "{shell}: the folder in {got:?}"
    );
    for never in ["notes.txt", "old.pdf"] {
        assert!(
            !got.iter().any(|g| g == never),
            "{shell}: {never} in {got:?}"
        );
    }
}

// ----- completions ----------------------------------------------------------

/// Every command a Tab after `ampreport ` must offer, from the command
/// line's own definition (so a new command cannot be left out).
fn subcommands() -> Vec<String> {
    let mut names: Vec<String> = ampreport::cli::args::Cli::command()
        .get_subcommands()
        .filter(|s| !s.is_hide_set())
        .map(|s| s.get_name().to_owned())
        .collect();
    names.sort();
    assert!(names.len() >= 10, "{names:?}");
    names
}

/// Checks that `got`, the candidates a shell offers after `ampreport `,
/// holds every command.
fn check_every_command_offered(got: &[String], shell: &str) {
    for name in subcommands() {
        assert!(
            got.contains(&name),
            "{shell}: `{name}` not offered in {got:?}"
        );
    }
}

#[test]
fn bash_script_parses_and_completes_valve_types_and_job_files() {
    let dir = workbench();
    let script = script("bash", dir.path());
    let o = Command::new("bash")
        .arg("-n")
        .arg(&script)
        .output()
        .unwrap();
    ok(&o, "bash -n");
    // Sourced into bash, asked as bash asks at a Tab: the words, the index.
    let complete = |words: &[&str]| -> Vec<String> {
        let cword = words.len() - 1;
        let quoted: Vec<String> = words.iter().map(|w| format!("'{w}'")).collect();
        let program = format!(
            "source '{}'; COMP_WORDS=({}); COMP_CWORD={cword}; COMP_TYPE=9; \
             _clap_complete_ampreport ampreport '{}' '{}'; printf '%s\\n' \"${{COMPREPLY[@]}}\"",
            script.display(),
            quoted.join(" "),
            words[cword],
            words[cword - 1],
        );
        let o = Command::new("bash")
            .args(["--norc", "-c", &program])
            .current_dir(dir.path())
            .env("PATH", path_with_binary(dir.path()))
            .output()
            .unwrap();
        ok(&o, "bash completion");
        sorted(stdout(&o).lines().map(str::to_owned))
    };
    assert_eq!(
        complete(&["ampreport", "tubes", "EL8"]),
        builtin_types_starting("EL8")
    );
    assert!(builtin_types_starting("EL8").contains(&"EL84".to_owned()));
    assert_eq!(
        complete(&["ampreport", "tubes", "6bq"]),
        builtin_types_starting("6BQ")
    );
    check_job_candidates(&complete(&["ampreport", "check", ""]), "bash");
    assert_eq!(
        complete(&["ampreport", "calc", "bench-"]),
        ["bench-a.kdl", "bench-b.kdl"]
    );
    assert_eq!(complete(&["ampreport", "rend"]), ["render"]);
    check_every_command_offered(&complete(&["ampreport", ""]), "bash");
    assert_eq!(
        complete(&["ampreport", "render", "bench-a.kdl", "-o", "ol"]),
        ["old.pdf"]
    );
    assert_eq!(
        complete(&["ampreport", "--color", ""]),
        ["always", "auto", "never"]
    );
}

#[test]
fn zsh_script_parses_and_completes() {
    if !have("zsh") {
        return;
    }
    let dir = workbench();
    let script = script("zsh", dir.path());
    let o = Command::new("zsh").arg("-n").arg(&script).output().unwrap();
    ok(&o, "zsh -n");
    // The completion system's `compdef` and `_describe` stand in as
    // recorders: the script's own function asks ampreport and hands each
    // group of candidates to `_describe`, whose array is printed.
    let complete = |words: &[&str]| -> Vec<String> {
        let quoted: Vec<String> = words.iter().map(|w| format!("'{w}'")).collect();
        let program = format!(
            "compdef() {{ :; }}; _describe() {{ print -rl -- \"${{(@P)3}}\"; }}; \
             source '{}'; words=({}); CURRENT={}; _clap_dynamic_completer_ampreport",
            script.display(),
            quoted.join(" "),
            words.len(),
        );
        let o = Command::new("zsh")
            .args(["-f", "-c", &program])
            .current_dir(dir.path())
            .env("PATH", path_with_binary(dir.path()))
            .output()
            .unwrap();
        ok(&o, "zsh completion");
        // Entries are `value:help`; a folder comes without its slash.
        sorted(
            stdout(&o)
                .lines()
                .map(|l| l.split(':').next().unwrap_or("").to_owned()),
        )
    };
    assert_eq!(
        complete(&["ampreport", "tubes", "EL8"]),
        builtin_types_starting("EL8")
    );
    check_job_candidates(&complete(&["ampreport", "render", ""]), "zsh");
    check_every_command_offered(&complete(&["ampreport", ""]), "zsh");
}

#[test]
fn fish_script_parses_and_completes() {
    if !have("fish") {
        return;
    }
    let dir = workbench();
    let script = script("fish", dir.path());
    let o = Command::new("fish")
        .arg("-n")
        .arg(&script)
        .output()
        .unwrap();
    ok(&o, "fish -n");
    // fish's own `complete -C LINE` prints what a Tab would offer.
    let complete = |line: &str| -> Vec<String> {
        let o = Command::new("fish")
            .args([
                "--no-config",
                "-c",
                &format!("source '{}'; complete -C '{line}'", script.display()),
            ])
            .current_dir(dir.path())
            .env("PATH", path_with_binary(dir.path()))
            .env("HOME", dir.path())
            .output()
            .unwrap();
        ok(&o, "fish completion");
        sorted(
            stdout(&o)
                .lines()
                .map(|l| l.split('\t').next().unwrap_or("").to_owned()),
        )
    };
    assert_eq!(
        complete("ampreport tubes EL8"),
        builtin_types_starting("EL8")
    );
    check_job_candidates(&complete("ampreport check "), "fish");
    check_every_command_offered(&complete("ampreport "), "fish");
}

/// Checks that a script for a shell not installed here at least closes
/// every bracket and quote it opens.
fn check_balanced(text: &str) {
    for (open, close) in [('{', '}'), ('(', ')'), ('[', ']')] {
        assert_eq!(
            text.matches(open).count(),
            text.matches(close).count(),
            "unbalanced {open}{close}:\n{text}"
        );
    }
    assert_eq!(text.matches('"').count() % 2, 0, "unbalanced quotes");
}

#[test]
fn powershell_script_has_its_shape_and_the_program_answers_it() {
    // PowerShell is not packaged for Debian: the script is checked for its
    // structure, and the program is asked exactly as the script asks.
    let dir = tempfile::tempdir().unwrap();
    let text = std::fs::read_to_string(script("powershell", dir.path())).unwrap();
    assert!(
        text.contains("Register-ArgumentCompleter -Native -CommandName ampreport -ScriptBlock {"),
        "{text}"
    );
    assert!(
        text.contains("$env:AMPREPORT_COMPLETE = \"powershell\";"),
        "{text}"
    );
    assert!(text.contains("& ampreport -- $args"), "{text}");
    check_balanced(&text);
    // `pwsh` is another name for it.
    let alias = ampreport().args(["completions", "pwsh"]).output().unwrap();
    assert_eq!(stdout(&alias), text);
    // The answer: one candidate a line, a tab, its help.
    let ask = |words: &[&str]| -> Vec<String> {
        let o = ampreport()
            .env("AMPREPORT_COMPLETE", "powershell")
            .arg("--")
            .args(words)
            .output()
            .unwrap();
        ok(&o, "powershell completion request");
        stdout(&o).lines().map(str::to_owned).collect()
    };
    let names = |lines: &[String]| {
        sorted(
            lines
                .iter()
                .map(|l| l.split('\t').next().unwrap().to_owned()),
        )
    };
    let lines = ask(&["ampreport", "tubes", "EL8"]);
    assert_eq!(names(&lines), builtin_types_starting("EL8"));
    let el84 = lines.iter().find(|l| l.starts_with("EL84\t")).unwrap();
    assert!(el84.ends_with("output pentode"), "{el84}");
    // After the program's name: every command.
    check_every_command_offered(&names(&ask(&["ampreport", ""])), "powershell");
}

#[test]
fn elvish_script_has_its_shape_and_the_program_answers_it() {
    // elvish is not installed by the test script: the script is checked
    // for its structure, and the program is asked exactly as it asks
    // (the words after `--`, the index of the word being completed, the
    // separator between candidates).
    let dir = workbench();
    let text = std::fs::read_to_string(script("elvish", dir.path())).unwrap();
    assert!(
        text.contains("set edit:completion:arg-completer[ampreport] = { |@words|"),
        "{text}"
    );
    assert!(
        text.contains("_CLAP_COMPLETE_INDEX=(to-string $index) AMPREPORT_COMPLETE=\"elvish\" ampreport -- $@words"),
        "{text}"
    );
    assert!(text.contains("set index = (- $index 1)"), "{text}");
    check_balanced(&text);
    let ask = |words: &[&str]| -> Vec<String> {
        let o = ampreport()
            .current_dir(dir.path())
            .env("AMPREPORT_COMPLETE", "elvish")
            .env("_CLAP_IFS", "\n")
            .env("_CLAP_COMPLETE_INDEX", (words.len() - 1).to_string())
            .arg("--")
            .args(words)
            .output()
            .unwrap();
        ok(&o, "elvish completion request");
        sorted(stdout(&o).lines().map(str::to_owned))
    };
    assert_eq!(
        ask(&["ampreport", "tubes", "EL8"]),
        builtin_types_starting("EL8")
    );
    check_job_candidates(&ask(&["ampreport", "check", ""]), "elvish");
    check_every_command_offered(&ask(&["ampreport", ""]), "elvish");
}

#[test]
fn valve_types_of_a_ratings_file_are_not_offered_and_the_help_says_so() {
    // The engine hands a completer only the word being completed, so a
    // type only a `--ratings` file names cannot be offered: the help and
    // the README say so rather than pretend.
    let dir = workbench();
    let ratings = dir.path().join("shop-ratings.kdl");
    // An invented type, for this test only.
    std::fs::write(
        &ratings,
        "ratings-format 1\nvalve \"QX91\" {\n    class \"output-pentode\"\n    \
         plate-dissipation \"12W\"\n    screen-dissipation \"2W\"\n    \
         plate-voltage \"300V\"\n    screen-voltage \"300V\"\n    \
         cathode-current \"65mA\"\n    heater \"6.3V\" \"0.76A\"\n    \
         source \"invented for a test\"\n}\n",
    )
    .unwrap();
    let shown = ampreport()
        .args(["tubes", "QX91", "--ratings"])
        .arg(&ratings)
        .output()
        .unwrap();
    ok(&shown, "tubes QX91 --ratings");
    let offered = |word: &str| {
        let o = ampreport()
            .env("AMPREPORT_COMPLETE", "powershell")
            .args(["--", "ampreport", "tubes", "--ratings"])
            .arg(&ratings)
            .arg(word)
            .output()
            .unwrap();
        ok(&o, "completion request with --ratings");
        sorted(
            stdout(&o)
                .lines()
                .map(|l| l.split('\t').next().unwrap().to_owned()),
        )
    };
    assert_eq!(offered("EL8"), builtin_types_starting("EL8"));
    assert!(offered("QX").is_empty(), "{:?}", offered("QX"));
    let help = ampreport()
        .args(["completions", "--help"])
        .output()
        .unwrap();
    ok(&help, "completions --help");
    let words = stdout(&help)
        .split_whitespace()
        .collect::<Vec<_>>()
        .join(" ");
    assert!(words.contains("not those a --ratings file adds"), "{words}");
    let readme = std::fs::read_to_string(support::repo().join("README.md")).unwrap();
    assert!(
        readme.contains("not those a `--ratings` file adds"),
        "README"
    );
}

#[test]
fn an_unknown_shell_is_a_usage_error_and_a_stray_complete_variable_is_ignored() {
    let o = ampreport().args(["completions", "tcsh"]).output().unwrap();
    assert_eq!(o.status.code(), Some(2));
    assert!(stderr(&o).contains("possible values"), "{}", stderr(&o));
    // Another tool's variable changes nothing; ampreport's own is its own.
    let o = ampreport()
        .env("COMPLETE", "bash")
        .args(["tubes", "EL84"])
        .output()
        .unwrap();
    ok(&o, "tubes EL84 with COMPLETE set");
    assert!(stdout(&o).starts_with("EL84 ("), "{}", stdout(&o));
}

// ----- manual pages -----------------------------------------------------------

/// Every page `man` must write: the program's and one per subcommand.
fn expected_pages() -> Vec<String> {
    let cmd = ampreport::cli::args::Cli::command();
    let mut pages = vec!["ampreport.1".to_owned()];
    pages.extend(
        cmd.get_subcommands()
            .map(|s| format!("ampreport-{}.1", s.get_name())),
    );
    pages.sort();
    pages
}

#[test]
fn man_pages_one_per_command_render_without_warnings() {
    let dir = tempfile::tempdir().unwrap();
    let o = ampreport().arg("man").arg(dir.path()).output().unwrap();
    ok(&o, "man");
    let mut written = sorted(
        std::fs::read_dir(dir.path())
            .unwrap()
            .map(|e| e.unwrap().file_name().to_string_lossy().into_owned()),
    );
    written.sort();
    assert_eq!(written, expected_pages());
    assert_eq!(stdout(&o).lines().count(), written.len(), "{}", stdout(&o));
    let groff = have("groff");
    let man = have("man");
    let cmd = ampreport::cli::args::Cli::command();
    for page in &written {
        let path = dir.path().join(page);
        if groff {
            // -ww: every warning; -z: no output, only the diagnostics.
            let o = Command::new("groff")
                .args(["-man", "-Tutf8", "-ww", "-z"])
                .arg(&path)
                .output()
                .unwrap();
            ok(&o, &format!("groff {page}"));
            assert!(
                stderr(&o).is_empty(),
                "groff warns on {page}:\n{}",
                stderr(&o)
            );
        }
        if !man {
            continue;
        }
        let o = Command::new("man")
            .args(["--warnings", "-l"])
            .arg(&path)
            .env("MANWIDTH", "100")
            .env_remove("MAN_KEEP_FORMATTING")
            .env("PAGER", "cat")
            .output()
            .unwrap();
        ok(&o, &format!("man -l {page}"));
        assert!(
            stderr(&o).is_empty(),
            "man warns on {page}:\n{}",
            stderr(&o)
        );
        // Every option of the command is on its page, as the reader sees it.
        let text = stdout(&o).replace('\u{2010}', "-").replace("-\n", "-");
        let words: String = text.split_whitespace().collect::<Vec<_>>().join(" ");
        let sub = page
            .strip_prefix("ampreport-")
            .and_then(|p| p.strip_suffix(".1"));
        let command = match sub {
            Some(name) => cmd.find_subcommand(name).unwrap().clone(),
            None => cmd.clone(),
        };
        assert!(
            words.contains("NAME") && words.contains("SYNOPSIS"),
            "{page}"
        );
        for arg in command.get_arguments().filter(|a| !a.is_hide_set()) {
            if let Some(long) = arg.get_long() {
                assert!(
                    words.contains(&format!("--{long}")),
                    "{page} lacks --{long}:\n{words}"
                );
            }
        }
        if sub.is_none() {
            for heading in ["EXIT STATUS", "ENVIRONMENT", "FILES", "SEE ALSO"] {
                assert!(words.contains(heading), "{page} lacks {heading}");
            }
            for s in cmd.get_subcommands() {
                assert!(
                    words.contains(&format!("ampreport-{}(1)", s.get_name())),
                    "{page} does not point at {}",
                    s.get_name()
                );
            }
        } else {
            assert!(words.contains("SEE ALSO ampreport(1)"), "{page}:\n{words}");
        }
    }
}

#[test]
fn man_replaces_its_own_pages_but_not_through_a_link_and_needs_a_folder() {
    let dir = tempfile::tempdir().unwrap();
    let first = ampreport().arg("man").arg(dir.path()).output().unwrap();
    ok(&first, "man");
    let page = dir.path().join("ampreport-render.1");
    let before = std::fs::read(&page).unwrap();
    std::fs::write(&page, "stale").unwrap();
    let again = ampreport()
        .arg("-q")
        .arg("man")
        .arg(dir.path())
        .output()
        .unwrap();
    ok(&again, "man again");
    assert!(again.stdout.is_empty(), "--quiet: {}", stdout(&again));
    assert_eq!(std::fs::read(&page).unwrap(), before, "the same page again");
    // A link where a page goes is refused, and its target left alone.
    let target = dir.path().join("precious.txt");
    std::fs::write(&target, "keep").unwrap();
    std::fs::remove_file(&page).unwrap();
    std::os::unix::fs::symlink(&target, &page).unwrap();
    let o = ampreport().arg("man").arg(dir.path()).output().unwrap();
    assert_eq!(o.status.code(), Some(2), "{}", stderr(&o));
    assert!(stderr(&o).contains("symbolic link"), "{}", stderr(&o));
    assert_eq!(std::fs::read_to_string(&target).unwrap(), "keep");
    // No temporary file is left behind.
    assert!(
        !std::fs::read_dir(dir.path()).unwrap().any(|e| e
            .unwrap()
            .file_name()
            .to_string_lossy()
            .starts_with('.')),
    );
    let o = ampreport()
        .arg("man")
        .arg(dir.path().join("missing"))
        .output()
        .unwrap();
    assert_eq!(o.status.code(), Some(2));
    assert!(stderr(&o).contains("is not a folder"), "{}", stderr(&o));
}

#[test]
fn man_without_a_folder_writes_into_the_current_one() {
    let dir = tempfile::tempdir().unwrap();
    let o = ampreport()
        .arg("man")
        .current_dir(dir.path())
        .output()
        .unwrap();
    ok(&o, "man");
    assert!(dir.path().join("ampreport.1").is_file());
    assert!(stdout(&o).contains("wrote ./ampreport.1"), "{}", stdout(&o));
}

// ----- --version ------------------------------------------------------------

/// A folder holding a stand-in `typst` whose `--version` runs `body`.
fn typst_folder(body: &str) -> tempfile::TempDir {
    let dir = tempfile::tempdir().unwrap();
    let path = dir.path().join("typst");
    std::fs::write(&path, format!("#!/bin/sh\n{body}\n")).unwrap();
    make_executable(&path);
    dir
}

fn version_with_path(path: &std::ffi::OsStr) -> Output {
    ampreport()
        .arg("--version")
        .env("PATH", path)
        .output()
        .unwrap()
}

/// The first three lines every `--version` prints, from the library's own
/// constants.
fn version_head() -> String {
    format!(
        "ampreport {}\njob format {}\nJSON schema {}\n",
        env!("CARGO_PKG_VERSION"),
        ampreport::job::FORMAT_VERSION,
        ampreport::calc::SCHEMA
    )
}

#[test]
fn the_readme_shows_the_versions_the_program_prints() {
    let readme =
        std::fs::read_to_string(concat!(env!("CARGO_MANIFEST_DIR"), "/README.md")).unwrap();
    let head = version_head();
    let shown = head.lines().skip(1).collect::<Vec<_>>().join("\n");
    assert!(
        readme.contains(&shown),
        "README's `--version` example should show:\n{shown}"
    );
}

#[test]
fn version_names_the_typst_on_path() {
    let dir = typst_folder("echo 'typst 0.15.1 (stand-in)'");
    let o = version_with_path(dir.path().as_os_str());
    ok(&o, "--version");
    let typst = dir.path().join("typst");
    assert_eq!(
        stdout(&o),
        format!("{}typst 0.15.1 at {}\n", version_head(), typst.display())
    );
    let short = ampreport()
        .arg("-V")
        .env("PATH", dir.path())
        .output()
        .unwrap();
    assert_eq!(short.stdout, o.stdout);
    // AMPREPORT_TYPST is honoured as render honours it.
    let other = typst_folder("echo 'typst 0.15.2 (other)'");
    let o = ampreport()
        .arg("--version")
        .env("PATH", dir.path())
        .env("AMPREPORT_TYPST", other.path().join("typst"))
        .output()
        .unwrap();
    assert!(
        stdout(&o).ends_with(&format!(
            "typst 0.15.2 at {}\n",
            other.path().join("typst").display()
        )),
        "{}",
        stdout(&o)
    );
}

#[test]
fn version_with_the_real_typst() {
    if !support::real_typst() {
        return;
    }
    let o = ampreport().arg("--version").output().unwrap();
    ok(&o, "--version");
    let real = Command::new("typst").arg("--version").output().unwrap();
    let real_version = stdout(&real).split_whitespace().nth(1).unwrap().to_owned();
    let text = stdout(&o);
    assert!(text.starts_with(&version_head()), "{text}");
    assert!(
        text.contains(&format!("typst {real_version} at /")),
        "{text}"
    );
}

#[test]
fn version_without_typst_says_so_with_the_install_command() {
    let empty = tempfile::tempdir().unwrap();
    let o = version_with_path(empty.path().as_os_str());
    ok(&o, "--version without typst");
    let text = stdout(&o);
    assert!(text.starts_with(&version_head()), "{text}");
    let last = text.lines().last().unwrap();
    assert!(
        last.starts_with("typst not found (no `typst` on PATH)"),
        "{last}"
    );
    assert!(last.contains("bash scripts/need-typst.sh"), "{last}");
    assert!(last.contains(ampreport::typeset::INSTALL_HINT), "{last}");
    assert!(
        last.contains(&ampreport::typeset::MIN_TYPST.to_string()),
        "{last}"
    );
    // A typst too old to use is named with its version.
    let old = typst_folder("echo 'typst 0.11.0 (old)'");
    let o = version_with_path(old.path().as_os_str());
    ok(&o, "--version with an old typst");
    let last = stdout(&o).lines().last().unwrap().to_owned();
    assert!(
        last.starts_with("typst unusable:") && last.contains("0.11.0"),
        "{last}"
    );
}

#[test]
fn version_waits_for_a_hanging_typst_no_longer_than_the_time_limit() {
    let hang = typst_folder("[ -n \"$FAKE_TYPST_PROBE\" ] && exit 0\nexec /bin/sleep 60");
    let start = Instant::now();
    let o = ampreport()
        .arg("--version")
        .env("PATH", hang.path())
        .env("AMPREPORT_TIMEOUT", "0.5")
        .output()
        .unwrap();
    let took = start.elapsed();
    ok(&o, "--version with a hanging typst");
    assert!(took < Duration::from_secs(20), "took {took:?}");
    let last = stdout(&o).lines().last().unwrap().to_owned();
    assert!(
        last.contains("did not finish `--version` within 0.5 s"),
        "{last}"
    );
}
