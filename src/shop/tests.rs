//! Decoding shop profiles: the skeleton, every node, and problems reported
//! at their own line and column with a suggestion.

use super::*;
use crate::job::{self, SafetyTest, Settings};
use crate::ratings::RatingsTable;
use rust_decimal::Decimal;

/// (line, column) of the `n`th occurrence of `needle`, worked out here.
fn place(text: &str, needle: &str, n: usize) -> (usize, usize) {
    let offset = text
        .match_indices(needle)
        .nth(n)
        .map(|(i, _)| i)
        .expect("needle present");
    let before = &text[..offset];
    let line = before.matches('\n').count() + 1;
    let column = before.rsplit('\n').next().unwrap_or("").chars().count() + 1;
    (line, column)
}

/// A problem as (code, (line, column), message, help).
type Problem = (String, (usize, usize), String, Option<String>);

fn problems(text: &str) -> Vec<Problem> {
    let d = decode("shop.kdl", text).expect_err("the profile is refused");
    d.problems
        .iter()
        .map(|p| {
            (
                p.shown_code(),
                d.line_column(p.span.offset()),
                p.message.clone(),
                p.help.clone(),
            )
        })
        .collect()
}

#[test]
fn the_skeleton_decodes_with_every_default_spelled_out() {
    let shop = decode("shop-skeleton.kdl", SKELETON).expect("skeleton decodes");
    assert!(shop.diagnostics.problems.is_empty());
    let p = shop.profile;
    assert_eq!(p.name, "Your Shop Name");
    assert_eq!(p.address.len(), 2);
    assert_eq!(p.contact.len(), 2);
    assert_eq!(p.paper, None);
    assert!(p.logo.is_none());
    // The skeleton writes out the built-in defaults.
    assert_eq!(p.defaults.settings, Settings::default());
    assert_eq!(p.settings_given.len(), crate::job::SETTINGS.len());
    assert_eq!(p.defaults.safety.earth_limit.map(|o| o.0), Some(0.1));
    assert_eq!(p.defaults.safety.insulation_minimum.map(|o| o.0), Some(1e6));
    assert_eq!(
        p.defaults.safety.insulation_test_voltage.map(|v| v.0),
        Some(500.0)
    );
    assert_eq!(p.defaults.safety.leakage_limit, None);
    assert_eq!(p.defaults.charges.currency.as_deref(), Some("GBP"));
    assert_eq!(p.defaults.charges.tax_rate_pct, Some(Decimal::from(20)));
    assert_eq!(
        p.warranty
            .as_ref()
            .and_then(|w| w.period)
            .map(|p| p.words())
            .as_deref(),
        Some("90 days")
    );
    assert!(p.terms.is_some());
}

#[test]
fn a_full_profile_decodes() {
    let text = r#"shop-format 1
shop "Larkmoor Valve Bench" {
    address "Unit 4"
    contact "01632 960 418"
}
logo "art/logo.svg"
paper letter
technician "Wren Addaway"
settings {
    cathode-bias-caution "85%"
}
safety {
    leakage limit="0.25mA"
}
charges currency="USD" tax-rate=8.875 tax-name="sales tax"
"#;
    let p = decode("shop.kdl", text).unwrap().profile;
    assert_eq!(p.paper, Some(Paper::Letter));
    assert_eq!(
        p.logo.as_ref().map(|l| l.value.as_str()),
        Some("art/logo.svg")
    );
    assert_eq!(p.defaults.technician.as_deref(), Some("Wren Addaway"));
    assert_eq!(p.defaults.settings.cathode_bias_caution, 0.85);
    assert_eq!(
        p.defaults.settings.fixed_bias_high,
        Settings::default().fixed_bias_high
    );
    assert_eq!(p.settings_given, ["cathode-bias-caution"]);
    assert_eq!(p.defaults.safety.leakage_limit.map(|a| a.0), Some(0.25e-3));
    // A bare number is read from its text: exactly 8.875.
    assert_eq!(p.defaults.charges.tax_rate_pct, Some(Decimal::new(8875, 3)));
    assert_eq!(p.warranty.map(|w| w.text), None);
}

#[test]
fn problems_point_at_their_line_and_column_with_a_suggestion() {
    let text = r#"shop-format 1
shop "Larkmoor Valve Bench" {
    adress "Unit 4"
}
paper legal
setings {
}
safety {
    insulation minimum="-1M"
}
warranty "Ninety days." period="ninety days"
charges tax-rate="120%"
"#;
    let found = problems(text);
    let expect = [
        (
            "shop::unknown-node",
            place(text, "adress", 0),
            "did you mean `address`?",
        ),
        ("shop::unknown-paper", place(text, "legal", 0), "a4, letter"),
        (
            "shop::unknown-node",
            place(text, "setings", 0),
            "did you mean `settings`?",
        ),
        ("shop::impossible-value", place(text, "\"-1M\"", 0), ""),
        (
            "shop::bad-value",
            place(text, "\"ninety days\"", 0),
            "90 days",
        ),
        ("shop::bad-value", place(text, "\"120%\"", 0), "20%"),
    ];
    assert_eq!(found.len(), expect.len(), "{found:#?}");
    for ((code, at, help), got) in expect.iter().zip(&found) {
        assert_eq!((got.0.as_str(), got.1), (*code, *at), "{got:?}");
        assert!(
            got.3.as_deref().unwrap_or("").contains(help),
            "help for {code}: {:?}",
            got.3
        );
    }
    // The summary names the file kind.
    let d = decode("shop.kdl", text).unwrap_err();
    assert!(d.to_string().contains("this shop profile"), "{d}");
}

#[test]
fn a_profile_without_its_name_or_format_is_refused() {
    let found = problems("paper a4\n");
    let codes: Vec<&str> = found.iter().map(|p| p.0.as_str()).collect();
    assert_eq!(codes, ["shop::missing-format", "shop::missing-node"]);
    let found = problems("shop-format 2\nshop \"A\"\n");
    assert_eq!(found[0].0, "shop::format-too-new");
    assert_eq!(found[0].1, (1, 13));
    let found = problems("shop-format 1\nshop \"A\" {\n  address \"x\n}\n");
    assert!(found.iter().all(|p| p.0 == "shop::syntax"), "{found:?}");
}

const JOB: &str = r#"job-format 1
job id="T-1"
unit make="Tollan" model="Test 1"
mains nominal="230V"
settings {
    fixed-bias-high "65%"
}
safety class=I {
    earth-continuity "0.08R"
    insulation "200M"
    leakage "0.1mA" limit="0.3mA"
}
"#;

#[test]
fn the_profile_lends_bands_limits_and_technician_and_the_job_still_wins() {
    let text = r#"shop-format 1
shop "Larkmoor Valve Bench"
technician "Wren Addaway"
settings {
    fixed-bias-high "75%"
    cathode-bias-caution "85%"
}
safety {
    earth-continuity limit="0.2R"
    insulation test-voltage="250V" minimum="2M"
    leakage limit="0.5mA"
}
"#;
    let shop = decode("shop.kdl", text).unwrap().profile;
    let ratings = RatingsTable::builtin();
    let job = job::decode_with_defaults("t.kdl", JOB, &ratings, &shop.defaults)
        .unwrap()
        .job;
    // The job's own band wins; the shop's fills the rest.
    assert_eq!(job.settings.fixed_bias_high, 0.65);
    assert_eq!(job.settings.cathode_bias_caution, 0.85);
    assert_eq!(job.settings.fixed_bias_low, 0.50);
    assert_eq!(job.settings_given, ["fixed-bias-high"]);
    assert_eq!(job.info.technician.as_deref(), Some("Wren Addaway"));
    let tests = &job.safety.as_ref().unwrap().tests;
    assert!(matches!(tests[0], SafetyTest::EarthContinuity { limit, .. } if limit.0 == 0.2));
    assert!(matches!(
        tests[1],
        SafetyTest::Insulation { test_voltage, minimum, .. } if test_voltage.0 == 250.0 && minimum.0 == 2e6
    ));
    // The job's own limit wins.
    assert!(matches!(tests[2], SafetyTest::Leakage { limit, .. } if limit.0 == 0.3e-3));

    // Without a profile the same job lacks its limits, each at its line.
    let d = job::decode_with_ratings("t.kdl", JOB, &ratings).unwrap_err();
    let at: Vec<(usize, usize)> = d
        .problems
        .iter()
        .map(|p| d.line_column(p.span.offset()))
        .collect();
    assert_eq!(
        at,
        [
            place(JOB, "earth-continuity", 0),
            place(JOB, "insulation", 0),
            place(JOB, "insulation", 0)
        ]
    );
    assert!(
        d.problems[0]
            .help
            .as_deref()
            .unwrap()
            .contains("shop profile")
    );
}

#[test]
fn an_aim_turned_upside_down_across_the_two_files_is_an_error() {
    let shop = decode(
        "shop.kdl",
        "shop-format 1\nshop \"A\"\nsettings {\n  fixed-bias-low \"68%\"\n}\n",
    )
    .unwrap()
    .profile;
    let job = JOB.replace("\"65%\"", "\"60%\"");
    let d = job::decode_with_defaults("t.kdl", &job, &RatingsTable::builtin(), &shop.defaults)
        .unwrap_err();
    let p = &d.problems[0];
    assert_eq!(p.shown_code(), "job::settings-order");
    assert_eq!(d.line_column(p.span.offset()), place(&job, "settings", 0));
    assert!(p.help.as_deref().unwrap().contains("shop profile"));
}
