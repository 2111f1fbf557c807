//! The one door to the outside `typst` program: finding and checking it,
//! escaping user text for Typst, filling templates, laying out a sandbox
//! folder (generated source, plots, images, bundled fonts), running typst
//! there and writing the PDF atomically. Knows nothing about what a job means.

mod error;
mod locate;
mod version;

pub use error::{INSTALL_HINT, TypesetError};
pub use locate::{TYPST_ENV, TypstProgram, locate, locate_in};
pub use version::{MAX_TYPST_EXCLUSIVE, MIN_TYPST, TypstVersion};
