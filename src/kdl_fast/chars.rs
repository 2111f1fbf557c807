//! Character classes of KDL 2.0 as the `kdl` crate reads them: spaces,
//! newlines, code points that may not appear literally, and the characters
//! a bare identifier may hold. Kept in one place so the parser and the
//! string readers agree on every class.

/// Unicode spaces: tab, space and the other horizontal spaces KDL lists.
pub(super) fn is_space(c: char) -> bool {
    matches!(
        c,
        '\t' | ' ' | '\u{A0}' | '\u{1680}' | '\u{2000}'
            ..='\u{200A}' | '\u{202F}' | '\u{205F}' | '\u{3000}'
    )
}

/// Characters that start a newline (CR LF counts as one newline, which the
/// length functions handle).
pub(super) fn is_newline(c: char) -> bool {
    matches!(
        c,
        '\r' | '\n' | '\u{85}' | '\u{0B}' | '\u{0C}' | '\u{2028}' | '\u{2029}'
    )
}

/// Code points that may not appear literally outside comments.
pub(super) fn is_disallowed(c: char) -> bool {
    matches!(
        c,
        '\u{0}'..='\u{8}'
            | '\u{E}'..='\u{1F}'
            | '\u{200E}'..='\u{200F}'
            | '\u{202A}'..='\u{202E}'
            | '\u{2066}'..='\u{2069}'
            | '\u{FEFF}'
    )
}

/// Whether `c` may appear in a bare identifier.
pub(super) fn is_ident_char(c: char) -> bool {
    if c.is_ascii() {
        return IDENT_ASCII[c as usize];
    }
    !(is_space(c) || is_newline(c) || is_disallowed(c))
}

/// Bare-identifier ASCII characters, by byte value.
pub(super) static IDENT_ASCII: [bool; 128] = {
    let mut t = [false; 128];
    let mut i = 0x21;
    while i < 0x7F {
        t[i] = true;
        i += 1;
    }
    // DEL is accepted in identifiers, as the `kdl` crate does.
    t[0x7F] = true;
    let banned = b"\\/(){}[];\"#=";
    let mut j = 0;
    while j < banned.len() {
        t[banned[j] as usize] = false;
        j += 1;
    }
    t
};

/// The length in bytes of the newline starting at `at`, or 0.
pub(super) fn newline_len(bytes: &[u8], at: usize) -> usize {
    match bytes.get(at) {
        Some(b'\r') => {
            if bytes.get(at + 1) == Some(&b'\n') {
                2
            } else {
                1
            }
        }
        Some(b'\n' | 0x0B | 0x0C) => 1,
        Some(0xC2) if bytes.get(at + 1) == Some(&0x85) => 2,
        Some(0xE2)
            if bytes.get(at + 1) == Some(&0x80)
                && matches!(bytes.get(at + 2), Some(0xA8 | 0xA9)) =>
        {
            3
        }
        _ => 0,
    }
}

/// The length in bytes of the unicode space starting at `at`, or 0.
pub(super) fn space_len(text: &str, at: usize) -> usize {
    let bytes = text.as_bytes();
    match bytes.get(at) {
        Some(b' ' | b'\t') => 1,
        Some(&b) if b >= 0x80 => match text.get(at..).and_then(|s| s.chars().next()) {
            Some(c) if is_space(c) => c.len_utf8(),
            _ => 0,
        },
        _ => 0,
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn ascii_table_matches_the_general_rule() {
        for b in 0u8..0x80 {
            let c = b as char;
            let general =
                !(is_space(c) || is_newline(c) || is_disallowed(c) || "\\/(){}[];\"#=".contains(c));
            // Control characters 0x09..=0x0D are spaces or newlines; the rest
            // of the C0 range is disallowed.
            assert_eq!(IDENT_ASCII[b as usize], general, "byte {b:#x}");
        }
    }

    #[test]
    fn newline_lengths() {
        assert_eq!(newline_len(b"\r\nx", 0), 2);
        assert_eq!(newline_len(b"\rx", 0), 1);
        assert_eq!(newline_len("\u{85}".as_bytes(), 0), 2);
        assert_eq!(newline_len("\u{2028}".as_bytes(), 0), 3);
        assert_eq!(newline_len("\u{2029}".as_bytes(), 0), 3);
        assert_eq!(newline_len("\u{2027}".as_bytes(), 0), 0);
        assert_eq!(newline_len(b"x", 0), 0);
    }

    #[test]
    fn space_lengths() {
        assert_eq!(space_len("\u{3000}a", 0), 3);
        assert_eq!(space_len("\u{A0}", 0), 2);
        assert_eq!(space_len("é", 0), 0);
        assert_eq!(space_len("\t", 0), 1);
    }
}
