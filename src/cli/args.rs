//! Every command-line definition, in one place. What the shell completes
//! for each argument is attached here too (see [`super::completions`]).

use clap::{Args, Parser, Subcommand, ValueEnum, ValueHint};
use clap_complete::engine::ArgValueCompleter;
use std::path::PathBuf;
use std::time::Duration;

use super::completions::{job_files, pdf_files, valve_types};
use super::ui::ColourChoice;

#[derive(Debug, Parser)]
#[command(
    name = "ampreport",
    disable_version_flag = true,
    about = "Checks a valve-amplifier repair job file and turns it into a hand-over document",
    long_about = "Reads one KDL job file (the unit, its measurements, parts and mods, safety tests), \
derives plate and screen dissipation, mains-corrected and high-line figures and the stress on \
resistors and capacitors, and prints them or typesets a PDF hand-over document.",
    after_help = "Exit status: 0 success; 1 the job file (or a ratings file) is invalid or unreadable; \
2 the command line is wrong (also: an output that must not be written); 3 the tool's environment failed (e.g. typst missing, failing or too slow); \
4 --strict found an un-accepted figure over its limit in the final set (--strict=all: in any set)."
)]
pub struct Cli {
    /// Print the version of ampreport, of the job format and the JSON
    /// schema, and the typst program found.
    #[arg(short = 'V', long)]
    pub version: bool,
    #[command(flatten)]
    pub output: OutputArgs,
    #[command(subcommand)]
    pub command: Option<Command>,
}

/// How the program talks, for every command.
#[derive(Debug, Args, Clone, Copy)]
pub struct OutputArgs {
    /// Colour in the summary and the messages: auto (only on a terminal,
    /// and never when NO_COLOR is set), always, or never.
    #[arg(
        long,
        global = true,
        value_enum,
        value_name = "WHEN",
        default_value_t = ColourChoice::Auto
    )]
    pub color: ColourChoice,
    /// Print errors only: no warnings, notes or "wrote" lines (the
    /// summary, JSON or PDF asked for is still written).
    #[arg(short, long, global = true, conflicts_with = "verbose")]
    pub quiet: bool,
    /// Also say what was read from where: the job, shop profile, ratings
    /// files, templates, typst, and the configuration and cache folders.
    #[arg(short, long, global = true)]
    pub verbose: bool,
}

#[derive(Debug, Subcommand)]
pub enum Command {
    /// Decode and derive a job, then print a summary of every figure and warning.
    Check(CheckArgs),
    /// Print every derived figure of a job as JSON.
    Calc(CalcArgs),
    /// Typeset the PDF hand-over document for each job (files or folders), or
    /// with --listing the listing for a buyer.
    Render(RenderArgs),
    /// Render jobs again whenever they, or anything they are made from, change.
    Watch(RenderArgs),
    /// List the valve ratings table, or show one type with its source note.
    Tubes(TubesArgs),
    /// Write an annotated skeleton job file (or, with --shop, a shop profile) to start from.
    Init(InitArgs),
    /// Write a mod's network as a plain SPICE netlist with an AC analysis.
    Netlist(NetlistArgs),
    /// Write the next job file: the shop's next job id, today's date, and with --from a previous job's unit.
    ///
    /// The id follows the shop profile's `job-numbers` pattern (default
    /// {yyyy}-{nnn}), counting on from the highest id of the period among
    /// the job files in the folder; the file is named after it. Never
    /// replaces a file.
    New(NewArgs),
    /// Show the figures that changed between two versions of a job, or two sets of one job.
    ///
    /// Each side is a job file or REV:PATH, a file at a git revision as
    /// `git show` names it (`HEAD:jobs/a.kdl`, `HEAD~2:./a.kdl`). With
    /// --sets, one job's two measurement sets are compared instead.
    Compare(CompareArgs),
    /// Print the shell completion script for bash, zsh, fish, PowerShell or
    /// elvish.
    ///
    /// The script asks ampreport itself what to offer at each Tab: commands,
    /// options, job files (.kdl) and folders, the valve types of the built-in
    /// ratings table for `tubes` (not those a --ratings file adds: a Tab
    /// sees only the word being typed, not the file named before it), .pdf
    /// files for `render -o`. ampreport must be on PATH. To install, for bash: `ampreport completions bash >
    /// ~/.local/share/bash-completion/completions/ampreport`; zsh:
    /// `ampreport completions zsh > ~/.zfunc/_ampreport` with ~/.zfunc on
    /// fpath before compinit; fish: `ampreport completions fish >
    /// ~/.config/fish/completions/ampreport.fish`; PowerShell: add
    /// `ampreport completions powershell | Out-String | Invoke-Expression`
    /// to $PROFILE; elvish: add `eval (ampreport completions elvish |
    /// slurp)` to ~/.config/elvish/rc.elv.
    Completions(CompletionsArgs),
    /// Write the manual pages, one per command, into a folder.
    ///
    /// Writes ampreport.1 and ampreport-COMMAND.1 for each command. To
    /// install them for one user: `ampreport man ~/.local/share/man/man1`
    /// (then `man ampreport-render`; man looks there when ~/.local/bin is
    /// on PATH, else add `export MANPATH="$HOME/.local/share/man:"` to the
    /// shell's profile); for all users, into /usr/local/share/man/man1 as
    /// root.
    Man(ManArgs),
}

/// Options every command that reads jobs shares.
#[derive(Debug, Args)]
pub struct JobArgs {
    /// Job files (KDL), or folders searched for them: every `*.kdl` file
    /// in the folder except `shop.kdl`, ratings files and hidden files;
    /// `-` alone reads one job from standard input.
    #[arg(value_name = "JOB|DIR", required = true, num_args = 1.., value_hint = ValueHint::AnyPath, add = ArgValueCompleter::new(job_files()))]
    pub jobs: Vec<PathBuf>,
    /// Search the folders' sub-folders too.
    #[arg(short, long)]
    pub recursive: bool,
    /// A shop's own ratings file that adds or corrects valve types.
    #[arg(long, value_name = "FILE", value_hint = ValueHint::FilePath, add = ArgValueCompleter::new(job_files()))]
    pub ratings: Vec<PathBuf>,
    /// The shop profile to use when there is no shop.kdl in the job's folder
    /// or a folder above it.
    #[arg(long, value_name = "FILE", conflicts_with = "no_shop", value_hint = ValueHint::FilePath, add = ArgValueCompleter::new(job_files()))]
    pub shop: Option<PathBuf>,
    /// Use no shop profile at all: the neutral heading and the built-in defaults.
    #[arg(long)]
    pub no_shop: bool,
}

/// Options of a command that reads one job file.
#[derive(Debug, Args)]
pub struct OneJobArgs {
    /// The job file (KDL); `-` reads it from standard input.
    #[arg(value_hint = ValueHint::FilePath, add = ArgValueCompleter::new(job_files()))]
    pub job: PathBuf,
    /// A shop's own ratings file that adds or corrects valve types.
    #[arg(long, value_name = "FILE", value_hint = ValueHint::FilePath, add = ArgValueCompleter::new(job_files()))]
    pub ratings: Vec<PathBuf>,
    /// The shop profile to use when there is no shop.kdl in the job's folder
    /// or a folder above it.
    #[arg(long, value_name = "FILE", conflicts_with = "no_shop", value_hint = ValueHint::FilePath, add = ArgValueCompleter::new(job_files()))]
    pub shop: Option<PathBuf>,
    /// Use no shop profile at all: the neutral heading and the built-in defaults.
    #[arg(long)]
    pub no_shop: bool,
}

#[derive(Debug, Args)]
pub struct CheckArgs {
    #[command(flatten)]
    pub job: JobArgs,
    /// Exit with status 4 when a figure of the unit as it leaves (the final
    /// set, the safety tests) is over its limit and not accepted;
    /// `--strict=all` judges every set, as found included.
    #[arg(
        long,
        value_enum,
        value_name = "SETS",
        num_args = 0..=1,
        require_equals = true,
        default_missing_value = "final"
    )]
    pub strict: Option<StrictSets>,
}

/// Which measurement sets `--strict` judges.
#[derive(Debug, Clone, Copy, PartialEq, Eq, ValueEnum)]
pub enum StrictSets {
    /// The final set (marked `final`, else the last) and the safety tests.
    Final,
    /// Every set.
    All,
}

#[derive(Debug, Args)]
pub struct CalcArgs {
    #[command(flatten)]
    pub job: JobArgs,
    /// Print JSON (the only format; the flag states it in scripts). With
    /// several jobs, one JSON document per line, in the order given.
    #[arg(long)]
    pub json: bool,
}

#[derive(Debug, Args)]
pub struct RenderArgs {
    #[command(flatten)]
    pub job: JobArgs,
    /// Where to write the PDF (default: beside the job file, same name,
    /// .pdf); `-` writes it to standard output. One job file only.
    #[arg(short, long, value_name = "FILE", conflicts_with = "out_dir", value_hint = ValueHint::FilePath, add = ArgValueCompleter::new(pdf_files()))]
    pub output: Option<PathBuf>,
    /// Write the PDFs under this folder, mirroring where the jobs are
    /// (a job found in a folder DIR goes to the same place under it).
    #[arg(long, value_name = "DIR", value_hint = ValueHint::DirPath)]
    pub out_dir: Option<PathBuf>,
    /// How many jobs to render at once (default: the number of cores); with
    /// more than one, each typst gets its share of the cores (`typst --jobs`).
    #[arg(short = 'j', long = "jobs", value_name = "N", value_parser = clap::value_parser!(u16).range(1..=1024))]
    pub parallel: Option<u16>,
    /// The typst program to run (default: $AMPREPORT_TYPST, else typst on PATH).
    #[arg(long, value_name = "PATH", value_hint = ValueHint::ExecutablePath)]
    pub typst: Option<PathBuf>,
    /// A folder of templates that replace the built-in ones by file name.
    #[arg(long, value_name = "DIR", value_hint = ValueHint::DirPath)]
    pub templates: Option<PathBuf>,
    /// Also write the generated Typst source and its assets to this folder
    /// (new or empty; see --force).
    #[arg(long, value_name = "DIR", value_hint = ValueHint::DirPath)]
    pub emit_source: Option<PathBuf>,
    /// Leave the job's charges out of the document.
    #[arg(long)]
    pub no_charges: bool,
    /// Write the listing document for a buyer instead of the hand-over:
    /// NAME.listing.pdf and NAME.listing.md (with its photos) beside the job,
    /// or beside the PDF named by -o. Never holds the customer, the charges
    /// or anything marked private.
    #[arg(long, conflicts_with = "no_charges")]
    pub listing: bool,
    /// How the listing shows the unit's serial number.
    #[arg(
        long,
        value_enum,
        value_name = "HOW",
        default_value = "shown",
        requires = "listing"
    )]
    pub serial: SerialArg,
    /// Render even when the PDF is up to date; with --emit-source, also
    /// replace everything in a folder that is not empty.
    #[arg(long)]
    pub force: bool,
    /// Stop typst after this many seconds (each run: the version check, the compile).
    #[arg(
        long,
        value_name = "SECONDS",
        env = "AMPREPORT_TIMEOUT",
        default_value = "120",
        value_parser = parse_timeout
    )]
    pub timeout: Duration,
}

/// How the listing shows the serial number.
#[derive(Debug, Clone, Copy, PartialEq, Eq, ValueEnum)]
pub enum SerialArg {
    /// As written.
    Shown,
    /// Every letter and digit but the last two hidden.
    Masked,
    /// Left out.
    Hidden,
}

/// The longest `--timeout` accepted: one day.
pub const MAX_TIMEOUT_SECONDS: f64 = 86_400.0;

/// A number of seconds, more than 0 and at most [`MAX_TIMEOUT_SECONDS`]
/// (fractions allowed).
pub fn parse_timeout(text: &str) -> Result<Duration, String> {
    let seconds: f64 = text
        .trim()
        .parse()
        .map_err(|_| format!("`{text}` is not a number of seconds"))?;
    if !(seconds > 0.0 && seconds <= MAX_TIMEOUT_SECONDS) {
        return Err(format!(
            "the time limit must be more than 0 and at most {MAX_TIMEOUT_SECONDS} seconds"
        ));
    }
    Ok(Duration::from_secs_f64(seconds))
}

#[derive(Debug, Args)]
pub struct TubesArgs {
    /// A valve type to show in full (equivalents are found too).
    #[arg(add = ArgValueCompleter::new(valve_types))]
    pub valve_type: Option<String>,
    /// A shop's own ratings file that adds or corrects valve types.
    #[arg(long, value_name = "FILE", value_hint = ValueHint::FilePath, add = ArgValueCompleter::new(job_files()))]
    pub ratings: Vec<PathBuf>,
}

#[derive(Debug, Args)]
#[command(group(clap::ArgGroup::new("what").required(true).multiple(true).args(["path", "shop", "repo"])))]
pub struct InitArgs {
    /// Where to write the new job file; an existing file is never replaced.
    #[arg(value_hint = ValueHint::FilePath)]
    pub path: Option<PathBuf>,
    /// Where to write an annotated shop profile (shop.kdl); an existing file
    /// is never replaced.
    #[arg(long, value_name = "PATH", value_hint = ValueHint::FilePath)]
    pub shop: Option<PathBuf>,
    /// Make DIR ready to keep jobs in git: a .gitattributes (PDFs and photos
    /// binary, job files text) and a .gitignore for rendered output; an
    /// existing file is never replaced.
    #[arg(long, value_name = "DIR", value_hint = ValueHint::DirPath)]
    pub repo: Option<PathBuf>,
}

#[derive(Debug, Args)]
pub struct NewArgs {
    /// A previous job of the same unit or model: its unit, mains, line-up
    /// and circuit are carried over (not its readings, parts, mods,
    /// customer or charges).
    #[arg(long, value_name = "OLD_JOB", value_hint = ValueHint::FilePath, add = ArgValueCompleter::new(job_files()))]
    pub from: Option<PathBuf>,
    /// The folder to write the job file in and count the jobs of (default:
    /// the current folder).
    #[arg(long, value_name = "DIR", value_hint = ValueHint::DirPath)]
    pub dir: Option<PathBuf>,
    /// The shop profile whose numbering to follow (default: found from the
    /// folder, as for a job there).
    #[arg(long, value_name = "FILE", conflicts_with = "no_shop", value_hint = ValueHint::FilePath, add = ArgValueCompleter::new(job_files()))]
    pub shop: Option<PathBuf>,
    /// Use no shop profile: the default numbering, {yyyy}-{nnn}.
    #[arg(long)]
    pub no_shop: bool,
}

#[derive(Debug, Args)]
pub struct CompareArgs {
    /// The old job: a file, or REV:PATH for a file at a git revision.
    #[arg(value_hint = ValueHint::FilePath, add = ArgValueCompleter::new(job_files()))]
    pub old: PathBuf,
    /// The new job: a file, or REV:PATH (not with --sets).
    #[arg(required_unless_present = "sets", conflicts_with = "sets", value_hint = ValueHint::FilePath, add = ArgValueCompleter::new(job_files()))]
    pub new: Option<PathBuf>,
    /// Compare two measurement sets of the one job, by their labels.
    #[arg(long, num_args = 2, value_names = ["OLD_SET", "NEW_SET"])]
    pub sets: Option<Vec<String>>,
    /// Print the changes as JSON.
    #[arg(long)]
    pub json: bool,
    /// A shop's own ratings file that adds or corrects valve types.
    #[arg(long, value_name = "FILE")]
    pub ratings: Vec<PathBuf>,
    /// The shop profile for both sides (default: found beside each job).
    #[arg(long, value_name = "FILE", conflicts_with = "no_shop", value_hint = ValueHint::FilePath, add = ArgValueCompleter::new(job_files()))]
    pub shop: Option<PathBuf>,
    /// Use no shop profile at all.
    #[arg(long)]
    pub no_shop: bool,
}

#[derive(Debug, Args)]
pub struct NetlistArgs {
    #[command(flatten)]
    pub job: OneJobArgs,
    /// The mod whose network to write, counted from 1 in the job's `mods`.
    #[arg(long = "mod", value_name = "N")]
    pub mod_number: usize,
    /// The network as left (after the mod's edits) instead of as found.
    #[arg(long)]
    pub after: bool,
    /// Which of the network's pot settings, counted from 1.
    #[arg(long, value_name = "S", default_value_t = 1)]
    pub setting: usize,
    /// Write to this file (atomically) instead of standard output.
    #[arg(short, long, value_name = "FILE", value_hint = ValueHint::FilePath)]
    pub output: Option<PathBuf>,
}

#[derive(Debug, Args)]
pub struct CompletionsArgs {
    /// The shell to print the script for.
    #[arg(value_enum)]
    pub shell: super::completions::Shell,
}

#[derive(Debug, Args)]
pub struct ManArgs {
    /// The folder to write the pages into (default: the current folder); it
    /// must exist. Pages of the same name are replaced.
    #[arg(value_name = "DIR", value_hint = ValueHint::DirPath)]
    pub dir: Option<PathBuf>,
}
