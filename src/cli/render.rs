//! `ampreport render JOB`: the PDF hand-over document.

use super::args::RenderArgs;
use super::exit::Exit;

pub fn run(_args: &RenderArgs) -> Exit {
    eprintln!("error: render is not built yet");
    Exit::Environment
}
