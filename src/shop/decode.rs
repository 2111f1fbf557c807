//! The shop-profile schema, format version 1: which nodes exist and what
//! each must hold. It shares the job file's readers, so a problem in
//! `shop.kdl` reads like one in a job file: `file:line:column`, what was
//! expected, a did-you-mean. Decoding computes nothing and reads no file.

use crate::catalogue::Msg;
use crate::kdl_fast::{Doc, Node};
use miette::SourceSpan;

use super::model::*;
use crate::job::decode::{SAFETY_TESTS, decode_settings};
use crate::job::reader::Reader;
use crate::job::{DecodeError, JobDefaults, SafetyDefaults, Settings, Spanned, suggestion};
use crate::units::{Amps, Ohms, QuantityKind as Q, Volts};

/// The newest shop-profile format this build reads.
pub const SHOP_FORMAT_VERSION: u32 = 1;

/// The top-level nodes of a shop profile; each appears at most once.
pub const SHOP_TOP_LEVEL: &[&str] = &[
    "shop-format",
    "shop",
    "logo",
    "paper",
    "technician",
    "settings",
    "safety",
    "charges",
    "warranty",
    "terms",
    "job-numbers",
    "language",
];

pub(crate) fn decode_document(
    doc: Doc<'_>,
    source_name: &str,
    r: &mut Reader,
) -> Option<ShopProfile> {
    let nodes = r.children(Some(doc), SHOP_TOP_LEVEL, Msg::new("diag-in-shop-profile"));
    for (i, &node) in nodes.iter().enumerate() {
        let name = node.name().value();
        if nodes[..i].iter().any(|n| n.name().value() == name) {
            r.push(
                DecodeError::error(
                    "job::repeated-node",
                    Reader::name_span(node),
                    Msg::new("diag-given-more-than-once").arg("name", name),
                    Msg::new("diag-repeated-here"),
                )
                .with_help(Msg::new("diag-merge-shop-nodes").arg("name", name)),
            );
        }
    }
    let first = |name: &str| nodes.iter().copied().find(|n| n.name().value() == name);
    let file_start = SourceSpan::new(0.into(), 0);

    let format_version = match first("shop-format") {
        Some(node) => format_version(node, r),
        None => {
            r.push(
                DecodeError::error(
                    "job::missing-format",
                    file_start,
                    Msg::new("diag-shop-no-format"),
                    Msg::new("diag-start-of-file"),
                )
                .with_help(Msg::new("diag-begin-with-shop-format")),
            );
            SHOP_FORMAT_VERSION
        }
    };

    let shop = match first("shop") {
        Some(node) => decode_shop(node, r),
        None => {
            r.push(
                DecodeError::error(
                    "job::missing-node",
                    file_start,
                    Msg::new("diag-shop-no-node").arg("name", "shop"),
                    Msg::new("diag-start-of-file"),
                )
                .with_help(Msg::new("diag-add").arg("example", Msg::new("diag-shop-example"))),
            );
            None
        }
    };
    let logo = first("logo").and_then(|n| {
        r.check_entries(n, &[], 1);
        r.no_children(n);
        let logo = r.req_arg_string(n, Msg::new("diag-what-logo-name"), "logo \"logo.svg\"")?;
        if logo.value.trim().is_empty() {
            r.push(DecodeError::error(
                "job::bad-value",
                logo.span,
                Msg::new("diag-logo-name-empty"),
                Msg::new("diag-expected-file-name"),
            ));
            return None;
        }
        Some(logo)
    });
    let paper = first("paper").and_then(|n| decode_paper(n, r));
    let technician = first("technician").and_then(|n| text(n, r));
    let (settings, settings_given) = match first("settings") {
        Some(n) => decode_settings(n, &Settings::default(), Msg::new("diag-from-defaults"), r),
        None => (Settings::default(), Vec::new()),
    };
    let safety = first("safety")
        .map(|n| decode_safety(n, r))
        .unwrap_or_default();
    let charges = first("charges")
        .map(|n| decode_charges(n, r))
        .unwrap_or_default();
    let warranty = first("warranty").and_then(|n| decode_warranty(n, r));
    let terms = first("terms").and_then(|n| text(n, r));
    let job_numbers = first("job-numbers").and_then(|n| {
        r.check_entries(n, &[], 1);
        r.no_children(n);
        let pattern = r.req_arg_string(
            n,
            Msg::new("diag-what-job-number-pattern"),
            "job-numbers \"D-{yymm}-{nnn}\"",
        )?;
        match crate::job::numbering::Numbering::parse(&pattern.value) {
            Ok(_) => Some(pattern.value),
            Err(why) => {
                r.push(
                    DecodeError::error(
                        "job::bad-value",
                        pattern.span,
                        Msg::new("diag-bad-pattern")
                            .arg("pattern", pattern.value.as_str())
                            .arg("why", why),
                        Msg::new("diag-expected-pattern"),
                    )
                    .with_help(Msg::new("diag-pattern-help")),
                );
                None
            }
        }
    });
    let language = first("language").and_then(|n| decode_language(n, r));

    let (name, address, contact) = shop?;
    Some(ShopProfile {
        source_name: source_name.to_string(),
        format_version,
        name,
        address,
        contact,
        logo,
        paper,
        defaults: JobDefaults {
            settings,
            safety,
            technician,
            charges,
        },
        settings_given,
        warranty,
        terms,
        job_numbers,
        language,
    })
}

/// `language "de"`, or `language "nl" file="nl.ftl"`: the language of the
/// documents and, for a language the program does not have built in (or
/// to replace a built-in one), the shop's translation file. The file is
/// read and checked against the English catalogue when the profile is
/// loaded ([`crate::shop::read_translation`]).
fn decode_language(node: Node<'_>, r: &mut Reader) -> Option<Language> {
    r.check_entries(node, &["file"], 1);
    r.no_children(node);
    let tag = r.req_arg_string(node, Msg::new("diag-what-language"), "language \"de\"")?;
    let valid = !tag.value.is_empty()
        && tag.value.len() <= 35
        && tag
            .value
            .split(['-', '_'])
            .all(|p| !p.is_empty() && p.len() <= 8 && p.chars().all(|c| c.is_ascii_alphanumeric()))
        && tag.value.parse::<unic_langid::LanguageIdentifier>().is_ok();
    if !valid {
        r.push(
            DecodeError::error(
                "job::bad-value",
                tag.span,
                Msg::new("diag-not-language-tag").arg("tag", tag.value.as_str()),
                Msg::new("diag-expected-language-tag"),
            )
            .with_help(
                Msg::new("diag-built-in-languages").arg(
                    "tags",
                    crate::catalogue::BUILT_IN
                        .iter()
                        .map(|(t, _)| *t)
                        .collect::<Vec<_>>()
                        .join(", "),
                ),
            ),
        );
        return None;
    }
    let file = match Reader::prop(node, "file") {
        Some(e) => Some(r.string(e, "`file`")?),
        None => None,
    };
    if file.is_none() && crate::catalogue::Catalogue::built_in(&tag.value).is_none() {
        let built: Vec<&str> = crate::catalogue::BUILT_IN.iter().map(|(t, _)| *t).collect();
        r.push(
            DecodeError::error(
                "job::unknown-language",
                tag.span,
                Msg::new("diag-no-catalogue").arg("tag", tag.value.as_str()),
                Msg::new("diag-no-built-in-catalogue"),
            )
            .with_help(
                Msg::new("diag-own-translation")
                    .arg("suggestion", suggestion(&tag.value, &built))
                    .arg("tag", tag.value.as_str()),
            ),
        );
        return None;
    }
    Some(Language { tag, file })
}

fn format_version(node: Node<'_>, r: &mut Reader) -> u32 {
    r.check_entries(node, &[], 1);
    r.no_children(node);
    let Some(entry) = Reader::arg(node, 0) else {
        r.push(
            DecodeError::error(
                "job::missing",
                Reader::name_span(node),
                Msg::new("diag-needs-version").arg("name", "shop-format"),
                Msg::new("diag-version-missing"),
            )
            .with_help(Msg::new("diag-write-shop-format")),
        );
        return SHOP_FORMAT_VERSION;
    };
    let Some(v) = r.integer(
        entry,
        Msg::new("diag-what-shop-format"),
        1..=i64::from(u32::MAX),
    ) else {
        return SHOP_FORMAT_VERSION;
    };
    let v = v as u32;
    if v > SHOP_FORMAT_VERSION {
        r.push(
            DecodeError::error(
                "job::format-too-new",
                r.value_span(entry),
                Msg::new("diag-shop-format-too-new")
                    .arg("found", v.to_string())
                    .arg("known", SHOP_FORMAT_VERSION.to_string()),
                Msg::new("diag-format-version"),
            )
            .with_help(Msg::new("diag-update-program")),
        );
    }
    v
}

/// A node holding one line of text and nothing else.
fn text(node: Node<'_>, r: &mut Reader) -> Option<String> {
    r.check_entries(node, &[], 1);
    r.no_children(node);
    let name = node.name().value();
    r.req_arg_string(node, format!("`{name}`"), format!("{name} \"…\""))
        .map(|s| s.value)
}

fn decode_shop(node: Node<'_>, r: &mut Reader) -> Option<(String, Vec<String>, Vec<String>)> {
    r.check_entries(node, &[], 1);
    let name = r.req_arg_string(
        node,
        Msg::new("diag-what-shop-name"),
        "shop \"Larkmoor Valve Bench\" { … }",
    );
    let mut address = Vec::new();
    let mut contact = Vec::new();
    for child in r.children(node.children(), &["address", "contact"], "`shop`") {
        if let Some(line) = text(child, r) {
            if child.name().value() == "address" {
                address.push(line);
            } else {
                contact.push(line);
            }
        }
    }
    let name = name?;
    if name.value.trim().is_empty() {
        r.push(DecodeError::error(
            "job::bad-value",
            name.span,
            Msg::new("diag-shop-name-empty"),
            Msg::new("diag-expected-the-name"),
        ));
        return None;
    }
    Some((name.value, address, contact))
}

fn decode_paper(node: Node<'_>, r: &mut Reader) -> Option<Paper> {
    r.check_entries(node, &[], 1);
    r.no_children(node);
    let name = r.req_arg_name(node, Msg::new("diag-what-paper-size"), "paper a4")?;
    match Paper::from_name(&name.value) {
        Some(p) => Some(p),
        None => {
            r.push(
                DecodeError::error(
                    "job::unknown-paper",
                    name.span,
                    Msg::new("diag-unknown-paper").arg("name", name.value.as_str()),
                    Msg::new("diag-expected-paper"),
                )
                .with_help(suggestion(&name.value, &Paper::NAMES)),
            );
            None
        }
    }
}

/// Default safety-test limits: the job's test nodes without the reading.
fn decode_safety(node: Node<'_>, r: &mut Reader) -> SafetyDefaults {
    r.check_entries(node, &[], 0);
    let mut d = SafetyDefaults::default();
    for child in r.children(node.children(), SAFETY_TESTS, "`safety`") {
        r.no_children(child);
        let limit = |r: &mut Reader, key: &str, kind: Q| {
            let q = r.opt_prop_quantity(child, key, kind);
            r.positive(q, format!("`{key}`"), false).map(|q| q.value)
        };
        match child.name().value() {
            "earth-continuity" => {
                r.check_entries(child, &["limit"], 0);
                d.earth_limit = limit(r, "limit", Q::Resistance).map(Ohms);
            }
            "insulation" => {
                r.check_entries(child, &["test-voltage", "minimum"], 0);
                d.insulation_test_voltage = limit(r, "test-voltage", Q::Voltage).map(Volts);
                d.insulation_minimum = limit(r, "minimum", Q::Resistance).map(Ohms);
            }
            "leakage" => {
                r.check_entries(child, &["limit"], 0);
                d.leakage_limit = limit(r, "limit", Q::Current).map(Amps);
            }
            _ => {}
        }
    }
    d
}

fn decode_charges(node: Node<'_>, r: &mut Reader) -> ChargeTerms {
    r.check_entries(node, &["currency", "tax-rate", "tax-name"], 0);
    r.no_children(node);
    ChargeTerms {
        currency: Reader::prop(node, "currency")
            .and_then(|e| crate::job::charges::currency(r, e))
            .map(|c| c.value),
        tax_rate_pct: Reader::prop(node, "tax-rate")
            .and_then(|e| crate::job::charges::tax_rate(r, e))
            .map(|t| t.value),
        tax_name: r.opt_prop_string(node, "tax-name"),
    }
}

fn decode_warranty(node: Node<'_>, r: &mut Reader) -> Option<Warranty> {
    r.check_entries(node, &["period"], 1);
    r.no_children(node);
    let text = r.req_arg_string(
        node,
        Msg::new("diag-what-warranty-text"),
        Msg::new("diag-warranty-example"),
    );
    let period = match Reader::prop(node, "period") {
        Some(e) => {
            let written: Option<Spanned<String>> = r.string(e, "`period`");
            match written {
                Some(w) => match Period::parse(&w.value) {
                    Some(p) => Some(p),
                    None => {
                        r.push(
                            DecodeError::error(
                                "job::bad-value",
                                w.span,
                                Msg::new("diag-bad-period").arg("text", w.value.as_str()),
                                Msg::new("diag-expected-period"),
                            )
                            .with_help(Msg::new("diag-period-help")),
                        );
                        None
                    }
                },
                None => None,
            }
        }
        None => None,
    };
    Some(Warranty {
        text: text?.value,
        period,
    })
}
