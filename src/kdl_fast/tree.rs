//! The fast parser's own reading of a document: every node of the text in
//! one flat list and every entry in another, names and text lent from the
//! source where no escape had to be decoded. A job file's decode reads this
//! instead of a `kdl::KdlDocument`, which would allocate each node, name,
//! entry and value on its own. Names, types, values and spans are the ones
//! the `kdl` crate gives (the tests hold [`Tree::to_document`] and the
//! tree itself to that crate's reading).

use std::borrow::Cow;

use kdl::{KdlDocument, KdlEntry, KdlEntryFormat, KdlIdentifier, KdlNode, KdlValue};
use miette::SourceSpan;

/// A parsed document: its nodes and entries, each child block's nodes next
/// to one another in [`Tree::nodes`], each node's entries next to one
/// another in [`Tree::entries`].
#[derive(Debug, Clone)]
pub struct Tree<'a> {
    pub(super) nodes: Vec<NodeData<'a>>,
    pub(super) entries: Vec<Entry<'a>>,
    pub(super) top: Block,
}

/// A run of nodes in [`Tree::nodes`] (a document or a child block) and the
/// span of the text they take, as the `kdl` crate gives a document's span.
#[derive(Debug, Clone, Copy)]
pub(super) struct Block {
    pub(super) first: u32,
    pub(super) len: u32,
    pub(super) span: SourceSpan,
}

/// One node as stored in the tree.
#[derive(Debug, Clone)]
pub(super) struct NodeData<'a> {
    pub(super) name: Ident<'a>,
    pub(super) ty: Option<Ident<'a>>,
    /// Its entries, `first..end` in [`Tree::entries`].
    pub(super) entries: (u32, u32),
    pub(super) children: Option<Block>,
    pub(super) span: SourceSpan,
}

/// A name: a node's name, a property's key or a type annotation.
#[derive(Debug, Clone, PartialEq)]
pub struct Ident<'a> {
    pub(super) value: Cow<'a, str>,
    pub(super) span: SourceSpan,
}

impl Ident<'_> {
    /// The name as read (escapes decoded).
    pub fn value(&self) -> &str {
        &self.value
    }

    pub fn span(&self) -> SourceSpan {
        self.span
    }
}

/// A value as the `kdl` crate reads it (`KdlValue`), its text lent from the
/// source where that is possible.
#[derive(Debug, Clone, PartialEq)]
pub enum Value<'a> {
    String(Cow<'a, str>),
    Integer(i128),
    Float(f64),
    Bool(bool),
    Null,
}

/// As the `kdl` crate writes the value (`KdlValue`'s own display).
impl std::fmt::Display for Value<'_> {
    fn fmt(&self, f: &mut std::fmt::Formatter<'_>) -> std::fmt::Result {
        std::fmt::Display::fmt(&self.to_kdl(), f)
    }
}

impl Value<'_> {
    fn to_kdl(&self) -> KdlValue {
        match self {
            Value::String(s) => KdlValue::String(s.to_string()),
            Value::Integer(i) => KdlValue::Integer(*i),
            Value::Float(f) => KdlValue::Float(*f),
            Value::Bool(b) => KdlValue::Bool(*b),
            Value::Null => KdlValue::Null,
        }
    }

    fn from_kdl(v: &KdlValue) -> Value<'static> {
        match v {
            KdlValue::String(s) => Value::String(Cow::Owned(s.clone())),
            KdlValue::Integer(i) => Value::Integer(*i),
            KdlValue::Float(f) => Value::Float(*f),
            KdlValue::Bool(b) => Value::Bool(*b),
            KdlValue::Null => Value::Null,
        }
    }
}

/// An argument or a property.
#[derive(Debug, Clone)]
pub struct Entry<'a> {
    pub(super) name: Option<Ident<'a>>,
    pub(super) ty: Option<Ident<'a>>,
    pub(super) value: Value<'a>,
    /// The value as written, without its type annotation (what the `kdl`
    /// crate keeps as the entry's `value_repr`).
    pub(super) raw: &'a str,
    pub(super) span: SourceSpan,
}

impl<'a> Entry<'a> {
    /// The property's key; `None` for an argument.
    pub fn name(&self) -> Option<&Ident<'a>> {
        self.name.as_ref()
    }

    pub fn ty(&self) -> Option<&Ident<'a>> {
        self.ty.as_ref()
    }

    pub fn value(&self) -> &Value<'a> {
        &self.value
    }

    /// From the key (or the value's type annotation) to the end of the
    /// value, as the `kdl` crate gives an entry's span.
    pub fn span(&self) -> SourceSpan {
        self.span
    }
}

/// A document or child block of a [`Tree`]: a run of its nodes.
#[derive(Debug, Clone, Copy)]
pub struct Doc<'t> {
    tree: &'t Tree<'t>,
    block: Block,
}

/// A node of a [`Tree`], lent out with the tree it is in.
#[derive(Debug, Clone, Copy)]
pub struct Node<'t> {
    tree: &'t Tree<'t>,
    data: &'t NodeData<'t>,
}

impl<'a> Tree<'a> {
    /// The document itself (its top-level nodes).
    pub fn doc(&self) -> Doc<'_> {
        Doc {
            tree: self,
            block: self.top,
        }
    }

    /// The same document as the `kdl` crate's types. With `reprs` each
    /// entry keeps its value as written, as `KdlDocument::parse` does;
    /// without, entries carry no format.
    pub fn to_document(&self, reprs: bool) -> KdlDocument {
        let mut blank = KdlNode::new("");
        blank.clear_format();
        let mut blank_entry = KdlEntry::new(KdlValue::Null);
        blank_entry.set_format(KdlEntryFormat::default());
        let make = Make {
            tree: self,
            blank,
            blank_entry,
            reprs,
        };
        make.document(self.top)
    }

    /// A tree holding what a `kdl::KdlDocument` holds (its text owned),
    /// for a valid text the fast parser declines.
    pub fn from_document(doc: &KdlDocument) -> Tree<'static> {
        let mut tree = Tree {
            nodes: Vec::new(),
            entries: Vec::new(),
            top: Block {
                first: 0,
                len: 0,
                span: doc.span(),
            },
        };
        tree.top = tree.add_block(doc);
        tree
    }
}

impl Tree<'static> {
    /// Adds the nodes of `doc`, their child blocks first, so that the
    /// block's own nodes lie next to one another.
    fn add_block(&mut self, doc: &KdlDocument) -> Block {
        let children: Vec<Option<Block>> = doc
            .nodes()
            .iter()
            .map(|n| n.children().map(|c| self.add_block(c)))
            .collect();
        let first = self.nodes.len() as u32;
        for (node, children) in doc.nodes().iter().zip(children) {
            let start = self.entries.len() as u32;
            self.entries.extend(node.entries().iter().map(|e| Entry {
                name: e.name().map(ident_of),
                ty: e.ty().map(ident_of),
                value: Value::from_kdl(e.value()),
                raw: "",
                span: e.span(),
            }));
            self.nodes.push(NodeData {
                name: ident_of(node.name()),
                ty: node.ty().map(ident_of),
                entries: (start, self.entries.len() as u32),
                children,
                span: node.span(),
            });
        }
        Block {
            first,
            len: self.nodes.len() as u32 - first,
            span: doc.span(),
        }
    }
}

fn ident_of(i: &KdlIdentifier) -> Ident<'static> {
    Ident {
        value: Cow::Owned(i.value().to_string()),
        span: i.span(),
    }
}

impl<'t> Doc<'t> {
    /// The block's nodes in order.
    pub fn nodes(
        self,
    ) -> impl ExactSizeIterator<Item = Node<'t>> + DoubleEndedIterator + Clone + 't {
        let tree = self.tree;
        let (first, len) = (self.block.first as usize, self.block.len as usize);
        tree.nodes[first..first + len]
            .iter()
            .map(move |data| Node { tree, data })
    }

    pub fn len(self) -> usize {
        self.block.len as usize
    }

    pub fn is_empty(self) -> bool {
        self.block.len == 0
    }

    pub fn first(self) -> Option<Node<'t>> {
        self.nodes().next()
    }

    pub fn span(self) -> SourceSpan {
        self.block.span
    }
}

impl<'t> Node<'t> {
    pub fn name(self) -> &'t Ident<'t> {
        &self.data.name
    }

    pub fn ty(self) -> Option<&'t Ident<'t>> {
        self.data.ty.as_ref()
    }

    pub fn entries(self) -> &'t [Entry<'t>] {
        let (a, b) = self.data.entries;
        &self.tree.entries[a as usize..b as usize]
    }

    /// The child block, if the node has one (perhaps empty: `n {}`).
    pub fn children(self) -> Option<Doc<'t>> {
        self.data.children.map(|block| Doc {
            tree: self.tree,
            block,
        })
    }

    pub fn span(self) -> SourceSpan {
        self.data.span
    }
}

/// Builds the `kdl` crate's document from a tree.
struct Make<'t, 'a> {
    tree: &'t Tree<'a>,
    /// An empty node without formatting, cloned for each node (which
    /// allocates nothing, unlike `KdlNode::new`).
    blank: KdlNode,
    /// An empty entry with empty formatting, for entries that keep their
    /// values as written.
    blank_entry: KdlEntry,
    reprs: bool,
}

impl Make<'_, '_> {
    fn document(&self, block: Block) -> KdlDocument {
        let mut doc = KdlDocument::new();
        let (first, len) = (block.first as usize, block.len as usize);
        if len > 0 {
            *doc.nodes_mut() = self.tree.nodes[first..first + len]
                .iter()
                .map(|n| self.node(n))
                .collect();
        }
        doc.set_span(block.span);
        doc
    }

    fn node(&self, data: &NodeData<'_>) -> KdlNode {
        let mut node = self.blank.clone();
        node.set_name(ident(&data.name));
        if let Some(ty) = &data.ty {
            node.set_ty(ident(ty));
        }
        let (a, b) = data.entries;
        if b > a {
            *node.entries_mut() = self.tree.entries[a as usize..b as usize]
                .iter()
                .map(|e| self.entry(e))
                .collect();
        }
        if let Some(children) = data.children {
            node.set_children(self.document(children));
        }
        node.set_span(data.span);
        node
    }

    fn entry(&self, e: &Entry<'_>) -> KdlEntry {
        let mut entry = if self.reprs {
            self.blank_entry.clone()
        } else {
            KdlEntry::new(KdlValue::Null)
        };
        entry.set_value(e.value.to_kdl());
        if let Some(name) = &e.name {
            entry.set_name(Some(ident(name)));
        }
        if let Some(ty) = &e.ty {
            entry.set_ty(ident(ty));
        }
        if let Some(format) = entry.format_mut() {
            format.value_repr = e.raw.to_string();
        }
        entry.set_span(e.span);
        entry
    }
}

fn ident(i: &Ident<'_>) -> KdlIdentifier {
    let mut out = KdlIdentifier::from(i.value.to_string());
    out.set_span(i.span);
    out
}

/// Where `tree` differs from `doc` (the `kdl` crate's reading of the same
/// text) in names, types, values, spans or children, walking the tree as
/// its readers do; formats are not compared. For the tests that hold the
/// tree to that crate.
#[doc(hidden)]
pub fn differs(path: &str, tree: Doc<'_>, doc: &KdlDocument) -> Result<(), String> {
    if tree.span() != doc.span() || tree.len() != doc.nodes().len() {
        return Err(format!(
            "{path}: span {:?} vs {:?}, {} nodes vs {}",
            tree.span(),
            doc.span(),
            tree.len(),
            doc.nodes().len()
        ));
    }
    let ident = |a: Option<&Ident<'_>>, b: Option<&KdlIdentifier>| match (a, b) {
        (None, None) => true,
        (Some(a), Some(b)) => a.value() == b.value() && a.span() == b.span(),
        _ => false,
    };
    for (i, (x, y)) in tree.nodes().zip(doc.nodes()).enumerate() {
        let path = format!("{path}/{i}:{}", y.name().value());
        if x.span() != y.span()
            || !ident(Some(x.name()), Some(y.name()))
            || !ident(x.ty(), y.ty())
            || x.entries().len() != y.entries().len()
        {
            return Err(format!("{path}: node {x:?} vs {y:?}"));
        }
        for (j, (e, f)) in x.entries().iter().zip(y.entries()).enumerate() {
            let same_value = match (e.value(), f.value()) {
                (Value::Float(a), KdlValue::Float(b)) => {
                    a.to_bits() == b.to_bits() || (a.is_nan() && b.is_nan())
                }
                (a, b) => a.to_kdl() == *b,
            };
            if !same_value
                || e.span() != f.span()
                || !ident(e.name(), f.name())
                || !ident(e.ty(), f.ty())
            {
                return Err(format!("{path}[{j}]: entry {e:?} vs {f:?}"));
            }
        }
        match (x.children(), y.children()) {
            (None, None) => {}
            (Some(c), Some(d)) => differs(&path, c, d)?,
            _ => return Err(format!("{path}: children")),
        }
    }
    Ok(())
}
