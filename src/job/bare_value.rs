//! Finds values written without quotes that KDL cannot read as numbers,
//! such as `nominal=120V` or `type=6V6GT`. This is the likeliest slip in a
//! job file, and the KDL parser reports it with a span over the whole
//! document, so the decoder looks for it itself and points at the value.
//!
//! A light scan, run only when the KDL parse has already failed: it skips
//! comments and strings, splits the rest into tokens and reports each token
//! that starts like a number but is not a KDL 2.0 number.

use miette::SourceSpan;

/// Byte spans of the bare values in `text`, in order.
pub fn find(text: &str) -> Vec<SourceSpan> {
    let chars: Vec<(usize, char)> = text.char_indices().collect();
    let at = |i: usize| chars.get(i).map(|&(_, c)| c);
    let offset = |i: usize| chars.get(i).map(|&(o, _)| o).unwrap_or(text.len());
    let mut out = Vec::new();
    let mut i = 0;
    while i < chars.len() {
        let c = chars[i].1;
        match c {
            // Line comment.
            '/' if at(i + 1) == Some('/') => {
                while i < chars.len() && !is_newline(chars[i].1) {
                    i += 1;
                }
            }
            // Block comment, nestable.
            '/' if at(i + 1) == Some('*') => {
                let mut depth = 0usize;
                while i < chars.len() {
                    if chars[i].1 == '/' && at(i + 1) == Some('*') {
                        depth += 1;
                        i += 2;
                    } else if chars[i].1 == '*' && at(i + 1) == Some('/') {
                        depth -= 1;
                        i += 2;
                        if depth == 0 {
                            break;
                        }
                    } else {
                        i += 1;
                    }
                }
            }
            // Multi-line string.
            '"' if at(i + 1) == Some('"') && at(i + 2) == Some('"') => {
                i += 3;
                while i < chars.len() {
                    if chars[i].1 == '\\' {
                        i += 2;
                    } else if chars[i].1 == '"' && at(i + 1) == Some('"') && at(i + 2) == Some('"')
                    {
                        i += 3;
                        break;
                    } else {
                        i += 1;
                    }
                }
            }
            // Single-line string; a newline ends it, so one unclosed quote
            // does not turn the rest of the file inside out.
            '"' => {
                i += 1;
                while i < chars.len() {
                    match chars[i].1 {
                        '\\' => i += 2,
                        '"' => {
                            i += 1;
                            break;
                        }
                        c if is_newline(c) => break,
                        _ => i += 1,
                    }
                }
            }
            // Raw string: #"…"#, ##"…"## …; otherwise a keyword such as #true.
            '#' => {
                let mut hashes = 0;
                while at(i + hashes) == Some('#') {
                    hashes += 1;
                }
                if at(i + hashes) == Some('"') {
                    i += hashes + 1;
                    while i < chars.len() {
                        if chars[i].1 == '"' && (1..=hashes).all(|k| at(i + k) == Some('#')) {
                            i += 1 + hashes;
                            break;
                        }
                        i += 1;
                    }
                } else {
                    i = token_end(&chars, i + hashes);
                }
            }
            c if is_delimiter(c) => i += 1,
            _ => {
                let end = token_end(&chars, i);
                let token = &text[offset(i)..offset(end)];
                if starts_like_a_number(token) && !is_kdl_number(token) {
                    out.push(SourceSpan::new(offset(i).into(), token.len()));
                }
                i = end.max(i + 1);
            }
        }
    }
    out
}

fn is_newline(c: char) -> bool {
    matches!(
        c,
        '\n' | '\r' | '\u{85}' | '\u{b}' | '\u{c}' | '\u{2028}' | '\u{2029}'
    )
}

fn is_delimiter(c: char) -> bool {
    c.is_whitespace()
        || matches!(
            c,
            '=' | '{' | '}' | ';' | '(' | ')' | '"' | '\\' | '/' | '\u{feff}'
        )
}

/// Index of the first char after the token starting at `i`.
fn token_end(chars: &[(usize, char)], mut i: usize) -> usize {
    while i < chars.len() && !is_delimiter(chars[i].1) {
        i += 1;
    }
    i
}

/// KDL 2.0 forbids identifiers that start with a digit, or with a sign or
/// a dot followed by a digit: such a token must be a number.
fn starts_like_a_number(t: &str) -> bool {
    let b = t.as_bytes();
    let digit = |i: usize| b.get(i).is_some_and(u8::is_ascii_digit);
    digit(0)
        || (matches!(b.first(), Some(b'+' | b'-'))
            && (digit(1) || (b.get(1) == Some(&b'.') && digit(2))))
        || (b.first() == Some(&b'.') && digit(1))
}

/// A KDL 2.0 number: decimal with optional fraction and exponent, or
/// 0x / 0o / 0b with underscores between digits.
fn is_kdl_number(t: &str) -> bool {
    let t = t.strip_prefix(['+', '-']).unwrap_or(t);
    let digits = |s: &str, ok: fn(char) -> bool| {
        s.chars().next().is_some_and(ok) && s.chars().all(|c| ok(c) || c == '_')
    };
    if let Some(h) = t.strip_prefix("0x") {
        return digits(h, |c| c.is_ascii_hexdigit());
    }
    if let Some(o) = t.strip_prefix("0o") {
        return digits(o, |c| ('0'..='7').contains(&c));
    }
    if let Some(bin) = t.strip_prefix("0b") {
        return digits(bin, |c| c == '0' || c == '1');
    }
    let dec = |c: char| c.is_ascii_digit();
    let (mantissa, exponent) = match t.find(['e', 'E']) {
        Some(i) => (&t[..i], Some(&t[i + 1..])),
        None => (t, None),
    };
    let mantissa_ok = match mantissa.split_once('.') {
        Some((whole, frac)) => digits(whole, dec) && digits(frac, dec),
        None => digits(mantissa, dec),
    };
    let exponent_ok = exponent.is_none_or(|e| digits(e.strip_prefix(['+', '-']).unwrap_or(e), dec));
    mantissa_ok && exponent_ok
}

#[cfg(test)]
mod tests {
    use super::*;

    fn found(text: &str) -> Vec<&str> {
        find(text)
            .iter()
            .map(|s| &text[s.offset()..s.offset() + s.len()])
            .collect()
    }

    #[test]
    fn finds_units_and_type_names_written_without_quotes() {
        assert_eq!(
            found("mains nominal=120V frequency=60Hz\n"),
            ["120V", "60Hz"]
        );
        assert_eq!(found("valve V3 type=6V6GT role=output\n"), ["6V6GT"]);
        assert_eq!(found("node B+1 352V chart=-5.5e3x\n"), ["352V", "-5.5e3x"]);
    }

    #[test]
    fn leaves_numbers_names_strings_and_comments_alone() {
        // KDL 2.0 numbers (the KDL 2.0 specification): decimal, exponent, hex, octal, binary, underscores.
        assert!(
            found("n 1 -2 +3.5 1e3 1.5E-3 0xFF 0o17 0b1010 1_000 #true #inf V3 B+1\n").is_empty()
        );
        assert!(found("n \"120V\" #\"6V6GT\"# ##\"a\"#b\"## \"\"\"\n4k7\n\"\"\" // 120V\n/* 4k7 /* 2M2 */ 1R */\n").is_empty());
        assert!(found("n \"esc \\\" 120V\"\n").is_empty());
    }

    #[test]
    fn an_unclosed_quote_ends_at_the_line_end() {
        assert!(found("unit model=\"N\nmains nominal=\"120V\"\n").is_empty());
        assert_eq!(found("unit model=\"N\nmains nominal=120V\n"), ["120V"]);
    }

    #[test]
    fn never_panics_on_odd_text() {
        for t in [
            "", "\"", "#", "##\"", "/*", "/* /*", "\"\"\"", "\\", "1", "-", ".5x", "µ1", "1µ",
            "\"\\",
        ] {
            for s in find(t) {
                assert!(s.offset() + s.len() <= t.len());
                assert!(t.is_char_boundary(s.offset()) && t.is_char_boundary(s.offset() + s.len()));
            }
        }
    }
}
