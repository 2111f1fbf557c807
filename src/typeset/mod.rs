//! The one door to the outside `typst` program: finding and checking it,
//! escaping user text for Typst, filling templates, laying out a sandbox
//! folder (generated source, plots, images, bundled fonts), running typst
//! there and writing the PDF atomically. Knows nothing about what a job means.

mod compile;
mod error;
mod escape;
mod fonts;
mod locate;
mod sandbox;
mod template_env;
mod version;

pub use compile::{CompileOptions, CompileOutcome, DEFAULT_PDF_STANDARD, compile};
pub use error::{INSTALL_HINT, TypesetError};
pub use escape::{escape_markup, escape_string};
pub use fonts::{BUNDLED_FONTS, FONT_DIR, FONT_LICENCES, MONO_FAMILIES, TEXT_FAMILIES, font_rules};
pub use locate::{TYPST_ENV, TypstProgram, locate, locate_in};
pub use sandbox::{Sandbox, emit_source};
pub use template_env::{TemplateSource, TypstMarkup, template_environment, typst_markup};
pub use version::{MAX_TYPST_EXCLUSIVE, MIN_TYPST, TypstVersion};
