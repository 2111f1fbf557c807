//! The message catalogue: every fixed sentence and label the program shows a
//! reader (the hand-over document, the mains-safety notice, the terminal,
//! the JSON reason strings) is looked up here by key, so a shop can have
//! its documents in another language without touching a template.
//!
//! Catalogues are Fluent files (`.ftl`, Project Fluent's syntax, read by the
//! `fluent-bundle` crate): English (`messages/en.ftl`) is the reference and
//! is built in, as is German (`messages/de.ftl`). A shop profile may name a
//! language and a translation file of its own; a translation must give
//! every key the English catalogue has, use no argument the English message
//! does not pass, and contain the mains-safety notice whole. Every problem
//! is reported at `file:line:column` like a job file's.

mod check;

use rustc_hash::FxHashMap;
use std::collections::BTreeMap;
use std::sync::{Arc, OnceLock};

use chrono::{Datelike, NaiveDate};
use fluent_bundle::concurrent::FluentBundle;
use fluent_bundle::{FluentArgs, FluentResource, FluentValue};

pub use check::{CatalogueDiagnostics, check_translation};

/// The built-in English catalogue, the reference every translation is
/// checked against.
pub const ENGLISH: &str = include_str!("../../messages/en.ftl");

/// The built-in German catalogue (needs a native speaker's review).
pub const GERMAN: &str = include_str!("../../messages/de.ftl");

/// The languages built into the program, by tag, with their catalogues.
pub const BUILT_IN: &[(&str, &str)] = &[("en", ENGLISH), ("de", GERMAN)];

/// The keys of the mains-safety notice: a translation gives all of them or
/// is refused, so the notice is never half in one language.
pub const NOTICE_KEYS: &[&str] = &[
    "notice-heading",
    "notice-deadly-title",
    "notice-deadly",
    "notice-stored-title",
    "notice-stored",
    "notice-who-title",
    "notice-who",
    "notice-earth-title",
    "notice-earth",
    "notice-fuses-title",
    "notice-fuses",
    "notice-document-title",
    "notice-document",
    "notice-codes-title",
    "notice-codes",
    "notice-check-opening",
    "notice-check-closing",
];

/// A catalogue ready for lookups. Cheap to clone.
#[derive(Clone)]
pub struct Catalogue {
    inner: Arc<Inner>,
}

struct Inner {
    /// The language tag ("en", "de").
    language: String,
    /// Where the messages came from, for messages ("built-in", a path).
    origin: String,
    /// The messages, in parts: a translation file is one part, read when
    /// the catalogue is made; a built-in catalogue is cut into its
    /// message groups at build time ([`BUILT_IN_PARTS`]: `doc-…`,
    /// `diag-…`, `cli-wrote-…`), and each part is parsed the first time
    /// one of its messages is asked for (a render says none of the
    /// diagnostics, and Fluent's parse of them was a seventh of its own
    /// instructions). No message of a built-in catalogue refers to
    /// another message or term (a test holds them to that), so a part
    /// says its messages alone exactly as the whole catalogue would.
    parts: Parts,
}

/// The messages of a catalogue, whole or by part. (One lives in each
/// catalogue's `Arc`, so the variants' sizes do not matter.)
#[allow(clippy::large_enum_variant)]
enum Parts {
    /// A translation file: every message in one bundle.
    Whole(Part),
    /// A built-in catalogue, each part built on first use.
    BuiltIn {
        language: &'static str,
        /// One for each part of `texts`, in the same order.
        parts: Box<[OnceLock<Part>]>,
        /// The part that holds no message, for a key of no group.
        none: OnceLock<Part>,
        texts: &'static [(&'static str, &'static str)],
        /// Where each group's part is in `texts`: a long job looks up
        /// some 270 keys a set, and a binary search of the groups was a
        /// seventh of deriving one.
        index: FxHashMap<&'static str, usize>,
    },
}

// `BUILT_IN_PARTS`: each built-in catalogue by language tag, cut into its
// message groups by `build.rs` (`catalogue_parts`), as (group, text) in
// order of the groups.
include!(concat!(env!("OUT_DIR"), "/catalogue_parts.rs"));

/// The group of a message key as `build.rs` cut the built-in catalogues
/// (`message_group` there): its first word, or its first two for the
/// terminal's messages (`cli-…`).
///
/// Found by looking for the hyphens byte by byte (a key is looked up some
/// 270 times for each set of a long job, and splitting it was a tenth of
/// deriving one; `group_of_is_the_first_words` holds it to the split).
fn group_of(key: &str) -> &str {
    let hyphen = |from: usize| key.as_bytes()[from..].iter().position(|&b| b == b'-');
    let Some(first) = hyphen(0) else {
        return key;
    };
    if &key[..first] != "cli" {
        return &key[..first];
    }
    match hyphen(first + 1) {
        Some(second) => &key[..first + 1 + second],
        None => key,
    }
}

/// One bundle of messages with their patterns.
struct Part {
    bundle: FluentBundle<FluentResource>,
    /// Every message with a value, by key, with its pattern worked out
    /// once when the pattern is plain text and arguments (see [`Pattern`]).
    /// Hashed with rustc-hash's FxHash rather than the standard SipHash:
    /// the keys are the catalogue's own, a long job looks up some 270 a
    /// set, and SipHash was 8 % of deriving one (docs/performance.md,
    /// "Seventh pass").
    patterns: FxHashMap<Box<str>, Pattern>,
}

impl Part {
    /// The part for `text`, and whether Fluent found no problem in it
    /// (else the part holds the messages it could read, which a built-in
    /// part read on first use keeps).
    fn build(language: &str, text: &str) -> (Part, bool) {
        let (resource, clean) = match FluentResource::try_new(text.to_owned()) {
            Ok(resource) => (resource, true),
            Err((resource, _)) => (resource, false),
        };
        // Each message's pattern read from the resource as it is parsed
        // (the bundle below refuses a resource that names a message
        // twice, so these are the patterns the bundle holds).
        let mut patterns =
            FxHashMap::with_capacity_and_hasher(resource.entries().count(), Default::default());
        for entry in resource.entries() {
            if let fluent_syntax::ast::Entry::Message(m) = entry
                && let Some(pattern) = &m.value
            {
                let pattern = plain_pattern(pattern).map_or(Pattern::Fluent, Pattern::Plain);
                patterns.insert(Box::from(m.id.name), pattern);
            }
        }
        let id: unic_langid::LanguageIdentifier = language.parse().unwrap_or_default();
        let mut bundle = FluentBundle::new_concurrent(vec![id]);
        // No Unicode isolation marks around arguments: the text goes to a
        // terminal, JSON and a PDF, where they would show as stray bytes.
        bundle.set_use_isolating(false);
        let added = bundle.add_resource(resource).is_ok();
        let part = Part { bundle, patterns };
        (part, clean && added)
    }
}

impl Inner {
    /// The part that holds `key` (built now if it was not yet).
    fn part(&self, key: &str) -> &Part {
        match &self.parts {
            Parts::Whole(part) => part,
            Parts::BuiltIn {
                language,
                parts,
                none,
                texts,
                index,
            } => {
                // A built-in part parses without a problem (tested);
                // were it not so, the messages Fluent could read are
                // used and the others said as missing.
                let group = group_of(key);
                match index.get(group) {
                    Some(&i) => parts[i].get_or_init(|| Part::build(language, texts[i].1).0),
                    None => none.get_or_init(|| Part::build(language, "").0),
                }
            }
        }
    }
}

/// A message of a catalogue, looked up: [`Catalogue::message`].
#[derive(Clone, Copy)]
pub struct Message<'a> {
    key: &'a str,
    part: &'a Part,
    /// `None` when the catalogue has no such message (or it has no value).
    pattern: Option<&'a Pattern>,
}

impl Message<'_> {
    /// The words [`Catalogue::format_str`] says for this message's key.
    pub fn format_str(&self, args: &[(&str, &str)]) -> String {
        self.try_format_str(args)
            .unwrap_or_else(|| format!("[{}]", self.key))
    }

    /// The words [`Catalogue::try_format_str`] says for this message's key.
    pub fn try_format_str(&self, args: &[(&str, &str)]) -> Option<String> {
        if let Pattern::Plain(pieces) = self.pattern?
            && let Some(words) = say_plain_str(pieces, args)
        {
            return Some(words);
        }
        let bundle = &self.part.bundle;
        let pattern = bundle.get_message(self.key)?.value()?;
        let mut fargs = FluentArgs::with_capacity(args.len());
        for (name, value) in args {
            fargs.set(*name, FluentValue::from(*value));
        }
        let mut errors = Vec::new();
        let words = bundle.format_pattern(pattern, Some(&fargs), &mut errors);
        Some(words.into_owned())
    }

    /// Whether the message's words may use the argument `name`: false only
    /// for a plain pattern (text and arguments) that does not name it, or
    /// for a missing message, so an argument's words need not be made for
    /// a message that leaves them out. Any other pattern may use it.
    pub fn uses(&self, name: &str) -> bool {
        match self.pattern {
            None => false,
            Some(Pattern::Plain(pieces)) => pieces
                .iter()
                .any(|p| matches!(p, Piece::Argument(a) if &**a == name)),
            Some(Pattern::Fluent) => true,
        }
    }
}

/// A message's pattern as [`Catalogue::try_format`] uses it.
enum Pattern {
    /// Text and `{ $name }` arguments only: no select, no reference to
    /// another message or term, no literal, no function. Said by joining
    /// the pieces, with each text argument written as it is, which is
    /// what Fluent writes for such a pattern (isolation marks are off and
    /// the bundle has no transform or formatter).
    Plain(Box<[Piece]>),
    /// Anything else: said by Fluent.
    Fluent,
}

/// A piece of a [`Pattern::Plain`].
enum Piece {
    Text(Box<str>),
    Argument(Box<str>),
}

/// A plain pattern's words with text arguments, or `None` when an
/// argument it names is missing (Fluent then says it). An argument given
/// twice counts as its last value, as in Fluent's arguments.
fn say_plain_str(pieces: &[Piece], args: &[(&str, &str)]) -> Option<String> {
    // Room for every piece and argument at once, as `say_plain` makes.
    let room = pieces
        .iter()
        .map(|p| match p {
            Piece::Text(text) => text.len(),
            Piece::Argument(_) => 0,
        })
        .sum::<usize>()
        + args.iter().map(|(_, v)| v.len()).sum::<usize>();
    let mut words = String::with_capacity(room);
    for piece in pieces {
        match piece {
            Piece::Text(text) => words.push_str(text),
            Piece::Argument(name) => words.push_str(argument(args, name)?),
        }
    }
    Some(words)
}

/// The value of the argument `name` (its last, if given twice).
fn argument<'a>(args: &[(&str, &'a str)], name: &str) -> Option<&'a str> {
    // Compared byte by byte: the names are a few letters, shorter than
    // the call a slice comparison makes.
    let same = |a: &str| a.len() == name.len() && a.bytes().zip(name.bytes()).all(|(x, y)| x == y);
    args.iter().rev().find(|(n, _)| same(n)).map(|(_, v)| *v)
}

/// The pattern as plain pieces, or `None` when Fluent must say it.
fn plain_pattern(pattern: &fluent_syntax::ast::Pattern<&str>) -> Option<Box<[Piece]>> {
    use fluent_syntax::ast::{Expression, InlineExpression, PatternElement};
    pattern
        .elements
        .iter()
        .map(|element| match element {
            PatternElement::TextElement { value } => Some(Piece::Text((*value).into())),
            PatternElement::Placeable {
                expression: Expression::Inline(InlineExpression::VariableReference { id }),
            } => Some(Piece::Argument(id.name.into())),
            PatternElement::Placeable { .. } => None,
        })
        .collect()
}

impl std::fmt::Debug for Catalogue {
    fn fmt(&self, f: &mut std::fmt::Formatter<'_>) -> std::fmt::Result {
        f.debug_struct("Catalogue")
            .field("language", &self.inner.language)
            .field("origin", &self.inner.origin)
            .finish()
    }
}

/// Two catalogues are equal when they are the same one, or the same
/// built-in language.
impl PartialEq for Catalogue {
    fn eq(&self, other: &Self) -> bool {
        Arc::ptr_eq(&self.inner, &other.inner)
            || (self.inner.origin == "built-in"
                && other.inner.origin == "built-in"
                && self.inner.language == other.inner.language)
    }
}

impl Default for Catalogue {
    fn default() -> Self {
        Catalogue::english().clone()
    }
}

/// One argument of a message: text, a number (which plural forms can
/// select on), or another message, said in the same language.
#[derive(Debug, Clone, PartialEq)]
pub enum Arg {
    Text(String),
    Number(f64),
    Message(Box<Msg>),
}

/// A message not yet said: its key and its arguments. Diagnostics carry
/// their words this way, so they can be said in the reader's language once
/// it is known (the shop profile is read after some of them are made).
#[derive(Debug, Clone, PartialEq)]
pub struct Msg {
    pub key: &'static str,
    pub args: Vec<(&'static str, Arg)>,
}

impl Msg {
    /// The message `key` with no arguments.
    pub fn new(key: &'static str) -> Msg {
        Msg {
            key,
            args: Vec::new(),
        }
    }

    /// The message with one more argument.
    pub fn arg(mut self, name: &'static str, value: impl Into<Arg>) -> Msg {
        self.args.push((name, value.into()));
        self
    }

    /// The words in English, the reference.
    pub fn english(&self) -> String {
        Catalogue::english().say(self)
    }
}

impl From<Msg> for Arg {
    fn from(m: Msg) -> Self {
        Arg::Message(Box::new(m))
    }
}

impl From<&str> for Arg {
    fn from(s: &str) -> Self {
        Arg::Text(s.to_owned())
    }
}
impl From<String> for Arg {
    fn from(s: String) -> Self {
        Arg::Text(s)
    }
}
impl From<&String> for Arg {
    fn from(s: &String) -> Self {
        Arg::Text(s.clone())
    }
}
impl From<usize> for Arg {
    fn from(n: usize) -> Self {
        Arg::Number(n as f64)
    }
}
impl From<i64> for Arg {
    fn from(n: i64) -> Self {
        Arg::Number(n as f64)
    }
}
impl From<f64> for Arg {
    fn from(n: f64) -> Self {
        Arg::Number(n)
    }
}

/// The operating system's answer to a failed file operation as a
/// catalogue message, so it is said in the reader's language: the common
/// kinds (no such file, permission denied, a folder where a file belongs,
/// too large, invalid data, …) by words of the catalogue (`diag-os-…`),
/// any other quoted as the system gave it (`diag-os-other`). Invalid data
/// keeps the words of whatever found it as a detail, since they say what
/// was wrong.
pub fn os_error(e: &std::io::Error) -> Msg {
    use std::io::ErrorKind as K;
    let key = match e.kind() {
        K::NotFound => "diag-os-not-found",
        K::PermissionDenied => "diag-os-permission-denied",
        K::IsADirectory => "diag-os-is-a-folder",
        K::NotADirectory => "diag-os-not-a-folder",
        K::FileTooLarge => "diag-os-too-large",
        K::AlreadyExists => "diag-os-already-exists",
        K::StorageFull | K::QuotaExceeded => "diag-os-disk-full",
        K::ReadOnlyFilesystem => "diag-os-read-only",
        K::UnexpectedEof => "diag-os-ended-early",
        K::Interrupted => "diag-os-interrupted",
        K::TimedOut => "diag-os-timed-out",
        K::BrokenPipe => "diag-os-broken-pipe",
        K::OutOfMemory => "diag-os-out-of-memory",
        K::InvalidData => {
            return Msg::new("diag-os-invalid-data").arg("detail", e.to_string());
        }
        _ => return Msg::new("diag-os-other").arg("detail", e.to_string()),
    };
    Msg::new(key)
}

/// A message as a standard error, to travel inside a third-party error as
/// its source (a template engine's error) and be found again by the code
/// that says it; its `Display` is English.
#[derive(Debug, Clone)]
pub struct MsgError(pub Msg);

impl std::fmt::Display for MsgError {
    fn fmt(&self, f: &mut std::fmt::Formatter<'_>) -> std::fmt::Result {
        f.write_str(&self.0.english())
    }
}

impl std::error::Error for MsgError {}

impl Catalogue {
    /// The built-in English catalogue.
    pub fn english() -> &'static Catalogue {
        static ENGLISH_CATALOGUE: OnceLock<Catalogue> = OnceLock::new();
        ENGLISH_CATALOGUE
            .get_or_init(|| Catalogue::built_in_parts("en").expect("English is built in, in parts"))
    }

    /// A built-in catalogue by language tag ("en", "de"; case and region
    /// ignored: "de-AT" gets German).
    pub fn built_in(language: &str) -> Option<Catalogue> {
        let primary = primary_subtag(language);
        if primary == "en" {
            return Some(Catalogue::english().clone());
        }
        Catalogue::built_in_parts(&primary)
    }

    /// A catalogue from a translation file's text, checked against English
    /// first ([`check_translation`]): every key present, no unknown key or
    /// argument, the notice whole. `name` names the file in messages.
    pub fn from_translation(
        language: &str,
        name: &str,
        text: &str,
    ) -> Result<Catalogue, CatalogueDiagnostics> {
        check_translation(name, text)?;
        Catalogue::build(&primary_subtag(language), name, text).map_err(|_| {
            // check_translation parsed the same text without an error.
            check::single(name, text, Msg::new("diag-ftl-unreadable"))
        })
    }

    fn build(language: &str, origin: &str, text: &str) -> Result<Catalogue, ()> {
        let (part, clean) = Part::build(language, text);
        if !clean {
            return Err(());
        }
        Ok(Catalogue {
            inner: Arc::new(Inner {
                language: language.to_owned(),
                origin: origin.to_owned(),
                parts: Parts::Whole(part),
            }),
        })
    }

    /// A built-in catalogue by its exact tag, its parts built on first use.
    fn built_in_parts(tag: &str) -> Option<Catalogue> {
        let (language, texts) = BUILT_IN_PARTS.iter().find(|(t, _)| *t == tag)?;
        Some(Catalogue {
            inner: Arc::new(Inner {
                language: (*language).to_owned(),
                origin: "built-in".to_owned(),
                parts: Parts::BuiltIn {
                    language,
                    parts: texts.iter().map(|_| OnceLock::new()).collect(),
                    none: OnceLock::new(),
                    texts,
                    index: texts
                        .iter()
                        .enumerate()
                        .map(|(i, (g, _))| (*g, i))
                        .collect(),
                },
            }),
        })
    }

    /// The language tag: "en", "de".
    pub fn language(&self) -> &str {
        &self.inner.language
    }

    /// Where the messages came from: "built-in" or the translation file.
    pub fn origin(&self) -> &str {
        &self.inner.origin
    }

    /// Whether the catalogue has a message for `key`.
    pub fn has(&self, key: &str) -> bool {
        self.inner.part(key).bundle.has_message(key)
    }

    /// The message `key` without arguments.
    pub fn text(&self, key: &str) -> String {
        self.format(key, &[])
    }

    /// The message `key` with its arguments. A key the catalogue lacks (a
    /// program error: tests check that every key used exists in English,
    /// and translations are checked complete when read) gives the key in
    /// brackets rather than a panic.
    pub fn format(&self, key: &str, args: &[(&str, Arg)]) -> String {
        self.try_format(key, args)
            .unwrap_or_else(|| format!("[{key}]"))
    }

    /// A message not yet said ([`Msg`]), said in this catalogue's language,
    /// its message arguments too.
    pub fn say(&self, msg: &Msg) -> String {
        self.format(msg.key, &msg.args)
    }

    /// The message `key` with its arguments, or `None` when there is no
    /// such message.
    pub fn try_format(&self, key: &str, args: &[(&str, Arg)]) -> Option<String> {
        let part = self.inner.part(key);
        if let Pattern::Plain(pieces) = part.patterns.get(key)?
            && let Some(words) = self.say_plain(pieces, args)
        {
            return Some(words);
        }
        self.fluent_format(part, key, args)
    }

    /// The message `key` with text arguments only, borrowed: the words
    /// [`Catalogue::format`] says with each argument as [`Arg::Text`],
    /// without making a `String` of each argument first (derive says its
    /// reasons and briefs by the hundred thousand on a long job, most with
    /// two to four figures in words that it has at hand).
    pub fn format_str(&self, key: &str, args: &[(&str, &str)]) -> String {
        self.try_format_str(key, args)
            .unwrap_or_else(|| format!("[{key}]"))
    }

    /// [`Catalogue::format_str`], or `None` when there is no such message.
    pub fn try_format_str(&self, key: &str, args: &[(&str, &str)]) -> Option<String> {
        self.message(key).try_format_str(args)
    }

    /// The message `key` looked up, to be said once or many times
    /// ([`Message::format_str`]): a caller that says one message over and
    /// over (derive, some hundred thousand sentences on a long job) looks
    /// it up once rather than each time.
    pub fn message<'a>(&'a self, key: &'a str) -> Message<'a> {
        let part = self.inner.part(key);
        Message {
            key,
            part,
            pattern: part.patterns.get(key),
        }
    }

    /// A plain pattern's words, or `None` when an argument it names is
    /// missing or a number (whose printed form is Fluent's to decide), so
    /// that Fluent says it. An argument given twice counts as its last
    /// value, as in Fluent's arguments.
    fn say_plain(&self, pieces: &[Piece], args: &[(&str, Arg)]) -> Option<String> {
        // Room for every piece and argument at once: the words are made
        // by the hundred per set of a long job, and growing the string a
        // piece at a time copied them over and over.
        let room = pieces
            .iter()
            .map(|p| match p {
                Piece::Text(text) => text.len(),
                Piece::Argument(_) => 0,
            })
            .sum::<usize>()
            + args
                .iter()
                .map(|(_, a)| match a {
                    Arg::Text(s) => s.len(),
                    _ => 16,
                })
                .sum::<usize>();
        let mut words = String::with_capacity(room);
        for piece in pieces {
            match piece {
                Piece::Text(text) => words.push_str(text),
                Piece::Argument(name) => match args.iter().rev().find(|(n, _)| *n == &**name)?.1 {
                    Arg::Text(ref s) => words.push_str(s),
                    Arg::Message(ref m) => words.push_str(&self.say(m)),
                    Arg::Number(_) => return None,
                },
            }
        }
        Some(words)
    }

    /// The message `key` said by Fluent, or `None` when there is no such
    /// message.
    fn fluent_format(&self, part: &Part, key: &str, args: &[(&str, Arg)]) -> Option<String> {
        let bundle = &part.bundle;
        let pattern = bundle.get_message(key)?.value()?;
        let mut fargs = FluentArgs::new();
        for (name, value) in args {
            match value {
                Arg::Text(s) => fargs.set(*name, FluentValue::from(s.as_str())),
                Arg::Number(n) => fargs.set(*name, FluentValue::from(*n)),
                Arg::Message(m) => fargs.set(*name, FluentValue::from(self.say(m))),
            }
        }
        let mut errors = Vec::new();
        let words = bundle.format_pattern(pattern, Some(&fargs), &mut errors);
        Some(words.into_owned())
    }

    /// A date in words: "9 November 2026", "9. November 2026".
    pub fn date(&self, d: NaiveDate) -> String {
        let month = self.text(&format!("month-{}", d.month()));
        self.format(
            "date",
            &[
                ("day", Arg::Text(d.day().to_string())),
                ("month", Arg::Text(month)),
                ("year", Arg::Text(d.year().to_string())),
            ],
        )
    }

    /// A list in words: "B+1", "B+1 and B+2", "V3, V4 and V5" (the last
    /// pair joined by `list-and`, the rest by commas).
    pub fn and_list<S: AsRef<str>>(&self, items: &[S]) -> String {
        match items {
            [] => String::new(),
            [one] => one.as_ref().to_owned(),
            [rest @ .., last] => {
                let first: Vec<&str> = rest.iter().map(|s| s.as_ref()).collect();
                self.format(
                    "list-and",
                    &[
                        ("first", Arg::from(first.join(", "))),
                        ("last", Arg::from(last.as_ref())),
                    ],
                )
            }
        }
    }

    /// Every message of the catalogue without arguments that a template
    /// may print as a label, by key.
    pub fn keys(&self) -> Vec<String> {
        message_lines(ENGLISH).into_keys().collect()
    }
}

/// "de-AT" → "de".
fn primary_subtag(tag: &str) -> String {
    tag.split(['-', '_'])
        .next()
        .unwrap_or("")
        .to_ascii_lowercase()
}

/// The message keys of a catalogue's text with the byte offset of each
/// definition: a line that starts with an identifier and `=`.
pub(crate) fn message_lines(text: &str) -> BTreeMap<String, usize> {
    let mut keys = BTreeMap::new();
    let mut offset = 0;
    for line in text.split_inclusive('\n') {
        if line.starts_with(|c: char| c.is_ascii_alphabetic())
            && let Some((id, _)) = line.split_once('=')
        {
            let id = id.trim();
            if id
                .chars()
                .all(|c| c.is_ascii_alphanumeric() || c == '-' || c == '_')
            {
                keys.entry(id.to_owned()).or_insert(offset);
            }
        }
        offset += line.len();
    }
    keys
}

#[cfg(test)]
mod tests;
