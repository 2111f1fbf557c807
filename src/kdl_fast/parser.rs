//! The structure of a KDL 2.0 document: nodes, entries, child blocks,
//! slashdash comments and the whitespace between them. Follows the grammar
//! exactly as the `kdl` crate reads it (so that spans come out the same),
//! and gives up with [`Reject`] wherever that reading would be an error or
//! where it is not certain what the `kdl` crate does.

use miette::SourceSpan;

use super::chars::{newline_len, space_len};
use super::tree::{Block, Entry, Ident, NodeData, Tree, Value};

/// The fast parser declines this input; the `kdl` crate's parser decides.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub(super) struct Reject;

pub(super) type R<T> = Result<T, Reject>;

/// How deeply child blocks and slashdash comments may nest before the fast
/// parser declines, so that its stack stays small whatever the input.
///
/// A decline here must never turn away a valid text that
/// [`super::too_deep`] lets through, since a large text the fast parser
/// declines is reported as broken. Within that check's limits a level of
/// block nesting costs the parser at most two levels (the block and a
/// slashdashed node holding it), and one run of `/-` within a node at most
/// one level per `/-`, so no such text nests more than
/// `3 * MAX_FALLBACK_DEPTH + 1` levels here; this limit is above that.
pub(super) const MAX_DEPTH: u32 = 4 * super::MAX_FALLBACK_DEPTH as u32;

pub(super) struct Parser<'a> {
    pub(super) src: &'a str,
    pub(super) bytes: &'a [u8],
    pub(super) pos: usize,
    depth: u32,
    /// Every entry read, each node's next to one another (a node's entries
    /// are all read before its children). Entries commented out with `/-`
    /// are taken off again.
    entries: Vec<Entry<'a>>,
    /// Nodes of the blocks being read, innermost last; a block, once read,
    /// moves its own off the top into `done`.
    open: Vec<NodeData<'a>>,
    /// Nodes of the blocks read, each block's next to one another.
    done: Vec<NodeData<'a>>,
}

pub(super) fn span(start: usize, end: usize) -> SourceSpan {
    SourceSpan::new(start.into(), end - start)
}

/// A place in the tree's lists as stored (a text of over four thousand
/// million nodes or entries is declined).
fn index(i: usize) -> R<u32> {
    u32::try_from(i).map_err(|_| Reject)
}

/// A value read from the text, before it becomes an entry.
pub(super) struct ReadValue<'a> {
    pub(super) ty: Option<Ident<'a>>,
    pub(super) value: Value<'a>,
    /// The value as written, without its type annotation.
    pub(super) raw: &'a str,
}

impl<'a> Parser<'a> {
    pub(super) fn new(src: &'a str) -> Self {
        // Room for a node in every 24 bytes of text (a long job's lines
        // take about 36) and an entry in every 12 (a reading such as
        // ` plate="466V"` takes 13), so that a long job's lists are not
        // copied as they grow; room never written to costs no memory.
        Parser {
            src,
            bytes: src.as_bytes(),
            pos: 0,
            depth: 0,
            entries: Vec::with_capacity(src.len() / 12),
            open: Vec::new(),
            done: Vec::with_capacity(src.len() / 24),
        }
    }

    pub(super) fn byte(&self) -> Option<u8> {
        self.bytes.get(self.pos).copied()
    }

    pub(super) fn byte_at(&self, at: usize) -> Option<u8> {
        self.bytes.get(at).copied()
    }

    pub(super) fn starts(&self, s: &[u8]) -> bool {
        self.bytes
            .get(self.pos..)
            .is_some_and(|rest| rest.starts_with(s))
    }

    fn at_close_or_end(&self) -> bool {
        matches!(self.byte(), None | Some(b'}'))
    }

    fn enter(&mut self) -> R<()> {
        self.depth += 1;
        if self.depth > MAX_DEPTH {
            Err(Reject)
        } else {
            Ok(())
        }
    }

    fn leave(&mut self) {
        self.depth -= 1;
    }

    // ----- the document ---------------------------------------------------

    /// `document := bom? nodes eof`
    pub(super) fn document(&mut self) -> R<Tree<'a>> {
        if self.starts("\u{FEFF}".as_bytes()) {
            self.pos += 3;
        }
        let top = self.nodes()?;
        if self.pos == self.bytes.len() {
            Ok(Tree {
                nodes: std::mem::take(&mut self.done),
                entries: std::mem::take(&mut self.entries),
                top,
            })
        } else {
            Err(Reject)
        }
    }

    /// Reads something commented out (a node, a child block) with `read`
    /// and forgets the nodes and entries it added.
    fn discarding<T>(&mut self, read: impl FnOnce(&mut Self) -> R<T>) -> R<T> {
        let (open, done, entries) = (self.open.len(), self.done.len(), self.entries.len());
        let out = read(self);
        self.open.truncate(open);
        self.done.truncate(done);
        self.entries.truncate(entries);
        out
    }

    /// `nodes := (line-space | slashdash node)* (node terminator ...)* ...`
    /// The span runs from the first node to the end of the last one.
    fn nodes(&mut self) -> R<Block> {
        self.leading()?;
        let start = self.pos;
        let mut end = start;
        let mark = self.open.len();
        loop {
            if self.at_close_or_end() {
                break;
            }
            self.base_node()?;
            end = self.pos;
            if !self.node_terminator() {
                // What follows may only be trailing space and slashdashed
                // nodes; the caller checks for `}` or the end.
                self.leading()?;
                break;
            }
            self.leading()?;
        }
        let first = self.done.len();
        self.done.extend(self.open.drain(mark..));
        Ok(Block {
            first: index(first)?,
            len: index(self.done.len() - first)?,
            span: span(start, end),
        })
    }

    /// `(line-space | slashdash base-node)*`: what may come before a node
    /// (and after the last one).
    fn leading(&mut self) -> R<()> {
        loop {
            if self.line_space()? {
                continue;
            }
            if self.starts(b"/-") {
                self.slashdash()?;
                if self.at_close_or_end() {
                    return Err(Reject);
                }
                self.enter()?;
                self.discarding(Self::base_node)?;
                self.leave();
                continue;
            }
            return Ok(());
        }
    }

    /// `node-terminator := ';' | newline | single-line-comment`
    fn node_terminator(&mut self) -> bool {
        match self.byte() {
            Some(b';') => {
                self.pos += 1;
                true
            }
            Some(b'/') if self.byte_at(self.pos + 1) == Some(b'/') => {
                self.line_comment();
                true
            }
            _ => {
                let n = newline_len(self.bytes, self.pos);
                self.pos += n;
                n > 0
            }
        }
    }

    /// A node's type, name, entries and children, and the space after them,
    /// pushed onto `self.open` (it is built there, in place). The caller
    /// has checked that the text is not at `}` or the end.
    fn base_node(&mut self) -> R<()> {
        let start = self.pos;
        let ty = match self.byte() {
            Some(b'{') => return Err(Reject),
            Some(b'(') => Some(self.ty()?),
            _ => None,
        };
        self.node_space0()?;
        let name = self.identifier()?.ok_or(Reject)?;
        let mark = self.entries.len();
        while self.starts_node_space() {
            let save = self.pos;
            if !self.node_entry()? {
                self.pos = save;
                break;
            }
        }
        let entries = (index(mark)?, index(self.entries.len())?);
        self.before_children()?;
        let at = self.open.len();
        self.open.push(NodeData {
            name,
            ty,
            entries,
            children: None,
            span: span(start, start),
        });
        if self.byte() == Some(b'{') {
            let children = self.node_children()?;
            self.open[at].children = Some(children);
            let save = self.pos;
            if !self.slashdashed_children()? {
                self.pos = save;
            }
        }
        self.node_space0()?;
        self.open[at].span = span(start, self.pos);
        Ok(())
    }

    /// `{ nodes }`
    fn node_children(&mut self) -> R<Block> {
        self.enter()?;
        self.pos += 1;
        let doc = self.nodes()?;
        if self.byte() != Some(b'}') {
            return Err(Reject);
        }
        self.pos += 1;
        self.leave();
        Ok(doc)
    }

    /// Slashdashed entries and child blocks after the last entry, before a
    /// child block (or the end of the node).
    fn before_children(&mut self) -> R<()> {
        if self.node_space0()? && self.starts(b"/-") {
            let at = self.pos;
            if self.slashdashed_entries()? {
                let after = self.pos;
                if !(self.node_space0()? && self.slashdashed_children()?) {
                    self.pos = after;
                }
            } else {
                self.pos = at;
                if !self.slashdashed_children()? {
                    self.pos = at;
                }
            }
        }
        self.node_space0()?;
        Ok(())
    }

    /// `(slashdash node-children) (node-space+ slashdash node-children)*`,
    /// after optional space. `false` means no match (the caller resets).
    fn slashdashed_children(&mut self) -> R<bool> {
        self.node_space0()?;
        if !self.starts(b"/-") {
            return Ok(false);
        }
        self.slashdash()?;
        if self.byte() != Some(b'{') {
            return Ok(false);
        }
        self.discarding(Self::node_children)?;
        loop {
            let save = self.pos;
            if !self.node_space0()? || !self.starts(b"/-") {
                self.pos = save;
                return Ok(true);
            }
            self.slashdash()?;
            if self.byte() != Some(b'{') {
                self.pos = save;
                return Ok(true);
            }
            self.discarding(Self::node_children)?;
        }
    }

    /// `(slashdash entry) (node-space+ slashdash entry)*`. `false` means no
    /// match (the caller resets).
    fn slashdashed_entries(&mut self) -> R<bool> {
        self.enter()?;
        let mark = self.entries.len();
        self.slashdash()?;
        let found = self.node_entry()?;
        self.entries.truncate(mark);
        if !found {
            self.leave();
            return Ok(false);
        }
        loop {
            let save = self.pos;
            if !self.node_space0()? || !self.starts(b"/-") {
                self.pos = save;
                break;
            }
            self.slashdash()?;
            let found = self.node_entry()?;
            self.entries.truncate(mark);
            if !found {
                self.pos = save;
                break;
            }
        }
        self.leave();
        Ok(true)
    }

    /// One argument or property, with the space and slashdashed entries
    /// before it, pushed onto `self.entries`. `false` means no entry here
    /// (the caller resets).
    fn node_entry(&mut self) -> R<bool> {
        self.node_space0()?;
        if self.starts(b"/-") {
            let save = self.pos;
            if !(self.slashdashed_entries()? && self.node_space0()?) {
                self.pos = save;
            }
        }
        let start = self.pos;
        let (name, value) = if let Some(text) = self.string_token()? {
            let name_end = self.pos;
            self.node_space0()?;
            if self.byte() == Some(b'=') {
                self.pos += 1;
                self.node_space0()?;
                let value = self.value()?.ok_or(Reject)?;
                let name = Ident {
                    value: text,
                    span: span(start, name_end),
                };
                (Some(name), value)
            } else {
                self.pos = name_end;
                let value = ReadValue {
                    ty: None,
                    value: Value::String(text),
                    raw: &self.src[start..name_end],
                };
                (None, value)
            }
        } else {
            let Some(value) = self.value()? else {
                return Ok(false);
            };
            (None, value)
        };
        self.entries.push(Entry {
            name,
            ty: value.ty,
            value: value.value,
            raw: value.raw,
            span: span(start, self.pos),
        });
        Ok(true)
    }

    /// `type := '(' node-space* string node-space* ')'`
    pub(super) fn ty(&mut self) -> R<Ident<'a>> {
        self.pos += 1;
        self.node_space0()?;
        let ty = self.identifier()?.ok_or(Reject)?;
        if !(self.starts_node_space() || self.byte() == Some(b')')) {
            return Err(Reject);
        }
        self.node_space0()?;
        if self.byte() != Some(b')') {
            return Err(Reject);
        }
        self.pos += 1;
        Ok(ty)
    }

    // ----- space and comments ---------------------------------------------

    /// Whether a node-space starts here (space, block comment or line
    /// continuation; a bad one is rejected when it is read).
    pub(super) fn starts_node_space(&self) -> bool {
        match self.byte() {
            Some(b' ' | b'\t' | b'\\') => true,
            Some(b'/') => self.byte_at(self.pos + 1) == Some(b'*'),
            Some(b) if b >= 0x80 => space_len(self.src, self.pos) > 0,
            _ => false,
        }
    }

    /// `node-space*`: spaces, block comments and line continuations.
    /// Returns whether anything was read.
    pub(super) fn node_space0(&mut self) -> R<bool> {
        let start = self.pos;
        loop {
            match self.byte() {
                Some(b' ' | b'\t') => self.pos += 1,
                Some(b'/') if self.byte_at(self.pos + 1) == Some(b'*') => self.block_comment()?,
                Some(b'\\') => self.escline()?,
                Some(b) if b >= 0x80 => {
                    let n = space_len(self.src, self.pos);
                    if n == 0 {
                        break;
                    }
                    self.pos += n;
                }
                _ => break,
            }
        }
        Ok(self.pos > start)
    }

    /// `(unicode-space | block comment)*`
    fn wss(&mut self) -> R<()> {
        loop {
            match self.byte() {
                Some(b' ' | b'\t') => self.pos += 1,
                Some(b'/') if self.byte_at(self.pos + 1) == Some(b'*') => self.block_comment()?,
                Some(b) if b >= 0x80 => {
                    let n = space_len(self.src, self.pos);
                    if n == 0 {
                        return Ok(());
                    }
                    self.pos += n;
                }
                _ => return Ok(()),
            }
        }
    }

    /// `escline := '\' ws* (single-line-comment | newline | eof) ws*`
    fn escline(&mut self) -> R<()> {
        self.pos += 1;
        self.wss()?;
        if self.starts(b"//") {
            self.line_comment();
        } else {
            let n = newline_len(self.bytes, self.pos);
            if n == 0 && self.pos < self.bytes.len() {
                return Err(Reject);
            }
            self.pos += n;
        }
        self.wss()
    }

    /// `line-space*`: node-space, newlines and line comments. Returns
    /// whether anything was read.
    fn line_space(&mut self) -> R<bool> {
        let start = self.pos;
        loop {
            self.node_space0()?;
            if self.starts(b"//") {
                self.line_comment();
                continue;
            }
            let n = newline_len(self.bytes, self.pos);
            if n == 0 {
                break;
            }
            self.pos += n;
        }
        Ok(self.pos > start)
    }

    /// `slashdash := '/-' line-space*`
    fn slashdash(&mut self) -> R<()> {
        self.pos += 2;
        self.line_space()?;
        Ok(())
    }

    /// `// …` up to and including the newline, or to the end.
    fn line_comment(&mut self) {
        let bytes = self.bytes;
        let mut p = self.pos + 2;
        while p < bytes.len() {
            match bytes[p] {
                b'\n' | b'\r' | 0x0B | 0x0C | 0xC2 | 0xE2 => {
                    let n = newline_len(bytes, p);
                    if n > 0 {
                        self.pos = p + n;
                        return;
                    }
                    p += 1;
                }
                _ => p += 1,
            }
        }
        self.pos = bytes.len();
    }

    /// `/* … */`, nesting.
    fn block_comment(&mut self) -> R<()> {
        let bytes = self.bytes;
        let mut p = self.pos + 2;
        let mut depth = 1u32;
        loop {
            match bytes.get(p) {
                None => return Err(Reject),
                Some(b'*') if bytes.get(p + 1) == Some(&b'/') => {
                    p += 2;
                    depth -= 1;
                    if depth == 0 {
                        self.pos = p;
                        return Ok(());
                    }
                }
                Some(b'/') if bytes.get(p + 1) == Some(&b'*') => {
                    p += 2;
                    depth += 1;
                }
                Some(_) => p += 1,
            }
        }
    }
}
