//! The shop's language: a built-in catalogue, or a translation file inside
//! the profile's own folder, read and checked against the English catalogue
//! before anything is rendered. A file that is outside the folder or cannot
//! be read is an error at the profile's `language` line; a problem inside
//! the file is an error at its own `file:line:column`.

use std::path::Path;

use crate::input_file::{InFolderError, read_in_folder};

use crate::catalogue::{Catalogue, CatalogueDiagnostics};
use crate::job::DecodeError;

use super::Language;

/// Why the shop's catalogue could not be had.
#[derive(Debug)]
pub enum TranslationError {
    /// The `language` node of the profile is at fault (file missing,
    /// outside the folder, unreadable).
    Profile(Box<DecodeError>),
    /// The translation file has problems, each at its line.
    File(Box<CatalogueDiagnostics>),
}

/// The catalogue for a profile's `language`, the profile being at
/// `profile`.
pub fn read_translation(
    profile: &Path,
    language: &Language,
) -> Result<Catalogue, TranslationError> {
    let Some(file) = &language.file else {
        return Catalogue::built_in(&language.tag.value).ok_or_else(|| {
            TranslationError::Profile(Box::new(
                DecodeError::error(
                    "shop::unknown-language",
                    language.tag.span,
                    format!(
                        "the program has no catalogue for `{}` built in",
                        language.tag.value
                    ),
                    "no built-in catalogue",
                )
                .in_file_kind("shop"),
            ))
        });
    };
    let fail = |message: String, label: &str, help: &str| {
        TranslationError::Profile(Box::new(
            DecodeError::error("shop::translation", file.span, message, label)
                .with_help(help)
                .in_file_kind("shop"),
        ))
    };
    let folder = profile.parent().unwrap_or(Path::new("."));
    let help = "the translation must be a Fluent (.ftl) file in the profile's folder";
    let limit = crate::input_file::MAX_INPUT_BYTES;
    let read = read_in_folder(folder, file.value.trim(), limit).map_err(|e| match e {
        InFolderError::NotInside { .. } => fail(
            format!(
                "the translation file `{}` is not inside the profile's folder",
                file.value
            ),
            "expected a file name in the profile's folder",
            "put the translation beside shop.kdl (or in a folder below it) and name it relative to it, for example file=\"de.ftl\"",
        ),
        InFolderError::LeadsOutside { real, .. } => fail(
            format!(
                "the translation file `{}` leads outside the profile's folder (to {})",
                file.value,
                real.display()
            ),
            "leads outside",
            "copy the translation into the profile's folder instead of linking to it",
        ),
        InFolderError::NotAFile { path } => fail(
            format!("the translation file {} is not a regular file", path.display()),
            "not a file",
            help,
        ),
        InFolderError::TooLarge { path, .. } => fail(
            crate::input_file::InputFileError::TooLarge {
                what: "translation file",
                path: path.display().to_string(),
            }
            .to_string(),
            "this file",
            help,
        ),
        InFolderError::Io { path, source } => fail(
            format!("cannot read the translation file {}: {source}", path.display()),
            "this file",
            help,
        ),
    })?;
    let place = read.place;
    let text = crate::input_file::read_from(
        read.bytes.as_slice(),
        read.real.display().to_string(),
        "translation file",
    )
    .map_err(|e| {
        fail(
            e.to_string(),
            "this file",
            "the translation must be a UTF-8 Fluent (.ftl) file in the profile's folder",
        )
    })?;
    Catalogue::from_translation(&language.tag.value, &place.display().to_string(), &text)
        .map_err(|d| TranslationError::File(Box::new(d)))
}
