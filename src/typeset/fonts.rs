//! The fonts every document is set in, built into the binary so a PDF looks
//! the same on every machine: typst is told to use these and nothing else.
//! The files and their licences live in `fonts/` at the top of the repository
//! (see `fonts/README.md`).

use std::io;
use std::path::Path;

/// The folder, inside a typesetting sandbox, that holds the fonts.
pub const FONT_DIR: &str = "fonts";

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
pub fn font_rules() -> String {
    let mut body: Vec<String> = TEXT_FAMILIES.iter().map(|f| quoted(f)).collect();
    body.insert(
        TEXT_FAMILIES.len() - 1,
        format!(
            "(name: {}, covers: regex(\"[{SIGNS_FROM_MONO}]\"))",
            quoted(MONO_FAMILIES[0])
        ),
    );
    format!(
        "#set text(font: ({}))\n#let mono-fonts = {}\n#show raw: set text(font: mono-fonts)\n",
        body.join(", "),
        family_array(MONO_FAMILIES),
    )
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

/// Writes the fonts and their licences into `dir/fonts/`.
pub(crate) fn write_fonts(dir: &Path) -> io::Result<()> {
    let fonts = dir.join(FONT_DIR);
    std::fs::create_dir_all(&fonts)?;
    for (name, bytes) in BUNDLED_FONTS.iter().chain(FONT_LICENCES) {
        std::fs::write(fonts.join(name), bytes)?;
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
        for (_, data) in BUNDLED_FONTS {
            let faces = ttf_parser::fonts_in_collection(data).unwrap_or(1);
            for index in 0..faces {
                let face = ttf_parser::Face::parse(data, index).unwrap();
                for table in face.tables().cmap.unwrap().subtables {
                    if table.is_unicode() {
                        table.codepoints(|c| {
                            set.insert(c);
                        });
                    }
                }
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
}
