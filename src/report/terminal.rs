//! The terminal summary printed by `ampreport check`: per measurement set a
//! table of valves and of nodes, the stressed parts, then the warnings in
//! plain sentences. Colour only when asked to (the caller decides).

use super::attention::{self, Attention};
use super::table::{Align, TextTable};
use crate::calc::{Findings, SetFindings, Status, ValveFindings, Verdict};
use crate::job::Job;
use crate::units::{QuantityKind as Q, format_engineering, format_fixed};

/// Options for the summary.
pub struct TerminalStyle {
    pub colour: bool,
}

fn paint(style: &TerminalStyle, status: Status, text: &str) -> String {
    if !style.colour {
        return text.to_string();
    }
    let code = match status {
        Status::Ok => "32",
        Status::Cold => "36",
        Status::Caution => "33",
        Status::Over => "1;31",
    };
    format!("\x1b[{code}m{text}\x1b[0m")
}

fn bold(style: &TerminalStyle, text: &str) -> String {
    if style.colour {
        format!("\x1b[1m{text}\x1b[0m")
    } else {
        text.to_string()
    }
}

/// The status word as shown in the terminal: upper case when not ok, so it
/// stands out without colour.
pub fn status_word(s: Status) -> String {
    match s {
        Status::Ok => "ok".to_string(),
        other => other.word().to_uppercase(),
    }
}

/// A state word ("ok", "caution", "accepted" …) as shown in the terminal.
fn state_word(state: &str) -> String {
    match state {
        "ok" => "ok".to_string(),
        "accepted" => "accepted".to_string(),
        other => other.to_uppercase(),
    }
}

/// A table's status cell: the state and, when not ok, why.
fn status_cell(state: &str, why: &str) -> String {
    if why.is_empty() || state == "ok" {
        state_word(state)
    } else {
        format!("{} ({why})", state_word(state))
    }
}

fn verdict_cell(v: &Verdict) -> String {
    status_cell(attention::state(v), &attention::why(v))
}

fn valve_cell(v: &ValveFindings) -> String {
    status_cell(attention::valve_state(v), &attention::valve_why(v))
}

/// The status a row is painted with: the one that still counts.
fn paint_status(v: &Verdict) -> Status {
    if v.accepted { Status::Ok } else { v.status }
}

fn opt(v: Option<f64>, f: impl Fn(f64) -> String) -> String {
    v.map(f).unwrap_or_else(|| "–".to_string())
}

fn volts(v: f64) -> String {
    format_engineering(v, Q::Voltage)
}

fn ma(v: f64) -> String {
    format!("{} mA", format_fixed(v, 1))
}

fn pct(v: f64) -> String {
    format!("{} %", format_fixed(v, 0))
}

pub fn render(job: &Job, findings: &Findings, style: &TerminalStyle) -> String {
    let mut out = String::new();
    let unit = &job.unit;
    out.push_str(&bold(
        style,
        &format!("Job {}: {} {}", findings.job.id, unit.make, unit.model),
    ));
    if let Some(serial) = &unit.serial {
        out.push_str(&format!(", serial {serial}"));
    }
    out.push('\n');
    let m = &findings.mains;
    out.push_str(&format!(
        "Mains: nominal {}, high line {} (+{} %){}\n",
        volts(m.nominal_volts),
        volts(m.high_line_volts),
        format_fixed(m.tolerance_pct, 0),
        m.design_volts
            .map(|d| format!(", chart drawn at {}", volts(d)))
            .unwrap_or_default()
    ));

    let summary = super::summary::summary(job, findings);
    for line in summary
        .found
        .iter()
        .chain(&summary.done)
        .chain(&summary.now)
    {
        out.push_str(&format!("{line}\n"));
    }

    for set in &findings.sets {
        out.push('\n');
        out.push_str(&render_set(findings, set, style));
    }

    out.push('\n');
    if !findings.safety.is_empty() {
        out.push_str(&bold(style, "Safety tests"));
        out.push('\n');
        let mut t = TextTable::new(&[
            ("test", Align::Left),
            ("reading", Align::Right),
            ("limit", Align::Left),
            ("status", Align::Left),
        ]);
        for s in &findings.safety {
            t.row(vec![
                s.test.replace('_', " "),
                s.measured.clone(),
                s.limit.clone(),
                if s.passed {
                    "pass".into()
                } else {
                    "FAIL".into()
                },
            ]);
        }
        let statuses: Vec<Status> = findings.safety.iter().map(|s| s.verdict.status).collect();
        out.push_str(&render_painted(&t, style, &statuses));
        out.push('\n');
    }

    let figured: Vec<_> = findings
        .mods
        .iter()
        .filter(|m| !m.figures.is_empty())
        .collect();
    if !figured.is_empty() {
        out.push_str(&bold(style, "Modification figures"));
        out.push('\n');
        for m in figured {
            out.push_str(&format!("  {}\n", m.what));
            for f in &m.figures {
                out.push_str(&format!("    {}  [{}]\n", f.description, f.formula));
            }
        }
        out.push('\n');
    }

    out.push_str(&render_attention(&attention::attention(findings), style));
    out
}

/// The warnings, grouped: the final set's open findings, what was
/// accepted, job-wide findings, then one line per part or valve for each
/// earlier set.
fn render_attention(a: &Attention, style: &TerminalStyle) -> String {
    let mut out = String::new();
    let tag = |status: Status, word: &str| paint(style, status, &format!("[{word}]"));
    let final_words = a
        .final_label
        .as_ref()
        .map(|l| format!("\u{201c}{l}\u{201d}, the final set"))
        .unwrap_or_else(|| "the final set".to_string());
    if a.open.is_empty() {
        out.push_str(&format!(
            "No open findings in {final_words}: every figure is inside its limits or accepted.\n"
        ));
    } else {
        out.push_str(&bold(
            style,
            &format!("Open findings in {final_words} ({})", a.open.len()),
        ));
        out.push('\n');
        for e in &a.open {
            out.push_str(&format!(
                "  {} {}: {}\n",
                tag(e.status, &status_word(e.status)),
                e.subject,
                e.lines.join(" ")
            ));
        }
    }
    if !a.accepted.is_empty() {
        out.push_str(&bold(
            style,
            &format!("Accepted by the technician ({})", a.accepted.len()),
        ));
        out.push('\n');
        for e in &a.accepted {
            out.push_str(&format!(
                "  [accepted] {} ({}, {}): {} ({}, {})\n",
                e.subject,
                e.status.word(),
                e.brief,
                e.accepted_reason,
                e.by,
                e.date
            ));
        }
    }
    if !a.job_wide.is_empty() {
        out.push_str(&bold(style, "For the whole job"));
        out.push('\n');
        for e in &a.job_wide {
            out.push_str(&format!(
                "  {} {}: {}\n",
                tag(e.status, &status_word(e.status)),
                e.subject,
                e.lines.join(" ")
            ));
        }
    }
    for h in &a.history {
        out.push_str(&bold(
            style,
            &format!("What was found in \u{201c}{}\u{201d}", h.label),
        ));
        out.push('\n');
        for e in &h.entries {
            out.push_str(&format!(
                "  {} {}: {}\n",
                tag(e.status, &status_word(e.status)),
                e.subject,
                e.lines.join(", ")
            ));
        }
    }
    out
}

fn render_painted(t: &TextTable, style: &TerminalStyle, statuses: &[Status]) -> String {
    // Paint the last column (the status word) of each row by its status.
    let last = t.columns().saturating_sub(1);
    t.render_with(2, &|row, col, cell| match statuses.get(row) {
        Some(&status) if col == last && style.colour && status != Status::Ok => {
            paint(style, status, cell.trim_end())
        }
        _ => cell.to_string(),
    })
}

fn render_set(findings: &Findings, set: &SetFindings, style: &TerminalStyle) -> String {
    let mut out = String::new();
    let date = set
        .date
        .as_ref()
        .map(|d| format!(", {d}"))
        .unwrap_or_default();
    let final_mark = if set.is_final {
        ", final: as handed over"
    } else {
        ""
    };
    out.push_str(&bold(
        style,
        &format!(
            "── {}{final_mark} (mains {}, factor {:.3} to nominal{date}) ──",
            set.label,
            volts(set.mains_volts),
            set.correction_factor
        ),
    ));
    out.push('\n');

    for l in &findings.line_up {
        if let Some(c) = l.changes.iter().find(|c| c.set == set.label) {
            out.push_str(&format!(
                "Fitted for these readings: {} {} (line-up: {})\n",
                l.position, c.valve_type, l.valve_type
            ));
        }
    }
    for b in &set.bias_controls {
        match &b.label {
            Some(l) => out.push_str(&format!("Bias control {l}: {}\n", b.position)),
            None => out.push_str(&format!("Bias control: {}\n", b.position)),
        }
    }
    if !set.valves.is_empty() {
        out.push_str("Valves\n");
        let mut t = TextTable::new(&[
            ("pos", Align::Left),
            ("type", Align::Left),
            ("bias", Align::Left),
            ("Va", Align::Right),
            ("Vk", Align::Right),
            ("current", Align::Right),
            ("Pa", Align::Right),
            ("% max", Align::Right),
            ("high line", Align::Right),
            ("status", Align::Left),
        ]);
        for v in &set.valves {
            let current = match (v.plate_current_ma, v.plate_current_includes_screen) {
                (Some(ia), true) => format!("Ik {}", ma(ia)),
                (Some(ia), false) => format!("Ia {}", ma(ia)),
                (None, _) => "–".into(),
            };
            let position = match &v.channel {
                Some(c) => format!("{} ({c})", v.position),
                None => v.position.clone(),
            };
            t.row(vec![
                position,
                v.valve_type.clone(),
                v.bias.clone(),
                opt(v.plate_volts, volts),
                opt(v.cathode_volts, volts),
                current,
                opt(v.plate_dissipation_w, |w| {
                    format!("{} W", format_fixed(w, 1))
                }),
                opt(v.plate_dissipation_pct, pct),
                opt(v.high_line_plate_dissipation_pct, pct),
                valve_cell(v),
            ]);
        }
        let statuses: Vec<Status> = set.valves.iter().map(|v| v.open_status).collect();
        out.push_str(&render_painted(&t, style, &statuses));
        for v in &set.valves {
            if let Some(w) = &v.target_window {
                let mut parts = vec![format!(
                    "Ia {}–{}",
                    ma(w.plate_current_low_ma),
                    ma(w.plate_current_high_ma)
                )];
                if let (Some(a), Some(b)) = (w.sense_low_mv, w.sense_high_mv) {
                    parts.push(format!(
                        "{}–{} mV across the sense resistor",
                        format_fixed(a, 1),
                        format_fixed(b, 1)
                    ));
                }
                if let (Some(a), Some(b)) = (w.primary_drop_low_volts, w.primary_drop_high_volts) {
                    parts.push(format!(
                        "{}–{} V across the half primary",
                        format_fixed(a, 2),
                        format_fixed(b, 2)
                    ));
                }
                if let Some(g) = w.grid_for_middle_volts {
                    parts.push(format!(
                        "grid about {} for the middle{} (estimate)",
                        volts(g),
                        v.grid_volts
                            .map(|now| format!(", now {}", volts(now)))
                            .unwrap_or_default()
                    ));
                }
                out.push_str(&format!(
                    "  {} target window {:.0}–{:.0} %: {}{}\n",
                    v.position,
                    w.low_pct,
                    w.high_pct,
                    parts.join(", "),
                    if w.inside { " (inside)" } else { " (outside)" }
                ));
            }
        }
        if set
            .valves
            .iter()
            .any(|v| v.plate_current_includes_screen && v.plate_current_ma.is_some())
        {
            out.push_str("  Ik: plate current taken as the cathode current, including screen current (conservative).\n");
        }
    }

    if !set.warm_up.is_empty() {
        out.push_str("Warm-up (idle current after power-on)\n");
        let mut t = TextTable::new(&[
            ("valve", Align::Left),
            ("after", Align::Right),
            ("current", Align::Right),
            ("Pa % max", Align::Right),
        ]);
        for p in &set.warm_up {
            t.row(vec![
                p.position.clone(),
                format!("{} min", format_fixed(p.minutes, 1)),
                opt(p.current_ma, |i| {
                    format!("{} {}", if p.includes_screen { "Ik" } else { "Ia" }, ma(i))
                }),
                opt(p.plate_dissipation_pct, pct),
            ]);
        }
        out.push_str(&t.render_with(2, &|_, _, cell| cell.to_string()));
    }
    if !set.nodes.is_empty() {
        out.push_str("Supply nodes\n");
        let mut t = TextTable::new(&[
            ("node", Align::Left),
            ("measured", Align::Right),
            ("corrected", Align::Right),
            ("expected", Align::Right),
            ("deviation", Align::Right),
            ("status", Align::Left),
        ]);
        for n in &set.nodes {
            t.row(vec![
                n.name.clone(),
                volts(n.measured_volts),
                volts(n.corrected_volts),
                opt(n.expected_volts, volts),
                opt(n.deviation_pct, |d| format!("{d:+.1} %")),
                verdict_cell(&n.verdict),
            ]);
        }
        let statuses: Vec<Status> = set.nodes.iter().map(|n| paint_status(&n.verdict)).collect();
        out.push_str(&render_painted(&t, style, &statuses));
    }

    let resistors: Vec<_> = set
        .droppers
        .iter()
        .chain(&set.cathode_resistors)
        .chain(&set.screen_resistors)
        .collect();
    if !resistors.is_empty() || !set.filter_capacitors.is_empty() || !set.not_checked.is_empty() {
        out.push_str("Stressed parts\n");
        let mut t = TextTable::new(&[
            ("part", Align::Left),
            ("where", Align::Left),
            ("stress", Align::Right),
            ("rating", Align::Right),
            ("% / margin", Align::Right),
            ("status", Align::Left),
        ]);
        let mut statuses = Vec::new();
        for r in &resistors {
            t.row(vec![
                r.reference.clone(),
                r.place.clone(),
                crate::calc::resistor_power_words(r.power_w),
                opt(r.rating_w, |w| format_engineering(w, Q::Power)),
                opt(r.power_pct, pct),
                verdict_cell(&r.verdict),
            ]);
            statuses.push(paint_status(&r.verdict));
        }
        for c in &set.filter_capacitors {
            t.row(vec![
                c.reference.clone(),
                c.node.clone(),
                format!("{} peak", volts(c.highest_volts)),
                volts(c.rating_volts),
                format!("{} % left", format_fixed(c.margin_pct, 1)),
                verdict_cell(&c.verdict),
            ]);
            statuses.push(paint_status(&c.verdict));
        }
        for n in &set.not_checked {
            t.row(vec![
                n.reference.clone(),
                n.place.clone(),
                "–".into(),
                "–".into(),
                "–".into(),
                format!("not checked ({})", n.reason),
            ]);
            statuses.push(Status::Ok);
        }
        out.push_str(&render_painted(&t, style, &statuses));
    }
    if let Some(r) = &set.rectifier {
        out.push_str(&format!(
            "Rectifier {} ({}): at least {:.0} mA of {:.0} mA ({:.0} %) {}\n",
            r.position,
            r.valve_type,
            r.load_at_least_ma,
            r.rating_ma,
            r.load_pct,
            paint(style, paint_status(&r.verdict), &verdict_cell(&r.verdict))
        ));
    }
    for h in &set.heaters {
        out.push_str(&format!(
            "Heater: {} against {} ({:+.1} %) {}\n",
            volts(h.measured_volts),
            volts(h.nominal_volts),
            h.deviation_pct,
            paint(style, paint_status(&h.verdict), &verdict_cell(&h.verdict))
        ));
    }
    out.push_str(&render_suggestions(set));
    out.push_str(&render_bench(set, style));
    out
}

fn ohms(v: f64) -> String {
    format_engineering(v, Q::Resistance)
}

fn hz(v: f64) -> String {
    format_engineering(v, Q::Frequency)
}

fn channel(c: &Option<String>) -> String {
    c.as_ref().map(|c| format!(" [{c}]")).unwrap_or_default()
}

/// The cathode-resistor suggestions of a set: the estimate, the preferred
/// values and what each would give.
fn render_suggestions(set: &SetFindings) -> String {
    let mut out = String::new();
    for s in &set.cathode_resistor_suggestions {
        out.push_str(&format!(
            "Cathode resistor {} ({}, now {}): for {:.0} % of Pa max ({} W) the three-halves law gives {}\n",
            s.reference,
            s.valves.join(", "),
            ohms(s.present_ohms),
            s.target_pct,
            format_fixed(s.target_plate_dissipation_w, 1),
            s.exact_ohms
                .map(ohms)
                .unwrap_or_else(|| "no resistor (out of reach)".to_string())
        ));
        for o in &s.options {
            out.push_str(&format!(
                "  {} {}: Vk {}, {} each, Pa {} W ({:.0} %); the resistor dissipates {} W: rate it {} W or more (a {} part)\n",
                o.series,
                ohms(o.resistance_ohms),
                volts(o.cathode_volts),
                ma(o.cathode_current_ma),
                format_fixed(o.plate_dissipation_w, 1),
                o.plate_dissipation_pct,
                format_fixed(o.resistor_power_w, 2),
                format_fixed(o.resistor_rating_at_least_w, 1),
                format_engineering(o.resistor_rating_w, Q::Power)
            ));
        }
        out.push_str(&format!(
            "  An estimate from one set of readings ({}, μg1g2 {}); measure the bias again after the change.\n",
            s.calibrated_on,
            crate::units::format_sig(s.mu_g1g2, 3)
        ));
    }
    out
}

/// Output power, hum and noise, response and gain of a set.
fn render_bench(set: &SetFindings, style: &TerminalStyle) -> String {
    let b = &set.bench;
    if b.is_empty() {
        return String::new();
    }
    let mut out = String::from("Bench tests\n");
    for p in &b.output_power {
        let read = match p.reading {
            crate::job::AcReading::Rms => format!("{} rms", volts(p.reading_volts)),
            crate::job::AcReading::PeakToPeak => format!(
                "{} p-p = {} rms",
                volts(p.reading_volts),
                volts(p.rms_volts)
            ),
        };
        out.push_str(&format!(
            "  Output power{}: {read} into {} at {}, {} = {} W{} {}\n",
            channel(&p.channel),
            ohms(p.load_ohms),
            hz(p.frequency_hz),
            p.condition_words,
            format_fixed(p.output_power_w, 1),
            p.output_power_pct_of_rated
                .map(|pct| format!(" ({} of rated)", self::pct(pct)))
                .unwrap_or_default(),
            paint(style, p.verdict.status, &status_word(p.verdict.status))
        ));
    }
    for h in &b.hum_noise {
        out.push_str(&format!(
            "  Hum and noise{}: {} mV ({:+.1} dBV), input {}{}{} {}\n",
            channel(&h.channel),
            format_fixed(h.hum_noise_mv, 2),
            h.hum_noise_dbv,
            h.input,
            h.volume
                .as_ref()
                .map(|v| format!(", volume {v}"))
                .unwrap_or_default(),
            h.hum_noise_db_below_full
                .map(|db| format!(", {} dB below full output", format_fixed(db, 1)))
                .unwrap_or_default(),
            paint(style, h.verdict.status, &status_word(h.verdict.status))
        ));
    }
    for r in &b.responses {
        out.push_str(&format!(
            "  Response{} against {}{}:\n",
            channel(&r.channel),
            hz(r.reference_hz),
            r.input_volts
                .map(|v| format!(", {} in", volts(v)))
                .unwrap_or_default()
        ));
        let mut t = TextTable::new(&[
            ("frequency", Align::Right),
            ("output", Align::Right),
            ("dB", Align::Right),
        ]);
        for p in &r.points {
            t.row(vec![
                hz(p.frequency_hz),
                volts(p.output_volts),
                format!("{:+.1}", p.response_db),
            ]);
        }
        out.push_str(&t.render_with(4, &|_, _, cell| cell.to_string()));
        let side = |f: Option<f64>, edge: f64, dir: &str| match f {
            Some(f) => hz(f),
            None => format!("{dir} {} (not reached)", hz(edge)),
        };
        out.push_str(&format!(
            "    −3 dB: {} and {}\n",
            side(r.minus_3db_low_hz, r.lowest_hz, "below"),
            side(r.minus_3db_high_hz, r.highest_hz, "above")
        ));
    }
    for g in &b.gains {
        out.push_str(&format!(
            "  Gain{}: {} in for {} out at {} = ×{} ({} dB)\n",
            channel(&g.channel),
            volts(g.input_volts),
            volts(g.output_volts),
            hz(g.frequency_hz),
            crate::units::format_sig(g.gain_times, 3),
            format_fixed(g.gain_db, 1)
        ));
    }
    out
}
