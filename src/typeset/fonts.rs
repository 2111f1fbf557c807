//! The fonts every document is set in, built into the binary so a PDF looks
//! the same on every machine: typst is told to use these and nothing else.
//! The files and their licences live in `fonts/` at the top of the repository
//! (see `fonts/README.md`).

use std::io;
use std::path::{Path, PathBuf};

use super::error::TypesetError;
use super::sandbox::{FileContents, Sandbox};

/// The folder, inside a typesetting sandbox, that holds the fonts.
pub const FONT_DIR: &str = "fonts";

/// The bundled CJK font file (two faces, 5 MB). It lives in a folder of
/// its own beside the other fonts ([`cjk_folder`]) and is handed to typst
/// only for a document that needs it ([`needs_cjk`]): typst reads every
/// font file it is given before it sets a word (about 20 million of its
/// instructions for this one; docs/performance.md).
pub const CJK_FONT: &str = "wqy-microhei.ttc";

/// The folder holding [`CJK_FONT`], beside the font folder `fonts` and
/// named after it with `-cjk` appended (`fonts/` → `fonts-cjk/`). A
/// sibling, not a sub-folder: typst searches a font folder recursively.
pub fn cjk_folder(fonts: &Path) -> PathBuf {
    let mut name = fonts.file_name().unwrap_or_default().to_os_string();
    name.push("-cjk");
    fonts.with_file_name(name)
}

/// The files of the font folder: every bundled font but [`CJK_FONT`], then
/// the licences (the CJK font's among them).
pub(crate) fn base_files() -> impl Iterator<Item = &'static (&'static str, &'static [u8])> {
    BUNDLED_FONTS
        .iter()
        .filter(|(name, _)| *name != CJK_FONT)
        .chain(FONT_LICENCES)
}

/// The files of the CJK folder ([`cjk_folder`]): [`CJK_FONT`] alone.
pub(crate) fn cjk_files() -> impl Iterator<Item = &'static (&'static str, &'static [u8])> {
    BUNDLED_FONTS.iter().filter(|(name, _)| *name == CJK_FONT)
}

/// Font files as (file name, contents).
pub static BUNDLED_FONTS: &[(&str, &[u8])] = &[
    (
        "NotoSans-Regular.ttf",
        include_bytes!("../../fonts/NotoSans-Regular.ttf"),
    ),
    (
        "NotoSans-Bold.ttf",
        include_bytes!("../../fonts/NotoSans-Bold.ttf"),
    ),
    (
        "NotoSans-Italic.ttf",
        include_bytes!("../../fonts/NotoSans-Italic.ttf"),
    ),
    (
        "NotoSans-BoldItalic.ttf",
        include_bytes!("../../fonts/NotoSans-BoldItalic.ttf"),
    ),
    (
        "NotoSansMono-Regular.ttf",
        include_bytes!("../../fonts/NotoSansMono-Regular.ttf"),
    ),
    (
        "NotoSansMono-Bold.ttf",
        include_bytes!("../../fonts/NotoSansMono-Bold.ttf"),
    ),
    (
        "NotoSansArabic-Regular.ttf",
        include_bytes!("../../fonts/NotoSansArabic-Regular.ttf"),
    ),
    (
        "NotoSansArabic-Bold.ttf",
        include_bytes!("../../fonts/NotoSansArabic-Bold.ttf"),
    ),
    (
        "NotoSansHebrew-Regular.ttf",
        include_bytes!("../../fonts/NotoSansHebrew-Regular.ttf"),
    ),
    (
        "NotoSansHebrew-Bold.ttf",
        include_bytes!("../../fonts/NotoSansHebrew-Bold.ttf"),
    ),
    (
        "NotoSansDevanagari-Regular.ttf",
        include_bytes!("../../fonts/NotoSansDevanagari-Regular.ttf"),
    ),
    (
        "NotoSansDevanagari-Bold.ttf",
        include_bytes!("../../fonts/NotoSansDevanagari-Bold.ttf"),
    ),
    (
        "wqy-microhei.ttc",
        include_bytes!("../../fonts/wqy-microhei.ttc"),
    ),
];

/// Licence texts shipped beside the fonts whenever they are written out.
pub static FONT_LICENCES: &[(&str, &[u8])] = &[
    ("README.md", include_bytes!("../../fonts/README.md")),
    ("OFL-1.1.txt", include_bytes!("../../fonts/OFL-1.1.txt")),
    (
        "Apache-2.0.txt",
        include_bytes!("../../fonts/Apache-2.0.txt"),
    ),
    (
        "Noto.copyright",
        include_bytes!("../../fonts/Noto.copyright"),
    ),
    (
        "WenQuanYi.copyright",
        include_bytes!("../../fonts/WenQuanYi.copyright"),
    ),
];

/// Body text families in fallback order: Latin, Greek and Cyrillic first,
/// then the scripts the first family lacks.
pub const TEXT_FAMILIES: &[&str] = &[
    "Noto Sans",
    "Noto Sans Arabic",
    "Noto Sans Hebrew",
    "Noto Sans Devanagari",
    "WenQuanYi Micro Hei",
];

/// Monospaced families for figures and listings, with the same fallbacks.
pub const MONO_FAMILIES: &[&str] = &[
    "Noto Sans Mono",
    "Noto Sans Arabic",
    "Noto Sans Hebrew",
    "Noto Sans Devanagari",
    "WenQuanYi Micro Hei Mono",
];

// `FONT_COVERAGE`: every character some bundled font has a glyph for, as
// sorted, disjoint ranges, read from the fonts' character maps by
// `build.rs` (building the set at run time cost every render several
// milliseconds; `the_coverage_table_is_the_fonts_character_maps` holds the
// table to the fonts themselves).
include!(concat!(env!("OUT_DIR"), "/font_coverage.rs"));

/// Which of the 128 ASCII characters [`covered`] finds, one bit each:
/// looked up once, since nearly every printed character is ASCII.
static ASCII_COVERED: std::sync::LazyLock<u128> = std::sync::LazyLock::new(|| {
    (0..128u32)
        .filter(|&c| covered_in_table(c))
        .fold(0, |bits, c| bits | 1 << c)
});

/// Which of the 128 ASCII characters a bundled font has, one bit each
/// (`1 << c`): for the escaper's loops, which read it once per text
/// rather than once per character.
pub(crate) fn ascii_covered() -> u128 {
    *ASCII_COVERED
}

/// True when a bundled font has a glyph for the character `c`.
fn covered(c: u32) -> bool {
    if c < 128 {
        return *ASCII_COVERED & 1 << c != 0;
    }
    covered_in_table(c)
}

/// [`covered`], searched in the table.
fn covered_in_table(c: u32) -> bool {
    let i = FONT_COVERAGE.partition_point(|&(_, last)| last < c);
    FONT_COVERAGE.get(i).is_some_and(|&(first, _)| first <= c)
}

/// Whether the document can draw `c`: a bundled font has it, or it needs
/// no glyph (white space, control characters, which the escaper handles,
/// and the invisible joiners and break marks typst lays out itself).
pub fn can_draw(c: char) -> bool {
    c.is_whitespace()
        || c.is_control()
        || matches!(
            c,
            '\u{200B}'..='\u{200D}' | '\u{2060}' | '\u{FEFF}' | '\u{AD}'
        )
        || covered(u32::from(c))
}

/// Marks that only select a glyph variant (emoji presentation, tags):
/// dropped, since the character they follow is replaced anyway.
fn is_variant_mark(c: char) -> bool {
    matches!(c, '\u{FE00}'..='\u{FE0F}' | '\u{E0000}'..='\u{E007F}' | '\u{E0100}'..='\u{E01EF}')
}

/// What is printed in place of a character no bundled font has: the
/// replacement character where the fonts have it, else a question mark.
pub fn placeholder() -> char {
    static MARK: std::sync::LazyLock<char> = std::sync::LazyLock::new(|| {
        ['\u{FFFD}', '\u{25A1}', '?']
            .into_iter()
            .find(|&c| can_draw(c))
            .unwrap_or('?')
    });
    *MARK
}

/// `text` with every character the fonts lack replaced by
/// [`placeholder`] (variant marks dropped), so typst never meets a
/// character it cannot draw.
pub fn drawable(text: &str) -> std::borrow::Cow<'_, str> {
    if text.chars().all(can_draw) {
        return std::borrow::Cow::Borrowed(text);
    }
    let mark = placeholder();
    text.chars()
        .filter(|&c| !is_variant_mark(c))
        .map(|c| if can_draw(c) { c } else { mark })
        .collect()
}

/// The distinct characters of `text` that print as the placeholder, in
/// order of first appearance.
pub fn undrawable(text: &str) -> Vec<char> {
    let mut out: Vec<char> = Vec::new();
    for c in text.chars() {
        if !can_draw(c) && !is_variant_mark(c) && !out.contains(&c) {
            out.push(c);
        }
    }
    out
}

/// Whether every character written in `text` can be drawn ([`can_draw`]),
/// read over bytes: ASCII (every character of which is drawn: a glyph, or
/// white space and control characters, which need none) eight bytes at a
/// time, and only the characters beyond it decoded. A job file is almost
/// all ASCII, so this settles in one pass that none of its values needs a
/// warning, where reading its values one by one means parsing it.
pub fn draws_every_char(text: &str) -> bool {
    !any_beyond_ascii(text, |c| !can_draw(c))
}

/// Typst set rules that select the bundled fonts, for the top of every
/// generated document. typst is run without its own built-in fonts, so a
/// document must name these families. `mono-fonts` names the monospaced
/// ones for a template that sets text in them without a `raw` element
/// (the hand-over's footer: see its `footer-mono`).
///
/// In the body text, the signs of [`SIGNS_FROM_MONO`] come from Noto Sans
/// Mono, before the CJK family is tried: no other body family has them,
/// and the CJK face is a 5 MB file that typst otherwise loads, hashes and
/// embeds for these few signs alone (some 28 million of typst's
/// instructions, 4 % of a demo job; see docs/performance.md). The
/// monospaced face is in every hand-over document anyway (its footer).
///
/// These rules name the CJK families; a document that does not need them
/// is set with [`font_rules_without_cjk`] instead ([`fit_fonts`]).
pub fn font_rules() -> String {
    rules(true)
}

/// [`font_rules`] without the CJK families, for a document typst sets
/// without the CJK file (naming a family typst has not been given makes
/// it warn "unknown font family").
pub fn font_rules_without_cjk() -> String {
    rules(false)
}

fn rules(cjk: bool) -> String {
    let keep = |f: &&&str| cjk || !CJK_FAMILIES.contains(*f);
    let mut body: Vec<String> = TEXT_FAMILIES
        .iter()
        .filter(keep)
        .map(|f| quoted(f))
        .collect();
    body.insert(
        TEXT_FAMILIES.len() - 1,
        format!(
            "(name: {}, covers: regex(\"[{SIGNS_FROM_MONO}]\"))",
            quoted(MONO_FAMILIES[0])
        ),
    );
    let mono: Vec<&str> = MONO_FAMILIES.iter().filter(keep).copied().collect();
    format!(
        "#set text(font: ({}))\n#let mono-fonts = {}\n#show raw: set text(font: mono-fonts)\n",
        body.join(", "),
        family_array(&mono),
    )
}

/// The families of [`CJK_FONT`], the last of [`TEXT_FAMILIES`] and of
/// [`MONO_FAMILIES`].
pub const CJK_FAMILIES: &[&str] = &["WenQuanYi Micro Hei", "WenQuanYi Micro Hei Mono"];

// `CJK_IN_BODY`, `CJK_IN_SVG`: the characters typst may take from the
// CJK face in the document's text and in an SVG's Noto Sans text, as
// sorted ranges
// (`build.rs`; held to the fonts by
// `the_cjk_tables_are_the_fonts_character_maps`).
include!(concat!(env!("OUT_DIR"), "/cjk_only.rs"));

/// Whether `c` is in `table` (sorted ranges). ASCII never is: every face
/// has it.
fn in_table(table: &[(u32, u32)], c: char) -> bool {
    let code = u32::from(c);
    if code < 0x80 {
        return false;
    }
    let i = table.partition_point(|&(_, last)| last < code);
    table.get(i).is_some_and(|&(first, _)| first <= code)
}

/// `text.contains(needle)`, by `memchr`'s substring search.
fn has(text: &str, needle: &str) -> bool {
    memchr::memmem::find(text.as_bytes(), needle.as_bytes()).is_some()
}

/// `text.split(needle).skip(1)`: the text after each occurrence of
/// `needle`, up to the next, found by `memchr`'s substring search (the
/// standard library's two-way search was a third of the fonts' check of
/// a long job).
fn pieces_after<'a>(text: &'a str, needle: &'a str) -> impl Iterator<Item = &'a str> + 'a {
    let mut starts = memchr::memmem::find_iter(text.as_bytes(), needle.as_bytes()).peekable();
    std::iter::from_fn(move || {
        let start = starts.next()? + needle.len();
        let end = starts.peek().copied().unwrap_or(text.len());
        // Occurrences of text in text start and end on character
        // boundaries (UTF-8 is self-synchronising).
        text.get(start..end)
    })
}

/// Whether typst may set `c` in the CJK face in the document's own text,
/// set with the rules of [`font_rules`] (the signs of [`SIGNS_FROM_MONO`]
/// come from Noto Sans Mono there).
fn body_takes_cjk(c: char) -> bool {
    in_table(CJK_IN_BODY, c) && !SIGNS_FROM_MONO.contains(c)
}

/// Whether a document made of the files of `sandbox` needs the CJK face:
/// some text in it is a character that typst may set in that face.
/// Conservative where it cannot be exact:
///
/// * a Typst file is read with its `\u{…}` escapes; one that names
///   typst's symbol tables (`sym.`, `emoji.`, `symbol(`,
///   `str.from-unicode`) needs it;
/// * an SVG with text is read with its `&#…;` references (typst sets an
///   SVG's text in the family it names, a character that face lacks in
///   the face most like it that has it: see `build.rs`); one whose text
///   names any family but Noto Sans, or none, needs it;
/// * any other file that is not a raster image (PNG, JPEG, GIF, WebP) is
///   read as the document's text, and needs it if it is not UTF-8.
///
/// What typst writes itself (page numbers, smart quotes for English and
/// German, the hyphen) is in every Noto face.
///
/// A file handed over as text ([`FileContents::Text`]) is UTF-8 already,
/// and is read as it is rather than checked again.
pub fn needs_cjk(sandbox: &Sandbox) -> bool {
    sandbox.contents().any(|(path, contents)| match contents {
        FileContents::Text(text) => text_needs_cjk(path, text),
        FileContents::Bytes(bytes) => file_needs_cjk(path, bytes),
        FileContents::PlainChart(_) => false,
    })
}

/// The lower-case extension of a sandbox path ("" for none).
fn extension(path: &str) -> String {
    path.rsplit_once('.')
        .map(|(_, e)| e.to_ascii_lowercase())
        .unwrap_or_default()
}

/// Whether [`needs_cjk`] takes the file at `path` for a raster image,
/// which it does not read.
fn is_raster_image(path: &str) -> bool {
    matches!(
        extension(path).as_str(),
        "png" | "jpg" | "jpeg" | "gif" | "webp"
    )
}

fn file_needs_cjk(path: &str, bytes: &[u8]) -> bool {
    if is_raster_image(path) {
        return false;
    }
    let Ok(text) = std::str::from_utf8(bytes) else {
        return true;
    };
    text_needs_cjk(path, text)
}

/// [`file_needs_cjk`] for a file known to be UTF-8.
pub(crate) fn text_needs_cjk(path: &str, text: &str) -> bool {
    if is_raster_image(path) {
        return false;
    }
    match extension(path).as_str() {
        "typ" => typst_source_needs_cjk(text),
        "svg" => svg_needs_cjk(text),
        _ => body_text_takes_cjk(text),
    }
}

/// Whether `test` holds for some character of `text` outside ASCII
/// (for which [`in_table`] is always false), reading the ASCII runs
/// 32 and 8 bytes at a time rather than as characters: a document's
/// sources are almost all ASCII, and decoding them character by
/// character was a twentieth of a render's own instructions. The few
/// characters beyond ASCII a document uses come again and again (the
/// no-break space, the dash, the ohm sign), so the last ones `test`
/// turned down are remembered, one for each of 16 slots by the
/// character's lowest bits, and not tested again: `test` must answer the
/// same for the same character.
fn any_beyond_ascii(text: &str, test: impl Fn(char) -> bool) -> bool {
    any_from(text, 0x80, test)
}

/// [`any_beyond_ascii`] for a `test` that is false for every character
/// below `lowest`: when that is U+0800 or above, a character of two bytes
/// (the no-break space, µ, Ω, ±: most of what a document has beyond
/// ASCII) is stepped over by its first byte, not decoded and tested.
fn any_from(text: &str, lowest: u32, test: impl Fn(char) -> bool) -> bool {
    const HIGH_BITS: u64 = 0x8080_8080_8080_8080;
    // Little-endian, so a word's lowest bits are its first byte.
    let word = |bytes: &[u8], at: usize| {
        u64::from_le_bytes(bytes[at..at + 8].try_into().expect("eight bytes"))
    };
    let bytes = text.as_bytes();
    let step_over_two = lowest >= 0x800;
    // Characters `test` turned down; '\0' (ASCII, never tested) for none.
    let mut cleared = ['\0'; 16];
    let mut at = 0;
    loop {
        while at + 32 <= bytes.len()
            && (word(bytes, at) | word(bytes, at + 8) | word(bytes, at + 16) | word(bytes, at + 24))
                & HIGH_BITS
                == 0
        {
            at += 32;
        }
        // The first byte outside ASCII: the lowest high bit of a word.
        loop {
            if at + 8 <= bytes.len() {
                let high = word(bytes, at) & HIGH_BITS;
                if high == 0 {
                    at += 8;
                    continue;
                }
                at += (high.trailing_zeros() / 8) as usize;
            } else {
                match bytes[at..].iter().position(|b| !b.is_ascii()) {
                    None => return false,
                    Some(i) => at += i,
                }
            }
            break;
        }
        // A byte outside ASCII after ASCII or after a whole character
        // begins a character; one below 0xE0 begins a character of two
        // bytes, below U+0800.
        if step_over_two && bytes[at] < 0xE0 {
            at += 2;
            continue;
        }
        let c = text[at..].chars().next().expect("a character begins here");
        let slot = &mut cleared[u32::from(c) as usize % 16];
        if *slot != c {
            if test(c) {
                return true;
            }
            *slot = c;
        }
        at += c.len_utf8();
    }
}

/// The lowest character of `table` (sorted ranges), for [`any_from`].
fn lowest(table: &[(u32, u32)]) -> u32 {
    table.first().map_or(u32::MAX, |&(first, _)| first)
}

/// Whether some character of `text` is in `table` (sorted ranges).
fn any_in_table(text: &str, table: &[(u32, u32)]) -> bool {
    any_from(text, lowest(table), |c| in_table(table, c))
}

/// Whether typst may set some character of `text` in the CJK face in the
/// document's own text ([`body_takes_cjk`]).
fn body_text_takes_cjk(text: &str) -> bool {
    any_from(text, lowest(CJK_IN_BODY), body_takes_cjk)
}

/// [`needs_cjk`] for one Typst source.
fn typst_needs_cjk(text: &str) -> bool {
    // `sym.` and `symbol(` found as `sym` with what follows it: one
    // search of a megabytes-long source rather than two.
    let names_symbols = memchr::memmem::find_iter(text.as_bytes(), b"sym").any(|at| {
        let rest = &text.as_bytes()[at + 3..];
        rest.starts_with(b".") || rest.starts_with(b"bol(")
    });
    if names_symbols || has(text, "emoji.") || has(text, "from-unicode") {
        return true;
    }
    body_text_takes_cjk(text)
        || pieces_after(text, "\\u{")
            .any(|rest| escaped_char(rest, '}', 16).is_none_or(body_takes_cjk))
}

/// [`typst_needs_cjk`] for a Typst source of any length: a long one (a
/// long job's main source is megabytes) is read in pieces on every core.
/// The pieces end at line ends, and no pattern the check looks for holds a
/// line end (a `\u{…}` escape broken by one is no escape, in the whole
/// text as in the piece before it), so the source needs the CJK face just
/// when one of its pieces does.
fn typst_source_needs_cjk(text: &str) -> bool {
    use rayon::prelude::*;
    if text.len() < PIECES_FROM {
        return typst_needs_cjk(text);
    }
    let pieces = line_pieces(text, text.len().div_ceil(PIECE_BYTES));
    pieces.par_iter().any(|piece| typst_needs_cjk(piece))
}

/// From this many bytes on, [`typst_source_needs_cjk`] reads a source in
/// pieces; shorter ones are read in one go.
const PIECES_FROM: usize = 1 << 20;

/// About how long each piece [`typst_source_needs_cjk`] reads is.
const PIECE_BYTES: usize = 1 << 19;

/// `text` cut into about `count` pieces of like length, each but the last
/// ending with a line end: together, `text`.
fn line_pieces(text: &str, count: usize) -> Vec<&str> {
    let mut pieces = Vec::with_capacity(count.max(1));
    let mut rest = text;
    let step = text.len().div_ceil(count.max(1)).max(1);
    while rest.len() > step {
        match memchr::memchr(b'\n', &rest.as_bytes()[step..]) {
            Some(at) => {
                let (piece, after) = rest.split_at(step + at + 1);
                pieces.push(piece);
                rest = after;
            }
            None => break,
        }
    }
    pieces.push(rest);
    pieces
}

/// [`needs_cjk`] for an SVG.
fn svg_needs_cjk(text: &str) -> bool {
    if !has(text, "<text") && !has(text, ":text") {
        return false;
    }
    // `font:` and `font-family` found in one search for `font` (neither
    // word can overlap another of its kind, so every one is found).
    let mut families = Vec::new();
    for at in memchr::memmem::find_iter(text.as_bytes(), b"font") {
        let rest = &text.as_bytes()[at + 4..];
        if rest.starts_with(b":") {
            return true;
        }
        if rest.starts_with(b"-family") {
            families.push(at);
        }
    }
    if !names_only_noto_sans_at(text, &families) {
        return true;
    }
    let table = CJK_IN_SVG;
    any_in_table(text, table)
        || pieces_after(text, "&#").any(|rest| {
            let (digits, radix) = match rest.strip_prefix(['x', 'X']) {
                Some(hex) => (hex, 16),
                None => (rest, 10),
            };
            escaped_char(digits, ';', radix).is_none_or(|c| in_table(table, c))
        })
}

/// Whether a chart's SVG writer (`report::plots`) may write the text
/// `text` in `family` without the fonts' check having to read the SVG:
/// the family is Noto Sans, the text holds no character typst may take
/// from the CJK face in an SVG, and no `font` or `&#` that the check looks
/// for. The writer escapes `<>&"'` and puts nothing else beyond ASCII
/// around a text (its numbers, colours and the five entities), so an SVG
/// whose every text passes, or that has none, needs no CJK face: what
/// [`svg_needs_cjk`] answers for it (held by
/// `a_plain_chart_text_leaves_the_svg_needing_no_cjk_face`, and in debug
/// builds by [`Sandbox::insert_plain_chart`] for every chart).
pub(crate) fn chart_text_is_plain(family: &str, text: &str) -> bool {
    family == TEXT_FAMILIES[0]
        && !has(text, "font")
        && !has(text, "&#")
        && !any_in_table(text, CJK_IN_SVG)
}

/// Whether every `font-family` of an SVG (attribute or style) names Noto
/// Sans alone, and there is at least one, given the places where
/// `font-family` begins in `text` (all of them, in order).
fn names_only_noto_sans_at(text: &str, starts: &[usize]) -> bool {
    if starts.is_empty() {
        return false;
    }
    const NEEDLE: usize = "font-family".len();
    let mut pieces = starts.iter().enumerate().filter_map(|(i, &start)| {
        let end = starts.get(i + 1).copied().unwrap_or(text.len());
        text.get(start + NEEDLE..end)
    });
    pieces.all(|rest| {
        let rest = rest.trim_start();
        let value = if let Some(attribute) = rest.strip_prefix('=') {
            let attribute = attribute.trim_start();
            let Some(quote) = attribute.chars().next().filter(|q| matches!(q, '"' | '\'')) else {
                return false;
            };
            attribute[1..].split(quote).next().unwrap_or_default()
        } else if let Some(style) = rest.strip_prefix(':') {
            style.split([';', '"', '}']).next().unwrap_or_default()
        } else {
            return false;
        };
        value.split(',').all(|family| {
            let family = family.trim().trim_matches(['"', '\'']);
            // Without an `&` there is no entity to take out, and no copy
            // to make (a chart names its family at every text).
            if family.contains('&') {
                family.replace("&quot;", "").replace("&apos;", "").trim() == TEXT_FAMILIES[0]
            } else {
                family.trim() == TEXT_FAMILIES[0]
            }
        })
    })
}

/// The character whose number (in `radix`) `rest` starts with, up to
/// `end`; `None` when that is not a character's number.
fn escaped_char(rest: &str, end: char, radix: u32) -> Option<char> {
    let (digits, _) = rest.split_once(end)?;
    char::from_u32(u32::from_str_radix(digits, radix).ok()?)
}

/// Readies the sandbox's main source `main` for the fonts it needs: when
/// no file of the sandbox needs the CJK face ([`needs_cjk`]), its
/// [`font_rules`] (as filled into the template) become
/// [`font_rules_without_cjk`]. Returns whether the CJK file is to be
/// handed to typst (`CompileOptions::cjk`). A template without the
/// rules is left as it is.
pub fn fit_fonts(sandbox: &mut Sandbox, main: &str) -> Result<bool, TypesetError> {
    if needs_cjk(sandbox) {
        return Ok(true);
    }
    let full = font_rules();
    // Changed in place: the main source of a long job is megabytes, which
    // a new string would copy (growing as it goes). Only a UTF-8 source
    // is changed; `needs_cjk` found every file UTF-8 but a raster image's,
    // so only a main source named as one is read again.
    match sandbox.get_mut(main) {
        Some(FileContents::Text(source) | FileContents::PlainChart(source)) => {
            if let Some(at) = memchr::memmem::find(source.as_bytes(), full.as_bytes()) {
                source.replace_range(at..at + full.len(), &font_rules_without_cjk());
            }
        }
        Some(FileContents::Bytes(source)) => {
            if (!is_raster_image(main) || std::str::from_utf8(source).is_ok())
                && let Some(at) = memchr::memmem::find(source, full.as_bytes())
            {
                let lean = font_rules_without_cjk();
                source.splice(at..at + full.len(), lean.bytes());
            }
        }
        None => {}
    }
    Ok(false)
}

/// Signs the body text takes from the monospaced family rather than the
/// CJK one (see [`font_rules`]): the square root and the two comparisons,
/// which the method note and the safety limits print. The arrow and the
/// parallel sign stay with the CJK family, whose drawing of them is
/// closer to the body text's.
pub const SIGNS_FROM_MONO: &str = "√≤≥";

fn quoted(family: &str) -> String {
    format!("\"{}\"", super::escape::escape_string(family))
}

fn family_array(families: &[&str]) -> String {
    let quoted: Vec<String> = families.iter().map(|f| quoted(f)).collect();
    format!("({})", quoted.join(", "))
}

/// Writes the fonts and their licences into `dir/fonts/`, the CJK font
/// into `dir/fonts-cjk/` ([`cjk_folder`]).
pub(crate) fn write_fonts(dir: &Path) -> io::Result<()> {
    let fonts = dir.join(FONT_DIR);
    for (folder, mut files) in [
        (
            fonts.clone(),
            Box::new(base_files()) as Box<dyn Iterator<Item = _>>,
        ),
        (cjk_folder(&fonts), Box::new(cjk_files())),
    ] {
        std::fs::create_dir_all(&folder)?;
        files.try_for_each(|(name, bytes)| std::fs::write(folder.join(name), bytes))?;
    }
    Ok(())
}

#[cfg(test)]
mod tests {
    use super::*;
    use std::collections::BTreeSet;

    fn repo_fonts() -> std::path::PathBuf {
        Path::new(env!("CARGO_MANIFEST_DIR")).join("fonts")
    }

    /// `any_beyond_ascii` answers as testing every character does, with
    /// characters of one to four bytes at every place of a text longer
    /// and shorter than its eight-byte steps, ASCII ones included.
    #[test]
    fn any_beyond_ascii_tests_what_every_character_would() {
        let marks = ['a', '\u{e9}', '\u{4e2d}', '\u{1f600}', '\u{ad}'];
        for len in 0..20 {
            for at in 0..=len {
                for mark in marks {
                    for second in [None, Some('\u{3b1}'), Some('\u{4e2d}')] {
                        let mut text: String =
                            (0..len).map(|i| (b'a' + (i % 26) as u8) as char).collect();
                        text.insert(at, mark);
                        if let Some(c) = second {
                            text.push(c);
                        }
                        for test in [
                            (|c: char| c == '\u{4e2d}') as fn(char) -> bool,
                            |c| c == '\u{1f600}',
                            |c| c.is_ascii(),
                            body_takes_cjk,
                            |c| in_table(CJK_IN_SVG, c),
                        ] {
                            let whole = text.chars().any(|c| !c.is_ascii() && test(c));
                            assert_eq!(any_beyond_ascii(&text, test), whole, "{text:?}");
                        }
                    }
                }
            }
        }
        // ASCII is never set in the CJK face, so leaving it untested
        // changes no answer.
        assert!(
            (0..0x80u8).all(|b| !body_takes_cjk(b as char) && !in_table(CJK_IN_SVG, b as char))
        );
    }

    /// The checks that step over characters of two bytes (`any_in_table`,
    /// `body_text_takes_cjk`) answer as testing every character does:
    /// characters of one to four bytes, those of the tables and others,
    /// many of two bytes, at every place of texts around the eight- and
    /// 32-byte steps, and 20,000 random texts of them; each answer comes
    /// up thousands of times. The tables start at U+0800 or above, or no
    /// character would be stepped over.
    #[test]
    fn stepping_over_two_byte_characters_answers_as_testing_each() {
        assert!(lowest(CJK_IN_BODY) >= 0x800 && lowest(CJK_IN_SVG) >= 0x800);
        let marks = [
            'a',
            '\u{a0}',
            '\u{b5}',
            '\u{3a9}',
            '\u{7ff}',
            '\u{800}',
            '\u{e3f}',
            '\u{2013}',
            '\u{2192}',
            '\u{2225}',
            '\u{221a}',
            '\u{2264}',
            '\u{4e2d}',
            '\u{ffee}',
            '\u{1f600}',
            '\u{20000}',
        ];
        let takes = |text: &str, table: &[(u32, u32)]| text.chars().any(|c| in_table(table, c));
        let body = |text: &str| text.chars().any(body_takes_cjk);
        let mut answers = [0usize; 2];
        let mut check = |text: &str| {
            assert_eq!(
                any_in_table(text, CJK_IN_SVG),
                takes(text, CJK_IN_SVG),
                "{text:?}"
            );
            assert_eq!(
                any_in_table(text, CJK_IN_BODY),
                takes(text, CJK_IN_BODY),
                "{text:?}"
            );
            let b = body(text);
            assert_eq!(body_text_takes_cjk(text), b, "{text:?}");
            answers[usize::from(b)] += 1;
        };
        for len in 0..70 {
            for at in 0..=len {
                for mark in marks {
                    let mut text: String = (0..len)
                        .map(|i| {
                            if i % 5 == 4 {
                                '\u{a0}'
                            } else {
                                (b'a' + (i % 26) as u8) as char
                            }
                        })
                        .collect();
                    let at = text.char_indices().nth(at).map_or(text.len(), |(i, _)| i);
                    text.insert(at, mark);
                    check(&text);
                }
            }
        }
        let mut next = crate::test_random::xorshift(0x9e37_79b9_7f4a_7c15u64);
        for _ in 0..20_000 {
            let len = (next() % 80) as usize;
            let text: String = (0..len)
                .map(|_| {
                    let n = next();
                    if n % 4 == 0 {
                        marks[(n >> 8) as usize % marks.len()]
                    } else {
                        (b' ' + (n >> 16) as u8 % 90) as char
                    }
                })
                .collect();
            check(&text);
        }
        assert!(answers[0] > 5_000 && answers[1] > 5_000, "{answers:?}");
    }

    /// `draws_every_char` says what testing every character with
    /// `can_draw` says: all of ASCII, characters the fonts have and lack
    /// (of two to four bytes) at every place of texts around the
    /// eight-byte steps, and random texts of such characters.
    #[test]
    fn draws_every_char_is_can_draw_of_every_char() {
        assert!((0..0x80u8).all(|b| can_draw(b as char)));
        let all_ascii: String = (0..0x80u8).map(char::from).collect();
        assert!(draws_every_char(&all_ascii));
        let marks = [
            '\u{e9}',
            '\u{3b1}',
            '\u{4e2d}',
            '\u{e01}',
            '\u{1f525}',
            '\u{fe0f}',
            '\u{ad}',
            '\u{200b}',
            '\u{2028}',
            '\u{10ffff}',
        ];
        assert!(marks.iter().any(|&c| can_draw(c)) && marks.iter().any(|&c| !can_draw(c)));
        for len in 0..20 {
            for at in 0..=len {
                for mark in marks {
                    let mut text: String =
                        (0..len).map(|i| (b' ' + (i % 90) as u8) as char).collect();
                    text.insert(at, mark);
                    assert_eq!(
                        draws_every_char(&text),
                        text.chars().all(can_draw),
                        "{text:?}"
                    );
                }
            }
        }
        let mut next = crate::test_random::xorshift(0x2545_f491_4f6c_dd1du64);
        for _ in 0..20_000 {
            let len = (next() % 40) as usize;
            let text: String = (0..len)
                .map(|_| match next() % 8 {
                    0 => marks[(next() % marks.len() as u64) as usize],
                    1 => char::from_u32((next() % 0x3_0000) as u32).unwrap_or('x'),
                    _ => char::from((next() % 0x80) as u8),
                })
                .collect();
            assert_eq!(
                draws_every_char(&text),
                text.chars().all(can_draw),
                "{text:?}"
            );
        }
    }

    #[test]
    fn every_font_file_in_the_repository_is_bundled_and_listed() {
        let on_disk: BTreeSet<String> = std::fs::read_dir(repo_fonts())
            .unwrap()
            .map(|e| e.unwrap().file_name().to_string_lossy().into_owned())
            .filter(|n| n.ends_with(".ttf") || n.ends_with(".otf") || n.ends_with(".ttc"))
            .collect();
        let bundled: BTreeSet<String> = BUNDLED_FONTS.iter().map(|(n, _)| n.to_string()).collect();
        assert_eq!(on_disk, bundled);
        let readme = std::fs::read_to_string(repo_fonts().join("README.md")).unwrap();
        for name in &bundled {
            assert!(
                readme.contains(name.as_str()),
                "fonts/README.md lacks {name}"
            );
        }
    }

    #[test]
    fn bundle_stays_small() {
        let total: usize = BUNDLED_FONTS.iter().map(|(_, b)| b.len()).sum();
        assert!(total < 15 * 1024 * 1024, "{total} bytes of fonts");
    }

    #[test]
    fn characters_the_fonts_lack_become_the_placeholder() {
        let mark = placeholder();
        assert!(can_draw('A') && can_draw('µ') && can_draw('Ω') && can_draw('日'));
        // Emoji, Thai, Ethiopic, a mathematical letter, private use.
        for c in ['🔥', 'ก', 'ሀ', '𝔸', '\u{E000}'] {
            assert!(!can_draw(c), "{c:?}");
            assert_eq!(drawable(&format!("a{c}b")), format!("a{mark}b"));
        }
        assert_eq!(drawable("ok \u{2764}\u{FE0F}"), format!("ok {mark}"));
        assert_eq!(undrawable("🔥x🔥ก"), vec!['🔥', 'ก']);
        assert!(matches!(
            drawable("plain µΩ"),
            std::borrow::Cow::Borrowed(_)
        ));
    }

    /// Every character of the fonts' Unicode character maps, read at run
    /// time the way `build.rs` reads them.
    fn coverage_from_the_fonts() -> BTreeSet<u32> {
        let mut set = BTreeSet::new();
        for (name, data) in BUNDLED_FONTS {
            for index in 0..ttf_parser::fonts_in_collection(data).unwrap_or(1) {
                set.extend(face_chars(name, index));
            }
        }
        set
    }

    #[test]
    fn the_coverage_table_is_the_fonts_character_maps() {
        let set = coverage_from_the_fonts();
        // Tens of thousands of characters: the CJK font alone has over 20,000.
        assert!(set.len() > 30_000, "{}", set.len());
        // Ranges in order, apart (not touching), each first <= last.
        for pair in FONT_COVERAGE.windows(2) {
            assert!(pair[0].1 + 1 < pair[1].0, "{pair:?}");
        }
        assert!(FONT_COVERAGE.iter().all(|&(first, last)| first <= last));
        let table: BTreeSet<u32> = FONT_COVERAGE
            .iter()
            .flat_map(|&(first, last)| first..=last)
            .collect();
        assert_eq!(table, set);
        // And the lookup answers from the table for every code point.
        for c in 0..=0x10FFFF_u32 {
            assert_eq!(covered(c), set.contains(&c), "U+{c:04X}");
        }
    }

    #[test]
    fn rules_name_each_family() {
        let rules = font_rules();
        for family in TEXT_FAMILIES.iter().chain(MONO_FAMILIES) {
            assert!(rules.contains(&format!("\"{family}\"")), "{family}");
        }
    }

    /// Whether the bundled file `name` has a glyph for `c`.
    fn file_has(name: &str, c: char) -> bool {
        let (_, data) = BUNDLED_FONTS.iter().find(|(n, _)| *n == name).unwrap();
        ttf_parser::Face::parse(data, 0)
            .unwrap()
            .glyph_index(c)
            .is_some()
    }

    #[test]
    fn the_signs_taken_from_mono_are_its_own_and_no_earlier_body_familys() {
        // Only which of the CJK and the monospaced face draws them changes:
        // every body family before the CJK one lacks them, and both
        // monospaced faces (regular, bold) have them.
        let rules = font_rules();
        let mono = rules
            .find("(name: \"Noto Sans Mono\", covers: regex(")
            .unwrap();
        let cjk = rules.find("\"WenQuanYi Micro Hei\"").unwrap();
        assert!(mono < cjk, "{rules}");
        assert!(rules.find("\"Noto Sans Devanagari\"").unwrap() < mono);
        for c in SIGNS_FROM_MONO.chars() {
            for earlier in [
                "NotoSans-Regular.ttf",
                "NotoSans-Bold.ttf",
                "NotoSans-Italic.ttf",
                "NotoSansArabic-Regular.ttf",
                "NotoSansHebrew-Regular.ttf",
                "NotoSansDevanagari-Regular.ttf",
            ] {
                assert!(!file_has(earlier, c), "{earlier} has {c}");
            }
            for mono in ["NotoSansMono-Regular.ttf", "NotoSansMono-Bold.ttf"] {
                assert!(file_has(mono, c), "{mono} lacks {c}");
            }
        }
    }

    /// The characters of the bundled file `name`'s face `index`.
    fn face_chars(name: &str, index: u32) -> BTreeSet<u32> {
        let (_, data) = BUNDLED_FONTS.iter().find(|(n, _)| *n == name).unwrap();
        let mut set = BTreeSet::new();
        let face = ttf_parser::Face::parse(data, index).unwrap();
        for table in face.tables().cmap.unwrap().subtables {
            if table.is_unicode() {
                table.codepoints(|c| {
                    set.insert(c);
                });
            }
        }
        set
    }

    /// The characters every one of `names` has.
    fn all_have(names: &[&str]) -> BTreeSet<u32> {
        let mut set = face_chars(names[0], 0);
        for name in &names[1..] {
            let other = face_chars(name, 0);
            set.retain(|c| other.contains(c));
        }
        set
    }

    fn table_set(table: &[(u32, u32)]) -> BTreeSet<u32> {
        table.iter().flat_map(|&(a, b)| a..=b).collect()
    }

    #[test]
    fn the_cjk_tables_are_the_fonts_character_maps() {
        let cjk: BTreeSet<u32> = face_chars(CJK_FONT, 0)
            .union(&face_chars(CJK_FONT, 1))
            .copied()
            .collect();
        let sans = all_have(&[
            "NotoSans-Regular.ttf",
            "NotoSans-Bold.ttf",
            "NotoSans-Italic.ttf",
            "NotoSans-BoldItalic.ttf",
        ]);
        let mono = all_have(&["NotoSansMono-Regular.ttf", "NotoSansMono-Bold.ttf"]);
        let scripts: BTreeSet<u32> = ["Arabic", "Hebrew", "Devanagari"]
            .iter()
            .flat_map(|f| {
                all_have(&[
                    &format!("NotoSans{f}-Regular.ttf"),
                    &format!("NotoSans{f}-Bold.ttf"),
                ])
            })
            .collect();
        let body: BTreeSet<u32> = cjk
            .iter()
            .copied()
            .filter(|c| !(scripts.contains(c) || sans.contains(c) && mono.contains(c)))
            .collect();
        let svg: BTreeSet<u32> = cjk
            .iter()
            .copied()
            .filter(|c| !sans.contains(c) && !scripts.contains(c))
            .collect();
        assert_eq!(table_set(CJK_IN_BODY), body);
        assert_eq!(table_set(CJK_IN_SVG), svg);
        // The signs the body text takes from the CJK face today, and ones
        // it does not: the minus sign comes from Noto Sans Devanagari, the
        // square root from Noto Sans Mono, Latin from Noto Sans.
        for c in ['→', '∥', '日', '한'] {
            assert!(body_takes_cjk(c), "{c}");
        }
        for c in [
            '−', '√', '≤', 'µ', 'Ω', 'é', '°', '±', '×', '–', '…', '„', '“', 'A',
        ] {
            assert!(!body_takes_cjk(c), "{c}");
        }
    }

    #[test]
    fn a_source_read_in_pieces_needs_what_it_needs_whole() {
        // Cut at line ends, anywhere: the answer is the whole text's, for
        // texts made of the patterns the check looks for, broken up by
        // line ends (the escape `\u{…}` among them, with and without its
        // brace, with good and bad digits).
        let mut next = crate::test_random::xorshift(0x9e37_79b9_7f4a_7c15_u64);
        const POOL: &[&str] = &[
            "\n",
            "\n",
            "\\u{",
            "}",
            "4e00",
            "41",
            "zz",
            "sym",
            ".",
            "bol(",
            "emoji.",
            "from-unicode",
            "日",
            "µ",
            " ",
            "a",
            "\\",
            "u",
            "{",
            "√",
        ];
        let mut both = [0usize; 2];
        for _ in 0..40_000 {
            let len = (next() % 24) as usize;
            let text: String = (0..len)
                .map(|_| POOL[(next() % POOL.len() as u64) as usize])
                .collect();
            let whole = typst_needs_cjk(&text);
            both[usize::from(whole)] += 1;
            for count in 1..=4 {
                let pieces = line_pieces(&text, count);
                assert_eq!(pieces.concat(), text);
                assert!(pieces[..pieces.len() - 1].iter().all(|p| p.ends_with('\n')));
                assert_eq!(
                    pieces.iter().any(|p| typst_needs_cjk(p)),
                    whole,
                    "{text:?} in {pieces:?}"
                );
            }
        }
        // Both answers came up often.
        assert!(both.iter().all(|&n| n > 5_000), "{both:?}");
        // A long source goes the piecewise way, with the same answer.
        let long = "#text[plain]\n".repeat(200_000);
        assert!(long.len() >= PIECES_FROM);
        assert!(line_pieces(&long, long.len().div_ceil(PIECE_BYTES)).len() > 1);
        assert!(!typst_source_needs_cjk(&long));
        let with_escape = format!("{long}#\"\\u{{4e00}}\"\n{long}");
        assert!(typst_source_needs_cjk(&with_escape));
        let broken = format!("{long}#\"\\u{{4e00\n}}\"\n{long}");
        assert_eq!(typst_source_needs_cjk(&broken), typst_needs_cjk(&broken));
    }

    #[test]
    fn pieces_after_a_needle_are_those_of_split() {
        let mut next = crate::test_random::xorshift(0x2545_f491_4f6c_dd1d_u64);
        const POOL: &[&str] = &[
            "\\",
            "u",
            "{",
            "}",
            "&",
            "#",
            "x",
            "font-family",
            "µ",
            "日",
            " ",
        ];
        for _ in 0..20_000 {
            let text: String = (0..next() % 24)
                .map(|_| POOL[(next() % POOL.len() as u64) as usize])
                .collect();
            for needle in ["\\u{", "&#", "font-family", "u"] {
                let ours: Vec<&str> = pieces_after(&text, needle).collect();
                let split: Vec<&str> = text.split(needle).skip(1).collect();
                assert_eq!(ours, split, "{text:?} {needle:?}");
            }
        }
    }

    /// The Typst and SVG checks as they were made before they searched
    /// for `sym` and `font` once: each word in a search of its own, the
    /// families after `split("font-family")`, every character tested.
    fn typst_needs_cjk_by_passes(text: &str) -> bool {
        ["sym.", "emoji.", "symbol(", "from-unicode"]
            .iter()
            .any(|name| text.contains(name))
            || text.chars().any(|c| !c.is_ascii() && body_takes_cjk(c))
            || text
                .split("\\u{")
                .skip(1)
                .any(|rest| escaped_char(rest, '}', 16).is_none_or(body_takes_cjk))
    }

    fn svg_needs_cjk_by_passes(text: &str) -> bool {
        if !text.contains("<text") && !text.contains(":text") {
            return false;
        }
        let mut families = text.split("font-family").skip(1).peekable();
        if text.contains("font:") || families.peek().is_none() {
            return true;
        }
        let only_noto_sans = families.all(|rest| {
            let rest = rest.trim_start();
            let value = if let Some(attribute) = rest.strip_prefix('=') {
                let attribute = attribute.trim_start();
                let Some(quote) = attribute.chars().next().filter(|q| matches!(q, '"' | '\''))
                else {
                    return false;
                };
                attribute[1..].split(quote).next().unwrap_or_default()
            } else if let Some(style) = rest.strip_prefix(':') {
                style.split([';', '"', '}']).next().unwrap_or_default()
            } else {
                return false;
            };
            value.split(',').all(|family| {
                let family = family.trim().trim_matches(['"', '\'']);
                family.replace("&quot;", "").replace("&apos;", "").trim() == TEXT_FAMILIES[0]
            })
        });
        if !only_noto_sans {
            return true;
        }
        text.chars().any(|c| in_table(CJK_IN_SVG, c))
            || text.split("&#").skip(1).any(|rest| {
                let (digits, radix) = match rest.strip_prefix(['x', 'X']) {
                    Some(hex) => (hex, 16),
                    None => (rest, 10),
                };
                escaped_char(digits, ';', radix).is_none_or(|c| in_table(CJK_IN_SVG, c))
            })
    }

    /// The checks of a Typst source and of an SVG answer as the checks
    /// made word by word and character by character do, on 60,000 random
    /// texts of the words they look for, their pieces and look-alikes,
    /// and characters that the CJK face alone has and that it does not
    /// (the same ones again and again, as the remembered answers of
    /// `any_beyond_ascii` meet them).
    #[test]
    fn one_search_for_several_words_answers_as_a_search_for_each() {
        let mut next = crate::test_random::xorshift(0x9e37_79b9_7f4a_7c15_u64);
        const POOL: &[&str] = &[
            "sym",
            "sym.",
            "bol(",
            "symbol(",
            "sy",
            "m.",
            "emoji.",
            "emoji",
            "from-unicode",
            "from-",
            "unicode",
            "\\u{",
            "4e2d}",
            "41}",
            "}",
            "<text",
            "<text>",
            ":text",
            "font",
            "font:",
            "font-family",
            "-family",
            "=",
            ":",
            "\"",
            "'",
            "Noto Sans",
            "Noto Serif",
            "&quot;",
            "&#",
            "&#x4e2d;",
            "&#65;",
            ";",
            ",",
            " ",
            "\u{3000}",
            "x",
            "µ",
            "Ω",
            "–",
            "日",
            "中",
            "√",
            "≤",
            "\u{a0}",
            "é",
            "\u{1f600}",
            "abcdefghijklmnopqrstuvwxyz0123",
        ];
        let mut seen = [[0usize; 2]; 2];
        for _ in 0..60_000 {
            let text: String = (0..next() % 40)
                .map(|_| POOL[(next() % POOL.len() as u64) as usize])
                .collect();
            let typst = typst_needs_cjk(&text);
            assert_eq!(typst, typst_needs_cjk_by_passes(&text), "{text:?}");
            let svg = svg_needs_cjk(&text);
            assert_eq!(svg, svg_needs_cjk_by_passes(&text), "{text:?}");
            seen[0][usize::from(typst)] += 1;
            seen[1][usize::from(svg)] += 1;
        }
        // Both answers came up often for both kinds of file.
        assert!(seen.iter().flatten().all(|&n| n > 1_000), "{seen:?}");
    }

    /// Text and bytes of the same file are the same file, and the check
    /// reads a text file as it reads the same bytes.
    #[test]
    fn text_and_bytes_of_a_file_are_checked_alike() {
        for (path, text) in [
            ("main.typ", "plain"),
            ("main.typ", "日本"),
            ("main.typ", "#sym.arrow"),
            (
                "plots/a.svg",
                "<svg><text font-family=\"Noto Sans\">中</text></svg>",
            ),
            (
                "plots/a.svg",
                "<svg><text font-family=\"Noto Sans\">Ω</text></svg>",
            ),
            ("notes.txt", "日"),
            ("a.png", "日"),
        ] {
            let mut as_text = Sandbox::new();
            as_text.insert(path, text).unwrap();
            let mut as_bytes = Sandbox::new();
            as_bytes.insert(path, text.as_bytes().to_vec()).unwrap();
            assert_eq!(as_text, as_bytes);
            assert_eq!(needs_cjk(&as_text), needs_cjk(&as_bytes), "{path}: {text}");
        }
    }

    fn sandbox_with(files: &[(&str, &str)]) -> Sandbox {
        let mut sandbox = Sandbox::new();
        for (path, text) in files {
            sandbox.insert(*path, *text).unwrap();
        }
        sandbox
    }

    #[test]
    fn a_document_needs_the_cjk_face_only_for_what_only_it_sets() {
        let main = format!(
            "{}= Report\nOutput 12 W, −3 dB, √2, ≤ 5 %, µF, Ω.\n",
            font_rules()
        );
        let plain = sandbox_with(&[
            ("main.typ", &main),
            (
                "mains-safety.typ",
                "= Sicherheit\n„Netzspannung“ – tödlich.",
            ),
            (
                "plots/p.svg",
                "<svg><text font-family=\"Noto Sans\">−20 dB</text></svg>",
            ),
            ("photos/a.jpg", "\u{FF}\u{D8}binary"),
        ]);
        assert!(!needs_cjk(&plain));
        // A CJK character, an arrow, the parallel sign, wherever typst sets
        // text: the main source, the notice, a chart's SVG.
        for (path, text) in [
            ("main.typ", "Value → 5"),
            ("main.typ", "R1 ∥ R2"),
            ("main.typ", "顧客"),
            ("main.typ", "escaped \\u{2192} arrow"),
            ("main.typ", "#sym.arrow.r"),
            ("mains-safety.typ", "注意"),
            (
                "plots/p.svg",
                "<svg><text font-family=\"Noto Sans\">→</text></svg>",
            ),
            (
                "plots/p.svg",
                "<svg><text font-family=\"Noto Sans\">&#x2192;</text></svg>",
            ),
            (
                "shop/logo.svg",
                "<svg><text font-family=\"Serif Co\">Shop</text></svg>",
            ),
            ("shop/logo.svg", "<svg><text>Shop</text></svg>"),
            ("data.bin", "\u{0}"),
        ] {
            let mut sandbox = plain.clone();
            let bytes: Vec<u8> = if path == "data.bin" {
                vec![0xFF, 0xFE, 0x00]
            } else {
                text.as_bytes().to_vec()
            };
            sandbox.insert(path, bytes).unwrap();
            assert!(needs_cjk(&sandbox), "{path}: {text}");
        }
        // Noto Sans named in every way an SVG may name it, entities
        // included, is Noto Sans; another family beside it is not.
        for (family, needs) in [
            ("font-family=\"Noto Sans\"", false),
            ("font-family='Noto Sans'", false),
            ("font-family=\"&quot;Noto Sans&quot;\"", false),
            ("font-family=\" &apos;Noto Sans&apos; , Noto Sans\"", false),
            ("style=\"font-family: Noto Sans; fill: red\"", false),
            // A style's value ends at the first `;`, an entity's too.
            ("style=\"font-family:&quot;Noto Sans&quot;\"", true),
            ("font-family=\"Noto Sans, Serif Co\"", true),
            ("font-family=\"&quot;Noto&quot; Sans\"", false),
            ("font-family=\"Noto Sans&amp;\"", true),
            ("font-family=\"\"", true),
        ] {
            let mut sandbox = plain.clone();
            let svg = format!("<svg><text {family}>Shop</text></svg>");
            sandbox.insert("shop/logo.svg", svg.as_str()).unwrap();
            assert_eq!(needs_cjk(&sandbox), needs, "{svg}");
        }
        // An SVG without text, or with the minus sign (Noto Sans
        // Devanagari has it), does not.
        let mut sandbox = plain.clone();
        sandbox
            .insert(
                "shop/logo.svg",
                "<svg><path d=\"M0 0\"/><!-- 注意 --></svg>",
            )
            .unwrap();
        assert!(!needs_cjk(&sandbox));
    }

    #[test]
    fn fitting_the_fonts_leaves_the_cjk_families_out_only_when_unneeded() {
        let main = format!("{}Output −3 dB.\n", font_rules());
        let mut sandbox = sandbox_with(&[("main.typ", &main)]);
        assert!(!fit_fonts(&mut sandbox, "main.typ").unwrap());
        let lean = String::from_utf8(sandbox.get("main.typ").unwrap().to_vec()).unwrap();
        assert_eq!(lean, format!("{}Output −3 dB.\n", font_rules_without_cjk()));
        // A main source that is not UTF-8 is left as it is, also when it
        // is named as an image (which the check does not read).
        let mut bytes = font_rules().into_bytes();
        bytes.push(0xFF);
        let mut sandbox = Sandbox::new();
        sandbox.insert("main.png", bytes.clone()).unwrap();
        assert!(!fit_fonts(&mut sandbox, "main.png").unwrap());
        assert_eq!(sandbox.get("main.png").unwrap(), bytes);
        // Text before and after is kept, and only the first rules change,
        // as `replacen(…, 1)` would change them.
        let main = format!("Über\n{0}Mitte −3 dB.\n{0}Ende", font_rules());
        let mut sandbox = sandbox_with(&[("main.typ", &main)]);
        assert!(!fit_fonts(&mut sandbox, "main.typ").unwrap());
        assert_eq!(
            sandbox.get("main.typ").unwrap(),
            main.replacen(&font_rules(), &font_rules_without_cjk(), 1)
                .as_bytes()
        );
        for family in CJK_FAMILIES {
            assert!(!lean.contains(family), "{lean}");
        }
        for family in TEXT_FAMILIES.iter().chain(MONO_FAMILIES) {
            assert_eq!(
                lean.contains(&format!("\"{family}\"")),
                !CJK_FAMILIES.contains(family),
                "{family}"
            );
        }
        // The signs from the monospaced face keep their rule.
        assert!(lean.contains("(name: \"Noto Sans Mono\", covers: regex("));
        let main = format!("{}Output → 3 dB.\n", font_rules());
        let mut sandbox = sandbox_with(&[("main.typ", &main)]);
        assert!(fit_fonts(&mut sandbox, "main.typ").unwrap());
        assert_eq!(sandbox.get("main.typ").unwrap(), main.as_bytes());
    }

    #[test]
    fn the_cjk_folder_is_beside_the_font_folder() {
        assert_eq!(
            cjk_folder(Path::new("/c/fonts-0123")),
            Path::new("/c/fonts-0123-cjk")
        );
        assert_eq!(cjk_folder(Path::new("fonts")), Path::new("fonts-cjk"));
        assert!(base_files().all(|(n, _)| *n != CJK_FONT));
        assert_eq!(cjk_files().map(|(n, _)| *n).collect::<Vec<_>>(), [CJK_FONT]);
    }
}
