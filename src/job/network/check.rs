//! Structural checks of every mod's network, before and after its edits:
//! each node reaches ground through some part, no loop of ideal
//! connections (the source and links), the load is reached from the
//! source, pot settings line up, and a valve source has the μ and ra the
//! ratings table must supply. A network that passes can be solved at every
//! frequency of the sweep; one that does not is reported at its line.

use std::collections::HashMap;

use miette::SourceSpan;

use super::super::decode_error::DecodeError;
use super::super::model::Job;
use super::*;
use crate::catalogue::{Arg, Msg};
use crate::ratings::RatingsTable;

/// Problems with the networks of `job`; `ratings`, when given, must hold μ
/// and ra for each valve a source names.
pub fn check(job: &Job, ratings: Option<&RatingsTable>) -> Vec<DecodeError> {
    let mut out = Vec::new();
    for m in &job.mods {
        let Some(net) = &m.network else { continue };
        let before = &net.before;
        let known = out.len();
        check_state(net, before, None, &mut out);
        if net.has_after() {
            let after = net.after();
            // A broken before network is reported once, not again after.
            if out.len() == known {
                check_state(net, &after, Some(net), &mut out);
            }
            let (b, a) = (before.setting_count(), after.setting_count());
            if b > 1 && a > 1 && a != b {
                out.push(
                    DecodeError::error(
                        "job::settings-count",
                        net.span,
                        Msg::new("diag-net-settings-before-after")
                            .arg("before", b)
                            .arg("after", a),
                        Msg::new("diag-net-settings-differ"),
                    )
                    .with_help(Msg::new("diag-net-settings-before-after-help")),
                );
            }
            if let Some(osc) = &net.oscillator
                && let Some(speed) = &osc.speed
                && !after.parts.iter().any(|p| p.reference.value == speed.value)
            {
                out.push(DecodeError::error(
                    "job::unknown-part",
                    speed.span,
                    Msg::new("diag-net-speed-removed").arg("name", speed.value.as_str()),
                    Msg::new("diag-net-not-as-left"),
                ));
            }
        }
        for state in std::iter::once(before.clone()).chain(net.has_after().then(|| net.after())) {
            if let SourceImpedance::Valve { valve, .. } = &state.source.impedance {
                check_valve(job, ratings, valve, &mut out);
            }
        }
    }
    // Each problem once.
    let mut seen: Vec<(usize, String)> = Vec::new();
    out.retain(|p| {
        let key = (p.span.offset(), p.message.clone());
        if seen.contains(&key) {
            false
        } else {
            seen.push(key);
            true
        }
    });
    out
}

fn check_valve(
    job: &Job,
    ratings: Option<&RatingsTable>,
    valve: &super::super::model::Spanned<String>,
    out: &mut Vec<DecodeError>,
) {
    let Some(spec) = job.valve(&valve.value) else {
        // The cross-reference check reports unknown positions.
        return;
    };
    let Some(row) = ratings.and_then(|t| t.lookup(&spec.type_name.value).ok()) else {
        return;
    };
    if row.mu.is_none() || row.plate_resistance.is_none() {
        out.push(
            DecodeError::error(
                "job::no-valve-figures",
                valve.span,
                Msg::new("diag-net-no-mu-ra")
                    .arg("position", valve.value.as_str())
                    .arg("type", row.name.as_str()),
                Msg::new("diag-net-no-mu-ra-label"),
            )
            .with_help(Msg::new("diag-net-no-mu-ra-help")),
        );
    }
}

/// A connection between two nodes, for the graph checks.
struct Edge<'a> {
    a: &'a str,
    b: &'a str,
    /// What it is, in words: "R5", "VR1 (ccw end to wiper)", "the source".
    name: Arg,
    /// The ideal source (shorted when it closes a loop of ideal edges).
    source: bool,
    /// An ideal connection: the ideal source or a link.
    ideal: bool,
    blame: SourceSpan,
    /// A part of the network (not the source or the load's resistance).
    part: bool,
}

fn edges(state: &NetworkState) -> Vec<Edge<'_>> {
    let mut out = Vec::new();
    let src = &state.source;
    out.push(Edge {
        a: &src.node.value,
        b: GROUND,
        name: Msg::new("diag-net-the-source").into(),
        source: true,
        ideal: matches!(src.impedance, SourceImpedance::Ideal),
        blame: src.span,
        part: false,
    });
    if state.load.resistance.is_some() {
        out.push(Edge {
            a: &state.load.node.value,
            b: GROUND,
            name: Msg::new("diag-net-the-load").into(),
            source: false,
            ideal: false,
            blame: state.load.span,
            part: false,
        });
    }
    for p in &state.parts {
        let name = p.reference.value.clone();
        match &p.kind {
            PartKind::Pot { ccw, wiper, cw, .. } => {
                for (end, side) in [(ccw, "ccw"), (cw, "cw")] {
                    if let Some(end) = end {
                        out.push(Edge {
                            a: &end.value,
                            b: &wiper.value,
                            name: Msg::new("diag-net-pot-end")
                                .arg("name", name.as_str())
                                .arg("side", side)
                                .into(),
                            source: false,
                            ideal: false,
                            blame: p.blame(),
                            part: true,
                        });
                    }
                }
            }
            PartKind::Link { a, b } => out.push(Edge {
                a: &a.value,
                b: &b.value,
                name: name.into(),
                source: false,
                ideal: true,
                blame: p.blame(),
                part: true,
            }),
            PartKind::Resistor { a, b, .. }
            | PartKind::Capacitor { a, b, .. }
            | PartKind::Inductor { a, b, .. } => out.push(Edge {
                a: &a.value,
                b: &b.value,
                name: name.into(),
                source: false,
                ideal: false,
                blame: p.blame(),
                part: true,
            }),
        }
    }
    out
}

/// Union-find over node indices.
struct Sets(Vec<usize>);

impl Sets {
    fn new(n: usize) -> Self {
        Sets((0..n).collect())
    }
    fn root(&mut self, mut i: usize) -> usize {
        while self.0[i] != i {
            self.0[i] = self.0[self.0[i]];
            i = self.0[i];
        }
        i
    }
    /// Joins the sets of `a` and `b`; false when they were already one.
    fn join(&mut self, a: usize, b: usize) -> bool {
        let (ra, rb) = (self.root(a), self.root(b));
        self.0[ra] = rb;
        ra != rb
    }
}

/// Checks one state. `edited` is the network when `state` is its after
/// state, so a problem caused by removing a part points at the removal.
fn check_state(
    net: &Network,
    state: &NetworkState,
    edited: Option<&Network>,
    out: &mut Vec<DecodeError>,
) {
    let after = if edited.is_some() { "yes" } else { "no" };
    let src = &state.source.node;
    let load = &state.load.node;
    if src.value == GROUND {
        out.push(DecodeError::error(
            "job::source-on-ground",
            src.span,
            Msg::new("diag-net-source-on-ground"),
            Msg::new("diag-net-source-on-ground-label"),
        ));
        return;
    }
    if load.value == GROUND {
        out.push(DecodeError::error(
            "job::load-on-ground",
            load.span,
            Msg::new("diag-net-load-on-ground"),
            Msg::new("diag-net-load-on-ground-label"),
        ));
        return;
    }
    let edges = edges(state);
    let mut index: HashMap<&str, usize> = HashMap::new();
    let mut names: Vec<&str> = Vec::new();
    for e in &edges {
        for n in [e.a, e.b] {
            if !index.contains_key(n) {
                index.insert(n, names.len());
                names.push(n);
            }
        }
    }
    let ground = index[GROUND];

    // Loops of ideal connections: the ideal source and links.
    let mut ideal = Sets::new(names.len());
    let mut ideal_edges: Vec<&Edge> = Vec::new();
    for e in edges.iter().filter(|e| e.ideal) {
        let (a, b) = (index[e.a], index[e.b]);
        if !ideal.join(a, b) {
            let mut loop_edges = ideal_path(&ideal_edges, e.a, e.b);
            loop_edges.push(e);
            let shorted_source = loop_edges.iter().any(|e| e.source);
            let loop_names: Vec<Arg> = loop_edges.iter().map(|e| e.name.clone()).collect();
            out.push(
                DecodeError::error(
                    "job::ideal-loop",
                    e.blame,
                    Msg::new("diag-net-ideal-loop")
                        .arg("parts", words_list(loop_names))
                        .arg("after", after)
                        .arg("shorted", if shorted_source { "yes" } else { "no" }),
                    Msg::new("diag-net-closes-loop"),
                )
                .with_help(Msg::new(if shorted_source {
                    "diag-net-shorted-source-help"
                } else {
                    "diag-net-ideal-loop-help"
                })),
            );
            return;
        }
        ideal_edges.push(e);
    }

    // Floating nodes: every node must reach ground through some connection.
    let mut all = Sets::new(names.len());
    for e in &edges {
        all.join(index[e.a], index[e.b]);
    }
    let ground_root = all.root(ground);
    let mut reported: Vec<usize> = Vec::new();
    for i in 0..names.len() {
        let root = all.root(i);
        if root == ground_root || reported.contains(&root) {
            continue;
        }
        reported.push(root);
        let group: Vec<&str> = (0..names.len())
            .filter(|&j| all.root(j) == root)
            .map(|j| names[j])
            .collect();
        let touching: Vec<&Edge> = edges
            .iter()
            .filter(|e| group.contains(&e.a) || group.contains(&e.b))
            .collect();
        let blame = blame_for(net, edited, &group, &touching);
        let parts: Vec<Arg> = touching.iter().map(|e| e.name.clone()).collect();
        let nodes: Vec<Arg> = group.iter().map(|n| Arg::from(format!("`{n}`"))).collect();
        out.push(
            DecodeError::error(
                "job::floating-node",
                blame,
                Msg::new("diag-net-floating")
                    .arg("count", group.len())
                    .arg("nodes", words_list(nodes))
                    .arg("after", after)
                    .arg("parts", words_list(parts)),
                Msg::new("diag-net-floating-label"),
            )
            .with_help(Msg::new("diag-net-floating-help").arg("count", group.len())),
        );
    }
    if !reported.is_empty() {
        return;
    }

    // The load must be reached from the source other than through ground.
    let mut through = Sets::new(names.len());
    for e in edges.iter().filter(|e| e.part) {
        let (a, b) = (index[e.a], index[e.b]);
        if a != ground && b != ground {
            through.join(a, b);
        }
    }
    if let (Some(&s), Some(&l)) = (
        index.get(src.value.as_str()),
        index.get(load.value.as_str()),
    ) && through.root(s) != through.root(l)
    {
        out.push(
            DecodeError::error(
                "job::load-unreached",
                load.span,
                Msg::new("diag-net-load-unreached")
                    .arg("source", src.value.as_str())
                    .arg("load", load.value.as_str())
                    .arg("after", after),
                Msg::new("diag-net-load-unreached-label"),
            )
            .with_help(Msg::new("diag-net-load-unreached-help")),
        );
    }

    // Pots listing several settings must list the same number.
    let mut count: Option<(usize, &Part)> = None;
    for p in &state.parts {
        if let PartKind::Pot { settings, .. } = &p.kind
            && settings.len() > 1
        {
            match count {
                None => count = Some((settings.len(), p)),
                Some((n, first)) if n != settings.len() => {
                    out.push(
                        DecodeError::error(
                            "job::settings-count",
                            p.blame(),
                            Msg::new("diag-net-pot-settings-differ")
                                .arg("pot", p.reference.value.as_str())
                                .arg("count", settings.len())
                                .arg("first", first.reference.value.as_str())
                                .arg("first_count", n)
                                .arg("after", after),
                            Msg::new("diag-net-settings-differ"),
                        )
                        .with_help(Msg::new("diag-net-pot-settings-help")),
                    );
                }
                Some(_) => {}
            }
        }
    }
}

/// Where a floating group should be reported: the first edge of the group
/// that an edit made, else (after the edits) the removal of a part that
/// touched the group, else the group's first edge.
fn blame_for(
    net: &Network,
    edited: Option<&Network>,
    group: &[&str],
    touching: &[&Edge],
) -> SourceSpan {
    if edited.is_some() {
        let changed: Vec<SourceSpan> = net
            .edits
            .iter()
            .filter_map(|e| match e {
                Edit::Add(p) => Some(p.span),
                Edit::Change { span, .. } => Some(*span),
                _ => None,
            })
            .collect();
        if let Some(e) = touching.iter().find(|e| changed.contains(&e.blame)) {
            return e.blame;
        }
        for edit in &net.edits {
            if let Edit::Remove { reference, span } = edit
                && let Some(part) = net
                    .before
                    .parts
                    .iter()
                    .find(|p| p.reference.value == reference.value)
                && part
                    .nodes()
                    .iter()
                    .any(|n| group.contains(&n.value.as_str()))
            {
                return *span;
            }
        }
    }
    touching.first().map(|e| e.blame).unwrap_or(net.span)
}

/// The ideal edges on the path from `from` to `to` in a forest of ideal
/// edges.
fn ideal_path<'e, 'a>(edges: &[&'e Edge<'a>], from: &str, to: &str) -> Vec<&'e Edge<'a>> {
    // Breadth-first search, remembering the edge that reached each node.
    let mut came: HashMap<&str, Option<usize>> = HashMap::new();
    came.insert(from, None);
    let mut queue = std::collections::VecDeque::from([from]);
    while let Some(n) = queue.pop_front() {
        if n == to {
            break;
        }
        for (i, e) in edges.iter().enumerate() {
            let next = if e.a == n {
                e.b
            } else if e.b == n {
                e.a
            } else {
                continue;
            };
            if !came.contains_key(next) {
                came.insert(next, Some(i));
                queue.push_back(next);
            }
        }
    }
    let mut path = Vec::new();
    let mut at = to;
    while let Some(Some(i)) = came.get(at) {
        let e = edges[*i];
        path.push(e);
        at = if e.a == at { e.b } else { e.a };
    }
    path.reverse();
    path
}

/// "a", "a and b", "a, b and c", said in the reader's language (each item
/// may itself be a message).
pub(crate) fn words_list(mut items: Vec<Arg>) -> Arg {
    let Some(last) = items.pop() else {
        return Arg::from("");
    };
    let Some(before) = items.pop() else {
        return last;
    };
    let mut list: Arg = Msg::new("diag-list-pair")
        .arg("first", before)
        .arg("last", last)
        .into();
    while let Some(item) = items.pop() {
        list = Msg::new("diag-list-more")
            .arg("first", item)
            .arg("rest", list)
            .into();
    }
    list
}
