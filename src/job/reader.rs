//! Reading KDL nodes into typed values while collecting every problem:
//! unknown names with suggestions, missing or repeated entries, wrong value
//! types, bad units and dates, each pointing at its own span.

use crate::kdl_fast::{Doc, Entry, Node, Value};
use chrono::NaiveDate;
use miette::SourceSpan;

use super::decode_error::{DecodeError, suggestion};
use super::model::Spanned;
use crate::catalogue::{Arg, Msg};
use crate::units::{QuantityKind, UnitProblem, parse_quantity};

/// Collects problems while a job file is read.
pub struct Reader<'s> {
    pub source: &'s str,
    pub problems: Vec<DecodeError>,
}

impl<'s> Reader<'s> {
    pub fn new(source: &'s str) -> Self {
        Reader {
            source,
            problems: Vec::new(),
        }
    }

    pub fn push(&mut self, e: DecodeError) {
        self.problems.push(e);
    }

    /// A did-you-mean for the first problems only: past the few that are
    /// printed, working out suggestions for a flood of unknown names would
    /// only cost time.
    pub fn suggest(&self, name: &str, allowed: &[&str]) -> Msg {
        if self.problems.len() < 4 * crate::problem_cap::SHOWN_PROBLEMS {
            suggestion(name, allowed)
        } else {
            Msg::new("diag-allowed-here").arg("names", allowed.join(", "))
        }
    }

    /// The span of a node's name.
    pub fn name_span(node: Node<'_>) -> SourceSpan {
        node.name().span()
    }

    /// Reports child nodes whose names are not in `allowed`; returns the
    /// known ones in order.
    pub fn children<'d>(
        &mut self,
        doc: Option<Doc<'d>>,
        allowed: &[&str],
        context: impl Into<Arg>,
    ) -> Vec<Node<'d>> {
        let context: Arg = context.into();
        let Some(doc) = doc else { return Vec::new() };
        let mut out = Vec::new();
        for node in doc.nodes() {
            let name = node.name().value();
            if allowed.contains(&name) {
                out.push(node);
            } else {
                self.push(
                    DecodeError::error(
                        "job::unknown-node",
                        Self::name_span(node),
                        Msg::new("diag-unknown-node")
                            .arg("name", name)
                            .arg("context", context.clone()),
                        Msg::new("diag-unknown-node-label"),
                    )
                    .with_help(self.suggest(name, allowed)),
                );
            }
        }
        out
    }

    /// Checks a node's properties against `allowed` and its positional
    /// arguments against `max_args`; reports repeats, unknowns and extras.
    pub fn check_entries(&mut self, node: Node<'_>, allowed: &[&str], max_args: usize) {
        let mut seen: Vec<&str> = Vec::new();
        let mut args = 0;
        for entry in node.entries() {
            if let Some(ty) = entry.ty() {
                self.push(
                    DecodeError::error(
                        "job::type-annotation",
                        ty.span(),
                        Msg::new("diag-type-annotation").arg("type", ty.value()),
                        Msg::new("diag-remove-this"),
                    )
                    .with_help(Msg::new("diag-type-annotation-help")),
                );
            }
            match entry.name() {
                Some(name) => {
                    let key = name.value();
                    if !allowed.contains(&key) {
                        let help = if allowed.is_empty() {
                            Msg::new("diag-takes-no-properties").arg("node", node.name().value())
                        } else {
                            self.suggest(key, allowed)
                        };
                        self.push(
                            DecodeError::error(
                                "job::unknown-property",
                                name.span(),
                                Msg::new("diag-unknown-property")
                                    .arg("key", key)
                                    .arg("node", node.name().value()),
                                Msg::new("diag-unknown-property-label"),
                            )
                            .with_help(help),
                        );
                    } else if seen.contains(&key) {
                        self.push(DecodeError::error(
                            "job::repeated-property",
                            name.span(),
                            Msg::new("diag-repeated-property")
                                .arg("key", key)
                                .arg("node", node.name().value()),
                            Msg::new("diag-repeated-here"),
                        ));
                    } else {
                        seen.push(key);
                    }
                }
                None => {
                    args += 1;
                    if args > max_args {
                        let help = if max_args == 0 {
                            Msg::new("diag-takes-no-values").arg("node", node.name().value())
                        } else {
                            Msg::new("diag-takes-values")
                                .arg("node", node.name().value())
                                .arg("count", max_args)
                        };
                        self.push(
                            DecodeError::error(
                                "job::extra-value",
                                entry.span(),
                                Msg::new("diag-extra-value").arg("node", node.name().value()),
                                Msg::new("diag-not-expected-here"),
                            )
                            .with_help(help),
                        );
                    }
                }
            }
        }
    }

    /// Reports children of a node that should have none.
    pub fn no_children(&mut self, node: Node<'_>) {
        if let Some(doc) = node.children()
            && let Some(first) = doc.first()
        {
            self.push(DecodeError::error(
                "job::unexpected-children",
                Self::name_span(first),
                Msg::new("diag-no-children").arg("node", node.name().value()),
                Msg::new("diag-not-expected-here"),
            ));
        }
    }

    pub fn arg(node: Node<'_>, index: usize) -> Option<&Entry<'_>> {
        node.entries()
            .iter()
            .filter(|e| e.name().is_none())
            .nth(index)
    }

    pub fn prop<'n>(node: Node<'n>, key: &str) -> Option<&'n Entry<'n>> {
        node.entries()
            .iter()
            .find(|e| e.name().is_some_and(|n| n.value() == key))
    }

    fn missing(&mut self, node: Node<'_>, what: Arg, example: Arg) {
        self.push(
            DecodeError::error(
                "job::missing",
                Self::name_span(node),
                Msg::new("diag-missing")
                    .arg("node", node.name().value())
                    .arg("what", what.clone()),
                Msg::new("diag-missing-label").arg("what", what),
            )
            .with_help(Msg::new("diag-for-example").arg("example", example)),
        );
    }

    /// The span of an entry's value (after `key=`), for precise underlines.
    pub fn value_span(&self, entry: &Entry<'_>) -> SourceSpan {
        let span = entry.span();
        let start = span.offset();
        let end = (start + span.len()).min(self.source.len());
        let Some(text) = self.source.get(start..end) else {
            return span;
        };
        let mut offset = 0;
        if entry.name().is_some()
            && let Some(eq) = text.find('=')
        {
            offset = eq + 1;
            offset += text[offset..].len() - text[offset..].trim_start().len();
        }
        let value_len = text[offset..].trim_end().len();
        SourceSpan::new((start + offset).into(), value_len)
    }

    /// The span in the source of bytes `start..start + len` of a string
    /// value's text, whose whole value (quotes included) is at `value`.
    /// Escapes and raw-string hashes are followed; where the literal cannot
    /// be followed (a multi-line string, which is dedented), or the part is
    /// empty, the whole value's span.
    pub fn part_span(&self, value: SourceSpan, text: &str, start: usize, len: usize) -> SourceSpan {
        let literal = self
            .source
            .get(value.offset()..value.offset() + value.len());
        match literal.and_then(|l| literal_range(l, text, start, start + len)) {
            Some((a, b)) if len > 0 => SourceSpan::new((value.offset() + a).into(), b - a),
            _ => value,
        }
    }

    // ----- value readers -------------------------------------------------

    pub fn string(&mut self, entry: &Entry<'_>, what: impl Into<Arg>) -> Option<Spanned<String>> {
        match entry.value() {
            Value::String(s) => Some(Spanned::new(s.to_string(), self.value_span(entry))),
            other => {
                let span = self.value_span(entry);
                self.push(
                    DecodeError::error(
                        "job::expected-text",
                        span,
                        Msg::new("diag-expected-text")
                            .arg("what", what)
                            .arg("found", describe(other)),
                        Msg::new("diag-expected-text-label"),
                    )
                    .with_help(Msg::new("diag-expected-text-help").arg("example", plain(other))),
                );
                None
            }
        }
    }

    /// A name such as a valve position (V1) or node (B+1): text, or a
    /// number that is read as text.
    pub fn name(&mut self, entry: &Entry<'_>, what: impl Into<Arg>) -> Option<Spanned<String>> {
        match entry.value() {
            Value::String(s) if !s.trim().is_empty() => {
                Some(Spanned::new(s.trim().to_string(), self.value_span(entry)))
            }
            Value::Integer(i) => Some(Spanned::new(i.to_string(), self.value_span(entry))),
            other => {
                self.push(DecodeError::error(
                    "job::expected-name",
                    self.value_span(entry),
                    Msg::new("diag-expected-name")
                        .arg("what", what)
                        .arg("found", describe(other)),
                    Msg::new("diag-expected-name-label"),
                ));
                None
            }
        }
    }

    pub fn bool(&mut self, entry: &Entry<'_>, what: impl Into<Arg>) -> Option<bool> {
        match entry.value() {
            Value::Bool(b) => Some(*b),
            other => {
                self.push(
                    DecodeError::error(
                        "job::expected-bool",
                        self.value_span(entry),
                        Msg::new("diag-expected-bool")
                            .arg("what", what)
                            .arg("found", describe(other)),
                        Msg::new("diag-expected-bool-label"),
                    )
                    .with_help(Msg::new("diag-expected-bool-help")),
                );
                None
            }
        }
    }

    pub fn integer(
        &mut self,
        entry: &Entry<'_>,
        what: impl Into<Arg>,
        range: std::ops::RangeInclusive<i64>,
    ) -> Option<i64> {
        let value = match entry.value() {
            Value::Integer(i) => i64::try_from(*i).ok(),
            Value::String(s) => s.trim().parse::<i64>().ok(),
            _ => None,
        };
        match value {
            Some(v) if range.contains(&v) => Some(v),
            _ => {
                self.push(DecodeError::error(
                    "job::expected-integer",
                    self.value_span(entry),
                    Msg::new("diag-expected-integer")
                        .arg("what", what)
                        .arg("low", range.start().to_string())
                        .arg("high", range.end().to_string()),
                    Msg::new("diag-expected-integer-label"),
                ));
                None
            }
        }
    }

    /// A quantity: a plain number in the base unit, or text with an SI
    /// prefix or RKM code and an optional unit symbol.
    pub fn quantity(
        &mut self,
        entry: &Entry<'_>,
        kind: QuantityKind,
        what: impl Into<Arg> + Clone,
    ) -> Option<Spanned<f64>> {
        self.quantity_with(entry, kind, || what.clone().into())
    }

    /// [`Reader::quantity`] with the words for what the value is made only
    /// when a problem is reported: a long job reads some forty thousand
    /// readings, each of which named itself in a string of its own.
    fn quantity_with(
        &mut self,
        entry: &Entry<'_>,
        kind: QuantityKind,
        what: impl Fn() -> Arg,
    ) -> Option<Spanned<f64>> {
        let span = self.value_span(entry);
        let value = match entry.value() {
            Value::Integer(i) => Ok(*i as f64),
            Value::Float(f) if f.is_finite() => Ok(*f),
            Value::String(s) => parse_quantity(s, kind).map_err(|e| {
                // Point inside the quotes at the offending part.
                let at = self.part_span(span, s, e.offset, e.len);
                let expected = match &e.problem {
                    UnitProblem::WrongUnit { expected, .. } => *expected,
                    _ => kind,
                };
                (
                    at,
                    Msg::new("diag-bad-value")
                        .arg("what", what())
                        .arg("problem", e.msg()),
                    Msg::new("diag-expected").arg("what", expected.noun_msg()),
                )
            }),
            other => Err((
                span,
                Msg::new("diag-must-be-kind")
                    .arg("what", what())
                    .arg("kind", kind.noun_msg())
                    .arg("found", describe(other)),
                Msg::new("diag-expected").arg("what", kind.noun_msg()),
            )),
        };
        match value {
            Ok(v) if !kind.accepts(v) => {
                let written: Arg = match self.source.get(span.offset()..span.offset() + span.len())
                {
                    Some(w) => w.into(),
                    None => Msg::new("diag-this-value").into(),
                };
                self.push(
                    DecodeError::error(
                        "job::out-of-range",
                        span,
                        Msg::new("diag-out-of-range-kind")
                            .arg("what", what())
                            .arg("written", written)
                            .arg("kind", kind.noun_msg())
                            .arg("range", kind.range_msg()),
                        Msg::new("diag-expected").arg("what", kind.range_msg()),
                    )
                    .with_help(Msg::new("diag-out-of-range-help")),
                );
                None
            }
            Ok(v) => Some(Spanned::new(v, span)),
            Err((at, message, label)) => {
                self.push(
                    DecodeError::error("job::bad-value", at, message, label).with_help(
                        Msg::new("diag-write-kind-as")
                            .arg("kind", kind.noun_msg())
                            .arg("example", kind.example()),
                    ),
                );
                None
            }
        }
    }

    /// A time since power-on in minutes: a plain number of minutes, or text
    /// with a unit, `"30s"`, `"5min"`, `"1.5h"`.
    pub fn minutes(&mut self, entry: &Entry<'_>, what: impl Into<Arg>) -> Option<Spanned<f64>> {
        let span = self.value_span(entry);
        let value = match entry.value() {
            Value::Integer(i) => Some(*i as f64),
            Value::Float(f) if f.is_finite() => Some(*f),
            Value::String(s) => {
                let t = s.trim();
                let split = t
                    .find(|c: char| !(c.is_ascii_digit() || c == '.'))
                    .unwrap_or(t.len());
                let (number, unit) = t.split_at(split);
                let scale = match unit.trim() {
                    "" | "min" | "m" => Some(1.0),
                    "s" => Some(1.0 / 60.0),
                    "h" => Some(60.0),
                    _ => None,
                };
                match (number.parse::<f64>().ok(), scale) {
                    (Some(n), Some(k)) if n.is_finite() => Some(n * k),
                    _ => None,
                }
            }
            _ => None,
        };
        match value {
            Some(v) if (0.0..=24.0 * 60.0).contains(&v) => Some(Spanned::new(v, span)),
            _ => {
                self.push(
                    DecodeError::error(
                        "job::bad-time",
                        span,
                        Msg::new("diag-bad-time").arg("what", what),
                        Msg::new("diag-bad-time-label"),
                    )
                    .with_help(Msg::new("diag-bad-time-help")),
                );
                None
            }
        }
    }

    pub fn date(&mut self, entry: &Entry<'_>, what: impl Into<Arg>) -> Option<Spanned<NaiveDate>> {
        let what: Arg = what.into();
        let span = self.value_span(entry);
        let text = match entry.value() {
            Value::String(s) => &**s,
            other => {
                self.push(
                    DecodeError::error(
                        "job::bad-date",
                        span,
                        Msg::new("diag-date-not-text")
                            .arg("what", what)
                            .arg("found", describe(other)),
                        Msg::new("diag-date-label"),
                    )
                    .with_help(Msg::new("diag-date-help")),
                );
                return None;
            }
        };
        match NaiveDate::parse_from_str(text.trim(), "%Y-%m-%d") {
            Ok(d) => Some(Spanned::new(d, span)),
            Err(e) => {
                self.push(
                    DecodeError::error(
                        "job::bad-date",
                        span,
                        Msg::new("diag-bad-date")
                            .arg("what", what)
                            .arg("text", text)
                            .arg("error", date_problem(&e)),
                        Msg::new("diag-date-label"),
                    )
                    .with_help(Msg::new("diag-bad-date-help")),
                );
                None
            }
        }
    }

    // ----- convenience: required / optional entries -----------------------
    //
    // The words for what is read (`what`, the example, "`key`") are made
    // only when a problem is reported: a long job reads tens of thousands
    // of entries, and each made them before.

    pub fn req_arg_string(
        &mut self,
        node: Node<'_>,
        what: impl Into<Arg>,
        example: impl Into<Arg>,
    ) -> Option<Spanned<String>> {
        match Self::arg(node, 0) {
            Some(e) => self.string(e, what),
            None => {
                self.missing(node, what.into(), example.into());
                None
            }
        }
    }

    pub fn req_arg_name(
        &mut self,
        node: Node<'_>,
        what: impl Into<Arg>,
        example: impl Into<Arg>,
    ) -> Option<Spanned<String>> {
        match Self::arg(node, 0) {
            Some(e) => self.name(e, what),
            None => {
                self.missing(node, what.into(), example.into());
                None
            }
        }
    }

    /// Reports that `node` lacks the property `key`.
    fn missing_prop(&mut self, node: Node<'_>, key: &str, example: Arg) {
        let what = Msg::new("diag-a-property").arg("key", key).into();
        self.missing(node, what, example);
    }

    pub fn req_prop_string(
        &mut self,
        node: Node<'_>,
        key: &str,
        example: impl Into<Arg>,
    ) -> Option<Spanned<String>> {
        match Self::prop(node, key) {
            Some(e) => self.string(e, Backticked(key)),
            None => {
                self.missing_prop(node, key, example.into());
                None
            }
        }
    }

    pub fn opt_prop_string(&mut self, node: Node<'_>, key: &str) -> Option<String> {
        Self::prop(node, key)
            .and_then(|e| self.string(e, Backticked(key)))
            .map(|s| s.value)
    }

    pub fn req_prop_name(
        &mut self,
        node: Node<'_>,
        key: &str,
        example: &str,
    ) -> Option<Spanned<String>> {
        match Self::prop(node, key) {
            Some(e) => self.name(e, Backticked(key)),
            None => {
                self.missing_prop(node, key, example.into());
                None
            }
        }
    }

    pub fn req_prop_quantity(
        &mut self,
        node: Node<'_>,
        key: &str,
        kind: QuantityKind,
        example: &str,
    ) -> Option<Spanned<f64>> {
        match Self::prop(node, key) {
            Some(e) => self.quantity_with(e, kind, || Backticked(key).into()),
            None => {
                self.missing_prop(node, key, example.into());
                None
            }
        }
    }

    pub fn opt_prop_quantity(
        &mut self,
        node: Node<'_>,
        key: &str,
        kind: QuantityKind,
    ) -> Option<Spanned<f64>> {
        Self::prop(node, key).and_then(|e| self.quantity_with(e, kind, || Backticked(key).into()))
    }

    pub fn opt_prop_bool(&mut self, node: Node<'_>, key: &str) -> Option<bool> {
        Self::prop(node, key).and_then(|e| self.bool(e, Backticked(key)))
    }

    pub fn opt_prop_date(&mut self, node: Node<'_>, key: &str) -> Option<Spanned<NaiveDate>> {
        Self::prop(node, key).and_then(|e| self.date(e, Backticked(key)))
    }

    /// Rejects a value outside `lo..=hi`, a narrower range than its kind's
    /// that the field's meaning sets (`why` says which).
    pub fn within(
        &mut self,
        v: Option<Spanned<f64>>,
        what: impl Into<Arg>,
        (lo, hi): (f64, f64),
        words: impl Into<Arg>,
        why: impl Into<super::decode_error::Text>,
    ) -> Option<Spanned<f64>> {
        let v = v?;
        if (lo..=hi).contains(&v.value) {
            return Some(v);
        }
        let words: Arg = words.into();
        self.push(
            DecodeError::error(
                "job::out-of-range",
                v.span,
                Msg::new("diag-must-be-from")
                    .arg("what", what)
                    .arg("range", words.clone()),
                Msg::new("diag-expected").arg("what", words),
            )
            .with_help(why),
        );
        None
    }

    /// Rejects negative (and optionally zero) values of physical quantities.
    pub fn positive(
        &mut self,
        v: Option<Spanned<f64>>,
        what: impl Into<Arg>,
        allow_zero: bool,
    ) -> Option<Spanned<f64>> {
        self.positive_or(v, what, allow_zero, Msg::new("diag-impossible-help"))
    }

    /// [`Reader::positive`] with its own help for a value out of range (a
    /// reading that can only be below zero when the meter's leads were
    /// the wrong way round says so).
    pub fn positive_or(
        &mut self,
        v: Option<Spanned<f64>>,
        what: impl Into<Arg>,
        allow_zero: bool,
        help: Msg,
    ) -> Option<Spanned<f64>> {
        let v = v?;
        let bad = if allow_zero {
            v.value < 0.0
        } else {
            v.value <= 0.0
        };
        if bad {
            self.push(
                DecodeError::error(
                    "job::impossible-value",
                    v.span,
                    Msg::new(if v.value < 0.0 {
                        "diag-cannot-be-negative"
                    } else {
                        "diag-cannot-be-zero"
                    })
                    .arg("what", what),
                    Msg::new(if allow_zero {
                        "diag-zero-or-more"
                    } else {
                        "diag-more-than-zero"
                    }),
                )
                .with_help(help),
            );
            return None;
        }
        Some(v)
    }
}

/// A property's key as the words for what it holds, "`key`", made into
/// text only when a problem names it.
struct Backticked<'k>(&'k str);

impl From<Backticked<'_>> for Arg {
    fn from(key: Backticked<'_>) -> Arg {
        format!("`{}`", key.0).into()
    }
}

/// What a value was, in words: "the text \"x\"", "the number 3", "#true".
pub(crate) fn describe(v: &Value<'_>) -> Arg {
    match v {
        Value::String(s) => Msg::new("diag-found-text").arg("text", &**s).into(),
        Value::Integer(i) => Msg::new("diag-found-number")
            .arg("number", i.to_string())
            .into(),
        Value::Float(f) => Msg::new("diag-found-number")
            .arg("number", f.to_string())
            .into(),
        Value::Bool(b) => format!("#{b}").into(),
        Value::Null => "#null".into(),
    }
}

fn plain(v: &Value<'_>) -> String {
    match v {
        Value::String(s) => s.to_string(),
        Value::Integer(i) => i.to_string(),
        Value::Float(f) => f.to_string(),
        Value::Bool(b) => b.to_string(),
        Value::Null => String::new(),
    }
}

/// Maps bytes `start..end` of a string value's text to bytes of its source
/// `literal` (the value as written, quotes included). Follows KDL 2.0
/// escapes in quoted strings and the hashes of raw strings; `None` for
/// multi-line strings or anything that does not decode to `text`.
fn literal_range(literal: &str, text: &str, start: usize, end: usize) -> Option<(usize, usize)> {
    if start > end || end > text.len() {
        return None;
    }
    let hashes = literal.bytes().take_while(|&b| b == b'#').count();
    let after_hashes = literal.get(hashes..)?;
    if after_hashes.starts_with("\"\"\"") || !after_hashes.starts_with('"') {
        return None;
    }
    let open = hashes + 1;
    if hashes > 0 {
        // A raw string holds its text verbatim.
        return (literal.get(open..open + text.len())? == text)
            .then_some((open + start, open + end));
    }
    // (offset in text, offset in literal) of each decoded character.
    let mut starts: Vec<(usize, usize)> = Vec::new();
    let mut decoded = String::new();
    let body = &literal[open..];
    let mut chars = body.char_indices().peekable();
    let close = loop {
        let (i, c) = chars.next()?;
        let at = open + i;
        match c {
            '"' => break at,
            '\\' => {
                let (_, e) = chars.next()?;
                let produced = match e {
                    'n' => Some('\n'),
                    'r' => Some('\r'),
                    't' => Some('\t'),
                    '\\' => Some('\\'),
                    '"' => Some('"'),
                    'b' => Some('\u{8}'),
                    'f' => Some('\u{c}'),
                    's' => Some(' '),
                    'u' => {
                        if chars.next()?.1 != '{' {
                            return None;
                        }
                        let mut hex = String::new();
                        loop {
                            let (_, h) = chars.next()?;
                            if h == '}' {
                                break;
                            }
                            hex.push(h);
                        }
                        Some(char::from_u32(u32::from_str_radix(&hex, 16).ok()?)?)
                    }
                    w if w.is_whitespace() => {
                        // Whitespace escape: the escape and all whitespace after it vanish.
                        while chars.peek().is_some_and(|&(_, c)| c.is_whitespace()) {
                            chars.next();
                        }
                        None
                    }
                    _ => return None,
                };
                if let Some(p) = produced {
                    starts.push((decoded.len(), at));
                    decoded.push(p);
                }
            }
            c => {
                starts.push((decoded.len(), at));
                decoded.push(c);
            }
        }
    };
    if decoded != text {
        return None;
    }
    let source_of = |offset: usize| {
        if offset == text.len() {
            Some(close)
        } else {
            starts.iter().find(|&&(t, _)| t == offset).map(|&(_, l)| l)
        }
    };
    Some((source_of(start)?, source_of(end)?))
}

/// What the date reader (chrono) found wrong with a date, in the
/// catalogue's words (`diag-date-…`).
fn date_problem(e: &chrono::ParseError) -> Msg {
    use chrono::format::ParseErrorKind as K;
    Msg::new(match e.kind() {
        K::OutOfRange | K::Impossible => "diag-date-out-of-range",
        K::NotEnough | K::TooShort => "diag-date-too-short",
        K::TooLong => "diag-date-too-long",
        _ => "diag-date-not-ymd",
    })
}

#[cfg(test)]
mod tests {
    use super::literal_range;

    #[test]
    fn parts_of_plain_escaped_and_raw_strings_map_to_the_source() {
        // Plain: text "38.5mA" in "\"38.5mA\"", the "A" at 5 is at 6 in the source.
        assert_eq!(literal_range("\"38.5mA\"", "38.5mA", 5, 6), Some((6, 7)));
        // An escaped newline takes two source bytes for one of text.
        assert_eq!(literal_range("\"\\nµµA\"", "\nµµA", 5, 6), Some((7, 8)));
        // A unicode escape for µ (U+00B5): one char of text, eight bytes of source.
        assert_eq!(literal_range("\"1\\u{b5}A\"", "1µA", 3, 4), Some((8, 9)));
        // A whitespace escape vanishes.
        assert_eq!(
            literal_range("\"V3 \\   V4\"", "V3 V4", 3, 5),
            Some((8, 10))
        );
        // Raw strings: the hashes and quote shift everything.
        assert_eq!(literal_range("##\"3µ0mA\"##", "3µ0mA", 5, 6), Some((8, 9)));
        // Names after a tab escape; the end of the text maps to the closing quote.
        assert_eq!(literal_range("\"\\tµµ V3\"", "\tµµ V3", 1, 5), Some((3, 7)));
        assert_eq!(
            literal_range("\"\\tµµ V3\"", "\tµµ V3", 6, 8),
            Some((8, 10))
        );
    }

    #[test]
    fn literals_that_cannot_be_followed_give_none() {
        assert_eq!(literal_range("\"\"\"\n  4k7\n  \"\"\"", "4k7", 0, 3), None);
        assert_eq!(literal_range("(u8)\"1\"", "1", 0, 1), None);
        assert_eq!(literal_range("\"abc\"", "abd", 0, 1), None);
        assert_eq!(literal_range("\"abc\"", "abc", 2, 9), None);
        assert_eq!(literal_range("\"ab", "ab", 0, 1), None);
    }
}
