use super::*;
use crate::job::JobDiagnostics;

/// The first part of every catalogue key: what the message belongs to.
const NAMESPACES: &[&str] = &[
    "doc",
    "status",
    "period",
    "notice",
    "date",
    "term",
    "reason",
    "threshold",
    "note",
    "place",
    "list",
    "summary",
    "attention",
    "chart",
    "family",
    "brief",
    "warn",
    "bench",
    "safety",
    "method",
    "role",
    "check",
    "figure",
    "listing",
    "diag",
    "cli",
];

/// Every `t("key")`/`tm("key")` of a template and every
/// `.text("key")`/`.format("key"` of the program's source.
fn keys_used() -> Vec<(String, String)> {
    let root = std::path::Path::new(env!("CARGO_MANIFEST_DIR"));
    let mut files = vec![root.join("templates/handover.typ")];
    let mut dirs = vec![root.join("src")];
    while let Some(dir) = dirs.pop() {
        for entry in std::fs::read_dir(dir).unwrap() {
            let path = entry.unwrap().path();
            if path.is_dir() {
                dirs.push(path);
            } else if path.extension().is_some_and(|e| e == "rs") {
                files.push(path);
            }
        }
    }
    let mut used = Vec::new();
    for file in files {
        if file.ends_with("catalogue/tests.rs") {
            continue;
        }
        let text = std::fs::read_to_string(&file).unwrap();
        for (i, _) in text.match_indices('"') {
            let rest = &text[i + 1..];
            let Some(end) = rest.find('"') else { continue };
            let key = &rest[..end];
            let namespace = key.split('-').next().unwrap_or("");
            let is_key = NAMESPACES.contains(&namespace)
                && key.len() > namespace.len() + 1
                && key
                    .chars()
                    .all(|c| c.is_ascii_lowercase() || c.is_ascii_digit() || c == '-');
            // `doc-row-` is completed in the template by the row's kind,
            // `month-` by the month's number.
            if is_key && !key.ends_with('-') {
                used.push((key.to_owned(), file.display().to_string()));
            }
        }
    }
    used
}

#[test]
fn the_operating_systems_answers_are_catalogue_words() {
    use std::io::{Error, ErrorKind};
    let de = Catalogue::built_in("de").unwrap();
    let en = Catalogue::english();
    for (kind, english, german) in [
        (
            ErrorKind::NotFound,
            "there is no such file or folder",
            "diese Datei oder dieser Ordner existiert nicht",
        ),
        (
            ErrorKind::PermissionDenied,
            "permission denied",
            "keine Berechtigung",
        ),
        (
            ErrorKind::IsADirectory,
            "it is a folder, not a file",
            "das ist ein Ordner, keine Datei",
        ),
        (
            ErrorKind::FileTooLarge,
            "the file is too large for the file system",
            "die Datei ist zu groß für das Dateisystem",
        ),
    ] {
        let msg = os_error(&Error::from(kind));
        assert_eq!(en.say(&msg), english);
        assert_eq!(de.say(&msg), german);
    }
    // An answer with no words of its own is quoted as the system gave it;
    // invalid data keeps what found it as a detail.
    let odd = Error::other("odd device");
    assert_eq!(de.say(&os_error(&odd)), "odd device");
    let bad = Error::new(ErrorKind::InvalidData, "stream did not contain valid UTF-8");
    assert_eq!(
        de.say(&os_error(&bad)),
        "die Daten sind ungültig (stream did not contain valid UTF-8)"
    );
}

#[test]
fn every_key_the_program_uses_is_in_the_english_catalogue() {
    let english = Catalogue::english();
    let used = keys_used();
    // The scan finds the template's labels and the program's sentences.
    assert!(used.len() > 250, "only {} keys found", used.len());
    assert!(used.iter().any(|(k, _)| k == "doc-glance-basis"));
    for (key, file) in &used {
        assert!(
            english.has(key),
            "{key} (used in {file}) is not in messages/en.ftl"
        );
    }
    // The network rows' kinds complete `doc-row-`.
    for kind in ["before", "after", "change"] {
        assert!(english.has(&format!("doc-row-{kind}")));
    }
}

#[test]
fn the_built_in_catalogues_are_complete_and_consistent() {
    check_translation("en.ftl", ENGLISH).expect("English checks against itself");
    if let Err(d) = check_translation("de.ftl", GERMAN) {
        panic!("{:?}", miette::Report::new(d));
    }
    for (tag, _) in BUILT_IN {
        let c = Catalogue::built_in(tag).unwrap();
        assert_eq!(c.language(), *tag);
        // The phrases checked in the PDF are the notice's own words.
        let deadly = c.text("notice-deadly");
        let codes = c.text("notice-codes");
        assert!(deadly.starts_with(&c.text("notice-check-opening")), "{tag}");
        assert!(codes.ends_with(&c.text("notice-check-closing")), "{tag}");
    }
    assert_eq!(Catalogue::built_in("de-AT").unwrap().language(), "de");
    assert!(Catalogue::built_in("xx").is_none());
}

#[test]
fn dates_and_periods_follow_the_language() {
    let d = NaiveDate::from_ymd_opt(2026, 11, 9).unwrap();
    assert_eq!(Catalogue::english().date(d), "9 November 2026");
    let de = Catalogue::built_in("de").unwrap();
    assert_eq!(de.date(d), "9. November 2026");
    assert_eq!(
        de.date(NaiveDate::from_ymd_opt(2027, 3, 1).unwrap()),
        "1. März 2027"
    );
    // English stays what chrono's "%-d %B %Y" gave before the catalogue.
    for month in 1..=12 {
        let d = NaiveDate::from_ymd_opt(2026, month, 28).unwrap();
        assert_eq!(
            Catalogue::english().date(d),
            d.format("%-d %B %Y").to_string()
        );
    }
    let en = Catalogue::english();
    assert_eq!(
        en.format("period-days", &[("count", Arg::from(90usize))]),
        "90 days"
    );
    assert_eq!(
        en.format("period-years", &[("count", Arg::from(1usize))]),
        "1 year"
    );
    assert_eq!(
        de.format("period-months", &[("count", Arg::from(6usize))]),
        "6 Monate"
    );
    // No Unicode isolation marks around arguments.
    let words = en.format("doc-job", &[("id", Arg::from("D-1"))]);
    assert_eq!(words, "Job D-1");
}

fn problems(name: &str, text: &str) -> JobDiagnostics {
    check_translation(name, text).expect_err("the translation has problems")
}

/// The German catalogue without the line defining `key`.
fn german_without(key: &str) -> String {
    let mut out = String::new();
    let mut skipping = false;
    for line in GERMAN.split_inclusive('\n') {
        if line.starts_with(&format!("{key} =")) {
            skipping = true;
            continue;
        }
        if skipping && line.starts_with(' ') {
            continue;
        }
        skipping = false;
        out.push_str(line);
    }
    out
}

#[test]
fn a_missing_key_is_an_error_naming_it_and_the_english_line() {
    let text = german_without("doc-subtotal");
    let d = problems("shop-de.ftl", &text);
    assert_eq!(d.problems.len(), 1, "{:?}", d.problems);
    let p = &d.problems[0];
    assert_eq!(p.code, "catalogue::missing-key");
    assert!(p.message.contains("`doc-subtotal`"), "{}", p.message);
    let line = ENGLISH
        .lines()
        .position(|l| l.starts_with("doc-subtotal ="))
        .unwrap()
        + 1;
    let help = p.help.as_deref().unwrap();
    assert!(
        help.contains(&format!("messages/en.ftl:{line}: Subtotal")),
        "{help}"
    );
    assert!(Catalogue::from_translation("de", "shop-de.ftl", &text).is_err());
}

#[test]
fn the_notice_is_translated_whole_or_refused() {
    let text = german_without("notice-fuses");
    let d = problems("de.ftl", &text);
    assert_eq!(d.problems.len(), 1, "{:?}", d.problems);
    assert_eq!(d.problems[0].code, "catalogue::notice-incomplete");
    assert!(
        d.problems[0]
            .message
            .contains("only as a whole; missing: notice-fuses")
    );
    // A file with no notice at all names every part.
    let none: String = GERMAN
        .lines()
        .filter(|l| !l.starts_with("notice-"))
        .map(|l| format!("{l}\n"))
        .collect();
    let d = problems("de.ftl", &none);
    assert!(
        NOTICE_KEYS
            .iter()
            .all(|k| d.problems[0].message.contains(k)),
        "{}",
        d.problems[0].message
    );
}

#[test]
fn unknown_keys_arguments_and_syntax_are_errors_at_their_line() {
    let text = format!("{GERMAN}doc-subtotl = Summe\n");
    let d = problems("de.ftl", &text);
    let p = &d.problems[0];
    assert_eq!(p.code, "catalogue::unknown-key");
    assert_eq!(d.line_column(p.span.offset()).0, text.lines().count());
    assert!(p.help.as_deref().unwrap().contains("`doc-subtotal`"));

    let text = GERMAN.replace(
        "doc-total = Gesamt, { $currency }",
        "doc-total = Gesamt, { $waehrung }",
    );
    let d = problems("de.ftl", &text);
    let p = &d.problems[0];
    assert_eq!(p.code, "catalogue::unknown-argument");
    let line = text
        .lines()
        .position(|l| l.starts_with("doc-total ="))
        .unwrap()
        + 1;
    assert_eq!(d.line_column(p.span.offset()), (line, 1));
    assert!(p.help.as_deref().unwrap().contains("{ $currency }"));

    let text = GERMAN.replace("doc-and = und", "doc-and = und { $");
    let d = problems("de.ftl", &text);
    assert!(d.problems.iter().any(|p| p.code == "catalogue::syntax"));
    let line = text
        .lines()
        .position(|l| l.starts_with("doc-and ="))
        .unwrap()
        + 1;
    let syntax = d
        .problems
        .iter()
        .find(|p| p.code == "catalogue::syntax")
        .unwrap();
    assert_eq!(d.line_column(syntax.span.offset()).0, line);
}

#[test]
fn a_key_the_catalogue_lacks_never_panics() {
    assert_eq!(Catalogue::english().text("no-such-key"), "[no-such-key]");
    assert!(
        Catalogue::english()
            .try_format("no-such-key", &[])
            .is_none()
    );
}

#[test]
fn a_translation_lacking_a_diagnostic_is_refused_naming_it() {
    // One message from each group of diagnostics (a network's syntax and
    // shape, bench tests, names that point nowhere, the logo and the
    // translation file itself), plural and select messages among them.
    for key in [
        "diag-net-bad-setting",
        "diag-net-floating",
        "diag-bench-bad-at",
        "diag-accept-unknown",
        "diag-what-mains-frequency",
        "diag-logo-svg-root",
        "diag-translation-not-utf8",
        "diag-ftl-missing-key",
    ] {
        assert!(Catalogue::english().has(key), "{key}");
        let d = problems("de.ftl", &german_without(key));
        assert_eq!(d.problems.len(), 1, "{key}: {:?}", d.problems);
        let p = &d.problems[0];
        assert_eq!(p.code, "catalogue::missing-key");
        assert_eq!(
            p.message,
            format!("the translation has no message `{key}`"),
            "{key}"
        );
        // Said in German, the same problem names the same key.
        let mut german = p.clone();
        german.localize(&Catalogue::built_in("de").unwrap());
        assert_eq!(
            german.message,
            format!("der Übersetzung fehlt die Meldung `{key}`")
        );
    }
}

/// Every argument name a message's pattern (or a variant of it) names.
fn argument_names(catalogue: &Catalogue, key: &str) -> Vec<String> {
    let pattern = catalogue
        .inner
        .part(key)
        .bundle
        .get_message(key)
        .and_then(|m| m.value())
        .expect("a message with a value");
    let mut names = Vec::new();
    fn walk_pattern(p: &fluent_syntax::ast::Pattern<&str>, names: &mut Vec<String>) {
        for element in &p.elements {
            if let fluent_syntax::ast::PatternElement::Placeable { expression } = element {
                walk_expression(expression, names);
            }
        }
    }
    fn walk_inline(e: &fluent_syntax::ast::InlineExpression<&str>, names: &mut Vec<String>) {
        use fluent_syntax::ast::InlineExpression as I;
        match e {
            I::VariableReference { id } => names.push(id.name.to_owned()),
            I::Placeable { expression } => walk_expression(expression, names),
            I::FunctionReference { arguments, .. } => {
                for a in &arguments.positional {
                    walk_inline(a, names);
                }
            }
            _ => {}
        }
    }
    fn walk_expression(e: &fluent_syntax::ast::Expression<&str>, names: &mut Vec<String>) {
        match e {
            fluent_syntax::ast::Expression::Inline(i) => walk_inline(i, names),
            fluent_syntax::ast::Expression::Select { selector, variants } => {
                walk_inline(selector, names);
                for v in variants {
                    walk_pattern(&v.value, names);
                }
            }
        }
    }
    walk_pattern(pattern, &mut names);
    names
}

/// The plain patterns said without Fluent give Fluent's words exactly:
/// every message of every built-in catalogue, with text arguments (empty,
/// braces, dollar signs, line breaks, other scripts), a message as an
/// argument, a number, an argument given twice and one left out.
#[test]
fn plain_patterns_say_what_fluent_says() {
    let texts = [
        "",
        "14.6 W",
        "{ $x }",
        "$name",
        "a\nb",
        "Ωμέγα \u{2068}",
        "  ",
    ];
    let mut plain = 0;
    for (tag, text) in BUILT_IN {
        let catalogue = Catalogue::built_in(tag).unwrap();
        for key in message_lines(text).keys() {
            let key = key.as_str();
            let Some(pattern) = catalogue.inner.part(key).patterns.get(key) else {
                continue;
            };
            if matches!(pattern, Pattern::Plain(_)) {
                plain += 1;
            }
            let names = argument_names(&catalogue, key);
            let mut cases: Vec<Vec<(&str, Arg)>> = Vec::new();
            for i in 0..texts.len() {
                cases.push(
                    names
                        .iter()
                        .enumerate()
                        .map(|(j, n)| (n.as_str(), Arg::from(texts[(i + j) % texts.len()])))
                        .collect(),
                );
            }
            cases.push(
                names
                    .iter()
                    .map(|n| {
                        (
                            n.as_str(),
                            Arg::from(Msg::new("list-and").arg("first", "a").arg("last", "b")),
                        )
                    })
                    .collect(),
            );
            cases.push(
                names
                    .iter()
                    .map(|n| (n.as_str(), Arg::from(2usize)))
                    .collect(),
            );
            cases.push(names.iter().map(|n| (n.as_str(), Arg::from(1.5))).collect());
            cases.push(
                names
                    .iter()
                    .flat_map(|n| {
                        [
                            (n.as_str(), Arg::from(3usize)),
                            (n.as_str(), Arg::from("last")),
                        ]
                    })
                    .collect(),
            );
            cases.push(
                names
                    .iter()
                    .flat_map(|n| {
                        [
                            (n.as_str(), Arg::from("first")),
                            (n.as_str(), Arg::from(1usize)),
                        ]
                    })
                    .collect(),
            );
            cases.push(
                names
                    .iter()
                    .skip(1)
                    .map(|n| (n.as_str(), Arg::from("x")))
                    .collect(),
            );
            cases.push(Vec::new());
            for args in &cases {
                assert_eq!(
                    catalogue.try_format(key, args),
                    catalogue.fluent_format(catalogue.inner.part(key), key, args),
                    "{tag} {key} {args:?}"
                );
            }
        }
    }
    // Most messages are plain: the fast path is the one taken.
    assert!(plain > 500, "{plain} plain patterns");
}

/// A built-in catalogue read in parts (cut by `build.rs`, each parsed on
/// first use) says every message exactly as the whole file read at once
/// does: with no arguments, with each argument as text, as a number and as
/// a message, and with one left out; and each part parses without a problem.
#[test]
fn built_in_parts_say_what_the_whole_catalogue_says() {
    for ((tag, text), (part_tag, parts)) in BUILT_IN.iter().zip(BUILT_IN_PARTS) {
        assert_eq!(tag, part_tag);
        assert!(parts.len() > 20, "{tag}: {} parts", parts.len());
        assert!(
            parts.windows(2).all(|w| w[0].0 < w[1].0),
            "{tag}: parts in order"
        );
        for (group, part) in parts.iter() {
            let (built, clean) = Part::build(tag, part);
            assert!(clean, "{tag}: part {group} does not parse");
            // Every message of a part is of its group, as `part` looks
            // for it.
            for key in built.patterns.keys() {
                assert_eq!(group_of(key), *group, "{tag}: {key}");
            }
        }
        let whole = Catalogue::build(tag, "built-in", text).expect("the whole file parses");
        let in_parts = Catalogue::built_in(tag).unwrap();
        let keys = message_lines(text);
        assert!(keys.len() > 1000, "{tag}: {} keys", keys.len());
        let mut diag = 0;
        for key in keys.keys() {
            let key = key.as_str();
            diag += usize::from(
                key.split_once('-')
                    .is_some_and(|(group, _)| group == "diag"),
            );
            assert_eq!(whole.has(key), in_parts.has(key), "{tag} {key}");
            let names = if whole.inner.part(key).patterns.contains_key(key) {
                argument_names(&whole, key)
            } else {
                Vec::new()
            };
            let cases: Vec<Vec<(&str, Arg)>> = vec![
                Vec::new(),
                names
                    .iter()
                    .map(|n| (n.as_str(), Arg::from("x y")))
                    .collect(),
                names
                    .iter()
                    .map(|n| (n.as_str(), Arg::from(1usize)))
                    .collect(),
                names.iter().map(|n| (n.as_str(), Arg::from(2.5))).collect(),
                names
                    .iter()
                    .map(|n| {
                        (
                            n.as_str(),
                            Arg::from(Msg::new("list-and").arg("first", "a").arg("last", "b")),
                        )
                    })
                    .collect(),
                names
                    .iter()
                    .skip(1)
                    .map(|n| (n.as_str(), Arg::from("z")))
                    .collect(),
            ];
            for args in &cases {
                assert_eq!(
                    whole.try_format(key, args),
                    in_parts.try_format(key, args),
                    "{tag} {key} {args:?}"
                );
            }
        }
        assert!(diag > 300, "{tag}: {diag} diagnostics");
    }
}

/// A render says none of the diagnostics: the catalogue's parts are read
/// only when one of their messages is said.
#[test]
fn a_part_is_read_only_when_one_of_its_messages_is_said() {
    let catalogue = Catalogue::built_in_parts("en").unwrap();
    let Parts::BuiltIn { parts, texts, .. } = &catalogue.inner.parts else {
        panic!("a built-in catalogue is in parts");
    };
    let read = || -> Vec<&str> {
        parts
            .iter()
            .zip(texts.iter())
            .filter(|(p, _)| p.get().is_some())
            .map(|(_, (group, _))| *group)
            .collect()
    };
    assert!(read().is_empty());
    assert_eq!(catalogue.text("month-3"), "March");
    assert_eq!(read(), ["month"]);
    assert!(catalogue.has("cli-wrote"));
    assert_eq!(read(), ["cli-wrote", "month"]);
    assert!(catalogue.has("cli-wrote-stdout"));
    // A terminal key of no group (put together here, as the test that
    // every terminal key written in the sources is in the catalogues
    // reads them).
    assert!(!catalogue.has(&["cli", "nosuchgroup", "at-all"].join("-")));
    assert!(!catalogue.has("nosuchgroup"));
    assert_eq!(read(), ["cli-wrote", "month"]);
    assert!(catalogue.has("diag-here"));
    assert_eq!(read(), ["cli-wrote", "diag", "month"]);
}

#[test]
fn group_of_is_the_first_words() {
    // The key's first word, or its first two for `cli-…`, as splitting it
    // at its hyphens gives them.
    let split = |key: &str| -> String {
        let mut words = key.splitn(3, '-');
        let first = words.next().unwrap_or_default();
        match (first, words.next()) {
            ("cli", Some(second)) => key[..first.len() + 1 + second.len()].to_string(),
            _ => first.to_string(),
        }
    };
    // The terminal's keys put together here, out of reach of the test that
    // reads the sources for the terminal keys they use.
    let cli = |rest: &str| format!("{}{rest}", "cli");
    let mut keys: Vec<String> = [
        "",
        "-",
        "--",
        "cli",
        "clix-a",
        "xcli-a-b",
        "reason",
        "reason-",
        "reason-of-rating",
        "-cli-a",
        "ä-b",
    ]
    .iter()
    .map(|k| k.to_string())
    .chain(["-", "--", "-x", "-x-", "-x-y-z", "-ä-b"].map(cli))
    .collect();
    for (_, text) in BUILT_IN {
        keys.extend(message_lines(text).into_keys());
    }
    for key in &keys {
        assert_eq!(group_of(key), split(key), "{key:?}");
    }
}

/// Text arguments lent ([`Catalogue::format_str`]) say what the same
/// arguments given as [`Arg::Text`] say: every message of every built-in
/// catalogue and of a translation read whole, with texts of every kind,
/// an argument given twice (the last counts), one left out, none, an
/// argument the message does not use, and a key there is not.
#[test]
fn text_arguments_lent_say_what_owned_ones_say() {
    let texts = [
        "",
        "14.6 W",
        "{ $x }",
        "$name",
        "a\nb",
        "Ωμέγα \u{2068}",
        "  ",
        "-3",
        "1",
    ];
    let mut said = 0;
    for_every_message(|catalogue, key| {
        let names = argument_names_if_any(catalogue, key);
        let mut cases: Vec<Vec<(&str, &str)>> = Vec::new();
        for i in 0..texts.len() {
            cases.push(
                names
                    .iter()
                    .enumerate()
                    .map(|(j, n)| (n.as_str(), texts[(i + j) % texts.len()]))
                    .collect(),
            );
        }
        cases.push(
            names
                .iter()
                .flat_map(|n| [(n.as_str(), "first"), (n.as_str(), "last")])
                .collect(),
        );
        cases.push(names.iter().skip(1).map(|n| (n.as_str(), "x")).collect());
        cases.push(names.iter().rev().map(|n| (n.as_str(), "r")).collect());
        cases.push(
            names
                .iter()
                .map(|n| (n.as_str(), "y"))
                .chain([("unused", "u")])
                .collect(),
        );
        cases.push(Vec::new());
        for args in &cases {
            let owned: Vec<(&str, Arg)> = args.iter().map(|(n, v)| (*n, Arg::from(*v))).collect();
            assert_eq!(
                catalogue.try_format_str(key, args),
                catalogue.try_format(key, &owned),
                "{key} {args:?}"
            );
            assert_eq!(
                catalogue.format_str(key, args),
                catalogue.format(key, &owned)
            );
            said += 1;
        }
    });
    assert!(said > 20_000, "{said} cases");
}

/// A message looked up once says what the catalogue says for its key, and
/// an argument it does not use ([`Message::uses`]) changes none of its
/// words, in every message of both built-in catalogues (and German read
/// whole as a translation).
#[test]
fn a_message_looked_up_says_what_its_key_says() {
    let mut left_out = 0;
    for_every_message(|catalogue, key| {
        let message = catalogue.message(key);
        let mut names = argument_names_if_any(catalogue, key);
        names.extend(argument_names_if_any(Catalogue::english(), key));
        names.push("unused".to_owned());
        let all: Vec<(&str, &str)> = names.iter().map(|n| (n.as_str(), "a b")).collect();
        assert_eq!(
            message.try_format_str(&all),
            catalogue.try_format(
                key,
                &all.iter()
                    .map(|(n, v)| (*n, Arg::from(*v)))
                    .collect::<Vec<_>>()
            ),
            "{key}"
        );
        for name in &names {
            if message.uses(name) {
                continue;
            }
            assert!(
                !argument_names_if_any(catalogue, key).contains(name),
                "{key} uses {name}"
            );
            let blank: Vec<(&str, &str)> = all
                .iter()
                .map(|&(n, v)| (n, if n == name.as_str() { "" } else { v }))
                .collect();
            assert_eq!(
                message.format_str(&blank),
                message.format_str(&all),
                "{key} {name}"
            );
            left_out += 1;
        }
    });
    assert!(left_out > 1_000, "{left_out} arguments left out");
}

/// Calls `f` with each message key of both built-in catalogues (and German
/// read whole as a translation), and a key none of them has.
fn for_every_message(mut f: impl FnMut(&Catalogue, &str)) {
    let whole_german = Catalogue::build("de", "de.ftl", GERMAN).unwrap();
    for (text, catalogue) in [
        (ENGLISH, Catalogue::english().clone()),
        (GERMAN, Catalogue::built_in("de").unwrap()),
        (GERMAN, whole_german),
    ] {
        for key in message_lines(text)
            .keys()
            .map(String::as_str)
            .chain(["no-such-key"])
        {
            f(&catalogue, key);
        }
    }
}

fn argument_names_if_any(catalogue: &Catalogue, key: &str) -> Vec<String> {
    if catalogue.inner.part(key).patterns.contains_key(key) {
        argument_names(catalogue, key)
    } else {
        Vec::new()
    }
}
