//! The listing as Markdown, for pasting into a listing or a web page: the
//! same context as the PDF, the same notice. Every piece of text that came
//! from a job or a shop profile is escaped ([`inline`], [`paragraphs`]), so
//! it reads as the words it is and can never become a heading, a list, a
//! link, an image, a table cell break or raw HTML.

use super::context::{ListingContext, PhotoFile};
use super::notice::Notice;

/// Characters that can start or end Markdown (CommonMark and the usual
/// extensions: tables, strikethrough, footnotes, maths, attributes)
/// anywhere in a line; a backslash makes each literal.
/// (Parentheses and quotes only mean something inside a link, and no
/// link can start without a `[` or a `<`, which are always escaped.) An
/// `&` is escaped only where it could start an entity (`&amp;`, `&#38;`),
/// and a `#` only where it could start a heading (at the start, followed
/// by a space: text is one line), so "Halloran & Pike" and "#47 bulb"
/// paste as written.
const ALWAYS: &[char] = &[
    '\\', '`', '*', '_', '[', ']', '<', '>', '|', '~', '!', '{', '}', '$', '^',
];

/// Escapes one line of text: runs of white space (line breaks included)
/// become one space, and what Markdown could read as markup is escaped.
pub fn inline(text: &str) -> String {
    let joined = text.split_whitespace().collect::<Vec<_>>().join(" ");
    escape_line(&joined)
}

/// Escapes text of one or more paragraphs (separated by an empty line);
/// inside a paragraph, line breaks become spaces.
pub fn paragraphs(text: &str) -> String {
    text.replace("\r\n", "\n")
        .split("\n\n")
        .map(inline)
        .filter(|p| !p.is_empty())
        .collect::<Vec<_>>()
        .join("\n\n")
}

fn escape_line(line: &str) -> String {
    let mut out = String::with_capacity(line.len() + 8);
    let mut chars = line.chars().peekable();
    while let Some(c) = chars.next() {
        let entity = c == '&'
            && chars
                .peek()
                .is_some_and(|n| n.is_ascii_alphanumeric() || *n == '#');
        if ALWAYS.contains(&c) || entity {
            out.push('\\');
        }
        out.push(c);
    }
    // What could start a block at the start of a line: a list item (`-`,
    // `+`, `1.`, `1)`), a setext underline or a thematic break (`=`, `-`).
    let digits = out.chars().take_while(char::is_ascii_digit).count();
    let lead = out.chars().next();
    // A heading: `#` to `######` followed by a space or nothing.
    let heading = lead == Some('#')
        && out
            .chars()
            .find(|c| *c != '#')
            .is_none_or(char::is_whitespace);
    if matches!(lead, Some('-' | '+' | '=')) || heading {
        out.insert(0, '\\');
    } else if digits > 0
        && matches!(out[digits..].chars().next(), Some('.' | ')'))
        && out[digits + 1..]
            .chars()
            .next()
            .is_none_or(char::is_whitespace)
    {
        out.insert(digits, '\\');
    }
    out
}

/// A table row of escaped cells.
fn row(cells: &[String]) -> String {
    format!("| {} |", cells.join(" | "))
}

fn or_dash(v: &Option<String>) -> String {
    v.as_deref().map(inline).unwrap_or_else(|| "–".into())
}

/// The whole listing in Markdown, ending in a newline. `photos` names the
/// photo files written beside the Markdown, in the order of the context's
/// photos.
pub fn render(ctx: &ListingContext, photos: &[PhotoFile], n: &Notice) -> String {
    let mut md = Vec::<String>::new();
    let u = &ctx.unit;
    let mut title = format!("{} {}", inline(&u.make), inline(&u.model));
    if let Some(y) = &u.year {
        title.push_str(&format!(" ({})", inline(y)));
    }
    md.push(format!("# {title}"));
    md.push(String::new());
    let w = &ctx.words;
    let mut by = vec![format!(
        "{} {}",
        w.serviced_by.as_str(),
        inline(&ctx.shop.name)
    )];
    if let Some(d) = &ctx.date {
        by.push(inline(d));
    }
    by.push(format!(
        "{} {}",
        w.service_record.as_str(),
        inline(&ctx.job_id)
    ));
    md.push(by.join(" · "));
    md.push(String::new());

    md.push(format!("## {}", w.the_unit.as_str()));
    md.push(String::new());
    let field = |label: &str, value: &str| format!("- **{label}:** {}", inline(value));
    md.push(field(w.make.as_str(), &u.make));
    md.push(field(w.model.as_str(), &u.model));
    if let Some(y) = &u.year {
        md.push(field(w.year.as_str(), y));
    }
    if let Some(s) = &u.serial {
        md.push(field(w.serial.as_str(), s));
    }
    md.push(field(w.mains.as_str(), &ctx.mains));
    if let Some(d) = &u.description {
        md.push(field(w.description.as_str(), d));
    }
    if let Some(c) = &u.condition {
        md.push(field(w.condition.as_str(), c));
    }
    md.push(String::new());

    let h = &ctx.health;
    md.push(format!("## {}", w.health.as_str()));
    md.push(String::new());
    md.push(inline(&h.headline));
    if let Some(b) = &h.basis {
        md.push(String::new());
        md.push(format!("*{}.*", inline(b)));
    }
    md.push(String::new());
    md.push(row(&[
        w.check.as_str().into(),
        w.state.as_str().into(),
        w.in_words.as_str().into(),
    ]));
    md.push("| --- | --- | --- |".into());
    for f in &h.families {
        md.push(row(&[inline(&f.title), inline(&f.state), inline(&f.words)]));
    }
    md.push(String::new());
    if !h.valves.is_empty() {
        md.push(row(&[
            w.output_valve.as_str().into(),
            w.valve_type.as_str().into(),
            w.bias.as_str().into(),
            w.idle.as_str().into(),
            w.high_line.as_str().into(),
            w.state.as_str().into(),
        ]));
        md.push("| --- | --- | --- | ---: | ---: | --- |".into());
        for v in &h.valves {
            md.push(row(&[
                inline(&v.position),
                inline(&v.type_name),
                inline(&v.bias),
                v.idle_pct
                    .as_deref()
                    .map(|p| format!("{} %", inline(p)))
                    .unwrap_or_else(|| "–".into()),
                v.high_line_pct
                    .as_deref()
                    .map(|p| format!("{} %", inline(p)))
                    .unwrap_or_else(|| "–".into()),
                inline(&v.state),
            ]));
        }
        md.push(String::new());
    }
    if h.safety.tests.is_empty() {
        md.push(w.no_safety_tests.as_str().into());
    } else {
        let mut head = w.safety_tests.as_str().to_string();
        if let Some(c) = &h.safety.class {
            head.push_str(&format!(", {}", inline(c)));
        }
        if let Some(d) = &h.safety_date {
            head.push_str(&format!(", {}", inline(d)));
        }
        md.push(format!("**{head}:**"));
        md.push(String::new());
        for t in &h.safety.tests {
            md.push(format!(
                "- {}: {} ({} {}), {}",
                inline(&t.test),
                inline(&t.measured),
                w.limit.as_str(),
                inline(&t.limit),
                inline(if t.status == "accepted" {
                    "accepted"
                } else {
                    &t.result
                })
            ));
        }
    }
    md.push(String::new());

    md.push(format!("## {}", w.serviced.as_str()));
    md.push(String::new());
    if ctx.serviced.is_empty() {
        md.push(w.no_parts.as_str().into());
    } else {
        md.push(row(&[
            w.part.as_str().into(),
            w.was.as_str().into(),
            w.now.as_str().into(),
            w.why.as_str().into(),
        ]));
        md.push("| --- | --- | --- | --- |".into());
        for s in &ctx.serviced {
            md.push(row(&[
                inline(&s.part),
                or_dash(&s.was),
                or_dash(&s.now),
                or_dash(&s.reason),
            ]));
        }
    }
    for (label, text) in [
        (w.findings.as_str(), &ctx.findings),
        (w.work.as_str(), &ctx.work),
    ] {
        if let Some(t) = text {
            md.push(String::new());
            md.push(format!("**{label}:** {}", paragraphs(t)));
        }
    }
    md.push(String::new());

    md.push(format!("## {}", w.originality.as_str()));
    md.push(String::new());
    if !ctx.ledger.rows.is_empty() {
        md.push(row(&[
            w.item.as_str().into(),
            w.change.as_str().into(),
            w.reversible.as_str().into(),
            w.original_kept.as_str().into(),
        ]));
        md.push("| --- | --- | --- | --- |".into());
        for r in &ctx.ledger.rows {
            let mut item = inline(&r.item);
            if let Some(w) = &r.why {
                item.push_str(&format!(" ({})", inline(w)));
            }
            md.push(row(&[
                item,
                inline(&r.change),
                or_dash(&r.reversible),
                or_dash(&r.original_kept),
            ]));
        }
        md.push(String::new());
    }
    md.push(inline(&ctx.ledger.summary));
    md.push(String::new());
    md.push(inline(w.not_listed.as_str()));
    md.push(String::new());

    if !ctx.notes.is_empty() {
        md.push(format!("## {}", w.notes.as_str()));
        md.push(String::new());
        for n in &ctx.notes {
            md.push(format!("- {}", inline(n)));
        }
        md.push(String::new());
    }

    if !photos.is_empty() {
        md.push(format!("## {}", w.photos.as_str()));
        md.push(String::new());
        for p in photos {
            let caption = p.caption.as_deref().map(inline).unwrap_or_default();
            // The file name is the program's own (`NAME.listing-photo-1.jpg`
            // beside this file), escaped all the same.
            md.push(format!(
                "![{caption}](<{}>)",
                p.file_name.replace(['<', '>'], "")
            ));
            if !caption.is_empty() {
                md.push(String::new());
                md.push(format!("*{caption}*"));
            }
            md.push(String::new());
        }
    }

    md.push(format!("## {}", inline(&n.heading)));
    md.push(String::new());
    for (title, body) in &n.points {
        md.push(format!("- **{}.** {}", inline(title), inline(body)));
    }
    md.push(String::new());
    md.push(format!(
        "**{}** {}",
        inline(&n.codes_lead),
        inline(&n.codes_rest)
    ));
    md.push(String::new());
    let mut tail = format!(
        "{} {} · {} {}",
        w.made_with.as_str(),
        inline(&ctx.footer.tool_version),
        w.service_record.as_str(),
        inline(&ctx.job_id)
    );
    match &ctx.footer.commit {
        Some(c) => {
            tail.push_str(&format!(
                " · {} `{}`",
                w.commit.as_str(),
                c.replace('`', "")
            ));
            if ctx.footer.uncommitted_changes {
                // A fixed word in the middle of the line: nothing to escape.
                tail.push_str(&format!(" {}", w.edits));
            }
        }
        None => tail.push_str(&format!(
            " · {} `{}`",
            w.job_file_sha.as_str(),
            ctx.footer.job_digest.replace('`', "")
        )),
    }
    tail.push('.');
    md.push(tail);
    let mut out = md.join("\n");
    out.push('\n');
    out
}

#[cfg(test)]
mod tests {
    use super::*;
    use pulldown_cmark::{Event, Options, Parser};

    /// Every extension the parser knows, less smart punctuation (which
    /// turns `--` into a dash: the same words to a reader).
    fn options() -> Options {
        let mut o = Options::all();
        o.remove(Options::ENABLE_SMART_PUNCTUATION);
        o
    }

    /// What a Markdown renderer makes of `md` as text, and whether it made
    /// anything but text of it.
    fn read_back(md: &str) -> (String, Vec<String>) {
        let mut text = String::new();
        let mut other = Vec::new();
        for event in Parser::new_ext(md, options()) {
            match event {
                Event::Text(t) => text.push_str(&t),
                Event::SoftBreak => text.push(' '),
                Event::Start(pulldown_cmark::Tag::Paragraph)
                | Event::End(pulldown_cmark::TagEnd::Paragraph) => {}
                e => other.push(format!("{e:?}")),
            }
        }
        (text, other)
    }

    #[test]
    fn user_text_reads_back_as_the_same_words_and_nothing_else() {
        let hostile = [
            "# not a heading",
            "- not a list",
            "+ nor this",
            "1. nor this",
            "1986) a year",
            "=== ",
            "--- ",
            "*bold* _it_ **b** __u__ ~~s~~ `code`",
            "[link](http://example.test) ![img](x.png)",
            "<b>html</b> <!-- c --> &amp; &copy; &#38; &#x26; &",
            "a | b | c",
            "$x^2$ {#id} [^1]",
            "\\ backslash \\* stays",
            "> quote",
            "    indented code",
            "line one\nline two\n# heading after break",
            "4k7 \"quoted\" 'single' 50 % (note)",
            "#47 bulb, open",
            "## two",
            "a # b ## c",
            "#",
        ];
        for s in hostile {
            let escaped = inline(s);
            let (text, other) = read_back(&escaped);
            let want = s.split_whitespace().collect::<Vec<_>>().join(" ");
            assert_eq!(text, want, "{s:?} escaped as {escaped:?}");
            assert!(other.is_empty(), "{s:?} became {other:?}");
            // In a table cell, the row keeps its cells.
            let table = format!("| a | b |\n| --- | --- |\n| {escaped} | x |\n");
            let cells = Parser::new_ext(&table, options())
                .filter(|e| matches!(e, Event::Start(pulldown_cmark::Tag::TableCell)))
                .count();
            assert_eq!(cells, 4, "{s:?} broke the table");
            // As a list item's text, it stays the item's text.
            let (item, other) = read_back(&format!("- {escaped}"));
            assert_eq!(item, want, "{s:?} as a list item");
            let blocks: Vec<&String> = other
                .iter()
                .filter(|e| !e.contains("List") && !e.contains("Item"))
                .collect();
            assert!(blocks.is_empty(), "{s:?} as a list item became {other:?}");
        }
    }

    #[test]
    fn a_plain_ampersand_and_plus_are_left_as_written() {
        assert_eq!(inline("Halloran & Pike"), "Halloran & Pike");
        assert_eq!(inline("R&D &amp"), "R\\&D \\&amp");
        assert_eq!(inline("commit 1a2b + edits"), "commit 1a2b + edits");
        assert_eq!(inline("#47 bulb"), "#47 bulb");
        assert_eq!(inline("## 47"), "\\## 47");
        assert_eq!(inline("lamp #47"), "lamp #47");
    }

    #[test]
    fn paragraphs_stay_paragraphs() {
        let escaped = paragraphs("First line\ngoes on.\n\n- second paragraph");
        assert_eq!(escaped, "First line goes on.\n\n\\- second paragraph");
    }
}
