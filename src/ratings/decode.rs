//! Reading the KDL text of a ratings file into drafts, one per `valve`
//! node, collecting every problem on the way instead of stopping at the
//! first. Nothing here panics, whatever the input.

use kdl::{KdlDocument, KdlEntry, KdlIdentifier, KdlNode, KdlValue};
use miette::SourceSpan;

use super::class::{RectifierHeating, ValveClass};
use super::diagnostic::RatingProblem;
use super::draft::Draft;
use super::rating::Heater;
use crate::units::{Amps, Ohms, QuantityKind, UnitProblem, Volts, Watts, parse_quantity};

/// The format version this program reads.
pub const FORMAT_VERSION: i128 = 1;

/// The nodes allowed at the top of a ratings file.
const TOP_NODES: [&str; 2] = ["ratings-format", "valve"];

/// The nodes allowed inside a `valve` block.
pub const FIELDS: [&str; 18] = [
    "equivalents",
    "class",
    "sections",
    "plate-dissipation",
    "design-max-plate-dissipation",
    "screen-dissipation",
    "plate-voltage",
    "screen-voltage",
    "cathode-current",
    "output-current",
    "rectifier-heating",
    "heater",
    "heater-parallel",
    "mu",
    "mu-g1g2",
    "plate-resistance",
    "transconductance",
    "source",
];

/// The most sections a row may claim.
const MAX_SECTIONS: i128 = 4;

/// Reads a whole ratings file. Returns every draft that could be read and
/// every problem found; the caller decides what to do when there are any.
pub(crate) fn read_file(text: &str) -> (Vec<Draft>, Vec<RatingProblem>) {
    let doc = match crate::kdl_fast::parse_document(text) {
        Ok(doc) => doc,
        Err(e) => return (Vec::new(), syntax_problems(text, &e)),
    };
    let mut drafts = Vec::new();
    let mut problems = Vec::new();
    let mut seen_format = false;
    let r = Reader { text };
    for node in doc.nodes() {
        if let Some(p) = r.type_problem(node.ty()) {
            problems.push(p);
        }
        match node.name().value() {
            "ratings-format" => {
                if seen_format {
                    problems.push(RatingProblem::new(
                        "ratings-format is given twice",
                        r.ident_span(node),
                        "second one here",
                    ));
                }
                seen_format = true;
                if let Err(p) = r.format_version(node) {
                    problems.push(p);
                }
            }
            "valve" => {
                let (draft, mut ps) = r.valve(node);
                problems.append(&mut ps);
                drafts.extend(draft);
            }
            other => problems.push(r.unknown_name(
                node,
                other,
                &TOP_NODES,
                "a ratings file holds `ratings-format 1` and `valve` nodes",
            )),
        }
    }
    (drafts, problems)
}

/// Turns the KDL parser's complaints into ours.
fn syntax_problems(text: &str, e: &kdl::KdlError) -> Vec<RatingProblem> {
    let hint = "ratings files are KDL 2.0: quote any value that starts with a digit (\"6.3V\", \"6BQ5\"), \
                and write booleans as #true and #false";
    let mut out: Vec<RatingProblem> = e
        .diagnostics
        .iter()
        .map(|d| {
            let message = d
                .message
                .clone()
                .unwrap_or_else(|| "this is not valid KDL".to_string());
            let label = d.label.clone().unwrap_or_else(|| "here".to_string());
            let help = d
                .help
                .clone()
                .map_or_else(|| hint.to_string(), |h| format!("{h}\n{hint}"));
            RatingProblem::new(
                message,
                clamp(text, crate::kdl_fast::narrow_span(text, d.span)),
                label,
            )
            .with_help(help)
        })
        .collect();
    if out.is_empty() {
        out.push(
            RatingProblem::new(
                "this is not valid KDL",
                SourceSpan::from(0..0),
                "somewhere in this file",
            )
            .with_help(hint),
        );
    }
    out
}

/// Keeps a span inside the text, so that printing it can never fail.
fn clamp(text: &str, span: SourceSpan) -> SourceSpan {
    let start = span.offset().min(text.len());
    let end = span.offset().saturating_add(span.len()).min(text.len());
    SourceSpan::from(start..end.max(start))
}

/// The text a value node holds, as it was written.
enum Written<'a> {
    Text(&'a str),
    Number(f64),
}

/// Reads nodes against the file text (for spans).
struct Reader<'t> {
    text: &'t str,
}

impl Reader<'_> {
    fn ident_span(&self, node: &KdlNode) -> SourceSpan {
        clamp(self.text, node.name().span())
    }

    /// The span of an entry's value as written, without surrounding space,
    /// property name or type annotation.
    fn value_span(&self, entry: &KdlEntry) -> SourceSpan {
        let whole = self.entry_span(entry);
        let start = whole.offset();
        let Some(slice) = self.text.get(start..start + whole.len()) else {
            return whole;
        };
        // A property's value comes after its name.
        let mut from = 0;
        if let Some(name) = entry.name() {
            let end = name.span().offset().saturating_add(name.span().len());
            if end > start && slice.is_char_boundary(end - start) && end - start <= slice.len() {
                from = end - start;
            }
        }
        if let Some(repr) = entry.format().map(|f| f.value_repr.as_str())
            && !repr.is_empty()
            && let Some(at) = slice.get(from..).and_then(|rest| rest.find(repr))
        {
            return SourceSpan::from(start + from + at..start + from + at + repr.len());
        }
        whole
    }

    /// The span of part of a string value (`offset`, `len` within the
    /// string's content), when the string is written plainly in quotes;
    /// otherwise the whole value.
    fn part_span(&self, entry: &KdlEntry, offset: usize, len: usize) -> SourceSpan {
        let whole = self.value_span(entry);
        let written = self
            .text
            .get(whole.offset()..whole.offset() + whole.len())
            .unwrap_or("");
        if let KdlValue::String(s) = entry.value()
            && written.len() == s.len() + 2
            && written.starts_with('"')
            && written.get(1..written.len() - 1) == Some(s.as_str())
            && offset + len <= s.len()
        {
            return SourceSpan::from(
                whole.offset() + 1 + offset..whole.offset() + 1 + offset + len,
            );
        }
        whole
    }

    /// The whole of an entry (a property with its name) without the
    /// surrounding space.
    fn entry_span(&self, entry: &KdlEntry) -> SourceSpan {
        let whole = clamp(self.text, entry.span());
        let start = whole.offset();
        match self.text.get(start..start + whole.len()) {
            Some(slice) => {
                let lead = slice.len() - slice.trim_start().len();
                SourceSpan::from(start + lead..start + lead + slice.trim().len())
            }
            None => whole,
        }
    }

    /// Type annotations such as `(mA)12` mean nothing here; rather than
    /// ignore a unit written that way, refuse it.
    fn type_problem(&self, ty: Option<&KdlIdentifier>) -> Option<RatingProblem> {
        ty.map(|ty| {
            RatingProblem::new(
                format!(
                    "type annotation ({}) is not used in a ratings file",
                    ty.value()
                ),
                clamp(self.text, ty.span()),
                "remove this",
            )
            .with_help("write units inside the value instead, e.g. \"65mA\"")
        })
    }

    fn unknown_name(
        &self,
        node: &KdlNode,
        name: &str,
        known: &[&str],
        help: &str,
    ) -> RatingProblem {
        let label = match closest_word(name, known) {
            Some(w) => format!("did you mean `{w}`?"),
            None => "not a name this file format uses".to_string(),
        };
        RatingProblem::new(
            format!("unknown node `{name}`"),
            self.ident_span(node),
            label,
        )
        .with_help(format!("{help}; the names are: {}", known.join(", ")))
    }

    fn format_version(&self, node: &KdlNode) -> Result<(), RatingProblem> {
        let entry = self.single_arg(node, "ratings-format 1")?;
        match entry.value() {
            KdlValue::Integer(FORMAT_VERSION) => Ok(()),
            _ => Err(RatingProblem::new(
                "unsupported ratings-format",
                self.value_span(entry),
                format!("this program reads format {FORMAT_VERSION}"),
            )
            .with_help(format!("write `ratings-format {FORMAT_VERSION}`"))),
        }
    }

    /// Reads one `valve "NAME" { … }` node.
    fn valve(&self, node: &KdlNode) -> (Option<Draft>, Vec<RatingProblem>) {
        let mut problems = Vec::new();
        let mut name: Option<(String, SourceSpan)> = None;
        for entry in node.entries() {
            if let Some(p) = self.type_problem(entry.ty()) {
                problems.push(p);
                continue;
            }
            if let Some(key) = entry.name() {
                let key = key.value();
                let help = if FIELDS.contains(&key) {
                    format!(
                        "write it as a child node inside the braces: valve \"EL84\" {{ {key} … }}"
                    )
                } else {
                    "a valve node takes only its designation, e.g. valve \"EL84\" { … }".to_string()
                };
                problems.push(
                    RatingProblem::new(
                        format!("unexpected property `{key}` on a valve node"),
                        self.entry_span(entry),
                        "properties are not used here",
                    )
                    .with_help(help),
                );
            } else if name.is_some() {
                problems.push(
                    RatingProblem::new(
                        "a valve node takes one designation",
                        self.value_span(entry),
                        "extra value",
                    )
                    .with_help("list other designations in an `equivalents` child node"),
                );
            } else {
                match self.designation(entry) {
                    Ok(n) => name = Some(n),
                    Err(p) => problems.push(p),
                }
            }
        }
        let Some((name, name_span)) = name else {
            if problems.is_empty() {
                problems.push(
                    RatingProblem::new(
                        "valve node without a designation",
                        self.ident_span(node),
                        "which type?",
                    )
                    .with_help("write the designation after `valve`, e.g. valve \"EL84\" { … }"),
                );
            }
            // Still read the block, so that its problems are reported too.
            let mut scratch = Draft::new("this valve".to_string(), self.ident_span(node));
            for child in node.children().map(KdlDocument::nodes).unwrap_or_default() {
                if let Err(mut ps) = self.field(child, &mut scratch) {
                    problems.append(&mut ps);
                }
            }
            return (None, problems);
        };
        let mut draft = Draft::new(name, name_span);
        if let Some(children) = node.children() {
            for child in children.nodes() {
                if let Err(mut ps) = self.field(child, &mut draft) {
                    problems.append(&mut ps);
                }
            }
        }
        (Some(draft), problems)
    }

    /// A designation: a string, or a bare number for types such as 45 or 83.
    fn designation(&self, entry: &KdlEntry) -> Result<(String, SourceSpan), RatingProblem> {
        let span = self.value_span(entry);
        let text = match entry.value() {
            KdlValue::String(s) => s.trim().to_string(),
            KdlValue::Integer(i) if *i >= 0 => i.to_string(),
            _ => String::new(),
        };
        let key = super::designation::designation_key(&text);
        if key.is_empty() {
            return Err(RatingProblem::new(
                "not a valve designation",
                span,
                "expected text such as \"EL84\"",
            )
            .with_help("write the designation in quotes, e.g. \"6L6GC\""));
        }
        Ok((text, span))
    }

    /// Reads one field node into the draft.
    fn field(&self, node: &KdlNode, draft: &mut Draft) -> Result<(), Vec<RatingProblem>> {
        let word = node.name().value();
        let Some(&field) = FIELDS.iter().find(|f| **f == word) else {
            return Err(vec![self.unknown_name(
                node,
                word,
                &FIELDS,
                "a valve block holds the fields listed in the ratings file guide",
            )]);
        };
        let mut problems = Vec::new();
        problems.extend(self.type_problem(node.ty()));
        if node.children().is_some() {
            problems.push(
                RatingProblem::new(
                    format!("`{field}` takes no block"),
                    self.ident_span(node),
                    "this node",
                )
                .with_help("remove the braces after the value"),
            );
        }
        if let Some((_, first)) = draft.given.iter().find(|(f, _)| *f == field) {
            let line = line_of(self.text, first.offset());
            problems.push(
                RatingProblem::new(
                    format!("`{field}` is given twice for {}", draft.name),
                    self.ident_span(node),
                    "again here",
                )
                .with_help(format!("the first is on line {line}; keep one")),
            );
        }
        if !problems.is_empty() {
            return Err(problems);
        }
        draft.given.push((field, self.ident_span(node)));
        let one = |r: Result<(), RatingProblem>| r.map_err(|p| vec![p]);
        match field {
            "equivalents" => {
                let mut ps = Vec::new();
                let args = self
                    .args(node, "equivalents \"6BQ5\"")
                    .map_err(|p| vec![p])?;
                if args.is_empty() {
                    ps.push(
                        RatingProblem::new(
                            "`equivalents` lists no designations",
                            self.ident_span(node),
                            "empty",
                        )
                        .with_help("write equivalents \"6BQ5\", or remove the line"),
                    );
                }
                for e in args {
                    match self.designation(e) {
                        Ok(d) => draft.equivalents.push(d),
                        Err(p) => ps.push(p),
                    }
                }
                if ps.is_empty() { Ok(()) } else { Err(ps) }
            }
            "class" => one(self
                .word(node, &ValveClass::ALL.map(ValveClass::file_word))
                .map(|w| {
                    draft.class = ValveClass::from_file_word(w);
                })),
            "rectifier-heating" => one(self
                .word(
                    node,
                    &RectifierHeating::ALL.map(RectifierHeating::file_word),
                )
                .map(|w| {
                    draft.rectifier_heating = RectifierHeating::from_file_word(w);
                })),
            "sections" => one(self.sections(node).map(|n| draft.sections = Some(n))),
            "plate-dissipation" => one(self.watts(node).map(|v| draft.plate_dissipation = Some(v))),
            "design-max-plate-dissipation" => one(self
                .watts(node)
                .map(|v| draft.design_max_plate_dissipation = Some(v))),
            "screen-dissipation" => {
                one(self.watts(node).map(|v| draft.screen_dissipation = Some(v)))
            }
            "plate-voltage" => one(self.volts(node).map(|v| draft.plate_voltage = Some(v))),
            "screen-voltage" => one(self.volts(node).map(|v| draft.screen_voltage = Some(v))),
            "cathode-current" => one(self.amps(node).map(|v| draft.cathode_current = Some(v))),
            "output-current" => one(self.amps(node).map(|v| draft.output_current = Some(v))),
            "heater" => self.heater(node).map(|h| draft.heater = Some(h)),
            "heater-parallel" => self.heater(node).map(|h| draft.heater_parallel = Some(h)),
            "mu" => one(self
                .plain_number(node, "mu 100")
                .map(|v| draft.mu = Some(v))),
            "mu-g1g2" => one(self
                .plain_number(node, "mu-g1g2 19")
                .map(|v| draft.mu_g1g2 = Some(v))),
            "plate-resistance" => one(self
                .quantity(
                    self.single_arg(node, "plate-resistance \"62.5k\"")
                        .map_err(|p| vec![p])?,
                    QuantityKind::Resistance,
                )
                .map(|v| draft.plate_resistance = Some(Ohms(v)))),
            "transconductance" => one(self
                .transconductance(node)
                .map(|v| draft.transconductance_ma_per_v = Some(v))),
            _ => one(self.source(node).map(|s| draft.source = Some(s))),
        }
    }

    /// The positional arguments of a field node; properties are refused.
    fn args<'n>(
        &self,
        node: &'n KdlNode,
        example: &str,
    ) -> Result<Vec<&'n KdlEntry>, RatingProblem> {
        let mut args = Vec::new();
        for entry in node.entries() {
            if let Some(p) = self.type_problem(entry.ty()) {
                return Err(p);
            }
            if let Some(key) = entry.name() {
                return Err(RatingProblem::new(
                    format!("unexpected property `{}`", key.value()),
                    self.entry_span(entry),
                    "properties are not used here",
                )
                .with_help(format!("write the value on its own: {example}")));
            }
            args.push(entry);
        }
        Ok(args)
    }

    /// Exactly one positional argument.
    fn single_arg<'n>(
        &self,
        node: &'n KdlNode,
        example: &str,
    ) -> Result<&'n KdlEntry, RatingProblem> {
        let args = self.args(node, example)?;
        match args.as_slice() {
            [one] => Ok(one),
            [] => Err(RatingProblem::new(
                format!("`{}` has no value", node.name().value()),
                self.ident_span(node),
                "value missing",
            )
            .with_help(format!("write e.g. {example}"))),
            [_, extra, ..] => Err(RatingProblem::new(
                format!("`{}` takes one value", node.name().value()),
                self.value_span(extra),
                "extra value",
            )
            .with_help(format!("write e.g. {example}"))),
        }
    }

    fn written<'n>(&self, entry: &'n KdlEntry) -> Option<Written<'n>> {
        match entry.value() {
            KdlValue::String(s) => Some(Written::Text(s)),
            KdlValue::Integer(i) => Some(Written::Number(*i as f64)),
            KdlValue::Float(f) => Some(Written::Number(*f)),
            KdlValue::Bool(_) | KdlValue::Null => None,
        }
    }

    /// A value of `kind`, written as text with an optional unit ("12W",
    /// "65mA", "62.5k") or as a plain number in the base unit. Must be above
    /// zero.
    fn quantity(&self, entry: &KdlEntry, kind: QuantityKind) -> Result<f64, RatingProblem> {
        let expected = format!("expected {kind} such as {}", kind.example());
        let value = match self.written(entry) {
            Some(Written::Text(s)) => parse_quantity(s, kind).map_err(|e| {
                let span = match e.problem {
                    UnitProblem::WrongUnit { .. } => self.part_span(entry, e.offset, e.len),
                    _ => self.value_span(entry),
                };
                RatingProblem::new(format!("this is not {kind}"), span, e.to_string())
                    .with_help(expected.clone())
            })?,
            Some(Written::Number(v)) => v,
            None => {
                return Err(RatingProblem::new(
                    format!("this is not {kind}"),
                    self.value_span(entry),
                    "not a number",
                )
                .with_help(expected));
            }
        };
        if !value.is_finite() || value <= 0.0 {
            return Err(RatingProblem::new(
                "a rating must be above zero",
                self.value_span(entry),
                "zero, negative or not finite",
            )
            .with_help(expected));
        }
        if !kind.accepts(value) {
            return Err(RatingProblem::new(
                format!(
                    "this is outside the range accepted for {kind} ({})",
                    kind.range_words()
                ),
                self.value_span(entry),
                format!("expected {}", kind.range_words()),
            )
            .with_help("no valve has a rating like this; check the prefix and the exponent"));
        }
        Ok(value)
    }

    fn watts(&self, node: &KdlNode) -> Result<Watts, RatingProblem> {
        let e = self.single_arg(node, &format!("{} \"12W\"", node.name().value()))?;
        self.quantity(e, QuantityKind::Power).map(Watts)
    }

    fn volts(&self, node: &KdlNode) -> Result<Volts, RatingProblem> {
        let e = self.single_arg(node, &format!("{} \"300V\"", node.name().value()))?;
        self.quantity(e, QuantityKind::Voltage).map(Volts)
    }

    fn amps(&self, node: &KdlNode) -> Result<Amps, RatingProblem> {
        let e = self.single_arg(node, &format!("{} \"65mA\"", node.name().value()))?;
        self.quantity(e, QuantityKind::Current).map(Amps)
    }

    /// `heater "6.3V" "0.76A"`: voltage, then current.
    fn heater(&self, node: &KdlNode) -> Result<Heater, Vec<RatingProblem>> {
        let example = format!("{} \"6.3V\" \"0.9A\"", node.name().value());
        let args = self.args(node, &example).map_err(|p| vec![p])?;
        let [v, a] = args.as_slice() else {
            let span = args
                .get(2)
                .map_or_else(|| self.ident_span(node), |e| self.value_span(e));
            return Err(vec![
                RatingProblem::new(
                    format!(
                        "`{}` takes two values, the voltage and the current",
                        node.name().value()
                    ),
                    span,
                    format!("{} value(s) here", args.len()),
                )
                .with_help(format!("write e.g. {example}")),
            ]);
        };
        let voltage = self.quantity(v, QuantityKind::Voltage);
        let current = self.quantity(a, QuantityKind::Current);
        match (voltage, current) {
            (Ok(v), Ok(a)) => Ok(Heater {
                voltage: Volts(v),
                current: Amps(a),
            }),
            (v, a) => Err(v.err().into_iter().chain(a.err()).collect()),
        }
    }

    /// One word out of a fixed list, with a did-you-mean when it is not.
    fn word<'w>(&self, node: &KdlNode, words: &[&'w str]) -> Result<&'w str, RatingProblem> {
        let field = node.name().value();
        let example = format!("{field} \"{}\"", words[0]);
        let e = self.single_arg(node, &example)?;
        let given = match e.value() {
            KdlValue::String(s) => s.as_str(),
            _ => "",
        };
        if let Some(w) = words.iter().find(|w| **w == given) {
            return Ok(w);
        }
        let label = match closest_word(given, words) {
            Some(w) => format!("did you mean \"{w}\"?"),
            None => format!("not a {field}"),
        };
        Err(
            RatingProblem::new(format!("unknown {field}"), self.value_span(e), label)
                .with_help(format!("one of: {}", words.join(", "))),
        )
    }

    fn sections(&self, node: &KdlNode) -> Result<u8, RatingProblem> {
        let e = self.single_arg(node, "sections 2")?;
        match e.value() {
            KdlValue::Integer(n) if (1..=MAX_SECTIONS).contains(n) => Ok(*n as u8),
            _ => Err(RatingProblem::new(
                "sections must be a whole number",
                self.value_span(e),
                format!("expected 1 to {MAX_SECTIONS}"),
            )
            .with_help("write sections 2 for a dual triode; leave it out for a single one")),
        }
    }

    /// A plain positive number, written bare or in quotes.
    fn plain_number(&self, node: &KdlNode, example: &str) -> Result<f64, RatingProblem> {
        let e = self.single_arg(node, example)?;
        let v = match self.written(e) {
            Some(Written::Number(v)) => Some(v),
            Some(Written::Text(s)) => s.trim().parse::<f64>().ok(),
            None => None,
        };
        match v {
            // μ of real valves runs from about 2 to a few hundred.
            Some(v) if (0.1..=10_000.0).contains(&v) => Ok(v),
            _ => Err(RatingProblem::new(
                format!(
                    "`{}` must be a number from 0.1 to 10000",
                    node.name().value()
                ),
                self.value_span(e),
                "not a plain number in range",
            )
            .with_help(format!("write e.g. {example}"))),
        }
    }

    /// Transconductance in mA/V: a plain number, or text ending in mA/V, mS,
    /// µA/V, µS, A/V or S.
    fn transconductance(&self, node: &KdlNode) -> Result<f64, RatingProblem> {
        let example = "transconductance \"1.6mA/V\"";
        let e = self.single_arg(node, example)?;
        let v = match self.written(e) {
            Some(Written::Number(v)) => Some(v),
            Some(Written::Text(s)) => read_transconductance(s),
            None => None,
        };
        match v {
            // Real valves: a fraction of a mA/V to a few tens.
            Some(v) if (0.001..=1000.0).contains(&v) => Ok(v),
            _ => Err(RatingProblem::new(
                "this is not a transconductance from 0.001 to 1000 mA/V",
                self.value_span(e),
                "expected a number in mA/V",
            )
            .with_help(format!(
                "write e.g. {example} (or \"1.6mS\", or a plain 1.6 meaning mA/V)"
            ))),
        }
    }

    fn source(&self, node: &KdlNode) -> Result<String, RatingProblem> {
        let example = "source \"from memory of manufacturer data; verify\"";
        let e = self.single_arg(node, example)?;
        match e.value() {
            KdlValue::String(s) if !s.trim().is_empty() => Ok(s.trim().to_string()),
            _ => Err(RatingProblem::new(
                "`source` must be a note in quotes",
                self.value_span(e),
                "not a note",
            )
            .with_help(format!("say where the figures come from: {example}"))),
        }
    }
}

/// Reads "1.6mA/V", "1.6 mS", "1600µA/V", "0.0016S" into mA/V.
fn read_transconductance(text: &str) -> Option<f64> {
    const SUFFIXES: [(&str, f64); 10] = [
        ("mA/V", 1.0),
        ("µA/V", 1e-3),
        ("μA/V", 1e-3),
        ("uA/V", 1e-3),
        ("A/V", 1e3),
        ("mS", 1.0),
        ("µS", 1e-3),
        ("μS", 1e-3),
        ("uS", 1e-3),
        ("S", 1e3),
    ];
    let t = text.trim();
    let (number, scale) = SUFFIXES
        .iter()
        .find_map(|(s, m)| t.strip_suffix(s).map(|n| (n, *m)))
        .unwrap_or((t, 1.0));
    let n: f64 = number.trim().parse().ok()?;
    Some(n * scale)
}

/// The closest of `words` to `given`, if any is plausibly what was meant.
pub(crate) fn closest_word<'w>(given: &str, words: &[&'w str]) -> Option<&'w str> {
    words
        .iter()
        .map(|w| (strsim::jaro_winkler(given, w), *w))
        .filter(|(score, _)| *score >= 0.8)
        .max_by(|a, b| a.0.total_cmp(&b.0))
        .map(|(_, w)| w)
}

/// The 1-based line number of a byte offset.
fn line_of(text: &str, offset: usize) -> usize {
    text.get(..offset)
        .map_or(1, |t| t.matches('\n').count() + 1)
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn transconductance_units() {
        assert_eq!(read_transconductance("1.6mA/V"), Some(1.6));
        assert_eq!(read_transconductance("1.6 mS"), Some(1.6));
        assert_eq!(read_transconductance("5.5"), Some(5.5));
        assert_eq!(read_transconductance("0.0016S"), Some(1.6));
        let v = read_transconductance("1600µA/V").unwrap();
        assert!((v - 1.6).abs() < 1e-12);
        assert_eq!(read_transconductance("fast"), None);
        assert_eq!(read_transconductance("mA/V"), None);
    }

    #[test]
    fn closest_words() {
        assert_eq!(
            closest_word("plate-disipation", &FIELDS),
            Some("plate-dissipation")
        );
        assert_eq!(
            closest_word("output-pentod", &ValveClass::ALL.map(ValveClass::file_word)),
            Some("output-pentode")
        );
        assert_eq!(closest_word("zzz", &FIELDS), None);
    }

    #[test]
    fn line_numbers() {
        assert_eq!(line_of("a\nb\nc", 0), 1);
        assert_eq!(line_of("a\nb\nc", 2), 2);
        assert_eq!(line_of("a\nb\nc", 99), 1);
    }
}
