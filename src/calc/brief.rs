//! The short "why" of each status: a few words naming the deciding figure
//! ("screen 196 %", "−20.9 % from chart", "543 V on 500 V"), for a table's
//! status column and the one-line history of a set. Filled in after every
//! figure of a set is worked out; the long reason stays in `reason`.
//!
//! Every fixed phrase of these briefs is in this file.

use super::findings::{SafetyFinding, SetFindings, ValveFindings};
use super::status::Status;
use crate::units::{QuantityKind, format_engineering};

fn pct(v: Option<f64>) -> String {
    v.map(|v| format!("{v:.0} %"))
        .unwrap_or_else(|| "–".to_string())
}

/// The deciding figure of one valve check. `high_line` turns a voltage
/// read in the set into its high-line projection (the correction to
/// nominal mains times 1 + tolerance), for a voltage caution that only the
/// projection decided.
pub fn valve_check(v: &ValveFindings, check: &str, high_line: f64) -> String {
    let voltage = |name: &str, pct_now: Option<f64>| match pct_now {
        Some(p) if p <= 100.0 => format!("{name} {:.0} % at high line", p * high_line),
        p => format!("{name} {} of max", pct(p)),
    };
    match check {
        "plate_dissipation" => format!("plate {}", pct(v.plate_dissipation_pct)),
        "plate_dissipation_high_line" => {
            format!(
                "plate {} at high line",
                pct(v.high_line_plate_dissipation_pct)
            )
        }
        "screen_dissipation" => format!("screen {}", pct(v.screen_dissipation_pct)),
        "plate_voltage" => voltage("Va", v.plate_voltage_pct),
        "screen_voltage" => voltage("Vg2", v.screen_voltage_pct),
        "cathode_current" => format!("Ik {} of max", pct(v.cathode_current_pct)),
        other => other.replace('_', " "),
    }
}

/// Fills `brief` on every verdict of a set; `derating` is the resistor
/// caution share (a fraction), which tells whether the high-line projection
/// decided a resistor's caution, and `tolerance` the mains' upper
/// tolerance (a fraction).
pub(crate) fn fill_set(set: &mut SetFindings, derating: f64, tolerance: f64) {
    let high_line = set.correction_factor * (1.0 + tolerance);
    for v in &mut set.valves {
        let briefs: Vec<String> = v
            .checks
            .iter()
            .map(|c| valve_check(v, c.check, high_line))
            .collect();
        for (c, b) in v.checks.iter_mut().zip(briefs) {
            c.verdict.brief = b;
        }
    }
    for n in &mut set.nodes {
        n.verdict.brief = match n.deviation_pct {
            Some(d) => format!("{d:+.1} % from chart"),
            None => "no chart figure".to_string(),
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
                format!("{h:.0} % at high line")
            }
            (Some(p), _) => format!("{p:.0} % of rating"),
            (None, _) => "no rating given".to_string(),
        };
    }
    for c in &mut set.filter_capacitors {
        let v = |x: f64| format_engineering(x, QuantityKind::Voltage);
        let what = if c.deciding == "working_high_line" {
            "working at high line"
        } else {
            "cold-start peak"
        };
        c.verdict.brief = match c.verdict.status {
            Status::Ok => format!("{:.0} % margin", c.margin_pct),
            _ if c.deciding_margin_pct < 0.0 => {
                format!("{} {what} on {}", v(c.deciding_volts), v(c.rating_volts))
            }
            _ => format!("{:.1} % margin, {what}", c.deciding_margin_pct),
        };
    }
    if let Some(r) = &mut set.rectifier {
        r.verdict.brief = format!("{:.0} % of rating", r.load_pct);
    }
    for h in &mut set.heaters {
        h.verdict.brief = format!("{:+.1} %", h.deviation_pct);
    }
    for p in &mut set.bench.output_power {
        p.verdict.brief = match p.output_power_pct_of_rated {
            Some(pct) => format!("{pct:.0} % of rated"),
            None => format!("{:.1} W", p.output_power_w),
        };
    }
    for h in &mut set.bench.hum_noise {
        h.verdict.brief = match h.hum_noise_db_below_full {
            Some(db) => format!("{db:.0} dB below full"),
            None => format!("{:.1} dBV", h.hum_noise_dbv),
        };
    }
}

/// Fills `brief` on the safety tests.
pub(crate) fn fill_safety(safety: &mut [SafetyFinding]) {
    for s in safety {
        s.verdict.brief = format!("{} against {}", s.measured, s.limit);
    }
}
