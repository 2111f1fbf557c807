//! The shop's language: a built-in catalogue, or a translation file inside
//! the profile's own folder, read and checked against the English catalogue
//! before anything is rendered. A file that is outside the folder or cannot
//! be read is an error at the profile's `language` line; a problem inside
//! the file is an error at its own `file:line:column`.

use std::path::Path;

use crate::input_file::{InFolderError, ReadKeys, read_in_folder, too_large_msg};

use crate::catalogue::{Catalogue, CatalogueDiagnostics, Msg};
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
                    Msg::new("diag-no-catalogue").arg("tag", language.tag.value.as_str()),
                    Msg::new("diag-no-built-in-catalogue"),
                )
                .in_file_kind("shop"),
            ))
        });
    };
    let fail = |message: Msg, label: &'static str, help: &'static str| {
        TranslationError::Profile(Box::new(
            DecodeError::error("shop::translation", file.span, message, Msg::new(label))
                .with_help(Msg::new(help))
                .in_file_kind("shop"),
        ))
    };
    let folder = profile.parent().unwrap_or(Path::new("."));
    let help = "diag-translation-ftl";
    let limit = crate::input_file::MAX_INPUT_BYTES;
    let written = file.value.as_str();
    let read = read_in_folder(folder, file.value.trim(), limit).map_err(|e| match e {
        InFolderError::NotInside { .. } => fail(
            Msg::new("diag-translation-outside").arg("path", written),
            "diag-expected-in-profile-folder",
            "diag-translation-keep-inside",
        ),
        InFolderError::LeadsOutside { real, .. } => fail(
            Msg::new("diag-translation-link")
                .arg("path", written)
                .arg("target", real.display().to_string()),
            "diag-leads-outside",
            "diag-translation-copy",
        ),
        InFolderError::NotAFile { path } => fail(
            Msg::new("diag-translation-not-file").arg("path", path.display().to_string()),
            "diag-not-a-file",
            help,
        ),
        InFolderError::TooLarge { path, .. } => fail(
            too_large_msg(&TRANSLATION_KEYS, &path.display().to_string()),
            "diag-this-file",
            help,
        ),
        InFolderError::Io { path, source } => fail(
            Msg::new("diag-translation-cannot-read")
                .arg("path", path.display().to_string())
                .arg("error", crate::catalogue::os_error(&source)),
            "diag-this-file",
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
        let message = e.msg(&TRANSLATION_KEYS);
        fail(message, "diag-this-file", "diag-translation-utf8-ftl")
    })?;
    Catalogue::from_translation(&language.tag.value, &place.display().to_string(), &text)
        .map_err(|d| TranslationError::File(Box::new(d)))
}

/// A translation file's reading problems (`diag-translation-…`).
const TRANSLATION_KEYS: ReadKeys = ReadKeys {
    cannot_read: "diag-translation-cannot-read",
    too_large: "diag-translation-too-large",
    not_utf8: "diag-translation-not-utf8",
};
