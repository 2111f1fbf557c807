//! Idle current by every measurement method, plate and screen dissipation,
//! percent of rating, the guide bands and the fixed-bias target window.

use super::findings::{Check, CurrentMethod, TargetWindow, ValveFindings};
use super::mains;
use super::status::{SaidOnce, Status, Verdict, under_rating_named, worst_of};
use crate::catalogue::{Arg, Catalogue};
use crate::job::{
    BiasKind, Circuit, CurrentMethod as ReadMethod, Job, MeasurementSet, Settings, ValvePosition,
    ValveReading,
};
use crate::ratings::Rating;
use crate::units::fixed;
use crate::units::{Amps, Ohms, Volts, Watts, format_engineering};

/// Ohm's law for a cathode resistor shared by `n` matched valves:
/// Ik(per valve) = Vk / (n · Rk).
pub fn cathode_current_shared(vk: Volts, rk: Ohms, n: usize) -> Amps {
    vk / rk / n.max(1) as f64
}

/// Plate current from the drop across a half primary shared by `n`
/// matched valves: Ia = Vdrop / (n · Rhalf).
pub fn plate_current_from_drop(drop: Volts, r_half: Ohms, n: usize) -> Amps {
    drop / r_half / n.max(1) as f64
}

/// Screen current from the drop across the screen resistor:
/// Ig2 = (Vsupply − Vg2) / Rg2.
pub fn screen_current(supply: Volts, vg2: Volts, rg2: Ohms) -> Amps {
    (supply - vg2) / rg2
}

/// Joule's law for the plate: Pa = (Va − Vk) · Ia.
pub fn plate_dissipation(va: Volts, vk: Volts, ia: Amps) -> Watts {
    (va - vk) * ia
}

/// The fixed-bias target current: Ia = f · Pa(max) / (Va − Vk).
pub fn target_current(fraction: f64, pa_max: Watts, va: Volts, vk: Volts) -> Amps {
    (pa_max * fraction) / (va - vk)
}

/// What a valve's readings give: the current and how it was found.
struct Current {
    method: CurrentMethod,
    /// Cathode current, when the method reads it (or Ia + Ig2 when known).
    ik: Option<Amps>,
    ia: Amps,
    ig2: Option<Amps>,
    includes_screen: bool,
}

pub(crate) struct ValveContext<'a, 'c> {
    pub job: &'a Job,
    pub set: &'a MeasurementSet,
    pub circuit: &'a Circuit,
    pub settings: &'a Settings,
    /// The words of the reasons and notes.
    pub cat: &'a Catalogue,
    /// The words that are the same in every set (thresholds, ratings).
    pub once: &'a SaidOnce<'c>,
}

pub(crate) fn analyse(
    ctx: &ValveContext,
    spec: &ValvePosition,
    reading: &ValveReading,
    rating: &Rating,
    notes: &mut Vec<String>,
) -> ValveFindings {
    let pos = spec.position.value.as_str();
    let cat = ctx.cat;
    let once = ctx.once;
    let circuit = ctx.circuit;
    let nominal = ctx.job.mains.nominal.value;
    let measured_mains = ctx.set.mains.value;
    let tolerance = ctx.job.mains.tolerance.value;
    let is_output = rating.class.is_output();

    let bias = match &circuit.bias {
        Some(b) => b.value,
        None if circuit.cathode_resistor_for(pos).is_some() => BiasKind::Cathode,
        None => BiasKind::Fixed,
    };
    let va = reading.plate.as_ref().map(|v| v.value);
    let vg2 = reading.screen.as_ref().map(|v| v.value);
    // Vk: read directly, else the sense-resistor voltage (Vk ≈ Vs), else 0 V
    // for a fixed-bias valve whose cathode is grounded.
    let vk = reading
        .cathode
        .as_ref()
        .map(|v| v.value)
        .or(reading.sense.as_ref().map(|v| v.value))
        .unwrap_or(Volts(0.0));

    // Screen current, where the screen resistor and its supply were read.
    let ig2 = circuit.screen_resistor_for(pos).and_then(|sr| {
        let supply = ctx
            .set
            .nodes
            .iter()
            .find(|n| n.name.value == sr.supply.value)?
            .volts
            .value;
        let vg2 = vg2?;
        let i = screen_current(supply, vg2, sr.value.value);
        if i.0 < 0.0 {
            notes.push(cat.format(
                "note-screen-above-supply",
                &[
                    ("position", Arg::from(pos)),
                    ("screen", Arg::from(vg2.to_string())),
                    ("supply", Arg::from(&sr.supply.value)),
                    ("volts", Arg::from(supply.to_string())),
                ],
            ));
            None
        } else {
            Some(i)
        }
    });

    let current = find_current(ctx, pos, reading, vk, ig2, notes);

    // Plate and screen dissipation, the high-line plate, the two voltages
    // and the cathode current at most.
    let mut checks: Vec<Check> = Vec::with_capacity(6);
    let mut f = ValveFindings {
        position: pos.to_string(),
        valve_type: spec.type_name.value.clone(),
        channel: spec.channel.clone(),
        rating_name: rating.name.clone(),
        role: spec.role.words().to_string(),
        is_output,
        bias: match bias {
            BiasKind::Cathode => "cathode".into(),
            BiasKind::Fixed => "fixed".into(),
        },
        method: current.as_ref().map(|c| c.method),
        current_shared_with: match current.as_ref().map(|c| c.method) {
            Some(CurrentMethod::SharedCathodeResistor) => circuit
                .cathode_resistor_for(pos)
                .map(|r| others(&r.valves, pos))
                .unwrap_or_default(),
            Some(CurrentMethod::TransformerResistance) => circuit
                .half_primary_for(pos)
                .map(|h| others(&h.valves, pos))
                .unwrap_or_default(),
            _ => Vec::new(),
        },
        plate_volts: va.map(|v| v.0),
        screen_volts: vg2.map(|v| v.0),
        cathode_volts: reading
            .cathode
            .as_ref()
            .map(|v| v.value.0)
            .or(reading.sense.as_ref().map(|v| v.value.0)),
        grid_volts: reading.grid.as_ref().map(|v| v.value.0),
        cathode_current_ma: current.as_ref().and_then(|c| c.ik).map(|i| i.0 * 1e3),
        screen_current_ma: current
            .as_ref()
            .and_then(|c| c.ig2)
            .or(ig2)
            .map(|i| i.0 * 1e3),
        plate_current_ma: current.as_ref().map(|c| c.ia.0 * 1e3),
        plate_current_includes_screen: current.as_ref().is_some_and(|c| c.includes_screen),
        plate_dissipation_w: None,
        plate_dissipation_max_w: rating.plate_dissipation.map(|w| w.0),
        plate_dissipation_pct: None,
        corrected_plate_dissipation_w: None,
        corrected_plate_dissipation_pct: None,
        high_line_plate_dissipation_w: None,
        high_line_plate_dissipation_pct: None,
        screen_dissipation_w: None,
        screen_dissipation_max_w: rating.screen_dissipation.map(|w| w.0),
        screen_dissipation_pct: None,
        plate_voltage_pct: None,
        screen_voltage_pct: None,
        cathode_current_pct: None,
        target_window: None,
        status: Status::Ok,
        open_status: Status::Ok,
        checks: Vec::new(),
    };

    // Plate dissipation and its bands.
    if let (Some(va), Some(c)) = (va, &current) {
        let pa = plate_dissipation(va, vk, c.ia);
        let pa_c = mains::corrected_power(pa, measured_mains, nominal);
        let pa_h = mains::high_line_power(pa_c, tolerance);
        f.plate_dissipation_w = Some(pa.0);
        f.corrected_plate_dissipation_w = Some(pa_c.0);
        f.high_line_plate_dissipation_w = Some(pa_h.0);
        if let Some(max) = rating.plate_dissipation {
            let pct = pa / max * 100.0;
            let pct_c = pa_c / max * 100.0;
            let pct_h = pa_h / max * 100.0;
            f.plate_dissipation_pct = Some(pct);
            f.corrected_plate_dissipation_pct = Some(pct_c);
            f.high_line_plate_dissipation_pct = Some(pct_h);
            let conservative = if c.includes_screen {
                once.words("reason-includes-screen", [0.0; 3], || {
                    format!(" {}", cat.format("reason-includes-screen", &[]))
                })
            } else {
                String::new()
            };
            let verdict = dissipation_verdict(
                ctx.settings,
                bias,
                is_output,
                pct,
                pct_c,
                pa,
                max,
                &conservative,
                once,
            );
            checks.push(Check {
                check: "plate_dissipation",
                verdict,
            });
            if pct_h > 100.0 && pct <= 100.0 && pct_c <= 100.0 {
                checks.push(Check {
                    check: "plate_dissipation_high_line",
                    verdict: Verdict::new(
                        Status::Caution,
                        once.say(
                            "reason-plate-high-line",
                            &[
                                (
                                    "mains",
                                    &format_engineering(
                                        (nominal * (1.0 + tolerance)).0,
                                        crate::units::QuantityKind::Voltage,
                                    ),
                                ),
                                ("watts", &fixed(pa_h.0, 1)),
                                ("pct", &fixed(pct_h, 0)),
                            ],
                        ),
                        once.text("threshold-plate-high-line"),
                    ),
                });
            }
        }
        // Fixed-bias target window.
        if bias == BiasKind::Fixed
            && is_output
            && let Some(max) = rating.plate_dissipation
            && va.0 > vk.0
        {
            let mut w = window(ctx, reading, va, vk, max, c);
            // The grid voltage for the middle of the window, where the
            // three-halves law can be fitted (a grid reading and μg1g2 are
            // needed); otherwise the window alone guides the adjustment,
            // and the reader is told why there is no estimate.
            let grid = reading.grid.as_ref().map(|g| g.value);
            let middle = Amps(w.plate_current_middle_ma / 1e3);
            match super::bias_estimate::grid_for_window_middle(&f, rating, grid, middle) {
                Ok(g) => w.grid_for_middle_volts = Some(g.0),
                Err(why) => {
                    w.grid_for_middle_unknown_reason = Some(match why.plain_key() {
                        Some(key) => once.text(key),
                        None => why.words(cat),
                    })
                }
            }
            f.target_window = Some(w);
        }
    }

    // Screen dissipation.
    if let (Some(vg2), Some(ig2)) = (vg2, current.as_ref().and_then(|c| c.ig2).or(ig2)) {
        let pg2 = (vg2 - vk) * ig2;
        f.screen_dissipation_w = Some(pg2.0);
        if let Some(max) = rating.screen_dissipation {
            let pct = pg2 / max * 100.0;
            f.screen_dissipation_pct = Some(pct);
            let pct_h = pct * (nominal / measured_mains).powi(2) * (1.0 + tolerance).powi(2);
            let rating_words = watts_words_once(max, once);
            // The band has no caution of its own below the rating: say what does decide.
            let threshold = once.words("threshold-screen-dissipation", [max.0, 0.0, 0.0], || {
                once.say("threshold-screen-dissipation", &[("rating", &rating_words)])
            });
            let mut verdict = under_rating_named(
                pct,
                1.0,
                "reason-screen-dissipation",
                max.0,
                &rating_words,
                threshold,
                once,
            );
            if verdict.status == Status::Ok && pct_h > 100.0 {
                verdict = Verdict::new(
                    Status::Caution,
                    once.say("reason-screen-high-line", &[("pct", &fixed(pct_h, 0))]),
                    verdict.threshold,
                );
            }
            checks.push(Check {
                check: "screen_dissipation",
                verdict,
            });
        }
    }

    // Voltage and cathode-current maxima.
    let high = |v: Volts| {
        mains::high_line_volts(
            mains::corrected_volts(v, measured_mains, nominal),
            tolerance,
        )
    };
    if let (Some(va), Some(max)) = (va, rating.plate_voltage) {
        let pct = va / max * 100.0;
        f.plate_voltage_pct = Some(pct);
        checks.push(Check {
            check: "plate_voltage",
            verdict: max_verdict(
                "reason-plate-voltage",
                va,
                high(va),
                max,
                ctx.settings.voltage_over,
                once,
            ),
        });
    }
    if let (Some(vg2), Some(max)) = (vg2, rating.screen_voltage) {
        f.screen_voltage_pct = Some(vg2 / max * 100.0);
        checks.push(Check {
            check: "screen_voltage",
            verdict: max_verdict(
                "reason-screen-voltage",
                vg2,
                high(vg2),
                max,
                ctx.settings.voltage_over,
                once,
            ),
        });
    }
    if let (Some(ik), Some(max)) = (
        current.as_ref().and_then(|c| c.ik.or(Some(c.ia))),
        rating.cathode_current,
    ) {
        let pct = ik / max * 100.0;
        f.cathode_current_pct = Some(pct);
        let threshold = once.words("threshold-cathode-current", [max.0, 0.0, 0.0], || {
            once.say(
                "threshold-cathode-current",
                &[(
                    "max",
                    &format_engineering(max.0, crate::units::QuantityKind::Current),
                )],
            )
        });
        let verdict = if pct > 100.0 {
            Verdict::new(
                Status::Over,
                once.say(
                    "reason-cathode-current-over",
                    &[
                        (
                            "current",
                            &format_engineering(ik.0, crate::units::QuantityKind::Current),
                        ),
                        ("pct", &fixed(pct, 0)),
                    ],
                ),
                threshold,
            )
        } else {
            let key = "reason-cathode-current";
            Verdict::ok(
                once.whole_words(key, "", pct, [0.0; 2], |pct_words| {
                    once.say(key, &[("pct", pct_words)])
                }),
                threshold,
            )
        };
        checks.push(Check {
            check: "cathode_current",
            verdict,
        });
    }

    if current.is_none() && is_output {
        notes.push(cat.format("note-no-idle-current", &[("position", Arg::from(pos))]));
    }

    f.status = worst_of(checks.iter().map(|c| &c.verdict))
        .map(|v| v.status)
        .unwrap_or(Status::Ok);
    f.checks = checks;
    f.refresh_open_status();
    f
}

fn find_current(
    ctx: &ValveContext,
    pos: &str,
    reading: &ValveReading,
    vk: Volts,
    ig2: Option<Amps>,
    notes: &mut Vec<String>,
) -> Option<Current> {
    let circuit = ctx.circuit;
    let from_ik = |method, ik: Amps| match ig2 {
        Some(ig2) => Current {
            method,
            ik: Some(ik),
            ia: ik - ig2,
            ig2: Some(ig2),
            includes_screen: false,
        },
        None => Current {
            method,
            ik: Some(ik),
            ia: ik,
            ig2: None,
            includes_screen: true,
        },
    };
    let from_ia = |method, ia: Amps| Current {
        method,
        ik: ig2.map(|g| ia + g),
        ia,
        ig2,
        includes_screen: false,
    };

    // Plate current read directly is best: no screen current in it.
    if let Some((i, ReadMethod::Shunt)) = &reading.current {
        return Some(from_ia(CurrentMethod::Shunt, i.value));
    }
    if let Some(drop) = &reading.primary_drop {
        match circuit.half_primary_for(pos) {
            Some(h) => {
                return Some(from_ia(
                    CurrentMethod::TransformerResistance,
                    plate_current_from_drop(drop.value, h.resistance.value, h.valves.len()),
                ));
            }
            None => notes.push(
                ctx.cat
                    .format("note-no-half-primary", &[("position", Arg::from(pos))]),
            ),
        }
    }
    if let Some((i, ReadMethod::Probe)) = &reading.current {
        return Some(from_ik(CurrentMethod::Probe, i.value));
    }
    if let Some(vs) = &reading.sense {
        match circuit.sense_resistor_for(pos) {
            Some(rs) => {
                return Some(from_ik(
                    CurrentMethod::SenseResistor,
                    vs.value / rs.value.value,
                ));
            }
            None => notes.push(
                ctx.cat
                    .format("note-no-sense-resistor", &[("position", Arg::from(pos))]),
            ),
        }
    }
    if reading.cathode.is_some()
        && let Some(rk) = circuit.cathode_resistor_for(pos)
    {
        let n = rk.valves.len();
        let method = if n > 1 {
            CurrentMethod::SharedCathodeResistor
        } else {
            CurrentMethod::OwnCathodeResistor
        };
        return Some(from_ik(
            method,
            cathode_current_shared(vk, rk.value.value, n),
        ));
    }
    None
}

#[allow(clippy::too_many_arguments)]
fn dissipation_verdict(
    settings: &Settings,
    bias: BiasKind,
    is_output: bool,
    pct: f64,
    pct_c: f64,
    pa: Watts,
    max: Watts,
    conservative: &str,
    once: &SaidOnce,
) -> Verdict {
    let rating = || watts_words_once(max, once);
    // Judge on the hotter of today's mains and nominal mains.
    let (judged, at) = if pct_c > pct {
        (
            pct_c,
            once.words("reason-at-nominal-mains", [0.0; 3], || {
                format!(" {}", once.say("reason-at-nominal-mains", &[]))
            }),
        )
    } else {
        (pct, String::new())
    };
    let watts = if at.is_empty() {
        pa.0
    } else {
        pa.0 * pct_c / pct
    };
    // The status, the threshold, and the message of the words after the
    // figure (`PLAIN` for none) with its argument.
    const PLAIN: &str = "reason-plate-dissipation";
    let (status, threshold, band, band_arg) = if bias == BiasKind::Fixed && is_output {
        let lo = settings.fixed_bias_low * 100.0;
        let hi = settings.fixed_bias_high * 100.0;
        let threshold = once.words("threshold-fixed-bias", [max.0, lo, hi], || {
            once.say(
                "threshold-fixed-bias",
                &[
                    ("low", &fixed(lo, 0)),
                    ("high", &fixed(hi, 0)),
                    ("rating", &rating()),
                ],
            )
        });
        if judged > 100.0 {
            (Status::Over, threshold, PLAIN, None)
        } else if judged > hi {
            let high = ("high", hi);
            (Status::Caution, threshold, "reason-above-aim", Some(high))
        } else if judged < lo {
            (
                Status::Cold,
                threshold,
                "reason-below-aim",
                Some(("low", lo)),
            )
        } else {
            (Status::Ok, threshold, "reason-inside-aim", None)
        }
    } else {
        let caution = settings.cathode_bias_caution * 100.0;
        let threshold = once.words("threshold-cathode-bias", [max.0, caution, 0.0], || {
            once.say(
                "threshold-cathode-bias",
                &[("caution", &fixed(caution, 0)), ("rating", &rating())],
            )
        });
        if judged > 100.0 {
            (Status::Over, threshold, PLAIN, None)
        } else if judged > caution {
            let guide = ("caution", caution);
            (
                Status::Caution,
                threshold,
                "reason-above-guide",
                Some(guide),
            )
        } else {
            (Status::Ok, threshold, PLAIN, None)
        }
    };
    // "plate dissipation 19.7 W is 79 % of its 25 W rating, above the 70 %
    // aim": said once for each power in tenths of a watt and share in whole
    // percent (with or without the words on the mains and the screen
    // current).
    let flags = f64::from(u8::from(!at.is_empty()) + 2 * u8::from(!conservative.is_empty()));
    let reason = once.fixed_words(
        band,
        PLAIN,
        [(watts, 1), (judged, 0)],
        [max.0, flags],
        |[watts, pct]| {
            let mut what = once.say(
                PLAIN,
                &[("watts", &watts), ("pct", &pct), ("rating", &rating())],
            );
            what.push_str(&at);
            what.push_str(conservative);
            match (band, band_arg) {
                (PLAIN, _) => what,
                (_, Some((name, share))) => {
                    joined(what, &once.say(band, &[(name, &fixed(share, 0))]))
                }
                (_, None) => joined(what, &once.text(band)),
            }
        },
    );
    Verdict::new(status, reason, threshold)
}

/// `first, second`: what `format!("{first}, {second}")` writes, on the
/// first's own string.
pub(super) fn joined(mut first: String, second: &str) -> String {
    first.reserve(2 + second.len());
    first.push_str(", ");
    first.push_str(second);
    first
}

/// A voltage against its published maximum: caution above it (or when the
/// high-line projection passes it), over more than `over` (a fraction,
/// [`Settings::voltage_over`]) above it. `what` is the message that names
/// the voltage ("reason-plate-voltage").
fn max_verdict(
    what: &'static str,
    v: Volts,
    high: Volts,
    max: Volts,
    over: f64,
    once: &SaidOnce,
) -> Verdict {
    let factor = 1.0 + over;
    // The maximum in words, where a threshold or reason is made.
    let max_words = || {
        once.words("volts", [max.0, 0.0, 0.0], || {
            format_engineering(max.0, crate::units::QuantityKind::Voltage)
        })
    };
    let threshold = once.words("threshold-voltage-max", [max.0, factor, 0.0], || {
        once.say(
            "threshold-voltage-max",
            &[("max", &max_words()), ("over", &fixed(factor * 100.0, 0))],
        )
    });
    let of_max = |key: &'static str| {
        let pct = v / max * 100.0;
        let message = once.message(key);
        let say = |pct_words: &str, volts: &str| {
            message.format_str(&[
                ("what", &once.text(what)),
                ("volts", volts),
                ("pct", pct_words),
                ("max", &max_words()),
            ])
        };
        if message.uses("volts") {
            say(
                &fixed(pct, 0),
                &format_engineering(v.0, crate::units::QuantityKind::Voltage),
            )
        } else {
            // Without the reading ("plate voltage is 58 % of its
            // maximum"), the words are the share's in whole percent.
            once.whole_words(key, what, pct, [max.0, 0.0], |pct_words| say(pct_words, ""))
        }
    };
    if v.0 > max.0 * factor {
        Verdict::new(Status::Over, of_max("reason-voltage-of-max"), threshold)
    } else if v.0 > max.0 {
        Verdict::new(Status::Caution, of_max("reason-voltage-of-max"), threshold)
    } else if high.0 > max.0 {
        Verdict::new(
            Status::Caution,
            once.say(
                "reason-voltage-high-line",
                &[
                    ("what", &once.text(what)),
                    (
                        "high",
                        &format_engineering(high.0, crate::units::QuantityKind::Voltage),
                    ),
                    ("max", &max_words()),
                ],
            ),
            threshold,
        )
    } else {
        Verdict::ok(of_max("reason-voltage-within"), threshold)
    }
}

/// The other names in `list` than `pos`.
fn others(list: &[crate::job::Spanned<String>], pos: &str) -> Vec<String> {
    list.iter()
        .map(|v| v.value.clone())
        .filter(|v| v != pos)
        .collect()
}

fn window(
    ctx: &ValveContext,
    reading: &ValveReading,
    va: Volts,
    vk: Volts,
    max: Watts,
    c: &Current,
) -> TargetWindow {
    let pos = reading.position.value.as_str();
    let lo = ctx.settings.fixed_bias_low;
    let hi = ctx.settings.fixed_bias_high;
    let ia_lo = target_current(lo, max, va, vk);
    let ia_hi = target_current(hi, max, va, vk);
    // A sense resistor or probe carries the cathode current: add the screen
    // current where it is known, so the window matches what the meter shows.
    let ig2 = c.ig2.unwrap_or(Amps(0.0));
    let sense_resistor = ctx.circuit.sense_resistor_for(pos);
    let half = ctx.circuit.half_primary_for(pos);
    let sense = sense_resistor.map(|rs| {
        (
            (ia_lo + ig2) * rs.value.value,
            (ia_hi + ig2) * rs.value.value,
        )
    });
    let drop = half.map(|h| {
        let n = h.valves.len().max(1) as f64;
        (
            ia_lo * h.resistance.value * n,
            ia_hi * h.resistance.value * n,
        )
    });
    TargetWindow {
        low_pct: lo * 100.0,
        high_pct: hi * 100.0,
        plate_current_low_ma: ia_lo.0 * 1e3,
        plate_current_high_ma: ia_hi.0 * 1e3,
        sense_low_mv: sense.map(|s| s.0.0 * 1e3),
        sense_high_mv: sense.map(|s| s.1.0 * 1e3),
        primary_drop_low_volts: drop.map(|d| d.0.0),
        primary_drop_high_volts: drop.map(|d| d.1.0),
        probe_low_ma: Some((ia_lo + ig2).0 * 1e3),
        probe_high_ma: Some((ia_hi + ig2).0 * 1e3),
        plate_current_middle_ma: (ia_lo.0 + ia_hi.0) / 2.0 * 1e3,
        grid_for_middle_volts: None,
        grid_for_middle_unknown_reason: None,
        inside: c.ia.0 >= ia_lo.0 && c.ia.0 <= ia_hi.0,
        place: if c.ia.0 > ia_hi.0 {
            "above"
        } else if c.ia.0 < ia_lo.0 {
            "below"
        } else {
            "inside"
        },
        sense_resistor_ohms: sense_resistor.map(|r| r.value.value.0),
        sense_resistor_reference: sense_resistor.and_then(|r| r.reference.clone()),
        sense_now_mv: reading.sense.as_ref().map(|s| s.value.0 * 1e3),
        half_primary_ohms: half.map(|h| h.resistance.value.0),
        half_primary_shared_with: half.map(|h| others(&h.valves, pos)).unwrap_or_default(),
        primary_drop_now_volts: reading.primary_drop.as_ref().map(|d| d.value.0),
    }
}

/// A power rating in words ("25 W"), said once for each rating.
fn watts_words_once(w: Watts, once: &SaidOnce) -> String {
    once.words("watts", [w.0, 0.0, 0.0], || {
        format_engineering(w.0, crate::units::QuantityKind::Power)
    })
}

#[cfg(test)]
mod tests {
    use super::*;

    fn close(a: f64, b: f64, tol: f64) -> bool {
        (a - b).abs() <= tol
    }

    #[test]
    fn ohms_law_for_a_shared_cathode_resistor() {
        // Ohm's law, Ik = Vk / (n·Rk): 11.6 V across 130 Ω shared by two → 44.615 mA each.
        assert!(close(
            cathode_current_shared(Volts(11.6), Ohms(130.0), 2).0,
            0.044615,
            1e-6
        ));
        // Own resistor (n = 1): 12 V across 240 Ω → 50 mA (Ohm's law).
        assert!(close(
            cathode_current_shared(Volts(12.0), Ohms(240.0), 1).0,
            0.050,
            1e-12
        ));
    }

    #[test]
    fn transformer_resistance_method() {
        // Ohm's law, Ia = Vdrop / Rhalf: 3.5 V across 38 Ω feeding two valves → 46.05 mA each.
        assert!(close(
            plate_current_from_drop(Volts(3.5), Ohms(38.0), 2).0,
            0.046053,
            1e-6
        ));
    }

    #[test]
    fn screen_current_from_its_resistor() {
        // Ohm's law, Ig2 = (Vsupply − Vg2) / Rg2: (305 − 303.8) V / 470 Ω = 2.553 mA.
        assert!(close(
            screen_current(Volts(305.0), Volts(303.8), Ohms(470.0)).0,
            0.0025532,
            1e-7
        ));
    }

    #[test]
    fn joules_law_for_the_plate() {
        // Joule's law, Pa = (Va − Vk)·Ia: (338 − 11.6) V × 44.615 mA = 14.562 W.
        assert!(close(
            plate_dissipation(Volts(338.0), Volts(11.6), Amps(0.044615)).0,
            14.5624,
            1e-3
        ));
    }

    #[test]
    fn fixed_bias_target_current() {
        // Ia = f·Pa(max)/(Va − Vk) (domain notes, common practice bands 50–70 %):
        // 0.5 × 12 W / 314 V = 19.11 mA; 0.7 × 12 W / 314 V = 26.75 mA.
        assert!(close(
            target_current(0.5, Watts(12.0), Volts(314.0), Volts(0.0)).0,
            0.019108,
            1e-6
        ));
        assert!(close(
            target_current(0.7, Watts(12.0), Volts(314.0), Volts(0.0)).0,
            0.026752,
            1e-6
        ));
    }

    /// Derives a one-set job at nominal mains (120 V, +5 %) with `valves`,
    /// `circuit` and `readings`; returns the findings of the first valve read.
    fn derive_one(valves: &str, circuit: &str, readings: &str) -> (ValveFindings, Vec<String>) {
        derive_at("120V", valves, circuit, readings)
    }

    /// As [`derive_one`], with the set measured at `mains`.
    fn derive_at(
        mains: &str,
        valves: &str,
        circuit: &str,
        readings: &str,
    ) -> (ValveFindings, Vec<String>) {
        let text = format!(
            "job-format 1\njob id=\"T\"\nunit make=\"M\" model=\"N\"\nmains nominal=\"120V\" tolerance=\"5%\"\n\
             valves {{\n{valves}\n}}\ncircuit {{\n{circuit}\n}}\nmeasurements \"x\" mains=\"{mains}\" {{\n{readings}\n}}\n"
        );
        let ratings = crate::ratings::RatingsTable::builtin();
        let job = match crate::job::decode_with_ratings("t.kdl", &text, &ratings) {
            Ok(d) => d.job,
            Err(d) => panic!("{:?}\n{text}", d.problems),
        };
        let mut f = crate::calc::derive(&job, &ratings);
        let warnings = f.warnings.iter().map(|w| w.message.clone()).collect();
        (f.sets.remove(0).valves.remove(0), warnings)
    }

    const PAIR_6L6: &str = "valve V3 type=\"6L6GC\" role=output";

    /// The thresholds and ratings said once for a run of sets are those
    /// each set would say alone: two types with their own ratings, sets
    /// enough to be worked out on every core, in both built-in languages.
    #[test]
    fn words_said_once_are_each_sets_own() {
        let mut text = String::from(
            "job-format 1\njob id=\"T\"\nunit make=\"M\" model=\"N\"\n\
             mains nominal=\"230V\" tolerance=\"10%\"\nvalves {\n\
             valve V3 type=EL34 role=output\nvalve V4 type=\"6L6GC\" role=output\n\
             valve V5 type=EL84 role=output\n}\n\
             circuit {\nbias fixed\nscreen-resistor R1 value=\"1k\" rating=\"5W\" valve=V3 supply=B+1\n\
             screen-resistor R2 value=\"470\" rating=\"1W\" valve=V4 supply=B+1\n\
             node B+1 chart=\"450V\" tolerance=\"10%\"\n\
             filter-capacitor C1 value=\"50u\" rating=\"500V\" node=B+1\n}\n",
        );
        for i in 0..40 {
            let d = i as f64 * 3.0;
            text.push_str(&format!(
                "measurements \"s{i}\" mains=\"{}V\" {{\nnode B+1 \"{}V\" tolerance=\"{}%\"\n\
                 valve V3 plate=\"{}V\" screen=\"{}V\" current=\"{}mA\" method=shunt\n\
                 valve V4 plate=\"{}V\" screen=\"{}V\" current=\"{}mA\" method=probe\n\
                 valve V5 plate=\"{}V\" screen=\"{}V\" current=\"{}mA\" method=shunt\n}}\n",
                220 + i % 20,
                440.0 + d,
                5 + i % 3,
                430.0 + d,
                420.0 + d,
                30.0 + d,
                430.0 + d,
                425.0 + d,
                40.0 + d / 2.0,
                300.0 + d,
                290.0 + d,
                20.0 + d / 3.0,
            ));
        }
        let ratings = crate::ratings::RatingsTable::builtin();
        let job = crate::job::decode_with_ratings("t.kdl", &text, &ratings)
            .unwrap_or_else(|d| panic!("{:?}", d.problems))
            .job;
        for cat in [Catalogue::english(), &Catalogue::built_in("de").unwrap()] {
            let whole = crate::calc::derive_in(&job, &ratings, cat);
            assert_eq!(whole.sets.len(), 40);
            let mut thresholds = std::collections::BTreeSet::new();
            for (i, set) in whole.sets.iter().enumerate() {
                // The same set alone in a job: its words said afresh.
                let mut alone_job = job.clone();
                alone_job.measurements = vec![job.measurements[i].clone()];
                let alone = crate::calc::derive_in(&alone_job, &ratings, cat);
                let a = &alone.sets[0];
                for (v, w) in set.valves.iter().zip(&a.valves) {
                    assert_eq!(v.checks.len(), w.checks.len());
                    for (c, d) in v.checks.iter().zip(&w.checks) {
                        assert_eq!(c.verdict, d.verdict, "{} {}", v.position, c.check);
                        thresholds.insert(c.verdict.threshold.clone());
                    }
                }
                assert_eq!(set.valves.len(), 3);
                for (n, m) in set.nodes.iter().zip(&a.nodes) {
                    assert_eq!(n.verdict, m.verdict);
                    thresholds.insert(n.verdict.threshold.clone());
                }
                for (r, s) in set.screen_resistors.iter().zip(&a.screen_resistors) {
                    assert_eq!(r.verdict, s.verdict);
                    thresholds.insert(r.verdict.threshold.clone());
                }
                assert_eq!(set.screen_resistors.len(), 2);
                for (c, d) in set.filter_capacitors.iter().zip(&a.filter_capacitors) {
                    assert_eq!(c.verdict, d.verdict);
                }
                assert_eq!(set.filter_capacitors.len(), 1);
            }
            // Each type's and each tolerance's own words, not the first ones said.
            assert!(thresholds.len() >= 14, "{thresholds:#?}");
        }
    }

    #[test]
    fn bias_probe_reads_cathode_current() {
        let (v, _) = derive_one(
            PAIR_6L6,
            "bias fixed",
            "valve V3 plate=\"420V\" current=\"40mA\" method=probe",
        );
        assert_eq!(v.method, Some(CurrentMethod::Probe));
        // A probe reads Ik; no screen figure, so Ia = Ik, conservative (domain notes): 40 mA.
        assert_eq!(v.cathode_current_ma, Some(40.0));
        assert!(v.plate_current_includes_screen);
        // Joule's law (textbook), cathode grounded: 420 V × 40 mA = 16.8 W; 6L6GC Pa(max) 30 W from memory → 56 %.
        assert!(close(v.plate_dissipation_w.unwrap(), 16.8, 1e-9));
        assert!(close(v.plate_dissipation_pct.unwrap(), 56.0, 1e-9));
        // Target window, common practice 50–70 %: 15 W / 420 V = 35.714 mA … 21 W / 420 V = 50 mA, as the probe shows it.
        let w = v.target_window.unwrap();
        assert!(close(w.probe_low_ma.unwrap(), 35.7143, 1e-4));
        assert!(close(w.probe_high_ma.unwrap(), 50.0, 1e-9));
        assert!(w.inside);
        assert_eq!(v.status, Status::Ok);
    }

    #[test]
    fn shunt_reads_plate_current() {
        let (v, _) = derive_one(
            PAIR_6L6,
            "bias fixed",
            "valve V3 plate=\"420V\" current=\"38mA\" method=shunt",
        );
        assert_eq!(v.method, Some(CurrentMethod::Shunt));
        // The shunt carries the plate current only: Ia = 38 mA (domain notes).
        assert_eq!(v.plate_current_ma, Some(38.0));
        assert!(!v.plate_current_includes_screen);
        // Joule's law (textbook): 420 V × 38 mA = 15.96 W, 53.2 % of 30 W (6L6GC, from memory).
        assert!(close(v.plate_dissipation_w.unwrap(), 15.96, 1e-9));
    }

    #[test]
    fn fixed_bias_below_the_aim_is_cold() {
        let (v, _) = derive_one(
            PAIR_6L6,
            "bias fixed",
            "valve V3 plate=\"420V\" current=\"25mA\" method=shunt",
        );
        // 420 V × 25 mA = 10.5 W = 35 % of 30 W: below the 50 % aim, common practice ("cold", crossover risk).
        assert!(close(v.plate_dissipation_pct.unwrap(), 35.0, 1e-9));
        assert_eq!(v.status, Status::Cold);
        assert!(!v.target_window.unwrap().inside);
    }

    #[test]
    fn cold_is_judged_on_the_figure_the_reason_gives() {
        // Read at 112 V on a 120 V supply: 420 V × 34.2857 mA = 14.4 W = 48 % of 30 W (6L6GC, from memory),
        // but referred to nominal mains (common practice, P·(Vn/Vm)²) 48 % × (120/112)² = 55.1 %: inside the 50–70 % aim.
        let (v, _) = derive_at(
            "112V",
            PAIR_6L6,
            "bias fixed",
            "valve V3 plate=\"420V\" current=\"34.2857mA\" method=shunt",
        );
        assert!(close(v.plate_dissipation_pct.unwrap(), 48.0, 1e-3));
        assert!(close(
            v.corrected_plate_dissipation_pct.unwrap(),
            55.102,
            1e-3
        ));
        let d = v
            .checks
            .iter()
            .find(|c| c.check == "plate_dissipation")
            .unwrap();
        assert_eq!(d.verdict.status, Status::Ok, "{}", d.verdict.reason);
        assert!(
            d.verdict
                .reason
                .contains("55 % of its 30 W rating at nominal mains, inside the aim"),
            "{}",
            d.verdict.reason
        );
        // Cold at both mains: 40 % read, 40 % × (120/112)² = 45.9 % at nominal.
        let (v, _) = derive_at(
            "112V",
            PAIR_6L6,
            "bias fixed",
            "valve V3 plate=\"420V\" current=\"28.5714mA\" method=shunt",
        );
        assert_eq!(v.status, Status::Cold);
    }

    #[test]
    fn own_cathode_resistor_with_a_known_screen_current() {
        let (v, _) = derive_one(
            "valve V1 type=EL84 role=output",
            "bias cathode\ncathode-resistor R1 value=\"270\" valves=\"V1\"\nscreen-resistor R2 value=\"1k\" valve=V1 supply=B+2",
            "node B+2 \"300V\"\nvalve V1 plate=\"320V\" screen=\"296V\" cathode=\"10.8V\"",
        );
        assert_eq!(v.method, Some(CurrentMethod::OwnCathodeResistor));
        // Ohm's law (textbook): Ik = 10.8 V / 270 Ω = 40 mA; Ig2 = (300 − 296) V / 1 kΩ = 4 mA; Ia = Ik − Ig2 = 36 mA (domain notes).
        assert!(close(v.cathode_current_ma.unwrap(), 40.0, 1e-9));
        assert!(close(v.screen_current_ma.unwrap(), 4.0, 1e-9));
        assert!(close(v.plate_current_ma.unwrap(), 36.0, 1e-9));
        // Joule's law (textbook): (320 − 10.8) V × 36 mA = 11.1312 W = 92.76 % of 12 W (EL84, from memory).
        assert!(close(v.plate_dissipation_w.unwrap(), 11.1312, 1e-9));
        // Pg2 = (Vg2 − Vk)·Ig2 (textbook): (296 − 10.8) V × 4 mA = 1.1408 W = 57.04 % of 2 W (EL84, from memory).
        assert!(close(v.screen_dissipation_w.unwrap(), 1.1408, 1e-9));
        assert!(close(v.screen_dissipation_pct.unwrap(), 57.04, 1e-9));
        let screen = v
            .checks
            .iter()
            .find(|c| c.check == "screen_dissipation")
            .unwrap();
        assert_eq!(screen.verdict.status, Status::Ok);
        assert_eq!(
            screen.verdict.threshold,
            "over above 100 % of 2 W; caution when the high-line projection is above it"
        );
        // Cathode bias, common practice: caution above 90 %.
        assert_eq!(v.status, Status::Caution);
        assert!(v.target_window.is_none());
        // EL84 Ik(max) 65 mA in the built-in table (from memory): 40/65 = 61.5 %.
        assert!(close(v.cathode_current_pct.unwrap(), 61.538, 1e-3));
    }

    #[test]
    fn an_output_valve_without_a_current_reading_is_noted() {
        let (v, warnings) = derive_one(PAIR_6L6, "bias fixed", "valve V3 plate=\"420V\"");
        assert_eq!(v.plate_dissipation_w, None);
        assert!(
            warnings
                .iter()
                .any(|w| w.contains("no reading gives the idle current")),
            "{warnings:?}"
        );
    }

    #[test]
    fn the_reasons_are_the_catalogues_words() {
        // 330 V on a 300 V maximum is 110 % of it (EL84's Va(max) from memory).
        let v = max_verdict(
            "reason-plate-voltage",
            Volts(330.0),
            Volts(340.0),
            Volts(300.0),
            Settings::default().voltage_over,
            &SaidOnce::new(Catalogue::english()),
        );
        let english = Catalogue::english();
        assert_eq!(
            v.reason,
            "plate voltage 330 V is 110 % of its 300 V maximum"
        );
        assert_eq!(
            v.reason,
            english.format(
                "reason-voltage-of-max",
                &[
                    ("what", Arg::from("plate voltage")),
                    ("volts", Arg::from("330 V")),
                    ("pct", Arg::from("110")),
                    ("max", Arg::from("300 V")),
                ],
            )
        );
        assert!(v.threshold.starts_with("caution above the 300 V maximum"));
    }

    #[test]
    fn voltage_maxima() {
        // Va(max) 300 V (EL84, from memory). Common practice in this tool: caution above the maximum or
        // when the high-line projection passes it, over above 120 % of it.
        let s = |v: f64, high: f64| {
            max_verdict(
                "reason-plate-voltage",
                Volts(v),
                Volts(high),
                Volts(300.0),
                Settings::default().voltage_over,
                &SaidOnce::new(Catalogue::english()),
            )
            .status
        };
        assert_eq!(s(290.0, 299.0), Status::Ok);
        assert_eq!(s(290.0, 304.5), Status::Caution); // 290 V × 1.05 = 304.5 V at high line
        assert_eq!(s(301.0, 301.0), Status::Caution);
        assert_eq!(s(360.0, 360.0), Status::Caution); // exactly 120 %
        assert_eq!(s(360.5, 360.5), Status::Over);
    }

    #[test]
    fn bands_for_fixed_and_cathode_bias() {
        let s = Settings::default();
        let v = |bias, pct: f64| {
            dissipation_verdict(
                &s,
                bias,
                true,
                pct,
                pct,
                Watts(pct / 10.0),
                Watts(10.0),
                "",
                &SaidOnce::new(Catalogue::english()),
            )
            .status
        };
        // Common practice: fixed bias aim 50–70 %, cold below 50 %, caution above 70 %, over above 100 %.
        assert_eq!(v(BiasKind::Fixed, 45.0), Status::Cold);
        assert_eq!(v(BiasKind::Fixed, 60.0), Status::Ok);
        assert_eq!(v(BiasKind::Fixed, 75.0), Status::Caution);
        assert_eq!(v(BiasKind::Fixed, 101.0), Status::Over);
        // Common practice: cathode bias caution above 90 %, over above 100 %.
        assert_eq!(v(BiasKind::Cathode, 45.0), Status::Ok);
        assert_eq!(v(BiasKind::Cathode, 89.0), Status::Ok);
        assert_eq!(v(BiasKind::Cathode, 95.0), Status::Caution);
        assert_eq!(v(BiasKind::Cathode, 121.0), Status::Over);
    }
}
