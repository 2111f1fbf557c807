//! The minijinja set-up for Typst templates, built so that a template cannot
//! print user text unescaped: every `{{ value }}` passes through
//! [`escape_markup`](super::escape::escape_markup) on its way out. The only way around it is a value the
//! program itself wraps with [`typst_markup`], for Typst snippets it
//! generated; a template has no means to make one, so filters such as
//! minijinja's `safe` cannot switch escaping off.
//!
//! Templates come from a built-in list, with an optional folder whose files
//! take precedence (the `--templates DIR` option).

use std::collections::BTreeMap;
use std::fmt;
use std::path::{Path, PathBuf};
use std::sync::Arc;

use minijinja::value::{Object, Value};
use minijinja::{Environment, Error, ErrorKind, UndefinedBehavior};

use super::escape::{escape_content, escape_markup_into, escape_string};
use super::inside::{InsideError, read_inside};
use crate::catalogue::{Msg, MsgError};

/// Where templates are read from.
#[derive(Debug, Clone, Default)]
pub struct TemplateSource {
    /// Built-in templates as (name, source).
    pub embedded: &'static [(&'static str, &'static str)],
    /// A folder whose files replace built-in templates of the same name and
    /// may add new ones.
    pub override_dir: Option<PathBuf>,
}

impl TemplateSource {
    pub fn embedded(embedded: &'static [(&'static str, &'static str)]) -> Self {
        Self {
            embedded,
            override_dir: None,
        }
    }

    pub fn with_override_dir(mut self, dir: impl Into<PathBuf>) -> Self {
        self.override_dir = Some(dir.into());
        self
    }

    /// Whether a failure to fill the template `name` is the `--templates`
    /// folder's: the folder holds something under that name or under the
    /// name of any built-in template (a part such as `handover-set.typ`
    /// alone is the shop's too), be it a file or not (a folder or a link
    /// there is refused when it is read, and that is the shop's to mend).
    pub fn from_override(&self, name: &str) -> bool {
        let there = |dir: &Path, name: &str| dir.join(name).symlink_metadata().is_ok();
        self.override_dir.as_ref().is_some_and(|dir| {
            there(dir, name)
                || self
                    .embedded
                    .iter()
                    .any(|(built_in, _)| there(dir, built_in))
        })
    }
}

/// A piece of Typst source made by the program (a table built from figures,
/// a set rule), printed by templates as it is.
#[derive(Debug, Clone, PartialEq, Eq)]
pub struct TypstMarkup(pub String);

impl Object for TypstMarkup {
    fn render(self: &Arc<Self>, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        f.write_str(&self.0)
    }
}

/// A list in a template's context whose items become template values
/// only when a template reads them (`{% for s in sets %}`, `sets[0]`,
/// `sets|length` all work as on any list): each item is made from its
/// Rust value on reading, and [`fill_each`] makes each where its part is
/// filled, on the pool, and lets it go there once the part is written.
/// A long job's sets are a million small values; made all at once
/// they took the template's thread milliseconds before any part could
/// start, and their memory was new memory that stayed in use to the end.
///
/// Serialized for a template, an [`OnDemand`] becomes one of these;
/// serialized any other way (JSON), it is the plain list.
#[derive(Debug, Clone)]
pub struct OnDemand<T>(pub Arc<Vec<T>>);

impl<T> OnDemand<T> {
    pub fn new(items: Vec<T>) -> Self {
        Self(Arc::new(items))
    }
}

impl<T> std::ops::Deref for OnDemand<T> {
    type Target = [T];
    fn deref(&self) -> &[T] {
        &self.0
    }
}

impl<T: serde::Serialize + Send + Sync + fmt::Debug + 'static> serde::Serialize for OnDemand<T> {
    fn serialize<S: serde::Serializer>(&self, serializer: S) -> Result<S::Ok, S::Error> {
        if minijinja::value::serializing_for_value() {
            let items: Arc<dyn ItemValues> = Arc::clone(&self.0) as Arc<dyn ItemValues>;
            Value::from_object(ValuesOnDemand(items)).serialize(serializer)
        } else {
            self.0.serialize(serializer)
        }
    }
}

/// Items that can each be made into a template value.
trait ItemValues: Send + Sync + fmt::Debug {
    fn count(&self) -> usize;
    fn value(&self, index: usize) -> Value;
}

impl<T: serde::Serialize + Send + Sync + fmt::Debug> ItemValues for Vec<T> {
    fn count(&self) -> usize {
        self.len()
    }
    fn value(&self, index: usize) -> Value {
        Value::from_serialize(&self[index])
    }
}

/// The template's side of an [`OnDemand`]: a list of its items, each made
/// when read.
#[derive(Debug)]
struct ValuesOnDemand(Arc<dyn ItemValues>);

impl Object for ValuesOnDemand {
    fn repr(self: &Arc<Self>) -> minijinja::value::ObjectRepr {
        minijinja::value::ObjectRepr::Seq
    }

    fn get_value(self: &Arc<Self>, key: &Value) -> Option<Value> {
        let index = usize::try_from(key.as_i64()?).ok()?;
        (index < self.0.count()).then(|| self.0.value(index))
    }

    fn enumerate(self: &Arc<Self>) -> minijinja::value::Enumerator {
        minijinja::value::Enumerator::Seq(self.0.count())
    }

    fn enumerator_len(self: &Arc<Self>) -> Option<usize> {
        Some(self.0.count())
    }
}

/// Program-made Typst source in pieces, printed one after another like a
/// [`TypstMarkup`] of them all: what [`fill_each`] gives, one piece per
/// item, so a long document's text is not copied into one more string on
/// its way out.
#[derive(Debug, Clone, PartialEq, Eq)]
pub struct TypstMarkupParts(pub Vec<String>);

impl Object for TypstMarkupParts {
    fn render(self: &Arc<Self>, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        self.0.iter().try_for_each(|part| f.write_str(part))
    }
}

/// Wraps program-generated Typst source so the template prints it without
/// escaping. Never pass user text here: escape it first with
/// [`escape_markup`](super::escape::escape_markup).
pub fn typst_markup(source: impl Into<String>) -> Value {
    Value::from_object(TypstMarkup(source.into()))
}

/// Writes `text` escaped for Typst markup, through one buffer kept per
/// thread rather than a new string for every printed value.
fn write_escaped(out: &mut minijinja::Output<'_>, text: &str) -> fmt::Result {
    thread_local! {
        static ESCAPED: std::cell::RefCell<String> = const { std::cell::RefCell::new(String::new()) };
    }
    ESCAPED.with_borrow_mut(|buf| {
        buf.clear();
        escape_markup_into(text, buf);
        out.write_str(buf)
    })
}

/// A minijinja environment for Typst templates.
///
/// * every printed value is escaped for Typst markup, except
///   [`typst_markup`] values; `none` and undefined print nothing;
/// * `{{ x|typst_string }}` prints a complete Typst string literal, quotes
///   included, for use in code (`#set document(title: {{ t|typst_string }})`);
/// * `{{ rows|typst_rows }}` prints a table's rows (`set.nodes`, `set.valves`
///   …) as the program writes their cells, one row a line (`typst_rows`);
/// * `{{ x|typst_content }}` prints the value as content for a code position
///   (a table cell: `data-table(…, {{ x|typst_content }}, …)`), printing what
///   `[{{ x }}]` prints, but as a string literal wherever that reads the same,
///   which typst lays out for less ([`escape_content`]);
/// * the `safe`, `escape`, `e` and `tojson` filters are removed: they would
///   suggest an opt-out that does not exist here (or print user text as a
///   raw JSON string);
/// * `{% include %}`, `{% import %}`, `{% extends %}` and macros work.
///   What a macro, a `{% set %}…{% endset %}` block or an include gives
///   back is template output whose values were escaped on the way in, so it
///   prints as it is; `replace` and `format` give plain text, escaped when
///   printed. The `{% autoescape %}` statement is refused, since another
///   escaping mode inside it would let such filters mix unescaped text in;
/// * an undefined variable is an error, so a misspelt name does not quietly
///   print nothing.
pub fn template_environment(templates: TemplateSource) -> Environment<'static> {
    let mut env = Environment::new();
    env.set_undefined_behavior(UndefinedBehavior::Strict);
    env.set_keep_trailing_newline(true);
    // A mode of our own: minijinja then marks template output captured by
    // macros and blocks as already escaped, and routes any escaping it does
    // itself through the formatter below.
    env.set_auto_escape_callback(|_| minijinja::AutoEscape::Custom(ESCAPE_MODE));
    for name in ["safe", "escape", "e", "tojson"] {
        env.remove_filter(name);
    }
    env.add_filter("typst_string", typst_string);
    env.add_filter("typst_content", typst_content);
    env.add_filter("text_length", text_length);
    env.add_filter("typst_rows", typst_rows);
    env.add_filter("replace", |value: String, from: String, to: String| {
        value.replace(&from, &to)
    });
    env.add_filter(
        "format",
        |state: &minijinja::State, format: String, args: minijinja::value::Rest<Value>| {
            minijinja::filters::format(state, &Value::from(format), args)
        },
    );
    env.set_formatter(|out, _state, value| {
        if let Some(markup) = value.downcast_object_ref::<TypstMarkup>() {
            out.write_str(&markup.0)?;
        } else if let Some(parts) = value.downcast_object_ref::<TypstMarkupParts>() {
            parts.0.iter().try_for_each(|part| out.write_str(part))?;
        } else if value.is_safe()
            && let Some(text) = value.as_str()
        {
            out.write_str(text)?;
        } else if let Some(text) = value.as_str() {
            write_escaped(out, text)?;
        } else if !(value.is_none() || value.is_undefined()) {
            write_escaped(out, &value.to_string())?;
        }
        Ok(())
    });
    let TemplateSource {
        embedded,
        override_dir,
    } = templates;
    env.set_loader(move |name| {
        let source = match &override_dir {
            Some(dir) => load_from_dir(dir, name)?,
            None => None,
        };
        let source = source.or_else(|| {
            embedded
                .iter()
                .find(|(n, _)| *n == name)
                .map(|(_, source)| (*source).to_owned())
        });
        if let Some(text) = &source
            && uses_autoescape(text)
        {
            return Err(refusal(
                ErrorKind::InvalidOperation,
                Msg::new("cli-template-autoescape").arg("name", name),
            ));
        }
        Ok(source)
    });
    env
}

/// The escaping mode every template runs in.
const ESCAPE_MODE: &str = "typst";

/// True when `source` has an `{% autoescape … %}` statement.
fn uses_autoescape(source: &str) -> bool {
    source.match_indices("{%").any(|(i, _)| {
        source[i + 2..]
            .trim_start_matches(['-', '+', '~'])
            .trim_start()
            .starts_with("autoescape")
    })
}

/// The `typst_string` filter: the value as a quoted Typst string literal.
fn typst_string(value: Value) -> Value {
    let text = if value.is_none() || value.is_undefined() {
        String::new()
    } else {
        value.to_string()
    };
    typst_markup(format!("\"{}\"", escape_string(&text)))
}

/// The `typst_content` filter: the value as Typst content in code position,
/// printing what `[{{ value }}]` prints: a string literal where the text
/// reads the same that way ([`escape_content`]), else that content block.
/// Markup the program made, or a macro's output, stays a content block as
/// it is; `none` is an empty one.
fn typst_content(value: Value) -> Value {
    if let Some(markup) = value.downcast_object_ref::<TypstMarkup>() {
        return typst_markup(format!("[{}]", markup.0));
    }
    if let Some(parts) = value.downcast_object_ref::<TypstMarkupParts>() {
        return typst_markup(format!("[{}]", parts.0.concat()));
    }
    if value.is_none() || value.is_undefined() {
        return typst_markup("[]");
    }
    match value.as_str() {
        Some(text) if value.is_safe() => typst_markup(format!("[{text}]")),
        Some(text) => typst_markup(escape_content(text)),
        None => typst_markup(escape_content(&value.to_string())),
    }
}

/// The `typst_rows` filter: a table's rows ([`Rows`](super::rows::Rows),
/// such as `set.nodes`) as the cells the program writes for them, escaped
/// as `typst_content`, `typst_string` and printing escape them
/// ([`TypstRow`](super::rows::TypstRow)). Any other value is an error.
fn typst_rows(value: Value) -> Result<Value, Error> {
    match value.downcast_object_ref::<super::rows::RowList>() {
        Some(rows) => Ok(typst_markup(rows.cells())),
        None => Err(refusal(
            ErrorKind::InvalidOperation,
            Msg::new("cli-template-not-rows"),
        )),
    }
}

/// The `fill_each` function of a template's context, for a document whose
/// `base` context is given:
/// `fill_each("part.typ", "name", items, extra=value, …)` fills the template
/// `part.typ` once for each of `items`, with the item as `name`, each
/// `extra` keyword as a variable, and the document's whole context (`base`)
/// beside them, and prints the texts one after another in the order of
/// `items`. The items are filled on every core (rayon; from
/// [`PARALLEL_PARTS`] items on), which is why a long hand-over's sets are
/// filled this way rather than in a `{% for %}` loop;
/// what is printed is what that loop would print, the same template text
/// written inline. A filled part's output was escaped as it was written, so
/// it prints as it is.
///
/// `base` does not hold `fill_each` itself, so a part cannot fill parts in
/// turn (a template calling itself that way would never end); `fill_each`
/// there is an undefined name, an error like any other. An error in a part
/// names the part and its line; of several, the first item's.
pub fn fill_each(base: Value) -> Value {
    Value::from_function(
        move |state: &minijinja::State,
              name: &str,
              item_name: &str,
              items: Value,
              extra: minijinja::value::Kwargs|
              -> Result<Value, Error> {
            use rayon::prelude::*;
            let template = state.env().get_template(name)?;
            // Every name a part sees, in one map made once: looked up
            // through one map rather than a chain of them, as the part's
            // names are looked up thousands of times.
            let mut names = BTreeMap::new();
            for key in base.try_iter()? {
                if let Some(key_str) = key.as_str() {
                    names.insert(key_str.to_owned(), base.get_item(&key)?);
                }
            }
            for key in extra.args() {
                names.insert(key.to_owned(), extra.get::<Value>(key)?);
            }
            let names = Arc::new(names);
            if items.is_undefined() {
                // As a loop over an undefined name would be.
                return Err(Error::from(ErrorKind::UndefinedError));
            }
            let item_name: Arc<str> = Arc::from(item_name);
            let fill = |item: Value| {
                template.render(Value::from_object(PartContext {
                    item_name: Arc::clone(&item_name),
                    item,
                    names: Arc::clone(&names),
                }))
            };
            // A list made on demand has each item made where its part is
            // filled (and let go there once the part is written); any
            // other list's items are taken as they are.
            let on_demand = items
                .downcast_object_ref::<ValuesOnDemand>()
                .map(|list| Arc::clone(&list.0));
            let listed: Vec<Value> = match on_demand {
                Some(_) => Vec::new(),
                None => items.try_iter()?.collect(),
            };
            let count = on_demand.as_ref().map_or(listed.len(), |list| list.count());
            let one = |index: usize| {
                fill(match &on_demand {
                    Some(list) => list.value(index),
                    None => listed[index].clone(),
                })
            };
            let parts: Vec<Result<String, Error>> = if count < PARALLEL_PARTS {
                (0..count).map(one).collect()
            } else {
                (0..count).into_par_iter().map(one).collect()
            };
            let parts = parts.into_iter().collect::<Result<Vec<_>, _>>()?;
            Ok(Value::from_object(TypstMarkupParts(parts)))
        },
    )
}

/// From this many items on, [`fill_each`] fills them on every core; fewer
/// are filled one after another, as starting the pool's threads for a
/// short document would cost more than it saves.
pub const PARALLEL_PARTS: usize = 16;

/// `bytes` as text, as [`String::from_utf8`] gives it; a long text (a
/// long job's filled hand-over is megabytes) is checked in pieces on every
/// core rather than in one pass before the document can go on.
pub(crate) fn text_from_bytes(bytes: Vec<u8>) -> Result<String, std::string::FromUtf8Error> {
    if bytes.len() < TEXT_PIECES_FROM {
        return String::from_utf8(bytes);
    }
    text_checked_in_pieces(bytes, TEXT_PIECE_BYTES)
}

/// From this many bytes on, [`text_from_bytes`] checks a text in pieces.
const TEXT_PIECES_FROM: usize = 1 << 20;

/// About how long each piece [`text_from_bytes`] checks is.
const TEXT_PIECE_BYTES: usize = 1 << 19;

/// [`text_from_bytes`] with pieces of about `piece` bytes. In UTF-8 each
/// piece starts where a character starts, so the text is UTF-8 just when
/// every piece is: a character cannot straddle two pieces, and a sequence
/// cut by a piece's start leaves the piece before it, or the one it
/// starts, no UTF-8. A text that is not UTF-8 is handed to
/// [`String::from_utf8`] for its error.
fn text_checked_in_pieces(
    bytes: Vec<u8>,
    piece: usize,
) -> Result<String, std::string::FromUtf8Error> {
    use rayon::prelude::*;
    let piece = piece.max(1);
    let mut starts = vec![0];
    let mut at = piece;
    while at < bytes.len() {
        // Back to the byte that starts the character `at` falls in: at
        // most three steps in UTF-8. In bytes that are not UTF-8 it may
        // stay on a byte that continues a character; that piece is then
        // not UTF-8 either, and the whole is checked again below.
        let last = *starts.last().expect("one start");
        let mut start = at;
        while at - start < 3 && start > last + 1 && bytes[start] & 0xC0 == 0x80 {
            start -= 1;
        }
        starts.push(start);
        at = start + piece;
    }
    starts.push(bytes.len());
    let every_piece_text = starts
        .par_windows(2)
        .all(|w| std::str::from_utf8(&bytes[w[0]..w[1]]).is_ok());
    if every_piece_text {
        // SAFETY: every piece is UTF-8, so each starts with a byte that
        // starts a character and ends with a whole character: the pieces
        // put together, `bytes`, are UTF-8.
        Ok(unsafe { String::from_utf8_unchecked(bytes) })
    } else {
        String::from_utf8(bytes)
    }
}

/// What one part [`fill_each`] fills sees: its item under its name, else
/// the names shared by all parts.
#[derive(Debug)]
struct PartContext {
    item_name: Arc<str>,
    item: Value,
    names: Arc<BTreeMap<String, Value>>,
}

impl Object for PartContext {
    fn get_value(self: &Arc<Self>, key: &Value) -> Option<Value> {
        let key = key.as_str()?;
        if key == &*self.item_name {
            return Some(self.item.clone());
        }
        self.names.get(key).cloned()
    }

    fn enumerate(self: &Arc<Self>) -> minijinja::value::Enumerator {
        let mut keys: Vec<Value> = self.names.keys().map(|k| Value::from(k.as_str())).collect();
        if !self.names.contains_key(&*self.item_name) {
            keys.push(Value::from(&*self.item_name));
        }
        minijinja::value::Enumerator::Values(keys)
    }
}

/// The `text_length` filter: how many characters of text a value holds,
/// counting every string in it (in lists and maps too, keys left out), so
/// a template can tell a short table from one whose cells hold pages of
/// text without laying it out. Numbers and other scalars count as their
/// printed form. A table's [`Rows`](super::rows::Rows) bring the count
/// with them, worked out from the Rust values the same way.
fn text_length(value: Value) -> usize {
    if let Some(rows) = value.downcast_object_ref::<super::rows::RowList>() {
        return rows.text_length();
    }
    text_length_walk(&value)
}

/// The `text_length` filter's count, walking the template value.
pub(crate) fn text_length_walk(value: &Value) -> usize {
    fn walk(value: &Value, depth: usize) -> usize {
        if depth > super::rows::MAX_DEPTH || value.is_none() || value.is_undefined() {
            return 0;
        }
        if let Some(text) = value.as_str() {
            return text.chars().count();
        }
        match value.kind() {
            minijinja::value::ValueKind::Seq | minijinja::value::ValueKind::Iterable => value
                .try_iter()
                .map(|items| items.map(|v| walk(&v, depth + 1)).sum())
                .unwrap_or(0),
            minijinja::value::ValueKind::Map => value
                .try_iter()
                .map(|keys| {
                    keys.map(|k| value.get_item(&k).map_or(0, |v| walk(&v, depth + 1)))
                        .sum()
                })
                .unwrap_or(0),
            _ => value.to_string().chars().count(),
        }
    }
    walk(value, 0)
}

/// Reads template `name` from `dir`, if the file exists there. Names must be
/// plain relative paths with `/` between folders; links and other
/// non-regular files are refused ([`read_inside`]), so a template can pull
/// in nothing from outside its folder.
fn load_from_dir(dir: &Path, name: &str) -> Result<Option<String>, Error> {
    let bytes = match read_inside(dir, name) {
        Ok(Some(bytes)) => bytes,
        Ok(None) => return Ok(None),
        Err(InsideError::BadName { .. }) => {
            return Err(refusal(
                ErrorKind::TemplateNotFound,
                Msg::new("cli-template-bad-name").arg("name", name),
            ));
        }
        Err(e) => {
            return Err(refusal(
                ErrorKind::InvalidOperation,
                Msg::new("cli-template-refused")
                    .arg("name", name)
                    .arg("why", e.msg()),
            ));
        }
    };
    String::from_utf8(bytes).map(Some).map_err(|_| {
        refusal(
            ErrorKind::InvalidOperation,
            Msg::new("cli-template-not-utf8").arg("name", name),
        )
    })
}

/// A template engine error of `kind` whose words are the catalogue's
/// `msg`: the message travels as the error's source ([`MsgError`]) and
/// [`template_error_msg`] finds it again, so the reader gets it in their
/// language; the engine's own text is its English.
pub fn refusal(kind: ErrorKind, msg: Msg) -> Error {
    Error::new(kind, msg.english()).with_source(MsgError(msg))
}

/// What the template engine said when a template could not be filled, as
/// a catalogue message for the reader's language: a refusal of the
/// program's own ([`refusal`]) as it was made; otherwise the kind of
/// problem in the catalogue's words (`cli-template-kind-…`). The engine's
/// own detail is kept, quoted, only where the error names a template line
/// (`cli-template-engine-said`), since there it points at the mistake; the
/// template and the line follow (`cli-template-place`).
pub fn template_error_msg(e: &Error) -> Msg {
    // The error that says most: the innermost of the engine's errors that
    // names a line (an included template's own), else the outermost.
    let mut said = e;
    let mut cause: Option<&(dyn std::error::Error + 'static)> = std::error::Error::source(e);
    let mut ours: Option<Msg> = None;
    while let Some(c) = cause {
        if let Some(inner) = c.downcast_ref::<Error>()
            && inner.line().is_some()
        {
            said = inner;
        }
        if let Some(MsgError(msg)) = c.downcast_ref::<MsgError>() {
            ours = Some(msg.clone());
        }
        cause = c.source();
    }
    let what = match ours {
        Some(msg) => msg,
        None => {
            let kind = Msg::new(kind_key(said.kind()));
            match (said.line(), said.detail()) {
                (Some(_), Some(detail)) => Msg::new("cli-template-engine-said")
                    .arg("what", kind)
                    .arg("detail", detail),
                _ => kind,
            }
        }
    };
    match (said.name(), said.line()) {
        (Some(name), Some(line)) => Msg::new("cli-template-place")
            .arg("what", what)
            .arg("name", name)
            .arg("line", line.to_string()),
        _ => what,
    }
}

/// The catalogue's words for a kind of template engine error.
fn kind_key(kind: ErrorKind) -> &'static str {
    match kind {
        ErrorKind::SyntaxError => "cli-template-kind-syntax",
        ErrorKind::UndefinedError => "cli-template-kind-undefined",
        ErrorKind::UnknownFilter => "cli-template-kind-unknown-filter",
        ErrorKind::UnknownTest => "cli-template-kind-unknown-test",
        ErrorKind::UnknownFunction => "cli-template-kind-unknown-function",
        ErrorKind::UnknownMethod => "cli-template-kind-unknown-method",
        ErrorKind::TemplateNotFound => "cli-template-kind-not-found",
        ErrorKind::TooManyArguments => "cli-template-kind-too-many-arguments",
        ErrorKind::MissingArgument => "cli-template-kind-missing-argument",
        ErrorKind::BadEscape => "cli-template-kind-bad-escape",
        ErrorKind::InvalidOperation => "cli-template-kind-invalid-operation",
        ErrorKind::NonPrimitive
        | ErrorKind::NonKey
        | ErrorKind::CannotUnpack
        | ErrorKind::BadSerialization => "cli-template-kind-wrong-value",
        ErrorKind::BadInclude => "cli-template-kind-bad-include",
        _ => "cli-template-kind-other",
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use minijinja::context;

    static BUILT_IN: &[(&str, &str)] = &[
        ("page.typ", "= {{ title }}\n{{ body }}\n"),
        ("other.typ", "built-in other"),
    ];

    fn env() -> Environment<'static> {
        template_environment(TemplateSource::embedded(BUILT_IN))
    }

    fn render(source: &str, ctx: Value) -> Result<String, Error> {
        env().render_str(source, ctx)
    }

    #[test]
    fn every_value_is_escaped() {
        let out = env()
            .get_template("page.typ")
            .unwrap()
            .render(context! { title => "#read(\"x\")", body => "*b* $m$" })
            .unwrap();
        assert_eq!(out, "= \\#read\\(\\\"x\\\"\\)\n\\*b\\* \\$m\\$\n");
    }

    #[test]
    fn numbers_lists_and_none() {
        let out = render(
            "{{ n }}|{{ xs }}|{{ nothing }}|",
            context! { n => -1.5, xs => vec!["a_b"], nothing => () },
        )
        .unwrap();
        assert_eq!(out, "\\-1\\.5|\\[\\\"a\\_b\\\"\\]||");
    }

    #[test]
    fn program_markup_is_printed_as_is() {
        let out = render(
            "{{ table }} {{ name }}",
            context! { table => typst_markup("#table(columns: 2)[a][b]"), name => "#x" },
        )
        .unwrap();
        assert_eq!(out, "#table(columns: 2)[a][b] \\#x");
    }

    #[test]
    fn a_template_cannot_opt_out() {
        for source in ["{{ x|safe }}", "{{ x|e }}", "{{ x|escape }}"] {
            assert!(render(source, context! { x => "#x" }).is_err(), "{source}");
        }
        // Filters that return strings give strings, which are escaped again.
        let out = render("{{ x|upper }}{{ x|trim }}", context! { x => "#x" }).unwrap();
        assert_eq!(out, "\\#X\\#x");
        // A wrapped value that passes through a filter loses its wrapping.
        let out = render("{{ m|lower }}", context! { m => typst_markup("#A") }).unwrap();
        assert_eq!(out, "\\#a");
        // Nor can macros and blocks, or the filters that mix text into
        // them, or JSON.
        let out = render(
            "{% macro m(v) %}[{{ v }}]{% endmacro %}{{ m(x) }}{{ m(x)|replace(']', x) }}\
             {% set b %}{{ x }}{% endset %}{{ b }}{{ '%s'|format(x) }}{{ [m(x), x]|join(x) }}",
            context! { x => "#x" },
        )
        .unwrap();
        assert_eq!(out, "[\\#x]\\[\\\\\\#x\\#x\\#x\\#x[\\#x]\\#x\\#x");
        assert!(render("{{ x|tojson }}", context! { x => "#x" }).is_err());
        // Another escaping mode cannot be switched on in a loaded template.
        static AUTOESCAPE: &[(&str, &str)] = &[(
            "a.typ",
            "{%- autoescape 'html' %}{{ x }}{% endautoescape %}",
        )];
        let env = template_environment(TemplateSource::embedded(AUTOESCAPE));
        let err = env.get_template("a.typ").unwrap_err();
        assert!(err.to_string().contains("autoescape"), "{err}");
    }

    #[test]
    fn typst_string_gives_a_whole_literal() {
        let out = render(
            "#set document(title: {{ t|typst_string }})",
            context! { t => "a \"b\"\\\nc" },
        )
        .unwrap();
        assert_eq!(out, "#set document(title: \"a \\\"b\\\"\\\\\\nc\")");
        let out = render("{{ n|typst_string }}", context! { n => () }).unwrap();
        assert_eq!(out, "\"\"");
    }

    #[test]
    fn typst_content_prints_what_a_content_block_prints() {
        let out = render(
            "({{ a|typst_content }}, {{ b|typst_content }}, {{ c|typst_content }}, {{ n|typst_content }}, {{ k|typst_content }}, {{ m|typst_content }})",
            context! { a => "0.10 W", b => "#x\ny", c => 42, n => (), k => typst_markup("*b*"), m => "] #read(\"/\")" },
        )
        .unwrap();
        assert_eq!(
            out,
            "(\"0.10 W\", [\\#x\\ y], \"42\", [], [*b*], \"] #read(\\\"/\\\")\")"
        );
        // A macro's output was escaped on the way in and stays markup.
        let out = render(
            "{% macro m(x) %}{{ x }}.{% endmacro %}{{ m(\"a*\")|typst_content }}",
            context! {},
        )
        .unwrap();
        assert_eq!(out, "[a\\*.]");
    }

    #[test]
    fn text_length_counts_every_string_inside() {
        let out = render(
            "{{ rows|text_length }} {{ one|text_length }} {{ none|text_length }}",
            context! {
                rows => vec![
                    context! { a => "abc", b => vec!["de", "fü"] },
                    context! { a => "", b => Vec::<String>::new() },
                ],
                one => "1234",
                none => (),
            },
        )
        .unwrap();
        assert_eq!(out, "7 4 0");
    }

    #[test]
    fn undefined_is_an_error() {
        assert!(render("{{ missing }}", context! {}).is_err());
    }

    #[test]
    fn override_folder_wins_and_falls_back() {
        let dir = tempfile::tempdir().unwrap();
        std::fs::write(dir.path().join("page.typ"), "shop page {{ title }}").unwrap();
        std::fs::create_dir(dir.path().join("parts")).unwrap();
        std::fs::write(dir.path().join("parts").join("new.typ"), "new").unwrap();
        let env =
            template_environment(TemplateSource::embedded(BUILT_IN).with_override_dir(dir.path()));
        let page = env.get_template("page.typ").unwrap();
        assert_eq!(
            page.render(context! { title => "_" }).unwrap(),
            "shop page \\_"
        );
        let other = env.get_template("other.typ").unwrap();
        assert_eq!(other.render(()).unwrap(), "built-in other");
        assert_eq!(
            env.get_template("parts/new.typ")
                .unwrap()
                .render(())
                .unwrap(),
            "new"
        );
        assert!(env.get_template("missing.typ").is_err());
        assert!(env.get_template("../secret").is_err());
    }

    #[test]
    fn a_template_can_be_split_into_parts() {
        let dir = tempfile::tempdir().unwrap();
        std::fs::create_dir(dir.path().join("parts")).unwrap();
        std::fs::write(
            dir.path().join("page.typ"),
            "{% import \"parts/macros.typ\" as m %}{% include \"parts/head.typ\" %}|{{ m.cell(title) }}",
        )
        .unwrap();
        std::fs::write(dir.path().join("parts/head.typ"), "head {{ title }}").unwrap();
        std::fs::write(
            dir.path().join("parts/macros.typ"),
            "{% macro cell(x) %}[{{ x }}]{% endmacro %}",
        )
        .unwrap();
        let env =
            template_environment(TemplateSource::embedded(BUILT_IN).with_override_dir(dir.path()));
        let out = env
            .get_template("page.typ")
            .unwrap()
            .render(context! { title => "#t" })
            .unwrap();
        assert_eq!(out, "head \\#t|[\\#t]");
        // A user value reaches the page escaped once, through any part.
    }

    #[cfg(unix)]
    #[test]
    fn a_linked_template_is_refused() {
        let outside = tempfile::tempdir().unwrap();
        std::fs::write(outside.path().join("secret"), "root:x:0:0").unwrap();
        let dir = tempfile::tempdir().unwrap();
        std::os::unix::fs::symlink(outside.path().join("secret"), dir.path().join("page.typ"))
            .unwrap();
        std::fs::write(dir.path().join("main.typ"), "{% include \"page.typ\" %}").unwrap();
        let env =
            template_environment(TemplateSource::embedded(BUILT_IN).with_override_dir(dir.path()));
        let err = env
            .get_template("main.typ")
            .unwrap()
            .render(())
            .unwrap_err();
        let words = format!("{err:#}");
        assert!(words.contains("symbolic link"), "{words}");
        assert!(!words.contains("root:x"), "{words}");
    }

    #[test]
    fn text_checked_in_pieces_is_text_as_from_utf8_says() {
        // Random bytes around character boundaries, valid and not, cut in
        // pieces of every small length: the same answer as one check.
        let mut next = crate::test_random::xorshift(0x5851_f42d_4c95_7f2d_u64);
        const POOL: &[&[u8]] = &[
            b"a",
            b" ",
            "µ".as_bytes(),
            "日".as_bytes(),
            "😀".as_bytes(),
            b"\xff",
            b"\x80",
            b"\xe6",
            b"\xe6\x97",
            b"\xf0\x9f",
            b"\xc2",
        ];
        let mut both = [0usize; 2];
        for _ in 0..30_000 {
            let len = (next() % 12) as usize;
            let bytes: Vec<u8> = (0..len)
                .flat_map(|_| POOL[(next() % POOL.len() as u64) as usize].iter().copied())
                .collect();
            let whole = String::from_utf8(bytes.clone());
            both[usize::from(whole.is_ok())] += 1;
            for piece in 1..=7 {
                let pieces = text_checked_in_pieces(bytes.clone(), piece);
                assert_eq!(
                    pieces.is_ok(),
                    whole.is_ok(),
                    "{bytes:?} in pieces of {piece}"
                );
                if let (Ok(a), Ok(b)) = (&pieces, &whole) {
                    assert_eq!(a, b);
                }
            }
        }
        assert!(both.iter().all(|&n| n > 2_000), "{both:?}");
        // The long way, for a long text, valid and not.
        let long = "ab µ 日 😀\n".repeat(100_000).into_bytes();
        assert!(long.len() >= TEXT_PIECES_FROM);
        assert_eq!(text_from_bytes(long.clone()).unwrap().as_bytes(), &long[..]);
        let mut broken = long;
        let middle = broken.len() / 2;
        broken[middle] = 0xff;
        assert!(text_from_bytes(broken).is_err());
    }

    #[test]
    fn a_failure_is_the_folders_when_it_holds_any_of_the_templates() {
        let dir = tempfile::tempdir().unwrap();
        let source = TemplateSource::embedded(BUILT_IN).with_override_dir(dir.path());
        // Only images, or nothing: the program's own template failed.
        std::fs::create_dir(dir.path().join("images")).unwrap();
        assert!(!source.from_override("page.typ"));
        assert!(!TemplateSource::embedded(BUILT_IN).from_override("page.typ"));
        // A part of its own (here `other.typ`), even one that is a folder
        // or a link the loader refuses, makes any failure the folder's.
        std::fs::create_dir(dir.path().join("other.typ")).unwrap();
        assert!(source.from_override("page.typ"));
        std::fs::remove_dir(dir.path().join("other.typ")).unwrap();
        #[cfg(unix)]
        {
            std::os::unix::fs::symlink("/nonexistent", dir.path().join("page.typ")).unwrap();
            assert!(source.from_override("page.typ"));
        }
    }

    /// A context as `fill_template` makes it: the document's values, and
    /// `fill_each` over them.
    fn with_fill_each(base: Value) -> Value {
        context! { fill_each => fill_each(base.clone()), ..base }
    }

    #[test]
    fn a_list_made_on_demand_reads_as_the_plain_list() {
        // The same items as a plain list and as one made on demand: every
        // way a template can read a list gives the same text, a JSON
        // serializer sees the plain list, and `fill_each` over either
        // prints the same parts, for a few items (in order on this
        // thread) and for many (on every core).
        #[derive(Debug, serde::Serialize)]
        struct Item {
            name: String,
            n: usize,
            rows: Vec<usize>,
        }
        let made = |count: usize| -> Vec<Item> {
            (0..count)
                .map(|n| Item {
                    name: format!("#set {n} *x*"),
                    n,
                    rows: (0..n % 4).collect(),
                })
                .collect()
        };
        let reads = "{% if items %}yes{% else %}no{% endif %} {{ items|length }} \
            {% for i in items %}{{ loop.index }}:{{ i.name }}/{% for r in i.rows %}{{ r }}{% endfor %};{% endfor %} \
            {{ items[0].name if items else '' }} {{ items[-1].n if items else '' }} \
            {{ (items|last).n if items else '' }} {{ items|map(attribute='n')|join(',') }} \
            {{ items[items|length] is undefined }} {{ items|reverse|map(attribute='n')|join(',') }} {{ items|pprint }} \
            {{ fill_each(\"part.typ\", \"i\", items, mark=\"m\") }}|";
        let built_in: &'static [(&'static str, &'static str)] = Box::leak(Box::new([
            (
                "part.typ",
                "<{{ i.n }} {{ i.name }} {{ mark }} {{ items|length }}>",
            ),
            ("reads.typ", reads),
        ]));
        let env = template_environment(TemplateSource::embedded(built_in));
        for count in [0, 1, 3, PARALLEL_PARTS + 5, 300] {
            let plain = env
                .get_template("reads.typ")
                .unwrap()
                .render(with_fill_each(
                    context! { items => Value::from_serialize(made(count)) },
                ))
                .unwrap();
            let on_demand = OnDemand::new(made(count));
            let lazy = env
                .get_template("reads.typ")
                .unwrap()
                .render(with_fill_each(Value::from_serialize(
                    std::collections::BTreeMap::from([("items", &on_demand)]),
                )))
                .unwrap();
            assert_eq!(lazy, plain, "{count} items");
            assert!(plain.contains(&format!(" {count} ")), "{plain}");
            assert_eq!(
                serde_json::to_string(&on_demand).unwrap(),
                serde_json::to_string(&made(count)).unwrap()
            );
        }
    }

    #[test]
    fn fill_each_prints_what_the_loop_prints_in_order() {
        // The part, written inline in a loop and as a template of its own:
        // the same text, item for item, for many items filled on every
        // core, with user text escaped, markup kept, the item's own
        // variables, `extra` keywords and the document's names all seen.
        let part = "\n\n== {{ item.name }} ({{ loop_free }}){% if item.n is even %} even{% endif %}\n{{ heading }} {{ shop }} {{ item.n|typst_content }} {{ t }}";
        let built_in: &'static [(&'static str, &'static str)] = Box::leak(Box::new([
            ("part.typ", part),
            (
                "inline.typ",
                Box::leak(
                    format!("{{% for item in items %}}{part}{{% endfor %}}|").into_boxed_str(),
                ) as &str,
            ),
            (
                "each.typ",
                "{{ fill_each(\"part.typ\", \"item\", items, heading=heading) }}|",
            ),
        ]));
        let env = template_environment(TemplateSource::embedded(built_in));
        let items: Vec<Value> = (0..700)
            .map(|n| context! { name => format!("#set {n} *x*"), n => n })
            .collect();
        let base = context! {
            items => items,
            loop_free => "a_b",
            shop => typst_markup("#strong[S]"),
            t => "$",
        };
        let heading = env
            .render_str(
                "{% set h %}[{{ w }}]{% endset %}{{ h }}",
                context! { w => "#w" },
            )
            .unwrap();
        assert_eq!(heading, "[\\#w]");
        let inline = env
            .get_template("inline.typ")
            .unwrap()
            .render(
                context! { heading => Value::from_safe_string(heading.clone()), ..base.clone() },
            )
            .unwrap();
        let each = env
            .get_template("each.typ")
            .unwrap()
            .render(with_fill_each(context! {
                heading => Value::from_safe_string(heading.clone()),
                ..base.clone()
            }))
            .unwrap();
        assert_eq!(each, inline);
        assert!(
            each.contains("== \\#set 699 \\*x\\* (a\\_b)\n[\\#w] #strong[S] \"699\" \\$|"),
            "{}",
            &each[each.len() - 200..]
        );
        // No items: nothing.
        let none = env
            .get_template("each.typ")
            .unwrap()
            .render(with_fill_each(
                context! { heading => "", items => Vec::<Value>::new(), ..base.clone() },
            ))
            .unwrap();
        assert_eq!(none, "|");
    }

    #[test]
    fn a_part_cannot_fill_parts_in_turn() {
        // Else a part filling itself would never end.
        let built_in: &'static [(&'static str, &'static str)] = &[(
            "self.typ",
            "x{{ fill_each(\"self.typ\", \"item\", items) }}",
        )];
        let err = fill_error(built_in, "self.typ", context! { items => vec![1, 2] });
        let inner = std::iter::successors(Some(&err as &dyn std::error::Error), |e| e.source())
            .filter_map(|e| e.downcast_ref::<Error>())
            .last()
            .unwrap();
        assert_eq!(inner.kind(), ErrorKind::UnknownFunction, "{err:#}");
    }

    #[test]
    fn an_error_in_a_part_names_the_part_and_its_line() {
        let built_in: &'static [(&'static str, &'static str)] = &[
            (
                "main.typ",
                "first line\n{{ fill_each(\"part.typ\", \"item\", items) }}",
            ),
            (
                "part.typ",
                "ok\n{% if item > 5 %}{{ item.no_such_field }}{% endif %}",
            ),
        ];
        let err = fill_error(
            built_in,
            "main.typ",
            context! { items => (0..20).collect::<Vec<i64>>() },
        );
        let words = template_error_msg(&err).english();
        assert!(words.contains("part.typ"), "{words}");
        assert!(words.contains('2'), "{words}");
        // A name a part does not know, and items that are not a list.
        for (ctx, what) in [
            (context! { items => 3 }, "not iterable"),
            (context! { others => 3 }, "undefined"),
        ] {
            let err = fill_error(built_in, "main.typ", ctx);
            assert!(format!("{err:#}").contains(what), "{err:#}");
        }
    }

    /// The error of filling `name` of `built_in` with `base` and
    /// `fill_each`, which must fail.
    fn fill_error(
        built_in: &'static [(&'static str, &'static str)],
        name: &str,
        base: Value,
    ) -> Error {
        template_environment(TemplateSource::embedded(built_in))
            .get_template(name)
            .unwrap()
            .render(with_fill_each(base))
            .unwrap_err()
    }
}
