//! `ampreport man [DIR]`: the manual pages, made from the same clap
//! definitions as `--help` (clap_mangen), one page per command:
//! `ampreport.1` for the program with its exit statuses, environment and
//! files, and `ampreport-check.1`, `ampreport-render.1` … for each
//! subcommand. Each page is written atomically (temporary file, then
//! rename) and only over a regular file, like every other output.

use std::io::Write;
use std::path::{Path, PathBuf};

use clap::CommandFactory;
use clap_mangen::Man;
use clap_mangen::roff::{Roff, bold, italic, roman};

use super::args::{Cli, ManArgs};
use super::exit::Exit;
use super::ui;

/// The manual section the pages belong to (user commands).
const SECTION: &str = "1";

pub fn run(args: &ManArgs) -> Exit {
    let dir = args.dir.clone().unwrap_or_else(|| PathBuf::from("."));
    if !dir.is_dir() {
        eprintln!(
            "error: {} is not a folder; create it first, or name another",
            dir.display()
        );
        return Exit::Usage;
    }
    for (name, page) in pages() {
        let path = dir.join(&name);
        if let Err(e) = crate::typeset::check_output(&path, &[]) {
            eprintln!("{:?}", miette::Report::new(e));
            return Exit::Usage;
        }
        if let Err(e) = write_atomically(&path, &page) {
            eprintln!("error: cannot write {}: {e}", path.display());
            return Exit::Environment;
        }
        ui::wrote(format!("wrote {}", path.display()));
    }
    Exit::Success
}

/// Every page as (file name, roff source): the program's first, then one
/// per subcommand in the order `--help` lists them.
pub fn pages() -> Vec<(String, Vec<u8>)> {
    let mut root = Cli::command().disable_help_subcommand(true);
    root.build();
    let subcommands: Vec<clap::Command> = root
        .get_subcommands()
        .filter(|s| !s.is_hide_set())
        .cloned()
        .collect();
    let names: Vec<String> = subcommands
        .iter()
        .map(|s| page_name(s).to_owned())
        .collect();
    let mut pages = vec![page(root, &names, true)];
    for sub in subcommands {
        pages.push(page(sub, &["ampreport".to_owned()], false));
    }
    pages
}

/// The name a page is filed under: `ampreport` or `ampreport-check`.
fn page_name(cmd: &clap::Command) -> &str {
    cmd.get_display_name().unwrap_or_else(|| cmd.get_name())
}

/// One page, with `see_also` as its SEE ALSO section; the program's page
/// also gets EXIT STATUS, ENVIRONMENT and FILES.
fn page(cmd: clap::Command, see_also: &[String], program: bool) -> (String, Vec<u8>) {
    let has_options = cmd.get_arguments().any(|a| !a.is_hide_set());
    let has_subcommands = cmd.get_subcommands().next().is_some();
    let man = Man::new(cmd)
        .section(SECTION)
        .source(format!("ampreport {}", env!("CARGO_PKG_VERSION")))
        .manual("ampreport manual");
    let name = man.get_filename();
    let mut out = Vec::new();
    let mut write = || -> std::io::Result<()> {
        man.render_title(&mut out)?;
        man.render_name_section(&mut out)?;
        man.render_synopsis_section(&mut out)?;
        man.render_description_section(&mut out)?;
        if has_options {
            man.render_options_section(&mut out)?;
        }
        if has_subcommands {
            man.render_subcommands_section(&mut out)?;
        }
        if program {
            program_sections().to_writer(&mut out)?;
        }
        see_also_section(see_also).to_writer(&mut out)?;
        Ok(())
    };
    write().expect("writing to memory does not fail");
    (name, out)
}

/// EXIT STATUS, ENVIRONMENT and FILES for the program's page.
fn program_sections() -> Roff {
    let mut roff = Roff::new();
    let entry = |roff: &mut Roff, term: clap_mangen::roff::Inline, text: &str| {
        roff.control("TP", []).text([term]).text([roman(text)]);
    };
    roff.control("SH", ["EXIT STATUS"]);
    for (code, text) in [
        ("0", "Success."),
        (
            "1",
            "The job file (or a ratings file, a shop template) is invalid or unreadable.",
        ),
        (
            "2",
            "The command line is wrong; also an output that must not be written \
             (an input, a link, a device).",
        ),
        (
            "3",
            "The environment failed: typst missing, too old, crashing or past its time \
             limit, or a folder that cannot be written.",
        ),
        (
            "4",
            "--strict found a figure over its limit and not accepted: in the final set \
             or the safety tests (--strict=all: in any set).",
        ),
        (
            "128+N",
            "render was stopped by signal N, after removing its temporary files.",
        ),
    ] {
        entry(&mut roff, bold(code), text);
    }
    roff.control("SH", ["ENVIRONMENT"]);
    for (name, text) in [
        (
            "AMPREPORT_TYPST",
            "The typst program render runs when --typst is not given (else typst on PATH).",
        ),
        (
            "AMPREPORT_TIMEOUT",
            "Seconds typst may run before it is stopped (default 120); also bounds \
             the typst check of --version.",
        ),
        (
            "NO_COLOR",
            "When set and not empty, no colour with --color auto (the default).",
        ),
        (
            "XDG_CONFIG_HOME",
            "On Linux, the configuration folder is $XDG_CONFIG_HOME/ampreport \
             (else ~/.config/ampreport).",
        ),
        (
            "XDG_CACHE_HOME",
            "On Linux, the cache folder is $XDG_CACHE_HOME/ampreport \
             (else ~/.cache/ampreport).",
        ),
        (
            "AMPREPORT_COMPLETE",
            "Set by the completion scripts when they ask for candidates; not for use by hand.",
        ),
    ] {
        entry(&mut roff, bold(name), text);
    }
    roff.control("SH", ["FILES"]);
    entry(
        &mut roff,
        italic("CACHE/fonts-HASH/"),
        "The bundled fonts, written once per user and build into the cache folder; \
         safe to delete.",
    );
    entry(
        &mut roff,
        italic("CONFIG/"),
        "The configuration folder; ampreport --verbose names it and the cache folder.",
    );
    roff
}

/// A SEE ALSO section naming `pages` in section 1.
fn see_also_section(pages: &[String]) -> Roff {
    let mut roff = Roff::new();
    roff.control("SH", ["SEE ALSO"]);
    let mut line = Vec::new();
    for (i, name) in pages.iter().enumerate() {
        if i > 0 {
            line.push(roman(", "));
        }
        line.push(bold(name.as_str()));
        line.push(roman(format!("({SECTION})")));
    }
    roff.text(line);
    roff
}

/// Writes `bytes` to a temporary file beside `path`, flushes it and renames
/// it over `path`.
fn write_atomically(path: &Path, bytes: &[u8]) -> std::io::Result<()> {
    let dir = match path.parent() {
        Some(p) if !p.as_os_str().is_empty() => p,
        _ => Path::new("."),
    };
    let mut tmp = tempfile::Builder::new()
        .prefix(".ampreport-man-")
        .tempfile_in(dir)?;
    tmp.write_all(bytes)?;
    tmp.as_file().sync_all()?;
    tmp.persist(path).map_err(|e| e.error)?;
    Ok(())
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn one_page_per_command_each_pointing_at_the_others() {
        let pages = pages();
        let names: Vec<&str> = pages.iter().map(|(n, _)| n.as_str()).collect();
        let mut root = Cli::command();
        root.build();
        assert_eq!(names[0], "ampreport.1");
        for sub in root.get_subcommands().filter(|s| s.get_name() != "help") {
            let want = format!("ampreport-{}.1", sub.get_name());
            assert!(names.contains(&want.as_str()), "{want} in {names:?}");
        }
        assert_eq!(
            names.len(),
            1 + root
                .get_subcommands()
                .filter(|s| s.get_name() != "help")
                .count()
        );
        let program = String::from_utf8(pages[0].1.clone()).unwrap();
        for heading in ["EXIT STATUS", "ENVIRONMENT", "FILES", "SEE ALSO"] {
            assert!(
                program.contains(&format!(".SH \"{heading}\""))
                    || program.contains(&format!(".SH {heading}")),
                "{heading}:\n{program}"
            );
        }
        assert!(program.contains("ampreport\\-render"), "{program}");
        let render = pages
            .iter()
            .find(|(n, _)| n == "ampreport-render.1")
            .map(|(_, p)| String::from_utf8(p.clone()).unwrap())
            .unwrap();
        assert!(render.contains("\\-\\-emit\\-source"), "{render}");
    }
}
