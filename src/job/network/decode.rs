//! Reading a mod's `network` block: parts, source, load, the phase-shift
//! search and the `after` edits. Every problem points at its own text.

use crate::kdl_fast::{Entry, Node, Value};

use super::super::decode_error::{DecodeError, suggestion};
use super::super::model::Spanned;
use super::super::reader::Reader;
use super::*;
use crate::catalogue::{Arg, Msg};
use crate::units::{Farads, Henries, Ohms, QuantityKind as Q};

/// Every child node of `network`.
pub const NETWORK_NODES: &[&str] = &[
    "source",
    "load",
    "resistor",
    "capacitor",
    "inductor",
    "link",
    "pot",
    "oscillator",
    "after",
];

/// Every child node of `after`.
pub const AFTER_NODES: &[&str] = &[
    "change",
    "remove",
    "source",
    "load",
    "resistor",
    "capacitor",
    "inductor",
    "link",
    "pot",
];

/// Names people use for the reference node that this format spells `ground`.
const GROUND_LOOKALIKES: &[&str] = &["0", "gnd", "GND", "Gnd", "earth", "chassis", "common"];

/// Decodes a `network` node of a mod.
pub fn decode_network(node: Node<'_>, r: &mut Reader) -> Option<Network> {
    r.check_entries(node, &[], 1);
    let label = Reader::arg(node, 0)
        .and_then(|e| r.string(e, Msg::new("diag-net-label")))
        .map(|s| s.value);
    let children = r.children(
        node.children(),
        NETWORK_NODES,
        Msg::new("diag-in-a-node").arg("node", "network"),
    );
    let mut source: Option<Source> = None;
    let mut load: Option<Load> = None;
    let mut parts: Vec<Part> = Vec::new();
    let mut oscillator = None;
    let mut after: Option<Node<'_>> = None;
    let mut broken = false;
    for &child in &children {
        match child.name().value() {
            "source" => {
                let s = decode_source(child, r);
                once(r, child, source.is_some());
                broken |= s.is_none();
                source = source.or(s);
            }
            "load" => {
                let l = decode_load(child, r);
                once(r, child, load.is_some());
                broken |= l.is_none();
                load = load.or(l);
            }
            "oscillator" => {
                once(r, child, oscillator.is_some());
                r.check_entries(child, &["speed"], 0);
                r.no_children(child);
                let speed = Reader::prop(child, "speed").and_then(|e| r.name(e, "`speed`"));
                oscillator = Some(Oscillator {
                    speed,
                    span: Reader::name_span(child),
                });
            }
            "after" => {
                once(r, child, after.is_some());
                after = after.or(Some(child));
            }
            _ => match decode_part(child, r) {
                Some(part) => {
                    if parts
                        .iter()
                        .any(|p| p.reference.value == part.reference.value)
                    {
                        r.push(repeated_reference(&part));
                    } else {
                        parts.push(part);
                    }
                }
                None => broken = true,
            },
        }
    }
    let span = Reader::name_span(node);
    if source.is_none() && !broken {
        r.push(
            DecodeError::error(
                "job::missing",
                span,
                Msg::new("diag-net-needs-source"),
                Msg::new("diag-net-source-missing"),
            )
            .with_help(
                Msg::new("diag-for-example")
                    .arg("example", "source node=in valve=V1 plate-load=\"100k\""),
            ),
        );
    }
    if load.is_none() && !broken {
        r.push(
            DecodeError::error(
                "job::missing",
                span,
                Msg::new("diag-net-needs-load"),
                Msg::new("diag-net-load-missing"),
            )
            .with_help(
                Msg::new("diag-for-example").arg("example", "load node=out resistance=\"1M\""),
            ),
        );
    }
    let before = NetworkState {
        source: source?,
        load: load?,
        parts,
    };
    let edits = match after {
        Some(a) => decode_after(a, &before, r),
        None => Vec::new(),
    };
    if let Some(osc) = &oscillator
        && let Some(speed) = &osc.speed
    {
        let pots: Vec<&str> = before
            .parts
            .iter()
            .filter(|p| matches!(p.kind, PartKind::Pot { .. }))
            .map(|p| p.reference.value.as_str())
            .collect();
        if !pots.contains(&speed.value.as_str()) {
            r.push(
                DecodeError::error(
                    "job::unknown-part",
                    speed.span,
                    Msg::new("diag-net-speed-not-pot").arg("name", speed.value.as_str()),
                    Msg::new("diag-net-no-such-pot"),
                )
                .with_help(if pots.is_empty() {
                    Msg::new("diag-net-add-speed-pot")
                } else {
                    suggestion(&speed.value, &pots)
                }),
            );
        }
    }
    Some(Network {
        label,
        before,
        edits,
        oscillator,
        span,
    })
}

fn once(r: &mut Reader, node: Node<'_>, seen: bool) {
    if seen {
        r.push(DecodeError::error(
            "job::repeated-node",
            Reader::name_span(node),
            Msg::new("diag-net-one-node").arg("node", node.name().value()),
            Msg::new("diag-repeated-here"),
        ));
    }
}

fn repeated_reference(part: &Part) -> DecodeError {
    DecodeError::error(
        "job::repeated-part",
        part.reference.span,
        Msg::new("diag-net-part-twice").arg("name", part.reference.value.as_str()),
        Msg::new("diag-net-repeated-reference"),
    )
    .with_help(Msg::new("diag-net-own-reference"))
}

/// A node name: text or a bare identifier; `ground` is the reference node.
fn node_name(r: &mut Reader, node: Node<'_>, key: &str, example: &str) -> Option<Spanned<String>> {
    let name = r.req_prop_name(node, key, example)?;
    ground_lookalike(r, &name);
    Some(name)
}

fn opt_node_name(r: &mut Reader, node: Node<'_>, key: &str) -> Option<Spanned<String>> {
    let name = Reader::prop(node, key).and_then(|e| r.name(e, format!("`{key}`")))?;
    ground_lookalike(r, &name);
    Some(name)
}

fn ground_lookalike(r: &mut Reader, name: &Spanned<String>) {
    if GROUND_LOOKALIKES.contains(&name.value.as_str()) {
        r.push(
            DecodeError::error(
                "job::ground-name",
                name.span,
                Msg::new("diag-net-not-ground").arg("name", name.value.as_str()),
                Msg::new("diag-net-write-ground"),
            )
            .with_help(Msg::new("diag-net-ground-help")),
        );
    }
}

fn decode_source(node: Node<'_>, r: &mut Reader) -> Option<Source> {
    r.check_entries(
        node,
        &[
            "node",
            "impedance",
            "valve",
            "plate-load",
            "cathode-resistor",
        ],
        0,
    );
    r.no_children(node);
    let example = "source node=in valve=V1 plate-load=\"100k\"";
    let at = node_name(r, node, "node", example);
    let impedance = Reader::prop(node, "impedance");
    let valve = Reader::prop(node, "valve").and_then(|e| r.name(e, "`valve`"));
    let plate = Reader::prop(node, "plate-load");
    let cathode = Reader::prop(node, "cathode-resistor");
    let impedance = match (impedance, valve) {
        (Some(z), None) => {
            for e in [plate, cathode].into_iter().flatten() {
                r.push(
                    DecodeError::error(
                        "job::conflicting-property",
                        e.span(),
                        Msg::new("diag-net-impedance-no-valve"),
                        Msg::new("diag-net-not-with-impedance"),
                    )
                    .with_help(Msg::new("diag-net-impedance-or-valve")),
                );
            }
            let q = r.quantity(z, Q::Resistance, "`impedance`");
            let q = r.positive(q, Msg::new("diag-net-source-impedance"), false)?;
            SourceImpedance::Given {
                ohms: Ohms(q.value),
            }
        }
        (Some(z), Some(_)) => {
            r.push(
                DecodeError::error(
                    "job::conflicting-property",
                    z.span(),
                    Msg::new("diag-net-valve-and-impedance"),
                    Msg::new("diag-net-remove-one"),
                )
                .with_help(Msg::new("diag-net-valve-impedance-help")),
            );
            return None;
        }
        (None, Some(valve)) => {
            let pl = r.req_prop_quantity(node, "plate-load", Q::Resistance, example);
            let pl = r.positive(pl, Msg::new("diag-net-plate-load"), false)?;
            let k = cathode.and_then(|e| r.quantity(e, Q::Resistance, "`cathode-resistor`"));
            let k = r.positive(k, Msg::new("diag-net-cathode-resistor"), false);
            SourceImpedance::Valve {
                valve,
                plate_load: Ohms(pl.value),
                cathode: k.map(|k| Ohms(k.value)),
            }
        }
        (None, None) => {
            for e in [plate, cathode].into_iter().flatten() {
                r.push(DecodeError::error(
                    "job::missing",
                    e.span(),
                    Msg::new("diag-net-needs-valve"),
                    Msg::new("diag-net-no-valve-named"),
                ));
            }
            SourceImpedance::Ideal
        }
    };
    Some(Source {
        node: at?,
        impedance,
        span: node.span(),
    })
}

fn decode_load(node: Node<'_>, r: &mut Reader) -> Option<Load> {
    r.check_entries(node, &["node", "resistance"], 0);
    r.no_children(node);
    let at = node_name(r, node, "node", "load node=out resistance=\"1M\"");
    let res = r.opt_prop_quantity(node, "resistance", Q::Resistance);
    let res = r.positive(res, Msg::new("diag-net-load-resistance"), false);
    Some(Load {
        node: at?,
        resistance: res.map(|q| Ohms(q.value)),
        span: node.span(),
    })
}

fn decode_part(node: Node<'_>, r: &mut Reader) -> Option<Part> {
    r.no_children(node);
    let kind_name = node.name().value();
    let example = match kind_name {
        "resistor" => "resistor R5 value=\"100k\" from=in to=a",
        "capacitor" => "capacitor C3 value=\"250p\" from=in to=a",
        "inductor" => "inductor L1 value=\"500mH\" from=a to=b",
        "link" => "link S1 from=a to=b",
        _ => "pot VR1 value=\"250k\" taper=audio ccw=ground wiper=out cw=in setting=5",
    };
    let reference = r.req_arg_name(node, Msg::new("diag-what-reference"), example);
    let kind = if kind_name == "pot" {
        r.check_entries(
            node,
            &["value", "taper", "ccw", "wiper", "cw", "setting", "label"],
            1,
        );
        let value = r.req_prop_quantity(node, "value", Q::Resistance, example);
        let value = r.positive(value, Msg::new("diag-net-track-resistance"), false);
        let taper = match Reader::prop(node, "taper") {
            None => Some(Taper::Linear),
            Some(e) => taper(r, e),
        };
        let ccw = opt_node_name(r, node, "ccw");
        let wiper = node_name(r, node, "wiper", example);
        let cw = opt_node_name(r, node, "cw");
        if ccw.is_none() && cw.is_none() {
            r.push(
                DecodeError::error(
                    "job::missing",
                    Reader::name_span(node),
                    Msg::new("diag-net-pot-needs-end"),
                    Msg::new("diag-net-no-end"),
                )
                .with_help(example.to_string()),
            );
            return None;
        }
        let settings = match Reader::prop(node, "setting") {
            Some(e) => settings(r, e)?,
            None => {
                r.push(
                    DecodeError::error(
                        "job::missing",
                        Reader::name_span(node),
                        Msg::new("diag-net-pot-needs-setting"),
                        Msg::new("diag-net-setting-missing"),
                    )
                    .with_help(example.to_string()),
                );
                return None;
            }
        };
        let label = r.opt_prop_string(node, "label");
        PartKind::Pot {
            value: Ohms(value?.value),
            taper: taper?,
            ccw,
            wiper: wiper?,
            cw,
            settings,
            label,
        }
    } else {
        let link = kind_name == "link";
        r.check_entries(
            node,
            if link {
                &["from", "to"]
            } else {
                &["value", "from", "to"]
            },
            1,
        );
        let value = if link {
            None
        } else {
            let q = match kind_name {
                "resistor" => Q::Resistance,
                "capacitor" => Q::Capacitance,
                _ => Q::Inductance,
            };
            let v = r.req_prop_quantity(node, "value", q, example);
            Some(r.positive(v, q.noun_msg(), false)?.value)
        };
        let a = node_name(r, node, "from", example);
        let b = node_name(r, node, "to", example);
        let (a, b) = (a?, b?);
        match (kind_name, value) {
            ("resistor", Some(v)) => PartKind::Resistor {
                value: Ohms(v),
                a,
                b,
            },
            ("capacitor", Some(v)) => PartKind::Capacitor {
                value: Farads(v),
                a,
                b,
            },
            ("inductor", Some(v)) => PartKind::Inductor {
                value: Henries(v),
                a,
                b,
            },
            _ => PartKind::Link { a, b },
        }
    };
    let part = Part {
        reference: reference?,
        kind,
        span: node.span(),
        edited: None,
    };
    // A part with both ends on one node does nothing and hides a typing slip.
    let nodes = part.nodes();
    for (i, n) in nodes.iter().enumerate() {
        if nodes[..i].iter().any(|m| m.value == n.value) {
            r.push(
                DecodeError::error(
                    "job::same-node",
                    n.span,
                    Msg::new("diag-net-same-node")
                        .arg("part", part.reference.value.as_str())
                        .arg("name", n.value.as_str()),
                    Msg::new("diag-net-same-node-label"),
                )
                .with_help(Msg::new("diag-net-same-node-help")),
            );
            return None;
        }
    }
    Some(part)
}

fn taper(r: &mut Reader, e: &Entry<'_>) -> Option<Taper> {
    let name = r.name(e, "`taper`")?;
    match Taper::from_name(&name.value) {
        Some(t) => Some(t),
        None => {
            r.push(
                DecodeError::error(
                    "job::unknown-taper",
                    name.span,
                    Msg::new("diag-net-unknown-taper").arg("name", name.value.as_str()),
                    Msg::new("diag-net-expected-taper"),
                )
                .with_help(suggestion(&name.value, &Taper::NAMES)),
            );
            None
        }
    }
}

/// One wiper setting (`5`, `7.5`) or several in text (`"2 5 8"`), each
/// from 0 to 10.
fn settings(r: &mut Reader, e: &Entry<'_>) -> Option<Vec<f64>> {
    let span = r.value_span(e);
    let bad = |r: &mut Reader, at, found: Arg| {
        r.push(
            DecodeError::error(
                "job::bad-setting",
                at,
                Msg::new("diag-net-bad-setting").arg("found", found),
                Msg::new("diag-net-expected-setting"),
            )
            .with_help(Msg::new("diag-net-setting-help")),
        );
    };
    let mut out = Vec::new();
    match e.value() {
        Value::Integer(i) => out.push((*i as f64, span)),
        Value::Float(f) => out.push((*f, span)),
        Value::String(s) => {
            let mut start = None;
            for (i, c) in s.char_indices().chain(std::iter::once((s.len(), ' '))) {
                let sep = c.is_whitespace() || c == ',';
                match (sep, start) {
                    (false, None) => start = Some(i),
                    (true, Some(st)) => {
                        let word = &s[st..i];
                        let at = r.part_span(span, s, st, i - st);
                        match word.parse::<f64>() {
                            Ok(v) => out.push((v, at)),
                            Err(_) => {
                                bad(
                                    r,
                                    at,
                                    Msg::new("diag-net-found-word").arg("word", word).into(),
                                );
                                return None;
                            }
                        }
                        start = None;
                    }
                    _ => {}
                }
            }
        }
        other => {
            bad(r, span, Arg::from(format!("{other}")));
            return None;
        }
    }
    if out.is_empty() {
        bad(r, span, Msg::new("diag-net-found-nothing").into());
        return None;
    }
    for (v, at) in &out {
        if !(0.0..=SETTING_MAX).contains(v) || !v.is_finite() {
            bad(r, *at, Arg::from(v.to_string()));
            return None;
        }
    }
    if out.len() > MAX_SETTINGS {
        r.push(DecodeError::error(
            "job::too-many-settings",
            span,
            Msg::new("diag-net-too-many-settings")
                .arg("max", MAX_SETTINGS)
                .arg("count", out.len()),
            Msg::new("diag-net-too-many"),
        ));
        return None;
    }
    Some(out.into_iter().map(|(v, _)| v).collect())
}

fn decode_after(node: Node<'_>, before: &NetworkState, r: &mut Reader) -> Vec<Edit> {
    r.check_entries(node, &[], 0);
    let mut out: Vec<Edit> = Vec::new();
    // The references present as the edits are applied in order.
    let mut present: Vec<(String, PartKind)> = before
        .parts
        .iter()
        .map(|p| (p.reference.value.clone(), p.kind.clone()))
        .collect();
    let mut seen_source = false;
    let mut seen_load = false;
    for child in r.children(node.children(), AFTER_NODES, "`after`") {
        let name = child.name().value();
        match name {
            "change" | "remove" => {
                let example = if name == "change" {
                    "change R5 value=\"56k\""
                } else {
                    "remove C3"
                };
                if name == "change" {
                    r.check_entries(child, &["value", "setting", "taper"], 1);
                } else {
                    r.check_entries(child, &[], 1);
                }
                r.no_children(child);
                let Some(reference) =
                    r.req_arg_name(child, Msg::new("diag-net-part-reference"), example)
                else {
                    continue;
                };
                let Some(idx) = present.iter().position(|(p, _)| *p == reference.value) else {
                    let names: Vec<&str> = present.iter().map(|(p, _)| p.as_str()).collect();
                    r.push(
                        DecodeError::error(
                            "job::unknown-part",
                            reference.span,
                            Msg::new(if name == "remove" {
                                "diag-net-no-part-to-remove"
                            } else {
                                "diag-net-no-part-to-change"
                            })
                            .arg("name", reference.value.as_str()),
                            Msg::new("diag-net-no-such-part"),
                        )
                        .with_help(if names.is_empty() {
                            Msg::new("diag-net-no-parts-yet")
                        } else {
                            Msg::new("diag-net-fit-new-part")
                                .arg("suggestion", suggestion(&reference.value, &names))
                                .arg("name", reference.value.as_str())
                        }),
                    );
                    continue;
                };
                if name == "remove" {
                    present.remove(idx);
                    out.push(Edit::Remove {
                        reference,
                        span: child.span(),
                    });
                    continue;
                }
                let kind = &present[idx].1;
                let is_pot = matches!(kind, PartKind::Pot { .. });
                let value = match (Reader::prop(child, "value"), kind.quantity()) {
                    (Some(e), Some(q)) => {
                        let v = r.quantity(e, q, "`value`");
                        match r.positive(v, q.noun_msg(), false) {
                            Some(v) => Some(v.value),
                            None => continue,
                        }
                    }
                    (Some(e), None) => {
                        r.push(DecodeError::error(
                            "job::not-applicable",
                            e.span(),
                            Msg::new("diag-net-link-no-value")
                                .arg("name", reference.value.as_str()),
                            Msg::new("diag-net-not-for-link"),
                        ));
                        continue;
                    }
                    (None, _) => None,
                };
                let mut settings_new = None;
                let mut taper_new = None;
                for key in ["setting", "taper"] {
                    if let Some(e) = Reader::prop(child, key) {
                        if !is_pot {
                            r.push(DecodeError::error(
                                "job::not-applicable",
                                e.span(),
                                Msg::new("diag-net-not-a-pot")
                                    .arg("name", reference.value.as_str())
                                    .arg("key", key),
                                Msg::new("diag-net-only-pots"),
                            ));
                            continue;
                        }
                        if key == "setting" {
                            settings_new = settings(r, e);
                        } else {
                            taper_new = taper(r, e);
                        }
                    }
                }
                if value.is_none() && settings_new.is_none() && taper_new.is_none() {
                    r.push(
                        DecodeError::error(
                            "job::missing",
                            Reader::name_span(child),
                            Msg::new("diag-net-nothing-to-change")
                                .arg("name", reference.value.as_str()),
                            Msg::new("diag-net-nothing-changed"),
                        )
                        .with_help(Msg::new(if is_pot {
                            "diag-net-give-pot-change"
                        } else {
                            "diag-net-give-value"
                        })),
                    );
                    continue;
                }
                out.push(Edit::Change {
                    reference,
                    value,
                    settings: settings_new,
                    taper: taper_new,
                    span: child.span(),
                });
            }
            "source" => {
                once(r, child, seen_source);
                seen_source = true;
                if let Some(s) = decode_source(child, r) {
                    out.push(Edit::Source(s));
                }
            }
            "load" => {
                once(r, child, seen_load);
                seen_load = true;
                if let Some(l) = decode_load(child, r) {
                    out.push(Edit::Load(l));
                }
            }
            _ => {
                let Some(part) = decode_part(child, r) else {
                    continue;
                };
                if present.iter().any(|(p, _)| *p == part.reference.value) {
                    r.push(
                        repeated_reference(&part).with_help(
                            Msg::new("diag-net-change-or-replace")
                                .arg("name", part.reference.value.as_str()),
                        ),
                    );
                    continue;
                }
                present.push((part.reference.value.clone(), part.kind.clone()));
                out.push(Edit::Add(part));
            }
        }
    }
    if out.is_empty() {
        r.push(
            DecodeError::warning(
                "job::empty-after",
                Reader::name_span(node),
                Msg::new("diag-net-empty-after"),
                Msg::new("diag-net-no-edits"),
            )
            .with_help(Msg::new("diag-net-empty-after-help")),
        );
    }
    out
}
