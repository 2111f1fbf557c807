//! The command line: clap arguments in [`args`], one file per subcommand,
//! exit statuses in [`exit`]. No business logic lives here.

pub mod args;
mod calc;
mod check;
pub mod exit;
mod init;
mod load;
mod netlist;
mod render;
mod tubes;

use clap::Parser;
use std::io::IsTerminal;
use std::process::ExitCode;

pub use exit::Exit;
pub use init::SKELETON;

/// Runs the program with the process's arguments.
pub fn main() -> ExitCode {
    let cli = match args::Cli::try_parse() {
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
    install_diagnostic_style();
    let exit = match &cli.command {
        args::Command::Check(a) => check::run(a),
        args::Command::Calc(a) => calc::run(a),
        args::Command::Render(a) => render::run(a),
        args::Command::Tubes(a) => tubes::run(a),
        args::Command::Init(a) => init::run(a),
        args::Command::Netlist(a) => netlist::run(a),
    };
    if let Exit::Interrupted(signal) = exit {
        crate::typeset::interrupt::exit_as_signalled(signal);
    }
    exit.into()
}

/// Diagnostics in colour only on a terminal without NO_COLOR; plain
/// Unicode otherwise, always with file:line:column.
fn install_diagnostic_style() {
    let colour = std::io::stderr().is_terminal()
        && std::env::var_os("NO_COLOR").is_none_or(|v| v.is_empty());
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
