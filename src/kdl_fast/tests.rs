//! Unit tests of the fast KDL parser, one syntax feature at a time, with the
//! values and spans each must give. The differential tests in `tests/`
//! compare it with the `kdl` crate on many more inputs.

use kdl::{KdlDocument, KdlEntry, KdlNode, KdlValue};
use miette::SourceSpan;

use super::{parse_document, parse_fast};

fn fast(text: &str) -> KdlDocument {
    parse_fast(text).unwrap_or_else(|| panic!("the fast parser declined {text:?}"))
}

fn declined(text: &str) -> bool {
    parse_fast(text).is_none()
}

fn only(text: &str) -> KdlNode {
    let doc = fast(text);
    assert_eq!(doc.nodes().len(), 1, "{text:?}");
    doc.nodes()[0].clone()
}

fn values(text: &str) -> Vec<KdlValue> {
    only(text)
        .entries()
        .iter()
        .map(|e| e.value().clone())
        .collect()
}

fn s(text: &str) -> KdlValue {
    KdlValue::String(text.to_string())
}

fn sp(start: usize, len: usize) -> SourceSpan {
    SourceSpan::new(start.into(), len)
}

fn entry(node: &KdlNode, i: usize) -> &KdlEntry {
    &node.entries()[i]
}

#[test]
fn bare_identifiers() {
    assert_eq!(
        values("n a b-c _x x.y + - . .. -x +y -.z .w é 中 a,b 'q' <t> B+1"),
        [
            "a", "b-c", "_x", "x.y", "+", "-", ".", "..", "-x", "+y", "-.z", ".w", "é", "中",
            "a,b", "'q'", "<t>", "B+1"
        ]
        .map(s)
    );
    // As the `kdl` crate reads them, a sign before `inf` makes a string.
    assert_eq!(values("n -inf +inf"), [s("-inf"), s("+inf")]);
}

#[test]
fn identifiers_that_may_not_be_bare_are_declined() {
    for word in ["true", "false", "null", "inf", "nan"] {
        assert!(declined(&format!("n {word}")), "{word}");
        assert!(declined(word), "{word}");
    }
    for bad in [
        "n a[b", "n a]", "n a\\b", "n a#b", "n a\"b", "n a(b", "n .5", "n +.5", "n 1a",
    ] {
        assert!(declined(bad), "{bad:?}");
    }
}

#[test]
fn quoted_strings_and_escapes() {
    assert_eq!(
        values(r#"n "" "plain" "a b" "\n\r\t\\\"\b\f\s" "\u{41}\u{e9}\u{1F600}" "µ Ω""#),
        [
            s(""),
            s("plain"),
            s("a b"),
            s("\n\r\t\\\"\u{8}\u{c} "),
            s("Aé😀"),
            s("µ Ω")
        ]
    );
    for bad in [
        r#"n "\q""#,
        r#"n "\u{}""#,
        r#"n "\u{110000}""#,
        r#"n "\u{D800}""#,
        r#"n "\u41""#,
        "n \"a\nb\"",
        "n \"open",
    ] {
        assert!(declined(bad), "{bad:?}");
    }
}

#[test]
fn whitespace_escapes_join_text() {
    assert_eq!(values("n \"a\\   b\""), [s("ab")]);
    assert_eq!(values("n \"a\\\n    b\""), [s("ab")]);
    assert_eq!(values("n \"a \\\r\n\n\t  b\""), [s("a b")]);
}

#[test]
fn raw_strings() {
    assert_eq!(
        values(
            r####"n #"plain"# #"with "quotes" and \n"# ##"has "# inside"## ###"a"##b"### #""#"####
        ),
        [
            s("plain"),
            s("with \"quotes\" and \\n"),
            s("has \"# inside"),
            s("a\"##b"),
            s("")
        ]
    );
    assert!(declined("n #\"open"));
    assert!(declined("n #\"a\"##"));
    assert!(declined("n #\"a\nb\"#"));
}

#[test]
fn multi_line_strings_are_dedented() {
    let text = "n \"\"\"\n    first\n      indented\n\n    last\n    \"\"\"";
    assert_eq!(values(text), [s("first\n  indented\n\nlast")]);
    assert_eq!(values("n \"\"\"\nflush\n\"\"\""), [s("flush")]);
    assert_eq!(values("n \"\"\"\n\"\"\""), [s("")]);
    assert_eq!(values("n \"\"\"\r\n  a\r\n  b\r\n  \"\"\""), [s("a\nb")]);
    assert_eq!(
        values("n \"\"\"\n  esc \\t \\\"\"\" \"q\" \"\"\n  \"\"\""),
        [s("esc \t \"\"\" \"q\" \"\"")]
    );
    assert_eq!(
        values("n \"\"\"\n  joined \\\n  here\n  \"\"\""),
        [s("joined here")]
    );
    // A line indented less than the closing quotes is an error.
    assert!(declined("n \"\"\"\n  a\n b\n  \"\"\""));
    // Text after the opening quotes, or `"""` inside a line, is an error.
    assert!(declined("n \"\"\"a\n\"\"\""));
    assert!(declined("n \"\"\"\n  a\"\"\"\n  \"\"\""));
}

#[test]
fn raw_multi_line_strings() {
    let text = "n #\"\"\"\n  C:\\path \"\"\" \\n\n    more\n  \"\"\"#";
    assert_eq!(values(text), [s("C:\\path \"\"\" \\n\n  more")]);
    assert_eq!(
        values("n ##\"\"\"\n  a \"\"\"# b\n  \"\"\"##"),
        [s("a \"\"\"# b")]
    );
}

#[test]
fn numbers() {
    use KdlValue::{Float, Integer};
    assert_eq!(
        values("n 0 1 -1 +1 1_000 007 0x1f -0xFF 0X1 0o17 0O7 0b1010 -0b1 0B1 0xdead_beef"),
        [
            Integer(0),
            Integer(1),
            Integer(-1),
            Integer(1),
            Integer(1000),
            Integer(7),
            Integer(31),
            Integer(-255),
            Integer(1),
            Integer(15),
            Integer(7),
            Integer(10),
            Integer(-1),
            Integer(1),
            Integer(0xdead_beef)
        ]
    );
    assert_eq!(
        values("n 1.5 -2.25 +0.5 1e3 1E3 1.5e-3 2.5E+2 1_0.2_5 1e1_0"),
        [
            Float(1.5),
            Float(-2.25),
            Float(0.5),
            Float(1e3),
            Float(1e3),
            Float(1.5e-3),
            Float(250.0),
            Float(10.25),
            Float(1e10)
        ]
    );
    assert_eq!(
        values("n 170141183460469231731687303715884105727"),
        [Integer(i128::MAX)]
    );
    assert_eq!(
        values("n -170141183460469231731687303715884105727"),
        [Integer(-i128::MAX)]
    );
    for bad in [
        "n 170141183460469231731687303715884105728",
        "n 1.",
        "n 1.e5",
        "n 1e",
        "n 1e+",
        "n 0x",
        "n 0xg",
        "n 0b2",
        "n 0o8",
        "n 1_a",
        "n 1.5.5",
        "n 10V",
    ] {
        assert!(declined(bad), "{bad:?}");
    }
}

#[test]
fn keywords() {
    let v = values("n #true #false #null #inf #-inf #nan");
    assert_eq!(
        v[..5],
        [
            KdlValue::Bool(true),
            KdlValue::Bool(false),
            KdlValue::Null,
            KdlValue::Float(f64::INFINITY),
            KdlValue::Float(f64::NEG_INFINITY)
        ]
    );
    assert!(matches!(v[5], KdlValue::Float(f) if f.is_nan()));
    assert!(declined("n #t"));
    assert!(declined("n #True"));
    assert!(declined("n #truex"));
}

#[test]
fn type_annotations_and_their_spans() {
    let n = only("(ty)n (u8)1 ( spaced )2 (\"quoted\")3 (t) 4");
    assert_eq!(
        n.ty().map(|t| (t.value(), t.span())),
        Some(("ty", sp(1, 2)))
    );
    assert_eq!(n.name().span(), sp(4, 1));
    let tys: Vec<_> = n
        .entries()
        .iter()
        .map(|e| e.ty().map(|t| (t.value().to_string(), t.span())))
        .collect();
    assert_eq!(
        tys,
        [
            Some(("u8".into(), sp(7, 2))),
            Some(("spaced".into(), sp(14, 6))),
            Some(("quoted".into(), sp(25, 8))),
            Some(("t".into(), sp(37, 1)))
        ]
    );
    // An entry's span starts at its type annotation.
    assert_eq!(entry(&n, 0).span(), sp(6, 5));
    assert_eq!(entry(&n, 3).span(), sp(36, 5));
    for bad in ["n (t", "n ()1", "n (t)", "(t)(u)n", "n (t)true"] {
        assert!(declined(bad), "{bad:?}");
    }
}

#[test]
fn properties_and_their_spans() {
    let n = only("n a=1 b = \"x\" \"c d\"= #true e =(t)2");
    let got: Vec<_> = n
        .entries()
        .iter()
        .map(|e| {
            (
                e.name().map(|k| (k.value().to_string(), k.span())),
                e.value().clone(),
                e.span(),
            )
        })
        .collect();
    assert_eq!(
        got,
        [
            (Some(("a".into(), sp(2, 1))), KdlValue::Integer(1), sp(2, 3)),
            (Some(("b".into(), sp(6, 1))), s("x"), sp(6, 7)),
            (
                Some(("c d".into(), sp(14, 5))),
                KdlValue::Bool(true),
                sp(14, 12)
            ),
            (
                Some(("e".into(), sp(27, 1))),
                KdlValue::Integer(2),
                sp(27, 7)
            ),
        ]
    );
    assert_eq!(
        entry(&n, 1).format().map(|f| f.value_repr.as_str()),
        Some("\"x\"")
    );
    assert!(declined("n a="));
    assert!(declined("n a=b=c"));
    assert!(declined("n=1"));
}

#[test]
fn node_spans_run_to_the_terminator() {
    let doc = fast("  first 1  // note\nsecond { inner 2 }\n");
    let spans: Vec<_> = doc
        .nodes()
        .iter()
        .map(|n| (n.name().value().to_string(), n.span(), n.name().span()))
        .collect();
    assert_eq!(
        spans,
        [
            ("first".into(), sp(2, 9), sp(2, 5)),
            ("second".into(), sp(19, 18), sp(19, 6))
        ]
    );
    assert_eq!(doc.span(), sp(2, 35));
    let children = doc.nodes()[1].children().unwrap();
    assert_eq!(children.span(), sp(28, 8));
    assert_eq!(children.nodes()[0].span(), sp(28, 8));
    assert_eq!(entry(&doc.nodes()[0], 0).span(), sp(8, 1));
}

#[test]
fn children_and_terminators() {
    let doc = fast("a; b;c\nd { e; f { g } }; h {}\ni{j}");
    let names: Vec<_> = doc
        .nodes()
        .iter()
        .map(|n| n.name().value().to_string())
        .collect();
    assert_eq!(names, ["a", "b", "c", "d", "h", "i"]);
    let d = &doc.nodes()[3];
    let inner: Vec<_> = d
        .children()
        .unwrap()
        .nodes()
        .iter()
        .map(|n| n.name().value().to_string())
        .collect();
    assert_eq!(inner, ["e", "f"]);
    assert_eq!(doc.nodes()[4].children().map(|d| d.nodes().len()), Some(0));
    for bad in ["a {", "a }", "}", "{ a }", "a {b} {c}", "a {b} c"] {
        assert!(declined(bad), "{bad:?}");
    }
}

#[test]
fn newlines_of_every_kind_separate_nodes() {
    let doc = fast("a\r\nb\rc\u{85}d\u{0B}e\u{0C}f\u{2028}g\u{2029}h\ni");
    assert_eq!(doc.nodes().len(), 9);
    assert_eq!(doc.nodes()[1].span(), sp(3, 1));
    assert_eq!(doc.nodes()[4].span(), sp(10, 1));
}

#[test]
fn spaces_of_every_kind_separate_entries() {
    assert_eq!(
        values("n\t1\u{A0}2\u{3000}3\u{2000}4 5"),
        (1..=5).map(KdlValue::Integer).collect::<Vec<_>>()
    );
}

#[test]
fn line_continuations() {
    let n = only("n 1 \\\n  2 \\ // comment\n  3");
    assert_eq!(n.entries().len(), 3);
    assert_eq!(entry(&n, 2).span(), sp(25, 1));
    assert!(declined("n 1 \\ 2"));
}

#[test]
fn comments() {
    let doc = fast(
        "// top\na /* one */ 1 /* nested /* two */ still */ 2 // end\n/* block\nover lines */ b",
    );
    assert_eq!(doc.nodes().len(), 2);
    assert_eq!(doc.nodes()[0].entries().len(), 2);
    assert!(declined("a /* open"));
    assert!(declined("a /* /* */"));
}

#[test]
fn slashdash_comments() {
    // `/-{` comments out a child block, and there is no node for it here.
    assert!(declined("/-{ a }"));
    let doc =
        fast("/-gone 1\nkept /-1 2 /-k=3 /-{ dropped } { child } /-{ also }\n/-\nalso-gone\nlast");
    let names: Vec<_> = doc
        .nodes()
        .iter()
        .map(|n| n.name().value().to_string())
        .collect();
    assert_eq!(names, ["kept", "last"]);
    let kept = &doc.nodes()[0];
    assert_eq!(kept.entries().len(), 1);
    assert_eq!(entry(kept, 0).value(), &KdlValue::Integer(2));
    assert_eq!(entry(kept, 0).span(), sp(18, 1));
    assert_eq!(kept.children().map(|d| d.nodes().len()), Some(1));
    assert_eq!(doc.span(), sp(9, 69));
    assert!(declined("/-"));
    assert!(declined("a /-"));
}

#[test]
fn a_byte_order_mark_counts_in_offsets() {
    let n = only("\u{FEFF}n 1");
    assert_eq!(n.span(), sp(3, 3));
    assert!(declined("n \u{FEFF}"));
}

#[test]
fn deep_nesting_is_read_up_to_the_limit() {
    let depth = super::parser::MAX_DEPTH as usize;
    let text = "a {".repeat(depth) + &"}".repeat(depth);
    let mut doc = fast(&text);
    let mut levels = 0;
    while let Some(inner) = doc.nodes().first().and_then(|n| n.children()).cloned() {
        levels += 1;
        doc = inner;
    }
    assert_eq!(levels, depth);
}

#[test]
fn deep_nesting_is_declined_without_overflowing() {
    let deep = "a {".repeat(5000);
    assert!(declined(&deep));
    let dashes = "a ".to_string() + &"/-".repeat(5000) + "1";
    assert!(declined(&dashes));
}

#[test]
fn declined_text_gets_the_kdl_crates_diagnostics() {
    let ours = parse_document("node \"open").unwrap_err();
    let theirs = KdlDocument::parse("node \"open").unwrap_err();
    assert_eq!(ours.diagnostics.len(), theirs.diagnostics.len());
    assert_eq!(ours.diagnostics[0].span, theirs.diagnostics[0].span);
    assert_eq!(ours.diagnostics[0].message, theirs.diagnostics[0].message);
    // Valid text nested deeper than the fast parser goes is refused with a
    // nesting diagnostic rather than handed to the `kdl` crate, whose
    // recursion would overflow the stack.
    let depth = super::parser::MAX_DEPTH as usize + 10;
    let deep = "a {".repeat(depth) + &"}".repeat(depth);
    assert!(declined(&deep));
    let err = parse_document(&deep).unwrap_err();
    assert!(
        err.diagnostics[0]
            .message
            .as_deref()
            .unwrap_or("")
            .contains("nested more than")
    );
}

#[test]
fn the_too_deep_span_never_splits_a_character() {
    // Found by the long fuzz run (seed 825,745): a run of `{` with a
    // three-byte letter after the place nesting goes too deep.
    for (braces, tail) in
        (45..60).flat_map(|n| ["\u{1200}{{", "é", "\u{1F600}", ""].map(|t| (n, t)))
    {
        let text = "{".repeat(braces) + tail;
        let Err(err) = parse_document(&text) else {
            panic!("{braces} braces and {tail:?} were read as a document");
        };
        let span = err.diagnostics[0].span;
        let (start, end) = (span.offset(), span.offset() + span.len());
        assert!(end <= text.len(), "{tail:?}: span {start}..{end}");
        assert!(
            text.is_char_boundary(start) && text.is_char_boundary(end),
            "{tail:?}: span {start}..{end} splits a character"
        );
        assert!(!span.is_empty(), "{tail:?}: empty span");
    }
}

#[test]
fn blocks_commented_out_with_slashdash_are_counted_where_they_nest() {
    for (text, dashed) in [
        ("a /- { b /- { c { } } }", 2),
        ("a /- {} b /- {} c /- {}", 1),
        ("a /- { } b { c /- { d /- { } } }", 2),
        ("/- a { b { } }", 0),
        ("a /-b { }", 0),
        ("a /-\n{ b /* note */ /- \\\n { } }", 2),
        ("a { b { c { } } }", 0),
        // Unbalanced: counted upwards, never below what is open.
        ("a /- { b /- { c /- {", 3),
        ("}}} a /- {", 1),
    ] {
        assert_eq!(super::measure(text).dashed_blocks, dashed, "{text:?}");
    }
    for (text, blocks) in [
        ("a { b { c { } } } d { }", 3),
        ("a \"{{\" { }", 3),
        ("a { } b { } c { }", 1),
        ("}} a {", 1),
    ] {
        assert_eq!(super::measure(text).blocks, blocks, "{text:?}");
    }
}

#[test]
fn a_broken_text_with_deep_dashed_blocks_gets_its_first_error_only() {
    let deep = format!(
        "{}= =\n",
        "a /- {\n".repeat(super::MAX_FALLBACK_DASHED_BLOCKS + 1)
    );
    let e = super::parse_document(&deep).expect_err("broken");
    assert_eq!(e.diagnostics.len(), 1);
    let d = &e.diagnostics[0];
    assert_eq!(d.span.offset(), deep.find('=').expect("the `=`"));
    assert!(
        d.help
            .as_deref()
            .unwrap_or("")
            .contains("so only the first syntax error")
    );
    // At the limit the `kdl` crate still gives its full report.
    let shallow = format!(
        "{}= =\n",
        "a /- {\n".repeat(super::MAX_FALLBACK_DASHED_BLOCKS)
    );
    let e = super::parse_document(&shallow).expect_err("broken");
    assert!(e.diagnostics.iter().all(|d| {
        !d.help
            .as_deref()
            .unwrap_or("")
            .contains("only the first syntax error")
    }));
    // Plain blocks past their own limit: the first error only too.
    let deep = format!("{}= =\n", "a {\n".repeat(super::MAX_FALLBACK_BLOCKS + 1));
    let e = super::parse_document(&deep).expect_err("broken");
    assert_eq!(e.diagnostics.len(), 1);
    assert_eq!(
        e.diagnostics[0].span.offset(),
        deep.find('=').expect("the `=`")
    );
    let shallow = format!("{}= =\n", "a {\n".repeat(super::MAX_FALLBACK_BLOCKS));
    let e = super::parse_document(&shallow).expect_err("broken");
    assert!(e.diagnostics.iter().all(|d| {
        !d.help
            .as_deref()
            .unwrap_or("")
            .contains("only the first syntax error")
    }));
}

#[test]
fn the_tree_is_the_kdl_crates_document() {
    // The repository's KDL files, the fuzz corpus and snippets: whatever
    // the fast parser reads, its tree has the names, types, values, spans
    // and children the `kdl` crate gives; a text it declines is read by
    // that crate (kept, with its text owned, when valid); a broken text is
    // refused with the errors `parse_document` gives, in the same places.
    let root = std::path::Path::new(env!("CARGO_MANIFEST_DIR"));
    let mut texts: Vec<String> = Vec::new();
    for dir in ["jobs", "ratings", "tests/fuzz-corpus", "templates"] {
        let mut paths: Vec<_> = std::fs::read_dir(root.join(dir))
            .unwrap()
            .map(|e| e.unwrap().path())
            .filter(|p| p.extension().is_some_and(|x| x == "kdl" || x == "txt"))
            .collect();
        paths.sort();
        texts.extend(paths.iter().map(|p| std::fs::read_to_string(p).unwrap()));
    }
    assert!(texts.len() > 15, "{}", texts.len());
    texts.extend(
        [
            "n (t)1 (u)\"x\" k=(v)#true \"q\"=r ##\"raw\"## 0x1F 1.5e3 #null",
            "a { b 1; c d=\"e\\n\" { f } }\n/- g 2\nh /- 3 4 /- { i }",
            "a /- { x 1 { y 2 } } { b 3 { c \"\\u{b5}\" } } /- { z }\nd /- e { f 4 }\n/- g { h 5 }\ni 6",
            "a { /- b { c 1 } ; d 2 { e 3 } }\n(t)f g=(u)7 {}\n",
            "n \"\"\"\n  multi\n  \"\"\" k=#inf\n",
            "\u{FEFF}a 1",
            "",
            "broken {",
            "n k=",
        ]
        .map(str::to_string),
    );
    let mut fast_ones = 0;
    for text in &texts {
        let tree = super::parse_tree(text);
        if super::fast_tree(text).is_some() {
            // Read fast: against the kdl crate's own reading.
            fast_ones += 1;
            let doc = KdlDocument::parse(text).expect("the kdl crate reads it too");
            super::tree_differs("", tree.expect("read").doc(), &doc)
                .unwrap_or_else(|e| panic!("{e} in {text:?}"));
            continue;
        }
        // Declined: as `parse_document` reads it (the kdl crate's parser,
        // behind the guards against deep or large broken text).
        match (tree, parse_document(text)) {
            (Ok(tree), Ok(doc)) => super::tree_differs("", tree.doc(), &doc)
                .unwrap_or_else(|e| panic!("{e} in {text:?}")),
            (Err(a), Err(b)) => {
                assert_eq!(a.diagnostics.len(), b.diagnostics.len());
                for (x, y) in a.diagnostics.iter().zip(&b.diagnostics) {
                    assert_eq!((x.span, &x.message), (y.span, &y.message));
                }
            }
            (a, b) => panic!("{text:?}: {:?} against {:?}", a.is_ok(), b.is_ok()),
        }
    }
    assert!(fast_ones > 10, "{fast_ones}");
}

#[test]
fn a_tree_from_the_kdl_crates_document_reads_the_same() {
    // The tree made for a valid text the fast parser declines is held to
    // the fast tree on texts both can read.
    let root = std::path::Path::new(env!("CARGO_MANIFEST_DIR"));
    let mut read = 0;
    for entry in std::fs::read_dir(root.join("jobs")).unwrap() {
        let path = entry.unwrap().path();
        if path.extension().is_none_or(|x| x != "kdl") {
            continue;
        }
        let text = std::fs::read_to_string(path).unwrap();
        let Ok(doc) = KdlDocument::parse(&text) else {
            continue;
        };
        let owned = super::Tree::from_document(&doc);
        super::tree_differs("", owned.doc(), &doc).unwrap();
        let fast = super::fast_tree(&text).expect("a demo job is read fast");
        super::tree_differs("", fast.doc(), &doc).unwrap();
        read += 1;
    }
    assert!(read >= 4, "{read}");
}
