//! Checking what typst wrote before it may replace anything: a complete PDF
//! (it parses with `lopdf`, has at least one page and ends with `%%EOF`),
//! and, when asked, text that must be on its pages (the mains-safety notice),
//! so a template cannot leave it out, hide it behind `#if false` or rewrite
//! it with a show rule.

/// The largest file accepted from typst. A hand-over document is well under
/// a megabyte; 256 MiB leaves room for many photos.
pub(crate) const MAX_PDF_BYTES: u64 = 256 << 20;

/// What is wrong with a file typst wrote, in words ("it ends before `%%EOF`").
pub(crate) fn incomplete(bytes: &[u8]) -> Result<lopdf::Document, String> {
    if bytes.is_empty() {
        return Err("it is empty".into());
    }
    if !bytes.starts_with(b"%PDF-") {
        return Err("it does not start like a PDF (`%PDF-`)".into());
    }
    let tail = &bytes[bytes.len().saturating_sub(1024)..];
    if !tail.windows(5).any(|w| w == b"%%EOF") {
        return Err(format!(
            "it stops after {} bytes without the end-of-file mark `%%EOF`",
            bytes.len()
        ));
    }
    let document = lopdf::Document::load_mem(bytes)
        .map_err(|e| format!("it does not parse as a PDF ({e})"))?;
    let pages = document.get_pages().len();
    if pages == 0 {
        return Err("it has no pages".into());
    }
    Ok(document)
}

/// The phrases of `required` that the document's text lacks. Text is
/// compared without whitespace, so line breaks and the spacing a PDF puts
/// between words do not matter.
pub(crate) fn missing_phrases<'a>(
    document: &lopdf::Document,
    required: &'a [String],
) -> Vec<&'a str> {
    if required.is_empty() {
        return Vec::new();
    }
    let pages: Vec<u32> = document.get_pages().keys().copied().collect();
    let text: String = pages
        .iter()
        .flat_map(|&p| document.extract_text_chunks(&[p]))
        .filter_map(Result::ok)
        .collect();
    let text = squeeze(&text);
    required
        .iter()
        .filter(|phrase| !text.contains(&squeeze(phrase)))
        .map(String::as_str)
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

    #[test]
    fn truncated_or_foreign_files_are_incomplete() {
        assert!(incomplete(b"").unwrap_err().contains("empty"));
        assert!(incomplete(b"<html>").unwrap_err().contains("%PDF-"));
        assert!(incomplete(b"%PDF-1.7\n").unwrap_err().contains("%%EOF"));
        let err = incomplete(b"%PDF-1.7\ngarbage\n%%EOF\n").unwrap_err();
        assert!(err.contains("does not parse"), "{err}");
    }

    #[test]
    fn a_small_real_pdf_is_complete_and_its_text_is_found() {
        let bytes = tiny_pdf("Local electrical codes come first.");
        let doc = incomplete(&bytes).unwrap();
        let required = vec![
            "Local electrical\ncodes come first.".to_owned(),
            "Not in it".to_owned(),
        ];
        assert_eq!(missing_phrases(&doc, &required), ["Not in it"]);
        assert!(missing_phrases(&doc, &[]).is_empty());
        let cut = &bytes[..bytes.len() / 2];
        assert!(incomplete(cut).is_err());
    }

    /// A one-page PDF showing `text` in Helvetica, built with lopdf.
    fn tiny_pdf(text: &str) -> Vec<u8> {
        use lopdf::content::{Content, Operation};
        use lopdf::{Document, Object, Stream, dictionary};
        let mut doc = Document::with_version("1.7");
        let pages_id = doc.new_object_id();
        let font_id = doc.add_object(dictionary! {
            "Type" => "Font", "Subtype" => "Type1", "BaseFont" => "Helvetica",
            "Encoding" => "WinAnsiEncoding",
        });
        let resources_id = doc.add_object(dictionary! {
            "Font" => dictionary! { "F1" => font_id },
        });
        let content = Content {
            operations: vec![
                Operation::new("BT", vec![]),
                Operation::new("Tf", vec!["F1".into(), 12.into()]),
                Operation::new("Td", vec![50.into(), 700.into()]),
                Operation::new("Tj", vec![Object::string_literal(text)]),
                Operation::new("ET", vec![]),
            ],
        };
        let content_id = doc.add_object(Stream::new(dictionary! {}, content.encode().unwrap()));
        let page_id = doc.add_object(dictionary! {
            "Type" => "Page", "Parent" => pages_id, "Contents" => content_id,
            "Resources" => resources_id, "MediaBox" => vec![0.into(), 0.into(), 595.into(), 842.into()],
        });
        doc.objects.insert(
            pages_id,
            Object::Dictionary(dictionary! {
                "Type" => "Pages", "Kids" => vec![page_id.into()], "Count" => 1,
            }),
        );
        let catalog_id = doc.add_object(dictionary! { "Type" => "Catalog", "Pages" => pages_id });
        doc.trailer.set("Root", catalog_id);
        let mut bytes = Vec::new();
        doc.save_to(&mut bytes).unwrap();
        bytes
    }
}
