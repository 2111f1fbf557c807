//! Cross-references inside a job: every valve position and node that a
//! circuit fact or reading names must exist. Pure checks, no figures.

use std::collections::HashSet;

use super::decode_error::{DecodeError, suggestion};
use super::model::{Job, RectifierKind, Spanned};
use crate::catalogue::Msg;

/// A did-you-mean for the first problems only: past the few that are
/// printed, comparing each name with every known one would only cost time.
fn suggest(name: &str, known: &[&str], problems_so_far: usize) -> Msg {
    if problems_so_far < 4 * crate::problem_cap::SHOWN_PROBLEMS && known.len() <= 1000 {
        suggestion(name, known)
    } else {
        Msg::new("diag-check-spelling")
    }
}

/// Problems with names that point nowhere.
pub fn cross_references(job: &Job) -> Vec<DecodeError> {
    let mut out = Vec::new();
    let positions: Vec<&str> = job
        .valves
        .iter()
        .map(|v| v.position.value.as_str())
        .collect();
    let mut nodes: Vec<&str> = job
        .circuit
        .nodes
        .iter()
        .map(|n| n.name.value.as_str())
        .collect();
    let mut known_nodes: HashSet<&str> = nodes.iter().copied().collect();
    for set in &job.measurements {
        for n in &set.nodes {
            if known_nodes.insert(n.name.value.as_str()) {
                nodes.push(&n.name.value);
            }
        }
    }

    let known_positions: HashSet<&str> = positions.iter().copied().collect();
    let mut position = |name: &Spanned<String>, what: Msg| {
        if !known_positions.contains(name.value.as_str()) {
            let help = if positions.is_empty() {
                Msg::new("diag-list-valves-first")
            } else {
                suggest(&name.value, &positions, out.len())
            };
            out.push(
                DecodeError::error(
                    "job::unknown-position",
                    name.span,
                    Msg::new("diag-names-unknown-position")
                        .arg("what", what)
                        .arg("name", name.value.as_str()),
                    Msg::new("diag-no-such-position"),
                )
                .with_help(help),
            );
        }
    };
    let circuits: Vec<&super::model::Circuit> = std::iter::once(&job.circuit)
        .chain(job.measurements.iter().map(|m| &m.circuit_changes))
        .collect();
    for c in &circuits {
        for r in &c.cathode_resistors {
            for v in &r.valves {
                position(
                    v,
                    Msg::new("diag-ref-cathode-resistor").arg("name", r.reference.as_str()),
                );
            }
        }
        for r in &c.sense_resistors {
            position(&r.valve, Msg::new("diag-ref-sense-resistor"));
        }
        for r in &c.screen_resistors {
            position(&r.valve, Msg::new("diag-ref-screen-resistor"));
        }
        for h in &c.half_primaries {
            for v in &h.valves {
                position(v, Msg::new("diag-ref-half-primary"));
            }
        }
        if let Some(rect) = &c.rectifier
            && let RectifierKind::Valve(p) = &rect.kind
        {
            position(p, Msg::new("diag-ref-rectifier"));
        }
    }
    for set in &job.measurements {
        for v in &set.valves {
            position(
                &v.position,
                Msg::new("diag-ref-readings").arg("set", set.label.as_str()),
            );
        }
        for c in &set.valve_types {
            if !set
                .valves
                .iter()
                .any(|v| v.position.value == c.position.value)
            {
                position(
                    &c.position,
                    Msg::new("diag-ref-readings").arg("set", set.label.as_str()),
                );
            }
        }
        for w in &set.warm_up {
            position(
                &w.reading.position,
                Msg::new("diag-ref-warm-up").arg("set", set.label.as_str()),
            );
        }
    }
    for m in &job.mods {
        for f in &m.figures {
            if let super::model::ModFigure::CathodeBypass { valve, .. }
            | super::model::ModFigure::StageGain { valve, .. } = f
            {
                position(valve, Msg::new("diag-ref-mod-figure"));
            }
        }
        for source in m.network.iter().flat_map(|n| n.sources()) {
            if let super::network::SourceImpedance::Valve { valve, .. } = &source.impedance {
                position(valve, Msg::new("diag-ref-network-source"));
            }
        }
    }

    let mut node = |name: &Spanned<String>, what: Msg| {
        if !known_nodes.contains(name.value.as_str()) {
            let help = if nodes.is_empty() {
                Msg::new("diag-declare-in-circuit")
            } else {
                suggest(&name.value, &nodes, out.len())
            };
            out.push(
                DecodeError::error(
                    "job::unknown-node-name",
                    name.span,
                    Msg::new("diag-names-unknown-node")
                        .arg("what", what)
                        .arg("name", name.value.as_str()),
                    Msg::new("diag-no-such-node"),
                )
                .with_help(help),
            );
        }
    };
    for c in &circuits {
        for d in &c.droppers {
            let dropper = || Msg::new("diag-ref-dropper").arg("name", d.reference.as_str());
            node(&d.from, dropper());
            node(&d.to, dropper());
        }
        for f in &c.filter_capacitors {
            node(
                &f.node,
                Msg::new("diag-ref-filter-capacitor").arg("name", f.reference.as_str()),
            );
        }
        for s in &c.screen_resistors {
            node(&s.supply, Msg::new("diag-ref-screen-resistor"));
        }
    }

    out.extend(acceptance_names(job, &positions, &nodes));

    // Readings far from the job's own nominal mains are suspect.
    for set in &job.measurements {
        let ratio = set.mains.value / job.mains.nominal.value;
        if !(0.8..=1.2).contains(&ratio) {
            out.push(
                DecodeError::warning(
                    "job::implausible",
                    set.mains.span,
                    Msg::new("diag-mains-far")
                        .arg("mains", set.mains.value.to_string())
                        .arg("set", set.label.as_str())
                        .arg("pct", format!("{:.0}", (ratio - 1.0) * 100.0))
                        .arg("nominal", job.mains.nominal.value.to_string()),
                    Msg::new("diag-far-from-nominal"),
                )
                .with_help(Msg::new("diag-mains-far-help")),
            );
        }
    }
    out
}

/// Every name an acceptance uses must name something in the job.
fn acceptance_names(job: &Job, positions: &[&str], nodes: &[&str]) -> Vec<DecodeError> {
    use super::model::AcceptedKind;
    let mut out = Vec::new();
    let mut parts: Vec<String> = Vec::new();
    for c in
        std::iter::once(&job.circuit).chain(job.measurements.iter().map(|m| &m.circuit_changes))
    {
        parts.extend(c.droppers.iter().map(|d| d.reference.clone()));
        parts.extend(c.cathode_resistors.iter().map(|d| d.reference.clone()));
        parts.extend(c.filter_capacitors.iter().map(|d| d.reference.clone()));
        parts.extend(c.screen_resistors.iter().map(|d| {
            d.reference
                .clone()
                .unwrap_or_else(|| format!("{} screen", d.valve.value))
        }));
    }
    parts.sort();
    parts.dedup();
    let parts: Vec<&str> = parts.iter().map(String::as_str).collect();
    let labels: Vec<&str> = job.measurements.iter().map(|m| m.label.as_str()).collect();
    let heater_labels: Vec<&str> = job
        .measurements
        .iter()
        .flat_map(|m| m.heaters.iter().filter_map(|h| h.label.as_deref()))
        .collect();
    // `kind` selects the words in the catalogue: set, channel, position,
    // node, part, heater or safety.
    let mut unknown = |name: &Spanned<String>, known: &[&str], kind: &str, code: &'static str| {
        if !known.contains(&name.value.as_str()) {
            let help = if known.is_empty() {
                Msg::new("diag-accept-none").arg("kind", kind)
            } else {
                suggestion(&name.value, known)
            };
            out.push(
                DecodeError::error(
                    code,
                    name.span,
                    Msg::new("diag-accept-unknown")
                        .arg("kind", kind)
                        .arg("name", name.value.as_str()),
                    Msg::new("diag-accept-no-such").arg("kind", kind),
                )
                .with_help(help),
            );
        }
    };
    for a in &job.acceptances {
        if let Some(set) = &a.set {
            unknown(set, &labels, "set", "job::unknown-set");
        }
        if let Some(channel) = &a.channel {
            let channels: Vec<&str> = job
                .measurements
                .iter()
                .flat_map(|m| {
                    m.bench
                        .output_power
                        .iter()
                        .map(|p| &p.channel)
                        .chain(m.bench.hum_noise.iter().map(|h| &h.channel))
                })
                .filter_map(|c| c.as_deref())
                .collect();
            unknown(channel, &channels, "channel", "job::unknown-channel");
        }
        let Some(name) = &a.name else { continue };
        match a.kind {
            AcceptedKind::Valve => unknown(name, positions, "position", "job::unknown-position"),
            AcceptedKind::Node => unknown(name, nodes, "node", "job::unknown-node-name"),
            AcceptedKind::Part => unknown(name, &parts, "part", "job::unknown-part"),
            AcceptedKind::Heater => unknown(name, &heater_labels, "heater", "job::unknown-heater"),
            AcceptedKind::Bench => {}
            AcceptedKind::Safety => {
                let recorded: Vec<&str> = job
                    .safety
                    .iter()
                    .flat_map(|s| s.tests.iter().map(|t| t.name()))
                    .collect();
                unknown(name, &recorded, "safety", "job::unknown-safety-test");
            }
        }
    }
    out
}
