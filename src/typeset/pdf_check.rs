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
    /// the resources of each node above the pages name (pages inherit
    /// them); a page's own resources are read with its text
    /// ([`Pdf::page_text`]), only for the pages whose text is read.
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
                    if let Ok(named) = node.get(b"Resources") {
                        references(named, &mut resources);
                    }
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
    ///
    /// lopdf extracts it from the page's content with the operations it
    /// reads text from left alone and everything else that it certainly
    /// parses taken out ([`text_operations`]): the same text, for a
    /// fraction of the parsing (a page with a chart is mostly drawing).
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
        let reduced = self
            .document
            .get_page_content(id)
            .ok()
            .map(|content| text_operations(&content));
        let mut stand_in = None;
        if let Some(reduced) = reduced
            && let Ok(page) = self.document.get_dictionary_mut(id)
        {
            // The reduced content in an object of its own, in place of
            // the page's; put back once the text is read.
            let before = page.remove(b"Contents");
            let mut free = self.document.max_id + 1;
            while self.document.objects.contains_key(&(free, 0)) {
                free += 1;
            }
            if let Ok(page) = self.document.get_dictionary_mut(id) {
                page.set("Contents", Object::Reference((free, 0)));
            }
            self.document.objects.insert(
                (free, 0),
                Object::Stream(lopdf::Stream::new(lopdf::Dictionary::new(), reduced)),
            );
            stand_in = Some(((free, 0), before));
        }
        let text = self
            .document
            .extract_text_chunks(&[number])
            .into_iter()
            .filter_map(Result::ok)
            .collect();
        if let Some((free, before)) = stand_in {
            self.document.objects.remove(&free);
            if let Ok(page) = self.document.get_dictionary_mut(id) {
                page.remove(b"Contents");
                if let Some(before) = before {
                    page.set("Contents", before);
                }
            }
        }
        text
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

/// The operators lopdf's text extraction reads (`extract_text_chunks`:
/// the font, the strings shown, the line breaks); it passes over every
/// other operation.
const TEXT_OPERATORS: [&[u8]; 7] = [b"Tf", b"Tj", b"TJ", b"'", b"\"", b"T*", b"ET"];

/// A page's content (decompressed) with every operation taken out that
/// lopdf's content parser certainly reads without a fault and whose
/// operator its text extraction passes over: what is left gives lopdf's
/// text extraction the same operations to read, in the same order, as
/// the whole content does, so the same text, and the same refusal when
/// lopdf cannot parse what it reads.
///
/// Most of a page with a chart is drawing (`q 1 0 0 1 48.2 743.1 cm`,
/// `0 0 m 760 0 l`), which lopdf parses operand by operand into objects
/// it then passes over; this reads it with a scanner that allocates
/// nothing. An operation is taken out only when each operand is a
/// number or a name of the plain forms below and its operator is not
/// one of [`TEXT_OPERATORS`]; every other operation (the text shown,
/// marked content with its dictionary) is left as it is, for lopdf to
/// parse. At anything the scanner does not know exactly as lopdf reads
/// it (a comment, an inline image, a `#` in a name, an unusual space
/// character, an operand lopdf would not read, the end of the content
/// inside an operation), the rest of the content from that operation on
/// is left whole, so lopdf meets it exactly as it would have: where
/// lopdf stops reading a content stream early, or refuses it, it does so
/// here too. `the_reduced_content_reads_as_the_whole_content_reads`
/// holds the two to the same operations over typst's content and
/// thousands of damaged copies of it.
fn text_operations(content: &[u8]) -> Vec<u8> {
    let mut out = Vec::with_capacity(content.len() / 2);
    let mut at = skip_space(content, 0);
    while at < content.len() {
        let start = at;
        let mut plain = true;
        // The operands, up to the operator.
        let operator_at = loop {
            let Some(&c) = content.get(at) else {
                break None;
            };
            let end = match c {
                b'0'..=b'9' | b'+' | b'-' | b'.' => number_end(content, at),
                b'/' => name_end(content, at),
                b'(' => {
                    plain = false;
                    literal_end(content, at)
                }
                b'[' => {
                    plain = false;
                    array_end(content, at, 0)
                }
                b'<' if content.get(at + 1) == Some(&b'<') => {
                    plain = false;
                    dictionary_end(content, at, 0)
                }
                b'<' => {
                    plain = false;
                    hex_end(content, at)
                }
                c if is_operator_byte(c) => break Some(at),
                _ => None,
            };
            match end {
                Some(end) => at = skip_space(content, end),
                None => break None,
            }
        };
        let Some(operator_at) = operator_at else {
            out.extend_from_slice(&content[start..]);
            return out;
        };
        let rest = &content[operator_at..];
        // lopdf reads these as operands (`null`, `true`, `false`, as a
        // prefix too) and `BI` as an inline image.
        if [&b"null"[..], b"true", b"false", b"BI"]
            .iter()
            .any(|word| rest.starts_with(word))
        {
            out.extend_from_slice(&content[start..]);
            return out;
        }
        let end = operator_at + rest.iter().take_while(|&&c| is_operator_byte(c)).count();
        let operator = &content[operator_at..end];
        if !plain || TEXT_OPERATORS.contains(&operator) {
            out.extend_from_slice(&content[start..end]);
            out.push(b'\n');
        }
        at = skip_space(content, end);
    }
    out
}

/// The spaces lopdf's content parser passes between operands and
/// operations (not NUL or form feed, which it takes elsewhere).
fn skip_space(content: &[u8], mut at: usize) -> usize {
    while matches!(content.get(at), Some(b' ' | b'\t' | b'\r' | b'\n')) {
        at += 1;
    }
    at
}

fn is_operator_byte(c: u8) -> bool {
    c.is_ascii_alphabetic() || matches!(c, b'*' | b'\'' | b'"')
}

/// lopdf's "regular" byte: neither white space nor a delimiter.
fn is_regular(c: u8) -> bool {
    !b" \t\n\r\0\x0C()<>[]{}/%".contains(&c)
}

/// The end of a number at `at` of a form lopdf reads as one, without
/// fail: an integer of at most 18 digits with an optional sign, or a
/// real with digits on both sides of its point or after a leading point.
fn number_end(content: &[u8], at: usize) -> Option<usize> {
    let digits = |from: usize| {
        content
            .get(from..)
            .map_or(0, |s| s.iter().take_while(|c| c.is_ascii_digit()).count())
    };
    let mut end = at;
    if matches!(content.get(end), Some(b'+' | b'-')) {
        end += 1;
    }
    let whole = digits(end);
    end += whole;
    if content.get(end) == Some(&b'.') {
        let fraction = digits(end + 1);
        (fraction > 0).then_some(end + 1 + fraction)
    } else {
        (whole > 0 && whole <= 18).then_some(end)
    }
}

/// The end of a name at `at` (its `/` and the regular bytes after it),
/// or `None` for one with a `#` escape.
fn name_end(content: &[u8], at: usize) -> Option<usize> {
    let len = content[at + 1..]
        .iter()
        .take_while(|&&c| is_regular(c) && c != b'#')
        .count();
    let end = at + 1 + len;
    (content.get(end) != Some(&b'#')).then_some(end)
}

/// The end of a literal string at `at`: its parentheses balanced, a
/// backslash escaping the byte after it; `None` when it does not end or
/// nests deeper than this reads (lopdf reads 100 levels).
fn literal_end(content: &[u8], at: usize) -> Option<usize> {
    let mut depth = 0usize;
    let mut i = at;
    loop {
        match *content.get(i)? {
            b'\\' => i += 1,
            b'(' => {
                depth += 1;
                if depth > 32 {
                    return None;
                }
            }
            b')' => {
                depth -= 1;
                if depth == 0 {
                    return Some(i + 1);
                }
            }
            _ => {}
        }
        i += 1;
    }
}

/// The end of a hexadecimal string at `at`: hexadecimal digits and
/// spaces up to its `>`.
fn hex_end(content: &[u8], at: usize) -> Option<usize> {
    let len = content[at + 1..]
        .iter()
        .take_while(|&&c| c.is_ascii_hexdigit() || matches!(c, b' ' | b'\t' | b'\r' | b'\n'))
        .count();
    let end = at + 1 + len;
    (content.get(end) == Some(&b'>')).then_some(end + 1)
}

/// The end of one object inside an array or a dictionary at `at`: a
/// number, a name, a string, an array or a dictionary (not a reference,
/// `true`, `false` or `null`: those end the reading here).
fn object_end(content: &[u8], at: usize, depth: usize) -> Option<usize> {
    match *content.get(at)? {
        b'0'..=b'9' | b'+' | b'-' | b'.' => number_end(content, at),
        b'/' => name_end(content, at),
        b'(' => literal_end(content, at),
        b'[' => array_end(content, at, depth + 1),
        b'<' if content.get(at + 1) == Some(&b'<') => dictionary_end(content, at, depth + 1),
        b'<' => hex_end(content, at),
        _ => None,
    }
}

/// The end of an array at `at`, nested at most 8 deep.
fn array_end(content: &[u8], at: usize, depth: usize) -> Option<usize> {
    if depth > 8 {
        return None;
    }
    let mut i = skip_space(content, at + 1);
    loop {
        if *content.get(i)? == b']' {
            return Some(i + 1);
        }
        i = skip_space(content, object_end(content, i, depth)?);
    }
}

/// The end of a dictionary at `at` (a name, then an object, in turn),
/// nested at most 8 deep.
fn dictionary_end(content: &[u8], at: usize, depth: usize) -> Option<usize> {
    if depth > 8 {
        return None;
    }
    let mut i = skip_space(content, at + 2);
    loop {
        if content.get(i..i + 2)? == b">>" {
            return Some(i + 2);
        }
        if content[i] != b'/' {
            return None;
        }
        i = skip_space(content, name_end(content, i)?);
        i = skip_space(content, object_end(content, i, depth)?);
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

    /// What lopdf's text extraction reads of a content stream: the text
    /// operations lopdf parses from it, in order, or that it refuses it.
    fn text_read(content: &[u8]) -> Result<Vec<String>, ()> {
        lopdf::content::Content::decode(content)
            .map(|content| {
                content
                    .operations
                    .iter()
                    .filter(|op| TEXT_OPERATORS.contains(&op.operator.as_bytes()))
                    .map(|op| format!("{op:?}"))
                    .collect()
            })
            .map_err(|_| ())
    }

    /// Page content as typst writes it: marked content with its
    /// dictionary, saved states, drawing, text shown as strings with
    /// escapes and in arrays with kerning.
    const TYPST_CONTENT: &[u8] = b"/Span<</MCID 0>>BDC\nq 1 0 0 -1 48.188976 743.0543 cm/c0 cs 0 scn\nBT 0 Tr/f0 9 Tf 1 0 0 -1 0 0 Tm[(\\000,\\000\\003)20(\\000\\013\\000E\\000$)]TJ\nET\nQ\nEMC/Span<</MCID 1>>BDC\nq 48.188976 737.1143 m 563.81104 737.1143 l 563.81104 513.2258 l 48.188976 513.2258 l\nh\nW\nn\nq 0.6784501 0 0 -0.67845005 48.188976 737.1143 cm/c0 cs 1 scn 0 0 m 760 0 l 760 330 l 0 330 l\nh\nf\nQ\nq -0.00000000000000012462926 0.67845005 0.6784501 0.00000000000000012462925 59.438114 581.70825 cm/c0 cs 0.078431375 scn\nBT 0 Tr/f1 11.290322 Tf 1 0 0 -1 0 0 Tm(\\000\\017)Tj\nET\nQ\n0.5 w 1 J 0 j [2 1] 0 d /GS1 gs 10 20 30 40 re S\nEMC/Span<</MCID 42>>BDC\nq 1 0 0 -1 112.948975 305.14688 cm/c0 cs 0 scn\nBT 0 Tr/f1 8.8 Tf 1 0 0 -1 0 0 Tm[(\\000\\033\\000\\r)20(\\000&\\000\\()-30<0012 00 3f>]TJ 12 TL T* (a \\(b\\) (c)) ' 1 2 (d) \" <414243> Tj\nET\nQ\nEMC\n";

    /// Whole operations, odd forms and faults lopdf meets in content:
    /// each reads the same reduced as whole.
    #[test]
    fn the_reduced_content_reads_as_the_whole_content_reads() {
        let mut cases: Vec<Vec<u8>> = vec![TYPST_CONTENT.to_vec()];
        for case in [
            &b""[..],
            b"   \n",
            b"BT /F1 12 Tf (plain) Tj ET",
            b"1. 2 m 3 4 l (x) Tj",
            b"+.5 -.25 m .5 l BT /F1 1 Tf (after) Tj ET",
            b"1234567890123456789 0 m BT /F1 1 Tf (after) Tj ET",
            b"123456789012345678 0 m BT /F1 1 Tf (after) Tj ET",
            b"null 0 m (x) Tj",
            b"true Tj (x) Tj",
            b"0 trueTj (x) Tj",
            b"falsehood (x) Tj",
            b"/F1 1 Tf (x) Tj BI /W 1 /H 1 /BPC 8 /CS /G ID \x00 EI (y) Tj",
            b"BIx (x) Tj",
            b"(x) Tj % a comment\n (y) Tj",
            b"(x) Tj %no end",
            b"/A#20B gs (x) Tj",
            b"/A#zz gs (x) Tj",
            b"1\x0c2 m (x) Tj",
            b"1\x002 m (x) Tj",
            b"(x) Tj\x0c(y) Tj",
            b"1 2 m (unterminated Tj",
            b"1 2 m (x\\",
            b"1 2 m <41 4g> Tj (y) Tj",
            b"1 2 m <41 42 Tj",
            b"[1 0 R] 0 d (x) Tj",
            b"[1 %c\n 2] 0 d (x) Tj",
            b"[(a) [<41> [1]]] TJ (x) Tj",
            b"<</A 1 0 R>> BDC (x) Tj",
            b"<</A true>> BDC (x) Tj",
            b"<</A <</B [1 2 (c)]>> /C /D>> BDC (x) Tj",
            b"<<1 2>> BDC (x) Tj",
            b"1 2 m{ (x) Tj",
            b"1 2 m) (x) Tj",
            b"1 2 m] (x) Tj",
            b"1 2 3",
            b"/F1 12 Tf",
            b"1.5.5 2 m (x) Tj",
            b"1-2 m (x) Tj",
            b"- 2 m (x) Tj",
            b". 2 m (x) Tj",
            b"1 2m(x)Tj/F1 1 Tf[(y)]TJ",
            b"1 2 m\r\n\t(x)'(y)\"",
            b"Tf Tj TJ ' \" T* ET",
            b"T*x ETET Tjj (x) Tjj",
        ] {
            cases.push(case.to_vec());
        }
        let mut deep = b"1 2 m ".to_vec();
        deep.extend(std::iter::repeat_n(b'(', 120));
        deep.extend(std::iter::repeat_n(b')', 120));
        deep.extend_from_slice(b" Tj (z) Tj");
        cases.push(deep);
        let mut nested = b"1 2 m ".to_vec();
        nested.extend(std::iter::repeat_n(b'[', 120));
        nested.extend(std::iter::repeat_n(b']', 120));
        nested.extend_from_slice(b" TJ (z) Tj");
        cases.push(nested);
        for case in &cases {
            assert_eq!(
                text_read(&text_operations(case)),
                text_read(case),
                "{}",
                String::from_utf8_lossy(case)
            );
        }
        // Damaged copies of typst's content: bytes changed, put in and
        // taken out at random places, with the bytes content is made of
        // (a fixed seed, so a failure repeats).
        let alphabet = b" \n\r\t\x00\x0c()<>[]{}/%#\\.+-019aefTjJ*'\"BIlmnrtuRS";
        // CONTENT_CASES=N and CONTENT_SEED=S for a longer hunt.
        let number = |name: &str, default: u64| {
            std::env::var(name)
                .ok()
                .and_then(|v| v.parse().ok())
                .unwrap_or(default)
        };
        let cases = number("CONTENT_CASES", 3000);
        let mut next =
            crate::test_random::xorshift(number("CONTENT_SEED", 0x9e37_79b9_7f4a_7c15) | 1);
        let mut reduced_fewer = 0;
        for _ in 0..cases {
            let mut content = TYPST_CONTENT.to_vec();
            for _ in 0..1 + next() % 3 {
                if content.is_empty() {
                    break;
                }
                let at = (next() % content.len() as u64) as usize;
                let byte = alphabet[(next() % alphabet.len() as u64) as usize];
                match next() % 4 {
                    0 => content[at] = byte,
                    1 => content.insert(at, byte),
                    2 => {
                        content.remove(at);
                    }
                    _ => content.truncate(at),
                }
            }
            let reduced = text_operations(&content);
            if reduced.len() < content.len() {
                reduced_fewer += 1;
            }
            assert_eq!(
                text_read(&reduced),
                text_read(&content),
                "{}",
                String::from_utf8_lossy(&content)
            );
        }
        // Most damaged copies are still mostly read by the scanner.
        assert!(reduced_fewer * 3 > cases * 2, "{reduced_fewer} of {cases}");
        // typst's drawing is taken out, its text left.
        let reduced = text_operations(TYPST_CONTENT);
        assert!(
            reduced.len() * 10 < TYPST_CONTENT.len() * 7,
            "{}",
            reduced.len()
        );
        assert!(!reduced.windows(3).any(|w| w == b" cm"));
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
            // Each page's text from its reduced content is the text lopdf
            // extracts from the whole content.
            for (number, page_text) in &text {
                let by_lopdf: String = whole
                    .document
                    .extract_text_chunks(&[*number])
                    .into_iter()
                    .filter_map(Result::ok)
                    .collect();
                assert_eq!(page_text, &by_lopdf, "{name}: page {number}");
            }
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
