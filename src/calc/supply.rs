//! The supply: B+ nodes against the chart, dropper, cathode and screen
//! resistor power, filter-capacitor margins (including the cold-start
//! peak) and heater voltage.

use super::findings::{
    CapacitorFindings, HeaterFindings, NodeFindings, NotChecked, RectifierFindings,
    ResistorFindings, ValveFindings,
};
use super::mains;
use super::status::{
    SaidOnce, Status, Verdict, rating_band, rating_reason, under_rating_threshold,
};
use crate::catalogue::{Arg, Catalogue};
use crate::job::{Circuit, Job, MeasurementSet, RectifierKind, Settings};
use crate::ratings::{RatingsTable, RectifierHeating};
use crate::units::{Ohms, QuantityKind, Volts, Watts, format_engineering};
use crate::units::{fixed, fixed_signed, fixed_with};

/// Cold-start peak of a full-wave winding of `rms` volts per side rated at
/// primary `rated_primary`, fed `mains` volts: √2 · Vsec · Vmains / Vp − drop.
pub fn cold_start_peak(
    rms: Volts,
    rated_primary: Volts,
    mains: Volts,
    rectifier_drop: Volts,
) -> Volts {
    Volts(std::f64::consts::SQRT_2 * rms.0 * (mains / rated_primary)) - rectifier_drop
}

fn v(x: f64) -> String {
    format_engineering(x, QuantityKind::Voltage)
}

/// "B+1 to B+2": where a dropper sits.
fn place_between(from: &str, to: &str, once: &SaidOnce) -> String {
    once.say("place-between", &[("from", from), ("to", to)])
}

/// Resistor power: two decimals of a watt, or milliwatts when tiny.
pub fn w(x: f64) -> String {
    if x.abs() < 0.01 {
        format_engineering(x, QuantityKind::Power)
    } else {
        fixed_with(x, 2, " W")
    }
}

pub(crate) fn nodes(
    job: &Job,
    set: &MeasurementSet,
    circuit: &Circuit,
    settings: &Settings,
    once: &SaidOnce,
) -> Vec<NodeFindings> {
    let nominal = job.mains.nominal.value;
    let design = job
        .mains
        .design
        .as_ref()
        .map(|d| d.value)
        .unwrap_or(nominal);
    let t = job.mains.tolerance.value;
    set.nodes
        .iter()
        .map(|reading| {
            let spec = circuit
                .nodes
                .iter()
                .find(|n| n.name.value == reading.name.value);
            let chart = reading.chart.or(spec.and_then(|s| s.chart));
            let tolerance = reading
                .tolerance
                .or(spec.and_then(|s| s.tolerance))
                .unwrap_or(settings.node_tolerance);
            let corrected = mains::corrected_volts(reading.volts.value, set.mains.value, nominal);
            let expected = chart.map(|c| mains::chart_expected(c, design, nominal));
            let deviation = expected.map(|e| (corrected / e - 1.0) * 100.0);
            let tol_pct = tolerance * 100.0;
            let tol_words = fixed(tol_pct, 0);
            let threshold = once.words("threshold-node", [tol_pct, nominal.0, 0.0], || {
                once.say(
                    "threshold-node",
                    &[("tolerance", &tol_words), ("nominal", &v(nominal.0))],
                )
            });
            let off_chart = |d: f64, e: Volts| {
                once.say(
                    "reason-node",
                    &[
                        ("corrected", &v(corrected.0)),
                        ("deviation", &fixed_signed(d, 1)),
                        ("expected", &v(e.0)),
                    ],
                )
            };
            let verdict = match (deviation, expected) {
                (Some(d), Some(e)) if d.abs() <= tol_pct + 1e-9 => {
                    Verdict::ok(off_chart(d, e), threshold)
                }
                (Some(d), Some(e)) => Verdict::new(
                    Status::Caution,
                    super::valve::joined(
                        off_chart(d, e),
                        &once.say(
                            if d > 0.0 {
                                "reason-above-band"
                            } else {
                                "reason-below-band"
                            },
                            &[("tolerance", &tol_words)],
                        ),
                    ),
                    threshold,
                ),
                _ => Verdict::ok(
                    once.text("reason-no-chart"),
                    once.text("threshold-no-chart"),
                ),
            };
            NodeFindings {
                name: reading.name.value.clone(),
                label: spec.and_then(|s| s.label.clone()),
                channel: spec.and_then(|s| s.channel.clone()),
                measured_volts: reading.volts.value.0,
                corrected_volts: corrected.0,
                chart_volts: chart.map(|c| c.0),
                expected_volts: expected.map(|e| e.0),
                deviation_pct: deviation,
                tolerance_pct: tol_pct,
                high_line_volts: mains::high_line_volts(corrected, t).0,
                verdict,
            }
        })
        .collect()
}

/// Dissipation of a resistor with `volts` across it, judged against its
/// rating with the derating band, and projected to high line.
#[allow(clippy::too_many_arguments)]
fn resistor(
    reference: &str,
    place: String,
    r: Ohms,
    rating: Option<Watts>,
    volts: Volts,
    job: &Job,
    set: &MeasurementSet,
    settings: &Settings,
    cat: &Catalogue,
    once: &SaidOnce,
) -> ResistorFindings {
    let p = volts.power_in(r);
    let p_c = mains::corrected_power(p, set.mains.value, job.mains.nominal.value);
    let p_h = mains::high_line_power(p_c, job.mains.tolerance.value);
    let pct = rating.map(|rt| p / rt * 100.0);
    let pct_h = rating.map(|rt| p_h / rt * 100.0);
    let verdict = match (rating, pct, pct_h) {
        (Some(rt), Some(pct), Some(pct_h)) => {
            let caution = settings.resistor_derating;
            // The rating in words, where a threshold or reason is made.
            let rating_words = || {
                once.words("watts", [rt.0, 0.0, 0.0], || {
                    format_engineering(rt.0, QuantityKind::Power)
                })
            };
            let threshold = once.words("threshold-under-rating", [rt.0, caution, 0.0], || {
                under_rating_threshold(caution, &rating_words(), cat)
            });
            let (status, key) = rating_band(pct, caution);
            let reason_of = |watts: &str, pct_words: &str| {
                rating_reason(
                    once.message(key),
                    &once.say("reason-dissipation", &[("watts", watts)]),
                    pct_words,
                    &rating_words(),
                    caution,
                )
            };
            // "dissipation 0.45 W is 22 % of its 2 W rating": said once for
            // each power in hundredths of a watt and share in whole percent
            // (a power under 10 mW, written with a prefix, each time).
            let reason = if p.0.abs() < 0.01 {
                reason_of(&w(p.0), &fixed(pct, 0))
            } else {
                once.fixed_words(
                    key,
                    "reason-dissipation",
                    [(p.0, 2), (pct, 0)],
                    [rt.0, caution],
                    |[watts, pct_words]| reason_of(&(watts + " W"), &pct_words),
                )
            };
            let mut verdict = Verdict::new(status, reason, threshold);
            if verdict.status == Status::Ok && pct_h > settings.resistor_derating * 100.0 {
                verdict = Verdict::new(
                    Status::Caution,
                    once.say(
                        "reason-resistor-high-line",
                        &[("watts", &w(p_h.0)), ("pct", &fixed(pct_h, 0))],
                    ),
                    verdict.threshold,
                );
            }
            verdict
        }
        _ => Verdict::ok(
            once.say("reason-resistor-no-rating", &[("watts", &w(p.0))]),
            once.text("threshold-no-power-rating"),
        ),
    };
    ResistorFindings {
        reference: reference.to_string(),
        place,
        resistance_ohms: r.0,
        rating_w: rating.map(|r| r.0),
        voltage_volts: volts.0,
        current_ma: (volts / r).0 * 1e3,
        power_w: p.0,
        power_pct: pct,
        high_line_power_w: p_h.0,
        high_line_power_pct: pct_h,
        verdict,
    }
}

pub(crate) fn droppers(
    job: &Job,
    set: &MeasurementSet,
    circuit: &Circuit,
    settings: &Settings,
    not_checked: &mut Vec<NotChecked>,
    cat: &Catalogue,
    once: &SaidOnce,
) -> Vec<ResistorFindings> {
    let read = |name: &str| {
        set.nodes
            .iter()
            .find(|n| n.name.value == name)
            .map(|n| n.volts.value)
    };
    let mut out = Vec::new();
    for d in &circuit.droppers {
        match (read(&d.from.value), read(&d.to.value)) {
            (Some(a), Some(b)) => out.push(resistor(
                &d.reference,
                place_between(&d.from.value, &d.to.value, once),
                d.value.value,
                d.rating,
                (a - b).abs(),
                job,
                set,
                settings,
                cat,
                once,
            )),
            (a, b) => {
                let missing: Vec<&str> = [(a, &d.from.value), (b, &d.to.value)]
                    .into_iter()
                    .filter(|(v, _)| v.is_none())
                    .map(|(_, n)| n.as_str())
                    .collect();
                not_checked.push(NotChecked {
                    reference: d.reference.clone(),
                    kind: "dropper",
                    place: place_between(&d.from.value, &d.to.value, once),
                    reason: cat.format(
                        "reason-not-measured",
                        &[
                            ("nodes", Arg::from(cat.and_list(&missing))),
                            ("count", Arg::from(missing.len())),
                        ],
                    ),
                });
            }
        }
    }
    out
}

pub(crate) fn cathode_resistors(
    job: &Job,
    set: &MeasurementSet,
    circuit: &Circuit,
    settings: &Settings,
    cat: &Catalogue,
    once: &SaidOnce,
) -> Vec<ResistorFindings> {
    let mut out = Vec::new();
    for rk in &circuit.cathode_resistors {
        let readings: Vec<Volts> = rk
            .valves
            .iter()
            .filter_map(|p| set.valves.iter().find(|v| v.position.value == p.value))
            .filter_map(|v| v.cathode.as_ref().map(|c| c.value))
            .collect();
        if readings.is_empty() {
            continue;
        }
        let vk = Volts(readings.iter().map(|v| v.0).sum::<f64>() / readings.len() as f64);
        let names: Vec<&str> = rk.valves.iter().map(|v| v.value.as_str()).collect();
        out.push(resistor(
            &rk.reference,
            cat.format(
                "place-cathodes",
                &[
                    ("valves", Arg::from(names.join(", "))),
                    ("count", Arg::from(names.len())),
                ],
            ),
            rk.value.value,
            rk.rating,
            vk,
            job,
            set,
            settings,
            cat,
            once,
        ));
    }
    out
}

pub(crate) fn screen_resistors(
    job: &Job,
    set: &MeasurementSet,
    circuit: &Circuit,
    settings: &Settings,
    cat: &Catalogue,
    once: &SaidOnce,
) -> Vec<ResistorFindings> {
    let mut out = Vec::new();
    for sr in &circuit.screen_resistors {
        let Some(supply) = set.nodes.iter().find(|n| n.name.value == sr.supply.value) else {
            continue;
        };
        let Some(vg2) = set
            .valves
            .iter()
            .find(|v| v.position.value == sr.valve.value)
            .and_then(|v| v.screen.as_ref())
        else {
            continue;
        };
        let reference = sr
            .reference
            .clone()
            .unwrap_or_else(|| once.say("place-screen", &[("valve", &sr.valve.value)]));
        out.push(resistor(
            &reference,
            once.say(
                "place-to-screen",
                &[("node", &sr.supply.value), ("valve", &sr.valve.value)],
            ),
            sr.value.value,
            sr.rating,
            (supply.volts.value - vg2.value).abs(),
            job,
            set,
            settings,
            cat,
            once,
        ));
    }
    out
}

#[allow(clippy::too_many_arguments)]
pub(crate) fn capacitors(
    job: &Job,
    set: &MeasurementSet,
    circuit: &Circuit,
    settings: &Settings,
    ratings: &RatingsTable,
    not_checked: &mut Vec<NotChecked>,
    cat: &Catalogue,
    once: &SaidOnce,
) -> Vec<CapacitorFindings> {
    let nominal = job.mains.nominal.value;
    let t = job.mains.tolerance.value;
    let high_mains = nominal * (1.0 + t);
    // The rectifier: its no-load drop, and whether it lets the supply reach
    // the peak before the output valves draw current.
    let (drop, slow_warmup, rect_words) =
        match circuit.rectifier.as_ref().map(|r| (&r.kind, r.drop)) {
            Some((RectifierKind::Silicon, d)) => (
                d.unwrap_or(settings.silicon_drop),
                false,
                once.text("reason-silicon-rectifier"),
            ),
            Some((RectifierKind::Valve(pos), d)) => {
                let heating = job
                    .valve_in(set, &pos.value)
                    .and_then(|v| ratings.lookup(&v.type_name.value).ok())
                    .and_then(|r| r.rectifier_heating);
                let slow = heating == Some(RectifierHeating::Indirect);
                let name = job
                    .valve_in(set, &pos.value)
                    .map(|v| v.type_name.value.clone())
                    .unwrap_or_default();
                (
                    d.unwrap_or(Volts(0.0)),
                    slow,
                    cat.format(
                        if slow {
                            "reason-valve-rectifier-slow"
                        } else {
                            "reason-valve-rectifier"
                        },
                        &[("type", Arg::from(&name))],
                    ),
                )
            }
            None => (
                settings.silicon_drop,
                false,
                once.text("reason-rectifier-not-stated"),
            ),
        };
    let peak = circuit
        .winding
        .as_ref()
        .map(|w| cold_start_peak(w.rms.value, w.primary.value, high_mains, drop));
    let mut out = Vec::new();
    for cap in &circuit.filter_capacitors {
        let measured = set
            .nodes
            .iter()
            .find(|n| n.name.value == cap.node.value)
            .map(|n| n.volts.value);
        let high = measured.map(|m| {
            mains::high_line_volts(mains::corrected_volts(m, set.mains.value, nominal), t)
        });
        let candidates = [high, peak];
        let Some(highest) = candidates.iter().flatten().copied().reduce(Volts::max) else {
            not_checked.push(NotChecked {
                reference: cap.reference.clone(),
                kind: "filter_capacitor",
                place: cap.node.value.clone(),
                reason: cat.format(
                    "reason-not-measured",
                    &[
                        ("nodes", Arg::from(&cap.node.value)),
                        ("count", Arg::from(1usize)),
                    ],
                ),
            });
            continue;
        };
        let rating = cap.rating.value;
        let margin = (rating.0 - highest.0) / rating.0 * 100.0;
        let high_mains_words = once.words("volts", [high_mains.0, 0.0, 0.0], || v(high_mains.0));
        let peak_words = once.say(
            "reason-cap-peak-words",
            &[("mains", &high_mains_words), ("rectifier", &rect_words)],
        );
        let work_words = once.words("reason-cap-work-words", [high_mains.0, 0.0, 0.0], || {
            once.say("reason-cap-work-words", &[("mains", &high_mains_words)])
        });
        let over_work = high.is_some_and(|h| h.0 > rating.0);
        let over_peak = peak.is_some_and(|p| p.0 > rating.0);
        // The figure that decides the status, named in the reason: the
        // working voltage when it is over (it decides even where a
        // slow-warming rectifier softens the peak), else the highest.
        let working_decides = match (high, peak) {
            (Some(_), _) if over_work => !over_peak || slow_warmup,
            (Some(h), Some(p)) => h.0 >= p.0,
            (Some(_), None) => true,
            (None, _) => false,
        };
        let (deciding, deciding_volts) = match (working_decides, high, peak) {
            (true, Some(h), _) => ("working_high_line", h),
            (_, _, Some(p)) => ("cold_start_peak", p),
            (_, Some(h), None) => ("working_high_line", h),
            (_, None, None) => ("cold_start_peak", highest),
        };
        let rating_words = once.words("volts", [rating.0, 0.0, 0.0], || v(rating.0));
        let margin_pct = settings.capacitor_margin * 100.0;
        let threshold = once.words("threshold-capacitor", [rating.0, margin_pct, 0.0], || {
            once.say(
                "threshold-capacitor",
                &[("rating", &rating_words), ("margin", &fixed(margin_pct, 0))],
            )
        });
        let unchecked = if measured.is_none() {
            once.say("reason-cap-unchecked", &[("node", &cap.node.value)])
        } else {
            String::new()
        };
        let source = if deciding == "working_high_line" {
            &work_words
        } else {
            &peak_words
        };
        let highest_words = v(highest.0);
        // The words of one reason: the figures by name, the unchecked
        // working voltage after it.
        let say = |key: &'static str, extra: &[(&'static str, &str)]| {
            let mut args: Vec<(&str, &str)> = Vec::with_capacity(5 + extra.len());
            args.extend([
                ("peak", peak_words.as_str()),
                ("work", work_words.as_str()),
                ("source", source.as_str()),
                ("rating", rating_words.as_str()),
                ("highest", highest_words.as_str()),
            ]);
            args.extend_from_slice(extra);
            let mut words = once.say(key, &args);
            words.push_str(&unchecked);
            words
        };
        // The peak and the working voltage in words, where a reason says
        // them (one that is over).
        let both_volts = || {
            (
                v(peak.map(|p| p.0).unwrap_or(0.0)),
                v(high.map(|h| h.0).unwrap_or(0.0)),
            )
        };
        let verdict = if over_work && over_peak && !slow_warmup {
            let (peak_volts, work_volts) = both_volts();
            Verdict::new(
                Status::Over,
                say(
                    "reason-cap-both-over",
                    &[("peak_volts", &peak_volts), ("work_volts", &work_volts)],
                ),
                threshold,
            )
        } else if over_work {
            let key = match peak {
                Some(p) if p.0 > high.map(|h| h.0).unwrap_or(0.0) => "reason-cap-work-over-peak",
                _ => "reason-cap-work-over",
            };
            let (peak_volts, work_volts) = both_volts();
            Verdict::new(
                Status::Over,
                say(
                    key,
                    &[("peak_volts", &peak_volts), ("work_volts", &work_volts)],
                ),
                threshold,
            )
        } else if over_peak && slow_warmup {
            Verdict::new(Status::Caution, say("reason-cap-peak-slow", &[]), threshold)
        } else if over_peak {
            Verdict::new(Status::Over, say("reason-cap-peak-over", &[]), threshold)
        } else if margin < settings.capacitor_margin * 100.0 {
            Verdict::new(
                Status::Caution,
                say("reason-cap-margin-low", &[("margin", &fixed(margin, 1))]),
                threshold,
            )
        } else {
            Verdict::ok(
                say("reason-cap-margin", &[("margin", &fixed(margin, 0))]),
                threshold,
            )
        };
        out.push(CapacitorFindings {
            reference: cap.reference.clone(),
            node: cap.node.value.clone(),
            capacitance_uf: cap.value.map(|f| f.0 * 1e6),
            rating_volts: rating.0,
            measured_volts: measured.map(|m| m.0),
            high_line_volts: high.map(|h| h.0),
            cold_start_peak_volts: peak.map(|p| p.0),
            highest_volts: highest.0,
            margin_pct: margin,
            deciding,
            deciding_volts: deciding_volts.0,
            deciding_margin_pct: (rating.0 - deciding_volts.0) / rating.0 * 100.0,
            verdict,
        });
    }
    out
}

/// A valve rectifier's load: at least the sum of the output valves' cathode
/// currents (Ia + Ig2 where the screen current is known). Judged with the
/// derating band's caution above 90 % (common practice) and over above 100 %.
pub(crate) fn rectifier(
    job: &Job,
    set: &MeasurementSet,
    circuit: &Circuit,
    valves: &[ValveFindings],
    ratings: &RatingsTable,
    cat: &Catalogue,
) -> Option<RectifierFindings> {
    let RectifierKind::Valve(pos) = &circuit.rectifier.as_ref()?.kind else {
        return None;
    };
    let spec = job.valve_in(set, &pos.value)?;
    let rating = ratings.lookup(&spec.type_name.value).ok()?;
    let max_ma = rating.output_current?.0 * 1e3;
    let outputs: Vec<&ValveFindings> = valves.iter().filter(|v| v.is_output).collect();
    let currents: Vec<f64> = outputs
        .iter()
        .filter_map(|v| {
            v.cathode_current_ma.or(v
                .plate_current_ma
                .map(|ia| ia + v.screen_current_ma.unwrap_or(0.0)))
        })
        .collect();
    if currents.is_empty() || currents.len() < outputs.len() {
        return None;
    }
    let load: f64 = currents.iter().sum();
    let pct = load / max_ma * 100.0;
    let threshold = cat.format(
        "threshold-rectifier",
        &[(
            "rating",
            Arg::from(format_engineering(max_ma / 1e3, QuantityKind::Current)),
        )],
    );
    let what = cat.format(
        "reason-rectifier",
        &[
            ("load", Arg::from(fixed(load, 0))),
            ("pct", Arg::from(fixed(pct, 0))),
            ("type", Arg::from(&spec.type_name.value)),
            ("position", Arg::from(&pos.value)),
            ("rating", Arg::from(fixed(max_ma, 0))),
        ],
    );
    let verdict = if pct > 100.0 {
        Verdict::new(Status::Over, what, threshold)
    } else if pct > 90.0 {
        Verdict::new(Status::Caution, what, threshold)
    } else {
        Verdict::ok(what, threshold)
    };
    Some(RectifierFindings {
        position: pos.value.clone(),
        valve_type: spec.type_name.value.clone(),
        load_at_least_ma: load,
        rating_ma: max_ma,
        load_pct: pct,
        verdict,
    })
}

pub(crate) fn heaters(
    job: &Job,
    set: &MeasurementSet,
    settings: &Settings,
    once: &SaidOnce,
) -> Vec<HeaterFindings> {
    set.heaters
        .iter()
        .map(|h| {
            let measured = h.volts.value;
            let corrected =
                mains::corrected_volts(measured, set.mains.value, job.mains.nominal.value);
            let dev = (measured / h.nominal - 1.0) * 100.0;
            let dev_c = (corrected / h.nominal - 1.0) * 100.0;
            let tol = settings.heater_tolerance * 100.0;
            let tol_words = fixed(tol, 0);
            let nominal_words = v(h.nominal.0);
            let threshold = once.words("threshold-heater", [tol, h.nominal.0, 0.0], || {
                once.say(
                    "threshold-heater",
                    &[("tolerance", &tol_words), ("nominal", &nominal_words)],
                )
            });
            let from_nominal = once.say(
                "reason-heater",
                &[
                    ("measured", &v(measured.0)),
                    ("deviation", &fixed_signed(dev, 1)),
                    ("nominal", &nominal_words),
                ],
            );
            // Off the band: how far, and the reading at nominal mains.
            let off_band = |key: &'static str| {
                let at_nominal = once.say(
                    "reason-at-nominal",
                    &[
                        ("volts", &v(corrected.0)),
                        ("deviation", &fixed_signed(dev_c, 1)),
                    ],
                );
                format!(
                    "{from_nominal}, {}; {at_nominal}",
                    once.say(key, &[("tolerance", &tol_words)])
                )
            };
            let verdict = if dev > tol + 1e-9 {
                Verdict::new(Status::Over, off_band("reason-above-band"), threshold)
            } else if dev < -tol - 1e-9 {
                Verdict::new(Status::Caution, off_band("reason-below-band"), threshold)
            } else {
                Verdict::ok(from_nominal, threshold)
            };
            HeaterFindings {
                label: h.label.clone(),
                measured_volts: measured.0,
                nominal_volts: h.nominal.0,
                corrected_volts: corrected.0,
                deviation_pct: dev,
                corrected_deviation_pct: dev_c,
                verdict,
            }
        })
        .collect()
}

#[cfg(test)]
mod tests {
    use super::*;

    fn en() -> &'static Catalogue {
        Catalogue::english()
    }
    use crate::job::{self, Job};

    /// A small 120 V job (nominal 120 V, +5 %, chart at 110 V) with one
    /// measurement set at `mains`; `circuit` and `readings` fill the holes.
    fn job(mains: &str, circuit: &str, readings: &str) -> Job {
        let text = format!(
            "job-format 1\njob id=\"T\"\nunit make=\"M\" model=\"N\"\nmains nominal=\"120V\" tolerance=\"5%\" design=\"110V\"\n\
             valves {{\n    valve V1 type=EL84 role=output\n    valve V5 type=EZ81 role=rectifier\n    valve V6 type=\"5Y3GT\" role=rectifier\n}}\n\
             circuit {{\n{circuit}\n}}\nmeasurements \"x\" mains=\"{mains}\" {{\n{readings}\n}}\n"
        );
        match job::decode_with_ratings("t.kdl", &text, &RatingsTable::builtin()) {
            Ok(d) => d.job,
            Err(d) => panic!("{:?}\n{text}", d.problems),
        }
    }

    fn statuses<T>(items: &[T], status: impl Fn(&T) -> Status) -> Vec<Status> {
        items.iter().map(status).collect()
    }

    #[test]
    fn nodes_against_the_chart_at_design_mains() {
        let j = job(
            "120V",
            "node A chart=\"300V\"\nnode B chart=\"300V\"\nnode C chart=\"300V\" tolerance=\"20%\"\nnode D",
            // expected = 300 V × 120/110 = 327.27 V (common practice); ±10 % is 294.55 … 360.00 V.
            "node A \"360V\"\nnode B \"361V\"\nnode C \"390V\"\nnode D \"100V\"",
        );
        let set = &j.measurements[0];
        let f = nodes(
            &j,
            set,
            &j.circuit_for(set),
            &j.settings,
            &SaidOnce::new(en()),
        );
        // Chart referred to nominal, common practice: 300 V × 120/110 = 327.273 V.
        assert!((f[0].expected_volts.unwrap() - 327.2727).abs() < 1e-3);
        // 360/327.273 − 1 = +10.0 %: inside the common-practice ±10 %; 361 V is +10.3 %: outside.
        assert!((f[0].deviation_pct.unwrap() - 10.0).abs() < 1e-9);
        // The node's own ±20 % (a factory chart's band): 390/327.27 − 1 = +19.2 %, inside.
        assert_eq!(
            statuses(&f, |n| n.verdict.status),
            [Status::Ok, Status::Caution, Status::Ok, Status::Ok]
        );
        assert_eq!(f[3].expected_volts, None);
        // High line, common practice V·(1 + t), ANSI C84.1 +5 % from memory: 360 V × 1.05 = 378 V.
        assert!((f[0].high_line_volts - 378.0).abs() < 1e-9);
    }

    #[test]
    fn dropper_power_and_the_derating_band() {
        let j = job(
            "120V",
            "node A\nnode B\nnode C\nnode D\ndropper R1 value=\"10k\" rating=\"1W\" from=A to=B\ndropper R2 value=\"10k\" rating=\"1W\" from=B to=C\n\
             dropper R3 value=\"10k\" rating=\"1W\" from=C to=D",
            // Joule's law P = ΔV²/R (textbook): 70 V → 0.49 W; 72 V → 0.5184 W; 101 V → 1.0201 W.
            "node A \"400V\"\nnode B \"330V\"\nnode C \"258V\"\nnode D \"157V\"",
        );
        let set = &j.measurements[0];
        let mut notes = Vec::new();
        let f = droppers(
            &j,
            set,
            &j.circuit_for(set),
            &j.settings,
            &mut notes,
            en(),
            &SaidOnce::new(en()),
        );
        assert!(notes.is_empty(), "{notes:?}");
        assert!((f[0].power_w - 0.49).abs() < 1e-12); // Joule's law (textbook): 70² / 10 kΩ = 0.49 W
        assert!((f[1].power_w - 0.5184).abs() < 1e-12); // 72² / 10 kΩ = 0.5184 W
        assert!((f[2].power_w - 1.0201).abs() < 1e-12); // 101² / 10 kΩ = 1.0201 W
        assert!((f[0].current_ma - 7.0).abs() < 1e-9); // Ohm's law (textbook): 70 V / 10 kΩ = 7 mA
        // Common practice: caution above 50 % of the rating, over above 100 %. 0.49 W is 49 %, but at
        // high line (ANSI C84.1 +5 %, from memory) 0.49 × 1.1025 = 0.540 W is 54 %: a caution too.
        assert!((f[0].high_line_power_w - 0.540225).abs() < 1e-9);
        assert_eq!(
            statuses(&f, |r| r.verdict.status),
            [Status::Caution, Status::Caution, Status::Over]
        );
        assert!(
            f[0].verdict.reason.contains("high line"),
            "{}",
            f[0].verdict.reason
        );
    }

    #[test]
    fn a_dropper_needs_both_nodes_read() {
        let j = job(
            "120V",
            "node A\nnode B\ndropper R1 value=\"10k\" rating=\"1W\" from=A to=B",
            "node A \"400V\"",
        );
        let set = &j.measurements[0];
        let mut notes = Vec::new();
        assert!(
            droppers(
                &j,
                set,
                &j.circuit_for(set),
                &j.settings,
                &mut notes,
                en(),
                &SaidOnce::new(en())
            )
            .is_empty()
        );
        assert_eq!(notes.len(), 1);
        assert_eq!(notes[0].reference, "R1");
        assert_eq!(notes[0].reason, "B not measured");
    }

    #[test]
    fn cathode_resistor_power() {
        let j = job(
            "120V",
            "cathode-resistor R9 value=\"130\" rating=\"2W\" valves=\"V1\"",
            "valve V1 plate=\"300V\" cathode=\"11.6V\"",
        );
        let set = &j.measurements[0];
        let f = cathode_resistors(
            &j,
            set,
            &j.circuit_for(set),
            &j.settings,
            en(),
            &SaidOnce::new(en()),
        );
        // Joule's law P = Vk²/Rk (textbook): 11.6² / 130 Ω = 1.0351 W, 51.8 % of 2 W: above the 50 % derating (common practice).
        assert!((f[0].power_w - 1.035077).abs() < 1e-6);
        assert_eq!(f[0].verdict.status, Status::Caution);
    }

    fn capacitor_statuses(
        rectifier: &str,
        ratings: &[&str],
        b1: &str,
    ) -> (Vec<Status>, Vec<CapacitorFindings>) {
        let caps: Vec<String> = ratings
            .iter()
            .enumerate()
            .map(|(i, r)| format!("filter-capacitor C{i} rating=\"{r}\" node=B+1"))
            .collect();
        let j = job(
            "120V",
            &format!(
                "node B+1\nhigh-voltage-winding rms=\"300V\" primary=\"120V\"\n{rectifier}\n{}",
                caps.join("\n")
            ),
            &format!("node B+1 \"{b1}\""),
        );
        let set = &j.measurements[0];
        let f = capacitors(
            &j,
            set,
            &j.circuit_for(set),
            &j.settings,
            &RatingsTable::builtin(),
            &mut Vec::new(),
            en(),
            &SaidOnce::new(en()),
        );
        (statuses(&f, |c| c.verdict.status), f)
    }

    #[test]
    fn filter_capacitor_margin_at_cold_start() {
        // √2·Vsec·Vhigh/Vp − drop (domain notes; peak = √2·RMS, textbook), silicon ≈ 1 V (common practice),
        // high line 126 V (ANSI C84.1 +5 %, from memory): 1.41421 × 300 × 126/120 − 1 = 444.48 V.
        let (s, f) = capacitor_statuses(
            "rectifier silicon",
            &["400V", "450V", "490V", "500V"],
            "360V",
        );
        assert!((f[0].cold_start_peak_volts.unwrap() - 444.4777).abs() < 1e-3);
        // Over when above the rating; caution when the margin is under 10 % (common practice):
        // 400 V: −11.1 %; 450 V: 1.2 %; 490 V: 9.3 %; 500 V: 11.1 %.
        assert!((f[1].margin_pct - 1.2272).abs() < 1e-3);
        assert_eq!(
            s,
            [Status::Over, Status::Caution, Status::Caution, Status::Ok]
        );
    }

    #[test]
    fn the_operating_voltage_at_high_line_counts_when_it_is_higher() {
        // No winding given: only the operating figure. 430 V at 120 V mains × 1.05 = 451.5 V (common practice).
        let j = job(
            "120V",
            "node B+1\nfilter-capacitor C1 rating=\"450V\" node=B+1",
            "node B+1 \"430V\"",
        );
        let set = &j.measurements[0];
        let f = capacitors(
            &j,
            set,
            &j.circuit_for(set),
            &j.settings,
            &RatingsTable::builtin(),
            &mut Vec::new(),
            en(),
            &SaidOnce::new(en()),
        );
        assert!((f[0].highest_volts - 451.5).abs() < 1e-9);
        assert_eq!(f[0].verdict.status, Status::Over);
    }

    #[test]
    fn a_slow_warming_rectifier_softens_a_cold_start_over_to_a_caution() {
        // Valve rectifier at no load ≈ 0 V drop (domain notes): 1.41421 × 300 × 1.05 = 445.48 V against 440 V.
        // An indirectly heated EZ81 warms with the output valves: caution; a directly heated 5Y3GT: over.
        let (slow, f) = capacitor_statuses("rectifier V5", &["440V"], "360V");
        assert!((f[0].cold_start_peak_volts.unwrap() - 445.4777).abs() < 1e-3);
        assert_eq!(slow, [Status::Caution]);
        let (fast, _) = capacitor_statuses("rectifier V6", &["440V"], "360V");
        assert_eq!(fast, [Status::Over]);
    }

    #[test]
    fn the_working_voltage_is_named_when_it_decides() {
        // EZ81 (indirectly heated, slow-warming) at no load ≈ 0 V drop: peak 1.41421 × 300 × 1.05 = 445.48 V.
        // Working voltage 425 V at 120 V mains, at high line 425 × 1.05 = 446.25 V (common practice,
        // ANSI C84.1 +5 %, from memory): both above a 440 V rating. The slow rectifier would soften the
        // peak to a caution, but the working voltage is over in its own right, so it decides.
        let (s, f) = capacitor_statuses("rectifier V5", &["440V"], "425V");
        assert_eq!(s, [Status::Over]);
        assert_eq!(f[0].deciding, "working_high_line");
        assert!((f[0].deciding_volts - 446.25).abs() < 1e-9);
        let reason = &f[0].verdict.reason;
        assert!(reason.contains("working voltage at high line"), "{reason}");
        assert!(reason.contains("446 V"), "{reason}");
        // With a directly heated 5Y3GT both figures are over: the reason names both.
        let (s, f) = capacitor_statuses("rectifier V6", &["440V"], "425V");
        assert_eq!(s, [Status::Over]);
        let reason = &f[0].verdict.reason;
        assert!(
            reason.contains("445 V") && reason.contains("446 V"),
            "{reason}"
        );
        // Under the rating, the higher figure decides the margin: 500 V leaves
        // (500 − 446.25) / 500 = 10.75 % on the working voltage, above the 10 % band.
        let (s, f) = capacitor_statuses("rectifier V5", &["500V"], "425V");
        assert_eq!(s, [Status::Ok]);
        assert_eq!(f[0].deciding, "working_high_line");
    }

    #[test]
    fn a_capacitor_whose_node_was_not_read_and_has_no_peak_is_not_checked() {
        let j = job(
            "120V",
            "node B+1\nnode B+3\nfilter-capacitor C1 rating=\"450V\" node=B+3",
            "node B+1 \"430V\"",
        );
        let set = &j.measurements[0];
        let mut not_checked = Vec::new();
        let f = capacitors(
            &j,
            set,
            &j.circuit_for(set),
            &j.settings,
            &RatingsTable::builtin(),
            &mut not_checked,
            en(),
            &SaidOnce::new(en()),
        );
        assert!(f.is_empty());
        assert_eq!(not_checked.len(), 1);
        assert_eq!(not_checked[0].reason, "B+3 not measured");
    }

    #[test]
    fn heater_band() {
        let j = job(
            "120V",
            "",
            "heater \"6.93V\"\nheater \"6.95V\"\nheater \"5.67V\"\nheater \"5.6V\"\nheater \"12.6V\" nominal=\"12.6V\"",
        );
        let set = &j.measurements[0];
        let f = heaters(&j, set, &j.settings, &SaidOnce::new(en()));
        // Common practice, 6.3 V ±10 % (many datasheets say ±10 %, from memory): 5.67 … 6.93 V.
        assert!((f[0].deviation_pct - 10.0).abs() < 1e-9); // 6.93/6.3 − 1 = +10.0 %
        assert_eq!(
            statuses(&f, |h| h.verdict.status),
            [
                Status::Ok,
                Status::Over,
                Status::Ok,
                Status::Caution,
                Status::Ok
            ]
        );
    }

    #[test]
    fn cold_start_peak_of_a_full_wave_winding() {
        // √2·Vsec·Vhigh/Vp − drop (domain notes; peak of a sine is √2·RMS, textbook):
        // 365 V rms rated at 240 V, fed 253 V (230 V + 10 %, IEC 60038 from memory), silicon drop 1 V (common practice):
        // 1.41421 × 365 × 253/240 − 1 = 544.15 − 1 = 543.15 V.
        let p = cold_start_peak(Volts(365.0), Volts(240.0), Volts(253.0), Volts(1.0));
        assert!((p.0 - 543.15).abs() < 0.01, "{}", p.0);
        // 260 V rms rated at 110 V, fed 126 V (120 V + 5 %, ANSI C84.1 from memory), valve rectifier at no load ≈ 0 V:
        // 1.41421 × 260 × 126/110 = 421.17 V.
        let p = cold_start_peak(Volts(260.0), Volts(110.0), Volts(126.0), Volts(0.0));
        assert!((p.0 - 421.17).abs() < 0.01, "{}", p.0);
    }
}
