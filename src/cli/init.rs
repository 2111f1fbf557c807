//! `ampreport init PATH`: an annotated skeleton job file. Never replaces an
//! existing file.

use std::io::Write;

use super::args::InitArgs;
use super::exit::Exit;

/// The skeleton, a valid job file with every node explained.
pub const SKELETON: &str = include_str!("../../templates/job-skeleton.kdl");

pub fn run(args: &InitArgs) -> Exit {
    let path = &args.path;
    if path.exists() {
        eprintln!(
            "error: {} already exists; ampreport init never replaces a file",
            path.display()
        );
        return Exit::InvalidInput;
    }
    let dir = match path.parent() {
        Some(p) if !p.as_os_str().is_empty() => p.to_path_buf(),
        _ => std::path::PathBuf::from("."),
    };
    let result = tempfile::NamedTempFile::new_in(&dir).and_then(|mut tmp| {
        tmp.write_all(SKELETON.as_bytes())?;
        tmp.as_file().sync_all()?;
        tmp.persist_noclobber(path).map_err(|e| e.error)?;
        Ok(())
    });
    match result {
        Ok(()) => {
            super::ui::wrote(format!(
                "wrote {}; fill it in, then run `ampreport check {}`",
                path.display(),
                path.display()
            ));
            Exit::Success
        }
        Err(e) if e.kind() == std::io::ErrorKind::AlreadyExists => {
            eprintln!(
                "error: {} already exists; ampreport init never replaces a file",
                path.display()
            );
            Exit::InvalidInput
        }
        Err(e) => {
            eprintln!("error: cannot write {}: {e}", path.display());
            Exit::Environment
        }
    }
}
