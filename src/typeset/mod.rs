//! The one door to the outside `typst` program: finding and checking it,
//! escaping user text for Typst, filling templates, laying out a sandbox
//! folder (generated source, plots, images), keeping the bundled fonts in a
//! per-user cache, running typst with a time limit and bounded output,
//! checking what it wrote, and writing the PDF atomically to a checked
//! destination, cleanly on a stop signal. Knows nothing about what a job
//! means.

mod child;
pub(crate) use child::{Running, Stopped, describe_status};
mod compile;
mod error;
mod escape;
mod font_cache;
mod fonts;
mod inside;
pub mod interrupt;
pub mod known_version;
mod leftovers;
mod locate;
mod output;
mod pdf_check;
mod rows;
mod sandbox;
mod template_env;
mod version;

pub use compile::{
    CompileOptions, CompileOutcome, DEFAULT_PDF_STANDARD, DEFAULT_TIMEOUT, FontPlace, FontsUsed,
    KEPT_PREFIX, PARTIAL_SUFFIX, RequiredText, WORK_PREFIX, compile, compile_with, place,
    threads_per_worker, write_small_file,
};
pub(crate) use compile::{locked_partial, sweep_partials};
pub use error::{INSTALL_HINT, TypesetError};
pub use escape::{
    escape_content, escape_content_into, escape_markup, escape_markup_into, escape_string,
    escape_string_into,
};
pub use font_cache::{
    FONTS_DIGEST, ensure_font_cache, font_cache_folder_name, is_complete as font_cache_is_complete,
    user_cache_root,
};
pub(crate) use fonts::chart_text_is_plain;
pub use fonts::{
    BUNDLED_FONTS, CJK_FAMILIES, CJK_FONT, FONT_DIR, FONT_LICENCES, MONO_FAMILIES, TEXT_FAMILIES,
    can_draw, cjk_folder, drawable, draws_every_char, fit_fonts, font_rules,
    font_rules_without_cjk, needs_cjk, placeholder, undrawable,
};
pub use inside::{InsideError, read_inside, read_regular};
pub use locate::{
    PendingTypst, TYPST_ENV, TypstProgram, locate, locate_in, start_locate, start_locate_afresh,
    start_locate_in, start_locate_keeping,
};
pub use output::{Input, InputIndex, OutputRefused, check_emit_folder, check_output};
pub use rows::{CountedText, RowList, Rows, TypstRow, serialize_counted_text};
pub use sandbox::{EMIT_PREFIX, FileContents, Sandbox, emit_source, emit_source_replacing};
pub(crate) use template_env::text_from_bytes;
pub use template_env::{
    OnDemand, PARALLEL_PARTS, TemplateSource, TypstMarkup, TypstMarkupParts, fill_each, refusal,
    template_environment, template_error_msg, typst_markup,
};
pub use version::{MAX_TYPST_EXCLUSIVE, MIN_TYPST, TypstVersion};
