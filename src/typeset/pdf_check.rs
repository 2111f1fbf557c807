//! Checking what typst wrote before it may replace anything: a complete PDF
//! (it parses with `lopdf`, has at least one page and ends with `%%EOF`),
//! and, when asked, text that must be on its pages (the mains-safety notice),
//! so a template cannot leave it out, hide it behind `#if false` or rewrite
//! it with a show rule.

use crate::catalogue::Msg;

/// The largest file accepted from typst. A hand-over document is well under
/// a megabyte; 256 MiB leaves room for many photos.
pub(crate) const MAX_PDF_BYTES: u64 = 256 << 20;

/// What is wrong with a file typst wrote, as a catalogue message
/// (`cli-typst-pdf-…`: "it ends before `%%EOF`"), said in the reader's
/// language by the failure that quotes it. lopdf's own words, when it
/// cannot parse the file, are quoted inside as a detail.
pub(crate) fn incomplete(bytes: &[u8]) -> Result<lopdf::Document, Msg> {
    if bytes.is_empty() {
        return Err(Msg::new("cli-typst-pdf-empty"));
    }
    if !bytes.starts_with(b"%PDF-") {
        return Err(Msg::new("cli-typst-pdf-not-pdf"));
    }
    let tail = &bytes[bytes.len().saturating_sub(1024)..];
    if !tail.windows(5).any(|w| w == b"%%EOF") {
        return Err(Msg::new("cli-typst-pdf-no-end").arg("size", bytes.len()));
    }
    let document = lopdf::Document::load_mem(bytes)
        .map_err(|e| Msg::new("cli-typst-pdf-unparsable").arg("detail", e.to_string()))?;
    let pages = document.get_pages().len();
    if pages == 0 {
        return Err(Msg::new("cli-typst-pdf-no-pages"));
    }
    Ok(document)
}

/// The phrases of `required` that the document's text lacks. Text is
/// compared without whitespace, so line breaks and the spacing a PDF puts
/// between words do not matter.
///
/// Pages are read from the last one back, and reading stops as soon as
/// the text of the pages read so far (in page order) holds every phrase:
/// a phrase found in the text of the last pages is found in the text of
/// all of them, so the answer is the one reading every page gives, while
/// a document whose notice sits near its end (as the hand-over
/// document's does) is not read whole. Extracting a page's text is most
/// of what the check costs.
pub(crate) fn missing_phrases<'a>(
    document: &lopdf::Document,
    required: &'a [String],
) -> Vec<&'a str> {
    if required.is_empty() {
        return Vec::new();
    }
    let wanted: Vec<String> = required.iter().map(|p| squeeze(p)).collect();
    let pages: Vec<u32> = document.get_pages().keys().copied().collect();
    // The squeezed text of the pages read so far, last page first.
    let mut read: Vec<String> = Vec::new();
    let mut text = String::new();
    for &page in pages.iter().rev() {
        let chunks: String = document
            .extract_text_chunks(&[page])
            .into_iter()
            .filter_map(Result::ok)
            .collect();
        read.push(squeeze(&chunks));
        text = read.iter().rev().map(String::as_str).collect();
        if wanted.iter().all(|w| text.contains(w.as_str())) {
            return Vec::new();
        }
    }
    required
        .iter()
        .zip(&wanted)
        .filter(|(_, w)| !text.contains(w.as_str()))
        .map(|(phrase, _)| phrase.as_str())
        .collect()
}

/// The text without whitespace, soft hyphens and zero-width spaces.
fn squeeze(text: &str) -> String {
    text.chars()
        .filter(|c| !c.is_whitespace() && !matches!(c, '\u{ad}' | '\u{200b}'))
        .collect()
}

#[cfg(test)]
mod tests {
    use super::*;

    /// A document with one page for each entry of `pages`, each showing
    /// its lines.
    fn pdf(pages: &[&[&str]]) -> lopdf::Document {
        use lopdf::content::{Content, Operation};
        use lopdf::{Document, Object, Stream, dictionary};
        let mut doc = Document::with_version("1.7");
        let pages_id = doc.new_object_id();
        let font_id = doc.add_object(dictionary! {
            "Type" => "Font", "Subtype" => "Type1", "BaseFont" => "Helvetica",
            "Encoding" => "WinAnsiEncoding",
        });
        let resources_id =
            doc.add_object(dictionary! { "Font" => dictionary! { "F1" => font_id } });
        let mut kids: Vec<Object> = Vec::new();
        for lines in pages {
            let mut operations = vec![
                Operation::new("BT", vec![]),
                Operation::new("Tf", vec!["F1".into(), 8.into()]),
                Operation::new("TL", vec![12.into()]),
                Operation::new("Td", vec![40.into(), 800.into()]),
            ];
            for line in *lines {
                operations.push(Operation::new("Tj", vec![Object::string_literal(*line)]));
                operations.push(Operation::new("T*", vec![]));
            }
            operations.push(Operation::new("ET", vec![]));
            let content = Content { operations }.encode().unwrap();
            let content_id = doc.add_object(Stream::new(dictionary! {}, content));
            let page_id = doc.add_object(dictionary! {
                "Type" => "Page", "Parent" => pages_id, "Contents" => content_id,
                "Resources" => resources_id, "MediaBox" => vec![0.into(), 0.into(), 595.into(), 842.into()],
            });
            kids.push(page_id.into());
        }
        let count = kids.len() as i64;
        doc.objects.insert(
            pages_id,
            lopdf::Object::Dictionary(
                dictionary! { "Type" => "Pages", "Kids" => kids, "Count" => count },
            ),
        );
        let catalog_id = doc.add_object(dictionary! { "Type" => "Catalog", "Pages" => pages_id });
        doc.trailer.set("Root", catalog_id);
        doc
    }

    #[test]
    fn phrases_are_found_on_any_page_and_across_a_page_break() {
        let doc = pdf(&[
            &["Before opening the unit,", "unplug it."],
            &["Filter capacitors hold"],
            &["a charge for minutes.", "The end."],
        ]);
        let required = |p: &[&str]| p.iter().map(|s| s.to_string()).collect::<Vec<_>>();
        // On the last page only: found without reading the others.
        assert!(missing_phrases(&doc, &required(&["The end."])).is_empty());
        // On the first page: every page is read back to it.
        assert!(
            missing_phrases(&doc, &required(&["Before opening the unit, unplug it."])).is_empty()
        );
        // Split across the break between the second and third pages.
        assert!(missing_phrases(&doc, &required(&["hold a charge"])).is_empty());
        // Only the phrase that is nowhere is missing, in the order given.
        let wanted = required(&["unplug it.", "a charge held", "The end.", "nowhere"]);
        assert_eq!(missing_phrases(&doc, &wanted), ["a charge held", "nowhere"]);
        // Out of page order is not found.
        assert_eq!(
            missing_phrases(&doc, &required(&["minutes.Filter"])),
            ["minutes.Filter"]
        );
    }

    #[test]
    fn truncated_or_foreign_files_are_incomplete() {
        let why = |bytes: &[u8]| incomplete(bytes).unwrap_err();
        assert_eq!(why(b"").key, "cli-typst-pdf-empty");
        assert_eq!(why(b"<html>").key, "cli-typst-pdf-not-pdf");
        let no_end = why(b"%PDF-1.7\n");
        assert_eq!(
            no_end.english(),
            "it stops after 9 bytes without the end-of-file mark `%%EOF`"
        );
        let err = why(b"%PDF-1.7\ngarbage\n%%EOF\n");
        assert_eq!(err.key, "cli-typst-pdf-unparsable");
        assert!(
            err.english().starts_with("it does not parse as a PDF ("),
            "{err:?}"
        );
        // In German, with lopdf's own words quoted inside.
        let de = crate::catalogue::Catalogue::built_in("de").unwrap();
        assert_eq!(
            de.say(&no_end),
            "sie endet nach 9 Bytes ohne die Dateiende-Marke `%%EOF`"
        );
        assert_eq!(de.say(&why(b"")), "sie ist leer");
    }
}
