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
}
