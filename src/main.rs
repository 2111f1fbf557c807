//! The `ampreport` binary: hands the command line to [`ampreport::cli`].

fn main() -> std::process::ExitCode {
    ampreport::cli::main()
}
