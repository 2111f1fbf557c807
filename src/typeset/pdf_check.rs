//! Checking what typst wrote before it may replace anything: a complete PDF
//! (it ends with `%%EOF`, `lopdf` reads its cross-reference table, every
//! object the table lists begins where the table says, and it has at least
//! one page), and, when asked, text that must be on its pages (the
//! mains-safety notice), so a template cannot leave it out, hide it behind
//! `#if false` or rewrite it with a show rule. Only the objects the page
//! tree and the pages read need are parsed ([`Pdf`]).

use std::collections::{BTreeMap, HashSet};

use lopdf::xref::XrefEntry;
use lopdf::{Document, Object, ObjectId, Reader};

use crate::catalogue::Msg;

/// The largest file accepted from typst. A hand-over document is well under
/// a megabyte; 256 MiB leaves room for many photos.
pub(crate) const MAX_PDF_BYTES: u64 = 256 << 20;

/// A PDF typst wrote, read with lopdf only as far as the check needs.
///
/// A hand-over document is some 1,100 objects, nine in ten of them the
/// tagged PDF's structure elements; parsing them all was about 20 ms,
/// most of what the check cost, while the check reads the page tree and
/// the few pages it takes the text of (some 60 objects). So the
/// cross-reference table and the trailer are read first, every object
/// the table lists is checked to begin where the table says (its `N G
/// obj` header: a file cut short, spliced or shifted fails here, where
/// reading it whole let lopdf skip a broken object), and lopdf parses an
/// object when the page tree or a page's text needs it. A file whose
/// table this does not cover (encrypted, updated in increments, objects
/// packed in object streams, or a table lopdf cannot read this way) is
/// read whole, as before.
pub(crate) struct Pdf<'a> {
    /// The objects read so far, under the file's trailer.
    document: Document,
    /// Where the objects not read yet come from; `None` when the file was
    /// read whole.
    reader: Option<Reader<'a>>,
}

/// What is wrong with a file typst wrote, as a catalogue message
/// (`cli-typst-pdf-…`: "it ends before `%%EOF`"), said in the reader's
/// language by the failure that quotes it. lopdf's own words, when it
/// cannot parse the file, are quoted inside as a detail.
pub(crate) fn incomplete(bytes: &[u8]) -> Result<Pdf<'_>, Msg> {
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
    let pdf = match Pdf::by_table(bytes)? {
        Some(pdf) => pdf,
        None => Pdf::whole(bytes)?,
    };
    if pdf.document.get_pages().is_empty() {
        return Err(Msg::new("cli-typst-pdf-no-pages"));
    }
    Ok(pdf)
}

impl<'a> Pdf<'a> {
    /// The whole file parsed by lopdf.
    fn whole(bytes: &[u8]) -> Result<Self, Msg> {
        let document = Document::load_mem(bytes)
            .map_err(|e| Msg::new("cli-typst-pdf-unparsable").arg("detail", e.to_string()))?;
        Ok(Self {
            document,
            reader: None,
        })
    }

    /// The file read from its cross-reference table, with its page tree;
    /// `None` when the table is not one this reads (the file is then read
    /// whole, and lopdf says what is wrong with it, if anything); an error
    /// when an object is not where the table says.
    fn by_table(bytes: &'a [u8]) -> Result<Option<Self>, Msg> {
        let Some((xref, trailer, version)) = table_and_trailer(bytes) else {
            return Ok(None);
        };
        if ["Encrypt", "Prev", "XRefStm"]
            .iter()
            .any(|key| trailer.has(key.as_bytes()))
        {
            return Ok(None);
        }
        for (&id, entry) in &xref.entries {
            match *entry {
                XrefEntry::Normal { offset, generation } => {
                    if !object_starts_at(bytes, (id, generation), offset as usize) {
                        return Err(Msg::new("cli-typst-pdf-misplaced")
                            .arg("object", id.to_string())
                            .arg("offset", offset.to_string()));
                    }
                }
                XrefEntry::Compressed { .. } => return Ok(None),
                XrefEntry::Free | XrefEntry::UnusableFree => {}
            }
        }
        let mut document = Document::new();
        document.version = version;
        document.max_id = xref.max_id();
        document.trailer = trailer;
        let mut reader = Reader {
            buffer: bytes,
            document: Document::new(),
            encryption_state: None,
            raw_objects: BTreeMap::new(),
            password: None,
            strict: false,
        };
        reader.document.reference_table = xref;
        let mut pdf = Self {
            document,
            reader: Some(reader),
        };
        pdf.read_page_tree();
        Ok(Some(pdf))
    }

    /// The object `id`, parsed by lopdf from where the table puts it the
    /// first time it is asked for; `None` when it is not there or does
    /// not parse (as reading the file whole leaves it out).
    fn object(&mut self, id: ObjectId) -> Option<&Object> {
        if let Some(reader) = &self.reader
            && !self.document.objects.contains_key(&id)
        {
            let object = reader.get_object(id, &mut HashSet::new()).ok()?;
            self.document.objects.insert(id, object);
        }
        self.document.objects.get(&id)
    }

    /// Reads the catalogue and every node of the page tree, with what
    /// each node's resources name (pages inherit them).
    fn read_page_tree(&mut self) {
        let Ok(root) = self
            .document
            .trailer
            .get(b"Root")
            .and_then(Object::as_reference)
        else {
            return;
        };
        let Some(Ok(pages)) = self.object(root).map(|catalog| {
            catalog
                .as_dict()
                .and_then(|d| d.get(b"Pages"))
                .and_then(Object::as_reference)
        }) else {
            return;
        };
        let mut todo = vec![pages];
        let mut seen = HashSet::new();
        while let Some(id) = todo.pop() {
            if !seen.insert(id) {
                continue;
            }
            let mut resources = Vec::new();
            if let Some(Ok(node)) = self.object(id).map(Object::as_dict) {
                if let Ok(kids) = node.get(b"Kids").and_then(Object::as_array) {
                    todo.extend(kids.iter().filter_map(|k| k.as_reference().ok()));
                }
                if let Ok(named) = node.get(b"Resources") {
                    references(named, &mut resources);
                }
            }
            self.read_all(resources);
        }
    }

    /// Reads the objects `todo` names and every object they name in turn,
    /// except a page tree node's parent.
    fn read_all(&mut self, mut todo: Vec<ObjectId>) {
        if self.reader.is_none() {
            return;
        }
        let mut seen = HashSet::new();
        while let Some(id) = todo.pop() {
            if !seen.insert(id) {
                continue;
            }
            if let Some(object) = self.object(id) {
                references(object, &mut todo);
            }
        }
    }

    /// The pages, numbered from 1, in order.
    fn pages(&self) -> Vec<(u32, ObjectId)> {
        self.document.get_pages().into_iter().collect()
    }

    /// The pages the first page links to (its link annotations with a
    /// destination in the document), as places in `pages`, in the order
    /// of the links: where the hand-over document's first page says the
    /// notice is.
    fn linked_from_first_page(&mut self, pages: &[(u32, ObjectId)]) -> Vec<usize> {
        let Some(&(_, first)) = pages.first() else {
            return Vec::new();
        };
        let listed = match self.object(first).map(Object::as_dict) {
            Some(Ok(page)) => page.get(b"Annots").ok().cloned(),
            _ => None,
        };
        let listed = match listed {
            Some(Object::Reference(id)) => self.object(id).cloned(),
            other => other,
        };
        let mut annotations = Vec::new();
        if let Some(Object::Array(items)) = &listed {
            annotations.extend(items.iter().filter_map(|o| o.as_reference().ok()));
        }
        let mut linked = Vec::new();
        for annotation in annotations {
            let Some(Ok(link)) = self.object(annotation).map(Object::as_dict) else {
                continue;
            };
            if !link
                .get(b"Subtype")
                .and_then(Object::as_name)
                .is_ok_and(|n| n == b"Link")
            {
                continue;
            }
            let target = match link.get(b"Dest") {
                Ok(dest) => dest.clone(),
                Err(_) => match link.get(b"A").and_then(Object::as_dict) {
                    Ok(action)
                        if action
                            .get(b"S")
                            .and_then(Object::as_name)
                            .is_ok_and(|n| n == b"GoTo") =>
                    {
                        match action.get(b"D") {
                            Ok(dest) => dest.clone(),
                            Err(_) => continue,
                        }
                    }
                    _ => continue,
                },
            };
            let target = match target {
                Object::Reference(id) => match self.object(id) {
                    Some(object) => object.clone(),
                    None => continue,
                },
                other => other,
            };
            let page = target
                .as_array()
                .ok()
                .and_then(|dest| dest.first())
                .and_then(|p| p.as_reference().ok());
            if let Some(place) = page.and_then(|page| pages.iter().position(|&(_, id)| id == page))
                && !linked.contains(&place)
            {
                linked.push(place);
            }
        }
        linked
    }

    /// The text of page `number` (object `id`), as lopdf extracts it.
    fn page_text(&mut self, number: u32, id: ObjectId) -> String {
        let mut named = Vec::new();
        if let Some(Ok(page)) = self.object(id).map(Object::as_dict) {
            for key in [&b"Contents"[..], b"Resources"] {
                if let Ok(value) = page.get(key) {
                    references(value, &mut named);
                }
            }
        }
        self.read_all(named);
        self.document
            .extract_text_chunks(&[number])
            .into_iter()
            .filter_map(Result::ok)
            .collect()
    }
}

/// The cross-reference table and trailer of the file, with its PDF
/// version, read by lopdf from the file's header and its last section
/// alone (from the offset `startxref` gives to the end): lopdf parses
/// that as a file of its own, finding no objects in it.
fn table_and_trailer(bytes: &[u8]) -> Option<(lopdf::xref::Xref, lopdf::Dictionary, String)> {
    let from = bytes.len().saturating_sub(1024);
    let mark = from + bytes[from..].windows(9).rposition(|w| w == b"startxref")?;
    let after = &bytes[mark + 9..];
    let digits = after.iter().position(|b| !b.is_ascii_whitespace())?;
    let number = &after[digits..];
    let len = number.iter().take_while(|b| b.is_ascii_digit()).count();
    let start: usize = std::str::from_utf8(&number[..len]).ok()?.parse().ok()?;
    if start >= mark {
        return None;
    }
    let header = bytes.iter().position(|&b| b == b'\n' || b == b'\r')?;
    let mut section = bytes[..header].to_vec();
    section.push(b'\n');
    let at = section.len();
    section.extend_from_slice(&bytes[start..mark]);
    section.extend_from_slice(format!("startxref\n{at}\n%%EOF\n").as_bytes());
    let read = Document::load_mem(&section).ok()?;
    Some((read.reference_table, read.trailer, read.version))
}

/// True when the object `id` begins at `offset`: its number, its
/// generation and `obj`, as the PDF standard writes an object's header.
fn object_starts_at(bytes: &[u8], id: ObjectId, offset: usize) -> bool {
    let Some(rest) = bytes.get(offset..) else {
        return false;
    };
    // A whole number of at most ten digits and the whitespace after it.
    let number = |rest: &[u8]| -> Option<(u64, usize)> {
        let len = rest.iter().take_while(|b| b.is_ascii_digit()).count();
        if len == 0 || len > 10 {
            return None;
        }
        let value = std::str::from_utf8(&rest[..len]).ok()?.parse().ok()?;
        let space = rest[len..]
            .iter()
            .take_while(|b| b.is_ascii_whitespace())
            .count();
        (space > 0).then_some((value, len + space))
    };
    let Some((number_read, used)) = number(rest) else {
        return false;
    };
    let rest = &rest[used..];
    let Some((generation_read, used)) = number(rest) else {
        return false;
    };
    number_read == u64::from(id.0)
        && generation_read == u64::from(id.1)
        && rest[used..].starts_with(b"obj")
}

/// Adds to `out` every object `object` names, directly or inside its
/// arrays and dictionaries (a stream's dictionary included), except a
/// page tree node's `Parent`.
fn references(object: &Object, out: &mut Vec<ObjectId>) {
    match object {
        Object::Reference(id) => out.push(*id),
        Object::Array(items) => items.iter().for_each(|o| references(o, out)),
        Object::Dictionary(dict) => dict_references(dict, out),
        Object::Stream(stream) => dict_references(&stream.dict, out),
        _ => {}
    }
}

fn dict_references(dict: &lopdf::Dictionary, out: &mut Vec<ObjectId>) {
    for (key, value) in dict.iter() {
        if key.as_slice() != b"Parent" {
            references(value, out);
        }
    }
}

/// How many pages from one the first page links to are read for the
/// phrases before the document is read from its end.
const LINKED_PAGES_READ: usize = 2;

/// The phrases of `required` that the document's text lacks. Text is
/// compared without whitespace, so line breaks and the spacing a PDF puts
/// between words do not matter.
///
/// The phrases are looked for in the text of a run of consecutive pages,
/// and a phrase found in the text of some consecutive pages is found in
/// the text of all of them: so the answer is the one reading every page
/// gives, while only the pages that hold them are read where that can be
/// told. First the page the first page links to (the hand-over
/// document's line naming the page of its notice) and the one after it
/// are read; then, if the phrases are not all there, pages from the last
/// one back, until the text of the pages read so far (in page order)
/// holds every phrase. A document whose notice sits near its end is not
/// read whole either way. Extracting a page's text is most of what the
/// check costs.
pub(crate) fn missing_phrases<'a>(document: &mut Pdf<'_>, required: &'a [String]) -> Vec<&'a str> {
    if required.is_empty() {
        return Vec::new();
    }
    let wanted: Vec<String> = required.iter().map(|p| squeeze(p)).collect();
    let all_in = |text: &str| wanted.iter().all(|w| text.contains(w.as_str()));
    let pages = document.pages();
    // Each page's squeezed text, once read.
    let mut read: Vec<Option<String>> = vec![None; pages.len()];
    let mut text_of = |document: &mut Pdf<'_>, place: usize| -> String {
        read[place]
            .get_or_insert_with(|| {
                let (number, id) = pages[place];
                squeeze(&document.page_text(number, id))
            })
            .clone()
    };
    for start in document.linked_from_first_page(&pages) {
        let mut text = String::new();
        for place in start..(start + LINKED_PAGES_READ).min(pages.len()) {
            text.push_str(&text_of(document, place));
            if all_in(&text) {
                return Vec::new();
            }
        }
    }
    // The text of the pages read from the end, last page first.
    let mut from_end: Vec<String> = Vec::new();
    let mut text = String::new();
    for place in (0..pages.len()).rev() {
        from_end.push(text_of(document, place));
        text = from_end.iter().rev().map(String::as_str).collect();
        if all_in(&text) {
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
    /// its lines. The font sits in the page tree's root, which every page
    /// inherits it from, and each page's content is an array of two
    /// streams, the second with its length in an object of its own.
    fn pdf(pages: &[&[&str]]) -> Document {
        pdf_linking(pages, None)
    }

    /// [`pdf`], its first page linking to page `link` (counted from 0),
    /// as the hand-over document's first page links to its notice.
    fn pdf_linking(pages: &[&[&str]], link: Option<usize>) -> Document {
        use lopdf::content::{Content, Operation};
        use lopdf::{Stream, dictionary};
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
            let content = Content { operations }.encode().unwrap();
            let end = Content {
                operations: vec![Operation::new("ET", vec![])],
            }
            .encode()
            .unwrap();
            let first = doc.add_object(Stream::new(dictionary! {}, content));
            let length = doc.add_object(Object::Integer(end.len() as i64));
            let mut second = Stream::new(dictionary! {}, end);
            second.dict.set("Length", Object::Reference(length));
            let second = doc.add_object(second);
            let page_id = doc.add_object(dictionary! {
                "Type" => "Page", "Parent" => pages_id,
                "Contents" => vec![first.into(), second.into()],
                "MediaBox" => vec![0.into(), 0.into(), 595.into(), 842.into()],
            });
            kids.push(page_id.into());
        }
        if let Some(target) = link {
            let dest = doc.add_object(vec![
                kids[target].clone(),
                "XYZ".into(),
                0.into(),
                800.into(),
                Object::Null,
            ]);
            let url = doc.add_object(dictionary! {
                "Type" => "Annot", "Subtype" => "Link", "Rect" => vec![0.into(), 0.into(), 9.into(), 9.into()],
                "A" => dictionary! { "S" => "URI", "URI" => Object::string_literal("https://example.invalid") },
            });
            let annotation = doc.add_object(dictionary! {
                "Type" => "Annot", "Subtype" => "Link", "Rect" => vec![0.into(), 0.into(), 9.into(), 9.into()],
                "Dest" => dest,
            });
            let first = kids[0].as_reference().unwrap();
            doc.get_dictionary_mut(first)
                .unwrap()
                .set("Annots", vec![url.into(), annotation.into()]);
        }
        let count = kids.len() as i64;
        doc.objects.insert(
            pages_id,
            lopdf::Object::Dictionary(dictionary! {
                "Type" => "Pages", "Kids" => kids, "Count" => count, "Resources" => resources_id,
            }),
        );
        let catalog_id = doc.add_object(dictionary! { "Type" => "Catalog", "Pages" => pages_id });
        doc.trailer.set("Root", catalog_id);
        doc
    }

    /// The file lopdf writes for `doc`: a cross-reference table, each
    /// object on its own.
    fn bytes(mut doc: Document) -> Vec<u8> {
        let mut out = Vec::new();
        doc.save_to(&mut out).unwrap();
        out
    }

    /// The page numbers and each page's text, as `pdf` reads them.
    fn read(pdf: &mut Pdf<'_>) -> Vec<(u32, String)> {
        pdf.pages()
            .into_iter()
            .map(|(number, id)| (number, pdf.page_text(number, id)))
            .collect()
    }

    #[test]
    fn phrases_are_found_on_any_page_and_across_a_page_break() {
        let file = bytes(pdf(&[
            &["Before opening the unit,", "unplug it."],
            &["Filter capacitors hold"],
            &["a charge for minutes.", "The end."],
        ]));
        let required = |p: &[&str]| p.iter().map(|s| s.to_string()).collect::<Vec<_>>();
        let missing = |p: &[&str]| -> Vec<String> {
            let mut doc = incomplete(&file).unwrap();
            assert!(doc.reader.is_some(), "read from its table");
            let wanted = required(p);
            missing_phrases(&mut doc, &wanted)
                .into_iter()
                .map(str::to_owned)
                .collect()
        };
        // On the last page only: found without reading the others.
        assert!(missing(&["The end."]).is_empty());
        // On the first page: every page is read back to it.
        assert!(missing(&["Before opening the unit, unplug it."]).is_empty());
        // Split across the break between the second and third pages.
        assert!(missing(&["hold a charge"]).is_empty());
        // Only the phrase that is nowhere is missing, in the order given.
        assert_eq!(
            missing(&["unplug it.", "a charge held", "The end.", "nowhere"]),
            ["a charge held", "nowhere"]
        );
        // Out of page order is not found.
        assert_eq!(missing(&["minutes.Filter"]), ["minutes.Filter"]);
    }

    /// Whether the content of page `place` (from 0) was parsed.
    fn content_read(pdf: &mut Pdf<'_>, place: usize) -> bool {
        let (_, id) = pdf.pages()[place];
        let contents = pdf.document.get_page_contents(id);
        contents
            .iter()
            .all(|id| pdf.document.objects.contains_key(id))
    }

    #[test]
    fn the_page_the_first_page_links_to_is_read_first_and_the_answer_stays_exact() {
        let notice: &[&str] = &[
            "MAINS SAFETY",
            "Deadly voltages.",
            "Local codes come first.",
        ];
        let pages = |at: usize| -> Vec<&[&str]> {
            (0..6)
                .map(|i| if i == at { notice } else { &["Figures."][..] })
                .collect()
        };
        let wanted: Vec<String> = ["MAINS SAFETY", "Local codes come first."]
            .iter()
            .map(|s| s.to_string())
            .collect();
        // The notice on the third page of six, linked from the first:
        // only the first page's links and the notice's page are read.
        let file = bytes(pdf_linking(&pages(2), Some(2)));
        let mut doc = incomplete(&file).unwrap();
        assert_eq!(doc.linked_from_first_page(&doc.pages()), [2]);
        assert!(missing_phrases(&mut doc, &wanted).is_empty());
        assert!(content_read(&mut doc, 2));
        for place in [1, 3, 4, 5] {
            assert!(!content_read(&mut doc, place), "page {place} read");
        }
        // A link to somewhere else: the pages are then read from the end
        // back to the notice, and it is still found.
        let file = bytes(pdf_linking(&pages(4), Some(1)));
        let mut doc = incomplete(&file).unwrap();
        assert!(missing_phrases(&mut doc, &wanted).is_empty());
        // The notice split over the linked page and the next one.
        let split: Vec<&[&str]> = vec![
            &["Figures."],
            &["MAINS SAFETY"],
            &["Local codes come first."],
            &["The end."],
        ];
        let file = bytes(pdf_linking(&split, Some(1)));
        let mut doc = incomplete(&file).unwrap();
        assert!(missing_phrases(&mut doc, &wanted).is_empty());
        assert!(!content_read(&mut doc, 3));
        // A linked page without the notice, nor any other: the missing
        // phrase is named, as reading every page names it.
        let file = bytes(pdf_linking(&pages(9), Some(3)));
        let mut doc = incomplete(&file).unwrap();
        assert_eq!(missing_phrases(&mut doc, &wanted), wanted);
        let without_closing: Vec<&[&str]> = vec![&["Figures."], &["MAINS SAFETY"], &["The end."]];
        let file = bytes(pdf_linking(&without_closing, Some(1)));
        let mut doc = incomplete(&file).unwrap();
        assert_eq!(
            missing_phrases(&mut doc, &wanted),
            ["Local codes come first."]
        );
    }

    #[test]
    fn reading_from_the_table_gives_the_pages_and_text_reading_the_whole_file_gives() {
        let file = bytes(pdf(&[
            &["One", "page"],
            &["Two"],
            &[],
            &["Four (4)", "end"],
        ]));
        let mut whole = Pdf::whole(&file).unwrap();
        let mut by_table = Pdf::by_table(&file).unwrap().expect("a table it reads");
        let all = whole.document.objects.len();
        let text = read(&mut whole);
        assert_eq!(text.len(), 4);
        assert!(text[3].1.contains("Four (4)"), "{text:?}");
        assert_eq!(read(&mut by_table), text);
        assert!(by_table.document.objects.len() <= all);
        // Objects the pages do not name are never parsed.
        let mut doc = pdf(&[&["Only"]]);
        let unused: Vec<ObjectId> = (0..50)
            .map(|i| doc.add_object(Object::Integer(i)))
            .collect();
        let file = bytes(doc);
        let mut by_table = Pdf::by_table(&file).unwrap().unwrap();
        assert_eq!(read(&mut by_table), read(&mut Pdf::whole(&file).unwrap()));
        assert!(
            unused
                .iter()
                .all(|id| !by_table.document.objects.contains_key(id))
        );
    }

    #[test]
    fn files_this_does_not_read_from_their_table_are_read_whole() {
        // Object streams and a cross-reference stream, as lopdf writes
        // them in its modern form.
        let mut doc = pdf(&[&["Packed", "away"], &["The end."]]);
        let mut file = Vec::new();
        doc.save_modern(&mut file).unwrap();
        assert!(Pdf::by_table(&file).unwrap().is_none());
        let mut read_whole = incomplete(&file).unwrap();
        assert!(read_whole.reader.is_none());
        let wanted = vec!["Packed away".to_owned(), "The end.".to_owned()];
        assert!(missing_phrases(&mut read_whole, &wanted).is_empty());
        // An update appended to a file (a trailer with `Prev`).
        let file = bytes(pdf(&[&["First"]]));
        let start = String::from_utf8_lossy(&file)
            .rsplit("startxref")
            .next()
            .unwrap()
            .trim()
            .trim_end_matches("%%EOF")
            .trim()
            .to_owned();
        let mut updated = file.clone();
        let at = updated.len();
        updated.extend_from_slice(
            format!("xref\n0 1\n0000000000 65535 f \ntrailer\n<</Size 1/Root 0 0 R/Prev {start}>>\nstartxref\n{at}\n%%EOF\n").as_bytes(),
        );
        assert!(Pdf::by_table(&updated).unwrap().is_none());
    }

    #[test]
    fn a_file_cut_short_spliced_or_with_a_broken_object_is_refused() {
        let file = bytes(pdf(&[&["Before opening the unit,"], &["unplug it."]]));
        assert!(incomplete(&file).is_ok());
        // Cut short anywhere: the end-of-file mark goes, or the table no
        // longer matches the objects.
        for cut in (1..file.len()).step_by(7) {
            assert!(incomplete(&file[..cut]).is_err(), "cut at {cut}");
        }
        // A piece cut out of the middle, the end kept: every object after
        // the cut has moved from where the table puts it.
        let middle = file.len() / 3;
        let mut spliced = file[..middle].to_vec();
        spliced.extend_from_slice(&file[middle + 40..]);
        let why = incomplete(&spliced).err().unwrap();
        assert!(
            ["cli-typst-pdf-misplaced", "cli-typst-pdf-unparsable"].contains(&why.key),
            "{why:?}"
        );
        // One object's header broken (`obj` misspelt): reading the whole
        // file skipped it and took the file; the table's check refuses it.
        let header = file.windows(7).position(|w| w == b"1 0 obj").unwrap();
        let mut broken = file.clone();
        broken[header + 4] = b'x';
        assert!(Pdf::whole(&broken).is_ok());
        let why = incomplete(&broken).err().unwrap();
        assert_eq!(why.key, "cli-typst-pdf-misplaced");
        assert!(
            why.english().starts_with("its object 1 is not at byte "),
            "{}",
            why.english()
        );
    }

    #[test]
    fn truncated_or_foreign_files_are_incomplete() {
        let why = |bytes: &[u8]| incomplete(bytes).err().unwrap();
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

    /// typst's own PDF of each demo job, read from its table and read
    /// whole: the same pages and the same text on every page (run where
    /// typst is installed; always under CI).
    #[test]
    fn typsts_documents_read_from_their_table_as_they_read_whole() {
        use crate::report::handover::{self, EMBEDDED_TEMPLATES, HandoverInput};
        use crate::typeset::{CompileOptions, FontPlace, TemplateSource};
        let program = match crate::typeset::locate(None) {
            Ok(program) => program,
            Err(_) if std::env::var_os("CI").is_none() => {
                eprintln!("note: skipping: no typst on PATH");
                return;
            }
            Err(e) => panic!("typst is needed for this test under CI: {e}"),
        };
        let ratings = crate::ratings::RatingsTable::builtin();
        let dir = tempfile::tempdir().unwrap();
        let jobs = std::path::Path::new(env!("CARGO_MANIFEST_DIR")).join("jobs");
        for name in ["combo-el84-cathode", "head-el34-quad"] {
            let text = std::fs::read_to_string(jobs.join(format!("{name}.kdl"))).unwrap();
            let job = crate::job::decode_with_ratings(name, &text, &ratings)
                .unwrap()
                .job;
            let findings = crate::calc::derive(&job, &ratings);
            let input = HandoverInput::new(&job, &findings, &text, "0.15.1");
            let doc =
                handover::build(&input, &TemplateSource::embedded(EMBEDDED_TEMPLATES)).unwrap();
            let output = dir.path().join(format!("{name}.pdf"));
            let options = CompileOptions {
                fonts: FontPlace::CacheIn(dir.path().join("cache")),
                ..doc.options.clone()
            };
            crate::typeset::compile(&program, &doc.sandbox, doc.main, &options, &output).unwrap();
            let file = std::fs::read(&output).unwrap();
            let mut by_table = Pdf::by_table(&file)
                .unwrap()
                .expect("typst's table is read");
            let mut whole = Pdf::whole(&file).unwrap();
            let text = read(&mut whole);
            assert!(text.len() >= 5, "{name}: {} pages", text.len());
            assert_eq!(read(&mut by_table), text, "{name}");
            let required = handover::notice_phrases(crate::catalogue::Catalogue::english());
            let mut checked = incomplete(&file).unwrap();
            assert!(missing_phrases(&mut checked, &required).is_empty());
            // The first page links to the notice's page, and that page is
            // all the check read of the pages after the first.
            let pages = checked.pages();
            let linked = checked.linked_from_first_page(&pages);
            assert_eq!(linked.len(), 1, "{name}");
            let notice = text
                .iter()
                .position(|(_, t)| squeeze(t).contains(&squeeze(&required[0])))
                .unwrap();
            assert_eq!(linked[0], notice, "{name}");
            for place in 1..pages.len() {
                assert_eq!(
                    content_read(&mut checked, place),
                    place == notice,
                    "{name}: page {place}"
                );
            }
            // Only a small part of typst's objects is parsed for all that.
            assert!(
                by_table.document.objects.len() * 5 < whole.document.objects.len(),
                "{name}: {} of {}",
                by_table.document.objects.len(),
                whole.document.objects.len()
            );
        }
    }
}
