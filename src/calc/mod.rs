//! The calculation pass: pure functions from a [`Job`], the ratings table
//! and the job's settings to [`Findings`]. No I/O, no page formatting.

mod accept;
mod bench;
mod bias_estimate;
pub mod brief;
mod circuit;
mod findings;
mod mains;
pub mod network;
mod safety;
mod status;
mod supply;
mod valve;

pub use bench::{
    condition_words, db_relative, dbv, gain_db, minus_3db_points, power_into,
    rms_from_peak_to_peak, volts_for_power,
};
pub use bias_estimate::{
    CathodePoint, ThreeHalvesLaw, cathode_resistor_for, grid_for_current, plate_dissipation_at,
    resistor_rating_for,
};
pub use circuit::{
    cathode_bypass_corner, cathode_resistance, child_langmuir_factor, gain_bypassed,
    gain_unbypassed, parallel, phase_shift_frequency,
};
pub use findings::*;
pub use mains::{
    chart_expected, corrected_power, corrected_volts, high_line_power, high_line_volts,
};
pub use status::{Status, Verdict, worst_of};
pub use supply::{cold_start_peak, w as resistor_power_words};
pub use valve::{
    cathode_current_shared, plate_current_from_drop, plate_dissipation, screen_current,
    target_current,
};

use crate::catalogue::{Arg, Catalogue};
use crate::job::Job;
use crate::ratings::RatingsTable;
use crate::units::{fixed, fixed_signed};

/// From this many measurement sets on, [`derive_in`] works the sets out on
/// every core (rayon); below it the threads' start costs more than it saves.
const PARALLEL_SETS: usize = 16;

/// Derives every figure of a job, with its reasons in English. Valve types
/// must already be known to `ratings` (see [`crate::job::check_types`]); an
/// unknown one is skipped with a warning rather than a panic.
pub fn derive(job: &Job, ratings: &RatingsTable) -> Findings {
    derive_in(job, ratings, Catalogue::english())
}

/// [`derive`] with the reasons, thresholds, notes and family titles in the
/// words of `cat` (the shop's language). The figures do not depend on it.
pub fn derive_in(job: &Job, ratings: &RatingsTable, cat: &Catalogue) -> Findings {
    let settings = &job.settings;
    let mut warnings = Vec::new();
    let mut sets = Vec::new();
    let final_index = job.final_set_index();
    // Each set is worked out on its own (the acceptances it matches are
    // gathered and joined after), so a long job's sets are worked out on
    // every core; the results are put together in the job's order, the
    // same as one after the other.
    // `once` keeps the words that are the same in every set (thresholds,
    // ratings in words) for the sets one thread works out.
    let per_set = |once: &mut status::SaidOnce,
                   (index, set): (usize, &crate::job::MeasurementSet)| {
        let once = &*once;
        let mut matched = vec![false; job.acceptances.len()];
        let is_final = Some(index) == final_index;
        let circuit = job.circuit_for(set);
        let mut notes = Vec::new();
        let ctx = valve::ValveContext {
            job,
            set,
            circuit: &circuit,
            settings,
            cat,
            once,
        };
        let mut valves = Vec::new();
        for reading in &set.valves {
            let Some(spec) = job.valve_in(set, &reading.position.value) else {
                continue;
            };
            let Ok(rating) = ratings.lookup(&spec.type_name.value) else {
                notes.push(cat.format(
                    "note-unknown-type",
                    &[
                        ("position", Arg::from(&spec.position.value)),
                        ("type", Arg::from(&spec.type_name.value)),
                    ],
                ));
                continue;
            };
            valves.push(valve::analyse(&ctx, &spec, reading, rating, &mut notes));
        }
        let warm_up = warm_up(&ctx, job, set, ratings);
        let nodes = supply::nodes(job, set, &circuit, settings, once);
        let mut not_checked = Vec::new();
        let droppers = supply::droppers(job, set, &circuit, settings, &mut not_checked, cat, once);
        let cathode_resistors = supply::cathode_resistors(job, set, &circuit, settings, cat, once);
        let screen_resistors = supply::screen_resistors(job, set, &circuit, settings, cat, once);
        let filter_capacitors = supply::capacitors(
            job,
            set,
            &circuit,
            settings,
            ratings,
            &mut not_checked,
            cat,
            once,
        );
        for n in &not_checked {
            notes.push(cat.format(
                "note-not-checked",
                &[
                    ("reference", Arg::from(&n.reference)),
                    ("reason", Arg::from(&n.reason)),
                ],
            ));
        }
        let heaters = supply::heaters(job, set, settings, once);
        let rectifier = supply::rectifier(job, set, &circuit, &valves, ratings, cat);
        let bench = bench::findings(job, set, settings, cat);
        let cathode_resistor_suggestions = bias_estimate::cathode_suggestions(
            job, set, &circuit, settings, &valves, ratings, &mut notes, cat,
        );
        let mut found = SetFindings {
            label: set.label.clone(),
            is_final,
            mains_volts: set.mains.value.0,
            correction_factor: job.mains.nominal.value / set.mains.value,
            date: set.date.map(|d| d.to_string()),
            valves,
            nodes,
            droppers,
            cathode_resistors,
            screen_resistors,
            filter_capacitors,
            rectifier,
            heaters,
            not_checked,
            bias_controls: set.bias_controls.clone(),
            warm_up,
            bench,
            cathode_resistor_suggestions,
        };
        brief::fill_set(
            &mut found,
            settings.resistor_derating,
            job.mains.tolerance.value,
            once,
        );
        accept::apply_to_set(&job.acceptances, &mut found, &mut matched);
        let mut warnings = set_warnings(&found, once);
        for n in notes {
            let subject = n.split(':').next().unwrap_or("").to_string();
            warnings.push(Warning::note(
                Some(&set.label),
                is_final,
                &subject,
                Status::Caution,
                n,
            ));
        }
        (found, warnings, matched)
    };
    let worked: Vec<_> = if job.measurements.len() >= PARALLEL_SETS {
        use rayon::prelude::*;
        // Each run of sets rayon works out in one piece keeps a
        // `SaidOnce` of its own; runs of at least an eighth of a thread's
        // share (rather than a few sets each), so that the words kept are
        // made a few times a job, not once every few sets.
        let run = job
            .measurements
            .len()
            .div_ceil(8 * rayon::current_num_threads());
        job.measurements
            .par_iter()
            .enumerate()
            .with_min_len(run)
            .map_init(|| status::SaidOnce::new(cat), per_set)
            .collect()
    } else {
        let mut once = status::SaidOnce::new(cat);
        job.measurements
            .iter()
            .enumerate()
            .map(|item| per_set(&mut once, item))
            .collect()
    };
    let mut matched = vec![false; job.acceptances.len()];
    for (found, set_warnings, set_matched) in worked {
        warnings.extend(set_warnings);
        for (m, s) in matched.iter_mut().zip(set_matched) {
            *m |= s;
        }
        sets.push(found);
    }
    for m in crate::job::not_measured_in_final(job) {
        let subject = match m.kind {
            "valve" => job
                .valve(&m.name)
                .map(|v| format!("{} ({})", m.name, v.type_name.value))
                .unwrap_or_else(|| m.name.clone()),
            _ => m.name.clone(),
        };
        warnings.push(Warning::note(
            Some(&m.final_set),
            true,
            &subject,
            Status::Caution,
            sentence(&cat.format(
                "warn-not-measured-final",
                &[
                    (
                        "what",
                        Arg::from(match m.kind {
                            "node" => {
                                cat.format("warn-accept-node", &[("name", Arg::from(&m.name))])
                            }
                            _ => m.name.clone(),
                        }),
                    ),
                    ("final", Arg::from(&m.final_set)),
                    ("set", Arg::from(&m.set)),
                ],
            )),
        ));
    }
    let mut safety = job
        .safety
        .as_ref()
        .map(|s| safety::findings(s, cat))
        .unwrap_or_default();
    brief::fill_safety(&mut safety, cat);
    accept::apply_to_safety(&job.acceptances, &mut safety, &mut matched);
    for s in &safety {
        if s.verdict.status != Status::Ok {
            warnings.push(verdict_warning(
                None,
                false,
                "safety",
                None,
                &s.verdict,
                sentence(&s.verdict.reason),
            ));
        }
    }
    for (a, _) in job.acceptances.iter().zip(&matched).filter(|(_, m)| !**m) {
        warnings.push(Warning::note(
            a.set.as_ref().map(|s| s.value.as_str()),
            false,
            &cat.text("warn-subject-sign-off"),
            Status::Caution,
            sentence(&cat.format(
                "warn-acceptance-unmatched",
                &[("what", Arg::from(accept::words(a, cat)))],
            )),
        ));
    }
    if job.measurements.is_empty() {
        warnings.push(Warning::note(
            None,
            false,
            &cat.text("warn-subject-job"),
            Status::Caution,
            cat.text("warn-no-sets"),
        ));
    }
    let mods = job
        .mods
        .iter()
        .map(|m| mod_findings(m, job, ratings, &mut warnings, cat))
        .collect();
    let final_set = final_index.and_then(|i| sets.get(i));
    let at_a_glance = glance(final_set, &safety, job.safety.is_some(), cat);
    let final_set = final_set.map(|s| s.label.clone());
    Findings {
        schema: SCHEMA,
        job: JobSummary {
            id: job.info.id.clone(),
            source: source_file_name(&job.source_name),
            format_version: job.format_version,
            file_sha256: None,
            git: None,
        },
        unit: UnitFindings {
            make: job.unit.make.clone(),
            model: job.unit.model.clone(),
            serial: job.unit.serial.clone(),
            year: job.unit.year,
            description: job.unit.description.clone(),
            condition: job.unit.condition.clone(),
            rated_power_w: job.unit.rated_power.as_ref().map(|p| p.value.0),
        },
        mains: MainsFigures {
            nominal_volts: job.mains.nominal.value.0,
            tolerance_pct: job.mains.tolerance.value * 100.0,
            high_line_volts: job.mains.nominal.value.0 * (1.0 + job.mains.tolerance.value),
            design_volts: job.mains.design.as_ref().map(|d| d.value.0),
            frequency_hz: job.mains.frequency.map(|f| f.0),
        },
        settings: SettingsUsed {
            fixed_bias_low_pct: settings.fixed_bias_low * 100.0,
            fixed_bias_high_pct: settings.fixed_bias_high * 100.0,
            cathode_bias_caution_pct: settings.cathode_bias_caution * 100.0,
            resistor_derating_pct: settings.resistor_derating * 100.0,
            capacitor_margin_pct: settings.capacitor_margin * 100.0,
            heater_tolerance_pct: settings.heater_tolerance * 100.0,
            node_tolerance_pct: settings.node_tolerance * 100.0,
            silicon_drop_volts: settings.silicon_drop.0,
            voltage_over_pct: settings.voltage_over * 100.0,
            output_power_caution_pct: settings.output_power_caution * 100.0,
            hum_noise_caution_db: settings.hum_noise_caution_db,
            cathode_bias_target_pct: settings.cathode_bias_target * 100.0,
        },
        final_set,
        sets,
        safety,
        parts: job
            .parts
            .iter()
            .map(|p| PartFindings {
                reference: p.reference.clone(),
                what: p.what.clone(),
                was: p.was.clone(),
                now: p.now.clone(),
                reason: p.reason.clone(),
                original_kept: p.original_kept,
                private: p.private,
            })
            .collect(),
        mods,
        at_a_glance,
        warnings,
        ratings_used: ratings_used(job, ratings),
        line_up: line_up(job, ratings),
    }
}

/// The file name of a job or shop file as it was given, without its
/// folders: what the findings record, so they do not depend on the folder
/// the command ran in.
pub fn source_file_name(given: &str) -> String {
    std::path::Path::new(given)
        .file_name()
        .map(|n| n.to_string_lossy().into_owned())
        .unwrap_or_else(|| given.to_string())
}

/// The idle current of each warm-up reading, worked out as the set's own
/// readings are; sorted by valve, then time.
fn warm_up(
    ctx: &valve::ValveContext,
    job: &Job,
    set: &crate::job::MeasurementSet,
    ratings: &RatingsTable,
) -> Vec<WarmUpPoint> {
    let mut out: Vec<WarmUpPoint> = set
        .warm_up
        .iter()
        .filter_map(|w| {
            let spec = job.valve_in(set, &w.reading.position.value)?;
            let rating = ratings.lookup(&spec.type_name.value).ok()?;
            // A warm-up reading often gives only what sets the current:
            // the plate and screen voltages are then the set's settled
            // ones (for the dissipation and the screen current).
            let mut reading = w.reading.clone();
            if let Some(settled) = set
                .valves
                .iter()
                .find(|v| v.position.value == reading.position.value)
            {
                reading.plate = reading.plate.or_else(|| settled.plate.clone());
                reading.screen = reading.screen.or_else(|| settled.screen.clone());
            }
            let f = valve::analyse(ctx, &spec, &reading, rating, &mut Vec::new());
            Some(WarmUpPoint {
                position: f.position,
                minutes: w.minutes.value,
                current_ma: f.plate_current_ma,
                includes_screen: f.plate_current_includes_screen,
                plate_dissipation_pct: f.plate_dissipation_pct,
            })
        })
        .collect();
    let order = |p: &str| job.valves.iter().position(|v| v.position.value == p);
    out.sort_by(|a, b| {
        order(&a.position)
            .cmp(&order(&b.position))
            .then(a.minutes.total_cmp(&b.minutes))
    });
    out
}

/// Capitalises the first letter and ends with a full stop.
fn sentence(s: &str) -> String {
    let mut out = String::with_capacity(s.len() + 4);
    let mut c = s.chars();
    if let Some(f) = c.next() {
        // An ASCII letter's capital without the Unicode tables (a long
        // job makes two sentences of each warning).
        if f.is_ascii() {
            out.push(f.to_ascii_uppercase());
        } else {
            out.extend(f.to_uppercase());
        }
        out.push_str(c.as_str());
    }
    if !out.ends_with('.') {
        out.push('.');
    }
    out
}

/// A warning for a figure's verdict, carrying its acceptance.
fn verdict_warning(
    set: Option<&SetFindings>,
    in_final_set: bool,
    subject: &str,
    check: Option<&'static str>,
    verdict: &Verdict,
    message: String,
) -> Warning {
    Warning {
        set: set.map(|s| s.label.clone()),
        in_final_set,
        subject: subject.to_string(),
        check,
        status: verdict.status,
        message,
        reason: sentence(&verdict.reason),
        brief: verdict.brief.clone(),
        accepted: verdict.accepted,
        accepted_reason: verdict.accepted_reason.clone(),
        accepted_by: verdict.accepted_by.clone(),
        accepted_date: verdict.accepted_date.clone(),
    }
}

/// "V3 (EL34)": a valve as a finding's subject.
fn valve_subject(position: &str, valve_type: &str) -> String {
    let mut subject = String::with_capacity(position.len() + valve_type.len() + 3);
    subject.push_str(position);
    subject.push_str(" (");
    subject.push_str(valve_type);
    subject.push(')');
    subject
}

fn set_warnings(set: &SetFindings, once: &status::SaidOnce) -> Vec<Warning> {
    let cat = once.catalogue();
    let mut out = Vec::new();
    let mut push = |subject: &str, check: Option<&'static str>, verdict: &Verdict| {
        if verdict.status != Status::Ok {
            out.push(verdict_warning(
                Some(set),
                set.is_final,
                subject,
                check,
                verdict,
                sentence(&once.say(
                    "warn-subject-reason",
                    &[("subject", subject), ("reason", &verdict.reason)],
                )),
            ));
        }
    };
    // A subject in words only where a warning names it.
    let warns = |v: &Verdict| v.status != Status::Ok;
    for v in &set.valves {
        if !v.checks.iter().any(|c| warns(&c.verdict)) {
            continue;
        }
        let subject = valve_subject(&v.position, &v.valve_type);
        for c in &v.checks {
            push(&subject, Some(c.check), &c.verdict);
        }
    }
    for n in &set.nodes {
        push(&n.name, None, &n.verdict);
    }
    for r in set
        .droppers
        .iter()
        .chain(&set.cathode_resistors)
        .chain(&set.screen_resistors)
    {
        push(&r.reference, None, &r.verdict);
    }
    for c in &set.filter_capacitors {
        push(&c.reference, None, &c.verdict);
    }
    if let Some(r) = &set.rectifier {
        push(
            &valve_subject(&r.position, &r.valve_type),
            Some("rectifier_load"),
            &r.verdict,
        );
    }
    for h in set.heaters.iter().filter(|h| warns(&h.verdict)) {
        let subject = match &h.label {
            Some(l) => cat.format("warn-subject-heater-labelled", &[("label", Arg::from(l))]),
            None => cat.text("warn-subject-heater"),
        };
        push(&subject, None, &h.verdict);
    }
    for p in set.bench.output_power.iter().filter(|p| warns(&p.verdict)) {
        push(
            &bench_subject("warn-subject-output-power", &p.channel, cat),
            None,
            &p.verdict,
        );
    }
    for h in set.bench.hum_noise.iter().filter(|h| warns(&h.verdict)) {
        push(
            &bench_subject("warn-subject-hum-noise", &h.channel, cat),
            None,
            &h.verdict,
        );
    }
    out
}

/// "output power" or "output power (clean channel)": `key` names the
/// test.
fn bench_subject(key: &str, channel: &Option<String>, cat: &Catalogue) -> String {
    let what = cat.text(key);
    match channel {
        Some(c) => cat.format(
            "warn-subject-on-channel",
            &[("what", Arg::from(what)), ("channel", Arg::from(c))],
        ),
        None => what,
    }
}

fn glance(
    last: Option<&SetFindings>,
    safety: &[SafetyFinding],
    has_safety: bool,
    cat: &Catalogue,
) -> Vec<FamilyStatus> {
    let mut out = Vec::new();
    for family in Family::ALL {
        // Each figure's subject ("V3 (EL34)", "R31"), the check it is (for
        // a valve) and its verdict.
        let verdicts: Vec<(String, Option<String>, &Verdict)> = match (family, last) {
            (Family::SafetyTests, _) => safety
                .iter()
                .map(|s| (safety_test_words(s.test, cat), None, &s.verdict))
                .collect(),
            (_, None) => Vec::new(),
            (Family::OutputValves, Some(set)) => set
                .valves
                .iter()
                .filter(|v| v.is_output)
                .flat_map(|v| {
                    v.checks.iter().map(move |c| {
                        (
                            valve_subject(&v.position, &v.valve_type),
                            Some(check_words(c.check, cat)),
                            &c.verdict,
                        )
                    })
                })
                .collect(),
            (Family::SupplyVoltages, Some(set)) => set
                .nodes
                .iter()
                .map(|n| (n.name.clone(), None, &n.verdict))
                .collect(),
            (Family::StressedParts, Some(set)) => set
                .droppers
                .iter()
                .chain(&set.cathode_resistors)
                .chain(&set.screen_resistors)
                .map(|r| (r.reference.clone(), None, &r.verdict))
                .chain(
                    set.filter_capacitors
                        .iter()
                        .map(|c| (c.reference.clone(), None, &c.verdict)),
                )
                .chain(set.rectifier.iter().map(|r| {
                    (
                        valve_subject(&r.position, &r.valve_type),
                        Some(check_words("rectifier_load", cat)),
                        &r.verdict,
                    )
                }))
                .collect(),
            (Family::Heater, Some(set)) => set
                .heaters
                .iter()
                .map(|h| (cat.text("warn-subject-heater"), None, &h.verdict))
                .collect(),
            (Family::BenchTests, Some(set)) => set
                .bench
                .output_power
                .iter()
                .map(|p| {
                    let subject = bench_subject("warn-subject-output-power", &p.channel, cat);
                    (subject, None, &p.verdict)
                })
                .chain(set.bench.hum_noise.iter().map(|h| {
                    let subject = bench_subject("warn-subject-hum-noise", &h.channel, cat);
                    (subject, None, &h.verdict)
                }))
                .collect(),
        };
        let accepted: Vec<AcceptedFinding> = verdicts
            .iter()
            .filter(|(_, _, v)| v.accepted)
            .map(|(subject, check, v)| AcceptedFinding {
                subject: subject.clone(),
                check: check.clone(),
                status: v.status,
                reason: v.reason.clone(),
                accepted_reason: v.accepted_reason.clone().unwrap_or_default(),
                accepted_by: v.accepted_by.clone().unwrap_or_default(),
                accepted_date: v.accepted_date.clone().unwrap_or_default(),
            })
            .collect();
        // The worst figure that still counts: accepted ones are left out.
        let worst = verdicts.iter().filter(|(_, _, v)| !v.accepted).fold(
            None,
            |best: Option<&(String, Option<String>, &Verdict)>, item| {
                if best.is_none_or(|b| item.2.status.rank() > b.2.status.rank()) {
                    Some(item)
                } else {
                    best
                }
            },
        );
        let (status, words, measured) = match worst {
            Some((subject, _, v)) if v.status != Status::Ok => (
                v.status,
                cat.format(
                    "warn-subject-reason",
                    &[
                        ("subject", Arg::from(subject)),
                        ("reason", Arg::from(&v.reason)),
                    ],
                ),
                true,
            ),
            _ if !accepted.is_empty() => (Status::Ok, accepted_words(&accepted, cat), true),
            Some((_, _, v)) => (
                Status::Ok,
                ok_summary(family, last, safety, cat).unwrap_or_else(|| v.reason.clone()),
                true,
            ),
            None if family == Family::SafetyTests && !has_safety => {
                (Status::Caution, cat.text("family-no-safety"), false)
            }
            None if family == Family::BenchTests && last.is_some_and(|s| !s.bench.is_empty()) => (
                Status::Ok,
                ok_summary(family, last, safety, cat).unwrap_or_default(),
                true,
            ),
            None if family == Family::BenchTests => {
                (Status::Ok, cat.text("family-no-bench"), false)
            }
            None => (Status::Ok, cat.text("family-nothing-measured"), false),
        };
        out.push(FamilyStatus {
            family,
            title: cat.text(family.key()),
            status,
            worst: words,
            measured,
            accepted,
        });
    }
    out
}

/// The accepted findings of a family in words, grouped by check:
/// "accepted by the technician: plate voltage of V3, V4; screen voltage of
/// V3, V4 (reasons below)".
fn accepted_words(accepted: &[AcceptedFinding], cat: &Catalogue) -> String {
    let mut groups: Vec<(Option<&str>, Vec<&str>)> = Vec::new();
    for a in accepted {
        // A valve by its position alone: the check names what it is.
        let name = match &a.check {
            Some(_) => a.subject.split(' ').next().unwrap_or(&a.subject),
            None => a.subject.as_str(),
        };
        match groups.iter_mut().find(|(c, _)| *c == a.check.as_deref()) {
            Some((_, names)) => names.push(name),
            None => groups.push((a.check.as_deref(), vec![name])),
        }
    }
    let parts: Vec<String> = groups
        .iter()
        .map(|(check, names)| match check {
            Some(c) => cat.format(
                "family-check-of",
                &[
                    ("check", Arg::from(*c)),
                    ("names", Arg::from(names.join(", "))),
                ],
            ),
            None => names.join(", "),
        })
        .collect();
    cat.format("family-accepted", &[("what", Arg::from(parts.join("; ")))])
}

/// A valve's check in words ("plate dissipation"), from its name in the
/// JSON ("plate_dissipation").
pub fn check_words(check: &str, cat: &Catalogue) -> String {
    cat.try_format(&format!("check-{}", check.replace('_', "-")), &[])
        .unwrap_or_else(|| check.replace('_', " "))
}

/// A safety test in words ("earth continuity"), from its name in the JSON.
pub fn safety_test_words(test: &str, cat: &Catalogue) -> String {
    cat.try_format(&format!("safety-test-{}", test.replace('_', "-")), &[])
        .unwrap_or_else(|| test.replace('_', " "))
}

/// When a whole family is ok, the figure nearest its limit, in words.
fn ok_summary(
    family: Family,
    last: Option<&SetFindings>,
    safety: &[SafetyFinding],
    cat: &Catalogue,
) -> Option<String> {
    let max_by = |a: f64, b: f64| a.total_cmp(&b);
    match family {
        Family::SafetyTests => {
            Some(cat.format("family-safety-ok", &[("count", Arg::from(safety.len()))]))
        }
        Family::OutputValves => {
            let set = last?;
            let v = set
                .valves
                .iter()
                .filter(|v| v.is_output && v.plate_dissipation_pct.is_some())
                .max_by(|a, b| {
                    max_by(
                        a.plate_dissipation_pct.unwrap_or(0.0),
                        b.plate_dissipation_pct.unwrap_or(0.0),
                    )
                })?;
            let n = set.valves.iter().filter(|v| v.is_output).count();
            Some(cat.format(
                "family-valves-ok",
                &[
                    ("count", Arg::from(n)),
                    (
                        "hottest",
                        Arg::from(valve_subject(&v.position, &v.valve_type)),
                    ),
                    (
                        "pct",
                        Arg::from(fixed(v.plate_dissipation_pct.unwrap_or(0.0), 0)),
                    ),
                ],
            ))
        }
        Family::SupplyVoltages => {
            let set = last?;
            let charted: Vec<&NodeFindings> = set
                .nodes
                .iter()
                .filter(|n| n.deviation_pct.is_some())
                .collect();
            let n = charted.iter().max_by(|a, b| {
                max_by(
                    a.deviation_pct.unwrap_or(0.0).abs(),
                    b.deviation_pct.unwrap_or(0.0).abs(),
                )
            })?;
            Some(cat.format(
                "family-nodes-ok",
                &[
                    ("count", Arg::from(charted.len())),
                    (
                        "deviation",
                        Arg::from(fixed_signed(n.deviation_pct.unwrap_or(0.0), 1)),
                    ),
                    ("node", Arg::from(&n.name)),
                ],
            ))
        }
        Family::StressedParts => {
            let set = last?;
            let mut parts = Vec::new();
            if let Some(r) = set
                .droppers
                .iter()
                .chain(&set.cathode_resistors)
                .chain(&set.screen_resistors)
                .filter(|r| r.power_pct.is_some())
                .max_by(|a, b| max_by(a.power_pct.unwrap_or(0.0), b.power_pct.unwrap_or(0.0)))
            {
                parts.push(cat.format(
                    "family-busiest-resistor",
                    &[
                        ("reference", Arg::from(&r.reference)),
                        ("pct", Arg::from(fixed(r.power_pct.unwrap_or(0.0), 0))),
                    ],
                ));
            }
            if let Some(c) = set
                .filter_capacitors
                .iter()
                .min_by(|a, b| a.margin_pct.total_cmp(&b.margin_pct))
            {
                parts.push(cat.format(
                    "family-least-margin",
                    &[
                        ("reference", Arg::from(&c.reference)),
                        ("pct", Arg::from(fixed(c.margin_pct, 0))),
                    ],
                ));
            }
            if let Some(r) = &set.rectifier {
                parts.push(cat.format(
                    "family-rectifier-load",
                    &[
                        ("position", Arg::from(&r.position)),
                        ("pct", Arg::from(fixed(r.load_pct, 0))),
                    ],
                ));
            }
            if parts.is_empty() {
                None
            } else {
                Some(parts.join("; "))
            }
        }
        Family::BenchTests => bench_summary(&last?.bench, cat),
        Family::Heater => {
            let h = last?.heaters.first()?;
            let volts = |v: f64| {
                Arg::from(crate::units::format_engineering(
                    v,
                    crate::units::QuantityKind::Voltage,
                ))
            };
            Some(cat.format(
                "family-heater-ok",
                &[
                    ("measured", volts(h.measured_volts)),
                    ("nominal", volts(h.nominal_volts)),
                    ("deviation", Arg::from(fixed_signed(h.deviation_pct, 1))),
                ],
            ))
        }
    }
}

/// The line-up, with each type a set fits instead.
fn line_up(job: &Job, ratings: &RatingsTable) -> Vec<LineUpFindings> {
    let rated = |t: &str| ratings.lookup(t).ok().map(|r| r.name.clone());
    job.valves
        .iter()
        .map(|v| LineUpFindings {
            position: v.position.value.clone(),
            valve_type: v.type_name.value.clone(),
            rating_name: rated(&v.type_name.value),
            role: v.role.words().to_string(),
            channel: v.channel.clone(),
            changes: job
                .measurements
                .iter()
                .filter_map(|set| {
                    let c = set
                        .valve_types
                        .iter()
                        .find(|c| c.position.value == v.position.value)?;
                    Some(TypeChangeFindings {
                        set: set.label.clone(),
                        valve_type: c.type_name.value.clone(),
                        rating_name: rated(&c.type_name.value),
                    })
                })
                .collect(),
        })
        .collect()
}

/// The bench tests of a set in one line: the largest output power, the
/// hum and noise nearest full output, the first response's −3 dB points
/// and the first gain.
fn bench_summary(bench: &BenchFindings, cat: &Catalogue) -> Option<String> {
    use crate::units::{QuantityKind as Q, format_engineering, format_sig};
    let mut parts = Vec::new();
    if let Some(p) = bench
        .output_power
        .iter()
        .filter(|p| p.condition != "drive")
        .max_by(|a, b| a.output_power_w.total_cmp(&b.output_power_w))
    {
        let args = [
            ("watts", Arg::from(format_sig(p.output_power_w, 3))),
            (
                "load",
                Arg::from(format_engineering(p.load_ohms, Q::Resistance)),
            ),
            ("condition", Arg::from(&p.condition_words)),
            (
                "pct",
                Arg::from(fixed(p.output_power_pct_of_rated.unwrap_or(0.0), 0)),
            ),
        ];
        parts.push(cat.format(
            if p.output_power_pct_of_rated.is_some() {
                "family-bench-power-rated"
            } else {
                "family-bench-power"
            },
            &args,
        ));
    }
    let quietest_margin = bench.hum_noise.iter().min_by(|a, b| {
        a.hum_noise_db_below_full
            .unwrap_or(f64::INFINITY)
            .total_cmp(&b.hum_noise_db_below_full.unwrap_or(f64::INFINITY))
    });
    if let Some(h) = quietest_margin {
        parts.push(match h.hum_noise_db_below_full {
            Some(db) => cat.format("family-bench-hum-below", &[("db", Arg::from(fixed(db, 0)))]),
            None => cat.format(
                "family-bench-hum",
                &[
                    (
                        "volts",
                        Arg::from(format_engineering(h.hum_noise_mv / 1e3, Q::Voltage)),
                    ),
                    ("dbv", Arg::from(fixed(h.hum_noise_dbv, 1))),
                ],
            ),
        });
    }
    if let Some(r) = bench.responses.first() {
        let hz = |f: f64| format_engineering(f, Q::Frequency);
        let (key, low, high) = match (r.minus_3db_low_hz, r.minus_3db_high_hz) {
            (Some(lo), Some(hi)) => ("family-bench-response-both", lo, hi),
            (Some(lo), None) => ("family-bench-response-low", lo, r.highest_hz),
            (None, Some(hi)) => ("family-bench-response-high", r.lowest_hz, hi),
            (None, None) => ("family-bench-response-flat", r.lowest_hz, r.highest_hz),
        };
        parts.push(cat.format(
            key,
            &[("low", Arg::from(hz(low))), ("high", Arg::from(hz(high)))],
        ));
    }
    if let Some(g) = bench.gains.first() {
        parts.push(cat.format(
            "family-bench-gain",
            &[("db", Arg::from(fixed(g.gain_db, 1)))],
        ));
    }
    (!parts.is_empty()).then(|| parts.join("; "))
}

fn ratings_used(job: &Job, ratings: &RatingsTable) -> Vec<RatingUsed> {
    let mut out: Vec<RatingUsed> = Vec::new();
    let fitted = job
        .valves
        .iter()
        .map(|v| (&v.position.value, &v.type_name.value))
        .chain(job.measurements.iter().flat_map(|s| {
            s.valve_types
                .iter()
                .map(|c| (&c.position.value, &c.type_name.value))
        }));
    for (position, type_name) in fitted {
        let Ok(r) = ratings.lookup(type_name) else {
            continue;
        };
        if let Some(existing) = out.iter_mut().find(|u| u.name == r.name) {
            if !existing.positions.contains(position) {
                existing.positions.push(position.clone());
            }
            continue;
        }
        out.push(RatingUsed {
            name: r.name.clone(),
            equivalents: r.equivalents.clone(),
            class: r.class.to_string(),
            source: r.source.clone(),
            origin: match &r.origin {
                crate::ratings::RatingOrigin::Builtin => "built in".to_string(),
                crate::ratings::RatingOrigin::Shop(p) => source_file_name(&p.display().to_string()),
            },
            positions: vec![position.clone()],
            mu_g1g2: r.mu_g1g2,
        });
    }
    out.sort_by(|a, b| a.name.cmp(&b.name));
    out
}

fn mod_findings(
    m: &crate::job::Modification,
    job: &Job,
    ratings: &RatingsTable,
    warnings: &mut Vec<Warning>,
    cat: &Catalogue,
) -> ModFindings {
    use crate::job::ModFigure;
    use crate::units::{QuantityKind as Q, format_engineering};
    let hz = |f: f64| format_engineering(f, Q::Frequency);
    let ohms = |r: f64| format_engineering(r, Q::Resistance);
    let farads = |c: f64| format_engineering(c, Q::Capacitance);
    // μ and ra of the valve at a position, from the ratings table.
    let mut triode = |pos: &str| {
        let spec = job.valve(pos)?;
        let r = ratings.lookup(&spec.type_name.value).ok()?;
        match (r.mu, r.plate_resistance) {
            (Some(mu), Some(ra)) => Some((mu, ra, r.name.clone())),
            _ => {
                warnings.push(Warning::note(
                    None,
                    false,
                    pos,
                    Status::Caution,
                    cat.format(
                        "warn-no-mu-ra",
                        &[("position", Arg::from(pos)), ("type", Arg::from(&r.name))],
                    ),
                ));
                None
            }
        }
    };
    let mut figures = Vec::new();
    for f in &m.figures {
        match f {
            ModFigure::RcCorner { r, c, label } => {
                let fc = crate::units::rc_corner(*r, *c).0;
                figures.push(ModFigureFindings {
                    kind: "rc_corner",
                    description: {
                        let corner = cat.format(
                            "figure-rc-corner",
                            &[
                                ("ohms", Arg::from(ohms(r.0))),
                                ("farads", Arg::from(farads(c.0))),
                                ("frequency", Arg::from(hz(fc))),
                            ],
                        );
                        match label {
                            Some(l) => format!("{l}: {corner}"),
                            None => corner,
                        }
                    },
                    formula: "fc = 1 / (2π·R·C)",
                    frequency_hz: Some(fc),
                    gain: None,
                });
            }
            ModFigure::CathodeBypass {
                valve,
                rk,
                ck,
                load,
            } => {
                if let Some((mu, ra, name)) = triode(&valve.value) {
                    let fc = cathode_bypass_corner(mu, ra, *load, *rk, *ck).0;
                    figures.push(ModFigureFindings {
                        kind: "cathode_bypass",
                        description: cat.format(
                            "figure-cathode-bypass",
                            &[
                                ("valve", Arg::from(&valve.value)),
                                ("type", Arg::from(&name)),
                                ("mu", Arg::from(mu.to_string())),
                                ("ra", Arg::from(ohms(ra.0))),
                                ("rk", Arg::from(ohms(rk.0))),
                                ("ck", Arg::from(farads(ck.0))),
                                ("load", Arg::from(ohms(load.0))),
                                ("frequency", Arg::from(hz(fc))),
                            ],
                        ),
                        formula: "fc = 1 / (2π·(Rk ∥ (ra + RL)/(μ + 1))·Ck)",
                        frequency_hz: Some(fc),
                        gain: None,
                    });
                }
            }
            ModFigure::StageGain {
                valve,
                load,
                rk,
                bypassed,
            } => {
                if let Some((mu, ra, name)) = triode(&valve.value) {
                    let (gain, formula) = match (rk, bypassed) {
                        (Some(rk), false) => (
                            gain_unbypassed(mu, ra, *load, *rk),
                            "A = μ·RL / (RL + ra + (μ + 1)·Rk)",
                        ),
                        _ => (gain_bypassed(mu, ra, *load), "A = μ·RL / (RL + ra)"),
                    };
                    figures.push(ModFigureFindings {
                        kind: "stage_gain",
                        description: cat.format(
                            match (rk, bypassed) {
                                (Some(_), false) => "figure-gain-unbypassed",
                                _ => "figure-gain-bypassed",
                            },
                            &[
                                ("valve", Arg::from(&valve.value)),
                                ("type", Arg::from(&name)),
                                ("load", Arg::from(ohms(load.0))),
                                ("rk", Arg::from(rk.map(|r| ohms(r.0)).unwrap_or_default())),
                                ("gain", Arg::from(fixed(gain, 0))),
                            ],
                        ),
                        formula,
                        frequency_hz: None,
                        gain: Some(gain),
                    });
                }
            }
            ModFigure::PhaseShift { r, c } => {
                let f = phase_shift_frequency(*r, *c).0;
                figures.push(ModFigureFindings {
                    kind: "phase_shift",
                    description: cat.format(
                        "figure-phase-shift",
                        &[
                            ("ohms", Arg::from(ohms(r.0))),
                            ("farads", Arg::from(farads(c.0))),
                            ("frequency", Arg::from(hz(f))),
                            ("gain", Arg::from(fixed(circuit::PHASE_SHIFT_MIN_GAIN, 0))),
                        ],
                    ),
                    formula: "f = 1 / (2π·R·C·√6)",
                    frequency_hz: Some(f),
                    gain: None,
                });
            }
        }
    }
    let network = m.network.as_ref().map(|n| {
        let found = network::derive_in(n, job, ratings, cat);
        if let Some(problem) = &found.problem {
            warnings.push(Warning::note(
                None,
                false,
                &cat.text("warn-subject-network"),
                Status::Caution,
                cat.format(
                    "warn-network-problem",
                    &[
                        ("what", Arg::from(&m.what)),
                        ("problem", Arg::from(problem)),
                    ],
                ),
            ));
        }
        found
    });
    ModFindings {
        what: m.what.clone(),
        why: m.why.clone(),
        reversible: m.reversible,
        original_kept: m.original_kept,
        private: m.private,
        figures,
        network,
    }
}

#[cfg(test)]
mod language_tests {
    use super::*;

    /// Every demo job, decoded and derived in the built-in catalogue `tag`,
    /// as the JSON `calc --json` writes.
    fn demo_json(tag: &str) -> Vec<(String, serde_json::Value)> {
        let cat = Catalogue::built_in(tag).unwrap();
        let ratings = RatingsTable::builtin();
        let dir = std::path::Path::new(env!("CARGO_MANIFEST_DIR")).join("jobs");
        let mut out = Vec::new();
        for entry in std::fs::read_dir(dir).unwrap() {
            let path = entry.unwrap().path();
            let name = path.file_name().unwrap().to_string_lossy().into_owned();
            if !name.ends_with(".kdl") || name == "shop.kdl" {
                continue;
            }
            let text = std::fs::read_to_string(&path).unwrap();
            let job = crate::job::decode_with_ratings(&name, &text, &ratings)
                .unwrap_or_else(|d| panic!("{name}: {:?}", d.problems))
                .job;
            let findings = derive_in(&job, &ratings, &cat);
            out.push((name, serde_json::to_value(&findings).unwrap()));
        }
        out
    }

    /// The words of every reason, threshold, brief, message and at-a-glance
    /// line in a findings JSON value.
    fn words(v: &serde_json::Value, out: &mut Vec<String>) {
        match v {
            serde_json::Value::Object(map) => {
                for (k, v) in map {
                    // The technician's own words (parts' reasons) and the
                    // mods' worked figures are not checks' reasons.
                    if k == "parts" || k == "what" || k == "why" {
                        continue;
                    }
                    let wordy = ["reason", "threshold", "brief", "message", "worst", "title"]
                        .contains(&k.as_str());
                    match v {
                        serde_json::Value::String(s) if wordy && k != "accepted_reason" => {
                            out.push(s.clone())
                        }
                        _ => words(v, out),
                    }
                }
            }
            serde_json::Value::Array(a) => a.iter().for_each(|v| words(v, out)),
            _ => {}
        }
    }

    #[test]
    fn the_german_findings_carry_no_english_reasons() {
        let english = demo_json("en");
        let german = demo_json("de");
        // Words only English sentences use (the job's own text, set labels
        // such as "as found", is the technician's and stays as written).
        let tell = [
            " the ",
            " is ",
            " of its ",
            "rating",
            "caution",
            "margin",
            "dissipation",
            "not measured",
            "within",
            "accepted by",
            "output valve",
            "heater",
        ];
        let mut checked = 0;
        for ((name, en), (_, de)) in english.iter().zip(&german) {
            let (mut en_words, mut de_words) = (Vec::new(), Vec::new());
            words(en, &mut en_words);
            words(de, &mut de_words);
            assert_eq!(en_words.len(), de_words.len(), "{name}");
            for (e, d) in en_words.iter().zip(&de_words) {
                for t in tell {
                    assert!(
                        !d.contains(t),
                        "{name}: {t:?} left in {d:?} (English {e:?})"
                    );
                }
                checked += 1;
            }
            // The figures do not depend on the language.
            assert_eq!(
                en["sets"].as_array().map(Vec::len),
                de["sets"].as_array().map(Vec::len)
            );
        }
        // A German reason of a known case: the combo's scorched dropper.
        let combo = &german
            .iter()
            .find(|(n, _)| n == "combo-6v6-fixed.kdl")
            .unwrap()
            .1;
        let r31 = combo["sets"][0]["droppers"]
            .as_array()
            .unwrap()
            .iter()
            .find(|r| r["reference"] == "R31")
            .unwrap();
        // 100 V across 4.7 kΩ is 100² / 4700 = 2.13 W (Joule's law, textbook),
        // 213 % of the 1 W rating.
        assert_eq!(
            r31["reason"],
            "Verlustleistung 2.13 W ist 213 % des Nennwerts von 1 W"
        );
        assert!(checked > 100, "only {checked} sentences checked");
    }
}
