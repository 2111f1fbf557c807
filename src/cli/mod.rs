//! The command line: clap arguments in [`args`], one file per subcommand,
//! exit statuses in [`exit`]. No business logic lives here.

pub mod args;
mod batch;
mod calc;
mod check;
mod compare;
pub mod completions;
pub mod content_key;
pub mod exit;
mod init;
pub mod job_files;
mod load;
pub mod man;
mod netlist;
mod new;
mod render;
mod said;
mod tubes;
pub mod ui;
pub mod version;
mod watch;

use clap::{CommandFactory, FromArgMatches};
use std::process::ExitCode;

pub use exit::Exit;
pub use init::SKELETON;

/// Runs the program with the process's arguments.
pub fn main() -> ExitCode {
    // A completion script asking for candidates: answered, then exit.
    completions::complete_if_asked();
    // clap's own help and errors follow --color too, so it is read first.
    let clap_colour = match ui::colour_in_args(std::env::args_os()) {
        Some(ui::ColourChoice::Always) => clap::ColorChoice::Always,
        Some(ui::ColourChoice::Never) => clap::ColorChoice::Never,
        _ => clap::ColorChoice::Auto,
    };
    let parsed = args::Cli::command()
        .color(clap_colour)
        .try_get_matches()
        .and_then(|m| args::Cli::from_arg_matches(&m));
    let cli = match parsed {
        Ok(cli) => cli,
        Err(e) => {
            let _ = e.print();
            return if e.use_stderr() {
                Exit::Usage.into()
            } else {
                Exit::Success.into()
            };
        }
    };
    let output = cli.output;
    ui::set(ui::Ui::new(output.color, output.quiet, output.verbose));
    install_diagnostic_style();
    if cli.version {
        return version::run().into();
    }
    let Some(command) = &cli.command else {
        let _ = args::Cli::command()
            .color(clap_colour)
            .error(
                clap::error::ErrorKind::MissingSubcommand,
                "a command is needed (or --version, or --help)",
            )
            .print();
        return Exit::Usage.into();
    };
    ui::folders();
    let exit = match command {
        args::Command::Check(a) => check::run(a),
        args::Command::Calc(a) => calc::run(a),
        args::Command::Render(a) => render::run(a),
        args::Command::Watch(a) => watch::run(a),
        args::Command::Tubes(a) => tubes::run(a),
        args::Command::Init(a) => init::run(a),
        args::Command::Completions(a) => completions::run(a),
        args::Command::Man(a) => man::run(a),
        args::Command::Netlist(a) => netlist::run(a),
        args::Command::Compare(a) => compare::run(a),
        args::Command::New(a) => new::run(a),
    };
    if let Exit::Interrupted(signal) = exit {
        crate::typeset::interrupt::exit_as_signalled(signal);
    }
    exit.into()
}

/// Diagnostics in colour as `--color` and NO_COLOR say ([`ui::colour`]);
/// plain Unicode otherwise, always with file:line:column.
fn install_diagnostic_style() {
    let colour = ui::colour(ui::Stream::Stderr);
    let _ = miette::set_hook(Box::new(move |_| {
        Box::new(
            miette::MietteHandlerOpts::new()
                .color(colour)
                .unicode(true)
                .terminal_links(false)
                .context_lines(1)
                .width(100)
                .build(),
        )
    }));
}
