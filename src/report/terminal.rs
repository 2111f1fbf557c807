//! The terminal summary printed by `ampreport check`: per measurement set a
//! table of valves and of nodes, the stressed parts, then the warnings in
//! plain sentences. Colour only when asked to (the caller decides).

use super::attention::{self, Attention};
use super::table::{Align, TextTable};
use crate::calc::{Findings, SetFindings, Status, ValveFindings, Verdict};
use crate::catalogue::{Arg, Catalogue};
use crate::job::Job;
use crate::units::{QuantityKind as Q, format_engineering, format_fixed};

/// Options for the summary.
pub struct TerminalStyle {
    pub colour: bool,
    /// The fixed words, in the shop's language.
    pub catalogue: Catalogue,
}

impl TerminalStyle {
    /// A message of the catalogue.
    fn t(&self, key: &str) -> String {
        self.catalogue.text(key)
    }

    /// A message of the catalogue with its arguments.
    fn f(&self, key: &str, args: &[(&str, String)]) -> String {
        let args: Vec<(&str, Arg)> = args.iter().map(|(k, v)| (*k, Arg::from(v))).collect();
        self.catalogue.format(key, &args)
    }

    /// A table whose headers are messages of the catalogue.
    fn table(&self, columns: &[(&str, Align)]) -> TextTable {
        let words: Vec<String> = columns.iter().map(|(k, _)| self.t(k)).collect();
        let headers: Vec<(&str, Align)> = words
            .iter()
            .zip(columns)
            .map(|(w, (_, a))| (w.as_str(), *a))
            .collect();
        TextTable::new(&headers)
    }
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
pub fn status_word(s: Status, catalogue: &Catalogue) -> String {
    state_word(s.word(), catalogue)
}

/// A state word ("ok", "caution", "accepted" …) as shown in the terminal
/// (`term-state-…` in the catalogue; upper case for a state it lacks).
fn state_word(state: &str, catalogue: &Catalogue) -> String {
    catalogue
        .try_format(&format!("term-state-{state}"), &[])
        .unwrap_or_else(|| state.to_uppercase())
}

/// A table's status cell: the state and, when not ok, why.
fn status_cell(state: &str, why: &str, style: &TerminalStyle) -> String {
    if why.is_empty() || state == "ok" {
        state_word(state, &style.catalogue)
    } else {
        format!("{} ({why})", state_word(state, &style.catalogue))
    }
}

fn verdict_cell(v: &Verdict, style: &TerminalStyle) -> String {
    status_cell(attention::state(v), &attention::why(v), style)
}

fn valve_cell(v: &ValveFindings, style: &TerminalStyle) -> String {
    status_cell(attention::valve_state(v), &attention::valve_why(v), style)
}

/// The status a row is painted with: the one that still counts.
fn paint_status(v: &Verdict) -> Status {
    if v.accepted { Status::Ok } else { v.status }
}

/// The kind of bias ("cathode", "fixed") in the reader's words.
fn bias_words(bias: &str, style: &TerminalStyle) -> String {
    style
        .catalogue
        .try_format(&format!("term-bias-{bias}"), &[])
        .unwrap_or_else(|| bias.to_string())
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
        &style.f(
            "term-job",
            &[
                ("id", findings.job.id.clone()),
                ("make", unit.make.clone()),
                ("model", unit.model.clone()),
            ],
        ),
    ));
    if let Some(serial) = &unit.serial {
        out.push_str(&format!(
            ", {}",
            style.f("term-serial", &[("serial", serial.clone())])
        ));
    }
    out.push('\n');
    let m = &findings.mains;
    out.push_str(&format!(
        "{}{}\n",
        style.f(
            "term-mains",
            &[
                ("nominal", volts(m.nominal_volts)),
                ("high_line", volts(m.high_line_volts)),
                ("tolerance", format_fixed(m.tolerance_pct, 0)),
            ],
        ),
        m.design_volts
            .map(|d| format!(", {}", style.f("term-chart-drawn", &[("design", volts(d))])))
            .unwrap_or_default()
    ));

    let summary = super::summary::summary(job, findings, &style.catalogue);
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
        out.push_str(&bold(style, &style.t("term-safety")));
        out.push('\n');
        let mut t = style.table(&[
            ("term-col-test", Align::Left),
            ("term-col-reading", Align::Right),
            ("term-col-limit", Align::Left),
            ("term-col-status", Align::Left),
        ]);
        for s in &findings.safety {
            t.row(vec![
                crate::calc::safety_test_words(s.test, &style.catalogue),
                s.measured.clone(),
                s.limit.clone(),
                if s.passed {
                    style.t("term-pass")
                } else {
                    style.t("term-fail")
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
        out.push_str(&bold(style, &style.t("term-mod-figures")));
        out.push('\n');
        for m in figured {
            out.push_str(&format!("  {}\n", m.what));
            for f in &m.figures {
                out.push_str(&format!("    {}  [{}]\n", f.description, f.formula));
            }
        }
        out.push('\n');
    }

    out.push_str(&render_attention(
        &attention::attention(findings, &style.catalogue),
        style,
    ));
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
        .map(|l| style.f("term-final-set-labelled", &[("label", l.clone())]))
        .unwrap_or_else(|| style.t("term-final-set"));
    if a.open.is_empty() {
        out.push_str(&style.f("term-no-open", &[("set", final_words)]));
        out.push('\n');
    } else {
        out.push_str(&bold(
            style,
            &style.f(
                "term-open",
                &[("set", final_words), ("count", a.open.len().to_string())],
            ),
        ));
        out.push('\n');
        for e in &a.open {
            out.push_str(&format!(
                "  {} {}: {}\n",
                tag(e.status, &status_word(e.status, &style.catalogue)),
                e.subject,
                e.lines.join(" ")
            ));
        }
    }
    if !a.accepted.is_empty() {
        out.push_str(&bold(
            style,
            &style.f(
                "term-accepted-heading",
                &[("count", a.accepted.len().to_string())],
            ),
        ));
        out.push('\n');
        for e in &a.accepted {
            out.push_str(&format!(
                "  [{}] {} ({}, {}): {} ({}, {})\n",
                style.t("term-state-accepted"),
                e.subject,
                style.t(&format!("term-word-{}", e.status.word())),
                e.brief,
                e.accepted_reason,
                e.by,
                e.date
            ));
        }
    }
    if !a.job_wide.is_empty() {
        out.push_str(&bold(style, &style.t("term-whole-job")));
        out.push('\n');
        for e in &a.job_wide {
            out.push_str(&format!(
                "  {} {}: {}\n",
                tag(e.status, &status_word(e.status, &style.catalogue)),
                e.subject,
                e.lines.join(" ")
            ));
        }
    }
    for h in &a.history {
        out.push_str(&bold(
            style,
            &style.f("term-history", &[("label", h.label.clone())]),
        ));
        out.push('\n');
        for e in &h.entries {
            out.push_str(&format!(
                "  {} {}: {}\n",
                tag(e.status, &status_word(e.status, &style.catalogue)),
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
        format!(", {}", style.t("term-final-mark"))
    } else {
        String::new()
    };
    out.push_str(&bold(
        style,
        &format!(
            "── {}{final_mark} ({}{date}) ──",
            set.label,
            style.f(
                "term-set-mains",
                &[
                    ("mains", volts(set.mains_volts)),
                    ("factor", format!("{:.3}", set.correction_factor)),
                ],
            ),
        ),
    ));
    out.push('\n');

    for l in &findings.line_up {
        if let Some(c) = l.changes.iter().find(|c| c.set == set.label) {
            out.push_str(&style.f(
                "term-fitted",
                &[
                    ("position", l.position.clone()),
                    ("type", c.valve_type.clone()),
                    ("line_up", l.valve_type.clone()),
                ],
            ));
            out.push('\n');
        }
    }
    for b in &set.bias_controls {
        match &b.label {
            Some(l) => out.push_str(&style.f(
                "term-bias-control-labelled",
                &[("label", l.clone()), ("position", b.position.clone())],
            )),
            None => {
                out.push_str(&style.f("term-bias-control", &[("position", b.position.clone())]))
            }
        }
        out.push('\n');
    }
    if !set.valves.is_empty() {
        out.push_str(&style.t("term-valves"));
        out.push('\n');
        let mut t = style.table(&[
            ("term-col-pos", Align::Left),
            ("term-col-type", Align::Left),
            ("term-col-bias", Align::Left),
            ("term-col-va", Align::Right),
            ("term-col-vk", Align::Right),
            ("term-col-current", Align::Right),
            ("term-col-pa", Align::Right),
            ("term-col-pct-max", Align::Right),
            ("term-col-high-line", Align::Right),
            ("term-col-status", Align::Left),
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
                bias_words(&v.bias, style),
                opt(v.plate_volts, volts),
                opt(v.cathode_volts, volts),
                current,
                opt(v.plate_dissipation_w, |w| {
                    format!("{} W", format_fixed(w, 1))
                }),
                opt(v.plate_dissipation_pct, pct),
                opt(v.high_line_plate_dissipation_pct, pct),
                valve_cell(v, style),
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
                    parts.push(style.f(
                        "term-window-sense",
                        &[("low", format_fixed(a, 1)), ("high", format_fixed(b, 1))],
                    ));
                }
                if let (Some(a), Some(b)) = (w.primary_drop_low_volts, w.primary_drop_high_volts) {
                    parts.push(style.f(
                        "term-window-primary",
                        &[("low", format_fixed(a, 2)), ("high", format_fixed(b, 2))],
                    ));
                }
                if let Some(g) = w.grid_for_middle_volts {
                    let grid = style.f("term-window-grid", &[("volts", volts(g))]);
                    let now = v
                        .grid_volts
                        .map(|now| format!(", {}", style.f("term-now", &[("volts", volts(now))])))
                        .unwrap_or_default();
                    parts.push(format!("{grid}{now} {}", style.t("term-estimate")));
                } else if let Some(why) = &w.grid_for_middle_unknown_reason {
                    parts.push(style.f("term-window-grid-unknown", &[("why", why.clone())]));
                }
                out.push_str(&format!(
                    "  {}: {} ({})\n",
                    style.f(
                        "term-window",
                        &[
                            ("position", v.position.clone()),
                            ("low", format!("{:.0}", w.low_pct)),
                            ("high", format!("{:.0}", w.high_pct)),
                        ],
                    ),
                    parts.join(", "),
                    if w.inside {
                        style.t("term-inside")
                    } else {
                        style.t("term-outside")
                    }
                ));
            }
        }
        if set
            .valves
            .iter()
            .any(|v| v.plate_current_includes_screen && v.plate_current_ma.is_some())
        {
            out.push_str(&format!("  {}\n", style.t("term-ik-note")));
        }
    }

    if !set.warm_up.is_empty() {
        out.push_str(&style.t("term-warm-up"));
        out.push('\n');
        let mut t = style.table(&[
            ("term-col-valve", Align::Left),
            ("term-col-after", Align::Right),
            ("term-col-current", Align::Right),
            ("term-col-pa-pct-max", Align::Right),
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
        out.push_str(&style.t("term-nodes"));
        out.push('\n');
        let mut t = style.table(&[
            ("term-col-node", Align::Left),
            ("term-col-measured", Align::Right),
            ("term-col-corrected", Align::Right),
            ("term-col-expected", Align::Right),
            ("term-col-deviation", Align::Right),
            ("term-col-status", Align::Left),
        ]);
        for n in &set.nodes {
            t.row(vec![
                n.name.clone(),
                volts(n.measured_volts),
                volts(n.corrected_volts),
                opt(n.expected_volts, volts),
                opt(n.deviation_pct, |d| format!("{d:+.1} %")),
                verdict_cell(&n.verdict, style),
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
        out.push_str(&style.t("term-stressed"));
        out.push('\n');
        let mut t = style.table(&[
            ("term-col-part", Align::Left),
            ("term-col-where", Align::Left),
            ("term-col-stress", Align::Right),
            ("term-col-rating", Align::Right),
            ("term-col-pct-margin", Align::Right),
            ("term-col-status", Align::Left),
        ]);
        let mut statuses = Vec::new();
        for r in &resistors {
            t.row(vec![
                r.reference.clone(),
                r.place.clone(),
                crate::calc::resistor_power_words(r.power_w),
                opt(r.rating_w, |w| format_engineering(w, Q::Power)),
                opt(r.power_pct, pct),
                verdict_cell(&r.verdict, style),
            ]);
            statuses.push(paint_status(&r.verdict));
        }
        for c in &set.filter_capacitors {
            t.row(vec![
                c.reference.clone(),
                c.node.clone(),
                style.f("term-peak", &[("volts", volts(c.highest_volts))]),
                volts(c.rating_volts),
                style.f("term-left", &[("pct", format_fixed(c.margin_pct, 1))]),
                verdict_cell(&c.verdict, style),
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
                style.f("term-not-checked", &[("reason", n.reason.clone())]),
            ]);
            statuses.push(Status::Ok);
        }
        out.push_str(&render_painted(&t, style, &statuses));
    }
    if let Some(r) = &set.rectifier {
        out.push_str(&format!(
            "{} {}\n",
            style.f(
                "term-rectifier",
                &[
                    ("position", r.position.clone()),
                    ("type", r.valve_type.clone()),
                    ("load", format!("{:.0}", r.load_at_least_ma)),
                    ("rating", format!("{:.0}", r.rating_ma)),
                    ("pct", format!("{:.0}", r.load_pct)),
                ],
            ),
            paint(
                style,
                paint_status(&r.verdict),
                &verdict_cell(&r.verdict, style)
            )
        ));
    }
    for h in &set.heaters {
        out.push_str(&format!(
            "{} {}\n",
            style.f(
                "term-heater",
                &[
                    ("measured", volts(h.measured_volts)),
                    ("nominal", volts(h.nominal_volts)),
                    ("deviation", format!("{:+.1}", h.deviation_pct)),
                ],
            ),
            paint(
                style,
                paint_status(&h.verdict),
                &verdict_cell(&h.verdict, style)
            )
        ));
    }
    out.push_str(&render_suggestions(set, style));
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
fn render_suggestions(set: &SetFindings, style: &TerminalStyle) -> String {
    let mut out = String::new();
    for s in &set.cathode_resistor_suggestions {
        out.push_str(
            &style.f(
                "term-suggestion",
                &[
                    ("reference", s.reference.clone()),
                    ("valves", s.valves.join(", ")),
                    ("present", ohms(s.present_ohms)),
                    ("target", format!("{:.0}", s.target_pct)),
                    ("pa", format_fixed(s.target_plate_dissipation_w, 1)),
                    (
                        "exact",
                        s.exact_ohms
                            .map(ohms)
                            .unwrap_or_else(|| style.t("term-out-of-reach")),
                    ),
                ],
            ),
        );
        out.push('\n');
        for o in &s.options {
            out.push_str(&format!(
                "  {}\n",
                style.f(
                    "term-suggestion-option",
                    &[
                        ("series", o.series.to_string()),
                        ("value", ohms(o.resistance_ohms)),
                        ("vk", volts(o.cathode_volts)),
                        ("current", ma(o.cathode_current_ma)),
                        ("pa", format_fixed(o.plate_dissipation_w, 1)),
                        ("pct", format!("{:.0}", o.plate_dissipation_pct)),
                        ("power", format_fixed(o.resistor_power_w, 2)),
                        ("least", format_fixed(o.resistor_rating_at_least_w, 1)),
                        ("rating", format_engineering(o.resistor_rating_w, Q::Power)),
                    ],
                )
            ));
        }
        out.push_str(&format!(
            "  {}\n",
            style.f(
                "term-suggestion-estimate",
                &[
                    ("calibrated", s.calibrated_on.clone()),
                    ("mu", crate::units::format_sig(s.mu_g1g2, 3)),
                ],
            )
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
    let mut out = format!("{}\n", style.t("term-bench"));
    for p in &b.output_power {
        let read = match p.reading {
            crate::job::AcReading::Rms => style.f("term-rms", &[("volts", volts(p.reading_volts))]),
            crate::job::AcReading::PeakToPeak => style.f(
                "term-peak-to-peak",
                &[
                    ("volts", volts(p.reading_volts)),
                    ("rms", volts(p.rms_volts)),
                ],
            ),
        };
        out.push_str(&format!(
            "  {}{}: {}{} {}\n",
            style.t("term-output-power"),
            channel(&p.channel),
            style.f(
                "term-output-power-line",
                &[
                    ("reading", read),
                    ("load", ohms(p.load_ohms)),
                    ("frequency", hz(p.frequency_hz)),
                    ("condition", p.condition_words.clone()),
                    ("power", format_fixed(p.output_power_w, 1)),
                ],
            ),
            p.output_power_pct_of_rated
                .map(|pct| format!(
                    " ({})",
                    style.f("term-of-rated", &[("pct", self::pct(pct))])
                ))
                .unwrap_or_default(),
            paint(
                style,
                p.verdict.status,
                &status_word(p.verdict.status, &style.catalogue)
            )
        ));
    }
    for h in &b.hum_noise {
        out.push_str(&format!(
            "  {}{}: {}{}{} {}\n",
            style.t("term-hum-noise"),
            channel(&h.channel),
            style.f(
                "term-hum-noise-line",
                &[
                    ("mv", format_fixed(h.hum_noise_mv, 2)),
                    ("dbv", format!("{:+.1}", h.hum_noise_dbv)),
                    ("input", h.input.to_string()),
                ],
            ),
            h.volume
                .as_ref()
                .map(|v| format!(", {}", style.f("term-volume", &[("volume", v.clone())])))
                .unwrap_or_default(),
            h.hum_noise_db_below_full
                .map(|db| format!(
                    ", {}",
                    style.f("term-below-full", &[("db", format_fixed(db, 1))])
                ))
                .unwrap_or_default(),
            paint(
                style,
                h.verdict.status,
                &status_word(h.verdict.status, &style.catalogue)
            )
        ));
    }
    for r in &b.responses {
        out.push_str(&format!(
            "  {}{} {}{}:\n",
            style.t("term-response"),
            channel(&r.channel),
            style.f("term-against", &[("reference", hz(r.reference_hz))]),
            r.input_volts
                .map(|v| format!(", {}", style.f("term-in", &[("volts", volts(v))])))
                .unwrap_or_default()
        ));
        let mut t = style.table(&[
            ("term-col-frequency", Align::Right),
            ("term-col-output", Align::Right),
            ("term-col-db", Align::Right),
        ]);
        for p in &r.points {
            t.row(vec![
                hz(p.frequency_hz),
                volts(p.output_volts),
                format!("{:+.1}", p.response_db),
            ]);
        }
        out.push_str(&t.render_with(4, &|_, _, cell| cell.to_string()));
        let side = |f: Option<f64>, edge: f64, key: &str| match f {
            Some(f) => hz(f),
            None => style.f(key, &[("frequency", hz(edge))]),
        };
        out.push_str(&format!(
            "    {}\n",
            style.f(
                "term-minus-3db",
                &[
                    (
                        "low",
                        side(r.minus_3db_low_hz, r.lowest_hz, "term-below-not-reached")
                    ),
                    (
                        "high",
                        side(r.minus_3db_high_hz, r.highest_hz, "term-above-not-reached")
                    ),
                ],
            )
        ));
    }
    for g in &b.gains {
        out.push_str(&format!(
            "  {}{}: {}\n",
            style.t("term-gain"),
            channel(&g.channel),
            style.f(
                "term-gain-line",
                &[
                    ("input", volts(g.input_volts)),
                    ("output", volts(g.output_volts)),
                    ("frequency", hz(g.frequency_hz)),
                    ("times", crate::units::format_sig(g.gain_times, 3)),
                    ("db", format_fixed(g.gain_db, 1)),
                ],
            )
        ));
    }
    out
}
