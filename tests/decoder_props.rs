//! Property tests for the job decoder: no text, however broken, may make it
//! panic, and every problem it reports must point inside the text on
//! character boundaries (miette slices the source at those offsets when it
//! draws the underline). Inputs are arbitrary strings, strings from a
//! KDL-flavoured alphabet, and the demo jobs mutated the way a hurried edit
//! or a damaged file would mutate them.

use ampreport::job::{self, JobDiagnostics};
use ampreport::ratings::RatingsTable;
use proptest::prelude::*;
use std::sync::OnceLock;

const DEMOS: [(&str, &str); 3] = [
    (
        "combo-el84-cathode.kdl",
        include_str!("../jobs/combo-el84-cathode.kdl"),
    ),
    (
        "combo-6v6-fixed.kdl",
        include_str!("../jobs/combo-6v6-fixed.kdl"),
    ),
    (
        "head-el34-quad.kdl",
        include_str!("../jobs/head-el34-quad.kdl"),
    ),
];

fn ratings() -> &'static RatingsTable {
    static TABLE: OnceLock<RatingsTable> = OnceLock::new();
    TABLE.get_or_init(RatingsTable::builtin)
}

/// Every span within the text and on char boundaries, with a readable
/// account of the first one that is not.
fn check_spans(text: &str, diagnostics: &JobDiagnostics) -> Result<(), String> {
    for p in &diagnostics.problems {
        let start = p.span.offset();
        let end = start + p.span.len();
        if end > text.len() {
            return Err(format!(
                "{} span {start}+{} runs past the end ({} bytes): {}",
                p.code,
                p.span.len(),
                text.len(),
                p.message
            ));
        }
        if !text.is_char_boundary(start) || !text.is_char_boundary(end) {
            return Err(format!(
                "{} span {start}..{end} splits a character: {}",
                p.code, p.message
            ));
        }
    }
    Ok(())
}

/// Decodes, checks the spans, draws the diagnostics as the binary does and,
/// for a job that decodes, derives its figures and their JSON.
fn decode_everything(text: &str) -> Result<(), String> {
    let diagnostics = match job::decode_with_ratings("prop.kdl", text, ratings()) {
        Ok(decoded) => {
            let findings = ampreport::calc::derive(&decoded.job, ratings());
            let json = ampreport::report::json::render(&findings);
            serde_json::from_str::<serde_json::Value>(&json)
                .map_err(|e| format!("calc JSON does not parse: {e}"))?;
            decoded.diagnostics
        }
        Err(diagnostics) => {
            if !diagnostics.has_errors() {
                return Err("a failed decode reports no error".into());
            }
            diagnostics
        }
    };
    check_spans(text, &diagnostics)?;
    let mut drawn = String::new();
    miette::GraphicalReportHandler::new_themed(miette::GraphicalTheme::unicode_nocolor())
        .render_report(&mut drawn, &diagnostics)
        .map_err(|e| format!("drawing the diagnostics failed: {e}"))?;
    Ok(())
}

// ----- mutations ----------------------------------------------------------------

/// Fragments a mutation may insert: KDL punctuation, escapes, comment and
/// string openers, unit letters, multi-byte characters.
const FRAGMENTS: &[&str] = &[
    "\"", "\"\"\"", "#", "#\"", "\"#", "{", "}", ";", "=", "\\", "\\t", "\\n", "\\u{b5}",
    "\\u{3bc}", "\\\"", "//", "/*", "*/", "/-", "\n", " ", "\t", "\r\n", "-", "+", ".", "0", "9",
    "e9", "k", "M", "R", "µ", "μ", "Ω", "mA", "V", "%", "#true", "#null", "#inf", "(u8)", "é",
    "日本", "\u{feff}", "\u{2028}", "🔥",
];

/// Unit suffixes to swap for one another.
const UNITS: &[&str] = &[
    "V", "mV", "mA", "A", "R", "k", "W", "u", "µF", "Hz", "%", "",
];

#[derive(Debug, Clone)]
enum Mutation {
    DeleteChar(usize),
    Insert(usize, &'static str),
    DeleteLine(usize),
    DuplicateLine(usize),
    SwapLines(usize, usize),
    SwapUnit(usize, &'static str),
    Truncate(usize),
}

fn mutation() -> impl Strategy<Value = Mutation> {
    let fragment = proptest::sample::select(FRAGMENTS);
    let unit = proptest::sample::select(UNITS);
    prop_oneof![
        3 => any::<usize>().prop_map(Mutation::DeleteChar),
        4 => (any::<usize>(), fragment).prop_map(|(i, f)| Mutation::Insert(i, f)),
        1 => any::<usize>().prop_map(Mutation::DeleteLine),
        1 => any::<usize>().prop_map(Mutation::DuplicateLine),
        1 => (any::<usize>(), any::<usize>()).prop_map(|(a, b)| Mutation::SwapLines(a, b)),
        3 => (any::<usize>(), unit).prop_map(|(i, u)| Mutation::SwapUnit(i, u)),
        1 => any::<usize>().prop_map(Mutation::Truncate),
    ]
}

/// The char boundary `pick` lands on (modulo the number of boundaries).
fn boundary(text: &str, pick: usize) -> usize {
    let n = text.chars().count() + 1;
    text.char_indices()
        .map(|(i, _)| i)
        .chain(std::iter::once(text.len()))
        .nth(pick % n)
        .unwrap_or(0)
}

fn apply(text: &mut String, m: &Mutation) {
    match *m {
        Mutation::DeleteChar(i) => {
            let at = boundary(text, i);
            if at < text.len() {
                text.remove(at);
            }
        }
        Mutation::Insert(i, f) => {
            let at = boundary(text, i);
            text.insert_str(at, f);
        }
        Mutation::DeleteLine(i) | Mutation::DuplicateLine(i) => {
            let mut lines: Vec<&str> = text.split_inclusive('\n').collect();
            if lines.is_empty() {
                return;
            }
            let k = i % lines.len();
            if matches!(m, Mutation::DeleteLine(_)) {
                lines.remove(k);
            } else {
                lines.insert(k, lines[k]);
            }
            *text = lines.concat();
        }
        Mutation::SwapLines(a, b) => {
            let mut lines: Vec<&str> = text.split_inclusive('\n').collect();
            if lines.len() > 1 {
                let (a, b) = (a % lines.len(), b % lines.len());
                lines.swap(a, b);
                *text = lines.concat();
            }
        }
        Mutation::SwapUnit(i, unit) => {
            // A quoted value ending in letters: "356V" → "356mA".
            let values: Vec<(usize, usize)> = text
                .match_indices('"')
                .map(|(q, _)| q)
                .collect::<Vec<_>>()
                .windows(2)
                .filter_map(|w| {
                    let inner = &text[w[0] + 1..w[1]];
                    let digits = inner.find(|c: char| c.is_ascii_digit())?;
                    let unit_start = inner.rfind(|c: char| c.is_ascii_digit())? + 1;
                    (digits == 0 && !inner.contains(' ')).then_some((w[0] + 1 + unit_start, w[1]))
                })
                .collect();
            if !values.is_empty() {
                let (start, end) = values[i % values.len()];
                text.replace_range(start..end, unit);
            }
        }
        Mutation::Truncate(i) => {
            let at = boundary(text, i);
            text.truncate(at);
        }
    }
}

// ----- properties -----------------------------------------------------------------

/// `cases` runs, or as many as PROPTEST_CASES asks for (for a longer hunt).
fn config(cases: u32) -> ProptestConfig {
    let cases = std::env::var("PROPTEST_CASES")
        .ok()
        .and_then(|v| v.parse().ok())
        .unwrap_or(cases);
    ProptestConfig {
        cases,
        failure_persistence: None,
        ..ProptestConfig::default()
    }
}

proptest! {
    // Moderate case counts: a debug-build decode of a demo job takes some
    // milliseconds, and the whole suite should run well under a minute.
    #![proptest_config(config(128))]

    #[test]
    fn arbitrary_text_never_panics(text in any::<String>()) {
        decode_everything(&text).map_err(TestCaseError::fail)?;
    }

    #[test]
    fn kdl_flavoured_text_never_panics(
        text in "(job-format 1\n)?([a-z+#=\"{}\\\\/*;() \n\t0-9.µμΩ-]|job|valve|node|measurements|mains=|\"V3\"|plate=){0,120}"
    ) {
        decode_everything(&text).map_err(TestCaseError::fail)?;
    }
}

proptest! {
    #![proptest_config(config(128))]

    #[test]
    fn mutated_demo_jobs_never_panic_and_spans_stay_inside(
        demo in 0..DEMOS.len(),
        mutations in proptest::collection::vec(mutation(), 1..6),
    ) {
        let mut text = DEMOS[demo].1.to_string();
        for m in &mutations {
            apply(&mut text, m);
        }
        decode_everything(&text).map_err(TestCaseError::fail)?;
    }
}

/// Each demo cut short at a sample of char boundaries: 48 spread evenly
/// through the text (a different phase for each demo), plus the first and
/// last few.
#[test]
fn truncated_demo_jobs_never_panic() {
    for (d, (name, text)) in DEMOS.iter().enumerate() {
        let bounds: Vec<usize> = text
            .char_indices()
            .map(|(i, _)| i)
            .chain(std::iter::once(text.len()))
            .collect();
        let n = bounds.len();
        let stride = n / 48;
        for (k, &at) in bounds.iter().enumerate() {
            if k % stride == d % stride || k < 4 || k + 4 > n {
                if let Err(e) = decode_everything(&text[..at]) {
                    panic!("{name} cut at byte {at}: {e}");
                }
            }
        }
    }
}

/// The demo jobs themselves decode without a problem.
#[test]
fn demo_jobs_decode_cleanly() {
    for (name, text) in DEMOS {
        match job::decode_with_ratings(name, text, ratings()) {
            Ok(d) => assert!(
                d.diagnostics.problems.is_empty(),
                "{name}: {:?}",
                d.diagnostics.problems
            ),
            Err(d) => panic!("{name}: {:?}", d.problems),
        }
    }
}

/// Escapes in a quoted value shift the decoded text against the source:
/// the underline must still land on the offending part of the value.
#[test]
fn escaped_strings_keep_spans_on_the_offending_part() {
    let base = "job-format 1\njob id=\"T-1\"\nunit make=\"M\" model=\"N\"\nmains nominal=\"120V\"\n\
                valves {\n    valve V3 type=EL84 role=output\n}\n\
                circuit {\n    cathode-resistor R1 value=\"130\" valves=\"V3\"\n}\n";
    let set = |plate: &str| {
        format!(
            "{base}measurements \"x\" mains=\"120V\" {{\n    valve V3 plate={plate} cathode=\"10V\"\n}}\n"
        )
    };
    let cases = [
        // A wrong unit after an escaped newline and two multi-byte characters.
        (set("\"\\nµµA\""), "job::bad-value", "A"),
        // The same with the µ written as a unicode escape.
        (set("\"\\u{b5}1A\""), "job::bad-value", "A"),
        // A raw string.
        (set("#\"3µ0mA\"#"), "job::bad-value", "A"),
        // An unknown valve position after a tab escape, in a list of names.
        (
            set("\"300V\"").replace("valves=\"V3\"", "valves=\"\\tµµ V3\""),
            "job::unknown-position",
            "µµ",
        ),
    ];
    for (text, code, part) in &cases {
        if let Err(e) = decode_everything(text) {
            panic!("{e}\n{text}");
        }
        let problems = match job::decode_with_ratings("esc.kdl", text, ratings()) {
            Ok(_) => panic!("should not decode:\n{text}"),
            Err(d) => d.problems,
        };
        let p = problems
            .iter()
            .find(|p| p.code == *code)
            .unwrap_or_else(|| panic!("no {code} in {problems:?}"));
        let underlined = &text[p.span.offset()..p.span.offset() + p.span.len()];
        assert_eq!(
            underlined, *part,
            "{code} underlines {underlined:?} in\n{text}"
        );
    }
}
