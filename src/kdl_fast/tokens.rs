//! The tokens of KDL 2.0: bare identifiers, quoted, multi-line and raw
//! strings, numbers and `#` keywords, read to the same values as the `kdl`
//! crate gives. Anything that crate would refuse, or whose reading is in
//! doubt, is a [`Reject`].

use std::borrow::Cow;

use super::chars::{
    IDENT_ASCII, is_disallowed, is_ident_char, is_newline, is_space, newline_len, space_len,
};
use super::parser::{Parser, R, ReadValue, Reject, span};
use super::tree::{Ident, Value};

impl<'a> Parser<'a> {
    fn char_here(&self) -> Option<char> {
        self.src.get(self.pos..).and_then(|s| s.chars().next())
    }

    fn char_at(&self, at: usize) -> Option<char> {
        self.src.get(at..).and_then(|s| s.chars().next())
    }

    // ----- identifiers and strings ------------------------------------------

    /// A string used as a name (node name, property key, type): bare,
    /// quoted or raw. `None` means no string starts here.
    pub(super) fn identifier(&mut self) -> R<Option<Ident<'a>>> {
        let start = self.pos;
        Ok(self.string_token()?.map(|value| Ident {
            value,
            span: span(start, self.pos),
        }))
    }

    /// Any string token, followed by a value terminator. `None` means no
    /// string starts here.
    pub(super) fn string_token(&mut self) -> R<Option<Cow<'a, str>>> {
        let value = match self.byte() {
            Some(b'"') => self.quoted_string()?,
            Some(b'#') => {
                let mut p = self.pos;
                while self.byte_at(p) == Some(b'#') {
                    p += 1;
                }
                if self.byte_at(p) != Some(b'"') {
                    return Ok(None);
                }
                self.raw_string(p - self.pos)?
            }
            _ => match self.bare_identifier()? {
                Some(s) => Cow::Borrowed(s),
                None => return Ok(None),
            },
        };
        self.value_terminator_check()?;
        Ok(Some(value))
    }

    /// `identifier-string := unambiguous-ident | signed-ident | dotted-ident`
    fn bare_identifier(&mut self) -> R<Option<&'a str>> {
        let start = self.pos;
        let Some(first) = self.char_here() else {
            return Ok(None);
        };
        let mut p = start;
        let unambiguous = match first {
            '0'..='9' => return Ok(None),
            '+' | '-' => {
                p += 1;
                match self.byte_at(p) {
                    Some(b'0'..=b'9') => return Ok(None),
                    Some(b'.') => {
                        p += 1;
                        if matches!(self.byte_at(p), Some(b'0'..=b'9')) {
                            return Ok(None);
                        }
                    }
                    _ => {}
                }
                false
            }
            '.' => {
                p += 1;
                if matches!(self.byte_at(p), Some(b'0'..=b'9')) {
                    return Ok(None);
                }
                false
            }
            c if is_ident_char(c) => true,
            _ => return Ok(None),
        };
        p = self.ident_chars(p);
        let s = &self.src[start..p];
        if unambiguous && matches!(s, "true" | "false" | "null" | "inf" | "-inf" | "nan") {
            return Err(Reject);
        }
        self.pos = p;
        Ok(Some(s))
    }

    /// The end of the run of identifier characters from `p`.
    fn ident_chars(&self, mut p: usize) -> usize {
        let bytes = self.bytes;
        while let Some(&b) = bytes.get(p) {
            if b < 0x80 {
                if !IDENT_ASCII[b as usize] {
                    break;
                }
                p += 1;
            } else {
                match self.char_at(p) {
                    Some(c) if is_ident_char(c) => p += c.len_utf8(),
                    _ => break,
                }
            }
        }
        p
    }

    /// `"…"` or `"""` multi-line `"""`.
    fn quoted_string(&mut self) -> R<Cow<'a, str>> {
        if self.starts(b"\"\"\"") {
            self.pos += 3;
            let n = newline_len(self.bytes, self.pos);
            if n == 0 {
                return Err(Reject);
            }
            self.pos += n;
            return self.multi_line_string().map(Cow::Owned);
        }
        self.pos += 1;
        let start = self.pos;
        loop {
            let b = self.byte().ok_or(Reject)?;
            match b {
                b'"' => {
                    let s = &self.src[start..self.pos];
                    self.pos += 1;
                    return Ok(Cow::Borrowed(s));
                }
                b'\\' => return self.quoted_slow(start).map(Cow::Owned),
                0..=0x08 | 0x0A..=0x1F => return Err(Reject),
                0x80.. => {
                    let c = self.char_here().ok_or(Reject)?;
                    if is_newline(c) || is_disallowed(c) {
                        return Err(Reject);
                    }
                    self.pos += c.len_utf8();
                }
                _ => self.pos += 1,
            }
        }
    }

    /// A single-line quoted string with escapes, from its first character.
    fn quoted_slow(&mut self, start: usize) -> R<String> {
        let mut out = String::with_capacity(self.pos - start + 16);
        out.push_str(&self.src[start..self.pos]);
        loop {
            let c = self.char_here().ok_or(Reject)?;
            match c {
                '"' => {
                    self.pos += 1;
                    return Ok(out);
                }
                '\\' => {
                    if let Some(c) = self.escape()? {
                        out.push(c);
                    }
                }
                c if is_newline(c) || is_disallowed(c) => return Err(Reject),
                c => {
                    out.push(c);
                    self.pos += c.len_utf8();
                }
            }
        }
    }

    /// An escape at a backslash. `None` for a whitespace escape (a
    /// backslash before spaces and newlines), which is skipped.
    fn escape(&mut self) -> R<Option<char>> {
        let next = self.pos + 1;
        let c = match self.byte_at(next) {
            Some(b'\\') => '\\',
            Some(b'"') => '"',
            Some(b'b') => '\u{8}',
            Some(b'f') => '\u{C}',
            Some(b'n') => '\n',
            Some(b'r') => '\r',
            Some(b't') => '\t',
            Some(b's') => ' ',
            Some(b'u') => {
                if self.byte_at(next + 1) != Some(b'{') {
                    return Err(Reject);
                }
                let digits = next + 2;
                let mut p = digits;
                while p < digits + 6 && self.byte_at(p).is_some_and(|b| b.is_ascii_hexdigit()) {
                    p += 1;
                }
                if p == digits || self.byte_at(p) != Some(b'}') {
                    return Err(Reject);
                }
                let code = u32::from_str_radix(&self.src[digits..p], 16).map_err(|_| Reject)?;
                let c = char::from_u32(code).ok_or(Reject)?;
                self.pos = p + 1;
                return Ok(Some(c));
            }
            _ => {
                let end = self.blank_run(next);
                if end == next {
                    return Err(Reject);
                }
                self.pos = end;
                return Ok(None);
            }
        };
        self.pos = next + 1;
        Ok(Some(c))
    }

    /// The body of a `"""` string, from the line after the opening quotes,
    /// dedented by the closing line's indentation. A whitespace escape may
    /// join lines; lines are counted after joining, as the `kdl` crate does.
    fn multi_line_string(&mut self) -> R<String> {
        let body = self.pos;
        // First pass: find the closing line, checking every line before it.
        let mut line = body;
        let (indent_end, close) = loop {
            // The closing line: spaces, whitespace escapes, then `"""`. The
            // indentation is the spaces before any escape.
            let p = self.spaces_from(line);
            let mut q = p;
            while self.byte_at(q) == Some(b'\\') {
                let after = self.blank_run(q + 1);
                if after == q + 1 {
                    break;
                }
                q = after;
            }
            if self
                .bytes
                .get(q..)
                .is_some_and(|r| r.starts_with(b"\"\"\""))
            {
                break (p, q + 3);
            }
            self.pos = line;
            self.quoted_line(None)?;
            line = self.pos;
        };
        let indent = &self.src[line..indent_end];
        // Second pass: dedent and unescape each line.
        let mut out = String::with_capacity(line - body);
        let mut at = body;
        while at < line {
            let after_indent = at + indent.len();
            let indented = self.bytes.get(at..after_indent) == Some(indent.as_bytes());
            if indented && !self.blank_line(after_indent) {
                self.pos = after_indent;
                self.quoted_line(Some(&mut out))?;
                at = self.pos;
            } else if self.blank_line(at) {
                let end = self.spaces_from(at);
                at = end + newline_len(self.bytes, end);
            } else {
                return Err(Reject);
            }
            out.push('\n');
        }
        if at != line {
            return Err(Reject);
        }
        out.pop();
        self.pos = close;
        Ok(out)
    }

    /// The end of the run of unicode spaces from `p`.
    fn spaces_from(&self, mut p: usize) -> usize {
        loop {
            let n = space_len(self.src, p);
            if n == 0 {
                return p;
            }
            p += n;
        }
    }

    /// The end of the run of unicode spaces and newlines from `p`.
    fn blank_run(&self, mut p: usize) -> usize {
        loop {
            let n = space_len(self.src, p) + newline_len(self.bytes, p);
            if n == 0 {
                return p;
            }
            p += n;
        }
    }

    /// Whether only unicode spaces stand between `p` and a newline.
    fn blank_line(&self, p: usize) -> bool {
        newline_len(self.bytes, self.spaces_from(p)) > 0
    }

    /// One line of a multi-line quoted string, through its newline (a
    /// whitespace escape may carry it over more than one line of text).
    /// Its characters go to `out` when given.
    fn quoted_line(&mut self, mut out: Option<&mut String>) -> R<()> {
        loop {
            if self.pos >= self.bytes.len() {
                return Err(Reject);
            }
            let n = newline_len(self.bytes, self.pos);
            if n > 0 {
                self.pos += n;
                return Ok(());
            }
            let c = match self.byte() {
                Some(b'\\') => match self.escape()? {
                    Some(c) => c,
                    None => continue,
                },
                Some(b'"') => {
                    if self.bytes.get(self.pos + 1..self.pos + 3) == Some(b"\"\"") {
                        return Err(Reject);
                    }
                    self.pos += 1;
                    '"'
                }
                _ => {
                    let c = self.char_here().ok_or(Reject)?;
                    if is_disallowed(c) {
                        return Err(Reject);
                    }
                    self.pos += c.len_utf8();
                    c
                }
            };
            if let Some(out) = out.as_deref_mut() {
                out.push(c);
            }
        }
    }

    /// The text of the line starting at `at` (without its newline) and the
    /// start of the next line. Only called on lines known to end in a
    /// newline.
    fn line_at(&self, at: usize) -> (&'a str, usize) {
        let mut p = at;
        loop {
            let n = newline_len(self.bytes, p);
            if n > 0 || p >= self.bytes.len() {
                return (&self.src[at..p], p + n);
            }
            p += 1;
        }
    }

    /// `#…#"…"#…#` or its multi-line form; `hashes` is the number of `#`.
    fn raw_string(&mut self, hashes: usize) -> R<Cow<'a, str>> {
        self.pos += hashes;
        let value = if self.starts(b"\"\"\"") && newline_len(self.bytes, self.pos + 3) > 0 {
            self.pos += 3;
            self.pos += newline_len(self.bytes, self.pos);
            Cow::Owned(self.raw_multi_line(hashes)?)
        } else {
            self.pos += 1;
            let start = self.pos;
            loop {
                match self.byte() {
                    None => return Err(Reject),
                    Some(b'"') if self.closes_raw(self.pos + 1, hashes) => break,
                    _ => {
                        let c = self.char_here().ok_or(Reject)?;
                        if is_newline(c) || is_disallowed(c) {
                            return Err(Reject);
                        }
                        self.pos += c.len_utf8();
                    }
                }
            }
            let s = &self.src[start..self.pos];
            self.pos += 1 + hashes;
            Cow::Borrowed(s)
        };
        if value == "\"" {
            return Err(Reject);
        }
        Ok(value)
    }

    /// Whether `hashes` `#` follow at `at`.
    fn closes_raw(&self, at: usize, hashes: usize) -> bool {
        self.bytes
            .get(at..at + hashes)
            .is_some_and(|h| h.iter().all(|&b| b == b'#'))
    }

    /// Whether `"""` and `hashes` `#` follow at `at`.
    fn closes_raw_multi(&self, at: usize, hashes: usize) -> bool {
        self.bytes.get(at..at + 3) == Some(b"\"\"\"") && self.closes_raw(at + 3, hashes)
    }

    /// The body of a multi-line raw string, dedented.
    fn raw_multi_line(&mut self, hashes: usize) -> R<String> {
        let body = self.pos;
        let mut line = body;
        let (indent_end, close) = loop {
            let mut p = line;
            loop {
                let n = space_len(self.src, p);
                if n == 0 {
                    break;
                }
                p += n;
            }
            if self.closes_raw_multi(p, hashes) {
                break (p, p + 3 + hashes);
            }
            let mut q = line;
            loop {
                if q >= self.bytes.len() {
                    return Err(Reject);
                }
                let n = newline_len(self.bytes, q);
                if n > 0 {
                    q += n;
                    break;
                }
                if self.closes_raw_multi(q, hashes) {
                    return Err(Reject);
                }
                let c = self.char_at(q).ok_or(Reject)?;
                if is_disallowed(c) {
                    return Err(Reject);
                }
                q += c.len_utf8();
            }
            line = q;
        };
        let indent = &self.src[line..indent_end];
        let mut out = String::with_capacity(line - body);
        let mut at = body;
        while at < line {
            let (text, next) = self.line_at(at);
            match text.strip_prefix(indent) {
                Some(rest) if !is_blank(rest) => out.push_str(rest),
                _ if is_blank(text) => {}
                _ => return Err(Reject),
            }
            out.push('\n');
            at = next;
        }
        out.pop();
        self.pos = close;
        Ok(out)
    }

    /// `value-terminator`, looked at but not read. Block comments and line
    /// continuations count; a bad one is rejected when it is read.
    pub(super) fn value_terminator_check(&self) -> R<()> {
        let ok = match self.byte() {
            None => true,
            Some(
                b'=' | b')' | b'{' | b'}' | b';' | b' ' | b'\t' | b'\n' | b'\r' | 0x0B | 0x0C
                | b'\\',
            ) => true,
            Some(b'/') => matches!(self.byte_at(self.pos + 1), Some(b'*' | b'/')),
            Some(b) if b >= 0x80 => self
                .char_here()
                .is_some_and(|c| is_space(c) || is_newline(c)),
            _ => false,
        };
        if ok { Ok(()) } else { Err(Reject) }
    }

    // ----- values -----------------------------------------------------------

    /// `value := type? node-space* (keyword | number | string)`. `None`
    /// means no value starts here.
    pub(super) fn value(&mut self) -> R<Option<ReadValue<'a>>> {
        let ty = if self.byte() == Some(b'(') {
            let ty = self.ty()?;
            self.node_space0()?;
            Some(ty)
        } else {
            None
        };
        let start = self.pos;
        let value = match self.byte() {
            Some(b'#') if !matches!(self.byte_at(self.pos + 1), Some(b'#' | b'"')) => {
                self.keyword()?
            }
            Some(b'0'..=b'9') => self.number()?,
            Some(b'+' | b'-') if matches!(self.byte_at(self.pos + 1), Some(b'0'..=b'9')) => {
                self.number()?
            }
            _ => match self.string_token()? {
                Some(s) => Value::String(s),
                None if ty.is_some() => return Err(Reject),
                None => return Ok(None),
            },
        };
        Ok(Some(ReadValue {
            ty,
            value,
            raw: &self.src[start..self.pos],
        }))
    }

    /// `#true`, `#false`, `#null`, `#inf`, `#-inf`, `#nan`. As in the
    /// `kdl` crate, no terminator is required after a keyword.
    fn keyword(&mut self) -> R<Value<'a>> {
        let words: [(&[u8], Value<'a>); 6] = [
            (b"#true", Value::Bool(true)),
            (b"#false", Value::Bool(false)),
            (b"#null", Value::Null),
            (b"#nan", Value::Float(f64::NAN)),
            (b"#inf", Value::Float(f64::INFINITY)),
            (b"#-inf", Value::Float(f64::NEG_INFINITY)),
        ];
        for (word, value) in words {
            if self.starts(word) {
                self.pos += word.len();
                return Ok(value);
            }
        }
        Err(Reject)
    }

    /// A number: decimal integer or float, or `0x` / `0o` / `0b` integer,
    /// each with an optional sign and `_` separators.
    fn number(&mut self) -> R<Value<'a>> {
        let start = self.pos;
        let negative = self.byte() == Some(b'-');
        if matches!(self.byte(), Some(b'+' | b'-')) {
            self.pos += 1;
        }
        let radix = match (self.byte(), self.byte_at(self.pos + 1)) {
            (Some(b'0'), Some(b'x' | b'X')) => 16,
            (Some(b'0'), Some(b'o' | b'O')) => 8,
            (Some(b'0'), Some(b'b' | b'B')) => 2,
            _ => 10,
        };
        if radix != 10 {
            self.pos += 2;
            let magnitude = self.digits(radix)?;
            self.value_terminator_check()?;
            return Ok(Value::Integer(if negative {
                -magnitude
            } else {
                magnitude
            }));
        }
        let whole = self.digits(10)?;
        let mut float = false;
        if self.byte() == Some(b'.') {
            self.pos += 1;
            self.digits(10)?;
            float = true;
        }
        if matches!(self.byte(), Some(b'e' | b'E')) {
            self.pos += 1;
            if matches!(self.byte(), Some(b'+' | b'-')) {
                self.pos += 1;
            }
            self.digits(10)?;
            float = true;
        }
        self.value_terminator_check()?;
        if !float {
            return Ok(Value::Integer(if negative { -whole } else { whole }));
        }
        let text = &self.src[start..self.pos];
        let parsed = if text.contains('_') {
            text.replace('_', "").parse::<f64>()
        } else {
            text.parse::<f64>()
        };
        parsed.map(Value::Float).map_err(|_| Reject)
    }

    /// `digit (digit | '_')*` in `radix`, as an `i128` magnitude.
    fn digits(&mut self, radix: u32) -> R<i128> {
        let first = self
            .byte()
            .and_then(|b| (b as char).to_digit(radix))
            .ok_or(Reject)?;
        let mut value = i128::from(first);
        self.pos += 1;
        while let Some(b) = self.byte() {
            if b == b'_' {
                self.pos += 1;
                continue;
            }
            let Some(d) = (b as char).to_digit(radix) else {
                break;
            };
            value = value
                .checked_mul(i128::from(radix))
                .and_then(|v| v.checked_add(i128::from(d)))
                .ok_or(Reject)?;
            self.pos += 1;
        }
        Ok(value)
    }
}

/// Whether `s` holds only unicode spaces.
fn is_blank(s: &str) -> bool {
    s.chars().all(is_space)
}
