//! The technician's judgement: marks the findings a job's `accepted` block
//! names as accepted, with the reason, the name and the date. An accepted
//! finding keeps its figures and its status; it only stops counting against
//! the unit (the at-a-glance panel, `check --strict`, the headline).

use super::findings::{SafetyFinding, SetFindings};
use super::status::Verdict;
use crate::catalogue::{Arg, Catalogue};
use crate::job::{Acceptance, AcceptedKind};

/// Marks the verdicts of `set` that `acceptances` name. `matched[i]` is set
/// when acceptance `i` accepted at least one finding.
pub(crate) fn apply_to_set(
    acceptances: &[Acceptance],
    set: &mut SetFindings,
    matched: &mut [bool],
) {
    for (i, a) in acceptances.iter().enumerate() {
        if a.set.as_ref().is_some_and(|s| s.value != set.label) {
            continue;
        }
        let name = a.name.as_ref().map(|n| n.value.as_str());
        let date = a.date.to_string();
        let mut accept = |v: &mut Verdict| {
            if v.accept(&a.reason, &a.by, &date) {
                matched[i] = true;
            }
        };
        match a.kind {
            AcceptedKind::Valve => {
                let check = a.check.as_ref().map(|c| c.value.replace('-', "_"));
                for v in set
                    .valves
                    .iter_mut()
                    .filter(|v| Some(v.position.as_str()) == name)
                {
                    for c in v
                        .checks
                        .iter_mut()
                        .filter(|c| check.as_deref().is_none_or(|k| k == c.check))
                    {
                        accept(&mut c.verdict);
                    }
                    v.refresh_open_status();
                }
                if let Some(r) = set.rectifier.as_mut()
                    && Some(r.position.as_str()) == name
                    && check.as_deref().is_none_or(|k| k == "rectifier_load")
                {
                    accept(&mut r.verdict);
                }
            }
            AcceptedKind::Node => {
                for n in set
                    .nodes
                    .iter_mut()
                    .filter(|n| Some(n.name.as_str()) == name)
                {
                    accept(&mut n.verdict);
                }
            }
            AcceptedKind::Part => {
                for r in set
                    .droppers
                    .iter_mut()
                    .chain(set.cathode_resistors.iter_mut())
                    .chain(set.screen_resistors.iter_mut())
                    .filter(|r| Some(r.reference.as_str()) == name)
                {
                    accept(&mut r.verdict);
                }
                for c in set
                    .filter_capacitors
                    .iter_mut()
                    .filter(|c| Some(c.reference.as_str()) == name)
                {
                    accept(&mut c.verdict);
                }
            }
            AcceptedKind::Heater => {
                for h in set
                    .heaters
                    .iter_mut()
                    .filter(|h| name.is_none() || h.label.as_deref() == name)
                {
                    accept(&mut h.verdict);
                }
            }
            AcceptedKind::Bench => {
                let channel = a.channel.as_ref().map(|c| c.value.as_str());
                let on = |c: &Option<String>| channel.is_none_or(|ch| c.as_deref() == Some(ch));
                match name {
                    Some("output-power") => {
                        for p in set.bench.output_power.iter_mut().filter(|p| on(&p.channel)) {
                            accept(&mut p.verdict);
                        }
                    }
                    Some("hum-noise") => {
                        for h in set.bench.hum_noise.iter_mut().filter(|h| on(&h.channel)) {
                            accept(&mut h.verdict);
                        }
                    }
                    _ => {}
                }
            }
            AcceptedKind::Safety => {}
        }
    }
}

/// Marks the safety tests the acceptances name.
pub(crate) fn apply_to_safety(
    acceptances: &[Acceptance],
    safety: &mut [SafetyFinding],
    matched: &mut [bool],
) {
    for (i, a) in acceptances.iter().enumerate() {
        if a.kind != AcceptedKind::Safety {
            continue;
        }
        let Some(name) = &a.name else { continue };
        let date = a.date.to_string();
        for s in safety
            .iter_mut()
            .filter(|s| s.test.replace('_', "-") == name.value)
        {
            if s.verdict.accept(&a.reason, &a.by, &date) {
                matched[i] = true;
            }
        }
    }
}

/// What an acceptance names, in words: "V3 screen voltage", "node B+4".
pub(crate) fn words(a: &Acceptance, cat: &Catalogue) -> String {
    let name = a.name.as_ref().map(|n| n.value.as_str());
    let one = |key: &str, n: &str| cat.format(key, &[("name", Arg::from(n))]);
    let base = match (a.kind, name) {
        (AcceptedKind::Valve, Some(n)) => n.to_string(),
        (AcceptedKind::Node, Some(n)) => one("warn-accept-node", n),
        (AcceptedKind::Part, Some(n)) => n.to_string(),
        (AcceptedKind::Heater, Some(n)) => one("warn-accept-heater", n),
        (AcceptedKind::Heater, None) => cat.text("warn-accept-heater-supply"),
        (AcceptedKind::Safety, Some(n)) => one(
            "warn-accept-safety",
            &super::safety_test_words(&n.replace('-', "_"), cat),
        ),
        (AcceptedKind::Bench, Some(n)) => {
            let key = format!("warn-subject-{n}");
            let test = cat
                .try_format(&key, &[])
                .unwrap_or_else(|| n.replace('-', " "));
            match &a.channel {
                Some(c) => cat.format(
                    "warn-subject-on-channel",
                    &[("what", Arg::from(test)), ("channel", Arg::from(&c.value))],
                ),
                None => test,
            }
        }
        (_, None) => String::new(),
    };
    let mut out = match &a.check {
        Some(c) => format!(
            "{base} {}",
            super::check_words(&c.value.replace('-', "_"), cat)
        ),
        None => base,
    };
    if let Some(set) = &a.set {
        out = cat.format(
            "warn-accept-in-set",
            &[("what", Arg::from(out)), ("set", Arg::from(&set.value))],
        );
    }
    out
}
