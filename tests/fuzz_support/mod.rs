//! The decode + derive fuzz target's body, shared by the proptest fallback
//! (`tests/fuzz_decode_derive.rs`, part of `cargo test`), its long run and
//! the cargo-fuzz target (`fuzz/fuzz_targets/decode_derive.rs`): job files
//! generated from the demo jobs with values drawn from the whole f64 range
//! and the edits a hurried hand or a damaged file makes, and the check that
//! every output of a job stays sound.

#![allow(dead_code)]

use std::sync::OnceLock;
use std::time::{Duration, Instant};

use ampreport::calc::Findings;
use ampreport::job::{self, JobDiagnostics};
use ampreport::ratings::RatingsTable;
use ampreport::report::handover::{self, HandoverInput};
use ampreport::report::terminal::{self, TerminalStyle};
use ampreport::typeset::TemplateSource;

pub const DEMOS: [&str; 3] = [
    include_str!("../../jobs/combo-el84-cathode.kdl"),
    include_str!("../../jobs/combo-6v6-fixed.kdl"),
    include_str!("../../jobs/head-el34-quad.kdl"),
];

fn ratings() -> &'static RatingsTable {
    static TABLE: OnceLock<RatingsTable> = OnceLock::new();
    TABLE.get_or_init(RatingsTable::builtin)
}

/// What one job file gave.
#[derive(Debug, Default, Clone, Copy)]
pub struct Outcome {
    /// The job decoded and was derived (else it was refused with errors).
    pub derived: bool,
    /// The document's Typst source and charts were built too.
    pub built_source: bool,
    pub took: Duration,
}

/// Runs a job file through everything a user can see without typst:
/// decode, the drawn diagnostics, derive, the terminal summary, the JSON
/// and (when `build_source`) the document's Typst source and charts.
/// `Err` names the first thing wrong: a span outside the text, a failed
/// decode without an error, a non-finite number in any output.
pub fn check_job_text(text: &str, build_source: bool) -> Result<Outcome, String> {
    // The program reads a job on its main thread, or on a batch worker
    // given the same stack (8 MiB); a test thread has 2 MiB, on which the
    // `kdl` crate's recursion over the deepest nesting the depth check
    // allows can overflow. Check under the program's own conditions.
    let owned = text.to_string();
    std::thread::Builder::new()
        .stack_size(PROGRAM_STACK)
        .spawn(move || check_job_text_here(&owned, build_source))
        .expect("a thread for the check")
        .join()
        .unwrap_or_else(|panic| std::panic::resume_unwind(panic))
}

/// The main thread's stack on Linux, which the program reads jobs on. An
/// unoptimised (debug) build's frames are several times larger than a
/// release build's, and 8 MiB was seen to overflow there on the deepest
/// nesting allowed; the release build, which the long run uses, gets
/// exactly the program's 8 MiB.
const PROGRAM_STACK: usize = if cfg!(debug_assertions) {
    64 * 1024 * 1024
} else {
    8 * 1024 * 1024
};

fn check_job_text_here(text: &str, build_source: bool) -> Result<Outcome, String> {
    let started = Instant::now();
    let mut outcome = Outcome::default();
    let diagnostics = match job::decode_with_ratings("fuzz.kdl", text, ratings()) {
        Ok(decoded) => {
            let findings = ampreport::calc::derive(&decoded.job, ratings());
            outcome.derived = true;
            check_findings(&findings)?;
            let summary = terminal::render(
                &decoded.job,
                &findings,
                &TerminalStyle {
                    colour: false,
                    catalogue: ampreport::catalogue::Catalogue::english().clone(),
                },
            );
            no_non_finite_words("terminal summary", &summary, text)?;
            let json = ampreport::report::json::render(&findings);
            let value: serde_json::Value = serde_json::from_str(&json)
                .map_err(|e| format!("calc JSON does not parse: {e}"))?;
            no_non_finite_words("JSON", &json, text)?;
            drop(value);
            if build_source {
                let input = HandoverInput::new(&decoded.job, &findings, text, "0.15.1");
                let templates = TemplateSource::embedded(handover::EMBEDDED_TEMPLATES);
                let document = handover::build(&input, &templates)
                    .map_err(|e| format!("the document could not be built: {e}"))?;
                let job_text = text;
                for (name, bytes) in document.sandbox.files() {
                    if name.ends_with(".typ") || name.ends_with(".svg") {
                        let text = String::from_utf8_lossy(bytes);
                        no_non_finite_words(name, &text, job_text)?;
                    }
                }
                outcome.built_source = true;
            }
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
    outcome.took = started.elapsed();
    Ok(outcome)
}

/// Every number in the findings is finite: walks them as the template
/// sees them, where a NaN or an infinity stays a float (JSON would have
/// turned it into `null`).
fn check_findings(findings: &Findings) -> Result<(), String> {
    fn walk(v: &minijinja::Value, path: &mut Vec<String>) -> Result<(), String> {
        use minijinja::value::ValueKind;
        match v.kind() {
            ValueKind::Number => {
                if let Ok(f) = f64::try_from(v.clone())
                    && !f.is_finite()
                {
                    return Err(format!("{} is {f}", path.join(".")));
                }
            }
            ValueKind::Seq => {
                for (i, item) in v.try_iter().into_iter().flatten().enumerate() {
                    path.push(i.to_string());
                    walk(&item, path)?;
                    path.pop();
                }
            }
            ValueKind::Map => {
                for key in v.try_iter().into_iter().flatten() {
                    let item = v.get_item(&key).unwrap_or_default();
                    path.push(key.to_string());
                    walk(&item, path)?;
                    path.pop();
                }
            }
            _ => {}
        }
        Ok(())
    }
    walk(
        &minijinja::Value::from_serialize(findings),
        &mut vec!["findings".into()],
    )
}

/// No word of `text` reads as a non-finite number. A word the job file
/// itself contains (a job id `D-2611#inf-031`, a note saying "inf") is the
/// user's own text, printed literally, and is not counted; the numbers are
/// held finite by `check_findings` whatever the text says.
fn no_non_finite_words(what: &str, text: &str, job: &str) -> Result<(), String> {
    let in_job = |word: &str| {
        job.split(|c: char| !c.is_ascii_alphanumeric())
            .any(|w| w == word)
    };
    for word in text.split(|c: char| !c.is_ascii_alphanumeric()) {
        if matches!(word, "NaN" | "nan" | "inf" | "Infinity" | "infinity") && !in_job(word) {
            let at = text.find(word).unwrap_or(0);
            let from = (0..=at.saturating_sub(60))
                .rev()
                .find(|&i| text.is_char_boundary(i))
                .unwrap_or(0);
            let to = ((at + 60).min(text.len())..=text.len())
                .find(|&i| text.is_char_boundary(i))
                .unwrap_or(text.len());
            return Err(format!("{what} shows {word:?}: …{}…", &text[from..to]));
        }
    }
    Ok(())
}

/// Every span within the text and on char boundaries.
fn check_spans(text: &str, diagnostics: &JobDiagnostics) -> Result<(), String> {
    for p in &diagnostics.problems {
        let start = p.span.offset();
        let end = start + p.span.len();
        if end > text.len() || !text.is_char_boundary(start) || !text.is_char_boundary(end) {
            return Err(format!(
                "{} span {start}..{end} is outside the text or splits a character: {}",
                p.code, p.message
            ));
        }
    }
    Ok(())
}

// ----- generating job files -------------------------------------------------------

/// SplitMix64: a small, seedable generator, so case `n` of a run can be
/// made again from its seed alone.
pub struct Rng(u64);

impl Rng {
    pub fn new(seed: u64) -> Self {
        Rng(seed)
    }

    pub fn next(&mut self) -> u64 {
        self.0 = self.0.wrapping_add(0x9e37_79b9_7f4a_7c15);
        let mut z = self.0;
        z = (z ^ (z >> 30)).wrapping_mul(0xbf58_476d_1ce4_e5b9);
        z = (z ^ (z >> 27)).wrapping_mul(0x94d0_49bb_1331_11eb);
        z ^ (z >> 31)
    }

    pub fn below(&mut self, n: usize) -> usize {
        (self.next() % n.max(1) as u64) as usize
    }

    pub fn pick<'a, T>(&mut self, items: &'a [T]) -> &'a T {
        &items[self.below(items.len())]
    }
}

/// Numbers as a job file may write them: ordinary readings, the ends of
/// the f64 range, zero and negatives, in every spelling.
fn number(rng: &mut Rng) -> String {
    const SPECIAL: &[&str] = &[
        "0",
        "-0",
        "1e-320",
        "5e-324",
        "1e308",
        "1.7976931348623157e308",
        "-1e308",
        "1e-12",
        "1e-300",
        "31200000",
        "2.2250738585072014e-308",
        "0.000001",
        "999999999999",
        "-1",
        "#inf",
        "#-inf",
        "#nan",
        "1e400",
        "0x7fffffffffffffff",
        "-0x8000000000000000",
        "340282366920938463463374607431768211455",
        "0.5",
        "1",
        "1000",
        "1001",
        "100000",
    ];
    match rng.below(4) {
        0 => rng.pick(SPECIAL).to_string(),
        1 => format!("{}", rng.below(1000)),
        2 => {
            let exp = rng.below(660) as i32 - 330;
            let mantissa = 1.0 + rng.below(9000) as f64 / 1000.0;
            format!("{mantissa}e{exp}")
        }
        _ => format!("{}.{}", rng.below(500) as i64 - 100, rng.below(100)),
    }
}

/// A value as text: a number with a prefix and a unit (right or wrong).
fn quoted_value(rng: &mut Rng) -> String {
    const PREFIX: &[&str] = &["", "", "p", "n", "u", "µ", "m", "k", "M", "G", "T"];
    const UNIT: &[&str] = &["", "", "V", "A", "R", "W", "F", "Hz", "%", "Ω", "mA", "Vac"];
    let n = number(rng);
    if rng.below(6) == 0 {
        // An RKM code such as 4k7 or R47.
        let letter = rng.pick(&["R", "k", "M", "u", "n", "p"]);
        return format!("\"{}{letter}{}\"", rng.below(1000), rng.below(100));
    }
    format!("\"{n}{}{}\"", rng.pick(PREFIX), rng.pick(UNIT))
}

/// Fragments an edit may insert: KDL punctuation, escapes, comment and
/// string openers, unit letters, multi-byte characters.
const FRAGMENTS: &[&str] = &[
    "\"", "\"\"\"", "#", "#\"", "\"#", "{", "}", ";", "=", "\\", "\\t", "\\n", "\\u{b5}",
    "\\u{3bc}", "\\\"", "//", "/*", "*/", "/-", "\n", " ", "\t", "\r\n", "-", "+", ".", "0", "9",
    "e9", "k", "M", "R", "µ", "μ", "Ω", "mA", "V", "%", "#true", "#null", "#inf", "(u8)", "é",
    "日本", "\u{feff}", "\u{2028}", "🔥", "𝔸", "\u{e000}", "ሀ", "ก",
];

/// Byte offsets of the values in a job file: quoted strings that start
/// with a digit, a sign or a dot, and bare numbers after `=` or a space.
fn value_spots(text: &str) -> Vec<(usize, usize)> {
    let bytes = text.as_bytes();
    let mut spots = Vec::new();
    let mut i = 0;
    while i < bytes.len() {
        let b = bytes[i];
        if b == b'"' {
            let Some(len) = text[i + 1..].find(['"', '\n']) else {
                break;
            };
            let end = i + 1 + len;
            if bytes
                .get(i + 1)
                .is_some_and(|c| c.is_ascii_digit() || *c == b'-' || *c == b'.')
            {
                spots.push((i, end + 1));
            }
            i = end + 1;
        } else if (b == b'=' || b == b' ') && bytes.get(i + 1).is_some_and(|c| c.is_ascii_digit()) {
            let end = text[i + 1..]
                .find(|c: char| c.is_whitespace() || c == '}' || c == ';')
                .map_or(text.len(), |l| i + 1 + l);
            spots.push((i + 1, end));
            i = end;
        } else {
            i += 1;
        }
    }
    spots
}

fn boundary(text: &str, pick: usize) -> usize {
    let mut at = pick % (text.len() + 1);
    while !text.is_char_boundary(at) {
        at -= 1;
    }
    at
}

/// One edit to a job file.
pub fn mutate(text: &mut String, rng: &mut Rng) {
    match rng.below(10) {
        0..=3 => {
            // A value replaced by another, from anywhere in the f64 range.
            let spots = value_spots(text);
            if spots.is_empty() {
                return;
            }
            let (a, b) = *rng.pick(&spots);
            let new = if rng.below(2) == 0 {
                quoted_value(rng)
            } else {
                number(rng)
            };
            text.replace_range(a..b, &new);
        }
        4 => {
            let at = boundary(text, rng.next() as usize);
            let f = *rng.pick(FRAGMENTS);
            text.insert_str(at, f);
        }
        5 => {
            let at = boundary(text, rng.next() as usize);
            if let Some(c) = text[at..].chars().next() {
                text.replace_range(at..at + c.len_utf8(), "");
            }
        }
        6 | 7 => {
            let mut lines: Vec<String> = text.split_inclusive('\n').map(String::from).collect();
            if lines.is_empty() {
                return;
            }
            let k = rng.below(lines.len());
            match rng.below(3) {
                0 => {
                    lines.remove(k);
                }
                1 => {
                    let line = lines[k].clone();
                    lines.insert(k, line);
                }
                _ => {
                    let j = rng.below(lines.len());
                    lines.swap(k, j);
                }
            }
            *text = lines.concat();
        }
        8 => {
            // A long run of one fragment: nesting, floods.
            let at = boundary(text, rng.next() as usize);
            let f = *rng.pick(&[
                "/*",
                "/-",
                "{",
                "x {",
                "\"",
                "a\n",
                "valve V9 plate=1e308\n",
            ]);
            let n = 1 + rng.below(600);
            text.insert_str(at, &f.repeat(n));
        }
        _ => {
            let at = boundary(text, rng.next() as usize);
            text.truncate(at);
        }
    }
}

/// Case `seed` of a run: a demo job with 1 to 8 edits.
pub fn generated_job(seed: u64) -> String {
    let mut rng = Rng::new(seed);
    let mut text = rng.pick(&DEMOS).to_string();
    let edits = 1 + rng.below(8);
    for _ in 0..edits {
        mutate(&mut text, &mut rng);
    }
    text
}
