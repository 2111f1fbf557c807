//! The shop profile (`shop.kdl`): the shop's name, address, contact lines
//! and logo for the document's header, the paper size, and the defaults its
//! jobs start from (technician, guide bands, safety-test limits, currency
//! and tax, warranty and terms). Another input beside the job file, decoded
//! the same way: typed values with spans, every problem collected and shown
//! at `file:line:column`. Its bands and limits are merged into the job
//! while the job is decoded ([`crate::job::decode_with_defaults`]), so the
//! calculation never knows where a threshold came from.

mod decode;
pub mod discover;
pub mod logo;
mod model;
pub mod translation;

pub use decode::{SHOP_FORMAT_VERSION, SHOP_TOP_LEVEL};
pub use discover::{Found, SHOP_FILE, discover, user_config_dir};
pub use logo::{Logo, LogoKind, read_logo};
pub use model::*;
pub use translation::{TranslationError, read_translation};

use miette::{NamedSource, SourceSpan};
use std::sync::Arc;

use crate::job::reader::Reader;
use crate::job::{DecodeError, JobDiagnostics};

/// The annotated profile `ampreport init --shop` writes.
pub const SKELETON: &str = include_str!("../../templates/shop-skeleton.kdl");

/// A decoded shop profile and any warnings found on the way.
#[derive(Debug, Clone)]
pub struct DecodedShop {
    pub profile: ShopProfile,
    pub diagnostics: JobDiagnostics,
}

/// The language tag the profile's top-level `language` node names, read
/// on its own so the profile's problems can be said in that language even
/// when the rest of the profile is refused; `None` when the text is not
/// KDL or names none.
pub fn named_language(text: &str) -> Option<String> {
    let tree = crate::kdl_fast::parse_tree(text).ok()?;
    let node = tree
        .doc()
        .nodes()
        .find(|n| n.name().value() == "language")?;
    match node.entries().iter().find(|e| e.name().is_none())?.value() {
        crate::kdl_fast::Value::String(s) => Some(s.trim().to_owned()),
        _ => None,
    }
}

/// Decodes shop-profile text; `name` is the file name used in messages.
/// Never panics, whatever the text. The logo is only named here; it is
/// read and checked by [`read_logo`].
pub fn decode(name: &str, text: &str) -> Result<DecodedShop, JobDiagnostics> {
    let source = crate::problem_cap::ClippedSource(
        NamedSource::new(name, Arc::new(text.to_string())).with_language("kdl"),
    );
    let mut problems = Vec::new();
    let profile = match crate::kdl_fast::parse_tree(text) {
        Ok(tree) => {
            let mut reader = Reader::new(text);
            let profile = decode::decode_document(tree.doc(), name, &mut reader);
            problems.append(&mut reader.problems);
            profile
        }
        Err(e) => {
            problems.extend(crate::job::syntax_problems(text, &e));
            None
        }
    };
    let mut problems: Vec<DecodeError> = problems
        .into_iter()
        .map(|p| p.in_file_kind("shop"))
        .collect();
    problems.sort_by_key(|p| p.span.offset());
    let diagnostics = JobDiagnostics::new(source, problems);
    match profile {
        Some(profile) if !diagnostics.has_errors() => Ok(DecodedShop {
            profile,
            diagnostics,
        }),
        _ => {
            let mut diagnostics = diagnostics;
            if !diagnostics.has_errors() {
                diagnostics.problems.push(
                    DecodeError::error(
                        "shop::incomplete",
                        SourceSpan::new(0.into(), 0),
                        crate::catalogue::Msg::new("diag-incomplete").arg("file", "shop"),
                        crate::catalogue::Msg::new("diag-here"),
                    )
                    .in_file_kind("shop"),
                );
            }
            Err(diagnostics)
        }
    }
}

#[cfg(test)]
mod tests;
