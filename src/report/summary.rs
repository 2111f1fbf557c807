//! The plain-words summary that opens the hand-over document: what was
//! wrong, what was done, and the state the unit leaves in, in a customer's
//! terms. Every figure in it comes from the findings (none is typed by
//! hand); the first set is what was found, the final set the state now.
//!
//! Every fixed sentence of the summary is in this file.

use crate::calc::{Findings, SetFindings, Status, Verdict};
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

    fn words(&self) -> Vec<String> {
        self.0.iter().map(|(t, list)| phrase(*t, list)).collect()
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

fn names(list: &[(String, f64)]) -> String {
    let n: Vec<String> = list.iter().map(|x| x.0.clone()).collect();
    and_list(&n)
}

/// "valve V3" or "valves V3 and V4".
fn counted(noun: &str, list: &[(String, f64)]) -> String {
    format!(
        "{noun}{} {}",
        if list.len() == 1 { "" } else { "s" },
        names(list)
    )
}

fn phrase(t: Trouble, list: &[(String, f64)]) -> String {
    match t {
        Trouble::ValvesHot => format!(
            "{} running hot ({} of the plate rating)",
            counted("output valve", list),
            range(list)
        ),
        Trouble::ValvesCold => format!(
            "{} idling cold ({} of the plate rating)",
            counted("output valve", list),
            range(list)
        ),
        Trouble::ValvesBeyond => format!(
            "{} beyond the plate rating ({})",
            counted("output valve", list),
            range(list)
        ),
        Trouble::ValvesHighLine => format!(
            "{} close to the plate rating at the top of the mains range ({})",
            counted("output valve", list),
            range(list)
        ),
        Trouble::ScreenHot => format!(
            "screen dissipation too high on {} ({} of the rating)",
            names(list),
            range(list)
        ),
        Trouble::VoltageMax => format!(
            "valve voltages above the published maximum on {}",
            names(list)
        ),
        Trouble::CathodeCurrent => {
            format!("more than the rated cathode current on {}", names(list))
        }
        Trouble::NodeOff => {
            let each: Vec<String> = list
                .iter()
                .map(|(n, d)| {
                    format!(
                        "{n} ({}{:.0} %)",
                        if *d < 0.0 { "\u{2212}" } else { "+" },
                        d.abs()
                    )
                })
                .collect();
            format!(
                "supply voltages off the factory chart at {}",
                and_list(&each)
            )
        }
        Trouble::ResistorOver => match list {
            [(n, p)] => format!("resistor {n} overloaded at {} of its rating", pct(*p)),
            _ => {
                let each: Vec<String> = list
                    .iter()
                    .map(|(n, p)| format!("{n} ({})", pct(*p)))
                    .collect();
                format!("resistors {} overloaded", and_list(&each))
            }
        },
        Trouble::ResistorWarm => format!("{} running warm", counted("resistor", list)),
        Trouble::CapacitorOver => format!(
            "{} rated below the voltage {} can see",
            counted("capacitor", list),
            if list.len() == 1 { "it" } else { "they" }
        ),
        Trouble::CapacitorMargin => {
            format!("little voltage margin on {}", counted("capacitor", list))
        }
        Trouble::RectifierLoad => format!(
            "the rectifier valve {} loaded to {} of its rating",
            names(list),
            range(list)
        ),
        Trouble::HeaterOff => {
            let d = list.first().map(|x| x.1).unwrap_or(0.0);
            format!(
                "the heater supply {:.0} % {}",
                d.abs(),
                if d < 0.0 { "low" } else { "high" }
            )
        }
    }
}

/// Everything off in a set, in words; with `open_only`, accepted figures
/// are left out.
fn off_in(set: &SetFindings, open_only: bool) -> Vec<String> {
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
    t.words()
}

/// "a, b and c".
fn and_list(items: &[String]) -> String {
    match items {
        [] => String::new(),
        [one] => one.clone(),
        [rest @ .., last] => format!("{} and {last}", rest.join(", ")),
    }
}

fn capital(s: &str) -> String {
    let mut c = s.chars();
    match c.next() {
        Some(f) => f.to_uppercase().collect::<String>() + c.as_str(),
        None => String::new(),
    }
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
pub fn summary(job: &Job, findings: &Findings) -> Summary {
    let final_set = findings.sets.iter().find(|s| s.is_final);
    let first = findings.sets.first().filter(|f| !f.is_final);
    let mut out = Summary::default();

    if let Some(first) = first {
        let off = off_in(first, false);
        out.found.push(if off.is_empty() {
            format!(
                "The readings \u{201c}{}\u{201d} showed every figure inside its limits.",
                first.label
            )
        } else {
            format!(
                "The readings \u{201c}{}\u{201d} showed {}.",
                first.label,
                and_list(&off)
            )
        });
    }

    let parts: Vec<String> = job.parts.iter().map(|p| p.name().to_string()).collect();
    match parts.len() {
        0 => {}
        1 => out
            .done
            .push(format!("One part was replaced ({}).", parts[0])),
        n => out
            .done
            .push(format!("{n} parts were replaced ({}).", parts.join(", "))),
    }
    match job.mods.len() {
        0 => {}
        1 => out
            .done
            .push("One modification was made (listed below).".to_string()),
        n => out
            .done
            .push(format!("{n} modifications were made (listed below).")),
    }
    if let Some(last) = final_set {
        for l in &findings.line_up {
            if let Some(c) = l.changes.iter().find(|c| c.set == last.label) {
                out.done.push(format!(
                    "{} now holds a {} (it held a {}).",
                    l.position, c.valve_type, l.valve_type
                ));
            }
        }
    }
    if let (Some(first), Some(last)) = (first, final_set)
        && let (Some(was), Some(now)) = (plate_range(first), plate_range(last))
        && was != now
    {
        out.done.push(format!(
            "The output valves now idle at {now} of their plate rating (they were at {was})."
        ));
    }

    let safety_failed = findings.safety.iter().any(|s| s.verdict.is_open());
    match final_set {
        Some(set) => {
            let open = off_in(set, true);
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
                out.now.push(format!(
                    "As handed over (\u{201c}{}\u{201d}), every figure is inside its limits{}.",
                    set.label,
                    match accepted {
                        0 => String::new(),
                        1 =>
                            ", apart from one the technician has judged and accepted (listed below)"
                                .to_string(),
                        n => format!(
                            ", apart from {n} the technician has judged and accepted (listed below)"
                        ),
                    }
                ));
            } else {
                out.now.push(format!(
                    "As handed over (\u{201c}{}\u{201d}), still needing attention: {}.",
                    set.label,
                    and_list(&open)
                ));
            }
        }
        None => out.now.push("No measurements were recorded.".to_string()),
    }
    if findings.safety.is_empty() {
        if job.safety.is_none() {
            out.now
                .push("No electrical safety tests were recorded.".to_string());
        }
    } else if safety_failed {
        let failed: Vec<String> = findings
            .safety
            .iter()
            .filter(|s| s.verdict.is_open())
            .map(|s| s.test.replace('_', " "))
            .collect();
        out.now.push(capital(&format!(
            "the {} test{} did not meet the shop's limit.",
            and_list(&failed),
            if failed.len() == 1 { "" } else { "s" }
        )));
    } else {
        out.now.push(match findings.safety.len() {
            1 => "The electrical safety test met the shop's limit.".to_string(),
            n => format!("All {n} electrical safety tests met the shop's limits."),
        });
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
        let s = summary(&job, &f);
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
