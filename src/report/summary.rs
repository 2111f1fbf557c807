//! The plain-words summary that opens the hand-over document: what was
//! wrong, what was done, and the state the unit leaves in, in a customer's
//! terms. Every figure in it comes from the findings (none is typed by
//! hand); the first set is what was found, the final set the state now.
//!
//! Every sentence of the summary is a `summary-…` message of the catalogue;
//! the figures and names are its arguments.

use crate::calc::{Findings, SetFindings, Status, Verdict};
use crate::catalogue::{Arg, Catalogue};
use crate::job::Job;

/// The summary, sentence by sentence.
#[derive(Debug, Clone, PartialEq, Default)]
pub struct Summary {
    /// What the first readings showed (empty with a single set).
    pub found: Vec<String>,
    /// What the work did.
    pub done: Vec<String>,
    /// The state the unit leaves in.
    pub now: Vec<String>,
    /// True when nothing still counts against the unit (open findings in
    /// the final set or failed safety tests).
    pub healthy: bool,
}

fn pct(v: f64) -> String {
    format!("{v:.0} %")
}

/// A kind of trouble, so that valves or parts with the same trouble are
/// named in one phrase.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
enum Trouble {
    ValvesHot,
    ValvesCold,
    ValvesBeyond,
    ValvesHighLine,
    ScreenHot,
    VoltageMax,
    CathodeCurrent,
    NodeOff,
    ResistorOver,
    ResistorWarm,
    CapacitorOver,
    CapacitorMargin,
    RectifierLoad,
    HeaterOff,
}

/// Troubles in the order they were met, each with its subjects and the
/// figure that goes with each subject.
#[derive(Default)]
struct Troubles(Vec<(Trouble, Vec<(String, f64)>)>);

impl Troubles {
    fn add(&mut self, t: Trouble, subject: &str, figure: f64) {
        match self.0.iter_mut().find(|(k, _)| *k == t) {
            Some((_, list)) => list.push((subject.to_string(), figure)),
            None => self.0.push((t, vec![(subject.to_string(), figure)])),
        }
    }

    fn words(&self, cat: &Catalogue) -> Vec<String> {
        self.0
            .iter()
            .map(|(t, list)| phrase(*t, list, cat))
            .collect()
    }
}

/// "67–68 %" or "68 %".
fn range(list: &[(String, f64)]) -> String {
    let lo = list.iter().map(|x| x.1).fold(f64::INFINITY, f64::min);
    let hi = list.iter().map(|x| x.1).fold(f64::NEG_INFINITY, f64::max);
    if format!("{lo:.0}") == format!("{hi:.0}") {
        pct(lo)
    } else {
        format!("{lo:.0}–{hi:.0} %")
    }
}

fn names(list: &[(String, f64)], cat: &Catalogue) -> String {
    let n: Vec<&str> = list.iter().map(|x| x.0.as_str()).collect();
    cat.and_list(&n)
}

/// "B+3 (−21 %)": a name with a signed whole percentage.
fn signed(name: &str, d: f64) -> String {
    format!(
        "{name} ({}{:.0} %)",
        if d < 0.0 { "\u{2212}" } else { "+" },
        d.abs()
    )
}

fn phrase(t: Trouble, list: &[(String, f64)], cat: &Catalogue) -> String {
    let say = |key: &str, names: String| {
        cat.format(
            key,
            &[
                ("count", Arg::from(list.len())),
                ("names", Arg::from(names)),
                ("range", Arg::from(range(list))),
            ],
        )
    };
    let plain = |key: &str| say(key, names(list, cat));
    match t {
        Trouble::ValvesHot => plain("summary-valves-hot"),
        Trouble::ValvesCold => plain("summary-valves-cold"),
        Trouble::ValvesBeyond => plain("summary-valves-beyond"),
        Trouble::ValvesHighLine => plain("summary-valves-high-line"),
        Trouble::ScreenHot => plain("summary-screen-hot"),
        Trouble::VoltageMax => plain("summary-voltage-max"),
        Trouble::CathodeCurrent => plain("summary-cathode-current"),
        Trouble::NodeOff => {
            let each: Vec<String> = list.iter().map(|(n, d)| signed(n, *d)).collect();
            say("summary-nodes-off", cat.and_list(&each))
        }
        Trouble::ResistorOver => match list {
            [(n, p)] => cat.format(
                "summary-resistor-over",
                &[("name", Arg::from(n)), ("pct", Arg::from(pct(*p)))],
            ),
            _ => {
                let each: Vec<String> = list
                    .iter()
                    .map(|(n, p)| format!("{n} ({})", pct(*p)))
                    .collect();
                say("summary-resistors-over", cat.and_list(&each))
            }
        },
        Trouble::ResistorWarm => plain("summary-resistors-warm"),
        Trouble::CapacitorOver => plain("summary-capacitors-over"),
        Trouble::CapacitorMargin => plain("summary-capacitors-margin"),
        Trouble::RectifierLoad => plain("summary-rectifier-load"),
        Trouble::HeaterOff => {
            let d = list.first().map(|x| x.1).unwrap_or(0.0);
            cat.format(
                if d < 0.0 {
                    "summary-heater-low"
                } else {
                    "summary-heater-high"
                },
                &[("pct", Arg::from(format!("{:.0}", d.abs())))],
            )
        }
    }
}

/// Everything off in a set, in words; with `open_only`, accepted figures
/// are left out.
fn off_in(set: &SetFindings, open_only: bool, cat: &Catalogue) -> Vec<String> {
    let counts = |v: &Verdict| v.status != Status::Ok && (!open_only || !v.accepted);
    let mut t = Troubles::default();
    for v in &set.valves {
        let off = |check: &str| {
            v.checks
                .iter()
                .find(|c| c.check == check && counts(&c.verdict))
                .map(|c| c.verdict.status)
        };
        let pa = v.plate_dissipation_pct.unwrap_or(0.0);
        match off("plate_dissipation") {
            Some(Status::Cold) => t.add(Trouble::ValvesCold, &v.position, pa),
            Some(Status::Over) => t.add(Trouble::ValvesBeyond, &v.position, pa),
            Some(_) => t.add(Trouble::ValvesHot, &v.position, pa),
            None => {
                if off("plate_dissipation_high_line").is_some() {
                    let hl = v.high_line_plate_dissipation_pct.unwrap_or(0.0);
                    t.add(Trouble::ValvesHighLine, &v.position, hl);
                }
            }
        }
        if off("screen_dissipation").is_some() {
            t.add(
                Trouble::ScreenHot,
                &v.position,
                v.screen_dissipation_pct.unwrap_or(0.0),
            );
        }
        if off("plate_voltage").is_some() || off("screen_voltage").is_some() {
            t.add(Trouble::VoltageMax, &v.position, 0.0);
        }
        if off("cathode_current").is_some() {
            t.add(Trouble::CathodeCurrent, &v.position, 0.0);
        }
    }
    for n in set.nodes.iter().filter(|n| counts(&n.verdict)) {
        t.add(Trouble::NodeOff, &n.name, n.deviation_pct.unwrap_or(0.0));
    }
    for r in set
        .droppers
        .iter()
        .chain(&set.cathode_resistors)
        .chain(&set.screen_resistors)
        .filter(|r| counts(&r.verdict))
    {
        let p = r.power_pct.unwrap_or(0.0);
        match r.verdict.status {
            Status::Over => t.add(Trouble::ResistorOver, &r.reference, p),
            _ => t.add(Trouble::ResistorWarm, &r.reference, p),
        }
    }
    for c in set.filter_capacitors.iter().filter(|c| counts(&c.verdict)) {
        match c.verdict.status {
            Status::Over => t.add(Trouble::CapacitorOver, &c.reference, c.margin_pct),
            _ => t.add(Trouble::CapacitorMargin, &c.reference, c.margin_pct),
        }
    }
    if let Some(r) = set.rectifier.as_ref().filter(|r| counts(&r.verdict)) {
        t.add(Trouble::RectifierLoad, &r.position, r.load_pct);
    }
    for h in set.heaters.iter().filter(|h| counts(&h.verdict)) {
        t.add(Trouble::HeaterOff, "heater", h.deviation_pct);
    }
    t.words(cat)
}

/// The range of plate-dissipation percentages of the output valves in a
/// set: "67–68 %" or "68 %".
fn plate_range(set: &SetFindings) -> Option<String> {
    let p: Vec<f64> = set
        .valves
        .iter()
        .filter(|v| v.is_output)
        .filter_map(|v| v.plate_dissipation_pct)
        .collect();
    let lo = p.iter().copied().reduce(f64::min)?;
    let hi = p.iter().copied().reduce(f64::max)?;
    Some(if format!("{lo:.0}") == format!("{hi:.0}") {
        pct(lo)
    } else {
        format!("{lo:.0}–{hi:.0} %")
    })
}

/// Builds the summary of a job's findings.
pub fn summary(job: &Job, findings: &Findings, cat: &Catalogue) -> Summary {
    let final_set = findings.sets.iter().find(|s| s.is_final);
    let first = findings.sets.first().filter(|f| !f.is_final);
    let mut out = Summary::default();

    if let Some(first) = first {
        let off = off_in(first, false, cat);
        out.found.push(if off.is_empty() {
            cat.format("summary-found-ok", &[("label", Arg::from(&first.label))])
        } else {
            cat.format(
                "summary-found",
                &[
                    ("label", Arg::from(&first.label)),
                    ("troubles", Arg::from(cat.and_list(&off))),
                ],
            )
        });
    }

    let parts: Vec<String> = job.parts.iter().map(|p| p.name().to_string()).collect();
    if !parts.is_empty() {
        out.done.push(cat.format(
            "summary-parts",
            &[
                ("count", Arg::from(parts.len())),
                ("parts", Arg::from(parts.join(", "))),
            ],
        ));
    }
    if !job.mods.is_empty() {
        out.done
            .push(cat.format("summary-mods", &[("count", Arg::from(job.mods.len()))]));
    }
    if let Some(last) = final_set {
        for l in &findings.line_up {
            if let Some(c) = l.changes.iter().find(|c| c.set == last.label) {
                out.done.push(cat.format(
                    "summary-type-change",
                    &[
                        ("position", Arg::from(&l.position)),
                        ("now", Arg::from(&c.valve_type)),
                        ("was", Arg::from(&l.valve_type)),
                    ],
                ));
            }
        }
    }
    if let (Some(first), Some(last)) = (first, final_set)
        && let (Some(was), Some(now)) = (plate_range(first), plate_range(last))
        && was != now
    {
        out.done.push(cat.format(
            "summary-idle-now",
            &[("now", Arg::from(now)), ("was", Arg::from(was))],
        ));
    }

    let safety_failed = findings.safety.iter().any(|s| s.verdict.is_open());
    match final_set {
        Some(set) => {
            let open = off_in(set, true, cat);
            let accepted = set
                .valves
                .iter()
                .flat_map(|v| v.checks.iter().map(|c| &c.verdict))
                .chain(set.nodes.iter().map(|n| &n.verdict))
                .chain(
                    set.droppers
                        .iter()
                        .chain(&set.cathode_resistors)
                        .chain(&set.screen_resistors)
                        .map(|r| &r.verdict),
                )
                .chain(set.filter_capacitors.iter().map(|c| &c.verdict))
                .chain(set.rectifier.iter().map(|r| &r.verdict))
                .chain(set.heaters.iter().map(|h| &h.verdict))
                .filter(|v| v.accepted)
                .count();
            out.healthy = open.is_empty() && !safety_failed;
            if open.is_empty() {
                out.now.push(cat.format(
                    "summary-now-ok",
                    &[
                        ("label", Arg::from(&set.label)),
                        ("accepted", Arg::from(accepted)),
                    ],
                ));
            } else {
                out.now.push(cat.format(
                    "summary-now-open",
                    &[
                        ("label", Arg::from(&set.label)),
                        ("troubles", Arg::from(cat.and_list(&open))),
                    ],
                ));
            }
        }
        None => out.now.push(cat.text("summary-no-measurements")),
    }
    if findings.safety.is_empty() {
        if job.safety.is_none() {
            out.now.push(cat.text("summary-no-safety"));
        }
    } else if safety_failed {
        let failed: Vec<String> = findings
            .safety
            .iter()
            .filter(|s| s.verdict.is_open())
            .map(|s| crate::calc::safety_test_words(s.test, cat))
            .collect();
        out.now.push(cat.format(
            "summary-safety-failed",
            &[
                ("count", Arg::from(failed.len())),
                ("tests", Arg::from(cat.and_list(&failed))),
            ],
        ));
    } else {
        out.now.push(cat.format(
            "summary-safety-ok",
            &[("count", Arg::from(findings.safety.len()))],
        ));
    }
    out
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::ratings::RatingsTable;

    fn demo(name: &str) -> (Job, Findings) {
        let text = std::fs::read_to_string(
            std::path::Path::new(env!("CARGO_MANIFEST_DIR"))
                .join("jobs")
                .join(name),
        )
        .unwrap();
        let ratings = RatingsTable::builtin();
        let job = crate::job::decode_with_ratings(name, &text, &ratings)
            .unwrap_or_else(|d| panic!("{:?}", d.problems))
            .job;
        let f = crate::calc::derive(&job, &ratings);
        (job, f)
    }

    #[test]
    fn the_summary_takes_its_figures_from_the_findings() {
        let (job, f) = demo("combo-6v6-fixed.kdl");
        let s = summary(&job, &f, Catalogue::english());
        let found = s.found.join(" ");
        // As found, V3 idles at the figure calc worked out.
        let v3 = &f.sets[0]
            .valves
            .iter()
            .find(|v| v.position == "V3")
            .unwrap();
        let p = format!("{:.0} %", v3.plate_dissipation_pct.unwrap());
        assert!(found.contains(&p), "{found} lacks {p}");
        assert!(found.contains("R31"), "{found}");
        let done = s.done.join(" ");
        assert!(
            done.contains(&format!("{} parts were replaced", job.parts.len())),
            "{done}"
        );
        // The rectifier swap of the final set is named.
        assert!(
            done.contains("V5 now holds a 5V4G (it held a 5Y3GT)"),
            "{done}"
        );
        // Signed off: every open figure of the final set is inside its limits.
        assert!(s.healthy);
        assert!(
            s.now[0].contains("every figure is inside its limits"),
            "{:?}",
            s.now
        );
    }
}
