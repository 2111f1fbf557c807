//! The one door to the outside `typst` program: finding and checking it,
//! escaping user text for Typst, filling templates, laying out a sandbox
//! folder (generated source, plots, images), keeping the bundled fonts in a
//! per-user cache, running typst and writing the PDF atomically. Knows
//! nothing about what a job means.

mod compile;
mod error;
mod escape;
mod font_cache;
mod fonts;
mod locate;
mod sandbox;
mod template_env;
mod version;

pub use compile::{
    CompileOptions, CompileOutcome, DEFAULT_PDF_STANDARD, FontPlace, FontsUsed, compile,
};
pub use error::{INSTALL_HINT, TypesetError};
pub use escape::{escape_markup, escape_string};
pub use font_cache::{
    FONTS_DIGEST, ensure_font_cache, font_cache_folder_name, is_complete as font_cache_is_complete,
    user_cache_root,
};
pub use fonts::{
    BUNDLED_FONTS, FONT_DIR, FONT_LICENCES, MONO_FAMILIES, TEXT_FAMILIES, can_draw, drawable,
    font_rules, placeholder, undrawable,
};
pub use locate::{
    PendingTypst, TYPST_ENV, TypstProgram, locate, locate_in, start_locate, start_locate_in,
};
pub use sandbox::{Sandbox, emit_source};
pub use template_env::{TemplateSource, TypstMarkup, template_environment, typst_markup};
pub use version::{MAX_TYPST_EXCLUSIVE, MIN_TYPST, TypstVersion};
