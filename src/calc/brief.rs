//! The short "why" of each status: a few words naming the deciding figure
//! ("screen 196 %", "−20.9 % from chart", "543 V on 500 V"), for a table's
//! status column and the one-line history of a set. Filled in after every
//! figure of a set is worked out; the long reason stays in `reason`.
//!
//! Their words are the catalogue's `brief-…` messages.

use super::findings::{SafetyFinding, SetFindings, ValveFindings};
use super::status::{SaidOnce, Status};
use crate::catalogue::Catalogue;
use crate::units::{QuantityKind, format_engineering};
use crate::units::{fixed, fixed_signed, fixed_with};

/// A share in whole percent: "79 %", from `fixed(share, 0)`'s words.
fn percent(whole: &str) -> String {
    let mut words = String::with_capacity(whole.len() + 2);
    words.push_str(whole);
    words.push_str(" %");
    words
}

/// The deciding figure of one valve check. `high_line` turns a voltage
/// read in the set into its high-line projection (the correction to
/// nominal mains times 1 + tolerance), for a voltage caution that only the
/// projection decided.
pub(crate) fn valve_check(
    v: &ValveFindings,
    check: &str,
    high_line: f64,
    once: &SaidOnce,
) -> String {
    // The message `key` with the share `p` in whole percent ("plate 79
    // %"), or a dash for none, and the figure's `name` where it has one
    // ("Va 64 % at high line"); said once for each whole percent.
    let share = |key: &'static str, name: &'static str, p: Option<f64>| {
        let say = |pct: &str| {
            if name.is_empty() {
                once.say(key, &[("pct", pct)])
            } else {
                once.say(key, &[("name", name), ("pct", pct)])
            }
        };
        match p {
            Some(p) => once.whole_words(key, name, p, [0.0; 2], |whole| say(&percent(whole))),
            None => say("–"),
        }
    };
    let voltage = |name: &'static str, pct_now: Option<f64>| match pct_now {
        Some(p) if p <= 100.0 => share("brief-voltage-high-line", name, Some(p * high_line)),
        p => share("brief-voltage-of-max", name, p),
    };
    match check {
        "plate_dissipation" => share("brief-plate", "", v.plate_dissipation_pct),
        "plate_dissipation_high_line" => share(
            "brief-plate-high-line",
            "",
            v.high_line_plate_dissipation_pct,
        ),
        "screen_dissipation" => share("brief-screen", "", v.screen_dissipation_pct),
        "plate_voltage" => voltage("Va", v.plate_voltage_pct),
        "screen_voltage" => voltage("Vg2", v.screen_voltage_pct),
        "cathode_current" => share("brief-cathode-current", "", v.cathode_current_pct),
        other => super::check_words(other, once.catalogue()),
    }
}

/// Fills `brief` on every verdict of a set; `derating` is the resistor
/// caution share (a fraction), which tells whether the high-line projection
/// decided a resistor's caution, and `tolerance` the mains' upper
/// tolerance (a fraction).
pub(crate) fn fill_set(set: &mut SetFindings, derating: f64, tolerance: f64, once: &SaidOnce) {
    // The message `key` with `p` in whole numbers, said once for each.
    let pct_of = |key: &'static str, p: f64| {
        once.whole_words(key, "", p, [0.0; 2], |whole| {
            once.say(key, &[("pct", whole)])
        })
    };
    let high_line = set.correction_factor * (1.0 + tolerance);
    for v in &mut set.valves {
        let briefs: Vec<String> = v
            .checks
            .iter()
            .map(|c| valve_check(v, c.check, high_line, once))
            .collect();
        for (c, b) in v.checks.iter_mut().zip(briefs) {
            c.verdict.brief = b;
        }
    }
    for n in &mut set.nodes {
        n.verdict.brief = match n.deviation_pct {
            Some(d) => once.say("brief-from-chart", &[("deviation", &fixed_signed(d, 1))]),
            None => once.text("brief-no-chart"),
        };
    }
    for r in set
        .droppers
        .iter_mut()
        .chain(set.cathode_resistors.iter_mut())
        .chain(set.screen_resistors.iter_mut())
    {
        r.verdict.brief = match (r.power_pct, r.high_line_power_pct) {
            (Some(p), Some(h)) if r.verdict.status != Status::Ok && p <= derating * 100.0 => {
                pct_of("brief-at-high-line", h)
            }
            (Some(p), _) => pct_of("brief-of-rating", p),
            (None, _) => once.text("brief-no-rating"),
        };
    }
    for c in &mut set.filter_capacitors {
        let v = |x: f64| format_engineering(x, QuantityKind::Voltage);
        let what = once.text(if c.deciding == "working_high_line" {
            "brief-working-high-line"
        } else {
            "brief-cold-start-peak"
        });
        c.verdict.brief = match c.verdict.status {
            Status::Ok => pct_of("brief-margin", c.margin_pct),
            _ if c.deciding_margin_pct < 0.0 => once.say(
                "brief-volts-on-rating",
                &[
                    ("volts", &v(c.deciding_volts)),
                    ("what", &what),
                    ("rating", &v(c.rating_volts)),
                ],
            ),
            _ => once.say(
                "brief-margin-what",
                &[("pct", &fixed(c.deciding_margin_pct, 1)), ("what", &what)],
            ),
        };
    }
    if let Some(r) = &mut set.rectifier {
        r.verdict.brief = pct_of("brief-of-rating", r.load_pct);
    }
    for h in &mut set.heaters {
        let mut brief = fixed_signed(h.deviation_pct, 1);
        brief.push_str(" %");
        h.verdict.brief = brief;
    }
    for p in &mut set.bench.output_power {
        p.verdict.brief = match p.output_power_pct_of_rated {
            Some(pct) => pct_of("brief-of-rated", pct),
            None => fixed_with(p.output_power_w, 1, " W"),
        };
    }
    for h in &mut set.bench.hum_noise {
        h.verdict.brief = match h.hum_noise_db_below_full {
            Some(db) => once.say("brief-below-full", &[("db", &fixed(db, 0))]),
            None => fixed_with(h.hum_noise_dbv, 1, " dBV"),
        };
    }
}

/// Fills `brief` on the safety tests.
pub(crate) fn fill_safety(safety: &mut [SafetyFinding], cat: &Catalogue) {
    for s in safety {
        s.verdict.brief = cat.format_str(
            "brief-against",
            &[("measured", &s.measured), ("limit", &s.limit)],
        );
    }
}
