//! Behaviour of the ratings table: the built-in file's invariants, lookups,
//! shop files that add and correct rows, and the errors a bad file gets.

use super::*;
use crate::units::Watts;
use std::collections::HashMap;
use std::path::PathBuf;
use std::sync::OnceLock;

const MEMORY: &str = "from memory of manufacturer data; verify";

/// The built-in table, parsed once for all tests.
fn builtin() -> RatingsTable {
    static TABLE: OnceLock<RatingsTable> = OnceLock::new();
    TABLE.get_or_init(RatingsTable::builtin).clone()
}

fn shop_origin() -> RatingOrigin {
    RatingOrigin::Shop(PathBuf::from("shop.kdl"))
}

/// The problems of a failed load, with the text each one underlines.
fn problems<'t>(report: &miette::Report, text: &'t str) -> Vec<(RatingProblem, &'t str)> {
    let file = report
        .downcast_ref::<RatingsFileError>()
        .expect("a ratings file error");
    file.problems()
        .iter()
        .map(|p| {
            let s = p.span();
            (
                p.clone(),
                text.get(s.offset()..s.offset() + s.len())
                    .expect("span inside the text"),
            )
        })
        .collect()
}

/// Renders a report the way the command line would, to be sure it prints.
fn render(report: &miette::Report) -> String {
    let mut out = String::new();
    miette::GraphicalReportHandler::new_themed(miette::GraphicalTheme::unicode_nocolor())
        .render_report(&mut out, report.as_ref())
        .expect("report renders");
    out
}

#[test]
fn builtin_table_parses_with_enough_rows() {
    let t = RatingsTable::builtin();
    assert!(t.len() >= 45, "only {} rows", t.len());
    assert!(!t.is_empty());
    assert!(t.iter().all(|r| r.origin == RatingOrigin::Builtin));
}

#[test]
fn each_builtin_table_is_its_own_copy() {
    // The embedded file is parsed once per process; a shop file applied to
    // one copy must not reach the next caller.
    let mut first = RatingsTable::builtin();
    let before = first.len();
    let text = "ratings-format 1\nvalve \"6P1P\" {\n class \"beam-tetrode\"\n plate-dissipation \"12W\"\n plate-voltage \"250V\"\n heater \"6.3V\" \"0.5A\"\n source \"shop data sheet\"\n}\n";
    first
        .apply_shop_text("shop.kdl", text, shop_origin())
        .unwrap();
    assert_eq!(first.len(), before + 1);
    let second = RatingsTable::builtin();
    assert_eq!(second.len(), before);
    assert!(second.lookup("6P1P").is_err());
    assert!(second.iter().all(|r| r.origin == RatingOrigin::Builtin));
}

#[test]
fn builtin_designations_are_unique() {
    let t = builtin();
    let mut seen: HashMap<String, String> = HashMap::new();
    for r in t.iter() {
        for d in r.designations() {
            if let Some(other) = seen.insert(designation_key(d), r.name.clone()) {
                panic!("{d} appears in both {other} and {}", r.name);
            }
        }
    }
}

#[test]
fn builtin_rows_are_complete_for_their_class() {
    for r in builtin().iter() {
        if r.class.is_output() {
            assert!(
                r.plate_dissipation.is_some(),
                "{} has no plate dissipation",
                r.name
            );
            assert!(r.plate_voltage.is_some(), "{} has no plate voltage", r.name);
        }
        if r.class.is_rectifier() {
            assert!(
                r.output_current.is_some(),
                "{} has no output current",
                r.name
            );
            assert!(
                r.rectifier_heating.is_some(),
                "{} has no heating kind",
                r.name
            );
        } else {
            assert!(
                r.output_current.is_none() && r.rectifier_heating.is_none(),
                "{}",
                r.name
            );
        }
        if r.class == ValveClass::PreampTriode {
            assert!(r.mu.is_some(), "{} has no mu", r.name);
            assert!(r.plate_resistance.is_some(), "{} has no ra", r.name);
            assert!(
                r.transconductance_ma_per_v.is_some(),
                "{} has no gm",
                r.name
            );
        }
        assert!(
            r.heater_voltage.0 > 0.0 && r.heater_current.0 > 0.0,
            "{}",
            r.name
        );
        assert!((1..=4).contains(&r.sections), "{}", r.name);
        assert_eq!(
            r.source, MEMORY,
            "{}: every built-in figure is recalled",
            r.name
        );
    }
}

#[test]
fn builtin_rows_cover_every_class() {
    let t = builtin();
    for class in ValveClass::ALL {
        assert!(t.iter().any(|r| r.class == class), "no {class} rows");
    }
}

#[test]
fn iteration_is_by_class_then_name() {
    let t = builtin();
    let rows: Vec<&Rating> = t.iter().collect();
    for pair in rows.windows(2) {
        assert!(
            pair[0].class <= pair[1].class,
            "{} before {}",
            pair[0].name,
            pair[1].name
        );
    }
    let triodes: Vec<&str> = rows
        .iter()
        .filter(|r| r.class == ValveClass::PreampTriode)
        .map(|r| r.name.as_str())
        .collect();
    let at = |n: &str| triodes.iter().position(|t| *t == n).unwrap();
    assert!(
        at("6C4") < at("12AX7"),
        "numbers in designations sort as numbers: {triodes:?}"
    );
    assert!(at("12AT7") < at("12AX7"));
}

#[test]
fn lookup_by_equivalent() {
    let t = builtin();
    assert_eq!(t.lookup("6BQ5").unwrap().name, "EL84");
    assert_eq!(t.lookup("ECC83").unwrap().name, "12AX7");
    assert_eq!(t.lookup("GZ34").unwrap().name, "5AR4");
    assert_eq!(t.lookup("6CA7").unwrap().name, "EL34");
}

#[test]
fn lookup_ignores_case_spaces_and_hyphens() {
    let t = builtin();
    assert_eq!(t.lookup("6L6-GC").unwrap().name, "6L6GC");
    assert_eq!(t.lookup("6l6gc").unwrap().name, "6L6GC");
    assert_eq!(t.lookup(" el 84 ").unwrap().name, "EL84");
    assert_eq!(t.lookup("ecc-83").unwrap().name, "12AX7");
    assert_eq!(t.lookup("gz34").unwrap().name, "5AR4");
}

#[test]
fn a_suffix_the_table_lacks_does_not_match_another_type() {
    let t = builtin();
    let e = t.lookup("6L6GB").unwrap_err();
    assert_eq!(e.name, "6L6GB");
    assert!(e.suggestions.contains(&"6L6GC".to_string()), "{e}");
    assert!(t.lookup("12AX7B").is_err());
    assert!(t.lookup("EL84X").is_err());
    assert!(
        t.lookup("5U4").is_err(),
        "5U4G and 5U4GB differ, so 5U4 alone is not enough"
    );
    assert!(t.lookup("6V6G").is_err());
    assert!(t.lookup("").is_err());
}

#[test]
fn unknown_types_get_suggestions() {
    let t = builtin();
    let e = t.lookup("EL8").unwrap_err();
    assert_eq!(e.suggestions, vec!["EL84", "EL86"]);
    assert_eq!(
        e.to_string(),
        "unknown valve type \"EL8\"; did you mean EL84, EL86?"
    );
    assert!(t.suggest("12AX").contains(&"12AX7".to_string()));
    assert!(t.suggest("6L6").len() <= 3);
    for probe in ["", "12A", "6", "KT", "ECC8", "zzzzzzzz"] {
        assert!(t.suggest(probe).len() <= 3, "{probe}");
    }
    assert!(t.suggest("zzzzzzzz").is_empty());
}

#[test]
fn shop_file_adds_a_row_and_corrects_one() {
    let mut t = builtin();
    let before = t.len();
    let el84 = t.lookup("EL84").unwrap().clone();
    let text = r#"
        ratings-format 1
        // Correction, found through an equivalent designation.
        valve "6bq5" {
            equivalents "EL84-bench"
            plate-dissipation "13.2W"
            source "shop's own data sheet copy, page 2"
        }
        valve "6P1P" {
            class "beam-tetrode"
            plate-dissipation "12W"
            plate-voltage "250V"
            heater "6.3V" "0.5A"
            source "shop data sheet"
        }
    "#;
    t.apply_shop_text("shop.kdl", text, shop_origin()).unwrap();
    assert_eq!(t.len(), before + 1);

    let fixed = t.lookup("EL84").unwrap();
    assert_eq!(fixed.plate_dissipation, Some(Watts(13.2)));
    assert_eq!(
        fixed.screen_dissipation, el84.screen_dissipation,
        "untouched fields stay"
    );
    assert_eq!(fixed.heater_current, el84.heater_current);
    assert_eq!(fixed.origin, shop_origin());
    assert!(
        fixed.equivalents.contains(&"6BQ5".to_string()),
        "equivalents are added, never removed"
    );
    assert_eq!(t.lookup("el84 bench").unwrap().name, "EL84");
    assert!(fixed.source.starts_with(MEMORY), "{}", fixed.source);
    assert!(
        fixed.source.contains("plate-dissipation"),
        "{}",
        fixed.source
    );
    assert!(
        fixed.source.contains("shop's own data sheet"),
        "{}",
        fixed.source
    );

    let added = t.lookup("6p1p").unwrap();
    assert_eq!(added.class, ValveClass::BeamTetrode);
    assert_eq!(added.sections, 1);
    assert_eq!(added.source, "shop data sheet");
    assert_eq!(added.origin, shop_origin());
    let rows: Vec<&Rating> = t.iter().collect();
    assert!(
        rows.windows(2).all(|p| p[0].class <= p[1].class),
        "still sorted after loading"
    );
}

#[test]
fn load_shop_file_reads_from_disk() {
    let dir = tempfile::tempdir().unwrap();
    let path = dir.path().join("bench.kdl");
    std::fs::write(
        &path,
        "valve \"6V6GT\" { design-max-plate-dissipation \"14W\"; screen-voltage \"315V\" }\n",
    )
    .unwrap();
    let mut t = builtin();
    t.load_shop_file(&path).unwrap();
    let r = t.lookup("6V6GT").unwrap();
    assert_eq!(r.origin, RatingOrigin::Shop(path.clone()));
    assert!(r.source.contains("no source given"), "{}", r.source);

    let missing = dir.path().join("absent.kdl");
    let e = t.load_shop_file(&missing).unwrap_err();
    assert!(e.to_string().contains("cannot read ratings file"), "{e}");
}

#[test]
fn shop_file_errors_are_all_reported_at_once_with_spans() {
    let mut t = builtin();
    let text = r#"valve "EL84" {
    plate-disipation "13W"
    plate-dissipation "12mA"
}
valve "KT88" weight="heavy" {
    heater "6.3V"
}
valves "X" {}
"#;
    let e = t
        .apply_shop_text("shop.kdl", text, shop_origin())
        .unwrap_err();
    let ps = problems(&e, text);
    assert_eq!(ps.len(), 5, "{ps:#?}");

    let (p, under) = &ps[0];
    assert_eq!(*under, "plate-disipation");
    assert!(
        p.label().contains("did you mean `plate-dissipation`?"),
        "{}",
        p.label()
    );

    let (p, under) = &ps[1];
    assert_eq!(*under, "A", "the wrong unit symbol itself is underlined");
    assert!(p.message().contains("a power"), "{}", p.message());
    assert!(p.label().contains("a current"), "{}", p.label());
    assert!(p.help().unwrap().contains("\"5W\""), "{:?}", p.help());

    let (p, under) = &ps[2];
    assert_eq!(*under, "weight=\"heavy\"");
    assert!(
        p.message().contains("unexpected property `weight`"),
        "{}",
        p.message()
    );

    let (p, under) = &ps[3];
    assert_eq!(*under, "heater");
    assert!(p.message().contains("two values"), "{}", p.message());

    let (p, under) = &ps[4];
    assert_eq!(*under, "valves");
    assert!(p.label().contains("did you mean `valve`?"), "{}", p.label());

    let shown = render(&e);
    assert!(
        shown.contains("5 problems in ratings file shop.kdl"),
        "{shown}"
    );
    assert!(
        shown.contains("did you mean `plate-dissipation`?"),
        "{shown}"
    );

    let el84 = t.lookup("EL84").unwrap();
    assert_eq!(
        el84.origin,
        RatingOrigin::Builtin,
        "a file with problems changes nothing"
    );
    assert_eq!(el84.plate_dissipation, Some(Watts(12.0)));
}

#[test]
fn a_property_named_like_a_field_says_to_use_a_child_node() {
    let mut t = builtin();
    let text = "valve \"EL84\" plate-dissipation=\"13W\"\n";
    let e = t
        .apply_shop_text("shop.kdl", text, shop_origin())
        .unwrap_err();
    let ps = problems(&e, text);
    assert_eq!(ps.len(), 1);
    assert_eq!(ps[0].1, "plate-dissipation=\"13W\"");
    assert!(ps[0].0.help().unwrap().contains("child node"));
}

#[test]
fn new_rows_must_be_complete_and_consistent() {
    let mut t = builtin();
    let text = r#"
valve "XR99" { plate-voltage "300V" }
valve "XR100" {
    class "rectifier"
    heater "5V" "2A"
    screen-voltage "200V"
    source "shop"
}
valve "XR101" {
    class "preamp-triode"
    heater "6.3V" "0.3A"
    source "shop"
    equivalents "ECC83"
}
valve "XR102" {
    class "beam-tetrode"
    heater "6.3V" "0.9A"
    plate-dissipation "20W"
    design-max-plate-dissipation "15W"
    plate-voltage "400V"
    source "shop"
}
"#;
    let e = t
        .apply_shop_text("shop.kdl", text, shop_origin())
        .unwrap_err();
    let ps = problems(&e, text);
    let messages: Vec<&str> = ps.iter().map(|(p, _)| p.message()).collect();
    assert!(
        messages
            .iter()
            .any(|m| m.contains("XR99 is new here but has no class, no heater, no source")),
        "{messages:#?}"
    );
    assert!(
        messages
            .iter()
            .any(|m| m.contains("rectifier XR100 has no output-current")),
        "{messages:#?}"
    );
    assert!(
        messages
            .iter()
            .any(|m| m.contains("rectifier XR100 has no rectifier-heating")),
        "{messages:#?}"
    );
    assert!(
        messages
            .iter()
            .any(|m| m.contains("screen-voltage does not apply")),
        "{messages:#?}"
    );
    assert!(
        messages
            .iter()
            .any(|m| m.contains("preamp triode XR101 has no mu")),
        "{messages:#?}"
    );
    assert!(
        messages
            .iter()
            .any(|m| m.contains("ECC83 is already a designation of 12AX7")),
        "{messages:#?}"
    );
    assert!(
        messages
            .iter()
            .any(|m| m.contains("design-max plate dissipation 15 W is below")),
        "{messages:#?}"
    );
    let (_, under) = ps
        .iter()
        .find(|(p, _)| p.message().contains("ECC83 is already"))
        .unwrap();
    assert_eq!(*under, "\"ECC83\"");
    assert!(t.lookup("XR102").is_err(), "nothing was added");
}

#[test]
fn a_correction_is_checked_as_a_whole_row() {
    let mut t = builtin();
    let text = "valve \"EL84\" { class \"rectifier\" }\n";
    let e = t
        .apply_shop_text("shop.kdl", text, shop_origin())
        .unwrap_err();
    let ps = problems(&e, text);
    assert!(
        ps.iter()
            .any(|(p, under)| p.message().contains("has no output-current") && *under == "class"),
        "{ps:#?}"
    );
    assert!(
        ps.iter()
            .any(|(p, _)| p.message().contains("screen-dissipation does not apply")),
        "{ps:#?}"
    );
}

#[test]
fn the_same_type_twice_in_one_file_is_an_error() {
    let mut t = builtin();
    let text = "valve \"EL84\" { mu 1 }\nvalve \"6BQ5\" { mu 2 }\n";
    let e = t
        .apply_shop_text("shop.kdl", text, shop_origin())
        .unwrap_err();
    assert!(
        problems(&e, text)
            .iter()
            .any(|(p, _)| p.message().contains("corrected twice"))
    );

    let text = r#"
valve "A1" { class "power-triode"; plate-dissipation "1W"; plate-voltage "1V"; heater "1V" "1A"; source "x" }
valve "a-1" { class "power-triode"; plate-dissipation "1W"; plate-voltage "1V"; heater "1V" "1A"; source "x" }
"#;
    let e = RatingsTable::from_kdl_text("dup.kdl", text, RatingOrigin::Builtin).unwrap_err();
    let ps = problems(&e, text);
    assert_eq!(ps.len(), 1, "{ps:#?}");
    assert_eq!(ps[0].1, "\"a-1\"");
    assert!(ps[0].0.message().contains("listed twice"));
}

#[test]
fn values_are_checked_for_kind_and_sign() {
    let text = r#"valve "T1" {
    class "preamp-triod"
    sections 9
    mu "lots"
    plate-resistance "-5k"
    transconductance "fast"
    heater "6.3A" "0.3V"
    rectifier-heating "warm"
    plate-voltage #true
    source ""
    plate-voltage "1V"
}
"#;
    let e = RatingsTable::from_kdl_text("t.kdl", text, RatingOrigin::Builtin).unwrap_err();
    let ps = problems(&e, text);
    let find = |needle: &str| {
        ps.iter()
            .find(|(p, _)| p.message().contains(needle) || p.label().contains(needle))
            .unwrap_or_else(|| panic!("no problem about {needle}: {ps:#?}"))
    };
    assert_eq!(
        find("did you mean \"preamp-triode\"?").1,
        "\"preamp-triod\""
    );
    assert_eq!(find("sections must be").1, "9");
    assert_eq!(find("`mu` must be a number").1, "\"lots\"");
    assert_eq!(find("a rating must be above zero").1, "\"-5k\"");
    assert_eq!(find("not a transconductance").1, "\"fast\"");
    assert_eq!(find("is the unit of a current, but a voltage").1, "A");
    assert_eq!(find("is the unit of a voltage, but a current").1, "V");
    assert_eq!(find("unknown rectifier-heating").1, "\"warm\"");
    assert_eq!(find("not a number").1, "#true");
    assert_eq!(find("`source` must be").1, "\"\"");
    assert_eq!(find("given twice").1, "plate-voltage");
}

#[test]
fn kdl_syntax_errors_become_problems_with_a_hint() {
    // Unquoted 6.3V is not a KDL value: a common slip.
    let text = "valve \"EL84\" {\n    heater 6.3V 0.76A\n}\n";
    let e = RatingsTable::from_kdl_text("bad.kdl", text, RatingOrigin::Builtin).unwrap_err();
    let ps = problems(&e, text);
    assert!(!ps.is_empty());
    assert!(
        ps.iter()
            .all(|(p, _)| p.help().unwrap().contains("KDL 2.0"))
    );
    let shown = render(&e);
    assert!(shown.contains("bad.kdl"), "{shown}");
}

#[test]
fn format_version_is_checked() {
    let e = RatingsTable::from_kdl_text("v.kdl", "ratings-format 2\n", RatingOrigin::Builtin)
        .unwrap_err();
    assert!(
        problems(&e, "ratings-format 2\n")[0]
            .0
            .message()
            .contains("unsupported ratings-format")
    );
    let rows =
        RatingsTable::from_kdl_text("v.kdl", "ratings-format 1\n", RatingOrigin::Builtin).unwrap();
    assert!(rows.is_empty());
    let rows = RatingsTable::from_kdl_text("v.kdl", "", RatingOrigin::Builtin).unwrap();
    assert!(rows.is_empty());
}

#[test]
fn bare_number_designations_are_accepted() {
    let text = "valve 45 { class \"power-triode\"; plate-dissipation 10; plate-voltage 275; heater 2.5 1.5; source \"x\" }\n";
    let rows = RatingsTable::from_kdl_text("n.kdl", text, RatingOrigin::Builtin).unwrap();
    assert_eq!(rows[0].name, "45");
    assert_eq!(
        rows[0].plate_dissipation,
        Some(Watts(10.0)),
        "a plain number is in the base unit"
    );
}

#[test]
fn garbage_never_panics() {
    let samples = [
        "",
        "\u{0}",
        "{{{{",
        "}}}}",
        "valve",
        "valve {",
        "valve \"",
        "valve \"EL84\" {",
        "valve \"EL84\" { heater }",
        "valve \"EL84\" { heater \"\" \"\" }",
        "valve \"EL84\" { heater \"µ\" \"μ\" }",
        "valve \"EL84\" { (x)heater \"6.3V\" \"1A\" }",
        "(t)valve (u)\"EL84\" { plate-dissipation (W)12 }",
        "valve \"é\" { plate-dissipation \"12é\" }",
        "valve \"EL84\" { plate-dissipation \"1e400W\" }",
        "valve \"EL84\" { sections 99999999999999999999999999999 }",
        "valve #null { class #false }",
        "valve \"\" {}",
        "valve \"EL84\" { plate-dissipation \"\"\"\n  12W\n  \"\"\" }",
        "valve \"EL84\" { plate-dissipation #\"12mA\"# }",
        "valve \"EL84\" { plate-dissipation \"12\\u{41}\" }",
        "ratings-format\nratings-format \"1\"",
        "/* unclosed",
        "valve \"EL84\" { - }",
        "\u{feff}valve \"EL84\" {}",
        "valve \"EL84\" { equivalents }",
        "valve \"EL84\" { equivalents #true -1 }",
    ];
    for text in samples {
        let mut t = builtin();
        if let Err(e) = t.apply_shop_text("g.kdl", text, shop_origin()) {
            let _ = render(&e);
            if let Some(file) = e.downcast_ref::<RatingsFileError>() {
                for p in file.problems() {
                    let s = p.span();
                    assert!(
                        s.offset() + s.len() <= text.len(),
                        "{text:?}: span {s:?} outside the text"
                    );
                }
            }
        }
        if let Err(e) = RatingsTable::from_kdl_text("g.kdl", text, RatingOrigin::Builtin) {
            let _ = render(&e);
        }
    }
}

mod fuzz {
    use super::*;
    use proptest::prelude::*;

    /// Fragments that make KDL-shaped text more often than random bytes do.
    fn kdlish() -> impl Strategy<Value = String> {
        let piece = prop_oneof![
            Just("valve ".to_string()),
            Just("\"EL84\" ".to_string()),
            Just("{ ".to_string()),
            Just("} ".to_string()),
            Just("\n".to_string()),
            Just("; ".to_string()),
            Just("heater \"6.3V\" \"0.3A\" ".to_string()),
            Just("plate-dissipation ".to_string()),
            Just("\"12mA\" ".to_string()),
            Just("class \"rectifier\" ".to_string()),
            Just("equivalents \"6BQ5\" ".to_string()),
            Just("x=1 ".to_string()),
            Just("(t)".to_string()),
            Just("#true ".to_string()),
            Just("// c\n".to_string()),
            Just("/- ".to_string()),
            "[a-z0-9\"{}; µ=#()-]{0,6}",
        ];
        prop::collection::vec(piece, 0..24).prop_map(|v| v.concat())
    }

    proptest! {
        #![proptest_config(ProptestConfig { cases: 256, .. ProptestConfig::default() })]

        #[test]
        fn arbitrary_text_never_panics(text in any::<String>()) {
            let mut t = builtin();
            if let Err(e) = t.apply_shop_text("p.kdl", &text, shop_origin()) {
                let _ = render(&e);
            }
        }

        #[test]
        fn kdl_shaped_text_never_panics(text in kdlish()) {
            let mut t = builtin();
            if let Err(e) = t.apply_shop_text("p.kdl", &text, shop_origin()) {
                let _ = render(&e);
            }
            let _ = t.lookup(&text);
            let _ = t.suggest(&text);
        }
    }
}

#[test]
fn the_examples_in_the_contributor_guide_work() {
    let guide = include_str!("../../docs/ratings.md");
    let blocks: Vec<&str> = guide
        .split("```kdl\n")
        .skip(1)
        .filter_map(|b| b.split("```").next())
        .collect();
    assert_eq!(
        blocks.len(),
        2,
        "the guide has a format example and a shop-file example"
    );
    let rows = RatingsTable::from_kdl_text("guide", blocks[0], RatingOrigin::Builtin).unwrap();
    assert_eq!(rows[0].name, "EL84");
    let mut t = builtin();
    t.apply_shop_text("guide", blocks[1], shop_origin())
        .unwrap();
    assert!(t.lookup("6P1P").is_ok());
    assert!(
        t.lookup("6V6GT")
            .unwrap()
            .source
            .contains("shop correction of screen-voltage")
    );
}
