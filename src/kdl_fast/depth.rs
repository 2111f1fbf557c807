//! How deeply a text nests, measured before it is handed to the `kdl`
//! crate's parser, which recurses once per level (of blocks, of `/* */`
//! comments, of `/-` comments in a row) and would overflow the stack on
//! very deep input. One pass over the bytes, with no recursion.
//!
//! The count must never be lower than the nesting that parser can meet,
//! whatever it makes of a broken text, so every doubt counts upwards:
//! a `{` counts wherever it stands, even inside a string; a `}` closes a
//! block only outside strings and comments (inside a string, only one that
//! closes a `{` of the same string). Comments are skipped as the `kdl`
//! crate reads them, unless one is left open at the end of the text; then
//! the text is measured again with comments read as text.

use super::chars::{is_newline, is_space, newline_len, space_len};
use super::{MAX_FALLBACK_DEPTH, Nesting};

/// Where nesting first goes past [`MAX_FALLBACK_DEPTH`].
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub struct TooDeep {
    /// Byte offset of the `{`, `/*` or `/-` past the limit.
    pub offset: usize,
    pub kind: Nesting,
}

/// The first place where blocks, `/*` comments or a run of `/-` comments
/// nest more than [`MAX_FALLBACK_DEPTH`] deep.
///
/// A run of `/-` is every `/-` with only what may stand between a `/-` and
/// what it comments out: spaces and newlines, `/* */` and `//` comments and
/// `\` line continuations (`/- \` on each line, or `/-// note` on each
/// line, nests as deeply as `/- /- /-`).
pub fn too_deep(text: &str) -> Option<TooDeep> {
    measure(text).too_deep
}

/// What the scan found: where nesting first went too deep, and how deeply
/// `/-` children blocks nest (see [`Depths::dashed_blocks`]).
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub struct Depths {
    pub too_deep: Option<TooDeep>,
    /// The deepest nesting of children blocks commented out by `/-`
    /// (`a /- {` inside `b /- {` …), up to the first place nesting went
    /// too deep. The `kdl` crate's error recovery takes about twice as long
    /// for each such level on a broken text (ten levels: seconds; the
    /// forty-eight blocks allowed: years), counted upwards like the rest.
    pub dashed_blocks: usize,
    /// The deepest nesting of blocks of any kind, counted upwards (every
    /// `{`, even in a string), up to the first place nesting went too deep.
    pub blocks: usize,
}

/// Measures `text`: the depths that decide whether the `kdl` crate's
/// parser may be given it.
pub fn measure(text: &str) -> Depths {
    let mut scan = Scan::new(text, true);
    match scan.run() {
        Ok(too_deep) => Depths {
            too_deep,
            dashed_blocks: scan.max_dashed,
            blocks: scan.max_blocks,
        },
        // A comment left open: the `kdl` crate's error recovery may read
        // on inside it, so measure its text too.
        Err(OpenComment) => {
            let mut again = Scan::new(text, false);
            let too_deep = again.run().unwrap_or(None);
            Depths {
                too_deep,
                dashed_blocks: again.max_dashed.max(scan.max_dashed),
                blocks: again.max_blocks.max(scan.max_blocks),
            }
        }
    }
}

/// The text ended inside a `/*` comment.
struct OpenComment;

/// What the scan is inside.
#[derive(Clone, Copy, PartialEq, Eq)]
enum Inside {
    Nodes,
    /// `"…"`, or `"""…"""` when `multi`.
    Quoted {
        multi: bool,
    },
    /// `#"…"#` with this many `#`, or `#"""…"""#` when `multi`.
    Raw {
        hashes: usize,
        multi: bool,
    },
    LineComment,
}

struct Scan<'a> {
    text: &'a str,
    bytes: &'a [u8],
    /// Skip the text of comments (false: read it as text, counting only).
    skip_comments: bool,
    blocks: usize,
    comments: usize,
    slashdashes: usize,
    inside: Inside,
    /// `{` opened inside the current string, which its `}` may close.
    string_blocks: usize,
    /// Bit `n` set: the open block at depth `n + 1` follows a `/-`. Depth
    /// never passes [`MAX_FALLBACK_DEPTH`] (48) before the scan stops.
    dashed: u64,
    /// The deepest count of open blocks that follow a `/-`.
    max_dashed: usize,
    /// The deepest count of open blocks.
    max_blocks: usize,
}

impl<'a> Scan<'a> {
    fn new(text: &'a str, skip_comments: bool) -> Self {
        Scan {
            text,
            bytes: text.as_bytes(),
            skip_comments,
            blocks: 0,
            comments: 0,
            slashdashes: 0,
            inside: Inside::Nodes,
            string_blocks: 0,
            dashed: 0,
            max_dashed: 0,
            max_blocks: 0,
        }
    }

    fn at(&self, i: usize) -> Option<u8> {
        self.bytes.get(i).copied()
    }

    fn starts(&self, i: usize, s: &[u8]) -> bool {
        self.bytes.get(i..).is_some_and(|r| r.starts_with(s))
    }

    fn hashes(&self, i: usize, n: usize) -> bool {
        self.bytes
            .get(i..i + n)
            .is_some_and(|h| h.iter().all(|&b| b == b'#'))
    }

    fn open_block(&mut self, i: usize) -> Option<TooDeep> {
        self.blocks += 1;
        if self.blocks > MAX_FALLBACK_DEPTH {
            return Some(TooDeep {
                offset: i,
                kind: Nesting::Blocks,
            });
        }
        self.max_blocks = self.max_blocks.max(self.blocks);
        // A block opened anew at this depth: forget what an earlier one
        // at the same depth was.
        self.dashed &= !(1u64 << (self.blocks - 1));
        None
    }

    /// Closes the innermost block (none open: nothing to close).
    fn close_block(&mut self) {
        if self.blocks > 0 {
            self.dashed &= !(1u64 << (self.blocks - 1));
            self.blocks -= 1;
        }
    }

    /// The block just opened follows a `/-`.
    fn mark_dashed(&mut self) {
        if self.blocks > 0 {
            self.dashed |= 1u64 << (self.blocks - 1);
            self.max_dashed = self.max_dashed.max(self.dashed.count_ones() as usize);
        }
    }

    /// The scan; `Err` when comments are skipped and one is left open.
    fn run(&mut self) -> Result<Option<TooDeep>, OpenComment> {
        let mut i = 0;
        while i < self.bytes.len() {
            let b = self.bytes[i];
            // Inside a comment (only when comments are skipped): nothing
            // counts but the comment's own nesting.
            if self.comments > 0 && self.skip_comments {
                if self.starts(i, b"*/") {
                    self.comments -= 1;
                    i += 2;
                } else if self.starts(i, b"/*") {
                    if let Some(d) = self.open_comment(i) {
                        return Ok(Some(d));
                    }
                    i += 2;
                } else {
                    i += 1;
                }
                continue;
            }
            let step = match self.inside {
                Inside::Nodes => match self.nodes(i) {
                    Ok(step) => step,
                    Err(d) => return Ok(Some(d)),
                },
                Inside::LineComment => {
                    if is_newline_at(self.text, i) {
                        self.inside = Inside::Nodes;
                    } else if b == b'{' && !self.skip_comments {
                        if let Some(d) = self.open_block(i) {
                            return Ok(Some(d));
                        }
                    }
                    1
                }
                Inside::Quoted { multi } => {
                    if b == b'\\' {
                        self.escape_len(i)
                    } else if multi && self.starts(i, b"\"\"\"") {
                        self.end_string();
                        3
                    } else if !multi && (b == b'"' || is_newline_at(self.text, i)) {
                        // A newline ends a broken single-line string.
                        self.end_string();
                        1
                    } else {
                        match self.in_string(i) {
                            Some(d) => return Ok(Some(d)),
                            None => 1,
                        }
                    }
                }
                Inside::Raw { hashes, multi } => {
                    if multi && self.starts(i, b"\"\"\"") && self.hashes(i + 3, hashes) {
                        self.end_string();
                        3 + hashes
                    } else if !multi && b == b'"' && self.hashes(i + 1, hashes) {
                        self.end_string();
                        1 + hashes
                    } else if !multi && is_newline_at(self.text, i) {
                        self.end_string();
                        1
                    } else {
                        match self.in_string(i) {
                            Some(d) => return Ok(Some(d)),
                            None => 1,
                        }
                    }
                }
            };
            i += step;
            // Step over the rest of a character of several bytes.
            while i < self.bytes.len() && !self.text.is_char_boundary(i) {
                i += 1;
            }
        }
        if self.comments > 0 && self.skip_comments {
            Err(OpenComment)
        } else {
            Ok(None)
        }
    }

    /// The length of an escape in a quoted string: the backslash and the
    /// character after it, or, for a whitespace escape, all the spaces and
    /// newlines after it (which may not end the string).
    fn escape_len(&self, i: usize) -> usize {
        let mut p = i + 1;
        loop {
            let n = space_len(self.text, p) + newline_len(self.bytes, p);
            if n == 0 {
                break;
            }
            p += n;
        }
        if p == i + 1 {
            // `\"`, `\\` and the like: step over the escaped character.
            p += 1;
        }
        p - i
    }

    fn open_comment(&mut self, i: usize) -> Option<TooDeep> {
        self.comments += 1;
        (self.comments > MAX_FALLBACK_DEPTH).then_some(TooDeep {
            offset: i,
            kind: Nesting::Comments,
        })
    }

    fn end_string(&mut self) {
        self.inside = Inside::Nodes;
        self.string_blocks = 0;
    }

    /// A character of a string: a `{` counts, a `}` closes only a `{` of
    /// the same string.
    fn in_string(&mut self, i: usize) -> Option<TooDeep> {
        match self.bytes[i] {
            b'{' => {
                self.string_blocks += 1;
                self.open_block(i)
            }
            b'}' if self.string_blocks > 0 => {
                self.string_blocks -= 1;
                self.close_block();
                None
            }
            _ => None,
        }
    }

    /// One step outside strings and skipped comments: the number of bytes
    /// read, or where nesting went too deep.
    fn nodes(&mut self, i: usize) -> Result<usize, TooDeep> {
        let b = self.bytes[i];
        let next = self.at(i + 1);
        // Inside a comment read as text, a `}` may not close a block.
        let in_comment = self.comments > 0;
        let step = match (b, next) {
            (b'/', Some(b'*')) => {
                if let Some(d) = self.open_comment(i) {
                    return Err(d);
                }
                2
            }
            (b'*', Some(b'/')) if in_comment => {
                self.comments -= 1;
                2
            }
            (b'/', Some(b'/')) => {
                self.inside = Inside::LineComment;
                2
            }
            (b'/', Some(b'-')) => {
                self.slashdashes += 1;
                if self.slashdashes > MAX_FALLBACK_DEPTH {
                    return Err(TooDeep {
                        offset: i,
                        kind: Nesting::Slashdash,
                    });
                }
                2
            }
            (b'{', _) => {
                if let Some(d) = self.open_block(i) {
                    return Err(d);
                }
                if self.slashdashes > 0 {
                    self.mark_dashed();
                }
                if !in_comment {
                    self.slashdashes = 0;
                }
                1
            }
            (b'}', _) => {
                if !in_comment {
                    self.close_block();
                    self.slashdashes = 0;
                }
                1
            }
            (b'\\', _) => 1,
            (b'"', _) => {
                let multi = self.starts(i, b"\"\"\"");
                self.start_string(in_comment, Inside::Quoted { multi });
                if multi { 3 } else { 1 }
            }
            (b'#', _) => {
                let mut p = i;
                while self.at(p) == Some(b'#') {
                    p += 1;
                }
                if self.at(p) == Some(b'"') {
                    let multi = self.starts(p, b"\"\"\"");
                    let hashes = p - i;
                    self.start_string(in_comment, Inside::Raw { hashes, multi });
                    p - i + if multi { 3 } else { 1 }
                } else {
                    self.end_run(in_comment);
                    p - i
                }
            }
            _ if b.is_ascii_whitespace() => 1,
            _ if b < 0x80 => {
                self.end_run(in_comment);
                1
            }
            _ => {
                let c = self.text[i..].chars().next().unwrap_or(' ');
                if !(is_space(c) || is_newline(c)) {
                    self.end_run(in_comment);
                }
                c.len_utf8()
            }
        };
        Ok(step)
    }

    fn start_string(&mut self, in_comment: bool, kind: Inside) {
        self.end_run(in_comment);
        self.inside = kind;
        self.string_blocks = 0;
    }

    /// Something other than space or a comment: a run of `/-` ends.
    fn end_run(&mut self, in_comment: bool) {
        if !in_comment {
            self.slashdashes = 0;
        }
    }
}

fn is_newline_at(text: &str, i: usize) -> bool {
    newline_len(text.as_bytes(), i) > 0
}
