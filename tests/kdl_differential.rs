//! Checks the fast KDL parser against the `kdl` crate's parser: whatever the
//! fast parser accepts, the `kdl` crate must accept too, giving a document
//! with the same names, types, values and spans all the way down. Run over
//! every KDL file in the repository, a list of tricky snippets, and
//! generated and mutated inputs.

use std::path::{Path, PathBuf};

use ampreport::kdl_fast::{fast_tree, parse_document, parse_fast, parse_tree, tree_differs};
use kdl::{KdlDocument, KdlEntry, KdlIdentifier, KdlNode, KdlValue};
use proptest::prelude::*;

// ----- structural comparison ----------------------------------------------

fn same_value(a: &KdlValue, b: &KdlValue) -> bool {
    match (a, b) {
        (KdlValue::Float(x), KdlValue::Float(y)) => {
            x.to_bits() == y.to_bits() || (x.is_nan() && y.is_nan())
        }
        _ => a == b,
    }
}

fn ident(path: &str, a: &KdlIdentifier, b: &KdlIdentifier) -> Result<(), String> {
    if a.value() != b.value() {
        return Err(format!("{path}: value {:?} vs {:?}", a.value(), b.value()));
    }
    if a.span() != b.span() {
        return Err(format!("{path}: span {:?} vs {:?}", a.span(), b.span()));
    }
    Ok(())
}

fn opt_ident(
    path: &str,
    a: Option<&KdlIdentifier>,
    b: Option<&KdlIdentifier>,
) -> Result<(), String> {
    match (a, b) {
        (None, None) => Ok(()),
        (Some(a), Some(b)) => ident(path, a, b),
        _ => Err(format!("{path}: {a:?} vs {b:?}")),
    }
}

fn entry(path: &str, a: &KdlEntry, b: &KdlEntry) -> Result<(), String> {
    if !same_value(a.value(), b.value()) {
        return Err(format!("{path}: value {:?} vs {:?}", a.value(), b.value()));
    }
    if a.span() != b.span() {
        return Err(format!("{path}: span {:?} vs {:?}", a.span(), b.span()));
    }
    opt_ident(&format!("{path}.name"), a.name(), b.name())?;
    opt_ident(&format!("{path}.ty"), a.ty(), b.ty())?;
    let repr = |e: &KdlEntry| e.format().map(|f| f.value_repr.clone());
    if repr(a) != repr(b) {
        return Err(format!("{path}: value_repr {:?} vs {:?}", repr(a), repr(b)));
    }
    Ok(())
}

fn node(path: &str, a: &KdlNode, b: &KdlNode) -> Result<(), String> {
    let path = format!("{path}/{}", b.name().value());
    if a.span() != b.span() {
        return Err(format!("{path}: span {:?} vs {:?}", a.span(), b.span()));
    }
    ident(&format!("{path}.name"), a.name(), b.name())?;
    opt_ident(&format!("{path}.ty"), a.ty(), b.ty())?;
    if a.entries().len() != b.entries().len() {
        return Err(format!(
            "{path}: {} entries vs {}",
            a.entries().len(),
            b.entries().len()
        ));
    }
    for (i, (x, y)) in a.entries().iter().zip(b.entries()).enumerate() {
        entry(&format!("{path}[{i}]"), x, y)?;
    }
    match (a.children(), b.children()) {
        (None, None) => Ok(()),
        (Some(x), Some(y)) => document(&path, x, y),
        (x, y) => Err(format!(
            "{path}: children {} vs {}",
            x.is_some(),
            y.is_some()
        )),
    }
}

fn document(path: &str, a: &KdlDocument, b: &KdlDocument) -> Result<(), String> {
    if a.span() != b.span() {
        return Err(format!(
            "{path}: document span {:?} vs {:?}",
            a.span(),
            b.span()
        ));
    }
    if a.nodes().len() != b.nodes().len() {
        return Err(format!(
            "{path}: {} nodes vs {}",
            a.nodes().len(),
            b.nodes().len()
        ));
    }
    for (x, y) in a.nodes().iter().zip(b.nodes()) {
        node(path, x, y)?;
    }
    Ok(())
}

/// How the two parsers agreed on one input.
#[derive(Debug, PartialEq, Eq)]
enum Outcome {
    /// Both accept, with the same document.
    Same,
    /// The fast parser declines; the `kdl` crate accepts (allowed, counted).
    FastDeclines,
    /// Both decline.
    BothReject,
}

/// Compares the parsers on `text`; an `Err` is a real disagreement.
fn compare(text: &str) -> Result<Outcome, String> {
    let slow = KdlDocument::parse(text);
    tree_agrees(text, &slow)?;
    match (parse_fast(text), slow) {
        (Some(fast), Ok(slow)) => document("", &fast, &slow).map(|()| Outcome::Same),
        (Some(_), Err(e)) => Err(format!(
            "fast accepts what kdl rejects: {:?}",
            e.diagnostics.first().map(|d| &d.message)
        )),
        (None, Ok(_)) => Ok(Outcome::FastDeclines),
        (None, Err(_)) => Ok(Outcome::BothReject),
    }
}

/// The job decode's reading (the fast parser's own tree, or a tree made
/// from the `kdl` crate's document for a valid text it declines) against
/// the `kdl` crate's: the same names, types, values, spans and children,
/// and refused where that crate refuses. (A refused text goes the way
/// `parse_document` sends it, so its errors are that function's; the unit
/// tests compare them.)
fn tree_agrees(text: &str, slow: &Result<KdlDocument, kdl::KdlError>) -> Result<(), String> {
    match (fast_tree(text), slow) {
        (Some(tree), Ok(slow)) => tree_differs("tree", tree.doc(), slow),
        (Some(_), Err(_)) => Err("the fast tree reads what kdl rejects".to_string()),
        (None, Ok(slow)) => match parse_tree(text) {
            Ok(tree) => tree_differs("declined tree", tree.doc(), slow),
            Err(e) => Err(format!("the tree refuses what kdl reads: {e:?}")),
        },
        (None, Err(_)) => Ok(()),
    }
}

fn check(text: &str) -> Outcome {
    match compare(text) {
        Ok(o) => o,
        Err(e) => panic!("parsers disagree on {text:?}: {e}"),
    }
}

// ----- the repository's own files -------------------------------------------

fn repo() -> PathBuf {
    PathBuf::from(env!("CARGO_MANIFEST_DIR"))
}

fn kdl_files(dir: &Path, out: &mut Vec<PathBuf>) {
    let Ok(list) = std::fs::read_dir(dir) else {
        return;
    };
    for entry in list.flatten() {
        let path = entry.path();
        let name = path.file_name().and_then(|n| n.to_str()).unwrap_or("");
        if path.is_dir() {
            // The fuzz corpus holds hostile files (nesting deep enough to
            // overflow the kdl crate's recursive parser) on purpose; the
            // fuzz and hostile-input tests read them through the guard.
            if !matches!(name, "target" | ".git" | "fuzz-corpus") {
                kdl_files(&path, out);
            }
        } else if name.ends_with(".kdl") {
            out.push(path);
        }
    }
}

/// The `kdl` code blocks of the Markdown files.
fn doc_examples() -> Vec<(String, String)> {
    let mut out = Vec::new();
    let mut md = Vec::new();
    for dir in [repo(), repo().join("docs")] {
        if let Ok(list) = std::fs::read_dir(&dir) {
            md.extend(
                list.flatten()
                    .map(|e| e.path())
                    .filter(|p| p.extension().is_some_and(|e| e == "md")),
            );
        }
    }
    for path in md {
        let text = std::fs::read_to_string(&path).unwrap_or_default();
        let mut block: Option<String> = None;
        for line in text.lines() {
            match &mut block {
                None if line.trim_start().starts_with("```kdl") => block = Some(String::new()),
                Some(b) if line.trim_start().starts_with("```") => {
                    out.push((path.display().to_string(), std::mem::take(b)));
                    block = None;
                }
                Some(b) => {
                    b.push_str(line);
                    b.push('\n');
                }
                None => {}
            }
        }
    }
    out
}

#[test]
fn every_kdl_file_in_the_repository_parses_fast_and_the_same() {
    let mut files = Vec::new();
    kdl_files(&repo(), &mut files);
    assert!(files.len() >= 5, "found only {files:?}");
    for path in files {
        let text = std::fs::read_to_string(&path).unwrap();
        assert_eq!(check(&text), Outcome::Same, "{}", path.display());
    }
}

#[test]
fn documentation_examples_parse_fast_and_the_same() {
    let examples = doc_examples();
    assert!(!examples.is_empty());
    for (file, text) in examples {
        let outcome = check(&text);
        // An example may show a broken file on purpose; a valid one must
        // take the fast path.
        assert_ne!(
            outcome,
            Outcome::FastDeclines,
            "an example in {file}:\n{text}"
        );
    }
}

#[test]
fn the_fallback_gives_the_kdl_crates_result() {
    for text in [
        "node \"unclosed",
        "a {",
        "10V",
        "x #t",
        "a\n}",
        "node \"ok\"",
    ] {
        let ours = parse_document(text);
        let theirs = KdlDocument::parse(text);
        match (ours, theirs) {
            (Ok(a), Ok(b)) => document("", &a, &b).unwrap(),
            (Err(a), Err(b)) => {
                let spans = |e: &kdl::KdlError| {
                    e.diagnostics
                        .iter()
                        .map(|d| (d.span, d.message.clone()))
                        .collect::<Vec<_>>()
                };
                assert_eq!(spans(&a), spans(&b), "{text:?}");
            }
            (a, b) => panic!("{text:?}: {a:?} vs {b:?}"),
        }
    }
}

// ----- tricky snippets --------------------------------------------------------

/// Inputs that exercise each part of the grammar; the fast parser must
/// agree with the `kdl` crate on all of them. Those marked `true` must take
/// the fast path.
const SNIPPETS: &[(&str, bool)] = &[
    ("", true),
    ("\u{FEFF}node 1", true),
    ("node", true),
    ("node;", true),
    ("a; b; c", true),
    ("a;b;c;", true),
    ("  \n\n  a  \n  b  ", true),
    ("a\r\nb\rc\u{85}d\u{2028}e\u{2029}f\u{0B}g\u{0C}h", true),
    ("a 1 2 3", true),
    ("a\t1\u{3000}2\u{A0}3", true),
    ("a key=1 other = 2 third= 3 fourth =4", true),
    ("a \"quoted key\"=1 #\"raw key\"#=2", true),
    ("(t)node (u)1 key=(v)\"x\" ( w )2 (\"q t\")3", true),
    ("(t) node", true),
    ("a (t) 1", true),
    ("a { b; c }", true),
    ("a {\n  b {\n    c 1\n  }\n}", true),
    ("a {}", true),
    ("a {   }", true),
    ("a{b}", true),
    ("a {b} ", true),
    ("a {b};c", true),
    ("a { b }\n", true),
    ("a 1 { b }", true),
    ("a #true #false #null #inf #-inf #nan", true),
    ("a #true{}", true),
    ("a #true;b", true),
    ("a 1 -1 +1 1_000 0x1f -0x1F 0o17 0b1010 0X1 0O7 0B1", true),
    (
        "a 1.5 -1.5 1e10 1E10 1.5e-3 1.5E+3 1_0.5_0e1_0 0.0 -0.0",
        true,
    ),
    ("a 170141183460469231731687303715884105727", true),
    ("a -170141183460469231731687303715884105727", true),
    ("a 170141183460469231731687303715884105728", false),
    ("a 1.000000000000000000000000000000000000000000001", true),
    ("a 1.e5", false),
    ("a 1.", false),
    ("a .5", false),
    ("a 1x", false),
    ("a 0x", false),
    ("a 0xg", false),
    ("a 1e", false),
    ("a foo bar-baz _x x.y ++ -- + - . .. -a +b -.a .x", true),
    ("a true", false),
    ("a null", false),
    ("a -inf +inf inf", false),
    ("a -inf +inf", true),
    ("true", false),
    ("a \"\" \"x\" \"a b c\" \"é ü 中\"", true),
    ("a \"\\n\\r\\t\\\\\\\"\\b\\f\\s\"", true),
    ("a \"\\u{41}\\u{1F600}\\u{0}\"", true),
    ("a \"\\u{110000}\"", false),
    ("a \"\\u{D800}\"", false),
    ("a \"\\u{}\"", false),
    ("a \"\\u{1234567}\"", false),
    ("a \"\\q\"", false),
    ("a \"x\\   y\"", true),
    ("a \"x\\\n   y\"", true),
    ("a \"x\\\n\n\t  y\"", true),
    ("a \"line\nbreak\"", false),
    ("a \"tab\there\"", true),
    ("a \"del\u{7F}\"", true),
    ("a \"nul\u{0}\"", false),
    ("a \"bom\u{FEFF}\"", false),
    ("a \"unclosed", false),
    ("a \"x\"\"y\"", false),
    ("a \"x\"y", false),
    ("a #\"raw\"# ##\"r\"#aw\"## #\"\"# #\"a\\nb\"#", true),
    ("a #\"x\"##", false),
    ("a #\"\"\"#", false),
    ("a #\"\"\"abc\"\"\"#", true),
    ("a #\"\"ab\"# #\"\"\"x\"\"#", true),
    ("a #\"unclosed", false),
    ("a \"\"\"\n  one\n    two\n  \"\"\"", true),
    ("a \"\"\"\nflush\n\"\"\"", true),
    ("a \"\"\"\n\"\"\"", true),
    ("a \"\"\"\n  x\n\n  y\n  \"\"\"", true),
    ("a \"\"\"\n  x\n \n      \n  y\n  \"\"\"", true),
    ("a \"\"\"\n  x \\n \\t \\\" \\u{41}\n  \"\"\"", true),
    ("a \"\"\"\n  quotes \" and \"\" here\n  \"\"\"", true),
    ("a \"\"\"\n  \\\"\"\"\n  \"\"\"", true),
    ("a \"\"\"\r\n  x\r\n  y\r\n  \"\"\"", true),
    ("a \"\"\"\n  x\n y\n  \"\"\"", false),
    ("a \"\"\"x\n\"\"\"", false),
    ("a \"\"\"\n  x\"\"\"\n  \"\"\"", false),
    ("a \"\"\"\n  x\n  \"\"\"y", false),
    ("a \"\"\"\n  \\   x\n  \"\"\"", true),
    ("a \"\"\"\n  x \\\n  y\n  \"\"\"", true),
    ("a #\"\"\"\n  raw \\n \"\"\" here\n  \"\"\"#", true),
    ("a ##\"\"\"\n  raw \"\"\"# here\n  \"\"\"##", true),
    ("a #\"\"\"\n\"\n\"\"\"#", false),
    ("a #\"\"\"\n  x\n y\n  \"\"\"#", false),
    ("a \"\"\"\n\t\tx\n\t\t\"\"\"", true),
    ("a \"\"\"\n  unclosed", false),
    ("// comment\na // another\nb", true),
    ("a /* inline */ 1 /* and */ 2", true),
    ("a /* nested /* deeper */ still */ 1", true),
    ("a /* /*/ */ */ 1", true),
    ("a /* unclosed", false),
    ("/* a */ b", true),
    ("a /*\nmulti\nline\n*/ b", true),
    ("a \\\n  b", true),
    ("a \\ // continued\n  b", true),
    ("a \\", true),
    ("a \\ x", false),
    ("a 1 \\\n  2 \\\n  3", true),
    ("/-a\nb", true),
    ("/- a\nb", true),
    ("/-\na\nb", true),
    ("/-a { x }\nb", true),
    ("/-a {x} b", true),
    ("/-a;b", false),
    ("a; /-b; c", false),
    ("a /-1 2", true),
    ("a /- 1 2", true),
    ("a /-key=1 other=2", true),
    ("a /-1 /-2 3", true),
    ("a 1 /-2", true),
    ("a /-{ b }", true),
    ("a /-{ b } { c }", true),
    ("a { c } /-{ d }", true),
    ("a { c } /-{ d } /-{ e }", true),
    ("a /-1 /-{ b } { c }", true),
    ("a 1 /-2 /-{ b }", true),
    ("a {b} /-c", true),
    ("a {b} /-c\nd", false),
    ("a /-\n  b", true),
    ("a /-", false),
    ("/-", false),
    ("a /- /-1 2 3", true),
    ("a #true/-b", true),
    ("a\n/-b {\n  c\n}\nd", true),
    ("{ a }", false),
    ("a { b", false),
    ("a }", false),
    ("}", false),
    ("a {b} {c}", false),
    ("a {b} 1", false),
    ("a=1", false),
    ("a 1=2", false),
    ("a (t)", false),
    ("a (t", false),
    ("a ()1", false),
    ("(t)(u)a", false),
    ("a b=", false),
    ("a [", false),
    ("a b\\c", false),
    ("a \u{200E}", false),
    ("\u{FEFF}\u{FEFF}a", false),
    ("a\u{FEFF}", false),
    ("a \"x\"/-b", false),
    ("a #", false),
    ("a #t", false),
    ("a #truex", false),
    ("a ##x", false),
    ("\"quoted name\" 1", true),
    ("#\"raw name\"# 1", true),
    ("\"\"\"\n  multi name\n  \"\"\" 1", true),
    ("a1 b2 c-3 d.4 é ü", true),
    ("a,b 1,2", false),
    ("a,b c,d", true),
    ("node_with_del\u{7F} 1", true),
    ("a 'single'", true),
    ("a <html>", true),
];

#[test]
fn snippets_agree() {
    let mut wrong = Vec::new();
    for (text, fast) in SNIPPETS {
        match compare(text) {
            Err(e) => wrong.push(format!("{text:?}: {e}")),
            Ok(outcome) if *fast && outcome != Outcome::Same => {
                wrong.push(format!("{text:?}: {outcome:?}, expected the fast path"))
            }
            Ok(_) => {}
        }
    }
    assert!(wrong.is_empty(), "{}", wrong.join("\n"));
}

// ----- generated inputs ---------------------------------------------------------

/// Pieces of KDL, valid and broken, to glue together at random.
const TOKENS: &[&str] = &[
    "node",
    "a",
    "b-c",
    "x.y",
    "+",
    "-",
    ".",
    "..",
    "-x",
    "+.y",
    "true",
    "#true",
    "#false",
    "#null",
    "#inf",
    "#-inf",
    "#nan",
    "#",
    "#t",
    "1",
    "-1",
    "+1",
    "1.5",
    "1e5",
    "1.e5",
    "0x1f",
    "0o7",
    "0b1",
    "0x",
    "1_0",
    "_1",
    "1__",
    ".5",
    "\"s\"",
    "\"\"",
    "\"a b\"",
    "\"\\n\"",
    "\"\\u{41}\"",
    "\"\\q\"",
    "\"x\\ \n y\"",
    "\"unclosed",
    "#\"r\"#",
    "##\"r\"#\"##",
    "#\"\"#",
    "#\"",
    "\"\"\"\n  m\n  \"\"\"",
    "\"\"\"\nx\n\"\"\"",
    "\"\"\"",
    "=",
    " = ",
    "(t)",
    "(t",
    "( t )",
    "()",
    ")",
    "{",
    "}",
    "{ }",
    ";",
    " ",
    "  ",
    "\t",
    "\n",
    "\r\n",
    "\r",
    "\u{85}",
    "\u{2028}",
    "\u{A0}",
    "\u{3000}",
    "//c\n",
    "// c",
    "/* c */",
    "/*",
    "*/",
    "/* /* */ */",
    "\\",
    "\\\n",
    "\\ //c\n",
    "/-",
    "/- ",
    "é",
    "中",
    "\u{FEFF}",
    "\u{7F}",
    "\u{0}",
    "\u{200E}",
    "[",
    "]",
    ",",
    "'",
];

fn token_soup() -> impl Strategy<Value = String> {
    prop::collection::vec(prop::sample::select(TOKENS), 0..40).prop_map(|parts| parts.concat())
}

/// Mostly-valid documents: nodes with entries and children, with space
/// and comments between the parts.
fn structured() -> impl Strategy<Value = String> {
    let value = prop::sample::select(
        &[
            "1",
            "-2",
            "3.5",
            "1e3",
            "0xff",
            "#true",
            "#null",
            "\"text\"",
            "bare",
            "#\"raw\"#",
            "\"esc\\n\"",
            "(t)4",
            "\"\"\"\n  ml\n  \"\"\"",
            "#-inf",
        ][..],
    );
    let space = prop::sample::select(
        &[
            " ",
            "  ",
            "\t",
            " /* c */ ",
            " \\\n  ",
            " /-dropped ",
            " /-k=1 ",
        ][..],
    );
    let entry = (
        space.clone(),
        prop::option::of(prop::sample::select(&["k", "key", "\"q k\"", "p"][..])),
        value,
    )
        .prop_map(|(s, k, v)| match k {
            Some(k) => format!("{s}{k}={v}"),
            None => format!("{s}{v}"),
        });
    let terminator = prop::sample::select(&["\n", ";", "\r\n", " // c\n", "\n\n", ";\n"][..]);
    let leaf = (
        prop::option::of(Just("(ty)")),
        prop::sample::select(&["n", "node", "\"q\"", "x-y"][..]),
        prop::collection::vec(entry, 0..4),
        terminator,
    )
        .prop_map(|(ty, name, entries, term)| {
            format!("{}{name}{}{term}", ty.unwrap_or(""), entries.concat())
        });
    leaf.prop_recursive(3, 24, 4, |inner| {
        (
            prop::sample::select(&["p", "parent"][..]),
            prop::collection::vec(inner, 0..4),
            prop::sample::select(&["", " /-{ x }", " /-{}"][..]),
            prop::sample::select(&["\n", ";", "", " "][..]),
            prop::bool::ANY,
        )
            .prop_map(|(name, kids, after, term, dash)| {
                format!(
                    "{}{name} {{\n{}}}{after}{term}",
                    if dash { "/-" } else { "" },
                    kids.concat()
                )
            })
    })
}

fn demo_jobs() -> Vec<String> {
    let mut files = Vec::new();
    kdl_files(&repo(), &mut files);
    files.sort();
    files
        .iter()
        .filter_map(|p| std::fs::read_to_string(p).ok())
        .collect()
}

/// A demo file with a few edits: bytes removed, tokens inserted.
fn mutated() -> impl Strategy<Value = String> {
    let jobs = demo_jobs();
    (
        0..jobs.len(),
        prop::collection::vec(
            (
                any::<prop::sample::Index>(),
                0usize..4,
                prop::sample::select(TOKENS),
            ),
            1..4,
        ),
    )
        .prop_map(move |(which, edits)| {
            let mut text = jobs[which].clone();
            for (at, cut, insert) in edits {
                let mut i = at.index(text.len() + 1);
                while !text.is_char_boundary(i) {
                    i -= 1;
                }
                let mut j = (i + cut).min(text.len());
                while !text.is_char_boundary(j) {
                    j -= 1;
                }
                text.replace_range(i..j, insert);
            }
            text
        })
}

proptest! {
    #![proptest_config(ProptestConfig { cases: 2000, ..ProptestConfig::default() })]

    #[test]
    fn token_soups_agree(text in token_soup()) {
        prop_assert!(compare(&text).is_ok(), "{:?}: {:?}", text, compare(&text));
    }

    #[test]
    fn structured_documents_agree(text in structured()) {
        let outcome = compare(&text);
        prop_assert!(outcome.is_ok(), "{:?}: {:?}", text, outcome);
    }

    #[test]
    fn arbitrary_text_never_panics(text in ".{0,200}") {
        let _ = parse_fast(&text);
        prop_assert!(compare(&text).is_ok(), "{:?}", text);
    }
}

proptest! {
    // Each case parses a whole demo file with the `kdl` crate, which is
    // slow in debug builds; the long search below does many more.
    #![proptest_config(ProptestConfig { cases: 150, ..ProptestConfig::default() })]

    #[test]
    fn mutated_demo_files_agree(text in mutated()) {
        prop_assert!(compare(&text).is_ok(), "{:?}: {:?}", text, compare(&text));
    }
}

/// Counts, over many generated inputs, how often the fast parser declines
/// a document the `kdl` crate accepts: allowed, but it should be rare for
/// ordinary documents.
#[test]
fn fast_path_declines_rarely_on_ordinary_documents() {
    use proptest::strategy::ValueTree;
    use proptest::test_runner::TestRunner;
    let mut runner = TestRunner::deterministic();
    let strategy = structured();
    let (mut same, mut declined, mut both) = (0, 0, 0);
    let mut examples = Vec::new();
    for _ in 0..1000 {
        let text = strategy.new_tree(&mut runner).unwrap().current();
        match check(&text) {
            Outcome::Same => same += 1,
            Outcome::FastDeclines => {
                declined += 1;
                if examples.len() < 5 {
                    examples.push(text);
                }
            }
            Outcome::BothReject => both += 1,
        }
    }
    println!(
        "structured documents: {same} same, {declined} declined by the fast parser only, {both} rejected by both"
    );
    assert_eq!(
        declined, 0,
        "the fast parser declined valid documents such as {examples:#?}"
    );
}

/// A long random search for disagreements, over token soups and edited
/// snippets. `cargo test --release --test kdl_differential -- --ignored`;
/// `KDL_FUZZ_CASES` sets the number of inputs.
#[test]
#[ignore = "long; run in release with --ignored"]
fn long_random_search() {
    let cases: u64 = std::env::var("KDL_FUZZ_CASES")
        .ok()
        .and_then(|v| v.parse().ok())
        .unwrap_or(200_000);
    let mut seed: u64 = std::env::var("KDL_FUZZ_SEED")
        .ok()
        .and_then(|v| v.parse().ok())
        .unwrap_or(0x9E37_79B9_7F4A_7C15);
    let mut next = move |n: usize| {
        seed ^= seed << 13;
        seed ^= seed >> 7;
        seed ^= seed << 17;
        (seed % n as u64) as usize
    };
    const CHARS: &[&str] = &[
        "a", "1", "-", "+", ".", "_", "e", "x", "#", "\"", "\\", "/", "*", "(", ")", "{", "}", "=",
        ";", " ", "\n", "\r", "\t", "\u{85}", "\u{A0}", "é", "0", "b", "o", "n", "t", "u",
        "\u{2028}", "\u{200E}", "\u{FEFF}", "\u{3000}", "\u{0B}", "\u{0C}", "\u{7F}", "\u{0}", "{",
        "s", "\"\"\"", "#\"", "/-", "//", "/*", "*/",
    ];
    let (mut same, mut declined, mut both) = (0u64, 0u64, 0u64);
    let mut same_by_kind = [0u64; 4];
    let mut wrong = Vec::new();
    let demos = demo_jobs();
    for i in 0..cases {
        let text = match i % 4 {
            // Now and then, a whole demo file with a few characters changed.
            _ if i % 200 == 199 => {
                let mut t = demos[next(demos.len())].clone();
                for _ in 0..1 + next(3) {
                    let mut at = next(t.len() + 1);
                    while !t.is_char_boundary(at) {
                        at -= 1;
                    }
                    let mut end = (at + next(3)).min(t.len());
                    while !t.is_char_boundary(end) {
                        end += 1;
                    }
                    t.replace_range(at..end, CHARS[next(CHARS.len())]);
                }
                t
            }
            3 => random_document(&mut next, 0),
            0 => (0..1 + next(16))
                .map(|_| TOKENS[next(TOKENS.len())])
                .collect::<String>(),
            1 => (0..1 + next(12))
                .map(|_| CHARS[next(CHARS.len())])
                .collect::<String>(),
            _ => {
                let mut t = SNIPPETS[next(SNIPPETS.len())].0.to_string();
                for _ in 0..1 + next(3) {
                    let mut at = next(t.len() + 1);
                    while !t.is_char_boundary(at) {
                        at -= 1;
                    }
                    if next(2) == 0 && at < t.len() {
                        let mut end = at + 1;
                        while !t.is_char_boundary(end) {
                            end += 1;
                        }
                        t.replace_range(at..end, "");
                    } else {
                        t.insert_str(at, CHARS[next(CHARS.len())]);
                    }
                }
                t
            }
        };
        match compare(&text) {
            Ok(Outcome::Same) => {
                same += 1;
                same_by_kind[(i % 4) as usize] += 1;
            }
            Ok(Outcome::FastDeclines) => {
                declined += 1;
                if declined <= 40 {
                    println!("declined: {text:?}");
                }
            }
            Ok(Outcome::BothReject) => both += 1,
            Err(e) => {
                if wrong.len() < 30 {
                    wrong.push(format!("{text:?}: {e}"));
                }
            }
        }
    }
    println!(
        "{cases} inputs: {same} same, {declined} declined by the fast parser only, {both} rejected by both"
    );
    println!(
        "accepted alike, by kind (token soup, character soup, edited snippet, built document): {same_by_kind:?}"
    );
    assert!(wrong.is_empty(), "disagreements:\n{}", wrong.join("\n"));
}

/// A random document built from valid pieces, with slashdashes, comments,
/// line continuations and child blocks in random places.
fn random_document(next: &mut impl FnMut(usize) -> usize, depth: usize) -> String {
    const SPACE: &[&str] = &[
        " ",
        "  ",
        "\t",
        " /* c */ ",
        "/**/",
        " \\\n ",
        " \\ // c\n",
        "\u{3000}",
    ];
    const LINE: &[&str] = &[
        "\n", "\r\n", "\n\n", " // c\n", ";", "; ", "\u{2028}", "\u{85}", "\n  ",
    ];
    const NAME: &[&str] = &[
        "n", "node", "\"q n\"", "#\"r\"#", "x-y", "+", "-x", ".z", "é",
    ];
    const VALUE: &[&str] = &[
        "1",
        "-2",
        "+3",
        "3.5",
        "1e3",
        "1_000",
        "0xff",
        "0b1_0",
        "0o7",
        "#true",
        "#false",
        "#null",
        "#nan",
        "#inf",
        "#-inf",
        "\"t\"",
        "\"e\\n\\u{41}\"",
        "\"w\\  s\"",
        "bare",
        "#\"raw\"#",
        "##\"r\"#\"##",
        "\"\"\"\n  ml\n    x\n  \"\"\"",
        "#\"\"\"\n raw\n \"\"\"#",
        "\"\"",
    ];
    let mut out = String::new();
    for _ in 0..next(4) {
        if next(4) == 0 {
            out.push_str(pick(next, LINE));
        }
        if next(6) == 0 {
            out.push_str("/-");
            out.push_str(pick(next, &["", " ", "\n"]));
        }
        if next(4) == 0 {
            out.push_str(pick(next, &["(t)", "( t )", "(\"q\")", "(t) "]));
        }
        out.push_str(pick(next, NAME));
        for _ in 0..next(4) {
            out.push_str(pick(next, SPACE));
            if next(5) == 0 {
                out.push_str("/-");
                out.push_str(pick(next, &["", " ", "\n  "]));
            }
            if next(3) == 0 {
                out.push_str(pick(next, &["k", "\"q k\"", "p"]));
                out.push_str(pick(next, &["=", " = ", "= ", " ="]));
            }
            if next(5) == 0 {
                out.push_str(pick(next, &["(u)", "(u) "]));
            }
            out.push_str(pick(next, VALUE));
        }
        if next(3) == 0 {
            out.push_str(pick(next, SPACE));
        }
        if depth < 3 && next(3) == 0 {
            if next(4) == 0 {
                out.push_str(" /-{ x }");
            }
            out.push_str(pick(next, &[" {", "{", " {\n"]));
            let inner = random_document(next, depth + 1);
            out.push_str(&inner);
            out.push('}');
            if next(4) == 0 {
                out.push_str(" /-{ y }");
            }
        }
        if next(5) == 0 {
            out.push_str(pick(next, SPACE));
        }
        out.push_str(pick(next, LINE));
    }
    out
}

fn pick(next: &mut impl FnMut(usize) -> usize, list: &[&'static str]) -> &'static str {
    list[next(list.len())]
}

/// The `kdl` crate's reading of `text`, on a thread with room for its
/// recursion on deeply nested text.
fn kdl_reading(text: &str) -> Result<KdlDocument, kdl::KdlError> {
    let text = text.to_string();
    std::thread::Builder::new()
        .stack_size(256 << 20)
        .spawn(move || KdlDocument::parse(&text))
        .expect("thread")
        .join()
        .expect("kdl parse")
}

/// A valid text the fast parser declines is refused when it is over
/// `MAX_FALLBACK_SIZE`, so it must decline none that the depth check lets
/// through: the deepest such nesting of every kind at once (slashdashed
/// blocks, with a run of `/-` in the innermost node and nested comments)
/// takes the fast path and reads as the `kdl` crate reads it.
#[test]
fn the_deepest_text_the_depth_check_passes_takes_the_fast_path() {
    let depth = ampreport::kdl_fast::MAX_FALLBACK_DEPTH;
    let text = format!(
        "/-a {{\n{}b {}{}/-1 {}\n{}}}\nc {}x{} 1\n",
        "/-a {\n".repeat(depth - 1),
        "/- \\\n".repeat(depth / 2),
        "/- /* c */ ".repeat(depth - 1 - depth / 2),
        "2 ".repeat(depth),
        "}\n".repeat(depth - 1),
        "/*".repeat(depth),
        "*/".repeat(depth),
    );
    assert_eq!(ampreport::kdl_fast::too_deep(&text), None);
    let slow = kdl_reading(&text).expect("valid KDL");
    let fast = parse_fast(&text).expect("the fast parser declined it");
    document("", &fast, &slow).unwrap();
    // One level more of any kind is refused by the depth check.
    for deeper in [
        format!("/-a {{\n{text}}}"),
        text.replacen("/- \\", "/- /- \\", 1),
        text.replacen("/*", "/*/*", 1).replacen("*/", "*/*/", 1),
    ] {
        assert!(ampreport::kdl_fast::too_deep(&deeper).is_some());
    }
}

/// Generated valid documents, padded past `MAX_FALLBACK_SIZE` with a
/// comment, read exactly as the `kdl` crate reads them: a large
/// valid file is never refused, whatever forms it uses.
#[test]
fn large_valid_documents_read_as_small_ones() {
    let mut seed: u64 = 0x2545_F491_4F6C_DD1D;
    let mut next = move |n: usize| {
        seed ^= seed << 13;
        seed ^= seed >> 7;
        seed ^= seed << 17;
        (seed % n as u64) as usize
    };
    let padding = format!(
        "\n/* {} */\n",
        "padding ".repeat(ampreport::kdl_fast::MAX_FALLBACK_SIZE / 8)
    );
    let mut valid = 0;
    while valid < 120 {
        let text = random_document(&mut next, 0);
        if KdlDocument::parse(&text).is_err() {
            continue;
        }
        valid += 1;
        let large = format!("{text}{padding}");
        let slow = KdlDocument::parse(&large).expect("still valid");
        match parse_document(&large) {
            Ok(fast) => document("", &fast, &slow).unwrap_or_else(|e| panic!("{text:?}: {e}")),
            Err(e) => panic!(
                "{text:?} refused when large: {:?}",
                e.diagnostics[0].message
            ),
        }
    }
}
