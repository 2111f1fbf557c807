//! The job-file schema, version 1: which nodes and properties exist and
//! what each must hold. Decoding turns KDL into a [`Job`] or a list of
//! problems; it computes nothing.

use crate::catalogue::Msg;
use crate::kdl_fast::{Doc, Entry, Node, Value};
use miette::SourceSpan;
use std::collections::HashSet;

use super::decode_bench::{BENCH_NODES, decode_bench_node};
use super::decode_error::{DecodeError, suggestion, suggestion_help};
use super::model::*;
use super::network::Network;
use super::reader::Reader;
use crate::units::{Amps, Farads, Hertz, Ohms, QuantityKind as Q, Volts, Watts};

/// The newest job-file format this build reads.
pub const FORMAT_VERSION: u32 = 1;

/// The top-level nodes of a job file.
pub const TOP_LEVEL: &[&str] = &[
    "job-format",
    "job",
    "customer",
    "unit",
    "mains",
    "complaint",
    "findings",
    "work",
    "valves",
    "circuit",
    "measurements",
    "parts",
    "mods",
    "safety",
    "notes",
    "photos",
    "settings",
    "charges",
    "accepted",
];

/// The only top-level node that may appear more than once.
const REPEATABLE: &str = "measurements";

pub const CIRCUIT_NODES: &[&str] = &[
    "bias",
    "cathode-resistor",
    "sense-resistor",
    "screen-resistor",
    "half-primary",
    "node",
    "dropper",
    "filter-capacitor",
    "high-voltage-winding",
    "rectifier",
];

pub const SETTINGS: &[&str] = &[
    "fixed-bias-low",
    "fixed-bias-high",
    "cathode-bias-caution",
    "resistor-derating",
    "capacitor-margin",
    "heater-tolerance",
    "node-tolerance",
    "silicon-drop",
    "voltage-over",
    "output-power-caution",
    "hum-noise-caution",
    "cathode-bias-target",
];

/// The child nodes of a measurement set.
pub const SET_NODES: &[&str] = &[
    "node",
    "valve",
    "heater",
    "circuit",
    "output-power",
    "hum-noise",
    "response",
    "gain",
    "suggest-cathode-resistor",
    "warm-up",
    "bias-control",
];

/// The checks of a valve an acceptance may name, as written in a job file.
pub const VALVE_CHECKS: &[&str] = &[
    "plate-dissipation",
    "plate-dissipation-high-line",
    "screen-dissipation",
    "plate-voltage",
    "screen-voltage",
    "cathode-current",
    "rectifier-load",
];

/// The bench tests an acceptance may name, as written in a job file.
pub const BENCH_CHECKS: &[&str] = &["output-power", "hum-noise"];

/// The safety tests, as written in a job file.
pub const SAFETY_TESTS: &[&str] = &["earth-continuity", "insulation", "leakage"];

/// The first node of a document that has neither `job-format` nor `job`,
/// when that node opens a shop profile (`shop-format`) or a ratings file
/// (`ratings-format`, `valve`).
fn other_kind_of_file(doc: Doc<'_>) -> Option<Node<'_>> {
    if doc
        .nodes()
        .any(|n| matches!(n.name().value(), "job-format" | "job"))
    {
        return None;
    }
    doc.first()
        .filter(|n| matches!(n.name().value(), "shop-format" | "ratings-format" | "valve"))
}

/// Decodes job text whose KDL syntax has already parsed.
pub(crate) fn decode_document(
    doc: Doc<'_>,
    source_name: &str,
    defaults: &JobDefaults,
    r: &mut Reader,
) -> Option<Job> {
    // A shop profile or a ratings file given where a job file belongs:
    // one error saying what the file is, rather than one for each of its
    // nodes that a job file does not know.
    if let Some(other) = other_kind_of_file(doc) {
        r.push(
            DecodeError::error(
                "job::not-a-job-file",
                Reader::name_span(other),
                Msg::new(if other.name().value() == "shop-format" {
                    "diag-is-shop-profile"
                } else {
                    "diag-is-ratings-file"
                }),
                Msg::new("diag-not-a-job-file"),
            )
            .with_help(Msg::new(if other.name().value() == "shop-format" {
                "diag-is-shop-profile-help"
            } else {
                "diag-is-ratings-file-help"
            })),
        );
        return None;
    }
    let nodes = r.children(Some(doc), TOP_LEVEL, Msg::new("diag-in-job-file"));

    // Repeated singletons.
    let mut seen = std::collections::HashSet::new();
    for &node in &nodes {
        let name = node.name().value();
        if name != REPEATABLE && !seen.insert(name) {
            r.push(
                DecodeError::error(
                    "job::repeated-node",
                    Reader::name_span(node),
                    Msg::new("diag-given-more-than-once").arg("name", name),
                    Msg::new("diag-repeated-here"),
                )
                .with_help(Msg::new("diag-merge-nodes").arg("name", name)),
            );
        }
    }
    let first = |name: &str| nodes.iter().copied().find(|n| n.name().value() == name);
    let file_start = SourceSpan::new(0.into(), 0);

    // Format version.
    let mut format_version = FORMAT_VERSION;
    match first("job-format") {
        Some(node) => {
            r.check_entries(node, &[], 1);
            r.no_children(node);
            if let Some(entry) = Reader::arg(node, 0) {
                if let Some(v) = r.integer(
                    entry,
                    Msg::new("diag-what-job-format"),
                    1..=i64::from(u32::MAX),
                ) {
                    format_version = v as u32;
                    if format_version > FORMAT_VERSION {
                        r.push(
                            DecodeError::error(
                                "job::format-too-new",
                                r.value_span(entry),
                                Msg::new("diag-format-too-new")
                                    .arg("found", format_version.to_string())
                                    .arg("known", FORMAT_VERSION.to_string()),
                                Msg::new("diag-format-version"),
                            )
                            .with_help(Msg::new("diag-update-program")),
                        );
                    }
                }
            } else {
                r.push(
                    DecodeError::error(
                        "job::missing",
                        Reader::name_span(node),
                        Msg::new("diag-needs-version").arg("name", "job-format"),
                        Msg::new("diag-version-missing"),
                    )
                    .with_help(Msg::new("diag-write-format")),
                );
            }
        }
        None => r.push(
            DecodeError::error(
                "job::missing-format",
                file_start,
                Msg::new("diag-no-format"),
                Msg::new("diag-start-of-file"),
            )
            .with_help(Msg::new("diag-begin-with-format")),
        ),
    }

    let info = match first("job") {
        Some(node) => decode_info(node, r).map(|mut info| {
            if info.technician.is_none() {
                info.technician = defaults.technician.clone();
            }
            info
        }),
        None => {
            r.push(
                DecodeError::error(
                    "job::missing-node",
                    file_start,
                    Msg::new("diag-no-node").arg("name", "job"),
                    Msg::new("diag-start-of-file"),
                )
                .with_help(Msg::new("diag-add").arg(
                    "example",
                    "job id=\"2026-001\" received=\"2026-11-02\" technician=\"…\"",
                )),
            );
            None
        }
    };
    let customer = first("customer").and_then(|n| decode_customer(n, r));
    let unit = match first("unit") {
        Some(node) => decode_unit(node, r),
        None => {
            r.push(
                DecodeError::error(
                    "job::missing-node",
                    file_start,
                    Msg::new("diag-no-node").arg("name", "unit"),
                    Msg::new("diag-start-of-file"),
                )
                .with_help(
                    Msg::new("diag-add").arg("example", "unit make=\"…\" model=\"…\" serial=\"…\""),
                ),
            );
            None
        }
    };
    let mains = match first("mains") {
        Some(node) => decode_mains(node, r),
        None => {
            r.push(
                DecodeError::error(
                    "job::missing-node",
                    file_start,
                    Msg::new("diag-no-node").arg("name", "mains"),
                    Msg::new("diag-start-of-file"),
                )
                .with_help(
                    Msg::new("diag-add")
                        .arg("example", "mains nominal=\"120V\" frequency=\"60Hz\""),
                ),
            );
            None
        }
    };
    let complaint = first("complaint").and_then(|n| text_node(n, r));
    let findings = first("findings").and_then(|n| remark(n, r));
    let work = first("work").and_then(|n| remark(n, r));
    let valves = first("valves")
        .map(|n| decode_valves(n, r))
        .unwrap_or_default();
    let circuit = first("circuit")
        .map(|n| decode_circuit(n, r))
        .unwrap_or_default();
    let mut measurements = Vec::new();
    // Labels seen so far, so a job with many sets is checked in linear time.
    let mut labels = std::collections::HashSet::new();
    let set_nodes: Vec<Node<'_>> = nodes
        .iter()
        .copied()
        .filter(|n| n.name().value() == "measurements")
        .collect();
    let mut decoded_apart = decode_sets_apart(&set_nodes, r.source);
    for (i, &node) in set_nodes.iter().enumerate() {
        let set = match &mut decoded_apart {
            Some(sets) => sets[i].take(),
            None => decode_measurements(node, r),
        };
        if let Some(set) = set {
            if set.is_final && measurements.iter().any(|m: &MeasurementSet| m.is_final) {
                let at = Reader::prop(node, "final")
                    .map(|e| e.span())
                    .unwrap_or_else(|| Reader::name_span(node));
                r.push(
                    DecodeError::error(
                        "job::two-final-sets",
                        at,
                        Msg::new("diag-two-final-sets"),
                        Msg::new("diag-second-final"),
                    )
                    .with_help(Msg::new("diag-two-final-help")),
                );
            }
            if !labels.insert(set.label.clone()) {
                r.push(DecodeError::error(
                    "job::repeated-set",
                    Reader::name_span(node),
                    Msg::new("diag-repeated-set").arg("label", set.label.as_str()),
                    Msg::new("diag-repeated-label"),
                ));
            }
            measurements.push(set);
        }
    }
    let parts = first("parts")
        .map(|n| decode_parts(n, r))
        .unwrap_or_default();
    let mods = first("mods").map(|n| decode_mods(n, r)).unwrap_or_default();
    let safety = first("safety").and_then(|n| decode_safety(n, &defaults.safety, r));
    let notes = first("notes")
        .map(|n| decode_notes(n, r))
        .unwrap_or_default();
    let photos = first("photos")
        .map(|n| decode_photos(n, r))
        .unwrap_or_default();
    let (settings, settings_given) = match first("settings") {
        Some(n) => decode_settings(n, &defaults.settings, Msg::new("diag-from-shop-profile"), r),
        None => (defaults.settings.clone(), Vec::new()),
    };
    let charges =
        first("charges").and_then(|n| super::charges::decode_charges(n, &defaults.charges, r));
    let acceptances = match (first("accepted"), &info) {
        (Some(node), Some(info)) => decode_accepted(node, info, r),
        _ => Vec::new(),
    };

    let job = Job {
        source_name: source_name.to_string(),
        format_version,
        info: info?,
        customer,
        unit: unit?,
        mains: mains?,
        complaint,
        findings,
        work,
        valves,
        circuit,
        measurements,
        parts,
        mods,
        safety,
        notes,
        photos,
        settings,
        settings_given,
        charges,
        acceptances,
    };
    Some(job)
}

fn text_node(node: Node<'_>, r: &mut Reader) -> Option<String> {
    r.check_entries(node, &[], 1);
    r.no_children(node);
    let what = format!("`{}`", node.name().value());
    r.req_arg_string(node, &what, format!("{} \"…\"", node.name().value()))
        .map(|s| s.value)
}

fn decode_info(node: Node<'_>, r: &mut Reader) -> Option<JobInfo> {
    r.check_entries(node, &["id", "received", "completed", "technician"], 0);
    r.no_children(node);
    let id = r.req_prop_string(node, "id", "job id=\"2026-001\"");
    let received = r.opt_prop_date(node, "received");
    let completed = r.opt_prop_date(node, "completed");
    let technician = r.opt_prop_string(node, "technician");
    if let (Some(rec), Some(done)) = (&received, &completed)
        && done.value < rec.value
    {
        r.push(DecodeError::error(
            "job::dates-out-of-order",
            done.span,
            Msg::new("diag-dates-out-of-order")
                .arg("completed", done.value.to_string())
                .arg("received", rec.value.to_string()),
            Msg::new("diag-completed-before"),
        ));
    }
    Some(JobInfo {
        id: id?.value,
        received: received.map(|d| d.value),
        completed: completed.map(|d| d.value),
        technician,
    })
}

fn decode_customer(node: Node<'_>, r: &mut Reader) -> Option<Customer> {
    r.check_entries(node, &["name"], 0);
    let name = r.req_prop_string(node, "name", "customer name=\"…\"");
    let mut contacts = Vec::new();
    for child in r.children(node.children(), &["contact"], "`customer`") {
        if let Some(c) = text_node(child, r) {
            contacts.push(c);
        }
    }
    Some(Customer {
        name: name?.value,
        contacts,
    })
}

fn decode_unit(node: Node<'_>, r: &mut Reader) -> Option<Unit> {
    r.check_entries(node, &["make", "model", "serial", "year", "rated-power"], 0);
    let make = r.req_prop_string(node, "make", "unit make=\"…\" model=\"…\"");
    let model = r.req_prop_string(node, "model", "unit make=\"…\" model=\"…\"");
    let serial = r.opt_prop_string(node, "serial");
    let year = Reader::prop(node, "year")
        .and_then(|e| r.integer(e, "`year`", 1900..=2100))
        .map(|y| y as i32);
    let rated_power = r.opt_prop_quantity(node, "rated-power", Q::Power);
    let rated_power = r
        .positive(rated_power, Msg::new("diag-what-rated-power"), false)
        .map(|p| Spanned::new(Watts(p.value), p.span));
    let mut description = None;
    let mut condition = None;
    for child in r.children(node.children(), &["description", "condition"], "`unit`") {
        let slot = if child.name().value() == "description" {
            &mut description
        } else {
            &mut condition
        };
        if slot.is_some() {
            r.push(DecodeError::error(
                "job::repeated-node",
                Reader::name_span(child),
                Msg::new("diag-given-twice").arg("name", child.name().value()),
                Msg::new("diag-repeated-here"),
            ));
        }
        *slot = text_node(child, r);
    }
    Some(Unit {
        make: make?.value,
        model: model?.value,
        serial,
        year,
        description,
        condition,
        rated_power,
    })
}

fn decode_mains(node: Node<'_>, r: &mut Reader) -> Option<Mains> {
    r.check_entries(node, &["nominal", "frequency", "tolerance", "design"], 0);
    r.no_children(node);
    let nominal = r.req_prop_quantity(node, "nominal", Q::Voltage, "mains nominal=\"120V\"");
    let nominal = r.positive(nominal, Msg::new("diag-what-nominal-mains"), false);
    let nominal = mains_range(r, nominal, Msg::new("diag-what-nominal-mains"));
    let frequency = r.opt_prop_quantity(node, "frequency", Q::Frequency);
    let frequency = r.positive(frequency, Msg::new("diag-what-mains-frequency"), false);
    let design = r.opt_prop_quantity(node, "design", Q::Voltage);
    let design = r.positive(design, Msg::new("diag-what-design-mains"), false);
    let design = mains_range(r, design, Msg::new("diag-what-design-mains"));
    let tolerance = match Reader::prop(node, "tolerance") {
        Some(e) => {
            let t = r.quantity(e, Q::Percent, "`tolerance`");
            let t = r.positive(t, Msg::new("diag-what-supply-tolerance"), true)?;
            if t.value > 30.0 {
                r.push(DecodeError::warning(
                    "job::implausible",
                    t.span,
                    Msg::new("diag-wide-tolerance").arg("pct", t.value.to_string()),
                    Msg::new("diag-unusual"),
                ));
            }
            Spanned::new(t.value / 100.0, t.span)
        }
        None => {
            // Defaults from the supply standards for the nominal given.
            let n = nominal.as_ref().map(|n| n.value).unwrap_or(0.0);
            let t = if (100.0..=130.0).contains(&n) {
                0.05
            } else {
                0.10
            };
            Spanned::new(t, Reader::name_span(node))
        }
    };
    if let Some(n) = &nominal
        && !(90.0..=260.0).contains(&n.value)
    {
        r.push(DecodeError::warning(
            "job::implausible",
            n.span,
            Msg::new("diag-unusual-mains").arg("volts", n.value.to_string()),
            Msg::new("diag-unusual-mains-label"),
        ));
    }
    let nominal = nominal?;
    Some(Mains {
        nominal: Spanned::new(Volts(nominal.value), nominal.span),
        frequency: frequency.map(|f| Hertz(f.value)),
        tolerance,
        design: design.map(|d| Spanned::new(Volts(d.value), d.span)),
    })
}

fn decode_valves(node: Node<'_>, r: &mut Reader) -> Vec<ValvePosition> {
    r.check_entries(node, &[], 0);
    let mut out: Vec<ValvePosition> = Vec::new();
    let mut listed: HashSet<String> = HashSet::new();
    for child in r.children(node.children(), &["valve"], "`valves`") {
        r.check_entries(child, &["type", "role", "channel"], 1);
        r.no_children(child);
        let position = r.req_arg_name(
            child,
            Msg::new("diag-what-position"),
            "valve V1 type=\"12AX7\" role=preamp",
        );
        let type_name = r.req_prop_name(child, "type", "valve V1 type=\"12AX7\" role=preamp");
        let channel = r.opt_prop_string(child, "channel");
        let role = match Reader::prop(child, "role") {
            Some(e) => match r.name(e, "`role`") {
                Some(name) => match Role::from_name(&name.value) {
                    Some(role) => Some(role),
                    None => {
                        r.push(
                            DecodeError::error(
                                "job::unknown-role",
                                name.span,
                                Msg::new("diag-unknown-role").arg("name", name.value.as_str()),
                                Msg::new("diag-expected-role"),
                            )
                            .with_help(suggestion(&name.value, &Role::NAMES)),
                        );
                        None
                    }
                },
                None => None,
            },
            None => {
                r.push(
                    DecodeError::error(
                        "job::missing",
                        Reader::name_span(child),
                        Msg::new("diag-valve-needs-role"),
                        Msg::new("diag-role-missing"),
                    )
                    .with_help(Msg::new("diag-one-of").arg("names", Role::NAMES.join(", "))),
                );
                None
            }
        };
        if let Some(p) = &position
            && !listed.insert(p.value.clone())
        {
            r.push(DecodeError::error(
                "job::repeated-position",
                p.span,
                Msg::new("diag-position-twice").arg("position", p.value.as_str()),
                Msg::new("diag-repeated-here"),
            ));
            continue;
        }
        // A position with a broken type or role is still listed (the error
        // is already reported), so readings that name it do not cascade
        // into "no such position" errors.
        if let Some(position) = position {
            let type_name = type_name.unwrap_or_else(|| Spanned::new(String::new(), position.span));
            out.push(ValvePosition {
                position,
                type_name,
                role: role.unwrap_or(Role::Other),
                channel,
            });
        }
    }
    out
}

fn decode_circuit(node: Node<'_>, r: &mut Reader) -> Circuit {
    r.check_entries(node, &[], 0);
    let mut c = Circuit::default();
    let mut declared: HashSet<String> = HashSet::new();
    for child in r.children(node.children(), CIRCUIT_NODES, "`circuit`") {
        r.no_children(child);
        match child.name().value() {
            "bias" => {
                r.check_entries(child, &[], 1);
                if let Some(kind) =
                    r.req_arg_name(child, Msg::new("diag-what-bias-kind"), "bias fixed")
                {
                    let value = match kind.value.as_str() {
                        "cathode" => Some(BiasKind::Cathode),
                        "fixed" => Some(BiasKind::Fixed),
                        other => {
                            r.push(
                                DecodeError::error(
                                    "job::unknown-bias",
                                    kind.span,
                                    Msg::new("diag-unknown-bias").arg("name", other),
                                    Msg::new("diag-expected-bias"),
                                )
                                .with_help(suggestion(other, &["cathode", "fixed"])),
                            );
                            None
                        }
                    };
                    if c.bias.is_some() {
                        r.push(DecodeError::error(
                            "job::repeated-node",
                            Reader::name_span(child),
                            Msg::new("diag-given-twice").arg("name", "bias"),
                            Msg::new("diag-repeated-here"),
                        ));
                    }
                    if let Some(v) = value {
                        c.bias = Some(Spanned::new(v, kind.span));
                    }
                }
            }
            "cathode-resistor" => {
                r.check_entries(child, &["value", "rating", "valves"], 1);
                let reference = r.req_arg_name(
                    child,
                    Msg::new("diag-what-reference"),
                    "cathode-resistor R20 value=\"130\" rating=\"5W\" valves=\"V3 V4\"",
                );
                let value = ohms(r, child, "value", "cathode-resistor R20 value=\"130\"");
                let rating = watts(r, child, "rating");
                let valves = match r.req_prop_string(child, "valves", "valves=\"V3 V4\"") {
                    Some(list) => split_names(r, &list),
                    None => Vec::new(),
                };
                if let (Some(reference), Some(value)) = (reference, value) {
                    c.cathode_resistors.push(CathodeResistor {
                        reference: reference.value,
                        value,
                        rating,
                        valves,
                        span: child.span(),
                    });
                }
            }
            "sense-resistor" => {
                r.check_entries(child, &["value", "valve"], 1);
                let reference = Reader::arg(child, 0)
                    .and_then(|e| r.name(e, Msg::new("diag-what-the-reference")));
                let value = ohms(
                    r,
                    child,
                    "value",
                    "sense-resistor R30 value=\"1R\" valve=V3",
                );
                let valve =
                    r.req_prop_name(child, "valve", "sense-resistor R30 value=\"1R\" valve=V3");
                if let Some(v) = &value
                    && v.value.0 > 100.0
                {
                    r.push(
                        DecodeError::warning(
                            "job::implausible",
                            v.span,
                            Msg::new("diag-large-sense").arg("value", v.value.to_string()),
                            Msg::new("diag-unusual"),
                        )
                        .with_help(Msg::new("diag-sense-help")),
                    );
                }
                if let (Some(value), Some(valve)) = (value, valve) {
                    c.sense_resistors.push(SenseResistor {
                        reference: reference.map(|r| r.value),
                        value,
                        valve,
                    });
                }
            }
            "screen-resistor" => {
                r.check_entries(child, &["value", "rating", "valve", "supply"], 1);
                let example = "screen-resistor R25 value=\"470\" valve=V3 supply=B+2";
                let reference = Reader::arg(child, 0)
                    .and_then(|e| r.name(e, Msg::new("diag-what-the-reference")));
                let value = ohms(r, child, "value", example);
                let rating = watts(r, child, "rating");
                let valve = r.req_prop_name(child, "valve", example);
                let supply = r.req_prop_name(child, "supply", example);
                if let (Some(value), Some(valve), Some(supply)) = (value, valve, supply) {
                    c.screen_resistors.push(ScreenResistor {
                        reference: reference.map(|r| r.value),
                        value,
                        rating,
                        valve,
                        supply,
                    });
                }
            }
            "half-primary" => {
                r.check_entries(child, &["valves", "resistance"], 0);
                let example = "half-primary resistance=\"52R\" valves=\"V3\"";
                let valves = match r.req_prop_string(child, "valves", example) {
                    Some(list) => split_names(r, &list),
                    None => Vec::new(),
                };
                let resistance = ohms(r, child, "resistance", example);
                if let Some(resistance) = resistance
                    && !valves.is_empty()
                {
                    c.half_primaries.push(HalfPrimary { valves, resistance });
                }
            }
            "node" => {
                r.check_entries(child, &["chart", "tolerance", "label", "channel"], 1);
                let name = r.req_arg_name(
                    child,
                    Msg::new("diag-what-node-name"),
                    "node B+1 chart=\"350V\"",
                );
                let chart = volts_pos(r, child, "chart", Msg::new("diag-what-chart-voltage"));
                let tolerance = percent(r, child, "tolerance");
                let label = r.opt_prop_string(child, "label");
                let channel = r.opt_prop_string(child, "channel");
                if let Some(name) = name {
                    if !declared.insert(name.value.clone()) {
                        r.push(DecodeError::error(
                            "job::repeated-node",
                            name.span,
                            Msg::new("diag-node-declared-twice").arg("name", name.value.as_str()),
                            Msg::new("diag-repeated-here"),
                        ));
                    } else {
                        c.nodes.push(NodeSpec {
                            name,
                            chart,
                            tolerance,
                            label,
                            channel,
                        });
                    }
                }
            }
            "dropper" => {
                r.check_entries(child, &["value", "rating", "from", "to"], 1);
                let example = "dropper R22 value=\"10k\" rating=\"1W\" from=B+1 to=B+2";
                let reference = r.req_arg_name(child, Msg::new("diag-what-reference"), example);
                let value = ohms(r, child, "value", example);
                let rating = watts(r, child, "rating");
                let from = r.req_prop_name(child, "from", example);
                let to = r.req_prop_name(child, "to", example);
                if let (Some(reference), Some(value), Some(from), Some(to)) =
                    (reference, value, from, to)
                {
                    c.droppers.push(Dropper {
                        reference: reference.value,
                        value,
                        rating,
                        from,
                        to,
                        span: child.span(),
                    });
                }
            }
            "filter-capacitor" => {
                r.check_entries(child, &["value", "rating", "node"], 1);
                let example = "filter-capacitor C10 value=\"40u\" rating=\"450V\" node=B+1";
                let reference = r.req_arg_name(child, Msg::new("diag-what-reference"), example);
                let value = r.opt_prop_quantity(child, "value", Q::Capacitance);
                let value = r
                    .positive(value, Msg::new("diag-kind-capacitance"), false)
                    .map(|v| Farads(v.value));
                let rating = r.req_prop_quantity(child, "rating", Q::Voltage, example);
                let rating = r.positive(rating, Msg::new("diag-what-voltage-rating"), false);
                let node_name = r.req_prop_name(child, "node", example);
                if let (Some(reference), Some(rating), Some(node_name)) =
                    (reference, rating, node_name)
                {
                    c.filter_capacitors.push(FilterCapacitor {
                        reference: reference.value,
                        value,
                        rating: Spanned::new(Volts(rating.value), rating.span),
                        node: node_name,
                        span: child.span(),
                    });
                }
            }
            "high-voltage-winding" => {
                r.check_entries(child, &["rms", "primary"], 0);
                let example = "high-voltage-winding rms=\"275V\" primary=\"117V\"";
                let rms = r.req_prop_quantity(child, "rms", Q::Voltage, example);
                let rms = r.positive(rms, Msg::new("diag-what-winding-voltage"), false);
                let primary = r.req_prop_quantity(child, "primary", Q::Voltage, example);
                let primary = r.positive(primary, Msg::new("diag-what-primary-voltage"), false);
                if c.winding.is_some() {
                    r.push(DecodeError::error(
                        "job::repeated-node",
                        Reader::name_span(child),
                        Msg::new("diag-given-twice").arg("name", "high-voltage-winding"),
                        Msg::new("diag-repeated-here"),
                    ));
                }
                if let (Some(rms), Some(primary)) = (rms, primary) {
                    c.winding = Some(Winding {
                        rms: Spanned::new(Volts(rms.value), rms.span),
                        primary: Spanned::new(Volts(primary.value), primary.span),
                    });
                }
            }
            "rectifier" => {
                r.check_entries(child, &["drop"], 1);
                let what = r.req_arg_name(
                    child,
                    Msg::new("diag-what-rectifier"),
                    Msg::new("diag-rectifier-example"),
                );
                let drop = r.opt_prop_quantity(child, "drop", Q::Voltage);
                let drop = r
                    .positive(drop, Msg::new("diag-what-rectifier-drop"), true)
                    .map(|d| Volts(d.value));
                if c.rectifier.is_some() {
                    r.push(DecodeError::error(
                        "job::repeated-node",
                        Reader::name_span(child),
                        Msg::new("diag-given-twice").arg("name", "rectifier"),
                        Msg::new("diag-repeated-here"),
                    ));
                }
                if let Some(what) = what {
                    let kind = if what.value == "silicon" {
                        RectifierKind::Silicon
                    } else {
                        RectifierKind::Valve(what)
                    };
                    c.rectifier = Some(Rectifier { kind, drop });
                }
            }
            _ => {}
        }
    }
    c
}

/// From this many measurement sets on, [`decode_sets_apart`] decodes them
/// on every core (rayon); below it the threads' start costs more than it
/// saves.
const PARALLEL_SETS: usize = 16;

/// A long job's measurement sets decoded on every core, each with a reader
/// of its own, in order; `None` when the job has fewer than
/// [`PARALLEL_SETS`] sets or when any set has a problem (an error or a
/// warning). The sets are then decoded one after another with the job's
/// own reader, as before, so what is said about a broken or doubtful job
/// is exactly what that says: the problems in the same order, and the
/// did-you-means, which only the first few problems of a file get. A set
/// decoded without a problem is the same either way.
fn decode_sets_apart(nodes: &[Node<'_>], source: &str) -> Option<Vec<Option<MeasurementSet>>> {
    use rayon::prelude::*;
    if nodes.len() < PARALLEL_SETS {
        return None;
    }
    nodes
        .par_iter()
        .map(|&node| {
            let mut own = Reader::new(source);
            let set = decode_measurements(node, &mut own);
            own.problems.is_empty().then_some(set)
        })
        .collect()
}

fn decode_measurements(node: Node<'_>, r: &mut Reader) -> Option<MeasurementSet> {
    r.check_entries(node, &["mains", "date", "final"], 1);
    let is_final = r.opt_prop_bool(node, "final").unwrap_or(false);
    let example = "measurements \"as found\" mains=\"121V\"";
    let label = r.req_arg_string(node, Msg::new("diag-what-set-label"), example);
    let mains = r.req_prop_quantity(node, "mains", Q::Voltage, example);
    let mains = r.positive(mains, Msg::new("diag-what-mains-voltage"), false);
    let mains = mains_range(r, mains, Msg::new("diag-what-mains-voltage"));
    let date = r.opt_prop_date(node, "date");
    let mut nodes: Vec<NodeReading> = Vec::new();
    let mut valves: Vec<ValveReading> = Vec::new();
    // Names read so far in this set, for the repeated-reading check.
    let (mut nodes_read, mut valves_read) = (HashSet::new(), HashSet::new());
    let mut heaters = Vec::new();
    let mut circuit_changes = Circuit::default();
    let mut valve_types: Vec<ValveTypeChange> = Vec::new();
    let mut warm_up: Vec<WarmUpReading> = Vec::new();
    // (position, minutes) read so far in the warm-up, and positions given a
    // type: sets, so a long file is checked in linear time.
    let mut warm_up_read: HashSet<(String, u64)> = HashSet::new();
    let mut typed: HashSet<String> = HashSet::new();
    let mut bias_controls = Vec::new();
    let mut bench = BenchTests::default();
    let mut suggest_cathode_resistor = false;
    for child in r.children(node.children(), SET_NODES, Msg::new("diag-in-set")) {
        match child.name().value() {
            "circuit" => {
                circuit_changes = decode_circuit(child, r);
                continue;
            }
            "suggest-cathode-resistor" => {
                r.check_entries(child, &[], 0);
                r.no_children(child);
                suggest_cathode_resistor = true;
                continue;
            }
            name if BENCH_NODES.contains(&name) => {
                decode_bench_node(child, r, &mut bench);
                continue;
            }
            // These two have children of their own (a warm-up's readings)
            // or decode their own (a valve reading).
            "warm-up" | "valve" => {}
            _ => r.no_children(child),
        }
        match child.name().value() {
            "node" => {
                r.check_entries(child, &["chart", "tolerance"], 2);
                let name = r.req_arg_name(
                    child,
                    Msg::new("diag-what-node-and-voltage"),
                    "node B+1 \"352V\"",
                );
                let volts = match Reader::arg(child, 1) {
                    Some(e) => r.quantity(e, Q::Voltage, Msg::new("diag-what-node-voltage")),
                    None => {
                        r.push(
                            DecodeError::error(
                                "job::missing",
                                Reader::name_span(child),
                                Msg::new("diag-needs-voltage").arg("name", "node"),
                                Msg::new("diag-voltage-missing"),
                            )
                            .with_help(
                                Msg::new("diag-for-example").arg("example", "node B+1 \"352V\""),
                            ),
                        );
                        None
                    }
                };
                let chart = volts_pos(r, child, "chart", Msg::new("diag-what-chart-voltage"));
                let tolerance = percent(r, child, "tolerance");
                if let (Some(name), Some(volts)) = (name, volts) {
                    if !nodes_read.insert(name.value.clone()) {
                        r.push(DecodeError::error(
                            "job::repeated-reading",
                            name.span,
                            Msg::new("diag-node-read-twice").arg("name", name.value.as_str()),
                            Msg::new("diag-repeated-here"),
                        ));
                        continue;
                    }
                    nodes.push(NodeReading {
                        name,
                        volts: Spanned::new(Volts(volts.value), volts.span),
                        chart,
                        tolerance,
                    });
                }
            }
            "valve" => {
                let Some((reading, type_name)) = decode_valve_reading(child, r, &[]) else {
                    continue;
                };
                if let Some(t) = type_name {
                    if !typed.insert(reading.position.value.clone()) {
                        r.push(DecodeError::error(
                            "job::repeated-reading",
                            t.span,
                            Msg::new("diag-type-twice")
                                .arg("position", reading.position.value.as_str()),
                            Msg::new("diag-repeated-here"),
                        ));
                    } else {
                        valve_types.push(ValveTypeChange {
                            position: reading.position.clone(),
                            type_name: t,
                        });
                    }
                }
                if !reading.has_readings() {
                    continue;
                }
                if !valves_read.insert(reading.position.value.clone()) {
                    r.push(
                        DecodeError::error(
                            "job::repeated-reading",
                            reading.position.span,
                            Msg::new("diag-valve-read-twice")
                                .arg("position", reading.position.value.as_str()),
                            Msg::new("diag-repeated-here"),
                        )
                        .with_help(Msg::new("diag-warm-up-help")),
                    );
                    continue;
                }
                valves.push(reading);
            }
            "warm-up" => {
                r.check_entries(child, &[], 0);
                for w in r.children(child.children(), &["valve"], "`warm-up`") {
                    let Some((reading, type_name)) = decode_valve_reading(w, r, &["after"]) else {
                        continue;
                    };
                    if let Some(t) = type_name {
                        r.push(
                            DecodeError::error(
                                "job::unexpected-type",
                                t.span,
                                Msg::new("diag-warm-up-type"),
                                Msg::new("diag-not-here"),
                            )
                            .with_help(Msg::new("diag-warm-up-type-help")),
                        );
                    }
                    let minutes = match Reader::prop(w, "after") {
                        Some(e) => r.minutes(e, "`after`"),
                        None => {
                            r.push(
                                DecodeError::error(
                                    "job::missing",
                                    Reader::name_span(w),
                                    Msg::new("diag-warm-up-time"),
                                    Msg::new("diag-time-missing"),
                                )
                                .with_help(
                                    Msg::new("diag-for-example").arg(
                                        "example",
                                        "valve V3 after=\"5min\" cathode=\"11.2V\"",
                                    ),
                                ),
                            );
                            None
                        }
                    };
                    if !reading.has_readings() {
                        r.push(DecodeError::error(
                            "job::missing",
                            Reader::name_span(w),
                            Msg::new("diag-warm-up-nothing"),
                            Msg::new("diag-nothing-read"),
                        ));
                        continue;
                    }
                    if let Some(minutes) = minutes {
                        if !warm_up_read
                            .insert((reading.position.value.clone(), minutes.value.to_bits()))
                        {
                            r.push(DecodeError::error(
                                "job::repeated-reading",
                                minutes.span,
                                Msg::new("diag-read-twice-same-time")
                                    .arg("position", reading.position.value.as_str()),
                                Msg::new("diag-repeated-here"),
                            ));
                            continue;
                        }
                        warm_up.push(WarmUpReading { minutes, reading });
                    }
                }
            }
            "bias-control" => {
                r.check_entries(child, &["label"], 1);
                r.no_children(child);
                let position = r.req_arg_string(
                    child,
                    Msg::new("diag-what-control-position"),
                    "bias-control \"2 o'clock\" label=\"V3, V4\"",
                );
                let label = r.opt_prop_string(child, "label");
                if let Some(position) = position {
                    bias_controls.push(BiasControl {
                        label,
                        position: position.value,
                    });
                }
            }
            "heater" => {
                r.check_entries(child, &["nominal", "label"], 1);
                let volts = match Reader::arg(child, 0) {
                    Some(e) => r.quantity(e, Q::Voltage, Msg::new("diag-what-heater-voltage")),
                    None => {
                        r.push(
                            DecodeError::error(
                                "job::missing",
                                Reader::name_span(child),
                                Msg::new("diag-needs-voltage").arg("name", "heater"),
                                Msg::new("diag-voltage-missing"),
                            )
                            .with_help(
                                Msg::new("diag-for-example").arg("example", "heater \"6.4V\""),
                            ),
                        );
                        None
                    }
                };
                let volts = r.positive(volts, Msg::new("diag-what-a-heater-voltage"), true);
                let nominal = volts_pos(r, child, "nominal", Msg::new("diag-what-heater-nominal"))
                    .unwrap_or(Volts(6.3));
                let label = r.opt_prop_string(child, "label");
                if let Some(v) = volts {
                    heaters.push(HeaterReading {
                        volts: Spanned::new(Volts(v.value), v.span),
                        nominal,
                        label,
                    });
                }
            }
            _ => {}
        }
    }
    let mains = mains?;
    Some(MeasurementSet {
        label: label?.value,
        is_final,
        mains: Spanned::new(Volts(mains.value), mains.span),
        date: date.map(|d| d.value),
        nodes,
        valves,
        heaters,
        circuit_changes,
        valve_types,
        warm_up,
        bias_controls,
        bench,
        suggest_cathode_resistor,
        span: node.span(),
    })
}

/// A valve's readings, and a type given for this set (`type=`); `extra`
/// names further properties the caller reads itself.
fn decode_valve_reading(
    child: Node<'_>,
    r: &mut Reader,
    extra: &[&str],
) -> Option<(ValveReading, Option<Spanned<String>>)> {
    r.no_children(child);
    const KEYS: &[&str] = &[
        "plate",
        "screen",
        "cathode",
        "grid",
        "sense",
        "primary-drop",
        "current",
        "method",
        "type",
    ];
    if extra.is_empty() {
        r.check_entries(child, KEYS, 1);
    } else {
        r.check_entries(child, &[KEYS, extra].concat(), 1);
    }
    let position = r.req_arg_name(
        child,
        Msg::new("diag-what-valve-position"),
        "valve V3 plate=\"352V\" cathode=\"11.2V\"",
    );
    let type_name = Reader::prop(child, "type").and_then(|e| r.name(e, "`type`"));
    let v = |r: &mut Reader, key: &str| {
        r.opt_prop_quantity(child, key, Q::Voltage)
            .map(|s| Spanned::new(Volts(s.value), s.span))
    };
    // A plate, screen or cathode below the chassis, or a drop across a
    // sense resistor or half primary below zero, is a reading taken the
    // wrong way round, not a valve's state: the valve's current flows
    // through each of them one way only (zero is a state: no supply, no
    // current). The grid sits below its cathode by nature.
    let at_least_zero = |r: &mut Reader, key: &str, what: &'static str| {
        let reading = r.opt_prop_quantity(child, key, Q::Voltage);
        r.positive_or(
            reading,
            Msg::new(what),
            true,
            Msg::new("diag-leads-reversed-help"),
        )
        .map(|s| Spanned::new(Volts(s.value), s.span))
    };
    let plate = at_least_zero(r, "plate", "diag-what-plate-voltage");
    let screen = at_least_zero(r, "screen", "diag-what-screen-voltage");
    let cathode = at_least_zero(r, "cathode", "diag-what-cathode-voltage");
    let grid = v(r, "grid");
    let sense = at_least_zero(r, "sense", "diag-what-sense-voltage");
    let primary_drop = at_least_zero(r, "primary-drop", "diag-what-primary-drop");
    let current = r.opt_prop_quantity(child, "current", Q::Current);
    let current = r.positive(current, Msg::new("diag-what-valve-current"), true);
    let method = match Reader::prop(child, "method").and_then(|e| r.name(e, "`method`")) {
        Some(m) => match m.value.as_str() {
            "probe" => Some(CurrentMethod::Probe),
            "shunt" => Some(CurrentMethod::Shunt),
            other => {
                r.push(
                    DecodeError::error(
                        "job::unknown-method",
                        m.span,
                        Msg::new("diag-unknown-method").arg("name", other),
                        Msg::new("diag-expected-method"),
                    )
                    .with_help(Msg::new("diag-method-help")),
                );
                None
            }
        },
        None => None,
    };
    let current = match (current, method) {
        (Some(c), Some(m)) => Some((Spanned::new(Amps(c.value), c.span), m)),
        (Some(c), None) => {
            r.push(
                DecodeError::error(
                    "job::missing",
                    c.span,
                    Msg::new("diag-current-needs-method"),
                    Msg::new("diag-method-missing"),
                )
                .with_help(Msg::new("diag-add-method")),
            );
            None
        }
        (None, Some(_)) => {
            if let Some(e) = Reader::prop(child, "method") {
                r.push(DecodeError::error(
                    "job::missing",
                    r.value_span(e),
                    Msg::new("diag-method-without-current"),
                    Msg::new("diag-no-current"),
                ));
            }
            None
        }
        (None, None) => None,
    };
    for reading in [&plate, &screen].into_iter().flatten() {
        if reading.value.0 > 1500.0 {
            r.push(DecodeError::warning(
                "job::implausible",
                reading.span,
                Msg::new("diag-unusually-high").arg("value", reading.value.to_string()),
                Msg::new("diag-unusual"),
            ));
        }
    }
    let p = position?;
    Some((
        ValveReading {
            position: p,
            plate,
            screen,
            cathode,
            grid,
            sense,
            primary_drop,
            current,
            span: child.span(),
        },
        type_name,
    ))
}

fn decode_parts(node: Node<'_>, r: &mut Reader) -> Vec<PartChange> {
    r.check_entries(node, &[], 0);
    let mut out = Vec::new();
    for child in r.children(node.children(), &["part"], "`parts`") {
        r.check_entries(
            child,
            &["what", "was", "now", "reason", "original-kept", "private"],
            1,
        );
        r.no_children(child);
        let reference =
            Reader::arg(child, 0).and_then(|e| r.name(e, Msg::new("diag-what-the-reference")));
        let what = r.opt_prop_string(child, "what");
        if reference.is_none() && what.is_none() && Reader::arg(child, 0).is_none() {
            r.push(
                DecodeError::error(
                    "job::missing",
                    Reader::name_span(child),
                    Msg::new("diag-part-needs-reference"),
                    Msg::new("diag-which-part"),
                )
                .with_help(Msg::new("diag-part-example")),
            );
        }
        let was = r.opt_prop_string(child, "was");
        let now = r.opt_prop_string(child, "now");
        let reason = r.opt_prop_string(child, "reason");
        let original_kept = r.opt_prop_bool(child, "original-kept");
        let private = r.opt_prop_bool(child, "private").unwrap_or(false);
        if reference.is_some() || what.is_some() {
            out.push(PartChange {
                reference: reference.map(|r| r.value),
                what,
                was,
                now,
                reason,
                original_kept,
                private,
            });
        }
    }
    out
}

fn decode_mods(node: Node<'_>, r: &mut Reader) -> Vec<Modification> {
    r.check_entries(node, &[], 0);
    let mut out = Vec::new();
    for child in r.children(node.children(), &["mod"], "`mods`") {
        r.check_entries(child, &["why", "reversible", "original-kept", "private"], 1);
        let what = r.req_arg_string(
            child,
            Msg::new("diag-what-description"),
            "mod \"…\" why=\"…\" reversible=#true",
        );
        let why = r.opt_prop_string(child, "why");
        let reversible = r.opt_prop_bool(child, "reversible");
        let original_kept = r.opt_prop_bool(child, "original-kept");
        let private = r.opt_prop_bool(child, "private").unwrap_or(false);
        let (figures, network) = decode_mod_figures(child, r);
        if let Some(what) = what {
            out.push(Modification {
                what: what.value,
                why,
                reversible,
                original_kept,
                private,
                figures,
                network,
            });
        }
    }
    out
}

pub const MOD_FIGURES: &[&str] = &[
    "rc-corner",
    "cathode-bypass",
    "stage-gain",
    "phase-shift",
    "network",
];

/// A mod's worked figures and its network, if it has one.
fn decode_mod_figures(node: Node<'_>, r: &mut Reader) -> (Vec<ModFigure>, Option<Network>) {
    let mut out = Vec::new();
    let mut network: Option<Network> = None;
    for child in r.children(
        node.children(),
        MOD_FIGURES,
        Msg::new("diag-in-a-node").arg("node", "mod"),
    ) {
        if child.name().value() == "network" {
            if network.is_some() {
                r.push(
                    DecodeError::error(
                        "job::repeated-node",
                        Reader::name_span(child),
                        Msg::new("diag-second-network"),
                        Msg::new("diag-repeated-here"),
                    )
                    .with_help(Msg::new("diag-second-network-help")),
                );
                continue;
            }
            network = super::network::decode::decode_network(child, r);
            continue;
        }
        r.no_children(child);
        let cap = |r: &mut Reader, key: &str, example: &str| {
            let q = r.req_prop_quantity(child, key, Q::Capacitance, example);
            r.positive(q, Msg::new("diag-kind-capacitance"), false)
                .map(|q| Farads(q.value))
        };
        let res = |r: &mut Reader, key: &str, example: &str| {
            ohms(r, child, key, example).map(|o| o.value)
        };
        match child.name().value() {
            "rc-corner" => {
                r.check_entries(child, &["r", "c", "label"], 0);
                let ex = "rc-corner r=\"1M\" c=\"120p\"";
                let (rv, cv) = (res(r, "r", ex), cap(r, "c", ex));
                let label = r.opt_prop_string(child, "label");
                if let (Some(rv), Some(cv)) = (rv, cv) {
                    out.push(ModFigure::RcCorner {
                        r: rv,
                        c: cv,
                        label,
                    });
                }
            }
            "cathode-bypass" => {
                r.check_entries(child, &["valve", "rk", "ck", "load"], 0);
                let ex = "cathode-bypass valve=V1 rk=\"1k5\" ck=\"22u\" load=\"100k\"";
                let valve = r.req_prop_name(child, "valve", ex);
                let (rk, ck, load) = (res(r, "rk", ex), cap(r, "ck", ex), res(r, "load", ex));
                if let (Some(valve), Some(rk), Some(ck), Some(load)) = (valve, rk, ck, load) {
                    out.push(ModFigure::CathodeBypass {
                        valve,
                        rk,
                        ck,
                        load,
                    });
                }
            }
            "stage-gain" => {
                r.check_entries(child, &["valve", "load", "rk", "bypassed"], 0);
                let ex = "stage-gain valve=V1 load=\"100k\" rk=\"1k5\" bypassed=#false";
                let valve = r.req_prop_name(child, "valve", ex);
                let load = res(r, "load", ex);
                let rk = r.opt_prop_quantity(child, "rk", Q::Resistance);
                let rk = r
                    .positive(rk, Msg::new("diag-kind-resistance"), false)
                    .map(|q| Ohms(q.value));
                let bypassed = r.opt_prop_bool(child, "bypassed").unwrap_or(rk.is_none());
                if let (Some(valve), Some(load)) = (valve, load) {
                    out.push(ModFigure::StageGain {
                        valve,
                        load,
                        rk,
                        bypassed,
                    });
                }
            }
            "phase-shift" => {
                r.check_entries(child, &["r", "c"], 0);
                let ex = "phase-shift r=\"220k\" c=\"0.01u\"";
                let (rv, cv) = (res(r, "r", ex), cap(r, "c", ex));
                if let (Some(rv), Some(cv)) = (rv, cv) {
                    out.push(ModFigure::PhaseShift { r: rv, c: cv });
                }
            }
            _ => {}
        }
    }
    (out, network)
}

fn decode_safety(node: Node<'_>, defaults: &SafetyDefaults, r: &mut Reader) -> Option<Safety> {
    r.check_entries(node, &["class"], 0);
    let class = match Reader::prop(node, "class").and_then(|e| r.name(e, "`class`")) {
        Some(c) => match c.value.as_str() {
            "I" | "1" => ProtectionClass::One,
            "II" | "2" => ProtectionClass::Two,
            other => {
                r.push(DecodeError::error(
                    "job::unknown-class",
                    c.span,
                    Msg::new("diag-unknown-class").arg("name", other),
                    Msg::new("diag-expected-class"),
                ));
                ProtectionClass::One
            }
        },
        None => ProtectionClass::One,
    };
    let mut tests = Vec::new();
    for child in r.children(node.children(), SAFETY_TESTS, "`safety`") {
        r.no_children(child);
        let reading = |r: &mut Reader, kind: Q, example: &str| match Reader::arg(child, 0) {
            Some(e) if over_range_text(e).is_some() => {
                let span = r.value_span(e);
                let at = SourceSpan::new((span.offset() + 1).into(), 1);
                r.push(
                    DecodeError::error(
                        "job::over-range",
                        at,
                        Msg::new("diag-no-over-range").arg("name", child.name().value()),
                        Msg::new("diag-no-over-range-label"),
                    )
                    .with_help(Msg::new("diag-no-over-range-help").arg("example", example)),
                );
                None
            }
            Some(e) => {
                let q = r.quantity(e, kind, Msg::new("diag-what-reading"));
                r.positive(q, Msg::new("diag-what-reading"), true)
                    .map(|q| q.value)
            }
            None => {
                r.push(
                    DecodeError::error(
                        "job::missing",
                        Reader::name_span(child),
                        Msg::new("diag-needs-reading").arg("name", child.name().value()),
                        Msg::new("diag-reading-missing"),
                    )
                    .with_help(Msg::new("diag-for-example").arg("example", example)),
                );
                None
            }
        };
        match child.name().value() {
            "earth-continuity" => {
                r.check_entries(child, &["limit", "cord"], 1);
                let example = "earth-continuity \"0.05R\" limit=\"0.1R\" cord=\"0.04R\"";
                let measured = reading(r, Q::Resistance, example);
                let limit = limit_or_default(
                    r,
                    child,
                    "limit",
                    Q::Resistance,
                    defaults.earth_limit.map(|o| o.0),
                    example,
                );
                let cord = r.opt_prop_quantity(child, "cord", Q::Resistance);
                let cord = r
                    .positive(cord, Msg::new("diag-what-cord-resistance"), true)
                    .map(|c| Ohms(c.value));
                if let (Some(measured), Some(limit)) = (measured, limit) {
                    tests.push(SafetyTest::EarthContinuity {
                        measured: Ohms(measured),
                        limit: Ohms(limit),
                        cord,
                    });
                }
            }
            "insulation" => {
                r.check_entries(child, &["test-voltage", "minimum", "over-range"], 1);
                let example = "insulation \"200M\" test-voltage=\"500V\" minimum=\"1M\"";
                // A meter at the top of its range shows "more than": ">500M".
                let arrow = Reader::arg(child, 0).and_then(over_range_text);
                let measured = match (arrow.clone(), Reader::arg(child, 0)) {
                    (Some(rest), Some(e)) => {
                        let span = r.value_span(e);
                        match crate::units::parse_quantity(&rest, Q::Resistance) {
                            Ok(v) if v > 0.0 => Some(v),
                            _ => {
                                r.push(
                                    DecodeError::error(
                                        "job::bad-value",
                                        span,
                                        Msg::new("diag-over-range-not-resistance")
                                            .arg("rest", rest.as_str()),
                                        Msg::new("diag-over-range-expected"),
                                    )
                                    .with_help(Msg::new("diag-over-range-help")),
                                );
                                None
                            }
                        }
                    }
                    _ => reading(r, Q::Resistance, example),
                };
                let test_voltage = limit_or_default(
                    r,
                    child,
                    "test-voltage",
                    Q::Voltage,
                    defaults.insulation_test_voltage.map(|v| v.0),
                    example,
                );
                let minimum = limit_or_default(
                    r,
                    child,
                    "minimum",
                    Q::Resistance,
                    defaults.insulation_minimum.map(|o| o.0),
                    example,
                );
                let over_range =
                    r.opt_prop_bool(child, "over-range").unwrap_or(false) || arrow.is_some();
                if let (Some(measured), Some(test_voltage), Some(minimum)) =
                    (measured, test_voltage, minimum)
                {
                    tests.push(SafetyTest::Insulation {
                        measured: Ohms(measured),
                        over_range,
                        test_voltage: Volts(test_voltage),
                        minimum: Ohms(minimum),
                    });
                }
            }
            "leakage" => {
                r.check_entries(child, &["limit"], 1);
                let example = "leakage \"0.05mA\" limit=\"0.5mA\"";
                let measured = reading(r, Q::Current, example);
                let limit = limit_or_default(
                    r,
                    child,
                    "limit",
                    Q::Current,
                    defaults.leakage_limit.map(|a| a.0),
                    example,
                );
                if let (Some(measured), Some(limit)) = (measured, limit) {
                    tests.push(SafetyTest::Leakage {
                        measured: Amps(measured),
                        limit: Amps(limit),
                    });
                }
            }
            _ => {}
        }
    }
    Some(Safety { class, tests })
}

/// A safety-test limit: the job's own, else the shop profile's default,
/// else an error saying where it may be given. More than zero.
fn limit_or_default(
    r: &mut Reader,
    node: Node<'_>,
    key: &str,
    kind: Q,
    default: Option<f64>,
    example: &str,
) -> Option<f64> {
    if Reader::prop(node, key).is_none() {
        if default.is_some() {
            return default;
        }
        r.push(
            DecodeError::error(
                "job::missing",
                Reader::name_span(node),
                Msg::new("diag-missing")
                    .arg("node", node.name().value())
                    .arg("what", Msg::new("diag-a-property").arg("key", key)),
                Msg::new("diag-key-missing").arg("key", key),
            )
            .with_help(
                Msg::new("diag-safety-default-help")
                    .arg("example", example)
                    .arg("key", key),
            ),
        );
        return None;
    }
    let q = r.opt_prop_quantity(node, key, kind);
    r.positive(q, format!("`{key}`"), false).map(|q| q.value)
}

/// The `accepted` block: findings the technician has judged and accepted,
/// each with a reason; `by=` and `date=` default to the block's, then to
/// the job's technician and completion date.
fn decode_accepted(node: Node<'_>, info: &JobInfo, r: &mut Reader) -> Vec<Acceptance> {
    r.check_entries(node, &["by", "date"], 0);
    let block_by = r
        .opt_prop_string(node, "by")
        .or_else(|| info.technician.clone());
    let block_date = r
        .opt_prop_date(node, "date")
        .map(|d| d.value)
        .or(info.completed);
    let mut out = Vec::new();
    for child in r.children(node.children(), &AcceptedKind::NAMES, "`accepted`") {
        r.no_children(child);
        let Some(kind) = AcceptedKind::from_name(child.name().value()) else {
            continue;
        };
        let (props, args): (&[&str], usize) = match kind {
            AcceptedKind::Valve => (&["check", "set", "reason", "by", "date"], 1),
            AcceptedKind::Heater => (&["label", "set", "reason", "by", "date"], 0),
            AcceptedKind::Safety => (&["reason", "by", "date"], 1),
            AcceptedKind::Bench => (&["channel", "set", "reason", "by", "date"], 1),
            _ => (&["set", "reason", "by", "date"], 1),
        };
        r.check_entries(child, props, args);
        // The example's words (a reason, a channel) are the reader's.
        let example = match kind {
            AcceptedKind::Valve => Msg::new("diag-accept-example-valve"),
            AcceptedKind::Node => Msg::new("diag-accept-example-node"),
            AcceptedKind::Part => Msg::new("diag-accept-example-part"),
            AcceptedKind::Heater => Msg::new("diag-accept-example-heater"),
            AcceptedKind::Safety => Msg::new("diag-accept-example-safety"),
            AcceptedKind::Bench => Msg::new("diag-accept-example-bench"),
        };
        let name = match kind {
            AcceptedKind::Heater => r.opt_prop_string(child, "label").map(|l| {
                let span = Reader::prop(child, "label")
                    .map(|e| r.value_span(e))
                    .unwrap_or_else(|| Reader::name_span(child));
                Spanned::new(l, span)
            }),
            AcceptedKind::Safety => {
                let n = r.req_arg_name(child, Msg::new("diag-what-safety-test"), example.clone());
                match n {
                    Some(n) if !SAFETY_TESTS.contains(&n.value.as_str()) => {
                        r.push(
                            DecodeError::error(
                                "job::unknown-safety-test",
                                n.span,
                                Msg::new("diag-unknown-safety-test").arg("name", n.value.as_str()),
                                Msg::new("diag-not-a-safety-test"),
                            )
                            .with_help(suggestion_help(&n.value, SAFETY_TESTS)),
                        );
                        None
                    }
                    other => other,
                }
            }
            AcceptedKind::Bench => {
                let n = r.req_arg_name(child, Msg::new("diag-what-bench-test"), example.clone());
                match n {
                    Some(n) if !BENCH_CHECKS.contains(&n.value.as_str()) => {
                        r.push(
                            DecodeError::error(
                                "job::unknown-bench-test",
                                n.span,
                                Msg::new("diag-unknown-bench-test").arg("name", n.value.as_str()),
                                Msg::new("diag-not-a-bench-test"),
                            )
                            .with_help(suggestion_help(&n.value, BENCH_CHECKS)),
                        );
                        None
                    }
                    other => other,
                }
            }
            AcceptedKind::Valve => {
                r.req_arg_name(child, Msg::new("diag-what-valve-position"), example.clone())
            }
            AcceptedKind::Node => {
                r.req_arg_name(child, Msg::new("diag-what-node-name"), example.clone())
            }
            AcceptedKind::Part => {
                r.req_arg_name(child, Msg::new("diag-what-part-reference"), example.clone())
            }
        };
        let check = Reader::prop(child, "check").and_then(|e| r.name(e, "`check`"));
        if let Some(c) = &check
            && !VALVE_CHECKS.contains(&c.value.as_str())
        {
            r.push(
                DecodeError::error(
                    "job::unknown-check",
                    c.span,
                    Msg::new("diag-unknown-check").arg("name", c.value.as_str()),
                    Msg::new("diag-not-a-check"),
                )
                .with_help(suggestion_help(&c.value, VALVE_CHECKS)),
            );
        }
        let set = Reader::prop(child, "set").and_then(|e| r.string(e, "`set`"));
        let channel = Reader::prop(child, "channel").and_then(|e| r.string(e, "`channel`"));
        let reason = r.req_prop_string(child, "reason", example);
        if let Some(reason) = &reason
            && reason.value.trim().is_empty()
        {
            r.push(
                DecodeError::error(
                    "job::empty-reason",
                    reason.span,
                    Msg::new("diag-empty-reason"),
                    Msg::new("diag-empty-reason-label"),
                )
                .with_help(Msg::new("diag-empty-reason-help")),
            );
        }
        let by = r.opt_prop_string(child, "by").or_else(|| block_by.clone());
        let date = r
            .opt_prop_date(child, "date")
            .map(|d| d.value)
            .or(block_date);
        if by.is_none() {
            r.push(
                DecodeError::error(
                    "job::missing",
                    Reader::name_span(child),
                    Msg::new("diag-acceptance-who"),
                    Msg::new("diag-who-accepted"),
                )
                .with_help(Msg::new("diag-acceptance-who-help")),
            );
        }
        if date.is_none() {
            r.push(
                DecodeError::error(
                    "job::missing",
                    Reader::name_span(child),
                    Msg::new("diag-acceptance-when"),
                    Msg::new("diag-when-accepted"),
                )
                .with_help(Msg::new("diag-acceptance-when-help")),
            );
        }
        let name_ok = name.is_some() || kind == AcceptedKind::Heater;
        if let (true, Some(reason), Some(by), Some(date)) = (name_ok, reason, by, date) {
            out.push(Acceptance {
                kind,
                name,
                check: check.filter(|c| VALVE_CHECKS.contains(&c.value.as_str())),
                channel,
                set,
                reason: reason.value.trim().to_string(),
                by,
                date,
                span: child.span(),
            });
        }
    }
    out
}

fn decode_notes(node: Node<'_>, r: &mut Reader) -> Vec<Remark> {
    r.check_entries(node, &[], 0);
    let mut out = Vec::new();
    for child in r.children(node.children(), &["note"], "`notes`") {
        if let Some(t) = remark(child, r) {
            out.push(t);
        }
    }
    out
}

/// A text node that may be marked `private=#true`: `note "…" private=#true`.
fn remark(node: Node<'_>, r: &mut Reader) -> Option<Remark> {
    r.check_entries(node, &["private"], 1);
    r.no_children(node);
    let name = node.name().value();
    let text = r.req_arg_string(node, format!("`{name}`"), format!("{name} \"…\""))?;
    let private = r.opt_prop_bool(node, "private").unwrap_or(false);
    Some(Remark {
        text: text.value,
        private,
    })
}

/// The photos of a job: `photo "photos/chassis.jpg" caption="…" listing=#true`.
/// Only what is written is checked here; the file itself is checked when a
/// document is made.
fn decode_photos(node: Node<'_>, r: &mut Reader) -> Vec<Photo> {
    r.check_entries(node, &[], 0);
    let mut out = Vec::new();
    for child in r.children(node.children(), &["photo"], "`photos`") {
        r.check_entries(child, &["caption", "listing"], 1);
        r.no_children(child);
        let path = r.req_arg_string(
            child,
            Msg::new("diag-what-photo-path"),
            "photo \"photos/chassis-after.jpg\" caption=\"…\"",
        );
        let caption = r.opt_prop_string(child, "caption");
        let listing = r.opt_prop_bool(child, "listing").unwrap_or(false);
        if let Some(path) = path {
            out.push(Photo {
                path,
                caption,
                listing,
            });
        }
    }
    out
}

/// Reads a `settings` block over `base`: each child given replaces one
/// band. Returns the bands and the names of the children given. `base_from`
/// names where the base came from, for the message when the merged aim is
/// upside down.
pub(crate) fn decode_settings(
    node: Node<'_>,
    base: &Settings,
    base_from: Msg,
    r: &mut Reader,
) -> (Settings, Vec<String>) {
    r.check_entries(node, &[], 0);
    let mut s = base.clone();
    let mut given = Vec::new();
    for child in r.children(node.children(), SETTINGS, "`settings`") {
        r.check_entries(child, &[], 1);
        r.no_children(child);
        let name = child.name().value();
        let Some(entry) = Reader::arg(child, 0) else {
            r.push(DecodeError::error(
                "job::missing",
                Reader::name_span(child),
                Msg::new("diag-needs-value").arg("name", name),
                Msg::new("diag-value-missing"),
            ));
            continue;
        };
        if name == "hum-noise-caution" {
            if let Some(db) = decibels(r, entry, name) {
                s.hum_noise_caution_db = db;
                given.push(name.to_string());
            }
            continue;
        }
        if name == "silicon-drop" {
            if let Some(v) = r.quantity(entry, Q::Voltage, "`silicon-drop`") {
                s.silicon_drop = Volts(v.value);
                given.push(name.to_string());
            }
            continue;
        }
        let Some(p) = r.quantity(entry, Q::Percent, format!("`{name}`")) else {
            continue;
        };
        if !(0.0..=200.0).contains(&p.value) {
            r.push(DecodeError::error(
                "job::impossible-value",
                p.span,
                Msg::new("diag-setting-range").arg("name", name),
                Msg::new("diag-out-of-range"),
            ));
            continue;
        }
        let f = p.value / 100.0;
        match name {
            "fixed-bias-low" => s.fixed_bias_low = f,
            "fixed-bias-high" => s.fixed_bias_high = f,
            "cathode-bias-caution" => s.cathode_bias_caution = f,
            "resistor-derating" => s.resistor_derating = f,
            "capacitor-margin" => s.capacitor_margin = f,
            "heater-tolerance" => s.heater_tolerance = f,
            "node-tolerance" => s.node_tolerance = f,
            "voltage-over" => s.voltage_over = f,
            "output-power-caution" => s.output_power_caution = f,
            "cathode-bias-target" => s.cathode_bias_target = f,
            _ => continue,
        }
        given.push(name.to_string());
    }
    if s.fixed_bias_low > s.fixed_bias_high {
        let both = given.iter().any(|g| g == "fixed-bias-low")
            && given.iter().any(|g| g == "fixed-bias-high");
        let mut e = DecodeError::error(
            "job::settings-order",
            node.name().span(),
            Msg::new("diag-bias-bands-order"),
            Msg::new("diag-these-settings"),
        );
        if !both && *base != Settings::default() {
            e = e.with_help(Msg::new("diag-one-comes-from").arg("source", base_from));
        }
        r.push(e);
    }
    (s, given)
}

// ----- small shared readers ---------------------------------------------------

/// The figure after a leading `>` of a text value (an over-range reading).
fn over_range_text(e: &Entry<'_>) -> Option<String> {
    match e.value() {
        Value::String(s) => s
            .trim()
            .strip_prefix('>')
            .map(|rest| rest.trim_start_matches('=').trim().to_string()),
        _ => None,
    }
}

/// A level in decibels: a plain number or text ending in `dB`, from 0 to
/// 150 dB.
fn decibels(r: &mut Reader, entry: &Entry<'_>, name: &str) -> Option<f64> {
    let span = r.value_span(entry);
    let value = match entry.value() {
        Value::Integer(i) => Some(*i as f64),
        Value::Float(f) => Some(*f),
        Value::String(s) => s
            .trim()
            .strip_suffix("dB")
            .unwrap_or(s.trim())
            .trim()
            .parse::<f64>()
            .ok(),
        _ => None,
    };
    match value {
        Some(v) if v.is_finite() && (0.0..=150.0).contains(&v) => Some(v),
        Some(_) => {
            r.push(DecodeError::error(
                "job::impossible-value",
                span,
                Msg::new("diag-decibel-range").arg("name", name),
                Msg::new("diag-out-of-range"),
            ));
            None
        }
        None => {
            r.push(
                DecodeError::error(
                    "job::bad-value",
                    span,
                    Msg::new("diag-decibels").arg("name", name),
                    Msg::new("diag-expected-decibels"),
                )
                .with_help(Msg::new("diag-decibels-help")),
            );
            None
        }
    }
}

/// Mains voltages, nominal or read: 1 V to 1,000 V. A variable
/// autotransformer brought up slowly gives readings of a few volts;
/// 1,000 V AC is the top of low-voltage supply (IEC 60038, from memory).
fn mains_range(r: &mut Reader, v: Option<Spanned<f64>>, what: Msg) -> Option<Spanned<f64>> {
    r.within(
        v,
        what,
        (1.0, 1000.0),
        Msg::new("diag-range")
            .arg("low", "1 V")
            .arg("high", "1000 V"),
        Msg::new("diag-mains-range-help"),
    )
}

fn ohms(r: &mut Reader, node: Node<'_>, key: &str, example: &str) -> Option<Spanned<Ohms>> {
    let q = r.req_prop_quantity(node, key, Q::Resistance, example);
    r.positive(q, Msg::new("diag-kind-resistance"), false)
        .map(|q| Spanned::new(Ohms(q.value), q.span))
}

fn watts(r: &mut Reader, node: Node<'_>, key: &str) -> Option<Watts> {
    let q = r.opt_prop_quantity(node, key, Q::Power);
    r.positive(q, Msg::new("diag-what-power-rating"), false)
        .map(|q| Watts(q.value))
}

fn volts_pos(r: &mut Reader, node: Node<'_>, key: &str, what: Msg) -> Option<Volts> {
    let q = r.opt_prop_quantity(node, key, Q::Voltage);
    r.positive(q, what, false).map(|q| Volts(q.value))
}

fn percent(r: &mut Reader, node: Node<'_>, key: &str) -> Option<f64> {
    let q = r.opt_prop_quantity(node, key, Q::Percent);
    r.positive(q, Msg::new("diag-what-tolerance"), true)
        .map(|q| q.value / 100.0)
}

/// Splits "V3 V4" or "V3, V4" into names, each with its own span.
fn split_names(r: &Reader, list: &Spanned<String>) -> Vec<Spanned<String>> {
    let mut out = Vec::new();
    let text = &list.value;
    let mut start = None;
    for (i, c) in text
        .char_indices()
        .chain(std::iter::once((text.len(), ' ')))
    {
        let sep = c.is_whitespace() || c == ',';
        match (sep, start) {
            (false, None) => start = Some(i),
            (true, Some(s)) => {
                out.push(Spanned::new(
                    text[s..i].to_string(),
                    r.part_span(list.span, text, s, i - s),
                ));
                start = None;
            }
            _ => {}
        }
    }
    out
}

#[cfg(test)]
mod tests {
    use super::*;

    /// The generated job of scripts/gen-job.sh with `sets` sets.
    fn generated(sets: usize) -> String {
        let out = std::process::Command::new("bash")
            .arg(std::path::Path::new(env!("CARGO_MANIFEST_DIR")).join("scripts/gen-job.sh"))
            .arg(sets.to_string())
            .output()
            .unwrap();
        String::from_utf8(out.stdout).unwrap()
    }

    /// The job's measurement sets.
    fn set_nodes<'t>(tree: &'t crate::kdl_fast::Tree<'_>) -> Vec<Node<'t>> {
        tree.doc()
            .nodes()
            .filter(|n| n.name().value() == "measurements")
            .collect()
    }

    #[test]
    fn sets_decoded_apart_are_the_sets_decoded_one_after_another() {
        let text = generated(40);
        let tree = crate::kdl_fast::parse_tree(&text).unwrap();
        let nodes = set_nodes(&tree);
        assert_eq!(nodes.len(), 40);
        let apart = decode_sets_apart(&nodes, &text).expect("a clean job's sets are decoded apart");
        let mut r = Reader::new(&text);
        let in_order: Vec<Option<MeasurementSet>> = nodes
            .iter()
            .map(|&n| decode_measurements(n, &mut r))
            .collect();
        assert!(r.problems.is_empty());
        assert_eq!(format!("{apart:?}"), format!("{in_order:?}"));
        assert!(apart.iter().all(Option::is_some));
        // Too few sets to be worth it, or a set with a problem: decoded in
        // order with the job's reader instead.
        assert!(decode_sets_apart(&nodes[..PARALLEL_SETS - 1], &text).is_none());
        let broken = text.replacen(
            "measurements \"reading 00007\"",
            "measurements \"reading 00007\" colour=\"red\"",
            1,
        );
        assert_ne!(broken, text);
        let tree = crate::kdl_fast::parse_tree(&broken).unwrap();
        assert!(decode_sets_apart(&set_nodes(&tree), &broken).is_none());
    }
}
