//! The bench tests and the cathode-resistor suggestions of a measurement
//! set, formatted for the hand-over document. Like the rest of the
//! context, only text: the figures and statuses are calc's.

use serde::Serialize;

use super::{fixed, minus, pct0, sentence, volts};
use crate::calc::{
    BenchFindings, CathodeResistorSuggestion, GainFindings, HumNoiseFindings, OutputPowerFindings,
    ResponseFindings,
};
use crate::catalogue::{Arg, Catalogue};
use crate::job::AcReading;
use crate::units::{QuantityKind as Q, format_engineering, format_sig};

/// The bench tests of one set.
#[derive(Debug, Clone, Serialize)]
pub struct BenchContext {
    pub output_power: Vec<OutputPowerRow>,
    pub hum_noise: Vec<HumNoiseRow>,
    pub responses: Vec<ResponseRow>,
    pub gains: Vec<GainRow>,
}

#[derive(Debug, Clone, Serialize)]
pub struct OutputPowerRow {
    pub channel: Option<String>,
    /// The reading as taken: "10.6 V rms", or "30.0 V p-p (10.6 V rms)".
    pub reading: String,
    /// "8 Ω".
    pub load: String,
    /// "1 kHz".
    pub frequency: String,
    /// "at the onset of clipping".
    pub condition: String,
    /// "14.0 W".
    pub power: String,
    /// "94 %", when the unit's rated power is known.
    pub pct_of_rated: Option<String>,
    /// "15 W".
    pub rated: Option<String>,
    /// ok, caution … or accepted.
    pub status: String,
    /// When not ok, the deciding figure in a few words.
    pub why: String,
    pub reason: String,
    pub threshold: String,
}

#[derive(Debug, Clone, Serialize)]
pub struct HumNoiseRow {
    pub channel: Option<String>,
    /// "shorted" or "open".
    pub input: String,
    pub volume: Option<String>,
    pub load: String,
    /// "3.1 mV".
    pub level: String,
    /// "−50.2 dBV".
    pub dbv: String,
    /// "70.7 dB", when there is a full output to compare with.
    pub below_full: Option<String>,
    /// What it was compared with: "measured 14.0 W", "rated 15 W".
    pub against: Option<String>,
    /// ok, caution … or accepted.
    pub status: String,
    /// When not ok, the deciding figure in a few words.
    pub why: String,
    pub reason: String,
}

#[derive(Debug, Clone, Serialize)]
pub struct ResponseRow {
    pub channel: Option<String>,
    /// "1 kHz".
    pub reference: String,
    /// "40 mV", the fixed input level.
    pub input: Option<String>,
    pub load: Option<String>,
    pub points: Vec<ResponsePointRow>,
    /// "49.9 Hz", or "below 40 Hz" when the readings do not fall to −3 dB.
    pub low: String,
    /// "13.0 kHz", or "above 16 kHz".
    pub high: String,
}

#[derive(Debug, Clone, Serialize)]
pub struct ResponsePointRow {
    /// "40 Hz".
    pub frequency: String,
    /// "2.6" (volts).
    pub volts: String,
    /// "−3.7" (dB).
    pub db: String,
}

#[derive(Debug, Clone, Serialize)]
pub struct GainRow {
    pub channel: Option<String>,
    pub input: String,
    pub output: String,
    pub frequency: String,
    /// "×112".
    pub times: String,
    /// "41.0 dB".
    pub db: String,
}

/// A cathode-resistor suggestion, formatted.
#[derive(Debug, Clone, Serialize)]
pub struct SuggestionRow {
    pub reference: String,
    /// "V3, V4".
    pub valves: String,
    pub calibrated_on: String,
    pub valve_type: String,
    /// Which valve's readings fit the law, in words: "V3 (EL84), the
    /// hottest valve on it," or "V3 (EL84)".
    pub calibrated_words: String,
    /// Why it is shown, as a sentence.
    pub why: String,
    /// "130 Ω".
    pub present: String,
    /// "14.6 W, 121 % of 12 W".
    pub present_pa: String,
    /// "85 % of 12 W, 10.2 W".
    pub target: String,
    /// "202 Ω", or none when out of reach.
    pub exact: Option<String>,
    /// "19".
    pub mu: String,
    /// The law's constant: "3.59 mA/V^1.5".
    pub constant: String,
    pub plate_current_includes_screen: bool,
    pub options: Vec<SuggestionOption>,
}

#[derive(Debug, Clone, Serialize)]
pub struct SuggestionOption {
    /// "E12".
    pub series: String,
    /// "220 Ω".
    pub value: String,
    /// "12.9 V".
    pub cathode: String,
    /// "29.2 mA".
    pub current: String,
    /// "9.5 W".
    pub pa: String,
    /// "79".
    pub pa_pct: String,
    /// "0.75 W".
    pub power: String,
    /// "1.5 W".
    pub rating_at_least: String,
    /// "2 W".
    pub rating: String,
}

fn hz(f: f64) -> String {
    format_engineering(f, Q::Frequency)
}

fn ohms(r: f64) -> String {
    format_engineering(r, Q::Resistance)
}

fn watts(w: f64) -> String {
    format!("{} W", fixed(w, if w >= 10.0 { 1 } else { 2 }))
}

/// A signed figure to 0.1 with a typographic minus: "−3.7", "+0.4", "0.0".
fn signed(v: f64) -> String {
    let s = fixed(v.abs(), 1);
    if s.chars().all(|c| c == '0' || c == '.') {
        s
    } else if v < 0.0 {
        format!("\u{2212}{s}")
    } else {
        format!("+{s}")
    }
}

/// The bench tests of a set, or none when it has none.
pub(super) fn bench_context(b: &BenchFindings, cat: &Catalogue) -> Option<BenchContext> {
    (!b.is_empty()).then(|| BenchContext {
        output_power: b.output_power.iter().map(output_power_row).collect(),
        hum_noise: b.hum_noise.iter().map(|h| hum_noise_row(h, cat)).collect(),
        responses: b.responses.iter().map(|r| response_row(r, cat)).collect(),
        gains: b.gains.iter().map(gain_row).collect(),
    })
}

fn output_power_row(p: &OutputPowerFindings) -> OutputPowerRow {
    let reading = match p.reading {
        AcReading::Rms => format!("{} rms", volts(p.reading_volts)),
        AcReading::PeakToPeak => format!(
            "{} p-p ({} rms)",
            volts(p.reading_volts),
            volts(p.rms_volts)
        ),
    };
    OutputPowerRow {
        channel: p.channel.clone(),
        reading,
        load: ohms(p.load_ohms),
        frequency: hz(p.frequency_hz),
        condition: p.condition_words.clone(),
        power: format!("{} W", fixed(p.output_power_w, 1)),
        pct_of_rated: p
            .output_power_pct_of_rated
            .map(|x| format!("{} %", pct0(x))),
        rated: p.rated_power_w.map(|w| format_engineering(w, Q::Power)),
        status: crate::report::attention::state(&p.verdict).to_string(),
        why: super::why(&p.verdict),
        reason: sentence(&p.verdict.reason),
        threshold: sentence(&p.verdict.threshold),
    }
}

fn hum_noise_row(h: &HumNoiseFindings, cat: &Catalogue) -> HumNoiseRow {
    HumNoiseRow {
        channel: h.channel.clone(),
        input: cat.text(if h.input == "shorted" {
            "doc-input-shorted"
        } else {
            "doc-input-open"
        }),
        volume: h.volume.clone(),
        load: ohms(h.load_ohms),
        level: minus(format_engineering(h.hum_noise_mv / 1e3, Q::Voltage)),
        dbv: format!("{} dBV", signed(h.hum_noise_dbv)),
        below_full: h
            .hum_noise_db_below_full
            .map(|db| format!("{} dB", minus(fixed(db, 1)))),
        against: match (h.full_output_from, h.full_output_w) {
            (Some("rated"), Some(w)) => Some(cat.format(
                "doc-against-rated",
                &[("watts", Arg::from(format_engineering(w, Q::Power)))],
            )),
            (Some(_), Some(w)) => {
                Some(cat.format("doc-against-measured", &[("watts", Arg::from(watts(w)))]))
            }
            _ => None,
        },
        status: crate::report::attention::state(&h.verdict).to_string(),
        why: super::why(&h.verdict),
        reason: sentence(&h.verdict.reason),
    }
}

fn response_row(r: &ResponseFindings, cat: &Catalogue) -> ResponseRow {
    ResponseRow {
        channel: r.channel.clone(),
        reference: hz(r.reference_hz),
        input: r.input_volts.map(volts),
        load: r.load_ohms.map(ohms),
        points: r
            .points
            .iter()
            .map(|p| ResponsePointRow {
                frequency: hz(p.frequency_hz),
                volts: minus(format_sig(p.output_volts, 3)),
                db: signed(p.response_db),
            })
            .collect(),
        low: match r.minus_3db_low_hz {
            Some(f) => hz(f),
            None => cat.format("doc-below", &[("frequency", Arg::from(hz(r.lowest_hz)))]),
        },
        high: match r.minus_3db_high_hz {
            Some(f) => hz(f),
            None => cat.format("doc-above", &[("frequency", Arg::from(hz(r.highest_hz)))]),
        },
    }
}

fn gain_row(g: &GainFindings) -> GainRow {
    GainRow {
        channel: g.channel.clone(),
        input: volts(g.input_volts),
        output: volts(g.output_volts),
        frequency: hz(g.frequency_hz),
        times: format!("×{}", format_sig(g.gain_times, 3)),
        db: format!("{} dB", minus(fixed(g.gain_db, 1))),
    }
}

pub(super) fn suggestion_row(
    s: &CathodeResistorSuggestion,
    caution_pct: f64,
    cat: &Catalogue,
) -> SuggestionRow {
    let pa_max = if s.target_pct > 0.0 {
        s.target_plate_dissipation_w / s.target_pct * 100.0
    } else {
        0.0
    };
    let max_words = format_engineering(pa_max, Q::Power);
    SuggestionRow {
        reference: s.reference.clone(),
        valves: s.valves.join(", "),
        calibrated_on: s.calibrated_on.clone(),
        valve_type: s.valve_type.clone(),
        calibrated_words: if s.valves.len() > 1 {
            cat.format(
                "doc-suggest-hottest",
                &[
                    ("valve", Arg::from(&s.calibrated_on)),
                    ("type", Arg::from(&s.valve_type)),
                ],
            )
        } else {
            format!("{} ({})", s.calibrated_on, s.valve_type)
        },
        why: match s.why {
            "asked" => cat.text("doc-suggest-asked"),
            _ => cat.format(
                "doc-suggest-shown",
                &[("caution", Arg::from(pct0(caution_pct)))],
            ),
        },
        present: ohms(s.present_ohms),
        present_pa: cat.format(
            "doc-suggest-present",
            &[
                ("watts", Arg::from(fixed(s.present_plate_dissipation_w, 1))),
                ("pct", Arg::from(pct0(s.present_plate_dissipation_pct))),
                ("max", Arg::from(&max_words)),
            ],
        ),
        target: cat.format(
            "doc-suggest-target",
            &[
                ("watts", Arg::from(fixed(s.target_plate_dissipation_w, 1))),
                ("pct", Arg::from(pct0(s.target_pct))),
                ("max", Arg::from(&max_words)),
            ],
        ),
        exact: s.exact_ohms.map(|o| ohms(crate::units::round_sig(o, 3))),
        mu: format_sig(s.mu_g1g2, 3),
        constant: format!("{} mA/V^1.5", format_sig(s.law_constant_ma_per_v1_5, 3)),
        plate_current_includes_screen: s.plate_current_includes_screen,
        options: s
            .options
            .iter()
            .map(|o| SuggestionOption {
                series: o.series.clone(),
                value: ohms(o.resistance_ohms),
                cathode: volts(o.cathode_volts),
                current: format!("{} mA", fixed(o.cathode_current_ma, 1)),
                pa: format!("{} W", fixed(o.plate_dissipation_w, 1)),
                pa_pct: pct0(o.plate_dissipation_pct),
                power: watts(o.resistor_power_w),
                rating_at_least: format!("{} W", fixed(o.resistor_rating_at_least_w, 1)),
                rating: format_engineering(o.resistor_rating_w, Q::Power),
            })
            .collect(),
    }
}
