//! The `ampreport` binary: hands the command line to [`ampreport::cli`],
//! on a thread with [`ampreport::cli::PROGRAM_STACK`] of stack.

/// mimalloc rather than the C library's allocator: a long job makes and
/// drops millions of small strings and vectors, and malloc and free were
/// a fifth to a quarter of every stage (docs/performance.md, "Eighth
/// pass: decode, derive and the allocator"). Built without transparent
/// huge pages for every job (Cargo.toml), which made a single render
/// dearer ("The allocator: huge pages found and turned off"); a long
/// job asks for them once its text is read
/// ([`ampreport::allocator::large_pages_for`]). Set here and in the
/// `phases` example only, not in the library, so the fuzz targets keep
/// the sanitiser's allocator. Asked through [`ampreport::allocator`], which
/// uses mimalloc's plain calls where the layout allows.
#[global_allocator]
static ALLOCATOR: ampreport::allocator::Allocator = ampreport::allocator::Allocator;

fn main() -> std::process::ExitCode {
    ampreport::allocator::keep_freed_memory();
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
