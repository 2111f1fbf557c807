//! How the program talks: colour (`--color` beside `NO_COLOR`), how much it
//! says on standard error (`--quiet`, `--verbose`), and the one place every
//! command's warnings, notes and "read from" lines go through, so the
//! options hold for all of them.
//!
//! Standard output carries only what a command was asked for (the summary,
//! the JSON, the table, a script, the PDF with `-o -`) and the short "wrote
//! FILE" lines of the commands that write files; everything else goes to
//! standard error. `--quiet` leaves errors only; `--verbose` adds where each
//! input came from.

use std::fmt::Display;
use std::io::IsTerminal;
use std::sync::OnceLock;

/// When to colour: the value of `--color`.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Default, clap::ValueEnum)]
pub enum ColourChoice {
    /// Only on a terminal, and never when NO_COLOR is set (and not empty).
    #[default]
    Auto,
    /// Always, even into a pipe or with NO_COLOR set: the command line
    /// overrides the environment.
    Always,
    /// Never.
    Never,
}

/// How much goes to standard error.
#[derive(Debug, Clone, Copy, PartialEq, Eq, PartialOrd, Ord, Default)]
pub enum Verbosity {
    /// Errors only.
    Quiet,
    /// Errors, warnings and notes.
    #[default]
    Normal,
    /// All of that, and what was read from where.
    Verbose,
}

/// The settings for this run.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Default)]
pub struct Ui {
    pub colour: ColourChoice,
    pub verbosity: Verbosity,
}

impl Ui {
    pub fn new(colour: ColourChoice, quiet: bool, verbose: bool) -> Self {
        let verbosity = if quiet {
            Verbosity::Quiet
        } else if verbose {
            Verbosity::Verbose
        } else {
            Verbosity::Normal
        };
        Self { colour, verbosity }
    }
}

static UI: OnceLock<Ui> = OnceLock::new();

/// Sets this run's settings; the first call wins.
pub fn set(ui: Ui) {
    let _ = UI.set(ui);
}

/// This run's settings (the defaults before [`set`]).
pub fn get() -> Ui {
    UI.get().copied().unwrap_or_default()
}

/// Which stream a colour decision is for.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum Stream {
    Stdout,
    Stderr,
}

/// Whether to colour what goes to `stream`.
pub fn colour(stream: Stream) -> bool {
    let terminal = match stream {
        Stream::Stdout => std::io::stdout().is_terminal(),
        Stream::Stderr => std::io::stderr().is_terminal(),
    };
    colour_for(
        get().colour,
        terminal,
        std::env::var_os("NO_COLOR").as_deref(),
    )
}

/// The `--color` value on a command line before clap reads it (the last
/// one given, before any `--`), so that clap's own help and error messages
/// can follow it; `None` when there is none or it is not a known value
/// (clap then reports it).
pub fn colour_in_args(args: impl IntoIterator<Item = std::ffi::OsString>) -> Option<ColourChoice> {
    use clap::ValueEnum;
    let mut found = None;
    let mut args = args.into_iter().skip(1);
    while let Some(arg) = args.next() {
        let Some(arg) = arg.to_str().map(str::to_owned) else {
            continue;
        };
        let value = if arg == "--" {
            break;
        } else if arg == "--color" {
            args.next().and_then(|v| v.to_str().map(str::to_owned))
        } else if let Some(v) = arg.strip_prefix("--color=") {
            Some(v.to_owned())
        } else {
            continue;
        };
        found = value.and_then(|v| ColourChoice::from_str(&v, false).ok());
    }
    found
}

/// The colour rule with its inputs passed in: `--color`, whether the
/// stream is a terminal, and `NO_COLOR` (set and not empty turns colour
/// off, as no-color.org says).
pub fn colour_for(
    choice: ColourChoice,
    terminal: bool,
    no_color: Option<&std::ffi::OsStr>,
) -> bool {
    match choice {
        ColourChoice::Always => true,
        ColourChoice::Never => false,
        ColourChoice::Auto => terminal && no_color.is_none_or(|v| v.is_empty()),
    }
}

/// True unless `--quiet`.
pub fn chatty() -> bool {
    get().verbosity >= Verbosity::Normal
}

/// True with `--verbose`.
pub fn verbose() -> bool {
    get().verbosity >= Verbosity::Verbose
}

/// A warning or a note for standard error (the text carries its own
/// `warning:` or `note:`); nothing under `--quiet`.
pub fn warn(message: impl Display) {
    if chatty() {
        eprintln!("{message}");
    }
}

/// A line on standard output saying what was written; nothing under
/// `--quiet`.
pub fn wrote(message: impl Display) {
    if chatty() {
        println!("{message}");
    }
}

/// What the program says before any shop profile is read, or about no one
/// job: the catalogue's words, in English (docs/shop.md, "The terminal's
/// language").
pub fn english(msg: &crate::catalogue::Msg) -> String {
    crate::catalogue::Catalogue::english().say(msg)
}

/// With `--verbose`, one line on standard error saying what was read from
/// where: `read: WHAT: WHERE` (`cli-read`), in English: it is said before
/// any shop profile is read, or about no one job. `what` is one of the
/// `cli-read-what-…` keys, `from` one of the `cli-read-from-…` messages.
pub fn read(what: &'static str, from: crate::catalogue::Msg) {
    if verbose() {
        eprintln!(
            "{}",
            read_line(crate::catalogue::Catalogue::english(), what, from)
        );
    }
}

/// The `--verbose` line saying what was read from where, in `catalogue`'s
/// words.
pub fn read_line(
    catalogue: &crate::catalogue::Catalogue,
    what: &'static str,
    from: crate::catalogue::Msg,
) -> String {
    catalogue.say(
        &crate::catalogue::Msg::new("cli-read")
            .arg("what", crate::catalogue::Msg::new(what))
            .arg("from", from),
    )
}

/// With `--verbose`, the per-user folders: where a shop profile is looked
/// for and where the fonts are cached.
pub fn folders() {
    if !verbose() {
        return;
    }
    use crate::catalogue::Msg;
    let shown = |dir: Option<std::path::PathBuf>| match dir {
        Some(dir) => Msg::new("cli-read-from-path").arg("path", dir.display().to_string()),
        None => Msg::new("cli-read-from-no-home"),
    };
    read(
        "cli-read-what-config-folder",
        shown(crate::folders::config_dir()),
    );
    read(
        "cli-read-what-cache-folder",
        shown(crate::folders::cache_dir()),
    );
}

#[cfg(test)]
mod tests {
    use super::*;
    use std::ffi::OsStr;

    #[test]
    fn the_command_line_beats_the_environment_and_auto_follows_both() {
        use ColourChoice::*;
        let set = Some(OsStr::new("1"));
        let empty = Some(OsStr::new(""));
        // (choice, terminal, NO_COLOR) → colour
        let cases = [
            (Auto, true, None, true),
            (Auto, false, None, false),
            (Auto, true, set, false),
            // Set but empty does not count (no-color.org).
            (Auto, true, empty, true),
            (Always, false, set, true),
            (Always, true, None, true),
            (Never, true, None, false),
            (Never, false, None, false),
        ];
        for (choice, terminal, no_color, want) in cases {
            assert_eq!(
                colour_for(choice, terminal, no_color),
                want,
                "{choice:?} terminal={terminal} NO_COLOR={no_color:?}"
            );
        }
    }

    #[test]
    fn the_colour_option_is_found_before_clap_reads_the_line() {
        let line = |words: &[&str]| {
            colour_in_args(
                std::iter::once("ampreport")
                    .chain(words.iter().copied())
                    .map(std::ffi::OsString::from),
            )
        };
        assert_eq!(
            line(&["--color", "never", "--help"]),
            Some(ColourChoice::Never)
        );
        assert_eq!(
            line(&["check", "--color=always", "x"]),
            Some(ColourChoice::Always)
        );
        assert_eq!(
            line(&["--color=never", "--color", "always"]),
            Some(ColourChoice::Always)
        );
        assert_eq!(line(&["check", "--", "--color=never"]), None);
        assert_eq!(line(&["--color", "purple"]), None);
        assert_eq!(line(&["--color"]), None);
        assert_eq!(line(&["tubes"]), None);
    }

    #[test]
    fn quiet_beats_verbose_and_the_levels_are_ordered() {
        assert_eq!(
            Ui::new(ColourChoice::Auto, true, true).verbosity,
            Verbosity::Quiet
        );
        assert_eq!(
            Ui::new(ColourChoice::Auto, false, true).verbosity,
            Verbosity::Verbose
        );
        assert_eq!(Ui::default().verbosity, Verbosity::Normal);
        assert!(Verbosity::Quiet < Verbosity::Normal && Verbosity::Normal < Verbosity::Verbose);
    }
}
