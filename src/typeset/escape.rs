//! Typst escaping: the one place that turns untrusted text (customer names,
//! fault notes, anything from a job file) into Typst source that prints
//! exactly those characters and nothing else.
//!
//! Two contexts exist:
//!
//! * **markup** ([`escape_markup`]): text placed in a template's body. Every
//!   ASCII punctuation character gets a backslash in front of it. Typst reads
//!   backslash-plus-character as that character, so this switches off at once
//!   every markup rule that uses punctuation: code (`#`), maths (`$`), strong
//!   and emphasis (`*`, `_`), raw text (`` ` ``), labels and references (`<`,
//!   `>`, `@`), headings (`=`), lists (`-`, `+`, `1.`, `/`), comments (`//`,
//!   `/*`), content brackets (`[`, `]`), smart quotes (`'`, `"`) and the
//!   shorthands (`~`, `--`, `...`, `-?`, `-1`). Escaping all punctuation,
//!   rather than a hand-picked list, means a new rule in a later Typst release
//!   that uses punctuation is covered too.
//! * **string literal** ([`escape_string`]): text placed between `"` quotes in
//!   Typst code, for example a document title.
//!
//! Line breaks in user text are kept on purpose: each one becomes a Typst
//! forced line break written as `\ ` (backslash, space), so a note typed on
//! three lines prints on three lines within one paragraph. The escaped text
//! never contains a source newline, so it cannot end a heading or list item
//! that a template writes in line-based markup (`= {{ title }}`). An empty
//! line in the user text becomes `~\ ` (a non-breaking space, then a break),
//! because Typst would fold two bare breaks in a row into one. The usual
//! newline forms (`\n`, `\r\n`, `\r`) and the other characters Typst treats
//! as a line end (vertical tab, form feed, U+0085, U+2028, U+2029) all count.
//! A tab becomes a space. Other control characters cannot be printed and are
//! dropped. Runs of spaces collapse to one space, as Typst does for all text.

/// Makes `text` print literally when placed in Typst markup.
///
/// See the module documentation for the rules.
pub fn escape_markup(text: &str) -> String {
    let mut out = String::with_capacity(text.len() + text.len() / 4);
    escape_markup_into(text, &mut out);
    out
}

/// [`escape_markup`], appending to `out` (the template's formatter writes
/// every printed value this way, without a string of its own for each).
pub fn escape_markup_into(text: &str, out: &mut String) {
    if !escape_common_into(text, out) {
        escape_full_into(text, out);
    }
}

/// The common case of [`escape_markup_into`] in one pass: text of printable
/// characters the fonts can draw, single-line, with no run of
/// [`LONG_RUN`] characters (nearly every figure and name a document prints).
/// It writes what [`escape_full_into`] writes and returns true; for any
/// other text it leaves `out` as it was and returns false.
fn escape_common_into(text: &str, out: &mut String) -> bool {
    let start = out.len();
    let bytes = text.as_bytes();
    let mut run = 0usize;
    let class = ascii_class();
    // The text is copied in runs between the characters that take a
    // backslash, rather than a character at a time: `text[copied..i]` is
    // not yet in `out`.
    let mut copied = 0;
    let mut i = 0;
    while i < bytes.len() {
        // A run of letters and digits, counted in one step: the run only
        // grows inside it, so one check at its end finds what a check at
        // each character finds.
        let from = i;
        while i < bytes.len() && class.get(usize::from(bytes[i])) == Some(&PLAIN) {
            i += 1;
        }
        if i > from {
            run += i - from;
            if run >= LONG_RUN {
                out.truncate(start);
                return false;
            }
            continue;
        }
        let b = bytes[i];
        if b.is_ascii() {
            match class[usize::from(b)] {
                SPACE => {
                    run = 0;
                    i += 1;
                    continue;
                }
                PUNCT | QUOTE => {
                    out.push_str(&text[copied..i]);
                    out.push('\\');
                    copied = i;
                    i += 1;
                }
                _ => {
                    out.truncate(start);
                    return false;
                }
            }
        } else {
            // A byte past ASCII at `i` starts a character.
            let Some(c) = text[i..].chars().next() else {
                break;
            };
            i += c.len_utf8();
            if c == '\u{A0}' {
                run = 0;
                continue;
            }
            if c.is_whitespace()
                || c.is_control()
                || is_variant_mark(c)
                || !super::fonts::can_draw(c)
            {
                out.truncate(start);
                return false;
            }
        }
        run += 1;
        if run >= LONG_RUN {
            out.truncate(start);
            return false;
        }
    }
    out.push_str(&text[copied..]);
    true
}

/// How the one-pass escapers treat an ASCII byte ([`ascii_class`]).
const BAIL: u8 = 0;
/// A letter or digit the fonts draw: copied as it is.
const PLAIN: u8 = 1;
/// Punctuation the fonts draw, other than `\\` and `"`: a backslash
/// before it in markup, as it is in a string.
const PUNCT: u8 = 2;
/// `\\` or `"` (when the fonts draw them): a backslash before it in
/// markup and in a string.
const QUOTE: u8 = 3;
/// The space.
const SPACE: u8 = 4;

/// The class of every ASCII byte for the one-pass escapers, worked out
/// once from the fonts' coverage: looking a byte up here costs a load,
/// where testing its bit in the 128-bit coverage mask cost a dozen
/// instructions a character (a long job prints some two million).
fn ascii_class() -> &'static [u8; 128] {
    static CLASS: std::sync::LazyLock<[u8; 128]> = std::sync::LazyLock::new(|| {
        let covered = super::fonts::ascii_covered();
        let mut class = [BAIL; 128];
        for b in b'!'..=b'~' {
            if (covered >> b) & 1 != 0 {
                class[usize::from(b)] = match b {
                    b'\\' | b'"' => QUOTE,
                    b if b.is_ascii_punctuation() => PUNCT,
                    _ => PLAIN,
                };
            }
        }
        class[usize::from(b' ')] = SPACE;
        class
    });
    &CLASS
}

/// Marks that only choose a glyph variant: dropped by the escaper.
fn is_variant_mark(c: char) -> bool {
    matches!(c, '\u{FE00}'..='\u{FE0F}' | '\u{E0000}'..='\u{E007F}' | '\u{E0100}'..='\u{E01EF}')
}

/// [`escape_markup_into`] for any text, character by character.
fn escape_full_into(text: &str, out: &mut String) {
    let mut chars = text.chars().peekable();
    // Breaks since the last printed character: the first is a plain line
    // break, each further one an empty line.
    let mut breaks = 0usize;
    // The run of printed characters since the last white space or break:
    // where each LONG_CHUNK-th of them ends in `out`. A run of LONG_RUN or
    // more gets a zero-width space at each of those places when it ends,
    // so typst may break a very long word rather than run it off the page.
    let mut run = 0usize;
    let mut chunk_ends: Vec<usize> = Vec::new();
    let mark = super::fonts::placeholder();
    while let Some(c) = chars.next() {
        if c == '\r' || is_line_end(c) {
            end_run(out, &mut run, &mut chunk_ends);
            // A lone CR or a CRLF pair is one line break.
            if c == '\r' && chars.peek() == Some(&'\n') {
                chars.next();
            }
            out.push_str(if breaks == 0 { "\\ " } else { "~\\ " });
            breaks += 1;
            continue;
        }
        if c.is_control() && c != '\t' {
            continue;
        }
        breaks = 0;
        if c.is_whitespace() {
            end_run(out, &mut run, &mut chunk_ends);
        }
        let before = out.len();
        match c {
            '\t' => out.push(' '),
            c if c.is_ascii_punctuation() => {
                out.push('\\');
                out.push(c);
            }
            c if is_variant_mark(c) => {}
            c if !super::fonts::can_draw(c) => out.push(mark),
            c => out.push(c),
        }
        if !c.is_whitespace() && out.len() > before {
            run += 1;
            if run % LONG_CHUNK == 0 {
                chunk_ends.push(out.len());
            }
        }
    }
    end_run(out, &mut run, &mut chunk_ends);
}

/// Ends the run of characters that `out` ends with: a run of at least
/// [`LONG_RUN`] characters gets a zero-width space after each
/// [`LONG_CHUNK`] of them (none at its very end).
fn end_run(out: &mut String, run: &mut usize, chunk_ends: &mut Vec<usize>) {
    if *run >= LONG_RUN {
        for &at in chunk_ends.iter().rev() {
            if at < out.len() {
                out.insert(at, '\u{200B}');
            }
        }
    }
    *run = 0;
    chunk_ends.clear();
}

/// Characters in a row, without white space, from which a run is broken:
/// longer than any real word or part number.
pub const LONG_RUN: usize = 32;

/// A long run may break after every this many characters, so that even its
/// pieces fit a narrow table column. The hand-over template gives the
/// strings it prints (a status cell's reason) the same break opportunities
/// (`long-runs` in `templates/handover.typ`); a regex rule over the whole
/// document did this for all text before, at a twentieth of typst's time
/// on a long job.
pub const LONG_CHUNK: usize = 16;

/// Makes `text` safe inside a Typst string literal: the result goes between
/// two `"` characters.
///
/// Backslash and quote are escaped, line breaks and tabs become `\n`, `\r`
/// and `\t`, and any other control character becomes a `\u{…}` escape, so
/// the string holds exactly the original characters.
pub fn escape_string(text: &str) -> String {
    let mut out = String::with_capacity(text.len() + 2);
    escape_string_into(text, &mut out);
    out
}

/// [`escape_string`], appended to `out`.
///
/// The text is scanned by bytes rather than characters: every character
/// that changes is ASCII, a C1 control (U+0080–U+009F, whose UTF-8 starts
/// with 0xC2) or a line or paragraph separator (U+2028, U+2029: 0xE2 0x80
/// 0xA8 or 0xA9), and no other character's bytes can look like them.
pub fn escape_string_into(text: &str, out: &mut String) {
    let bytes = text.as_bytes();
    // Copied in runs between the characters that change: `text[copied..i]`
    // is not yet in `out`.
    let mut copied = 0;
    let mut i = 0;
    while i < bytes.len() {
        let b = bytes[i];
        // The character at `i` that changes, and its length in bytes.
        let (c, len) = match b {
            b'\\' | b'"' | 0..0x20 | 0x7F => (char::from(b), 1),
            0xC2 if matches!(bytes.get(i + 1), Some(0x80..=0x9F)) => (char::from(bytes[i + 1]), 2),
            0xE2 if bytes.get(i + 1) == Some(&0x80)
                && matches!(bytes.get(i + 2), Some(0xA8 | 0xA9)) =>
            {
                (
                    if bytes[i + 2] == 0xA8 {
                        '\u{2028}'
                    } else {
                        '\u{2029}'
                    },
                    3,
                )
            }
            _ => {
                i += 1;
                continue;
            }
        };
        out.push_str(&text[copied..i]);
        match c {
            '\\' => out.push_str("\\\\"),
            '"' => out.push_str("\\\""),
            '\n' => out.push_str("\\n"),
            '\r' => out.push_str("\\r"),
            '\t' => out.push_str("\\t"),
            c => {
                use std::fmt::Write as _;
                let _ = write!(out, "\\u{{{:x}}}", u32::from(c));
            }
        }
        i += len;
        copied = i;
    }
    out.push_str(&text[copied..]);
}

/// Makes `text` a Typst expression for content in code position (a table
/// cell, a function's argument) that prints exactly what the content block
/// `[` + [`escape_markup`]`(text)` + `]` prints.
///
/// Where the text reads the same as a string literal, that is what it
/// becomes: typst makes one text element of a string, but one of every
/// escaped character, space and run of letters in markup, and in a long
/// job's thousands of table cells laying those out was a seventh of typst's
/// work (see docs/performance.md). Text that markup would change (a line
/// break, a tab or a control character, spaces at either end or two in a
/// row, which markup folds into one) stays a content block. Either way the
/// characters printed are those of [`escape_markup`]: the same stand-in for
/// what the fonts cannot draw, the same break opportunities in long runs,
/// and nothing in the text can run code.
pub fn escape_content(text: &str) -> String {
    let mut out = String::with_capacity(text.len() + 2);
    escape_content_into(text, &mut out);
    out
}

/// [`escape_content`], appended to `out`.
pub fn escape_content_into(text: &str, out: &mut String) {
    if plain_cell_into(text, out) {
        return;
    }
    let start = out.len();
    if !content_as_string_into(text, out) {
        out.truncate(start);
        out.push_str(&escape_content_full(text));
    }
}

/// The commonest case of [`escape_content`], tested before any other: a
/// short cell of ASCII letters, digits, punctuation other than `\` and
/// `"`, single spaces inside and the few characters past ASCII that
/// figures and units use ([`FIGURE_CHARS`], where the fonts draw them): a
/// figure such as `473`, `0.44 W`, `+2.9 %`, `1 kΩ`, `26.8–37.6 mA`. Such
/// a text reads the same as a string literal and needs no escape, so it
/// is written between quotes as it is, as [`content_as_string_into`]
/// would write it: it holds no character that changes or sends the text
/// to the full path, and, shorter than [`LONG_RUN`] bytes, no long run.
/// Returns false, with `out` untouched, for any other text.
///
/// A long job prints some 180,000 table cells, nearly all of them such
/// figures; a byte here is a single table look-up and comparison, and a
/// figure's character past ASCII one comparison with a short list, where
/// the general pass sorted every byte into five kinds and looked every
/// character past ASCII up in the Unicode and font tables.
fn plain_cell_into(text: &str, out: &mut String) -> bool {
    let bytes = text.as_bytes();
    let (Some(&first), Some(&last)) = (bytes.first(), bytes.last()) else {
        return false;
    };
    if bytes.len() >= LONG_RUN || first == b' ' || last == b' ' {
        return false;
    }
    let plain = plain_in_cell();
    // Every character plain, and no space right after a space (a space is
    // never first or last).
    let mut after_space = false;
    let mut i = 0;
    while i < bytes.len() {
        let b = bytes[i];
        if b.is_ascii() {
            if !plain[usize::from(b)] {
                return false;
            }
            let space = b == b' ';
            if space && after_space {
                return false;
            }
            after_space = space;
            i += 1;
        } else {
            // A byte past ASCII at `i` starts a character.
            let Some(c) = text[i..].chars().next() else {
                return false;
            };
            if !figure_char_drawn(c) {
                return false;
            }
            after_space = false;
            i += c.len_utf8();
        }
    }
    out.reserve(bytes.len() + 2);
    out.push('"');
    out.push_str(text);
    out.push('"');
    true
}

/// Which ASCII bytes [`plain_cell_into`] takes: the letters, digits and
/// punctuation of [`ascii_class`]'s `PLAIN` and `PUNCT` (the ones the
/// fonts draw, `\` and `"` left out) and the space.
fn plain_in_cell() -> &'static [bool; 128] {
    static PLAIN_IN_CELL: std::sync::LazyLock<[bool; 128]> = std::sync::LazyLock::new(|| {
        let class = ascii_class();
        let mut plain = [false; 128];
        for (b, kind) in class.iter().enumerate() {
            plain[b] = matches!(*kind, PLAIN | PUNCT | SPACE);
        }
        plain
    });
    &PLAIN_IN_CELL
}

/// The characters past ASCII that the tables' figures and units use (the
/// dash of a range, the minus sign, ±, Ω, µ, °). None is white space, a
/// control or a variant mark, so where the fonts draw one the one-pass
/// escaper copies it as it is.
const FIGURE_CHARS: [char; 6] = ['–', '\u{2212}', '±', 'Ω', 'µ', '°'];

/// Whether `c` is one of [`FIGURE_CHARS`] and the fonts draw it (asked
/// of the fonts once).
fn figure_char_drawn(c: char) -> bool {
    static DRAWN: std::sync::LazyLock<[bool; FIGURE_CHARS.len()]> =
        std::sync::LazyLock::new(|| FIGURE_CHARS.map(super::fonts::can_draw));
    FIGURE_CHARS
        .iter()
        .position(|&f| f == c)
        .is_some_and(|k| DRAWN[k])
}

/// The common case of [`escape_content`] in one pass: text that
/// [`escape_common_into`] takes (printable characters the fonts can draw,
/// one line, no run of [`LONG_RUN`]), not empty, with no space at either
/// end and no two in a row. Its markup, unescaped, is the text itself, so
/// the string literal is the text with `\` and `"` escaped. `None` for
/// any other text.
#[cfg(test)]
fn content_as_string(text: &str) -> Option<String> {
    let mut out = String::with_capacity(text.len() + 2);
    content_as_string_into(text, &mut out).then_some(out)
}

/// [`content_as_string`] appended to `out`; false (with part of the text
/// possibly written) when the text is not for the one pass.
fn content_as_string_into(text: &str, out: &mut String) -> bool {
    let bytes = text.as_bytes();
    if text.is_empty() || text.starts_with(' ') || text.ends_with(' ') {
        return false;
    }
    out.reserve(bytes.len() + 2);
    out.push('"');
    let mut run = 0usize;
    // Two spaces in a row (not a no-break space) send the text to the
    // full path: found in this loop rather than by a search of its own.
    let mut after_space = false;
    let class = ascii_class();
    // The text is copied in runs between the characters that take a
    // backslash: `text[copied..i]` is not yet in `out`.
    let mut copied = 0;
    let mut i = 0;
    while i < bytes.len() {
        let b = bytes[i];
        if b.is_ascii() {
            match class[usize::from(b)] {
                SPACE => {
                    if after_space {
                        return false;
                    }
                    after_space = true;
                    run = 0;
                    i += 1;
                    continue;
                }
                PLAIN | PUNCT => i += 1,
                QUOTE => {
                    out.push_str(&text[copied..i]);
                    out.push('\\');
                    copied = i;
                    i += 1;
                }
                _ => return false,
            }
        } else {
            // A byte past ASCII at `i` starts a character.
            let Some(c) = text[i..].chars().next() else {
                break;
            };
            i += c.len_utf8();
            if c == '\u{A0}' {
                after_space = false;
                run = 0;
                continue;
            }
            if c.is_whitespace()
                || c.is_control()
                || is_variant_mark(c)
                || !super::fonts::can_draw(c)
            {
                return false;
            }
        }
        after_space = false;
        run += 1;
        if run >= LONG_RUN {
            return false;
        }
    }
    out.push_str(&text[copied..]);
    out.push('"');
    true
}

/// [`escape_content`] for any text: through [`escape_markup`].
fn escape_content_full(text: &str) -> String {
    let plain = !text.is_empty()
        && !text.starts_with(' ')
        && !text.ends_with(' ')
        && !text.contains("  ")
        && !text
            .chars()
            .any(|c| c == '\r' || c.is_control() || is_line_end(c));
    let markup = escape_markup(text);
    if !plain || markup.is_empty() {
        return format!("[{markup}]");
    }
    // Markup without line breaks holds a backslash only in front of the
    // character it escapes.
    let mut printed = String::with_capacity(markup.len());
    let mut chars = markup.chars();
    while let Some(c) = chars.next() {
        match c {
            '\\' => printed.extend(chars.next()),
            c => printed.push(c),
        }
    }
    format!("\"{}\"", escape_string(&printed))
}

/// Characters other than CR that end a line in Typst source.
fn is_line_end(c: char) -> bool {
    matches!(
        c,
        '\n' | '\u{0B}' | '\u{0C}' | '\u{85}' | '\u{2028}' | '\u{2029}'
    )
}

#[cfg(test)]
mod tests {
    use super::*;

    /// [`escape_string_into`] as it was written before it scanned bytes:
    /// character by character.
    fn escape_string_by_chars(text: &str) -> String {
        let mut out = String::new();
        let mut copied = 0;
        for (i, c) in text.char_indices() {
            let escaped = match c {
                '\\' => "\\\\",
                '"' => "\\\"",
                '\n' => "\\n",
                '\r' => "\\r",
                '\t' => "\\t",
                c if c.is_control() || is_line_end(c) => {
                    out.push_str(&text[copied..i]);
                    out.push_str(&format!("\\u{{{:x}}}", c as u32));
                    copied = i + c.len_utf8();
                    continue;
                }
                _ => continue,
            };
            out.push_str(&text[copied..i]);
            out.push_str(escaped);
            copied = i + c.len_utf8();
        }
        out.push_str(&text[copied..]);
        out
    }

    #[test]
    fn strings_are_escaped_by_bytes_as_by_characters() {
        // Every control character and line end, and their UTF-8
        // neighbours (the same lead byte, the next and previous code
        // points), among plain text.
        let mut pool: Vec<char> = (0..0x100u32).filter_map(char::from_u32).collect();
        pool.extend("\u{2026}\u{2027}\u{2028}\u{2029}\u{202A}\u{202F}\u{2080}\u{20AC}\u{2212}\u{1F600}\u{10FFFF}\u{FFFD}–Ω“µ中".chars());
        let mut next = crate::test_random::xorshift(0x9E37_79B9_7F4A_7C15u64);
        for round in 0..60_000 {
            let len = (next() % 14) as usize;
            let text: String = (0..len)
                .map(|_| {
                    let k = next() as usize;
                    if round % 2 == 0 && k % 3 != 0 {
                        ['a', ' ', '7', '.'][k % 4]
                    } else {
                        pool[k % pool.len()]
                    }
                })
                .collect();
            let mut out = String::from("before ");
            escape_string_into(&text, &mut out);
            assert_eq!(
                out,
                format!("before {}", escape_string_by_chars(&text)),
                "{text:?}"
            );
        }
        for c in pool {
            let text = format!("x{c}y{c}");
            assert_eq!(escape_string(&text), escape_string_by_chars(&text), "{c:?}");
        }
    }

    #[test]
    fn a_long_run_may_break_after_every_chunk() {
        let word = "a".repeat(LONG_RUN - 1);
        assert_eq!(escape_markup(&word), word);
        let b16 = "b".repeat(LONG_CHUNK);
        // 40 characters: breaks after the 16th and the 32nd.
        assert_eq!(
            escape_markup(&"b".repeat(40)),
            format!("{b16}\u{200B}{b16}\u{200B}bbbbbbbb")
        );
        // Exactly two chunks: no break at the very end.
        assert_eq!(
            escape_markup(&"b".repeat(2 * LONG_CHUNK)),
            format!("{b16}\u{200B}{b16}")
        );
        // Punctuation counts as one character, escaped whole.
        let dots = ".".repeat(LONG_RUN);
        let escaped16 = "\\.".repeat(LONG_CHUNK);
        assert_eq!(
            escape_markup(&dots),
            format!("{escaped16}\u{200B}{escaped16}")
        );
        // Appended to text already written, the breaks fall in the run.
        let mut out = String::from("prefix ");
        escape_markup_into(&"b".repeat(40), &mut out);
        assert_eq!(out, format!("prefix {b16}\u{200B}{b16}\u{200B}bbbbbbbb"));
        // White space and line breaks start a new run.
        assert_eq!(
            escape_markup(&format!("{word} {word}")),
            format!("{word} {word}")
        );
        assert_eq!(
            escape_markup(&format!("{word}\n{word}")),
            format!("{word}\\ {word}")
        );
    }

    #[test]
    fn plain_words_pass_through() {
        assert_eq!(escape_markup("Mr Smith 12 W"), "Mr Smith 12 W");
        assert_eq!(escape_markup("Ωμέγα Жук שלום"), "Ωμέγα Жук שלום");
        assert_eq!(escape_markup(""), "");
    }

    #[test]
    fn every_markup_sigil_gets_a_backslash() {
        for c in "#$*_`<>@=-+/\\[]~\"'.:;,!?(){}%&|^".chars() {
            assert_eq!(escape_markup(&c.to_string()), format!("\\{c}"), "{c:?}");
        }
    }

    #[test]
    fn code_and_comments_are_disarmed() {
        assert_eq!(
            escape_markup("#read(\"/etc/passwd\")"),
            "\\#read\\(\\\"\\/etc\\/passwd\\\"\\)"
        );
        assert_eq!(escape_markup("// x"), "\\/\\/ x");
        assert_eq!(escape_markup("/* x */"), "\\/\\* x \\*\\/");
    }

    #[test]
    fn no_unescaped_sigil_survives() {
        let nasty = "= H\n- a\n+ b\n1. c\n/ t: d\n$x^2$ <l> @r *b* _e_ `r` ~ -- ... -? -1";
        let out = escape_markup(nasty);
        let mut prev_backslash = false;
        for c in out.chars() {
            if c.is_ascii_punctuation() && c != '\\' {
                assert!(prev_backslash, "bare {c:?} in {out:?}");
            }
            prev_backslash = c == '\\' && !prev_backslash;
        }
    }

    #[test]
    fn newlines_become_forced_line_breaks() {
        assert_eq!(escape_markup("a\nb"), "a\\ b");
        assert_eq!(escape_markup("a\r\nb"), "a\\ b");
        assert_eq!(escape_markup("a\rb"), "a\\ b");
        assert_eq!(escape_markup("a\u{2028}b"), "a\\ b");
        assert_eq!(escape_markup("a\n\nb"), "a\\ ~\\ b");
        assert_eq!(escape_markup("a\r\n\r\n\r\nb"), "a\\ ~\\ ~\\ b");
        assert!(!escape_markup("x\ny\rz\u{85}").contains('\n'));
    }

    #[test]
    fn tabs_become_spaces_and_controls_vanish() {
        assert_eq!(escape_markup("a\tb"), "a b");
        assert_eq!(escape_markup("a\u{7}b\u{0}c\u{9b}"), "abc");
    }

    #[test]
    fn a_trailing_backslash_cannot_eat_what_follows() {
        // `\` escaped as `\\`, so a template's own `]` after it still closes.
        assert_eq!(escape_markup("C:\\"), "C\\:\\\\");
    }

    #[test]
    fn content_is_a_string_where_it_prints_the_same() {
        assert_eq!(escape_content("0.10 W"), "\"0.10 W\"");
        assert_eq!(escape_content("±10 %"), "\"±10 %\"");
        assert_eq!(
            escape_content("#read(\"x\") \\ [b]"),
            "\"#read(\\\"x\\\") \\\\ [b]\""
        );
        // What markup would change stays markup, escaped as ever.
        assert_eq!(escape_content(""), "[]");
        assert_eq!(escape_content("a\nb"), "[a\\ b]");
        assert_eq!(escape_content("a\tb"), "[a b]");
        assert_eq!(escape_content(" a"), "[ a]");
        assert_eq!(escape_content("a  b."), "[a  b\\.]");
        assert_eq!(escape_content("bell\u{7}"), "[bell]");
        // The same break opportunities in a long run as in markup.
        let b16 = "b".repeat(LONG_CHUNK);
        assert_eq!(
            escape_content(&"b".repeat(40)),
            format!("\"{b16}\u{200B}{b16}\u{200B}bbbbbbbb\"")
        );
        // A string literal's text is the markup's, character for character.
        for text in [
            "V1",
            "B+1 to B+2",
            "1. not a list",
            "= not a heading",
            "C:\\",
            "a \"q\" 'x'",
        ] {
            let literal = escape_content(text);
            let inner = &literal[1..literal.len() - 1];
            assert_eq!(
                inner.replace("\\\"", "\"").replace("\\\\", "\\"),
                text,
                "{literal}"
            );
        }
    }

    #[test]
    fn string_literal_escapes() {
        assert_eq!(escape_string("plain"), "plain");
        assert_eq!(escape_string("say \"hi\""), "say \\\"hi\\\"");
        assert_eq!(escape_string("back\\slash"), "back\\\\slash");
        assert_eq!(escape_string("two\nlines\r\tx"), "two\\nlines\\r\\tx");
        assert_eq!(escape_string("bell\u{7}"), "bell\\u{7}");
        assert_eq!(escape_string("ls\u{2028}"), "ls\\u{2028}");
        assert_eq!(escape_string("#$*_ ok"), "#$*_ ok");
        let mut out = String::from("x ");
        escape_string_into("a\"b\n", &mut out);
        assert_eq!(out, "x a\\\"b\\n");
    }

    #[test]
    fn the_common_path_writes_what_the_full_path_writes() {
        // Characters of every kind the two paths treat differently: plain
        // and punctuation ASCII, spaces of several kinds, line ends,
        // controls, variant marks, drawable and undrawable non-ASCII.
        let pool: Vec<char> = "aZ09 .%-+#\\*_[]()\"'~\t\n\r\u{B}\u{7}\u{A0}\u{2009}\u{2028}–−±Ω“”µ\u{200B}\u{AD}\u{FE0F}\u{E0001}\u{1F600}\u{10FFFF}\u{4E2D}"
            .chars()
            .collect();
        let mut next = crate::test_random::xorshift(0x2545_f491_4f6c_dd1du64);
        let mut common = 0;
        for i in 0..20_000 {
            let len = (next() % 48) as usize;
            // Half the texts from the characters the common path takes.
            let narrow = i % 2 == 0;
            let text: String = (0..len)
                .map(|_| {
                    let k = (next() % pool.len() as u64) as usize;
                    if narrow { pool[k % 16] } else { pool[k] }
                })
                .collect();
            let mut full = String::from("before ");
            escape_full_into(&text, &mut full);
            let mut out = String::from("before ");
            if escape_common_into(&text, &mut out) {
                common += 1;
                assert_eq!(out, full, "{text:?}");
            } else {
                assert_eq!(out, "before ", "{text:?} left output behind");
            }
            let mut both = String::from("before ");
            escape_markup_into(&text, &mut both);
            assert_eq!(both, full, "{text:?}");
        }
        // The common path must really be taken for most plain texts.
        assert!(common > 5_000, "common path taken {common} times");
    }

    #[test]
    fn runs_at_the_long_run_limit_take_the_same_path_either_way() {
        // Runs one short of, at and past the limit, made of letters alone,
        // of letters and punctuation, and broken by quotes, no-break
        // spaces and non-ASCII letters, after a word and a space.
        let pieces = ["a", "7", ".", "\\", "\"", "Ω", "\u{A0}", "-", "ab", "x."];
        for total in LONG_RUN - 3..LONG_RUN + 3 {
            for (k, piece) in pieces.iter().enumerate() {
                for start in ["", "word ", " ", "a\u{A0}"] {
                    let mut text = String::from(start);
                    let mut n = 0;
                    while n < total {
                        // Mostly letters, the piece every few characters.
                        if n % (k + 2) == 0 {
                            text.push_str(piece);
                        } else {
                            text.push('b');
                        }
                        n += 1;
                    }
                    let mut full = String::new();
                    escape_full_into(&text, &mut full);
                    assert_eq!(escape_markup(&text), full, "{text:?}");
                    assert_eq!(
                        escape_content(&text),
                        escape_content_full(&text),
                        "{text:?}"
                    );
                }
            }
        }
    }

    #[test]
    fn content_as_a_string_in_one_pass_is_what_the_full_path_gives() {
        // Spaces at the ends and in pairs, quotes and backslashes, line
        // ends, controls, variant marks, drawable and undrawable non-ASCII.
        let pool: Vec<char> = "aZ09 .%-\\\"+#*_[]\u{A0}()'~\t\n\r\u{B}\u{7}\u{2009}\u{2028}–−±Ω“”µ\u{200B}\u{AD}\u{FE0F}\u{E0001}\u{1F600}\u{10FFFF}\u{4E2D}"
            .chars()
            .collect();
        let mut next = crate::test_random::xorshift(0x9e37_79b9_7f4a_7c15u64);
        let mut fast = 0;
        for i in 0..20_000 {
            // Some texts long enough for a long run.
            let len = (next() % if i % 5 == 0 { 80 } else { 24 }) as usize;
            // Most texts from the characters the one pass takes.
            let narrow = i % 4 != 0;
            let text: String = (0..len)
                .map(|_| {
                    let k = (next() % pool.len() as u64) as usize;
                    if narrow { pool[k % 16] } else { pool[k] }
                })
                .collect();
            let full = escape_content_full(&text);
            if let Some(one_pass) = content_as_string(&text) {
                fast += 1;
                assert_eq!(one_pass, full, "{text:?}");
            }
            assert_eq!(escape_content(&text), full, "{text:?}");
            // Appended to what is there, a partial one-pass write undone.
            let mut appended = String::from("before ");
            escape_content_into(&text, &mut appended);
            assert_eq!(appended, format!("before {full}"), "{text:?}");
        }
        assert!(fast > 3_000, "one pass taken {fast} times");
    }

    #[test]
    fn a_plain_cell_is_written_as_the_one_pass_writes_it() {
        // Figures, units and words with single and double spaces, spaces
        // at the ends, quotes and backslashes, non-ASCII and controls, at
        // lengths around the long-run limit.
        let pool: Vec<char> =
            "0123456789.%+-kWVmA –−±Ωµ°\\\"#[]()_*'~\t\n\u{A0}\u{2009}“\u{7}\u{4E2D}\u{FE0F}"
                .chars()
                .collect();
        let mut next = crate::test_random::xorshift(0x6a09_e667_f3bc_c908u64);
        let (mut plain, mut other) = (0, 0);
        for i in 0..60_000 {
            let len = match i % 4 {
                0 => LONG_RUN - 2 + (next() % 4) as usize,
                _ => (next() % 12) as usize,
            };
            // Most texts from the figures' characters and the space.
            let narrow = i % 3 != 0;
            let text: String = (0..len)
                .map(|_| {
                    let k = (next() % pool.len() as u64) as usize;
                    if narrow { pool[k % 26] } else { pool[k] }
                })
                .collect();
            let mut out = String::from("before ");
            if plain_cell_into(&text, &mut out) {
                plain += 1;
                let one_pass = content_as_string(&text).expect("the one pass takes it");
                assert_eq!(out, format!("before {one_pass}"), "{text:?}");
            } else {
                other += 1;
                assert_eq!(out, "before ", "{text:?} left output behind");
            }
            assert_eq!(
                escape_content(&text),
                escape_content_full(&text),
                "{text:?}"
            );
        }
        assert!(
            plain > 10_000 && other > 10_000,
            "{plain} plain, {other} other"
        );
        // The figures' characters past ASCII are ones the one pass copies.
        for c in FIGURE_CHARS {
            assert!(!c.is_ascii() && !c.is_whitespace() && !c.is_control() && !is_variant_mark(c));
            assert_eq!(
                figure_char_drawn(c),
                super::super::fonts::can_draw(c),
                "{c:?}"
            );
        }
        for text in [
            "473",
            "0.44 W",
            "+2.9 %",
            "B+1 to B+2",
            "a",
            "x.y",
            "1 kΩ",
            "–",
            "±10 %",
        ] {
            let mut out = String::new();
            assert!(plain_cell_into(text, &mut out), "{text:?}");
            assert_eq!(out, format!("\"{text}\""));
        }
        for text in [
            "",
            " 1",
            "1 ",
            "1  2",
            "say \"x\"",
            "a\\b",
            "6.3\u{A0}V",
            "“x”",
            "1\u{2009}2",
        ] {
            assert!(!plain_cell_into(text, &mut String::new()), "{text:?}");
        }
    }
}
