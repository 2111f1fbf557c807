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
                        format!(
                            "the network lists {b} settings before and {a} after; the curves are compared setting by setting"
                        ),
                        "settings do not line up",
                    )
                    .with_help("list the same number of settings before and after (or one)"),
                );
            }
            if let Some(osc) = &net.oscillator
                && let Some(speed) = &osc.speed
                && !after.parts.iter().any(|p| p.reference.value == speed.value)
            {
                out.push(DecodeError::error(
                    "job::unknown-part",
                    speed.span,
                    format!(
                        "the speed pot {} is removed by the mod's edits",
                        speed.value
                    ),
                    "not in the network as left",
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
                format!(
                    "{} ({}) has no typical μ and ra in the ratings table, so its output impedance cannot be worked out",
                    valve.value, row.name
                ),
                "no μ and ra",
            )
            .with_help("give the source's `impedance=` instead, or add μ and ra to the ratings row (--ratings)"),
        );
    }
}

/// A connection between two nodes, for the graph checks.
struct Edge<'a> {
    a: &'a str,
    b: &'a str,
    /// What it is, in words: "R5", "VR1 (ccw to wiper)", "the source".
    name: String,
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
        name: "the source".into(),
        ideal: matches!(src.impedance, SourceImpedance::Ideal),
        blame: src.span,
        part: false,
    });
    if state.load.resistance.is_some() {
        out.push(Edge {
            a: &state.load.node.value,
            b: GROUND,
            name: "the load".into(),
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
                            name: format!("{name} ({side} end to wiper)"),
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
                name,
                ideal: true,
                blame: p.blame(),
                part: true,
            }),
            PartKind::Resistor { a, b, .. }
            | PartKind::Capacitor { a, b, .. }
            | PartKind::Inductor { a, b, .. } => out.push(Edge {
                a: &a.value,
                b: &b.value,
                name,
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
    let after = if edited.is_some() {
        " after the mod's edits"
    } else {
        ""
    };
    let src = &state.source.node;
    let load = &state.load.node;
    if src.value == GROUND {
        out.push(DecodeError::error(
            "job::source-on-ground",
            src.span,
            "the source cannot sit on `ground`: it drives a node against ground",
            "source on ground",
        ));
        return;
    }
    if load.value == GROUND {
        out.push(DecodeError::error(
            "job::load-on-ground",
            load.span,
            "the response cannot be read at `ground`: name the node the load hangs on",
            "load on ground",
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
            let mut loop_names = ideal_path(&ideal_edges, e.a, e.b);
            loop_names.push(e.name.clone());
            let shorted_source = loop_names.iter().any(|n| n == "the source");
            out.push(
                DecodeError::error(
                    "job::ideal-loop",
                    e.blame,
                    format!(
                        "{} form a loop of ideal connections{after}{}: the network cannot be solved",
                        words_list(&loop_names),
                        if shorted_source {
                            " (the ideal source is shorted)"
                        } else {
                            ""
                        }
                    ),
                    "closes a loop",
                )
                .with_help(if shorted_source {
                    "give the source its output `impedance=` or a `valve=`, or take out the link that shorts it"
                } else {
                    "take out one of the links: two ideal paths between the same nodes say nothing more than one"
                }),
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
        let parts: Vec<String> = touching.iter().map(|e| e.name.clone()).collect();
        let nodes: Vec<String> = group.iter().map(|n| format!("`{n}`")).collect();
        out.push(
            DecodeError::error(
                "job::floating-node",
                blame,
                format!(
                    "{} {} connect{} to nothing that reaches ground{after} (only {}): the network cannot be solved",
                    if group.len() == 1 { "node" } else { "nodes" },
                    words_list(&nodes),
                    if group.len() == 1 { "s" } else { "" },
                    words_list(&parts)
                ),
                "floating",
            )
            .with_help(format!(
                "connect {} to the rest of the network, or check the node names for a typing slip",
                if group.len() == 1 { "it" } else { "them" }
            )),
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
                format!(
                    "no part leads from the source's node `{}` to the load's node `{}`{after}, so the response is nil",
                    src.value, load.value
                ),
                "not reached from the source",
            )
            .with_help("check the node names of the parts between them"),
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
                            format!(
                                "{} lists {} settings but {} lists {n}{after}: the k-th setting of every pot makes the network's k-th setting",
                                p.reference.value,
                                settings.len(),
                                first.reference.value
                            ),
                            "settings do not line up",
                        )
                        .with_help("list the same number of settings on each pot, or one setting for a pot that stays put"),
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

/// The names of the ideal edges on the path from `from` to `to` in a
/// forest of ideal edges.
fn ideal_path(edges: &[&Edge], from: &str, to: &str) -> Vec<String> {
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
        path.push(e.name.clone());
        at = if e.a == at { e.b } else { e.a };
    }
    path.reverse();
    path
}

/// "a", "a and b", "a, b and c".
pub(crate) fn words_list(items: &[String]) -> String {
    match items {
        [] => String::new(),
        [one] => one.clone(),
        [rest @ .., last] => format!("{} and {last}", rest.join(", ")),
    }
}
