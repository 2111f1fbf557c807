//! The `ampreport` binary: hands the command line to [`ampreport::cli`],
//! on a thread with [`ampreport::cli::PROGRAM_STACK`] of stack.

// The C library's allocator. mimalloc was tried (docs/performance.md,
// "The allocator taken back out"): it made a long job's own work far
// cheaper but a single render's own share erratic (one render in two or
// three cost 10–20 ms more processor time while typst ran), for a reason
// not yet found.

fn main() -> std::process::ExitCode {
    match std::thread::Builder::new()
        .name("ampreport".to_string())
        .stack_size(ampreport::cli::PROGRAM_STACK)
        .spawn(ampreport::cli::main)
    {
        Ok(program) => program
            .join()
            .unwrap_or_else(|panic| std::panic::resume_unwind(panic)),
        // No thread to be had (a tight memory limit): run here instead,
        // on the main thread's own stack.
        Err(_) => ampreport::cli::main(),
    }
}
